"""A larger fuzz run than the test suite's (tests/interfaces/test_fuzz.py strategies): counts the outcomes.

Every outcome must be a result or one of the project's own errors; the script prints how many of
each, and the number of tracebacks (any other exception), silent NaN (an undefined dGr with no
reason given) and numpy warnings, all of which must be zero.

Run: python benchmarks/fuzz_inputs.py [--tables N]
"""

import argparse
import collections
import sys
import time
import warnings
from pathlib import Path

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests"))
sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests" / "interfaces"))
from test_fuzz import REACTIONS, sample_tables  # noqa: E402

from redoxgibbs.errors import RedoxGibbsError  # noqa: E402
from redoxgibbs.pipeline.evaluate import evaluate  # noqa: E402
from redoxgibbs.speciation.samples import read_samples  # noqa: E402


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--tables", type=int, default=10_000)
    args = parser.parse_args()
    counts = collections.Counter()

    @settings(max_examples=args.tables, deadline=None, derandomize=True, database=None,
              suppress_health_check=list(HealthCheck))
    @given(sample_tables(), st.booleans())
    def run(frame, from_charge_balance):
        with warnings.catch_warnings(record=True) as caught:
            warnings.simplefilter("always", RuntimeWarning)
            try:
                ev = evaluate(read_samples(frame), REACTIONS, "bdot", pH_from_charge_balance=from_charge_balance)
            except RedoxGibbsError:
                counts["refused with the project's own error"] += 1
                return
            except Exception:   # counted, never expected
                counts["traceback"] += 1
                return
        counts["numpy warning"] += sum(issubclass(w.category, RuntimeWarning) for w in caught)
        rows = ev.to_frame()
        silent = rows["dGr_kJ_per_mol"].isna() & (rows["failure"] == "") & (rows["missing_species"] == "") \
            & (rows["zero_species"] == "")
        counts["silent NaN"] += int(silent.sum())
        counts["computed tables"] += 1
        counts["samples failing in their own row"] += int((ev.speciation.failure != "").sum())

    start = time.perf_counter()
    run()
    print(f"{args.tables} generated sample tables in {time.perf_counter() - start:.0f} s")
    for key in ("computed tables", "samples failing in their own row", "refused with the project's own error",
                "traceback", "silent NaN", "numpy warning"):
        print(f"  {key}: {counts[key]}")
    return 1 if counts["traceback"] or counts["silent NaN"] or counts["numpy warning"] else 0


if __name__ == "__main__":
    sys.exit(main())
