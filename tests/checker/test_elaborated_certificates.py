"""`elaborate` then `check`: every valid fixture re-checks with no search,
and an elaborated certificate with one field changed is rejected there.

The elaborated file is validated record by record against the version 2
JSON Schema (formats/native_certificate_v2.schema.json) with the
jsonschema package; the verdicts compared are the checker's own on the
original derivation, whose expected verdicts the fixture tests settle.
"""

from __future__ import annotations

import json
from pathlib import Path

import jsonschema
import pytest

from checker.elaborate import elaborate
from checker.outcomes import ACCEPTED, ASSUMED, CHECKED, FAILED, REJECTED
from checker.run import check

ROOT = Path(__file__).resolve().parents[2]
TPTP = ROOT / "fixtures" / "tptp"
SCHEMA = json.loads((ROOT / "formats" / "native_certificate_v2.schema.json").read_text(encoding="utf-8"))
VALIDATOR = jsonschema.Draft202012Validator(SCHEMA)

# The prover-printed derivations that check in about a second (as in test_prover_corpus.py).
FAST_CORPUS = (
    "boolean_algebra_absorption", "boolean_algebra_idempotence", "group_commuting_inverse",
    "group_double_inverse", "group_inverse_of_product", "group_right_cancellation", "group_right_identity",
    "group_right_inverse", "group_squares_commute", "lattice_idempotence", "lattice_order_duality",
    "plant_startup_checklist", "boolean_algebra_de_morgan", "boolean_ring_characteristic_two",
)


def _valid_fixtures() -> list[tuple[str, Path, Path | None]]:
    found = []
    for group in ("derivations", "splitting", "typed"):
        for folder in sorted((TPTP / group).iterdir()):
            if (folder / "proof.p").is_file():
                found.append((f"{group}/{folder.name}", folder / "proof.p", folder / "problem.p"))
    for name in FAST_CORPUS:
        folder = TPTP / "prover_corpus" / name
        found.append((f"prover_corpus/{name}", folder / "proof.p", folder / "problem.p"))
    found.append(("demo/interlock", ROOT / "fixtures" / "demo" / "interlock.jsonl", None))
    return found


VALID = _valid_fixtures()


def _schema_errors(path: Path) -> list[str]:
    errors = []
    for number, line in enumerate(path.read_text(encoding="utf-8").splitlines(), start=1):
        for error in VALIDATOR.iter_errors(json.loads(line)):
            errors.append(f"line {number}: {error.message[:200]}")
    return errors


@pytest.mark.parametrize(("label", "derivation", "problem"), VALID, ids=[label for label, _, _ in VALID])
def test_an_elaborated_certificate_rechecks_with_every_step_checked(label, derivation, problem, tmp_path):
    out = tmp_path / "elaborated.jsonl"
    done = elaborate(str(derivation), str(out), str(problem) if problem and problem.exists() else None)
    assert done.report.verdict == ACCEPTED, done.report.first_failure
    assert done.written == str(out)
    assert _schema_errors(out) == []
    again = check(str(out))
    assert again.verdict == done.report.verdict, again.error or again.first_failure
    assumed_before = {step.name for step in done.report.steps if step.outcome == ASSUMED}
    for step in again.steps:
        # Leaves taken as assumptions stay so; everything else is replayed from the certificate.
        assert step.outcome == CHECKED or (step.outcome == ASSUMED and step.name in assumed_before), step
    stated_after = {step.name for step in again.steps}
    assert stated_after <= {step.name for step in done.report.steps}


def test_a_derivation_that_is_not_accepted_gets_no_certificate(tmp_path):
    out = tmp_path / "never.jsonl"
    done = elaborate(str(ROOT / "fixtures" / "demo" / "interlock_broken.jsonl"), str(out))
    assert done.report.verdict == REJECTED
    assert done.written is None and not out.exists()


def test_a_partial_certificate_says_so_in_its_header(tmp_path):
    out = tmp_path / "partial.jsonl"
    done = elaborate(str(ROOT / "fixtures" / "demo" / "interlock_broken.jsonl"), str(out), partial=True)
    assert done.written == str(out)
    header = json.loads(out.read_text(encoding="utf-8").splitlines()[0])
    assert header["partial"] is True and "p1_flow_path" in header["comment"]
    assert _schema_errors(out) == []
    assert check(str(out)).verdict == REJECTED


# Attacks: one field changed -------------------------------------------------


def _elaborated(tmp_path: Path, scenario: str) -> tuple[Path, list[dict]]:
    folder = TPTP / "derivations" / scenario
    out = tmp_path / f"{scenario}.jsonl"
    assert elaborate(str(folder / "proof.p"), str(out), str(folder / "problem.p")).written
    return out, [json.loads(line) for line in out.read_text(encoding="utf-8").splitlines()]


def _rewrite(path: Path, records: list[dict]) -> None:
    path.write_text("".join(json.dumps(record) + "\n" for record in records), encoding="utf-8")


def _rejected_at(path: Path, name: str) -> str:
    report = check(str(path))
    assert report.verdict == REJECTED, report.error
    failed = [step for step in report.steps if step.outcome == FAILED]
    assert [step.name for step in failed] == [name], failed
    return failed[0].reason


def _findings(records: list[dict], kind: str):
    for record in records[1:]:
        for finding in record.get("findings", []):
            if finding["kind"] == kind:
                yield record, finding


def test_a_changed_binding_in_inline_evidence_is_rejected_at_that_step(tmp_path):
    path, records = _elaborated(tmp_path, "badge_door_access_eprover")
    record = next(r for r in records[1:] if "right_substitution" in r.get("inference", {})
                  or "left_substitution" in r.get("inference", {}))
    inference = record["inference"]
    field = "left_substitution" if "left_substitution" in inference else "right_substitution"
    variable = min(inference[field])
    inference[field][variable] = "elsewhere_constant"
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "atoms_differ"


def test_a_changed_literal_index_in_a_refutation_is_rejected_at_that_step(tmp_path):
    path, records = _elaborated(tmp_path, "harbour_pilot_roster")
    record, finding = next(
        (r, f) for r, f in _findings(records, "refutation") if any(s["rule"] == "resolution" for s in f["steps"])
    )
    step = next(s for s in finding["steps"] if s["rule"] == "resolution")
    step["left_literal"] += 7  # no clause has that many literals
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "literal_out_of_range"


def test_a_cover_match_naming_a_clause_the_premises_lack_is_rejected_at_that_step(tmp_path):
    path, records = _elaborated(tmp_path, "cooling_racks_distribution")
    record, finding = next(_findings(records, "cover"))
    finding["matches"][0]["premise_clause"] = 10**6
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "no_such_clause"


def test_a_cover_renaming_a_symbol_of_the_problem_is_rejected_at_that_step(tmp_path):
    path, records = _elaborated(tmp_path, "cooling_racks_distribution")
    record, finding = next(_findings(records, "cover"))
    finding["renaming"].append(["primary", "backup"])
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "renames_a_symbol"


def test_a_changed_witness_pairing_is_rejected_at_that_step(tmp_path):
    path, records = _elaborated(tmp_path, "badge_staff_equivalence_skolemize")
    record, finding = next(_findings(records, "witness_pairings"))
    witnessing = finding["pairings"][0][0]
    symbol, _, arguments = witnessing["witness"].partition("(")
    assert arguments, "the scenario's Skolem function has arguments"
    # The same symbol over other variables: it forgets those its quantifier depends on.
    others = ",".join(f"Z{number}" for number in range(arguments.count(",") + 1))
    witnessing["witness"] = f"{symbol}({others})"
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "missing_dependency"


def test_a_witness_paired_with_another_quantifier_is_rejected_at_that_step(tmp_path):
    path, records = _elaborated(tmp_path, "badge_staff_equivalence_skolemize")
    record, finding = next(_findings(records, "witness_pairings"))
    witnessing = finding["pairings"][0][0]
    witnessing["premise"] = 5  # a premise the step does not have
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "pairing_premise"


def test_a_changed_leaf_digest_is_rejected_at_that_leaf(tmp_path):
    path, records = _elaborated(tmp_path, "badge_staff_equivalence_skolemize")
    record, finding = next(_findings(records, "problem_link"))
    finding["sha256"] = ("0" if finding["sha256"][0] != "0" else "1") + finding["sha256"][1:]
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "link_digest"


def test_a_leaf_linked_to_a_formula_the_problem_lacks_is_rejected(tmp_path):
    path, records = _elaborated(tmp_path, "badge_staff_equivalence_skolemize")
    record, finding = next(_findings(records, "problem_link"))
    finding["name"] = "no_such_formula"
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "link_unknown"


def test_a_finding_for_another_question_is_rejected_where_it_is_needed(tmp_path):
    path, records = _elaborated(tmp_path, "badge_staff_equivalence_skolemize")
    record, finding = next(_findings(records, "witness_pairings"))
    finding["for"] = "0" * 32
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "finding_unused"


def test_a_second_definition_for_one_name_is_rejected_at_the_step_that_gives_it(tmp_path):
    path, records = _elaborated(tmp_path, "pallet_wrap_naming")
    record, finding = list(_findings(records, "definition"))[-1]
    # Every step introducing the name asks for its one definition; this one answers differently.
    finding["definition"] = "! [X,Y] : (sP5(X,Y) <=> wrapped(Y))"
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "definition_differs"


def test_a_wrong_definition_given_by_every_step_is_not_accepted(tmp_path):
    path, records = _elaborated(tmp_path, "pallet_wrap_naming")
    for _, finding in _findings(records, "definition"):
        finding["definition"] = "! [X,Y] : (sP5(X,Y) <=> wrapped(Y))"
    _rewrite(path, records)
    report = check(str(path))
    assert report.verdict == REJECTED
    assert {step.reason for step in report.steps if step.outcome == FAILED} == {"finding_unused"}


def test_a_witness_that_is_not_a_new_symbol_is_rejected_at_that_step(tmp_path):
    path, records = _elaborated(tmp_path, "badge_staff_equivalence_skolemize")
    record, finding = next(_findings(records, "witness_pairings"))
    finding["pairings"][0][0]["witness"] = "ann"  # a constant of the problem
    _rewrite(path, records)
    assert _rejected_at(path, record["name"]) == "not_a_new_symbol"
