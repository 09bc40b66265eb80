"""Command-line interface: ``redoxgibbs COMMAND ...``."""

import argparse
import itertools
import sys

import numpy as np

from ..errors import RedoxGibbsError
from ..reactions.reaction import Reaction, reaction_properties
from ..speciation.solver import speciate

__all__ = ["main"]

SCREENING_NOTE = ("Screening estimates of thermodynamic potential, not evidence of life or of "
                  "rates. Field sampling near hot fluids follows local rules and trained practice.")


def _number_list(text, field):
    try:
        return [float(x) for x in text.split(",") if x.strip()]
    except ValueError:
        raise RedoxGibbsError(f"--{field}: expected comma-separated numbers, got {text!r}") from None


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
    if args.format == "csv":
        sys.stdout.write(frame.to_csv(index=False, float_format="%.6g"))
    else:
        print(f"Reaction: {reaction}\n")
        print(frame.to_string(index=False, float_format=lambda v: f"{v:.4f}"))
        print("\nlogK, dG0 etc.: standard states (aqueous: 1 molal ideal; gases: 1 bar; solids and "
              "water: pure phase).")
    return 0


def _speciation(args):
    result = speciate(args.samples, args.activity_model, pH_from_charge_balance=args.pH_from_charge_balance)
    if args.format == "csv":
        sys.stdout.write(result.to_long_frame().to_csv(index=False, float_format="%.6g"))
        return 0
    summary = result.summary_frame()
    long = result.to_long_frame()
    print(f"Activity model: {result.activity_model}\n")
    for i, row in summary.iterrows():
        flag = "  (beyond the activity model's ionic-strength range)" if row.beyond_activity_model_validity else ""
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
    std.add_argument("--format", choices=("table", "csv"), default="table")
    std.set_defaults(run=_stdstate)
    spc = sub.add_parser("speciation", help="in-situ speciation of a table of fluid samples")
    spc.add_argument("samples", help="CSV: sample, T [degC], P [bar], pH, SPECIES [UNIT] columns")
    spc.add_argument("--activity-model", choices=("ideal", "davies", "bdot"), default="bdot")
    spc.add_argument("--pH-from-charge-balance", action="store_true",
                     help="solve pH from charge balance where the pH cell is blank")
    spc.add_argument("--format", choices=("table", "csv"), default="table")
    spc.add_argument("--top", type=int, default=8, help="species listed per sample in the table view")
    spc.set_defaults(run=_speciation)
    return parser


def main(argv=None):
    args = _parser().parse_args(argv)
    try:
        return args.run(args)
    except RedoxGibbsError as err:
        print(f"redoxgibbs: error: {err}", file=sys.stderr)
        return 2


if __name__ == "__main__":
    sys.exit(main())
