"""End to end: every valid TPTP derivation fixture is accepted against its problem.

The fixtures are derivations of invented scenarios, written in the TPTP
language as a prover prints them (fixtures/tptp/derivations/*/proof.p).
Each was checked by hand, inference by inference, against the rules as
published: binary resolution and factoring (J. A. Robinson, "A
Machine-Oriented Logic Based on the Resolution Principle", JACM 12(1),
1965), paramodulation (G. Robinson and L. Wos, "Paramodulation and
Theorem-Proving in First-Order Theories with Equality", Machine
Intelligence 4, 1969), Skolemization and definitional (Tseitin-style)
naming as in M. Fitting, "First-Order Logic and Automated Theorem
Proving", 2nd ed., 1996 (from memory).  The annotation syntax
(inference records, nested records, ``bind(X, $fot(t))`` parent details,
``introduced(definition, ...)``, ``include`` with a name selection, the
statuses thm, cth and esa) is that of the TPTP language BNF and the SZS
ontology (G. Sutcliffe, tptp.org).
"""

from __future__ import annotations

import pytest
from tptp_derivation_files import DERIVATIONS, label, mutants, scenarios

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.formulas import FALSUM
from checker.outcomes import ACCEPTED, CHECKED, RECONSTRUCTED
from checker.report import report_json
from checker.run import check
from formats.derivation import Inference, Origin, Parent
from formats.tptp import read_tptp

SCENARIOS = scenarios()


def _failure_text(report) -> str:
    failure = report.first_failure
    if report.error:
        return report.error
    return "no failure" if failure is None else f"{failure.name} {failure.outcome}: {failure.message}"


@pytest.mark.parametrize("scenario", SCENARIOS, ids=label)
def test_valid_derivation_is_accepted_against_its_problem(scenario):
    # Expected verdict: the derivation was checked by hand (see the module docstring).
    report = check(str(scenario / "proof.p"), problem=str(scenario / "problem.p"))
    assert report.verdict == ACCEPTED, _failure_text(report)
    assert report.first_failure is None
    assert {step.outcome for step in report.steps} <= {CHECKED, RECONSTRUCTED}
    assert report.cautions == ()  # the leaves were checked against the problem, not assumed
    summary = report_json(report)
    assert summary["verdict"] == "accepted" and summary["first_failure"] is None and summary["assumed"] == []


@pytest.mark.parametrize("scenario", SCENARIOS, ids=label)
def test_every_leaf_is_matched_to_a_statement_of_the_problem(scenario):
    document = read_tptp(str(scenario / "proof.p"))
    leaves = {
        statement.name
        for statement in document.statements
        if isinstance(statement.source, Origin) and statement.source.kind == "file"
    }
    report = check(str(scenario / "proof.p"), problem=str(scenario / "problem.p"))
    by_name = {step.name: step for step in report.steps}
    assert leaves, "a derivation has leaves"
    for name in leaves:
        assert name in by_name, _failure_text(report)
        assert by_name[name].outcome == CHECKED, by_name[name].message
        assert "of the problem" in by_name[name].message


def test_there_are_thirty_scenarios_each_with_a_problem_and_a_mutant():
    assert len(SCENARIOS) >= 30
    with_mutants = {mutant.path.parent for mutant in mutants()}
    for scenario in SCENARIOS:
        assert (scenario / "problem.p").is_file(), scenario.name
        assert scenario in with_mutants, f"{scenario.name} has no mutant"


def _nested(source) -> bool:
    return isinstance(source, Inference) and any(isinstance(parent, Inference) for parent in source.parents)


def _stated_bindings(source) -> bool:
    return isinstance(source, Inference) and any(
        isinstance(parent, Parent) and parent.bindings is not None for parent in source.parents
    )


def _multi_literal_equality(content) -> bool:
    return isinstance(content, Clause) and len(content) > 1 and any(is_equality(lit.atom) for lit in content.literals)


def test_the_fixtures_cover_what_real_derivations_contain():
    """Nested records, definitions, Skolem steps, $false, rewriting,
    equality in multi-literal clauses, stated bindings, a raw log, and
    problems with includes: each appears in some fixture."""
    seen: dict[str, list[str]] = {}

    def saw(feature: str, scenario) -> None:
        seen.setdefault(feature, []).append(scenario.name)

    for scenario in SCENARIOS:
        proof = read_tptp(str(scenario / "proof.p"))
        problem = read_tptp(str(scenario / "problem.p"))
        statements = proof.statements
        if any(_nested(s.source) for s in statements):
            saw("nested records", scenario)
        if any(isinstance(s.source, Origin) and s.source.detail[:1] == ("definition",) for s in statements):
            saw("introduced definition", scenario)
        if any(isinstance(s.source, Inference) and s.source.status == "esa" for s in statements):
            saw("skolemization", scenario)
        if any(s.content is FALSUM or (isinstance(s.content, Clause) and s.content.is_empty) for s in statements):
            saw("$false", scenario)
        if any(isinstance(s.source, Inference) and s.source.rule == "rewrite" for s in statements):
            saw("rewriting", scenario)
        if any(_multi_literal_equality(s.content) for s in statements):
            saw("multi-literal equality", scenario)
        if any(_stated_bindings(s.source) for s in statements):
            saw("stated bindings", scenario)
        if proof.notices:
            saw("raw log", scenario)
        if any(s.location.file != str(scenario / "problem.p") for s in problem.statements):
            saw("include", scenario)
    assert len(seen.get("$false", ())) == len(SCENARIOS)
    for feature in (
        "nested records", "introduced definition", "skolemization", "rewriting",
        "multi-literal equality", "stated bindings", "raw log", "include",
    ):
        assert len(seen.get(feature, ())) >= 2, f"{feature}: only in {seen.get(feature)}"


def test_fixture_folder_holds_only_scenarios():
    assert sorted(path for path in DERIVATIONS.iterdir() if path.is_dir()) == SCENARIOS
