"""`assay batch --cluster`: the same batch on a Dask distributed cluster.

The test starts its own cluster on the loopback address: a scheduler and
two workers, each a separate process (the `dask scheduler` and `dask
worker` commands of the distributed package), and kills one worker while
the batch runs.  The batch must still report every file exactly once, with
the same verdicts as a local run.
"""

from __future__ import annotations

import json
import os
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest
from distributed import Client

from checker.batch import make_jobs, run_batch
from checker.outcomes import INTERNAL_ERROR

ROOT = Path(__file__).resolve().parents[2]
DERIVATIONS = ROOT / "fixtures" / "tptp" / "derivations"
SLOW = ROOT / "fixtures" / "tptp" / "time_limit"
START_SECONDS = 120  # to start a process of the cluster on a busy machine


def _start(arguments: list[str], log: Path) -> subprocess.Popen:
    with open(log, "w") as out:
        return subprocess.Popen([sys.executable, "-m", "dask", *arguments], cwd=ROOT, stdout=out,
                                stderr=subprocess.STDOUT, stdin=subprocess.DEVNULL)


@pytest.fixture
def cluster(tmp_path):
    """A scheduler and two workers on 127.0.0.1; yields (address, {worker address: process})."""
    scheduler_file = tmp_path / "scheduler.json"
    processes = [_start(["scheduler", "--host", "127.0.0.1", "--port", "0", "--no-dashboard",
                         "--scheduler-file", str(scheduler_file)], tmp_path / "scheduler.log")]
    try:
        waited = time.monotonic()
        while not scheduler_file.exists() and time.monotonic() - waited < START_SECONDS:
            assert processes[0].poll() is None, (tmp_path / "scheduler.log").read_text()
            time.sleep(0.2)
        address = json.loads(scheduler_file.read_text())["address"]
        for number in range(2):
            processes.append(_start(["worker", address, "--host", "127.0.0.1", "--nthreads", "1", "--no-nanny",
                                     "--no-dashboard"], tmp_path / f"worker{number}.log"))
        with Client(address, timeout=START_SECONDS) as client:
            client.wait_for_workers(2, timeout=START_SECONDS)
            pids = client.run(os.getpid)
        by_pid = {process.pid: process for process in processes[1:]}
        yield address, {worker: by_pid[pid] for worker, pid in pids.items()}
    finally:
        for process in processes:
            process.terminate()  # a worker ends its own children as it closes
            try:
                process.wait(timeout=START_SECONDS)
            except subprocess.TimeoutExpired:
                process.kill()
                process.wait()


def _corpus(tmp_path: Path) -> list[str]:
    paths = []
    for copy in range(8):
        for name in ("pump_trip_alarm", "crane_load_limit"):
            folder = tmp_path / "files" / f"{name}_{copy}"
            shutil.copytree(DERIVATIONS / name, folder)
            paths.append(str(folder / "proof.p"))
    paths.append(str(tmp_path / "files" / "pump_trip_alarm_0" / "mutant_wrong_parent.p"))
    (tmp_path / "files" / "garbled.p").write_text("cnf(c1, axiom, p(X) | ).\n")
    paths.append(str(tmp_path / "files" / "garbled.p"))
    for copy in range(2):  # long enough for a worker to be killed in the middle of one
        folder = tmp_path / "files" / f"slow_{copy}"
        shutil.copytree(SLOW, folder)
        paths.insert(4 * copy + 2, str(folder / "conveyor_counter.p"))
    return paths


def _summary(result) -> tuple:
    """What a local and a cluster run must agree on (times aside; and for a
    file cut short by its time limit, which steps the limit reached)."""
    failure = None if result.cut_short or result.first_failure is None else result.first_failure.name
    return result.path, result.verdict, result.steps, failure, result.cut_short


def test_a_batch_on_a_cluster_survives_a_lost_worker_and_matches_a_local_run(tmp_path, cluster):
    address, workers = cluster
    jobs = make_jobs(_corpus(tmp_path), file_timeout=1)
    killed = []

    def kill_a_busy_worker(_result) -> None:
        if killed:
            return
        with Client(address, timeout=START_SECONDS) as client:
            busy = [worker for worker, tasks in client.processing().items() if tasks]
        victim = (busy or list(workers))[0]
        workers[victim].send_signal(signal.SIGKILL)
        killed.append((victim, bool(busy)))

    on_cluster = run_batch(jobs, cluster=address, on_result=kill_a_busy_worker)
    (victim, was_busy), = killed
    assert workers[victim].wait() == -signal.SIGKILL and was_busy
    assert [result.path for result in on_cluster.results] == [job.path for job in jobs]
    assert all(result.verdict != INTERNAL_ERROR for result in on_cluster.results)
    local = run_batch(jobs, workers=2)
    assert [_summary(result) for result in on_cluster.results] == [_summary(result) for result in local.results]
    assert sum(result.cut_short for result in on_cluster.results) == 2
    assert on_cluster.verdict == "unreadable"
