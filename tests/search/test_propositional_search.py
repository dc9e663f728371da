"""The SAT-backed search for propositional refutations, against python-sat
as the reference: unsatisfiable clause sets get a proof the kernel accepts,
satisfiable ones get none."""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st
from pysat.solvers import Minisat22

from checker.kernel.clauses import Clause, Literal
from checker.kernel.formulas import FALSUM
from checker.kernel.propositional import check_unit_entailment, check_unit_refutation
from checker.kernel.terms import application
from checker.search.propositional import find_unit_entailment, find_unit_refutation
from formats.tptp import parse_clause, parse_formula

ATOMS = [application(name) for name in ("p", "q", "r", "s", "t")]
literals = st.builds(Literal, st.booleans(), st.sampled_from(ATOMS))
clause_sets = st.lists(st.lists(literals, min_size=1, max_size=3).map(Clause), min_size=1, max_size=12)


@settings(max_examples=300, deadline=None)
@given(clause_sets)
def test_agrees_with_python_sat(clauses):
    # python-sat (Minisat22) decides satisfiability independently of the
    # solver the search uses; unsatisfiable sets get a kernel-checked proof,
    # satisfiable ones get none.
    encode = {atom: number for number, atom in enumerate(ATOMS, 1)}
    with Minisat22(bootstrap_with=[[encode[l.atom] * (1 if l.positive else -1) for l in c.literal_set]
                                   for c in clauses]) as reference:
        unsatisfiable = not reference.solve()
    lemmas = find_unit_refutation(clauses, 10000)
    if unsatisfiable:
        assert lemmas is not None and check_unit_refutation(clauses, lemmas) is None
    else:
        assert lemmas is None
        assert check_unit_refutation(clauses, [Clause(c.literals[:1]) for c in clauses] + [Clause()]) is not None



def test_an_empty_clause_needs_no_solver():
    assert find_unit_refutation([parse_clause("p"), Clause()], 10) == [Clause()]


def test_guards_over_split_symbols():
    premises = [parse_formula("sp1 | sp2"), parse_formula("$false <= sp1"), parse_formula("$false <= (sp2 & ~sp1)")]
    lemmas = find_unit_entailment(premises, FALSUM, 1000)
    assert lemmas is not None and check_unit_entailment(premises, FALSUM, lemmas) is None
    assert find_unit_entailment(premises[:2], FALSUM, 1000) is None
