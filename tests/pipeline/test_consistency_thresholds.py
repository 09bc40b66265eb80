"""Consistency (not an outside check): the [thresholds] section through the command, the assessment
and the solver give the same numbers; the map file reads back."""

import io
from contextlib import redirect_stdout
from pathlib import Path

import numpy as np
import pandas as pd
import pytest
import xarray as xr

from redoxgibbs.energetics.catalog import resolve_reactions
from redoxgibbs.errors import InputError
from redoxgibbs.interfaces.cli import main
from redoxgibbs.interfaces.scenario import load_scenario
from redoxgibbs.pipeline.thresholds import Target, solve_input

SCENARIO = """title = "t"
minimum_energy_kJ_per_mol = 12.0
[[sites]]
name = "site"
samples = "s.csv"
[reactions]
catalog = ["hydrogenotrophic methanogenesis"]
[thresholds]
reaction = "hydrogenotrophic methanogenesis"
input = "H2(aq) [nmol/kg]"
target = "minimum_energy"
bracket = [1e-6, 1e8]
"""
SAMPLES = ("sample,T [degC],P [bar],pH,Na+ [mmol/kg],Cl- [mmol/kg],HCO3- [mmol/kg],CH4(aq) [umol/kg],"
           "H2(aq) [umol/kg]\na,20,50,7.5,450,450,2,1,5\nb,80,50,8.5,450,450,2,1,5\n")


def _write(tmp_path, extra=""):
    (tmp_path / "s.csv").write_text(SAMPLES)
    (tmp_path / "sc.toml").write_text(SCENARIO + extra)
    return tmp_path / "sc.toml"


def test_command_and_solver_agree(tmp_path):
    path = _write(tmp_path)
    with redirect_stdout(io.StringIO()):
        assert main(["thresholds", str(path), "--out", str(tmp_path / "out"), "--quiet"]) == 0
    table = pd.read_csv(tmp_path / "out" / "thresholds.csv")
    frame = pd.read_csv(tmp_path / "s.csv").drop(columns="H2(aq) [umol/kg]")
    direct = solve_input(frame, resolve_reactions(["hydrogenotrophic methanogenesis"])[0], "H2(aq) [nmol/kg]",
                         Target("minimum_energy", 12.0), (1e-6, 1e8))
    np.testing.assert_allclose(table["H2(aq) [nmol/kg]"], direct["H2(aq) [nmol/kg]"], rtol=1e-12)
    assert (table["status"] == "solved").all()


def test_map_reads_back_from_netcdf(tmp_path):
    path = _write(tmp_path, 'sample = "a"\n[thresholds.map]\n"T [degC]" = [5, 50]\npH = [7, 8, 9]\n')
    with redirect_stdout(io.StringIO()):
        assert main(["thresholds", str(path), "--out", str(tmp_path / "out"), "--quiet"]) == 0
    ds = xr.open_dataset(tmp_path / "out" / "feasibility_map.nc")
    assert ds["threshold"].shape == (2, 3) and np.isfinite(ds["threshold"].values).all()
    assert Path(tmp_path / "out" / "feasibility_map.png").exists()


def test_a_map_needs_two_axes_and_a_sample(tmp_path):
    with pytest.raises(InputError, match="exactly two columns"):
        load_scenario(_write(tmp_path, 'sample = "a"\n[thresholds.map]\n"T [degC]" = [5, 50]\n'))
    with pytest.raises(InputError, match="base sample"):
        load_scenario(_write(tmp_path, '[thresholds.map]\n"T [degC]" = [5, 50]\npH = [7, 8]\n'))
