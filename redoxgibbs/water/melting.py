"""Melting curve of ice (IAPWS R14-08) and the liquid-region test used by the water layer.

Reference: IAPWS R14-08(2011), Revised Release on the Pressure along the Melting and Sublimation
Curves of Ordinary Water Substance, eqs. (1)-(5) and Table 3 (triple points).
"""

import numpy as np

__all__ = [
    "melting_pressure_ice_Ih",
    "melting_pressure_ice_III",
    "melting_pressure_ice_V",
    "melting_pressure_ice_VI",
    "melting_temperature",
    "frozen_phase",
]

T_TRIPLE_K = 273.16        # Ih-liquid-vapour triple point (R14-08 Table 3)
P_TRIPLE_PA = 611.657
T_IH_III_K, P_IH_III_PA = 251.165, 208.566e6
T_III_V_K, P_III_V_PA = 256.164, 350.1e6
T_V_VI_K, P_V_VI_PA = 273.31, 632.4e6
T_VI_VII_K, P_VI_VII_PA = 355.0, 2216.0e6

_IH_A = np.array([0.119539337e7, 0.808183159e5, 0.333826860e4])
_IH_B = np.array([0.300000e1, 0.257500e2, 0.103750e3])


def melting_pressure_ice_Ih(T_K):
    """Melting pressure of ice Ih [Pa], R14-08 eq. (1): p/pt = 1 + sum a_i (1 - theta^b_i).

    Valid 251.165 K <= T <= 273.16 K.
    """
    theta = np.asarray(T_K, dtype=float)[..., None] / T_TRIPLE_K
    return P_TRIPLE_PA * (1.0 + np.sum(_IH_A * (1.0 - theta**_IH_B), axis=-1))


def melting_pressure_ice_III(T_K):
    """Melting pressure of ice III [Pa], R14-08 eq. (2); valid 251.165-256.164 K."""
    theta = np.asarray(T_K, dtype=float) / T_IH_III_K
    return P_IH_III_PA * (1.0 - 0.299948 * (1.0 - theta**60))


def melting_pressure_ice_V(T_K):
    """Melting pressure of ice V [Pa], R14-08 eq. (3); valid 256.164-273.31 K."""
    theta = np.asarray(T_K, dtype=float) / T_III_V_K
    return P_III_V_PA * (1.0 - 1.18721 * (1.0 - theta**8))


def melting_pressure_ice_VI(T_K):
    """Melting pressure of ice VI [Pa], R14-08 eq. (4); valid 273.31-355 K."""
    theta = np.asarray(T_K, dtype=float) / T_V_VI_K
    return P_V_VI_PA * (1.0 - 1.07476 * (1.0 - theta**4.6))


def _invert_power_law(P_Pa, P_t, T_t, a, b):
    """Solve p/pt = 1 - a (1 - theta^b) for T (eqs. 2-4 of R14-08 inverted in closed form)."""
    return T_t * (1.0 + (P_Pa / P_t - 1.0) / a) ** (1.0 / b)


def _invert_ice_Ih(P_Pa):
    """Melting temperature on the ice Ih curve [K] by bisection (the curve is monotonic)."""
    lo = np.full_like(P_Pa, T_IH_III_K)
    hi = np.full_like(P_Pa, T_TRIPLE_K)
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        above = melting_pressure_ice_Ih(mid) > P_Pa  # melting pressure falls as T rises
        lo = np.where(above, mid, lo)
        hi = np.where(above, hi, mid)
    return 0.5 * (lo + hi)


def melting_temperature(P_Pa):
    """Temperature [K] of the ice-liquid boundary at pressure ``P_Pa`` (ices Ih, III, V, VI).

    Below the triple-point pressure there is no melting curve and NaN is returned.
    """
    P = np.asarray(P_Pa, dtype=float)
    T = np.full(P.shape, np.nan)
    ih = (P >= P_TRIPLE_PA) & (P <= P_IH_III_PA)
    T[ih] = _invert_ice_Ih(P[ih])
    iii = (P > P_IH_III_PA) & (P <= P_III_V_PA)
    T[iii] = _invert_power_law(P[iii], P_IH_III_PA, T_IH_III_K, 0.299948, 60)
    v = (P > P_III_V_PA) & (P <= P_V_VI_PA)
    T[v] = _invert_power_law(P[v], P_III_V_PA, T_III_V_K, 1.18721, 8)
    vi = (P > P_V_VI_PA) & (P <= P_VI_VII_PA)
    T[vi] = _invert_power_law(P[vi], P_V_VI_PA, T_V_VI_K, 1.07476, 4.6)
    return T


def frozen_phase(T_K, P_Pa, tolerance_K=0.01):
    """Name of the stable ice at (T, P) when it lies below the melting curve, else ''.

    ``tolerance_K`` admits liquid states a hair below the curve: pure water at 0 degC and
    1.01325 bar lies 2.5 mK below its melting temperature (273.1525 K) and is evaluated as the
    (metastable) liquid, as the 0 degC entries of standard tables are.
    """
    T = np.asarray(T_K, dtype=float)
    P = np.asarray(P_Pa, dtype=float)
    T_melt = melting_temperature(P)
    frozen = np.isfinite(T_melt) & (T < T_melt - tolerance_K)
    names = np.full(T.shape, "", dtype=object)
    names[frozen & (P <= P_IH_III_PA)] = "ice Ih"
    names[frozen & (P > P_IH_III_PA) & (P <= P_III_V_PA)] = "ice III"
    names[frozen & (P > P_III_V_PA) & (P <= P_V_VI_PA)] = "ice V"
    names[frozen & (P > P_V_VI_PA)] = "ice VI"
    return names
