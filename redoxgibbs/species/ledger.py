"""The verification ledger: for every species, its source and the outside checks it passes.

The checks are the project's tests against outside references; ``species_data/verification.csv``
names, for each, the reference, the species it exercises, the temperatures and the tolerance. A
species counts as checked at 25 C when a check covers 25 C, and as checked at temperature up to
the highest temperature of its checks.
"""

import functools
import math
from importlib import resources

import pandas as pd

from .database import default_database

__all__ = ["ledger_words", "verification_checks", "verification_ledger"]


@functools.lru_cache(maxsize=1)
def verification_checks():
    """The checks of ``species_data/verification.csv`` as a table (one row per check)."""
    path = resources.files("redoxgibbs.species_data") / "verification.csv"
    table = pd.read_csv(str(path), comment="#", skipinitialspace=True)
    table["species"] = table["species"].str.split(";")
    return table


def _describe(check):
    span = (f"{check.T_min_C:g} C" if check.T_min_C == check.T_max_C
            else f"{check.T_min_C:g}-{check.T_max_C:g} C")
    return f"{check.check} ({check.reference}; {span}; within {check.tolerance})"


def verification_ledger(names=None, db=None):
    """One row per species: model, source, whether entered from memory, and its outside checks.

    Columns: ``species``, ``model``, ``source``, ``entered_from_memory``, ``checked_at_25C``,
    ``checked_to_T_C`` (highest temperature of any check, NaN when none), ``outside_checks``.
    ``names`` restricts the ledger to those species (default: every species in the data).
    """
    db = default_database() if db is None else db
    names = db.names if names is None else [db.resolve(n) for n in names]
    checks = verification_checks()
    rows = []
    for name in names:
        rec = db.record(name)
        mine = checks[checks["species"].apply(lambda s: name in s)]
        at_25 = ((mine["T_min_C"] <= 25) & (mine["T_max_C"] >= 25)).any()
        rows.append({
            "species": name, "model": rec.model, "source": rec.source,
            "entered_from_memory": rec.from_memory, "checked_at_25C": bool(at_25),
            "checked_to_T_C": float(mine["T_max_C"].max()) if len(mine) else float("nan"),
            "outside_checks": "; ".join(_describe(c) for c in mine.itertuples()) or "none yet"})
    return pd.DataFrame(rows)


def ledger_words(ledger):
    """(how entered, reach) per ledger row as words, the one wording every output shows:
    'recalled from memory' or 'copied from an outside table'; 'checked to T C' or 'no outside
    check yet'."""
    entered = ["recalled from memory" if m else "copied from an outside table" for m in ledger["entered_from_memory"]]
    reach = ["no outside check yet" if math.isnan(t) else f"checked to {t:g} C" for t in ledger["checked_to_T_C"]]
    return entered, reach
