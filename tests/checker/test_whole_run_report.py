"""The whole-run report: steps resting on a failure, notes, trust summary.

The derivations are small invented ones (a cold store, a loading bay)
whose every step was settled by hand: which steps lie below a wrong one,
which the refutation uses, which clauses are tautologies (a clause with
a literal and its complement, or with s = s, is true in every
interpretation: common practice).
"""

from __future__ import annotations

from pathlib import Path

from checker.kernel.clauses import Clause, Literal
from checker.kernel.terms import application
from checker.notes import tautology_witness
from checker.outcomes import ACCEPTED, CHECKED, FAILED, NOT_NEEDED, RECONSTRUCTED, REJECTED, UNFOUNDED, UNUSED_LEAF
from checker.report import SCOPE, render_text, report_json
from checker.run import check

ROOT = Path(__file__).resolve().parents[2]
CASES = ROOT / "fixtures" / "report_cases"


def _write(tmp_path, text: str) -> str:
    path = tmp_path / "bay.p"
    path.write_text(text, encoding="utf-8")
    return str(path)


BAY = """\
cnf(bay_open, axiom, open(bay)).
cnf(open_needs_guard, axiom, ~ open(B) | guarded(B)).
cnf(unguarded, negated_conjecture, ~ guarded(bay)).
cnf(spare, axiom, idle(crane)).
cnf(guarded_bay, plain, guarded(bay), inference(resolve, [status(thm)], [bay_open, open_needs_guard])).
cnf(refutation, plain, $false, inference(resolve, [status(thm)], [guarded_bay, unguarded])).
"""


def test_every_step_below_a_failure_is_unfounded_and_names_it(tmp_path):
    # guarded_bay claims guarded(yard), which resolution of its parents does
    # not give; refutation below it is a correct inference from what
    # guarded_bay states, but rests on it.
    text = BAY.replace("plain, guarded(bay)", "plain, guarded(yard)").replace("~ guarded(bay)).", "~ guarded(X)).")
    report = check(_write(tmp_path, text))
    outcomes = {step.name: step.outcome for step in report.steps}
    assert report.verdict == REJECTED
    assert outcomes["guarded_bay"] in (FAILED, "refuted")
    assert outcomes["refutation"] == UNFOUNDED
    refutation = next(step for step in report.steps if step.name == "refutation")
    assert "rests on" in refutation.message and "`guarded_bay`" in refutation.message
    assert refutation.details[0] == "rests on: guarded_bay"
    assert report.first_failure.name == "guarded_bay"  # never the unfounded step
    assert report_json(report)["counts"][UNFOUNDED] == 1


def test_a_sound_derivation_has_no_unfounded_step_and_its_notes(tmp_path):
    report = check(_write(tmp_path, BAY))
    assert report.verdict == ACCEPTED
    assert {step.outcome for step in report.steps} <= {"assumed", CHECKED, RECONSTRUCTED}
    notes = {(note.kind, note.step) for note in report.notes}
    assert notes == {(UNUSED_LEAF, "spare")}
    # No problem: every leaf is an assumption, and the summary says so.
    text = render_text(report)
    assert "    leaves taken as assumptions: bay_open, open_needs_guard, unguarded, spare" in text
    assert "    steps: 0 checked, 2 reconstructed, 0 refuted, 0 failed, 0 unproven, 0 unfounded" in text


def test_a_step_used_only_by_unneeded_steps_is_not_needed(tmp_path):
    text = BAY + "cnf(idle_or_open, plain, idle(crane) | open(bay), inference(weaken, [status(thm)], [spare])).\n"
    report = check(_write(tmp_path, text))
    notes = {(note.kind, note.step) for note in report.notes}
    assert notes == {(NOT_NEEDED, "spare"), (NOT_NEEDED, "idle_or_open")}


def test_tautologies_are_recognized():
    bay, yard = application("bay"), application("yard")
    guarded = application("guarded", (bay,))
    assert "both" in tautology_witness(Clause([Literal(False, guarded), Literal(True, guarded)]))
    assert "reflexivity" in tautology_witness(Clause([Literal(True, application("=", (bay, bay)))]))
    assert "is true" in tautology_witness(Clause([Literal(True, application("$true"))]))
    assert "is true" in tautology_witness(Clause([Literal(False, application("$false"))]))
    # Not tautologies: different atoms, a disequation s != s, a different equation.
    assert tautology_witness(Clause([Literal(False, guarded), Literal(True, application("guarded", (yard,)))])) is None
    assert tautology_witness(Clause([Literal(False, application("=", (bay, bay)))])) is None
    assert tautology_witness(Clause([Literal(True, application("=", (bay, yard)))])) is None


def test_the_trust_summary_names_the_introduced_symbols_and_where():
    # hangar_crew_rota: the clause-form step f6 introduces sK5/1 and sK2/2
    # (read off the derivation).
    folder = ROOT / "fixtures" / "tptp" / "derivations" / "hangar_crew_rota"
    report = check(str(folder / "proof.p"), str(folder / "problem.p"))
    line = next(n for n, text in enumerate((folder / "proof.p").read_text().splitlines(), 1) if "(f6," in text[:8])
    assert [(i.symbol, i.step, i.location.line) for i in report.introduced] == [("sK2/2", "f6", line), ("sK5/1", "f6", line)]
    assert f"      sK5/1 by step f6 at {folder / 'proof.p'}:{line}:1" in render_text(report)


def test_the_json_report_says_what_a_checked_proof_shows():
    report = report_json(check(str(CASES / "cold_store.jsonl")))
    assert report["verdict"] == ACCEPTED
    assert report["scope"] == SCOPE
    assert "it does not show that the axioms describe the real system" in report["scope"]
