"""Tests of hash-consed terms: sharing, positions, traversal, rendering,
first difference, and terms nested 100,000 deep."""

from __future__ import annotations

import copy
import pickle

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.substitution import Substitution
from checker.kernel.terms import (
    application,
    first_difference,
    render,
    replace_at,
    subterm_at,
    subterms,
    symbols_of,
    variable,
    variables_of,
)
from strategies import X, Y, Z, a, b, f, g, term_positions, terms

import pytest

DEPTH = 100_000


def nested_f(depth: int, innermost):
    """f(f(...f(innermost)...)) built by a loop, never by recursion."""
    term = innermost
    for _ in range(depth):
        term = f(term)
    return term


# --- hash-consing ---------------------------------------------------------


def test_equal_terms_are_one_object():
    assert variable("X") is variable("X")
    assert application("g", (application("a"), variable("X"))) is g(a, X)
    assert application("g", [a, X]) is g(a, X)  # any sequence of arguments


def test_names_arity_and_kind_keep_terms_apart():
    assert variable("a") is not application("a")
    assert application("f") is not application("f", (a,))
    assert g(a, b) is not g(b, a)


def test_ground_and_arity():
    assert a.ground and f(a).ground and not X.ground and not g(a, X).ground
    assert (a.arity, f(a).arity, g(a, b).arity, X.arity) == (0, 1, 2, 0)
    assert X.is_variable and not a.is_variable


def test_text_forms():
    # TPTP syntax (TPTP language standard): f(g(a,X)), no spaces.
    assert render(f(g(a, X))) == "f(g(a,X))"
    assert str(g(X, b)) == "g(X,b)"
    assert repr(a) == "Term('a')"
    assert render(application("h", (a, b, X))) == "h(a,b,X)"


@settings(max_examples=150, deadline=None)
@given(term=terms)
def test_pickling_and_copying_keep_sharing(term):
    assert pickle.loads(pickle.dumps(term)) is term
    assert copy.deepcopy(term) is term


# --- positions ------------------------------------------------------------


def test_subterms_in_preorder_with_positions():
    term = g(f(a), X)
    assert list(subterms(term)) == [((), term), ((1,), f(a)), ((1, 1), a), ((2,), X)]


def test_subterm_at_follows_one_based_indices():
    term = g(f(a), X)
    assert subterm_at(term, ()) is term
    assert subterm_at(term, (1, 1)) is a
    assert subterm_at(term, (2,)) is X


@pytest.mark.parametrize("position", [(0,), (3,), (-1,), (1, 2), (1, 1, 1), (2, 1)])
def test_subterm_at_refuses_positions_the_term_lacks(position):
    assert subterm_at(g(f(a), X), position) is None


def test_replace_at():
    term = g(f(a), X)
    assert replace_at(term, (1, 1), b) is g(f(b), X)
    assert replace_at(term, (), b) is b
    assert replace_at(term, (2,), f(Y)) is g(f(a), f(Y))


@pytest.mark.parametrize("position", [(0,), (-1,), (3,), (1, 2), (2, 1)])
def test_replace_at_refuses_positions_the_term_lacks(position):
    # (-1,) and (0,) would silently pick an argument by Python indexing.
    with pytest.raises(ValueError, match="is not in g"):
        replace_at(g(f(a), X), position, b)


@settings(max_examples=150, deadline=None)
@given(term=terms, replacement=terms, data=st.data())
def test_replace_at_changes_exactly_that_position(term, replacement, data):
    position = data.draw(st.sampled_from(term_positions(term)))
    assert replace_at(term, position, subterm_at(term, position)) is term
    replaced = replace_at(term, position, replacement)
    assert subterm_at(replaced, position) is replacement
    for other in term_positions(term):
        apart = other[: len(position)] != position and position[: len(other)] != other
        if apart:
            assert subterm_at(replaced, other) is subterm_at(term, other)


@settings(max_examples=150, deadline=None)
@given(term=terms)
def test_subterms_agree_with_subterm_at(term):
    listed = list(subterms(term))
    assert sorted(position for position, _ in listed) == sorted(term_positions(term))
    assert all(subterm_at(term, position) is sub for position, sub in listed)


def test_variables_and_symbols():
    term = g(f(X), g(Y, a))
    assert variables_of(term) == {X, Y}
    assert variables_of(f(a)) == set()
    assert symbols_of(term) == {("g", 2), ("f", 1), ("a", 0)}
    assert symbols_of(X) == set()
    shared = g(f(X), f(X))
    assert variables_of(shared) == {X} and symbols_of(shared) == {("g", 2), ("f", 1)}


# --- first difference -----------------------------------------------------


def test_first_difference_cases():
    assert first_difference(g(a, X), g(a, X)) is None
    assert first_difference(f(a), g(a, a)) == ((), f(a), g(a, a))
    assert first_difference(g(X, a), g(Y, a)) == ((1,), X, Y)
    assert first_difference(g(f(a), b), g(X, b)) == ((1,), f(a), X)
    assert first_difference(application("h", (a,)), application("h", (a, b))) == ((), application("h", (a,)), application("h", (a, b)))
    # Leftmost first: 1.1 comes before 2 in preorder, though 2 is shallower.
    assert first_difference(g(f(a), b), g(f(b), Z)) == ((1, 1), a, b)


@settings(max_examples=200, deadline=None)
@given(left=terms, right=terms)
def test_first_difference_is_a_real_and_first_difference(left, right):
    found = first_difference(left, right)
    if found is None:
        assert left is right
        return
    position, here, there = found
    assert subterm_at(left, position) is here and subterm_at(right, position) is there
    assert here.is_variable or there.is_variable or (here.symbol, here.arity) != (there.symbol, there.arity)
    for depth in range(len(position)):
        above_left, above_right = subterm_at(left, position[:depth]), subterm_at(right, position[:depth])
        assert not above_left.is_variable and (above_left.symbol, above_left.arity) == (above_right.symbol, above_right.arity)
        # every argument to the left of the path is the same on both sides
        for index in range(1, position[depth]):
            assert above_left.arguments[index - 1] is above_right.arguments[index - 1]


# --- terms nested 100,000 deep ----------------------------------------------


def test_deep_terms_are_built_shared_and_rendered():
    deep = nested_f(DEPTH, X)
    assert nested_f(DEPTH, X) is deep
    text = render(deep)
    assert text == "f(" * DEPTH + "X" + ")" * DEPTH
    assert variables_of(deep) == {X} and symbols_of(deep) == {("f", 1)}


def test_deep_terms_take_substitution_positions_and_comparison():
    deep = nested_f(DEPTH, X)
    instance = Substitution({X: g(a, b)})(deep)
    assert instance is nested_f(DEPTH, g(a, b)) and instance.ground
    bottom = (1,) * DEPTH
    assert subterm_at(instance, bottom) is g(a, b)
    assert subterm_at(instance, bottom + (2,)) is b
    assert subterm_at(instance, bottom + (3,)) is None
    assert replace_at(instance, bottom + (2,), a) is nested_f(DEPTH, g(a, a))
    assert replace_at(deep, (1,) * (DEPTH // 2), a) is nested_f(DEPTH // 2, a)
    assert first_difference(instance, nested_f(DEPTH, g(a, a))) == (bottom + (2,), b, a)
    assert first_difference(instance, instance) is None


def test_deep_terms_pickle_and_copy():
    deep = nested_f(DEPTH, g(X, a))
    assert pickle.loads(pickle.dumps(deep)) is deep
    assert copy.deepcopy(deep) is deep
    assert next(iter(subterms(deep))) == ((), deep)


def test_walks_visit_a_shared_subterm_once():
    # Each level uses the one below twice: 2**64 paths through 65 distinct
    # subterms, so a walk that revisits shared subterms never ends
    # (hash-consed terms are DAGs; common practice).
    shared, ground = X, a
    for _ in range(64):
        shared, ground = application("pair", (shared, shared)), application("pair", (ground, ground))
    assert variables_of(shared) == {X}
    assert symbols_of(shared) == {("pair", 2)}
    assert symbols_of(ground) == {("pair", 2), ("a", 0)}


def test_a_variable_differs_from_a_constant_of_the_same_name():
    # The kernel takes names as given, so a variable and a constant may
    # share one; they are still different terms.
    assert first_difference(variable("c"), application("c")) == ((), variable("c"), application("c"))
    assert first_difference(application("c"), variable("c")) == ((), application("c"), variable("c"))
