"""The evaluation pipeline: one path, water evaluated once per state, in-situ density, result types."""

import numpy as np
import pandas as pd
import pytest
from iapws import IAPWS95

from redoxgibbs.energetics.catalog import catalog
from redoxgibbs.energetics.power import CellRequirement, Supply
from redoxgibbs.pipeline.evaluate import evaluate
from redoxgibbs.speciation.samples import SEAWATER_DENSITY_SLOPE

FLUID = pd.DataFrame({"sample": ["hot", "cold"], "T [degC]": [341.0, 2.0], "P [bar]": [250.0, 250.0],
                      "pH": [3.5, 7.8], "Na+ [mmol/kg]": [420.0, 464.0], "Cl- [mmol/kg]": [545.0, 545.0],
                      "Ca^2+ [mmol/kg]": [30.0, 10.2], "Mg^2+ [mmol/kg]": [0.0, 52.6],
                      "H2(aq) [umol/kg]": [1800.0, 0.4], "O2(aq) [umol/kg]": [1.0, 210.0]})
REACTIONS = [x for x in catalog() if x.name == "aerobic hydrogen oxidation"]


def test_per_litre_energy_uses_the_in_situ_density():
    ev = evaluate(FLUID, REACTIONS, "bdot")
    e = ev.energetics
    W = e.water_per_kg_solution
    # water at T, P from the iapws package's IAPWS-95, plus the stated salinity correction
    rho_w = np.array([IAPWS95(T=341.0 + 273.15, P=25.0).rho, IAPWS95(T=2.0 + 273.15, P=25.0).rho]) / 1000
    np.testing.assert_allclose(e.density_kg_L, rho_w + SEAWATER_DENSITY_SLOPE * (1 - W), rtol=1e-8)
    assert e.density_kg_L[0] < 0.7          # a 341 C fluid is far lighter than 1 kg/L
    frame = e.to_frame()
    per_kg, per_sol, per_L = (frame[c].to_numpy() for c in ("energy_density_J_per_kg",
                                                            "energy_density_J_per_kg_solution",
                                                            "energy_density_J_per_L"))
    assert (per_kg > per_sol).all() and (per_sol[0] > per_L[0])


def test_water_is_evaluated_once_per_state(monkeypatch):
    import redoxgibbs.pipeline.evaluate as pipeline

    calls = []
    real = pipeline.water_state

    def counting(T, P, caloric=True):
        calls.append(np.size(T))
        return real(T, P, caloric=caloric)

    evaluate(FLUID, REACTIONS, "bdot", water=counting)
    assert len(calls) == 1


def test_tidy_table_and_dataset():
    supplies = [Supply("flow-through", flux_kg_per_s=1.0, volume_m3=10.0), Supply("turnover", tau_s=1e7)]
    ev = evaluate(FLUID, REACTIONS, "bdot", supplies, CellRequirement())
    frame = ev.to_frame()
    assert len(frame) == 2 * 1 * 2 and set(frame["supply"]) == {x.describe() for x in supplies}
    ds = ev.to_dataset()
    assert ds["power_W_per_m3"].dims == ("supply", "sample", "reaction")
    assert ds["dGr_kJ_per_mol"].sel(sample="hot").item() == pytest.approx(ev.energetics.dGr[0, 0] / 1e3)
    np.testing.assert_allclose(ds["power_W_per_m3"].sel(supply=supplies[0].describe()).values,
                               ev.power_W_per_m3[0])


def test_every_flag_is_named_once_and_documented():
    from pathlib import Path

    from redoxgibbs.flags import FLAGS, ionic_strength_flag
    from redoxgibbs.species.properties import standard_properties

    props = standard_properties(["HCO3-", "CaSO4(aq)"], np.array([298.15]), np.array([1.0]))
    assert set(props.flags) <= set(FLAGS)
    assert ionic_strength_flag("MODEL") in FLAGS
    guide = (Path(__file__).resolve().parents[2] / "DEVELOPERS.md").read_text()
    for name in FLAGS:
        assert f"`{name}`" in guide, name


def test_standard_states_are_evaluated_once(monkeypatch):
    from redoxgibbs.energetics import insitu
    from redoxgibbs.speciation import solver
    from redoxgibbs.species.properties import standard_properties

    calls = []

    def counting(*args, **kw):
        calls.append(1)
        return standard_properties(*args, **kw)

    monkeypatch.setattr(solver, "standard_properties", counting)
    monkeypatch.setattr(insitu, "standard_properties", counting)
    ev = evaluate(FLUID, REACTIONS, "bdot")
    assert len(calls) == 1      # the speciation's evaluation serves the energetics too
    direct = insitu.insitu_energetics(ev.speciation, REACTIONS)
    np.testing.assert_allclose(direct.dGr, ev.energetics.dGr, rtol=1e-12)
