"""Property tests of unification, matching and subsumption."""

from __future__ import annotations

import itertools

from hypothesis import given, settings
from hypothesis import strategies as st
from search_strategies import (
    VARIABLES,
    clauses,
    eq,
    fn,
    is_instance_of,
    literals,
    substitutions,
    terms,
)

from checker.kernel.clauses import Clause, Literal
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable, variables_of
from checker.search.subsumption import find_theta
from checker.search.unify import match, unify, unify_atoms

SETTINGS = settings(max_examples=200, deadline=None)
FRESH = [variable("U"), variable("V")]
GROUND_POOL = [application("a"), application("b"), fn("f", application("a")), fn("g", application("a"), application("b"))]


def _fresh_images():
    """Substitutions of the test variables into terms over U and V only."""
    leaf = st.one_of(st.sampled_from(FRESH), st.sampled_from([application("a"), application("b")]))
    image = st.recursive(leaf, lambda c: st.one_of(c.map(lambda t: fn("f", t)), st.tuples(c, c).map(lambda p: fn("g", *p))), max_leaves=4)
    return st.fixed_dictionaries({variable(name): image for name in VARIABLES}).map(Substitution)


@SETTINGS
@given(terms(), terms())
def test_a_unifier_makes_both_sides_identical_and_is_idempotent(left, right):
    unifier = unify(left, right)
    if unifier is not None:
        assert unifier(left) is unifier(right)
        for var, value in unifier.mapping.items():
            assert unifier(value) is value  # idempotent: no bound variable in any image
            assert var not in variables_of(value)


@SETTINGS
@given(terms(max_leaves=5), terms(max_leaves=5))
def test_brute_force_ground_unifiers_are_instances_of_the_mgu(left, right):
    # Every ground unifier over a small pool of ground terms must exist only
    # when the mgu does, and must be an instance of it (mgu is most general).
    variables = sorted(variables_of(left) | variables_of(right), key=lambda v: v.symbol)
    unifier = unify(left, right)
    for values in itertools.product(GROUND_POOL, repeat=len(variables)):
        candidate = Substitution(dict(zip(variables, values)))
        if candidate(left) is candidate(right):
            assert unifier is not None
            assert is_instance_of(candidate, unifier, variables)
    if unifier is not None:
        grounding = Substitution({var: application("a") for var in variables})
        assert grounding(unifier(left)) is grounding(unifier(right))


@SETTINGS
@given(terms(), _fresh_images())
def test_a_term_unifies_with_any_instance_over_other_variables(term, instantiation):
    instance = instantiation(term)
    unifier = unify(term, instance)
    assert unifier is not None
    variables = sorted(variables_of(term) | variables_of(instance), key=lambda v: v.symbol)
    # instantiation itself is a unifier (its images avoid its own domain), so
    # it must be an instance of the most general one.
    assert instantiation(term) is instantiation(instance)
    assert is_instance_of(instantiation, unifier, variables)


@SETTINGS
@given(terms(), terms(), terms())
def test_unifying_with_bindings_extends_them(first, second, third):
    start = unify(first, second)
    if start is None:
        return
    extended = unify(second, third, start)
    if extended is not None:
        assert extended(first) is extended(second) is extended(third)
    joint = unify(fn("g", first, second), fn("g", second, third))
    assert (joint is None) == (extended is None)


@SETTINGS
@given(terms(), _fresh_images())
def test_match_finds_the_instantiation_and_binds_only_pattern_variables(pattern, instantiation):
    target = instantiation(pattern)
    found = match(pattern, target)
    assert found is not None
    assert found(pattern) is target
    assert set(found.mapping) <= variables_of(pattern)


@SETTINGS
@given(terms(), terms())
def test_match_result_is_correct_when_found(pattern, target):
    found = match(pattern, target)
    if found is not None:
        assert found(pattern) is target
    if target.ground:
        # against a ground target, matching and unification coincide
        assert (found is None) == (unify(pattern, target) is None)


def test_match_treats_target_variables_as_constants():
    # common practice: one-way matching never binds the target's variables
    x, y = variable("X"), variable("Y")
    assert match(fn("f", application("a")), fn("f", x)) is None
    assert match(fn("g", x, x), fn("g", y, application("a"))) is None
    assert match(fn("g", x, y), fn("g", y, x)) == Substitution({x: y, y: x})
    assert match(x, fn("f", x)) == Substitution({x: fn("f", x)})


def test_equality_atoms_unify_in_both_orientations():
    # common practice: s = t and t = s are the same atom
    x, y, a, b = variable("X"), variable("Y"), application("a"), application("b")
    assert unify_atoms(eq(x, a).atom, eq(b, y).atom) == [Substitution({x: b, y: a})]
    both = unify_atoms(eq(x, y).atom, eq(a, b).atom)
    assert both == [Substitution({x: a, y: b}), Substitution({x: b, y: a})]
    assert unify_atoms(eq(x, a).atom, eq(a, b).atom) == [Substitution({x: b})]
    assert unify_atoms(fn("q", x, a), fn("q", a, x)) == [Substitution({x: a})]
    assert unify_atoms(fn("q", x, b), fn("q", a, x)) == []


@SETTINGS
@given(clauses(), substitutions(), st.lists(literals(), max_size=2), st.randoms(use_true_random=False))
def test_subsumption_finds_theta_for_an_instance_with_extra_literals(clause, instantiation, extra, rng):
    literals_of_claim = list(clause.instance(instantiation).literals) + list(extra)
    rng.shuffle(literals_of_claim)
    # write equalities of the claim either way round
    claimed = Clause(
        Literal(l.positive, application("=", l.atom.arguments[::-1])) if l.atom.symbol == "=" and rng.random() < 0.5 else l
        for l in literals_of_claim
    )
    theta = find_theta(clause, claimed)
    assert theta is not None
    assert clause.instance(theta).literal_set <= claimed.literal_set


@SETTINGS
@given(clauses(), clauses())
def test_a_found_theta_really_shows_subsumption(computed, claimed):
    theta = find_theta(computed, claimed)
    if theta is not None:
        assert computed.instance(theta).literal_set <= claimed.literal_set
    if len(computed.literal_set) == 1:
        # a unit subsumes iff it matches some claimed literal, either way
        # round for equalities: cross-check with plain matching
        (unit,) = computed.literal_set
        matchable = any(
            unit.positive == other.positive
            and (
                match(unit.atom, other.atom) is not None
                or (other.atom.symbol == "=" and match(unit.atom, application("=", other.atom.arguments[::-1])) is not None)
            )
            for other in claimed.literal_set
        )
        assert (theta is not None) == matchable


def test_subsumption_respects_its_bound():
    # A clause of n literals p(Xi, Xi+1) against a claim where matching must
    # backtrack: with a bound of one attempt the search gives up.
    xs = [variable(f"X{i}") for i in range(6)]
    computed = Clause(Literal(True, fn("q", xs[i], xs[i + 1])) for i in range(5))
    a, b = application("a"), application("b")
    claimed = Clause([Literal(True, fn("q", a, b)), Literal(True, fn("q", b, a))])
    assert find_theta(computed, claimed) is not None
    assert find_theta(computed, claimed, limit=1) is None
    # and it says no when there is no theta at all
    assert find_theta(computed, Clause([Literal(True, fn("q", a, b))])) is None
