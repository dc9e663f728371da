"""`assay batch`: many derivations in one run, each reported once, one bad
file never stopping the others.

The derivations are copies of the fixtures under fixtures/tptp/derivations
(whose verdicts their own tests settle: a proof is accepted, a mutant is
rejected at the step its `% broken-step:` header names); the JUnit file is
read back with junitparser from PyPI, a reader of the JUnit XML format CI
systems use.
"""

from __future__ import annotations

import json
import os
import shutil
from pathlib import Path

from click.testing import CliRunner
from junitparser import Error, Failure, JUnitXml

from checker.cli import main

ROOT = Path(__file__).resolve().parents[2]
DERIVATIONS = ROOT / "fixtures" / "tptp" / "derivations"
TIME_LIMIT = ROOT / "fixtures" / "tptp" / "time_limit"

# Cheap derivations (a few hundredths of a second each) and their expected verdicts.
PROOFS = ["ward_alarm_clause_leaves", "oxygen_supply_nested", "pump_trip_alarm", "train_door_departure",
          "warehouse_routing", "parcel_locker_release"]
MUTANTS = {  # folder: (mutant file, the step its header names as broken)
    "pump_trip_alarm": ("mutant_wrong_parent.p", "c2"),
    "warehouse_routing": ("mutant_rewrite_wrong_equation.p", "c1"),
    "signal_box_log": ("mutant_dropped_literal.p", "c2"),
}


def run_batch(*arguments: str):
    result = CliRunner().invoke(main, ["batch", *arguments], catch_exceptions=False)
    return result.exit_code, result.stdout, result.stderr


def _by_file(summary: dict) -> dict[str, dict]:
    return {Path(entry["file"]).resolve().as_posix(): entry for entry in summary["results"]}


def _make_corpus(tmp_path: Path) -> tuple[list[str], dict[str, tuple]]:
    """Over 200 derivations in three layouts, one per way of pairing a
    derivation with its problem, plus a corrupt, an unreadable and an
    over-time file.  Returns the batch arguments and, per file, what is
    expected: (verdict, problem or None, broken step or None)."""
    expected: dict[str, tuple] = {}
    # 1. Folders with proof.p beside the problem.p its leaves' file(...) sources name.
    cited = tmp_path / "cited"
    for copy in range(26):
        for name in PROOFS:
            folder = cited / f"{name}_{copy}"
            folder.mkdir(parents=True)
            shutil.copy(DERIVATIONS / name / "proof.p", folder / "proof.p")
            shutil.copy(DERIVATIONS / name / "problem.p", folder / "problem.p")
            expected[str(folder / "proof.p")] = ("accepted", folder / "problem.p", None)
    for name, (mutant, broken) in MUTANTS.items():
        folder = cited / f"{name}_mutant"
        folder.mkdir(parents=True)
        shutil.copy(DERIVATIONS / name / mutant, folder / "proof.p")
        shutil.copy(DERIVATIONS / name / "problem.p", folder / "problem.p")
        expected[str(folder / "proof.p")] = ("rejected", folder / "problem.p", broken)
    # 2. A flat folder of derivations, problems of the same name in --problems.
    named, problems = tmp_path / "named", tmp_path / "problems"
    named.mkdir()
    problems.mkdir()
    for copy in range(5):
        for name in PROOFS:
            shutil.copy(DERIVATIONS / name / "proof.p", named / f"{name}_{copy}.p")
            shutil.copy(DERIVATIONS / name / "problem.p", problems / f"{name}_{copy}.p")
            expected[str(named / f"{name}_{copy}.p")] = ("accepted", problems / f"{name}_{copy}.p", None)
    # 3. Derivations and problems with unrelated names, paired by the map.
    mapped = tmp_path / "mapped"
    (mapped / "specs").mkdir(parents=True)
    pairs = {}
    for copy, name in enumerate(PROOFS * 2):
        shutil.copy(DERIVATIONS / name / "proof.p", mapped / f"run_{copy}.p")
        shutil.copy(DERIVATIONS / name / "problem.p", mapped / "specs" / f"spec_{copy}.tptp")
        pairs[f"run_{copy}.p"] = f"specs/spec_{copy}.tptp"
        expected[str(mapped / f"run_{copy}.p")] = ("accepted", mapped / "specs" / f"spec_{copy}.tptp", None)
    (mapped / "pairs.json").write_text(json.dumps(pairs))
    # The three bad files.
    bad = tmp_path / "bad"
    bad.mkdir()
    text = (DERIVATIONS / "pump_trip_alarm" / "proof.p").read_text()
    (bad / "corrupt.p").write_text(text[: text.index("tripped(pump1), inference")])  # cut inside a statement
    expected[str(bad / "corrupt.p")] = ("unreadable", None, None)
    # chmod 000 does not stop root (CI runs as root): a link to nothing cannot be read by anyone.
    os.symlink(bad / "deleted.p", bad / "unreadable.p")
    expected[str(bad / "unreadable.p")] = ("unreadable", None, None)
    shutil.copy(TIME_LIMIT / "conveyor_counter.p", bad / "overtime.p")
    shutil.copy(TIME_LIMIT / "conveyor_counter_problem.p", bad / "conveyor_counter_problem.p")
    expected[str(bad / "overtime.p")] = ("undecided", bad / "conveyor_counter_problem.p", None)
    arguments = [str(cited / "*" / "proof.p"), str(named), str(mapped / "*.p"),
                 str(bad / "corrupt.p"), str(bad / "unreadable.p"), str(bad / "overtime.p"),
                 "--problems", str(problems), "--problem-map", str(mapped / "pairs.json")]
    return arguments, expected


def test_a_batch_of_over_200_derivations_reports_each_file_once_and_writes_junit(tmp_path):
    arguments, expected = _make_corpus(tmp_path)
    assert len(expected) > 200
    summary_path, junit_path = tmp_path / "summary.json", tmp_path / "batch.xml"
    # The over-time file needs minutes in full (every step runs its search to the bounds): far past 1 s.
    code, output, errors = run_batch(*arguments, "--jobs", "2", "--file-timeout", "1",
                                     "--json", str(summary_path), "--junit", str(junit_path))
    assert code == 2, errors  # the worst verdict: unreadable
    summary = json.loads(summary_path.read_text())
    assert summary["files"] == len(expected) == len(summary["results"])
    reported = _by_file(summary)
    assert set(reported) == {Path(path).resolve().as_posix() for path in expected}
    for path, (verdict, problem, broken) in expected.items():
        entry = reported[Path(path).resolve().as_posix()]
        assert entry["verdict"] == verdict, (path, entry)
        if problem is not None:
            assert Path(entry["problem"]).resolve() == Path(problem).resolve(), (path, entry["problem"])
        if broken is not None:
            assert entry["first_failure"]["step"] == broken
            assert entry["first_failure"]["location"].startswith(f"{path}:")
    bad = tmp_path / "bad"
    corrupt = reported[(bad / "corrupt.p").resolve().as_posix()]
    assert f"corrupt.p:{len((bad / 'corrupt.p').read_text().splitlines())}:" in corrupt["error"]
    assert "cannot read" in reported[(bad / "unreadable.p").resolve().as_posix()]["error"]
    overtime = reported[(bad / "overtime.p").resolve().as_posix()]
    assert any("the file time limit of 1 s was reached" in caution for caution in overtime["cautions"]) \
        or "the file time limit of 1 s was reached" in (overtime["error"] or "")
    assert overtime["counts"].get("checked", 0) + overtime["counts"].get("reconstructed", 0) < overtime["steps"]
    assert summary["totals"] == {"accepted": len(expected) - 6, "undecided": 1, "rejected": 3, "unreadable": 2}
    # The table: a row per file and the batch verdict.
    assert all(any(line.startswith(path) for line in output.splitlines()) for path in expected)
    assert "batch verdict unreadable (exit 2)" in output

    cases = {case.classname + "/" + case.name: case for suite in JUnitXml.fromfile(str(junit_path)) for case in suite}
    assert set(cases) == set(expected)
    for path, (verdict, _problem, broken) in expected.items():
        results = cases[path].result
        if verdict == "accepted":
            assert results == []
        elif verdict == "unreadable":
            assert len(results) == 1 and isinstance(results[0], Error) and results[0].type == "unreadable"
        else:
            assert len(results) == 1 and isinstance(results[0], Failure) and results[0].type == verdict
        if broken is not None:
            # The failure carries the diagnosis and its file:line:column.
            assert f"step {broken} " in results[0].message and results[0].message.startswith(f"{path}:")
            assert "reason: " in results[0].text


def test_the_exit_code_is_the_worst_verdict(tmp_path):
    folder = tmp_path / "pump"
    shutil.copytree(DERIVATIONS / "pump_trip_alarm", folder)
    code, output, _ = run_batch(str(folder / "proof.p"))
    assert code == 0 and "batch verdict accepted (exit 0)" in output
    code, output, _ = run_batch(str(folder / "proof.p"), str(folder / "mutant_wrong_parent.p"))
    assert code == 1 and "1 accepted, 1 rejected" in output


def test_a_directory_is_searched_for_derivations_and_the_problems_directory_is_left_out(tmp_path):
    problems = tmp_path / "problems"
    problems.mkdir()
    shutil.copy(DERIVATIONS / "pump_trip_alarm" / "proof.p", tmp_path / "pump.p")
    shutil.copy(DERIVATIONS / "pump_trip_alarm" / "problem.p", problems / "pump.p")
    (tmp_path / "notes.md").write_text("not a derivation\n")
    summary_path = tmp_path / "summary.json"
    code, _, _ = run_batch(str(tmp_path), "--problems", str(problems), "--json", str(summary_path))
    summary = json.loads(summary_path.read_text())
    assert code == 0
    assert [Path(entry["file"]).name for entry in summary["results"]] == ["pump.p"]
    assert Path(summary["results"][0]["problem"]) == problems / "pump.p"


def test_a_garbled_problem_map_is_bad_usage_with_its_place(tmp_path):
    shutil.copy(DERIVATIONS / "pump_trip_alarm" / "proof.p", tmp_path / "pump.p")
    (tmp_path / "pairs.json").write_text('{\n  "pump.p": problem.p\n}\n')
    code, output, errors = run_batch(str(tmp_path / "pump.p"), "--problem-map", str(tmp_path / "pairs.json"))
    assert code == 2
    assert "pairs.json:2:" in errors and "Traceback" not in output + errors


def test_arguments_that_name_no_derivation_are_errors(tmp_path):
    code, _, errors = run_batch(str(tmp_path / "*.p"))
    assert code == 2
    assert "no derivation files found" in errors and "no derivation files to check" in errors


def test_quiet_prints_only_errors_and_still_writes_the_summary(tmp_path):
    folder = tmp_path / "pump"
    shutil.copytree(DERIVATIONS / "pump_trip_alarm", folder)
    (tmp_path / "garbled.p").write_text("cnf(c1, axiom, p(X) | ).\n")
    summary_path = tmp_path / "summary.json"
    code, output, errors = run_batch(str(folder / "proof.p"), str(tmp_path / "garbled.p"), "--quiet",
                                     "--json", str(summary_path))
    assert code == 2
    assert output == ""
    assert errors.startswith(f"{tmp_path / 'garbled.p'}: unreadable: {tmp_path / 'garbled.p'}:1:")
    assert "proof.p" not in errors
    assert json.loads(summary_path.read_text())["files"] == 2


def test_a_whole_run_time_limit_leaves_later_files_unstarted(tmp_path):
    shutil.copy(TIME_LIMIT / "conveyor_counter.p", tmp_path / "a_overtime.p")
    shutil.copy(TIME_LIMIT / "conveyor_counter_problem.p", tmp_path / "conveyor_counter_problem.p")
    shutil.copy(DERIVATIONS / "pump_trip_alarm" / "proof.p", tmp_path / "b_pump.p")
    summary_path = tmp_path / "summary.json"
    code, _, _ = run_batch(str(tmp_path / "a_overtime.p"), str(tmp_path / "b_pump.p"), "--time-limit", "1",
                           "--json", str(summary_path))
    first, second = json.loads(summary_path.read_text())["results"]
    assert code == 3
    assert first["verdict"] == "undecided" and "the time limit of 1 s was reached" in " ".join(first["cautions"])
    assert second["verdict"] == "undecided"
    assert second["error"] == "not checked: the time limit of 1 s was reached before this file was started"
