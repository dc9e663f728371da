"""Steps that use a predicate no premise defines: namings and defined symbols.

A prover may name a subformula by a fresh predicate in a clause-form step
and never print the definition (``sP5(X0,X1)``), or print a definition
once (an equality proxy ``sQ1_eqProxy(X0,X1) <=> X0 = X1``) and then use
the symbol in steps and axioms that do not cite it.  Such a step is sound
when it follows from its premises plus the symbol's definition and the
symbol is fresh: any model of the problem then extends to the symbol so
that the definition holds.  The definition is the stated one, found by
symbol, or else one the search proposes (checker.search.namings); the
kernel checks its shape, the symbol table its freshness, and a
kernel-replayed refutation the step.  Every step that introduces one name
is judged against the same definition.
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.formula_steps import as_formula, check_consequence, check_introduction, step_result
from checker.freshness import Symbol, SymbolTable, describe_symbol, new_symbols
from checker.kernel.clauses import Clause
from checker.kernel.formulas import FORALL, IFF, Formula, subformulas_with_polarity, symbols_of_formula
from checker.kernel.introductions import check_definition
from checker.outcomes import FAILED, REFUTED, UNPROVEN, StepResult
from checker.plan import Step
from checker.search.namings import choose_definition, introduction
from checker.search.reconstruct import SearchLimits
from formats.derivation import Origin, Statement


def predicate_symbols(content: Clause | Formula) -> set[Symbol]:
    """The predicates of a statement, equality and TPTP's ``$`` atoms aside
    (atoms' head symbols only: their terms may be very deep)."""
    if isinstance(content, Clause):
        atoms = [literal.atom for literal in content.literals]
    else:
        atoms = [f.atom for f, _ in subformulas_with_polarity(content) if f.atom is not None]
    return {(a.symbol, a.arity) for a in atoms if a.symbol != "=" and not a.symbol.startswith("$")}


def new_predicates(claimed: Clause | Formula, premises: Sequence[Clause | Formula]) -> set[Symbol]:
    """Predicates of the conclusion that no premise has."""
    return predicate_symbols(claimed).difference(*(predicate_symbols(p) for p in premises))


def is_definition_leaf(step: Step) -> bool:
    """A leaf the prover introduced as a definition (of any kind: a naming,
    an equality proxy ...)."""
    source = step.statement.source if step.statement is not None else None
    return step.is_leaf and isinstance(source, Origin) and source.kind == "introduced" and any(
        "definition" in word for word in source.detail[:1]
    )


def stated_definition(table: SymbolTable, symbol: Symbol) -> tuple[str, Formula] | None:
    """The first definition leaf that introduces ``symbol`` and has a
    definition's shape (kernel-checked), by name and closed formula.  Its
    own check holds it to freshness."""
    for name in table.introducers.get(symbol, ()):
        step = table.planned.get(name)
        if step is not None and is_definition_leaf(step):
            formula = as_formula(step.statement.content)
            if check_definition(formula, symbol) is None:
                return name, formula
    return None


def naming_freshness_failure(table: SymbolTable, symbol: Symbol) -> str | None:
    """Why a name introduced without a stated definition is not fresh, or
    None: it must occur in no problem formula and only in steps that
    introduce it or descend from one that does."""
    if symbol in table.problem:
        name, location = table.problem[symbol]
        return f"new predicate `{describe_symbol(symbol)}` is not fresh: it occurs in the problem's `{name}` at {location}"
    introducers = table.introducers.get(symbol, [])
    allowed = set(introducers).union(*(table.descendants(name) for name in introducers))
    for name in table.occurrences.get(symbol, ()):
        if name not in allowed:
            return (
                f"new predicate `{describe_symbol(symbol)}` is not fresh: it occurs in step `{name}` at "
                f"{table.locations[name]}, which neither introduces it nor descends from a step that does"
            )
    return None


def _introductions(table: SymbolTable, symbol: Symbol) -> tuple:
    """The inference steps that introduce ``symbol`` and nothing else, with
    their stated premises: what the one definition must serve."""
    found = []
    for name in table.introducers.get(symbol, ()):
        step = table.planned.get(name)
        if step is None or step.is_leaf:
            continue
        parents = [table.planned.get(parent) for parent in step.parents]
        if any(parent is None or parent.statement is None for parent in parents):
            continue
        premises = [parent.statement.content for parent in parents]
        if new_symbols(step.statement.content, premises) == {symbol}:
            found.append(introduction(premises, step.statement.content))
    return tuple(found)


def _given(table: SymbolTable, symbol: Symbol) -> bool:
    """Whether ``symbol`` belongs to what the derivation starts from: the
    problem, or a leaf it did not introduce (with no problem, the leaves
    are the problem).  Such a predicate is no name: a step adding it is a
    weakening (or wrong), judged as a consequence."""
    if symbol in table.problem:
        return True
    occurring = (table.planned[name] for name in table.occurrences.get(symbol, ()) if name in table.planned)
    return any(
        step.is_leaf and not is_definition_leaf(step) and _origin_kind(step) != "introduced" for step in occurring
    )


def _origin_kind(step: Step) -> str | None:
    source = step.statement.source if step.statement is not None else None
    return source.kind if isinstance(source, Origin) else None


def _later_symbols(table: SymbolTable, symbol: Symbol, definition: Formula) -> set[Symbol]:
    """Symbols of the definition that exist only after the name's first
    introduction: a name must be interpretable when it first appears, so
    its definition may use only what the problem or earlier steps have."""
    first = min(table.order[name] for name in table.introducers[symbol])
    return {
        other for other in symbols_of_formula(definition) - {symbol}
        if other in table.introducers and all(table.order[name] > first for name in table.introducers[other])
    }


def _only_iff(definitions: Sequence[Formula]) -> bool:
    """Whether each definition fixes its symbol (an equivalence), so that a
    counter-model refutes the step under every admissible meaning."""
    bodies = []
    for definition in definitions:
        while definition.connective == FORALL:
            definition = definition.arguments[0]
        bodies.append(definition)
    return all(body.connective == IFF for body in bodies)


def _without_refutation(result: StepResult, reason: str) -> StepResult:
    """A counter-model for one proposed definition does not refute the step,
    which may have meant another: the outcome is unproven."""
    if result.outcome != REFUTED:
        return result
    details = tuple(d for d in result.details if not d.startswith("reason: "))
    return StepResult(
        result.name, UNPROVEN, result.rule,
        "does not follow with the definition assumed for its new symbol; no other definition was found",
        result.location, (f"reason: {reason}", result.message, *details),
    )


def check_naming_step(
    step: Step, parents: Sequence[Statement], table: SymbolTable, limits: SearchLimits
) -> StepResult | None:
    """The outcome of an inference step whose conclusion has predicates that
    neither a premise nor the problem has, or None when it has none (or uses
    the conjecture, or carries evidence: those are checked as such)."""
    if step.inference.evidence is not None or any(parent.role == "conjecture" for parent in parents):
        return None
    claimed = step.statement.content
    premises = [parent.content for parent in parents]
    named = {symbol for symbol in new_predicates(claimed, premises) if not _given(table, symbol)}
    if not named:
        return None
    definitions: list[Formula] = []
    accounts: list[str] = []
    proposed = False
    for symbol in sorted(named):
        stated = stated_definition(table, symbol)
        if stated is not None:
            definitions.append(stated[1])
            accounts.append(f"`{describe_symbol(symbol)}` as defined by `{stated[0]}`")
            continue
        not_fresh = naming_freshness_failure(table, symbol)
        if not_fresh:
            return step_result(step, FAILED, not_fresh, ("reason: not_fresh",))
        chosen = choose_definition(symbol, _introductions(table, symbol), limits)
        if chosen is None or check_definition(chosen, symbol) is not None or _later_symbols(table, symbol, chosen):
            return step_result(
                step, UNPROVEN,
                f"uses a new predicate `{describe_symbol(symbol)}` that nothing defines, and no subformula of the "
                "premises over exactly its arguments defines it so that every step introducing it follows",
                ("reason: no_naming_definition",),
            )
        proposed = True
        definitions.append(chosen)
        accounts.append(f"fresh `{describe_symbol(symbol)}` named by `{chosen}` (proposed, kernel-checked shape)")
    formulas = [as_formula(p) for p in premises]
    what = "uses " + "; ".join(accounts) + ": follows from its premises and " + (
        "that definition" if len(definitions) == 1 else "those definitions"
    )
    others = new_symbols(claimed, premises) - named
    if others:
        result = check_introduction(step, [*formulas, *definitions], claimed, [*premises, *definitions], table, limits)
    else:
        result = check_consequence(step, [*formulas, *definitions], as_formula(claimed), limits, what=what)
    if proposed or not _only_iff(definitions):
        return _without_refutation(result, "naming_not_shown")
    return result


def check_defined_leaf(step: Step, table: SymbolTable, limits: SearchLimits) -> StepResult | None:
    """An introduced leaf that is not a definition but uses symbols the
    derivation defines elsewhere (an equality proxy's reflexivity or
    symmetry axiom citing nothing): a consequence of those definitions.
    None when it uses no such symbol."""
    if is_definition_leaf(step):
        return None
    content = step.statement.content
    found = [stated_definition(table, symbol) for symbol in sorted(predicate_symbols(content))]
    found = [(name, formula) for name, formula in filter(None, found) if name != step.name]
    if not found:
        return None
    definitions = [formula for _, formula in found]
    names = ", ".join(f"`{name}`" for name, _ in found)
    what = f"follows from the definition{'s' if len(found) > 1 else ''} {names}"
    result = check_consequence(step, definitions, as_formula(content), limits, what=what)
    return result if _only_iff(definitions) else _without_refutation(result, "definition_not_shown")
