"""Activity coefficients of dissolved gases (neutral species) in salt solutions: salting-out.

Shared by every activity model for the neutral species it has no parameters of. References:
Drummond (1981) Ph.D. thesis, Pennsylvania State Univ. (CO2 in NaCl); Weisenberger & Schumpe
(1996) AIChE J. 42, 298 (Setschenow coefficients).
"""

import numpy as np

__all__ = ["SETSCHENOW_K", "log10_gamma_co2_drummond_1981", "log10_gamma_neutral"]

# Setschenow coefficients k [kg/mol], log10 gamma = k I, of dissolved gases in NaCl solutions near
# 25 C (Weisenberger & Schumpe 1996, AIChE J. 42, 298, evaluated for NaCl; from memory).
SETSCHENOW_K = {"O2(aq)": 0.141, "N2(aq)": 0.130, "H2(aq)": 0.105, "CH4(aq)": 0.127,
                "H2S(aq)": 0.061, "CO(aq)": 0.130, "N2O(aq)": 0.110}


def log10_gamma_co2_drummond_1981(T_K, I):
    """log10 gamma of CO2(aq) in NaCl solutions, Drummond (1981), as given by many later works.

    ln gamma = (C + F T + G/T) I - (E + H T) I/(I + 1), C = -1.0312, F = 1.2806e-3, G = 255.9,
    E = 0.4445, H = -1.606e-3 (T in K; from memory). Valid 0-400 C, I up to about 4 mol/kg.
    """
    T = np.asarray(T_K, float)
    ln_gamma = (-1.0312 + 1.2806e-3 * T + 255.9 / T) * I - (0.4445 - 1.606e-3 * T) * I / (I + 1)
    return ln_gamma / np.log(10)


def log10_gamma_neutral(names, T_K, I):
    """log10 gamma (n, s) of dissolved gases by their salting-out in NaCl solutions; 0 elsewhere.

    CO2(aq) by Drummond (1981), the gases of ``SETSCHENOW_K`` by log10 gamma = k I; every other
    species (ions included) gets 0 here.
    """
    out = np.zeros((I.shape[0], len(names)))
    for j, name in enumerate(names):
        if name == "CO2(aq)":
            out[:, j] = log10_gamma_co2_drummond_1981(T_K, I)
        elif name in SETSCHENOW_K:
            out[:, j] = SETSCHENOW_K[name] * I
    return out
