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

from dataclasses import dataclass
from pathlib import Path

import pytest

from checker.outcomes import ACCEPTED, FAILED, REFUTED, REJECTED, UNPROVEN
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


# Hand-written derivations in the published conventions of further provers
# (folders `*_printed_*` added with them), one single-change mutant per
# feature they exercise: each must be rejected at the changed step with a
# stable reason.  Expected verdicts by construction: each comment gives a
# counter-model of the changed step's claim (premises true, claim false) or
# says why the leaf is not the problem's.


@dataclass(frozen=True, slots=True)
class _M:
    folder: str
    old: str
    new: str
    step: str
    reason: str


MUTANTS = [
    # Typed, two sorts: the converse of the resolvent of f16 and f21.  Counter-model:
    # one item, on the depot list sK3 but not on sK1, sK1 covered by sK3.
    _M(
        "stock_lists_union_printed_tff_sorts",
        "tff(f26,plain,(\n  ! [X0 : item] : (on(X0,sK3) | ~on(X0,sK1))),",
        "tff(f26,plain,(\n  ! [X0 : item] : (on(X0,sK1) | ~on(X0,sK3))),",
        "f26", "countermodel",
    ),
    # Typed, one sort, backward demodulation into the wrong side.  Counter-model:
    # overlap(x,y) = y, interior constantly 0, sK0 = 0, sK1 = 1.
    _M(
        "survey_interior_printed_tff_demodulation",
        "tff(f25,plain,(\n  overlap(sK0,interior(sK1)) != overlap(sK0,sK1)),",
        "tff(f25,plain,(\n  overlap(sK0,interior(sK1)) != overlap(sK1,sK0)),",
        "f25", "countermodel",
    ),
    # thf: symmetry gives link(sK0(X),X), not link(sK0(X),sK0(X)).  Counter-model:
    # two routers, sK0 swaps them, link holds between distinct routers only.
    _M(
        "peer_links_printed_thf_first_order",
        "thf(f18,plain,(\n  ! [X0 : router] : (link @ (sK0 @ X0) @ X0)),",
        "thf(f18,plain,(\n  ! [X0 : router] : (link @ (sK0 @ X0) @ (sK0 @ X0))),",
        "f18", "countermodel",
    ),
    # Typed AVATAR: the contradiction under spl0_2 stated with the split symbol
    # positive.  Counter-model: spl0_2 false, sK0 not isolated at the hub.
    _M(
        "hub_space_printed_tff_avatar",
        "tff(f31,plain,(\n  $false | ~spl0_2),",
        "tff(f31,plain,(\n  $false | spl0_2),",
        "f31", "countermodel",
    ),
    # Typed naming: the folded definition negated.  Counter-model: one user in
    # one group granted the one document: sP0 and can_read both true.
    _M(
        "document_access_printed_tff_naming",
        "tff(f10,plain,(\n  ! [X0 : user,X1 : doc] : (can_read(X0,X1) <=> sP0(X1,X0))),",
        "tff(f10,plain,(\n  ! [X0 : user,X1 : doc] : (can_read(X0,X1) <=> ~sP0(X1,X0))),",
        "f10", "countermodel",
    ),
    # Pure predicate removal that keeps a pure predicate as a conjunct.
    # Counter-model: one record, in the inbox, logged and reviewed, not flagged.
    _M(
        "archive_inbox_printed_pure_predicates",
        "fof(f9,plain,( ! [X0] : (member(X0,inbox) => logged(X0)) ),inference(pure_predicate_removal,[],[f3])).",
        "fof(f9,plain,( ! [X0] : (member(X0,inbox) => (logged(X0) & flagged(X0))) ),inference(pure_predicate_removal,[],[f3])).",
        "f9", "countermodel",
    ),
    # A definition weakened to the wrong direction.  Counter-model: one record,
    # logged, not signed, not audited.
    _M(
        "archive_inbox_printed_pure_predicates",
        "fof(f10,plain,( ! [X0] : ((logged(X0) & signed(X0)) => audited(X0)) ),inference(unused_predicate_definition_removal,[],[f1])).",
        "fof(f10,plain,( ! [X0] : ((logged(X0) | signed(X0)) => audited(X0)) ),inference(unused_predicate_definition_removal,[],[f1])).",
        "f10", "countermodel",
    ),
    # Equality factoring whose claim contradicts its premise `sK0 = sK2`:
    # every model of the premise (sK0 = sK2) falsifies it.
    _M(
        "badge_pairs_printed_equality_factoring",
        "cnf(f15,plain,( sK0 != sK0 | sK2 = sK0 ),inference(equality_factoring,[],[f14])).",
        "cnf(f15,plain,( sK0 != sK0 | sK2 != sK0 ),inference(equality_factoring,[],[f14])).",
        "f15", "countermodel",
    ),
    # Truth constants removed with the equation negated.  Counter-model: one
    # zone, its own closure, closed.
    _M(
        "zoning_closure_printed_tff_fool",
        "tff(f8,plain,( ! [X0 : zone] : (closed(X0) <=> closure(X0) = X0) ),inference(true_and_false_elimination,[],[f7])).",
        "tff(f8,plain,( ! [X0 : zone] : (closed(X0) <=> closure(X0) != X0) ),inference(true_and_false_elimination,[],[f7])).",
        "f8", "countermodel",
    ),
    # A definition unfolded without its outer complement.  Counter-model: two
    # zones, complement swaps them, interior the identity, every zone closed.
    _M(
        "zoning_closure_printed_tff_fool",
        "tff(f9,plain,( ! [X0 : zone] : (closed(X0) <=> complement(interior(complement(X0))) = X0) ),inference(definition_unfolding,[],[f8,f1])).",
        "tff(f9,plain,( ! [X0 : zone] : (closed(X0) <=> interior(complement(X0)) = X0) ),inference(definition_unfolding,[],[f8,f1])).",
        "f9", "countermodel",
    ),
    # A contradiction resting on two split symbols turned into a clause with
    # one.  Counter-model: spl0_0 true, spl0_2 false.
    _M(
        "valve_modes_printed_avatar_pairs",
        "cnf(f26,plain,( ~spl0_0 | ~spl0_2 ),inference(avatar_contradiction_clause,[],[f25])).",
        "cnf(f26,plain,( ~spl0_0 ),inference(avatar_contradiction_clause,[],[f25])).",
        "f26", "countermodel",
    ),
    # Global subsumption without the negated goal it needs.  Counter-model:
    # the gateway live and not muted.
    _M(
        "relay_chain_printed_global_subsumption",
        "cnf(f21,plain,( muted(gateway) ),inference(global_subsumption,[],[f16,f14])).",
        "cnf(f21,plain,( muted(gateway) ),inference(global_subsumption,[],[f16])).",
        "f21", "countermodel",
    ),
    # A Skolem clause with the wrong sign of its witness's literal.
    # Counter-model (the only pairing, sK0 for the existential of f7): sP0 false,
    # sK0(x) open, its preimage not open.
    _M(
        "transit_map_printed_naming_skolem_clauses",
        "cnf(f10,plain,( sP0(X0) | ~open(preimage(X0,sK0(X0))) ),inference(cnf_transformation,[],[f7])).",
        "cnf(f10,plain,( sP0(X0) | open(preimage(X0,sK0(X0))) ),inference(cnf_transformation,[],[f7])).",
        "f10", "countermodel",
    ),
    # An axiom of choice whose consequent is no instance of its antecedent.
    # Counter-model: a basic cell inside both zones exists, and the second
    # zone is not inside the one chosen.
    _M(
        "coverage_base_printed_choice_prefix",
        "(basic(sK0(X0,X1,X2)) & in(X2,sK0(X0,X1,X2)) & sub(sK0(X0,X1,X2),X0) & sub(sK0(X0,X1,X2),X1))) ),introduced",
        "(basic(sK0(X0,X1,X2)) & in(X2,sK0(X0,X1,X2)) & sub(sK0(X0,X1,X2),X0) & sub(X1,sK0(X0,X1,X2)))) ),introduced",
        "f8", "countermodel",
    ),
    # Superposition of commutativity into the absorption law, with the wrong
    # right side.  Counter-model: two rotas, overlap constantly 0, merge(x,y) = x.
    _M(
        "shift_rota_printed_superposition_chain",
        "cnf(f18,plain,( merge(X1,overlap(X0,X1)) = X1 ),inference(superposition,[],[f11,f9])).",
        "cnf(f18,plain,( merge(X1,overlap(X0,X1)) = X0 ),inference(superposition,[],[f11,f9])).",
        "f18", "countermodel",
    ),
    # A rewrite that drops the label.  Counter-model: label constantly 0 and
    # sK0 = sK1 = sK2 = 1.
    _M(
        "class_labels_printed_backward_demodulation",
        "cnf(f17,plain,( label(sK0) = label(sK2) ),inference(backward_demodulation,[],[f16,f15])).",
        "cnf(f17,plain,( label(sK0) = sK2 ),inference(backward_demodulation,[],[f16,f15])).",
        "f17", "countermodel",
    ),
    # Factoring that does not unify the two literals.  Counter-model: two staff,
    # a not on call and closed, b on call and not closed (a, b for X0, X1).
    _M(
        "desk_rota_printed_factoring",
        "cnf(f9,plain,( on_call(X0) | closed(X0) ),inference(factoring,[],[f6])).",
        "cnf(f9,plain,( on_call(X0) | closed(X1) ),inference(factoring,[],[f6])).",
        "f9", "countermodel",
    ),
    # A restated leaf with the equation negated: not the problem's `memo_owner`.
    _M(
        "clearance_printed_tff_ground_equation",
        "tff(f2,axiom,( bob = owner(memo) ),file('problem.p',memo_owner)).",
        "tff(f2,axiom,( bob != owner(memo) ),file('problem.p',memo_owner)).",
        "f2", "not_in_problem",
    ),
    # A clause of the Skolemized negation that contradicts the first.
    # Counter-model: sk__3 symmetric, its inverse not.
    _M(
        "inverse_links_printed_quoted_rules",
        "cnf(zip_derived_cl6, negated_conjecture, (~ symmetric(inverse(sk__3)))",
        "cnf(zip_derived_cl6, negated_conjecture, (~ symmetric(sk__3))",
        "zip_derived_cl6", "countermodel",
    ),
    # The second clause of the Skolemized negation with the Skolem constants
    # swapped: with the first it is not the negation Skolemized.  Counter-model:
    # sk__1 in its tag set, sk__2 in sk__3's, sk__3 not in sk__2's.
    _M(
        "singleton_tags_printed_tff_quoted_rules",
        "tff(zip_derived_cl3, negated_conjecture, (~ in(sk__1, tags(sk__1)) | ~ in(sk__3, tags(sk__2)))",
        "tff(zip_derived_cl3, negated_conjecture, (~ in(sk__1, tags(sk__1)) | ~ in(sk__2, tags(sk__3)))",
        "zip_derived_cl3", "witness_reused",
    ),
    # Nested records: two clauses name the same witness with its arguments
    # swapped.  Counter-model: two plans, each holding the other (in = {(0,1),
    # (1,0)}), neither fitting the other, sk_1(1,0) = 0, sk_1(0,1) = 1 (the
    # witnesses 11 needs); 12 fails at X1 = 1, X2 = 0.
    _M(
        "storage_power_printed_nested_skolem",
        "cnf(12, plain, (fits(X1,X2) | ~in(sk_1(X1,X2),X2))",
        "cnf(12, plain, (fits(X1,X2) | ~in(sk_1(X2,X1),X2))",
        "12", "witness_reused",
    ),
    # The negated conjecture under nested records with its constants swapped.
    # Counter-model: sk_2 = 0, sk_3 = 1, options swaps them, fits = {(0,1)}.
    _M(
        "storage_power_printed_nested_skolem",
        "cnf(16, negated_conjecture, (~fits(options(sk_2),options(sk_3)))",
        "cnf(16, negated_conjecture, (~fits(options(sk_3),options(sk_2)))",
        "16", "witness_reused",
    ),
    # A restated leaf that is not the problem's `pool_def`: a part in pool(a,b)
    # because it is in a, not in b.
    _M(
        "parts_bins_printed_restated_leaves",
        "(in(X0,pool(X1,X2)) <=> (in(X0,X2) | in(X0,X1)))",
        "(in(X0,pool(X1,X2)) <=> (in(X0,X2) | in(X0,X2)))",
        "f3", "not_in_problem",
    ),
    # Nested axioms of choice: the inner witness put inside the outer one of
    # the other variable.  Counter-model: two cells a, b, every cell open,
    # in = {(a,a), (b,b), (a,b)}, sub the identity, sK0 the identity,
    # sK1(x,y) = x; at X0 = b, X2 = a the claim wants sub(b,a).
    _M(
        "beacon_cells_printed_nested_choice",
        "((open(sK1(X0,X2)) & in(X2,sK1(X0,X2)) & sub(sK1(X0,X2),sK0(X0))) | ~in(X2,sK0(X0)))",
        "((open(sK1(X0,X2)) & in(X2,sK1(X0,X2)) & sub(sK1(X0,X2),sK0(X2))) | ~in(X2,sK0(X0)))",
        "f8", "countermodel",
    ),
    # An inner axiom of choice with the inclusion turned round.  Counter-model:
    # two cells 0 and 1, in and open everywhere, sub = {(0,0), (0,1)}, sK0
    # swapping them: the witness for X0 = X2 = 0 must be inside sK0(0) = 1,
    # so it is 0, and 1 is not inside it.
    _M(
        "beacon_cells_printed_nested_choice",
        "(open(sK1(X0,X2)) & in(X2,sK1(X0,X2)) & sub(sK1(X0,X2),sK0(X0)))) ),introduced",
        "(open(sK1(X0,X2)) & in(X2,sK1(X0,X2)) & sub(sK0(X0),sK1(X0,X2)))) ),introduced",
        "f7", "countermodel",
    ),
    # A split clause that forgets the split symbol its clause rests on.
    # Counter-model: spl0_0 false, the witness in neither sK1 nor sK2,
    # spl0_2 and spl0_3 false (as their definitions say).
    _M(
        "shared_shelves_printed_avatar_distribution",
        "cnf(f43,plain,( spl0_2 | spl0_3 | ~spl0_0 )",
        "cnf(f43,plain,( spl0_2 | spl0_3 )",
        "f43", "countermodel",
    ),
    # The second round of hand-written derivations (conventions and
    # combinations the first did not show), one single change each.
    # The exclusive or written out with a sign lost.  Counter-model: one door,
    # sealed and not open.
    _M(
        "interlock_doors_printed_xor_connectives",
        "fof(f12,plain,( ! [X0] : ((~open(X0) | ~sealed(X0)) & (open(X0) | sealed(X0))) )",
        "fof(f12,plain,( ! [X0] : ((~open(X0) | ~sealed(X0)) & (open(X0) | ~sealed(X0))) )",
        "f12", "countermodel",
    ),
    # A clause of the nested equivalences with a sign turned.  Counter-model:
    # one room, certified and filtered, neither pressured nor staffed.
    _M(
        "clean_room_printed_nested_equivalences",
        "cnf(f20,plain,( ~filtered(X0) | pressured(X0) | ~staffed(X0) | ~certified(X0) )",
        "cnf(f20,plain,( ~filtered(X0) | pressured(X0) | staffed(X0) | ~certified(X0) )",
        "f20", "countermodel",
    ),
    # The four-argument witness linked in the class's week instead of the
    # relay's.  Counter-model: two elements, link only in week 0 (found by
    # the search, sK0 tabled over all 16 argument tuples).
    _M(
        "freight_hubs_printed_wide_choice",
        "cnf(f15,plain,( link(X0,sK0(X0,X1,X2,X3),X3) | ~relay(X0,X1,X2,X3) )",
        "cnf(f15,plain,( link(X0,sK0(X0,X1,X2,X3),X2) | ~relay(X0,X1,X2,X3) )",
        "f15", "countermodel",
    ),
    # Two names folded as a disjunction.  Counter-model: one station with a
    # valve not closed (sP0 false), sP1 true, not safe.
    _M(
        "pump_station_printed_two_definitions_folded",
        "fof(f9,plain,( ! [X0] : (safe(X0) <=> (sP0(X0) & sP1(X0))) )",
        "fof(f9,plain,( ! [X0] : (safe(X0) <=> (sP0(X0) | sP1(X0))) )",
        "f9", "countermodel",
    ),
    # The backup's split clause naming the wrong component.  Counter-model:
    # every cell cooled, none heated or drained (spl0_1 true, spl0_0 and
    # spl0_5 false, as their definitions say).
    _M(
        "cooling_loop_printed_avatar_many_components",
        "cnf(f27,plain,( spl0_1 | spl0_5 )",
        "cnf(f27,plain,( spl0_0 | spl0_5 )",
        "f27", "countermodel",
    ),
    # Superposition of a non-unit equation that drops the side condition it
    # brings.  Counter-model: depot swaps two sites, site 0 remote, hub 0 runs
    # slow (0), site 0 not audited.
    _M(
        "depot_rates_printed_nonunit_superposition",
        "cnf(f20,plain,( rate(hub) != slow | audited(X0) | remote(X0) )",
        "cnf(f20,plain,( rate(hub) != slow | audited(X0) )",
        "f20", "countermodel",
    ),
    # Equality resolution binding the valve to its own gate.  Counter-model:
    # gate_of constantly 1, 0 locked, nothing isolated.
    _M(
        "gate_isolation_printed_nested_records_by_hand",
        "cnf(c_0_20, plain, (isolated(X1)|~locked(gate_of(X1)))",
        "cnf(c_0_20, plain, (isolated(X1)|~locked(X1))",
        "c_0_20", "countermodel",
    ),
    # thf: subsumption resolution without the unit `lockdown` it needs.
    # Counter-model: lockdown false, no reader armed.
    _M(
        "badge_readers_printed_thf_bool_atoms",
        "! [X0 : reader] : (armed @ X0)),\n  inference(subsumption_resolution,[],[f12,f13])",
        "! [X0 : reader] : (armed @ X0)),\n  inference(subsumption_resolution,[],[f12])",
        "f15", "countermodel",
    ),
    # A leaf citing a statement of the included file that the include does not
    # select (`relay_noisy` would contradict `sealed_quiet` for s1).
    _M(
        "relay_shelter_printed_included_roles",
        "fof(f3,axiom,( ! [X0] : (relay_in(X0) => powered(X0)) ),file('problem.p',relay_powered_here))",
        "fof(f3,axiom,( ! [X0] : (relay_in(X0) => noisy(X0)) ),file('shelter_axioms.ax',relay_noisy))",
        "f3", "not_in_problem",
    ),
    # Typed over $i: superposition that keeps the inequality positive.
    # Counter-model: locker swaps two keys, sK0 = sK1 = 0.
    _M(
        "locker_keys_printed_tff_individuals",
        "cnf(f16,plain,( sK1 = X0 | locker(sK0) != locker(X0) )",
        "cnf(f16,plain,( sK1 = X0 | locker(sK0) = locker(X0) )",
        "f16", "countermodel",
    ),
    # A Skolem clause under the equivalence with its guard's sign turned.
    # Counter-model (both pairings): one depot, sending and receiving nothing.
    _M(
        "route_pairs_printed_skolem_clauses_under_equivalence",
        "cnf(f9,plain,( sends(X0,sK0(X0)) | ~receives(X0,X1) )",
        "cnf(f9,plain,( sends(X0,sK0(X0)) | receives(X0,X1) )",
        "f9", "countermodel",
    ),
    # The inner witness's clause moved to the outer constant: every officer's
    # shift covered by the inspector.  Counter-model: two elements, covers the
    # identity, sk__2 the identity, sk__1 = 1; the claim fails at X0 = 0.
    _M(
        "audit_rota_printed_quoted_rules_inner_witness",
        "cnf(zip_derived_cl1, negated_conjecture, (covers(X0, sk__2(X0)))",
        "cnf(zip_derived_cl1, negated_conjecture, (covers(sk__1, sk__2(X0)))",
        "zip_derived_cl1", "countermodel",
    ),
    # A clause of the equivalence with ~| and <~> that reads the badge for the
    # training.  Counter-model: one worker with a badge and a ban, untrained,
    # not allowed.
    _M(
        "site_gates_printed_negated_connectives_in_equivalence",
        "cnf(f19,plain,( allowed(X0) | ~banned(X0) | ~trained(X0) )",
        "cnf(f19,plain,( allowed(X0) | ~badge(X0) | ~banned(X0) )",
        "f19", "countermodel",
    ),
    # A negated conjecture leaf of a problem in clause form that is not the
    # problem's: the crew not rostered for the night route itself.
    _M(
        "night_crews_printed_clause_problem",
        "cnf(f6,negated_conjecture,( ~rostered(crew(night),next(night)) )",
        "cnf(f6,negated_conjecture,( ~rostered(crew(night),night) )",
        "f6", "not_in_problem",
    ),
    # Rectify taking the shadowed inner variable for the outer one: the
    # valve held must be open.  Counter-model: bank 0 holds valves 0 and 1,
    # only 1 open.
    _M(
        "valve_banks_printed_shadowed_variables",
        "fof(f5,plain,( ! [X0,X1] : (holds(X0,X1) => ? [X2] : (holds(X0,X2) & open(X2))) )",
        "fof(f5,plain,( ! [X0,X1] : (holds(X0,X1) => ? [X2] : (holds(X0,X2) & open(X1))) )",
        "f5", "countermodel",
    ),
    # Condensation that drops the literal the instance keeps.  Counter-model:
    # two pallets, only the lot tagged.
    _M(
        "pallet_yard_printed_simplification_rules",
        "cnf(f30,plain,( tagged(lot) ),inference(condensation,[],[f18]))",
        "cnf(f30,plain,( tagged(X0) ),inference(condensation,[],[f18]))",
        "f30", "countermodel",
    ),
    # Inner rewriting that drops the equation it rewrote by.  Counter-model:
    # code swaps two pallets, pallet 0 (the lot) tagged, nothing inspected.
    _M(
        "pallet_yard_printed_simplification_rules",
        "cnf(f31,plain,( inspected(lot) | ~tagged(X0) | code(X0) != lot )",
        "cnf(f31,plain,( inspected(lot) | ~tagged(X0) )",
        "f31", "countermodel",
    ),
    # A clause split from the five-witness Skolemization with the two stops
    # of a route swapped.  Counter-model: found by the search over two
    # terminals (every Skolem function tabled).
    _M(
        "network_legs_printed_five_witnesses",
        "cnf(c_0_6, plain, (leg(esk1_2(X1,X2),esk2_2(X1,X2))|~route(X1,X2))",
        "cnf(c_0_6, plain, (leg(esk2_2(X1,X2),esk1_2(X1,X2))|~route(X1,X2))",
        "c_0_6", "countermodel",
    ),
    # The inner axiom of choice under the exclusive or, with the crossing
    # turned round.  Counter-model: sK0 = 0, sK1 = 1, slots hold only
    # crossings from 0, sK2 = 1.
    _M(
        "ferry_slots_printed_negated_xor_goal_nested_choice",
        "fof(f11,plain,( ? [X3] : holds(sK0,sK1,X3) => holds(sK0,sK1,sK2) )",
        "fof(f11,plain,( ? [X3] : holds(sK0,sK1,X3) => holds(sK1,sK0,sK2) )",
        "f11", "countermodel",
    ),
    # A split clause reading the negative ground component as positive.
    # Counter-model: pilot off, nothing lit or shut, every split symbol false.
    _M(
        "boiler_room_printed_avatar_negative_ground_component",
        "cnf(f22,plain,( spl0_0 | ~spl0_1 | spl0_2 )",
        "cnf(f22,plain,( spl0_0 | spl0_1 | spl0_2 )",
        "f22", "countermodel",
    ),
    # A leaf introduced as a tautology that is none.  Counter-model: v2 open,
    # v1 not.
    _M(
        "vent_checks_printed_tautology_leaves",
        "cnf(f12,plain,( open(v1) | ~open(v1) )",
        "cnf(f12,plain,( open(v1) | ~open(v2) )",
        "f12", "countermodel",
    ),
    # Two definitions folded by nested apply_def records as a disjunction.
    # Counter-model: one store whose valve is not closed (epred1_1 false)
    # and whose sensor is live (epred2_1 true), not safe.
    _M(
        "cold_store_printed_nested_apply_def",
        "fof(c_0_6, axiom, ![X1]:(safe(X1)<=>(epred1_1(X1)&epred2_1(X1)))",
        "fof(c_0_6, axiom, ![X1]:(safe(X1)<=>(epred1_1(X1)|epred2_1(X1)))",
        "c_0_6", "countermodel",
    ),
]


@pytest.mark.parametrize("mutant", MUTANTS, ids=lambda m: f"{m.folder}:{m.step}")
def test_a_single_change_to_a_printed_derivation_is_rejected_at_that_step(tmp_path, mutant):
    report, steps = _mutant(tmp_path, mutant.folder, mutant.old, mutant.new)
    _rejected_at(report, steps, mutant.step, mutant.reason)


# The clauses of a negated conjecture Skolemized one per step, each citing
# the conjecture, introduce their Skolem constants together (a prover that
# clausifies the conjecture directly); the second clause was refuted as if
# its constant were arbitrary.

def test_clauses_of_one_skolemized_negation_are_checked_together():
    folder = STYLES / "inverse_links_printed_quoted_rules"
    report = check(str(folder / "proof.p"), str(folder / "problem.p"))
    steps = {step.name: step for step in report.steps}
    assert report.verdict == ACCEPTED
    assert "with the 1 earlier step introducing them" in steps["zip_derived_cl6"].message


# Clauses written each with its own nested records of formula steps rest
# on the same stated statement and introduce the same Skolem function: they
# are co-introducers, not a second introduction (was `not_fresh`).

def test_clauses_with_nested_records_introduce_their_witness_together():
    folder = STYLES / "storage_power_printed_nested_skolem"
    report = check(str(folder / "proof.p"), str(folder / "problem.p"))
    steps = {step.name: step for step in report.steps}
    assert report.verdict == ACCEPTED
    assert "with the 1 earlier step introducing them" in steps["12"].message


def test_a_clause_with_nested_records_from_another_statement_still_introduces_afresh(tmp_path):
    # Clause 13 rests on `options_def`, not on `fits_def`: a witness `sk_1`
    # there is a second introduction of the symbol, whatever its records.
    report, steps = _mutant(
        tmp_path, "storage_power_printed_nested_skolem",
        "cnf(13, plain, (~in(X1,options(X2)) | fits(X1,X2))",
        "cnf(13, plain, (~in(X1,options(X2)) | fits(X1,sk_1(X1,X2)))",
    )
    _rejected_at(report, steps, "13", "not_fresh")


# A restated leaf that only reorders a disjunction under an equivalence is
# matched clause by clause (a cover); the refutation search missed it.

def test_a_reordered_leaf_is_shown_by_a_cover():
    folder = STYLES / "parts_bins_printed_restated_leaves"
    report = check(str(folder / "proof.p"), str(folder / "problem.p"))
    steps = {step.name: step for step in report.steps}
    assert report.verdict == ACCEPTED
    assert "a cover" in steps["f3"].message


# A prover that splits a clause into variable-disjoint components may name
# one by a propositional symbol it never defines; the name is proposed from
# the clause miniscoped (`! [X1] : open_air(X1)` of
# `pressurised(X0) | open_air(X1)`), which has it as a subformula.

VENTS = "vent_bank_printed_split_names"


def test_a_split_component_named_without_a_definition_is_proposed_from_the_miniscoped_clause():
    report = check(str(STYLES / VENTS / "proof.p"), str(STYLES / VENTS / "problem.p"))
    steps = {step.name: step for step in report.steps}
    assert report.verdict == ACCEPTED
    assert "named by `sP0_iProver_split <=> ! [X1] : open_air(X1)`" in steps["c_61"].message


def test_a_split_clause_guarding_the_wrong_component_is_not_accepted(tmp_path):
    # No definition of sP0 makes both split clauses follow from
    # `pressurised(X0) | open_air(X1)`: with `! [X1] : open_air(X1)` the
    # changed clause fails (counter-model: every vent open to air, v1 not
    # pressurised), with `! [X0] : pressurised(X0)` the first (v1 not
    # pressurised, every vent open to air, sP0 false), with the clause itself
    # the changed one (sP0 true, v1 not pressurised).  A proposed definition
    # never refutes, so the splitting steps are unproven, and the
    # derivation is rejected downstream.
    report, steps = _mutant(
        tmp_path, VENTS,
        "cnf(c_61,plain,( open_air(X1) | ~sP0_iProver_split )",
        "cnf(c_61,plain,( pressurised(X1) | ~sP0_iProver_split )",
    )
    assert report.verdict == REJECTED
    assert steps["c_61"].outcome == UNPROVEN
    assert "reason: no_naming_definition" in steps["c_61"].details


# A derivation laid out as published solutions are (the refutation first)
# is checked in the order it was found: Kahn's order takes the latest
# written step among the ready ones when most parents are written after
# their children.  Taking the earliest put the split definitions that
# mention Skolem constants before the axiom of choice of those constants,
# which then failed as not fresh.

PUBLISHED = "shelf_meets_printed_published_layout"


def test_a_refutation_first_layout_is_checked_in_the_order_it_was_found():
    report = check(str(STYLES / PUBLISHED / "proof.p"), str(STYLES / PUBLISHED / "problem.p"))
    order = [step.name for step in report.steps]
    assert report.verdict == ACCEPTED
    assert order.index("f11") < order.index("f28") < order.index("f31") < order.index("f73")


def test_a_split_symbol_defined_twice_in_a_refutation_first_layout_is_not_fresh(tmp_path):
    # The second definition in the order found is at fault: spl0_0 would
    # name both sides of the goal's equation.
    report, steps = _mutant(tmp_path, PUBLISHED, "fof(f31,plain,( spl0_1 <=>", "fof(f31,plain,( spl0_0 <=>")
    _rejected_at(report, steps, "f31", "not_fresh")


# A clause of a Skolemized formula may hold an inner witness and not the
# outer existential's: `device(sK1(X0)) | ...` of
# `? [X0] : ! [X1] : (? [X2] : (~ grant(X1,X0,X2) & device(X2)) | ...)`,
# written before the clause with sK0, or printed alone by a prover that
# prints only the clauses its refutation uses.  sK1 rightly takes no
# argument for X0; the step was refuted under the only pairing found (sK1
# for X0).  The outer existential is now also witnessed by a symbol of
# nothing else, which the entailment is over every meaning of.

GRANTS = "access_grants_printed_alternating_goal"
GUARDS = "guard_doors_printed_inner_witness_alone"


@pytest.mark.parametrize("folder, step", [(GRANTS, "f13"), (GUARDS, "zip_derived_cl1")])
def test_an_inner_witness_is_paired_with_the_outer_existential_left_anonymous(folder, step):
    report = check(str(STYLES / folder / "proof.p"), str(STYLES / folder / "problem.p"))
    steps = {s.name: s for s in report.steps}
    assert report.verdict == ACCEPTED
    assert "witnessed by a symbol of nothing else" in steps[step].message


def test_an_inner_witness_that_forgets_its_universal_is_still_refuted(tmp_path):
    # `sk__2` a constant: one door for every guard.  No pairing fits with
    # the room anonymous (the door depends on the guard); as the room's
    # witness it has a counter-model: two elements, the room 1, both
    # guards assigned door 0, the room opening door 0 for both; the claim
    # fails for guard 0 and door 1.
    report, steps = _mutant(
        tmp_path, GUARDS,
        "(assigned(X0, sk__2(X0)))",
        "(assigned(X0, sk__2))",
    )
    _rejected_at(report, steps, "zip_derived_cl1", "countermodel")


def test_an_inner_witness_on_the_wrong_side_is_refuted_under_every_pairing(tmp_path):
    # Counter-model under each pairing, the anonymous room's included
    # (that of the room's: two elements each assigned the other, sk__2
    # constantly 0; the claim fails for guard 0).
    report, steps = _mutant(
        tmp_path, GUARDS,
        "(assigned(X0, sk__2(X0)))",
        "(assigned(sk__2(X0), X0))",
    )
    _rejected_at(report, steps, "zip_derived_cl1", "countermodel")


def test_a_clause_with_only_the_inner_witness_that_does_not_follow_is_refuted(tmp_path):
    # f13 with the device literal's sign turned.  Counter-model: one user
    # owning one thing, no device.
    report, steps = _mutant(
        tmp_path, GRANTS,
        "cnf(f13,plain,( device(sK1(X0)) | ~device(X1) | ~owns(X0,X1) )",
        "cnf(f13,plain,( device(sK1(X0)) | device(X1) | ~owns(X0,X1) )",
    )
    _rejected_at(report, steps, "f13", "countermodel")


def test_a_later_clause_with_both_witnesses_is_checked_with_the_first(tmp_path):
    # f13 is right; f14 with a sign turned has a counter-model with f13 (one
    # user owning a granted non-device): the fault is f14's.
    report, steps = _mutant(
        tmp_path, GRANTS,
        "cnf(f14,plain,( ~grant(X0,sK0,sK1(X0)) | ~device(X1) | ~owns(X0,X1) )",
        "cnf(f14,plain,( ~grant(X0,sK0,sK1(X0)) | device(X1) | ~owns(X0,X1) )",
    )
    _rejected_at(report, steps, "f14", "countermodel")
    assert steps["f13"].outcome not in (FAILED, REFUTED)


# A clause weakened by a literal over a symbol its parents lack follows
# from them whatever that symbol means (C entails C | L: common practice),
# so it needs no freshness and witnesses nothing.  Found by the mutation
# run (`added_literal`, a sound change by construction).

def test_a_clause_weakened_by_a_problem_symbol_is_a_plain_consequence(tmp_path):
    report, steps = _mutant(
        tmp_path, "inverse_links_printed_quoted_rules",
        "(~ holds(inverse(X0), X1, X2) | holds(X0, X2, X1)), inference('cnf'",
        "(~ holds(inverse(X0), X1, X2) | holds(X0, X2, X1) | ~ symmetric(X0)), inference('cnf'",
    )
    assert steps["zip_derived_cl3"].outcome not in (FAILED, REFUTED, UNPROVEN)
    assert "witnessing nothing" in steps["zip_derived_cl3"].message
    # The weaker clause no longer gives the superposition its claim.
    _rejected_at(report, steps, "zip_derived_cl9", "countermodel")


def test_a_clause_with_a_problem_symbol_that_does_not_follow_is_not_fresh(tmp_path):
    # Attack: the extra literal replaces one the parent gives, so the clause
    # is no weakening; `symmetric` is the problem's, so it witnesses nothing.
    report, steps = _mutant(
        tmp_path, "inverse_links_printed_quoted_rules",
        "(~ holds(inverse(X0), X1, X2) | holds(X0, X2, X1)), inference('cnf'",
        "(~ holds(inverse(X0), X1, X2) | symmetric(X0)), inference('cnf'",
    )
    _rejected_at(report, steps, "zip_derived_cl3", "not_fresh")


def test_a_clause_with_a_witness_of_a_universal_is_still_refused(tmp_path):
    # Attack: `! [Z] : ~ assigned(night_guard, Z)` has no existential to
    # witness, and the clause with its sign turned does not follow (a model
    # where the night guard is assigned nowhere), so the new symbol can
    # neither witness anything nor be a mere weakening.
    report, steps = _mutant(
        tmp_path, "guard_doors_printed_inner_witness_alone",
        "(~ assigned(night_guard, X0)), inference('cnf'",
        "(assigned(night_guard, sk__9)), inference('cnf'",
    )
    _rejected_at(report, steps, "zip_derived_cl0", "wrong_polarity")
