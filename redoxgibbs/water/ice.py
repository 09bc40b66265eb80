"""Ice Ih (IAPWS R10-06) and the freezing point of an aqueous solution.

The Gibbs function of ice Ih is the IAPWS "Revised Release on the Equation of State 2006 for
H2O Ice Ih" (R10-06(2009)), whose reference state is that of IAPWS-95 (internal energy and entropy
of the liquid zero at the triple point), so the two can be equated directly. A solution freezes
where ice is in equilibrium with its water:

    g_ice(T, P) = g_liquid(T, P) + (R / M_w) T ln a_w            [J/kg]

solved for T by Newton's method over arrays of states, with g_liquid from IAPWS-95.
"""

import numpy as np

from . import iapws95
from .iapws95 import SUPERCOOLED_LIMIT_K
from .helmholtz import R_SPECIFIC_J_KG_K
from .melting import P_IH_III_PA, P_TRIPLE_PA, T_TRIPLE_K, melting_temperature

__all__ = ["ice_ih_gibbs", "freezing_temperature"]

# IAPWS R10-06(2009), Table 2 (as transcribed in the iapws package, iapws._iapws._Ice)
_P0_PA = 101325.0
_S0 = -0.332733756492168e4                               # J/kg/K (absolute-entropy constant of the release's IAPWS-95 form)
_G0K = np.array([-0.632020233335886e6, 0.655022213658955, -0.189369929326131e-7,
                 0.339746123271053e-14, -0.556464869058991e-21])     # J/kg
_T1 = complex(0.368017112855051e-1, 0.510878114959572e-1)
_T2 = complex(0.337315741065416, 0.335449415919309)
_R1 = complex(0.447050716285388e2, 0.656876847463481e2)             # J/kg/K
_R2K = np.array([complex(-0.725974574329220e2, -0.781008427112870e2),
                 complex(-0.557107698030123e-4, 0.464578634580806e-4),
                 complex(0.234801409215913e-10, -0.285651142904972e-10)])  # J/kg/K


def _term(r, t, tau):
    """r [(t - tau) ln(t - tau) + (t + tau) ln(t + tau) - 2 t ln t - tau^2 / t] (R10-06 eq. 1)."""
    return r * ((t - tau) * np.log(t - tau) + (t + tau) * np.log(t + tau) - 2 * t * np.log(t) - tau**2 / t)


def _term_dtau(r, t, tau):
    return r * (-np.log(t - tau) + np.log(t + tau) - 2 * tau / t)


def ice_ih_gibbs(T_K, P_Pa):
    """Specific Gibbs energy g [J/kg] and entropy s = -dg/dT [J/kg/K] of ice Ih (R10-06 eq. 1).

    g(T, p) = g0(p) - s0 Tt tau + Tt Re{ r1 F(t1, tau) + r2(p) F(t2, tau) }, tau = T/Tt,
    g0 and r2 polynomials in (p - p0)/pt. Valid 0-273.16 K up to 210 MPa (the stable ice Ih range).
    """
    T = np.asarray(T_K, dtype=float)
    pi = (np.asarray(P_Pa, dtype=float) - _P0_PA) / P_TRIPLE_PA
    tau = (T / T_TRIPLE_K).astype(complex)
    g0 = sum(c * pi**k for k, c in enumerate(_G0K))
    r2 = sum(c * pi**k for k, c in enumerate(_R2K))
    g = g0 - _S0 * T_TRIPLE_K * tau.real + T_TRIPLE_K * (_term(_R1, _T1, tau) + _term(r2, _T2, tau)).real
    dg_dT = -_S0 + (_term_dtau(_R1, _T1, tau) + _term_dtau(r2, _T2, tau)).real
    return g, -dg_dT


def _liquid_gibbs(T, P_Pa):
    """IAPWS-95 g [J/kg] and s [J/kg/K] of liquid water (metastable below the melting curve)."""
    rho = iapws95.liquid_density_kg_m3(T, P_Pa)
    g, _, s, _, _, _ = iapws95.specific_properties(T, rho, caloric=True)
    return g, s


def freezing_temperature(P_bar, ln_water_activity, iterations=8):
    """Temperature [K] at which a solution of water activity a_w freezes to ice Ih at P [bar].

    Solves g_ice = g_liquid + (R/M_w) T ln a_w (IAPWS R10-06 ice, IAPWS-95 liquid) from the
    pure-water melting temperature of IAPWS R14-08. a_w is taken as independent of T over the
    depression (stated approximation). At pressures above the ice Ih range (208.566 MPa, where ice
    III and V form) the pure-water melting temperature is returned: an upper bound on the
    solution's freezing point. Below the triple-point pressure the result is NaN, and so it is where
    the freezing point lies below the coldest liquid evaluated (``SUPERCOOLED_LIMIT_K``): such a
    fluid is liquid at every state the engine takes.
    """
    P_Pa = np.asarray(P_bar, dtype=float) * 1e5
    ln_aw = np.asarray(ln_water_activity, dtype=float)
    P_Pa, ln_aw = np.broadcast_arrays(P_Pa, ln_aw)
    T_melt = melting_temperature(P_Pa)
    T = T_melt.copy()
    ih = np.isfinite(T_melt) & (P_Pa <= P_IH_III_PA) & (ln_aw < 0)
    if not ih.any():
        return T
    P, la = P_Pa[ih], ln_aw[ih]
    floor = SUPERCOOLED_LIMIT_K - 5.0
    Tk = T_melt[ih] * (1.0 + R_SPECIFIC_J_KG_K * T_melt[ih] * la / 333.4e3)   # first-order start
    Tk = np.clip(Tk, floor, T_melt[ih])
    for _ in range(iterations):
        g_w, s_w = _liquid_gibbs(Tk, P)
        g_i, s_i = ice_ih_gibbs(Tk, P)
        f = g_w - g_i + R_SPECIFIC_J_KG_K * Tk * la
        Tk = np.clip(Tk - f / (-s_w + s_i + R_SPECIFIC_J_KG_K * la), floor, T_melt[ih])
    # colder than the liquid water evaluated here: the fluid is liquid at every state the engine takes
    T[ih] = np.where(Tk <= floor, np.nan, Tk)
    return T
