"""Formula-level consequence, checked as a refutation of the negated conclusion.

``premises ⊨ conclusion`` holds when the premises together with the
negation of the conclusion have no model.  The kernel builds the clauses of
that set with its own clausifier (each premise closed universally, the
conclusion closed universally and then negated) and replays the given chain
of primitive inferences over them; the chain must end in the empty clause.
Premises and conclusion may be formulas or clauses (a clause is read as the
universal closure of its disjunction).

A step that only reshapes formulas (negation normal form, distribution,
flattening, renaming, quantifier shifting, splitting a conjunction) is
shown more directly by a :class:`Cover`: premises and conclusion are
clausified side by side without naming, and each clause of the conclusion
is subsumed by a clause of the premises.  That spares the clausification
of the negated conclusion, which multiplies out for a large conjunction.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause, Literal
from checker.kernel.clausify import Clausification, clausify
from checker.kernel.failure import Failure, quote
from checker.kernel.formulas import Formula, formula_of_clause, negation, universal_closure
from checker.kernel.rules import Chain, check_conclusion, replay
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, post_order
from checker.kernel.unfolding import Unfolding, check_unfolding


def _closed(statement: Clause | Formula) -> Formula:
    return formula_of_clause(statement) if isinstance(statement, Clause) else universal_closure(statement)


def entailment_clausification(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula
) -> Clausification:
    """The clausified premises and negated conclusion; the conclusion's
    clauses have source ``len(premises)``."""
    return clausify([*map(_closed, premises), negation(_closed(conclusion))])


def entailment_clauses(premises: Sequence[Clause | Formula], conclusion: Clause | Formula) -> tuple[Clause, ...]:
    """The clause list a refutation chain's premise indices refer to."""
    return entailment_clausification(premises, conclusion).clauses


@dataclass(frozen=True, slots=True)
class Cover:
    """Evidence that the premises entail the conclusion clause by clause
    (see :func:`cover_clauses`): ``matches[k]`` is ``(i, theta)`` with
    theta(premise clause ``i``) ⊆ conclusion clause ``k`` once the
    conclusion's Skolem symbols are renamed by ``renaming`` (pairs of
    names, each keeping the arguments).

    Why this is sound: every model of the premises extends to a model of
    their clauses (Skolem functions chosen as witnesses); there each
    conclusion clause holds, being subsumed; reading each renamed Skolem
    symbol as its new name makes the conclusion's clauses true, and they
    imply the conclusion whatever their Skolem functions are.  All Skolem
    symbols are fresh for premises and conclusion alike, so the extended
    model still says what the original one did."""

    matches: tuple[tuple[int, Substitution], ...]
    renaming: tuple[tuple[str, str], ...] = ()


def cover_clauses(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula
) -> tuple[tuple[Clause, ...], tuple[Clause, ...], frozenset[str]]:
    """The premise clauses, the conclusion clauses and the conclusion's
    Skolem symbols, from one clausification without naming.  A conclusion
    clause that is also a premise clause is listed only with the premises."""
    clausification = clausify([*map(_closed, premises), _closed(conclusion)], naming=False)
    pairs = list(zip(clausification.clauses, clausification.sources))
    count = len(premises)
    skolem = frozenset(s.name for s in clausification.fresh_symbols if s.source == count)
    return (
        tuple(clause for clause, source in pairs if source < count),
        tuple(clause for clause, source in pairs if source == count),
        skolem,
    )


def renamed_clause(clause: Clause, renaming: dict[str, str]) -> Clause:
    """The clause with function symbols renamed, arguments kept."""
    done: dict[Term, Term] = {}
    for literal in clause.literals:
        for node in post_order(literal.atom, done):
            symbol = node.symbol if node.is_variable else renaming.get(node.symbol, node.symbol)
            done[node] = node if node.is_variable else application(symbol, tuple(done[a] for a in node.arguments))
    return Clause(Literal(literal.positive, done[literal.atom]) for literal in clause.literals)


def check_cover(premises: Sequence[Clause | Formula], conclusion: Clause | Formula, cover: Cover) -> Failure | None:
    """None when ``cover`` subsumes every clause of the conclusion by a
    clause of the premises (:func:`cover_clauses`)."""
    premise_clauses, conclusion_clauses, skolem = cover_clauses(premises, conclusion)
    renaming = dict(cover.renaming)
    foreign = sorted(set(renaming) - skolem)
    if foreign:
        return Failure("renames_a_symbol", f"only the conclusion's Skolem symbols may be renamed, not `{foreign[0]}`")
    if len(cover.matches) != len(conclusion_clauses):
        return Failure(
            "cover_incomplete",
            f"the conclusion has {len(conclusion_clauses)} clauses and the cover matches {len(cover.matches)}",
        )
    for number, ((index, theta), claimed) in enumerate(zip(cover.matches, conclusion_clauses)):
        if not 0 <= index < len(premise_clauses):
            return Failure("no_such_clause", f"the premises have no clause {index}")
        failure = check_conclusion(premise_clauses[index], renamed_clause(claimed, renaming), theta)
        if failure is not None:
            return Failure(failure.reason, f"conclusion clause {number}: {failure.message}")
    return None


def check_entailment(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula, refutation: Chain | Cover | Unfolding
) -> Failure | None:
    """None when ``refutation`` derives the empty clause from
    :func:`entailment_clauses` of the premises and conclusion, is a cover
    of the conclusion's clauses by the premises', or an unfolding of the
    definitions among the premises (checker.kernel.unfolding)."""
    if isinstance(refutation, Cover):
        return check_cover(premises, conclusion, refutation)
    if isinstance(refutation, Unfolding):
        return check_unfolding(premises, conclusion, refutation)
    computed = replay(entailment_clauses(premises, conclusion), refutation)
    if isinstance(computed, Failure):
        return computed
    if not computed.is_empty:
        return Failure("refutation_incomplete", f"the refutation ends in {quote(computed)}, not the empty clause")
    return None
