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


class NativeV2Format(NativeFormat):
    """Native certificates, version 2 (formats/native_certificate_v2.md): a
    record is one JSON line that may carry findings, the evidence found when
    the derivation was elaborated.  Besides the records, the findings are
    mutated: each such mutant keeps every claim and makes one piece of
    evidence wrong, so it must fail at the statement that carries it."""

    name = "native_v2"

    def used_findings(self, path: str, problem: str | None) -> dict[str, set[str]]:
        """Statement name → the keys of its findings that checking the valid
        certificate asks for.  A finding no question asks for (a nested
        record may carry its outer step's findings beside its own inline
        evidence) is not evidence of anything: making it wrong changes nothing."""
        from checker import certified_steps, run

        used: dict[str, set[str]] = {}
        replayers: list = []
        original_check, original_replayer = run.checked_with_findings, certified_steps.Replayer

        class Watched(original_replayer):
            def __init__(self, *args, **kwargs):
                super().__init__(*args, **kwargs)
                replayers.append(self)

        def watched(step, statement, *rest):
            replayers.clear()
            results = original_check(step, statement, *rest)
            used.setdefault(step.name, set()).update(*(r.used for r in replayers))
            return results

        run.checked_with_findings, certified_steps.Replayer = watched, Watched
        try:
            run.check(path, problem=problem)
        finally:
            run.checked_with_findings, certified_steps.Replayer = original_check, original_replayer
        return used

    def finding_mutations(self, record: Record, constants: list[str], used: set[str]) -> list[tuple[str, str]]:
        """(kind, the record with one used finding made wrong), for each finding
        of the record that its check asks for (and each leaf's problem link)."""
        findings = record.fields.get("findings") or []
        found = []

        def with_finding(index: int, finding: dict) -> str:
            changed = [finding if i == index else f for i, f in enumerate(findings)]
            return self.write(record, value={**record.fields, "findings": changed})

        for index, finding in enumerate(findings):
            kind = finding["kind"]
            if "for" in finding and finding["for"] not in used:
                continue
            if "for" in finding and kind != "definition":  # a name's definition is shared by its steps
                found.append(("finding_wrong_key", with_finding(index, {**finding, "for": _other_hex(finding["for"])})))
            if kind == "problem_link":
                found.append(("finding_wrong_leaf_hash",
                              with_finding(index, {**finding, "sha256": _other_hex(finding["sha256"])})))
            for field in ("substitution", "theta"):
                wrong = _wrong_substitution(finding.get(field), constants)
                if wrong is not None:
                    found.append(("finding_wrong_binding", with_finding(index, {**finding, field: wrong})))
            if kind == "cover":
                matches = finding["matches"]
                for m, match in enumerate(matches[:2]):
                    moved = {**match, "premise_clause": match["premise_clause"] + 1}
                    found.append(("finding_wrong_cover_premise", with_finding(
                        index, {**finding, "matches": matches[:m] + [moved] + matches[m + 1 :]})))
                    wrong = _wrong_substitution(match["substitution"], constants)
                    if wrong is not None:
                        found.append(("finding_wrong_binding", with_finding(
                            index, {**finding, "matches": matches[:m] + [{**match, "substitution": wrong}] + matches[m + 1 :]})))
            if kind == "witness_pairings":
                for p, pairing in enumerate(finding["pairings"]):
                    for w, witnessing in enumerate(pairing):
                        for wrong in _wrong_witnessings(witnessing, constants):
                            changed = [list(q) for q in finding["pairings"]]
                            changed[p][w] = wrong
                            found.append(("finding_wrong_witness", with_finding(index, {**finding, "pairings": changed})))
                    if len(pairing) > 1:  # two witnesses exchanged
                        changed = [list(q) for q in finding["pairings"]]
                        first, second = changed[p][0], changed[p][1]
                        changed[p][0] = {**first, "witness": second["witness"]}
                        changed[p][1] = {**second, "witness": first["witness"]}
                        found.append(("finding_wrong_witness", with_finding(index, {**finding, "pairings": changed})))
            if kind == "definition" and " <=> " in finding["definition"]:
                head, body = finding["definition"].split(" <=> ", 1)
                wrong = f"{head} <=> ~ ({body[:-1]}))"  # the defining formula negated
                found.append(("finding_wrong_definition", with_finding(index, {**finding, "definition": wrong})))
            if kind in ("refutation", "clause_evidence"):
                steps = finding.get("steps") or (finding.get("evidence") or {}).get("steps") or [finding.get("evidence") or {}]
                for s, step in enumerate(steps[-2:]):
                    for field, value in step.items():
                        if field.endswith("literal") and isinstance(value, int) and not isinstance(value, bool):
                            found.append(("finding_wrong_index", with_finding(
                                index, _with_step_field(finding, len(steps) - len(steps[-2:]) + s, field, value + 1))))
                            break
        return found


def _other_hex(digest: str) -> str:
    """The digest with its last hex digit changed."""
    return digest[:-1] + ("0" if digest[-1] != "0" else "1")


def _wrong_substitution(substitution, constants: list[str]) -> dict | None:
    """The substitution with its first binding made a constant it does not bind to."""
    if not isinstance(substitution, dict) or not substitution:
        return None
    variable, term = next(iter(substitution.items()))
    others = [c for c in constants if c != term]
    return {**substitution, variable: others[0]} if others else None


def _wrong_witnessings(witnessing: dict, constants: list[str]) -> list[dict]:
    """A witnessing with an old symbol as its witness, and one for another premise."""
    found = []
    symbol = witnessing["witness"].split("(")[0]
    others = [c for c in constants if c != symbol]
    if others:
        found.append({**witnessing, "witness": others[0]})
    found.append({**witnessing, "premise": witnessing["premise"] + 1})
    return found


def _with_step_field(finding: dict, index: int, field: str, value: int) -> dict:
    """The finding with one field of one of its evidence steps changed."""
    if "steps" in finding:
        steps = [dict(s) for s in finding["steps"]]
        steps[index][field] = value
        return {**finding, "steps": steps}
    evidence = dict(finding["evidence"])
    if "steps" in evidence:
        steps = [dict(s) for s in evidence["steps"]]
        steps[index][field] = value
        return {**finding, "evidence": {**evidence, "steps": steps}}
    return {**finding, "evidence": {**evidence, field: value}}


FORMATS = {"tptp": TptpFormat(), "native": NativeFormat(), "native_v2": NativeV2Format()}


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
