"""Equivalences written out as two implications, so Skolemization can reach
what they hide.

A quantifier under ``<=>`` occurs with both polarities, so Skolemization
may not replace it there; a prover first writes the equivalence as two
implications (as negation normal form does), after which the copy of
positive polarity can be Skolemized.  Untrusted: the result is handed on
only after the kernel has replayed that the original entails it.
"""

from __future__ import annotations

from checker.kernel.formulas import AND, IFF, IMPLIES, OR, XOR, Formula, binary, make, negation


def has_equivalence(formula: Formula) -> bool:
    stack = [formula]
    while stack:
        current = stack.pop()
        if current.connective in (IFF, XOR):
            return True
        stack.extend(current.arguments)
    return False


def _written_out(connective: str, left: Formula, right: Formula) -> Formula:
    if connective == IFF:
        return binary(AND, binary(IMPLIES, left, right), binary(IMPLIES, right, left))
    return binary(AND, binary(OR, left, right), binary(OR, negation(left), negation(right)))


def without_equivalences(formula: Formula) -> Formula:
    """``formula`` with every ``a <=> b`` written ``(a => b) & (b => a)`` and
    every ``a <~> b`` written ``(a | b) & (~a | ~b)`` (iteratively, post-order)."""
    results: list[Formula] = []
    tasks: list[tuple[Formula, bool]] = [(formula, False)]
    while tasks:
        current, rebuilt = tasks.pop()
        if not current.arguments:
            results.append(current)
        elif not rebuilt:
            tasks.append((current, True))
            tasks.extend((argument, False) for argument in reversed(current.arguments))
        else:
            count = len(current.arguments)
            arguments = tuple(results[len(results) - count:])
            del results[len(results) - count:]
            if current.connective in (IFF, XOR):
                results.append(_written_out(current.connective, *arguments))
            else:
                results.append(make(current.connective, arguments, current.variables, current.atom))
    return results[0]
