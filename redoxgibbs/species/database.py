"""Species data: loading the plain-text tables of species_data/ into validated records.

Five kinds of record, one per standard-state model: ``hkf`` (aqueous, revised HKF; regressed
parameters, or parameters estimated from 25 C properties by the published correlations), ``formation``
(aqueous or solid, from a formation reaction of other species), ``nasa7`` (ideal gas),
``maier_kelley`` (solid) and ``iapws95`` (the solvent). Users add their own CSV files with the
same columns and pass them to :func:`load_species_data`; the file kind is told by its columns.
"""

import difflib
import functools
import math
from dataclasses import dataclass, field, replace
from importlib import resources
from pathlib import Path

import numpy as np
import pandas as pd

from ..constants import R_J_MOL_K, T_REF_K
from ..errors import InputError, SpeciesDataError, UnknownSpeciesError
from ..standard_state.hkf_estimates import (
    OMEGA_ENTROPY_SLOPE,
    a1_constant_nonsolvation_volume,
    c1_closing_heat_capacity,
    c2_from_heat_capacity_shock_helgeson_1988,
    omega_from_entropy_shock_helgeson_1990,
)
from ..units import CAL_TO_J
from ..water.born import reference_born_functions
from .checks import check_database
from .elements import formation_entropy_offset
from .equation import split_reaction
from .formula import canonical_name, parse_formula, split_charge

__all__ = ["R_J_MOL_K", "SpeciesDatabase", "SpeciesRecord", "default_database", "load_species_data"]



@dataclass(frozen=True)
class SpeciesRecord:
    """One species: identity, reference values at 25 C, 1 bar [J, mol, K] and model parameters."""

    name: str
    formula: str
    elements: dict
    charge: int
    state: str                     # 'aq', 'gas', 'solid' or 'liquid'
    model: str                     # 'hkf', 'formation', 'nasa7', 'maier_kelley', 'iapws95'
    G_f: float                     # J/mol
    H_f: float                     # J/mol
    S: float                       # J/mol/K
    params: dict = field(repr=False)
    source: str = ""
    from_memory: bool = False


def _read_table(path):
    return pd.read_csv(path, comment="#", skipinitialspace=True, dtype={"name": str})


def _blank(value):
    return value is None or (isinstance(value, float) and math.isnan(value))


def _memory(row):
    return str(row.get("entered_from", "")).strip().lower() == "memory"


def _elements(row, path):
    try:
        return dict(parse_formula(str(row["formula"])))
    except InputError as err:
        raise SpeciesDataError(f"{path}: species {row['name']}: {err}") from None


def _hkf_records(table, path):
    for _, row in table.iterrows():
        c = CAL_TO_J
        linear = np.array([row["G_f"], row["H_f"], row["S"], row["a1x10"] / 10, row["a2x1e-2"] * 1e2,
                           row["a3"], row["a4x1e-4"] * 1e4, row["c1"], row["c2x1e-4"] * 1e4], dtype=float)
        yield SpeciesRecord(
            name=row["name"], formula=row["formula"], elements=_elements(row, path),
            charge=int(row["charge"]), state="aq", model="hkf",
            G_f=row["G_f"] * c, H_f=row["H_f"] * c, S=row["S"] * c,
            params={"linear_cal": linear, "omega_ref_cal": row["omegax1e-5"] * 1e5,
                    "Cp_tab_J": None if _blank(row["Cp"]) else row["Cp"] * c,
                    "V_tab_cm3": None if _blank(row["V"]) else float(row["V"])},
            source=row["source"], from_memory=_memory(row))


def _entropy_offsets_by_charge(hkf_records):
    """beta_Z of the omega-entropy correlation, per charge Z, from the regressed HKF ions:
    the median of omega + 1514.4 S over the ions of that charge (0 for neutral species)."""

    by_charge = {}
    for r in hkf_records:
        if r.charge != 0 and r.name != "H+":
            by_charge.setdefault(r.charge, []).append(
                r.params["omega_ref_cal"] - OMEGA_ENTROPY_SLOPE * r.S / CAL_TO_J)
    return {0: 0.0, **{z: float(np.median(v)) for z, v in by_charge.items()}}


def _estimated_hkf_records(table, path, hkf_records):
    """HKF records whose parameters come from 25 C properties through the published correlations
    (:mod:`redoxgibbs.standard_state.hkf_estimates`)."""

    born = reference_born_functions()
    X_r, Q_r = float(born.X), float(born.Q)
    beta = _entropy_offsets_by_charge(hkf_records)
    for _, row in table.iterrows():
        z = int(row["charge"])
        if z not in beta:
            raise SpeciesDataError(f"{path}: {row['name']}: no regressed HKF ion of charge {z} to set "
                                   "the omega-entropy correlation")
        G, H = row["G_f_kJ_mol"] * 1e3 / CAL_TO_J, row["H_f_kJ_mol"] * 1e3 / CAL_TO_J
        S, Cp = row["S_J_mol_K"] / CAL_TO_J, row["Cp_J_mol_K"] / CAL_TO_J
        omega = float(omega_from_entropy_shock_helgeson_1990(S, beta[z]))
        c2 = float(c2_from_heat_capacity_shock_helgeson_1988(Cp))
        c1 = float(c1_closing_heat_capacity(Cp, c2, omega, X_r))
        a1 = float(a1_constant_nonsolvation_volume(row["V_cm3_mol"], omega, Q_r))
        yield SpeciesRecord(
            name=row["name"], formula=row["formula"], elements=_elements(row, path), charge=z,
            state="aq", model="hkf", G_f=G * CAL_TO_J, H_f=H * CAL_TO_J, S=S * CAL_TO_J,
            params={"linear_cal": np.array([G, H, S, a1, 0.0, 0.0, 0.0, c1, c2]), "omega_ref_cal": omega,
                    "Cp_tab_J": float(row["Cp_J_mol_K"]), "V_tab_cm3": float(row["V_cm3_mol"]),
                    "estimated": row["method"]},
            source=row["source"] + "; parameters: " + row["method"], from_memory=_memory(row))


def _gas_records(table, path):
    for _, row in table.iterrows():
        yield SpeciesRecord(
            name=row["name"], formula=row["formula"], elements=_elements(row, path), charge=0,
            state="gas", model="nasa7", G_f=row["G_f_kJ_mol"] * 1e3, H_f=row["H_f_kJ_mol"] * 1e3,
            S=float(row["S_J_mol_K"]),
            params={"nasa_name": row["nasa_name"], "Cp_tab_J": float(row["Cp_J_mol_K"])},
            source=row["source"], from_memory=_memory(row))


def _water_records(table, path):
    for _, row in table.iterrows():
        c = CAL_TO_J
        yield SpeciesRecord(
            name=row["name"], formula=row["formula"], elements=_elements(row, path), charge=0,
            state="liquid", model="iapws95", G_f=row["G_f_cal"] * c, H_f=row["H_f_cal"] * c,
            S=row["S_cal_K"] * c, params={}, source=row["source"], from_memory=_memory(row))


def _mineral_records(table, path, heat_capacity):
    for _, row in table.iterrows():
        segs = heat_capacity[heat_capacity["name"] == row["name"]]
        if segs.empty:
            raise SpeciesDataError(f"{path}: mineral {row['name']} has no heat-capacity segments")
        c = CAL_TO_J
        segments = [
            (s["a"] * c, s["b_x1e3"] * 1e-3 * c, s["c_x1e-5"] * 1e5 * c, float(s["T_max_K"]),
             0.0 if _blank(s["dH_transition_cal"]) else s["dH_transition_cal"] * c)
            for _, s in segs.iterrows()]
        yield SpeciesRecord(
            name=row["name"], formula=row["formula"], elements=_elements(row, path), charge=0,
            state="solid", model="maier_kelley", G_f=row["G_f"] * c, H_f=row["H_f"] * c,
            S=row["S"] * c, params={"segments": segments, "V_cm3": float(row["V"])},
            source=row["source"], from_memory=_memory(row))


class SpeciesDatabase:
    """Validated species records, looked up by canonical name, by any charge notation or alias."""

    def __init__(self, records):
        self._records = {}
        for rec in records:
            if rec.name in self._records:
                raise SpeciesDataError(f"species {rec.name!r} is defined twice")
            self._records[rec.name] = rec

    def __contains__(self, name):
        return name in self._records

    def __len__(self):
        return len(self._records)

    @property
    def names(self):
        """Canonical names of every species in the data, in load order."""
        return list(self._records)

    def record(self, name):
        """The SpeciesRecord of a species (by canonical name or alias); unknown names are refused with the
        nearest known ones."""
        return self._records[self.resolve(name)]

    def resolve(self, text):
        """Canonical name of the species written ``text``; suggests near names when unknown."""
        text = text.strip()
        if text in self._records:
            return text
        candidates = [canonical_name(text)]
        body, charge, state = split_charge(text)
        if charge == 0 and state in ("", "s", "cr"):
            # a formula with (s), or a neutral formula without a state, when it is unambiguous
            matches = [r.name for r in self._records.values()
                       if r.formula == body and r.charge == 0
                       and (r.state == "solid" or not state)]
            if len(matches) == 1:
                return matches[0]
            if len(matches) > 1:
                raise UnknownSpeciesError(
                    f"species {text!r} is ambiguous: write one of {', '.join(sorted(matches))}")
        if state == "aq" and charge != 0:
            candidates.append(body + canonical_name(text)[len(body):])
        for cand in candidates:
            if cand in self._records:
                return cand
        near = difflib.get_close_matches(canonical_name(text), self._records, n=4, cutoff=0.5)
        hint = f"; did you mean {', '.join(near)}?" if near else ""
        raise UnknownSpeciesError(f"species {text!r} is not in the species data{hint}")


def _formation_records(table, path, known):
    """Formation records in dependency order; ``known`` maps names to already loaded records."""
    pending = {row["name"]: row for _, row in table.iterrows()}
    lookup = SpeciesDatabase(known.values())
    out = []
    while pending:
        progressed = False
        for name, row in list(pending.items()):
            terms = split_reaction(row["formation"])
            others = [(c, s) for c, s in terms if s.strip() != name]
            product = [c for c, s in terms if s.strip() == name]
            if product != [1.0]:
                raise SpeciesDataError(f"{path}: {name}: its formation reaction must make one {name}")
            try:
                parents = [(c, lookup.resolve(s)) for c, s in others]
            except UnknownSpeciesError:
                continue
            recs = {**known, **{r.name: r for r in out}}
            dG_parents = sum(c * recs[p].G_f for c, p in parents)   # reactants carry c < 0
            dH_parents = sum(c * recs[p].H_f for c, p in parents)
            dS_parents = sum(c * recs[p].S for c, p in parents)
            if not _blank(row["logK_25C"]):
                dG_r = -R_J_MOL_K * T_REF_K * math.log(10) * row["logK_25C"]
                dH_r = 0.0 if _blank(row["dH_r_kJ_mol"]) else row["dH_r_kJ_mol"] * 1e3
                G_f, H_f = dG_r - dG_parents, dH_r - dH_parents
                S = (dH_r - dG_r) / T_REF_K - dS_parents
                own = False
            else:
                G_f, H_f = row["G_f_kJ_mol"] * 1e3, row["H_f_kJ_mol"] * 1e3
                S = float(row["S_J_mol_K"])
                dG_r, dH_r = G_f + dG_parents, H_f + dH_parents
                own = True
            rec = SpeciesRecord(
                name=name, formula=row["formula"], elements=_elements(row, path),
                charge=int(row["charge"]), state=row["state"], model="formation",
                G_f=G_f, H_f=H_f, S=S,
                params={"parents": parents, "dG_r_J": dG_r, "dH_r_J": dH_r,
                        "T_range_C": (float(row.get("T_min_C", 0.0)), float(row["T_max_C"])), "dH_r_missing":
                        not own and _blank(row["dH_r_kJ_mol"]), "tabulated_own_values": own,
                        "reaction": row["formation"]},
                source=row["source"], from_memory=_memory(row))
            out.append(rec)
            lookup = SpeciesDatabase(list(known.values()) + out)
            del pending[name]
            progressed = True
        if not progressed:
            raise SpeciesDataError(
                f"{path}: formation reactions of {sorted(pending)} name species that are not loaded")
    return out


def _consistent_enthalpy(rec):
    """The record with H_f replaced by G_f + Tr (S - sum of element entropies).

    G_f and S fix log K at every temperature; the tabulated H_f, rounded separately, disagrees
    with them by up to the loader's tolerance (0.4 kJ/mol). Taking the consistent value makes
    G = H - TS hold exactly for every balanced reaction. The tabulated value is kept in
    ``params['H_f_tabulated_J']`` for the checks.
    """

    H_f = rec.G_f + T_REF_K * (rec.S - formation_entropy_offset(rec.elements, rec.charge))
    params = dict(rec.params, H_f_tabulated_J=rec.H_f)
    if rec.model == "hkf":
        linear = rec.params["linear_cal"].copy()
        linear[1] = H_f / CAL_TO_J
        params["linear_cal"] = linear
    return replace(rec, H_f=H_f, params=params)


def _kind(columns):
    cols = set(columns)
    if "a1x10" in cols:
        return "hkf"
    if "formation" in cols:
        return "formation"
    if "V_cm3_mol" in cols and "method" in cols:
        return "hkf_estimated"
    if "nasa_name" in cols:
        return "gas"
    if "G_f_cal" in cols:
        return "water"
    if "V" in cols and "G_f" in cols:
        return "mineral"
    if "T_max_K" in cols:
        return "heat_capacity"
    if "test" in cols and "check" in cols:
        return "verification"  # the verification ledger (species/ledger.py), not a species record
    if "ion_size_angstrom" in cols or {"kind", "parameter", "form"} <= cols:
        return "activity"  # ion sizes, Pitzer parameters: read by the activity layer, not species records
    raise SpeciesDataError(f"species file with columns {sorted(cols)} is of no known kind")


def _default_files():
    folder = resources.files("redoxgibbs.species_data")
    return sorted(Path(str(p)) for p in folder.iterdir() if str(p).endswith(".csv"))


def load_species_data(extra_files=(), check=True):
    """Load species_data/ plus ``extra_files`` (user CSVs of the same kinds) and validate them.

    With ``check`` (the default) every record is validated (see :mod:`.checks`) and a
    :class:`~redoxgibbs.errors.SpeciesDataError` lists each failing check and by how much.
    """
    tables = {"hkf": [], "hkf_estimated": [], "formation": [], "gas": [], "water": [], "mineral": [], "heat_capacity": [],
              "activity": [], "verification": []}
    for path in list(_default_files()) + [Path(p) for p in extra_files]:
        if not path.exists():
            raise InputError(f"species data: file {path} does not exist")
        table = _read_table(path)
        tables[_kind(table.columns)].append((path, table))
    records = {}

    def add(recs):
        for r in recs:
            if r.name in records:
                raise SpeciesDataError(f"species {r.name!r} is defined twice")
            records[r.name] = r

    for path, t in tables["hkf"]:
        add(_hkf_records(t, path))
    regressed = list(records.values())
    for path, t in tables["hkf_estimated"]:
        add(_estimated_hkf_records(t, path, regressed))
    for path, t in tables["gas"]:
        add(_gas_records(t, path))
    for path, t in tables["water"]:
        add(_water_records(t, path))
    heat_capacity = pd.concat([t for _, t in tables["heat_capacity"]]) if tables["heat_capacity"] else None
    for path, t in tables["mineral"]:
        add(_mineral_records(t, path, heat_capacity))
    for path, t in tables["formation"]:
        add(_formation_records(t, path, dict(records)))
    db = SpeciesDatabase(_consistent_enthalpy(r) for r in records.values())
    if check:

        problems = check_database(db)
        if problems:
            raise SpeciesDataError("species data failed its checks:\n  " + "\n  ".join(problems))
    return db


@functools.lru_cache(maxsize=1)
def default_database():
    """The bundled species data (``species_data/``), loaded and checked once.

    Returns
    -------
    SpeciesDatabase
        Every species record (its model, parameters, source and whether entered from memory); the
        loader's checks (G, H, S consistency, Cp and V at 25 C, NASA data) have passed.
    """
    return load_species_data()
