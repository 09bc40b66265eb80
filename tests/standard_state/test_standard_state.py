"""Standard-state properties of species and reactions against outside references."""

import cantera as ct
import numpy as np
import pytest
from iapws._iapws import _Kw
from reference_equations import G7_04, M_WATER_KG, g7_04_henry_constant_bar

from redoxgibbs.reactions.reaction import reaction_properties
from redoxgibbs.species.properties import standard_properties
from redoxgibbs.water.iapws95 import saturation_pressure_bar

R = 8.314462618
LN10 = np.log(10)


# --- ionization of water: IAPWS R11-07 (Bandura & Lvov 2006), through the iapws package -------
# Tolerances are the measured disagreement of the revised-HKF data (OH-, Shock & Helgeson 1988)
# with R11-07, which grows with pressure at low temperature and with temperature at high pressure,
# where the HKF fit had few data; R11-07's own uncertainty is 0.01-0.05 at saturation and larger
# at high pressure. Above 400 C (densities below 0.7 g/cm3) the two depart by 0.3 or more and are
# not compared here (see DEVELOPERS.md, "Known departures").
KW_CASES = [("psat", [0.01, 25, 50, 100, 150, 200, 250, 300], 0.03), ("psat", [350], 0.07),
            (500.0, [0.01, 25, 100, 200, 300, 400], 0.07), (1000.0, [0.01, 25, 100, 200, 300, 400], 0.12),
            (2000.0, [0.01, 25, 100, 200, 300, 400], 0.17), (5000.0, [0.01, 25, 100, 200, 300, 400], 0.30)]


@pytest.mark.parametrize("P,T_C,tol", KW_CASES)
def test_log_kw_against_iapws_r11_07(P, T_C, tol):
    p = reaction_properties("H2O(l) = H+ + OH-", T_C, P)
    sp = standard_properties(["H2O(l)"], p.T_K, p.P_bar)
    ref = np.array([-_Kw(rho, T) for rho, T in zip(sp.water_density_kg_m3, p.T_K)])
    assert np.abs(p.logK - ref).max() < tol


# --- carbonic acid and CO2 solubility: Plummer & Busenberg (1982) Geochim. Cosmochim. Acta 46,
# 1011, Table 5 fits (coefficients from memory), valid 0-250 C at psat. The fits reproduce their
# data to about 0.01-0.03; the HKF data were fitted to partly different data sets.
def _pb82(T, c):
    return c[0] + c[1] * T + c[2] / T + c[3] * np.log10(T) + c[4] / T**2


PB82_K1 = (-356.3094, -0.06091964, 21834.37, 126.8339, -1684915)
PB82_K2 = (-107.8871, -0.03252849, 5151.79, 38.92561, -563713.9)
PB82_KH = (108.3865, 0.01985076, -6919.53, -40.45154, 669365)
PB82_KC = (-171.9065, -0.077993, 2839.319, 71.595, 0.0)
T_PB = np.array([0.01, 25, 50, 75, 100, 150, 200, 250])


def test_carbonic_acid_first_dissociation():
    p = reaction_properties("CO2(aq) + H2O(l) = HCO3- + H+", T_PB, "psat")
    assert np.abs(p.logK - _pb82(p.T_K, PB82_K1)).max() < 0.06


def test_co2_solubility_henry_constant():
    p = reaction_properties("CO2(g) = CO2(aq)", T_PB, "psat")
    assert np.abs(p.logK - _pb82(p.T_K, PB82_KH)).max() < 0.06


def test_carbonic_acid_second_dissociation_and_calcite_to_100C():
    T = T_PB[T_PB <= 100]
    p2 = reaction_properties("HCO3- = CO3^2- + H+", T, "psat")
    pc = reaction_properties("calcite = Ca^2+ + CO3^2-", T, "psat")
    assert np.abs(p2.logK - _pb82(p2.T_K, PB82_K2)).max() < 0.08
    assert np.abs(pc.logK - _pb82(pc.T_K, PB82_KC)).max() < 0.06


@pytest.mark.xfail(strict=True, reason="known: CO3^2- above 100 C departs from Plummer & Busenberg "
                   "(1982) by up to 0.4 in log K2 at 250 C; its HKF parameters were entered from "
                   "memory and await a check against the source table")
def test_carbonic_acid_second_dissociation_above_100C():
    T = T_PB[T_PB > 100]
    p2 = reaction_properties("HCO3- = CO3^2- + H+", T, "psat")
    assert np.abs(p2.logK - _pb82(p2.T_K, PB82_K2)).max() < 0.08


def test_quartz_solubility_rimstidt_1997():
    # Rimstidt (1997) Geochim. Cosmochim. Acta 61, 2553: log K = -0.0254 - 1107.12 / T (0-300 C,
    # psat; from memory). Below 100 C the HKF SiO2(aq) data sit 0.1-0.5 below this fit, a
    # disagreement in the literature on low-temperature quartz solubility; checked from 100 C.
    T = np.array([100.0, 150, 200, 250, 300])
    p = reaction_properties("quartz = SiO2(aq)", T, "psat")
    assert np.abs(p.logK - (-0.0254 - 1107.12 / p.T_K)).max() < 0.1


# --- Henry's constants: IAPWS G7-04 (coefficients and citation in reference_equations.py),
# converted to molality: log K = log10(1 / (kH M_w)). The HKF gas parameters (Shock et al. 1989)
# were fitted to older data and depart by up to 0.08 at 300 C: 0.05 up to 250 C, 0.1 at 300 C.
@pytest.mark.parametrize("gas", sorted(G7_04))
def test_gas_solubility_against_iapws_g7_04(gas):
    T = np.array([5.0, 25, 50, 100, 150, 200, 250, 300]) + 273.15
    P = saturation_pressure_bar(T)
    ref = -np.log10(g7_04_henry_constant_bar(gas, T, P) * M_WATER_KG)
    p = reaction_properties(f"{gas}(g) = {gas}(aq)", T - 273.15, P)
    assert np.abs(p.logK - ref)[:-1].max() < 0.05
    assert abs(p.logK - ref)[-1] < 0.1


# --- 25 C values against the NBS tables: Wagman et al. (1982) J. Phys. Chem. Ref. Data 11,
# Suppl. 2 (from memory). The HKF data adopt partly different 25 C values; tolerances are the
# documented spread between the compilations, 0.6 in log K.
@pytest.mark.parametrize("reaction,logK_ref,tol", [
    ("H2O(l) = H+ + OH-", -13.995, 0.01),                         # common practice (R11-07: 13.995)
    ("CO2(aq) + H2O(l) = HCO3- + H+", -6.352, 0.02),             # Plummer & Busenberg 1982
    ("HS- + H+ = H2S(aq)", 6.99, 0.1),                            # Nordstrom et al. 1990 (6.994)
    ("NH4+ = NH3(aq) + H+", -9.252, 0.01),                        # Bates & Pinching 1949
    ("HSO4- = SO4^2- + H+", -1.988, 0.05),                        # Nordstrom et al. 1990
    ("CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)", 33.94, 0.1),      # Amend & Shock 2001, -193.7 kJ/mol
])
def test_25C_log_k(reaction, logK_ref, tol):
    assert float(reaction_properties(reaction, 25.0, 1.0).logK) == pytest.approx(logK_ref, abs=tol)


@pytest.mark.parametrize("name,G_kJ", [("H2O(l)", -237.129), ("OH-", -157.244), ("Na+", -261.905),
                                       ("Cl-", -131.228), ("HCO3-", -586.77), ("CO3^2-", -527.81),
                                       ("SO4^2-", -744.53), ("NH4+", -79.31), ("NO3-", -111.25),
                                       ("CO2(aq)", -385.98), ("CO2(g)", -394.359), ("calcite", -1128.79),
                                       ("quartz", -856.64), ("magnetite", -1015.4)])
def test_25C_gibbs_energies_of_formation_nbs(name, G_kJ):
    # NBS tables (Wagman et al. 1982), from memory; the HKF and Helgeson et al. (1978) data differ
    # from them by up to about 3 kJ/mol for some minerals (magnetite); 1.5 kJ/mol otherwise
    sp = standard_properties([name], np.array([298.15]), np.array([1.0]))
    tol = 3.5 if name == "magnetite" else 1.5
    assert sp.G[0, 0] / 1000 == pytest.approx(G_kJ, abs=tol)


# --- ideal-gas reactions against cantera's own NASA gas thermochemistry, 25-600 C --------------
def _cantera_gas(species_coeffs, T):
    gas = {s.name: s for s in ct.Species.list_from_file("nasa_gas.yaml")}
    h = sum(c * gas[n].thermo.h(T) for n, c in species_coeffs.items()) / 1000
    s = sum(c * gas[n].thermo.s(T) for n, c in species_coeffs.items()) / 1000
    return h - T * s, h, s


@pytest.mark.parametrize("reaction,coeffs", [
    ("CO2(g) + 4 H2(g) = CH4(g) + 2 H2O(g)", {"CO2": -1, "H2": -4, "CH4": 1, "H2O": 2}),
    ("2 H2(g) + O2(g) = 2 H2O(g)", {"H2": -2, "O2": -1, "H2O": 2}),
    ("N2(g) + 3 H2(g) = 2 NH3(g)", {"N2": -1, "H2": -3, "NH3": 2}),
    ("CO(g) + H2O(g) = CO2(g) + H2(g)", {"CO": -1, "H2O": -1, "CO2": 1, "H2": 1}),
])
def test_ideal_gas_reactions_against_cantera(reaction, coeffs):
    T_C = np.array([25.0, 100, 200, 400, 600])
    p = reaction_properties(reaction, T_C, 1.0)
    G, H, S = np.array([_cantera_gas(coeffs, T) for T in p.T_K]).T
    # enthalpy increments follow the NASA polynomials exactly; the 25 C anchors are the NBS values
    # of the records, whose reaction entropies differ from NASA's by up to 0.7 J/mol/K (NH3) and
    # reaction enthalpies by up to 0.2 kJ/mol, so dG0 may drift by 0.7 J/mol/K x (T - 25 C)
    assert np.abs((p.dH0 - p.dH0[0]) - (H - H[0])).max() < 1e-6
    assert np.abs(p.dS0 - S).max() < 0.8
    assert np.abs(p.dG0 - G).max() < 200.0 + 0.8 * (p.T_K.max() - 298.15)


# --- minerals against cantera's NASA condensed-phase data (JANAF-based), 25-500 C -------------
@pytest.mark.parametrize("mineral,nasa_name,T_max", [("calcite", "CaCO3(caL)", 773.15),
                                                      ("pyrite", "FeS2(s)", 773.15),
                                                      ("hematite", "Fe2O3(s)", 773.15),
                                                      ("magnetite", "Fe3O4(s)", 600.0)])
def test_mineral_heat_content_against_nasa_condensed(mineral, nasa_name, T_max):
    # Maier-Kelley fits of Helgeson et al. (1978) against JANAF-based polynomials: increments of
    # H within 1.5 % and S within 1.5 J/mol/K (the two compilations' own spread for these solids;
    # magnetite only to 600 K, below the rise of its Curie-point anomaly, which the Maier-Kelley
    # segment does not follow)
    thermo = {s.name: s for s in ct.Species.list_from_file("nasa_condensed.yaml")}[nasa_name].thermo
    T = np.linspace(300.0, T_max, 8)
    sp = standard_properties([mineral], T, np.ones_like(T))
    dH_ref = np.array([thermo.h(t) - thermo.h(300.0) for t in T]) / 1000
    S_ref = np.array([thermo.s(t) for t in T]) / 1000
    dH = sp.H[:, 0] - sp.H[0, 0]
    assert np.abs(dH - dH_ref).max() <= 0.015 * np.abs(dH_ref).max()
    assert np.abs(sp.S[:, 0] - S_ref).max() < 1.5


@pytest.mark.parametrize("reaction,logK", [
    # Nordstrom et al. (1990) ACS Symp. Ser. 416, Table 2 (from memory): the inputs of the
    # formation records, recovered through chains of formation species (Fe^3+ from Fe^2+)
    ("Fe^3+ + H2O(l) = FeOH^2+ + H+", -2.19), ("Fe^3+ + 4 H2O(l) = Fe(OH)4- + 4 H+", -21.6),
    ("ferrihydrite + 3 H+ = Fe^3+ + 3 H2O(l)", 4.891), ("Fe^2+ + SO4^2- = FeSO4(aq)", 2.25),
    ("Mg^2+ + SO4^2- = MgSO4(aq)", 2.37)])
def test_formation_constants_survive_chains(reaction, logK):
    assert float(reaction_properties(reaction, 25.0, 1.0).logK) == pytest.approx(logK, abs=1e-6)
