"""Speciation: mass balance, mass action and an activity model, solved for all samples at once.

Unknowns per sample: log10 molality of each component master and log10 a(H+). Rows: mass balance
of each measured component (sum_i nu_ij m_i = total_j), and either a fixed pH or charge balance
(sum_i z_i m_i = target). A batched Newton iteration (np.linalg.solve over the sample axis) with
activity coefficients, ionic strength and water activity updated after every step; iteration
stops when every residual is below 1e-12 of its scale and activity coefficients have settled.
Redox couples are separate components and are not equilibrated with each other.
"""

from dataclasses import dataclass

import numpy as np
import pandas as pd

from ..activities.models import activity_model, ionic_strength, log10_water_activity
from ..constants import R_J_MOL_K
from ..errors import InputError, OutOfValidityError
from ..flags import (
    ALKALINITY_NOT_USED,
    ionic_strength_flag,
    join_flags,
)
from ..species.database import default_database
from ..species.properties import standard_properties
from ..water.born import debye_hueckel_A, debye_hueckel_B
from ..water.dielectric import dielectric_johnson_norton_1991
from ..water.iapws95 import psat_convention_bar, water_state
from ..water.ice import freezing_temperature
from ..water.melting import T_TRIPLE_K
from .samples import SampleSet, read_samples
from .system import build_system, complexes_of

__all__ = ["SpeciationResult", "speciate", "species_in_samples"]

LN10 = np.log(10.0)
ABSENT_LOG_M = -60.0       # log10 molality standing in for an unmeasured component
MAX_STEP = 2.0             # largest Newton step in log10 units
MAX_ITERATIONS = 300
PRE_STEPS = 3              # continued-fraction steps before Newton
TOLERANCE = 1e-11          # residuals, relative to each row's scale (mass balance to 1e-11)
GAMMA_TOLERANCE = 1e-10    # change of log10 gamma between iterations
OSCILLATION_LOG_GAMMA = 0.01   # a growing change of log10 gamma above this is damped
SIGNIFICANT_SHARE = 0.01   # a species holding this share of a component's total carries its caveats


@dataclass
class SpeciationResult:
    """Speciation of n samples over the system's species (arrays (n, n_species) unless noted)."""

    samples: list
    species: list
    T_K: np.ndarray
    P_bar: np.ndarray
    molality: np.ndarray
    log10_gamma: np.ndarray
    ionic_strength: np.ndarray          # (n,)
    pH: np.ndarray                      # in-situ pH (-log10 a H+), (n,)
    charge_imbalance: np.ndarray        # sum z m [eq/kg], (n,)
    log10_water_activity: np.ndarray    # (n,)
    totals: dict                        # component -> total molality (n,)
    composition: np.ndarray             # (n_species, n_masters): species = composition . masters + ...
    minerals: list
    saturation_index: np.ndarray        # (n, n_minerals)
    iterations: np.ndarray              # Newton iterations per sample (both stages), (n,)
    activity_model: str
    beyond_model_validity: np.ndarray   # ionic strength above the model's stated limit, (n,)
    model_flags: np.ndarray             # the activity model's own validity flags, (n,) text
    present: np.ndarray                 # bool (n, n_species): built only from measured components
    density_estimated: np.ndarray       # per-litre units converted with an estimated density, (n,)
    failure: np.ndarray = None          # per sample: why it could not be computed ('' if it was)
    input_flags: np.ndarray = None      # per sample: notes on the inputs (assumed, below detection)
    data_flags: np.ndarray = None       # per sample: caveats of the species data used, (n,) text
    standard_states: object = None      # StandardProperties (G) of the system at the in-situ states
    standard_rows: np.ndarray = None    # the samples those rows belong to (those solved)
    water_per_kg_solution: np.ndarray = None   # kg of water per kg of solution, (n,)
    density_kg_L: np.ndarray = None     # fluid density at in-situ T, P, (n,)

    def pool_molality(self, species):
        """Amount of ``species`` the sample's pools allow [mol/kg water], (n,).

        Species that equilibrate fast (CO2(aq), HCO3-, CO3^2- and their ion pairs; H2S(aq) and
        HS-; NH4+ and NH3(aq)) share their component's analytical total: a reaction consuming any
        one of them can draw on the whole pool, whichever species a reaction or column names. A
        species built from several components is limited by the scarcest (total / coefficient);
        one built from water alone (H+, OH-) is not limited (inf).
        """
        c = self.composition[self.species.index(species)]
        used = np.flatnonzero(c > 0)
        if used.size == 0:
            return np.full(len(self.samples), np.inf)
        masters = list(self.totals)
        pools = np.column_stack([self.totals[masters[j]] / c[j] for j in used])
        return pools.min(axis=1)

    def freezing_point_K(self):
        """Temperature [K] at which each sample freezes to ice at its pressure, from its water
        activity under the chosen activity model (:func:`~redoxgibbs.water.ice.freezing_temperature`)."""
        return freezing_temperature(self.P_bar, self.log10_water_activity * LN10)

    @property
    def log10_activity(self):
        """log10 activity (n, n_species) of every species present; -inf where a species is absent."""
        with np.errstate(divide="ignore"):
            return np.where(self.present, np.log10(np.where(self.present, self.molality, 1.0)) + self.log10_gamma, -np.inf)

    def sample_flags(self):
        """Per sample, the comma-joined validity flags of the speciation ('' where none)."""
        flags = np.full(len(self.samples), "", dtype=object)
        flags[self.beyond_model_validity] = ionic_strength_flag(self.activity_model)
        flags = join_flags(join_flags(flags, self.model_flags), self.input_flags)
        return flags if self.data_flags is None else join_flags(flags, self.data_flags)

    def to_long_frame(self):
        """One row per sample x species, units in the column names; a sample that could not be
        computed keeps one row, with its reason in ``failure``."""
        n, s = self.molality.shape
        frame = pd.DataFrame({
            "sample": np.repeat(self.samples, s), "species": np.tile(self.species, n),
            "molality_mol_per_kg": self.molality.ravel(), "log10_gamma": self.log10_gamma.ravel(),
            "log10_activity": self.log10_activity.ravel(),
            "ionic_strength_mol_per_kg": np.repeat(self.ionic_strength, s),
            "flags": np.repeat(self.sample_flags(), s), "failure": ""})
        keep = self.present.ravel()
        failed = np.flatnonzero(self.failure != "")
        first_row = np.zeros(n * s, bool)
        first_row[failed * s] = True
        frame.loc[first_row, ["species", "failure"]] = np.column_stack(
            [np.full(failed.size, ""), self.failure[failed]])
        return frame[keep | first_row].reset_index(drop=True)

    def summary_frame(self):
        """One row per sample: T [degC], P [bar], in-situ pH, ionic strength [mol/kg], charge imbalance
        [eq/kg], iterations, flags and failure."""
        return pd.DataFrame({
            "sample": self.samples, "T_C": self.T_K - 273.15, "P_bar": self.P_bar,
            "pH_insitu": self.pH, "ionic_strength_mol_per_kg": self.ionic_strength,
            "charge_imbalance_eq_per_kg": self.charge_imbalance,
            "beyond_activity_model_validity": self.beyond_model_validity,
            "density_estimated": self.density_estimated, "newton_iterations": self.iterations,
            "flags": self.sample_flags(), "failure": self.failure})


def _log_k(system, db, T_K, P_bar, water, gas_masters):
    """log10 K of formation from the masters of every species and mineral, log10 K of each
    gas -> dissolved-master reaction (``gas_masters``: gas -> master), and water density; one
    evaluation of the standard states for all of them."""
    gases = list(gas_masters)
    names = system.species + system.minerals + ["H2O(l)"] + gases
    props = standard_properties(names, T_K, P_bar, db=db, properties=("G",), water=water)
    G = props.G
    n_sp, n_min = len(system.species), len(system.minerals)
    G_w = G[:, n_sp + n_min]
    G_masters = G[:, [system.species.index(m) for m in system.masters]]
    RT = R_J_MOL_K * T_K[:, None] * LN10
    dG_sp = G[:, :n_sp] - G_masters @ system.nu.T - G_w[:, None] * system.nu_w
    dG_min = G[:, n_sp:n_sp + n_min] - G_masters @ system.nu_min.T - G_w[:, None] * system.nu_w_min
    G_aq = G[:, [system.species.index(gas_masters[g]) for g in gases]]
    dG_gas = G_aq - G[:, n_sp + n_min + 1:]
    return -dG_sp / RT, -dG_min / RT, -dG_gas / RT, props


def _newton(system, model, logK, A, B, T_K, totals, fixed_log_a, log_aH, charge_target, solve_H,
            start=None):
    """Batched Newton solve; returns molality, log10 gamma, I, log a_w, the unknowns, iterations.

    ``start``: (unknowns, log10 gamma, log a_w) of an earlier solve of the same samples (another
    T, P), from which the iteration starts instead of from the totals.

    Unknowns x = (log10 m of the k masters, log10 a_H+). Rows: mass balance per master and charge
    balance. With rows = [nu | z] and columns = [nu | nu_H] (species x (k+1)), the Jacobian is
    J_rc = ln10 sum_s rows_sr cols_sc m_s: one (n x s) @ (s x (k+1)^2) product per iteration,
    restricted to the unknowns that have an equation (grouped by pattern). Samples leave the
    iteration as they converge.
    """
    n, k = totals.shape
    nu_w, z = system.nu_w, system.charge
    rows = np.column_stack([system.nu, z])
    cols = np.column_stack([system.nu, system.nu_H])
    W = (rows[:, :, None] * cols[:, None, :]).reshape(len(system.species), (k + 1) ** 2) * LN10
    measured = np.isfinite(totals) & (totals > 0)   # zero or blank: nothing to balance
    fixed = np.isfinite(fixed_log_a)
    if start is None:
        x = _dominant_species_start(system, logK, totals, measured, log_aH)
    else:
        x = start[0].copy()
    x[:, :k] = np.where(fixed, fixed_log_a, x[:, :k])
    x[:, k] = np.where(np.isfinite(log_aH), log_aH, x[:, k])
    target = np.column_stack([np.nan_to_num(totals), charge_target])
    frozen = np.concatenate([~measured | fixed, ~solve_H[:, None]], axis=1)
    is_fixed = np.column_stack([fixed, np.zeros(n, bool)])
    fixed_full = np.column_stack([np.where(fixed, fixed_log_a, 0.0), np.zeros(n)])
    free_masters = np.column_stack([~fixed, np.zeros(n, bool)]).astype(float)  # log a = x + lg
    at_states = model.at(system.species, z, T_K, A, B)
    if start is None:   # activity coefficients of the masters alone, at their totals
        m0 = np.zeros((n, len(system.species)))
        m0[:, :k] = np.nan_to_num(totals)
        lg = at_states.activities(m0)[0]
        log_aw = log10_water_activity(np.nan_to_num(totals).sum(axis=1))
    else:
        lg, log_aw = start[1].copy(), start[2].copy()
    m = np.zeros((n, len(system.species)))
    iterations = np.zeros(n, dtype=int)
    active = np.arange(n)
    converged = np.ones(n, bool)
    relax = np.ones(n)                  # fraction of each gamma update taken (halved on oscillation)
    last_change = np.full(n, np.inf)
    abs_rows = np.abs(rows)
    # which unknowns have an equation is fixed per sample: group samples by that pattern once
    codes = frozen.astype(np.int64) @ (1 << np.arange(k + 1))
    pattern_keys, pattern_of = np.unique(codes, return_inverse=True)
    pattern_free = [~frozen[np.flatnonzero(pattern_of == p)[0]] for p in range(pattern_keys.size)]
    W3 = W.reshape(-1, k + 1, k + 1)
    pattern_W = [W3[:, f][:, :, f].reshape(W.shape[0], -1) for f in pattern_free]
    cols_masters = np.r_[np.arange(k), 0]  # the H+ column carries no gamma (a_H is the unknown)

    def molalities(idx, lg_now, aw_now):
        la = x[idx] + lg_now[:, cols_masters] * free_masters[idx]
        la = np.where(is_fixed[idx], fixed_full[idx], la)
        log_m = logK[idx] + la @ cols.T + aw_now[:, None] * nu_w - lg_now
        return 10.0 ** np.minimum(log_m, 3.0)

    # a few continued-fraction steps first (one molality evaluation each, no Jacobian): each
    # master is scaled by total / (what the current guess puts in its mass balance)
    balanced = measured & ~fixed
    for _ in range(PRE_STEPS if start is None else 0):
        ma = molalities(slice(None), lg, log_aw)
        held = ma @ system.nu
        with np.errstate(divide="ignore", invalid="ignore"):
            ratio = np.where(balanced, np.nan_to_num(totals) / np.where(held > 0, held, 1.0), 1.0)
        x[:, :k] += np.clip(np.log10(np.where(ratio > 0, ratio, 1.0)), -MAX_STEP, MAX_STEP)

    for _ in range(MAX_ITERATIONS):
        idx = slice(None) if active.size == n else active   # a view while all samples iterate
        # one fixed-point update of gamma and a_w at the current unknowns, then a Newton step at
        # those activity coefficients (their lag shrinks the error about 50-fold per iteration)
        ma = molalities(idx, lg[idx], log_aw[idx])
        lg_new, aw_new = at_states.activities(ma, idx)
        changed = np.abs(lg_new - lg[idx]).max(axis=1)
        # concentrated solutions (pH near 0 or 14, brines) can make the plain update of gamma
        # oscillate: take half the share of it wherever the change grew, and a larger share again
        # wherever it shrinks fast
        growing = (changed > last_change[idx]) & (changed > OSCILLATION_LOG_GAMMA)
        f = np.where(growing, 0.5 * relax[idx],
                     np.where(changed < 0.5 * last_change[idx], np.minimum(1.0, 1.5 * relax[idx]), relax[idx]))
        f = np.maximum(f, 1.0 / 64)
        relax[idx], last_change[idx] = f, changed
        if (f < 1.0).any():
            lg_new = lg[idx] + f[:, None] * (lg_new - lg[idx])
            aw_new = log_aw[idx] + f * (aw_new - log_aw[idx])
        lg[idx], log_aw[idx] = lg_new, aw_new
        ma = molalities(idx, lg_new, aw_new)
        m[idx] = ma
        fr = frozen[idx]
        scale = ma @ abs_rows + 1e-300
        R = np.where(fr, 0.0, (ma @ rows - target[idx]) / scale)
        settled = (np.abs(R).max(axis=1) < TOLERANCE) & (changed < GAMMA_TOLERANCE)
        if settled.all():
            break
        if settled.any():
            go = ~settled
            active, ma, R, scale, fr = active[go], ma[go], R[go], scale[go], fr[go]
        step = np.zeros((active.size, k + 1))
        groups = pattern_of[active]
        for p in np.unique(groups):
            free = pattern_free[p]
            if not free.any():
                continue
            sel = slice(None) if groups.size == 1 or (groups == p).all() else np.flatnonzero(groups == p)
            nf = int(free.sum())
            J = (ma[sel] @ pattern_W[p]).reshape(-1, nf, nf) / scale[sel][:, free, None]
            sub = _solve_or_least_squares(J, -R[sel][:, free, None])[..., 0]
            if isinstance(sel, slice):
                step[:, free] = sub
            else:
                step[np.ix_(sel, np.flatnonzero(free))] = sub
        x[active] += np.clip(step, -MAX_STEP, MAX_STEP)
        iterations[active] += 1
    else:
        converged[active] = False
    return m, lg, ionic_strength(m, z), log_aw, x, iterations, converged


def _all_samples(out, ok, n, n_species, n_minerals):
    """The solved arrays for all n samples: as solved when every sample was, else NaN-filled with
    the solved ones placed (no copy in the common case)."""
    if out is not None and ok.all():
        return out
    shapes = [(n, n_species), (n, n_species), (n,), (n,), (n,), (n,), (n,), (n, n_minerals), (n,)]
    full = [np.zeros(sh, dtype=int) if k == 5 else np.zeros(sh, dtype=bool) if k == 6 else np.full(sh, np.nan)
            for k, sh in enumerate(shapes)]
    if out is not None:
        for target, value in zip(full, out):
            target[ok] = value
    return full


def _solve_or_least_squares(J, b):
    """np.linalg.solve over a stack, falling back to the pseudo-inverse when a Jacobian is
    singular (a component whose species all vanish): the step is then the least-squares one."""
    try:
        return np.linalg.solve(J, b)
    except np.linalg.LinAlgError:
        with np.errstate(all="ignore"):
            return np.nan_to_num(np.linalg.pinv(J) @ b)


def _species_data_flags(props, rows, m, system, masters, n):
    """Per sample (n,), the standard-state caveats (a formation species outside the temperatures
    where its constant reaction enthalpy holds, HKF extrapolations ...) of the species that hold at
    least SIGNIFICANT_SHARE of the total of one of their components; the H+ and water budgets do
    not count. ``props`` covers the samples ``rows``."""
    out = np.full(n, "", dtype=object)
    if props is None:
        return out
    n_sp = len(system.species)
    flagged = {name: where[:, :n_sp] for name, where in props.flags.items() if where[:, :n_sp].any()}
    if not flagged:
        return out
    mr = np.nan_to_num(m[rows])
    cols = np.flatnonzero(np.any([w.any(axis=0) for w in flagged.values()], axis=0))   # species ever flagged
    significant = np.zeros((mr.shape[0], cols.size), bool)
    for j, master in enumerate(masters):
        if master == "H+" or not system.nu[cols, j].any():
            continue
        total = mr @ np.abs(system.nu[:, j])
        held = mr[:, cols] * np.abs(system.nu[cols, j])
        significant |= (system.nu[cols, j] != 0) & (held >= SIGNIFICANT_SHARE * total[:, None]) & (total[:, None] > 0)
    part = np.full(mr.shape[0], "", dtype=object)
    for name, where in flagged.items():
        part = join_flags(part, np.where((where[:, cols] & significant).any(axis=1), name, ""))
    out[rows] = part
    return out


def _dominant_species_start(system, logK, totals, measured, log_aH):
    """Starting log10 molalities of the masters: each master at the value where the largest of
    its single-component species (the master itself, its hydrolysis or protonation species) holds
    the whole total, at the given pH (pH 7 where it is to be solved). Species built from several
    components and activity coefficients are left out of this first guess."""
    n, k = totals.shape
    log_aH = np.where(np.isfinite(log_aH), log_aH, -7.0)
    x = np.full((n, k + 1), ABSENT_LOG_M)
    x[:, k] = log_aH
    own = (system.nu != 0).sum(axis=1) == 1
    with np.errstate(divide="ignore"):
        log_total = np.log10(np.where(measured, totals, 1.0))
    for j in range(k):
        sp = np.flatnonzero(own & (system.nu[:, j] > 0))
        nu = system.nu[sp, j]
        guess = (log_total[:, j, None] - logK[:, sp] - system.nu_H[sp] * log_aH[:, None]) / nu
        x[:, j] = np.where(measured[:, j], guess.min(axis=1), ABSENT_LOG_M)
    return x


def _components(samples, db):
    """Component masters (measured totals, then gases given as fugacities), the gas masters and
    the (n, k) totals array (NaN: not measured, or fixed by a gas fugacity)."""
    masters = list(samples.totals)
    gas_masters = {}
    for gas in samples.gas_fugacity_bar:
        aq = db.resolve(db.record(gas).formula + "(aq)")
        if aq in masters:
            raise InputError(f"columns {gas} and {aq}: give either the gas fugacity or the dissolved total")
        gas_masters[gas] = aq
        masters.append(aq)
    if not masters:
        raise InputError("samples: no composition columns (e.g. 'Na+ [mmol/kg]') were found")
    n = len(samples)
    totals = np.column_stack([samples.totals.get(m, np.full(n, np.nan)) if m not in gas_masters.values()
                              else np.full(n, np.nan) for m in masters])
    return masters, gas_masters, totals


def _presence(system, totals, gas_masters):
    """Masks (n, n_species): species built only from measured components (``present``), and of
    those, from components with non-zero totals (``nonzero``); plus the (n, k) masks of
    unmeasured and zero components. Gas-fixed components count as measured and non-zero."""
    is_gas = np.isin(np.array(system.masters), list(gas_masters.values()))[None, :]
    unmeasured = ~np.isfinite(totals) & ~is_gas
    zero = (totals == 0) & ~is_gas
    uses = system.nu[None, :, :] != 0
    present = ~(uses & unmeasured[:, None, :]).any(axis=2)
    nonzero = present & ~(uses & zero[:, None, :]).any(axis=2)
    return present, nonzero, unmeasured, zero


#: Zero levels of protons of the total alkalinity (Dickson 1981, Deep-Sea Res. 28A, 609): acids
#: with pK >= 4.5 count from their acid form; other components count from their free ion
ALKALINITY_ZERO_LEVELS = ("CO2(aq)", "B(OH)3(aq)", "H2S(aq)", "NH4+", "SiO2(aq)", "CH3COOH(aq)", "H2PO4-")


def _zero_level_charges(system, db):
    """Charge of each component's zero-level species (the master's own charge where no zero level
    of the list belongs to the component)."""
    charges = np.array([db.record(m).charge for m in system.masters], dtype=float)
    for j in range(len(system.masters)):
        for name in ALKALINITY_ZERO_LEVELS:
            if name in system.species:
                row = system.nu[system.species.index(name)]
                if row[j] == 1 and np.count_nonzero(row) == 1:
                    charges[j] = db.record(name).charge
    return charges


def _frozen_samples(samples, log10_aw, computed):
    """Per sample, 'frozen: ...' where it is colder than its own freezing point ('' elsewhere).
    Only computed samples below the triple-point temperature are checked: a solute only lowers
    the freezing point."""
    out = np.full(len(samples), "", dtype=object)
    cold = np.flatnonzero(computed & (samples.T_K < T_TRIPLE_K))
    if cold.size == 0:
        return out
    T_freeze = freezing_temperature(samples.P_bar[cold], log10_aw[cold] * LN10)
    for i, tf in zip(cold, T_freeze):
        if samples.T_K[i] < tf - 0.005:
            out[i] = (f"frozen: at {samples.T_K[i] - 273.15:.4g} degC and {samples.P_bar[i]:.6g} bar the "
                      f"fluid's freezing point is {tf - 273.15:.4g} degC (ice Ih against its water "
                      f"activity, {10 ** log10_aw[i]:.5f}); give a warmer temperature")
    return out


def _at_own_freezing_points(s, activity_model_name, pH_from_charge_balance, db, charge_balance_target, water,
                            passes=3):
    """A copy of the samples in which those marked ``at_freezing`` take their own freezing point at
    their pressure: speciated at the current temperature, then set to the freezing point of the
    water activity found (three times: a_w changes by about 1e-5 per K). A freezing point colder than
    any liquid evaluated here is the sample's failure."""
    s = s.subset(np.ones(len(s), bool))
    settle = s.at_freezing & (s.problems == "")
    rows = np.flatnonzero(settle)
    if rows.size == 0:
        return s
    sub = s.subset(settle)
    sub.at_freezing = np.zeros(rows.size, bool)
    target = None if charge_balance_target is None else np.asarray(charge_balance_target, float)[rows]
    follows = np.abs(sub.pH_T_K - sub.T_K) < 1e-9     # pH given at the in-situ temperature
    for _ in range(passes):
        result = speciate(sub, activity_model_name, pH_from_charge_balance, db, target, water)
        T_freeze = result.freezing_point_K()
        known = np.isfinite(T_freeze) & (result.failure == "")
        sub.T_K = np.where(known, T_freeze, sub.T_K)
        sub.pH_T_K = np.where(follows & known, sub.T_K, sub.pH_T_K)
    s.T_K[rows], s.pH_T_K[rows] = sub.T_K, sub.pH_T_K
    cold = rows[(result.failure == "") & ~np.isfinite(T_freeze)]
    s.problems[cold] = ("outside validity: the fluid's freezing point at this pressure lies below the coldest "
                        "liquid water evaluated here (-20 degC); give a temperature")
    return s


def species_in_samples(samples, db=None):
    """Aqueous species with a non-zero amount in at least one sample (no solving needed: a species
    is there when every component it is built from was measured above zero, or fixed by a gas)."""
    db = default_database() if db is None else db
    s = samples if isinstance(samples, SampleSet) else read_samples(samples, db=db)
    masters, gas_masters, totals = _components(s, db)
    system = build_system(masters, db)
    nonzero = _presence(system, totals, gas_masters)[1]
    return {name for name, there in zip(system.species, nonzero.any(axis=0)) if there}


def _water_problems(T_K, P_bar, water):
    """Per state, the water layer's refusal ('' where water is liquid). The common case, all
    liquid, costs one evaluation; only when something is refused are the distinct states tried
    one at a time to name which."""
    problems = np.full(T_K.shape, "", dtype=object)
    try:
        water(T_K, P_bar, caloric=False)
        return problems
    except OutOfValidityError:
        pass
    pairs, inverse = np.unique(np.stack([T_K, P_bar], axis=1), axis=0, return_inverse=True)
    for u, (t, p) in enumerate(pairs):
        try:
            water(np.array([t]), np.array([p]), caloric=False)
        except OutOfValidityError as err:
            problems[inverse.ravel() == u] = f"outside validity: {err}"
    return problems


def _solve_samples(s, totals, system, masters, gas_masters, model, charge_target, solve_H,
                   shifted, water, db):
    """Both speciation stages for samples that can be computed; returns arrays for them."""
    n, k = len(s), len(masters)

    def stage(T_K, P_bar, log_aH, charge_target, solve_H, water=water, start=None):
        logK, logK_min, logK_gas, props = _log_k(system, db, T_K, P_bar, water, gas_masters)
        rho = props.water_density_kg_m3
        fixed = np.full((n, k), np.nan)
        for j, (gas, aq) in enumerate(gas_masters.items()):
            with np.errstate(divide="ignore"):
                fixed[:, masters.index(aq)] = np.log10(s.gas_fugacity_bar[gas]) + logK_gas[:, j]
        eps = dielectric_johnson_norton_1991(T_K, rho)[0]
        A, B = debye_hueckel_A(T_K, rho, eps), debye_hueckel_B(T_K, rho, eps)
        out = _newton(system, model, logK, A, B, T_K, totals, fixed, log_aH, charge_target, solve_H, start)
        return out, logK_min, props

    # stage 1: where pH was measured at another temperature, speciate there to fix the charge balance
    iterations = np.zeros(n, dtype=int)
    converged = np.ones(n, bool)
    start = None
    if shifted.any():
        P_lab = psat_convention_bar(s.pH_T_K)
        # laboratory states are few and distinct: always the exact water path
        (m, lg, I, law, x, its, ok), _, _ = stage(s.pH_T_K, P_lab, -s.pH, np.zeros(n), np.zeros(n, bool),
                                                  water=water_state)
        charge_target = np.where(shifted, m @ system.charge, charge_target)
        iterations += np.where(shifted, its, 0)
        converged &= ok | ~shifted
        start = (x, lg, law)   # the in-situ solve starts from the laboratory one
    (m, lg, I, law, x, its, ok), logK_min, props = stage(s.T_K, s.P_bar, np.where(solve_H, np.nan, -s.pH),
                                                         charge_target, solve_H, start=start)
    return (m, lg, I, law, x[:, k], iterations + its, converged & ok, logK_min, props.water_density_kg_m3), props


def speciate(samples, activity_model_name="bdot", pH_from_charge_balance=False, db=None,
             charge_balance_target=None, water=water_state):
    """Speciate samples at their in-situ temperature and pressure.

    Mass balances of every measured component and charge balance (or a fixed pH), with the law of
    mass action for every species built from the components, solved by Newton's method for all
    samples at once. pH is given at in-situ T; or measured at ``pH T`` and carried to in-situ T, P
    by re-speciating at constant totals and charge balance; or solved from charge balance.

    Parameters
    ----------
    samples : str, path, pandas.DataFrame or SampleSet
        Sample table (CSV or Excel) or an already-read sample set.
    activity_model_name : {'ideal', 'davies', 'bdot', 'pitzer'}
        Activity model (``pitzer`` leaves the ion pairs its parameters carry out of the species).
    pH_from_charge_balance : bool
        Where the pH cell is blank, solve pH from sum z m = ``charge_balance_target``.
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).
    charge_balance_target : array, optional
        Sum of z m [eq per kg of water] per sample (default 0; a mixture carries its end-members'
        imbalance, i.e. their alkalinity).
    water : callable
        The exact water path or a :class:`~redoxgibbs.water.table.WaterTable` for in-situ states.

    Returns
    -------
    SpeciationResult
        Molalities [mol/kg], log10 activity coefficients, ionic strength [mol/kg], in-situ pH, water
        activity, saturation indices and per-sample flags. A sample that cannot be computed (outside
        the engine's range, frozen, vapour, no convergence) keeps NaN values and its reason in
        ``failure``; the others are computed.
    """
    db = default_database() if db is None else db
    s = samples if isinstance(samples, SampleSet) else read_samples(samples, db=db)
    if s.at_freezing.any():
        s = _at_own_freezing_points(s, activity_model_name, pH_from_charge_balance, db, charge_balance_target, water)
    model = activity_model(activity_model_name)
    masters, gas_masters, totals = _components(s, db)
    system = build_system(masters, db, omit=complexes_of(model.basis_ions, db) - set(model.model_species))
    missing_pH = np.isnan(s.pH)
    by_alkalinity = missing_pH & np.isfinite(s.alkalinity_eq_kg)
    if (missing_pH & ~by_alkalinity).any() and not pH_from_charge_balance:
        i = int(np.flatnonzero(missing_pH & ~by_alkalinity)[0])
        raise InputError(f"row {s.names[i]}, column 'pH': no pH given; give one, an alkalinity, or ask for pH "
                         "from charge balance")
    n, k = len(s), len(masters)
    charge_target = np.zeros(n) if charge_balance_target is None else np.asarray(charge_balance_target, float)
    if by_alkalinity.any():
        # each species' charge is its zero level's minus the protons it lacks, so
        # sum z m = sum_j z(zero level of j) T_j - alkalinity: the charge balance with this target
        # is the alkalinity equation (Dickson 1981 zero levels)
        conservative = np.nan_to_num(totals) @ _zero_level_charges(system, db)
        charge_target = np.where(by_alkalinity, conservative - s.alkalinity_eq_kg, charge_target)
    input_flags = join_flags(s.flags, np.where(np.isfinite(s.alkalinity_eq_kg) & ~missing_pH,
                                               ALKALINITY_NOT_USED, ""))
    shifted = ~missing_pH & (np.abs(s.pH_T_K - s.T_K) > 1e-9)
    failure = s.problems.copy()

    def solve(ok):
        if ok.all():
            return _solve_samples(s, totals, system, masters, gas_masters, model, charge_target,
                                  missing_pH | shifted, shifted, water, db)
        return _solve_samples(s.subset(ok), totals[ok], system, masters, gas_masters, model, charge_target[ok],
                              (missing_pH | shifted)[ok], shifted[ok], water, db)

    ok = failure == ""
    out = props = None
    if ok.any():
        try:
            out, props = solve(ok)
        except OutOfValidityError:
            # some state is not liquid water: name which (one water evaluation per distinct state,
            # only on this path) and solve the others
            failure[ok] = _water_problems(s.T_K[ok], s.P_bar[ok], water_state)
            lab = ok & shifted & (failure == "")
            if lab.any():
                lab_problems = _water_problems(s.pH_T_K[lab], psat_convention_bar(s.pH_T_K[lab]), water_state)
                failure[lab] = np.where(lab_problems != "", "pH temperature: " + lab_problems.astype(str), "")
            ok = failure == ""
            out, props = solve(ok) if ok.any() else (None, None)
    m, lg, I, law, xH, iterations, converged, logK_min, rho_w = _all_samples(
        out, ok, n, len(system.species), len(system.minerals))
    pH = -xH
    if out is not None:
        lost = np.flatnonzero(ok & ~converged)
        failure[lost] = (f"speciation did not converge in {MAX_ITERATIONS} iterations; check the "
                         "totals, pH and charge balance of this sample")
        frozen = _frozen_samples(s, law, ok)
        failure[frozen != ""] = frozen[frozen != ""]
    failed = failure != ""
    data_flags = np.where(failed, "", _species_data_flags(props, ok, m, system, masters, n))
    for arr in (m, lg, law, I, pH, logK_min, rho_w):
        arr[failed] = np.nan
    W, _ = s.water_fraction_and_density(db)
    present, nonzero, unmeasured, zero = _presence(system, totals, gas_masters)
    present = present & ~failed[:, None]
    m = np.where(nonzero | failed[:, None], m, 0.0)
    positive = m[:, :k] > 0
    la = np.where(positive, np.log10(np.where(positive, m[:, :k], 1.0)), ABSENT_LOG_M) + lg[:, :k]
    si = logK_min + la @ system.nu_min.T + law[:, None] * system.nu_w_min - pH[:, None] * system.nu_H_min
    mineral_ok = ~((system.nu_min[None, :, :] != 0) & (unmeasured | zero)[:, None, :]).any(axis=2)
    si = np.where(mineral_ok, si, np.nan)
    return SpeciationResult(
        samples=s.names, species=system.species, T_K=s.T_K, P_bar=s.P_bar, molality=m,
        log10_gamma=lg, ionic_strength=I, pH=pH, charge_imbalance=m @ system.charge,
        log10_water_activity=law, totals={mn: m @ system.nu[:, j] for j, mn in enumerate(masters)},
        composition=system.nu,
        minerals=system.minerals, saturation_index=si, iterations=iterations,
        activity_model=model.name, beyond_model_validity=I > model.I_max, present=present,
        model_flags=np.where(failed, "", model.validity_flags(system.species, system.charge, np.nan_to_num(m), s.T_K)),
        density_estimated=s.density_estimated, failure=failure, input_flags=input_flags,
        data_flags=data_flags, standard_states=props, standard_rows=ok,
        water_per_kg_solution=W,
        density_kg_L=s.insitu_density_kg_L(W, rho_w))
