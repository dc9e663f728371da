"""Finite-model evaluation in the kernel: terms, atoms, clauses, formulas,
counter-model confirmation and its report text.

Scenario (invented): an access policy over two users.  ``admin`` and
``guest`` are constants, ``manager(U)`` is a function, ``can_read(U)`` and
``trusts(U, V)`` are predicates, ``audit_on`` is a proposition.
"""

from __future__ import annotations

import itertools

import sympy
from hypothesis import given, settings
from hypothesis import strategies as st
from sympy.logic.boolalg import And, Equivalent, Implies, Nand, Nor, Not, Or, Xor

from checker.kernel.clauses import Clause, Literal
from checker.kernel.failure import Failure
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
from checker.kernel.models import (
    Interpretation,
    confirm_countermodel,
    evaluate_atom,
    evaluate_clause,
    evaluate_formula,
    evaluate_term,
    falsified_instance,
    holds,
    render_countermodel,
)
from checker.kernel.terms import application, variable

U, V = variable("U"), variable("V")
admin, guest = application("admin"), application("guest")


def manager(t):
    return application("manager", (t,))


def can_read(t):
    return application("can_read", (t,))


def trusts(s, t):
    return application("trusts", (s, t))


def equals(s, t):
    return application("=", (s, t))


audit_on = application("audit_on")

# admin = 0, guest = 1; everyone's manager is the admin; only the admin can
# read; the admin trusts everyone, the guest trusts only itself; audit is off.
POLICY = Interpretation(
    2,
    {("admin", 0): {(): 0}, ("guest", 0): {(): 1}, ("manager", 1): {(0,): 0, (1,): 0}},
    {
        ("can_read", 1): frozenset({(0,)}),
        ("trusts", 2): frozenset({(0, 0), (0, 1), (1, 1)}),
        ("audit_on", 0): frozenset(),
    },
)


def forall(variables, body):
    return quantified(FORALL, tuple(variables), body)


def exists(variables, body):
    return quantified(EXISTS, tuple(variables), body)


# --- terms and atoms ----------------------------------------------------------


def test_terms_denote_through_the_tables():
    assert evaluate_term(POLICY, manager(manager(guest)), {}) == 0
    assert evaluate_term(POLICY, manager(U), {U: 1}) == 0
    assert evaluate_term(POLICY, guest, {}) == 1


def test_missing_tables_and_entries_are_failures_not_defaults():
    assert evaluate_term(POLICY, application("auditor"), {}) == Failure(
        "missing_table", "the model has no table for function auditor/0"
    )
    partial = Interpretation(2, {("manager", 1): {(0,): 1}}, {})
    assert evaluate_term(partial, manager(U), {U: 1}) == Failure(
        "missing_table_entry", "the table of manager/1 has no value at (1)"
    )
    broken = Interpretation(2, {("manager", 1): {(0,): 5, (1,): 0}}, {})
    assert evaluate_term(broken, manager(U), {U: 0}) == Failure(
        "value_outside_domain", "manager(0) = 5 is not in the domain"
    )
    assert evaluate_term(POLICY, manager(U), {}) == Failure("unassigned_variable", "variable U has no value")
    assert evaluate_atom(POLICY, application("writes", (admin,)), {}) == Failure(
        "missing_table", "the model has no table for predicate writes/1"
    )
    assert isinstance(evaluate_atom(POLICY, can_read(application("auditor")), {}), Failure)


def test_equality_is_identity_on_the_domain():
    assert evaluate_atom(POLICY, equals(manager(guest), admin), {}) is True
    assert evaluate_atom(POLICY, equals(guest, admin), {}) is False
    assert evaluate_atom(POLICY, trusts(guest, admin), {}) is False
    assert evaluate_atom(POLICY, audit_on, {}) is False


# --- clauses --------------------------------------------------------------------


def test_a_clause_holds_for_all_assignments_or_names_the_first_falsifying_one():
    everyone_reads_or_is_guest = Clause([Literal(True, can_read(U)), Literal(True, equals(U, guest))])
    assert evaluate_clause(POLICY, everyone_reads_or_is_guest) == (True, None)
    trust_is_symmetric = Clause([Literal(False, trusts(U, V)), Literal(True, trusts(V, U))])
    assert evaluate_clause(POLICY, trust_is_symmetric) == (False, {U: 0, V: 1})
    assert evaluate_clause(POLICY, Clause([])) == (False, {})
    unknown = Clause([Literal(False, can_read(U)), Literal(True, application("writes", (U,)))])
    assert isinstance(evaluate_clause(POLICY, unknown), Failure)


# --- formulas -------------------------------------------------------------------


def test_quantifiers_range_over_the_domain():
    everyone_has_a_trusted_manager = forall([U], exists([V], binary(AND, atomic(trusts(V, U)), atomic(equals(V, manager(U))))))
    assert evaluate_formula(POLICY, everyone_has_a_trusted_manager) is True
    someone_trusted_by_all = exists([V], forall([U], atomic(trusts(U, V))))
    assert evaluate_formula(POLICY, someone_trusted_by_all) is True
    all_trust_all = forall([U, V], atomic(trusts(U, V)))
    assert evaluate_formula(POLICY, all_trust_all) is False
    assert evaluate_formula(POLICY, atomic(can_read(U)), {U: 1}) is False
    assert evaluate_formula(POLICY, binary(NOR, VERUM, FALSUM)) is False
    assert isinstance(evaluate_formula(POLICY, forall([U], atomic(application("writes", (U,))))), Failure)


def test_a_deep_formula_is_evaluated_without_recursion():
    formula = atomic(can_read(admin))
    for _ in range(20_000):
        formula = binary(AND, atomic(can_read(manager(guest))), formula)
    assert evaluate_formula(POLICY, formula) is True
    assert evaluate_formula(POLICY, negation(formula)) is False


NAMES = ("p", "q", "r")
CONNECTIVES = (AND, OR, IMPLIES, IFF, XOR, NOR, NAND)
propositions = st.sampled_from([atomic(application(n)) for n in NAMES] + [VERUM, FALSUM])
formulas = st.recursive(
    propositions,
    lambda children: st.one_of(
        st.builds(negation, children), st.builds(binary, st.sampled_from(CONNECTIVES), children, children)
    ),
    max_leaves=10,
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


@settings(max_examples=200, deadline=None)
@given(formulas, st.sets(st.sampled_from(NAMES)))
def test_propositional_truth_values_agree_with_sympy(formula, true_names):
    # SymPy (sympy.logic.boolalg): substituting truth values into the
    # expression evaluates it.  Propositions are 0-ary predicates.
    model = Interpretation(1, {}, {(n, 0): frozenset({()} if n in true_names else set()) for n in NAMES})
    expected = bool(to_sympy(formula).subs({sympy.Symbol(n): n in true_names for n in NAMES}))
    assert evaluate_formula(model, formula) is expected


clause_atoms = st.sampled_from([can_read(U), can_read(manager(V)), trusts(U, V), trusts(V, guest), equals(U, manager(V))])
clauses = st.lists(st.builds(Literal, st.booleans(), clause_atoms), max_size=4).map(Clause)


@settings(max_examples=150, deadline=None)
@given(clauses)
def test_a_clause_and_its_closed_disjunction_agree(clause):
    # Common practice: a clause means the universal closure of the
    # disjunction of its literals.
    formula = FALSUM
    for literal in clause.literals:
        atom = atomic(literal.atom)
        formula = binary(OR, formula, atom if literal.positive else negation(atom))
    closed = forall(sorted(clause.variables(), key=lambda v: v.symbol), formula)
    holds_as_clause, falsifying = evaluate_clause(POLICY, clause)
    assert evaluate_formula(POLICY, closed) is holds_as_clause
    assert holds(POLICY, clause) is holds_as_clause
    if falsifying is not None:
        assert evaluate_formula(POLICY, formula, falsifying) is False
        earlier = itertools.takewhile(
            lambda values: values != tuple(falsifying[v] for v in sorted(falsifying, key=lambda v: v.symbol)),
            itertools.product(range(2), repeat=len(falsifying)),
        )
        names = sorted(falsifying, key=lambda v: v.symbol)
        assert all(evaluate_formula(POLICY, formula, dict(zip(names, values))) for values in earlier)


# --- confirmation and report ---------------------------------------------------

MANAGERS_READ = forall([U], binary(IMPLIES, atomic(equals(U, manager(U))), atomic(can_read(U))))
EVERYONE_READS = forall([U], atomic(can_read(U)))


def test_a_genuine_counter_model_is_confirmed():
    assert confirm_countermodel(POLICY, [MANAGERS_READ], EVERYONE_READS) is None
    clause_conclusion = Clause([Literal(True, can_read(U))])
    premise_clause = Clause([Literal(True, trusts(admin, U))])
    assert confirm_countermodel(POLICY, [premise_clause, MANAGERS_READ], clause_conclusion) is None
    # A free variable in a formula conclusion is read universally.
    assert confirm_countermodel(POLICY, [], atomic(can_read(U))) is None


def test_a_wrong_counter_model_is_refused_with_the_reason():
    assert confirm_countermodel(POLICY, [EVERYONE_READS], atomic(audit_on)) == Failure(
        "premise_false", "premise 0 `! [U] : can_read(U)` is false in the model"
    )
    assert confirm_countermodel(POLICY, [], MANAGERS_READ) == Failure(
        "conclusion_true", "the conclusion `! [U] : (U = manager(U) => can_read(U))` is true in the model"
    )
    empty = Interpretation(0, {}, {})
    assert confirm_countermodel(empty, [], FALSUM) == Failure(
        "empty_domain", "a first-order interpretation needs at least one element"
    )
    writes = atomic(application("writes", (admin,)))
    assert confirm_countermodel(POLICY, [writes], FALSUM).reason == "missing_table"
    assert confirm_countermodel(POLICY, [], writes).reason == "missing_table"


def test_falsified_instances_show_domain_elements():
    trust_is_symmetric = Clause([Literal(False, trusts(U, V)), Literal(True, trusts(V, U))])
    instance = falsified_instance(POLICY, trust_is_symmetric)
    assert str(instance) == "~trusts(0,1) | trusts(1,0)"
    nested = forall([U], forall([V], binary(IMPLIES, atomic(trusts(U, V)), atomic(trusts(V, U)))))
    assert str(falsified_instance(POLICY, nested)) == "trusts(0,1) => trusts(1,0)"
    existential = exists([V], atomic(audit_on))
    assert falsified_instance(POLICY, existential) is existential
    assert str(falsified_instance(POLICY, binary(IMPLIES, atomic(trusts(U, V)), atomic(can_read(V))))) == "trusts(0,1) => can_read(1)"


def test_no_falsified_instance_when_the_conclusion_is_true_or_unknown():
    true_clause = Clause([Literal(True, trusts(admin, U))])
    failure = falsified_instance(POLICY, true_clause)
    assert failure.reason == "conclusion_true"
    assert failure.message == f"the conclusion `{true_clause}` is true in the model"
    assert falsified_instance(POLICY, forall([U], atomic(trusts(admin, U)))).reason == "conclusion_true"
    unknown = application("writes", (U,))
    assert falsified_instance(POLICY, Clause([Literal(True, unknown)])).reason == "missing_table"
    assert falsified_instance(POLICY, forall([U], atomic(unknown))).reason == "missing_table"


def test_report_shows_the_domain_the_used_tables_and_the_falsified_instance():
    text = render_countermodel(POLICY, [MANAGERS_READ, atomic(trusts(admin, guest))], forall([U, V], atomic(trusts(U, V))))
    assert text.splitlines() == [
        "domain = {0, 1}",
        "admin = 0",
        "guest = 1",
        "manager = {0 -> 0, 1 -> 0}",
        "can_read = {0}",
        "trusts = {(0,0), (0,1), (1,1)}",
        "falsified: trusts(1,0)",
    ]
    proposition = render_countermodel(POLICY, [], atomic(audit_on))
    assert proposition.splitlines() == ["domain = {0, 1}", "audit_on = false", "falsified: audit_on"]
    audited = Interpretation(1, {("pair", 2): {(0, 0): 0}}, {("audit_on", 0): frozenset({()})})
    pair = application("pair", (U, U))
    text = render_countermodel(audited, [atomic(audit_on)], atomic(equals(pair, pair)))
    assert text.splitlines() == [
        "domain = {0}",
        "pair = {(0,0) -> 0}",
        "audit_on = true",
        "no falsified instance: the conclusion `pair(U,U) = pair(U,U)` is true in the model",
    ]
    # A 0-ary function whose entry is missing shows as an empty table.
    missing = Interpretation(1, {("admin", 0): {}}, {("can_read", 1): frozenset()})
    assert render_countermodel(missing, [], atomic(can_read(admin))).splitlines()[1] == "admin = {}"
