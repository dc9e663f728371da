"""Miniscoping keeps a formula's meaning and frees existentials from
universals they do not mention.

Oracle: brute-force evaluation in every interpretation of a small
signature over domains of one and two elements (written here, independent
of the kernel's model evaluation).  The pilot example is from an invented
harbour scenario; the rules used are the textbook miniscoping equivalences
(common practice).
"""

from __future__ import annotations

import itertools

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.formulas import (
    AND,
    ATOM,
    EXISTS,
    FALSE,
    FORALL,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    NOT,
    OR,
    TRUE,
    XOR,
    Formula,
    alpha_equivalent,
    atomic,
    binary,
    free_variables,
    negation,
    quantified,
)
from checker.kernel.terms import application, variable
from checker.search.miniscoping import DEPTH_LIMIT, miniscoped
from formats.tptp import parse_formula

X, Y = variable("X"), variable("Y")
CONSTANT = application("c")
atoms = st.sampled_from([
    atomic(application("p", (X,))), atomic(application("p", (Y,))), atomic(application("p", (CONSTANT,))),
    atomic(application("q", (X, Y))), atomic(application("q", (Y, X))), atomic(application("r")),
])
CONNECTIVES = (AND, OR, IMPLIES, IFF, XOR, NOR, NAND)
formulas = st.recursive(
    atoms,
    lambda children: st.one_of(
        st.builds(negation, children),
        st.builds(binary, st.sampled_from(CONNECTIVES), children, children),
        st.builds(lambda q, v, body: quantified(q, v, body), st.sampled_from((FORALL, EXISTS)),
                  st.sampled_from(((X,), (Y,), (X, Y), (Y, X))), children),
    ),
    max_leaves=7,
)

_TRUTH = {
    AND: lambda a, b: a and b, OR: lambda a, b: a or b, IMPLIES: lambda a, b: (not a) or b,
    IFF: lambda a, b: a == b, XOR: lambda a, b: a != b, NOR: lambda a, b: not (a or b),
    NAND: lambda a, b: not (a and b),
}


def holds(formula: Formula, model: dict, assignment: dict) -> bool:
    """Truth of ``formula`` in ``model`` (constant c, predicates p, q, r)."""
    connective = formula.connective
    if connective == ATOM:
        atom = formula.atom
        values = tuple(assignment[t] if t.is_variable else model["c"] for t in atom.arguments)
        return values in model[atom.symbol]
    if connective in (TRUE, FALSE):
        return connective == TRUE
    if connective == NOT:
        return not holds(formula.arguments[0], model, assignment)
    if connective in (FORALL, EXISTS):
        combine = all if connective == FORALL else any
        return combine(
            holds(formula.arguments[0], model, {**assignment, **dict(zip(formula.variables, values))})
            for values in itertools.product(model["domain"], repeat=len(formula.variables))
        )
    return _TRUTH[connective](*(holds(a, model, assignment) for a in formula.arguments))


def models():
    for size in (1, 2):
        domain = range(size)
        unary = [frozenset((e,) for e in chosen) for n in range(size + 1) for chosen in itertools.combinations(domain, n)]
        pairs = list(itertools.product(domain, repeat=2))
        binary_ = [frozenset(chosen) for n in range(len(pairs) + 1) for chosen in itertools.combinations(pairs, n)]
        for c, p, q, r in itertools.product(domain, unary, binary_, (frozenset(), frozenset({()}))):
            yield {"domain": domain, "c": c, "p": p, "q": q, "r": r}


MODELS = list(models())[::3]  # every third: all sizes and tables still vary


@settings(max_examples=40, deadline=None)
@given(formulas)
def test_a_miniscoped_formula_is_equivalent_in_every_small_interpretation(formula):
    closed = quantified(FORALL, tuple(sorted(free_variables(formula), key=lambda v: v.symbol)), formula) \
        if free_variables(formula) else formula
    scoped = miniscoped(closed)
    for model in MODELS:
        assert holds(closed, model, {}) == holds(scoped, model, {})


def test_an_existential_leaves_a_universal_it_does_not_mention():
    # ! [S] : ? [P] : (registered(S) & on_duty(P)) miniscopes to
    # (! [S] : registered(S)) & ? [P] : on_duty(P).
    premise = parse_formula("! [S] : ? [P] : (registered(S) & on_duty(P))")
    expected = parse_formula("(! [S] : registered(S)) & ? [P] : on_duty(P)")
    assert alpha_equivalent(miniscoped(premise), expected)


def test_a_dependency_stays_where_the_existential_mentions_the_universal():
    premise = parse_formula("! [S] : ? [B] : (berth(B) & assigned(S, B))")
    assert alpha_equivalent(miniscoped(premise), premise)


def test_negations_and_implications_are_put_in_negation_normal_form_on_the_way():
    premise = parse_formula("~ ? [X] : (bay(X) => ! [F] : parked(F))")
    expected = parse_formula("(! [X] : bay(X)) & ? [F] : ~ parked(F)")
    assert alpha_equivalent(miniscoped(premise), expected)


def test_a_formula_nested_beyond_the_depth_limit_is_left_as_it_is_below_it():
    deep = atomic(application("r"))
    for _ in range(DEPTH_LIMIT + 10):
        deep = negation(negation(deep))
    assert miniscoped(deep) is not None
