"""The IAPWS-95 Helmholtz function of water and its derivatives, vectorized over states.

phi(delta, tau) = phi0 + phir with delta = rho / rho_c and tau = T_c / T (Wagner & Pruss 2002,
J. Phys. Chem. Ref. Data 31, 387, eqs. 6.5 and 6.6; IAPWS R6-95(2018) Tables 4-5 for the
derivatives). The coefficients are the release's Tables 1 and 2 as distributed with the ``iapws``
package (read from it, not retyped here). Evaluation is over arrays of states, in blocks that fit
the processor's cache; no per-state Python loop.
"""

import functools
from dataclasses import dataclass

import numpy as np

__all__ = ["Derivatives", "residual", "ideal", "R_SPECIFIC_J_KG_K", "RHO_C", "T_C"]

T_C = 647.096               # K
RHO_C = 322.0               # kg/m3
R_SPECIFIC_J_KG_K = 461.51805
_BLOCK = 16384              # states per block


@dataclass
class Derivatives:
    """phi and its first and second derivatives in delta (d) and tau (t); arrays of one shape."""

    phi: np.ndarray
    d: np.ndarray
    dd: np.ndarray
    t: np.ndarray
    tt: np.ndarray
    dt: np.ndarray


@functools.lru_cache(maxsize=1)
def _coefficients():
    from iapws.iapws95 import IAPWS95

    c = {k: np.asarray(v, dtype=float) for k, v in IAPWS95._constants.items() if isinstance(v, list)}
    # polynomial (7) and exponential (44) terms share one form: n delta^d tau^t exp(-delta^c),
    # with c = 0 (and exp(-delta^c) taken as 1) for the polynomial terms
    n = np.concatenate([c["nr1"], c["nr2"]])
    d = np.concatenate([c["d1"], c["d2"]])
    t = np.concatenate([c["t1"], c["t2"]])
    cc = np.concatenate([np.zeros(7), c["c2"]])
    # ln A = d ln delta + t ln tau - delta^c: one matrix product with the columns
    # (ln delta, ln tau, -delta^c for each distinct c > 0); sums over terms with a factor delta^c
    # or delta^2c are taken per distinct c (columns of the weight matrix), so that the only
    # (states x terms) work is one exponential and two matrix products
    powers = np.unique(cc[cc > 0])
    onehot = (cc[None, :] == powers[:, None]).astype(float)
    c["c_powers"] = powers
    c["exponents"] = np.vstack([d, t, onehot])
    w_plain = [n, n * d, n * d * (d - 1), n * t, n * t * (t - 1), n * t * d]
    w_dc = [w * g for g in onehot for w in (n * cc, n * cc * (2 * d - 1) + n * cc**2, n * t * cc)]
    w_dc2 = [n * cc**2 * g for g in onehot]
    c["weights"] = np.stack(w_plain + w_dc + w_dc2, axis=1)
    c["bell_exponents"] = np.stack([c["d3"], c["t3"]])
    for shared in ("A", "B", "a4", "beta4"):       # the two non-analytic terms share these
        assert np.all(c[shared] == c[shared][0]), shared
    c["ideal"] = IAPWS95.Fi0
    return c


def _blocks(n):
    return [slice(i, min(i + _BLOCK, n)) for i in range(0, n, _BLOCK)]


def residual(delta, tau, second_tau=True):
    """phir and derivatives (Wagner & Pruss 2002, eq. 6.6 and Table 6.5) at 1-D arrays.

    Without ``second_tau`` only phir, phir_d and phir_dd are filled (what a density search needs);
    the tau derivatives are left zero.
    """
    delta = np.asarray(delta, float)
    tau = np.asarray(tau, float)
    out = Derivatives(*(np.zeros(delta.shape) for _ in range(6)))
    for b in _blocks(delta.size):
        _residual_block(delta[b], tau[b], out, b, second_tau)
    return out


def _residual_block(delta, tau, out, b, second_tau):
    c = _coefficients()
    d_, t_ = delta[:, None], tau[:, None]
    # terms 1-51: A = delta^d tau^t exp(-delta^c), (states x 51); with k = d - c delta^c,
    #   delta phir_d = sum n A k,  delta^2 phir_dd = sum n A (k (k - 1) - c^2 delta^c),
    #   tau phir_t = sum n A t,    tau^2 phir_tt = sum n A t (t - 1),  delta tau phir_dt = sum n A t k
    dc = d_ ** c["c_powers"]                                   # (states x distinct c)
    A = np.column_stack([np.log(delta), np.log(tau), -dc]) @ c["exponents"]
    np.exp(A, out=A)
    Y = A @ c["weights"]
    g = dc.shape[1]
    with_dc = (Y[:, 6:6 + 3 * g].reshape(-1, g, 3) * dc[:, :, None]).sum(1)
    with_dc2 = (Y[:, 6 + 3 * g:] * dc**2).sum(1)
    out.phi[b] = Y[:, 0]
    out.d[b] = (Y[:, 1] - with_dc[:, 0]) / delta
    out.dd[b] = (Y[:, 2] - with_dc[:, 1] + with_dc2) / delta**2
    if second_tau:
        out.t[b] = Y[:, 3] / tau
        out.tt[b] = Y[:, 4] / tau**2
        out.dt[b] = (Y[:, 5] - with_dc[:, 2]) / (delta * tau)
    # terms 52-54: Gaussian bell terms n delta^d tau^t exp(-alpha (delta - eps)^2 - beta (tau - gamma)^2)
    ddel, dtau = d_ - c["epsilon3"], t_ - c["gamma3"]
    bell = np.exp(np.column_stack([np.log(delta), np.log(tau)]) @ c["bell_exponents"]
                  - c["alfa3"] * ddel**2 - c["beta3"] * dtau**2)
    gd = c["d3"] / d_ - 2 * c["alfa3"] * ddel
    n3 = c["nr3"]
    out.phi[b] += bell @ n3
    out.d[b] += (bell * gd) @ n3
    out.dd[b] += (bell * (gd**2 - c["d3"] / d_**2 - 2 * c["alfa3"])) @ n3
    if second_tau:
        gt = c["t3"] / t_ - 2 * c["beta3"] * dtau
        out.t[b] += (bell * gt) @ n3
        out.tt[b] += (bell * (gt**2 - c["t3"] / t_**2 - 2 * c["beta3"])) @ n3
        out.dt[b] += (bell * gd * gt) @ n3
    _nonanalytic(delta, tau, c, out, b, second_tau)


def _nonanalytic(delta, tau, c, out, b, second_tau):
    """Terms 55-56, n Delta^b delta psi (R6-95 Table 5), which shape the critical region.

    The two terms share A, B, a and beta (a check on load), so theta, Delta and their delta
    derivatives are computed once per state; only b, C, D and n differ.
    """
    n, bb, C, D = c["nr4"], c["b4"], c["C"], c["D"]
    A, B, a, beta = c["A"][0], c["B"][0], c["a4"][0], c["beta4"][0]
    dm1 = delta - 1.0
    sq = np.maximum(dm1**2, 1e-300)                      # (delta - 1)^2, kept off zero
    ln_sq = np.log(sq)
    s_beta = np.exp(ln_sq / (2 * beta))                  # sq^(1 / (2 beta))
    s_a = np.exp(a * ln_sq)                              # sq^a
    theta = (1.0 - tau) + A * s_beta
    Delta = np.maximum(theta**2 + B * s_a, 1e-300)
    Delta_d = dm1 * (A * theta * 2 / beta * s_beta / sq + 2 * B * a * s_a / sq)
    Delta_dd = Delta_d / np.where(dm1 == 0, 1e-300, dm1) + sq * (
        4 * B * a * (a - 1) * s_a / sq**2 + 2 * A**2 / beta**2 * (s_beta / sq) ** 2
        + A * theta * 4 / beta * (1 / (2 * beta) - 1) * s_beta / sq**2)
    d_, dm1_, th_, De_, De_d = (x[:, None] for x in (delta, dm1, theta, Delta, Delta_d))
    psi = np.exp(-C * dm1_**2 - D * (tau[:, None] - 1.0) ** 2)
    psi_d, psi_dd = -2 * C * dm1_ * psi, (2 * C * dm1_**2 - 1) * 2 * C * psi
    Db = np.exp(bb * np.log(De_))                        # Delta^b, (states x 2)
    Db1 = Db / De_                                       # Delta^(b - 1)
    Db_d = bb * Db1 * De_d
    Db_dd = bb * (Db1 * Delta_dd[:, None] + (bb - 1) * Db1 / De_ * De_d**2)
    out.phi[b] += (Db * d_ * psi) @ n
    out.d[b] += (Db * (psi + d_ * psi_d) + Db_d * d_ * psi) @ n
    out.dd[b] += (Db * (2 * psi_d + d_ * psi_dd) + 2 * Db_d * (psi + d_ * psi_d) + Db_dd * d_ * psi) @ n
    if second_tau:
        tm1 = tau[:, None] - 1.0
        psi_t, psi_tt = -2 * D * tm1 * psi, (2 * D * tm1**2 - 1) * 2 * D * psi
        psi_dt = 4 * C * D * dm1_ * tm1 * psi
        Db_t = -2 * th_ * bb * Db1
        Db_tt = 2 * bb * Db1 + 4 * th_**2 * bb * (bb - 1) * Db1 / De_
        Db_dt = (-A * bb * 2 / beta * Db1 * dm1_ * (s_beta / sq)[:, None]
                 - 2 * th_ * bb * (bb - 1) * Db1 / De_ * De_d)
        out.t[b] += (d_ * (Db_t * psi + Db * psi_t)) @ n
        out.tt[b] += (d_ * (Db_tt * psi + 2 * Db_t * psi_t + Db * psi_tt)) @ n
        out.dt[b] += (Db * (psi_t + d_ * psi_dt) + d_ * Db_d * psi_t + Db_t * (psi + d_ * psi_d)
                      + Db_dt * d_ * psi) @ n


def ideal(delta, tau):
    """phi0 and derivatives (Wagner & Pruss 2002, eq. 6.5; R6-95 Table 4) at 1-D arrays."""
    f = _coefficients()["ideal"]
    n1, n2 = f["ao_pow"]
    n3 = f["ao_log"][1]
    n, g = np.asarray(f["ao_exp"]), np.asarray(f["titao"])
    delta = np.asarray(delta, float)
    tau = np.asarray(tau, float)
    e = np.exp(-g * tau[:, None])
    zero = np.zeros(delta.shape)
    return Derivatives(
        phi=np.log(delta) + n1 + n2 * tau + n3 * np.log(tau) + (n * np.log1p(-e)).sum(1),
        d=1.0 / delta, dd=-1.0 / delta**2,
        t=n2 + n3 / tau + (n * g * (1.0 / (1.0 - e) - 1.0)).sum(1),
        tt=-n3 / tau**2 - (n * g**2 * e / (1.0 - e) ** 2).sum(1),
        dt=zero)
