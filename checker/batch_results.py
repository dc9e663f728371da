"""One file of a batch: what to check (a job) and what came of it (a
result small enough to send between processes and machines)."""

from __future__ import annotations

import time
from dataclasses import dataclass

from checker.outcomes import EXIT_CODES, Report, StepResult
from checker.run import check
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from checker.time_limit import TIME_LIMIT_REASON, Deadline


@dataclass(frozen=True, slots=True)
class FileJob:
    """A derivation to check, with its problem (None: found by the
    ``file(...)`` sources of its leaves, else none) and how long it may take
    (``time_limit`` seconds; ``limit_reached`` says which limit that is)."""

    path: str
    problem: str | None = None
    include_dirs: tuple[str, ...] = ()
    limits: SearchLimits = DEFAULT_LIMITS
    require_problem: bool = False
    time_limit: float | None = None
    limit_reached: str = ""


@dataclass(frozen=True, slots=True)
class FileResult:
    """The summary of one file's check: the verdict, how many steps, how
    long, and the first failure (or why the file could not be checked)."""

    path: str
    verdict: str
    problem: str | None = None
    steps: int = 0
    counts: tuple[tuple[str, int], ...] = ()
    seconds: float = 0.0
    first_failure: StepResult | None = None
    error: str | None = None
    cautions: tuple[str, ...] = ()
    cut_short: bool = False
    """the time limit left steps unchecked"""

    @property
    def exit_code(self) -> int:
        return EXIT_CODES[self.verdict]


def summarize(report: Report, seconds: float) -> FileResult:
    return FileResult(
        report.path, report.verdict, report.problem, len(report.steps), tuple(report.counts.items()), seconds,
        report.first_failure, report.error, report.cautions,
        any(step.reason == TIME_LIMIT_REASON for step in report.steps),
    )


def check_file(job: FileJob) -> FileResult:
    """Check one job in this process, under its time limit."""
    started = time.perf_counter()
    deadline = None if job.time_limit is None else Deadline.after(job.time_limit, job.limit_reached or None)
    report = check(job.path, job.problem, job.include_dirs, job.limits, 1, job.require_problem, deadline)
    return summarize(report, time.perf_counter() - started)
