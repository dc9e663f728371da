"""Proposing the definition of a fresh predicate that names a subformula.

A prover that converts formulas to clauses may replace a subformula by a
new predicate applied to the subformula's free variables (``sP5(X0,X1)``)
and never print the definition it had in mind.  This search proposes one:
``! [V..] : (p(V..) <=> F)`` for a subformula ``F`` of the premises whose
free variables are exactly as many as ``p`` has arguments, in an order of
arguments that agrees with how ``p`` is applied in the conclusion.

Untrusted: the kernel checks the shape of a proposed definition
(checker.kernel.introductions.check_definition), the checker its
freshness, and every step must still follow from its premises and the
definition by a kernel-replayed refutation.  A wrong proposal costs
completeness only.  Several steps may introduce the same name (the clauses
of one formula); they must all be judged against one definition, so the
choice below depends only on all of them together, never on which of them
asks.
"""

from __future__ import annotations

import itertools
from collections.abc import Iterator, Sequence
from functools import lru_cache

from checker.kernel.clauses import Clause
from checker.kernel.entailment import check_entailment
from checker.kernel.clausify import chain_operands
from checker.kernel.formulas import (
    ATOM,
    EXISTS,
    FORALL,
    IFF,
    OR,
    Formula,
    atomic,
    binary,
    formula_of_clause,
    free_variables,
    quantified,
    subformulas_with_polarity,
    universal_closure,
)
from checker.kernel.terms import Term, application
from checker.search.entailment import find_entailment
from checker.search.findings import DEFINITION, hook
from checker.search.miniscoping import miniscoped
from checker.search.reconstruct import SearchLimits

Symbol = tuple[str, int]

CANDIDATES = 24
"""definitions proposed per named symbol, at most"""
ORDERS = 6
"""argument orders tried per subformula, at most (all of them up to arity 3)"""

Introduction = tuple[tuple[Formula, ...], Formula]
"""One step that introduces the name: its premises and its conclusion, closed."""


def _closed(content: Clause | Formula) -> Formula:
    return formula_of_clause(content) if isinstance(content, Clause) else universal_closure(content)


def _applications(symbol: Symbol, conclusion: Formula) -> list[Term]:
    return [
        f.atom for f, _ in subformulas_with_polarity(conclusion)
        if f.atom is not None and (f.atom.symbol, f.atom.arity) == symbol
    ]


def _pairings(premises: Sequence[Formula], conclusion: Formula) -> dict[Term, Term]:
    """Which conclusion variable each premise variable most likely became:
    atoms of the same predicate, compared argument by argument (a guess)."""
    votes: dict[tuple[Term, Term], int] = {}
    conclusion_atoms = [f.atom for f, _ in subformulas_with_polarity(conclusion) if f.atom is not None]
    for premise in premises:
        for occurrence, _ in subformulas_with_polarity(premise):
            atom = occurrence.atom
            if atom is None:
                continue
            for other in conclusion_atoms:
                if other.symbol != atom.symbol or other.arity != atom.arity:
                    continue
                for mine, theirs in zip(atom.arguments, other.arguments):
                    if mine.is_variable and theirs.is_variable:
                        votes[mine, theirs] = votes.get((mine, theirs), 0) + 1
    pairing: dict[Term, Term] = {}
    for (mine, theirs), _ in sorted(votes.items(), key=lambda item: -item[1]):
        if mine not in pairing and theirs not in pairing.values():
            pairing[mine] = theirs
    return pairing


def _orders(free: list[Term], applied: list[Term], pairing: dict[Term, Term]) -> Iterator[tuple[Term, ...]]:
    """Argument orders for a subformula's free variables: first the one the
    pairing with the conclusion's application suggests, then the others."""
    suggested: list[tuple[Term, ...]] = []
    for arguments in applied:
        position = {argument: index for index, argument in enumerate(arguments)}
        if all(pairing.get(v) in position for v in free):
            order = sorted(free, key=lambda v: position[pairing[v]])
            if len(set(pairing[v] for v in free)) == len(free):
                suggested.append(tuple(order))
    seen = set()
    for order in itertools.chain(suggested, [tuple(free)], itertools.permutations(free)):
        if order not in seen:
            seen.add(order)
            yield order


def proposals(
    symbol: Symbol, premises: Sequence[Clause | Formula], conclusion: Clause | Formula
) -> list[Formula]:
    """Definitions of ``symbol`` by subformulas of the premises, at most
    :data:`CANDIDATES`, then as many by subformulas of the premises
    miniscoped: a prover that splits a clause into variable-disjoint
    components names a component (``! [X1] : open_air(X1)`` of
    ``pressurised(X0) | open_air(X1)``), which is a subformula only once
    the clause's quantifiers are pushed inward."""
    closed = [_closed(p) for p in premises]
    found = _proposals(symbol, closed, conclusion)
    components = [c for p in closed for c in _components(miniscoped(p)) if c not in closed]
    if components:
        found += [d for d in _proposals(symbol, components, conclusion) if d not in found]
    return found


def _components(formula: Formula) -> list[Formula]:
    """The quantified operands of the disjunctions of ``formula``: once a
    clause is miniscoped, its variable-disjoint components."""
    found: list[Formula] = []
    for subformula, _ in subformulas_with_polarity(formula):
        if subformula.connective == OR:
            found += [part for part in chain_operands(subformula) if part.connective in (FORALL, EXISTS)]
    return found


def _proposals(symbol: Symbol, premises: Sequence[Formula], conclusion: Clause | Formula) -> list[Formula]:
    """Definitions by subformulas of ``premises``, at most :data:`CANDIDATES`:
    non-atomic subformulas of the polarity the name has in the conclusion
    first, innermost first; atoms last."""
    name, arity = symbol
    conclusion = _closed(conclusion)
    applied = [atom.arguments for atom in _applications(symbol, conclusion)]
    signs = {p for f, p in subformulas_with_polarity(conclusion) if f.atom is not None and (f.atom.symbol, f.atom.arity) == symbol}
    pairing = _pairings(premises, conclusion)
    occurrences: list[tuple[tuple, Formula]] = []
    for number, premise in enumerate(premises):
        listed = list(subformulas_with_polarity(premise))
        for depth, (subformula, polarity) in enumerate(listed):
            if len(free_variables(subformula)) != arity:
                continue
            rank = (subformula.connective == ATOM, polarity not in signs, -depth, number)
            occurrences.append((rank, subformula))
    found: list[Formula] = []
    seen: set[Formula] = set()
    for _, subformula in sorted(occurrences, key=lambda item: item[0]):
        free = sorted(free_variables(subformula), key=lambda v: v.symbol)
        for order in itertools.islice(_orders(free, applied, pairing), ORDERS):
            defined = atomic(application(name, order))
            body = binary(IFF, defined, subformula)
            definition = quantified(FORALL, order, body) if order else body
            if definition not in seen:
                seen.add(definition)
                found.append(definition)
            if len(found) == CANDIDATES:
                return found
    return found


def _follows(premises: Sequence[Formula], conclusion: Formula, limits: SearchLimits) -> bool:
    chain = find_entailment(premises, conclusion, limits)
    return chain is not None and check_entailment(premises, conclusion, chain) is None


@hook(
    DEFINITION,
    # The naming check has the kernel confirm the definition's shape and each step from it.
    question=lambda symbol, introductions, limits: (symbol, introductions),
    keep=lambda definition: definition,
    give=lambda args, kwargs, definition: definition,
    nothing=lambda: None,
)
@lru_cache(maxsize=256)  # cleared between files (checker/tables.py)
def choose_definition(symbol: Symbol, introductions: tuple[Introduction, ...], limits: SearchLimits) -> Formula | None:
    """The proposal (from the first introduction's premises) with which the
    most introductions follow from their premises, the first such; None
    when none follows.  A pure function of its arguments, so every step
    introducing ``symbol`` is judged against the same definition, and a
    single wrong step among them does not change it."""
    if not introductions:
        return None
    first_premises, first_conclusion = introductions[0]
    best, best_count = None, 0
    for definition in proposals(symbol, first_premises, first_conclusion):
        count = sum(_follows((*premises, definition), conclusion, limits) for premises, conclusion in introductions)
        if count > best_count:
            best, best_count = definition, count
        if count == len(introductions):
            break
    return best


def introduction(premises: Sequence[Clause | Formula], conclusion: Clause | Formula) -> Introduction:
    """An introducing step as :func:`choose_definition` takes it."""
    return tuple(_closed(p) for p in premises), _closed(conclusion)


def forget_definitions() -> None:
    """Forget the definitions chosen so far (between files)."""
    choose_definition.__wrapped__.cache_clear()
