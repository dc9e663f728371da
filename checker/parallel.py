"""Spreading independent step checks over processes (``--jobs N``).

Steps are independent given their parents' stated formulas, so the checks
can run anywhere; only their results come back, in order.  Worker
processes are forked, so they start with the plan already built and
nothing but results crosses between processes.  Where forking is not
available the checks simply run in this process.
"""

from __future__ import annotations

import math
import multiprocessing
from collections.abc import Callable, Sequence
from typing import TypeVar

Item = TypeVar("Item")
Result = TypeVar("Result")

_task: tuple[Callable, Sequence] | None = None  # what forked workers inherit


def _run_slice(bounds: tuple[int, int]) -> list:
    function, items = _task
    start, stop = bounds
    return [function(item) for item in items[start:stop]]


def map_in_processes(
    function: Callable[[Item], Result],
    items: Sequence[Item],
    jobs: int,
    on_done: Callable[[int], None] | None = None,
) -> list[Result]:
    """``[function(item) for item in items]``, spread over ``jobs`` processes;
    ``on_done(count)`` hears, in this process, of each batch of items done."""
    if jobs <= 1 or len(items) < 2 or "fork" not in multiprocessing.get_all_start_methods():
        return [_done(function(item), on_done) for item in items]
    global _task
    _task = (function, items)
    try:
        size = max(1, math.ceil(len(items) / (jobs * 4)))
        slices = [(start, min(start + size, len(items))) for start in range(0, len(items), size)]
        with multiprocessing.get_context("fork").Pool(jobs) as pool:
            parts = [_done(part, on_done, len(part)) for part in pool.imap(_run_slice, slices)]
    finally:
        _task = None
    return [result for part in parts for result in part]


def _done(result: Result, on_done: Callable[[int], None] | None, count: int = 1) -> Result:
    if on_done is not None:
        on_done(count)
    return result
