"""Consistency (not an outside check): the Pitzer model inside the speciation.

Its ion pairs are carried by the interaction parameters, so the speciation leaves them out; ions
without parameters still speciate; its range flags reach the sample flags.
"""

import numpy as np
import pandas as pd

from redoxgibbs.speciation.solver import speciate


def _brine(T_C=25.0, nacl=5.0):
    return pd.DataFrame({"sample": ["brine"], "T [degC]": [T_C], "P [bar]": [10.0], "pH": [7.5],
                         "Na+ [mol/kg]": [nacl], "Cl- [mol/kg]": [nacl + 0.1], "Mg^2+ [mmol/kg]": [50.0],
                         "SO4^2- [mmol/kg]": [30.0], "Ca^2+ [mmol/kg]": [10.0], "HCO3- [mmol/kg]": [2.0],
                         "Fe^2+ [umol/kg]": [5.0], "HS- [umol/kg]": [20.0]})


def test_complexes_of_the_basis_ions_are_left_to_the_parameters():
    pitzer, bdot = speciate(_brine(), "pitzer"), speciate(_brine(), "bdot")
    for pair in ("NaCl(aq)", "MgSO4(aq)", "NaSO4-", "CaHCO3+"):
        assert pair in bdot.species and pair not in pitzer.species
    for kept in ("HSO4-", "CO2(aq)", "CaCO3(aq)", "MgOH+", "FeCl+", "FeSO4(aq)"):
        assert kept in pitzer.species
    # mass balance holds with the model's own species
    np.testing.assert_allclose(pitzer.totals["Na+"], 5.0, rtol=1e-9)


def test_range_flags_reach_the_sample_flags():
    brine = speciate(_brine(nacl=5.0), "pitzer")
    assert "ionic_strength_beyond_pitzer_range" not in brine.sample_flags()[0]
    assert "ionic_strength_beyond_bdot_range" in speciate(_brine(nacl=5.0), "bdot").sample_flags()[0]
    cold = speciate(_brine(T_C=-2.0, nacl=0.5), "pitzer")     # MgCl2 parameters hold from 25 C
    assert "pitzer_parameters_outside_their_temperatures" in cold.sample_flags()[0]
    assert "pitzer_parameters_outside_their_temperatures" in cold.summary_frame()["flags"][0]


def test_a_trace_ion_on_parameters_far_outside_their_range_flags_the_sample():
    # H+ with Cl- (Campbell et al. 1993, 0-55 C) sets the pH of an acid NaCl fluid: held 95 K
    # beyond its range at 150 C it flags, though H+ is a trace ion; 20 K beyond it does not
    def acid(T_C):
        frame = pd.DataFrame({"sample": ["acid"], "T [degC]": [T_C], "P [bar]": [50.0], "pH": [3.5],
                              "Na+ [mmol/kg]": [500.0], "Cl- [mmol/kg]": [500.0]})
        return speciate(frame, "pitzer").sample_flags()[0]

    assert "pitzer_parameters_outside_their_temperatures" in acid(150.0)
    assert "pitzer_parameters_outside_their_temperatures" not in acid(75.0)


def test_ions_without_parameters_are_flagged_beyond_one_percent_of_the_ionic_strength():
    clean = _brine(nacl=0.5)
    ammonium = _brine(nacl=0.5).assign(**{"NH4+ [mmol/kg]": [100.0]})
    assert "pitzer_ions_without_parameters" not in speciate(clean, "pitzer").sample_flags()[0]
    assert "pitzer_ions_without_parameters" in speciate(ammonium, "pitzer").sample_flags()[0]
