"""Benchmark: the main job, `assess`, on 10,000 samples x 50 reactions at one site.

Times the evaluation (speciation, energetics, power, cells for two supply models) and the writing
of results.csv, rankings, figures and the report, separately. Samples are seawater-like fluids
from 2 to 350 C at 250 bar, pH measured at 25 C.

Run: python benchmarks/bench_assess.py [--samples N]
"""

import argparse
import tempfile
import time
from pathlib import Path

import numpy as np
import pandas as pd

from redoxgibbs.interfaces.assess import run_assessment
from redoxgibbs.interfaces.report import write_outputs

CUSTOM = ["2 H2(aq) + O2(aq) = 2 H2O(l)", "CH4(aq) + 2 O2(aq) = HCO3- + H+ + H2O(l)",
          "HS- + 2 O2(aq) = SO4^2- + H+", "4 H2(aq) + HCO3- + H+ = CH4(aq) + 3 H2O(l)",
          "4 H2(aq) + SO4^2- + H+ = HS- + 4 H2O(l)", "NH4+ + 2 O2(aq) = NO3- + 2 H+ + H2O(l)"]


def samples(n, seed=5):
    rng = np.random.default_rng(seed)
    f = rng.uniform(0.0, 1.0, n)            # share of a hot end-member
    return pd.DataFrame({
        "sample": [f"s{i}" for i in range(n)], "T [degC]": 2.0 + 348.0 * f, "P [bar]": 250.0,
        "pH": 7.8 - 4.0 * f, "pH T [degC]": 25.0, "Na+ [mmol/kg]": 464 - 40 * f, "Cl- [mmol/kg]": 545.0,
        "Mg^2+ [mmol/kg]": 52.6 * (1 - f), "Ca^2+ [mmol/kg]": 10.2 + 20 * f, "K+ [mmol/kg]": 9.9 + 14 * f,
        "SO4^2- [mmol/kg]": 28.1 * (1 - f) + 0.1, "HCO3- [mmol/kg]": 2.3 + 8 * f, "HS- [umol/kg]": 7000 * f + 0.1,
        "H2(aq) [umol/kg]": 1800 * f + 0.4, "Fe^2+ [umol/kg]": 1300 * f + 0.01, "NH4+ [umol/kg]": 26 * f + 0.4,
        "CH4(aq) [umol/kg]": 120 * f + 0.3, "NO3- [umol/kg]": 32 * (1 - f) + 0.01,
        "O2(aq) [umol/kg]": 210 * (1 - f) + 0.01, "CH3COO- [umol/kg]": 10 * f + 0.1})


SCENARIO = """
title = "assess benchmark"
activity_model = "bdot"
[[sites]]
name = "one site"
samples = "samples.csv"
[reactions]
catalog = "all"
custom = {custom}
[[supply]]
kind = "flow-through"
flux_kg_per_s = 5.0
volume_m3 = 1.0e4
[[supply]]
kind = "turnover"
tau_s = 3.15e7
"""


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--samples", type=int, default=10_000)
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as tmp:
        folder = Path(tmp)
        samples(args.samples).to_csv(folder / "samples.csv", index=False)
        (folder / "scenario.toml").write_text(SCENARIO.format(custom=repr(CUSTOM).replace("'", '"')))
        start = time.perf_counter()
        assessment = run_assessment(folder / "scenario.toml", quiet=True)
        evaluated = time.perf_counter()
        write_outputs(assessment, folder / "out")
        written = time.perf_counter()
        n_rxn = assessment.results["reaction"].nunique()
        print(f"samples: {args.samples}, reactions: {n_rxn}, result rows: {len(assessment.results)}")
        print(f"evaluation: {evaluated - start:.1f} s; outputs (results.csv, rankings, figures, report): "
              f"{written - evaluated:.1f} s; total {written - start:.1f} s")


if __name__ == "__main__":
    main()
