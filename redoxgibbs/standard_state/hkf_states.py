"""Revised-HKF properties of several species at arrays of water states: the solvent terms (Born
functions, the g-function) evaluated once per state and shared by the species.

Used by the engine's front door (``species.properties``) and by the load-time checks of the
species data (``species.checks``), so that both take the same path.
"""

import numpy as np

from ..units import CAL_TO_J
from ..water.born import born_functions, reference_born_functions
from ..water.dielectric import dielectric_along_TP
from .gfunction import g_function_shock_1992
from .hkf import (
    HKFParameters,
    SolventTerms,
    hkf_enthalpy,
    hkf_entropy,
    hkf_gibbs,
    hkf_heat_capacity,
    hkf_volume,
    solvation_omega,
)

__all__ = ["HKF_PROPERTIES", "hkf_parameters", "hkf_properties"]

#: The properties and their unit factors: G, H [J/mol], S, Cp [J/mol/K] from cal; V [cm3/mol]
HKF_PROPERTIES = {"G": (hkf_gibbs, CAL_TO_J), "H": (hkf_enthalpy, CAL_TO_J), "S": (hkf_entropy, CAL_TO_J),
                  "Cp": (hkf_heat_capacity, CAL_TO_J), "V": (hkf_volume, 1.0)}


def hkf_parameters(linear_cal, omega_ref_cal, charges):
    """HKFParameters of several species: ``linear_cal`` a list of their 7 linear parameters (a1-a4,
    c1, c2 and the reference omega's companions, in the units of the data files)."""
    return HKFParameters(linear=np.stack(linear_cal, axis=1), omega_ref=np.asarray(omega_ref_cal, float),
                         charge=np.asarray(charges, float))


def _solvent_terms(water, params, n):
    born = born_functions(dielectric_along_TP(water))
    born_r = reference_born_functions()
    gfun = g_function_shock_1992(water.T_K, water.P_bar, water)
    omega = solvation_omega(params, gfun, n)
    return SolventTerms(Z=born.Z, Y=born.Y, Q=born.Q, X=born.X, Z_ref=float(born_r.Z),
                        Y_ref=float(born_r.Y), omega=omega[0], omega_T=omega[1],
                        omega_TT=omega[2], omega_P=omega[3])


def hkf_properties(params, water, T, P, wanted=tuple(HKF_PROPERTIES)):
    """[G, H, S, Cp, V] (each (n_states, n_species), NaN where not ``wanted``) of the species of
    ``params`` at the water states ``water`` (a WaterState at T [K], P [bar])."""
    solvent = _solvent_terms(water, params, T.size)
    return [HKF_PROPERTIES[p][0](params, T, P, solvent) * HKF_PROPERTIES[p][1] if p in wanted else np.nan
            for p in HKF_PROPERTIES]
