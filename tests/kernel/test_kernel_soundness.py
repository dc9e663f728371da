"""Soundness of the kernel's rules, checked semantically.

Whenever the kernel accepts a step, the claimed clause must be true in every
sampled finite interpretation in which the premises are true.  The
interpretations and the evaluator are the tests' own (strategies.py), so a
wrong kernel rule cannot hide behind a matching wrong evaluator.  Each
property also counts how many steps were accepted, and in how many of those
some sampled interpretation made the premises true, so that it is known not
to pass vacuously.
"""

from __future__ import annotations

import random
from collections import Counter

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.clauses import Clause, Literal
from checker.kernel.failure import Failure
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.rules import Chain, Instantiation, Refutation, Resolution, check_clause_step, negated_claim, replay
from strategies import (
    Interpretation,
    X,
    a,
    b,
    clause_holds,
    eq,
    f,
    neg,
    p,
    pos,
    r,
    random_interpretation,
    claimed_from,
    clauses,
    consequence_holds,
    equality_factoring_steps,
    equality_resolution_steps,
    fitted_paramodulation,
    fitted_resolution,
    generalize_atom,
    instantiation_steps,
    interpretation_samples,
    literals,
    matcher,
    mostly,
    paramodulation_steps,
    resolution_steps,
    substitutions,
)

EXAMPLES = 250
MODELS = interpretation_samples(150)


def assert_sound_and_counted(step_strategy, minimum_accepted_share: float = 0.4) -> None:
    counts: Counter[str] = Counter()

    @settings(max_examples=EXAMPLES, deadline=None)
    @given(step=step_strategy, data=st.data(), models=MODELS)
    def run(step, data, models):
        premises, evidence = step
        computed = replay(premises, evidence)
        claimed, theta = claimed_from(data.draw, None if isinstance(computed, Failure) else computed)
        counts["steps"] += 1
        if check_clause_step(premises, claimed, evidence, theta) is not None:
            return
        counts["accepted"] += 1
        holds, relevant = consequence_holds(premises, claimed, models)
        assert holds, f"accepted `{claimed}` from {premises} with {evidence}, but a model of the premises falsifies it"
        counts["accepted_with_models"] += relevant > 0

    run()
    assert counts["accepted"] >= minimum_accepted_share * counts["steps"], counts
    assert counts["accepted_with_models"] >= 0.2 * counts["accepted"], counts


def test_instantiation_is_sound():
    assert_sound_and_counted(instantiation_steps())


def test_resolution_is_sound():
    assert_sound_and_counted(resolution_steps())


def test_paramodulation_is_sound():
    assert_sound_and_counted(paramodulation_steps())


def test_equality_resolution_is_sound():
    assert_sound_and_counted(equality_resolution_steps())


def test_equality_factoring_is_sound():
    assert_sound_and_counted(equality_factoring_steps())


@st.composite
def chain_steps(draw):
    """Two or three premises and a chain of two inferences: a resolution of
    the first two, then a further inference on its result."""
    first = draw(clauses(min_size=1))
    partner, opening = fitted_resolution(draw, first, 0, 1)
    kind = draw(st.sampled_from(("resolve", "paramodulate", "instantiate", "random")))
    # The third premise, when there is one, is a copy of the first until a
    # fitted one replaces it: a copy keeps the premises satisfiable.
    premises = [first, partner] if kind == "instantiate" else [first, partner, first]
    result = replay(premises, opening)
    result_index = len(premises)
    if kind == "random":
        premises[2] = draw(clauses())
        follow_up = Resolution(
            draw(st.integers(0, 3)), draw(st.integers(0, 2)), draw(st.integers(0, 3)), draw(st.integers(0, 2)),
            draw(substitutions), draw(substitutions),
        )
    elif kind == "instantiate" or isinstance(result, Failure) or result.is_empty:
        follow_up = Instantiation(result_index, draw(substitutions))
    elif kind == "resolve":
        premises[2], follow_up = fitted_resolution(draw, result, result_index, 2)
    else:
        premises[2], follow_up = fitted_paramodulation(draw, result, result_index, 2)
    return premises, Chain((opening, follow_up))


def test_chain_is_sound():
    assert_sound_and_counted(chain_steps())


@st.composite
def refutation_steps(draw):
    """A claimed clause, a premise that generalizes some of its literals
    (plus random premises), and a chain resolving that premise's instance
    away against the negated claim, literal by literal; sometimes the
    premise has a literal too many, sometimes the chain is spoilt."""
    claimed = draw(clauses(min_size=1, max_size=2))
    chosen = draw(st.lists(st.sampled_from(claimed.literals), min_size=1, max_size=3))
    bindings: dict = {}
    general = [Literal(lit.positive, generalize_atom(draw, lit.atom, bindings)) for lit in chosen]
    if not mostly(draw):
        # a literal the claim lacks: the chain cannot reach the empty clause
        general.append(draw(literals))
    general = Clause(general)
    premises = [general, *draw(st.lists(clauses(min_size=1), max_size=1))]
    units = negated_claim(premises, claimed)
    grounded = [unit.literals[0].negated() for unit in units]
    grounding: dict = {}
    for lit, ground in zip(claimed.literals, grounded):
        grounding.update(matcher(lit.atom, ground.atom))
    tau = Substitution({var: Substitution(grounding)(term) for var, term in bindings.items()})
    available = [*premises, *units]
    steps = []
    current_index, current, substitution = 0, general.instance(tau), tau
    while not current.is_empty and current.literals[0] in grounded:
        unit = grounded.index(current.literals[0])
        steps.append(Resolution(current_index, 0, len(premises) + unit, 0, substitution))
        current = replay(available, steps[-1])
        available.append(current)
        current_index, substitution = len(available) - 1, IDENTITY
    if not mostly(draw):
        spoilt = draw(st.integers(0, len(steps) - 1))
        steps[spoilt] = Resolution(
            steps[spoilt].left, draw(st.integers(0, 2)), draw(st.integers(0, len(available) - 1)), 0, draw(substitutions)
        )
    if not mostly(draw):
        claimed = draw(clauses())
    return premises, claimed, Refutation(Chain(tuple(steps)))


def test_refutation_is_sound():
    counts: Counter[str] = Counter()

    @settings(max_examples=EXAMPLES, deadline=None)
    @given(step=refutation_steps(), models=MODELS)
    def run(step, models):
        premises, claimed, evidence = step
        counts["steps"] += 1
        if check_clause_step(premises, claimed, evidence) is not None:
            return
        counts["accepted"] += 1
        holds, relevant = consequence_holds(premises, claimed, models)
        assert holds, f"refutation accepted `{claimed}` from {premises}, but a model of the premises falsifies it"
        counts["accepted_with_models"] += relevant > 0

    run()
    assert counts["accepted"] >= 0.4 * counts["steps"], counts
    assert counts["accepted_with_models"] >= 0.2 * counts["accepted"], counts


def test_random_refutations_are_sound():
    """Random premises, claim and chain: acceptance is rare, and always sound."""

    @settings(max_examples=EXAMPLES, deadline=None)
    @given(
        premises=st.lists(clauses(min_size=1, max_size=2), min_size=1, max_size=2),
        claimed=clauses(max_size=2),
        raw_steps=st.lists(
            st.tuples(st.integers(0, 4), st.integers(0, 1), st.integers(0, 4), st.integers(0, 1), substitutions, substitutions),
            min_size=1,
            max_size=3,
        ),
        models=MODELS,
    )
    def run(premises, claimed, raw_steps, models):
        evidence = Refutation(Chain(tuple(Resolution(*raw) for raw in raw_steps)))
        if check_clause_step(premises, claimed, evidence) is None:
            holds, _ = consequence_holds(premises, claimed, models)
            assert holds

    run()


def test_the_evaluator_finds_a_countermodel():
    """The properties above could fail: a model of p(a) where p(b) is false
    (domain {0, 1}, a -> 0, b -> 1, p = {0}) is found and recognised."""
    model = Interpretation(2, {"a": 0, "b": 1}, (0, 0), {}, frozenset({0}), frozenset(), False)
    holds, relevant = consequence_holds([Clause([pos(p(a))])], Clause([pos(p(b))]), [model])
    assert (holds, relevant) == (False, 1)


def test_the_evaluator_reads_quantifiers_and_equality():
    """Hand-computed: over {0, 1} with f swapping the elements, X != f(X)
    holds for every X, X = f(f(X)) too, and X = a does not."""
    model = Interpretation(2, {"a": 0, "b": 1}, (1, 0), {}, frozenset(), frozenset(), True)
    assert clause_holds(Clause([neg(eq(X, f(X)))]), model)
    assert clause_holds(Clause([pos(eq(X, f(f(X))))]), model)
    assert not clause_holds(Clause([pos(eq(X, a))]), model)
    assert clause_holds(Clause([pos(eq(X, a)), pos(eq(X, b))]), model)
    assert clause_holds(Clause([pos(r)]), model) and not clause_holds(Clause(), model)


def test_sampled_interpretations_vary():
    models = [random_interpretation(random.Random(seed)) for seed in range(30)]
    assert {m.size for m in models} == {1, 2, 3}
    assert len({(m.p_true, m.r_true, m.constants["a"]) for m in models}) > 5


def test_literals_strategy_reaches_every_predicate():
    seen = set()

    @settings(max_examples=60, deadline=None)
    @given(literal=literals)
    def run(literal):
        seen.add(literal.atom.symbol)

    run()
    assert seen == {"p", "q", "r", "="}
