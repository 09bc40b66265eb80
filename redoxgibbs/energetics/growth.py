"""Growth, not only maintenance: biomass yield per mole of electron donor and biomass production.

Method: the Gibbs energy dissipated per C-mol of biomass formed, D_s, from the correlation of
Heijnen & van Dijken (1992) Biotechnol. Bioeng. 39, 833 (as restated by Heijnen 1999 and by
Kleerebezem & van Loosdrecht 2010, Crit. Rev. Environ. Sci. Technol. 40, 1; from memory):

- heterotrophic growth on a carbon source with C carbon atoms and degree of reduction gamma per C:
  D_s = 200 + 18 (6 - C)^1.8 + exp{[(3.8 - gamma)^2]^0.16 (3.6 + 0.4 C)}  [kJ per C-mol]
  (glucose, C = 6, gamma = 4: 236; acetate, C = 2, gamma = 4: 432);
- autotrophic growth (CO2 as carbon source): 1000 kJ per C-mol, or 3500 kJ per C-mol where the
  electron donor's couple lies above NAD+/NADH (E0' = -0.32 V, Thauer et al. 1977) so that
  electrons must be pushed uphill (reversed electron transport).

The energy-limited maximum yield is then Y = (-dGr per mol of donor) / D_s [C-mol per mol donor]:
the Gibbs energy of anabolism itself and the donor spent as reductant in anabolism are left out
(stated approximation: a few per cent of D_s for H2-based autotrophs, about 10 % for Fe(II)).
A power P [W/m3] spent on growth alone then makes P / D_s C-mol of biomass per m3 per second.
Carbon source: the reaction's electron donor where it is organic (heterotrophic growth on it),
CO2 otherwise.
"""

import numpy as np

from ..errors import InputError
from .catalog import _oxidation_states

__all__ = [
    "AUTOTROPHIC_DISSIPATION_KJ_PER_CMOL",
    "NO_RET_DONORS",
    "RET_DONORS",
    "biomass_yield_Cmol_per_mol_donor",
    "dissipation_heijnen_1992_kJ_per_Cmol",
    "electron_donor",
    "growth_model",
    "growth_models",
]

#: Heijnen & van Dijken (1992): autotrophic growth without and with reversed electron transport
AUTOTROPHIC_DISSIPATION_KJ_PER_CMOL = {"without reversed electron transport": 1000.0,
                                       "with reversed electron transport": 3500.0}
#: Inorganic donors whose couple lies above NAD+/NADH at pH 7 (Thauer et al. 1977 potentials;
#: common practice): their autotrophs need reversed electron transport
RET_DONORS = ("Fe^2+", "NH4+", "NH3(aq)", "NO2-", "HS-", "H2S(aq)", "sulfur", "S2O3^2-", "SO3^2-", "HSO3-",
              "Mn^2+", "pyrite", "pyrrhotite")
#: ... and those below it, which do not
NO_RET_DONORS = ("H2(aq)", "CO(aq)")


def dissipation_heijnen_1992_kJ_per_Cmol(carbon_atoms, degree_of_reduction):
    """Gibbs energy dissipated per C-mol of biomass in heterotrophic growth [kJ/C-mol] on a carbon
    source of ``carbon_atoms`` C per molecule and ``degree_of_reduction`` per C (Heijnen & van
    Dijken 1992): 200 + 18 (6 - C)^1.8 + exp{[(3.8 - gamma)^2]^0.16 (3.6 + 0.4 C)}, C <= 6."""
    C = np.asarray(carbon_atoms, float)
    g = np.asarray(degree_of_reduction, float)
    return 200.0 + 18.0 * np.maximum(6.0 - C, 0.0) ** 1.8 + np.exp(((3.8 - g) ** 2) ** 0.16 * (3.6 + 0.4 * C))


def electron_donor(reaction):
    """The reactant that gives up electrons: the first with an element found in a product at a
    higher formal oxidation state ('' where none does)."""
    db = reaction.db
    states = {n: _oxidation_states(db.record(n)) for n in reaction.species}
    products = [n for n, c in zip(reaction.species, reaction.coefficients) if c > 0]
    for name, c in zip(reaction.species, reaction.coefficients):
        if c >= 0:
            continue
        for el, (ox, _) in states[name].items():
            if any(el in states[p] and states[p][el][0] > ox + 1e-9 for p in products):
                return name
    return ""


def _degree_of_reduction(record):
    """Degree of reduction per C of a carbon compound (reference: CO2, H2O, NH4+ as in Heijnen)."""
    el = record.elements
    C = el.get("C", 0.0)
    return (4 * C + el.get("H", 0.0) - 2 * el.get("O", 0.0) - 3 * el.get("N", 0.0) - record.charge) / C


def growth_model(reaction):
    """(donor, carbon source description, D_s [kJ/C-mol]) of a reaction's growth (module notes)."""
    donor = electron_donor(reaction)
    if not donor:
        raise InputError(f"reaction {reaction.text!r}: no electron donor found, so no growth yield")
    record = reaction.db.record(donor)
    C = record.elements.get("C", 0.0)
    if C > 0 and _oxidation_states(record)["C"][0] < 4.0:
        if C > 6:
            raise InputError(f"reaction {reaction.text!r}: the correlation of Heijnen & van Dijken (1992) "
                             f"holds for carbon sources of up to 6 C, not {donor}")
        gamma = _degree_of_reduction(record)
        return donor, f"heterotrophic on {donor} (C = {C:g}, gamma = {gamma:g})", float(
            dissipation_heijnen_1992_kJ_per_Cmol(C, gamma))
    if donor in NO_RET_DONORS:
        kind = "without reversed electron transport"
    elif donor in RET_DONORS:
        kind = "with reversed electron transport"
    else:
        raise InputError(f"reaction {reaction.text!r}: donor {donor} is in neither RET_DONORS nor NO_RET_DONORS "
                         "of energetics/growth.py; add it to the list its couple's potential puts it in")
    return donor, f"autotrophic on CO2, {kind}", AUTOTROPHIC_DISSIPATION_KJ_PER_CMOL[kind]


def growth_models(reactions):
    """Per NamedReaction: (donor, growth model text, D_s [kJ/C-mol], donor coefficient); a reaction
    the method cannot place gets NaN and the reason as its text (it does not stop the others)."""
    out = []
    for x in reactions:
        try:
            donor, text, D = growth_model(x.reaction)
        except InputError as err:
            out.append(("", f"no growth model: {err}", np.nan, np.nan))
            continue
        out.append((donor, f"{text}: D_s = {D:.0f} kJ/C-mol (Heijnen & van Dijken 1992)", D,
                    abs(x.reaction.coefficient(donor))))
    return out


def biomass_yield_Cmol_per_mol_donor(dGr_J_per_mol, donor_coefficient, dissipation_kJ_per_Cmol):
    """Energy-limited maximum yield [C-mol biomass per mol of donor]: (-dGr / |nu_donor|) / D_s,
    0 where the reaction releases no energy (arrays broadcast)."""
    dGr = np.asarray(dGr_J_per_mol, float)
    per_donor = np.where(dGr < 0, -dGr / np.abs(donor_coefficient), np.where(np.isnan(dGr), np.nan, 0.0))
    return per_donor / (np.asarray(dissipation_kJ_per_Cmol) * 1e3)
