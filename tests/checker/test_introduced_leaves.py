"""Leaves the prover introduces: axioms of choice and valid statements.

TPTP language standard (from memory): ``introduced(axiom_of_choice)`` and
``introduced(tautology)`` are among the standard kinds of introduced
source; an axiom of choice here is a Skolem axiom for fresh symbols.
"""

from checker.outcomes import ACCEPTED, FAILED, REFUTED, REJECTED
from checker.run import check

PROBLEM = """
fof(every_pallet_has_slot, axiom, ! [P] : (pallet(P) => ? [S] : assigned(P, S))).
fof(pallet_9, axiom, pallet(p9)).
fof(home_bay, axiom, ! [P] : bay(home(P))).
fof(goal, conjecture, ? [S] : assigned(p9, S)).
"""

PROOF = """
fof(every_pallet_has_slot, axiom, ! [P] : (pallet(P) => ? [S] : assigned(P, S)), file('problem.p', every_pallet_has_slot)).
fof(pallet_9, axiom, pallet(p9), file('problem.p', pallet_9)).
fof(goal, conjecture, ? [S] : assigned(p9, S), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ ? [S] : assigned(p9, S), inference(negate, [status(cth)], [goal])).
fof(choice, plain, ! [P] : ((? [S] : assigned(P, S)) => assigned(P, slot_of(P))), introduced(axiom_of_choice)).
fof(sk, plain, ! [P] : (pallet(P) => assigned(P, slot_of(P))), inference(skolemize, [status(thm)], [every_pallet_has_slot, choice])).
cnf(c1, plain, ~ pallet(P) | assigned(P, slot_of(P)), inference(clausify, [status(thm)], [sk])).
cnf(c2, plain, ~ assigned(p9, S), inference(clausify, [status(thm)], [n1])).
cnf(c3, plain, pallet(p9), inference(clausify, [status(thm)], [pallet_9])).
cnf(c4, plain, assigned(p9, slot_of(p9)), inference(resolve, [status(thm)], [c1, c3])).
cnf(c5, plain, $false, inference(resolve, [status(thm)], [c4, c2])).
fof(valid, plain, ! [X] : (pallet(X) | ~ pallet(X)), introduced(tautology)).
"""


def run(tmp_path, proof: str):
    (tmp_path / "problem.p").write_text(PROBLEM)
    (tmp_path / "proof.p").write_text(proof)
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))
    return report, {step.name: step for step in report.steps}


def test_axiom_of_choice_for_a_fresh_symbol_is_accepted(tmp_path):
    report, steps = run(tmp_path, PROOF)
    assert report.verdict == ACCEPTED, report.first_failure
    assert "Skolem axiom" in steps["choice"].message and "slot_of/1" in steps["choice"].message
    assert steps["valid"].message.startswith("valid formula")


def test_choice_witness_that_forgets_a_variable_is_refused(tmp_path):
    proof = PROOF.replace("slot_of(P)", "slot_of").replace("slot_of(p9)", "slot_of")
    report, steps = run(tmp_path, proof)
    assert report.verdict == REJECTED
    assert report.first_failure.name == "choice"
    assert "reason: missing_dependency" in steps["choice"].details


def test_choice_witness_from_the_problem_is_not_fresh(tmp_path):
    proof = PROOF.replace("slot_of(", "home(")
    report, steps = run(tmp_path, proof)
    assert report.first_failure.name == "choice"
    assert steps["choice"].outcome == FAILED
    assert "reason: not_fresh" in steps["choice"].details
    assert "problem's `home_bay`" in steps["choice"].message


def test_introduced_statement_that_is_not_valid_is_refuted(tmp_path):
    proof = PROOF.replace("(pallet(X) | ~ pallet(X))", "pallet(X)")
    report, steps = run(tmp_path, proof)
    assert report.verdict == REJECTED
    assert steps["valid"].outcome == REFUTED
