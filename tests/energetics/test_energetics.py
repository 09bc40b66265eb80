"""Catalog, enumeration, in-situ energetics, power, cells and the assess report."""

import io
import shutil
import subprocess
from contextlib import redirect_stdout

import matplotlib
import numpy as np
import pandas as pd
import pytest
from scenarios import POOL_SCENARIO

from redoxgibbs.energetics.catalog import catalog, enumerate_reactions
from redoxgibbs.energetics.insitu import (
    energy_density_kernel,
    gibbs_energy_kernel,
    insitu_energetics,
)
from redoxgibbs.energetics.power import (
    CellRequirement,
    Supply,
    maintenance_tijhuis_1993_W_per_Cmol,
    power_per_cell_W,
    power_per_volume,
)
from redoxgibbs.interfaces.cli import main
from redoxgibbs.reactions.reaction import Reaction, reaction_properties
from redoxgibbs.speciation.solver import speciate

R = 8.314462618
LN10 = np.log(10)


def test_catalog_size_and_balance():
    entries = catalog()          # loading builds every Reaction, which checks the balance
    assert len(entries) >= 40
    assert all(e.electrons > 0 for e in entries)
    names = {e.name for e in entries}
    for required in ("hydrogenotrophic methanogenesis", "acetoclastic methanogenesis", "anammox",
                     "anaerobic oxidation of methane", "sulfur disproportionation", "acetogenesis"):
        assert required in names


def test_electron_counts_common_practice():
    # common practice: 8 e- for sulfate reduction and methanogenesis from H2, 3 for anammox
    by_name = {e.name: e.electrons for e in catalog()}
    assert by_name["sulfate reduction with H2"] == 8
    assert by_name["hydrogenotrophic methanogenesis"] == 8
    assert by_name["anammox"] == 3
    assert by_name["aerobic hydrogen oxidation"] == 4


def test_enumeration_balances_and_counts():
    entries = enumerate_reactions()
    assert len(entries) == 21 * 20
    for e in entries:            # from_coefficients re-parses and checks the balance
        Reaction(str(e.reaction))
    pick = enumerate_reactions(["H+/H2"], ["SO4^2-/HS-"])
    assert str(pick[0].reaction) == "SO4^2- + H+ + 4 H2(aq) = HS- + 4 H2O(l)"
    assert pick[0].electrons == 8


# Thauer, Jungermann & Decker (1977) Bacteriol. Rev. 41, 100, Table: dG0' at 25 C, pH 7, gases at
# 1 atm, solutes 1 M (from memory). Tolerance 2 kJ/mol: their data (NBS tables) and the HKF data
# used here differ by up to about that for these species.
@pytest.mark.parametrize("reaction,h_plus,dG0_prime", [
    ("4 H2(g) + HCO3- + H+ = CH4(g) + 3 H2O(l)", -1, -135.6),
    ("SO4^2- + 4 H2(g) + H+ = HS- + 4 H2O(l)", -1, -151.9),
    ("CH3COO- + H2O(l) = CH4(g) + HCO3-", 0, -31.0),
    ("CH3COO- + SO4^2- = 2 HCO3- + HS-", 0, -47.6),
])
def test_named_reactions_against_thauer_1977(reaction, h_plus, dG0_prime):
    p = reaction_properties(reaction, 25.0, 1.0)
    gases = Reaction(reaction).coefficients[[i for i, s in enumerate(Reaction(reaction).species) if "(g)" in s]]
    # pH 7 and 1 atm gas: RT ln Q with a_H+ = 1e-7, f = 1.01325 bar
    log_q = h_plus * -7.0 + gases.sum() * np.log10(1.01325)
    dGr = float(p.dG0) + R * 298.15 * LN10 * log_q
    assert dGr / 1000 == pytest.approx(dG0_prime, abs=2.0)


def test_gibbs_kernel_hand_computed():
    # dGr = dG0 + RT ln Q written out: A + 2 B = C at 300 K with a_A = 1e-3, a_B = 1e-2, a_C = 1e-6
    dG0 = np.array([[-50_000.0]])
    log_a = np.log10([[1e-3, 1e-2, 1e-6]])
    nu = np.array([[-1.0], [-2.0], [1.0]])
    dGr, log_q = gibbs_energy_kernel(dG0, log_a, nu, np.array([300.0]))
    by_hand = -50_000.0 + R * 300.0 * np.log(1e-6 / (1e-3 * 1e-2**2))
    assert log_q[0, 0] == pytest.approx(-6 + 3 + 4, abs=1e-12)
    assert dGr[0, 0] == pytest.approx(by_hand, rel=1e-11)


def test_energy_density_from_limiting_reactant():
    # 2 mmol/kg of A (nu 1) and 1 mmol/kg of B (nu 2): B limits, 0.5 mmol/kg of reaction;
    # at dGr = -40 kJ/mol that is 20 J/kg; a non-exergonic reaction holds none
    amounts = np.array([[2e-3, 1e-3, 0.0]])
    nu_consumed = np.array([[1.0, 1.0], [2.0, 2.0], [0.0, 0.0]])
    E, limiting = energy_density_kernel(np.array([[-40_000.0, 5_000.0]]), amounts, nu_consumed)
    assert E[0, 0] == pytest.approx(20.0, rel=1e-12) and limiting[0, 0] == 1
    assert E[0, 1] == 0.0


def _sample_frame():
    return pd.DataFrame({"sample": ["a", "b"], "T [degC]": [25.0, 80.0], "P [bar]": [1.0, 50.0],
                         "pH": [7.0, 6.5], "Na+ [mmol/kg]": [10.0, 10.0], "Cl- [mmol/kg]": [10.0, 10.0],
                         "SO4^2- [mmol/kg]": [1.0, 2.0], "HS- [umol/kg]": [5.0, 50.0],
                         "H2(aq) [umol/kg]": [1.0, 100.0], "O2(aq) [umol/kg]": [200.0, 1.0],
                         "HCO3- [mmol/kg]": [2.0, 2.0], "CH4(aq) [umol/kg]": [1.0, 10.0]})


def test_per_electron_times_electrons_is_per_reaction():
    r = speciate(_sample_frame(), "bdot")
    e = insitu_energetics(r, catalog())
    ok = np.isfinite(e.dGr)
    np.testing.assert_allclose((e.dGr_per_electron * e.electrons)[ok], e.dGr[ok], rtol=1e-12)


def test_per_species_values_times_coefficients_are_per_reaction():
    r = speciate(_sample_frame(), "bdot")
    e = insitu_energetics(r, catalog())
    frame = e.to_frame(["H2(aq)"])
    nu = np.tile([abs(x.reaction.coefficient("H2(aq)")) for x in catalog()], len(r.samples))
    takes_part = (nu > 0) & np.isfinite(frame["dGr_kJ_per_mol"].to_numpy())
    np.testing.assert_allclose(frame["dGr_kJ_per_mol_H2(aq)"].to_numpy()[takes_part] * nu[takes_part],
                               frame["dGr_kJ_per_mol"].to_numpy()[takes_part], rtol=1e-12)
    assert frame["dGr_kJ_per_mol_H2(aq)"][nu == 0].isna().all()


def test_energy_density_is_zero_at_equilibrium():
    # choose H2 so that CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l) sits at Q = K at 25 C
    r = speciate(_sample_frame().iloc[:1], "ideal")
    rxn = [x for x in catalog() if x.name == "hydrogenotrophic methanogenesis"]
    e = insitu_energetics(r, rxn)
    # shift H2 by the dGr found: dGr -> 0 when log a_H2 rises by dGr / (4 RT ln 10)
    shift = e.dGr[0, 0] / (4 * R * 298.15 * LN10)
    frame = _sample_frame().iloc[:1].copy()
    frame["H2(aq) [umol/kg]"] *= 10**shift
    e0 = insitu_energetics(speciate(frame, "ideal"), rxn)
    assert abs(e0.dGr[0, 0]) < 1e-6 * abs(e.dGr[0, 0]) + 1e-6
    assert e0.energy_density_J_per_kg[0, 0] == pytest.approx(0.0, abs=1e-9)


def test_power_and_cells_hand_computed():
    r = speciate(_sample_frame(), "bdot")
    e = insitu_energetics(r, [x for x in catalog() if x.name == "aerobic hydrogen oxidation"])
    P = power_per_volume(Supply("flow-through", flux_kg_per_s=2.0, volume_m3=4.0), e)
    # per kg of solution: the water content of each fluid from its own solutes (W < 1)
    assert (e.water_per_kg_solution < 1).all()
    np.testing.assert_allclose(P, e.energy_density_J_per_kg * e.water_per_kg_solution[:, None] * 2.0 / 4.0,
                               rtol=1e-12)
    rate = power_per_volume(Supply("rate", rate_mol_per_L_s=1e-12), e)
    np.testing.assert_allclose(rate, -e.dGr * 1e-12 * 1000.0, rtol=1e-12)
    # Tijhuis et al. (1993): 4.5 kJ per C-mol per hour at 25 C; a 1e-13 g C cell needs
    # 4.5e3 / 3600 W/C-mol x 1e-13 / 12.011 C-mol = 1.04e-14 W
    assert maintenance_tijhuis_1993_W_per_Cmol(298.15) == pytest.approx(4500 / 3600, rel=1e-12)
    low, high = power_per_cell_W(CellRequirement("tijhuis1993", (1e-14, 1e-13)), np.array([298.15]))
    assert high[0] == pytest.approx(4500 / 3600 * 1e-13 / 12.011, rel=1e-9)
    cells = P[0, 0] / high[0]
    assert cells > 0


def test_insitu_cli_contract():
    out = io.StringIO()
    import tempfile
    with tempfile.NamedTemporaryFile("w", suffix=".csv", delete=False) as f:
        _sample_frame().to_csv(f, index=False)
    with redirect_stdout(out):
        assert main(["insitu", f.name, "--reaction", "sulfide oxidation with O2", "--reaction",
                     "CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)", "--activity-model", "bdot",
                     "--format", "csv"]) == 0
    frame = pd.read_csv(io.StringIO(out.getvalue()))
    for col in ["sample", "reaction", "T_C", "P_bar", "dG0_kJ_per_mol", "log10_Q", "dGr_kJ_per_mol",
                "dGr_kJ_per_mol_e", "limiting_species", "energy_density_J_per_kg"]:
        assert col in frame.columns
    assert len(frame) == 4


SCENARIO = POOL_SCENARIO


def test_power_units_are_selectable(tmp_path):
    from redoxgibbs.errors import InputError
    from redoxgibbs.interfaces.assess import run_assessment

    plain, chosen, wrong = (tmp_path / n for n in ("plain.toml", "chosen.toml", "wrong.toml"))
    plain.write_text(SCENARIO)
    chosen.write_text(SCENARIO + '[units]\npower_per_volume = "nW/cm3"\npower_per_mass = "uW/kg"\n')
    wrong.write_text(SCENARIO + '[units]\npower_per_volume = "W/kg"\n')
    a = run_assessment(plain, quiet=True).results
    b = run_assessment(chosen, quiet=True).results
    # SI prefixes: 1 W/m3 = 1e9 nW / 1e6 cm3 = 1000 nW/cm3; 1 W/kg = 1e6 uW/kg
    assert b["power_nW_per_cm3"].iloc[0] == pytest.approx(1000 * a["power_W_per_m3"].iloc[0], rel=1e-12)
    assert b["power_uW_per_kg"].iloc[0] == pytest.approx(1e6 * a["power_W_per_kg"].iloc[0], rel=1e-12)
    assert "power_W_per_m3" not in b.columns
    with pytest.raises(InputError, match="power_per_volume"):
        run_assessment(wrong, quiet=True)


def test_enumeration_of_the_couples_present_in_samples(tmp_path):
    from redoxgibbs.energetics.catalog import couples_present
    from redoxgibbs.speciation.solver import species_in_samples

    frame = _sample_frame()            # H2, O2, SO4, HS-, HCO3-, CH4 (and Na, Cl) measured
    present = couples_present(species_in_samples(frame))
    assert set(present) == {"H+/H2", "O2/H2O", "SO4^2-/HS-", "SO4^2-/sulfur", "sulfur/HS-", "HCO3-/CH4"}
    measured = species_in_samples(frame)
    for x in enumerate_reactions(present, present):
        dissolved = [s for s in x.reaction.species if s not in ("H+", "H2O(l)", "sulfur")]
        assert all(s in measured for s in dissolved), x.name
    path = tmp_path / "samples.csv"
    frame.to_csv(path, index=False)
    out = io.StringIO()
    with redirect_stdout(out):
        assert main(["reactions", "--present-in", str(path)]) == 0
    assert "SO4^2-/HS- -> O2/H2O" in out.getvalue() and "NO3-" not in out.getvalue()


def test_assess_demo_writes_everything(tmp_path):
    out = io.StringIO()
    with redirect_stdout(out):
        assert main(["demo", "--out", str(tmp_path), "--quiet"]) == 0
    for name in ["results.csv", "ranking_reactions_per_site.csv", "ranking_sites_per_reaction.csv",
                 "report.html", "report.md"] + [f"{p}.{ext}" for p in ("gibbs_per_electron", "energy_density",
                                                                       "heat_map", "power_and_cells")
                                                for ext in ("png", "svg")]:
        assert (tmp_path / name).exists(), name
    results = pd.read_csv(tmp_path / "results.csv")
    assert {"power_W_per_m3", "cells_per_m3_low", "cells_per_m3_high", "site"} <= set(results.columns)
    page = (tmp_path / "report.html").read_text()
    assert "screening estimates" in page and "local rules" in page
    for name in ("habitability.csv", "thresholds.csv", "feasibility_map.nc", "depth_profile.csv"):
        assert (tmp_path / name).exists(), name
    for section in ("Habitability envelope", "Thresholds", "not evidence of life"):
        assert section in page and section in (tmp_path / "report.md").read_text(), section
    assert {"biomass_Cmol_per_m3_yr", "biomass_yield_Cmol_per_mol_donor", "growth_model"} <= set(results.columns)


CHROMIUM = shutil.which("chromium") or shutil.which("chromium-browser")


def test_report_renders_in_headless_chromium(tmp_path):
    # the report is a web page: render it, screenshot it, and read back the DOM it built
    assert CHROMIUM, "Debian's chromium package is needed (installed by .ci/run)"
    with redirect_stdout(io.StringIO()):
        main(["demo", "--out", str(tmp_path), "--quiet"])
    flags = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
             "--disable-component-update", "--disable-sync", "--no-first-run", "--disable-quic",
             f"--user-data-dir={tmp_path / 'profile'}", "--window-size=1200,2400"]
    url = (tmp_path / "report.html").as_uri()
    shot = tmp_path / "shot.png"
    subprocess.run([CHROMIUM, *flags, f"--screenshot={shot}", url], check=True, timeout=120,
                   capture_output=True)
    dom = subprocess.run([CHROMIUM, *flags, "--dump-dom", url], check=True, timeout=120,
                         capture_output=True, text=True).stdout
    import matplotlib.image as mpimg
    pixels = mpimg.imread(shot)
    assert pixels.shape[0] > 1000 and pixels[..., :3].std() > 0.05   # not a blank page
    from redoxgibbs.interfaces.report import SECTIONS

    for title in SECTIONS:                                  # every section, in the rendered page
        assert f"<h2>{title}</h2>" in dom, title
    figures = [p.stem for p in tmp_path.glob("*.png") if p.stem != "shot"]
    assert dom.count("<figure") == len(figures) >= 7         # every figure is in the page, inline
    assert dom.count("<svg") >= len(figures) and dom.count('class="scroll"') >= 7   # every table in its box
    assert "http://" not in dom.split("<body")[1].split("<svg")[0] and "<script src" not in dom   # no network
    # the tables sort in the browser: click the speciation table's temperature header in a frame
    probe = tmp_path / "sort_probe.html"
    probe.write_text(
        '<html><body><iframe src="report.html" onload="var d = this.contentDocument;'
        " var t = d.querySelectorAll('table.data')[1]; var k = Array.from(t.rows[0].cells)"
        ".findIndex(function (c) { return c.textContent === 'T_C'; }); t.rows[0].cells[k].click();"
        " document.body.setAttribute('data-sort', t.rows[0].cells[k].getAttribute('aria-sort'));"
        " document.body.setAttribute('data-first', t.tBodies[0].rows[0].cells[k].textContent);\">"
        "</iframe></body></html>")
    probed = subprocess.run([CHROMIUM, *flags, "--allow-file-access-from-files", "--dump-dom", probe.as_uri()],
                            check=True, timeout=120, capture_output=True, text=True).stdout
    coldest = pd.read_csv(tmp_path / "results.csv").drop_duplicates("sample")["T_C"].min()
    assert 'data-sort="ascending"' in probed
    assert float(probed.split('data-first="')[1].split('"')[0]) == pytest.approx(coldest, rel=1e-3)


def test_report_figures_have_no_overlapping_legends_or_labels():
    # the figure objects themselves: legends outside every plotting area, tick labels apart
    from redoxgibbs.interfaces.assess import run_assessment
    from redoxgibbs.interfaces.figures import figure_problems, reaction_styles
    from redoxgibbs.interfaces.report import report_figures

    assessment = run_assessment("examples/demo_scenario.toml", quiet=True)
    figures = report_figures(assessment)
    assert set(figures) >= {"gibbs_per_electron", "energy_density", "heat_map", "power_and_cells", "mixing_path",
                            "depth_profile", "feasibility_map"}
    for stem, (fig, caption) in figures.items():
        assert figure_problems(fig) == [], stem
        assert len(caption) > 60, stem
    # one style per reaction, the same in every figure that draws reactions
    styles = reaction_styles([x.name for x in assessment.scenario.reactions])
    assert len({(s["color"], s["marker"]) for s in styles.values()}) == len(styles)
    for stem in ("gibbs_per_electron", "mixing_path"):
        fig = figures[stem][0]
        handles = {t.get_text(): h for legend in fig.legends for h, t in zip(legend.legend_handles, legend.get_texts())}
        for name, handle in handles.items():
            colour = handle.get_facecolor()[0] if hasattr(handle, "get_facecolor") and stem != "mixing_path" \
                else handle.get_color()
            assert matplotlib.colors.to_hex(colour) == styles[name]["color"].lower(), (stem, name)


# --- mixing -----------------------------------------------------------------------------------
def _end_members():
    return pd.DataFrame({
        "sample": ["vent", "sea"], "T [degC]": [330.0, 2.0], "P [bar]": [250.0, 250.0],
        "pH": [3.6, 7.9], "pH T [degC]": [25.0, 25.0], "Na+ [mmol/kg]": [420.0, 464.0],
        "Cl- [mmol/kg]": [530.0, 545.0], "Mg^2+ [mmol/kg]": [0.0, 52.7], "Ca^2+ [mmol/kg]": [30.0, 10.2],
        "SO4^2- [mmol/kg]": [0.5, 28.0], "HCO3- [mmol/kg]": [8.0, 2.3], "HS- [mmol/kg]": [6.0, 0.0],
        "H2(aq) [mmol/kg]": [1.2, 0.0004], "O2(aq) [umol/kg]": [0.0, 200.0]})


def test_mixing_conserves_elements_and_mass():
    from redoxgibbs.speciation.mixing import mixture_samples
    from redoxgibbs.speciation.samples import read_samples
    from redoxgibbs.species.database import default_database

    db = default_database()
    s = read_samples(_end_members())
    ends = speciate(s, "bdot")
    f = np.array([0.0, 0.1, 0.5, 0.9, 1.0])
    mixed, q, W_mix = mixture_samples(s, "vent", "sea", f, db, ends.charge_imbalance)
    r = speciate(mixed, "bdot", pH_from_charge_balance=True, charge_balance_target=q)
    W, _ = s.water_fraction_and_density(db)
    for el in ("Na", "Cl", "Mg", "S", "C", "Ca"):
        count = np.array([db.record(n).elements.get(el, 0.0) for n in r.species])
        per_kg_solution = (r.molality @ count) * W_mix
        ends_el = np.array([(ends.molality[i] @ count) * W[i] for i in (0, 1)])
        np.testing.assert_allclose(per_kg_solution, f * ends_el[0] + (1 - f) * ends_el[1], rtol=1e-10)
    # mass of fluid: water plus solutes per kg of solution stays 1 kg
    np.testing.assert_allclose(W_mix, f * W[0] + (1 - f) * W[1], rtol=1e-12)


def test_mixing_end_members_reproduce_end_member_results():
    from redoxgibbs.pipeline.mixing import mixing_energetics

    rx = [x for x in catalog() if x.name in ("sulfate reduction with H2", "aerobic hydrogen oxidation")]
    frame = mixing_energetics(_end_members(), "vent", "sea", rx, fractions=[1.0, 0.0])
    ends = speciate(_end_members(), "bdot")
    np.testing.assert_allclose(frame["pH_insitu"].to_numpy()[::2], ends.pH, atol=1e-9)
    e = insitu_energetics(ends, rx)
    np.testing.assert_allclose(frame["dGr_kJ_per_mol"].to_numpy().reshape(2, 2), e.dGr / 1000, rtol=1e-9)


def test_enthalpy_mixing_temperature_against_iapws_hand_calculation():
    # hand calculation with the iapws package's IAPWS-95 enthalpies: h_mix = f h_a + (1 - f) h_b,
    # then T from h by bisection (independent of the project's water layer)
    import iapws

    from redoxgibbs.speciation.mixing import mixing_temperature_enthalpy

    Ta, Tb, P, f = 603.15, 275.15, 250.0, 0.3
    h = lambda T: iapws.IAPWS95(T=T, P=P / 10).h
    target = f * h(Ta) + (1 - f) * h(Tb)
    lo, hi = Tb, Ta
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if h(mid) < target else (lo, mid)
    assert float(mixing_temperature_enthalpy(np.array([f]), Ta, Tb, P)[0]) == pytest.approx(0.5 * (lo + hi), abs=1e-6)


def test_scenario_mixing_section_writes_the_path(tmp_path):
    with redirect_stdout(io.StringIO()):
        assert main(["demo", "--out", str(tmp_path), "--quiet"]) == 0
    mixing = pd.read_csv(tmp_path / "mixing.csv")
    assert {"hydrothermal_fraction", "energy_J_per_kg_mixed_fluid", "energy_J_per_kg_hydrothermal_fluid"} <= set(mixing.columns)
    assert (tmp_path / "mixing_path.png").exists() and (tmp_path / "mixing_path.svg").exists()
    assert mixing["T_C"].min() == pytest.approx(5.0, abs=1e-6)
