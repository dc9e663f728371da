"""Which steps rest on a failure: sound on their own, unfounded in the whole.

Every step is checked against its parents' formulas as stated, so a step
below a failed or refuted one may well be a correct inference; it is still
no part of a sound derivation.  Such a step is reported ``unfounded``,
naming the failure it rests on, instead of ``checked`` or
``reconstructed`` as if its premises were sound.  Its own outcome stays
in its details.  A step with a problem of its own (failed, refuted,
unproven) keeps that outcome.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence

from checker.outcomes import CHECKED, FAILED, RECONSTRUCTED, REFUTED, UNFOUNDED, StepResult
from checker.plan import Step


def failures_rested_on(results: Sequence[StepResult], steps: Iterable[Step]) -> dict[str, str]:
    """Per step, the failed or refuted step it rests on (through its
    parents, transitively): the one reached through its earliest parent.
    ``steps`` come parents first, as planned."""
    if not any(result.outcome in (FAILED, REFUTED) for result in results):
        return {}  # the usual case, without a table of every step
    outcome = {}
    for result in results:
        outcome.setdefault(result.name, result.outcome)  # a duplicate name is not the step
    rests_on: dict[str, str] = {}
    for step in steps:
        for parent in step.parents:
            root = parent if outcome.get(parent) in (FAILED, REFUTED) else rests_on.get(parent)
            if root is not None:
                rests_on[step.name] = root
                break
    return rests_on


def mark_unfounded(results: Sequence[StepResult], steps: Iterable[Step]) -> list[StepResult]:
    """The results with every sound-on-its-own step below a failure marked
    ``unfounded``."""
    rests_on = failures_rested_on(results, steps)
    if not rests_on:
        return list(results)
    outcome = {}
    for result in results:
        outcome.setdefault(result.name, result.outcome)
    marked = []
    seen: set[str] = set()
    for result in results:
        first = result.name not in seen
        seen.add(result.name)
        root = rests_on.get(result.name)
        if not first or root is None or result.outcome not in (CHECKED, RECONSTRUCTED):
            marked.append(result)
            continue
        marked.append(
            StepResult(
                result.name,
                UNFOUNDED,
                result.rule,
                f"rests on {outcome[root]} step `{root}` (its own inference was {result.outcome})",
                result.location,
                (f"rests on: {root}", f"own check: {result.message}", *result.details),
            )
        )
    return marked
