"""Steps sound by a derivation-wide condition: pure predicates, defined symbols.

A step that drops a predicate may rest on more than its premises.  When
the predicate is pure (it occurs with one polarity in every formula of the
problem and the derivation), any model of the problem stays one when the
predicate is made true everywhere (false, for a negative one), so the step
may assume ``! [X..] : p(X..)`` (or its negation).  When the predicate is a
fresh symbol with a stated definition, the step may assume the definition
(inlining it, after which the definition is unused).  The condition is
global, so it is read off the symbol table built once for the whole
derivation; the step must then follow from its premises plus that
assumption, by a kernel-replayed refutation.  Introducers other than
stated definitions disqualify a pure predicate: a name defined only
implicitly has a definition in both polarities that no statement shows.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from checker.formula_steps import as_formula, step_result
from checker.freshness import Symbol, SymbolTable, describe_symbol
from checker.kernel.entailment import check_entailment
from checker.kernel.formulas import FORALL, Formula, atomic, negation, quantified
from checker.kernel.terms import application, variable
from checker.namings import is_definition_leaf, predicate_symbols, stated_definition
from checker.outcomes import RECONSTRUCTED, StepResult
from checker.plan import Step
from checker.search.entailment import find_entailment
from checker.search.reconstruct import SearchLimits
from formats.derivation import Statement

REMOVAL_WORDS = ("pure", "unused", "removal", "unfold", "inlin")
"""Rule-name fragments that make the global check come first (a hint for
the order of attempts, never a reason to accept)."""


@dataclass(frozen=True, slots=True)
class GlobalAssumption:
    """What a step may assume about a predicate, and the condition that
    justifies it, as the report states it."""

    symbol: Symbol
    formula: Formula
    account: str


@dataclass(frozen=True, slots=True)
class RemovalCheck:
    """The result of the global check (None when nothing held) and, for
    each dropped predicate that qualified for nothing, why."""

    result: StepResult | None
    objections: tuple[str, ...]


def removal_hinted(step: Step) -> bool:
    rule = (step.inference.rule if step.inference is not None else "").lower()
    return any(word in rule for word in REMOVAL_WORDS)


def _everywhere(symbol: Symbol, positive: bool) -> Formula:
    """``! [X1..Xn] : p(X1..Xn)``, negated inside for a negative predicate."""
    name, arity = symbol
    variables = tuple(variable(f"X{number}") for number in range(1, arity + 1))
    atom = atomic(application(name, variables))
    body = atom if positive else negation(atom)
    return quantified(FORALL, variables, body) if variables else body


def _where(entry) -> str:
    name, location = entry
    return f"`{name}` at {location}"


def pure_assumption(table: SymbolTable, symbol: Symbol) -> GlobalAssumption | str:
    """The assumption a pure predicate allows, or why it is not pure."""
    seen = table.polarities.get(symbol, {})
    shown = describe_symbol(symbol)
    if len(seen) != 1:
        return (
            f"`{shown}` is not pure: it occurs positively in {_where(seen[1])} and negatively in {_where(seen[-1])}"
            if len(seen) == 2 else f"`{shown}` occurs in no formula of the problem or the derivation"
        )
    implicit = [
        name for name in table.introducers.get(symbol, ())
        if name in table.planned and not is_definition_leaf(table.planned[name])
    ]
    if implicit:
        return f"`{shown}` is not pure: step `{implicit[0]}` introduces it without a stated definition"
    (sign, entry), = seen.items()
    polarity = "positively" if sign > 0 else "negatively"
    value = "true" if sign > 0 else "false"
    return GlobalAssumption(
        symbol, _everywhere(symbol, sign > 0),
        f"pure predicate `{shown}` taken as {value} everywhere: checked against the global condition that it "
        f"occurs only {polarity} in every formula of the problem and the derivation (first in {_where(entry)})",
    )


def definition_assumption(table: SymbolTable, symbol: Symbol) -> GlobalAssumption | str:
    """The stated definition of a fresh symbol, or why there is none."""
    stated = stated_definition(table, symbol)
    if stated is None:
        return f"`{describe_symbol(symbol)}` has no stated definition"
    name, formula = stated
    not_fresh = table.freshness_failure(name, {symbol})
    if not_fresh:
        return not_fresh
    return GlobalAssumption(
        symbol, formula,
        f"`{describe_symbol(symbol)}` unfolded by its definition `{name}`: checked against the global condition "
        "that the symbol is fresh, so the definition holds wherever the derivation is used",
    )


def _follows(premises: Sequence[Formula], conclusion: Formula, limits: SearchLimits) -> bool:
    chain = find_entailment(premises, conclusion, limits)
    return chain is not None and check_entailment(premises, conclusion, chain) is None


def check_removal(step: Step, parents: Sequence[Statement], table: SymbolTable, limits: SearchLimits) -> RemovalCheck:
    """A step whose conclusion drops predicates of its premises, checked as
    a consequence of the premises plus what the global condition of a
    dropped predicate allows (each alone, then all that qualify together)."""
    if step.inference.evidence is not None or any(parent.role == "conjecture" for parent in parents):
        return RemovalCheck(None, ())
    claimed = step.statement.content
    premises = [as_formula(parent.content) for parent in parents]
    dropped = set().union(*(predicate_symbols(p.content) for p in parents)) - predicate_symbols(claimed)
    assumptions: list[GlobalAssumption] = []
    objections: list[str] = []
    for symbol in sorted(dropped):
        for found in (definition_assumption(table, symbol), pure_assumption(table, symbol)):
            if isinstance(found, GlobalAssumption):
                assumptions.append(found)
                break
        else:
            objections.append(found)
    conclusion = as_formula(claimed)
    tries = [[a] for a in assumptions] + ([assumptions] if len(assumptions) > 1 else [])
    for used in tries:
        if _follows([*premises, *(a.formula for a in used)], conclusion, limits):
            accounts = "; ".join(a.account for a in used)
            return RemovalCheck(
                step_result(step, RECONSTRUCTED, f"{accounts}; the conclusion follows from the premises with that "
                            "assumption (kernel replayed a refutation)"),
                tuple(objections),
            )
    return RemovalCheck(None, tuple(objections))
