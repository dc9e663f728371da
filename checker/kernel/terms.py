"""First-order terms, hash-consed so that equal terms are the same object.

One object per distinct term makes equality an identity test and hashing
O(1), which is what keeps substitution and comparison cheap on large
certificates.  Every traversal here is iterative: prover output can nest
terms far deeper than Python's recursion limit.
"""

from __future__ import annotations

from collections.abc import Iterator
from itertools import islice

Position = tuple[int, ...]
"""A path into a term: 1-based argument indices, root is ``()``."""


class Term:
    """A variable or a function/constant application; build with
    :func:`variable` or :func:`application`, never directly."""

    __slots__ = ("symbol", "arguments", "is_variable", "ground", "__weakref__")

    symbol: str
    arguments: tuple[Term, ...]
    is_variable: bool
    ground: bool

    def __reduce__(self):
        # Flat, so that pickling (worker processes) and copying never recurse
        # through a deep term; rebuilding goes through the hash-consing table.
        return (_from_flat, (_flat(self),))

    def __repr__(self) -> str:
        return f"Term({render(self)!r})"

    def __str__(self) -> str:
        return render(self)

    @property
    def arity(self) -> int:
        return len(self.arguments)


_table: dict[tuple, Term] = {}


def _make(key: tuple, symbol: str, arguments: tuple, is_variable: bool) -> Term:
    term = object.__new__(Term)
    term.symbol = symbol
    term.arguments = arguments
    term.is_variable = is_variable
    term.ground = not is_variable and all(a.ground for a in arguments)
    _table[key] = term
    return term


def table_size() -> int:
    """How many terms the table holds: a mark for :func:`forget_terms_since`."""
    return len(_table)


def forget_terms_since(mark: int) -> None:
    """Drop from the table every term made after ``mark`` (between files,
    so that one process's memory stays flat).  A term made later is no
    longer the one object for its value, so the caller must use none of
    them again; the table keeps insertion order, so they are the last."""
    for key in list(islice(_table, mark, None)):
        del _table[key]


def variable(name: str) -> Term:
    """The variable called ``name``."""
    key = (True, name)
    term = _table.get(key)
    return term if term is not None else _make(key, name, (), True)


def application(symbol: str, arguments: tuple[Term, ...] = ()) -> Term:
    """The term ``symbol(arguments...)``; a constant when there are none."""
    arguments = tuple(arguments)
    key = (False, symbol, arguments)
    term = _table.get(key)
    return term if term is not None else _make(key, symbol, arguments, False)


def post_order(root, done=frozenset()) -> list:
    """The distinct nodes of a term or formula (anything with ``arguments``),
    each after all its arguments, skipping those in ``done`` and what lies
    below them; iterative, so depth is no limit."""
    ordered: list = []
    placed: set = set()
    stack = [root]
    while stack:
        current = stack[-1]
        if current in placed or current in done:
            stack.pop()
            continue
        pending = [a for a in current.arguments if a not in placed and a not in done]
        if pending:
            stack.extend(pending)
            continue
        stack.pop()
        placed.add(current)
        ordered.append(current)
    return ordered


def _flat(term: Term) -> tuple[tuple[bool, str, tuple[int, ...]], ...]:
    """The distinct subterms of ``term``, innermost first, each as
    (is_variable, symbol, indices of its arguments in this list)."""
    nodes = post_order(term)
    index = {node: number for number, node in enumerate(nodes)}
    return tuple((n.is_variable, n.symbol, tuple(index[a] for a in n.arguments)) for n in nodes)


def _from_flat(entries: tuple[tuple[bool, str, tuple[int, ...]], ...]) -> Term:
    built: list[Term] = []
    for is_variable, symbol, arguments in entries:
        built.append(variable(symbol) if is_variable else application(symbol, tuple(built[i] for i in arguments)))
    return built[-1]


def subterms(term: Term) -> Iterator[tuple[Position, Term]]:
    """Every subterm with its position, outermost first, left to right.

    Each position is a fresh tuple, so on a deep term this costs size times
    depth; the rules themselves only ever walk one given position."""
    stack: list[tuple[Position, Term]] = [((), term)]
    while stack:
        position, current = stack.pop()
        yield position, current
        for index in range(current.arity, 0, -1):
            stack.append((position + (index,), current.arguments[index - 1]))


def subterm_at(term: Term, position: Position) -> Term | None:
    """The subterm at ``position``, or None if the term has no such position."""
    current = term
    for index in position:
        if not 1 <= index <= current.arity:
            return None
        current = current.arguments[index - 1]
    return current


def replace_at(term: Term, position: Position, replacement: Term) -> Term:
    """``term`` with the subterm at ``position`` replaced.

    A position the term does not have is a caller's bug (check it with
    :func:`subterm_at` first), so it raises instead of guessing."""
    path = []
    current = term
    for index in position:
        if not 1 <= index <= current.arity:
            raise ValueError(f"position {position} is not in {render(term)}")
        path.append((current, index))
        current = current.arguments[index - 1]
    result = replacement
    for parent, index in reversed(path):
        arguments = list(parent.arguments)
        arguments[index - 1] = result
        result = application(parent.symbol, tuple(arguments))
    return result


def variables_of(term: Term) -> set[Term]:
    """The variables occurring in ``term``."""
    found: set[Term] = set()
    seen: set[Term] = set()
    stack = [term]
    while stack:
        current = stack.pop()
        if current.ground or current in seen:
            continue
        seen.add(current)
        if current.is_variable:
            found.add(current)
        else:
            stack.extend(current.arguments)
    return found


def symbols_of(term: Term) -> set[tuple[str, int]]:
    """The function and constant symbols of ``term``, as (name, arity)."""
    found: set[tuple[str, int]] = set()
    seen: set[Term] = set()
    stack = [term]
    while stack:
        current = stack.pop()
        if current in seen or current.is_variable:
            continue
        seen.add(current)
        found.add((current.symbol, current.arity))
        stack.extend(current.arguments)
    return found


def render(term: Term) -> str:
    """The term in TPTP syntax."""
    parts: list[str] = []
    stack: list[Term | str] = [term]
    while stack:
        item = stack.pop()
        if isinstance(item, str):
            parts.append(item)
        elif not item.arguments:
            parts.append(item.symbol)
        else:
            parts.append(item.symbol + "(")
            stack.append(")")
            for index in range(item.arity - 1, -1, -1):
                stack.append(item.arguments[index])
                if index:
                    stack.append(",")
    return "".join(parts)


def first_difference(left: Term, right: Term) -> tuple[Position, Term, Term] | None:
    """The first position, in left-to-right preorder, where two terms differ
    (so no position above it differs), with the two subterms found there;
    None when they are the same term."""
    # A path is kept as a chain (index, parent chain) and only turned into a
    # tuple once found, so that walking a deep common spine stays linear.
    stack: list[tuple[tuple | None, Term, Term]] = [(None, left, right)]
    while stack:
        path, a, b = stack.pop()
        if a is b:
            continue
        if a.is_variable or b.is_variable or a.symbol != b.symbol or a.arity != b.arity:
            position: list[int] = []
            while path is not None:
                index, path = path
                position.append(index)
            return tuple(reversed(position)), a, b
        for index in range(a.arity, 0, -1):
            stack.append(((index, path), a.arguments[index - 1], b.arguments[index - 1]))
    return None
