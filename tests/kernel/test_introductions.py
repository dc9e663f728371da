"""Kernel introductions: Skolemizing a premise, and the shape of definitions."""

import pytest

from checker.kernel.failure import Failure
from checker.kernel.formulas import alpha_equivalent
from checker.kernel.introductions import check_choice_axiom, check_definition, skolemize
from checker.kernel.terms import application, variable
from formats.tptp import parse_formula, parse_term

X, Y, Z, U, V, W = (variable(n) for n in "XYZUVW")


def quantifier_in(formula, text):
    """The subformula of ``formula`` written as ``text``."""
    wanted = parse_formula(text)
    stack = [formula]
    while stack:
        current = stack.pop()
        if current is wanted:
            return current
        stack.extend(current.arguments)
    raise AssertionError(f"{text} not in {formula}")


def skolemize_all(formula, steps):
    """Skolemize the quantifiers named in ``steps`` one after the other,
    outermost first, as the checker does."""
    for quantifier_text, witnesses in steps:
        quantifier = quantifier_in(formula, quantifier_text)
        formula = skolemize(formula, quantifier, {variable(v): parse_term(t) for v, t in witnesses.items()})
        assert not isinstance(formula, Failure), formula
    return formula


def test_standard_form_example_from_chang_and_lee():
    # Chang & Lee 1973, "Symbolic Logic and Mechanical Theorem Proving",
    # section 4.2 (from memory): the standard form of
    # ?x !y !z ?u !v ?w P(x,y,z,u,v,w) is !y !z !v P(a,y,z,f(y,z),v,g(y,z,v)).
    premise = parse_formula("? [X] : ! [Y] : ! [Z] : ? [U] : ! [V] : ? [W] : p(X,Y,Z,U,V,W)")
    result = skolemize_all(
        premise,
        [
            ("? [X] : ! [Y] : ! [Z] : ? [U] : ! [V] : ? [W] : p(X,Y,Z,U,V,W)", {"X": "a"}),
            ("? [U] : ! [V] : ? [W] : p(a,Y,Z,U,V,W)", {"U": "f(Y,Z)"}),
            ("? [W] : p(a,Y,Z,f(Y,Z),V,W)", {"W": "g(Y,Z,V)"}),
        ],
    )
    assert alpha_equivalent(result, parse_formula("! [Y] : ! [Z] : ! [V] : p(a,Y,Z,f(Y,Z),V,g(Y,Z,V))"))


def test_negative_universal_is_replaced_and_a_partial_witness_keeps_the_rest():
    # Common practice: ~ ! [X] : q(X) is ? [X] : ~ q(X) in disguise, so its
    # universal may be Skolemized; a quantifier over two variables may be
    # witnessed one variable at a time.
    premise = parse_formula("~ (! [X,Y] : q(X,Y))")
    result = skolemize(premise, quantifier_in(premise, "! [X,Y] : q(X,Y)"), {X: application("c")})
    assert result is parse_formula("~ (! [Y] : q(c,Y))")


def test_only_occurrences_of_the_right_polarity_are_replaced():
    # (? [X] : p(X)) => (? [X] : p(X)): the left occurrence is negative.
    premise = parse_formula("(? [X] : p(X)) => (? [X] : p(X))")
    result = skolemize(premise, quantifier_in(premise, "? [X] : p(X)"), {X: application("k")})
    assert result is parse_formula("(? [X] : p(X)) => p(k)")


def test_occurrence_of_wrong_polarity_only():
    premise = parse_formula("~ (? [X] : p(X))")
    failure = skolemize(premise, quantifier_in(premise, "? [X] : p(X)"), {X: application("k")})
    assert failure.reason == "wrong_polarity"
    assert "? [X] : p(X)" in failure.message and "only in negative polarity" in failure.message


def test_quantifier_under_an_equivalence_may_not_be_replaced():
    premise = parse_formula("(? [X] : p(X)) <=> r")
    failure = skolemize(premise, quantifier_in(premise, "? [X] : p(X)"), {X: application("k")})
    assert failure.reason == "wrong_polarity"
    assert "only under an equivalence" in failure.message
    # Under an equivalence and in negative polarity: both places are named.
    premise = parse_formula("((? [X] : p(X)) <=> r) & ~ (? [X] : p(X))")
    failure = skolemize(premise, quantifier_in(premise, "? [X] : p(X)"), {X: application("k")})
    assert failure.reason == "wrong_polarity"
    assert "only in negative polarity and under an equivalence," in failure.message


def test_a_universal_of_positive_polarity_may_not_be_replaced():
    # Common practice: replacing ! [X] in positive polarity by a constant
    # is an instance, not a Skolemization; the kernel says where it stands.
    premise = parse_formula("(! [X] : p(X)) & ~ (! [X] : p(X))")
    result = skolemize(premise, quantifier_in(premise, "! [X] : p(X)"), {X: application("k")})
    assert result is parse_formula("(! [X] : p(X)) & ~ p(k)")
    positive = parse_formula("! [X] : p(X)")
    failure = skolemize(positive, positive, {X: application("k")})
    assert failure.reason == "wrong_polarity" and "only in positive polarity" in failure.message


def test_quantifier_that_does_not_occur():
    premise = parse_formula("r & s")
    failure = skolemize(premise, parse_formula("? [X] : p(X)"), {X: application("k")})
    assert failure.reason == "no_occurrence"
    assert failure.message == "`? [X] : p(X)` does not occur in `r & s`"


@pytest.mark.parametrize(
    ("premise", "quantifier", "witnesses", "reason", "words"),
    [
        ("r & s", "r", {"X": "k"}, "not_quantified", "`r`"),
        ("? [X] : p(X)", "? [X] : p(X)", {}, "witness_variables", "variables bound"),
        ("? [X] : p(X)", "? [X] : p(X)", {"Y": "k"}, "witness_variables", "variables bound"),
        ("? [X] : p(X)", "? [X] : p(X)", {"X": "Y"}, "not_a_skolem_term", "`Y`"),
        ("! [Y] : ? [X] : p(X,Y)", "? [X] : p(X,Y)", {"X": "f(a)"}, "not_a_skolem_term", "`f(a)`"),
        ("! [Y] : ? [X] : p(X,Y)", "? [X] : p(X,Y)", {"X": "f(Y,Y)"}, "not_a_skolem_term", "`f(Y,Y)`"),
        ("! [Y] : ? [X] : p(X,Y)", "? [X] : p(X,Y)", {"X": "f"}, "missing_dependency", "on Y, which occurs free"),
        ("! [Y,Z] : ? [X] : p(X,Y,Z)", "? [X] : p(X,Y,Z)", {"X": "f"}, "missing_dependency", "on Y, Z, which occur free"),
        ("? [X] : p(X,a)", "? [X] : p(X,a)", {"X": "a"}, "not_fresh", "`a`"),
        ("? [X,Y] : p(X,Y)", "? [X,Y] : p(X,Y)", {"X": "k", "Y": "k"}, "not_fresh", "`k`"),
    ],
)
def test_witnesses_that_are_not_skolem_terms_are_refused(premise, quantifier, witnesses, reason, words):
    formula = parse_formula(premise)
    target = quantifier_in(formula, quantifier)
    failure = skolemize(formula, target, {variable(v): parse_term(t) for v, t in witnesses.items()})
    assert isinstance(failure, Failure)
    assert failure.reason == reason
    assert words in failure.message


def test_skolem_term_may_depend_on_more_than_it_needs():
    # Common practice: an extra argument only makes the witness less
    # constrained, which is still a sound choice function.
    premise = parse_formula("! [Y,Z] : ? [X] : p(X,Y)")
    result = skolemize(premise, quantifier_in(premise, "? [X] : p(X,Y)"), {X: parse_term("f(Y,Z)")})
    assert result is parse_formula("! [Y,Z] : p(f(Y,Z),Y)")


@pytest.mark.parametrize(
    ("text", "symbol"),
    [
        ("! [X] : (d(X) <=> (p(X) & q(X)))", ("d", 1)),
        ("! [X] : ((p(X) | q(X)) <=> d(X))", ("d", 1)),
        ("! [X,Y] : (d(X,Y) => r(Y,X))", ("d", 2)),
        ("! [X] : (p(X) => d(X))", ("d", 1)),
        ("d0 <=> (p(a) & q(b))", ("d0", 0)),
    ],
)
def test_definitions_of_their_symbol_are_accepted(text, symbol):
    # Common practice: definitional (Tseitin-style) naming introduces a new
    # predicate equivalent to, or implying / implied by, a subformula.
    assert check_definition(parse_formula(text), symbol) is None


@pytest.mark.parametrize(
    ("text", "symbol", "reason", "words"),
    [
        ("d(X) <=> p(X)", ("d", 1), "definition_not_closed", "free variables"),
        ("! [X] : (d(X) & p(X))", ("d", 1), "not_a_definition", "not an equivalence"),
        ("(! [X] : (d(X) <=> p(X))) | r", ("d", 1), "not_a_definition", "not an equivalence"),
        ("! [X,Y] : (d(X) <=> p(X,Y))", ("d", 1), "definition_arguments", "free variables {X, Y}"),
        ("! [X] : (d(X) <=> (d(X) & p(X)))", ("d", 1), "definition_circular", "own definition"),
        ("! [X] : (d(f(X)) <=> p(X))", ("d", 1), "definition_arguments", "distinct variables"),
        ("! [X] : (d(X,X) <=> p(X))", ("d", 2), "definition_arguments", "distinct variables"),
        ("! [X] : ((X = a) <=> p(X))", ("=", 2), "not_a_definition", "neither side"),
        ("! [X] : (d(X) <=> p(X))", ("e", 1), "not_a_definition", "atom of `e/1`"),
        ("! [X] : (d(X) <=> p(X))", ("d", 2), "not_a_definition", "atom of `d/2`"),
    ],
)
def test_formulas_that_do_not_define_the_symbol(text, symbol, reason, words):
    failure = check_definition(parse_formula(text), symbol)
    assert isinstance(failure, Failure)
    assert failure.reason == reason
    assert words in failure.message


@pytest.mark.parametrize(
    ("text", "witnesses"),
    [
        # Common practice: the Skolem axiom of f for ? [Y] : p(X,Y) under ! [X].
        ("! [X] : ((? [Y] : p(X,Y)) => p(X,f(X)))", {"Y": "f(X)"}),
        # The dual for a universal of negative polarity.
        ("! [X] : (p(X,g(X)) => (! [Y] : p(X,Y)))", {"Y": "g(X)"}),
        # One of two variables witnessed, the other still quantified.
        ("(? [Y,Z] : q(Y,Z)) => (? [Z] : q(c,Z))", {"Y": "c"}),
    ],
)
def test_axioms_of_choice_are_accepted(text, witnesses):
    axiom = parse_formula(text)
    assert check_choice_axiom(axiom, {variable(v): parse_term(t) for v, t in witnesses.items()}) is None


@pytest.mark.parametrize(
    ("text", "witnesses", "reason", "said"),
    [
        ("(? [Y] : p(X,Y)) => p(X,f(X))", {"Y": "f(X)"}, "choice_not_closed", "has free variables"),
        ("! [X] : (p(X) & q(X))", {"X": "c"}, "not_a_choice_axiom", "is not an implication under universal quantifiers"),
        ("! [X] : (p(X) => q(X))", {"X": "c"}, "not_a_choice_axiom", "is existential nor"),
        ("! [X] : ((? [Y] : p(X,Y)) => p(X,f))", {"Y": "f"}, "missing_dependency", "does not depend on X"),
        ("! [X] : ((? [Y] : p(X,Y)) => p(X,f(X)))", {"Y": "h(X)"}, "not_a_choice_axiom", "at the witnesses"),
    ],
)
def test_formulas_that_are_not_axioms_of_choice(text, witnesses, reason, said):
    failure = check_choice_axiom(parse_formula(text), {variable(v): parse_term(t) for v, t in witnesses.items()})
    assert isinstance(failure, Failure) and failure.reason == reason
    assert said in failure.message
