"""Revised Helgeson-Kirkham-Flowers (HKF) equations of state for aqueous species.

Apparent standard molal properties of formation (Benson-Helgeson convention) at T, P:
Helgeson, Kirkham & Flowers (1981) Am. J. Sci. 281, 1249; Tanger & Helgeson (1988) Am. J. Sci.
288, 19, eqs. (59)-(62); Shock et al. (1992) J. Chem. Soc. Faraday Trans. 88, 803, eqs. (B10)-(B14).

Apart from omega of charged species the equations are linear in the species parameters, so the
non-solvation part of each property is one (states x 9) @ (9 x species) product; rows of the
parameter matrix are (G_f, H_f, S_r, a1, a2, a3, a4, c1, c2), all in calorie-bar-kelvin units.
"""

from dataclasses import dataclass

import numpy as np

from ..constants import P_REF_BAR, T_REF_K
from .gfunction import omega_charged

__all__ = [
    "HKFParameters",
    "SolventTerms",
    "hkf_gibbs",
    "hkf_enthalpy",
    "hkf_entropy",
    "hkf_heat_capacity",
    "hkf_volume",
    "solvation_omega",
]

THETA_K = 228.0      # solvent singular temperature (Tanger & Helgeson 1988)
PSI_BAR = 2600.0     # solvent pressure parameter
CAL_BAR_TO_CM3 = 41.84  # 1 cal/bar = 41.84 cm3


@dataclass(frozen=True)
class HKFParameters:
    """Parameters of m species: ``linear`` (9, m) in cal units, ``omega_ref`` and ``charge`` (m,)."""

    linear: np.ndarray
    omega_ref: np.ndarray
    charge: np.ndarray


@dataclass(frozen=True)
class SolventTerms:
    """Born functions at the states (n,) and at 25 degC, 1 bar (scalars), plus omega (n, m)."""

    Z: np.ndarray
    Y: np.ndarray
    Q: np.ndarray
    X: np.ndarray
    Z_ref: float
    Y_ref: float
    omega: np.ndarray
    omega_T: np.ndarray
    omega_TT: np.ndarray
    omega_P: np.ndarray


def solvation_omega(params, gfun, n_states):
    """omega and its derivatives (n, m): constant for neutral species, eq. (49)-(51) when charged."""
    m = params.charge.size
    omega = np.broadcast_to(params.omega_ref, (n_states, m)).copy()
    w_t, w_tt, w_p = (np.zeros((n_states, m)) for _ in range(3))
    charged = params.charge != 0
    if charged.any():
        values = omega_charged(params.omega_ref[charged], params.charge[charged], gfun)
        for target, value in zip((omega, w_t, w_tt, w_p), values):
            target[:, charged] = value
    return omega, w_t, w_tt, w_p


def _pressure_terms(P):
    return P - P_REF_BAR, np.log((PSI_BAR + P) / (PSI_BAR + P_REF_BAR))


def _theta_log(T):
    """ln[Tr (T - Theta) / (T (Tr - Theta))], shared by the c2 terms of G and S."""
    return np.log(T_REF_K * (T - THETA_K) / (T * (T_REF_K - THETA_K)))


def _zeros(T):
    return np.zeros_like(T)


def hkf_gibbs(params, T, P, solvent):
    """Apparent standard Gibbs energy of formation [cal/mol], Shock et al. (1992) eq. (B10).

    G = G_f - S_r (T-Tr) - c1 [T ln(T/Tr) - T + Tr] + a1 (P-Pr) + a2 ln((Psi+P)/(Psi+Pr))
        - c2 {[1/(T-Theta) - 1/(Tr-Theta)] (Theta-T)/Theta - T/Theta^2 ln[Tr(T-Theta)/(T(Tr-Theta))]}
        + [a3 (P-Pr) + a4 ln(...)] / (T-Theta) - omega (Z+1) + omega_r (Z_r+1) + omega_r Y_r (T-Tr)
    """
    dP, lnP = _pressure_terms(P)
    inv = 1.0 / (T - THETA_K) - 1.0 / (T_REF_K - THETA_K)
    basis = np.stack([
        np.ones_like(T), _zeros(T), -(T - T_REF_K), dP, lnP, dP / (T - THETA_K),
        lnP / (T - THETA_K), -(T * np.log(T / T_REF_K) - T + T_REF_K),
        -(inv * (THETA_K - T) / THETA_K - T / THETA_K**2 * _theta_log(T)),
    ], axis=-1)
    w_r = params.omega_ref
    solvation = (-solvent.omega * (solvent.Z[:, None] + 1) + w_r * (solvent.Z_ref + 1)
                 + w_r * solvent.Y_ref * (T[:, None] - T_REF_K))
    return basis @ params.linear + solvation


def hkf_enthalpy(params, T, P, solvent):
    """Apparent standard enthalpy of formation [cal/mol], Shock et al. (1992) eq. (B11).

    H = H_f + c1 (T-Tr) - c2 [1/(T-Theta) - 1/(Tr-Theta)] + a1 (P-Pr) + a2 ln(...)
        + (2T-Theta)/(T-Theta)^2 [a3 (P-Pr) + a4 ln(...)]
        - omega (Z+1) + omega T Y + T (Z+1) omega_T + omega_r (Z_r+1) - omega_r Tr Y_r
    """
    dP, lnP = _pressure_terms(P)
    k = (2 * T - THETA_K) / (T - THETA_K) ** 2
    basis = np.stack([
        _zeros(T), np.ones_like(T), _zeros(T), dP, lnP, k * dP, k * lnP, T - T_REF_K,
        -(1.0 / (T - THETA_K) - 1.0 / (T_REF_K - THETA_K)),
    ], axis=-1)
    Zp1, Tc = solvent.Z[:, None] + 1, T[:, None]
    w, w_r = solvent.omega, params.omega_ref
    solvation = (-w * Zp1 + w * Tc * solvent.Y[:, None] + Tc * Zp1 * solvent.omega_T
                 + w_r * (solvent.Z_ref + 1) - w_r * T_REF_K * solvent.Y_ref)
    return basis @ params.linear + solvation


def hkf_entropy(params, T, P, solvent):
    """Standard molal entropy [cal/mol/K], Shock et al. (1992) eq. (B12).

    S = S_r + c1 ln(T/Tr) - c2/Theta {[1/(T-Theta) - 1/(Tr-Theta)] + ln[Tr(T-Theta)/(T(Tr-Theta))]/Theta}
        + [a3 (P-Pr) + a4 ln(...)] / (T-Theta)^2 + omega Y + (Z+1) omega_T - omega_r Y_r
    """
    dP, lnP = _pressure_terms(P)
    k = 1.0 / (T - THETA_K) ** 2
    inv = 1.0 / (T - THETA_K) - 1.0 / (T_REF_K - THETA_K)
    basis = np.stack([
        _zeros(T), _zeros(T), np.ones_like(T), _zeros(T), _zeros(T), k * dP, k * lnP,
        np.log(T / T_REF_K), -(inv + _theta_log(T) / THETA_K) / THETA_K,
    ], axis=-1)
    solvation = (solvent.omega * solvent.Y[:, None] + (solvent.Z[:, None] + 1) * solvent.omega_T
                 - params.omega_ref * solvent.Y_ref)
    return basis @ params.linear + solvation


def hkf_heat_capacity(params, T, P, solvent):
    """Standard molal isobaric heat capacity [cal/mol/K], Shock et al. (1992) eq. (B13).

    Cp = c1 + c2/(T-Theta)^2 - 2T/(T-Theta)^3 [a3 (P-Pr) + a4 ln(...)]
         + omega T X + 2 T Y omega_T + T (Z+1) omega_TT
    """
    dP, lnP = _pressure_terms(P)
    k = -2 * T / (T - THETA_K) ** 3
    basis = np.stack([
        _zeros(T), _zeros(T), _zeros(T), _zeros(T), _zeros(T), k * dP, k * lnP,
        np.ones_like(T), 1.0 / (T - THETA_K) ** 2,
    ], axis=-1)
    Tc = T[:, None]
    solvation = (solvent.omega * Tc * solvent.X[:, None] + 2 * Tc * solvent.Y[:, None] * solvent.omega_T
                 + Tc * (solvent.Z[:, None] + 1) * solvent.omega_TT)
    return basis @ params.linear + solvation


def hkf_volume(params, T, P, solvent):
    """Standard molal volume [cm3/mol], Shock et al. (1992) eq. (B14).

    V = a1 + a2/(Psi+P) + [a3 + a4/(Psi+P)]/(T-Theta) - omega Q - (Z+1) omega_P   (in cal/bar)
    """
    k = 1.0 / (T - THETA_K)
    basis = np.stack([
        _zeros(T), _zeros(T), _zeros(T), np.ones_like(T), 1.0 / (PSI_BAR + P), k,
        k / (PSI_BAR + P), _zeros(T), _zeros(T),
    ], axis=-1)
    solvation = -solvent.omega * solvent.Q[:, None] - (solvent.Z[:, None] + 1) * solvent.omega_P
    return (basis @ params.linear + solvation) * CAL_BAR_TO_CM3
