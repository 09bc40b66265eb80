"""Solvent g-function of the revised HKF model and the temperature/pressure-dependent omega.

References: Shock, Oelkers, Johnson, Sverjensky & Helgeson (1992) J. Chem. Soc. Faraday Trans.
88, 803-826, eqs. (25), (32)-(33), (49)-(51) and Table 3 (coefficients, from memory);
Tanger & Helgeson (1988) Am. J. Sci. 288, 19-98, eq. (55) for omega.
"""

from dataclasses import dataclass

import numpy as np

__all__ = ["GFunction", "g_function_shock_1992", "omega_charged", "ETA_ANGSTROM_CAL_MOL"]

ETA_ANGSTROM_CAL_MOL = 1.66027e5   # Born constant eta = N_A e^2 / 2 (Tanger & Helgeson 1988)
_R_H_PLUS_ANGSTROM = 3.082          # effective electrostatic radius of H+ (Shock et al. 1992)

_AG = (-2.037662, 5.747000e-3, -6.557892e-6)   # a_g(T[degC]) coefficients, Table 3
_BG = (6.107361, -1.074377e-2, 1.268348e-5)    # b_g(T[degC]) coefficients, Table 3
_AF = (0.3666666e2, -0.1504956e-9, 0.5017997e-13)  # f(T, P) correction, eq. (33)


@dataclass(frozen=True)
class GFunction:
    """g [angstrom] and its derivatives: dT, dTT [per K, K2] at constant P, dP [per bar]."""

    g: np.ndarray
    dT: np.ndarray
    dTT: np.ndarray
    dP: np.ndarray


def _density_part(T_C, rho_hat, alpha, beta, dalpha_dT):
    """a_g (1 - rho)^b_g and its derivatives (Shock et al. 1992, eq. 32); zero where rho >= 1."""
    a = _AG[0] + _AG[1] * T_C + _AG[2] * T_C**2
    a_t, a_tt = _AG[1] + 2 * _AG[2] * T_C, 2 * _AG[2]
    b = _BG[0] + _BG[1] * T_C + _BG[2] * T_C**2
    b_t, b_tt = _BG[1] + 2 * _BG[2] * T_C, 2 * _BG[2]
    active = rho_hat < 1.0
    u = np.where(active, 1.0 - rho_hat, 0.5)     # 0.5 is a placeholder, masked below
    u_t = alpha * rho_hat                        # d(1 - rho)/dT with rho_T = -alpha rho
    u_tt = -rho_hat * (alpha**2 - dalpha_dT)
    u_p = -beta * rho_hat
    ub = u**b
    L = b_t * np.log(u) + b * u_t / u
    L_t = b_tt * np.log(u) + 2 * b_t * u_t / u + b * (u_tt * u - u_t**2) / u**2
    h = a * ub
    h_t = ub * (a_t + a * L)
    h_tt = ub * (a_tt + 2 * a_t * L + a * L**2 + a * L_t)
    h_p = a * b * u ** (b - 1) * u_p
    zero = np.zeros_like(h)
    return tuple(np.where(active, x, zero) for x in (h, h_t, h_tt, h_p))


def _high_temperature_part(T_C, P_bar):
    """Correction f(T, P) of Shock et al. (1992), eq. (33): 155-355 degC and P <= 1000 bar."""
    active = (T_C > 155.0) & (T_C < 355.0) & (P_bar < 1000.0)
    x = np.where(active, (T_C - 155.0) / 300.0, 0.0)
    y = np.where(active, 1000.0 - P_bar, 0.0)
    c, f2, f3 = _AF
    F1 = x**4.8 + c * x**16
    F1_t = (4.8 * x**3.8 + 16 * c * x**15) / 300.0
    F1_tt = (4.8 * 3.8 * x**2.8 + 240 * c * x**14) / 300.0**2
    F2 = f2 * y**3 + f3 * y**4
    F2_p = -(3 * f2 * y**2 + 4 * f3 * y**3)
    return F1 * F2, F1_t * F2, F1_tt * F2, F1 * F2_p


def g_function_shock_1992(T_K, P_bar, water):
    """Solvent function g(T, P) [angstrom] with derivatives, Shock et al. (1992) eqs. (25), (32), (33).

    g = a_g (1 - rho)^b_g - f(T, P), rho in g/cm3, T in degC in a_g, b_g and f; g = 0 for
    rho >= 1 g/cm3. Fitted for densities above 0.35 g/cm3 (the caller flags lower densities).
    ``water`` is a :class:`~redoxgibbs.water.iapws95.WaterState` at the same states.
    """
    T_C = np.asarray(T_K, dtype=float) - 273.15
    P = np.asarray(P_bar, dtype=float)
    rho_hat = water.density_kg_m3 / 1000.0
    h = _density_part(T_C, rho_hat, water.alpha_per_K, water.beta_per_bar, water.dalpha_dT_per_K2)
    f = _high_temperature_part(T_C, P)
    return GFunction(g=h[0] - f[0], dT=h[1] - f[1], dTT=h[2] - f[2], dP=h[3] - f[3])


def omega_charged(omega_ref, charge, gfun):
    """omega(T, P) of charged species [cal/mol] and its dT, dTT, dP derivatives.

    omega = eta (Z^2 / r_e - Z / (3.082 + g)), r_e = r_e,ref + |Z| g,
    r_e,ref = Z^2 / (omega_ref / eta + Z / 3.082)   (Shock et al. 1992, eqs. 49-51).
    ``omega_ref`` and ``charge`` have shape (n_species,); results (n_states, n_species).
    """
    eta = ETA_ANGSTROM_CAL_MOL
    Z = np.asarray(charge, dtype=float)
    r_ref = Z**2 / (np.asarray(omega_ref, dtype=float) / eta + Z / _R_H_PLUS_ANGSTROM)
    g = gfun.g[..., None]
    r_e = r_ref + np.abs(Z) * g
    r_h = _R_H_PLUS_ANGSTROM + g
    omega = eta * (Z**2 / r_e - Z / r_h)
    w_g = eta * (-(Z**2) * np.abs(Z) / r_e**2 + Z / r_h**2)
    w_gg = eta * (2 * Z**4 / r_e**3 - 2 * Z / r_h**3)
    g_t, g_tt, g_p = gfun.dT[..., None], gfun.dTT[..., None], gfun.dP[..., None]
    return omega, w_g * g_t, w_gg * g_t**2 + w_g * g_tt, w_g * g_p
