"""A whole run's time limit (``--time-limit``): steps not checked in time
are left unchecked and listed, and the report is still written.

Search is bounded by counts so that verdicts are reproducible; a time
limit is for pipelines that must finish.  It never changes what a checked
step means: a step the limit interrupts, and every step after it, ends
``unproven`` with the reason ``time_limit``, so a run cut short is at best
``undecided``, never ``accepted``.

A step is interrupted by a timer signal where this process can take one
(its main thread, on a system with interval timers); elsewhere the limit is
looked at between steps only.
"""

from __future__ import annotations

import signal
import threading
import time
from collections.abc import Callable
from dataclasses import dataclass
from typing import TypeVar

Result = TypeVar("Result")

TIME_LIMIT_REASON = "time_limit"


@dataclass(frozen=True, slots=True)
class Deadline:
    """When a run must stop checking: at ``ends_at`` on this machine's
    monotonic clock (shared by forked processes); ``reached`` says so in
    the words of the limit the user gave."""

    ends_at: float
    reached: str

    @classmethod
    def after(cls, seconds: float, reached: str | None = None) -> Deadline:
        return cls(time.monotonic() + seconds, reached or f"the time limit of {format_seconds(seconds)} was reached")

    def remaining(self) -> float:
        return self.ends_at - time.monotonic()

    def expired(self) -> bool:
        return self.remaining() <= 0

    def describe(self) -> str:
        return self.reached


def format_seconds(seconds: float) -> str:
    """``2 s``, ``0.5 s``: as a person would write the limit they gave."""
    return f"{seconds:g} s"


class _TimeLimitReached(BaseException):
    """Raised by the timer inside a step; a BaseException so that the
    checker's own ``except Exception`` (internal errors) never takes it."""


class _Alarm:
    """Whether the timer may interrupt: only while a step is running."""

    armed = False

    @classmethod
    def ring(cls, _signum, _frame) -> None:
        if cls.armed:
            cls.armed = False
            raise _TimeLimitReached


def _can_interrupt() -> bool:
    return hasattr(signal, "setitimer") and threading.current_thread() is threading.main_thread()


def run_before(deadline: Deadline, function: Callable[..., Result], *arguments) -> Result | None:
    """``function(*arguments)``, or None when the deadline passed before or
    while it ran."""
    remaining = deadline.remaining()
    if remaining <= 0:
        return None
    if not _can_interrupt():
        return function(*arguments)
    previous = signal.signal(signal.SIGALRM, _Alarm.ring)
    signal.setitimer(signal.ITIMER_REAL, max(remaining, 1e-6))
    try:
        try:
            _Alarm.armed = True
            return function(*arguments)
        finally:
            _Alarm.armed = False
    except _TimeLimitReached:
        # Also where the timer rang just as the step ended: the step then
        # counts as unchecked, which never claims more than was shown.
        return None
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, previous)
