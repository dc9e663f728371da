"""Renaming a clause apart from another, and splitting the unifier back.

The kernel gives each premise its own substitution and never renames
anything, but a unifier for two premises that share variable names must be
computed on renamed-apart copies.  :func:`split_unifier` turns such a
unifier back into one substitution per premise, in the premises' own
variable names, with the fresh names of the copy renamed back wherever
that is unambiguous (so a report shows ``Y``, not ``Y_1``).
"""

from __future__ import annotations

from collections.abc import Iterable

from checker.kernel.clauses import Clause
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, variable, variables_of


def rename_apart(clause: Clause, avoid: Iterable[Term]) -> tuple[Clause, dict[Term, Term]]:
    """A variant of ``clause`` sharing no variable with ``avoid``, and the
    renaming used (original variable -> fresh variable)."""
    taken = {var.symbol for var in avoid} | {var.symbol for var in clause.variables()}
    renaming: dict[Term, Term] = {}
    for var in sorted(clause.variables(), key=lambda v: v.symbol):
        number = 1
        while f"{var.symbol}_{number}" in taken:
            number += 1
        fresh = f"{var.symbol}_{number}"
        taken.add(fresh)
        renaming[var] = variable(fresh)
    return clause.instance(Substitution(renaming)), renaming


def split_unifier(
    unifier: Substitution,
    left_variables: Iterable[Term],
    right_variables: Iterable[Term],
    renaming: dict[Term, Term],
) -> tuple[Substitution, Substitution]:
    """Per-premise substitutions from a unifier of a left premise and a
    renamed-apart copy of a right premise (``renaming`` maps the right
    premise's variables to the copy's)."""
    left = {var: unifier(var) for var in left_variables}
    right = {var: unifier(renaming.get(var, var)) for var in right_variables}
    images: set[Term] = set()
    for value in (*left.values(), *right.values()):
        images |= variables_of(value)
    original = {fresh: var for var, fresh in renaming.items()}
    back: dict[Term, Term] = {}
    for var in images:
        name = original.get(var)
        if name is not None and name not in images and name not in back.values():
            back[var] = name
    tidy = Substitution(back)
    return (
        Substitution({var: tidy(value) for var, value in left.items()}),
        Substitution({var: tidy(value) for var, value in right.items()}),
    )
