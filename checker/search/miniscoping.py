"""Miniscoping: quantifiers pushed inward, as a prover does before Skolemizing.

``! [S] : ? [P] : (registered(S) & on_duty(P))`` says the same as
``(! [S] : registered(S)) & ? [P] : on_duty(P)``, and Skolemizing the
second needs a constant where the first needs a function of ``S``.  A
prover that miniscopes first writes the constant; to pair it with its
quantifier the premise is miniscoped here too.  Untrusted: the result is
used only after the kernel has replayed that the premise entails it.

The formula is put in negation normal form on the way (equivalences are
left as they are), and each quantifier of a block is pushed separately:
a universal distributes over a conjunction, an existential over a
disjunction, and either leaves the operands of the other connective that
do not mention its variable.
"""

from __future__ import annotations

from checker.kernel.clausify import chain_operands
from checker.kernel.formulas import (
    AND,
    ATOM,
    EXISTS,
    FALSE,
    FORALL,
    IMPLIES,
    NAND,
    NOR,
    NOT,
    OR,
    TRUE,
    Formula,
    binary,
    free_variables,
    negation,
    quantified,
)
from checker.kernel.terms import Term

DEPTH_LIMIT = 200
"""Nesting depth beyond which a formula is left as it is (no recursion error)."""

_DUAL = {AND: OR, OR: AND, FORALL: EXISTS, EXISTS: FORALL}


def _joined(connective: str, parts: list[Formula]) -> Formula:
    combined = parts[0]
    for part in parts[1:]:
        combined = binary(connective, combined, part)
    return combined


def _pushed(quantifier: str, bound: Term, body: Formula, depth: int) -> Formula:
    """``quantifier bound : body`` with the quantifier moved inward."""
    if bound not in free_variables(body):
        return body
    if depth > DEPTH_LIMIT or body.connective not in (AND, OR):
        return quantified(quantifier, (bound,), body)
    operands = chain_operands(body)
    if (quantifier, body.connective) in ((FORALL, AND), (EXISTS, OR)):
        return _joined(body.connective, [_pushed(quantifier, bound, part, depth + 1) for part in operands])
    mentioning = [part for part in operands if bound in free_variables(part)]
    others = [part for part in operands if bound not in free_variables(part)]
    if not others:
        return quantified(quantifier, (bound,), body)
    inner = _pushed(quantifier, bound, _joined(body.connective, mentioning), depth + 1)
    # Written order kept: the quantified part where its first operand was.
    first = operands.index(mentioning[0])
    kept = [part for part in operands[:first] if part in others]
    return _joined(body.connective, [*kept, inner, *(part for part in others if part not in kept)])


def miniscoped(formula: Formula, positive: bool = True, depth: int = 0) -> Formula:
    """``formula`` (negated unless ``positive``) in negation normal form with
    its quantifiers pushed inward; equivalences kept as written."""
    connective = formula.connective
    if depth > DEPTH_LIMIT or connective in (ATOM, TRUE, FALSE) or connective not in (
        NOT, AND, OR, IMPLIES, NOR, NAND, FORALL, EXISTS
    ):
        return formula if positive else negation(formula)
    if connective == NOT:
        return miniscoped(formula.arguments[0], not positive, depth + 1)
    if connective in (AND, OR):
        parts = [miniscoped(part, positive, depth + 1) for part in chain_operands(formula)]
        return _joined(connective if positive else _DUAL[connective], parts)
    if connective in (IMPLIES, NOR, NAND):
        left, right = formula.arguments
        # a => b is ~a | b; a ~| b is ~a & ~b; a ~& b is ~a | ~b.
        signs = {IMPLIES: (False, True), NOR: (False, False), NAND: (False, False)}[connective]
        joined = OR if connective in (IMPLIES, NAND) else AND
        parts = [miniscoped(left, signs[0] == positive, depth + 1), miniscoped(right, signs[1] == positive, depth + 1)]
        return _joined(joined if positive else _DUAL[joined], parts)
    quantifier = connective if positive else _DUAL[connective]
    body = miniscoped(formula.arguments[0], positive, depth + 1)
    for bound in reversed(formula.variables):
        body = _pushed(quantifier, bound, body, depth + 1)
    return body
