"""`assay verify-record`: a check record verified later.

The record ties the verdict to SHA-256 hashes (FIPS 180-4, recomputed here
with Python's hashlib) of every file checked and of the kernel's sources;
changing one byte of any of them must make the record fail and name the
file.  The files are copies of the conveyor_include scenario (a
derivation, its problem, and an axiom file the problem includes) in a
temporary folder, so the test can change them.
"""

from __future__ import annotations

import json
import shutil
from pathlib import Path

import pytest
from click.testing import CliRunner

from checker.cli import main
from checker.record import FILE_CHANGED, KERNEL_CHANGED, OUTCOME_DIFFERS, RECORD_HOLDS, RECORD_UNREADABLE, verify_record

ROOT = Path(__file__).resolve().parents[2]
SCENARIO = ROOT / "fixtures" / "tptp" / "derivations" / "conveyor_include"


def _invoke(*args: str):
    result = CliRunner().invoke(main, list(args), catch_exceptions=False)
    return result.exit_code, result.output


@pytest.fixture
def recorded(tmp_path, monkeypatch):
    """A record of checking a copy of the scenario, made from its folder
    with relative paths, as a user in a project folder would."""
    folder = tmp_path / "conveyor"
    shutil.copytree(SCENARIO, folder)
    monkeypatch.chdir(tmp_path)
    code, output = _invoke("check", "conveyor/proof.p", "--problem", "conveyor/problem.p", "--record", "record.json")
    assert code == 0, output
    return tmp_path


def _flip_one_byte(path: Path) -> None:
    data = bytearray(path.read_bytes())
    index = data.index(b"%") if b"%" in data else len(data) - 2  # a comment byte: still readable
    data[index + 1] = ord("#") if data[index + 1] != ord("#") else ord("=")
    path.write_bytes(bytes(data))


def test_an_untouched_record_holds(recorded):
    code, output = _invoke("verify-record", "record.json")
    assert code == RECORD_HOLDS == 0, output
    assert "the record holds" in output
    assert "  conveyor/proof.p: accepted" in output


@pytest.mark.parametrize("changed", ["proof.p", "problem.p", "conveyor_axioms.ax"])
def test_one_changed_byte_of_any_checked_file_breaks_the_record_and_names_it(recorded, changed):
    assert changed in [Path(entry["path"]).name for entry in json.loads(Path("record.json").read_text())["files"][0]["files_read"]]
    _flip_one_byte(recorded / "conveyor" / changed)
    code, output = _invoke("verify-record", "record.json")
    assert code == FILE_CHANGED == 5, output
    assert f"  changed: conveyor/{changed}" in output
    assert [line for line in output.splitlines() if line.startswith("  changed:")] == [f"  changed: conveyor/{changed}"]


def test_a_missing_file_breaks_the_record(recorded):
    (recorded / "conveyor" / "conveyor_axioms.ax").unlink()
    found = verify_record("record.json")
    assert found.exit_code == FILE_CHANGED
    assert "conveyor/conveyor_axioms.ax" in found.changed_files


def test_a_record_checked_by_another_kernel_says_which_source_differs(recorded):
    record = json.loads(Path("record.json").read_text())
    sources = [source["path"] for source in record["kernel_sources"]]
    assert "checker/kernel/rules.py" in sources and "checker/kernel/terms.py" in sources
    rules = next(source for source in record["kernel_sources"] if source["path"] == "checker/kernel/rules.py")
    rules["sha256"] = "0" * 64
    Path("record.json").write_text(json.dumps(record))
    code, output = _invoke("verify-record", "record.json")
    assert code == KERNEL_CHANGED == 6, output
    assert "  kernel source changed: checker/kernel/rules.py" in output


def test_a_record_whose_outcomes_the_recheck_does_not_give_is_refused(recorded):
    record = json.loads(Path("record.json").read_text())
    report = record["files"][0]["report"]
    step = report["steps"][-1]["name"]
    report["steps"][-1]["outcome"] = "assumed"
    report["verdict"] = "undecided"
    Path("record.json").write_text(json.dumps(record))
    code, output = _invoke("verify-record", "record.json")
    assert code == OUTCOME_DIFFERS == 1, output
    assert "verdict recorded undecided, now accepted" in output
    assert f"step {step}: recorded assumed, now " in output


def test_the_record_keeps_the_options_it_was_checked_with(recorded):
    # A lower search bound recorded is the bound re-used: with one candidate
    # the re-check cannot reconstruct what the default bounds did, so the
    # outcomes differ and the record does not hold.
    record = json.loads(Path("record.json").read_text())
    assert record["options"]["problem"] == "conveyor/problem.p"
    record["search_limits"] = {name: 1 for name in record["search_limits"]}
    Path("record.json").write_text(json.dumps(record))
    assert verify_record("record.json").exit_code == OUTCOME_DIFFERS


def test_the_record_keeps_the_input_limits_and_reuses_them(recorded):
    # The derivation has clauses of more than one literal: recorded with a
    # one-literal bound, the re-check refuses the file as unreadable.
    record = json.loads(Path("record.json").read_text())
    assert record["options"]["input_limits"]["literals"] == 1000
    record["options"]["input_limits"]["literals"] = 1
    Path("record.json").write_text(json.dumps(record))
    found = verify_record("record.json")
    assert found.exit_code == OUTCOME_DIFFERS
    assert found.verdicts == ("conveyor/proof.p: unreadable",)


def test_an_input_limit_given_to_check_is_what_the_record_keeps(recorded):
    code, output = _invoke("check", "conveyor/proof.p", "--problem", "conveyor/problem.p",
                           "--input-limit", "depth=5000", "--time-limit", "300", "--record", "limited.json")
    assert code == 0, output
    options = json.loads(Path("limited.json").read_text())["options"]
    assert options["input_limits"]["depth"] == 5000 and options["time_limit"] == 300
    assert verify_record("limited.json").exit_code == RECORD_HOLDS


def test_a_difference_after_a_timed_out_check_mentions_the_time_limit(recorded):
    # A recorded `undecided` under --time-limit is re-checked without the
    # limit (wall-clock time is not reproducible), and the difference says why.
    record = json.loads(Path("record.json").read_text())
    record["options"]["time_limit"] = 0.5
    record["files"][0]["report"]["verdict"] = "undecided"
    Path("record.json").write_text(json.dumps(record))
    found = verify_record("record.json")
    assert found.exit_code == OUTCOME_DIFFERS
    assert "ran under a time limit of 0.5 s" in found.differences[0]


def test_unknown_recorded_input_limits_make_the_record_unreadable(recorded):
    record = json.loads(Path("record.json").read_text())
    record["options"]["input_limits"] = {"pages": 3}
    Path("record.json").write_text(json.dumps(record))
    code, output = _invoke("verify-record", "record.json")
    assert code == RECORD_UNREADABLE and "input limits this assay does not know: pages" in output


def test_a_record_found_elsewhere_is_verified_from_a_base_directory(recorded, tmp_path_factory):
    moved = tmp_path_factory.mktemp("archive")
    shutil.copytree(recorded / "conveyor", moved / "conveyor")
    shutil.copy(recorded / "record.json", moved / "record.json")
    shutil.rmtree(recorded / "conveyor")
    assert verify_record(str(moved / "record.json")).exit_code == FILE_CHANGED
    code, output = _invoke("verify-record", str(moved / "record.json"), "--base-dir", str(moved))
    assert code == RECORD_HOLDS, output


def test_an_unreadable_record_is_a_clear_error(tmp_path):
    for text, words in (("{", "not a JSON check record"), ('{"record": "other"}', "not an assay check record"),
                        ('{"record": "assay check record", "files": []}', "record version 1 cannot be verified")):
        path = tmp_path / "record.json"
        path.write_text(text)
        code, output = _invoke("verify-record", str(path))
        assert code == RECORD_UNREADABLE == 2
        assert words in output and "Traceback" not in output
    code, output = _invoke("verify-record", str(tmp_path / "nowhere.json"))
    assert code == RECORD_UNREADABLE and "cannot read" in output
