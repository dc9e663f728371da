"""Golden files of the text report for representative failures.

Each case is a certificate of the invented cold-store scenario
(fixtures/report_cases) with one thing made wrong by hand; the expected
diagnosis is what the rule as published says is wrong with it: binary
resolution needs complementary literals, equal atoms after the
substitution, and a claim that holds every literal of the resolvent
(J. A. Robinson, "A Machine-Oriented Logic Based on the Resolution
Principle", JACM 12(1), 1965); a Skolem symbol must be new to the problem
(Skolemization as in M. Fitting, "First-Order Logic and Automated Theorem
Proving", 2nd ed., 1996, from memory); a leaf must be a statement of the
problem, and a derivation must be acyclic (common practice).

Besides the whole text, each test asserts the step name, its location and
the exact terms the diagnosis must name, so a golden file cannot drift into
saying something else.  After a deliberate change of wording, rewrite the
files with ``ASSAY_WRITE_GOLDEN=1 python3 -m pytest tests/cli/test_report_golden.py``
and review the difference.
"""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from checker.report import render_text
from checker.run import check

ROOT = Path(__file__).resolve().parents[2]
GOLDEN = Path(__file__).resolve().parent / "golden"
CASES = "fixtures/report_cases"
PROBLEM = f"{CASES}/cold_store_problem.p"
KEYS_PROBLEM = f"{CASES}/cold_store_keys_problem.p"


def _line_of(path: str, needle: str) -> int:
    lines = (ROOT / path).read_text(encoding="utf-8").splitlines()
    return next(number for number, text in enumerate(lines, start=1) if needle in text)


# (golden name, certificate, problem, broken step, text on its line, reason, exact terms named)
FAILURES = [
    ("sign_clash", "cold_store_sign_clash.jsonl", PROBLEM, "open_dock_alarm", '"name": "open_dock_alarm"', "same_sign",
     ["left literal 2 `alarm(D)`", "right literal 0 `open(dock)`", "are both positive"]),
    ("symbol_clash", "cold_store_symbol_clash.jsonl", PROBLEM, "open_dock_alarm", '"name": "open_dock_alarm"',
     "atoms_differ", ["`open(yard)` and `open(dock)` differ at position 1: `yard` vs `dock`"]),
    ("missing_literal", "cold_store_missing_literal.jsonl", PROBLEM, "open_dock_alarm", '"name": "open_dock_alarm"',
     "missing_from_claimed", ["produced but missing from the claimed clause: `~armed(dock)`"]),
    ("extra_literal", "cold_store_extra_literal.jsonl", PROBLEM, "open_dock_alarm", '"name": "open_dock_alarm"',
     "missing_from_claimed", ["claimed but not produced: `alarm(yard)`", "missing from the claimed clause: `alarm(dock)`"]),
    ("skolem_not_fresh", "cold_store_keys_skolem_not_fresh.p", KEYS_PROBLEM, "key_witness", "fof(key_witness,",
     "not_fresh", ["new symbol `dock/0`", "it occurs in the problem's `dock_is_door`"]),
    ("unknown_leaf", "cold_store_unknown_leaf.p", PROBLEM, "every_door_armed", "cnf(every_door_armed,",
     "not_in_problem", ["not in the problem: `armed(D)`"]),
    ("cycle", "cold_store_cycle.p", PROBLEM, "open_dock_alarm", "cnf(open_dock_alarm,", "cycle",
     ["open_dock_alarm -> dock_alarm_raised -> open_dock_alarm"]),
]


def _text(certificate: str, problem: str, verbose: bool = False) -> str:
    return render_text(check(f"{CASES}/{certificate}", problem), verbose=verbose) + "\n"


def _compare(name: str, text: str) -> None:
    golden = GOLDEN / f"{name}.txt"
    if os.environ.get("ASSAY_WRITE_GOLDEN"):
        golden.write_text(text, encoding="utf-8")
    assert text == golden.read_text(encoding="utf-8")


@pytest.mark.parametrize("case", FAILURES, ids=lambda case: case[0])
def test_the_text_report_of_a_failure_names_step_location_and_terms(case, monkeypatch):
    name, certificate, problem, step, needle, reason, terms = case
    monkeypatch.chdir(ROOT)  # paths in the report as a user in the project root sees them
    text = _text(certificate, problem)
    location = f"{CASES}/{certificate}:{_line_of(f'{CASES}/{certificate}', needle)}:1"
    failure_line = next(line for line in text.splitlines() if f"step {step} (" in line)
    assert failure_line.startswith(f"  {location}: step {step} (")
    assert ": failed: " in failure_line
    for term in terms:
        assert term in failure_line, term
    assert f"      reason: {reason}" in text
    _compare(name, text)


def test_all_steps_lists_every_failing_step_and_what_rests_on_it(monkeypatch):
    monkeypatch.chdir(ROOT)
    certificate = "cold_store_missing_literal.jsonl"
    short = _text(certificate, PROBLEM)
    full = _text(certificate, PROBLEM, verbose=True)
    # Dropping ~armed(dock) also breaks the next resolution, which now meets
    # alarm(dock) where it expects ~armed(dock): two failures of their own.
    assert "step dock_alarm_raised" not in short
    assert "and 1 more failed, refuted or unproven steps" in short
    assert "step dock_alarm_raised (resolution): failed: " in full
    assert "step contradiction (resolution): unfounded: rests on failed step `dock_alarm_raised`" in full
    _compare("missing_literal_all_steps", full)


def test_notes_and_trust_summary_of_a_valid_derivation(monkeypatch):
    monkeypatch.chdir(ROOT)
    text = _text("cold_store_notes.p", PROBLEM)
    assert "cold_store_notes.p: accepted" in text
    assert "note: not needed for the refutation (2): armed_or_not, dock_is_dock" in text
    assert "note: leaves used by no step (1): door_open_again" in text
    assert "it has both `armed(dock)` and `~armed(dock)`" in text
    assert "`dock = dock` holds by reflexivity" in text
    assert "    leaves taken as assumptions: none" in text
    _compare("notes", text)
