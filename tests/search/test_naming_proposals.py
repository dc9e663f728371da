"""The search that proposes a definition for a name the prover never defined.

What a proposal must be is Tseitin's definitional naming (G. S. Tseitin,
"On the Complexity of Derivation in Propositional Calculus", 1968; in the
first-order form of A. Nonnengart and C. Weidenbach, "Computing Small
Clause Normal Forms", 2001, from memory): the name applied to exactly the
free variables of a subformula, equivalent to it.  The kernel's
check_definition is the judge of that shape; these tests hold every
proposal to it.
"""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.formulas import (
    AND,
    IFF,
    IMPLIES,
    OR,
    FORALL,
    atomic,
    binary,
    free_variables,
    negation,
    quantified,
    subformulas_with_polarity,
)
from checker.kernel.introductions import check_definition
from checker.kernel.terms import application, variable
from checker.search.miniscoping import miniscoped
from checker.search.namings import choose_definition, introduction, proposals
from checker.search.reconstruct import DEFAULT_LIMITS
from formats.tptp import read_tptp

X, Y = variable("X"), variable("Y")
ATOMS = [atomic(application(name, args)) for name, args in (("p", (X,)), ("q", (X, Y)), ("r", (Y,)), ("s", ()))]


def _formulas():
    leaves = st.sampled_from(ATOMS)
    return st.recursive(
        leaves,
        lambda inner: st.one_of(
            inner.map(negation),
            st.tuples(st.sampled_from((AND, OR, IMPLIES, IFF)), inner, inner).map(lambda t: binary(*t)),
        ),
        max_leaves=8,
    )


def _body(definition):
    while definition.connective == FORALL:
        definition = definition.arguments[0]
    return definition


@settings(max_examples=150, deadline=None)
@given(_formulas(), st.integers(min_value=0, max_value=2))
def test_every_proposal_has_the_shape_the_kernel_accepts_and_names_a_subformula(body, arity):
    premise = quantified(FORALL, (X, Y), body)
    conclusion = atomic(application("sP9", tuple(variable(f"X{i}") for i in range(arity))))
    # Subformulas of the premise, or of the premise miniscoped (the
    # components a prover that splits clauses names).
    subformulas = {f for form in (premise, miniscoped(premise)) for f, _ in subformulas_with_polarity(form)}
    for definition in proposals(("sP9", arity), [premise], conclusion):
        assert check_definition(definition, ("sP9", arity)) is None
        named = _body(definition).arguments[1]
        assert named in subformulas
        assert len(free_variables(named)) == arity


def _steps(tmp_path, text):
    (tmp_path / "proof.p").write_text(text)
    return {s.name: s for s in read_tptp(str(tmp_path / "proof.p")).statements}


def test_the_argument_order_follows_how_the_name_is_applied(tmp_path):
    # sP1(X1,X0) names `q(X,Y) & r(Y)` with its arguments swapped: the
    # first proposal puts Y first, as the conclusion's `p`-free literal
    # `~ q(X0,X1)` pairs X with X0 and Y with X1.
    steps = _steps(
        tmp_path,
        "fof(l1, axiom, ! [X,Y] : (~ q(X,Y) | (q(X,Y) & r(Y)))).\n"
        "cnf(c1, plain, ~ q(X0,X1) | sP1(X1,X0), inference(cnf_transformation, [], [l1])).\n",
    )
    first = proposals(("sP1", 2), [steps["l1"].content], steps["c1"].content)
    assert str(first[0]).startswith("! [Y,X] : (sP1(Y,X) <=>")


def test_one_definition_serves_every_step_that_introduces_the_name(tmp_path):
    # Common practice (clausification by naming): `~ ships | held | sP1` and
    # `~ sP1 | labelled` both come from naming `wrapped & labelled`.
    steps = _steps(
        tmp_path,
        "fof(l1, axiom, ! [X] : (ships(X) => (held(X) | (wrapped(X) & labelled(X))))).\n"
        "cnf(c1, plain, ~ ships(X0) | held(X0) | sP1(X0), inference(cnf_transformation, [], [l1])).\n"
        "cnf(c2, plain, ~ sP1(X0) | labelled(X0), inference(cnf_transformation, [], [l1])).\n",
    )
    group = tuple(introduction([steps["l1"].content], steps[name].content) for name in ("c1", "c2"))
    chosen = choose_definition(("sP1", 1), group, DEFAULT_LIMITS)
    assert str(chosen) == "! [X] : (sP1(X) <=> (wrapped(X) & labelled(X)))"
    # The choice depends on the whole group, not on which step asks first.
    assert choose_definition(("sP1", 1), group[::-1], DEFAULT_LIMITS) is not None


def test_no_definition_when_no_subformula_has_the_right_free_variables(tmp_path):
    steps = _steps(
        tmp_path,
        "fof(l1, axiom, ! [X,Y] : q(X,Y)).\n"
        "cnf(c1, plain, sP1(X0), inference(cnf_transformation, [], [l1])).\n",
    )
    assert proposals(("sP1", 1), [steps["l1"].content], steps["c1"].content) == []
    group = (introduction([steps["l1"].content], steps["c1"].content),)
    assert choose_definition(("sP1", 1), group, DEFAULT_LIMITS) is None
