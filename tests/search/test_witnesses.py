"""Guessing Skolem witnesses (untrusted): which quantifier a new symbol
witnesses, and which terms stand for bound variables in an axiom of choice.
Whatever is guessed here is judged again by the kernel."""

from checker.kernel.introductions import skolemize
from checker.kernel.terms import application, variable
from checker.search.witnesses import Misfit, Witnessing, matching_witnesses, next_witness
from formats.tptp import parse_clause, parse_formula

V, S, W0 = variable("V"), variable("S"), variable("W0")


def test_a_renamed_use_falls_back_to_the_quantifiers_own_variables():
    # Common practice: a clausified conclusion renames variables (X1 for V);
    # the witness is then built over the quantifier's free variables.
    premise = parse_formula("! [V] : ? [S] : monitors(S, V)")
    proposal = next_witness([premise], parse_clause("monitors(sensor_of(X1), X1)"), {("sensor_of", 1)})
    assert isinstance(proposal, Witnessing)
    assert proposal.bound is S and proposal.witness is application("sensor_of", (V,))
    result = skolemize(premise, proposal.quantifier, {proposal.bound: proposal.witness})
    assert result is parse_formula("! [V] : monitors(sensor_of(V), V)")


def test_a_symbol_taking_more_arguments_is_padded_with_new_variables():
    premise = parse_formula("! [V] : ? [S] : monitors(S, V)")
    proposal = next_witness([premise], parse_clause("monitors(sensor_of(X1, X2), X1)"), {("sensor_of", 2)})
    assert proposal.witness is application("sensor_of", (V, W0))


def test_symbols_that_fit_no_quantifier_are_misfits():
    no_quantifier = next_witness([parse_formula("p(a)")], parse_clause("p(sk)"), {("sk", 0)})
    assert isinstance(no_quantifier, Misfit) and no_quantifier.reason == "no_quantifier"
    negative = next_witness([parse_formula("~ (? [X] : p(X))")], parse_clause("~ p(sk)"), {("sk", 0)})
    assert isinstance(negative, Misfit) and negative.reason == "wrong_polarity"


def test_matching_witnesses_walks_both_formulas_in_step():
    quantifier = parse_formula("? [Y] : (p(X, Y) & q(Y))")
    assert matching_witnesses(quantifier, parse_formula("p(X, f(X)) & q(f(X))")) == {
        variable("Y"): parse_formula("q(f(X))").atom.arguments[0]
    }
    # Different shapes, a variable standing for two terms, a clash elsewhere.
    assert matching_witnesses(quantifier, parse_formula("p(X, f(X)) | q(f(X))")) is None
    assert matching_witnesses(quantifier, parse_formula("p(X, f(X)) & q(g(X))")) is None
    assert matching_witnesses(quantifier, parse_formula("p(Z, f(X)) & q(f(X))")) is None
    assert matching_witnesses(quantifier, parse_formula("r(X, f(X)) & q(f(X))")) is None
