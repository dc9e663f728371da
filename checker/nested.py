"""Steps whose parents include unnamed intermediate steps (nested records).

A prover may write ``inference(r, [...], [inference(s, [...], [a, b]), c])``:
the inner step's conclusion is never stated.  For clause steps assay
computes it: each nested step gets the candidate conclusions of single
kernel-replayed inferences from its parents (for a rewriting record, the
rewrites of its first parent computed directly, likely ones first), and
the first combination with which the outer step checks settles them, each
nested step then reported as a step of its own.  The combinations are
first tried with cheap bounds and no counter-model searches (a guess that
does not fit can only be wrong, and that says nothing about the outer
step), then a few with the full bounds.  When no combination works (or
formulas are involved), the outer step is checked directly from the named
statements its nested records rest on, which shows the same claim as a
coarser step; only that check may refute it.

Bindings a nested record states for a parent (``a:[bind(X, c)]``) are
held as on a single inference: the record's candidate conclusions are
computed from the stated instances, and the coarser checks (through
rewriting records, from the named statements) take each cited statement
as the instance its record states.  When the claim follows only without
them, the record that states the bindings fails (``wrong_bindings``).
"""

from __future__ import annotations

import itertools
from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass, replace

from checker.formula_steps import as_formula
from checker.kernel.clauses import Clause
from checker.kernel.formulas import negation
from checker.kernel.rules import Paramodulation, replay
from checker.kernel.substitution import Substitution
from checker.outcomes import CHECKED, FAILED, RECONSTRUCTED, StepResult
from checker.plan import Step
from checker.search.demodulation import describe_rewriting, each_demodulant, is_rewriting
from checker.search.evidence import candidates, describe
from checker.search.findings import note_nested
from checker.search.ordered_rewriting import everywhere, superposes, too_large
from checker.search.reconstruct import from_stated_instances
from checker.search.saturation import premise_references
from checker.search.term_order import TermOrder
from checker.statuses import weakest_status
from formats.derivation import Parent, Statement

CANDIDATES_PER_STEP = 12
COMBINATIONS = 64
FULL_COMBINATIONS = 4
"""combinations tried with the full bounds after the cheap pass"""

CheckStep = Callable[[Step, Sequence[Statement | None]], StepResult]


@dataclass(frozen=True, slots=True)
class Option:
    """A candidate conclusion of a nested step: the clause, the inference
    that computed it, and the options of nested parents it was computed from."""

    content: Clause
    how: str
    from_nested: tuple[tuple[str, Option], ...] = ()
    evidence: object = None
    """the kernel-replayed inference that computed it"""


def _conclusions(
    premises: list[Clause], rule: str, order: TermOrder | None, stated: Sequence[Substitution | None] = ()
) -> Iterator[tuple[Clause, str, object]]:
    """Distinct conclusions of kernel-replayed inferences from ``premises``
    (with their evidence), computed as they are asked for: for a rewriting
    record its computed rewrites first (the prover's by ``order`` first),
    then single inferences, those that use every premise first, a
    paramodulation replacing every occurrence of its term before the one
    replacing a single occurrence.  A premise with ``stated`` bindings is
    used only as its stated instance (the evidence still names the premise
    itself)."""
    if any(too_large(premise) for premise in premises):
        return  # a wrong guess grown past any clause of the prover's
    others: list[tuple[Clause, str, object]] = []
    seen: set[frozenset] = set()
    given = 0
    stated = (list(stated) + [None] * len(premises))[: len(premises)]
    searched = [p if bound is None else p.instance(bound) for p, bound in zip(premises, stated)]
    if is_rewriting(rule):
        for computed, evidence in each_demodulant(searched, order=order):
            seen.add(computed.literal_set)
            given += 1
            evidence = from_stated_instances(evidence, premises, stated)
            yield computed, describe_rewriting(evidence), evidence
    attempts = itertools.islice(candidates(searched, rule), 20 * CANDIDATES_PER_STEP)
    if order is not None and not is_rewriting(rule):
        attempts = sorted(attempts, key=lambda attempt: not (
            isinstance(attempt.evidence, Paramodulation) and superposes(searched, attempt.evidence, order)))
    for attempt in attempts:
        if given >= CANDIDATES_PER_STEP:
            return
        uses_all = set(premise_references(attempt.evidence)) == set(range(len(premises)))
        how = describe(premises, from_stated_instances(attempt.evidence, premises, stated))
        shared = everywhere(searched, attempt.evidence, attempt.computed) if (
            isinstance(attempt.evidence, Paramodulation) and not is_rewriting(rule)) else None
        computed = replay(searched, shared) if shared is not None else None
        found = [(computed, shared, ", at every occurrence"), (attempt.computed, attempt.evidence, "")]
        for content, evidence, suffix in found:
            if isinstance(content, Clause) and content.literal_set not in seen:
                seen.add(content.literal_set)
                conclusion = (content, how + suffix, from_stated_instances(evidence, premises, stated))
                if uses_all:
                    given += 1
                    yield conclusion
                else:
                    others.append(conclusion)
    yield from others[:CANDIDATES_PER_STEP - given]


def _options(conclusions: Iterator[tuple[Clause, str, object]], picked: tuple) -> Iterator[Option]:
    for content, how, evidence in conclusions:
        yield Option(content, how, picked, evidence)


def _round_robin(per_choice: list[Iterator[Option]]) -> list[Option]:
    """Distinct options, the likeliest of each choice of premises before
    the second likeliest of any, up to the bound per step (each choice's
    options computed only as far as they are taken)."""
    gathered: dict[Clause, Option] = {}
    remaining = list(per_choice)
    while remaining and len(gathered) < CANDIDATES_PER_STEP:
        still = []
        for found in remaining:
            option = next(found, None)
            if option is None:
                continue
            still.append(found)
            gathered.setdefault(option.content, option)
            if len(gathered) >= CANDIDATES_PER_STEP:
                break
        remaining = still
    return list(gathered.values())[:CANDIDATES_PER_STEP]


def _premise_choices(step: Step, statements: dict[str, Statement], options: dict[str, list[Option]]):
    """Each way of picking the step's premises: stated ones as they are,
    nested ones among their options (a bounded number of combinations)."""
    per_parent: list[list[tuple[Clause, Option | None]]] = []
    for name in step.parents:
        if name in options:
            per_parent.append([(option.content, option) for option in options[name]])
        elif name in statements:
            per_parent.append([(statements[name].content, None)])
        else:
            return
    yield from itertools.islice(itertools.product(*per_parent), COMBINATIONS)


def _stand_in(step: Step, content: Clause) -> Statement:
    return Statement(step.name, "plain", "cnf", content, step.location, step.inference)


def _negations_of_conjectures(
    outer: Step, nested: Sequence[Step], statements: dict[str, Statement], check_step: CheckStep
) -> tuple[dict[str, tuple[StepResult, Statement]], StepResult | None]:
    """Nested records that use a conjecture.  Only its negation may be
    used, so such a record must negate it (status ``cth``, the conjecture
    its only parent); its unstated conclusion is then the negation, which
    is stated for it and checked like any negated conjecture.  Returns the
    settled records with their stand-in statements, or the failure, which
    is the outer step's (a nested record has no name of its own)."""
    found: dict[str, tuple[StepResult, Statement]] = {}
    for step in nested:
        parents = [statements.get(name) for name in step.parents]
        conjecture = next((p for p in parents if p is not None and p.role == "conjecture"), None)
        if conjecture is None:
            continue
        content = negation(as_formula(conjecture.content))
        stand_in = Statement(step.name, "negated_conjecture", "fof", content, step.location, step.inference)
        if step.inference.status == "cth":
            result = check_step(Step(step.name, stand_in, step.inference, step.parents, step.bindings, step.location),
                                parents)
        else:
            result = StepResult(
                step.name, FAILED, step.inference.rule,
                f"uses the conjecture `{conjecture.name}` as a premise; only its negation may be used",
                step.location, ("reason: conjecture_as_premise",),
            )
        if result.outcome not in (CHECKED, RECONSTRUCTED):
            return found, StepResult(
                outer.name, result.outcome, result.rule,
                f"in its nested record `{step.name}`: {result.message}", outer.location, result.details,
            )
        message = f"conclusion not stated; taken as `{content}`: {result.message}"
        found[step.name] = (StepResult(step.name, result.outcome, result.rule, message, step.location), stand_in)
    return found, None


def check_with_nested(
    outer: Step,
    nested: Sequence[Step],
    statements: dict[str, Statement],
    check_step: CheckStep,
    cheap_step: CheckStep | None = None,
    order: TermOrder | None = None,
    single_step: CheckStep | None = None,
) -> list[StepResult]:
    """Results for the nested steps (in order) and then the outer step.
    ``cheap_step`` checks a step with cheap bounds and no counter-model
    searches, ``single_step`` with single inferences only; the
    combinations of options are tried with them first, the latter first.
    ``order`` is the term order the prover likely rewrote with."""
    assert outer.statement is not None
    negations, failure = _negations_of_conjectures(outer, nested, statements, check_step)
    if failure is not None:
        return [failure]
    if negations:
        statements = {**statements, **{result.name: stand_in for result, stand_in in negations.values()}}
        negated = [step for step in nested if step.name in negations]
        nested = [step for step in nested if step.name not in negations]
        settled = [result for result, _ in negations.values()]
        note_nested([_named(Step(s.name, stand_in, s.inference, s.parents, s.bindings, s.location))
                     for s, (_, stand_in) in ((s, negations[s.name]) for s in negated)])
        if not nested:
            note_nested([_named(outer)])
            return [*settled, check_step(outer, [statements.get(name) for name in outer.parents])]
        return [*settled, *check_with_nested(outer, nested, statements, check_step, cheap_step, order, single_step)]
    options: dict[str, list[Option]] = {}
    for step in nested:  # parents first, as planned
        per_choice: list[Iterator[Option]] = []
        for choice in _premise_choices(step, statements, options):
            premises = [content for content, _ in choice]
            if not all(isinstance(p, Clause) for p in premises):
                continue
            picked = tuple((name, option) for name, (_, option) in zip(step.parents, choice) if option is not None)
            per_choice.append(_options(
                _conclusions(premises, step.inference.rule, order, step.bindings), picked))
        options[step.name] = _round_robin(per_choice)

    by_name = {step.name: step for step in nested}
    choices = list(_premise_choices(outer, statements, options))
    passes = [(check, choices) for check in (single_step, cheap_step) if check is not None]
    passes.append((check_step, choices[:FULL_COMBINATIONS]))
    for check, tried in passes:
        for choice in tried:
            parents = [
                _stand_in(by_name[name], content) if option is not None else statements[name]
                for name, (content, option) in zip(outer.parents, choice)
            ]
            # Only a reconstruction is used: a guessed parent that does not
            # fit says nothing about the step as the derivation states it.
            result = check(outer, parents)
            if result.outcome == RECONSTRUCTED:
                picked = {name: option for name, (_, option) in zip(outer.parents, choice) if option is not None}
                results = _settled(nested, picked)
                note_nested([*(_stated(step, picked[step.name]) for step in nested), _named(outer)])
                return [*results, result]
        if check is single_step:
            continue
        bases = len(tried) if check is cheap_step else FULL_COMBINATIONS
        through = _through_rewrites(outer, nested, statements, options, check, bases)
        if through is not None:
            return through
    return _coarse(outer, nested, statements, check_step, options)


def _through_rewrites(
    outer: Step,
    nested: Sequence[Step],
    statements: dict[str, Statement],
    options: dict[str, list[Option]],
    check: CheckStep,
    count: int,
) -> list[StepResult] | None:
    """A chain of rewriting records (``rw(rw(rw(B, e1), e2), e3)``) checked
    as one: the outer step from each option of its base record ``B`` and
    all the equations the chain cites, so that a rewrite the options of an
    intermediate record missed (an equation used in an order of the
    prover's own) is still found.  The records in between are covered by
    that check; their conclusions are not used.  None when the outer step
    is no such chain or none of the first ``count`` options of the base
    lets it follow."""
    by_name = {step.name: step for step in nested}
    skipped: list[Step] = []
    record, equations = outer, []
    while is_rewriting(record.inference.rule) and record.parents:
        equations = [*zip(record.parents[1:], record.bindings[1:]), *equations]
        if record.parents[0] not in by_name:
            base, base_bindings = record.parents[0], record.bindings[0]
            break
        record = by_name[record.parents[0]]
        if not is_rewriting(record.inference.rule):
            base, base_bindings = record.name, None
            break
        skipped.append(record)
    else:
        return None
    cited = list(dict.fromkeys(equations))  # (name, stated bindings): each instance once
    names = [name for name, _ in cited]
    if not skipped or base in names or any(name in by_name or name not in statements for name in names):
        return None
    flattened = Step(outer.name, outer.statement, outer.inference, (base, *names), (None,) * (1 + len(names)),
                     outer.location)
    written = [_as_stated(statements[name], bindings) for name, bindings in cited]
    bases = [(_stand_in(by_name[base], o.content), o) for o in options.get(base, [])] if base in by_name else [
        (_as_stated(statements[base], base_bindings), None)] if base in statements else []
    for parent, option in bases[:count]:
        result = check(flattened, [parent, *written])
        if result.outcome != RECONSTRUCTED:
            continue
        picked = {} if option is None else {base: option}
        rest = [step for step in nested if step not in skipped]
        results = _settled(rest, picked)
        covered = [
            StepResult(step.name, RECONSTRUCTED, step.inference.rule,
                       f"conclusion not stated; covered by the check of `{outer.name}` from `{base}` and the "
                       f"equations the rewriting records cite", step.location)
            for step in skipped
        ]
        note_nested([*(_stated(step, picked[step.name]) for step in rest), _named(flattened)])
        by_order = {result.name: result for result in (*results, *covered)}
        message = f"{result.message} (checked from {', '.join(flattened.parents)}, through its rewriting records)"
        return [*(by_order[step.name] for step in nested), replace(result, message=message)]
    return None


def _named(step: Step) -> Statement:
    """The step's statement with its (planned) parents as names, as an
    elaborated certificate states it."""
    parents = tuple(Parent(name) for name in step.parents)
    return replace(step.statement, source=replace(step.inference, parents=parents))


def _stated(step: Step, option: Option) -> Statement:
    """A nested record stated with the conclusion it was settled with."""
    inference = replace(step.inference, parents=tuple(Parent(name) for name in step.parents), evidence=option.evidence)
    return Statement(step.name, "plain", "cnf", option.content, step.location, inference)


def _settled(nested: Sequence[Step], picked: dict[str, Option]) -> list[StepResult]:
    """Results for the nested steps, following the options that were used
    down to the innermost records."""
    stack = list(picked.items())
    while stack:
        _, option = stack.pop()
        for inner in option.from_nested:
            picked.setdefault(*inner)
            stack.append(inner)
    return [
        StepResult(
            step.name, RECONSTRUCTED, step.inference.rule,
            f"conclusion not stated; computed `{picked[step.name].content}` by {picked[step.name].how}",
            step.location,
        )
        for step in nested
    ]


def _coarse(
    outer: Step,
    nested: Sequence[Step],
    statements: dict[str, Statement],
    check_step: CheckStep,
    options: dict[str, list[Option]],
) -> list[StepResult]:
    """Check the outer step from the named statements under its nested
    records.  If that fails too, the fault is the outer step's: a nested
    step whose inference yields something is not blamed for it."""
    by_name = {step.name: step for step in nested}
    # Each named statement under the records, as the instance its record
    # states (once per distinct instance), with the record that cites it.
    cited: dict[tuple[str, Substitution | None], str] = {}
    stack = [(outer, name, bindings) for name, bindings in reversed(list(zip(outer.parents, outer.bindings)))]
    while stack:
        record, name, bindings = stack.pop()
        if name in by_name:
            inner = by_name[name]
            stack.extend((inner, parent, given) for parent, given in reversed(list(zip(inner.parents, inner.bindings))))
        else:
            cited.setdefault((name, bindings), record.name)
    leaves = list(dict.fromkeys(name for name, _ in cited))
    # The flattened step claims what its weakest record claims: a
    # Skolemization nested under a `thm` record makes the whole an `esa` step.
    status = weakest_status(step.inference.status for step in (*nested, outer))
    inference = replace(outer.inference, status=status)
    flattened = Step(outer.name, outer.statement, inference, tuple(leaves), (None,) * len(leaves), outer.location)
    bound = {(name, bindings): citer for (name, bindings), citer in cited.items() if bindings is not None}
    if bound:
        # Each cited statement only as the instance its record states.
        instances = Step(outer.name, outer.statement, inference, tuple(name for name, _ in cited),
                         (None,) * len(cited), outer.location)
        result = check_step(instances, [_as_stated(statements.get(name), b) for name, b in cited])
        if result.outcome not in (CHECKED, RECONSTRUCTED):
            free = check_step(flattened, [statements.get(name) for name in leaves])
            if free.outcome in (CHECKED, RECONSTRUCTED):
                return _wrong_nested_bindings(outer, by_name, bound, result, leaves)
            result = free  # not even without the bindings: the claim's own fault
        else:
            flattened = instances
    else:
        result = check_step(flattened, [statements.get(name) for name in leaves])
    covered = result.outcome == RECONSTRUCTED
    if covered:
        note_nested([_named(flattened)])
    nested_results = []
    for step in nested:
        if covered:
            message = f"conclusion not stated; covered by the check of `{outer.name}` from its named parents"
        elif options.get(step.name):
            first = options[step.name][0]
            message = (
                f"conclusion not stated; its inference yields `{first.content}` by {first.how} "
                f"(one of {len(options[step.name])} candidates), none of which lets `{outer.name}` follow"
            )
        else:
            continue  # not checked on its own: the outer step's diagnosis covers it
        nested_results.append(StepResult(step.name, RECONSTRUCTED, step.inference.rule, message, step.location))
    result = StepResult(
        result.name, result.outcome, result.rule,
        f"{result.message} (checked from {', '.join(leaves)}, under its nested records)",
        result.location, result.details,
    )
    return [*nested_results, result]


def _as_stated(statement: Statement | None, bindings: Substitution | None) -> Statement | None:
    """A cited clause as the instance its citation states (``a:[bind(X, t)]``)."""
    if statement is None or bindings is None or not isinstance(statement.content, Clause):
        return statement
    return replace(statement, content=statement.content.instance(bindings))


def _wrong_nested_bindings(
    outer: Step,
    by_name: dict[str, Step],
    bound: dict[tuple[str, Substitution], str],
    result: StepResult,
    leaves: list[str],
) -> list[StepResult]:
    """The claim follows from the named statements (kernel-replayed) but
    not from the instances the records state: the first record stating
    bindings fails (``wrong_bindings``), and the outer step, shown from
    the named statements, rests on it (``unfounded``).  When the outer step
    states them itself, it fails."""
    (name, bindings), citer = next(iter(bound.items()))
    others = [f"`{c}` states {b} for `{n}`" for (n, b), c in list(bound.items())[1:]]
    message = (
        f"the bindings it states for `{name}` ({bindings}) are wrong: `{outer.name}` follows from "
        f"{', '.join(leaves)} without them, but not from the instances its records state: {result.message}"
    )
    details = ("reason: wrong_bindings", *(f"also: {line}" for line in others),
               *(d for d in result.details if not d.startswith("reason: ")))
    if citer == outer.name:
        return [StepResult(outer.name, FAILED, outer.inference.rule, message, outer.location, details)]
    record = by_name[citer]
    failure = StepResult(record.name, FAILED, record.inference.rule, message, record.location, details)
    follows = StepResult(
        outer.name, RECONSTRUCTED, outer.inference.rule,
        f"follows from {', '.join(leaves)} only without the bindings `{record.name}` states", outer.location,
    )
    return [failure, follows]  # the other records are not settled, and not blamed
