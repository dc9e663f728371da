"""Cutting a TPTP file into statements, skipping text that is not TPTP.

A derivation often arrives inside a prover's log.  The scanner finds each
annotated formula or include by its keyword (at the start of a line, or
right after a previous statement) and its end (the matching ``)`` and the
full stop), stepping over quoted words and comments.  Everything else that
is not a comment or blank is reported as a run of skipped text, so the
reader can say what it ignored.
"""

from __future__ import annotations

import re
from collections.abc import Iterator
from dataclasses import dataclass

from formats.derivation import Location, UnreadableInput
from formats.limits import current_limits

_KEYWORD = re.compile(r"(cnf|fof|tff|thf|tcf|tpi|include)[ \t\r\n\f\v]*\(")
_BLANK = re.compile(r"[ \t\r\f\v]*")
_INSIDE = re.compile(r"[()'\"%]|/\*")
_QUOTED = {
    "'": re.compile(r"(?:[^'\\\n]|\\[^\n])*'?"),
    '"': re.compile(r'(?:[^"\\\n]|\\[^\n])*"?'),
}
_GAP = re.compile(r"(?:\s+|%[^\n]*|/\*.*?\*/)*", re.DOTALL)


@dataclass(frozen=True, slots=True)
class StatementText:
    """The text of one statement, from its keyword to its full stop."""

    keyword: str
    text: str
    line: int
    column: int


@dataclass(frozen=True, slots=True)
class SkippedText:
    """A run of lines that hold text other than statements and comments."""

    line: int
    column: int
    lines: int


_EXCERPT_WIDTH = 120


def excerpt(line_text: str, column: int) -> str:
    """The offending line with a caret under ``column`` (1-based); a long
    line is cut to a window around the column, marked with ``...``."""
    line_text = line_text.rstrip("\r")
    if len(line_text) > _EXCERPT_WIDTH:
        start = max(0, min(column - 1 - _EXCERPT_WIDTH // 2, len(line_text) - _EXCERPT_WIDTH))
        shown = line_text[start : start + _EXCERPT_WIDTH]
        before, after = ("..." if start else ""), ("..." if start + _EXCERPT_WIDTH < len(line_text) else "")
        line_text, column = before + shown + after, column - start + len(before)
    pad = "".join("\t" if c == "\t" else " " for c in line_text[: column - 1])
    return f"{line_text}\n{pad}^"


class _TooDeep(Exception):
    """Brackets open past the depth limit, at ``offset``: the scan stops
    there rather than walk a hostile statement to its end."""

    def __init__(self, offset: int):
        super().__init__(offset)
        self.offset = offset


def _statement_end(text: str, position: int) -> int:
    """The offset just after the statement whose opening bracket ends just
    before ``position``; if the full stop is missing, the offset after the
    closing bracket, and if that is missing too, the end of the text (the
    parser then says what is wrong)."""
    depth, limit = 1, current_limits().depth
    while True:
        found = _INSIDE.search(text, position)
        if found is None:
            return len(text)
        mark, position = found.group(), found.end()
        if mark == "(":
            depth += 1
            if depth > limit:
                raise _TooDeep(found.start())
        elif mark == ")":
            depth -= 1
            if depth == 0:
                after = _GAP.match(text, position).end()
                return after + 1 if text.startswith(".", after) else position
        elif mark in _QUOTED:
            position = _QUOTED[mark].match(text, position).end()
        elif mark == "%":
            newline = text.find("\n", position)
            position = len(text) if newline < 0 else newline
        else:
            close = text.find("*/", position)
            position = len(text) if close < 0 else close + 2


def most_statements(text: str) -> int:
    """An upper bound on the statements :func:`scan` finds in ``text``,
    at the cost of one regular-expression pass: each opens with a keyword
    and its bracket, and no two such openings overlap."""
    return len(_KEYWORD.findall(text))


def scan(text: str, file: str) -> Iterator[StatementText | SkippedText]:
    """The statements and skipped runs of ``text``, in order."""
    position, line, line_start = 0, 1, 0
    run: tuple[int, int] | None = None  # (line, column) where skipped text began
    run_lines, last_run_line = 0, 0

    while True:
        position = _BLANK.match(text, position).end()
        if position >= len(text):
            break
        if text[position] == "\n":
            position += 1
            line, line_start = line + 1, position
            continue
        if text[position] == "%":
            newline = text.find("\n", position)
            position = len(text) if newline < 0 else newline
            continue
        if text.startswith("/*", position):
            close = text.find("*/", position + 2)
            if close < 0:
                newline = text.find("\n", position)
                column = position - line_start + 1
                raise UnreadableInput(
                    "comment is never closed (no */)",
                    Location(file, line, column),
                    excerpt(text[line_start : len(text) if newline < 0 else newline], column),
                )
            end = close + 2
        else:
            keyword = _KEYWORD.match(text, position)
            if keyword is None:
                if run is None:
                    run, run_lines = (line, position - line_start + 1), 0
                if line != last_run_line:
                    run_lines, last_run_line = run_lines + 1, line
                newline = text.find("\n", position)
                position = len(text) if newline < 0 else newline
                continue
            if run is not None:
                yield SkippedText(run[0], run[1], run_lines)
                run = None
            try:
                end = _statement_end(text, keyword.end())
            except _TooDeep as deep:
                at_line = line + text.count("\n", position, deep.offset)
                column = deep.offset - (text.rfind("\n", 0, deep.offset) + 1) + 1
                newline = text.find("\n", deep.offset)
                limits = current_limits()
                raise UnreadableInput(
                    f"brackets nested more than {limits.depth} deep; {limits.describe('depth')}",
                    Location(file, at_line, column),
                    excerpt(text[text.rfind("\n", 0, deep.offset) + 1 : len(text) if newline < 0 else newline], column),
                ) from None
            yield StatementText(
                keyword.group(1), text[position:end], line, position - line_start + 1
            )
        newlines = text.count("\n", position, end)
        if newlines:
            line, line_start = line + newlines, text.rfind("\n", position, end) + 1
        position = end

    if run is not None:
        yield SkippedText(run[0], run[1], run_lines)
