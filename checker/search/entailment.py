"""Finding a refutation that shows a formula-level entailment.

The kernel decides premises ⊨ conclusion by replaying a refutation of the
clause list it builds itself (checker.kernel.entailment); this search runs
the bounded saturation over exactly that list, so the chain's premise
indices line up with what the kernel rebuilds.
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.kernel.entailment import entailment_clauses
from checker.kernel.formulas import Formula
from checker.kernel.rules import Chain
from checker.search.findings import REFUTATION, checked_refutation, hook
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
    clauses = entailment_clauses(list(premises), conclusion)
    return refute(clauses, limits.saturation_clauses, limits.saturation_given, limits.subsumption_nodes)
