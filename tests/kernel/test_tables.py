"""Tests of forgetting the terms and formulas made after a mark (between
files): what was made before stays the one object for its value, what
was made after is made anew, and the tables shrink back to the mark.
Common practice for hash-consing with generations."""

from __future__ import annotations

from checker.kernel import formulas, terms
from checker.kernel.formulas import atomic, free_variables, negation
from checker.kernel.terms import application, variable


def test_terms_made_after_the_mark_are_forgotten_and_earlier_ones_kept():
    kept = application("crane_kept", (variable("Load"),))
    mark = terms.table_size()
    later = application("crane_later", (kept, application("bay9")))
    assert terms.table_size() == mark + 2
    terms.forget_terms_since(mark)
    assert terms.table_size() == mark
    assert application("crane_kept", (variable("Load"),)) is kept
    remade = application("crane_later", (kept, application("bay9")))
    assert remade is not later and str(remade) == str(later)
    terms.forget_terms_since(mark)


def test_formulas_made_after_the_mark_are_forgotten_with_their_memo():
    kept = atomic(application("hoist_ready", (variable("H"),)))
    assert free_variables(kept) == {variable("H")}
    mark_terms, mark = terms.table_size(), formulas.table_size()
    later = negation(atomic(application("hoist_jammed", (variable("J"),))))
    assert free_variables(later) == {variable("J")}
    formulas.forget_formulas_since(mark)
    terms.forget_terms_since(mark_terms)
    assert formulas.table_size() == mark
    assert atomic(application("hoist_ready", (variable("H"),))) is kept
    assert free_variables(kept) == {variable("H")}
    remade = negation(atomic(application("hoist_jammed", (variable("J"),))))
    assert remade is not later and str(remade) == str(later)
    assert free_variables(remade) == {variable("J")}
    formulas.forget_formulas_since(mark)
    terms.forget_terms_since(mark_terms)
