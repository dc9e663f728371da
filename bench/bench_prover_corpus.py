"""Checking speed on derivations a saturation prover printed for problems of
our own (fixtures/tptp/prover_corpus): per derivation, the verdict, the
steps, wall and CPU seconds and steps per CPU second.  Each derivation is
checked in a process of its own, stopped after a wall-clock budget, so one
slow derivation cannot hold up the rest; CPU seconds are the fairer figure
on a busy machine.  With ``--before REV`` each derivation is also checked
by the code of git revision REV (exported to a temporary folder), and both
figures are printed side by side.

With ``--large`` the derivations are the long ones of
fixtures/tptp/prover_corpus/large (hundreds to thousands of steps, each
found by the prover in well under ten seconds).

Run: python3 bench/bench_prover_corpus.py [--budget SECONDS] [--before REV] [--corpus DIR | --large] [NAME ...]
"""

from __future__ import annotations

import argparse
import json
import resource
import subprocess
import sys
import tarfile
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
CORPUS = ROOT / "fixtures" / "tptp" / "prover_corpus"
LARGE = CORPUS / "large"  # 800 to 2,100 statements each (bench/large_problems.py wrote the problems)


def _children_cpu() -> float:
    usage = resource.getrusage(resource.RUSAGE_CHILDREN)
    return usage.ru_utime + usage.ru_stime


def run_one(folder: Path, budget: float, code: Path = ROOT) -> tuple[str, int, float, float]:
    """(verdict, steps, wall seconds, CPU seconds) for one derivation,
    checked by the code in ``code``."""
    command = [sys.executable, "-m", "checker", "check", str(folder / "proof.p"),
               "--problem", str(folder / "problem.p"), "--report", "json"]
    cpu, wall = _children_cpu(), time.perf_counter()
    try:
        done = subprocess.run(command, check=False, cwd=code, capture_output=True, text=True, timeout=budget)
    except subprocess.TimeoutExpired:
        return f"stopped after {budget:.0f} s", 0, time.perf_counter() - wall, _children_cpu() - cpu
    wall, cpu = time.perf_counter() - wall, _children_cpu() - cpu
    try:
        report = json.loads(done.stdout)
    except json.JSONDecodeError:
        return f"no report (exit {done.returncode})", 0, wall, cpu
    return report["verdict"], len(report["steps"]), wall, cpu


def export_revision(revision: str, into: Path) -> Path:
    """The checker's code at ``revision``, unpacked into ``into``."""
    archive = subprocess.run(["git", "archive", revision, "checker", "formats"], cwd=ROOT,
                             capture_output=True, check=True).stdout
    with tempfile.TemporaryFile() as file:
        file.write(archive)
        file.seek(0)
        with tarfile.open(fileobj=file) as tar:
            tar.extractall(into, filter="data")
    return into


def compare(folders: list[Path], budget: float, revision: str) -> None:
    """Verdict and CPU seconds per derivation, at ``revision`` and now."""
    with tempfile.TemporaryDirectory() as folder:
        before_code = export_revision(revision, Path(folder))
        print(f"{'derivation':40} {'verdict before':22} {'cpu s':>7}   {'verdict now':22} {'cpu s':>7}")
        for derivation in folders:
            before, _, _, before_cpu = run_one(derivation, budget, before_code)
            now, _, _, now_cpu = run_one(derivation, budget)
            print(f"{derivation.name:40} {before:22} {before_cpu:7.1f}   {now:22} {now_cpu:7.1f}", flush=True)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--budget", type=float, default=600.0, help="wall seconds per derivation")
    parser.add_argument("--before", metavar="REV", help="also check with the code of this git revision")
    parser.add_argument("--corpus", type=Path, default=CORPUS, help="folder of derivation folders")
    parser.add_argument("--large", action="store_const", dest="corpus", const=LARGE, help="the long derivations")
    parser.add_argument("names", nargs="*", help="derivations to run (default: all)")
    options = parser.parse_args()
    folders = sorted(f for f in options.corpus.resolve().iterdir() if (f / "proof.p").is_file())
    if options.names:
        folders = [f for f in folders if f.name in options.names]
    if options.before:
        compare(folders, options.budget, options.before)
        return
    print(f"{'derivation':40} {'verdict':22} {'steps':>5} {'wall s':>8} {'cpu s':>8} {'steps/cpu s':>11}")
    total_steps, total_cpu = 0, 0.0
    for folder in folders:
        verdict, steps, wall, cpu = run_one(folder, options.budget)
        rate = steps / cpu if cpu > 0 else 0.0
        total_steps, total_cpu = total_steps + steps, total_cpu + cpu
        print(f"{folder.name:40} {verdict:22} {steps:5d} {wall:8.1f} {cpu:8.1f} {rate:11.1f}", flush=True)
    print(f"{'total':40} {'':22} {total_steps:5d} {'':8} {total_cpu:8.1f}")


if __name__ == "__main__":
    main()
