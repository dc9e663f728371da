"""Tests of substitutions: a given mapping, applied simultaneously."""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from unification import reify
from unification import var as library_variable

from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import Term, application, variables_of
from strategies import VARIABLES, X, Y, Z, a, b, f, g, ground_terms, substitutions, terms


def test_binding_a_non_variable_is_a_bug():
    with pytest.raises(ValueError, match="binds non-variable a"):
        Substitution({a: b})


def test_identity_bindings_are_dropped():
    assert Substitution({X: X}) == IDENTITY
    assert not Substitution({X: X}) and not IDENTITY and Substitution({X: a})
    assert Substitution({X: X, Y: a}).mapping == {Y: a}


def test_equality_hash_and_text():
    assert Substitution({X: a, Y: f(Z)}) == Substitution({Y: f(Z), X: a})
    assert hash(Substitution({X: a, Y: f(Z)})) == hash(Substitution({Y: f(Z), X: a}))
    assert Substitution({X: a}) != Substitution({X: b}) and Substitution({X: a}) != {X: a}
    assert repr(Substitution({Y: f(Z), X: a})) == "{X -> a, Y -> f(Z)}"
    assert Substitution({Y: b, X: a}).items_sorted() == [(X, a), (Y, b)]


def test_application_is_simultaneous():
    # Simultaneous substitution (common practice): each variable is
    # replaced once, bindings are not applied to each other, so a swap swaps.
    assert Substitution({X: Y, Y: X})(g(X, Y)) is g(Y, X)
    assert Substitution({X: f(Y), Y: a})(g(X, Y)) is g(f(Y), a)


def test_ground_terms_and_the_identity_return_the_same_object():
    assert Substitution({X: a})(g(a, f(b))) is g(a, f(b))
    assert IDENTITY(g(X, Y)) is g(X, Y)
    assert Substitution({Z: a})(g(X, Y)) is g(X, Y)


def test_shared_subterms_are_substituted_once():
    # g(t, t) nested 200 times is 2^200 leaves as a tree but 201 terms as a
    # graph; application must work on the graph.
    term, expected = X, a
    for _ in range(200):
        term, expected = g(term, term), g(expected, expected)
    assert Substitution({X: a})(term) is expected


def test_deep_instance_of_a_variable_shared_at_many_depths():
    term = X
    for _ in range(3000):
        term = g(term, X)
    instance = Substitution({X: f(a)})(term)
    assert instance.ground and variables_of(instance) == set()


@settings(max_examples=200, deadline=None)
@given(term=terms, substitution=substitutions)
def test_variables_of_an_instance(term, substitution):
    instance = substitution(term)
    expected = set()
    for v in variables_of(term):
        expected |= variables_of(substitution.mapping.get(v, v))
    assert variables_of(instance) == expected


@settings(max_examples=200, deadline=None)
@given(term=terms, first=substitutions, second=substitutions)
def test_applying_in_turn_is_applying_the_composition(term, first, second):
    composed = Substitution(
        {**{v: second(t) for v, t in first.mapping.items()}, **{v: t for v, t in second.mapping.items() if v not in first.mapping}}
    )
    assert second(first(term)) is composed(term)


def to_library(term: Term):
    """A term as logical-unification's tuples: ("f", args...), and its vars."""
    if term.is_variable:
        return library_variable(term.symbol)
    return (term.symbol, *(to_library(argument) for argument in term.arguments))


def from_library(expression) -> Term:
    if isinstance(expression, tuple):
        return application(expression[0], tuple(from_library(e) for e in expression[1:]))
    return next(v for v in VARIABLES if library_variable(v.symbol) == expression)


@settings(max_examples=200, deadline=None)
@given(term=terms, bindings=st.dictionaries(st.sampled_from(VARIABLES), ground_terms, max_size=3))
def test_agrees_with_logical_unification_on_ground_bindings(term, bindings):
    # Reference library logical-unification (PyPI): reify applies a mapping
    # of its logic variables; with ground bindings it must give the same
    # instance as ours (with non-ground ones reify would chase bindings,
    # which a simultaneous substitution does not).
    library_bindings = {library_variable(v.symbol): to_library(t) for v, t in bindings.items()}
    assert from_library(reify(to_library(term), library_bindings)) is Substitution(bindings)(term)


def test_bindings_are_listed_in_the_order_of_their_variables():
    # Common practice: a report lists a substitution by variable name, whatever
    # the terms bound, so that the same substitution always reads the same.
    substitution = Substitution({Y: a, X: b})
    assert [variable.symbol for variable, _ in substitution.items_sorted()] == ["X", "Y"]
    assert repr(substitution) == "{X -> b, Y -> a}"
