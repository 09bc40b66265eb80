"""Benchmarks of sweeps (issue "Fluid mixing, parameter sweeps, Monte Carlo uncertainty, ..."):

1. a 1,000,000-draw Monte Carlo of 20 reactions at one vent site, speciation included, on two
   local dask workers with the tabulated water path: target under 60 s and memory under 2 GB
   (peak resident memory of this process and of the workers, as the OS reports it);
2. throughput of one against two local dask workers on the same sweep of about a minute of work:
   target at least 1.6x.

Run: python benchmarks/bench_sweeps.py [--draws N]
"""

import argparse
import resource
import tempfile
import time

from redoxgibbs.energetics.catalog import catalog
from redoxgibbs.sweeps.runner import Distribution, SweepSpec, run_sweep

BASE = {"T [degC]": 28.0, "P [bar]": 240.0, "pH": 6.1, "pH T [degC]": 25.0, "Na+ [mmol/kg]": 458,
        "Cl- [mmol/kg]": 546, "Mg^2+ [mmol/kg]": 49.1, "Ca^2+ [mmol/kg]": 11.4, "K+ [mmol/kg]": 10.8,
        "SO4^2- [mmol/kg]": 26.6, "HCO3- [mmol/kg]": 3.1, "HS- [umol/kg]": 310, "H2(aq) [umol/kg]": 22,
        "Fe^2+ [umol/kg]": 45, "NH4+ [umol/kg]": 2.1, "CH4(aq) [umol/kg]": 6.2, "NO3- [umol/kg]": 18,
        "O2(aq) [umol/kg]": 15}
INPUTS = {"T [degC]": Distribution("uniform", 15.0, 45.0),
          "H2(aq) [umol/kg]": Distribution("lognormal", 22.0, 0.7),
          "HS- [umol/kg]": Distribution("lognormal", 310.0, 0.4),
          "O2(aq) [umol/kg]": Distribution("lognormal", 15.0, 0.8),
          "pH": Distribution("normal", 6.1, 0.1)}


def spec(n, chunk=20_000):
    names = [x.name for x in catalog()
             if all(s in ("H2O(l)", "H+", "sulfur", "ferrihydrite", "goethite", "pyrolusite")
                    or s in {"Na+", "Cl-", "Mg^2+", "Ca^2+", "K+", "SO4^2-", "HCO3-", "HS-", "H2(aq)",
                             "Fe^2+", "NH4+", "CH4(aq)", "NO3-", "O2(aq)", "CO2(aq)", "H2S(aq)",
                             "N2(aq)", "NO2-"} for s in x.reaction.species)]
    return SweepSpec(base=BASE, inputs=INPUTS, reactions=tuple(names[:20]), n=n, chunk_size=chunk,
                     seed=1, water="tabulated")


def timed(s, workers):
    with tempfile.TemporaryDirectory() as out:
        t0 = time.perf_counter()
        run_sweep(s, out, workers=workers, quiet=True)
        return time.perf_counter() - t0


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--draws", type=int, default=1_000_000)
    args = parser.parse_args()
    big = spec(args.draws)
    print(f"reactions: {len(big.reactions)}; draws: {big.n}; chunks: {big.n_chunks}")
    seconds = timed(big, workers=2)
    peak_self = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    peak_children = resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024
    print(f"Monte Carlo on 2 workers: {seconds:.1f} s (target < 60 s); peak memory: client "
          f"{peak_self:.0f} MB, largest worker {peak_children:.0f} MB (target < 2 GB)")
    minute = spec(800_000, chunk=20_000)
    one, two = timed(minute, workers=1), timed(minute, workers=2)
    print(f"same sweep ({minute.n} draws): 1 worker {one:.1f} s, 2 workers {two:.1f} s, "
          f"throughput ratio {one / two:.2f} (target >= 1.6)")


if __name__ == "__main__":
    main()
