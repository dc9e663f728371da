"""Conclusions of a rewriting record computed by rewriting (untrusted,
every one replayed by the kernel)."""

from hypothesis import given, settings
from hypothesis import strategies as st

from checker.kernel.clauses import Clause
from checker.kernel.rules import Chain, Paramodulation, check_clause_step
from checker.search.demodulation import demodulants, describe_rewriting, is_rewriting
from formats.tptp import parse_clause

# Group axioms (from memory, any algebra textbook): associativity, left
# identity, left inverse.
ASSOCIATIVITY = parse_clause("mult(mult(X1,X2),X3) = mult(X1,mult(X2,X3))")
LEFT_IDENTITY = parse_clause("mult(e,X1) = X1")


def test_rule_names_of_demodulation_are_recognised():
    assert all(is_rewriting(name) for name in ("rw", "RW", "demodulation", "forward_demodulation", "rewrite"))
    assert not any(is_rewriting(name) for name in ("spm", "superposition", "resolution", "rwx", "cn"))


def test_the_squared_product_is_rewritten_once_then_to_its_normal_form():
    # (xy)(xy) = (xx)(yy) with associativity as written: one rewrite at the
    # outermost-leftmost redex first, then the normal form (two rewrites).
    square = parse_clause("mult(mult(X1,X2),mult(X1,X2)) = mult(mult(X1,X1),mult(X2,X2))")
    found = demodulants([square, ASSOCIATIVITY])
    clauses = [clause for clause, _ in found]
    assert clauses[0] == parse_clause("mult(X1,mult(X2,mult(X1,X2))) = mult(mult(X1,X1),mult(X2,X2))")
    assert clauses[1] == parse_clause("mult(X1,mult(X2,mult(X1,X2))) = mult(X1,mult(X1,mult(X2,X2)))")
    assert isinstance(found[0][1], Paramodulation) and isinstance(found[1][1], Chain)
    assert describe_rewriting(found[1][1]) == "2 rewrites of premise 0 to a normal form"
    assert "as written" in describe_rewriting(found[0][1])
    assert len(set(clauses)) == len(clauses)
    for clause, evidence in found:
        assert check_clause_step([square, ASSOCIATIVITY], clause, evidence) is None


def test_nothing_to_rewrite_and_no_equation_give_no_demodulants():
    assert demodulants([parse_clause("p(a)"), LEFT_IDENTITY]) == []
    assert demodulants([parse_clause("p(mult(e,a))"), parse_clause("q(a)")]) == []
    assert demodulants([parse_clause("p(mult(e,a))"), parse_clause("mult(e,X) = X | q(X)")]) == []
    assert demodulants([]) == []


def test_the_rewritten_clause_is_not_instantiated():
    # Demodulation matches the equation into the clause: p(mult(X,a)) has no
    # instance of mult(e,Y) without binding X, so nothing is rewritten.
    assert demodulants([parse_clause("p(mult(X,a))"), LEFT_IDENTITY]) == []


def test_a_non_terminating_orientation_offers_no_normal_form():
    # Commutativity as written rewrites forever; only single rewrites come back.
    commutativity = parse_clause("plus(X,Y) = plus(Y,X)")
    found = demodulants([parse_clause("p(plus(a,b))"), commutativity], limit=10)
    assert [clause for clause, _ in found] == [parse_clause("p(plus(b,a))")]


_TERMS = st.recursive(
    st.sampled_from(["a", "b", "e", "X", "Y"]),
    lambda inner: st.builds(lambda f, x, y: f"{f}({x},{y})", st.sampled_from(["mult", "plus"]), inner, inner),
    max_leaves=8,
)
_EQUATIONS = st.lists(
    st.sampled_from([
        "mult(mult(X1,X2),X3) = mult(X1,mult(X2,X3))",
        "mult(e,X1) = X1",
        "plus(X1,X1) = e",
        "mult(X1,e) = X1",
        "plus(a,b) = mult(b,a)",
    ]),
    min_size=1, max_size=3, unique=True,
)


@settings(max_examples=60, deadline=None)
@given(_TERMS, _TERMS, _EQUATIONS)
def test_every_demodulant_is_what_the_kernel_computes_from_its_evidence(left, right, equations):
    target = parse_clause(f"{left} = {right} | p({left})")
    premises = [target, *(parse_clause(text) for text in equations)]
    found = demodulants(premises, limit=15)
    assert len({clause.literal_set for clause, _ in found}) == len(found)
    for clause, evidence in found:
        assert isinstance(clause, Clause)
        assert check_clause_step(premises, clause, evidence) is None
