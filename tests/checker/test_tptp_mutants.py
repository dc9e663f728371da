"""End to end: every mutated TPTP derivation is rejected at its mutated step.

Each mutant (fixtures/tptp/derivations/*/mutant_*.p) is a copy of a valid
derivation made logically wrong at exactly one step, the one its header
names; the steps after it were rewritten where needed so that they are
correct from the wrong claim.  So assay must not accept it, must name that
step first, and must find nothing else wrong.  Which steps are wrong was
decided by hand against the rules as published (see
tests/checker/test_tptp_derivations.py); the ground ones are also
confirmed with a SAT solver in tests/search/test_ground_steps_sat.py.
"""

from __future__ import annotations

import pytest
from tptp_derivation_files import label, mutants

from checker.kernel.clauses import Clause
from checker.outcomes import ACCEPTED, ASSUMED, CHECKED, FAILED, RECONSTRUCTED, UNFOUNDED
from checker.report import report_json
from checker.run import check
from formats.derivation import Inference
from formats.tptp import read_tptp

MUTANTS = mutants()


def _report(mutant):
    return check(str(mutant.path), problem=str(mutant.problem))


@pytest.mark.parametrize("mutant", MUTANTS, ids=lambda m: label(m.path))
def test_mutant_is_not_accepted_and_fails_first_at_the_mutated_step(mutant):
    # Expected: the step named in the header is the one wrong step (checked by hand).
    report = _report(mutant)
    assert report.verdict != ACCEPTED
    failure = report.first_failure
    assert failure is not None, report.error
    assert failure.name == mutant.broken_step, f"{failure.name} {failure.outcome}: {failure.message}"
    assert report_json(report)["first_failure"]["step"] == mutant.broken_step
    others = [step for step in report.steps if step.name != mutant.broken_step]
    wrongly_blamed = [f"{s.name}: {s.outcome}: {s.message}" for s in others
                      if s.outcome not in (CHECKED, RECONSTRUCTED, ASSUMED, UNFOUNDED)]
    assert wrongly_blamed == []
    # A step below the broken one is sound on its own but rests on it.
    roots = {s.details[0].removeprefix("rests on: ").partition("/")[0] for s in others if s.outcome == UNFOUNDED}
    assert roots <= {mutant.broken_step}


@pytest.mark.parametrize("mutant", [m for m in MUTANTS if m.expected_message], ids=lambda m: label(m.path))
def test_mutant_diagnosis_says_what_is_wrong(mutant):
    failure = _report(mutant).first_failure
    assert failure is not None and failure.name == mutant.broken_step
    assert mutant.expected_message in failure.message


@pytest.mark.parametrize("mutant", MUTANTS, ids=lambda m: label(m.path))
def test_mutant_header_names_a_changed_step_of_the_mutant(mutant):
    broken = [s for s in read_tptp(str(mutant.path)).statements if s.name == mutant.broken_step]
    assert len(broken) == 1, f"no step {mutant.broken_step!r} in {mutant.path.name}"
    original = [s for s in read_tptp(str(mutant.valid)).statements if s.name == mutant.broken_step]
    if original:
        changed = broken[0].content != original[0].content or repr(broken[0].source) != repr(original[0].source)
        assert changed, "the named step is the same as in proof.p"


LEAF_MUTANTS = [m for m in MUTANTS if m.expected_message == "not in the problem"]


def test_several_mutants_cite_a_leaf_absent_from_the_problem():
    assert len(LEAF_MUTANTS) >= 4


@pytest.mark.parametrize("mutant", LEAF_MUTANTS, ids=lambda m: label(m.path))
def test_a_leaf_absent_from_the_problem_is_rejected_as_not_in_the_problem_at_that_leaf(mutant):
    # TPTP language: a leaf's file('problem.p', name) source cites an input of the problem;
    # these mutants' broken leaf states a clause or formula the problem does not have.
    report = _report(mutant)
    failure = report.first_failure
    assert report.verdict == "rejected"
    assert failure.name == mutant.broken_step and failure.outcome == FAILED
    assert "not in the problem" in failure.message
    lines = mutant.path.read_text(encoding="utf-8").splitlines()
    line = next(n for n, text in enumerate(lines, start=1) if text.startswith((f"cnf({failure.name},", f"fof({failure.name},")))
    assert failure.location.line == line and failure.location.column == 1


def test_an_axiom_of_an_included_file_that_the_problem_does_not_select_is_not_in_the_problem():
    # TPTP language: include('file', [names]) brings in only the named formulas.
    mutant = next(m for m in MUTANTS if m.path.stem == "mutant_axiom_not_selected")
    failure = _report(mutant).first_failure
    assert failure.name == "trusted_zone_open" and "not in the problem" in failure.message


def test_a_wrong_stated_binding_fails_although_another_unifier_would_have_worked():
    """The broken step claims exactly what the valid derivation's step
    claims (which is accepted there); only the stated binding differs."""
    binding_mutants = [m for m in MUTANTS if "wrong_binding" in m.path.stem]
    assert len(binding_mutants) >= 3
    for mutant in binding_mutants:
        broken = {s.name: s for s in read_tptp(str(mutant.path)).statements}[mutant.broken_step]
        original = {s.name: s for s in read_tptp(str(mutant.valid)).statements}[mutant.broken_step]
        assert isinstance(broken.content, Clause) and broken.content == original.content
        assert isinstance(broken.source, Inference)
        assert [p.name for p in broken.source.parents] == [p.name for p in original.source.parents]
        assert [p.bindings for p in broken.source.parents] != [p.bindings for p in original.source.parents]
        failure = _report(mutant).first_failure
        assert failure.name == mutant.broken_step
        assert failure.outcome == FAILED and "reason: wrong_bindings" in failure.details
        assert "the stated bindings of premise" in failure.message


def test_the_mutants_cover_the_kinds_of_error_a_prover_makes():
    kinds = " ".join(mutant.path.stem for mutant in MUTANTS)
    for kind in (
        "sign_flipped", "wrong_symbol", "dropped", "wrong_binding", "not_in_problem",
        "wrong_parent", "skolem_reused_constant", "rewrite_wrong_equation",
    ):
        assert kind in kinds, kind
