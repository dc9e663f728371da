"""Finding theta with theta(computed) ⊆ claimed: the kernel's conclusion test,
searched for.

Backtracking matching of each literal of the computed clause onto some
literal of the claimed one, most constrained literal first, equality taken
as symmetric.  The search is bounded by a count of matching attempts so
that a pathological clause pair costs a known amount of work.
"""

from __future__ import annotations

from checker.kernel.clauses import Clause, Literal
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import Term
from checker.search.findings import MATCHING, checked_matching, hook
from checker.search.unify import match_atoms_into

DEFAULT_NODES = 2000


Head = tuple[bool, str, int]
"""A literal's sign, predicate symbol and arity: only literals with the same
head can match."""


def _by_head(claimed: Clause) -> dict[Head, list[Literal]]:
    """The claimed clause's distinct literals, in written order, by head
    (grouped once per search rather than scanned for every literal)."""
    groups: dict[Head, list[Literal]] = {}
    for target in dict.fromkeys(claimed.literals):
        groups.setdefault((target.positive, target.atom.symbol, target.atom.arity), []).append(target)
    return groups


def _candidates(
    literal: Literal, targets: dict[Head, list[Literal]], bindings: dict[Term, Term]
) -> list[dict[Term, Term]]:
    found: list[dict[Term, Term]] = []
    for target in targets.get((literal.positive, literal.atom.symbol, literal.atom.arity), ()):
        found.extend(match_atoms_into(literal.atom, target.atom, bindings))
    return found


@hook(
    MATCHING,
    question=lambda computed, claimed, limit=None, bindings=None: (computed, claimed, bindings or IDENTITY),
    keep=lambda theta: theta,
    give=lambda args, kwargs, theta: checked_matching(args[0], args[1], theta),
    nothing=lambda: None,
)
def find_theta(
    computed: Clause,
    claimed: Clause,
    limit: int = DEFAULT_NODES,
    bindings: Substitution | None = None,
) -> Substitution | None:
    """A substitution theta, extending ``bindings``, with theta(computed) a
    subset of claimed; None when there is none or when ``limit`` matching
    attempts did not find one."""
    start: dict[Term, Term] = dict(bindings.mapping) if bindings is not None else {}
    found = find_theta_into(computed, claimed, start, limit)
    return None if found is None else Substitution(found)


def find_theta_into(
    computed: Clause, claimed: Clause, start: dict[Term, Term], limit: int = DEFAULT_NODES
) -> dict[Term, Term] | None:
    """:func:`find_theta` on working bindings that keep identity entries."""
    pending = list(dict.fromkeys(computed.literals))  # written order: reproducible results
    targets = _by_head(claimed)
    # Most constrained first: a literal with few possible images prunes early.
    counted = []
    for literal in pending:
        options = _candidates(literal, targets, start)
        if not options:
            return None
        counted.append((len(options), literal))
    counted.sort(key=lambda item: item[0])  # stable: ties keep the written order
    order = [literal for _, literal in counted]
    attempts = len(order)
    # Iterative depth-first search: one frame per literal, holding its options.
    frames: list[list[dict[Term, Term]]] = []
    bindings = start
    depth = 0
    while True:
        if depth == len(order):
            return bindings
        options = _candidates(order[depth], targets, bindings)
        attempts += 1
        if attempts > limit:
            return None
        frames.append(options)
        while frames and not frames[-1]:
            frames.pop()
            depth -= 1
        if not frames:
            return None
        bindings = frames[-1].pop()
        depth = len(frames)
