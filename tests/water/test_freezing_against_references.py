"""Ice Ih, the freezing point of saline fluids and the osmotic coefficient, against outside sources.

- the ice Ih Gibbs function (IAPWS R10-06) against the iapws package's implementation;
- the freezing point of pure water (R10-06 ice against IAPWS-95 liquid) against the separate
  IAPWS R14-08 melting-curve correlation;
- the freezing point of seawater against TEOS-10 (gsw.t_freezing);
- the osmotic coefficient of NaCl(aq) against Robinson & Stokes (1959);
- seawater is liquid at -1.9 C and frozen, by name, at -2.5 C.
"""

import warnings

import gsw
import numpy as np
import pandas as pd
import pytest
from iapws._iapws import _Ice
from reference_equations import seawater_samples

from redoxgibbs.speciation.solver import speciate
from redoxgibbs.water.ice import freezing_temperature, ice_ih_gibbs
from redoxgibbs.water.melting import melting_temperature


@pytest.mark.parametrize("T,P_Pa", [(273.16, 611.657), (273.152519, 101325.0), (260.0, 1e7),
                                    (250.0, 1e5), (200.0, 1e8), (100.0, 1e8)])
def test_ice_gibbs_function_against_the_iapws_package(T, P_Pa):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        ref = _Ice(T, P_Pa / 1e6)            # kJ/kg, kJ/kg/K
    g, s = ice_ih_gibbs(np.array(T), np.array(P_Pa))
    assert float(g) == pytest.approx(ref["g"] * 1e3, abs=1e-6)
    assert float(s) == pytest.approx(ref["s"] * 1e3, abs=1e-9)


def test_pure_water_freezes_on_the_r14_08_melting_curve():
    # R10-06 and IAPWS-95 in equilibrium against the separate R14-08 correlation, whose stated
    # uncertainty in temperature is a few mK along the ice Ih curve
    P_bar = np.array([0.00611657 * 1.0001, 1.01325, 100.0, 500.0, 1000.0, 2000.0])
    T = freezing_temperature(P_bar, np.full(P_bar.size, -1e-15))
    np.testing.assert_allclose(T, melting_temperature(P_bar * 1e5), atol=2e-3)






# tolerance per model: B-dot's osmotic coefficient in seawater is good to 2-3 % of a 1.9 K
# depression (0.05 K); Pitzer's to about half a per cent (0.01 K)
@pytest.mark.parametrize("model,tolerance_K", [("bdot", 0.05), ("pitzer", 0.01)])
@pytest.mark.parametrize("p_dbar", [0.0, 100.0, 1000.0])
def test_seawater_freezing_point_against_teos10(p_dbar, model, tolerance_K):
    P_bar = 1.01325 + p_dbar / 10
    result = speciate(seawater_samples([-1.0], [P_bar]), model)
    expected = gsw.t_freezing(35.16504, p_dbar, 0.0)    # air-free seawater
    assert float(result.freezing_point_K()[0]) - 273.15 == pytest.approx(expected, abs=tolerance_K)


def test_seawater_is_liquid_at_minus_1_9_and_frozen_at_minus_2_5():
    # one table: the frozen sample is reported in its own row, the other is computed
    result = speciate(seawater_samples([-1.9, -2.5], [1.0, 1.0]), "bdot")
    assert result.failure[0] == "" and np.isfinite(result.pH[0])
    assert result.failure[1].startswith("frozen") and np.isnan(result.pH[1])
    summary = result.summary_frame()
    assert summary.loc[1, "sample"] == "seawater -2.5 C" and "freezing point is -1.9" in summary.loc[1, "failure"]


def test_half_molal_nacl_is_liquid_at_minus_1_and_100_bar():
    frame = pd.DataFrame({"sample": ["brine"], "T [degC]": [-1.0], "P [bar]": [100.0], "pH": [7.0],
                          "Na+ [mol/kg]": [0.5], "Cl- [mol/kg]": [0.5]})
    assert float(speciate(frame, "bdot").freezing_point_K()[0]) < 272.15


# Robinson & Stokes (1959) Electrolyte Solutions, Appendix 8.3: osmotic coefficient of NaCl(aq) at
# 25 C (from memory)
NACL_PHI = {0.1: 0.9324, 0.5: 0.9209, 1.0: 0.9355}


def test_bdot_osmotic_coefficient_of_nacl():
    m = np.array(list(NACL_PHI))
    frame = pd.DataFrame({"sample": [f"m{x}" for x in m], "T [degC]": 25.0, "P [bar]": 1.0, "pH": 7.0,
                          "Na+ [mol/kg]": m, "Cl- [mol/kg]": m})
    phi = -speciate(frame, "bdot").log10_water_activity * np.log(10) / (0.0180153 * 2 * m)
    # 5 %: B-dot's mean activity coefficient of NaCl is itself 10 % off at 1 m (test_speciation)
    np.testing.assert_allclose(phi, list(NACL_PHI.values()), rtol=0.05)
