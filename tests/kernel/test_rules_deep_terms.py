"""The primitive rules on terms nested 100,000 deep: no recursion limit is
hit, and the answers are the expected ones."""

from __future__ import annotations

import pytest

from checker.kernel.clauses import Clause
from checker.kernel.rules import (
    CLAIM_CONSTANT_PREFIX,
    Chain,
    EqualityResolution,
    Paramodulation,
    Refutation,
    Resolution,
    check_clause_step,
    replay,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application
from strategies import X, Y, a, b, eq, f, g, neg, p, pos, r

DEPTH = 100_000
BOTTOM = (1,) * DEPTH


def nested_f(depth: int, innermost):
    term = innermost
    for _ in range(depth):
        term = f(term)
    return term


@pytest.fixture(scope="module")
def deep():
    """f^DEPTH(X), f^DEPTH(a) and f^DEPTH(b), built once."""
    return nested_f(DEPTH, X), nested_f(DEPTH, a), nested_f(DEPTH, b)


def test_resolution_on_deep_atoms(deep):
    over_x, over_a, _ = deep
    premises = [Clause([pos(p(over_x)), pos(r)]), Clause([neg(p(over_a))])]
    evidence = Resolution(0, 0, 1, 0, Substitution({X: a}))
    assert check_clause_step(premises, Clause([pos(r)]), evidence) is None


def test_a_deep_clash_is_reported_at_its_position(deep):
    _, over_a, over_b = deep
    failure = replay([Clause([pos(p(over_a))]), Clause([neg(p(over_b))])], Resolution(0, 0, 1, 0))
    assert failure.reason == "atoms_differ"
    assert f"(depth {DEPTH + 1}): `a` vs `b`" in failure.message
    assert len(failure.message) < 5_000


def test_paramodulation_at_the_bottom_of_a_deep_term(deep):
    over_x, over_a, over_b = deep
    premises = [Clause([pos(eq(a, b))]), Clause([pos(p(over_x))])]
    evidence = Paramodulation(0, 0, True, 1, 0, (1, *BOTTOM), target_substitution=Substitution({X: a}))
    assert replay(premises, evidence) == Clause([pos(p(over_b))])
    wrong = replay(premises, Paramodulation(0, 0, True, 1, 0, (1, *BOTTOM, 1)))
    assert wrong.reason == "no_such_position"


def test_equality_resolution_and_conclusion_on_deep_terms(deep):
    over_x, over_a, _ = deep
    premise = Clause([neg(eq(over_x, over_a)), pos(p(g(X, Y)))])
    evidence = EqualityResolution(0, 0, Substitution({X: a}))
    assert check_clause_step([premise], Clause([pos(p(g(a, b)))]), evidence, Substitution({Y: b})) is None
    missing = check_clause_step([premise], Clause([pos(p(g(a, a)))]), evidence)
    assert missing.reason == "missing_from_claimed"


def test_refuting_a_deep_claim(deep):
    over_x, _, _ = deep
    # p(f^n(X)) follows from p(X): its negation ~p(f^n(c0)) is refuted with X -> f^n(c0).
    claimed = Clause([pos(p(over_x))])
    c0 = nested_f(DEPTH, application(f"{CLAIM_CONSTANT_PREFIX}0"))
    chain = Chain((Resolution(0, 0, 1, 0, Substitution({X: c0})),))
    assert check_clause_step([Clause([pos(p(X))])], claimed, Refutation(chain)) is None
