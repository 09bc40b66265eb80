"""Supply from geology and from the surface: body-scale parameters turned into the fluxes the power
calculation needs. One published approach per function, each input with its unit.

- hydrogen from serpentinization: 2 FeO + H2O -> Fe2O3 + H2, one H2 per two Fe(II) oxidized to
  Fe(III) (the stoichiometry behind the H2 budgets of McCollom & Bach 2009, Geochim. Cosmochim.
  Acta 73, 856, and of Vance et al. 2007, Astrobiology 7, 987; from memory);
- oxidant delivery through an ice shell: surface production times a delivery efficiency, with a
  first-order loss at the surface over the surface's age (the resurfacing time), the framework of
  Chyba (2000) Nature 403, 381 and Hand et al. (2007) Astrobiology 7, 1006 (from memory);
- hydrothermal circulation: the fluid mass flux that carries a heat flow at a given temperature
  rise, m = Q / [h(T_r + dT) - h(T_r)] from the recharge temperature T_r at the seafloor's pressure
  (heat budget of a vent field, common practice), with the enthalpy of IAPWS-95 water.
"""

import numpy as np

from ..constants import SECONDS_PER_YEAR
from ..water.iapws95 import M_WATER_KG_PER_MOL, water_state

__all__ = [
    "FEO_G_PER_MOL",
    "h2_from_serpentinization_mol_per_s",
    "hydrothermal_mass_flux_kg_per_s",
    "oxidant_delivery_mol_per_s",
    "surviving_fraction_first_order",
]

#: Molar mass of FeO [g/mol] (IUPAC 2021 standard atomic weights: Fe 55.845, O 15.999)
FEO_G_PER_MOL = 71.844


def h2_from_serpentinization_mol_per_s(rock_kg_per_yr, feo_mass_fraction, fe_oxidized_fraction):
    """H2 produced by serpentinization [mol/s]: rock altered per year [kg/yr] of FeO mass fraction
    [kg/kg], of whose Fe(II) the fraction [-] is oxidized to Fe(III); 2 FeO + H2O -> Fe2O3 + H2.

    Example: 1e9 kg/yr of rock with 8 wt% FeO, 30 % of it oxidized: 1e9 * 0.08 / 0.071844 * 0.3 / 2
    = 1.67e8 mol H2/yr = 5.29 mol/s.
    """
    fe_mol_per_yr = np.asarray(rock_kg_per_yr, float) * feo_mass_fraction / (FEO_G_PER_MOL / 1000.0)
    return fe_mol_per_yr * fe_oxidized_fraction / 2.0 / SECONDS_PER_YEAR


def surviving_fraction_first_order(resurfacing_time_yr, surface_lifetime_yr):
    """Share of the oxidant produced at the surface that is still there when the ice is resurfaced
    [-]: production at a steady rate over the surface age tau_r, first-order loss of lifetime
    tau_L: f = (tau_L / tau_r) (1 - exp(-tau_r / tau_L)); 1 for an infinite lifetime."""
    tr = np.asarray(resurfacing_time_yr, float)
    tl = np.asarray(surface_lifetime_yr, float)
    x = tr / tl
    return np.where(np.isinf(tl), 1.0, np.where(x < 1e-8, 1.0 - x / 2.0, -np.expm1(-x) / np.where(x > 0, x, 1.0)))


def oxidant_delivery_mol_per_s(production_mol_per_m2_yr, area_m2, delivery_efficiency, resurfacing_time_yr,
                               surface_lifetime_yr=np.inf):
    """Oxidant delivered to the ocean [mol/s]: surface production [mol m-2 yr-1] over the surface
    area [m2], the share surviving at the surface until resurfacing
    (:func:`surviving_fraction_first_order`), times the share of that delivered through the shell
    (delivery efficiency [-])."""
    f = surviving_fraction_first_order(resurfacing_time_yr, surface_lifetime_yr)
    return np.asarray(production_mol_per_m2_yr, float) * area_m2 * f * delivery_efficiency / SECONDS_PER_YEAR


def hydrothermal_mass_flux_kg_per_s(heat_flow_W, recharge_T_K, P_bar, temperature_rise_K):
    """Fluid mass flux [kg/s] carrying a heat flow [W] out of the seafloor as fluid warmed by
    ``temperature_rise_K`` from the recharge temperature [K] at pressure P [bar]:
    Q / [h(T_r + dT) - h(T_r)], h of IAPWS-95 water (arrays broadcast)."""
    T, P, dT = np.broadcast_arrays(np.asarray(recharge_T_K, float), np.asarray(P_bar, float),
                                   np.asarray(temperature_rise_K, float))
    hot, cold = water_state(T + dT, P), water_state(T, P)
    dh_J_per_kg = (hot.H_J_mol - cold.H_J_mol) / M_WATER_KG_PER_MOL
    return np.asarray(heat_flow_W, float) / dh_J_per_kg
