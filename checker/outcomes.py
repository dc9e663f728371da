"""Outcomes of steps and runs, and the report model they are gathered in.

The names are fixed by the design: a step is ``checked``, ``reconstructed``,
``refuted``, ``failed``, ``unproven`` or ``assumed``, and ``unfounded`` when
its own inference holds but it rests on a failed or refuted step; a run is ``accepted``,
``rejected``, ``undecided`` or ``unreadable``.  Each run verdict has its
exit code; an internal error has its own code and is never reported as
accepted.
"""

from __future__ import annotations

from collections import Counter
from dataclasses import dataclass, field

from formats.derivation import Location, Notice

CHECKED = "checked"
RECONSTRUCTED = "reconstructed"
REFUTED = "refuted"
FAILED = "failed"
UNPROVEN = "unproven"
ASSUMED = "assumed"
UNFOUNDED = "unfounded"
"""the step's own inference holds, but a premise (or one of its premises in
turn) is failed or refuted, so the step is not sound as part of this derivation"""
STEP_OUTCOMES = (CHECKED, RECONSTRUCTED, REFUTED, FAILED, UNPROVEN, ASSUMED, UNFOUNDED)

ACCEPTED = "accepted"
REJECTED = "rejected"
UNDECIDED = "undecided"
UNREADABLE = "unreadable"
INTERNAL_ERROR = "internal_error"

EXIT_CODES = {ACCEPTED: 0, REJECTED: 1, UNREADABLE: 2, UNDECIDED: 3, INTERNAL_ERROR: 4}
EXIT_USAGE = 2

# From worst to best: which verdict a batch of files reports.
SEVERITY = (INTERNAL_ERROR, UNREADABLE, REJECTED, UNDECIDED, ACCEPTED)


@dataclass(frozen=True, slots=True)
class StepResult:
    """What happened to one step (or leaf) of a derivation.

    ``message`` is the diagnosis: for a failure, the exact point of failure;
    for a success, a short account of the evidence.  ``details`` holds extra
    lines such as a closest candidate or a counter-model.
    """

    name: str
    outcome: str
    rule: str
    message: str
    location: Location | None = None
    details: tuple[str, ...] = ()

    @property
    def reason(self) -> str | None:
        """The stable code of a failure (its ``reason: CODE`` detail line)."""
        return next((d.removeprefix("reason: ") for d in self.details if d.startswith("reason: ")), None)

    @property
    def is_problem(self) -> bool:
        return self.outcome in (FAILED, REFUTED, UNPROVEN)


NOT_NEEDED = "not_needed"
UNUSED_LEAF = "unused_leaf"
TAUTOLOGY = "tautology"
NOTE_KINDS = (NOT_NEEDED, UNUSED_LEAF, TAUTOLOGY)


@dataclass(frozen=True, slots=True)
class Note:
    """Something worth knowing about a step that is not a failure: a step
    the refutation does not need, a leaf no step uses, a tautological clause."""

    kind: str
    step: str
    message: str
    location: Location | None = None


@dataclass(frozen=True, slots=True)
class Introduction:
    """A symbol the derivation introduces (Skolem function, defined
    predicate, split symbol) and the step that introduces it."""

    symbol: str
    step: str
    location: Location | None = None


@dataclass(frozen=True, slots=True)
class Report:
    """The result of checking one certificate."""

    path: str
    verdict: str
    steps: tuple[StepResult, ...] = ()
    notices: tuple[Notice, ...] = ()
    problem: str | None = None
    error: str | None = None
    cautions: tuple[str, ...] = field(default=())
    files: tuple[str, ...] = ()
    """every file read: the certificate, its includes, the problem and its includes"""
    notes: tuple[Note, ...] = ()
    introduced: tuple[Introduction, ...] = ()

    @property
    def exit_code(self) -> int:
        return EXIT_CODES[self.verdict]

    @property
    def counts(self) -> dict[str, int]:
        tally = Counter(step.outcome for step in self.steps)
        return {outcome: tally[outcome] for outcome in STEP_OUTCOMES if tally[outcome]}

    @property
    def first_failure(self) -> StepResult | None:
        """The first step that is failed or refuted, else the first unproven."""
        for wanted in ((FAILED, REFUTED), (UNPROVEN,)):
            for step in self.steps:
                if step.outcome in wanted:
                    return step
        return None


def verdict_of(steps: tuple[StepResult, ...] | list[StepResult]) -> str:
    """The run verdict the step outcomes add up to."""
    outcomes = {step.outcome for step in steps}
    if outcomes & {FAILED, REFUTED}:
        return REJECTED
    if UNPROVEN in outcomes:
        return UNDECIDED
    return ACCEPTED


def worst(verdicts: list[str]) -> str:
    """The verdict a batch reports: the worst of its files'."""
    return min(verdicts, key=SEVERITY.index) if verdicts else ACCEPTED
