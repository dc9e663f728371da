"""Nested records checked by what they claim, and parents that name
problem formulas directly.

A nested record with status ``esa`` under a ``thm`` record makes the whole
step a Skolemization; a nested ``cth`` record on a conjecture states its
negation.  The TPTP standard lets a derivation cite a problem formula by
its name without copying it (from memory of the TPTP language
documentation: parents are names of annotated formulas, in the derivation
or in the problem).  Scenarios (cold stores, loading bays) are invented.
"""

from checker.outcomes import ACCEPTED, FAILED, RECONSTRUCTED, REFUTED, UNPROVEN
from checker.run import check
from checker.search.reconstruct import SearchLimits

STORES = """
fof(every_store_has_probe, axiom, ! [S] : (store(S) => ? [P] : (probe(P) & fitted(P, S)))).
fof(probes_log, axiom, ! [P, S] : ((probe(P) & fitted(P, S)) => logged(S))).
fof(store7, axiom, store(s7)).
fof(goal, conjecture, logged(s7)).
"""

# The Skolemization is the innermost record, under `thm` records: the
# whole step introduces w/1 and claims no more than satisfiability.
NESTED_SKOLEM = """
fof(n, negated_conjecture, ~ logged(s7), inference(assume_negation, [status(cth)], [goal])).
fof(s, plain, ! [S] : ((probe(w(S)) | ~ store(S)) & (fitted(w(S), S) | ~ store(S))),
    inference(distribute, [status(thm)],
      [inference(skolemize, [status(esa)],
        [inference(variable_rename, [status(thm)], [every_store_has_probe])])])).
cnf(c1, plain, probe(w(S)) | ~ store(S), inference(split_conjunct, [status(thm)], [s])).
cnf(c2, plain, fitted(w(S), S) | ~ store(S), inference(split_conjunct, [status(thm)], [s])).
cnf(c3, plain, ~ probe(P) | ~ fitted(P, S) | logged(S), inference(clausify, [status(thm)], [probes_log])).
cnf(c4, plain, ~ fitted(P, s7) | ~ probe(P), inference(resolve, [status(thm)], [c3, n])).
cnf(c5, plain, ~ probe(w(s7)) | ~ store(s7), inference(resolve, [status(thm)], [c4, c2])).
cnf(c6, plain, ~ store(s7), inference(resolve, [status(thm)], [c5, c1])).
cnf(c7, plain, $false, inference(resolve, [status(thm)], [c6, store7])).
"""


def run(tmp_path, proof: str, problem: str = STORES):
    (tmp_path / "proof.p").write_text(proof)
    (tmp_path / "problem.p").write_text(problem)
    return check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))


def step(report, name: str):
    return next(s for s in report.steps if s.name == name)


def test_problem_formulas_cited_by_name_are_linked_as_leaves(tmp_path):
    # No leaf is copied into the derivation: goal, every_store_has_probe,
    # probes_log and store7 are the problem's own statements.
    report = run(tmp_path, NESTED_SKOLEM)
    assert report.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in report.steps]
    assert step(report, "store7").location.file.endswith("problem.p")


def test_a_skolemization_nested_under_a_thm_record_is_checked_as_one(tmp_path):
    report = run(tmp_path, NESTED_SKOLEM)
    assert step(report, "s").outcome == RECONSTRUCTED
    assert "Skolemization introducing w/1" in step(report, "s").message
    assert all(step(report, f"s/{n}").outcome == RECONSTRUCTED for n in (1, 2))


def test_a_nested_skolemization_never_gives_a_countermodel_for_a_valid_step(tmp_path):
    # Checked as a plain consequence, this step has a counter-model (w is
    # free to point anywhere); as the Skolemization it is, it holds.
    report = run(tmp_path, NESTED_SKOLEM)
    assert not any(s.outcome == REFUTED for s in report.steps)


def test_a_nested_skolem_witness_that_drops_a_dependency_fails(tmp_path):
    # Attack: one probe for every store (a constant w0 for w(S)) is stronger
    # than the axiom; the hidden record must not make it pass.
    proof = NESTED_SKOLEM.replace("w(S)", "w0").replace("w(s7)", "w0")
    report = run(tmp_path, proof)
    assert report.verdict != ACCEPTED
    assert report.first_failure.name == "s"
    assert report.first_failure.reason == "missing_dependency"


def test_a_nested_witness_that_is_not_fresh_fails(tmp_path):
    # Attack: the witness reuses a problem symbol (s7 is a store).
    proof = NESTED_SKOLEM.replace("w(S)", "s7").replace("w(s7)", "s7")
    report = run(tmp_path, proof)
    assert report.verdict != ACCEPTED
    assert report.first_failure.name == "s"


def test_a_nested_negation_of_the_conjecture_is_stated_for_its_record(tmp_path):
    # The negation is applied inside a record and then rewritten with a
    # definition of a fresh predicate, as definitional clause forms do.
    proof = """
fof(d, plain, ! [S] : (alert(S) <=> logged(S)), introduced(definition)).
fof(n, negated_conjecture, ~ alert(s7),
    inference(apply_def, [status(thm)], [inference(assume_negation, [status(cth)], [goal]), d])).
fof(c1, plain, ! [S] : (~ store(S) | logged(S)), inference(chain, [status(thm)], [every_store_has_probe, probes_log])).
fof(c2, plain, ~ logged(s7), inference(apply_def, [status(thm)], [n, d])).
fof(c3, plain, $false, inference(resolve, [status(thm)], [c1, c2, store7])).
"""
    report = run(tmp_path, proof)
    assert report.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in report.steps]
    assert "taken as" in step(report, "n/1").message


def test_a_nested_record_that_uses_the_conjecture_itself_fails_its_outer_step(tmp_path):
    # Attack: the record says `thm`, so its conclusion could be the
    # conjecture itself; only a negation may be used.
    proof = """
fof(n, negated_conjecture, ~ logged(s7),
    inference(simplify, [status(thm)], [inference(assume_negation, [status(thm)], [goal])])).
fof(c1, plain, ! [S] : (~ store(S) | logged(S)), inference(chain, [status(thm)], [every_store_has_probe, probes_log])).
fof(c3, plain, $false, inference(resolve, [status(thm)], [c1, n, store7])).
"""
    report = run(tmp_path, proof)
    assert report.verdict != ACCEPTED
    assert report.first_failure.name == "n" and report.first_failure.reason == "conjecture_as_premise"
    assert report.first_failure.outcome == FAILED


def test_a_nested_negation_with_an_extra_parent_fails(tmp_path):
    # Attack: a cth record with an axiom beside the conjecture could state
    # anything that follows from both.
    proof = """
fof(n, negated_conjecture, $false,
    inference(simplify, [status(thm)], [inference(negate, [status(cth)], [goal, store7])])).
"""
    report = run(tmp_path, proof)
    assert report.verdict != ACCEPTED
    assert report.first_failure.name == "n" and report.first_failure.reason == "negation_parents"


def test_a_cited_name_the_problem_lacks_is_still_dangling(tmp_path):
    proof = "cnf(c1, plain, $false, inference(resolve, [status(thm)], [store7, no_such_axiom])).\n"
    report = run(tmp_path, proof)
    assert report.verdict != ACCEPTED
    assert report.first_failure.reason == "dangling_parent"
    assert "no_such_axiom" in report.first_failure.message and "store7" not in report.first_failure.message


def test_a_derived_statement_of_the_problem_file_cannot_be_cited(tmp_path):
    # Only input statements justify leaves: a problem file that carries a
    # derived `$false` does not make it citable.
    problem = STORES + "fof(bogus, plain, $false, inference(made_up, [status(thm)], [store7])).\n"
    report = run(tmp_path, "cnf(c1, plain, $false, inference(copy, [status(thm)], [bogus])).\n", problem)
    assert report.verdict != ACCEPTED


# Rewriting records nested three deep, their conclusions never stated:
# each is computed by rewriting its first parent with the cited unit
# equation (an invented parcel-forwarding scenario; idempotent forwarding).
FORWARDING = """
cnf(idem, axiom, fwd(fwd(X)) = fwd(X)).
cnf(dock_to_bay, axiom, fwd(dock) = bay).
cnf(crate_at, axiom, at(crate, fwd(fwd(fwd(dock))))).
fof(goal, conjecture, at(crate, bay)).
"""

NESTED_REWRITES = """
fof(n, negated_conjecture, ~ at(crate, bay), inference(assume_negation, [status(cth)], [goal])).
cnf(c1, plain, at(crate, CLAIM),
    inference(rw, [status(thm)], [inference(rw, [status(thm)], [inference(rw, [status(thm)],
      [crate_at, idem]), idem]), dock_to_bay])).
cnf(c2, plain, $false, inference(resolve, [status(thm)], [c1, n])).
"""


def test_nested_rewriting_records_are_computed_by_rewriting(tmp_path):
    report = run(tmp_path, NESTED_REWRITES.replace("CLAIM", "bay"), FORWARDING)
    assert report.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in report.steps]
    nested = [s for s in report.steps if s.name not in {"n", "c1", "c2", "idem", "dock_to_bay", "crate_at", "goal"}]
    assert len(nested) == 2
    assert all(s.outcome == RECONSTRUCTED and "computed" in s.message for s in nested)
    # The innermost record rewrote once (outermost redex), the next once more.
    assert any("at(crate,fwd(fwd(dock)))" in s.message.replace(" ", "") for s in nested)
    assert any("at(crate,fwd(dock))" in s.message.replace(" ", "") for s in nested)


def test_a_wrong_claim_under_nested_rewriting_records_is_refuted_at_the_outer_step(tmp_path):
    # at(crate, dock) does not follow: dock and bay may differ.
    report = run(tmp_path, NESTED_REWRITES.replace("CLAIM", "dock"), FORWARDING)
    assert report.verdict != ACCEPTED
    assert step(report, "c1").outcome == REFUTED
    assert "reason: countermodel" in step(report, "c1").details


def test_a_record_named_rewriting_that_resolves_is_still_checked(tmp_path):
    # The rule name only orders the guesses: the last step, a resolution
    # written as `rw`, is found among the other single inferences once its
    # nested record is computed by rewriting (right to left); nothing is
    # refuted.
    proof = """
fof(n, negated_conjecture, ~ at(crate, bay), inference(assume_negation, [status(cth)], [goal])).
cnf(c1, plain, ~ at(crate, fwd(dock)),
    inference(rw, [status(thm)], [inference(rw, [status(thm)], [n, dock_to_bay]), dock_to_bay])).
cnf(c2, plain, ~ at(crate, fwd(fwd(dock))), inference(rw, [status(thm)], [c1, idem])).
cnf(c3, plain, $false, inference(rw, [status(thm)], [inference(rw, [status(thm)], [c2, idem]), crate_at])).
"""
    report = run(tmp_path, proof, FORWARDING)
    assert report.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in report.steps]
    assert not any(s.outcome == REFUTED for s in report.steps)
    assert "computed `~at(crate,fwd(fwd(fwd(dock))))`" in step(report, "c3/1").message
    assert "resolution" in step(report, "c3").message


def test_cheap_bounds_search_no_counter_model(tmp_path):
    # The bounds the guesses for unstated conclusions are first tried with:
    # a step that does not hold is left unproven there (a guess that does
    # not fit says nothing about the step); with the full bounds it is refuted.
    proof = "cnf(c1, plain, at(crate, dock), inference(rw, [status(thm)], [crate_at, dock_to_bay])).\n"
    (tmp_path / "proof.p").write_text(proof)
    (tmp_path / "problem.p").write_text(FORWARDING)
    cheap = SearchLimits().cheap()
    assert (cheap.screen_domain, cheap.countermodel_domain) == (0, 0)
    assert cheap.saturation_given < SearchLimits().saturation_given
    full = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))
    quick = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"), limits=cheap)
    assert step(full, "c1").outcome == REFUTED
    assert step(quick, "c1").outcome == UNPROVEN


# Fourteen crates, each at the dock's alias; the prover's first rewrite is
# at the last crate, beyond the guesses kept for a record, so the chain of
# rewriting records is checked as one from its base and cited equations.
MANIFEST_ARGS = ", ".join(f"alias(k{i})" for i in range(14))
MANIFEST = f"""
cnf(alias_is_dock, axiom, alias(X) = dock(X)).
cnf(dock_is_bay, axiom, dock(k13) = bay).
cnf(unrelated, axiom, dock(k0) = yard).
cnf(manifest, axiom, held({MANIFEST_ARGS})).
fof(goal, conjecture, held({MANIFEST_ARGS.replace("alias(k13)", "bay")})).
"""


def _manifest_proof(claim_last: str) -> str:
    args = ", ".join([*(f"alias(k{i})" for i in range(13)), claim_last])
    return f"""
cnf(c1, plain, held({args}),
    inference(rw, [status(thm)], [inference(rw, [status(thm)], [manifest, alias_is_dock]), dock_is_bay])).
fof(n, negated_conjecture, ~ held({MANIFEST_ARGS.replace("alias(k13)", "bay")}),
    inference(assume_negation, [status(cth)], [goal])).
cnf(c2, plain, $false, inference(resolve, [status(thm)], [c1, n])).
"""


def test_a_chain_of_rewriting_records_is_checked_from_its_base(tmp_path):
    report = run(tmp_path, _manifest_proof("bay"), MANIFEST)
    assert report.verdict == ACCEPTED, [(s.name, s.outcome, s.message) for s in report.steps]
    assert "through its rewriting records" in step(report, "c1").message
    assert "covered by the check of `c1` from `manifest`" in step(report, "c1/1").message


def test_a_rewrite_by_an_equation_the_chain_does_not_cite_is_not_accepted(tmp_path):
    # Attack: the first crate rewritten to the yard needs `unrelated`, which
    # no record of the chain cites.
    proof = _manifest_proof("bay").replace("held(alias(k0)", "held(yard")
    report = run(tmp_path, proof, MANIFEST)
    assert report.verdict != ACCEPTED
    assert step(report, "c1").outcome in (FAILED, REFUTED, UNPROVEN)
