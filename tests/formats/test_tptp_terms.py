"""The TPTP reader on terms: words, quoting, numbers, defined and system
symbols, and nesting far beyond Python's recursion limit."""

import sys

import pytest

from checker.kernel.terms import application, variable
from formats.derivation import UnreadableInput
from formats.tptp import parse_term, parse_tptp

a = application("a")
b = application("b")


def test_upper_words_are_variables():
    # TPTP syntax BNF, <variable> ::= <upper_word>
    assert parse_term("Platform") is variable("Platform")
    assert parse_term("X_1") is variable("X_1")


def test_lower_words_are_constants_and_functors():
    # TPTP syntax BNF, <fof_plain_term> ::= <constant> | <functor>(<fof_arguments>)
    assert parse_term("gate_4") is application("gate_4")
    assert parse_term("next_stop(a, X)") is application("next_stop", (a, variable("X")))
    assert parse_term("f(g(a), b)") is application("f", (application("g", (a,)), b))


def test_single_quoted_lower_word_is_the_unquoted_symbol():
    # TPTP syntax BNF, <atomic_word> ::= <lower_word> | <single_quoted>; the
    # BNF's comment on <single_quoted> says 'cat' and cat are the same word
    # (from memory)
    assert parse_term("'abc'") is application("abc")
    assert parse_term("'f'('a')") is application("f", (a,))


def test_other_single_quoted_words_keep_their_quotes():
    # TPTP syntax BNF, <single_quoted>: any printable characters, with \' and \\ escaped
    assert parse_term("'Signal box'") is application("'Signal box'")
    assert parse_term("'it\\'s'") is application("'it\\'s'")
    assert parse_term("'9lives'(a)") is application("'9lives'", (a,))


def test_distinct_objects_keep_their_double_quotes():
    # TPTP syntax BNF, <defined_term> ::= <number> | <distinct_object>
    assert parse_term('"Platform 3"') is application('"Platform 3"')
    assert parse_term('"say \\"hi\\""') is application('"say \\"hi\\""')
    assert parse_term('""') is application('""')


@pytest.mark.parametrize("number", ["0", "42", "-7", "+3", "2/3", "-1/8", "3.25", "1.5E-2", "6e10"])
def test_numbers_are_constants(number):
    # TPTP syntax BNF, <number> ::= <integer> | <rational> | <real>
    assert parse_term(number) is application(number)
    assert parse_term(f"weight({number})") is application("weight", (application(number),))


def test_defined_and_system_functors_are_kept_as_symbols():
    # TPTP syntax BNF, <fof_defined_plain_term> ::= <defined_constant> |
    # <defined_functor>(<fof_arguments>), and <fof_system_term> (the $$ words)
    assert parse_term("$sum(a, b)") is application("$sum", (a, b))
    assert parse_term("$pi") is application("$pi")
    assert parse_term("$$clock(X)") is application("$$clock", (variable("X"),))


def test_language_keywords_are_ordinary_lower_words():
    # TPTP syntax BNF, <functor> ::= <atomic_word>: cnf, fof and include are lower words
    assert parse_term("cnf(fof, include)") is application(
        "cnf", (application("fof"), application("include"))
    )


def test_comments_may_stand_between_tokens():
    # TPTP syntax BNF, <comment_line> and <comment_block> may occur between tokens
    assert parse_term("f( % first argument\n a, /* second */ b)") is application("f", (a, b))


@pytest.mark.parametrize("text", ["F(a)", "f(,a)", "f()", "f(a", "12(a)", '"box"(a)', "$true("])
def test_malformed_terms_are_unreadable(text):
    # TPTP syntax BNF, <functor> ::= <atomic_word> and <fof_arguments> is non-empty
    with pytest.raises(UnreadableInput):
        parse_term(text)


def test_term_nested_far_beyond_the_recursion_limit():
    # common practice: prover output can nest terms arbitrarily deep; read
    # here as a whole statement, so the scanner meets the depth too
    depth = 100_000
    assert depth > 10 * sys.getrecursionlimit()
    text = "cnf(deep, axiom, p(" + "f(" * depth + "a" + ")" * depth + ")).\ncnf(next, axiom, q)."
    deep, following = parse_tptp(text).statements
    assert following.name == "next"
    clause = deep.content
    (literal,) = clause.literals
    term, levels = literal.atom.arguments[0], 0
    while term.arguments:
        assert term.symbol == "f"
        term, levels = term.arguments[0], levels + 1
    assert (levels, term) == (depth, a)


def test_very_wide_argument_list():
    # common practice: wide terms must read in linear time and keep argument order
    width = 20_000
    term = parse_term("tuple(" + ",".join(f"c{i}" for i in range(width)) + ")")
    assert term.arity == width
    assert term.arguments[0] is application("c0")
    assert term.arguments[-1] is application(f"c{width - 1}")
