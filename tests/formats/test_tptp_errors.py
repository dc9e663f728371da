"""Where the TPTP reader says a text is unreadable: line, column, the caret
excerpt, and what it expected instead."""

import pytest

from formats.derivation import Location, UnreadableInput
from formats.tptp import parse_clause, parse_formula, parse_term, parse_tptp


def failure(read, text, **options):
    with pytest.raises(UnreadableInput) as caught:
        read(text, **options)
    return caught.value


def test_unexpected_token_in_a_multi_line_statement():
    # TPTP syntax BNF, <fof_arguments> ::= <fof_term> | <fof_term>,<fof_arguments>
    error = failure(parse_tptp, "cnf(a, axiom, p).\n\ncnf(b, axiom,\n    q(X,) | r).", path="yard.p")
    assert error.location == Location("yard.p", 4, 9)
    assert error.excerpt == "    q(X,) | r).\n        ^"
    assert "unexpected ')'" in error.message
    assert "a variable" in error.message and "a lower-case word" in error.message


def test_error_on_the_first_line_of_a_statement_that_does_not_start_the_line():
    # TPTP syntax BNF, <disjunction>: a literal must follow each |
    error = failure(parse_tptp, "cnf(a, axiom, p).  cnf(b, axiom, p | | q).")
    assert error.location == Location("<string>", 1, 38)
    assert error.excerpt == "cnf(a, axiom, p).  cnf(b, axiom, p | | q).\n" + " " * 37 + "^"


def test_missing_full_stop():
    # TPTP syntax BNF, <cnf_annotated> ends with ).
    error = failure(parse_tptp, "cnf(a, axiom, p)\ncnf(b, axiom, q).")
    assert error.location == Location("<string>", 1, 17)
    assert "expected '.'" in error.message


def test_unclosed_statement_is_reported_at_the_end_of_its_text():
    # TPTP syntax BNF, <fof_plain_term> ::= <functor>(<fof_arguments>): the bracket must close
    error = failure(parse_tptp, "fof(a, axiom, p(a, b\n")
    assert error.location == Location("<string>", 1, 21)
    assert "unexpected end of text" in error.message


def test_mixed_connectives_point_at_the_second_connective():
    # TPTP syntax BNF, <fof_or_formula>: operands are unit formulas, so & cannot follow p | q
    error = failure(parse_formula, "p | q & r")
    assert error.location == Location("<string>", 1, 7)
    assert error.excerpt == "p | q & r\n      ^"


def test_bad_character():
    # TPTP syntax BNF, <lower_word> ::- <lower_alpha><alpha_numeric>*: # is no word character
    error = failure(parse_term, "gate(#4)")
    assert error.location == Location("<string>", 1, 6)
    assert "unexpected character '#'" in error.message


def test_errors_in_a_string_are_located_relative_to_where_it_starts():
    # common practice: a formula held in a JSON string is reported at its place in that file
    where = Location("certificate.jsonl", 12, 30)
    error = failure(parse_clause, "p(X) | | q", where=where)
    assert error.location == Location("certificate.jsonl", 12, 37)
    assert error.excerpt == "p(X) | | q\n       ^"
    error = failure(parse_formula, "p &\n  & q", where=where)
    assert error.location == Location("certificate.jsonl", 13, 3)
    assert error.excerpt == "  & q\n  ^"


def test_tabs_in_the_excerpt_keep_the_caret_aligned():
    # common practice: the caret line repeats tabs so it lines up in a terminal
    error = failure(parse_tptp, "\tcnf(a, axiom, p q).")
    assert error.location == Location("<string>", 1, 18)
    assert error.excerpt == "\tcnf(a, axiom, p q).\n\t" + " " * 16 + "^"


def test_empty_string_is_not_a_clause():
    # TPTP syntax BNF, <disjunction>: at least one literal
    error = failure(parse_clause, "")
    assert error.location == Location("<string>", 1, 1)
    assert "unexpected end of text" in error.message
