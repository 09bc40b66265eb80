"""The Pitzer activity model: ion interaction equations for concentrated and cold brines.

Activity coefficients of ions and neutral species, the osmotic coefficient and the water
activity from the Pitzer (1973) equations in the form of Harvie, Moller & Weare (1984, eqs. 1-9),
with the unsymmetrical-mixing terms E-theta of Pitzer (1975, eqs. 47 and B-15). The parameters
(``species_data/pitzer.csv``) belong to the Harvie-Moller-Weare family of sets, each row with its
source and temperature range. Everything works on arrays of samples: molalities (n, s) and
temperatures (n,); the Debye-Hueckel slope is the one the parameters were fitted with (Moller
1988), and, like them, is taken along the saturation curve: pressure enters the model only through
the speciation, not through the activity coefficients.

Ions without parameters keep the Debye-Hueckel function, the E-theta terms and the term in the
sum of all C_ca; neutral species without lambda parameters are treated as in the other models.
Aqueous complexes made only of the model's ions (NaCl(aq), MgSO4(aq), NaSO4-, CaHCO3+ ...) are
not species of this model: their association is carried by the interaction parameters
(Harvie et al. 1984), and the speciation leaves them out (``BASIS_IONS``, ``MODEL_COMPLEXES``).
"""

from dataclasses import dataclass
from functools import lru_cache
from importlib import resources

import numpy as np
import pandas as pd

from ..constants import T_REF_K
from ..errors import InputError
from ..flags import UNPARAMETERIZED_IONS, join_flags, parameter_temperature_flag
from ..water.iapws95 import M_WATER_KG_PER_MOL as M_WATER_KG
from .neutral import log10_gamma_neutral

__all__ = [
    "BASIS_IONS",
    "B_PITZER",
    "MODEL_COMPLEXES",
    "SIGNIFICANT_MOLALITY",
    "PitzerModel",
    "debye_hueckel_aphi_moller_1988",
    "e_theta",
    "pitzer_activities",
    "pitzer_g",
    "pitzer_g_prime",
    "pitzer_parameter_table",
    "unsymmetrical_j_pitzer_1975",
]

B_PITZER = 1.2              # kg^0.5 mol^-0.5, Pitzer (1973), common to every ion pair
ALPHA2 = 12.0               # kg^0.5 mol^-0.5, Harvie et al. (1984) for pairs with a beta2 term
T_REF_PITZER_K = T_REF_K       # the reference temperature of the about25 and PP86 forms
SIGNIFICANT_MOLALITY = 0.01  # mol/kg: a pair outside its parameters' range is flagged above this
# A trace ion's activity coefficient rests on its pairs with the major ions (H+ with Cl- sets the
# pH). Held at their range's end, such a pair's parameters err by d(beta)/dT x the distance; with the
# temperature slopes of this file's about25 rows (1e-3 to 4e-3 per K) 25 K keeps that error below
# about 0.05 in log10 gamma of a trace ion in 0.5 mol/kg of its counter-ion. Farther out, flagged.
TRACE_PAIR_ALLOWANCE_K = 25.0
TRACE_MOLALITY = 1e-6        # mol/kg: trace ions scarcer than this (OH- in an acid fluid) are not judged
#: Share of the ionic strength that ions without Pitzer parameters may carry before the sample is
#: flagged (they get only the Debye-Hueckel and mixing terms)
UNPARAMETERIZED_SHARE = 0.01
# Pitzer (1975) eq. 47: J(x) = x / (4 + C1 x^-C2 exp(-C3 x^C4))
_J_C = (4.581, 0.7237, 0.0120, 0.528)


# Moller (1988) Geochim. Cosmochim. Acta 52, 821: A_phi [kg^0.5 mol^-0.5] in the form of eq. 13,
# fitted for 0-300 C along the saturation curve (coefficients via pytzer 0.6.0, debyehueckel.Aosm_M88)
_APHI_M88 = np.array([3.36901532e-1, -6.32100430e-4, 9.14252359, -1.35143986e-2, 2.26089488e-3,
                      1.92118597e-6, 45.2586464, 0.0])
_APHI_T_MIN_K, _APHI_T_MAX_K = 273.15, 573.15


def debye_hueckel_aphi_moller_1988(T_K):
    """Osmotic Debye-Hueckel slope A_phi [kg^0.5 mol^-0.5] of Moller (1988), 0-300 C at saturation.

    The slope the parameter sets of ``pitzer.csv`` were fitted with (Harvie-Moller-Weare family).
    Below 0 C it is continued linearly with its slope at 0 C (stated extrapolation: the eq. 13
    form has a pole at 263 K); above 300 C it is held at its 300 C value. Pressure is not a variable
    of it, as of the interaction parameters (all fitted along saturation).
    """
    T = np.asarray(T_K, float)
    value = _basis(np.clip(T, _APHI_T_MIN_K, _APHI_T_MAX_K))[..., :8] @ _APHI_M88
    ends = _basis(np.array([_APHI_T_MIN_K, _APHI_T_MIN_K + 0.01]))[:, :8] @ _APHI_M88
    slope0 = (ends[1] - ends[0]) / 0.01           # [per K], by a 0.01 K difference
    return np.where(T < _APHI_T_MIN_K, value + slope0 * (T - _APHI_T_MIN_K), value)


def pitzer_g(x):
    """g(x) = 2 [1 - (1 + x) exp(-x)] / x^2 (Pitzer 1973; Harvie et al. 1984 eq. A3), g(0) = 1."""
    x = np.asarray(x, float)
    xs = np.where(x < 1e-4, 1.0, x)
    return np.where(x < 1e-4, 1.0 - 2.0 * x / 3.0, 2.0 * (1.0 - (1.0 + xs) * np.exp(-xs)) / xs**2)


def pitzer_g_prime(x):
    """g'(x) = -2 [1 - (1 + x + x^2/2) exp(-x)] / x^2 (Harvie et al. 1984 eq. A4), -> -x/3 at 0."""
    x = np.asarray(x, float)
    xs = np.where(x < 1e-4, 1.0, x)
    return np.where(x < 1e-4, -x / 3.0, -2.0 * (1.0 - (1.0 + xs + 0.5 * xs**2) * np.exp(-xs)) / xs**2)


def unsymmetrical_j_pitzer_1975(x):
    """J(x) and dJ/dx of the unsymmetrical-mixing integral, Pitzer (1975) eq. 47 approximation.

    J(x) = x / (4 + C1 x^-C2 exp(-C3 x^C4)), C = (4.581, 0.7237, 0.0120, 0.528); x > 0.
    """
    c1, c2, c3, c4 = _J_C
    x = np.maximum(np.asarray(x, float), 1e-12)
    tail = c1 * x**-c2 * np.exp(-c3 * x**c4)
    D = 4.0 + tail
    dD = tail * (-c2 / x - c3 * c4 * x ** (c4 - 1.0))
    return x / D, 1.0 / D - x * dD / D**2


def e_theta(zi, zj, I, A_phi):
    """E-theta and its ionic-strength derivative for two like-signed ions of charges zi, zj.

    E-theta = zi zj / (4 I) [J(x_ij) - J(x_ii)/2 - J(x_jj)/2], x_ij = 6 zi zj A_phi sqrt(I), and
    E-theta' = -E-theta / I + zi zj / (8 I^2) [x_ij J'(x_ij) - x_ii J'(x_ii)/2 - x_jj J'(x_jj)/2]
    (Pitzer 1975 eqs. B-15, B-16; Harvie et al. 1984 eqs. A7-A8). I [mol/kg], A_phi per sample.
    Zero for equal charges.
    """
    I = np.maximum(I, 1e-12)
    zz = abs(zi * zj)
    if zi == zj:
        return np.zeros_like(I), np.zeros_like(I)
    base = 6.0 * A_phi * np.sqrt(I)
    (Jij, dij), (Jii, dii), (Jjj, djj) = (unsymmetrical_j_pitzer_1975(base * c) for c in (zz, zi * zi, zj * zj))
    xij, xii, xjj = base * zz, base * zi * zi, base * zj * zj
    et = zz / (4.0 * I) * (Jij - 0.5 * Jii - 0.5 * Jjj)
    etp = -et / I + zz / (8.0 * I**2) * (xij * dij - 0.5 * xii * dii - 0.5 * xjj * djj)
    return et, etp


def _basis(T_K):
    """Functions of T [K] that every parameter form is a sum of: (n, 10), 1, T, 1/T, ln T,
    1/(T - 263), T^2, 1/(680 - T), 1/(T - 227) (Moller 1988 eq. 13), T^3, T^4."""
    T = np.asarray(T_K, float)
    return np.stack([np.ones_like(T), T, 1.0 / T, np.log(T), 1.0 / (T - 263.0), T**2,
                     1.0 / (680.0 - T), 1.0 / (T - 227.0), T**3, T**4], axis=-1)


def _coefficients(row):
    """A row's coefficients on the 10 functions of :func:`_basis`, whatever its published form."""
    c = np.nan_to_num(np.array([row[f"c{i}"] for i in range(1, 9)], float))
    out = np.zeros(10)
    Tr = T_REF_PITZER_K
    if row["form"] == "Tfunc":
        out[:8] = c
    elif row["form"] == "const":
        out[0] = c[0]
    elif row["form"] == "about25":     # c1 + c2 d + c3 d^2, d = T - Tr
        v, d1, d2 = c[:3]
        out[0], out[1], out[5] = v - d1 * Tr + d2 * Tr**2, d1 - 2.0 * d2 * Tr, d2
    elif row["form"] == "PP86":        # Pabalan & Pitzer (1986) eq. 29, written out in T
        q1, q2, q3, q4, q5, q6 = c[:6]
        out[0] = -q1 * Tr - q2 * Tr**2 / 2 - q3 * Tr**3 / 3 - q4 * Tr**4 / 4 + q5 * Tr + q6
        out[1], out[5], out[8], out[9] = q1 / 2, q2 / 6, q3 / 12, q4 / 20
        out[2] = q1 * Tr**2 / 2 + q2 * Tr**3 / 3 + q3 * Tr**4 / 4 + q4 * Tr**5 / 5 - q5 * Tr**2
    else:
        raise InputError(f"pitzer.csv: form {row['form']!r} is unknown (const, about25, Tfunc, PP86)")
    return out


@lru_cache(maxsize=1)
def pitzer_parameter_table():
    """The Pitzer parameter rows (``species_data/pitzer.csv``) as a DataFrame, loaded once."""
    path = resources.files("redoxgibbs.species_data") / "pitzer.csv"
    table = pd.read_csv(str(path), comment="#", skipinitialspace=True)
    table["species"] = table["species"].str.split()
    table["coefficients"] = [_coefficients(r) for _, r in table.iterrows()]
    return table


@dataclass(frozen=True)
class _Terms:
    """Interaction terms of one species list: index tuples and parameter rows, built once."""

    pairs: np.ndarray          # (P, 2) cation, anion indices of ca pairs with parameters
    pair_rows: dict            # parameter name -> list per pair of (coefficients (R, 10), ranges (R, 2))
    alpha1: np.ndarray         # (P,) alpha1 per pair (Harvie et al. 1984: 1.4 for 2:2 pairs, else 2)
    alpha2: np.ndarray         # (P,) alpha2 per pair (Harvie et al. 1984: 12), unless a row sets them
    thetas: np.ndarray         # (Q, 2)
    theta_rows: list
    triplets: np.ndarray       # (U, 3)
    psi_rows: list
    lambdas: np.ndarray        # (L, 2) neutral, ion
    lambda_rows: list
    charge_groups: list        # per sign: list of (charge, member indices)
    neutral_with_lambda: np.ndarray   # neutral species that have lambda parameters


def _rows_of(table, kind, names, parameter):
    """{tuple(species indices): (coefficients (R, 10), ranges (R, 2))} for one kind and parameter."""
    index = {n: i for i, n in enumerate(names)}
    out = {}
    sel = table[(table["kind"] == kind) & (table["parameter"] == parameter)]
    for _, r in sel.iterrows():
        if all(s in index for s in r["species"]):
            key = tuple(index[s] for s in r["species"])
            coeffs, ranges = out.get(key, ([], []))
            out[key] = (coeffs + [r["coefficients"]], ranges + [(r["T_min_C"] + 273.15, r["T_max_C"] + 273.15)])
    return {k: (np.array(c), np.array(rg)) for k, (c, rg) in out.items()}


@lru_cache(maxsize=32)
def _terms(names, charges):
    table = pitzer_parameter_table()
    z = np.asarray(charges, float)
    params = {p: _rows_of(table, "ca", names, p) for p in ("beta0", "beta1", "beta2", "Cphi")}
    keys = sorted(set().union(*params.values()))
    pairs = np.array(keys, dtype=int).reshape(-1, 2)
    pair_rows = {p: [params[p].get(k) for k in keys] for p in params}
    alpha1 = np.where((np.abs(z[pairs[:, 0]]) == 2) & (np.abs(z[pairs[:, 1]]) == 2), 1.4, 2.0) if keys else np.zeros(0)
    alpha2 = np.full(len(keys), ALPHA2)
    for alpha, name in ((alpha1, "alpha1"), (alpha2, "alpha2")):     # a source's own alphas (const rows)
        for key, (coeffs, _) in _rows_of(table, "ca", names, name).items():
            if key in keys:
                alpha[keys.index(key)] = coeffs[0, 0]
    th = {**_rows_of(table, "cc", names, "theta"), **_rows_of(table, "aa", names, "theta")}
    ps = {**_rows_of(table, "cca", names, "psi"), **_rows_of(table, "caa", names, "psi")}
    la = {**_rows_of(table, "nc", names, "lambda"), **_rows_of(table, "na", names, "lambda")}
    groups = [[(c, np.flatnonzero(z == c)) for c in np.unique(z[np.sign(z) == sign])] for sign in (1, -1)]
    lam = np.array(list(la), dtype=int).reshape(-1, 2)
    return _Terms(pairs=pairs, pair_rows=pair_rows, alpha1=alpha1, alpha2=alpha2,
                  thetas=np.array(list(th), dtype=int).reshape(-1, 2), theta_rows=list(th.values()),
                  triplets=np.array(list(ps), dtype=int).reshape(-1, 3), psi_rows=list(ps.values()),
                  lambdas=lam, lambda_rows=list(la.values()), charge_groups=groups,
                  neutral_with_lambda=np.unique(lam[:, 0]))


def _evaluate(rows, T_K):
    """Values (n, K) of K parameters, each from the row whose T range holds T (else the nearest
    end of the nearest row, held constant); and how far [K] T lay outside every row's range (n, K)."""
    n = T_K.shape[0]
    values, outside = np.zeros((n, len(rows))), np.zeros((n, len(rows)))
    for k, entry in enumerate(rows):
        if entry is None:
            continue
        coeffs, ranges = entry
        lo, hi = ranges[:, 0], ranges[:, 1]
        Tc = np.clip(T_K[:, None], lo, hi)                               # (n, R)
        distance = np.abs(Tc - T_K[:, None])
        pick = np.argmin(distance, axis=1)
        Tp = Tc[np.arange(n), pick]
        values[:, k] = np.einsum("nj,nj->n", _basis(Tp), coeffs[pick])
        outside[:, k] = distance[np.arange(n), pick]
    return values, outside


#: complexes of the basis ions that are species of the Harvie et al. (1984) model itself
MODEL_COMPLEXES = ("HSO4-", "CO2(aq)", "CO3^2-", "OH-", "MgOH+", "CaCO3(aq)", "MgCO3(aq)")
#: ions whose complexes the parameters carry (one per element: the speciation's decomposition basis)
BASIS_IONS = ("Na+", "K+", "Mg^2+", "Ca^2+", "Cl-", "SO4^2-", "HCO3-")


@dataclass(frozen=True)
class PitzerModel:
    """The Pitzer activity model (Harvie, Moller & Weare 1984 form), selectable as 'pitzer'.

    ``I_max`` [mol/kg]: 6, the range of the NaCl parameters (Moller 1988); each parameter row has
    its own temperature range, checked per sample (:meth:`validity_flags`).
    """

    name: str = "pitzer"
    I_max: float = 6.0
    basis_ions: tuple = BASIS_IONS
    model_species: tuple = MODEL_COMPLEXES

    def at(self, names, charges, T_K, A=None, B=None):
        """The model at fixed states: parameters and A_phi (:func:`debye_hueckel_aphi_moller_1988`)
        evaluated once at T_K (n,) [K]. A and B (the engine's Debye-Hueckel slopes) are not used:
        the parameters hold only with the A_phi they were fitted with."""
        terms = _terms(tuple(names), tuple(float(c) for c in charges))
        T = np.asarray(T_K, float)
        values, outside = {}, {}
        for p, rows in terms.pair_rows.items():
            values[p], outside[p] = _evaluate(rows, T)
        values["alpha1"] = np.broadcast_to(terms.alpha1, values["beta0"].shape)
        values["alpha2"] = np.broadcast_to(terms.alpha2, values["beta0"].shape)
        values["theta"] = _evaluate(terms.theta_rows, T)[0]
        values["psi"] = _evaluate(terms.psi_rows, T)[0]
        values["lambda"] = _evaluate(terms.lambda_rows, T)[0]
        pair_beyond_K = np.maximum.reduce([outside[p] for p in ("beta0", "beta1", "beta2", "Cphi")])
        return _PitzerAtStates(terms, np.asarray(charges, float), tuple(names), T, values, pair_beyond_K,
                               debye_hueckel_aphi_moller_1988(T))

    def validity_flags(self, names, charges, molality, T_K):
        """Per sample (n,), the model's flags: a cation-anion pair outside the temperatures its
        parameters' source states (``parameter_temperature_flag``), with both ions at
        SIGNIFICANT_MOLALITY or more, or with one of them there, the other at TRACE_MOLALITY or more
        and the pair more than TRACE_PAIR_ALLOWANCE_K outside; ions without any cation-anion parameter carrying more
        than UNPARAMETERIZED_SHARE of the ionic strength (``UNPARAMETERIZED_IONS``)."""
        state = self.at(names, charges, T_K)
        pairs = state.terms.pairs
        z2 = np.asarray(charges, float) ** 2
        n = molality.shape[0]
        outside = np.zeros(n, bool)
        if len(pairs):
            mc, ma = molality[:, pairs[:, 0]], molality[:, pairs[:, 1]]
            both = (mc >= SIGNIFICANT_MOLALITY) & (ma >= SIGNIFICANT_MOLALITY)
            trace = (((mc >= SIGNIFICANT_MOLALITY) & (ma >= TRACE_MOLALITY))
                     | ((ma >= SIGNIFICANT_MOLALITY) & (mc >= TRACE_MOLALITY)))
            outside = ((both & (state.pair_beyond_K > 0.01))
                       | (trace & (state.pair_beyond_K > TRACE_PAIR_ALLOWANCE_K))).any(axis=1)
        covered = np.isin(np.arange(z2.size), pairs.ravel()) | (z2 == 0)
        I = 0.5 * molality @ z2
        share = np.divide(0.5 * molality[:, ~covered] @ z2[~covered], I, out=np.zeros(n), where=I > 0)
        return join_flags(np.where(outside, parameter_temperature_flag(self.name), ""),
                          np.where(share > UNPARAMETERIZED_SHARE, UNPARAMETERIZED_IONS, ""))


@dataclass(frozen=True)
class _PitzerAtStates:
    terms: _Terms
    charges: np.ndarray
    names: tuple
    T_K: np.ndarray
    values: dict
    pair_beyond_K: np.ndarray     # (n, P) how far [K] outside their stated T range the pair's parameters are taken
    A_phi: np.ndarray

    def activities(self, molality, rows=slice(None)):
        """log10 gamma (n, s) and log10 a_w (n,) of molalities (n, s) [mol/kg] at the states ``rows``.

        Neutral species without lambda parameters take the shared salting-out terms
        (:func:`~redoxgibbs.activities.neutral.log10_gamma_neutral`).
        """
        values = {k: v[rows] for k, v in self.values.items()}
        lg, law, _ = pitzer_activities(self.terms, self.charges, molality, values, self.A_phi[rows])
        neutral = (self.charges == 0) & ~np.isin(np.arange(self.charges.size), self.terms.neutral_with_lambda)
        if neutral.any():
            I = 0.5 * molality @ self.charges**2
            lg[:, neutral] = log10_gamma_neutral([n for n, c in zip(self.names, neutral) if c], self.T_K[rows], I)
        return lg, law

    def osmotic_coefficient(self, molality):
        """The osmotic coefficient phi (n,) of molalities (n, s) [mol/kg] at every state."""
        return pitzer_activities(self.terms, self.charges, molality, self.values, self.A_phi)[2]

def _scatter(n_species, index, values):
    """Sum of values (n, K) into columns index (K,) of an (n, n_species) array."""
    out = np.zeros((values.shape[0], n_species))
    np.add.at(out.T, index, values.T)
    return out


def pitzer_activities(terms, charges, m, values, A_phi):
    """log10 gamma (n, s), log10 a_w (n,) and the osmotic coefficient (n,): Harvie et al. (1984)
    eqs. 1-9 (with their appendix A) for molalities m (n, s) [mol/kg].

    ``values``: parameter values at each state (n, K) per kind (beta0, beta1, beta2, Cphi,
    alpha1, alpha2 per cation-anion pair of ``terms``; theta; psi; lambda); A_phi (n,) [kg^0.5 mol^-0.5].
    """
    z = np.asarray(charges, float)
    n, s = m.shape
    absz = np.abs(z)
    I = np.maximum(0.5 * m @ z**2, 1e-12)
    sI = np.sqrt(I)
    Z = m @ absz
    total = m.sum(axis=1)
    ln_g = np.zeros((n, s))
    # Debye-Hueckel terms (Harvie et al. 1984 eq. A1 and eq. 1 of the osmotic coefficient)
    F = -A_phi * (sI / (1 + B_PITZER * sI) + 2.0 / B_PITZER * np.log1p(B_PITZER * sI))
    osm = -A_phi * I**1.5 / (1 + B_PITZER * sI)
    # cation-anion pairs
    if len(terms.pairs):
        c, a = terms.pairs[:, 0], terms.pairs[:, 1]
        b0, b1, b2, cphi = (values[p] for p in ("beta0", "beta1", "beta2", "Cphi"))
        x1, x2 = values["alpha1"] * sI[:, None], values["alpha2"] * sI[:, None]
        Bv = b0 + b1 * pitzer_g(x1) + b2 * pitzer_g(x2)
        Bp = (b1 * pitzer_g_prime(x1) + b2 * pitzer_g_prime(x2)) / I[:, None]
        Bphi = b0 + b1 * np.exp(-x1) + b2 * np.exp(-x2)
        C = cphi / (2.0 * np.sqrt(absz[c] * absz[a]))
        mc, ma = m[:, c], m[:, a]
        mm = mc * ma
        F = F + (mm * Bp).sum(axis=1)
        term = 2.0 * Bv + Z[:, None] * C
        ln_g += _scatter(s, c, ma * term) + _scatter(s, a, mc * term)
        ln_g += absz[None, :] * (mm * C).sum(axis=1)[:, None]
        osm = osm + (mm * (Bphi + Z[:, None] * C)).sum(axis=1)
    # like-signed pairs: theta (parameters) and E-theta (all unlike charges)
    if len(terms.thetas):
        th = values["theta"]
        i, j = terms.thetas[:, 0], terms.thetas[:, 1]
        ln_g += _scatter(s, i, 2.0 * m[:, j] * th) + _scatter(s, j, 2.0 * m[:, i] * th)
        osm = osm + (m[:, i] * m[:, j] * th).sum(axis=1)
    for groups in terms.charge_groups:
        sums = [m[:, members].sum(axis=1) for _, members in groups]
        for u, (zu, mem_u) in enumerate(groups):
            for v, (zv, mem_v) in enumerate(groups):
                if v == u:
                    continue
                et, etp = e_theta(zu, zv, I, A_phi)
                ln_g[:, mem_u] += (2.0 * sums[v] * et)[:, None]
                if v > u:   # each unordered pair of charge groups once in F and the osmotic sum
                    F = F + sums[u] * sums[v] * etp
                    osm = osm + sums[u] * sums[v] * (et + I * etp)
    # triplets: psi, each member takes the product of the other two
    if len(terms.triplets):
        ps = values["psi"]
        i, j, k = terms.triplets.T
        ln_g += (_scatter(s, i, m[:, j] * m[:, k] * ps) + _scatter(s, j, m[:, i] * m[:, k] * ps)
                 + _scatter(s, k, m[:, i] * m[:, j] * ps))
        osm = osm + (m[:, i] * m[:, j] * m[:, k] * ps).sum(axis=1)
    # neutral-ion lambda
    if len(terms.lambdas):
        la = values["lambda"]
        nn, ion = terms.lambdas[:, 0], terms.lambdas[:, 1]
        ln_g += _scatter(s, nn, 2.0 * m[:, ion] * la) + _scatter(s, ion, 2.0 * m[:, nn] * la)
        osm = osm + (m[:, nn] * m[:, ion] * la).sum(axis=1)
    ln_g += z[None, :] ** 2 * F[:, None]
    phi = 1.0 + 2.0 * osm / np.where(total > 0, total, 1.0)
    ln_aw = -M_WATER_KG * total * phi
    return ln_g / np.log(10.0), ln_aw / np.log(10.0), phi
