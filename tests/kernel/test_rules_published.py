"""Published worked examples, replayed by the kernel with the unifiers the
examples give (the kernel does not search for them).  All are written from
memory of the cited texts; symbol names follow the texts, variables are
written in upper case as TPTP wants."""

from __future__ import annotations

from checker.kernel.clauses import Clause, Literal
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

X, Y, Z = variable("X"), variable("Y"), variable("Z")


def atom(symbol: str, *arguments: Term) -> Term:
    return application(symbol, arguments)


def const(name: str) -> Term:
    return application(name)


def pos(symbol: str, *arguments: Term) -> Literal:
    return Literal(True, atom(symbol, *arguments))


def neg(symbol: str, *arguments: Term) -> Literal:
    return Literal(False, atom(symbol, *arguments))


def clause(*literals: Literal) -> Clause:
    return Clause(literals)


def sub(**bindings: Term) -> Substitution:
    return Substitution({variable(name): value for name, value in bindings.items()})


def F(t: Term) -> Term:
    return application("F", (t,))


def G(t: Term) -> Term:
    return application("G", (t,))


# --- Chang & Lee 1973, "Symbolic Logic and Mechanical Theorem Proving" ------


a, b, c = const("a"), const("b"), const("c")


def test_chang_lee_binary_resolvent():
    # Chang & Lee 1973, ch. 5 (from memory): C1 = P(x) | Q(x) and
    # C2 = ~P(a) | R(x); renaming C2's x to y and taking sigma = {x -> a}
    # gives the binary resolvent Q(a) | R(y).
    c1 = clause(pos("P", X), pos("Q", X))
    c2 = clause(neg("P", a), pos("R", X))
    evidence = Resolution(0, 0, 1, 0, sub(X=a), sub(X=Y))
    assert replay([c1, c2], evidence) == clause(pos("Q", a), pos("R", Y))
    assert check_clause_step([c1, c2], clause(pos("R", Y), pos("Q", a)), evidence) is None
    # Without renaming C2, the resolvent is Q(a) | R(x), a variant: theta renames it.
    plain = Resolution(0, 0, 1, 0, sub(X=a))
    assert check_clause_step([c1, c2], clause(pos("Q", a), pos("R", Y)), plain, sub(X=Y)) is None
    # Claiming R(a) instead of R(y) is not what the step gives.
    assert check_clause_step([c1, c2], clause(pos("Q", a), pos("R", a)), plain).reason == "missing_from_claimed"


def test_chang_lee_factor():
    # Chang & Lee 1973, ch. 5 (from memory): C = P(x) | P(f(y)) | ~Q(x);
    # sigma = {x -> f(y)} unifies the first two literals, and
    # P(f(y)) | ~Q(f(y)) is a factor of C.
    y_f = application("f", (Y,))
    c = clause(pos("P", X), pos("P", y_f), neg("Q", X))
    assert check_clause_step([c], clause(pos("P", y_f), neg("Q", y_f)), Instantiation(0, sub(X=y_f))) is None


def test_chang_lee_paramodulant():
    # Chang & Lee 1973, ch. 8 (from memory): C1 = P(g(f(x))) | Q(x) and
    # C2 = f(g(b)) = a | R(g(c)); f(x) in C1 unifies with f(g(b)) under
    # sigma = {x -> g(b)}, and the paramodulant is P(g(a)) | Q(g(b)) | R(g(c)).
    def f(t):
        return application("f", (t,))

    def g(t):
        return application("g", (t,))

    c1 = clause(pos("P", g(f(X))), pos("Q", X))
    c2 = Clause([Literal(True, application("=", (f(g(b)), a))), pos("R", g(c))])
    evidence = Paramodulation(1, 0, True, 0, 0, (1, 1), target_substitution=sub(X=g(b)))
    claimed = clause(pos("P", g(a)), pos("Q", g(b)), pos("R", g(c)))
    assert replay([c1, c2], evidence) == claimed
    assert check_clause_step([c1, c2], claimed, evidence) is None


# --- Russell & Norvig, "Artificial Intelligence: A Modern Approach" ----------


Jack, Tuna, Curiosity = const("Jack"), const("Tuna"), const("Curiosity")

# The "Curiosity killed the cat?" example in conjunctive normal form
# (Russell & Norvig, AIMA, 3rd ed., ch. 9, resolution section; from memory).
# F and G are the Skolem functions of the text.
CAT_AXIOMS = [
    clause(pos("Animal", F(X)), pos("Loves", G(X), X)),  # A1
    clause(neg("Loves", X, F(X)), pos("Loves", G(X), X)),  # A2
    clause(neg("Loves", Y, X), neg("Animal", Z), neg("Kills", X, Z)),  # B
    clause(neg("Animal", X), pos("Loves", Jack, X)),  # C
    clause(pos("Kills", Jack, Tuna), pos("Kills", Curiosity, Tuna)),  # D
    clause(pos("Cat", Tuna)),  # E
    clause(neg("Cat", X), pos("Animal", X)),  # F
]
A1, A2, B, C, D, E, F_ = range(7)
NOT_GOAL = 7  # ~Kills(Curiosity, Tuna): the negated goal, or the negated claim

# The refutation of the text's figure, as inferences 8, 9, ... of a chain.
CAT_PROOF = (
    # 8: Animal(Tuna), from E and F
    Resolution(E, 0, F_, 0, right_substitution=sub(X=Tuna)),
    # 9: Kills(Jack, Tuna), from D and the negated goal
    Resolution(D, 1, NOT_GOAL, 0),
    # 10: ~Loves(y, x) | ~Kills(x, Tuna), from B and Animal(Tuna)
    Resolution(B, 1, 8, 0, sub(Z=Tuna)),
    # 11: ~Loves(y, Jack), from 10 and Kills(Jack, Tuna)
    Resolution(10, 1, 9, 0, sub(X=Jack)),
    # 12: Loves(Jack, F(x)) | Loves(G(x), x), from C and A1
    Resolution(C, 0, A1, 0, sub(X=F(X))),
    # 13: Loves(G(Jack), Jack), from 12 and A2 (both copies merge)
    Resolution(12, 0, A2, 0, sub(X=Jack), sub(X=Jack)),
    # 14: the empty clause, from 13 and 11
    Resolution(13, 0, 11, 0, right_substitution=sub(Y=G(Jack))),
)


def test_curiosity_resolvents_are_the_ones_in_the_text():
    premises = [*CAT_AXIOMS, clause(neg("Kills", Curiosity, Tuna))]
    expected = [
        clause(pos("Animal", Tuna)),
        clause(pos("Kills", Jack, Tuna)),
        clause(neg("Loves", Y, X), neg("Kills", X, Tuna)),
        clause(neg("Loves", Y, Jack)),
        clause(pos("Loves", Jack, F(X)), pos("Loves", G(X), X)),
        clause(pos("Loves", G(Jack), Jack)),
        clause(),
    ]
    available = list(premises)
    for evidence, resolvent in zip(CAT_PROOF, expected, strict=True):
        assert check_clause_step(available, resolvent, evidence) is None, evidence
        available.append(replay(available, evidence))


def test_curiosity_refutation_as_one_chain():
    premises = [*CAT_AXIOMS, clause(neg("Kills", Curiosity, Tuna))]
    assert check_clause_step(premises, clause(), Chain(CAT_PROOF)) is None
    # Without the negated goal, premise 7 is inference 1's Animal(Tuna), and
    # inference 2 no longer fits: the axioms alone are not refuted.
    alone = check_clause_step(CAT_AXIOMS, clause(), Chain(CAT_PROOF))
    assert alone.reason == "same_sign" and alone.message.startswith("inference 2 of 7")


def test_curiosity_killed_the_cat_as_a_refuted_claim():
    claimed = clause(pos("Kills", Curiosity, Tuna))
    assert negated_claim(CAT_AXIOMS, claimed) == [clause(neg("Kills", Curiosity, Tuna))]
    assert check_clause_step(CAT_AXIOMS, claimed, Refutation(Chain(CAT_PROOF))) is None
    # Jack killed it is not what this refutation shows: its negation is
    # ~Kills(Jack, Tuna), with which inference 9 no longer yields Kills(Jack, Tuna).
    wrong = check_clause_step(CAT_AXIOMS, clause(pos("Kills", Jack, Tuna)), Refutation(Chain(CAT_PROOF)))
    assert wrong is not None and wrong.reason == "atoms_differ"
    assert "inference 2 of 7" in wrong.message and "`Curiosity` vs `Jack`" in wrong.message


West, Nono, America, M1 = const("West"), const("Nono"), const("America"), const("M1")

# The crime example ("it is a crime for an American to sell weapons to
# hostile nations ...") in conjunctive normal form (Russell & Norvig, AIMA,
# 3rd ed., ch. 9; from memory).
CRIME_AXIOMS = [
    clause(neg("American", X), neg("Weapon", Y), neg("Sells", X, Y, Z), neg("Hostile", Z), pos("Criminal", X)),
    clause(neg("Missile", X), neg("Owns", Nono, X), pos("Sells", West, X, Nono)),
    clause(neg("Enemy", X, America), pos("Hostile", X)),
    clause(neg("Missile", X), pos("Weapon", X)),
    clause(pos("Owns", Nono, M1)),
    clause(pos("Missile", M1)),
    clause(pos("American", West)),
    clause(pos("Enemy", Nono, America)),
]


def test_colonel_west_is_a_criminal_by_refutation():
    # The text's linear refutation from ~Criminal(West) (premise 8).
    goal = 8
    proof = Chain(
        (
            Resolution(goal, 0, 0, 4, right_substitution=sub(X=West)),  # 9
            Resolution(9, 0, 6, 0),  # 10: ~Weapon(y) | ~Sells(West,y,z) | ~Hostile(z)
            Resolution(10, 0, 3, 1, sub(), sub(X=Y)),  # 11: ~Sells(West,y,z) | ~Hostile(z) | ~Missile(y)
            Resolution(11, 2, 5, 0, sub(Y=M1)),  # 12: ~Sells(West,M1,z) | ~Hostile(z)
            Resolution(12, 0, 1, 2, sub(Z=Nono), sub(X=M1)),  # 13: ~Hostile(Nono) | ~Missile(M1) | ~Owns(Nono,M1)
            Resolution(13, 1, 5, 0),  # 14: ~Hostile(Nono) | ~Owns(Nono,M1)
            Resolution(14, 1, 4, 0),  # 15: ~Hostile(Nono)
            Resolution(15, 0, 2, 1, right_substitution=sub(X=Nono)),  # 16: ~Enemy(Nono,America)
            Resolution(16, 0, 7, 0),  # 17: the empty clause
        )
    )
    assert check_clause_step(CRIME_AXIOMS, clause(pos("Criminal", West)), Refutation(proof)) is None
    assert replay([*CRIME_AXIOMS, clause(neg("Criminal", West))], Chain(proof.steps[:7])) == clause(neg("Hostile", Nono))


def test_a_claim_with_variables_is_refuted_with_fresh_constants():
    # Chang & Lee's resolvent Q(a) | R(y) above, shown instead by refuting
    # its negation ~Q(a), ~R(c0) with c0 a fresh constant.
    c1 = clause(pos("P", X), pos("Q", X))
    c2 = clause(neg("P", a), pos("R", X))
    claimed = clause(pos("Q", a), pos("R", Y))
    c0 = const(f"{CLAIM_CONSTANT_PREFIX}0")
    assert negated_claim([c1, c2], claimed) == [clause(neg("Q", a)), clause(neg("R", c0))]
    proof = Chain(
        (
            Resolution(0, 1, 2, 0, sub(X=a)),  # 4: P(a)
            Resolution(4, 0, 1, 0, right_substitution=sub(X=c0)),  # 5: R(c0)
            Resolution(5, 0, 3, 0),  # 6: the empty clause
        )
    )
    assert check_clause_step([c1, c2], claimed, Refutation(proof)) is None


# --- equality rules -----------------------------------------------------------


def test_equality_resolution_and_factoring_as_defined_for_superposition():
    # The equality resolution and equality factoring rules of the
    # superposition calculus (Bachmair & Ganzinger 1994, "Rewrite-based
    # equational theorem proving with selection and simplification", from
    # memory): from s != t | C with s, t unified by sigma derive C sigma;
    # from s = t | s' = t' | C with s, s' unified derive
    # (t != t' | s' = t' | C) sigma.  The instances are common practice.
    def f(t):
        return application("f", (t,))

    def eq(s, t, positive=True):
        return Literal(positive, application("=", (s, t)))

    assert replay([clause(eq(f(X), f(a), False), pos("p", X))], EqualityResolution(0, 0, sub(X=a))) == clause(pos("p", a))
    premise = clause(eq(f(X), b), eq(f(a), c), pos("p", X))
    factored = replay([premise], EqualityFactoring(0, 0, 1, substitution=sub(X=a)))
    assert factored == clause(eq(b, c, False), eq(f(a), c), pos("p", a))
