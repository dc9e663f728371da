"""Conjectures: each is refuted on its own, and the report says what a
refutation shows about them.

TPTP language standard (from memory): a problem's conjectures are proved one
at a time; a refutation of the axioms with the negations of two conjectures
proves only their disjunction.
"""

from checker.outcomes import ACCEPTED, FAILED, REJECTED
from checker.run import check

PROBLEM = """
fof(door_locked, axiom, locked(door1)).
fof(alarm_armed, axiom, armed(alarm1)).
fof(goal_locked, conjecture, locked(door1)).
fof(goal_armed, conjecture, armed(alarm1)).
"""

ONE_CONJECTURE = """
fof(door_locked, axiom, locked(door1), file('problem.p', door_locked)).
fof(goal_locked, conjecture, locked(door1), file('problem.p', goal_locked)).
fof(n1, negated_conjecture, ~ locked(door1), inference(negate, [status(cth)], [goal_locked])).
cnf(c1, plain, locked(door1), inference(clausify, [status(thm)], [door_locked])).
cnf(c2, plain, ~ locked(door1), inference(clausify, [status(thm)], [n1])).
cnf(c3, plain, $false, inference(resolve, [status(thm)], [c1, c2])).
"""

BOTH_CONJECTURES = """
fof(goal_locked, conjecture, locked(door1), file('problem.p', goal_locked)).
fof(goal_armed, conjecture, armed(alarm1), file('problem.p', goal_armed)).
fof(n1, negated_conjecture, ~ locked(door1), inference(negate, [status(cth)], [goal_locked])).
fof(n2, negated_conjecture, ~ armed(alarm1), inference(negate, [status(cth)], [goal_armed])).
fof(door_locked, axiom, locked(door1), file('problem.p', door_locked)).
cnf(c1, plain, locked(door1), inference(clausify, [status(thm)], [door_locked])).
cnf(c2, plain, ~ locked(door1), inference(clausify, [status(thm)], [n1])).
cnf(c3, plain, $false, inference(resolve, [status(thm)], [c1, c2])).
"""

INCONSISTENT_PROBLEM = """
fof(door_locked, axiom, locked(door1)).
fof(door_open, axiom, ~ locked(door1)).
fof(goal_armed, conjecture, armed(alarm1)).
"""

AXIOMS_ONLY = """
cnf(door_locked, axiom, locked(door1), file('problem.p', door_locked)).
cnf(door_open, axiom, ~ locked(door1), file('problem.p', door_open)).
cnf(c1, plain, $false, inference(resolve, [status(thm)], [door_locked, door_open])).
"""


def run(tmp_path, problem: str, proof: str):
    (tmp_path / "problem.p").write_text(problem)
    (tmp_path / "proof.p").write_text(proof)
    return check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))


def test_refuting_one_conjecture_is_accepted_and_says_which(tmp_path):
    report = run(tmp_path, PROBLEM, ONE_CONJECTURE)
    assert report.verdict == ACCEPTED
    assert any("proves conjecture goal_locked only" in c and "goal_armed" in c for c in report.cautions)


def test_negating_a_second_conjecture_fails_that_step(tmp_path):
    report = run(tmp_path, PROBLEM, BOTH_CONJECTURES)
    assert report.verdict == REJECTED
    failure = report.first_failure
    assert failure.name == "n2" and failure.outcome == FAILED
    assert "already negated conjecture `goal_locked`" in failure.message


def test_a_refutation_of_the_axioms_alone_is_flagged_as_inconsistency(tmp_path):
    report = run(tmp_path, INCONSISTENT_PROBLEM, AXIOMS_ONLY)
    assert report.verdict == ACCEPTED
    assert any("axioms are inconsistent" in c for c in report.cautions)


def test_cautions_name_conjectures_as_the_problem_does(tmp_path):
    # The derivation calls its copy of the conjecture `g1`; it cites the
    # problem's `goal_locked`, which is what the report must name.
    proof = ONE_CONJECTURE.replace("fof(goal_locked, conjecture", "fof(g1, conjecture").replace("[goal_locked]", "[g1]")
    report = run(tmp_path, PROBLEM, proof)
    assert report.verdict == ACCEPTED
    assert report.cautions == (
        "proves conjecture goal_locked only; the problem's other conjectures (goal_armed) are not addressed",
    )


GATE_PROBLEM = """
fof(gate_rule, axiom, ~ (open(gate4) & armed(gate4))).
fof(goal, conjecture, open(gate4) & armed(gate4)).
"""


def negation_step(formula: str) -> str:
    return f"""
fof(goal, conjecture, open(gate4) & armed(gate4), file('problem.p', goal)).
fof(n1, negated_conjecture, {formula}, inference(negate, [status(cth)], [goal])).
"""


def test_a_negation_with_the_negation_pushed_in_is_equivalent(tmp_path):
    # Common practice (De Morgan): ~ (A & B) is equivalent to ~ A | ~ B.
    report = run(tmp_path, GATE_PROBLEM, negation_step("~ open(gate4) | ~ armed(gate4)"))
    step = {s.name: s for s in report.steps}["n1"]
    assert step.message.startswith("equivalent to the negation of the conjecture")


def test_a_mere_consequence_of_the_negation_is_not_the_negation(tmp_path):
    # ~ (A & B) entails ~ A | ~ B | C but not the other way round.
    report = run(tmp_path, GATE_PROBLEM, negation_step("~ open(gate4) | ~ armed(gate4) | sealed(gate4)"))
    step = {s.name: s for s in report.steps}["n1"]
    assert step.outcome == FAILED
    assert "reason: not_the_negation" in step.details
    assert any(line.startswith("domain = ") for line in step.details)


def test_a_negation_step_takes_the_conjecture_alone(tmp_path):
    proof = negation_step("~ (open(gate4) & armed(gate4))").replace("[goal])", "[goal, gate_rule])")
    proof += "fof(gate_rule, axiom, ~ (open(gate4) & armed(gate4)), file('problem.p', gate_rule)).\n"
    report = run(tmp_path, GATE_PROBLEM, proof)
    step = {s.name: s for s in report.steps}["n1"]
    assert step.outcome == FAILED and "reason: negation_parents" in step.details


def test_negating_a_derived_statement_labelled_conjecture_fails(tmp_path):
    # Only a conjecture of the problem may be negated: a step that merely
    # carries the role `conjecture` proves nothing about the problem's goal.
    # Its content is weaker than goal_locked (implied by it, not implying
    # it), so the refutation shows only locked(door1) | sealed(door1).
    proof = """
fof(door_locked, axiom, locked(door1), file('problem.p', door_locked)).
fof(fake_goal, conjecture, locked(door1) | sealed(door1), inference(weaken, [status(thm)], [door_locked])).
fof(n1, negated_conjecture, ~ (locked(door1) | sealed(door1)), inference(negate, [status(cth)], [fake_goal])).
cnf(c1, plain, locked(door1), inference(clausify, [status(thm)], [door_locked])).
cnf(c2, plain, ~ locked(door1), inference(clausify, [status(thm)], [n1])).
cnf(c3, plain, $false, inference(resolve, [status(thm)], [c1, c2])).
"""
    report = run(tmp_path, PROBLEM, proof)
    assert report.verdict == REJECTED
    assert report.first_failure.name == "n1"
    assert "reason: not_a_problem_conjecture" in report.first_failure.details
