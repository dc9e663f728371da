"""Formula-level consequence, checked as a refutation of the negated conclusion.

``premises ⊨ conclusion`` holds when the premises together with the
negation of the conclusion have no model.  The kernel builds the clauses of
that set with its own clausifier (each premise closed universally, the
conclusion closed universally and then negated) and replays the given chain
of primitive inferences over them; the chain must end in the empty clause.
Premises and conclusion may be formulas or clauses (a clause is read as the
universal closure of its disjunction).
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.kernel.clauses import Clause
from checker.kernel.clausify import Clausification, clausify
from checker.kernel.failure import Failure, quote
from checker.kernel.formulas import Formula, formula_of_clause, negation, universal_closure
from checker.kernel.rules import Chain, replay


def _closed(statement: Clause | Formula) -> Formula:
    return formula_of_clause(statement) if isinstance(statement, Clause) else universal_closure(statement)


def entailment_clausification(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula
) -> Clausification:
    """The clausified premises and negated conclusion; the conclusion's
    clauses have source ``len(premises)``."""
    return clausify([*map(_closed, premises), negation(_closed(conclusion))])


def entailment_clauses(premises: Sequence[Clause | Formula], conclusion: Clause | Formula) -> tuple[Clause, ...]:
    """The clause list a refutation chain's premise indices refer to."""
    return entailment_clausification(premises, conclusion).clauses


def check_entailment(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula, refutation: Chain
) -> Failure | None:
    """None when ``refutation`` derives the empty clause from
    :func:`entailment_clauses` of the premises and conclusion."""
    computed = replay(entailment_clauses(premises, conclusion), refutation)
    if isinstance(computed, Failure):
        return computed
    if not computed.is_empty:
        return Failure("refutation_incomplete", f"the refutation ends in {quote(computed)}, not the empty clause")
    return None
