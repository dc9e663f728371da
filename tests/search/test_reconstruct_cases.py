"""reconstruct on hand-made steps: chains, deletions, closest candidates,
hints and bounds.  The scenario (a freight yard) is invented."""

from __future__ import annotations

from search_strategies import N, P, eq, fn, neq

from checker.kernel.clauses import Clause
from checker.kernel.rules import (
    Chain,
    EqualityResolution,
    Paramodulation,
    Refutation,
    Resolution,
    check_clause_step,
)
from checker.kernel.terms import application, variable
from checker.search.evidence import order_for
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits, reconstruct
from checker.search.saturation import refute

X, Y, S = variable("X"), variable("Y"), variable("S")
dock, yard, gate = application("dock"), application("yard"), application("gate")
crate1, crate2, truck1 = application("crate1"), application("crate2"), application("truck1")


def test_two_rewrites_by_unit_equations_make_a_chain():
    target = Clause([P("ships", fn("next", fn("next", dock)))])
    first = Clause([eq(fn("next", dock), yard)])
    second = Clause([eq(gate, fn("next", yard))])  # written right to left
    premises = [target, first, second]
    claimed = Clause([P("ships", gate)])
    found = reconstruct(premises, claimed, "demodulation")
    assert isinstance(found.evidence, Chain)
    assert [type(step) for step in found.evidence.steps] == [Paramodulation, Paramodulation]
    assert found.evidence.steps[1].left_to_right is False
    assert check_clause_step(premises, claimed, found.evidence, found.theta) is None


def test_rewriting_then_deleting_a_trivial_disequality():
    # route(next(dock)) != route(yard) becomes route(yard) != route(yard)
    # after one rewrite, and is then deleted.
    target = Clause([neq(fn("route", fn("next", dock)), fn("route", yard)), P("open", gate)])
    equation = Clause([eq(fn("next", dock), yard)])
    claimed = Clause([P("open", gate)])
    found = reconstruct([target, equation], claimed, "forward_demodulation")
    assert isinstance(found.evidence, Chain)
    assert [type(step) for step in found.evidence.steps] == [Paramodulation, EqualityResolution]
    assert check_clause_step([target, equation], claimed, found.evidence, found.theta) is None


def test_unit_deletion_by_two_units():
    clause = Clause([N("loaded", truck1), P("blocked", truck1), N("late", truck1, X)])
    first = Clause([P("loaded", S)])
    second = Clause([P("late", S, Y)])
    claimed = Clause([P("blocked", truck1)])
    premises = [clause, first, second]
    found = reconstruct(premises, claimed, "subsumption_resolution")
    assert isinstance(found.evidence, Chain)
    assert all(isinstance(step, Resolution) for step in found.evidence.steps)
    assert check_clause_step(premises, claimed, found.evidence, found.theta) is None


def test_non_unit_subsumption_resolution():
    side = Clause([P("blocked", X), N("loaded", X)])
    main = Clause([P("loaded", truck1), P("blocked", truck1), P("idle", truck1)])
    claimed = Clause([P("blocked", truck1), P("idle", truck1)])
    found = reconstruct([side, main], claimed, "subsumption_resolution")
    assert found.evidence is not None
    assert check_clause_step([side, main], claimed, found.evidence, found.theta) is None


def test_closest_candidate_names_the_differing_literals():
    premises = [Clause([P("shipped", X), P("held", X)]), Clause([N("shipped", crate1)])]
    claimed = Clause([P("held", crate2), P("audited", crate1)])
    found = reconstruct(premises, claimed, "resolution")
    assert found.evidence is None
    closest = found.closest
    # The nearest inference is premise 0 itself under X -> crate2: it
    # produces shipped(crate2), which the claim lacks, and never audited(crate1).
    assert closest.missing == (P("shipped", crate2),)
    assert closest.extra == (P("audited", crate1),)
    assert "shipped(crate2)" in closest.message and "audited(crate1)" in closest.message
    assert closest.computed == premises[0]
    assert closest.claimed == claimed


def test_no_premises_and_a_tautology_is_a_refutation():
    claimed = Clause([P("open", X), N("open", X)])
    found = reconstruct([], claimed)
    assert isinstance(found.evidence, Refutation)
    assert check_clause_step([], claimed, found.evidence) is None


def test_rule_names_reorder_the_tries():
    assert order_for("resolution")[:2] == ["resolution", "resolution_factoring"]
    assert order_for("superposition")[0] == "paramodulation"
    assert order_for("forward_demodulation")[0] == "paramodulation"
    assert order_for("equality_resolution")[0] == "equality_resolution"
    assert order_for("factoring")[0] == "instantiation"
    assert order_for("er")[0] == "equality_resolution"
    default = order_for("")
    assert default[0] == "instantiation" and sorted(default) == sorted(order_for("superposition"))


def test_the_rule_name_does_not_decide_what_is_found():
    premises = [Clause([P("shipped", X), P("held", X)]), Clause([N("shipped", crate1)])]
    claimed = Clause([P("held", crate1)])
    for name in ("superposition", "equality_factoring", "whatever"):
        found = reconstruct(premises, claimed, name)
        assert isinstance(found.evidence, Resolution)


def test_bounds_are_counts_that_can_stop_the_search():
    nucleus = Clause([N("at", X, Y), N("route", Y, S), P("reaches", X, S)])
    facts = [Clause([P("at", crate1, dock)]), Clause([P("route", dock, gate)])]
    claimed = Clause([P("reaches", crate1, gate)])
    premises = [nucleus, *facts]
    found = reconstruct(premises, claimed)
    assert found.evidence is not None
    starved = SearchLimits(candidates=1, rewrite_steps=1, chain_seeds=0, saturation_clauses=1, saturation_given=1)
    assert reconstruct(premises, claimed, limits=starved).evidence is None


def test_limits_scale():
    doubled = DEFAULT_LIMITS.scaled(2)
    assert doubled.candidates == 2 * DEFAULT_LIMITS.candidates
    assert DEFAULT_LIMITS.scaled(0).saturation_given == 1


def test_saturation_gives_up_on_a_satisfiable_set():
    clauses = [Clause([P("open", X), P("closed", X)]), Clause([N("open", dock)])]
    assert refute(clauses, 200, 50, 100) is None


def test_saturation_keeps_only_the_ancestors_of_the_empty_clause():
    clauses = [
        Clause([P("open", X), P("closed", X)]),
        Clause([N("open", dock)]),
        Clause([N("closed", dock)]),
        Clause([P("noise", X), P("more_noise", X)]),
    ]
    chain = refute(clauses, 200, 50, 100)
    assert chain is not None
    assert len(chain.steps) == 2  # two resolutions; nothing about the noise
    assert check_clause_step(clauses, Clause([]), Refutation(chain)) is None


def test_a_claim_with_a_small_counter_model_skips_the_costly_searches(monkeypatch):
    # Common practice: a counter-model of premises -> claim means no evidence
    # exists.  Here crate1 stands in the dock and the claim puts it in the yard.
    premises = [Clause([P("at", crate1, dock)]), Clause([N("at", X, yard), P("ships", X)])]
    claimed = Clause([P("at", crate1, yard)])
    import checker.search.reconstruct as module

    calls = []
    monkeypatch.setattr(module, "refute", lambda *args: calls.append(args))
    screened = reconstruct(premises, claimed)
    assert screened.evidence is None and screened.closest is not None
    assert calls == []  # the refutation search never ran
    unscreened = reconstruct(premises, claimed, limits=SearchLimits(screen_domain=0))
    assert unscreened.evidence is None and len(calls) == 1
    assert screened.closest.computed == unscreened.closest.computed


def test_the_screen_leaves_a_step_that_follows_to_the_searches():
    # Two rewrites (a chain): no counter-model exists, and the chain is found.
    target = Clause([P("ships", fn("next", fn("next", dock)))])
    premises = [target, Clause([eq(fn("next", dock), yard)]), Clause([eq(fn("next", yard), gate)])]
    found = reconstruct(premises, Clause([P("ships", gate)]))
    assert isinstance(found.evidence, Chain)
