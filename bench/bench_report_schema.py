"""The JSON report of every fixture, the prover corpus included, against
formats/check_report.schema.json, with the default search bounds; and
whether two runs with different hash seeds and --jobs give the same bytes.
Prints one line per fixture (schema errors, identical or not) and totals;
it asserts nothing (the tests validate every fixture but the corpus with
the smallest bounds, tests/checker/test_report_schema.py).

Run: python3 bench/bench_report_schema.py [--budget SECONDS] [PATH ...]
"""

from __future__ import annotations

import argparse
import json
import os
import subprocess
import sys
from pathlib import Path

import jsonschema

ROOT = Path(__file__).resolve().parents[1]
SCHEMA = json.loads((ROOT / "formats" / "check_report.schema.json").read_text(encoding="utf-8"))


def _report(path: Path, seed: str, jobs: int, budget: float) -> bytes | None:
    problem = path.parent / "problem.p"
    extra = ["--problem", str(problem)] if problem.is_file() and problem != path else []
    try:
        completed = subprocess.run(
            [sys.executable, "-m", "checker", "check", str(path), *extra, "--report", "json", "--jobs", str(jobs)],
            check=False, capture_output=True, cwd=ROOT, env={**os.environ, "PYTHONHASHSEED": seed}, timeout=budget,
        )
    except subprocess.TimeoutExpired:
        return None
    return completed.stdout


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--budget", type=float, default=300.0, help="wall seconds per check")
    parser.add_argument("paths", nargs="*", type=Path)
    arguments = parser.parse_args()
    paths = [p.resolve() for p in arguments.paths] or sorted(
        p for p in (ROOT / "fixtures").rglob("*") if p.is_file() and p.suffix in (".p", ".jsonl", ".txt")
    )
    validator = jsonschema.Draft202012Validator(SCHEMA)
    invalid = differing = timed_out = 0
    for path in paths:
        first = _report(path, "0", 1, arguments.budget)
        second = _report(path, "1", 2, arguments.budget) if first is not None else None
        if first is None or second is None:
            timed_out += 1
            print(f"{path.relative_to(ROOT)}: over the budget")
            continue
        errors = list(validator.iter_errors(json.loads(first)))
        invalid += bool(errors)
        differing += first != second
        print(f"{path.relative_to(ROOT)}: {len(errors)} schema errors, {'same bytes' if first == second else 'DIFFERENT bytes'}")
    print(f"{len(paths)} fixtures: {invalid} with schema errors, {differing} not byte-identical, {timed_out} over the budget")


if __name__ == "__main__":
    main()
