"""Clausification steps: Skolemization, definitions and the negated
conjecture, each broken in one way and rejected for the right reason.

Every mutant fixture names its broken step and the expected reason in
machine-readable comments (`% broken-step: NAME`, `% reason: REASON`); the
correct fixtures beside them must be accepted.  The scenarios are invented.
"""

import re
from pathlib import Path

import pytest

from checker.kernel.entailment import check_entailment
from checker.kernel.formulas import universal_closure
from checker.outcomes import ACCEPTED, FAILED, REJECTED, RECONSTRUCTED
from checker.run import check
from checker.search.entailment import find_entailment
from checker.search.reconstruct import DEFAULT_LIMITS
from formats.tptp import read_tptp

CLAUSIFICATION = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "clausification"


def expectation(path: Path) -> tuple[str, str] | None:
    """The (broken step, reason) a mutant fixture announces, or None."""
    text = path.read_text()
    step = re.search(r"^% broken-step: (\S+)$", text, re.MULTILINE)
    reason = re.search(r"^% reason: (\S+)$", text, re.MULTILINE)
    assert (step is None) == (reason is None), path.name
    return None if step is None else (step.group(1), reason.group(1))


DERIVATIONS = sorted(p for p in CLAUSIFICATION.glob("*.p") if not p.name.endswith("_problem.p"))
MUTANTS = [p for p in DERIVATIONS if expectation(p)]
CORRECT = [p for p in DERIVATIONS if not expectation(p)]


def test_the_fixture_set_covers_every_kind_of_mutant():
    # The list: Skolemization (problem constant, missing variable,
    # symbol introduced twice, negative-polarity existential), definitions,
    # negated conjecture (negation dropped, changed, another conjecture's).
    names = {p.stem for p in MUTANTS}
    assert {
        "skolem_witness_is_problem_constant",
        "skolem_function_missing_variable",
        "skolem_symbol_introduced_twice",
        "skolem_existential_negative_polarity",
        "definition_symbol_not_fresh",
        "definition_arguments_dropped",
        "definition_circular",
        "negated_conjecture_negation_dropped",
        "negated_conjecture_changed",
        "negated_conjecture_other_conjecture",
    } <= names
    assert {p.stem for p in CORRECT} >= {"valve_interlock_refutation", "badge_access_refutation"}


@pytest.mark.parametrize("path", MUTANTS, ids=lambda p: p.stem)
def test_mutant_is_rejected_at_its_broken_step_for_its_reason(path):
    broken, reason = expectation(path)
    report = check(str(path))
    assert report.verdict == REJECTED
    failure = report.first_failure
    assert failure.name == broken
    assert f"reason: {reason}" in failure.details or reason in failure.message
    # The mutant is a refutation in every other respect: no other step is
    # refuted or failed.
    others = [s.name for s in report.steps if s.is_problem and s.name != broken]
    assert others == []


@pytest.mark.parametrize("path", CORRECT, ids=lambda p: p.stem)
def test_correct_clausification_is_accepted(path):
    report = check(str(path))
    assert report.verdict == ACCEPTED, report.first_failure
    assert report.problem is not None


def results(name: str) -> dict:
    return {step.name: step for step in check(str(CLAUSIFICATION / name)).steps}


def test_problem_constant_as_witness_names_where_it_occurs():
    failure = results("skolem_witness_is_problem_constant.p")["s1"]
    assert "`guard/0`" in failure.message
    assert "vault_keys_problem.p:5:1" in failure.message


def test_missing_dependency_names_the_forgotten_variable():
    failure = results("skolem_function_missing_variable.p")["s1"]
    assert "`sk1(W)`" in failure.message
    assert "does not depend on D" in failure.message


def test_the_second_introducer_of_a_symbol_is_blamed_and_names_the_first():
    steps = results("skolem_symbol_introduced_twice.p")
    assert steps["s1"].outcome != FAILED
    assert steps["s2"].outcome == FAILED
    assert "`sk1/0`" in steps["s2"].message
    assert "already introduced by step `s1`" in steps["s2"].message


def test_negative_polarity_replacement_is_rejected_although_it_follows():
    # Common practice: (? [V] : q(V)) => p entails q(c) => p for any c (an
    # instance of the universal it is equivalent to), so no counter-model
    # exists; the step is refused by the structural rule alone.
    document = read_tptp(str(CLAUSIFICATION / "skolem_existential_negative_polarity.p"))
    statements = {s.name: s for s in document.statements}
    premise = universal_closure(statements["open_valve_stops_pump"].content)
    conclusion = universal_closure(statements["s1"].content)
    chain = find_entailment([premise], conclusion, DEFAULT_LIMITS)
    assert chain is not None and check_entailment([premise], conclusion, chain) is None
    failure = results("skolem_existential_negative_polarity.p")["s1"]
    assert "`? [V] : open_valve(V)`" in failure.message


def test_definition_leaf_of_a_fresh_symbol_is_accepted_and_used():
    steps = results("badge_access_refutation.p")
    assert steps["d1"].outcome == RECONSTRUCTED
    assert "`escorted_badge/1`" in steps["d1"].message
    # The step that names the subformula uses the definition as a premise.
    assert steps["a1"].outcome == RECONSTRUCTED


def test_definition_mutants_say_what_is_wrong_with_the_definition():
    assert "`visitor/1`" in results("definition_symbol_not_fresh.p")["d1"].message
    assert "{U}" in results("definition_arguments_dropped.p")["d1"].message
    assert "`override`" in results("definition_circular.p")["d1"].message


def test_each_conjecture_of_a_two_conjecture_problem_stands_alone():
    # The TPTP language standard, conjecture role (from memory): with
    # several conjectures, each is to be proved separately.  The refutation of the first is
    # accepted; the same refutation passed off as one of the second is not.
    first = check(str(CLAUSIFICATION / "negated_conjecture_first_of_two.p"))
    other = check(str(CLAUSIFICATION / "negated_conjecture_other_conjecture.p"))
    assert first.verdict == ACCEPTED
    assert other.verdict == REJECTED
    assert other.first_failure.name == "n1"
    assert Path(first.problem).name == Path(other.problem).name == "parcel_two_conjectures_problem.p"
