"""Which term order a derivation's prover rewrote with, inferred once.

The rewriting records a prover nests (``rw(rw(spm(a, b), e1), e2)``) leave
their conclusions unstated; the search computes them with the prover's
rewrites (:mod:`checker.search.ordered_rewriting`), for which it needs the
prover's term order.  The order is inferred from what the derivation does
state: each stated clause derived by rewriting records alone from a stated
clause is an example, and so is each stated unit equation (written greater
side first).  A wrong inference only makes the search slower.
"""

from __future__ import annotations

from collections.abc import Iterable, Iterator

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.formulas import Formula, subformulas_with_polarity
from checker.kernel.terms import Term
from checker.search.demodulation import is_rewriting
from checker.search.ordered_rewriting import RewritingExample, inferred_order
from checker.search.term_order import TermOrder
from formats.derivation import Inference, Origin, Parent, Statement


def _atoms(statements: Iterable[Statement]) -> Iterator[Term]:
    for statement in statements:
        if isinstance(statement.content, Clause):
            yield from (literal.atom for literal in statement.content.literals)
        elif isinstance(statement.content, Formula):
            yield from (f.atom for f, _ in subformulas_with_polarity(statement.content) if f.atom is not None)


def _rewriting_chain(inference: Inference) -> tuple[str, list[str]] | None:
    """(stated base, equations in the order applied) of a chain of
    rewriting records with one equation each, or None."""
    equations: list[str] = []
    current: Inference | Parent = inference
    while isinstance(current, Inference):
        if not is_rewriting(current.rule) or len(current.parents) != 2 or not isinstance(current.parents[1], Parent):
            return None
        equations.append(current.parents[1].name)
        current = current.parents[0]
    return current.name, equations[::-1]


def rewriting_examples(statements: dict[str, Statement]) -> list[RewritingExample]:
    """The derivation's stated rewriting steps from stated clauses."""
    found = []
    for statement in statements.values():
        if not (isinstance(statement.source, Inference) and isinstance(statement.content, Clause)):
            continue
        chain = _rewriting_chain(statement.source)
        if chain is None:
            continue
        base, equations = chain
        cited = [statements.get(name) for name in (base, *equations)]
        if all(s is not None and isinstance(s.content, Clause) for s in cited) and all(
            _is_unit_equation(s.content) for s in cited[1:]
        ):
            found.append(RewritingExample(cited[0].content, tuple(s.content for s in cited[1:]), statement.content))
    return found


def _is_unit_equation(clause: Clause) -> bool:
    """A rewriting record cites unit equations; a citation of anything else
    (a wrong derivation's) is no example of how the prover rewrites."""
    return len(clause.literals) == 1 and clause.literals[0].positive and is_equality(clause.literals[0].atom)


def derivation_order(statements: dict[str, Statement], problem: Iterable[Statement] | None) -> TermOrder | None:
    """The term order the derivation's prover most likely rewrote with;
    its symbols counted in the problem (or, with none, in the leaves)."""
    inputs = problem if problem is not None else (
        s for s in statements.values() if isinstance(s.source, Origin) and s.source.kind == "file")
    derived = (s.content for s in statements.values()
               if isinstance(s.source, Inference) and isinstance(s.content, Clause) and s.role != "axiom")
    return inferred_order(_atoms(inputs), rewriting_examples(statements), derived)
