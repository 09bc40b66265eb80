"""Mixing two end-member fluids: conservative totals by mass, temperature by enthalpy or linearly.

With f the mass fraction of the first (hydrothermal) end-member in the mixture:
- totals: moles per kg of solution mix linearly, c = f c_a + (1 - f) c_b, and so does the water
  content W (kg water per kg solution); molality m = c / W
- charge imbalance (alkalinity) per kg of solution mixes the same way
- temperature: enthalpy conservation, h(T_mix, P) = f h_a + (1 - f) h_b with the specific
  enthalpies of pure water from IAPWS-95 (the salts' contribution is neglected, stated), or the
  linear rule T_mix = f T_a + (1 - f) T_b; pressure is the first end-member's
"""

import numpy as np

from ..errors import InputError
from ..water.iapws95 import M_WATER_KG_PER_MOL, water_state
from .samples import SampleSet

__all__ = ["mixture_samples", "mixing_temperature_enthalpy", "fraction_for_temperature", "end_member_row"]

def _specific_enthalpy_J_kg(T_K, P_bar):
    return water_state(T_K, P_bar).H_J_mol / M_WATER_KG_PER_MOL

def mixing_temperature_enthalpy(f, T_a, T_b, P_bar):
    """T [K] of the mixture conserving enthalpy: Newton on h(T) = f h_a + (1 - f) h_b."""
    f = np.asarray(f, float)
    P = np.broadcast_to(P_bar, f.shape).astype(float)
    h_target = (f * _specific_enthalpy_J_kg(T_a, P_bar) + (1 - f) * _specific_enthalpy_J_kg(T_b, P_bar))
    T = f * T_a + (1 - f) * T_b
    for _ in range(30):
        w = water_state(T, P)
        h = w.H_J_mol / M_WATER_KG_PER_MOL
        step = (h_target - h) / (w.Cp_J_mol_K / M_WATER_KG_PER_MOL)
        T = T + step
        if np.all(np.abs(step) < 1e-9):
            return T
    raise InputError("mixing: the enthalpy-conserving temperature did not converge")

def fraction_for_temperature(T_mix, T_a, T_b, P_bar, rule="enthalpy"):
    """Mass fraction of end-member a that gives mixtures at T_mix [K] (closed form per rule)."""
    T_mix = np.asarray(T_mix, float)
    lo, hi = min(T_a, T_b), max(T_a, T_b)
    if np.any((T_mix < lo) | (T_mix > hi)):
        raise InputError(f"mixing: temperatures must lie between the end-members' "
                         f"({lo - 273.15:.4g} and {hi - 273.15:.4g} degC)")
    if rule == "linear":
        return np.clip((T_mix - T_b) / (T_a - T_b), 0.0, 1.0)
    h_a, h_b = _specific_enthalpy_J_kg(T_a, P_bar), _specific_enthalpy_J_kg(T_b, P_bar)
    h = _specific_enthalpy_J_kg(T_mix, np.full(T_mix.shape, P_bar))
    # an end-member's own temperature gives f = 0 or 1 up to rounding of the enthalpies
    return np.clip((h - h_b) / (h_a - h_b), 0.0, 1.0)

def end_member_row(samples, name):
    """The row of the sample called ``name`` in a SampleSet, refusing a name it does not hold."""
    if name not in samples.names:
        raise InputError(f"mixing: no sample called {name!r}; samples are {', '.join(samples.names)}")
    return samples.names.index(name)

def mixture_samples(samples, hydrothermal, seawater, fractions, db, charge_imbalance, rule="enthalpy"):
    """A SampleSet of mixtures of two samples of ``samples``, and their charge targets [eq/kg].

    ``fractions``: mass fractions of the hydrothermal end-member; ``charge_imbalance``: sum z m of
    every sample in ``samples`` (from its own speciation).
    """
    if samples.gas_fugacity_bar:
        raise InputError("mixing: end-members with gas-fugacity columns cannot be mixed by mass; "
                         "give dissolved totals instead")
    a, b = end_member_row(samples, hydrothermal), end_member_row(samples, seawater)
    f = np.asarray(fractions, float)
    if np.any((f < 0) | (f > 1)):
        raise InputError("mixing: fractions must lie between 0 and 1")
    W, _ = samples.water_fraction_and_density(db)
    P = float(samples.P_bar[a])
    if rule == "enthalpy":
        T = mixing_temperature_enthalpy(f, samples.T_K[a], samples.T_K[b], P)
    elif rule == "linear":
        T = f * samples.T_K[a] + (1 - f) * samples.T_K[b]
    else:
        raise InputError(f"mixing: temperature rule {rule!r} is unknown; use 'enthalpy' or 'linear'")
    W_mix = f * W[a] + (1 - f) * W[b]
    totals = {}
    for name, m in samples.totals.items():
        ca, cb = m[a] * W[a], m[b] * W[b]
        if np.isnan(ca) and np.isnan(cb):
            continue
        totals[name] = (f * np.nan_to_num(ca) + (1 - f) * np.nan_to_num(cb)) / W_mix
    q = (f * charge_imbalance[a] * W[a] + (1 - f) * charge_imbalance[b] * W[b]) / W_mix
    n = f.size
    mixed = SampleSet(names=[f"f={x:.6g}" for x in f], T_K=T, P_bar=np.full(n, P),
                      pH=np.full(n, np.nan), pH_T_K=T.copy(), totals=totals, gas_fugacity_bar={},
                      density_kg_L=np.full(n, np.nan), density_estimated=np.zeros(n, bool))
    return mixed, q, W_mix
