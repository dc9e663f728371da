"""The quick reader of plain TPTP text (formats/tptp_plain.py) against the
grammar (formats/tptp.lark), which is the reference: wherever the quick
reader answers, it must build exactly what the grammar's transformer
builds, and wherever the grammar refuses the text, the quick reader must
leave it alone (answer None) so that the grammar's error is the one shown.

Text comes from generators shaped by the TPTP syntax BNF rules named
beside them (<cnf_annotated>, <disjunction>, <literal>, <fof_term>,
<general_term>), with words of every terminal shape, then damaged by
dropping, doubling and swapping tokens; and from every fixture file.
"""

import json
import re
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from lark.exceptions import UnexpectedInput

from checker.kernel.clauses import Clause
from formats import tptp
from formats.derivation import UnreadableInput
from formats.limits import InputLimits, bounded
from formats.tptp import parse_clause, parse_term, parse_tptp
from formats.tptp_scan import StatementText, scan

ROOT = Path(__file__).resolve().parents[2]
FAILED = "unreadable"
STARTS = ("cnf_formula", "fof_term", "tptp_input")


def by_grammar(text: str, start: str):
    try:
        return tptp._PARSER.parse(text, start=start)
    except (UnexpectedInput, tptp._Misread):
        return FAILED


def shape(read):
    """What a reading says, with a clause's literals in written order (a
    Clause compares as a set)."""
    if isinstance(read, Clause):
        return ("clause", tuple((literal.positive, literal.atom) for literal in read.literals))
    if isinstance(read, tptp._Annotated):
        return (read.language, read.name, read.role, shape(read.content), read.source, read.sorts)
    return read


def assert_agrees(text: str, start: str) -> bool:
    """The quick reading, if any, is the grammar's; True if there is one."""
    quick = tptp._plain(text, start)
    reference = by_grammar(text, start)
    if reference == FAILED:
        assert quick is None, text
    elif quick is not None:
        assert shape(quick) == shape(reference), text
    return quick is not None


# Words of every terminal shape of the TPTP syntax BNF: <lower_word>,
# <single_quoted> (with and without needed quotes, with escapes),
# <dollar_word>, <dollar_dollar_word>, <integer>, <rational>, <real>,
# signed numbers, <distinct_object>; some of them no term at all.
plain_symbols = st.sampled_from(["a", "valve", "open_2", "'pump'", "'Main gate'", "$sum", "$$sys", "$fot", "$cnf"])
odd_symbols = st.sampled_from(["12", "0", "007", "2.5", "1/3", "-3", "+4", "1e5", '"red"', "'it\\'s'", "'a\\\\b'",
                               "$true", "$false", "'$true'"])
variables = st.sampled_from(["X", "Y", "Z1", "Valve_2"])
spaces = st.sampled_from(["", " ", "  ", "\t", "\n", " \r\n "])


def terms(symbols):
    """<fof_term>: a variable, a constant or a function term."""
    return st.recursive(
        st.one_of(variables, symbols),
        lambda inner: st.builds(lambda f, gap, args: f"{f}{gap}({','.join(args)})", symbols, spaces,
                                st.lists(inner, min_size=1, max_size=3)),
        max_leaves=6,
    )


def literals(symbols):
    """<literal>: an atom, a negated atom, an equation or an inequation."""
    term = terms(symbols)
    return st.one_of(
        term,
        st.builds(lambda gap, a: f"~{gap}{a}", spaces, term),
        st.builds(lambda a, gap, relation, b: f"{a}{gap}{relation}{gap}{b}", term, spaces,
                  st.sampled_from(["=", "!=", "=>"]), term),
        st.builds(lambda a, relation, b: f"~ {a} {relation} {b}", term, st.sampled_from(["=", "!="]), term),
        st.sampled_from(["$true", "$false", "~ $true", "~$false"]),
    )


def clauses(symbols):
    """<cnf_formula>: a disjunction, bracketed or not, or quantified."""
    disjunction = st.builds(lambda items, gap: f"{gap}|{gap}".join(items), st.lists(literals(symbols), min_size=1, max_size=4), spaces)
    return st.one_of(
        disjunction,
        disjunction.map(lambda d: f"({d})"),
        disjunction.map(lambda d: f"! [X] : ({d})"),
    )


def formulas(symbols):
    """<fof_logic_formula>: binary (non-associative, or chains of | and of
    &), unary, quantified, bracketed or atomic; bracketed or not at random,
    so that many are refused."""
    connective = st.sampled_from(["&", "|", "=>", "<=", "<=>", "<~>", "~|", "~&"])
    quantifier = st.builds(lambda q, names: f"{q} [{', '.join(names)}] :", st.sampled_from(["!", "?"]),
                           st.lists(variables, min_size=1, max_size=2))
    return st.recursive(
        literals(symbols),
        lambda inner: st.one_of(
            st.builds(lambda a, c, b, wrap: f"({a} {c} {b})" if wrap else f"{a} {c} {b}", inner, connective, inner,
                      st.booleans()),
            st.builds(lambda items, c: "(" + f" {c} ".join(items) + ")", st.lists(inner, min_size=2, max_size=4),
                      st.sampled_from(["&", "|"])),
            inner.map(lambda a: f"~ {a}"),
            inner.map(lambda a: f"~({a})"),
            st.builds(lambda q, a, wrap: f"{q} ({a})" if wrap else f"{q} {a}", quantifier, inner, st.booleans()),
        ),
        max_leaves=6,
    )


def general_terms(symbols):
    """<general_term>: data, ``data : term``, lists; formula data."""
    leaves = st.one_of(
        symbols, variables, st.sampled_from(["[]", "42", '"note"', "inference", "status(thm)"]),
        terms(symbols).map(lambda t: f"$fot({t})"),
        clauses(symbols).map(lambda c: f"$cnf({c})"),
        formulas(symbols).map(lambda f: f"$fof({f})"),
    )
    return st.recursive(
        leaves,
        lambda inner: st.one_of(
            st.builds(lambda f, args: f"{f}({','.join(args)})", symbols, st.lists(inner, min_size=1, max_size=3)),
            st.lists(inner, max_size=3).map(lambda items: f"[{', '.join(items)}]"),
            st.builds(lambda a, b: f"{a}:{b}", inner, inner),
            st.builds(lambda a, b: f"[{a}]:{b}", inner, inner),
        ),
        max_leaves=8,
    )


@st.composite
def statements(draw, symbols):
    """<cnf_annotated> or <fof_annotated>, with zero, one or two annotations."""
    name = draw(st.one_of(st.sampled_from(["s1", "c_0_7", "42", "'step 3'", "'s4'", "X", "-1", "$s"]), symbols))
    role = draw(st.sampled_from(["axiom", "plain", "negated_conjecture", "plain_ish", "'plain'"]))
    annotations = draw(st.lists(general_terms(symbols), max_size=2))
    annotation = "".join(f", {item}" for item in annotations)
    gap = draw(spaces)
    if draw(st.booleans()):
        return f"cnf{gap}({name},{gap}{role}, {draw(clauses(symbols))}{annotation}){gap}."
    return f"fof{gap}({name},{gap}{role}, {draw(formulas(symbols))}{annotation}){gap}."


every_symbol = st.one_of(plain_symbols, odd_symbols)
TOKEN = r"'(?:[^'\\]|\\.)*'|\"[^\"]*\"|[A-Za-z0-9_$]+|!=|\S"


@st.composite
def damaged(draw, texts):
    """A generated text with a few tokens dropped, doubled or swapped."""
    tokens = re.findall(TOKEN + r"|\s+", draw(texts))
    for _ in range(draw(st.integers(1, 3))):
        if not tokens:
            break
        at = draw(st.integers(0, len(tokens) - 1))
        kind = draw(st.integers(0, 2))
        if kind == 0:
            del tokens[at]
        elif kind == 1:
            tokens.insert(at, tokens[at])
        else:
            other = draw(st.integers(0, len(tokens) - 1))
            tokens[at], tokens[other] = tokens[other], tokens[at]
    return "".join(tokens)


@settings(max_examples=150, deadline=None)
@given(terms(plain_symbols))
def test_plain_terms_are_read_quickly_and_as_the_grammar_reads_them(text):
    assert assert_agrees(text, "fof_term")
    assert by_grammar(text, "fof_term") != FAILED


@settings(max_examples=150, deadline=None)
@given(st.lists(literals(plain_symbols), min_size=1, max_size=5).map(" | ".join))
def test_plain_clauses_are_read_quickly_and_as_the_grammar_reads_them(text):
    # of plain words, the quick reader reads every clause the grammar reads
    # (the grammar refuses a variable as an atom, and => in a clause)
    answered = assert_agrees(text, "cnf_formula")
    assert answered == (by_grammar(text, "cnf_formula") != FAILED), text


@settings(max_examples=150, deadline=None)
@given(formulas(plain_symbols))
def test_plain_formulas_are_read_as_the_grammar_reads_them(text):
    assert_agrees(text, "fof_formula")


@settings(max_examples=100, deadline=None)
@given(st.one_of(terms(every_symbol).map(lambda t: (t, "fof_term")),
                 clauses(every_symbol).map(lambda c: (c, "cnf_formula")),
                 formulas(every_symbol).map(lambda f: (f, "fof_formula")),
                 statements(every_symbol).map(lambda s: (s, "tptp_input"))))
def test_every_word_shape_is_read_as_the_grammar_reads_it_or_left_to_it(case):
    assert_agrees(*case)


@settings(max_examples=150, deadline=None)
@given(st.one_of(damaged(clauses(every_symbol)).map(lambda c: (c, "cnf_formula")),
                 damaged(terms(every_symbol)).map(lambda t: (t, "fof_term")),
                 damaged(formulas(every_symbol)).map(lambda f: (f, "fof_formula")),
                 damaged(statements(every_symbol)).map(lambda s: (s, "tptp_input"))))
def test_damaged_text_is_read_as_the_grammar_reads_it_or_left_to_it(case):
    assert_agrees(*case)


# Edge cases of the BNF, each with whether the quick reader should answer:
# atoms that are no <fof_atomic_formula> (a number, a variable), ~ before an
# inequation, doubled brackets, numbers other than <integer>, quoted words
# that need their quotes, lists followed by a colon, $fof data.
EDGES = [
    ("12", "cnf_formula", False), ("p | 12", "cnf_formula", False), ("X", "cnf_formula", False),
    ("~ a != b", "cnf_formula", False), ("~~a", "cnf_formula", False), ("(a | b)", "cnf_formula", True),
    ("((a))", "cnf_formula", False), ("(a) | b", "cnf_formula", False), ("a | (b)", "cnf_formula", False),
    ("p(2.5)", "cnf_formula", False), ("p(007)", "cnf_formula", False), ("p(1e5)", "cnf_formula", False),
    ("p(12)", "cnf_formula", True), ("12 = X", "cnf_formula", True), ("f()", "fof_term", False),
    ("p($fot)", "cnf_formula", True), ("'a'(X) | 'A'(X)", "cnf_formula", True), ("'a\\'b'", "fof_term", True),
    ("a = b = c", "cnf_formula", False), ("$false", "cnf_formula", True), ("~ $true | $true", "cnf_formula", True),
    ("$$s(X) | ~ $d", "cnf_formula", True), ("a | ", "cnf_formula", False), ("p(X) % note", "cnf_formula", False),
    ("cnf(a, axiom, p, [a]:b).", "tptp_input", False), ("cnf(a, axiom, p, f([a]:b)).", "tptp_input", False),
    ("cnf(a, axiom, p, $fof(p => q)).", "tptp_input", True), ("cnf(a, axiom, p, $cnf(p | ~q)).", "tptp_input", True),
    ("cnf(a, axiom, p, a:b:f(c):[d]).", "tptp_input", True), ("cnf(a,axiom,p,x,y,z).", "tptp_input", False),
    ("cnf (a , axiom , p ) .", "tptp_input", True), ("cnf(a, axiom, p)./* c */", "tptp_input", False),
    ("cnf(12, axiom, p).", "tptp_input", True), ("cnf('12', axiom, p).", "tptp_input", True),
    ("cnf('s', axiom, p).", "tptp_input", True), ("cnf(a, 'axiom', p).", "tptp_input", False),
    ("cnf(a, axiom, p, file('x.p', a)).", "tptp_input", True), ("cnf(a, axiom, p, $fot).", "tptp_input", False),
    ("cnf(a, axiom, p, f:[]).", "tptp_input", True), ("cnf(a, axiom, p, [a,]).", "tptp_input", False),
    ("cnf(a, axiom, ! [X] : p(X)).", "tptp_input", False), ("cnf(a, lemma_ish, p).", "tptp_input", False),
    ("cnf(X, axiom, p).", "tptp_input", False), ("cnf(a, axiom, p, [X, 3, 'q r', \"d\"]).", "tptp_input", False),
    ("fof(a, axiom, p).", "tptp_input", True), ("cnf(a, axiom, p, inference(r, [], [s:[bind(X, $fot(Y))]])).",
                                                  "tptp_input", True),
    ("~ a != b", "fof_formula", True), ("a => b => c", "fof_formula", False), ("a | b & c", "fof_formula", False),
    ("a | b | c", "fof_formula", True), ("(a & b) & c", "fof_formula", True), ("p <= q", "fof_formula", True),
    ("! [X] : p(X) => q(X)", "fof_formula", True), ("! [] : p", "fof_formula", False),
    ("! [X,] : p(X)", "fof_formula", False), ("? [X : $i] : p(X)", "fof_formula", False),
    ("~| p", "fof_formula", False), ("p ~| q", "fof_formula", True), ("$true & ~$false", "fof_formula", True),
    ("X", "fof_formula", False), ("p(X) = q(X)", "fof_formula", True), ("a =>b", "fof_formula", True),
    ("a = >b", "fof_formula", False), ("a <=> b <=> c", "fof_formula", False), ("(a)", "fof_formula", True),
    ("~" * 150 + "p", "fof_formula", False), ("(" * 150 + "p" + ")" * 150, "fof_formula", False),
    ("fof(a, axiom, ! [X] : ? [Y] : r(X, Y), file('p.p', a)).", "tptp_input", True),
    ("fof(a, axiom, p & q, inference(r, [status(thm)], [b]))", "tptp_input", False),
    ("tff(a, axiom, p).", "tptp_input", False), ("include('a.ax').", "tptp_input", False),
]


@pytest.mark.parametrize("text, start, quick", EDGES)
def test_edge_cases_are_read_as_the_grammar_reads_them_or_left_to_it(text, start, quick):
    assert assert_agrees(text, start) == quick


def test_inference_records_with_bindings_are_read_quickly():
    text = ("cnf(reached2, plain, at0(parcel0, depot2) | '$x'(Y), inference(resolution, [status(thm)], "
            "[route0_1:[bind(P, $fot(f(parcel0)))], reached1, inference(factor, [], [s3:c])]), [note:'a b']).")
    assert assert_agrees(text, "tptp_input")
    read = tptp._plain(text, "tptp_input")
    assert read.source.parents[0].bindings is not None


def fixture_statements():
    for path in sorted((ROOT / "fixtures").rglob("*")):
        if path.suffix in (".p", ".ax", ".txt") and path.is_file():
            text = path.read_text(encoding="utf-8", errors="replace")
            try:
                chunks = [chunk for chunk in scan(text, str(path)) if isinstance(chunk, StatementText)]
            except UnreadableInput:
                continue
            yield path, chunks


def test_every_fixture_statement_is_read_as_the_grammar_reads_it():
    answered = 0
    for path, chunks in fixture_statements():
        for chunk in chunks:
            answered += assert_agrees(chunk.text, "tptp_input")
    assert answered > 1000  # most fixture statements are plain


def test_every_native_fixture_clause_and_term_is_read_as_the_grammar_reads_it():
    answered = 0
    for path in sorted((ROOT / "fixtures").rglob("*.jsonl")):
        for line in path.read_text(encoding="utf-8").splitlines():
            try:
                record = json.loads(line)
            except ValueError:
                continue
            if not isinstance(record, dict):
                continue
            if record.get("language") == "cnf" and isinstance(record.get("formula"), str):
                answered += assert_agrees(record["formula"], "cnf_formula")
            for value in re.findall(r'"[A-Z][A-Za-z0-9_]*": "([^"]*)"', line):
                answered += assert_agrees(value, "fof_term")
    assert answered > 100


def test_past_the_literal_limit_the_grammar_gives_its_error_at_the_bar():
    with bounded(InputLimits(literals=3)):
        assert tptp._plain("a | b | c", "cnf_formula") is not None
        assert tptp._plain("a | b | c | d", "cnf_formula") is None
        with pytest.raises(UnreadableInput) as error:
            parse_clause("a | b | c | d")
    assert "more than 3 literals" in error.value.message
    assert error.value.location.column == 11


def test_past_the_name_length_limit_the_grammar_gives_its_error_at_the_word():
    with bounded(InputLimits(name_length=5)):
        assert tptp._plain("f(abcde)", "fof_term") is not None
        with pytest.raises(UnreadableInput) as error:
            parse_term("f(abcdef)")
    assert "a name of 6 characters" in error.value.message
    assert error.value.location.column == 3


def test_text_of_blanks_longer_than_the_name_limit_is_left_to_the_grammar():
    with bounded(InputLimits(name_length=5)):
        assert tptp._plain(" " * 8, "fof_term") is None
        with pytest.raises(UnreadableInput):
            parse_term(" " * 8)


def test_an_error_in_a_plain_looking_statement_is_the_grammars_at_its_place():
    text = "cnf(a1, axiom, p(X)).\ncnf(a2, axiom, p(X) | | q(X)).\n"
    with pytest.raises(UnreadableInput) as error:
        parse_tptp(text, "slip.p")
    assert str(error.value.location) == "slip.p:2:23"
    assert "unexpected '|'" in error.value.message
