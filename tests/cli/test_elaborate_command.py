"""The `assay elaborate` command: a certificate for an accepted derivation,
a refusal (exit 1, nothing written) for any other, a marked partial one on
request."""

import json
from pathlib import Path

from click.testing import CliRunner

from checker.cli import main

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "fixtures" / "demo"


def run(*args: str):
    result = CliRunner().invoke(main, ["elaborate", *args], catch_exceptions=False)
    return result.exit_code, result.output


def test_an_accepted_derivation_is_written_and_rechecks_with_every_step_checked(tmp_path):
    out = tmp_path / "skid.jsonl"
    code, output = run(str(DEMO / "interlock.jsonl"), "-o", str(out))
    assert code == 0, output
    assert "certificate written to" in output
    assert json.loads(out.read_text(encoding="utf-8").splitlines()[0])["assay_certificate"] == 2
    result = CliRunner().invoke(main, ["check", str(out), "--report", "json"], catch_exceptions=False)
    report = json.loads(result.output)
    assert result.exit_code == 0 and {step["outcome"] for step in report["steps"]} == {"checked"}


def test_a_rejected_derivation_is_refused_and_nothing_is_written(tmp_path):
    out = tmp_path / "never.jsonl"
    code, output = run(str(DEMO / "interlock_broken.jsonl"), "-o", str(out))
    assert code == 1
    assert "p1_flow_path" in output and not out.exists()


def test_partial_writes_a_certificate_marked_partial_and_still_exits_1(tmp_path):
    out = tmp_path / "partial.jsonl"
    code, output = run(str(DEMO / "interlock_broken.jsonl"), "-o", str(out), "--partial")
    assert code == 1
    assert "partial certificate written" in output
    assert json.loads(out.read_text(encoding="utf-8").splitlines()[0])["partial"] is True


def test_unreadable_input_keeps_its_own_exit_code(tmp_path):
    code, _ = run(str(tmp_path / "missing.p"), "-o", str(tmp_path / "out.jsonl"))
    assert code == 2
