"""Scenario files (TOML) of the ``assess`` and ``sweep`` commands: sites, reactions, supply and cell
models, mixing and sweeps.

The schema (every key, its type, allowed values and meaning) is written down once, in
:mod:`redoxgibbs.interfaces.schema`, and enforced on reading; ``redoxgibbs scenario-keys`` prints
it, and examples/demo_scenario.toml is an annotated example. Each site's samples are read on their
own (their own units and species names) and merged; a site may give its own ``[[sites.supply]]``
and ``[sites.cells]``, otherwise the scenario's apply.
"""

import sys
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np
import pandas as pd

from ..bodies.body import Body
from ..energetics.catalog import (
    catalog,
    couples_present,
    enumerate_reactions,
    resolve_reactions,
)
from ..energetics.insitu import DEFAULT_MINIMUM_ENERGY_KJ
from ..energetics.power import CellRequirement, PowerUnits, Supply
from ..errors import InputError
from ..habitability.envelope import Limits
from ..speciation.samples import (
    EXCEL_SUFFIXES,
    SampleSet,
    merge_sample_sets,
    parse_column_header,
    read_sample_table,
    read_samples,
    read_workbook,
)
from ..speciation.solver import species_in_samples
from ..species.database import default_database
from .schema import check_scenario

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

__all__ = ["Scenario", "Site", "load_scenario", "sweep_spec"]

@dataclass
class Site:
    """A site: its name, the rows of its samples in the scenario's sample set, and its supply and
    cell models (the scenario's defaults unless the site gives its own)."""

    name: str
    rows: slice
    supplies: list
    cells: CellRequirement


@dataclass
class Scenario:
    """A scenario file as read: sites and their samples, reactions, activity model, supply and cell models,
    units, body, limits and the raw sections."""
    title: str
    samples: pd.DataFrame          # every site's sample rows as written, with a 'site' column (for display)
    sample_set: SampleSet          # the same samples read site by site (own units and species) and merged
    sites: list                    # Site
    reactions: list                # NamedReaction
    activity_model: str
    supplies: list = field(default_factory=list)
    cells: CellRequirement = field(default_factory=CellRequirement)
    power_units: PowerUnits = field(default_factory=PowerUnits)
    per_species: list = field(default_factory=list)
    minimum_energy_kJ: float = DEFAULT_MINIMUM_ENERGY_KJ
    source: Path = None
    mixing: dict = None
    raw: dict = None
    body: Body = None
    limits: Limits = field(default_factory=Limits)

    def site_of(self, sample):
        """The Site a sample (by name) belongs to."""
        where = dict(zip(self.sample_set.names, self.site_of_samples()))[str(sample)]
        return next(x for x in self.sites if x.name == where)

    def sample_row(self, name):
        """A sample's row as written (a dict of its non-blank cells; a blank temperature stays)."""
        rows = self.samples[self.samples["sample"].astype(str) == str(name)]
        if rows.empty:
            raise InputError(f"scenario: sample {name!r} is not a sample name")
        return {k: v for k, v in rows.iloc[0].items()
                if k != "site" and (not (isinstance(v, float) and pd.isna(v)) or parse_column_header(k)[0] == "T")}

    def site_of_samples(self):
        """The site name of every sample, in sample order."""
        return np.concatenate([[s.name] * (s.rows.stop - s.rows.start) for s in self.sites])


def _site_frames(site, folder):
    """A site's samples as written, as (site name, DataFrame) pairs: its inline fluid, its CSV
    (relative to the scenario file), or its Excel workbook: the sheet ``sheet``, or one site per
    sheet (named 'SITE: SHEET') when the workbook has several and no sheet is named."""
    if "fluid" in site:
        return [(site["name"], pd.DataFrame([{"sample": site["name"], **site["fluid"]}]))]
    path = (folder / site["samples"]).resolve()
    try:
        if str(path).lower().endswith(EXCEL_SUFFIXES):
            sheets = read_workbook(path, site.get("sheet"))
            if len(sheets) == 1:
                return [(site["name"], next(iter(sheets.values())))]
            return [(f"{site['name']}: {name}", frame) for name, frame in sheets.items()]
        if "sheet" in site:
            raise InputError(f"sheet {site['sheet']!r} is given, but {path.name} is not an Excel workbook")
        return [(site["name"], read_sample_table(path))]
    except InputError as err:
        raise InputError(f"scenario: site {site['name']!r}: {err}") from None


def _body(spec):
    """The scenario's [body], or None."""
    if spec is None:
        return None
    return Body(**{k: v for k, v in spec.items() if k != "profile_points"})


def _supplies(specs):
    return [Supply(**{**s, "kind": s["kind"].strip().lower()}) for s in specs]


def _cells(spec, default=None):
    base = default or CellRequirement()
    return CellRequirement(model=spec.get("model", base.model),
                           cell_carbon_g=tuple(spec.get("cell_carbon_g", base.cell_carbon_g)),
                           basal_W=tuple(spec.get("basal_W", base.basal_W)))


def _reactions(spec, sample_set):
    out = []
    chosen = spec.get("catalog", [])
    if chosen == "all":
        out.extend(catalog())
    else:
        out.extend(resolve_reactions(chosen))
    out.extend(resolve_reactions(spec.get("custom", [])))
    enum = spec.get("enumerate")
    if enum:
        present = None
        if "present" in (enum.get("donors"), enum.get("acceptors")):
            present = couples_present(species_in_samples(sample_set))

        def pick(value):
            return present if value == "present" else None if value in (None, "all") else list(value)

        out.extend(enumerate_reactions(pick(enum.get("donors")), pick(enum.get("acceptors"))))
    if not out:
        raise InputError("scenario: [reactions] names no reactions (catalog, custom or enumerate)")
    return out


def _read_toml(path):
    try:
        return tomllib.loads(path.read_text(encoding="utf-8"))
    except FileNotFoundError:
        raise InputError(f"scenario: file {path} does not exist") from None
    except IsADirectoryError:
        raise InputError(f"scenario: {path} is a folder; give the scenario's TOML file") from None
    except UnicodeDecodeError:
        raise InputError(f"scenario: {path} is not UTF-8 text") from None
    except tomllib.TOMLDecodeError as err:
        raise InputError(f"scenario: {path} is not valid TOML: {err}") from None


def load_scenario(path):
    """Read a scenario file.

    Parameters
    ----------
    path : str or path
        A scenario (TOML); ``redoxgibbs scenario-keys`` lists every key. It is checked against the
        schema (``interfaces/schema.py``), and each site's samples are read on their own (their
        own units and species names; a workbook of several sheets gives one site per sheet).

    Returns
    -------
    Scenario
        Sites, samples, reactions, activity model, supply and cell models, body, limits and the
        sections for mixing, sweeps and thresholds.
    """
    path = Path(path)
    data = _read_toml(path)
    check_scenario(data)
    db = default_database()
    body = _body(data.get("body"))
    frames, sets, names, specs = [], [], [], []
    for site in data["sites"]:
        for name, frame in _site_frames(site, path.parent):
            try:
                sets.append(read_samples(frame, db=db, below_detection=data.get("below_detection", "not-measured"),
                                         body=body))
            except InputError as err:
                raise InputError(f"scenario: site {name!r}: {err}") from None
            frames.append(frame.assign(site=name))
            names.append(name)
            specs.append(site)
    sample_set = merge_sample_sets(sets, names, db)
    frame = pd.concat(frames, ignore_index=True)
    frame.insert(0, "site", frame.pop("site"))
    supplies = _supplies(data.get("supply", []))
    cells = _cells(data.get("cells", {}))
    sites, start = [], 0
    for name, site, s in zip(names, specs, sets):
        sites.append(Site(name=name, rows=slice(start, start + len(s)),
                          supplies=_supplies(site["supply"]) if "supply" in site else supplies,
                          cells=_cells(site["cells"], cells) if "cells" in site else cells))
        start += len(s)
    units = data.get("units", {})
    power_units = PowerUnits(per_volume=units.get("power_per_volume", "W/m3"),
                             per_mass=units.get("power_per_mass", "W/kg"))
    mixing = data.get("mixing")
    if mixing is not None:
        for role in ("hydrothermal", "seawater"):
            if mixing[role] not in sample_set.names:
                raise InputError(f"scenario: mixing.{role}: {mixing[role]!r} is not a sample name")
    reaction_spec = data["reactions"]
    return Scenario(title=data.get("title", path.stem), samples=frame, sample_set=sample_set, sites=sites,
                    reactions=_reactions(reaction_spec, sample_set),
                    activity_model=data.get("activity_model", "bdot").strip().lower(), supplies=supplies,
                    cells=cells, power_units=power_units,
                    per_species=[db.resolve(x) for x in reaction_spec.get("per_species", [])],
                    minimum_energy_kJ=float(data.get("minimum_energy_kJ_per_mol", DEFAULT_MINIMUM_ENERGY_KJ)),
                    source=path, mixing=mixing, raw=data, body=body, limits=Limits(**data.get("habitability", {})))


def _distribution(column, spec):
    from ..sweeps.runner import Distribution

    if isinstance(spec, list):
        return Distribution("grid", values=tuple(spec))
    kind = spec.get("distribution")
    keys = {"normal": ("mean", "sd"), "lognormal": ("median", "sigma_ln"), "uniform": ("low", "high")}
    if kind not in keys:
        raise InputError(f"scenario: input {column!r}: distribution must be one of {', '.join(keys)}")
    a, b = keys[kind]
    if a not in spec or b not in spec:
        raise InputError(f"scenario: input {column!r}: a {kind} distribution needs {a} and {b}")
    return Distribution(kind, float(spec[a]), float(spec[b]))


def sweep_spec(scenario):
    """The SweepSpec of a scenario's [uncertainty] or [sweep] section."""
    from ..sweeps.runner import SweepSpec

    section = scenario.raw.get("uncertainty") or scenario.raw.get("sweep")
    if not section:
        raise InputError("scenario: no [uncertainty] or [sweep] section to run")
    row = scenario.sample_row

    mixing = section.get("mixing")
    if mixing:
        mixing = {"hydrothermal": row(mixing.get("hydrothermal")), "seawater": row(mixing.get("seawater")),
                  "temperature_rule": mixing.get("temperature_rule", "enthalpy")}
        base = {}
        site = None
    else:
        base = row(section.get("sample"))
        site = scenario.site_of(section["sample"])
    inputs = {c: _distribution(c, d) for c, d in section.get("inputs", {}).items()}
    if not inputs:
        raise InputError("scenario: the sweep section names no inputs")
    return SweepSpec(base=base, inputs=inputs, reactions=tuple(scenario.reactions),
                     activity_model=scenario.activity_model, n=int(section.get("draws", 1000)),
                     chunk_size=int(section.get("chunk_size", 10_000)), seed=int(section.get("seed", 0)),
                     supplies=tuple(site.supplies if site else scenario.supplies),
                     cells=site.cells if site else scenario.cells,
                     power_units=scenario.power_units,
                     water=section.get("water", "exact"), mixing=mixing,
                     below_detection=scenario.raw.get("below_detection", "not-measured"), body=scenario.body)
