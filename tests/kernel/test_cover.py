"""The kernel's cover check: premises entail a conclusion when each clause of
the conclusion is subsumed by a clause of the premises.

That a subsumed clause follows from its subsumer is common practice (it is
the soundness half of subsumption, in every resolution textbook; Chang and
Lee, Symbolic Logic and Mechanical Theorem Proving, 1973, from memory).
Scenario (invented): fire zones of a plant, each vented or sealed and armed.
"""

from __future__ import annotations

import sympy
from hypothesis import given, settings
from hypothesis import strategies as st
from sympy.logic.inference import satisfiable

from checker.kernel.clauses import Clause, Literal
from checker.kernel.entailment import Cover, check_cover, check_entailment, cover_clauses, renamed_clause
from checker.kernel.formulas import AND, IFF, IMPLIES, OR, atomic, binary, negation
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable
from formats.tptp import parse_formula

X, Y, Z = variable("X"), variable("Y"), variable("Z")
IDENTITY = Substitution()


def test_a_distributed_formula_is_covered_clause_by_clause():
    # (v | (s & a)) is (v | s) & (v | a): distribution, by construction.
    premise = parse_formula("vented(z1) | (sealed(z1) & armed(z1))")
    conclusion = parse_formula("(sealed(z1) | vented(z1)) & (vented(z1) | armed(z1))")
    premise_clauses, conclusion_clauses, skolem = cover_clauses([premise], conclusion)
    # Every conclusion clause is also a premise clause: listed with the premises.
    assert len(premise_clauses) == 2 and conclusion_clauses == () and skolem == frozenset()
    assert check_cover([premise], conclusion, Cover(())) is None
    assert check_entailment([premise], conclusion, Cover(())) is None


def test_an_equivalence_covers_its_textbook_expansion_without_naming():
    # v <=> (s & a) is (v => s) & (v => a) & ((s & a) => v): the textbook
    # expansion of <=> (common practice).  Side by side without naming, both
    # give the clauses ~v|s, ~v|a, v|~s|~a, so nothing is left to match; a
    # named side would leave the premise with a definition atom instead.
    premise = parse_formula("vented(z1) <=> (sealed(z1) & armed(z1))")
    conclusion = parse_formula(
        "(vented(z1) => sealed(z1)) & (vented(z1) => armed(z1)) & ((sealed(z1) & armed(z1)) => vented(z1))"
    )
    premise_clauses, conclusion_clauses, _ = cover_clauses([premise], conclusion)
    assert len(premise_clauses) == 3 and conclusion_clauses == ()
    assert check_cover([premise], conclusion, Cover(())) is None


def test_a_renamed_and_shifted_quantifier_is_covered_under_a_substitution():
    # ![X] : (p(X) & r) and r & ![Y] : p(Y) are equivalent (quantifier shifting).
    premise = parse_formula("![X] : (safe(X) & alarm_off)")
    conclusion = parse_formula("alarm_off & ![Y] : safe(Y)")
    premise_clauses, conclusion_clauses, _ = cover_clauses([premise], conclusion)
    assert conclusion_clauses == (Clause([Literal(True, application("safe", (Y,)))]),)
    index = premise_clauses.index(Clause([Literal(True, application("safe", (X,)))]))
    assert check_cover([premise], conclusion, Cover(((index, Substitution({X: Y})),))) is None
    # The wrong substitution leaves a literal uncovered.
    wrong = check_cover([premise], conclusion, Cover(((index, Substitution({X: Z})),)))
    assert wrong is not None and wrong.reason == "missing_from_claimed"
    assert "conclusion clause 0" in wrong.message


def test_a_stronger_conclusion_is_not_covered():
    # vented | sealed does not entail vented (a model: sealed only).
    premise = parse_formula("vented(z1) | sealed(z1)")
    conclusion = parse_formula("vented(z1)")
    failure = check_cover([premise], conclusion, Cover(((0, IDENTITY),)))
    assert failure is not None and failure.reason == "missing_from_claimed"


def test_every_conclusion_clause_needs_a_match():
    premise = parse_formula("vented(z1) & armed(z2)")
    conclusion = parse_formula("armed(z1) & vented(z2)")
    failure = check_cover([premise], conclusion, Cover(((0, IDENTITY),)))
    assert failure is not None and failure.reason == "cover_incomplete"
    assert failure.message == "the conclusion has 2 clauses and the cover matches 1"
    failure = check_cover([premise], conclusion, Cover(((7, IDENTITY), (0, IDENTITY))))
    assert failure is not None and failure.reason == "no_such_clause"
    assert failure.message == "the premises have no clause 7"
    failure = check_cover([premise], conclusion, Cover(((-1, IDENTITY), (0, IDENTITY))))
    assert failure is not None and failure.reason == "no_such_clause"
    # One past the last premise clause (there are two) is out of range too.
    failure = check_cover([premise], conclusion, Cover(((2, IDENTITY), (0, IDENTITY))))
    assert failure is not None and failure.reason == "no_such_clause"


def test_a_conclusion_skolem_symbol_may_be_read_as_a_premise_skolem_symbol():
    # ![X] : ?[Y] : feeds(X, Y) and ![Z] : ?[W] : feeds(Z, W) are alpha-variants.
    premise = parse_formula("![X] : ?[Y] : feeds(X, Y)")
    conclusion = parse_formula("![Z] : ?[W] : feeds(Z, W)")
    premise_clauses, conclusion_clauses, skolem = cover_clauses([premise], conclusion)
    (premise_symbol,) = {t.symbol for t in premise_clauses[0].literals[0].atom.arguments if not t.is_variable}
    (conclusion_symbol,) = skolem
    match = ((0, Substitution({X: Z})),)
    assert check_cover([premise], conclusion, Cover(match, ((conclusion_symbol, premise_symbol),))) is None
    # Without the renaming the witnesses differ.
    failure = check_cover([premise], conclusion, Cover(match))
    assert failure is not None and failure.reason == "missing_from_claimed"
    del conclusion_clauses


def test_only_the_conclusions_skolem_symbols_may_be_renamed():
    # Renaming a symbol of the formulas would change what they say:
    # armed(z1) does not entail armed(z2).
    premise = parse_formula("armed(z1)")
    conclusion = parse_formula("armed(z2)")
    failure = check_cover([premise], conclusion, Cover(((0, IDENTITY),), (("z2", "z1"),)))
    assert failure is not None and failure.reason == "renames_a_symbol"
    assert failure.message == "only the conclusion's Skolem symbols may be renamed, not `z2`"


def test_a_premise_skolem_symbol_cannot_stand_for_a_given_constant():
    # ?[Y] : armed(Y) does not entail armed(z1); the premise's witness is
    # not z1, and z1 is no Skolem symbol of the conclusion to rename.
    premise = parse_formula("?[Y] : armed(Y)")
    conclusion = parse_formula("armed(z1)")
    _, _, skolem = cover_clauses([premise], conclusion)
    assert skolem == frozenset()
    failure = check_cover([premise], conclusion, Cover(((0, IDENTITY),)))
    assert failure is not None and failure.reason == "missing_from_claimed"


def test_an_existential_conclusion_is_covered_by_a_witness_of_any_name():
    # armed(z1) entails ?[Y] : armed(Y): the conclusion's witness read as z1.
    premise = parse_formula("armed(z1)")
    conclusion = parse_formula("?[Y] : armed(Y)")
    _, _, skolem = cover_clauses([premise], conclusion)
    (symbol,) = skolem
    assert check_cover([premise], conclusion, Cover(((0, IDENTITY),), ((symbol, "z1"),))) is None


def test_clauses_are_renamed_deep_inside_terms_and_keep_their_variables():
    clause = Clause([
        Literal(False, application("feeds", (application("w", (X,)), application("g", (application("w", (Y,)),))))),
        Literal(True, application("armed", (X,))),
    ])
    renamed = renamed_clause(clause, {"w": "v"})
    assert renamed == Clause([
        Literal(False, application("feeds", (application("v", (X,)), application("g", (application("v", (Y,)),))))),
        Literal(True, application("armed", (X,))),
    ])
    assert renamed_clause(clause, {}) == clause


# Random evidence against SymPy (a reference library from PyPI): whatever
# matches are proposed, an accepted cover is a true entailment.
_NAMES = ("vented", "sealed", "armed")
_propositions = st.sampled_from([atomic(application(name, ())) for name in _NAMES])
_formulas = st.recursive(
    _propositions,
    lambda children: st.one_of(st.builds(negation, children),
                               st.builds(binary, st.sampled_from((AND, OR, IMPLIES, IFF)), children, children)),
    max_leaves=6,
)
_SYMPY = {AND: sympy.And, OR: sympy.Or, IMPLIES: sympy.Implies, IFF: sympy.Equivalent}


def _to_sympy(formula):
    if formula.connective == "atom":
        return sympy.Symbol(formula.atom.symbol)
    if formula.connective == "~":
        return sympy.Not(_to_sympy(formula.arguments[0]))
    return _SYMPY[formula.connective](*(_to_sympy(a) for a in formula.arguments))


@settings(max_examples=60, deadline=None)
@given(_formulas, _formulas, st.data())
def test_a_cover_with_random_matches_is_accepted_only_for_an_entailment(premise, conclusion, data):
    premise_clauses, conclusion_clauses, _ = cover_clauses([premise], conclusion)
    if not premise_clauses:
        return
    matches = tuple(
        (data.draw(st.integers(0, len(premise_clauses) - 1)), IDENTITY) for _ in conclusion_clauses
    )
    if check_cover([premise], conclusion, Cover(matches)) is None:
        assert satisfiable(sympy.And(_to_sympy(premise), sympy.Not(_to_sympy(conclusion)))) is False


def test_a_conclusion_symbol_named_like_a_kernel_skolem_symbol_is_not_one():
    # ?[X] : armed(X) does not entail armed(skolem_1) for a given skolem_1
    # (a model: skolem_1 unarmed, something else armed).  The kernel's own
    # witness takes another name, and skolem_1 may not be renamed.
    premise = parse_formula("?[X] : armed(X)")
    conclusion = parse_formula("armed(skolem_1)")
    premise_clauses, conclusion_clauses, skolem = cover_clauses([premise], conclusion)
    assert skolem == frozenset() and premise_clauses != conclusion_clauses
    assert check_cover([premise], conclusion, Cover(((0, IDENTITY),))).reason == "missing_from_claimed"
    renamed = check_cover([premise], conclusion, Cover(((0, IDENTITY),), (("skolem_1", "skolem_2"),)))
    assert renamed.reason == "renames_a_symbol"
