"""The primitive inference rules, and the conclusion test.

Each rule is a piece of evidence (a frozen dataclass saying which premises,
which literals, which substitutions, which position) and a pure function
that recomputes the conclusion from the premises, or returns a
:class:`Failure` naming the exact point where the evidence does not fit.
Premises are referred to by their index in the step's list of premises.
Each premise gets its own substitution, so parents never need renaming apart.

A step is accepted when the computed clause, under a given substitution
theta, is a subset of the claimed clause (theta(computed) ⊆ claimed): that
admits variants, renamings and weakenings, and nothing unsound.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from checker.kernel.clauses import EQUALITY, Clause, Literal, is_equality
from checker.kernel.failure import Failure, describe_position, quote
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import Position, Term, application, first_difference, replace_at, subterm_at


@dataclass(frozen=True, slots=True)
class Instantiation:
    """theta(premise): covers factoring and merging of duplicate literals."""

    premise: int
    substitution: Substitution = IDENTITY


@dataclass(frozen=True, slots=True)
class Resolution:
    """Binary resolution of ``left_literal`` of ``left`` with
    ``right_literal`` of ``right``, each premise under its own substitution."""

    left: int
    left_literal: int
    right: int
    right_literal: int
    left_substitution: Substitution = IDENTITY
    right_substitution: Substitution = IDENTITY


@dataclass(frozen=True, slots=True)
class Paramodulation:
    """Replace, at ``position`` of the atom of ``target_literal``, an
    instance of one side of the equation ``equation_literal`` by the other.

    ``left_to_right`` says the equation's first side (as written) is the one
    found in the target.  The position is into the instantiated target atom.
    """

    equation: int
    equation_literal: int
    left_to_right: bool
    target: int
    target_literal: int
    position: Position
    equation_substitution: Substitution = IDENTITY
    target_substitution: Substitution = IDENTITY


@dataclass(frozen=True, slots=True)
class EqualityResolution:
    """Remove a disequality ``s != t`` whose sides are equal under theta."""

    premise: int
    literal: int
    substitution: Substitution = IDENTITY


@dataclass(frozen=True, slots=True)
class EqualityFactoring:
    """From ``s = t | s' = t' | R`` with theta(s) = theta(s'), derive
    theta(``t != t' | s' = t' | R``).  The ``*_reversed`` flags say that the
    written equation is ``t = s`` (resp. ``t' = s'``)."""

    premise: int
    literal: int
    other_literal: int
    literal_reversed: bool = False
    other_reversed: bool = False
    substitution: Substitution = IDENTITY


PrimitiveEvidence = Instantiation | Resolution | Paramodulation | EqualityResolution | EqualityFactoring


@dataclass(frozen=True, slots=True)
class Chain:
    """Several primitive inferences in a row.  Premise index ``k`` of an
    inner step means the step's ``k``-th premise when below the number of
    premises, and otherwise the result of inner step ``k - len(premises)``."""

    steps: tuple[PrimitiveEvidence, ...]


def _premise(premises: Sequence[Clause], index: int, role: str) -> Clause | Failure:
    if not 0 <= index < len(premises):
        return Failure("premise_out_of_range", f"{role} premise {index} does not exist (the step has {len(premises)})")
    return premises[index]


def _literal(clause: Clause, index: int, role: str) -> Literal | Failure:
    if not 0 <= index < len(clause.literals):
        return Failure(
            "literal_out_of_range",
            f"{role} literal {index} does not exist in {quote(clause)} ({len(clause.literals)} literals)",
        )
    return clause.literals[index]


def _clash(reason: str, role: str, left: Term, right: Term, why: str) -> Failure:
    difference = first_difference(left, right)
    assert difference is not None  # callers only report terms that differ
    position, a, b = difference
    return Failure(
        reason,
        f"{role}: {quote(left)} and {quote(right)} differ at position {describe_position(position)}: "
        f"{quote(a)} vs {quote(b)} ({why})",
    )


def _atoms_match(left: Term, right: Term) -> bool:
    if left is right:
        return True
    return is_equality(left) and is_equality(right) and left.arguments == right.arguments[::-1]


def _facing(left: Term, right: Term) -> Term:
    """``right``, turned round when both are equations and only the turned
    one shares a side with ``left``, so that a reported difference is the
    real one rather than an artefact of how the equation was written."""
    if is_equality(left) and is_equality(right) and right.arguments[0] is not left.arguments[0]:
        if right.arguments[1] is left.arguments[0] or right.arguments[0] is left.arguments[1]:
            return application(right.symbol, right.arguments[::-1])
    return right


def instantiate(premises: Sequence[Clause], evidence: Instantiation) -> Clause | Failure:
    premise = _premise(premises, evidence.premise, "instantiated")
    if isinstance(premise, Failure):
        return premise
    return premise.instance(evidence.substitution)


def _pair(evidence: Resolution, left: Literal, right: Literal) -> str:
    """The two resolved literals as a failure names them (built only on failure)."""
    return (
        f"left literal {evidence.left_literal} {quote(left)} and "
        f"right literal {evidence.right_literal} {quote(right)}"
    )


def resolve(premises: Sequence[Clause], evidence: Resolution) -> Clause | Failure:
    left = _premise(premises, evidence.left, "left")
    if isinstance(left, Failure):
        return left
    right = _premise(premises, evidence.right, "right")
    if isinstance(right, Failure):
        return right
    left_literal = _literal(left, evidence.left_literal, "left")
    if isinstance(left_literal, Failure):
        return left_literal
    right_literal = _literal(right, evidence.right_literal, "right")
    if isinstance(right_literal, Failure):
        return right_literal
    if left_literal.positive == right_literal.positive:
        sign = "positive" if left_literal.positive else "negative"
        return Failure(
            "same_sign", f"literals not complementary: {_pair(evidence, left_literal, right_literal)} are both {sign}"
        )
    a = left_literal.instance(evidence.left_substitution)
    b = right_literal.instance(evidence.right_substitution)
    if not _atoms_match(a.atom, b.atom):
        return _clash(
            "atoms_differ",
            f"literals not complementary: {_pair(evidence, left_literal, right_literal)} after substitution",
            a.atom,
            _facing(a.atom, b.atom),
            "the stated substitutions do not make the atoms equal",
        )
    # Clauses are sets: every literal that the substitution merges into the
    # resolved one goes with it.
    kept = [lit for lit in left.instance(evidence.left_substitution).literals if lit != a]
    kept += [lit for lit in right.instance(evidence.right_substitution).literals if lit != b]
    return Clause(kept)


def paramodulate(premises: Sequence[Clause], evidence: Paramodulation) -> Clause | Failure:
    equation_clause = _premise(premises, evidence.equation, "equation")
    if isinstance(equation_clause, Failure):
        return equation_clause
    target_clause = _premise(premises, evidence.target, "target")
    if isinstance(target_clause, Failure):
        return target_clause
    equation = _literal(equation_clause, evidence.equation_literal, "equation")
    if isinstance(equation, Failure):
        return equation
    target = _literal(target_clause, evidence.target_literal, "target")
    if isinstance(target, Failure):
        return target
    if not (equation.positive and is_equality(equation.atom)):
        return Failure(
            "not_an_equation",
            f"equation literal {evidence.equation_literal} {quote(equation)} is not a positive equality",
        )
    first, second = (evidence.equation_substitution(side) for side in equation.atom.arguments)
    found, replacement = (first, second) if evidence.left_to_right else (second, first)
    target_instance = target.instance(evidence.target_substitution)
    position = tuple(evidence.position)
    # The root is the atom itself, which is not a term an equation may rewrite.
    subterm = subterm_at(target_instance.atom, position) if position else None
    if subterm is None:
        return Failure(
            "no_such_position",
            f"position {describe_position(position)} is not a term position in target literal "
            f"{evidence.target_literal} {quote(target_instance)}",
        )
    if subterm is not found:
        return _clash(
            "subterm_mismatch",
            f"subterm at position {describe_position(position)} of target literal {evidence.target_literal} "
            f"{quote(target_instance)} does not match the equation side",
            subterm,
            found,
            "subterm vs equation side after substitution",
        )
    rewritten = Literal(target_instance.positive, replace_at(target_instance.atom, position, replacement))
    equation_used = Literal(True, application(EQUALITY, (first, second)))
    kept = [lit for lit in equation_clause.instance(evidence.equation_substitution).literals if lit != equation_used]
    kept += [lit for lit in target_clause.instance(evidence.target_substitution).literals if lit != target_instance]
    kept.append(rewritten)
    return Clause(kept)


def resolve_equality(premises: Sequence[Clause], evidence: EqualityResolution) -> Clause | Failure:
    premise = _premise(premises, evidence.premise, "equality resolution")
    if isinstance(premise, Failure):
        return premise
    literal = _literal(premise, evidence.literal, "disequality")
    if isinstance(literal, Failure):
        return literal
    if literal.positive or not is_equality(literal.atom):
        return Failure("not_a_disequality", f"literal {evidence.literal} {quote(literal)} is not a disequality")
    instance = literal.instance(evidence.substitution)
    left, right = instance.atom.arguments
    if left is not right:
        return _clash(
            "sides_differ", f"disequality literal {evidence.literal} {quote(literal)}", left, right, "sides after substitution"
        )
    return Clause(lit for lit in premise.instance(evidence.substitution).literals if lit != instance)


def factor_equality(premises: Sequence[Clause], evidence: EqualityFactoring) -> Clause | Failure:
    premise = _premise(premises, evidence.premise, "equality factoring")
    if isinstance(premise, Failure):
        return premise
    if evidence.literal == evidence.other_literal:
        return Failure("same_literal", f"equality factoring needs two literals, got {evidence.literal} twice")
    sides = []
    for index, reversed_ in ((evidence.literal, evidence.literal_reversed), (evidence.other_literal, evidence.other_reversed)):
        literal = _literal(premise, index, "equality factoring")
        if isinstance(literal, Failure):
            return literal
        if not (literal.positive and is_equality(literal.atom)):
            return Failure("not_an_equation", f"literal {index} {quote(literal)} is not a positive equality")
        s, t = (evidence.substitution(side) for side in literal.atom.arguments)
        sides.append((t, s) if reversed_ else (s, t))
    (s, t), (s2, t2) = sides
    if s is not s2:
        return _clash(
            "factored_sides_differ",
            f"equality factoring of literals {evidence.literal} {quote(premise.literals[evidence.literal])} and "
            f"{evidence.other_literal} {quote(premise.literals[evidence.other_literal])}",
            s,
            s2,
            "the sides to be identified, after substitution",
        )
    kept = [lit for i, lit in enumerate(premise.instance(evidence.substitution).literals) if i != evidence.literal]
    kept.append(Literal(False, application(EQUALITY, (t, t2))))
    return Clause(kept)


_RULES = {
    Instantiation: instantiate,
    Resolution: resolve,
    Paramodulation: paramodulate,
    EqualityResolution: resolve_equality,
    EqualityFactoring: factor_equality,
}


def replay(premises: Sequence[Clause], evidence: PrimitiveEvidence | Chain) -> Clause | Failure:
    """The clause the evidence derives from the premises, or why it does not.

    A chain's inferences must be primitive (no chains inside chains), so
    replay never recurses however the evidence is nested."""
    if not isinstance(evidence, Chain):
        return _replay_primitive(premises, evidence)
    if not evidence.steps:
        return Failure("empty_chain", "a chain of inferences needs at least one inference")
    available = list(premises)
    for number, inner in enumerate(evidence.steps, start=1):
        result = _replay_primitive(available, inner)
        if isinstance(result, Failure):
            return Failure(result.reason, f"inference {number} of {len(evidence.steps)}: {result.message}")
        available.append(result)
    return available[-1]


def _replay_primitive(premises: Sequence[Clause], evidence: PrimitiveEvidence) -> Clause | Failure:
    rule = _RULES.get(type(evidence))
    if rule is None:
        return Failure("unknown_evidence", f"no primitive rule takes evidence of type {type(evidence).__name__}")
    return rule(premises, evidence)


@dataclass(frozen=True, slots=True)
class Refutation:
    """The claimed clause follows because the premises together with its
    negation (see :func:`negated_claim`) derive the empty clause by ``chain``."""

    chain: Chain


CLAIM_CONSTANT_PREFIX = "claim_constant_"


def negated_claim(premises: Sequence[Clause], claimed: Clause) -> list[Clause]:
    """One unit clause per claimed literal, negated, with the claim's
    variables replaced by constants that occur in no premise and not in the
    claim.  Premise index ``len(premises) + k`` of a :class:`Refutation`
    chain is the ``k``-th of these."""
    used = {name for clause in (*premises, claimed) for name, _ in clause.symbols()}
    constants: dict[Term, Term] = {}
    number = 0
    for var in sorted(claimed.variables(), key=lambda v: v.symbol):
        while f"{CLAIM_CONSTANT_PREFIX}{number}" in used:
            number += 1
        constants[var] = application(f"{CLAIM_CONSTANT_PREFIX}{number}")
        number += 1
    grounding = Substitution(constants)
    return [Clause([literal.instance(grounding).negated()]) for literal in claimed.literals]


def check_conclusion(computed: Clause, claimed: Clause, theta: Substitution = IDENTITY) -> Failure | None:
    """None when theta(computed) ⊆ claimed; otherwise the literals that the
    claimed clause lacks (and, to help, those it has that were not produced:
    extra claimed literals alone are a harmless weakening, never a failure)."""
    produced = computed.instance(theta)
    missing = [lit for lit in produced.literals if lit not in claimed.literal_set]
    if not missing:
        return None
    extra = [lit for lit in claimed.literals if lit not in produced.literal_set]
    message = (
        f"computed {quote(produced)}, claimed {quote(claimed)}: produced but missing from the claimed clause: "
        + ", ".join(quote(lit) for lit in dict.fromkeys(missing))
    )
    if extra:
        message += "; claimed but not produced: " + ", ".join(quote(lit) for lit in dict.fromkeys(extra))
    return Failure("missing_from_claimed", message)


def check_clause_step(
    premises: Sequence[Clause],
    claimed: Clause,
    evidence: PrimitiveEvidence | Chain | Refutation,
    theta: Substitution = IDENTITY,
) -> Failure | None:
    """None when the evidence derives, from the premises, a clause that
    subsumes the claimed one under theta (a refutation needs no theta)."""
    if isinstance(evidence, Refutation):
        computed = replay([*premises, *negated_claim(premises, claimed)], evidence.chain)
        if isinstance(computed, Failure):
            return Failure(computed.reason, f"refuting the negated claim: {computed.message}")
        if not computed.is_empty:
            return Failure("refutation_incomplete", f"the refutation ends in {quote(computed)}, not the empty clause")
        return None
    computed = replay(premises, evidence)
    if isinstance(computed, Failure):
        return computed
    return check_conclusion(computed, claimed, theta)
