"""Propositional refutations: SAT search with proof log, then the kernel's
RUP re-check, on random 3-CNF near the satisfiability threshold and on
pigeonhole formulas.  Prints figures; asserts nothing."""

from __future__ import annotations

import random
import time

from checker.kernel.clauses import Clause, Literal
from checker.kernel.propositional import check_unit_refutation
from checker.kernel.terms import application
from checker.search.propositional import find_unit_refutation


def literal(number: int) -> Literal:
    return Literal(number > 0, application(f"x{abs(number)}"))


def random_3cnf(variables: int, ratio: float, seed: int) -> list[Clause]:
    rng = random.Random(seed)
    return [
        Clause(literal(v * rng.choice((1, -1))) for v in rng.sample(range(1, variables + 1), 3))
        for _ in range(int(variables * ratio))
    ]


def pigeonhole(holes: int) -> list[Clause]:
    """holes + 1 pigeons, each in some hole, no two in one hole (unsatisfiable)."""
    def var(pigeon: int, hole: int) -> int:
        return pigeon * holes + hole + 1
    clauses = [Clause(literal(var(p, h)) for h in range(holes)) for p in range(holes + 1)]
    for h in range(holes):
        for p in range(holes + 1):
            for q in range(p + 1, holes + 1):
                clauses.append(Clause((literal(-var(p, h)), literal(-var(q, h)))))
    return clauses


def measure(name: str, clauses: list[Clause]) -> None:
    start = time.perf_counter()
    lemmas = find_unit_refutation(clauses, 10**6)
    found = time.perf_counter() - start
    if lemmas is None:
        print(f"{name}: {len(clauses)} clauses, satisfiable, search {found:.3f}s")
        return
    start = time.perf_counter()
    failure = check_unit_refutation(clauses, lemmas)
    checked = time.perf_counter() - start
    print(f"{name}: {len(clauses)} clauses, {len(lemmas)} lemmas, search {found:.3f}s, "
          f"kernel RUP check {checked:.3f}s, {'accepted' if failure is None else failure.reason}")


if __name__ == "__main__":
    for variables in (20, 40, 60):
        for seed in range(2):
            measure(f"random 3-CNF, {variables} variables, seed {seed}", random_3cnf(variables, 5.0, seed))
    for holes in (4, 5, 6):
        measure(f"pigeonhole {holes + 1} into {holes}", pigeonhole(holes))
