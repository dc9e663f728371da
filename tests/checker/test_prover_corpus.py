"""End to end on derivations a saturation prover printed (fixtures/tptp/prover_corpus).

Each folder holds a problem of our own (problem.p: group, ring, lattice and
Boolean-algebra identities recalled from memory as classic textbook
exercises, and invented plant, access and logistics scenarios written as
first-order formulas with large conjunctions, disjunctions and nested
quantifiers) and the derivation a prover printed for it (proof.p, the text
between its proof-object markers, kept as printed).  Expected verdict: valid
by construction, since the prover found a proof of a statement we know to
be a theorem.  Mutants (mutant_*.p) are copies with one step made wrong by
hand; each header names the step and why it is wrong (a counter-model).

The whole corpus is slower than a test should be; the derivations checked
here are those that finish in seconds, and bench/bench_prover_corpus.py
runs all of them.
"""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from checker.outcomes import ACCEPTED, CHECKED, RECONSTRUCTED
from checker.report import report_json
from checker.run import check
from formats.derivation import Origin
from formats.tptp import read_tptp

CORPUS = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "prover_corpus"

FAST = (
    "access_policy_nested_quantifiers",
    "boolean_algebra_absorption",
    "boolean_algebra_complement_unique",
    "boolean_algebra_de_morgan",
    "boolean_algebra_idempotence",
    "boolean_algebra_involution",
    "boolean_ring_characteristic_two",
    "boolean_ring_commutative",
    "group_commuting_inverse",
    "group_double_inverse",
    "group_inverse_of_product",
    "group_right_cancellation",
    "group_right_identity",
    "group_right_inverse",
    "group_square_of_product",
    "group_squares_commute",
    "interlock_equivalences",
    "lattice_idempotence",
    "lattice_order_duality",
    "logistics_depot_cover",
    "maintenance_schedule_dnf",
    "plant_alarm_distribution",
    "plant_startup_checklist",
    "ring_minus_one_squared",
    # Once slow or undecided, now a second or two (rewriting records computed
    # by the prover's term order), and four written later.
    "boolean_algebra_consensus",
    "group_exponent_three_conjugate",
    "huntington_complement_constant",
    "ring_neg_product",
    "boolean_algebra_complement_of_mixed_join",
    "boolean_ring_anticommutative",
    "group_commutator_inverse",
    "lattice_dual_distributive",
)

MUTANTS = sorted(CORPUS.glob("*/mutant_*.p"))
_BROKEN = re.compile(r"^% broken-step: (\S+)\s*$", re.MULTILINE)


def _failure_text(report) -> str:
    failure = report.first_failure
    return report.error or ("no failure" if failure is None else f"{failure.name} {failure.outcome}: {failure.message}")


def test_the_corpus_holds_problems_with_derivations_and_mutants():
    folders = sorted(f for f in CORPUS.iterdir() if f.is_dir() and f.name != "large")  # large: a corpus of its own
    assert len(folders) >= 15
    for folder in folders:
        assert (folder / "problem.p").is_file() and (folder / "proof.p").is_file(), folder.name
    assert set(FAST) <= {folder.name for folder in folders}
    assert len(MUTANTS) >= 3


@pytest.mark.parametrize("name", FAST)
def test_a_printed_derivation_is_accepted_against_its_problem(name):
    # Expected verdict: valid by construction (a prover's proof of a theorem).
    folder = CORPUS / name
    report = check(str(folder / "proof.p"), problem=str(folder / "problem.p"))
    assert report.verdict == ACCEPTED, _failure_text(report)
    assert {step.outcome for step in report.steps} <= {CHECKED, RECONSTRUCTED}
    assert report.cautions == ()
    # The proof-object markers are the only text that is not TPTP.
    assert all("not TPTP" in notice.message for notice in report.notices)
    assert report_json(report)["verdict"] == "accepted"


@pytest.mark.parametrize("name", FAST)
def test_every_leaf_is_a_statement_of_its_problem(name):
    folder = CORPUS / name
    proof = read_tptp(str(folder / "proof.p"))
    problem_names = {statement.name for statement in read_tptp(str(folder / "problem.p")).statements}
    leaves = [s for s in proof.statements if isinstance(s.source, Origin) and s.source.kind == "file"]
    assert leaves
    assert {leaf.name for leaf in leaves} <= problem_names


@pytest.mark.parametrize("mutant", MUTANTS, ids=lambda path: f"{path.parent.name}/{path.stem}")
def test_a_mutant_is_rejected_at_the_changed_step_by_a_counter_model(mutant):
    # Expected: the header's step is wrong, shown by the counter-model it names.
    broken = _BROKEN.search(mutant.read_text(encoding="utf-8")).group(1)
    report = check(str(mutant), problem=str(mutant.parent / "problem.p"))
    assert report.verdict != ACCEPTED
    assert report.first_failure is not None and report.first_failure.name == broken, _failure_text(report)
    first = report_json(report)["first_failure"]
    # A changed constant the parents lack is also no introduction: then the
    # introduction's failure is given, with the counter-model beside it.
    assert first["step"] == broken
    assert first["reason"] == "countermodel" or "has a counter-model" in report.first_failure.message
