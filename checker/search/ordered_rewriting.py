"""The rewrite a prover makes with a unit equation, by its term order.

A saturation prover simplifies a clause one rewrite at a time and prints a
rewriting record per rewrite: the equation is used from the side that is
greater in its term order, at an instance only if that instance's side is
greater (ordered rewriting), at the first subterm found when the greater
side of an equational literal is visited first and, within a side, the
innermost subterms leftmost first (observed on the prover corpus, common
practice).  The term order itself is not printed, so it is inferred once
per derivation (:func:`inferred_order`): of the orders a prover commonly
uses (:func:`checker.search.term_order.likely_orders`), the one whose
rewrites reproduce most of the derivation's stated rewriting steps, then
which agrees most with how its stated unit equations are written (greater
side first).  Untrusted: a rewrite computed here is replayed by the kernel.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import dataclass

from checker.kernel.clauses import EQUALITY, Clause, is_equality
from checker.kernel.rules import Chain, Paramodulation, replay
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Position, Term, subterms
from checker.search.subsumption import find_theta
from checker.search.term_order import TermOrder, likely_orders
from checker.search.unify import match_into

EXAMPLES = 200
"""stated rewriting steps an order is scored on, at most"""

TERM_SIZE = 1000
"""subterm occurrences of a literal beyond which the search does not
rewrite it (a wrong guess repeating a distributive law doubles a term at
each step; a prover's own clauses stay far smaller)"""


def innermost_positions(term: Term, limit: int = TERM_SIZE) -> list[tuple[Position, Term]] | None:
    """The term's non-variable subterms below the root with their positions,
    innermost first, left to right (iterative); None past ``limit``."""
    found: list[tuple[Position, Term]] = []
    stack: list[tuple[Position, Term, bool]] = [((), term, False)]
    while stack:
        if len(found) + len(stack) > limit:
            return None
        position, current, visited = stack.pop()
        if current.is_variable:
            continue
        if visited or not current.arguments:
            if position:
                found.append((position, current))
            continue
        stack.append((position, current, True))
        for index in range(current.arity, 0, -1):
            stack.append(((*position, index), current.arguments[index - 1], False))
    return found


def too_large(clause: Clause) -> bool:
    """Whether a literal of the clause has more than ``TERM_SIZE`` subterm
    occurrences."""
    return any(innermost_positions(literal.atom) is None for literal in clause.literals)


def _visiting_order(atom: Term, order: TermOrder) -> list[tuple[Position, Term]] | None:
    positions = innermost_positions(atom)
    if positions is None:
        return None
    if atom.symbol == EQUALITY and atom.arity == 2 and order.greater(atom.arguments[1], atom.arguments[0]):
        positions.sort(key=lambda item: item[0][0] != 2)  # stable: the greater (second) side first
    return positions


def ordered_rewrite(
    premises: Sequence[Clause], target: int, equations: Sequence[int], order: TermOrder
) -> Paramodulation | None:
    """The prover's rewrite of premise ``target`` by one of the unit
    equations (premise indices), or None when none applies."""
    clause = premises[target]
    visits = [_visiting_order(literal.atom, order) for literal in clause.literals]
    if any(visit is None for visit in visits):
        return None
    for number, visit in enumerate(visits):
        for position, subterm in visit:
            for index in equations:
                left, right = premises[index].literals[0].atom.arguments
                for left_to_right, (found, replacement) in ((True, (left, right)), (False, (right, left))):
                    if found.is_variable or found.symbol != subterm.symbol or found.arity != subterm.arity:
                        continue
                    bindings = match_into(found, subterm, {})
                    if bindings is None:
                        continue
                    substitution = Substitution(bindings)
                    if order.greater(subterm, substitution(replacement)):
                        return Paramodulation(index, 0, left_to_right, target, number, position, substitution)
    return None


def superposes(premises: Sequence[Clause], step: Paramodulation, order: TermOrder) -> bool:
    """Whether a paramodulation is one a superposition prover makes: from
    a side of the equation that is not smaller than the other, into a side
    of an equational target literal that is not smaller than the other
    (both after the substitutions), never at a variable (the ordering
    restrictions of the superposition calculus, common practice)."""
    first, second = (step.equation_substitution(side)
                     for side in premises[step.equation].literals[step.equation_literal].atom.arguments)
    found, replacement = (first, second) if step.left_to_right else (second, first)
    if order.greater(replacement, found):
        return False
    target = premises[step.target].literals[step.target_literal].instance(step.target_substitution).atom
    if target.symbol != EQUALITY or target.arity != 2:
        return True
    into, other = target.arguments[step.position[0] - 1], target.arguments[2 - step.position[0]]
    return not order.greater(other, into)


def _occurs(term: Term, clause: Clause) -> bool:
    return any(subterm is term for literal in clause.literals for position, subterm in subterms(literal.atom) if position)


def everywhere(premises: Sequence[Clause], step: Paramodulation, computed: Clause, limit: int = 20) -> Chain | None:
    """A paramodulation (whose conclusion is ``computed``) followed by the
    same replacement (the same equation instance) at every other occurrence
    of the replaced term, as a prover that shares equal subterms computes
    it; None when the term occurs only once."""
    equation = premises[step.equation].literals[step.equation_literal].atom.arguments
    found = step.equation_substitution(equation[0 if step.left_to_right else 1])
    if not _occurs(found, computed):
        return None
    steps = [step]
    available = list(premises)
    while len(steps) <= limit:
        result = replay(available, steps[-1])
        if not isinstance(result, Clause):
            return None
        available.append(result)
        occurrence = next(
            ((number, position) for number, literal in enumerate(result.literals)
             for position, subterm in subterms(literal.atom) if position and subterm is found),
            None,
        )
        if occurrence is None:
            break
        number, position = occurrence
        steps.append(Paramodulation(step.equation, step.equation_literal, step.left_to_right, len(available) - 1,
                                    number, position, step.equation_substitution))
    return Chain(tuple(steps)) if len(steps) > 1 else None


@dataclass(frozen=True, slots=True)
class RewritingExample:
    """A stated rewriting step: a stated clause, the unit equations applied
    to it in turn (one rewrite each), and the stated conclusion."""

    base: Clause
    equations: tuple[Clause, ...]
    conclusion: Clause


def _reproduces(example: RewritingExample, order: TermOrder) -> bool:
    clause = example.base
    for equation in example.equations:
        step = ordered_rewrite([clause, equation], 0, [1], order)
        if step is None:
            return False
        result = replay([clause, equation], step)
        if not isinstance(result, Clause):
            return False
        clause = result
    return find_theta(clause, example.conclusion, 200) is not None


def _written_greater_first(order: TermOrder, units: Sequence[tuple[Term, Term]]) -> int:
    return sum(order.greater(left, right) for left, right in units) - sum(
        order.greater(right, left) for left, right in units)


def inferred_order(
    problem_atoms: Iterable[Term], examples: Sequence[RewritingExample], stated: Iterable[Clause]
) -> TermOrder | None:
    """The likely order that best explains the derivation (see the module's
    docstring), the first of them on a tie; None when the problem has no
    function symbols."""
    orders = likely_orders(problem_atoms)
    if not orders:
        return None
    units = [
        clause.literals[0].atom.arguments
        for clause in stated
        if len(clause.literal_set) == 1 and clause.literals[0].positive and is_equality(clause.literals[0].atom)
    ]
    sample = examples[:EXAMPLES]

    def score(numbered: tuple[int, TermOrder]) -> tuple[int, int, int]:
        number, order = numbered
        return sum(_reproduces(example, order) for example in sample), _written_greater_first(order, units), -number

    return max(enumerate(orders), key=score)[1]
