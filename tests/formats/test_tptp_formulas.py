"""The TPTP reader on fof formulas: connectives, their binding, quantifiers,
defined propositions and equality."""

import pytest

from checker.kernel.formulas import (
    AND,
    EXISTS,
    FALSUM,
    FORALL,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    OR,
    VERUM,
    XOR,
    atomic,
    binary,
    negation,
    quantified,
)
from checker.kernel.terms import application, variable
from formats.derivation import UnreadableInput
from formats.tptp import parse_formula

p, q, r = (atomic(application(name)) for name in "pqr")
X, Y = variable("X"), variable("Y")


def at(predicate, *arguments):
    return atomic(application(predicate, arguments))


def equal(left, right):
    return atomic(application("=", (left, right)))


@pytest.mark.parametrize(
    "written, connective",
    [("=>", IMPLIES), ("<=>", IFF), ("<~>", XOR), ("~|", NOR), ("~&", NAND), ("|", OR), ("&", AND)],
)
def test_binary_connectives(written, connective):
    # TPTP syntax BNF, <nonassoc_connective> and <assoc_connective>
    assert parse_formula(f"p {written} q") is binary(connective, p, q)


def test_reverse_implication_is_read_as_implication():
    # TPTP syntax BNF, <nonassoc_connective>: <= is implication written right to left
    assert parse_formula("p <= q") is binary(IMPLIES, q, p)


def test_and_and_or_chains_are_read_left_nested():
    # TPTP syntax BNF, <fof_binary_assoc>: & and | are associative
    assert parse_formula("p & q & r") is binary(AND, binary(AND, p, q), r)
    assert parse_formula("p | q | r") is binary(OR, binary(OR, p, q), r)
    assert parse_formula("p | (q | r)") is binary(OR, p, binary(OR, q, r))


@pytest.mark.parametrize("text", ["p & q | r", "p | q & r", "p => q => r", "p <=> q & r", "p & q => r"])
def test_mixing_binary_connectives_needs_brackets(text):
    # TPTP syntax BNF, <fof_binary_nonassoc> and <fof_or_formula>/<fof_and_formula>
    # take <fof_unit_formula> operands, so a mix without brackets is not a formula
    with pytest.raises(UnreadableInput):
        parse_formula(text)


def test_brackets_group_mixed_connectives():
    # TPTP syntax BNF, <fof_unitary_formula> ::= (<fof_logic_formula>)
    assert parse_formula("(p & q) | r") is binary(OR, binary(AND, p, q), r)
    assert parse_formula("p => (q => r)") is binary(IMPLIES, p, binary(IMPLIES, q, r))
    assert parse_formula("((p))") is p


def test_negation_binds_tighter_than_binary_connectives():
    # TPTP syntax BNF, <fof_unary_formula> ::= <unary_connective> <fof_unit_formula>
    assert parse_formula("~ p & q") is binary(AND, negation(p), q)
    assert parse_formula("~ (p & q)") is negation(binary(AND, p, q))
    assert parse_formula("~~p") is negation(negation(p))


def test_quantifier_binds_the_unit_formula_after_the_colon():
    # TPTP syntax BNF, <fof_quantified_formula> ::=
    # <fof_quantifier> [<fof_variable_list>] : <fof_unit_formula>
    open_x = at("open", X)
    assert parse_formula("! [X] : open(X) & q") is binary(AND, quantified(FORALL, (X,), open_x), q)
    assert parse_formula("! [X] : (open(X) & q)") is quantified(FORALL, (X,), binary(AND, open_x, q))
    assert parse_formula("? [X,Y] : ~ at(X, Y)") is quantified(EXISTS, (X, Y), negation(at("at", X, Y)))
    assert parse_formula("! [X] : ? [Y] : at(X,Y)") is quantified(
        FORALL, (X,), quantified(EXISTS, (Y,), at("at", X, Y))
    )


def test_empty_variable_list_is_not_a_quantifier():
    # TPTP syntax BNF, <fof_variable_list> ::= <variable> | <variable>,<fof_variable_list>
    with pytest.raises(UnreadableInput):
        parse_formula("! [] : p")


def test_true_and_false_are_the_formula_constants():
    # TPTP syntax BNF, <defined_proposition> ::= $true | $false
    assert parse_formula("$true") is VERUM
    assert parse_formula("$false") is FALSUM
    assert parse_formula("~ $true | $false") is binary(OR, negation(VERUM), FALSUM)


def test_other_defined_predicates_are_kept_as_atoms():
    # TPTP syntax BNF, <defined_predicate>: $distinct and the like are atoms
    a, b = application("a"), application("b")
    assert parse_formula("$distinct(a, b)") is at("$distinct", a, b)


def test_equality_and_inequality_atoms():
    # TPTP syntax BNF, <fof_defined_infix_formula> ::= <fof_term> <defined_infix_pred> <fof_term>
    # and <fof_infix_unary> ::= <fof_term> <infix_inequality> <fof_term>
    gate = application("gate", (X,))
    assert parse_formula("gate(X) = Y") is equal(gate, Y)
    assert parse_formula("gate(X) != Y") is negation(equal(gate, Y))
    assert parse_formula("~ X = Y") is negation(equal(X, Y))
    assert parse_formula("X = Y & p") is binary(AND, equal(X, Y), p)


def test_variable_alone_is_not_a_formula():
    # TPTP syntax BNF, <fof_plain_atomic_formula> ::= <fof_plain_term> (no variables)
    with pytest.raises(UnreadableInput):
        parse_formula("X")


def test_deep_negations_and_brackets():
    # common practice: formula nesting is unbounded; nothing may recurse per level
    depth = 100_000
    formula = parse_formula("~" * depth + "p")
    for _ in range(depth):
        formula = formula.arguments[0]
    assert formula is p
    assert parse_formula("(" * depth + "p" + ")" * depth) is p
