"""The chemical system of a sample set: component master species and every species built on them.

Each measured species names a component: all species whose element (other than H and O) is in
the same oxidation state. A species belongs to the system when it can be written from the
component masters, H+ and H2O alone, with elements and charge balanced; a charge that fails to
balance means a change of oxidation state, so redox couples are never equilibrated with each
other. H2(aq) and O2(aq) are components of their own (elemental H and O).
"""

import itertools
from dataclasses import dataclass

import numpy as np

from ..errors import InputError

__all__ = ["ChemicalSystem", "build_system", "complexes_of", "decompose"]

_PSEUDO = {"H2": "H(0)", "O2": "O(0)"}


def _heavy_elements(record):
    if record.formula in _PSEUDO:
        return {_PSEUDO[record.formula]: 1.0}
    return {el: n for el, n in record.elements.items() if el not in ("H", "O")}


def decompose(record, masters, db):
    """Coefficients (masters dict, H2O, H+) with record = sum c_b b + c_w H2O + c_H H+, or None."""
    heavy = _heavy_elements(record)
    choices = []
    for el, n in heavy.items():
        options = [(b, n / h[el]) for b, h in masters.items() if set(h) == {el}]
        if not options:
            return None
        choices.append(options)
    for combo in itertools.product(*choices):
        O = record.elements.get("O", 0.0)
        H = record.elements.get("H", 0.0)
        z = record.charge
        coeffs = {}
        for b, c in combo:
            rb = db.record(b)
            coeffs[b] = coeffs.get(b, 0.0) + c
            O -= c * rb.elements.get("O", 0.0)
            H -= c * rb.elements.get("H", 0.0)
            z -= c * rb.charge
        c_w = O
        c_H = H - 2.0 * O
        if abs(z - c_H) < 1e-9:
            return coeffs, c_w, c_H
    return None


@dataclass(frozen=True)
class ChemicalSystem:
    """Masters (components), species (aqueous, masters first) and their stoichiometry.

    ``nu`` (n_species, n_masters), ``nu_w`` and ``nu_H`` (n_species,): species = nu . masters +
    nu_w H2O + nu_H H+. ``minerals`` with ``nu_min`` etc. likewise, for saturation indices.
    """

    masters: list
    species: list
    nu: np.ndarray
    nu_w: np.ndarray
    nu_H: np.ndarray
    charge: np.ndarray
    minerals: list
    nu_min: np.ndarray
    nu_w_min: np.ndarray
    nu_H_min: np.ndarray


def complexes_of(basis, db):
    """Aqueous species of ``db`` built from the ions ``basis`` (with H+ and H2O) other than the
    basis ions themselves: the complexes an activity model may carry in its own parameters."""
    masters = {b: _heavy_elements(db.record(b)) for b in basis}
    return {name for name in db.names if name not in masters and db.record(name).state == "aq"
            and _heavy_elements(db.record(name)) and decompose(db.record(name), masters, db) is not None}


def build_system(master_names, db, omit=frozenset()):
    """Every aqueous species and mineral of ``db`` built from the masters, H+ and H2O, except the
    species ``omit`` (complexes the activity model carries in its parameters)."""
    masters = {}
    for name in master_names:
        rec = db.record(name)
        heavy = _heavy_elements(rec)
        if len(heavy) != 1:
            raise InputError(f"column {name}: a measured total must name a species of one element "
                             f"besides H and O (e.g. HCO3-, SO4^2-), not {name}")
        for other, h in masters.items():
            if set(h) == set(heavy) and decompose(rec, {other: h}, db):
                raise InputError(f"columns {other} and {name} are the same component; give one of them")
        masters[name] = heavy
    rows, minerals, mineral_rows = [], [], []
    for name in db.names:
        rec = db.record(name)
        if rec.state not in ("aq", "solid") or (name in omit and name not in masters):
            continue
        found = decompose(rec, masters, db)
        if found is None:
            continue
        coeffs, c_w, c_H = found
        vec = np.array([coeffs.get(m, 0.0) for m in masters])
        if rec.state == "aq":
            rows.append((name, vec, c_w, c_H, rec.charge))
        else:
            minerals.append(name)
            mineral_rows.append((vec, c_w, c_H))
    order = sorted(rows, key=lambda r: (r[0] not in masters, list(masters).index(r[0]) if r[0] in masters else 0))
    k = len(masters)
    return ChemicalSystem(
        masters=list(masters), species=[r[0] for r in order],
        nu=np.array([r[1] for r in order]).reshape(len(order), k), nu_w=np.array([r[2] for r in order]),
        nu_H=np.array([r[3] for r in order]), charge=np.array([float(r[4]) for r in order]),
        minerals=minerals, nu_min=np.array([r[0] for r in mineral_rows]).reshape(len(minerals), k),
        nu_w_min=np.array([r[1] for r in mineral_rows]), nu_H_min=np.array([r[2] for r in mineral_rows]))
