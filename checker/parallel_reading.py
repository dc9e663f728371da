"""Reading one large file in parts, side by side (``--jobs N``).

Parsing a statement costs a few hundred microseconds, so on a large
certificate reading is most of a check whose steps are otherwise spread
over processes.  A file is cut at statement boundaries into one part per
job, each part's text standing at the very lines and columns it has in
the file (what lies before it is blanked to newlines and spaces, comments
are dropped).  This process reads the first part while forked processes
read the others and send back their statements.  Each part goes through
the ordinary reader, so the statements are the ones it makes.

Only files whose statements are independent of each other are cut: native
certificates, and TPTP files of cnf and fof statements with no include
and no skipped text.  A part that does not read, or whose statements do
not stand where the cut put them, sends the whole file back to the
ordinary reader, which then says what it has to say in its own words.
"""

from __future__ import annotations

import multiprocessing
from collections.abc import Sequence
from dataclasses import replace

from formats.derivation import Document, UnreadableInput
from formats.limits import current_limits
from formats.native import parse_native
from formats.tptp import parse_tptp
from formats.tptp_scan import StatementText, scan

PARTS_FROM = 2000
"""statements a file must have before it is read in parts (fewer: a fork costs more than it saves)"""

SENDING_BACK = 0.15
"""what sending a part's statements back costs, as a share of reading them"""

INDEPENDENT_KEYWORDS = ("cnf", "fof")

_Part = tuple[str, tuple[tuple[int, int], ...] | None]
"""the text of one part, and where its statements must start (TPTP)"""

_parts: tuple[str, str, Sequence[str], list[_Part]] | None = None  # what forked readers inherit


def read_in_parts(path: str, native: bool, include_dirs: Sequence[str], jobs: int) -> Document | None:
    """The file's document read in ``jobs`` parts, or None when it is not
    worth cutting or cannot be cut (then read it as usual)."""
    if jobs <= 1 or "fork" not in multiprocessing.get_all_start_methods():
        return None
    try:
        text = _text_as_read(path, native)
    except (OSError, UnicodeDecodeError):
        return None
    try:
        parts = _native_parts(text, jobs) if native else _tptp_parts(text, path, jobs)
    except UnreadableInput:
        return None
    if parts is None or len(parts) < 2:
        return None
    global _parts
    _parts = ("native" if native else "tptp", path, include_dirs, parts)
    try:
        with multiprocessing.get_context("fork").Pool(len(parts) - 1) as pool:
            others = pool.map_async(_read_part, range(1, len(parts)))
            read = [_read_part(0), *others.get()]
    finally:
        _parts = None
    if any(part is None for part in read):
        return None
    first = read[0]
    return replace(first, statements=tuple(s for part in read for s in part.statements),
                   notices=tuple(n for part in read for n in part.notices))


def _text_as_read(path: str, native: bool) -> str:
    """The file's text as its reader takes it: a native certificate's bytes
    decoded (a carriage return stays, and the reader strips it from each
    line); a TPTP file with its line ends made newlines."""
    if native:
        with open(path, "rb") as handle:
            return handle.read().decode("utf-8-sig")
    with open(path, encoding="utf-8-sig") as handle:
        return handle.read()


def _read_part(index: int) -> Document | None:
    kind, path, include_dirs, parts = _parts
    text, starts = parts[index]
    try:
        document = parse_native(text, path) if kind == "native" else parse_tptp(text, path, include_dirs)
    except Exception:  # noqa: BLE001 - the ordinary reader reads the file again and reports it
        return None
    if starts is not None and tuple((s.location.line, s.location.column) for s in document.statements) != starts:
        return None
    return document


def _balanced_cuts(sizes: list[int], jobs: int) -> list[int]:
    """Indices that cut ``sizes`` into ``jobs`` runs of about equal cost:
    the first run, read here, is the larger by what the others cost to
    send back (about a seventh of reading them, measured on generated
    certificates)."""
    shares = [1 + SENDING_BACK, *([1.0] * (jobs - 1))]
    total, goal, cuts, running = sum(sizes), 0.0, [], 0
    for index, size in enumerate(sizes):
        if len(cuts) < jobs - 1 and running >= total * (goal + shares[len(cuts)]) / sum(shares):
            goal += shares[len(cuts)]
            cuts.append(index)
        running += size
    return cuts


def _native_parts(text: str, jobs: int) -> list[_Part] | None:
    """A native certificate by lines: the header, then each part's records
    after as many empty lines as stand before them in the file."""
    lines = text.split("\n")
    records = [number for number, line in enumerate(lines) if line.strip()]
    if len(records) - 1 < PARTS_FROM or len(records) - 1 > current_limits().statements:
        return None
    header = records[0]
    body = records[1:]
    cuts = [body[i] for i in _balanced_cuts([len(lines[n]) for n in body], jobs)]
    bounds = list(zip([header + 1, *cuts], [*cuts, len(lines)]))
    head = "\n".join(lines[: header + 1])
    return [(head + "\n" * (start - header) + "\n".join(lines[start:stop]), None) for start, stop in bounds]


def _tptp_parts(text: str, path: str, jobs: int) -> list[_Part] | None:
    """A TPTP file by statements, each set at its line and column."""
    chunks = list(scan(text, path))
    if len(chunks) < PARTS_FROM or len(chunks) > current_limits().statements:
        return None
    if not all(isinstance(c, StatementText) and c.keyword in INDEPENDENT_KEYWORDS for c in chunks):
        return None
    cuts = _balanced_cuts([len(c.text) for c in chunks], jobs)
    parts = []
    for start, stop in zip([0, *cuts], [*cuts, len(chunks)]):
        part = _placed(chunks[start:stop])
        if part is None:
            return None
        parts.append(part)
    return parts


def _placed(chunks: list[StatementText]) -> _Part | None:
    """The statements' texts with blanks before each, so that each starts
    at its own line and column."""
    pieces, line, column = [], 1, 1
    for chunk in chunks:
        if chunk.line > line:
            pieces.append("\n" * (chunk.line - line))
            line, column = chunk.line, 1
        if chunk.line < line or chunk.column < column:
            return None
        pieces.append(" " * (chunk.column - column))
        pieces.append(chunk.text)
        newlines = chunk.text.count("\n")
        if newlines:
            line, column = line + newlines, len(chunk.text) - chunk.text.rfind("\n")
        else:
            column = chunk.column + len(chunk.text)
    return "".join(pieces), tuple((c.line, c.column) for c in chunks)
