"""Benchmark: a 200 x 200 feasibility map for one reaction, speciation included.

Target (issue "From energy to life"): under 60 s on this machine. The map: the dissolved H2 at
which hydrogenotrophic methanogenesis reaches dGr = -10 kJ/mol over temperature (2-120 C) x pH
(6-11) for a seawater-like fluid with 2 mmol/kg DIC, solved by the vectorized Illinois method over
all 40,000 grid points at once (each step one pass of the evaluation pipeline). Also reports the
steps per point, and the time per point against solving 20 points one at a time.

Run: python benchmarks/bench_feasibility.py [points per axis]
"""

import sys
import time

import numpy as np
import pandas as pd

from redoxgibbs.energetics.catalog import resolve_reactions
from redoxgibbs.pipeline.thresholds import Target, feasibility_map, solve_input

BASE = {"sample": "fluid", "P [bar]": 200.0, "Na+ [mmol/kg]": 469.0, "K+ [mmol/kg]": 10.2,
        "Mg^2+ [mmol/kg]": 52.8, "Ca^2+ [mmol/kg]": 10.3, "Cl- [mmol/kg]": 546.0, "SO4^2- [mmol/kg]": 28.2,
        "HCO3- [mmol/kg]": 2.0, "CH4(aq) [umol/kg]": 5.0, "T [degC]": 25.0, "pH": 8.0}


def main(n):
    reaction = resolve_reactions(["hydrogenotrophic methanogenesis"])[0]
    target, bracket = Target("minimum_energy", 10.0), (1e-6, 1e8)
    axes = {"T [degC]": np.linspace(2.0, 120.0, n), "pH": np.linspace(6.0, 11.0, n)}
    feasibility_map(BASE, reaction, "H2(aq) [nmol/kg]", target, bracket,
                    {"T [degC]": [10.0, 20.0], "pH": [7.0, 8.0]})          # warm caches
    t0 = time.perf_counter()
    ds = feasibility_map(BASE, reaction, "H2(aq) [nmol/kg]", target, bracket, axes)
    elapsed = time.perf_counter() - t0
    solved = int((ds["status"] == "solved").sum())
    frame = pd.DataFrame([BASE] * 20)
    frame["T [degC]"] = np.linspace(2.0, 120.0, 20)
    t0 = time.perf_counter()
    for i in range(20):
        solve_input(frame.iloc[i:i + 1], reaction, "H2(aq) [nmol/kg]", target, bracket)
    single = (time.perf_counter() - t0) / 20
    print(f"map {n} x {n}: {elapsed:.1f} s (target < 60 s), {solved} of {n * n} points solved")
    print(f"one point at a time: {single * 1e3:.0f} ms per point, i.e. {single * n * n:.0f} s for the map "
          f"({single * n * n / elapsed:.0f}x the vectorized map)")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 200)
