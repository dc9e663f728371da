"""Stated bindings: the evidence must use the bindings the derivation
states for a parent, and a misstated binding fails even when another
unifier would work.  The scenario (warehouse access badges) is invented."""

from __future__ import annotations

from hypothesis import assume, given, settings
from hypothesis import strategies as st
from search_steps import Builder, resolution_step
from search_strategies import N, P

from checker.kernel.clauses import Clause
from checker.kernel.rules import Chain, Instantiation, Refutation, Resolution, check_clause_step
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable
from checker.search.reconstruct import reconstruct, stated_disagreement

X, Y, Z = variable("X"), variable("Y"), variable("Z")
ana, ben, vault = application("ana"), application("ben"), application("vault")

BADGE = Clause([N("badge", X, Y), P("enters", X, Y)])
FACT = Clause([P("badge", ana, vault)])
CLAIM = Clause([P("enters", ana, vault)])


def test_correct_stated_bindings_are_used():
    stated = [Substitution({X: ana, Y: vault}), None]
    found = reconstruct([BADGE, FACT], CLAIM, "resolution", stated=stated)
    assert isinstance(found.evidence, Resolution)
    assert found.evidence.left_substitution == Substitution({X: ana, Y: vault})
    assert check_clause_step([BADGE, FACT], CLAIM, found.evidence, found.theta) is None


def test_partially_stated_bindings_leave_the_rest_to_the_unifier():
    found = reconstruct([BADGE, FACT], CLAIM, "resolution", stated=[Substitution({X: ana}), None])
    assert isinstance(found.evidence, Resolution)
    assert found.evidence.left_substitution(X) is ana and found.evidence.left_substitution(Y) is vault


def test_a_wrong_stated_binding_fails_although_the_mgu_works():
    stated = [Substitution({X: ben}), None]
    assert reconstruct([BADGE, FACT], CLAIM, "resolution").evidence is not None
    found = reconstruct([BADGE, FACT], CLAIM, "resolution", stated=stated)
    assert found.evidence is None and found.wrong_bindings
    assert found.closest is not None
    assert "stated bindings of premise 0 are wrong" in found.closest.message
    assert "X -> ben" in found.closest.message and "X -> ana" in found.closest.message


def test_stated_bindings_of_a_more_specific_instance_are_honoured():
    # The parent is used at X -> ana although the mgu would leave X free.
    left = Clause([P("badge", X, Y), P("audited", X)])
    right = Clause([N("badge", Z, vault)])
    claimed = Clause([P("audited", ana)])
    found = reconstruct([left, right], claimed, "resolution", stated=[Substitution({X: ana}), None])
    assert isinstance(found.evidence, Resolution)
    assert check_clause_step([left, right], claimed, found.evidence, found.theta) is None
    assert found.evidence.left_substitution(X) is ana


def test_a_stated_binding_naming_a_fresh_variable_agrees_up_to_renaming():
    left = Clause([P("badge", X, Y), P("audited", X)])
    right = Clause([N("badge", ana, Z)])
    claimed = Clause([P("audited", ana)])
    found = reconstruct([left, right], claimed, "resolution", stated=[None, Substitution({Z: variable("W")})])
    assert isinstance(found.evidence, Resolution)


def test_stated_bindings_in_a_multi_inference_step():
    nucleus = Clause([N("badge", X, Y), N("cleared", X), P("enters", X, Y)])
    facts = [Clause([P("badge", ana, vault)]), Clause([P("cleared", ana)])]
    premises = [nucleus, *facts]
    right = reconstruct(premises, CLAIM, "hyper_resolution", stated=[Substitution({X: ana}), None, None])
    assert right.evidence is not None
    assert check_clause_step(premises, CLAIM, right.evidence, right.theta) is None
    # a multi-inference step first derives the stated instance of the parent
    assert isinstance(right.evidence, (Chain, Refutation))
    steps = right.evidence.steps if isinstance(right.evidence, Chain) else right.evidence.chain.steps
    assert steps[0] == Instantiation(0, Substitution({X: ana}))
    wrong = reconstruct(premises, CLAIM, "hyper_resolution", stated=[Substitution({X: ben}), None, None])
    assert wrong.evidence is None
    assert "stated bindings of premise 0 are wrong" in wrong.closest.message


@settings(max_examples=30, deadline=None)
@given(st.randoms(use_true_random=False))
def test_generated_resolutions_with_their_true_bindings_stated(rng):
    step = resolution_step(Builder(rng))
    found = reconstruct(step.premises, step.claimed, "resolution")
    assert found.evidence is not None
    # State, for each parent, the bindings the evidence found uses: the
    # search must again succeed, with exactly those bindings.
    evidence = found.evidence
    assume(isinstance(evidence, Resolution))
    stated = [None, None]
    stated[evidence.left] = evidence.left_substitution
    stated[evidence.right] = evidence.right_substitution if evidence.right != evidence.left else None
    again = reconstruct(step.premises, step.claimed, "resolution", stated=stated)
    assert again.evidence is not None
    assert check_clause_step(step.premises, step.claimed, again.evidence, again.theta) is None


def test_stated_disagreement_compares_every_use_of_a_stated_premise():
    premises = [Clause([P("badge", X, Y)]), Clause([N("badge", ana, vault)])]
    stated = [Substitution({X: ana}), None]
    right = Resolution(0, 0, 1, 0, Substitution({X: ana, Y: vault}))
    wrong = Resolution(0, 0, 1, 0, Substitution({X: ben, Y: vault}))
    assert stated_disagreement(premises, stated, right) is None
    message = stated_disagreement(premises, stated, wrong)
    assert message == "the stated bindings of premise 0 are wrong: it states X -> ana, the inference uses X -> ben"
    # inside chains and refutations too, but only where the premise itself is used
    assert stated_disagreement(premises, stated, Chain((right, wrong))) == message
    assert stated_disagreement(premises, stated, Refutation(Chain((wrong,)))) == message
    assert stated_disagreement(premises, stated, Chain((Instantiation(0, Substitution({X: ana})), Instantiation(2)))) is None
    assert stated_disagreement(premises, [None, None], wrong) is None


def test_stated_terms_with_variables_admit_instances_but_not_inconsistency():
    premises = [Clause([P("badge", X, Y)])]
    # X -> W: any instance of W will do
    assert stated_disagreement(premises, [Substitution({X: variable("W")})], Instantiation(0, Substitution({X: ana}))) is None
    # X -> Y ties X to the premise's own Y: using X -> ana while Y stays Y breaks the tie
    tied = [Substitution({X: Y})]
    assert stated_disagreement(premises, tied, Instantiation(0, Substitution({X: ana, Y: ana}))) is None
    message = stated_disagreement(premises, tied, Instantiation(0, Substitution({X: ana})))
    assert message.endswith("it states X -> Y, the inference uses X -> ana, Y -> Y")
