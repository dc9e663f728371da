"""One file's terms and formulas freed when its check ends, so that a
process checking many files (a batch, a worker) keeps its memory flat.

Terms and formulas are hash-consed in tables that would otherwise grow
with every file.  A check runs inside :func:`file_scope`: on leaving the
outermost scope, everything made since entering it is dropped from the
tables and from the memos that hold such objects.  Nothing from an
earlier file is ever used by a later one (a report keeps only its own
objects, for printing), so no object made before the mark meets one made
after it.  Scopes may nest or overlap (threads): only the last one out
forgets, back to the mark of the first one in.
"""

from __future__ import annotations

import threading
from collections.abc import Iterator
from contextlib import contextmanager

from checker import leaves
from checker.kernel import formulas, terms
from checker.search import models, namings, restatement
from formats import tptp

_lock = threading.Lock()
_open = 0
_marks = (0, 0)


def _forget_memos() -> None:
    """The memos outside the kernel that hold terms or formulas."""
    leaves._entailment.cache_clear()
    leaves.forget_indexed_problem()
    restatement.shape_of.cache_clear()
    namings.forget_definitions()
    models.forget_countermodels()
    tptp.forget_readings()


@contextmanager
def file_scope() -> Iterator[None]:
    """Free on exit what the tables gained inside (see the module's note)."""
    global _open, _marks
    with _lock:
        if _open == 0:
            _marks = (terms.table_size(), formulas.table_size())
        _open += 1
    try:
        yield
    finally:
        with _lock:
            _open -= 1
            if _open == 0:
                _forget_memos()
                formulas.forget_formulas_since(_marks[1])
                terms.forget_terms_since(_marks[0])
