"""The scenario file's schema, written down once and enforced.

Every section and key a scenario may hold is declared here with its type, its allowed values and a
one-line description; :func:`check_scenario` refuses unknown keys (naming the nearest known one),
wrong types and out-of-range values, naming the key and what is expected. The same declarations
produce the scenario reference (:func:`schema_reference`).
"""

import difflib
import math
from dataclasses import dataclass, field

from ..activities.models import MODELS
from ..energetics.power import SUPPLY_OPTIONAL, SUPPLY_PARAMETERS
from ..errors import InputError

__all__ = ["SCENARIO", "Key", "check_scenario", "schema_reference"]


@dataclass(frozen=True)
class Key:
    """One key: ``kind`` is str, number, integer, bool, strings (a list of text), numbers (a list),
    range ([low, high] with low <= high), table (fixed keys), tables (an array of tables with fixed
    keys), columns (a table of sample columns to values) or inputs (sweep inputs)."""

    kind: str
    doc: str
    required: bool = False
    choices: tuple = ()
    positive: bool = False          # > 0
    non_negative: bool = False      # >= 0
    within: tuple = ()              # (low, high), inclusive
    keys: dict = field(default_factory=dict)
    words: tuple = ()               # strings also accepted in place of a list (e.g. "all")


_POSITIVE = dict(positive=True)

SUPPLY = {
    "kind": Key("str", "supply model", required=True,
                choices=tuple(SUPPLY_PARAMETERS)),
    "flux_kg_per_s": Key("number", "fluid mass flux through the habitat [kg/s] (flow-through)", **_POSITIVE),
    "volume_m3": Key("number", "habitat volume [m3] (flow-through; serpentinization, ice-delivery and hydrothermal: "
                               "default the body's ocean)", **_POSITIVE),
    "tau_s": Key("number", "renewal time of the reactant pool [s] (turnover)", **_POSITIVE),
    "areal_flux_mol_per_m2_yr": Key("number", "flux of the limiting reactant [mol/m2/yr] (areal-flux)", **_POSITIVE),
    "thickness_m": Key("number", "thickness of the layer it feeds [m] (areal-flux)", **_POSITIVE),
    "limiting_species": Key("str", "the species the flux delivers (areal-flux; ice-delivery: the oxidant)"),
    "rate_mol_per_L_s": Key("number", "reaction rate [mol/L/s] (rate)", **_POSITIVE),
    "rock_kg_per_yr": Key("number", "rock altered per year [kg/yr] (serpentinization)", **_POSITIVE),
    "feo_mass_fraction": Key("number", "FeO mass fraction of the rock [kg/kg] (serpentinization)",
                             within=(0.0, 1.0)),
    "fe_oxidized_fraction": Key("number", "share of its Fe(II) oxidized to Fe(III) (serpentinization)",
                                within=(0.0, 1.0)),
    "surface_production_mol_per_m2_yr": Key("number", "oxidant production at the surface [mol/m2/yr] "
                                            "(ice-delivery)", **_POSITIVE),
    "delivery_efficiency": Key("number", "share of the surviving oxidant delivered through the shell "
                               "(ice-delivery)", within=(0.0, 1.0)),
    "resurfacing_time_yr": Key("number", "surface age: time to resurface the ice [yr] (ice-delivery)", **_POSITIVE),
    "surface_lifetime_yr": Key("number", "lifetime of the oxidant at the surface [yr] (ice-delivery; default: "
                               "no loss)", **_POSITIVE),
    "heat_flow_W": Key("number", "heat carried out of the seafloor by the fluid [W] (hydrothermal)", **_POSITIVE),
    "temperature_rise_K": Key("number", "the fluid's temperature rise [K] (hydrothermal)", **_POSITIVE),
    "recharge_T_C": Key("number", "temperature of the water entering the seafloor [degC] (hydrothermal)",
                        within=(-20.0, 370.0)),
}

CELLS = {
    "model": Key("str", "per-cell power model", choices=("tijhuis1993", "basal")),
    "cell_carbon_g": Key("range", "carbon per cell, [low, high] [g C] (tijhuis1993)", **_POSITIVE),
    "basal_W": Key("range", "basal power per cell, [low, high] [W] (basal)", **_POSITIVE),
}

SITE = {
    "name": Key("str", "site name", required=True),
    "samples": Key("str", "sample table (CSV or Excel .xlsx), relative to the scenario file"),
    "sheet": Key("str", "the workbook's sheet (default: every sheet, one site per sheet)"),
    "fluid": Key("columns", "one inline sample: sample-table columns to values"),
    "supply": Key("tables", "supply models of this site (default: the scenario's [[supply]])", keys=SUPPLY),
    "cells": Key("table", "per-cell power model of this site (default: the scenario's [cells])", keys=CELLS),
}

REACTIONS = {
    "catalog": Key("strings", "catalog reaction names, or \"all\"", words=("all",)),
    "custom": Key("strings", "reaction strings, e.g. \"CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)\""),
    "enumerate": Key("table", "donor x acceptor enumeration of redox couples", keys={
        "donors": Key("strings", "couples giving electrons, \"all\" or \"present\"", words=("all", "present")),
        "acceptors": Key("strings", "couples taking electrons, \"all\" or \"present\"", words=("all", "present")),
    }),
    "per_species": Key("strings", "species per mole of which dGr is also given"),
}

MIXING = {
    "hydrothermal": Key("str", "sample name of the hot end-member", required=True),
    "seawater": Key("str", "sample name of the cold end-member", required=True),
    "temperatures_C": Key("numbers", "mixture temperatures [degC]"),
    "fractions": Key("numbers", "mass fractions of the hot end-member", within=(0.0, 1.0)),
    "temperature_rule": Key("str", "how mixtures take their temperature", choices=("enthalpy", "linear")),
}

SWEEP = {
    "sample": Key("str", "the base sample's name"),
    "draws": Key("integer", "Monte Carlo draws", **_POSITIVE),
    "seed": Key("integer", "random seed", non_negative=True),
    "chunk_size": Key("integer", "draws per chunk", **_POSITIVE),
    "water": Key("str", "water properties: exact or interpolated from a table", choices=("exact", "tabulated")),
    "inputs": Key("inputs", "swept inputs: a column (or supply:FIELD, mixing:fraction) to a list of grid "
                            "values or a distribution {distribution, mean, sd | median, sigma_ln | low, high}",
                  required=True),
    "mixing": Key("table", "sweep the mixing fraction between two end-members", keys={
        "hydrothermal": Key("str", "hot end-member", required=True),
        "seawater": Key("str", "cold end-member", required=True),
        "temperature_rule": Key("str", "how mixtures take their temperature", choices=("enthalpy", "linear")),
    }),
}

BODY = {
    "name": Key("str", "the body's name", required=True),
    "radius_km": Key("number", "radius [km]", required=True, **_POSITIVE),
    "mass_kg": Key("number", "mass [kg] (or surface_gravity_m_s2)", **_POSITIVE),
    "surface_gravity_m_s2": Key("number", "surface gravity [m/s2] (or mass_kg)", **_POSITIVE),
    "ice_shell_km": Key("number", "thickness of the ice shell [km]", required=True, non_negative=True),
    "ice_density_kg_m3": Key("number", "density of the ice shell [kg/m3] (default 920)", **_POSITIVE),
    "ocean_depth_km": Key("number", "thickness of the liquid ocean [km]", required=True, **_POSITIVE),
    "surface_pressure_bar": Key("number", "pressure at the surface [bar] (default 0)", non_negative=True),
    "profile_points": Key("integer", "depths of the report's energetics-against-depth profile (default 21)",
                          within=(2, 500)),
}

HABITABILITY = {
    "T_max_C": Key("number", "highest temperature of growth [degC] (default 122, Takai et al. 2008)"),
    "T_min_C": Key("number", "lowest temperature of measured activity [degC] (default -20, Rivkina et al. 2000)"),
    "water_activity_min": Key("number", "lowest water activity of growth (default 0.585, Stevenson et al. 2015)",
                              within=(0.0, 1.0)),
    "pH_min": Key("number", "lowest pH of growth (default 0)", within=(-2.0, 16.0)),
    "pH_max": Key("number", "highest pH of growth (default 12.5)", within=(-2.0, 16.0)),
    "cells_per_cm3_min": Key("number", "cell density the best reaction's power must keep alive [cells/cm3] "
                             "(default 1000)", **_POSITIVE),
    "fixed_nitrogen_umol_per_kg_min": Key("number", "fixed nitrogen needed [umol/kg] (default 1)", non_negative=True),
    "phosphate_umol_per_kg_min": Key("number", "phosphate needed [umol/kg] (default 0.01)", non_negative=True),
    "sulfur_umol_per_kg_min": Key("number", "sulfur needed [umol/kg] (default 1)", non_negative=True),
    "iron_umol_per_kg_min": Key("number", "iron needed [umol/kg] (default 0.001)", non_negative=True),
}

THRESHOLDS = {
    "reaction": Key("str", "the reaction (catalog name or reaction string)", required=True),
    "input": Key("str", "the sample column solved for, e.g. \"H2(aq) [nmol/kg]\"", required=True),
    "target": Key("str", "what the reaction must reach", required=True,
                  choices=("minimum_energy", "energy_density", "cells")),
    "value": Key("number", "the target: kJ/mol (minimum_energy; default the scenario's minimum energy), "
                           "J/kg (energy_density) or cells/cm3 (cells)", **_POSITIVE),
    "bracket": Key("range", "where to search, [low, high] in the input's units", required=True),
    "sample": Key("str", "the base sample of the map (without a map: every sample is solved)"),
    "map": Key("inputs", "two sample columns to grid values, e.g. {\"T [degC]\" = [...], pH = [...]}"),
}

SCENARIO = {
    "title": Key("str", "report title"),
    "habitability": Key("table", "limits of the habitability envelope (defaults: published values)", keys=HABITABILITY),
    "thresholds": Key("table", "feasibility asked backwards: the input at which a reaction reaches a target",
                      keys=THRESHOLDS),
    "body": Key("table", "an icy body: its ocean column turns 'depth [km]' (below the ice-ocean interface) or "
                         "'above seafloor [km]' sample columns into pressures", keys=BODY),
    "activity_model": Key("str", "activity model", choices=tuple(MODELS)),
    "below_detection": Key("str", "how cells below the detection limit ('<0.1', 'bdl', 'nd') are taken",
                           choices=("not-measured", "detection-limit", "half-limit")),
    "minimum_energy_kJ_per_mol": Key("number", "smallest |dGr| a catabolism is taken to use [kJ/mol]",
                                     non_negative=True),
    "sites": Key("tables", "sites: each a sample table or one inline fluid", required=True, keys=SITE),
    "reactions": Key("table", "reactions to evaluate", required=True, keys=REACTIONS),
    "supply": Key("tables", "supply models (every site's default)", keys=SUPPLY),
    "units": Key("table", "units of the power columns", keys={
        "power_per_volume": Key("str", "e.g. \"W/m3\", \"nW/cm3\", \"uW/L\""),
        "power_per_mass": Key("str", "e.g. \"W/kg\", \"uW/kg\""),
    }),
    "cells": Key("table", "per-cell power model (every site's default)", keys=CELLS),
    "mixing": Key("table", "energetics along the mixing path of two samples", keys=MIXING),
    "uncertainty": Key("table", "Monte Carlo uncertainty (redoxgibbs sweep)", keys=SWEEP),
    "sweep": Key("table", "grid sweep (redoxgibbs sweep)", keys=SWEEP),
}

_DISTRIBUTIONS = {"normal": ("mean", "sd"), "lognormal": ("median", "sigma_ln"), "uniform": ("low", "high")}
_TYPE_WORDS = {"str": "text", "number": "a number", "integer": "a whole number", "bool": "true or false",
               "strings": "a list of text", "numbers": "a list of numbers", "range": "[low, high]",
               "table": "a table", "tables": "an array of tables ([[...]])", "columns": "a table",
               "inputs": "a table"}


def _fail(where, message):
    raise InputError(f"scenario: {where}: {message}")


def _is_number(v):
    return isinstance(v, (int, float)) and not isinstance(v, bool) and math.isfinite(v)


def _check_number(where, key, v):
    if not _is_number(v):
        _fail(where, f"expected a finite number, got {v!r}")
    if key.positive and v <= 0:
        _fail(where, f"must be above 0, got {v!r}")
    if key.non_negative and v < 0:
        _fail(where, f"must not be negative, got {v!r}")
    if key.within and not key.within[0] <= v <= key.within[1]:
        _fail(where, f"must lie between {key.within[0]:g} and {key.within[1]:g}, got {v!r}")


def _check_value(where, key, v):
    kind = key.kind
    if kind == "str":
        if not isinstance(v, str) or not v.strip():
            _fail(where, f"expected {_TYPE_WORDS[kind]}, got {v!r}")
        if key.choices and v.strip().lower() not in key.choices:
            _fail(where, f"{v!r} is not one of {', '.join(key.choices)}")
    elif kind == "number":
        _check_number(where, key, v)
    elif kind == "integer":
        if isinstance(v, bool) or not isinstance(v, int):
            _fail(where, f"expected a whole number, got {v!r}")
        _check_number(where, key, v)
    elif kind == "strings":
        if isinstance(v, str) and v in key.words:
            return
        if not isinstance(v, list) or not all(isinstance(x, str) and x.strip() for x in v):
            words = f" or one of {', '.join(repr(w) for w in key.words)}" if key.words else ""
            _fail(where, f"expected a list of text{words}, got {v!r}")
    elif kind in ("numbers", "range"):
        if not isinstance(v, list) or not v:
            _fail(where, f"expected {_TYPE_WORDS[kind]}, got {v!r}")
        for i, x in enumerate(v):
            _check_number(f"{where}[{i}]", key, x)
        if kind == "range" and (len(v) != 2 or v[0] > v[1]):
            _fail(where, f"expected [low, high] with low <= high, got {v!r}")
    elif kind == "table":
        if not isinstance(v, dict):
            _fail(where, f"expected a table, got {v!r}")
        _check_table(where, v, key.keys)
    elif kind == "tables":
        if not isinstance(v, list) or not all(isinstance(t, dict) for t in v):
            _fail(where, f"expected an array of tables ([[...]]), got {v!r}")
        for i, t in enumerate(v):
            _check_table(f"{where} {i + 1}", t, key.keys)
            if key.keys is SUPPLY:
                _check_supply(f"{where} {i + 1}", t)
    elif kind == "columns":
        if not isinstance(v, dict):
            _fail(where, f"expected a table of sample columns, got {v!r}")
        for col, x in v.items():
            if not (_is_number(x) or isinstance(x, str)):
                _fail(f"{where}.{col}", f"expected a number or text, got {x!r}")
    elif kind == "inputs":
        _check_inputs(where, v)


def _check_supply(where, table):
    kind = table.get("kind", "").strip().lower()
    missing = [k for k in SUPPLY_PARAMETERS.get(kind, ()) if k not in table]
    if missing:
        _fail(where, f"a {kind} supply needs {', '.join(missing)}")
    allowed = SUPPLY_PARAMETERS.get(kind, ()) + SUPPLY_OPTIONAL.get(kind, ())
    extra = [k for k in table if k != "kind" and k not in allowed]
    if extra:
        _fail(where, f"{', '.join(extra)} do not belong to a {kind} supply (it takes {', '.join(allowed)})")


def _check_inputs(where, v):
    if not isinstance(v, dict) or not v:
        _fail(where, "expected a table mapping each swept input to its values or distribution")
    for col, spec in v.items():
        here = f"{where}.{col!r}"
        if isinstance(spec, list):
            if not spec or not all(_is_number(x) for x in spec):
                _fail(here, f"a grid is a non-empty list of numbers, got {spec!r}")
            continue
        if not isinstance(spec, dict):
            _fail(here, f"expected a list of grid values or a distribution table, got {spec!r}")
        kind = spec.get("distribution")
        if kind not in _DISTRIBUTIONS:
            _fail(here, f"distribution must be one of {', '.join(_DISTRIBUTIONS)}, got {kind!r}")
        a, b = _DISTRIBUTIONS[kind]
        extra = set(spec) - {"distribution", a, b}
        if extra:
            _fail(here, f"a {kind} distribution takes {a} and {b}, not {', '.join(sorted(extra))}")
        for k in (a, b):
            if not _is_number(spec.get(k)):
                _fail(f"{here}.{k}", f"expected a number, got {spec.get(k)!r}")
        if kind == "uniform" and spec["low"] > spec["high"]:
            _fail(here, f"low ({spec['low']}) is above high ({spec['high']})")
        if kind in ("normal", "lognormal") and spec[b] <= 0:
            _fail(f"{here}.{b}", f"must be above 0, got {spec[b]!r}")
        if kind == "lognormal" and spec[a] <= 0:
            _fail(f"{here}.{a}", f"must be above 0, got {spec[a]!r}")


def _check_table(where, table, keys):
    for name, value in table.items():
        if name not in keys:
            near = difflib.get_close_matches(name, keys, n=1, cutoff=0.5)
            hint = f"; did you mean {near[0]!r}?" if near else f"; known keys: {', '.join(keys)}"
            _fail(where, f"unknown key {name!r}{hint}")
        _check_value(f"{where}.{name}" if where else name, keys[name], value)
    for name, key in keys.items():
        if key.required and name not in table:
            _fail(where or "top level", f"{name!r} is required ({key.doc})")


def check_scenario(data):
    """Refuse, naming the key, any scenario content the schema does not allow."""
    _check_table("", data, SCENARIO)
    for i, site in enumerate(data["sites"]):
        if ("samples" in site) == ("fluid" in site):
            _fail(f"sites {i + 1} ({site['name']!r})", "give either samples (a CSV file) or a [sites.fluid] table")
    mixing = data.get("mixing")
    if mixing is not None and ("temperatures_C" in mixing) == ("fractions" in mixing):
        _fail("mixing", "give either temperatures_C or fractions")
    thresholds = data.get("thresholds")
    if thresholds is not None and "map" in thresholds:
        grid = thresholds["map"]
        if len(grid) != 2 or not all(isinstance(v, list) for v in grid.values()):
            _fail("thresholds.map", f"a map takes exactly two columns, each a list of values; got {grid!r}")
        if "sample" not in thresholds:
            _fail("thresholds", "a map needs the base sample ('sample')")


def schema_reference(keys=SCENARIO, prefix=""):
    """The scenario reference as Markdown lines: every key, its type, allowed values and meaning."""
    lines = []
    for name, key in keys.items():
        path = f"{prefix}{name}"
        extra = [f"one of {', '.join(key.choices)}"] if key.choices else []
        if key.required:
            extra.append("required")
        note = f" ({'; '.join(extra)})" if extra else ""
        lines.append(f"- `{path}`: {_TYPE_WORDS[key.kind]}{note}: {key.doc}")
        if key.keys:
            lines += schema_reference(key.keys, f"{path}.")
    return lines
