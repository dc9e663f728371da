"""Speed of linking leaves to the problem: prints figures, asserts nothing.

A generated problem of 4N access rules over an invented site vocabulary
(badges, doors, zones), and four derivations of N leaves each: copied
verbatim, restated as provers print them (bound variables renamed and
reordered, conjuncts and disjuncts reordered), restated citing no name
(found by content among all 4N rules), and restated with a disjunct dropped
(stronger, so rejected after the entailment search runs out).  Printed per
kind: leaves per second and mean milliseconds per leaf.

    python3 bench/bench_leaves.py [rules]
"""

from __future__ import annotations

import sys
import tempfile
import time
from pathlib import Path

from checker.run import check


def _rule(i: int) -> str:
    return (
        f"! [P,D,Z] : ((holds_{i}(P,D) & opens_{i}(D,Z) & badge(P)) => "
        f"(enter_{i}(P,Z) | revoked_{i}(D) | escorted(P)))"
    )


def _restated(i: int, dropped: bool = False) -> str:
    tail = "" if dropped else f" | revoked_{i}(X1)"
    return (
        f"! [X2,X0,X1] : ((badge(X0) & opens_{i}(X1,X2) & holds_{i}(X0,X1)) => "
        f"(escorted(X0){tail} | enter_{i}(X0,X2)))"
    )


KINDS = ("verbatim", "restated", "by content", "stronger")


def _derivation(rules: int, kind: str) -> str:
    """Leaves for the kind's own share of the rules (so that no kind reuses
    what another one searched)."""
    lines = []
    offset = KINDS.index(kind) * rules
    for i in range(offset, offset + rules):
        if kind == "verbatim":
            lines.append(f"fof(l{i}, axiom, {_rule(i)}, file('problem.p', rule_{i})).")
        elif kind == "restated":
            lines.append(f"fof(l{i}, axiom, {_restated(i)}, file('problem.p', rule_{i})).")
        elif kind == "by content":
            lines.append(f"fof(l{i}, axiom, {_restated(i)}, file('problem.p', unknown)).")
        else:
            lines.append(f"fof(l{i}, axiom, {_restated(i, dropped=True)}, file('problem.p', rule_{i})).")
    return "\n".join(lines) + "\n"


def main() -> None:
    rules = int(sys.argv[1]) if len(sys.argv) > 1 else 100
    with tempfile.TemporaryDirectory() as folder:
        problem = Path(folder) / "problem.p"
        problem.write_text("".join(f"fof(rule_{i}, axiom, {_rule(i)}).\n" for i in range(len(KINDS) * rules)))
        print(f"{len(KINDS) * rules} problem rules, {rules} leaves per derivation")
        for kind in KINDS:
            proof = Path(folder) / "proof.p"
            proof.write_text(_derivation(rules, kind))
            start = time.perf_counter()
            report = check(str(proof), str(problem))
            elapsed = time.perf_counter() - start
            outcomes = sorted({step.outcome for step in report.steps if step.name.startswith("l")})
            print(
                f"  {kind:<11} {rules / elapsed:8.1f} leaves/s  {1000 * elapsed / rules:7.2f} ms/leaf  "
                f"outcomes: {', '.join(outcomes)}"
            )


if __name__ == "__main__":
    main()
