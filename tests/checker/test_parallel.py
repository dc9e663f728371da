"""--jobs N: the same report, whatever the number of processes."""

from pathlib import Path

import pytest

from checker.outcomes import INTERNAL_ERROR
from checker.parallel import map_in_processes
from checker.run import check

FIXTURES = Path(__file__).resolve().parents[2] / "fixtures"
CASES = [
    FIXTURES / "demo" / "interlock_broken.jsonl",
    FIXTURES / "tptp" / "pelletier" / "p40_refutation.p",
    FIXTURES / "tptp" / "derivations" / "oxygen_supply_nested" / "proof.p",
    FIXTURES / "tptp" / "derivations" / "mine_evacuation_hoists" / "mutant_skolem_reused_from_other_step.p",
    FIXTURES / "tptp" / "clausification" / "negated_conjecture_other_conjecture.p",
]


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.stem)
def test_two_processes_give_the_report_one_gives(path):
    assert check(str(path), jobs=2) == check(str(path), jobs=1)


def test_results_come_back_in_order():
    assert map_in_processes(lambda n: n * n, list(range(50)), jobs=2) == [n * n for n in range(50)]


def test_a_fault_in_a_worker_is_an_internal_error(monkeypatch):
    def broken(step, parents, context):
        raise RuntimeError("planted fault")

    monkeypatch.setattr("checker.run.check_inference", broken)
    report = check(str(CASES[1]), jobs=2)
    assert report.verdict == INTERNAL_ERROR
    assert "planted fault" in report.error
