"""Reconstructing the evidence for a clause step: the one entry point.

Given a step's premises and claimed clause, look for kernel evidence that
the claim follows, cheapest first: a single primitive inference (whose
result subsumes the claim), then a short chain of rewrites and literal
deletions, then a bounded refutation of the premises and the negated
claim.  Everything returned has been accepted by
:func:`checker.kernel.rules.check_clause_step`; this module itself is
untrusted and can only fail to find evidence.

When the derivation states a parent's bindings, the search runs on the
stated instances, and the evidence returned uses the parent only as that
instance (or an instance of it, when the stated terms themselves hold
variables).  When nothing is found,
the closest candidate tells a prover developer what the nearest inference
computes, and what differs from the claim.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field, replace

from checker.kernel.clauses import Clause, Literal
from checker.kernel.rules import (
    Chain,
    Instantiation,
    PrimitiveEvidence,
    Refutation,
    check_clause_step,
    negated_claim,
    replay,
)
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import Term, variables_of
from checker.search.chains import Seed, find_chain
from checker.search.evidence import (
    Attempt,
    candidates,
    describe,
    premise_substitutions,
    reindexed,
    with_premise_substitutions,
)
from checker.search.findings import CLAUSE_EVIDENCE, argument_of, checked_clause_evidence, hook
from checker.search.models import find_countermodel
from checker.search.normal_forms import find_normal_form_chain
from checker.search.saturation import refute
from checker.search.subsumption import find_theta
from checker.search.unify import match_atoms_into, match_into

Evidence = PrimitiveEvidence | Chain | Refutation


@dataclass(frozen=True, slots=True)
class SearchLimits:
    """How much work one step's search may do, as counts (never time), so
    that results are reproducible."""

    candidates: int = 2000
    """single-inference candidates examined"""
    subsumption_nodes: int = 2000
    """matching attempts per subsumption test"""
    rewrite_steps: int = 600
    """clauses expanded by the rewriting / deletion chain search"""
    chain_seeds: int = 8
    """nearest single-inference results also used as chain starts"""
    saturation_clauses: int = 600
    """clauses the refutation search may generate"""
    saturation_given: int = 60
    """clauses the refutation search may process"""
    witness_readings: int = 64
    """choices explored when pairing new Skolem symbols with quantifiers"""
    sat_conflicts: int = 100000
    """conflicts the SAT solver may meet on a propositional step"""
    screen_domain: int = 3
    """largest domain of the counter-model screen run before the costly
    searches (0: no screen)"""
    screen_ground_clauses: int = 20000
    """ground clauses per domain size the screen may build"""
    countermodel_domain: int = 4
    """largest domain of the counter-model search on a clause step for
    which no evidence was found (0: none, the step is then unproven)"""

    def scaled(self, factor: float) -> SearchLimits:
        """Every bound multiplied by ``factor`` (at least 1 each)."""
        return SearchLimits(
            **{name: max(1, int(getattr(self, name) * factor)) for name in self.__dataclass_fields__}
        )


    def single(self) -> SearchLimits:
        """Bounds for a first look that tries a single inference only (the
        options computed for an unstated nested conclusion are usually
        exactly the prover's, so one inference then shows the step)."""
        return replace(self.cheap(), rewrite_steps=0, chain_seeds=0, saturation_clauses=0, saturation_given=0)

    def cheap(self) -> SearchLimits:
        """Bounds for a first look at a step that is likely to hold (the
        options tried for an unstated nested conclusion): the single
        inference and a short chain, a small refutation, and no
        counter-model searches, which can only say that a guess was wrong."""
        return replace(
            self,
            rewrite_steps=min(self.rewrite_steps, 60),
            chain_seeds=min(self.chain_seeds, 2),
            saturation_clauses=min(self.saturation_clauses, 60),
            saturation_given=min(self.saturation_given, 8),
            screen_domain=0,
            countermodel_domain=0,
        )


DEFAULT_LIMITS = SearchLimits()


@dataclass(frozen=True, slots=True)
class Candidate:
    """The inference that came nearest to the claim, for the report."""

    description: str
    computed: Clause
    claimed: Clause
    missing: tuple[Literal, ...]
    """literals the inference produces that the claimed clause lacks"""
    extra: tuple[Literal, ...]
    """literals of the claimed clause the inference does not produce"""
    message: str
    """the kernel's failure message for this candidate"""


@dataclass(frozen=True, slots=True)
class Reconstruction:
    """What the search found: kernel-accepted evidence (with the theta of
    the conclusion test), or None and the closest candidate."""

    evidence: Evidence | None
    theta: Substitution = IDENTITY
    closest: Candidate | None = None
    description: str = ""
    wrong_bindings: bool = False
    """the step holds, but not with the bindings the derivation states"""
    tried: tuple[str, ...] = ()
    """what the search tried, in order, and what each stage came to (for
    ``assay explain``)"""


# Stated bindings -----------------------------------------------------------


def _disagreement(stated: Substitution, used: Substitution, premise: Clause) -> str | None:
    """None when ``used`` is an instance of ``stated`` on the premise's
    variables (used = rho after stated, for one rho); otherwise the first
    variable on which they part, in words."""
    variables = premise.variables()
    bound = [var for var in sorted(variables, key=lambda v: v.symbol) if var in stated.mapping]
    introduced: set[Term] = set()
    for var in bound:
        introduced |= variables_of(stated(var))
    # a premise variable the stated terms mention must itself stay consistent
    compared = bound + sorted((introduced & variables) - set(bound), key=lambda v: v.symbol)
    rho: dict[Term, Term] = {}
    for var in compared:
        extended = match_into(stated(var), used(var), rho)
        if extended is None:
            says = ", ".join(f"{v} -> {stated(v)}" for v in bound)
            does = ", ".join(f"{v} -> {used(v)}" for v in compared)
            return f"it states {says}, the inference uses {does}"
        rho = extended
    return None


def stated_disagreement(
    premises: Sequence[Clause], stated: Sequence[Substitution | None], evidence: Evidence
) -> str | None:
    """Why the evidence does not use the premises as the stated bindings
    say, or None if it does.  Every inference that uses a premise with
    stated bindings is checked."""
    if isinstance(evidence, Refutation):
        steps = evidence.chain.steps
    elif isinstance(evidence, Chain):
        steps = evidence.steps
    else:
        steps = (evidence,)
    for step in steps:
        for index, used in premise_substitutions(step):
            if index < len(premises) and stated[index] is not None:
                wrong = _disagreement(stated[index], used, premises[index])
                if wrong is not None:
                    return f"the stated bindings of premise {index} are wrong: {wrong}"
    return None


def from_stated_instances(
    evidence: PrimitiveEvidence | Chain, premises: Sequence[Clause], stated: Sequence[Substitution | None]
) -> PrimitiveEvidence | Chain:
    """Evidence computed on the stated instances of the premises, made to
    use the premises themselves (it honours the stated bindings)."""
    if not any(given is not None for given in stated):
        return evidence
    if isinstance(evidence, Chain):
        return _prefixed(evidence, stated, len(premises), 0)
    return with_premise_substitutions(evidence, _composed(stated, premises))


def _composed(stated: Sequence[Substitution | None], premises: Sequence[Clause]):
    """For evidence found on the stated instances of the premises: each
    premise's substitution s becomes s after the stated one."""

    def change(index: int, found: Substitution) -> Substitution:
        given = stated[index]
        if given is None:
            return found
        mapping = {var: found(given(var)) for var in premises[index].variables()}
        return Substitution(mapping)

    return change


def _prefixed(chain: Chain, stated: Sequence[Substitution | None], premise_count: int, extra: int) -> Chain:
    """A chain found on the stated instances, made to start from the
    premises themselves: it first derives each stated instance, then runs
    with indices moved past those instantiations.  ``extra`` clauses (the
    negated claim of a refutation) sit between the premises and the steps."""
    prefix = [Instantiation(index, given) for index, given in enumerate(stated) if given is not None]
    base = premise_count + extra
    mapping = {index: index for index in range(base)}
    for position, step in enumerate(prefix):
        mapping[step.premise] = base + position
    for number in range(len(chain.steps)):
        mapping[base + number] = base + len(prefix) + number
    return Chain((*prefix, *(reindexed(step, mapping) for step in chain.steps)))


# The search ----------------------------------------------------------------


def _partial_theta(computed: Clause, claimed: Clause) -> Substitution:
    """A greedy theta matching as many computed literals into the claim as it
    happens to find, for showing how near a candidate came."""
    bindings: dict[Term, Term] = {}
    for literal in dict.fromkeys(computed.literals):
        for target in dict.fromkeys(claimed.literals):
            if target.positive != literal.positive:
                continue
            extended = match_atoms_into(literal.atom, target.atom, bindings)
            if extended:
                bindings = extended[0]
                break
    return Substitution(bindings)


def _difference(computed: Clause, claimed: Clause) -> tuple[tuple[Literal, ...], tuple[Literal, ...]]:
    produced = computed.instance(_partial_theta(computed, claimed))
    missing = tuple(dict.fromkeys(lit for lit in produced.literals if lit not in claimed.literal_set))
    extra = tuple(lit for lit in claimed.literals if lit not in produced.literal_set)
    return missing, extra


@dataclass(slots=True)
class _Search:
    """The state of one step's search."""

    premises: Sequence[Clause]
    claimed: Clause
    stated: Sequence[Substitution | None]
    limits: SearchLimits
    searched: Sequence[Clause]  # the premises, or their stated instances
    best: tuple[int, int, Attempt] | None = None
    seeds: list[Seed] = field(default_factory=list)
    tried: list[str] = field(default_factory=list)

    def accept(self, evidence: Evidence, theta: Substitution) -> bool:
        """The last word: stated bindings honoured, and the kernel agrees."""
        return (
            stated_disagreement(self.premises, self.stated, evidence) is None
            and check_clause_step(self.premises, self.claimed, evidence, theta) is None
        )

    def lift(self, evidence: PrimitiveEvidence, theta: Substitution) -> tuple[PrimitiveEvidence, Substitution]:
        """Evidence on the premises themselves.  An instantiation takes theta
        in, unless its premise has stated bindings (theta then stays apart,
        since it instantiates the stated instance further)."""
        if isinstance(evidence, Instantiation) and self.stated[evidence.premise] is None:
            evidence, theta = replace(evidence, substitution=theta), IDENTITY
        if any(given is not None for given in self.stated):
            evidence = with_premise_substitutions(evidence, _composed(self.stated, self.premises))
        return evidence, theta

    def single(self, rule_hint: str) -> Reconstruction | None:
        near: list[tuple[int, int, Attempt]] = []
        examined = 0
        for number, attempt in enumerate(candidates(self.searched, rule_hint)):
            if number >= self.limits.candidates:
                break
            examined += 1
            theta = find_theta(attempt.computed, self.claimed, self.limits.subsumption_nodes)
            if theta is not None:
                evidence, theta = self.lift(attempt.evidence, theta)
                if self.accept(evidence, theta):
                    self.tried.append(f"single inference: candidate {examined} subsumes the claim")
                    return Reconstruction(evidence, theta, None, describe(self.premises, evidence))
                continue
            missing, extra = _difference(attempt.computed, self.claimed)
            near.append((len(missing) + len(extra), number, attempt))
        bound = " (the bound)" if examined >= self.limits.candidates else ""
        self.tried.append(f"single inference: {examined} candidates{bound}, none subsumes the claim")
        near.sort(key=lambda item: item[:2])
        if near:
            self.best = near[0]
        self.seeds = [Seed(a.computed, a.evidence) for _, _, a in near[: self.limits.chain_seeds]]
        return None

    def chain(self) -> Reconstruction | None:
        if self.limits.rewrite_steps == 0:
            return None
        seeds = [Seed(clause, None, index) for index, clause in enumerate(self.searched)] + self.seeds
        found = find_chain(
            self.searched, self.claimed, seeds, self.limits.rewrite_steps, self.limits.subsumption_nodes
        ) or find_normal_form_chain(self.searched, self.claimed, self.limits.rewrite_steps, self.limits.subsumption_nodes)
        if found is None:
            self.tried.append(f"chain of rewrites and deletions: none within {self.limits.rewrite_steps} expansions")
            return None
        chain, theta = found
        if any(given is not None for given in self.stated):
            chain = _prefixed(chain, self.stated, len(self.premises), 0)
        if not self.accept(chain, theta):
            self.tried.append("chain of rewrites and deletions: found one the kernel did not accept")
            return None
        self.tried.append(f"chain of rewrites and deletions: {len(chain.steps)} inferences")
        return Reconstruction(chain, theta, None, f"chain of {len(chain.steps)} inferences")

    def refutation(self) -> Reconstruction | None:
        if self.limits.saturation_given == 0:
            return None
        negation = negated_claim(self.premises, self.claimed)
        chain = refute(
            [*self.searched, *negation],
            self.limits.saturation_clauses,
            self.limits.saturation_given,
            self.limits.subsumption_nodes,
        )
        if chain is None:
            self.tried.append(
                f"refutation of the premises and the negated claim: none within {self.limits.saturation_given} "
                f"given clauses and {self.limits.saturation_clauses} generated"
            )
            return None
        if any(given is not None for given in self.stated):
            chain = _prefixed(chain, self.stated, len(self.premises), len(negation))
        evidence = Refutation(chain)
        if not self.accept(evidence, IDENTITY):
            self.tried.append("refutation of the premises and the negated claim: found one the kernel did not accept")
            return None
        self.tried.append(f"refutation of the premises and the negated claim: {len(chain.steps)} inferences")
        return Reconstruction(
            evidence, IDENTITY, None, f"refutation of the premises and the negated claim in {len(chain.steps)} inferences"
        )

    def closest(self) -> Candidate | None:
        if self.best is None:
            return None
        attempt = self.best[2]
        theta = _partial_theta(attempt.computed, self.claimed)
        missing, extra = _difference(attempt.computed, self.claimed)
        evidence, theta = self.lift(attempt.evidence, theta)
        failure = check_clause_step(self.premises, self.claimed, evidence, theta)
        message = failure.message if failure is not None else "accepted by the kernel"
        return Candidate(describe(self.premises, evidence), attempt.computed, self.claimed, missing, extra, message)


class _Screen:
    """Whether a small counter-model shows the claim does not follow from
    the premises, looked for once per step and only when the cheap stage
    failed.  A kernel-confirmed counter-model means no evidence exists, so
    the costly chain and refutation searches are skipped; the outcome is
    the same, found sooner (wrong candidates are common, e.g. the options
    tried for an unstated nested conclusion)."""

    def __init__(self, premises: Sequence[Clause], claimed: Clause, limits: SearchLimits):
        self.premises, self.claimed, self.limits = premises, claimed, limits
        self.verdict: bool | None = None

    def hopeless(self) -> bool:
        if self.verdict is None:
            limits = self.limits
            self.verdict = limits.screen_domain > 0 and find_countermodel(
                self.premises, self.claimed, limits.screen_domain, limits.screen_ground_clauses, limits.screen_ground_clauses
            ) is not None
        return self.verdict


def _run(search: _Search, rule_hint: str, screen: _Screen) -> Reconstruction:
    found = search.single(rule_hint)
    if found is not None:
        return replace(found, tried=tuple(search.tried))
    if screen.hopeless():
        search.tried.append(f"counter-model screen (domain up to {search.limits.screen_domain}): a counter-model "
                            "exists, so no evidence can; the chain and refutation searches were skipped")
    else:
        if search.limits.screen_domain > 0:
            search.tried.append(f"counter-model screen (domain up to {search.limits.screen_domain}): none found")
        for stage in (search.chain, search.refutation):
            found = stage()
            if found is not None:
                return replace(found, tried=tuple(search.tried))
    return Reconstruction(None, IDENTITY, search.closest(), tried=tuple(search.tried))


def _given_reconstruction(args: tuple, kwargs: dict, answer: tuple) -> Reconstruction:
    evidence, theta = checked_clause_evidence(args[0], argument_of(args, kwargs, 1, "claimed"), answer)
    return Reconstruction(evidence, theta, description="the certificate's evidence")


@hook(
    CLAUSE_EVIDENCE,
    # Stated bindings only steer the search; the evidence is checked against the premises.
    question=lambda premises, claimed, *rest, **options: (list(premises), claimed),
    keep=lambda found: (found.evidence, found.theta) if found.evidence is not None else None,
    give=_given_reconstruction,
    nothing=lambda: Reconstruction(None),
)
def reconstruct(
    premises: Sequence[Clause],
    claimed: Clause,
    rule_hint: str = "",
    limits: SearchLimits = DEFAULT_LIMITS,
    stated: Sequence[Substitution | None] | None = None,
) -> Reconstruction:
    """Kernel-accepted evidence that ``claimed`` follows from ``premises``,
    or the closest candidate.  ``rule_hint`` is the prover's rule name (it
    only reorders the tries); ``stated`` holds, per premise, the bindings the
    derivation states for it, or None."""
    premises = list(premises)
    given = list(stated) if stated is not None else []
    given = (given + [None] * len(premises))[: len(premises)]
    screen = _Screen(premises, claimed, limits)
    if not any(bindings is not None for bindings in given):
        none = [None] * len(premises)
        return _run(_Search(premises, claimed, none, limits, premises), rule_hint, screen)
    # The stated instances are weaker than the premises: a counter-model of
    # the premises is one of the instances too, and the screen is shared.
    instances = [p if b is None else p.instance(b) for p, b in zip(premises, given)]
    found = _run(_Search(premises, claimed, given, limits, instances), rule_hint, screen)
    found = replace(found, tried=tuple(f"on the stated instances: {line}" for line in found.tried))
    if found.evidence is not None:
        return found
    # Nothing fits the stated bindings: if the step holds without them, say
    # that the bindings are what is wrong.
    free = _run(_Search(premises, claimed, [None] * len(premises), limits, premises), rule_hint, screen)
    tried = (*found.tried, *(f"without the stated bindings: {line}" for line in free.tried))
    if free.evidence is None:
        return replace(found, tried=tried)
    wrong = stated_disagreement(premises, given, free.evidence) or "the stated bindings do not fit the inference"
    computed = _computed(premises, claimed, free.evidence, free.theta)
    candidate = Candidate(free.description, computed, claimed, (), (), wrong)
    return Reconstruction(None, IDENTITY, candidate, wrong_bindings=True, tried=tried)


def _computed(premises: Sequence[Clause], claimed: Clause, evidence: Evidence, theta: Substitution) -> Clause:
    """The clause accepted evidence computes, as the claim sees it (for a
    refutation, the claim itself: that is what it shows to follow)."""
    if isinstance(evidence, Refutation):
        return claimed
    return replay(premises, evidence).instance(theta)
