"""Witnesses a step introduces itself: judged by what the step does.

Skolemization as in M. Fitting, "First-Order Logic and Automated Theorem
Proving", 2nd ed., 1996 (from memory): a fresh function symbol over the
variables an existential depends on.  A step that introduces a symbol is
an introduction whatever its TPTP status says (SZS ontology: ``thm``
claims consequence, ``esa`` equisatisfiability), and is refuted only when
every pairing of its new symbols with quantifiers is; where the pairing
is a guess, it is ``unproven``.
"""

from __future__ import annotations

from pathlib import Path

from checker.outcomes import ACCEPTED, FAILED, RECONSTRUCTED, REFUTED, UNPROVEN
from checker.run import check
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits

DERIVATIONS = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "derivations"

PROBLEM = """
fof(sites_have_gates, axiom, ! [S] : (site(S) => ? [G] : (gate(G) & guards(G, S)))).
fof(all_logged, axiom, ! [X] : logged(X)).
fof(north_site, axiom, site(north)).
fof(north_guarded, conjecture, ? [G] : guards(G, north)).
"""

HEAD = """
fof(sites_have_gates, axiom, ! [S] : (site(S) => ? [G] : (gate(G) & guards(G, S))), file('problem.p', sites_have_gates)).
fof(all_logged, axiom, ! [X] : logged(X), file('problem.p', all_logged)).
fof(north_site, axiom, site(north), file('problem.p', north_site)).
fof(north_guarded, conjecture, ? [G] : guards(G, north), file('problem.p', north_guarded)).
fof(n1, negated_conjecture, ~ ? [G] : guards(G, north), inference(negate, [status(cth)], [north_guarded])).
"""

TAIL = """
cnf(c3, plain, site(north), inference(clausify, [status(thm)], [north_site])).
cnf(c4, plain, ~ guards(X0, north), inference(clausify, [status(thm)], [n1])).
cnf(c5, plain, guards(sK0(north), north), inference(resolve, [status(thm)], [c2, c3])).
cnf(c6, plain, $false, inference(resolve, [status(thm)], [c5, c4])).
"""


def run(tmp_path, steps: str, limits: SearchLimits = DEFAULT_LIMITS):
    (tmp_path / "problem.p").write_text(PROBLEM)
    (tmp_path / "proof.p").write_text(HEAD + steps + TAIL)
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"), limits=limits)
    return report, {step.name: step for step in report.steps}


def test_a_thm_step_introducing_a_skolem_function_is_an_introduction(tmp_path):
    report, steps = run(
        tmp_path,
        "cnf(c2, plain, ~ site(X0) | guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates])).",
    )
    assert report.verdict == ACCEPTED, report.first_failure
    assert "Skolemization introducing sK0/1" in steps["c2"].message


def test_a_thm_step_that_instantiates_with_a_new_constant_is_a_consequence(tmp_path):
    # Common practice: `logged(gatehouse)` follows from `! [X] : logged(X)`
    # whatever `gatehouse` is; it introduces nothing and needs no freshness.
    report, steps = run(
        tmp_path,
        "cnf(c2, plain, ~ site(X0) | guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates])).\n"
        "cnf(c7, plain, logged(north), inference(instantiate, [status(thm)], [all_logged])).\n"
        "cnf(c8, plain, logged(sK0(north)), inference(instantiate, [status(thm)], [all_logged])).",
    )
    assert report.verdict == ACCEPTED, report.first_failure
    assert steps["c8"].outcome == RECONSTRUCTED and "Skolemization" not in steps["c8"].message


def test_a_thm_step_whose_witness_forgets_a_dependency_fails(tmp_path):
    report, steps = run(
        tmp_path,
        "cnf(c2, plain, ~ site(X0) | guards(sK0(north), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates])).",
    )
    # sK0/1 applied to a constant: one gate for every site.  `north` is not
    # in the premise either, and a problem's symbol is never fresh, so the
    # step is no introduction; nor is it the consequence its status claims.
    assert report.verdict != ACCEPTED
    assert report.first_failure.name == "c2" and steps["c2"].outcome == FAILED
    assert "reason: not_fresh" in steps["c2"].details
    assert "has a counter-model" in steps["c2"].message


def test_an_esa_step_with_no_quantifier_to_witness_is_failed(tmp_path):
    _, steps = run(
        tmp_path,
        "cnf(c2, plain, ~ site(X0) | guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates])).\n"
        "cnf(c7, plain, ~ logged(sK9), inference(skolemize, [status(esa)], [all_logged])).",
    )
    assert steps["c7"].outcome == FAILED and "reason: wrong_polarity" in steps["c7"].details


def test_a_wrong_step_is_refuted_only_when_every_pairing_was_tried(tmp_path):
    # The same wrong step (two quantifiers witnessed by one symbol) is
    # refuted when all its pairings are enumerated, and unproven when the
    # bound cuts the enumeration short: a counter-model to some pairings is
    # no refutation of the step.
    folder = DERIVATIONS / "forklift_charger_pairing"
    mutant = str(folder / "mutant_two_quantifiers_share_one_symbol.p")
    problem = str(folder / "problem.p")
    whole = {s.name: s for s in check(mutant, problem).steps}["f5"]
    assert whole.outcome == REFUTED and "each of the 2 pairings" in whole.message
    starved = SearchLimits(witness_readings=1)
    cut = {s.name: s for s in check(mutant, problem, limits=starved).steps}["f5"]
    assert cut.outcome == UNPROVEN and "not every pairing was tried" in cut.message


def test_a_choice_shaped_leaf_does_not_vouch_for_itself(tmp_path):
    # An introduced leaf shaped like an axiom of choice but whose instance
    # is not the quantified formula's body (the gate guards the north site,
    # not the site X0) must not be accepted on the strength of its own
    # statement; a new predicate is no witness either.
    report, steps = run(
        tmp_path,
        "fof(ch, plain, ! [X0] : ((? [X1] : (gate(X1) & guards(X1, X0))) => (gate(sK0(X0)) & guards(sK0(X0), north))), "
        "introduced(choice_axiom, [])).\n"
        "cnf(c2, plain, ~ site(X0) | guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates, ch])).",
    )
    assert report.verdict != ACCEPTED
    assert steps["ch"].outcome == REFUTED and report.first_failure.name == "ch"
    _, steps = run(
        tmp_path,
        "fof(ch, plain, ! [X0] : ((? [X1] : (gate(X1) & guards(X1, X0))) => (garage(sK0(X0)) & guards(sK0(X0), X0))), "
        "introduced(choice_axiom, [])).\n"
        "cnf(c2, plain, ~ site(X0) | guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates, ch])).",
    )
    assert steps["ch"].outcome == FAILED and "`garage/1` is not applied as a function" in steps["ch"].message


def test_a_step_using_an_uncited_choice_axiom_wrongly_is_unproven_not_refuted(tmp_path):
    # The step does not cite the axiom of choice that defines sK0, and
    # says sK0 is not a gate: that does not follow with the axiom, but the
    # step might mean sK0 as a symbol of its own, so it is not refuted.
    report, steps = run(
        tmp_path,
        "fof(ch, plain, ! [X0] : ((? [X1] : (gate(X1) & guards(X1, X0))) => (gate(sK0(X0)) & guards(sK0(X0), X0))), "
        "introduced(choice_axiom, [])).\n"
        "cnf(c2, plain, ~ site(X0) | guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates])).\n"
        "cnf(c7, plain, ~ site(X0) | ~ gate(sK0(X0)), inference(cnf_transformation, [status(thm)], [sites_have_gates])).",
    )
    assert steps["ch"].outcome == RECONSTRUCTED and steps["c2"].outcome == RECONSTRUCTED
    assert steps["c7"].outcome == UNPROVEN and "which it does not cite" in steps["c7"].message
    assert report.verdict != ACCEPTED


def test_clause_form_siblings_must_agree_on_what_a_symbol_witnesses(tmp_path):
    # c2 and c7 both introduce sK0 from the same premise; c7 alone would be
    # a sound Skolemization (sK0 a site's gate), but with c2 it says the
    # gate guards no site at all.
    report, steps = run(
        tmp_path,
        "cnf(c2, plain, ~ site(X0) | guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates])).\n"
        "cnf(c7, plain, ~ site(X0) | gate(sK0(X0)), inference(cnf_transformation, [status(thm)], [sites_have_gates])).\n"
        "cnf(c8, plain, ~ site(X0) | ~ guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates])).",
    )
    assert steps["c2"].outcome == RECONSTRUCTED and steps["c7"].outcome == RECONSTRUCTED
    assert report.first_failure.name == "c8"
    assert steps["c8"].outcome != RECONSTRUCTED
    assert report.verdict != ACCEPTED


def test_two_introduced_leaves_never_share_a_symbol(tmp_path):
    # Two axioms of choice for sK0 (each written with its instance's
    # conjuncts swapped, so read as the Skolemization of `Q => Q`): one says
    # sK0(X0) is a gate guarding X0, the other that it is a logged site.
    # Each alone is sound; together they are not, and the second is blamed.
    report, steps = run(
        tmp_path,
        "fof(ch1, plain, ! [X0] : ((? [X1] : (gate(X1) & guards(X1, X0))) => (guards(sK0(X0), X0) & gate(sK0(X0)))), "
        "introduced(choice_axiom, [])).\n"
        "fof(ch2, plain, ! [X0] : ((? [X1] : (site(X1) & logged(X1))) => (logged(sK0(X0)) & site(sK0(X0)))), "
        "introduced(choice_axiom, [])).\n"
        "cnf(c2, plain, ~ site(X0) | guards(sK0(X0), X0), inference(cnf_transformation, [status(thm)], [sites_have_gates])).",
    )
    assert steps["ch1"].outcome == RECONSTRUCTED
    assert steps["ch2"].outcome == FAILED and "reason: not_fresh" in steps["ch2"].details
    assert report.verdict != ACCEPTED


# A clause-form step that Skolemizes and also weakens by a literal over
# symbols of the problem (here `staffed(desk)`): the new but stale symbols
# witness nothing, the fresh one (sk0) witnesses the existential.
READERS = """
fof(doors_have_readers, axiom, ! [D] : (door(D) => ? [R] : reads(R, D))).
fof(lobby_door, axiom, door(lobby)).
fof(desk_unstaffed, axiom, ~ staffed(desk)).
fof(keepers, axiom, ! [D] : holds(keeper(D), D)).
fof(lobby_read, conjecture, ? [R] : reads(R, lobby)).
"""

READERS_PROOF = """
fof(doors_have_readers, axiom, ! [D] : (door(D) => ? [R] : reads(R, D)), file('problem.p', doors_have_readers)).
fof(lobby_door, axiom, door(lobby), file('problem.p', lobby_door)).
fof(desk_unstaffed, axiom, ~ staffed(desk), file('problem.p', desk_unstaffed)).
fof(lobby_read, conjecture, ? [R] : reads(R, lobby), file('problem.p', lobby_read)).
fof(n, negated_conjecture, ~ ? [R] : reads(R, lobby), inference(negated_conjecture, [status(cth)], [lobby_read])).
cnf(c1, plain, CLAIM, inference(cnf_transformation, [status(thm)], [doors_have_readers])).
cnf(c2, plain, door(lobby), inference(cnf_transformation, [status(thm)], [lobby_door])).
cnf(c3, plain, ~ reads(X0, lobby), inference(cnf_transformation, [status(thm)], [n])).
cnf(c4, plain, reads(sk0(lobby), lobby) | staffed(desk), inference(resolution, [status(thm)], [c1, c2])).
cnf(c5, plain, staffed(desk), inference(resolution, [status(thm)], [c4, c3])).
cnf(c6, plain, ~ staffed(desk), inference(cnf_transformation, [status(thm)], [desk_unstaffed])).
cnf(c7, plain, $false, inference(resolution, [status(thm)], [c5, c6])).
"""


def _readers(tmp_path, claim: str):
    (tmp_path / "problem.p").write_text(READERS)
    (tmp_path / "proof.p").write_text(READERS_PROOF.replace("CLAIM", claim))
    return check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))


def test_a_skolemizing_step_weakened_by_a_problem_literal_is_accepted(tmp_path):
    report = _readers(tmp_path, "~ door(X0) | reads(sk0(X0), X0) | staffed(desk)")
    assert report.verdict == ACCEPTED, report.first_failure
    c1 = next(s for s in report.steps if s.name == "c1")
    assert c1.outcome == RECONSTRUCTED and "introducing sk0/1" in c1.message
    assert "desk/0, staffed/1 used as in the problem or earlier steps" in c1.message


def test_a_problem_symbol_as_the_only_witness_is_still_not_fresh(tmp_path):
    # keeper/1 is the problem's: no fresh symbol is left to witness R.
    report = _readers(tmp_path, "~ door(X0) | reads(keeper(X0), X0) | staffed(desk)")
    assert (report.first_failure.name, report.first_failure.reason) == ("c1", "not_fresh")


def test_a_stale_symbol_beside_a_fresh_witness_must_not_witness_either(tmp_path):
    # With sk0 fresh and keeper/1 taken as it is, the claim does not
    # follow (reads(keeper(X0), X0) is not implied): the stale symbol is the
    # fault reported, never a counter-model.
    report = _readers(tmp_path, "~ door(X0) | reads(keeper(X0), X0) | ~ reads(sk0(X0), X0)")
    failure = report.first_failure
    assert (failure.name, failure.outcome, failure.reason) == ("c1", FAILED, "not_fresh")
    assert "keeper/1" in failure.message
