"""Solids: Maier-Kelley heat capacity with phase transitions, constant molar volume.

Cp = a + b T + c / T^2 (Maier & Kelley 1932, J. Am. Chem. Soc. 54, 3243), integrated segment by
segment from 298.15 K; on passing a transition temperature T_t the enthalpy of transition dH_t
adds dH_t to H, dH_t / T_t to S and dH_t (1 - T/T_t) to G (Helgeson et al. 1978, eqs. 75-77).
"""

import numpy as np

from ..constants import T_REF_K

__all__ = ["maier_kelley_properties"]

P_REF_BAR = 1.0
CM3_BAR_TO_J = 0.1


def _cp_integrals(a, b, c, T1, T2):
    """Integrals of Cp dT and Cp/T dT from T1 to T2 (arrays)."""
    int_cp = a * (T2 - T1) + b / 2 * (T2**2 - T1**2) - c * (1 / T2 - 1 / T1)
    int_cp_T = a * np.log(T2 / T1) + b * (T2 - T1) - c / 2 * (1 / T2**2 - 1 / T1**2)
    return int_cp, int_cp_T


def maier_kelley_properties(segments, G_f, H_f, S_ref, V_cm3, T, P):
    """Apparent standard properties of a solid at T [K], P [bar].

    ``segments``: sequence of (a, b, c, T_max, dH_transition) in J units, in temperature order.
    G = G_f - S_r (T - Tr) + int Cp dT - T int Cp/T dT + V (P - Pr) + transition terms.
    Returns G, H [J/mol], S, Cp [J/mol/K].
    """
    T = np.asarray(T, dtype=float)
    int_cp = np.zeros_like(T)
    int_cp_T = np.zeros_like(T)
    transition_H = np.zeros_like(T)
    transition_S = np.zeros_like(T)
    cp = np.zeros_like(T)
    T_low = T_REF_K
    last = len(segments) - 1
    for i, (a, b, c, T_max, dH_t) in enumerate(segments):
        T_top = np.inf if i == last else T_max  # the last segment is extrapolated upward
        upper = np.clip(T, T_low, T_top)
        i_cp, i_cp_T = _cp_integrals(a, b, c, T_low, upper)
        int_cp += i_cp
        int_cp_T += i_cp_T
        in_segment = (T <= T_top) & ((T > T_low) if i else True)
        cp = np.where(in_segment, a + b * T + c / T**2, cp)
        if i < last:
            transition_H += np.where(T > T_max, dH_t, 0.0)
            transition_S += np.where(T > T_max, dH_t / T_max, 0.0)
        T_low = T_max
    below = T < T_REF_K  # extrapolate the first segment below 25 C
    if below.any():
        a, b, c = segments[0][:3]
        i_cp, i_cp_T = _cp_integrals(a, b, c, T_REF_K, T)
        int_cp = np.where(below, i_cp, int_cp)
        int_cp_T = np.where(below, i_cp_T, int_cp_T)
    pv = V_cm3 * CM3_BAR_TO_J * (np.asarray(P, dtype=float) - P_REF_BAR)
    H = H_f + int_cp + transition_H + pv
    S = S_ref + int_cp_T + transition_S
    G = G_f - S_ref * (T - T_REF_K) + int_cp - T * int_cp_T + transition_H - T * transition_S + pv
    return G, H, S, cp
