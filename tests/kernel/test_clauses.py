"""Tests of literals and clauses: sets of literals, symmetric equality."""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.clauses import Clause, Literal, is_equality
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application
from strategies import X, Y, Z, a, b, clauses, eq, f, g, literals, neg, p, pos, q, r


def test_equality_atoms_are_unordered_pairs():
    # s = t and t = s are the same literal (common practice: equality is symmetric).
    assert pos(eq(a, f(X))) == pos(eq(f(X), a))
    assert hash(pos(eq(a, f(X)))) == hash(pos(eq(f(X), a)))
    assert neg(eq(a, b)) == neg(eq(b, a))
    assert pos(eq(a, b)) != neg(eq(a, b))
    assert pos(eq(a, a)) == pos(eq(a, a)) and pos(eq(a, a)) != pos(eq(a, b))


def test_other_atoms_keep_their_argument_order():
    assert pos(q(a, b)) != pos(q(b, a))
    assert pos(p(a)) != neg(p(a))
    assert pos(p(a)) != p(a)  # a literal is not its atom


def test_is_equality_needs_the_symbol_and_two_arguments():
    assert is_equality(eq(a, b))
    assert not is_equality(application("=", (a, b, a)))
    assert not is_equality(application("=", (a,)))
    assert not is_equality(q(a, b))


def test_a_variable_is_not_an_atom():
    with pytest.raises(ValueError, match="a variable is not an atom: X"):
        Literal(True, X)


def test_text_forms():
    # TPTP syntax (TPTP language standard): ~ for negation, != for a
    # negated equation, $false for the empty clause.
    assert str(neg(p(X))) == "~p(X)"
    assert str(pos(r)) == "r"
    assert str(pos(eq(a, f(X)))) == "a = f(X)"
    assert str(neg(eq(a, b))) == "a != b"
    assert str(Clause([pos(p(a)), neg(q(X, b))])) == "p(a) | ~q(X,b)"
    assert str(Clause()) == "$false"
    assert repr(pos(r)) == "Literal(r)" and repr(Clause([pos(r)])) == "Clause(r)"


def test_negated_and_instance():
    assert neg(p(X)).negated() == pos(p(X))
    assert pos(q(X, Y)).instance(Substitution({X: a})) == pos(q(a, Y))


def test_a_clause_is_a_set_that_remembers_how_it_was_written():
    written = [pos(p(a)), neg(q(X, b)), pos(p(a))]
    clause = Clause(written)
    assert clause.literals == tuple(written) and len(clause) == 3
    assert clause.literal_set == {pos(p(a)), neg(q(X, b))}
    assert clause == Clause([neg(q(X, b)), pos(p(a))])
    assert hash(clause) == hash(Clause([neg(q(X, b)), pos(p(a))]))
    assert clause != Clause([pos(p(a))]) and clause != clause.literal_set
    assert clause.without(0) == [neg(q(X, b)), pos(p(a))]
    assert Clause([pos(eq(a, b))]) == Clause([pos(eq(b, a))])


def test_empty_clause():
    assert Clause().is_empty and not Clause([pos(r)]).is_empty and len(Clause()) == 0


def test_instances_merge_literals():
    # Instantiation followed by merging is factoring (Chang & Lee 1973,
    # ch. 5, from memory: P(x) | P(f(y)) | ~Q(x) with {x -> f(y)} has the
    # factor P(f(y)) | ~Q(f(y))).
    def P(t):
        return application("P", (t,))

    def Q(t):
        return application("Q", (t,))

    clause = Clause([pos(P(X)), pos(P(f(Y))), neg(Q(X))])
    factor = clause.instance(Substitution({X: f(Y)}))
    assert factor == Clause([pos(P(f(Y))), neg(Q(f(Y)))]) and len(factor.literal_set) == 2


def test_variables_and_symbols():
    clause = Clause([pos(p(f(X))), neg(eq(Y, a)), pos(r)])
    assert clause.variables() == {X, Y}
    assert clause.symbols() == {("p", 1), ("f", 1), ("=", 2), ("a", 0), ("r", 0)}
    assert Clause().variables() == set() and Clause().symbols() == set()


@settings(max_examples=150, deadline=None)
@given(clause=clauses(max_size=4), data=st.data())
def test_clause_equality_ignores_order_duplicates_and_orientation(clause, data):
    turned = [
        Literal(lit.positive, eq(*lit.atom.arguments[::-1])) if is_equality(lit.atom) else lit for lit in clause.literals
    ]
    shuffled = data.draw(st.permutations(turned + turned[:1]))
    assert Clause(shuffled) == clause and hash(Clause(shuffled)) == hash(clause)


@settings(max_examples=150, deadline=None)
@given(left=literals, right=literals)
def test_literals_are_equal_exactly_when_the_same_up_to_equation_orientation(left, right):
    same = left.positive == right.positive and (
        left.atom is right.atom
        or (is_equality(left.atom) and is_equality(right.atom) and left.atom.arguments == right.atom.arguments[::-1])
    )
    assert (left == right) == same
    if same:
        assert hash(left) == hash(right)


def test_equality_inside_terms_is_an_ordinary_function_symbol():
    # Only the atom's equality is symmetric; "=" as a function symbol in a
    # term is not (the kernel does not treat it specially).
    assert pos(p(eq(a, b))) != pos(p(eq(b, a)))
    assert pos(eq(g(a, Z), b)) == pos(eq(b, g(a, Z)))
