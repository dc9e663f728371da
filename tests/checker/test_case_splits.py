"""Case splits with assumptions, and the propositional path: each rule of
checker/assumptions.py and checker/splitting.py, and attacks that must not
be accepted (a `$false` under an open assumption, a discharge before its
branch is closed, an assumption dropped from a record for free)."""

from __future__ import annotations

import pytest

from checker.assumptions import trace_branches
from checker.outcomes import ACCEPTED, ASSUMED, REJECTED, UNPROVEN
from checker.plan import make_plan
from checker.run import check
from checker.splitting import is_propositional
from formats.tptp import parse_clause, parse_formula, parse_tptp

# An invented depot: one of the two must hold, and neither does.
PROBLEM = """
cnf(shift, axiom, loaded(X) | idle(Y)).
cnf(nothing_loaded, axiom, ~loaded(truck1)).
cnf(busy, axiom, ~idle(truck2)).
"""
LEAVES = """
cnf(shift, axiom, loaded(X) | idle(Y), file('problem.p', shift)).
cnf(nothing_loaded, axiom, ~loaded(truck1), file('problem.p', nothing_loaded)).
cnf(busy, axiom, ~idle(truck2), file('problem.p', busy)).
"""


def run(tmp_path, derivation: str, problem: str = PROBLEM):
    (tmp_path / "problem.p").write_text(problem)
    (tmp_path / "proof.p").write_text(LEAVES + derivation if problem is PROBLEM else derivation)
    return check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))


def by_name(report, name):
    return [r for r in report.steps if r.name == name]


def test_a_false_under_an_assumption_alone_is_not_a_refutation(tmp_path):
    report = run(tmp_path, """
cnf(c1, plain, loaded(X), inference(splitLeft, [status(thm)], [shift])).
cnf(c2, plain, $false, inference(resolution, [status(thm)], [c1, nothing_loaded])).
""")
    assert report.verdict == REJECTED
    assert (report.first_failure.name, report.first_failure.reason) == ("c2", "open_assumption")


def test_the_other_side_before_the_branch_is_closed_is_refused(tmp_path):
    # Written before the `$false` that would close the branch, the other
    # side cannot rest on it (the closure could otherwise use the side).
    report = run(tmp_path, """
cnf(c1, plain, loaded(X), inference(splitLeft, [status(thm)], [shift])).
cnf(c3, plain, idle(Y), inference(splitRight, [status(thm)], [shift])).
cnf(c2, plain, $false, inference(resolution, [status(thm)], [c1, nothing_loaded])).
cnf(c4, plain, $false, inference(resolution, [status(thm)], [c3, busy])).
""")
    failure = report.first_failure
    assert (failure.name, failure.reason) == ("c3", "branch_not_closed")
    assert "assumption `c1`: `loaded(X)` (a component of `shift`); no `$false` written before this step rests on it" \
        in failure.details


def test_the_other_side_of_a_clause_never_split_is_refused(tmp_path):
    report = run(tmp_path, """
cnf(c3, plain, idle(Y), inference(splitRight, [status(thm)], [shift])).
cnf(c4, plain, $false, inference(resolution, [status(thm)], [c3, busy])).
""")
    failure = report.first_failure
    assert (failure.name, failure.reason) == ("c3", "branch_not_closed")
    assert "no branch of it was assumed" in failure.message


def test_a_split_clause_that_was_never_stated_is_a_dangling_parent(tmp_path):
    # Both sides of the split cite `c0`, which no statement defines (its
    # statement was written under another step's name): a structural
    # fault of each side, reported as such, never an error inside assay.
    report = run(tmp_path, """
cnf(c1, plain, loaded(X), inference(splitLeft, [status(thm)], [c0])).
cnf(c2, plain, $false, inference(resolution, [status(thm)], [c1, nothing_loaded])).
cnf(c3, plain, idle(Y), inference(splitRight, [status(thm)], [c0])).
cnf(c4, plain, $false, inference(resolution, [status(thm)], [c3, busy])).
""")
    assert report.verdict == REJECTED
    assert {(r.name, r.reason) for r in report.steps if r.reason == "dangling_parent"} == {
        ("c1", "dangling_parent"), ("c3", "dangling_parent")}
    assert report.first_failure.name == "c1"


def test_a_branch_weakened_by_an_extra_literal_is_assumed(tmp_path):
    # `loaded(X) | idle(truck2)` is the component loaded(X) of shift with a
    # literal added: closing it refutes the component too, and the other
    # side is checked from the negation of the branch as written.
    report = run(tmp_path, """
cnf(c1, plain, loaded(X) | idle(truck2), inference(splitLeft, [status(thm)], [shift])).
cnf(c2, plain, $false, inference(resolution, [status(thm)], [c1, nothing_loaded, busy])).
cnf(c3, plain, idle(Y), inference(splitRight, [status(thm)], [shift])).
cnf(c4, plain, $false, inference(resolution, [status(thm)], [c3, busy])).
""")
    assert report.verdict == ACCEPTED, report.first_failure
    assumed = by_name(report, "c1")[0]
    assert assumed.outcome == ASSUMED and "weakened by `idle(truck2)`" in assumed.message


def test_a_weakened_branch_still_needs_a_variable_disjoint_component(tmp_path):
    # The kept literal loaded(X) shares X with the rest of the split clause.
    problem = "cnf(shift, axiom, loaded(X) | idle(X)).\ncnf(busy, axiom, ~idle(truck2)).\n"
    report = run(tmp_path, """
cnf(shift, axiom, loaded(X) | idle(X), file('problem.p', shift)).
cnf(busy, axiom, ~idle(truck2), file('problem.p', busy)).
cnf(c1, plain, loaded(X) | idle(truck2), inference(splitLeft, [status(thm)], [shift])).
""", problem)
    assert (report.first_failure.name, report.first_failure.reason) == ("c1", "component_shares_variable")


def test_a_branch_with_no_literal_of_its_split_clause_is_refused(tmp_path):
    report = run(tmp_path, """
cnf(c1, plain, idle(truck2) | loaded(truck1), inference(splitLeft, [status(thm)], [shift])).
""")
    assert (report.first_failure.name, report.first_failure.reason) == ("c1", "not_a_component")


def test_a_branch_closed_under_an_outer_assumption_keeps_it_open(tmp_path):
    # The branch c2 of c1's clause is closed by a `$false` that also rests on
    # the outer assumption a0; the other side carries a0, so the final
    # `$false` does too.
    report = run(tmp_path, """
cnf(a0, plain, loaded(truck1), introduced(assumption, [])).
cnf(c1, plain, loaded(X), inference(splitLeft, [status(thm)], [shift])).
cnf(c2, plain, $false, inference(resolution, [status(thm)], [a0, nothing_loaded, c1])).
cnf(c3, plain, idle(Y), inference(splitRight, [status(thm)], [shift])).
cnf(c4, plain, $false, inference(resolution, [status(thm)], [c3, busy])).
""")
    failure = report.first_failure
    assert (failure.name, failure.reason) == ("c4", "open_assumption")
    assert "rests on assumption `a0`: `loaded(truck1)` (introduced)" in failure.details


def test_rests_on_follows_branches(tmp_path):
    document = parse_tptp(LEAVES + """
cnf(c1, plain, loaded(X), inference(splitLeft, [status(thm)], [shift])).
cnf(c2, plain, $false, inference(resolution, [status(thm)], [c1, nothing_loaded])).
cnf(c3, plain, idle(Y), inference(splitRight, [status(thm)], [shift])).
cnf(c4, plain, $false, inference(resolution, [status(thm)], [c3, busy])).
""")
    branches = trace_branches(make_plan(document), {s.name: s for s in document.statements})
    assert branches.rests_on["c2"] == {"c1"} and branches.rests_on["c4"] == frozenset()
    assert branches.assumptions["c1"].closed_by == "c2"
    assert branches.discharges["c3"].discharged == ("c1",)


def test_a_discharge_by_shape_needs_no_rule_name(tmp_path):
    # The other side named by an unknown rule: recognized because it states
    # part of a clause whose branch is closed.
    report = run(tmp_path, """
cnf(c1, plain, loaded(X), inference(splitLeft, [status(thm)], [shift])).
cnf(c2, plain, $false, inference(resolution, [status(thm)], [c1, nothing_loaded])).
cnf(c3, plain, idle(Y), inference(other_side, [status(thm)], [shift])).
cnf(c4, plain, $false, inference(resolution, [status(thm)], [c3, busy])).
""")
    assert report.verdict == ACCEPTED
    assert by_name(report, "c1")[0].outcome == ASSUMED
    assert "closed by `c2`" in by_name(report, "c1")[0].message


def test_an_assumed_formula_is_not_checked_as_a_component(tmp_path):
    report = run(tmp_path, """
fof(c1, plain, ! [X] : loaded(X), inference(splitLeft, [status(thm)], [shift])).
""")
    assert by_name(report, "c1")[0].outcome == UNPROVEN


def test_dropping_an_assumption_from_the_record_does_not_discharge_it(tmp_path):
    report = run(tmp_path, """
fof(h1, plain, loaded(truck1), introduced(assumption, [])).
fof(h2, plain, $false, inference(contradiction, [status(thm), assumptions([h1])], [h1, nothing_loaded])).
fof(h3, plain, $false, inference(discharge, [status(thm), assumptions([])], [h2])).
""")
    assert report.verdict != ACCEPTED
    assert report.first_failure.name == "h3"


def test_a_record_naming_an_assumption_never_made_is_refused(tmp_path):
    report = run(tmp_path, """
fof(h2, plain, $false, inference(contradiction, [status(thm), assumptions([h9])], [shift, nothing_loaded, busy])).
""")
    assert (report.first_failure.name, report.first_failure.reason) == ("h2", "assumptions_differ")


def test_an_introduced_assumption_never_discharged_is_reported_open(tmp_path):
    report = run(tmp_path, """
fof(h1, plain, loaded(truck1), introduced(assumption, [])).
fof(h2, plain, $false, inference(contradiction, [status(thm), assumptions([h1])], [h1, nothing_loaded])).
""")
    assert (report.first_failure.name, report.first_failure.reason) == ("h2", "open_assumption")
    assert "assumption (introduced); first closed by `h2`" in by_name(report, "h1")[0].message


# ---------------------------------------------------------------- the propositional path

NAMES_PROBLEM = """
fof(p1, axiom, (spl1 | spl2 | spl3)).
fof(p2, axiom, (spl1 => spl2)).
fof(p3, axiom, ~spl2).
cnf(p4, axiom, ~spl3 | spl2).
"""


def test_a_propositional_refutation_is_found_and_replayed(tmp_path):
    derivation = "\n".join(
        line.replace(")).", f"), file('problem.p', {line[4:6]})).") for line in NAMES_PROBLEM.strip().splitlines()
    ) + "\nfof(f, plain, $false, inference('sat_resolution*', [status(thm)], [p1, p2, p3, p4])).\n"
    report = run(tmp_path, derivation, NAMES_PROBLEM)
    assert report.verdict == ACCEPTED
    assert "by unit propagation" in by_name(report, "f")[0].message


def test_a_satisfiable_propositional_step_gets_a_counter_model(tmp_path):
    derivation = "\n".join(
        line.replace(")).", f"), file('problem.p', {line[4:6]})).") for line in NAMES_PROBLEM.strip().splitlines()
    ) + "\nfof(f, plain, $false, inference('sat_resolution*', [status(thm)], [p1, p2, p4])).\n"
    report = run(tmp_path, derivation, NAMES_PROBLEM)
    assert report.verdict == REJECTED and report.first_failure.reason == "countermodel"


@pytest.mark.parametrize(("text", "expected"), [
    ("spl1 | ~spl2", True), ("p(a)", False), ("$false", True),
])
def test_propositional_clauses(text, expected):
    assert is_propositional(parse_clause(text)) is expected


@pytest.mark.parametrize(("text", "expected"), [
    ("($false <= (sp1 & ~sp2))", True), ("! [X] : sp1", False), ("(p(X) <= sp1)", False), ("sp1 <=> sp2", True),
])
def test_propositional_formulas(text, expected):
    assert is_propositional(parse_formula(text)) is expected


def test_a_single_propositional_resolution_is_left_to_the_ordinary_search(tmp_path):
    report = run(tmp_path, """
fof(p1, axiom, (spl1 | spl2 | spl3), file('problem.p', p1)).
cnf(p4, axiom, ~spl3 | spl2, file('problem.p', p4)).
cnf(r, plain, spl2 | ~spl3, inference(resolution, [status(thm)], [p4])).
""", NAMES_PROBLEM)
    assert by_name(report, "r")[0].message.startswith("kernel replayed")
