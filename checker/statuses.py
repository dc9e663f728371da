"""What the TPTP statuses of inference records claim (the SZS ontology).

A status says how a step's conclusion relates to its parents.  Under a
consequence status the conclusion follows from the parents; under any other
(``esa``, ``sat`` ...) the step only preserves satisfiability, as
Skolemization and definitions do.  A chain of records claims what its
weakest record claims.
"""

from __future__ import annotations

from collections.abc import Iterable

# Statuses under which the conclusion is a logical consequence of the parents.
CONSEQUENCE_STATUSES = frozenset({"thm", "cth", "tau", "eqv", "tac", "wec", "eth", "wth", "wtc", "wcs"})


def weakest_status(statuses: Iterable[str | None]) -> str:
    """The status a chain of records claims as a whole: the first one that
    is not a consequence status, else ``thm`` (an unstated status is ``thm``)."""
    for status in statuses:
        if status is not None and status not in CONSEQUENCE_STATUSES:
            return status
    return "thm"
