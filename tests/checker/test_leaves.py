"""Leaves: linked to the problem by name and content, theory axioms shown
valid, and nothing smuggled in."""

from checker.outcomes import ACCEPTED, ASSUMED, CHECKED, FAILED, RECONSTRUCTED, REFUTED
from checker.run import NO_PROBLEM_CAUTION, check

PROBLEM = """
cnf(dock_rule, axiom, ~ berth(S, D) | moored(S)).
cnf(tanker_berth, axiom, berth(tanker3, dock2)).
fof(goal, conjecture, moored(tanker3)).
"""


def run(tmp_path, proof: str, problem: str | None = PROBLEM):
    (tmp_path / "proof.p").write_text(proof)
    if problem is None:
        return check(str(tmp_path / "proof.p"))
    (tmp_path / "problem.p").write_text(problem)
    return check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))


def outcomes(report):
    return {step.name: step for step in report.steps}


def test_a_variant_or_weakening_of_an_axiom_is_that_axiom(tmp_path):
    # Common practice: a clause leaf may rename variables, reorder literals
    # or add literals (a weakening); theta(problem clause) ⊆ leaf.
    report = run(
        tmp_path,
        """
        cnf(l1, axiom, moored(V) | ~ berth(V, W), file('problem.p', dock_rule)).
        cnf(l2, axiom, berth(tanker3, dock2) | moored(barge1), file('problem.p', tanker_berth)).
        """,
    )
    steps = outcomes(report)
    assert steps["l1"].outcome == CHECKED and "axiom `dock_rule`" in steps["l1"].message
    assert steps["l2"].outcome == CHECKED


def test_a_stronger_clause_is_not_in_the_problem(tmp_path):
    report = run(tmp_path, "cnf(l1, axiom, moored(V), file('problem.p', dock_rule)).\n")
    leaf = outcomes(report)["l1"]
    assert leaf.outcome == FAILED
    assert "not in the problem" in leaf.message and "~berth(S,D) | moored(S)" in leaf.message


def test_a_copied_clause_with_a_sign_changed_or_a_literal_left_out_is_not_the_axiom(tmp_path):
    # Attacks on the quickest link, a leaf whose literals include the
    # problem clause's as they stand: the same atoms with one sign changed,
    # and the problem clause with one literal left out, link to nothing.
    report = run(
        tmp_path,
        """
        cnf(l1, axiom, ~ berth(tanker3, dock2) | moored(barge1), file('problem.p', tanker_berth)).
        cnf(l2, axiom, berth(S, D) | moored(S), file('problem.p', dock_rule)).
        cnf(l3, axiom, ~ berth(S, D), file('problem.p', dock_rule)).
        """,
    )
    steps = outcomes(report)
    for name in ("l1", "l2", "l3"):
        assert steps[name].outcome == FAILED, name
        assert "reason: not_in_problem" in steps[name].details, name


def test_the_conjecture_cannot_be_used_as_an_axiom(tmp_path):
    report = run(tmp_path, "fof(l1, axiom, moored(tanker3), file('problem.p', goal)).\n")
    leaf = outcomes(report)["l1"]
    assert leaf.outcome == FAILED
    assert "not in the problem as an axiom" in leaf.message and "conjecture `goal`" in leaf.message


def test_equality_axioms_are_shown_valid_and_a_false_one_refuted(tmp_path):
    # Common practice: reflexivity, symmetry, transitivity and congruence
    # hold in every model with equality; X = Y does not (two elements).
    report = run(
        tmp_path,
        """
        cnf(refl, axiom, X = X, theory(equality)).
        cnf(sym, axiom, X != Y | Y = X, theory(equality)).
        cnf(trans, axiom, X != Y | Y != Z | X = Z, theory(equality)).
        cnf(cong, axiom, X != Y | ~ moored(X) | moored(Y), theory(equality)).
        cnf(bogus, axiom, X = Y, theory(equality)).
        """,
    )
    steps = outcomes(report)
    for name in ("refl", "sym", "trans", "cong"):
        assert steps[name].outcome == RECONSTRUCTED, steps[name]
    assert steps["bogus"].outcome == REFUTED
    assert "domain = {0, 1}" in steps["bogus"].details


def test_without_a_problem_leaves_are_assumed_and_the_report_says_so(tmp_path):
    report = run(
        tmp_path,
        """
        cnf(a1, axiom, berth(tanker3, dock2)).
        cnf(a2, axiom, ~ berth(tanker3, dock2)).
        cnf(c1, plain, $false, inference(resolve, [status(thm)], [a1, a2])).
        """,
        problem=None,
    )
    assert report.verdict == ACCEPTED
    assert [s.name for s in report.steps if s.outcome == ASSUMED] == ["a1", "a2"]
    assert NO_PROBLEM_CAUTION in report.cautions


def test_a_step_uses_the_first_statement_of_a_duplicated_name(tmp_path):
    # The plan keeps the first statement of a name (the second is a fault);
    # steps must then be checked against that same first statement.
    report = run(
        tmp_path,
        """
        cnf(l1, axiom, berth(tanker3, dock2), file('problem.p', tanker_berth)).
        cnf(l1, axiom, moored(tanker3), file('problem.p', tanker_berth)).
        cnf(c1, plain, berth(tanker3, dock2) | moored(barge1), inference(weaken, [status(thm)], [l1])).
        """,
    )
    steps = {}
    for step in report.steps:
        steps.setdefault(step.name, []).append(step)
    assert [s.outcome for s in steps["l1"]] == [CHECKED, FAILED]
    assert "duplicate name" in steps["l1"][1].message
    assert steps["c1"][0].outcome == RECONSTRUCTED


def test_a_conjecture_inside_a_nested_record_is_not_an_axiom(tmp_path):
    # Refuting the axioms together with the conjecture itself shows the
    # conjecture false, not true: a nested record must not hide that use.
    problem = """
    cnf(goal, conjecture, berth(tanker3, dock2)).
    cnf(dock_rule, axiom, ~ berth(S, D) | moored(S)).
    cnf(adrift, axiom, ~ moored(tanker3)).
    """
    proof = """
    cnf(goal, conjecture, berth(tanker3, dock2), file('problem.p', goal)).
    cnf(dock_rule, axiom, ~ berth(S, D) | moored(S), file('problem.p', dock_rule)).
    cnf(adrift, axiom, ~ moored(tanker3), file('problem.p', adrift)).
    cnf(c1, plain, $false,
        inference(resolve, [status(thm)], [inference(resolve, [status(thm)], [goal, dock_rule]), adrift])).
    """
    report = run(tmp_path, proof, problem)
    assert report.verdict == "rejected"
    failure = report.first_failure
    assert failure.name == "c1" and "reason: conjecture_as_premise" in failure.details


def test_derived_statements_of_a_problem_file_are_not_its_axioms(tmp_path):
    # A file handed over as the problem may hold inferences (say, another
    # derivation); only its input statements count as the problem's.
    problem = PROBLEM + "cnf(made_up, plain, moored(barge1), inference(guess, [status(thm)], [dock_rule])).\n"
    report = run(tmp_path, "cnf(l1, axiom, moored(barge1), file('problem.p', made_up)).\n", problem)
    assert outcomes(report)["l1"].outcome == FAILED
    assert "not in the problem" in outcomes(report)["l1"].message


def test_the_certificate_cannot_be_its_own_problem(tmp_path):
    (tmp_path / "proof.p").write_text("cnf(l1, axiom, $false).\n")
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "proof.p"))
    assert report.verdict == "unreadable"
    assert "the problem given is the certificate itself" in report.error


def test_a_leaf_matching_an_axiom_and_the_conjecture_is_the_axiom(tmp_path):
    # The problem states moored(tanker3) both as an axiom and as the
    # conjecture; a leaf with that content is the axiom, whichever it cites.
    problem = PROBLEM + "cnf(tanker_moored, axiom, moored(tanker3)).\n"
    report = run(tmp_path, "cnf(l1, axiom, moored(tanker3), file('problem.p', goal)).\n", problem)
    leaf = outcomes(report)["l1"]
    assert leaf.outcome == CHECKED and "axiom `tanker_moored`" in leaf.message
