"""Hostile inputs at full size, each checked through the command line with
the default input limits: prints the exit code, the first line of the
answer, the wall time and the peak memory of the process.  Figures only;
nothing is asserted.

Run: python3 bench/bench_hostile_input.py [--timeout SECONDS]
"""

from __future__ import annotations

import argparse
import json
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
REFUTE = "cnf(c2, axiom, ~p(X)).\ncnf(c3, plain, $false, inference(resolve, [status(thm)], [c1, c2])).\n"


def unifier_problem(n: int) -> str:
    xs = ",".join(f"X{i}" for i in range(1, n + 1))
    gs = ",".join(f"g(X{i - 1},X{i - 1})" for i in range(1, n + 1))
    return (f"cnf(c1, axiom, p(f({xs}))).\ncnf(c2, axiom, ~p(f({gs}))).\n"
            "cnf(c3, plain, $false, inference(resolve, [status(thm)], [c1, c2])).\n")


def cases(directory: Path) -> dict[str, Path]:
    """Each hostile input written into ``directory``."""
    texts = {
        "term nested 10^6 deep": "cnf(c1, axiom, p(" + "f(" * 10**6 + "a" + ")" * 10**6 + ")).\n" + REFUTE,
        "clause of 10^5 literals": "cnf(c1, axiom, " + " | ".join(f"p{i}(X)" for i in range(10**5)) + ").\n" + REFUTE,
        "name of 10^6 characters": f"cnf(c1, axiom, p(X) | {'a' * 10**6}(X)).\n" + REFUTE,
        "10^6 steps": "".join(f"cnf(c{i}, axiom, p{i % 7}(a)).\n" for i in range(10**6)),
        "self-referencing parent": "cnf(c1, plain, p(a), inference(r, [status(thm)], [c1])).\n"
                                   "cnf(c2, axiom, ~p(a)).\ncnf(c3, plain, $false, inference(resolve, [status(thm)], [c1, c2])).\n",
        "exponential unifier (n=200)": unifier_problem(200),
        "include of itself": "include('case.p').\ncnf(c1, axiom, p).\n",
        "include outside": "include('/etc/hostname').\ncnf(c1, axiom, p).\n",
        "fof with free variables": "fof(a1, axiom, ! [X] : door(X) => locked(X, Y)).\nfof(a2, axiom, door(d1)).\n",
    }
    written = {}
    for index, (label, text) in enumerate(texts.items()):
        folder = directory / str(index)
        folder.mkdir()
        (folder / "case.p").write_text(text)
        written[label] = folder / "case.p"
    deep_json = directory / "deep.jsonl"
    deep_json.write_text(json.dumps({"assay_certificate": 1}) + "\n" + "[" * 10**6 + "]" * 10**6 + "\n")
    written["JSON nested 10^6 deep"] = deep_json
    return written


def run(path: Path, timeout: float) -> tuple[str, str, float, float]:
    started = time.perf_counter()
    try:
        done = subprocess.run(["/usr/bin/time", "-f", "peak_kb=%M", sys.executable, "-m", "checker", "check", str(path)],
                              capture_output=True, text=True, timeout=timeout, cwd=ROOT)
    except subprocess.TimeoutExpired:
        return "timeout", "", time.perf_counter() - started, 0.0
    seconds = time.perf_counter() - started
    errors = done.stderr.strip().splitlines()
    peak = int(errors.pop().removeprefix("peak_kb=")) if errors and errors[-1].startswith("peak_kb=") else 0
    lines = [line for line in done.stdout.splitlines() if line.strip()]
    answer = lines[1] if len(lines) > 1 else (errors or [""])[-1]
    return str(done.returncode), answer, seconds, peak / 1024


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--timeout", type=float, default=600.0)
    options = parser.parse_args()
    print("hostile input | exit | answer | wall s | peak MB")
    with tempfile.TemporaryDirectory(prefix="assay-hostile-") as scratch:
        for label, path in cases(Path(scratch)).items():
            code, answer, seconds, peak = run(path, options.timeout)
            shown = answer.replace(str(path), "case")
            shown = shown if len(shown) <= 140 else shown[:137] + "..."
            print(f"{label:30} | {code:7} | {shown} | {seconds:6.1f} | {peak:6.0f}", flush=True)


if __name__ == "__main__":
    main()
