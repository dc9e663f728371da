"""A whole run's time limit: the run ends with a report, the steps not
reached are listed as unchecked, and nothing cut short is accepted.

fixtures/tptp/time_limit/conveyor_counter.p is a derivation whose every
step runs its search to the bounds (a minute or more in full), so a limit
of a second always cuts it short.
"""

from __future__ import annotations

import signal
import threading
from pathlib import Path

from click.testing import CliRunner

from checker.cli import main
from checker.outcomes import ACCEPTED, UNDECIDED, UNPROVEN
from checker.run import check
from checker.time_limit import TIME_LIMIT_REASON, Deadline, run_before

ROOT = Path(__file__).resolve().parents[2]
SLOW = ROOT / "fixtures" / "tptp" / "time_limit" / "conveyor_counter.p"
PUMP = ROOT / "fixtures" / "tptp" / "derivations" / "pump_trip_alarm" / "proof.p"


def _spin() -> str:
    while True:
        pass


def test_a_step_running_past_the_deadline_is_interrupted():
    assert run_before(Deadline.after(0.2), _spin) is None


def test_a_step_within_the_deadline_gives_its_result_and_the_alarm_is_put_back():
    def previous(_signum, _frame):
        raise AssertionError("not expected to ring")

    signal.signal(signal.SIGALRM, previous)
    try:
        assert run_before(Deadline.after(30), sum, [1, 2, 3]) == 6
        assert signal.getsignal(signal.SIGALRM) is previous
        assert signal.getitimer(signal.ITIMER_REAL) == (0.0, 0.0)
    finally:
        signal.signal(signal.SIGALRM, signal.SIG_DFL)


def test_a_passed_deadline_runs_nothing():
    ran = []
    assert run_before(Deadline.after(-1), ran.append, 1) is None
    assert ran == []


def test_outside_the_main_thread_the_deadline_is_looked_at_before_the_step():
    found = []
    thread = threading.Thread(target=lambda: found.append(run_before(Deadline.after(30), sum, [4, 5])))
    thread.start()
    thread.join()
    assert found == [9]


def test_a_run_with_no_time_left_lists_every_step_as_unchecked_and_is_not_accepted():
    report = check(str(PUMP), deadline=Deadline.after(-1))
    assert report.verdict == UNDECIDED
    assert len(report.steps) == 7
    assert all(step.outcome == UNPROVEN and step.reason == TIME_LIMIT_REASON for step in report.steps)
    assert report.steps[-1].location is not None and report.steps[-1].location.line == 9
    (caution,) = [c for c in report.cautions if "left unchecked" in c]
    assert caution.startswith("the time limit of ") and "7 steps left unchecked: " in caution
    assert all(step.name in caution for step in report.steps)


def test_the_same_run_with_time_enough_is_accepted():
    assert check(str(PUMP), deadline=Deadline.after(600)).verdict == ACCEPTED


def test_a_long_run_is_cut_short_and_the_steps_after_the_cut_are_listed():
    report = check(str(SLOW), deadline=Deadline.after(1.0))
    assert report.verdict == UNDECIDED
    unchecked = [step.name for step in report.steps if step.reason == TIME_LIMIT_REASON]
    assert unchecked and unchecked[-1] == "c91"
    # Every step after the first one left unchecked is unchecked too (steps run in order).
    names = [step.name for step in report.steps]
    assert names[names.index(unchecked[0]):] == unchecked
    assert any(f"{len(unchecked)} steps left unchecked" in caution for caution in report.cautions)


def test_with_two_processes_each_stops_at_the_deadline():
    report = check(str(SLOW), jobs=2, deadline=Deadline.after(1.0))
    assert report.verdict == UNDECIDED
    assert report.steps[-1].reason == TIME_LIMIT_REASON
    assert len(report.steps) == 96


def test_check_time_limit_option_leaves_later_files_unstarted():
    result = CliRunner().invoke(main, ["check", str(SLOW), str(PUMP), "--time-limit", "1"], catch_exceptions=False)
    assert result.exit_code == 3
    assert "caution: the time limit of 1 s was reached: " in result.stdout
    assert f"{PUMP}: undecided\nnot checked: the time limit of 1 s was reached before this file was started" \
        in result.stdout
