"""Writing equivalences out as implications keeps a formula's meaning.

Oracle: SymPy's propositional logic (a reference library from PyPI), on
random propositional formulas; and a quantified formula from a badge-access
scenario (invented) whose existential only becomes Skolemizable once its
equivalence is written out.
"""

import sympy
from hypothesis import given, settings
from hypothesis import strategies as st
from sympy.logic.boolalg import And, Equivalent, Implies, Not, Or, Xor
from sympy.logic.inference import satisfiable

from checker.kernel.formulas import (
    AND, ATOM, EXISTS, FALSUM, IFF, IMPLIES, OR, VERUM, XOR, Formula, atomic, binary, negation,
    subformulas_with_polarity,
)
from checker.kernel.terms import application
from checker.search.equivalences import has_equivalence, without_equivalences
from formats.tptp import parse_tptp

NAMES = ("p", "q", "r")
CONNECTIVES = (AND, OR, IMPLIES, IFF, XOR)
SYMPY = {AND: And, OR: Or, IMPLIES: Implies, IFF: Equivalent, XOR: Xor}
propositions = st.sampled_from([atomic(application(n, ())) for n in NAMES] + [VERUM, FALSUM])
formulas = st.recursive(
    propositions,
    lambda children: st.one_of(st.builds(negation, children),
                               st.builds(binary, st.sampled_from(CONNECTIVES), children, children)),
    max_leaves=8,
)


def to_sympy(formula: Formula):
    if formula.connective == ATOM:
        return sympy.Symbol(formula.atom.symbol)
    if formula is VERUM:
        return sympy.true
    if formula is FALSUM:
        return sympy.false
    if formula.connective == "~":
        return Not(to_sympy(formula.arguments[0]))
    return SYMPY[formula.connective](*(to_sympy(a) for a in formula.arguments))


def connectives(formula: Formula) -> set[str]:
    return {f.connective for f, _ in subformulas_with_polarity(formula)}


@settings(max_examples=200, deadline=None)
@given(formulas)
def test_written_out_formula_is_equivalent_and_has_no_equivalence(formula):
    written = without_equivalences(formula)
    assert not has_equivalence(written) and not {IFF, XOR} & connectives(written)
    # SymPy: the two are equivalent when their non-equivalence is unsatisfiable.
    assert satisfiable(Not(Equivalent(to_sympy(formula), to_sympy(written)))) is False


def test_an_existential_under_an_equivalence_gets_a_positive_occurrence():
    text = "fof(staff_rule, axiom, ! [P] : (staff(P) <=> ? [B] : (badge(B) & holds(P, B))))."
    formula = parse_tptp(text).statements[0].content
    polarities = {p for f, p in subformulas_with_polarity(formula) if f.connective == EXISTS}
    written = {p for f, p in subformulas_with_polarity(without_equivalences(formula)) if f.connective == EXISTS}
    assert has_equivalence(formula)
    assert polarities == {0} and written == {1, -1}
