"""Element data: standard entropies and molar masses, both read from cantera's own tables.

Entropies: cantera's ``element-standard-entropies.yaml`` (Chase 1998, NIST-JANAF tables; Robie &
Hemingway 1995), per atom of the element in its reference state (1/2 H2(g) for H). Molar masses:
cantera's element table (IUPAC atomic weights).
"""

import functools
from pathlib import Path

import cantera as ct
from ruamel.yaml import YAML

from ..errors import InputError

__all__ = ["element_entropy_J_mol_K", "molar_mass_g_mol", "formation_entropy_offset"]


@functools.lru_cache(maxsize=1)
def _entropy_table():
    for folder in ct.get_data_directories():
        path = Path(folder) / "element-standard-entropies.yaml"
        if path.exists():
            data = YAML(typ="safe").load(path.read_text())
            return {e["symbol"]: e["entropy298"] / 1000.0 for e in data["elements"] if "entropy298" in e}
    raise FileNotFoundError("cantera's element-standard-entropies.yaml was not found")


def element_entropy_J_mol_K(symbol):
    """Standard entropy at 298.15 K, 1 bar of one atom of ``symbol`` in its reference state."""
    try:
        return _entropy_table()[symbol]
    except KeyError:
        raise InputError(f"formula: element {symbol!r} has no standard entropy in the element table") from None


def molar_mass_g_mol(elements):
    """Molar mass [g/mol] from element counts (a mapping symbol -> count)."""
    try:
        return sum(ct.Element(el).weight * n for el, n in elements.items())
    except ct.CanteraError:
        raise InputError(f"formula: unknown element among {sorted(elements)}") from None


def formation_entropy_offset(elements, charge):
    """Sum of element entropies in the formation reaction of a species [J/mol/K].

    For an ion the H+ convention adds z/2 H2(g) on the product side and z H+ (S = 0) on the
    reactant side: sum = sum_i n_i S_i - z S(1/2 H2), so that G_f = H_f - T (S - sum).
    """
    return sum(element_entropy_J_mol_K(el) * n for el, n in elements.items()) - charge * element_entropy_J_mol_K("H")
