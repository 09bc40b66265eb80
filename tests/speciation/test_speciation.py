"""Sample tables, activity models and speciation against outside references."""

import gsw
import numpy as np
import pandas as pd
import pytest
from iapws._iapws import _Kw

from redoxgibbs.errors import InputError
from redoxgibbs.speciation.samples import read_samples
from redoxgibbs.speciation.solver import speciate
from redoxgibbs.water.iapws95 import psat_convention_bar, water_state

# Robinson & Stokes (1959) Electrolyte Solutions, Appendix 8.10: mean activity coefficients at
# 25 C (from memory).
NACL = {0.001: 0.965, 0.01: 0.902, 0.05: 0.821, 0.1: 0.778, 0.2: 0.735, 0.5: 0.681, 1.0: 0.657}
CACL2 = {0.001: 0.888, 0.01: 0.732, 0.05: 0.584, 0.1: 0.518, 0.2: 0.472, 0.3: 0.455}


def _salt_frame(cation, charge, molalities):
    ms = np.array(molalities)
    return pd.DataFrame({"sample": [f"m{m}" for m in ms], "T [degC]": 25.0, "P [bar]": 1.0,
                         "pH": 7.0, f"{cation} [mol/kg]": ms, "Cl- [mol/kg]": charge * ms})


def _mean_gamma(result, cation, nu_c, nu_a, m_salt):
    la = result.log10_activity
    c, a = result.species.index(cation), result.species.index("Cl-")
    log_ia = nu_c * la[:, c] + nu_a * la[:, a]
    return (10**log_ia / ((nu_c * m_salt) ** nu_c * (nu_a * m_salt) ** nu_a)) ** (1 / (nu_c + nu_a))


# Tolerances: the known accuracy of these simple published models against the measured values
# (B-dot with Kielland ion sizes: 2.5 % to 0.1 m NaCl, 10 % at 1 m; Davies: 3.5 % to 0.5 m)
@pytest.mark.parametrize("model,salt,table,limit,tol", [
    ("bdot", "NaCl", NACL, 0.1, 0.025), ("bdot", "NaCl", NACL, 1.0, 0.10),
    ("bdot", "CaCl2", CACL2, 0.1, 0.015), ("bdot", "CaCl2", CACL2, 0.34, 0.055),
    ("davies", "NaCl", NACL, 0.5, 0.035), ("davies", "CaCl2", CACL2, 0.1, 0.04)])
def test_mean_activity_coefficients_robinson_stokes(model, salt, table, limit, tol):
    ms = [m for m in table if m <= limit]
    cation, nu_c, nu_a = ("Na+", 1, 1) if salt == "NaCl" else ("Ca^2+", 1, 2)
    r = speciate(_salt_frame(cation, nu_a, ms), model)
    gamma = _mean_gamma(r, cation, nu_c, nu_a, np.array(ms))
    np.testing.assert_allclose(gamma, [table[m] for m in ms], rtol=tol)


# Reference composition of standard seawater at S = 35 (Millero et al. 2008, Deep-Sea Res. I 55,
# 50, Table 4) in mol per kg of seawater, from memory; minor ions folded into the majors.
SEAWATER = {"Na+": 0.4690691, "Mg^2+": 0.0528171, "Ca^2+": 0.0102820, "K+": 0.0102077,
            "Cl-": 0.5466582, "SO4^2-": 0.0282352, "HCO3-": 0.0017177}


def _air_o2_fugacity_bar(T_K):
    # moist air at 1 atm total pressure: 0.20946 x (1.01325 - p_H2O), p_H2O of pure water at T
    # (IAPWS-95 saturation; the lowering over seawater is 2 % of p_H2O)
    from redoxgibbs.water.iapws95 import saturation_pressure_bar
    return 0.20946 * (1.01325 - saturation_pressure_bar(np.maximum(T_K, 273.16)))


@pytest.mark.parametrize("salinity", [0.0, 35.0])
def test_air_saturated_oxygen_against_gsw_garcia_gordon_1992(salinity):
    # TEOS-10 gsw.O2sol_SP_pt (Garcia & Gordon 1992 fit of Benson & Krause 1984) [umol/kg]. The HKF
    # O2(aq) data reproduce fresh-water solubility to 2.5 % (the largest departure at 1 C); in
    # seawater the salting-out coefficient (a constant 25 C value) adds up to 4 % at the ends of
    # 0-35 C: 2.5 % and 6 %.
    T_C = np.array([1.0, 5.0, 15.0, 25.0, 35.0])
    frame = pd.DataFrame({"sample": [f"t{t}" for t in T_C], "T [degC]": T_C, "P [bar]": 1.01325,
                          "pH": 8.0 if salinity else 7.0})
    scale = salinity / 35.0
    for ion, m in SEAWATER.items():
        frame[f"{ion} [mol/kg-solution]"] = m * scale if salinity else 1e-9
    frame["O2(g) [bar]"] = _air_o2_fugacity_bar(T_C + 273.15)
    r = speciate(frame, "bdot")
    m_o2 = r.molality[:, r.species.index("O2(aq)")]
    mass_solute = sum(r.totals[i] * w for i, w in
                      [("Na+", 22.99e-3), ("Mg^2+", 24.305e-3), ("Ca^2+", 40.078e-3), ("K+", 39.098e-3),
                       ("Cl-", 35.453e-3), ("SO4^2-", 96.06e-3), ("HCO3-", 61.02e-3)])
    per_kg_solution = m_o2 / (1 + mass_solute) * 1e6
    ref = gsw.O2sol_SP_pt(salinity, T_C)
    np.testing.assert_allclose(per_kg_solution, ref, rtol=0.025 if salinity == 0 else 0.06)


def test_neutral_pH_along_saturation_against_iapws_r11_07():
    # pure water (traces of NaCl) with pH at 25 C = pKw/2, carried to T by charge balance, gives
    # the neutral pH pKw(T)/2 of IAPWS R11-07 (iapws._Kw); tolerance half that of the log Kw check
    T_C = np.array([25.0, 50, 100, 150, 200, 250, 300])
    T = T_C + 273.15
    pkw25 = _Kw(float(water_state(298.15, 1.01325).density_kg_m3), 298.15)
    frame = pd.DataFrame({"sample": [f"t{t}" for t in T_C], "T [degC]": T_C, "P [bar]": "psat",
                          "pH": pkw25 / 2, "pH T [degC]": 25.0, "Na+ [mol/kg]": 1e-12, "Cl- [mol/kg]": 1e-12})
    r = speciate(frame, "bdot")
    rho = water_state(T, psat_convention_bar(T)).density_kg_m3
    neutral = np.array([_Kw(d, t) for d, t in zip(rho, T)]) / 2
    np.testing.assert_allclose(r.pH, neutral, atol=0.016)


def _pb82(T, c):
    return c[0] + c[1] * T + c[2] / T + c[3] * np.log10(T) + c[4] / T**2


def test_dilute_carbonate_speciation_against_plummer_busenberg_constants():
    # 1 mmol/kg total carbonate, ideal activities; species fractions from Plummer & Busenberg (1982)
    # K1, K2 (coefficients from memory), computed here independently. The engine's K1 and K2 agree
    # with those to 0.02 in log K at 25-50 C, so fractions to 5 %.
    K1c = (-356.3094, -0.06091964, 21834.37, 126.8339, -1684915)
    K2c = (-107.8871, -0.03252849, 5151.79, 38.92561, -563713.9)
    T_C, pH = np.array([25.0, 25.0, 25.0, 50.0]), np.array([5.5, 7.0, 9.5, 8.0])
    frame = pd.DataFrame({"sample": list("abcd"), "T [degC]": T_C, "P [bar]": 1.01325, "pH": pH,
                          "HCO3- [mmol/kg]": 1.0, "Na+ [mmol/kg]": 1.0})
    r = speciate(frame, "ideal")
    T = T_C + 273.15
    K1, K2, h = 10 ** _pb82(T, K1c), 10 ** _pb82(T, K2c), 10.0**-pH
    # water activity is 1 - 0.02 % here; CO2(aq) + H2O = HCO3- + H+
    frac = np.column_stack([h / K1, np.ones(4), K2 / h])
    frac /= frac.sum(axis=1, keepdims=True)
    got = np.column_stack([r.molality[:, r.species.index(s)] for s in ("CO2(aq)", "HCO3-", "CO3^2-")])
    # the NaHCO3(aq) and NaCO3- pairs hold under 0.1 % of carbonate at 1 mmol/kg Na
    np.testing.assert_allclose(got / 1e-3, frac, rtol=0.05, atol=2e-4)


def _vent_frame():
    return pd.DataFrame({
        "sample": ["seawater", "vent-A", "vent-B", "alkaline"],
        "T [degC]": [2.0, 350.0, 120.0, 90.0], "P [bar]": [250.0, 250.0, 250.0, "psat"],
        "pH": [7.8, 3.4, 5.6, 11.5], "pH T [degC]": [25, 25, 25, 25],
        "Na+ [mmol/kg]": [464, 430, 460, 300], "Cl- [mmol/kg]": [545, 540, 545, 380],
        "Mg^2+ [mmol/kg]": [52.7, 0.0, 30.0, 0.001], "Ca^2+ [mmol/kg]": [10.2, 30.0, 15.0, 0.5],
        "K+ [mmol/kg]": [9.8, 24.0, 15.0, 5.0], "SO4^2- [mmol/kg]": [28.0, 0.5, 15.0, 1.0],
        "HCO3- [mmol/kg]": [2.3, 10.0, 5.0, 0.05], "HS- [mmol/kg]": [None, 6.0, 2.0, 0.1],
        "H2(aq) [mmol/kg]": [0.0004, 1.5, 0.5, 10.0], "Fe^2+ [umol/kg]": [None, 900.0, 100.0, 1.0],
        "NH4+ [umol/kg]": [0.5, 20.0, 10.0, 5.0], "CH4(aq) [mmol/kg]": [0.0003, 0.1, 0.05, 1.0],
        "SiO2(aq) [mmol/kg]": [0.1, 17.0, 8.0, 0.5]})


def test_mass_balance_and_reported_charge_balance():
    r = speciate(_vent_frame(), "bdot")
    s = read_samples(_vent_frame())
    for name, total in s.totals.items():
        measured = np.isfinite(total) & (total > 0)
        np.testing.assert_allclose(r.totals[name][measured], total[measured], rtol=1e-10)
    z = np.array([_charge(n) for n in r.species])
    np.testing.assert_allclose(r.charge_imbalance, r.molality @ z, rtol=1e-12, atol=1e-18)


def _charge(name):
    from redoxgibbs.species.database import default_database
    return default_database().record(name).charge


def test_results_do_not_depend_on_row_order():
    frame = _vent_frame()
    a = speciate(frame, "bdot")
    b = speciate(frame.iloc[::-1].reset_index(drop=True), "bdot")
    np.testing.assert_allclose(a.molality, b.molality[::-1], rtol=1e-9, atol=1e-30)
    np.testing.assert_allclose(a.pH, b.pH[::-1], rtol=1e-12)


def test_unmeasured_is_not_zero_and_blank_means_absent():
    r = speciate(_vent_frame(), "bdot")
    i = r.species.index("HS-")
    assert not r.present[0, i] and r.molality[0, i] == 0.0
    assert r.present[1, i]


def test_pH_from_charge_balance():
    frame = _vent_frame().drop(columns=["pH", "pH T [degC]"])
    with pytest.raises(InputError, match="no pH given"):
        speciate(frame)
    r = speciate(frame, pH_from_charge_balance=True)
    np.testing.assert_allclose(r.charge_imbalance, 0.0, atol=1e-12)


@pytest.mark.parametrize("column,value,message", [
    ("Na+ [mmol/kg]", -1.0, "below the allowed amount"), ("Na+ [mmol/kg]", "lots", "not a number"),
    ("pH", 17.0, "above the allowed pH"), ("Nax+ [mmol/kg]", 1.0, "did you mean"),
    ("Na+ [furlong]", 1.0, "not an amount unit")])
def test_bad_input_names_row_column_and_reason(column, value, message):
    frame = _vent_frame()[["sample", "T [degC]", "P [bar]", "pH", "Cl- [mmol/kg]"]].copy()
    frame[column] = frame.get(column, 1.0)
    frame[column] = frame[column].astype(object)
    frame.loc[1, column] = value
    with pytest.raises(InputError, match=message):
        read_samples(frame)


@pytest.mark.parametrize("column,value,message", [
    ("T [degC]", 1200.0, "above 1000 degC"), ("P [bar]", 6000.0, "above 5000 bar"),
    ("T [degC]", -30.0, "below -20 degC"), ("P [bar]", 1.0, "vapour"), ("T [degC]", 400.0, "gas-like")])
def test_states_outside_validity_fail_their_own_row_only(column, value, message):
    frame = _vent_frame()
    frame[column] = frame[column].astype(object)
    frame.loc[1, column] = value
    if column == "P [bar]" and value == 1.0:
        frame.loc[1, "T [degC]"] = 200.0
    if value == 400.0:
        frame.loc[1, "P [bar]"] = 100.0
    r = speciate(frame)
    assert message in r.failure[1] and np.isnan(r.pH[1])
    assert (r.failure[[0, 2]] == "").all() and np.isfinite(r.pH[[0, 2]]).all()


def test_hard_samples_converge():
    # Fe(III) in alkaline water, the pH extremes of the accepted range, hot low-pressure fluid
    frame = pd.DataFrame({"sample": ["Fe(III) at pH 10.5", "pH -1.9", "pH 15.9", "400 C, 300 bar"],
                          "T [degC]": [25.0, 25.0, 25.0, 400.0], "P [bar]": [1.0, 1.0, 1.0, 300.0],
                          "pH": [10.5, -1.9, 15.9, 5.0], "Na+ [mmol/kg]": 100.0, "Cl- [mmol/kg]": 100.0,
                          "HCO3- [mmol/kg]": 2.0, "Fe^3+ [umol/kg]": [1.0, 0.0, 0.0, 0.0]})
    r = speciate(frame)
    assert (r.failure == "").all(), r.failure
    np.testing.assert_allclose(r.pH, frame["pH"])


def test_blank_text_cells_are_not_measured():
    frame = _vent_frame()[["sample", "T [degC]", "P [bar]", "pH", "Cl- [mmol/kg]"]].copy()
    frame["Na+ [mmol/kg]"] = pd.Series([1.0] * len(frame), dtype=object)
    frame.loc[1, "Na+ [mmol/kg]"] = "  "
    s = read_samples(frame)
    assert np.isnan(s.totals["Na+"][1]) and s.totals["Na+"][0] == pytest.approx(1e-3)


def test_units_mass_and_volume_based():
    # 23 mg/L of Na+ at density 1.0 is 1.0004 mmol per kg of water here (trace solution); ppm by
    # mass likewise; 1 mmol/L with the density estimated is flagged as estimated
    frame = pd.DataFrame({"sample": ["a"], "T [degC]": [25.0], "P [bar]": [1.0], "pH": [7.0],
                          "Na+ [mg/L]": [22.98977], "Cl- [ppm]": [35.453], "density [g/cm3]": [1.0]})
    s = read_samples(frame)
    assert s.totals["Na+"][0] == pytest.approx(1e-3 / (1.0 - 0.0584e-3), rel=1e-4)
    assert s.totals["Cl-"][0] == pytest.approx(1e-3, rel=1e-3)
    frame2 = frame.drop(columns=["density [g/cm3]"]).rename(columns={"Na+ [mg/L]": "Na+ [mmol/L]"})
    assert read_samples(frame2).density_estimated[0]


@pytest.mark.xfail(strict=True, reason="known departure: no chloride complexes (HCl(aq), NaCl(aq) beyond "
                   "150 C, KCl(aq), CaCl+, CaCl2(aq)) on revised HKF, so a hot acid chloride fluid comes out "
                   "too acid in situ (3.7 here); see DEVELOPERS.md, known departures")
def test_in_situ_pH_of_a_hot_acid_chloride_fluid():
    # a 350 C vent fluid of pH 3.5 at 25 C and 0.55 mol/kg chloride: calculated and measured in-situ
    # pH of such fluids lie near 4.5-5 (from memory; the band of published vent-fluid studies),
    # so 4.3 is a generous floor
    frame = pd.DataFrame({"sample": ["hot"], "T [degC]": [350.0], "P [bar]": [300.0], "pH": [3.5],
                          "pH T [degC]": [25.0], "Na+ [mmol/kg]": [500.0], "Cl- [mmol/kg]": [550.0],
                          "Ca^2+ [mmol/kg]": [25.0], "K+ [mmol/kg]": [20.0], "HCO3- [mmol/kg]": [5.0],
                          "HS- [mmol/kg]": [5.0]})
    assert float(speciate(frame, "bdot").pH[0]) > 4.3
