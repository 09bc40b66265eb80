"""Catabolic reactions: the named catalog, redox couples and donor x acceptor enumeration.

Electrons transferred are counted from formal oxidation states (H +1 and O -2, except in H2 and
O2 where they are 0): for each element, the rise of the products' oxidation states above the
reactants' average (or, for comproportionations such as anammox, of the reactants' below the
products' average, whichever is larger), summed over elements. For disproportionations
(acetoclastic methanogenesis, sulfur and thiosulfate disproportionation) this average count gives
4 electrons where counts by individual carbon or sulfur atoms give 8: state which convention a
comparison uses. Enumerated reactions carry the electron count of their half-reactions.
"""

from collections import Counter
from dataclasses import dataclass
from fractions import Fraction
from functools import lru_cache
from importlib import resources
from math import gcd

import pandas as pd

from ..errors import InputError, UnbalancedReactionError
from ..reactions.reaction import Reaction
from ..species.database import default_database
from ..species.equation import split_reaction

__all__ = ["catalog", "catalog_reaction", "redox_couples", "couples_present", "enumerate_reactions",
           "electrons_transferred", "NamedReaction", "resolve_reactions"]


@dataclass(frozen=True)
class NamedReaction:
    """A named reaction: ``name``, the balanced ``reaction`` and the ``electrons`` it moves per mole as
    written."""
    name: str
    reaction: Reaction
    electrons: float
    group: str = ""


def _oxidation_states(record):
    """Formal oxidation state per atom of each element in one species, and the atom counts."""
    el = record.elements
    if record.formula in ("H2", "O2"):
        return {next(iter(el)): (0.0, el[next(iter(el))])}
    heavy = [e for e in el if e not in ("H", "O")]
    if len(heavy) > 1:
        raise InputError(f"species {record.name}: oxidation states of several elements cannot be "
                         "told from the formula; electron counts need single-element species")
    out = {}
    if "H" in el:
        out["H"] = (1.0, el["H"])
    if "O" in el:
        out["O"] = (-2.0, el["O"])
    if heavy:
        n = el[heavy[0]]
        out[heavy[0]] = ((record.charge - el.get("H", 0.0) + 2.0 * el.get("O", 0.0)) / n, n)
    return out


def electrons_transferred(reaction):
    """Moles of electrons moved per mole of reaction as written (see the module notes)."""
    db = reaction.db
    sides = {-1: {}, 1: {}}
    for name, c in zip(reaction.species, reaction.coefficients):
        for el, (ox, n) in _oxidation_states(db.record(name)).items():
            sides[1 if c > 0 else -1].setdefault(el, []).append((ox, abs(c) * n))
    electrons = 0.0
    for el in sides[1]:
        mean = {s: sum(o * a for o, a in sides[s][el]) / sum(a for _, a in sides[s][el]) for s in (-1, 1)}
        raised = sum(a * max(0.0, o - mean[-1]) for o, a in sides[1][el])     # products above reactants
        lifted = sum(a * max(0.0, mean[1] - o) for o, a in sides[-1][el])     # reactants below products
        electrons += max(raised, lifted)
    return float(electrons)


@lru_cache(maxsize=None)
def _packaged_table(filename):
    """A CSV table shipped beside this module (catalog.csv, redox_couples.csv), read once."""
    path = resources.files("redoxgibbs.energetics") / filename
    return pd.read_csv(str(path), comment="#", skipinitialspace=True)


def catalog(db=None):
    """The catalog of named catabolic reactions (``energetics/catalog.csv``), each balanced.

    Parameters
    ----------
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).

    Returns
    -------
    list of NamedReaction
        Name, balanced reaction and electrons moved per mole of reaction (formal oxidation states).
    """
    return list(_catalog_for(default_database() if db is None else db))


@lru_cache(maxsize=4)
def _catalog_for(db):
    return tuple(NamedReaction(row["name"], rxn, electrons_transferred(rxn), row["group"])
                 for _, row in _packaged_table("catalog.csv").iterrows()
                 for rxn in [Reaction(row["reaction"], db=db)])


def catalog_reaction(name, db=None):
    """The catalog entry called ``name`` (a NamedReaction), or None where the catalog has none."""
    for entry in catalog(db):
        if entry.name.lower() == name.strip().lower():
            return entry
    return None


def _half_reaction(text, db):
    """(coefficients without electrons, electrons consumed) of a reduction half-reaction."""
    coeffs, electrons = {}, 0.0
    for c, s in split_reaction(text):
        if s.strip() == "e-":
            electrons -= c  # written on the left: c < 0
            continue
        name = db.resolve(s)
        coeffs[name] = coeffs.get(name, 0.0) + c
    elements, charge = Counter(), electrons  # c_e = -electrons, charge -1 each
    for name, c in coeffs.items():
        rec = db.record(name)
        for el, n in rec.elements.items():
            elements[el] += c * n
        charge += c * rec.charge
    off = {el: v for el, v in elements.items() if abs(v) > 1e-9}
    if off or abs(charge) > 1e-9:
        raise UnbalancedReactionError(f"half-reaction {text!r} does not balance: {off}, charge {charge:+g}")
    return coeffs, electrons


def redox_couples(db=None):
    """{couple name: (coefficients of the reduction, electrons)} from redox_couples.csv."""
    db = default_database() if db is None else db
    return {row["couple"]: _half_reaction(row["half_reaction"], db) for _, row in _packaged_table("redox_couples.csv").iterrows()}


def couples_present(species, db=None):
    """Names of the redox couples whose dissolved species all lie in ``species`` (e.g. from
    :func:`~redoxgibbs.speciation.solver.species_in_samples`). H+, water and solids count as
    available: fluid analyses do not report the minerals in contact with the fluid."""
    db = default_database() if db is None else db
    species = set(species)
    return [name for name, (coeffs, _) in redox_couples(db).items()
            if all(s in species for s in coeffs if s not in ("H+", "H2O(l)") and db.record(s).state != "solid")]


def _smallest_whole(coeffs):
    """Coefficients scaled to the smallest whole numbers, and the scale factor used."""
    fracs = {k: Fraction(v).limit_denominator(1000) for k, v in coeffs.items() if abs(v) > 1e-12}
    denom = 1
    for f in fracs.values():
        denom = denom * f.denominator // gcd(denom, f.denominator)
    ints = {k: int(f * denom) for k, f in fracs.items()}
    g = 0
    for v in ints.values():
        g = gcd(g, abs(v))
    g = g or 1
    return {k: v // g for k, v in ints.items()}, Fraction(denom, g)


def enumerate_reactions(donors=None, acceptors=None, db=None):
    """Every donor x acceptor reaction from the redox couples, in smallest whole coefficients.

    Parameters
    ----------
    donors, acceptors : list of str, optional
        Couple names of ``energetics/redox_couples.csv`` (default: all). A donor couple runs as an
        oxidation, an acceptor couple as a reduction; pairs of a couple with itself are skipped.
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).

    Returns
    -------
    list of NamedReaction
        Named 'DONOR -> ACCEPTOR', with the half-reactions' electron count.
    """
    db = default_database() if db is None else db
    couples = redox_couples(db)
    for group, names in (("donor", donors), ("acceptor", acceptors)):
        for n in names or []:
            if n not in couples:
                raise InputError(f"{group} couple {n!r} is unknown; known: {', '.join(couples)}")
    out = []
    for d in donors or list(couples):
        for a in acceptors or list(couples):
            if a == d:
                continue
            (cd, nd), (ca, na) = couples[d], couples[a]
            total = {}
            for k, v in ca.items():
                total[k] = total.get(k, 0.0) + v * nd
            for k, v in cd.items():
                total[k] = total.get(k, 0.0) - v * na
            whole, factor = _smallest_whole(total)
            if not any(v for v in whole.values()):
                continue
            rxn = Reaction.from_coefficients({k: float(v) for k, v in whole.items() if v}, db=db)
            out.append(NamedReaction(f"{d} -> {a}", rxn, float(na * nd * factor), "enumerated"))
    return out


def resolve_reactions(items, db=None):
    """Reactions from catalog names or reaction strings.

    Parameters
    ----------
    items : list of str
        Catalog names (see ``redoxgibbs reactions``) or reactions such as
        ``"CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)"`` (checked for element and charge balance).
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).

    Returns
    -------
    list of NamedReaction
    """
    db = default_database() if db is None else db
    out = []
    for item in items:
        named = catalog_reaction(item, db)
        if named is None:
            if "=" not in item:
                raise InputError(f"reaction {item!r} is neither a catalog name nor a reaction; "
                                 "see 'redoxgibbs reactions' for the catalog")
            rxn = Reaction(item, db=db)
            named = NamedReaction(item, rxn, electrons_transferred(rxn))
        out.append(named)
    return out
