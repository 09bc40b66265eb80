"""Consistency checks run on every species record when the data are loaded.

Each check returns messages naming the species, the check and the size of the disagreement.
Tolerances and their reasons:

- G_f = H_f - 298.15 K (S - sum of element entropies): 0.4 kJ/mol. The tables round G, H and S
  separately and were built on element entropies that differ from the JANAF set used here by up
  to about 0.2 J/mol/K per atom (0.06 kJ/mol per atom at 25 C); a typing error is usually larger.
- HKF Cp and V at 25 C recomputed from the parameters: 1 J/mol/K + Tr |omega| dX and
  0.5 cm3/mol + |omega| dQ, with dX = 1e-8 K^-2 and dQ = 7.5e-8 bar^-1. The parameters were
  regressed with reference Born functions (Helgeson & Kirkham 1974: X_r = -3.09e-7, Q_r = 5.90e-7)
  that differ from the Johnson & Norton (1991) ones used here (X_r = -3.06e-7, Q_r = 6.64e-7), so
  the recomputed values may differ by omega times that difference (about 3.5 J/mol/K and 1 cm3/mol
  for SO4^2-) on top of the rounding of the tables.
- Gases: the 25 C H, S and Cp of the record against cantera's NASA polynomials: 0.5 kJ/mol,
  0.5 J/mol/K and 1.0 J/mol/K (the compilations' own spread: for NH3 the NBS and JANAF Cp differ
  by 0.6 J/mol/K).
"""

import numpy as np

from ..constants import T_REF_K
from ..standard_state.gas import nasa7_cp_h_s, nasa7_coefficients
from ..standard_state.hkf_states import hkf_parameters, hkf_properties
from ..units import CAL_TO_J
from ..water.iapws95 import water_state
from .elements import formation_entropy_offset

__all__ = ["check_database", "gibbs_helmholtz_residual_J"]

TOL_GHS_J = 400.0
BORN_X_SPREAD = 1e-8     # K^-2, spread of reference X between Born-function sets
BORN_Q_SPREAD = 7.5e-8   # bar^-1, spread of reference Q


def gibbs_helmholtz_residual_J(record):
    """G_f - [H_f - Tr (S - sum S_elements)] of a record with its tabulated H_f [J/mol]."""
    offset = formation_entropy_offset(record.elements, record.charge)
    H_f = record.params.get("H_f_tabulated_J", record.H_f)
    return record.G_f - (H_f - T_REF_K * (record.S - offset))


def _check_ghs(rec):
    if rec.model == "formation" and not rec.params["tabulated_own_values"]:
        return []  # G, H and S were derived from logK and dH_r: consistent by construction
    residual = gibbs_helmholtz_residual_J(rec)
    if abs(residual) > TOL_GHS_J:
        return [f"{rec.name}: G_f, H_f and S disagree by {residual / 1000:.3f} kJ/mol through the "
                f"element entropies (tolerance {TOL_GHS_J / 1000} kJ/mol)"]
    return []


def _check_hkf_25C(records):
    """Cp and V at 25 C, 1 bar recomputed from each record's HKF parameters (the engine's kernels)
    against the values its source tabulates."""
    T, P = np.array([T_REF_K]), np.array([1.0])
    params = hkf_parameters([r.params["linear_cal"] for r in records], [r.params["omega_ref_cal"] for r in records],
                            [float(r.charge) for r in records])
    _, _, _, Cp, V = hkf_properties(params, water_state(T, P), T, P, ("Cp", "V"))
    out = []
    for j, rec in enumerate(records):
        omega_J = abs(rec.params["omega_ref_cal"]) * CAL_TO_J
        tol_cp = 1.0 + T_REF_K * omega_J * BORN_X_SPREAD
        tol_v = 0.5 + omega_J * BORN_Q_SPREAD * 10.0  # J/bar -> cm3
        cp_tab, v_tab = rec.params["Cp_tab_J"], rec.params["V_tab_cm3"]
        if cp_tab is not None and abs(Cp[0, j] - cp_tab) > tol_cp:
            out.append(f"{rec.name}: Cp at 25 C from the HKF parameters is {Cp[0, j]:.2f} J/mol/K, "
                       f"the table says {cp_tab:.2f} (tolerance {tol_cp:.2f})")
        if v_tab is not None and abs(V[0, j] - v_tab) > tol_v:
            out.append(f"{rec.name}: V at 25 C from the HKF parameters is {V[0, j]:.2f} cm3/mol, "
                       f"the table says {v_tab:.2f} (tolerance {tol_v:.2f})")
    return out


def _check_gas(rec):
    cp, h, s = nasa7_cp_h_s(nasa7_coefficients(rec.params["nasa_name"]), np.array(T_REF_K))
    out = []
    for label, mine, theirs, tol in (("H_f", rec.H_f, h, 500.0), ("S", rec.S, s, 0.5),
                                     ("Cp", rec.params["Cp_tab_J"], cp, 1.0)):
        if abs(mine - theirs) > tol:
            out.append(f"{rec.name}: {label} at 25 C is {mine:.3f}, the NASA polynomials give "
                       f"{float(theirs):.3f} (tolerance {tol})")
    return out


def check_database(db):
    """All consistency problems of the records in ``db`` (an empty list when all pass)."""
    problems = []
    records = [db.record(n) for n in db.names]
    for rec in records:
        if rec.charge != round(rec.charge):
            problems.append(f"{rec.name}: charge must be a whole number")
        try:
            problems.extend(_check_ghs(rec))
        except Exception as err:  # unknown element: name it
            problems.append(f"{rec.name}: {err}")
        if rec.model == "nasa7":
            problems.extend(_check_gas(rec))
    hkf = [r for r in records if r.model == "hkf"]
    if hkf:
        problems.extend(_check_hkf_25C(hkf))
    return problems
