"""Reading and writing the native certificate's version 2 fields: findings,
typed statements, nested records, branch assumptions, the partial flag.

What the reader must refuse follows formats/native_certificate_v2.md; the
records written are validated with the jsonschema package against
formats/native_certificate_v2.schema.json.
"""

from __future__ import annotations

import io
import json
from pathlib import Path

import jsonschema
import pytest

from checker.kernel.entailment import Cover
from checker.kernel.rules import Chain, Resolution
from checker.kernel.substitution import Substitution
from formats.derivation import Finding, Inference, Parent, UnreadableInput
from formats.native import NativeHeader, parse_native, parse_native_header, write_native
from formats.tptp import parse_clause, parse_formula, parse_term

ROOT = Path(__file__).resolve().parents[2]
SCHEMA = json.loads((ROOT / "formats" / "native_certificate_v2.schema.json").read_text(encoding="utf-8"))

HEADER = '{"assay_certificate": 2}\n'
LEAF = {"name": "gate_shut", "role": "axiom", "language": "cnf", "formula": "~open(G) | shut(G)",
        "origin": {"kind": "file", "detail": ["yard.p", "gate_shut"]}}
KEY = "0123456789abcdef0123456789abcdef"
DIGEST = "ab" * 32


def _certificate(*records: dict, header: str = HEADER) -> str:
    return header + "".join(json.dumps(record) + "\n" for record in records)


def _with(**fields) -> dict:
    return {**LEAF, **fields}


BAD = {
    "finding of unknown kind": (_with(findings=[{"kind": "hunch", "for": KEY}]), "findings[0].kind' must be one of"),
    "finding without its key": (_with(findings=[{"kind": "matching", "substitution": {}}]), "missing field 'findings[0].for'"),
    "digest too short": (_with(findings=[{"kind": "problem_link", "name": "gate_shut", "sha256": "ab"}]),
                         "64 lower-case hex digits"),
    "witness for a non-variable": (
        _with(findings=[{"kind": "witness_pairings", "for": KEY, "pairings": [[
            {"premise": 0, "quantifier": "? [Y] : p(Y)", "variable": "y", "witness": "sk0"}]]}]),
        "must be a variable"),
    "quantifier that is not a formula": (
        _with(findings=[{"kind": "witness_pairings", "for": KEY, "pairings": [[
            {"premise": 0, "quantifier": "? [Y] :", "variable": "Y", "witness": "sk0"}]]}]),
        "pairings[].quantifier' must be a formula"),
    "unknown field in a finding": (_with(findings=[{"kind": "matching", "for": KEY, "substitution": {}, "x": 1}]),
                                   "unknown field 'findings[0].x'"),
    "lemma that is not a clause": (_with(findings=[{"kind": "unit_lemmas", "for": KEY, "lemmas": ["p |"]}]),
                                   "must be a clause"),
    "sorts not a list": (_with(sorts="$i"), "field 'sorts' must be a list"),
    "assumptions not names": (
        {"name": "s", "role": "plain", "language": "cnf", "formula": "p",
         "inference": {"rule": "split", "parents": ["gate_shut"], "assumptions": [3]}},
        "'inference.assumptions' must be a list of names"),
}


@pytest.mark.parametrize("case", sorted(BAD))
def test_a_bad_version_2_field_is_unreadable_with_its_name(case):
    record, words = BAD[case]
    with pytest.raises(UnreadableInput) as caught:
        parse_native(_certificate(record))
    assert words in caught.value.message
    assert caught.value.location.line == 2


@pytest.mark.parametrize(("field", "value"), [("findings", []), ("sorts", ["crate"])])
def test_version_1_has_no_version_2_fields(field, value):
    with pytest.raises(UnreadableInput) as caught:
        parse_native(_certificate(_with(**{field: value}), header='{"assay_certificate": 1}\n'))
    assert f"unknown field '{field}'" in caught.value.message


def test_version_1_refuses_the_partial_flag_and_typed_languages():
    with pytest.raises(UnreadableInput):
        parse_native_header('{"assay_certificate": 1, "partial": true}')
    with pytest.raises(UnreadableInput):
        parse_native(_certificate(_with(language="tff", formula="p"), header='{"assay_certificate": 1}\n'))


def test_every_finding_kind_survives_writing_and_reading():
    x, y = parse_term("X"), parse_term("Y")
    quantifier = parse_formula("? [Y] : holds(X,Y)")
    findings = (
        Finding("refutation", KEY, Chain((Resolution(0, 0, 1, 0, Substitution({x: parse_term("g1")})),))),
        Finding("cover", KEY, Cover(((2, Substitution({x: parse_term("g1")})), (0, Substitution({}))),
                                    (("esk1_1", "sk2"),))),
        Finding("clause_evidence", KEY, (Resolution(0, 1, 1, 0), Substitution({y: x}))),
        Finding("witness_pairings", KEY, (((0, quantifier, y, parse_term("sk1(X)")),),)),
        Finding("matching", KEY, Substitution({x: parse_term("g2")})),
        Finding("unit_lemmas", KEY, (parse_clause("p | q"), parse_clause("$false"))),
        Finding("definition", KEY, parse_formula("! [X] : (sP1(X) <=> shut(X))")),
        Finding("problem_link", "gate_shut", DIGEST),
    )
    document = parse_native(_certificate(LEAF))
    statement = document.statements[0]
    nested = Inference("merge", "thm", (Parent("gate_shut"), Inference("resolve", "thm", (Parent("gate_shut"),))))
    step = statement.__class__("later", "plain", "tff", parse_formula("! [X] : shut(X)"), statement.location,
                               nested, frozenset({"gate"}))
    out = io.StringIO()
    document = document.__class__(document.path, (statement.__class__(*[
        getattr(statement, f) for f in ("name", "role", "language", "content", "location", "source", "sorts")
    ], findings=findings), step))
    write_native(document, out, NativeHeader(2, partial=True))
    for line in out.getvalue().splitlines():
        jsonschema.validate(json.loads(line), SCHEMA)
    again = parse_native(out.getvalue())
    assert parse_native_header(out.getvalue()).partial is True
    assert again.statements[0].findings == findings
    assert again.statements[1].source.parents == nested.parents
    assert again.statements[1].sorts == frozenset({"gate"}) and again.statements[1].language == "tff"


def test_the_format_has_a_field_for_every_kind_of_finding_the_checker_records():
    from checker.search.findings import FINDING_KINDS
    from formats.native import FINDING_FIELDS, PROBLEM_LINK

    assert set(FINDING_KINDS) == {*FINDING_FIELDS, PROBLEM_LINK}
    schema_kinds = {branch["properties"]["kind"]["const"] for branch in SCHEMA["$defs"]["finding"]["oneOf"]}
    assert schema_kinds == set(FINDING_KINDS)
