"""Writing equivalences out as implications keeps a formula's meaning.

Oracle: SymPy's propositional logic (a reference library from PyPI), on
random propositional formulas; and a quantified formula from a badge-access
scenario (invented) whose existential only becomes Skolemizable once its
equivalence is written out.
"""

from hypothesis import given, settings
from search_strategies import propositional_formulas, to_sympy
from sympy.logic.boolalg import Equivalent, Not
from sympy.logic.inference import satisfiable

from checker.kernel.formulas import (
    AND,
    EXISTS,
    IFF,
    IMPLIES,
    OR,
    XOR,
    Formula,
    subformulas_with_polarity,
)
from checker.search.equivalences import has_equivalence, without_equivalences
from formats.tptp import parse_tptp

NAMES = ("p", "q", "r")
CONNECTIVES = (AND, OR, IMPLIES, IFF, XOR)
formulas = propositional_formulas(NAMES, CONNECTIVES, max_leaves=8)


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
