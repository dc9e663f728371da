"""Worker processes for a batch: a crash, a hang or a memory blow-up of one
check costs that file alone.

Files are handed out one at a time to at most ``workers`` child processes.
A child checks its file under the file's time limit (steps not reached are
left unchecked, see ``checker.time_limit``) and sends back a
:class:`~checker.batch_results.FileResult`.  A child that dies without one
is reported as an internal error of that file; one that overruns its limit
by more than a grace period (stuck outside the interruptible steps) is
stopped and its file reported ``undecided``; in both cases a new child
takes the next file.  A child is also retired after a file cut short by
its time limit and after ``FILES_PER_WORKER`` files, so that memory stays
bounded over a long batch and no check starts in a process whose step was
interrupted half way.
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

FILES_PER_WORKER = 50
"""files one child checks before a fresh one takes over"""


def default_context():
    """Forked children start with everything imported; elsewhere, spawned."""
    method = "fork" if "fork" in multiprocessing.get_all_start_methods() else "spawn"
    return multiprocessing.get_context(method)


def _serve(connection: Connection, check_one: Callable[[FileJob], FileResult]) -> None:
    """A child's life: check each job it is sent until told to stop (None,
    or the parent gone)."""
    while True:
        try:
            job = connection.recv()
        except EOFError:
            return
        if job is None:
            return
        try:
            result = check_one(job)
        except BaseException as error:  # noqa: BLE001 - reported for this file, never a verdict
            result = FileResult(job.path, INTERNAL_ERROR, problem=job.problem, error=describe_internal_error(error))
        connection.send(result)


@dataclass(slots=True)
class Worker:
    """A child process that checks the files it is given, one at a time."""

    process: multiprocessing.process.BaseProcess
    connection: Connection
    files: int = 0
    index: int = -1
    job: FileJob | None = None
    started: float = 0.0

    @classmethod
    def hire(cls, context, check_one: Callable[[FileJob], FileResult]) -> Worker:
        ours, theirs = context.Pipe()
        process = context.Process(target=_serve, args=(theirs, check_one), daemon=True)
        process.start()
        theirs.close()
        return cls(process, ours)

    def give(self, index: int, job: FileJob) -> None:
        self.index, self.job, self.started, self.files = index, job, time.monotonic(), self.files + 1
        self.connection.send(job)

    def stop_at(self) -> float:
        limit = self.job.time_limit
        return float("inf") if limit is None else self.started + limit + STOP_GRACE

    def elapsed(self) -> float:
        return time.monotonic() - self.started

    def end(self, kill: bool) -> None:
        if kill:
            self.process.kill()
        else:
            try:
                self.connection.send(None)
            except OSError:
                self.process.kill()
        self.process.join()
        self.connection.close()


def _ended_without_report(worker: Worker) -> FileResult:
    worker.process.join()
    code = worker.process.exitcode
    how = f"killed by {signal.Signals(-code).name}" if code is not None and code < 0 else f"exit code {code}"
    return FileResult(
        worker.job.path, INTERNAL_ERROR, problem=worker.job.problem, seconds=worker.elapsed(),
        error=f"the process checking this file ended ({how}) without a report; nothing was accepted",
    )


def _stopped(worker: Worker) -> FileResult:
    return FileResult(
        worker.job.path, UNDECIDED, problem=worker.job.problem, seconds=worker.elapsed(),
        error=f"not checked: no report {format_seconds(STOP_GRACE)} after {worker.job.limit_reached}; "
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


def _collect(worker: Worker) -> tuple[FileResult, bool]:
    """The result the worker sent, and whether it may take another file
    (else it has been ended)."""
    try:
        result = worker.connection.recv()
    except Exception:  # noqa: BLE001 - EOF or a half-sent report: the child died
        result = _ended_without_report(worker)
        worker.end(kill=True)
        return result, False
    if worker.files >= FILES_PER_WORKER or result.cut_short:
        worker.end(kill=False)
        return result, False
    return result, True


def check_in_worker(worker: Worker | None, job: FileJob, context) -> tuple[FileResult, Worker | None]:
    """One job checked in ``worker`` (a new one if None), and the worker
    to give the next job to (None: it was ended)."""
    worker = worker or Worker.hire(context, check_file)
    worker.give(0, job)
    stop_at = worker.stop_at()
    if not wait([worker.connection], None if stop_at == float("inf") else max(0.0, stop_at - time.monotonic())):
        worker.end(kill=True)
        return _stopped(worker), None
    result, kept = _collect(worker)
    return result, worker if kept else None


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
    idle: list[Worker] = []
    busy: dict[Connection, Worker] = {}

    def finish(index: int, result: FileResult) -> None:
        results[index] = result
        if on_result is not None:
            on_result(result)

    try:
        while waiting or busy:
            while waiting and len(busy) < workers:
                index, job = waiting.pop()
                if deadline is not None and deadline.expired():
                    finish(index, not_started(job, deadline))
                    continue
                worker = idle.pop() if idle else Worker.hire(context, check_one)
                worker.give(index, within_run(job, deadline))
                busy[worker.connection] = worker
            if not busy:
                continue
            next_stop = min(worker.stop_at() for worker in busy.values())
            timeout = None if next_stop == float("inf") else max(0.0, next_stop - time.monotonic())
            for connection in wait(list(busy), timeout):
                worker = busy.pop(connection)
                result, kept = _collect(worker)
                finish(worker.index, result)
                if kept:
                    idle.append(worker)
            now = time.monotonic()
            for connection, worker in list(busy.items()):
                if now >= worker.stop_at():
                    del busy[connection]
                    worker.end(kill=True)
                    finish(worker.index, _stopped(worker))
    finally:
        for worker in idle:
            worker.end(kill=False)
        for worker in busy.values():
            worker.end(kill=True)
    return results
