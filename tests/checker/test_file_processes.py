"""Worker processes of a batch: a file whose check crashes, raises or
hangs is reported for itself, and the other files are checked as usual."""

from __future__ import annotations

import os
import time
from dataclasses import replace
from pathlib import Path

from checker import file_processes
from checker.batch_results import FileJob, FileResult, check_file
from checker.file_processes import check_in_processes
from checker.outcomes import ACCEPTED, INTERNAL_ERROR, UNDECIDED
from checker.time_limit import Deadline

ROOT = Path(__file__).resolve().parents[2]
PUMP = str(ROOT / "fixtures" / "tptp" / "derivations" / "pump_trip_alarm" / "proof.p")


def _misbehaving(job: FileJob):
    """Check as usual, except for files named to crash, raise or hang."""
    name = os.path.basename(job.path)
    if name == "crash.p":
        os._exit(7)
    if name == "killed.p":
        os.kill(os.getpid(), 9)
    if name == "raise.p":
        raise RuntimeError("a bug in the checker")
    if name == "hang.p":
        while True:
            time.sleep(1)
    return check_file(job)


def test_a_crash_or_exception_costs_only_its_own_file():
    jobs = [FileJob(PUMP), FileJob("crash.p"), FileJob(PUMP), FileJob("killed.p"), FileJob("raise.p"), FileJob(PUMP)]
    heard = []
    results = check_in_processes(jobs, 2, _misbehaving, on_result=heard.append)
    assert [result.path for result in results] == [job.path for job in jobs]
    assert sorted(result.path for result in heard) == sorted(job.path for job in jobs)
    assert [result.verdict for result in results] == [ACCEPTED, INTERNAL_ERROR, ACCEPTED, INTERNAL_ERROR,
                                                      INTERNAL_ERROR, ACCEPTED]
    assert "ended (exit code 7) without a report; nothing was accepted" in results[1].error
    assert "ended (killed by SIGKILL) without a report" in results[3].error
    assert "RuntimeError: a bug in the checker" in results[4].error


def test_a_file_stuck_past_its_limit_and_the_grace_is_stopped(monkeypatch):
    monkeypatch.setattr(file_processes, "STOP_GRACE", 0.2)
    jobs = [FileJob("hang.p", time_limit=0.2, limit_reached="the file time limit of 0.2 s was reached"),
            FileJob(PUMP, time_limit=600)]
    hung, pump = check_in_processes(jobs, 1, _misbehaving)
    assert hung.verdict == UNDECIDED
    assert hung.error == ("not checked: no report 0.2 s after the file time limit of 0.2 s was reached; "
                          "the process checking this file was stopped")
    assert pump.verdict == ACCEPTED


def test_files_not_started_before_the_run_deadline_are_undecided():
    results = check_in_processes([FileJob(PUMP), FileJob(PUMP)], 1, deadline=Deadline.after(-1))
    assert [result.verdict for result in results] == [UNDECIDED, UNDECIDED]
    assert results[0].error == "not checked: the time limit of -1 s was reached before this file was started"


def _which_process(job: FileJob) -> FileResult:
    return FileResult(job.path, ACCEPTED, problem=str(os.getpid()))


def test_a_worker_checks_many_files_and_is_replaced_after_its_share(monkeypatch):
    monkeypatch.setattr(file_processes, "FILES_PER_WORKER", 2)
    results = check_in_processes([FileJob(f"{n}.p") for n in range(5)], 1, _which_process)
    processes = [result.problem for result in results]
    assert processes[0] == processes[1] != processes[2] == processes[3] != processes[4]
    assert str(os.getpid()) not in processes


def test_a_worker_is_replaced_after_a_file_its_time_limit_cut_short():
    slow = str(ROOT / "fixtures" / "tptp" / "time_limit" / "conveyor_counter.p")
    jobs = [FileJob(slow, time_limit=0.5), FileJob(PUMP)]
    cut, pump = check_in_processes(jobs, 1, _check_and_say_where)
    assert cut.cut_short and cut.verdict == UNDECIDED
    assert not pump.cut_short and pump.verdict == ACCEPTED
    assert cut.cautions[-1] != pump.cautions[-1]


def _check_and_say_where(job: FileJob) -> FileResult:
    result = check_file(job)
    return replace(result, cautions=(*result.cautions, f"process {os.getpid()}"))
