"""Outputs of ``assess``: results and rankings as CSV, figures as PNG and SVG, NetCDF datasets, and one
self-contained report (report.html, with sortable tables that scroll inside their box and need no
network; report.md with the same sections)."""

import html
import io
from pathlib import Path

import matplotlib.pyplot as plt
import pandas as pd

from ..species.ledger import ledger_words, verification_ledger
from ..sweeps.runner import write_netcdf
from .figures import (
    energy_density_figure,
    feasibility_figure,
    gibbs_figure,
    heat_map_figure,
    mixing_figure,
    power_figure,
    profile_figure,
    reaction_styles,
)

__all__ = ["SCREENING_NOTE", "SECTIONS", "report_figures", "save_figure", "write_outputs"]

SCREENING_NOTE = ("These are screening estimates of thermodynamic potential, not evidence of life "
                  "or of rates. Field sampling near hot fluids follows local rules and trained practice.")
#: The report's sections, in order (report.html and report.md carry the same ones)
SECTIONS = ("Inputs", "Assumptions", "Speciation", "Most energy per kilogram of fluid, per sample",
            "Habitability envelope", "Thresholds", "Figures", "Validity flags",
            "Data sources and verification ledger", "Cautions")


def save_figure(fig, out, stem):
    """Write a figure as PNG and SVG beside the report; returns the SVG text (embedded in the page)."""
    fig.savefig(out / f"{stem}.png", dpi=110)
    buf = io.StringIO()
    fig.savefig(buf, format="svg")
    (out / f"{stem}.svg").write_text(buf.getvalue())
    plt.close(fig)
    return buf.getvalue()


def _first_supply_rows(results):
    """The result rows of each sample's site's first supply model (results are site by site, each
    site's models in order): one row per sample x reaction, as the figures and rankings show."""
    return results.drop_duplicates(subset=["sample", "reaction"], keep="first")


def report_figures(assessment):
    """Every figure of the report as {stem: (Figure, caption)} (not yet saved: tests inspect them)."""
    results = assessment.results
    first = _first_supply_rows(results)
    first = first.assign(label=first["site"] + " / " + first["sample"])
    sc = assessment.scenario
    styles = reaction_styles([x.name for x in sc.reactions])
    supplies = {site.name: (site.supplies[0].describe() if site.supplies else "none given") for site in sc.sites}
    figures = {"gibbs_per_electron": gibbs_figure(first, styles),
               "energy_density": energy_density_figure(first, styles),
               "heat_map": heat_map_figure(first, styles),
               "power_and_cells": power_figure(first, styles, sc.power_units, supplies)}
    if assessment.mixing is not None:
        figures["mixing_path"] = mixing_figure(assessment.mixing, styles)
    if assessment.profile is not None:
        figures["depth_profile"] = profile_figure(assessment.profile, assessment.profile_sample, sc.body.name,
                                                  styles)
    if assessment.feasibility is not None:
        figures["feasibility_map"] = feasibility_figure(assessment.feasibility)
    return figures


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
    entered, reach = ledger_words(ledger)
    return pd.DataFrame({"species": ledger["species"], "model": ledger["model"], "source": ledger["source"],
                         "outside checks passed (tolerance)": ledger["outside_checks"],
                         "reach": reach, "how entered": entered})


#: Rows shown per table in report.html and report.md; every row is in the CSV files beside them.
MAX_TABLE_ROWS = 60


def _more_rows(frame, max_rows):
    return (f"First {max_rows} of {len(frame)} rows; every row is in results.csv and the ranking files."
            if len(frame) > max_rows else "")


def _table_html(frame, max_rows=MAX_TABLE_ROWS):
    """A table in a box that scrolls sideways when wide; its headers sort it (the page's script)."""
    note = _more_rows(frame, max_rows)
    table = frame.head(max_rows).to_html(index=False, float_format=lambda v: f"{v:.4g}", border=0,
                                         classes="data", na_rep="")
    return f'<div class="scroll">{table}</div>' + (f"<p>{note}</p>" if note else "")


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
    wide = wide[list(dict.fromkeys(envelope["criterion"]))]
    wide.columns.name = None
    return wide.reset_index()


def _thresholds_text(assessment):
    """The Thresholds section's sentence and table (None without a [thresholds] section)."""
    if assessment.thresholds is None:
        return "No [thresholds] section in the scenario.", None
    spec = assessment.scenario.raw["thresholds"]
    what = ("over the feasibility map's grid (figure below; feasibility_map.nc)" if assessment.feasibility is not None
            else "per sample")
    return (f"The value of {spec['input']} at which {spec['reaction']} reaches the target, {what}; 'no solution' "
            f"where the target is not crossed within [{spec['bracket'][0]:g}, {spec['bracket'][1]:g}]."), \
        assessment.thresholds


def _solid_reactions(reactions):
    """'reaction (solid, ...)' for each reaction that takes a solid as reactant or product."""
    items = []
    for x in reactions:
        solids = [s for s in x.reaction.species if x.reaction.db.record(s).state == "solid"]
        if solids:
            items.append(f"{x.name} ({', '.join(solids)})")
    return "; ".join(items)


ASSUMPTIONS_STATIC = (
    "Standard states: aqueous 1 molal ideal (revised HKF or formation reactions), gases 1 bar ideal, solids and "
    "water pure phases; water from IAPWS-95.",
    "Redox couples are not equilibrated with each other; pH measured at another temperature is carried to "
    "in-situ conditions at constant totals and charge balance.",
    "Energy density: -dGr times the amount of reaction allowed by the limiting dissolved reactant, whose amount "
    "is the total of its pool (dissolved inorganic carbon for CO2(aq), HCO3- or CO3^2-; total sulfide for "
    "H2S(aq) or HS-; total ammonia; each component's total), whichever species the reaction or the sample "
    "columns name; zero where not exergonic.",
    "Growth: biomass yield and production from the Gibbs energy dissipated per C-mol of biomass (Heijnen & van "
    "Dijken 1992), power spent on growth alone; the yield leaves out the Gibbs energy of anabolism itself.",
)

_STYLE = """
body { font-family: sans-serif; margin: 2em auto; max-width: 1250px; padding: 0 1em; }
.scroll { overflow-x: auto; max-width: 100%; margin: 1em 0; border: 1px solid #e4e4e4; }
table.data { border-collapse: collapse; font-size: 12px; }
table.data td, table.data th { border-bottom: 1px solid #ddd; padding: 2px 6px; text-align: right;
  white-space: nowrap; }
table.data th { position: sticky; top: 0; background: #f4f4f4; cursor: pointer; }
table.data th[aria-sort="ascending"]::after { content: " \\25B2"; }
table.data th[aria-sort="descending"]::after { content: " \\25BC"; }
.caution { background: #fff4d6; border-left: 4px solid #e0a800; padding: 0.6em 1em; }
figure { margin: 1.5em 0; } .plot svg { max-width: 100%; height: auto; }
figcaption { font-size: 13px; color: #333; max-width: 60em; }
"""

# Sorting by clicking a column header: a few lines of plain JavaScript inside the page (no network).
_SORT_SCRIPT = """
document.querySelectorAll("table.data").forEach(function (table) {
  table.querySelectorAll("th").forEach(function (th, col) {
    th.addEventListener("click", function () {
      var body = table.tBodies[0], rows = Array.from(body.rows);
      var up = th.getAttribute("aria-sort") !== "ascending";
      table.querySelectorAll("th").forEach(function (h) { h.removeAttribute("aria-sort"); });
      th.setAttribute("aria-sort", up ? "ascending" : "descending");
      rows.sort(function (a, b) {
        var x = a.cells[col].textContent, y = b.cells[col].textContent;
        var nx = parseFloat(x), ny = parseFloat(y);
        var cmp = (!isNaN(nx) && !isNaN(ny)) ? nx - ny : x.localeCompare(y);
        return up ? cmp : -cmp;
      });
      rows.forEach(function (r) { body.appendChild(r); });
    });
  });
});
"""


def _section_html(title, body):
    return f"<section><h2>{html.escape(title)}</h2>\n{body}</section>"


def write_outputs(assessment, out_dir):
    """Write every output of an assessment into ``out_dir``; returns the path of report.html."""
    out = Path(out_dir)
    out.mkdir(parents=True, exist_ok=True)
    sc = assessment.scenario
    results = assessment.results
    results.to_csv(out / "results.csv", index=False)
    if assessment.dataset is not None:
        write_netcdf(assessment.dataset, out / "results.nc")
    first = _first_supply_rows(results)
    ranking = _rankings(first, out, sc.power_units)
    if assessment.mixing is not None:
        assessment.mixing.to_csv(out / "mixing.csv", index=False)
    if assessment.profile is not None:
        assessment.profile.to_csv(out / "depth_profile.csv", index=False)
    if assessment.envelope is not None:
        assessment.envelope.to_csv(out / "habitability.csv", index=False)
    if assessment.thresholds is not None:
        assessment.thresholds.to_csv(out / "thresholds.csv", index=False)
    if assessment.feasibility is not None:
        write_netcdf(assessment.feasibility, out / "feasibility_map.nc")
    figures = {stem: (save_figure(fig, out, stem), caption) for stem, (fig, caption) in report_figures(assessment).items()}
    summary = assessment.speciation.summary_frame()
    summary.insert(0, "site", sc.samples["site"].to_numpy())
    flagged = first[(first["flags"] != "") | (first["missing_species"] != "") | first["below_minimum_energy"]
                    | (first["failure"] != "")]
    flag_columns = ["site", "sample", "reaction", "dGr_kJ_per_mol", "below_minimum_energy", "missing_species",
                    "flags", "failure"]
    assumptions = [
        f"Activity model: {assessment.speciation.activity_model} (samples beyond its range are flagged).",
        *ASSUMPTIONS_STATIC,
        "Solids are in excess (never limiting): " + (_solid_reactions(sc.reactions) or "no reaction here uses a "
                                                      "solid") + ".",
        f"Minimum usable energy: {sc.minimum_energy_kJ:g} kJ per mol of reaction (Hoehler 2004).",
        "Supply models, per site (the figures show each site's first): " + "; ".join(
            f"{site.name}: {', '.join(x.describe() for x in site.supplies) or 'none given'}" for site in sc.sites) + ".",
        "Per-cell requirement, per site: " + "; ".join(f"{site.name}: {site.cells.describe()}" for site in sc.sites)
        + "; cell numbers are given as a low-high range.",
    ]
    envelope = _envelope_summary(assessment.envelope)
    thresholds_text, thresholds_table = _thresholds_text(assessment)
    sources = _sources(assessment)
    inputs_text = f"Scenario file: {sc.source}; {len(summary)} samples, {len(sc.reactions)} reactions."
    ledger_text = ("Every species the assessment used: its data source, the outside checks its data pass "
                   "(the project's tests against published tables, standards and reference libraries) and the "
                   "highest temperature they reach.")
    flags_text = ("Rows with standard-state or activity-model caveats, species without a measured activity, |dGr| "
                  "below the minimum usable energy, or samples that could not be computed (with the reason).")
    cautions = (f"{SCREENING_NOTE} Values recalled from memory are held by the outside checks listed in the "
                "ledger; see DEVELOPERS.md for known departures of the data from outside references.")
    figure_html = "\n".join(f'<figure id="{stem}"><div class="plot">{svg[svg.find("<svg"):]}</div>'
                             f"<figcaption>{html.escape(caption)}</figcaption></figure>"
                             for stem, (svg, caption) in figures.items())
    body = {
        "Inputs": f"<p>{html.escape(inputs_text)}</p>" + _table_html(sc.samples),
        "Assumptions": "<ul>" + "".join(f"<li>{html.escape(a)}</li>" for a in assumptions) + "</ul>",
        "Speciation": _table_html(summary),
        "Most energy per kilogram of fluid, per sample": _table_html(ranking.groupby(["site", "sample"]).head(5)),
        "Habitability envelope": f'<p class="caution">{html.escape(ENVELOPE_NOTE)}</p>' + _table_html(envelope),
        "Thresholds": f"<p>{html.escape(thresholds_text)}</p>" + (_table_html(thresholds_table)
                                                                  if thresholds_table is not None else ""),
        "Figures": figure_html,
        "Validity flags": f"<p>{html.escape(flags_text)}</p>" + _table_html(flagged[flag_columns]),
        "Data sources and verification ledger": f"<p>{html.escape(ledger_text)}</p>" + _table_html(sources, 500),
        "Cautions": f'<p class="caution">{html.escape(cautions)}</p>',
    }
    page = (f'<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8"><title>{html.escape(sc.title)}</title>'
            f"<style>{_STYLE}</style></head><body>\n<h1>{html.escape(sc.title)}</h1>\n"
            f'<p class="caution">{html.escape(SCREENING_NOTE)}</p>\n'
            + "\n".join(_section_html(t, body[t]) for t in SECTIONS)
            + f"\n<script>{_SORT_SCRIPT}</script>\n</body></html>\n")
    (out / "report.html").write_text(page)
    md_body = {
        "Inputs": [inputs_text, "", _table_md(sc.samples)],
        "Assumptions": [f"- {a}" for a in assumptions],
        "Speciation": [_table_md(summary, floatfmt=".4g")],
        "Most energy per kilogram of fluid, per sample": [_table_md(ranking.groupby(["site", "sample"]).head(5),
                                                                    floatfmt=".4g")],
        "Habitability envelope": [f"> {ENVELOPE_NOTE}", "", _table_md(envelope)],
        "Thresholds": [thresholds_text] + (["", _table_md(thresholds_table, floatfmt=".4g")]
                                           if thresholds_table is not None else []),
        "Figures": [line for stem, (_, caption) in figures.items() for line in (f"![{stem}]({stem}.png)", "",
                                                                                f"*{caption}*", "")],
        "Validity flags": [flags_text, "", _table_md(flagged[flag_columns], floatfmt=".4g")],
        "Data sources and verification ledger": [ledger_text, "", _table_md(sources, max_rows=500)],
        "Cautions": [f"> {cautions}"],
    }
    md = [f"# {sc.title}", "", f"> {SCREENING_NOTE}", ""]
    for title in SECTIONS:
        md += [f"## {title}", "", *md_body[title], ""]
    (out / "report.md").write_text("\n".join(md))
    return out / "report.html"
