"""Standard-state properties of named species at arrays of (T, P): the engine's front door.

Water is evaluated once per distinct (T, P); each model then fills its columns of the
(n_states, n_species) result arrays: G, H [J/mol], S, Cp [J/mol/K], V [cm3/mol].
"""

from dataclasses import dataclass

import numpy as np

from ..errors import OutOfValidityError
from ..standard_state.formation import vant_hoff_reaction_entropy, vant_hoff_reaction_gibbs
from ..standard_state.gas import apparent_gas_properties, nasa7_coefficients
from ..standard_state.gfunction import g_function_shock_1992
from ..standard_state.hkf import (HKFParameters, SolventTerms, hkf_enthalpy, hkf_entropy,
                                  hkf_gibbs, hkf_heat_capacity, hkf_volume, solvation_omega)
from ..standard_state.mineral import maier_kelley_properties
from ..standard_state.solvent import apparent_water_properties
from ..water.born import born_functions
from ..water.dielectric import dielectric_along_TP
from ..water.iapws95 import water_state
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
    G: np.ndarray
    H: np.ndarray
    S: np.ndarray
    Cp: np.ndarray
    V: np.ndarray
    water_density_kg_m3: np.ndarray  # None when no participant needs the solvent
    flags: dict

    def column(self, name):
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


def _solvent_terms(water, params, n):
    eps = dielectric_along_TP(water)
    born = born_functions(eps)
    ref = water_state(298.15, 1.0)
    born_r = born_functions(dielectric_along_TP(ref))
    gfun = g_function_shock_1992(water.T_K, water.P_bar, water)
    omega = solvation_omega(params, gfun, n)
    return SolventTerms(Z=born.Z, Y=born.Y, Q=born.Q, X=born.X, Z_ref=float(born_r.Z),
                        Y_ref=float(born_r.Y), omega=omega[0], omega_T=omega[1],
                        omega_TT=omega[2], omega_P=omega[3])


def _hkf_block(records, water, T, P):
    params = HKFParameters(
        linear=np.stack([r.params["linear_cal"] for r in records], axis=1),
        omega_ref=np.array([r.params["omega_ref_cal"] for r in records]),
        charge=np.array([float(r.charge) for r in records]))
    solvent = _solvent_terms(water, params, T.size)
    cal = 4.184
    return (hkf_gibbs(params, T, P, solvent) * cal, hkf_enthalpy(params, T, P, solvent) * cal,
            hkf_entropy(params, T, P, solvent) * cal, hkf_heat_capacity(params, T, P, solvent) * cal,
            hkf_volume(params, T, P, solvent))


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


def standard_properties(names, T_K, P_bar, db=None):
    """Standard-state G, H, S, Cp, V of species ``names`` at 1-D arrays ``T_K`` [K], ``P_bar`` [bar].

    States must already be liquid or supercritical water (the water layer refuses others).
    """
    db = default_database() if db is None else db
    names = [db.resolve(n) for n in names]
    T = np.atleast_1d(np.asarray(T_K, dtype=float))
    P = np.atleast_1d(np.asarray(P_bar, dtype=float))
    T, P = np.broadcast_arrays(T, P)
    validate_states(T, P)
    everything = _closure(db, names)
    needs_water = any(db.record(x).model in ("hkf", "iapws95") for x in everything)
    water = water_state(T, P) if needs_water else None
    index = {n: i for i, n in enumerate(everything)}
    n, m = T.size, len(everything)
    G, H, S, Cp, V = (np.zeros((n, m)) for _ in range(5))
    flags = {"water_density_below_0.35_g_cm3": np.zeros((n, m), bool),
             "below_0C_extrapolated": np.zeros((n, m), bool),
             "beyond_formation_T_max": np.zeros((n, m), bool),
             "formation_enthalpy_missing": np.zeros((n, m), bool)}
    records = [db.record(x) for x in everything]
    hkf = [r for r in records if r.model == "hkf"]
    if hkf:
        cols = [index[r.name] for r in hkf]
        for target, value in zip((G, H, S, Cp, V), _hkf_block(hkf, water, T, P)):
            target[:, cols] = value
        flags["water_density_below_0.35_g_cm3"][:, cols] = (water.density_kg_m3 < 350.0)[:, None]
        flags["below_0C_extrapolated"][:, cols] = (T < 273.15)[:, None]
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
    for r in records:  # parents precede their products in ``everything``
        if r.model != "formation":
            continue
        j = index[r.name]
        p = r.params
        dS_r = vant_hoff_reaction_entropy(p["dG_r_J"], p["dH_r_J"])
        G[:, j] = vant_hoff_reaction_gibbs(p["dG_r_J"], p["dH_r_J"], T)
        H[:, j] = p["dH_r_J"]
        S[:, j] = dS_r
        for c, parent in p["parents"]:
            k = index[parent]
            G[:, j] -= c * G[:, k]
            H[:, j] -= c * H[:, k]
            S[:, j] -= c * S[:, k]
            Cp[:, j] -= c * Cp[:, k]
            V[:, j] -= c * V[:, k]
            for f in flags.values():
                f[:, j] |= f[:, k]
        flags["beyond_formation_T_max"][:, j] |= T - 273.15 > p["T_max_C"]
        flags["formation_enthalpy_missing"][:, j] |= p["dH_r_missing"] and bool(np.any(T != 298.15))
    cols = [index[x] for x in names]
    return StandardProperties(
        names=names, T_K=T, P_bar=P, G=G[:, cols], H=H[:, cols], S=S[:, cols], Cp=Cp[:, cols],
        V=V[:, cols], water_density_kg_m3=None if water is None else water.density_kg_m3,
        flags={k: v[:, cols] for k, v in flags.items()})
