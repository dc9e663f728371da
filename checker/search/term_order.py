"""Knuth-Bendix orders on terms, for rewriting the way a prover does.

A saturation prover rewrites with a unit equation only from its greater
side to its smaller one in a reduction order of its own, and an equation
neither of whose sides is greater (commutativity, ``f(X, Y) = f(Y, X)``)
only at instances whose one side is greater (ordered rewriting).  The
search computes the likely conclusions of a rewriting record the same way,
with a Knuth-Bendix order (Knuth & Bendix, "Simple word problems in
universal algebras", 1970), as defined in Baader & Nipkow, "Term Rewriting
and All That" (1998), section 5.4.4 (from memory):

    s > t  iff  |s|_x >= |t|_x for every variable x, and
                (a) w(s) > w(t), or
                (b) w(s) = w(t) and
                    (b1) t is a variable and s = f^n(t), n >= 1, or
                    (b2) s = f(...), t = g(...) and f > g in the precedence, or
                    (b3) s = f(s1..sn), t = f(t1..tn) and s_i > t_i at the
                         first i with s_i != t_i.

The weights are positive integers (every variable weighs ``variable_weight``,
no constant less), except that one unary symbol may weigh 0 if it is the
greatest in the precedence; then the order is a simplification order, well
founded and closed under substitution and contexts.  A prover's own
weights and precedence are not printed, so the search tries a few
(:func:`likely_orders`); what it finds is replayed by the kernel, so a
wrong guess costs only time.
"""

from __future__ import annotations

from collections import Counter
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass, field

from checker.kernel.terms import Term, post_order, subterms

Symbol = tuple[str, int]
"""A function symbol with its arity (the same name may have two arities)."""


def symbol_of(term: Term) -> Symbol:
    return term.symbol, term.arity


@dataclass(frozen=True, slots=True)
class KnuthBendixOrder:
    """A Knuth-Bendix order: symbol weights (1 unless given), the weight of
    a variable, and a precedence (rank; greater is greater, symbols not
    ranked are below every ranked one, then by arity and name, so the
    precedence is total)."""

    precedence: Mapping[Symbol, int]
    weights: Mapping[Symbol, int] = field(default_factory=dict)
    variable_weight: int = 1
    _weight_memo: dict = field(default_factory=dict, compare=False, repr=False)
    _count_memo: dict = field(default_factory=dict, compare=False, repr=False)

    def __post_init__(self) -> None:
        if self.variable_weight <= 0:
            raise ValueError("a variable's weight must be positive")
        zero = [symbol for symbol, weight in self.weights.items() if weight == 0]
        if any(weight < 0 for weight in self.weights.values()) or len(zero) > 1:
            raise ValueError("weights must be non-negative, and at most one symbol may weigh 0")
        for name, arity in zero:
            if arity != 1 or any(self.rank((name, arity)) < self.rank(other) for other in self.precedence):
                raise ValueError("only a unary symbol greatest in the precedence may weigh 0")
        if any(arity == 0 and weight < self.variable_weight for (_, arity), weight in self.weights.items()):
            raise ValueError("a constant may not weigh less than a variable")

    def rank(self, symbol: Symbol) -> tuple[int, int, str]:
        return self.precedence.get(symbol, -1), symbol[1], symbol[0]

    def weight(self, term: Term) -> int:
        """The sum of the weights of the term's symbol and variable occurrences."""
        memo = self._weight_memo
        stack = [term]
        while stack:
            current = stack[-1]
            if current in memo:
                stack.pop()
                continue
            if current.is_variable:
                memo[current] = self.variable_weight
                stack.pop()
                continue
            waiting = [argument for argument in current.arguments if argument not in memo]
            if waiting:
                stack.extend(waiting)
                continue
            stack.pop()
            memo[current] = self.weights.get(symbol_of(current), 1) + sum(memo[a] for a in current.arguments)
        return memo[term]

    def variable_counts(self, term: Term) -> Counter:
        """How often each variable occurs in the term."""
        counts = self._count_memo.get(term)
        if counts is None:
            counts = Counter(t for _, t in subterms(term) if t.is_variable)
            self._count_memo[term] = counts
        return counts

    def _variables_dominate(self, big: Term, small: Term) -> bool:
        if small.ground:
            return True
        have = self.variable_counts(big)
        return all(have[var] >= count for var, count in self.variable_counts(small).items())

    def greater(self, big: Term, small: Term) -> bool:
        """Whether ``big`` > ``small``.  Iterative: the lexicographic case
        (b3) only ever compares the first pair of arguments that differ."""
        while True:
            if big is small or not self._variables_dominate(big, small):
                return False
            heavy, light = self.weight(big), self.weight(small)
            if heavy != light:
                return heavy > light
            if big.is_variable:
                return False
            if small.is_variable:
                return True  # (b1): equal weights and the variable inside make big f^n(small)
            if symbol_of(big) != symbol_of(small):
                return self.rank(symbol_of(big)) > self.rank(symbol_of(small))
            big, small = next((a, b) for a, b in zip(big.arguments, small.arguments) if a is not b)


@dataclass(frozen=True, slots=True)
class LexicographicPathOrder:
    """A lexicographic path order for a precedence (ranked as in
    :class:`KnuthBendixOrder`)."""

    precedence: Mapping[Symbol, int]
    _memo: dict = field(default_factory=dict, compare=False, repr=False)

    def rank(self, symbol: Symbol) -> tuple[int, int, str]:
        return self.precedence.get(symbol, -1), symbol[1], symbol[0]

    def greater(self, big: Term, small: Term) -> bool:
        """Whether ``big`` > ``small``, by the definition's cases applied to
        every pair of subterms, innermost first (iterative: each case only
        looks at pairs of smaller subterms, already decided)."""
        memo = self._memo
        if (big, small) in memo:
            return memo[big, small]
        lows = post_order(small)
        variables = {}
        for high in post_order(big):
            if high.is_variable:
                variables[high] = {high}
                for low in lows:
                    memo[high, low] = False
                continue
            inside = set().union(*(variables[a] for a in high.arguments))
            variables[high] = inside
            for low in lows:
                if (high, low) in memo:
                    continue
                memo[high, low] = self._case(high, low, inside)
        return memo[big, small]

    def _case(self, high: Term, low: Term, inside: set) -> bool:
        memo = self._memo
        if high is low:
            return False
        if low.is_variable:  # (LPO1)
            return low in inside
        if any(a is low or memo[a, low] for a in high.arguments):  # (LPO2a)
            return True
        if not all(memo[high, b] for b in low.arguments):
            return False
        if symbol_of(high) != symbol_of(low):  # (LPO2b)
            return self.rank(symbol_of(high)) > self.rank(symbol_of(low))
        first = next((a, b) for a, b in zip(high.arguments, low.arguments) if a is not b)  # (LPO2c)
        return memo[first]


TermOrder = KnuthBendixOrder | LexicographicPathOrder


def symbol_occurrences(atoms: Iterable[Term]) -> dict[Symbol, int]:
    """How often each function symbol occurs under the atoms, in the order
    the symbols first appear."""
    counts: dict[Symbol, int] = {}
    for atom in atoms:
        for _, term in subterms(atom):
            if not term.is_variable and term is not atom:
                counts[symbol_of(term)] = counts.get(symbol_of(term), 0) + 1
    return counts


def _ranked(symbols: Sequence[Symbol]) -> dict[Symbol, int]:
    """A precedence from a list, least first."""
    return {symbol: rank for rank, symbol in enumerate(symbols)}


def likely_orders(atoms: Iterable[Term]) -> list[TermOrder]:
    """The term orders a prover commonly uses (common practice), for the
    symbols of the problem's atoms: Knuth-Bendix orders with every symbol
    weighing 1, and lexicographic path orders, each with precedences by
    how often a symbol occurs in the problem (more often greater, or
    rarer greater), by arity first or with constants least or neither;
    ties by first occurrence, later greater.  Symbols the problem lacks
    (Skolem constants) are least, by arity and name."""
    counts = symbol_occurrences(atoms)
    if not counts:
        return []
    first = {symbol: number for number, symbol in enumerate(counts)}
    precedences = []
    for sign in (1, -1):
        for shape in (lambda s: (s[1],), lambda s: (s[1] == 1, s[1]), lambda s: (s[1] > 0,), lambda s: ()):
            ranking = sorted(counts, key=lambda s: (*shape(s), sign * counts[s], first[s]))
            if _ranked(ranking) not in precedences:
                precedences.append(_ranked(ranking))
    return [kind(precedence) for kind in (KnuthBendixOrder, LexicographicPathOrder) for precedence in precedences]
