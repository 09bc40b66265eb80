"""Liquid and supercritical water from IAPWS-95, evaluated for all states at once.

The Helmholtz function and its derivatives come from ``helmholtz.py`` (numpy, over arrays of
states). The density at each (T, P) is found by a bracketed Newton iteration on the IAPWS-95
pressure, run over all states together and started from the saturated-liquid density of the
auxiliary equation (or from a compressed-liquid guess above T_c). cantera's
``liquid-water-IAPWS95`` phase, an independent implementation of the same equation, supplies
three things only: the exact saturation pressure, the reference state of G, H and S (its
convention: H of formation and third-law S at 298.15 K, 1 bar), and a (T, P) search with clear
refusals for the rare states where the iteration fails (within about 1 K of the critical point,
or below saturation). Every distinct (T, P) is evaluated once and broadcast back.

IAPWS-95 holds for the metastable and stable liquid down to the ice melting curve (IAPWS
R14-08), so cold liquid (e.g. -20 degC near 2 kbar) takes the same path.

References: Wagner & Pruss (2002) J. Phys. Chem. Ref. Data 31, 387 (IAPWS-95);
IAPWS R6-95(2018); IAPWS R14-08(2011) for the melting curve; Wagner & Pruss (1993)
J. Phys. Chem. Ref. Data 22, 783 for the auxiliary saturation equations.
"""

import functools
from dataclasses import dataclass

import cantera as ct
import numpy as np

from ..errors import InputError, OutOfValidityError
from . import helmholtz
from .melting import T_TRIPLE_K, frozen_phase

__all__ = [
    "WaterState",
    "water_state",
    "saturation_pressure_bar",
    "psat_convention_bar",
    "T_CRITICAL_K",
    "P_CRITICAL_BAR",
    "saturation_temperature_K",
    "M_WATER_KG_PER_MOL",
    "SUPERCOOLED_LIMIT_K",
    "liquid_density_kg_m3",
    "specific_properties",
    "near_critical",
]

T_CRITICAL_K = helmholtz.T_C    # IAPWS-95
P_CRITICAL_BAR = 220.64
RHO_CRITICAL = helmholtz.RHO_C  # kg/m3
M_WATER_KG_PER_MOL = 0.018015      # cantera's molar mass of H2O (its liquid-water phase); molar
                                    # properties and V = M / rho use this one value throughout
#: Coldest liquid evaluated [K]. Below the pure-water melting curve water is metastable, yet the
#: solvent of a saline fluid is liquid down to the fluid's own freezing point (checked per sample
#: by the speciation). IAPWS-95 extrapolates reasonably into the supercooled liquid down to the
#: homogeneous nucleation temperature (IAPWS-95 release; about 235 K at 0.1 MPa); this project
#: stops at the lower limit of its aqueous data, -20.15 degC.
SUPERCOOLED_LIMIT_K = 253.0
P_ONE_ATM_BAR = 1.01325
T_BOILING_1ATM_K = 373.124      # IAPWS-95 normal boiling point (ITS-90)
_DT_FOR_DALPHA = 0.05           # K, central difference of alpha(T) at constant P
_MAX_DENSITY_STEPS = 80
_DENSITY_STEP_TOLERANCE = 1e-11  # relative; the rounding floor of the pressure sum is about 2e-13

_PHASE_YAML = """
phases:
- name: liquid-water
  thermo: liquid-water-IAPWS95
  species: [H2O]
species:
- name: H2O
  composition: {H: 2, O: 1}
  thermo: {model: constant-cp}
  equation-of-state: {model: liquid-water-IAPWS95}
"""


@functools.lru_cache(maxsize=1)
def _phase():
    return ct.Solution(yaml=_PHASE_YAML)


@dataclass(frozen=True)
class WaterState:
    """Properties of pure water at arrays of (T, P), cantera's reference state.

    Molar G, H and S follow cantera's convention (H = standard enthalpy of formation and S the
    third-law entropy at 298.15 K, 1 bar); the standard-state layer turns them into the apparent
    properties of formation that the aqueous data use.
    """

    T_K: np.ndarray
    P_bar: np.ndarray
    density_kg_m3: np.ndarray
    G_J_mol: np.ndarray
    H_J_mol: np.ndarray
    S_J_mol_K: np.ndarray
    Cp_J_mol_K: np.ndarray
    alpha_per_K: np.ndarray          # isobaric expansivity
    beta_per_bar: np.ndarray         # isothermal compressibility
    dalpha_dT_per_K2: np.ndarray     # (d alpha / dT) at constant P

    @property
    def V_cm3_mol(self):
        """Molar volume of water [cm3/mol] = M_w / rho."""
        return M_WATER_KG_PER_MOL / self.density_kg_m3 * 1e6

    @property
    def shape(self):
        """Shape of the arrays of states."""
        return self.T_K.shape


def _near_critical_message(T, P_Pa):
    return (f"T, P: IAPWS-95 liquid density could not be found at {T - 273.15:.6g} degC, "
            f"{P_Pa / 1e5:.6g} bar (within about 1 K of the critical point, 373.946 degC, "
            "220.64 bar, the density search fails); move the state away from the critical point")


def _saturation_pressure_auxiliary_Pa(T):
    """Saturation pressure [Pa] from the auxiliary equation of Wagner & Pruss (1993),
    J. Phys. Chem. Ref. Data 22, 783, eq. (2.5); used only to screen states near saturation."""
    tau = 1.0 - T / T_CRITICAL_K
    series = (-7.85951783 * tau + 1.84408259 * tau**1.5 - 11.7866497 * tau**3
              + 22.6807411 * tau**3.5 - 15.9618719 * tau**4 + 1.80122502 * tau**7.5)
    return P_CRITICAL_BAR * 1e5 * np.exp(T_CRITICAL_K / T * series)


def _refuse_below_saturation(phase, T, P_Pa):
    """Refuse a subcritical state below the exact IAPWS-95 saturation pressure (cantera)."""
    try:
        psat = phase.P_sat
    except ct.CanteraError:
        raise OutOfValidityError(_near_critical_message(T, P_Pa)) from None
    if P_Pa < psat * (1 - 1e-9):
        raise OutOfValidityError(
            f"P: {P_Pa / 1e5:.6g} bar at T = {T - 273.15:.6g} degC is below the saturation "
            f"pressure ({psat / 1e5:.6g} bar), where water is vapour; give a higher pressure "
            "or 'psat'")


def _near_saturation(T, P_Pa):
    """States (arrays) close enough to saturation to need the exact check."""
    sub = T < T_CRITICAL_K
    near = np.zeros(T.shape, dtype=bool)
    near[sub] = P_Pa[sub] <= 1.01 * _saturation_pressure_auxiliary_Pa(T[sub])
    return near


def _saturated_liquid_density_auxiliary(T):
    """Saturated-liquid density [kg/m3] of Wagner & Pruss (1993), eq. (2.6): a starting guess."""
    tau = 1.0 - np.minimum(T, T_CRITICAL_K) / T_CRITICAL_K
    b = (1.99274064, 1.09965342, -0.510839303, -1.75493479, -45.5170352, -6.74694450e5)
    e = (1 / 3, 2 / 3, 5 / 3, 16 / 3, 43 / 3, 110 / 3)
    return RHO_CRITICAL * (1.0 + sum(bi * tau**ei for bi, ei in zip(b, e)))


def _pressure_and_slope(rho, T):
    """IAPWS-95 pressure [Pa] and (dp/drho)_T at arrays of density and temperature."""
    delta = rho / RHO_CRITICAL
    r = helmholtz.residual(delta, T_CRITICAL_K / T, second_tau=False)
    RT = helmholtz.R_SPECIFIC_J_KG_K * T
    return rho * RT * (1.0 + delta * r.d), RT * (1.0 + 2.0 * delta * r.d + delta**2 * r.dd)


def _density_newton(T, P_Pa, rho):
    """Density at (T, P) from a start ``rho`` by bracketed Newton steps, all states together.

    Returns the densities and a mask of the states that did not converge onto a mechanically
    stable root (left to cantera's search and its refusals).
    """
    rho = rho.copy()
    lo, hi = np.full(T.shape, 1e-3), np.full(T.shape, 1400.0)
    active = np.arange(T.size)
    for _ in range(_MAX_DENSITY_STEPS):
        p, slope = _pressure_and_slope(rho[active], T[active])
        residual = p - P_Pa[active]
        hi[active] = np.where(residual > 0, rho[active], hi[active])
        lo[active] = np.where(residual <= 0, rho[active], lo[active])
        with np.errstate(divide="ignore", invalid="ignore"):
            step = np.where(slope > 0, residual / slope, np.inf)
        proposal = rho[active] - step
        done = np.abs(step) <= _DENSITY_STEP_TOLERANCE * rho[active]
        inside = done | ((proposal > lo[active]) & (proposal < hi[active]))
        rho[active] = np.where(inside, proposal, 0.5 * (lo[active] + hi[active]))
        active = active[~done]
        if active.size == 0:
            break
    failed = np.zeros(T.shape, dtype=bool)
    failed[active] = True
    slope = _pressure_and_slope(rho, T)[1]
    failed |= (slope <= 0) | ((T < T_CRITICAL_K) & (rho < RHO_CRITICAL))   # unstable or vapour root
    return rho, failed


def _density_by_cantera(T, P_Pa):
    """cantera's own (T, P) search for one state, with refusals that name the problem."""
    phase = _phase()
    try:
        phase.TD = T, 1000.0  # a liquid start for cantera's search
        phase.TP = T, P_Pa
    except ct.CanteraError as err:
        if "saturation" in str(err):
            raise OutOfValidityError(
                f"P: {P_Pa / 1e5:.6g} bar at T = {T - 273.15:.6g} degC is below the saturation "
                "pressure, where water is vapour; give a higher pressure or 'psat'") from None
        raise OutOfValidityError(_near_critical_message(T, P_Pa)) from None
    if T < T_CRITICAL_K and phase.density < RHO_CRITICAL:
        raise OutOfValidityError(
            f"P: {P_Pa / 1e5:.6g} bar at T = {T - 273.15:.6g} degC is below the saturation "
            "pressure, where water is vapour; give a higher pressure or 'psat'")
    return phase.density


def liquid_density_kg_m3(T, P_Pa):
    """Liquid (or supercritical) densities at 1-D arrays of distinct states, refusing vapour."""
    start = np.where(T < T_CRITICAL_K, _saturated_liquid_density_auxiliary(T), 1100.0)
    rho, failed = _density_newton(T, P_Pa, start)
    for i in np.flatnonzero(failed):   # rare: near the critical point, or below saturation
        rho[i] = _density_by_cantera(T[i], P_Pa[i])
    near = _near_saturation(T, P_Pa) & (T >= T_TRIPLE_K)
    if near.any():
        phase = _phase()
        for i in np.flatnonzero(near):
            phase.TD = T[i], rho[i]
            _refuse_below_saturation(phase, T[i], P_Pa[i])
    return rho


def specific_properties(T, rho, caloric):
    """Rows rho, G, H, S, Cp, alpha, beta [1/Pa] per kg (J/kg...) at arrays of T and density."""
    delta, tau = rho / RHO_CRITICAL, T_CRITICAL_K / T
    r, i0 = helmholtz.residual(delta, tau), helmholtz.ideal(delta, tau)
    R = helmholtz.R_SPECIFIC_J_KG_K
    X = 1.0 + delta * r.d - delta * tau * r.dt
    Y = 1.0 + 2.0 * delta * r.d + delta**2 * r.dd
    beta = 1.0 / (rho * R * T * Y)
    alpha = beta * rho * R * X
    g = R * T * (1.0 + i0.phi + r.phi + delta * r.d)
    h = R * T * (1.0 + tau * (i0.t + r.t) + delta * r.d)
    S = R * (tau * (i0.t + r.t) - i0.phi - r.phi)
    cp = R * (-tau**2 * (i0.tt + r.tt) + X**2 / Y)
    if not caloric:
        h = S = cp = np.full(T.shape, np.nan)
    return g, h, S, cp, alpha, beta


def _alpha_at(T, P_Pa, rho_near):
    """Expansivity at (T, P) from a density close to the answer (one Newton step)."""
    p, slope = _pressure_and_slope(rho_near, T)
    return specific_properties(T, rho_near - (p - P_Pa) / slope, caloric=False)[4]


def _dalpha_dT(T, P_Pa, rho, alpha):
    """(d alpha / dT) at constant P by a central difference of +-0.05 K."""
    dT = _DT_FOR_DALPHA
    a_hi = _alpha_at(T + dT, P_Pa, rho * (1 - alpha * dT))
    a_lo = _alpha_at(T - dT, P_Pa, rho * (1 + alpha * dT))
    return (a_hi - a_lo) / (2 * dT)


@functools.lru_cache(maxsize=1)
def _reference_offsets():
    """Shift [J/mol] of IAPWS-95's H and S (u = s = 0 for the liquid at the triple point) to
    cantera's convention, read at one state."""
    T, P_Pa = 300.0, 1e6
    phase = _phase()
    phase.TP = T, P_Pa
    _, h, S, _, _, _ = specific_properties(np.array([T]), np.array([phase.density]), caloric=True)
    return (phase.enthalpy_mole / 1000.0 - h[0] * M_WATER_KG_PER_MOL,
            phase.entropy_mole / 1000.0 - S[0] * M_WATER_KG_PER_MOL)


def _evaluate(T, P_Pa, caloric=True):
    """Rows rho, G, H, S, Cp, alpha, beta, d(alpha)/dT at 1-D arrays of distinct states (molar)."""
    rho = liquid_density_kg_m3(T, P_Pa)
    _refuse_gas_like(T, P_Pa, rho)
    g, h, S, cp, alpha, beta = specific_properties(T, rho, caloric)
    dH, dS = _reference_offsets()
    M = M_WATER_KG_PER_MOL
    dalpha = _dalpha_dT(T, P_Pa, rho, alpha) if caloric else np.full(T.shape, np.nan)
    return np.stack([rho, g * M + dH - T * dS, h * M + dH, S * M + dS, cp * M, alpha, beta, dalpha])


#: Half-widths of the box around the critical point within which states are flagged: there the
#: second derivatives of water's properties (compressibility, heat capacity, the Born function X)
#: diverge, and so do the HKF enthalpies and heat capacities built on them.
NEAR_CRITICAL_K, NEAR_CRITICAL_BAR = 2.0, 5.0


def near_critical(T_K, P_bar):
    """True where (T, P) lies within NEAR_CRITICAL_K and NEAR_CRITICAL_BAR of the critical point."""
    return (np.abs(np.asarray(T_K) - T_CRITICAL_K) <= NEAR_CRITICAL_K) & \
        (np.abs(np.asarray(P_bar) - P_CRITICAL_BAR) <= NEAR_CRITICAL_BAR)


def _refuse_gas_like(T, P_Pa, rho):
    """Refuse supercritical states at a density below the critical one: water there is a gas in
    all but name, and neither the aqueous equations of state nor the activity models apply."""
    gas_like = (T >= T_CRITICAL_K) & (rho < RHO_CRITICAL)
    if np.any(gas_like):
        i = int(np.flatnonzero(gas_like)[0])
        raise OutOfValidityError(
            f"T, P: water is gas-like at {T[i] - 273.15:.6g} degC, {P_Pa[i] / 1e5:.6g} bar (supercritical, "
            f"density {rho[i] / 1000:.3g} g/cm3 below the critical {RHO_CRITICAL / 1000:.3g} g/cm3); give "
            "a higher pressure")


def _refuse_frozen(T, P_Pa):
    ice = frozen_phase(T, P_Pa)
    frozen = (ice != "") & (T < SUPERCOOLED_LIMIT_K)
    if np.any(frozen):
        i = int(np.flatnonzero(frozen)[0])
        raise OutOfValidityError(
            f"T, P: water is frozen ({ice[i]}) at {T[i] - 273.15:.6g} degC, {P_Pa[i] / 1e5:.6g} bar "
            f"(IAPWS R14-08 melting curve), and colder than the supercooled liquid evaluated here "
            f"({SUPERCOOLED_LIMIT_K - 273.15:.4g} degC); raise the temperature or change the pressure")
    vapour = (T < T_TRIPLE_K) & (P_Pa < 611.657)
    if np.any(vapour):
        raise OutOfValidityError("P: below the triple-point pressure water is not liquid")


def water_state(T_K, P_bar, caloric=True):
    """IAPWS-95 properties of liquid or supercritical water at broadcast arrays of T [K], P [bar].

    Each distinct (T, P) pair is evaluated once. States where water is vapour (P below
    saturation) are refused by name; below the IAPWS R14-08 melting curve the metastable liquid
    is evaluated down to ``SUPERCOOLED_LIMIT_K`` (the solvent of a saline fluid is liquid there;
    whether a fluid is frozen depends on its water activity, see ``water.ice``), colder states are
    refused as ice. Without
    ``caloric`` (H, S, Cp and d(alpha)/dT) they are left NaN (G, density, alpha and beta suffice
    for Gibbs energies) and the evaluation costs about half.
    """
    T, P = np.broadcast_arrays(np.asarray(T_K, dtype=float), np.asarray(P_bar, dtype=float))
    if T.size == 0:
        raise InputError("T, P: no states given")
    pairs = np.stack([T.ravel(), P.ravel()], axis=1)
    unique, inverse = np.unique(pairs, axis=0, return_inverse=True)
    Tu, Pu_Pa = unique[:, 0], unique[:, 1] * 1e5
    _refuse_frozen(Tu, Pu_Pa)
    full = _evaluate(Tu, Pu_Pa, caloric)[:, inverse.ravel()].reshape((8,) + T.shape)
    return WaterState(
        T_K=T.copy(), P_bar=P.copy(), density_kg_m3=full[0], G_J_mol=full[1], H_J_mol=full[2],
        S_J_mol_K=full[3], Cp_J_mol_K=full[4], alpha_per_K=full[5],
        beta_per_bar=full[6] * 1e5, dalpha_dT_per_K2=full[7])


def saturation_pressure_bar(T_K):
    """Liquid-vapour saturation pressure of IAPWS-95 [bar] (cantera), for T below T_c."""
    T = np.asarray(T_K, dtype=float)
    if np.any(T >= T_CRITICAL_K):
        raise OutOfValidityError(
            f"P='psat': saturation is defined only below the critical temperature "
            f"({T_CRITICAL_K - 273.15} degC); give pressures in bar for hotter states")
    if np.any(T < T_TRIPLE_K):
        raise OutOfValidityError("P='psat': saturation of the liquid is defined from 0.01 degC up")
    phase = _phase()
    unique, inverse = np.unique(T.ravel(), return_inverse=True)
    psat = np.empty(unique.size)
    for i, t in enumerate(unique):
        try:
            phase.TD = t, 1000.0
            psat[i] = phase.P_sat / 1e5
        except ct.CanteraError:
            raise OutOfValidityError(
                f"P='psat': the saturation pressure could not be found at {t - 273.15:.6g} degC, within about "
                "1 K of the critical point (373.946 degC); give a pressure") from None
    return psat[inverse].reshape(T.shape)


def saturation_temperature_K(P_bar):
    """Boiling temperature [K] at pressure P [bar]: the Wagner & Pruss (2002) auxiliary saturation
    equation (to about 0.03 % in pressure) inverted by bisection over all states at once; NaN at
    and above the critical pressure and below the triple-point pressure."""
    P = np.asarray(P_bar, dtype=float) * 1e5
    lo, hi = np.full(P.shape, T_TRIPLE_K), np.full(P.shape, T_CRITICAL_K)
    for _ in range(48):            # 374 K of bracket halved 48 times: below 1e-12 K
        mid = 0.5 * (lo + hi)
        below = _saturation_pressure_auxiliary_Pa(mid) < P
        lo, hi = np.where(below, mid, lo), np.where(below, hi, mid)
    inside = (P < P_CRITICAL_BAR * 1e5) & (P >= _saturation_pressure_auxiliary_Pa(np.array(T_TRIPLE_K)))
    return np.where(inside, 0.5 * (lo + hi), np.nan)


def psat_convention_bar(T_K):
    """Pressure of the usual 'psat' convention [bar]: 1.01325 bar up to 100 degC, saturation above.

    Below 0.01 degC (down to 0 degC) the 1.01325 bar branch applies.
    """
    T = np.asarray(T_K, dtype=float)
    P = np.full(T.shape, P_ONE_ATM_BAR)
    hot = T > T_BOILING_1ATM_K
    if np.any(hot):
        P[hot] = saturation_pressure_bar(T[hot])
    return P
