"""Benchmark: standard-state properties of 100 or more species at 10,000 (T, P) states.

Targets (issue "Standard-state thermodynamics engine"): under 2 s for the vectorized call, water
included, and at least 50x faster than evaluating the same states one at a time through the same
code. Both are measured side by side in this one run. Every species of the data takes part; when
the data hold fewer than 100, renamed copies of HKF records make up the 100 (their cost is that of
any HKF species).

Run: python benchmarks/bench_standard_state.py
"""

import time
from dataclasses import replace

import numpy as np

from redoxgibbs.species.database import SpeciesDatabase, default_database
from redoxgibbs.species.properties import standard_properties

N_STATES = 10_000
N_SINGLE = 300  # states timed one at a time; the per-state cost is scaled to N_STATES


def benchmark_database():
    base = default_database()
    records = [base.record(n) for n in base.names]
    hkf = [r for r in records if r.model == "hkf"]
    extra = [replace(hkf[i % len(hkf)], name=f"{hkf[i % len(hkf)].name}#copy{i}") for i in range(100 - len(records))]
    return SpeciesDatabase(records + extra)


def liquid_like(T, P):
    """The states kept by the engine: supercritical states below the critical density (gas-like
    water) are refused since the issue "One evaluation path", so they are left out here (cantera's
    own IAPWS-95 tells which), and the same states serve every version compared."""
    import cantera as ct

    phase = ct.Water()
    keep = np.array([t < 647.096 or (setattr(phase, "TP", (t, p * 1e5)) or phase.density >= 322.0)
                     for t, p in zip(T, P)])
    return T[keep], P[keep]


def main():
    db = benchmark_database()
    names = db.names
    rng = np.random.default_rng(42)
    T = rng.uniform(283.15, 873.15, N_STATES)
    P = rng.uniform(500.0, 5000.0, N_STATES)
    T, P = liquid_like(T, P)
    standard_properties(names, T[:10], P[:10], db=db)  # warm caches (cantera, data)

    t0 = time.perf_counter()
    props = standard_properties(names, T, P, db=db)
    vectorized = time.perf_counter() - t0

    t0 = time.perf_counter()
    for i in range(N_SINGLE):
        standard_properties(names, T[i:i + 1], P[i:i + 1], db=db)
    single = (time.perf_counter() - t0) / N_SINGLE * N_STATES

    print(f"species: {len(names)}, states: {N_STATES}, result shape {props.G.shape}")
    print(f"vectorized, water included: {vectorized:.3f} s (target < 2 s)")
    print(f"one state at a time (scaled from {N_SINGLE} states): {single:.1f} s")
    print(f"speed-up: {single / vectorized:.0f}x (target >= 50x)")


if __name__ == "__main__":
    main()
