"""The demo certificate (reactor feed skid interlock) and its broken copy,
replayed step by step with the kernel and judged against its problem file."""

from __future__ import annotations

from pathlib import Path

import pytest

from checker.kernel.clauses import Clause
from checker.kernel.rules import Chain, Instantiation, Paramodulation, Resolution
from formats.derivation import Origin
from formats.native import read_native, read_native_header
from formats.tptp import read_tptp

from native_replay import check_step, clause_steps, first_refused, premises_of, small_counter_model

DEMO_DIR = Path(__file__).resolve().parents[2] / "fixtures" / "demo"
DEMO = DEMO_DIR / "interlock.jsonl"
BROKEN = DEMO_DIR / "interlock_broken.jsonl"
PROBLEM = DEMO_DIR / "interlock_problem.p"

DEMO_DOCUMENT = read_native(str(DEMO))
DEMO_STEPS = list(clause_steps(DEMO_DOCUMENT))


@pytest.mark.parametrize("step", DEMO_STEPS, ids=lambda s: s.name)
def test_every_demo_step_replays_in_the_kernel(step):
    assert check_step(DEMO_DOCUMENT, step) is None


@pytest.mark.parametrize("step", DEMO_STEPS, ids=lambda s: s.name)
def test_every_demo_step_has_no_small_counter_model(step):
    """Independently of the kernel: no interpretation over one or two
    elements makes a step's parents true and its conclusion false."""
    assert small_counter_model(premises_of(DEMO_DOCUMENT, step), step.content) is None


def test_demo_is_a_refutation_of_the_right_size_and_kinds():
    assert first_refused(DEMO_DOCUMENT) is None
    assert 10 <= len(DEMO_STEPS) <= 30
    last = DEMO_DOCUMENT.statements[-1]
    assert isinstance(last.content, Clause) and last.content.is_empty
    evidence_types = set()
    for step in DEMO_STEPS:
        evidence = step.source.evidence
        inner = evidence.steps if isinstance(evidence, Chain) else (evidence,)
        evidence_types |= {type(e) for e in inner}
    assert {Resolution, Instantiation, Paramodulation} <= evidence_types


def test_the_factoring_step_merges_literals():
    step = next(s for s in DEMO_STEPS if isinstance(s.source.evidence, Instantiation))
    (premise,) = premises_of(DEMO_DOCUMENT, step)
    instance = premise.instance(step.source.evidence.substitution)
    # Two written literals became one: the clause as a set shrank.
    assert len(set(instance.literals)) < len(instance.literals)
    assert instance == step.content


def test_demo_leaves_are_the_problem_statements():
    problem = {s.name: s for s in read_tptp(str(PROBLEM)).statements}
    leaves = [s for s in DEMO_DOCUMENT.statements if isinstance(s.source, Origin)]
    assert sorted(s.name for s in leaves) == sorted(problem)
    for leaf in leaves:
        assert leaf.source == Origin("file", ("interlock_problem.p", leaf.name))
        stated = problem[leaf.name]
        assert (stated.role, stated.language) == (leaf.role, leaf.language)
        # Same literals in the same written order.
        assert stated.content.literals == leaf.content.literals


def test_demo_header_names_its_problem():
    header = read_native_header(str(DEMO))
    assert header.problem is not None and (DEMO_DIR / header.problem).resolve() == PROBLEM.resolve()


def test_broken_copy_differs_in_one_step_and_is_refused_there():
    broken = read_native(str(BROKEN))
    different = [
        (a.name, b.name)
        for a, b in zip(DEMO_DOCUMENT.statements, broken.statements, strict=True)
        if (a.name, a.content, a.source) != (b.name, b.content, b.source)
    ]
    assert different == [("p1_flow_path", "p1_flow_path")]
    refused = first_refused(broken)
    assert refused is not None
    name, failure = refused
    assert name == "p1_flow_path"
    # The failure names the clash the wrong binding causes.
    assert "p2" in failure.message and "p1" in failure.message
    others = [s for s in clause_steps(broken) if s.name != "p1_flow_path"]
    assert all(check_step(broken, s) is None for s in others)



def test_assay_accepts_the_demo_and_rejects_the_broken_copy_at_its_step():
    import checker

    report = checker.check(str(DEMO), str(PROBLEM))
    assert report.verdict == "accepted"
    assert {result.outcome for result in report.steps} == {"checked"}
    broken = checker.check(str(BROKEN), str(PROBLEM))
    assert broken.verdict == "rejected"
    failed = [result for result in broken.steps if result.outcome not in ("checked", "unfounded")]
    assert [(result.name, result.outcome) for result in failed] == [("p1_flow_path", "failed")]
    # The steps below it hold on their own but rest on it (read off the certificate).
    below = [result.name for result in broken.steps if result.outcome == "unfounded"]
    assert below == ["p1_inlet_open", "v3_open", "skid1_contradiction"]
    assert failed[0].location.line == 14
