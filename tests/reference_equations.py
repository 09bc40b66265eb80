"""Published equations used as check values by several test modules (coefficients cited here)."""

import numpy as np

#: Molar mass of water [kg/mol] (IAPWS-95 value, 18.015268 g/mol).
M_WATER_KG = 0.018015268
T_CRIT_K = 647.096

# IAPWS G7-04 (Fernandez-Prini, Alvarez & Harvey 2003, J. Phys. Chem. Ref. Data 32, 903), Table 2
# coefficients A, B, C (from memory) of ln(kH/p1*) = A/Tr + B tau^0.355/Tr + C Tr^-0.41 exp(tau),
# kH = lim f2/x2 of the gas in liquid water at the saturation pressure p1* of water. G7-04 fits
# its data to about 0.02-0.05 in log10.
G7_04 = {"H2": (-4.73284, 6.08954, 6.06066), "N2": (-9.67578, 4.72162, 11.70585),
         "O2": (-9.44833, 4.43822, 11.42005), "CO2": (-8.55445, 4.01195, 9.52345),
         "H2S": (-4.51499, 5.23538, 4.42126), "CH4": (-10.44708, 4.66491, 12.12986)}


def g7_04_henry_constant_bar(gas, T_K, psat_bar):
    """kH [bar per mole fraction] of IAPWS G7-04 at T_K, with the saturation pressure psat_bar."""
    A, B, C = G7_04[gas]
    Tr, tau = T_K / T_CRIT_K, 1 - T_K / T_CRIT_K
    ln_kh_MPa = np.log(psat_bar / 10) + A / Tr + B * tau**0.355 / Tr + C * Tr**-0.41 * np.exp(tau)
    return np.exp(ln_kh_MPa) * 10


# Standard seawater (Millero et al. 2008, Deep-Sea Res. I 55, 50, Table 4), reference salinity
# 35.16504 g/kg, in mol/kg of solution (Br- folded into Cl-, CO3^2- into the carbonate total)
SEAWATER = {"Na+": 0.4688626, "Mg^2+": 0.0528171, "Ca^2+": 0.0102821, "K+": 0.0102062,
            "Cl-": 0.5458696 + 0.0008421, "SO4^2-": 0.0282352, "HCO3-": 0.0017177 + 0.0002390}


def seawater_samples(T_C, P_bar, SA=35.16504):
    """A sample table of reference-composition seawater at absolute salinity SA [g/kg] (its
    composition scales with SA), one row per (T [degC], P [bar]), pH 8.1."""
    import pandas as pd

    frame = pd.DataFrame({"sample": [f"seawater {t} C" for t in T_C], "T [degC]": T_C, "P [bar]": P_bar,
                          "pH": 8.1})
    for sp, m in SEAWATER.items():
        frame[f"{sp} [mol/kg-solution]"] = m * SA / 35.16504
    return frame


def pytzer_solution(library, solution, T_K):
    """Activity coefficients {ion: gamma} and water activity of ``solution`` ({pytzer ion name:
    mol/kg}) at T_K from the pytzer library's parameter ``library`` (e.g. 'M88', Moller 1988), every
    other ion of the library at zero; 64-bit JAX, the precision pytzer is checked with."""
    import jax

    jax.config.update("jax_enable_x64", True)
    import pytzer

    pz = pytzer.set_library(pytzer, library)
    full = {s: 0.0 for s in list(pz.library.cations) + list(pz.library.anions) + list(pz.library.neutrals)}
    full.update(solution)
    gamma = pz.activity_coefficients(full, temperature=T_K, pressure=10.1325)
    aw = pz.activity_water(full, temperature=T_K, pressure=10.1325)
    return {k: float(gamma[k]) for k in solution}, float(aw)
