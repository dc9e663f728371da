"""Conditions on a derivation as a whole, not on any one step.

Some faults only show across steps: a derivation that negates two of the
problem's conjectures refutes only their disjunction, and one that never
reaches the empty clause refutes nothing.  The plan (checker/plan.py)
settles the structure; this module settles these, after every step has its
own outcome, and says what an accepted refutation does and does not show.
"""

from __future__ import annotations

from checker.kernel.clauses import Clause
from checker.kernel.formulas import FALSUM
from checker.leaves import equivalent_content
from checker.outcomes import FAILED, StepResult
from formats.derivation import Document, Location, Origin, Statement


def negations(plan, statements, problem: Document | None = None) -> list[tuple[str, str]]:
    """(step, conjecture) for each stated step that uses a conjecture, in
    order, looking through its nested records; the conjecture by the name
    the problem gives the statement it equals, when there is a problem."""
    found = []
    for step in plan.steps:
        if step.is_leaf:
            continue
        stated = step.name if step.statement is not None else step.name.rpartition("/")[0]
        for name in step.parents:
            parent = statements.get(name)
            if parent is not None and parent.role == "conjecture":
                found.append((stated, _problem_name(parent, problem)))
    return found


def _problem_name(conjecture: Statement, problem: Document | None) -> str:
    """The problem's name for the conjecture a statement states (by content;
    the cited name only breaks ties between identical conjectures)."""
    if problem is None:
        return conjecture.name
    source = conjecture.source
    cited = source.detail[1] if isinstance(source, Origin) and len(source.detail) > 1 else None
    equal = [
        s.name for s in problem.statements if s.role == "conjecture" and equivalent_content(s.content, conjecture.content)
    ]
    if not equal:
        return conjecture.name
    return cited if cited in equal else equal[0]


def one_conjecture_at_a_time(plan, statements, problem: Document | None, results: list[StepResult]) -> list[StepResult]:
    """TPTP takes a problem's conjectures one at a time: a derivation that
    negates two of them refutes only their disjunction, so the step that
    negates the second one is failed."""
    found = negations(plan, statements, problem)
    if len({conjecture for _, conjecture in found}) < 2:
        return results
    first_step, first = found[0]
    blamed = {
        step: f"negates conjecture `{conjecture}`, but step `{first_step}` already negated conjecture `{first}`: "
        "each conjecture must be refuted on its own (a refutation from both negations proves only their disjunction)"
        for step, conjecture in found
        if conjecture != first
    }
    return [
        StepResult(r.name, FAILED, r.rule, blamed[r.name], r.location, ("reason: second_conjecture",))
        if r.name in blamed
        else r
        for r in results
    ]


def conjecture_cautions(plan, statements, problem: Document) -> list[str]:
    """What an accepted refutation does and does not show about the conjectures."""
    conjectures = [s.name for s in problem.statements if s.role == "conjecture"]
    if not conjectures:
        return []
    negated = {conjecture for _, conjecture in negations(plan, statements, problem)}
    if not negated:
        return [
            "the refutation uses no negated conjecture: it shows the problem's axioms are inconsistent, "
            "so every conjecture follows from them trivially"
        ]
    others = [c for c in conjectures if c not in negated]
    if others:
        return [
            f"proves conjecture {', '.join(sorted(negated))} only; the problem's other conjectures "
            f"({', '.join(others)}) are not addressed"
        ]
    return []


def reaches_refutation(document: Document) -> list[StepResult]:
    """The derivation must reach the empty clause (a refutation); a
    conjecture of `$false` is something to show, not something reached."""
    for statement in document.statements:
        if statement.role == "conjecture":
            continue
        content = statement.content
        if (isinstance(content, Clause) and content.is_empty) or content is FALSUM:
            return []
    return [
        StepResult(
            "(derivation)",
            FAILED,
            "refutation",
            "the derivation never reaches the empty clause (`$false`)",
            Location(document.path, 1, 1),
            ("reason: no_refutation",),
        )
    ]
