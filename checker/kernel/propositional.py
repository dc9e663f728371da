"""Propositional refutations, checked by reverse unit propagation (RUP).

A list of lemmas refutes a clause set when it ends in the empty clause and
each lemma is implied by unit propagation from the clauses and the lemmas
before it: assuming every literal of the lemma false and propagating unit
clauses reaches a clause with all literals false.  The lemmas come from a
SAT solver outside the kernel; here they are only re-checked.

Atoms are read as propositional variables, whatever their arguments.  That
is sound for first-order clauses too: in any model, the assignment giving
each written atom the truth value of its instance with every variable set to
one element satisfies every clause, so a propositionally unsatisfiable set
has no model.
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.kernel.clauses import Clause, Literal
from checker.kernel.entailment import entailment_clauses
from checker.kernel.failure import Failure, quote
from checker.kernel.formulas import Formula


def _propagates_to_conflict(clauses: Sequence[Clause], false_literals: Sequence[Literal]) -> bool:
    """Whether unit propagation from the literals set false reaches a clause
    whose literals are all false."""
    true = {literal.negated() for literal in false_literals}
    changed = True
    while changed:
        changed = False
        for clause in clauses:
            unassigned = [literal for literal in clause.literal_set if literal.negated() not in true]
            if not unassigned:
                return True
            if len(unassigned) == 1 and unassigned[0] not in true:
                true.add(unassigned[0])
                changed = True
    return False


def check_unit_refutation(clauses: Sequence[Clause], lemmas: Sequence[Clause]) -> Failure | None:
    """None when ``lemmas`` is a RUP refutation of ``clauses``."""
    known = list(clauses)
    for number, lemma in enumerate(lemmas):
        if not _propagates_to_conflict(known, lemma.literals):
            return Failure(
                "not_unit_implied",
                f"lemma {number} {quote(lemma)} does not follow by unit propagation from the clauses before it",
            )
        known.append(lemma)
    if not lemmas or not lemmas[-1].is_empty:
        return Failure("refutation_incomplete", "the lemmas do not end in the empty clause")
    return None


def check_unit_entailment(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula, lemmas: Sequence[Clause]
) -> Failure | None:
    """premises ⊨ conclusion, by a RUP refutation of the kernel's clauses of
    the premises and the negated conclusion (``entailment_clauses``)."""
    return check_unit_refutation(entailment_clauses(premises, conclusion), lemmas)
