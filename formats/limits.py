"""Bounds on the size of what the readers accept, so that hostile or
broken input is refused early with a clear message instead of exhausting
time or memory.

Each bound is a count (never a time), an option of the command line
(``--input-limit NAME=COUNT``), and generous for what provers write: the
readers check the cheap ones before parsing (nesting depth, number of
statements) and the rest as soon as the parser reaches the place that
breaks them, so a refusal costs little more than reading up to that place.
"""

from __future__ import annotations

import re
from collections.abc import Iterator
from contextlib import contextmanager
from contextvars import ContextVar
from dataclasses import dataclass, fields


@dataclass(frozen=True, slots=True)
class InputLimits:
    depth: int = 200_000
    """brackets ``(`` and ``[`` open at once in one statement (term and formula nesting)"""
    literals: int = 1_000
    """literals in one clause"""
    name_length: int = 10_000
    """characters in one name (symbol, variable, statement name)"""
    statements: int = 100_000
    """statements in one file (a derivation's steps, a problem's formulas)"""

    def describe(self, name: str) -> str:
        """The bound and how to change it, for a refusal message."""
        return f"the limit is {getattr(self, name)}; raise it with --input-limit {name}=COUNT"


DEFAULT_INPUT_LIMITS = InputLimits()
INPUT_LIMIT_NAMES = tuple(field.name for field in fields(InputLimits))

_CURRENT: ContextVar[InputLimits] = ContextVar("input_limits", default=DEFAULT_INPUT_LIMITS)


def current_limits() -> InputLimits:
    """The bounds the readers apply now."""
    return _CURRENT.get()


@contextmanager
def bounded(limits: InputLimits) -> Iterator[None]:
    """Read with ``limits`` inside the ``with`` block (the readers' public
    functions keep their signatures; a check sets the bounds once)."""
    token = _CURRENT.set(limits)
    try:
        yield
    finally:
        _CURRENT.reset(token)


_BRACKETS = re.compile(r"""[(\[]|[)\]]|'(?:[^'\\\n]|\\.)*'?|"(?:[^"\\\n]|\\.)*"?|%[^\n]*|/\*.*?\*/""", re.DOTALL)


def too_deep_at(text: str, limit: int) -> int | None:
    """The offset of the first bracket in ``text`` that opens more than
    ``limit`` at once (quoted words and comments aside), or None.  Text
    with no more brackets than the limit is passed at the cost of a count."""
    if text.count("(") + text.count("[") <= limit:
        return None
    depth = 0
    for found in _BRACKETS.finditer(text):
        mark = found.group()
        if mark in "([":
            depth += 1
            if depth > limit:
                return found.start()
        elif mark in ")]":
            depth = max(depth - 1, 0)
    return None
