"""The search's edges: bounds, degenerate inputs, and the promise that a
search bug costs completeness, never soundness.  Invented scenario: a
conveyor line."""

from __future__ import annotations

from search_strategies import N, P, eq, fn

import checker.search.reconstruct as reconstruct_module
from checker.kernel.clauses import Clause
from checker.kernel.rules import Chain, Instantiation, Paramodulation, Refutation, Resolution, check_clause_step
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable
from checker.search.chains import find_chain
from checker.search.evidence import Attempt, _attempt
from checker.search.reconstruct import reconstruct
from checker.search.saturation import is_tautology, refute
from checker.search.unify import unify

X, Y, Z = variable("X"), variable("Y"), variable("Z")
belt, sorter, chute = application("belt"), application("sorter"), application("chute")


def test_unify_refuses_to_extend_cyclic_bindings():
    assert unify(X, belt, Substitution({Y: fn("f", Y)})) is None
    assert unify(X, belt, Substitution({Y: fn("f", Z)})) == Substitution({X: belt, Y: fn("f", Z)})


def test_tautologies_are_recognised():
    assert is_tautology(Clause([eq(belt, belt)]))
    assert is_tautology(Clause([P("jam", X), N("jam", X)]))
    assert not is_tautology(Clause([P("jam", X), N("jam", Y)]))
    assert not is_tautology(Clause([eq(belt, sorter)]))


def test_refute_with_an_empty_clause_given():
    assert refute([Clause([P("jam", belt)]), Clause([])], 10, 10, 10) == Chain((Instantiation(1),))


def test_refute_stops_at_its_clause_bound():
    clauses = [Clause([P("jam", X), P("stop", X)]), Clause([N("jam", belt)]), Clause([N("stop", belt)])]
    assert refute(clauses, 100, 100, 100) is not None
    assert refute(clauses, 1, 100, 100) is None
    assert refute(clauses, 100, 1, 100) is None


def test_rewriting_by_an_equation_with_a_variable_side():
    # next(next(X)) = X can only be used left to right.
    target = Clause([P("at", fn("next", fn("next", fn("next", fn("next", belt)))))])
    equation = Clause([eq(fn("next", fn("next", X)), X)])
    claimed = Clause([P("at", belt)])
    found = reconstruct([target, equation], claimed, "demodulation")
    assert isinstance(found.evidence, Chain)
    assert all(isinstance(s, Paramodulation) and s.left_to_right for s in found.evidence.steps)
    assert check_clause_step([target, equation], claimed, found.evidence, found.theta) is None
    assert find_chain([target, equation], claimed, [], 10, 10) is None  # no seeds, nothing to start from


def test_resolution_merging_three_literals_at_once():
    left = Clause([P("jam", X), P("jam", Y), P("jam", Z)])
    right = Clause([N("jam", belt)])
    found = reconstruct([left, right], Clause([]), "resolution")
    assert isinstance(found.evidence, Resolution)
    assert found.evidence.left_substitution == Substitution({X: belt, Y: belt, Z: belt})


def test_a_malformed_candidate_is_dropped():
    assert _attempt([Clause([P("jam", belt)])], "resolution", Resolution(0, 5, 0, 0)) is None


def test_a_case_split_needs_the_refutation_and_keeps_stated_bindings():
    # jam or stop; jam raises the alarm; stop sounds the siren; the siren
    # raises the alarm.  No single line of simplifications gets there.
    premises = [
        Clause([P("jam", X), P("stop", X)]),
        Clause([N("jam", Y), P("alarm", Y)]),
        Clause([N("stop", Z), P("siren", Z)]),
        Clause([N("siren", Z), P("alarm", Z)]),
    ]
    claimed = Clause([P("alarm", belt)])
    found = reconstruct(premises, claimed, "", stated=[Substitution({X: belt}), None, None, None])
    assert isinstance(found.evidence, Refutation)
    assert found.evidence.chain.steps[0] == Instantiation(0, Substitution({X: belt}))
    assert check_clause_step(premises, claimed, found.evidence) is None
    wrong = reconstruct(premises, claimed, "", stated=[Substitution({X: sorter}), None, None, None])
    assert wrong.evidence is None
    assert "X -> sorter" in wrong.closest.message and wrong.closest.computed == claimed


def test_stated_bindings_on_a_step_that_fails_anyway():
    premises = [Clause([P("jam", X)])]
    claimed = Clause([P("stop", belt)])
    found = reconstruct(premises, claimed, "", stated=[Substitution({X: belt})])
    assert found.evidence is None
    assert found.closest.extra == (P("stop", belt),)
    assert "stated" not in found.closest.message


def test_bogus_search_results_never_come_back_as_evidence(monkeypatch):
    # Make every stage of the search "find" wrong evidence: the entry point
    # must still return none, because the kernel rejects it.
    premises = [Clause([P("jam", X), P("stop", X)]), Clause([N("jam", belt)])]
    claimed = Clause([P("alarm", chute)])
    bogus = Resolution(0, 0, 1, 0, Substitution({X: belt}))

    def fake_candidates(searched, rule_hint=""):
        yield Attempt("resolution", bogus, claimed)  # claims to compute the claim

    monkeypatch.setattr(reconstruct_module, "candidates", fake_candidates)
    monkeypatch.setattr(reconstruct_module, "find_chain", lambda *args: (Chain((bogus,)), Substitution()))
    monkeypatch.setattr(reconstruct_module, "refute", lambda *args: Chain((bogus,)))
    found = reconstruct(premises, claimed)
    assert found.evidence is None
    with_stated = reconstruct(premises, claimed, stated=[Substitution({X: belt}), None])
    assert with_stated.evidence is None


def test_saturation_does_not_delete_a_clause_by_its_own_parent():
    # The nucleus theta-subsumes (X and Y merged) its own resolvent with
    # jam(sorter), although it is longer; deleting that resolvent would lose
    # the refutation (common practice: subsumption for deletion needs the
    # subsumer to be no longer than the subsumed clause).
    nucleus = Clause([N("ready", Z), N("jam", X), N("jam", Y), P("jam", belt)])
    clauses = [nucleus, Clause([P("ready", belt)]), Clause([P("jam", sorter)]), Clause([N("jam", belt)])]
    chain = refute(clauses, 600, 60, 2000)
    assert chain is not None
    assert check_clause_step(clauses, Clause([]), Refutation(chain)) is None
