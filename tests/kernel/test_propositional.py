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
    assert check_unit_refutation(ALL_SIGNS, clauses_of("q")).reason == "refutation_incomplete"
    assert check_unit_refutation(ALL_SIGNS, []).reason == "refutation_incomplete"


def test_an_empty_input_clause_is_a_conflict_at_once():
    assert check_unit_refutation([Clause()], [Clause()]) is None


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
