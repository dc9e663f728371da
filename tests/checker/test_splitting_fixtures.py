"""End to end: derivations with split symbols, guarded clauses and case
splits (fixtures/tptp/splitting/<scenario>/), each accepted, and each
single-change mutant rejected at the step its header names.

The scenarios are invented; the derivations are written in the TPTP
language with the annotation conventions described for splitting
(named components as in A. Voronkov, "AVATAR: The Architecture for
First-Order Theorem Provers", CAV 2014, from memory) and, for the
standard's own notation, the TPTP BNF rules <assumptions_record>
(``assumptions([...])``) and <intro_type> ``assumption``.  Expected
verdicts hold by construction: every problem is unsatisfiable, which
python-sat confirms on its ground instances below.
"""

from __future__ import annotations

import glob
import itertools
import os
import re

import pytest
from pysat.solvers import Minisat22
from sympy import symbols
from sympy.logic.boolalg import Implies, Not, Or
from sympy.logic.inference import satisfiable

from checker.kernel.clauses import Clause
from checker.outcomes import ACCEPTED, FAILED, REFUTED, REJECTED
from checker.report import report_json
from checker.run import check
from formats.tptp import read_tptp

ROOT = os.path.join(os.path.dirname(__file__), "..", "..", "fixtures", "tptp", "splitting")
SCENARIOS = sorted(os.path.basename(d) for d in glob.glob(os.path.join(ROOT, "*")) if os.path.isdir(d))
MUTANTS = sorted(
    (scenario, os.path.basename(path))
    for scenario in SCENARIOS
    for path in glob.glob(os.path.join(ROOT, scenario, "mutant_*.p"))
)
# Mutants that change a definition: a definition of a fresh symbol holds
# whatever it says, so the first step that relies on it is the one rejected.
REJECTED_DOWNSTREAM = {("conveyor_three_components", "mutant_component_shares_variable.p")}


def _path(scenario: str, name: str) -> str:
    return os.path.join(ROOT, scenario, name)


def test_enough_derivations():
    # The issue asks for at least 30 derivations in these shapes, with mutants.
    assert len(SCENARIOS) + len(MUTANTS) >= 30
    assert all(any(s == scenario for s, _ in MUTANTS) for scenario in SCENARIOS)


@pytest.mark.parametrize("scenario", SCENARIOS)
def test_the_derivation_is_accepted(scenario):
    report = check(_path(scenario, "proof.p"), _path(scenario, "problem.p"))
    assert report.verdict == ACCEPTED, report.first_failure


def _statement_lines(path: str) -> list[str]:
    with open(path, encoding="utf-8") as handle:
        return [line.rstrip("\n") for line in handle if not line.startswith("%")]


@pytest.mark.parametrize(("scenario", "mutant"), MUTANTS)
def test_the_mutant_is_rejected_where_its_header_says(scenario, mutant):
    path = _path(scenario, mutant)
    with open(path, encoding="utf-8") as handle:
        step, reason = re.search(r"% expected: rejected at (\S+) \((\w+)\)", handle.read()).groups()
    original, changed = _statement_lines(_path(scenario, "proof.p")), _statement_lines(path)
    differing = [new for old, new in zip(original, changed) if old != new]
    assert len(original) == len(changed) and len(differing) == 1, "a mutant changes exactly one statement"
    changed_step = re.match(r"\w+\((\w+),", differing[0]).group(1)
    if (scenario, mutant) not in REJECTED_DOWNSTREAM:
        assert changed_step == step
    report = check(path, _path(scenario, "problem.p"))
    assert report.verdict == REJECTED
    failure = report.first_failure
    assert (failure.name, failure.reason) == (step, reason), failure
    assert failure.outcome in (FAILED, REFUTED)


# ---------------------------------------------------------------- the problems are unsatisfiable


def _ground_instances(clauses: list[Clause]) -> list[list[tuple[bool, str]]]:
    """Every clause instantiated over the problem's constants (function-free problems)."""
    constants = sorted({str(t) for c in clauses for lit in c.literals for t in lit.atom.arguments if not t.is_variable})
    ground = []
    for clause in clauses:
        variables = sorted(clause.variables(), key=str)
        for values in itertools.product(constants, repeat=len(variables)):
            binding = dict(zip(map(str, variables), values))
            ground.append([(lit.positive, f"{lit.atom.symbol}({','.join(binding.get(str(a), str(a)) for a in lit.atom.arguments)})")
                           for lit in clause.literals])
    return ground


@pytest.mark.parametrize("scenario", SCENARIOS)
def test_the_problem_is_unsatisfiable(scenario):
    problem = read_tptp(_path(scenario, "problem.p"))
    contents = [s.content for s in problem.statements]
    if all(isinstance(c, Clause) for c in contents):
        # python-sat on the Herbrand instances over the problem's constants.
        ground = _ground_instances(contents)
        numbers = {atom: n for n, atom in enumerate(sorted({a for c in ground for _, a in c}), 1)}
        with Minisat22(bootstrap_with=[[numbers[a] if p else -numbers[a] for p, a in c] for c in ground]) as solver:
            assert solver.solve() is False
    else:
        # The one formula problem is propositional: SymPy decides it.
        assert scenario == "hangar_assumption_records"
        towed, serviced, logged, signed = symbols("towed serviced logged signed")
        formula = [Or(towed, serviced), Implies(towed, logged), Not(logged), Implies(serviced, signed), Not(signed)]
        assert satisfiable(formula[0] & formula[1] & formula[2] & formula[3] & formula[4]) is False


# ---------------------------------------------------------------- reports


def test_open_assumption_report_names_the_assumption_in_json():
    report = report_json(check(_path("depot_two_levels", "mutant_final_false_open.p"),
                               _path("depot_two_levels", "problem.p")))
    failure = report["first_failure"]
    assert failure["step"] == "s8" and failure["reason"] == "open_assumption"
    assert "rests on assumption `s1`: `loaded(X)` (a component of `shift`)" in failure["details"]


def test_a_failure_inside_a_branch_names_its_assumptions():
    report = check(_path("warehouse_three_levels", "mutant_innermost_never_closed.p"),
                   _path("warehouse_three_levels", "problem.p"))
    details = report.first_failure.details
    assert [d.split(":")[0] for d in details if d.startswith("rests on")] == [
        "rests on assumption `w1`", "rests on assumption `w3`", "rests on assumption `w5`"]


def test_a_failure_on_split_symbols_names_their_components():
    report = report_json(check(_path("interlock_two_components", "mutant_sat_missing_branch.p"),
                               _path("interlock_two_components", "problem.p")))
    details = report["first_failure"]["details"]
    assert "split symbol `spl0_1` names `open(v1)` (defined at `f1`)" in details
    assert "split symbol `spl0_2` names `! [X0] : alarm(X0)` (defined at `f2`)" in details


def test_a_failure_under_a_guard_names_the_guard():
    report = check(_path("gate_guarded", "mutant_guard_swapped.p"), _path("gate_guarded", "problem.p"))
    assert "guard: `sp2` (the step claims `$false` under it)" in report.first_failure.details


def test_the_other_side_names_the_branch_it_relies_on():
    report = check(_path("depot_two_levels", "mutant_closed_under_wrong_split.p"), _path("depot_two_levels", "problem.p"))
    assert "split clause `shift` and its closed branches (`s1` closed by `s4`)" in report.first_failure.message
