"""Pelletier's problems end to end: hand-written TPTP refutations accepted,
every clausification step among them checked, and broken Skolemizations of
them rejected for the right reason.

The problems come from F. J. Pelletier, "Seventy-five problems for testing
automatic theorem provers", Journal of Automated Reasoning 2 (1986); each
fixture's statement is written from memory and is a theorem there.  The
refutations are our own: negated conjecture (status cth), negation pushed
inward (thm), Skolemization (esa), clause form (cnf from fof, thm), then
resolution and factoring to `$false`.
"""

import shutil
from pathlib import Path

import pytest

from checker.kernel.clauses import Clause
from checker.kernel.formulas import FALSUM, symbols_of_formula
from checker.outcomes import ACCEPTED, CHECKED, RECONSTRUCTED, REJECTED
from checker.run import check
from formats.derivation import Inference
from formats.tptp import read_tptp

PELLETIER = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "pelletier"

# Pelletier (1986), problems 18, 19, 21, 30, 32, 35, 39, 40 and 41, from memory:
# all theorems, so each hand-written refutation must be accepted.
PROBLEMS = (18, 19, 21, 30, 32, 35, 39, 40, 41)

def refutation_path(number: int) -> Path:
    return PELLETIER / f"p{number}_refutation.p"


def symbols(content) -> set[tuple[str, int]]:
    return content.symbols() if isinstance(content, Clause) else set(symbols_of_formula(content))


@pytest.fixture(scope="module")
def reports():
    return {number: check(str(refutation_path(number))) for number in PROBLEMS}


@pytest.mark.parametrize("number", PROBLEMS)
def test_refutation_is_accepted_against_its_problem(number, reports):
    report = reports[number]
    assert report.verdict == ACCEPTED, report.first_failure
    assert report.problem is not None and Path(report.problem).name == f"p{number}_problem.p"
    statements = read_tptp(str(refutation_path(number))).statements
    assert [step.name for step in report.steps] == [statement.name for statement in statements]
    assert all(step.outcome in (CHECKED, RECONSTRUCTED) for step in report.steps)
    assert report.cautions == ()


@pytest.mark.parametrize("number", PROBLEMS)
def test_each_clausification_step_is_checked_as_what_it_is(number, reports):
    results = {step.name: step for step in reports[number].steps}
    statements = {s.name: s for s in read_tptp(str(refutation_path(number))).statements}
    kinds = set()
    for name, statement in statements.items():
        result = results[name]
        source = statement.source
        if not isinstance(source, Inference):
            assert result.outcome == CHECKED and "of the problem" in result.message
            kinds.add("leaf")
            continue
        parents = [statements[p.name] for p in source.parents]
        if source.status == "cth":
            assert [p.role for p in parents] == ["conjecture"]
            assert result.message == "the negation of the conjecture"
            kinds.add("negated conjecture")
        elif source.status == "esa":
            new = symbols(statement.content) - set().union(*(symbols(p.content) for p in parents))
            assert new and all(symbol.startswith("sk") for symbol, _ in new)
            assert result.message.startswith("Skolemization introducing")
            assert all(f"{symbol}/{arity}" in result.message for symbol, arity in new)
            kinds.add("skolemization")
        elif all(isinstance(p.content, Clause) for p in parents):
            assert isinstance(statement.content, Clause)
            assert result.message.startswith("kernel replayed"), result.message
            kinds.add("clause inference")
        else:
            assert source.status == "thm"
            assert result.message.startswith("follows from its premises"), result.message
            kinds.add("clause form" if isinstance(statement.content, Clause) else "formula consequence")
    assert {"leaf", "negated conjecture", "skolemization", "clause form", "clause inference"} <= kinds
    last = list(statements.values())[-1].content
    assert (isinstance(last, Clause) and last.is_empty) or last is FALSUM


# Broken copies of the refutations above.  Every formula derived from the
# negated conjecture of a theorem is unsatisfiable, so only the structural
# rules of Skolemization (fresh symbols, all dependencies, a quantifier to
# witness) can catch these; a semantic check alone would pass them.
MUTANTS = [
    # Pelletier 40 (from memory): Y's witness forgets X.
    pytest.param(
        40, [("sk2(X)", "sk2"), ("sk2(sk1)", "sk2")], "n6", "missing_dependency", id="p40-witness-forgets-variable"
    ),
    # Pelletier 21 (from memory): both axioms' witnesses named sk1.
    pytest.param(21, [("sk2", "sk1")], "s2", "not_fresh", id="p21-symbol-introduced-twice"),
    # Pelletier 32 (from memory): a second constant that witnesses nothing.
    pytest.param(
        32, [("f(sk1) & k(sk1) & ~ j(sk1)", "f(sk1) & k(sk2) & ~ j(sk1)")], "n3", "no_quantifier",
        id="p32-symbol-witnesses-nothing",
    ),
]


# Witnesses with fewer arguments than the universals around them, sound
# because the existential does not mention those universals: pushed inward
# (miniscoping, a textbook equivalence), it lies under none of them.
FREED_BY_MINISCOPING = [
    # Pelletier 18: ! [Y] : ? [X] : (f(Y) & ~ f(X)) is
    # (! [Y] : f(Y)) & ? [X] : ~ f(X), so X's witness is a constant.
    pytest.param(18, [("sk1(Y)", "sk1")], "n3", id="p18-witness-of-a-miniscoped-existential"),
    # Pelletier 19: Z occurs only in (~ p(Y) | q(Z)), which does not mention X.
    pytest.param(19, [("sk2(X)", "sk2")], "n3", id="p19-witness-of-a-miniscoped-existential"),
]


@pytest.mark.parametrize(("number", "replacements", "step"), FREED_BY_MINISCOPING)
def test_a_witness_freed_by_miniscoping_is_accepted(number, replacements, step, tmp_path):
    shutil.copy(PELLETIER / f"p{number}_problem.p", tmp_path)
    text = refutation_path(number).read_text()
    for old, new in replacements:
        assert old in text
        text = text.replace(old, new)
    variant = tmp_path / refutation_path(number).name
    variant.write_text(text)
    report = check(str(variant))
    assert report.verdict == ACCEPTED
    assert "miniscoped first" in next(s for s in report.steps if s.name == step).message


@pytest.mark.parametrize(("number", "replacements", "broken", "reason"), MUTANTS)
def test_broken_skolemization_is_rejected_with_its_reason(number, replacements, broken, reason, tmp_path):
    shutil.copy(PELLETIER / f"p{number}_problem.p", tmp_path)
    text = refutation_path(number).read_text()
    for old, new in replacements:
        assert old in text
        text = text.replace(old, new)
    mutant = tmp_path / refutation_path(number).name
    mutant.write_text(text)
    report = check(str(mutant))
    assert report.verdict == REJECTED
    failure = report.first_failure
    assert failure.name == broken
    assert f"reason: {reason}" in failure.details
