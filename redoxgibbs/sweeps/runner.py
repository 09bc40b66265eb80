"""Grids and Monte Carlo draws over sample inputs, run in chunks that stream to Parquet.

A sweep varies columns of one base sample (any sample-table column: T, P, pH, a total, ...) and
fields of the supply model, named ``supply:FIELD`` (e.g. ``supply:flux_kg_per_s``); or, with two
end-members given, the mixing fraction ``mixing:fraction`` (each mixture re-speciated with pH
from charge balance, as in redoxgibbs.energetics.mixing).
Monte Carlo inputs carry a distribution (normal, lognormal, uniform); grid inputs a list of
values (their product is swept). Work runs in chunks; each chunk's draws come from its own seed,
numpy's SeedSequence of (seed, chunk index), so results do not depend on who computes a chunk.
Each finished chunk is written atomically as chunk_NNNNN.parquet; an interrupted sweep resumes
from the chunks already on disk. The same chunks run in-process or on a dask.distributed cluster
(coarse tasks: a chunk is seconds of work, and draws are made on the worker).
"""

import itertools
import os
import sys
from dataclasses import dataclass, field, replace
from pathlib import Path

import numpy as np
import pandas as pd

from ..energetics.catalog import resolve_reactions
from ..energetics.insitu import insitu_energetics
from ..energetics.power import CellRequirement, PowerUnits, power_per_cell_W, power_per_volume
from ..errors import InputError
from ..species.database import default_database
from ..speciation.mixing import mixture_samples
from ..speciation.samples import read_samples
from ..speciation.solver import speciate
from ..water.iapws95 import water_state
from ..water.table import WaterTable

_WORKER_MALLOC = {"distributed.nanny.pre-spawn-environ.MALLOC_TRIM_THRESHOLD_": 1 << 30,
                  "distributed.nanny.pre-spawn-environ.MALLOC_MMAP_THRESHOLD_": 1 << 25}

__all__ = ["Distribution", "SweepSpec", "run_chunk", "run_sweep", "summarize", "load_results", "grid_dataset"]


@dataclass(frozen=True)
class Distribution:
    """normal(mean, sd), lognormal(median, sigma of ln), uniform(low, high) or grid(values)."""

    kind: str
    a: float = np.nan
    b: float = np.nan
    values: tuple = ()

    def draw(self, rng, n):
        if self.kind == "normal":
            return rng.normal(self.a, self.b, n)
        if self.kind == "lognormal":
            return self.a * np.exp(rng.normal(0.0, self.b, n))
        if self.kind == "uniform":
            return rng.uniform(self.a, self.b, n)
        raise InputError(f"distribution {self.kind!r} is unknown; use normal, lognormal or uniform")


@dataclass(frozen=True)
class SweepSpec:
    """Everything a chunk needs (plain, picklable data)."""

    base: dict
    inputs: dict                       # column -> Distribution
    reactions: tuple                   # catalog names or reaction strings
    activity_model: str = "bdot"
    n: int = 1000
    chunk_size: int = 10_000
    seed: int = 0
    supply: object = None
    cells: CellRequirement = field(default_factory=CellRequirement)
    power_units: PowerUnits = field(default_factory=PowerUnits)
    water: str = "exact"               # or "tabulated": a WaterTable over each chunk's range
    mixing: dict = None                # {"hydrothermal": row, "seawater": row, "temperature_rule"}

    @property
    def is_grid(self):
        return any(d.kind == "grid" for d in self.inputs.values())

    @property
    def total(self):
        if self.is_grid:
            return int(np.prod([len(d.values) for d in self.inputs.values()]))
        return self.n

    @property
    def n_chunks(self):
        return -(-self.total // self.chunk_size)


def _inputs_for_chunk(spec, index):
    start = index * spec.chunk_size
    stop = min(start + spec.chunk_size, spec.total)
    if spec.is_grid:
        if any(d.kind != "grid" for d in spec.inputs.values()):
            raise InputError("sweep: combine grid inputs with each other only, not with distributions")
        grid = list(itertools.product(*[d.values for d in spec.inputs.values()]))[start:stop]
        return {c: np.array([g[i] for g in grid], float) for i, c in enumerate(spec.inputs)}, start
    rng = np.random.default_rng(np.random.SeedSequence([spec.seed, index]))
    return {c: d.draw(rng, stop - start) for c, d in spec.inputs.items()}, start


def _chunk_frame(spec, index):
    drawn, start = _inputs_for_chunk(spec, index)
    n = len(next(iter(drawn.values())))
    frame = pd.DataFrame({k: [v] * n for k, v in spec.base.items() if k not in drawn})
    for c, v in drawn.items():
        if not c.startswith("supply:"):
            frame[c] = v
    frame["sample"] = [f"draw{start + i}" for i in range(n)]
    return frame, drawn, start


def _mixtures(spec, drawn, db):
    """Mixtures of the spec's two end-members at the drawn fractions, and their charge targets."""
    extra = set(drawn) - {"mixing:fraction"} - {c for c in drawn if c.startswith("supply:")}
    if extra:
        raise InputError(f"sweep: with mixing, only mixing:fraction and supply fields can vary, not {sorted(extra)}")
    m = spec.mixing
    ends = read_samples(pd.DataFrame([m["hydrothermal"], m["seawater"]]), db=db)
    charge = speciate(ends, spec.activity_model, db=db).charge_imbalance
    mixed, target, _ = mixture_samples(ends, ends.names[0], ends.names[1], drawn["mixing:fraction"], db,
                                       charge, m.get("temperature_rule", "enthalpy"))
    return mixed, target


def run_chunk(spec, index, out_dir):
    """Compute chunk ``index`` and write it; returns its path. Safe to call on a dask worker."""
    db = default_database()
    frame, drawn, start = _chunk_frame(spec, index)
    if spec.mixing:
        samples, charge_target = _mixtures(spec, drawn, db)
        frame = frame.iloc[:len(samples)]
    else:
        samples, charge_target = read_samples(frame, db=db), None
    water = water_state
    if spec.water == "tabulated":
        water = WaterTable((samples.T_K.min() - 2.0, samples.T_K.max() + 2.0),
                           (max(samples.P_bar.min() - 20.0, 1.0), samples.P_bar.max() + 20.0))
    elif spec.water != "exact":
        raise InputError(f"sweep: water = {spec.water!r}; use 'exact' or 'tabulated'")
    result = speciate(samples, spec.activity_model, db=db, water=water,
                      pH_from_charge_balance=spec.mixing is not None, charge_balance_target=charge_target)
    reactions = resolve_reactions(list(spec.reactions), db=db)
    W, rho = samples.water_fraction_and_density(db)
    e = insitu_energetics(result, reactions, db=db, water_per_kg_solution=W, density_kg_L=rho, water=water)
    out = pd.DataFrame({"draw": np.arange(start, start + len(frame))})
    for c, v in drawn.items():
        out[f"input:{c}"] = v
    out["pH_insitu"] = result.pH
    supply_inputs = {c[7:]: v[:, None] for c, v in drawn.items() if c.startswith("supply:")}
    if supply_inputs and spec.supply is None:
        raise InputError("sweep: supply inputs need a [[supply]] model in the scenario")
    if spec.supply is not None:
        unknown = set(supply_inputs) - set(vars(spec.supply))
        if unknown:
            raise InputError(f"sweep: supply fields {sorted(unknown)} are unknown; known: {sorted(vars(spec.supply))}")
        power = power_per_volume(replace(spec.supply, **supply_inputs), e)
        low_W, high_W = power_per_cell_W(spec.cells, result.T_K)
    for r, x in enumerate(reactions):
        out[f"{x.name}|dGr_kJ_per_mol"] = e.dGr[:, r] / 1e3
        out[f"{x.name}|energy_density_J_per_kg"] = e.energy_density_J_per_kg[:, r]
        if spec.supply is not None:
            out[f"{x.name}|{spec.power_units.volume_column}"] = power[:, r] * spec.power_units.volume_factor
            out[f"{x.name}|cells_per_m3_low"] = power[:, r] / high_W
            out[f"{x.name}|cells_per_m3_high"] = power[:, r] / low_W
    path = Path(out_dir) / f"chunk_{index:05d}.parquet"
    tmp = path.with_suffix(".partial")
    out.to_parquet(tmp, index=False)
    os.replace(tmp, path)   # a chunk on disk is always complete
    return str(path)


def _progress(done, total, quiet):
    if not quiet:
        width = 30
        filled = int(width * done / max(total, 1))
        sys.stderr.write(f"\r[{'#' * filled}{'.' * (width - filled)}] {done}/{total} chunks")
        sys.stderr.flush()
        if done == total:
            sys.stderr.write("\n")


def run_sweep(spec, out_dir, workers=None, scheduler=None, quiet=False):
    """Run every chunk not yet on disk (in-process, on ``workers`` local dask workers, or on the
    dask scheduler at ``scheduler``); returns (percentiles, rank correlations), see
    :func:`summarize`; :func:`load_results` reads the per-draw table."""
    out = Path(out_dir)
    out.mkdir(parents=True, exist_ok=True)
    todo = [i for i in range(spec.n_chunks) if not (out / f"chunk_{i:05d}.parquet").exists()]
    done = spec.n_chunks - len(todo)
    _progress(done, spec.n_chunks, quiet)
    if workers or scheduler:
        import dask
        from dask.distributed import Client, LocalCluster, as_completed

        cluster = None
        if not scheduler:
            # dask sets MALLOC_TRIM_THRESHOLD_=65536 in its workers, which makes glibc map and unmap
            # every large numpy temporary; measured here that halves the speed of a chunk. Local
            # workers get glibc's own behaviour back (memory is still freed between chunks).
            with dask.config.set(_WORKER_MALLOC):
                cluster = LocalCluster(n_workers=int(workers), threads_per_worker=1, processes=True,
                                       dashboard_address=None)
        with Client(scheduler or cluster) as client:
            futures = client.map(run_chunk, [spec] * len(todo), todo, [str(out)] * len(todo), pure=False)
            for _ in as_completed(futures):
                done += 1
                _progress(done, spec.n_chunks, quiet)
        if cluster is not None:
            cluster.close()
    else:
        for i in todo:
            run_chunk(spec, i, out)
            done += 1
            _progress(done, spec.n_chunks, quiet)
    return summarize(out)


def _chunk_paths(out_dir):
    return sorted(Path(out_dir).glob("chunk_*.parquet"))


def load_results(out_dir, columns=None):
    """The per-draw table of a sweep folder (all chunks, in draw order)."""
    # chunk files sort by index and hold their draws in order, so concatenation is in draw order
    frame = pd.concat([pd.read_parquet(p, columns=columns) for p in _chunk_paths(out_dir)], ignore_index=True)
    if "draw" in frame and not frame["draw"].is_monotonic_increasing:
        frame = frame.sort_values("draw").reset_index(drop=True)
    return frame


def _standard_ranks(x):
    """Ranks of x (ties averaged), centred and scaled to unit variance; NaN if x is constant."""
    order = np.argsort(x, kind="quicksort")          # order within ties does not matter
    xs = x[order]
    first = np.empty(x.size, dtype=bool)
    first[:1] = True
    np.not_equal(xs[1:], xs[:-1], out=first[1:])
    starts = np.flatnonzero(first)
    counts = np.diff(np.append(starts, x.size))
    r = np.empty(x.size)
    r[order] = np.repeat(starts + (counts + 1) / 2.0, counts)   # mean 1-based rank of each tie
    r -= r.mean()
    sd = r.std()
    return r / sd if sd > 0 else np.full(r.shape, np.nan)


def summarize(out_dir, percentiles=(5, 50, 95), batch=8):
    """Percentiles of every output and Spearman rank correlations of outputs with the inputs.

    Reads ``batch`` output columns at a time, so memory stays at the inputs plus a few columns.
    Spearman's rho is the mean product of standardized ranks (Pearson's r of the ranks).
    """
    import pyarrow.parquet as pq

    names = pq.read_schema(_chunk_paths(out_dir)[0]).names
    inputs = [c for c in names if c.startswith("input:")]
    outputs = [c for c in names if "|" in c]
    # inputs and outputs are read the same way (chunk by chunk), so their rows stay aligned
    draws = load_results(out_dir, inputs)
    x = {i: draws[i].to_numpy(float) for i in inputs}
    x_ranks = np.array([_standard_ranks(v) for v in x.values()]).reshape(len(inputs), len(draws))
    rows, corr = [], []
    for start in range(0, len(outputs), batch):
        block = load_results(out_dir, outputs[start:start + batch])
        for c in block.columns:
            reaction, quantity = c.split("|")
            values = block[c].to_numpy(float)
            finite = np.isfinite(values)
            n = int(finite.sum())
            row = {"reaction": reaction, "quantity": quantity, "n": n}
            q = np.percentile(values[finite], percentiles) if n else np.full(len(percentiles), np.nan)
            row.update({f"p{p}": v for p, v in zip(percentiles, q)})
            rows.append(row)
            rho = np.full(len(inputs), np.nan)
            if n > 2:
                y = _standard_ranks(values[finite])
                xr = x_ranks if n == values.size else np.array([_standard_ranks(x[i][finite]) for i in inputs])
                rho = xr.reshape(len(inputs), n) @ y / n
            corr += [{"reaction": reaction, "quantity": quantity, "input": i[6:], "spearman_rho": r}
                     for i, r in zip(inputs, rho)]
    return pd.DataFrame(rows), pd.DataFrame(corr)


def grid_dataset(spec, out_dir):
    """A grid sweep's results as an xarray Dataset with one named dimension per grid input."""
    import xarray as xr

    if not spec.is_grid:
        raise InputError("sweep: an xarray dataset needs a grid sweep (value lists, not distributions)")
    frame = load_results(out_dir)
    dims = list(spec.inputs)
    shape = [len(spec.inputs[d].values) for d in dims]
    coords = {d: list(spec.inputs[d].values) for d in dims}
    data = {c: (dims, frame[c].to_numpy().reshape(shape)) for c in frame.columns
            if "|" in c or c == "pH_insitu"}
    return xr.Dataset(data, coords=coords)
