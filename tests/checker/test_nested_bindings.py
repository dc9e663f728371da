"""Bindings stated inside nested records are held as on a single inference.

A record ``inference(resolve, [...], [a:[bind(X, $fot(c))], b])`` whose
conclusion is never stated may use ``a`` only as its stated instance.  A
claim that follows from the named statements only without those bindings
fails at the record that states them (``wrong_bindings``), and the outer
step rests on it.  Scenarios (ambulance dispatch, parcel forwarding, a
tool store) are invented; a bound instance of an axiom follows from it
(first-order semantics, common practice).
"""

from __future__ import annotations

from pathlib import Path

from checker.outcomes import ACCEPTED, FAILED, REJECTED, RECONSTRUCTED, UNFOUNDED
from checker.run import check

AMBULANCE = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "derivations" / "ambulance_dispatch_nested"


def step(report, name: str):
    return next(s for s in report.steps if s.name == name)


def run(tmp_path, proof: str, problem: str):
    (tmp_path / "proof.p").write_text(proof)
    (tmp_path / "problem.p").write_text(problem)
    return check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))


def test_a_correct_binding_in_a_nested_record_is_accepted():
    report = check(str(AMBULANCE / "proof.p"), str(AMBULANCE / "problem.p"))
    assert report.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in report.steps]
    # the record's conclusion is computed from the stated instance of call_to_station
    assert step(report, "c1/1").outcome == RECONSTRUCTED
    assert "computed `assigned(call31,station_of(harbour))`" in step(report, "c1/1").message


def _ambulance_with(tmp_path, binding: str):
    text = (AMBULANCE / "proof.p").read_text(encoding="utf-8")
    stated = "[bind(C, $fot(call31)), bind(D, $fot(harbour))]"
    assert stated in text
    (tmp_path / "proof.p").write_text(text.replace(stated, binding))
    return check(str(tmp_path / "proof.p"), str(AMBULANCE / "problem.p"))


def test_a_changed_binding_in_a_nested_record_fails_at_that_record(tmp_path):
    # D -> st2 makes the instance `~call_in(call31, st2) | ...`, which does
    # not resolve with call_in(call31, harbour); without the bindings c1
    # follows, so the bindings are what is wrong.
    report = _ambulance_with(tmp_path, "[bind(C, $fot(call31)), bind(D, $fot(st2))]")
    assert report.verdict == REJECTED
    failure = report.first_failure
    assert (failure.name, failure.outcome, failure.reason) == ("c1/1", FAILED, "wrong_bindings")
    assert "the bindings it states for `call_to_station` ({C -> call31, D -> st2}) are wrong" in failure.message
    assert step(report, "c1").outcome == UNFOUNDED
    assert "only without the bindings `c1/1` states" in step(report, "c1").details[1]


def test_a_changed_binding_of_the_other_variable_fails_too(tmp_path):
    report = _ambulance_with(tmp_path, "[bind(C, $fot(st2)), bind(D, $fot(harbour))]")
    assert (report.first_failure.name, report.first_failure.reason) == ("c1/1", "wrong_bindings")


def test_a_binding_more_specific_than_the_unifier_is_accepted(tmp_path):
    # The record binds Y, which the resolution itself leaves free: the
    # instance still resolves, and the outer claim is its instance.
    problem = """
cnf(lent_is_out, axiom, ~ lent(T, P) | out(T, P)).
cnf(drill_lent, axiom, lent(drill, P)).
fof(goal, conjecture, out(drill, ana)).
"""
    proof = """
cnf(lent_is_out, axiom, ~ lent(T, P) | out(T, P), file('problem.p', lent_is_out)).
cnf(drill_lent, axiom, lent(drill, P), file('problem.p', drill_lent)).
fof(n, negated_conjecture, ~ out(drill, ana), inference(assume_negation, [status(cth)], [goal])).
cnf(c1, plain, $false,
    inference(resolve, [status(thm)],
      [inference(resolve, [status(thm)], [lent_is_out:[bind(P, $fot(ana))], drill_lent]), n])).
"""
    report = run(tmp_path, proof, problem)
    assert report.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in report.steps]
    assert "computed `out(drill,ana)`" in step(report, "c1/1").message
    wrong = run(tmp_path, proof.replace("$fot(ana)", "$fot(bob)"), problem + "cnf(bob, axiom, out(bob, bob)).\n")
    assert (wrong.first_failure.name, wrong.first_failure.reason) == ("c1/1", "wrong_bindings")


FORWARDING = """
cnf(idem, axiom, fwd(fwd(X)) = fwd(X)).
cnf(dock_to_bay, axiom, fwd(dock) = bay).
cnf(crate_at, axiom, at(crate, fwd(fwd(dock)))).
fof(goal, conjecture, at(crate, bay)).
"""

REWRITES = """
fof(n, negated_conjecture, ~ at(crate, bay), inference(assume_negation, [status(cth)], [goal])).
cnf(c1, plain, at(crate, bay),
    inference(rw, [status(thm)], [inference(rw, [status(thm)], [crate_at, idem:[bind(X, $fot(BOUND))]]), dock_to_bay])).
cnf(c2, plain, $false, inference(resolve, [status(thm)], [c1, n])).
"""


def test_a_binding_of_an_equation_in_nested_rewriting_records_is_held(tmp_path):
    right = run(tmp_path, REWRITES.replace("BOUND", "dock"), FORWARDING)
    assert right.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in right.steps]
    # idem as fwd(fwd(bay)) = fwd(bay) rewrites nothing in at(crate, fwd(fwd(dock))):
    # neither the record's guesses, nor the chain through the rewriting
    # records, nor the named statements with that instance give c1.
    wrong = run(tmp_path, REWRITES.replace("BOUND", "bay"), FORWARDING)
    assert wrong.verdict == REJECTED
    assert (wrong.first_failure.name, wrong.first_failure.reason) == ("c1/1", "wrong_bindings")
    assert "the bindings it states for `idem` ({X -> bay}) are wrong" in wrong.first_failure.message
