"""Exception hierarchy of redoxgibbs.

Every message names the offending field, the value given and how to fix it.
"""

__all__ = [
    "RedoxGibbsError",
    "InputError",
    "OutOfValidityError",
    "UnknownSpeciesError",
    "UnbalancedReactionError",
    "SpeciesDataError",
]


class RedoxGibbsError(Exception):
    """Base class of all errors raised by redoxgibbs."""


class InputError(RedoxGibbsError, ValueError):
    """An input is malformed: wrong type, unit, sign or shape."""


class OutOfValidityError(RedoxGibbsError, ValueError):
    """A state lies outside the range where a model is defined (e.g. frozen or vapour water)."""


class UnknownSpeciesError(RedoxGibbsError, KeyError):
    """A species name is not in the loaded species data."""

    def __str__(self):  # KeyError would otherwise quote the message
        return str(self.args[0]) if self.args else ""


class UnbalancedReactionError(RedoxGibbsError, ValueError):
    """A reaction does not conserve elements or charge."""


class SpeciesDataError(RedoxGibbsError, ValueError):
    """A species-data record fails a consistency check."""
