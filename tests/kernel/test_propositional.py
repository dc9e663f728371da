"""The RUP refutation check: each branch, and a property that it accepts
nothing satisfiable (truth tables written for the test as the reference)."""

from __future__ import annotations

import itertools

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.clauses import Clause, Literal
from checker.kernel.formulas import FALSUM
from checker.kernel.propositional import check_unit_entailment, check_unit_refutation
from checker.kernel.terms import application, variable
from formats.tptp import parse_clause, parse_formula

ATOMS = [application(name) for name in ("p", "q", "r", "s", "t")]


def clauses_of(*texts: str) -> list[Clause]:
    return [parse_clause(text) for text in texts]


# The four clauses over two atoms: the smallest unsatisfiable 2-CNF with no
# unit clause (common practice).
ALL_SIGNS = clauses_of("p | q", "~p | q", "p | ~q", "~p | ~q")


def test_a_rup_refutation_is_accepted():
    assert check_unit_refutation(ALL_SIGNS, clauses_of("q", "$false")) is None


def test_a_lemma_that_does_not_propagate_is_refused():
    failure = check_unit_refutation(ALL_SIGNS[:3], clauses_of("q", "~p", "$false"))
    assert failure is not None and failure.reason == "not_unit_implied"
    assert "lemma 1" in failure.message and "`~p`" in failure.message


def test_lemmas_must_end_in_the_empty_clause():
    failure = check_unit_refutation(ALL_SIGNS, clauses_of("q"))
    assert failure.reason == "refutation_incomplete"
    assert failure.message == "the lemmas do not end in the empty clause"
    assert check_unit_refutation(ALL_SIGNS, []).reason == "refutation_incomplete"


def test_an_empty_input_clause_is_a_conflict_at_once():
    assert check_unit_refutation([Clause()], [Clause()]) is None


def test_an_empty_input_clause_stays_a_conflict_after_other_clauses():
    # The empty clause has no model, whatever clauses come after it (common practice).
    assert check_unit_refutation([Clause(), *clauses_of("p")], [Clause()]) is None


def test_a_tautological_lemma_is_unit_implied():
    # Setting both r and ~r false is a conflict before any clause is read
    # (reverse unit propagation, common practice).
    assert check_unit_refutation(ALL_SIGNS, clauses_of("r | ~r", "q", "$false")) is None


def test_propagation_goes_on_past_a_literal_assumed_twice():
    # The lemma ~s | ~p repeats the unit clause p; assuming s as well gives
    # t and ~t.  Unsatisfiable: s forces t and ~t, ~s forces q and ~q
    # (checked by hand, common practice).
    clauses = clauses_of("p", "~s | t", "~s | ~t", "s | q", "s | ~q")
    assert check_unit_refutation(clauses, clauses_of("~s | ~p", "~s", "$false")) is None


def test_propagation_goes_on_past_a_satisfied_clause():
    # With x and y assumed, ~x | y is already true; ~x | z still gives z,
    # and z gives w and ~w.  Unsatisfiable: x leads to that conflict, ~x
    # forces v and ~v (checked by hand, common practice).
    clauses = clauses_of("~x | y", "~x | z", "~z | w", "~z | ~w", "x | v", "x | ~v")
    assert check_unit_refutation(clauses, clauses_of("~x | ~y", "~x", "$false")) is None


def test_atoms_with_arguments_are_propositional_variables():
    # p(X) and ~p(Y) are different atoms: no conflict by propagation.
    assert check_unit_refutation(clauses_of("p(X)", "~p(Y)"), [Clause()]).reason == "not_unit_implied"
    assert check_unit_refutation(clauses_of("p(X)", "~p(X)"), [Clause()]) is None


def test_entailment_over_the_kernel_clauses_of_formulas():
    premises = [parse_formula("spl1 | spl2"), parse_clause("~spl1"), parse_formula("~spl2")]
    assert check_unit_entailment(premises, FALSUM, [Clause()]) is None
    assert check_unit_entailment(premises[:2], FALSUM, [Clause()]).reason == "not_unit_implied"


# ---------------------------------------------------------------- properties

literals = st.builds(Literal, st.booleans(), st.sampled_from(ATOMS))
clause_sets = st.lists(st.lists(literals, min_size=1, max_size=3).map(Clause), min_size=1, max_size=12)


def satisfiable_by_enumeration(clauses: list[Clause]) -> bool:
    """Truth tables over the five atoms (written for the tests)."""
    for values in itertools.product((False, True), repeat=len(ATOMS)):
        truth = dict(zip(ATOMS, values))
        if all(any(truth[lit.atom] == lit.positive for lit in clause.literal_set) for clause in clauses):
            return True
    return False


@settings(max_examples=300, deadline=None)
@given(clause_sets, st.lists(st.lists(literals, max_size=2).map(Clause), max_size=6))
def test_nothing_satisfiable_is_refuted(clauses, lemmas):
    if check_unit_refutation(clauses, [*lemmas, Clause()]) is None:
        assert not satisfiable_by_enumeration(clauses)


def test_variables_in_atoms_stay_distinct_atoms():
    x = variable("X")
    clause = Clause([Literal(True, application("p", (x,)))])
    assert check_unit_refutation([clause], [Clause()]) is not None
