"""A leaf that is no statement of the problem is the first failure, not
the Skolem step whose symbol it happens to mention.

Such a leaf fails on its own, so the derivation is rejected at it; its
symbols (and those of the steps resting on it) are left out of the
freshness table, so they cannot make an earlier introduction look
non-fresh.  Invented scenario: expense requests (a Skolem constant for
the request no one approves; Skolemization as in any logic textbook,
common practice).
"""

from __future__ import annotations

from pathlib import Path

from checker.freshness import build_symbol_table
from checker.outcomes import FAILED, RECONSTRUCTED, REJECTED, UNFOUNDED
from checker.plan import make_plan
from checker.run import check
from formats.tptp import parse_tptp

EXPENSES = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "derivations" / "expense_request_approval"

# A leaf `~approves(X0, sK0)` claimed from the problem, written after f6
# (which introduces sK0) and cited by f7 in place of f5.
EXTRA_LEAF = (
    "cnf(extra, axiom, ~approves(X0, sK0), file('problem.p', extra)).\n"
    "cnf(f7, negated_conjecture, ~ approves(X0, sK0), inference(cnf_transformation, [status(thm)], [extra])).\n"
)


def _with_extra_leaf(tmp_path) -> Path:
    text = (EXPENSES / "proof.p").read_text(encoding="utf-8")
    original = "cnf(f7, negated_conjecture, ~ approves(X0, sK0), inference(cnf_transformation, [status(thm)], [f5])).\n"
    assert original in text
    path = tmp_path / "proof.p"
    path.write_text(text.replace(original, EXTRA_LEAF))
    return path


def by_name(report, name):
    return next(s for s in report.steps if s.name == name)


def test_the_leaf_not_in_the_problem_is_the_first_failure(tmp_path):
    report = check(str(_with_extra_leaf(tmp_path)), str(EXPENSES / "problem.p"))
    assert report.verdict == REJECTED
    assert (report.first_failure.name, report.first_failure.reason) == ("extra", "not_in_problem")
    # f6 introduces sK0, which occurs elsewhere only through the bad leaf
    assert by_name(report, "f6").outcome == RECONSTRUCTED
    assert by_name(report, "f7").outcome == UNFOUNDED and by_name(report, "f10").outcome == UNFOUNDED


def test_a_symbol_of_a_leaf_in_the_problem_still_makes_a_skolem_symbol_stale(tmp_path):
    # The same leaf, now a statement of the problem: sK0 is no longer new,
    # and f6, which introduces it, is at fault.
    problem = (EXPENSES / "problem.p").read_text(encoding="utf-8") + "cnf(extra, axiom, ~approves(X0, sK0)).\n"
    (tmp_path / "problem.p").write_text(problem)
    report = check(str(_with_extra_leaf(tmp_path)), str(tmp_path / "problem.p"))
    assert report.verdict == REJECTED
    assert (report.first_failure.name, report.first_failure.reason) == ("f6", "not_fresh")
    assert by_name(report, "extra").outcome != FAILED


def test_the_table_leaves_out_unlinked_leaves_and_what_rests_on_them(tmp_path):
    document = parse_tptp((_with_extra_leaf(tmp_path)).read_text(encoding="utf-8"))
    plan = make_plan(document)
    full = build_symbol_table(plan.steps, None)
    table = build_symbol_table(plan.steps, None, frozenset({"extra"}))
    def occurring(symbols):
        return {name for names in symbols.occurrences.values() for name in names}

    assert {"extra", "f7"} <= occurring(full)  # f10 is $false: no symbol
    assert not {"extra", "f7", "f10"} & occurring(table)
    assert full.freshness_failure("f6", [("sK0", 0)]) is not None
    assert table.freshness_failure("f6", [("sK0", 0)]) is None
    # f7 still inherits sK0 from its parent: it introduces nothing
    assert table.introducers[("sK0", 0)] == ["f6"]
