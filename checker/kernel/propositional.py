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


class _Propagator:
    """The clauses so far, literals numbered (an atom +n, its negation -n),
    with the clauses each literal occurs in, for unit propagation."""

    def __init__(self) -> None:
        self.numbers: dict[Literal, int] = {}
        self.clauses: list[tuple[int, ...]] = []
        self.occurrences: dict[int, list[int]] = {}
        self.units: list[int] = []
        self.has_empty = False

    def number(self, literal: Literal) -> int:
        positive = literal if literal.positive else literal.negated()
        code = self.numbers.setdefault(positive, len(self.numbers) + 1)
        return code if literal.positive else -code

    def add(self, clause: Clause) -> None:
        codes = tuple({self.number(literal) for literal in clause.literal_set})
        for code in codes:
            self.occurrences.setdefault(code, []).append(len(self.clauses))
        self.clauses.append(codes)
        self.has_empty |= not codes
        if len(codes) == 1:
            self.units.append(codes[0])

    def conflict(self, false_literals: Sequence[Literal]) -> bool:
        """Whether unit propagation from the literals set false reaches a
        clause whose literals are all false."""
        true: set[int] = set()
        if self.has_empty:
            return True
        pending = [-self.number(literal) for literal in false_literals] + self.units
        while pending:
            code = pending.pop()
            if -code in true:
                return True
            if code in true:
                continue
            true.add(code)
            for index in self.occurrences.get(-code, ()):
                codes = self.clauses[index]
                if any(other in true for other in codes):
                    continue
                unassigned = [other for other in codes if -other not in true]
                if not unassigned:
                    return True
                if len(unassigned) == 1:
                    pending.append(unassigned[0])
        return False


def check_unit_refutation(clauses: Sequence[Clause], lemmas: Sequence[Clause]) -> Failure | None:
    """None when ``lemmas`` is a RUP refutation of ``clauses``."""
    known = _Propagator()
    for clause in clauses:
        known.add(clause)
    for number, lemma in enumerate(lemmas):
        if not known.conflict(lemma.literals):
            return Failure(
                "not_unit_implied",
                f"lemma {number} {quote(lemma)} does not follow by unit propagation from the clauses before it",
            )
        known.add(lemma)
    if not lemmas or not lemmas[-1].is_empty:
        return Failure("refutation_incomplete", "the lemmas do not end in the empty clause")
    return None


def check_unit_entailment(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula, lemmas: Sequence[Clause]
) -> Failure | None:
    """premises ⊨ conclusion, by a RUP refutation of the kernel's clauses of
    the premises and the negated conclusion (``entailment_clauses``)."""
    return check_unit_refutation(entailment_clauses(premises, conclusion), lemmas)
