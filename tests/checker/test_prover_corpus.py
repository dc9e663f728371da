"""End to end on derivations a saturation prover printed (fixtures/tptp/prover_corpus).

Each folder holds a problem of our own (problem.p: group, ring, lattice and
Boolean-algebra identities recalled from memory as classic textbook
exercises, and invented plant, access and logistics scenarios written as
first-order formulas with large conjunctions, disjunctions and nested
quantifiers) and the derivation a prover printed for it (proof.p, the text
between its proof-object markers, kept as printed).  Expected verdict: valid
by construction, since the prover found a proof of a statement we know to
be a theorem.  Mutants (mutant_*.p) are copies with one step made wrong by
hand; each header names the step and why it is wrong (a counter-model).

Every derivation is checked here; bench/bench_prover_corpus.py prints how
long each takes.
"""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from checker.outcomes import ACCEPTED, CHECKED, RECONSTRUCTED
from checker.report import report_json
from checker.run import check
from formats.derivation import Origin
from formats.tptp import read_tptp

CORPUS = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "prover_corpus"

# Every derivation of the corpus: about 40 CPU seconds in all on an idle
# machine (bench/bench_prover_corpus.py prints the figures per derivation).
DERIVATIONS = sorted(f.name for f in CORPUS.iterdir() if f.is_dir() and f.name != "large")  # large: a corpus of its own

MUTANTS = sorted(CORPUS.glob("*/mutant_*.p"))
_BROKEN = re.compile(r"^% broken-step: (\S+)\s*$", re.MULTILINE)


def _failure_text(report) -> str:
    failure = report.first_failure
    return report.error or ("no failure" if failure is None else f"{failure.name} {failure.outcome}: {failure.message}")


def test_the_corpus_holds_problems_with_derivations_and_mutants():
    assert len(DERIVATIONS) >= 50
    for name in DERIVATIONS:
        assert (CORPUS / name / "problem.p").is_file() and (CORPUS / name / "proof.p").is_file(), name
    assert len(MUTANTS) >= 3


@pytest.mark.parametrize("name", DERIVATIONS)
def test_a_printed_derivation_is_accepted_against_its_problem(name):
    # Expected verdict: valid by construction (a prover's proof of a theorem).
    folder = CORPUS / name
    report = check(str(folder / "proof.p"), problem=str(folder / "problem.p"))
    assert report.verdict == ACCEPTED, _failure_text(report)
    assert {step.outcome for step in report.steps} <= {CHECKED, RECONSTRUCTED}
    assert report.cautions == ()
    # The proof-object markers are the only text that is not TPTP.
    assert all("not TPTP" in notice.message for notice in report.notices)
    assert report_json(report)["verdict"] == "accepted"


@pytest.mark.parametrize("name", DERIVATIONS)
def test_every_leaf_is_a_statement_of_its_problem(name):
    folder = CORPUS / name
    proof = read_tptp(str(folder / "proof.p"))
    problem_names = {statement.name for statement in read_tptp(str(folder / "problem.p")).statements}
    leaves = [s for s in proof.statements if isinstance(s.source, Origin) and s.source.kind == "file"]
    assert leaves
    assert {leaf.name for leaf in leaves} <= problem_names


@pytest.mark.parametrize("mutant", MUTANTS, ids=lambda path: f"{path.parent.name}/{path.stem}")
def test_a_mutant_is_rejected_at_the_changed_step_by_a_counter_model(mutant):
    # Expected: the header's step is wrong, shown by the counter-model it names.
    broken = _BROKEN.search(mutant.read_text(encoding="utf-8")).group(1)
    report = check(str(mutant), problem=str(mutant.parent / "problem.p"))
    assert report.verdict != ACCEPTED
    assert report.first_failure is not None and report.first_failure.name == broken, _failure_text(report)
    first = report_json(report)["first_failure"]
    # A changed constant the parents lack is also no introduction: then the
    # introduction's failure is given, with the counter-model beside it.
    assert first["step"] == broken
    assert first["reason"] == "countermodel" or "has a counter-model" in report.first_failure.message
