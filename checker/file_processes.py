"""One process per file: a crash, a hang or a memory blow-up of one check
costs that file alone.

Each file of a batch is checked in a child process of its own, at most
``workers`` at a time.  The child checks under the file's time limit (steps
not reached are left unchecked, see ``checker.time_limit``) and sends back
a :class:`~checker.batch_results.FileResult`; a child that dies without one
is reported as an internal error of that file, and one that overruns its
limit by more than a grace period (stuck outside the interruptible steps)
is stopped and its file reported ``undecided``.  A fresh process per file
also keeps the memory of a long batch flat.
"""

from __future__ import annotations

import multiprocessing
import signal
import time
from collections.abc import Callable, Sequence
from dataclasses import dataclass, replace
from multiprocessing.connection import Connection, wait

from checker.batch_results import FileJob, FileResult, check_file
from checker.outcomes import INTERNAL_ERROR, UNDECIDED
from checker.run import describe_internal_error
from checker.time_limit import Deadline, format_seconds

STOP_GRACE = 5.0
"""seconds a child may overrun its time limit before it is stopped"""


def default_context():
    """Forked children start with everything imported; elsewhere, spawned."""
    method = "fork" if "fork" in multiprocessing.get_all_start_methods() else "spawn"
    return multiprocessing.get_context(method)


def _child(sender: Connection, check_one: Callable[[FileJob], FileResult], job: FileJob) -> None:
    try:
        result = check_one(job)
    except BaseException as error:  # noqa: BLE001 - reported for this file, never a verdict
        result = FileResult(job.path, INTERNAL_ERROR, problem=job.problem, error=describe_internal_error(error))
    sender.send(result)
    sender.close()


@dataclass(slots=True)
class _Running:
    index: int
    job: FileJob
    process: multiprocessing.process.BaseProcess
    started: float

    def stop_at(self) -> float:
        limit = self.job.time_limit
        return float("inf") if limit is None else self.started + limit + STOP_GRACE

    def elapsed(self) -> float:
        return time.monotonic() - self.started


def _ended_without_report(running: _Running) -> FileResult:
    code = running.process.exitcode
    if code is not None and code < 0:
        how = f"killed by {signal.Signals(-code).name}"
    else:
        how = f"exit code {code}"
    return FileResult(
        running.job.path, INTERNAL_ERROR, problem=running.job.problem, seconds=running.elapsed(),
        error=f"the process checking this file ended ({how}) without a report; nothing was accepted",
    )


def _stopped(running: _Running) -> FileResult:
    return FileResult(
        running.job.path, UNDECIDED, problem=running.job.problem, seconds=running.elapsed(),
        error=f"not checked: no report {format_seconds(STOP_GRACE)} after {running.job.limit_reached}; "
        "the process checking this file was stopped",
    )


def not_started(job: FileJob, deadline: Deadline) -> FileResult:
    return FileResult(job.path, UNDECIDED, problem=job.problem,
                      error=f"not checked: {deadline.describe()} before this file was started")


def within_run(job: FileJob, deadline: Deadline | None) -> FileJob:
    """The job with its time limit cut to what is left of the run's."""
    if deadline is None:
        return job
    left = max(deadline.remaining(), 0.001)
    if job.time_limit is not None and job.time_limit <= left:
        return job
    return replace(job, time_limit=left, limit_reached=deadline.describe())


def check_in_processes(
    jobs: Sequence[FileJob],
    workers: int,
    check_one: Callable[[FileJob], FileResult] = check_file,
    context=None,
    deadline: Deadline | None = None,
    on_result: Callable[[FileResult], None] | None = None,
) -> list[FileResult]:
    """Each job's result, in the order of ``jobs``, checked in child
    processes, ``workers`` at a time; files not started before the
    ``deadline`` are ``undecided``."""
    context = context or default_context()
    results: list[FileResult | None] = [None] * len(jobs)
    waiting = list(enumerate(jobs))[::-1]
    running: dict[Connection, _Running] = {}

    def finish(index: int, result: FileResult) -> None:
        results[index] = result
        if on_result is not None:
            on_result(result)

    try:
        while waiting or running:
            while waiting and len(running) < workers:
                index, job = waiting.pop()
                if deadline is not None and deadline.expired():
                    finish(index, not_started(job, deadline))
                    continue
                job = within_run(job, deadline)
                receiver, sender = context.Pipe(duplex=False)
                process = context.Process(target=_child, args=(sender, check_one, job), daemon=True)
                process.start()
                sender.close()
                running[receiver] = _Running(index, job, process, time.monotonic())
            if not running:
                continue
            next_stop = min(entry.stop_at() for entry in running.values())
            timeout = None if next_stop == float("inf") else max(0.0, next_stop - time.monotonic())
            for receiver in wait(list(running), timeout):
                entry = running.pop(receiver)
                try:
                    result = receiver.recv()
                except Exception:  # noqa: BLE001 - EOF or a half-sent report: the child died
                    entry.process.join()
                    result = _ended_without_report(entry)
                receiver.close()
                entry.process.join()
                finish(entry.index, result)
            now = time.monotonic()
            for receiver, entry in list(running.items()):
                if now >= entry.stop_at():
                    del running[receiver]
                    entry.process.kill()
                    entry.process.join()
                    receiver.close()
                    finish(entry.index, _stopped(entry))
    finally:
        for entry in running.values():
            entry.process.kill()
            entry.process.join()
    return results
