"""Checking a step with its evidence written down: recorded, or replayed.

While ``assay elaborate`` checks a derivation, every step's searches are
recorded (:func:`recording`).  When an elaborated certificate is checked,
each step's searches are answered from the findings written with it, so
the same checks run with no search: the kernel re-checks every answer, a
wrong answer fails the step (it is never trusted), and a step accepted on
the certificate's answers alone is ``checked`` rather than
``reconstructed``.  A leaf's link to a problem formula (its name and the
SHA-256 of its text) is checked before the leaf is.
"""

from __future__ import annotations

import hashlib
from collections.abc import Callable, Iterable, Iterator, Mapping
from contextlib import contextmanager
from contextvars import ContextVar
from dataclasses import dataclass, field, replace

from checker.formula_steps import step_result
from checker.leaves import problem_statement_named
from checker.kernel.clauses import Clause
from checker.kernel.formulas import Formula, render_formula
from checker.outcomes import CHECKED, FAILED, RECONSTRUCTED, UNPROVEN, StepResult
from checker.plan import Step
from checker.search.findings import DEFINITION, PROBLEM_LINK, EvidenceRejected, Recorder, Replayer, answering
from formats.derivation import Document, Finding, Origin, Statement


@dataclass(frozen=True, slots=True)
class Recording:
    """What the checks of a derivation's steps found, by step name: the
    answers to their searches, and how nested records were settled."""

    findings: dict[str, tuple[Finding, ...]] = field(default_factory=dict)
    nested: dict[str, tuple[Statement, ...]] = field(default_factory=dict)


_recorded: ContextVar[Recording | None] = ContextVar("recorded", default=None)


@contextmanager
def recording() -> Iterator[Recording]:
    """Inside the block, every step checked keeps what its searches found."""
    found = Recording()
    token = _recorded.set(found)
    try:
        yield found
    finally:
        _recorded.reset(token)


def formula_text(content: Clause | Formula) -> str:
    """A statement's text as the native certificate writes it."""
    return str(content) if isinstance(content, Clause) else render_formula(content)


def text_digest(content: Clause | Formula) -> str:
    """The SHA-256 (hex) of a formula's text, the fingerprint a leaf's link
    to a problem formula carries."""
    return hashlib.sha256(formula_text(content).encode("utf-8")).hexdigest()


def problem_link(step: Step, problem: Document | None) -> Finding | None:
    """The link of a leaf to the problem formula it cites (by its file
    source, else by its own name), if the problem has one of that name."""
    if problem is None or not step.is_leaf:
        return None
    origin = step.statement.source if step.statement is not None else None
    cited = origin.detail[1] if isinstance(origin, Origin) and origin.kind == "file" and len(origin.detail) > 1 else None
    for name in (cited, step.name):
        statement = problem_statement_named(problem, name) if name is not None else None
        if statement is not None:
            return Finding(PROBLEM_LINK, statement.name, text_digest(statement.content))
    return None


def _link_failure(step: Step, link: Finding, problem: Document | None) -> StepResult | None:
    """Why the leaf's link does not hold: no such problem formula, or a
    different text (the problem changed since the certificate was written)."""
    if problem is None:
        return None
    named = problem_statement_named(problem, link.key)
    if named is None:
        return step_result(step, FAILED, f"links to problem formula `{link.key}`, which the problem does not have",
                           ("reason: link_unknown",))
    digest = text_digest(named.content)
    if digest != link.answer:
        return step_result(
            step, FAILED,
            f"links to problem formula `{link.key}` with SHA-256 {link.answer}, but its text has {digest}",
            ("reason: link_digest",),
        )
    return None


def shared_answers(statements: Iterable[Statement]) -> dict[str, Finding]:
    """The answers every step must share: the definition chosen for a new
    name is one for the whole derivation (every step introducing the name
    asks the same question), so the first one given stands for all."""
    shared: dict[str, Finding] = {}
    for statement in statements:
        for finding in statement.findings or ():
            if finding.kind == DEFINITION:
                shared.setdefault(finding.key, finding)
    return shared


def checked_with_findings(
    step: Step,
    statement: Statement | None,
    problem: Document | None,
    check: Callable[[], list[StepResult]],
    shared: Mapping[str, Finding] | None = None,
) -> list[StepResult]:
    """The results of ``check()`` for a stated step: recorded while
    elaborating, answered from the statement's findings when it has them
    (with ``shared``, from :func:`shared_answers`, taking precedence)."""
    recorded = _recorded.get()
    if recorded is not None:
        recorder = Recorder()
        with answering(recorder):
            results = check()
        link = problem_link(step, problem)
        recorded.findings[step.name] = tuple(recorder.findings.values()) + ((link,) if link else ())
        if recorder.nested is not None:
            recorded.nested[step.name] = recorder.nested
        return results
    if statement is None or statement.findings is None:
        return check()
    answers = {f.key: f for f in statement.findings if f.kind != PROBLEM_LINK}
    own = set(answers)
    for key, finding in (shared or {}).items():
        if key in answers and answers[key].answer != finding.answer:
            return [step_result(
                step, FAILED, f"gives a definition `{answers[key].answer}` for a name that another step "
                f"defines as `{finding.answer}`; a name has one definition", ("reason: definition_differs",),
            )]
        answers[key] = finding
    for link in (f for f in statement.findings if f.kind == PROBLEM_LINK):
        failure = _link_failure(step, link, problem)
        if failure is not None:
            return [failure]
    replayer = Replayer(answers)
    try:
        with answering(replayer):
            results = check()
    except EvidenceRejected as rejected:
        return [step_result(
            step, FAILED, f"the certificate's {rejected.kind.replace('_', ' ')} does not hold: {rejected.failure.message}",
            (f"reason: {rejected.failure.reason}",),
        )]
    unused = sorted(own - replayer.used)
    if unused and any(result.outcome == UNPROVEN for result in results):
        return [step_result(
            step, FAILED, f"the certificate's evidence answers no question this step's check asks ({len(unused)} "
            f"finding{'s' if len(unused) != 1 else ''} unused, first {unused[0]})",
            ("reason: finding_unused",),
        )]
    if replayer.searched:
        return results
    return [
        replace(result, outcome=CHECKED, message=f"kernel replayed the certificate's evidence: {result.message}")
        if result.outcome == RECONSTRUCTED else result
        for result in results
    ]
