"""Grids and Monte Carlo draws over sample inputs, run in chunks that stream to Parquet.

A sweep varies columns of one base sample (any sample-table column: T, P, pH, a total, ...) and
fields of the supply model, named ``supply:FIELD`` (e.g. ``supply:flux_kg_per_s``); or, with two
end-members given, the mixing fraction ``mixing:fraction`` (each mixture re-speciated with pH
from charge balance, as in redoxgibbs.pipeline.mixing).
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
import uuid
from dataclasses import dataclass, field, replace
from pathlib import Path

import numpy as np
import pandas as pd

from ..bodies.body import Body
from ..energetics.catalog import NamedReaction, resolve_reactions
from ..energetics.power import CellRequirement, PowerUnits
from ..errors import InputError
from ..pipeline.evaluate import evaluate
from ..pipeline.mixing import mixtures
from ..reactions.reaction import Reaction
from ..speciation.samples import read_samples
from ..species.database import default_database
from ..water.iapws95 import water_state
from ..water.table import WaterTable

_WORKER_MALLOC = {"distributed.nanny.pre-spawn-environ.MALLOC_TRIM_THRESHOLD_": 1 << 30,
                  "distributed.nanny.pre-spawn-environ.MALLOC_MMAP_THRESHOLD_": 1 << 25}

__all__ = [
    "Distribution",
    "SweepSpec",
    "grid_dataset",
    "load_results",
    "reaction_records",
    "run_chunk",
    "run_sweep",
    "summarize",
]


@dataclass(frozen=True)
class Distribution:
    """normal(mean, sd), lognormal(median, sigma of ln), uniform(low, high) or grid(values)."""

    kind: str
    a: float = np.nan
    b: float = np.nan
    values: tuple = ()

    def draw(self, rng, n):
        """``n`` values drawn with the generator ``rng`` (grids are laid out by the sweep, not drawn)."""
        if self.kind == "normal":
            return rng.normal(self.a, self.b, n)
        if self.kind == "lognormal":
            return self.a * np.exp(rng.normal(0.0, self.b, n))
        if self.kind == "uniform":
            return rng.uniform(self.a, self.b, n)
        raise InputError(f"distribution {self.kind!r} is unknown; use normal, lognormal or uniform")


def reaction_records(reactions, db=None):
    """Reactions as plain records (name, equation, electrons, group) that travel to workers and
    are rebuilt there exactly (no lookup by name): from NamedReaction objects, catalog names or
    reaction strings."""
    out = []
    for x in reactions:
        if isinstance(x, tuple):
            out.append(x)
            continue
        named = x if isinstance(x, NamedReaction) else resolve_reactions([x], db=db)[0]
        out.append((named.name, str(named.reaction), float(named.electrons), named.group))
    return tuple(out)


def _rebuild(records, db):
    return [NamedReaction(name, Reaction(eq, db=db), electrons, group) for name, eq, electrons, group in records]


@dataclass(frozen=True)
class SweepSpec:
    """Everything a chunk needs (plain, picklable data)."""

    base: dict
    inputs: dict                       # column -> Distribution
    reactions: tuple                   # reaction records, or catalog names / reaction strings
    activity_model: str = "bdot"
    n: int = 1000
    chunk_size: int = 10_000
    seed: int = 0
    supplies: tuple = ()               # every supply model; one power column per model
    cells: CellRequirement = field(default_factory=CellRequirement)
    power_units: PowerUnits = field(default_factory=PowerUnits)
    water: str = "exact"               # or "tabulated": a WaterTable over each chunk's range
    mixing: dict = None                # {"hydrothermal": row, "seawater": row, "temperature_rule"}
    below_detection: str = "not-measured"   # policy for '<0.1', 'bdl', 'nd' cells of the base sample
    body: Body = None                  # places 'depth [km]' in its ocean; feeds body-scale supplies

    def __post_init__(self):
        object.__setattr__(self, "reactions", reaction_records(self.reactions))
        object.__setattr__(self, "supplies", tuple(self.supplies))

    def fingerprint(self):
        """A hash of everything that determines the results (the manifest's identity)."""
        import hashlib

        return hashlib.sha256(repr((sorted(self.base.items()), sorted(self.inputs.items()), self.reactions,
                                    self.activity_model, self.n, self.chunk_size, self.seed, self.supplies,
                                    self.cells, self.power_units.per_volume, self.power_units.per_mass,
                                    self.water, self.mixing, self.below_detection, self.body)).encode()).hexdigest()

    @property
    def is_grid(self):
        """True for a grid sweep (value lists), False for Monte Carlo draws."""
        return any(d.kind == "grid" for d in self.inputs.values())

    @property
    def total(self):
        """Number of evaluations: the product of the grid's lengths, or the draws."""
        if self.is_grid:
            return int(np.prod([len(d.values) for d in self.inputs.values()]))
        return self.n

    @property
    def n_chunks(self):
        """Number of chunks the sweep is written in."""
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
    ends = read_samples(pd.DataFrame([m["hydrothermal"], m["seawater"]]), db=db, below_detection=spec.below_detection,
                        body=spec.body)
    return mixtures(ends, ends.names[0], ends.names[1], drawn["mixing:fraction"], spec.activity_model, db,
                    m.get("temperature_rule", "enthalpy"))


def run_chunk(spec, index, out_dir):
    """Compute chunk ``index`` and write it; returns its path. Safe to call on a dask worker."""
    db = default_database()
    frame, drawn, start = _chunk_frame(spec, index)
    if spec.mixing:
        samples, charge_target = _mixtures(spec, drawn, db)
        frame = frame.iloc[:len(samples)]
    else:
        samples, charge_target = read_samples(frame, db=db, below_detection=spec.below_detection,
                                              body=spec.body), None
    water = water_state
    if spec.water == "tabulated":
        water = WaterTable((samples.T_K.min() - 2.0, samples.T_K.max() + 2.0),
                           (max(samples.P_bar.min() - 20.0, 1.0), samples.P_bar.max() + 20.0))
    elif spec.water != "exact":
        raise InputError(f"sweep: water = {spec.water!r}; use 'exact' or 'tabulated'")
    supply_inputs = {c[7:]: v[:, None] for c, v in drawn.items() if c.startswith("supply:")}
    if supply_inputs and not spec.supplies:
        raise InputError("sweep: supply inputs need a [[supply]] model in the scenario")
    unknown = set(supply_inputs) - set().union(*(vars(x) for x in spec.supplies))
    if unknown:
        raise InputError(f"sweep: supply fields {sorted(unknown)} are unknown")
    supplies = [replace(x, **{k: v for k, v in supply_inputs.items() if k in vars(x)}) for x in spec.supplies]
    reactions = _rebuild(spec.reactions, db)
    ev = evaluate(samples, reactions, spec.activity_model, supplies, spec.cells, spec.power_units,
                  pH_from_charge_balance=spec.mixing is not None, charge_balance_target=charge_target,
                  water=water, db=db, body=spec.body)
    e, result = ev.energetics, ev.speciation
    out = pd.DataFrame({"draw": np.arange(start, start + len(frame))})
    for c, v in drawn.items():
        out[f"input:{c}"] = v
    out["pH_insitu"] = result.pH
    out["flags"] = e.flags_of_sample
    out["failure"] = result.failure
    for r, x in enumerate(reactions):
        out[f"{x.name}|dGr_kJ_per_mol"] = e.dGr[:, r] / 1e3
        out[f"{x.name}|energy_density_J_per_kg"] = e.energy_density_J_per_kg[:, r]
    n_r = len(reactions)
    for k, supply in enumerate(spec.supplies):     # power, cells and growth: the evaluation's own columns
        tag = "" if len(spec.supplies) == 1 else f" [{supply.describe()}]"
        for column, values in ev.power_columns(k).items():
            per_reaction = values.reshape(-1, n_r)
            for r, x in enumerate(reactions):
                out[f"{x.name}|{column}{tag}"] = per_reaction[:, r]
    path = Path(out_dir) / _chunk_name(index)
    tmp = path.with_name(f"{path.stem}.{os.getpid()}.{uuid.uuid4().hex}.partial")   # unique per writer
    out.to_parquet(tmp, index=False)
    os.replace(tmp, path)   # a chunk on disk is always complete
    return str(path)


def _chunk_name(index):
    return f"chunk_{index:05d}.parquet"


MANIFEST = "manifest.json"


def _manifest(spec):
    from importlib.metadata import PackageNotFoundError, version

    try:
        code = version("redoxgibbs")
    except PackageNotFoundError:   # pragma: no cover - running from a source tree
        code = "unknown"
    return {"fingerprint": spec.fingerprint(), "seed": spec.seed, "draws": spec.total,
            "chunk_size": spec.chunk_size, "chunks": spec.n_chunks, "code_version": code,
            "reactions": [r[0] for r in spec.reactions], "supplies": [x.describe() for x in spec.supplies]}


def _prepare_folder(spec, out, fresh):
    """Check (or start) the sweep folder: its manifest must be this spec's, every chunk file one
    of this sweep's chunks, and each chunk readable and complete; returns the chunks to compute."""
    import json

    import pyarrow.parquet as pq

    out.mkdir(parents=True, exist_ok=True)
    manifest_path = out / MANIFEST
    chunks = sorted(out.glob("chunk_*"))
    if fresh:
        for p in chunks + sorted(out.glob("*.partial")):
            p.unlink()
        chunks = []
        manifest_path.unlink(missing_ok=True)
    wanted = _manifest(spec)
    if manifest_path.exists():
        try:
            found = json.loads(manifest_path.read_text())
        except ValueError:
            raise InputError(f"sweep: {manifest_path} is not a readable manifest; start the folder afresh "
                             "(--fresh) or choose another --out") from None
        if found.get("fingerprint") != wanted["fingerprint"]:
            raise InputError(f"sweep: folder {out} holds another sweep (different scenario, seed, draws, chunk "
                             "size or distributions); choose another --out, or --fresh to start it afresh")
    elif chunks:
        raise InputError(f"sweep: folder {out} holds chunk files but no manifest; choose another --out, or "
                         "--fresh to start it afresh")
    known = {_chunk_name(i): i for i in range(spec.n_chunks)}
    todo = set(range(spec.n_chunks))
    for p in chunks:
        if p.name not in known:
            raise InputError(f"sweep: {p} is not one of this sweep's chunks (chunk_00000 to "
                             f"{_chunk_name(spec.n_chunks - 1)}); remove it or start afresh (--fresh)")
        i = known[p.name]
        expected = min(spec.chunk_size, spec.total - i * spec.chunk_size)
        try:
            complete = pq.read_metadata(p).num_rows == expected
        except Exception:   # pyarrow raises several kinds on damaged files
            complete = False
        if complete:
            todo.discard(i)
        else:
            print(f"redoxgibbs: chunk {p.name} is damaged or incomplete; computing it again", file=sys.stderr)
            p.unlink()
    _write_atomically(manifest_path, json.dumps(wanted, indent=1))
    return sorted(todo)


def _write_atomically(path, text):
    tmp = path.with_name(f"{path.name}.{os.getpid()}.{uuid.uuid4().hex}.partial")
    tmp.write_text(text)
    os.replace(tmp, path)


def _progress(done, total, quiet):
    if not quiet:
        width = 30
        filled = int(width * done / max(total, 1))
        sys.stderr.write(f"\r[{'#' * filled}{'.' * (width - filled)}] {done}/{total} chunks")
        sys.stderr.flush()
        if done == total:
            sys.stderr.write("\n")


def run_sweep(spec, out_dir, workers=None, scheduler=None, quiet=False, fresh=False):
    """Run every chunk not yet on disk (in-process, on ``workers`` local dask workers, or on the
    dask scheduler at ``scheduler``); returns (percentiles, rank correlations), see
    :func:`summarize`; :func:`load_results` reads the per-draw table. The folder's manifest must
    match ``spec`` (``fresh`` empties the folder first)."""
    out = Path(out_dir)
    todo = _prepare_folder(spec, out, fresh)
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
    return sorted(Path(out_dir).glob("chunk_[0-9][0-9][0-9][0-9][0-9].parquet"))


def load_results(out_dir, columns=None):
    """The per-draw table of a sweep folder.

    Parameters
    ----------
    out_dir : str or path
        The sweep's folder (Parquet chunks and manifest).
    columns : list of str, optional
        Read only these columns.

    Returns
    -------
    pandas.DataFrame
        One row per draw (all chunks, in draw order): the drawn inputs, dGr [kJ/mol], energy
        densities [J/kg], power and cells per supply model, flags and failures.
    """
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
            reaction, quantity = c.split("|", 1)
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
            if "|" in c or c in ("pH_insitu", "flags", "failure")}
    return xr.Dataset(data, coords=coords)


def results_dataset(spec, out_dir):
    """A sweep's results as an xarray Dataset: a grid's with one dimension per grid input
    (:func:`grid_dataset`), Monte Carlo draws along the dimension ``draw``."""
    import xarray as xr

    if spec.is_grid:
        return grid_dataset(spec, out_dir)
    frame = load_results(out_dir)
    return xr.Dataset({c: ("draw", frame[c].to_numpy()) for c in frame.columns if c != "draw"},
                      coords={"draw": frame["draw"].to_numpy()})


def write_netcdf(dataset, path):
    """Write a Dataset to a NetCDF (classic, version 3) file through scipy: text variables become
    character arrays, numbers stay float64."""
    encoded = dataset.copy()
    for name, var in encoded.variables.items():
        if var.dtype == object:
            encoded[name] = var.astype(str)
    encoded.to_netcdf(path, engine="scipy")
