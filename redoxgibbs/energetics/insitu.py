"""In-situ Gibbs energies and energy densities over samples x reactions.

dGr = dG0(T, P) + RT ln Q, with log10 Q = sum_i nu_i log10 a_i (activities from speciation);
affinity = -dGr. Energy density: -dGr times the amount of reaction the limiting reactant allows
per kg of water, min over consumed dissolved species of (pool / |nu|), where the pool is the
analytical total of the species' component (dissolved inorganic carbon for CO2(aq), HCO3- or
CO3^2-; total sulfide for H2S(aq) or HS-), whichever species the reaction names; water, H+,
OH-, gases given as fugacities and solids are not limiting. Zero, and flagged, where the reaction is not exergonic.
"""

from dataclasses import dataclass

import numpy as np
import pandas as pd

from ..constants import R_J_MOL_K
from ..flags import join_flags
from ..species.database import default_database
from ..species.properties import standard_properties
from ..water.iapws95 import water_state
from .growth import biomass_yield_Cmol_per_mol_donor, growth_models

__all__ = [
    "DEFAULT_MINIMUM_ENERGY_KJ",
    "InsituEnergetics",
    "energy_density_kernel",
    "gibbs_energy_kernel",
    "insitu_energetics",
]

LN10 = np.log(10.0)
#: Smallest |dGr| a catabolism is taken to use, per mole of reaction as written (Hoehler 2004,
#: Geobiology 2, 205: about -10 kJ/mol for methanogens in sediments; from memory). User-settable.
DEFAULT_MINIMUM_ENERGY_KJ = 10.0
NOT_LIMITING = ("H2O(l)", "H+", "OH-")


def gibbs_energy_kernel(dG0, log10_a, nu, T_K):
    """dGr [J/mol] and log10 Q of reactions: dG0 (n, r) [J/mol], log10_a (n, s), nu (s, r), T (n,)."""
    log_q = log10_a @ nu
    dGr = log_q * (R_J_MOL_K * LN10 * np.asarray(T_K, float))[:, None]
    dGr += dG0                      # in place: one (n, r) array less to allocate and fill
    return dGr, log_q


def energy_density_kernel(dGr, amounts, nu_consumed):
    """Energy density [J/kg water] from dGr (n, r), amounts (n, s) [mol/kg] and |nu| of consumed
    species (s, r; 0 where a species is not consumed or not limiting).

    Returns (J/kg, index of the limiting species (n, r), -1 where nothing limits). The loop runs
    over reactions (each has one to three limiting candidates), never over samples.
    """
    n, r = dGr.shape
    by_species = np.ascontiguousarray(amounts.T)          # one contiguous row per species
    allowed = np.zeros((r, n))                            # one contiguous row per reaction
    limiting = np.full((r, n), -1, dtype=np.int16)
    for k in range(r):
        idx = np.flatnonzero(nu_consumed[:, k] > 0)
        if idx.size == 0:
            continue
        best, which = allowed[k], limiting[k]
        np.divide(by_species[idx[0]], nu_consumed[idx[0], k], out=best)
        which[:] = idx[0]
        for i in idx[1:]:   # the candidates are few: a running minimum beats argmin here
            extent = by_species[i] / nu_consumed[i, k]
            smaller = extent < best
            np.copyto(best, extent, where=smaller)
            np.copyto(which, i, where=smaller)
    energy = np.multiply(dGr, allowed.T)
    np.negative(energy, out=energy)
    np.copyto(energy, 0.0, where=~(dGr < 0))
    return energy, limiting.T


@dataclass
class InsituEnergetics:
    """Per sample x reaction results (arrays (n, r)), with the reactions and sample context."""

    samples: list
    reactions: list                 # NamedReaction
    T_K: np.ndarray
    P_bar: np.ndarray
    dG0: np.ndarray
    log10_Q: np.ndarray
    dGr: np.ndarray
    electrons: np.ndarray           # (r,)
    limiting_species: np.ndarray    # object (n, r)
    energy_density_J_per_kg: np.ndarray
    water_per_kg_solution: np.ndarray   # (n,) kg water per kg solution
    density_kg_L: np.ndarray            # (n,)
    missing_species: np.ndarray     # object (n, r): comma-joined names without an activity
    zero_species: np.ndarray        # object (n, r): species measured at zero, '(reactant)' or '(product)'
    minimum_energy_kJ: float
    flags: np.ndarray               # object (n, r): caveats of the standard-state data
    failure: np.ndarray             # object (n,): why a sample could not be computed ('' if it was)
    flags_of_sample: np.ndarray     # object (n,): the flags of any of the sample's reactions

    @property
    def dGr_per_electron(self):
        """dGr per mole of electrons moved [J/mol e-] (n, r); NaN for reactions that move none."""
        with np.errstate(divide="ignore", invalid="ignore"):
            return np.where(self.electrons > 0, self.dGr / self.electrons, np.nan)

    def to_frame(self, per_species=()):
        """One row per sample x reaction; ``per_species`` adds dGr per mole of each named species."""
        n, r = self.dGr.shape
        rep = lambda a: np.repeat(a, r)
        til = lambda a: np.tile(a, n)
        E = self.energy_density_J_per_kg
        W = self.water_per_kg_solution[:, None]
        rho = self.density_kg_L[:, None]
        frame = pd.DataFrame({
            "sample": rep(self.samples), "reaction": til([x.name for x in self.reactions]),
            "equation": til([str(x.reaction) for x in self.reactions]),
            "T_C": rep(self.T_K - 273.15), "P_bar": rep(self.P_bar),
            "dG0_kJ_per_mol": self.dG0.ravel() / 1e3, "log10_Q": self.log10_Q.ravel(),
            "dGr_kJ_per_mol": self.dGr.ravel() / 1e3,
            "dGr_kJ_per_mol_e": self.dGr_per_electron.ravel() / 1e3,
            "electrons": til(self.electrons), "limiting_species": self.limiting_species.ravel(),
            "energy_density_J_per_kg": E.ravel(),
            "energy_density_J_per_kg_solution": (E * W).ravel(),
            "energy_density_J_per_L": (E * W * rho).ravel(),
            "exergonic": (self.dGr < 0).ravel(),
            "below_minimum_energy": (np.abs(self.dGr) < self.minimum_energy_kJ * 1e3).ravel(),
            "missing_species": self.missing_species.ravel(), "zero_species": self.zero_species.ravel(),
            "flags": self.flags.ravel(),
            "failure": rep(self.failure)})
        for species in per_species:
            frame.insert(frame.columns.get_loc("dGr_kJ_per_mol_e") + 1, f"dGr_kJ_per_mol_{species}",
                         self.per_species(species).ravel())
        growth = growth_models(self.reactions)
        frame["electron_donor"] = til([g[0] for g in growth])
        frame["growth_model"] = til([g[1] for g in growth])
        frame["biomass_yield_Cmol_per_mol_donor"] = biomass_yield_Cmol_per_mol_donor(
            self.dGr, np.array([g[3] for g in growth]), np.array([g[2] for g in growth])).ravel()
        return frame

    def per_species(self, species):
        """dGr per mole of ``species`` [kJ/mol] (n, r); NaN where it does not take part."""
        coef = np.array([abs(x.reaction.coefficient(species)) for x in self.reactions])
        with np.errstate(divide="ignore", invalid="ignore"):
            return np.where(coef > 0, self.dGr / coef / 1e3, np.nan)


def _joined_labels(mask, labels):
    """Comma-joined labels where ``mask`` (n, labels, r) is set, as an object array (n, r).

    Each reaction has few distinct patterns: they are found by packing a row's bits into one
    integer, joined once each, and mapped back (no loop over samples).
    """
    n, m, r = mask.shape
    out = np.empty((n, r), dtype=object)
    labels = np.array(labels, dtype=object)
    for k in range(r):
        cols = np.flatnonzero(mask[:, :, k].any(axis=0))
        if cols.size == 0:
            out[:, k] = ""
            continue
        codes = mask[:, cols, k].astype(np.int64) @ (1 << np.arange(cols.size, dtype=np.int64))
        unique, inverse = np.unique(codes, return_inverse=True)
        texts = np.array([", ".join(labels[cols[(u >> np.arange(cols.size)) & 1 == 1]]) for u in unique],
                         dtype=object)
        out[:, k] = texts[inverse.ravel()]
    return out


def _standard_gibbs(result, names, db, water):
    """Standard Gibbs energies (n, s) of ``names`` and their flags, NaN for failed samples: taken
    from the speciation's own evaluation at the same states when it holds every species named,
    else evaluated here (only for the samples that were computed: a failed one's state may not
    be liquid water)."""
    ok = result.failure == ""
    G = np.full((len(result.samples), len(names)), np.nan)
    cached = result.standard_states
    if cached is not None and set(names) <= set(cached.names):
        rows = ok[result.standard_rows]          # of the solved samples, those still computed
        cols = [cached.names.index(x) for x in names]
        G[ok] = cached.G[rows][:, cols]
        flags = {}
        for k, v in cached.flags.items():
            flags[k] = np.zeros(G.shape, bool)
            flags[k][ok] = v[rows][:, cols]
        return G, flags
    if not ok.any():
        return G, {}
    T_ok, P_ok = (result.T_K, result.P_bar) if ok.all() else (result.T_K[ok], result.P_bar[ok])
    props = standard_properties(names, T_ok, P_ok, db=db, properties=("G",), water=water)
    G[ok] = props.G
    flags = {}
    for k, v in props.flags.items():
        flags[k] = np.zeros(G.shape, bool)
        flags[k][ok] = v
    return G, flags


def _activity_columns(result, names, db, gas_fugacity):
    """log10 activities (n, s) of ``names`` from a speciation result; NaN where unknown."""
    n = len(result.samples)
    la = np.full((n, len(names)), np.nan)
    amounts = np.zeros((n, len(names)))
    index = {sp: j for j, sp in enumerate(result.species)}
    activity = result.log10_activity
    for j, name in enumerate(names):
        rec = db.record(name)
        if name == "H2O(l)":
            la[:, j] = result.log10_water_activity
        elif rec.state == "solid":
            la[:, j] = 0.0
        elif rec.state == "gas":
            if name in gas_fugacity:
                with np.errstate(divide="ignore"):
                    la[:, j] = np.log10(gas_fugacity[name])
        elif name in index:
            k = index[name]
            la[:, j] = np.where(result.present[:, k], activity[:, k], np.nan)
            amounts[:, j] = result.pool_molality(name)
    return la, amounts


def insitu_energetics(result, reactions, db=None, minimum_energy_kJ=DEFAULT_MINIMUM_ENERGY_KJ,
                      gas_fugacity=None, water=water_state):
    """In-situ Gibbs energies and energy densities of reactions in speciated samples.

    dGr = dG0 + RT ln Q with the activities of the speciation; energy density = -dGr times the
    amount of reaction the limiting pool allows (total of each reactant's pool over its
    coefficient), per kg of water, per kg of solution and per litre.

    Parameters
    ----------
    result : SpeciationResult
        Speciated samples (:func:`~redoxgibbs.speciation.solver.speciate`).
    reactions : list of NamedReaction
        The reactions.
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).
    minimum_energy_kJ : float
        Smallest absolute dGr [kJ per mol of reaction] taken as usable (Hoehler 2004).
    gas_fugacity : dict, optional
        Gas species to fugacity [bar] per sample, for reactions written with gases.
    water : callable
        The water-state function (exact IAPWS-95 or a WaterTable).

    Returns
    -------
    InsituEnergetics
        dG0, log10 Q, dGr [J/mol] (samples x reactions), energy densities [J/kg], limiting species,
        flags; ``to_frame()`` names the units in its columns.
    """
    db = default_database() if db is None else db
    names = sorted({s for x in reactions for s in x.reaction.species})
    nu = np.zeros((len(names), len(reactions)))
    for r, x in enumerate(reactions):
        for s, c in zip(x.reaction.species, x.reaction.coefficients):
            nu[names.index(s), r] = c
    G, flags = _standard_gibbs(result, names, db, water)
    dG0 = G @ nu
    la, amounts = _activity_columns(result, names, db, gas_fugacity or {})
    # measured zeros: with a reactant at zero the reaction cannot run (no energy); with a product at
    # zero dGr is unbounded; both leave dGr undefined (never inf) and are named in zero_species
    zero = np.isneginf(la)
    dGr, log_q = gibbs_energy_kernel(dG0, np.where(np.isfinite(la), la, 0.0), nu, result.T_K)
    failed = result.failure != ""
    missing_mask = np.isnan(la)[:, :, None] & (nu[None] != 0) & ~failed[:, None, None]
    zero_reactant = zero[:, :, None] & (nu[None] < 0)
    zero_product = zero[:, :, None] & (nu[None] > 0)
    no_reactant = zero_reactant.any(axis=1)
    unknown = missing_mask.any(axis=1) | failed[:, None]
    unbounded = zero_product.any(axis=1) & ~no_reactant
    undefined = unknown | unbounded | no_reactant
    dGr = np.where(undefined, np.nan, dGr)
    log_q = np.where(undefined, np.nan, log_q)
    consumed = np.where(nu < 0, -nu, 0.0)
    for j, name in enumerate(names):
        if name in NOT_LIMITING or db.record(name).state != "aq":
            consumed[j] = 0.0
    E, limiting = energy_density_kernel(np.nan_to_num(dGr, nan=0.0), amounts, consumed)
    E = np.where(unknown | unbounded, np.nan, E)     # a reactant at zero: no energy (0)
    limiting_names = np.where((limiting >= 0) & ~undefined, np.array(names + [""], dtype=object)[limiting], "")
    zeros = join_flags(_joined_labels(zero_reactant, [f"{x} (reactant)" for x in names]),
                        _joined_labels(zero_product, [f"{x} (product)" for x in names]))
    missing = _joined_labels(missing_mask, names)
    flag_names = list(flags)
    flag_any = np.stack([(flags[k].astype(float) @ (nu != 0)) > 0 for k in flag_names], axis=1) if flags \
        else np.zeros((len(result.samples), 0, len(reactions)), bool)
    flag_text = join_flags(_joined_labels(flag_any, flag_names), result.sample_flags()[:, None])
    flag_sample = join_flags(_joined_labels(flag_any.any(axis=2)[:, :, None], flag_names)[:, 0],
                              result.sample_flags())
    return InsituEnergetics(
        samples=result.samples, reactions=list(reactions), T_K=result.T_K, P_bar=result.P_bar,
        dG0=dG0, log10_Q=log_q, dGr=dGr, electrons=np.array([x.electrons for x in reactions]),
        limiting_species=limiting_names, energy_density_J_per_kg=E,
        water_per_kg_solution=result.water_per_kg_solution, density_kg_L=result.density_kg_L,
        missing_species=missing, zero_species=zeros, minimum_energy_kJ=minimum_energy_kJ, flags=flag_text,
        flags_of_sample=flag_sample, failure=result.failure)
