"""Where each symbol occurs, for the freshness of introduced symbols.

A Skolem symbol or a defined predicate is sound only if it is new: in no
problem formula, in no step other than the introducing step's descendants,
and introduced by exactly one step.  This table answers those questions
for the whole derivation at once.
"""

from __future__ import annotations

from collections.abc import Collection, Iterable
from dataclasses import dataclass, field
from itertools import pairwise

from checker.kernel.clauses import Clause
from checker.kernel.formulas import Formula, subformulas_with_polarity, symbols_of_formula
from checker.plan import Step
from checker.sorts import non_monotone_statements, sorts_of
from formats.derivation import Document, Location

Symbol = tuple[str, int]


def content_symbols(content: Clause | Formula) -> set[Symbol]:
    """Function and predicate symbols (name, arity) of a clause or formula."""
    if isinstance(content, Clause):
        return content.symbols()
    return set(symbols_of_formula(content))


def describe_symbol(symbol: Symbol) -> str:
    return f"{symbol[0]}/{symbol[1]}"


@dataclass(slots=True)
class SymbolTable:
    """Occurrences of symbols in the problem and in each stated step."""

    problem: dict[Symbol, tuple[str, Location]]
    locations: dict[str, Location]
    children: dict[str, list[str]]
    introducers: dict[Symbol, list[str]]
    order: dict[str, int]
    parents: dict[str, tuple[str, ...]]
    """each step's parents, sorted and without repeats"""
    contents: dict[str, Clause | Formula]
    leaf_introducers: dict[Symbol, str]
    """the first introduced leaf (an axiom of choice, a definition) in which
    each symbol occurs: a step using the symbol without citing the leaf
    is judged with the leaf as an extra premise, not as introducing it"""
    implicit_citations: dict[str, list[str]]
    """per such leaf, the steps that use its symbols without citing it"""
    sorts: frozenset[str] = frozenset()
    """the sorts of individuals of the problem and the derivation"""
    non_monotone: dict[str, str] = field(default_factory=dict)
    """problem statements with a naked variable in a positive equality (checker/sorts.py)"""
    planned: dict[str, Step] = field(default_factory=dict)
    """every planned step by name (stated or nested), for derivation-wide conditions"""
    polarities: dict[Symbol, dict[int, tuple[str, Location]]] = field(default_factory=dict)
    """per predicate, where it first occurs positively (+1) and negatively
    (-1) in the problem and the stated steps (conjectures counted negated)"""
    occurrences: dict[Symbol, list[str]] = field(default_factory=dict)
    """per symbol, the stated steps it occurs in, in checking order: a
    freshness question looks at these, not at every step (and no set of
    symbols per step is kept)"""
    introduced_by: dict[str, list[Symbol]] = field(default_factory=dict)
    """per introducing step, the symbols it introduces (``introducers`` turned round)"""

    def descendants(self, name: str) -> set[str]:
        found: set[str] = set()
        stack = [name]
        while stack:
            for child in self.children.get(stack.pop(), ()):
                if child not in found:
                    found.add(child)
                    stack.append(child)
        return found

    def co_introducers(self, step: str, new_symbols: Iterable[Symbol]) -> list[str]:
        """The other steps with exactly ``step``'s parents that introduce one
        of its new symbols, and theirs in turn, in checking order: clause-form
        conversion writes each clause of one Skolemized formula as a step of
        its own.  Their claims hold together or not at all, so they are
        checked as one introduction.  Parents are compared as the stated
        statements they rest on: a prover that writes each clause with its
        chain of formula steps as nested records gives every clause nested
        parents of its own."""
        if not self.parents.get(step):
            return []  # leaves introduce alone
        group = {step}
        symbols = set(new_symbols)
        pending = list(symbols)
        stated_parents = self.stated_parents(step)
        while pending:
            for other in self.introducers.get(pending.pop(), ()):
                if other not in group and self.stated_parents(other) == stated_parents:
                    group.add(other)
                    added = set(self.introducers_of(other)) - symbols
                    symbols |= added
                    pending.extend(added)
        return sorted(group - {step}, key=self.order.__getitem__)

    def stated_parents(self, step: str) -> tuple[str, ...]:
        """The stated statements ``step`` rests on, through its unstated
        (nested) parents, sorted."""
        found: set[str] = set()
        seen: set[str] = set()
        stack = list(self.parents.get(step, ()))
        while stack:
            parent = stack.pop()
            if parent in seen:
                continue
            seen.add(parent)
            if parent in self.contents:
                found.add(parent)
            else:
                stack.extend(self.parents.get(parent, ()))
        return tuple(sorted(found))

    def introducers_of(self, step: str) -> list[Symbol]:
        return self.introduced_by.get(step, [])

    def freshness_failure(self, step: str, new_symbols: Iterable[Symbol], peers: Iterable[str] = ()) -> str | None:
        """Why one of ``new_symbols`` introduced by ``step`` is not fresh, or
        None.  When two steps introduce a symbol, the later one (in checking
        order) is the one at fault, and the earlier is judged without it;
        ``peers``, introducing it together with ``step``, are no fault."""
        peers = set(peers)
        own_allowed: set[str] | None = None  # computed once, when a symbol occurs outside ``step``
        for symbol in sorted(new_symbols):
            if symbol in self.problem:
                name, location = self.problem[symbol]
                return (
                    f"new symbol `{describe_symbol(symbol)}` (in no parent) is not fresh: "
                    f"it occurs in the problem's `{name}` at {location}"
                )
            introducers = self.introducers.get(symbol, [])
            earlier = [s for s in introducers if self.order[s] < self.order[step] and s not in peers]
            if earlier:
                return (
                    f"new symbol `{describe_symbol(symbol)}` (in no parent) is not fresh: it was already "
                    f"introduced by step `{earlier[0]}` at {self.locations[earlier[0]]}"
                )
            users = [name for name in self.occurrences.get(symbol, ()) if name != step]
            if not users:
                continue
            if own_allowed is None:
                own_allowed = self.descendants(step) | {step}
                for user in self.implicit_citations.get(step, ()):
                    own_allowed |= self.descendants(user) | {user}
            allowed = own_allowed
            for later in introducers:
                if self.order[later] > self.order[step] or later in peers:
                    allowed = allowed | self.descendants(later) | {later}
            for name in users:
                if name not in allowed:
                    return (
                        f"new symbol `{describe_symbol(symbol)}` (in no parent) is not fresh: it occurs in step "
                        f"`{name}` at {self.locations[name]}, which does not descend from this step"
                    )
        return None


def build_symbol_table(
    steps: Iterable[Step], problem: Document | None, unlinked: frozenset[str] = frozenset()
) -> SymbolTable:
    """The table of a planned derivation.  The ``unlinked`` leaves (shown
    to be no statement of the problem) and the steps resting on them are
    no occurrences of anything: such a leaf fails, so the derivation is
    rejected at it whatever the other steps are, and what it says must not
    make an earlier Skolem or defined symbol look non-fresh, which would
    report the first failure away from its cause.  (They are still
    introducers, and their own freshness is judged as any step's.)"""
    steps = list(steps)
    problem_symbols: dict[Symbol, tuple[str, Location]] = {}
    for statement in problem.statements if problem else ():
        for symbol in content_symbols(statement.content):
            problem_symbols.setdefault(symbol, (statement.name, statement.location))
    children: dict[str, list[str]] = {}
    for s in steps:
        for parent in s.parents:
            children.setdefault(parent, []).append(s.name)
    left_out = set(unlinked)
    pending = list(unlinked)
    while pending:
        for child in children.get(pending.pop(), ()):
            if child not in left_out:
                left_out.add(child)
                pending.append(child)
    # Tuples, not sets (a small set takes some 200 bytes, and there is one
    # per statement), of one shared tuple per symbol.
    shared: dict[Symbol, Symbol] = {}
    stated_symbols = {
        s.name: tuple(shared.setdefault(symbol, symbol) for symbol in content_symbols(s.statement.content))
        for s in steps if s.statement is not None
    }
    step_symbols = {name: found for name, found in stated_symbols.items() if name not in left_out}
    introducers: dict[Symbol, list[str]] = {}
    leaf_introducers: dict[Symbol, str] = {}
    implicit_citations: dict[str, list[str]] = {}
    for s in steps:
        if s.statement is not None and s.is_leaf and _is_introduction(s):
            for symbol in _introducible(stated_symbols[s.name]):
                if symbol not in problem_symbols:  # not `- problem_symbols.keys()`: that walks every key
                    leaf_introducers.setdefault(symbol, s.name)
    # What each step hands on to its children: a stated step its own
    # symbols (the same tuple, not a copy), an unstated (nested) one what it
    # inherited from its parents.  Steps come parents first; a parent placed
    # later (on a cycle) has handed nothing on yet when its child's turn comes.
    handed_on: dict[str, Collection[Symbol]] = {}
    for s in steps:
        judged = s.statement is not None and (not s.is_leaf or _is_introduction(s))
        inherited = _inherited(s, handed_on) if judged or s.statement is None else set()
        handed_on[s.name] = stated_symbols[s.name] if s.statement is not None else inherited
        if not judged:
            continue
        for symbol in _introducible(stated_symbols[s.name]) - inherited:
            if s.is_leaf or symbol not in leaf_introducers:
                introducers.setdefault(symbol, []).append(s.name)
            else:
                implicit_citations.setdefault(leaf_introducers[symbol], []).append(s.name)
    sorts = sorts_of([*(problem.statements if problem else ()), *(s.statement for s in steps if s.statement)])
    occurrences: dict[Symbol, list[str]] = {}
    for name, symbols in step_symbols.items():
        for symbol in symbols:
            occurrences.setdefault(symbol, []).append(name)
    introduced_by: dict[str, list[Symbol]] = {}
    for symbol, names in introducers.items():
        for name in names:
            introduced_by.setdefault(name, []).append(symbol)
    return SymbolTable(
        problem_symbols,
        {s.name: s.location for s in steps},
        children,
        introducers,
        {s.name: number for number, s in enumerate(steps)},
        {s.name: _sorted_once(s.parents) for s in steps},
        {s.name: s.statement.content for s in steps if s.statement is not None},
        leaf_introducers,
        implicit_citations,
        sorts,
        # only several sorts make a naked variable matter (checker/sorts.py)
        non_monotone_statements(problem.statements) if problem and len(sorts) > 1 else {},
        {s.name: s for s in steps},
        _polarities(problem, [s for s in steps if s.name not in left_out]),
        occurrences,
        introduced_by,
    )


def _polarities(problem: Document | None, steps: list[Step]) -> dict[Symbol, dict[int, tuple[str, Location]]]:
    """Where each predicate first occurs with each polarity, over every
    formula of the problem and the derivation.  A conjecture is refuted
    through its negation, so its polarities count reversed; under an
    equivalence a predicate occurs with both."""
    statements = [*(problem.statements if problem else ()), *(s.statement for s in steps if s.statement is not None)]
    found: dict[Symbol, dict[int, tuple[str, Location]]] = {}
    for statement in statements:
        content = statement.content
        turn = -1 if statement.role == "conjecture" else 1
        if isinstance(content, Clause):  # literals directly: no walk over their (maybe deep) terms
            atoms = [(literal.atom, 1 if literal.positive else -1) for literal in content.literals]
        else:
            atoms = [(f.atom, polarity) for f, polarity in subformulas_with_polarity(content) if f.atom is not None]
        for atom, polarity in atoms:
            if atom.symbol == "=" or atom.symbol.startswith("$"):
                continue
            where = found.setdefault((atom.symbol, atom.arity), {})
            for sign in (polarity * turn,) if polarity else (1, -1):
                where.setdefault(sign, (statement.name, statement.location))
    return found


def _is_introduction(step: Step) -> bool:
    source = step.statement.source if step.statement else None
    return getattr(source, "kind", None) == "introduced"


def _sorted_once(names: tuple[str, ...]) -> tuple[str, ...]:
    """The names sorted, without repeats (the same tuple when it already is)."""
    if all(first < second for first, second in pairwise(names)):
        return names
    return tuple(sorted(set(names)))


def _inherited(step: Step, handed_on: dict[str, Collection[Symbol]]) -> set[Symbol]:
    """The symbols a step's parents hand on to it (made when asked, so that
    the table keeps no set per step)."""
    return set().union(*(handed_on.get(parent, ()) for parent in step.parents))


def _introducible(symbols: Iterable[Symbol]) -> set[Symbol]:
    """Equality and TPTP's defined ``$`` symbols are interpreted, never introduced."""
    return {s for s in symbols if s[0] != "=" and not s[0].startswith("$")}


def new_symbols_of(content: Clause | Formula) -> set[Symbol]:
    """The symbols a statement could introduce."""
    return _introducible(content_symbols(content))


def new_symbols(claimed: Clause | Formula, premises: Iterable[Clause | Formula]) -> set[Symbol]:
    """Symbols of the claimed statement that no premise has."""
    found = new_symbols_of(claimed)
    for premise in premises:
        found -= content_symbols(premise)
    return found
