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
        [--cpu-factor F] [--recheck-factor R] [--resume] [--report-only] [--fresh-recheck]
Needs ``pip install mutmut`` (3.x).  Takes several hours on two cores for
the whole kernel; a module or two at a time is practical.
"""

from __future__ import annotations

import argparse
import json
import os
import shutil
import subprocess
import sys
from collections import Counter
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
# mutmut's own module imported under its package name (not as __main__), so that
# the mutated code's import of it does not set the process start method twice.
MUTMUT = [sys.executable, "-c", "import sys; from mutmut.__main__ import cli; sys.exit(cli())"]

# The same, with mutmut's limits replaced.  mutmut stops a mutant after 15 times
# its tests' estimated time of *wall clock* (and 30 times in CPU time); on a shared
# machine wall time says more about the neighbours than about the mutant, and 30
# times a minute of tests is a long wait for a loop.  Here a mutant is stopped
# after (estimated time + 1) * CPU_FACTOR seconds of *its own CPU time*, and wall
# time only stops it past WALL_FACTOR times that (a backstop, not a judge).
LIMITED = """
import hashlib, math, os, resource, signal, sys, threading, time
from datetime import datetime
from pathlib import Path
import mutmut.__main__ as mm

cpu_factor = float(os.environ["KERNEL_MUTATION_CPU_FACTOR"])
wall_factor = float(os.environ["KERNEL_MUTATION_WALL_FACTOR"])

class CpuLimit:
    RLIMIT_CPU = resource.RLIMIT_CPU

    @staticmethod
    def setrlimit(which, limits):
        # mutmut asks for ceil((estimate + 1) * 30 + CPU time so far): take the estimate back out.
        spent = time.process_time()
        limit = math.ceil(spent + (limits[0] - spent) / 30 * cpu_factor)
        resource.setrlimit(which, (limit, limit + 1))

def wall_backstop(mutants):
    files = {id(m): m for m, _, _ in mutants}.values()
    def watch():
        while True:
            time.sleep(5)
            now = datetime.now()
            for m in files:
                with mm.START_TIMES_BY_PID_LOCK:
                    started = dict(m.start_time_by_pid)
                for pid, start in started.items():
                    allowed = (m.estimated_time_of_tests_by_pid.get(pid, 0) + 1) * cpu_factor * wall_factor
                    if (now - start).total_seconds() > allowed:
                        try:
                            os.kill(pid, signal.SIGXCPU)
                        except ProcessLookupError:
                            pass
    return watch

def timed_stats(run_stats):
    # mutmut keeps the duration of a test's last phase (its teardown, near 0 s),
    # which makes every estimate 0: keep the sum of setup, call and teardown.
    def run(self, *, tests):
        totals = {}

        class Durations:
            def pytest_runtest_logreport(self, report):
                totals[report.nodeid] = totals.get(report.nodeid, 0) + report.duration

        execute = self.execute_pytest
        self.execute_pytest = lambda params, **kw: execute(params, **{**kw, "plugins": [*kw.get("plugins", []), Durations()]})
        try:
            return run_stats(self, tests=tests)
        finally:
            del self.execute_pytest
            mm.mutmut.duration_by_test.update(totals)
    return run

def keeping_results(create):
    # mutmut writes every file's mutants afresh on each run, and with them a record
    # of results all unchecked: a second run (--resume, the recheck of stopped
    # mutants) would forget the first.  Keep the earlier results of the same source.
    def create_again(filename, output_path):
        earlier = mm.SourceFileMutationData(path=filename)
        earlier.load()
        digest = hashlib.sha256(Path(filename).read_bytes()).hexdigest()
        mark = Path(str(earlier.meta_path) + ".source")
        same = mark.exists() and mark.read_text() == digest
        result = create(filename, output_path)
        if result.error is None:
            fresh = mm.SourceFileMutationData(path=filename)
            fresh.load()
            if same:
                fresh.exit_code_by_key = {k: earlier.exit_code_by_key.get(k) for k in fresh.exit_code_by_key}
                fresh.save()
            mark.write_text(digest)
        return result
    return create_again

mm.resource = CpuLimit
mm.timeout_checker = wall_backstop
mm.PytestRunner.run_stats = timed_stats(mm.PytestRunner.run_stats)
mm.create_mutants_for_file = keeping_results(mm.create_mutants_for_file)
sys.exit(mm.cli())
"""

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


INTERRUPTED = (-2, -9, -15)
"""Exit codes of a mutant whose run was stopped from outside (SIGINT, SIGKILL,
SIGTERM): mutmut has no status for them, and its listing stops there."""


def forget_interrupted(scratch: Path) -> None:
    """Mark the mutants of an interrupted run that were cut short as unchecked."""
    for meta in (scratch / "mutants").rglob("*.meta"):
        data = json.loads(meta.read_text(encoding="utf-8"))
        codes = data["exit_code_by_key"]
        if any(code in INTERRUPTED for code in codes.values()):
            data["exit_code_by_key"] = {k: None if c in INTERRUPTED else c for k, c in codes.items()}
            meta.write_text(json.dumps(data, indent=4), encoding="utf-8")


def results(scratch: Path) -> list[tuple[str, str]]:
    """(mutant, status) pairs as mutmut lists them."""
    forget_interrupted(scratch)
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


def mutmut(scratch: Path, arguments: list[str], cpu_factor: float, wall_factor: float) -> None:
    """One mutmut run with the CPU limit of LIMITED."""
    environment = {**os.environ, "KERNEL_MUTATION_CPU_FACTOR": str(cpu_factor),
                   "KERNEL_MUTATION_WALL_FACTOR": str(wall_factor)}
    subprocess.run([sys.executable, "-c", LIMITED, *arguments], cwd=scratch, env=environment, check=False)


def fresh_recheck(scratch: Path, survivors: list[str], tests: list[str]) -> set[str]:
    """The survivors that fail their tests when run in a process of their own.

    mutmut runs each mutant in a child forked from the process that ran the
    unmutated tests, so the kernel's hash-consing table is already full: a
    term the tests ask for is found, and a mutant of the code that makes new
    terms is never called.  A fresh interpreter starts with an empty table."""
    kernel_tests = [f"tests/kernel/{t}" for t in tests] or ["tests/kernel/"]
    killed = set()
    for name in survivors:
        environment = {**os.environ, "MUTANT_UNDER_TEST": name}
        run = subprocess.run([sys.executable, "-m", "pytest", "-x", "-q", "-p", "no:cacheprovider", *kernel_tests],
                             cwd=scratch / "mutants", env=environment, capture_output=True, check=False)
        if run.returncode != 0:
            killed.add(name)
    return killed


def module_of(mutant: str) -> str:
    """'checker.kernel.rules.x_resolve__mutmut_3' -> 'rules.py'."""
    return mutant.split(".")[2] + ".py"


def report(pairs: list[tuple[str, str]]) -> None:
    """A table per kernel module and in all: killed by a test, stopped by the limit, survived."""
    by_module: dict[str, Counter] = {}
    for name, status in pairs:
        by_module.setdefault(module_of(name), Counter())[status] += 1
    print(f"\n{'module':<18}{'mutants':>8}{'killed':>8}{'limit':>7}{'survived':>9}{'other':>7}  kill rate")
    total = Counter()
    for module, tally in [*sorted(by_module.items()), ("all", None)]:
        tally = tally if tally is not None else total
        if module != "all":
            total.update(tally)
        killed, limit = tally["killed"] + tally["segfault"] + tally["killed (fresh process)"], tally["timeout"]
        survived = tally["survived"] + tally["no tests"]
        other = sum(tally.values()) - killed - limit - survived
        judged = killed + limit + survived
        rate = f"{100 * (killed + limit) / judged:.1f}%" if judged else "-"
        print(f"{module:<18}{sum(tally.values()):>8}{killed:>8}{limit:>7}{survived:>9}{other:>7}  {rate}")
    print("(limit: stopped by the CPU limit, counted as killed; other: not checked, skipped, suspicious)")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--jobs", type=int, default=2)
    parser.add_argument("--scratch", type=Path, default=Path("/tmp/assay-kernel-mutation"))
    parser.add_argument("--examples", type=int, default=20, help="hypothesis examples per property test")
    parser.add_argument("--report-only", action="store_true", help="print the figures of an earlier run")
    parser.add_argument("--resume", action="store_true", help="go on with the mutants an earlier run left unchecked")
    parser.add_argument("--module", action="append", default=[], help="mutate only this kernel file (repeatable)")
    parser.add_argument("--tests", action="append", default=[], help="run only this file of tests/kernel (repeatable)")
    parser.add_argument("--cpu-factor", type=float, default=5,
                        help="stop a mutant after (its tests' estimated seconds + 1) * this much CPU time")
    parser.add_argument("--recheck-factor", type=float, default=30,
                        help="run the stopped mutants again with this factor, to tell slow from looping (0: no)")
    parser.add_argument("--wall-factor", type=float, default=20,
                        help="backstop: stop a mutant after this many times its CPU allowance in wall time")
    parser.add_argument("--fresh-recheck", action="store_true",
                        help="run every survivor again in a process of its own (see fresh_recheck)")
    options = parser.parse_args()
    if not options.report_only:
        if not options.resume:
            prepare(options.scratch, options.examples, options.module, options.tests)
        mutmut(options.scratch, ["run", "--max-children", str(options.jobs)], options.cpu_factor, options.wall_factor)
        stopped = [name for name, status in results(options.scratch) if status == "timeout"]
        if stopped and options.recheck_factor:
            print(f"\nrunning the {len(stopped)} stopped mutants again with CPU factor {options.recheck_factor}")
            mutmut(options.scratch, ["run", "--max-children", str(options.jobs), *stopped],
                   options.recheck_factor, options.wall_factor)
    pairs = results(options.scratch)
    if options.fresh_recheck:
        survivors = [name for name, status in pairs if status in ("survived", "no tests")]
        print(f"\nrunning the {len(survivors)} survivors again, each in a fresh process")
        killed = fresh_recheck(options.scratch, survivors, options.tests)
        pairs = [(name, "killed (fresh process)" if name in killed else status) for name, status in pairs]
    tally = Counter(status for _, status in pairs)
    print(f"\nkernel mutants: {len(pairs)}  " + ", ".join(f"{n} {s}" for s, n in sorted(tally.items())))
    report(pairs)
    for name, status in pairs:
        if status in ("survived", "no tests"):
            diff = subprocess.run([*MUTMUT, "show", name], cwd=options.scratch,
                                  capture_output=True, text=True, check=False).stdout
            print(f"\n--- {name} ({status})\n{diff.strip()}")


if __name__ == "__main__":
    main()
