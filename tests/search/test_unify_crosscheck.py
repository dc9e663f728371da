"""Cross-check of computed mgus against the PyPI library logical-unification.

That library unifies Python tuples and does no occurs check: on a pair
that has no unifier only because a variable would have to contain itself,
it still returns bindings, which are then cyclic.  So the comparison is:
whenever the library's bindings are acyclic, both must agree that a
unifier exists and the two unifiers must be instance-equivalent; whenever
they are cyclic, ours must say there is no unifier.
"""

from __future__ import annotations

from hypothesis import given, settings
from search_strategies import is_instance_of, terms
from unification import unify as library_unify
from unification import var as library_var
from unification.variable import Var

from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, variable, variables_of
from checker.search.unify import unify


def to_library(term: Term, variables: dict[str, Var]):
    """Our term as the library's tuple form: (symbol, argument...)."""
    stack = [term]
    built: dict[Term, object] = {}
    order = []
    while stack:
        current = stack.pop()
        order.append(current)
        stack.extend(current.arguments)
    for current in reversed(order):
        if current.is_variable:
            built[current] = variables.setdefault(current.symbol, library_var(current.symbol))
        else:
            built[current] = (current.symbol, *(built[a] for a in current.arguments))
    return built[term]


def _cyclic(bindings: dict) -> bool:
    """Whether following the library's bindings from some variable leads back to it."""

    def reachable(start):
        seen, stack = set(), [bindings[start]]
        while stack:
            value = stack.pop()
            if isinstance(value, Var):
                if value is start:
                    return True
                if value in bindings and value not in seen:
                    seen.add(value)
                    stack.append(bindings[value])
            elif isinstance(value, tuple):
                stack.extend(value[1:])
        return False

    return any(reachable(start) for start in bindings)


def from_library(value, names: dict[Var, str], bindings: dict) -> Term:
    """The library's value with its bindings followed, as our term."""
    pending = [value]
    order = []
    while pending:
        current = pending.pop()
        while isinstance(current, Var) and current in bindings:
            current = bindings[current]
        order.append(current)
        if isinstance(current, tuple):
            pending.extend(current[1:])
    built: dict[int, Term] = {}

    def resolve(current):
        while isinstance(current, Var) and current in bindings:
            current = bindings[current]
        return current

    for current in reversed(order):
        if isinstance(current, Var):
            built[id(current)] = variable(names[current])
        else:
            built[id(current)] = application(current[0], tuple(built[id(resolve(a))] for a in current[1:]))
    return built[id(resolve(value))]


@settings(max_examples=400, deadline=None)
@given(terms(max_leaves=7), terms(max_leaves=7))
def test_mgu_agrees_with_logical_unification(left, right):
    library_variables: dict[str, Var] = {}
    result = library_unify(to_library(left, library_variables), to_library(right, library_variables), {})
    ours = unify(left, right)
    if result is False:
        assert ours is None
        return
    if _cyclic(result):
        # a solution only without the occurs check: no first-order unifier
        assert ours is None
        return
    assert ours is not None
    names = {v: name for name, v in library_variables.items()}
    theirs = Substitution({variable(names[v]): from_library(value, names, result) for v, value in result.items()})
    assert theirs(left) is theirs(right)
    variables = sorted(variables_of(left) | variables_of(right), key=lambda v: v.symbol)
    assert is_instance_of(ours, theirs, variables)
    assert is_instance_of(theirs, ours, variables)


def test_the_library_really_skips_the_occurs_check():
    # Why the cyclic case above exists: X against f(X).
    x = library_var("X_check")
    bindings = library_unify(x, ("f", x), {})
    assert bindings is not False and _cyclic(bindings)
    assert unify(variable("X"), application("f", (variable("X"),))) is None
