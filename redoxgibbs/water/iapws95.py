"""Liquid and supercritical water from IAPWS-95, evaluated through cantera (and iapws when cold).

IAPWS-95 is not written here: cantera's ``liquid-water-IAPWS95`` phase supplies the Helmholtz
function. Setting that phase by (T, density) costs well under a microsecond, while setting it by
(T, P) runs a general density search (about 100 us); so the density at (T, P) is found here by a
bracketed Newton iteration on cantera's own pressure, with cantera's (T, P) search as the
fallback near the critical point. Every distinct (T, P) is evaluated once and the results are
broadcast back to the caller's shape.

cantera refuses T below the triple point (273.16 K); liquid water there (down to the ice melting
curve, e.g. -20 degC near 2 kbar) is evaluated with the IAPWS-95 implementation of the ``iapws``
package, shifted to cantera's reference state.

References: Wagner & Pruss (2002) J. Phys. Chem. Ref. Data 31, 387 (IAPWS-95);
IAPWS R6-95(2018); IAPWS R14-08(2011) for the melting curve.
"""

import functools
import warnings
from dataclasses import dataclass

import cantera as ct
import numpy as np

from ..errors import InputError, OutOfValidityError
from .melting import T_TRIPLE_K, frozen_phase

__all__ = [
    "WaterState",
    "water_state",
    "saturation_pressure_bar",
    "psat_convention_bar",
    "T_CRITICAL_K",
    "P_CRITICAL_BAR",
    "M_WATER_KG_PER_MOL",
]

T_CRITICAL_K = 647.096          # IAPWS-95
P_CRITICAL_BAR = 220.64
RHO_CRITICAL = 322.0            # kg/m3
M_WATER_KG_PER_MOL = 0.018015      # cantera's molar mass of H2O (its liquid-water phase); molar
                                    # properties and V = M / rho use this one value throughout
P_ONE_ATM_BAR = 1.01325
T_BOILING_1ATM_K = 373.124      # IAPWS-95 normal boiling point (ITS-90)
_DT_FOR_DALPHA = 0.05           # K, central difference of alpha(T) at constant P

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
        return M_WATER_KG_PER_MOL / self.density_kg_m3 * 1e6

    @property
    def shape(self):
        return self.T_K.shape


def _density_newton(phase, T, P_Pa, rho_guess):
    """Liquid-branch density [kg/m3] at (T, P) by Newton on P(rho), bracketed; None on failure."""
    lo, hi = 1e-3, 1400.0
    rho = rho_guess
    for _ in range(40):
        phase.TD = T, rho
        residual = phase.P - P_Pa
        if abs(residual) <= 1e-13 * P_Pa:
            return rho
        if residual > 0:
            hi = rho
        else:
            lo = rho
        beta = phase.isothermal_compressibility
        step = residual * rho * beta if beta > 0 else np.inf
        if abs(step) <= 1e-14 * rho:   # at the rounding floor of cantera's pressure
            return rho
        rho_next = rho - step
        rho = rho_next if lo < rho_next < hi else 0.5 * (lo + hi)
    return None


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


def _density_at(phase, T, P_Pa, rho_guess, near_saturation):
    """Density at (T, P) on the liquid (or supercritical) branch, with clear refusals."""
    rho = _density_newton(phase, T, P_Pa, rho_guess)
    if rho is not None:
        stable = phase.isothermal_compressibility > 0
        if not stable or (T < T_CRITICAL_K and rho < RHO_CRITICAL):
            rho = None  # an unstable or vapour root: let cantera decide and explain
        elif near_saturation:
            _refuse_below_saturation(phase, T, P_Pa)
    if rho is None:
        try:
            phase.TD = T, 1000.0  # a liquid start for cantera's own search
            phase.TP = T, P_Pa
        except ct.CanteraError as err:
            text = str(err)
            if "saturation" in text:
                raise OutOfValidityError(
                    f"P: {P_Pa / 1e5:.6g} bar at T = {T - 273.15:.6g} degC is below the saturation "
                    "pressure, where water is vapour; give a higher pressure or 'psat'") from None
            raise OutOfValidityError(_near_critical_message(T, P_Pa)) from None
        rho = phase.density
    phase.TD = T, rho
    return rho


def _alpha_at(phase, T, P_Pa, rho_near):
    """Expansivity at (T, P), starting from a density close to the answer (one Newton step)."""
    phase.TD = T, rho_near
    rho = rho_near - (phase.P - P_Pa) * rho_near * phase.isothermal_compressibility
    phase.TD = T, rho
    return phase.thermal_expansion_coeff


def _dalpha_dT(phase, T, P_Pa, rho, alpha):
    """(d alpha / dT) at constant P by a central difference of +-0.05 K (one-sided at 273.16 K)."""
    dT = min(_DT_FOR_DALPHA, T - T_TRIPLE_K)
    if dT > 1e-3:
        a_hi = _alpha_at(phase, T + dT, P_Pa, rho * (1 - alpha * dT))
        a_lo = _alpha_at(phase, T - dT, P_Pa, rho * (1 + alpha * dT))
        return (a_hi - a_lo) / (2 * dT)
    dT = _DT_FOR_DALPHA
    return (_alpha_at(phase, T + dT, P_Pa, rho * (1 - alpha * dT)) - alpha) / dT


def _evaluate_cantera(T, P_Pa, caloric=True):
    """Evaluate 1-D arrays of distinct warm states (T >= 273.16 K) through cantera."""
    phase = _phase()
    n = T.size
    out = np.empty((8, n))
    rho_guess = 1300.0
    near = _near_saturation(T, P_Pa)
    for i in range(n):
        t, p = T[i], P_Pa[i]
        rho = _density_at(phase, t, p, rho_guess, near[i])  # leaves the phase at (t, rho)
        alpha = phase.thermal_expansion_coeff
        out[0, i] = rho
        out[1, i] = phase.gibbs_mole
        out[5, i] = alpha
        out[6, i] = phase.isothermal_compressibility
        if caloric:  # H, S and Cp go with the heat-capacity level of detail
            out[2, i] = phase.enthalpy_mole
            out[3, i] = phase.entropy_mole
            out[4, i] = phase.cp_mole
        else:
            out[2:5, i] = np.nan
        out[7, i] = _dalpha_dT(phase, t, p, rho, alpha) if caloric else np.nan
        if i + 1 < n:  # first-order prediction of the next density (states come sorted by T)
            dT, dP = T[i + 1] - t, P_Pa[i + 1] - p
            predicted = rho * (1.0 - alpha * dT + out[6, i] * dP)
            rho_guess = min(max(predicted, 1e-2), 1399.0)
    out[1:4] /= 1000.0  # J/kmol -> J/mol
    out[4] /= 1000.0
    return out


@functools.lru_cache(maxsize=1)
def _iapws_reference_offsets():
    """Shift of the iapws package's IAPWS-95 (u = s = 0 at the triple point) to cantera's."""
    import iapws

    T, P_Pa = 300.0, 1e6
    phase = _phase()
    phase.TP = T, P_Pa
    ref = iapws.IAPWS95(T=T, P=P_Pa / 1e6)
    M = M_WATER_KG_PER_MOL * 1e3  # g/mol = kJ/kg -> J/mol
    dH = phase.enthalpy_mole / 1000.0 - ref.h * M
    dS = phase.entropy_mole / 1000.0 - ref.s * M
    return dH, dS


def _iapws_point(T, P_Pa):
    import iapws

    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        return iapws.IAPWS95(T=T, P=P_Pa / 1e6)


def _evaluate_cold(T, P_Pa, caloric=True):
    """Evaluate distinct cold liquid states (T < 273.16 K) with the iapws package (IAPWS-95)."""
    dH, dS = _iapws_reference_offsets()
    M = M_WATER_KG_PER_MOL * 1e3
    out = np.empty((8, T.size))
    for i, (t, p) in enumerate(zip(T, P_Pa)):
        s = _iapws_point(t, p)
        dT = 0.05
        dalpha = np.nan
        if caloric:
            dalpha = (_iapws_point(t + dT, p).alfav - _iapws_point(t - dT, p).alfav) / (2 * dT)
        h, S = s.h * M + dH, s.s * M + dS
        out[:, i] = (s.rho, h - t * S, h, S, s.cp * M, s.alfav, s.kappa * 1e-6, dalpha)
    return out


def _refuse_frozen(T, P_Pa):
    ice = frozen_phase(T, P_Pa)
    if np.any(ice != ""):
        i = int(np.flatnonzero(ice != "")[0])
        raise OutOfValidityError(
            f"T, P: water is frozen ({ice[i]}) at {T[i] - 273.15:.6g} degC, {P_Pa[i] / 1e5:.6g} bar "
            "(IAPWS R14-08 melting curve); raise the temperature or change the pressure")
    vapour = (T < T_TRIPLE_K) & (P_Pa < 611.657)
    if np.any(vapour):
        raise OutOfValidityError("P: below the triple-point pressure water is not liquid")


def water_state(T_K, P_bar, caloric=True):
    """IAPWS-95 properties of liquid or supercritical water at broadcast arrays of T [K], P [bar].

    Each distinct (T, P) pair is evaluated once. States where water is vapour (P below
    saturation) or ice (below the IAPWS R14-08 melting curve) are refused by name. Without
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
    values = np.empty((8, Tu.size))
    warm = Tu >= T_TRIPLE_K
    if warm.any():
        values[:, warm] = _evaluate_cantera(Tu[warm], Pu_Pa[warm], caloric)
    if (~warm).any():
        values[:, ~warm] = _evaluate_cold(Tu[~warm], Pu_Pa[~warm], caloric)
    full = values[:, inverse.ravel()].reshape((8,) + T.shape)
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
        phase.TD = t, 1000.0
        psat[i] = phase.P_sat / 1e5
    return psat[inverse].reshape(T.shape)


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
