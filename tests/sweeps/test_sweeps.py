"""Monte Carlo, grids, chunked Parquet output, resumption and dask runs."""

from statistics import NormalDist

import numpy as np
import pytest

from redoxgibbs.sweeps.runner import Distribution, SweepSpec, load_results, run_sweep

R = 8.314462618
BASE = {"T [degC]": 25.0, "P [bar]": 1.0, "pH": 7.0, "Na+ [mmol/kg]": 1.0, "Cl- [mmol/kg]": 1.0,
        "O2(aq) [umol/kg]": 200.0}


def _run(spec, out, **kw):
    run_sweep(spec, out, quiet=True, **kw)
    return load_results(out)


def _spec(n=4000, chunk=1000, seed=11, sigma=0.8):
    return SweepSpec(base=BASE, inputs={"H2(aq) [umol/kg]": Distribution("lognormal", 10.0, sigma)},
                     reactions=("aerobic hydrogen oxidation",), activity_model="ideal", n=n,
                     chunk_size=chunk, seed=seed)


def test_monte_carlo_matches_the_closed_form(tmp_path):
    # 2 H2(aq) + O2(aq) = 2 H2O(l), ideal activities: dGr = c - 2 RT ln m(H2), with ln m(H2) normal
    # (lognormal H2), so the p-th percentile of dGr is c - 2 RT (ln median + sigma z_(1-p)).
    # Tolerance: four standard errors of a sample percentile, sqrt(p(1-p)/N) / phi(z) x sd.
    spec = _spec()
    pct, corr = run_sweep(spec, tmp_path, quiet=True)
    frame = load_results(tmp_path)
    dGr = frame["aerobic hydrogen oxidation|dGr_kJ_per_mol"].to_numpy() * 1e3
    m = frame["input:H2(aq) [umol/kg]"].to_numpy() * 1e-6
    c = np.median(dGr + 2 * R * 298.15 * np.log(m))   # the constant, read off the draws
    sd = 2 * R * 298.15 * spec.inputs["H2(aq) [umol/kg]"].b
    row = pct[pct["quantity"] == "dGr_kJ_per_mol"].iloc[0]
    for p in (5, 50, 95):
        z = NormalDist().inv_cdf(1 - p / 100)
        expected = c - 2 * R * 298.15 * (np.log(10e-6) + spec.inputs["H2(aq) [umol/kg]"].b * z)
        se = np.sqrt(p / 100 * (1 - p / 100) / spec.n) / NormalDist().pdf(z) * sd
        assert row[f"p{p}"] * 1e3 == pytest.approx(expected, abs=4 * se)
    rho = corr[(corr["quantity"] == "dGr_kJ_per_mol")]["spearman_rho"].iloc[0]
    assert rho == pytest.approx(-1.0, abs=1e-9)   # dGr falls monotonically with H2


def test_rank_correlations_against_scipy(tmp_path):
    # scipy.stats.spearmanr of the stored draws: two inputs; sulfate reduction turns endergonic
    # at low H2, so its energy densities hold many tied zeros; anammox lacks its species (NaN)
    from scipy.stats import spearmanr

    base = {**BASE, "SO4^2- [mmol/kg]": 1.0, "HS- [umol/kg]": 100.0}
    spec = SweepSpec(base=base, inputs={"H2(aq) [umol/kg]": Distribution("lognormal", 1e-3, 3.0),
                                        "T [degC]": Distribution("uniform", 5.0, 60.0)},
                     reactions=("aerobic hydrogen oxidation", "sulfate reduction with H2", "anammox"),
                     activity_model="ideal", n=3000, chunk_size=1000, seed=3)
    _, corr = run_sweep(spec, tmp_path, quiet=True)
    frame = load_results(tmp_path)
    tied = frame["sulfate reduction with H2|energy_density_J_per_kg"].to_numpy()
    assert 100 < (tied == 0).sum() < 2900                 # the ties are there
    for _, row in corr.iterrows():
        y = frame[f"{row.reaction}|{row.quantity}"].to_numpy()
        x = frame[f"input:{row.input}"].to_numpy()
        ok = np.isfinite(y)
        if ok.sum() > 2 and np.ptp(y[ok]) > 0:
            assert row.spearman_rho == pytest.approx(spearmanr(x[ok], y[ok]).statistic, abs=1e-10)
        else:
            assert np.isnan(row.spearman_rho)


def test_seeded_and_reproducible(tmp_path):
    a = _run(_spec(n=1500, chunk=500), tmp_path / "a")
    b = _run(_spec(n=1500, chunk=500), tmp_path / "b")
    c = _run(_spec(n=1500, chunk=500, seed=12), tmp_path / "c")
    assert a.equals(b) and not a.equals(c)


def test_interrupted_sweep_resumes_from_chunks_on_disk(tmp_path, monkeypatch):
    from redoxgibbs.sweeps import runner

    spec = _spec(n=1500, chunk=500)
    full = _run(spec, tmp_path / "full")
    part = tmp_path / "part"
    real, calls = runner.run_chunk, []

    def stop_after_one(*args):
        if calls:
            raise KeyboardInterrupt
        calls.append(args)
        return real(*args)

    monkeypatch.setattr(runner, "run_chunk", stop_after_one)
    with pytest.raises(KeyboardInterrupt):
        run_sweep(spec, part, quiet=True)     # a run stopped after one chunk
    monkeypatch.setattr(runner, "run_chunk", real)
    stamp = (part / "chunk_00000.parquet").stat().st_mtime_ns
    resumed = _run(spec, part)
    assert (part / "chunk_00000.parquet").stat().st_mtime_ns == stamp   # not recomputed
    assert resumed.reset_index(drop=True).equals(full.reset_index(drop=True))


def test_a_folder_of_another_sweep_is_refused_by_name(tmp_path):
    from redoxgibbs.errors import InputError

    _run(_spec(n=1000, chunk=500), tmp_path)
    for other in (_spec(n=1000, chunk=500, seed=12), _spec(n=2000, chunk=500), _spec(n=1000, chunk=250),
                  _spec(n=1000, chunk=500, sigma=0.5)):
        with pytest.raises(InputError, match="holds another sweep"):
            run_sweep(other, tmp_path, quiet=True)
    frame = load_results(tmp_path)
    assert len(frame) == 1000
    fresh = _spec(n=1000, chunk=500, seed=12)
    run_sweep(fresh, tmp_path, quiet=True, fresh=True)
    assert not load_results(tmp_path).equals(frame)


def test_stray_and_damaged_chunks(tmp_path, capsys):
    import shutil

    from redoxgibbs.errors import InputError

    spec = _spec(n=1000, chunk=500)
    full = _run(spec, tmp_path)
    shutil.copy(tmp_path / "chunk_00000.parquet", tmp_path / "chunk_00007.parquet")   # a stray copy
    with pytest.raises(InputError, match="chunk_00007.parquet is not one of this sweep's chunks"):
        run_sweep(spec, tmp_path, quiet=True)
    (tmp_path / "chunk_00007.parquet").unlink()
    (tmp_path / "chunk_00001.parquet").write_bytes(b"not parquet")                    # a damaged one
    again = _run(spec, tmp_path)
    assert "chunk_00001.parquet is damaged" in capsys.readouterr().err
    assert again.equals(full)


def test_two_sweeps_into_one_folder_at_once(tmp_path):
    import threading

    spec = _spec(n=2000, chunk=500)
    errors = []

    def go():
        try:
            run_sweep(spec, tmp_path, quiet=True)
        except Exception as err:   # collected and asserted below
            errors.append(err)

    threads = [threading.Thread(target=go) for _ in range(2)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    assert not errors and len(load_results(tmp_path)) == 2000


def test_grid_sweep_is_the_product_of_the_values(tmp_path):
    spec = SweepSpec(base=BASE, inputs={"T [degC]": Distribution("grid", values=(5.0, 25.0, 60.0)),
                                         "H2(aq) [umol/kg]": Distribution("grid", values=(1.0, 100.0))},
                     reactions=("aerobic hydrogen oxidation",), activity_model="ideal", chunk_size=4)
    frame = _run(spec, tmp_path)
    assert len(frame) == 6 and spec.n_chunks == 2
    assert sorted(set(frame["input:T [degC]"])) == [5.0, 25.0, 60.0]


def test_two_worker_dask_cluster_gives_the_in_process_result(tmp_path):
    pytest.importorskip("dask.distributed")
    spec = _spec(n=1200, chunk=300)
    local = _run(spec, tmp_path / "local")
    dask = _run(spec, tmp_path / "dask", workers=2)
    assert local.reset_index(drop=True).equals(dask.reset_index(drop=True))


def test_tabulated_water_path_agrees_with_the_exact_one(tmp_path):
    from dataclasses import replace

    spec = SweepSpec(base=BASE, inputs={"T [degC]": Distribution("uniform", 2.0, 60.0),
                                         "H2(aq) [umol/kg]": Distribution("lognormal", 10.0, 0.5)},
                     reactions=("aerobic hydrogen oxidation",), activity_model="bdot", n=600, chunk_size=300)
    exact = _run(spec, tmp_path / "exact")
    table = _run(replace(spec, water="tabulated"), tmp_path / "table")
    col = "aerobic hydrogen oxidation|dGr_kJ_per_mol"
    # the table's bound on log K (1e-6) is a few uJ/mol here
    assert np.max(np.abs(exact[col].to_numpy() - table[col].to_numpy())) < 1e-5


def test_supply_rate_sweep_scales_power(tmp_path):
    # power of a flow-through supply is linear in the flux: P = e F / V, computed by hand here
    from redoxgibbs.energetics.power import Supply

    spec = SweepSpec(base=BASE, inputs={"supply:flux_kg_per_s": Distribution("grid", values=(1.0, 3.0))},
                     reactions=("aerobic hydrogen oxidation",), activity_model="ideal", chunk_size=10,
                     supplies=(Supply("flow-through", flux_kg_per_s=1.0, volume_m3=10.0),))
    base = dict(BASE, **{"H2(aq) [umol/kg]": 5.0})
    spec = SweepSpec(**{**vars(spec), "base": base})
    frame = _run(spec, tmp_path)
    e = frame["aerobic hydrogen oxidation|energy_density_J_per_kg"].to_numpy()
    P = frame["aerobic hydrogen oxidation|power_W_per_m3"].to_numpy()
    W = 1.0 / (1.0 + 1e-3 * (22.99 + 35.45) * 1e-3 + 5e-6 * 2.016e-3 + 200e-6 * 32.0e-3)
    np.testing.assert_allclose(P, e * W * np.array([1.0, 3.0]) / 10.0, rtol=1e-6)


def test_grid_sweep_as_xarray(tmp_path):
    from redoxgibbs.sweeps.runner import grid_dataset

    spec = SweepSpec(base=BASE, inputs={"T [degC]": Distribution("grid", values=(5.0, 25.0, 60.0)),
                                         "H2(aq) [umol/kg]": Distribution("grid", values=(1.0, 100.0))},
                     reactions=("aerobic hydrogen oxidation",), activity_model="ideal", chunk_size=4)
    run_sweep(spec, tmp_path, quiet=True)
    ds = grid_dataset(spec, tmp_path)
    da = ds["aerobic hydrogen oxidation|dGr_kJ_per_mol"]
    assert da.dims == ("T [degC]", "H2(aq) [umol/kg]") and da.shape == (3, 2)
    # more H2 makes the reaction more exergonic at every temperature (log Q falls)
    assert bool((da.sel({"H2(aq) [umol/kg]": 100.0}) < da.sel({"H2(aq) [umol/kg]": 1.0})).all())


def test_mixing_fraction_as_a_sweep_input(tmp_path):
    # the sweep's mixtures are those of the mixing path computed directly
    from redoxgibbs.energetics.catalog import resolve_reactions
    from redoxgibbs.pipeline.mixing import mixing_energetics

    vent = {"sample": "vent", "T [degC]": 300.0, "P [bar]": 250.0, "pH": 4.0, "Na+ [mmol/kg]": 450.0,
            "Cl- [mmol/kg]": 540.0, "HS- [mmol/kg]": 5.0, "H2(aq) [mmol/kg]": 1.0, "O2(aq) [umol/kg]": 0.0,
            "SO4^2- [mmol/kg]": 0.5, "HCO3- [mmol/kg]": 5.0}
    sea = {"sample": "sea", "T [degC]": 2.0, "P [bar]": 250.0, "pH": 7.9, "Na+ [mmol/kg]": 464.0,
           "Cl- [mmol/kg]": 545.0, "HS- [mmol/kg]": 0.0, "H2(aq) [mmol/kg]": 0.0004, "O2(aq) [umol/kg]": 200.0,
           "SO4^2- [mmol/kg]": 28.0, "HCO3- [mmol/kg]": 2.3}
    fractions = (0.05, 0.2, 0.6)
    spec = SweepSpec(base={}, inputs={"mixing:fraction": Distribution("grid", values=fractions)},
                     reactions=("aerobic hydrogen oxidation",), chunk_size=2,
                     mixing={"hydrothermal": vent, "seawater": sea, "temperature_rule": "enthalpy"})
    swept = _run(spec, tmp_path)
    import pandas as pd
    direct = mixing_energetics(pd.DataFrame([vent, sea]), "vent", "sea",
                               resolve_reactions(["aerobic hydrogen oxidation"]), fractions=list(fractions))
    np.testing.assert_allclose(swept["aerobic hydrogen oxidation|dGr_kJ_per_mol"], direct["dGr_kJ_per_mol"], rtol=1e-9)
    np.testing.assert_allclose(swept["pH_insitu"], direct["pH_insitu"], rtol=1e-9)
