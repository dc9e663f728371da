"""Evidence found once, written down, and answered from the page later.

Every search whose result reaches the kernel is a question: "a refutation
of these premises and this negated conclusion", "a pairing of these new
symbols with quantifiers", "evidence for this clause step".  While a
derivation is checked for ``assay elaborate``, a :class:`Recorder` keeps
the answers the searches gave, keyed by the question (:func:`question_key`);
when an elaborated certificate is checked, a :class:`Replayer` answers the
same questions from the certificate's findings and never searches.

An answer from a certificate is a claim: before it is handed on, the
kernel re-checks it against the question actually asked, and a wrong one
raises :class:`EvidenceRejected` (the step fails, it is never trusted).  A
question the certificate does not answer gets "nothing found"; a search
that has no findings kind (:func:`searching`) marks the step as searched.
Only questions asked outside any other search are recorded: what a search
asks itself is part of how it found its answer, not part of the answer.
"""

from __future__ import annotations

import functools
import hashlib
from collections.abc import Callable, Collection, Iterator, Mapping, Sequence
from contextlib import contextmanager
from contextvars import ContextVar
from dataclasses import dataclass, field

from checker.kernel.clauses import Clause
from checker.kernel.entailment import Cover, check_cover, check_entailment
from checker.kernel.failure import Failure
from checker.kernel.formulas import Formula, render_formula, symbols_of_formula
from checker.kernel.introductions import skolemize
from checker.kernel.propositional import check_unit_entailment
from checker.kernel.rules import check_clause_step, check_conclusion
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, render
from formats.derivation import Finding, Statement

# The kinds of finding, as the native certificate (version 2) names them.
REFUTATION = "refutation"
COVER = "cover"
CLAUSE_EVIDENCE = "clause_evidence"
PAIRINGS = "witness_pairings"
MATCHING = "matching"
LEMMAS = "unit_lemmas"
DEFINITION = "definition"
PROBLEM_LINK = "problem_link"
FINDING_KINDS = (REFUTATION, COVER, CLAUSE_EVIDENCE, PAIRINGS, MATCHING, LEMMAS, DEFINITION, PROBLEM_LINK)


class EvidenceRejected(Exception):
    """A certificate's answer that the kernel does not accept."""

    def __init__(self, kind: str, failure: Failure):
        super().__init__(failure.message)
        self.kind = kind
        self.failure = failure


def _canonical(value: object) -> str:
    """A text that names the value: formulas and terms in TPTP syntax."""
    if isinstance(value, Formula):
        return render_formula(value)
    if isinstance(value, Term):
        return render(value)
    if isinstance(value, Clause):
        return str(value)
    if isinstance(value, Substitution):
        return "{" + ", ".join(f"{render(v)}: {render(t)}" for v, t in value.items_sorted()) + "}"
    if isinstance(value, (set, frozenset)):
        return "{" + ", ".join(sorted(_canonical(item) for item in value)) + "}"
    if isinstance(value, (list, tuple)):
        return "[" + ", ".join(_canonical(item) for item in value) + "]"
    return repr(value)


def question_key(kind: str, parts: Sequence[object]) -> str:
    """The key of a question: the kind and the first 32 hex digits of the
    SHA-256 of the canonical text of what it is about."""
    text = kind + "\n" + "\n".join(_canonical(part) for part in parts)
    return hashlib.sha256(text.encode("utf-8")).hexdigest()[:32]


@dataclass(slots=True)
class Recorder:
    """Keeps the answers given to the questions a step's check asks."""

    findings: dict[str, Finding] = field(default_factory=dict)
    depth: int = 0
    nested: tuple[Statement, ...] | None = None
    """the nested records of the step, as the check settled them: each
    stated with the conclusion and evidence it was checked with (the outer
    step last, its parents now names); None for a step without any"""


@dataclass(slots=True)
class Replayer:
    """Answers a step's questions from its findings; ``searched`` says a
    search with no findings kind ran, ``used`` which findings were asked."""

    findings: Mapping[str, Finding]
    searched: bool = False
    used: set[str] = field(default_factory=set)


_active: ContextVar[Recorder | Replayer | None] = ContextVar("findings", default=None)


@contextmanager
def answering(mode: Recorder | Replayer | None) -> Iterator[Recorder | Replayer | None]:
    """Record (or replay) the questions asked inside the block."""
    token = _active.set(mode)
    try:
        yield mode
    finally:
        _active.reset(token)


def hook(
    kind: str,
    question: Callable[..., Sequence[object]],
    keep: Callable[[object], object | None],
    give: Callable[[tuple, dict, object], object],
    nothing: Callable[[], object],
):
    """Decorate a search: ``question(*args, **kwargs)`` names what it is
    asked, ``keep(result)`` is the answer to record (None: nothing found),
    ``give(args, kwargs, answer)`` re-checks an answer from a certificate
    and returns it as the search would (raising EvidenceRejected), and
    ``nothing()`` is what the search returns when it finds nothing."""

    def decorate(search):
        @functools.wraps(search)
        def answered(*args, **kwargs):
            mode = _active.get()
            if isinstance(mode, Replayer):
                key = question_key(kind, question(*args, **kwargs))
                found = mode.findings.get(key)
                if found is None or found.kind != kind:
                    return nothing()
                mode.used.add(key)
                return give(args, kwargs, found.answer)
            if mode is None or mode.depth:
                return search(*args, **kwargs)
            mode.depth += 1
            try:
                result = search(*args, **kwargs)
            finally:
                mode.depth -= 1
            answer = keep(result)
            if answer is not None:
                key = question_key(kind, question(*args, **kwargs))
                mode.findings[key] = Finding(kind, key, answer)
            return result

        return answered

    return decorate


def note_nested(statements: Sequence[Statement]) -> None:
    """Record how a step's nested records were settled (while recording);
    the outer step comes last."""
    mode = _active.get()
    if isinstance(mode, Recorder):
        mode.nested = (*(mode.nested or ()), *statements)


def searching(search):
    """Decorate a search that has no findings kind: replaying, it runs and
    marks the step as searched (so it cannot count as checked)."""

    @functools.wraps(search)
    def marked(*args, **kwargs):
        mode = _active.get()
        if isinstance(mode, Replayer):
            mode.searched = True
        return search(*args, **kwargs)

    return marked


def nothing_without_search(search):
    """Decorate a search whose "nothing found" is always a safe answer (a
    counter-model, which can only reject): replaying, it is not run."""

    @functools.wraps(search)
    def skipped(*args, **kwargs):
        if isinstance(_active.get(), Replayer):
            return None
        return search(*args, **kwargs)

    return skipped


def argument_of(args: tuple, kwargs: dict, position: int, name: str, default: object = None) -> object:
    return args[position] if len(args) > position else kwargs.get(name, default)


def _reject_if(kind: str, failure: Failure | None) -> None:
    if failure is not None:
        raise EvidenceRejected(kind, failure)


# Checks of the answers ------------------------------------------------------


def checked_refutation(premises: Sequence, conclusion, chain):
    """A refutation of premises ∧ ¬conclusion, replayed by the kernel."""
    _reject_if(REFUTATION, check_entailment(premises, conclusion, chain))
    return chain


def checked_cover(premises: Sequence, conclusion, cover: Cover) -> Cover:
    """A cover of the conclusion's clauses by the premises', re-checked by the kernel."""
    _reject_if(COVER, check_cover(premises, conclusion, cover))
    return cover


def checked_clause_evidence(premises: Sequence[Clause], claimed: Clause, answer: tuple):
    """Clause-step evidence and the theta of its conclusion test."""
    evidence, theta = answer
    _reject_if(CLAUSE_EVIDENCE, check_clause_step(list(premises), claimed, evidence, theta))
    return answer


def checked_matching(general: Clause, specific: Clause, theta: Substitution) -> Substitution:
    _reject_if(MATCHING, check_conclusion(general, specific, theta))
    return theta


def checked_lemmas(premises: Sequence, conclusion, lemmas: Sequence[Clause]) -> list[Clause]:
    _reject_if(LEMMAS, check_unit_entailment(premises, conclusion, list(lemmas)))
    return list(lemmas)


def checked_pairing(
    premises: Sequence[Formula], new: Collection[tuple[str, int]], pairing: Sequence[tuple[int, Formula, Term, Term]]
) -> None:
    """Each witness is a term of one of the step's new symbols that the
    kernel can put for its quantifier, in turn; no symbol witnesses two
    quantifiers, and none occurs in any premise."""
    present = set().union(*(symbols_of_formula(p) for p in premises)) if premises else set()
    used: set[tuple[str, int]] = set()
    current = list(premises)
    for premise, quantifier, bound, witness in pairing:
        symbol = (witness.symbol, len(witness.arguments))
        if not 0 <= premise < len(current):
            raise EvidenceRejected(PAIRINGS, Failure("pairing_premise", f"there is no premise {premise}"))
        if symbol not in new:
            raise EvidenceRejected(PAIRINGS, Failure(
                "not_a_new_symbol", f"witness `{witness}` is not a term of a symbol the step introduces"))
        if symbol in present or symbol in used:
            raise EvidenceRejected(PAIRINGS, Failure(
                "witness_reused", f"Skolem symbol `{witness.symbol}` occurs in a premise or witnesses twice"))
        used.add(symbol)
        replaced = skolemize(current[premise], quantifier, {bound: witness})
        if isinstance(replaced, Failure):
            raise EvidenceRejected(PAIRINGS, replaced)
        current[premise] = replaced
