"""Consistency (not an outside check): the body's ocean column and supply models inside the
scenario, the pipeline and the sweeps (the outside checks are in test_bodies_against_references)."""

import numpy as np
import pandas as pd
import pytest

from redoxgibbs.bodies.body import Body
from redoxgibbs.energetics.body_supply import h2_from_serpentinization_mol_per_s
from redoxgibbs.energetics.catalog import resolve_reactions
from redoxgibbs.energetics.power import Supply
from redoxgibbs.errors import InputError
from redoxgibbs.interfaces.scenario import load_scenario
from redoxgibbs.pipeline.evaluate import evaluate
from redoxgibbs.sweeps.runner import Distribution, SweepSpec, load_results, run_sweep

MOON = Body("moon", radius_km=1500.0, ice_shell_km=20.0, ocean_depth_km=100.0, surface_gravity_m_s2=1.3)
FLUID = {"sample": "vent", "above seafloor [km]": 0.0, "T [degC]": 40.0, "pH": 8.5, "Na+ [mmol/kg]": 100.0,
         "Cl- [mmol/kg]": 100.0, "HCO3- [mmol/kg]": 5.0, "H2(aq) [umol/kg]": 500.0, "CH4(aq) [umol/kg]": 10.0}


def test_serpentinization_power_is_energy_per_mole_of_h2_times_its_supply():
    supply = Supply("serpentinization", rock_kg_per_yr=1e9, feo_mass_fraction=0.08, fe_oxidized_fraction=0.3)
    reactions = resolve_reactions(["hydrogenotrophic methanogenesis"])
    ev = evaluate(pd.DataFrame([FLUID]), reactions, "bdot", [supply], body=MOON)
    dGr = ev.energetics.dGr[0, 0]
    expected = -dGr / 4.0 * h2_from_serpentinization_mol_per_s(1e9, 0.08, 0.3) / MOON.ocean_volume_m3()
    assert ev.power_W_per_m3[0][0, 0] == pytest.approx(expected, rel=1e-12)
    assert "serpentinization" in ev.to_frame()["supply"].iloc[0]


def test_body_supplies_without_a_body_are_refused_by_name():
    reactions = resolve_reactions(["hydrogenotrophic methanogenesis"])
    frame = pd.DataFrame([{**{k: v for k, v in FLUID.items() if k != "above seafloor [km]"}, "P [bar]": 100.0}])
    supply = Supply("hydrothermal", heat_flow_W=1e9, temperature_rise_K=40.0, recharge_T_C=1.0)
    with pytest.raises(InputError, match=r"hydrothermal.*\[body\]"):
        evaluate(frame, reactions, "bdot", [supply])


def test_a_depth_profile_is_one_sweep_away(tmp_path):
    base = {k: v for k, v in FLUID.items() if k not in ("sample", "above seafloor [km]")}
    spec = SweepSpec(base=base, inputs={"depth [km]": Distribution("grid", values=(0.0, 50.0, 100.0))},
                     reactions=("hydrogenotrophic methanogenesis",), activity_model="bdot", body=MOON)
    run_sweep(spec, tmp_path, quiet=True)
    frame = load_results(tmp_path)
    assert (frame["failure"] == "").all()
    assert np.all(np.diff(frame["input:depth [km]"]) > 0)


def test_scenario_body_section(tmp_path):
    (tmp_path / "ocean.csv").write_text("sample,depth [km],T [degC],pH,Na+ [mmol/kg],Cl- [mmol/kg]\n"
                                        "top,0,,8.0,450,450\nfloor,100,3,8.0,450,450\n")
    text = """title = "t"
[body]
name = "moon"
radius_km = 1500
surface_gravity_m_s2 = 1.3
ice_shell_km = 20
ocean_depth_km = 100
[[sites]]
name = "ocean"
samples = "ocean.csv"
[reactions]
custom = ["H2(aq) + 1/2 O2(aq) = H2O(l)"]
"""
    (tmp_path / "s.toml").write_text(text)
    scenario = load_scenario(tmp_path / "s.toml")
    s = scenario.sample_set
    assert s.at_freezing.tolist() == [True, False] and s.P_bar[1] > s.P_bar[0] > 200
    (tmp_path / "bad.toml").write_text(text.replace("ice_shell_km", "ice_shell"))
    with pytest.raises(InputError, match="ice_shell_km"):
        load_scenario(tmp_path / "bad.toml")
