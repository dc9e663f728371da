"""Naming ground terms before the counter-model search grounds clauses:
the named clauses unfold back to the input, every definition is one
application of constants, and a step with a deeply nested ground term is
screened as quickly as a flat one (right claim found, wrong one refuted by
a kernel-confirmed counter-model).

Definitional naming of subterms is the flattening of finite-model finders
in the style of the published MACE method (McCune, from memory); the
checks here are structural, by construction.  Scenario: crates in wrappers.
"""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st
from search_strategies import clauses

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.models import confirm_countermodel
from checker.kernel.terms import application, post_order, subterms
from checker.search.models import GROUND_NAME, find_countermodel, name_ground_terms
from checker.search.reconstruct import reconstruct
from formats.tptp import parse_clause


def _unfold(clause: Clause, meaning: dict) -> Clause:
    def unfolded(term):
        built = {}
        for current in post_order(term):
            if current.symbol.startswith(GROUND_NAME):
                built[current] = meaning[current]
            elif current.is_variable:
                built[current] = current
            else:
                built[current] = application(current.symbol, tuple(built[a] for a in current.arguments))
        return built[term]

    return Clause([type(l)(l.positive, unfolded(l.atom)) for l in clause.literals])


@settings(max_examples=150, deadline=None)
@given(st.lists(clauses(), min_size=1, max_size=4))
def test_named_clauses_unfold_to_the_input_and_hold_no_ground_compound_term(given_clauses):
    named = name_ground_terms(given_clauses)
    body, definitions = named[: len(given_clauses)], named[len(given_clauses):]
    meaning = {}
    for definition in definitions:
        (literal,) = definition.literals
        assert literal.positive and is_equality(literal.atom)
        applied, constant = literal.atom.arguments
        assert constant.symbol.startswith(GROUND_NAME) and constant.arity == 0 and constant not in meaning
        assert applied.arity > 0 and all(a.arity == 0 and not a.is_variable for a in applied.arguments)
        meaning[constant] = _unfold(Clause([type(literal)(True, applied)]), meaning).literals[0].atom
    for original, clause in zip(given_clauses, body):
        for literal in clause.literals:
            for _, term in subterms(literal.atom):
                assert term is literal.atom or not (term.ground and term.arity > 0)
        assert _unfold(clause, meaning).literals == original.literals


def _wrapped(depth: int) -> str:
    return "wrap(" * depth + "crate" + ")" * depth


def test_a_deep_ground_term_is_screened_and_the_bundled_step_reconstructed():
    # By construction: wrap(X) = X removes every layer, ~held(crate) resolves the other literal away.
    premises = [parse_clause(f"sealed({_wrapped(14)}) | held(crate)"), parse_clause("wrap(X) = X"),
                parse_clause("~held(crate)")]
    assert find_countermodel(premises, parse_clause("sealed(crate)"), 3, 20_000, 20_000) is None
    wrong = parse_clause("sealed(box)")
    model = find_countermodel(premises, wrong, 3, 20_000, 20_000)
    assert model is not None and confirm_countermodel(model, premises, wrong) is None
    assert reconstruct(premises, parse_clause("sealed(crate)"), "rewrite_and_simplify").evidence is not None
    assert reconstruct(premises, wrong, "rewrite_and_simplify").evidence is None
