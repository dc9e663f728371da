"""A small bounded saturation search for a refutation, as kernel evidence.

For a step no single inference or simplification chain explains, the
claimed clause may still follow from the premises by a short proof.  This
is the given-clause loop: pick the lightest unprocessed clause, drop it if
it is a tautology or subsumed by a processed one, otherwise infer
everything it yields with the processed clauses (binary resolution,
factoring, paramodulation, equality resolution and factoring), dropping
clauses much heavier than any input (a short proof of one step rarely
needs them, and without this a self-resolving clause grows its terms
without end, so that a count bound would no longer bound time).  Every
derived clause remembers its kernel evidence, so when the empty clause
appears only its ancestors are kept and re-indexed into a kernel
:class:`~checker.kernel.rules.Chain`.  The bounds are counts, never time.
"""

from __future__ import annotations

import heapq
from collections.abc import Iterator, Sequence

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.rules import Chain, Instantiation, PrimitiveEvidence
from checker.kernel.terms import subterms
from checker.search.evidence import (
    Attempt,
    equality_factors,
    equality_resolvents,
    factors,
    paramodulants,
    premise_references,
    reindexed,
    resolvents,
)
from checker.search.subsumption import find_theta

WEIGHT_MARGIN = 8
"""Symbols a derived clause may have beyond twice the heaviest input."""


def _weight(clause: Clause) -> int:
    """The number of symbol occurrences."""
    return sum(sum(1 for _ in subterms(literal.atom)) for literal in clause.literal_set)


def is_tautology(clause: Clause) -> bool:
    """Whether the clause holds in every interpretation with equality, by
    a complementary pair or an ``s = s`` literal."""
    for literal in clause.literal_set:
        if literal.positive and is_equality(literal.atom) and literal.atom.arguments[0] is literal.atom.arguments[1]:
            return True
        if literal.negated() in clause.literal_set:
            return True
    return False


def _subsumes(general: Clause, specific: Clause, nodes: int) -> bool:
    """Subsumption for deletion: theta(general) ⊆ specific, and general no
    longer than specific; without the length condition a clause would
    delete its own factors, and the search would lose completeness."""
    return len(general.literal_set) <= len(specific.literal_set) and find_theta(general, specific, nodes) is not None


class _Signature:
    """What a stored clause offers to binary inferences and subsumption,
    worked out once: the heads (sign, predicate, arity) of its literals,
    those it could be resolved against, and whether it has a positive
    equation to paramodulate with."""

    __slots__ = ("complements", "equational", "resolvable")

    def __init__(self, clause: Clause):
        self.resolvable = {(lit.positive, lit.atom.symbol, lit.atom.arity) for lit in clause.literals}
        self.complements = {(not positive, symbol, arity) for positive, symbol, arity in self.resolvable}
        self.equational = any(lit.positive and is_equality(lit.atom) for lit in clause.literals)


def _inferences(store: list[Clause], given: int, active: list[int], signatures: list[_Signature]) -> Iterator[Attempt]:
    """Every inference of the given clause alone and with each active one;
    pairs with no complementary predicates (no resolvent) or no equation
    (no paramodulant) are passed over without asking the generators."""
    yield from equality_resolvents(store, given)
    yield from factors(store, given)
    yield from equality_factors(store, given)
    mine = signatures[given]
    for other in active:
        theirs = signatures[other]
        if not mine.complements.isdisjoint(theirs.resolvable):
            yield from resolvents(store, other, given)
        if theirs.equational:
            yield from paramodulants(store, other, given)
        if other != given and mine.equational:
            yield from paramodulants(store, given, other)


def _extract(store_evidence: dict[int, PrimitiveEvidence], initial: int, empty: int) -> Chain:
    """The chain deriving clause ``empty`` from the initial clauses, keeping
    only its ancestors, numbered as :class:`Chain` requires."""
    needed: set[int] = set()
    stack = [empty]
    while stack:
        current = stack.pop()
        if current < initial or current in needed:
            continue
        needed.add(current)
        stack.extend(premise_references(store_evidence[current]))
    mapping = {index: index for index in range(initial)}
    for rank, index in enumerate(sorted(needed)):
        mapping[index] = initial + rank
    return Chain(tuple(reindexed(store_evidence[index], mapping) for index in sorted(needed)))


def refute(
    clauses: Sequence[Clause],
    max_generated: int,
    max_given: int,
    subsumption_nodes: int,
    support: Sequence[int] | None = None,
) -> Chain | None:
    """A chain deriving the empty clause from ``clauses`` (their indices are
    the chain's premise indices), or None within the bounds.

    With ``support`` (the indices of the clauses of a negated claim), the
    set-of-support strategy: the other clauses are taken as processed from
    the start and never infer among themselves, so every inference involves
    the claim.  That finds the short refutations of a reshaping step in far
    fewer inferences, but not every refutation (one that needs an inference
    between premises alone); callers try it first."""
    store = list(clauses)
    initial = len(store)
    evidence_of: dict[int, PrimitiveEvidence] = {}
    for index, clause in enumerate(store):
        if clause.is_empty:
            return Chain((Instantiation(index),))
    candidates = range(initial) if support is None else sorted(set(support))
    passive: list[tuple[int, int]] = [(_weight(store[i]), i) for i in candidates if not is_tautology(store[i])]
    heaviest = max((_weight(c) for c in store), default=0)
    max_weight = 2 * heaviest + WEIGHT_MARGIN
    heapq.heapify(passive)
    seen = {clause.literal_set for clause in store}
    signatures = [_Signature(clause) for clause in store]
    active: list[int] = []
    if support is not None:
        supported = set(support)
        active = [i for i in range(initial) if i not in supported and not is_tautology(store[i])]
    generated = given_count = 0
    while passive and given_count < max_given:
        _, given = heapq.heappop(passive)
        clause = store[given]
        heads = signatures[given].resolvable  # a clause with a head this one lacks cannot subsume it
        if any(signatures[other].resolvable <= heads and _subsumes(store[other], clause, subsumption_nodes)
               for other in active):
            continue
        given_count += 1
        active.append(given)
        for attempt in _inferences(store, given, active, signatures):
            computed = attempt.computed
            weight = _weight(computed)
            if weight > max_weight or computed.literal_set in seen or is_tautology(computed):
                continue
            seen.add(computed.literal_set)
            store.append(computed)
            signatures.append(_Signature(computed))
            evidence_of[len(store) - 1] = attempt.evidence
            if computed.is_empty:
                return _extract(evidence_of, initial, len(store) - 1)
            generated += 1
            if generated >= max_generated:
                return None
            heapq.heappush(passive, (weight, len(store) - 1))
    return None
