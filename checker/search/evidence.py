"""Candidate single inferences from a step's premises, cheapest kind first.

Each generator proposes kernel evidence for one primitive rule together
with the clause the kernel computes from it; whether that clause subsumes
the claimed one is decided by the caller.  Unifiers are most general and
computed on renamed-apart copies, then split into one substitution per
premise (see :mod:`checker.search.renaming`).  The prover's rule name only
changes which kinds are tried first.

The per-premise generators (``resolvents(premises, left, right)`` ...) are
shared with the saturation search, which calls them on its clause store.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause, Literal, is_equality
from checker.kernel.failure import describe_position
from checker.kernel.rules import (
    EqualityFactoring,
    EqualityResolution,
    Instantiation,
    Paramodulation,
    PrimitiveEvidence,
    Resolution,
    replay,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import subterms
from checker.search.findings import searching
from checker.search.renaming import rename_apart, split_unifier
from checker.search.unify import unify, unify_atoms


@dataclass(frozen=True, slots=True)
class Attempt:
    """One candidate inference: its kind, the evidence, and the clause the
    kernel computes from it."""

    kind: str
    evidence: PrimitiveEvidence
    computed: Clause


def _attempt(premises: Sequence[Clause], kind: str, evidence: PrimitiveEvidence) -> Attempt | None:
    computed = replay(premises, evidence)
    if not isinstance(computed, Clause):
        return None  # a malformed candidate is a search bug; drop it rather than trust it
    return Attempt(kind, evidence, computed)


def describe(premises: Sequence[Clause], evidence: PrimitiveEvidence) -> str:
    """The inference in words, for a report (written only when shown)."""
    if isinstance(evidence, Instantiation):
        return f"instance of premise {evidence.premise} under {evidence.substitution}"
    if isinstance(evidence, Resolution):
        left, right = premises[evidence.left], premises[evidence.right]
        return (
            f"resolution of literal {evidence.left_literal} `{left.literals[evidence.left_literal]}` of premise "
            f"{evidence.left} with literal {evidence.right_literal} `{right.literals[evidence.right_literal]}` of "
            f"premise {evidence.right}, unifier {evidence.left_substitution} / {evidence.right_substitution}"
        )
    if isinstance(evidence, Paramodulation):
        equation = premises[evidence.equation].literals[evidence.equation_literal]
        target = premises[evidence.target].literals[evidence.target_literal]
        direction = "left to right" if evidence.left_to_right else "right to left"
        return (
            f"paramodulation with literal {evidence.equation_literal} `{equation}` of premise {evidence.equation} "
            f"({direction}) into literal {evidence.target_literal} `{target}` of premise {evidence.target} at "
            f"position {describe_position(evidence.position)}, unifier {evidence.equation_substitution} / "
            f"{evidence.target_substitution}"
        )
    if isinstance(evidence, EqualityResolution):
        literal = premises[evidence.premise].literals[evidence.literal]
        return (
            f"equality resolution on literal {evidence.literal} `{literal}` of premise {evidence.premise}, "
            f"unifier {evidence.substitution}"
        )
    literals = premises[evidence.premise].literals
    return (
        f"equality factoring of literals {evidence.literal} `{literals[evidence.literal]}` and "
        f"{evidence.other_literal} `{literals[evidence.other_literal]}` of premise {evidence.premise}, "
        f"unifier {evidence.substitution}"
    )


_PREMISE_FIELDS: dict[type, tuple[str, ...]] = {
    Instantiation: ("premise",),
    Resolution: ("left", "right"),
    Paramodulation: ("equation", "target"),
    EqualityResolution: ("premise",),
    EqualityFactoring: ("premise",),
}

_SUBSTITUTION_FIELDS: dict[type, tuple[tuple[str, str], ...]] = {
    Instantiation: (("premise", "substitution"),),
    Resolution: (("left", "left_substitution"), ("right", "right_substitution")),
    Paramodulation: (("equation", "equation_substitution"), ("target", "target_substitution")),
    EqualityResolution: (("premise", "substitution"),),
    EqualityFactoring: (("premise", "substitution"),),
}


def premise_references(evidence: PrimitiveEvidence) -> list[int]:
    """The premise (or earlier result) indices a piece of evidence uses."""
    return [getattr(evidence, name) for name in _PREMISE_FIELDS[type(evidence)]]


def reindexed(evidence: PrimitiveEvidence, mapping: dict[int, int]) -> PrimitiveEvidence:
    """The same evidence with its premise indices mapped."""
    fields = _PREMISE_FIELDS[type(evidence)]
    return dataclasses.replace(evidence, **{name: mapping[getattr(evidence, name)] for name in fields})


def premise_substitutions(evidence: PrimitiveEvidence) -> list[tuple[int, Substitution]]:
    """Each premise index the evidence uses, with the substitution it applies there."""
    return [(getattr(evidence, p), getattr(evidence, s)) for p, s in _SUBSTITUTION_FIELDS[type(evidence)]]


def with_premise_substitutions(evidence: PrimitiveEvidence, change) -> PrimitiveEvidence:
    """The evidence with each premise's substitution ``s`` replaced by
    ``change(premise_index, s)``."""
    updates = {s: change(getattr(evidence, p), getattr(evidence, s)) for p, s in _SUBSTITUTION_FIELDS[type(evidence)]}
    return dataclasses.replace(evidence, **updates)


# Per-premise generators ---------------------------------------------------


def equality_resolvents(premises: Sequence[Clause], index: int) -> Iterator[Attempt]:
    """Equality resolution on each disequality whose sides unify."""
    for position, literal in enumerate(premises[index].literals):
        if literal.positive or not is_equality(literal.atom):
            continue
        unifier = unify(*literal.atom.arguments)
        if unifier is not None:
            found = _attempt(premises, "equality_resolution", EqualityResolution(index, position, unifier))
            if found is not None:
                yield found


def factors(premises: Sequence[Clause], index: int) -> Iterator[Attempt]:
    """Factoring: the instance under the mgu of two same-sign literals."""
    literals = premises[index].literals
    for i, a in enumerate(literals):
        for j in range(i + 1, len(literals)):
            b = literals[j]
            if a.positive != b.positive or a.atom.symbol != b.atom.symbol or a == b:
                continue
            for unifier in unify_atoms(a.atom, b.atom):
                found = _attempt(premises, "factoring", Instantiation(index, unifier))
                if found is not None:
                    yield found


def _merged(unifier: Substitution, resolved: Literal, index: int, literals: tuple[Literal, ...]) -> list[Substitution]:
    """Unifiers extending ``unifier`` that also merge one more literal (same
    sign) of the same clause into the resolved one, and one merging all it can."""
    found: list[Substitution] = []
    greedy = unifier
    for other, literal in enumerate(literals):
        if other == index or literal.positive != resolved.positive:
            continue
        for extended in unify_atoms(resolved.atom, literal.atom, unifier):
            if extended != unifier and extended not in found:
                found.append(extended)
        more = unify_atoms(resolved.atom, literal.atom, greedy)
        if more:
            greedy = more[0]
    if greedy != unifier and greedy not in found:
        found.append(greedy)
    return found


def resolvents(
    premises: Sequence[Clause], left_index: int, right_index: int, with_factoring: bool = False
) -> Iterator[Attempt]:
    """Binary resolution of the two premises on every complementary pair of
    literals, with the mgu; with ``with_factoring``, with unifiers that also
    merge further literals of one parent into the resolved one."""
    left, right = premises[left_index], premises[right_index]
    if not _clashing(left, right):
        return  # no pair of literals to resolve on: renaming apart would be wasted
    copy, renaming = rename_apart(right, left.variables())
    left_variables, right_variables = left.variables(), right.variables()
    kind = "resolution_factoring" if with_factoring else "resolution"
    for i, a in enumerate(left.literals):
        for j, b in enumerate(copy.literals):
            if left_index == right_index and j <= i:
                continue
            if a.positive == b.positive or a.atom.symbol != b.atom.symbol or a.atom.arity != b.atom.arity:
                continue
            for unifier in unify_atoms(a.atom, b.atom):
                if with_factoring:
                    unifiers = _merged(unifier, a, i, left.literals) + _merged(unifier, b, j, copy.literals)
                else:
                    unifiers = [unifier]
                for chosen in unifiers:
                    left_sub, right_sub = split_unifier(chosen, left_variables, right_variables, renaming)
                    found = _attempt(premises, kind, Resolution(left_index, i, right_index, j, left_sub, right_sub))
                    if found is not None:
                        yield found


def _clashing(left: Clause, right: Clause) -> bool:
    """Whether some literal of ``left`` and some literal of ``right`` have
    opposite signs and the same predicate symbol and arity (the only pairs
    :func:`resolvents` tries)."""
    signed = {(literal.positive, literal.atom.symbol, literal.atom.arity) for literal in left.literals}
    return any((not literal.positive, literal.atom.symbol, literal.atom.arity) in signed for literal in right.literals)


def paramodulants(premises: Sequence[Clause], equation_index: int, target_index: int) -> Iterator[Attempt]:
    """Paramodulation with every positive equation of one premise, in either
    direction, into every non-variable subterm of the other premise."""
    equation_clause, target_clause = premises[equation_index], premises[target_index]
    equations = [(k, lit) for k, lit in enumerate(equation_clause.literals) if lit.positive and is_equality(lit.atom)]
    if not equations:
        return
    copy, renaming = rename_apart(target_clause, equation_clause.variables())
    equation_variables, target_variables = equation_clause.variables(), target_clause.variables()
    for k, equation in equations:
        for left_to_right in (True, False):
            side = equation.atom.arguments[0 if left_to_right else 1]
            if side.is_variable:
                continue
            for m, literal in enumerate(copy.literals):
                itself = equation_index == target_index and m == k
                for position, subterm in subterms(literal.atom):
                    if not position or subterm.is_variable or subterm.symbol != side.symbol:
                        continue
                    if itself and len(position) == 1:
                        continue  # an equation rewritten at its own side only yields s = s
                    unifier = unify(side, subterm)
                    if unifier is None:
                        continue
                    equation_sub, target_sub = split_unifier(unifier, equation_variables, target_variables, renaming)
                    evidence = Paramodulation(
                        equation_index, k, left_to_right, target_index, m, position, equation_sub, target_sub
                    )
                    found = _attempt(premises, "paramodulation", evidence)
                    if found is not None:
                        yield found


def equality_factors(premises: Sequence[Clause], index: int) -> Iterator[Attempt]:
    """Equality factoring of every ordered pair of positive equations whose
    chosen sides unify, in all four orientations."""
    literals = premises[index].literals
    equations = [(k, lit) for k, lit in enumerate(literals) if lit.positive and is_equality(lit.atom)]
    for k, literal in equations:
        for m, other in equations:
            if k == m:
                continue
            for literal_reversed in (False, True):
                for other_reversed in (False, True):
                    s = literal.atom.arguments[1 if literal_reversed else 0]
                    s2 = other.atom.arguments[1 if other_reversed else 0]
                    unifier = unify(s, s2)
                    if unifier is None:
                        continue
                    evidence = EqualityFactoring(index, k, m, literal_reversed, other_reversed, unifier)
                    found = _attempt(premises, "equality_factoring", evidence)
                    if found is not None:
                        yield found


# Whole-step generators ----------------------------------------------------


def instantiations(premises: Sequence[Clause]) -> Iterator[Attempt]:
    """Each premise as it stands: renaming, instantiation and factoring are
    all found afterwards by subsumption of the claimed clause."""
    for index in range(len(premises)):
        found = _attempt(premises, "instantiation", Instantiation(index))
        if found is not None:
            yield found


def _each_premise(generator: Callable[[Sequence[Clause], int], Iterator[Attempt]]):
    def run(premises: Sequence[Clause]) -> Iterator[Attempt]:
        for index in range(len(premises)):
            yield from generator(premises, index)

    return run


def _resolutions(with_factoring: bool):
    def run(premises: Sequence[Clause]) -> Iterator[Attempt]:
        for left in range(len(premises)):
            for right in range(left, len(premises)):
                yield from resolvents(premises, left, right, with_factoring)

    return run


def _paramodulations(premises: Sequence[Clause]) -> Iterator[Attempt]:
    for equation in range(len(premises)):
        for target in range(len(premises)):
            yield from paramodulants(premises, equation, target)


GENERATORS: dict[str, Callable[[Sequence[Clause]], Iterator[Attempt]]] = {
    "instantiation": instantiations,
    "equality_resolution": _each_premise(equality_resolvents),
    "resolution": _resolutions(False),
    "equality_factoring": _each_premise(equality_factors),
    "paramodulation": _paramodulations,
    "resolution_factoring": _resolutions(True),
}
"""The kinds of candidate in the default order, cheapest first."""

_HINTS: tuple[tuple[tuple[str, ...], frozenset[str], tuple[str, ...]], ...] = (
    # (words found anywhere in the name, whole short names, kinds to try first)
    (("equality_resolution", "equality resolution", "eq_res"), frozenset({"er"}), ("equality_resolution",)),
    (("equality_factoring", "equality factoring", "eq_fact"), frozenset({"ef"}), ("equality_factoring",)),
    (("superpos", "paramod", "demod", "rewrit"), frozenset({"sup", "pm", "rw"}), ("paramodulation",)),
    (("resol",), frozenset({"res", "br"}), ("resolution", "resolution_factoring")),
    (("factor", "merg", "instan", "renam", "variant", "duplicate"), frozenset({"fact", "inst"}), ("instantiation",)),
)


def order_for(rule_hint: str) -> list[str]:
    """The kinds of candidate to try, those the rule name suggests first."""
    name = rule_hint.lower()
    first: list[str] = []
    for words, short_names, kinds in _HINTS:
        if name in short_names or any(word in name for word in words):
            first.extend(kind for kind in kinds if kind not in first)
    return first + [kind for kind in GENERATORS if kind not in first]


@searching
def candidates(premises: Sequence[Clause], rule_hint: str = "") -> Iterator[Attempt]:
    """Every candidate single inference, in the order :func:`order_for` gives."""
    for kind in order_for(rule_hint):
        yield from GENERATORS[kind](premises)
