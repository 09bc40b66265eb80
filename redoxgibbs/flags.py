"""The validity flags, named once: every table and report carries these names in its ``flags``
column (comma-joined), and nothing else.

Flags mark results computed outside the range where a model was fitted or is trusted; they never
change a number. Refusals (states where water is ice, vapour or gas-like; samples colder than
their freezing point) are not flags: those samples carry a ``failure`` instead.
"""

import numpy as np
import pandas as pd

__all__ = [
    "ALKALINITY_NOT_USED",
    "BELOW_0C",
    "FLAGS",
    "FORMATION_ENTHALPY_MISSING",
    "LOW_DENSITY",
    "NEAR_CRITICAL",
    "OUTSIDE_FORMATION_RANGE",
    "T_AT_FREEZING",
    "UNPARAMETERIZED_IONS",
    "ionic_strength_flag",
    "join_flags",
    "parameter_temperature_flag",
]

LOW_DENSITY = "water_density_below_0.35_g_cm3"
BELOW_0C = "below_0C_extrapolated"
OUTSIDE_FORMATION_RANGE = "outside_formation_T_range"
FORMATION_ENTHALPY_MISSING = "formation_enthalpy_missing"
NEAR_CRITICAL = "near_critical_point"
ALKALINITY_NOT_USED = "alkalinity_not_used"
T_AT_FREEZING = "T_at_freezing_point"
UNPARAMETERIZED_IONS = "pitzer_ions_without_parameters"


def join_flags(a, b):
    """Element-wise ', '-join of two (broadcast) arrays of flag texts, blanks and repeats skipped:
    the one way flags are combined in every table."""
    a, b = np.broadcast_arrays(np.asarray(a, dtype=object), np.asarray(b, dtype=object))
    has_a, has_b = a != "", b != ""
    out = np.where(has_a, a, b)
    both = np.flatnonzero((has_a & has_b).ravel())
    if both.size:
        # few distinct texts, many rows: join each distinct pair once
        codes, pairs = pd.factorize(a.ravel()[both] + "\n" + b.ravel()[both])
        joined = np.array([", ".join(dict.fromkeys(p.replace("\n", ", ").split(", "))) for p in pairs],
                          dtype=object)
        out.ravel()[both] = joined[codes]
    return out


def parameter_temperature_flag(model_name):
    """The flag of samples whose activity-model parameters are used outside their stated temperatures."""
    return f"{model_name}_parameters_outside_their_temperatures"


def ionic_strength_flag(model_name):
    """The flag of samples whose ionic strength lies beyond the activity model's stated range."""
    return f"ionic_strength_beyond_{model_name}_range"


#: name -> meaning (the one list the documentation shows)
FLAGS = {
    LOW_DENSITY: "water density below 0.35 g/cm3, below the range the HKF g-function was fitted to "
                 "(Shock et al. 1992)",
    BELOW_0C: "below 0 C: aqueous standard states extrapolated below the HKF equations' range",
    OUTSIDE_FORMATION_RANGE: "a formation-reaction species outside the temperatures where constant "
                             "reaction enthalpy is trusted (its T_min_C to T_max_C)",
    FORMATION_ENTHALPY_MISSING: "a formation-reaction species whose source gives no reaction enthalpy, "
                                "away from 25 C",
    NEAR_CRITICAL: "within 2 K and 5 bar of water's critical point, where enthalpies, entropies and heat "
                   "capacities of aqueous species diverge (Gibbs energies stay finite)",
    ALKALINITY_NOT_USED: "an alkalinity was given with a pH: the pH is used, the alkalinity only where "
                         "the pH is blank",
    UNPARAMETERIZED_IONS: "ions without Pitzer parameters (Fe2+, NH4+, acetate ...) carry more than 1 % of the "
                          "ionic strength: they get only the Debye-Hueckel and mixing terms of the Pitzer model",
    T_AT_FREEZING: "the temperature is the fluid's own freezing point at its pressure (a 'freezing' cell, or a "
                   "blank one at a body's ice-ocean interface), from its water activity",
    "below_detection:SPECIES": "the species' cell was reported below the detection limit and taken by "
                               "the chosen policy (not measured, the limit, or half of it)",
    "assumed:SPECIES": "the species' amount is an assumed value ('assumed X' in the table)",
    "assumed_air_saturated:SPECIES": "N2(aq) or O2(aq) taken at saturation with air at 1 atm and the sample's "
                                     "temperature (salting-out neglected)",
    ionic_strength_flag("MODEL"): "ionic strength beyond the activity model's stated range (Davies 0.5, "
                                  "B-dot 1, Pitzer 6 mol/kg)",
    parameter_temperature_flag("MODEL"): "an ion pair whose interaction parameters are used outside the "
                                         "temperatures their source states (Pitzer model; held at the nearest "
                                         "end of that range): both ions at 0.01 mol/kg or more, or one of them "
                                         "and a trace ion (1 umol/kg or more, e.g. H+ with Cl-) more than 25 K "
                                         "outside",
}
