"""One step laid open (``assay explain``): what it says, what was tried, what was found.

A prover developer looking at a rejected step needs more than the verdict:
the premises and the claim as written, the order in which evidence was
looked for, the evidence that was found (literals, per-parent unifiers,
positions, the chain of rewrites) or the exact point of failure, the
computed clause beside the claimed one with the differing literals
marked, and the counter-model if there is one.  The outcome is the
check's own (the whole derivation is checked, so the step is judged in
context); for clause steps the evidence search is run once more on the
step alone to report its stages, as data returned by the search.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, replace

import click

from checker.formula_steps import as_formula
from checker.freshness import new_symbols
from checker.kernel.clauses import Clause
from checker.kernel.entailment import check_entailment, entailment_clauses
from checker.kernel.failure import Failure, quote
from checker.kernel.formulas import alpha_equivalent
from checker.kernel.rules import Chain, Refutation, check_clause_step, negated_claim, replay
from checker.kernel.substitution import IDENTITY
from checker.opened import OpenedDerivation, claimed_status, resolved_premises
from checker.outcomes import FAILED, REFUTED, UNPROVEN, Report, StepResult
from checker.plan import Step
from checker.search.entailment import find_entailment
from checker.search.evidence import describe
from checker.search.reconstruct import DEFAULT_LIMITS, Evidence, SearchLimits, reconstruct
from checker.statuses import CONSEQUENCE_STATUSES
from formats.derivation import Origin

BOTH, PRODUCED_ONLY, CLAIMED_ONLY = " ", "-", "+"


@dataclass(frozen=True, slots=True)
class Premise:
    """A premise as written (or, for a nested record, what the check made of it)."""

    name: str
    text: str
    location: str | None
    note: str = ""


@dataclass(frozen=True, slots=True)
class Explanation:
    """Everything ``assay explain`` shows about one step, as plain data."""

    step: str
    location: str
    rule: str
    status: str | None
    role: str
    source: str | None
    """for a leaf: where it says it comes from"""
    premises: tuple[Premise, ...]
    claimed: str | None
    result: StepResult | None
    """the check's result for the step (None: not checked on its own)"""
    tried: tuple[str, ...] = ()
    evidence: tuple[str, ...] = ()
    comparison: tuple[tuple[str, str], ...] = ()
    """(mark, literal): BOTH, PRODUCED_ONLY (computed, not claimed) or
    CLAIMED_ONLY (claimed, not computed)"""
    kernel: str = ""
    """the kernel's word on the closest candidate or on stated evidence"""
    countermodel: tuple[str, ...] = ()
    details: tuple[str, ...] = ()


@dataclass(frozen=True, slots=True)
class Account:
    """What a search run again for the explanation tried and found."""

    tried: tuple[str, ...] = ()
    evidence: tuple[str, ...] = ()
    comparison: tuple[tuple[str, str], ...] = ()
    kernel: str = ""


def _premises(opened: OpenedDerivation, step: Step, results: dict[str, StepResult]) -> tuple[Premise, ...]:
    premises = []
    for name, bindings in zip(step.parents, step.bindings):
        statement = opened.statements.get(name)
        if statement is not None:
            note = f"used as its instance under {bindings}" if bindings is not None else ""
            premises.append(Premise(name, str(statement.content), str(statement.location), note))
        elif name in opened.steps:
            found = results.get(name)
            what = found.message if found is not None else "conclusion not stated"
            premises.append(Premise(name, "(nested record)", None, what))
        else:
            premises.append(Premise(name, "(not defined)", None))
    return tuple(premises)


def _source(step: Step) -> str | None:
    origin = step.statement.source if step.is_leaf and step.statement is not None else None
    if not isinstance(origin, Origin):
        return None
    return f"{origin.kind}({', '.join(origin.detail)})"


def _countermodel_lines(details: Sequence[str]) -> tuple[tuple[str, ...], tuple[str, ...]]:
    """The counter-model block of a result's detail lines (from ``domain =``
    to ``falsified:``), and the other lines."""
    start = next((number for number, line in enumerate(details) if line.startswith("domain = ")), None)
    if start is None:
        return (), tuple(details)
    end = next((n for n in range(start, len(details)) if details[n].startswith("falsified")), len(details) - 1)
    return tuple(details[start:end + 1]), tuple(details[:start]) + tuple(details[end + 1:])


def evidence_lines(premises: Sequence[Clause], claimed: Clause, evidence: Evidence) -> list[str]:
    """The evidence in words, one line per inference, each clause a chain
    derives numbered after the premises (and, for a refutation, after the
    negated claim's unit clauses)."""
    clauses = list(premises)
    lines = []
    if isinstance(evidence, Refutation):
        negation = negated_claim(premises, claimed)
        lines.append("refutation of the premises and the negated claim: "
                     + ", ".join(f"[{len(clauses) + k}] {quote(c)}" for k, c in enumerate(negation)))
        clauses.extend(negation)
        evidence = evidence.chain
    steps = evidence.steps if isinstance(evidence, Chain) else (evidence,)
    for inference in steps:
        result = replay(clauses, inference)
        if isinstance(result, Failure):
            lines.append(f"[{len(clauses)}] {describe(clauses, inference)}: fails here ({result.reason})")
            break
        lines.append(f"[{len(clauses)}] {describe(clauses, inference)}: {quote(result)}")
        clauses.append(result)
    return lines


def compared(computed: Clause, claimed: Clause) -> tuple[tuple[str, str], ...]:
    """The claimed literals marked BOTH or CLAIMED_ONLY, then the computed
    ones the claim lacks, marked PRODUCED_ONLY."""
    marks = [(BOTH if literal in computed.literal_set else CLAIMED_ONLY, str(literal)) for literal in claimed.literals]
    marks += [(PRODUCED_ONLY, str(literal)) for literal in computed.literals if literal not in claimed.literal_set]
    return tuple(marks)


def _clause_search(step: Step, premises: list[Clause], claimed: Clause, limits: SearchLimits) -> Account:
    """What the evidence search tries and finds for a clause step, or what
    the kernel says of the evidence the certificate states."""
    inference = step.inference
    if inference.evidence is not None:
        theta = inference.theta or IDENTITY
        failure = check_clause_step(premises, claimed, inference.evidence, theta)
        computed = replay(premises, inference.evidence) if not isinstance(inference.evidence, Refutation) else None
        return Account(
            ("the certificate states its evidence: replayed by the kernel, no search",),
            tuple(evidence_lines(premises, claimed, inference.evidence)),
            compared(computed.instance(theta), claimed) if failure is not None and isinstance(computed, Clause) else (),
            "accepted" if failure is None else f"{failure.reason}: {failure.message}",
        )
    found = reconstruct(premises, claimed, rule_hint=inference.rule, limits=limits, stated=step.bindings)
    if found.evidence is not None:
        lines = evidence_lines(premises, claimed, found.evidence)
        if found.theta is not IDENTITY and found.theta.mapping:
            lines.append(f"conclusion test: theta {found.theta} maps the computed clause into the claimed one")
        return Account(found.tried, tuple(lines), (), "accepted")
    closest = found.closest
    if closest is None:
        return Account(found.tried)
    extra = set(closest.extra)
    comparison = [(CLAIMED_ONLY if literal in extra else BOTH, str(literal)) for literal in closest.claimed.literals]
    comparison += [(PRODUCED_ONLY, str(literal)) for literal in closest.missing if literal not in extra]
    return Account(
        found.tried,
        (f"closest candidate: {closest.description}", f"computed: {quote(closest.computed)}"),
        tuple(comparison),
        closest.message,
    )


SHOWN_INFERENCES = 40


def _formula_search(premises: list, claimed, limits: SearchLimits) -> Account:
    """What the consequence check of a formula step tries: a premise
    alpha-equivalent to the claim, then a refutation of
    clausify(premises ∧ ¬claim) replayed by the kernel."""
    formulas = [as_formula(premise) for premise in premises]
    conclusion = as_formula(claimed)
    if any(alpha_equivalent(premise, conclusion) for premise in formulas):
        return Account(("alpha-equivalence with a premise: found",), (), (), "accepted")
    tried = ["alpha-equivalence with a premise: none"]
    clauses = entailment_clauses(formulas, conclusion)
    chain = find_entailment(formulas, conclusion, limits)
    if chain is None or check_entailment(formulas, conclusion, chain) is not None:
        tried.append(f"refutation of the {len(clauses)} clauses of premises and negated claim: none within "
                     f"{limits.saturation_given} given clauses")
        return Account(tuple(tried))
    tried.append(f"refutation of the {len(clauses)} clauses of premises and negated claim: "
                 f"{len(chain.steps)} inferences")
    lines = [f"[{number}] {quote(clause)}" for number, clause in enumerate(clauses)]
    lines += evidence_lines(clauses, Clause(()), chain)
    if len(lines) > SHOWN_INFERENCES:
        lines = lines[:SHOWN_INFERENCES] + [f"... and {len(lines) - SHOWN_INFERENCES} more lines"]
    return Account(tuple(tried), tuple(lines), (), "accepted")


def explain(
    opened: OpenedDerivation, report: Report, name: str, limits: SearchLimits = DEFAULT_LIMITS, search: bool = True
) -> Explanation:
    """The explanation of step ``name`` (which must be a step of the plan),
    given the report of checking the whole derivation; with ``search``
    False, a clause step's evidence search is not run again (the check's
    own result is still shown)."""
    step = opened.steps[name]
    results = {result.name: result for result in report.steps}
    result = results.get(name)
    statement = step.statement
    claimed = str(statement.content) if statement is not None else None
    premises = _premises(opened, step, results)
    countermodel, details = _countermodel_lines(result.details) if result is not None else ((), ())
    found = Account()
    parents = [opened.statements.get(parent) for parent in step.parents]
    is_clause_step = (
        step.inference is not None and statement is not None and isinstance(statement.content, Clause)
        and all(parent is not None and isinstance(parent.content, Clause) for parent in parents)
        and not any(parent.role == "conjecture" for parent in parents)
    )
    if name in opened.plan.faults:
        found = Account(("nothing: the derivation's structure rules the step out before any inference is replayed",))
    elif is_clause_step and search:
        found = _clause_search(step, [parent.content for parent in parents], statement.content, limits)
    elif search and statement is not None and not step.is_leaf:
        names = resolved_premises(opened, step)
        resting_on = [opened.statements.get(parent) for parent in names]
        if _plain_consequence(claimed_status(opened, step), statement, resting_on):
            found = _formula_search([parent.content for parent in resting_on], statement.content, limits)
            if tuple(names) != step.parents:
                under = f"premises: the statements under its nested records, {', '.join(names)}"
                found = replace(found, tried=(under, *found.tried))
    return Explanation(
        name,
        str(step.location),
        step.inference.rule if step.inference is not None else (result.rule if result else "leaf"),
        step.inference.status if step.inference is not None else None,
        statement.role if statement is not None else "plain",
        _source(step),
        premises,
        claimed,
        result,
        found.tried,
        found.evidence,
        found.comparison,
        found.kernel,
        countermodel,
        details,
    )


def _plain_consequence(status: str, statement, parents: Sequence) -> bool:
    """A step that claims consequence of stated, non-conjecture premises
    and introduces no symbol: checked as an entailment alone."""
    if status not in CONSEQUENCE_STATUSES or not parents:
        return False
    if any(parent is None or parent.role == "conjecture" for parent in parents):
        return False
    return not new_symbols(statement.content, [parent.content for parent in parents])


# The closest-candidate lines of a result's details, shown above from the search itself.
_CANDIDATE_LINES = ("closest candidate: ", "computed: ", "claimed:  ", "produced but not claimed: ",
                    "claimed but not produced: ", "kernel: ")

_OUTCOME_COLOURS = {FAILED: "red", REFUTED: "red", UNPROVEN: "yellow"}


def render_explanation(explanation: Explanation, styled: bool = False) -> str:
    """The explanation as text; ``styled`` adds terminal colours."""

    def style(text: str, **how) -> str:
        return click.style(text, **how) if styled else text

    e = explanation
    status = f", status {e.status}" if e.status else ""
    lines = [style(f"step {e.step}", bold=True) + f" at {e.location} ({e.rule}{status})"]
    if e.premises:
        lines.append("premises, as written:")
        for number, premise in enumerate(e.premises):
            where = f"  [{premise.location}]" if premise.location else ""
            lines.append(f"  {number} = {premise.name}: {premise.text}{where}")
            if premise.note:
                lines.append(f"      {premise.note}")
    else:
        lines.append(f"premises: none (a leaf, role {explanation.role})")
    if e.source:
        lines.append(f"source: {e.source}")
    lines.append(f"claimed: {e.claimed}" if e.claimed is not None else "claimed: not stated (a nested record)")
    if e.result is None:
        lines.append("outcome: not checked on its own (its outer step's diagnosis covers it)")
    else:
        colour = _OUTCOME_COLOURS.get(e.result.outcome, "green")
        lines.append("outcome: " + style(e.result.outcome, fg=colour, bold=True) + f": {e.result.message}")
        if e.result.reason:
            lines.append(f"reason: {e.result.reason}")
    if e.tried:
        lines.append("tried, in order:")
        lines.extend(f"  {number}. {line}" for number, line in enumerate(e.tried, 1))
    if e.evidence:
        lines.append("evidence:")
        lines.extend(f"  {line}" for line in e.evidence)
    if e.comparison:
        lines.append("computed vs claimed (- computed, not claimed; + claimed, not computed):")
        colours = {PRODUCED_ONLY: "red", CLAIMED_ONLY: "yellow"}
        for mark, literal in e.comparison:
            text = f"  {mark} {literal}"
            lines.append(style(text, fg=colours[mark]) if mark in colours else text)
    if e.kernel:
        lines.append(f"kernel: {e.kernel}")
    if e.countermodel:
        lines.append("counter-model (premises true, claim false; kernel-confirmed):")
        lines.extend(f"  {line}" for line in e.countermodel)
    shown_above = ("reason: ",) + (_CANDIDATE_LINES if e.evidence or e.comparison else ())
    others = [line for line in e.details if not line.startswith(shown_above)]
    if others:
        lines.append("details:")
        lines.extend(f"  {line}" for line in others)
    return "\n".join(lines)
