"""The value a kernel check returns when a step is wrong."""

from __future__ import annotations

from dataclasses import dataclass

SHOWN_CHARACTERS = 200
"""Longer terms and clauses are abbreviated in messages (head … tail)."""


@dataclass(frozen=True, slots=True)
class Failure:
    """Why the kernel refused a step.

    ``reason`` is a stable code for programs (``atoms_differ``,
    ``missing_from_claimed`` ...); ``message`` is the exact point of failure
    for a person: which literal, which subterm, which terms clash.
    """

    reason: str
    message: str


def _abbreviated(text: str) -> str:
    head = SHOWN_CHARACTERS * 3 // 4
    return f"{text[:head]} … {text[head - SHOWN_CHARACTERS:]}"


def quote(thing: object) -> str:
    """``thing`` as text in backticks, abbreviated when very long (prover
    terms can be megabytes) so that a message stays readable."""
    text = str(thing)
    if len(text) > SHOWN_CHARACTERS:
        return f"`{_abbreviated(text)}` ({len(text)} characters)"
    return f"`{text}`"


def describe_position(position: tuple[int, ...]) -> str:
    """A position as written in reports: ``root`` or dotted indices ``2.1``,
    abbreviated when very deep."""
    if not position:
        return "root"
    text = ".".join(str(i) for i in position)
    if len(text) > SHOWN_CHARACTERS:
        return f"{_abbreviated(text)} (depth {len(position)})"
    return text
