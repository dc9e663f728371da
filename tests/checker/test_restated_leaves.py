"""Leaves a prover restated: linked to the problem statement they restate
by a kernel-replayed entailment, and never when they say more.

The scenario (badges, doors and zones of a site) is invented.  What counts
as the same formula is first-order semantics (common practice): renaming and
reordering the variables of one quantifier block, reordering conjuncts and
disjuncts, the sides of an equation or of ``<=>``, and closing free
variables universally change nothing; TPTP reads a formula's free variables
as universally quantified and ``s != t`` as ``~ s = t`` (TPTP language BNF,
rules fof_infix_unary and fof_unitary_formula, from memory).
"""

import pytest
from tptp_derivation_files import DERIVATIONS, scenarios

from checker.leaves import equivalent_content
from checker.outcomes import CHECKED, FAILED, UNPROVEN
from checker.run import check
from checker.search.reconstruct import SearchLimits
from formats.tptp import parse_formula

PROBLEM = """
fof(badge_rule, axiom, ! [P,D,Z] : ((holds(P,D) & opens(D,Z)) => (enter(P,Z) | revoked(D)))).
fof(escort_rule, axiom, ! [P] : (visitor(P) => ? [E] : (escorts(E,P) & staff(E)))).
fof(one_desk, axiom, ! [X] : (desk(X) => X = desk1)).
fof(guest_badge, axiom, badge_of(guest7) != master_badge).
fof(lobby_staffed, axiom, open(lobby) <=> staffed(lobby)).
fof(some_door, axiom, ? [D] : opens(D, lobby)).
fof(goal, conjecture, ! [P,Z] : ((cleared(P) & zone(Z)) => (enter(P,Z) | ~ locked(Z)))).
"""

BADGE_RULE_REORDERED = "! [X2,X0,X1] : ((holds(X0,X1) & opens(X1,X2)) => (enter(X0,X2) | revoked(X1)))"
GOAL_REORDERED = "! [X1,X0] : ((zone(X1) & cleared(X0)) => (~ locked(X1) | enter(X0,X1)))"


def leaf(tmp_path, line: str, limits: SearchLimits | None = None):
    """The result for the one leaf of a derivation made of ``line`` alone."""
    (tmp_path / "problem.p").write_text(PROBLEM)
    (tmp_path / "proof.p").write_text(line + "\n")
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"), **({"limits": limits} if limits else {}))
    (result,) = [step for step in report.steps if step.name == "l"]
    return result


ACCEPTED_RESTATEMENTS = [
    # (what is restated, leaf, the problem statement it is)
    ("bound variables renamed and reordered", f"fof(l, axiom, {BADGE_RULE_REORDERED}, file('problem.p', badge_rule)).",
     "badge_rule"),
    ("conjuncts and disjuncts reordered",
     "fof(l, axiom, ! [P,D,Z] : ((opens(D,Z) & holds(P,D)) => (revoked(D) | enter(P,Z))), file('problem.p', badge_rule)).",
     "badge_rule"),
    ("free variables left implicit, in another order",
     "fof(l, axiom, (holds(Z,P) & opens(P,D)) => (enter(Z,D) | revoked(P)), file('problem.p', badge_rule)).",
     "badge_rule"),
    ("prefix split into two blocks",
     ("fof(l, axiom, ! [P] : ! [Z,D] : ((holds(P,D) & opens(D,Z)) => (enter(P,Z) | revoked(D))), "
     "file('problem.p', badge_rule))."),
     "badge_rule"),
    ("existential body reordered, variables renamed",
     "fof(l, axiom, ! [X0] : (visitor(X0) => ? [X1] : (staff(X1) & escorts(X1,X0))), file('problem.p', escort_rule)).",
     "escort_rule"),
    ("sides of an equivalence swapped", "fof(l, axiom, staffed(lobby) <=> open(lobby), file('problem.p', lobby_staffed)).",
     "lobby_staffed"),
    ("cited as unknown, found by content", f"fof(l, axiom, {BADGE_RULE_REORDERED}, file('problem.p', unknown)).",
     "badge_rule"),
    ("no source, found by content", f"fof(l, axiom, {BADGE_RULE_REORDERED}).", "badge_rule"),
    ("a clause of the formula's clause form",
     "cnf(l, axiom, ~ holds(A,B) | ~ opens(B,C) | enter(A,C) | revoked(B), file('problem.p', badge_rule)).",
     "badge_rule"),
]


@pytest.mark.parametrize(("shape", "line", "name"), ACCEPTED_RESTATEMENTS, ids=[r[0] for r in ACCEPTED_RESTATEMENTS])
def test_a_restated_axiom_is_linked_to_it_by_a_kernel_replayed_entailment(tmp_path, shape, line, name):
    result = leaf(tmp_path, line)
    assert result.outcome == CHECKED, result.message
    assert f"axiom `{name}` of the problem" in result.message
    assert "kernel checked a cover" in result.message or "kernel checked a refutation" in result.message


@pytest.mark.parametrize(
    "line",
    [
        # TPTP BNF (fof_infix_unary): s != t is ~ s = t; an equation is symmetric.
        "fof(l, axiom, ~ (master_badge = badge_of(guest7)), file('problem.p', guest_badge)).",
        "fof(l, axiom, ~ master_badge = badge_of(guest7), file('problem.p', guest_badge)).",
        "fof(l, axiom, ! [X0] : (desk(X0) => desk1 = X0), file('problem.p', one_desk)).",
    ],
)
def test_a_turned_equation_or_a_spelt_out_inequation_is_the_axiom_itself(tmp_path, line):
    result = leaf(tmp_path, line)
    assert result.outcome == CHECKED and "of the problem" in result.message
    assert "restated" not in result.message  # alpha-equivalent: no search needed


def test_the_report_says_how_a_leaf_was_found(tmp_path):
    assert "(cited as `unknown`)" in leaf(tmp_path, f"fof(l, axiom, {BADGE_RULE_REORDERED}, file('problem.p', unknown)).").message
    assert "(by content)" in leaf(tmp_path, f"fof(l, axiom, {BADGE_RULE_REORDERED}).").message


def test_a_restated_conjecture_is_linked_by_entailments_both_ways(tmp_path):
    result = leaf(tmp_path, f"fof(l, conjecture, {GOAL_REORDERED}, file('problem.p', goal)).")
    assert result.outcome == CHECKED, result.message
    assert "conjecture `goal` of the problem" in result.message and "both ways" in result.message


STRONGER_THAN_THE_AXIOM = [
    # (how it is stronger, leaf); in each the problem statement does not
    # entail the leaf (first-order semantics, common practice).
    ("dropped disjunct",
     "fof(l, axiom, ! [X2,X0,X1] : ((opens(X1,X2) & holds(X0,X1)) => enter(X0,X2)), file('problem.p', badge_rule))."),
    ("existential turned universal",
     "fof(l, axiom, ! [X0] : (visitor(X0) => ! [X1] : (staff(X1) & escorts(X1,X0))), file('problem.p', escort_rule))."),
    ("quantifiers swapped, one escort for all",
     "fof(l, axiom, ? [E] : ! [P] : (visitor(P) => (escorts(E,P) & staff(E))), file('problem.p', escort_rule))."),
    ("sign flipped, hidden by reordering",
     ("fof(l, axiom, ! [P,D,Z] : ((opens(D,Z) & holds(P,D)) => (~ revoked(D) | enter(P,Z))), "
     "file('problem.p', badge_rule)).")),
    ("a different equation", "fof(l, axiom, ~ (master_badge = badge_of(guest8)), file('problem.p', guest_badge))."),
    ("an equation turned into another", "fof(l, axiom, ! [X0] : (desk(X0) => desk2 = X0), file('problem.p', one_desk))."),
    ("variables crossed",
     ("fof(l, axiom, ! [X0,X1,X2] : ((holds(X0,X1) & opens(X1,X2)) => (enter(X2,X0) | revoked(X1))), "
     "file('problem.p', badge_rule)).")),
    ("an existential left free, so universal", "fof(l, axiom, opens(D, lobby), file('problem.p', some_door))."),
    ("stronger, found by content only",
     "fof(l, axiom, ! [X2,X0,X1] : ((opens(X1,X2) & holds(X0,X1)) => enter(X0,X2)), file('problem.p', unknown))."),
]


@pytest.mark.parametrize(("how", "line"), STRONGER_THAN_THE_AXIOM, ids=[a[0] for a in STRONGER_THAN_THE_AXIOM])
def test_a_restated_leaf_stronger_than_the_axiom_is_not_in_the_problem(tmp_path, how, line):
    result = leaf(tmp_path, line)
    assert result.outcome == FAILED
    assert result.reason == "not_in_problem"
    assert "not in the problem" in result.message


def test_the_failure_shows_the_cited_problem_statement(tmp_path):
    result = leaf(tmp_path, STRONGER_THAN_THE_AXIOM[0][1])
    assert "the problem's `badge_rule` is `! [P,D,Z] : ((holds(P,D) & opens(D,Z)) => (enter(P,Z) | revoked(D)))`" in (
        result.message
    )


def test_with_nothing_cited_the_failure_shows_the_statement_sharing_most_symbols(tmp_path):
    # visitor/1 and staff/1 occur together only in escort_rule.
    result = leaf(tmp_path, "fof(l, axiom, ! [X0] : (visitor(X0) => staff(X0))).")
    assert result.reason == "not_in_problem"
    assert "the closest problem statement is `escort_rule`" in result.message


def test_with_no_symbol_shared_no_statement_is_shown(tmp_path):
    result = leaf(tmp_path, "fof(l, axiom, ! [X0] : flooded(X0)).")
    assert result.reason == "not_in_problem" and "closest" not in result.message


@pytest.mark.parametrize(
    "conjecture",
    [
        # weaker: the problem's conjecture entails it, not the other way
        "! [P,Z] : ((cleared(P) & zone(Z) & badge(P)) => (enter(P,Z) | ~ locked(Z)))",
        # stronger: it entails the problem's conjecture, not the other way
        "! [P,Z] : (zone(Z) => (enter(P,Z) | ~ locked(Z)))",
        # the same symbols, reordered, but a variable crossed
        "! [X1,X0] : ((zone(X1) & cleared(X0)) => (~ locked(X0) | enter(X0,X1)))",
    ],
)
def test_a_conjecture_leaf_weaker_or_stronger_than_the_problems_is_not_its_conjecture(tmp_path, conjecture):
    # A weaker conjecture has a stronger negation; a stronger one is another theorem.
    result = leaf(tmp_path, f"fof(l, conjecture, {conjecture}, file('problem.p', goal)).")
    assert result.outcome == FAILED and result.reason == "not_a_problem_conjecture"
    assert "the problem's `goal` is" in result.message


@pytest.mark.parametrize("cited", ["goal", "unknown"])
def test_the_restated_conjecture_is_no_axiom(tmp_path, cited):
    result = leaf(tmp_path, f"fof(l, axiom, {GOAL_REORDERED}, file('problem.p', {cited})).")
    assert result.outcome == FAILED and result.reason == "conjecture_as_axiom"


def _shift_plan(order: list[int]) -> str:
    """Thirteen alternative shift plans for a zone, each two conditions:
    2^13 clauses multiplied out, more than a cover is tried on
    (checker.search.covering.CLAUSE_LIMIT), so only a refutation confirms
    a reordering of it."""
    return " | ".join(f"(day{n}(Z) & night{n}(Z))" for n in order)


def test_a_restatement_the_kernel_could_not_confirm_is_unproven_not_failed(tmp_path):
    # With no room for a refutation, the proposal alone must not be accepted,
    # and since it does restate the axiom, neither is the leaf failed.
    cramped = SearchLimits(saturation_clauses=1, saturation_given=1)
    plans = list(range(13))
    (tmp_path / "problem.p").write_text(
        f"fof(shift_plans, axiom, ! [Z] : ({_shift_plan(plans)})).\n"
        f"fof(goal, conjecture, ? [Z] : ({_shift_plan(plans)})).\n"
    )
    reordered = _shift_plan(plans[::-1])
    for line, restates in (
        (f"fof(l, axiom, ! [X] : ({reordered.replace('(Z)', '(X)')}), file('problem.p', shift_plans)).",
         "restates axiom `shift_plans`"),
        (f"fof(l, conjecture, ? [X] : ({reordered.replace('(Z)', '(X)')}), file('problem.p', goal)).",
         "restates conjecture `goal`"),
    ):
        (tmp_path / "proof.p").write_text(line + "\n")
        report = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"), limits=cramped)
        (result,) = [step for step in report.steps if step.name == "l"]
        assert result.outcome == UNPROVEN and restates in result.message, result.message


CARD_AXIOMS = """
fof(card_holder, axiom, ! [P] : (cleared(P) => holds(P,card3))).
fof(card_opens, axiom, ! [Z] : (zone(Z) => opens(card3,Z))).
fof(card_valid, axiom, ~ revoked(card3)).
"""

REFUTATION = f"""
fof(f1, axiom, {BADGE_RULE_REORDERED}, file('problem.p', badge_rule)).
fof(f2, conjecture, {GOAL_REORDERED}, file('problem.p', goal)).
fof(f3, axiom, cleared(X) => holds(X,card3), file('problem.p', card_holder)).
fof(f4, axiom, ! [X0] : (opens(card3,X0) | ~ zone(X0)), file('problem.p', card_opens)).
fof(f5, axiom, ~ revoked(card3), file('problem.p', card_valid)).
fof(f6, negated_conjecture, ~ {GOAL_REORDERED}, inference(negated_conjecture, [status(cth)], [f2])).
fof(f7, plain, zone(sk1) & cleared(sk0) & locked(sk1) & ~ enter(sk0,sk1), inference(skolemize, [status(esa)], [f6])).
cnf(c1, plain, ~ holds(A,B) | ~ opens(B,C) | enter(A,C) | revoked(B), inference(clausify, [status(thm)], [f1])).
cnf(c2, plain, ~ cleared(X) | holds(X,card3), inference(clausify, [status(thm)], [f3])).
cnf(c3, plain, opens(card3,X) | ~ zone(X), inference(clausify, [status(thm)], [f4])).
cnf(c4, plain, zone(sk1), inference(clausify, [status(thm)], [f7])).
cnf(c5, plain, cleared(sk0), inference(clausify, [status(thm)], [f7])).
cnf(c6, plain, ~ enter(sk0,sk1), inference(clausify, [status(thm)], [f7])).
cnf(c7, plain, holds(sk0,card3), inference(resolve, [status(thm)], [c2, c5])).
cnf(c8, plain, opens(card3,sk1), inference(resolve, [status(thm)], [c3, c4])).
cnf(c9, plain, ~ opens(card3,C) | enter(sk0,C) | revoked(card3), inference(resolve, [status(thm)], [c1, c7])).
cnf(c10, plain, enter(sk0,sk1) | revoked(card3), inference(resolve, [status(thm)], [c9, c8])).
cnf(c11, plain, revoked(card3), inference(resolve, [status(thm)], [c10, c6])).
cnf(c12, plain, $false, inference(resolve, [status(thm)], [c11, f5])).
"""


def test_a_refutation_from_restated_leaves_negating_a_restated_conjecture_is_accepted(tmp_path):
    # By construction: sk0 is cleared, so holds card3, which opens zone sk1
    # and is not revoked, so badge_rule lets sk0 enter sk1, against the
    # negated goal.  f4 restates card_opens beyond reordering (=> as |).
    (tmp_path / "problem.p").write_text(PROBLEM + CARD_AXIOMS)
    (tmp_path / "proof.p").write_text(REFUTATION)
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))
    assert report.verdict == "accepted", report.first_failure
    steps = {step.name: step for step in report.steps}
    assert all(steps[name].outcome == CHECKED for name in ("f1", "f2", "f3", "f4", "f5"))
    assert "as a consequence" in steps["f4"].message and "restated" in steps["f1"].message


RESTATING_SCENARIOS = [
    "archive_dehumidifier", "cargo_hold_ventilation", "harbour_pilot_roster",
    "lab_freezer_alarm", "seed_vault_access", "tram_depot_points",
]


@pytest.mark.parametrize("name", RESTATING_SCENARIOS)
def test_the_derivation_fixtures_hold_restated_leaves(name):
    # fixtures/tptp/derivations: derivations whose leaves a prover restated
    # (test_tptp_derivations.py checks each is accepted, test_tptp_mutants.py
    # that its mutant is rejected at the one restated leaf made wrong).
    scenario = DERIVATIONS / name
    assert scenario in scenarios()
    report = check(str(scenario / "proof.p"), str(scenario / "problem.p"))
    assert any(step.outcome == CHECKED and "restated" in step.message for step in report.steps)


@pytest.mark.parametrize(
    ("problem", "leaf", "equivalent"),
    [
        # common practice: reorderings and rewordings that keep the meaning
        ("! [P,Z] : ((cleared(P) & zone(Z)) => enter(P,Z))", "! [X1,X0] : ((zone(X1) & cleared(X0)) => enter(X0,X1))",
         True),
        ("! [P,Z] : ((cleared(P) & zone(Z)) => enter(P,Z))", "! [X0,X1] : (~ cleared(X0) | ~ zone(X1) | enter(X0,X1))",
         True),
        ("a != b", "~ (b = a)", True),
        # one direction only: never enough for a conjecture
        ("! [P,Z] : ((cleared(P) & zone(Z)) => enter(P,Z))", "! [P,Z] : (cleared(P) => enter(P,Z))", False),
        ("! [P,Z] : (cleared(P) => enter(P,Z))", "! [P,Z] : ((cleared(P) & zone(Z)) => enter(P,Z))", False),
        ("? [P] : enter(P,lobby)", "! [P] : enter(P,lobby)", False),
    ],
)
def test_equivalent_content_needs_entailment_both_ways(problem, leaf, equivalent):
    assert equivalent_content(parse_formula(problem), parse_formula(leaf)) is equivalent
