"""Red-team attacks on the trusted kernel: inputs a kernel function must refuse.

Each attack is a piece of evidence, a formula pair or a witness that would
let an unsound step through if the kernel accepted it; the comment above
each test says why accepting it would be unsound.  Where the attack's
claim is stated as "not a consequence", the test first shows that with its
own finite-model evaluator (written here, independent of the kernel's
``models.py``), so that a refusal is the right answer and not an accident.
The property tests at the end let the untrusted search (and random
evidence) play the adversary against brute-force model checking over
domains of size 1 to 3.  Scenarios (valves, badges, docks) are invented.
"""

from __future__ import annotations

import itertools
import json
import random

import sympy
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from strategies import Interpretation as SmallModel
from strategies import clause_holds, random_interpretation
from strategies import clauses as clause_strategy
from strategies import literals as literal_strategy
from strategies import substitutions as substitution_strategy
from sympy.logic.inference import satisfiable

from checker.kernel.clauses import Clause, Literal
from checker.kernel.clausify import clausify
from checker.kernel.entailment import check_entailment, entailment_clauses
from checker.kernel.failure import Failure
from checker.kernel.formulas import (
    AND,
    EXISTS,
    FALSUM,
    FORALL,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    OR,
    VERUM,
    XOR,
    Formula,
    alpha_equivalent,
    atomic,
    binary,
    negation,
    quantified,
    substitute_free,
)
from checker.kernel.introductions import check_choice_axiom, check_definition, skolemize
from checker.kernel.models import Interpretation, confirm_countermodel
from checker.kernel.rules import (
    CLAIM_CONSTANT_PREFIX,
    Chain,
    EqualityFactoring,
    EqualityResolution,
    Instantiation,
    Paramodulation,
    Refutation,
    Resolution,
    check_clause_step,
    negated_claim,
    replay,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, variable
from checker.outcomes import CHECKED
from checker.run import check
from checker.search.saturation import refute
from formats.tptp import parse_clause, parse_formula

SETTINGS = settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])

X, Y, Z = variable("X"), variable("Y"), variable("Z")
a, b, c = application("a"), application("b"), application("c")


def fn(name: str, *arguments: Term) -> Term:
    return application(name, tuple(arguments))


def pos(atom: Term) -> Literal:
    return Literal(True, atom)


def neg(atom: Term) -> Literal:
    return Literal(False, atom)


def eq(s: Term, t: Term) -> Term:
    return application("=", (s, t))


def cl(text: str) -> Clause:
    return parse_clause(text)


def fo(text: str) -> Formula:
    return parse_formula(text)




# ----------------------------------------------------- the test's own evaluator
#
# A formula evaluator over an arbitrary finite structure: functions and
# predicates are Python dicts keyed by (name, arity); equality is identity.
# Written for these tests (common practice: Tarski's truth definition),
# sharing nothing with checker/kernel/models.py.


def _term_value(term: Term, structure, env) -> int:
    if term.is_variable:
        return env[term]
    functions = structure[1]
    return functions[(term.symbol, term.arity)][tuple(_term_value(t, structure, env) for t in term.arguments)]


def _true(formula: Formula, structure, env) -> bool:
    size, _, predicates = structure
    kind = formula.connective
    if kind == "atom":
        atom = formula.atom
        values = tuple(_term_value(t, structure, env) for t in atom.arguments)
        if atom.symbol == "=" and atom.arity == 2:
            return values[0] == values[1]
        return values in predicates[(atom.symbol, atom.arity)]
    if kind == "$true":
        return True
    if kind == "$false":
        return False
    if kind == "~":
        return not _true(formula.arguments[0], structure, env)
    if kind in (FORALL, EXISTS):
        results = (
            _true(formula.arguments[0], structure, {**env, **dict(zip(formula.variables, values))})
            for values in itertools.product(range(size), repeat=len(formula.variables))
        )
        return all(results) if kind == FORALL else any(results)
    left, right = (_true(argument, structure, env) for argument in formula.arguments)
    return {
        AND: left and right,
        OR: left or right,
        IMPLIES: (not left) or right,
        IFF: left == right,
        XOR: left != right,
        NOR: not (left or right),
        NAND: not (left and right),
    }[kind]


def _free(formula: Formula) -> set[Term]:
    if formula.connective == "atom":
        found, stack = set(), [formula.atom]
        while stack:
            t = stack.pop()
            if t.is_variable:
                found.add(t)
            stack.extend(t.arguments)
        return found
    inner = set().union(*(_free(argument) for argument in formula.arguments)) if formula.arguments else set()
    return inner - set(formula.variables)


def closure_true(formula: Formula, structure) -> bool:
    free = sorted(_free(formula), key=lambda v: v.symbol)
    return all(
        _true(formula, structure, dict(zip(free, values)))
        for values in itertools.product(range(structure[0]), repeat=len(free))
    )


# Signature of the random formulas: constants a, b; unary f; p/1, q/2, r/0; =.
def _structures_of_size(size: int):
    elements = range(size)
    singles = [(e,) for e in elements]
    pairs = list(itertools.product(elements, repeat=2))
    for ca, cb in itertools.product(elements, repeat=2):
        for f_values in itertools.product(elements, repeat=size):
            functions = {("a", 0): {(): ca}, ("b", 0): {(): cb}, ("f", 1): dict(zip(singles, f_values))}
            for p_bits in itertools.product((False, True), repeat=size):
                for q_bits in itertools.product((False, True), repeat=len(pairs)):
                    for r_bit in (False, True):
                        predicates = {
                            ("p", 1): frozenset(t for t, bit in zip(singles, p_bits) if bit),
                            ("q", 2): frozenset(t for t, bit in zip(pairs, q_bits) if bit),
                            ("r", 0): frozenset({()}) if r_bit else frozenset(),
                        }
                        yield (size, functions, predicates)


SMALL_STRUCTURES = [s for size in (1, 2) for s in _structures_of_size(size)]
_rng = random.Random(20240601)
_SIZE_THREE = list(_structures_of_size(3))
SMALL_STRUCTURES += _rng.sample(_SIZE_THREE, 300)
del _SIZE_THREE


def _signature(formulas) -> tuple[set, set]:
    """The (name, arity) function and predicate symbols of the formulas."""
    functions, predicates = set(), set()
    stack = list(formulas)
    terms = []
    while stack:
        formula = stack.pop()
        stack.extend(formula.arguments)
        if formula.connective == "atom":
            atom = formula.atom
            if not (atom.symbol == "=" and atom.arity == 2):
                predicates.add((atom.symbol, atom.arity))
            terms.extend(atom.arguments)
    while terms:
        term = terms.pop()
        if not term.is_variable:
            functions.add((term.symbol, term.arity))
            terms.extend(term.arguments)
    return functions, predicates


def _random_structure(rng: random.Random, size: int, functions, predicates):
    elements = range(size)
    return (
        size,
        {s: {t: rng.randrange(size) for t in itertools.product(elements, repeat=s[1])} for s in functions},
        {
            s: frozenset(t for t in itertools.product(elements, repeat=s[1]) if rng.random() < 0.5)
            for s in predicates
        },
    )


def countermodel(premises, conclusion):
    """A structure where every premise holds and the conclusion fails, or
    None.  Over the random formulas' signature: every structure of size 1
    and 2 and 300 of size 3; otherwise 1500 random structures per size 1-3."""
    as_formulas = [p if isinstance(p, Formula) else _clause_formula(p) for p in premises]
    goal = conclusion if isinstance(conclusion, Formula) else _clause_formula(conclusion)
    functions, predicates = _signature([*as_formulas, goal])
    if functions <= {("a", 0), ("b", 0), ("f", 1)} and predicates <= {("p", 1), ("q", 2), ("r", 0)}:
        candidates = SMALL_STRUCTURES
    else:
        rng = random.Random(7)
        candidates = (_random_structure(rng, size, functions, predicates) for size in (1, 2, 3) for _ in range(1500))
    for structure in candidates:
        if all(closure_true(p, structure) for p in as_formulas) and not closure_true(goal, structure):
            return structure
    return None


def _clause_formula(clause: Clause) -> Formula:
    result = FALSUM
    for literal in clause.literals:
        atom = atomic(literal.atom)
        disjunct = atom if literal.positive else negation(atom)
        result = disjunct if result is FALSUM else binary(OR, result, disjunct)
    return result


def assert_not_consequence(premises, conclusion):
    assert countermodel(premises, conclusion) is not None, "the attack's claim must really not follow"


# ======================================================================= rules


def test_resolution_of_literals_of_the_same_sign_is_refused():
    # Resolving valve_open(v1) with valve_open(v1) would derive the empty
    # clause from one satisfiable unit.
    premises = [cl("open(v1)"), cl("open(v1)")]
    assert_not_consequence([fo("open(v1)")], FALSUM)
    failure = check_clause_step(premises, Clause(), Resolution(0, 0, 1, 0))
    assert failure is not None and failure.reason == "same_sign"


def test_equality_symmetry_stops_at_the_atom():
    # `=` nested inside a term is an uninterpreted function symbol; taking
    # p(=(a,b)) and ~p(=(b,a)) as complementary would refute a satisfiable
    # pair (interpret =/2 as the first projection).
    premises = [Clause([pos(fn("p", eq(a, b)))]), Clause([neg(fn("p", eq(b, a)))])]
    failure = check_clause_step(premises, Clause(), Resolution(0, 0, 1, 0))
    assert failure is not None and failure.reason == "atoms_differ"
    # ...while at the atom itself the two orientations are one literal.
    top = [Clause([pos(eq(a, b))]), Clause([neg(eq(b, a))])]
    assert check_clause_step(top, Clause(), Resolution(0, 0, 1, 0)) is None


def test_nested_equality_terms_are_not_alpha_equivalent_when_turned():
    # The same point for formulas: leaf matching by alpha-equivalence must
    # not turn a nested =/2 term round.
    left = atomic(fn("p", eq(a, b)))
    right = atomic(fn("p", eq(b, a)))
    assert not alpha_equivalent(left, right)
    assert not alpha_equivalent(fo("f(a, b) = c"), fo("f(b, a) = c"))
    assert alpha_equivalent(fo("f(a, b) = c"), fo("c = f(a, b)"))


def test_resolution_substitution_must_unify_exactly():
    # badge(X) and ~badge(b) do not clash under X := a; accepting the
    # mis-stated unifier would derive door(a), which does not follow.
    premises = [cl("badge(X) | door(X)"), cl("~badge(b)")]
    evidence = Resolution(0, 0, 1, 0, left_substitution=Substitution({X: a}))
    failure = check_clause_step(premises, cl("door(a)"), evidence)
    assert failure is not None and failure.reason == "atoms_differ"
    assert_not_consequence([fo("! [X] : (badge(X) | door(X))"), fo("~badge(b)")], fo("door(a)"))


def test_paramodulation_at_the_root_is_refused():
    # The root of a literal is the atom, a truth value: rewriting it with
    # a = b would turn p(a)'s atom into a term.
    premises = [cl("a = b"), cl("p(a)")]
    failure = check_clause_step(premises, cl("p(b)"), Paramodulation(0, 0, True, 1, 0, ()))
    assert failure is not None and failure.reason == "no_such_position"


def test_paramodulation_with_a_disequation_is_refused():
    # From a != b one may not rewrite a into b: p(a), a != b does not give p(b).
    premises = [cl("a != b"), cl("p(a)")]
    assert_not_consequence([fo("a != b"), fo("p(a)")], fo("p(b)"))
    failure = check_clause_step(premises, cl("p(b)"), Paramodulation(0, 0, True, 1, 0, (1,)))
    assert failure is not None and failure.reason == "not_an_equation"


def test_paramodulation_position_outside_the_atom_is_refused():
    # Position 3 of an equality atom and position 1.1 below a constant do
    # not exist; guessing a nearby position could rewrite the wrong term.
    premises = [cl("a = b"), cl("f(a) = c")]
    for position in ((3,), (2, 1), (0,), (1, 1, 1)):
        failure = check_clause_step(premises, cl("f(b) = c"), Paramodulation(0, 0, True, 1, 0, position))
        assert failure is not None and failure.reason == "no_such_position", position


def test_paramodulation_inside_an_equality_rewrites_only_the_named_side():
    # a = b into f(a) = g(a) at 1.1 gives f(b) = g(a); claiming that both
    # sides were rewritten, f(b) = g(b), does not follow.
    premises = [cl("a = b"), cl("f(a) = g(a)")]
    assert_not_consequence([fo("a = b"), fo("f(a) = g(a)")], fo("f(b) = g(b) & f(a) != f(b)"))
    evidence = Paramodulation(0, 0, True, 1, 0, (1, 1))
    assert check_clause_step(premises, cl("f(b) = g(a)"), evidence) is None
    failure = check_clause_step(premises, cl("f(b) = g(b) | a != a"), evidence)
    assert failure is not None and failure.reason == "missing_from_claimed"


def test_paramodulation_direction_flag_is_honoured():
    # With left_to_right the written left side must be found: rewriting b
    # in p(b) using a = b left to right would need a at that position.
    premises = [cl("a = b"), cl("p(b)")]
    failure = check_clause_step(premises, cl("p(b)"), Paramodulation(0, 0, True, 1, 0, (1,)))
    assert failure is not None and failure.reason == "subterm_mismatch"
    assert check_clause_step(premises, cl("p(a)"), Paramodulation(0, 0, False, 1, 0, (1,))) is None


def test_paramodulation_into_a_predicate_argument_keeps_the_other_arguments():
    # q(a, a) with a = b rewritten at position 2 gives q(a, b), not q(b, b).
    premises = [cl("a = b"), cl("q(a, a)")]
    evidence = Paramodulation(0, 0, True, 1, 0, (2,))
    assert check_clause_step(premises, cl("q(a, b)"), evidence) is None
    failure = check_clause_step(premises, cl("q(b, a)"), evidence)
    assert failure is not None and failure.reason == "missing_from_claimed"


def test_paramodulation_target_substitution_applies_before_the_position():
    # The subterm at the position is read in the instantiated target; an
    # equation side that only matches before instantiation must be refused.
    premises = [cl("f(X) = c"), cl("p(f(a))")]
    evidence = Paramodulation(0, 0, True, 1, 0, (1,))  # f(X) is not f(a): no equation substitution
    failure = check_clause_step(premises, cl("p(c)"), evidence)
    assert failure is not None and failure.reason == "subterm_mismatch"
    good = Paramodulation(0, 0, True, 1, 0, (1,), equation_substitution=Substitution({X: a}))
    assert check_clause_step(premises, cl("p(c)"), good) is None


def test_equality_resolution_needs_a_disequality_with_equal_sides():
    # Removing a = b (positive) or a != b with a, b distinct would discard a
    # literal that can be true.
    assert check_clause_step([cl("a = b | p(a)")], cl("p(a)"), EqualityResolution(0, 0)).reason == "not_a_disequality"
    failure = check_clause_step([cl("a != b | p(a)")], cl("p(a)"), EqualityResolution(0, 0))
    assert failure.reason == "sides_differ"
    assert_not_consequence([fo("a != b | p(a)")], fo("p(a)"))


def test_equality_factoring_reversed_flags_must_name_the_shared_side():
    # a = b | c = a: the shared side is a, written second in the other
    # literal.  Without other_reversed the kernel would identify a with c.
    premises = [cl("a = b | c = a")]
    honest = EqualityFactoring(0, 0, 1, other_reversed=True)
    assert check_clause_step(premises, cl("b != c | c = a"), honest) is None
    failure = check_clause_step(premises, cl("b != a | c = a"), EqualityFactoring(0, 0, 1))
    assert failure is not None and failure.reason == "factored_sides_differ"
    # Reversing the first literal instead pairs b with c: also refused.
    failure = check_clause_step(premises, cl("a != a | c = a"), EqualityFactoring(0, 0, 1, literal_reversed=True))
    assert failure is not None and failure.reason == "factored_sides_differ"


def test_equality_factoring_of_one_literal_with_itself_is_refused():
    # One literal is not two: factoring a = b | r with itself would drop
    # a = b and add b != b, i.e. derive r from a = b | r.
    assert_not_consequence([fo("a = b | r")], fo("r"))
    failure = check_clause_step([cl("a = b | r")], cl("b != b | r"), EqualityFactoring(0, 0, 0))
    assert failure is not None and failure.reason == "same_literal"


def test_equality_factoring_drops_the_first_literal_not_the_second():
    # From s = t | s = t' | R the conclusion keeps s = t': a = b | a = c
    # gives b != c | a = c, and claiming b != c alone (a = b = c refutes it)
    # must be refused.
    premises = [cl("a = b | a = c")]
    assert_not_consequence([fo("a = b | a = c")], fo("b != c"))
    assert check_clause_step(premises, cl("b != c | a = c"), EqualityFactoring(0, 0, 1)) is None
    failure = check_clause_step(premises, cl("b != c"), EqualityFactoring(0, 0, 1))
    assert failure is not None and failure.reason == "missing_from_claimed"


def test_chain_may_not_refer_to_its_own_or_a_later_result():
    # Premise index len(premises) + k is inner result k; step k itself (or
    # a later one) does not exist yet.  Accepting would let a step use its
    # own conclusion.
    premises = [cl("p(a)")]
    for bad in (1, 2):
        chain = Chain((Resolution(0, 0, bad, 0),))
        failure = check_clause_step(premises, Clause(), chain)
        assert failure is not None and failure.reason == "premise_out_of_range"
    failure = check_clause_step(premises, Clause(), Chain((Instantiation(0), Resolution(1, 0, 2, 0))))
    assert failure is not None and failure.reason == "premise_out_of_range"


def test_empty_chain_and_unknown_evidence_are_refused():
    assert check_clause_step([Clause()], Clause(), Chain(())).reason == "empty_chain"
    assert replay([Clause()], Chain((object(),))).reason == "unknown_evidence"
    assert replay([Clause()], object()).reason == "unknown_evidence"


def test_chains_do_not_nest():
    # A chain inside a chain is not a primitive inference: refused rather
    # than recursed into.
    inner = Chain((Instantiation(0),))
    assert replay([cl("p(a)")], Chain((inner,))).reason == "unknown_evidence"


def test_theta_cannot_drop_literals_it_does_not_merge():
    # theta(computed) ⊆ claimed: p(X) | q(X, a) under X := a is
    # p(a) | q(a, a); claiming p(a) alone would drop q(a, a).
    premises = [cl("p(X) | q(X, a)")]
    failure = check_clause_step(premises, cl("p(a)"), Instantiation(0), Substitution({X: a}))
    assert failure is not None and failure.reason == "missing_from_claimed"
    assert_not_consequence([fo("! [X] : (p(X) | q(X, a))")], fo("p(a)"))
    # Merging is fine: p(X) | p(Y) under X := Y is p(Y), which does follow.
    assert check_clause_step([cl("p(X) | p(Y)")], cl("p(Y)"), Instantiation(0), Substitution({X: Y})) is None


def test_theta_is_not_applied_to_the_claimed_clause():
    # Only the computed clause is instantiated: claimed p(X) from p(a) with
    # theta X := a would be p(a) ⊆ p(a) if theta also hit the claim.
    failure = check_clause_step([cl("p(a)")], cl("p(X)"), Instantiation(0), Substitution({X: a}))
    assert failure is not None and failure.reason == "missing_from_claimed"


def test_refutation_claim_constant_avoids_a_premise_constant():
    # p(claim_constant_0) does not entail p(X); if the negated claim reused
    # claim_constant_0 for X, resolving with the premise would refute it.
    constant = application(f"{CLAIM_CONSTANT_PREFIX}0")
    premises = [Clause([pos(fn("p", constant))])]
    claimed = Clause([pos(fn("p", X))])
    negated = negated_claim(premises, claimed)
    assert negated[0].literals[0].atom.arguments[0] is not constant
    failure = check_clause_step(premises, claimed, Refutation(Chain((Resolution(0, 0, 1, 0),))))
    assert failure is not None and failure.reason == "atoms_differ"


def test_refutation_claim_constant_avoids_a_constant_of_the_claim():
    # ~q(X, claim_constant_0) | q(claim_constant_0, X) is not valid; had
    # X become claim_constant_0, its negation would be q(c, c), ~q(c, c):
    # a refutation from no premises at all.
    constant = application(f"{CLAIM_CONSTANT_PREFIX}0")
    claimed = Clause([neg(fn("q", X, constant)), pos(fn("q", constant, X))])
    failure = check_clause_step([], claimed, Refutation(Chain((Resolution(0, 0, 1, 0),))))
    assert failure is not None and failure.reason == "atoms_differ"


def test_refutation_claim_constant_avoids_names_of_every_arity_and_kind():
    # A predicate or a unary function called claim_constant_0 is still the
    # name; the new constants also differ from each other.
    used = [Clause([pos(fn(f"{CLAIM_CONSTANT_PREFIX}0", a)), pos(application(f"{CLAIM_CONSTANT_PREFIX}1"))])]
    negated = negated_claim(used, Clause([pos(fn("q", X, Y))]))
    x_constant, y_constant = negated[0].literals[0].atom.arguments
    assert x_constant is not y_constant
    assert {x_constant.symbol, y_constant.symbol}.isdisjoint({f"{CLAIM_CONSTANT_PREFIX}0", f"{CLAIM_CONSTANT_PREFIX}1"})


def test_refutation_must_end_in_the_empty_clause():
    # A chain that stops short refutes nothing.
    premises = [cl("p(a) | r")]
    failure = check_clause_step(premises, cl("r"), Refutation(Chain((Resolution(0, 0, 1, 0),))))
    assert failure is not None  # ~r does not clash with p(a)
    failure = check_clause_step([cl("p(a) | r | s")], cl("r"), Refutation(Chain((Resolution(0, 1, 1, 0),))))
    assert failure is not None and failure.reason == "refutation_incomplete"


def test_refutation_negates_every_claimed_literal_separately():
    # Claim p(X) | q(X, X) from p(a) | q(b, b): not a consequence.  Each
    # claimed literal becomes its own unit; the same constant stands for X
    # in both, so no substitution can split them.
    premises = [cl("p(a) | q(b, b)")]
    claimed = cl("p(X) | q(X, X)")
    assert_not_consequence([fo("p(a) | q(b, b)")], fo("! [X] : (p(X) | q(X, X))"))
    chain = Chain((Resolution(0, 0, 1, 0), Resolution(3, 0, 2, 0)))
    failure = check_clause_step(premises, claimed, Refutation(chain))
    assert failure is not None and failure.reason == "atoms_differ"


# ================================================================== clausify


def _no_refutation(premises, conclusion):
    """The untrusted saturation, as an adversary, finds no refutation of the
    kernel's clauses that the kernel accepts."""
    clauses = entailment_clauses(premises, conclusion)
    chain = refute(clauses, 800, 120, 2000)
    return chain is None or check_entailment(premises, conclusion, chain) is not None


def assert_refused_entailment(premises_text, conclusion_text):
    premises = [fo(text) for text in premises_text]
    conclusion = fo(conclusion_text)
    assert_not_consequence(premises, conclusion)
    assert _no_refutation(premises, conclusion)


def test_skolem_constant_is_fresh_against_the_conclusion():
    # ? [X] : p(X) does not give p(skolem_1); a Skolem constant named
    # skolem_1 would make the premise's witness the conclusion's constant.
    assert_refused_entailment(["? [X] : p(X)"], "p(skolem_1)")
    clauses = entailment_clauses([fo("? [X] : p(X)")], fo("p(skolem_1)"))
    assert Clause([neg(fn("p", application("skolem_1")))]) in clauses
    assert Clause([pos(fn("p", application("skolem_1")))]) not in clauses


def test_skolem_function_keeps_its_arguments():
    # ! [Y] : ? [X] : q(X, Y) does not give ? [X] : ! [Y] : q(X, Y); a
    # Skolem constant in place of sk(Y) would.
    assert_refused_entailment(["! [Y] : ? [X] : q(X, Y)"], "? [X] : ! [Y] : q(X, Y)")


def test_skolem_argument_reached_through_an_outer_skolem_term():
    # In ! [X] : ? [Y] : ? [Z] : q(Y, Z), the inner witness Z depends on X
    # only through Y's Skolem term; in ! [X] : ? [Y] : (p(Y) & ? [Z] : q(X, Z))
    # Z depends on X directly.  Either way a constant would be too strong.
    assert_refused_entailment(["! [X] : ? [Z] : (p(X) & q(X, Z))"], "? [Z] : ! [X] : q(X, Z)")
    assert_refused_entailment(["! [X] : ? [Y] : (Y = f(X) & ? [Z] : q(Y, Z))"], "? [Z] : ! [X] : q(f(X), Z)")


def test_shadowed_existentials_get_separate_skolem_constants():
    # ! [X] : (p(X) | ! [X] : q(X, X)) is not implied by
    # ! [X] : (p(X) | q(X, X)); negating the conclusion gives two existentials
    # named X, and one constant for both would refute it.
    assert_refused_entailment(["! [X] : (p(X) | q(X, X))"], "! [X] : (p(X) | ! [X] : q(X, X))")


def test_shadowed_universals_get_separate_clause_variables():
    # ! [X] : (p(X) | ! [X] : ~ q(X, X)) read with one variable would be
    # p(X) | ~q(X, X), which is weaker; with the same name reused in a
    # negated conclusion it must stay two.
    assert_refused_entailment(["? [X] : (p(X) & ? [X] : q(X, X))"], "? [X] : (p(X) & q(X, X))")


def test_free_variable_of_the_conclusion_is_universal():
    # p(a) does not entail p(X) read as ! [X] : p(X).
    premises = [Clause([pos(fn("p", a))])]
    conclusion = Clause([pos(fn("p", X))])
    assert_not_consequence(premises, conclusion)
    clauses = entailment_clauses(premises, conclusion)
    assert all(clause.variables() == set() for clause in clauses)
    for left, right in itertools.permutations(range(len(clauses)), 2):
        assert check_entailment(premises, conclusion, Chain((Resolution(left, 0, right, 0),))) is not None


def test_free_variable_of_a_premise_is_universal_not_a_witness():
    # Premise p(X) (free) entails p(b); the reading as universal is what
    # lets the refutation through, so the clause keeps a variable.
    clauses = entailment_clauses([atomic(fn("p", X))], atomic(fn("p", b)))
    assert Clause([pos(fn("p", X))]) in clauses


def test_definitional_naming_of_an_equivalence_side_keeps_both_directions():
    # (r <=> (p(a) & p(b))) with r does not give ~p(a); the name for
    # p(a) & p(b) must be defined in both directions.
    assert_refused_entailment(["r <=> (p(a) & p(b))", "r"], "~ p(a)")
    assert_refused_entailment(["r <=> (p(a) & p(b))", "~ r"], "~ p(a) & ~ p(b)")


def test_negated_equivalence_is_exclusive_or():
    # ~(r <=> p(a)) and r give ~p(a); but not p(a).
    assert_refused_entailment(["~ (r <=> p(a))", "r"], "p(a)")
    assert_refused_entailment(["~ (r <~> p(a))", "r"], "~ p(a)")
    assert_refused_entailment(["r <~> p(a)"], "r & p(a)")
    assert_refused_entailment(["r <~> p(a)"], "~ r & ~ p(a)")


def test_nor_nand_and_reversed_implication():
    assert_refused_entailment(["r ~| p(a)"], "r")
    assert_refused_entailment(["r ~& p(a)"], "~ r & ~ p(a)")
    assert_refused_entailment(["r <= p(a)"], "p(a) | ~ r")


def test_true_and_false_are_read_as_truth_values():
    # $true gives nothing; ~ $false gives nothing; r | $false is r.
    assert_refused_entailment(["$true"], "r")
    assert_refused_entailment(["~ $false"], "r")
    assert_refused_entailment(["r | $false"], "p(a)")
    assert_refused_entailment(["p(a) => $true"], "p(a)")
    assert_refused_entailment(["r"], "r & $false")


def test_vacuous_quantifiers_change_nothing():
    # ! [X] : r is r; ? [X] : r is r; neither gives p(a).
    assert_refused_entailment(["! [X] : r", "? [Y] : r"], "p(a)")
    assert_refused_entailment(["? [X] : p(a)"], "! [X] : p(X)")


def test_deeply_nested_negations_are_counted_exactly():
    # 2000 negations of r is r; concluding ~ r does not follow.  The
    # clausifier must neither recurse nor lose a negation.
    premise = atomic(application("r"))
    for _ in range(2000):
        premise = negation(premise)
    conclusion = negation(atomic(application("r")))
    clauses = entailment_clauses([premise], conclusion)
    r = application("r")
    assert set(clauses) == {Clause([pos(r)])}  # ¬¬r is r: one clause, counted twice
    odd = negation(premise)
    assert set(entailment_clauses([odd], conclusion)) == {Clause([neg(r)]), Clause([pos(r)])}
    # r ⊭ ~r: there is no refutation of {r} (the negated conclusion is r again).
    assert check_entailment([premise], conclusion, Chain((Resolution(0, 0, 0, 0),))) is not None


def test_long_conjunction_and_disjunction_chains():
    # p(a) | p(b) | ... (300 disjuncts) does not give p(a); the flattened
    # operands must all stay in one clause.
    disjunction = atomic(fn("p", a))
    for index in range(300):
        disjunction = binary(OR, disjunction, atomic(fn("p", application(f"d{index}"))))
    clauses = entailment_clauses([disjunction], atomic(fn("p", a)))
    assert any(len(clause) == 301 for clause in clauses)


def test_distribution_naming_is_sound():
    # A conjunction-of-disjunctions product above the distribution limit is
    # named; the named form must still not refute a satisfiable set.
    wide = "(p(a) & q(a,a) & r) | (p(b) & q(b,b) & ~ r) | (q(a,b) & q(b,a) & p(f(a)))"
    assert_refused_entailment([wide], "p(a) | p(b)")
    assert_refused_entailment([wide, "~ r"], "p(b) & q(b,b) & p(f(a))")


def test_equivalence_under_a_quantifier_names_with_the_free_variables():
    # ! [X] : (p(X) <=> ? [Y] : q(X, Y)) with p(a) does not give q(a, a):
    # the definition name must carry X (a constant name would merge cases).
    assert_refused_entailment(["! [X] : (p(X) <=> ? [Y] : q(X, Y))", "p(a)"], "q(a, a)")
    assert_refused_entailment(["! [X] : (p(X) <=> ? [Y] : q(X, Y))", "p(a)", "~ p(b)"], "? [Y] : q(b, Y)")


def test_definition_names_are_fresh_against_the_input():
    # A premise that already uses definition_1 must not have its atom taken
    # as the name of an equivalence side.
    assert_refused_entailment(["definition_1 <=> (p(a) & p(b))"], "~ definition_1")
    result = clausify([fo("r <=> (p(a) & p(b))"), fo("definition_1")])
    assert all(symbol.name != "definition_1" for symbol in result.fresh_symbols)


# ============================================================== introductions


def test_skolemize_replaces_only_occurrences_of_the_right_polarity():
    # In (? [Y] : p(Y)) => (? [Y] : p(Y)) only the consequent is positive;
    # replacing the antecedent as well would give p(c) => p(c), and
    # replacing it alone p(c) => ? [Y] : p(Y) — the kernel must give
    # (? [Y] : p(Y)) => p(c).
    quantifier = fo("? [Y] : p(Y)")
    premise = binary(IMPLIES, quantifier, quantifier)
    result = skolemize(premise, quantifier, {Y: c})
    assert not isinstance(result, Failure)
    assert result is binary(IMPLIES, quantifier, atomic(fn("p", c)))


def test_skolemize_refuses_an_existential_only_under_negation_or_equivalence():
    quantifier = fo("? [Y] : p(Y)")
    failure = skolemize(negation(quantifier), quantifier, {Y: c})
    assert isinstance(failure, Failure) and failure.reason == "wrong_polarity"
    failure = skolemize(binary(IFF, atomic(application("r")), quantifier), quantifier, {Y: c})
    assert isinstance(failure, Failure) and failure.reason == "wrong_polarity"


def test_skolemize_refuses_a_universal_of_positive_polarity():
    # Skolemization replaces a universal only where it is negative (an
    # existential in disguise); in positive polarity the witness reading
    # does not apply, so the step must go through a consequence check.
    quantifier = fo("! [Y] : p(Y)")
    failure = skolemize(binary(AND, quantifier, atomic(application("r"))), quantifier, {Y: c})
    assert isinstance(failure, Failure) and failure.reason == "wrong_polarity"
    result = skolemize(negation(quantifier), quantifier, {Y: c})
    assert result is negation(atomic(fn("p", c)))


def test_skolemize_refuses_a_witness_that_forgets_a_dependency():
    # ! [X] : ? [Y] : q(X, Y) with Y := c gives ! [X] : q(X, c): unsound.
    premise = fo("! [X] : ? [Y] : q(X, Y)")
    quantifier = premise.arguments[0]
    # (what ! [X] : q(X, c) would give for a fresh c)
    assert_not_consequence([premise], fo("? [Y] : ! [X] : q(X, Y)"))
    failure = skolemize(premise, quantifier, {Y: c})
    assert isinstance(failure, Failure) and failure.reason == "missing_dependency"


def test_skolemize_refuses_one_symbol_for_two_variables():
    # ? [Y, Z] : (p(Y) & ~p(Z)) with Y := c and Z := c is p(c) & ~p(c).
    premise = fo("? [Y, Z] : (p(Y) & ~ p(Z))")
    failure = skolemize(premise, premise, {Y: c, Z: c})
    assert isinstance(failure, Failure) and failure.reason == "not_fresh"


def test_skolemize_refuses_a_witness_symbol_of_the_premise():
    # ? [Y] : p(Y) & ~ p(a) with Y := a is p(a) & ~p(a).
    premise = fo("(? [Y] : p(Y)) & ~ p(a)")
    failure = skolemize(premise, premise.arguments[0], {Y: a})
    assert isinstance(failure, Failure) and failure.reason == "not_fresh"


def test_skolemize_refuses_a_variable_or_compound_witness():
    # A variable witness turns ? [Y] : p(Y) into p(Z), read as ! [Z] : p(Z).
    premise = fo("? [Y] : p(Y)")
    for witness in (Z, fn("sk", fn("f", X)), fn("sk", X, X)):
        failure = skolemize(premise, premise, {Y: witness})
        assert isinstance(failure, Failure) and failure.reason == "not_a_skolem_term", witness


def test_skolemize_refuses_witnesses_for_variables_it_does_not_bind():
    premise = fo("? [Y] : p(Y)")
    for witnesses in ({}, {Z: c}):
        failure = skolemize(premise, premise, witnesses)
        assert isinstance(failure, Failure) and failure.reason == "witness_variables"
    failure = skolemize(fo("p(a)"), fo("p(a)"), {Y: c})
    assert isinstance(failure, Failure) and failure.reason == "not_quantified"


def test_skolemize_avoids_capture_of_the_witness_arguments():
    # ? [Y] : (q(X, Y) & ~ ! [X] : s(X, Y)) with Y := sk(X): the inner
    # binder X must be renamed, or the second sk(X) would mean sk of the
    # inner X, and the naive result does not preserve satisfiability.
    premise = fo("? [Y] : (q(X, Y) & ~ ! [X] : s(X, Y))")
    witness = fn("sk", X)
    result = skolemize(premise, premise, {Y: witness})
    assert not isinstance(result, Failure)
    naive = fo("q(X, sk(X)) & ~ ! [X] : s(X, sk(X))")
    assert not alpha_equivalent(result, naive)
    assert alpha_equivalent(result, fo("q(X, sk(X)) & ~ ! [W] : s(W, sk(X))"))
    # Why the naive result is wrong: in this model of the premise no
    # interpretation of sk makes it true (q forces sk(x) = x, and then
    # ~ s(w, w) would be needed for some w, but s is the identity).
    structure = (2, {}, {("q", 2): frozenset({(0, 0), (1, 1)}), ("s", 2): frozenset({(0, 0), (1, 1)})})
    assert closure_true(premise, structure)
    for table in itertools.product(range(2), repeat=2):
        extended = (2, {("sk", 1): {(0,): table[0], (1,): table[1]}}, structure[2])
        assert not closure_true(naive, extended)
    extended = (2, {("sk", 1): {(0,): 0, (1,): 1}}, structure[2])
    assert closure_true(result, extended)


def test_skolemize_same_subformula_under_two_binders():
    # The hash-consed ? [Y] : q(X, Y) occurs under ! [X] twice and once
    # with X free; each occurrence gets sk(X) of its own X.
    quantifier = fo("? [Y] : q(X, Y)")
    premise = binary(AND, quantified(FORALL, (X,), quantifier), binary(OR, quantifier, atomic(application("r"))))
    result = skolemize(premise, quantifier, {Y: fn("sk", X)})
    instance = atomic(fn("q", X, fn("sk", X)))
    assert result is binary(AND, quantified(FORALL, (X,), instance), binary(OR, instance, atomic(application("r"))))


def test_skolemize_partial_witnessing_keeps_the_rest_quantified():
    # ? [Y, Z] : q(Y, Z) with only Y witnessed is ? [Z] : q(c, Z), not
    # q(c, Z) (which would read Z universally).
    premise = fo("? [Y, Z] : q(Y, Z)")
    result = skolemize(premise, premise, {Y: c})
    assert result is quantified(EXISTS, (Z,), atomic(fn("q", c, Z)))


def test_choice_axiom_attacks():
    # Each of these would assert more than a choice function can make true.
    witnesses = {Y: fn("sk", X)}
    assert check_choice_axiom(fo("! [X] : ((? [Y] : q(X, Y)) => q(X, sk(X)))"), witnesses) is None
    # the witness forgets X
    assert check_choice_axiom(fo("! [X] : ((? [Y] : q(X, Y)) => q(X, c))"), {Y: c}).reason == "missing_dependency"
    # an instance of a different formula
    assert check_choice_axiom(fo("! [X] : ((? [Y] : q(X, Y)) => q(sk(X), X))"), witnesses).reason == "not_a_choice_axiom"
    # the witness occurs in the quantified formula itself
    assert check_choice_axiom(fo("(? [Y] : q(Y, c)) => q(c, c)"), {Y: c}).reason == "not_fresh"
    # the wrong direction: q(X, sk(X)) => ? [Y] : q(X, Y) is valid, but
    # (? [Y] : ...) as consequent with a universal reading is not the axiom
    assert check_choice_axiom(fo("! [X] : (q(X, sk(X)) => ? [Y] : q(X, Y))"), witnesses).reason == "not_a_choice_axiom"
    # the universal form the right way round, and the wrong way round
    assert check_choice_axiom(fo("! [X] : (q(X, sk(X)) => ! [Y] : q(X, Y))"), witnesses) is None
    assert check_choice_axiom(fo("! [X] : ((! [Y] : q(X, Y)) => q(X, sk(X)))"), witnesses).reason == "not_a_choice_axiom"
    # free variables
    assert check_choice_axiom(fo("(? [Y] : q(X, Y)) => q(X, sk(X))"), witnesses).reason == "choice_not_closed"
    # ! [X] : ? [Y] bodies under an existential prefix are not universal closures
    assert check_choice_axiom(fo("? [X] : ((? [Y] : q(X, Y)) => q(X, sk(X)))"), witnesses).reason == "not_a_choice_axiom"


def test_definition_attacks():
    # Each would constrain existing symbols, or be unsatisfiable.
    symbol = ("d", 1)
    assert check_definition(fo("! [X] : (d(X) <=> p(X))"), symbol) is None
    # d(X) <=> q(X, Y) for every Y says q(X, _) is constant: not a definition
    assert check_definition(fo("! [X, Y] : (d(X) <=> q(X, Y))"), symbol).reason == "definition_arguments"
    # d(X) <=> ~ d(X) is unsatisfiable
    assert check_definition(fo("! [X] : (d(X) <=> ~ d(X))"), symbol).reason == "definition_circular"
    # d applied to a constant only defines one point and constrains nothing
    # else; still refused because it is not the shape
    assert check_definition(fo("d(a) <=> r"), symbol).reason == "definition_arguments"
    # equality cannot be defined
    assert check_definition(fo("! [X, Y] : (X = Y <=> q(X, Y))"), ("=", 2)).reason == "not_a_definition"
    # a disjunction is not a definition
    assert check_definition(fo("! [X] : (d(X) | p(X))"), symbol).reason == "not_a_definition"
    # not closed
    assert check_definition(fo("d(X) <=> p(X)"), symbol).reason == "definition_not_closed"
    # repeated argument
    assert check_definition(fo("! [X] : (d2(X, X) <=> p(X))"), ("d2", 2)).reason == "definition_arguments"


# ============================================================ alpha-equivalence


def test_alpha_equivalence_keeps_bound_and_free_apart():
    assert not alpha_equivalent(fo("! [X] : p(X)"), quantified(FORALL, (Y,), atomic(fn("p", X))))
    assert not alpha_equivalent(atomic(fn("p", X)), fo("! [X] : p(X)"))
    assert not alpha_equivalent(fo("! [X] : p(X)"), fo("? [X] : p(X)"))


def test_alpha_equivalence_matches_binders_not_names():
    # ! [X] : ? [Y] : q(X, Y) and ! [Y] : ? [X] : q(X, Y) share the body
    # object q(X, Y) but bind its variables the other way round.
    assert not alpha_equivalent(fo("! [X] : ? [Y] : q(X, Y)"), fo("! [Y] : ? [X] : q(X, Y)"))
    assert alpha_equivalent(fo("! [X] : ? [Y] : q(X, Y)"), fo("! [Z] : ? [X] : q(Z, X)"))
    # a repeated block variable: the inner one binds
    assert not alpha_equivalent(fo("! [X, Y] : q(X, Y)"), quantified(FORALL, (X, X), atomic(fn("q", X, X))))
    # shadowing: ! [X] : ? [X] : p(X) is about the inner X
    assert not alpha_equivalent(fo("! [X] : ? [X] : q(X, X)"), fo("! [Y] : ? [X] : q(Y, Y)"))


def test_alpha_equivalence_shortcut_on_shared_subformulas():
    # The same hash-consed subformula p(X) under binders of different
    # pairings must not be taken as equal by identity.
    left = fo("! [X] : (! [Y] : (p(X) & p(Y)))")
    right = fo("! [Y] : (! [X] : (p(X) & p(Y)))")
    assert alpha_equivalent(left, fo("! [Z] : (! [W] : (p(Z) & p(W)))"))
    assert not alpha_equivalent(fo("! [X] : ? [Y] : (p(X) & q(X, Y))"), fo("! [Y] : ? [X] : (p(X) & q(X, Y))"))
    assert alpha_equivalent(left, left) and alpha_equivalent(right, right)


def test_substitution_avoids_capture():
    # (! [Y] : q(X, Y)){X := Y} must rename the binder, else ∀Y q(Y, Y).
    result = substitute_free(fo("! [Y] : q(X, Y)"), Substitution({X: Y}))
    assert not alpha_equivalent(result, fo("! [Y] : q(Y, Y)"))
    assert alpha_equivalent(result, quantified(FORALL, (Z,), atomic(fn("q", Y, Z))))


# ==================================================================== models


def test_confirm_countermodel_checks_every_premise():
    # A model where a premise is false is no counter-model.
    model = Interpretation(1, {("a", 0): {(): 0}}, {("p", 1): frozenset()})
    assert confirm_countermodel(model, [cl("p(a)")], cl("~p(a)")).reason == "premise_false"
    assert confirm_countermodel(model, [], cl("~p(a)")).reason == "conclusion_true"
    assert confirm_countermodel(Interpretation(0, {}, {}), [], cl("p(a)")).reason == "empty_domain"
    assert confirm_countermodel(model, [], cl("q(a)")).reason == "missing_table"
    outside = Interpretation(1, {("a", 0): {(): 3}}, {("p", 1): frozenset()})
    assert confirm_countermodel(outside, [], cl("p(a)")).reason == "value_outside_domain"


def test_confirm_countermodel_reads_equality_as_identity():
    # A table for =/2 is ignored: a = a can never be false.
    model = Interpretation(1, {("a", 0): {(): 0}}, {("=", 2): frozenset()})
    assert confirm_countermodel(model, [], cl("a = a")).reason == "conclusion_true"
    assert confirm_countermodel(model, [], fo("! [X] : X = X")).reason == "conclusion_true"


def _kernel_model(model: SmallModel) -> Interpretation:
    elements = range(model.size)
    return Interpretation(
        model.size,
        {
            ("a", 0): {(): model.constants["a"]},
            ("b", 0): {(): model.constants["b"]},
            ("f", 1): {(e,): model.f_table[e] for e in elements},
            ("g", 2): dict(model.g_table),
        },
        {
            ("p", 1): frozenset((e,) for e in model.p_true),
            ("q", 2): frozenset(model.q_true),
            ("r", 0): frozenset({()}) if model.r_true else frozenset(),
        },
    )




@SETTINGS
@given(st.lists(clause_strategy(1, 3), max_size=3), clause_strategy(0, 3), st.integers(0, 2**32 - 1))
def test_confirmed_countermodels_are_countermodels(premises, conclusion, seed):
    # A confirmed counter-model makes assay reject a step: it must really
    # make every premise true and the conclusion false (strategies.py's
    # evaluator, independent of models.py).
    model = random_interpretation(random.Random(seed))
    verdict = confirm_countermodel(_kernel_model(model), premises, conclusion)
    truly = all(clause_holds(p, model) for p in premises) and not clause_holds(conclusion, model)
    assert (verdict is None) == truly


# ======================================================== property searches

_CONSTANTS = (a, application("b"))
_terms = st.recursive(
    st.sampled_from((X, Y, *_CONSTANTS)), lambda inner: st.builds(lambda t: fn("f", t), inner), max_leaves=2
)
_atoms = st.one_of(
    st.builds(lambda t: atomic(fn("p", t)), _terms),
    st.builds(lambda s, t: atomic(fn("q", s, t)), _terms, _terms),
    st.just(atomic(application("r"))),
    st.builds(lambda s, t: atomic(eq(s, t)), _terms, _terms),
    st.sampled_from((VERUM, FALSUM)),
)
_formulas = st.recursive(
    _atoms,
    lambda inner: st.one_of(
        st.builds(negation, inner),
        st.builds(binary, st.sampled_from((AND, OR, IMPLIES, IFF, XOR, NOR, NAND)), inner, inner),
        st.builds(
            quantified,
            st.sampled_from((FORALL, EXISTS)),
            st.sampled_from(((X,), (Y,), (X, Y))),
            inner,
        ),
    ),
    max_leaves=5,
)


def _entailed_somewhere(premises, conclusion) -> bool:
    return countermodel(premises, conclusion) is None


@SETTINGS
@given(st.lists(_formulas, min_size=1, max_size=2), _formulas)
def test_accepted_entailments_hold_in_every_small_model(premises, conclusion):
    # The search plays the adversary: whatever refutation of the kernel's
    # clauses it finds and the kernel accepts, premises ⊨ conclusion must
    # hold in every structure of size 1-2 (and the sampled ones of size 3).
    clauses = entailment_clauses(premises, conclusion)
    chain = refute(clauses, 300, 40, 500)
    if chain is not None and check_entailment(premises, conclusion, chain) is None:
        assert _entailed_somewhere(premises, conclusion)


@SETTINGS
@given(_formulas, st.sampled_from(("drop_negation", "swap_quantifier", "same")))
def test_mutated_conclusions_are_refused_when_invalid(formula, mutation):
    # Start from F ⊨ F and mutate the conclusion; when the mutant is not a
    # consequence, no accepted refutation may exist.
    if mutation == "drop_negation" and formula.connective == "~":
        conclusion = formula.arguments[0]
    elif mutation == "swap_quantifier" and formula.connective in (FORALL, EXISTS):
        other = EXISTS if formula.connective == FORALL else FORALL
        conclusion = quantified(other, formula.variables, formula.arguments[0])
    else:
        conclusion = negation(formula)
    chain = refute(entailment_clauses([formula], conclusion), 300, 40, 500)
    if chain is not None and check_entailment([formula], conclusion, chain) is None:
        assert _entailed_somewhere([formula], conclusion)


# Propositional formulas: the clause list of premises ∧ ¬conclusion must be
# satisfiable exactly when SymPy's satisfiable says the formulas are.

_LETTERS = ("r", "s", "t")
_propositional = st.recursive(
    st.sampled_from(tuple(atomic(application(name)) for name in _LETTERS) + (VERUM, FALSUM)),
    lambda inner: st.one_of(
        st.builds(negation, inner),
        st.builds(binary, st.sampled_from((AND, OR, IMPLIES, IFF, XOR, NOR, NAND)), inner, inner),
    ),
    max_leaves=10,
)


def _sympy(formula: Formula):
    kind = formula.connective
    if kind == "atom":
        return sympy.Symbol(formula.atom.symbol)
    if kind == "$true":
        return sympy.true
    if kind == "$false":
        return sympy.false
    if kind == "~":
        return sympy.Not(_sympy(formula.arguments[0]))
    left, right = (_sympy(argument) for argument in formula.arguments)
    return {
        AND: lambda: sympy.And(left, right),
        OR: lambda: sympy.Or(left, right),
        IMPLIES: lambda: sympy.Implies(left, right),
        IFF: lambda: sympy.Equivalent(left, right),
        XOR: lambda: sympy.Xor(left, right),
        NOR: lambda: sympy.Nor(left, right),
        NAND: lambda: sympy.Nand(left, right),
    }[kind]()


def _clauses_satisfiable(clauses) -> bool:
    names = sorted({literal.atom.symbol for clause in clauses for literal in clause.literals})
    for bits in itertools.product((False, True), repeat=len(names)):
        value = dict(zip(names, bits))
        if all(any(value[lit.atom.symbol] == lit.positive for lit in clause.literals) for clause in clauses):
            return True
    return False


@SETTINGS
@given(st.lists(_propositional, min_size=1, max_size=2), _propositional)
def test_entailment_clauses_encode_premises_and_negated_conclusion(premises, conclusion):
    # Source: SymPy's propositional satisfiable() as the reference for
    # premises ∧ ¬conclusion; the kernel's clause list (with its definition
    # atoms) must agree, or a refutation of it would prove a non-theorem.
    reference = sympy.And(*(_sympy(p) for p in premises), sympy.Not(_sympy(conclusion)))
    expected = bool(satisfiable(reference))
    assert _clauses_satisfiable(entailment_clauses(premises, conclusion)) == expected


# ================================================ random native certificates


_PROBLEM_HEADER = "% badge readers (invented)\n"


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow, HealthCheck.function_scoped_fixture])
@given(
    st.lists(literal_strategy, min_size=1, max_size=3),
    st.lists(literal_strategy, min_size=1, max_size=3),
    st.integers(0, 2),
    st.integers(0, 2),
    substitution_strategy,
    substitution_strategy,
    st.lists(literal_strategy, max_size=3),
    st.booleans(),
    st.sampled_from(("resolvent", "resolvent_less_one", "random")),
    st.integers(0, 2**32 - 1),
)
def test_random_native_resolution_steps(tmp_path_factory, left, right, i, j, s1, s2, claimed, complement, claim, seed):
    # Random native certificates through checker.run.check: a step the run
    # marks checked must be a consequence of its parents in every sampled
    # model (strategies.py's evaluator).
    i, j = i % len(left), j % len(right)
    if complement:  # a clashing pair under one substitution, so that the evidence fits
        right = [left[i].negated(), *right]
        j, s2 = 0, s1
    left_clause, right_clause = Clause(left), Clause(right)
    claimed_clause = Clause(claimed)
    # Half the claims are the resolvent itself, or it with one literal
    # dropped (a strengthening the run must refuse), so that steps do pass.
    resolvent = replay([left_clause, right_clause], Resolution(0, i, 1, j, s1, s2))
    if claim != "random" and not isinstance(resolvent, Failure):
        kept = list(resolvent.literals)
        if claim == "resolvent_less_one" and kept:
            kept.pop(seed % len(kept))
        claimed_clause = Clause(kept)
    problem = _PROBLEM_HEADER + f"cnf(left, axiom, {left_clause}).\ncnf(right, axiom, {right_clause}).\n"
    leaf = lambda name, clause: {
        "name": name, "role": "axiom", "language": "cnf", "formula": str(clause),
        "origin": {"kind": "file", "detail": ["problem.p", name]},
    }
    evidence = {"rule": "resolution", "parents": ["left", "right"], "left": 0, "left_literal": i, "right": 1,
                "right_literal": j,
                "left_substitution": {v.symbol: str(t) for v, t in s1.items_sorted()},
                "right_substitution": {v.symbol: str(t) for v, t in s2.items_sorted()}}
    records = [
        {"assay_certificate": 1, "problem": "problem.p"},
        leaf("left", left_clause),
        leaf("right", right_clause),
        {"name": "step", "role": "plain", "language": "cnf", "formula": str(claimed_clause), "inference": evidence},
    ]
    directory = tmp_path_factory.mktemp("native")
    (directory / "problem.p").write_text(problem)
    (directory / "proof.jsonl").write_text("\n".join(json.dumps(r) for r in records) + "\n")
    report = check(str(directory / "proof.jsonl"), str(directory / "problem.p"))
    step = next(s for s in report.steps if s.name == "step")
    if step.outcome == CHECKED:
        rng = random.Random(seed)
        for _ in range(40):
            model = random_interpretation(rng)
            if clause_holds(left_clause, model) and clause_holds(right_clause, model):
                assert clause_holds(claimed_clause, model)
