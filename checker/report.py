"""Rendering reports: a short text for people, JSON for programs.

The text report leads with the verdict, then the counts by outcome and the
first failing step with its diagnosis and ``file:line:col`` (with
``--all-steps``, every step), the notes, and ends with a trust summary:
what was checked and how, what was assumed, which symbols were introduced
where.  The JSON report carries the same and every step; its layout is
``formats/check_report.schema.json`` (``report_version`` below).  It holds
nothing that changes from run to run (no times, no machine details), so
the same input gives the same bytes.
"""

from __future__ import annotations

import json
from collections.abc import Sequence

from checker.outcomes import (
    ASSUMED,
    CHECKED,
    FAILED,
    NOT_NEEDED,
    RECONSTRUCTED,
    REFUTED,
    TAUTOLOGY,
    UNFOUNDED,
    UNPROVEN,
    UNUSED_LEAF,
    Report,
    StepResult,
)

REPORT_VERSION = 2
"""1: the report before it was versioned; 2: adds report_version, scope,
notes, introduced and the ``unfounded`` outcome"""

SAFETY_NOTE = (
    "note: a checked proof shows that the conclusion follows from the axioms as written, "
    "not that the axioms describe the real system; defer to the applicable standards and qualified review."
)

SCOPE = (
    "A checked proof shows that the conclusion follows from the axioms as written; it does not show that "
    "the axioms describe the real system. Defer to the applicable standards and qualified review."
)

SHOWN_NAMES = 20

SUMMARY_OUTCOMES = (CHECKED, RECONSTRUCTED, REFUTED, FAILED, UNPROVEN, UNFOUNDED)


def _location(step: StepResult) -> str | None:
    return str(step.location) if step.location else None


def step_json(step: StepResult) -> dict:
    return {
        "name": step.name,
        "outcome": step.outcome,
        "rule": step.rule,
        "reason": step.reason,
        "message": step.message,
        "location": _location(step),
        "details": list(step.details),
    }


def report_json(report: Report) -> dict:
    failure = report.first_failure
    return {
        "report_version": REPORT_VERSION,
        "file": report.path,
        "problem": report.problem,
        "files_read": list(dict.fromkeys(report.files)),
        "verdict": report.verdict,
        "exit_code": report.exit_code,
        "counts": report.counts,
        "first_failure": None
        if failure is None
        else {
            "step": failure.name,
            "outcome": failure.outcome,
            "rule": failure.rule,
            "reason": failure.reason,
            "message": failure.message,
            "location": _location(failure),
            "details": list(failure.details),
        },
        "error": report.error,
        "cautions": list(report.cautions),
        "notices": [{"message": n.message, "location": str(n.location)} for n in report.notices],
        "assumed": [step.name for step in report.steps if step.outcome == ASSUMED],
        "introduced": [
            {"symbol": i.symbol, "step": i.step, "location": str(i.location) if i.location else None}
            for i in report.introduced
        ],
        "notes": [
            {"kind": n.kind, "step": n.step, "message": n.message, "location": str(n.location) if n.location else None}
            for n in report.notes
        ],
        "scope": SCOPE,
        "steps": [step_json(step) for step in report.steps],
    }


def render_json(reports: Sequence[Report]) -> str:
    """One report as an object; a batch as an object with a list of them."""
    if len(reports) == 1:
        return json.dumps(report_json(reports[0]), indent=2)
    return json.dumps({"report_version": REPORT_VERSION, "reports": [report_json(r) for r in reports]}, indent=2)


def _names(names: Sequence[str], verbose: bool) -> str:
    if verbose or len(names) <= SHOWN_NAMES:
        return ", ".join(names)
    return ", ".join(names[:SHOWN_NAMES]) + f" and {len(names) - SHOWN_NAMES} more"


def _step_lines(step: StepResult) -> list[str]:
    where = f"{step.location}: " if step.location else ""
    return [f"  {where}step {step.name} ({step.rule}): {step.outcome}: {step.message}",
            *(f"      {detail}" for detail in step.details)]


_NOTE_HEADINGS = {
    NOT_NEEDED: "not needed for the refutation",
    UNUSED_LEAF: "leaves used by no step",
}


def _note_lines(report: Report, verbose: bool) -> list[str]:
    lines = []
    for kind, heading in _NOTE_HEADINGS.items():
        names = [note.step for note in report.notes if note.kind == kind]
        if names:
            lines.append(f"  note: {heading} ({len(names)}): {_names(names, verbose)}")
    tautologies = [note for note in report.notes if note.kind == TAUTOLOGY]
    for note in tautologies if verbose else tautologies[:SHOWN_NAMES]:
        where = f"{note.location}: " if note.location else ""
        lines.append(f"  note: {where}{note.message}")
    if len(tautologies) > SHOWN_NAMES and not verbose:
        lines.append(f"  note: and {len(tautologies) - SHOWN_NAMES} more tautological clauses")
    return lines


def trust_summary(report: Report, verbose: bool = False) -> list[str]:
    """How far to trust the verdict: how each step was settled, which
    leaves were taken on trust, which symbols the derivation introduced."""
    counts = report.counts
    assumed = [step.name for step in report.steps if step.outcome == ASSUMED]
    lines = [
        "  trust summary:",
        "    steps: " + ", ".join(f"{counts.get(outcome, 0)} {outcome}" for outcome in SUMMARY_OUTCOMES),
        f"    leaves taken as assumptions: {_names(assumed, verbose) if assumed else 'none'}",
    ]
    if report.introduced:
        shown = report.introduced if verbose else report.introduced[:SHOWN_NAMES]
        lines.append("    symbols introduced:")
        lines.extend(f"      {i.symbol} by step {i.step}" + (f" at {i.location}" if i.location else "") for i in shown)
        if len(shown) < len(report.introduced):
            lines.append(f"      and {len(report.introduced) - len(shown)} more")
    else:
        lines.append("    symbols introduced: none")
    return lines


def render_text(report: Report, verbose: bool = False) -> str:
    """The text report; ``verbose`` (``--all-steps``) lists every step and
    every name instead of the first failure and the first names."""
    lines = [f"{report.path}: {report.verdict}"]
    if report.error:
        lines.append(report.error)
        return "\n".join(lines)
    if report.counts:
        lines.append("  " + ", ".join(f"{count} {outcome}" for outcome, count in report.counts.items()))
    if report.problem:
        lines.append(f"  problem: {report.problem}")
    for caution in report.cautions:
        lines.append(f"  caution: {caution}")
    assumed = [step.name for step in report.steps if step.outcome == ASSUMED]
    if assumed:
        lines.append("  assumed leaves: " + _names(assumed, verbose))
    for notice in report.notices:
        lines.append(f"  notice: {notice.location}: {notice.message}")
    if verbose:
        for step in report.steps:
            lines.extend(_step_lines(step))
    elif report.first_failure is not None:
        lines.extend(_step_lines(report.first_failure))
        others = sum(step.is_problem for step in report.steps) - 1
        if others:
            lines.append(f"  and {others} more failed, refuted or unproven steps (--all-steps lists every step)")
    lines.extend(_note_lines(report, verbose))
    lines.extend(trust_summary(report, verbose))
    return "\n".join(lines)
