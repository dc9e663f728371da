"""End to end: typed (tff, thf) derivations, and when their sorts may be erased.

Each scenario under fixtures/tptp/typed holds a problem, a valid
derivation (hand-written in the style of prover output, on an invented
scenario) and mutants.  A mutant's header says either which step was made
wrong (``% broken-step: NAME``), decided by hand, or where a term of the
wrong sort stands (``% unreadable-at: LINE:COLUMN``).
"""

from __future__ import annotations

import json
import re
from pathlib import Path

import pytest

from checker.kernel.formulas import FALSUM
from checker.outcomes import ACCEPTED, CHECKED, RECONSTRUCTED, REFUTED, REJECTED, UNDECIDED, UNPROVEN, UNREADABLE
from checker.run import check
from checker.sorts import naked_equality
from formats.tptp import parse_formula, read_tptp

TYPED = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "typed"
SCENARIOS = sorted(folder for folder in TYPED.iterdir() if (folder / "proof.p").is_file())
MUTANTS = sorted(TYPED.glob("*/mutant_*.p"))
_HEADER = re.compile(r"^% (broken-step|unreadable-at): (\S+)", re.MULTILINE)


def test_there_are_typed_derivations_with_and_without_declared_sorts():
    assert len(SCENARIOS) >= 8
    sorted_ones = [f for f in SCENARIOS if "$tType" in (f / "problem.p").read_text(encoding="utf-8")]
    assert 3 <= len(sorted_ones) < len(SCENARIOS)
    languages = {s.language for f in SCENARIOS for s in read_tptp(str(f / "proof.p")).statements}
    assert languages == {"tff", "thf"}


@pytest.mark.parametrize("folder", SCENARIOS, ids=lambda f: f.name)
def test_valid_typed_derivation_is_accepted(folder):
    # Valid by construction: each step follows from its parents as written
    # (checked by hand), with sorts respected.
    report = check(str(folder / "proof.p"), problem=str(folder / "problem.p"))
    assert report.verdict == ACCEPTED, report.error or [(s.name, s.outcome, s.message) for s in report.steps]
    assert all(step.outcome in (CHECKED, RECONSTRUCTED) for step in report.steps)


@pytest.mark.parametrize("mutant", MUTANTS, ids=lambda m: f"{m.parent.name}/{m.stem}")
def test_typed_mutant_is_rejected_at_its_changed_step_or_place(mutant):
    kind, where = _HEADER.search(mutant.read_text(encoding="utf-8")).groups()
    report = check(str(mutant), problem=str(mutant.parent / "problem.p"))
    if kind == "unreadable-at":
        line, column = where.split(":")
        assert report.verdict == UNREADABLE
        assert report.error.startswith(f"{mutant}:{line}:{column}: ")
        assert "must be of type" in report.error
    else:
        assert report.verdict == REJECTED
        assert report.first_failure.name == where
        # Refuted; or, where the changed literal brings in a problem symbol
        # the parents lack, failed as no introduction, with the counter-model.
        failure = report.first_failure
        assert failure.outcome == REFUTED or (failure.reason == "not_fresh" and "counter-model" in failure.message)


def test_every_typed_scenario_has_a_mutant_and_the_sorted_ones_a_wrong_sort():
    for folder in SCENARIOS:
        headers = [_HEADER.search(m.read_text(encoding="utf-8")).group(1) for m in folder.glob("mutant_*.p")]
        assert "broken-step" in headers, folder.name
        if "$tType" in (folder / "problem.p").read_text(encoding="utf-8"):
            assert "unreadable-at" in headers, folder.name


def test_a_derivation_with_two_false_clauses_and_a_commented_copy_is_accepted():
    folder = TYPED / "cold_room_unused_arithmetic"
    statements = read_tptp(str(folder / "proof.p")).statements
    assert [s.name for s in statements if s.content is FALSUM] == ["f9", "f10"]
    assert check(str(folder / "proof.p"), problem=str(folder / "problem.p")).verdict == ACCEPTED


# ------------------------------------------------------------ monotonicity

# Two sorts, one forced to a single element: satisfiable with sorts (one
# valve, two sensors), unsatisfiable once the sorts are erased.  The example
# of Claessen, Lillieström & Smallbone 2011 (from memory), set in a plant.
SINGLE_VALVE = """\
tff(valve_type, type, valve: $tType).
tff(sensor_type, type, sensor: $tType).
tff(s1_type, type, s1: sensor).
tff(s2_type, type, s2: sensor).
tff(one_valve, axiom, ! [X: valve, Y: valve] : X = Y).
tff(two_sensors, axiom, s1 != s2).
"""


def _write(tmp_path, name, text):
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return str(path)


def test_erasing_sorts_is_refused_where_a_sort_may_not_be_monotone(tmp_path):
    problem = _write(tmp_path, "problem.p", SINGLE_VALVE)
    proof = _write(
        tmp_path,
        "proof.p",
        SINGLE_VALVE.split("tff(one_valve")[0]
        + "tff(a1, axiom, ! [X: valve, Y: valve] : X = Y, file('problem.p', one_valve)).\n"
        "tff(a2, axiom, s1 != s2, file('problem.p', two_sensors)).\n"
        "tff(f3, plain, $false, inference(superposition, [status(thm)], [a1, a2])).\n",
    )
    report = check(proof, problem=problem)
    step = next(s for s in report.steps if s.name == "f3")
    assert report.verdict == UNDECIDED
    assert step.outcome == UNPROVEN
    assert step.message.startswith("unsupported: equality over a sort that may not be monotone")
    assert "reason: unsupported_sorts" in step.details


def test_the_same_refutation_untyped_is_accepted(tmp_path):
    # Without sorts the refutation is right: X = Y makes every two individuals equal.
    problem = _write(tmp_path, "problem.p", "fof(one, axiom, ! [X, Y] : X = Y).\nfof(two, axiom, s1 != s2).\n")
    proof = _write(
        tmp_path,
        "proof.p",
        "fof(a1, axiom, ! [X, Y] : X = Y, file('problem.p', one)).\n"
        "fof(a2, axiom, s1 != s2, file('problem.p', two)).\n"
        "fof(f3, plain, $false, inference(superposition, [status(thm)], [a1, a2])).\n",
    )
    assert check(proof, problem=problem).verdict == ACCEPTED


def test_an_untyped_derivation_of_a_many_sorted_problem_cannot_slip_past(tmp_path):
    # The leaf s1 = s2 is an (ill-sorted) instance of one_valve once sorts are erased;
    # its own step has no naked variable, but the problem it is linked to does.
    problem = _write(tmp_path, "problem.p", SINGLE_VALVE)
    proof = _write(
        tmp_path,
        "proof.p",
        "cnf(a1, axiom, s1 = s2, file('problem.p', one_valve)).\n"
        "cnf(a2, axiom, s1 != s2, file('problem.p', two_sensors)).\n"
        "cnf(f3, plain, $false, inference(resolution, [status(thm)], [a1, a2])).\n",
    )
    report = check(proof, problem=problem)
    assert report.verdict != ACCEPTED
    step = next(s for s in report.steps if s.name == "f3")
    assert step.outcome == UNPROVEN and "`one_valve`" in step.message


def test_a_derivation_cannot_declare_the_sorts_away(tmp_path):
    # Declaring everything at $i in the derivation does not make the problem single-sorted.
    problem = _write(tmp_path, "problem.p", SINGLE_VALVE)
    proof = _write(
        tmp_path,
        "proof.p",
        "tff(a1, axiom, ! [X: $i, Y: $i] : X = Y, file('problem.p', one_valve)).\n"
        "tff(a2, axiom, s1 != s2, file('problem.p', two_sensors)).\n"
        "tff(f3, plain, $false, inference(superposition, [status(thm)], [a1, a2])).\n",
    )
    assert check(proof, problem=problem).verdict != ACCEPTED


def test_a_native_certificate_cannot_forge_the_sorts_away(tmp_path):
    # The same attack in assay's own certificate (version 2): typed statements
    # written as untyped fof with no `sorts` field.  The sorts come from the
    # typed problem as read, so erasure stays refused.
    problem = _write(tmp_path, "problem.p", SINGLE_VALVE)
    records = [
        {"assay_certificate": 2, "problem": "problem.p"},
        {"name": "a1", "role": "axiom", "language": "fof", "formula": "! [X, Y] : X = Y",
         "origin": {"kind": "file", "detail": ["problem.p", "one_valve"]}},
        {"name": "a2", "role": "axiom", "language": "fof", "formula": "s1 != s2",
         "origin": {"kind": "file", "detail": ["problem.p", "two_sensors"]}},
        {"name": "f3", "role": "plain", "language": "fof", "formula": "$false",
         "inference": {"rule": "superposition", "parents": ["a1", "a2"], "status": "thm"}},
    ]
    proof = _write(tmp_path, "proof.jsonl", "".join(json.dumps(record) + "\n" for record in records))
    report = check(proof, problem=problem)
    assert report.verdict != ACCEPTED
    step = next(s for s in report.steps if s.name == "f3")
    assert step.outcome == UNPROVEN and step.message.startswith("unsupported: equality over a sort")


@pytest.mark.parametrize(
    ("formula", "naked"),
    [
        ("! [X] : X = a", "X"),
        ("! [X] : (p(X) | a = X)", "X"),
        ("? [X] : X = a", None),  # Skolemized away: not naked
        ("~ ? [X] : ~ X = a", "X"),  # universal in effect
        ("~ ! [X] : X = a", None),  # the equality is negative
        ("! [X] : f(X) = a", None),  # under a function: not naked
        ("! [X] : X = X", None),  # true at every size
        ("! [X] : (p(X) <=> X = a)", "X"),  # both polarities
        ("p(X) | X = b", "X"),  # free variables are universal
    ],
)
def test_naked_variables(formula, naked):
    # Claessen, Lillieström & Smallbone 2011 (from memory): a variable is naked when it
    # is a side of an equality that occurs positively after clausification.
    found = naked_equality(parse_formula(formula))
    assert (None if found is None else str(found[0])) == naked


# ------------------------------------------------------------ arithmetic


def test_a_step_that_relies_on_arithmetic_is_unsupported_not_refuted(tmp_path):
    # 1 < 2 holds in the integers; read as an uninterpreted predicate it need not.
    proof = _write(
        tmp_path,
        "proof.p",
        "tff(q_type, type, q: $o).\n"
        "tff(a1, axiom, $less(1, 2) => q).\n"
        "tff(f2, plain, q, inference(evaluation, [status(thm)], [a1])).\n"
        "tff(f3, plain, $false, inference(resolution, [status(thm)], [f2, f2])).\n",
    )
    step = next(s for s in check(proof).steps if s.name == "f2")
    assert step.outcome == UNPROVEN
    assert step.message.startswith("unsupported: the step is over $int")


def test_a_step_over_arithmetic_sorts_that_does_not_rely_on_them_is_accepted(tmp_path):
    proof = _write(
        tmp_path,
        "proof.p",
        "tff(p_type, type, p: $int > $o).\n"
        "tff(a1, axiom, p(1)).\n"
        "tff(a2, axiom, ~ p(1)).\n"
        "tff(f3, plain, $false, inference(resolution, [status(thm)], [a1, a2])).\n",
    )
    report = check(proof)
    assert report.verdict == ACCEPTED


def test_a_leaf_hidden_behind_a_nested_record_is_examined_too(tmp_path):
    # No problem: the leaves are assumptions; the one-valve leaf is used only by the
    # nested record, whose unstated conclusion is all the outer step sees.
    proof = _write(
        tmp_path,
        "proof.p",
        SINGLE_VALVE.split("tff(one_valve")[0]
        + "tff(a1, axiom, ! [X: valve, Y: valve] : X = Y).\n"
        "tff(a2, axiom, s1 != s2).\n"
        "tff(f3, plain, $false, inference(resolution, [status(thm)], "
        "[inference(superposition, [status(thm)], [a1, a2]), a2])).\n",
    )
    report = check(proof)
    assert report.verdict == UNDECIDED
    outer = next(s for s in report.steps if s.name == "f3")
    assert outer.outcome == UNPROVEN and outer.message.startswith("unsupported: equality over a sort")


def test_an_unstated_nested_conclusion_as_premise_is_refused_with_several_sorts():
    from checker.sorts import erasure_hazard
    from formats.derivation import Inference, Location, Parent, Statement

    here = Location("proof.p", 1, 1)
    inner = Inference("superposition", "thm", (Parent("a1"), Parent("a2")))
    outer = Inference("resolution", "thm", (inner, Parent("a2")))
    claimed = Statement("f3", "plain", "tff", FALSUM, here, outer, frozenset())
    stand_in = Statement("f3/1", "plain", "cnf", parse_formula("s1 != s1"), here, inner)
    a2 = Statement("a2", "axiom", "tff", parse_formula("s1 != s2"), here, None, frozenset({"sensor"}))
    several = frozenset({"valve", "sensor"})
    assert erasure_hazard(claimed, outer, [stand_in, a2], several, {}).startswith(
        "unsupported: equality over a sort that may not be monotone: a premise is the unstated conclusion"
    )
    assert erasure_hazard(claimed, outer, [stand_in, a2], frozenset({"sensor"}), {}) is None
