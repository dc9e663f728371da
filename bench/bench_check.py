"""Whole-certificate checking speed: steps per second, seconds per MB, and
peak memory, for a native certificate (explicit evidence, no search) and
the same derivation in TPTP (evidence reconstructed by search), at 1x and
10x size, in one process and in two (--jobs 2).  An invented logistics scenario: a parcel hops depot to depot.

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


def formula_problem_text(hops: int) -> str:
    lines = [f"fof(route_{i}, axiom, ! [P] : (at(P, depot{i}) => at(P, depot{i + 1})))." for i in range(hops)]
    lines.append("fof(start, axiom, at(parcel7, depot0)).")
    lines.append(f"fof(arrives, conjecture, at(parcel7, depot{hops})).")
    return "\n".join(lines) + "\n"


def formula_proof(hops: int) -> str:
    """The same journey from fof axioms: negated conjecture, one clause-form
    step per axiom (each an entailment the search must show), resolutions."""
    lines = [
        f"fof(route_{i}, axiom, ! [P] : (at(P, depot{i}) => at(P, depot{i + 1})), file('problem_fof.p', route_{i}))."
        for i in range(hops)
    ]
    lines.append("fof(start, axiom, at(parcel7, depot0), file('problem_fof.p', start)).")
    lines.append(f"fof(arrives, conjecture, at(parcel7, depot{hops}), file('problem_fof.p', arrives)).")
    lines.append(f"fof(negated, negated_conjecture, ~ at(parcel7, depot{hops}), inference(negate, [status(cth)], [arrives])).")
    lines.append(f"cnf(never_arrives, plain, ~at(parcel7, depot{hops}), inference(clausify, [status(thm)], [negated])).")
    lines.append("cnf(start_clause, plain, at(parcel7, depot0), inference(clausify, [status(thm)], [start])).")
    previous = "start_clause"
    for i in range(hops):
        lines.append(f"cnf(hop_{i}, plain, ~at(P, depot{i}) | at(P, depot{i + 1}), inference(clausify, [status(thm)], [route_{i}])).")
        lines.append(f"cnf(reached_{i + 1}, plain, at(parcel7, depot{i + 1}), inference(resolve, [status(thm)], [hop_{i}, {previous}])).")
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


def measure(directory: str, name: str, text: str, jobs: int = 1, problem_name: str = "problem.p") -> None:
    path = os.path.join(directory, name)
    with open(path, "w") as out:
        out.write(text)
    problem = os.path.join(directory, problem_name)
    started = time.perf_counter()
    report = check(path, problem, jobs=jobs)
    elapsed = time.perf_counter() - started
    # Memory in a second run: tracing allocations slows the run it traces.
    tracemalloc.start()
    check(path, problem)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    steps = len(report.steps)
    megabytes = len(text.encode()) / 1e6
    print(
        f"{name:>12} jobs={jobs}  {report.verdict:>9}  {steps:6d} steps  {elapsed:7.2f} s  "
        f"{steps / elapsed:8.0f} steps/s  {elapsed / megabytes:7.2f} s/MB  peak {peak / 1e6:7.1f} MB"
    )


def main() -> None:
    base = int(sys.argv[1]) if len(sys.argv) > 1 else 200
    for factor in (1, 10):
        hops = base * factor
        with tempfile.TemporaryDirectory() as directory:
            with open(os.path.join(directory, "problem.p"), "w") as out:
                out.write(problem_text(hops))
            with open(os.path.join(directory, "problem_fof.p"), "w") as out:
                out.write(formula_problem_text(hops))
            print(f"{hops} hops ({factor}x):")
            for jobs in (1, 2):
                measure(directory, "proof.jsonl", native_proof(hops), jobs)
                measure(directory, "proof.p", tptp_proof(hops), jobs)
                measure(directory, "proof_fof.p", formula_proof(hops), jobs, "problem_fof.p")


if __name__ == "__main__":
    main()
