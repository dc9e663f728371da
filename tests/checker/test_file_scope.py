"""One process checking file after file keeps its term and formula tables
flat, and checks each file as if it were the first."""

from __future__ import annotations

import threading
from pathlib import Path

from checker.kernel import formulas, terms
from checker.kernel.terms import application
from checker.run import check
from checker.tables import file_scope

FIXTURES = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "splitting" / "conveyor_three_components"


def test_tables_are_back_to_their_size_after_each_file_and_verdicts_repeat():
    sizes, verdicts = [], []
    for _ in range(3):
        verdicts.append(check(str(FIXTURES / "proof.p"), str(FIXTURES / "problem.p")).verdict)
        verdicts.append(check(str(FIXTURES / "mutant_split_drops_component.p"), str(FIXTURES / "problem.p")).verdict)
        sizes.append((terms.table_size(), formulas.table_size()))
    # expected verdicts: the fixtures' own "% expected:" lines (accepted; rejected at s1)
    assert verdicts == ["accepted", "rejected"] * 3
    assert sizes[0] == sizes[1] == sizes[2]


def test_only_the_last_of_overlapping_scopes_forgets():
    before = terms.table_size()
    with file_scope():
        outer = application("pallet_outer")
        with file_scope():
            application("pallet_inner")
        assert application("pallet_outer") is outer  # the inner scope's exit forgot nothing
        assert terms.table_size() == before + 2
    assert terms.table_size() == before


def test_a_scope_in_another_thread_does_not_free_this_one():
    before = terms.table_size()
    entered, release = threading.Event(), threading.Event()

    def other_file():
        with file_scope():
            application("dock_other")
            entered.set()
            release.wait(5)

    with file_scope():
        mine = application("dock_mine")
        worker = threading.Thread(target=other_file)
        worker.start()
        entered.wait(5)
        release.set()
        worker.join()
        assert application("dock_mine") is mine
    assert terms.table_size() == before
