"""Finding a cover: each clause of a conclusion subsumed by a premise clause.

Most formula steps a prover writes only reshape their premise (negation
normal form, distribution, flattening, renaming bound variables, shifting
quantifiers, splitting off a conjunct): premise and conclusion then have
the same clauses up to variants, or the conclusion's are a subset.  Finding
that is a matter of matching clauses, with no refutation search, and it
avoids clausifying the negated conclusion, which for a conjunction of
sixteen disjunctions multiplies out.  Untrusted: the kernel re-checks the
cover (checker.kernel.entailment.check_cover).
"""

from __future__ import annotations

import itertools
from collections.abc import Sequence

from checker.kernel.clauses import Clause
from checker.kernel.entailment import Cover, cover_clauses, renamed_clause
from checker.kernel.formulas import (
    AND,
    ATOM,
    EXISTS,
    FALSE,
    FORALL,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    NOT,
    OR,
    TRUE,
    Formula,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import post_order, symbols_of
from checker.search.findings import COVER, checked_cover, hook
from checker.search.subsumption import find_theta

CLAUSE_LIMIT = 4000
"""Most clauses the premises or the conclusion may give without naming
before the cover is not tried (the refutation search, which names, is)."""

RENAMING_TRIES = 64
"""Most renamings of a clause's Skolem symbols tried when matching it."""

MATCHING_NODES = 500
"""Matching attempts per pair of clauses (checker.search.subsumption)."""

MATCHING_TRIES = 20000
"""Pairs of clauses tried in all before the cover is given up."""


def clause_count(formula: Formula, limit: int = CLAUSE_LIMIT) -> int:
    """How many clauses ``formula`` gives when multiplied out without
    naming (before duplicates and tautologies are dropped), or ``limit + 1``
    when more.  Counts are kept for both polarities of every subformula,
    following the expansions of checker.kernel.clausify."""
    cap = limit + 1
    counts: dict[Formula, tuple[int, int]] = {}
    for node in post_order(formula):
        parts = [counts[argument] for argument in node.arguments]
        connective = node.connective
        if connective == ATOM:
            positive, negative = 1, 1
        elif connective in (TRUE, FALSE):
            positive, negative = (0, 1) if connective == TRUE else (1, 0)
        elif connective in (FORALL, EXISTS):
            positive, negative = parts[0]
        elif connective == NOT:
            negative, positive = parts[0]
        elif connective in (AND, OR, NOR, NAND):
            sum_positive, sum_negative = sum(p for p, _ in parts), sum(n for _, n in parts)
            product_positive = product_negative = 1
            for p, n in parts:
                product_positive, product_negative = min(product_positive * p, cap), min(product_negative * n, cap)
            positive, negative = {
                AND: (sum_positive, product_negative),
                OR: (product_positive, sum_negative),
                NOR: (sum_negative, product_positive),
                NAND: (product_negative, sum_positive),
            }[connective]
        else:
            (a_pos, a_neg), (b_pos, b_neg) = parts
            if connective == IMPLIES:
                positive, negative = a_neg * b_pos, a_pos + b_neg
            elif connective == IFF:
                positive, negative = a_neg * b_pos + b_neg * a_pos, a_pos * b_pos + a_neg * b_neg
            else:  # XOR
                positive, negative = a_pos * b_pos + a_neg * b_neg, a_neg * b_pos + b_neg * a_pos
        counts[node] = (min(positive, cap), min(negative, cap))
    return counts[formula][0]


def _signature(clause: Clause) -> frozenset[tuple[bool, str, int]]:
    return frozenset((literal.positive, literal.atom.symbol, literal.atom.arity) for literal in clause.literal_set)


def _symbols(clause: Clause) -> set[str]:
    return {name for literal in clause.literal_set for name, _ in symbols_of(literal.atom)}


class _Matcher:
    """Premise clauses indexed for subsumption of one conclusion clause:
    by clause, and by the set of signed predicate symbols they use (a
    subsumer's set is a subset of the subsumed clause's)."""

    def __init__(self, premise_clauses: Sequence[Clause]):
        self.clauses = premise_clauses
        self.exact = {clause: index for index, clause in reversed(list(enumerate(premise_clauses)))}
        self.groups: dict[frozenset, list[int]] = {}
        for index, clause in enumerate(premise_clauses):
            self.groups.setdefault(_signature(clause), []).append(index)
        self.budget = MATCHING_TRIES

    def subsumer(self, claimed: Clause) -> tuple[int, Substitution] | None:
        exact = self.exact.get(claimed)
        if exact is not None:
            return exact, Substitution()
        wanted = _signature(claimed)
        size = len(claimed.literal_set)
        # Same symbols first: a variant (renamed variables) is the usual case.
        groups = sorted((g for g in self.groups if g <= wanted), key=lambda g: g != wanted)
        for group in groups:
            for index in self.groups[group]:
                if len(self.clauses[index].literal_set) > size:
                    continue
                self.budget -= 1
                if self.budget < 0:
                    return None
                theta = find_theta(self.clauses[index], claimed, MATCHING_NODES)
                if theta is not None:
                    return index, theta
        return None


@hook(
    COVER,
    question=lambda premises, conclusion: (list(premises), conclusion),
    keep=lambda cover: cover,
    give=lambda args, kwargs, cover: checked_cover(args[0], args[1], cover),
    nothing=lambda: None,
)
def find_cover(premises: Sequence[Clause | Formula], conclusion: Clause | Formula) -> Cover | None:
    """A cover of the conclusion's clauses by the premises', or None (too
    many clauses, or some conclusion clause subsumed by none)."""
    formulas = [item for item in (*premises, conclusion) if isinstance(item, Formula)]
    if any(clause_count(formula) > CLAUSE_LIMIT for formula in formulas):
        return None
    premise_clauses, conclusion_clauses, skolem = cover_clauses(premises, conclusion)
    matcher = _Matcher(premise_clauses)
    arities = {}
    for clause in premise_clauses:
        for literal in clause.literal_set:
            for node in post_order(literal.atom):
                if not node.is_variable and node is not literal.atom:
                    arities.setdefault(node.arity, set()).add(node.symbol)
    renaming: dict[str, str] = {}
    matches: dict[int, tuple[int, Substitution]] = {}
    # Clauses without Skolem symbols first; then the others, fewest
    # unpaired symbols first, each pairing what it needs.
    pending = sorted(range(len(conclusion_clauses)), key=lambda k: len(_symbols(conclusion_clauses[k]) & skolem))
    for number in pending:
        claimed = conclusion_clauses[number]
        unpaired = sorted(_symbols(claimed) & skolem - set(renaming))
        found = None
        if not unpaired:
            found = matcher.subsumer(renamed_clause(claimed, renaming))
        else:
            arity = {name: node.arity for literal in claimed.literal_set for node in post_order(literal.atom)
                     if not node.is_variable for name in (node.symbol,) if name in unpaired}
            options = [sorted(arities.get(arity[name], ())) for name in unpaired]
            for choice in itertools.islice(itertools.product(*options), RENAMING_TRIES):
                trial = {**renaming, **dict(zip(unpaired, choice))}
                found = matcher.subsumer(renamed_clause(claimed, trial))
                if found is not None:
                    renaming = trial
                    break
        if found is None:
            return None
        matches[number] = found
    return Cover(tuple(matches[k] for k in range(len(conclusion_clauses))), tuple(sorted(renaming.items())))
