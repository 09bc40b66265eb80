"""Consistency (not an outside check): a sample carries the caveats of the species data it uses."""

import numpy as np

from reference_equations import seawater_samples
from redoxgibbs.speciation.solver import speciate


def test_ion_pairs_used_outside_their_temperatures_flag_the_sample():
    # seawater's sulfate and carbonate ion pairs are 25 C constants with a trusted range of -20 to
    # 100 C (NaHCO3(aq): 15 to 35 C, no published enthalpy)
    flags = speciate(seawater_samples([25.0, 2.0, 300.0], [300.0] * 3), "bdot").sample_flags()
    assert "outside_formation_T_range" not in flags[0] and "formation_enthalpy_missing" not in flags[0]
    assert "outside_formation_T_range" in flags[1] and "formation_enthalpy_missing" in flags[1]
    assert "outside_formation_T_range" in flags[2]


def test_a_sample_does_not_take_its_neighbours_caveats():
    # at 25 C every pair is within its range and at its reference temperature
    flags = speciate(seawater_samples([25.0, 60.0], [1.0, 1.0]), "bdot").sample_flags()
    assert flags[0] == ""
    assert np.all([f == "" or "formation" in f for f in flags])


def test_the_hot_acid_chloride_fluid_is_flagged():
    # NaCl(aq) (trusted to 150 C) holds 5 % of the chloride of this 350 C fluid, whose in-situ pH is
    # a known departure (tests/speciation/test_speciation.py): the result must say so
    import pandas as pd

    frame = pd.DataFrame({"sample": ["hot"], "T [degC]": [350.0], "P [bar]": [300.0], "pH": [3.5],
                          "pH T [degC]": [25.0], "Na+ [mmol/kg]": [500.0], "Cl- [mmol/kg]": [550.0]})
    assert "outside_formation_T_range" in speciate(frame, "bdot").sample_flags()[0]


def test_flags_are_joined_once_each():
    from redoxgibbs.flags import join_flags

    got = join_flags(np.array(["a, b", "", "c"], dtype=object), np.array(["b, d", "e", ""], dtype=object))
    assert list(got) == ["a, b, d", "e", "c"]
