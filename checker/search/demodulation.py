"""Likely conclusions of a rewriting record, computed by rewriting.

A prover's demodulation record (``rw``, ``demod``, ``rewrite``...) rewrites
its first parent with unit equations among the others, by matching only
(the rewritten clause is not instantiated).  When such a record's
conclusion is not stated (a nested record), its likely conclusions are
computed directly rather than searched for: each single rewrite, and the
normal forms under the equations as written, oriented by size, and
reversed.  The equations as written come first, since a prover prints an
equation it rewrites with in the direction it uses it.  Untrusted: each
conclusion is what the kernel's replay of its evidence computes.
"""

from __future__ import annotations

from collections.abc import Iterator, Sequence

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.rules import Chain, Paramodulation, PrimitiveEvidence, replay
from checker.search.chains import rewrites
from checker.search.normal_forms import normalise, oriented_equations
from checker.search.ordered_rewriting import ordered_rewrite, too_large
from checker.search.term_order import TermOrder

REWRITE_STEPS = 40
"""rewrites per normal form, beyond which that normal form is not offered"""

_WORDS = ("demod", "rewrit")
_SHORT_NAMES = frozenset({"rw"})


def is_rewriting(rule: str) -> bool:
    """Whether the rule name is one a prover gives to demodulation."""
    name = rule.lower()
    return name in _SHORT_NAMES or any(word in name for word in _WORDS)


def _unit_equations(premises: Sequence[Clause]) -> list[int]:
    """The premises after the first that are positive unit equations."""
    return [
        index
        for index, clause in enumerate(premises)
        if index and len(clause.literal_set) == 1 and clause.literals[0].positive
        and is_equality(clause.literals[0].atom)
    ]


def demodulants(
    premises: Sequence[Clause], limit: int = REWRITE_STEPS, order: TermOrder | None = None
) -> list[tuple[Clause, PrimitiveEvidence | Chain]]:
    """Every clause :func:`each_demodulant` yields."""
    return list(each_demodulant(premises, limit, order))


def each_demodulant(
    premises: Sequence[Clause], limit: int = REWRITE_STEPS, order: TermOrder | None = None
) -> Iterator[tuple[Clause, PrimitiveEvidence | Chain]]:
    """Distinct clauses the first premise rewrites to with the unit
    equations among the others, each with the evidence the kernel replayed,
    computed as they are asked for: the prover's rewrite by its term order
    ``order`` (when given), the first single rewrite by an equation as
    written, the normal forms (equations as written, by size, reversed),
    then the other single rewrites, those by equations as written first."""
    if not premises or too_large(premises[0]):
        return
    equations = _unit_equations(premises)
    seen: set[frozenset] = set()

    def offered(evidence: PrimitiveEvidence | Chain | None) -> tuple[Clause, PrimitiveEvidence | Chain] | None:
        clause = replay(list(premises), evidence) if evidence is not None else None
        if isinstance(clause, Clause) and clause.literal_set not in seen:
            seen.add(clause.literal_set)
            return clause, evidence
        return None

    def candidates() -> Iterator[PrimitiveEvidence | Chain | None]:
        if order is not None:
            yield ordered_rewrite(premises, 0, equations, order)
        singles = [s for s in rewrites(premises, premises[0], 0) if s.equation in equations]
        singles.sort(key=lambda step: not step.left_to_right)  # stable: outermost-leftmost within each
        yield from singles[:1]
        orders = (
            [(index, True) for index in equations],
            [(index, way) for index, way in oriented_equations(premises) if index in equations],
            [(index, False) for index in equations],
        )
        for rules in orders:
            normal = normalise(premises, rules, premises[0], 0, limit)
            if normal is not None and len(normal[0]) > 1:
                yield Chain(tuple(normal[0]))
        yield from singles[1:]

    for evidence in candidates():
        found = offered(evidence)
        if found is not None:
            yield found


def describe_rewriting(evidence: PrimitiveEvidence | Chain) -> str:
    """How a demodulant was computed, for the report."""
    if isinstance(evidence, Chain):
        return f"{len(evidence.steps)} rewrites of premise 0 to a normal form"
    assert isinstance(evidence, Paramodulation)
    way = "as written" if evidence.left_to_right else "right to left"
    return f"a rewrite of premise 0 by premise {evidence.equation} ({way})"
