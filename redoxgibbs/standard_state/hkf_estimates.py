"""Revised-HKF parameters estimated from a species' standard properties at 25 C, 1 bar.

For species whose HKF parameters were never regressed (or cannot be vouched for), the published
correlations of Shock and Helgeson give the parameters that fix the temperature dependence:

- omega, the Born coefficient, from the standard entropy S (Shock & Helgeson 1990, Geochim.
  Cosmochim. Acta 54, 915, eq. 58; Shock, Helgeson & Sverjensky 1989, Geochim. Cosmochim. Acta
  53, 2157, eq. 61 for neutral species): omega = -1514.4 S + beta_Z, with beta_Z a constant per
  charge Z (0 for neutral species);
- c2 from the heat capacity (Shock & Helgeson 1988, Geochim. Cosmochim. Acta 52, 2009, eq. 89):
  c2 = (0.2037 Cp - 3.0346) x 1e4;
- c1 then closes the heat capacity at 25 C: Cp = c1 + c2/(Tr - Theta)^2 + omega Tr X_r;
- the pressure parameters are reduced to a constant non-solvation volume, a1 = V/41.84 + omega Q_r
  (a2 = a3 = a4 = 0), in place of the published volume correlations: along the saturation curve
  and to a few hundred bar this term moves G by V dP, a few hundred J/mol at most.

All quantities in the calorie units of the HKF tables: S and Cp [cal/mol/K], V [cm3/mol],
omega and c2 [cal/mol] and [cal K/mol], X_r [1/K^2], Q_r [1/bar].
"""

import numpy as np

from .hkf import CAL_BAR_TO_CM3, THETA_K, T_REF_K

__all__ = ["OMEGA_ENTROPY_SLOPE", "omega_from_entropy_shock_helgeson_1990",
           "c2_from_heat_capacity_shock_helgeson_1988", "c1_closing_heat_capacity",
           "a1_constant_nonsolvation_volume"]

#: Slope of the omega-entropy correlation [cal/mol per cal/mol/K] (Shock & Helgeson 1990, eq. 58)
OMEGA_ENTROPY_SLOPE = -1514.4


def omega_from_entropy_shock_helgeson_1990(S_cal, beta_cal):
    """Conventional Born coefficient omega [cal/mol] = -1514.4 S + beta_Z (S [cal/mol/K])."""
    return OMEGA_ENTROPY_SLOPE * np.asarray(S_cal, float) + beta_cal


def c2_from_heat_capacity_shock_helgeson_1988(Cp_cal):
    """c2 [cal K/mol] = (0.2037 Cp - 3.0346) x 1e4, Cp [cal/mol/K] (Shock & Helgeson 1988, eq. 89)."""
    return (0.2037 * np.asarray(Cp_cal, float) - 3.0346) * 1e4


def c1_closing_heat_capacity(Cp_cal, c2_cal, omega_cal, X_ref):
    """c1 [cal/mol/K] that reproduces Cp at 25 C: Cp - c2/(Tr - Theta)^2 - omega Tr X_r."""
    return Cp_cal - c2_cal / (T_REF_K - THETA_K) ** 2 - omega_cal * T_REF_K * X_ref


def a1_constant_nonsolvation_volume(V_cm3, omega_cal, Q_ref):
    """a1 [cal/mol/bar] holding the non-solvation volume V + omega Q_r constant (V [cm3/mol])."""
    return np.asarray(V_cm3, float) / CAL_BAR_TO_CM3 + omega_cal * Q_ref
