"""Consistency (not an outside check): every command computes through the same path, so the same
sample gives the same numbers through assess, insitu, a one-point sweep and mixing at an
end-member, for catalog, custom, enumerated and gas-bearing reactions."""

import io
import textwrap
from contextlib import redirect_stdout

import numpy as np
import pandas as pd
import pytest

from redoxgibbs.interfaces.assess import run_assessment
from redoxgibbs.interfaces.cli import main
from redoxgibbs.interfaces.scenario import load_scenario, sweep_spec
from redoxgibbs.sweeps.runner import load_results, run_sweep

SAMPLES = ("sample,T [degC],P [bar],pH,Na+ [mmol/kg],Cl- [mmol/kg],HCO3- [mmol/kg],O2(aq) [umol/kg],"
           "CH4(aq) [umol/kg],H2(g) [bar]\n"
           "pool,30,20,7.4,100,100,2,50,5,0.001\n"
           "hot,150,20,6.0,300,300,5,0,400,0.01\n")
SCENARIO = """
title = "one path"
[[sites]]
name = "site"
samples = "samples.csv"
[reactions]
catalog = ["aerobic hydrogen oxidation", "aerobic methane oxidation"]
custom = ["2 H2(g) + O2(aq) = 2 H2O(l)", "H2(aq) + 1/2 O2(aq) = H2O(l)"]
[reactions.enumerate]
donors = ["H+/H2"]
acceptors = ["O2/H2O"]
[[supply]]
kind = "flow-through"
flux_kg_per_s = 1.0
volume_m3 = 10.0
[sweep]
sample = "pool"
[sweep.inputs]
"T [degC]" = [30.0]
"""


@pytest.fixture(scope="module")
def folder(tmp_path_factory):
    path = tmp_path_factory.mktemp("one_path")
    (path / "samples.csv").write_text(SAMPLES)
    (path / "s.toml").write_text(textwrap.dedent(SCENARIO))
    return path


def test_assess_insitu_sweep_and_mix_agree(folder):
    assessed = run_assessment(folder / "s.toml", quiet=True).results
    pool = assessed[assessed["sample"] == "pool"].set_index("reaction")
    assert len(pool) == 5 and np.isfinite(pool["dGr_kJ_per_mol"]).all()

    out = io.StringIO()
    argv = ["insitu", str(folder / "samples.csv"), "--format", "csv"]
    for name, eq in zip(pool.index, pool["equation"]):
        argv += ["--reaction", eq]
    with redirect_stdout(out):
        assert main(argv) == 0
    insitu = pd.read_csv(io.StringIO(out.getvalue()))
    insitu = insitu[insitu["sample"] == "pool"]
    # the CLI's CSV carries 6 significant digits
    np.testing.assert_allclose(insitu["dGr_kJ_per_mol"], pool["dGr_kJ_per_mol"], rtol=5e-6)
    np.testing.assert_allclose(insitu["energy_density_J_per_kg"], pool["energy_density_J_per_kg"], rtol=5e-6)

    spec = sweep_spec(load_scenario(folder / "s.toml"))
    run_sweep(spec, folder / "sweep", quiet=True)
    swept = load_results(folder / "sweep")
    for name, row in pool.iterrows():
        assert swept[f"{name}|dGr_kJ_per_mol"].iloc[0] == pytest.approx(row["dGr_kJ_per_mol"], rel=1e-9)
        assert swept[f"{name}|power_W_per_m3"].iloc[0] == pytest.approx(row["power_W_per_m3"], rel=1e-9)



def test_mixing_at_an_end_member_agrees_with_insitu(folder):
    # mixing mixes dissolved totals by mass, so its end-members give H2 as a dissolved total
    from redoxgibbs.energetics.insitu import insitu_energetics
    from redoxgibbs.pipeline.mixing import mixing_energetics
    from redoxgibbs.speciation.samples import read_samples
    from redoxgibbs.speciation.solver import speciate

    frame = pd.read_csv(io.StringIO(SAMPLES)).drop(columns=["H2(g) [bar]"]).assign(**{"H2(aq) [umol/kg]": [0.8, 8.0]})
    samples = read_samples(frame)
    reactions = [x for x in load_scenario(folder / "s.toml").reactions if "(g)" not in str(x.reaction)]
    direct = insitu_energetics(speciate(samples, "bdot"), reactions)
    mixed = mixing_energetics(samples, "hot", "pool", reactions, fractions=[0.0])
    # pH from charge balance with the end-member's own imbalance: the same solution to the solver's
    # tolerance
    np.testing.assert_allclose(mixed["dGr_kJ_per_mol"], direct.dGr[0] / 1e3, rtol=1e-7)
