"""Notes on a derivation that are not failures, and the symbols it introduces.

A derivation may carry steps the refutation never uses, leaves no step
cites, or clauses that are tautologies: none of these makes it unsound,
but a reader of the report (or a prover developer) wants to know.  The
symbols a derivation introduces (Skolem functions, defined predicates,
split symbols) belong in the trust summary, with the step that introduces
each, because the soundness of those steps rests on their freshness.
"""

from __future__ import annotations

from checker.freshness import SymbolTable, content_symbols, describe_symbol
from checker.kernel.clauses import Clause, Literal, is_equality
from checker.kernel.formulas import FALSE, FALSUM, TRUE
from checker.outcomes import NOT_NEEDED, TAUTOLOGY, UNUSED_LEAF, Introduction, Note
from checker.plan import Plan, Step


def _is_refutation(statement) -> bool:
    content = statement.content
    return statement.role != "conjecture" and (
        (isinstance(content, Clause) and content.is_empty) or content is FALSUM
    )


def _needed(plan: Plan, by_name: dict[str, Step]) -> set[str] | None:
    """The steps some refutation (a stated `$false`) rests on; None when
    the derivation reaches none (a failure of its own, not a note)."""
    stack = [s.name for s in plan.steps if s.statement is not None and _is_refutation(s.statement)]
    if not stack:
        return None
    needed = set(stack)
    while stack:
        step = by_name.get(stack.pop())
        for parent in step.parents if step else ():
            if parent not in needed:
                needed.add(parent)
                stack.append(parent)
    return needed


def tautology_witness(clause: Clause) -> str | None:
    """Why a clause is true in every interpretation, or None: a literal
    with its complement, a reflexive equation, `$true` or `~$false`."""
    for literal in clause.literals:
        atom = literal.atom
        if literal.positive and is_equality(atom) and atom.arguments[0] is atom.arguments[1]:
            return f"`{literal}` holds by reflexivity"
        if atom.arity == 0 and atom.symbol == (TRUE if literal.positive else FALSE):
            return f"`{literal}` is true"
        if not literal.positive and Literal(True, atom) in clause.literal_set:
            return f"it has both `{literal.negated()}` and `{literal}`"
    return None


def notes_on(plan: Plan, symbols: SymbolTable) -> tuple[Note, ...]:
    """Unused leaves, steps the refutation does not need and tautological
    clauses, in checking order.  The plan's symbol table already has every
    step by name and every cited name (as a parent with children)."""
    used = symbols.children
    needed = _needed(plan, symbols.planned)
    notes = []
    for step in plan.steps:
        statement = step.statement
        if statement is None:
            continue
        if step.is_leaf and step.name not in used:
            notes.append(Note(UNUSED_LEAF, step.name, f"leaf `{step.name}` is used by no step", step.location))
        elif needed is not None and step.name not in needed:
            notes.append(Note(NOT_NEEDED, step.name, f"step `{step.name}` is not needed for the refutation",
                              step.location))
        if isinstance(statement.content, Clause):
            witness = tautology_witness(statement.content)
            if witness is not None:
                notes.append(Note(TAUTOLOGY, step.name, f"the clause of `{step.name}` is a tautology: {witness}",
                                  step.location))
    return tuple(notes)


def _is_introduced(step) -> bool:
    source = step.statement.source if step.statement is not None else None
    return step.is_leaf and getattr(source, "kind", None) == "introduced"


def introduced_symbols(symbols: SymbolTable) -> tuple[Introduction, ...]:
    """Each symbol the derivation introduces, with the first step that
    introduces it, in checking order (ties by symbol).  An axiom of choice
    or a definition also mentions symbols it does not introduce (the
    predicates of its formula): a symbol the problem or a leaf taken from
    it has is left out when only such introduced leaves list it."""
    given = set(symbols.problem)
    for name, step in symbols.planned.items():
        if step.is_leaf and not _is_introduced(step) and name in symbols.contents:
            given |= content_symbols(symbols.contents[name])
    found = []
    for symbol, steps in symbols.introducers.items():
        if symbol in given and all(_is_introduced(symbols.planned[name]) for name in steps if name in symbols.planned):
            continue
        first = min(steps, key=lambda name: symbols.order.get(name, len(symbols.order)))
        found.append((symbols.order.get(first, len(symbols.order)), describe_symbol(symbol), first))
    return tuple(
        Introduction(symbol, step, symbols.locations.get(step)) for _, symbol, step in sorted(found)
    )
