"""Checking one inference step of a planned derivation, given its parents.

A step is judged by its shape and its declared status, never by its rule
name alone (the name only reorders the search): a step carrying explicit
evidence is replayed by the kernel (``checked``); a clause step without
evidence goes to the untrusted search, whose findings the kernel replays
(``reconstructed``); formula steps go to :mod:`checker.formula_steps`.
When nothing is found, the closest candidate is reported (``unproven``).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, replace

from checker.formula_steps import (
    as_formula,
    check_consequence,
    check_introduction,
    check_negated_conjecture,
    step_result,
)
from checker.freshness import SymbolTable, new_symbols
from checker.global_steps import check_removal, removal_hinted
from checker.kernel.clauses import Clause
from checker.kernel.failure import quote
from checker.kernel.formulas import Formula
from checker.kernel.models import confirm_countermodel, render_countermodel
from checker.kernel.rules import check_clause_step
from checker.kernel.substitution import IDENTITY
from checker.leaves import equivalent_content
from checker.namings import check_naming_step
from checker.outcomes import CHECKED, FAILED, RECONSTRUCTED, REFUTED, UNPROVEN, StepResult
from checker.plan import Step
from checker.search.models import find_countermodel
from checker.search.reconstruct import Candidate, SearchLimits, reconstruct
from checker.sorts import arithmetic_sorts, erasure_hazard
from checker.splitting import check_propositional_step
from checker.statuses import CONSEQUENCE_STATUSES
from formats.derivation import Statement


@dataclass(frozen=True, slots=True)
class StepContext:
    """What every step check may consult besides its own parents."""

    limits: SearchLimits
    symbols: SymbolTable
    conjectures: tuple[Clause | Formula, ...] | None = None
    """the problem's conjectures, or None when there is no problem"""


def closest_lines(candidate: Candidate | None) -> tuple[str, ...]:
    """The nearest inference the search tried, as a prover developer needs it."""
    if candidate is None:
        return ()
    lines = [
        f"closest candidate: {candidate.description}",
        f"computed: {quote(candidate.computed)}",
        f"claimed:  {quote(candidate.claimed)}",
    ]
    if candidate.missing:
        lines.append("produced but not claimed: " + ", ".join(quote(lit) for lit in candidate.missing))
    if candidate.extra:
        lines.append("claimed but not produced: " + ", ".join(quote(lit) for lit in candidate.extra))
    lines.append(f"kernel: {candidate.message}")
    return tuple(lines)


def premise_names(step: Step) -> str:
    """Which parent each premise number of a diagnosis is."""
    return "premises: " + ", ".join(f"{number} = `{name}`" for number, name in enumerate(step.parents))


def check_inference(step: Step, parents: Sequence[Statement | None], context: StepContext) -> StepResult:
    """The outcome of an inference step whose parent statements are
    ``parents``; typed steps only where erasing their sorts is sound, and
    never refuted over arithmetic (checker/sorts.py)."""
    assert step.inference is not None and step.statement is not None
    assert all(parent is not None for parent in parents), "the plan faults dangling parents; nested ones are stood in"
    hazard = erasure_hazard(step.statement, step.inference, parents, context.symbols.sorts, context.symbols.non_monotone)
    if hazard is not None:
        return step_result(step, UNPROVEN, hazard, ("reason: unsupported_sorts",))
    result = _check_named_or_removed(step, parents, context)
    arithmetic = arithmetic_sorts([step.statement, *parents])
    if arithmetic and result.outcome in (REFUTED, UNPROVEN):
        return step_result(
            step, UNPROVEN,
            f"unsupported: the step is over {', '.join(sorted(arithmetic))}, and arithmetic is read as "
            f"uninterpreted symbols; with them the step {'does not hold' if result.outcome == REFUTED else 'was not shown'}",
            ("reason: unsupported_arithmetic",),
        )
    return result


def check_from_premises(step: Step, parents: Sequence[Statement], context: StepContext) -> StepResult:
    """The outcome of an inference step judged by what its parent
    statements say, sorts erased."""
    inference = step.inference
    claimed = step.statement.content
    premises = [parent.content for parent in parents]
    status = inference.status or "thm"

    conjectures = [parent for parent in parents if parent.role == "conjecture"]
    if conjectures:
        if status != "cth" and step.statement.role != "negated_conjecture":
            return step_result(
                step, FAILED,
                f"uses the conjecture `{conjectures[0].name}` as a premise; only its negation may be used",
                ("reason: conjecture_as_premise",),
            )
        if len(parents) != 1:
            return step_result(step, FAILED, "a negated conjecture must have the conjecture as its only parent",
                           ("reason: negation_parents",))
        if context.conjectures is not None and not any(
            equivalent_content(conjecture, conjectures[0].content, context.limits)
            for conjecture in context.conjectures
        ):
            return step_result(
                step, FAILED, f"negates `{conjectures[0].name}`, which is not a conjecture of the problem",
                ("reason: not_a_problem_conjecture",),
            )
        return check_negated_conjecture(
            step, as_formula(conjectures[0].content), claimed, context.symbols, context.limits
        )

    if inference.evidence is not None:
        if not isinstance(claimed, Clause) or not all(isinstance(p, Clause) for p in premises):
            return step_result(step, FAILED, "explicit evidence is given for clauses, but this step or a parent is a formula")
        failure = check_clause_step(premises, claimed, inference.evidence, inference.theta or IDENTITY)
        if failure is None:
            return step_result(step, CHECKED, "kernel replayed the stated evidence")
        return step_result(step, FAILED, failure.message, (f"reason: {failure.reason}", premise_names(step)))

    propositional = check_propositional_step(step, premises, claimed, context.limits)
    if propositional is not None:
        return propositional

    introduces = bool(new_symbols(claimed, premises))
    if introduces and status not in CONSEQUENCE_STATUSES:
        return _check_with_new_symbols(step, claimed, premises, status, context)
    if isinstance(claimed, Clause) and all(isinstance(p, Clause) for p in premises):
        # A clause inference may instantiate with a symbol its premises lack.
        found = reconstruct(premises, claimed, rule_hint=inference.rule, limits=context.limits, stated=step.bindings)
        if found.evidence is not None:
            return step_result(step, RECONSTRUCTED, f"kernel replayed {found.description}")
        if introduces and not found.wrong_bindings:
            return _check_with_new_symbols(step, claimed, premises, status, context)
        if found.wrong_bindings:
            # A certificate that misstates its unifier is wrong even when
            # another unifier works: its producer must see it.
            return step_result(
                step, FAILED, found.closest.message,
                ("reason: wrong_bindings", premise_names(step), *closest_lines(found.closest)),
            )
        model = find_countermodel(premises, claimed, context.limits.countermodel_domain)
        if model is not None and confirm_countermodel(model, premises, claimed) is None:
            return step_result(
                step, REFUTED, "counter-model: the premises are true and the claimed clause false",
                ("reason: countermodel", *render_countermodel(model, premises, claimed).splitlines(),
                 premise_names(step), *closest_lines(found.closest)),
            )
        return step_result(
            step, UNPROVEN, "no evidence found within the search bounds (see --search-limit)",
            (premise_names(step), *closest_lines(found.closest)),
        )
    if introduces:
        return _check_with_new_symbols(step, claimed, premises, status, context)
    return check_consequence(step, [as_formula(p) for p in premises], as_formula(claimed), context.limits)


def _check_with_new_symbols(
    step: Step, claimed: Clause | Formula, premises: Sequence[Clause | Formula], status: str, context: StepContext
) -> StepResult:
    """A step whose conclusion has symbols its premises lack is judged by
    what it does, whatever its status claims.  Under a consequence status it
    may still be one (``p(c)`` from ``! [X] : p(X)``), tried first; else it
    must be an introduction.  A status that claims more than an introduction
    (``thm``) is not held against a sound introduction; where neither
    reading is shown, it is ``unproven``, never refuted by the consequence
    check alone; and a structural fault of the introduction reading stands
    only if the step is shown not to be a consequence.  A step that claims
    to introduce (``esa``) is judged as an introduction only: Skolemizing
    the wrong quantifier is a fault even where the result happens to follow."""
    formulas = [as_formula(p) for p in premises]
    consequence = None
    if status in CONSEQUENCE_STATUSES:
        consequence = check_consequence(step, formulas, as_formula(claimed), context.limits)
        if consequence.outcome == RECONSTRUCTED:
            return consequence
    introduction = check_introduction(step, formulas, claimed, premises, context.symbols, context.limits)
    if consequence is not None and consequence.outcome == REFUTED and introduction.outcome == FAILED:
        # Neither reading holds: say why it is no introduction, and show the
        # counter-model to the consequence its status claims.
        model = tuple(line for line in consequence.details if not line.startswith("reason: "))
        return replace(introduction, message=f"{introduction.message}; and as a consequence of its premises "
                       "it has a counter-model", details=(*introduction.details, *model))
    if introduction.outcome != FAILED or consequence is None:
        return introduction
    return step_result(
        step, UNPROVEN,
        f"not shown a consequence within the search bounds, and as an introduction: {introduction.message}",
        tuple(line for line in introduction.details if not line.startswith("reason: ")),
    )


def _check_named_or_removed(step: Step, parents: Sequence[Statement], context: StepContext) -> StepResult:
    """The outcome of an inference step whose parent statements are
    ``parents``: a step with new predicates as a naming, one that drops a
    predicate also against the derivation-wide condition that may make it
    sound (first, when its rule name says it removes something)."""
    naming = check_naming_step(step, parents, context.symbols, context.limits)
    if naming is not None:
        return naming
    hinted = removal_hinted(step)
    removal = check_removal(step, parents, context.symbols, context.limits) if hinted else None
    if removal is not None and removal.result is not None:
        return removal.result
    local = check_from_premises(step, parents, context)
    if local.outcome not in (REFUTED, UNPROVEN):
        return local
    removal = removal or check_removal(step, parents, context.symbols, context.limits)
    if removal.result is not None:
        return removal.result
    if not (hinted and removal.objections):
        return local
    others = tuple(d for d in local.details if not d.startswith("reason: "))
    if local.outcome == REFUTED:
        # Not a consequence (the counter-model is confirmed), and the global
        # condition that could make the removal sound does not hold.
        return step_result(
            step, FAILED, f"removes a predicate that the global condition does not allow: {removal.objections[0]}",
            ("reason: not_pure", *removal.objections[1:], local.message, *others),
        )
    return StepResult(local.name, local.outcome, local.rule, local.message, local.location,
                      (*local.details, *removal.objections))
