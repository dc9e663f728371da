"""Nested superposition and rewriting records computed the way a prover
makes them (every occurrence of the replaced term at once, one rewrite per
record by its term order), and attacks on that path.

An invented relay-panel scenario: a relay alias f(a) is the relay b, and a
panel pairing a relay with itself is that relay's hold line h.
"""

from checker.outcomes import ACCEPTED, RECONSTRUCTED, REFUTED
from checker.run import check

PANEL = """
cnf(relay_alias, axiom, f(a) = b).
cnf(pair_merge, axiom, g(X, X) = h(X)).
cnf(panel, axiom, q(g(f(a), f(a)))).
fof(goal, conjecture, q(h(b))).
"""

PROOF = """
cnf(c1, plain, q(h(CLAIM)),
    inference(rw, [status(thm)], [inference(spm, [status(thm)], [relay_alias, panel]), pair_merge])).
fof(n, negated_conjecture, ~ q(h(b)), inference(assume_negation, [status(cth)], [goal])).
cnf(c2, plain, $false, inference(resolve, [status(thm)], [c1, n])).
"""


def _check(tmp_path, claim):
    (tmp_path / "problem.p").write_text(PANEL)
    (tmp_path / "proof.p").write_text(PROOF.replace("CLAIM", claim))
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))
    return report, {step.name: step for step in report.steps}


def test_a_superposition_record_replaces_every_occurrence(tmp_path):
    report, steps = _check(tmp_path, "b")
    assert report.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in report.steps]
    assert steps["c1/1"].outcome == RECONSTRUCTED
    assert "computed`q(g(b,b))`" in steps["c1/1"].message.replace(" ", "")
    assert "at every occurrence" in steps["c1/1"].message


def test_a_wrong_claim_over_the_computed_records_is_refuted_at_the_outer_step(tmp_path):
    # Attack: h(a) does not follow (a and b may differ); the options the
    # search computed for the nested record cannot make it hold.
    report, steps = _check(tmp_path, "a")
    assert report.verdict != ACCEPTED
    assert report.first_failure.name == "c1"
    assert steps["c1"].outcome == REFUTED
    assert "reason: countermodel" in steps["c1"].details


def test_a_rewriting_record_citing_the_empty_clause_as_its_equation_is_refuted_not_a_crash(tmp_path):
    # A mutant of the large mutation run: the cited "equation" claims $false,
    # so the record is no example of the prover's rewriting (was an internal error).
    (tmp_path / "problem.p").write_text(PANEL)
    (tmp_path / "proof.p").write_text("""
cnf(c0, plain, $false, inference(rw, [status(thm)], [inference(spm, [status(thm)], [relay_alias, panel]), pair_merge])).
cnf(c1, plain, q(b), inference(rw, [status(thm)], [panel, c0])).
fof(n, negated_conjecture, ~ q(h(b)), inference(assume_negation, [status(cth)], [goal])).
cnf(c2, plain, $false, inference(resolve, [status(thm)], [c1, n])).
""")
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))
    steps = {step.name: step for step in report.steps}
    assert report.verdict != ACCEPTED
    assert report.first_failure.name == "c0"
    assert steps["c0"].outcome == REFUTED
