"""Splitting with propositional names: the SAT path and what reports show.

A prover that splits clauses into components names each component by a
fresh propositional symbol (a definition ``s <=> C``), tags clauses with
the names they depend on (``C | ~s``, or a guarded clause ``C <= G`` read as
``G => C``), and closes the search with a propositional refutation over the
names.  Definitions are checked like any definition, split and component
steps like any consequence; here is the propositional part: a step whose
premises and conclusion are purely propositional is shown by a SAT solver's
RUP log that the kernel re-checks.  Failures on such steps get report lines
naming the split symbols, guards and branch assumptions involved.
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.assumptions import Branches, branch_lines, open_branch_faults
from checker.formula_steps import as_formula, step_result
from checker.kernel.clauses import Clause
from checker.kernel.failure import quote
from checker.kernel.formulas import ATOM, IFF, IMPLIES, QUANTIFIERS, Formula, subformulas_with_polarity
from checker.kernel.propositional import check_unit_entailment
from checker.outcomes import RECONSTRUCTED, StepResult
from checker.plan import Plan, Step
from checker.search.propositional import find_unit_entailment
from checker.search.reconstruct import SearchLimits
from formats.derivation import Origin, Statement


def is_propositional(content: Clause | Formula) -> bool:
    """No variables, no quantifiers, and every atom a 0-ary predicate."""
    if isinstance(content, Clause):
        return all(literal.atom.arity == 0 for literal in content.literal_set)
    return all(
        part.connective not in QUANTIFIERS and (part.connective != ATOM or part.atom.arity == 0)
        for part, _ in subformulas_with_polarity(content)
    )


def check_propositional_step(
    step: Step, premises: Sequence[Clause | Formula], claimed: Clause | Formula, limits: SearchLimits
) -> StepResult | None:
    """A purely propositional step shown by a kernel-checked RUP refutation;
    None when the step is not propositional or no refutation was found (the
    ordinary checks then look for a counter-model).  A step from one or two
    clauses to a clause is left to the ordinary search, which names the
    single inference it replays."""
    if not premises or not all(map(is_propositional, (*premises, claimed))):
        return None
    clauses_only = all(isinstance(content, Clause) for content in (*premises, claimed))
    if clauses_only and len(premises) <= 2:
        return None
    lemmas = find_unit_entailment(premises, claimed, limits.sat_conflicts)
    if lemmas is None or check_unit_entailment(premises, claimed, lemmas) is not None:
        return None
    return step_result(
        step, RECONSTRUCTED,
        f"propositional: kernel checked a refutation of {len(lemmas)} lemma{'s' if len(lemmas) != 1 else ''} "
        "by unit propagation (found by a SAT solver)",
    )


def split_symbols(statements: dict[str, Statement]) -> dict[str, tuple[str, Formula]]:
    """Each propositional symbol an introduced definition names: the
    definition's statement name and the component it stands for."""
    found: dict[str, tuple[str, Formula]] = {}
    for statement in statements.values():
        origin = statement.source
        if not (isinstance(origin, Origin) and origin.kind == "introduced" and isinstance(statement.content, Formula)):
            continue
        body = statement.content
        if body.connective != IFF:
            continue
        for named, meaning in (body.arguments, body.arguments[::-1]):
            if named.connective == ATOM and named.atom.arity == 0:
                found.setdefault(named.atom.symbol, (statement.name, meaning))
                break
    return found


def _symbols_in(content: Clause | Formula) -> set[str]:
    formula = as_formula(content)
    return {part.atom.symbol for part, _ in subformulas_with_polarity(formula)
            if part.connective == ATOM and part.atom.arity == 0}


def splitting_lines(step_name: str, statements: dict[str, Statement], named: dict[str, tuple[str, Formula]]) -> list[str]:
    """Report lines for a failed step: its guard and the split symbols it
    and its parents use, each with its component."""
    statement = statements.get(step_name)
    if statement is None:
        return []
    lines = []
    content = statement.content
    if isinstance(content, Formula) and content.connective == IMPLIES and is_propositional(content.arguments[0]):
        lines.append(f"guard: {quote(content.arguments[0])} (the step claims {quote(content.arguments[1])} under it)")
    involved = _symbols_in(content)
    source = statement.source
    for parent in getattr(source, "parents", ()):
        if getattr(parent, "name", None) in statements:
            involved |= _symbols_in(statements[parent.name].content)
    for symbol in sorted(involved & named.keys()):
        definition, meaning = named[symbol]
        lines.append(f"split symbol `{symbol}` names {quote(meaning)} (defined at `{definition}`)")
    return lines


def with_splitting_details(
    results: list[StepResult], plan: Plan, branches: Branches, statements: dict[str, Statement]
) -> list[StepResult]:
    """The results, failures annotated with the split symbols, guards and
    branch assumptions involved, plus a failure when every `$false` rests
    on an open assumption."""
    named = split_symbols(statements)
    annotated = []
    for result in [*results, *open_branch_faults(plan, branches, statements)]:
        extra = []
        if result.is_problem:
            extra = [*splitting_lines(result.name, statements, named), *branch_lines(branches, result.name, statements)]
            extra = [line for line in extra if line not in result.details]
        annotated.append(
            StepResult(result.name, result.outcome, result.rule, result.message, result.location,
                       (*result.details, *extra)) if extra else result
        )
    return annotated
