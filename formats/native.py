"""Reading and writing assay's native certificate, version 1 (JSON Lines).

One JSON object per line: a header first, then one record per statement.
Formulas are TPTP strings (parsed by :mod:`formats.tptp`); every inference
step carries the kernel evidence that justifies it, so that a native
certificate is checked with no search at all.  The format is specified in
``native_certificate.md`` next to this module, with a JSON Schema in
``native_certificate.schema.json``.  Field names are exactly the field
names of the kernel's evidence classes, so each record maps one-to-one
onto a :class:`checker.kernel.rules` evidence object.

Reading is strict: an unknown field, a field of the wrong type or an
unknown version is unreadable input, reported at the record's line.
"""

from __future__ import annotations

import dataclasses
import json
import re
from collections.abc import Collection, Iterator, Mapping
from dataclasses import dataclass
from typing import NoReturn, TextIO

from checker.kernel.clauses import Clause
from checker.kernel.formulas import Formula, render_formula
from checker.kernel.rules import (
    Chain,
    EqualityFactoring,
    EqualityResolution,
    Instantiation,
    Paramodulation,
    Refutation,
    Resolution,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, render
from formats.derivation import (
    Document,
    Inference,
    Location,
    Origin,
    Parent,
    Statement,
    UnreadableInput,
)
from formats.limits import current_limits
from formats.tptp import parse_clause, parse_formula, parse_term

VERSION = 1
VERSION_FIELD = "assay_certificate"
FORMAT = "native"

PRIMITIVE_RULES: dict[str, type] = {
    "instantiation": Instantiation,
    "resolution": Resolution,
    "paramodulation": Paramodulation,
    "equality_resolution": EqualityResolution,
    "equality_factoring": EqualityFactoring,
}
CHAIN = "chain"
REFUTATION = "refutation"
EVIDENCE_RULES = frozenset({*PRIMITIVE_RULES, CHAIN, REFUTATION})
_RULE_OF_EVIDENCE = {evidence: rule for rule, evidence in PRIMITIVE_RULES.items()}

# How each evidence field is written.  The names are the kernel's own
# dataclass fields; a test checks that this table covers every one of them.
INDEX, SUBSTITUTION, POSITION, FLAG = "index", "substitution", "position", "flag"
EVIDENCE_FIELD_KINDS: dict[str, str] = {
    "premise": INDEX,
    "left": INDEX,
    "right": INDEX,
    "equation": INDEX,
    "target": INDEX,
    "literal": INDEX,
    "other_literal": INDEX,
    "left_literal": INDEX,
    "right_literal": INDEX,
    "equation_literal": INDEX,
    "target_literal": INDEX,
    "substitution": SUBSTITUTION,
    "left_substitution": SUBSTITUTION,
    "right_substitution": SUBSTITUTION,
    "equation_substitution": SUBSTITUTION,
    "target_substitution": SUBSTITUTION,
    "position": POSITION,
    "left_to_right": FLAG,
    "literal_reversed": FLAG,
    "other_reversed": FLAG,
}

# TPTP formula roles (TPTP syntax BNF, <formula_role>; from memory).
ROLES = frozenset(
    {
        "axiom", "hypothesis", "definition", "assumption", "lemma", "theorem", "corollary",
        "conjecture", "negated_conjecture", "plain", "type", "interpretation",
        "fi_domain", "fi_functors", "fi_predicates", "logic", "unknown",
    }
)
# TPTP inference statuses: the SZS success ontology's short names, in the
# lower case that TPTP inference records use (from memory).
STATUSES = frozenset(
    {
        "suc", "unp", "sap", "esa", "sat", "fsa", "thm", "eqv", "tac", "wec", "eth", "tau",
        "wtc", "wth", "cax", "sca", "tca", "wca", "cup", "csp", "ecs", "csa", "cth", "ceq",
        "unc", "wcc", "ect", "fun", "uns", "wuc", "wct", "scc", "uca", "noc",
    }
)
DEFAULT_STATUS = "thm"
LANGUAGES = ("cnf", "fof")
ORIGIN_KINDS = ("file", "introduced", "theory", "unknown")

HEADER_FIELDS = (VERSION_FIELD, "problem", "producer", "comment")
STATEMENT_REQUIRED = ("name", "role", "language", "formula")
STATEMENT_OPTIONAL = ("origin", "inference", "comment")


@dataclass(frozen=True, slots=True)
class NativeHeader:
    """The first record: the format version and what the certificate is
    about.  ``problem`` is the problem file, relative to the certificate's
    directory; ``producer`` names the program (or person) that wrote it."""

    version: int = VERSION
    problem: str | None = None
    producer: str | None = None
    comment: str | None = None


# --------------------------------------------------------------------- reading


class _DuplicateField(Exception):
    def __init__(self, key: str):
        super().__init__(key)
        self.key = key


def _no_duplicates(pairs: list[tuple[str, object]]) -> dict[str, object]:
    record: dict[str, object] = {}
    for key, value in pairs:
        if key in record:
            raise _DuplicateField(key)
        record[key] = value
    return record


def _no_constant(name: str) -> NoReturn:
    raise ValueError(f"{name} is not a JSON number")


@dataclass(frozen=True, slots=True)
class _Record:
    """One line being read, so that every complaint can say where it is."""

    path: str
    line: int
    text: str

    def location(self, column: int = 1) -> Location:
        return Location(self.path, self.line, column)

    def fail(self, message: str, column: int = 1) -> NoReturn:
        raise UnreadableInput(message, self.location(column), _excerpt(self.text))

    def column_of_value(self, field: str) -> int:
        """The column where the string value of ``field`` starts (inside its
        quotes), or 1 if the raw line spells the key differently (escaped).
        Quotes inside JSON strings are escaped, so the pattern can only
        match the key itself."""
        found = re.search(f'"{re.escape(field)}"\\s*:\\s*"', self.text)
        return found.end() + 1 if found else 1


def _excerpt(text: str, limit: int = 200) -> str:
    return text if len(text) <= limit else text[: limit - 3] + "..."


def _decode(record: _Record) -> object:
    try:
        return json.loads(record.text, object_pairs_hook=_no_duplicates, parse_constant=_no_constant)
    except json.JSONDecodeError as error:
        record.fail(f"not a JSON record: {error.msg}", error.colno)
    except _DuplicateField as error:
        record.fail(f"field '{error.key}' appears twice in one record")
    except RecursionError:
        record.fail("not a JSON record: arrays or objects nested too deeply")
    except ValueError as error:
        record.fail(f"not a JSON record: {error}")


def _is_integer(value: object) -> bool:
    return isinstance(value, int) and not isinstance(value, bool)


def _check_fields(
    record: _Record, value: Mapping[str, object], where: str, required: Collection[str], optional: Collection[str]
) -> None:
    for key in value:
        if key not in required and key not in optional:
            known = ", ".join(f"'{name}'" for name in (*required, *optional))
            record.fail(f"unknown field '{where}{key}' (known here: {known})")
    for key in required:
        if key not in value:
            record.fail(f"missing field '{where}{key}'")


def _object(record: _Record, value: object, field: str) -> dict[str, object]:
    if not isinstance(value, dict):
        record.fail(f"field '{field}' must be an object")
    return value


def _text(record: _Record, value: object, field: str) -> str:
    if not isinstance(value, str) or not value.strip():
        record.fail(f"field '{field}' must be a non-empty string")
    return value


def _comment(record: _Record, value: object, field: str) -> str:
    if not isinstance(value, str):
        record.fail(f"field '{field}' must be a string")
    return value


def _choice(record: _Record, value: object, field: str, allowed: Collection[str], what: str) -> str:
    if not isinstance(value, str) or value not in allowed:
        record.fail(f"field '{field}' must be {what}, not {json.dumps(value)}")
    return value


def _header(record: _Record, value: object) -> NativeHeader:
    if not isinstance(value, dict) or VERSION_FIELD not in value:
        record.fail(f"the first record must be the header {{\"{VERSION_FIELD}\": {VERSION}, ...}}")
    version = value[VERSION_FIELD]
    if not _is_integer(version):
        record.fail(f"field '{VERSION_FIELD}' must be the format version, an integer")
    if version != VERSION:
        record.fail(f"unknown version {version} of the native certificate (this reader knows version {VERSION})")
    _check_fields(record, value, "", (VERSION_FIELD,), HEADER_FIELDS[1:])
    problem = _text(record, value["problem"], "problem") if "problem" in value else None
    producer = _comment(record, value["producer"], "producer") if "producer" in value else None
    comment = _comment(record, value["comment"], "comment") if "comment" in value else None
    return NativeHeader(version, problem, producer, comment)


def _content(record: _Record, language: str, text: str) -> Clause | Formula:
    where = record.location(record.column_of_value("formula"))
    try:
        return parse_clause(text, where) if language == "cnf" else parse_formula(text, where)
    except UnreadableInput as error:
        raise UnreadableInput(f"field 'formula': {error.message}", error.location, error.excerpt or _excerpt(record.text)) from None


def _term(record: _Record, text: object, field: str) -> Term:
    text = _text(record, text, field)
    try:
        return parse_term(text, record.location())
    except UnreadableInput as error:
        record.fail(f"field '{field}' must be a term in TPTP syntax: {error.message}")


def _substitution(record: _Record, value: object, field: str) -> Substitution:
    if not isinstance(value, dict):
        record.fail(f"field '{field}' must be an object mapping variables to terms, e.g. {{\"X\": \"f(a)\"}}")
    mapping = {}
    for name, term_text in value.items():
        var = _term(record, name, f"{field}.{name}")
        if not var.is_variable:
            record.fail(f"field '{field}' binds '{name}', which is not a variable (variables start with a capital)")
        mapping[var] = _term(record, term_text, f"{field}.{name}")
    return Substitution(mapping)


def _index(record: _Record, value: object, field: str) -> int:
    if not _is_integer(value) or value < 0:
        record.fail(f"field '{field}' must be a 0-based index, a non-negative integer")
    return value


def _position(record: _Record, value: object, field: str) -> tuple[int, ...]:
    if not isinstance(value, list) or not all(_is_integer(i) and i >= 1 for i in value):
        record.fail(f"field '{field}' must be a list of 1-based argument indices, e.g. [2, 1]")
    return tuple(value)


def _flag(record: _Record, value: object, field: str) -> bool:
    if not isinstance(value, bool):
        record.fail(f"field '{field}' must be true or false")
    return value


_READ_FIELD = {INDEX: _index, SUBSTITUTION: _substitution, POSITION: _position, FLAG: _flag}


def _evidence_fields(evidence: type) -> tuple[list[str], list[str]]:
    """The evidence class's fields, split into (required, optional)."""
    required, optional = [], []
    for field in dataclasses.fields(evidence):
        has_default = field.default is not dataclasses.MISSING
        (optional if has_default else required).append(field.name)
    return required, optional


def _primitive(
    record: _Record, value: Mapping[str, object], rule: str, where: str, required: Collection[str], optional: Collection[str]
) -> object:
    """The evidence object of a primitive rule; ``required`` and ``optional``
    are the other fields allowed alongside the evidence fields."""
    evidence = PRIMITIVE_RULES[rule]
    evidence_required, evidence_optional = _evidence_fields(evidence)
    _check_fields(record, value, where, ("rule", *required, *evidence_required), (*optional, *evidence_optional))
    arguments = {}
    for name in (*evidence_required, *evidence_optional):
        if name in value:
            arguments[name] = _READ_FIELD[EVIDENCE_FIELD_KINDS[name]](record, value[name], where + name)
    return evidence(**arguments)


def _chain(record: _Record, value: object, field: str) -> Chain:
    if not isinstance(value, list) or not value:
        record.fail(f"field '{field}' must be a non-empty list of inferences")
    steps = []
    for number, inner in enumerate(value):
        where = f"{field}[{number}]"
        inner = _object(record, inner, where)
        rule = inner.get("rule")
        if not isinstance(rule, str) or rule not in PRIMITIVE_RULES:
            names = ", ".join(f"'{name}'" for name in PRIMITIVE_RULES)
            record.fail(f"field '{where}.rule' must be one of {names}, not {json.dumps(rule)}")
        steps.append(_primitive(record, inner, rule, where + ".", (), ()))
    return Chain(tuple(steps))


def _parents(record: _Record, value: object) -> tuple[Parent, ...]:
    if not isinstance(value, list) or not all(isinstance(name, str) and name for name in value):
        record.fail("field 'inference.parents' must be a list of names")
    return tuple(Parent(name) for name in value)


def _inference(record: _Record, value: object, language: str) -> Inference:
    value = _object(record, value, "inference")
    if "rule" not in value:
        record.fail("missing field 'inference.rule'")
    rule = _text(record, value["rule"], "inference.rule")
    if rule in EVIDENCE_RULES and language != "cnf":
        record.fail(f"rule '{rule}' works on clauses: field 'language' must be \"cnf\"")
    where = "inference."
    evidence = None
    if rule in PRIMITIVE_RULES:
        evidence = _primitive(record, value, rule, where, ("parents",), ("status", "theta"))
    elif rule == CHAIN:
        _check_fields(record, value, where, ("rule", "parents", "steps"), ("status", "theta"))
        evidence = _chain(record, value["steps"], "inference.steps")
    elif rule == REFUTATION:
        # A refutation ends in the empty clause: there is no computed clause for theta to map.
        _check_fields(record, value, where, ("rule", "parents", "steps"), ("status",))
        evidence = Refutation(_chain(record, value["steps"], "inference.steps"))
    else:
        _check_fields(record, value, where, ("rule", "parents"), ("status",))
    parents = _parents(record, value["parents"])
    status = DEFAULT_STATUS
    if "status" in value:
        status = _choice(record, value["status"], "inference.status", STATUSES, "a TPTP status such as \"thm\"")
    theta = _substitution(record, value["theta"], "inference.theta") if "theta" in value else None
    return Inference(rule, status, parents, evidence, theta)


def _origin(record: _Record, value: object) -> Origin:
    value = _object(record, value, "origin")
    _check_fields(record, value, "origin.", ("kind",), ("detail",))
    kinds = ", ".join(f'"{kind}"' for kind in ORIGIN_KINDS)
    kind = _choice(record, value["kind"], "origin.kind", ORIGIN_KINDS, f"one of {kinds}")
    detail = value.get("detail", [])
    if not isinstance(detail, list) or not all(isinstance(part, str) for part in detail):
        record.fail("field 'origin.detail' must be a list of strings")
    return Origin(kind, tuple(detail))


def _statement(record: _Record, value: object) -> Statement:
    if not isinstance(value, dict):
        record.fail("a record must be a JSON object")
    if VERSION_FIELD in value:
        record.fail("a second header record: the header must be the first record and appear once")
    _check_fields(record, value, "", STATEMENT_REQUIRED, STATEMENT_OPTIONAL)
    name = _text(record, value["name"], "name")
    limits = current_limits()
    if len(name) > limits.name_length:
        record.fail(f"a name of {len(name)} characters; {limits.describe('name_length')}", record.column_of_value("name"))
    role = _choice(record, value["role"], "role", ROLES, "a TPTP role such as \"axiom\" or \"plain\"")
    language = _choice(record, value["language"], "language", LANGUAGES, '"cnf" or "fof"')
    formula = _text(record, value["formula"], "formula")
    if "comment" in value:
        _comment(record, value["comment"], "comment")
    if ("origin" in value) == ("inference" in value):
        record.fail("a record needs exactly one of the fields 'origin' (a leaf) and 'inference' (a step)")
    source = _origin(record, value["origin"]) if "origin" in value else _inference(record, value["inference"], language)
    return Statement(name, role, language, _content(record, language, formula), record.location(), source)


def _records(text: str, path: str) -> Iterator[_Record]:
    """The non-blank lines of the text, numbered from 1."""
    for number, line in enumerate(text.split("\n"), start=1):
        line = line.removesuffix("\r")
        if line.strip():
            yield _Record(path, number, line)


def _header_and_records(text: str, path: str) -> tuple[NativeHeader, Iterator[_Record]]:
    records = _records(text, path)
    first = next(records, None)
    if first is None:
        raise UnreadableInput(
            f"empty certificate: the first record must be the header {{\"{VERSION_FIELD}\": {VERSION}}}",
            Location(path, 1, 1),
        )
    return _header(first, _decode(first)), records


def parse_native_header(text: str, path: str = "<string>") -> NativeHeader:
    """The header of a native certificate given as text."""
    return _header_and_records(text, path)[0]


def parse_native(text: str, path: str = "<string>") -> Document:
    """The statements of a native certificate given as text."""
    _, records = _header_and_records(text, path)
    _within_statement_limit(text, path)
    statements = tuple(_statement(record, _decode(record)) for record in records)
    return Document(path, statements, format=FORMAT, files=(path,))


def _within_statement_limit(text: str, path: str) -> None:
    """Refuse, before decoding any, more records than the limit allows."""
    limits = current_limits()
    if text.count("\n") <= limits.statements:
        return
    for index, record in enumerate(_records(text, path)):
        if index > limits.statements:  # the header, then the statements
            record.fail(f"more than {limits.statements} statements; {limits.describe('statements')}")


def _read_text(path: str) -> str:
    with open(path, "rb") as handle:
        data = handle.read()
    try:
        return data.decode("utf-8-sig")  # a byte-order mark is no text
    except UnicodeDecodeError as error:
        line = data.count(b"\n", 0, error.start) + 1
        column = error.start - (data.rfind(b"\n", 0, error.start) + 1) + 1
        raise UnreadableInput("not UTF-8 text", Location(path, line, column)) from None


def read_native(path: str) -> Document:
    """The statements of the native certificate in the file at ``path``."""
    return parse_native(_read_text(path), path)


def read_native_header(path: str) -> NativeHeader:
    """The header of the native certificate in the file at ``path``."""
    return parse_native_header(_read_text(path), path)


# --------------------------------------------------------------------- writing


def _write_substitution(substitution: Substitution) -> dict[str, str]:
    return {var.symbol: render(term) for var, term in substitution.items_sorted()}


def _write_evidence(evidence: object) -> dict[str, object]:
    """The rule name and evidence fields of a primitive inference; fields
    at their default value are left out, as a reader would fill them in."""
    rule = _RULE_OF_EVIDENCE.get(type(evidence))
    if rule is None:
        raise ValueError(f"no native rule writes evidence of type {type(evidence).__name__}")
    fields: dict[str, object] = {"rule": rule}
    for field in dataclasses.fields(evidence):
        value = getattr(evidence, field.name)
        if field.default is not dataclasses.MISSING and value == field.default:
            continue
        kind = EVIDENCE_FIELD_KINDS[field.name]
        if kind == SUBSTITUTION:
            value = _write_substitution(value)
        elif kind == POSITION:
            value = list(value)
        fields[field.name] = value
    return fields


def _write_inference(statement: Statement, inference: Inference) -> dict[str, object]:
    parents = []
    for parent in inference.parents:
        if not isinstance(parent, Parent):
            raise ValueError(f"statement {statement.name}: a nested inference has no name to be written as a parent")
        parents.append(parent.name)  # stated bindings are hints; evidence supersedes them
    evidence = inference.evidence
    if evidence is None:
        if inference.rule in EVIDENCE_RULES:
            raise ValueError(f"statement {statement.name}: rule '{inference.rule}' needs evidence in a native certificate")
        record = {"rule": inference.rule}
    elif isinstance(evidence, Chain):
        record = {"rule": CHAIN, "steps": [_write_evidence(step) for step in evidence.steps]}
    elif isinstance(evidence, Refutation):
        record = {"rule": REFUTATION, "steps": [_write_evidence(step) for step in evidence.chain.steps]}
    else:
        record = _write_evidence(evidence)
    fields: dict[str, object] = {"rule": record.pop("rule"), "parents": parents}
    if inference.status is not None:
        fields["status"] = inference.status
    fields.update(record)
    if inference.theta is not None:
        fields["theta"] = _write_substitution(inference.theta)
    return fields


def _write_content(content: Clause | Formula) -> str:
    return str(content) if isinstance(content, Clause) else render_formula(content)


def _write_statement(statement: Statement) -> dict[str, object]:
    record: dict[str, object] = {
        "name": statement.name,
        "role": statement.role,
        "language": statement.language,
        "formula": _write_content(statement.content),
    }
    source = statement.source
    if isinstance(source, Inference):
        record["inference"] = _write_inference(statement, source)
    else:
        origin = source if isinstance(source, Origin) else Origin("unknown")
        record["origin"] = {"kind": origin.kind, "detail": list(origin.detail)} if origin.detail else {"kind": origin.kind}
    return record


def write_native(document: Document, out: TextIO, header: NativeHeader | None = None) -> None:
    """Write the document as a native certificate, one record per line.

    Inferences must carry kernel evidence or have a rule name outside the
    native evidence rules; a leaf without an origin is written as of
    unknown origin.  Parents' stated bindings are not written (the
    evidence's substitutions say everything they would)."""
    header = header or NativeHeader()
    first: dict[str, object] = {VERSION_FIELD: header.version}
    for field in ("problem", "producer", "comment"):
        if getattr(header, field) is not None:
            first[field] = getattr(header, field)
    out.write(json.dumps(first, ensure_ascii=False) + "\n")
    for statement in document.statements:
        out.write(json.dumps(_write_statement(statement), ensure_ascii=False) + "\n")
