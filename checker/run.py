"""Checking a whole certificate: read, plan, check every step, add it up.

This is the public entry point (``checker.check``).  It never raises for
bad input: an unreadable file gives an ``unreadable`` report with the
place where reading stopped, and an unexpected error inside assay gives an
``internal_error`` report, never an accepted one.
"""

from __future__ import annotations

import os
import traceback
from collections import Counter
from collections.abc import Sequence
from dataclasses import replace

from checker.assumptions import check_branch_step, trace_branches
from checker.certified_steps import checked_with_findings, shared_answers
from checker.collection import collector_paused_while_reading, derivation_read
from checker.conditions import conjecture_cautions, one_conjecture_at_a_time, reaches_refutation
from checker.dependence import mark_unfounded
from checker.freshness import build_symbol_table
from checker.leaves import check_leaf, unlinked_leaves
from checker.nested import check_with_nested
from checker.notes import introduced_symbols, notes_on
from checker.outcomes import (
    ACCEPTED,
    INTERNAL_ERROR,
    UNPROVEN,
    UNREADABLE,
    Report,
    StepResult,
    verdict_of,
)
from checker.parallel import map_in_processes
from checker.parallel_reading import read_in_parts
from checker.plan import make_plan, with_cited_problem_statements
from checker.progress import Progress
from checker.prover_order import derivation_order
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from checker.splitting import with_splitting_details
from checker.steps import StepContext, check_inference
from checker.tables import file_scope
from checker.time_limit import TIME_LIMIT_REASON, Deadline, run_before
from formats.derivation import Document, Location, Origin, Statement, UnreadableInput
from formats.limits import DEFAULT_INPUT_LIMITS, InputLimits, bounded
from formats.native import read_native, read_native_header
from formats.tptp import read_tptp

UNCHECKED_SHOWN = 50

NO_PROBLEM_CAUTION = (
    "no problem was given: the leaves were taken as assumptions, so this shows only that "
    "the conclusion follows from them, not from the problem's axioms"
)


def read_document(path: str, include_dirs: Sequence[str] = (), jobs: int = 1) -> Document:
    """Read a native certificate (JSON Lines) or a TPTP file, by content;
    a large one in parts, over ``jobs`` processes."""
    with open(path, encoding="utf-8", errors="replace") as handle:  # the reader reports bad bytes
        start = handle.read(4096).lstrip("\ufeff \t\r\n")
    native = path.endswith(".jsonl") or start.startswith("{")
    in_parts = read_in_parts(path, native, include_dirs, jobs)
    if in_parts is not None:
        return in_parts
    return read_native(path) if native else read_tptp(path, include_dirs)


def read_problem(path: str, include_dirs: Sequence[str] = (), jobs: int = 1) -> Document:
    """Read a TPTP problem; a large one in parts, over ``jobs`` processes."""
    in_parts = read_in_parts(path, False, include_dirs, jobs)
    return in_parts if in_parts is not None else read_tptp(path, include_dirs)


def check(
    path: str,
    problem: str | None = None,
    include_dirs: Sequence[str] = (),
    limits: SearchLimits = DEFAULT_LIMITS,
    jobs: int = 1,
    require_problem: bool = False,
    deadline: Deadline | None = None,
    progress: Progress | None = None,
    input_limits: InputLimits = DEFAULT_INPUT_LIMITS,
) -> Report:
    """Check the certificate at ``path``, against the problem file if given
    (or found), spreading the steps over ``jobs`` processes.  With
    ``require_problem``, a certificate with no problem to link its leaves to
    is unreadable rather than checked on assumptions.  Steps not checked
    before the ``deadline`` are left unchecked (``unproven``, reason
    ``time_limit``) and listed in a caution; ``progress`` hears of every
    step done; ``input_limits`` bound what the readers accept."""
    try:
        with file_scope(), bounded(input_limits), collector_paused_while_reading():
            return _check(path, problem, tuple(include_dirs), limits, jobs, require_problem, deadline, progress)
    except UnreadableInput as error:
        text = f"{error.location}: {error.message}"
        if error.excerpt:
            text += "\n" + error.excerpt
        return Report(path, UNREADABLE, problem=problem, error=text)
    except OSError as error:
        return Report(path, UNREADABLE, problem=problem, error=f"{path}: cannot read: {error.strerror or error}")
    except Exception as error:  # noqa: BLE001 - a bug must never turn into a verdict
        return Report(path, INTERNAL_ERROR, problem=problem, error=describe_internal_error(error))


def describe_internal_error(error: BaseException) -> str:
    """One line for a bug in assay: what was raised and where, no traceback."""
    frames = traceback.extract_tb(error.__traceback__)
    where = f" at {os.path.basename(frames[-1].filename)}:{frames[-1].lineno}" if frames else ""
    return f"internal error in assay ({type(error).__name__}: {error}{where}); nothing was accepted; please report it"


def cited_problems(path: str, document: Document) -> list[str]:
    """The problem files a certificate names: the native header's
    ``problem``, or the files its leaves' ``file(...)`` sources cite, the
    most cited first."""
    if document.format == "native":
        named = read_native_header(path).problem
        return [named] if named else []
    cited = Counter(
        statement.source.detail[0]
        for statement in document.statements
        if isinstance(statement.source, Origin) and statement.source.kind == "file" and statement.source.detail
    )
    return [name for name, _ in cited.most_common() if name]


def discover_problem(path: str, names: Sequence[str], include_dirs: Sequence[str]) -> str | None:
    """The first named problem found next to the certificate or in an
    include directory (never the certificate itself)."""
    for name in names:
        for directory in (os.path.dirname(path), *include_dirs):
            candidate = os.path.join(directory, name)
            if os.path.isfile(candidate) and os.path.abspath(candidate) != os.path.abspath(path):
                return candidate
    return None


def _statements_or_unreadable(document: Document) -> Document:
    """A file with no statement at all is not a derivation or a problem."""
    if not document.statements:
        skipped = f" (skipped: {document.notices[0].message})" if document.notices else ""
        raise UnreadableInput(f"no statements found{skipped}", Location(document.path, 1, 1))
    return document


def _include_dirs(include_dirs: tuple[str, ...]) -> tuple[str, ...]:
    from_environment = os.environ.get("TPTP")
    return include_dirs + ((from_environment,) if from_environment else ())


def _refuse_problem(
    path: str,
    problem_path: str | None,
    cited: list[str],
    document: Document,
    include_dirs: tuple[str, ...],
    require_problem: bool,
) -> None:
    """Raise when the problem situation makes the certificate uncheckable:
    a problem the native header names is missing, a required problem is
    absent, or the problem is the certificate itself."""
    elsewhere = " or in the include directories" if include_dirs else ""
    if not problem_path and cited and document.format == "native":
        raise UnreadableInput(
            f"the problem the header names, {cited[0]}, was not found next to the certificate{elsewhere}",
            Location(path, 1, 1),
        )
    if require_problem and not problem_path:
        named = f" (its leaves cite {', '.join(cited)}, not found)" if cited else ""
        raise UnreadableInput(f"no problem given or found{named}, and one is required", Location(path, 1, 1))
    if problem_path and os.path.exists(problem_path) and os.path.samefile(problem_path, path):
        raise UnreadableInput("the problem given is the certificate itself", Location(problem_path, 1, 1))


def _check(
    path: str,
    problem_path: str | None,
    include_dirs: tuple[str, ...],
    limits: SearchLimits,
    jobs: int,
    require_problem: bool,
    deadline: Deadline | None = None,
    progress: Progress | None = None,
) -> Report:
    include_dirs = _include_dirs(include_dirs)
    document = _statements_or_unreadable(read_document(path, include_dirs, jobs))
    cited = [] if problem_path else cited_problems(path, document)
    problem_path = problem_path or discover_problem(path, cited, include_dirs)
    _refuse_problem(path, problem_path, cited, document, include_dirs, require_problem)
    problem = _statements_or_unreadable(read_problem(problem_path, include_dirs, jobs)) if problem_path else None
    document = with_cited_problem_statements(document, problem)
    plan = make_plan(document)
    conjectures = None if problem is None else tuple(s.content for s in problem.statements if s.role == "conjecture")
    unlinked = unlinked_leaves(plan.steps, problem, limits)
    context = StepContext(limits, build_symbol_table(plan.steps, problem, frozenset(unlinked)), conjectures)
    derivation_read()
    statements: dict[str, Statement] = {}
    for statement in document.statements:
        statements.setdefault(statement.name, statement)  # as the plan does: a duplicate is not a step
    nested = _nested_by_outer(plan)
    branches = trace_branches(plan, statements)
    shared = shared_answers(statements.values())
    order = derivation_order(statements, problem.statements if problem is not None else None) if nested else None

    def check_step(step, parents):
        return check_branch_step(step, parents, branches, statements, limits) or check_inference(step, parents, context)

    cheap_context = replace(context, limits=limits.cheap())
    single_context = replace(context, limits=limits.single())

    def cheap_step(step, parents):
        return check_branch_step(step, parents, branches, statements, limits) or check_inference(
            step, parents, cheap_context)

    def single_step(step, parents):
        return check_branch_step(step, parents, branches, statements, limits) or check_inference(
            step, parents, single_context)

    def results_for(step) -> list[StepResult]:
        """The results a stated step contributes (its searches recorded, or
        answered from an elaborated certificate), then any duplicate of its name."""
        found = checked_with_findings(step, statements.get(step.name), problem, lambda: own_results(step), shared)
        return found + [duplicate for duplicate in plan.duplicates if duplicate.name == step.name]

    def own_results(step) -> list[StepResult]:
        """Its nested records' results and its own (or its structural fault)."""
        inner = nested.get(step.name, [])
        found = [plan.faults[s.name] for s in (*inner, step) if s.name in plan.faults]
        if not found and inner:
            found = check_with_nested(step, inner, statements, check_step, cheap_step, order, single_step)
        elif not found and step.is_leaf:
            found = [unlinked.get(step.name) or check_branch_step(step, [], branches, statements, limits)
                     or check_leaf(step, problem, limits, context.symbols)]
        elif not found:
            found = [check_step(step, [statements.get(name) for name in step.parents])]
        return found

    def results_in_time(step) -> list[StepResult]:
        found = run_before(deadline, results_for, step)
        return found if found is not None else [left_unchecked(step, deadline)]

    stated = [step for step in plan.steps if step.statement is not None]
    if progress is not None:
        progress.start(len(stated), os.path.basename(path))
    results = [
        result
        for found in map_in_processes(results_for if deadline is None else results_in_time, stated, jobs,
                                      progress.advance if progress is not None else None)
        for result in found
    ]
    results = one_conjecture_at_a_time(plan, statements, problem, results)
    results.extend(reaches_refutation(document))
    results = with_splitting_details(results, plan, branches, statements)
    results = mark_unfounded(results, plan.steps)
    verdict = verdict_of(results)
    cautions = []
    if problem is None and verdict == ACCEPTED:
        cautions.append(NO_PROBLEM_CAUTION)
        if cited:
            cautions.append(f"the leaves cite {', '.join(cited)}, which was not found next to the derivation"
                            + (" or in the include directories" if include_dirs else ""))
    if problem is not None and verdict == ACCEPTED:
        cautions.extend(conjecture_cautions(plan, statements, problem))
    unchecked = [result.name for result in results if result.reason == TIME_LIMIT_REASON]
    if unchecked:
        cautions.append(unchecked_caution(deadline, unchecked))
    return Report(
        path, verdict, tuple(results), document.notices, problem_path, cautions=tuple(cautions),
        files=document.files + (problem.files if problem else ()),
        notes=notes_on(plan, context.symbols), introduced=introduced_symbols(context.symbols),
    )


def left_unchecked(step, deadline: Deadline) -> StepResult:
    """The result of a step the time limit stopped (or never let start)."""
    return StepResult(
        step.name, UNPROVEN, step.inference.rule if step.inference else "leaf",
        f"not checked: {deadline.describe()}", step.location, (f"reason: {TIME_LIMIT_REASON}",),
    )


def unchecked_caution(deadline: Deadline, names: list[str]) -> str:
    shown = ", ".join(names[:UNCHECKED_SHOWN])
    more = f" and {len(names) - UNCHECKED_SHOWN} more (each a step with reason {TIME_LIMIT_REASON})" \
        if len(names) > UNCHECKED_SHOWN else ""
    return f"{deadline.describe()}: {len(names)} steps left unchecked: {shown}{more}"


def _nested_by_outer(plan) -> dict[str, list]:
    """The nested-record steps of each statement, parents first."""
    found: dict[str, list] = {}
    for step in plan.steps:
        if step.statement is None:
            found.setdefault(step.name.rpartition("/")[0], []).append(step)
    return found
