"""The native certificate's JSON Schema and specification agree with the
reader and with the fixtures."""

from __future__ import annotations

import dataclasses
import json
import re
from pathlib import Path

import jsonschema
import pytest

from checker.kernel import rules
from formats.native import (
    EVIDENCE_FIELD_KINDS,
    EVIDENCE_RULES,
    ORIGIN_KINDS,
    PRIMITIVE_RULES,
    ROLES,
    STATUSES,
    parse_native,
)

from native_replay import first_refused

ROOT = Path(__file__).resolve().parents[2]
SCHEMA = json.loads((ROOT / "formats" / "native_certificate.schema.json").read_text(encoding="utf-8"))
SPECIFICATION = (ROOT / "formats" / "native_certificate.md").read_text(encoding="utf-8")
FIXTURES = sorted([*(ROOT / "fixtures" / "native").glob("*.jsonl"), *(ROOT / "fixtures" / "demo").glob("*.jsonl")])


def test_schema_is_a_valid_draft_2020_12_schema():
    # The JSON Schema 2020-12 meta-schema, as shipped with the jsonschema package.
    jsonschema.Draft202012Validator.check_schema(SCHEMA)
    assert SCHEMA["$schema"] == "https://json-schema.org/draft/2020-12/schema"
    assert SCHEMA["$defs"]["header"]["properties"]["assay_certificate"]["const"] == 1


@pytest.mark.parametrize("path", FIXTURES, ids=lambda p: p.name)
def test_every_fixture_record_is_valid_under_the_schema(path):
    validator = jsonschema.Draft202012Validator(SCHEMA)
    lines = [line for line in path.read_text(encoding="utf-8").split("\n") if line.strip()]
    assert lines
    for number, line in enumerate(lines, start=1):
        errors = [error.message for error in validator.iter_errors(json.loads(line))]
        assert not errors, (number, errors)


def test_schema_lists_what_the_reader_accepts():
    definitions = SCHEMA["$defs"]
    statement = definitions["statement"]["properties"]
    assert set(statement["role"]["enum"]) == ROLES
    assert set(definitions["inference"]["properties"]["status"]["enum"]) == STATUSES
    assert tuple(definitions["origin"]["properties"]["kind"]["enum"]) == ORIGIN_KINDS
    other_rule = definitions["inference"]["oneOf"][-1]["properties"]["rule"]["not"]["enum"]
    assert set(other_rule) == EVIDENCE_RULES


@pytest.mark.parametrize("rule", sorted(PRIMITIVE_RULES))
def test_schema_evidence_fields_are_the_kernel_fields(rule):
    evidence = PRIMITIVE_RULES[rule]
    schema = SCHEMA["$defs"][f"{rule}_evidence"]
    fields = dataclasses.fields(evidence)
    assert set(schema["properties"]) == {"rule"} | {f.name for f in fields}
    assert set(schema["required"]) == {"rule"} | {f.name for f in fields if f.default is dataclasses.MISSING}


def test_every_kernel_evidence_class_has_a_native_rule_and_field_kinds():
    primitive = [rules.Instantiation, rules.Resolution, rules.Paramodulation, rules.EqualityResolution, rules.EqualityFactoring]
    assert set(PRIMITIVE_RULES.values()) == set(primitive)
    for evidence in primitive:
        for field in dataclasses.fields(evidence):
            assert field.name in EVIDENCE_FIELD_KINDS, (evidence.__name__, field.name)


def test_specification_names_every_schema_field():
    names = set()
    for definition in SCHEMA["$defs"].values():
        names |= set(definition.get("properties", {}))
    for name in sorted(names):
        assert f"`{name}`" in SPECIFICATION, name
    for rule in sorted(EVIDENCE_RULES):
        assert f"`{rule}`" in SPECIFICATION, rule


def _json_blocks() -> list[str]:
    return re.findall(r"```json\n(.*?)```", SPECIFICATION, flags=re.DOTALL)


def test_specification_example_is_a_certificate_the_kernel_accepts():
    example = max(_json_blocks(), key=len)
    document = parse_native(example, "native_certificate.md")
    assert len(document.statements) >= 6
    assert first_refused(document) is None


def test_specification_snippets_are_valid_records():
    validator = jsonschema.Draft202012Validator(SCHEMA)
    header = _json_blocks()[0]
    assert validator.is_valid(json.loads(header))
