"""Guessing which quantifier each new symbol of a Skolemization step witnesses.

Untrusted: a guess only names a quantifier and witness terms; the kernel
checks their shape and builds the Skolemized premise itself
(checker.kernel.introductions.skolemize), and the step must still follow
from that.  A wrong guess costs completeness only.  Quantifiers are taken
outermost first, so a witness for an inner quantifier is built after the
outer ones are replaced, as Skolemization does.
"""

from __future__ import annotations

from collections.abc import Iterator, Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause
from checker.kernel.formulas import (
    EXISTS,
    FORALL,
    Formula,
    argument_polarities,
    free_variables,
)
from checker.kernel.terms import Term, application, subterms, variable

Symbol = tuple[str, int]


@dataclass(frozen=True, slots=True)
class Witnessing:
    """The proposal: in premise ``premise``, the bound variable ``bound`` of
    ``quantifier`` is witnessed by ``witness``."""

    premise: int
    quantifier: Formula
    bound: Term
    witness: Term


@dataclass(frozen=True, slots=True)
class Misfit:
    """Why no proposal fits a new symbol: it could only replace a quantifier
    of the wrong polarity (``wrong_polarity``), or there is none."""

    symbol: Symbol
    reason: str
    message: str


def _with_context(formula: Formula) -> Iterator[tuple[Formula, int, tuple[Term, ...]]]:
    """Subformula occurrences outermost first, with polarity and the
    variables bound around them, outermost binder first."""
    stack = [(formula, 1, ())]
    while stack:
        current, polarity, bound = stack.pop()
        yield current, polarity, bound
        inner = bound + current.variables
        factors = argument_polarities(current.connective)
        for argument, factor in reversed(tuple(zip(current.arguments, factors))):
            stack.append((argument, polarity * factor, inner))


def _uses(conclusion: Clause | Formula, symbols: set[Symbol]) -> list[Term]:
    """The first occurrence of each of ``symbols`` in the conclusion, in
    written order."""
    if isinstance(conclusion, Clause):
        atoms = [literal.atom for literal in conclusion.literals]
    else:
        atoms = [f.atom for f, _, _ in _with_context(conclusion) if f.atom is not None]
    uses: dict[Symbol, Term] = {}
    for atom in atoms:
        for position, term in subterms(atom):
            key = (term.symbol, term.arity)
            if position and not term.is_variable and key in symbols and key not in uses:
                uses[key] = term
    return list(uses.values())


def _witness(use: Term, free_in_order: list[Term]) -> Term:
    """The Skolem term for a quantifier, from the symbol's first use: its
    arguments where they are the quantifier's free variables, else the free
    variables in binding order (padded with new variables if the symbol
    takes more, cut short if it takes fewer, for the kernel to judge)."""
    if all(a in free_in_order for a in use.arguments) and len(set(use.arguments)) == use.arity:
        return use
    arguments = free_in_order[: use.arity]
    number = 0
    while len(arguments) < use.arity:
        candidate = variable(f"W{number}")
        number += 1
        if candidate not in arguments:
            arguments.append(candidate)
    return application(use.symbol, tuple(arguments))


def next_witness(premises: Sequence[Formula], conclusion: Clause | Formula, remaining: set[Symbol]) -> Witnessing | Misfit:
    """The outermost quantifier Skolemization may replace, paired with the
    remaining new symbol that best fits it (first used, preferring one whose
    arity is the quantifier's number of free variables)."""
    uses = _uses(conclusion, remaining)
    improper = None
    for index, premise in enumerate(premises):
        for formula, polarity, bound in _with_context(premise):
            if formula.connective not in (EXISTS, FORALL):
                continue
            replaceable = polarity == (1 if formula.connective == EXISTS else -1)
            if not replaceable:
                improper = improper or formula
                continue
            free = free_variables(formula)
            free_in_order = [v for v in dict.fromkeys(bound) if v in free]
            free_in_order += sorted(free - set(free_in_order), key=lambda v: v.symbol)
            if not uses:
                break
            fitting = [use for use in uses if use.arity == len(free_in_order)]
            use = (fitting or uses)[0]
            return Witnessing(index, formula, formula.variables[0], _witness(use, free_in_order))
    use = uses[0] if uses else None
    symbol = (use.symbol, use.arity) if use else sorted(remaining)[0]
    name = f"{symbol[0]}/{symbol[1]}"
    if improper is not None:
        return Misfit(
            symbol,
            "wrong_polarity",
            f"new symbol `{name}` can only replace a variable of `{improper}`, which Skolemization may not "
            "replace (an existential of negative polarity, a universal of positive polarity, or under an equivalence)",
        )
    return Misfit(symbol, "no_quantifier", f"new symbol `{name}` witnesses no quantifier of the premises")


def matching_witnesses(quantifier: Formula, instance: Formula) -> dict[Term, Term] | None:
    """The terms that stand, in ``instance``, where ``quantifier``'s body has
    its bound variables: a parallel walk of the two formulas, None when their
    shapes differ or a variable stands for two different terms."""
    bound = set(quantifier.variables)
    found: dict[Term, Term] = {}
    stack = [(quantifier.arguments[0], instance)]
    while stack:
        pattern, target = stack.pop()
        if pattern.connective != target.connective or len(pattern.arguments) != len(target.arguments):
            return None
        if pattern.atom is None:
            stack.extend(zip(pattern.arguments, target.arguments))
            continue
        terms = [(pattern.atom, target.atom)]
        while terms:
            left, right = terms.pop()
            if left in bound:
                if found.setdefault(left, right) is not right:
                    return None
            elif left.is_variable or right.is_variable or left.symbol != right.symbol or left.arity != right.arity:
                if left is not right:
                    return None
            else:
                terms.extend(zip(left.arguments, right.arguments))
    return found
