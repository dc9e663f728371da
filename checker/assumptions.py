"""Case splits with assumptions: which open assumptions each step rests on.

A derivation may assume one component of a clause (a branch), derive
`$false` under it, and then state the clause's other components.  Such a
`$false` is not a refutation: it closes the branch, showing that the
assumption is false given the outer assumptions.  This module traces, over
the whole derivation, the assumptions each step rests on:

- an assumption (an ``introduced(assumption, ...)`` leaf, or a step of a
  rule that opens a branch, whose one parent is the split clause) rests on
  itself and on what its parent rests on;
- a `$false` resting on assumptions shows that, given all but one of them,
  the remaining one is false: it can close the branch of any of them;
- a step whose one parent is a split clause with closed branches, and which
  states part of that clause (or names the rule that does), discharges
  them: it must follow from the clause and the negation of each closed
  assumption, and rests on what the closing `$false` steps (written before
  it, the ones carrying fewest other assumptions) rested on besides;
- a step that writes ``assumptions([...])`` (TPTP's record) discharges the
  assumptions of its parents it no longer lists: it must follow from
  ``assumption => parent`` for each;
- any other step rests on the union of its parents' assumptions.

Assuming is always safe, since whatever rests on an assumption carries it;
the derivation refutes the problem only with a `$false` that rests on none.
"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass

from checker.formula_steps import as_formula, check_consequence, step_result
from checker.kernel.clauses import Clause
from checker.kernel.failure import quote
from checker.kernel.formulas import FALSUM, IMPLIES, binary, negation
from checker.kernel.terms import render
from checker.outcomes import ASSUMED, FAILED, UNPROVEN, StepResult
from checker.plan import Plan, Step
from formats.derivation import Origin, Statement

OPENING_RULES = frozenset({"splitLeft"})
"""rule names (as written in inference records) of steps that assume a component of their parent"""
CLOSING_RULES = frozenset({"splitRight"})
"""rule names of steps that state the rest of a split clause once its branches are closed"""

_RECORD = re.compile(r"assumptions\(\[(.*)\]\)")


@dataclass(frozen=True, slots=True)
class Assumption:
    """A step that assumes: ``split`` is the clause it is a component of
    (None for an introduced assumption); ``closed_by`` the first `$false`
    that rests on it."""

    name: str
    split: str | None
    closed_by: str | None = None


@dataclass(frozen=True, slots=True)
class Discharge:
    """A step that discharges ``discharged``: by the split clause ``split``
    (with the negations of its closed branches), or, for a step writing
    ``assumptions([...])``, by implications from its parents."""

    name: str
    split: str | None
    discharged: tuple[str, ...]
    closers: tuple[str, ...] = ()
    """for a split clause: the `$false` closing each discharged branch"""


@dataclass(frozen=True, slots=True)
class Branches:
    """The assumptions, discharges and what each step rests on."""

    assumptions: dict[str, Assumption]
    discharges: dict[str, Discharge]
    rests_on: dict[str, frozenset[str]]
    declared: dict[str, tuple[str, ...]]
    """the ``assumptions([...])`` record of each step that writes one"""


def _declared(step: Step) -> tuple[str, ...] | None:
    if step.statement is None or step.inference is None:
        return None
    for item in step.inference.info:
        found = _RECORD.fullmatch(item.replace(" ", ""))
        if found:
            return tuple(name.strip("'") for name in found.group(1).split(",") if name)
    return None


def _is_assumption(step: Step) -> bool:
    if step.inference is None:
        origin = step.statement.source if step.statement else None
        return isinstance(origin, Origin) and origin.kind == "introduced" and origin.detail[:1] == ("assumption",)
    return step.statement is not None and step.inference.rule in OPENING_RULES and len(step.parents) == 1


def _is_false(statement: Statement | None) -> bool:
    content = statement.content if statement else None
    return content is FALSUM or (isinstance(content, Clause) and content.is_empty)


def _states_part_of(step: Step, split: Statement | None) -> bool:
    claimed = step.statement.content if step.statement else None
    if not (isinstance(claimed, Clause) and split is not None and isinstance(split.content, Clause)):
        return False
    return claimed.literal_set < split.content.literal_set


NO_ASSUMPTIONS: frozenset[str] = frozenset()


def trace_branches(plan: Plan, statements: dict[str, Statement]) -> Branches:
    """Follow the assumptions through the derivation, parents first."""
    order = {step.name: number for number, step in enumerate(plan.steps)}
    assumptions: dict[str, Assumption] = {}
    discharges: dict[str, Discharge] = {}
    rests_on: dict[str, frozenset[str]] = {}
    declared: dict[str, tuple[str, ...]] = {}
    falses_on: dict[str, list[str]] = {}  # per assumption, the `$false` steps so far that rest on it
    branches_of: dict[str, list[str]] = {}  # split clause -> its assumed branches
    for step in plan.steps:
        inherited = frozenset().union(*(rests_on.get(parent, NO_ASSUMPTIONS) for parent in step.parents)) \
            or NO_ASSUMPTIONS  # one empty set for the many steps that rest on nothing
        record = _declared(step)
        if record is not None:
            declared[step.name] = record
        closed: dict[str, str] = {}
        if len(step.parents) == 1 and step.inference is not None and not _is_assumption(step):
            for branch in branches_of.get(step.parents[0], ()):
                closers = falses_on.get(branch, [])
                if closers:
                    extra = rests_on.get(step.parents[0], frozenset()) | {branch}  # a dangling parent rests on nothing
                    closed[branch] = min(closers, key=lambda f, extra=extra: (len(rests_on[f] - extra), order[f]))
        if _is_assumption(step):
            assumptions[step.name] = Assumption(step.name, step.parents[0] if step.parents else None)
            if step.parents:
                branches_of.setdefault(step.parents[0], []).append(step.name)
            rests = inherited | {step.name}
        elif record is not None and inherited - set(record):
            discharges[step.name] = Discharge(step.name, None, tuple(sorted(inherited - set(record), key=order.get)))
            rests = inherited & set(record)
        elif step.statement is not None and (
            (closed and _states_part_of(step, statements.get(step.parents[0])))
            or (step.inference is not None and step.inference.rule in CLOSING_RULES)
        ):
            discharges[step.name] = Discharge(step.name, step.parents[0] if step.parents else None,
                                              tuple(closed), tuple(closed.values()))
            rests = inherited.union(*(rests_on[f] - {a} for a, f in closed.items()))
        else:
            rests = inherited
        rests_on[step.name] = rests
        if rests and step.statement is not None and _is_false(step.statement):
            for name in rests:
                falses_on.setdefault(name, []).append(step.name)
                if assumptions[name].closed_by is None:
                    assumptions[name] = Assumption(name, assumptions[name].split, step.name)
    return Branches(assumptions, discharges, rests_on, declared)


def describe_assumption(branches: Branches, name: str, statements: dict[str, Statement]) -> str:
    """One line naming an assumption, what it assumes and where it came from."""
    assumption = branches.assumptions[name]
    content = statements[name].content if name in statements else None
    where = f"a component of `{assumption.split}`" if assumption.split else "introduced"
    return f"assumption `{name}`: {quote(content)} ({where})"


def _closure_of(statement: Statement):
    return as_formula(statement.content)


def check_branch_step(
    step: Step, parents: Sequence[Statement | None], branches: Branches, statements: dict[str, Statement], limits
) -> StepResult | None:
    """The result of a step that assumes or discharges, or whose written
    assumptions differ from what it rests on; None for any other step."""
    if step.name in branches.assumptions:
        return _check_assumption(step, parents, branches)
    record = branches.declared.get(step.name)
    if record is not None:
        inherited = frozenset().union(*(branches.rests_on.get(p, frozenset()) for p in step.parents))
        unknown = [name for name in record if name not in inherited]
        if unknown:
            return step_result(
                step, FAILED,
                f"writes assumptions [{', '.join(record)}], but its parents rest on "
                f"[{', '.join(sorted(inherited))}]: `{unknown[0]}` is not among them",
                ("reason: assumptions_differ",),
            )
    discharge = branches.discharges.get(step.name)
    if discharge is None:
        return None
    if discharge.split is None:
        premises = []
        for parent in parents:
            hypotheses = [_closure_of(statements[a]) for a in discharge.discharged
                          if a in branches.rests_on.get(parent.name, ())]
            body = as_formula(parent.content)
            for hypothesis in reversed(hypotheses):
                body = binary(IMPLIES, hypothesis, body)
            premises.append(body)
        what = f"discharging {', '.join(f'`{a}`' for a in discharge.discharged)}: follows from its parents under them"
        return check_consequence(step, premises, as_formula(step.statement.content), limits, what=what)
    if not discharge.discharged:
        opened = [a for a in branches.assumptions.values() if a.split == discharge.split]
        lines = [f"{describe_assumption(branches, a.name, statements)}; no `$false` written before this step rests on it"
                 for a in opened]
        why = "no branch of it was assumed" if not opened else "none of its branches was closed by a `$false` before it"
        return step_result(
            step, FAILED, f"states the rest of split clause `{discharge.split}`, but {why}",
            ("reason: branch_not_closed", *lines),
        )
    split = parents[0]
    premises = [as_formula(split.content)] + [negation(_closure_of(statements[a])) for a in discharge.discharged]
    closers = ", ".join(f"`{a}` closed by `{f}`" for a, f in zip(discharge.discharged, discharge.closers))
    result = check_consequence(
        step, premises, as_formula(step.statement.content), limits,
        what=f"follows from split clause `{split.name}` and its closed branches ({closers})",
    )
    return result


def _check_assumption(step: Step, parents: Sequence[Statement | None], branches: Branches) -> StepResult:
    """An assumption needs no justification (what rests on it carries it),
    but a branch must contain a component of its split clause sharing no
    variable with the rest, or the other side of the split is not its
    complement.  Literals beyond the component weaken the branch: that is
    safe, since closing the weaker branch refutes the component too (the
    other side is checked from the negation of the branch as written)."""
    assumption = branches.assumptions[step.name]
    fate = f"first closed by `{assumption.closed_by}`" if assumption.closed_by else "never closed"
    if not parents:
        return step_result(step, ASSUMED, f"assumption (introduced); {fate}")
    claimed, split = step.statement.content, parents[0].content
    if not (isinstance(claimed, Clause) and isinstance(split, Clause)):
        return step_result(step, UNPROVEN, "an assumed branch and its split clause must both be clauses")
    component = Clause(literal for literal in claimed.literals if literal in split.literal_set)
    extra = [literal for literal in claimed.literals if literal not in split.literal_set]
    if extra and not component.literals:
        return step_result(
            step, FAILED,
            f"assumes {quote(claimed)}, which is not a component of `{parents[0].name}` ({quote(split)}): "
            f"{quote(extra[0])} is not one of its literals, and none of its literals is",
            ("reason: not_a_component",),
        )
    rest = Clause(literal for literal in split.literals if literal not in claimed.literal_set)
    shared = sorted(component.variables() & rest.variables(), key=render)
    if shared:
        return step_result(
            step, FAILED,
            f"assumes {quote(claimed)}, which shares variable `{render(shared[0])}` with the rest of "
            f"`{parents[0].name}` ({quote(rest)}): a branch must be a variable-disjoint component",
            ("reason: component_shares_variable",),
        )
    if extra:
        weakened = ", ".join(quote(literal) for literal in extra)
        return step_result(step, ASSUMED, f"assumption: the variable-disjoint component {quote(component)} of "
                                          f"`{parents[0].name}`, weakened by {weakened}; {fate}")
    return step_result(step, ASSUMED, f"assumption: a variable-disjoint component of `{parents[0].name}`; {fate}")


def open_branch_faults(plan: Plan, branches: Branches, statements: dict[str, Statement]) -> list[StepResult]:
    """When the derivation assumes, it refutes the problem only with a
    `$false` that rests on no open assumption; otherwise its last `$false`
    is failed, naming what it still rests on."""
    if not branches.assumptions:
        return []
    falses = [s for s in plan.steps if s.statement is not None and _is_false(s.statement)]
    if not falses or any(not branches.rests_on[s.name] for s in falses):
        return []
    last = falses[-1]
    open_ = sorted(branches.rests_on[last.name], key=[s.name for s in plan.steps].index)
    return [
        step_result(
            last, FAILED,
            f"every `$false` rests on an open assumption; this one rests on "
            f"{', '.join(f'`{a}`' for a in open_)}: it closes a branch, it does not refute the problem",
            ("reason: open_assumption", *branch_lines(branches, last.name, statements)),
        )
    ]


def branch_lines(branches: Branches, name: str, statements: dict[str, Statement]) -> tuple[str, ...]:
    """For a report: the open assumptions a step rests on."""
    return tuple(f"rests on {describe_assumption(branches, a, statements)}"
                 for a in sorted(branches.rests_on.get(name, ()), key=list(branches.rests_on).index))
