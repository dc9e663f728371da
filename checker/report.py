"""Rendering reports: a short text for people, JSON for programs.

The text report leads with the verdict, then the counts by outcome and the
first failing step with its diagnosis and ``file:line:col``; JSON carries
the same and every step.
"""

from __future__ import annotations

import json
from collections.abc import Sequence

from checker.outcomes import ASSUMED, Report, StepResult

SAFETY_NOTE = (
    "note: a checked proof shows that the conclusion follows from the axioms as written, "
    "not that the axioms describe the real system; defer to the applicable standards and qualified review."
)


SHOWN_NAMES = 20


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
        "steps": [step_json(step) for step in report.steps],
    }


def render_json(reports: Sequence[Report]) -> str:
    """One report as an object; a batch as an object with a list of them."""
    if len(reports) == 1:
        return json.dumps(report_json(reports[0]), indent=2)
    return json.dumps({"reports": [report_json(report) for report in reports]}, indent=2)


def render_text(report: Report, verbose: bool = False) -> str:
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
        more = f" and {len(assumed) - SHOWN_NAMES} more" if len(assumed) > SHOWN_NAMES else ""
        lines.append("  assumed leaves: " + ", ".join(assumed[:SHOWN_NAMES]) + more)
    for notice in report.notices:
        lines.append(f"  notice: {notice.location}: {notice.message}")
    shown = report.steps if verbose else [s for s in (report.first_failure,) if s is not None]
    for step in shown:
        where = f"{step.location}: " if step.location else ""
        lines.append(f"  {where}step {step.name} ({step.rule}): {step.outcome}: {step.message}")
        lines.extend(f"      {detail}" for detail in step.details)
    return "\n".join(lines)
