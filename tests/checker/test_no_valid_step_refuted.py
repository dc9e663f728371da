"""No valid step of any fixture is reported `refuted`.

A false `refuted` tells a prover's developer that a sound prover is broken
(DESIGN.md, section 4), so every derivation under fixtures/ is checked and
every step but a mutant's announced broken one must not be refuted.  Which
steps are valid was settled when each fixture was written (see
tests/checker/test_tptp_derivations.py and the fixtures' own comments):
valid derivations are valid throughout, and a mutant is broken at exactly
the step its ``% broken-step:`` (or ``% expected: rejected at``) header names
and the steps an ``% also refuted:`` line names (those that follow from the
original claim of the changed step, not from the changed one), or, for the one JSON Lines
mutant, at the step its comment names.
"""

from __future__ import annotations

import json
import re
from pathlib import Path

import pytest

from checker.outcomes import REFUTED
from checker.run import check

FIXTURES = Path(__file__).resolve().parents[2] / "fixtures"

_BROKEN = re.compile(r"^% (?:broken-step:|expected: rejected at|also refuted:) ([^\s,;]+)", re.MULTILINE)


def _derivations() -> list[Path]:
    """Every certificate under fixtures/: TPTP derivations (not problems or
    axiom files) and JSON Lines certificates."""
    found = []
    for path in sorted(FIXTURES.rglob("*")):
        if "prover_corpus" in path.parts:
            continue  # minutes each: tests/checker/test_prover_corpus.py and bench/bench_prover_corpus.py
        if "styles" in path.parts:
            continue  # each checked against its problem, no step refuted: tests/checker/test_prover_styles.py

        problem = path.name == "problem.p" or path.name.endswith("_problem.p")
        if path.suffix == ".jsonl" or (path.suffix == ".p" and not problem):
            found.append(path)
    return found


def _broken_steps(path: Path) -> set[str]:
    text = path.read_text(encoding="utf-8")
    if path.suffix == ".jsonl":
        header = json.loads(text.splitlines()[0])
        return set(re.findall(r"step (\w+)", header.get("comment", "")))
    return set(_BROKEN.findall(text))


def _problem(path: Path) -> str | None:
    beside = path.with_name("problem.p")
    return str(beside) if path.parent.parent.name == "derivations" and beside.is_file() else None


DERIVATIONS = _derivations()


def test_the_fixtures_hold_many_derivations():
    assert len(DERIVATIONS) >= 100


@pytest.mark.parametrize("path", DERIVATIONS, ids=lambda p: str(p.relative_to(FIXTURES)))
def test_no_valid_step_of_a_fixture_is_refuted(path):
    report = check(str(path), problem=_problem(path))
    refuted = [f"{s.name}: {s.message}" for s in report.steps if s.outcome == REFUTED and s.name not in _broken_steps(path)]
    assert refuted == []
