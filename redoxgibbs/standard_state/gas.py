"""Ideal gases: NASA 7-coefficient polynomials, standard state the pure gas at 1 bar.

cp/R = a1 + a2 T + a3 T^2 + a4 T^3 + a5 T^4
h/RT = a1 + a2 T/2 + a3 T^2/3 + a4 T^3/4 + a5 T^4/5 + a6/T
s/R  = a1 ln T + a2 T + a3 T^2/2 + a4 T^3/3 + a5 T^4/4 + a7
(McBride, Gordon & Reno 1993, NASA TM-4513, eqs. 1-3). Coefficients are those cantera ships in
``nasa_gas.yaml``; that file labels its reference pressure 1 atm but its entropies are 1-bar values.
"""

import functools

import cantera as ct
import numpy as np

from ..constants import R_J_MOL_K as R
from ..constants import T_REF_K

__all__ = ["apparent_gas_properties", "nasa7_coefficients", "nasa7_cp_h_s"]



@functools.cache
def nasa7_coefficients(nasa_name):
    """(T_low, T_mid, T_high, low-range coefficients (7,), high-range coefficients (7,))."""
    species = {s.name: s for s in _nasa_species()}
    thermo = species[nasa_name].thermo
    c = thermo.coeffs
    return thermo.min_temp, c[0], thermo.max_temp, np.array(c[8:15]), np.array(c[1:8])


@functools.lru_cache(maxsize=1)
def _nasa_species():
    return tuple(ct.Species.list_from_file("nasa_gas.yaml"))


def nasa7_cp_h_s(coeffs, T):
    """cp [J/mol/K], h [J/mol] and s [J/mol/K] from NASA 7-coefficient polynomials at T [K]."""
    _, T_mid, _, low, high = coeffs
    a = np.where((T < T_mid)[..., None], low, high)
    a1, a2, a3, a4, a5, a6, a7 = np.moveaxis(a, -1, 0)
    cp = R * (a1 + a2 * T + a3 * T**2 + a4 * T**3 + a5 * T**4)
    h = R * T * (a1 + a2 * T / 2 + a3 * T**2 / 3 + a4 * T**3 / 4 + a5 * T**4 / 5 + a6 / T)
    s = R * (a1 * np.log(T) + a2 * T + a3 * T**2 / 2 + a4 * T**3 / 3 + a5 * T**4 / 4 + a7)
    return cp, h, s


def apparent_gas_properties(coeffs, G_f, H_f, S_ref, T):
    """Apparent standard properties of formation of an ideal gas at T [K] (pressure-independent).

    G(T) = G_f + [g(T) - g(Tr)] + [s(Tr) - S_ref] (T - Tr), H(T) = H_f + [h(T) - h(Tr)],
    S(T) = S_ref + [s(T) - s(Tr)] with g = h - T s from the polynomials (Benson-Helgeson
    convention; the (T - Tr) term carries the tabulated S_ref into G, so dG/dT = -S exactly).
    Returns G, H [J/mol], S, Cp [J/mol/K].
    """
    T_ref = np.array(T_REF_K)
    cp, h, s = nasa7_cp_h_s(coeffs, T)
    _, h_r, s_r = nasa7_cp_h_s(coeffs, T_ref)
    G = G_f + (h - T * s) - (h_r - T_ref * s_r) + (s_r - S_ref) * (T - T_ref)
    return G, H_f + h - h_r, S_ref + s - s_r, cp
