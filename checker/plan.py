"""The plan: which steps a derivation has and in which order to check them.

Before any inference is replayed, the derivation as a whole must make
sense: every name defined once, every parent defined, no cycles.  The plan
finds those structural faults (as failed results), gives each unnamed
intermediate step (a nested inference record) a name of its own,
``outer/1``, ``outer/2`` ..., and orders the steps so that parents come
first, keeping the written order wherever it already does so.
"""

from __future__ import annotations

import functools
import heapq
import os
from dataclasses import dataclass, replace

from checker.kernel.clauses import Clause
from checker.kernel.formulas import FALSE
from checker.outcomes import FAILED, StepResult
from formats.derivation import Document, Inference, Location, Origin, Parent, Statement


@dataclass(frozen=True, slots=True)
class Step:
    """One thing to check: a stated statement, or an unnamed intermediate
    step whose conclusion the derivation does not state (``statement`` None)."""

    name: str
    statement: Statement | None
    inference: Inference | None
    parents: tuple[str, ...]
    bindings: tuple[object, ...]  # per parent: stated Substitution or None
    location: Location

    @property
    def is_leaf(self) -> bool:
        return self.inference is None


@dataclass(frozen=True, slots=True)
class Plan:
    """The steps, parents first (steps caught on a cycle come last);
    ``faults`` by step name for the steps that cannot be checked (a dangling
    parent, a cycle); ``duplicates`` for statements whose name was already
    taken, which are not steps at all."""

    steps: tuple[Step, ...]
    faults: dict[str, StepResult]
    duplicates: tuple[StepResult, ...]


def _unfold(statement: Statement, taken: set[str]) -> list[Step]:
    """The statement's step, preceded by steps for its nested records, named
    ``outer/1``, ``outer/2`` ... but never as a written statement is."""
    if not isinstance(statement.source, Inference):
        return [Step(statement.name, statement, None, (), (), statement.location)]
    steps: list[Step] = []
    counter = 0

    def name_nested() -> str:
        nonlocal counter
        counter += 1
        while f"{statement.name}/{counter}" in taken:
            counter += 1
        return f"{statement.name}/{counter}"

    # Iterative post-order over nested records: a nested record's step must
    # exist (and be named) before the step that uses it.
    outer = (statement.name, statement.source)
    names: dict[int, str] = {id(statement.source): statement.name}
    order: list[tuple[str, Inference]] = []
    stack = [outer]
    while stack:
        name, inference = stack.pop()
        order.append((name, inference))
        for parent in inference.parents:
            if isinstance(parent, Inference):
                names[id(parent)] = name_nested()
                stack.append((names[id(parent)], parent))
    for name, inference in reversed(order):
        parent_names = []
        bindings = []
        for parent in inference.parents:
            if isinstance(parent, Parent):
                parent_names.append(parent.name)
                bindings.append(parent.bindings)
            else:
                parent_names.append(names[id(parent)])
                bindings.append(None)
        is_outer = name == statement.name
        steps.append(
            Step(
                name,
                statement if is_outer else None,
                inference,
                tuple(parent_names),
                _no_bindings(len(bindings)) if not any(b is not None for b in bindings) else tuple(bindings),
                statement.location,
            )
        )
    return steps


@functools.cache
def _no_bindings(count: int) -> tuple[None, ...]:
    """One shared tuple per number of parents for the (usual) steps that
    state no bindings, rather than one per step."""
    return (None,) * count


def with_cited_problem_statements(document: Document, problem: Document | None) -> Document:
    """The document, preceded by the problem statements its steps cite by
    name without stating them (the TPTP standard lets a derivation name a
    problem formula directly); each becomes a leaf whose source is the
    problem, so it is linked and checked like a copied leaf."""
    if problem is None:
        return document
    defined = {statement.name for statement in document.statements}
    cited: list[str] = []
    for statement in document.statements:
        stack = [statement.source] if isinstance(statement.source, Inference) else []
        while stack:
            for parent in stack.pop().parents:
                if isinstance(parent, Inference):
                    stack.append(parent)
                elif parent.name not in defined and parent.name not in cited:
                    cited.append(parent.name)
    inputs = {}
    for statement in problem.statements:
        if not isinstance(statement.source, Inference):  # only inputs justify leaves
            inputs.setdefault(statement.name, statement)
    source_name = os.path.basename(problem.path)
    added = tuple(
        replace(inputs[name], source=Origin("file", (source_name, name))) for name in cited if name in inputs
    )
    return replace(document, statements=added + document.statements) if added else document


def make_plan(document: Document) -> Plan:
    """Order the document's steps parents-first and collect structural faults."""
    written = {statement.name for statement in document.statements}
    duplicates: list[StepResult] = []
    faults: dict[str, StepResult] = {}
    steps: list[Step] = []
    defined: dict[str, Location] = {}
    for statement in document.statements:
        if statement.name in defined:
            duplicates.append(
                StepResult(
                    statement.name,
                    FAILED,
                    "structure",
                    f"duplicate name: `{statement.name}` is already defined at {defined[statement.name]}",
                    statement.location,
                    ("reason: duplicate_name",),
                )
            )
            continue
        defined[statement.name] = statement.location
        steps.extend(_unfold(statement, written))

    by_name = {step.name: step for step in steps}
    usable: list[Step] = []
    for step in steps:
        missing = [name for name in step.parents if name not in by_name]
        if missing:
            faults[step.name] = (
                StepResult(
                    step.name,
                    FAILED,
                    step.inference.rule if step.inference else "structure",
                    "parent not defined: " + ", ".join(f"`{name}`" for name in missing),
                    step.location,
                    ("reason: dangling_parent",),
                )
            )
        usable.append(step)

    ordered, stuck = _parents_first(usable)
    stuck_names = {step.name for step in stuck}
    for step in stuck:
        cycle = _cycle_from(step, by_name, stuck_names)
        what = "the step depends on itself" if cycle[0] == step.name else "the step depends on a cycle"
        faults[step.name] = (
            StepResult(
                step.name,
                FAILED,
                step.inference.rule if step.inference else "structure",
                f"cycle: {what}: " + " -> ".join(cycle),
                step.location,
                ("reason: cycle",),
            )
        )
    return Plan(tuple(ordered) + tuple(stuck), faults, tuple(duplicates))


def _parents_first(steps: list[Step]) -> tuple[list[Step], list[Step]]:
    """Kahn's algorithm, taking the earliest written step whenever several
    are ready, or the latest when the derivation is written refutation
    first (it opens with a step that concludes `$false`, and more parents
    are written after their children than before, as in published
    solutions), so that it is checked in the order it was found: an axiom
    of choice before the split definitions that mention its witnesses.
    Returns the ordered steps and those left on a cycle."""
    index = {step.name: number for number, step in enumerate(steps)}
    waiting = {step.name: 0 for step in steps}
    children: dict[str, list[str]] = {step.name: [] for step in steps}
    written_after = 0
    for step in steps:
        for parent in set(step.parents):
            if parent in index:
                waiting[step.name] += 1
                children[parent].append(step.name)
                written_after += 1 if index[parent] > index[step.name] else -1
    sign = -1 if written_after > 0 and steps and _refutes(steps[0]) else 1
    ready = [sign * index[name] for name, count in waiting.items() if count == 0]
    heapq.heapify(ready)
    ordered: list[Step] = []
    while ready:
        step = steps[sign * heapq.heappop(ready)]
        ordered.append(step)
        for child in children[step.name]:
            waiting[child] -= 1
            if waiting[child] == 0:
                heapq.heappush(ready, sign * index[child])
    placed = {step.name for step in ordered}
    return ordered, [step for step in steps if step.name not in placed]


def _refutes(step: Step) -> bool:
    """Whether ``step`` is an inference concluding the empty clause or `$false`."""
    if step.statement is None or step.is_leaf:
        return False
    content = step.statement.content
    return content.is_empty if isinstance(content, Clause) else content.connective == FALSE


def _cycle_from(start: Step, by_name: dict[str, Step], stuck: set[str]) -> list[str]:
    """The cycle reached from ``start`` by following parents that are stuck
    too (every stuck step has one), written from where it closes."""
    path = [start.name]
    seen = {start.name: 0}
    current = start
    while True:
        following = next(p for p in current.parents if p in stuck)
        if following in seen:
            return path[seen[following]:] + [following]
        seen[following] = len(path)
        path.append(following)
        current = by_name[following]
