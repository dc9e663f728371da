"""When a step of a typed derivation may be checked with its sorts erased.

The typed reader (formats/tptp_types.py) checks that every term is
well-sorted and then erases the sorts, so the kernel sees untyped
first-order logic.  Erasure is exact when there is only one sort of
individuals.  With several, an untyped refutation may rest on the sorts
having the same size: "every two valves are equal" and "these two sensors
differ" are satisfiable together with sorts, but not once erased.  By the
monotonicity result of Claessen, Lillieström & Smallbone ("Sort it out with
monotonicity", CADE 2011), erasure preserves satisfiability when every
sort is monotone, and a sort is monotone in a formula set where no
universally read variable of it is a side of a positively occurring
equality (a "naked" variable).  A step is therefore checked erased only
when its assumptions (premises, the negation of a conjecture it negates,
and the negation of its conclusion) have no naked variable at all, which
makes every sort monotone whatever the declarations say, and when no leaf
it uses may stand for a problem statement that has one.

Untyped counter-models stay counter-models with sorts (give every sort the
one domain), so a ``refuted`` step is refuted with sorts too; arithmetic is
the exception, and a step over arithmetic sorts that the untyped check
cannot show is unproven, never refuted.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.formulas import (
    ATOM,
    FORALL,
    QUANTIFIERS,
    Formula,
    argument_polarities,
    formula_of_clause,
    negation,
    universal_closure,
)
from checker.kernel.terms import Term
from formats.derivation import Inference, Origin, Parent, Statement
from formats.tptp_types import INDIVIDUALS, NUMERIC

_LINKED_ORIGINS = frozenset(("file", "unknown"))


def _closed(content: Clause | Formula) -> Formula:
    return formula_of_clause(content) if isinstance(content, Clause) else universal_closure(content)


def naked_equality(formula: Formula) -> tuple[Term, Term] | None:
    """A variable read universally (free, or bound by a quantifier that
    clausification keeps universal) that is a side of an equality occurring
    positively, with that equality; None when there is none.  ``X = X`` is
    true at every size and does not count."""
    stack: list[tuple[Formula, int, frozenset[Term]]] = [(formula, 1, frozenset())]
    while stack:
        current, polarity, existential = stack.pop()
        if current.connective == ATOM:
            atom = current.atom
            if polarity >= 0 and is_equality(atom) and atom.arguments[0] is not atom.arguments[1]:
                for side in atom.arguments:
                    if side.is_variable and side not in existential:
                        return side, atom
            continue
        if current.connective in QUANTIFIERS:
            universal = polarity == 0 or (current.connective == FORALL) == (polarity > 0)
            bound = frozenset(current.variables)
            existential = existential - bound if universal else existential | bound
        for argument, factor in zip(current.arguments, argument_polarities(current.connective)):
            stack.append((argument, polarity * factor, existential))
    return None


def sorts_of(statements: Iterable[Statement]) -> frozenset[str]:
    """The sorts of individuals the statements use; an untyped statement's
    terms are all of ``$i``."""
    found: set[str] = set()
    for statement in statements:
        found |= statement.sorts if statement.sorts is not None else {INDIVIDUALS}
    return frozenset(found)


def non_monotone_statements(statements: Iterable[Statement]) -> dict[str, str]:
    """Problem statements (a conjecture as its negation) with a naked
    variable, each with that equality as text."""
    found: dict[str, str] = {}
    for statement in statements:
        closed = _closed(statement.content)
        naked = naked_equality(negation(closed) if statement.role == "conjecture" else closed)
        if naked is not None:
            found.setdefault(statement.name, f"{naked[1].arguments[0]} = {naked[1].arguments[1]}")
    return found


def _named_parents(inference: Inference) -> set[str]:
    """The names an inference record cites, through its nested records."""
    names: set[str] = set()
    stack = [inference]
    while stack:
        for parent in stack.pop().parents:
            if isinstance(parent, Parent):
                names.add(parent.name)
            else:
                stack.append(parent)
    return names


def erasure_hazard(
    claimed: Statement,
    inference: Inference,
    parents: Sequence[Statement],
    sorts: frozenset[str],
    non_monotone: dict[str, str],
) -> str | None:
    """Why checking this step with sorts erased might accept what fails
    with sorts (a message starting ``unsupported:``), or None when it is safe."""
    if len(sorts) <= 1:
        return None
    several = f"the problem and derivation have several sorts ({', '.join(sorted(sorts))})"
    prefix = "unsupported: equality over a sort that may not be monotone: "
    cited = _named_parents(inference)
    for parent in parents:
        if parent.name not in cited:
            return (
                f"{prefix}a premise is the unstated conclusion of a nested inference record, whose own "
                f"premises cannot be examined for equalities that fix a sort's size, and {several}"
            )
        closed = _closed(parent.content)
        naked = naked_equality(negation(closed) if parent.role == "conjecture" else closed)
        if naked is not None:
            where = "the negation of conjecture" if parent.role == "conjecture" else "premise"
            return (
                f"{prefix}variable `{naked[0]}` is a side of `{naked[1].arguments[0]} = {naked[1].arguments[1]}`, "
                f"positive in {where} `{parent.name}`, and {several}; with sorts erased this equality "
                "could also constrain individuals of other sorts"
            )
        origin = parent.source
        if non_monotone and (origin is None or (isinstance(origin, Origin) and origin.kind in _LINKED_ORIGINS)):
            name, equality = next(iter(non_monotone.items()))
            return (
                f"{prefix}the problem's `{name}` has a variable as a side of the positive equality `{equality}`, "
                f"leaf `{parent.name}` is linked to the problem with sorts erased, and {several}"
            )
    naked = naked_equality(negation(_closed(claimed.content)))
    if naked is not None:
        return (
            f"{prefix}variable `{naked[0]}` is a side of `{naked[1].arguments[0]} = {naked[1].arguments[1]}`, "
            f"negative in the conclusion, and {several}; with sorts erased its negation could also "
            "constrain individuals of other sorts"
        )
    return None


def arithmetic_sorts(statements: Iterable[Statement]) -> frozenset[str]:
    """The arithmetic sorts ($int, $rat, $real) the statements use."""
    found: set[str] = set()
    for statement in statements:
        if statement.sorts is not None:
            found |= statement.sorts & NUMERIC
    return frozenset(found)
