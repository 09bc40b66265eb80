"""Scenario files: the schema refuses what it does not allow, naming the key and what is expected;
sites are read on their own (units, species names) and may carry their own supply and cell models."""

import textwrap

import pytest
from scenarios import POOL_SCENARIO

from redoxgibbs.errors import InputError
from redoxgibbs.interfaces.assess import run_assessment
from redoxgibbs.interfaces.scenario import load_scenario

BASE = POOL_SCENARIO


def _write(tmp_path, text, name="s.toml"):
    path = tmp_path / name
    path.write_text(textwrap.dedent(text))
    return path


@pytest.mark.parametrize("change,message", [
    (('activity_model = "bdot"', 'activity-model = "bdot"'), "did you mean 'activity_model'"),
    (('activity_model = "bdot"', 'activty_model = "bdot"'), "did you mean 'activity_model'"),
    (('catalog = ["aerobic hydrogen oxidation"]', 'catalog = ["aerobic hydrogen oxidation"]\ncustm = []'),
     "did you mean 'custom'"),
    (('catalog = ["aerobic hydrogen oxidation"]', 'catalog = ["aerobic hydrogen oxidation"]\nper_specie = []'),
     "did you mean 'per_species'"),
    (("[[supply]]", "[[suply]]"), "did you mean 'supply'"),
    (('catalog = ["aerobic hydrogen oxidation"]', 'catalog = "aerobic hydrogen oxidation"'), "a list of text"),
    (('catalog = ["aerobic hydrogen oxidation"]', "catalog = [1, 2]"), "a list of text"),
    (('activity_model = "bdot"', 'minimum_energy_kJ_per_mol = "ten"'), "finite number"),
    (("flux_kg_per_s = 1.0", "flux_kg_per_s = -1.0"), "above 0"),
    (("volume_m3 = 100.0", "volume_m3 = 0"), "above 0"),
    (('kind = "flow-through"\n', ""), "'kind' is required"),
    (('kind = "flow-through"', 'kind = "flow-trough"'), "not one of"),
    (("volume_m3 = 100.0", "volume_m3 = 100.0\ntau_s = 5.0"), "do not belong"),
])
def test_scenario_mistakes_are_refused_by_key(tmp_path, change, message):
    old, new = change
    assert old in BASE
    with pytest.raises(InputError, match=message):
        load_scenario(_write(tmp_path, BASE.replace(old, new)))


@pytest.mark.parametrize("extra,message", [
    ("[cell]\nmodel = \"basal\"\n", "did you mean 'cells'"),
    ("[cells]\nmodel = \"tijhuis1993\"\ncell_carbon_g = [1e-13, 1e-14]\n", "low <= high"),
    ("[uncertainty]\nsample = \"pool\"\ndraws = 200.7\n[uncertainty.inputs]\n\"T [degC]\" = [20, 30]\n", "whole number"),
    ("[uncertainty]\nsample = \"pool\"\ndraws = 0\n[uncertainty.inputs]\n\"T [degC]\" = [20, 30]\n", "above 0"),
    ("[uncertainty]\nsample = \"pool\"\nchunk_size = 0\n[uncertainty.inputs]\n\"T [degC]\" = [20, 30]\n", "above 0"),
    ("[uncertainty]\nsample = \"pool\"\n[uncertainty.inputs]\n\"T [degC]\" = {distribution = \"uniform\", low = 40, high = 20}\n",
     "above high"),
])
def test_sections_are_checked(tmp_path, extra, message):
    with pytest.raises(InputError, match=message):
        load_scenario(_write(tmp_path, BASE + extra))


def test_samples_key_of_the_wrong_type_and_file_problems(tmp_path):
    text = BASE.replace('[sites.fluid]\n"T [degC]" = 30\n"P [bar]" = 1\npH = 7.0\n"Na+ [mmol/kg]" = 10\n'
                        '"Cl- [mmol/kg]" = 10\n"HCO3- [mmol/kg]" = 2\n"H2(aq) [umol/kg]" = 20\n"O2(aq) [umol/kg]" = 100\n',
                        "samples = 5\n")
    with pytest.raises(InputError, match="sites 1.samples: expected text"):
        load_scenario(_write(tmp_path, text))
    with pytest.raises(InputError, match="does not exist"):
        load_scenario(tmp_path / "nothing.toml")
    with pytest.raises(InputError, match="not valid TOML"):
        load_scenario(_write(tmp_path, "title = \n"))


SITES = """
title = "two sites"
[[sites]]
name = "east"
samples = "east.csv"
[[sites]]
name = "west"
samples = "west.csv"
[[sites.supply]]
kind = "turnover"
tau_s = 1e6
[reactions]
catalog = ["hydrogenotrophic methanogenesis"]
[[supply]]
kind = "flow-through"
flux_kg_per_s = 1.0
volume_m3 = 100.0
"""


def test_each_site_is_read_on_its_own_with_its_own_supply(tmp_path):
    # the same fluid, given in different units and with a different carbonate species per site
    (tmp_path / "east.csv").write_text(
        "sample,T [degC],P [bar],pH,Na+ [mmol/kg],Cl- [mmol/kg],HCO3- [mmol/kg],H2(aq) [umol/kg],CH4(aq) [umol/kg]\n"
        "e1,40,50,9.5,100,100,2,500,10\n")
    (tmp_path / "west.csv").write_text(
        "sample,T [degC],P [bar],pH,Na+ [mol/kg],Cl- [mol/kg],CO2(aq) [umol/kg],H2(aq) [mmol/kg],CH4(aq) [mmol/kg]\n"
        "w1,40,50,9.5,0.1,0.1,2000,0.5,0.01\n")
    a = run_assessment(_write(tmp_path, SITES), quiet=True)
    res = a.results
    east, west = res[res["site"] == "east"], res[res["site"] == "west"]
    assert east["dGr_kJ_per_mol"].iloc[0] == pytest.approx(west["dGr_kJ_per_mol"].iloc[0], rel=1e-9)
    assert east["energy_density_J_per_kg"].iloc[0] == pytest.approx(west["energy_density_J_per_kg"].iloc[0], rel=1e-9)
    assert list(east["supply"]) == ["flow-through: 1 kg/s through 100 m3"]
    assert list(west["supply"]) == ["turnover: reactant pool renewed every 1e+06 s"]


def test_sample_names_repeated_across_sites_are_refused(tmp_path):
    (tmp_path / "east.csv").write_text("sample,T [degC],P [bar],pH,Na+ [mmol/kg],Cl- [mmol/kg]\ns,25,1,7,1,1\n")
    (tmp_path / "west.csv").write_text("sample,T [degC],P [bar],pH,Na+ [mmol/kg],Cl- [mmol/kg]\ns,25,1,7,1,1\n")
    with pytest.raises(InputError, match="named in both 'east' and 'west'"):
        load_scenario(_write(tmp_path, SITES))


def test_the_scenario_reference_lists_every_key():
    from redoxgibbs.interfaces.schema import schema_reference

    text = "\n".join(schema_reference())
    for key in ("sites.supply.flux_kg_per_s", "uncertainty.draws", "cells.cell_carbon_g", "mixing.fractions"):
        assert f"`{key}`" in text
