"""Benchmark: speciation of 100,000 brines with the Pitzer model against B-dot, side by side.

Target (issue "Oceans under ice and brines"): Pitzer within 3x of B-dot on 100,000 brines. The
brines are Na-K-Mg-Ca-Cl-SO4-HCO3 fluids from seawater to five times concentrated, each with its
own temperature (-2 to 40 C) and pressure, so water, standard states and the Pitzer parameters are
evaluated 100,000 times. Both models speciate the same sample set in the same run.

Run: python benchmarks/bench_pitzer.py [n_samples]
"""

import sys
import time

import numpy as np
import pandas as pd

from redoxgibbs.speciation.samples import read_samples
from redoxgibbs.speciation.solver import speciate

MAJORS = {"Na+": 469.0, "K+": 10.2, "Mg^2+": 52.8, "Ca^2+": 10.3, "Cl-": 546.0, "SO4^2-": 28.2,
          "HCO3-": 2.1}


def brines(n, seed=11):
    rng = np.random.default_rng(seed)
    factor = rng.uniform(1.0, 5.0, n)
    frame = pd.DataFrame({"sample": [f"b{i}" for i in range(n)], "T [degC]": rng.uniform(-2.0, 40.0, n),
                          "P [bar]": rng.uniform(1.0, 400.0, n), "pH": rng.uniform(7.0, 8.5, n)})
    for ion, c in MAJORS.items():
        frame[f"{ion} [mmol/kg]"] = c * factor * rng.uniform(0.9, 1.1, n)
    return frame


def main(n):
    samples = read_samples(brines(n))
    small = read_samples(brines(10))
    for model in ("bdot", "pitzer"):
        speciate(small, model)                 # warm caches
    times = {}
    for model in ("bdot", "pitzer"):
        t0 = time.perf_counter()
        result = speciate(samples, model)
        times[model] = time.perf_counter() - t0
        failed = int((result.failure != "").sum())
        print(f"{model:7s} {times[model]:6.2f} s, {len(result.species)} species, Newton iterations median "
              f"{np.median(result.iterations):.0f}, failed {failed}")
    print(f"pitzer / bdot: {times['pitzer'] / times['bdot']:.2f} (target <= 3)")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 100_000)
