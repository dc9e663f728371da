"""Writing native certificates: parse -> write -> parse gives the same
statements, for every rule's evidence, and the writer refuses what version
1 cannot say."""

from __future__ import annotations

import io
import json
from pathlib import Path

import jsonschema
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.clauses import Clause, Literal
from checker.kernel.rules import (
    Chain,
    EqualityFactoring,
    EqualityResolution,
    Instantiation,
    Paramodulation,
    Refutation,
    Resolution,
)
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import Term, application, variable
from formats.derivation import Document, Inference, Location, Origin, Parent, Statement
from formats.native import NativeHeader, parse_native, parse_native_header, read_native, write_native
from formats.tptp import parse_formula

ROOT = Path(__file__).resolve().parents[2]
FIXTURES = sorted([*(ROOT / "fixtures" / "native").glob("*.jsonl"), *(ROOT / "fixtures" / "demo").glob("*.jsonl")])
SCHEMA = json.loads((ROOT / "formats" / "native_certificate.schema.json").read_text(encoding="utf-8"))
HERE = Location("<test>", 1, 1)


def _written(document: Document, header: NativeHeader | None = None) -> str:
    out = io.StringIO()
    write_native(document, out, header)
    return out.getvalue()


def _meaning(statement: Statement) -> tuple:
    """Everything a statement says, with clauses in written literal order
    (evidence indices depend on it); the location is where it was read."""
    content = statement.content
    written = content.literals if isinstance(content, Clause) else content
    return statement.name, statement.role, statement.language, written, statement.source


def _round_trip(document: Document) -> Document:
    return parse_native(_written(document))


@pytest.mark.parametrize("path", FIXTURES, ids=lambda p: p.name)
def test_fixtures_survive_a_round_trip(path):
    document = read_native(str(path))
    again = _round_trip(document)
    assert [_meaning(s) for s in again.statements] == [_meaning(s) for s in document.statements]


@pytest.mark.parametrize("path", FIXTURES, ids=lambda p: p.name)
def test_written_records_are_valid_under_the_schema(path):
    validator = jsonschema.Draft202012Validator(SCHEMA)
    for line in _written(read_native(str(path))).splitlines():
        assert validator.is_valid(json.loads(line)), line


# ------------------------------------------------------- every rule, non-default fields

X, Y, Z = variable("X"), variable("Y"), variable("Z")
a, b = application("a"), application("b")


def f(term: Term) -> Term:
    return application("f", (term,))


def p(*terms: Term) -> Term:
    return application("p", terms)


def _clause(*literals: tuple[bool, Term]) -> Clause:
    return Clause(Literal(positive, atom) for positive, atom in literals)


SIGMA = Substitution({X: f(Y), Y: a})
TAU = Substitution({Z: b})
EVERY_EVIDENCE = {
    "instantiation": Instantiation(0, SIGMA),
    "resolution": Resolution(1, 2, 0, 1, SIGMA, TAU),
    "paramodulation": Paramodulation(1, 0, False, 0, 2, (2, 1), SIGMA, TAU),
    "equality_resolution": EqualityResolution(0, 1, TAU),
    "equality_factoring": EqualityFactoring(0, 2, 1, True, True, SIGMA),
    "chain": Chain((Resolution(0, 0, 1, 0), Instantiation(2, TAU), Paramodulation(0, 1, True, 3, 0, (1,)))),
    "refutation": Refutation(Chain((Resolution(0, 0, 2, 0, SIGMA), EqualityResolution(3, 0)))),
}


def _document_with(evidence, theta: Substitution | None) -> Document:
    leaf = Statement("leaf", "axiom", "cnf", _clause((True, p(X)), (False, application("=", (X, f(a))))), HERE, Origin("unknown"))
    other = Statement("other", "hypothesis", "cnf", _clause((False, p(a, b))), HERE, Origin("file", ("j.p", "o")))
    step = Statement(
        "step",
        "plain",
        "cnf",
        _clause((True, p(f(a))), (False, p(Y, Z))),
        HERE,
        Inference("rule-name-ignored", "thm", (Parent("leaf"), Parent("other"), Parent("leaf")), evidence, theta),
    )
    return Document("<test>", (leaf, other, step), format="native")


@pytest.mark.parametrize("rule", sorted(EVERY_EVIDENCE))
def test_every_rule_survives_a_round_trip(rule):
    evidence = EVERY_EVIDENCE[rule]
    theta = None if rule == "refutation" else Substitution({Y: b})
    document = _document_with(evidence, theta)
    again = _round_trip(document)
    step = again.statements[-1]
    assert step.source == Inference(rule, "thm", (Parent("leaf"), Parent("other"), Parent("leaf")), evidence, theta)
    assert [_meaning(s) for s in again.statements[:-1]] == [_meaning(s) for s in document.statements[:-1]]


def test_writer_leaves_out_default_fields_and_keeps_an_empty_theta():
    document = _document_with(Resolution(0, 0, 1, 0), IDENTITY)
    record = json.loads(_written(document).splitlines()[-1])
    assert record["inference"] == {
        "rule": "resolution", "parents": ["leaf", "other", "leaf"], "status": "thm",
        "left": 0, "left_literal": 0, "right": 1, "right_literal": 0, "theta": {},
    }
    assert _round_trip(document).statements[-1].source.theta == IDENTITY


def test_header_survives_a_round_trip():
    header = NativeHeader(problem="junction_j4.p", producer="rail-prover 0.3", comment="j4 → j5")
    text = _written(Document("<test>", ()), header)
    assert parse_native_header(text) == header
    assert parse_native_header(_written(Document("<test>", ()))) == NativeHeader()


def test_formula_statements_and_unknown_sources_are_written():
    formula = parse_formula("! [S] : ((clear(ahead(S)) & ~ 'Signal at danger'(S)) => proceed(S))")
    no_source = Statement("rule", "axiom", "fof", formula, HERE, None)
    step = Statement("again", "plain", "fof", formula, HERE, Inference("variable_renaming", "eqv", (Parent("rule"),)))
    again = _round_trip(Document("<test>", (no_source, step)))
    assert again.statements[0].content is formula
    assert again.statements[0].source == Origin("unknown")
    assert again.statements[1].source == Inference("variable_renaming", "eqv", (Parent("rule"),))


def test_stated_parent_bindings_are_not_written():
    document = _document_with(Instantiation(0, SIGMA), None)
    step = document.statements[-1]
    bound = Inference(step.source.rule, "thm", (Parent("leaf", SIGMA),), step.source.evidence)
    again = _round_trip(Document("<test>", (*document.statements[:-1], Statement("step", "plain", "cnf", step.content, HERE, bound))))
    assert again.statements[-1].source.parents == (Parent("leaf"),)


@pytest.mark.parametrize(
    "source, words",
    [
        (Inference("resolution", "thm", (Parent("leaf"),)), "rule 'resolution' needs evidence"),
        (Inference("chain", "thm", (Parent("leaf"),)), "rule 'chain' needs evidence"),
        (Inference("r", "thm", (Inference("s", "thm", (Parent("leaf"),)),)), "a nested inference has no name"),
        (Inference("r", "thm", (Parent("leaf"),), evidence="not evidence"), "no native rule writes evidence of type str"),
    ],
)
def test_writer_refuses_what_version_1_cannot_say(source, words):
    leaf = Statement("leaf", "axiom", "cnf", _clause((True, p(a))), HERE, Origin("unknown"))
    step = Statement("step", "plain", "cnf", _clause((True, p(a))), HERE, source)
    with pytest.raises(ValueError, match=words):
        _written(Document("<test>", (leaf, step)))


# ------------------------------------------------------- property: random evidence

terms = st.recursive(
    st.sampled_from([variable("X"), variable("Y"), variable("Long_Name_2"), application("a"), application("'Valve 3'")]),
    lambda inner: st.one_of(
        st.builds(lambda t: application("f", (t,)), inner),
        st.builds(lambda s, t: application("g", (s, t)), inner, inner),
    ),
    max_leaves=6,
)
substitutions = st.dictionaries(st.sampled_from([X, Y, Z, variable("Long_Name_2")]), terms, max_size=3).map(Substitution)
indices = st.integers(min_value=0, max_value=7)
positions = st.lists(st.integers(min_value=1, max_value=4), max_size=4).map(tuple)
primitive_evidence = st.one_of(
    st.builds(Instantiation, indices, substitutions),
    st.builds(Resolution, indices, indices, indices, indices, substitutions, substitutions),
    st.builds(Paramodulation, indices, indices, st.booleans(), indices, indices, positions, substitutions, substitutions),
    st.builds(EqualityResolution, indices, indices, substitutions),
    st.builds(EqualityFactoring, indices, indices, indices, st.booleans(), st.booleans(), substitutions),
)
any_evidence = st.one_of(
    primitive_evidence,
    st.lists(primitive_evidence, min_size=1, max_size=4).map(lambda steps: Chain(tuple(steps))),
    st.lists(primitive_evidence, min_size=1, max_size=4).map(lambda steps: Refutation(Chain(tuple(steps)))),
)
literals = st.builds(
    Literal,
    st.booleans(),
    st.one_of(
        st.builds(lambda t: application("p", (t,)), terms),
        st.builds(lambda s, t: application("=", (s, t)), terms, terms),
        st.just(application("'Alarm raised'")),
    ),
)


@settings(max_examples=150, deadline=None)
@given(evidence=any_evidence, claimed=st.lists(literals, max_size=4), theta=st.none() | substitutions)
def test_random_evidence_and_clauses_survive_a_round_trip(evidence, claimed, theta):
    if isinstance(evidence, Refutation):
        theta = None
    step = Statement("step", "plain", "cnf", Clause(claimed), HERE, Inference("x", "thm", (Parent("a"), Parent("b")), evidence, theta))
    (again,) = _round_trip(Document("<test>", (step,))).statements
    assert again.content.literals == step.content.literals
    assert again.source.evidence == evidence
    assert again.source.theta == theta
