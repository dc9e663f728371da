"""The JSON report is the same bytes on every run.

Run in fresh processes with different string-hash seeds (PYTHONHASHSEED,
which changes the iteration order of sets of names) and different
``--jobs`` (which changes which process checks which step and where terms
live in memory), the JSON report of a batch must not change by one byte.
The batch mixes shapes: a counter-model (refuted Skolem witness), a proxy
axiom not implied, a valid clause-form derivation with Skolem symbols, a
case split, notes, and a native certificate with unfounded steps.
"""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
DERIVATIONS = "fixtures/tptp/derivations"
BATCH = [
    f"{DERIVATIONS}/badge_door_access_eprover/mutant_skolem_term_of_another_badge.p",
    f"{DERIVATIONS}/dock_gate_equality_proxy/mutant_proxy_axiom_not_implied.p",
    f"{DERIVATIONS}/hangar_crew_rota/proof.p",
    "fixtures/tptp/splitting/gate_guarded/mutant_guard_swapped.p",
    "fixtures/report_cases/cold_store_notes.p",
    "fixtures/demo/interlock_broken.jsonl",
]


def _report(seed: str, jobs: int) -> bytes:
    completed = subprocess.run(
        [sys.executable, "-m", "checker", "check", *BATCH, "--report", "json", "--jobs", str(jobs)],
        check=False, capture_output=True, cwd=ROOT, env={**os.environ, "PYTHONHASHSEED": seed}, timeout=600,
    )
    assert completed.returncode == 1, completed.stderr  # the batch holds rejected derivations
    return completed.stdout


def test_json_reports_are_byte_identical_across_runs_jobs_and_hash_seeds():
    first = _report("0", 1)
    assert b'"unfounded"' in first and b'"refuted"' in first and b'"introduced"' in first
    for seed, jobs in (("0", 1), ("1", 2), ("random", 3)):
        assert _report(seed, jobs) == first, (seed, jobs)
