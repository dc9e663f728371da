"""A textbook resolution refutation, step by step and as a whole.

Russell & Norvig, "Artificial Intelligence: A Modern Approach" (3rd ed.,
section 9.5, the "Curiosity killed the cat" example; clauses and proof
tree from memory).  F and G are the Skolem functions of the first
sentence, which is why the first two clauses share them.
"""

from __future__ import annotations

import pytest
from search_strategies import N, P, fn

from checker.kernel.clauses import Clause
from checker.kernel.rules import Refutation, check_clause_step
from checker.kernel.terms import application, variable
from checker.search.reconstruct import reconstruct

x, y, z = variable("x"), variable("y"), variable("z")
jack, tuna, curiosity = application("Jack"), application("Tuna"), application("Curiosity")

A1 = Clause([P("Animal", fn("F", x)), P("Loves", fn("G", x), x)])
A2 = Clause([N("Loves", x, fn("F", x)), P("Loves", fn("G", x), x)])
B = Clause([N("Loves", y, x), N("Animal", z), N("Kills", x, z)])
C = Clause([N("Animal", x), P("Loves", jack, x)])
D = Clause([P("Kills", jack, tuna), P("Kills", curiosity, tuna)])
E = Clause([P("Cat", tuna)])
F = Clause([N("Cat", x), P("Animal", x)])
NEGATED_GOAL = Clause([N("Kills", curiosity, tuna)])

# The proof tree's steps: (parents, resolvent), in the book's order.
STEPS = [
    ((E, F), Clause([P("Animal", tuna)])),
    ((D, NEGATED_GOAL), Clause([P("Kills", jack, tuna)])),
    ((Clause([P("Animal", tuna)]), B), Clause([N("Loves", y, x), N("Kills", x, tuna)])),
    ((Clause([P("Kills", jack, tuna)]), Clause([N("Loves", y, x), N("Kills", x, tuna)])), Clause([N("Loves", y, jack)])),
    ((C, A1), Clause([P("Loves", jack, fn("F", x)), P("Loves", fn("G", x), x)])),
    ((Clause([P("Loves", jack, fn("F", x)), P("Loves", fn("G", x), x)]), A2), Clause([P("Loves", fn("G", jack), jack)])),
    ((Clause([P("Loves", fn("G", jack), jack)]), Clause([N("Loves", y, jack)])), Clause([])),
]


@pytest.mark.parametrize("number", range(len(STEPS)))
def test_each_step_of_the_curiosity_refutation_is_reconstructed(number):
    parents, resolvent = STEPS[number]
    found = reconstruct(parents, resolvent, "resolution")
    assert found.evidence is not None, found.closest
    assert check_clause_step(parents, resolvent, found.evidence, found.theta) is None


def test_a_misremembered_step_is_not_reconstructed():
    # Swapping the constants in step 2 gives a clause that does not follow.
    parents, _ = STEPS[1]
    wrong = Clause([P("Kills", tuna, jack)])
    found = reconstruct(parents, wrong, "resolution")
    assert found.evidence is None
    assert found.closest is not None and wrong.literals[0] in found.closest.extra


def test_the_whole_refutation_is_found_by_saturation():
    clauses = [A1, A2, B, C, D, E, F, NEGATED_GOAL]
    found = reconstruct(clauses, Clause([]), "")
    assert isinstance(found.evidence, Refutation)
    assert check_clause_step(clauses, Clause([]), found.evidence) is None


def test_the_conclusion_follows_from_the_axioms_by_refutation():
    # Without the negated goal, the goal itself is the claimed clause; the
    # search refutes axioms plus the kernel's negation of the claim.
    axioms = [A1, A2, B, C, D, E, F]
    goal = Clause([P("Kills", curiosity, tuna)])
    found = reconstruct(axioms, goal, "")
    assert isinstance(found.evidence, Refutation)
    assert check_clause_step(axioms, goal, found.evidence) is None
