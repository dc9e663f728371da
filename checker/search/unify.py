"""Most general unifiers and one-way matching of terms, atoms and literals.

Unification keeps its bindings in triangular form while it works (a
variable may be bound to a term holding other bound variables) and only at
the end resolves them into an idempotent substitution, the shape the kernel
and the reports want.  The occurs check is done on every binding, so a
unifier is never cyclic.  Everything is iterative: prover terms can nest
deeper than Python's recursion limit.

Equality atoms are unordered pairs, so the ``*_atoms`` helpers return one
unifier per orientation (deduplicated) instead of just one.
"""

from __future__ import annotations

from collections.abc import Mapping

from checker.kernel.clauses import is_equality
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application


def _walk(term: Term, bindings: Mapping[Term, Term]) -> Term:
    """Follow variable bindings until an unbound variable or an application."""
    while term.is_variable:
        bound = bindings.get(term)
        if bound is None:
            return term
        term = bound
    return term


def _occurs(var: Term, term: Term, bindings: Mapping[Term, Term]) -> bool:
    """Whether ``var`` occurs in ``term`` once the bindings are followed."""
    seen: set[Term] = set()
    stack = [term]
    while stack:
        current = _walk(stack.pop(), bindings)
        if current is var:
            return True
        if current.ground or current in seen or current.is_variable:
            continue
        seen.add(current)
        stack.extend(current.arguments)
    return False


def _resolve(bindings: dict[Term, Term]) -> Substitution:
    """The idempotent substitution equivalent to acyclic triangular bindings."""
    done: dict[Term, Term] = {}

    def value(term: Term) -> Term:
        stack = [term]
        while stack:
            current = stack[-1]
            if current in done:
                stack.pop()
            elif current.ground:
                done[current] = current
                stack.pop()
            elif current.is_variable:
                bound = bindings.get(current)
                if bound is None:
                    done[current] = current
                    stack.pop()
                elif bound in done:
                    done[current] = done[bound]
                    stack.pop()
                else:
                    stack.append(bound)
            else:
                pending = [a for a in current.arguments if a not in done]
                if pending:
                    stack.extend(pending)
                else:
                    stack.pop()
                    done[current] = application(current.symbol, tuple(done[a] for a in current.arguments))
        return done[term]

    return Substitution({var: value(var) for var in bindings})


def _unify_into(pairs: list[tuple[Term, Term]], bindings: dict[Term, Term]) -> bool:
    """Extend triangular ``bindings`` so that every pair is unified; False
    (with ``bindings`` left partly extended) when that is impossible."""
    while pairs:
        left, right = pairs.pop()
        left = _walk(left, bindings)
        right = _walk(right, bindings)
        if left is right:
            continue
        if left.is_variable or right.is_variable:
            var, value = (left, right) if left.is_variable else (right, left)
            if not value.ground and _occurs(var, value, bindings):
                return False
            bindings[var] = value
            continue
        if left.symbol != right.symbol or left.arity != right.arity:
            return False
        pairs.extend(zip(left.arguments, right.arguments))
    return True


def _start(bindings: Substitution | None) -> dict[Term, Term] | None:
    """Triangular bindings holding an existing unifier, or None if its
    bindings are cyclic (then nothing can extend it)."""
    start: dict[Term, Term] = {}
    if bindings is None:
        return start
    if not _unify_into([(var, value) for var, value in bindings.mapping.items()], start):
        return None
    return start


def unify(left: Term, right: Term, bindings: Substitution | None = None) -> Substitution | None:
    """The most general unifier of ``left`` and ``right`` that extends
    ``bindings`` (itself a unifier of something), or None when there is none.
    The result is idempotent."""
    start = _start(bindings)
    if start is None or not _unify_into([(left, right)], start):
        return None
    return _resolve(start)


def unify_all(pairs: list[tuple[Term, Term]], bindings: Substitution | None = None) -> Substitution | None:
    """The most general simultaneous unifier of all the pairs, or None."""
    start = _start(bindings)
    if start is None or not _unify_into(list(pairs), start):
        return None
    return _resolve(start)


def _orientations(left: Term, right: Term) -> list[list[tuple[Term, Term]]]:
    """The argument pairings to try for two atoms: one, or two for equalities."""
    if left.symbol != right.symbol or left.arity != right.arity or left.is_variable or right.is_variable:
        return []
    straight = list(zip(left.arguments, right.arguments))
    if is_equality(left):
        (a, b), (c, d) = left.arguments, right.arguments
        return [straight, [(a, d), (b, c)]]
    return [straight]


def unify_atoms(left: Term, right: Term, bindings: Substitution | None = None) -> list[Substitution]:
    """The most general unifiers of two atoms: at most one, except for
    equality atoms, which are tried in both orientations (duplicates dropped)."""
    found: list[Substitution] = []
    for pairs in _orientations(left, right):
        unifier = unify_all(pairs, bindings)
        if unifier is not None and unifier not in found:
            found.append(unifier)
    return found


def _match_into(pairs: list[tuple[Term, Term]], bindings: dict[Term, Term]) -> bool:
    """Extend ``bindings`` (pattern variable -> target term, identity
    bindings included) so that each pattern becomes its target."""
    while pairs:
        pattern, target = pairs.pop()
        if pattern.is_variable:
            bound = bindings.get(pattern)
            if bound is None:
                bindings[pattern] = target
            elif bound is not target:
                return False
            continue
        if pattern.ground:
            if pattern is not target:
                return False
            continue
        if target.is_variable or pattern.symbol != target.symbol or pattern.arity != target.arity:
            return False
        pairs.extend(zip(pattern.arguments, target.arguments))
    return True


def match_into(pattern: Term, target: Term, bindings: dict[Term, Term]) -> dict[Term, Term] | None:
    """A copy of the working ``bindings`` extended so that the pattern's
    instance is the target, or None.  The bindings keep identity entries
    (X -> X), so that a variable already matched to itself stays put."""
    extended = dict(bindings)
    return extended if _match_into([(pattern, target)], extended) else None


def match_atoms_into(pattern: Term, target: Term, bindings: dict[Term, Term]) -> list[dict[Term, Term]]:
    """Every way (one, or two for equalities) of extending ``bindings`` so
    that the pattern atom's instance is the target atom."""
    found: list[dict[Term, Term]] = []
    for pairs in _orientations(pattern, target):
        extended = dict(bindings)
        if _match_into(pairs, extended) and extended not in found:
            found.append(extended)
    return found


def match(pattern: Term, target: Term, bindings: Substitution | None = None) -> Substitution | None:
    """The substitution sigma, extending ``bindings``, with sigma(pattern)
    identical to ``target``; only the pattern's variables are bound (the
    target's are treated as constants), or None when there is none.  A
    variable absent from ``bindings`` is free to be bound."""
    start = dict(bindings.mapping) if bindings is not None else {}
    extended = match_into(pattern, target, start)
    return None if extended is None else Substitution(extended)
