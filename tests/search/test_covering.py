"""The cover search: reshaped formulas matched clause by clause, and only
ever a cover the kernel accepts for a true entailment.

Oracles: SymPy's propositional logic (a reference library from PyPI) for
random propositional formulas and their conjunctive normal forms (SymPy's
``to_cnf``, with single changes); finite interpretations (tests/kernel/
strategies.py, independent of the kernel's model evaluation) for
quantified formulas.  Scenarios (plant zones, badges) are invented.
"""

from __future__ import annotations

import sympy
from hypothesis import given, settings
from hypothesis import strategies as st
from search_strategies import propositional_formulas, to_sympy
from sympy.logic.boolalg import And, Not, Or, to_cnf
from sympy.logic.inference import satisfiable

from checker.kernel.clausify import clausify
from checker.kernel.entailment import check_cover
from checker.kernel.formulas import (
    AND,
    FALSUM,
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
)
from checker.kernel.terms import application
from checker.search.covering import CLAUSE_LIMIT, clause_count, find_cover
from formats.tptp import parse_formula

NAMES = ("p", "q", "r", "s")
CONNECTIVES = (AND, OR, IMPLIES, IFF, XOR, NOR, NAND)
formulas = propositional_formulas(NAMES, CONNECTIVES, max_leaves=6)


def from_sympy(expression) -> Formula:
    if expression is sympy.true:
        return VERUM
    if expression is sympy.false:
        return FALSUM
    if isinstance(expression, sympy.Symbol):
        return atomic(application(expression.name, ()))
    if isinstance(expression, Not):
        return negation(from_sympy(expression.args[0]))
    connective = AND if isinstance(expression, And) else OR
    parts = [from_sympy(argument) for argument in expression.args]
    combined = parts[0]
    for part in parts[1:]:
        combined = binary(connective, combined, part)
    return combined


def changed(expression, choice: int):
    """``expression`` in CNF with one change: a clause dropped (weaker), a
    literal dropped or a sign flipped (usually stronger or unrelated)."""
    clauses = list(expression.args) if isinstance(expression, And) else [expression]
    if not clauses:
        return expression
    number = choice % len(clauses)
    clause = clauses[number]
    literals = list(clause.args) if isinstance(clause, Or) else [clause]
    kind = choice % 3
    if kind == 0:
        del clauses[number]
    elif kind == 1 and len(literals) > 1:
        clauses[number] = Or(*literals[1:])
    else:
        clauses[number] = Or(Not(literals[0]), *literals[1:])
    return And(*clauses)


@settings(max_examples=40, deadline=None)
@given(formulas, st.integers(0, 50), st.booleans())
def test_a_cover_of_a_normal_form_or_a_changed_one_is_accepted_only_for_an_entailment(formula, choice, mutate):
    premise = to_sympy(formula)
    target = to_cnf(premise, simplify=False)
    if mutate:
        target = changed(target, choice)
    conclusion = from_sympy(target)
    cover = find_cover([formula], conclusion)
    if cover is not None:
        assert check_cover([formula], conclusion, cover) is None
        # SymPy: the premise entails the conclusion.
        assert satisfiable(And(premise, Not(target))) is False


@settings(max_examples=60, deadline=None)
@given(formulas)
def test_the_clause_count_bounds_the_clauses_of_the_clausifier(formula):
    produced = clausify([formula], naming=False).clauses
    assert clause_count(formula) >= len(produced)
    # And it is exact before repeats and tautologies are dropped: the
    # product of the disjuncts' counts for a disjunction, checked on one.
    disjunction = binary(OR, formula, formula)
    assert clause_count(disjunction) == min(clause_count(formula) ** 2, CLAUSE_LIMIT + 1)


def conjunction(parts: list[str]) -> str:
    return " & ".join(f"({part})" for part in parts)


def test_a_sixteen_conjunct_distribution_is_covered():
    # Four zones, each vented or (sealed and armed and tested and logged),
    # distributed into 4 * 4 = 16 two-literal conjuncts (by construction).
    zones = [f"z{n}" for n in range(1, 5)]
    premise = parse_formula(" & ".join(
        f"(vented({z}) | (sealed({z}) & armed({z}) & tested({z}) & logged({z})))" for z in zones))
    conclusion = parse_formula(conjunction([
        f"{check}({z}) | vented({z})" for z in zones for check in ("sealed", "armed", "tested", "logged")]))
    cover = find_cover([premise], conclusion)
    assert cover is not None and check_cover([premise], conclusion, cover) is None
    # Dropping `vented` from one clause is no consequence: not covered.
    stronger = parse_formula(conjunction([
        f"{check}({z})" + ("" if (z, check) == ("z3", "armed") else f" | vented({z})")
        for z in zones for check in ("sealed", "armed", "tested", "logged")]))
    assert find_cover([premise], stronger) is None


def test_a_disjunction_of_sixteen_conjunctions_is_too_large_and_left_to_the_refutation():
    premise = parse_formula(" | ".join(f"(a{n} & b{n})" for n in range(16)))
    assert clause_count(premise) > CLAUSE_LIMIT
    assert find_cover([premise], premise) is None


def test_quantifier_shifting_renaming_and_existential_variants_are_covered():
    # Equivalences by construction (miniscoping, alpha-renaming).
    pairs = [
        ("![X] : (badge(X) => (staff(X) & active(X)))", "(![Y] : (~badge(Y) | staff(Y))) & ![Z] : (~badge(Z) | active(Z))"),
        ("![X] : ?[Y] : (holds(X, Y) & badge(Y))", "![U] : ?[V] : (badge(V) & holds(U, V))"),
        ("?[Y] : ![X] : opens(Y, X)", "?[B] : ![D] : opens(B, D)"),
        ("![X] : (door(X) | alarm)", "alarm | ![Y] : door(Y)"),
    ]
    for premise_text, conclusion_text in pairs:
        premise, conclusion = parse_formula(premise_text), parse_formula(conclusion_text)
        cover = find_cover([premise], conclusion)
        assert cover is not None, conclusion_text
        assert check_cover([premise], conclusion, cover) is None


def test_swapped_quantifiers_and_a_shared_witness_are_not_covered():
    # Not consequences, each with a two-element counter-model (from memory,
    # the textbook quantifier-swap and shared-witness examples).
    pairs = [
        ("![X] : ?[Y] : opens(X, Y)", "?[Y] : ![X] : opens(X, Y)"),
        ("(![X] : ?[Y] : left(X, Y)) & ![X] : ?[Y] : right(X, Y)", "![X] : ?[Y] : (left(X, Y) & right(X, Y))"),
        ("?[X] : staff(X)", "staff(alice)"),
    ]
    for premise_text, conclusion_text in pairs:
        assert find_cover([parse_formula(premise_text)], parse_formula(conclusion_text)) is None, conclusion_text


def test_witnesses_are_paired_clause_by_clause_in_any_order():
    # Seven existentials restated in reverse order: each conclusion clause
    # pairs its own witness, so no search over the 7! orders is needed.
    count = 7
    premise = parse_formula(" & ".join(f"(?[X] : p{n}(X))" for n in range(count)))
    conclusion = parse_formula(" & ".join(f"(?[X] : p{n}(X))" for n in reversed(range(count))))
    cover = find_cover([premise], conclusion)
    assert cover is not None and check_cover([premise], conclusion, cover) is None


def test_the_matching_is_bounded_by_a_count_of_clause_pairs(monkeypatch):
    # A variant needs one matching try; with none allowed no cover is found.
    premise = parse_formula("![X] : (badge(X) | guest(X))")
    conclusion = parse_formula("![Y] : (guest(Y) | badge(Y))")
    assert find_cover([premise], conclusion) is not None
    monkeypatch.setattr("checker.search.covering.MATCHING_TRIES", 0)
    assert find_cover([premise], conclusion) is None
