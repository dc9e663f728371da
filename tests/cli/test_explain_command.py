"""``assay explain``: golden files for representative failures.

Each case names a failing step; its explanation must match the golden
file exactly (regenerate with ASSAY_WRITE_GOLDEN=1 and review the diff),
and, whatever the golden file says, must name the step, its location and
the exact terms of the failure.  The expected terms were worked out by
hand from the rules as published (binary resolution and its unifier,
Robinson 1965; Skolemization needs a fresh symbol; a leaf must be a
problem statement; a derivation is acyclic): common practice.
"""

from __future__ import annotations

import os
from pathlib import Path

import pytest
from click.testing import CliRunner

from checker.cli import main
from checker.explain import explain, render_explanation
from checker.opened import open_derivation
from checker.run import check

ROOT = Path(__file__).resolve().parents[2]
GOLDEN = Path(__file__).resolve().parent / "golden"
DERIVATIONS = "fixtures/tptp/derivations"

# name: (derivation, step, location, terms the explanation must name)
CASES = {
    "sign_clash": ("fixtures/explain/dock_door_sign_clash.jsonl", "d1", ":7:1",
                   ["`opens(P,dock_door)`", "`badge(driver7)`", "are both positive", "reason: same_sign"]),
    "symbol_clash_after_substitution": ("fixtures/explain/dock_door_symbol_clash.jsonl", "d1", ":7:1",
                                        ["{P -> driver8}", "`driver8` vs `driver7`", "reason: atoms_differ"]),
    "missing_literal": ("fixtures/explain/dock_door_missing_literal.jsonl", "d2", ":8:1",
                        ["  - alarm(dock_door)", "    logged(driver7)", "reason: missing_from_claimed"]),
    "extra_literal": ("fixtures/explain/dock_door_extra_literal.jsonl", "d2", ":8:1",
                      ["  + logged(driver9)", "  - logged(driver7)", "    alarm(dock_door)"]),
    "non_fresh_skolem_symbol": (f"{DERIVATIONS}/depot_truck_dispatch/mutant_skolem_reused_constant.p", "s1", ":9:1",
                                ["`hub_truck/0`", "hub_truck_is_truck", "reason: not_fresh"]),
    "unknown_leaf": (f"{DERIVATIONS}/conveyor_include/mutant_axiom_not_in_problem.p", "jam_stops_belt", ":7:1",
                     ["`~jammed(B) | flag_raised(B)`", "`~jammed(B) | stopped(B)`", "reason: not_in_problem"]),
    "cycle": ("fixtures/explain/dock_door_cycle.p", "d1", ":7:1", ["d1 -> d2 -> d1", "reason: cycle"]),
    "refuted_with_counter_model": (f"{DERIVATIONS}/signal_box_log/mutant_dropped_literal.p", "c2", ":19:1",
                                   ["  - block_clear(block_of(sig_a))", "falsified: written_order(b2)",
                                    "2. counter-model screen"]),
}


def _explain_text(derivation: str, step: str, monkeypatch) -> str:
    monkeypatch.chdir(ROOT)
    result = CliRunner().invoke(main, ["explain", derivation, step])
    assert result.exit_code == 0, result.output
    return result.output


@pytest.mark.parametrize("case", sorted(CASES))
def test_explanation_matches_its_golden_file_and_names_the_exact_terms(case, monkeypatch):
    derivation, step, location, terms = CASES[case]
    text = _explain_text(derivation, step, monkeypatch)
    assert text.startswith(f"step {step} at {derivation}{location} ")
    for term in terms:
        assert term in text, term
    golden = GOLDEN / f"explain_{case}.txt"
    if os.environ.get("ASSAY_WRITE_GOLDEN"):
        golden.write_text(text, encoding="utf-8")
    assert text == golden.read_text(encoding="utf-8")


def test_a_valid_step_shows_its_evidence_with_unifier_and_result(monkeypatch):
    text = _explain_text("fixtures/explain/dock_door.jsonl", "d2", monkeypatch)
    # Binary resolution of ~opens(P,D) with opens(driver7,dock_door): unifier {D -> dock_door, P -> driver7}.
    assert "outcome: checked" in text
    assert "unifier {D -> dock_door, P -> driver7} / {}: `logged(driver7) | alarm(dock_door)`" in text
    assert "kernel: accepted" in text


def test_a_reconstructed_step_says_what_was_tried_and_found(monkeypatch):
    text = _explain_text(f"{DERIVATIONS}/signal_box_log/proof.p", "c2", monkeypatch)
    # Two rewrites with block_of(sig_a) = b2, one per literal (worked by hand).
    assert "outcome: reconstructed" in text
    assert "1. single inference: 4 candidates, none subsumes the claim" in text
    assert "3. chain of rewrites and deletions: 2 inferences" in text
    assert "of premise 2 at position 1, unifier {} / {}: `block_clear(b2) | written_order(b2)`" in text


def test_a_nested_record_is_explained_by_its_own_name(monkeypatch):
    text = _explain_text(f"{DERIVATIONS}/valve_sensor_nested_skolemize/proof.p", "c_0_9/2", monkeypatch)
    assert text.startswith("step c_0_9/2 at ")
    assert "0 = c_0_9/3: (nested record)" in text
    assert "claimed: not stated (a nested record)" in text


def test_an_unknown_step_is_a_usage_error_with_the_nearest_names(monkeypatch):
    monkeypatch.chdir(ROOT)
    result = CliRunner().invoke(main, ["explain", "fixtures/explain/dock_door.jsonl", "d22"])
    assert result.exit_code == 2
    assert "no step named `d22`; did you mean `d2`" in result.output


def test_colour_only_when_asked_for_a_terminal(monkeypatch):
    monkeypatch.chdir(ROOT)
    path = "fixtures/explain/dock_door_missing_literal.jsonl"
    opened = open_derivation(path)
    explanation = explain(opened, check(path), "d2")
    assert "\x1b[" in render_explanation(explanation, styled=True)
    assert "\x1b[" not in render_explanation(explanation, styled=False)
    assert "\x1b[" not in _explain_text(path, "d2", monkeypatch)  # not a terminal


def test_a_formula_step_under_nested_records_shows_the_replayed_refutation(monkeypatch):
    text = _explain_text(f"{DERIVATIONS}/valve_sensor_nested_skolemize/proof.p", "c_0_5", monkeypatch)
    # Renaming the variables of sensors_report: clausify(premise ∧ ¬claim) is refuted by resolution (worked by hand).
    assert "1. premises: the statements under its nested records, sensors_report" in text
    assert "3. refutation of the 4 clauses of premises and negated claim: 3 inferences" in text
    assert text.rstrip().endswith("kernel: accepted")
    assert "`$false`" in text


def test_a_refuted_formula_step_shows_what_was_tried_and_the_counter_model(monkeypatch):
    text = _explain_text(f"{DERIVATIONS}/reactor_coolant_scram/mutant_formula_literal_dropped.p", "f2", monkeypatch)
    # The claim drops the low_coolant_flow guard: a reactor with normal flow and no scram falsifies it.
    assert "outcome: refuted" in text
    assert "2. refutation of the 4 clauses of premises and negated claim: none within 60 given clauses" in text
    assert "  low_coolant_flow = {}" in text and "  falsified: ~ reactor(0) | scrammed(0)" in text


def test_unreadable_derivation_is_a_clear_error_with_its_place(monkeypatch, tmp_path):
    monkeypatch.chdir(ROOT)
    garbled = tmp_path / "garbled.p"
    garbled.write_text("cnf(a, axiom, p).\ncnf(b, plain, q(, inference(r, [], [a])).\n", encoding="utf-8")
    for command in (["explain", str(garbled), "b"], ["extract", str(garbled), "b", "-o", str(tmp_path / "r.p")],
                    ["graph", str(garbled), "-o", str(tmp_path / "g.dot")]):
        result = CliRunner().invoke(main, command)
        assert result.exit_code == 2, command
        assert f"{garbled}:2:" in result.output and "Traceback" not in result.output
