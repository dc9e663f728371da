"""Linking the leaves of a derivation to the problem it claims to refute.

A derivation that may state its own axioms proves nothing: every leaf must
be a statement of the problem (by name and by content, up to renaming of
variables), a theory axiom or tautology the kernel can confirm, or it is
``failed`` as "not in the problem".  With no problem at all, leaves are
taken as assumptions and reported as such.
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.formula_steps import as_formula, check_introduced_leaf
from checker.freshness import SymbolTable
from checker.kernel.clauses import Clause
from checker.kernel.entailment import check_entailment
from checker.kernel.formulas import Formula, alpha_equivalent
from checker.kernel.rules import check_conclusion
from checker.outcomes import (
    ASSUMED,
    CHECKED,
    FAILED,
    StepResult,
)
from checker.plan import Step
from checker.search.entailment import find_entailment
from checker.search.reconstruct import SearchLimits
from checker.search.subsumption import find_theta
from formats.derivation import Document, Inference, Origin, Statement



def same_content(problem_content: Clause | Formula, leaf_content: Clause | Formula) -> bool:
    """Whether the leaf states the problem statement (or a weakening of a
    clause): clauses by a kernel-checked theta(problem clause) ⊆ leaf
    clause, anything else by alpha-equivalence of universal closures."""
    if isinstance(problem_content, Clause) and isinstance(leaf_content, Clause):
        theta = find_theta(problem_content, leaf_content)
        return theta is not None and check_conclusion(problem_content, leaf_content, theta) is None
    return alpha_equivalent(as_formula(problem_content), as_formula(leaf_content))


def _clause_form_of(problem_content: Formula, leaf_content: Clause, limits: SearchLimits) -> bool:
    """Whether a clause leaf follows from the formula it cites (a clause of
    its clause form), by a kernel-replayed refutation."""
    premise, conclusion = as_formula(problem_content), as_formula(leaf_content)
    chain = find_entailment([premise], conclusion, limits)
    return chain is not None and check_entailment([premise], conclusion, chain) is None


def equivalent_content(problem_content: Clause | Formula, leaf_content: Clause | Formula) -> bool:
    """Whether two statements say the same: clauses subsume each other
    (kernel-checked both ways), anything else alpha-equivalent closures.
    A conjecture must be stated exactly so: a weaker conjecture has a
    stronger negation."""
    if isinstance(problem_content, Clause) and isinstance(leaf_content, Clause):
        return same_content(problem_content, leaf_content) and same_content(leaf_content, problem_content)
    return alpha_equivalent(as_formula(problem_content), as_formula(leaf_content))


def _fail(step: Step, message: str, reason: str) -> StepResult:
    return StepResult(step.name, FAILED, "leaf", message, step.location, (f"reason: {reason}",))


def check_leaf(step: Step, problem: Document | None, limits: SearchLimits, table: SymbolTable) -> StepResult:
    """The outcome of a leaf: which problem statement it is, or why it is
    none; introduced and theory leaves need no problem.  A leaf with the
    role conjecture must state a conjecture of the problem exactly; any
    other leaf may weaken an axiom but never state a conjecture."""
    statement = step.statement
    assert statement is not None
    origin = statement.source if isinstance(statement.source, Origin) else Origin("unknown")
    if origin.kind in ("theory", "introduced"):
        return check_introduced_leaf(step, origin, table, limits)
    if problem is None:
        return StepResult(step.name, ASSUMED, "leaf", "taken as given: no problem to check it against", step.location)
    cited = origin.detail[1] if origin.kind == "file" and len(origin.detail) > 1 and origin.detail[1] else statement.name
    candidates = _by_name_first(problem.statements, cited)
    content = statement.content
    if statement.role == "conjecture":
        for candidate in candidates:
            if candidate.role == "conjecture" and equivalent_content(candidate.content, content):
                how = "" if candidate.name == cited else f" (cited as `{cited}`)"
                return StepResult(step.name, CHECKED, "leaf", f"conjecture `{candidate.name}` of the problem{how}", step.location)
        return _fail(step, f"not a conjecture of the problem: `{content}`", "not_a_problem_conjecture")
    stated_conjecture = None
    for candidate in candidates:
        if same_content(candidate.content, content) or (
            candidate.name == cited
            and isinstance(candidate.content, Formula)
            and isinstance(content, Clause)
            and _clause_form_of(candidate.content, content, limits)
        ):
            if candidate.role == "conjecture":
                stated_conjecture = stated_conjecture or candidate
                continue
            how = "" if candidate.name == cited else f" (cited as `{cited}`)"
            return StepResult(
                step.name, CHECKED, "leaf", f"{candidate.role} `{candidate.name}` of the problem{how}", step.location
            )
    if stated_conjecture is not None:
        return _fail(
            step, f"not in the problem as an axiom: it states the problem's conjecture `{stated_conjecture.name}`",
            "conjecture_as_axiom",
        )
    named = [c for c in problem.statements if c.name == cited]
    hint = f"; the problem's `{cited}` is `{named[0].content}`" if named else ""
    return _fail(step, f"not in the problem: `{content}`{hint}", "not_in_problem")


def _by_name_first(statements: Sequence[Statement], name: str) -> list[Statement]:
    """The problem's inputs, the cited one first.  A statement derived by an
    inference is no input of a problem, whatever file it stands in."""
    inputs = [s for s in statements if not isinstance(s.source, Inference)]
    named = [s for s in inputs if s.name == name]
    return named + [s for s in inputs if s.name != name]
