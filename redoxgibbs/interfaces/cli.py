"""Command-line interface: ``redoxgibbs COMMAND ...``."""

import argparse
import itertools
import sys

import numpy as np

from ..errors import RedoxGibbsError
from ..reactions.reaction import Reaction, reaction_properties

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
