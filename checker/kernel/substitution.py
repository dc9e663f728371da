"""Substitutions: a given mapping from variables to terms, applied at once.

The kernel never searches for a substitution; it only applies the one the
evidence states.  Application is simultaneous (the mapping is applied once,
not iterated), so any mapping yields a sound instance of a clause.
"""

from __future__ import annotations

from collections.abc import Mapping

from checker.kernel.terms import Term, application


class Substitution:
    """An immutable finite mapping from variables to terms."""

    __slots__ = ("mapping",)

    def __init__(self, mapping: Mapping[Term, Term] | None = None):
        bindings = {}
        for var, value in (mapping or {}).items():
            if not var.is_variable:
                raise ValueError(f"substitution binds non-variable {var}")
            if value is not var:
                bindings[var] = value
        self.mapping: dict[Term, Term] = bindings

    def __eq__(self, other: object) -> bool:
        return isinstance(other, Substitution) and self.mapping == other.mapping

    def __hash__(self) -> int:
        return hash(frozenset(self.mapping.items()))

    def __bool__(self) -> bool:
        return bool(self.mapping)

    def __repr__(self) -> str:
        return "{" + ", ".join(f"{v} -> {t}" for v, t in self.items_sorted()) + "}"

    def items_sorted(self) -> list[tuple[Term, Term]]:
        return sorted(self.mapping.items(), key=lambda item: item[0].symbol)

    def __call__(self, term: Term) -> Term:
        """The instance of ``term`` under this substitution.  Only compound
        terms with variables below them are visited; a variable argument is
        looked up, a ground one kept."""
        if term.ground or not self.mapping:
            return term
        mapping = self.mapping
        if term.is_variable:
            return mapping.get(term, term)
        done: dict[Term, Term] = {}
        stack = [term]
        while stack:
            current = stack[-1]
            if current in done:  # a shared subterm, pushed twice
                stack.pop()
                continue
            pending = [a for a in current.arguments if not (a.ground or a.is_variable or a in done)]
            if pending:
                stack.extend(pending)
                continue
            stack.pop()
            done[current] = application(
                current.symbol,
                tuple(a if a.ground else mapping.get(a, a) if a.is_variable else done[a] for a in current.arguments),
            )
        return done[term]


IDENTITY = Substitution()
