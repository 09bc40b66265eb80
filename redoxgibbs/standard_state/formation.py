"""Species defined by a formation reaction from other species, extrapolated with van 't Hoff.

With constant reaction enthalpy (reaction Cp = 0, reaction V = 0):
dG_r(T) = dH_r - T dS_r, dS_r = (dH_r - dG_r(Tr)) / Tr  (the integrated van 't Hoff equation),
and the species' property is the reaction's minus its parents' (stoichiometric sum).
Isocoulombic reactions make the constant-enthalpy assumption good to high temperature
(Gu, Gammons & Bloom 1994, Geochim. Cosmochim. Acta 58, 3545).
"""

from ..constants import T_REF_K

__all__ = ["vant_hoff_reaction_gibbs", "vant_hoff_reaction_entropy"]


def vant_hoff_reaction_entropy(dG_r_ref, dH_r):
    """Reaction entropy [J/mol/K] from dG_r and dH_r at 25 C [J/mol]."""
    return (dH_r - dG_r_ref) / T_REF_K


def vant_hoff_reaction_gibbs(dG_r_ref, dH_r, T):
    """Reaction Gibbs energy [J/mol] at T [K] with constant dH_r and dS_r."""
    return dH_r - T * vant_hoff_reaction_entropy(dG_r_ref, dH_r)
