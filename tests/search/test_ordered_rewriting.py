"""The rewrites a prover makes by its term order, and the order inferred
from a derivation (untrusted; every rewrite is replayed by the kernel)."""

from pathlib import Path

from checker.kernel.clauses import Clause
from checker.kernel.rules import Paramodulation, check_clause_step, replay
from checker.kernel.substitution import Substitution
from checker.kernel.terms import variable
from checker.prover_order import derivation_order, rewriting_examples
from checker.search.ordered_rewriting import (
    RewritingExample,
    everywhere,
    inferred_order,
    innermost_positions,
    ordered_rewrite,
    superposes,
    too_large,
)
from checker.search.term_order import KnuthBendixOrder, LexicographicPathOrder
from formats.tptp import parse_clause, read_tptp

CORPUS = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "prover_corpus"

# Commutativity of an invented valve-mixing operation; with b > a in the
# precedence only the instance whose greater side is found is rewritten
# (ordered rewriting, Baader & Nipkow section 5.4, from memory).
COMMUTATIVITY = parse_clause("mix(X,Y) = mix(Y,X)")
ORDER = KnuthBendixOrder({("a", 0): 0, ("b", 0): 1, ("mix", 2): 2, ("p", 1): 3})


def test_commutativity_rewrites_only_the_greater_instance():
    premises = [parse_clause("p(mix(b,a))"), COMMUTATIVITY]
    step = ordered_rewrite(premises, 0, [1], ORDER)
    assert step is not None
    assert replay(premises, step) == parse_clause("p(mix(a,b))")
    assert check_clause_step(premises, parse_clause("p(mix(a,b))"), step) is None
    assert ordered_rewrite([parse_clause("p(mix(a,b))"), COMMUTATIVITY], 0, [1], ORDER) is None


def test_the_innermost_subterm_leftmost_and_the_greater_side_come_first():
    # Left identity (group axiom, from memory) applies at two places; the
    # innermost is rewritten first, in the greater side of the equation.
    identity = parse_clause("mult(e,X) = X")
    order = KnuthBendixOrder({("e", 0): 0, ("c", 0): 1, ("mult", 2): 2})
    premises = [parse_clause("c = mult(e,mult(e,c))"), identity]
    step = ordered_rewrite(premises, 0, [1], order)
    assert replay(premises, step) == parse_clause("c = mult(e,c)")
    assert step.position == (2, 2)
    assert [position for position, _ in innermost_positions(premises[0].literals[0].atom)] == [
        (1,), (2, 1), (2, 2, 1), (2, 2, 2), (2, 2), (2,)]


def test_a_superposition_replaces_every_occurrence_of_its_term():
    # An invented relay scenario: f(a) = b replaces both occurrences.
    equation, target = parse_clause("f(a) = b"), parse_clause("q(f(a), f(a))")
    premises = [equation, target]
    first = Paramodulation(0, 0, True, 1, 0, (1,))
    chain = everywhere(premises, first, replay(premises, first))
    assert chain is not None and len(chain.steps) == 2
    assert replay(premises, chain) == parse_clause("q(b, b)")
    assert check_clause_step(premises, parse_clause("q(b, b)"), chain) is None
    once = [equation, parse_clause("q(f(a), c)")]
    assert everywhere(once, first, replay(once, first)) is None


def test_superposition_goes_from_the_greater_side_into_the_greater_side():
    order = KnuthBendixOrder({("a", 0): 0, ("b", 0): 1, ("f", 1): 2})
    premises = [parse_clause("f(X) = a"), parse_clause("f(b) = b")]
    down = Paramodulation(0, 0, True, 1, 0, (1,), Substitution({variable("X"): parse_clause("p(b)").literals[0].atom.arguments[0]}))
    assert superposes(premises, down, order)
    into_smaller = Paramodulation(1, 0, False, 1, 0, (2,))
    assert not superposes(premises, into_smaller, order)


def test_a_clause_grown_too_large_is_not_rewritten():
    big = parse_clause("p(" + "f(" * 1200 + "a" + ")" * 1200 + ")")
    assert too_large(big) and not too_large(parse_clause("p(f(a))"))
    assert ordered_rewrite([big, parse_clause("f(a) = a")], 0, [1], ORDER) is None


def test_the_order_that_reproduces_the_stated_rewrites_is_chosen():
    # Distributing meet over join (a prover's rewrite in the Boolean-algebra
    # corpus) is possible only by a path order with join above meet.
    distributive = parse_clause("join(X,meet(Y,Z)) = meet(join(X,Y),join(X,Z))")
    example = RewritingExample(parse_clause("p(join(a,meet(b,c)))"), (distributive,),
                               parse_clause("p(meet(join(a,b),join(a,c)))"))
    atoms = [literal.atom for literal in distributive.literals] + [parse_clause("p(join(a,a))").literals[0].atom]
    chosen = inferred_order(atoms, [example], [])
    assert isinstance(chosen, LexicographicPathOrder)
    assert chosen.greater(*distributive.literals[0].atom.arguments)


def test_the_prover_corpus_orders_are_inferred_from_the_derivations():
    # The join-associativity derivation distributes (a path order); the
    # group one is explained by a Knuth-Bendix order.
    def inferred(name):
        folder = CORPUS / name
        statements = {s.name: s for s in read_tptp(str(folder / "proof.p")).statements}
        return statements, derivation_order(statements, read_tptp(str(folder / "problem.p")).statements)

    statements, order = inferred("boolean_algebra_join_assoc")
    assert isinstance(order, LexicographicPathOrder)
    assert order.rank(("join", 2)) > order.rank(("meet", 2))
    assert len(rewriting_examples(statements)) >= 5
    assert all(isinstance(example.conclusion, Clause) for example in rewriting_examples(statements))
    _, order = inferred("group_exponent_three_conjugate")
    assert isinstance(order, KnuthBendixOrder)
