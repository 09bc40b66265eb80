"""Bad input ends in one of the project's errors naming the field, the value and the fix; one bad
sample is reported in its own row while the others are computed (regression tests of the issue
"One evaluation path for every command; nothing silent, nothing lost")."""

import io
from contextlib import redirect_stderr, redirect_stdout

import numpy as np
import pandas as pd
import pytest

from redoxgibbs.errors import InputError
from redoxgibbs.interfaces.cli import main
from redoxgibbs.speciation.samples import read_samples

GOOD = ("sample,T [degC],P [bar],pH,Na+ [mmol/kg],Cl- [mmol/kg],HCO3- [mmol/kg],H2(aq) [umol/kg],"
        "O2(aq) [umol/kg]\n")


def _csv(tmp_path, text, name="s.csv", mode="w"):
    path = tmp_path / name
    if mode == "wb":
        path.write_bytes(text)
    else:
        path.write_text(text)
    return path


@pytest.mark.parametrize("text,message", [
    (GOOD.replace("Cl- [mmol/kg]", "Na+ [mmol/kg]") + "a,25,1,7,10,10,2,1,1\n", "given twice"),
    (GOOD.replace("Cl- [mmol/kg]", "Cl- [mmol/kg") + "a,25,1,7,10,10,2,1,1\n", "cannot read the header"),
    (GOOD.replace("Cl- [mmol/kg]", "Cl-") + "a,25,1,7,10,10,2,1,1\n", "give the amount's unit"),
    (GOOD + "a,25,1,7,10,10,2,1,1\na,30,1,7,10,10,2,1,1\n", "used twice"),
    (GOOD + ",25,1,7,10,10,2,1,1\n", "blank"),
    (GOOD + "a,25,1,7,inf,10,2,1,1\n", "not a finite"),
    (GOOD + "a,25,1,7,1e30,10,2,1,1\n", "more than any fluid dissolves"),
    (GOOD + "a,inf,1,7,10,10,2,1,1\n", "not a finite"),
    ("", "is empty"),
])
def test_sample_tables_are_refused_by_cell_row_or_column(tmp_path, text, message):
    with pytest.raises(InputError, match=message):
        read_samples(_csv(tmp_path, text))


def test_file_problems_get_one_clear_line(tmp_path):
    with pytest.raises(InputError, match="does not exist"):
        read_samples(tmp_path / "missing.csv")
    with pytest.raises(InputError, match="is a folder"):
        read_samples(tmp_path)
    with pytest.raises(InputError, match="not UTF-8"):
        read_samples(_csv(tmp_path, GOOD.encode() + "a\xff,25,1,7,1,1,1,1,1\n".encode("latin-1"), mode="wb"))


def _run(argv):
    out, err = io.StringIO(), io.StringIO()
    with redirect_stdout(out), redirect_stderr(err):
        code = main(argv)
    return code, out.getvalue(), err.getvalue()


def test_one_frozen_sample_does_not_stop_the_others(tmp_path):
    path = _csv(tmp_path, GOOD + "warm,25,1,7,10,10,2,1,100\nfrozen,-5,1,7,10,10,2,1,100\n")
    code, out, err = _run(["insitu", str(path), "--reaction", "aerobic hydrogen oxidation", "--format", "csv"])
    assert code == 1 and "1 of 2 samples could not be computed" in err and "frozen" in err
    frame = pd.read_csv(io.StringIO(out), keep_default_na=False)
    assert frame.loc[frame["sample"] == "warm", "dGr_kJ_per_mol"].astype(float).lt(0).all()
    assert frame.loc[frame["sample"] == "frozen", "failure"].str.startswith("frozen").all()
    code, out, err = _run(["speciation", str(path), "--format", "csv"])
    frame = pd.read_csv(io.StringIO(out), keep_default_na=False)
    assert code == 1 and frame.loc[frame["sample"] == "frozen", "failure"].str.startswith("frozen").all()


def test_ionic_strength_beyond_the_model_is_flagged_in_every_table(tmp_path):
    path = _csv(tmp_path, GOOD + "brine,25,1,7,2500,2500,2,1,100\n")
    code, out, _ = _run(["speciation", str(path), "--format", "csv", "--activity-model", "davies"])
    assert code == 0 and (pd.read_csv(io.StringIO(out))["flags"] == "ionic_strength_beyond_davies_range").all()
    code, out, _ = _run(["insitu", str(path), "--reaction", "aerobic hydrogen oxidation", "--format", "csv",
                         "--activity-model", "davies"])
    assert "ionic_strength_beyond_davies_range" in pd.read_csv(io.StringIO(out))["flags"].iloc[0]


def test_mixing_to_the_seawater_temperature_itself(tmp_path):
    path = _csv(tmp_path, GOOD + "vent,300,250,4,400,450,5,1000,0\nsea,2,250,7.8,460,540,2.3,0.4,200\n")
    code, out, err = _run(["mix", str(path), "--hydrothermal", "vent", "--seawater", "sea", "--temperatures",
                           "2,10", "--reaction", "aerobic hydrogen oxidation", "--format", "csv"])
    assert code == 0, err
    frame = pd.read_csv(io.StringIO(out))
    assert frame["hydrothermal_fraction"].iloc[0] == pytest.approx(0.0, abs=1e-12)
    code, _, err = _run(["mix", str(path), "--hydrothermal", "vents", "--seawater", "sea", "--temperatures",
                         "10", "--reaction", "aerobic hydrogen oxidation"])
    assert code == 2 and "no sample called 'vents'" in err


def test_an_output_folder_that_cannot_be_written(tmp_path):
    blocker = tmp_path / "a_file"
    blocker.write_text("not a folder")
    code, _, err = _run(["demo", "--quiet", "--out", str(blocker / "out")])
    assert code == 2 and "cannot use" in err and "choose another path" in err


def test_supply_and_cell_models_refuse_impossible_values_through_the_api():
    from redoxgibbs.energetics.catalog import catalog
    from redoxgibbs.energetics.power import CellRequirement, Supply, power_per_cell_W
    from redoxgibbs.pipeline.evaluate import evaluate

    frame = pd.DataFrame({"sample": ["a"], "T [degC]": [25.0], "P [bar]": [1.0], "pH": [7.0],
                          "H2(aq) [umol/kg]": [10.0], "O2(aq) [umol/kg]": [100.0]})
    reactions = [x for x in catalog() if x.name == "aerobic hydrogen oxidation"]
    for bad in (Supply("flow-through", flux_kg_per_s=-1.0, volume_m3=1.0),
                Supply("flow-through", flux_kg_per_s=1.0, volume_m3=0.0), Supply("turnover", tau_s=0.0)):
        with pytest.raises(InputError, match="must be a finite number above 0"):
            evaluate(frame, reactions, "bdot", [bad])
    with pytest.raises(InputError, match="low <= high"):
        power_per_cell_W(CellRequirement("tijhuis1993", (1e-13, 1e-14)), np.array([298.15]))
