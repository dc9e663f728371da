"""Rewriting chains met at a normal form (untrusted search, kernel-replayed)."""

from checker.kernel.rules import check_clause_step
from checker.search.normal_forms import find_normal_form_chain, oriented_equations
from formats.tptp import parse_clause

# An invented depot network: each hop's alias rewrites to the depot it names.
HOPS = [parse_clause(f"next(d{i}) = d{i + 1}") for i in range(10)]


def test_equations_are_oriented_from_the_larger_side():
    # Common practice (term rewriting): a rule's left side is the greater one
    # in a well-founded order, so rewriting ends.
    premises = [
        parse_clause("next(d0) = d1"),
        parse_clause("d2 = next(d1)"),
        parse_clause("f(X, Y) = g(Y)"),
        parse_clause("g(X) = h(X, X)"),
        parse_clause("zeta = alpha"),
        parse_clause("k(X) = k(Y)"),
        parse_clause("p(a) | q"),
    ]
    assert oriented_equations(premises) == [(0, True), (1, False), (2, True), (3, False), (4, True)]


def test_a_long_rewrite_chain_is_found_through_the_normal_form():
    # next^10(d0) rewritten ten times to d10, written on the claim's side as
    # the partly rewritten next(next(d8)): both sides meet at at(d10).
    start = parse_clause("at(crate3, " + "next(" * 10 + "d0" + ")" * 10 + ")")
    claimed = parse_clause("at(crate3, next(next(d8)))")
    premises = [start, *HOPS]
    found = find_normal_form_chain(premises, claimed, limit=50, subsumption_nodes=2000)
    assert found is not None
    chain, theta = found
    assert check_clause_step(premises, claimed, chain, theta) is None
    assert len(chain.steps) == 10 + 1 + 2  # ten rewrites, the instantiation, two undone


def test_no_chain_when_the_normal_forms_differ_or_there_are_no_rules():
    start = parse_clause("at(crate3, next(d0))")
    assert find_normal_form_chain([start, *HOPS], parse_clause("at(crate3, d5)"), 50, 2000) is None
    assert find_normal_form_chain([start], parse_clause("at(crate3, d1)"), 50, 2000) is None


def test_the_rewrite_bound_is_respected():
    start = parse_clause("at(crate3, " + "next(" * 10 + "d0" + ")" * 10 + ")")
    assert find_normal_form_chain([start, *HOPS], parse_clause("at(crate3, d10)"), 5, 2000) is None
    assert find_normal_form_chain([start, *HOPS], parse_clause("at(crate3, next(next(next(next(next(next(next(d3))))))))"), 3, 2000) is None


def test_a_weakening_literal_of_the_claim_is_left_as_it_is():
    start = parse_clause("at(crate3, next(d0))")
    claimed = parse_clause("at(crate3, d1) | late(next(d0))")
    found = find_normal_form_chain([start, *HOPS], claimed, 50, 2000)
    assert found is not None
    chain, theta = found
    assert check_clause_step([start, *HOPS], claimed, chain, theta) is None


def test_an_equation_written_the_other_way_round_is_not_undone_at_the_wrong_side():
    # The normal forms agree only up to the symmetry of equality; undoing a
    # rewrite at a position of the other orientation would be meaningless,
    # so this route gives up (single inferences still cover such steps).
    start = parse_clause("next(d0) = home | late")
    claimed = parse_clause("home = next(d0) | late")
    assert find_normal_form_chain([start, *HOPS], claimed, 50, 2000) is None
