"""Random but valid single-inference steps and rewriting chains.

Each builder makes premises whose unifiable parts are built on purpose
(two generalizations of one term), applies the kernel's own rule to them
with the substitutions that come out of the construction, and then
disguises the result as a prover would write it: variables renamed,
literals shuffled, equations written either way round, sometimes an extra
literal (a harmless weakening).  None of this uses the search, so a step
the search then fails on is a genuine miss.

The signature is a parameter, so the benchmark can run the same builders
over its own invented vocabulary.
"""

from __future__ import annotations

import random
from collections.abc import Callable
from dataclasses import dataclass, field

from checker.kernel.clauses import Clause, Literal
from checker.kernel.rules import (
    EqualityFactoring,
    EqualityResolution,
    Paramodulation,
    Resolution,
    factor_equality,
    paramodulate,
    resolve,
    resolve_equality,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, replace_at, subterm_at, subterms, variable


@dataclass(frozen=True)
class Signature:
    constants: tuple[str, ...] = ("a", "b", "c")
    functions: tuple[tuple[str, int], ...] = (("f", 1), ("g", 2), ("h", 1))
    predicates: tuple[tuple[str, int], ...] = (("p", 1), ("q", 2), ("r", 1))
    variables: tuple[str, ...] = ("X", "Y", "Z")


@dataclass(frozen=True)
class Step:
    kind: str
    premises: tuple[Clause, ...]
    claimed: Clause
    stated: tuple[Substitution | None, ...] = field(default=())


class Builder:
    """Random terms, atoms and clauses over a signature."""

    def __init__(self, rng: random.Random, signature: Signature = Signature(), ground: bool = False):
        self.rng = rng
        self.signature = signature
        self.ground = ground
        self.fresh = 0

    def term(self, depth: int = 2, pool: tuple[str, ...] | None = None) -> Term:
        pool = self.signature.variables if pool is None else pool
        rng = self.rng
        if depth == 0 or rng.random() < 0.35:
            if not self.ground and pool and rng.random() < 0.4:
                return variable(rng.choice(pool))
            return application(rng.choice(self.signature.constants))
        name, arity = rng.choice(self.signature.functions)
        return application(name, tuple(self.term(depth - 1, pool) for _ in range(arity)))

    def atom(self, depth: int = 2, equality: bool = False) -> Term:
        if equality:
            return application("=", (self.term(depth), self.term(depth)))
        name, arity = self.rng.choice(self.signature.predicates)
        return application(name, tuple(self.term(depth) for _ in range(arity)))

    def literal(self, equality: bool = False) -> Literal:
        return Literal(self.rng.random() < 0.5, self.atom(equality=equality and self.rng.random() < 0.5))

    def literals(self, most: int = 2, equality: bool = False) -> list[Literal]:
        return [self.literal(equality) for _ in range(self.rng.randint(0, most))]

    def generalized(self, term: Term, prefix: str) -> tuple[Term, dict[Term, Term]]:
        """A term of which ``term`` is an instance, with the bindings that
        give it back; new variables are ``prefix0``, ``prefix1`` ... (never
        in the ground variant)."""
        bindings: dict[Term, Term] = {}
        if self.ground:
            return term, bindings
        names = [f"{prefix}{i}" for i in range(3)]
        # Rebuild bottom-up, replacing some subterms by variables.
        order = [t for _, t in subterms(term)]
        built: dict[Term, Term] = {}
        for current in reversed(order):
            if current in built:
                continue
            if current is not term and self.rng.random() < 0.3:
                name = self.rng.choice(names)
                var = variable(name)
                if var not in bindings:
                    bindings[var] = current
                    built[current] = var
                    continue
                if bindings[var] is current:
                    built[current] = var
                    continue
            if current.is_variable:
                built[current] = current
            else:
                built[current] = application(current.symbol, tuple(built[a] for a in current.arguments))
        return built[term], bindings

    def disguised(self, clause: Clause, extra: bool = True) -> Clause:
        """The clause as a prover might write it: variables renamed,
        literals shuffled, equations either way round, maybe one more literal."""
        names = sorted(clause.variables(), key=lambda v: v.symbol)
        renaming = Substitution({var: variable(f"V{i}") for i, var in enumerate(names)})
        written = []
        for literal in clause.instance(renaming).literal_set:
            atom = literal.atom
            if atom.symbol == "=" and self.rng.random() < 0.5:
                atom = application("=", atom.arguments[::-1])
            written.append(Literal(literal.positive, atom))
        written.sort(key=str)
        self.rng.shuffle(written)
        if extra and self.rng.random() < 0.3:
            written.append(Literal(True, application("extra_weakening", (application(self.signature.constants[0]),))))
        return Clause(written)


def _ground_out(clause: Clause, builder: Builder) -> Clause:
    if not builder.ground:
        return clause
    return clause.instance(Substitution({v: application(builder.signature.constants[0]) for v in clause.variables()}))


def resolution_step(builder: Builder) -> Step:
    rng = builder.rng
    atom = builder.atom()
    left_atom, left_bindings = builder.generalized(atom, "U")
    right_atom, right_bindings = builder.generalized(atom, "U")  # same names on purpose: parents share variables
    positive = rng.random() < 0.5
    left = _ground_out(Clause([Literal(positive, left_atom), *builder.literals()]), builder)
    right = _ground_out(Clause([*builder.literals(), Literal(not positive, right_atom)]), builder)
    right_index = len(right.literals) - 1
    evidence = Resolution(0, 0, 1, right_index, Substitution(left_bindings), Substitution(right_bindings))
    computed = resolve([left, right], evidence)
    assert isinstance(computed, Clause), computed
    return Step("resolution", (left, right), builder.disguised(computed))


def factoring_step(builder: Builder) -> Step:
    atom = builder.atom()
    first, first_bindings = builder.generalized(atom, "U")
    second, second_bindings = builder.generalized(atom, "W")
    positive = builder.rng.random() < 0.5
    clause = Clause([Literal(positive, first), *builder.literals(), Literal(positive, second)])
    computed = clause.instance(Substitution({**first_bindings, **second_bindings}))
    return Step("factoring", (_ground_out(clause, builder),), builder.disguised(_ground_out(computed, builder)))


def instantiation_step(builder: Builder) -> Step:
    clause = Clause([builder.literal(equality=True), *builder.literals(equality=True)])
    theta = Substitution({variable(name): builder.term(1, ()) for name in builder.signature.variables})
    return Step("instantiation", (clause,), builder.disguised(clause.instance(theta)))


def paramodulation_step(builder: Builder) -> Step:
    rng = builder.rng
    target_atom = builder.atom(depth=3, equality=rng.random() < 0.3)
    positions = [(p, t) for p, t in subterms(target_atom) if p and not t.is_variable]
    if not positions:
        target_atom = application("p", (application("f", (application("a"),)),))
        positions = [((1,), target_atom.arguments[0])]
    position, found = rng.choice(positions)
    side, equation_bindings = builder.generalized(found, "U")
    other = builder.term(2, tuple(v.symbol for v in equation_bindings) or None)
    left_to_right = rng.random() < 0.5
    equation_atom = application("=", (side, other) if left_to_right else (other, side))
    equation = Clause([Literal(True, equation_atom), *builder.literals()])
    # The target holds a generalization of the found subterm at the position.
    target_pattern, target_bindings = builder.generalized(found, "U")
    target_atom = _replace(target_atom, position, target_pattern)
    target = Clause([*builder.literals(), Literal(rng.random() < 0.5, target_atom)])
    evidence = Paramodulation(
        0,
        0,
        left_to_right,
        1,
        len(target.literals) - 1,
        position,
        Substitution(equation_bindings),
        Substitution(target_bindings),
    )
    computed = paramodulate([equation, target], evidence)
    assert isinstance(computed, Clause), computed
    return Step("paramodulation", (equation, target), builder.disguised(computed))


def _replace(term: Term, position: tuple[int, ...], replacement: Term) -> Term:
    assert subterm_at(term, position) is not None
    return replace_at(term, position, replacement)


def equality_resolution_step(builder: Builder) -> Step:
    term = builder.term(2)
    left, left_bindings = builder.generalized(term, "U")
    right, right_bindings = builder.generalized(term, "W")
    clause = Clause([*builder.literals(), Literal(False, application("=", (left, right)))])
    evidence = EqualityResolution(0, len(clause.literals) - 1, Substitution({**left_bindings, **right_bindings}))
    computed = resolve_equality([clause], evidence)
    assert isinstance(computed, Clause), computed
    return Step("equality_resolution", (clause,), builder.disguised(computed))


def equality_factoring_step(builder: Builder) -> Step:
    rng = builder.rng
    term = builder.term(2)
    s, s_bindings = builder.generalized(term, "U")
    s2, s2_bindings = builder.generalized(term, "W")
    t, t2 = builder.term(1), builder.term(1)
    first_reversed, second_reversed = rng.random() < 0.5, rng.random() < 0.5
    first = application("=", (t, s) if first_reversed else (s, t))
    second = application("=", (t2, s2) if second_reversed else (s2, t2))
    clause = Clause([Literal(True, first), *builder.literals(), Literal(True, second)])
    evidence = EqualityFactoring(
        0, 0, len(clause.literals) - 1, first_reversed, second_reversed, Substitution({**s_bindings, **s2_bindings})
    )
    computed = factor_equality([clause], evidence)
    assert isinstance(computed, Clause), computed
    return Step("equality_factoring", (clause,), builder.disguised(computed))


def rewriting_chain_step(builder: Builder, rewrites: int | None = None) -> Step:
    """A clause rewritten several times, each time by a new unit equation
    built to match a subterm of the clause as it then is.  As in a prover's
    demodulation, each rewrite makes the clause smaller: a compound subterm
    becomes a constant."""
    rng = builder.rng
    count = rewrites if rewrites is not None else rng.randint(2, 4)
    clause = Clause([Literal(rng.random() < 0.5, builder.atom(depth=3)), *builder.literals(1)])
    premises = [clause]
    current = clause
    for _ in range(count):
        positions = [
            (m, p, t) for m, lit in enumerate(current.literals) for p, t in subterms(lit.atom) if p and t.arguments
        ]
        if not positions:
            break
        m, position, found = rng.choice(positions)
        side, bindings = builder.generalized(found, "U")
        other = application(rng.choice(builder.signature.constants))
        left_to_right = rng.random() < 0.5
        equation = Clause([Literal(True, application("=", (side, other) if left_to_right else (other, side)))])
        premises.append(equation)
        evidence = Paramodulation(len(premises) - 1, 0, left_to_right, 0, m, position, Substitution(bindings))
        # The evidence names premise 0 as its target: rewrite the current clause in its place.
        rewritten = paramodulate([current, *premises[1:]], evidence)
        assert isinstance(rewritten, Clause), rewritten
        current = rewritten
    return Step("rewriting_chain", tuple(premises), builder.disguised(current, extra=False))


def unit_deletion_step(builder: Builder) -> Step:
    """A clause from which literals are deleted by (generalized) unit clauses
    among the parents, plus an ``s != s`` literal removed."""
    rng = builder.rng
    kept = [builder.literal() for _ in range(rng.randint(1, 2))]
    deleted = [builder.literal() for _ in range(rng.randint(1, 2))]
    trivial = builder.term(1)
    clause = Clause([*kept, *deleted, Literal(False, application("=", (trivial, trivial)))])
    units = []
    for literal in deleted:
        pattern, _ = builder.generalized(literal.atom, "U")
        units.append(Clause([Literal(not literal.positive, pattern)]))
    premises = [clause, *units]
    claimed = Clause(lit for lit in kept if lit not in deleted)
    return Step("unit_deletion", tuple(premises), builder.disguised(claimed, extra=False))


def hyper_resolution_step(builder: Builder) -> Step:
    """A nucleus ~A1 | ... | ~Ak | B with units instantiating every Ai: the
    claim needs several resolutions that instantiate the nucleus, which
    only the refutation search does."""
    rng = builder.rng
    size = rng.randint(2, 3)
    negatives = [builder.atom(depth=1) for _ in range(size)]
    head = builder.atom(depth=1)
    nucleus = Clause([*(Literal(False, a) for a in negatives), Literal(True, head)])
    grounding = Substitution({variable(name): builder.term(1, ()) for name in builder.signature.variables})
    units = [Clause([Literal(True, grounding(a))]) for a in negatives]
    return Step("hyper_resolution", (nucleus, *units), Clause([Literal(True, grounding(head))]))


BUILDERS: dict[str, Callable[[Builder], Step]] = {
    "instantiation": instantiation_step,
    "factoring": factoring_step,
    "resolution": resolution_step,
    "paramodulation": paramodulation_step,
    "equality_resolution": equality_resolution_step,
    "equality_factoring": equality_factoring_step,
    "rewriting_chain": rewriting_chain_step,
    "unit_deletion": unit_deletion_step,
    "hyper_resolution": hyper_resolution_step,
}
