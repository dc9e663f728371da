"""The restatement proposer: a formula matches its reorderings, and nothing
it matches says something else.

What counts as saying the same is first-order semantics (common practice):
``&`` and ``|`` are associative and commutative, ``<=>`` and ``<~>``
commutative, ``=`` symmetric, the variables of one quantifier block may be
renamed and listed in any order, and a formula stands for its universal
closure (TPTP language BNF: free variables of a fof formula are read as
universally quantified, from memory).  Propositional proposals are checked
against SymPy's ``satisfiable`` (sympy.logic.inference), first-order ones
by the kernel replaying entailments both ways.
"""

from __future__ import annotations

import random
from itertools import count

import pytest
import sympy
from dataclasses import fields, replace

from hypothesis import given, settings
from hypothesis import strategies as st
from sympy.logic.boolalg import And, Equivalent, Implies, Nand, Nor, Not, Or, Xor
from sympy.logic.inference import satisfiable

from checker.kernel.entailment import check_entailment
from checker.kernel.formulas import (
    AND,
    ATOM,
    EXISTS,
    FALSUM,
    FORALL,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    NOT,
    OR,
    QUANTIFIERS,
    VERUM,
    XOR,
    Formula,
    atomic,
    binary,
    negation,
    quantified,
    substitute_free,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable
from checker.search.entailment import find_entailment
from checker.search.reconstruct import DEFAULT_LIMITS
from checker.search.restatement import restates, shape_of
from formats.tptp import parse_formula

ALTERNATIVES = 2000


def same(left: str, right: str, alternatives: int = ALTERNATIVES) -> bool:
    return restates(shape_of(parse_formula(left)), shape_of(parse_formula(right)), alternatives)


@pytest.mark.parametrize(
    ("left", "right"),
    [
        ("! [X,Y,Z] : p(X,Y,Z)", "! [Z,X,Y] : p(X,Y,Z)"),
        ("! [X,Y,Z] : p(X,Y,Z)", "! [X2,X0,X1] : p(X2,X0,X1)"),
        ("! [X,Y] : p(X,Y)", "p(A,B)"),
        ("! [X] : ! [Y] : p(X,Y)", "! [Y,X] : p(X,Y)"),
        ("! [X,Y] : p(X)", "! [Z] : p(Z)"),
        ("(a & b) & c", "c & (b & a)"),
        ("a | (b | (c & d))", "(d & c) | b | a"),
        ("X = f(Y)", "f(Y) = X"),
        ("X != a", "~ a = X"),
        ("a ~| b", "~ (b | a)"),
        ("a ~& b", "~ (b & a)"),
        ("a <=> b", "b <=> a"),
        ("a <~> b", "b <~> a"),
        ("! [X] : ? [Y] : (p(X,Y) & q(Y))", "! [U] : ? [V] : (q(V) & p(U,V))"),
        ("p(X) | p(Y)", "p(Y) | p(X)"),
        ("$true & a", "a & $true"),
    ],
)
def test_a_formula_restates_its_reordering(left, right):
    assert same(left, right) and same(right, left)


@pytest.mark.parametrize(
    ("left", "right"),
    [
        ("p(X,Y) | q(X)", "p(X)"),  # dropped disjunct
        ("! [X] : ? [Y] : p(X,Y)", "? [Y] : ! [X] : p(X,Y)"),  # quantifiers swapped
        ("! [X] : ? [Y] : p(X,Y)", "! [X,Y] : p(X,Y)"),  # existential made universal
        ("p(X) | ~ q(X)", "~ p(X) | q(X)"),  # signs moved
        ("X = a", "X = b"),
        ("! [X] : ? [Y] : f(X) = Y", "! [X] : ? [Y] : f(Y) = X"),
        ("p(X,Y)", "p(X,X)"),  # two variables merged
        ("p(X,X)", "p(X,Y)"),
        ("a => b", "b => a"),  # implication is not commutative
        ("a => b", "~ a | b"),  # equivalent, but not a reordering: left to the kernel
        ("p(X) & p(Y)", "p(X)"),  # no contraction of bags
        ("! [X] : (p(X) & ! [Y] : q(X,Y))", "! [X] : (p(X) & ! [Y] : q(Y,X))"),
        ("$true", "$false"),
        ("~ a", "a"),
    ],
)
def test_a_formula_does_not_restate_a_different_one(left, right):
    assert not same(left, right) and not same(right, left)


def test_the_search_stops_at_its_bound():
    # Three disjuncts alike but for their variables: each may pair with any
    # of the other's, so the search must choose, and back up.
    left = "! [A,B,C,D] : (p(A,B) | p(B,C) | p(C,D))"
    right = "! [W,X,Y,Z] : (p(Y,Z) | p(X,Y) | p(W,X))"
    assert same(left, right)
    assert not same(left, right, alternatives=1)


def test_a_match_without_choices_costs_nothing_however_long():
    # Prover output chains thousands of conjuncts; with all of them distinct
    # there is nothing to choose, and no bound to run out of.
    conjuncts = [f"p{i}(X)" for i in range(3000)]
    assert same("! [X] : (" + " & ".join(conjuncts) + ")", " & ".join(reversed(conjuncts)), alternatives=0)


# --- propositional: every proposal is an equivalence (SymPy) ---------------

NAMES = ("p", "q", "r")
propositions = st.sampled_from([atomic(application(n)) for n in NAMES] + [VERUM, FALSUM])
CONNECTIVES = (AND, OR, IMPLIES, IFF, XOR, NOR, NAND)


def _extend(children):
    return st.one_of(
        st.builds(negation, children), st.builds(binary, st.sampled_from(CONNECTIVES), children, children)
    )


propositional = st.recursive(propositions, _extend, max_leaves=8)
SYMPY_CONNECTIVES = {AND: And, OR: Or, IMPLIES: Implies, IFF: Equivalent, XOR: Xor, NOR: Nor, NAND: Nand}


def to_sympy(formula: Formula):
    """The formula as a SymPy Boolean expression (recursive; test formulas are small)."""
    c = formula.connective
    if c == ATOM:
        return sympy.Symbol(formula.atom.symbol)
    if c in ("$true", "$false"):
        return sympy.true if c == "$true" else sympy.false
    if c == NOT:
        return Not(to_sympy(formula.arguments[0]))
    return SYMPY_CONNECTIVES[c](*(to_sympy(a) for a in formula.arguments))


_FRESH = count()


def reordered(formula: Formula, rng: random.Random) -> Formula:
    """A random restatement: bags reordered and regrouped, equations and
    equivalences turned, quantifier blocks renamed, reordered and split."""
    c = formula.connective
    if c == ATOM:
        atom = formula.atom
        if atom.symbol == "=" and rng.random() < 0.5:
            return atomic(application("=", atom.arguments[::-1]))
        return formula
    if c in (AND, OR):
        operands = [reordered(operand, rng) for operand in _chain(formula, c)]
        rng.shuffle(operands)
        while len(operands) > 1:
            i = rng.randrange(len(operands) - 1)
            operands[i : i + 2] = [binary(c, operands[i], operands[i + 1])]
        return operands[0]
    if c in (IFF, XOR):
        left, right = (reordered(a, rng) for a in formula.arguments)
        return binary(c, *((right, left) if rng.random() < 0.5 else (left, right)))
    if c in QUANTIFIERS:
        fresh = {v: variable(f"R{next(_FRESH)}") for v in formula.variables}
        body = reordered(substitute_free(formula.arguments[0], Substitution(fresh)), rng)
        block = list(fresh.values())
        rng.shuffle(block)
        cut = rng.randrange(len(block))
        if cut:
            return quantified(c, tuple(block[:cut]), quantified(c, tuple(block[cut:]), body))
        return quantified(c, tuple(block), body)
    if not formula.arguments:
        return formula
    return _rebuilt(formula, [reordered(a, rng) for a in formula.arguments])


def _rebuilt(formula: Formula, arguments: list[Formula]) -> Formula:
    return negation(arguments[0]) if formula.connective == NOT else binary(formula.connective, *arguments)


def _chain(formula: Formula, connective: str) -> list[Formula]:
    if formula.connective != connective:
        return [formula]
    return [part for argument in formula.arguments for part in _chain(argument, connective)]


def mutated(formula: Formula, rng: random.Random) -> Formula:
    """The formula with one random subformula negated."""
    nodes = []
    stack = [(formula, ())]
    while stack:
        current, path = stack.pop()
        nodes.append(path)
        stack.extend((a, path + (i,)) for i, a in enumerate(current.arguments))
    return _negated_at(formula, rng.choice(nodes))


def _negated_at(formula: Formula, path: tuple[int, ...]) -> Formula:
    if not path:
        return negation(formula)
    arguments = list(formula.arguments)
    arguments[path[0]] = _negated_at(arguments[path[0]], path[1:])
    if formula.connective in QUANTIFIERS:
        return quantified(formula.connective, formula.variables, arguments[0])
    return _rebuilt(formula, arguments)


def equivalent_in_sympy(left: Formula, right: Formula) -> bool:
    return satisfiable(Not(Equivalent(to_sympy(left), to_sympy(right)))) is False


@settings(max_examples=200, deadline=None)
@given(propositional, st.randoms(use_true_random=False))
def test_a_random_reordering_is_proposed_and_sympy_agrees_it_is_equivalent(formula, rng):
    restatement = reordered(formula, rng)
    assert equivalent_in_sympy(formula, restatement)  # the test's own reordering is sound
    assert restates(shape_of(formula), shape_of(restatement), ALTERNATIVES)


@settings(max_examples=300, deadline=None)
@given(propositional, st.randoms(use_true_random=False))
def test_a_proposal_between_a_formula_and_a_mutant_is_an_equivalence(formula, rng):
    # SymPy (satisfiable): whatever the proposer matches must be equivalent;
    # a negated subformula usually changes the meaning, and must then not match.
    mutant = reordered(mutated(formula, rng), rng)
    if restates(shape_of(formula), shape_of(mutant), ALTERNATIVES):
        assert equivalent_in_sympy(formula, mutant)


# --- first-order: every proposal is confirmed by the kernel ----------------

VARIABLES = [variable(n) for n in ("X", "Y", "Z")]
terms = st.sampled_from([*VARIABLES, application("a"), application("f", (VARIABLES[0],))])
fo_atoms = st.one_of(
    st.builds(lambda s, t: atomic(application("p", (s, t))), terms, terms),
    st.builds(lambda s: atomic(application("q", (s,))), terms),
    st.builds(lambda s, t: atomic(application("=", (s, t))), terms, terms),
)


def _fo_extend(children):
    return st.one_of(
        st.builds(negation, children),
        # (equivalences nested in equivalences clausify into many clauses: their
        # reorderings may need more than the default search, and end unproven)
        st.builds(binary, st.sampled_from((AND, OR)), children, children),
        st.builds(
            quantified, st.sampled_from((FORALL, EXISTS)),
            st.lists(st.sampled_from(VARIABLES), min_size=1, max_size=2, unique=True).map(tuple), children,
        ),
    )


first_order = st.recursive(fo_atoms, _fo_extend, max_leaves=4)


GENEROUS_LIMITS = replace(DEFAULT_LIMITS, **{f.name: getattr(DEFAULT_LIMITS, f.name) * 8 for f in fields(DEFAULT_LIMITS)})


@settings(max_examples=40, deadline=None)
@given(first_order, st.randoms(use_true_random=False))
def test_a_first_order_reordering_is_proposed_and_the_kernel_confirms_it_both_ways(formula, rng):
    restatement = reordered(formula, rng)
    assert restates(shape_of(formula), shape_of(restatement), ALTERNATIVES)
    for premise, conclusion in ((formula, restatement), (restatement, formula)):
        # Generous bounds: a reordering is equivalent, and this checks the
        # proposal, not how far the default search reaches.
        chain = find_entailment([premise], conclusion, GENEROUS_LIMITS)
        assert chain is not None and check_entailment([premise], conclusion, chain) is None
