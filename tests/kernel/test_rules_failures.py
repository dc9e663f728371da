"""One test per reason the kernel refuses a step: the reason code, and a
message naming the literal(s), the clashing terms and the position."""

from __future__ import annotations

from dataclasses import dataclass

import pytest

from checker.kernel.clauses import Clause
from checker.kernel.failure import SHOWN_CHARACTERS, Failure, describe_position, quote
from checker.kernel.rules import (
    Chain,
    EqualityFactoring,
    EqualityResolution,
    Instantiation,
    Paramodulation,
    Refutation,
    Resolution,
    check_clause_step,
    check_conclusion,
    replay,
)
from checker.kernel.substitution import Substitution
from strategies import X, Y, a, b, eq, f, g, neg, p, pos, q, r

P_OF_X = Clause([pos(p(X)), pos(r)])
NOT_P_OF_A = Clause([neg(p(a))])


def refused(premises, evidence) -> Failure:
    result = replay(premises, evidence)
    assert isinstance(result, Failure), result
    return result


def test_premise_out_of_range():
    failure = refused([P_OF_X], Resolution(0, 0, 3, 0))
    assert failure.reason == "premise_out_of_range"
    assert failure.message == "right premise 3 does not exist (the step has 1)"
    assert refused([P_OF_X], Instantiation(-1)).message == "instantiated premise -1 does not exist (the step has 1)"
    assert refused([], Paramodulation(0, 0, True, 0, 0, (1,))).message == "equation premise 0 does not exist (the step has 0)"
    assert refused([P_OF_X], Paramodulation(0, 0, True, 1, 0, (1,))).message.startswith("target premise 1")
    failure = refused([], EqualityResolution(0, 0))
    assert failure.reason == "premise_out_of_range"
    assert failure.message == "equality resolution premise 0 does not exist (the step has 0)"
    failure = refused([], EqualityFactoring(0, 0, 1))
    assert failure.reason == "premise_out_of_range"
    assert failure.message == "equality factoring premise 0 does not exist (the step has 0)"
    assert refused([], Resolution(0, 0, 0, 0)).message.startswith("left premise 0")


def test_literal_out_of_range():
    failure = refused([P_OF_X, NOT_P_OF_A], Resolution(0, 2, 1, 0))
    assert failure.reason == "literal_out_of_range"
    assert failure.message == "left literal 2 does not exist in `p(X) | r` (2 literals)"
    assert refused([P_OF_X, NOT_P_OF_A], Resolution(0, 0, 1, 1)).message.startswith("right literal 1 does not exist in `~p(a)`")
    assert refused([P_OF_X, NOT_P_OF_A], Resolution(0, -1, 1, 0)).reason == "literal_out_of_range"
    equation = Clause([pos(eq(a, b))])
    assert refused([equation, P_OF_X], Paramodulation(0, 1, True, 1, 0, (1,))).message.startswith("equation literal 1")
    assert refused([equation, P_OF_X], Paramodulation(0, 0, True, 1, 5, (1,))).message.startswith("target literal 5")
    assert refused([P_OF_X], EqualityResolution(0, 2)).message.startswith("disequality literal 2")
    assert refused([equation], EqualityFactoring(0, 0, 1)).message.startswith("equality factoring literal 1")


def test_literals_of_the_same_sign_are_not_complementary():
    failure = refused([P_OF_X, Clause([pos(p(a))])], Resolution(0, 0, 1, 0, Substitution({X: a})))
    assert failure.reason == "same_sign"
    assert failure.message == "literals not complementary: left literal 0 `p(X)` and right literal 0 `p(a)` are both positive"
    assert "are both negative" in refused([NOT_P_OF_A, NOT_P_OF_A], Resolution(0, 0, 1, 0)).message


def test_atoms_differing_after_substitution():
    left = Clause([pos(q(g(X, a), f(Y)))])
    right = Clause([pos(r), neg(q(g(b, a), f(a)))])
    failure = refused([left, right], Resolution(0, 0, 1, 1, Substitution({X: b, Y: b})))
    assert failure.reason == "atoms_differ"
    assert failure.message == (
        "literals not complementary: left literal 0 `q(g(X,a),f(Y))` and right literal 1 `~q(g(b,a),f(a))` "
        "after substitution: `q(g(b,a),f(b))` and `q(g(b,a),f(a))` differ at position 2.1: `b` vs `a` "
        "(the stated substitutions do not make the atoms equal)"
    )


def test_atoms_with_different_predicates():
    failure = refused([P_OF_X, Clause([neg(q(a, a))])], Resolution(0, 0, 1, 0))
    assert failure.reason == "atoms_differ"
    assert "`p(X)` and `q(a,a)` differ at position root: `p(X)` vs `q(a,a)`" in failure.message


def test_differing_equations_are_compared_the_way_round_they_share_a_side():
    # b = f(X) against a != b: turned round, the right one is b != a, so the
    # real difference is f(X) against a at position 2, not b against a at 1.
    failure = refused([Clause([pos(eq(b, f(X)))]), Clause([neg(eq(a, b))])], Resolution(0, 0, 1, 0))
    assert failure.reason == "atoms_differ"
    assert "differ at position 2: `f(X)` vs `a`" in failure.message
    written_way = refused([Clause([pos(eq(b, f(X)))]), Clause([neg(eq(b, a))])], Resolution(0, 0, 1, 0))
    assert "differ at position 2: `f(X)` vs `a`" in written_way.message
    unrelated = refused([Clause([pos(eq(b, f(X)))]), Clause([neg(eq(a, a))])], Resolution(0, 0, 1, 0))
    assert "differ at position 1: `b` vs `a`" in unrelated.message
    # b = f(X) against f(X) != a share f(X) the other way round: turned, the
    # right one is a != f(X), so the difference is b against a at position 1.
    other_side = refused([Clause([pos(eq(b, f(X)))]), Clause([neg(eq(f(X), a))])], Resolution(0, 0, 1, 0))
    assert "differ at position 1: `b` vs `a`" in other_side.message


def test_paramodulation_needs_a_positive_equation():
    failure = refused([Clause([neg(eq(a, b))]), P_OF_X], Paramodulation(0, 0, True, 1, 0, (1,)))
    assert failure.reason == "not_an_equation"
    assert failure.message == "equation literal 0 `a != b` is not a positive equality"
    assert refused([Clause([pos(p(a))]), P_OF_X], Paramodulation(0, 0, True, 1, 0, (1,))).reason == "not_an_equation"


@pytest.mark.parametrize(
    ("position", "shown"),
    [((), "root"), ((2,), "2"), ((1, 1), "1.1"), ((0,), "0"), ((-1,), "-1")],
)
def test_position_not_in_the_target(position, shown):
    equation = Clause([pos(eq(a, b))])
    failure = refused([equation, Clause([pos(p(X))])], Paramodulation(0, 0, True, 1, 0, position, target_substitution=Substitution({X: a})))
    assert failure.reason == "no_such_position"
    assert failure.message == f"position {shown} is not a term position in target literal 0 `p(a)`"


def test_subterm_not_matching_the_equation_side():
    equation = Clause([pos(eq(f(X), b))])
    target = Clause([neg(q(a, g(f(a), f(b))))])
    evidence = Paramodulation(0, 0, True, 1, 0, (2, 2), equation_substitution=Substitution({X: a}))
    failure = refused([equation, target], evidence)
    assert failure.reason == "subterm_mismatch"
    assert failure.message == (
        "subterm at position 2.2 of target literal 0 `~q(a,g(f(a),f(b)))` does not match the equation side: "
        "`f(b)` and `f(a)` differ at position 1: `b` vs `a` (subterm vs equation side after substitution)"
    )
    # right to left, the side looked for is b
    reverse = refused([equation, target], Paramodulation(0, 0, False, 1, 0, (2, 1)))
    assert reverse.reason == "subterm_mismatch" and "`f(a)` and `b` differ at position root" in reverse.message


def test_equality_resolution_needs_a_disequality():
    for literal in (pos(eq(a, a)), neg(p(a))):
        failure = refused([Clause([pos(r), literal])], EqualityResolution(0, 1))
        assert failure.reason == "not_a_disequality"
        assert failure.message == f"literal 1 `{literal}` is not a disequality"


def test_sides_of_the_disequality_differ():
    failure = refused([Clause([neg(eq(g(X, a), g(b, Y)))])], EqualityResolution(0, 0, Substitution({X: b, Y: b})))
    assert failure.reason == "sides_differ"
    assert failure.message == (
        "disequality literal 0 `g(X,a) != g(b,Y)`: `g(b,a)` and `g(b,b)` differ at position 2: `a` vs `b` "
        "(sides after substitution)"
    )


def test_equality_factoring_needs_two_literals():
    failure = refused([Clause([pos(eq(a, b)), pos(eq(a, X))])], EqualityFactoring(0, 1, 1))
    assert failure.reason == "same_literal"
    assert failure.message == "equality factoring needs two literals, got 1 twice"


def test_equality_factoring_needs_positive_equations():
    premise = Clause([pos(eq(a, b)), neg(eq(a, X)), pos(p(a))])
    failure = refused([premise], EqualityFactoring(0, 0, 1))
    assert failure.reason == "not_an_equation"
    assert failure.message == "literal 1 `a != X` is not a positive equality"
    assert refused([premise], EqualityFactoring(0, 2, 0)).message == "literal 2 `p(a)` is not a positive equality"


def test_factored_sides_differ():
    premise = Clause([pos(eq(f(X), b)), pos(eq(a, f(Y)))])
    failure = refused([premise], EqualityFactoring(0, 0, 1, other_reversed=True, substitution=Substitution({X: a, Y: b})))
    assert failure.reason == "factored_sides_differ"
    assert failure.message == (
        "equality factoring of literals 0 `f(X) = b` and 1 `a = f(Y)`: `f(a)` and `f(b)` differ at position 1: "
        "`a` vs `b` (the sides to be identified, after substitution)"
    )


def test_empty_chain():
    failure = refused([P_OF_X], Chain(()))
    assert failure.reason == "empty_chain"
    assert failure.message == "a chain of inferences needs at least one inference"


@dataclass(frozen=True)
class Guess:
    """Evidence of no kind the kernel knows."""


def test_unknown_evidence():
    failure = refused([P_OF_X], Guess())
    assert failure.reason == "unknown_evidence"
    assert failure.message == "no primitive rule takes evidence of type Guess"


def test_chains_and_refutations_do_not_nest_inside_a_chain():
    inner = Chain((Instantiation(0),))
    failure = refused([P_OF_X], Chain((inner,)))
    assert failure.reason == "unknown_evidence"
    assert failure.message == "inference 1 of 1: no primitive rule takes evidence of type Chain"
    assert refused([P_OF_X], Chain((Instantiation(0), Refutation(inner)))).message.endswith("type Refutation")


def test_failure_inside_a_chain_names_the_inference():
    # inference 1 yields r (premise 2), inference 2 resolves it with r itself
    chain = Chain((Resolution(0, 0, 1, 0, Substitution({X: a})), Resolution(2, 0, 0, 1)))
    failure = refused([P_OF_X, NOT_P_OF_A], chain)
    assert failure.reason == "same_sign"
    assert failure.message == (
        "inference 2 of 2: literals not complementary: left literal 0 `r` and right literal 1 `r` are both positive"
    )


def test_literal_produced_but_missing_from_the_claimed_clause():
    claimed = Clause([pos(q(a, b)), pos(p(b))])
    failure = check_clause_step([P_OF_X, NOT_P_OF_A], claimed, Resolution(0, 0, 1, 0, Substitution({X: a})))
    assert failure.reason == "missing_from_claimed"
    assert failure.message == (
        "computed `r`, claimed `q(a,b) | p(b)`: produced but missing from the claimed clause: `r`; "
        "claimed but not produced: `q(a,b)`, `p(b)`"
    )


def test_missing_literals_are_named_once_and_extra_ones_only_when_there_are_some():
    computed = Clause([pos(p(X)), pos(p(Y)), pos(r)])
    failure = check_conclusion(computed, Clause([pos(r)]), Substitution({Y: X}))
    assert failure.reason == "missing_from_claimed"
    assert failure.message == "computed `p(X) | p(X) | r`, claimed `r`: produced but missing from the claimed clause: `p(X)`"
    two_missing = check_conclusion(Clause([pos(p(a)), pos(q(a, b)), pos(r)]), Clause([pos(r)]))
    assert two_missing.message.endswith("missing from the claimed clause: `p(a)`, `q(a,b)`")


def test_claimed_literals_not_produced_are_a_weakening_not_a_failure():
    assert check_conclusion(Clause([pos(r)]), Clause([pos(q(a, b)), pos(r)])) is None
    assert check_conclusion(Clause(), Clause([pos(r)])) is None


def test_a_refutation_that_does_not_reach_the_empty_clause():
    # premises p(X) | r and ~p(a); claimed r: negated claim ~r is premise 2.
    chain = Chain((Resolution(0, 0, 1, 0, Substitution({X: a})),))
    failure = check_clause_step([P_OF_X, NOT_P_OF_A], Clause([pos(r)]), Refutation(chain))
    assert failure.reason == "refutation_incomplete"
    assert failure.message == "the refutation ends in `r`, not the empty clause"


def test_a_failure_inside_a_refutation_says_so():
    # premise 2 is the negated claim ~r
    chain = Chain((Resolution(2, 0, 1, 0),))
    failure = check_clause_step([P_OF_X, NOT_P_OF_A], Clause([pos(r)]), Refutation(chain))
    assert failure.reason == "same_sign"
    assert failure.message == (
        "refuting the negated claim: inference 1 of 1: literals not complementary: "
        "left literal 0 `~r` and right literal 0 `~p(a)` are both negative"
    )


def test_long_terms_are_abbreviated_in_messages():
    deep = a
    for _ in range(500):
        deep = f(deep)
    failure = refused([Clause([pos(p(deep))]), Clause([neg(p(f(deep)))])], Resolution(0, 0, 1, 0))
    assert failure.reason == "atoms_differ"
    assert f"` ({len(str(p(deep)))} characters) and `" in failure.message and " … " in failure.message
    assert len(failure.message) < 20 * SHOWN_CHARACTERS
    assert f"differ at position {describe_position((1,) * 501)}: `a` vs `f(a)`" in failure.message
    assert describe_position((1,) * 501).endswith("(depth 501)")


def test_quote_and_describe_position():
    assert quote(p(a)) == "`p(a)`"
    assert quote("x" * SHOWN_CHARACTERS) == "`" + "x" * SHOWN_CHARACTERS + "`"
    long_text = quote("x" * 150 + "y" * 150)
    assert long_text.startswith("`" + "x" * 150) and long_text.endswith("y` (300 characters)")
    assert describe_position(()) == "root" and describe_position((2, 1)) == "2.1"
    # Exactly SHOWN_CHARACTERS characters are shown in full, as for quote.
    at_the_limit = (1,) * 99 + (10,)
    assert describe_position(at_the_limit) == "1." * 99 + "10" and len("1." * 99 + "10") == SHOWN_CHARACTERS
