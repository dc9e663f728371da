"""Finding a refutation that shows a formula-level entailment.

The kernel decides premises ⊨ conclusion by replaying a refutation of the
clause list it builds itself (checker.kernel.entailment); this search runs
the bounded saturation over exactly that list, so the chain's premise
indices line up with what the kernel rebuilds.  A step that only reshapes
its premises is shown more cheaply by a cover (checker.search.covering),
tried first by :func:`find_consequence`.
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.kernel.entailment import Cover, entailment_clausification
from checker.kernel.formulas import Formula
from checker.kernel.rules import Chain
from checker.search.findings import REFUTATION, checked_refutation, hook
from checker.search.covering import find_cover
from checker.search.reconstruct import SearchLimits
from checker.search.saturation import refute


@hook(
    REFUTATION,
    question=lambda premises, conclusion, limits: (list(premises), conclusion),
    keep=lambda chain: chain,
    give=lambda args, kwargs, chain: checked_refutation(args[0], args[1], chain),
    nothing=lambda: None,
)
def find_entailment(premises: Sequence[Formula], conclusion: Formula, limits: SearchLimits) -> Chain | None:
    """A refutation of clausify(premises ∧ ¬conclusion), or None within the bounds."""
    clausification = entailment_clausification(list(premises), conclusion)
    clauses = clausification.clauses
    claim = [index for index, source in enumerate(clausification.sources) if source == len(premises)]
    bounds = (limits.saturation_clauses, limits.saturation_given, limits.subsumption_nodes)
    if 0 < len(claim) < len(clauses):
        found = refute(clauses, *bounds, support=claim)
        if found is not None:
            return found
    return refute(clauses, *bounds)


def find_consequence(premises: Sequence[Formula], conclusion: Formula, limits: SearchLimits) -> Chain | Cover | None:
    """Evidence for premises ⊨ conclusion that checker.kernel.entailment
    checks: a cover of the conclusion's clauses when there is one, else a
    refutation, or None within the bounds."""
    return find_cover(premises, conclusion) or find_entailment(premises, conclusion, limits)
