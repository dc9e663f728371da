"""The JSON report against its schema (formats/check_report.schema.json).

The schema is checked as a JSON Schema by the reference validator from
PyPI (jsonschema, draft 2020-12), and the report of every fixture is
validated against it in this process.  The report's layout does not depend
on how far the evidence search goes, so the fixtures are checked with the
smallest search bounds: the reports are then mostly of unproven and
failed steps, which carry the most fields.  The prover corpus
(fixtures/tptp/prover_corpus) takes minutes even so; bench/bench_report_schema.py
validates its reports with the default bounds.
"""

from __future__ import annotations

import json
from dataclasses import fields
from pathlib import Path

import jsonschema
import pytest

from checker.outcomes import INTERNAL_ERROR, Report
from checker.report import REPORT_VERSION, render_json, report_json
from checker.run import check
from checker.search.reconstruct import SearchLimits

ROOT = Path(__file__).resolve().parents[2]
SCHEMA = json.loads((ROOT / "formats" / "check_report.schema.json").read_text(encoding="utf-8"))
VALIDATOR = jsonschema.Draft202012Validator(SCHEMA)
SMALLEST = SearchLimits(**{field.name: 1 for field in fields(SearchLimits)})


def fixture_certificates() -> list[Path]:
    """Every certificate and derivation under fixtures/ (problems and axiom
    files are checked as what they are: read, then refused or checked on
    assumptions), the prover corpus aside."""
    found = []
    for path in sorted((ROOT / "fixtures").rglob("*")):
        if path.is_file() and path.suffix in (".p", ".jsonl", ".txt") and "prover_corpus" not in path.parts:
            found.append(path)
    return found


def _problem_for(path: Path) -> str | None:
    beside = path.parent / "problem.p"
    return str(beside) if beside.is_file() and beside != path else None


def _errors(instance) -> list[str]:
    return [f"{'/'.join(map(str, error.absolute_path))}: {error.message}" for error in VALIDATOR.iter_errors(instance)]


def test_the_schema_is_a_valid_json_schema_of_this_report_version():
    jsonschema.Draft202012Validator.check_schema(SCHEMA)
    assert SCHEMA["$id"].endswith(f":{REPORT_VERSION}")
    assert SCHEMA["$defs"]["report"]["properties"]["report_version"]["const"] == REPORT_VERSION


def test_there_are_fixtures_of_every_kind():
    certificates = fixture_certificates()
    assert len(certificates) > 250
    assert {path.suffix for path in certificates} == {".p", ".jsonl", ".txt"}


@pytest.mark.parametrize("path", fixture_certificates(), ids=lambda p: str(p.relative_to(ROOT / "fixtures")))
def test_the_report_of_every_fixture_matches_the_schema(path):
    report = report_json(check(str(path), _problem_for(path), limits=SMALLEST))
    assert _errors(report) == []


def test_a_batch_report_matches_the_schema():
    demo = ROOT / "fixtures" / "demo"
    reports = [check(str(demo / "interlock.jsonl")), check(str(demo / "interlock_broken.jsonl")),
               Report(str(demo / "missing.p"), INTERNAL_ERROR, error="internal error in assay (planted)")]
    assert _errors(json.loads(render_json(reports))) == []


def test_the_schema_refuses_what_a_program_could_not_rely_on():
    report = report_json(check(str(ROOT / "fixtures" / "demo" / "interlock_broken.jsonl")))
    assert _errors(report) == []
    for broken in (
        {**report, "verdict": "fine"},
        {**report, "steps": [{**report["steps"][0], "outcome": "passed"}]},
        {**report, "report_version": 1},
        {key: value for key, value in report.items() if key != "scope"},
        {**report, "counts": {"checked": 0}},
        {**report, "elapsed_seconds": 0.5},
    ):
        assert _errors(broken) != []
