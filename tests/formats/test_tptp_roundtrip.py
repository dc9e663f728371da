"""Writing a term, clause or formula in TPTP syntax and reading it back
gives the same object (hash-consing makes this an identity test)."""

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.clauses import Clause, Literal
from checker.kernel.formulas import (
    BINARY,
    FALSUM,
    QUANTIFIERS,
    VERUM,
    atomic,
    binary,
    negation,
    quantified,
    render_formula,
)
from checker.kernel.terms import application, render, variable
from formats.tptp import parse_clause, parse_formula, parse_term

# Words of each kind the TPTP syntax BNF allows in term position.
VARIABLES = st.sampled_from(["X", "Y", "Z1", "Route_2"]).map(variable)
FUNCTORS = st.sampled_from(["f", "next_stop", "'Dock 4'", "'it\\'s'", "$sum", "$$clock"])
CONSTANTS = st.sampled_from(
    ["depot", "'Yard B'", '"Platform 3"', "12", "-4", "2/3", "0.5", "7E-3", "$pi", "$$now"]
)
PREDICATES = st.sampled_from(["at", "loaded", "'Gate open'", "$distinct", "$$ready"])

ROUNDTRIP = settings(max_examples=150, deadline=None)

terms = st.recursive(
    VARIABLES | CONSTANTS.map(application),
    lambda inner: st.builds(
        lambda symbol, arguments: application(symbol, tuple(arguments)),
        FUNCTORS,
        st.lists(inner, min_size=1, max_size=3),
    ),
    max_leaves=12,
)

atoms = st.one_of(
    st.builds(lambda left, right: application("=", (left, right)), terms, terms),
    st.builds(
        lambda symbol, arguments: application(symbol, tuple(arguments)),
        PREDICATES,
        st.lists(terms, max_size=3),
    ),
)

literals = st.builds(Literal, st.booleans(), atoms)
clauses = st.lists(literals, max_size=5).map(Clause)

formulas = st.recursive(
    st.one_of(atoms.map(atomic), st.just(VERUM), st.just(FALSUM)),
    lambda inner: st.one_of(
        inner.map(negation),
        st.builds(binary, st.sampled_from(BINARY), inner, inner),
        st.builds(
            lambda quantifier, names, body: quantified(quantifier, tuple(names), body),
            st.sampled_from(QUANTIFIERS),
            st.lists(VARIABLES, min_size=1, max_size=3),
            inner,
        ),
    ),
    max_leaves=10,
)


@ROUNDTRIP
@given(terms)
def test_term_reads_back_as_itself(term):
    # TPTP syntax BNF, <fof_term>: the kernel writes terms in this syntax
    assert parse_term(render(term)) is term


@ROUNDTRIP
@given(clauses)
def test_clause_reads_back_as_itself(clause):
    # TPTP syntax BNF, <cnf_formula>: the kernel writes clauses in this syntax
    read = parse_clause(str(clause))
    assert read == clause
    assert [(lit.positive, lit.atom) for lit in read.literals] == [
        (lit.positive, lit.atom) for lit in clause.literals
    ]


@ROUNDTRIP
@given(formulas)
def test_formula_reads_back_as_itself(formula):
    # TPTP syntax BNF, <fof_formula>: render_formula brackets every binary operand
    assert parse_formula(render_formula(formula)) is formula
