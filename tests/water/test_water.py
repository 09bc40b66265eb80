"""Water layer against IAPWS releases and the iapws reference library."""

import iapws
import numpy as np
import pytest
from iapws._iapws import _Dielectric

from redoxgibbs.errors import OutOfValidityError
from redoxgibbs.water.born import born_functions, debye_hueckel_A, debye_hueckel_B
from redoxgibbs.water.dielectric import dielectric_along_TP
from redoxgibbs.water.iapws95 import (
    psat_convention_bar,
    saturation_pressure_bar,
    water_state,
)
from redoxgibbs.water.melting import (
    melting_pressure_ice_Ih,
    melting_pressure_ice_III,
    melting_pressure_ice_V,
    melting_pressure_ice_VI,
    melting_temperature,
)

STATES = [(273.16, 1.0), (298.15, 1.0), (373.15, 10.0), (473.15, 50.0), (573.15, 500.0),
          (650.0, 300.0), (673.15, 500.0), (873.15, 1000.0), (1273.15, 5000.0), (298.15, 5000.0),
          (253.15, 2000.0), (273.15, 1.01325), (647.1, 220.7)]


@pytest.mark.parametrize("T,P", STATES)
def test_iapws95_against_iapws_package(T, P):
    # reference: iapws package, IAPWS-95 (Wagner & Pruss 2002); same equation, so agreement is
    # limited by the two density solvers only (1e-9); per-kg Cp through cantera's molar mass
    w = water_state(T, P)
    ref = iapws.IAPWS95(T=T, P=P / 10.0)
    assert w.density_kg_m3 == pytest.approx(ref.rho, rel=1e-8)  # 1e-8 also beside T_c
    assert w.alpha_per_K == pytest.approx(ref.alfav, rel=1e-6, abs=1e-9)
    assert w.Cp_J_mol_K / 18.015 == pytest.approx(ref.cp, rel=1e-6)
    assert w.beta_per_bar == pytest.approx(ref.kappa * 1e-1, rel=1e-6)


def test_helmholtz_derivatives_against_r6_95_check_values():
    # IAPWS R6-95(2018) Table 6 (from memory): T = 500 K, rho = 838.025 kg/m3
    from redoxgibbs.water import helmholtz

    delta, tau = np.array([838.025 / 322.0]), np.array([647.096 / 500.0])
    r, i0 = helmholtz.residual(delta, tau), helmholtz.ideal(delta, tau)
    expected_r = {"phi": -0.342693206e1, "d": -0.364366650, "dd": 0.856063701, "t": -0.581403435e1,
                  "tt": -0.223440737e1, "dt": -0.112176915e1}
    expected_0 = {"phi": 0.204797733e1, "d": 0.384236747, "dd": -0.147637878, "t": 0.904611106e1,
                  "tt": -0.193249185e1}
    for k, v in expected_r.items():
        assert getattr(r, k)[0] == pytest.approx(v, rel=1e-8), k
    for k, v in expected_0.items():
        assert getattr(i0, k)[0] == pytest.approx(v, rel=1e-8), k


def _liquid_like(T, P):
    """The states (T [K], P [bar]) not refused as gas-like (supercritical below the critical
    density), told by cantera's own (T, P) search."""
    from redoxgibbs.water.iapws95 import RHO_CRITICAL, T_CRITICAL_K, _phase

    phase = _phase()
    keep = []
    for t, p in zip(T, P):
        phase.TP = t, p * 1e5
        keep.append(t < T_CRITICAL_K or phase.density >= RHO_CRITICAL)
    keep = np.array(keep)
    assert keep.sum() > 0.6 * keep.size
    return T[keep], P[keep]


def test_gas_like_supercritical_water_is_refused():
    with pytest.raises(OutOfValidityError, match="gas-like"):
        water_state(673.15, 100.0)
    assert water_state(673.15, 300.0).density_kg_m3 > 322.0


def test_properties_against_cantera_independent_implementation():
    # cantera's liquid-water-IAPWS95 phase (its own coefficients and code) at states drawn over
    # the range; G, H and S share its reference state, fixed here at one state (300 K, 10 bar)
    from redoxgibbs.water.iapws95 import _phase

    rng = np.random.default_rng(11)
    T = np.r_[rng.uniform(274.0, 1273.0, 40), rng.uniform(274.0, 373.0, 40)]
    P = np.r_[rng.uniform(300.0, 5000.0, 40), rng.uniform(1.1, 400.0, 40)]
    T, P = _liquid_like(T, P)
    w = water_state(T, P)
    phase = _phase()
    for i in range(T.size):
        phase.TP = T[i], P[i] * 1e5
        assert w.density_kg_m3[i] == pytest.approx(phase.density, rel=1e-11)
        assert w.G_J_mol[i] == pytest.approx(phase.gibbs_mole / 1000, abs=1e-6)
        assert w.H_J_mol[i] == pytest.approx(phase.enthalpy_mole / 1000, abs=1e-6)
        assert w.S_J_mol_K[i] == pytest.approx(phase.entropy_mole / 1000, abs=1e-9)
        assert w.Cp_J_mol_K[i] == pytest.approx(phase.cp_mole / 1000, rel=1e-9)
        assert w.alpha_per_K[i] == pytest.approx(phase.thermal_expansion_coeff, rel=1e-8)
        assert w.beta_per_bar[i] == pytest.approx(phase.isothermal_compressibility * 1e5, rel=1e-9)


def test_expansivity_derivative_against_finite_difference_of_iapws():
    # d alpha/dT at constant P by central difference of the iapws package's alpha
    T, P = 423.15, 200.0
    h = 0.5
    fd = (iapws.IAPWS95(T=T + h, P=P / 10).alfav - iapws.IAPWS95(T=T - h, P=P / 10).alfav) / (2 * h)
    assert water_state(T, P).dalpha_dT_per_K2 == pytest.approx(fd, rel=1e-4)


def test_saturation_pressure_against_iapws():
    # iapws package saturation (IAPWS-95 Maxwell construction)
    for T in (373.15, 473.15, 573.15, 623.15):
        assert saturation_pressure_bar(T) == pytest.approx(iapws.IAPWS95(T=T, x=0).P * 10, rel=1e-7)


def test_psat_convention():
    # common practice: 1.01325 bar up to 100 C, saturation above
    P = psat_convention_bar(np.array([273.15, 298.15, 373.10, 473.15]))
    assert P[:3] == pytest.approx([1.01325] * 3)
    assert P[3] == pytest.approx(15.5493, rel=1e-4)  # IAPWS-95 psat at 200 C (Wagner & Pruss 2002 table)


def test_melting_curve_check_values():
    # IAPWS R14-08(2011), Table 3 computer-program verification values (from memory)
    assert melting_pressure_ice_Ih(260.0) / 1e6 == pytest.approx(138.268, rel=1e-5)
    assert melting_pressure_ice_III(254.0) / 1e6 == pytest.approx(268.685, rel=1e-5)
    assert melting_pressure_ice_V(265.0) / 1e6 == pytest.approx(479.640, rel=1e-5)
    assert melting_pressure_ice_VI(320.0) / 1e6 == pytest.approx(1356.76, rel=1e-5)
    assert melting_temperature(138.268e6) == pytest.approx(260.0, abs=1e-4)
    assert melting_temperature(479.640e6) == pytest.approx(265.0, abs=1e-4)


def test_cold_ocean_states():
    # about -20 C near 2 kbar is liquid (ice Ih/III boundary at 251.165 K, 208.566 MPa, R14-08)
    w = water_state(253.15, 2000.0)
    assert w.density_kg_m3 == pytest.approx(iapws.IAPWS95(T=253.15, P=200.0).rho, rel=1e-8)
    # below the melting curve the metastable liquid is evaluated (the solvent of a brine), against
    # the iapws package's IAPWS-95, down to -20.15 C; colder is refused as ice
    for T, P in ((253.15, 1000.0), (263.15, 1.0)):   # ice Ih melts at about -10 C at 1 kbar
        assert water_state(T, P).density_kg_m3 == pytest.approx(iapws.IAPWS95(T=T, P=P / 10).rho, rel=1e-8)
    with pytest.raises(OutOfValidityError, match="frozen"):
        water_state(252.0, 1000.0)
    with pytest.raises(OutOfValidityError, match="ice Ih"):
        water_state(252.0, 1.0)


def test_refusals_name_the_problem():
    with pytest.raises(OutOfValidityError, match="below the saturation"):
        water_state(473.15, 5.0)
    with pytest.raises(OutOfValidityError, match="below the saturation"):
        water_state(373.15, 1.01325)   # IAPWS-95 boils at 373.124 K at one atmosphere
    with pytest.raises(OutOfValidityError, match="critical point"):
        water_state(647.0, 221.0)


def test_broadcast_and_unique_evaluation():
    T = np.array([[298.15], [373.15]])
    P = np.array([10.0, 100.0, 10.0])
    w = water_state(T, P)
    assert w.density_kg_m3.shape == (2, 3)
    assert w.density_kg_m3[1, 0] == w.density_kg_m3[1, 2]
    assert w.density_kg_m3[0, 1] == pytest.approx(float(water_state(298.15, 100.0).density_kg_m3))


def _assert_density_matches_cantera_tp(T, P, rel):
    from redoxgibbs.water.iapws95 import _phase

    w = water_state(T, P)
    phase = _phase()
    for t, p, rho in zip(T, P, w.density_kg_m3):
        phase.TP = t, p * 1e5
        assert rho == pytest.approx(phase.density, rel=rel)


def test_density_newton_matches_cantera_tp_search():
    # the fast (T, rho) Newton path against cantera's own (T, P) search over the range
    rng = np.random.default_rng(1)
    _assert_density_matches_cantera_tp(*_liquid_like(rng.uniform(274.0, 1273.0, 60), rng.uniform(300.0, 5000.0, 60)), 1e-9)


def test_density_newton_at_cool_low_pressure_states():
    # sorted sweeps of near-surface states, where the Newton iteration meets cantera's rounding
    # floor: every state must evaluate and agree with cantera's (T, P) search
    rng = np.random.default_rng(5)
    _assert_density_matches_cantera_tp(rng.uniform(274.0, 303.0, 400), rng.uniform(1.0, 400.0, 400), 1e-11)


@pytest.mark.parametrize("T_C,P_bar,tol", [(25, 1.0, 0.003), (100, 1.01418, 0.002),
                                           (200, 15.55, 0.007), (300, 500, 0.015),
                                           (500, 1000, 0.06), (25, 5000, 0.025)])
def test_dielectric_johnson_norton_against_iapws_r8_97(T_C, P_bar, tol):
    # IAPWS R8-97 (Fernandez et al. 1997) through the iapws package. Tolerance: the relative
    # disagreement of the two published formulations, which grows where JN91 had few data
    # (supercritical, low density); measured here and documented in DEVELOPERS.md
    T = T_C + 273.15
    w = water_state(T, P_bar)
    eps = dielectric_along_TP(w).eps
    assert eps == pytest.approx(_Dielectric(float(w.density_kg_m3), T), rel=tol)


def test_born_functions_are_derivatives_of_eps():
    # Y = d(-1/eps)/dT... identities of the Born functions, by finite differences
    T, P, h = 423.15, 300.0, 0.01
    e = lambda t, p: dielectric_along_TP(water_state(t, p)).eps
    born = born_functions(dielectric_along_TP(water_state(T, P)))
    Y = (-1 / e(T + h, P) + 1 / e(T - h, P)) / (2 * h)
    X = (-1 / e(T + h, P) + 2 / e(T, P) - 1 / e(T - h, P)) / h**2
    Q = (-1 / e(T, P + 1) + 1 / e(T, P - 1)) / 2
    assert born.Y == pytest.approx(Y, rel=1e-6)
    assert born.Q == pytest.approx(Q, rel=1e-5)
    assert born.X == pytest.approx(X, rel=1e-3)


# Helgeson & Kirkham (1974) Am. J. Sci. 274, 1089-1198, as tabulated in W. M. White,
# Geochemistry (Wiley): A_gamma [kg^0.5 mol^-0.5] and B_gamma [1e8 cm^-1 kg^0.5 mol^-0.5] along
# saturation (1.013 bar below 100 C); read-back uncertainty about 0.001 in A.
HK74 = [(0, 0.4911, 0.3244), (25, 0.5092, 0.3283), (50, 0.5336, 0.3325), (75, 0.5639, 0.3371),
        (100, 0.5998, 0.3422), (150, 0.6898, 0.3533), (200, 0.8099, 0.3655),
        (250, 0.9785, 0.3792), (300, 1.2555, 0.3965)]


@pytest.mark.parametrize("T_C,A_ref,B_ref", HK74)
def test_debye_hueckel_parameters_against_helgeson_kirkham_1974(T_C, A_ref, B_ref):
    # A and B from density and dielectric constant. With the IAPWS R8-97 dielectric constant the
    # formulas reproduce the table to 0.6 % in A up to 200 C and 1.2 % at 250-300 C:
    # the table used Helgeson & Kirkham's own dielectric model, which departs from R8-97 by up to
    # 0.8 % at 300 C, entering A as eps^-1.5 and B as eps^-0.5 (B: 0.4 %)
    T = T_C + 273.15
    P = float(psat_convention_bar(max(T, 273.16)))
    rho = float(water_state(T, P).density_kg_m3)
    eps = _Dielectric(rho, T)
    assert debye_hueckel_A(T, rho, eps) == pytest.approx(A_ref, rel=0.006 if T_C <= 200 else 0.012)
    assert debye_hueckel_B(T, rho, eps) == pytest.approx(B_ref, rel=0.004)



def test_water_table_error_bound_against_the_exact_path():
    # the bound stated in redoxgibbs/water/table.py, checked on random states of its range
    from redoxgibbs.water.table import WaterTable

    table = WaterTable((273.16, 473.15), (20.0, 1000.0))
    rng = np.random.default_rng(2)
    T, P = rng.uniform(273.2, 473.1, 2000), rng.uniform(20.0, 1000.0, 2000)
    exact, approx = water_state(T, P), table(T, P)
    rel = lambda f: np.max(np.abs(getattr(approx, f) / getattr(exact, f) - 1))
    ab = lambda f: np.max(np.abs(getattr(approx, f) - getattr(exact, f)))
    assert rel("density_kg_m3") < 5e-8 and ab("G_J_mol") < 1e-4 and ab("H_J_mol") < 1e-3
    assert ab("S_J_mol_K") < 1e-5 and ab("Cp_J_mol_K") < 1e-4 and ab("alpha_per_K") < 5e-9
    assert rel("beta_per_bar") < 2e-6 and ab("dalpha_dT_per_K2") < 2e-8
    from redoxgibbs.reactions.reaction import Reaction
    from redoxgibbs.species.properties import standard_properties
    rxn = Reaction("H2O(l) = H+ + OH-")
    G_exact = standard_properties(rxn.species, T, P).G @ rxn.coefficients
    G_table = standard_properties(rxn.species, T, P, water=table).G @ rxn.coefficients
    assert np.max(np.abs(G_table - G_exact) / (8.314462618 * T * np.log(10))) < 1e-6
    with pytest.raises(OutOfValidityError, match="outside the water table"):
        table(500.0, 100.0)


def test_the_critical_point_is_flagged():
    # there compressibility and heat capacity diverge (the HKF dH0 of water's dissociation came out
    # at -237,009 kJ/mol with no word); 2 K and 5 bar around it are flagged
    from redoxgibbs.reactions.reaction import reaction_properties

    p = reaction_properties("H2O(l) = H+ + OH-", [373.946, 380.0], [220.65, 300.0])
    assert p.flags["near_critical_point"].tolist() == [True, False]
    assert "near_critical_point" in p.to_frame()["flags"].iloc[0]
