"""Checking formula-level steps: consequences, Skolemization, definitions,
and the negated conjecture.

A derivation starts from formulas; a wrong step here (a Skolem function
that forgot a variable, a reused constant, a dropped negation) silently
proves anything.  Consequence steps are checked as kernel-replayed
refutations of clausify(premises ∧ ¬conclusion); steps that introduce new
symbols must introduce them fresh, as witnesses of quantifiers that
Skolemization may replace, and are then checked as consequences of the
premises plus the kernel-built Skolem axioms.
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.freshness import SymbolTable, describe_symbol, new_symbols
from checker.kernel.clauses import Clause
from checker.kernel.entailment import check_entailment
from checker.kernel.failure import Failure
from checker.kernel.formulas import (
    EXISTS,
    FORALL,
    IMPLIES,
    Formula,
    alpha_equivalent,
    formula_of_clause,
    negation,
    subformulas_with_polarity,
    universal_closure,
)
from checker.kernel.introductions import check_choice_axiom, check_definition, skolemize
from checker.kernel.models import confirm_countermodel, render_countermodel
from checker.outcomes import FAILED, RECONSTRUCTED, REFUTED, UNPROVEN, StepResult
from checker.plan import Step
from checker.search.entailment import find_entailment
from checker.search.models import find_countermodel
from checker.search.reconstruct import SearchLimits, reconstruct
from checker.search.witnesses import Misfit, matching_witnesses, next_witness
from formats.derivation import Origin


def as_formula(content: Clause | Formula) -> Formula:
    """A clause as the universal closure of its disjunction; a formula as
    its universal closure (TPTP leaves free variables universal)."""
    if isinstance(content, Clause):
        return formula_of_clause(content)
    return universal_closure(content)


def step_result(step: Step, outcome: str, message: str, details: Sequence[str] = ()) -> StepResult:
    """A result for ``step`` under its rule name (a leaf's kind of origin)."""
    rule = step.inference.rule if step.inference is not None else _leaf_kind(step)
    return StepResult(step.name, outcome, rule, message, step.location, tuple(details))


def _leaf_kind(step: Step) -> str:
    origin = step.statement.source if step.statement is not None else None
    return " ".join((origin.kind, *origin.detail[:1])) if isinstance(origin, Origin) else "leaf"


def check_consequence(
    step: Step,
    premises: Sequence[Formula],
    conclusion: Formula,
    limits: SearchLimits,
    what: str = "follows from its premises",
) -> StepResult:
    """premises ⊨ conclusion, by alpha-equivalence or a kernel-replayed
    refutation; if neither is found, a kernel-confirmed counter-model."""
    if any(alpha_equivalent(premise, conclusion) for premise in premises):
        return step_result(step, RECONSTRUCTED, f"{what}: alpha-equivalent to a premise")
    chain = find_entailment(premises, conclusion, limits)
    if chain is not None:
        failure = check_entailment(premises, conclusion, chain)
        if failure is None:
            return step_result(
                step, RECONSTRUCTED,
                f"{what}: kernel replayed a refutation of premises and negated conclusion in "
                f"{len(chain.steps)} inference{'s' if len(chain.steps) != 1 else ''}",
            )
    model = find_countermodel(list(premises), conclusion)
    if model is not None and confirm_countermodel(model, list(premises), conclusion) is None:
        return step_result(
            step,
            REFUTED,
            f"counter-model: the premises are true and the conclusion false (claimed: {what})",
            ("reason: countermodel", *render_countermodel(model, list(premises), conclusion).splitlines()),
        )
    return step_result(step, UNPROVEN, f"not shown within the search bounds (claimed: {what})")


def check_introduction(
    step: Step,
    premises: Sequence[Formula],
    claimed: Clause | Formula,
    raw_premises: Sequence[Clause | Formula],
    table: SymbolTable,
    limits: SearchLimits,
) -> StepResult:
    """A step with new symbols: fresh, each the witness of a quantifier that
    Skolemization may replace, and the step follows from the premises so
    Skolemized (built by the kernel, outermost quantifier first)."""
    new = new_symbols(claimed, raw_premises)
    not_fresh = table.freshness_failure(step.name, new)
    if not_fresh:
        return step_result(step, FAILED, not_fresh, ("reason: not_fresh",))
    skolemized = list(premises)
    remaining = set(new)
    witnessed: list[str] = []
    while remaining:
        proposal = next_witness(skolemized, claimed, remaining)
        if isinstance(proposal, Misfit):
            return step_result(step, FAILED, proposal.message, (f"reason: {proposal.reason}",))
        replaced = skolemize(skolemized[proposal.premise], proposal.quantifier, {proposal.bound: proposal.witness})
        if isinstance(replaced, Failure):
            return step_result(step, FAILED, replaced.message, (f"reason: {replaced.reason}",))
        skolemized[proposal.premise] = replaced
        remaining.discard((proposal.witness.symbol, proposal.witness.arity))
        witnessed.append(f"Skolem term `{proposal.witness}` for `{proposal.bound}` of `{proposal.quantifier}`")
    introduced = ", ".join(describe_symbol(s) for s in sorted(new))
    result = check_consequence(
        step, skolemized, as_formula(claimed), limits,
        what=f"Skolemization introducing {introduced}: follows from its Skolemized premises",
    )
    if result.outcome == RECONSTRUCTED:
        return result
    # Say which quantifier each symbol was taken to witness: that pairing is
    # part of what did not hold.
    return StepResult(result.name, result.outcome, result.rule, result.message, result.location,
                      (*result.details, *witnessed))


def check_introduced_leaf(step: Step, origin: Origin, table: SymbolTable, limits: SearchLimits) -> StepResult:
    """A leaf the prover introduced rather than took from the problem: a
    definition, an axiom of choice (a Skolem axiom), or a statement valid in
    itself (a tautology, an equality axiom)."""
    content = step.statement.content
    kind = origin.detail[0] if origin.detail else ""
    if "definition" in kind:
        return check_definition_leaf(step, table)
    if isinstance(content, Formula):
        choice = _choice_parts(universal_closure(content))
        if choice is not None:
            return check_choice_leaf(step, universal_closure(content), *choice, table)
    from checker.namings import check_defined_leaf  # it builds on this module

    return check_defined_leaf(step, table, limits) or check_valid_leaf(step, limits)


def _choice_parts(axiom: Formula) -> tuple[Formula, dict] | None:
    """The quantifier of what looks like a Skolem axiom, and the witnesses
    found where its bound variables stand in the instance (untrusted)."""
    body = axiom
    while body.connective == FORALL:
        body = body.arguments[0]
    if body.connective != IMPLIES:
        return None
    antecedent, consequent = body.arguments
    if antecedent.connective == EXISTS:
        quantifier, instance = antecedent, consequent
    elif consequent.connective == FORALL:
        quantifier, instance = consequent, antecedent
    else:
        return None
    witnesses = matching_witnesses(quantifier, instance)
    return (quantifier, witnesses) if witnesses else None


def check_choice_leaf(step: Step, axiom: Formula, quantifier: Formula, witnesses: dict, table: SymbolTable) -> StepResult:
    """An axiom of choice: the kernel confirms it is the Skolem axiom of its
    witnesses, and their symbols must be fresh."""
    failure = check_choice_axiom(axiom, witnesses)
    if failure is not None:
        return step_result(step, FAILED, failure.message, (f"reason: {failure.reason}",))
    symbols = {(w.symbol, w.arity) for w in witnesses.values()}
    not_fresh = table.freshness_failure(step.name, symbols)
    if not_fresh:
        return step_result(step, FAILED, not_fresh, ("reason: not_fresh",))
    named = ", ".join(describe_symbol(s) for s in sorted(symbols))
    return step_result(step, RECONSTRUCTED, f"Skolem axiom (axiom of choice) for fresh {named}")


def check_valid_leaf(step: Step, limits: SearchLimits) -> StepResult:
    """A statement that needs no premises: the kernel replays a refutation of
    its negation from nothing (equality reasoning included); if that is not
    found, a counter-model shows it is not valid."""
    claimed = step.statement.content
    if isinstance(claimed, Clause):
        found = reconstruct([], claimed, rule_hint=_leaf_kind(step), limits=limits)
        if found.evidence is not None:
            return step_result(step, RECONSTRUCTED, "valid clause: its negation is refuted from no premises")
    else:
        chain = find_entailment([], universal_closure(claimed), limits)
        if chain is not None and check_entailment([], universal_closure(claimed), chain) is None:
            return step_result(step, RECONSTRUCTED, "valid formula: its negation is refuted from no premises")
    model = find_countermodel([], claimed)
    if model is not None and confirm_countermodel(model, [], claimed) is None:
        return step_result(
            step, REFUTED, "not valid: counter-model in which it is false",
            ("reason: countermodel", *render_countermodel(model, [], claimed).splitlines()),
        )
    return step_result(step, UNPROVEN, "not shown valid within the search bounds")


def check_definition_leaf(step: Step, table: SymbolTable) -> StepResult:
    """An introduced definition: the defined symbol is a predicate of one
    of its sides that is fresh, and the formula has a definition's shape.
    Sides whose predicate is not in the problem are tried first, so that a
    failure names the symbol the definition most likely introduces."""
    statement = step.statement
    assert statement is not None
    formula = as_formula(statement.content)
    body = formula
    while body.connective == FORALL:
        body = body.arguments[0]
    sides = [(a.atom.symbol, a.atom.arity) for a in body.arguments if a.atom is not None and a.atom.symbol != "="]
    candidates = sorted(dict.fromkeys(sides), key=lambda symbol: symbol in table.problem)
    failure = Failure("not_a_definition", f"`{formula}` has no side that is a predicate applied to variables")
    for number, symbol in enumerate(candidates):
        shape = check_definition(formula, symbol)
        if shape is None:
            not_fresh = table.freshness_failure(step.name, {symbol})
            if not_fresh is None:
                return step_result(step, RECONSTRUCTED, f"defines fresh symbol `{describe_symbol(symbol)}`")
            shape = Failure("not_fresh", not_fresh)
        if number == 0:
            failure = shape
    return step_result(step, FAILED, failure.message, (f"reason: {failure.reason}",))


def _predicates(content: Clause | Formula) -> set[tuple[str, int]]:
    formula = as_formula(content)
    atoms = (f.atom for f, _ in subformulas_with_polarity(formula) if f.atom is not None)
    return {(atom.symbol, atom.arity) for atom in atoms}


def check_negated_conjecture(
    step: Step,
    conjecture: Formula,
    claimed: Clause | Formula,
    table: SymbolTable,
    limits: SearchLimits,
) -> StepResult:
    """The step states the negation of the conjecture: alpha-equivalent to
    it, or equivalent to it (both directions kernel-replayed), or, when it
    introduces symbols, the negation Skolemized.  Mere consequence is not
    enough: when the conjecture is valid its negation entails anything, and
    a dropped negation would pass unnoticed."""
    negated = negation(universal_closure(conjecture))
    conclusion = as_formula(claimed)
    if alpha_equivalent(negated, conclusion) or (
        isinstance(claimed, Formula) and alpha_equivalent(negation(conjecture), claimed)
    ):
        return step_result(step, RECONSTRUCTED, "the negation of the conjecture")
    new = new_symbols(claimed, [conjecture])
    if new and not new & _predicates(claimed) and table.freshness_failure(step.name, new) is None:
        # Negated and Skolemized in one step.
        return check_introduction(step, [negated], claimed, [conjecture], table, limits)
    forward = check_consequence(step, [negated], conclusion, limits, what="follows from the negation of the conjecture")
    if forward.outcome != RECONSTRUCTED:
        return forward
    backward = check_consequence(step, [conclusion], negated, limits, what="implies the negation of the conjecture")
    if backward.outcome == RECONSTRUCTED:
        return step_result(step, RECONSTRUCTED, "equivalent to the negation of the conjecture (both directions replayed)")
    if backward.outcome == REFUTED:
        return step_result(
            step, FAILED,
            "not the negation of the conjecture: it follows from the negation but is weaker; "
            "counter-model in which the step holds and the negated conjecture does not",
            ("reason: not_the_negation", *backward.details),
        )
    return step_result(step, UNPROVEN, "not shown equivalent to the negation of the conjecture within the search bounds")
