"""Checking formula-level steps: consequences, Skolemization, definitions,
and the negated conjecture.

A derivation starts from formulas; a wrong step here (a Skolem function
that forgot a variable, a reused constant, a dropped negation) silently
proves anything.  Consequence steps are checked as kernel-replayed
refutations of clausify(premises ∧ ¬conclusion); steps that introduce new
symbols must introduce them fresh, as witnesses of quantifiers that
Skolemization may replace, and are then checked as consequences of the
premises plus the kernel-built Skolem axioms.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import replace

from checker.definition_readings import confirmed_reading, negated_side_reading
from checker.freshness import SymbolTable, describe_symbol, new_symbols
from checker.kernel.clauses import Clause
from checker.kernel.entailment import Cover, check_entailment
from checker.kernel.failure import Failure
from checker.kernel.formulas import (
    AND,
    ATOM,
    EXISTS,
    FORALL,
    IMPLIES,
    Formula,
    alpha_equivalent,
    binary,
    formula_of_clause,
    negation,
    subformulas_with_polarity,
    universal_closure,
)
from checker.kernel.introductions import check_choice_axiom, check_definition, skolemize
from checker.kernel.models import confirm_countermodel, render_countermodel
from checker.kernel.propositional import check_unit_entailment
from checker.outcomes import FAILED, RECONSTRUCTED, REFUTED, UNPROVEN, StepResult
from checker.plan import Step
from checker.search.entailment import find_consequence, find_entailment
from checker.search.equivalences import has_equivalence, without_equivalences
from checker.search.miniscoping import miniscoped
from checker.search.models import find_countermodel
from checker.search.propositional import find_unit_entailment
from checker.search.reconstruct import SearchLimits, reconstruct
from checker.search.unfolding import find_unfolding
from checker.search.witnesses import (
    Witnessing,
    matching_witnesses,
    readings_with_anonymous_outer,
    witness_readings,
)
from formats.derivation import Origin


def as_formula(content: Clause | Formula) -> Formula:
    """A clause as the universal closure of its disjunction; a formula as
    its universal closure (TPTP leaves free variables universal)."""
    if isinstance(content, Clause):
        return formula_of_clause(content)
    return universal_closure(content)


def step_result(step: Step, outcome: str, message: str, details: Sequence[str] = ()) -> StepResult:
    """A result for ``step`` under its rule name (a leaf's kind of origin)."""
    rule = step.inference.rule if step.inference is not None else _leaf_kind(step)
    return StepResult(step.name, outcome, rule, message, step.location, tuple(details))


def _leaf_kind(step: Step) -> str:
    origin = step.statement.source if step.statement is not None else None
    return " ".join((origin.kind, *origin.detail[:1])) if isinstance(origin, Origin) else "leaf"


def check_consequence(
    step: Step,
    premises: Sequence[Formula],
    conclusion: Formula,
    limits: SearchLimits,
    what: str = "follows from its premises",
) -> StepResult:
    """premises ⊨ conclusion, by alpha-equivalence or a kernel-replayed
    refutation; if neither is found, a kernel-confirmed counter-model."""
    if any(alpha_equivalent(premise, conclusion) for premise in premises):
        return step_result(step, RECONSTRUCTED, f"{what}: alpha-equivalent to a premise")
    unfolding = find_unfolding(premises, conclusion)  # definitions applied: cheap, so first
    if unfolding is not None and check_entailment(premises, conclusion, unfolding) is None:
        return step_result(
            step, RECONSTRUCTED,
            f"{what}: kernel unfolded the {len(unfolding.definitions)} definition(s) among the premises in a premise "
            "and in the conclusion, and found them alpha-equivalent",
        )
    length = _refutation_length(premises, conclusion, limits)
    if length == COVERED:
        return step_result(step, RECONSTRUCTED, f"{what}: {COVERED_MESSAGE}")
    if length is not None:
        return step_result(
            step, RECONSTRUCTED,
            f"{what}: kernel replayed a refutation of premises and negated conclusion in "
            f"{length} inference{'s' if length != 1 else ''}",
        )
    model = _countermodel(premises, conclusion)
    if model is not None:
        return step_result(
            step,
            REFUTED,
            f"counter-model: the premises are true and the conclusion false (claimed: {what})",
            ("reason: countermodel", *model),
        )
    if limits.countermodel_domain:  # not a cheap first look at a guess
        wider = replace(
            limits,
            saturation_clauses=limits.saturation_clauses * WIDER_SATURATION,
            saturation_given=limits.saturation_given * WIDER_SATURATION,
        )
        length = _refutation_length(premises, conclusion, wider)
        if length is not None and length != COVERED:
            return step_result(
                step, RECONSTRUCTED,
                f"{what}: kernel replayed a refutation of premises and negated conclusion in "
                f"{length} inference{'s' if length != 1 else ''} (found with {WIDER_SATURATION}x the saturation bounds)",
            )
    return step_result(step, UNPROVEN, f"not shown within the search bounds (claimed: {what})")


WIDER_SATURATION = 5
"""A formula step that neither the refutation search nor the counter-model
search settles gets one more refutation search with this many times the
saturation bounds (definitions applied inside equivalences, distributions
folded by names): counts, so the result is the same on every machine."""


COVERED = 0
"""The length given for an entailment shown by a cover, which has no inferences."""

COVERED_MESSAGE = "kernel matched each clause of the conclusion to a premise clause that subsumes it"


def _refutation_length(premises: Sequence[Formula], conclusion: Formula, limits: SearchLimits) -> int | None:
    """The length of a kernel-replayed refutation of premises and negated
    conclusion (cited axioms of choice applied first), ``COVERED`` for a
    kernel-checked cover of the conclusion's clauses, or None."""
    premises = _with_choice_instances(premises)
    if all(map(_is_ground, (*premises, conclusion))):
        # Ground atoms are propositions: a SAT solver settles the step.
        lemmas = find_unit_entailment(premises, conclusion, limits.sat_conflicts)
        if lemmas is not None and check_unit_entailment(premises, conclusion, lemmas) is None:
            return len(lemmas)
    evidence = find_consequence(premises, conclusion, limits)
    if evidence is not None and check_entailment(premises, conclusion, evidence) is None:
        return COVERED if isinstance(evidence, Cover) else len(evidence.steps)
    return None


def _is_ground(formula: Formula) -> bool:
    """No quantifier and no variable."""
    return all(
        part.connective not in (FORALL, EXISTS) and (part.connective != ATOM or part.atom.ground)
        for part, _ in subformulas_with_polarity(formula)
    )


def _countermodel(premises: Sequence[Formula], conclusion: Formula) -> list[str] | None:
    """A kernel-confirmed counter-model, rendered, or None."""
    model = find_countermodel(list(premises), conclusion)
    if model is not None and confirm_countermodel(model, list(premises), conclusion) is None:
        return render_countermodel(model, list(premises), conclusion).splitlines()
    return None


def _with_choice_instances(premises: Sequence[Formula]) -> list[Formula]:
    """The premises and, for each axiom of choice among them (confirmed by
    the kernel), the other premises with its quantifier replaced by its
    witnesses.  Under the axiom the quantified formula and its instance are
    equivalent, so these follow from the premises; they spare the search a
    long detour through the axiom's clauses.  An axiom whose quantifier
    mentions another's witness (a nested existential, ``sub(X3,sK0(X0))``)
    applies to what the other's replacement made, so the replacements are
    repeated on their own results, once per axiom at most."""
    axioms: list[tuple[Formula, Formula, dict]] = []
    for axiom in premises:
        parts = _choice_parts(axiom)
        if parts is not None and check_choice_axiom(axiom, parts[1]) is None:
            axioms.append((axiom, *parts))
    known = list(premises)
    frontier = list(premises)
    for _ in axioms:
        made: list[Formula] = []
        for axiom, quantifier, witnesses in axioms:
            for premise in frontier:
                replaced = skolemize(premise, quantifier, witnesses) if premise is not axiom else None
                if isinstance(replaced, Formula) and replaced not in known and replaced not in made:
                    made.append(replaced)
        if not made:
            break
        known += made
        frontier = made
    return known


def check_introduction(
    step: Step,
    premises: Sequence[Formula],
    claimed: Clause | Formula,
    raw_premises: Sequence[Clause | Formula],
    table: SymbolTable,
    limits: SearchLimits,
) -> StepResult:
    """A step with new symbols: fresh, each the witness of a quantifier that
    Skolemization may replace, and the step follows from the premises so
    Skolemized (built by the kernel, outermost quantifier first).

    Steps with the same parents that introduce a symbol together (the
    clauses of one Skolemized formula) must hold together: each is checked
    with the claims of the earlier ones, so the last checks them all.  A
    symbol an introduced leaf (an axiom of choice) defines is that leaf's,
    and the leaf joins the premises."""
    peers = table.co_introducers(step.name, new_symbols(claimed, raw_premises))
    earlier = [peer for peer in peers if table.order[peer] < table.order[step.name]]
    together = _introduction(step, premises, [claimed, *(table.contents[p] for p in earlier)], raw_premises, peers, table, limits)
    if together.outcome == RECONSTRUCTED or not earlier:
        return together
    alone = _introduction(step, premises, [claimed], raw_premises, peers, table, limits)
    if alone.outcome != RECONSTRUCTED:
        return alone
    before = _introduction(step, premises, [table.contents[p] for p in earlier], raw_premises, peers, table, limits)
    if before.outcome != RECONSTRUCTED:
        # The earlier steps do not hold together by themselves: the fault
        # is theirs, reported there.
        return alone
    others = ", ".join(f"`{p}`" for p in earlier)
    details = tuple(line for line in together.details if not line.startswith("reason: "))
    if together.outcome != REFUTED:
        return step_result(
            step, UNPROVEN,
            f"holds by itself, but was not shown to hold together with {others}, which introduce the same symbols "
            "from the same premises, within the search bounds",
            details,
        )
    return step_result(
        step, FAILED,
        f"holds by itself, but not together with {others}, which introduce the same symbols from the same "
        "premises: under every pairing, a symbol would witness two quantifiers",
        ("reason: witness_reused", *details),
    )


def _introduction(
    step: Step,
    premises: Sequence[Formula],
    claims: Sequence[Clause | Formula],
    raw_premises: Sequence[Clause | Formula],
    peers: Sequence[str],
    table: SymbolTable,
    limits: SearchLimits,
    used: frozenset = frozenset(),
) -> StepResult:
    """The conjunction of ``claims`` as an introduction.  Which quantifier
    each symbol witnesses is searched for; a counter-model refutes the step
    only if it refutes every pairing there is.

    Symbols ``used`` are new to the premises but taken as ordinary symbols
    of the claim, witnessing nothing.  When some or all new symbols are not
    fresh (a clause weakened by a literal over a problem symbol), the step
    holds if it follows with the fresh ones, if any, as witnesses and the
    rest as they are: that entailment is over every meaning of the
    stale symbols, so nothing about them is assumed.  Otherwise the symbol
    that is not fresh is the fault reported."""
    conclusion = as_formula(claims[0])
    for other in claims[1:]:
        conclusion = binary(AND, conclusion, as_formula(other))
    new = set().union(*(new_symbols(claim, raw_premises) for claim in claims))
    # A leaf never vouches for itself nor leans on another leaf.
    leaves = sorted(
        {table.leaf_introducers[s] for s in new if table.leaf_introducers.get(s, step.name) != step.name},
        key=table.order.__getitem__,
    ) if not step.is_leaf else []
    premises = [*premises, *(as_formula(table.contents[leaf]) for leaf in leaves)]
    raw_premises = [*raw_premises, *(table.contents[leaf] for leaf in leaves)]
    new = set().union(*(new_symbols(claim, raw_premises) for claim in claims))
    if step.is_leaf:
        # An introduced leaf introduces only what the problem does not have.
        new = {s for s in new if s in table.leaf_introducers}
    new -= used
    cited = f" and `{'`, `'.join(leaves)}`, which define{'s' if len(leaves) == 1 else ''} some of its symbols" if leaves else ""
    together = ""
    if len(claims) > 1:
        together = f" (with the {len(claims) - 1} earlier step{'s' if len(claims) > 2 else ''} introducing them)"
    not_fresh = table.freshness_failure(step.name, new, peers)
    if not_fresh:
        stale = frozenset(s for s in new if table.freshness_failure(step.name, [s], peers))
        if not used and not step.is_leaf:
            found = _introduction(step, premises, claims, raw_premises, peers, table, limits, stale)
            if found.outcome == RECONSTRUCTED:
                named = ", ".join(describe_symbol(s) for s in sorted(stale))
                return replace(found, message=f"{found.message} ({named} used as in the problem or earlier steps, "
                                              "witnessing nothing)")
        return step_result(step, FAILED, not_fresh, ("reason: not_fresh",))
    if not new:
        result = check_consequence(step, premises, conclusion, limits, what=f"follows from its premises{cited}{together}")
        return _not_refuted_by_uncited(result, leaves)
    introduced = ", ".join(describe_symbol(s) for s in sorted(new))
    what = f"Skolemization introducing {introduced}{together}: follows from its Skolemized premises{cited}"
    premises = [_equivalences_written_out(premise, limits) for premise in premises]
    readings = witness_readings(premises, conclusion, new, limits.witness_readings, _kernel_skolemize)
    if not readings.found:
        # A prover may push quantifiers inward before Skolemizing, so that
        # a witness rightly takes fewer arguments.
        scoped = _miniscoped_premises(premises, limits)
        retry = witness_readings(scoped, conclusion, new, limits.witness_readings, _kernel_skolemize) if scoped else None
        if retry is not None and retry.found:
            premises, readings = scoped, retry
            what = f"{what} (miniscoped first)"
    if not readings.found:
        outer = _with_anonymous_outer(premises, conclusion, claims, new, limits, what)
        if isinstance(outer, str):
            return step_result(step, RECONSTRUCTED, outer)
        if readings.misfit is not None and outer:
            return step_result(step, FAILED, readings.misfit.message, (f"reason: {readings.misfit.reason}",))
        return step_result(step, UNPROVEN, f"no pairing of new symbols with quantifiers found within the search bounds (claimed: {what})")
    replayed = [_replay(premises, reading) for reading in readings.found]
    models: list[list[str] | None] = []
    for number, skolemized in enumerate(replayed):
        # The likeliest pairing is searched for a refutation first; for the
        # others a counter-model (cheap to look for) first spares the search.
        if number > 0:
            models.append(_countermodel(skolemized, conclusion))
            if models[-1] is not None:
                continue
        how = _follows(skolemized, claims, limits)
        if how is not None:
            return step_result(step, RECONSTRUCTED, f"{what}: {how}")
    outer = _with_anonymous_outer(premises, conclusion, claims, new, limits, what)
    if isinstance(outer, str):
        return step_result(step, RECONSTRUCTED, outer)
    # Say which quantifier each symbol was taken to witness: that pairing is
    # part of what did not hold.
    pairing = [f"Skolem term `{w.witness}` for `{w.bound}` of `{w.quantifier}`" for w in readings.found[0]]
    if readings.exhaustive and outer:
        models.insert(0, _countermodel(replayed[0], conclusion))
    else:
        models = [None]
    if all(model is not None for model in models):
        count = len(models)
        result = step_result(
            step, REFUTED,
            f"counter-model: under {f'each of the {count} pairings' if count > 1 else 'the only pairing'} of "
            f"new symbols with quantifiers, the Skolemized premises are true and the conclusion false (claimed: {what})",
            ("reason: countermodel", *models[0], *pairing),
        )
        return _not_refuted_by_uncited(result, leaves)
    tried = f"{len(readings.found)} pairing{'s' if len(readings.found) != 1 else ''} of new symbols with quantifiers"
    return step_result(
        step, UNPROVEN,
        f"not shown within the search bounds under {tried}"
        f"{'' if readings.exhaustive else ' (not every pairing was tried)'} (claimed: {what})",
        tuple(pairing),
    )


def _follows(skolemized: Sequence[Formula], claims: Sequence[Clause | Formula], limits: SearchLimits) -> str | None:
    """How each claim follows from the same Skolemized premises (then so
    does their conjunction, at the cost of several small searches, not one
    large), or None."""
    lengths = []
    for claim in claims:
        wanted = as_formula(claim)
        if any(alpha_equivalent(p, wanted) for p in skolemized):
            lengths.append(0)
            continue
        lengths.append(_refutation_length(skolemized, wanted, limits))
        if lengths[-1] is None:
            return None
    if not any(lengths):
        return "alpha-equivalent to a Skolemized premise, or its clauses subsumed by theirs"
    return f"kernel replayed {'refutations' if len(claims) > 1 else 'a refutation'} in {sum(lengths)} inferences"


def _with_anonymous_outer(
    premises: Sequence[Formula],
    conclusion: Formula,
    claims: Sequence[Clause | Formula],
    new: set,
    limits: SearchLimits,
    what: str,
) -> str | bool:
    """The pairings that witness an outer existential by a symbol of nothing
    else (checker/search/witnesses.py: readings_with_anonymous_outer): the
    message when one shows the claims, else whether every such pairing was
    tried and has a kernel-confirmed counter-model (only then may the step
    be refuted or a missing dependency be final)."""
    readings = readings_with_anonymous_outer(premises, conclusion, new, limits.witness_readings, _kernel_skolemize)
    for reading in readings.found:
        skolemized = _replay(premises, reading)
        if _countermodel(skolemized, conclusion) is not None:
            continue
        how = _follows(skolemized, claims, limits)
        if how is not None:
            anonymous = ", ".join(f"`{w.bound}` of `{w.quantifier}`" for w in reading if w.witness.symbol in readings.anonymous)
            return f"{what}: {how}, with {anonymous} witnessed by a symbol of nothing else (the claim needs no name for it)"
        return False
    return readings.exhaustive


def _not_refuted_by_uncited(result: StepResult, leaves: Sequence[str]) -> StepResult:
    """A counter-model found with introduced leaves the step does not cite
    refutes a reading of the step, not the step: it might introduce the
    symbols jointly with the leaf in a way the leaf allows."""
    if result.outcome != REFUTED or not leaves:
        return result
    return StepResult(
        result.name, UNPROVEN, result.rule,
        f"does not follow from its premises with `{'`, `'.join(leaves)}`, which it does not cite; "
        f"not refuted, since it might introduce their symbols itself ({result.message})",
        result.location, tuple(line for line in result.details if not line.startswith("reason: ")),
    )


def _kernel_skolemize(premise: Formula, witnessing: Witnessing) -> Formula | None:
    replaced = skolemize(premise, witnessing.quantifier, {witnessing.bound: witnessing.witness})
    return None if isinstance(replaced, Failure) else replaced


def _replay(premises: Sequence[Formula], reading: Sequence[Witnessing]) -> list[Formula]:
    """The premises Skolemized by the kernel along a proposed pairing."""
    skolemized = list(premises)
    for witnessing in reading:
        replaced = skolemize(skolemized[witnessing.premise], witnessing.quantifier, {witnessing.bound: witnessing.witness})
        assert not isinstance(replaced, Failure), "the search proposes only what the kernel Skolemized"
        skolemized[witnessing.premise] = replaced
    return skolemized


def _miniscoped_premises(premises: Sequence[Formula], limits: SearchLimits) -> list[Formula] | None:
    """The premises with quantifiers pushed inward, each where the kernel
    confirms the premise entails that form; None when none changes."""
    scoped = []
    for premise in premises:
        candidate = miniscoped(premise)
        evidence = None if alpha_equivalent(candidate, premise) else find_consequence([premise], candidate, limits)
        confirmed = evidence is not None and check_entailment([premise], candidate, evidence) is None
        scoped.append(candidate if confirmed else premise)
    return scoped if any(new is not old for new, old in zip(scoped, premises)) else None


def _equivalences_written_out(premise: Formula, limits: SearchLimits) -> Formula:
    """The premise with its equivalences written as implications, when the
    kernel replays that the premise entails that form (so a quantifier
    under an equivalence can be Skolemized where it occurs positively);
    else the premise as it is."""
    if not has_equivalence(premise):
        return premise
    written = without_equivalences(premise)
    evidence = find_consequence([premise], written, limits)  # a cover first: the clauses are the premise's
    if evidence is not None and check_entailment([premise], written, evidence) is None:
        return written
    return premise


def check_introduced_leaf(step: Step, origin: Origin, table: SymbolTable, limits: SearchLimits) -> StepResult:
    """A leaf the prover introduced rather than took from the problem: a
    definition, an axiom of choice (a Skolem axiom), or a statement valid in
    itself (a tautology, an equality axiom)."""
    content = step.statement.content
    kind = origin.detail[0] if origin.detail else ""
    if "definition" in kind:
        return check_definition_leaf(step, table)
    if isinstance(content, Formula):
        choice = _choice_parts(universal_closure(content))
        if choice is not None:
            return check_choice_leaf(step, universal_closure(content), *choice, table)
        quantifier = _choice_quantifier(universal_closure(content))
        if quantifier is not None and new_symbols(content, [quantifier]):
            # Shaped like an axiom of choice but not read as one: it is the
            # Skolemization of `Q => Q` or it is not sound.
            tautology = universal_closure(binary(IMPLIES, quantifier, quantifier))
            return check_introduction(step, [tautology], content, [tautology], table, limits)
    from checker.namings import check_defined_leaf  # it builds on this module

    return check_defined_leaf(step, table, limits) or check_valid_leaf(step, limits)


def _choice_quantifier(axiom: Formula) -> Formula | None:
    """The quantified formula a Skolem axiom is about: the existential
    antecedent or the universal consequent of its implication."""
    body = axiom
    while body.connective == FORALL:
        body = body.arguments[0]
    if body.connective != IMPLIES:
        return None
    antecedent, consequent = body.arguments
    if antecedent.connective == EXISTS:
        return antecedent
    return consequent if consequent.connective == FORALL else None


def _choice_parts(axiom: Formula) -> tuple[Formula, dict] | None:
    """The quantifier of what looks like a Skolem axiom, and the witnesses
    found where its bound variables stand in the instance (untrusted)."""
    quantifier = _choice_quantifier(axiom)
    if quantifier is None:
        return None
    body = axiom
    while body.connective == FORALL:
        body = body.arguments[0]
    instance = body.arguments[1] if quantifier is body.arguments[0] else body.arguments[0]
    witnesses = matching_witnesses(quantifier, instance)
    return (quantifier, witnesses) if witnesses else None


def check_choice_leaf(step: Step, axiom: Formula, quantifier: Formula, witnesses: dict, table: SymbolTable) -> StepResult:
    """An axiom of choice: the kernel confirms it is the Skolem axiom of its
    witnesses, and their symbols must be fresh."""
    failure = check_choice_axiom(axiom, witnesses)
    if failure is not None:
        return step_result(step, FAILED, failure.message, (f"reason: {failure.reason}",))
    symbols = {(w.symbol, w.arity) for w in witnesses.values()}
    not_fresh = table.freshness_failure(step.name, symbols)
    if not_fresh:
        return step_result(step, FAILED, not_fresh, ("reason: not_fresh",))
    named = ", ".join(describe_symbol(s) for s in sorted(symbols))
    return step_result(step, RECONSTRUCTED, f"Skolem axiom (axiom of choice) for fresh {named}")


def check_valid_leaf(step: Step, limits: SearchLimits) -> StepResult:
    """A statement that needs no premises: the kernel replays a refutation of
    its negation from nothing (equality reasoning included); if that is not
    found, a counter-model shows it is not valid."""
    claimed = step.statement.content
    if isinstance(claimed, Clause):
        found = reconstruct([], claimed, rule_hint=_leaf_kind(step), limits=limits)
        if found.evidence is not None:
            return step_result(step, RECONSTRUCTED, "valid clause: its negation is refuted from no premises")
    else:
        chain = find_entailment([], universal_closure(claimed), limits)
        if chain is not None and check_entailment([], universal_closure(claimed), chain) is None:
            return step_result(step, RECONSTRUCTED, "valid formula: its negation is refuted from no premises")
    model = find_countermodel([], claimed)
    if model is not None and confirm_countermodel(model, [], claimed) is None:
        return step_result(
            step, REFUTED, "not valid: counter-model in which it is false",
            ("reason: countermodel", *render_countermodel(model, [], claimed).splitlines()),
        )
    return step_result(step, UNPROVEN, "not shown valid within the search bounds")


def check_definition_leaf(step: Step, table: SymbolTable) -> StepResult:
    """An introduced definition: the defined symbol is a predicate of one
    of its sides that is fresh, and the formula has a definition's shape.
    Sides whose predicate is not in the problem are tried first, so that a
    failure names the symbol the definition most likely introduces."""
    statement = step.statement
    assert statement is not None
    formula = as_formula(statement.content)
    failure = Failure("not_a_definition", f"`{formula}` has no side that is a predicate applied to variables")
    readings = [(formula, "")]
    if negated_side_reading(formula) is not None:  # `~ e <=> F` is `e <=> ~ F`
        readings.append((None, ""))
    first = True
    for reading, read in readings:
        if reading is None:
            reading = confirmed_reading(formula)
            if reading is None:
                break
            read = f" (read as `{reading}`)"
        body = reading
        while body.connective == FORALL:
            body = body.arguments[0]
        sides = [(a.atom.symbol, a.atom.arity) for a in body.arguments if a.atom is not None and a.atom.symbol != "="]
        candidates = sorted(dict.fromkeys(sides), key=lambda symbol: symbol in table.problem)
        for symbol in candidates:
            shape = check_definition(reading, symbol)
            if shape is None:
                not_fresh = table.freshness_failure(step.name, {symbol})
                if not_fresh is None:
                    return step_result(step, RECONSTRUCTED, f"defines fresh symbol `{describe_symbol(symbol)}`{read}")
                shape = Failure("not_fresh", not_fresh)
            if first:
                failure, first = shape, False
    return step_result(step, FAILED, failure.message, (f"reason: {failure.reason}",))


def _predicates(content: Clause | Formula) -> set[tuple[str, int]]:
    formula = as_formula(content)
    atoms = (f.atom for f, _ in subformulas_with_polarity(formula) if f.atom is not None)
    return {(atom.symbol, atom.arity) for atom in atoms}


def check_negated_conjecture(
    step: Step,
    conjecture: Formula,
    claimed: Clause | Formula,
    table: SymbolTable,
    limits: SearchLimits,
) -> StepResult:
    """The step states the negation of the conjecture: alpha-equivalent to
    it, or equivalent to it (both directions kernel-replayed), or, when it
    introduces symbols, the negation Skolemized.  Mere consequence is not
    enough: when the conjecture is valid its negation entails anything, and
    a dropped negation would pass unnoticed."""
    negated = negation(universal_closure(conjecture))
    conclusion = as_formula(claimed)
    if alpha_equivalent(negated, conclusion) or (
        isinstance(claimed, Formula) and alpha_equivalent(negation(conjecture), claimed)
    ):
        return step_result(step, RECONSTRUCTED, "the negation of the conjecture")
    new = new_symbols(claimed, [conjecture])
    # The clauses of one Skolemized negation, each a step citing the
    # conjecture, introduce their symbols together.
    peers = table.co_introducers(step.name, new) if new else []
    if new and not new & _predicates(claimed) and table.freshness_failure(step.name, new, peers) is None:
        # Negated and Skolemized in one step.
        return check_introduction(step, [negated], claimed, [conjecture], table, limits)
    forward = check_consequence(step, [negated], conclusion, limits, what="follows from the negation of the conjecture")
    if forward.outcome != RECONSTRUCTED:
        return forward
    backward = check_consequence(step, [conclusion], negated, limits, what="implies the negation of the conjecture")
    if backward.outcome == RECONSTRUCTED:
        return step_result(step, RECONSTRUCTED, "equivalent to the negation of the conjecture (both directions replayed)")
    if backward.outcome == REFUTED:
        return step_result(
            step, FAILED,
            "not the negation of the conjecture: it follows from the negation but is weaker; "
            "counter-model in which the step holds and the negated conjecture does not",
            ("reason: not_the_negation", *backward.details),
        )
    return step_result(step, UNPROVEN, "not shown equivalent to the negation of the conjecture within the search bounds")
