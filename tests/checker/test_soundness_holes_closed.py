"""Soundness attacks that assay once accepted (and, for the last, a latent
plan fault), kept as regressions now that each hole is closed.

Scenarios (rail signals, badge readers) are invented.  See the sibling
test_soundness_attacks.py for the attacks that are already rejected.
"""

from checker.kernel.clauses import Clause
from checker.outcomes import ACCEPTED
from checker.plan import make_plan
from checker.run import check
from formats.derivation import Document, Inference, Location, Parent, Statement
from formats.tptp import parse_tptp


def run(tmp_path, proof: str, problem: str):
    (tmp_path / "proof.p").write_text(proof)
    (tmp_path / "problem.p").write_text(problem)
    return check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))


def test_conjecture_that_is_false_stated_as_a_leaf_is_not_a_refutation(tmp_path):
    # The conjecture is what is to be shown, not something asserted: a leaf
    # stating the conjecture `$false` derives nothing, yet the derivation
    # "reaches $false" through it.  The axiom (a green signal) is
    # consistent, so nothing here refutes it.
    problem = "fof(s1_green, axiom, green(s1)).\nfof(goal, conjecture, $false).\n"
    report = run(tmp_path, "fof(goal, conjecture, $false, file('problem.p', goal)).\n", problem)
    assert report.verdict != ACCEPTED


def test_cnf_conjecture_that_is_the_empty_clause_stated_as_a_leaf(tmp_path):
    # The same with a clause conjecture: the empty clause as the statement
    # to be proved is no derivation of the empty clause.
    problem = "cnf(s1_green, axiom, green(s1)).\ncnf(goal, conjecture, $false).\n"
    report = run(tmp_path, "cnf(goal, conjecture, $false, file('problem.p', goal)).\n", problem)
    assert report.verdict != ACCEPTED


def test_clause_conjecture_weakened_in_its_leaf(tmp_path):
    # Common practice: a leaf may weaken an axiom clause (theta(problem) ⊆
    # leaf), but a weaker conjecture has a stronger negation.  green(s2) |
    # lamp_test is implied by the axiom lamp_test; green(s2) is not (a
    # model: lamp_test true, green(s2) false).  Refuting the negation of the
    # weakened conjecture proves nothing about green(s2).
    problem = "cnf(lamp_check, axiom, lamp_test).\ncnf(goal, conjecture, green(s2)).\n"
    report = run(tmp_path, """
cnf(lamp_check, axiom, lamp_test, file('problem.p', lamp_check)).
cnf(goal, conjecture, green(s2) | lamp_test, file('problem.p', goal)).
fof(n1, negated_conjecture, ~ green(s2) & ~ lamp_test, inference(negate, [status(cth)], [goal])).
fof(f, plain, $false, inference(resolve, [status(thm)], [lamp_check, n1])).
""", problem)
    assert report.verdict != ACCEPTED


TWO_GOALS = """
fof(one_green, axiom, green(s1) | green(s2)).
fof(goal1, conjecture, green(s1)).
fof(goal2, conjecture, green(s2)).
"""


def test_second_conjecture_negated_through_a_nested_record(tmp_path):
    # TPTP language standard (from memory): conjectures are proved one at a
    # time; with both negations the refutation proves only green(s1) |
    # green(s2), which is the axiom.  Neither conjecture follows (a model
    # with only s1 green refutes goal2, one with only s2 green goal1).
    report = run(tmp_path, """
fof(one_green, axiom, green(s1) | green(s2), file('problem.p', one_green)).
fof(goal1, conjecture, green(s1), file('problem.p', goal1)).
fof(goal2, conjecture, green(s2), file('problem.p', goal2)).
fof(n1, negated_conjecture, ~ green(s1), inference(negate, [status(cth)], [goal1])).
fof(n2, negated_conjecture, ~ green(s2),
    inference(negate, [status(cth)], [inference(copy, [status(thm)], [goal2])])).
fof(f, plain, $false, inference(resolve, [status(thm)], [one_green, n1, n2])).
""", TWO_GOALS)
    assert report.verdict != ACCEPTED


def test_second_conjecture_cited_under_the_first_conjectures_name(tmp_path):
    # The same refutation of the disjunction, with the second conjecture's
    # leaf citing the first one's name: the leaf is linked to goal2 by
    # content, but the one-conjecture-at-a-time rule goes by the cited name.
    report = run(tmp_path, """
fof(one_green, axiom, green(s1) | green(s2), file('problem.p', one_green)).
fof(goal1, conjecture, green(s1), file('problem.p', goal1)).
fof(other, conjecture, green(s2), file('problem.p', goal1)).
fof(n1, negated_conjecture, ~ green(s1), inference(negate, [status(cth)], [goal1])).
fof(n2, negated_conjecture, ~ green(s2), inference(negate, [status(cth)], [other])).
fof(f, plain, $false, inference(resolve, [status(thm)], [one_green, n1, n2])).
""", TWO_GOALS)
    assert report.verdict != ACCEPTED


def test_report_names_the_conjecture_actually_refuted_not_the_one_cited(tmp_path):
    # A leaf stating badge(b7) (goal_badge's content) but citing goal_gate:
    # the refutation proves goal_badge, and the report must not say it
    # proves goal_gate, which does not follow (a model with gate_open false).
    problem = """
fof(issued, axiom, badge(b7)).
fof(goal_badge, conjecture, badge(b7)).
fof(goal_gate, conjecture, gate_open).
"""
    report = run(tmp_path, """
fof(g, conjecture, badge(b7), file('problem.p', goal_gate)).
fof(n1, negated_conjecture, ~ badge(b7), inference(negate, [status(cth)], [g])).
fof(issued, axiom, badge(b7), file('problem.p', issued)).
fof(f, plain, $false, inference(resolve, [status(thm)], [issued, n1])).
""", problem)
    assert not any("proves conjecture goal_gate" in caution for caution in report.cautions)


def test_plan_keeps_a_statement_named_like_a_nested_record(tmp_path):
    # Latent (not reachable from TPTP or native text today, since TPTP
    # names cannot contain `/` and native certificates have no nested
    # records): a stated `x/1` and x's nested record share a name; the
    # plan's name-keyed ordering keeps only one of the two steps, so the
    # stated `$false` would never be checked while still counting as the
    # derivation's empty clause.  Common practice: every statement of a
    # derivation is checked or faulted.
    here = Location("proof.p", 1, 1)
    green = parse_tptp("cnf(s1_green, axiom, green(s1)).\n").statements[0].content
    statements = (
        Statement("x/1", "plain", "cnf", Clause(()), here, None),
        Statement("s1_green", "axiom", "cnf", green, here, None),
        Statement(
            "x", "plain", "cnf", green, here,
            Inference("copy", "thm", (Inference("copy", "thm", (Parent("s1_green"),)),)),
        ),
    )
    plan = make_plan(Document("proof.p", statements))
    planned = [step for step in plan.steps if step.statement is not None]
    faulted = set(plan.faults) | {result.name for result in plan.duplicates}
    assert all(
        any(step.statement is statement for step in planned) or statement.name in faulted
        for statement in statements
    )
