"""Hypothesis strategies and small builders shared by the search tests.

The signature is tiny on purpose (three constants, three functions, four
variables) so that random pairs unify often enough to be interesting.
"""

from __future__ import annotations

import sympy
from hypothesis import strategies as st
from sympy.logic.boolalg import And, Equivalent, Implies, Not, Or, Xor

from checker.kernel.clauses import Clause, Literal
from checker.kernel.formulas import (
    AND,
    ATOM,
    FALSUM,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    OR,
    VERUM,
    XOR,
    Formula,
    atomic,
    binary,
    negation,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, variable

CONSTANTS = ("a", "b", "c")
FUNCTIONS = (("f", 1), ("g", 2), ("h", 1))
VARIABLES = ("X", "Y", "Z", "W")


def leaves(with_variables: bool = True):
    options = [st.sampled_from([application(name) for name in CONSTANTS])]
    if with_variables:
        options.append(st.sampled_from([variable(name) for name in VARIABLES]))
    return st.one_of(*options)


def _extend(children):
    return st.one_of(
        *[
            st.tuples(*[children] * arity).map(lambda args, name=name: application(name, args))
            for name, arity in FUNCTIONS
        ]
    )


def terms(with_variables: bool = True, max_leaves: int = 8):
    return st.recursive(leaves(with_variables), _extend, max_leaves=max_leaves)


def ground_terms(max_leaves: int = 6):
    return terms(with_variables=False, max_leaves=max_leaves)


def atoms(with_variables: bool = True, max_leaves: int = 6):
    """Atoms of p/1, q/2 and equality."""
    term = terms(with_variables, max_leaves)
    return st.one_of(
        term.map(lambda t: application("p", (t,))),
        st.tuples(term, term).map(lambda ts: application("q", ts)),
        st.tuples(term, term).map(lambda ts: application("=", ts)),
    )


def literals(with_variables: bool = True, max_leaves: int = 5):
    return st.tuples(st.booleans(), atoms(with_variables, max_leaves)).map(lambda pair: Literal(*pair))


def clauses(with_variables: bool = True, max_size: int = 4):
    return st.lists(literals(with_variables), min_size=1, max_size=max_size).map(Clause)


def substitutions(with_variables: bool = True):
    return st.dictionaries(
        st.sampled_from([variable(name) for name in VARIABLES]), terms(with_variables, max_leaves=4), max_size=4
    ).map(Substitution)


def is_instance_of(specific: Substitution, general: Substitution, variables: list[Term]) -> bool:
    """Whether specific = rho after general on ``variables`` for some rho:
    one-way matching of the general images onto the specific ones."""
    from checker.search.unify import match_into

    bindings: dict[Term, Term] = {}
    for var in variables:
        extended = match_into(general(var), specific(var), bindings)
        if extended is None:
            return False
        bindings = extended
    return True


def P(symbol: str, *arguments: Term) -> Literal:
    return Literal(True, application(symbol, arguments))


def N(symbol: str, *arguments: Term) -> Literal:
    return Literal(False, application(symbol, arguments))


def fn(symbol: str, *arguments: Term) -> Term:
    return application(symbol, arguments)


def eq(left: Term, right: Term) -> Literal:
    return Literal(True, application("=", (left, right)))


def neq(left: Term, right: Term) -> Literal:
    return Literal(False, application("=", (left, right)))


# Propositional formulas and their SymPy images (SymPy's propositional
# logic is the reference library these tests compare against).

SYMPY_CONNECTIVES = {
    AND: And, OR: Or, IMPLIES: Implies, IFF: Equivalent, XOR: Xor,
    NOR: lambda a, b: Not(Or(a, b)), NAND: lambda a, b: Not(And(a, b)),
}


def propositional_formulas(names: tuple[str, ...], connectives: tuple[str, ...], max_leaves: int):
    """Random formulas over the propositions ``names``, ``$true`` and ``$false``."""
    propositions = st.sampled_from([atomic(application(n, ())) for n in names] + [VERUM, FALSUM])
    return st.recursive(
        propositions,
        lambda children: st.one_of(st.builds(negation, children),
                                   st.builds(binary, st.sampled_from(connectives), children, children)),
        max_leaves=max_leaves,
    )


def to_sympy(formula: Formula):
    """The SymPy expression of a propositional formula."""
    if formula.connective == ATOM:
        return sympy.Symbol(formula.atom.symbol)
    if formula is VERUM:
        return sympy.true
    if formula is FALSUM:
        return sympy.false
    if formula.connective == "~":
        return Not(to_sympy(formula.arguments[0]))
    return SYMPY_CONNECTIVES[formula.connective](*(to_sympy(a) for a in formula.arguments))
