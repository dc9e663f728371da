"""Rewriting chains found by meeting in the middle at a normal form.

A prover's simplification step may apply many rewrites by unit equations.
Searching forward from the premise for the claimed clause can miss a long
chain; instead, both the premise and the claimed clause are rewritten to
normal form with the unit equations oriented by size (a larger side
rewrites to a smaller one, so rewriting ends), and when the two normal
forms agree, the chain is the premise's rewrites, an instantiation, then
the claimed clause's rewrites undone one by one.  Untrusted: the chain is
replayed by the kernel before anyone relies on it.
"""

from __future__ import annotations

from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause, Literal, is_equality
from checker.kernel.rules import Chain, Instantiation, Paramodulation, PrimitiveEvidence, replay
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Position, Term, subterms
from checker.search.subsumption import find_theta
from checker.search.unify import match_into


def _size(term: Term) -> int:
    return sum(1 for _ in subterms(term))


def _variable_counts(term: Term) -> Counter:
    return Counter(t for _, t in subterms(term) if t.is_variable)


def _greater(big: Term, small: Term) -> bool:
    """Size first (every variable of the smaller side occurring at least as
    often in the larger, so that instances keep the order); ground sides of
    equal size by their text.  The rewrite bound ends any run regardless."""
    if _variable_counts(small) - _variable_counts(big):
        return False
    if _size(big) != _size(small):
        return _size(big) > _size(small)
    return big.ground and small.ground and str(big) > str(small)


def oriented_equations(premises: Sequence[Clause]) -> list[tuple[int, bool]]:
    """(premise, left_to_right) for each unit equation, oriented so that its
    found side is the greater one."""
    rules = []
    for index, clause in enumerate(premises):
        if len(clause.literal_set) != 1:
            continue
        literal = clause.literals[0]
        if not (literal.positive and is_equality(literal.atom)):
            continue
        left, right = literal.atom.arguments
        for left_to_right, (big, small) in ((True, (left, right)), (False, (right, left))):
            if _greater(big, small):
                rules.append((index, left_to_right))
    return rules


def _rewrite(premises: Sequence[Clause], rules, clause: Clause, target: int) -> Paramodulation | None:
    """The outermost-leftmost rewrite of ``clause`` (premise ``target``) by a rule."""
    for number, literal in enumerate(clause.literals):
        for position, subterm in subterms(literal.atom):
            if not position or subterm.is_variable:
                continue
            for index, left_to_right in rules:
                if index == target:
                    continue  # an equation does not rewrite itself
                side = premises[index].literals[0].atom.arguments[0 if left_to_right else 1]
                if side.symbol != subterm.symbol or side.arity != subterm.arity:
                    continue
                bindings = match_into(side, subterm, {})
                if bindings is not None:
                    return Paramodulation(index, 0, left_to_right, target, number, position, Substitution(bindings))
    return None


@dataclass(frozen=True, slots=True)
class _Undo:
    """A rewrite of the claimed clause, kept so that it can be undone: the
    literal it produced, where, and with which equation."""

    produced: Literal
    position: Position
    equation: int
    left_to_right: bool
    bindings: Substitution


def normalise(premises, rules, clause: Clause, start: int, limit: int):
    """Rewrite to normal form from chain index ``start``: the steps, the
    clauses they derive and the normal form, or None past ``limit`` steps."""
    available = list(premises)
    steps: list[PrimitiveEvidence] = []
    index = start
    while len(steps) <= limit:
        step = _rewrite(premises, rules, clause, index)
        if step is None:
            return steps, available[len(premises):], clause
        result = replay(available, step)
        if not isinstance(result, Clause):
            return None
        steps.append(step)
        available.append(result)
        clause, index = result, len(available) - 1
    return None


def find_normal_form_chain(
    premises: Sequence[Clause], claimed: Clause, limit: int, subsumption_nodes: int
) -> tuple[Chain, Substitution] | None:
    """A chain from a premise to a clause that subsumes ``claimed``, through
    a common normal form, or None."""
    rules = oriented_equations(premises)
    if not rules:
        return None
    # The claimed clause's rewrites, recorded to be undone.
    undo: list[_Undo] = []
    claim_form = claimed
    own = [*premises, claimed]
    while len(undo) <= limit:
        step = _rewrite(own, rules, claim_form, len(own) - 1)
        if step is None:
            break
        result = replay(own, step)
        if not isinstance(result, Clause):
            return None
        undo.append(_Undo(result.literals[-1], step.position, step.equation, step.left_to_right, step.equation_substitution))
        own = [*premises, result]
        claim_form = result
    else:
        return None
    for start, premise in enumerate(premises):
        forward = normalise(premises, rules, premise, start, limit)
        if forward is None:
            continue
        steps, derived, normal = forward
        theta = find_theta(normal, claim_form, subsumption_nodes)
        if theta is None:
            continue
        chain = _undone(premises, [*steps, Instantiation(len(premises) + len(steps) - 1 if steps else start, theta)],
                        derived, undo)
        if chain is None:
            continue
        final = replay(list(premises), chain)
        if isinstance(final, Clause):
            found = find_theta(final, claimed, subsumption_nodes)
            if found is not None:
                return chain, found
    return None


def _undone(premises, steps: list[PrimitiveEvidence], derived, undo: list[_Undo]) -> Chain | None:
    """The steps followed by the claimed clause's rewrites undone, last first."""
    available = [*premises, *derived]
    result = replay(available, steps[-1])
    if not isinstance(result, Clause):
        return None
    available.append(result)
    clause = result
    for record in reversed(undo):
        if record.produced not in clause.literal_set:
            continue  # the literal was weakened away: nothing to undo
        written = [i for i, lit in enumerate(clause.literals) if lit.atom is record.produced.atom]
        if not written:
            return None  # an equation standing the other way round: positions would not fit
        number = written[0]
        step = Paramodulation(
            record.equation, 0, not record.left_to_right, len(available) - 1, number, record.position, record.bindings
        )
        result = replay(available, step)
        if not isinstance(result, Clause):
            return None
        steps.append(step)
        available.append(result)
        clause = result
    return Chain(tuple(steps))
