"""Accepted steps stay accepted after renaming the claimed clause's
variables (with theta renamed to match) and permuting its literals: the
conclusion test works on clauses as sets of literals, up to variants."""

from __future__ import annotations

from collections import Counter

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.clauses import Clause
from checker.kernel.failure import Failure
from checker.kernel.rules import check_clause_step, replay
from checker.kernel.substitution import Substitution
from checker.kernel.terms import variable
from strategies import VARIABLES, claimed_from, paramodulation_steps, resolution_steps

POOL = (*VARIABLES, variable("U"), variable("V"), variable("W"))


def assert_invariant(step_strategy) -> None:
    counts: Counter[str] = Counter()

    @settings(max_examples=200, deadline=None)
    @given(step=step_strategy, data=st.data())
    def run(step, data):
        premises, evidence = step
        computed = replay(premises, evidence)
        claimed, theta = claimed_from(data.draw, None if isinstance(computed, Failure) else computed)
        counts["steps"] += 1
        if check_clause_step(premises, claimed, evidence, theta) is not None:
            return
        counts["accepted"] += 1
        # an injective renaming of every variable in play
        image = data.draw(st.permutations(POOL))
        renaming = Substitution(dict(zip(VARIABLES, image)))
        renamed_theta = Substitution({v: renaming(theta(v)) for v in VARIABLES})
        written = [literal.instance(renaming) for literal in claimed.literals]
        permuted = Clause(data.draw(st.permutations(written)))
        assert check_clause_step(premises, permuted, evidence, renamed_theta) is None, (claimed, permuted, theta)

    run()
    assert counts["accepted"] >= 0.4 * counts["steps"], counts


def test_accepted_resolutions_survive_renaming_and_permutation():
    assert_invariant(resolution_steps())


def test_accepted_paramodulations_survive_renaming_and_permutation():
    assert_invariant(paramodulation_steps())
