"""Consistency (not an outside check): results must not depend on how the question is written.

A reaction written with another species of the same fast-equilibrating pool (CO2(aq) for HCO3-,
H2S(aq) for HS-, NH3(aq) for NH4+), or a sample whose column names another species of the pool,
must give the same dGr and the same energy density: the species are related by an equilibrium the
speciation honours, and the amount a fluid allows is the pool's total (the project's stated
convention, README "limiting pools").
"""

import numpy as np
import pandas as pd
import pytest

from redoxgibbs.energetics.catalog import NamedReaction, catalog
from redoxgibbs.energetics.insitu import insitu_energetics
from redoxgibbs.reactions.reaction import Reaction
from redoxgibbs.speciation.solver import speciate
from redoxgibbs.species.database import default_database

PARTNERS = {"HCO3-": "CO2(aq)", "CO2(aq)": "HCO3-", "HS-": "H2S(aq)", "H2S(aq)": "HS-",
            "NH4+": "NH3(aq)", "NH3(aq)": "NH4+"}


def _swap(reaction, old, new):
    """The reaction with ``old`` replaced by ``new`` through old = new + w H2O - h H+."""
    db = default_database()
    a, b = db.record(old), db.record(new)
    w = a.elements.get("O", 0) - b.elements.get("O", 0)
    h = b.elements.get("H", 0) + 2 * w - a.elements.get("H", 0)
    assert a.charge == b.charge - h
    coeffs = dict(zip(reaction.species, reaction.coefficients))
    c = coeffs.pop(old)
    for sp, dc in ((new, c), ("H2O(l)", c * w), ("H+", -c * h)):
        coeffs[sp] = coeffs.get(sp, 0.0) + dc
    left = " + ".join(f"{-v:g} {s}" for s, v in coeffs.items() if v < -1e-12)
    right = " + ".join(f"{v:g} {s}" for s, v in coeffs.items() if v > 1e-12)
    return Reaction(f"{left} = {right}")


def _fluid(pH, carbon="HCO3-", sulfide="HS-"):
    return pd.DataFrame({
        "sample": ["alkaline", "neutral", "acid"], "T [degC]": [60.0, 25.0, 90.0], "P [bar]": 50.0,
        "pH": pH, "Na+ [mmol/kg]": 450.0, "Cl- [mmol/kg]": 520.0, "Ca^2+ [mmol/kg]": 10.0,
        "Mg^2+ [mmol/kg]": 20.0, "SO4^2- [mmol/kg]": 15.0, f"{carbon} [mmol/kg]": 2.0,
        f"{sulfide} [umol/kg]": 300.0, "NH4+ [umol/kg]": 40.0, "H2(aq) [umol/kg]": 500.0,
        "CH4(aq) [umol/kg]": 80.0, "O2(aq) [umol/kg]": 5.0, "NO3- [umol/kg]": 10.0,
        "Fe^2+ [umol/kg]": 3.0, "CH3COO- [umol/kg]": 12.0, "HCOO- [umol/kg]": 2.0})


PH = [10.5, 7.0, 4.5]
SWAPPABLE = [(e, s) for e in catalog() for s in e.reaction.species if s in PARTNERS]


@pytest.mark.parametrize("entry,old", SWAPPABLE, ids=lambda x: x if isinstance(x, str) else x.name)
def test_rewriting_with_another_species_of_the_pool_changes_nothing(entry, old):
    result = speciate(_fluid(PH), "bdot")
    other = NamedReaction(entry.name + " (rewritten)", _swap(entry.reaction, old, PARTNERS[old]),
                          entry.electrons)
    e = insitu_energetics(result, [entry, other])
    both = np.isfinite(e.dGr[:, 0])
    assert (both == np.isfinite(e.dGr[:, 1])).all()
    np.testing.assert_allclose(e.dGr[both, 1], e.dGr[both, 0], rtol=1e-7, atol=1e-3)
    np.testing.assert_allclose(e.energy_density_J_per_kg[both, 1], e.energy_density_J_per_kg[both, 0],
                               rtol=1e-7, atol=1e-12)


@pytest.mark.parametrize("carbon,sulfide", [("CO2(aq)", "HS-"), ("HCO3-", "H2S(aq)"),
                                            ("CO2(aq)", "H2S(aq)")])
def test_naming_another_species_of_the_pool_in_the_header_changes_nothing(carbon, sulfide):
    reactions = catalog()
    base = insitu_energetics(speciate(_fluid(PH), "bdot"), reactions)
    other = insitu_energetics(speciate(_fluid(PH, carbon, sulfide), "bdot"), reactions)
    np.testing.assert_allclose(other.dGr, base.dGr, rtol=1e-7, atol=1e-3)
    np.testing.assert_allclose(other.energy_density_J_per_kg, base.energy_density_J_per_kg,
                               rtol=1e-7, atol=1e-12)


def test_methanogenesis_energy_is_limited_by_dissolved_inorganic_carbon():
    # at pH 10.5 almost no carbon is CO2(aq); the reaction still draws on the whole DIC pool
    result = speciate(_fluid(PH), "bdot")
    total_dic = result.totals["HCO3-"][0]
    assert total_dic == pytest.approx(2e-3, rel=1e-9)
    assert result.pool_molality("CO2(aq)")[0] == pytest.approx(total_dic, rel=1e-12)
