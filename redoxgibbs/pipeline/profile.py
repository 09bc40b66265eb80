"""Energetics against depth in a body's ocean: one sample's fluid placed at depths of the column.

The fluid keeps its composition and pH; its temperature is the one given (or, where the sample's
temperature is its freezing point, the freezing point at each depth); pressure comes from the body's
ocean column. Everything else is the one evaluation path (:func:`~redoxgibbs.pipeline.evaluate.evaluate`).
"""

import numpy as np
import pandas as pd

from ..speciation.samples import OCEAN_POSITION_COLUMNS, parse_column_header
from .evaluate import evaluate

__all__ = ["depth_profile"]


def depth_profile(sample, body, reactions, activity_model="bdot", points=21, db=None):
    """Energetics of the fluid of ``sample`` (a sample-table row as a dict) at ``points`` depths
    from the ice-ocean interface to the seafloor of ``body``; one row per depth x reaction."""
    row = {k: v for k, v in sample.items()
           if parse_column_header(k)[0].lower() not in OCEAN_POSITION_COLUMNS and k != "site"}
    t_col = next(k for k in row if parse_column_header(k)[0] == "T")
    t = row[t_col]
    if t is None or (isinstance(t, float) and np.isnan(t)):
        row[t_col] = "freezing"
    depths = np.linspace(0.0, body.ocean_depth_km, points)
    frame = pd.DataFrame([row] * points)
    frame["sample"] = [f"{sample['sample']} at {d:.4g} km" for d in depths]
    frame["depth [km]"] = depths
    ev = evaluate(frame, reactions, activity_model, db=db, body=body)
    out = ev.energetics.to_frame()
    out.insert(1, "depth_km", np.repeat(depths, len(reactions)))
    return out
