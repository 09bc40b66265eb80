"""Stoichiometric equilibrium constants of seawater from the whole speciation chain (standard
states, ion pairs, activity model) against the measured constants of seawater chemistry.

The check values come from PyCO2SYS 1.8.3.4 (Humphreys et al. 2022, Geosci. Model Dev. 15, 15), a
seawater carbonate-chemistry library that carries the published fits of constants measured in
seawater: K1*, K2* of Lueker, Dickson & Keeling (2000) Mar. Chem. 70, 105; KB* of Dickson (1990)
Deep-Sea Res. 37, 755; KP2*, KP3* of Yao & Millero (1995) Aquat. Geochem. 1, 53; the calcite
solubility product of Mucci (1983) Am. J. Sci. 283, 780. Constants are on the free-H+ scale in mol
per kg of seawater; the model's molalities are converted with 1 - 0.001005 S kg of water per kg of
seawater (common practice: Dickson, Sabine & Christian 2007, PICES Special Publication 3).
"""

import numpy as np
import pytest
import PyCO2SYS as pyco2

from reference_equations import seawater_samples
from redoxgibbs.speciation.solver import speciate

S = 35.0
WATER_PER_KG_SEAWATER = 1 - 0.001005 * S


def _measured_pK(T_C):
    r = pyco2.sys(par1=2300, par2=8.1, par1_type=1, par2_type=3, salinity=S, temperature=T_C, pressure=0,
                  opt_pH_scale=3, opt_k_carbonic=10, total_phosphate=2, total_silicate=0)
    names = {"K1": "k_carbonic_1", "K2": "k_carbonic_2", "KB": "k_borate", "KP2": "k_phosphoric_2",
             "KP3": "k_phosphoric_3", "Kcalcite": "k_calcite"}
    return {k: -np.log10(float(r[v])) for k, v in names.items()}


def _seawater(T_C, model):
    frame = seawater_samples([T_C], [1.0])
    frame["B(OH)3(aq) [umol/kg-solution]"] = 416.0     # total boron at S = 35 (Uppstrom 1974)
    frame["HPO4^2- [umol/kg-solution]"] = 2.0
    return speciate(frame, model)


def _model_pK(result):
    m = dict(zip(result.species, result.molality[0] * WATER_PER_KG_SEAWATER))   # per kg of seawater

    def total(*groups):
        return sum(v for s, v in m.items() if any(g(s) for g in groups))

    def carbonate(s):
        return "CO3" in s and "HCO3" not in s

    def bicarbonate(s):
        return "HCO3" in s

    def hydrogen_phosphate(s):
        return "HPO4" in s and "H2PO4" not in s

    def dihydrogen_phosphate(s):
        return "H2PO4" in s and "H3PO4" not in s

    def phosphate(s):
        return "PO4" in s and not any(x in s for x in ("HPO4", "H2PO4", "H3PO4"))

    H = m["H+"]
    pK = {"K1": -np.log10(H * total(bicarbonate) / m["CO2(aq)"]),
          "K2": -np.log10(H * total(carbonate) / total(bicarbonate)),
          "KB": -np.log10(H * total(lambda s: "B(OH)4" in s) / m["B(OH)3(aq)"]),
          "KP2": -np.log10(H * total(hydrogen_phosphate) / total(dihydrogen_phosphate)),
          "KP3": -np.log10(H * total(phosphate) / total(hydrogen_phosphate))}
    # the calcite solubility product of seawater: total Ca x total carbonate at saturation
    si = result.saturation_index[0, result.minerals.index("calcite")]
    pK["Kcalcite"] = -np.log10(total(lambda s: "Ca" in s) * total(carbonate)) + si
    return pK


# Tolerances: the measured constants' own uncertainty is 0.01-0.02 (K1*, K2*, KB*) to 0.05 (KP*,
# Kcalcite). Pitzer: its parameters for carbonate and borate were fitted to such data (0.05); the
# phosphate parameters are 25 C values, and none exist for the charged Mg and Ca phosphate pairs
# (0.07 in KP2*, 0.2 in KP3*). B-dot was never fitted to seawater's Mg-Ca-SO4 mixture: 0.1-0.2 in the
# log gamma of its divalent ions (0.1 in K2* and Kcalcite, 0.2 in KP2*, 0.25 in KP3*); its borate is
# a known departure (tests/species/test_ocean_species_against_references.py). KP3* is checked at
# 25 C only: the Mg and Ca phosphate pairs that hold most of PO4^3- are 25 C constants without a
# published enthalpy (flagged away from 25 C), and the departure grows to 0.29 at 15 C and 0.41 at
# 5 C (Pitzer). Without those pairs B-dot missed KP3* by 3 units (11.87 against 8.90).
TOLERANCES = {
    "pitzer": {"K1": 0.05, "K2": 0.03, "KB": 0.05, "KP2": 0.07, "KP3": 0.2, "Kcalcite": 0.08},
    "bdot": {"K1": 0.05, "K2": 0.1, "KP2": 0.2, "KP3": 0.25, "Kcalcite": 0.12},
}


@pytest.mark.parametrize("model", list(TOLERANCES))
@pytest.mark.parametrize("T_C", [5.0, 15.0, 25.0, 35.0])
def test_seawater_constants_against_measured(model, T_C):
    got, expected = _model_pK(_seawater(T_C, model)), _measured_pK(T_C)
    for k, tol in TOLERANCES[model].items():
        if k == "KP3" and T_C != 25.0:
            continue
        assert got[k] == pytest.approx(expected[k], abs=tol), k

