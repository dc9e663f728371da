"""A long derivation a saturation prover printed (fixtures/tptp/prover_corpus/large).

The problem (bench/large_problems.py: ``maintenance_order_cycle``) is a
theorem by construction: tasks ordered in a chain by a transitive,
irreflexive order cannot close a cycle.  Its refutation runs to a thousand
statements, so it also shows that such a derivation is checked whole; the
other long derivations are run by bench/bench_prover_corpus.py --large.
"""

from __future__ import annotations

from pathlib import Path

from checker.outcomes import ACCEPTED, CHECKED, RECONSTRUCTED, REJECTED
from checker.run import check

FOLDER = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "prover_corpus" / "large" / "maintenance_order_cycle"


def test_the_long_order_derivation_is_accepted_step_by_step():
    report = check(str(FOLDER / "proof.p"), str(FOLDER / "problem.p"))
    assert report.verdict == ACCEPTED
    assert len(report.steps) > 1000
    assert all(step.outcome in (CHECKED, RECONSTRUCTED) for step in report.steps)


def test_a_step_turned_round_late_in_the_long_derivation_is_rejected_there(tmp_path):
    # From `before(X1,task2) => before(X1,task3)` by transitivity with
    # before(task2,task3); turned round, `before(task3,X1)` does not follow
    # (counter-model: the chain order itself, with X1 = task0).
    text = (FOLDER / "proof.p").read_text()
    stated = "cnf(c_0_1002, plain, (before(X1,task3)|~before(X1,task2)),"
    assert stated in text
    mutant = tmp_path / "proof.p"
    mutant.write_text(text.replace(stated, "cnf(c_0_1002, plain, (before(task3,X1)|~before(X1,task2)),"))
    (tmp_path / "problem.p").write_text((FOLDER / "problem.p").read_text())
    report = check(str(mutant), str(tmp_path / "problem.p"))
    assert report.verdict == REJECTED
    # c_0_1006 resolved c_0_1002's `before(X1,task3)` against
    # `~before(task250,task3)`; turned round, that literal no longer clashes.
    assert [step.name for step in report.steps if step.outcome in ("failed", "refuted")] == ["c_0_1002", "c_0_1006"]
