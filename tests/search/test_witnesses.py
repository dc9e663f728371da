"""Guessing Skolem witnesses (untrusted): which quantifier a new symbol
witnesses, and which terms stand for bound variables in an axiom of choice.
Whatever is guessed here is judged again by the kernel."""

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.failure import Failure
from checker.kernel.formulas import alpha_equivalent
from checker.kernel.introductions import skolemize
from checker.kernel.terms import application, variable
from checker.search.witnesses import matching_witnesses, readings_with_anonymous_outer, witness_readings
from formats.tptp import parse_clause, parse_formula

V, S, W0 = variable("V"), variable("S"), variable("W0")


def kernel_replace(premise, witnessing):
    replaced = skolemize(premise, witnessing.quantifier, {witnessing.bound: witnessing.witness})
    return None if isinstance(replaced, Failure) else replaced


def readings(premises, conclusion, symbols, bound=64):
    return witness_readings(premises, conclusion, set(symbols), bound, kernel_replace)


def replayed(premises, reading):
    premises = list(premises)
    for witnessing in reading:
        premises[witnessing.premise] = kernel_replace(premises[witnessing.premise], witnessing)
    return premises


def test_a_renamed_use_falls_back_to_the_quantifiers_own_variables():
    # Common practice: a clausified conclusion renames variables (X1 for V);
    # the witness is then built over the quantifier's free variables.
    premise = parse_formula("! [V] : ? [S] : monitors(S, V)")
    found = readings([premise], parse_clause("monitors(sensor_of(X1), X1)"), {("sensor_of", 1)})
    first = found.found[0][0]
    assert first.bound is S and first.witness is application("sensor_of", (V,))
    assert replayed([premise], found.found[0]) == [parse_formula("! [V] : monitors(sensor_of(V), V)")]
    # One quantifier, one symbol of arity one: that reading (or none) is all there is.
    assert found.exhaustive and len(found.found) == 1


def test_a_symbol_taking_more_arguments_is_placed_every_way():
    premise = parse_formula("! [V] : ? [S] : monitors(S, V)")
    found = readings([premise], parse_clause("monitors(sensor_of(X1, X2), X1)"), {("sensor_of", 2)})
    witnesses = [reading[0].witness for reading in found.found]
    assert witnesses == [application("sensor_of", (V, W0)), application("sensor_of", (W0, V))]
    assert found.exhaustive


def test_arguments_in_any_order_are_readings():
    # A prover may order a Skolem function's arguments as it likes
    # (common practice); every order of the free variables is tried.
    premise = parse_formula("! [A, B, C] : ? [D] : links(A, B, C, D)")
    found = readings([premise], parse_clause("links(X0, X1, X2, sk(X2, X1, X0))"), {("sk", 3)})
    assert found.exhaustive and len(found.found) == 6
    a, b, c = (variable(name) for name in "ABC")
    assert application("sk", (c, b, a)) in [reading[0].witness for reading in found.found]


def test_symbols_numbered_against_the_order_of_the_quantifiers_are_paired_both_ways():
    premise = parse_formula("? [X] : ? [Y] : (p(X) & q(Y))")
    found = readings([premise], parse_formula("p(sK3) & q(sK1)"), {("sK3", 0), ("sK1", 0)})
    conclusion = parse_formula("p(sK3) & q(sK1)")
    assert any(alpha_equivalent(replayed([premise], r)[0], conclusion) for r in found.found)
    assert found.exhaustive


def test_symbols_that_fit_no_quantifier_are_misfits():
    no_quantifier = readings([parse_formula("p(a)")], parse_clause("p(sk)"), {("sk", 0)})
    assert no_quantifier.found == () and no_quantifier.misfit.reason == "no_quantifier"
    negative = readings([parse_formula("~ (? [X] : p(X))")], parse_clause("~ p(sk)"), {("sk", 0)})
    assert negative.misfit.reason == "wrong_polarity"
    short = readings([parse_formula("! [X] : ? [Y] : r(X, Y)")], parse_clause("r(X, sk)"), {("sk", 0)})
    assert short.misfit.reason == "missing_dependency" and "does not depend on X" in short.misfit.message
    # Two symbols, one quantifier: no pairing gives each a quantifier of its own.
    shared = readings([parse_formula("? [Y] : r(Y)")], parse_formula("r(a1) & r(a2)"), {("a1", 0), ("a2", 0)})
    assert shared.found == () and shared.exhaustive


def test_the_bound_cuts_the_enumeration_short_and_says_so():
    premise = parse_formula("! [A, B, C] : ? [D] : links(A, B, C, D)")
    found = readings([premise], parse_clause("links(X0, X1, X2, sk(X2, X1, X0))"), {("sk", 3)}, bound=3)
    assert not found.exhaustive and found.misfit is None


@settings(max_examples=40, deadline=None)
@given(st.permutations(range(3)), st.permutations(range(2)))
def test_the_pairing_a_prover_used_is_among_the_readings(numbering, argument_order):
    # Property: whatever numbers a prover gives its Skolem symbols and in
    # whatever order it writes their arguments, the kernel-Skolemized
    # premise under one of the readings is the prover's Skolemized formula.
    premise = parse_formula("! [A, B] : ? [X] : (p(A, X) & ? [Y] : (q(X, B, Y) & ? [Z] : r(Z)))")
    names = [f"sK{n}" for n in numbering]
    args = ["A", "B"]
    args = [args[i] for i in argument_order]
    x = f"{names[0]}({', '.join(args)})"
    y = f"{names[1]}({', '.join(args)})"
    skolemized = parse_formula(f"! [A, B] : (p(A, {x}) & (q({x}, B, {y}) & r({names[2]})))")
    symbols = {(names[0], 2), (names[1], 2), (names[2], 0)}
    found = readings([premise], skolemized, symbols)
    assert found.exhaustive
    assert any(alpha_equivalent(replayed([premise], r)[0], skolemized) for r in found.found)


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


# An inner witness with the outer existential unnamed (common practice for
# printers that print only the clauses a refutation uses): the outer
# existential is witnessed by a symbol of nothing else.

ROOMS = "? [X] : ! [Y] : ? [Z] : (opens(X, Y, Z) & assigned(Y, Z))"


def test_an_inner_witness_alone_fits_only_with_the_outer_existential_anonymous():
    premise = parse_formula(ROOMS)
    claim = parse_clause("assigned(X0, door(X0))")
    # Ordinary pairings: `door` can only stand for X, padded; none for Z.
    ordinary = readings([premise], claim, {("door", 1)})
    assert [r[0].bound for r in ordinary.found] == [variable("X")]
    found = readings_with_anonymous_outer([premise], claim, {("door", 1)}, 64, kernel_replace)
    assert found.exhaustive and found.anonymous == {"anonymous_0"}
    (outer, inner), = found.found
    assert outer.witness is application("anonymous_0", ()) and inner.bound is variable("Z")
    assert inner.witness is application("door", (variable("Y"),))
    assert replayed([premise], (outer, inner)) == [
        parse_formula("! [Y] : (opens(anonymous_0, Y, door(Y)) & assigned(Y, door(Y)))")
    ]


def test_an_anonymous_witness_takes_a_name_of_nothing_else():
    premise = parse_formula("? [X] : ! [Y] : ? [Z] : (opens(X, Y, Z) & anonymous_0(Y, Z))")
    claim = parse_clause("anonymous_0(X0, door(X0))")
    found = readings_with_anonymous_outer([premise], claim, {("door", 1)}, 64, kernel_replace)
    assert found.anonymous == {"anonymous_1"}
    assert found.found[0][0].witness is application("anonymous_1", ())


def test_a_quantifier_enclosing_none_is_not_made_anonymous():
    # `? [X] : p(X)` has nothing inside for a witness to need: no reading.
    premise = parse_formula("(? [X] : parked(X)) & ! [Y] : ? [Z] : towed(Y, Z)")
    found = readings_with_anonymous_outer([premise], parse_clause("towed(X0, truck(X0))"), {("truck", 1)}, 64, kernel_replace)
    assert found.found == () and found.exhaustive
