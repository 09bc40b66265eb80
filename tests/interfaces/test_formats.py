"""Formats users have (consistency, not outside checks): Excel workbooks in, CSV / JSON out of every
command, NetCDF beside Parquet for grids, sweeps, maps and assessments."""

import io
import json
from contextlib import redirect_stdout

import numpy as np
import pandas as pd
import pytest
import xarray as xr

import redoxgibbs as rg
from redoxgibbs.errors import InputError
from redoxgibbs.interfaces.cli import main
from redoxgibbs.sweeps.runner import (
    Distribution,
    SweepSpec,
    results_dataset,
    run_sweep,
    write_netcdf,
)

VENTS, ASHGROVE = "examples/vent_samples.csv", "examples/ashgrove_samples.csv"


def _run(argv):
    out = io.StringIO()
    with redirect_stdout(out):
        status = main(argv)
    return status, out.getvalue()


@pytest.mark.parametrize("argv", [
    ["stdstate", "H2(aq) + 0.5 O2(aq) = H2O(l)", "--temperature", "25,100"],
    ["speciation", VENTS],
    ["insitu", VENTS, "--reaction", "aerobic hydrogen oxidation"],
    ["reactions"],
    ["ledger", "Na+", "Cl-"],
    ["mix", VENTS, "--hydrothermal", "Brinefold black smoker", "--seawater", "Brinefold bottom water",
     "--temperatures", "10,50", "--reaction", "aerobic hydrogen oxidation"],
])
def test_every_command_writes_the_same_table_as_csv_and_json(argv):
    _, text_csv = _run(argv + ["--format", "csv"])
    _, text_json = _run(argv + ["--format", "json"])
    from_csv = pd.read_csv(io.StringIO(text_csv))
    from_json = pd.DataFrame(json.loads(text_json))
    assert list(from_csv.columns) == list(from_json.columns) and len(from_csv) == len(from_json) > 0
    for column in from_csv.columns:
        if pd.api.types.is_numeric_dtype(from_csv[column]) and pd.api.types.is_numeric_dtype(from_json[column]):
            np.testing.assert_allclose(from_json[column].astype(float), from_csv[column].astype(float), rtol=1e-5)


def _workbook(path):
    with pd.ExcelWriter(path) as book:
        pd.read_csv(VENTS).to_excel(book, sheet_name="Brinefold", index=False)
        pd.read_csv(ASHGROVE).to_excel(book, sheet_name="Ashgrove", index=False)
    return path


def test_excel_workbooks_read_like_their_csv(tmp_path):
    book = _workbook(tmp_path / "samples.xlsx")
    from_book = rg.speciate(str(book))
    from_csv = rg.speciate(rg.read_samples(VENTS))
    np.testing.assert_allclose(from_book.pH[:3], from_csv.pH, rtol=1e-12)
    assert len(from_book.samples) == 5


def test_one_site_per_sheet_in_a_scenario(tmp_path):
    _workbook(tmp_path / "samples.xlsx")
    text = 'title = "t"\n[[sites]]\nname = "vents"\nsamples = "samples.xlsx"\n[reactions]\ncustom = ["H2(aq) + 1/2 O2(aq) = H2O(l)"]\n'
    (tmp_path / "s.toml").write_text(text)
    assert [s.name for s in rg.load_scenario(tmp_path / "s.toml").sites] == ["vents: Brinefold", "vents: Ashgrove"]
    (tmp_path / "one.toml").write_text(text.replace('samples.xlsx"', 'samples.xlsx"\nsheet = "Ashgrove"'))
    assert [s.name for s in rg.load_scenario(tmp_path / "one.toml").sites] == ["vents"]
    (tmp_path / "bad.toml").write_text(text.replace('samples.xlsx"', 'samples.xlsx"\nsheet = "Nowhere"'))
    with pytest.raises(InputError, match="Nowhere"):
        rg.load_scenario(tmp_path / "bad.toml")


def test_sweeps_write_netcdf_beside_parquet(tmp_path):
    base = {"T [degC]": 25.0, "P [bar]": 1.0, "pH": 7.0, "Na+ [mmol/kg]": 1.0, "Cl- [mmol/kg]": 1.0,
            "O2(aq) [umol/kg]": 200.0}
    grid = SweepSpec(base=base, inputs={"H2(aq) [umol/kg]": Distribution("grid", values=(1.0, 10.0)),
                                        "T [degC]": Distribution("grid", values=(5.0, 25.0, 45.0))},
                     reactions=("aerobic hydrogen oxidation",), activity_model="ideal")
    run_sweep(grid, tmp_path / "grid", quiet=True)
    write_netcdf(results_dataset(grid, tmp_path / "grid"), tmp_path / "grid.nc")
    ds = xr.open_dataset(tmp_path / "grid.nc")
    assert ds["aerobic hydrogen oxidation|dGr_kJ_per_mol"].shape == (2, 3)
    draws = SweepSpec(base=base, inputs={"H2(aq) [umol/kg]": Distribution("lognormal", 10.0, 0.5)},
                      reactions=("aerobic hydrogen oxidation",), activity_model="ideal", n=50, chunk_size=25)
    run_sweep(draws, tmp_path / "mc", quiet=True)
    write_netcdf(results_dataset(draws, tmp_path / "mc"), tmp_path / "mc.nc")
    mc = xr.open_dataset(tmp_path / "mc.nc")
    parquet = rg.load_results(tmp_path / "mc")
    np.testing.assert_allclose(mc["aerobic hydrogen oxidation|dGr_kJ_per_mol"].values,
                               parquet["aerobic hydrogen oxidation|dGr_kJ_per_mol"].values)
