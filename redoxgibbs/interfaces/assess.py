"""The main job: a scenario in, a folder of results, rankings, plots and a report out."""

import sys
from dataclasses import dataclass

import numpy as np
import pandas as pd

from ..energetics.insitu import insitu_energetics
from ..energetics.power import power_per_cell_W, power_per_volume
from ..species.database import default_database
from ..speciation.solver import speciate
from .scenario import load_scenario

__all__ = ["Assessment", "run_assessment"]


@dataclass
class Assessment:
    scenario: object
    sample_set: object
    speciation: object
    energetics: object
    results: pd.DataFrame
    mixing: pd.DataFrame = None


def _progress(step, total, text, quiet):
    if not quiet:
        print(f"[{step}/{total}] {text}", file=sys.stderr, flush=True)


def _power_frames(scenario, energetics, T_K, rho):
    """Results per site and per supply model of that site (sites in order, each site's supply
    models in order): the energetics rows of its samples with power and cell numbers."""
    base = energetics.to_frame(scenario.per_species)
    base.insert(0, "site", np.repeat(scenario.site_of_samples(), len(scenario.reactions)))
    units, r = scenario.power_units, len(scenario.reactions)
    power = {}
    frames = []
    for site in scenario.sites:
        rows = site.rows
        low_W, high_W = power_per_cell_W(site.cells, T_K[rows])
        for supply in site.supplies or [None]:
            frame = base.iloc[rows.start * r:rows.stop * r].copy()
            if supply is None:
                frame["supply"] = "none given"
                for col in (units.volume_column, units.mass_column, "cells_per_m3_low", "cells_per_m3_high"):
                    frame[col] = np.nan
            else:
                key = supply.describe()
                if key not in power:
                    power[key] = power_per_volume(supply, energetics)   # W/m3, every sample once
                P = power[key][rows]
                frame["supply"] = key
                frame[units.volume_column] = P.ravel() * units.volume_factor
                frame[units.mass_column] = (P / (rho[rows, None] * 1000.0)).ravel() * units.mass_factor
                frame["cells_per_m3_low"] = (P / high_W[:, None]).ravel()
                frame["cells_per_m3_high"] = (P / low_W[:, None]).ravel()
            frame["cell_model"] = site.cells.describe()
            frames.append(frame)
    return frames


def run_assessment(scenario_path, quiet=False):
    """Run a scenario file; returns an :class:`Assessment` (nothing is written here)."""
    db = default_database()
    scenario = load_scenario(scenario_path)
    steps = 5 if scenario.mixing else 4
    _progress(1, steps, f"read scenario {scenario_path}", quiet)
    samples = scenario.sample_set
    _progress(2, steps, f"speciating {len(samples)} samples ({scenario.activity_model})", quiet)
    result = speciate(samples, scenario.activity_model)
    _progress(3, steps, f"Gibbs energies of {len(scenario.reactions)} reactions", quiet)
    W, rho = samples.water_fraction_and_density(db)
    energetics = insitu_energetics(result, scenario.reactions, db=db,
                                   minimum_energy_kJ=scenario.minimum_energy_kJ,
                                   gas_fugacity=samples.gas_fugacity_bar,
                                   water_per_kg_solution=W, density_kg_L=rho)
    n_supplies = len({x.describe() for site in scenario.sites for x in site.supplies})
    _progress(4, steps, f"power and cells for {n_supplies} supply models", quiet)
    frames = _power_frames(scenario, energetics, result.T_K, rho)
    mixing = None
    if scenario.mixing:
        from ..energetics.mixing import mixing_energetics

        m = scenario.mixing
        _progress(steps, steps, f"mixing {m['hydrothermal']} into {m['seawater']}", quiet)
        mixing = mixing_energetics(samples, m["hydrothermal"], m["seawater"], scenario.reactions,
                                   fractions=m.get("fractions"), temperatures_C=m.get("temperatures_C"),
                                   rule=m.get("temperature_rule", "enthalpy"),
                                   activity_model_name=scenario.activity_model, db=db)
    return Assessment(scenario, samples, result, energetics, pd.concat(frames, ignore_index=True), mixing)
