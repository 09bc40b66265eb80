"""The main job: a scenario in, a folder of results, rankings, plots and a report out."""

import sys
from dataclasses import dataclass

import numpy as np
import pandas as pd

from ..energetics.catalog import resolve_reactions
from ..errors import InputError
from ..habitability.envelope import habitability_envelope
from ..pipeline.evaluate import evaluate
from ..pipeline.mixing import mixing_energetics
from ..pipeline.profile import depth_profile
from ..pipeline.thresholds import Target, feasibility_map, solve_input
from ..speciation.samples import OCEAN_POSITION_COLUMNS, parse_column_header
from ..species.database import default_database
from .scenario import load_scenario

__all__ = ["Assessment", "run_assessment"]


@dataclass
class Assessment:
    """Everything one scenario's assessment computed: samples, speciation, energetics, result tables (per
    site and supply model), mixing, depth profile, habitability envelope, thresholds and their map."""
    scenario: object
    sample_set: object
    speciation: object
    energetics: object
    results: pd.DataFrame
    mixing: pd.DataFrame = None
    profile: pd.DataFrame = None       # energetics against depth in the body's ocean
    profile_sample: str = ""
    envelope: pd.DataFrame = None      # the habitability envelope, sample x criterion
    thresholds: pd.DataFrame = None    # the [thresholds] section solved per sample
    feasibility: object = None         # its map (an xarray Dataset), when it asks for one
    dataset: object = None             # the evaluation as an xarray Dataset (sample x reaction x supply)


def _progress(step, total, text, quiet):
    if not quiet:
        print(f"[{step}/{total}] {text}", file=sys.stderr, flush=True)


def _power_frames(scenario, ev):
    """Results per site and per supply model of that site (sites in order, each site's supply
    models in order): the evaluation's rows of its samples, with power and that site's cells."""
    base = ev.energetics.to_frame(scenario.per_species)
    base.insert(0, "site", np.repeat(scenario.site_of_samples(), len(scenario.reactions)))
    r = len(scenario.reactions)
    frames = []
    for site in scenario.sites:
        rows = site.rows
        for supply in site.supplies or [None]:
            frame = base.iloc[rows.start * r:rows.stop * r].copy()
            if supply is None:
                frame["supply"] = "none given"
                for col in ev.power_column_names():
                    frame[col] = np.nan
            else:
                frame["supply"] = supply.describe()
                for col, values in ev.power_columns(ev.supply_index(supply), rows, site.cells).items():
                    frame[col] = values
            frame["cell_model"] = site.cells.describe()
            frames.append(frame)
    return frames


def run_assessment(scenario_path, quiet=False):
    """Run the main job of a scenario: evaluation, habitability envelope, mixing, depth profile and
    thresholds (nothing is written here; see :func:`~redoxgibbs.interfaces.report.write_outputs`).

    Parameters
    ----------
    scenario_path : str or path
        The scenario file (TOML).
    quiet : bool
        No progress lines on standard error.

    Returns
    -------
    Assessment
    """
    db = default_database()
    scenario = load_scenario(scenario_path)
    steps = 4 if scenario.mixing else 3
    _progress(1, steps, f"read scenario {scenario_path}", quiet)
    samples = scenario.sample_set
    _progress(2, steps, f"speciating {len(samples)} samples ({scenario.activity_model}) and the Gibbs "
                        f"energies of {len(scenario.reactions)} reactions", quiet)
    supplies = list({x.describe(): x for site in scenario.sites for x in site.supplies}.values())
    ev = evaluate(samples, scenario.reactions, scenario.activity_model, supplies, scenario.cells,
                  scenario.power_units, minimum_energy_kJ=scenario.minimum_energy_kJ, db=db, body=scenario.body)
    _progress(3, steps, f"power and cells for {len(supplies)} supply models", quiet)
    frames = _power_frames(scenario, ev)
    mixing = None
    if scenario.mixing:

        m = scenario.mixing
        _progress(steps, steps, f"mixing {m['hydrothermal']} into {m['seawater']}", quiet)
        mixing = mixing_energetics(samples, m["hydrothermal"], m["seawater"], scenario.reactions,
                                   fractions=m.get("fractions"), temperatures_C=m.get("temperatures_C"),
                                   rule=m.get("temperature_rule", "enthalpy"),
                                   activity_model_name=scenario.activity_model, db=db)
    profile, profile_sample = _ocean_profile(scenario, db, quiet)
    thresholds, feasibility = scenario_thresholds(scenario, db, quiet) if "thresholds" in scenario.raw else (None, None)
    return Assessment(scenario, samples, ev.speciation, ev.energetics, pd.concat(frames, ignore_index=True),
                      mixing, profile, profile_sample, _envelope(scenario, ev, db), thresholds, feasibility,
                      ev.to_dataset())


def _envelope(scenario, ev, db):
    """The habitability envelope of every sample, each site with its first supply and cell model."""
    parts = []
    for site in scenario.sites:
        k = ev.supply_index(site.supplies[0]) if site.supplies else None
        part = habitability_envelope(ev, scenario.limits, scenario.minimum_energy_kJ, k, site.cells, site.rows, db)
        parts.append(part.assign(site=site.name))
    frame = pd.concat(parts, ignore_index=True)
    frame.insert(0, "site", frame.pop("site"))
    return frame


def scenario_thresholds(scenario, db, quiet=True):
    """The [thresholds] section: (table per sample, or per map point; the map's xarray Dataset or None)."""
    spec = scenario.raw["thresholds"]
    reaction = resolve_reactions([spec["reaction"]], db)[0]
    value = spec.get("value", scenario.minimum_energy_kJ if spec["target"] == "minimum_energy" else None)
    if value is None:
        raise InputError(f"scenario: thresholds.value is needed for the target {spec['target']!r}")
    target, column, bracket = Target(spec["target"], float(value)), spec["input"], tuple(spec["bracket"])
    same = parse_column_header(column)[0]

    def own(row):     # the fluid without its own cell of the solved input (in whatever unit)
        return {k: v for k, v in row.items() if parse_column_header(k)[0] != same}

    def supply_of(site):
        return site.supplies[0] if site.supplies else None

    if "map" in spec:
        site = scenario.site_of(spec["sample"])
        axes = {c: [float(x) for x in v] for c, v in spec["map"].items()}
        _progress("+", "", f"feasibility map of {column} over {' x '.join(axes)} "
                           f"({np.prod([len(v) for v in axes.values()])} points)", quiet)
        ds = feasibility_map(own(scenario.sample_row(spec["sample"])), reaction, column, target, bracket, axes,
                             scenario.activity_model, supply_of(site), site.cells, scenario.body, db)
        return ds.to_dataframe().reset_index().rename(columns={"threshold": column}), ds
    _progress("+", "", f"thresholds of {column} for {len(scenario.sample_set)} samples", quiet)
    parts = []
    for site in scenario.sites:
        frame = pd.DataFrame([own(scenario.sample_row(n)) for n in scenario.sample_set.names[site.rows]])
        part = solve_input(frame, reaction, column, target, bracket, scenario.activity_model, supply_of(site),
                           site.cells, scenario.body, db)
        parts.append(part.assign(site=site.name))
    table = pd.concat(parts, ignore_index=True)
    table.insert(0, "site", table.pop("site"))
    return table, None


def _ocean_profile(scenario, db, quiet):
    """Energetics against depth of the first sample placed in the body's ocean (None without one)."""
    if scenario.body is None:
        return None, ""
    placed = [c for c in scenario.samples.columns
              if parse_column_header(c)[0].lower() in OCEAN_POSITION_COLUMNS]
    rows = scenario.samples[scenario.samples[placed].notna().any(axis=1)] if placed else scenario.samples.iloc[:0]
    if rows.empty:
        return None, ""
    sample = scenario.sample_row(rows.iloc[0]["sample"])
    points = int(scenario.raw["body"].get("profile_points", 21))
    _progress("+", "", f"profile of {sample['sample']} over {points} depths of {scenario.body.name}", quiet)
    return depth_profile(sample, scenario.body, scenario.reactions, scenario.activity_model, points, db), \
        sample["sample"]
