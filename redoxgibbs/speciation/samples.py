"""Sample tables as labs report them, turned into molalities at 1 kg of water.

Tables are CSV files or Excel workbooks (.xlsx). Contract (one row per sample; other columns may
be added and are ignored):
``sample``, ``T [degC]``, ``P [bar]`` (a number or ``psat``), ``pH``, optionally ``pH T [degC]``
and ``density [g/cm3]``; composition columns ``SPECIES [UNIT]`` holding the analytical total of
that species' component; gas columns ``GAS(g) [bar|atm|Pa|MPa]`` fixing its fugacity. Blank cells
mean "not measured". Amount units: mol/kg, mmol/kg, umol/kg, nmol/kg (per kg of water),
mol/kg-solution (and m-, u-, n-), mol/L (and m-, u-, n-), mg/L, ug/L, ppm and ppb (by mass).
"""

import re
from dataclasses import dataclass, field

import numpy as np
import pandas as pd

from ..errors import InputError, UnknownSpeciesError
from ..flags import T_AT_FREEZING, join_flags
from ..reactions.reaction import reaction_properties
from ..species.database import default_database
from ..species.elements import molar_mass_g_mol
from ..species.properties import VALIDITY
from ..units import to_unit
from ..water.iapws95 import (
    T_CRITICAL_K,
    liquid_density_kg_m3,
    psat_convention_bar,
    saturation_pressure_bar,
)
from ..water.melting import melting_temperature
from .system import _heavy_elements, decompose

__all__ = ["SampleSet", "merge_sample_sets", "parse_column_header", "read_sample_table", "read_samples",
           "read_workbook"]

_HEADER = re.compile(r"^\s*(.+?)\s*\[\s*(.+?)\s*\]\s*$")
_PREFIX = {"": 1.0, "m": 1e-3, "u": 1e-6, "n": 1e-9}
# amount units -> (basis, factor to mol or kg-scale)
_AMOUNT_UNITS = {}
for p, f in _PREFIX.items():
    _AMOUNT_UNITS[f"{p}mol/kg"] = ("per_kg_water", f)
    _AMOUNT_UNITS[f"{p}mol/kg-solution"] = ("per_kg_solution", f)
    _AMOUNT_UNITS[f"{p}mol/l"] = ("per_litre", f)
    _AMOUNT_UNITS[f"{p}m"] = ("per_litre", f)   # molar: M, mM, uM, nM
_MASS_UNITS = {"mg/l": ("per_litre", 1e-3), "ug/l": ("per_litre", 1e-6),
               "ppm": ("per_kg_solution", 1e-3), "ppb": ("per_kg_solution", 1e-6)}
_GAS_UNITS = ("bar", "atm", "pa", "mpa", "kpa")
#: Columns giving a position in a body's ocean instead of a pressure (lower-case names)
OCEAN_POSITION_COLUMNS = ("depth", "above seafloor")
SEAWATER_DENSITY_SLOPE = 0.73  # kg/L per kg/kg of dissolved solids, estimate stated in output
WATER_DENSITY_25C_KG_L = 0.997047   # IAPWS-95 at 25 C, 1 bar


def parse_column_header(header):
    """(name, unit) of a ``'NAME [UNIT]'`` header, or (header, None)."""
    m = _HEADER.match(str(header))
    return (m.group(1), m.group(2)) if m else (str(header).strip(), None)


@dataclass
class SampleSet:
    """Samples as arrays (n samples); totals in mol per kg of water, NaN where not measured."""

    names: list
    T_K: np.ndarray
    P_bar: np.ndarray
    pH: np.ndarray                 # NaN: not given (solve from charge balance if asked)
    pH_T_K: np.ndarray             # temperature at which pH was measured
    totals: dict                   # component master species -> molality array
    gas_fugacity_bar: dict         # gas species -> fugacity array
    density_kg_L: np.ndarray
    density_estimated: np.ndarray
    notes: list = field(default_factory=list)
    problems: np.ndarray = None    # per sample: why it cannot be computed ('' where it can)
    alkalinity_eq_kg: np.ndarray = None   # total alkalinity [eq per kg of water], NaN: not given
    flags: np.ndarray = None       # per sample: input notes (values assumed or below detection)
    at_freezing: np.ndarray = None  # per sample: T is to be the fluid's own freezing point at P

    def __post_init__(self):
        n = len(self.names)
        if self.at_freezing is None:
            self.at_freezing = np.zeros(n, bool)
        if self.problems is None:
            self.problems = np.full(n, "", dtype=object)
        if self.alkalinity_eq_kg is None:
            self.alkalinity_eq_kg = np.full(n, np.nan)
        if self.flags is None:
            self.flags = np.full(n, "", dtype=object)

    def __len__(self):
        return len(self.names)

    def subset(self, keep):
        """The samples where the boolean mask ``keep`` is set, as a new SampleSet."""
        idx = np.flatnonzero(keep)
        pick = lambda a: a[idx]
        return SampleSet(
            names=[self.names[i] for i in idx], T_K=pick(self.T_K), P_bar=pick(self.P_bar),
            pH=pick(self.pH), pH_T_K=pick(self.pH_T_K), totals={k: pick(v) for k, v in self.totals.items()},
            gas_fugacity_bar={k: pick(v) for k, v in self.gas_fugacity_bar.items()},
            density_kg_L=pick(self.density_kg_L), density_estimated=pick(self.density_estimated),
            notes=list(self.notes), problems=pick(self.problems),
            alkalinity_eq_kg=pick(self.alkalinity_eq_kg), flags=pick(self.flags),
            at_freezing=pick(self.at_freezing))

    def insitu_density_kg_L(self, W, water_density_kg_m3):
        """Density of each fluid at its in-situ T, P [kg/L]: a measured (laboratory) density scaled
        by the density of water at T, P over that at 25 C, 1 bar; otherwise the density of water at
        T, P plus the salinity correction SEAWATER_DENSITY_SLOPE (1 - W) (stated estimate, about
        1 % for seawater-like fluids)."""
        rho_w = np.asarray(water_density_kg_m3, float) / 1000.0
        return np.where(np.isnan(self.density_kg_L), rho_w + SEAWATER_DENSITY_SLOPE * (1 - W),
                        self.density_kg_L * rho_w / WATER_DENSITY_25C_KG_L)

    def water_fraction_and_density(self, db):
        """kg water per kg solution and density [kg/L] at the laboratory, 25 C (measured, or
        estimated as on reading)."""
        mass = np.zeros(len(self.names)) + sum(np.nan_to_num(m) * molar_mass_g_mol(db.record(s).elements) / 1000.0
                                               for s, m in self.totals.items())
        W = 1.0 / (1.0 + mass)
        rho = np.where(np.isnan(self.density_kg_L), 0.997 + SEAWATER_DENSITY_SLOPE * (1 - W),
                       self.density_kg_L)
        return W, rho


def _numeric(frame, column, row_labels, allow_blank=True, low=None, high=None, what="value"):
    raw = frame[column]
    values = pd.to_numeric(raw, errors="coerce").to_numpy(dtype=float)
    bad = np.isnan(values) & raw.notna().to_numpy()
    if bad.any():   # text cells: only blanks may be non-numbers
        bad[bad] = (raw[bad].astype(str).str.strip() != "").to_numpy()
    if bad.any():
        i = int(np.flatnonzero(bad)[0])
        raise InputError(f"row {row_labels[i]}, column {column!r}: {raw.iloc[i]!r} is not a number")
    if np.isinf(values).any():
        i = int(np.flatnonzero(np.isinf(values))[0])
        raise InputError(f"row {row_labels[i]}, column {column!r}: {raw.iloc[i]!r} is not a finite {what}")
    if not allow_blank and np.isnan(values).any():
        i = int(np.flatnonzero(np.isnan(values))[0])
        raise InputError(f"row {row_labels[i]}, column {column!r}: a {what} is required")
    for limit, test, word in ((low, np.less, "below"), (high, np.greater, "above")):
        if limit is not None:
            out = test(values, limit) & ~np.isnan(values)
            if out.any():
                i = int(np.flatnonzero(out)[0])
                raise InputError(f"row {row_labels[i]}, column {column!r}: {values[i]:g} is {word} "
                                 f"the allowed {what} range limit {limit:g}")
    return values


def _names_a_species(name, db):
    try:
        db.resolve(name)
        return True
    except UnknownSpeciesError:
        return False


def _pressures(frame, labels, T_K):
    col = next((c for c in frame.columns if parse_column_header(c)[0] == "P"), None)
    if col is None:
        raise InputError("samples: a pressure column 'P [bar]' is required (a number or 'psat')")
    unit = parse_column_header(col)[1] or "bar"
    text = frame[col].astype(str).str.strip().str.lower()
    is_psat = (text == "psat").to_numpy()
    P = np.empty(len(frame))
    # 'psat' has no meaning above the critical temperature: such rows keep NaN, and fail on their own
    defined = is_psat & (T_K < T_CRITICAL_K - 1.0)
    P[is_psat & ~defined] = np.nan
    if defined.any():
        P[defined] = psat_convention_bar(T_K[defined])
    if (~is_psat).any():
        sub = frame.loc[~is_psat, [col]]
        values = _numeric(sub, col, [labels[i] for i in np.flatnonzero(~is_psat)], allow_blank=False,
                          low=0.0, what="pressure")
        P[~is_psat] = to_unit(values, unit, "bar", f"column {col!r}")
    return P


def _state_problems(T_K, P_bar, t_col):
    """Per row, why the state lies outside the engine's range ('' where it does not); ice and
    vapour are screened by the speciation against the water equation of state."""
    problems = np.full(T_K.shape, "", dtype=object)
    problems[np.isnan(P_bar)] = ("outside validity: P 'psat' is defined only below the critical temperature "
                                 "(373.946 degC; here up to 372.9 degC); give a pressure")
    for bad, what in ((P_bar > VALIDITY["P_max_bar"], "'P [bar]' above 5000 bar"),
                      (T_K < VALIDITY["T_min_K"], f"{t_col!r} below -20 degC, colder than any liquid water here"),
                      (T_K > VALIDITY["T_max_K"], f"{t_col!r} above 1000 degC")):
        problems[bad] = (f"outside validity: {what}, the range of the revised HKF equations; give a "
                         "state within -20 to 1000 degC and up to 5000 bar")
    return problems


def _read_csv(path):
    """The CSV at ``path``, or one of the project's errors naming the file problem."""
    try:
        return pd.read_csv(path, skipinitialspace=True)
    except FileNotFoundError:
        raise InputError(f"samples: file {path} does not exist") from None
    except IsADirectoryError:
        raise InputError(f"samples: {path} is a folder; give the sample table's CSV file") from None
    except pd.errors.EmptyDataError:
        raise InputError(f"samples: file {path} is empty; give a header row and one row per sample") from None
    except UnicodeDecodeError:
        raise InputError(f"samples: file {path} is not UTF-8 text; save it as CSV (UTF-8)") from None
    except (pd.errors.ParserError, ValueError) as err:
        raise InputError(f"samples: file {path} is not a readable CSV table ({err})") from None


EXCEL_SUFFIXES = (".xlsx", ".xlsm")


def read_sample_table(path, sheet=None):
    """The sample table at ``path`` as written (a DataFrame), its file and header problems refused.

    CSV, or an Excel workbook (.xlsx): the sheet ``sheet``, or every sheet one after the other
    (see :func:`read_workbook` for one table per sheet).
    """
    if str(path).lower().endswith(EXCEL_SUFFIXES):
        sheets = read_workbook(path, sheet)
        return next(iter(sheets.values())) if len(sheets) == 1 else pd.concat(sheets.values(), ignore_index=True)
    frame = _read_csv(path)
    _check_columns(_csv_header(path))
    return frame


def read_workbook(path, sheet=None):
    """The sample tables of an Excel workbook, {sheet name: DataFrame} (only ``sheet`` when given),
    each sheet's first row its header; empty sheets are skipped."""
    try:
        raw = pd.read_excel(path, sheet_name=sheet if sheet is not None else None, header=None, dtype=object)
    except FileNotFoundError:
        raise InputError(f"samples: file {path} does not exist") from None
    except ValueError as err:   # an unknown sheet name, or not a workbook
        raise InputError(f"samples: {path}: {err}") from None
    except Exception as err:    # a damaged or encrypted file: openpyxl's own errors
        raise InputError(f"samples: {path} cannot be read as an Excel workbook ({err})") from None
    raw = {sheet: raw} if sheet is not None else raw
    out = {}
    for name, table in raw.items():
        table = table.dropna(how="all").dropna(axis=1, how="all")
        if table.empty:
            continue
        header = [str(c).strip() for c in table.iloc[0]]
        _check_columns(header)
        frame = table.iloc[1:].reset_index(drop=True)
        frame.columns = header
        out[name] = frame.infer_objects()
    if not out:
        raise InputError(f"samples: {path} holds no sample table (every sheet is empty)")
    return out


def _csv_header(path):
    """The header cells as written (pandas renames repeated names, so read them directly)."""
    import csv

    with open(path, newline="", encoding="utf-8") as f:
        return [c.strip() for c in next(csv.reader(f), [])]


def _check_columns(columns):
    """Refuse repeated columns, and headers that look like 'NAME [UNIT]' but do not parse."""
    seen = set()
    for c in columns:
        if c in seen:
            raise InputError(f"column {c!r} is given twice; keep one")
        seen.add(c)
        if ("[" in c or "]" in c) and parse_column_header(c)[1] is None:
            raise InputError(f"column {c!r}: cannot read the header; write it as NAME [UNIT], "
                             "e.g. 'Na+ [mmol/kg]'")


def _sample_names(column):
    """Sample names as text; blank or repeated names are refused by row."""
    names = ["" if pd.isna(v) else str(v).strip() for v in column]
    seen = {}
    for i, name in enumerate(names):
        if not name:
            raise InputError(f"row {i + 1} (counting data rows from 1), column 'sample': the sample "
                             "name is blank; give every sample a name")
        if name in seen:
            raise InputError(f"rows {seen[name] + 1} and {i + 1}, column 'sample': the name {name!r} "
                             "is used twice; give every sample its own name")
        seen[name] = i
    return names


def read_samples(source, db=None, below_detection="not-measured", body=None):
    """Read a sample table into a :class:`SampleSet`, validating each cell.

    Amounts are converted once, here, to molalities [mol per kg of water] (per-litre and per-kg-of-
    solution units through the sample's density, measured or estimated and flagged).

    Parameters
    ----------
    source : str, path or pandas.DataFrame
        A CSV file, an Excel workbook (.xlsx; its sheets one after the other) or a DataFrame with
        columns ``sample``, ``T [degC]``, ``P [bar]`` (or ``psat``), ``pH`` and ``SPECIES [UNIT]``.
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).
    below_detection : {'not-measured', 'detection-limit', 'half-limit'}
        How cells reported below the detection limit ('<0.1', 'bdl', 'nd') are taken; each is
        noted in the sample's flags.
    body : Body, optional
        An icy body: positions in its ocean (``depth [km]`` below the ice-ocean interface, or
        ``above seafloor [km]``) stand for ``P [bar]``, and a temperature cell reading ``freezing``
        (or blank at depth 0) is the fluid's own freezing point, settled by the speciation.

    Returns
    -------
    SampleSet
        The samples as arrays: T [K], P [bar], pH, totals [mol/kg], gas fugacities [bar], flags and,
        per sample, the reason it cannot be computed ('' where it can).
    """
    db = default_database() if db is None else db
    if isinstance(source, pd.DataFrame):
        frame = source.copy()
        _check_columns([str(c).strip() for c in frame.columns])
    else:
        frame = read_sample_table(source)
    frame.columns = [str(c).strip() for c in frame.columns]
    if "sample" not in frame.columns:
        raise InputError("samples: a 'sample' column (the sample names) is required")
    labels = _sample_names(frame["sample"])
    headers = {c: parse_column_header(c) for c in frame.columns}
    t_col = next((c for c, (n, u) in headers.items() if n == "T"), None)
    if t_col is None:
        raise InputError("samples: a temperature column 'T [degC]' is required")
    depth_col = _ocean_position_column(headers, body)
    depth = None if depth_col is None else _ocean_depth(frame, depth_col, headers[depth_col], labels, body)
    at_freezing = _freezing_cells(frame, t_col, depth)
    given = ~at_freezing
    T_K = np.full(len(frame), np.nan)
    T_K[given] = to_unit(_numeric(frame.loc[given], t_col, [labels[i] for i in np.flatnonzero(given)],
                                  allow_blank=False, what="temperature"),
                         headers[t_col][1] or "degC", "kelvin", f"column {t_col!r}")
    if depth is None:
        P = _pressures(frame, labels, T_K)
    else:   # pure water's melting temperature until the speciation settles the fluid's own
        P = np.full(len(frame), body.interface_pressure_bar())
        T_K = np.where(at_freezing, melting_temperature(P * 1e5), T_K)
    problems = _state_problems(T_K, P, t_col)
    pH = _numeric(frame, "pH", labels, low=-2.0, high=16.0, what="pH") if "pH" in frame else np.full(len(frame), np.nan)
    pht_col = next((c for c, (n, u) in headers.items() if n == "pH T"), None)
    pH_T_K = T_K.copy()
    pht_given = np.zeros(len(frame), bool)
    if pht_col:
        given = _numeric(frame, pht_col, labels, what="temperature")
        has = pht_given = ~np.isnan(given)
        pH_T_K[has] = to_unit(given[has], headers[pht_col][1] or "degC", "kelvin", f"column {pht_col!r}")
    totals_raw, gases, reserved, columns_of = {}, {}, {"sample", "pH", t_col, pht_col, depth_col}, {}
    density = np.full(len(frame), np.nan)
    flags = np.full(len(frame), "", dtype=object)
    for col, (name, unit) in headers.items():
        if col in reserved or name == "P":
            continue
        if name == "density":
            density = _numeric(frame, col, labels, low=0.5, high=2.0, what="density") * \
                to_unit(1.0, unit or "g/cm3", "kg/L", f"column {col!r}")
            continue
        if unit is None:
            if _names_a_species(name, db) or name.lower() in ("alkalinity", "dic"):
                raise InputError(f"column {col!r}: give the amount's unit in brackets, e.g. '{name} [mmol/kg]'")
            continue  # free-text or extra columns are ignored
        key = unit.strip().lower().replace("µ", "u").replace("μ", "u").replace(" ", "")
        if name.lower() == "alkalinity":
            if key not in _EQUIVALENT_UNITS:
                raise InputError(f"column {col!r}: alkalinity takes eq/kg, meq/kg, ueq/kg, meq/kg-solution or "
                                 f"meq/L, got {unit!r}")
            basis, factor = _EQUIVALENT_UNITS[key]
            values = _numeric(frame, col, labels, what="alkalinity")
            totals_raw[ALKALINITY] = (basis, values * factor, 0.0)
            columns_of[ALKALINITY] = col
            continue
        try:
            species = db.resolve("CO2(aq)" if name.upper() == "DIC" else name)
        except UnknownSpeciesError as err:
            raise InputError(f"column {col!r}: {err}") from None
        rec = db.record(species)
        if rec.state == "gas":
            if key not in _GAS_UNITS:
                raise InputError(f"column {col!r}: a gas column takes a pressure unit (bar, atm, Pa, MPa), got {unit!r}")
            gases[species] = to_unit(_numeric(frame, col, labels, low=0.0, what="fugacity"), unit, "bar",
                                     f"column {col!r}")
            continue
        values, notes = _amount_cells(frame, col, labels, below_detection)
        if key in _AMOUNT_UNITS:
            basis, factor = _AMOUNT_UNITS[key]
            mol = values * factor
        elif key in _MASS_UNITS:
            basis, factor = _MASS_UNITS[key]
            mol = values * factor / molar_mass_g_mol(rec.elements)
        else:
            raise InputError(f"column {col!r}: unit {unit!r} is not an amount unit; use mol/kg, mmol/kg, "
                             "umol/kg, nmol/kg, mol/kg-solution, mol/L, mmol/L, mg/L, ug/L, ppm or ppb")
        air = notes == AIR_SATURATED
        if air.any():
            mol = np.where(air, _air_saturated_molality(species, T_K[air], labels, col, db, air), mol)
            basis = "per_kg_water" if air.all() else basis
            if not air.all() and basis != "per_kg_water":
                raise InputError(f"column {col!r}: 'air-saturated' cells need the column in mol/kg units "
                                 "(per kg of water)")
        flags = _add_notes(flags, notes, species)
        if species in totals_raw:
            raise InputError(f"column {col!r}: {species} is given twice")
        totals_raw[species] = (basis, mol, molar_mass_g_mol(rec.elements) / 1000.0)
        columns_of[species] = col
    _refuse_impossible_amounts(totals_raw, columns_of, labels)
    totals, estimated = _to_molality(totals_raw, density)
    alkalinity = totals.pop(ALKALINITY, np.full(len(frame), np.nan))
    flags = join_flags(flags, np.where(at_freezing, T_AT_FREEZING, ""))
    samples = SampleSet(names=labels, T_K=T_K, P_bar=P, pH=pH, pH_T_K=pH_T_K, totals=totals,
                        gas_fugacity_bar=gases, density_kg_L=density, density_estimated=estimated,
                        problems=problems, alkalinity_eq_kg=alkalinity, flags=flags, at_freezing=at_freezing)
    if depth is not None:
        samples.P_bar = _column_pressures(samples, depth, body, db)
        samples.T_K = np.where(at_freezing, melting_temperature(samples.P_bar * 1e5), samples.T_K)
        samples.pH_T_K = np.where(pht_given, samples.pH_T_K, samples.T_K)
        samples.problems = _state_problems(samples.T_K, samples.P_bar, t_col)
    return samples


def _ocean_position_column(headers, body):
    """The column giving positions in a body's ocean ('depth [km]' or 'above seafloor [km]'), or
    None; refused without a body, or beside a pressure column."""
    found = [c for c, (n, u) in headers.items() if n.lower() in OCEAN_POSITION_COLUMNS]
    if not found:
        return None
    if len(found) > 1:
        raise InputError(f"columns {found[0]!r} and {found[1]!r}: give the position in the ocean once")
    if any(n == "P" for n, _ in headers.values()):
        raise InputError(f"columns 'P' and {found[0]!r}: give either the pressure or the position in the ocean")
    if body is None:
        raise InputError(f"column {found[0]!r}: a position in an ocean needs the body it belongs to (a [body] "
                         "section in a scenario); give 'P [bar]' instead")
    return found[0]


def _ocean_depth(frame, col, header, labels, body):
    """Depths below the body's ice-ocean interface [km] from a depth or a height above the seafloor."""
    name, unit = header
    km = to_unit(_numeric(frame, col, labels, allow_blank=False, what="position"), unit or "km", "km",
                 f"column {col!r}")
    if name.lower() == "depth":
        return body.depth_below_interface_km(depth_km=km)
    return body.depth_below_interface_km(above_seafloor_km=km)


def _freezing_cells(frame, t_col, depth):
    """Rows whose temperature is to be the fluid's freezing point: cells reading 'freezing', and
    blank cells at the ice-ocean interface (depth 0)."""
    text = frame[t_col].astype(str).str.strip().str.lower().to_numpy()
    freezing = text == "freezing"
    if depth is not None:
        freezing |= frame[t_col].isna().to_numpy() & (depth == 0)
    elif freezing.any():
        raise InputError(f"column {t_col!r}: 'freezing' needs the pressure from a body's ocean column; give a "
                         "temperature")
    return freezing


def _column_pressures(samples, depth_km, body, db):
    """Pressure at each sample's depth [bar]: the ocean column above it is that sample's fluid at
    its temperature (its in-situ density as the speciation estimates it)."""
    W, _ = samples.water_fraction_and_density(db)

    def density(P_bar):
        return samples.insitu_density_kg_L(W, liquid_density_kg_m3(samples.T_K, P_bar * 1e5)) * 1000.0

    return body.pressure_bar(depth_km, density)


ALKALINITY = "alkalinity"       # the key of the alkalinity column among the amounts being converted
_EQUIVALENT_UNITS = {"eq/kg": ("per_kg_water", 1.0), "meq/kg": ("per_kg_water", 1e-3),
                     "ueq/kg": ("per_kg_water", 1e-6), "meq/kg-solution": ("per_kg_solution", 1e-3),
                     "ueq/kg-solution": ("per_kg_solution", 1e-6), "meq/l": ("per_litre", 1e-3),
                     "ueq/l": ("per_litre", 1e-6)}

#: Policies for cells below the detection limit ('<0.1', 'bdl', 'nd'): the cell is not measured,
#: takes the detection limit, or half of it. Each such cell is noted in the sample's flags.
BELOW_DETECTION_POLICIES = ("not-measured", "detection-limit", "half-limit")
_BELOW_WORDS = ("bdl", "b.d.l.", "nd", "n.d.", "<dl", "< dl", "below detection")
AIR_SATURATED = "air-saturated"
BELOW_DETECTION = "below_detection"
ASSUMED = "assumed"
#: Mole fractions in dry air (common practice): the gases an 'air-saturated' cell may name
AIR_MOLE_FRACTION = {"N2(aq)": 0.7808, "O2(aq)": 0.2095}


def _amount_cells(frame, column, labels, policy):
    """Values of an amount column and a note per cell ('' | below_detection | assumed |
    air-saturated). Text cells: '<X' or a below-detection word (handled by ``policy``),
    'assumed X' (the value X, noted), 'air-saturated' (computed later from the temperature)."""
    if policy not in BELOW_DETECTION_POLICIES:
        raise InputError(f"below-detection policy {policy!r} is unknown; choose one of "
                         f"{', '.join(BELOW_DETECTION_POLICIES)}")
    raw = frame[column]
    notes = np.full(len(frame), "", dtype=object)
    numbers = pd.to_numeric(raw, errors="coerce")
    if not (raw.notna() & numbers.isna()).any():      # a plain numeric column (the usual case)
        return _numeric(frame, column, labels, low=0.0, what="amount"), notes
    text = raw.astype(str).str.strip().str.lower()
    is_text = raw.notna().to_numpy() & numbers.isna().to_numpy() & (text != "").to_numpy() & \
        (text != "nan").to_numpy()
    cleaned = raw.copy().astype(object)
    for i in np.flatnonzero(is_text):
        cell = text.iloc[i]
        where = f"row {labels[i]}, column {column!r}"
        if cell.startswith("<") and cell[1:].strip() not in ("dl",):
            limit = pd.to_numeric(cell[1:].strip(), errors="coerce")
            if not np.isfinite(limit) or limit < 0:
                raise InputError(f"{where}: cannot read the detection limit in {raw.iloc[i]!r}; write e.g. '<0.1'")
            cleaned.iloc[i] = {"not-measured": np.nan, "detection-limit": limit, "half-limit": limit / 2}[policy]
            notes[i] = BELOW_DETECTION
        elif cell in _BELOW_WORDS:
            if policy != "not-measured":
                raise InputError(f"{where}: {raw.iloc[i]!r} gives no detection limit for the '{policy}' policy; "
                                 "write it as '<LIMIT' or choose the not-measured policy")
            cleaned.iloc[i] = np.nan
            notes[i] = BELOW_DETECTION
        elif cell.startswith("assumed"):
            value = pd.to_numeric(cell[len("assumed"):].strip(), errors="coerce")
            if not np.isfinite(value) or value < 0:
                raise InputError(f"{where}: write an assumed amount as 'assumed 0.5', got {raw.iloc[i]!r}")
            cleaned.iloc[i] = value
            notes[i] = ASSUMED
        elif cell == AIR_SATURATED:
            cleaned.iloc[i] = 0.0
            notes[i] = AIR_SATURATED
        else:
            raise InputError(f"{where}: {raw.iloc[i]!r} is not a number; amounts are numbers, '<LIMIT', 'bdl', "
                             "'nd', 'assumed VALUE' or, for N2(aq) and O2(aq), 'air-saturated'")
    values = _numeric(pd.DataFrame({column: cleaned}), column, labels, low=0.0, what="amount")
    return values, notes


def _air_saturated_molality(species, T_K, labels, column, db, rows):
    """Molality [mol/kg] of a gas dissolved at equilibrium with water-saturated air at 1 atm and the
    sample's temperature: x_air (1.01325 bar - p_w(T)) K_H(T), with K_H of this project's data
    (salting-out neglected, stated)."""
    if species not in AIR_MOLE_FRACTION:
        raise InputError(f"column {column!r}: 'air-saturated' applies to {', '.join(AIR_MOLE_FRACTION)} only")
    if np.any(T_K >= 373.124):
        i = int(np.flatnonzero(rows)[np.flatnonzero(T_K >= 373.124)[0]])
        raise InputError(f"row {labels[i]}, column {column!r}: water does not stay air-saturated at 1 atm above "
                         "its boiling point; give an amount")
    gas = db.record(species).formula + "(g)"
    logK = reaction_properties(f"{gas} = {species}", T_K, 1.01325, T_unit="K", db=db).logK
    f = AIR_MOLE_FRACTION[species] * (1.01325 - saturation_pressure_bar(T_K))
    return f * 10.0 ** logK


def _add_notes(flags, notes, species):
    """Sample flags with this column's cell notes added ('below_detection:NO3-', ...)."""
    if not (notes != "").any():
        return flags
    text = np.where(notes == AIR_SATURATED, f"assumed_air_saturated:{species}",
                    np.where(notes != "", notes.astype(str) + f":{species}", ""))
    return join_flags(flags, text)


#: Largest amount of one solute accepted [mol per kg of water, of solution or per litre]: above
#: the solubility of the most soluble salts (about 20 mol/kg), so larger values are typing errors.
MAX_AMOUNT_MOL = 50.0


def _refuse_impossible_amounts(totals_raw, columns_of, labels):
    """Refuse, by cell, amounts no aqueous fluid holds, and per-kg-solution or per-litre amounts
    whose solutes would weigh as much as the solution itself."""
    for species, (basis, mol, _) in totals_raw.items():
        big = mol > MAX_AMOUNT_MOL
        if big.any():
            i = int(np.flatnonzero(big)[0])
            raise InputError(f"row {labels[i]}, column {columns_of[species]!r}: {mol[i]:.4g} mol per kg or "
                             f"litre is more than any fluid dissolves (limit {MAX_AMOUNT_MOL:g}); check the "
                             "value and its unit")
    mass = sum(np.nan_to_num(mol) * M for basis, mol, M in totals_raw.values() if basis != "per_kg_water")
    heavy = np.asarray(mass) >= 0.9
    if np.any(heavy):
        i = int(np.flatnonzero(heavy)[0])
        raise InputError(f"row {labels[i]}: the solutes given per kg of solution or per litre weigh "
                         f"{float(np.asarray(mass)[i]):.3g} kg, as much as the solution; check the amounts and units")


def _to_molality(totals_raw, density_kg_L):
    """Molalities from amounts per kg water, per kg solution and per litre (fixed point in W).

    W (kg water per kg solution) = 1 / (1 + sum m_i M_i); per kg solution: m = c / W; per litre:
    m = c / (W rho). Without a measured density, rho = 0.997 + 0.73 (1 - W) kg/L (estimate).
    """
    n = len(density_kg_L)
    estimated = np.isnan(density_kg_L) & any(b == "per_litre" for b, _, _ in totals_raw.values())
    m = {k: np.nan_to_num(v[1]) for k, v in totals_raw.items()}
    for _ in range(50):
        W = 1.0 / (1.0 + sum(m[k] * totals_raw[k][2] for k in m)) if m else np.ones(n)
        rho = np.where(np.isnan(density_kg_L), 0.997 + SEAWATER_DENSITY_SLOPE * (1 - W), density_kg_L)
        new = {}
        for k, (basis, c, _) in totals_raw.items():
            c0 = np.nan_to_num(c)
            new[k] = c0 if basis == "per_kg_water" else (c0 / W if basis == "per_kg_solution" else c0 / (W * rho))
        if all(np.allclose(new[k], m[k], rtol=1e-14, atol=0) for k in m):
            m = new
            break
        m = new
    return {k: np.where(np.isnan(totals_raw[k][1]), np.nan, m[k]) for k in m}, estimated


def merge_sample_sets(sets, groups, db=None):
    """One SampleSet from several read on their own, each with its own units and species names.

    ``groups`` names each set (e.g. its site) for the messages. A component given under different
    species in different sets (HCO3- in one, CO2(aq) in another) is merged under the first name,
    its totals converted by the stoichiometry that relates the two; sample names must be unique
    across the sets.
    """

    db = default_database() if db is None else db
    owner = {}
    for group, s in zip(groups, sets):
        for name in s.names:
            if name in owner:
                raise InputError(f"sample {name!r} is named in both {owner[name]!r} and {group!r}; give every "
                                 "sample its own name")
            owner[name] = group
    n_all = sum(len(s) for s in sets)
    offsets = np.cumsum([0] + [len(s) for s in sets])
    totals, gases = {}, {}
    for s, start in zip(sets, offsets):
        for species, values in s.totals.items():
            key, factor = species, 1.0
            for other in totals:
                found = decompose(db.record(species), {other: _heavy_elements(db.record(other))}, db)
                if found is not None:
                    key, factor = other, found[0][other]
                    break
            column = totals.setdefault(key, np.full(n_all, np.nan))
            column[start:start + len(s)] = values * factor
        for gas, values in s.gas_fugacity_bar.items():
            column = gases.setdefault(gas, np.full(n_all, np.nan))
            column[start:start + len(s)] = values
    join = lambda attr: np.concatenate([getattr(s, attr) for s in sets])
    return SampleSet(names=[n for s in sets for n in s.names], T_K=join("T_K"), P_bar=join("P_bar"),
                     pH=join("pH"), pH_T_K=join("pH_T_K"), totals=totals, gas_fugacity_bar=gases,
                     density_kg_L=join("density_kg_L"), density_estimated=join("density_estimated"),
                     notes=[x for s in sets for x in s.notes], problems=join("problems"),
                     alkalinity_eq_kg=join("alkalinity_eq_kg"), flags=join("flags"),
                     at_freezing=join("at_freezing"))
