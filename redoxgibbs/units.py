"""Units at the boundary: one package-wide pint registry and converters to internal units.

Internal units are kelvin, bar, J/mol (and cm3/mol for volumes). Public functions accept pint
quantities, strings such as ``"300 degC"`` or ``"50 MPa"``, or plain numbers together with the
unit named in the call (``T_unit="degC"``); everything is converted once, here.
"""

import numpy as np
import pint

from .errors import InputError

__all__ = [
    "ureg",
    "Q_",
    "CAL_TO_J",
    "to_kelvin",
    "to_bar",
    "to_unit",
    "as_float_array",
    "conversion_factor",
    "column_label",
]

ureg = pint.UnitRegistry(autoconvert_offset_to_baseunit=True)
# Molality (per kg of water) is the concentration scale of all aqueous standard states.
ureg.define("molal = mole / kilogram")
ureg.define("mmolal = 1e-3 molal")
# volumes as laboratories write them in unit strings (g/cm3, kg/m3)
ureg.define("cm3 = centimeter ** 3")
ureg.define("m3 = meter ** 3")
Q_ = ureg.Quantity

#: Thermochemical calorie, the unit of the HKF and Maier-Kelley parameter tables [J/cal].
CAL_TO_J = 4.184


def as_float_array(value, field):
    """Return ``value`` as a float ndarray, or raise an InputError naming ``field``."""
    try:
        arr = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise InputError(f"{field}: expected numbers, got {value!r}") from None
    if not np.all(np.isfinite(arr)):
        raise InputError(f"{field}: contains NaN or infinite values; give finite numbers")
    return arr


def to_unit(value, unit, target, field):
    """Convert ``value`` (quantity, string or numbers in ``unit``) to a float array in ``target``."""
    if isinstance(value, str):
        try:
            value = Q_(value)
        except Exception:
            raise InputError(f"{field}: cannot read {value!r} as a quantity; write e.g. '25 degC'") from None
    if isinstance(value, pint.Quantity):
        try:
            return as_float_array(value.to(target).magnitude, field)
        except pint.DimensionalityError:
            raise InputError(f"{field}: {value.units} is not convertible to {target}") from None
    if isinstance(value, (list, tuple)) and value and isinstance(value[0], pint.Quantity):
        return np.array([to_unit(v, unit, target, field) for v in value], dtype=float)
    if unit is None:
        raise InputError(f"{field}: plain numbers need a unit; pass a pint quantity or a unit string")
    try:
        magnitude = Q_(as_float_array(value, field), unit)
        return as_float_array(magnitude.to(target).magnitude, field)
    except (pint.UndefinedUnitError, pint.DimensionalityError, AttributeError):
        raise InputError(f"{field}: unit {unit!r} is unknown or not convertible to {target}") from None


def to_kelvin(value, unit="degC", field="T"):
    """Temperature in kelvin from a quantity, a string or numbers in ``unit``; refuses T <= 0 K."""
    T = to_unit(value, unit, "kelvin", field)
    if np.any(T <= 0):
        raise InputError(f"{field}: temperatures must be above absolute zero, got {T.min()} K")
    return T


def to_bar(value, unit="bar", field="P"):
    """Pressure in bar from a quantity, a string or numbers in ``unit``; refuses P <= 0."""
    P = to_unit(value, unit, "bar", field)
    if np.any(P <= 0):
        raise InputError(f"{field}: pressures must be positive, got {P.min()} bar")
    return P


def conversion_factor(unit, reference, field):
    """Multiplier taking a value in ``reference`` to ``unit`` (unit strings of one dimension)."""
    try:
        return float(Q_(1.0, reference).to(unit).magnitude)
    except (pint.UndefinedUnitError, pint.DimensionalityError, AttributeError, ValueError, TypeError):
        raise InputError(f"{field}: {unit!r} is not a unit of the same kind as {reference}; "
                         f"write e.g. {reference!r}") from None


def column_label(unit):
    """A unit string as it reads in a column name: 'nW/cm3' -> 'nW_per_cm3'."""
    text = str(unit).strip().replace("µ", "u").replace("μ", "u").replace("**", "").replace("^", "")
    return text.replace(" / ", "/").replace("/", "_per_").replace("*", "_").replace(" ", "_")
