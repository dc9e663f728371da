"""A derivation opened for looking into one step at a time.

``assay explain``, ``assay extract`` and ``assay graph`` need what the
check itself builds before it replays anything: the statements, the
problem the leaves come from, and the plan (with nested records named
``outer/1``, ``outer/2`` ...).  This module builds it the same way
``checker.run`` does, and answers which statements a step rests on.
"""

from __future__ import annotations

import difflib
import os
from collections.abc import Sequence
from dataclasses import dataclass

from checker.plan import Plan, Step, make_plan, with_cited_problem_statements
from checker.run import cited_problems, discover_problem, read_document
from checker.statuses import weakest_status
from formats.derivation import Document, Location, Origin, Statement, UnreadableInput
from formats.tptp import read_tptp


@dataclass(frozen=True, slots=True)
class OpenedDerivation:
    """A derivation read and planned, with its problem if one was given or found."""

    path: str
    document: Document
    problem_path: str | None
    problem: Document | None
    plan: Plan
    statements: dict[str, Statement]
    steps: dict[str, Step]


def open_derivation(path: str, problem_path: str | None = None, include_dirs: Sequence[str] = ()) -> OpenedDerivation:
    """Read and plan the derivation at ``path``; raises
    :class:`UnreadableInput` or ``OSError`` as the readers do."""
    environment = os.environ.get("TPTP")
    include_dirs = tuple(include_dirs) + ((environment,) if environment else ())
    document = read_document(path, include_dirs)
    if not document.statements:
        raise UnreadableInput("no statements found", Location(path, 1, 1))
    if problem_path is None:
        problem_path = discover_problem(path, cited_problems(path, document), include_dirs)
    problem = read_tptp(problem_path, include_dirs) if problem_path else None
    document = with_cited_problem_statements(document, problem)
    plan = make_plan(document)
    statements: dict[str, Statement] = {}
    for statement in document.statements:
        statements.setdefault(statement.name, statement)
    steps = {step.name: step for step in plan.steps}
    return OpenedDerivation(path, document, problem_path, problem, plan, statements, steps)


def unknown_step_message(opened: OpenedDerivation, name: str) -> str:
    """Why ``name`` names no step, with the nearest names there are."""
    near = difflib.get_close_matches(name, list(opened.steps), n=3)
    hint = f"; did you mean {', '.join(f'`{n}`' for n in near)}?" if near else ""
    return f"{opened.path}: no step named `{name}`{hint}"


def resolved_premises(opened: OpenedDerivation, step: Step) -> list[str]:
    """The stated statements a step rests on: its parents, with each
    nested record (whose conclusion is not stated) replaced by the parents
    it rests on in turn, in order and without repeats."""
    found: list[str] = []
    stack = list(reversed(step.parents))
    while stack:
        name = stack.pop()
        inner = opened.steps.get(name)
        if inner is not None and inner.statement is None:
            stack.extend(reversed(inner.parents))
        elif name not in found:
            found.append(name)
    return found


def cited_problem_statement(opened: OpenedDerivation, step: Step) -> Statement | None:
    """The problem statement a leaf cites by ``file(_, name)``, if the
    problem has one of that name."""
    source = step.statement.source if step.statement is not None else None
    if opened.problem is None or not isinstance(source, Origin) or source.kind != "file" or len(source.detail) < 2:
        return None
    return next((s for s in opened.problem.statements if s.name == source.detail[1]), None)


def claimed_status(opened: OpenedDerivation, step: Step) -> str:
    """What the step claims, under its nested records too: a Skolemization
    nested under a ``thm`` record claims only satisfiability."""
    if step.is_leaf:
        return "thm"
    statuses = [step.inference.status]
    stack = list(step.parents)
    while stack:
        inner = opened.steps.get(stack.pop())
        if inner is not None and inner.statement is None:
            statuses.append(inner.inference.status)
            stack.extend(inner.parents)
    return weakest_status(statuses)
