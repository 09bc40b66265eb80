"""Feasibility asked backwards: the value of one input at which a reaction reaches a target.

Targets: ``minimum_energy`` (dGr = -value [kJ per mol of reaction as written]), ``energy_density``
(value [J per kg of water]) or ``cells`` (the power of a supply model keeps value cells per cm3
alive, at the low per-cell demand of the cell model: the most favourable end of its range). The
input is any sample column (an amount, searched on a log scale, or a temperature or pH, on a
linear one) within a bracket; every sample is solved at once by the Illinois variant of regula
falsi (Dowell & Jarratt 1971, BIT 11, 168), each step one pass of the evaluation pipeline over
the samples still unsolved. A sample whose target lies outside the bracket is reported as
having no solution there (with the values at both ends), never as a number at an end.
"""

from dataclasses import dataclass

import numpy as np
import pandas as pd

from ..errors import InputError
from ..speciation.samples import parse_column_header
from .evaluate import evaluate

__all__ = ["TARGET_KINDS", "Target", "feasibility_map", "solve_input"]

TARGET_KINDS = ("minimum_energy", "energy_density", "cells")
#: Convergence: |metric - target| below this share of the target (or, at a zero target, 1e-9 of
#: its scale), or the bracket narrower than this share of the input
RELATIVE_TOLERANCE = 1e-9
MAX_STEPS = 80
_LINEAR_INPUTS = ("T", "pH", "pH T", "depth", "above seafloor", "P")


@dataclass(frozen=True)
class Target:
    """What the reaction must reach: ``kind`` (one of TARGET_KINDS) and ``value``."""

    kind: str
    value: float

    def __post_init__(self):
        if self.kind not in TARGET_KINDS:
            raise InputError(f"threshold target {self.kind!r} is unknown; use {', '.join(TARGET_KINDS)}")
        if not (np.isfinite(self.value) and self.value > 0):
            raise InputError(f"threshold target {self.kind}: value = {self.value!r} must be a number above 0")

    def describe(self):
        """The target in words, e.g. 'dGr = -10 kJ/mol' (it names the target in every output)."""
        return {"minimum_energy": f"dGr = -{self.value:g} kJ/mol",
                "energy_density": f"energy density = {self.value:g} J/kg",
                "cells": f"power for {self.value:g} cells/cm3"}[self.kind]


def _metric(ev, target):
    """The quantity the target fixes, per sample (one reaction), signed so that it grows with a
    more favourable reaction: -dGr [kJ/mol], energy density [J/kg] or cells per cm3."""
    if target.kind == "minimum_energy":
        return -ev.energetics.dGr[:, 0] / 1e3
    if target.kind == "energy_density":
        return ev.energetics.energy_density_J_per_kg[:, 0]
    if not ev.supplies:
        raise InputError("threshold target 'cells' needs a supply model")
    return ev.power_columns(0)["cells_per_m3_high"] / 1e6     # one reaction: one value per sample


def _on_log_scale(column):
    name, unit = parse_column_header(column)
    return name not in _LINEAR_INPUTS and unit is not None


def solve_input(samples, reaction, column, target, bracket, activity_model="bdot", supply=None, cells=None,
                body=None, db=None):
    """For each sample (a DataFrame of sample rows), the value of ``column`` at which ``reaction``
    (a NamedReaction) reaches ``target``, searched within ``bracket`` = (low, high) in the column's
    units. Returns one row per sample: the value (NaN where there is none), status ('solved', or
    why not), the metric minus the target at both ends of the bracket and the steps taken."""
    frame = samples.reset_index(drop=True)
    low, high = (float(b) for b in bracket)
    log = _on_log_scale(column)
    if not (np.isfinite(low) and np.isfinite(high) and low < high) or (log and low <= 0):
        raise InputError(f"thresholds: bracket [{low:g}, {high:g}] of {column!r} must be [low, high] with "
                         f"low < high{' and low > 0 (an amount)' if log else ''}")
    scale = np.log if log else (lambda v: v)
    unscale = np.exp if log else (lambda v: v)
    n = len(frame)
    supplies = [supply] if supply is not None else []

    def f(rows, u):
        part = frame.iloc[rows].copy()
        part[column] = unscale(u)
        ev = evaluate(part, [reaction], activity_model, supplies, cells, db=db, body=body)
        return _metric(ev, target) - target.value, ev.speciation.failure

    a, b = np.full(n, scale(low)), np.full(n, scale(high))
    fa, why_a = f(np.arange(n), a)
    fb, why_b = f(np.arange(n), b)
    gap_low, gap_high = fa.copy(), fb.copy()     # metric - target at the ends, as evaluated
    status = np.full(n, "", dtype=object)
    broken = ~np.isfinite(fa) | ~np.isfinite(fb)
    status[broken] = [f"no solution: the target is undefined at an end of the bracket ({x or y or 'dGr undefined'})"
                      for x, y in zip(why_a[broken], why_b[broken])]
    outside = ~broken & (np.sign(fa) == np.sign(fb)) & (fa != 0) & (fb != 0)
    status[outside] = f"no solution in [{low:g}, {high:g}]: the target is not crossed"
    value = np.full(n, np.nan)
    value[~broken & (fa == 0)] = unscale(a[~broken & (fa == 0)])
    value[~broken & (fb == 0) & (fa != 0)] = unscale(b[~broken & (fb == 0) & (fa != 0)])
    active = np.flatnonzero((status == "") & np.isnan(value))
    steps = np.zeros(n, dtype=int)
    tol_f = RELATIVE_TOLERANCE * target.value
    side = np.zeros(n, dtype=int)     # which end was kept last (-1 a, +1 b): Illinois halving
    for _ in range(MAX_STEPS):
        if active.size == 0:
            break
        A, B, FA, FB = a[active], b[active], fa[active], fb[active]
        c = (A * FB - B * FA) / (FB - FA)
        c = np.where(np.isfinite(c) & (c > np.minimum(A, B)) & (c < np.maximum(A, B)), c, 0.5 * (A + B))
        fc, why = f(active, c)
        steps[active] += 1
        lost = ~np.isfinite(fc)
        status[active[lost]] = [f"no solution: the pipeline failed inside the bracket ({w or 'dGr undefined'})"
                                for w in why[lost]]
        same_as_a = np.sign(fc) == np.sign(FA)
        a[active] = np.where(same_as_a, c, A)
        fa[active] = np.where(same_as_a, fc, np.where(side[active] == 1, 0.5 * FA, FA))
        b[active] = np.where(same_as_a, B, c)
        fb[active] = np.where(same_as_a, np.where(side[active] == -1, 0.5 * FB, FB), fc)
        side[active] = np.where(same_as_a, -1, 1)
        done = ~lost & ((np.abs(fc) <= tol_f) | (np.abs(b[active] - a[active]) <= RELATIVE_TOLERANCE * (1 + np.abs(c))))
        value[active[done]] = unscale(c[done])
        active = active[~done & ~lost]
    status[active] = f"no solution: not converged in {MAX_STEPS} steps"
    status[(status == "") & np.isfinite(value)] = "solved"
    return pd.DataFrame({"sample": frame["sample"].astype(str), "reaction": reaction.name, "target": target.describe(),
                         column: value, "status": status, "gap_at_low": gap_low, "gap_at_high": gap_high,
                         "steps": steps})


def feasibility_map(base, reaction, column, target, bracket, axes, activity_model="bdot", supply=None, cells=None,
                    body=None, db=None):
    """The threshold of ``column`` (see :func:`solve_input`) over the grid of two other inputs
    ``axes`` = {column_x: values, column_y: values}, for the fluid ``base`` (a sample row as a
    dict): an xarray Dataset with dimensions named after the two axes."""
    import xarray as xr

    if len(axes) != 2:
        raise InputError(f"feasibility map: give exactly two axes, not {len(axes)}")
    (cx, vx), (cy, vy) = axes.items()
    if column in axes:
        raise InputError(f"feasibility map: {column!r} is the solved input; it cannot also be an axis")
    X, Y = np.meshgrid(np.asarray(vx, float), np.asarray(vy, float), indexing="ij")
    frame = pd.DataFrame([base] * X.size)
    frame[cx], frame[cy] = X.ravel(), Y.ravel()
    frame["sample"] = [f"{base.get('sample', 'map')} [{i}]" for i in range(X.size)]
    solved = solve_input(frame, reaction, column, target, bracket, activity_model, supply, cells, body, db)
    dims = [parse_column_header(c)[0] for c in (cx, cy)]
    return xr.Dataset(
        {"threshold": ((dims[0], dims[1]), solved[column].to_numpy().reshape(X.shape)),
         "status": ((dims[0], dims[1]), solved["status"].to_numpy().reshape(X.shape).astype(str))},
        coords={dims[0]: np.asarray(vx, float), dims[1]: np.asarray(vy, float)},
        attrs={"input": column, "reaction": reaction.name, "target": target.describe(),
               "axes": f"{cx}; {cy}", "bracket": f"[{bracket[0]:g}, {bracket[1]:g}]",
               "log_scale": int(_on_log_scale(column))})
