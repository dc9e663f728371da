"""Fuzzing the readers: grammar-shaped random statements, whole or with
tokens dropped, doubled or swapped, and random byte edits of the native
fixture.  A reader returns a document or raises UnreadableInput with a
place inside the text; nothing else escapes it.

Common practice (grammar-based fuzzing): input shaped by the grammar
reaches the parser's deeper states, where uniform random bytes stop at the
first token.  Shapes follow the TPTP syntax BNF rules named beside them.
"""

import json
import subprocess
import sys
from pathlib import Path

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from checker.outcomes import INTERNAL_ERROR, UNREADABLE
from checker.run import check
from formats.derivation import UnreadableInput
from formats.native import parse_native
from formats.tptp import parse_tptp

ROOT = Path(__file__).resolve().parents[2]
NATIVE = [ROOT / "fixtures" / "demo" / "interlock.jsonl", ROOT / "fixtures" / "native" / "every_rule_signalling.jsonl"]

# <lower_word>, <upper_word>, <single_quoted>, <dollar_word>, <number>, <distinct_object>
functors = st.sampled_from(["valve", "pump", "open", "f", "g", "'Main gate'", "$sum", "next"])
constants = st.sampled_from(["v1", "p2", "0", "-3", "2.5", "1/3", '"red"', "'dock 4'", "$true", "$false"])
variables = st.sampled_from(["X", "Y", "Z", "X1", "Valve"])


def terms(depth: int = 3):
    """<fof_term>: a variable, a constant or a function term."""
    leaves = st.one_of(variables, constants)
    return st.recursive(
        leaves,
        lambda inner: st.builds(lambda f, args: f"{f}({','.join(args)})", functors, st.lists(inner, min_size=1, max_size=3)),
        max_leaves=depth * 3,
    )


# <fof_atomic_formula>, <fof_defined_infix_formula>, <fof_infix_unary>
atoms = st.one_of(
    st.builds(lambda p, args: f"{p}({','.join(args)})", functors, st.lists(terms(), min_size=1, max_size=3)),
    st.builds(lambda a, b: f"{a} = {b}", terms(), terms()),
    st.builds(lambda a, b: f"{a} != {b}", terms(), terms()),
    st.sampled_from(["alarm", "$true", "$false"]),
)
# <literal> and <disjunction>
literals = st.one_of(atoms, atoms.map(lambda a: f"~ {a}" if "=" not in a else a))
clauses = st.lists(literals, min_size=1, max_size=4).map(" | ".join)

# <fof_logic_formula>: binary, unary, quantified, bracketed
connectives = st.sampled_from(["&", "|", "=>", "<=", "<=>", "<~>", "~|", "~&"])
formulas = st.recursive(
    atoms,
    lambda inner: st.one_of(
        st.builds(lambda a, c, b: f"({a} {c} {b})", inner, connectives, inner),
        inner.map(lambda a: f"~ ({a})"),
        st.builds(lambda q, vs, a: f"{q} [{','.join(vs)}] : ({a})", st.sampled_from("!?"),
                  st.lists(variables, min_size=1, max_size=2, unique=True), inner),
    ),
    max_leaves=6,
)
# <source>: a file or an inference record, possibly nested
sources = st.one_of(
    st.just("file('problem.p', ax1)"),
    st.builds(lambda r, s, ps: f"inference({r}, [status({s})], [{','.join(ps)}])",
              st.sampled_from(["resolve", "factor", "skolemize", "'rewrite chain'"]),
              st.sampled_from(["thm", "esa", "cth", "unknown"]),
              st.lists(st.sampled_from(["s0", "s1", "s2", "inference(r, [], [s0])", "s1:[bind(X, $fot(a))]"]),
                       min_size=1, max_size=3)),
    st.just("introduced(definition)"),
)
roles = st.sampled_from(["axiom", "plain", "negated_conjecture", "conjecture", "hypothesis"])


@st.composite
def statements(draw) -> str:
    """<cnf_annotated> or <fof_annotated>, with or without annotations."""
    name = draw(st.sampled_from(["s0", "s1", "s2", "c_0_7", "42"]))
    if draw(st.booleans()):
        body, language = draw(clauses), "cnf"
    else:
        body, language = draw(formulas), "fof"
    annotation = f", {draw(sources)}" if draw(st.booleans()) else ""
    return f"{language}({name}, {draw(roles)}, {body}{annotation}).\n"


TOKEN = r"[A-Za-z0-9_$'\"]+|\S"


@st.composite
def damaged(draw):
    """Generated statements with a few tokens dropped, doubled or moved."""
    import re

    text = "".join(draw(st.lists(statements(), min_size=1, max_size=4)))
    tokens = re.findall(TOKEN + r"|\s+", text)
    for _ in range(draw(st.integers(1, 3))):
        at = draw(st.integers(0, len(tokens) - 1))
        kind = draw(st.integers(0, 2))
        if kind == 0:
            del tokens[at]
        elif kind == 1:
            tokens.insert(at, tokens[at])
        else:
            other = draw(st.integers(0, len(tokens) - 1))
            tokens[at], tokens[other] = tokens[other], tokens[at]
        if not tokens:
            tokens = ["%"]
    return "".join(tokens)


def assert_located(error: UnreadableInput, text: str, file: str) -> None:
    assert error.location.file == file
    assert 1 <= error.location.line <= text.count("\n") + 1
    assert error.location.column >= 1
    assert error.message


@settings(max_examples=40, deadline=None)
@given(st.lists(statements(), min_size=1, max_size=5))
def test_grammar_shaped_statements_are_read_one_statement_each(texts):
    document = parse_tptp("".join(texts), "generated.p")
    assert len(document.statements) == len(texts)
    assert [s.location.line for s in document.statements] == list(range(1, len(texts) + 1))


@settings(max_examples=60, deadline=None)
@given(damaged())
def test_damaged_statements_are_read_or_unreadable_at_a_place_in_the_text(text):
    try:
        parse_tptp(text, "damaged.p")
    except UnreadableInput as error:
        assert_located(error, text, "damaged.p")


@settings(max_examples=60, deadline=None)
@given(st.sampled_from(NATIVE), st.data())
def test_byte_edited_native_certificates_are_read_or_unreadable_at_a_place(source, data):
    raw = source.read_bytes()
    for _ in range(data.draw(st.integers(1, 3))):
        at = data.draw(st.integers(0, len(raw)))
        if data.draw(st.booleans()):
            raw = raw[:at] + data.draw(st.binary(min_size=1, max_size=3)) + raw[at:]
        else:
            raw = raw[:at] + raw[at + data.draw(st.integers(1, 10)):]
    text = raw.decode("utf-8", errors="replace")
    try:
        parse_native(text, "edited.jsonl")
    except UnreadableInput as error:
        assert_located(error, text, "edited.jsonl")


@settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(damaged())
def test_damaged_derivations_through_the_whole_pipeline_never_end_in_an_internal_error(tmp_path, text):
    path = tmp_path / "damaged.p"
    path.write_text(text)
    report = check(str(path))
    assert report.verdict != INTERNAL_ERROR, report.error
    if report.verdict == UNREADABLE:
        assert report.error.startswith(f"{path}:")


def test_command_line_answers_byte_edited_files_with_an_exit_code_and_no_traceback(tmp_path):
    # fixed edits (a cut bracket, a stray byte, a doubled record), so that this
    # one slow test through a fresh interpreter stays deterministic
    proof = (ROOT / "fixtures" / "tptp" / "pelletier" / "p41_refutation.p").read_text()
    certificate = NATIVE[0].read_text()
    cases = {
        "cut.p": proof.replace(")", "", 3),
        "stray.p": proof.replace("cnf(", "cnf(\x00", 1),
        "doubled.jsonl": certificate + certificate.split("\n", 2)[1] + "\n",
    }
    for name, text in cases.items():
        (tmp_path / name).write_text(text)
    done = subprocess.run(
        [sys.executable, "-m", "checker", "check", *sorted(cases), "--report", "json"],
        capture_output=True, text=True, cwd=tmp_path, env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"},
    )
    assert "Traceback" not in done.stderr
    assert done.returncode in (1, 2, 3), done.stderr
    json.loads(done.stdout)
