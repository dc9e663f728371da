"""The kernel's verdicts against general-purpose reference libraries:
SymPy's propositional logic for ground steps, logical-unification for the
atoms a resolution step identifies."""

from __future__ import annotations

from collections import Counter

from hypothesis import given, settings
from hypothesis import strategies as st
from sympy import And, Not, Or, Symbol
from sympy.logic.inference import satisfiable
from unification import reify, unify
from unification import var as library_variable

from checker.kernel.clauses import Clause, Literal
from checker.kernel.failure import Failure
from checker.kernel.rules import Chain, Instantiation, Resolution, check_clause_step, replay
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, render, variable
from strategies import (
    atoms,
    atoms_over,
    claimed_from,
    clauses,
    generalize,
    ground_terms,
    insert_at,
    mostly,
    resolution_steps,
    substitutions,
    terms,
)

# --- SymPy: ground steps are propositional -----------------------------------

ground_literals = st.builds(Literal, st.booleans(), atoms_over(ground_terms, with_equality=False))
ground_clauses = clauses(max_size=3, literal_strategy=ground_literals)


def as_formula(clause: Clause):
    """A ground clause as a SymPy disjunction, one symbol per ground atom."""
    return Or(*(Symbol(render(l.atom)) if l.positive else Not(Symbol(render(l.atom))) for l in clause.literals))


def entailed(premises, claimed: Clause) -> bool:
    # Reference library SymPy (sympy.logic): premises entail the claim iff
    # premises & ~claim is unsatisfiable.
    return satisfiable(And(*(as_formula(p) for p in premises), Not(as_formula(claimed)))) is False


@st.composite
def ground_steps(draw):
    """Ground premises and a resolution, or a chain of two, that fits most of the time."""
    left = draw(clauses(min_size=1, max_size=3, literal_strategy=ground_literals))
    index = draw(st.integers(0, len(left.literals) - 1))
    opposite = left.literals[index].negated() if mostly(draw) else draw(ground_literals)
    right, right_index = insert_at(draw, draw(ground_clauses), opposite)
    first = Resolution(0, index, 1, right_index)
    if draw(st.booleans()):
        return [left, right], first
    resolvent = replay([left, right], first)
    if isinstance(resolvent, Failure) or resolvent.is_empty:
        return [left, right], Chain((first, Instantiation(2)))
    k = draw(st.integers(0, len(resolvent.literals) - 1))
    third, third_index = insert_at(draw, draw(ground_clauses), resolvent.literals[k].negated())
    return [left, right, third], Chain((first, Resolution(3, k, 2, third_index)))


def test_accepted_ground_steps_are_propositional_consequences():
    counts: Counter[str] = Counter()

    @settings(max_examples=200, deadline=None)
    @given(step=ground_steps(), data=st.data())
    def run(step, data):
        premises, evidence = step
        computed = replay(premises, evidence)
        claimed, _ = claimed_from(data.draw, None if isinstance(computed, Failure) else computed)
        counts["steps"] += 1
        if check_clause_step(premises, claimed, evidence) is None:
            counts["accepted"] += 1
            assert entailed(premises, claimed), (premises, claimed, evidence)

    run()
    assert counts["accepted"] >= 0.4 * counts["steps"], counts


def test_the_sympy_check_can_say_no():
    p_a, p_b = (Clause([Literal(True, application("p", (application(n),)))]) for n in "ab")
    assert entailed([p_a], p_a) and not entailed([p_a], p_b)


# --- logical-unification: resolution identifies unifiable atoms ---------------


def to_library(term: Term, suffix: str):
    """A term as logical-unification's tuples, its variables renamed apart by ``suffix``."""
    if term.is_variable:
        return library_variable(term.symbol + suffix)
    return (term.symbol, *(to_library(argument, suffix) for argument in term.arguments))


def from_library(expression) -> Term:
    if isinstance(expression, tuple):
        return application(expression[0], tuple(from_library(e) for e in expression[1:]))
    return variable(expression.token)


def orientations(atom: Term) -> list[Term]:
    if atom.symbol == "=" and atom.arity == 2:
        return [atom, application("=", atom.arguments[::-1])]
    return [atom]


def library_unifiers(left: Term, right: Term) -> list[dict]:
    """logical-unification's unifiers of ``left`` (variables renamed with
    suffix 1) and ``right`` (suffix 2), one per orientation of an equation."""
    found = []
    for turned in orientations(right):
        result = unify(to_library(left, "1"), to_library(turned, "2"), {})
        if result is not False:
            found.append(result)
    return found


def acyclic(bindings: dict) -> bool:
    """No variable reaches itself through the bindings (the library does not
    check occurrences, so a 'unifier' of X and f(X) can come back)."""

    def variables_in(expression):
        if isinstance(expression, tuple):
            for part in expression[1:]:
                yield from variables_in(part)
        else:
            yield expression

    state: dict = {}

    def visit(v) -> bool:
        if state.get(v) == "done":
            return True
        if state.get(v) == "open":
            return False
        state[v] = "open"
        ok = v not in bindings or all(visit(w) for w in variables_in(bindings[v]))
        state[v] = "done"
        return ok

    return all(visit(v) for v in bindings)


@settings(max_examples=250, deadline=None)
@given(step=resolution_steps())
def test_accepted_resolutions_identify_unifiable_atoms(step):
    premises, evidence = step
    if isinstance(replay(premises, evidence), Failure):
        return
    left = premises[evidence.left].literals[evidence.left_literal].atom
    right = premises[evidence.right].literals[evidence.right_literal].atom
    # Reference library logical-unification (PyPI): the atoms, renamed
    # apart, have a unifier.
    assert library_unifiers(left, right)


@st.composite
def atom_pairs(draw):
    """Two atoms of one predicate, the second often an anti-instance of an
    instance of the first, so that a good share of pairs unify."""
    left = draw(atoms)
    instance = draw(substitutions)(left)
    arguments = []
    for argument in instance.arguments:
        arguments.append(generalize(draw, argument, {}) if mostly(draw) else draw(terms))
    return left, application(left.symbol, tuple(arguments))


def test_resolution_with_the_library_unifier_is_accepted():
    # Reference library logical-unification (PyPI): when it finds a unifier
    # (free of cycles), the kernel accepts the resolution of the two atoms
    # with that unifier split into one substitution per premise.
    counts: Counter[str] = Counter()

    @settings(max_examples=250, deadline=None)
    @given(pair=atom_pairs(), sign=st.booleans())
    def run(pair, sign):
        left, right = pair
        counts["pairs"] += 1
        unifiers = [u for u in library_unifiers(left, right) if acyclic(u)]
        if not unifiers:
            return
        counts["unified"] += 1

        def per_premise(atom: Term, suffix: str) -> Substitution:
            return Substitution(
                {v: from_library(reify(library_variable(v.symbol + suffix), unifiers[0])) for v in variables_of_atom(atom)}
            )

        premises = [Clause([Literal(sign, left)]), Clause([Literal(not sign, right)])]
        evidence = Resolution(0, 0, 1, 0, per_premise(left, "1"), per_premise(right, "2"))
        assert check_clause_step(premises, Clause(), evidence) is None

    run()
    assert counts["unified"] >= 0.3 * counts["pairs"], counts


def variables_of_atom(atom: Term) -> set[Term]:
    found, stack = set(), [atom]
    while stack:
        term = stack.pop()
        if term.is_variable:
            found.add(term)
        else:
            stack.extend(term.arguments)
    return found
