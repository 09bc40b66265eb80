"""Benchmark: speciation of 100,000 seawater-like samples (15 components) in one call.

Targets (issue "From a fluid analysis to in-situ activities"): under 10 s, and at least 50x
faster than solving the same samples one at a time through the same code; also reports the
Newton iterations per sample. Every sample has its own temperature, so the water equation of
state and the standard-state properties are evaluated 100,000 times too.

Run: python benchmarks/bench_speciation.py
"""

import time

import numpy as np
import pandas as pd

from redoxgibbs.speciation.samples import read_samples
from redoxgibbs.speciation.solver import speciate

N_SAMPLES = 100_000
N_SINGLE = 40
MAJORS = {"Na+": 469.0, "K+": 10.2, "Mg^2+": 52.8, "Ca^2+": 10.3, "Cl-": 546.0, "SO4^2-": 28.2,
          "HCO3-": 2.1}
TRACES_UMOL = {"HS-": 5.0, "H2(aq)": 0.5, "Fe^2+": 0.2, "NH4+": 1.0, "CH4(aq)": 0.3,
               "SiO2(aq)": 100.0, "CH3COO-": 2.0, "NO3-": 20.0}


def samples(n, seed=7):
    rng = np.random.default_rng(seed)
    frame = pd.DataFrame({"sample": [f"s{i}" for i in range(n)], "T [degC]": rng.uniform(1.0, 30.0, n),
                          "P [bar]": rng.uniform(1.0, 400.0, n), "pH": rng.uniform(7.4, 8.4, n)})
    for ion, c in MAJORS.items():
        frame[f"{ion} [mmol/kg]"] = c * rng.uniform(0.9, 1.1, n)
    for ion, c in TRACES_UMOL.items():
        frame[f"{ion} [umol/kg]"] = c * rng.lognormal(0.0, 1.0, n)
    return frame


def main():
    frame = samples(N_SAMPLES)
    set_all = read_samples(frame)
    speciate(read_samples(frame.iloc[:10]))  # warm caches

    t0 = time.perf_counter()
    result = speciate(set_all)
    vectorized = time.perf_counter() - t0

    singles = [read_samples(frame.iloc[i:i + 1]) for i in range(N_SINGLE)]
    t0 = time.perf_counter()
    for one in singles:
        speciate(one)
    single = (time.perf_counter() - t0) / N_SINGLE * N_SAMPLES

    print(f"samples: {N_SAMPLES}, components: {len(result.totals)}, species: {len(result.species)}")
    print(f"vectorized: {vectorized:.2f} s (target < 10 s)")
    print(f"one sample at a time (scaled from {N_SINGLE}): {single:.0f} s")
    print(f"speed-up: {single / vectorized:.0f}x (target >= 50x)")
    its = result.iterations
    print(f"Newton iterations per sample: median {np.median(its):.0f}, max {its.max()}")


if __name__ == "__main__":
    main()
