"""A reproducer for one step: a standalone TPTP problem a prover can be given.

When a step is wrong, its author wants something to attach to a bug
report or feed to any prover: the step's premises as axioms and its
claimed conclusion, universally closed, as the conjecture.  Premises under
nested records (whose conclusions the derivation does not state) are the
stated statements those records rest on.  A leaf's premises are the
problem statement it cites (or, citing none, the problem's axioms).
"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass

from checker.formula_steps import as_formula
from checker.kernel.clauses import Clause
from checker.kernel.formulas import Formula, negation
from checker.kernel.models import Interpretation, confirm_countermodel, render_countermodel
from checker.opened import OpenedDerivation, cited_problem_statement, claimed_status, resolved_premises
from checker.plan import Step
from checker.search.models import find_countermodel
from checker.statuses import CONSEQUENCE_STATUSES

AXIOM_ROLES = frozenset({"axiom", "hypothesis", "definition", "assumption", "lemma", "theorem", "corollary"})

# TPTP syntax, BNF rules <lower_word> and <integer>: names that need no quotes.
_PLAIN_NAME = re.compile(r"[a-z][A-Za-z0-9_]*|[0-9]+")


@dataclass(frozen=True, slots=True)
class Reproducer:
    """The reproducer of a step: its TPTP text and what went into it."""

    step: str
    text: str
    axioms: tuple[tuple[str, Formula], ...]
    conjecture: Formula
    consequence_claimed: bool
    """the step's status claims its conclusion follows (not only that
    satisfiability is preserved), so a prover should prove the conjecture"""
    countermodel: Interpretation | None = None


@dataclass(frozen=True, slots=True)
class NoReproducer:
    """Why no reproducer can be written for the step (a failure value)."""

    message: str


def tptp_name(name: str) -> str:
    """``name`` as a TPTP name: as is when it is a <lower_word> or an
    <integer>, otherwise a <single_quoted> name."""
    if _PLAIN_NAME.fullmatch(name):
        return name
    return "'" + name.replace("\\", "\\\\").replace("'", "\\'") + "'"


def _premises(opened: OpenedDerivation, step: Step) -> tuple[list[tuple[str, Formula]], list[str]] | NoReproducer:
    """The axioms (name, closed formula) and notes on what was left out."""
    notes: list[str] = []
    if step.is_leaf:
        if opened.problem is None:
            return NoReproducer(f"`{step.name}` is a leaf and no problem was given or found to take its axioms from")
        cited = cited_problem_statement(opened, step)
        if cited is not None and cited.role in AXIOM_ROLES:
            return [(cited.name, as_formula(cited.content))], notes
        if cited is not None:
            notes.append(f"the leaf cites the problem's {cited.role} `{cited.name}`, which is no axiom: left out")
            return [], notes
        notes.append("the leaf cites no statement of the problem: the axioms are all of the problem's")
        return [(s.name, as_formula(s.content)) for s in opened.problem.statements if s.role in AXIOM_ROLES], notes
    axioms: list[tuple[str, Formula]] = []
    negated = _negated_by_records(opened, step)
    stated = {name: bindings for name, bindings in zip(step.parents, step.bindings) if bindings is not None}
    for name in resolved_premises(opened, step):
        statement = opened.statements.get(name)
        if statement is None:
            return NoReproducer(f"`{step.name}` rests on `{name}`, which the derivation does not define")
        if statement.role == "conjecture" and name in negated:
            notes.append(f"premise `{name}` is a conjecture, taken negated as the record with status cth that uses it says")
            axioms.append((f"{name}_negated", negation(as_formula(statement.content))))
            continue
        if statement.role == "conjecture":
            notes.append(f"premise `{name}` is a conjecture, which a derivation may use only negated: left out")
            continue
        content = statement.content
        if name in stated and isinstance(content, Clause):
            # The step uses this premise only as the instance its bindings state.
            content = content.instance(stated[name])
            notes.append(f"premise `{name}` is taken as the instance its stated bindings give, {stated[name]}")
        axioms.append((name, as_formula(content)))
    return axioms, notes


def _negated_by_records(opened: OpenedDerivation, step: Step) -> set[str]:
    """The parents that the step, or a nested record under it, uses with
    status ``cth``: a conjecture there stands negated."""
    negated: set[str] = set()
    stack = [step]
    while stack:
        record = stack.pop()
        if record.inference.status == "cth":
            negated.update(record.parents)
        for name in record.parents:
            inner = opened.steps.get(name)
            if inner is not None and inner.statement is None:
                stack.append(inner)
    return negated


def extract(opened: OpenedDerivation, name: str, with_model: bool = False) -> Reproducer | NoReproducer:
    """The reproducer of step ``name``; with ``with_model``, a kernel-confirmed
    counter-model (premises true, conclusion false) is looked for and added
    as a comment."""
    step = opened.steps.get(name)
    if step is None:
        return NoReproducer(f"no step named `{name}`")
    if step.statement is None:
        outer = name.rpartition("/")[0]
        return NoReproducer(
            f"the conclusion of the nested record `{name}` is not stated in the derivation; "
            f"extract `{outer}`, whose premises are the statements under its nested records"
        )
    found = _premises(opened, step)
    if isinstance(found, NoReproducer):
        return found
    axioms, notes = found
    conjecture = as_formula(step.statement.content)
    status = claimed_status(opened, step)
    model = None
    if with_model:
        formulas = [formula for _, formula in axioms]
        candidate = find_countermodel(formulas, conjecture)
        if candidate is not None and confirm_countermodel(candidate, formulas, conjecture) is None:
            model = candidate
    header = _header(opened, step, status, notes, axioms, conjecture, with_model, model)
    body = [f"fof({tptp_name(axiom)}, axiom, {formula})." for axiom, formula in axioms]
    body.append(f"fof({tptp_name(step.name)}, conjecture, {conjecture}).")
    text = "\n".join(header + body) + "\n"
    return Reproducer(step.name, text, tuple(axioms), conjecture, status in CONSEQUENCE_STATUSES, model)


def _header(
    opened: OpenedDerivation,
    step: Step,
    status: str,
    notes: Sequence[str],
    axioms: Sequence[tuple[str, Formula]],
    conjecture: Formula,
    with_model: bool,
    model: Interpretation | None,
) -> list[str]:
    location = step.location
    lines = [
        f"% Reproducer of step `{step.name}` of {opened.path}, line {location.line}, column {location.column}",
        "% (written by assay extract): the axioms are the step's premises, the",
        "% conjecture its claimed conclusion, universally closed.",
    ]
    if step.is_leaf:
        lines.append(f"% The step is a leaf ({step.statement.role}); problem: {opened.problem_path}.")
    else:
        lines.append(f"% Rule `{step.inference.rule}`, status {status}.")
    if status not in CONSEQUENCE_STATUSES:
        lines.append(f"% Status {status} claims only that satisfiability is preserved: the conjecture need not follow.")
    lines.extend(f"% Note: {note}." for note in notes)
    if with_model and model is None:
        lines.append("% No counter-model was found (up to 4 elements).")
    elif model is not None:
        lines.append("% Counter-model (every axiom true, the conjecture false; kernel-confirmed):")
        rendered = render_countermodel(model, [formula for _, formula in axioms], conjecture)
        lines.extend(f"%   {line}" for line in rendered.splitlines())
    return lines
