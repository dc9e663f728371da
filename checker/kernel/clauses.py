"""Literals and clauses.

A clause is a set of literals (duplicates merge, order is irrelevant), but
it remembers the order in which it was written so that evidence can name a
literal by its index.  An equality atom is an unordered pair: ``s = t`` and
``t = s`` are the same literal.
"""

from __future__ import annotations

from collections.abc import Iterable

from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, render, symbols_of, variables_of

EQUALITY = "="


def is_equality(atom: Term) -> bool:
    return atom.arity == 2 and atom.symbol == EQUALITY


class Literal:
    """A possibly negated atom; compares with equality taken as symmetric."""

    __slots__ = ("positive", "atom", "_key")

    def __init__(self, positive: bool, atom: Term):
        if atom.is_variable:
            # Not first-order: a substitution could turn it into any atom.
            raise ValueError(f"a variable is not an atom: {atom}")
        self.positive = positive
        self.atom = atom
        if is_equality(atom):
            self._key = (positive, EQUALITY, frozenset(atom.arguments))
        else:
            self._key = (positive, atom)

    def __eq__(self, other: object) -> bool:
        return isinstance(other, Literal) and self._key == other._key

    def __hash__(self) -> int:
        return hash(self._key)

    def __repr__(self) -> str:
        return f"Literal({self})"

    def __str__(self) -> str:
        if is_equality(self.atom):
            left, right = self.atom.arguments
            return f"{render(left)} {'=' if self.positive else '!='} {render(right)}"
        return ("" if self.positive else "~") + render(self.atom)

    def negated(self) -> Literal:
        return Literal(not self.positive, self.atom)

    def instance(self, substitution: Substitution) -> Literal:
        return Literal(self.positive, substitution(self.atom))


class Clause:
    """A set of literals, with the order it was written in kept for indexing."""

    __slots__ = ("literals", "literal_set")

    def __init__(self, literals: Iterable[Literal] = ()):
        self.literals: tuple[Literal, ...] = tuple(literals)
        self.literal_set: frozenset[Literal] = frozenset(self.literals)

    def __eq__(self, other: object) -> bool:
        return isinstance(other, Clause) and self.literal_set == other.literal_set

    def __hash__(self) -> int:
        return hash(self.literal_set)

    def __len__(self) -> int:
        return len(self.literals)

    def __repr__(self) -> str:
        return f"Clause({self})"

    def __str__(self) -> str:
        if not self.literals:
            return "$false"
        return " | ".join(str(literal) for literal in self.literals)

    @property
    def is_empty(self) -> bool:
        return not self.literals

    def instance(self, substitution: Substitution) -> Clause:
        return Clause(literal.instance(substitution) for literal in self.literals)

    def without(self, index: int) -> list[Literal]:
        """The written literals other than the one at ``index``."""
        return [lit for i, lit in enumerate(self.literals) if i != index]

    def variables(self) -> set[Term]:
        found: set[Term] = set()
        for literal in self.literals:
            found |= variables_of(literal.atom)
        return found

    def symbols(self) -> set[tuple[str, int]]:
        found: set[tuple[str, int]] = set()
        for literal in self.literals:
            found |= symbols_of(literal.atom)
        return found
