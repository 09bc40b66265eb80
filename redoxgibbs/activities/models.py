"""Activity models: ideal, Davies, B-dot (extended Debye-Hueckel) and Pitzer, selectable by name.

All work on arrays: molalities (n_samples, n_species), ionic strength (n_samples,), the
Debye-Hueckel A and B of the water layer at each sample's T, P. Each model states its validity in
ionic strength; samples beyond it are flagged by the caller.

References: Davies (1962) Ion Association, Butterworths, eq. (3.6); Helgeson (1969) Am. J. Sci.
267, 729, eq. (4) and Table 2 (B-dot); neutral species as in ``neutral.py``; the Pitzer model in ``pitzer.py``.
"""

from dataclasses import dataclass
from functools import lru_cache
from importlib import resources

import numpy as np
import pandas as pd

from ..errors import InputError
from ..water.iapws95 import M_WATER_KG_PER_MOL as M_WATER_KG
from .neutral import log10_gamma_neutral
from .pitzer import PitzerModel

__all__ = [
    "MODELS",
    "ActivityModel",
    "activity_model",
    "bdot_helgeson_1969",
    "debye_hueckel_sigma",
    "ion_sizes_angstrom",
    "ionic_strength",
    "log10_gamma_bdot",
    "log10_gamma_davies",
    "log10_water_activity",
    "log10_water_activity_extended_dh",
]

DEFAULT_ION_SIZE_ANGSTROM = {1: 4.0, 2: 5.0, 3: 9.0}  # common practice for unlisted ions

# Helgeson (1969) Table 2: B-dot [kg/mol] along saturation, from memory
_BDOT_T_C = np.array([25.0, 50.0, 100.0, 150.0, 200.0, 250.0, 300.0])
_BDOT = np.array([0.041, 0.043, 0.046, 0.047, 0.047, 0.044, 0.035])

def ionic_strength(molality, charge):
    """I = 1/2 sum m_i z_i^2 [mol/kg]; molality (..., n_species), charge (n_species,)."""
    return 0.5 * molality @ (np.asarray(charge, dtype=float) ** 2)


def log10_gamma_davies(charge, I, A):
    """Davies (1962): log10 gamma = -A z^2 [sqrt(I)/(1 + sqrt(I)) - 0.3 I]; valid I <= 0.5 mol/kg."""
    sI = np.sqrt(I)[..., None]
    return -A[..., None] * np.asarray(charge, float) ** 2 * (sI / (1 + sI) - 0.3 * I[..., None])


def bdot_helgeson_1969(T_K):
    """B-dot [kg/mol] of Helgeson (1969) Table 2, interpolated in T (held at the ends)."""
    return np.interp(np.asarray(T_K, float) - 273.15, _BDOT_T_C, _BDOT)


def log10_gamma_bdot(charge, ion_size, I, A, B, bdot):
    """B-dot (Helgeson 1969, eq. 4): log10 gamma = -A z^2 sqrt(I) / (1 + a B sqrt(I)) + Bdot I.

    ``ion_size`` a [angstrom] and ``charge`` per species; A, B [1/angstrom], bdot per sample.
    Valid to about I = 1 mol/kg in NaCl-dominated solutions (Helgeson 1969).
    """
    sI = np.sqrt(I)[..., None]
    z2 = np.asarray(charge, float) ** 2
    return -A[..., None] * z2 * sI / (1 + np.asarray(ion_size) * B[..., None] * sI) + (bdot * I)[..., None]


def log10_water_activity(total_solute_molality):
    """log10 a_w = -M_w sum(m) / ln 10: Raoult's law (osmotic coefficient 1), the ideal model's.

    About 0.2 % high in a_w for seawater (osmotic coefficient 0.90).
    """
    return -M_WATER_KG * total_solute_molality / np.log(10)


def debye_hueckel_sigma(x):
    """sigma(x) = 3/x^3 [1 + x - 1/(1 + x) - 2 ln(1 + x)], with sigma(0) = 1.

    The function of the osmotic coefficient that goes with log10 gamma = -A z^2 sqrt(I) / (1 + x)
    (Robinson & Stokes 1959, Electrolyte Solutions, eq. 9.8); a series near x = 0.
    """
    x = np.asarray(x, dtype=float)
    small = x < 1e-3
    xs = np.where(small, 1.0, x)
    exact = 3.0 / xs**3 * (1.0 + xs - 1.0 / (1.0 + xs) - 2.0 * np.log1p(xs))
    return np.where(small, 1.0 - 1.5 * x + 1.8 * x**2, exact)


def log10_water_activity_extended_dh(molality, charge, ion_size, I, A, B, linear_sum):
    """log10 a_w from the Gibbs-Duhem equation for an extended Debye-Hueckel model.

    For log10 gamma_i = -A z_i^2 sqrt(I) / (1 + a_i B sqrt(I)) + L_i I (each ion its own size a_i
    [angstrom], L_i [kg/mol] the linear coefficient), integrated along dilution at constant
    composition (Robinson & Stokes 1959, eq. 9.8, generalised to a mixture):

        log10 a_w = -M_w [ sum m / ln 10 - (2/3) A I^1.5 sum_i f_i sigma(a_i B sqrt(I))
                           + (I / 2) sum_i L_i m_i ],  f_i = m_i z_i^2 / (2 I).

    Neutral species count in sum m only (their salting-out terms are left out: below 1e-4 in
    log10 a_w at their usual molalities). ``molality`` (n, s); ``charge``, ``ion_size`` (s,);
    I, A, B and ``linear_sum`` = sum_i L_i m_i (n,). Ions are grouped by size, so sigma is
    evaluated once per distinct size, not per ion.
    """
    z2 = np.asarray(charge, float) ** 2
    ions = np.flatnonzero(z2 > 0)
    sizes, group = np.unique(np.asarray(ion_size, float)[ions], return_inverse=True)
    by_size = np.zeros((ions.size, sizes.size))
    by_size[np.arange(ions.size), group] = z2[ions]
    sI = np.sqrt(I)
    mz2 = molality[:, ions] @ by_size                      # sum of m z^2 per size, (n, K)
    # (2/3) A I^1.5 sum f_i sigma_i = (1/3) A sqrt(I) sum m_i z_i^2 sigma_i
    dh = A * sI / 3.0 * np.sum(mz2 * debye_hueckel_sigma(sizes * (B * sI)[:, None]), axis=1)
    return -M_WATER_KG * (molality.sum(axis=1) / np.log(10) - dh + 0.5 * I * linear_sum)


@lru_cache(maxsize=1)
def _ion_size_table():
    path = resources.files("redoxgibbs.species_data") / "ion_sizes.csv"
    table = pd.read_csv(str(path), comment="#", skipinitialspace=True)
    return dict(zip(table["name"], table["ion_size_angstrom"].astype(float)))


def ion_sizes_angstrom(names, charges):
    """Ion-size parameters of species (Kielland 1937 where listed, a default by charge otherwise)."""
    table = _ion_size_table()
    return np.array([table.get(n, DEFAULT_ION_SIZE_ANGSTROM.get(min(abs(int(z)), 3), 4.0)) if z else 0.0
                     for n, z in zip(names, charges)])


@dataclass(frozen=True)
class ActivityModel:
    """A named activity model and the largest ionic strength it is trusted to [mol/kg]."""

    name: str
    I_max: float
    #: ions whose complexes the model carries in its own parameters (none: complexes are species)
    basis_ions: tuple = ()
    #: complexes of those ions that stay species of the model
    model_species: tuple = ()

    def log10_gamma(self, names, charges, I, T_K, A, B):
        """log10 gamma (n_samples, n_species) of the species at ionic strength I per sample."""
        charges = np.asarray(charges, float)
        n = I.shape[0]
        if self.name == "ideal":
            return np.zeros((n, charges.size))
        if self.name == "davies":
            out = log10_gamma_davies(charges, I, A)
        else:
            sizes = ion_sizes_angstrom(names, charges)
            out = log10_gamma_bdot(charges, sizes, I, A, B, bdot_helgeson_1969(T_K))
        neutral = charges == 0
        out[:, neutral] = log10_gamma_neutral([nm for nm, c in zip(names, neutral) if c], T_K, I)
        return out

    def log10_water_activity(self, names, charges, molality, I, T_K, A, B):
        """log10 a_w (n_samples,) consistent with the model's ion activity coefficients."""
        if self.name == "ideal":
            return log10_water_activity(molality.sum(axis=1))
        charges = np.asarray(charges, float)
        if self.name == "davies":   # a_i B = 1 for every ion; L_i = 0.3 A z_i^2, sum L m = 0.6 A I
            return log10_water_activity_extended_dh(molality, charges, np.ones(charges.size), I, A,
                                                    np.ones_like(I), 0.6 * A * I)
        ions = charges != 0
        return log10_water_activity_extended_dh(molality, charges, ion_sizes_angstrom(names, charges), I,
                                                A, B, bdot_helgeson_1969(T_K) * molality[:, ions].sum(axis=1))

    def validity_flags(self, names, charges, molality, T_K):
        """Per sample (n,), flags beyond the ionic-strength limit: none for these models (their
        validity is stated in ionic strength alone)."""
        return np.full(molality.shape[0], "", dtype=object)

    def at(self, names, charges, T_K, A, B):
        """The model at fixed states (n,): its ``activities(molality, rows)`` gives log10 gamma and
        log10 a_w of molalities at those states (every model has this method)."""
        return _DebyeHueckelAtStates(self, tuple(names), np.asarray(charges, float), T_K, A, B)


@dataclass(frozen=True)
class _DebyeHueckelAtStates:
    model: ActivityModel
    names: tuple
    charges: np.ndarray
    T_K: np.ndarray
    A: np.ndarray
    B: np.ndarray

    def activities(self, molality, rows=slice(None)):
        """log10 gamma (n, s) and log10 a_w (n,) of the molalities (n, s) of the states ``rows``."""
        I = ionic_strength(molality, self.charges)
        T, A, B = self.T_K[rows], self.A[rows], self.B[rows]
        return (self.model.log10_gamma(self.names, self.charges, I, T, A, B),
                self.model.log10_water_activity(self.names, self.charges, molality, I, T, A, B))


MODELS = {"ideal": ActivityModel("ideal", np.inf), "davies": ActivityModel("davies", 0.5),
          "bdot": ActivityModel("bdot", 1.0), "pitzer": PitzerModel()}


def activity_model(name):
    """The activity model called ``name`` ('ideal', 'davies', 'bdot' or 'pitzer')."""
    try:
        return MODELS[name.strip().lower()]
    except (KeyError, AttributeError):
        raise InputError(f"activity model: {name!r} is unknown; choose one of {', '.join(MODELS)}") from None
