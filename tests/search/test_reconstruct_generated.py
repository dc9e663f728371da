"""reconstruct on generated valid steps of every kind, and on invalid ones."""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st
from search_steps import BUILDERS, Builder

from checker.kernel.clauses import Clause, Literal
from checker.kernel.rules import check_clause_step
from checker.kernel.terms import application
from checker.search.reconstruct import reconstruct

SETTINGS = settings(max_examples=40, deadline=None)


def _assert_reconstructed(step):
    found = reconstruct(step.premises, step.claimed, step.kind)
    assert found.evidence is not None, (step, found.closest)
    # the entry point promises kernel-accepted evidence; check it again here
    assert check_clause_step(step.premises, step.claimed, found.evidence, found.theta) is None
    return found


def _kind_test(kind):
    @SETTINGS
    @given(st.randoms(use_true_random=False))
    def test(rng):
        _assert_reconstructed(BUILDERS[kind](Builder(rng)))

    test.__name__ = f"test_generated_{kind}_steps_are_reconstructed"
    return test


test_generated_instantiation_steps_are_reconstructed = _kind_test("instantiation")
test_generated_factoring_steps_are_reconstructed = _kind_test("factoring")
test_generated_resolution_steps_are_reconstructed = _kind_test("resolution")
test_generated_paramodulation_steps_are_reconstructed = _kind_test("paramodulation")
test_generated_equality_resolution_steps_are_reconstructed = _kind_test("equality_resolution")
test_generated_equality_factoring_steps_are_reconstructed = _kind_test("equality_factoring")
test_generated_rewriting_chains_are_reconstructed = _kind_test("rewriting_chain")
test_generated_unit_deletions_are_reconstructed = _kind_test("unit_deletion")
test_generated_hyper_resolutions_are_reconstructed = _kind_test("hyper_resolution")


@SETTINGS
@given(st.sampled_from(sorted(BUILDERS)), st.randoms(use_true_random=False))
def test_a_claim_with_an_underivable_literal_gets_no_evidence_and_a_closest_candidate(kind, rng):
    step = BUILDERS[kind](Builder(rng))
    # Replace one literal of the claim by a literal of a predicate no premise
    # mentions: no inference can produce it.
    underivable = Literal(True, application("never_derived", (application("a"),)))
    if not step.claimed.literals:
        return
    claimed = Clause([*step.claimed.literals[1:], underivable])
    found = reconstruct(step.premises, claimed, step.kind)
    if found.evidence is not None:
        # dropping a literal may leave a claim that still follows; then the
        # evidence must genuinely be accepted
        assert check_clause_step(step.premises, claimed, found.evidence, found.theta) is None
        return
    closest = found.closest
    assert closest is not None
    assert underivable in closest.extra
    assert closest.missing  # something the candidate produces is not claimed
    assert closest.claimed == claimed
