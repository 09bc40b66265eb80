"""Standard-state properties of liquid water as a reaction participant (pure water, activity 1).

The IAPWS-95 properties (cantera's reference: H = enthalpy of formation and S third-law at
298.15 K, 1 bar) are shifted to the apparent properties of formation of the aqueous data:
G(T,P) = G_f + [g(T,P) - g(Tr,Pr)] + [s(Tr,Pr) - S_ref] (T - Tr), H(T,P) = H_f + [h(T,P) - h(Tr,Pr)],
S(T,P) = S_ref + [s(T,P) - s(Tr,Pr)] (Helgeson & Kirkham 1974; Benson-Helgeson convention). The
(T - Tr) term carries the tabulated S_ref into G so that dG/dT = -S holds exactly.
"""

import functools

from ..constants import P_REF_BAR, T_REF_K
from ..water.iapws95 import M_WATER_KG_PER_MOL, water_state

__all__ = ["apparent_water_properties"]


@functools.lru_cache(maxsize=1)
def _reference_state():
    ref = water_state(T_REF_K, P_REF_BAR)
    return float(ref.G_J_mol), float(ref.H_J_mol), float(ref.S_J_mol_K)


def apparent_water_properties(water, G_f, H_f, S_ref):
    """G, H [J/mol], S, Cp [J/mol/K] and V [cm3/mol] of H2O(l) from a WaterState."""
    g_r, h_r, s_r = _reference_state()
    G = G_f + water.G_J_mol - g_r + (s_r - S_ref) * (water.T_K - T_REF_K)
    H = H_f + water.H_J_mol - h_r
    S = S_ref + water.S_J_mol_K - s_r
    return G, H, S, water.Cp_J_mol_K, M_WATER_KG_PER_MOL / water.density_kg_m3 * 1e6
