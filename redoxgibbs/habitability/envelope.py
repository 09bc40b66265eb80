"""The habitability envelope of each sample: liquid water, physical conditions, energy, nutrients.

Each criterion is stated with its value, the limit it is compared with and the source of that
limit; a criterion whose data are missing is "not assessed", never "pass". These are screening
criteria, not evidence of life. Every limit can be set in a scenario's ``[habitability]`` section.
Defaults (from memory, each with its source):

- temperature: growth up to 122 C (Methanopyrus kandleri strain 116, Takai et al. 2008, Proc. Natl.
  Acad. Sci. USA 105, 10949); metabolic activity measured down to -20 C (Rivkina et al. 2000, Appl.
  Environ. Microbiol. 66, 3230);
- water activity: growth down to 0.585 (Stevenson et al. 2015, ISME J. 9, 1333);
- pH: growth from about 0 (Picrophilus, Schleper et al. 1995, J. Bacteriol. 177, 7050) to 12.5
  (Alkaliphilus transvaalensis, Takai et al. 2001, Int. J. Syst. Evol. Microbiol. 51, 1245);
- energy: the best reaction's |dGr| against the minimum usable energy (the scenario's, default
  Hoehler 2004), and its power against the maintenance power of the chosen cell model for a
  population of 1000 cells per cm3 (about the lowest cell densities counted in subseafloor
  sediment, Kallmeyer et al. 2012, Proc. Natl. Acad. Sci. USA 109, 16213);
- nutrients (fixed nitrogen, phosphate, sulfur, iron): present at or above thresholds that are this
  project's screening defaults, not published limits (none is universal); set your own.
"""

from dataclasses import dataclass, fields

import numpy as np
import pandas as pd

from ..errors import InputError
from ..species.database import default_database
from ..water.iapws95 import saturation_temperature_K

__all__ = ["LIMIT_SOURCES", "VERDICTS", "Limits", "habitability_envelope"]

VERDICTS = ("pass", "fail", "uncertain", "not assessed")


@dataclass(frozen=True)
class Limits:
    """The limits of the envelope (defaults: see the module notes and ``LIMIT_SOURCES``)."""

    T_max_C: float = 122.0
    T_min_C: float = -20.0
    water_activity_min: float = 0.585
    pH_min: float = 0.0
    pH_max: float = 12.5
    cells_per_cm3_min: float = 1000.0
    fixed_nitrogen_umol_per_kg_min: float = 1.0
    phosphate_umol_per_kg_min: float = 0.01
    sulfur_umol_per_kg_min: float = 1.0
    iron_umol_per_kg_min: float = 0.001

    def __post_init__(self):
        for f in fields(self):
            v = getattr(self, f.name)
            if not np.isfinite(v):
                raise InputError(f"habitability: {f.name} = {v!r} must be a finite number")
        for low, high in (("T_min_C", "T_max_C"), ("pH_min", "pH_max")):
            if getattr(self, low) >= getattr(self, high):
                raise InputError(f"habitability: {low} ({getattr(self, low):g}) must lie below {high} "
                                 f"({getattr(self, high):g})")
        if not 0 < self.water_activity_min < 1:
            raise InputError(f"habitability: water_activity_min = {self.water_activity_min:g} must lie "
                             "between 0 and 1")


PROJECT_DEFAULT = "screening default of this project, not a published limit; set your own"
LIMIT_SOURCES = {
    "T_max_C": "Takai et al. (2008) Proc. Natl. Acad. Sci. USA 105, 10949 (growth at 122 C; from memory)",
    "T_min_C": "Rivkina et al. (2000) Appl. Environ. Microbiol. 66, 3230 (activity at -20 C; from memory)",
    "water_activity_min": "Stevenson et al. (2015) ISME J. 9, 1333 (growth at a_w 0.585; from memory)",
    "pH_min": "Schleper et al. (1995) J. Bacteriol. 177, 7050 (Picrophilus, growth near pH 0; from memory)",
    "pH_max": "Takai et al. (2001) Int. J. Syst. Evol. Microbiol. 51, 1245 (growth at pH 12.5; from memory)",
    "minimum_energy": "Hoehler (2004) Geobiology 2, 205 (minimum usable energy; from memory)",
    "cells_per_cm3_min": "Kallmeyer et al. (2012) Proc. Natl. Acad. Sci. USA 109, 16213 (lowest counted "
                         "subseafloor cell densities, about 1e3 per cm3; from memory)",
    "fixed_nitrogen_umol_per_kg_min": PROJECT_DEFAULT,
    "phosphate_umol_per_kg_min": PROJECT_DEFAULT,
    "sulfur_umol_per_kg_min": PROJECT_DEFAULT,
    "iron_umol_per_kg_min": PROJECT_DEFAULT,
}


def _element_total(samples, db, element, exclude=()):
    """Total molality [mol/kg] of the measured components containing ``element`` (NaN where none of
    them was measured), per sample."""
    columns = [v for m, v in samples.totals.items()
               if element in db.record(m).elements and m not in exclude]
    if not columns:
        return np.full(len(samples), np.nan)
    stacked = np.column_stack(columns)
    known = np.isfinite(stacked).any(axis=1)
    return np.where(known, np.nansum(stacked, axis=1), np.nan)


def _verdict(ok, known):
    return np.where(~known, "not assessed", np.where(ok, "pass", "fail"))


def habitability_envelope(evaluation, limits=Limits(), minimum_energy_kJ=None, supply_index=0,
                          cells=None, rows=slice(None), db=None):
    """The envelope of the samples ``rows`` of an :class:`~redoxgibbs.pipeline.evaluate.Evaluation`:
    one row per sample x criterion (value, unit, limit, verdict, source).

    Power is that of the supply model ``supply_index`` (None, or no supply given: the power
    criterion is not assessed), against the per-cell demand of ``cells`` (a CellRequirement;
    default: the evaluation's cell model).
    """

    db = default_database() if db is None else db
    s, result, e = evaluation.samples, evaluation.speciation, evaluation.energetics
    idx = np.arange(len(s))[rows]
    minimum = e.minimum_energy_kJ if minimum_energy_kJ is None else minimum_energy_kJ
    T_C = result.T_K[idx] - 273.15
    failure = result.failure[idx].astype(str)
    computed = failure == ""
    T_freeze = np.where(computed, result.freezing_point_K()[idx] - 273.15, np.nan)
    T_boil = saturation_temperature_K(result.P_bar[idx]) - 273.15
    out = []

    def add(name, value, unit, limit, verdict, source):
        out.append(pd.DataFrame({"sample": np.asarray(result.samples, dtype=object)[idx], "criterion": name,
                                 "value": value, "unit": unit, "limit": limit, "verdict": verdict,
                                 "source": source}))

    frozen_or_vapour = np.char.startswith(failure, "frozen") | (np.char.find(failure, "vapour") >= 0)
    def liquid_range(freeze, boil, ok):
        if not ok:
            return ""
        low = f"{freeze:.2f}" if np.isfinite(freeze) else "below -20 (colder than any liquid evaluated here)"
        return f"{low} to {boil:.1f} degC" if np.isfinite(boil) else \
            f"above {low} degC (no boiling above the critical pressure)"

    liquid_limit = [liquid_range(a, b, ok) for a, b, ok in zip(T_freeze, T_boil, computed)]
    add("liquid water", T_C, "degC", liquid_limit,
        np.where(computed, "pass", np.where(frozen_or_vapour, "fail", "not assessed")),
        "the fluid's own freezing point (IAPWS R10-06 ice against its water activity) and boiling "
        "point (IAPWS-95 saturation)")
    add("temperature, upper", T_C, "degC", f"<= {limits.T_max_C:g}", _verdict(T_C <= limits.T_max_C, computed),
        LIMIT_SOURCES["T_max_C"])
    add("temperature, lower", T_C, "degC", f">= {limits.T_min_C:g}", _verdict(T_C >= limits.T_min_C, computed),
        LIMIT_SOURCES["T_min_C"])
    aw = 10 ** result.log10_water_activity[idx]
    add("water activity", aw, "-", f">= {limits.water_activity_min:g}",
        _verdict(aw >= limits.water_activity_min, computed & np.isfinite(aw)), LIMIT_SOURCES["water_activity_min"])
    pH = result.pH[idx]
    add("pH", pH, "-", f"{limits.pH_min:g} to {limits.pH_max:g}",
        _verdict((pH >= limits.pH_min) & (pH <= limits.pH_max), computed & np.isfinite(pH)),
        f"{LIMIT_SOURCES['pH_min']}; {LIMIT_SOURCES['pH_max']}")
    dGr = e.dGr[idx]
    with np.errstate(invalid="ignore"):
        best = np.nanmax(np.where(np.isfinite(dGr), -dGr / 1e3, -np.inf), axis=1) if dGr.size else np.full(idx.size, -np.inf)
    known = np.isfinite(best)
    add("energy: best reaction's -dGr", np.where(known, best, np.nan), "kJ/mol", f">= {minimum:g}",
        _verdict(best >= minimum, known), LIMIT_SOURCES["minimum_energy"])
    _power_criterion(add, evaluation, idx, limits, supply_index, evaluation.cells if cells is None else cells)
    for name, element, exclude, key in (
            ("nutrient: fixed nitrogen", "N", ("N2(aq)", "N2O(aq)"), "fixed_nitrogen_umol_per_kg_min"),
            ("nutrient: phosphate", "P", (), "phosphate_umol_per_kg_min"),
            ("nutrient: sulfur", "S", (), "sulfur_umol_per_kg_min"),
            ("nutrient: iron", "Fe", (), "iron_umol_per_kg_min")):
        total = _element_total(s, db, element, exclude)[idx] * 1e6
        add(name, total, "umol/kg", f">= {getattr(limits, key):g}",
            _verdict(total >= getattr(limits, key), np.isfinite(total)), LIMIT_SOURCES[key])
    frame = pd.concat(out, ignore_index=True)
    order = {name: k for k, name in enumerate(dict.fromkeys(frame["sample"]))}
    return frame.sort_values("sample", key=lambda c: c.map(order), kind="stable").reset_index(drop=True)


def _power_criterion(add, evaluation, idx, limits, supply_index, cells):
    """The best reaction's power against the maintenance power of limits.cells_per_cm3_min cells:
    pass when even the high per-cell demand is met, fail when not even the low one is."""
    if not evaluation.supplies or supply_index is None:
        add("energy: power for cells", np.nan, "cells/cm3", f">= {limits.cells_per_cm3_min:g}", "not assessed",
            "no supply model given")
        return
    # the evaluation's own cell numbers (per m3, sample x reaction), of the best reaction, per cm3
    columns = evaluation.power_columns(supply_index, idx, cells)
    n_r = len(evaluation.energetics.reactions)
    low, high = (columns[c].reshape(idx.size, n_r) for c in ("cells_per_m3_low", "cells_per_m3_high"))
    finite = np.isfinite(high).any(axis=1) if high.size else np.zeros(idx.size, bool)
    cells_low, cells_high = (np.where(finite, np.nanmax(np.where(np.isfinite(x), x, -np.inf), axis=1), np.nan) / 1e6
                             for x in (low, high))
    need = limits.cells_per_cm3_min
    verdict = np.where(~finite, "not assessed", np.where(cells_low >= need, "pass",
                                                         np.where(cells_high < need, "fail", "uncertain")))
    supply = evaluation.supplies[supply_index].describe()
    add("energy: power for cells", cells_high, "cells/cm3 (high end)", f">= {need:g}", verdict,
        f"{LIMIT_SOURCES['cells_per_cm3_min']}; power of {supply}; {cells.describe()}")
