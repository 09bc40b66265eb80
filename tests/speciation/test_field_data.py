"""Field data as labs report it: below-detection cells, assumed and air-saturated values, alkalinity
and DIC as inputs, measured zeros; each noted in the flags of the rows that use it."""

import io
from contextlib import redirect_stdout

import gsw
import numpy as np
import pandas as pd
import pytest

from redoxgibbs.energetics.catalog import catalog
from redoxgibbs.errors import InputError
from redoxgibbs.interfaces.cli import main
from redoxgibbs.pipeline.evaluate import evaluate
from redoxgibbs.speciation.samples import read_samples
from redoxgibbs.speciation.solver import speciate


def _frame(**cells):
    base = {"sample": ["a", "b"], "T [degC]": [25.0, 25.0], "P [bar]": [1.0, 1.0], "pH": [7.0, 7.0],
            "Na+ [mmol/kg]": [10.0, 10.0], "Cl- [mmol/kg]": [10.0, 10.0]}
    base.update(cells)
    return pd.DataFrame(base)


@pytest.mark.parametrize("policy,expected", [("not-measured", np.nan), ("detection-limit", 0.2e-3),
                                             ("half-limit", 0.1e-3)])
def test_below_detection_cells_follow_the_chosen_policy(policy, expected):
    s = read_samples(_frame(**{"NO3- [mmol/kg]": ["<0.2", "1.5"]}), below_detection=policy)
    np.testing.assert_allclose(s.totals["NO3-"], [expected, 1.5e-3])
    assert s.flags.tolist() == ["below_detection:NO3-", ""]


def test_words_for_below_detection_and_their_limits():
    s = read_samples(_frame(**{"NO3- [mmol/kg]": ["bdl", "nd"]}))
    assert np.isnan(s.totals["NO3-"]).all()
    with pytest.raises(InputError, match="gives no detection limit"):
        read_samples(_frame(**{"NO3- [mmol/kg]": ["bdl", "1"]}), below_detection="half-limit")
    with pytest.raises(InputError, match="not a number"):
        read_samples(_frame(**{"NO3- [mmol/kg]": ["lots", "1"]}))


def test_assumed_values_are_flagged_in_every_row_that_uses_them():
    frame = _frame(**{"H2(aq) [umol/kg]": [10.0, 10.0], "O2(aq) [umol/kg]": ["assumed 100", "100"]})
    ev = evaluate(frame, [x for x in catalog() if x.name == "aerobic hydrogen oxidation"], "bdot")
    rows = ev.to_frame()
    assert "assumed:O2(aq)" in rows.loc[rows["sample"] == "a", "flags"].iloc[0]
    assert "assumed" not in rows.loc[rows["sample"] == "b", "flags"].iloc[0]
    assert rows["dGr_kJ_per_mol"].iloc[0] == pytest.approx(rows["dGr_kJ_per_mol"].iloc[1], rel=1e-12)


@pytest.mark.parametrize("T_C", [2.0, 15.0, 25.0])
def test_air_saturated_oxygen_against_gsw(T_C):
    # TEOS-10 gsw.O2sol_SP_pt (Garcia & Gordon 1992) in fresh water [umol/kg]; 3 %: the HKF
    # Henry's constant of O2 against these data (2.5 % found in test_speciation) and air's humidity
    s = read_samples(_frame(**{"T [degC]": [T_C, T_C], "O2(aq) [umol/kg]": ["air-saturated", "air-saturated"]}))
    expected = float(gsw.O2sol_SP_pt(0.0, T_C)) * 1e-6
    assert s.totals["O2(aq)"][0] == pytest.approx(expected, rel=0.03)
    assert s.flags[0] == "assumed_air_saturated:O2(aq)"


def test_alkalinity_and_dic_give_the_ph():
    # surface seawater, TA 2300 ueq/kg and DIC 2000 umol/kg at 25 C: pH about 8.1 on the total
    # scale, about 0.13 higher on the activity (NBS) scale used here (common practice); 0.1 allows
    # for the activity model and the missing borate ion pairs
    sw = {"sample": ["sw"], "T [degC]": [25.0], "P [bar]": [1.0], "Na+ [mmol/kg]": [469.0],
          "Mg^2+ [mmol/kg]": [52.8], "Ca^2+ [mmol/kg]": [10.3], "K+ [mmol/kg]": [10.2],
          "Cl- [mmol/kg]": [546.0], "SO4^2- [mmol/kg]": [28.2], "B(OH)3(aq) [umol/kg]": [416.0],
          "DIC [umol/kg]": [2000.0], "alkalinity [ueq/kg]": [2300.0]}
    r = speciate(pd.DataFrame(sw), "bdot")
    assert r.pH[0] == pytest.approx(8.1 + 0.13, abs=0.1)
    # consistency: the alkalinity of the solution, summed from its species, is the one given
    m = dict(zip(r.species, r.molality[0]))
    alk = (sum(m.get(x, 0.0) for x in ("HCO3-", "NaCO3-", "MgHCO3+", "CaHCO3+", "NaHCO3(aq)", "B(OH)4-",
                                       "OH-", "HS-", "NH3(aq)", "HSiO3-"))
           + 2 * sum(m.get(x, 0.0) for x in ("CO3^2-", "MgCO3(aq)", "CaCO3(aq)", "NaCO3-"))
           - m.get("NaCO3-", 0.0) - sum(m.get(x, 0.0) for x in ("H+", "HSO4-")) + m.get("MgOH+", 0.0))
    assert alk == pytest.approx(2300e-6, rel=1e-6)
    with_pH = speciate(pd.DataFrame({**sw, "pH": [8.0]}), "bdot")
    assert "alkalinity_not_used" in with_pH.sample_flags()[0]


def test_measured_zeros_never_print_inf():
    frame = _frame(**{"H2(aq) [umol/kg]": [0.0, 10.0], "O2(aq) [umol/kg]": [100.0, 100.0]})
    path = io.StringIO()
    frame.to_csv(path, index=False)
    import tempfile

    with tempfile.NamedTemporaryFile("w", suffix=".csv", delete=False) as f:
        f.write(path.getvalue())
    out = io.StringIO()
    with redirect_stdout(out):
        assert main(["insitu", f.name, "--reaction", "aerobic hydrogen oxidation", "--reaction",
                     "2 H2O(l) = 2 H2(aq) + O2(aq)", "--format", "csv"]) == 0
    text = out.getvalue()
    assert "inf" not in text.lower()
    rows = pd.read_csv(io.StringIO(text), keep_default_na=False)
    a = rows[rows["sample"] == "a"]
    # reactant at zero: the reaction cannot run, no energy; product at zero: dGr unbounded
    assert a["zero_species"].tolist() == ["H2(aq) (reactant)", "H2(aq) (product)"]
    assert float(a["energy_density_J_per_kg"].tolist()[0]) == 0.0
    assert a["dGr_kJ_per_mol"].tolist() == ["", ""]
