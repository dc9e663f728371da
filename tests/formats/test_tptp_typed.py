"""Reading the first-order part of TFF and THF, and refusing the rest.

Expected values come from the TPTP syntax BNF (rule names in the comments,
from memory of the standard) and from the erasure of types: a typed
statement must read as the fof statement it spells without its types.
"""

from __future__ import annotations

import pytest

from checker.kernel.formulas import FALSUM
from formats.derivation import Location, UnreadableInput
from formats.tptp import parse_formula, parse_tptp


def only(text: str):
    (statement,) = parse_tptp(text).statements
    return statement


def refusal(text: str) -> UnreadableInput:
    with pytest.raises(UnreadableInput) as caught:
        parse_tptp(text)
    return caught.value


# ------------------------------------------------------------ what reads


def test_type_declarations_are_not_statements():
    # TPTP syntax BNF, <tff_atom_typing> and <thf_atom_typing> under the role type:
    # a declaration says what a symbol is; it is no axiom of the problem.
    document = parse_tptp(
        "tff(p_type, type, p: ($i * $i) > $o).\n"
        "thf(v5_type, type, (v5: $i > $i > $o)).\n"
        "tff(a, axiom, p(c, d)).\n"
    )
    assert [s.name for s in document.statements] == ["a"]


def test_tff_typed_quantifier_reads_as_the_fof_formula():
    # TPTP syntax BNF, <tff_quantified_formula> with <tff_typed_variable> X : <tff_atomic_type>
    statement = only("tff(p_type, type, p: ($i * $i) > $o).\ntff(a, axiom, ! [X: $i, Y: $i] : (p(X, Y) | ~ p(Y, X))).")
    assert statement.language == "tff"
    assert statement.content is parse_formula("! [X, Y] : (p(X, Y) | ~ p(Y, X))")
    assert statement.sorts == frozenset({"$i"})


def test_tff_untyped_variable_is_of_type_individual():
    # TPTP syntax BNF, <tff_variable> ::= <tff_typed_variable> | <variable>; an untyped one is $i
    statement = only("tff(a, axiom, ! [X] : q(X)).")
    assert statement.content is parse_formula("! [X] : q(X)")
    assert statement.sorts == frozenset({"$i"})


@pytest.mark.parametrize(
    "written",
    [
        "v4_relat_1 @ k1_xboole_0 @ X",
        "( v4_relat_1 @ k1_xboole_0 ) @ X",
        "( ( v4_relat_1 @ k1_xboole_0 ) @ X )",
        "( v4_relat_1 @ k1_xboole_0 @ X )",
        "v4_relat_1(k1_xboole_0, X)",
        "( v4_relat_1(k1_xboole_0) @ X )",
    ],
)
def test_thf_application_however_bracketed_is_one_atom(written):
    # TPTP syntax BNF, <thf_apply_formula> ::= <thf_unit_formula> @ <thf_unit_formula> | <thf_apply_formula> @ ...
    # (left associative), and <thf_fof_function> for f(a, b): all spell v4_relat_1(k1_xboole_0, X)
    statement = only(
        "thf(v4_type, type, v4_relat_1: $i > $i > $o).\nthf(k1_type, type, k1_xboole_0: $i).\n"
        f"thf(a, axiom, ! [X: $i] : ( {written} )).",
    )
    assert statement.content is parse_formula("! [X] : v4_relat_1(k1_xboole_0, X)")


def test_thf_application_inside_terms_and_equations():
    # TPTP syntax BNF, <thf_defined_infix> ::= <thf_unitary_formula> = <thf_unitary_formula>
    statement = only(
        "thf(f_type, type, f: $i > $i > $i).\nthf(g_type, type, g: $i > $i).\n"
        "thf(a, axiom, ! [X: $i] : ( ( f @ ( g @ X ) @ X ) = ( g @ X ) )).",
    )
    assert statement.content is parse_formula("! [X] : f(g(X), X) = g(X)")


def test_o_typed_atoms_are_propositions():
    # TPTP syntax BNF, <defined_type> $o: a symbol declared at $o is a proposition
    statement = only("thf(s, type, smoke: $o).\nthf(h, type, heat: $o).\nthf(a, axiom, ( smoke & heat ) => smoke).")
    assert statement.content is parse_formula("(smoke & heat) => smoke")
    assert statement.sorts == frozenset()


def test_quoted_and_hash_prefixed_names():
    # TPTP syntax BNF, <single_quoted>: '#skF_1' is a symbol like any other; a quoted
    # lower word is the same symbol as the word unquoted
    statement = only(
        "tff(sk, type, '#skF_1': $i > $i).\ntff(p, type, 'p': $i > $o).\n"
        "tff(a, axiom, ! [X: $i] : p('#skF_1'(X))).",
    )
    assert statement.content is parse_formula("! [X] : p('#skF_1'(X))")


def test_declared_sorts_are_erased_and_recorded():
    # TPTP syntax BNF, <tff_atom_typing> with <defined_type> $tType declares a sort
    statement = only(
        "tff(crate, type, crate: $tType).\ntff(shelf, type, shelf: $tType).\n"
        "tff(on, type, stored_on: crate > shelf).\n"
        "tff(a, axiom, ! [C: crate, S: shelf] : (stored_on(C) = S | ~ stored_on(C) = S)).",
    )
    assert statement.content is parse_formula("! [C, S] : (stored_on(C) = S | stored_on(C) != S)")
    assert statement.sorts == frozenset({"crate", "shelf"})


def test_unused_declarations_of_arithmetic_and_higher_order_symbols_are_harmless():
    # The example: a symbol declared at $int, $rat and $real under three names,
    # never used; a higher-order symbol declared but never used is no reason to refuse.
    statement = only(
        "tff(n1, type, max_load: $int).\ntff(n2, type, ratio: $rat).\ntff(n3, type, setpoint: $real).\n"
        "thf(h, type, apply_all: ($i > $i) > $o).\n"
        "tff(a, axiom, door_open(r1)).",
    )
    assert statement.content is parse_formula("door_open(r1)")
    assert statement.sorts == frozenset({"$i"})


def test_arithmetic_terms_carry_their_sort():
    # TPTP syntax BNF, <integer> and <rational> are of $int and $rat; $sum is polymorphic over them
    statement = only("tff(c, type, load: $int).\ntff(a, axiom, $less($sum(load, 2), 10)).")
    assert statement.sorts == frozenset({"$int"})


def test_a_repeated_equal_declaration_is_accepted():
    # Derivations repeat the problem's declarations.
    statement = only("tff(t1, type, p: $i > $o).\ntff(t2, type, p: $i > $o).\ntff(a, axiom, p(c)).")
    assert statement.content is parse_formula("p(c)")


def test_free_variables_of_clause_shaped_steps_take_the_sort_of_their_use():
    statement = only(
        "thf(s, type, sensor: $tType).\nthf(r, type, reads: sensor > $o).\n"
        "thf(c, plain, ( ( reads @ X1 ) | ( X1 = X2 ) )).",
    )
    assert statement.content is parse_formula("reads(X1) | X1 = X2")
    assert statement.sorts == frozenset({"sensor"})


# ------------------------------------------------------------ the standard's odds and ends


def test_fourth_annotation_argument_is_read():
    # TPTP syntax BNF, <annotations> ::= , <source> <optional_info>, with <useful_info> a list
    document = parse_tptp(
        "cnf(c1, axiom, p, file('x.p', c1), [proof]).\n"
        "tff(c2, plain, $false, inference(resolution, [status(thm)], [c1, c1]), [proof]).\n"
    )
    assert [s.name for s in document.statements] == ["c1", "c2"]
    assert document.statements[1].content is FALSUM


def test_several_false_clauses_and_interleaved_comments():
    # TPTP syntax BNF, <comment_line> may stand between any two <TPTP_input>s
    document = parse_tptp(
        "% start\ncnf(c1, axiom, p).\n% between\n/* block */\ncnf(c2, axiom, ~p).\n"
        "cnf(c3, plain, $false, inference(r, [status(thm)], [c1, c2])).\n% again\n"
        "cnf(c4, plain, $false, inference(r, [status(thm)], [c2, c1])).\n"
    )
    assert [s.name for s in document.statements] == ["c1", "c2", "c3", "c4"]
    assert not document.notices


def test_commented_copy_of_the_proof_is_not_read():
    # TPTP syntax BNF, <comment>: a commented statement is no statement
    document = parse_tptp("cnf(c1, axiom, p).\n% cnf(c1, axiom, q).\n% cnf(c9, plain, $false).\n")
    assert [s.name for s in document.statements] == ["c1"]


# ------------------------------------------------------------ what is refused


@pytest.mark.parametrize(
    ("text", "words", "column"),
    [
        # <thf_quantifier> ^ (lambda)
        ("thf(a, axiom, ( ^ [X: $i] : p @ X ) @ c).", "lambda abstraction", 17),
        ("thf(a, axiom, ! [F: $i > $i] : ( F @ c ) = c).", "quantification over functions or predicates", 18),
        ("thf(a, axiom, ! [P: $o] : P).", "quantification over $o", 18),
        ("thf(t, type, f: $i > $i > $i).\nthf(a, axiom, ( f @ c ) = g).", "partial application", 17),
        ("thf(t, type, q: ($i > $o) > $o).\nthf(a, axiom, q @ p).", "`q`: a function or predicate as an argument", 15),
        ("tff(a, axiom, f(p & q) = c).", "a formula as an argument", 17),
        ("thf(a, axiom, !! @ p).", "the quantifier constant !!", 15),
        ("thf(a, axiom, (=) @ c @ d).", "the connective (=) used as a term", 16),
        ("thf(a, axiom, @+ [X: $i] : p @ X).", "choice and description binders", 15),
        ("tff(t, type, choose: !> [A: $tType] : A).\ntff(a, axiom, p(choose)).", "`choose`: polymorphic types", 17),
        ("tff(a, axiom, $ite(p, q, r)).", "$ite", 15),
        ("thf(a, axiom, ! [X: $i] : ( X @ c )).", "applying the variable `X`", 29),
        ("thf(t, type, p: $i > $o).\nthf(a, axiom, ( p @ c ) = c).", "equality between formulas", 17),
    ],
)
def test_what_is_not_first_order_is_refused_as_unsupported(text, words, column):
    error = refusal(text)
    assert error.message.startswith("unsupported: ")
    assert words in error.message
    assert error.location == Location("<string>", text.count("\n") + 1, column)


@pytest.mark.parametrize("language", ["tcf", "tpi"])
def test_tcf_and_tpi_are_refused_as_unsupported(language):
    # TPTP syntax BNF, <annotated_formula>: <tcf_annotated> and <tpi_annotated>
    error = refusal(f"cnf(a, axiom, p).\n{language}(b, axiom, p).")
    assert error.message.startswith("unsupported: ")
    assert error.location == Location("<string>", 2, 1)


def test_a_typed_statement_that_does_not_parse_says_what_is_read():
    error = refusal("tff(a, axiom, [c, d] = e).")
    assert "only the first-order part is read" in error.message


# ------------------------------------------------------------ sort errors


@pytest.mark.parametrize(
    ("text", "words", "line", "column"),
    [
        (
            "tff(s, type, valve: $tType).\ntff(o, type, open: valve > $o).\ntff(a, axiom, open(c)).",
            "argument 1 of `open` must be of type `valve`, but `c` is not declared",
            3, 20,
        ),
        (
            "tff(s, type, valve: $tType).\ntff(t, type, v1: valve).\ntff(a, axiom, v1 = c).",
            "the sides of `=` have different types",
            3, 18,
        ),
        (
            "tff(s, type, valve: $tType).\ntff(a, axiom, ! [X: valve] : p(X)).",
            "argument 1 of `p` must be of type `$i`, but `X` is of type `valve`",
            2, 32,
        ),
        ("tff(a, axiom, ! [X: sensor] : p(X)).", "type `sensor` is not declared", 1, 21),
        ("tff(t1, type, p: $i > $o).\ntff(t2, type, p: $o).", "`p` is declared as `$o` but was declared as `$i > $o`", 2, 15),
        ("tff(s, type, valve: $tType).\ntff(t, type, v1: valve).\ntff(a, axiom, v1).", "`v1` of type `valve` stands where a formula", 3, 15),
        ("tff(t, type, p: $i > $o).\ntff(a, axiom, p(c, d)).", "`p` of type `$i > $o` is applied to 2 arguments", 2, 15),
        ("tff(t, axiom, p: $i > $o).", "must have the role type", 1, 15),
    ],
)
def test_a_term_of_the_wrong_sort_is_unreadable_at_its_place(text, words, line, column):
    error = refusal(text)
    assert words in error.message
    assert error.location == Location("<string>", line, column)
    assert error.excerpt.endswith("^")
