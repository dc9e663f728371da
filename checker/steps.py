"""Checking one step of a planned derivation, given its parents' statements.

A step is judged by its shape and its declared status, never by its rule
name alone: a step carrying explicit evidence is replayed by the kernel
(``checked``); a clause step without evidence goes to the untrusted search,
whose findings the kernel replays (``reconstructed``); when nothing is
found, the closest candidate is reported (``unproven``), or a counter-model
the kernel confirmed (``refuted``).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause
from checker.kernel.failure import Failure
from checker.kernel.rules import check_clause_step
from checker.kernel.substitution import IDENTITY
from checker.outcomes import CHECKED, FAILED, RECONSTRUCTED, UNPROVEN, StepResult
from checker.plan import Step
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits, reconstruct

# TPTP statuses under which the conclusion is a logical consequence of the
# parents (TPTP SZS ontology: thm, and the weaker-claim relatives).
CONSEQUENCE_STATUSES = frozenset({"thm", "cth", "tau", "eqv", "tac", "wec", "eth", "wth", "wtc", "wcs"})


@dataclass(frozen=True, slots=True)
class StepContext:
    """What every step check may consult besides its own premises."""

    limits: SearchLimits = DEFAULT_LIMITS


def describe_rule(step: Step) -> str:
    return step.inference.rule if step.inference else "leaf"


def check_inference(step: Step, premises: Sequence[Clause | object], context: StepContext) -> StepResult:
    """The outcome of an inference step whose parents' contents are ``premises``."""
    inference = step.inference
    assert inference is not None
    rule = inference.rule
    if any(premise is None for premise in premises):
        return StepResult(step.name, UNPROVEN, rule, "a parent is an intermediate step whose conclusion is not stated", step.location)
    claimed = step.statement.content if step.statement is not None else None
    if inference.evidence is not None:
        if not isinstance(claimed, Clause) or not all(isinstance(p, Clause) for p in premises):
            return StepResult(step.name, FAILED, rule, "explicit evidence is given for clauses, but this step or a parent is a formula", step.location)
        failure = check_clause_step(list(premises), claimed, inference.evidence, inference.theta or IDENTITY)
        if failure is None:
            return StepResult(step.name, CHECKED, rule, "kernel replayed the stated evidence", step.location)
        return _failed(step, rule, failure)
    status = inference.status or "thm"
    if isinstance(claimed, Clause) and all(isinstance(p, Clause) for p in premises):
        if status not in CONSEQUENCE_STATUSES:
            return StepResult(
                step.name, UNPROVEN, rule, f"status `{status}` on a clause step: no check for this kind of step", step.location
            )
        found = reconstruct(list(premises), claimed, rule_hint=rule, limits=context.limits, stated=step.bindings)
        if found.evidence is not None:
            return StepResult(step.name, RECONSTRUCTED, rule, f"kernel replayed {found.description}", step.location)
        details = () if found.closest is None else tuple(found.closest.lines())
        return StepResult(step.name, UNPROVEN, rule, "no evidence found within the search bounds", step.location, details)
    return StepResult(step.name, UNPROVEN, rule, "no check for this kind of step", step.location)


def _failed(step: Step, rule: str, failure: Failure) -> StepResult:
    return StepResult(step.name, FAILED, rule, failure.message, step.location, (f"reason: {failure.reason}",))
