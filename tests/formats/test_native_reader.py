"""Reading native certificates: every field, and a precise, located error
for every kind of bad record."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from checker.kernel.rules import (
    Chain,
    EqualityFactoring,
    EqualityResolution,
    Instantiation,
    Paramodulation,
    Refutation,
    Resolution,
)
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import application, variable
from formats.derivation import Inference, Location, Origin, Parent, UnreadableInput
from formats.native import NativeHeader, parse_native, parse_native_header, read_native
from formats.tptp import parse_clause, parse_formula

FIXTURES = Path(__file__).resolve().parents[2] / "fixtures"
EVERY_RULE = FIXTURES / "native" / "every_rule_signalling.jsonl"

HEADER = '{"assay_certificate": 1}'
LEAF = '{"name": "b2_clear", "role": "axiom", "language": "cnf", "formula": "clear(b2)", "origin": {"kind": "unknown"}}'

S, A, B, R = (variable(name) for name in ("S", "A", "B", "R"))
s1 = application("s1")
c0 = application("claim_constant_0")


def _by_name(document):
    return {statement.name: statement for statement in document.statements}


# ------------------------------------------------------------------ every field


def test_header_fields():
    text = '{"assay_certificate": 1, "problem": "junction_j4.p", "producer": "rail-prover 0.3", "comment": "j4"}\n'
    assert parse_native_header(text) == NativeHeader(1, "junction_j4.p", "rail-prover 0.3", "j4")
    assert parse_native_header(HEADER) == NativeHeader()


def test_statement_fields_of_a_leaf():
    document = parse_native(HEADER + "\n" + LEAF + "\n", "cert.jsonl")
    assert document.format == "native" and document.path == "cert.jsonl"
    (leaf,) = document.statements
    assert (leaf.name, leaf.role, leaf.language) == ("b2_clear", "axiom", "cnf")
    assert leaf.content == parse_clause("clear(b2)")
    assert leaf.source == Origin("unknown")
    assert leaf.location == Location("cert.jsonl", 2, 1)


def test_every_rule_fixture_reads_into_kernel_evidence():
    statements = _by_name(read_native(str(EVERY_RULE)))
    # fof leaf with a file origin
    leaf = statements["proceed_rule"]
    assert leaf.language == "fof"
    assert leaf.content is parse_formula("! [S] : (clear(ahead(S)) => proceed(S))")
    assert leaf.source == Origin("file", ("junction_j4.p", "proceed_rule"))
    assert statements["reflexivity"].source == Origin("theory", ("equality",))
    assert statements["halted_definition"].source == Origin("introduced", ("definition",))
    assert statements["halted_definition"].role == "definition"
    # a step without evidence keeps its rule name
    assert statements["proceed_rule_clause"].source == Inference("clause_form", "thm", (Parent("proceed_rule"),))
    assert statements["s1_not_halted"].source.evidence is None
    # primitive rules, field by field
    assert statements["s1_green_when_clear"].source == Inference(
        "instantiation", "thm", (Parent("green_when_clear"),), Instantiation(0, Substitution({S: s1}))
    )
    assert statements["s1_green"].source.evidence == Resolution(0, 0, 1, 0)
    assert statements["s1_green_when_b2_clear"].source.evidence == Paramodulation(0, 0, True, 1, 0, (1,))
    equality_resolution = statements["route_conflicts_with_itself"].source
    assert equality_resolution.evidence == EqualityResolution(0, 1, Substitution({B: A}))
    assert equality_resolution.theta == Substitution({A: R})
    assert statements["caution_or_dark"].source.evidence == EqualityFactoring(0, 0, 1, False, True)
    # chain and refutation
    chain = statements["s1_flashing"].source
    assert chain.evidence == Chain(
        (Resolution(1, 0, 0, 0, Substitution({S: s1})), Resolution(2, 0, 3, 0, Substitution({S: s1})))
    )
    assert chain.theta == IDENTITY and chain.parents == (Parent("s1_green"), Parent("halt_rule"), Parent("lit_signal"))
    refutation = statements["green_when_clear"].source
    assert refutation.evidence == Refutation(
        Chain(
            (
                Resolution(0, 0, 2, 0, Substitution({S: c0})),
                Resolution(1, 0, 4, 0, Substitution({S: c0})),
                Resolution(5, 0, 3, 0),
            )
        )
    )
    assert refutation.theta is None and refutation.status == "thm"


def test_status_defaults_to_thm_and_is_kept_when_given():
    step = '{"name": "n", "role": "plain", "language": "fof", "formula": "p", "inference": {"rule": "r", "parents": ["b2_clear"]}}'
    esa = step.replace('"parents"', '"status": "esa", "parents"')
    assert parse_native("\n".join((HEADER, LEAF, step))).statements[1].source.status == "thm"
    assert parse_native("\n".join((HEADER, LEAF, esa))).statements[1].source.status == "esa"


def test_locations_count_every_line_including_blank_ones():
    text = "\n".join(("", HEADER, "", "   ", LEAF, LEAF.replace("b2_clear", "b3_clear")))
    document = parse_native(text, "c.jsonl")
    assert [s.location for s in document.statements] == [Location("c.jsonl", 5, 1), Location("c.jsonl", 6, 1)]


def test_crlf_line_endings_are_read():
    # JSON Lines (jsonlines.org, from memory): "\r\n" line ends are allowed,
    # since white space around a JSON value is insignificant (RFC 8259).
    document = parse_native(HEADER + "\r\n" + LEAF + "\r\n")
    assert document.statements[0].content == parse_clause("clear(b2)")


def test_parents_may_repeat_a_name_and_evidence_counts_positions():
    step = (
        '{"name": "n", "role": "plain", "language": "cnf", "formula": "$false", "inference": {"rule": "resolution",'
        ' "parents": ["b2_clear", "b2_clear"], "left": 0, "left_literal": 0, "right": 1, "right_literal": 0}}'
    )
    (_, statement) = parse_native("\n".join((HEADER, LEAF, step))).statements
    assert statement.source.parents == (Parent("b2_clear"), Parent("b2_clear"))
    assert statement.content.is_empty


def test_read_native_reads_a_file(tmp_path):
    path = tmp_path / "cert.jsonl"
    path.write_text(HEADER + "\n" + LEAF + "\n", encoding="utf-8")
    document = read_native(str(path))
    assert document.statements[0].location == Location(str(path), 2, 1)


def test_text_that_is_not_utf8_is_located(tmp_path):
    path = tmp_path / "cert.jsonl"
    path.write_bytes(HEADER.encode() + b'\n{"name": "caf\xe9"}\n')
    with pytest.raises(UnreadableInput) as caught:
        read_native(str(path))
    assert caught.value.location == Location(str(path), 2, 14)
    assert "UTF-8" in caught.value.message


def test_a_byte_order_mark_inside_the_text_is_refused_at_its_record():
    # a byte-order mark starts a file, never a line inside it (RFC 8259, section 8.1)
    with pytest.raises(UnreadableInput) as caught:
        parse_native(HEADER + "\n\ufeff" + LEAF + "\n", "cert.jsonl")
    assert caught.value.location == Location("cert.jsonl", 2, 1)
    assert "BOM" in caught.value.message


# ------------------------------------------------------------------ bad records


def _record(inference: dict | None = None, without_inference: bool = False, **changes) -> str:
    """A resolution step of b2_clear with itself, with fields changed: a
    value None removes the field; ``inference`` changes the inference's
    fields the same way."""
    record = {
        "name": "n",
        "role": "plain",
        "language": "cnf",
        "formula": "$false",
        "inference": {"rule": "resolution", "parents": ["b2_clear", "b2_clear"], "left": 0, "left_literal": 0,
                      "right": 1, "right_literal": 0},
    }
    for fields, updates in ((record, changes), (record["inference"], inference or {})):
        for key, value in updates.items():
            if value is None:
                fields.pop(key)
            else:
                fields[key] = value
    if without_inference:
        del record["inference"]
    return json.dumps(record)


PARAMODULATION = {"rule": "paramodulation", "equation": 0, "equation_literal": 0, "target": 1, "target_literal": 0,
                  "position": [1], "left": None, "left_literal": None, "right": None, "right_literal": None}

# (record, words the message must contain, column, whether the JSON Schema also refuses it)
BAD_RECORDS = {
    "not JSON": ('{"name": "n", "role": ', "not a JSON record", 23, False),
    "not an object": ("[1, 2]", "a record must be a JSON object", 1, True),
    "duplicate field": (LEAF.replace('"name": "b2_clear",', '"name": "b2_clear", "name": "b9",'), "field 'name' appears twice", 1, False),
    "NaN": (_record().replace('"left": 0', '"left": NaN'), "not a JSON record: NaN is not a JSON number", 1, True),
    "misspelt field": (_record(nmae="x"), "unknown field 'nmae'", 1, True),
    "missing formula": (_record(formula=None), "missing field 'formula'", 1, True),
    "unknown role": (_record(role="axoim"), "field 'role' must be a TPTP role", 1, True),
    "unknown language": (_record(language="tff"), "field 'language' must be \"cnf\" or \"fof\"", 1, True),
    "empty name": (_record(name=""), "field 'name' must be a non-empty string", 1, True),
    "parents not a list": (_record(inference={"parents": "b2_clear"}), "field 'inference.parents' must be a list of names", 1, True),
    "parents missing": (_record(inference={"parents": None}), "missing field 'inference.parents'", 1, True),
    "rule missing": (_record(inference={"rule": None}), "missing field 'inference.rule'", 1, True),
    "negative index": (_record(inference={"left_literal": -1}), "field 'inference.left_literal' must be a 0-based index", 1, True),
    "fractional index": (_record(inference={"left_literal": 1.0}), "field 'inference.left_literal' must be a 0-based index", 1, False),
    "boolean index": (_record(inference={"right": True}), "field 'inference.right' must be a 0-based index", 1, True),
    "misspelt evidence field": (_record(inference={"lefft": 0}), "unknown field 'inference.lefft'", 1, True),
    "missing evidence field": (_record(inference={"right_literal": None}), "missing field 'inference.right_literal'", 1, True),
    "binding of a non-variable": (
        _record(inference={"left_substitution": {"x": "a"}}),
        "field 'inference.left_substitution' binds 'x', which is not a variable",
        1,
        True,
    ),
    "binding to a bad term": (
        _record(inference={"left_substitution": {"X": "f("}}),
        "field 'inference.left_substitution.X' must be a term in TPTP syntax",
        1,
        False,
    ),
    "substitution not an object": (
        _record(inference={"right_substitution": ["X", "a"]}),
        "field 'inference.right_substitution' must be an object mapping variables to terms",
        1,
        True,
    ),
    "position from 0": (
        _record(inference=PARAMODULATION | {"position": [0], "left_to_right": True}),
        "field 'inference.position' must be a list of 1-based argument indices",
        1,
        True,
    ),
    "orientation missing": (_record(inference=PARAMODULATION), "missing field 'inference.left_to_right'", 1, True),
    "orientation not a flag": (
        _record(inference=PARAMODULATION | {"left_to_right": "yes"}),
        "field 'inference.left_to_right' must be true or false",
        1,
        True,
    ),
    "unknown status": (_record(inference={"status": "proved"}), "field 'inference.status' must be a TPTP status", 1, True),
    "evidence on a formula": (_record(language="fof"), "rule 'resolution' works on clauses", 1, True),
    "evidence fields on another rule": (
        _record(inference={"rule": "clause_form"}),
        "unknown field 'inference.left'",
        1,
        True,
    ),
    "theta on a refutation": (
        _record(inference={"rule": "refutation", "steps": [{"rule": "instantiation", "premise": 0}], "theta": {},
                           "left": None, "left_literal": None, "right": None, "right_literal": None}),
        "unknown field 'inference.theta'",
        1,
        True,
    ),
    "empty chain": (
        _record(inference={"rule": "chain", "steps": [], "left": None, "left_literal": None, "right": None,
                           "right_literal": None}),
        "field 'inference.steps' must be a non-empty list of inferences",
        1,
        True,
    ),
    "chain inside a chain": (
        _record(inference={"rule": "chain", "steps": [{"rule": "chain", "steps": []}], "left": None,
                           "left_literal": None, "right": None, "right_literal": None}),
        "field 'inference.steps[0].rule' must be one of 'instantiation', 'resolution'",
        1,
        True,
    ),
    "inner rule not a name": (
        _record(inference={"rule": "chain", "steps": [{"rule": ["resolution"]}], "left": None,
                           "left_literal": None, "right": None, "right_literal": None}),
        "field 'inference.steps[0].rule' must be one of",
        1,
        True,
    ),
    "bad inner evidence": (
        _record(inference={"rule": "chain", "steps": [{"rule": "instantiation", "premise": "0"}], "left": None,
                           "left_literal": None, "right": None, "right_literal": None}),
        "field 'inference.steps[0].premise' must be a 0-based index",
        1,
        True,
    ),
    "both origin and inference": (_record(origin={"kind": "unknown"}), "exactly one of the fields 'origin'", 1, True),
    "neither origin nor inference": (_record(without_inference=True), "exactly one of the fields 'origin'", 1, True),
    "unknown origin kind": (
        _record(without_inference=True, origin={"kind": "axiom"}),
        "field 'origin.kind' must be one of \"file\", \"introduced\"",
        1,
        True,
    ),
    "origin detail not strings": (
        _record(without_inference=True, origin={"kind": "file", "detail": ["p.p", 3]}),
        "field 'origin.detail' must be a list of strings",
        1,
        True,
    ),
    "inference not an object": (_record(inference=None).replace('"inference": {', '"inference": [{').replace("}}", "}]}"), "field 'inference' must be an object", 1, True),
    "origin not an object": (_record(without_inference=True, origin="problem.p"), "field 'origin' must be an object", 1, True),
    "comment not a string": (_record(comment=3), "field 'comment' must be a string", 1, True),
    "second header": ('{"assay_certificate": 1}', "a second header record", 1, False),
}


@pytest.mark.parametrize("case", sorted(BAD_RECORDS))
def test_bad_record_is_refused_with_its_field_and_location(case):
    record, words, column, _ = BAD_RECORDS[case]
    text = "\n".join((HEADER, LEAF, record))
    with pytest.raises(UnreadableInput) as caught:
        parse_native(text, "cert.jsonl")
    assert words in caught.value.message
    assert caught.value.location == Location("cert.jsonl", 3, column)
    assert str(caught.value).startswith("cert.jsonl:3:")


@pytest.mark.parametrize(
    "record, column",
    [
        ('{"name": "n", "role": "axiom", "language": "cnf", "formula": "p(X) | | q", "origin": {"kind": "unknown"}}', 70),
        # a value spelt like the key does not mislead the column
        ('{"name": "formula", "role": "axiom", "language": "cnf", "formula": "p(X) | | q", "origin": {"kind": "unknown"}}', 76),
        # an escaped key cannot be found in the raw line: column 1 of the formula text is reported
        ('{"name": "n", "role": "axiom", "language": "cnf", "\\u0066ormula": "p(X) | | q", "origin": {"kind": "unknown"}}', 8),
    ],
)
def test_bad_formula_is_located_inside_the_line(record, column):
    with pytest.raises(UnreadableInput) as caught:
        parse_native("\n".join((HEADER, LEAF, record)), "cert.jsonl")
    assert caught.value.message.startswith("field 'formula': ")
    # The second '|' is the formula text's 8th character.
    if column > 8:
        assert record[column - 8 : column - 8 + 10] == "p(X) | | q"
    assert caught.value.location == Location("cert.jsonl", 3, column)


BAD_HEADERS = {
    "empty certificate": ("", "empty certificate", 1, 1),
    "only blank lines": ("\n  \n", "empty certificate", 1, 1),
    "statement first": (LEAF, "the first record must be the header", 1, 1),
    "unknown version": ('{"assay_certificate": 3}\n' + LEAF, "unknown version 3 of the native certificate", 1, 1),
    "version as text": ('{"assay_certificate": "1"}', "field 'assay_certificate' must be the format version", 1, 1),
    "misspelt header field": ('{"assay_certificate": 1, "problme": "p.p"}', "unknown field 'problme'", 1, 1),
    "bad JSON after blank lines": ('\n\n{"assay_certificate": 1,}', "not a JSON record", 3, 25),
}


@pytest.mark.parametrize("case", sorted(BAD_HEADERS))
def test_bad_header_is_refused(case):
    text, words, line, column = BAD_HEADERS[case]
    with pytest.raises(UnreadableInput) as caught:
        parse_native(text, "cert.jsonl")
    assert words in caught.value.message
    assert caught.value.location == Location("cert.jsonl", line, column)


# ------------------------------------------------------- the schema agrees


def _schema_validator():
    import jsonschema

    schema = json.loads((Path(__file__).resolve().parents[2] / "formats" / "native_certificate.schema.json").read_text())
    return jsonschema.Draft202012Validator(schema)


@pytest.mark.parametrize("case", sorted(BAD_RECORDS))
def test_schema_refuses_the_bad_records_it_can_see(case):
    """The JSON Schema (checked with the jsonschema package) refuses the
    same bad records, except those only a TPTP parser or a strict JSON
    reader can tell (bad terms, 1.0 as an index, duplicate fields), and
    a second header, which is a valid record in the wrong place."""
    record, _, _, schema_refuses = BAD_RECORDS[case]
    try:
        value = json.loads(record)
    except json.JSONDecodeError:
        assert not schema_refuses
        return
    assert _schema_validator().is_valid(value) is not schema_refuses
