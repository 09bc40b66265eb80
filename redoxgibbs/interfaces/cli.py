"""Command-line interface: ``redoxgibbs COMMAND ...``."""

import argparse
import itertools
import json
import os
import sys
from pathlib import Path

import numpy as np
import pandas as pd

from ..activities.models import MODELS
from ..energetics.catalog import (
    catalog,
    couples_present,
    enumerate_reactions,
    resolve_reactions,
)
from ..energetics.insitu import DEFAULT_MINIMUM_ENERGY_KJ
from ..errors import InputError, RedoxGibbsError
from ..reactions.reaction import Reaction, reaction_properties
from ..speciation.samples import BELOW_DETECTION_POLICIES, read_samples
from ..speciation.solver import speciate, species_in_samples
from ..species.database import default_database
from .report import SCREENING_NOTE

__all__ = ["main"]


def _number_list(text, field):
    try:
        return [float(x) for x in text.split(",") if x.strip()]
    except ValueError:
        raise RedoxGibbsError(f"--{field}: expected comma-separated numbers, got {text!r}") from None


#: Output formats of every command's table: text for reading, CSV or JSON (records) for programs
FORMATS = ("table", "csv", "json")


def _json_scalar(value):
    """numpy scalars as plain Python numbers and flags for JSON."""
    return value.item() if isinstance(value, np.generic) else str(value)


def _machine_output(frame, fmt):
    """Write every column of ``frame`` as CSV or JSON (a list of records) and return True; False for
    the text table, which the caller prints its own way."""
    if fmt == "csv":
        sys.stdout.write(frame.to_csv(index=False, float_format="%.6g"))
    elif fmt == "json":
        records = frame.astype(object).where(pd.notna(frame), None).to_dict(orient="records")
        sys.stdout.write(json.dumps(records, default=_json_scalar) + "\n")   # floats at full precision
    else:
        return False
    return True


def _write_frame(frame, fmt, table_columns, note=""):
    """Print a result table: every column as CSV or JSON, or the chosen columns as text with the caution."""
    if not _machine_output(frame, fmt):
        print(frame[table_columns].to_string(index=False, float_format=lambda v: f"{v:.4g}"))
        print("\n" + note + SCREENING_NOTE)
    return 0


def _failures(names, failure):
    """Print one line naming the samples that could not be computed; exit status 1 if any."""
    bad = np.flatnonzero(np.asarray(failure, dtype=object) != "")
    if bad.size == 0:
        return 0
    listed = "; ".join(f"{names[i]}: {failure[i]}" for i in bad[:5])
    more = f"; and {bad.size - 5} more (see the failure column)" if bad.size > 5 else ""
    print(f"redoxgibbs: {bad.size} of {len(names)} samples could not be computed ({listed}{more}); "
          "the others were", file=sys.stderr)
    return 1


def _stdstate(args):
    reaction = Reaction(args.reaction)
    temperatures = _number_list(args.temperature, "temperature")
    psat = args.pressure.strip().lower() == "psat"
    pressures = [None] if psat else _number_list(args.pressure, "pressure")
    if not temperatures or not pressures:
        raise RedoxGibbsError("--temperature and --pressure need at least one value each")
    pairs = list(itertools.product(temperatures, pressures))
    T = np.array([t for t, _ in pairs])
    P = "psat" if psat else np.array([p for _, p in pairs])
    frame = reaction_properties(reaction, T, P).to_frame()
    if not _machine_output(frame, args.format):
        print(f"Reaction: {reaction}\n")
        print(frame.to_string(index=False, float_format=lambda v: f"{v:.4f}"))
        print("\nlogK, dG0 etc.: standard states (aqueous: 1 molal ideal; gases: 1 bar; solids and "
              "water: pure phase).")
    return 0


def _speciation(args):
    result = speciate(read_samples(args.samples, below_detection=args.below_detection), args.activity_model,
                      pH_from_charge_balance=args.pH_from_charge_balance)
    if _machine_output(result.to_long_frame(), args.format):
        return _failures(result.samples, result.failure)
    summary = result.summary_frame()
    long = result.to_long_frame()
    print(f"Activity model: {result.activity_model}\n")
    for i, row in summary.iterrows():
        if row.failure:
            print(f"{row['sample']}: not computed: {row.failure}")
            continue
        flag = "  (beyond the activity model's ionic-strength range)" if row.beyond_activity_model_validity else ""
        if row.density_estimated:
            flag += "  (per-litre amounts converted with an estimated density)"
        print(f"{row['sample']}: {row.T_C:.2f} degC, {row.P_bar:.2f} bar, in-situ pH {row.pH_insitu:.3f}, "
              f"I = {row.ionic_strength_mol_per_kg:.4g} mol/kg{flag}, charge imbalance "
              f"{row.charge_imbalance_eq_per_kg:.3g} eq/kg")
        top = long[long["sample"] == row["sample"]].nlargest(args.top, "molality_mol_per_kg")
        for _, sp in top.iterrows():
            print(f"    {sp.species:<14} {sp.molality_mol_per_kg:11.4e} mol/kg   log10 gamma {sp.log10_gamma:7.3f}")
        si = [f"{m} {v:+.2f}" for m, v in zip(result.minerals, result.saturation_index[i]) if np.isfinite(v)]
        if si:
            print("    saturation index: " + ", ".join(si))
    print("\n" + SCREENING_NOTE)
    return _failures(result.samples, result.failure)


def _insitu(args):
    from ..pipeline.evaluate import evaluate

    ev = evaluate(read_samples(args.samples, below_detection=args.below_detection),
                  resolve_reactions(args.reaction), args.activity_model,
                  minimum_energy_kJ=args.minimum_energy, pH_from_charge_balance=args.pH_from_charge_balance)
    result, energetics = ev.speciation, ev.energetics
    per_species = [default_database().resolve(s) for s in args.per_species or []]
    frame = energetics.to_frame(per_species)
    cols = ["sample", "reaction", "T_C", "dGr_kJ_per_mol", "dGr_kJ_per_mol_e",
            *[f"dGr_kJ_per_mol_{s}" for s in per_species], "limiting_species",
            "energy_density_J_per_kg", "missing_species", "flags", "failure"]
    _write_frame(frame, args.format, cols, "energy_density_J_per_kg is per kg of water. ")
    return _failures(result.samples, result.failure)


def _reactions(args):
    if args.present_in:
        present = couples_present(species_in_samples(args.present_in))
        if args.format == "table":
            print(f"couples whose dissolved species are in {args.present_in}: {', '.join(present)}\n")
        entries = enumerate_reactions(args.donor or present, args.acceptor or present)
    elif args.donor or args.acceptor:
        entries = enumerate_reactions(args.donor or None, args.acceptor or None)
    else:
        entries = catalog()
    frame = pd.DataFrame({"name": [e.name for e in entries], "electrons": [e.electrons for e in entries],
                          "reaction": [str(e.reaction) for e in entries]})
    if not _machine_output(frame, args.format):
        for e in entries:
            print(f"{e.name:<52} {e.electrons:5.3g} e-   {e.reaction}")
    return 0


def _ledger(args):
    from ..species.ledger import ledger_words, verification_ledger

    frame = verification_ledger(args.species or None)
    if not _machine_output(frame, args.format):
        for row, memory, reach in zip(frame.itertuples(), *ledger_words(frame)):
            print(f"{row.species} ({row.model}; {memory}; {reach})\n  source: {row.source}\n"
                  f"  checks: {row.outside_checks}\n")
    return 0


def _scenario_keys(args):
    from .schema import schema_reference

    print("Scenario file keys (TOML), as checked on reading:\n")
    print("\n".join(schema_reference()))
    return 0


def _assess(args):
    from .assess import run_assessment
    from .report import write_outputs

    assessment = run_assessment(args.scenario, quiet=args.quiet)
    report = write_outputs(assessment, args.out)
    print(f"report: {report}")
    return _failures(assessment.speciation.samples, assessment.speciation.failure)


def _demo(args):
    from importlib import resources

    from .assess import run_assessment
    from .report import write_outputs

    scenario = resources.files("redoxgibbs.examples") / "demo_scenario.toml"
    assessment = run_assessment(str(scenario), quiet=args.quiet)
    report = write_outputs(assessment, args.out)
    print(f"demo report: {report.resolve()}")
    return _failures(assessment.speciation.samples, assessment.speciation.failure)


def _mix(args):
    from ..pipeline.mixing import mixing_energetics
    from .figures import mixing_figure

    if (args.fractions is None) == (args.temperatures is None):
        raise RedoxGibbsError("mix: give either --fractions or --temperatures")
    frame = mixing_energetics(
        read_samples(args.samples, below_detection=args.below_detection), args.hydrothermal, args.seawater, resolve_reactions(args.reaction),
        fractions=None if args.fractions is None else _number_list(args.fractions, "fractions"),
        temperatures_C=None if args.temperatures is None else _number_list(args.temperatures, "temperatures"),
        rule=args.temperature_rule, activity_model_name=args.activity_model)
    if args.plot:
        fig, _ = mixing_figure(frame)
        fig.savefig(args.plot, dpi=110)
    cols = ["hydrothermal_fraction", "T_C", "pH_insitu", "reaction", "dGr_kJ_per_mol",
            "energy_J_per_kg_mixed_fluid", "energy_J_per_kg_hydrothermal_fluid", "failure"]
    _write_frame(frame, args.format, cols)
    mixtures = frame.drop_duplicates("sample")
    return _failures(mixtures["sample"].tolist(), mixtures["failure"].to_numpy())


def _sweep(args):
    from ..sweeps.runner import results_dataset, run_sweep, write_netcdf
    from .scenario import load_scenario, sweep_spec

    spec = sweep_spec(load_scenario(args.scenario))
    percentiles, correlations = run_sweep(spec, args.out, workers=args.workers,
                                          scheduler=args.scheduler, quiet=args.quiet, fresh=args.fresh)
    percentiles.to_csv(f"{args.out}/percentiles.csv", index=False)
    correlations.to_csv(f"{args.out}/rank_correlations.csv", index=False)
    write_netcdf(results_dataset(spec, args.out), f"{args.out}/results.nc")
    print(percentiles.to_string(index=False, float_format=lambda v: f"{v:.4g}"))
    print(f"\nchunks (Parquet), results.nc, percentiles.csv and rank_correlations.csv in {args.out}")
    return 0


def _thresholds(args):
    from ..sweeps.runner import write_netcdf
    from .assess import scenario_thresholds
    from .figures import feasibility_figure
    from .report import save_figure
    from .scenario import load_scenario

    scenario = load_scenario(args.scenario)
    if "thresholds" not in scenario.raw:
        raise InputError(f"scenario {args.scenario}: no [thresholds] section (see 'redoxgibbs scenario-keys')")
    table, ds = scenario_thresholds(scenario, default_database(), quiet=args.quiet)
    if args.out:
        out = Path(args.out)
        out.mkdir(parents=True, exist_ok=True)
        table.to_csv(out / "thresholds.csv", index=False)
        if ds is not None:
            write_netcdf(ds, out / "feasibility_map.nc")
            save_figure(feasibility_figure(ds)[0], out, "feasibility_map")
        print(f"thresholds.csv{', feasibility_map.nc, .png and .svg' if ds is not None else ''} in {out}",
              file=sys.stderr)
    column = scenario.raw["thresholds"]["input"]
    shown = [c for c in ("site", "sample", *(ds.threshold.dims if ds is not None else ()), column, "status")
             if c in table.columns]
    _write_frame(table, args.format, shown)
    unsolved = int((table["status"] != "solved").sum())
    if unsolved:
        print(f"redoxgibbs: {unsolved} of {len(table)} have no solution (see the status column)", file=sys.stderr)
    return 0


def _parser():
    parser = argparse.ArgumentParser(
        prog="redoxgibbs",
        description="Gibbs energies of catabolic reactions in natural fluids. " + SCREENING_NOTE)
    sub = parser.add_subparsers(dest="command", required=True)
    std = sub.add_parser("stdstate", help="standard-state logK, dG0, dH0, dS0 of a reaction at T, P")
    std.add_argument("reaction", help="e.g. \"CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)\"")
    std.add_argument("--temperature", default="25", help="comma-separated list in degC (default 25)")
    std.add_argument("--pressure", default="psat",
                     help="comma-separated list in bar, or 'psat' (1.01325 bar to 100 degC, "
                          "saturation above; the default)")
    std.add_argument("--format", choices=FORMATS, default="table")
    std.set_defaults(run=_stdstate)
    spc = sub.add_parser("speciation", help="in-situ speciation of a table of fluid samples")
    spc.add_argument("samples", help="CSV or Excel workbook (.xlsx; its sheets one after the other): sample, "
                                  "T [degC], P [bar], pH, SPECIES [UNIT] columns")
    spc.add_argument("--activity-model", choices=tuple(MODELS), default="bdot")
    spc.add_argument("--below-detection", choices=BELOW_DETECTION_POLICIES, default="not-measured",
                     help="cells such as '<0.1', 'bdl', 'nd': not measured (default), at the limit, or half of it")
    spc.add_argument("--pH-from-charge-balance", action="store_true",
                     help="solve pH from charge balance where the pH cell is blank")
    spc.add_argument("--format", choices=FORMATS, default="table")
    spc.add_argument("--top", type=int, default=8, help="species listed per sample in the table view")
    spc.set_defaults(run=_speciation)
    ins = sub.add_parser("insitu", help="in-situ Gibbs energies and energy densities of reactions")
    ins.add_argument("samples", help="CSV as for 'speciation'")
    ins.add_argument("--reaction", action="append", required=True,
                     help="a catalog name or a reaction string; repeat for several")
    ins.add_argument("--activity-model", choices=tuple(MODELS), default="bdot")
    ins.add_argument("--below-detection", choices=BELOW_DETECTION_POLICIES, default="not-measured",
                     help="cells such as '<0.1', 'bdl', 'nd': not measured (default), at the limit, or half of it")
    ins.add_argument("--pH-from-charge-balance", action="store_true")
    ins.add_argument("--minimum-energy", type=float, default=DEFAULT_MINIMUM_ENERGY_KJ,
                     help="kJ per mol of reaction below which |dGr| is flagged (default %(default)s)")
    ins.add_argument("--per-species", action="append", metavar="SPECIES",
                     help="also report dGr per mole of this species, e.g. H2(aq); repeat for several")
    ins.add_argument("--format", choices=FORMATS, default="table")
    ins.set_defaults(run=_insitu)
    rxn = sub.add_parser("reactions", help="list the reaction catalog, or enumerate donor x acceptor pairs")
    rxn.add_argument("--donor", action="append", help="redox couple giving electrons, e.g. H+/H2")
    rxn.add_argument("--acceptor", action="append", help="redox couple taking electrons, e.g. O2/H2O")
    rxn.add_argument("--present-in", metavar="SAMPLES.csv",
                     help="enumerate the couples whose dissolved species these samples contain "
                          "(solids count as available); --donor/--acceptor override either side")
    rxn.add_argument("--format", choices=FORMATS, default="table")
    rxn.set_defaults(run=_reactions)
    led = sub.add_parser("ledger", help="the verification ledger: each species' source and the outside "
                                        "checks its data pass")
    led.add_argument("species", nargs="*", help="species to list (default: all)")
    led.add_argument("--format", choices=FORMATS, default="table")
    led.set_defaults(run=_ledger)
    keys = sub.add_parser("scenario-keys", help="every key a scenario file may hold, its type and meaning")
    keys.set_defaults(run=_scenario_keys)
    ass = sub.add_parser("assess", help="run a scenario file into a folder of results and a report")
    ass.add_argument("scenario", help="scenario TOML (see examples/demo_scenario.toml)")
    ass.add_argument("--out", required=True, help="output folder")
    ass.add_argument("--quiet", action="store_true", help="no progress lines")
    ass.set_defaults(run=_assess)
    mix = sub.add_parser("mix", help="energetics along the mixing path of two end-member samples")
    mix.add_argument("samples", help="CSV holding both end-members (as for 'speciation')")
    mix.add_argument("--hydrothermal", required=True, help="sample name of the hot end-member")
    mix.add_argument("--seawater", required=True, help="sample name of the cold end-member")
    mix.add_argument("--fractions", help="comma-separated mass fractions of the hydrothermal fluid")
    mix.add_argument("--temperatures", help="comma-separated mixture temperatures [degC]")
    mix.add_argument("--temperature-rule", choices=("enthalpy", "linear"), default="enthalpy")
    mix.add_argument("--reaction", action="append", required=True)
    mix.add_argument("--activity-model", choices=tuple(MODELS), default="bdot")
    mix.add_argument("--below-detection", choices=BELOW_DETECTION_POLICIES, default="not-measured",
                     help="cells such as '<0.1', 'bdl', 'nd': not measured (default), at the limit, or half of it")
    mix.add_argument("--plot", help="write the energy-against-temperature figure to this PNG/SVG file")
    mix.add_argument("--format", choices=FORMATS, default="table")
    mix.set_defaults(run=_mix)
    swp = sub.add_parser("sweep", help="grid or Monte Carlo sweep of a scenario's [sweep] / [uncertainty]")
    swp.add_argument("scenario")
    swp.add_argument("--out", required=True, help="folder for the Parquet chunks and summaries")
    swp.add_argument("--workers", type=int, help="start a local dask cluster with this many workers")
    swp.add_argument("--scheduler", help="address of an existing dask.distributed scheduler")
    swp.add_argument("--quiet", action="store_true")
    swp.add_argument("--fresh", action="store_true",
                     help="empty the output folder first (it must otherwise hold this same sweep)")
    swp.set_defaults(run=_sweep)
    thr = sub.add_parser("thresholds", help="solve a scenario's [thresholds]: the input at which a reaction "
                                            "reaches a target, per sample or over a feasibility map")
    thr.add_argument("scenario")
    thr.add_argument("--out", help="folder for thresholds.csv (and feasibility_map.nc and .png)")
    thr.add_argument("--format", choices=FORMATS, default="table")
    thr.add_argument("--quiet", action="store_true")
    thr.set_defaults(run=_thresholds)
    demo = sub.add_parser("demo", help="run the bundled demo scenario (invented sites)")
    demo.add_argument("--out", default="redoxgibbs-demo", help="output folder (default %(default)s)")
    demo.add_argument("--quiet", action="store_true")
    demo.set_defaults(run=_demo)
    return parser


def main(argv=None):
    """The ``redoxgibbs`` command: run ``argv`` (default: the command line); returns the exit status (0 ok,
    1 some samples failed, 2 refused input)."""
    args = _parser().parse_args(argv)
    try:
        return args.run(args)
    except RedoxGibbsError as err:
        print(f"redoxgibbs: error: {err}", file=sys.stderr)
        return 2
    except BrokenPipeError:   # output piped into a reader that stopped early (e.g. head): before OSError
        sys.stdout = open(os.devnull, "w")  # noqa: SIM115 (stays open for the interpreter's final flush)
        return 0
    except OSError as err:   # output folder or file that cannot be written (or read)
        where = f" {err.filename}" if err.filename else ""
        print(f"redoxgibbs: error: cannot use{where}: {err.strerror or err}; choose another path", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        print("redoxgibbs: interrupted; nothing half-written is kept (a sweep resumes from its "
              "finished chunks)", file=sys.stderr)
        return 130


if __name__ == "__main__":
    sys.exit(main())
