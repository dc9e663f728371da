"""Published worked examples of unifiers, resolvents and factors."""

from __future__ import annotations

from search_strategies import N, P, fn, is_instance_of

from checker.kernel.clauses import Clause
from checker.kernel.rules import Instantiation, Resolution, check_clause_step, replay
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable, variables_of
from checker.search.reconstruct import reconstruct
from checker.search.unify import unify, unify_all

a = application("a")
x, y, z, u = (variable(name) for name in ("x", "y", "z", "u"))
x1, x2, x3, x4 = (variable(f"x{i}") for i in range(1, 5))


def _equivalent(found: Substitution, published: Substitution, terms) -> bool:
    variables = sorted(set().union(*(variables_of(t) for t in terms)), key=lambda v: v.symbol)
    return is_instance_of(found, published, variables) and is_instance_of(published, found, variables)


def test_martelli_montanari_worked_example():
    # Martelli & Montanari 1982, "An efficient unification algorithm", ACM
    # TOPLAS 4(2), the introductory example (from memory): the equations
    # g(x2) = x1 and f(x1, h(x1), x2) = f(g(x3), x4, x3) have the solved form
    # x1 = g(x3), x2 = x3, x4 = h(g(x3)).
    pairs = [(fn("g", x2), x1), (fn("f", x1, fn("h", x1), x2), fn("f", fn("g", x3), x4, x3))]
    found = unify_all(pairs)
    assert found is not None
    for left, right in pairs:
        assert found(left) is found(right)
    published = Substitution({x1: fn("g", x3), x2: x3, x4: fn("h", fn("g", x3))})
    assert _equivalent(found, published, [t for pair in pairs for t in pair])


def test_chang_lee_unification_example():
    # Chang & Lee 1973, "Symbolic Logic and Mechanical Theorem Proving",
    # section 5.4, worked example of the unification algorithm (from memory):
    # W = {P(a, x, f(g(y))), P(z, f(z), f(u))} has mgu {a/z, f(a)/x, g(y)/u}.
    left = fn("P", a, x, fn("f", fn("g", y)))
    right = fn("P", z, fn("f", z), fn("f", u))
    assert unify(left, right) == Substitution({z: a, x: fn("f", a), u: fn("g", y)})


def test_chang_lee_non_unifiable_example():
    # Chang & Lee 1973, section 5.4 (from memory): W = {Q(f(a), g(x)), Q(y, y)}
    # is not unifiable (y would have to be both f(a) and g(x)).
    assert unify(fn("Q", fn("f", a), fn("g", x)), fn("Q", y, y)) is None


def test_hart_memo_on_robinsons_algorithm():
    # T. Hart 1965, "A useful algebraic property of Robinson's unification
    # algorithm", MIT AI Memo 91 (abstract), on Robinson 1965, "A
    # machine-oriented logic based on the resolution principle", JACM 12(1):
    # A = {f(x), y, f(g(u)), f(g(z))} has mgu {g(u)/x, f(g(u))/y, u/z}, and
    # {g(z)/x, f(g(z))/y, z/u} is another most general unifier of A.
    members = [fn("f", x), y, fn("f", fn("g", u)), fn("f", fn("g", z))]
    found = unify_all([(members[0], other) for other in members[1:]])
    assert found is not None
    assert len({found(member) for member in members}) == 1
    first = Substitution({x: fn("g", u), y: fn("f", fn("g", u)), z: u})
    second = Substitution({x: fn("g", z), y: fn("f", fn("g", z)), u: z})
    assert _equivalent(found, first, members)
    assert _equivalent(found, second, members)


def test_toronto_course_mgu_examples():
    # University of Toronto CSC324 (fall 2004), "MGU examples from class",
    # slide 91: g(a,W,h(X)) and g(Y,f(Y,Z),Z) unify with W = f(a,h(X)),
    # Y = a, Z = h(X); f(X,g(X),Z) and f(Z,Y,h(Y)) do not unify (the
    # attempted substitution does not terminate: the occurs check fails).
    W, X, Y, Z = (variable(name) for name in "WXYZ")
    found = unify(fn("g", a, W, fn("h", X)), fn("g", Y, fn("f", Y, Z), Z))
    assert found == Substitution({W: fn("f", a, fn("h", X)), Y: a, Z: fn("h", X)})
    assert unify(fn("f", X, fn("g", X), Z), fn("f", Z, Y, fn("h", Y))) is None
    # and f(X,h(b,X)) with f(g(P,a),h(b,g(Q,Q))): P = a, Q = a, X = g(a,a)
    b, Pv, Qv = application("b"), variable("P"), variable("Q")
    found = unify(fn("f", X, fn("h", b, X)), fn("f", fn("g", Pv, a), fn("h", b, fn("g", Qv, Qv))))
    assert found == Substitution({Pv: a, Qv: a, X: fn("g", a, a)})


def test_chang_lee_resolvent_with_shared_variable_names():
    # Chang & Lee 1973, section 5.5, resolvent example (from memory):
    # C1 = P(x) | Q(x), C2 = ~P(a) | R(x); renaming x to y in C2, the
    # resolvent is Q(a) | R(y).  The two clauses share the name x, so the
    # search must rename apart and split the mgu per parent.
    c1 = Clause([P("P", x), P("Q", x)])
    c2 = Clause([N("P", a), P("R", x)])
    claimed = Clause([P("Q", a), P("R", y)])
    found = reconstruct([c1, c2], claimed, "resolution")
    assert isinstance(found.evidence, Resolution)
    assert found.evidence.left_substitution(x) is a
    assert found.evidence.right_substitution(x) is not a  # C2's x stays free
    assert check_clause_step([c1, c2], claimed, found.evidence, found.theta) is None
    # the computed resolvent is the published one, up to renaming
    assert replay([c1, c2], found.evidence).instance(found.theta).literal_set == claimed.literal_set


def test_chang_lee_factor():
    # Chang & Lee 1973, section 5.5, factor example (from memory):
    # C = P(x) | P(f(y)) | ~Q(x) has the factor P(f(y)) | ~Q(f(y)).
    clause = Clause([P("P", x), P("P", fn("f", y)), N("Q", x)])
    claimed = Clause([P("P", fn("f", y)), N("Q", fn("f", y))])
    found = reconstruct([clause], claimed, "factoring")
    assert isinstance(found.evidence, Instantiation)
    assert found.evidence.substitution == Substitution({x: fn("f", y)})
    assert check_clause_step([clause], claimed, found.evidence, found.theta) is None
