"""Static dielectric constant of water and its derivatives along (T, P).

The revised-HKF parameters in the species data were regressed with the Johnson & Norton (1991)
model, so that model is the default; the IAPWS R8-97 formulation (Fernandez et al. 1997) is used
only as an outside check in the tests.
"""

from dataclasses import dataclass

import numpy as np

from ..constants import T_REF_K as _T_REF_K

__all__ = ["DielectricState", "dielectric_johnson_norton_1991", "dielectric_along_TP"]

# Johnson & Norton (1991) Am. J. Sci. 291, 541-648, eq. (36) and Table 2 (coefficients a1..a10),
# as coded in SUPCRT92 (Johnson, Oelkers & Helgeson 1992, Comput. Geosci. 18, 899). From memory.
_JN91_A = (0.1470333593e2, 0.2128462733e3, -0.1154445173e3, 0.1955210915e2, -0.8330347980e2,
           0.3213240048e2, -0.6694098645e1, -0.3786202045e2, 0.6887359646e2, -0.2729401652e2)
_RHO_REF = 1000.0  # kg/m3


def dielectric_johnson_norton_1991(T_K, density_kg_m3):
    """Dielectric constant and its partial derivatives in T and density, Johnson & Norton (1991).

    eps = sum_k k_k(T) rho^k, k = 0..4, with t = T/298.15 K and rho in g/cm3 (JN91 eq. 36):
    k0 = 1, k1 = a1/t, k2 = a2/t + a3 + a4 t, k3 = a5/t + a6 t + a7 t^2, k4 = a8/t^2 + a9/t + a10.

    Returns (eps, d eps/dT, d2 eps/dT2, d eps/d rho, d2 eps/d rho2, d2 eps/dT d rho), with T in K
    and rho in kg/m3. Valid 0-1000 degC, 1-5000 bar (densities above about 0.05 g/cm3).
    """
    a1, a2, a3, a4, a5, a6, a7, a8, a9, a10 = _JN91_A
    t = np.asarray(T_K, dtype=float) / _T_REF_K
    r = np.asarray(density_kg_m3, dtype=float) / _RHO_REF
    k = [np.ones_like(t), a1 / t, a2 / t + a3 + a4 * t, a5 / t + a6 * t + a7 * t**2,
         a8 / t**2 + a9 / t + a10]
    dk = [np.zeros_like(t), -a1 / t**2, -a2 / t**2 + a4, -a5 / t**2 + a6 + 2 * a7 * t,
          -2 * a8 / t**3 - a9 / t**2]
    d2k = [np.zeros_like(t), 2 * a1 / t**3, 2 * a2 / t**3, 2 * a5 / t**3 + 2 * a7,
           6 * a8 / t**4 + 2 * a9 / t**3]
    powers = [r**n for n in range(5)]
    eps = sum(k[n] * powers[n] for n in range(5))
    deps_dt = sum(dk[n] * powers[n] for n in range(5)) / _T_REF_K
    d2eps_dt2 = sum(d2k[n] * powers[n] for n in range(5)) / _T_REF_K**2
    deps_dr = sum(n * k[n] * powers[n - 1] for n in range(1, 5)) / _RHO_REF
    d2eps_dr2 = sum(n * (n - 1) * k[n] * powers[n - 2] for n in range(2, 5)) / _RHO_REF**2
    d2eps_dtdr = sum(n * dk[n] * powers[n - 1] for n in range(1, 5)) / (_T_REF_K * _RHO_REF)
    return eps, deps_dt, d2eps_dt2, deps_dr, d2eps_dr2, d2eps_dtdr


@dataclass(frozen=True)
class DielectricState:
    """Dielectric constant and its derivatives along T (constant P) and P (constant T)."""

    eps: np.ndarray
    deps_dT: np.ndarray      # [1/K]
    d2eps_dT2: np.ndarray    # [1/K2]
    deps_dP: np.ndarray      # [1/bar]


def dielectric_along_TP(water):
    """Carry the (T, rho) derivatives of the JN91 dielectric model to (T, P) derivatives.

    With rho_T = -alpha rho, rho_TT = rho (alpha^2 - d alpha/dT) and rho_P = beta rho (chain rule).
    ``water`` is a :class:`~redoxgibbs.water.iapws95.WaterState`.
    """
    rho = water.density_kg_m3
    eps, e_t, e_tt, e_r, e_rr, e_tr = dielectric_johnson_norton_1991(water.T_K, rho)
    rho_t = -water.alpha_per_K * rho
    rho_tt = rho * (water.alpha_per_K**2 - water.dalpha_dT_per_K2)
    rho_p = water.beta_per_bar * rho
    return DielectricState(
        eps=eps,
        deps_dT=e_t + e_r * rho_t,
        d2eps_dT2=e_tt + 2 * e_tr * rho_t + e_rr * rho_t**2 + e_r * rho_tt,
        deps_dP=e_r * rho_p,
    )
