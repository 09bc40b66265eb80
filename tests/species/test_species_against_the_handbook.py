"""Every aqueous ion the CRC Handbook tabulates, against the Handbook at 25 C, 1 bar.

CRC Handbook of Chemistry and Physics, "Thermodynamic properties of aqueous ions" (the NBS values,
Wagman et al. 1982), as distributed in the data files of the chemicals 1.5.2 package: (G_f, H_f
[kJ/mol], S [J/mol/K]). Left out: the iron ions (the Handbook's are the pre-revision NBS values,
see DEVELOPERS.md, "One basis for iron"), and the rows this project copied from this same table
(formate, acetate, nitrite, Mn^2+, F-: comparing them would compare the table with itself).
"""

import pytest

from redoxgibbs.species.database import default_database

CRC_IONS = {
    "Na+": (-261.9, -240.1, 59.0), "K+": (-283.3, -252.4, 102.5), "Cl-": (-131.2, -167.2, 56.5),
    "Mg^2+": (-454.8, -466.9, -138.1), "Ca^2+": (-553.6, -542.8, -53.1), "OH-": (-157.2, -230.0, -10.8),
    "HCO3-": (-586.8, -692.0, 91.2), "CO3^2-": (-527.8, -677.1, -56.9), "SO4^2-": (-744.5, -909.3, 20.1),
    "HSO4-": (-755.9, -887.3, 131.8), "NH4+": (-79.3, -132.5, 113.4), "NO3-": (-111.3, -207.4, 146.4),
    "S2O3^2-": (-522.5, -652.3, 67.0), "SO3^2-": (-486.5, -635.5, -29.0), "HSO3-": (-527.7, -626.2, 139.7),
}


# The HKF data take these entropies from the CODATA key values (Cox, Wagman & Medvedev 1989;
# memory), 3-7 J/mol/K from the NBS ones: a known departure, shown, not hidden by the tolerance.
# In log K2 of carbonic acid the HCO3- and CO3^2- differences cancel (0.3 J/mol/K in the reaction).
CODATA_ENTROPIES = ("Ca^2+", "HCO3-", "CO3^2-", "HSO4-")


@pytest.mark.parametrize("name", sorted(CRC_IONS))
def test_ion_gibbs_energies_against_the_crc_handbook(name):
    # 1.0 kJ/mol: the HKF data adopt partly revised 25 C values (up to 0.85 kJ/mol from the NBS
    # tables for Mg^2+, Ca^2+ and K+), and the Handbook rounds to 0.1 kJ/mol
    assert default_database().record(name).G_f / 1e3 == pytest.approx(CRC_IONS[name][0], abs=1.0)


@pytest.mark.parametrize("name", [pytest.param(n, marks=pytest.mark.xfail(
    strict=True, reason="known departure: CODATA entropy in the HKF data")) if n in CODATA_ENTROPIES else n
    for n in sorted(CRC_IONS)])
def test_ion_entropies_and_enthalpies_against_the_crc_handbook(name):
    rec = default_database().record(name)
    _, H, S = CRC_IONS[name]
    # 2.5 J/mol/K and 1.5 kJ/mol: the spread between compilations for these ions; H follows from G
    # and S here (DEVELOPERS.md, "Consistency of G, H and S")
    assert rec.S == pytest.approx(S, abs=2.5)
    assert rec.H_f / 1e3 == pytest.approx(H, abs=1.5)
