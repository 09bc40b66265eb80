"""Physical constants and reference states, each named once with its source.

The molar mass of water lives with the water equation of state (``water.iapws95.M_WATER_KG_PER_MOL``)
and the calorie with the units (``units.CAL_TO_J``, the thermochemical calorie).
"""

__all__ = ["R_J_MOL_K", "T_REF_K", "P_REF_BAR", "SECONDS_PER_YEAR"]

#: Molar gas constant [J/mol/K], CODATA 2018 (exact: Avogadro constant x Boltzmann constant)
R_J_MOL_K = 8.31446261815324
#: Reference temperature of the thermodynamic tables [K] (common practice: 25 C)
T_REF_K = 298.15
#: Reference pressure of the standard states [bar] (IUPAC standard pressure, 1 bar)
P_REF_BAR = 1.0
#: Seconds in a year [s]: the Julian year of 365.25 days (IAU; common practice for rates per year)
SECONDS_PER_YEAR = 365.25 * 86400
