"""A small sample of the mutation run (bench/bench_mutation.py has the large one).

Mutants of a few quick certificates of different shapes: the native
certificates (version 1, and version 2 with every one of its findings made
wrong in turn), small clause derivations, a case split, a formula derivation.  Each mutant's expected answer is settled
before assay sees it, by construction or by the oracle (python-sat on
finite groundings, tests/mutation/mutation_oracle.py).  No unsound mutant
may be accepted, and each must fail first at the mutated step.
"""

from __future__ import annotations

import random

import pytest
from mutation_harness import (
    FALSE_ACCEPT,
    FALSE_REJECTION,
    INTERNAL_ERROR,
    RIGHT,
    WRONG_STEP,
    reading_once,
    run_mutant,
)
from mutation_kinds import SOUND, UNSOUND, fixtures, mutants
from mutation_oracle import countermodel_size, ground_entailment

from checker.report import report_json
from checker.run import check
from formats.tptp import parse_clause, parse_formula

QUICK = ("interlock.jsonl", "baggage_sorting", "bridge_lift_interlock", "depot_one_level", "badge_access_refutation.p",
         "crane_truck_pairing.jsonl")
PER_CERTIFICATE = 40


def _sample():
    """Some mutants of each quick certificate, and every finding made wrong in the version 2 ones."""
    chosen = [f for f in fixtures() if any(name in str(f.path) for name in QUICK)]
    found = []
    for fixture in chosen:
        every = mutants(fixture)
        picked = random.Random(fixture.path.name).sample(every, min(PER_CERTIFICATE, len(every)))
        found.extend(picked + [m for m in every if m.kind.startswith("finding_") and m not in picked])
    return found


SAMPLE = _sample()


@pytest.fixture(scope="module")
def outcomes():
    with reading_once():
        return [(mutant, run_mutant(mutant)) for mutant in SAMPLE]


def test_the_sample_covers_several_shapes_and_kinds():
    assert {m.fixture.shape for m in SAMPLE} >= {"native_v1", "native_v2", "clause_derivations", "splitting", "formula_steps"}
    assert len({m.kind for m in SAMPLE}) >= 10
    assert {"finding_wrong_leaf_hash", "finding_wrong_witness", "finding_wrong_key"} <= {m.kind for m in SAMPLE}
    assert 100 <= len(SAMPLE) <= 400


def test_no_unsound_mutant_is_accepted_and_none_crashes(outcomes):
    wrong = [o for _, o in outcomes if o.judgement in (FALSE_ACCEPT, INTERNAL_ERROR)]
    assert wrong == []


def test_each_unsound_mutant_fails_first_at_the_mutated_step(outcomes):
    unsound = [o for _, o in outcomes if o.expected == UNSOUND]
    assert len(unsound) >= 50
    assert [o for o in unsound if o.judgement == WRONG_STEP] == []


def test_every_wrong_finding_fails_at_the_statement_that_carries_it(outcomes):
    wrong = [o for m, o in outcomes if m.kind.startswith("finding_")]
    assert len(wrong) >= 10
    assert all(o.verdict == "rejected" and o.judgement == RIGHT for o in wrong), wrong


def test_no_sound_mutant_is_rejected_at_the_mutated_step(outcomes):
    assert [o for _, o in outcomes if o.judgement == FALSE_REJECTION] == []
    assert any(o.expected == SOUND and o.judgement == RIGHT for _, o in outcomes)


def test_the_mutated_step_is_the_one_the_mutant_changed():
    for mutant in SAMPLE:
        assert mutant.text != mutant.fixture.path.read_text(encoding="utf-8")
        assert mutant.step in mutant.text


def test_the_version_2_certificates_are_accepted_as_they_are_written():
    # made by `python3 -m checker elaborate` (DEVELOPERS.md, "Mutation testing"); a
    # certificate that no longer reads as written would make every mutant of it look right
    for fixture in (f for f in fixtures() if f.shape == "native_v2"):
        report = report_json(check(str(fixture.path), problem=str(fixture.problem)))
        assert report["verdict"] == "accepted", fixture.path
        assert {s["outcome"] for s in report["steps"]} <= {"checked", "assumed"}, fixture.path


# The oracle itself, on textbook cases (first-order semantics, common practice).


def test_the_oracle_finds_a_countermodel_to_a_wrong_instance():
    assert countermodel_size([parse_clause("at(truck1, depot)")], parse_clause("at(truck2, depot)")) == 2


def test_the_oracle_finds_no_countermodel_to_an_instance():
    assert countermodel_size([parse_formula("! [X] : at(X, depot)")], parse_clause("at(truck2, depot)")) is None


def test_the_oracle_respects_equality_and_functions():
    premises = [parse_clause("dock(bay_of(truck1)) = gate4"), parse_clause("~open(gate4)")]
    assert countermodel_size(premises, parse_clause("~open(dock(bay_of(truck1)))")) is None
    assert countermodel_size(premises, parse_clause("open(dock(bay_of(truck1)))")) == 1


def test_the_oracle_shows_a_ground_resolvent_sound():
    premises = [parse_clause("~loaded(van3) | departs(van3)"), parse_clause("loaded(van3)")]
    assert ground_entailment(premises, parse_clause("departs(van3)"))
    assert not ground_entailment(premises, parse_clause("~departs(van3)"))
