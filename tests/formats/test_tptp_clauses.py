"""The TPTP reader on cnf clauses: literals, dropped constants, brackets and
the outermost universal quantifier."""

import pytest

from checker.kernel.clauses import Clause, Literal
from checker.kernel.terms import application, variable
from formats.derivation import UnreadableInput
from formats.tptp import parse_clause

X = variable("X")
valve = application("valve", (X,))


def atom(predicate, *arguments):
    return application(predicate, arguments)


def test_disjunction_of_literals_in_written_order():
    # TPTP syntax BNF, <disjunction> ::= <literal> | <disjunction><vline><literal>
    clause = parse_clause("open(X) | ~ closed(X) | jammed")
    assert clause.literals == (
        Literal(True, atom("open", X)),
        Literal(False, atom("closed", X)),
        Literal(True, atom("jammed")),
    )
    assert clause.literals[0].atom is atom("open", X)


def test_equality_and_inequality_literals():
    # TPTP syntax BNF, <literal> ::= <fof_atomic_formula> | ~ <fof_atomic_formula> | <fof_infix_unary>
    a = application("a")
    equality = application("=", (valve, a))
    clause = parse_clause("valve(X) = a | valve(X) != a | ~ valve(X) = a")
    assert [(lit.positive, lit.atom) for lit in clause.literals] == [
        (True, equality),
        (False, equality),
        (False, equality),
    ]


def test_false_literal_is_dropped():
    # TPTP syntax BNF, <defined_proposition>: $false as a literal adds nothing to a disjunction
    assert parse_clause("p | $false | q") == parse_clause("p | q")
    assert len(parse_clause("p | $false | q")) == 2


def test_negated_true_literal_is_dropped():
    # TPTP syntax BNF, <defined_proposition>: ~$true is false, so it adds nothing either
    assert parse_clause("~ $true | p").literals == (Literal(True, atom("p")),)


def test_false_alone_is_the_empty_clause():
    # TPTP syntax BNF, <cnf_formula>: the empty clause is written $false
    assert parse_clause("$false").is_empty
    assert parse_clause("($false)").is_empty
    assert parse_clause("$false | ~ $true") == Clause()


def test_true_literal_is_kept():
    # TPTP syntax BNF, <defined_proposition>: $true makes the clause a tautology,
    # which the reader keeps as written
    assert parse_clause("$true | p").literals[0] == Literal(True, application("$true"))


def test_bracketed_disjunction():
    # TPTP syntax BNF, <cnf_formula> ::= <disjunction> | (<disjunction>)
    assert parse_clause("(p | ~ q)") == parse_clause("p | ~ q")


def test_outermost_universal_quantifier_is_dropped():
    # TPTP syntax BNF, <cnf_formula>: variables are implicitly universal, so an
    # explicit outermost ! [X] : is accepted and adds nothing
    expected = parse_clause("open(X) | closed(X)")
    assert parse_clause("! [X] : (open(X) | closed(X))") == expected
    assert parse_clause("! [X] : ! [Y] : (open(X) | closed(X))") == expected
    assert parse_clause("! [X] : open(X)") == parse_clause("open(X)")


@pytest.mark.parametrize(
    "text",
    ["p & q", "~ (p | q)", "~ ~ p", "p => q", "? [X] : p(X)", "! [X] : p(X) | q(X)", "(p) | q", ""],
)
def test_non_clauses_are_unreadable(text):
    # TPTP syntax BNF, <literal>: a literal is an atom, a negated atom or an inequality
    with pytest.raises(UnreadableInput):
        parse_clause(text)
