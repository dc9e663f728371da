"""A batch's summary: a table for people, JSON for programs.

One row per file (verdict, steps, seconds, first failure), then the totals
and the batch's verdict, the worst of its files'.
"""

from __future__ import annotations

import json
from collections import Counter

from checker.batch import Batch
from checker.batch_results import FileResult
from checker.outcomes import EXIT_CODES, SEVERITY, StepResult

SUMMARY_VERSION = 1


def failure_line(step: StepResult) -> str:
    """``LOCATION: step NAME (RULE): OUTCOME: MESSAGE [REASON]`` on one line."""
    where = f"{step.location}: " if step.location else ""
    reason = f" [{step.reason}]" if step.reason else ""
    return f"{where}step {step.name} ({step.rule}): {step.outcome}: {step.message.splitlines()[0]}{reason}"


def first_problem(result: FileResult) -> str:
    """What went wrong first, on one line ("-" for nothing)."""
    if result.error:
        return result.error.splitlines()[0]
    if result.first_failure is not None:
        return failure_line(result.first_failure)
    return "-"


def totals(batch: Batch) -> dict[str, int]:
    tally = Counter(result.verdict for result in batch.results)
    return {verdict: tally[verdict] for verdict in reversed(SEVERITY) if tally[verdict]}


def render_table(batch: Batch) -> str:
    header = ("file", "verdict", "steps", "time", "first failure")
    rows = [
        (result.path, result.verdict, str(result.steps), f"{result.seconds:.2f}s", first_problem(result))
        for result in batch.results
    ]
    widths = [max(len(row[column]) for row in [header, *rows]) for column in range(4)]

    def line(row) -> str:
        return "  ".join(
            [row[0].ljust(widths[0]), row[1].ljust(widths[1]), row[2].rjust(widths[2]), row[3].rjust(widths[3]), row[4]]
        )

    counted = ", ".join(f"{count} {verdict}" for verdict, count in totals(batch).items())
    files = len(batch.results)
    closing = (f"{files} file{'s' if files != 1 else ''}: {counted or 'none'} in {batch.seconds:.1f}s; "
               f"batch verdict {batch.verdict} (exit {EXIT_CODES[batch.verdict]})")
    return "\n".join([line(header), *(line(row) for row in rows), closing])


def _step_json(step: StepResult | None) -> dict | None:
    if step is None:
        return None
    return {
        "step": step.name,
        "outcome": step.outcome,
        "rule": step.rule,
        "reason": step.reason,
        "message": step.message,
        "location": str(step.location) if step.location else None,
        "details": list(step.details),
    }


def result_json(result: FileResult) -> dict:
    return {
        "file": result.path,
        "problem": result.problem,
        "verdict": result.verdict,
        "exit_code": result.exit_code,
        "steps": result.steps,
        "counts": dict(result.counts),
        "seconds": round(result.seconds, 3),
        "first_failure": _step_json(result.first_failure),
        "error": result.error,
        "cautions": list(result.cautions),
        "time_limit_reached": result.cut_short,
    }


def render_summary_json(batch: Batch) -> str:
    return json.dumps(
        {
            "summary_version": SUMMARY_VERSION,
            "verdict": batch.verdict,
            "exit_code": EXIT_CODES[batch.verdict],
            "files": len(batch.results),
            "totals": totals(batch),
            "seconds": round(batch.seconds, 3),
            "results": [result_json(result) for result in batch.results],
        },
        indent=2,
    )
