"""Reading and writing assay's native certificate, versions 1 and 2 (JSON Lines).

One JSON object per line: a header first, then one record per statement.
Formulas are TPTP strings (parsed by :mod:`formats.tptp`); every inference
step carries the kernel evidence that justifies it, so that a native
certificate is checked with no search at all.  The format is specified in
``native_certificate.md`` next to this module, with a JSON Schema in
``native_certificate.schema.json``.  Field names are exactly the field
names of the kernel's evidence classes, so each record maps one-to-one
onto a :class:`checker.kernel.rules` evidence object.

Version 2 adds what ``assay elaborate`` writes: every statement's
``findings`` (the evidence found for it: refutations, witness pairings,
clause evidence, a leaf's link to its problem formula ...), typed
statements (with the sorts they use), and nested inference records.

Reading is strict: an unknown field, a field of the wrong type or an
unknown version is unreadable input, reported at the record's line.
"""

from __future__ import annotations

import dataclasses
import functools
import itertools
import json
import re
import sys
from collections.abc import Collection, Iterator, Mapping
from dataclasses import dataclass
from typing import NoReturn, TextIO

from checker.kernel.clauses import Clause
from checker.kernel.entailment import Cover
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
    Finding,
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
"""the version written by default (a certificate without findings)"""
ELABORATED_VERSION = 2
"""the version with findings, typed statements and nested records"""
VERSIONS = (VERSION, ELABORATED_VERSION)
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
LANGUAGES_V2 = ("cnf", "fof", "tff", "thf")
ORIGIN_KINDS = ("file", "introduced", "theory", "unknown")

HEADER_FIELDS = (VERSION_FIELD, "problem", "producer", "comment")
STATEMENT_REQUIRED = ("name", "role", "language", "formula")
STATEMENT_OPTIONAL = ("origin", "inference", "comment")
STATEMENT_OPTIONAL_V2 = (*STATEMENT_OPTIONAL, "findings", "sorts")

# The kinds of finding in version 2 (checker/search/findings.py asks the
# questions they answer), and the fields each has besides "kind" and "for".
FINDING_FIELDS: dict[str, tuple[str, ...]] = {
    "refutation": ("steps",),
    "cover": ("matches", "renaming"),
    "clause_evidence": ("evidence",),
    "witness_pairings": ("pairings",),
    "matching": ("substitution",),
    "unit_lemmas": ("lemmas",),
    "definition": ("definition",),
}
PROBLEM_LINK = "problem_link"
WITNESSING_FIELDS = ("premise", "quantifier", "variable", "witness")
COVER_MATCH_FIELDS = ("premise_clause", "substitution")


@dataclass(frozen=True, slots=True)
class NativeHeader:
    """The first record: the format version and what the certificate is
    about.  ``problem`` is the problem file, relative to the certificate's
    directory; ``producer`` names the program (or person) that wrote it."""

    version: int = VERSION
    problem: str | None = None
    producer: str | None = None
    comment: str | None = None
    partial: bool = False
    """(version 2) the derivation was not accepted: some steps lack evidence"""


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


_DECODER = json.JSONDecoder(object_pairs_hook=_no_duplicates, parse_constant=_no_constant)


def _decode(record: _Record) -> object:
    if record.text.startswith("\ufeff"):  # as json.loads says it
        record.fail("not a JSON record: Unexpected UTF-8 BOM (decode using utf-8-sig)")
    try:
        return _DECODER.decode(record.text)
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
    return sys.intern(value)  # one string object for the run, not one per record


def _header(record: _Record, value: object) -> NativeHeader:
    if not isinstance(value, dict) or VERSION_FIELD not in value:
        record.fail(f"the first record must be the header {{\"{VERSION_FIELD}\": {VERSION}, ...}}")
    version = value[VERSION_FIELD]
    if not _is_integer(version):
        record.fail(f"field '{VERSION_FIELD}' must be the format version, an integer")
    if version not in VERSIONS:
        record.fail(f"unknown version {version} of the native certificate (this reader knows versions 1 and 2)")
    _check_fields(record, value, "", (VERSION_FIELD,), HEADER_FIELDS[1:] + (("partial",) if version >= 2 else ()))
    problem = _text(record, value["problem"], "problem") if "problem" in value else None
    producer = _comment(record, value["producer"], "producer") if "producer" in value else None
    comment = _comment(record, value["comment"], "comment") if "comment" in value else None
    partial = _flag(record, value["partial"], "partial") if "partial" in value else False
    return NativeHeader(version, problem, producer, comment, partial)


def _content(record: _Record, language: str, text: str) -> Clause | Formula:
    # Typed statements are written with their sorts erased, in fof syntax.
    parse = parse_clause if language == "cnf" else parse_formula
    try:
        return parse(text)
    except UnreadableInput:
        where = record.location(record.column_of_value("formula"))  # only an error needs its place
    try:
        return parse(text, where)
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


@functools.cache
def _evidence_fields(evidence: type) -> tuple[tuple[str, ...], tuple[str, ...]]:
    """The evidence class's fields, split into (required, optional)."""
    required, optional = [], []
    for field in dataclasses.fields(evidence):
        has_default = field.default is not dataclasses.MISSING
        (optional if has_default else required).append(field.name)
    return tuple(required), tuple(optional)


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


def _parents(record: _Record, value: object, version: int = 1, field: str = "inference.parents") -> tuple:
    """Parent names; in version 2 also nested inference records (objects
    with a rule, a status and parents of their own), read depth first."""
    if version == 1:
        if not isinstance(value, list) or not all(isinstance(name, str) and name for name in value):
            record.fail(f"field '{field}' must be a list of names")
        return tuple(Parent(sys.intern(name)) for name in value)
    if not isinstance(value, list):
        record.fail(f"field '{field}' must be a list of names and nested inferences")
    built: list[list] = [[]]
    pending: list = [(iter(value), field, None)]
    while pending:
        entries, where, nested = pending[-1]
        entry = next(entries, None)
        if entry is None:
            pending.pop()
            if nested is not None:
                parents = tuple(built.pop())
                built[-1].append(Inference(nested[0], nested[1], parents))
            continue
        if isinstance(entry, str) and entry:
            built[-1].append(Parent(sys.intern(entry)))
            continue
        inner = _object(record, entry, where + "[]")
        _check_fields(record, inner, where + "[].", ("rule", "parents"), ("status",))
        rule = _text(record, inner["rule"], where + "[].rule")
        status = _choice(record, inner.get("status", DEFAULT_STATUS), where + "[].status", STATUSES, "a TPTP status")
        if not isinstance(inner["parents"], list):
            record.fail(f"field '{where}[].parents' must be a list of names and nested inferences")
        built.append([])
        pending.append((iter(inner["parents"]), where + "[].parents", (rule, status)))
    return tuple(built[0])


def _inference(record: _Record, value: object, language: str, version: int = 1) -> Inference:
    value = _object(record, value, "inference")
    if "rule" not in value:
        record.fail("missing field 'inference.rule'")
    rule = sys.intern(_text(record, value["rule"], "inference.rule"))
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
        _check_fields(record, value, where, ("rule", "parents"), ("status",) + (("assumptions",) if version >= 2 else ()))
    parents = _parents(record, value["parents"], version)
    status = DEFAULT_STATUS
    if "status" in value:
        status = _choice(record, value["status"], "inference.status", STATUSES, "a TPTP status such as \"thm\"")
    theta = _substitution(record, value["theta"], "inference.theta") if "theta" in value else None
    info: tuple[str, ...] = ()
    if "assumptions" in value:
        # The branch assumptions the step rests on, as TPTP's assumptions([...]) record.
        names = value["assumptions"]
        if not isinstance(names, list) or not all(isinstance(name, str) and name for name in names):
            record.fail("field 'inference.assumptions' must be a list of names")
        info = (f"assumptions([{','.join(names)}])",)
    return Inference(rule, status, parents, evidence, theta, info)


def _origin(record: _Record, value: object) -> Origin:
    value = _object(record, value, "origin")
    _check_fields(record, value, "origin.", ("kind",), ("detail",))
    kinds = ", ".join(f'"{kind}"' for kind in ORIGIN_KINDS)
    kind = _choice(record, value["kind"], "origin.kind", ORIGIN_KINDS, f"one of {kinds}")
    detail = value.get("detail", [])
    if not isinstance(detail, list) or not all(isinstance(part, str) for part in detail):
        record.fail("field 'origin.detail' must be a list of strings")
    return Origin(kind, tuple(map(sys.intern, detail)))


def _statement(record: _Record, value: object, version: int = 1) -> Statement:
    if not isinstance(value, dict):
        record.fail("a record must be a JSON object")
    if VERSION_FIELD in value:
        record.fail("a second header record: the header must be the first record and appear once")
    _check_fields(record, value, "", STATEMENT_REQUIRED, STATEMENT_OPTIONAL if version == 1 else STATEMENT_OPTIONAL_V2)
    name = sys.intern(_text(record, value["name"], "name"))  # the same object as its children's parent names
    limits = current_limits()
    if len(name) > limits.name_length:
        record.fail(f"a name of {len(name)} characters; {limits.describe('name_length')}", record.column_of_value("name"))
    role = _choice(record, value["role"], "role", ROLES, "a TPTP role such as \"axiom\" or \"plain\"")
    languages = LANGUAGES if version == 1 else LANGUAGES_V2
    language = _choice(record, value["language"], "language", languages, " or ".join(f'"{x}"' for x in languages))
    formula = _text(record, value["formula"], "formula")
    if "comment" in value:
        _comment(record, value["comment"], "comment")
    if ("origin" in value) == ("inference" in value):
        record.fail("a record needs exactly one of the fields 'origin' (a leaf) and 'inference' (a step)")
    source = (_origin(record, value["origin"]) if "origin" in value
              else _inference(record, value["inference"], language, version))
    findings = sorts = None
    if version >= 2:
        findings = _findings(record, value.get("findings", []))
        if "sorts" in value:
            sorts = value["sorts"]
            if not isinstance(sorts, list) or not all(isinstance(s, str) and s for s in sorts):
                record.fail("field 'sorts' must be a list of sort names")
            sorts = frozenset(sorts)
    return Statement(name, role, language, _content(record, language, formula), record.location(), source, sorts, findings)


def _findings(record: _Record, value: object) -> tuple[Finding, ...]:
    """The evidence found for a statement (version 2), each answer read
    into kernel data; whether it holds is the kernel's to say."""
    if not isinstance(value, list):
        record.fail("field 'findings' must be a list of findings")
    found = []
    for number, entry in enumerate(value):
        where = f"findings[{number}]"
        entry = _object(record, entry, where)
        kind = entry.get("kind")
        if kind == PROBLEM_LINK:
            _check_fields(record, entry, where + ".", ("kind", "name", "sha256"), ())
            digest = _text(record, entry["sha256"], where + ".sha256")
            if not re.fullmatch("[0-9a-f]{64}", digest):
                record.fail(f"field '{where}.sha256' must be 64 lower-case hex digits")
            found.append(Finding(PROBLEM_LINK, _text(record, entry["name"], where + ".name"), digest))
            continue
        if kind not in FINDING_FIELDS:
            kinds = ", ".join(f"'{k}'" for k in (*FINDING_FIELDS, PROBLEM_LINK))
            record.fail(f"field '{where}.kind' must be one of {kinds}, not {json.dumps(kind)}")
        _check_fields(record, entry, where + ".", ("kind", "for", *FINDING_FIELDS[kind]), ("theta",) if kind == "clause_evidence" else ())
        key = _text(record, entry["for"], where + ".for")
        found.append(Finding(kind, key, _answer(record, kind, entry, where)))
    return tuple(found)


def _answer(record: _Record, kind: str, entry: Mapping[str, object], where: str) -> object:
    if kind == "refutation":
        return _chain(record, entry["steps"], where + ".steps")
    if kind == "cover":
        return _cover(record, entry, where)
    if kind == "clause_evidence":
        evidence = _object(record, entry["evidence"], where + ".evidence")
        rule = evidence.get("rule")
        if rule in PRIMITIVE_RULES:
            read = _primitive(record, evidence, rule, where + ".evidence.", (), ())
        elif rule in (CHAIN, REFUTATION):
            _check_fields(record, evidence, where + ".evidence.", ("rule", "steps"), ())
            read = _chain(record, evidence["steps"], where + ".evidence.steps")
            read = read if rule == CHAIN else Refutation(read)
        else:
            record.fail(f"field '{where}.evidence.rule' must be an evidence rule, not {json.dumps(rule)}")
        theta = _substitution(record, entry["theta"], where + ".theta") if "theta" in entry else Substitution({})
        return read, theta
    if kind == "witness_pairings":
        pairings = entry["pairings"]
        if not isinstance(pairings, list) or not all(isinstance(p, list) for p in pairings):
            record.fail(f"field '{where}.pairings' must be a list of lists of witnessings")
        read_pairings = []
        for pairing in pairings:
            witnessings = []
            for witnessing in pairing:
                witnessing = _object(record, witnessing, where + ".pairings[]")
                _check_fields(record, witnessing, where + ".pairings[].", WITNESSING_FIELDS, ())
                variable = _term(record, witnessing["variable"], where + ".pairings[].variable")
                if not variable.is_variable:
                    record.fail(f"field '{where}.pairings[].variable' must be a variable")
                quantifier = _formula(record, witnessing["quantifier"], where + ".pairings[].quantifier")
                witnessings.append((
                    _index(record, witnessing["premise"], where + ".pairings[].premise"), quantifier, variable,
                    _term(record, witnessing["witness"], where + ".pairings[].witness"),
                ))
            read_pairings.append(tuple(witnessings))
        return tuple(read_pairings)
    if kind == "matching":
        return _substitution(record, entry["substitution"], where + ".substitution")
    if kind == "unit_lemmas":
        lemmas = entry["lemmas"]
        if not isinstance(lemmas, list):
            record.fail(f"field '{where}.lemmas' must be a list of clauses")
        return tuple(_clause(record, lemma, where + ".lemmas[]") for lemma in lemmas)
    return _formula(record, entry["definition"], where + ".definition")


def _cover(record: _Record, entry: Mapping[str, object], where: str) -> Cover:
    matches = entry["matches"]
    if not isinstance(matches, list):
        record.fail(f"field '{where}.matches' must be a list of matches")
    read = []
    for match in matches:
        match = _object(record, match, where + ".matches[]")
        _check_fields(record, match, where + ".matches[].", COVER_MATCH_FIELDS, ())
        read.append((_index(record, match["premise_clause"], where + ".matches[].premise_clause"),
                     _substitution(record, match["substitution"], where + ".matches[].substitution")))
    renaming = entry["renaming"]
    if not isinstance(renaming, list) or not all(
        isinstance(pair, list) and len(pair) == 2 and all(isinstance(name, str) and name for name in pair)
        for pair in renaming
    ):
        record.fail(f"field '{where}.renaming' must be a list of [from, to] pairs of symbol names")
    return Cover(tuple(read), tuple((old, new) for old, new in renaming))


def _formula(record: _Record, text: object, field: str) -> Formula:
    text = _text(record, text, field)
    try:
        return parse_formula(text, record.location())
    except UnreadableInput as error:
        record.fail(f"field '{field}' must be a formula in TPTP syntax: {error.message}")


def _clause(record: _Record, text: object, field: str) -> Clause:
    text = _text(record, text, field)
    try:
        return parse_clause(text, record.location())
    except UnreadableInput as error:
        record.fail(f"field '{field}' must be a clause in TPTP syntax: {error.message}")


def _records(text: str, path: str) -> Iterator[_Record]:
    """The non-blank lines of the text, numbered from 1 (cut one at a
    time: a list of them all would double the text in memory)."""
    start = 0
    for number in itertools.count(1):
        end = text.find("\n", start)
        line = text[start:] if end < 0 else text[start:end]
        line = line.removesuffix("\r")
        if line.strip():
            yield _Record(path, number, line)
        if end < 0:
            return
        start = end + 1


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
    header, records = _header_and_records(text, path)
    _within_statement_limit(text, path)
    statements = tuple(_statement(record, _decode(record), header.version) for record in records)
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


def _write_parents(statement: Statement, parents: tuple, version: int) -> list[object]:
    """Parent names, and in version 2 nested inference records as objects
    (built innermost first, without recursion)."""
    if version == 1:
        if not all(isinstance(parent, Parent) for parent in parents):
            raise ValueError(f"statement {statement.name}: a nested inference has no name to be written as a parent")
        return [parent.name for parent in parents]  # stated bindings are hints; evidence supersedes them
    written: list[object] = []
    pending: list = [(iter(parents), written)]
    while pending:
        entries, into = pending[-1]
        parent = next(entries, None)
        if parent is None:
            pending.pop()
        elif isinstance(parent, Parent):
            into.append(parent.name)
        else:
            inner: list[object] = []
            into.append({"rule": parent.rule, "status": parent.status or DEFAULT_STATUS, "parents": inner})
            pending.append((iter(parent.parents), inner))
    return written


def _write_inference(statement: Statement, inference: Inference, version: int = 1) -> dict[str, object]:
    parents = _write_parents(statement, inference.parents, version)
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
    if inference.theta is not None and not isinstance(evidence, Refutation):
        fields["theta"] = _write_substitution(inference.theta)
    if version >= 2 and evidence is None:
        for item in inference.info:
            found = re.fullmatch(r"assumptions\(\[(.*)\]\)", item.replace(" ", ""))
            if found:
                fields["assumptions"] = [name.strip("'") for name in found.group(1).split(",") if name]
    return fields


def _write_content(content: Clause | Formula) -> str:
    return str(content) if isinstance(content, Clause) else render_formula(content)


def _write_statement(statement: Statement, version: int = 1) -> dict[str, object]:
    record: dict[str, object] = {
        "name": statement.name,
        "role": statement.role,
        "language": statement.language,
        "formula": _write_content(statement.content),
    }
    source = statement.source
    if isinstance(source, Inference):
        record["inference"] = _write_inference(statement, source, version)
    else:
        origin = source if isinstance(source, Origin) else Origin("unknown")
        record["origin"] = {"kind": origin.kind, "detail": list(origin.detail)} if origin.detail else {"kind": origin.kind}
    if version >= 2 and statement.sorts is not None:
        record["sorts"] = sorted(statement.sorts)
    if version >= 2 and statement.findings:
        record["findings"] = [_write_finding(finding) for finding in statement.findings]
    return record


def _write_finding(finding: Finding) -> dict[str, object]:
    """A finding as version 2 writes it (the inverse of :func:`_answer`)."""
    if finding.kind == PROBLEM_LINK:
        return {"kind": PROBLEM_LINK, "name": finding.key, "sha256": finding.answer}
    record: dict[str, object] = {"kind": finding.kind, "for": finding.key}
    answer = finding.answer
    if finding.kind == "refutation":
        record["steps"] = [_write_evidence(step) for step in answer.steps]
    elif finding.kind == "cover":
        record["matches"] = [{"premise_clause": index, "substitution": _write_substitution(theta)}
                             for index, theta in answer.matches]
        record["renaming"] = [[old, new] for old, new in answer.renaming]
    elif finding.kind == "clause_evidence":
        evidence, theta = answer
        if isinstance(evidence, Chain):
            record["evidence"] = {"rule": CHAIN, "steps": [_write_evidence(step) for step in evidence.steps]}
        elif isinstance(evidence, Refutation):
            record["evidence"] = {"rule": REFUTATION, "steps": [_write_evidence(step) for step in evidence.chain.steps]}
        else:
            record["evidence"] = _write_evidence(evidence)
        if theta.mapping:
            record["theta"] = _write_substitution(theta)
    elif finding.kind == "witness_pairings":
        record["pairings"] = [
            [{"premise": premise, "quantifier": render_formula(quantifier), "variable": render(bound),
              "witness": render(witness)} for premise, quantifier, bound, witness in pairing]
            for pairing in answer
        ]
    elif finding.kind == "matching":
        record["substitution"] = _write_substitution(answer)
    elif finding.kind == "unit_lemmas":
        record["lemmas"] = [str(lemma) for lemma in answer]
    elif finding.kind == "definition":
        record["definition"] = render_formula(answer)
    else:
        raise ValueError(f"no native field writes findings of kind {finding.kind}")
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
    if header.partial:
        first["partial"] = True
    out.write(json.dumps(first, ensure_ascii=False) + "\n")
    out.writelines(json.dumps(_write_statement(statement, header.version), ensure_ascii=False) + "\n" for statement in document.statements)
