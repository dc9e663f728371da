"""Whole-certificate checking speed: steps per second, seconds per MB, and
peak memory, for a native certificate (explicit evidence, no search) and
the same derivation in TPTP (evidence reconstructed by search), at 1x and
10x size.  An invented logistics scenario: a parcel hops depot to depot.

Run: python3 bench/bench_check.py [base_steps]
"""

from __future__ import annotations

import json
import os
import sys
import tempfile
import time
import tracemalloc

from checker.run import check


def problem_text(hops: int) -> str:
    lines = [f"cnf(route_{i}, axiom, ~at(P, depot{i}) | at(P, depot{i + 1}))." for i in range(hops)]
    lines.append("cnf(start, axiom, at(parcel7, depot0)).")
    lines.append(f"cnf(never_arrives, negated_conjecture, ~at(parcel7, depot{hops})).")
    return "\n".join(lines) + "\n"


def tptp_proof(hops: int) -> str:
    lines = [f"cnf(route_{i}, axiom, ~at(P, depot{i}) | at(P, depot{i + 1}), file('problem.p', route_{i}))." for i in range(hops)]
    lines.append("cnf(start, axiom, at(parcel7, depot0), file('problem.p', start)).")
    lines.append(f"cnf(never_arrives, negated_conjecture, ~at(parcel7, depot{hops}), file('problem.p', never_arrives)).")
    previous = "start"
    for i in range(hops):
        lines.append(f"cnf(reached_{i + 1}, plain, at(parcel7, depot{i + 1}), inference(resolve, [status(thm)], [route_{i}, {previous}])).")
        previous = f"reached_{i + 1}"
    lines.append(f"cnf(contradiction, plain, $false, inference(resolve, [status(thm)], [{previous}, never_arrives])).")
    return "\n".join(lines) + "\n"


def native_proof(hops: int) -> str:
    records = [{"assay_certificate": 1, "problem": "problem.p"}]

    def leaf(name, formula, role="axiom"):
        records.append({"name": name, "role": role, "language": "cnf", "formula": formula,
                        "origin": {"kind": "file", "detail": ["problem.p", name]}})

    for i in range(hops):
        leaf(f"route_{i}", f"~at(P, depot{i}) | at(P, depot{i + 1})")
    leaf("start", "at(parcel7, depot0)")
    leaf("never_arrives", f"~at(parcel7, depot{hops})", "negated_conjecture")
    previous = "start"
    for i in range(hops):
        records.append({
            "name": f"reached_{i + 1}", "role": "plain", "language": "cnf", "formula": f"at(parcel7, depot{i + 1})",
            "inference": {"rule": "resolution", "parents": [f"route_{i}", previous],
                          "left": 0, "left_literal": 0, "right": 1, "right_literal": 0,
                          "left_substitution": {"P": "parcel7"}},
        })
        previous = f"reached_{i + 1}"
    records.append({
        "name": "contradiction", "role": "plain", "language": "cnf", "formula": "$false",
        "inference": {"rule": "resolution", "parents": [previous, "never_arrives"],
                      "left": 0, "left_literal": 0, "right": 1, "right_literal": 0},
    })
    return "\n".join(json.dumps(record) for record in records) + "\n"


def measure(directory: str, name: str, text: str) -> None:
    path = os.path.join(directory, name)
    with open(path, "w") as out:
        out.write(text)
    problem = os.path.join(directory, "problem.p")
    started = time.perf_counter()
    report = check(path, problem)
    elapsed = time.perf_counter() - started
    # Memory in a second run: tracing allocations slows the run it traces.
    tracemalloc.start()
    check(path, problem)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    steps = len(report.steps)
    megabytes = len(text.encode()) / 1e6
    print(
        f"{name:>12}  {report.verdict:>9}  {steps:6d} steps  {elapsed:7.2f} s  "
        f"{steps / elapsed:8.0f} steps/s  {elapsed / megabytes:7.2f} s/MB  peak {peak / 1e6:7.1f} MB"
    )


def main() -> None:
    base = int(sys.argv[1]) if len(sys.argv) > 1 else 200
    for factor in (1, 10):
        hops = base * factor
        with tempfile.TemporaryDirectory() as directory:
            with open(os.path.join(directory, "problem.p"), "w") as out:
                out.write(problem_text(hops))
            print(f"{hops} hops ({factor}x):")
            measure(directory, "proof.jsonl", native_proof(hops))
            measure(directory, "proof.p", tptp_proof(hops))


if __name__ == "__main__":
    main()
