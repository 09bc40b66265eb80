"""Text of a reaction: ``'CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)'`` to signed coefficients.

Only the text is read here; species are looked up and balance is checked by the reactions layer.
"""

import re
from fractions import Fraction

from ..errors import InputError

__all__ = ["split_reaction"]

_TERM = re.compile(r"^\s*(?:(\d+(?:\.\d+)?(?:/\d+)?|\.\d+)\s+)?(\S.*?)\s*$")


def _coefficient(text, reaction):
    try:
        return float(Fraction(text))
    except (ValueError, ZeroDivisionError):
        raise InputError(f"reaction: cannot read coefficient {text!r} in {reaction!r}") from None


def _side(text, reaction):
    # split on ' + ' only (a '+' inside a name such as 'Na+' has no space after it)
    terms = [t for t in re.split(r"\s\+\s", " " + text.strip() + " ") if t.strip()]
    out = []
    for term in terms:
        m = _TERM.match(term)
        if not m or not m.group(2):
            raise InputError(f"reaction: cannot read term {term.strip()!r} in {reaction!r}")
        coef = _coefficient(m.group(1), reaction) if m.group(1) else 1.0
        out.append((coef, m.group(2)))
    return out


def split_reaction(text):
    """Species and signed coefficients (reactants negative) of ``'A + 2 B = C'``.

    Coefficients may be integers, decimals or fractions (``1/2``). Returns a list of
    (coefficient, species text) pairs in the order written.
    """
    if not isinstance(text, str) or text.count("=") != 1:
        raise InputError(f"reaction: write one '=' between reactants and products, got {text!r}")
    left, right = text.split("=")
    if not left.strip() or not right.strip():
        raise InputError(f"reaction: both sides of {text!r} need species")
    return [(-c, s) for c, s in _side(left, text)] + _side(right, text)
