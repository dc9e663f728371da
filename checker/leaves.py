"""Linking the leaves of a derivation to the problem it claims to refute.

A derivation that may state its own axioms proves nothing: every leaf must
be a statement of the problem (by name and by content, up to renaming of
variables), a theory axiom or tautology the kernel can confirm, or it is
``failed`` as "not in the problem".  With no problem at all, leaves are
taken as assumptions and reported as such.

Provers restate what they copy: bound variables renamed and reordered,
conjuncts and disjuncts reordered, equations turned round.  Such a leaf is
linked to the problem statement it cites (or, citing none that fits, to
one its content restates, see checker/search/restatement.py) by a
kernel-replayed entailment: the problem statement entails an axiom leaf,
and a conjecture leaf and the problem's conjecture entail each other.
"""

from __future__ import annotations

from collections.abc import Iterable, Iterator
from dataclasses import dataclass
from functools import lru_cache

from checker.formula_steps import as_formula, check_introduced_leaf
from checker.freshness import SymbolTable
from checker.kernel.clauses import Clause
from checker.kernel.entailment import Cover, check_entailment
from checker.kernel.formulas import Formula, alpha_equivalent, symbols_of_formula
from checker.kernel.rules import Chain, check_conclusion
from checker.outcomes import (
    ASSUMED,
    CHECKED,
    FAILED,
    UNPROVEN,
    StepResult,
)
from checker.plan import Step
from checker.search.entailment import find_consequence
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from checker.search.restatement import restates, shape_of
from checker.search.subsumption import find_theta
from formats.derivation import Document, Inference, Origin, Statement

PROPOSED_SCALE = 4
"""How much further the entailment search may go for a statement the leaf
restates (it holds; only the search may fall short, on nested equivalences)."""

CONTENT_CANDIDATES = 3
"""Problem statements, besides the cited one, whose restatement a leaf's
entailment is sought from: the first that the content matches."""


def same_content(problem_content: Clause | Formula, leaf_content: Clause | Formula) -> bool:
    """Whether the leaf states the problem statement (or a weakening of a
    clause): clauses by a kernel-checked theta(problem clause) ⊆ leaf
    clause, anything else by alpha-equivalence of universal closures."""
    if isinstance(problem_content, Clause) and isinstance(leaf_content, Clause):
        if problem_content.literal_set <= leaf_content.literal_set:  # copied as it stands: no theta to search for
            return check_conclusion(problem_content, leaf_content) is None
        theta = find_theta(problem_content, leaf_content)
        return theta is not None and check_conclusion(problem_content, leaf_content, theta) is None
    return alpha_equivalent(as_formula(problem_content), as_formula(leaf_content))


def restated(problem_content: Clause | Formula, leaf_content: Clause | Formula, limits: SearchLimits) -> bool:
    """Whether the leaf proposes itself as the problem statement in another
    order (a proposal only: nothing is accepted on it)."""
    return restates(shape_of(as_formula(problem_content)), shape_of(as_formula(leaf_content)), limits.subsumption_nodes)


def entailment(premise: Clause | Formula, conclusion: Clause | Formula, limits: SearchLimits) -> Chain | Cover | None:
    """A cover or a refutation, checked by the kernel, showing premise ⊨
    conclusion; None when none is found within the bounds.  A restatement
    that reorders the sides of a disjunction under an equivalence has the
    same clauses, which a cover matches at once, where the refutation
    search must split cases through the definitions the clausifier names."""
    return _entailment(as_formula(premise), as_formula(conclusion), limits)


def _confirmed(
    premise: Clause | Formula, conclusion: Clause | Formula, limits: SearchLimits, proposed: bool
) -> Chain | Cover | None:
    """An entailment, searched further when the conclusion restates the premise."""
    chain = entailment(premise, conclusion, limits)
    if chain is None and proposed:
        chain = entailment(premise, conclusion, limits.scaled(PROPOSED_SCALE))
    return chain


@lru_cache(maxsize=256)
def _entailment(premise: Formula, conclusion: Formula, limits: SearchLimits) -> Chain | Cover | None:
    # Cached: the same conjecture is compared for its leaf, for each step
    # that negates it, and when the report names it.
    chain = find_consequence([premise], conclusion, limits)
    return chain if chain is not None and check_entailment([premise], conclusion, chain) is None else None


def _equivalence(
    problem_content: Clause | Formula, leaf_content: Clause | Formula, limits: SearchLimits
) -> str | None:
    """How the two statements were shown to say the same, or None."""
    if isinstance(problem_content, Clause) and isinstance(leaf_content, Clause):
        if same_content(problem_content, leaf_content) and same_content(leaf_content, problem_content):
            return ""
    elif alpha_equivalent(as_formula(problem_content), as_formula(leaf_content)):
        return ""
    if symbols_of_formula(as_formula(problem_content)) != symbols_of_formula(as_formula(leaf_content)):
        return None
    proposed = restated(problem_content, leaf_content, limits)
    there = _confirmed(problem_content, leaf_content, limits, proposed)
    back = there and _confirmed(leaf_content, problem_content, limits, proposed)
    if not back:
        return None
    how = "restated" if proposed else "equivalent"
    return f", {how} (kernel checked both ways: {_inferences(there)} and {_inferences(back)})"


def equivalent_content(
    problem_content: Clause | Formula, leaf_content: Clause | Formula, limits: SearchLimits = DEFAULT_LIMITS
) -> bool:
    """Whether two statements say the same: clauses subsume each other, or
    formulas are alpha-equivalent closures, or failing that (when they
    share their symbols) each entails the other by a kernel-replayed
    refutation.  A conjecture must be stated so: a weaker conjecture has a
    stronger negation, and a stronger one is not the problem's."""
    return _equivalence(problem_content, leaf_content, limits) is not None


def _inferences(chain: Chain | Cover) -> str:
    if isinstance(chain, Cover):
        return "a cover (each clause subsumed by one of the other side's)"
    return f"a refutation in {len(chain.steps)} inference{'s' if len(chain.steps) != 1 else ''}"


def _fail(step: Step, message: str, reason: str) -> StepResult:
    return StepResult(step.name, FAILED, "leaf", message, step.location, (f"reason: {reason}",))


def _checked(step: Step, candidate: Statement, cited: str, how: str = "") -> StepResult:
    cites = isinstance(step.statement.source, Origin) and step.statement.source.kind == "file"
    named = "" if candidate.name == cited else f" (cited as `{cited}`)" if cites else " (by content)"
    return StepResult(
        step.name, CHECKED, "leaf", f"{candidate.role} `{candidate.name}` of the problem{named}{how}", step.location
    )


def _unconfirmed(step: Step, candidate: Statement) -> StepResult:
    return StepResult(
        step.name, UNPROVEN, "leaf",
        f"restates {candidate.role} `{candidate.name}` of the problem in another order, but no kernel-replayed "
        "entailment was found within the search bounds (see --search-limit)",
        step.location, (f"problem: `{candidate.content}`",),
    )


def check_leaf(step: Step, problem: Document | None, limits: SearchLimits, table: SymbolTable) -> StepResult:
    """The outcome of a leaf: which problem statement it is, or why it is
    none; introduced and theory leaves need no problem.  A leaf with the
    role conjecture must be equivalent to a conjecture of the problem; any
    other leaf may weaken an axiom but never state a conjecture."""
    statement = step.statement
    assert statement is not None
    origin = _origin(statement)
    if origin.kind in ("theory", "introduced"):
        return check_introduced_leaf(step, origin, table, limits)
    if problem is None:
        return StepResult(step.name, ASSUMED, "leaf", "taken as given: no problem to check it against", step.location)
    return _linked(step, origin, problem, limits)


def unlinked_leaves(steps: Iterable[Step], problem: Document | None, limits: SearchLimits) -> dict[str, StepResult]:
    """The failures of the leaves that cite the problem and do not link to
    it (not in the problem, a conjecture stated as an axiom ...), by name,
    checked before the rest: the derivation is rejected at each whatever
    else holds, and the run reports exactly these results for them."""
    if problem is None:
        return {}
    found = {}
    for step in steps:
        if step.is_leaf and step.statement is not None and _origin(step.statement).kind not in ("theory", "introduced"):
            result = _linked(step, _origin(step.statement), problem, limits)
            if result.outcome == FAILED:
                found[step.name] = result
    # These searches ran outside any step's recording (checker/search/findings.py):
    # forget their cached answers, so that each leaf's own check asks again where it is recorded.
    _entailment.cache_clear()
    return found


def _origin(statement: Statement) -> Origin:
    return statement.source if isinstance(statement.source, Origin) else Origin("unknown")


def _linked(step: Step, origin: Origin, problem: Document, limits: SearchLimits) -> StepResult:
    """The leaf linked to the problem statement it cites (or one it states)."""
    statement = step.statement
    cited = origin.detail[1] if origin.kind == "file" and len(origin.detail) > 1 and origin.detail[1] else statement.name
    inputs = _problem_inputs(problem)
    if statement.role == "conjecture":
        return _check_conjecture_leaf(step, list(inputs.conjectures), cited, limits)
    return _check_axiom_leaf(step, inputs, cited, limits)


def _check_conjecture_leaf(step: Step, conjectures: list[Statement], cited: str, limits: SearchLimits) -> StepResult:
    content = step.statement.content
    for candidate in conjectures:
        how = _equivalence(candidate.content, content, limits)
        if how is not None:
            return _checked(step, candidate, cited, how)
    for candidate in conjectures:
        if restated(candidate.content, content, limits):
            return _unconfirmed(step, candidate)
    return _fail(
        step, f"not a conjecture of the problem: `{content}`{_closest(conjectures, cited, content)}",
        "not_a_problem_conjecture",
    )


def _check_axiom_leaf(step: Step, inputs: _ProblemInputs, cited: str, limits: SearchLimits) -> StepResult:
    """Cheapest first (see :func:`_tries`); a statement the leaf restates but
    that the search could not confirm leaves it unproven, not failed."""
    content = step.statement.content
    stated_conjecture = None
    unconfirmed = None
    for candidate, same in _tries(inputs, cited, content, limits):
        if same:
            if not same_content(candidate.content, content):
                continue
            if candidate.role == "conjecture":
                stated_conjecture = stated_conjecture or candidate
                continue
            return _checked(step, candidate, cited)
        is_restated = candidate.name != cited or restated(candidate.content, content, limits)
        if candidate.role == "conjecture":
            if is_restated:
                stated_conjecture = stated_conjecture or candidate
            continue
        chain = _confirmed(candidate.content, content, limits, is_restated)
        if chain is not None:
            how = ", restated" if is_restated else ", as a consequence"
            return _checked(step, candidate, cited, f"{how} (kernel checked {_inferences(chain)})")
        if is_restated and unconfirmed is None:
            unconfirmed = candidate
    if stated_conjecture is not None:
        return _fail(
            step, f"not in the problem as an axiom: it states the problem's conjecture `{stated_conjecture.name}`",
            "conjecture_as_axiom",
        )
    if unconfirmed is not None:
        return _unconfirmed(step, unconfirmed)
    candidates = inputs.by_name.get(cited, []) + [c for c in inputs.statements if c.name != cited]
    return _fail(step, f"not in the problem: `{content}`{_closest(candidates, cited, content)}", "not_in_problem")


def _tries(
    inputs: _ProblemInputs, cited: str, content: Clause | Formula, limits: SearchLimits
) -> Iterator[tuple[Statement, bool]]:
    """(problem statement, whether to ask for the same content rather than
    an entailment), in the order worth trying: the cited statement as the
    same content, then entailing the leaf; any other as the same content;
    then, by entailment, the first few others the leaf restates."""
    named = inputs.by_name.get(cited, [])
    yield from ((c, True) for c in named)
    yield from ((c, False) for c in named)
    yield from ((c, True) for c in inputs.statements if c.name != cited)
    restating = (c for c in inputs.statements if c.name != cited and restated(c.content, content, limits))
    for _, candidate in zip(range(CONTENT_CANDIDATES), restating):
        yield candidate, False


def _closest(candidates: list[Statement], cited: str, content: Clause | Formula) -> str:
    """The problem statement a reader should compare the leaf with: the
    cited one, else the one sharing most symbols with it."""
    named = [c for c in candidates if c.name == cited]
    if named:
        return f"; the problem's `{cited}` is `{named[0].content}`"
    symbols = symbols_of_formula(as_formula(content))
    shared = [len(symbols & symbols_of_formula(as_formula(c.content))) for c in candidates]
    if not shared or max(shared) == 0:
        return ""
    closest = candidates[shared.index(max(shared))]
    return f"; the closest problem statement is `{closest.name}`: `{closest.content}`"


@dataclass(frozen=True, slots=True)
class _ProblemInputs:
    """The problem's inputs, indexed once per problem so that linking each
    leaf costs a look-up rather than a pass over the problem.  A statement
    derived by an inference is no input of a problem, whatever file it
    stands in."""

    statements: tuple[Statement, ...]
    by_name: dict[str, list[Statement]]
    conjectures: tuple[Statement, ...]
    first_named: dict[str, Statement]
    """the first statement of each name, derived or not (what a
    certificate's link to a problem formula names)"""


_last_indexed: tuple = (None, None)  # (problem, its inputs), replaced as one value


def _problem_inputs(problem: Document) -> _ProblemInputs:
    global _last_indexed
    indexed_problem, inputs = _last_indexed
    if indexed_problem is not problem:
        statements = tuple(s for s in problem.statements if not isinstance(s.source, Inference))
        by_name: dict[str, list[Statement]] = {}
        for statement in statements:
            by_name.setdefault(statement.name, []).append(statement)
        first_named: dict[str, Statement] = {}
        for statement in problem.statements:
            first_named.setdefault(statement.name, statement)
        conjectures = tuple(s for s in statements if s.role == "conjecture")
        inputs = _ProblemInputs(statements, by_name, conjectures, first_named)
        _last_indexed = (problem, inputs)
    return inputs


def problem_statement_named(problem: Document, name: str) -> Statement | None:
    """The problem's first statement of this name (a look-up, not a pass)."""
    return _problem_inputs(problem).first_named.get(name)


def forget_indexed_problem() -> None:
    """Drop the index of the last problem (between files)."""
    global _last_indexed
    _last_indexed = (None, None)
