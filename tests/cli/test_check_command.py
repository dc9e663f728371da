"""The `assay check` command: verdicts, exit codes and report fields.

Exit codes and outcomes are those of the design (DESIGN section 4); the
demo certificate and its broken copy are the bundled fixtures.
"""

import json
import os
import subprocess
import sys
from pathlib import Path

from click.testing import CliRunner

from checker.cli import main

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "fixtures" / "demo"


def run(*args: str):
    result = CliRunner().invoke(main, ["check", *args], catch_exceptions=False)
    return result.exit_code, result.output


def test_demo_is_accepted_against_its_problem():
    code, output = run(str(DEMO / "interlock.jsonl"), "--problem", str(DEMO / "interlock_problem.p"))
    assert code == 0, output
    assert "interlock.jsonl: accepted" in output
    assert "axioms as written" in output  # the caution accompanies every text report


def test_broken_demo_is_rejected_at_the_broken_step_with_a_located_diagnosis():
    code, output = run(str(DEMO / "interlock_broken.jsonl"), "--report", "json")
    assert code == 1
    report = json.loads(output)
    assert report["verdict"] == "rejected"
    failure = report["first_failure"]
    assert failure["step"] == "p1_flow_path"
    assert failure["outcome"] == "failed"
    lines = (DEMO / "interlock_broken.jsonl").read_text().splitlines()
    line = next(n for n, text in enumerate(lines, start=1) if '"name": "p1_flow_path"' in text)
    assert failure["location"].endswith(f"interlock_broken.jsonl:{line}:1")
    # The diagnosis names the literals and the clashing terms.
    assert "p2" in failure["message"] and "p1" in failure["message"]


def test_json_report_has_the_fields_programs_rely_on():
    code, output = run(str(DEMO / "interlock.jsonl"), "--report", "json")
    report = json.loads(output)
    assert code == 0
    assert set(report) >= {"verdict", "counts", "first_failure", "steps"}
    assert report["first_failure"] is None
    assert sum(report["counts"].values()) == len(report["steps"])
    assert all(set(step) >= {"name", "outcome"} for step in report["steps"])
    # The header names the problem, so leaves are checked, not assumed.
    assert "assumed" not in report["counts"]
    assert [Path(f).name for f in report["files_read"]] == ["interlock.jsonl", "interlock_problem.p"]


def test_batch_reports_the_worst_verdict_and_checks_every_file(tmp_path):
    unreadable = tmp_path / "garbled.p"
    unreadable.write_text("cnf(c1, axiom, p(X) | ).\n")
    code, output = run(str(unreadable), str(DEMO / "interlock.jsonl"), str(DEMO / "interlock_broken.jsonl"))
    assert code == 2
    assert "garbled.p: unreadable" in output
    assert "garbled.p:1:" in output
    assert "interlock.jsonl: accepted" in output
    assert "interlock_broken.jsonl: rejected" in output
    assert "Traceback" not in output


def test_missing_file_is_unreadable_not_a_traceback(tmp_path):
    code, output = run(str(tmp_path / "nowhere.p"))
    assert code == 2
    assert "cannot read" in output and "Traceback" not in output


def test_bad_usage_exits_2():
    result = CliRunner().invoke(main, ["check"])
    assert result.exit_code == 2
    result = CliRunner().invoke(main, ["check", "x.p", "--report", "pdf"])
    assert result.exit_code == 2


def test_record_ties_the_verdict_to_file_hashes(tmp_path):
    import hashlib

    record_path = tmp_path / "record.json"
    code, _ = run(str(DEMO / "interlock.jsonl"), "--record", str(record_path))
    assert code == 0
    record = json.loads(record_path.read_text())
    entry = record["files"][0]
    assert entry["certificate_sha256"] == hashlib.sha256((DEMO / "interlock.jsonl").read_bytes()).hexdigest()
    assert entry["report"]["verdict"] == "accepted"
    assert "does not show that those axioms describe the real system" in record["scope"]


def test_module_entry_point_runs_the_same_command():
    completed = subprocess.run(
        [sys.executable, "-m", "checker", "check", str(DEMO / "interlock_broken.jsonl")],
        capture_output=True, text=True, cwd=ROOT, env={**os.environ},
    )
    assert completed.returncode == 1
    assert "rejected" in completed.stdout


def test_internal_error_exits_4_without_traceback_or_acceptance(monkeypatch):
    # A bug anywhere must never be reported as accepted (DESIGN section 4).
    import checker.run

    def broken_plan(document):
        raise RuntimeError("planted fault")

    monkeypatch.setattr(checker.run, "make_plan", broken_plan)
    code, output = run(str(DEMO / "interlock.jsonl"), str(DEMO / "interlock_broken.jsonl"))
    assert code == 4
    assert "internal error in assay (RuntimeError: planted fault at" in output
    assert "accepted" not in output.replace("nothing was accepted", "")
    assert "Traceback" not in output


def test_unwritable_record_is_a_usage_error(tmp_path):
    code, output = run(str(DEMO / "interlock.jsonl"), "--record", str(tmp_path / "missing" / "record.json"))
    assert code == 2
    assert "record.json" in output


def test_a_gate_can_require_a_problem(tmp_path):
    proof = tmp_path / "assumed.p"
    proof.write_text("cnf(a, axiom, p).\ncnf(b, axiom, ~ p).\ncnf(c, plain, $false, inference(r, [status(thm)], [a, b])).\n")
    code, output = run(str(proof))
    assert code == 0 and "no problem was given" in output
    code, output = run(str(proof), "--require-problem")
    assert code == 2
    assert "no problem given or found, and one is required" in output


def test_json_failures_carry_their_reason_code():
    code, output = run(str(DEMO / "interlock_broken.jsonl"), "--report", "json")
    report = json.loads(output)
    assert report["first_failure"]["reason"] == "atoms_differ"
    reasons = {step["name"]: step["reason"] for step in report["steps"]}
    assert reasons["p1_flow_path"] == "atoms_differ"
    assert all(reason is None for name, reason in reasons.items() if name != "p1_flow_path")


def test_a_long_list_of_assumed_leaves_is_cut_short(tmp_path):
    proof = tmp_path / "many.p"
    leaves = [f"cnf(a{i}, axiom, p{i})." for i in range(30)]
    proof.write_text("\n".join(leaves) + "\ncnf(z, axiom, $false).\n")
    code, output = run(str(proof))
    assert code == 0
    assert "assumed leaves: a0, a1," in output and "and 11 more" in output
