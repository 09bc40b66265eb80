"""Power from a fluid supply, and the number of cells it could sustain.

Supply models (each states itself in the output):
- ``flow-through``: fluid mass flux F [kg/s] through a habitat volume V [m3]: P/V = e_solution F / V
- ``turnover``: the fluid's reactant pool renewed every tau [s]: P/V = e_litre * 1000 / tau
- ``areal-flux``: a flux J [mol m-2 yr-1] of the limiting reactant into a layer of thickness h [m]:
  P/V = (-dGr / |nu_limiting|) J / (h * 1 yr)
- ``rate``: a measured or assumed reaction rate r [mol L-1 s-1]: P/V = -dGr r * 1000
- ``serpentinization``: H2 from rock altered per year (``body_supply``) into a volume V (default:
  the body's ocean): P/V = (-dGr / |nu_H2|) r_H2 / V
- ``ice-delivery``: an oxidant produced at a body's surface and delivered through its ice shell
  (``body_supply``) into V: P/V = (-dGr / |nu_oxidant|) r_ox / V
- ``hydrothermal``: the fluid that carries a heat flow Q at a temperature rise dT from the
  recharge temperature, at the pressure of a body's seafloor (``body_supply``), m = Q / dh, into V:
  P/V = e_solution m / V
where e is the energy density (per kg of solution or per litre). Computed in W/m3 and W/kg of
fluid, reported in the units a :class:`PowerUnits` names (e.g. nW/cm3, uW/L, W/kg).

Per-cell requirements (a low-high range, never one number):
- ``tijhuis1993``: maintenance Gibbs energy m_G = 4.5 exp[(69400/R)(1/298.15 - 1/T)] kJ per
  C-mol of biomass per hour (Tijhuis, van Loosdrecht & Heijnen 1993, Biotechnol. Bioeng. 42, 509,
  eq. for aerobic and anaerobic growth; from memory), times a cell's carbon [C-mol]
- ``basal``: a basal power per cell from the range of LaRowe & Amend (2015) Front. Microbiol. 6, 718
  (about 1e-21 to 1e-19 W per cell in marine sediments; from memory)
"""

from dataclasses import dataclass, field

import numpy as np

from ..constants import R_J_MOL_K as R
from ..constants import SECONDS_PER_YEAR, T_REF_K
from ..errors import InputError
from ..units import column_label, conversion_factor
from .body_supply import (
    h2_from_serpentinization_mol_per_s,
    hydrothermal_mass_flux_kg_per_s,
    oxidant_delivery_mol_per_s,
)

__all__ = [
    "SECONDS_PER_YEAR",
    "SUPPLY_OPTIONAL",
    "SUPPLY_PARAMETERS",
    "CellRequirement",
    "PowerUnits",
    "Supply",
    "power_per_cell_W",
    "power_per_volume",
]

#: Each supply model and the fields it takes (the amounts must be above zero; limiting_species
#: names a species). The scenario schema reads the same table.
SUPPLY_PARAMETERS = {"flow-through": ("flux_kg_per_s", "volume_m3"), "turnover": ("tau_s",),
                     "areal-flux": ("areal_flux_mol_per_m2_yr", "thickness_m", "limiting_species"),
                     "rate": ("rate_mol_per_L_s",),
                     "serpentinization": ("rock_kg_per_yr", "feo_mass_fraction", "fe_oxidized_fraction"),
                     "ice-delivery": ("surface_production_mol_per_m2_yr", "delivery_efficiency",
                                      "resurfacing_time_yr", "limiting_species"),
                     "hydrothermal": ("heat_flow_W", "temperature_rise_K", "recharge_T_C")}
#: Fields a supply model may take besides its own (the body-scale models: the volume fed, default
#: the body's ocean; the oxidant's lifetime at the surface, default unlimited)
SUPPLY_OPTIONAL = {"serpentinization": ("volume_m3",), "ice-delivery": ("volume_m3", "surface_lifetime_yr"),
                   "hydrothermal": ("volume_m3",)}
#: Fractions among the fields (between 0 and 1)
SUPPLY_FRACTIONS = ("feo_mass_fraction", "fe_oxidized_fraction", "delivery_efficiency")
SUPPLY_KINDS = tuple(SUPPLY_PARAMETERS)
TIJHUIS_MG_KJ_PER_CMOL_H = 4.5
TIJHUIS_EA_J_PER_MOL = 69400.0
CARBON_G_PER_MOL = 12.011
BASAL_W_PER_CELL = (1e-21, 1e-19)
CELL_CARBON_G = (1e-14, 1e-13)   # 10-100 fg C per cell, small environmental cells (common practice)


@dataclass(frozen=True)
class Supply:
    """A fluid-supply model: ``kind`` and its parameters in SI-named fields."""

    kind: str
    flux_kg_per_s: float = np.nan
    volume_m3: float = np.nan
    tau_s: float = np.nan
    areal_flux_mol_per_m2_yr: float = np.nan
    thickness_m: float = np.nan
    limiting_species: str = ""
    rate_mol_per_L_s: float = np.nan
    rock_kg_per_yr: float = np.nan
    feo_mass_fraction: float = np.nan
    fe_oxidized_fraction: float = np.nan
    surface_production_mol_per_m2_yr: float = np.nan
    delivery_efficiency: float = np.nan
    resurfacing_time_yr: float = np.nan
    surface_lifetime_yr: float = np.inf
    heat_flow_W: float = np.nan
    temperature_rise_K: float = np.nan
    recharge_T_C: float = np.nan

    def _into(self):
        return f"into {self.volume_m3:g} m3" if np.isfinite(self.volume_m3) else "into the body's ocean"

    def describe(self):
        """The supply model and its inputs in words (it names the model in every output)."""
        if self.kind == "flow-through":
            return f"flow-through: {self.flux_kg_per_s:g} kg/s through {self.volume_m3:g} m3"
        if self.kind == "turnover":
            return f"turnover: reactant pool renewed every {self.tau_s:g} s"
        if self.kind == "areal-flux":
            return (f"areal flux: {self.areal_flux_mol_per_m2_yr:g} mol/m2/yr of {self.limiting_species} "
                    f"into {self.thickness_m:g} m")
        if self.kind == "rate":
            return f"reaction rate: {self.rate_mol_per_L_s:g} mol/L/s"
        if self.kind == "serpentinization":
            return (f"serpentinization: {self.rock_kg_per_yr:g} kg/yr of rock, FeO {self.feo_mass_fraction:g}, "
                    f"{self.fe_oxidized_fraction:g} of Fe(II) oxidized -> H2(aq) {self._into()}")
        if self.kind == "ice-delivery":
            life = "" if np.isinf(self.surface_lifetime_yr) else f", surface lifetime {self.surface_lifetime_yr:g} yr"
            return (f"ice delivery: {self.limiting_species} produced at {self.surface_production_mol_per_m2_yr:g} "
                    f"mol/m2/yr, efficiency {self.delivery_efficiency:g}, resurfacing {self.resurfacing_time_yr:g} yr"
                    f"{life} {self._into()}")
        if self.kind == "hydrothermal":
            return (f"hydrothermal: {self.heat_flow_W:g} W carried by fluid warmed {self.temperature_rise_K:g} K "
                    f"from {self.recharge_T_C:g} degC {self._into()}")
        raise InputError(f"supply kind {self.kind!r} is unknown; use {', '.join(SUPPLY_PARAMETERS)}")


def _check_supply(supply):
    """Refuse a supply whose parameters are missing, not finite or not above zero (a drawn sweep
    value included), naming the field."""
    if supply.kind not in SUPPLY_KINDS:
        supply.describe()     # raises the error that names the known kinds
    optional = [x for x in SUPPLY_OPTIONAL.get(supply.kind, ()) if x == "volume_m3" and np.isfinite(supply.volume_m3)]
    for name in SUPPLY_PARAMETERS[supply.kind] + tuple(optional):
        if name in ("limiting_species", "recharge_T_C"):
            continue
        value = np.asarray(getattr(supply, name), dtype=float)
        bad = ~np.isfinite(value) | (value <= 0)
        if bad.any():
            raise InputError(f"supply ({supply.kind}): {name} = {value[bad].ravel()[0]:g} must be a finite number "
                             "above 0 (for a swept value, choose a distribution of positive values, e.g. "
                             "lognormal or uniform)")
        if name in SUPPLY_FRACTIONS and (value > 1).any():
            raise InputError(f"supply ({supply.kind}): {name} = {value[value > 1].ravel()[0]:g} is a fraction; "
                             "give a value between 0 and 1")
    if (np.asarray(supply.surface_lifetime_yr, float) <= 0).any():
        raise InputError(f"supply ({supply.kind}): surface_lifetime_yr must be above 0 (leave it out for no loss)")


def _per_mole_of(species, supply, energetics):
    """-dGr per mole of ``species`` consumed [J/mol] per sample x reaction (NaN where a reaction
    does not consume it; 0 where it releases no energy)."""
    nu = np.array([abs(x.reaction.coefficient(species)) for x in energetics.reactions])
    if not nu.any():
        raise InputError(f"supply ({supply.kind}): {species} takes part in none of the reactions")
    affinity = np.where(energetics.dGr < 0, -energetics.dGr, 0.0)
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(nu > 0, affinity / nu, np.nan)


def _volume_fed(supply, body):
    """The volume a body-scale supply feeds [m3]: its own, or the body's ocean."""
    if np.isfinite(supply.volume_m3):
        return supply.volume_m3
    if body is None:
        raise InputError(f"supply ({supply.kind}): give volume_m3, or a [body] whose ocean it feeds")
    return body.ocean_volume_m3()


def power_per_volume(supply, energetics, body=None):
    """Power [W/m3] per sample x reaction for a supply model and an InsituEnergetics result; the
    body-scale models take the body (:class:`~redoxgibbs.bodies.body.Body`) for its areas and ocean."""
    _check_supply(supply)
    e_kg = energetics.energy_density_J_per_kg * energetics.water_per_kg_solution[:, None]
    e_L = e_kg * energetics.density_kg_L[:, None]
    affinity = np.where(energetics.dGr < 0, -energetics.dGr, 0.0)
    if supply.kind == "flow-through":
        return e_kg * supply.flux_kg_per_s / supply.volume_m3
    if supply.kind == "turnover":
        return e_L * 1000.0 / supply.tau_s
    if supply.kind == "areal-flux":
        return (_per_mole_of(supply.limiting_species, supply, energetics) * supply.areal_flux_mol_per_m2_yr
                / (supply.thickness_m * SECONDS_PER_YEAR))
    if supply.kind == "rate":
        return affinity * supply.rate_mol_per_L_s * 1000.0
    V = _volume_fed(supply, body)
    if supply.kind == "serpentinization":
        rate = h2_from_serpentinization_mol_per_s(supply.rock_kg_per_yr, supply.feo_mass_fraction,
                                                  supply.fe_oxidized_fraction)
        return _per_mole_of("H2(aq)", supply, energetics) * rate / V
    if supply.kind == "ice-delivery":
        if body is None:
            raise InputError("supply (ice-delivery): needs a [body] (its surface area)")
        rate = oxidant_delivery_mol_per_s(supply.surface_production_mol_per_m2_yr, body.surface_area_m2(),
                                          supply.delivery_efficiency, supply.resurfacing_time_yr,
                                          supply.surface_lifetime_yr)
        return _per_mole_of(supply.limiting_species, supply, energetics) * rate / V
    if body is None:
        raise InputError("supply (hydrothermal): needs a [body] (the pressure at its seafloor)")
    flux = hydrothermal_mass_flux_kg_per_s(supply.heat_flow_W, supply.recharge_T_C + 273.15,
                                           body.seafloor_pressure_bar(supply.recharge_T_C + 273.15),
                                           supply.temperature_rise_K)
    return e_kg * flux / V


@dataclass(frozen=True)
class PowerUnits:
    """Units in which power is reported: per volume of habitat and per mass of fluid."""

    per_volume: str = "W/m3"
    per_mass: str = "W/kg"
    volume_factor: float = field(init=False)    # value in per_volume per W/m3
    mass_factor: float = field(init=False)      # value in per_mass per W/kg

    def __post_init__(self):   # units of the wrong kind are refused here, naming the field
        object.__setattr__(self, "volume_factor",
                           conversion_factor(self.per_volume, "W/m3", "power_per_volume unit"))
        object.__setattr__(self, "mass_factor", conversion_factor(self.per_mass, "W/kg", "power_per_mass unit"))

    @property
    def volume_column(self):
        """Column name of power per volume, e.g. ``power_W_per_m3``."""
        return f"power_{column_label(self.per_volume)}"

    @property
    def mass_column(self):
        """Column name of power per mass of fluid, e.g. ``power_W_per_kg``."""
        return f"power_{column_label(self.per_mass)}"


@dataclass(frozen=True)
class CellRequirement:
    """A per-cell power model: ``tijhuis1993`` (with a cell-carbon range) or ``basal``."""

    model: str = "tijhuis1993"
    cell_carbon_g: tuple = CELL_CARBON_G
    basal_W: tuple = BASAL_W_PER_CELL

    def describe(self):
        """The cell model and its ranges in words (it names the model in every output)."""
        if self.model == "tijhuis1993":
            lo, hi = self.cell_carbon_g
            return f"maintenance power, Tijhuis et al. (1993), cells of {lo:g}-{hi:g} g C"
        if self.model == "basal":
            return f"basal power {self.basal_W[0]:g}-{self.basal_W[1]:g} W per cell, LaRowe & Amend (2015)"
        raise InputError(f"cell requirement model {self.model!r} is unknown; use tijhuis1993 or basal")


def maintenance_tijhuis_1993_W_per_Cmol(T_K):
    """Maintenance Gibbs-energy demand [W per C-mol of biomass] (Tijhuis et al. 1993)."""
    T = np.asarray(T_K, float)
    kJ_per_h = TIJHUIS_MG_KJ_PER_CMOL_H * np.exp(TIJHUIS_EA_J_PER_MOL / R * (1 / T_REF_K - 1 / T))
    return kJ_per_h * 1000.0 / 3600.0


def power_per_cell_W(requirement, T_K):
    """(low, high) power demand per cell [W] at temperatures T_K (arrays)."""
    requirement.describe()
    for name in ("cell_carbon_g", "basal_W"):
        low, high = getattr(requirement, name)
        if not (np.isfinite(low) and np.isfinite(high) and 0 < low <= high):
            raise InputError(f"cells: {name} = [{low:g}, {high:g}] must be [low, high] with 0 < low <= high")
    if requirement.model == "tijhuis1993":
        per_cmol = maintenance_tijhuis_1993_W_per_Cmol(T_K)
        lo, hi = requirement.cell_carbon_g
        return per_cmol * lo / CARBON_G_PER_MOL, per_cmol * hi / CARBON_G_PER_MOL
    T = np.asarray(T_K, float)
    return np.full(T.shape, requirement.basal_W[0]), np.full(T.shape, requirement.basal_W[1])
