"""Born functions and Debye-Hueckel parameters from the density and dielectric constant of water.

Born functions (Helgeson & Kirkham 1974, Am. J. Sci. 274, 1089, eqs. 36-40; sign conventions of
Shock et al. 1992): Z = -1/eps, Y = (d ln eps/dT)/eps, Q = (d ln eps/dP)/eps,
X = [d2 ln eps/dT2 - (d ln eps/dT)^2]/eps.
"""

import functools
from dataclasses import dataclass

import numpy as np

from ..constants import P_REF_BAR, T_REF_K
from .dielectric import dielectric_along_TP
from .iapws95 import water_state

__all__ = [
    "BornFunctions",
    "born_functions",
    "debye_hueckel_A",
    "debye_hueckel_B",
    "reference_born_functions",
]

# CODATA 2018 exact / recommended constants
_E_CHARGE = 1.602176634e-19      # C
_N_AVOGADRO = 6.02214076e23      # 1/mol
_K_BOLTZMANN = 1.380649e-23      # J/K
_EPS_VACUUM = 8.8541878128e-12   # F/m


@dataclass(frozen=True)
class BornFunctions:
    """The Born functions of the solvent at states: Z = -1/eps, Y = dZ/dT [1/K], Q = dZ/dP [1/bar], X =
    dY/dT [1/K2] (Helgeson & Kirkham 1974)."""
    Z: np.ndarray   # [-]
    Y: np.ndarray   # [1/K]
    Q: np.ndarray   # [1/bar]
    X: np.ndarray   # [1/K2]


def born_functions(dielectric):
    """Born functions from a :class:`~redoxgibbs.water.dielectric.DielectricState`."""
    eps, e_t, e_tt, e_p = dielectric.eps, dielectric.deps_dT, dielectric.d2eps_dT2, dielectric.deps_dP
    return BornFunctions(
        Z=-1.0 / eps,
        Y=e_t / eps**2,
        Q=e_p / eps**2,
        X=e_tt / eps**2 - 2.0 * e_t**2 / eps**3,
    )


@functools.lru_cache(maxsize=1)
def reference_born_functions():
    """Born functions at 25 C, 1 bar (the reference state of the HKF parameters)."""
    return born_functions(dielectric_along_TP(water_state(T_REF_K, P_REF_BAR)))


def _inverse_debye_length_per_m(T_K, density_kg_m3, eps):
    """kappa / sqrt(I) [m^-1 (mol/kg)^-1/2]: kappa^2 = 2 N_A e^2 rho_w I / (eps0 eps k T)."""
    return np.sqrt(2.0 * _N_AVOGADRO * _E_CHARGE**2 * density_kg_m3
                   / (_EPS_VACUUM * eps * _K_BOLTZMANN * T_K))


def debye_hueckel_A(T_K, density_kg_m3, eps):
    """Debye-Hueckel A_gamma [kg^0.5 mol^-0.5, log10 basis] (Helgeson & Kirkham 1974, eq. 121).

    log10 gamma = -A z^2 sqrt(I) / (1 + a B sqrt(I)); A = e^2 kappa' / (8 pi eps0 eps k T ln 10).
    """
    kappa = _inverse_debye_length_per_m(T_K, density_kg_m3, eps)
    return _E_CHARGE**2 * kappa / (8.0 * np.pi * _EPS_VACUUM * eps * _K_BOLTZMANN * T_K * np.log(10))


def debye_hueckel_B(T_K, density_kg_m3, eps):
    """Debye-Hueckel B_gamma [1/angstrom kg^0.5 mol^-0.5] (Helgeson & Kirkham 1974, eq. 122)."""
    return _inverse_debye_length_per_m(T_K, density_kg_m3, eps) * 1e-10
