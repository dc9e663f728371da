"""A stated definition whose defined atom stands negated, read the other way.

A prover that splits a clause may name a component by the negation of a
fresh symbol (`~ e <=> ! [X] : p(X)`).  That is the definition
`e <=> ~ ! [X] : p(X)` with its negation moved across; the kernel checks
the definition's shape on that reading, and replays that the reading
entails the formula as stated, so whatever the stated formula is later
used for rests on a kernel-checked definition of a fresh symbol.
"""

from __future__ import annotations

from checker.kernel.entailment import check_entailment
from checker.kernel.formulas import ATOM, FORALL, IFF, IMPLIES, NOT, Formula, binary, negation, quantified
from checker.search.entailment import find_entailment
from checker.search.reconstruct import SearchLimits


def _negated_atom(formula: Formula) -> Formula | None:
    if formula.connective == NOT and formula.arguments[0].connective == ATOM:
        return formula.arguments[0]
    return None


def negated_side_reading(formula: Formula) -> Formula | None:
    """``! [X..] : (d <=> ~F)`` for ``! [X..] : (~d <=> F)`` (either side),
    ``~F => d`` for ``~d => F`` and ``d => ~F`` for ``F => ~d``; None when
    no side of the equivalence or implication is a negated atom."""
    prefix = []
    body = formula
    while body.connective == FORALL:
        prefix.append(body.variables)
        body = body.arguments[0]
    if body.connective not in (IFF, IMPLIES):
        return None
    left, right = body.arguments
    left_atom, right_atom = _negated_atom(left), _negated_atom(right)
    if body.connective == IFF and left_atom is not None:
        reading = binary(IFF, left_atom, negation(right))
    elif body.connective == IFF and right_atom is not None:
        reading = binary(IFF, right_atom, negation(left))
    elif left_atom is not None:
        reading = binary(IMPLIES, negation(right), left_atom)
    elif right_atom is not None:
        reading = binary(IMPLIES, right_atom, negation(left))
    else:
        return None
    for variables in reversed(prefix):
        reading = quantified(FORALL, variables, reading)
    return reading


def confirmed_reading(formula: Formula, limits: SearchLimits | None = None) -> Formula | None:
    """The negated-side reading of ``formula`` when the kernel replays that
    it entails ``formula`` as stated; else None."""
    reading = negated_side_reading(formula)
    if reading is None:
        return None
    chain = find_entailment([reading], formula, limits or SearchLimits())
    if chain is None or check_entailment([reading], formula, chain) is not None:
        return None
    return reading
