"""Python's cycle collector kept off the derivation while a file is checked.

Reading and planning make hundreds of thousands of objects (terms,
formulas, statements, steps) that live as long as the check and hold no
reference cycles.  Left to itself, the collector walks all of them again
at every full collection, and the number of full collections grows with
the size of the file: on 10^4 steps that was an eighth of the check.  So
the collector is paused while the derivation is read and planned, and
what was made is then set aside (``gc.freeze``) so later collections,
during the step checks, look only at what those make.  Forked workers
also leave the set-aside objects' pages unwritten, so they stay shared.
Objects set aside are still freed as usual when no longer referenced;
they rejoin the collector's view when the check ends.
"""

from __future__ import annotations

import gc
from collections.abc import Iterator
from contextlib import contextmanager

_resume = True  # whether the collector ran before the pause (overlapping checks in threads: the last to enter)


@contextmanager
def collector_paused_while_reading() -> Iterator[None]:
    """Pause the collector until :func:`derivation_read` (or the end);
    afterwards, return what was set aside to the collector's view.  A
    collector the caller had turned off stays off."""
    global _resume
    was_enabled = _resume = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        gc.unfreeze()
        if was_enabled:
            gc.enable()


def derivation_read() -> None:
    """Set aside everything made so far and let the collector run again
    (unless the caller had turned it off)."""
    gc.freeze()
    if _resume:
        gc.enable()
