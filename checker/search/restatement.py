"""Proposing which problem statement a leaf restates: the same formula up to
the order a prover printed it in.

A prover copying a problem formula into its derivation may rename the
bound variables and list them in another order (``! [X2,X0,X1]``), close
the free variables or leave them implicit, merge or split a quantifier
prefix, reorder conjuncts and disjuncts (and the sides of ``<=>``), turn
equations round, and write ``s != t`` for ``~ s = t`` (the reader builds
both alike).  A :class:`Shape` is a formula with those differences taken
out: the universal closure, ``&`` and ``|`` flattened into bags, nested
quantifiers of one kind merged into one block, every bound variable renamed
apart and unused ones dropped.  :func:`restates` matches two shapes by a
bounded backtracking search over the bags and the variable blocks.

A match is only a proposal: a leaf is linked to a problem statement when the
kernel replays an entailment between them (checker/leaves.py), so a bug
here costs completeness, never soundness.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache
from itertools import count

from checker.kernel.formulas import (
    AND,
    ATOM,
    IFF,
    NAND,
    NOR,
    NOT,
    OR,
    QUANTIFIERS,
    XOR,
    Formula,
    universal_closure,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, post_order, variable, variables_of

BAGS = (AND, OR, IFF, XOR)
"""Connectives whose arguments may come in any order (``&`` and ``|`` also
flattened, since they are associative)."""

_FLATTENED = (AND, OR)


@dataclass(frozen=True, slots=True, eq=False)
class Shape:
    """A formula without the order of its bags and bound variables.

    ``signature`` is a hash that two shapes matched by :func:`restates`
    share (the converse may fail: it is only a filter); ``free`` holds
    the bound variables of enclosing blocks that occur inside."""

    connective: str
    children: tuple[Shape, ...]
    bound: tuple[Term, ...]
    atom: Term | None
    signature: int
    free: frozenset[Term]


@dataclass(frozen=True, slots=True)
class _Rebuild:
    """A pending node: build ``connective`` from the last ``arity`` shapes."""

    connective: str
    arity: int
    bound: tuple[Term, ...] = ()


@lru_cache(maxsize=4096)
def shape_of(formula: Formula) -> Shape:
    """The shape of the universal closure of ``formula``."""
    fresh = count(1)
    results: list[Shape] = []
    tasks: list[_Rebuild | tuple[Formula, dict[Term, Term]]] = [(universal_closure(formula), {})]
    while tasks:
        task = tasks.pop()
        if isinstance(task, _Rebuild):
            arguments = tuple(results[len(results) - task.arity :])
            del results[len(results) - task.arity :]
            results.append(_build(task, arguments))
            continue
        current, renaming = task
        connective = current.connective
        if connective == ATOM:
            atom = Substitution(renaming)(current.atom)
            results.append(Shape(ATOM, (), (), atom, _atom_signature(atom), frozenset(variables_of(atom))))
        elif connective in QUANTIFIERS:
            inner = dict(renaming)
            bound = []
            for old in current.variables:
                inner[old] = variable(f"#{next(fresh)}")  # no TPTP variable is spelt so
                bound.append(inner[old])
            tasks.append(_Rebuild(connective, 1, tuple(bound)))
            tasks.append((current.arguments[0], inner))
        elif connective in (NOR, NAND):
            tasks.append(_Rebuild(NOT, 1))
            tasks.append(_Rebuild(OR if connective == NOR else AND, 2))
            tasks.extend((argument, renaming) for argument in reversed(current.arguments))
        else:
            tasks.append(_Rebuild(connective, len(current.arguments)))
            tasks.extend((argument, renaming) for argument in reversed(current.arguments))
    return results[0]


def _build(task: _Rebuild, arguments: tuple[Shape, ...]) -> Shape:
    connective = task.connective
    if connective in QUANTIFIERS:
        (body,) = arguments
        bound = tuple(v for v in task.bound if v in body.free)
        if body.connective == connective:
            bound, body = bound + body.bound, body.children[0]
        if not bound:
            return body
        signature = hash((connective, len(bound), body.signature))
        return Shape(connective, (body,), bound, None, signature, body.free - frozenset(bound))
    if connective in _FLATTENED:
        arguments = tuple(part for a in arguments for part in (a.children if a.connective == connective else (a,)))
    if connective in BAGS:
        arguments = tuple(sorted(arguments, key=lambda a: a.signature))
    signature = hash((connective, tuple(a.signature for a in arguments)))
    return Shape(connective, arguments, (), None, signature, frozenset().union(*(a.free for a in arguments)))


_VARIABLE_SIGNATURE = hash("#variable")


def _atom_signature(atom: Term) -> int:
    """A hash of the atom with every variable alike and the sides of an
    equation unordered."""
    signatures: dict[Term, int] = {}
    for term in post_order(atom):
        if term.is_variable:
            signatures[term] = _VARIABLE_SIGNATURE
        else:
            parts = [signatures[a] for a in term.arguments]
            if term is atom and _is_equation(atom):
                parts.sort()
            signatures[term] = hash((term.symbol, tuple(parts)))
    return signatures[atom]


def _is_equation(atom: Term) -> bool:
    return atom.symbol == "=" and atom.arity == 2


_PAIR = "pair"
_BAG = "bag"

Goals = tuple | None
"""A linked list ``((kind, left, right), rest)``: shapes to match as a
pair, or tuples of shapes to match as bags."""


def restates(left: Shape, right: Shape, alternatives: int) -> bool:
    """Whether ``right`` is ``left`` up to the order of bags, a renaming of
    each quantifier block onto a block of the other (variables in any
    order) and the sides of equations, found trying at most
    ``alternatives`` choices beyond the first at each choice point (a
    match without choices costs nothing, however large the formulas)."""
    states: list[tuple[Goals, dict[Term, Term], dict[Term, Term], dict[Term, tuple[Term, ...]]]]
    states = [(((_PAIR, left, right), None), {}, {}, {})]
    while states:
        goals, forward, backward, blocks = states.pop()
        alive = True
        while alive and goals is not None:
            (kind, f, g), goals = goals
            if kind == _BAG:
                if f:
                    options = [i for i, candidate in enumerate(g) if candidate.signature == f[0].signature]
                    choices = [((_PAIR, f[0], g[i]), ((_BAG, f[1:], g[:i] + g[i + 1 :]), goals)) for i in options]
                    alternatives -= max(0, len(choices) - 1)
                    if alternatives < 0:
                        return False
                    for other in reversed(choices[1:]):
                        states.append((other, dict(forward), dict(backward), dict(blocks)))
                    alive = bool(choices)
                    goals = choices[0] if alive else None
            elif (f.signature, f.connective, len(f.children), len(f.bound)) != (
                g.signature, g.connective, len(g.children), len(g.bound)
            ):
                alive = False
            elif f.connective == ATOM:
                found = [added for pairs in _sides(f.atom, g.atom) if (added := _bind(pairs, forward, backward, blocks)) is not None]
                alternatives -= max(0, len(found) - 1)
                if alternatives < 0:
                    return False
                for added in found[1:]:
                    other_forward, other_backward = dict(forward), dict(backward)
                    _extend(added, other_forward, other_backward)
                    states.append((goals, other_forward, other_backward, dict(blocks)))
                alive = bool(found)
                if alive:
                    _extend(found[0], forward, backward)
            elif f.connective in QUANTIFIERS:
                blocks.update(dict.fromkeys(f.bound, g.bound))
                goals = ((_PAIR, f.children[0], g.children[0]), goals)
            elif f.connective in BAGS:
                goals = ((_BAG, f.children, g.children), goals)
            else:
                for pair in reversed(tuple(zip(f.children, g.children))):
                    goals = ((_PAIR, *pair), goals)
        if alive:
            return True
    return False


def _sides(s: Term, t: Term) -> list[list[tuple[Term, Term]]]:
    """The ways to pair the arguments of two atoms: in order, and for two
    equations also crosswise."""
    if s.symbol != t.symbol or s.arity != t.arity:
        return []
    ways = [list(zip(s.arguments, t.arguments))]
    if _is_equation(s):
        ways.append(list(zip(s.arguments, t.arguments[::-1])))
    return ways


def _bind(
    pairs: list[tuple[Term, Term]],
    forward: dict[Term, Term],
    backward: dict[Term, Term],
    blocks: dict[Term, tuple[Term, ...]],
) -> dict[Term, Term] | None:
    """The new variable pairs that make the term pairs equal under the
    renaming so far, each variable renamed onto one of its matched block;
    None if there are none."""
    added: dict[Term, Term] = {}
    taken: set[Term] = set()
    stack = list(pairs)
    while stack:
        s, t = stack.pop()
        if s.is_variable or t.is_variable:
            if not (s.is_variable and t.is_variable):
                return None
            image = forward.get(s, added.get(s))
            if image is None:
                if t not in blocks.get(s, ()) or t in backward or t in taken:
                    return None
                added[s] = t
                taken.add(t)
            elif image is not t:
                return None
        elif s.symbol != t.symbol or s.arity != t.arity:
            return None
        elif not (s is t and s.ground):
            stack.extend(zip(s.arguments, t.arguments))
    return added


def _extend(added: dict[Term, Term], forward: dict[Term, Term], backward: dict[Term, Term]) -> None:
    forward.update(added)
    backward.update((t, s) for s, t in added.items())
