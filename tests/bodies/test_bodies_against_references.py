"""The ocean column of an icy body and the body-scale supply models, against outside sources.

- pressure at depth: the closed form for uniform density (self-gravity of the shells above), the
  thin-shell limit rho g h (common practice), and a hand integration of the hydrostatic equation
  with IAPWS-95 densities from the iapws package;
- the temperature at the ice-ocean interface of a seawater ocean against TEOS-10 (gsw.t_freezing);
- the supply models against hand computation from their published stoichiometry and, for the
  hydrothermal one, IAPWS-95 enthalpies from the iapws package.
"""

import warnings

import gsw
import numpy as np
import pandas as pd
import pytest
from iapws import IAPWS95
from reference_equations import SEAWATER

from redoxgibbs.bodies.body import G_NEWTON, Body, pressure_uniform_density_Pa
from redoxgibbs.energetics.body_supply import (
    h2_from_serpentinization_mol_per_s,
    hydrothermal_mass_flux_kg_per_s,
    oxidant_delivery_mol_per_s,
    surviving_fraction_first_order,
)
from redoxgibbs.errors import InputError
from redoxgibbs.speciation.samples import read_samples
from redoxgibbs.speciation.solver import speciate

MOON = Body("invented moon", radius_km=1500.0, ice_shell_km=20.0, ocean_depth_km=100.0, surface_gravity_m_s2=1.3)


def test_uniform_density_column_against_its_closed_form():
    rho = 1030.0
    depth_km = np.array([0.0, 10.0, 55.0, 100.0])
    P = MOON.pressure_bar(depth_km, lambda P_bar: np.full(P_bar.shape, rho))
    r_i = MOON.interface_radius_m
    expected = MOON.interface_pressure_bar() + pressure_uniform_density_Pa(
        MOON.mass - MOON.ice_mass_kg, r_i, r_i - depth_km * 1e3, rho) / 1e5
    np.testing.assert_allclose(P, expected, rtol=1e-9)   # the Runge-Kutta error, stated in body.py


def test_thin_shell_limit_is_rho_g_h():
    # a 1 km shell and 1 km of ocean on a 6000 km body: rho g h within (h / R) of the exact column
    big = Body("big", radius_km=6000.0, ice_shell_km=1.0, ocean_depth_km=1.0, surface_gravity_m_s2=9.8,
               ice_density_kg_m3=917.0)
    assert big.interface_pressure_bar() == pytest.approx(917.0 * 9.8 * 1e3 / 1e5, rel=1e-3)
    P = big.pressure_bar(np.array([1.0]), lambda P_bar: np.full(P_bar.shape, 1000.0))
    assert float(P[0]) == pytest.approx((917.0 + 1000.0) * 9.8 * 1e3 / 1e5, rel=1e-3)


def _iapws_density(T_K, P_bar):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        return IAPWS95(T=T_K, P=P_bar / 10.0).rho     # MPa


def test_pure_water_column_against_a_hand_integration_with_the_iapws_package():
    T = 275.0
    depth = 100e3
    steps = 500
    h = depth / steps
    P = MOON.interface_pressure_bar() * 1e5
    m = MOON.ice_mass_kg
    r = MOON.interface_radius_m
    for _ in range(steps):     # explicit midpoint steps, the density of the iapws package
        rho = _iapws_density(T, P / 1e5)
        g = G_NEWTON * (MOON.mass - m) / r**2
        P_mid, m_mid, r_mid = P + 0.5 * h * rho * g, m + 0.5 * h * 4 * np.pi * r**2 * rho, r - 0.5 * h
        rho_mid = _iapws_density(T, P_mid / 1e5)
        P += h * rho_mid * G_NEWTON * (MOON.mass - m_mid) / r_mid**2
        m += h * 4 * np.pi * r_mid**2 * rho_mid
        r -= h
    frame = pd.DataFrame({"sample": ["floor"], "depth [km]": [100.0], "T [degC]": [T - 273.15], "pH": [7.0],
                          "Na+ [mol/kg]": [0.0], "Cl- [mol/kg]": [0.0]})
    ours = read_samples(frame, body=MOON).P_bar[0]
    # 1e-6: the hand integration's step error, with densities of two IAPWS-95 implementations
    assert ours == pytest.approx(P / 1e5, rel=1e-6)


def test_interface_temperature_of_a_seawater_ocean_against_teos10():
    frame = pd.DataFrame({"sample": ["interface", "floor"], "depth [km]": [0.0, 100.0], "T [degC]": [None, 2.0],
                          "pH": 8.1})
    for sp, x in SEAWATER.items():
        frame[f"{sp} [mol/kg-solution]"] = x
    samples = read_samples(frame, body=MOON)
    result = speciate(samples, "pitzer")
    assert result.failure[0] == "" and "T_at_freezing_point" in result.sample_flags()[0]
    p_dbar = (result.P_bar[0] - 1.01325) * 10.0
    # 0.02 K: the Pitzer water activity (0.2 % in ln a_w) without its pressure dependence at ~240 bar
    assert result.T_K[0] - 273.15 == pytest.approx(gsw.t_freezing(35.16504, p_dbar, 0.0), abs=0.02)
    assert result.T_K[1] == pytest.approx(275.15)


def test_positions_outside_the_ocean_and_depths_without_a_body_are_refused():
    frame = pd.DataFrame({"sample": ["deep"], "depth [km]": [150.0], "T [degC]": [2.0], "pH": [8.0],
                          "Na+ [mol/kg]": [0.5], "Cl- [mol/kg]": [0.5]})
    with pytest.raises(InputError, match="outside the ocean"):
        read_samples(frame, body=MOON)
    with pytest.raises(InputError, match=r"needs the body"):
        read_samples(frame)
    with pytest.raises(InputError, match="either mass_kg or surface_gravity"):
        Body("x", radius_km=100.0, ice_shell_km=1.0, ocean_depth_km=1.0)


def test_serpentinization_hydrogen_by_hand():
    # 2 FeO + H2O -> Fe2O3 + H2: 1e9 kg/yr, 8 wt% FeO (71.844 g/mol), 30 % of the Fe(II) oxidized
    expected = 1e9 * 0.08 / 0.071844 * 0.30 / 2.0 / (365.25 * 86400)
    assert h2_from_serpentinization_mol_per_s(1e9, 0.08, 0.30) == pytest.approx(expected, rel=1e-12)
    assert expected == pytest.approx(5.29, rel=1e-3)


def test_oxidant_delivery_by_hand():
    area = 4 * np.pi * (1500e3) ** 2
    no_loss = oxidant_delivery_mol_per_s(1e-3, area, 0.5, 1e7)
    assert no_loss == pytest.approx(1e-3 * area * 0.5 / (365.25 * 86400), rel=1e-12)
    # a lifetime equal to the surface age keeps (1 - 1/e) of the production
    assert surviving_fraction_first_order(1e7, 1e7) == pytest.approx(1 - np.exp(-1), rel=1e-12)
    assert surviving_fraction_first_order(1.0, 1e12) == pytest.approx(1.0, abs=1e-11)


def test_hydrothermal_mass_flux_against_iapws_enthalpies():
    Q, T, P, dT = 1e9, 275.15, 200.0, 90.0
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        dh = (IAPWS95(T=T + dT, P=P / 10).h - IAPWS95(T=T, P=P / 10).h) * 1e3    # kJ/kg -> J/kg
    assert hydrothermal_mass_flux_kg_per_s(Q, T, P, dT) == pytest.approx(Q / dh, rel=1e-6)
