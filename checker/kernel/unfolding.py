"""Premise and conclusion equal once the definitions among the premises are unfolded.

A prover that names subformulas writes a step that replaces a subformula
by the atom defined to be equivalent to it (`apply_def`).  Among the
premises, an *equivalence definition* is a closed formula
``! [X..] : (p(Y1,..,Yn) <=> F)`` (either side) whose atom has distinct
variables as arguments, every free variable of ``F`` among them, ``p`` not
equality.  Every model of it makes ``p(t1,..,tn)`` and ``F[Y:=t]`` agree,
so replacing the one by the other anywhere in a formula (capture-avoiding)
gives an equivalent formula there.  The kernel unfolds every atom of the
defined predicates, pass after pass, in the chosen premise and in the
conclusion alike, and requires the two results to be alpha-equivalent:
then the premises entail the conclusion.  Nothing needs to be fresh for
this; a definition is just a premise.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause
from checker.kernel.failure import Failure
from checker.kernel.formulas import (
    ATOM,
    FORALL,
    IFF,
    QUANTIFIERS,
    Formula,
    alpha_equivalent,
    formula_of_clause,
    free_variables,
    make,
    substitute_free,
    universal_closure,
)
from checker.kernel.substitution import Substitution

Definitions = dict[tuple[str, int], tuple[tuple, Formula]]


@dataclass(frozen=True, slots=True)
class Unfolding:
    """Evidence: premise ``premise`` and the conclusion unfold, by the
    equivalence definitions ``definitions`` (premise indices), in at most
    ``passes`` passes, to alpha-equivalent formulas."""

    premise: int
    definitions: tuple[int, ...]
    passes: int


def _closed(statement: Clause | Formula) -> Formula:
    return formula_of_clause(statement) if isinstance(statement, Clause) else universal_closure(statement)


def equivalence_definition(formula: Formula) -> tuple[Formula, Formula] | None:
    """The defined atom and its meaning when ``formula`` is an equivalence
    definition (module docstring), the left side tried first; else None."""
    body = formula
    while body.connective == FORALL:
        body = body.arguments[0]
    if body.connective != IFF or free_variables(formula):
        return None
    for defined, meaning in (body.arguments, body.arguments[::-1]):
        if defined.connective != ATOM or defined.atom.symbol == "=":
            continue
        arguments = defined.atom.arguments
        if all(a.is_variable for a in arguments) and len(set(arguments)) == len(arguments):
            if free_variables(meaning) <= set(arguments):
                return defined, meaning
    return None


def unfolded(formula: Formula, definitions: Definitions) -> Formula:
    """``formula`` with every atom of a defined predicate replaced by its
    meaning at the atom's arguments (one pass; meanings are not unfolded
    again here)."""
    results: list[Formula] = []
    tasks: list[tuple] = [(formula,)]
    while tasks:
        task = tasks.pop()
        if len(task) == 3:
            connective, count, bound = task
            arguments = tuple(results[len(results) - count :])
            del results[len(results) - count :]
            results.append(make(connective, arguments, bound))
            continue
        current = task[0]
        if current.connective == ATOM:
            key = (current.atom.symbol, current.atom.arity)
            if key in definitions:
                parameters, meaning = definitions[key]
                results.append(substitute_free(meaning, Substitution(dict(zip(parameters, current.atom.arguments)))))
            else:
                results.append(current)
        elif not current.arguments:
            results.append(current)
        else:
            bound = current.variables if current.connective in QUANTIFIERS else ()
            tasks.append((current.connective, len(current.arguments), bound))
            tasks.extend((argument,) for argument in reversed(current.arguments))
    return results[0]


def check_unfolding(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula, unfolding: Unfolding
) -> Failure | None:
    """None when the chosen premise and the conclusion unfold to
    alpha-equivalent formulas by the given equivalence definitions."""
    indices = (unfolding.premise, *unfolding.definitions)
    if not all(0 <= index < len(premises) for index in indices):
        return Failure("no_such_premise", f"the step has {len(premises)} premises, not one numbered {max(indices)}")
    if not 1 <= unfolding.passes <= len(unfolding.definitions):
        return Failure("unfolding_passes", f"{unfolding.passes} passes for {len(unfolding.definitions)} definitions")
    definitions: Definitions = {}
    for index in unfolding.definitions:
        formula = _closed(premises[index])
        parts = equivalence_definition(formula)
        if parts is None:
            return Failure("not_a_definition", f"premise {index} `{formula}` is not an equivalence definition")
        defined, meaning = parts
        key = (defined.atom.symbol, defined.atom.arity)
        if key in definitions:
            return Failure("defined_twice", f"`{key[0]}/{key[1]}` is defined by two of the premises")
        definitions[key] = (defined.atom.arguments, meaning)
    premise, claimed = _closed(premises[unfolding.premise]), _closed(conclusion)
    for _ in range(unfolding.passes):
        premise, claimed = unfolded(premise, definitions), unfolded(claimed, definitions)
    if not alpha_equivalent(premise, claimed):
        return Failure("unfolded_differ", f"unfolded, the premise is `{premise}` and the conclusion `{claimed}`")
    return None
