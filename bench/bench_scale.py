"""Checking speed and memory as derivations grow, beside a general-purpose
solver checking every step on its own.

For each size (default 10^3 and 10^4 steps; add 100000 on the command line
for 10^5) a derivation from bench/generate.py is written in TPTP (evidence
stated as ``bind(...)`` where a single inference has one, bundled steps
left to search) and as a native certificate (every clause step with its
evidence), and each is checked in a fresh process.  Printed per run:
steps/s and s/MB (CPU seconds of the checking process, the fairer figure on
a shared machine), peak RSS, and the time split into read (the readers),
plan (ordering, symbol tables, branches), search (everything proposing
evidence), kernel (the trusted replay), report (rendering).  Then
time(10x)/time(1x) between consecutive sizes, ``--jobs 2`` against
``--jobs 1`` (wall clock, and the wall time two idle cores would take,
from CPU seconds: on a shared machine the wall clock says little), and the baseline: each clause step's premises and negated
conclusion as one quantified z3 query (needs the ``bench`` extra), on a
sample of steps, with assay's speed-up over it.

Run: python3 bench/bench_scale.py [SIZE ...] [--baseline-sample N] [--jobs-size N]
"""

from __future__ import annotations

import argparse
import json
import os
import resource
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path[:0] = [str(ROOT), str(ROOT / "bench")]

from generate import generate, write

STAGES = ("read", "plan", "search", "kernel", "report")
KERNEL_MODULES = ("rules", "entailment", "introductions", "models", "propositional", "clausify")
PLAN_FUNCTIONS = ("make_plan", "with_cited_problem_statements", "build_symbol_table", "trace_branches",
                  "_nested_by_outer", "one_conjecture_at_a_time", "reaches_refutation", "with_splitting_details")


class StageClock:
    """Exclusive CPU time per stage: entering a stage pauses the one it was
    called from, so a kernel replay inside a search is counted once."""

    def __init__(self) -> None:
        self.spent = dict.fromkeys(STAGES, 0.0)
        self.stack: list[list] = []

    def wrap(self, stage: str, function):
        def timed(*args, **kwargs):
            now = time.process_time()
            if self.stack:
                outer = self.stack[-1]
                self.spent[outer[0]] += now - outer[1]
            self.stack.append([stage, now])
            try:
                return function(*args, **kwargs)
            finally:
                done = time.process_time()
                self.spent[stage] += done - self.stack.pop()[1]
                if self.stack:
                    self.stack[-1][1] = done

        timed.__wrapped__ = function
        return timed


def _instrument(clock: StageClock) -> None:
    """Time every call into the kernel's checks from outside the kernel,
    the readers and the planning functions, wherever they were imported."""
    import checker.run
    import checker.search.reconstruct  # noqa: F401

    kernel = tuple(f"checker.kernel.{name}" for name in KERNEL_MODULES)
    for module_name, module in list(sys.modules.items()):
        if not module_name.startswith(("checker", "formats")) or module_name.startswith("checker.kernel"):
            continue
        for attribute, value in list(vars(module).items()):
            if not callable(value) or isinstance(value, type) or not hasattr(value, "__module__"):
                continue
            if value.__module__ in kernel:
                setattr(module, attribute, clock.wrap("kernel", value))
            elif module_name == "checker.run" and attribute in ("read_document", "read_problem", "read_tptp"):
                setattr(module, attribute, clock.wrap("read", value))
            elif attribute in PLAN_FUNCTIONS and module_name == "checker.run":
                setattr(module, attribute, clock.wrap("plan", value))


def run_one(path: str, problem: str, jobs: int) -> dict:
    """Check one certificate in this (fresh) process; figures as a dict."""
    clock = StageClock()
    _instrument(clock)
    import checker.run
    from checker.report import render_text
    from checker.run import check

    read_by_children = []  # the reading processes' CPU seconds, taken once reading is over
    planning = checker.run.make_plan

    def make_plan(*args, **kwargs):
        read_by_children.append(_children_cpu())
        return planning(*args, **kwargs)

    checker.run.make_plan = make_plan
    started, wall = time.process_time(), time.perf_counter()
    report = clock.wrap("search", check)(path, problem, jobs=jobs)
    clock.wrap("report", render_text)(report, verbose=True)
    own = time.process_time() - started
    return {
        "verdict": report.verdict,
        "steps": len(report.steps),
        "cpu": own + _children_cpu(),
        "own_cpu": own,
        "checking_children_cpu": _children_cpu() - read_by_children[0],
        "wall": time.perf_counter() - wall,
        "stages": clock.spent,
        "peak_rss_mb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
    }


def _children_cpu() -> float:
    children = resource.getrusage(resource.RUSAGE_CHILDREN)
    return children.ru_utime + children.ru_stime


def on_free_cores(figures: dict, jobs: int) -> float:
    """The wall time the run would take with ``jobs`` idle cores, from CPU
    seconds (on a loaded machine the wall clock says little): this
    process's own CPU (reading its part, planning, adding up; reading
    workers run alongside it), plus the checking workers' CPU shared out."""
    return figures["own_cpu"] + figures["checking_children_cpu"] / jobs


def measure(path: str, problem: str, jobs: int = 1) -> dict:
    command = [sys.executable, __file__, "--one", path, problem, str(jobs)]
    done = subprocess.run(command, check=False, capture_output=True, text=True, cwd=ROOT)
    if done.returncode != 0:
        raise SystemExit(f"measuring {path} failed:\n{done.stderr}")
    return json.loads(done.stdout)


def show(label: str, size_bytes: int, figures: dict) -> None:
    cpu = figures["cpu"]
    split = "  ".join(f"{stage} {figures['stages'][stage] / cpu:4.0%}" for stage in STAGES)
    print(f"  {label:14} {figures['verdict']:9} {figures['steps']:7d} steps  cpu {cpu:7.2f} s  "
          f"wall {figures['wall']:7.2f} s  {figures['steps'] / cpu:8.0f} steps/s  "
          f"{size_bytes / 1e6 / cpu:5.2f} MB/s  {cpu / (size_bytes / 1e6):6.2f} s/MB  "
          f"peak RSS {figures['peak_rss_mb']:6.0f} MB (input {size_bytes / 1e6:5.1f} MB)  [{split}]", flush=True)


# ------------------------------------------------------------ the z3 baseline


def _z3_term(term, functions, variables, z3, sort):
    from checker.kernel.terms import post_order

    built = {}
    for node in post_order(term):
        if node.is_variable:
            built[node] = variables.setdefault(node.symbol, z3.Const(node.symbol, sort))
        else:
            key = (node.symbol, node.arity)
            if key not in functions:
                functions[key] = z3.Function(f"{node.symbol}_{node.arity}", *([sort] * node.arity), sort)
            built[node] = functions[key](*(built[a] for a in node.arguments))
    return built[term]


def _z3_clause(clause, predicates, functions, z3, sort):
    variables: dict = {}
    disjuncts = []
    for literal in clause.literals:
        atom = literal.atom
        arguments = [_z3_term(a, functions, variables, z3, sort) for a in atom.arguments]
        if atom.symbol == "=" and atom.arity == 2:
            formula = arguments[0] == arguments[1]
        else:
            key = (atom.symbol, atom.arity)
            if key not in predicates:
                predicates[key] = z3.Function(f"p_{atom.symbol}_{atom.arity}", *([sort] * atom.arity), z3.BoolSort())
            formula = predicates[key](*arguments)
        disjuncts.append(formula if literal.positive else z3.Not(formula))
    body = z3.Or(*disjuncts) if disjuncts else z3.BoolVal(False)
    return z3.ForAll(list(variables.values()), body) if variables else body


def z3_baseline(native_path: str, sample: int) -> tuple[int, int, float]:
    """(steps tried, steps shown, CPU seconds): every ``len // sample``-th
    clause step of the certificate as one query premises ∧ ¬conclusion,
    expected unsat."""
    import z3

    from checker.kernel.clauses import Clause
    from formats.native import read_native

    document = read_native(native_path)
    clauses = {s.name: s.content for s in document.statements if isinstance(s.content, Clause)}
    steps = [s for s in document.statements
             if s.source is not None and hasattr(s.source, "parents") and s.name in clauses
             and all(getattr(p, "name", None) in clauses for p in s.source.parents)]
    stride = max(1, len(steps) // sample)
    chosen = steps[::stride][:sample]
    shown, started = 0, time.process_time()
    for step in chosen:
        sort = z3.DeclareSort("U")
        predicates, functions = {}, {}
        solver = z3.Solver()
        solver.set("timeout", 10_000)
        for parent in step.source.parents:
            solver.add(_z3_clause(clauses[parent.name], predicates, functions, z3, sort))
        solver.add(z3.Not(_z3_clause(step.content, predicates, functions, z3, sort)))
        shown += solver.check() == z3.unsat
    return len(chosen), shown, time.process_time() - started


# ------------------------------------------------------------ main


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("sizes", nargs="*", type=int, default=[1000, 10000])
    parser.add_argument("--baseline-sample", type=int, default=300, help="clause steps sent to z3 per size (0: no baseline)")
    parser.add_argument("--jobs-size", type=int, default=10000, help="the size also checked with --jobs 2")
    parser.add_argument("--one", nargs=3, help=argparse.SUPPRESS)
    options = parser.parse_args()
    if options.one:
        print(json.dumps(run_one(options.one[0], options.one[1], int(options.one[2]))))
        return
    previous: dict[str, float] = {}
    for size in options.sizes:
        with tempfile.TemporaryDirectory() as directory:
            paths = write(generate(size), directory)
            print(f"{size} steps:", flush=True)
            for kind in ("native", "tptp"):
                size_bytes = os.path.getsize(paths[kind])
                figures = measure(paths[kind], paths["problem"])
                show(kind, size_bytes, figures)
                if kind in previous:
                    print(f"  {kind:14} time({size}) / time(previous size) = {figures['cpu'] / previous[kind]:.1f}")
                previous[kind] = figures["cpu"]
                if size == options.jobs_size:
                    pair = measure(paths[kind], paths["problem"], jobs=2)
                    show(f"{kind} --jobs 2", size_bytes, pair)
                    print(f"  {kind:14} --jobs 2 is {figures['wall'] / pair['wall']:.2f}x faster (wall, under the "
                          f"load of the moment), {figures['cpu'] / on_free_cores(pair, 2):.2f}x on two free cores "
                          f"(from CPU s: {pair['own_cpu']:.2f} s in the main process, "
                          f"{pair['checking_children_cpu']:.2f} s in the checking workers)", flush=True)
                if kind == "native":
                    native_rate = figures["steps"] / figures["cpu"]
            if options.baseline_sample <= 0:
                continue
            try:
                tried, shown, seconds = z3_baseline(paths["native"], options.baseline_sample)
            except ImportError:
                print("  z3 baseline: z3-solver not installed (pip install -e '.[bench]')")
                continue
            rate = tried / seconds
            print(f"  z3 per step    {shown}/{tried} clause steps shown, {rate:8.0f} steps/s; "
                  f"assay native is {native_rate / rate:.1f}x faster", flush=True)


if __name__ == "__main__":
    main()
