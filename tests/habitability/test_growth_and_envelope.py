"""Growth yields, the habitability envelope and thresholds solved backwards.

Outside checks: the dissipation correlation's published values for glucose and acetate (Heijnen &
van Dijken 1992, from memory) and yields computed by hand from it; the envelope's limits at each
side, hand-checked. The threshold tests check the solver against the pipeline itself (the target
is met when the solved input is put back) and are consistency checks, kept here beside the
feature they test.
"""

import numpy as np
import pandas as pd
import pytest

from redoxgibbs.energetics.catalog import resolve_reactions
from redoxgibbs.energetics.growth import (
    biomass_yield_Cmol_per_mol_donor,
    dissipation_heijnen_1992_kJ_per_Cmol,
    electron_donor,
    growth_model,
)
from redoxgibbs.energetics.power import CellRequirement, Supply
from redoxgibbs.habitability.envelope import Limits, habitability_envelope
from redoxgibbs.pipeline.evaluate import evaluate
from redoxgibbs.pipeline.thresholds import Target, feasibility_map, solve_input


def test_dissipation_correlation_against_its_published_values():
    # Heijnen & van Dijken (1992) Biotechnol. Bioeng. 39, 833 (from memory): 236 kJ/C-mol on
    # glucose (C = 6, gamma = 4), 432 on acetate (C = 2, gamma = 4); the tables give whole kJ
    assert dissipation_heijnen_1992_kJ_per_Cmol(6, 4) == pytest.approx(236.0, abs=0.5)
    assert dissipation_heijnen_1992_kJ_per_Cmol(2, 4) == pytest.approx(432.0, abs=0.5)


def test_growth_models_of_catalog_reactions():
    methanogens = resolve_reactions(["hydrogenotrophic methanogenesis"])[0].reaction
    assert electron_donor(methanogens) == "H2(aq)"
    assert growth_model(methanogens)[2] == 1000.0                 # autotrophic, no reversed transport
    iron = resolve_reactions(["ferrous iron oxidation with O2 to goethite"])[0].reaction
    assert growth_model(iron)[0] == "Fe^2+" and growth_model(iron)[2] == 3500.0
    acetate = resolve_reactions(["acetoclastic methanogenesis"])[0].reaction
    assert growth_model(acetate)[0] == "CH3COO-" and growth_model(acetate)[2] == pytest.approx(432.12, abs=0.01)


def test_yield_by_hand():
    # -100 kJ per mol of reaction with 4 H2: 25 kJ per mol H2; 1000 kJ per C-mol: 0.025 C-mol/mol H2
    assert biomass_yield_Cmol_per_mol_donor(-100e3, 4, 1000.0) == pytest.approx(0.025)
    assert biomass_yield_Cmol_per_mol_donor(5e3, 4, 1000.0) == 0.0


def test_biomass_production_by_hand_from_power():
    fluid = pd.DataFrame({"sample": ["s"], "T [degC]": [30.0], "P [bar]": [50.0], "pH": [7.5],
                          "Na+ [mmol/kg]": [450.0], "Cl- [mmol/kg]": [450.0], "HCO3- [mmol/kg]": [2.0],
                          "CH4(aq) [umol/kg]": [1.0], "H2(aq) [umol/kg]": [100.0]})
    cells = CellRequirement(cell_carbon_g=(1e-14, 1e-13))
    ev = evaluate(fluid, resolve_reactions(["hydrogenotrophic methanogenesis"]), "bdot",
                  [Supply("turnover", tau_s=3.15e7)], cells)
    row = ev.to_frame().iloc[0]
    P = ev.power_W_per_m3[0][0, 0]
    expected_Cmol = P / 1e6 * 365.25 * 86400          # W/m3 over 1000 kJ/C-mol, per year
    assert row["biomass_Cmol_per_m3_yr"] == pytest.approx(expected_Cmol, rel=1e-12)
    assert row["new_cells_per_m3_yr_high"] == pytest.approx(expected_Cmol * 12.011 / 1e-14, rel=1e-12)
    assert row["biomass_yield_Cmol_per_mol_donor"] == pytest.approx(-row["dGr_kJ_per_mol"] / 4 / 1000, rel=1e-12)


def _fluid(**over):
    base = {"sample": "s", "T [degC]": 25.0, "P [bar]": 10.0, "pH": 7.0, "Na+ [mmol/kg]": 450.0,
            "Cl- [mmol/kg]": 450.0, "HCO3- [mmol/kg]": 2.0, "CH4(aq) [umol/kg]": 1.0, "H2(aq) [umol/kg]": 100.0}
    base.update(over)
    return base


def _verdicts(rows, limits=Limits(), supplies=(), model="bdot"):
    frame = pd.DataFrame(rows)
    frame["sample"] = [f"s{i}" for i in range(len(frame))]
    ev = evaluate(frame, resolve_reactions(["hydrogenotrophic methanogenesis"]), model, list(supplies))
    env = habitability_envelope(ev, limits)
    return {(r.sample, r.criterion): r.verdict for r in env.itertuples()}


def test_envelope_limits_at_each_side():
    v = _verdicts([_fluid(**{"T [degC]": 121.0}), _fluid(**{"T [degC]": 123.0}), _fluid(pH=12.4),
                   _fluid(pH=12.6)])
    assert v[("s0", "temperature, upper")] == "pass" and v[("s1", "temperature, upper")] == "fail"
    assert v[("s2", "pH")] == "pass" and v[("s3", "pH")] == "fail"
    own = Limits(T_max_C=100.0)
    assert _verdicts([_fluid(**{"T [degC]": 101.0})], own)[("s0", "temperature, upper")] == "fail"


def test_missing_data_is_never_a_pass():
    v = _verdicts([_fluid()])
    for criterion in ("nutrient: phosphate", "nutrient: iron", "energy: power for cells"):
        assert v[("s0", criterion)] == "not assessed"
    v = _verdicts([_fluid(**{"HPO4^2- [umol/kg]": 0.0}), _fluid(**{"HPO4^2- [umol/kg]": 1.0})])
    assert v[("s0", "nutrient: phosphate")] == "fail" and v[("s1", "nutrient: phosphate")] == "pass"


def test_water_activity_limit():
    brine = _fluid(**{"Na+ [mol/kg]": 6.0, "Cl- [mol/kg]": 6.0})
    del brine["Na+ [mmol/kg]"], brine["Cl- [mmol/kg]"]
    # a_w of 6 mol/kg NaCl is 0.76 (Robinson & Stokes 1959; from memory): passes 0.585, fails 0.8
    assert _verdicts([brine], model="pitzer")[("s0", "water activity")] == "pass"
    assert _verdicts([brine], Limits(water_activity_min=0.8), model="pitzer")[("s0", "water activity")] == "fail"


METHANOGENESIS = resolve_reactions(["hydrogenotrophic methanogenesis"])[0]


def _random_fluids(n, seed, T_max=110.0):
    rng = np.random.default_rng(seed)
    frame = pd.DataFrame([_fluid()] * n)
    frame["T [degC]"] = rng.uniform(2.0, T_max, n)
    frame["pH"] = rng.uniform(6.0, 10.0, n)
    frame["P [bar]"] = rng.uniform(5.0, 400.0, n)
    frame["sample"] = [f"r{i}" for i in range(n)]
    return frame


@pytest.mark.parametrize("target", [Target("minimum_energy", 10.0), Target("energy_density", 0.5)])
def test_solved_inputs_meet_the_target_when_put_back(target):
    frame = _random_fluids(40, 3)
    solved = solve_input(frame, METHANOGENESIS, "H2(aq) [umol/kg]", target, (1e-9, 1e5))
    assert (solved["status"] == "solved").all()
    frame["H2(aq) [umol/kg]"] = solved["H2(aq) [umol/kg]"]
    ev = evaluate(frame, [METHANOGENESIS], "bdot")
    got = -ev.energetics.dGr[:, 0] / 1e3 if target.kind == "minimum_energy" else ev.energetics.energy_density_J_per_kg[:, 0]
    np.testing.assert_allclose(got, target.value, rtol=1e-6)


def test_cells_target_and_monotonicity():
    frame = _random_fluids(10, 5, T_max=60.0)     # hotter, the maintenance power outgrows 0.1 mol/kg H2
    supply = Supply("turnover", tau_s=3.15e7)
    few = solve_input(frame, METHANOGENESIS, "H2(aq) [umol/kg]", Target("cells", 1e3), (1e-9, 1e5), supply=supply)
    many = solve_input(frame, METHANOGENESIS, "H2(aq) [umol/kg]", Target("cells", 1e5), (1e-9, 1e5), supply=supply)
    ok = (few["status"] == "solved") & (many["status"] == "solved")
    assert ok.all()
    assert (many["H2(aq) [umol/kg]"][ok] > few["H2(aq) [umol/kg]"][ok]).all()
    # more energy demanded needs more hydrogen, at every sample
    low = solve_input(frame, METHANOGENESIS, "H2(aq) [umol/kg]", Target("minimum_energy", 5.0), (1e-9, 1e5))
    high = solve_input(frame, METHANOGENESIS, "H2(aq) [umol/kg]", Target("minimum_energy", 20.0), (1e-9, 1e5))
    assert (high["H2(aq) [umol/kg]"] > low["H2(aq) [umol/kg]"]).all()


def test_no_solution_is_reported_as_such():
    frame = _random_fluids(5, 7)
    out = solve_input(frame, METHANOGENESIS, "H2(aq) [umol/kg]", Target("minimum_energy", 10.0), (1e-9, 1e-6))
    assert out["H2(aq) [umol/kg]"].isna().all()
    assert out["status"].str.startswith("no solution in [1e-09, 1e-06]").all()


def test_feasibility_map_dimensions_and_values():
    base = _fluid()
    ds = feasibility_map(base, METHANOGENESIS, "H2(aq) [umol/kg]", Target("minimum_energy", 10.0), (1e-9, 1e5),
                         {"T [degC]": [5.0, 50.0, 100.0], "pH": [6.5, 8.0]})
    assert ds["threshold"].dims == ("T", "pH") and ds["threshold"].shape == (3, 2)
    single = solve_input(pd.DataFrame([{**base, "T [degC]": 50.0, "pH": 8.0}]), METHANOGENESIS, "H2(aq) [umol/kg]",
                         Target("minimum_energy", 10.0), (1e-9, 1e5))
    assert float(ds["threshold"].sel(T=50.0, pH=8.0)) == pytest.approx(single["H2(aq) [umol/kg]"][0], rel=1e-7)


def test_envelope_each_other_limit_at_each_side():
    cold = _fluid(**{"T [degC]": -5.0, "Na+ [mmol/kg]": 1500.0, "Cl- [mmol/kg]": 1500.0})
    assert _verdicts([cold])[("s0", "temperature, lower")] == "pass"
    assert _verdicts([cold], Limits(T_min_C=0.0))[("s0", "temperature, lower")] == "fail"
    acid = _fluid(pH=0.5)
    assert _verdicts([acid])[("s0", "pH")] == "pass"
    assert _verdicts([acid], Limits(pH_min=1.0))[("s0", "pH")] == "fail"
    nutrients = [_fluid(**{"NH4+ [umol/kg]": 2.0, "SO4^2- [umol/kg]": 2.0, "Fe^2+ [umol/kg]": 0.002}),
                 _fluid(**{"NH4+ [umol/kg]": 0.5, "SO4^2- [umol/kg]": 0.5, "Fe^2+ [umol/kg]": 0.0005})]
    v = _verdicts(nutrients)
    for criterion in ("nutrient: fixed nitrogen", "nutrient: sulfur", "nutrient: iron"):
        assert (v[("s0", criterion)], v[("s1", criterion)]) == ("pass", "fail"), criterion


def test_energy_criteria_at_each_side():
    frame = pd.DataFrame([_fluid()])
    ev = evaluate(frame, [METHANOGENESIS], "bdot", [Supply("turnover", tau_s=3.15e7)])
    best = -ev.energetics.dGr[0, 0] / 1e3
    verdict = lambda env, c: env.loc[env["criterion"] == c, "verdict"].item()   # noqa: E731
    assert verdict(habitability_envelope(ev, minimum_energy_kJ=best * 0.99), "energy: best reaction's -dGr") == "pass"
    assert verdict(habitability_envelope(ev, minimum_energy_kJ=best * 1.01), "energy: best reaction's -dGr") == "fail"
    # the power keeps P / demand cells: pass when even the high demand is met, fail when not the low one
    P = ev.power_W_per_m3[0][0, 0]
    low_W, high_W = ev.cells_W_low[0], ev.cells_W_high[0]
    for need, expected in ((P / high_W / 1e6 * 0.99, "pass"), (P / low_W / 1e6 * 1.01, "fail"),
                           (np.sqrt(P / high_W * P / low_W) / 1e6, "uncertain")):
        env = habitability_envelope(ev, Limits(cells_per_cm3_min=need))
        assert verdict(env, "energy: power for cells") == expected, expected
