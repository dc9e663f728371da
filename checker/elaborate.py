"""Writing a checked derivation out with its evidence (``assay elaborate``).

The derivation is checked once with every search recorded
(checker/certified_steps.py); if it is accepted, each statement is written
to a native certificate (version 2) together with what its check found: a
clause step's own evidence inline, the answers to the other questions its
check asked as findings, and a leaf's link to its problem formula.
Checking that certificate asks the same questions and finds every answer
written down, so it searches for nothing; the kernel re-checks each one.
A derivation that is not accepted gets no certificate (or, asked for, a
partial one marked as such in its header).
"""

from __future__ import annotations

import os
from collections.abc import Sequence
from dataclasses import dataclass, replace

from checker.certified_steps import Recording, recording
from checker.kernel.clauses import Clause
from checker.outcomes import ACCEPTED, Report
from checker.run import check, read_document
from checker.search.findings import CLAUSE_EVIDENCE, question_key
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from formats.derivation import Document, Finding, Inference, Parent, Statement
from formats.native import ELABORATED_VERSION, EVIDENCE_RULES, NativeHeader, write_native
from formats.tptp import read_tptp

PRODUCER = "assay elaborate"


@dataclass(frozen=True, slots=True)
class Elaboration:
    """The check that was run and the certificate written from it (None
    when the derivation was not accepted and no partial one was asked for)."""

    report: Report
    written: str | None


def elaborated_document(document: Document, problem: Document | None, found: Recording) -> Document:
    """The document's statements, each with the findings of its check; a
    clause step whose own evidence was found carries it inline; a step
    with nested records is stated as it was settled (each record named,
    with the conclusion it was checked with, or the step taken from the
    named statements under them)."""
    expanded: list[Statement] = []
    seen: set[str] = set()
    for statement in document.statements:
        findings = found.findings.get(statement.name, ()) if statement.name not in seen else ()
        settled = found.nested.get(statement.name, ()) if statement.name not in seen else ()
        seen.add(statement.name)
        expanded.extend((replace(s, findings=findings) for s in settled) if settled else
                        [replace(statement, findings=findings)])
    contents = {s.name: s.content for s in (*(problem.statements if problem else ()), *expanded)}
    statements = [_with_evidence(statement, statement.findings, contents) for statement in expanded]
    return replace(document, statements=tuple(statements))


def _with_evidence(statement: Statement, findings: tuple[Finding, ...], contents: dict) -> Statement:
    inference = statement.source
    if isinstance(inference, Inference) and isinstance(statement.content, Clause) and inference.evidence is None:
        names = [p.name for p in inference.parents if isinstance(p, Parent)]
        if len(names) == len(inference.parents) and all(isinstance(contents.get(n), Clause) for n in names):
            key = question_key(CLAUSE_EVIDENCE, ([contents[n] for n in names], statement.content))
            own = next((f for f in findings if f.key == key and f.kind == CLAUSE_EVIDENCE), None)
            if own is not None:
                evidence, theta = own.answer
                parents = tuple(Parent(n) for n in names)
                inference = Inference(inference.rule, inference.status, parents, evidence, theta)
                findings = tuple(f for f in findings if f is not own)
    if isinstance(inference, Inference) and inference.evidence is None and inference.rule in EVIDENCE_RULES:
        # A prover's rule name that is also a native evidence rule, without that evidence.
        inference = replace(inference, rule=f"stated_{inference.rule}")
    return replace(statement, source=inference, findings=findings)


def elaborate(
    path: str,
    output: str,
    problem: str | None = None,
    include_dirs: Sequence[str] = (),
    limits: SearchLimits = DEFAULT_LIMITS,
    partial: bool = False,
) -> Elaboration:
    """Check the derivation at ``path`` and, if it is accepted (or
    ``partial``), write the elaborated certificate to ``output``."""
    with recording() as found:
        report = check(path, problem, include_dirs, limits)
    accepted = report.verdict == ACCEPTED
    if not accepted and not (partial and report.steps):
        return Elaboration(report, None)
    document = read_document(path, include_dirs)
    problem_path = report.problem
    problem_document = read_tptp(problem_path, include_dirs) if problem_path else None
    relative = None
    if problem_path:
        relative = os.path.relpath(os.path.abspath(problem_path), os.path.dirname(os.path.abspath(output)))
    comment = None
    if not accepted:
        problems = ", ".join(step.name for step in report.steps if step.is_problem)
        comment = f"PARTIAL: the derivation was {report.verdict}; these steps carry no complete evidence: {problems}"
    header = NativeHeader(ELABORATED_VERSION, relative, PRODUCER, comment, partial=not accepted)
    elaborated = elaborated_document(document, problem_document, found)
    with open(output, "w", encoding="utf-8") as out:
        write_native(elaborated, out, header)
    return Elaboration(report, output)
