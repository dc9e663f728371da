"""A progress line on standard error, for people watching a long run.

Shown only when the stream is a terminal and the run has gone on for more
than a second, so pipelines, logs and quick runs see nothing extra; it is
one line redrawn in place (done/total, rate, estimate of the time left)
and wiped before the report is printed.
"""

from __future__ import annotations

import shutil
import sys
import time
from collections.abc import Callable
from typing import TextIO

SHOW_AFTER = 1.0
"""seconds a run goes on before the line appears"""

REDRAW_EVERY = 0.1
"""seconds between two redraws"""

_WIPE = "\r\033[K"


def _is_terminal(stream: TextIO) -> bool:
    try:
        return stream.isatty()
    except (AttributeError, ValueError):  # no isatty, or a closed stream
        return False


def format_duration(seconds: float) -> str:
    """``7s``, ``3m05s``, ``2h10m``: short enough for a progress line."""
    whole = max(0, round(seconds))
    if whole < 60:
        return f"{whole}s"
    if whole < 3600:
        return f"{whole // 60}m{whole % 60:02d}s"
    return f"{whole // 3600}h{whole % 3600 // 60:02d}m"


class Progress:
    """Counts of things done (steps of a file, or files of a batch) drawn
    as a line on ``stream``; silent when the stream is no terminal or
    ``enabled`` is False (``--quiet``)."""

    def __init__(
        self,
        stream: TextIO | None = None,
        unit: str = "steps",
        enabled: bool = True,
        clock: Callable[[], float] = time.monotonic,
        show_after: float | None = None,
    ) -> None:
        self.stream = sys.stderr if stream is None else stream
        self.unit = unit
        self.enabled = enabled and _is_terminal(self.stream)
        self.clock = clock
        self.show_after = SHOW_AFTER if show_after is None else show_after
        self.run_started = clock()
        self.started = self.run_started
        self.label = ""
        self.total = 0
        self.done = 0
        self.drawn_at: float | None = None

    def start(self, total: int, label: str = "") -> None:
        """Begin counting ``total`` things (the next file's steps, say)."""
        self.total, self.done, self.label = total, 0, label
        self.started = self.clock()
        self.advance(0)

    def advance(self, count: int = 1) -> None:
        self.done += count
        if not self.enabled:
            return
        now = self.clock()
        if now - self.run_started < self.show_after:
            return
        if self.drawn_at is not None and now - self.drawn_at < REDRAW_EVERY and self.done < self.total:
            return
        self.drawn_at = now
        width = shutil.get_terminal_size((80, 24)).columns - 1
        self.stream.write(_WIPE + self.line(now)[:width])
        self.stream.flush()

    def line(self, now: float) -> str:
        """What the line says at time ``now``."""
        parts = [self.label] if self.label else []
        parts.append(f"{self.done}/{self.total} {self.unit}")
        if self.total:
            parts.append(f"{100 * self.done // self.total}%")
        elapsed = now - self.started
        if self.done and elapsed > 0:
            rate = self.done / elapsed
            parts.append(f"{rate:.1f} {self.unit}/s")
            parts.append(f"about {format_duration((self.total - self.done) / rate)} left")
        else:
            parts.append("estimating")
        return "  ".join(parts)

    def finish(self) -> None:
        """Wipe the line, so that what is printed next starts clean."""
        if self.drawn_at is not None:
            self.stream.write(_WIPE)
            self.stream.flush()
            self.drawn_at = None
