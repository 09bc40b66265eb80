"""The report's figures: built as matplotlib Figure objects (so that tests can inspect them), each
with a caption that says what is plotted, in which units and under which supply model.

One style per reaction in every figure: the Okabe & Ito (2008) colour-blind-safe palette of eight
colours (common practice), combined with a marker (and a line style) for the ninth reaction on,
so that every reaction keeps one look across the figures. Legends sit outside the plotting area.
"""

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt
import numpy as np
from matplotlib.colors import TwoSlopeNorm

__all__ = [
    "MAX_FIGURE_SAMPLES",
    "energy_density_figure",
    "feasibility_figure",
    "figure_problems",
    "gibbs_figure",
    "heat_map_figure",
    "mixing_figure",
    "power_figure",
    "profile_figure",
    "reaction_styles",
]

#: Okabe & Ito (2008) "Color Universal Design" palette (common practice for colour-blind readers)
OKABE_ITO = ("#E69F00", "#56B4E9", "#009E73", "#F0E442", "#0072B2", "#D55E00", "#CC79A7", "#000000")
MARKERS = ("o", "s", "^", "D", "v", "P", "X", "*")
LINES = ("-", "--", ":", "-.")
#: Samples drawn per figure: beyond this the figures show the first ones (their captions say so);
#: the tables and CSV files always hold every sample.
MAX_FIGURE_SAMPLES = 24
NOT_MEASURED = "#bdbdbd"


def reaction_styles(reactions):
    """{reaction name: matplotlib keyword arguments} (colour, marker, line style), fixed by the
    reaction's place in the scenario's list so that it is the same in every figure."""
    styles = {}
    for k, name in enumerate(dict.fromkeys(reactions)):
        group = k // len(OKABE_ITO)
        styles[name] = {"color": OKABE_ITO[k % len(OKABE_ITO)], "marker": MARKERS[group % len(MARKERS)],
                        "linestyle": LINES[group % len(LINES)]}
    return styles


def _legend_outside(fig, ax, title=None):
    """The axes' legend placed right of the plotting area (never over the data)."""
    handles, labels = ax.get_legend_handles_labels()
    if handles:
        fig.legend(handles, labels, loc="outside right upper", fontsize=7, title=title, title_fontsize=7,
                   frameon=False)


def _height(n_rows):
    return max(3.2, 0.28 * n_rows + 1.6)


def _samples_shown(first):
    labels = list(dict.fromkeys(first["label"]))
    shown = labels[:MAX_FIGURE_SAMPLES]
    note = (f" The first {MAX_FIGURE_SAMPLES} of {len(labels)} samples are drawn; the tables and results.csv "
            "hold all." if len(labels) > MAX_FIGURE_SAMPLES else "")
    return shown, note


def _dot_plot(first, column, styles, xlabel, title, log=False):
    """Samples down the y axis, one marker per reaction (its style) along x."""
    labels, note = _samples_shown(first)
    fig, ax = plt.subplots(figsize=(11, _height(len(labels))), layout="constrained")
    y = {lab: i for i, lab in enumerate(labels)}
    for name, style in styles.items():
        rows = first[(first["reaction"] == name) & first["label"].isin(labels)]
        x = rows[column].to_numpy(dtype=float)
        keep = np.isfinite(x) & ((x > 0) if log else True)
        ax.scatter(x[keep], [y[v] for v in rows["label"].to_numpy()[keep]], s=28, label=name,
                   color=style["color"], marker=style["marker"], edgecolors="k", linewidths=0.3)
    if log:
        ax.set_xscale("log")
    else:
        ax.axvline(0, color="k", lw=0.8)
    ax.set_yticks(range(len(labels)), labels, fontsize=7)
    ax.set_ylim(len(labels) - 0.5, -0.5)
    ax.grid(axis="x", color="#dddddd", lw=0.5)
    ax.set_xlabel(xlabel)
    ax.set_title(title, fontsize=10)
    _legend_outside(fig, ax, "reaction")
    return fig, note


def gibbs_figure(first, styles):
    """dGr per electron [kJ/mol e-] per sample and reaction: (Figure, caption)."""
    fig, note = _dot_plot(first, "dGr_kJ_per_mol_e", styles, "dGr [kJ per mol e-]",
                          "In-situ Gibbs energy per electron transferred")
    return fig, ("In-situ Gibbs energy of each reaction per mole of electrons transferred [kJ/mol e-], per "
                 "sample; left of the line the reaction releases energy. A reaction whose species were not all "
                 "measured has no marker." + note)


def energy_density_figure(first, styles):
    """Energy density [J per kg of water] per sample and reaction, log scale: (Figure, caption)."""
    fig, note = _dot_plot(first, "energy_density_J_per_kg", styles, "energy density [J per kg H2O]",
                          "Energy available per kilogram of fluid", log=True)
    return fig, ("Energy density [J per kg of water]: -dGr times the amount of reaction the limiting pool "
                 "allows (log scale; reactions that release no energy are not drawn)." + note)


def heat_map_figure(first, styles):
    """Reactions x samples of dGr per electron; not-measured cells grey and hatched; the colour scale
    spans the 2nd-98th percentile of |dGr| so that one extreme value does not wash out the rest."""
    labels, note = _samples_shown(first)
    reactions = list(styles)
    pivot = first.pivot_table(index="reaction", columns="label", values="dGr_kJ_per_mol_e",
                              aggfunc="first").reindex(index=reactions, columns=labels)
    data = pivot.to_numpy(dtype=float)
    finite = np.abs(data[np.isfinite(data)])
    lim = float(np.percentile(finite, 98)) if finite.size else 1.0
    lim = lim if lim > 0 else 1.0
    fig, ax = plt.subplots(figsize=(max(6.0, 0.45 * len(labels) + 5.0), _height(len(reactions))),
                           layout="constrained")
    ax.add_patch(plt.Rectangle((-0.5, -0.5), len(labels), len(reactions), facecolor=NOT_MEASURED,
                               hatch="///", edgecolor="white", lw=0, zorder=0))
    im = ax.imshow(np.ma.masked_invalid(data), aspect="auto", cmap="RdBu",
                   norm=TwoSlopeNorm(vcenter=0.0, vmin=-lim, vmax=lim), zorder=1)
    ax.set_yticks(range(len(reactions)), reactions, fontsize=7)
    ax.set_xticks(range(len(labels)), labels, rotation=90, fontsize=7)
    fig.colorbar(im, ax=ax, label="dGr [kJ per mol e-]", extend="both")
    ax.set_title("Reactions x samples", fontsize=10)
    return fig, ("dGr per electron [kJ/mol e-] of every reaction in every sample: blue releases energy, red "
                 "needs it, white is near zero; grey hatched cells: a species of the reaction was not "
                 f"measured. The colour scale spans +-{lim:.3g} kJ/mol e- (98th percentile of |dGr|); "
                 "beyond it cells take the end colour." + note)


def power_figure(first, styles, units, supplies_by_site):
    """Power and the cells it sustains (high end), per sample and reaction, under each site's first
    supply model (named in the caption)."""
    labels, note = _samples_shown(first)
    fig, axes = plt.subplots(1, 2, figsize=(13, _height(len(labels))), layout="constrained", sharey=True)
    y = {lab: i for i, lab in enumerate(labels)}
    for name, style in styles.items():
        rows = first[(first["reaction"] == name) & first["label"].isin(labels)]
        for ax, column in zip(axes, (units.volume_column, "cells_per_m3_high")):
            x = rows[column].to_numpy(dtype=float)
            keep = np.isfinite(x) & (x > 0)
            ax.scatter(x[keep], [y[v] for v in rows["label"].to_numpy()[keep]], s=26, label=name,
                       color=style["color"], marker=style["marker"], edgecolors="k", linewidths=0.3)
    for ax in axes:
        ax.set_xscale("log")
        ax.grid(axis="x", color="#dddddd", lw=0.5)
    axes[0].set_yticks(range(len(labels)), labels, fontsize=7)
    axes[0].set_ylim(len(labels) - 0.5, -0.5)
    axes[0].set_xlabel(f"power [{units.per_volume}]")
    axes[1].set_xlabel("cells per m3 it could sustain (high end)")
    axes[0].set_title("Power delivered by the supply", fontsize=10)
    axes[1].set_title("Cells it could sustain", fontsize=10)
    _legend_outside(fig, axes[0], "reaction")
    models = "; ".join(f"{site}: {supply}" for site, supply in supplies_by_site.items())
    return fig, (f"Power [{units.per_volume}] of each reaction under each site's first supply model ({models}), "
                 "and the number of cells per m3 it could keep alive at the low per-cell demand of the cell "
                 "model (the high end of the range in results.csv)." + note)


def mixing_figure(frame, styles=None):
    """Energy along the mixing path, per kg of mixed fluid and per kg of hydrothermal fluid."""
    styles = styles or reaction_styles(frame["reaction"])
    fig, axes = plt.subplots(1, 2, figsize=(13, 5), layout="constrained", sharex=True)
    for name, group in frame.groupby("reaction", sort=False):
        g = group.sort_values("T_C")
        style = styles.get(name, {"color": "grey", "marker": "o", "linestyle": "-"})
        for ax, column in zip(axes, ("energy_J_per_kg_mixed_fluid", "energy_J_per_kg_hydrothermal_fluid")):
            ax.plot(g["T_C"], g[column].where(g[column] > 0), ms=3, label=name, **style)
    for ax in axes:
        ax.set_yscale("log")
        ax.set_xlabel("mixture temperature [degC]")
        ax.grid(color="#eeeeee", lw=0.5)
    axes[0].set_ylabel("energy [J per kg of mixed fluid]")
    axes[1].set_ylabel("energy [J per kg of hydrothermal fluid]")
    axes[0].set_title("Per kg of mixed fluid", fontsize=10)
    axes[1].set_title("Per kg of hydrothermal fluid", fontsize=10)
    _legend_outside(fig, axes[0], "reaction")
    return fig, ("Energy along the mixing path of the hydrothermal fluid into the cold end-member, against the "
                 "mixture's temperature: per kg of mixed fluid (left) and per kg of the hydrothermal fluid "
                 "that made it (right); reactions that release no energy are not drawn.")


def profile_figure(frame, sample, body, styles=None):
    """dGr per electron against depth in a body's ocean, one curve per reaction (depth downward)."""
    styles = styles or reaction_styles(frame["reaction"])
    fig, ax = plt.subplots(figsize=(11, 5.5), layout="constrained")
    for name, group in frame.groupby("reaction", sort=False):
        ax.plot(group["dGr_kJ_per_mol_e"], group["depth_km"], ms=3, label=name,
                **styles.get(name, {"color": "grey", "marker": "o", "linestyle": "-"}))
    ax.axvline(0, color="k", lw=0.8)
    ax.invert_yaxis()
    ax.set_xlabel("dGr [kJ per mol e-]")
    ax.set_ylabel("depth below the ice-ocean interface [km]")
    ax.set_title(f"Energetics against depth in the ocean of {body}", fontsize=10)
    _legend_outside(fig, ax, "reaction")
    return fig, (f"dGr per electron [kJ/mol e-] of the fluid of {sample} placed at depths from the ice-ocean "
                 f"interface to the seafloor of {body} (pressure from the ocean column, same composition).")


def feasibility_figure(ds):
    """Contours of the solved input (log10 for amounts) over the map's two axes; points without a
    solution are left blank and said so."""
    (x, y), values = list(ds["threshold"].dims), ds["threshold"].values
    positive = np.isfinite(values) & (values > 0)
    log = bool(ds.attrs["log_scale"]) and positive.any()
    z = np.where(positive, np.log10(np.where(positive, values, 1.0)), np.nan) if log else values
    fig, ax = plt.subplots(figsize=(8, 5.5), layout="constrained")
    if np.isfinite(z).sum() >= 4 and min(z.shape) >= 2:
        cs = ax.contourf(ds[x].values, ds[y].values, z.T, levels=12, cmap="viridis")
        fig.colorbar(cs, ax=ax, label=("log10 " if log else "") + ds.attrs["input"])
    missing = int((~np.isfinite(values)).sum())
    ax.set_xlabel(ds.attrs["axes"].split("; ")[0])
    ax.set_ylabel(ds.attrs["axes"].split("; ")[1])
    ax.set_title(f"{ds.attrs['input']} needed by {ds.attrs['reaction']}", fontsize=10)
    return fig, (f"{ds.attrs['input']} at which {ds.attrs['reaction']} reaches {ds.attrs['target']} "
                 f"({'log10 scale; ' if log else ''}searched within {ds.attrs['bracket']}). "
                 + (f"{missing} points have no solution there and are left blank." if missing else
                    "Every point has a solution."))


def figure_problems(fig):
    """What is wrong with a figure's layout: legends over a plotting area, tick labels of one axis
    overlapping each other, text outside the figure (a list of descriptions, empty when none)."""
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    problems = []
    plot_axes = [ax for ax in fig.axes if ax.get_label() != "<colorbar>"]
    legends = list(fig.legends) + [ax.get_legend() for ax in plot_axes if ax.get_legend() is not None]
    for legend in legends:
        box = legend.get_window_extent(renderer)
        for ax in plot_axes:
            if box.overlaps(ax.get_window_extent(renderer)):
                problems.append(f"legend over the plotting area of {ax.get_title() or 'an axes'!r}")
        if box.x1 > fig.bbox.x1 + 1 or box.y0 < fig.bbox.y0 - 1:
            problems.append("legend outside the figure")
    for ax in plot_axes:
        for axis, name in ((ax.xaxis, "x"), (ax.yaxis, "y")):
            boxes = [t.get_window_extent(renderer) for t in axis.get_ticklabels() if t.get_visible() and t.get_text()]
            for a, b in zip(boxes, boxes[1:]):
                if a.overlaps(b):
                    problems.append(f"{name} tick labels overlap in {ax.get_title() or 'an axes'!r}")
                    break
    return problems
