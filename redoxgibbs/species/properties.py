"""Standard-state properties of named species at arrays of (T, P): the engine's front door.

Water is evaluated once per distinct (T, P); each model then fills its columns of the
(n_states, n_species) result arrays: G, H [J/mol], S, Cp [J/mol/K], V [cm3/mol].
"""

from dataclasses import dataclass

import numpy as np

from ..constants import T_REF_K
from ..errors import OutOfValidityError
from ..flags import BELOW_0C, FORMATION_ENTHALPY_MISSING, LOW_DENSITY, NEAR_CRITICAL, OUTSIDE_FORMATION_RANGE
from ..standard_state.formation import vant_hoff_reaction_entropy, vant_hoff_reaction_gibbs
from ..standard_state.gas import apparent_gas_properties, nasa7_coefficients
from ..standard_state.hkf_states import hkf_parameters, hkf_properties
from ..standard_state.mineral import maier_kelley_properties
from ..standard_state.solvent import apparent_water_properties
from ..water.iapws95 import near_critical, water_state
from .database import default_database

__all__ = ["StandardProperties", "standard_properties", "VALIDITY", "validate_states"]

#: Range of the revised HKF model (Shock et al. 1992) and the density below which the
#: g-function is an extrapolation of its fit.
VALIDITY = {"T_min_K": 253.0, "T_max_K": 1273.15, "P_max_bar": 5000.0, "rho_min_kg_m3": 350.0}


@dataclass(frozen=True)
class StandardProperties:
    """Standard-state properties of ``names`` at states ``T_K``, ``P_bar`` (1-D, length n).

    ``flags`` maps a flag name to a boolean (n, m) array of states where that caveat applies.
    """

    names: list
    T_K: np.ndarray
    P_bar: np.ndarray
    G: np.ndarray                    # each (n, m), or None when not asked for
    H: np.ndarray
    S: np.ndarray
    Cp: np.ndarray
    V: np.ndarray
    water_density_kg_m3: np.ndarray  # None when no participant needs the solvent
    flags: dict

    def column(self, name):
        """The column of species ``name`` in the (n_states, n_species) arrays."""
        return self.names.index(name)


def validate_states(T_K, P_bar):
    """Refuse states outside 0-1000 degC (down to the ice melting curve) and above 5000 bar."""
    if np.any(T_K > VALIDITY["T_max_K"]):
        raise OutOfValidityError(
            f"T: {T_K.max() - 273.15:.6g} degC is above 1000 degC, the upper limit of the revised "
            "HKF equations; give temperatures up to 1000 degC")
    if np.any(P_bar > VALIDITY["P_max_bar"]):
        raise OutOfValidityError(
            f"P: {P_bar.max():.6g} bar is above 5000 bar, the upper limit of the revised HKF "
            "equations; give pressures up to 5000 bar")


def _hkf_block(records, water, T, P, wanted):
    params = hkf_parameters([r.params["linear_cal"] for r in records], [r.params["omega_ref_cal"] for r in records],
                            [float(r.charge) for r in records])
    return hkf_properties(params, water, T, P, wanted)


def _closure(db, names):
    """The requested species plus, recursively, the parents of formation species (parents first)."""
    order, seen = [], set()

    def visit(name):
        if name in seen:
            return
        seen.add(name)
        rec = db.record(name)
        if rec.model == "formation":
            for _, parent in rec.params["parents"]:
                visit(parent)
        order.append(name)

    for n in names:
        visit(n)
    return order


ALL_PROPERTIES = ("G", "H", "S", "Cp", "V")


def _expand_formation(db, name):
    """A formation species as (coefficients of non-formation species, summed reaction terms).

    X = sum_r (reaction r) - sum_b c_b B over the whole chain of formation reactions, so that
    property(X) = sum_r [reaction property] - sum_b c_b property(B); the van 't Hoff terms are
    linear in dG_r and dH_r, so the chain's are summed. Returns (dict b -> c_b, dG_r(Tr), dH_r,
    (T_min_C, T_max_C) narrowed over the chain, any reaction enthalpy missing).
    """
    p = db.record(name).params
    base, dG, dH = {}, p["dG_r_J"], p["dH_r_J"]
    T_range, missing = p["T_range_C"], p["dH_r_missing"]
    for c, parent in p["parents"]:
        if db.record(parent).model == "formation":
            sub, sub_dG, sub_dH, sub_range, sub_missing = _expand_formation(db, parent)
            for b, cb in sub.items():
                base[b] = base.get(b, 0.0) - c * cb
            dG, dH = dG - c * sub_dG, dH - c * sub_dH
            T_range = (max(T_range[0], sub_range[0]), min(T_range[1], sub_range[1]))
            missing = missing or sub_missing
        else:
            base[parent] = base.get(parent, 0.0) + c
    return base, dG, dH, T_range, missing


def _formation_block(db, formation, index, T, arrays, flags, properties):
    """Fill the columns of formation species: reaction terms minus a matrix of base columns."""
    expanded = [_expand_formation(db, r.name) for r in formation]
    base_names = sorted({b for e in expanded for b in e[0]}, key=lambda b: index[b])
    C = np.array([[e[0].get(b, 0.0) for e in expanded] for b in base_names])  # (base, F)
    bcols = [index[b] for b in base_names]
    fcols = [index[r.name] for r in formation]
    dG_r = np.array([e[1] for e in expanded])
    dH_r = np.array([e[2] for e in expanded])
    dS_r = vant_hoff_reaction_entropy(dG_r, dH_r)
    reaction = {"G": vant_hoff_reaction_gibbs(dG_r, dH_r, T[:, None]), "H": dH_r, "S": dS_r,
                "Cp": 0.0, "V": 0.0}
    for name, X in zip(ALL_PROPERTIES, arrays):
        if name in properties:
            X[:, fcols] = reaction[name] - X[:, bcols] @ C
    for f in flags.values():
        f[:, fcols] = (f[:, bcols].astype(float) @ np.abs(C)) > 0
    T_min, T_max = np.array([e[3] for e in expanded]).T
    T_C = (T - 273.15)[:, None]
    flags[OUTSIDE_FORMATION_RANGE][:, fcols] |= (T_C < T_min - 1e-9) | (T_C > T_max)
    missing = np.array([e[4] for e in expanded])
    flags[FORMATION_ENTHALPY_MISSING][:, fcols] |= missing[None, :] & (np.abs(T - T_REF_K) > 1e-6)[:, None]


def standard_properties(names, T_K, P_bar, db=None, properties=ALL_PROPERTIES, water=water_state):
    """Standard-state properties of named species at arrays of states.

    Each species by its own model: revised HKF (Tanger & Helgeson 1988; Shock et al. 1992), NASA
    polynomials for gases, Maier-Kelley for minerals, formation reactions (van 't Hoff), and water
    from IAPWS-95; water is evaluated once per distinct state.

    Parameters
    ----------
    names : list of str
        Species names (canonical or aliases).
    T_K : array_like
        Temperatures [K], 1-D.
    P_bar : array_like
        Pressures [bar], broadcast against ``T_K``; states must be liquid or supercritical water.
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).
    properties : tuple of str
        Which of G, H, S, Cp, V to compute (the others are returned as None; without Cp the
        water second derivative is skipped).
    water : callable
        The water-state function: exact IAPWS-95 or a :class:`~redoxgibbs.water.table.WaterTable`.

    Returns
    -------
    StandardProperties
        G, H [J/mol], S, Cp [J/mol/K], V [cm3/mol], each (n_states, n_species), and the validity
        flags of each state and species.
    """
    db = default_database() if db is None else db
    names = [db.resolve(n) for n in names]
    T = np.atleast_1d(np.asarray(T_K, dtype=float))
    P = np.atleast_1d(np.asarray(P_bar, dtype=float))
    T, P = np.broadcast_arrays(T, P)
    validate_states(T, P)
    everything = _closure(db, names)
    needs_water = any(db.record(x).model in ("hkf", "iapws95") for x in everything)
    water = water(T, P, caloric="Cp" in properties) if needs_water else None
    index = {n: i for i, n in enumerate(everything)}
    n, m = T.size, len(everything)
    G, H, S, Cp, V = (np.zeros((n, m)) for _ in range(5))
    flags = {name: np.zeros((n, m), bool)
             for name in (LOW_DENSITY, BELOW_0C, OUTSIDE_FORMATION_RANGE, FORMATION_ENTHALPY_MISSING, NEAR_CRITICAL)}
    records = [db.record(x) for x in everything]
    hkf = [r for r in records if r.model == "hkf"]
    if hkf:
        cols = [index[r.name] for r in hkf]
        for name, target, value in zip(ALL_PROPERTIES, (G, H, S, Cp, V), _hkf_block(hkf, water, T, P, properties)):
            if name in properties:
                target[:, cols] = value
        flags[LOW_DENSITY][:, cols] = (water.density_kg_m3 < 350.0)[:, None]
        flags[BELOW_0C][:, cols] = (T < 273.15)[:, None]
    if needs_water:
        water_cols = [index[r.name] for r in records if r.model in ("hkf", "iapws95")]
        flags[NEAR_CRITICAL][:, water_cols] = near_critical(T, P)[:, None]
    for r in records:
        j = index[r.name]
        if r.model == "iapws95":
            G[:, j], H[:, j], S[:, j], Cp[:, j], V[:, j] = apparent_water_properties(water, r.G_f, r.H_f, r.S)
        elif r.model == "nasa7":
            coeffs = nasa7_coefficients(r.params["nasa_name"])
            G[:, j], H[:, j], S[:, j], Cp[:, j] = apparent_gas_properties(coeffs, r.G_f, r.H_f, r.S, T)
            V[:, j] = 0.0
        elif r.model == "maier_kelley":
            G[:, j], H[:, j], S[:, j], Cp[:, j] = maier_kelley_properties(
                r.params["segments"], r.G_f, r.H_f, r.S, r.params["V_cm3"], T, P)
            V[:, j] = r.params["V_cm3"]
    formation = [r for r in records if r.model == "formation"]
    if formation:
        _formation_block(db, formation, index, T, (G, H, S, Cp, V), flags, properties)
    cols = [index[x] for x in names]
    same = cols == list(range(m))   # the species asked for are all there is: no copy needed

    def pick(X, name=None):
        if name is not None and name not in properties:
            return None
        return X if same else X[:, cols]

    return StandardProperties(
        names=names, T_K=T, P_bar=P, G=pick(G, "G"), H=pick(H, "H"), S=pick(S, "S"), Cp=pick(Cp, "Cp"),
        V=pick(V, "V"), water_density_kg_m3=None if water is None else water.density_kg_m3,
        flags={k: pick(v) for k, v in flags.items()})
