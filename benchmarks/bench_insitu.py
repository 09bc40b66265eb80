"""Benchmark: in-situ dGr and energy density of 50 reactions over 1,000,000 samples.

Target (issue "Catabolic reactions, in-situ Gibbs energies, ..."): under 3 s with activities
given, and within 3x of the bare numpy evaluation of the same sums, measured side by side here.
Samples share 100 distinct (T, P) states, whose standard Gibbs energies are computed once. Each
path runs three times, alternating, and its best time is reported.

Run: python benchmarks/bench_insitu.py
"""

import time

import numpy as np

from redoxgibbs.energetics.catalog import catalog, enumerate_reactions
from redoxgibbs.energetics.insitu import energy_density_kernel, gibbs_energy_kernel
from redoxgibbs.species.database import R_J_MOL_K
from redoxgibbs.species.properties import standard_properties

N = 1_000_000
N_STATES = 100


def main():
    reactions = (catalog() + enumerate_reactions(["H+/H2", "HCO3-/CH4"]))[:50]
    names = sorted({s for x in reactions for s in x.reaction.species})
    nu = np.zeros((len(names), len(reactions)))
    for r, x in enumerate(reactions):
        for s, c in zip(x.reaction.species, x.reaction.coefficients):
            nu[names.index(s), r] = c
    rng = np.random.default_rng(3)
    T_states = rng.uniform(275.0, 420.0, N_STATES)
    G = standard_properties(names, T_states, np.full(N_STATES, 300.0), properties=("G",)).G
    state = rng.integers(0, N_STATES, N)
    T = T_states[state]
    dG0 = (G @ nu)[state]
    log_a = rng.uniform(-9.0, -1.0, (N, len(names)))
    amounts = 10.0**log_a
    consumed = np.where(nu < 0, -nu, 0.0)

    def library_run():
        dGr, _ = gibbs_energy_kernel(dG0, log_a, nu, T)
        return energy_density_kernel(dGr, amounts, consumed)[0]

    def bare_run():
        dGr = dG0 + R_J_MOL_K * np.log(10) * T[:, None] * (log_a @ nu)
        best = np.zeros_like(dGr)
        for k in range(nu.shape[1]):
            idx = np.flatnonzero(consumed[:, k])
            if idx.size:
                best[:, k] = (amounts[:, idx] / consumed[idx, k]).min(axis=1)
        return np.where(dGr < 0, -dGr * best, 0.0)

    # alternate the two and keep each one's best of three (first touches of memory cost both)
    library, reference = np.inf, np.inf
    for _ in range(3):
        t0 = time.perf_counter()
        E = library_run()
        library = min(library, time.perf_counter() - t0)
        t0 = time.perf_counter()
        E_bare = bare_run()
        reference = min(reference, time.perf_counter() - t0)
    assert np.allclose(E, E_bare)

    print(f"reactions: {nu.shape[1]}, species: {nu.shape[0]}, samples: {N}")
    print(f"redoxgibbs kernels: {library:.2f} s (target < 3 s)")
    print(f"bare numpy, same sums: {reference:.2f} s; ratio {library / reference:.2f} (target <= 3)")


if __name__ == "__main__":
    main()
