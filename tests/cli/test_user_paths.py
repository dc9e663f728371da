"""`assay check` on the inputs a new user tries first: odd files, odd
options, a missing problem, and what the report then says.

Exit codes are the README's: 0 accepted, 1 rejected, 2 unreadable input or
bad usage, 3 undecided, 4 internal error.
"""

import hashlib
import json
import shutil
from pathlib import Path

import pytest
from click.testing import CliRunner

from checker.cli import main

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "fixtures" / "demo"
DERIVATIONS = ROOT / "fixtures" / "tptp" / "derivations"
CLAUSIFICATION = ROOT / "fixtures" / "tptp" / "clausification"


def run(*args: str):
    result = CliRunner().invoke(main, ["check", *args], catch_exceptions=False)
    return result.exit_code, result.output


# Bytes that are not UTF-8 (0xff never occurs in UTF-8, common practice).
NOT_UTF8 = b"\xff\xfe\x00\x97 not text \x80\x81"


@pytest.mark.parametrize("name", ["log.p", "certificate.jsonl"])
def test_a_file_that_is_not_utf8_is_unreadable_not_an_internal_error(tmp_path, name):
    path = tmp_path / name
    path.write_bytes(NOT_UTF8)
    code, output = run(str(path))
    assert code == 2, output
    assert f"{name}: unreadable" in output
    assert "internal error" not in output


@pytest.mark.parametrize("text", ["", "\n\n", "prover ran out of time\nno proof found\n"])
def test_a_tptp_file_with_no_statement_is_unreadable(tmp_path, text):
    # An empty native certificate is unreadable; a TPTP file holding no
    # statement at all has no derivation to reject either.
    path = tmp_path / "proof.p"
    path.write_text(text)
    code, output = run(str(path))
    assert code == 2, output
    assert "proof.p: unreadable" in output


def test_an_include_directory_that_does_not_exist_is_bad_usage():
    proof = DERIVATIONS / "conveyor_include" / "proof.p"
    code, output = run(str(proof), "--include-dir", str(ROOT / "no_such_directory"))
    assert code == 2, output


def test_a_problem_named_by_the_header_but_missing_is_named_in_the_report(tmp_path):
    # The header names interlock_problem.p, which is not next to the copy.
    copy = tmp_path / "interlock.jsonl"
    shutil.copy(DEMO / "interlock.jsonl", copy)
    code, output = run(str(copy))
    assert "interlock_problem.p" in output, output
    assert "no problem was given" not in output


def test_a_duplicate_name_does_not_change_which_statement_a_parent_is(tmp_path):
    # The report calls the second `a` the duplicate of the first, so the
    # step whose parent is `a` is checked against the first one, from which
    # it follows (p(x) with ~p(X) gives the empty clause).
    path = tmp_path / "duplicate.p"
    path.write_text(
        "cnf(a, axiom, p(x)).\n"
        "cnf(b, negated_conjecture, ~ p(X)).\n"
        "cnf(a, axiom, q(x)).\n"
        "cnf(f, plain, $false, inference(resolve, [status(thm)], [a, b])).\n"
    )
    code, output = run(str(path), "--report", "json")
    report = json.loads(output)
    assert code == 1
    outcomes = {step["name"]: step["outcome"] for step in report["steps"] if step["name"] == "f"}
    assert outcomes == {"f": "reconstructed"}, report["steps"]


def _first_failure(*args: str) -> dict:
    _, output = run(*args, "--report", "json")
    return json.loads(output)["first_failure"]


def test_a_failed_leaf_carries_a_reason_code():
    # DEVELOPERS.md: a failure's details carry a `reason: CODE` line.
    folder = DERIVATIONS / "train_door_departure"
    failure = _first_failure(str(folder / "mutant_leaf_literal_dropped.p"), "--problem", str(folder / "problem.p"))
    assert failure["outcome"] == "failed"
    assert any(line.startswith("reason: ") for line in failure["details"]), failure


def test_a_dangling_parent_carries_a_reason_code(tmp_path):
    path = tmp_path / "dangling.p"
    path.write_text(
        "cnf(a, axiom, p).\ncnf(b, negated_conjecture, ~ p).\n"
        "cnf(c, plain, $false, inference(resolve, [status(thm)], [a, ghost])).\n"
    )
    failure = _first_failure(str(path))
    assert failure["step"] == "c"
    assert any(line.startswith("reason: ") for line in failure["details"]), failure


def test_a_derivation_without_the_empty_clause_carries_a_reason_code(tmp_path):
    path = tmp_path / "no_refutation.p"
    path.write_text("cnf(a, axiom, p).\n")
    failure = _first_failure(str(path))
    assert failure["outcome"] == "failed"
    assert any(line.startswith("reason: ") for line in failure["details"]), failure


def test_the_check_record_hashes_the_axiom_files_the_problem_includes(tmp_path):
    folder = DERIVATIONS / "conveyor_include"
    record_path = tmp_path / "record.json"
    code, output = run(str(folder / "proof.p"), "--problem", str(folder / "problem.p"), "--record", str(record_path))
    assert code == 0, output
    included = hashlib.sha256((folder / "conveyor_axioms.ax").read_bytes()).hexdigest()
    assert included in record_path.read_text(), "the included axioms are part of what was checked"


def test_a_refuted_skolemization_step_has_a_grammatical_message():
    failure = _first_failure(str(CLAUSIFICATION / "skolemization_strengthened.p"))
    assert failure["step"] == "s1" and failure["outcome"] == "refuted"
    assert "claims it Skolemization" not in failure["message"], failure["message"]
