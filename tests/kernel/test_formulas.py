"""Kernel formulas: free variables, closure, alpha-equivalence, capture-avoiding
substitution, polarity, symbols.

The scenario for the hand-written cases is an invented plant interlock:
``open(V)`` for a valve, ``feeds(V, W)`` for piping, ``pump`` a constant.
Semantic properties are checked with a small evaluator written here,
independent of checker.kernel.models.
"""

from __future__ import annotations

import copy
import itertools
import pickle

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.clauses import Clause, Literal
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
    OR,
    VERUM,
    XOR,
    Formula,
    alpha_equivalent,
    argument_polarities,
    atomic,
    binary,
    formula_of_clause,
    free_variables,
    fresh_variable,
    negation,
    quantified,
    subformulas_with_polarity,
    substitute_free,
    symbols_of_formula,
    universal_closure,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable

X, Y, Z, W, U = (variable(n) for n in "XYZWU")
pump = application("pump")
tank = application("tank")


def drain(t):
    return application("drain", (t,))


def opened(t):
    return atomic(application("open", (t,)))


def feeds(s, t):
    return atomic(application("feeds", (s, t)))


def equal(s, t):
    return atomic(application("=", (s, t)))


alarm = atomic(application("alarm"))


def forall(variables, body):
    return quantified(FORALL, tuple(variables), body)


def exists(variables, body):
    return quantified(EXISTS, tuple(variables), body)


def conjunction_chain(count: int) -> Formula:
    formula = opened(application("valve_0"))
    for index in range(1, count):
        formula = binary(AND, opened(application(f"valve_{index}")), formula)
    return formula


# --- free variables and closure ---------------------------------------------


def test_free_variables_exclude_bound_ones_and_respect_shadowing():
    assert free_variables(forall([X], feeds(X, Y))) == {Y}
    assert free_variables(binary(AND, opened(X), forall([X], opened(X)))) == {X}
    assert free_variables(exists([X, Y], feeds(X, drain(Y)))) == frozenset()
    assert free_variables(VERUM) == frozenset()


def test_free_variables_of_a_deep_chain_do_not_recurse():
    chain = binary(AND, opened(X), conjunction_chain(30_000))
    assert free_variables(chain) == {X}


def test_universal_closure_binds_free_variables_by_name():
    assert universal_closure(feeds(Y, X)) is forall([X, Y], feeds(Y, X))
    closed = forall([X], opened(X))
    assert universal_closure(closed) is closed


def test_formula_of_clause_keeps_literal_order_and_closes():
    clause = Clause([Literal(False, application("open", (X,))), Literal(True, application("feeds", (X, pump)))])
    assert formula_of_clause(clause) is forall([X], binary(OR, negation(opened(X)), feeds(X, pump)))
    assert formula_of_clause(Clause([])) is FALSUM
    ground = Clause([Literal(True, application("alarm"))])
    assert formula_of_clause(ground) is alarm


def test_symbols_of_formula_cover_predicates_functions_constants_and_equality():
    formula = forall([X], binary(IMPLIES, opened(drain(X)), binary(OR, equal(X, pump), alarm)))
    assert symbols_of_formula(formula) == {("open", 1), ("drain", 1), ("=", 2), ("pump", 0), ("alarm", 0)}


def test_symbols_of_formula_go_on_past_a_repeated_subformula():
    # Common practice: every symbol counts, or a "fresh" Skolem or definition
    # symbol could clash with one the input already uses.  The shared
    # `alarm & alarm` is read before open/1 here, and open/1 must still count.
    formula = binary(AND, opened(tank), binary(AND, alarm, alarm))
    assert symbols_of_formula(formula) == {("open", 1), ("tank", 0), ("alarm", 0)}


# --- alpha-equivalence -------------------------------------------------------


def test_alpha_equivalence_renames_bound_variables():
    assert alpha_equivalent(forall([X], opened(X)), forall([Y], opened(Y)))
    assert alpha_equivalent(forall([X, Y], feeds(X, Y)), forall([Y, X], feeds(Y, X)))
    assert alpha_equivalent(exists([X], forall([Y], feeds(X, Y))), exists([Z], forall([W], feeds(Z, W))))


def test_alpha_equivalence_never_matches_a_variable_with_a_constant_of_its_name():
    # A term's kind, not its name, makes it a variable: ! [X] : open(X) says
    # every valve is open, open(X) with a constant named X one valve only
    # (common practice).  Either side may hold the constant.
    constant = application("X")
    assert not alpha_equivalent(forall([X], opened(X)), forall([X], opened(constant)))
    assert not alpha_equivalent(forall([X], opened(constant)), forall([X], opened(X)))
    assert not alpha_equivalent(opened(X), opened(constant))


def test_alpha_equivalence_does_not_capture_or_confuse_free_and_bound():
    assert not alpha_equivalent(forall([X], feeds(X, Y)), forall([Y], feeds(Y, Y)))
    assert not alpha_equivalent(opened(X), opened(Y))
    assert not alpha_equivalent(forall([X], opened(X)), forall([X], opened(Y)))
    assert not alpha_equivalent(forall([Y], opened(X)), forall([X], opened(X)))
    # The shared subformula open(X) is bound by different binders on each side.
    assert not alpha_equivalent(forall([X], forall([Y], opened(X))), forall([Y], forall([X], opened(X))))
    assert alpha_equivalent(forall([X], forall([Y], opened(X))), forall([Y], forall([X], opened(Y))))


def test_alpha_equivalence_matches_quantifier_blocks_in_order():
    assert not alpha_equivalent(forall([X, Y], feeds(X, Y)), forall([Y, X], feeds(X, Y)))
    assert not alpha_equivalent(forall([X, Y], feeds(X, Y)), forall([X], forall([Y], feeds(X, Y))))
    assert not alpha_equivalent(forall([X], opened(X)), exists([X], opened(X)))


def test_alpha_equivalence_reads_equality_as_symmetric_and_nothing_else():
    assert alpha_equivalent(equal(pump, drain(X)), equal(drain(X), pump))
    assert alpha_equivalent(forall([X], equal(X, pump)), forall([Y], equal(pump, Y)))
    assert not alpha_equivalent(feeds(pump, tank), feeds(tank, pump))
    assert not alpha_equivalent(equal(pump, tank), equal(pump, drain(tank)))


def test_alpha_equivalence_compares_connectives_and_terms():
    assert not alpha_equivalent(binary(AND, alarm, opened(pump)), binary(OR, alarm, opened(pump)))
    assert not alpha_equivalent(opened(pump), opened(drain(pump)))
    assert not alpha_equivalent(opened(X), opened(pump))
    assert not alpha_equivalent(opened(pump), atomic(application("open", (pump, pump))))
    assert alpha_equivalent(opened(drain(drain(pump))), opened(drain(drain(pump))))
    assert alpha_equivalent(forall([X], feeds(X, drain(tank))), forall([Y], feeds(Y, drain(tank))))


def test_alpha_equivalence_of_deep_chains_does_not_recurse():
    left = forall([X], binary(AND, opened(X), conjunction_chain(20_000)))
    right = forall([Y], binary(AND, opened(Y), conjunction_chain(20_000)))
    assert alpha_equivalent(left, right)
    assert not alpha_equivalent(left, forall([Y], binary(AND, opened(pump), conjunction_chain(20_000))))


# --- random formulas, and an evaluator written for these tests ---------------

VARIABLE_POOL = (X, Y, Z)
terms = st.recursive(
    st.sampled_from([X, Y, Z, pump, tank]),
    lambda inner: inner.map(drain),
    max_leaves=3,
)
atoms = st.one_of(
    st.builds(opened, terms),
    st.builds(feeds, terms, terms),
    st.builds(equal, terms, terms),
    st.just(alarm),
    st.sampled_from([VERUM, FALSUM]),
)


def extend(children):
    connectives = st.sampled_from([AND, OR, IMPLIES, IFF, XOR, NOR, NAND])
    blocks = st.lists(st.sampled_from(VARIABLE_POOL), min_size=1, max_size=2)
    return st.one_of(
        st.builds(negation, children),
        st.builds(binary, connectives, children, children),
        st.builds(forall, blocks, children),
        st.builds(exists, blocks, children),
    )


formulas = st.recursive(atoms, extend, max_leaves=8)

# A fixed two-element structure: drain swaps, pump = 0, tank = 1.
DOMAIN = (0, 1)
FUNCTIONS = {"drain": lambda v: 1 - v, "pump": lambda: 0, "tank": lambda: 1}


def value(term, env):
    if term.is_variable:
        return env[term]
    return FUNCTIONS[term.symbol](*(value(a, env) for a in term.arguments))


def truth(formula, env, predicates):
    """Textbook Tarski semantics, recursively (test formulas are small)."""
    c = formula.connective
    if c == ATOM:
        args = tuple(value(a, env) for a in formula.atom.arguments)
        if formula.atom.symbol == "=":
            return args[0] == args[1]
        return args in predicates[formula.atom.symbol]
    if c in ("$true", "$false"):
        return c == "$true"
    parts = [truth(a, env, predicates) for a in formula.arguments] if c not in (FORALL, EXISTS) else None
    if c == "~":
        return not parts[0]
    if c in (FORALL, EXISTS):
        outcomes = (
            truth(formula.arguments[0], {**env, **dict(zip(formula.variables, vs))}, predicates)
            for vs in itertools.product(DOMAIN, repeat=len(formula.variables))
        )
        return all(outcomes) if c == FORALL else any(outcomes)
    a, b = parts
    return {AND: a and b, OR: a or b, IMPLIES: (not a) or b, IFF: a == b, XOR: a != b, NOR: not (a or b), NAND: not (a and b)}[c]


predicate_tables = st.fixed_dictionaries(
    {
        "open": st.sets(st.sampled_from([(0,), (1,)])),
        "feeds": st.sets(st.sampled_from(list(itertools.product(DOMAIN, repeat=2)))),
        "alarm": st.sets(st.just(())),
    }
)
environments = st.fixed_dictionaries({v: st.sampled_from(DOMAIN) for v in VARIABLE_POOL})


def rename_bound(formula: Formula, names) -> Formula:
    """Rename every binder to a new variable (recursively; test formulas are small)."""
    c = formula.connective
    if c in (FORALL, EXISTS):
        fresh = tuple(variable(next(names)) for _ in formula.variables)
        body = substitute_free(rename_bound(formula.arguments[0], names), Substitution(dict(zip(formula.variables, fresh))))
        return quantified(c, fresh, body)
    if c == ATOM or not formula.arguments:
        return formula
    return _rebuild(formula, [rename_bound(a, names) for a in formula.arguments])


def _rebuild(formula, arguments):
    if formula.connective == "~":
        return negation(arguments[0])
    return binary(formula.connective, *arguments)


@settings(max_examples=150, deadline=None)
@given(formulas)
def test_consistent_renaming_of_binders_is_alpha_equivalent(formula):
    # Common practice: renaming bound variables to new names is the
    # definition of alpha-equivalence.
    renamed = rename_bound(formula, (f"Bound{i}" for i in itertools.count()))
    assert alpha_equivalent(formula, renamed)
    assert alpha_equivalent(renamed, formula)
    assert free_variables(renamed) == free_variables(formula)


@settings(max_examples=150, deadline=None)
@given(formulas, predicate_tables, environments)
def test_alpha_equivalent_formulas_have_the_same_truth_value(formula, predicates, env):
    renamed = rename_bound(formula, (f"Bound{i}" for i in itertools.count()))
    assert truth(formula, env, predicates) == truth(renamed, env, predicates)


@settings(max_examples=200, deadline=None)
@given(formulas, st.fixed_dictionaries({X: terms, Y: terms}), predicate_tables, environments)
def test_substitution_lemma(formula, bindings, predicates, env):
    # Common practice (the substitution lemma of first-order logic): the
    # instance under sigma is true under env exactly when the formula is true
    # under the assignment x -> value of sigma(x) under env.  A captured
    # variable would break it.
    instance = substitute_free(formula, Substitution(bindings))
    shifted = {**env, **{v: value(t, env) for v, t in bindings.items()}}
    assert truth(instance, env, predicates) == truth(formula, shifted, predicates)
    expected_free = set()
    for v in free_variables(formula):
        expected_free |= _variables(bindings[v]) if v in bindings else {v}
    assert free_variables(instance) == expected_free


def _variables(term):
    return {term} if term.is_variable else set().union(*(_variables(a) for a in term.arguments))


# --- substitution, by hand ---------------------------------------------------


def test_substitution_renames_a_binder_that_would_capture():
    formula = forall([Y], feeds(X, Y))
    instance = substitute_free(formula, Substitution({X: drain(Y)}))
    assert instance is forall([variable("Y1")], feeds(drain(Y), variable("Y1")))
    assert alpha_equivalent(instance, forall([Z], feeds(drain(Y), Z)))


def test_substitution_skips_names_already_used_when_renaming():
    formula = forall([Y], binary(AND, feeds(X, Y), opened(variable("Y1"))))
    instance = substitute_free(formula, Substitution({X: Y}))
    assert instance is forall([variable("Y2")], binary(AND, feeds(Y, variable("Y2")), opened(variable("Y1"))))


def test_substitution_skips_names_used_after_a_repeated_subformula():
    # The renamed binder must avoid every variable name of the formula
    # (capture-avoiding substitution, common practice), also those read
    # after a subformula that occurs twice (alarm & alarm).
    y1 = variable("Y1")
    formula = binary(AND, forall([Y], binary(AND, feeds(X, Y), opened(y1))), binary(AND, alarm, alarm))
    instance = substitute_free(formula, Substitution({X: Y}))
    y2 = variable("Y2")
    assert instance is binary(AND, forall([y2], binary(AND, feeds(Y, y2), opened(y1))), binary(AND, alarm, alarm))


def test_substitution_renames_two_capturing_binders_apart():
    # Capture-avoiding substitution, renaming each binder the new term
    # would capture (common practice): both bound Y and Z meet drain(Y, Z).
    formula = forall([Y, Z], feeds(X, Y))
    term = application("drain", (Y, Z))
    instance = substitute_free(formula, Substitution({X: term}))
    assert instance is forall([variable("Y1"), variable("Z1")], feeds(term, variable("Y1")))
    assert alpha_equivalent(instance, forall([U, W], feeds(term, U)))


def test_substitution_leaves_bound_occurrences_and_untouched_formulas_alone():
    formula = binary(AND, opened(X), forall([X], opened(X)))
    assert substitute_free(formula, Substitution({X: pump})) is binary(AND, opened(pump), forall([X], opened(X)))
    closed = forall([X], opened(X))
    assert substitute_free(closed, Substitution({X: pump})) is closed
    assert substitute_free(opened(Y), Substitution()) is opened(Y)


def test_substitution_in_a_deep_chain_does_not_recurse():
    chain = binary(AND, opened(X), conjunction_chain(20_000))
    instance = substitute_free(chain, Substitution({X: pump}))
    assert instance.arguments[0] is opened(pump)
    assert instance.arguments[1] is chain.arguments[1]


def test_fresh_variable_takes_the_first_unused_number():
    used = {"X", "X1", "X2"}
    assert fresh_variable("X", used) is variable("X3")
    assert "X3" in used


# --- polarity ----------------------------------------------------------------


def test_polarity_of_every_connective():
    p, q, r, s, t = (atomic(application(n)) for n in "pqrst")
    formula = binary(OR, negation(binary(IMPLIES, p, binary(IFF, q, r))), forall([X], binary(NAND, s, t)))
    assert list(subformulas_with_polarity(formula)) == [
        (formula, 1),
        (formula.arguments[0], 1),
        (binary(IMPLIES, p, binary(IFF, q, r)), -1),
        (p, 1),
        (binary(IFF, q, r), -1),
        (q, 0),
        (r, 0),
        (formula.arguments[1], 1),
        (binary(NAND, s, t), 1),
        (s, -1),
        (t, -1),
    ]
    other = exists([X], binary(AND, binary(NOR, p, q), negation(binary(XOR, r, negation(s)))))
    assert [polarity for _, polarity in subformulas_with_polarity(other)] == [1, 1, 1, -1, -1, 1, -1, 0, 0, 0]


def test_polarity_enumeration_of_a_deep_chain_does_not_recurse():
    chain = conjunction_chain(30_000)
    seen = list(subformulas_with_polarity(negation(chain)))
    assert len(seen) == 1 + 2 * 30_000 - 1
    assert {polarity for _, polarity in seen[1:]} == {-1}


def test_argument_polarities_of_connectives():
    assert argument_polarities(IMPLIES) == (-1, 1)
    assert argument_polarities(XOR) == (0, 0)
    assert argument_polarities(ATOM) == ()


# --- construction, rendering, pickling --------------------------------------


def test_constructors_refuse_what_is_not_a_connective_or_quantifier():
    with pytest.raises(ValueError, match="not a binary connective"):
        binary("~", alarm, alarm)
    with pytest.raises(ValueError, match="not a quantifier"):
        quantified("&", (X,), alarm)


def test_rendering_reads_as_tptp():
    formula = forall([X], binary(IMPLIES, negation(binary(OR, opened(X), alarm)), equal(drain(X), pump)))
    assert str(formula) == "! [X] : (~ (open(X) | alarm) => drain(X) = pump)"
    assert repr(negation(VERUM)) == "Formula('~ $true')"
    # TPTP BNF <fof_variable_list>: the variables of one quantifier, comma-separated.
    assert str(exists([X, Y], feeds(X, Y))) == "? [X,Y] : feeds(X,Y)"


def test_pickling_a_deep_chain_is_flat_and_keeps_sharing():
    chain = forall([X], binary(AND, opened(X), conjunction_chain(30_000)))
    assert pickle.loads(pickle.dumps(chain)) is chain
    assert copy.deepcopy(chain) is chain
    twice = binary(AND, alarm, alarm)
    assert pickle.loads(pickle.dumps(twice)) is twice


def test_substitution_renames_once_in_a_shared_subformula():
    shared = feeds(X, Y)
    formula = forall([Y], binary(AND, shared, shared))
    renamed = variable("Y1")
    assert substitute_free(formula, Substitution({X: Y})) is forall([renamed], binary(AND, feeds(Y, renamed), feeds(Y, renamed)))


def test_symbols_of_a_formula_read_a_shared_subformula_once():
    # Each level uses the one below twice: 2**64 paths through 65 distinct
    # subformulas (hash-consed formulas are DAGs; common practice).
    shared = atomic(application("valve_open", (application("v1"),)))
    for _ in range(64):
        shared = binary(AND, shared, shared)
    assert symbols_of_formula(shared) == {("valve_open", 1), ("v1", 0)}
