"""Fuzz (hypothesis, derandomized): sample tables, reaction strings and scenario files.

Every outcome is a result or one of the project's own errors; a result never holds a silent NaN
(each undefined dGr has its reason: a failure, a missing or a zero species). A larger run is
benchmarks/fuzz_inputs.py.
"""

import numpy as np
import pandas as pd
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from scenarios import POOL_SCENARIO

from redoxgibbs.energetics.catalog import catalog
from redoxgibbs.errors import RedoxGibbsError
from redoxgibbs.pipeline.evaluate import evaluate
from redoxgibbs.reactions.reaction import Reaction
from redoxgibbs.speciation.samples import read_samples

COLUMNS = ["Na+ [mmol/kg]", "Cl- [mmol/kg]", "HCO3- [mmol/kg]", "CO2(aq) [umol/kg]", "HS- [umol/kg]",
           "H2(aq) [umol/kg]", "O2(aq) [umol/kg]", "CH4(aq) [umol/kg]", "SO4^2- [mmol/kg]", "Fe^2+ [umol/kg]",
           "Fe^3+ [umol/kg]", "NH4+ [umol/kg]", "NO3- [umol/kg]", "Ca^2+ [mmol/kg]", "Mg^2+ [mmol/kg]",
           "CH3COO- [umol/kg]", "Mn^2+ [umol/kg]", "B(OH)3(aq) [umol/kg]", "F- [umol/kg]", "H2(g) [bar]",
           "Na+ [mg/L]", "Cl- [mol/kg-solution]", "alkalinity [meq/kg]", "DIC [mmol/kg]", "notes"]
BROKEN = ["Na+ [furlong]", "Nax+ [mmol/kg]", "Na+ [mmol/kg", "density [g/cm3]"]
# mostly amounts a lab would write, sometimes the malformed cells a table may hold
CELLS = st.one_of(st.floats(0, 600), st.floats(0, 600), st.floats(0, 600), st.just(0.0),
                  st.sampled_from(["<0.1", "bdl", "nd", "assumed 2", "air-saturated", "x", "", "1e30", " 5 ",
                                   float("nan"), float("inf"), -1.0]))
REACTIONS = [x for x in catalog() if x.name in ("aerobic hydrogen oxidation", "hydrogenotrophic methanogenesis",
                                                  "sulfate reduction with H2", "ferrous iron oxidation with O2 to goethite")]


@st.composite
def sample_tables(draw):
    n = draw(st.integers(1, 4))
    columns = draw(st.lists(st.sampled_from(COLUMNS), min_size=1, max_size=8, unique=True))
    if draw(st.integers(0, 9)) == 0:
        columns.append(draw(st.sampled_from(BROKEN)))
    frame = pd.DataFrame({"sample": [f"s{i}" for i in range(n)]})
    frame["T [degC]"] = draw(st.lists(st.one_of(st.floats(-5, 400), st.floats(-30, 1100)), min_size=n, max_size=n))
    frame["P [bar]"] = draw(st.lists(st.one_of(st.floats(1, 1000), st.floats(0.5, 6000), st.just("psat")),
                                     min_size=n, max_size=n))
    frame["pH"] = draw(st.lists(st.one_of(st.floats(2, 12), st.floats(-2, 16), st.just(np.nan)),
                                min_size=n, max_size=n))
    for c in columns:
        frame[c] = pd.Series(draw(st.lists(CELLS, min_size=n, max_size=n)), dtype=object)
    return frame


@pytest.mark.filterwarnings("error::RuntimeWarning")    # a numpy warning is a NaN on its way
@settings(max_examples=1500, deadline=None, derandomize=True, suppress_health_check=[HealthCheck.too_slow])
@given(sample_tables(), st.booleans())
def test_sample_tables_end_in_a_result_or_our_own_error(frame, from_charge_balance):
    try:
        ev = evaluate(read_samples(frame), REACTIONS, "bdot", pH_from_charge_balance=from_charge_balance)
    except RedoxGibbsError:
        return
    rows = ev.to_frame()
    undefined = rows["dGr_kJ_per_mol"].isna()
    explained = (rows["failure"] != "") | (rows["missing_species"] != "") | (rows["zero_species"] != "")
    assert not (undefined & ~explained).any(), rows[undefined & ~explained]
    assert np.isfinite(rows.loc[~undefined, "dGr_kJ_per_mol"]).all()
    ok = ev.speciation.failure == ""
    assert np.isfinite(ev.speciation.pH[ok]).all() and np.isfinite(ev.speciation.ionic_strength[ok]).all()


TOKENS = ["H2(aq)", "O2(aq)", "2", "1/2", "0.5", "+", "=", "->", "H2O(l)", "CO2(aq)", "CH4(aq)", "HS-", "SO4-2",
          "SO4^2-", "Fe+3", "goethite", "pyrite", "H+", "e-", "Xx", "(", ")", "==", "4", "-", "NaCl", "H2(g)"]


@settings(max_examples=1000, deadline=None, derandomize=True)
@given(st.lists(st.sampled_from(TOKENS), min_size=1, max_size=9))
def test_reaction_strings_end_in_a_reaction_or_our_own_error(tokens):
    try:
        Reaction(" ".join(tokens))
    except RedoxGibbsError:
        pass


SCENARIO = POOL_SCENARIO + """[cells]
model = "tijhuis1993"
cell_carbon_g = [1e-14, 1e-13]
[uncertainty]
sample = "pool"
draws = 10
[uncertainty.inputs]
"T [degC]" = { distribution = "uniform", low = 20, high = 40 }
"""
VALUES = ["1", "-1", "0", "200.7", '"ten"', '"all"', "[1, 2]", '["aerobic hydrogen oxidation"]', "true",
          '"bdot"', "[]", "{}", '"x"', "1e400", '"present"']


@settings(max_examples=300, deadline=None, derandomize=True, suppress_health_check=[HealthCheck.too_slow,
                                                                                     HealthCheck.function_scoped_fixture])
@given(st.integers(0, SCENARIO.count("\n") - 1), st.sampled_from(VALUES), st.booleans())
def test_scenario_files_end_in_a_scenario_or_our_own_error(tmp_path, line, value, rename):
    from redoxgibbs.interfaces.scenario import load_scenario, sweep_spec

    lines = SCENARIO.splitlines()
    if "=" in lines[line] and not lines[line].startswith("["):
        key = lines[line].split("=")[0].strip()
        lines[line] = f"{key}x = {value}" if rename else f"{key} = {value}"
    else:
        lines[line] = lines[line].replace("]", "s]") if rename else lines[line]
    path = tmp_path / "fuzz.toml"
    path.write_text("\n".join(lines) + "\n")
    try:
        scenario = load_scenario(path)
        sweep_spec(scenario)
    except RedoxGibbsError:
        pass
