"""Hostile input gets a clear, located answer within the input limits:
deep nesting, wide clauses, long names, many statements, cyclic parents,
includes that loop or leave the allowed directories, exponential
unifiers, formulas with free variables.

The inputs are generated here, at sizes just past lowered limits, so the
refusal path is the one the full-size inputs take
(bench/bench_hostile_input.py runs those and prints time and memory).
"""

import json
import re

import pytest

from checker.outcomes import ACCEPTED, EXIT_CODES, UNREADABLE
from checker.run import check
from formats.limits import DEFAULT_INPUT_LIMITS, InputLimits, bounded
from formats.native import parse_native
from formats.tptp import parse_tptp

LOCATED = re.compile(r"^(?P<file>.+):(?P<line>\d+):(?P<column>\d+): ")


def located(report, path, line):
    """The unreadable report's error, checked to name ``path`` at ``line``."""
    assert report.verdict == UNREADABLE and EXIT_CODES[report.verdict] == 2
    found = LOCATED.match(report.error)
    assert found and found["file"] == str(path) and int(found["line"]) == line, report.error
    return report.error


def refutation(first_literal: str, extra: str = "") -> str:
    return (
        f"cnf(c1, axiom, {first_literal}).\n"
        "cnf(c2, axiom, ~p(X)).\n"
        f"{extra}"
        "cnf(c3, plain, $false, inference(resolve, [status(thm)], [c1, c2])).\n"
    )


def test_term_nested_past_the_depth_limit_is_refused_at_the_bracket(tmp_path):
    limits = InputLimits(depth=50)
    proof = tmp_path / "crate_stack.p"
    proof.write_text(refutation("p(" + "on(" * 60 + "pallet" + ")" * 60 + ")"))
    error = located(check(str(proof), input_limits=limits), proof, 1)
    assert "nested more than 50 deep" in error and "--input-limit depth=" in error
    # the bracket that opened the 51st level: "cnf(" and "p(" are two of them
    assert error.startswith(f"{proof}:1:{len('cnf(c1, axiom, p(') + 48 * len('on(') + 3}:")


def test_term_just_within_the_depth_limit_is_checked(tmp_path):
    limits = InputLimits(depth=62)
    proof = tmp_path / "crate_stack.p"
    proof.write_text(refutation("p(" + "on(" * 60 + "pallet" + ")" * 60 + ")"))
    assert check(str(proof), input_limits=limits).verdict == ACCEPTED


def test_square_brackets_count_towards_the_depth_of_a_single_formula():
    # a formula string read on its own (as the native reader does) meets the same bound
    with bounded(InputLimits(depth=10)), pytest.raises(Exception) as caught:
        parse_native(
            json.dumps({"assay_certificate": 1}) + "\n"
            + json.dumps({"name": "a1", "role": "axiom", "language": "fof",
                          "formula": "![X]:" * 3 + "p(" + "g(" * 12 + "c" + ")" * 13, "origin": {"kind": "file"}})
        )
    assert "nested more than 10 deep" in str(caught.value) and ":2:" in str(caught.value)


def test_clause_wider_than_the_literal_limit_is_refused(tmp_path):
    proof = tmp_path / "wide_manifest.p"
    proof.write_text(refutation("p(X) | " + " | ".join(f"shipped(item{i})" for i in range(40))))
    error = located(check(str(proof), input_limits=InputLimits(literals=30)), proof, 1)
    assert "more than 30 literals" in error and "--input-limit literals=" in error


def test_long_name_is_refused_without_echoing_it_in_full(tmp_path):
    name = "valve" * 400
    proof = tmp_path / "long_name.p"
    proof.write_text(refutation(f"p(X) | {name}(X)", f"cnf(c4, axiom, ~{name}(a)).\n"))
    error = located(check(str(proof), input_limits=InputLimits(name_length=1_000)), proof, 1)
    assert "a name of 2000 characters" in error
    assert len(error) < 800  # the excerpt is a window around the place, not the whole line


def test_long_statement_name_in_a_native_certificate_is_refused(tmp_path):
    certificate = tmp_path / "long_name.jsonl"
    certificate.write_text(
        json.dumps({"assay_certificate": 1}) + "\n"
        + json.dumps({"name": "n" * 300, "role": "axiom", "language": "cnf", "formula": "p(a)",
                      "origin": {"kind": "file"}}) + "\n"
    )
    error = located(check(str(certificate), input_limits=InputLimits(name_length=200)), certificate, 2)
    assert "a name of 300 characters" in error


def test_more_statements_than_the_limit_are_refused_before_any_is_parsed(tmp_path):
    proof = tmp_path / "many_steps.p"
    proof.write_text("".join(f"cnf(s{i}, axiom, loaded(truck{i})).\n" for i in range(60)))
    error = located(check(str(proof), input_limits=InputLimits(statements=50)), proof, 51)
    assert "more than 50 statements" in error


def test_more_records_than_the_limit_are_refused_in_a_native_certificate(tmp_path):
    certificate = tmp_path / "many_steps.jsonl"
    records = [{"assay_certificate": 1}] + [
        {"name": f"s{i}", "role": "axiom", "language": "cnf", "formula": "p(a)", "origin": {"kind": "file"}}
        for i in range(60)
    ]
    certificate.write_text("\n".join(json.dumps(record) for record in records) + "\n")
    error = located(check(str(certificate), input_limits=InputLimits(statements=50)), certificate, 52)
    assert "more than 50 statements" in error


def test_json_nested_past_the_interpreter_limit_is_unreadable(tmp_path):
    # common practice: Python's json module recurses, and fails past its recursion limit
    certificate = tmp_path / "deep.jsonl"
    certificate.write_text(json.dumps({"assay_certificate": 1}) + "\n" + "[" * 100_000 + "]" * 100_000 + "\n")
    error = located(check(str(certificate)), certificate, 2)
    assert "nested too deeply" in error


@pytest.mark.parametrize(
    "parents, cycle",
    [
        ({"c1": ["c1"]}, "c1 -> c1"),
        ({"c1": ["c2"], "c2": ["c1"]}, "c1 -> c2 -> c1"),
    ],
)
def test_cyclic_and_self_referencing_parents_fail_as_a_cycle(tmp_path, parents, cycle):
    lines = [f"cnf({name}, plain, p(a), inference(merge, [status(thm)], [{', '.join(cited)}]))."
             for name, cited in parents.items()]
    lines += ["cnf(c9, axiom, ~p(a)).", "cnf(c10, plain, $false, inference(resolve, [status(thm)], [c1, c9]))."]
    proof = tmp_path / "loop.p"
    proof.write_text("\n".join(lines) + "\n")
    report = check(str(proof))
    assert report.first_failure.reason == "cycle"
    assert cycle in report.first_failure.message


def test_include_of_itself_is_an_include_cycle(tmp_path):
    problem = tmp_path / "self.p"
    problem.write_text("include('self.p').\ncnf(c1, axiom, p).\n")
    assert "include cycle" in located(check(str(problem)), problem, 1)


@pytest.mark.parametrize("written", ["../outside/rules.ax", "{absolute}"])
def test_include_outside_the_allowed_directories_is_refused(tmp_path, written):
    outside = tmp_path / "outside"
    outside.mkdir()
    rules = outside / "rules.ax"
    rules.write_text("cnf(r1, axiom, p).\n")
    inside = tmp_path / "derivation"
    inside.mkdir()
    proof = inside / "proof.p"
    proof.write_text(f"include('{written.format(absolute=rules)}').\ncnf(c1, axiom, ~p).\n"
                     "cnf(c2, plain, $false, inference(resolve, [status(thm)], [r1, c1])).\n")
    error = located(check(str(proof)), proof, 1)
    assert "outside the allowed directories" in error
    # the same include is read once its directory is an include directory
    assert check(str(proof), include_dirs=[str(outside)]).verdict == ACCEPTED


def test_fof_formula_with_free_variables_gets_a_notice_naming_them():
    # TPTP syntax BNF: a <fof_formula> of an annotated formula is closed
    # (every variable bound by a quantifier); an open one is read as its
    # universal closure here, and said so
    document = parse_tptp(
        "fof(rule, axiom, ! [X] : badge(X) => enters(X, Room)).\n"
        "fof(closed, axiom, ! [X, Room] : (badge(X) => enters(X, Room))).\n"
    )
    (notice,) = document.notices
    assert notice.location.line == 1
    assert "rule" in notice.message and "Room, X" in notice.message and "free variables" in notice.message


def test_exponential_unifier_is_found_and_checked_without_writing_it_out(tmp_path):
    # The unification problem f(X1..Xn) = f(g(X0,X0)..g(Xn-1,Xn-1)) has a
    # unifier whose terms are 2^n symbols long written out, but n long as a
    # shared graph (a classic example, e.g. Baader and Nipkow, "Term
    # Rewriting and All That", ch. 4, from memory)
    n = 40
    xs = ",".join(f"X{i}" for i in range(1, n + 1))
    gs = ",".join(f"g(X{i - 1},X{i - 1})" for i in range(1, n + 1))
    proof = tmp_path / "unify.p"
    proof.write_text(refutation(f"p(f({xs}))").replace("~p(X)", f"~p(f({gs}))"))
    assert check(str(proof)).verdict == ACCEPTED
    # a wrong claim next to it is not accepted, and its report stays small
    wrong = tmp_path / "unify_wrong.p"
    wrong.write_text(
        f"cnf(c1, axiom, p(f({xs})) | q(X{n})).\ncnf(c2, axiom, ~p(f({gs}))).\n"
        "cnf(c3, plain, q(X0), inference(resolve, [status(thm)], [c1, c2])).\n"
        "cnf(c4, axiom, ~q(X)).\ncnf(c5, plain, $false, inference(resolve, [status(thm)], [c3, c4])).\n"
    )
    report = check(str(wrong))
    assert report.verdict != ACCEPTED
    assert sum(len(line) for step in report.steps for line in (step.message, *step.details)) < 100_000


def test_default_limits_are_generous_for_prover_output():
    # common practice: provers' clauses have tens of literals, their terms
    # nest hundreds deep, their names are short; the defaults sit far above
    assert DEFAULT_INPUT_LIMITS.depth >= 100_000 and DEFAULT_INPUT_LIMITS.literals >= 1_000
    assert DEFAULT_INPUT_LIMITS.name_length >= 1_000 and DEFAULT_INPUT_LIMITS.statements >= 100_000
