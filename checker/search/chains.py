"""Short chains of inferences for a prover's simplification step.

A prover often bundles, in one step, a run of rewrites by unit equations,
the removal of duplicate literals and of trivially false ones (``s != s``)
and the deletion of literals by unit clauses (subsumption resolution).
This module searches for such a run starting from a premise (or from a
clause one inference away from the premises), and returns it as a kernel
:class:`~checker.kernel.rules.Chain`.

Deleting a literal never hurts (a subset of a subsuming clause still
subsumes), so deletions are applied greedily; rewriting can go either way
and is searched best-first, guided by how far the clause's subterms are
from the claimed clause's, bounded by a count of expanded clauses.
Duplicate literals need no step: the kernel's clauses are sets.
"""

from __future__ import annotations

import heapq
from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.rules import Chain, EqualityResolution, Paramodulation, PrimitiveEvidence, Resolution, replay
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import subterms, variable
from checker.search.subsumption import find_theta, find_theta_into
from checker.search.unify import match_atoms_into, match_into


@dataclass(frozen=True, slots=True)
class Seed:
    """A clause to start a chain from: premise number ``premise`` itself, or
    the clause ``evidence`` computes from the premises."""

    clause: Clause
    evidence: PrimitiveEvidence | None = None
    premise: int = -1


def _index(premises: Sequence[Clause], steps: tuple[PrimitiveEvidence, ...], premise: int) -> int:
    """The chain index of the clause the steps end in (or of the premise)."""
    return len(premises) + len(steps) - 1 if steps else premise


_ANY = variable("_")


def _profile(clause: Clause) -> Counter:
    """The clause's subterms counted, variables all read as one (the claim
    names its variables differently from the premises)."""
    blind = Substitution({var: _ANY for var in clause.variables()})
    profile: Counter = Counter()
    for literal in clause.literal_set:
        profile[literal.positive] += 1
        for _, term in subterms(blind(literal.atom)):
            profile[term] += 1
    return profile


def _distance(profile: Counter, goal: Counter) -> int:
    return sum(((profile - goal) + (goal - profile)).values())


def _deletions(premises: Sequence[Clause], clause: Clause, index: int, nodes: int) -> list[PrimitiveEvidence]:
    """Inferences each removing one literal of ``clause`` at chain index
    ``index``: ``s != s`` by equality resolution, and a literal whose
    complement is matched by a premise whose other literals all match into
    the clause (unit deletion, subsumption resolution)."""
    found: list[PrimitiveEvidence] = []
    for position, literal in enumerate(clause.literals):
        if not literal.positive and is_equality(literal.atom) and literal.atom.arguments[0] is literal.atom.arguments[1]:
            found.append(EqualityResolution(index, position, IDENTITY))
    for premise_index, premise in enumerate(premises):
        if premise_index == index:
            continue
        for k, unit in enumerate(premise.literals):
            rest = Clause(premise.without(k))
            for position, literal in enumerate(clause.literals):
                if literal.positive == unit.positive:
                    continue
                for start in match_atoms_into(unit.atom, literal.atom, {}):
                    bindings = find_theta_into(rest, clause, start, nodes)
                    if bindings is not None:
                        found.append(Resolution(premise_index, k, index, position, Substitution(bindings), IDENTITY))
                        break
    return found


def rewrites(premises: Sequence[Clause], clause: Clause, index: int) -> list[PrimitiveEvidence]:
    """Every one-step rewrite of ``clause`` by a unit equation among the
    premises, either way round, at a non-variable position (matching only:
    the clause itself is not instantiated)."""
    found: list[PrimitiveEvidence] = []
    for equation_index, equation_clause in enumerate(premises):
        if len(equation_clause.literal_set) != 1 or equation_index == index:
            continue
        equation = equation_clause.literals[0]
        if not (equation.positive and is_equality(equation.atom)):
            continue
        for left_to_right in (True, False):
            side = equation.atom.arguments[0 if left_to_right else 1]
            if side.is_variable:
                continue
            for m, literal in enumerate(clause.literals):
                for position, subterm in subterms(literal.atom):
                    if not position or subterm.is_variable or subterm.symbol != side.symbol:
                        continue
                    bindings = match_into(side, subterm, {})
                    if bindings is None:
                        continue
                    found.append(
                        Paramodulation(
                            equation_index, 0, left_to_right, index, m, position, Substitution(bindings), IDENTITY
                        )
                    )
    return found


def _simplified(
    premises: Sequence[Clause],
    clause: Clause,
    steps: tuple[PrimitiveEvidence, ...],
    derived: tuple[Clause, ...],
    premise: int,
    nodes: int,
) -> tuple[Clause, tuple[PrimitiveEvidence, ...], tuple[Clause, ...]]:
    """The clause after every literal deletion that applies, greedily, with
    the steps and derived clauses extended accordingly."""
    while True:
        index = _index(premises, steps, premise)
        for deletion in _deletions(premises, clause, index, nodes):
            result = replay([*premises, *derived], deletion)
            if isinstance(result, Clause) and len(result.literal_set) < len(clause.literal_set):
                clause, steps, derived = result, (*steps, deletion), (*derived, result)
                break
        else:
            return clause, steps, derived


def find_chain(
    premises: Sequence[Clause],
    claimed: Clause,
    seeds: Sequence[Seed],
    expansions: int,
    subsumption_nodes: int,
) -> tuple[Chain, Substitution] | None:
    """A chain of deletions and rewrites from one of the seeds to a clause
    that subsumes ``claimed`` (with the theta that shows it), or None within
    ``expansions`` expanded clauses."""
    goal = _profile(claimed)
    frontier: list[tuple[int, int, int, Clause, tuple[PrimitiveEvidence, ...], tuple[Clause, ...], int]] = []
    seen: set[frozenset] = set()
    order = 0

    def push(clause: Clause, steps: tuple[PrimitiveEvidence, ...], derived: tuple[Clause, ...], premise: int) -> None:
        nonlocal order
        clause, steps, derived = _simplified(premises, clause, steps, derived, premise, subsumption_nodes)
        if clause.literal_set in seen:
            return
        seen.add(clause.literal_set)
        order += 1
        heapq.heappush(frontier, (_distance(_profile(clause), goal), len(steps), order, clause, steps, derived, premise))

    for seed in seeds:
        if seed.evidence is None:
            push(seed.clause, (), (), seed.premise)
        else:
            push(seed.clause, (seed.evidence,), (seed.clause,), seed.premise)
    expanded = 0
    while frontier and expanded < expansions:
        _, _, _, clause, steps, derived, premise = heapq.heappop(frontier)
        expanded += 1
        if steps:
            theta = find_theta(clause, claimed, subsumption_nodes)
            if theta is not None:
                return Chain(steps), theta
        available = [*premises, *derived]
        index = _index(premises, steps, premise)
        for rewrite in rewrites(premises, clause, index):
            result = replay(available, rewrite)
            if isinstance(result, Clause):
                push(result, (*steps, rewrite), (*derived, result), premise)
    return None
