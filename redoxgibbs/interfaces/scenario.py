"""Scenario files (TOML) of the ``assess`` command: sites, reactions, supply and cell models.

Schema (annotated example: examples/demo_scenario.toml):
- ``title``, ``activity_model`` (ideal | davies | bdot), ``minimum_energy_kJ_per_mol``
- ``[[sites]]``: ``name`` and either ``samples`` (a CSV path, relative to the scenario file) or an
  inline ``[sites.fluid]`` table with the same columns as a sample CSV (one sample)
- ``[reactions]``: ``catalog`` (a list of names, or "all"), ``custom`` (reaction strings),
  ``[reactions.enumerate]`` with ``donors`` and ``acceptors`` (redox-couple names, "all", or
  "present": the couples whose dissolved species the sites' samples contain), ``per_species``
  (species names: results also give dGr per mole of each)
- ``[[supply]]``: ``kind`` = flow-through | turnover | areal-flux | rate and its parameters
- ``[units]`` (optional): ``power_per_volume`` (default "W/m3"; e.g. "nW/cm3", "uW/L") and
  ``power_per_mass`` (default "W/kg"), the units of the power columns, named in their headers
- ``[cells]``: ``model`` = tijhuis1993 (with ``cell_carbon_g`` = [low, high]) or basal
  (with ``basal_W`` = [low, high])
- ``[mixing]`` (optional): ``hydrothermal`` and ``seawater`` (sample names), ``temperatures_C`` or
  ``fractions``, ``temperature_rule`` = enthalpy | linear
- ``[uncertainty]`` or ``[sweep]`` (for ``redoxgibbs sweep``): ``sample`` (the base sample's
  name), ``draws``, ``seed``, ``chunk_size``, and ``[uncertainty.inputs]`` mapping a sample
  column to ``{distribution = "normal", mean, sd}``, ``{distribution = "lognormal", median,
  sigma_ln}`` or ``{distribution = "uniform", low, high}``; ``[sweep.inputs]`` maps a column to a
  list of values (their product is swept); instead of ``sample``, ``mixing = {hydrothermal =
  NAME, seawater = NAME, temperature_rule = ...}`` sweeps the input ``"mixing:fraction"``;
  ``water`` = exact | tabulated (interpolated water
  properties, see redoxgibbs/water/table.py for the error bound)
"""

import sys
from dataclasses import dataclass, field
from pathlib import Path

import pandas as pd

from ..energetics.catalog import catalog, couples_present, enumerate_reactions, resolve_reactions
from ..energetics.insitu import DEFAULT_MINIMUM_ENERGY_KJ
from ..energetics.power import CellRequirement, PowerUnits, Supply
from ..errors import InputError
from ..species.database import default_database
from ..speciation.solver import species_in_samples

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

__all__ = ["Scenario", "load_scenario", "sweep_spec"]

_SUPPLY_FIELDS = {"flux_kg_per_s", "volume_m3", "tau_s", "areal_flux_mol_per_m2_yr", "thickness_m",
                  "limiting_species", "rate_mol_per_L_s"}


@dataclass
class Scenario:
    title: str
    samples: pd.DataFrame          # all sites' samples, with a 'site' column
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


def _site_frame(site, folder):
    name = site.get("name")
    if not name:
        raise InputError("scenario: every [[sites]] entry needs a name")
    if "samples" in site:
        path = (folder / site["samples"]).resolve()
        if not path.exists():
            raise InputError(f"scenario: site {name!r}: samples file {path} does not exist")
        frame = pd.read_csv(path, skipinitialspace=True)
    elif "fluid" in site:
        frame = pd.DataFrame([{"sample": name, **site["fluid"]}])
    else:
        raise InputError(f"scenario: site {name!r} needs 'samples' (a CSV file) or a [sites.fluid] table")
    frame.insert(0, "site", name)
    return frame


def _reactions(spec, samples):
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
            present = couples_present(species_in_samples(samples.drop(columns=["site"])))

        def pick(value):
            return present if value == "present" else None if value in (None, "all") else list(value)

        out.extend(enumerate_reactions(pick(enum.get("donors")), pick(enum.get("acceptors"))))
    if not out:
        raise InputError("scenario: [reactions] names no reactions (catalog, custom or enumerate)")
    return out


def load_scenario(path):
    """Read and check a scenario TOML file."""
    path = Path(path)
    try:
        data = tomllib.loads(path.read_text())
    except FileNotFoundError:
        raise InputError(f"scenario: file {path} does not exist") from None
    except tomllib.TOMLDecodeError as err:
        raise InputError(f"scenario: {path} is not valid TOML: {err}") from None
    sites = data.get("sites") or []
    if not sites:
        raise InputError("scenario: at least one [[sites]] entry is needed")
    frame = pd.concat([_site_frame(s, path.parent) for s in sites], ignore_index=True)
    supplies = []
    for s in data.get("supply", []):
        unknown = set(s) - _SUPPLY_FIELDS - {"kind"}
        if unknown:
            raise InputError(f"scenario: supply fields {sorted(unknown)} are unknown; known: {sorted(_SUPPLY_FIELDS)}")
        supply = Supply(**s)
        supply.describe()
        supplies.append(supply)
    cells_spec = data.get("cells", {})
    cells = CellRequirement(model=cells_spec.get("model", "tijhuis1993"),
                            cell_carbon_g=tuple(cells_spec.get("cell_carbon_g", CellRequirement().cell_carbon_g)),
                            basal_W=tuple(cells_spec.get("basal_W", CellRequirement().basal_W)))
    cells.describe()
    units = data.get("units", {})
    unknown = set(units) - {"power_per_volume", "power_per_mass"}
    if unknown:
        raise InputError(f"scenario: [units] fields {sorted(unknown)} are unknown; known: power_per_volume, power_per_mass")
    power_units = PowerUnits(per_volume=units.get("power_per_volume", "W/m3"),
                             per_mass=units.get("power_per_mass", "W/kg"))
    mixing = data.get("mixing")
    if mixing is not None:
        names = set(frame["sample"].astype(str))
        for role in ("hydrothermal", "seawater"):
            if mixing.get(role) not in names:
                raise InputError(f"scenario: [mixing] {role} = {mixing.get(role)!r} is not a sample name")
        if ("temperatures_C" in mixing) == ("fractions" in mixing):
            raise InputError("scenario: [mixing] needs either temperatures_C or fractions")
    reaction_spec = data.get("reactions", {})
    return Scenario(title=data.get("title", path.stem), samples=frame,
                    reactions=_reactions(reaction_spec, frame),
                    activity_model=data.get("activity_model", "bdot"), supplies=supplies, cells=cells,
                    power_units=power_units,
                    per_species=[default_database().resolve(x) for x in reaction_spec.get("per_species", [])],
                    minimum_energy_kJ=float(data.get("minimum_energy_kJ_per_mol", DEFAULT_MINIMUM_ENERGY_KJ)),
                    source=path, mixing=mixing, raw=data)


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
    def row(name):
        rows = scenario.samples[scenario.samples["sample"].astype(str) == str(name)]
        if rows.empty:
            raise InputError(f"scenario: sweep sample {name!r} is not a sample name")
        return {k: v for k, v in rows.iloc[0].items() if k != "site" and not (isinstance(v, float) and pd.isna(v))}

    mixing = section.get("mixing")
    if mixing:
        mixing = {"hydrothermal": row(mixing.get("hydrothermal")), "seawater": row(mixing.get("seawater")),
                  "temperature_rule": mixing.get("temperature_rule", "enthalpy")}
        base = {}
    else:
        base = row(section.get("sample"))
    inputs = {c: _distribution(c, d) for c, d in section.get("inputs", {}).items()}
    if not inputs:
        raise InputError("scenario: the sweep section names no inputs")
    return SweepSpec(base=base, inputs=inputs, reactions=tuple(x.name if x.group else str(x.reaction)
                                                                for x in scenario.reactions),
                     activity_model=scenario.activity_model, n=int(section.get("draws", 1000)),
                     chunk_size=int(section.get("chunk_size", 10_000)), seed=int(section.get("seed", 0)),
                     supply=scenario.supplies[0] if scenario.supplies else None, cells=scenario.cells,
                     power_units=scenario.power_units,
                     water=section.get("water", "exact"), mixing=mixing)
