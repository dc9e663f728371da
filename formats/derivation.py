"""The plain data every reader produces: statements and their sources.

A derivation file and a problem file are both a :class:`Document`, a list
of named statements in the order they were written.  A statement's source
says where it came from: an :class:`Inference` from parent statements, or
an :class:`Origin` for a leaf (a file, an introduced definition, a theory).
Nothing here checks anything.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from checker.kernel.clauses import Clause
from checker.kernel.formulas import Formula
from checker.kernel.substitution import Substitution


class UnreadableInput(Exception):
    """Input that cannot be read, with the place where reading stopped."""

    def __init__(self, message: str, location: Location, excerpt: str = ""):
        super().__init__(f"{location}: {message}")
        self.message = message
        self.location = location
        self.excerpt = excerpt


@dataclass(frozen=True, slots=True)
class Location:
    file: str
    line: int
    column: int

    def __str__(self) -> str:
        return f"{self.file}:{self.line}:{self.column}"


@dataclass(frozen=True, slots=True)
class Parent:
    """A reference to a parent statement by name, with the bindings of the
    parent's variables if the derivation states them."""

    name: str
    bindings: Substitution | None = None


@dataclass(frozen=True, slots=True)
class Inference:
    """How a statement was derived.

    ``rule`` is the prover's own name for the inference and only a hint;
    ``status`` is the TPTP status of the conclusion relative to the parents
    (``thm``, ``esa``, ``cth`` ...).  A parent is a :class:`Parent` or, for
    an unnamed intermediate step, a nested :class:`Inference`.  ``evidence``
    and ``theta`` carry explicit kernel evidence when the format has it.
    """

    rule: str
    status: str | None
    parents: tuple[Parent | Inference, ...]
    evidence: object | None = None
    theta: Substitution | None = None
    info: tuple[str, ...] = ()


@dataclass(frozen=True, slots=True)
class Origin:
    """Where a leaf comes from: ``kind`` is ``file``, ``introduced``,
    ``theory`` or ``unknown``; ``detail`` holds the rest as written, e.g.
    ``("problem.p", "ax1")`` for a file source or ``("definition",)``."""

    kind: str
    detail: tuple[str, ...] = ()


@dataclass(frozen=True, slots=True)
class Finding:
    """A piece of evidence an elaborated certificate gives for a step: the
    answer (plain kernel data) to one question a check asks, of a kind
    (``refutation``, ``witness_pairings`` ...), under the question's key;
    or, for a leaf, the link to a problem formula (kind ``problem_link``,
    key its name, answer the SHA-256 of its text)."""

    kind: str
    key: str
    answer: object


@dataclass(frozen=True, slots=True)
class Statement:
    """One annotated formula or clause: a problem input or a derivation step."""

    name: str
    role: str
    language: str  # "cnf", "fof", "tff" or "thf"
    content: Clause | Formula
    location: Location
    source: Inference | Origin | None = None
    sorts: frozenset[str] | None = None
    """for a typed statement (sorts erased), the sorts its terms and
    variables have; None for an untyped one"""
    findings: tuple[Finding, ...] | None = None
    """for an elaborated certificate, the evidence found for this statement
    (its checks then answer their searches from it); None otherwise"""


@dataclass(frozen=True, slots=True)
class Notice:
    """Something a reader skipped or doubted without refusing the input."""

    message: str
    location: Location


@dataclass(frozen=True, slots=True)
class Document:
    """The statements of one file (with its includes), in written order."""

    path: str
    statements: tuple[Statement, ...]
    notices: tuple[Notice, ...] = field(default=())
    format: str = "tptp"
    files: tuple[str, ...] = ()
    """every file read for it: the file itself, then each included file"""
