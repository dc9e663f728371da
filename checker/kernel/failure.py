"""The value a kernel check returns when a step is wrong."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True, slots=True)
class Failure:
    """Why the kernel refused a step.

    ``reason`` is a stable code for programs (``not_complementary``,
    ``missing_from_claimed`` ...); ``message`` is the exact point of failure
    for a person: which literal, which subterm, which terms clash.
    """

    reason: str
    message: str


def describe_position(position: tuple[int, ...]) -> str:
    """A position as written in reports: ``root`` or dotted indices ``2.1``."""
    return ".".join(str(i) for i in position) if position else "root"
