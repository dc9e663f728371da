"""Finding a propositional refutation with a SAT solver (python-sat).

The solver works on the very clause list the kernel rebuilds
(``entailment_clauses``), atoms read as propositional variables, and logs
its learnt clauses; that log, ending in the empty clause, is a RUP
refutation the kernel re-checks by unit propagation.  The solver is trusted
for nothing: a wrong log is simply not accepted.
"""

from __future__ import annotations

from collections.abc import Sequence

from pysat.solvers import Glucose3

from checker.kernel.clauses import Clause, Literal
from checker.kernel.entailment import entailment_clauses
from checker.kernel.formulas import Formula
from checker.search.findings import LEMMAS, checked_lemmas, hook


def find_unit_refutation(clauses: Sequence[Clause], conflicts: int) -> list[Clause] | None:
    """RUP lemmas ending in the empty clause, or None when the clauses are
    satisfiable or the solver ran out of ``conflicts``."""
    if any(clause.is_empty for clause in clauses):
        return [Clause()]
    numbers: dict[Literal, int] = {}
    atoms: list[Literal] = []

    def number(literal: Literal) -> int:
        positive = Literal(True, literal.atom)
        if positive not in numbers:
            numbers[positive] = len(atoms) + 1
            atoms.append(positive)
        return numbers[positive] if literal.positive else -numbers[positive]

    encoded = [[number(literal) for literal in clause.literal_set] for clause in clauses]
    with Glucose3(bootstrap_with=encoded, with_proof=True) as solver:
        solver.conf_budget(conflicts)
        if solver.solve_limited() is not False:
            return None
        log = solver.get_proof()
    lemmas = []
    for line in log:
        if line.startswith("d"):
            continue  # deletions only shrink the clause set; keeping everything is still sound
        values = [int(value) for value in line.split()[:-1]]
        lemmas.append(Clause(atoms[abs(v) - 1] if v > 0 else atoms[abs(v) - 1].negated() for v in values))
    if not lemmas or not lemmas[-1].is_empty:
        lemmas.append(Clause())
    return lemmas


@hook(
    LEMMAS,
    question=lambda premises, conclusion, conflicts: (list(premises), conclusion),
    keep=lambda lemmas: tuple(lemmas) if lemmas is not None else None,
    give=lambda args, kwargs, lemmas: checked_lemmas(args[0], args[1], lemmas),
    nothing=lambda: None,
)
def find_unit_entailment(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula, conflicts: int
) -> list[Clause] | None:
    """A RUP refutation of the kernel's clauses of premises and negated conclusion."""
    return find_unit_refutation(entailment_clauses(premises, conclusion), conflicts)
