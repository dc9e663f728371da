"""Mutation testing of the trusted kernel: how many small changes to
checker/kernel/ the kernel's own tests (tests/kernel/) notice.

Runs mutmut in a scratch copy of the project (so nothing in the working
tree is touched), with the property tests replaying a fixed, smaller
sequence of examples, then prints the kill rate and every surviving
mutant with its diff.  Survivors are reviewed in
checker/kernel/MUTANTS.md (equivalent, or killed by a test added since).

Prints figures, asserts nothing.  Usage:
    python3 bench/bench_kernel_mutation.py [--jobs N] [--scratch DIR] [--examples N]
        [--module substitution.py --tests test_substitution.py ...]   (a part of the kernel)
Needs ``pip install mutmut`` (3.x).  Takes an hour or more on two cores.
"""

from __future__ import annotations

import argparse
import shutil
import subprocess
import sys
from collections import Counter
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
# mutmut's own module imported under its package name (not as __main__), so that
# the mutated code's import of it does not set the process start method twice.
MUTMUT = [sys.executable, "-c", "import sys; from mutmut.__main__ import cli; sys.exit(cli())"]

PROFILE = '''
# Added by bench/bench_kernel_mutation.py: a fixed, smaller replay of the
# property tests, so each mutant is judged quickly and the same way every run.
settings.register_profile("kernel-mutation", derandomize=True, max_examples={examples}, deadline=None, database=None)
settings.load_profile("kernel-mutation")
'''


def prepare(scratch: Path, examples: int, modules: list[str], tests: list[str]) -> None:
    """A copy of the project with only the kernel's tests, and mutmut's settings."""
    if scratch.exists():
        shutil.rmtree(scratch)
    scratch.mkdir(parents=True)
    shutil.copytree(ROOT / "checker", scratch / "checker", ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copytree(ROOT / "formats", scratch / "formats", ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copytree(ROOT / "tests" / "kernel", scratch / "tests" / "kernel", ignore=shutil.ignore_patterns("__pycache__"))
    conftest = (ROOT / "tests" / "conftest.py").read_text(encoding="utf-8")
    conftest = "\n".join(line for line in conftest.splitlines() if not line.startswith("pytest_plugins"))
    (scratch / "tests" / "conftest.py").write_text(conftest + PROFILE.format(examples=examples), encoding="utf-8")
    also = sorted(str(p.relative_to(scratch)) for p in (scratch / "checker").iterdir() if p.name != "kernel")
    mutated = [f"checker/kernel/{m}" for m in modules] or ["checker/kernel/"]
    kernel_tests = [f"tests/kernel/{t}" for t in tests] or ["tests/kernel/"]
    lines = ["[mutmut]", "paths_to_mutate=", *(f"    {m}" for m in mutated), "tests_dir=", *(f"    {t}" for t in kernel_tests)]
    if modules:
        also = [*also, *(f"checker/kernel/{p.name}" for p in (ROOT / "checker" / "kernel").glob("*.py") if p.name not in modules)]
    lines.append("also_copy=")
    lines += [f"    {path}" for path in [*also, "formats"]]
    (scratch / "setup.cfg").write_text("\n".join(lines) + "\n", encoding="utf-8")


def results(scratch: Path) -> list[tuple[str, str]]:
    """(mutant, status) pairs as mutmut lists them."""
    shown = subprocess.run(
        [*MUTMUT, "results", "--all", "true"],
        cwd=scratch, capture_output=True, text=True, check=False,
    ).stdout
    pairs = []
    for line in shown.splitlines():
        name, _, status = line.strip().partition(": ")
        if name and status:
            pairs.append((name, status))
    return pairs


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--jobs", type=int, default=2)
    parser.add_argument("--scratch", type=Path, default=Path("/tmp/assay-kernel-mutation"))
    parser.add_argument("--examples", type=int, default=20, help="hypothesis examples per property test")
    parser.add_argument("--report-only", action="store_true", help="print the figures of an earlier run")
    parser.add_argument("--module", action="append", default=[], help="mutate only this kernel file (repeatable)")
    parser.add_argument("--tests", action="append", default=[], help="run only this file of tests/kernel (repeatable)")
    options = parser.parse_args()
    if not options.report_only:
        prepare(options.scratch, options.examples, options.module, options.tests)
        subprocess.run([*MUTMUT, "run", "--max-children", str(options.jobs)],
                       cwd=options.scratch, check=False)
    pairs = results(options.scratch)
    tally = Counter(status for _, status in pairs)
    judged = sum(n for status, n in tally.items() if status not in ("not checked", "skipped"))
    killed = tally["killed"] + tally["timeout"] + tally["segfault"]
    print(f"\nkernel mutants: {len(pairs)}  " + ", ".join(f"{n} {s}" for s, n in sorted(tally.items())))
    if judged:
        print(f"kill rate: {killed}/{judged} = {100 * killed / judged:.1f}% (timeouts and crashes count as killed)")
    for name, status in pairs:
        if status in ("survived", "no tests"):
            diff = subprocess.run([*MUTMUT, "show", name], cwd=options.scratch,
                                  capture_output=True, text=True, check=False).stdout
            print(f"\n--- {name} ({status})\n{diff.strip()}")


if __name__ == "__main__":
    main()
