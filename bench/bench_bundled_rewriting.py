"""Reconstructing one bundled rewriting step: a step that cites a clause, a
unit equation and a unit clause, and hides up to 20 rewrites and a
resolution that removes a literal.  Prints, per number of rewrites, the
median and the slowest CPU milliseconds of the search (kernel replay
included), for the right claim and for a wrong one (which the
counter-model screen must turn down).  Scenario: crates in wrappers.

Run: python3 bench/bench_bundled_rewriting.py [REPEATS]
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from checker.search.reconstruct import reconstruct
from formats.tptp import parse_clause


def _wrapped(term: str, layers: int) -> str:
    return "wrap(" * layers + term + ")" * layers


def timed(premises, claimed) -> tuple[float, bool]:
    started = time.process_time()
    found = reconstruct(premises, claimed, "rewrite_and_simplify")
    return (time.process_time() - started) * 1000, found.evidence is not None


def main() -> None:
    repeats = int(sys.argv[1]) if len(sys.argv) > 1 else 7
    print(f"{'rewrites':>8} {'claim':6} {'found':>5} {'median ms':>10} {'max ms':>8}")
    medians = []
    for layers in (4, 8, 12, 16, 20):
        premises = [parse_clause(f"sealed({_wrapped(f'crate{layers}', layers)}) | held(crate{layers})"),
                    parse_clause("wrap(X) = X"), parse_clause(f"~held(crate{layers})")]
        for label, claimed in (("right", f"sealed(crate{layers})"), ("wrong", f"sealed(box{layers})")):
            runs = [timed(premises, parse_clause(claimed)) for _ in range(repeats)]
            times = [ms for ms, _ in runs]
            if label == "right":
                medians.extend(times)
            print(f"{layers:8d} {label:6} {runs[0][1]!s:>5} {statistics.median(times):10.1f} {max(times):8.1f}")
    print(f"median over every right claim: {statistics.median(medians):.1f} ms")


if __name__ == "__main__":
    main()
