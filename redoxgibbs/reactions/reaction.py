"""Reactions: parsed from text, checked for balance, evaluated for standard-state properties.

>>> r = Reaction("CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)")
>>> str(r)
'CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)'
"""

from collections import Counter
from dataclasses import dataclass
from fractions import Fraction

import numpy as np
import pandas as pd

from ..constants import R_J_MOL_K
from ..errors import InputError, UnbalancedReactionError
from ..species.database import default_database
from ..species.equation import split_reaction
from ..species.properties import standard_properties
from ..units import to_bar, to_kelvin
from ..water.iapws95 import psat_convention_bar

__all__ = ["Reaction", "ReactionProperties", "reaction_properties", "resolve_states"]

_BALANCE_TOL = 1e-9


def _format_coefficient(c):
    frac = Fraction(c).limit_denominator(1000)
    if frac == 1:
        return ""
    text = str(frac) if abs(float(frac) - c) < 1e-12 else f"{c:g}"
    return text + " "


class Reaction:
    """A balanced reaction between species of the loaded data (products have c > 0)."""

    def __init__(self, text, db=None):
        self.db = default_database() if db is None else db
        merged = {}
        for coef, name in split_reaction(text):
            canonical = self.db.resolve(name)
            merged[canonical] = merged.get(canonical, 0.0) + coef
        self.species = [n for n, c in merged.items() if c != 0]
        self.coefficients = np.array([merged[n] for n in self.species])
        self.text = text
        if not self.species:
            raise InputError(f"reaction {text!r}: the two sides are the same; nothing reacts")
        self._check_balance()

    @classmethod
    def from_coefficients(cls, coefficients, db=None):
        """Build from a mapping canonical name -> coefficient (products positive)."""
        reactants = " + ".join(f"{_format_coefficient(-c)}{n}" for n, c in coefficients.items() if c < 0)
        products = " + ".join(f"{_format_coefficient(c)}{n}" for n, c in coefficients.items() if c > 0)
        return cls(f"{reactants} = {products}", db=db)

    def _check_balance(self):
        elements, charge = Counter(), 0.0
        for name, c in zip(self.species, self.coefficients):
            rec = self.db.record(name)
            for el, n in rec.elements.items():
                elements[el] += c * n
            charge += c * rec.charge
        off = {el: n for el, n in elements.items() if abs(n) > _BALANCE_TOL}
        if off or abs(charge) > _BALANCE_TOL:
            parts = [f"{el} {n:+g}" for el, n in sorted(off.items())]
            if abs(charge) > _BALANCE_TOL:
                parts.append(f"charge {charge:+g}")
            raise UnbalancedReactionError(
                f"reaction {self.text!r} does not balance (products minus reactants: "
                f"{', '.join(parts)}); adjust the coefficients or add H2O(l) / H+")

    def coefficient(self, name):
        """Stoichiometric coefficient of ``species`` (negative for reactants, 0 when it takes no part)."""
        name = self.db.resolve(name)
        return float(self.coefficients[self.species.index(name)]) if name in self.species else 0.0

    def __str__(self):
        left = [f"{_format_coefficient(-c)}{n}" for n, c in zip(self.species, self.coefficients) if c < 0]
        right = [f"{_format_coefficient(c)}{n}" for n, c in zip(self.species, self.coefficients) if c > 0]
        return f"{' + '.join(left)} = {' + '.join(right)}"

    def __repr__(self):
        return f"Reaction({str(self)!r})"

    def properties(self, T, P="psat", *, T_unit="degC", P_unit="bar"):
        """Standard-state reaction properties at broadcast T and P (see :func:`reaction_properties`)."""
        return reaction_properties(self, T, P, T_unit=T_unit, P_unit=P_unit)


def resolve_states(T, P, T_unit="degC", P_unit="bar"):
    """Temperatures [K] and pressures [bar] broadcast together; P may be 'psat'."""
    T_K = to_kelvin(T, T_unit)
    if isinstance(P, str) and P.strip().lower() == "psat":
        return T_K, psat_convention_bar(T_K)
    P_bar = to_bar(P, P_unit)
    T_K, P_bar = np.broadcast_arrays(T_K, P_bar)
    return T_K.astype(float), P_bar.astype(float)


@dataclass(frozen=True)
class ReactionProperties:
    """Standard-state properties of one reaction at an array of states (any broadcast shape).

    dG0, dH0 [J/mol], dS0, dCp0 [J/mol/K], dV0 [cm3/mol], logK [-]; ``flags`` maps a caveat to a
    boolean array of the states it applies to (any participating species affected).
    """

    reaction: str
    T_K: np.ndarray
    P_bar: np.ndarray
    dG0: np.ndarray
    dH0: np.ndarray
    dS0: np.ndarray
    dCp0: np.ndarray
    dV0: np.ndarray
    flags: dict

    @property
    def logK(self):
        """log10 K = -dG0 / (RT ln 10) at each state."""
        return -self.dG0 / (R_J_MOL_K * self.T_K * np.log(10))

    def to_frame(self):
        """One row per state, units in the column names."""
        frame = pd.DataFrame({
            "T_C": self.T_K.ravel() - 273.15, "P_bar": self.P_bar.ravel(), "logK": self.logK.ravel(),
            "dG0_kJ_per_mol": self.dG0.ravel() / 1e3, "dH0_kJ_per_mol": self.dH0.ravel() / 1e3,
            "dS0_J_per_mol_K": self.dS0.ravel(), "dCp0_J_per_mol_K": self.dCp0.ravel(),
            "dV0_cm3_per_mol": self.dV0.ravel()})
        caveats = [", ".join(k for k, v in self.flags.items() if v.ravel()[i]) for i in range(frame.shape[0])]
        frame["flags"] = caveats
        return frame


def reaction_properties(reaction, T, P="psat", *, T_unit="degC", P_unit="bar", db=None):
    """Standard-state properties of a reaction at broadcast temperatures and pressures.

    dG0 = sum nu_i G_i(T, P) over the balanced reaction (apparent standard properties of
    formation), log10 K = -dG0 / (RT ln 10), and likewise dH0, dS0, dCp0, dV0.

    Parameters
    ----------
    reaction : Reaction or str
        The reaction, e.g. ``"CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)"``.
    T : array_like, pint Quantity or str
        Temperatures [``T_unit``, default degC], or a quantity / text such as ``'300 degC'``.
    P : array_like, pint Quantity or 'psat'
        Pressures [``P_unit``, default bar]; ``'psat'``: 1.01325 bar up to 100 degC, liquid-vapour
        saturation above.
    T_unit, P_unit : str
        Units of plain numbers.
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).

    Returns
    -------
    ReactionProperties
        logK, dG0 [J/mol], dH0 [J/mol], dS0 [J/mol/K], dCp0 [J/mol/K], dV0 [cm3/mol] and flags;
        ``to_frame()`` names the units in its columns.
    """
    rxn = reaction if isinstance(reaction, Reaction) else Reaction(reaction, db=db)
    T_K, P_bar = resolve_states(T, P, T_unit, P_unit)
    shape = T_K.shape
    props = standard_properties(rxn.species, T_K.ravel(), P_bar.ravel(), db=rxn.db)
    nu = rxn.coefficients
    combine = (lambda X: (X @ nu).reshape(shape))
    flags = {k: v.any(axis=1).reshape(shape) for k, v in props.flags.items()}
    return ReactionProperties(
        reaction=str(rxn), T_K=T_K, P_bar=P_bar, dG0=combine(props.G), dH0=combine(props.H),
        dS0=combine(props.S), dCp0=combine(props.Cp), dV0=combine(props.V), flags=flags)
