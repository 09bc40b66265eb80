"""Outputs of ``assess``: results and rankings as CSV, plots as PNG and SVG, report.html and .md."""

import html
import io
from pathlib import Path

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt
import numpy as np
import pandas as pd

from ..species.ledger import verification_ledger
from ..sweeps.runner import write_netcdf

__all__ = ["SCREENING_NOTE", "mixing_figure", "profile_figure", "write_outputs"]

SCREENING_NOTE = ("These are screening estimates of thermodynamic potential, not evidence of life "
                  "or of rates. Field sampling near hot fluids follows local rules and trained practice.")


def _save(fig, out, stem):
    fig.tight_layout()
    fig.savefig(out / f"{stem}.png", dpi=110)
    buf = io.StringIO()
    fig.savefig(buf, format="svg")
    (out / f"{stem}.svg").write_text(buf.getvalue())
    plt.close(fig)
    return buf.getvalue()


def _label(frame):
    return frame["site"] + " / " + frame["sample"]


def _pivot(first, value, reactions, labels):
    return first.pivot_table(index="reaction", columns="label", values=value,
                             aggfunc="first").reindex(index=reactions, columns=labels)


def _log_bars(ax, table, reactions, labels, xlabel):
    """Grouped horizontal bars on a log axis, one group per reaction, one bar per sample."""
    width = 0.8 / max(len(labels), 1)
    for j, lab in enumerate(labels):
        ax.barh(np.arange(len(reactions)) + j * width, table[lab].where(table[lab] > 0),
                height=width, label=lab)
    ax.set_xscale("log")
    ax.set_yticks(np.arange(len(reactions)) + 0.4 - width / 2, reactions, fontsize=7)
    ax.invert_yaxis()
    ax.set_xlabel(xlabel)


#: Samples drawn per figure: beyond this the figures show the first ones (their captions say so);
#: the tables and CSV files always hold every sample.
MAX_FIGURE_SAMPLES = 24


def _plots(first, out, units):
    """The four figures; ``first`` holds one row per sample x reaction (first supply)."""
    svgs = {}
    first = first.assign(label=_label(first))
    reactions = list(dict.fromkeys(first["reaction"]))
    labels = list(dict.fromkeys(first["label"]))[:MAX_FIGURE_SAMPLES]
    first = first[first["label"].isin(labels)]
    pivot = _pivot(first, "dGr_kJ_per_mol_e", reactions, labels)
    height = max(3.0, 0.22 * len(reactions) + 1.5)
    fig, ax = plt.subplots(figsize=(9, height))
    for lab in labels:
        ax.scatter(pivot[lab], np.arange(len(reactions)), s=18, label=lab)
    ax.axvline(0, color="k", lw=0.8)
    ax.set_yticks(np.arange(len(reactions)), reactions, fontsize=7)
    ax.invert_yaxis()
    ax.set_xlabel("dGr [kJ per mol e-]")
    ax.set_title("In-situ Gibbs energy per electron")
    ax.legend(fontsize=7, loc="lower left")
    svgs["gibbs_per_electron"] = _save(fig, out, "gibbs_per_electron")

    fig, ax = plt.subplots(figsize=(9, height))
    _log_bars(ax, _pivot(first, "energy_density_J_per_kg", reactions, labels), reactions, labels,
              "energy density [J per kg H2O]")
    ax.set_title("Energy available per kilogram of fluid")
    ax.legend(fontsize=7)
    svgs["energy_density"] = _save(fig, out, "energy_density")

    fig, ax = plt.subplots(figsize=(max(5, 1.2 * len(labels) + 4), height))
    data = pivot.to_numpy(dtype=float)
    lim = np.nanmax(np.abs(data)) if np.isfinite(data).any() else 1.0
    im = ax.imshow(data, aspect="auto", cmap="RdBu", vmin=-lim, vmax=lim)
    ax.set_yticks(np.arange(len(reactions)), reactions, fontsize=7)
    ax.set_xticks(np.arange(len(labels)), labels, rotation=30, ha="right", fontsize=7)
    fig.colorbar(im, ax=ax, label="dGr [kJ per mol e-]")
    ax.set_title("Reactions x samples (blank: a species not measured)")
    svgs["heat_map"] = _save(fig, out, "heat_map")

    fig, axes = plt.subplots(1, 2, figsize=(11, height))
    _log_bars(axes[0], _pivot(first, units.volume_column, reactions, labels), reactions, labels,
              f"power [{units.per_volume}]")
    _log_bars(axes[1], _pivot(first, "cells_per_m3_high", reactions, labels), reactions, labels,
              "cells per m3 (high end)")
    axes[0].set_title("Power delivered by the supply")
    axes[1].set_title("Cells it could sustain")
    axes[0].legend(fontsize=7)
    svgs["power_and_cells"] = _save(fig, out, "power_and_cells")
    return svgs


def mixing_figure(frame, path=None):
    """Energy per kg of mixed fluid against mixing temperature, one curve per reaction.

    Writes ``path`` when given; returns the figure's SVG text.
    """
    fig, ax = plt.subplots(figsize=(8, 5))
    for name, group in frame.groupby("reaction", sort=False):
        g = group.sort_values("T_C")
        ax.plot(g["T_C"], g["energy_J_per_kg_mixed_fluid"].where(g["energy_J_per_kg_mixed_fluid"] > 0),
                marker="o", ms=3, label=name)
    ax.set_yscale("log")
    ax.set_xlabel("mixture temperature [degC]")
    ax.set_ylabel("energy [J per kg of mixed fluid]")
    ax.set_title("Energy along the mixing path")
    ax.legend(fontsize=7)
    fig.tight_layout()
    if path is not None:
        fig.savefig(path, dpi=110)
    buf = io.StringIO()
    fig.savefig(buf, format="svg")
    plt.close(fig)
    return buf.getvalue()


def profile_figure(frame, sample, body, path=None):
    """dGr per electron against depth in a body's ocean, one curve per reaction (depth downward).

    Writes ``path`` when given; returns the figure's SVG text.
    """
    fig, ax = plt.subplots(figsize=(10, 5.5))
    colours = plt.get_cmap("tab20").colors
    for k, (name, group) in enumerate(frame.groupby("reaction", sort=False)):
        ax.plot(group["dGr_kJ_per_mol_e"], group["depth_km"], marker="o", ms=3, label=name,
                color=colours[k % len(colours)])
    ax.axvline(0, color="k", lw=0.8)
    ax.invert_yaxis()
    ax.set_xlabel("dGr [kJ per mol e-]")
    ax.set_ylabel("depth below the ice-ocean interface [km]")
    ax.set_title(f"Energetics against depth in the ocean of {body}\n(fluid of {sample})", fontsize=10)
    ax.legend(fontsize=7, loc="upper left", bbox_to_anchor=(1.02, 1.0))
    fig.tight_layout()
    if path is not None:
        fig.savefig(path, dpi=110)
    buf = io.StringIO()
    fig.savefig(buf, format="svg")
    plt.close(fig)
    return buf.getvalue()


def feasibility_figure(ds, path=None):
    """Contours of the solved input (log10 for amounts) over the map's two axes; points without a
    solution are left blank and said so in the title. Returns the figure's SVG text."""
    (x, y), values = list(ds["threshold"].dims), ds["threshold"].values
    positive = np.isfinite(values) & (values > 0)
    log = bool(ds.attrs["log_scale"]) and positive.any()
    z = np.where(positive, np.log10(np.where(positive, values, 1.0)), np.nan) if log else values
    fig, ax = plt.subplots(figsize=(8, 5.5))
    if np.isfinite(z).sum() >= 4 and min(z.shape) >= 2:
        cs = ax.contourf(ds[x].values, ds[y].values, z.T, levels=12, cmap="viridis")
        fig.colorbar(cs, ax=ax, label=("log10 " if log else "") + ds.attrs["input"])
    missing = int((~np.isfinite(values)).sum())
    ax.set_xlabel(ds.attrs["axes"].split("; ")[0])
    ax.set_ylabel(ds.attrs["axes"].split("; ")[1])
    ax.set_title(f"{ds.attrs['input']} at which {ds.attrs['reaction']} reaches {ds.attrs['target']}"
                 + (f"\n({missing} points without a solution in {ds.attrs['bracket']}: blank)" if missing else ""),
                 fontsize=9)
    fig.tight_layout()
    if path is not None:
        fig.savefig(path, dpi=110)
    buf = io.StringIO()
    fig.savefig(buf, format="svg")
    plt.close(fig)
    return buf.getvalue()


def _rankings(first, out, units):
    valid = first[first["exergonic"]]
    by_site = valid.sort_values(["site", "sample", "energy_density_J_per_kg"], ascending=[True, True, False])
    by_site = by_site.assign(rank=by_site.groupby(["site", "sample"]).cumcount() + 1)
    cols = ["site", "sample", "rank", "reaction", "dGr_kJ_per_mol", "dGr_kJ_per_mol_e",
            "energy_density_J_per_kg", units.volume_column]
    by_site[cols].to_csv(out / "ranking_reactions_per_site.csv", index=False)
    by_rxn = valid.sort_values(["reaction", "energy_density_J_per_kg"], ascending=[True, False])
    by_rxn = by_rxn.assign(rank=by_rxn.groupby("reaction").cumcount() + 1)
    by_rxn[["reaction", "rank", "site", "sample", "energy_density_J_per_kg", "dGr_kJ_per_mol_e"]].to_csv(
        out / "ranking_sites_per_reaction.csv", index=False)
    return by_site[cols]


def _sources(assessment):
    """The verification ledger of the species this assessment used."""
    used = sorted({s for x in assessment.scenario.reactions for s in x.reaction.species}
                  | set(assessment.speciation.species))
    ledger = verification_ledger(used)
    ledger["entered_from_memory"] = np.where(ledger["entered_from_memory"], "yes", "")
    ledger["checked_to_T_C"] = ledger["checked_to_T_C"].map(lambda t: "none yet" if np.isnan(t) else f"{t:g}")
    return ledger.rename(columns={"entered_from_memory": "entered from memory",
                                  "checked_at_25C": "checked at 25 C",
                                  "checked_to_T_C": "checked to T [C]", "outside_checks": "outside checks"})


#: Rows shown per table in report.html and report.md; every row is in the CSV files beside them.
MAX_TABLE_ROWS = 60


def _more_rows(frame, max_rows):
    return (f"First {max_rows} of {len(frame)} rows; every row is in results.csv and the ranking files."
            if len(frame) > max_rows else "")


def _table_html(frame, max_rows=MAX_TABLE_ROWS):
    note = _more_rows(frame, max_rows)
    return frame.head(max_rows).to_html(index=False, float_format=lambda v: f"{v:.4g}", border=0,
                                        classes="data", na_rep="") + (f"<p>{note}</p>" if note else "")


def _table_md(frame, max_rows=MAX_TABLE_ROWS, **kw):
    note = _more_rows(frame, max_rows)
    return frame.head(max_rows).to_markdown(index=False, **kw) + (f"\n\n{note}" if note else "")


ENVELOPE_NOTE = ("Screening criteria, not evidence of life: each sample's value against a published limit "
                 "(habitability.csv gives every value, limit and source; a criterion without data is 'not "
                 "assessed', never 'pass'). Nutrient thresholds are this project's screening defaults.")


def _envelope_summary(envelope):
    """One row per sample, one column per criterion, the verdicts (the values are in habitability.csv)."""
    if envelope is None:
        return pd.DataFrame()
    wide = envelope.pivot_table(index=["site", "sample"], columns="criterion", values="verdict", aggfunc="first",
                                sort=False)
    return wide[list(dict.fromkeys(envelope["criterion"]))].reset_index()


def _thresholds_html(assessment):
    if assessment.thresholds is None:
        return ""
    spec = assessment.scenario.raw["thresholds"]
    what = "over the feasibility map's grid (figure below; feasibility_map.nc)" if assessment.feasibility is not None \
        else "per sample"
    return (f"<h2>Thresholds</h2><p>The value of {html.escape(spec['input'])} at which "
            f"{html.escape(spec['reaction'])} reaches the target, {what}; 'no solution' where the target is not "
            f"crossed within [{spec['bracket'][0]:g}, {spec['bracket'][1]:g}].</p>"
            + _table_html(assessment.thresholds))


def _solid_reactions(reactions):
    """'reaction (solid, ...)' for each reaction that takes a solid as reactant or product."""
    items = []
    for x in reactions:
        solids = [s for s in x.reaction.species if x.reaction.db.record(s).state == "solid"]
        if solids:
            items.append(f"{x.name} ({', '.join(solids)})")
    return "; ".join(items)


def write_outputs(assessment, out_dir):
    """Write every output of an assessment into ``out_dir``; returns the path of report.html."""
    out = Path(out_dir)
    out.mkdir(parents=True, exist_ok=True)
    results = assessment.results
    results.to_csv(out / "results.csv", index=False)
    if assessment.dataset is not None:
        write_netcdf(assessment.dataset, out / "results.nc")
    # each site's first supply model (results are site by site, each site's models in order)
    first = results.drop_duplicates(subset=["sample", "reaction"], keep="first")
    units = assessment.scenario.power_units
    ranking = _rankings(first, out, units)
    svgs = _plots(first, out, units)
    if assessment.mixing is not None:
        assessment.mixing.to_csv(out / "mixing.csv", index=False)
        svgs["mixing_path"] = mixing_figure(assessment.mixing, out / "mixing_path.png")
        (out / "mixing_path.svg").write_text(svgs["mixing_path"])
    if assessment.profile is not None:
        assessment.profile.to_csv(out / "depth_profile.csv", index=False)
        svgs["depth_profile"] = profile_figure(assessment.profile, assessment.profile_sample,
                                               assessment.scenario.body.name, out / "depth_profile.png")
        (out / "depth_profile.svg").write_text(svgs["depth_profile"])
    if assessment.envelope is not None:
        assessment.envelope.to_csv(out / "habitability.csv", index=False)
    if assessment.thresholds is not None:
        assessment.thresholds.to_csv(out / "thresholds.csv", index=False)
    if assessment.feasibility is not None:
        write_netcdf(assessment.feasibility, out / "feasibility_map.nc")
        svgs["feasibility_map"] = feasibility_figure(assessment.feasibility, out / "feasibility_map.png")
        (out / "feasibility_map.svg").write_text(svgs["feasibility_map"])
    envelope = _envelope_summary(assessment.envelope)
    sc = assessment.scenario
    summary = assessment.speciation.summary_frame()
    summary.insert(0, "site", sc.samples["site"].to_numpy())
    flagged = first[(first["flags"] != "") | (first["missing_species"] != "") | first["below_minimum_energy"]
                    | (first["failure"] != "")]
    flag_columns = ["site", "sample", "reaction", "dGr_kJ_per_mol", "below_minimum_energy", "missing_species",
                    "flags", "failure"]
    sources = _sources(assessment)
    assumptions = [
        f"Activity model: {assessment.speciation.activity_model} (samples beyond its ionic-strength "
        f"range are flagged in the speciation table).",
        "Standard states: aqueous 1 molal ideal (revised HKF or formation reactions), gases 1 bar "
        "ideal, solids and water pure phases; water from IAPWS-95.",
        "Redox couples are not equilibrated with each other; pH measured at another temperature is "
        "carried to in-situ conditions at constant totals and charge balance.",
        "Energy density: -dGr times the amount of reaction allowed by the limiting dissolved "
        "reactant, whose amount is the total of its pool (dissolved inorganic carbon for CO2(aq), "
        "HCO3- or CO3^2-; total sulfide for H2S(aq) or HS-; total ammonia; each component's "
        "total), whichever species the reaction or the sample columns name; zero where not "
        "exergonic.",
        "Solids are in excess (never limiting): " + (_solid_reactions(sc.reactions) or "no reaction "
                                                      "here uses a solid") + ".",
        f"Minimum usable energy: {sc.minimum_energy_kJ:g} kJ per mol of reaction (Hoehler 2004).",
        "Supply models, per site (the figures and rankings show each site's first): " + "; ".join(
            f"{site.name}: {', '.join(x.describe() for x in site.supplies) or 'none given'}" for site in sc.sites) + ".",
        "Per-cell requirement, per site: " + "; ".join(f"{site.name}: {site.cells.describe()}" for site in sc.sites)
        + "; cell numbers are given as a low-high range.",
    ]
    n_samples = first["sample"].nunique()
    shown = (f" (the first {MAX_FIGURE_SAMPLES} of {n_samples} samples; the tables and results.csv hold all)"
             if n_samples > MAX_FIGURE_SAMPLES else "")
    figure_html = "\n".join(f'<figure><div class="plot">{svg[svg.find("<svg"):]}</div>'
                            f"<figcaption>{html.escape(k.replace('_', ' ') + (shown if k not in ('mixing_path', 'depth_profile', 'feasibility_map') else ''))}"
                            "</figcaption></figure>"
                            for k, svg in svgs.items())
    page = f"""<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>{html.escape(sc.title)}</title>
<style>
body {{ font-family: sans-serif; margin: 2em; max-width: 1200px; }}
table.data {{ border-collapse: collapse; font-size: 12px; margin: 1em 0; }}
table.data td, table.data th {{ border-bottom: 1px solid #ccc; padding: 2px 6px; text-align: right; }}
.caution {{ background: #fff4d6; border-left: 4px solid #e0a800; padding: 0.6em 1em; }}
figure {{ margin: 1.5em 0; }} .plot svg {{ max-width: 100%; height: auto; }}
</style></head><body>
<h1>{html.escape(sc.title)}</h1>
<p class="caution">{html.escape(SCREENING_NOTE)}</p>
<h2>Inputs</h2>
<p>Scenario file: {html.escape(str(sc.source))}; {len(summary)} samples, {len(sc.reactions)} reactions.</p>
{_table_html(sc.samples)}
<h2>Assumptions</h2>
<ul>{''.join(f'<li>{html.escape(a)}</li>' for a in assumptions)}</ul>
<h2>Speciation</h2>
{_table_html(summary)}
<h2>Most energy per kilogram of fluid, per sample</h2>
{_table_html(ranking.groupby(['site', 'sample']).head(5))}
<h2>Habitability envelope</h2>
<p class="caution">{html.escape(ENVELOPE_NOTE)}</p>
{_table_html(envelope)}
{_thresholds_html(assessment)}
<h2>Figures</h2>
{figure_html}
<h2>Validity flags</h2>
<p>Rows with standard-state or activity-model caveats, species without a measured activity, |dGr|
below the minimum usable energy, or samples that could not be computed (with the reason).</p>
{_table_html(flagged[flag_columns])}
<h2>Data sources and verification ledger of the species used</h2>
{_table_html(sources, max_rows=500)}
<h2>Cautions</h2>
<p class="caution">{html.escape(SCREENING_NOTE)} Values entered from memory are marked above and
checked against outside references in the project's tests; see DEVELOPERS.md for known departures.</p>
</body></html>
"""
    (out / "report.html").write_text(page)
    md = [f"# {sc.title}", "", f"> {SCREENING_NOTE}", "", "## Assumptions", ""]
    md += [f"- {a}" for a in assumptions]
    md += ["", "## Speciation", "", _table_md(summary, floatfmt=".4g")]
    md += ["", "## Most energy per kilogram of fluid, per sample", "",
           _table_md(ranking.groupby(["site", "sample"]).head(5), floatfmt=".4g"), "",
           "## Habitability envelope", "", f"> {ENVELOPE_NOTE}", "", _table_md(envelope), ""]
    if assessment.thresholds is not None:
        md += ["## Thresholds", "", _table_md(assessment.thresholds, floatfmt=".4g"), ""]
    md += ["## Figures", ""]
    md += [f"![{k}]({k}.png)" for k in svgs]
    md += ["", "## Validity flags", "", _table_md(flagged[flag_columns], floatfmt=".4g")]
    md += ["", "## Data sources and verification ledger", "", _table_md(sources, max_rows=500), ""]
    (out / "report.md").write_text("\n".join(md))
    return out / "report.html"
