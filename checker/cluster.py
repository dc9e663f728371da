"""Running a batch on a Dask distributed cluster (``--cluster ADDRESS``).

Each file is one task; the scheduler hands tasks to workers and, when a
worker is lost, gives its unfinished tasks to another, so every file is
still reported exactly once.  A task checks its file in a child process of
the worker (as a local batch does, ``checker.file_processes``), so the
file's time limit holds and a crash costs that file alone; a worker that
may not have children (a daemonic one, as under a nanny by default) checks
in its own thread, where the time limit is looked at between steps.  A
task that still fails (its workers kept dying) is reported as an internal
error of its file.  The workers must see the files at the same paths.

Needs the ``distributed`` package: ``pip install 'assay[cluster]'``.
"""

from __future__ import annotations

import multiprocessing
import threading
import uuid
from collections.abc import Callable, Sequence

from checker.batch_results import FileJob, FileResult, check_file
from checker.file_processes import STOP_GRACE, check_in_worker, not_started, within_run
from checker.outcomes import INTERNAL_ERROR, UNDECIDED
from checker.time_limit import Deadline

CONNECT_SECONDS = 30


class ClusterUnavailable(Exception):
    """The cluster cannot be used: no ``distributed`` package, or no
    scheduler at the address."""


_children = threading.local()  # per worker thread: the child process it checks files in


def check_in_child(job: FileJob) -> FileResult:
    """A cluster task: one file, in a child process of this worker thread
    (kept for the next file) where the worker may have one."""
    if multiprocessing.current_process().daemon:
        return check_file(job)
    context = multiprocessing.get_context("forkserver")  # a clean process to fork from, not this threaded one
    context.set_forkserver_preload(["checker.batch_results"])
    result, _children.worker = check_in_worker(getattr(_children, "worker", None), job, context)
    return result


def _lost(job: FileJob, error: BaseException) -> FileResult:
    return FileResult(job.path, INTERNAL_ERROR, problem=job.problem,
                      error=f"the cluster could not check this file ({type(error).__name__}: {error}); "
                      "nothing was accepted")


def _unfinished(job: FileJob, deadline: Deadline) -> FileResult:
    return FileResult(job.path, UNDECIDED, problem=job.problem,
                      error=f"not checked: {deadline.describe()} before the cluster finished this file")


def check_on_cluster(
    address: str,
    jobs: Sequence[FileJob],
    deadline: Deadline | None = None,
    on_result: Callable[[FileResult], None] | None = None,
) -> list[FileResult]:
    """Each job's result, in the order of ``jobs``, checked by the Dask
    cluster whose scheduler is at ``address``."""
    try:
        from distributed import Client, as_completed
    except ImportError:
        raise ClusterUnavailable(
            "--cluster needs the distributed package: pip install 'assay[cluster]'"
        ) from None
    try:
        client = Client(address, timeout=CONNECT_SECONDS)
    except OSError as error:
        raise ClusterUnavailable(f"no Dask scheduler reached at {address}: {error}") from None
    results: list[FileResult | None] = [None] * len(jobs)

    def finish(index: int, result: FileResult) -> None:
        results[index] = result
        if on_result is not None:
            on_result(result)

    with client:
        batch = uuid.uuid4().hex
        index_of = {}
        for index, job in enumerate(jobs):
            if deadline is not None and deadline.expired():
                finish(index, not_started(job, deadline))
                continue
            future = client.submit(check_in_child, within_run(job, deadline), key=f"assay-{batch}-{index}",
                                   pure=False)
            index_of[future] = index
        timeout = None if deadline is None else max(deadline.remaining(), 0) + STOP_GRACE
        pending = set(index_of)
        try:
            for future in as_completed(index_of, timeout=timeout):
                pending.discard(future)
                index = index_of[future]
                try:
                    finish(index, future.result())
                except Exception as error:  # noqa: BLE001 - a lost task is that file's internal error
                    finish(index, _lost(jobs[index], error))
        except TimeoutError:
            for future in pending:
                future.cancel()
                finish(index_of[future], _unfinished(jobs[index_of[future]], deadline))
    return results
