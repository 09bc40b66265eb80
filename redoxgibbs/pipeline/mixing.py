"""Gibbs energies and energy densities along the mixing path of two end-member fluids.

Each mixture is re-speciated with pH from charge balance, its totals and alkalinity (charge
imbalance) mixed conservatively from the end-members, whose own pH fixes their imbalance; redox
couples are not equilibrated with each other. Energy is reported per kg of mixed fluid and per kg
of hydrothermal fluid (divided by its mass fraction f).
"""

import numpy as np
import pandas as pd

from ..errors import InputError
from ..species.database import default_database
from ..speciation.mixing import end_member_row, fraction_for_temperature, mixture_samples
from ..speciation.samples import SampleSet, read_samples
from ..speciation.solver import speciate
from .evaluate import evaluate

__all__ = ["mixtures", "mixing_energetics"]


def mixtures(samples, hydrothermal, seawater, fractions, activity_model_name, db, rule="enthalpy"):
    """Mixtures of two end-members of ``samples`` (a SampleSet) at mass ``fractions`` of the
    hydrothermal one, and their charge-balance targets: the end-members' own charge imbalance
    (their alkalinity), mixed by mass. An end-member that cannot be computed is refused by name."""
    a, b = end_member_row(samples, hydrothermal), end_member_row(samples, seawater)
    ends = speciate(samples, activity_model_name, pH_from_charge_balance=True, db=db)
    for i in (a, b):
        if ends.failure[i]:
            raise InputError(f"mixing: end-member {samples.names[i]!r} could not be computed: {ends.failure[i]}")
    mixed, q, _ = mixture_samples(samples, hydrothermal, seawater, fractions, db, ends.charge_imbalance, rule)
    return mixed, q


def mixing_energetics(samples, hydrothermal, seawater, reactions, fractions=None, temperatures_C=None,
                      rule="enthalpy", activity_model_name="bdot", db=None):
    """Energetics along the mixing path of a hydrothermal fluid into a cold end-member.

    Totals and alkalinity mix by mass; the temperature by enthalpy conservation (IAPWS-95) or
    linearly; each mixture's pH from its charge balance.

    Parameters
    ----------
    samples : str, path, pandas.DataFrame or SampleSet
        Samples holding both end-members.
    hydrothermal, seawater : str
        Sample names of the hot and the cold end-member.
    reactions : list of NamedReaction
        The reactions.
    fractions : list of float, optional
        Mass fractions of the hydrothermal fluid (or give ``temperatures_C``).
    temperatures_C : list of float, optional
        Mixture temperatures [degC], converted to fractions by the same ``rule``.
    rule : {'enthalpy', 'linear'}
        How a mixture takes its temperature.
    activity_model_name : str
        Activity model.
    db : SpeciesDatabase, optional
        Species data.

    Returns
    -------
    pandas.DataFrame
        One row per mixture x reaction: fraction, T [degC], in-situ pH, dGr [kJ/mol], energy per kg
        of mixed fluid and per kg of hydrothermal fluid [J/kg], failure.
    """
    db = default_database() if db is None else db
    s = samples if isinstance(samples, SampleSet) else read_samples(samples, db=db)
    if temperatures_C is not None:
        a, b = end_member_row(s, hydrothermal), end_member_row(s, seawater)
        fractions = fraction_for_temperature(np.asarray(temperatures_C, float) + 273.15, s.T_K[a],
                                             s.T_K[b], float(s.P_bar[a]), rule)
    mixed, q = mixtures(s, hydrothermal, seawater, fractions, activity_model_name, db, rule)
    ev = evaluate(mixed, reactions, activity_model_name, pH_from_charge_balance=True,
                  charge_balance_target=q, db=db)
    result = ev.speciation
    frame = ev.energetics.to_frame()
    f = np.repeat(np.asarray(fractions, float), len(reactions))
    frame.insert(1, "hydrothermal_fraction", f)
    frame["pH_insitu"] = np.repeat(result.pH, len(reactions))
    frame["energy_J_per_kg_mixed_fluid"] = frame["energy_density_J_per_kg_solution"]
    with np.errstate(divide="ignore", invalid="ignore"):
        frame["energy_J_per_kg_hydrothermal_fluid"] = np.where(f > 0, frame["energy_J_per_kg_mixed_fluid"] / f, np.nan)
    frame["temperature_rule"] = rule
    return pd.DataFrame(frame)
