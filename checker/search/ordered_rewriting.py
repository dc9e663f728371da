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


def innermost_positions(term: Term) -> list[tuple[Position, Term]]:
    """The term's non-variable subterms below the root with their positions,
    innermost first, left to right (iterative)."""
    found: list[tuple[Position, Term]] = []
    stack: list[tuple[Position, Term, bool]] = [((), term, False)]
    while stack:
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


def _visiting_order(atom: Term, order: TermOrder) -> list[tuple[Position, Term]]:
    positions = innermost_positions(atom)
    if atom.symbol == EQUALITY and atom.arity == 2 and order.greater(atom.arguments[1], atom.arguments[0]):
        positions.sort(key=lambda item: item[0][0] != 2)  # stable: the greater (second) side first
    return positions


def ordered_rewrite(
    premises: Sequence[Clause], target: int, equations: Sequence[int], order: TermOrder
) -> Paramodulation | None:
    """The prover's rewrite of premise ``target`` by one of the unit
    equations (premise indices), or None when none applies."""
    clause = premises[target]
    for number, literal in enumerate(clause.literals):
        for position, subterm in _visiting_order(literal.atom, order):
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
