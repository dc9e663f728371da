"""Guessing which quantifier each new symbol of a Skolemization step witnesses.

Untrusted: the guess only proposes Skolem axioms, which the kernel builds
and checks (checker.kernel.introductions), and the step still has to be
entailed by premises plus axioms.  A wrong guess costs completeness only.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause
from checker.kernel.formulas import EXISTS, FORALL, Formula, free_variables, subformulas_with_polarity
from checker.kernel.terms import Term, application, subterms, variable

Symbol = tuple[str, int]


@dataclass(frozen=True, slots=True)
class Witnessing:
    """The proposal: ``quantifier`` (a subformula of a premise) has its
    bound variables witnessed by ``witnesses``."""

    quantifier: Formula
    witnesses: tuple[Term, ...]


@dataclass(frozen=True, slots=True)
class Misfit:
    """Why no proposal fits a new symbol: it matches only quantifiers of the
    wrong polarity (``wrong_polarity``) or none at all."""

    symbol: Symbol
    reason: str
    message: str


def _occurrences(content: Clause | Formula) -> list[Term]:
    """Terms of the conclusion in written order, atoms' arguments included."""
    atoms: list[Term] = []
    if isinstance(content, Clause):
        atoms = [literal.atom for literal in content.literals]
    else:
        for formula, _ in subformulas_with_polarity(content):
            if formula.atom is not None:
                atoms.append(formula.atom)
    found: list[Term] = []
    for atom in atoms:
        for position, term in subterms(atom):
            if position:
                found.append(term)
    return found


def _first_uses(conclusion: Clause | Formula, symbols: set[Symbol]) -> list[Term]:
    """For each new symbol, its first occurrence in the conclusion, in order."""
    uses: dict[Symbol, Term] = {}
    for term in _occurrences(conclusion):
        key = (term.symbol, term.arity)
        if not term.is_variable and key in symbols and key not in uses:
            uses[key] = term
    return list(uses.values())


def _quantified_variables(premises: Sequence[Formula]) -> tuple[list[tuple[Formula, Term]], list[tuple[Formula, Term]]]:
    """Bound variables that Skolemization may replace (existential in positive
    polarity, universal in negative), and those it may not, in written order."""
    proper: list[tuple[Formula, Term]] = []
    improper: list[tuple[Formula, Term]] = []
    for premise in premises:
        for formula, polarity in subformulas_with_polarity(premise):
            if formula.connective not in (EXISTS, FORALL):
                continue
            replaceable = (formula.connective == EXISTS and polarity > 0) or (
                formula.connective == FORALL and polarity < 0
            )
            target = proper if replaceable else improper
            target.extend((formula, bound) for bound in formula.variables)
    return proper, improper


def _witness(use: Term, quantifier: Formula) -> Term:
    """The Skolem term for ``quantifier`` built from the symbol's use: its
    variables where they are variables of the quantifier, else the
    quantifier's free variables in order, else fresh ones."""
    free = sorted(free_variables(quantifier), key=lambda v: v.symbol)
    named = [a for a in use.arguments if a.is_variable and a in free]
    if len(set(named)) == use.arity:
        return application(use.symbol, tuple(named))
    arguments = free[: use.arity]
    number = 0
    while len(arguments) < use.arity:
        candidate = variable(f"W{number}")
        number += 1
        if candidate not in arguments:
            arguments.append(candidate)
    return application(use.symbol, tuple(arguments))


def propose_witnesses(
    premises: Sequence[Formula], conclusion: Clause | Formula, new: set[Symbol]
) -> list[Witnessing] | Misfit:
    """Pair each new symbol, by order of first use, with the next replaceable
    bound variable of the premises, grouped by quantifier."""
    uses = _first_uses(conclusion, new)
    proper, improper = _quantified_variables(premises)
    if len(uses) > len(proper):
        use = uses[len(proper)]
        symbol = (use.symbol, use.arity)
        if improper:
            formula, bound = improper[0]
            return Misfit(
                symbol,
                "wrong_polarity",
                f"new symbol `{use.symbol}/{use.arity}` can only replace `{bound}` of `{formula}`, "
                "which Skolemization may not replace (an existential of negative polarity or a universal of positive polarity)",
            )
        return Misfit(symbol, "no_quantifier", f"new symbol `{use.symbol}/{use.arity}` witnesses no quantifier of the premises")
    grouped: dict[Formula, dict[Term, Term]] = {}
    for use, (formula, bound) in zip(uses, proper):
        grouped.setdefault(formula, {})[bound] = _witness(use, formula)
    proposals = []
    for formula, chosen in grouped.items():
        if len(chosen) != len(formula.variables):
            # A quantifier only partly witnessed gets no axiom: the entailment
            # check then fails and the step is reported unproven.
            continue
        proposals.append(Witnessing(formula, tuple(chosen[v] for v in formula.variables)))
    return proposals
