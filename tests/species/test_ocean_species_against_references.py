"""Species of ocean fluids (borate, fluoride, silicate anion, anhydrite, brucite) against outside values.

Solids here take their 25 C values from the CRC Handbook tables carried by the chemicals package
(NBS values) and heat capacities from the JANAF tables in cantera; dissociation constants are
checked against published measurements (each marked where recalled from memory).
"""

import numpy as np
import pandas as pd
import pytest

from redoxgibbs.reactions.reaction import reaction_properties
from redoxgibbs.speciation.solver import speciate


def _logK(reaction, T_C, P="psat"):
    return reaction_properties(reaction, np.asarray(T_C, float), P).logK


def test_boric_acid_against_manov_1944():
    # Manov, DeLollis & Acree (1944) J. Res. Natl. Bur. Stand. 33, 287 (0-60 C; memory):
    # pK = 2237.94/T - 3.305 + 0.016883 T. 0.03 at 25 C: the NBS Gibbs energies give pK to 0.02;
    # 0.06 over 0-60 C: B(OH)4- is a formation species at constant reaction enthalpy, which leaves
    # out the ionization heat capacity (-193 J/mol/K from this fit), 0.05 in pK at 60 C
    T = np.array([0.0, 25.0, 40.0, 60.0])
    expected = 2237.94 / (T + 273.15) - 3.305 + 0.016883 * (T + 273.15)
    got = -_logK("B(OH)3(aq) + H2O(l) = B(OH)4- + H+", T)
    assert got[1] == pytest.approx(expected[1], abs=0.03)
    np.testing.assert_allclose(got, expected, atol=0.06)


def test_hydrofluoric_acid_at_25C():
    # pK 3.17 at 25 C (common practice; e.g. the CRC Handbook's dissociation constants, memory)
    assert -_logK("HF(aq) = F- + H+", [25.0])[0] == pytest.approx(3.17, abs=0.03)


@pytest.mark.parametrize("reaction,logK,tol", [
    # Nordstrom et al. (1990) ACS Symp. Ser. 416, 398, Table 2 (memory); tolerances: the spread of
    # the compilations (NBS, JANAF, Robie & Hemingway) for these solids
    ("anhydrite = Ca^2+ + SO4^2-", -4.36, 0.1),
    ("brucite + 2 H+ = Mg^2+ + 2 H2O(l)", 16.84, 0.3),
    ("rhodochrosite = Mn^2+ + CO3^2-", -11.13, 0.6),
])
def test_solubility_of_ocean_solids_at_25C(reaction, logK, tol):
    assert _logK(reaction, [25.0])[0] == pytest.approx(logK, abs=tol)


SEAWATER = {"Na+": 469.0, "Mg^2+": 52.8, "Ca^2+": 10.3, "K+": 10.2, "Cl-": 546.0, "SO4^2-": 28.2,
            "HCO3-": 2.05}   # mmol/kg water, standard seawater near S = 35 (Millero et al. 2008)


def _seawater(T_C, P_bar, pH):
    frame = pd.DataFrame({"sample": [f"sw {t}" for t in T_C], "T [degC]": T_C, "P [bar]": P_bar, "pH": pH})
    for sp, m in SEAWATER.items():
        frame[f"{sp} [mmol/kg]"] = m
    frame["B(OH)3(aq) [umol/kg]"] = 416.0      # total boron at S = 35 (Uppstrom 1974; memory)
    return frame


def _borate_share(result):
    m = dict(zip(result.species, result.molality[0]))
    borate = m["B(OH)4-"]
    carbonate = (m["HCO3-"] + 2 * m["CO3^2-"] + sum(m.get(s, 0.0) for s in ("NaCO3-", "MgHCO3+", "CaHCO3+"))
                 + 2 * sum(m.get(s, 0.0) for s in ("MgCO3(aq)", "CaCO3(aq)")))
    return borate / (borate + carbonate + m["OH-"])


def test_borate_counts_in_seawater_alkalinity():
    assert _borate_share(speciate(_seawater([25.0], [1.0], [8.1]), "bdot")) > 0.015


@pytest.mark.parametrize("model", [
    "pitzer",
    pytest.param("bdot", marks=pytest.mark.xfail(strict=True, reason=(
        "known departure: B-dot without borate ion pairs (MgB(OH)4+, CaB(OH)4+) puts 1.9 % of seawater "
        "alkalinity on borate, against 3-4 % measured (KB* 0.3 from Dickson 1990)")))])
def test_borate_share_of_seawater_alkalinity_is_three_to_four_percent(model):
    # common practice: borate is 3-4 % of the total alkalinity of surface seawater (Pitzer: 2.7 %
    # at pH 8.1 on the activity scale, its KB* within 0.05 of Dickson 1990)
    assert 0.025 < _borate_share(speciate(_seawater([25.0], [1.0], [8.1]), model)) < 0.05


def test_heated_seawater_saturates_anhydrite():
    # common practice: seawater becomes saturated with anhydrite when heated past about 150 C,
    # which is why anhydrite lines vent chimneys; it is undersaturated at 25 C
    r = speciate(_seawater([25.0, 250.0], [250.0, 250.0], [8.1, np.nan]), "bdot", pH_from_charge_balance=True)
    si = r.saturation_index[:, r.minerals.index("anhydrite")]
    assert si[0] < -0.5 and si[1] > 0


def test_henry_constants_of_carbon_monoxide_and_methanol_at_25C():
    # Sander (2015) Atmos. Chem. Phys. 15, 4399, recommended Henry's-law solubilities at 25 C
    # (memory): CO 9.7e-6 mol/(m3 Pa) = 9.7e-4 mol/(kg bar); methanol 2.2 mol/(m3 Pa) = 220
    # mol/(kg bar). Methanol's gas comes from the CRC Handbook table in the chemicals 1.5.2 data
    # files (-162.3 kJ/mol). 0.1 in log10: the scatter of the compiled measurements
    from redoxgibbs.constants import R_J_MOL_K
    from redoxgibbs.species.database import default_database

    assert _logK("CO(g) = CO(aq)", [25.0])[0] == pytest.approx(np.log10(9.7e-4), abs=0.1)
    G_aq = default_database().record("CH3OH(aq)").G_f
    logK = -(G_aq - (-162.3e3)) / (R_J_MOL_K * 298.15 * np.log(10))
    assert logK == pytest.approx(np.log10(220.0), abs=0.1)


def test_ammonium_dissociation_against_bates_pinching_1949():
    # Bates & Pinching (1949) J. Res. Natl. Bur. Stand. 42, 419 (0-50 C; memory):
    # pK = 2835.76/T - 0.6322 + 0.001225 T. 0.02: NH3(aq) is a formation species at constant
    # enthalpy (the ionization heat capacity is small, about 0 +- 10 J/mol/K)
    T = np.array([0.0, 10.0, 25.0, 40.0, 50.0])
    expected = 2835.76 / (T + 273.15) - 0.6322 + 0.001225 * (T + 273.15)
    np.testing.assert_allclose(-_logK("NH4+ = NH3(aq) + H+", T), expected, atol=0.02)


def test_phosphoric_acid_dissociation_against_bates_and_acree():
    # Bates (1951) J. Res. Natl. Bur. Stand. 47, 127: pK1 = 799.31/T - 4.5535 + 0.013486 T; Bates &
    # Acree (1943) J. Res. Natl. Bur. Stand. 30, 129: pK2 = 2073.0/T - 5.9884 + 0.020912 T (0-60 C;
    # both from memory). 0.03 in pK1; 0.08 in pK2: H2PO4- is a formation species at constant
    # enthalpy, and the ionization's heat capacity (about -220 J/mol/K) bends pK2 by 0.06 at 0 C
    T = np.array([0.0, 25.0, 50.0]) + 273.15
    pk1 = 799.31 / T - 4.5535 + 0.013486 * T
    pk2 = 2073.0 / T - 5.9884 + 0.020912 * T
    np.testing.assert_allclose(-_logK("H3PO4(aq) = H2PO4- + H+", T - 273.15), pk1, atol=0.03)
    np.testing.assert_allclose(-_logK("H2PO4- = HPO4^2- + H+", T - 273.15), pk2, atol=0.08)


def test_third_dissociation_of_phosphoric_acid_at_25C():
    # CRC Handbook, "Dissociation constants of inorganic acids and bases": pK3 = 12.32 (recent
    # editions) to 12.375 (older ones; both from memory): 0.06
    assert -float(_logK("HPO4^2- = PO4^3- + H+", [25.0])[0]) == pytest.approx(12.35, abs=0.06)
