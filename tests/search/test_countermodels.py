"""The counter-model finder: every model it reports is re-evaluated here by a
brute-force evaluator written in this file, independent of the kernel's.

Scenario (invented): a plant interlock.  ``sensor_ok(S)``, ``valve_open(V)``,
``drives(S, V)``; ``upstream(V)`` is a function, ``main_valve`` and
``bypass`` are constants.
"""

from __future__ import annotations

import itertools

import sympy
from hypothesis import given, settings
from hypothesis import strategies as st
from sympy.logic.boolalg import And, Equivalent, Implies, Nand, Nor, Not, Or, Xor
from sympy.logic.inference import satisfiable

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
    atomic,
    binary,
    negation,
    quantified,
)
from checker.kernel.models import Interpretation
from checker.kernel.terms import Term, application, variable
from checker.search.models import find_countermodel, flatten, solve

X, Y = variable("X"), variable("Y")
main_valve, bypass = application("main_valve"), application("bypass")


def upstream(t):
    return application("upstream", (t,))


def sensor_ok(t):
    return atomic(application("sensor_ok", (t,)))


def valve_open(t):
    return atomic(application("valve_open", (t,)))


def equal(s, t):
    return atomic(application("=", (s, t)))


def forall(variables, body):
    return quantified(FORALL, tuple(variables), body)


def exists(variables, body):
    return quantified(EXISTS, tuple(variables), body)


# --- the independent evaluator ------------------------------------------------


def value(model: Interpretation, term: Term, env) -> int:
    if term.is_variable:
        return env[term]
    return model.functions[(term.symbol, term.arity)][tuple(value(model, a, env) for a in term.arguments)]


def atom_true(model: Interpretation, atom: Term, env) -> bool:
    args = tuple(value(model, a, env) for a in atom.arguments)
    if atom.symbol == "=":
        return args[0] == args[1]
    return args in model.predicates[(atom.symbol, atom.arity)]


def true_in(model: Interpretation, formula: Formula, env=None) -> bool:
    """Tarski semantics by brute force, recursively (formulas here are small)."""
    env = env or {}
    c = formula.connective
    if c == ATOM:
        return atom_true(model, formula.atom, env)
    if c in ("$true", "$false"):
        return c == "$true"
    if c == "~":
        return not true_in(model, formula.arguments[0], env)
    if c in (FORALL, EXISTS):
        outcomes = (
            true_in(model, formula.arguments[0], {**env, **dict(zip(formula.variables, values))})
            for values in itertools.product(range(model.size), repeat=len(formula.variables))
        )
        return all(outcomes) if c == FORALL else any(outcomes)
    a, b = (true_in(model, x, env) for x in formula.arguments)
    return {AND: a and b, OR: a or b, IMPLIES: not a or b, IFF: a == b, XOR: a != b, NOR: not (a or b), NAND: not (a and b)}[c]


def clause_true(model: Interpretation, clause: Clause) -> bool:
    variables = sorted(clause.variables(), key=lambda v: v.symbol)
    return all(
        any(atom_true(model, lit.atom, dict(zip(variables, values))) == lit.positive for lit in clause.literals)
        for values in itertools.product(range(model.size), repeat=len(variables))
    )


def statement_true(model, statement) -> bool:
    if isinstance(statement, Clause):
        return clause_true(model, statement)
    free = sorted({v for v in _variables(statement)}, key=lambda v: v.symbol)
    return all(true_in(model, statement, dict(zip(free, values))) for values in itertools.product(range(model.size), repeat=len(free)))


def _variables(formula: Formula) -> set[Term]:
    """Free variables, recomputed here rather than taken from the kernel."""
    if formula.connective == ATOM:
        found, stack = set(), [formula.atom]
        while stack:
            t = stack.pop()
            if t.is_variable:
                found.add(t)
            stack.extend(t.arguments)
        return found
    inner = set().union(*(_variables(a) for a in formula.arguments)) if formula.arguments else set()
    return inner - set(formula.variables)


def assert_countermodel(model, premises, conclusion):
    assert model is not None
    assert all(statement_true(model, p) for p in premises)
    assert not statement_true(model, conclusion)


# --- invalid steps get a model, valid ones none ---------------------------------


def test_a_converse_is_refuted_in_a_one_element_plant():
    premises = [forall([X], binary(IMPLIES, sensor_ok(X), valve_open(X)))]
    conclusion = forall([X], binary(IMPLIES, valve_open(X), sensor_ok(X)))
    model = find_countermodel(premises, conclusion)
    assert_countermodel(model, premises, conclusion)
    assert model.size == 1


def test_equal_upstream_valves_need_not_be_equal():
    premises = [equal(upstream(main_valve), upstream(bypass))]
    conclusion = equal(main_valve, bypass)
    model = find_countermodel(premises, conclusion)
    assert_countermodel(model, premises, conclusion)
    assert model.size == 2


def test_the_domain_bound_is_respected():
    # Two distinct valves do not make every valve one of them: the smallest
    # counter-model has three elements.
    premises = [negation(equal(main_valve, bypass))]
    conclusion = forall([X], binary(OR, equal(X, main_valve), equal(X, bypass)))
    assert find_countermodel(premises, conclusion, max_domain=2) is None
    model = find_countermodel(premises, conclusion, max_domain=3)
    assert_countermodel(model, premises, conclusion)
    assert model.size == 3


def test_a_valid_consequence_has_no_counter_model():
    premises = [valve_open(main_valve), forall([X], binary(IMPLIES, valve_open(X), sensor_ok(upstream(X))))]
    assert find_countermodel(premises, exists([Y], sensor_ok(Y))) is None
    assert find_countermodel(premises, sensor_ok(upstream(main_valve))) is None
    assert find_countermodel([forall([X], equal(X, upstream(X)))], equal(upstream(upstream(bypass)), bypass)) is None


def test_clauses_as_premises_and_conclusion():
    premises = [
        Clause([Literal(False, application("sensor_ok", (X,))), Literal(True, application("valve_open", (X,)))]),
        Clause([Literal(True, application("sensor_ok", (main_valve,)))]),
    ]
    conclusion = Clause([Literal(True, application("valve_open", (bypass,)))])
    model = find_countermodel(premises, conclusion)
    assert_countermodel(model, premises, conclusion)
    valid = Clause([Literal(True, application("valve_open", (main_valve,)))])
    assert find_countermodel(premises, valid) is None


def test_symbols_that_clausification_drops_still_get_tables():
    # valve_open(bypass) | $true simplifies away, yet the model must say
    # what bypass and valve_open are for the kernel to evaluate the premise.
    premises = [binary(OR, valve_open(upstream(bypass)), VERUM)]
    conclusion = sensor_ok(main_valve)
    model = find_countermodel(premises, conclusion)
    assert_countermodel(model, premises, conclusion)
    assert ("bypass", 0) in model.functions and ("valve_open", 1) in model.predicates


def test_the_ground_clause_limit_stops_the_search():
    premises = [forall([X], binary(IMPLIES, sensor_ok(X), valve_open(X)))]
    conclusion = forall([X], binary(IMPLIES, valve_open(X), sensor_ok(X)))
    # At one element: three clauses with one variable each once flattened
    # (the Skolem constant of the negated conclusion is named by one), and
    # one at-least-one clause for that constant's table: four ground clauses.
    assert find_countermodel(premises, conclusion, limit=3) is None
    assert find_countermodel(premises, conclusion, limit=4) is not None


def test_the_solver_reports_a_model_no_model_or_giving_up():
    # The pigeonhole formulas (Cook and Reckhow, 1979; Haken, 1985; from
    # memory): seven pigeons in six holes are unsatisfiable, and resolution
    # needs many steps (a SAT solver many conflicts) to show it.
    pigeons, holes = 7, 6
    sits = lambda i, j: i * holes + j + 1  # noqa: E731
    problem = [[sits(i, j) for j in range(holes)] for i in range(pigeons)]
    problem += [[-sits(i, j), -sits(k, j)] for j in range(holes) for i, k in itertools.combinations(range(pigeons), 2)]
    assert solve(problem, conflicts=1) is None
    assert solve(problem, conflicts=1_000_000) is False
    assert solve([[1, 2], [-1]], conflicts=10) == {2}


def test_flattening_names_each_function_application_once():
    clause = Clause([Literal(True, application("drives", (upstream(X), upstream(X)))), Literal(False, application("=", (X, main_valve)))])
    flat = flatten(clause)
    # Slots: X, upstream(X), main_valve.
    assert flat.variable_count == 3
    assert [(lit.kind, lit.positive, lit.arguments, lit.result) for lit in flat.literals] == [
        ("function", False, (0,), 1),
        ("function", False, (), 2),
        ("predicate", True, (1, 1), -1),
        ("equality", False, (0, 2), -1),
    ]


# --- properties -------------------------------------------------------------------

NAMES = ("p", "q", "r")
CONNECTIVES = (AND, OR, IMPLIES, IFF, XOR, NOR, NAND)
propositions = st.sampled_from([atomic(application(n)) for n in NAMES] + [VERUM, FALSUM])
propositional = st.recursive(
    propositions,
    lambda children: st.one_of(st.builds(negation, children), st.builds(binary, st.sampled_from(CONNECTIVES), children, children)),
    max_leaves=6,
)
SYMPY_CONNECTIVES = {AND: And, OR: Or, IMPLIES: Implies, IFF: Equivalent, XOR: Xor, NOR: Nor, NAND: Nand}


def to_sympy(formula: Formula):
    c = formula.connective
    if c == ATOM:
        return sympy.Symbol(formula.atom.symbol)
    if c in ("$true", "$false"):
        return sympy.true if c == "$true" else sympy.false
    if c == "~":
        return Not(to_sympy(formula.arguments[0]))
    return SYMPY_CONNECTIVES[c](*(to_sympy(a) for a in formula.arguments))


@settings(max_examples=100, deadline=None)
@given(st.lists(propositional, max_size=3), propositional)
def test_propositional_counter_models_exist_exactly_when_sympy_says_so(premises, conclusion):
    # SymPy (sympy.logic.inference.satisfiable): premises |= conclusion fails
    # exactly when premises & ~conclusion is satisfiable.
    expected = satisfiable(And(*(to_sympy(p) for p in premises), Not(to_sympy(conclusion)))) is not False
    model = find_countermodel(premises, conclusion, max_domain=1)
    assert (model is not None) == expected
    if model is not None:
        assert_countermodel(model, premises, conclusion)


fo_terms = st.sampled_from([X, Y, main_valve, upstream(X), upstream(main_valve)])
fo_atoms = st.one_of(st.builds(sensor_ok, fo_terms), st.builds(valve_open, fo_terms), st.builds(equal, fo_terms, fo_terms))
first_order = st.recursive(
    fo_atoms,
    lambda children: st.one_of(
        st.builds(negation, children),
        st.builds(binary, st.sampled_from(CONNECTIVES), children, children),
        st.builds(forall, st.sampled_from([[X], [Y]]), children),
        st.builds(exists, st.sampled_from([[X], [Y]]), children),
    ),
    max_leaves=4,
)


def all_interpretations(size: int):
    """Every interpretation of main_valve, upstream, sensor_ok, valve_open."""
    points = [(v,) for v in range(size)]
    for constant, images, ok, opened in itertools.product(
        range(size),
        itertools.product(range(size), repeat=size),
        itertools.product((False, True), repeat=size),
        itertools.product((False, True), repeat=size),
    ):
        yield Interpretation(
            size,
            {("main_valve", 0): {(): constant}, ("upstream", 1): dict(zip(points, images))},
            {
                ("sensor_ok", 1): frozenset(p for p, flag in zip(points, ok) if flag),
                ("valve_open", 1): frozenset(p for p, flag in zip(points, opened) if flag),
            },
        )


@settings(max_examples=60, deadline=None)
@given(st.lists(first_order, max_size=2), first_order)
def test_first_order_counter_models_are_found_at_the_smallest_size(premises, conclusion):
    # Common practice (the definition of a counter-model): checked against
    # an exhaustive search of all interpretations with at most 2 elements.
    smallest = next(
        (
            size
            for size in (1, 2)
            for model in all_interpretations(size)
            if all(statement_true(model, p) for p in premises) and not statement_true(model, conclusion)
        ),
        None,
    )
    model = find_countermodel(premises, conclusion, max_domain=2)
    if smallest is None:
        assert model is None
    else:
        assert_countermodel(model, premises, conclusion)
        assert model.size == smallest


def test_a_remembered_counter_model_is_reused_only_under_bounds_at_least_as_large():
    # The same question asked under larger then smaller bounds: the answer
    # under the smaller ones must not depend on what was asked before.
    premises = [forall([X], binary(IMPLIES, valve_open(X), sensor_ok(X)))]
    conclusion = forall([X], binary(IMPLIES, sensor_ok(X), valve_open(X)))
    assert find_countermodel(premises, conclusion, limit=100) is not None
    assert find_countermodel(premises, conclusion, limit=3) is None
    assert find_countermodel(premises, conclusion, limit=4) is not None
    assert find_countermodel(premises, conclusion, limit=4, max_domain=0) is None
