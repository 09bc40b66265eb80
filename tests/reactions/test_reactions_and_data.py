"""Reaction parsing, balance checks, species-data loading and the stdstate command."""

import io
import textwrap
from contextlib import redirect_stdout

import numpy as np
import pandas as pd
import pytest

from redoxgibbs.errors import (
    InputError,
    OutOfValidityError,
    SpeciesDataError,
    UnbalancedReactionError,
    UnknownSpeciesError,
)
from redoxgibbs.interfaces.cli import main
from redoxgibbs.reactions.reaction import Reaction, reaction_properties
from redoxgibbs.species.database import load_species_data
from redoxgibbs.units import Q_


@pytest.mark.parametrize("text", ["HCO3- = CO3^2- + H+", "HCO3- = CO3-2 + H+", "HCO3- = CO3-- + H+"])
def test_charge_notations_are_one_species(text):
    assert str(Reaction(text)) == "HCO3- = CO3^2- + H+"


def test_fraction_and_decimal_coefficients():
    a = Reaction("Fe^2+ + 1/4 O2(aq) + H+ = Fe^3+ + 1/2 H2O(l)")
    b = Reaction("Fe^2+ + 0.25 O2(aq) + H+ = Fe^3+ + 0.5 H2O(l)")
    assert str(a) == str(b) == "Fe^2+ + 1/4 O2(aq) + H+ = Fe^3+ + 1/2 H2O(l)"


def test_unbalanced_reaction_says_what_is_off():
    with pytest.raises(UnbalancedReactionError, match=r"H -2, O -1"):
        Reaction("CO2(aq) + 4 H2(aq) = CH4(aq) + H2O(l)")
    with pytest.raises(UnbalancedReactionError, match="charge"):
        Reaction("HCO3- = CO3^2- + 2 H+")


def test_unknown_species_suggests_near_names():
    with pytest.raises(UnknownSpeciesError, match="did you mean.*CH4\\(aq\\)"):
        Reaction("CO2(aq) + 4 H2(aq) = CH5(aq) + 2 H2O(l)")


def test_ambiguous_and_mineral_names():
    with pytest.raises(UnknownSpeciesError, match="H2\\(aq\\), H2\\(g\\)"):
        Reaction("CO2(aq) + 4 H2 = CH4(aq) + 2 H2O(l)")
    assert str(Reaction("CaCO3(s) + H+ = Ca^2+ + HCO3-")) == "calcite + H+ = Ca^2+ + HCO3-"
    with pytest.raises(InputError, match="same"):
        Reaction("FeS2(s) = pyrite")


def test_units_at_the_boundary():
    a = reaction_properties("H2O(l) = H+ + OH-", 300.0, 500.0)
    b = reaction_properties("H2O(l) = H+ + OH-", Q_(573.15, "K"), Q_(50.0, "MPa"))
    c = reaction_properties("H2O(l) = H+ + OH-", "300 degC", "500 bar")
    assert float(a.logK) == pytest.approx(float(b.logK), rel=1e-12)
    assert float(a.logK) == pytest.approx(float(c.logK), rel=1e-12)
    with pytest.raises(InputError, match="P: .*not convertible"):
        reaction_properties("H2O(l) = H+ + OH-", 25.0, Q_(1.0, "m"))


def test_broadcasting_shapes_and_frame():
    p = reaction_properties("H2O(l) = H+ + OH-", np.array([[25.0], [100.0]]), np.array([10.0, 500.0, 1000.0]))
    assert p.logK.shape == (2, 3)
    frame = p.to_frame()
    assert list(frame.columns[:6]) == ["T_C", "P_bar", "logK", "dG0_kJ_per_mol", "dH0_kJ_per_mol",
                                       "dS0_J_per_mol_K"]
    scalar = reaction_properties("H2O(l) = H+ + OH-", 100.0, 500.0)
    assert p.logK[1, 1] == pytest.approx(float(scalar.logK), rel=1e-12)


def test_validity_refusals():
    with pytest.raises(OutOfValidityError, match="1000 degC"):
        reaction_properties("H2O(l) = H+ + OH-", 1100.0, 2000.0)
    with pytest.raises(OutOfValidityError, match="5000 bar"):
        reaction_properties("H2O(l) = H+ + OH-", 300.0, 6000.0)
    with pytest.raises(InputError, match="NaN"):
        reaction_properties("H2O(l) = H+ + OH-", float("nan"), 10.0)


def test_low_density_and_cold_states_are_flagged():
    # 500 C, 600 bar: 0.339 g/cm3, above the critical density (below it water is refused as
    # gas-like) but below the g-function's fitted range
    p = reaction_properties("H2O(l) = H+ + OH-", [500.0, 300.0], [600.0, 500.0])
    assert list(p.flags["water_density_below_0.35_g_cm3"]) == [True, False]
    from redoxgibbs.errors import OutOfValidityError
    with pytest.raises(OutOfValidityError, match="gas-like"):
        reaction_properties("H2O(l) = H+ + OH-", 500.0, 300.0)
    cold = reaction_properties("H2O(l) = H+ + OH-", -20.0, 2000.0)
    assert bool(cold.flags["below_0C_extrapolated"])


def test_loader_names_the_failing_check(tmp_path):
    bad = tmp_path / "mine.csv"
    bad.write_text(textwrap.dedent("""\
        name,formula,charge,G_f,H_f,S,Cp,V,a1x10,a2x1e-2,a3,a4x1e-4,c1,c2x1e-4,omegax1e-5,source,entered_from
        Li+,Li,1,-62591,-50000,13.96,9.06,-1.21,1.839,-2.285,3.256,-2.726,18.18,-2.981,0.3306,test,
        """))
    with pytest.raises(SpeciesDataError, match="disagree by"):
        load_species_data([bad])


def test_user_file_adds_species(tmp_path):
    extra = tmp_path / "extra.csv"
    extra.write_text(textwrap.dedent("""\
        name,formula,charge,state,formation,logK_25C,dH_r_kJ_mol,G_f_kJ_mol,H_f_kJ_mol,S_J_mol_K,T_max_C,source,entered_from
        KCl(aq),KCl,0,aq,K+ + Cl- = KCl(aq),-0.5,0,,,,100,a user's own estimate,
        """))
    db = load_species_data([extra])
    p = reaction_properties(Reaction("K+ + Cl- = KCl(aq)", db=db), 25.0, 1.0)
    assert float(p.logK) == pytest.approx(-0.5, abs=1e-9)


def _run(argv):
    out = io.StringIO()
    with redirect_stdout(out):
        code = main(argv)
    return code, out.getvalue()


def test_stdstate_cli_csv_contract():
    code, text = _run(["stdstate", "CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)", "--temperature",
                       "25,100,300", "--pressure", "psat", "--format", "csv"])
    assert code == 0
    frame = pd.read_csv(io.StringIO(text))
    for col in ["T_C", "P_bar", "logK", "dG0_kJ_per_mol", "dH0_kJ_per_mol", "dS0_J_per_mol_K"]:
        assert col in frame.columns
    assert list(frame["T_C"]) == [25, 100, 300]
    # Amend & Shock (2001) FEMS Microbiol. Rev. 25, 175, Table: dG0 of CO2(aq) + 4 H2(aq) ->
    # CH4(aq) + 2 H2O(l) at 25 C is -193.70 kJ/mol (their data rest on the same HKF sources)
    assert frame["dG0_kJ_per_mol"][0] == pytest.approx(-193.7, abs=0.3)


def test_stdstate_cli_product_of_lists_and_errors(capsys):
    code, text = _run(["stdstate", "H2O(l) = H+ + OH-", "--temperature", "25,300",
                       "--pressure", "500,1000", "--format", "csv"])
    assert code == 0 and len(pd.read_csv(io.StringIO(text))) == 4
    assert main(["stdstate", "H2O(l) = H+ + OH-", "--temperature", "-30", "--pressure", "1"]) == 2
    assert "frozen" in capsys.readouterr().err


def test_formation_species_are_flagged_outside_their_stated_range():
    # FeCl+ has no published enthalpy: constant (zero) enthalpy is trusted only at 15-35 C;
    # ion pairs with an enthalpy from -20 to 100 C
    p = reaction_properties("Fe^2+ + Cl- = FeCl+", [10.0, 25.0, 50.0], "psat")
    assert p.flags["outside_formation_T_range"].tolist() == [True, False, True]
    q = reaction_properties("Ca^2+ + SO4^2- = CaSO4(aq)", [-5.0, 25.0, 99.0, 120.0], [1.0, 1.0, 1.0, 5.0])
    assert q.flags["outside_formation_T_range"].tolist() == [False, False, False, True]
