"""Run one mutant through assay and say whether assay's answer is right.

The expected answer is settled before assay is asked: by construction
(mutation_kinds.py), or by mutation_oracle.py on the mutated step as the
reader read it (premises = its parents, or the problem for a leaf).  Then:

* an unsound mutant must not be accepted, and the JSON report's
  ``first_failure.step`` must be the mutated step (or one of its nested
  records, ``step/1`` ...);
* a sound mutant may be accepted; rejecting it *at that step* is a false
  rejection (a failure later, where a descendant no longer follows from
  the weaker claim, is right);
* an undecided mutant is reported only if assay accepts it, for review.

A native certificate states its evidence (inline, or as version 2
findings keyed by the step's premises and claim): a sound claim whose
stated evidence no longer fits it fails (``failed``, never ``refuted``),
which is right for a certificate and counted on its own.
"""

from __future__ import annotations

import os
import tempfile
from collections import Counter, defaultdict
from contextlib import contextmanager
from dataclasses import dataclass

from mutation_formats import is_leaf, origin_file, parent_names
from mutation_kinds import SOUND, UNSOUND, Mutant, symbols
from mutation_oracle import OracleGaveUp, countermodel_size, ground_entailment, is_interpreted

from checker.kernel.clauses import Clause
from checker.kernel.formulas import NOT, make
from checker.report import report_json
from checker.run import check, read_document
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from checker.tables import file_scope
from formats.derivation import Inference, UnreadableInput
from formats.tptp import read_tptp

FALSE_ACCEPT = "false accept"
WRONG_STEP = "wrong first step"
UNPROVEN_THEN_LATER = "step unproven, later failed"
FALSE_REJECTION = "false rejection"
STATED_EVIDENCE_REJECTED = "sound, stated evidence rejected"
ACCEPTED_UNDECIDED = "accepted, oracle undecided"
RIGHT = "right"
UNREADABLE_MUTANT = "mutant unreadable"
INTERNAL_ERROR = "internal error"


@dataclass(frozen=True, slots=True)
class Outcome:
    kind: str
    shape: str
    expected: str
    """unsound, sound or undecided"""
    verdict: str
    first_step: str | None
    judgement: str
    where: str
    """fixture, mutant index and mutated step, to reproduce it"""


@contextmanager
def reading_once():
    """Within it, a file whose text was read before is not parsed again: the
    problem of a fixture is the same for all its mutants, and a mutant is read
    by the judge and by the check.  The reader is a pure function of the
    text, so the checks are the same; only faster."""
    import mutation_harness as harness

    from checker import run

    cache: dict[tuple, object] = {}
    original = run.read_tptp

    def read_tptp_once(path: str, include_dirs=()):
        with open(path, "rb") as handle:
            key = (path, tuple(include_dirs), handle.read())
        if key not in cache:
            if len(cache) > 256:
                cache.clear()
            cache[key] = original(path, include_dirs)
        return cache[key]

    run.read_tptp, harness.read_tptp = read_tptp_once, read_tptp_once
    try:
        with file_scope():  # cached documents outlive each check: keep their terms interned
            yield
    finally:
        run.read_tptp, harness.read_tptp = original, original


@contextmanager
def reusing_checked_steps():
    """Within it, a step whose statement and parents are exactly those of a
    step checked before keeps that earlier success (never a failure), so the
    unchanged part of a mutated derivation is not searched again.

    This can only turn a rejection into an acceptance, never the reverse: a
    run that finds no false accept with it finds none without it.  (It can
    hide a failure of an unchanged step caused by the mutation elsewhere,
    such as a symbol that is no longer fresh; such a mutant then shows up
    as accepted, or fails at the mutated step.)"""
    from checker import run
    from checker.search import findings

    cache: dict = {}
    original = run.check_inference

    def check_inference_once(step, parents, context):
        if isinstance(findings._active.get(), findings.Replayer):
            return original(step, parents, context)  # answered from a certificate's findings, which may differ
        try:
            key = (step, tuple(parents), context.limits, context.conjectures)
            hash(key)
        except TypeError:
            return original(step, parents, context)
        if key in cache:
            return cache[key]
        result = original(step, parents, context)
        if result.outcome in ("checked", "reconstructed"):
            if len(cache) > 50_000:
                cache.clear()
            cache[key] = result
        return result

    run.check_inference = check_inference_once
    try:
        with file_scope():  # cached results outlive each check: keep their terms interned
            yield
    finally:
        run.check_inference = original


def leaf_justifications(problem) -> list[list]:
    """What a leaf may follow from: the problem's axioms (a satisfiable set),
    or one negated conjecture (a conjecture negated) alone.  The axioms and
    the negated conjecture together are unsatisfiable, so they are never
    taken at once: a leaf is unsound when each of these has a counter-model."""
    axioms = [s.content for s in problem if s.role not in ("conjecture", "negated_conjecture")]
    negated = [[make(NOT, (s.content,)) if s.role == "conjecture" else s.content]
               for s in problem if s.role in ("conjecture", "negated_conjecture")]
    return [axioms, *negated]


def _premises(statement, statements: dict, problem) -> list | None:
    """What an inference step's claim must follow from, or None if a parent is missing."""
    premises = []
    by_name = {s.name: s for s in problem}
    stack = [statement.source]
    while stack:
        inference = stack.pop()
        for parent in inference.parents:
            if isinstance(parent, Inference):
                stack.append(parent)
                continue
            cited = statements.get(parent.name) or by_name.get(parent.name)
            if cited is None:
                return None
            content = cited.content
            if cited.role == "conjecture":
                content = make(NOT, (content,))
            elif parent.bindings is not None and isinstance(content, Clause):
                content = content.instance(parent.bindings)
            premises.append(content)
    return premises


def judge(mutant: Mutant, path: str) -> str:
    """unsound, sound or undecided: for this mutant, by construction or by the oracle.

    Every symbol the valid derivation introduces (Skolem functions, defined
    and split symbols) is fresh, so together its introductions are a
    conservative extension of the problem: they are taken as background
    premises, and a claim that follows with them is not called unsound."""
    if mutant.expected is not None:
        return mutant.expected
    try:
        document = read_document(path) if mutant.fixture.format != "tptp" else read_tptp(path)
    except UnreadableInput:
        return "undecided"
    problem = read_tptp(str(mutant.fixture.problem)).statements if mutant.fixture.problem else ()
    statements: dict = {}
    for s in document.statements:
        statements.setdefault(s.name, s)
    statement = statements.get(mutant.step)
    if statement is None or (is_leaf(statement) and not problem):
        return "undecided"
    if is_leaf(statement) and origin_file(statement) is None:
        return "undecided"  # an introduced leaf (a definition, an assumption): any fresh one may do
    if is_leaf(statement):
        groups = leaf_justifications(problem)
        if any(is_interpreted(p) for group in groups for p in group) or is_interpreted(statement.content):
            return "undecided"
        if all(countermodel_size(group, statement.content) is not None for group in groups):
            return UNSOUND
        return "undecided"  # a leaf must be the problem's own statement, not just follow from the problem
    premises = _premises(statement, statements, problem)
    if premises is None or any(is_interpreted(p) for p in [*premises, statement.content]):
        return "undecided"
    original, background = _original(mutant)
    if original is not None and not is_leaf(original) and original.name not in background:
        original_premises = _premises(original, _ORIGINALS[str(mutant.fixture.path)][0], problem)
        if original_premises is None or countermodel_size(original_premises, original.content, (1, 2)) is not None:
            return "undecided"  # an assumption or a step of its own kind: not a plain consequence
    if original is not None and original.name in background:
        # An introduction (Skolemization, definition): another definition of a fresh
        # symbol, or another witness, may be just as sound; only the kinds that
        # are wrong by construction (reuse, missing argument) are judged.
        return "undecided"
    extra = [content for name, content in background.items() if name != mutant.step]
    if countermodel_size([*premises, *extra], statement.content) is not None:
        return UNSOUND
    if ground_entailment(premises, statement.content):
        return SOUND
    return "undecided"


_ORIGINALS: dict[str, tuple[dict, dict]] = {}


def _original(mutant: Mutant):
    """The valid derivation's statement of this name, and its introductions (name → content)."""
    key = str(mutant.fixture.path)
    if key not in _ORIGINALS:
        statements: dict = {}
        for s in read_document(key).statements:
            statements.setdefault(s.name, s)
        problem = read_tptp(str(mutant.fixture.problem)).statements if mutant.fixture.problem else ()
        known = set()
        for s in problem:
            known |= symbols(s.content)
        background = {}
        for s in _parents_first(statements):
            new = symbols(s.content) - known
            if new and not is_interpreted(s.content):
                background[s.name] = s.content
            known |= new
        _ORIGINALS[key] = (statements, background)
    statements, background = _ORIGINALS[key]
    return statements.get(mutant.step), background


def _parents_first(statements: dict) -> list:
    """The statements with every statement after its parents (iterative), so
    that a symbol's first statement is its introduction even in a file that
    prints the refutation first and its premises after it."""
    ordered, placed, entered = [], set(), set()
    for root in statements:
        stack = [(root, False)]
        while stack:
            name, expanded = stack.pop()
            if name in placed or name not in statements:
                continue
            if expanded:
                placed.add(name)
                ordered.append(statements[name])
                continue
            if name in entered:  # a cycle: leave it where it was met
                continue
            entered.add(name)
            stack.append((name, True))
            stack.extend((parent, False) for parent in reversed(parent_names(statements[name])) if parent not in placed)
    return ordered


def _at_step(first: str | None, step: str) -> bool:
    return first is not None and (first == step or first.startswith(step + "/"))


def run_mutant(mutant: Mutant, limits: SearchLimits = DEFAULT_LIMITS) -> Outcome:
    """Write the mutant next to nothing else, check it against its problem, and judge the answer."""
    suffix = mutant.fixture.path.suffix
    with tempfile.TemporaryDirectory() as scratch:
        path = os.path.join(scratch, f"mutant{suffix}")
        with open(path, "w", encoding="utf-8") as handle:
            handle.write(mutant.text)
        try:
            expected = judge(mutant, path)
        except OracleGaveUp:
            expected = "undecided"
        problem = str(mutant.fixture.problem) if mutant.fixture.problem else None
        report = report_json(check(path, problem=problem, limits=limits))
    verdict = report["verdict"]
    first = report["first_failure"]["step"] if report["first_failure"] else None
    if verdict == "internal_error":
        judgement = INTERNAL_ERROR
    elif verdict == "unreadable":
        judgement = UNREADABLE_MUTANT
    elif expected == UNSOUND:
        if verdict == "accepted":
            judgement = FALSE_ACCEPT
        elif _at_step(first, mutant.step) or any(_at_step(first, step) for step in mutant.citing):
            judgement = RIGHT
        elif any(_at_step(s["name"], mutant.step) and s["outcome"] == "unproven" for s in report["steps"]):
            judgement = UNPROVEN_THEN_LATER
        else:
            judgement = WRONG_STEP
    elif expected == SOUND:
        if verdict == "rejected" and _at_step(first, mutant.step):
            stated = mutant.fixture.format != "tptp" and report["first_failure"]["outcome"] == "failed"
            judgement = STATED_EVIDENCE_REJECTED if stated else FALSE_REJECTION
        else:
            judgement = RIGHT
    else:
        judgement = ACCEPTED_UNDECIDED if verdict == "accepted" else RIGHT
    return Outcome(mutant.kind, mutant.fixture.shape, expected, verdict, first, judgement, where_of(mutant))


def where_of(mutant: Mutant) -> str:
    """The fixture, mutant index and mutated step: enough to make the mutant again."""
    return f"{mutant.fixture.path.relative_to(mutant.fixture.path.parents[2])}#{mutant.index} ({mutant.step})"


def tally(outcomes: list[Outcome]) -> str:
    """A table by kind: mutants, unsound / sound / undecided, and each kind of wrong answer."""
    columns = (FALSE_ACCEPT, WRONG_STEP, UNPROVEN_THEN_LATER, FALSE_REJECTION, STATED_EVIDENCE_REJECTED,
               ACCEPTED_UNDECIDED, UNREADABLE_MUTANT, INTERNAL_ERROR)
    by_kind: dict[str, Counter] = defaultdict(Counter)
    for outcome in outcomes:
        for key in (outcome.kind, "ALL"):
            by_kind[key]["mutants"] += 1
            by_kind[key][outcome.expected] += 1
            by_kind[key][outcome.judgement] += 1
    header = f"{'kind':28} {'mutants':>7} {'unsound':>7} {'sound':>6} {'undec.':>6} | " + " | ".join(
        f"{c:>{max(6, len(c))}}" for c in columns)
    lines = [header, "-" * len(header)]
    for kind in sorted(by_kind, key=lambda k: (k == "ALL", k)):
        row = by_kind[kind]
        lines.append(f"{kind:28} {row['mutants']:7} {row[UNSOUND]:7} {row[SOUND]:6} {row['undecided']:6} | "
                     + " | ".join(f"{row[c]:>{max(6, len(c))}}" for c in columns))
    return "\n".join(lines)
