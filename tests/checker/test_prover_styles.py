"""Derivations in the styles of several saturation provers (fixtures/tptp/styles).

Problems on sets, relations, orders and topology, invented; derivations
either printed by `eprover` on them or written by hand in the published TPTP
output conventions of saturation provers, each settled without assay
(fixtures/tptp/styles/README.md, bench/styles_oracle.py).  Every one must be
accepted with no step refuted.  The acceptance paths they needed are
attacked below: a one-field change that makes the step unsound is rejected
at that step with a stable reason code.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from checker.outcomes import ACCEPTED, FAILED, REFUTED, REJECTED
from checker.run import check

STYLES = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "styles"
FOLDERS = sorted(folder for folder in STYLES.iterdir() if (folder / "proof.p").is_file())


def test_the_styles_hold_hand_written_and_printed_derivations():
    hand_written = [f for f in FOLDERS if "_eprover" not in f.name]
    printed = [f for f in FOLDERS if "_eprover" in f.name]
    assert len(hand_written) >= 15 and len(printed) >= 15


@pytest.mark.parametrize("folder", FOLDERS, ids=lambda folder: folder.name)
def test_every_styled_derivation_is_accepted_with_no_step_refuted(folder):
    report = check(str(folder / "proof.p"), str(folder / "problem.p"))
    refuted = [f"{s.name}: {s.message}" for s in report.steps if s.outcome == REFUTED]
    assert refuted == []
    assert report.verdict == ACCEPTED, report.first_failure


def _mutant(tmp_path, folder: str, old: str, new: str):
    """The derivation of ``folder`` with ``old`` replaced by ``new`` once,
    checked against its problem; the report and its steps by name."""
    text = (STYLES / folder / "proof.p").read_text(encoding="utf-8")
    assert text.count(old) == 1
    (tmp_path / "proof.p").write_text(text.replace(old, new), encoding="utf-8")
    report = check(str(tmp_path / "proof.p"), str(STYLES / folder / "problem.p"))
    return report, {step.name: step for step in report.steps}


def _rejected_at(report, steps, name: str, reason: str):
    assert report.verdict == REJECTED
    assert report.first_failure.name == name
    assert steps[name].outcome in (FAILED, REFUTED)
    assert f"reason: {reason}" in steps[name].details


# A definition whose defined atom stands negated (`~ e <=> F`, a split
# component named by a prover) is read `e <=> ~ F`: common practice for
# definitional clause splitting.

SPLIT = "split_space_kind_eprover_split"


def test_a_negated_definition_is_read_the_other_way():
    report = check(str(STYLES / SPLIT / "proof.p"), str(STYLES / SPLIT / "problem.p"))
    steps = {step.name: step for step in report.steps}
    assert "read as `epred4_0 <=> ~ ! [X1] : drained(X1)`" in steps["c_0_7"].message


def test_a_negated_definition_of_a_problem_symbol_is_not_fresh(tmp_path):
    # `open/1` is the problem's; as a 0-ary atom it would be a new symbol,
    # so the defined atom is a problem predicate applied to a constant.
    report, steps = _mutant(tmp_path, SPLIT, "(~epred4_0<=>![X1]:drained(X1))", "(~open(core)<=>![X1]:drained(X1))")
    assert report.verdict == REJECTED
    assert steps["c_0_7"].outcome == FAILED
    assert any(d in steps["c_0_7"].details for d in ("reason: definition_arguments", "reason: not_fresh"))


def test_a_negated_definition_that_uses_its_own_symbol_is_circular(tmp_path):
    report, steps = _mutant(tmp_path, SPLIT, "(~epred4_0<=>![X1]:drained(X1))", "(~epred4_0<=>(epred4_0|![X1]:drained(X1)))")
    _rejected_at(report, steps, "c_0_7", "definition_circular")


def test_a_negated_definition_over_other_variables_is_refused(tmp_path):
    report, steps = _mutant(tmp_path, SPLIT, "(~epred4_0<=>![X1]:drained(X1))", "![X2]:(~epred4_0<=>drained(X2))")
    _rejected_at(report, steps, "c_0_7", "definition_arguments")


def test_a_negated_definition_whose_symbol_another_defines_is_not_fresh(tmp_path):
    report, steps = _mutant(tmp_path, SPLIT, "(~epred4_0<=>![X1]:drained(X1))", "(~epred3_0<=>![X1]:drained(X1))")
    assert report.verdict == REJECTED
    assert "reason: not_fresh" in steps["c_0_9"].details


def test_a_negated_definition_is_used_as_stated_not_as_more(tmp_path):
    # From `~ e <=> ! [X] : drained(X)` and `~ drained(rim)` follows `e`;
    # the claim `~ e` does not (counter-model: rim not drained, e true).
    report, steps = _mutant(
        tmp_path, SPLIT,
        "cnf(c_0_18, plain, (epred4_0), inference(pm,[status(thm)],[c_0_11, c_0_12])).",
        "cnf(c_0_18, plain, (~epred4_0), inference(pm,[status(thm)],[c_0_11, c_0_12])).",
    )
    _rejected_at(report, steps, "c_0_18", "countermodel")


# A quantifier under an equivalence is Skolemized after the equivalence is
# written as two implications, the rewriting shown by a cover (each clause
# of the written form subsumed by one of the premise's).

COMPOSITION = "inverse_of_composition_eprover"


def test_a_witness_under_an_equivalence_that_loses_its_guard_is_refuted(tmp_path):
    report, steps = _mutant(
        tmp_path, COMPOSITION,
        "(holds(X21,X23,esk1_4(X21,X22,X23,X24))|~holds(comp(X21,X22),X23,X24))",
        "holds(X21,X23,esk1_4(X21,X22,X23,X24))",
    )
    _rejected_at(report, steps, "c_0_4", "countermodel")


def test_a_witness_under_an_equivalence_that_drops_a_dependency_is_refused(tmp_path):
    report, steps = _mutant(
        tmp_path, COMPOSITION,
        "fof(c_0_4, plain, ![X21, X22, X23, X24, X26, X27, X28, X29, X30]:(((holds(X21,X23,esk1_4(X21,X22,X23,X24))"
        "|~holds(comp(X21,X22),X23,X24))&(holds(X22,esk1_4(X21,X22,X23,X24),X24)",
        "fof(c_0_4, plain, ![X21, X22, X23, X24, X26, X27, X28, X29, X30]:(((holds(X21,X23,esk1_4(X21,X22,X23,X23))"
        "|~holds(comp(X21,X22),X23,X24))&(holds(X22,esk1_4(X21,X22,X23,X23),X24)",
    )
    assert report.verdict == REJECTED
    assert report.first_failure.name == "c_0_4"
    assert steps["c_0_4"].outcome in (FAILED, REFUTED)


# A formula step that the default refutation search misses gets one more
# search with wider saturation bounds; a claim that does not follow is
# still refuted first.

DISTRIBUTION = "zone_classes_distribution_eprover_defcnf"


def test_a_folded_distribution_that_drops_a_class_is_refuted(tmp_path):
    report, steps = _mutant(
        tmp_path, DISTRIBUTION,
        "fof(c_0_13, axiom, ![X1]:(epred1_1(X1)|epred2_1(X1)|epred3_1(X1)|epred4_1(X1))",
        "fof(c_0_13, axiom, ![X1]:(epred1_1(X1)|epred2_1(X1)|epred3_1(X1))",
    )
    _rejected_at(report, steps, "c_0_13", "countermodel")


def test_a_definition_applied_inside_an_equivalence_with_a_swapped_argument_is_refuted(tmp_path):
    report, steps = _mutant(
        tmp_path, "equivalence_relation_symmetric_eprover_defcnf",
        "fof(c_0_7, plain, ![X1]:(epred5_1(X1)<=>![X2, X3, X4]:(epred4_4(X4,X3,X2,X1)=>holds(X1,X2,X4)))",
        "fof(c_0_7, plain, ![X1]:(epred5_1(X1)<=>![X2, X3, X4]:(epred4_4(X4,X3,X2,X1)=>holds(X1,X4,X2)))",
    )
    assert report.verdict == REJECTED
    assert report.first_failure.name == "c_0_7"


# Definitions applied inside equivalences (`apply_def` after definitional
# clause form) are shown by unfolding the definitions among the premises in
# a premise and the conclusion alike (checker.kernel.unfolding).

POLICY = "access_policy_definitions_eprover_defcnf"


def test_definitions_applied_are_shown_by_unfolding():
    report = check(str(STYLES / POLICY / "proof.p"), str(STYLES / POLICY / "problem.p"))
    steps = {step.name: step for step in report.steps}
    assert "kernel unfolded the 3 definition(s)" in steps["c_0_12"].message


def test_a_definition_applied_with_its_arguments_swapped_is_not_unfolded(tmp_path):
    report, steps = _mutant(
        tmp_path, POLICY,
        "fof(c_0_12, plain, ![X2, X1]:(epred4_2(X1,X2)<=>?[X3, X4]:(epred2_4(X2,X3,X4,X1)&epred3_2(X4,X1)))",
        "fof(c_0_12, plain, ![X2, X1]:(epred4_2(X1,X2)<=>?[X3, X4]:(epred2_4(X2,X3,X4,X1)&epred3_2(X3,X1)))",
    )
    assert report.verdict == REJECTED
    assert report.first_failure.name == "c_0_12"
    assert "unfolded" not in steps["c_0_12"].message


def test_a_definition_applied_that_drops_a_conjunct_is_refuted(tmp_path):
    report, steps = _mutant(
        tmp_path, POLICY,
        "(epred2_4(X2,X3,X4,X1)<=>(epred1_3(X4,X3,X1)&contains(X4,X2)))",
        "(epred2_4(X2,X3,X4,X1)<=>epred1_3(X4,X3,X1))",
    )
    _rejected_at(report, steps, "c_0_13", "countermodel")


def test_the_trust_summary_lists_skolem_symbols_not_the_predicates_of_choice_axioms():
    # An axiom of choice mentions the problem's `member/2` and `subset/2`;
    # it introduces only its witnesses.
    folder = STYLES / "subset_chain_saturation"
    report = check(str(folder / "proof.p"), str(folder / "problem.p"))
    assert [(i.symbol, i.step) for i in report.introduced] == [
        ("sK0/2", "f9"), ("sK1/0", "f11"), ("sK2/0", "f11"), ("sK3/0", "f11"),
    ]
