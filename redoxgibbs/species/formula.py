"""Chemical formulas and species names: parsing, charges and the canonical spelling.

Charges may be written ``CO3^2-``, ``CO3-2`` or ``CO3--``; the canonical form is ``CO3^2-``
(``Na+`` and ``Cl-`` for unit charges). Neutral aqueous species carry ``(aq)``, gases ``(g)`` and
liquid water ``(l)``.
"""

import re
from collections import Counter

from ..errors import InputError

__all__ = ["parse_formula", "split_charge", "canonical_name", "format_charge"]

_TOKEN = re.compile(r"([A-Z][a-z]?|\(|\)|\d+(?:\.\d+)?)")
_STATE = re.compile(r"\((aq|g|l|s|cr)\)$")
_CHARGE_FORMS = (
    re.compile(r"\^(\d+)([+-])$"),   # CO3^2-
    re.compile(r"\^([+-])(\d+)$"),   # CO3^-2 (tolerated)
    re.compile(r"([+-])(\d+)$"),     # CO3-2
    re.compile(r"([+-]+)$"),         # CO3-- or Na+
)


def parse_formula(formula):
    """Element counts of a formula such as ``Fe(OH)2`` or ``CH3COO`` as a Counter."""
    text = formula.strip()
    tokens = _TOKEN.findall(text)
    if not text or "".join(tokens) != text:
        raise InputError(f"formula: cannot read {formula!r}; write elements and counts, e.g. Fe(OH)2")
    stack = [Counter()]
    i = 0
    while i < len(tokens):
        tok = tokens[i]
        has_count = i + 1 < len(tokens) and tokens[i + 1][0].isdigit()
        count = float(tokens[i + 1]) if has_count else 1.0
        if tok == "(":
            stack.append(Counter())
            i += 1
            continue
        if tok[0].isdigit():
            raise InputError(f"formula: misplaced number in {formula!r}")
        if tok == ")":
            if len(stack) == 1:
                raise InputError(f"formula: unbalanced ')' in {formula!r}")
            for el, n in stack.pop().items():
                stack[-1][el] += n * count
        else:
            stack[-1][tok] += count
        i += 2 if has_count else 1
    if len(stack) != 1:
        raise InputError(f"formula: unbalanced '(' in {formula!r}")
    return stack[0]


def split_charge(text):
    """Split ``'CO3^2-(aq)'`` into (body ``'CO3'``, charge ``-2``, state suffix ``'aq'`` or '')."""
    s = text.strip()
    state = ""
    m = _STATE.search(s)
    if m:
        state, s = m.group(1), s[: m.start()]
    for form in _CHARGE_FORMS:
        m = form.search(s)
        if not m:
            continue
        groups = m.groups()
        if len(groups) == 1:
            signs = groups[0]
            if len(set(signs)) != 1:
                raise InputError(f"species: mixed charge signs in {text!r}; write e.g. CO3^2-")
            charge = len(signs) * (1 if signs[0] == "+" else -1)
        else:
            digits, sign = (groups if groups[0].isdigit() else groups[::-1])
            charge = int(digits) * (1 if sign == "+" else -1)
        return s[: m.start()], charge, state
    return s, 0, state


def format_charge(charge):
    """Canonical charge suffix: '' for 0, '+' / '-' for unit charges, '^2+' otherwise."""
    if charge == 0:
        return ""
    sign = "+" if charge > 0 else "-"
    return sign if abs(charge) == 1 else f"^{abs(charge)}{sign}"


def canonical_name(text):
    """Canonical spelling of a species written with any accepted charge notation."""
    body, charge, state = split_charge(text)
    if charge != 0:
        return body + format_charge(charge)
    return f"{body}({state})" if state else body
