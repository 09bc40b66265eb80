"""One evaluation path: samples x reactions through speciation, in-situ energetics, power and cells.

Every command (insitu, assess, mix, sweep chunks) calls :func:`evaluate`. The water equation of
state is evaluated once per distinct (T, P) and shared by the speciation and the energetics
(:class:`SharedWater`). The result converts to a tidy pandas table and to an xarray Dataset with
named dimensions (sample, reaction, supply).
"""

from dataclasses import dataclass, field

import numpy as np
import pandas as pd

from ..constants import SECONDS_PER_YEAR
from ..energetics.growth import growth_models
from ..energetics.insitu import DEFAULT_MINIMUM_ENERGY_KJ, insitu_energetics
from ..energetics.power import (
    CARBON_G_PER_MOL,
    CellRequirement,
    PowerUnits,
    power_per_cell_W,
    power_per_volume,
)
from ..speciation.samples import SampleSet, read_samples
from ..speciation.solver import speciate
from ..species.database import default_database
from ..water.iapws95 import water_state

__all__ = ["Evaluation", "SharedWater", "evaluate"]


class SharedWater:
    """A water-state function that remembers its last few results, so that the speciation and the
    energetics of the same states share one evaluation of the equation of state."""

    def __init__(self, water=water_state, size=4):
        self.water, self.size, self._memo = water, size, []

    def __call__(self, T_K, P_bar, caloric=True):
        T, P = np.asarray(T_K, float), np.asarray(P_bar, float)
        for (T0, P0, cal0), value in self._memo:
            if (cal0 or not caloric) and T0.shape == T.shape and np.array_equal(T0, T) and np.array_equal(P0, P):
                return value
        value = self.water(T, P, caloric=caloric)
        self._memo = [((T.copy(), P.copy(), caloric), value)] + self._memo[:self.size - 1]
        return value


@dataclass
class Evaluation:
    """Samples x reactions x supply models: the speciation, the energetics and the power."""

    samples: SampleSet
    speciation: object                  # SpeciationResult
    energetics: object                  # InsituEnergetics
    supplies: list                      # Supply
    power_W_per_m3: list                # per supply: array (n, r)
    cells_W_low: np.ndarray             # per-cell power demand, (n,)
    cells_W_high: np.ndarray
    cells: CellRequirement
    units: PowerUnits = field(default_factory=PowerUnits)

    @property
    def failed(self):
        """Per sample (n,): True where the sample could not be computed (its reason is in ``failure``)."""
        return self.speciation.failure != ""

    def supply_index(self, supply):
        """The index of ``supply`` among the evaluation's supply models (the same model, however
        often several sites name it)."""
        return [x.describe() for x in self.supplies].index(supply.describe())

    def power_column_names(self):
        """The names of the columns :meth:`power_columns` gives."""
        return [self.units.volume_column, self.units.mass_column, "cells_per_m3_low", "cells_per_m3_high",
                "biomass_Cmol_per_m3_yr", "new_cells_per_m3_yr_low", "new_cells_per_m3_yr_high"]

    def power_columns(self, k, rows=slice(None), cells=None):
        """Power, cell and growth columns of supply ``k`` for the samples ``rows`` (flattened sample
        x reaction), named in the chosen units; ``cells`` a CellRequirement when another cell model
        than the evaluation's applies to them. Growth: power spent on growth alone makes power / D_s
        C-mol of biomass (:mod:`~redoxgibbs.energetics.growth`), in cells through the cell model's
        carbon per cell (a low-high range)."""
        cells = self.cells if cells is None else cells
        P = self.power_W_per_m3[k][rows]
        rho = self.energetics.density_kg_L[rows, None]
        low, high = power_per_cell_W(cells, self.speciation.T_K[rows])
        D = np.array([g[2] for g in growth_models(self.energetics.reactions)])     # kJ per C-mol
        biomass = P / (D * 1e3) * SECONDS_PER_YEAR                              # C-mol per m3 per yr
        carbon_low, carbon_high = cells.cell_carbon_g
        return {self.units.volume_column: (P * self.units.volume_factor).ravel(),
                self.units.mass_column: (P / (rho * 1000.0) * self.units.mass_factor).ravel(),
                "cells_per_m3_low": (P / high[:, None]).ravel(),
                "cells_per_m3_high": (P / low[:, None]).ravel(),
                "biomass_Cmol_per_m3_yr": biomass.ravel(),
                "new_cells_per_m3_yr_low": (biomass * CARBON_G_PER_MOL / carbon_high).ravel(),
                "new_cells_per_m3_yr_high": (biomass * CARBON_G_PER_MOL / carbon_low).ravel()}

    def to_frame(self, per_species=()):
        """Tidy table: one row per sample x reaction x supply model (x reaction when none)."""
        base = self.energetics.to_frame(per_species)
        if not self.supplies:
            return base.assign(supply="none given", cell_model=self.cells.describe())
        frames = [base.assign(supply=x.describe(), **self.power_columns(k), cell_model=self.cells.describe())
                  for k, x in enumerate(self.supplies)]
        return pd.concat(frames, ignore_index=True)

    def to_dataset(self):
        """xarray Dataset with dimensions sample, reaction (and supply for power and cells)."""
        import xarray as xr

        e = self.energetics
        dims = ("sample", "reaction")
        data = {"dGr_kJ_per_mol": (dims, e.dGr / 1e3), "dG0_kJ_per_mol": (dims, e.dG0 / 1e3),
                "log10_Q": (dims, e.log10_Q), "dGr_kJ_per_mol_e": (dims, e.dGr_per_electron / 1e3),
                "energy_density_J_per_kg": (dims, e.energy_density_J_per_kg),
                "flags": (dims, e.flags.astype(str)),
                "T_C": (("sample",), e.T_K - 273.15), "P_bar": (("sample",), e.P_bar),
                "pH_insitu": (("sample",), self.speciation.pH),
                "failure": (("sample",), self.speciation.failure.astype(str))}
        if self.supplies:
            stack = np.stack(self.power_W_per_m3)                      # (supply, n, r)
            data[self.units.volume_column] = (("supply",) + dims, stack * self.units.volume_factor)
            data["cells_per_m3_low"] = (("supply",) + dims, stack / self.cells_W_high[None, :, None])
            data["cells_per_m3_high"] = (("supply",) + dims, stack / self.cells_W_low[None, :, None])
        coords = {"sample": list(e.samples), "reaction": [x.name for x in e.reactions]}
        if self.supplies:
            coords["supply"] = [x.describe() for x in self.supplies]
        return xr.Dataset(data, coords=coords)


def evaluate(samples, reactions, activity_model="bdot", supplies=(), cells=None, units=None, *,
             minimum_energy_kJ=DEFAULT_MINIMUM_ENERGY_KJ, pH_from_charge_balance=False,
             charge_balance_target=None, water=water_state, db=None, body=None):
    """Evaluate reactions in samples: the one path every command takes.

    Speciation, in-situ Gibbs energies dGr = dG0 + RT ln Q and energy densities, then power for
    each supply model, the per-cell power demand and growth. A sample that cannot be computed
    carries its reason in ``failure`` and NaN values; the others are computed.

    Parameters
    ----------
    samples : str, path, pandas.DataFrame or SampleSet
        Sample table (CSV or Excel) or an already-read sample set.
    reactions : list of NamedReaction
        Reactions, e.g. from :func:`~redoxgibbs.energetics.catalog.resolve_reactions`.
    activity_model : {'ideal', 'davies', 'bdot', 'pitzer'}
        Activity model of the speciation.
    supplies : sequence of Supply, optional
        Supply models; power [W/m3] is computed for each.
    cells : CellRequirement, optional
        Per-cell power model (default: Tijhuis et al. 1993 maintenance, 10-100 fg C per cell).
    units : PowerUnits, optional
        Units of the power columns of the tables (default W/m3 and W/kg).
    minimum_energy_kJ : float
        Smallest absolute dGr [kJ per mol of reaction] taken as usable (Hoehler 2004); smaller ones are
        flagged.
    pH_from_charge_balance : bool
        Solve the pH from charge balance where a sample's pH cell is blank.
    charge_balance_target : array, optional
        Sum of z m [eq/kg] each sample's charge balance must meet (mixtures keep their alkalinity).
    water : callable
        The water-state function (exact IAPWS-95 or a WaterTable).
    db : SpeciesDatabase, optional
        Species data (default: the bundled data).
    body : Body, optional
        An icy body: places ``depth [km]`` columns in its ocean and feeds body-scale supply models.

    Returns
    -------
    Evaluation
        Speciation, energetics and power; ``to_frame()`` gives the tidy table, ``to_dataset()`` an
        xarray Dataset (sample x reaction x supply).
    """
    db = default_database() if db is None else db
    s = samples if isinstance(samples, SampleSet) else read_samples(samples, db=db, body=body)
    cells = CellRequirement() if cells is None else cells
    shared = SharedWater(water)
    result = speciate(s, activity_model, pH_from_charge_balance=pH_from_charge_balance, db=db,
                      charge_balance_target=charge_balance_target, water=shared)
    energetics = insitu_energetics(result, reactions, db=db, minimum_energy_kJ=minimum_energy_kJ,
                                   gas_fugacity=s.gas_fugacity_bar, water=shared)
    powers = [power_per_volume(x, energetics, body) for x in supplies]
    low, high = power_per_cell_W(cells, result.T_K)
    return Evaluation(samples=s, speciation=result, energetics=energetics, supplies=list(supplies),
                      power_W_per_m3=powers, cells_W_low=low, cells_W_high=high, cells=cells,
                      units=PowerUnits() if units is None else units)
