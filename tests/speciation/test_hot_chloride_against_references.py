"""Hot chloride fluids under B-dot (with the NaCl(aq) ion pair) against measured activities.

Check values: the stoichiometric mean activity coefficients of NaCl and CaCl2 solutions from the
Pitzer fit of Moller (1988) Geochim. Cosmochim. Acta 52, 821 to measured osmotic and activity
coefficients (0-250 C), evaluated by the pytzer library (its M88 parameter library, its own code).
The B-dot result is the stoichiometric one: free-ion activities over the analytical molalities, so
the share of NaCl(aq) counts.
"""

import numpy as np
import pandas as pd
import pytest

from reference_equations import pytzer_solution

from redoxgibbs.speciation.solver import speciate
from redoxgibbs.water.iapws95 import psat_convention_bar

SALTS = {"NaCl": ("Na", "Na+", 1), "CaCl2": ("Ca", "Ca^2+", 2)}


def _moller_1988(salt, m, T_K):
    ion, _, n_cl = SALTS[salt]
    g, _ = pytzer_solution("M88", {ion: m, "Cl": n_cl * m}, T_K)
    return (g[ion] * g["Cl"] ** n_cl) ** (1 / (1 + n_cl))


def _bdot(salt, ms, T_C):
    _, cation, n_cl = SALTS[salt]
    P = float(psat_convention_bar(np.array([T_C + 273.15]))[0]) + 1.0
    frame = pd.DataFrame({"sample": [f"m{m}" for m in ms], "T [degC]": T_C, "P [bar]": P, "pH": 7.0,
                          f"{cation} [mol/kg]": ms, "Cl- [mol/kg]": n_cl * np.asarray(ms)})
    r = speciate(frame, "bdot")
    la = r.log10_activity
    log_ia = la[:, r.species.index(cation)] + n_cl * la[:, r.species.index("Cl-")]
    return (10**log_ia / (np.asarray(ms) * (n_cl * np.asarray(ms)) ** n_cl)) ** (1 / (1 + n_cl))


# Tolerance: B-dot's known accuracy at 1 mol/kg (10 % for NaCl at 25 C against Robinson & Stokes,
# tests/speciation/test_speciation.py). Measured here: NaCl within 14 % to 1 mol/kg (largest at
# 100-150 C), CaCl2 within 8 % to 0.3 mol/kg and 200 C. Above 250 C Moller's fit is not carried by
# the reference library.
@pytest.mark.parametrize("T_C", [100.0, 150.0, 200.0, 250.0])
def test_nacl_mean_activity_coefficient_to_250C(T_C):
    ms = [0.1, 0.5, 1.0]
    expected = [_moller_1988("NaCl", m, T_C + 273.15) for m in ms]
    np.testing.assert_allclose(_bdot("NaCl", ms, T_C), expected, rtol=0.15)


@pytest.mark.parametrize("T_C", [100.0, 150.0, 200.0, pytest.param(250.0, marks=pytest.mark.xfail(
    strict=True, reason="known departure: without CaCl+ (no revised-HKF parameters that could be vouched "
    "for) B-dot puts gamma(CaCl2) 16 % above Moller (1988) at 250 C, 0.3 mol/kg"))])
def test_cacl2_mean_activity_coefficient_to_250C(T_C):
    ms = [0.05, 0.1, 0.3]
    expected = [_moller_1988("CaCl2", m, T_C + 273.15) for m in ms]
    np.testing.assert_allclose(_bdot("CaCl2", ms, T_C), expected, rtol=0.1)
