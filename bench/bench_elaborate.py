"""Check time of a derivation against that of its elaborated certificate.

For each valid fixture (or the derivations named), `assay elaborate` writes
the native certificate (version 2), then the original and the certificate
are each checked in a fresh process (so that no cache of one run helps the
other), several times; the figures are the smallest CPU seconds of each,
the ratio, and the certificate's size against the derivation's.  CPU
seconds are the fairer figure on a busy machine.

Run: python3 bench/bench_elaborate.py [--repeat N] [--corpus] [NAME ...]
"""

from __future__ import annotations

import argparse
import json
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
TPTP = ROOT / "fixtures" / "tptp"
FAST_CORPUS = (
    "boolean_algebra_absorption", "boolean_algebra_complement_unique", "boolean_algebra_idempotence",
    "group_commuting_inverse", "group_double_inverse", "group_inverse_of_product", "group_right_cancellation",
    "group_right_identity", "group_right_inverse", "group_squares_commute", "lattice_idempotence",
    "lattice_order_duality", "plant_startup_checklist",
)


# Timed in a process of its own, after assay is loaded: only the check counts.
_CHECK = """
import json, sys, time
from checker.run import check
started = time.process_time()
report = check(sys.argv[1], sys.argv[2] or None)
spent = time.process_time() - started
print(json.dumps({"cpu": spent, "outcomes": [step.outcome for step in report.steps], "verdict": report.verdict}))
"""


def _run(path: Path | str, problem: str) -> tuple[dict | None, float]:
    """The outcomes of one check in a fresh process, and its CPU seconds."""
    done = subprocess.run([sys.executable, "-c", _CHECK, str(path), problem], cwd=ROOT, capture_output=True, text=True, check=False)
    try:
        found = json.loads(done.stdout)
    except json.JSONDecodeError:
        return None, float("inf")
    return found, found["cpu"]


def _fixtures(corpus: bool) -> list[tuple[str, Path, Path | None]]:
    found = []
    for group in ("derivations", "splitting", "typed"):
        for folder in sorted((TPTP / group).iterdir()):
            if (folder / "proof.p").is_file():
                found.append((f"{group}/{folder.name}", folder / "proof.p", folder / "problem.p"))
    if corpus:
        for name in FAST_CORPUS:
            folder = TPTP / "prover_corpus" / name
            found.append((f"prover_corpus/{name}", folder / "proof.p", folder / "problem.p"))
    return found


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=3, help="checks of each file; the fastest counts")
    parser.add_argument("--corpus", action="store_true", help="also the prover corpus derivations that check fast")
    parser.add_argument("names", nargs="*", help="fixtures to run (substrings of group/name; default: all)")
    options = parser.parse_args()
    fixtures = _fixtures(options.corpus)
    if options.names:
        fixtures = [f for f in fixtures if any(name in f[0] for name in options.names)]
    print(f"{'fixture':52} {'steps':>5} {'orig cpu s':>10} {'cert cpu s':>10} {'ratio':>6} {'size x':>6}  outcomes")
    totals = [0.0, 0.0]
    with tempfile.TemporaryDirectory() as scratch:
        for label, derivation, problem in fixtures:
            out = os.path.join(scratch, label.replace("/", "_") + ".jsonl")
            given = ["--problem", str(problem)] if problem and problem.exists() else []
            started = time.perf_counter()
            made = subprocess.run([sys.executable, "-m", "checker", "elaborate", str(derivation), "-o", out, *given],
                                  cwd=ROOT, capture_output=True, text=True, check=False)
            if made.returncode != 0:
                print(f"{label:52} not elaborated (exit {made.returncode}, {time.perf_counter() - started:.1f} s)")
                continue
            original = min((_run(derivation, given[-1] if given else "") for _ in range(options.repeat)),
                           key=lambda r: r[1])
            elaborated = min((_run(out, "") for _ in range(options.repeat)), key=lambda r: r[1])
            if original[0] is None or elaborated[0] is None:
                print(f"{label:52} no report")
                continue
            outcomes: dict[str, int] = {}
            for outcome in elaborated[0]["outcomes"]:
                outcomes[outcome] = outcomes.get(outcome, 0) + 1
            size = os.path.getsize(out) / os.path.getsize(derivation)
            totals[0] += original[1]
            totals[1] += elaborated[1]
            print(f"{label:52} {len(elaborated[0]['outcomes']):5} {original[1]:10.2f} {elaborated[1]:10.2f} "
                  f"{original[1] / max(elaborated[1], 1e-9):6.2f} {size:6.1f}  {outcomes}")
    print(f"{'total':52} {'':5} {totals[0]:10.2f} {totals[1]:10.2f} {totals[0] / max(totals[1], 1e-9):6.2f}")
    print("(CPU seconds of the check alone, in a fresh process, after loading assay)")


if __name__ == "__main__":
    main()
