"""Knuth-Bendix and lexicographic path orders (untrusted search helpers).

Properties from Baader & Nipkow, "Term Rewriting and All That" (1998),
section 5.4 (from memory): both orders, for any precedence (and admissible
weights), are simplification orders -- irreflexive, transitive, closed
under substitution and under contexts, with the subterm property -- and
every greater term holds every variable of the smaller one; with a total
precedence both are total on ground terms.
"""

from hypothesis import given, settings
from hypothesis import strategies as st
from search_strategies import CONSTANTS, FUNCTIONS, VARIABLES, ground_terms, terms

from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, subterms, variable, variables_of
from checker.search.term_order import KnuthBendixOrder, LexicographicPathOrder, likely_orders
from formats.tptp import parse_clause

SYMBOLS = [(name, 0) for name in CONSTANTS] + list(FUNCTIONS)


@st.composite
def orders(draw):
    ranking = draw(st.permutations(SYMBOLS))
    precedence = {symbol: rank for rank, symbol in enumerate(ranking)}
    if draw(st.booleans()):
        return LexicographicPathOrder(precedence)
    weights = {symbol: draw(st.integers(1, 3)) for symbol in SYMBOLS}
    greatest = ranking[-1]
    if greatest[1] == 1 and draw(st.booleans()):
        weights[greatest] = 0  # a unary symbol greatest in the precedence may weigh 0
    return KnuthBendixOrder(precedence, weights)


def _term(text):
    return parse_clause(f"p({text})").literals[0].atom.arguments[0]


@settings(max_examples=200, deadline=None)
@given(orders(), terms())
def test_irreflexive_and_the_subterm_property(order, term):
    assert not order.greater(term, term)
    for position, subterm in subterms(term):
        if position:
            assert order.greater(term, subterm)
            assert not order.greater(subterm, term)


@settings(max_examples=200, deadline=None)
@given(orders(), st.lists(terms(max_leaves=5), min_size=3, max_size=6))
def test_asymmetric_and_transitive_on_samples(order, sample):
    for s in sample:
        for t in sample:
            assert not (order.greater(s, t) and order.greater(t, s))
            for u in sample:
                if order.greater(s, t) and order.greater(t, u):
                    assert order.greater(s, u)


@settings(max_examples=200, deadline=None)
@given(orders(), terms(max_leaves=6), terms(max_leaves=6), st.lists(terms(max_leaves=3), min_size=4, max_size=4))
def test_closed_under_substitution_and_contexts_and_variables_kept(order, s, t, images):
    # The pair in its order; an incomparable pair is replaced by a term over
    # the first one and that term (greater by the subterm property).
    if order.greater(t, s):
        s, t = t, s
    elif not order.greater(s, t):
        s, t = application("g", (s, t)), s
    assert order.greater(s, t)
    assert variables_of(t) <= variables_of(s)
    sigma = Substitution({variable(name): image for name, image in zip(VARIABLES, images)})
    assert order.greater(sigma(s), sigma(t))
    other = images[0]
    for name, arity in FUNCTIONS:
        if arity == 1:
            assert order.greater(application(name, (s,)), application(name, (t,)))
        else:
            assert order.greater(application(name, (s, other)), application(name, (t, other)))
            assert order.greater(application(name, (other, s)), application(name, (other, t)))


@settings(max_examples=200, deadline=None)
@given(orders(), ground_terms(), ground_terms())
def test_total_on_ground_terms(order, s, t):
    assert s is t or order.greater(s, t) or order.greater(t, s)


def test_knuth_bendix_orients_the_group_completion_rules():
    # Knuth & Bendix (1970), the group example (from memory): the inverse
    # weighs 0 and is greatest, so i(x*y) > i(y)*i(x) by precedence alone,
    # (x*y)*z > x*(y*z) by the first arguments, and i(i(x)) > x (case b1).
    order = KnuthBendixOrder({("e", 0): 0, ("mult", 2): 1, ("i", 1): 2}, {("i", 1): 0})
    assert order.greater(_term("i(mult(X,Y))"), _term("mult(i(Y),i(X))"))
    assert order.greater(_term("mult(mult(X,Y),Z)"), _term("mult(X,mult(Y,Z))"))
    assert order.greater(_term("i(i(X))"), _term("X"))
    assert order.greater(_term("mult(i(X),mult(X,Y))"), _term("Y"))
    # Commutativity is oriented on no variables; a variable duplicated on
    # the right is never smaller.
    assert not order.greater(_term("mult(X,Y)"), _term("mult(Y,X)"))
    assert not order.greater(_term("mult(X,e)"), _term("mult(X,X)"))


def test_path_order_distributes_the_greater_operation():
    # Baader & Nipkow, section 5.4 (from memory): with * > + the path order
    # orients x*(y+z) -> x*y + x*z, which no Knuth-Bendix order can (x is
    # duplicated); with + > * it orients the other distributive law instead.
    times_greater = LexicographicPathOrder({("plus", 2): 0, ("times", 2): 1})
    distributed = _term("plus(times(X,Y),times(X,Z))")
    assert times_greater.greater(_term("times(X,plus(Y,Z))"), distributed)
    assert not KnuthBendixOrder({("plus", 2): 0, ("times", 2): 1}).greater(_term("times(X,plus(Y,Z))"), distributed)
    plus_greater = LexicographicPathOrder({("plus", 2): 1, ("times", 2): 0})
    assert plus_greater.greater(distributed, _term("times(X,plus(Y,Z))"))


def test_the_likely_orders_rank_every_problem_symbol():
    atoms = [parse_clause(text).literals[0].atom
             for text in ("join(X,bottom) = X", "meet(X,comp(X)) = bottom", "join(X,Y) = join(Y,X)")]
    found = likely_orders(atoms)
    assert {type(order) for order in found} == {KnuthBendixOrder, LexicographicPathOrder}
    for order in found:
        assert set(order.precedence) == {("join", 2), ("bottom", 0), ("meet", 2), ("comp", 1)}
    assert likely_orders([parse_clause("p").literals[0].atom]) == []


def test_weights_that_break_well_foundedness_are_refused():
    for weights in ({("a", 0): 0}, {("f", 1): 0, ("h", 1): 0}, {("g", 2): 0}, {("f", 1): -1}):
        try:
            KnuthBendixOrder({("f", 1): 2, ("h", 1): 1}, weights)
        except ValueError:
            continue
        raise AssertionError(f"accepted {weights}")
    try:
        KnuthBendixOrder({("f", 1): 1, ("h", 1): 2}, {("f", 1): 0})  # f weighs 0 but is not greatest
    except ValueError:
        return
    raise AssertionError("accepted a zero-weight symbol below another")
