"""The negated claim of a refutation: one negated unit per claimed
literal, the claim's variables replaced by constants fresh for the step."""

from __future__ import annotations

from checker.kernel.clauses import Clause
from checker.kernel.rules import CLAIM_CONSTANT_PREFIX, Chain, Refutation, Resolution, check_clause_step, negated_claim
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application
from strategies import X, Y, Z, a, eq, f, g, neg, p, pos, q, r


def constant(number: int):
    return application(f"{CLAIM_CONSTANT_PREFIX}{number}")


def test_one_negated_unit_per_literal_in_written_order():
    claimed = Clause([pos(q(Y, X)), neg(p(Z)), pos(eq(X, a))])
    c0, c1, c2 = constant(0), constant(1), constant(2)
    # variables are numbered in name order: X -> c0, Y -> c1, Z -> c2
    assert [unit.literals for unit in negated_claim([], claimed)] == [
        (neg(q(c1, c0)),),
        (pos(p(c2)),),
        (neg(eq(c0, a)),),
    ]


def test_ground_and_empty_claims():
    assert negated_claim([], Clause([pos(p(a))])) == [Clause([neg(p(a))])]
    assert negated_claim([Clause([pos(r)])], Clause()) == []


def test_constants_are_fresh_for_premises_and_claim_whatever_their_arity():
    taken_by_premise = Clause([pos(p(constant(0)))])
    taken_by_claim_as_a_function = application(f"{CLAIM_CONSTANT_PREFIX}1", (a,))
    claimed = Clause([pos(q(X, taken_by_claim_as_a_function)), pos(p(Y))])
    units = negated_claim([taken_by_premise], claimed)
    assert units == [Clause([neg(q(constant(2), taken_by_claim_as_a_function))]), Clause([neg(p(constant(3)))])]


def test_a_refutation_cannot_borrow_a_constant_of_the_premises():
    # p(c0) does not entail p(X); if the negated claim reused c0 as its
    # constant, ~p(c0) would resolve with the premise and "refute" it.
    premise = Clause([pos(p(constant(0)))])
    borrowed = Refutation(Chain((Resolution(0, 0, 1, 0),)))
    failure = check_clause_step([premise], Clause([pos(p(X))]), borrowed)
    assert failure.reason == "atoms_differ"
    assert f"`{CLAIM_CONSTANT_PREFIX}0` vs `{CLAIM_CONSTANT_PREFIX}1`" in failure.message


def test_claims_with_variables_are_refuted_only_when_they_follow():
    # p(Z) entails p(g(X, f(Y))): the negated claim ~p(g(c0, f(c1))) is
    # refuted with Z -> g(c0, f(c1)).
    premise = Clause([pos(p(Z))])
    chain = Chain((Resolution(0, 0, 1, 0, Substitution({Z: g(constant(0), f(constant(1)))})),))
    assert check_clause_step([premise], Clause([pos(p(g(X, f(Y))))]), Refutation(chain)) is None
    # p(g(Z, Z)) does not entail p(g(X, Y)): no instance of it is ~p(g(c0, c1))'s complement.
    narrower = Clause([pos(p(g(Z, Z)))])
    attempt = Chain((Resolution(0, 0, 1, 0, Substitution({Z: constant(0)})),))
    failure = check_clause_step([narrower], Clause([pos(p(g(X, Y)))]), Refutation(attempt))
    assert failure.reason == "atoms_differ" and "differ at position 1.2" in failure.message
