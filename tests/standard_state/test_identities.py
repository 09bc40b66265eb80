"""Thermodynamic identities at random states (hypothesis) and a plain transcription of HKF.

These check internal consistency: the standard-state equations are derivatives of one another.
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from redoxgibbs.reactions.reaction import reaction_properties
from redoxgibbs.species.properties import standard_properties

R = 8.314462618
REACTIONS = ["CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)", "HS- + 2 O2(aq) = SO4^2- + H+",
             "H2O(l) = H+ + OH-", "Fe^2+ + 0.25 O2(aq) + H+ = Fe^3+ + 0.5 H2O(l)",
             "calcite + H+ = Ca^2+ + HCO3-", "NH4+ + 1.5 O2(aq) = NO2- + 2 H+ + H2O(l)"]
SPECIES = ["Na+", "Cl-", "SO4^2-", "HCO3-", "CO2(aq)", "CH4(aq)", "OH-", "H2O(l)", "Mg^2+", "HS-"]

def _liquid_like(state):
    """Not refused as gas-like (supercritical water below the critical density)."""
    from redoxgibbs.errors import OutOfValidityError
    from redoxgibbs.water.iapws95 import water_state

    try:
        water_state(*state, caloric=False)
        return True
    except OutOfValidityError:
        return False


states = st.tuples(st.floats(280.0, 870.0), st.floats(600.0, 4900.0)).filter(_liquid_like)


@settings(max_examples=25, deadline=None)
@given(states, st.sampled_from(REACTIONS))
def test_gibbs_enthalpy_entropy(state, reaction):
    T, P = state
    p = reaction_properties(reaction, T, P, T_unit="K")
    assert p.dG0 == pytest.approx(p.dH0 - T * p.dS0, rel=1e-9, abs=1e-6)


@settings(max_examples=25, deadline=None)
@given(states)
def test_temperature_and_pressure_derivatives(state):
    # dG/dT = -S, dG/dP = V, dH/dT = Cp, by central differences on the species (the water
    # expansivity derivative is itself a finite difference, hence 1e-4 on Cp)
    T, P = state
    hT, hP = 0.01, 0.05
    Ts = np.array([T - hT, T, T + hT, T, T])
    Ps = np.array([P, P, P, P - hP, P + hP])
    sp = standard_properties(SPECIES, Ts, Ps)
    S, V, Cp = sp.S[1], sp.V[1], sp.Cp[1]
    dGdT = (sp.G[2] - sp.G[0]) / (2 * hT)
    dGdP = (sp.G[4] - sp.G[3]) / (2 * hP) * 10.0  # J/bar -> cm3
    dHdT = (sp.H[2] - sp.H[0]) / (2 * hT)
    np.testing.assert_allclose(dGdT, -S, rtol=1e-6, atol=1e-4)
    np.testing.assert_allclose(dGdP, V, rtol=1e-5, atol=1e-4)
    np.testing.assert_allclose(dHdT, Cp, rtol=1e-4, atol=2e-2)


@settings(max_examples=15, deadline=None)
@given(states, st.sampled_from(REACTIONS))
def test_logk_and_doubling(state, reaction):
    T, P = state
    p = reaction_properties(reaction, T, P, T_unit="K")
    lhs, rhs = reaction.split("=")
    doubled = reaction_properties(
        " + ".join(f"2 {t.strip()}" if not t.strip()[0].isdigit() else
                   f"{2 * float(t.split()[0]):g} {t.split(None, 1)[1]}" for t in lhs.split(" + "))
        + " = " +
        " + ".join(f"2 {t.strip()}" if not t.strip()[0].isdigit() else
                   f"{2 * float(t.split()[0]):g} {t.split(None, 1)[1]}" for t in rhs.split(" + ")),
        T, P, T_unit="K")
    assert p.logK == pytest.approx(-p.dG0 / (R * T * np.log(10)), rel=1e-10)
    assert doubled.dG0 == pytest.approx(2 * p.dG0, rel=1e-10)
    assert doubled.logK == pytest.approx(2 * p.logK, rel=1e-10)


def _hkf_gibbs_plain(T, P, p, omega, Z, Z_r, Y_r):
    """Straight transcription of Shock et al. (1992) eq. (B10) for one species, in cal."""
    Tr, Pr, Th, Psi = 298.15, 1.0, 228.0, 2600.0
    Gf, Hf, Sr, a1, a2, a3, a4, c1, c2, w_r = p
    return (Gf - Sr * (T - Tr) - c1 * (T * np.log(T / Tr) - T + Tr) + a1 * (P - Pr)
            + a2 * np.log((Psi + P) / (Psi + Pr))
            - c2 * ((1 / (T - Th) - 1 / (Tr - Th)) * ((Th - T) / Th)
                    - T / Th**2 * np.log(Tr * (T - Th) / (T * (Tr - Th))))
            + (1 / (T - Th)) * (a3 * (P - Pr) + a4 * np.log((Psi + P) / (Psi + Pr)))
            - omega * (Z + 1) + w_r * (Z_r + 1) + w_r * Y_r * (T - Tr))


def test_matrix_form_matches_plain_transcription(db):
    # the (states x 9) @ (9 x species) form against the equation as printed, for a neutral species
    from redoxgibbs.water.born import born_functions
    from redoxgibbs.water.dielectric import dielectric_along_TP
    from redoxgibbs.water.iapws95 import water_state

    T = np.linspace(280.0, 900.0, 12)
    P = np.linspace(300.0, 4000.0, 12)
    rec = db.record("CO2(aq)")
    Z = born_functions(dielectric_along_TP(water_state(T, P))).Z
    ref = born_functions(dielectric_along_TP(water_state(298.15, 1.0)))
    params = list(rec.params["linear_cal"]) + [rec.params["omega_ref_cal"]]
    plain = _hkf_gibbs_plain(T, P, params, rec.params["omega_ref_cal"], Z, float(ref.Z), float(ref.Y))
    fast = standard_properties(["CO2(aq)"], T, P).G[:, 0] / 4.184
    np.testing.assert_allclose(fast, plain, rtol=1e-12)
