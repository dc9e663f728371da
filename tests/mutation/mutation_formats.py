"""How the mutation harness edits one certificate format: a plug-in per format.

A format plug-in cuts a certificate's text into :class:`Record` s (one per
statement, with the statement as assay's reader read it) and writes a
record back with a changed name, content, parents or evidence.  The
mutation kinds (mutation_kinds.py) only ever talk to this interface, so a
new certificate format (a new native version) is one more plug-in class
registered in ``FORMATS``.
"""

from __future__ import annotations

import json
import re
from dataclasses import dataclass, replace

from checker.kernel.clauses import Clause
from checker.kernel.formulas import render_formula
from checker.run import read_document
from formats.derivation import Inference, Origin, Statement
from formats.tptp_scan import StatementText, scan


@dataclass(frozen=True, slots=True)
class Record:
    """One statement of a certificate: where its text is, and what it says.

    ``fields`` are the format's own parts of the record (for TPTP: name,
    role, formula text, annotations; for the native format: the decoded
    JSON object), so that a mutation changes only what it means to."""

    statement: Statement
    start: int
    end: int
    fields: object


def render_content(content) -> str:
    """A clause or formula in the standard's syntax (cnf/fof bodies)."""
    return str(content) if isinstance(content, Clause) else render_formula(content)


def _split_top_level(text: str, separator: str = ",") -> list[str]:
    """``text`` cut at the separators outside brackets and quotes."""
    parts, depth, quote, start, i = [], 0, None, 0, 0
    while i < len(text):
        c = text[i]
        if quote:
            if c == "\\":
                i += 1
            elif c == quote:
                quote = None
        elif c in "'\"":
            quote = c
        elif c in "([":
            depth += 1
        elif c in ")]":
            depth -= 1
        elif c == separator and depth == 0:
            parts.append(text[start:i])
            start = i + 1
        i += 1
    parts.append(text[start:])
    return parts


class TptpFormat:
    """TPTP derivations (cnf, fof, tff, thf): a record is an annotated formula."""

    name = "tptp"
    suffix = ".p"

    def records(self, text: str, path: str) -> list[Record]:
        document = read_document(path)
        by_line = {(s.location.line, s.location.column): s for s in document.statements if s.location.file == path}
        line_starts = [0] + [m.end() for m in re.finditer("\n", text)]
        found = []
        for chunk in scan(text, path):
            if not isinstance(chunk, StatementText) or chunk.keyword == "include":
                continue
            statement = by_line.get((chunk.line, chunk.column))
            if statement is None:
                continue
            start = line_starts[chunk.line - 1] + chunk.column - 1
            inner = chunk.text[chunk.text.index("(") + 1 : chunk.text.rindex(")")]
            fields = [part.strip() for part in _split_top_level(inner)]
            found.append(Record(statement, start, start + len(chunk.text), (chunk.keyword, fields)))
        return found

    def write(self, record: Record, name: str | None = None, content=None, formula_text: str | None = None,
              annotations: str | None = None) -> str:
        keyword, fields = record.fields
        fields = list(fields)
        if name is not None:
            fields[0] = name
        if content is not None:
            fields[2] = render_content(content)
        if formula_text is not None:
            fields[2] = formula_text
        if annotations is not None:
            fields[3:] = [annotations]
        return f"{keyword}({', '.join(fields)})."

    def formula_text(self, record: Record) -> str:
        return record.fields[1][2]

    def annotations(self, record: Record) -> str:
        return ", ".join(record.fields[1][3:])

    def with_parent_renamed(self, record: Record, old: str, new: str) -> str | None:
        """The record with its last citation of parent ``old`` made ``new``."""
        annotations = self.annotations(record)
        hits = list(re.finditer(rf"(?<![\w'$]){re.escape(old)}(?![\w'])", annotations))
        if not hits:
            return None
        hit = hits[-1]
        return self.write(record, annotations=annotations[: hit.start()] + new + annotations[hit.end() :])

    def with_parent_dropped(self, record: Record, old: str) -> str | None:
        annotations = self.annotations(record)
        for pattern in (rf",\s*{re.escape(old)}(?=\s*\])", rf"(?<=\[){re.escape(old)}\s*,\s*"):
            changed, count = re.subn(pattern, "", annotations, count=1)
            if count:
                return self.write(record, annotations=changed)
        return None

    def with_binding_changed(self, record: Record, replacement: str) -> list[str]:
        """The record with one stated binding's term made ``replacement``, for each binding."""
        annotations = self.annotations(record)
        found = []
        for hit in re.finditer(r"bind\(\s*[A-Z]\w*\s*,\s*", annotations):
            depth, i = 0, hit.end()
            while i < len(annotations) and not (depth == 0 and annotations[i] == ")"):
                depth += annotations[i] == "("
                depth -= annotations[i] == ")"
                i += 1
            term = annotations[hit.end() : i]
            wrapped = f"$fot({replacement})" if term.startswith("$fot(") else replacement
            if term != wrapped:
                found.append(self.write(record, annotations=annotations[: hit.end()] + wrapped + annotations[i:]))
        return found

    def leaf(self, name: str, role: str, content, problem_file: str, language: str = "cnf") -> str:
        return f"{language}({name}, {role}, {render_content(content)}, file('{problem_file}', {name}))."

    def step(self, name: str, content, parents: list[str], language: str = "cnf") -> str:
        return f"{language}({name}, plain, {render_content(content)}, inference(resolution, [status(thm)], [{', '.join(parents)}]))."

    def with_rule(self, record: Record, old: str, new: str) -> str | None:
        annotations = self.annotations(record)
        if f"inference({old}" not in annotations.replace(" ", ""):
            return None
        return self.write(record, annotations=re.sub(rf"inference\(\s*{re.escape(old)}", f"inference({new}", annotations, 1))

    def separator(self) -> str:
        return "\n"


class NativeFormat:
    """Native certificates, version 1: a record is one JSON line."""

    name = "native"
    suffix = ".jsonl"

    def records(self, text: str, path: str) -> list[Record]:
        document = read_document(path)
        by_line = {s.location.line: s for s in document.statements}
        found, offset = [], 0
        for number, line in enumerate(text.splitlines(keepends=True), start=1):
            if number in by_line:
                found.append(Record(by_line[number], offset, offset + len(line.rstrip("\n")), json.loads(line)))
            offset += len(line)
        return found

    def write(self, record: Record, name: str | None = None, content=None, formula_text: str | None = None,
              value: dict | None = None) -> str:
        value = dict(record.fields if value is None else value)
        if name is not None:
            value["name"] = name
        if content is not None:
            value["formula"] = render_content(content)
        if formula_text is not None:
            value["formula"] = formula_text
        return json.dumps(value)

    def formula_text(self, record: Record) -> str:
        return record.fields["formula"]

    def with_parent_renamed(self, record: Record, old: str, new: str) -> str | None:
        inference = record.fields.get("inference")
        if not inference or old not in inference["parents"]:
            return None
        parents = [new if p == old else p for p in inference["parents"]]
        return self.write(record, value={**record.fields, "inference": {**inference, "parents": parents}})

    def with_parent_dropped(self, record: Record, old: str) -> str | None:
        inference = record.fields.get("inference")
        if not inference or old not in inference["parents"] or len(inference["parents"]) < 2:
            return None
        parents = [p for p in inference["parents"] if p != old]
        return self.write(record, value={**record.fields, "inference": {**inference, "parents": parents}})

    def with_binding_changed(self, record: Record, replacement: str) -> list[str]:
        """The record with one substitution value made ``replacement``, for each one stated."""
        inference = record.fields.get("inference") or {}
        found = []
        for field, substitution in inference.items():
            if not isinstance(substitution, dict):
                continue
            for variable, term in substitution.items():
                if term != replacement:
                    changed = {**inference, field: {**substitution, variable: replacement}}
                    found.append(self.write(record, value={**record.fields, "inference": changed}))
        return found

    def with_index_changed(self, record: Record) -> list[str]:
        """The record with one literal or premise index moved by one."""
        inference = record.fields.get("inference") or {}
        found = []
        for field, index in inference.items():
            if isinstance(index, int) and not isinstance(index, bool):
                for other in (index + 1, index - 1):
                    if other >= 0:
                        found.append(self.write(record, value={**record.fields, "inference": {**inference, field: other}}))
        return found

    def leaf(self, name: str, role: str, content, problem_file: str, language: str = "cnf") -> str:
        return json.dumps({"name": name, "role": role, "language": language, "formula": render_content(content),
                           "origin": {"kind": "file", "detail": [problem_file, name]}})

    def step(self, name: str, content, parents: list[str], language: str = "cnf") -> str:
        return json.dumps({"name": name, "role": "plain", "language": language, "formula": render_content(content),
                           "inference": {"rule": "inference", "parents": parents, "status": "thm"}})

    def with_rule(self, record: Record, old: str, new: str) -> str | None:
        return None

    def separator(self) -> str:
        return "\n"


FORMATS = {"tptp": TptpFormat(), "native": NativeFormat()}


def is_leaf(statement: Statement) -> bool:
    return not isinstance(statement.source, Inference)


def parent_names(statement: Statement) -> list[str]:
    """The named parents of a step, nested records' included, in order."""
    names, stack = [], [statement.source] if isinstance(statement.source, Inference) else []
    while stack:
        inference = stack.pop(0)
        for parent in inference.parents:
            if isinstance(parent, Inference):
                stack.append(parent)
            elif parent.name not in names:
                names.append(parent.name)
    return names


def origin_file(statement: Statement) -> str | None:
    source = statement.source
    if isinstance(source, Origin) and source.kind == "file" and source.detail:
        return source.detail[0]
    return None


def renamed(statement: Statement, name: str) -> Statement:
    return replace(statement, name=name)
