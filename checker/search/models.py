"""Counter-model search: a finite interpretation in which a step's premises
hold and its conclusion fails.

Untrusted.  The premises and the negated conclusion are turned into clauses
by the kernel's clausifier; for each domain size from 1 up, the clauses'
ground instances over the domain are encoded as a propositional problem
and handed to a SAT solver (python-sat).  Function applications are
flattened first: ``p(f(X))`` becomes ``f(X) != Y | p(Y)``, and each entry of
a function table is a group of value variables of which exactly one is
true.  A solver model is decoded into an :class:`Interpretation` of the
step's own symbols and returned only when the kernel's
``confirm_countermodel`` agrees.  The search is bounded by counts (domain
size, ground clauses, solver conflicts), never by time.
"""

from __future__ import annotations

from collections import OrderedDict
from collections.abc import Sequence
from dataclasses import dataclass
from itertools import combinations, product

from pysat.solvers import Solver

from checker.kernel.clauses import Clause, Literal
from checker.kernel.entailment import entailment_clausification
from checker.kernel.formulas import ATOM, Formula, subformulas_with_polarity
from checker.kernel.models import Interpretation, confirm_countermodel
from checker.kernel.terms import Term, application, post_order
from checker.search.findings import nothing_without_search

Symbol = tuple[str, int]
SOLVER = "glucose4"


@dataclass(frozen=True, slots=True)
class FlatLiteral:
    """``[~]p(v..)``, ``[~]v = w`` or ``[~]f(v..) = w`` over numbered
    variables: ``kind`` is ``predicate``, ``equality`` or ``function``;
    ``result`` is the value variable of a function literal."""

    kind: str
    positive: bool
    symbol: Symbol | None
    arguments: tuple[int, ...]
    result: int = -1


@dataclass(frozen=True, slots=True)
class FlatClause:
    variable_count: int
    literals: tuple[FlatLiteral, ...]


def flatten(clause: Clause) -> FlatClause:
    """The clause with every function application named by a variable:
    ``C[f(t)]`` becomes ``f(t) != Y | C[Y]``, innermost applications first,
    one variable per distinct subterm."""
    slots: dict[Term, int] = {}
    definitions: list[FlatLiteral] = []

    def slot(term: Term) -> int:
        stack = [term]
        while stack:
            current = stack[-1]
            if current in slots:
                stack.pop()
                continue
            pending = [a for a in current.arguments if a not in slots]
            if pending:
                stack.extend(pending)
                continue
            stack.pop()
            slots[current] = len(slots)
            if not current.is_variable:
                arguments = tuple(slots[a] for a in current.arguments)
                symbol = (current.symbol, current.arity)
                definitions.append(FlatLiteral("function", False, symbol, arguments, slots[current]))
        return slots[term]

    literals = []
    for literal in clause.literals:
        atom = literal.atom
        arguments = tuple(slot(a) for a in atom.arguments)
        if atom.symbol == "=" and atom.arity == 2:
            literals.append(FlatLiteral("equality", literal.positive, None, arguments))
        else:
            literals.append(FlatLiteral("predicate", literal.positive, (atom.symbol, atom.arity), arguments))
    return FlatClause(len(slots), (*definitions, *literals))


GROUND_NAME = "ground#"
"""Prefix of the constants that name ground terms (no TPTP word has ``#``)."""


def name_ground_terms(clauses: Sequence[Clause]) -> list[Clause]:
    """The clauses with every ground compound term replaced by a constant
    of its own, defined by a unit clause ``f(c1..cn) = c``: satisfiable
    exactly when the clauses are.  Flattening then gives a deeply nested
    ground term one variable per definition instead of one per subterm in
    every clause that holds it, so a ground instance count of
    ``size ** depth`` becomes ``depth * size ** (arity + 2)``."""
    names: dict[Term, Term] = {}
    definitions: list[Clause] = []

    def name(term: Term) -> Term:
        for current in post_order(term, names):
            if current.is_variable or not current.ground:
                continue
            if not current.arguments:
                names[current] = current
                continue
            constant = application(f"{GROUND_NAME}{len(definitions)}")
            named = application(current.symbol, tuple(names[a] for a in current.arguments))
            definitions.append(Clause([Literal(True, application("=", (named, constant)))]))
            names[current] = constant
        return names.get(term) or rebuilt(term)

    def rebuilt(term: Term) -> Term:
        built: dict[Term, Term] = {}
        for current in post_order(term):
            if current.ground:
                built[current] = names[current]
            else:
                built[current] = current if current.is_variable else application(
                    current.symbol, tuple(built[a] for a in current.arguments))
        return built[term]

    named = [
        Clause([Literal(l.positive, application(l.atom.symbol, tuple(name(a) for a in l.atom.arguments)))
                for l in clause.literals])
        for clause in clauses
    ]
    return named + definitions


def _signature(atoms) -> tuple[set[Symbol], set[Symbol]]:
    """The predicate and the function symbols of some atoms."""
    predicates: set[Symbol] = set()
    functions: set[Symbol] = set()
    for atom in atoms:
        if not (atom.symbol == "=" and atom.arity == 2):
            predicates.add((atom.symbol, atom.arity))
        stack = list(atom.arguments)
        while stack:
            term = stack.pop()
            if not term.is_variable:
                functions.add((term.symbol, term.arity))
                stack.extend(term.arguments)
    return predicates, functions


def _atoms(statement: Clause | Formula):
    if isinstance(statement, Clause):
        return [literal.atom for literal in statement.literals]
    return [f.atom for f, _ in subformulas_with_polarity(statement) if f.connective == ATOM]


class _Encoding:
    """Propositional variables for one domain size, numbered from 1: each
    predicate and function symbol owns a block of numbers, one per tuple
    of domain elements (a function's arguments followed by its value), so
    that a ground literal's number is computed, not looked up."""

    def __init__(self, size: int):
        self.size = size
        self.blocks: dict[tuple[str, Symbol], tuple[int, int]] = {}
        """(kind, symbol) -> (first number, tuple width)"""
        self.count = 0

    def _block(self, kind: str, symbol: Symbol) -> tuple[int, int]:
        block = self.blocks.get((kind, symbol))
        if block is None:
            width = symbol[1] + (kind == "function")
            block = self.blocks[(kind, symbol)] = (self.count + 1, width)
            self.count += self.size**width
        return block

    def _weights(self, width: int) -> list[int]:
        return [self.size ** (width - 1 - place) for place in range(width)]

    def number(self, key: tuple) -> int:
        kind, symbol, arguments = key[:3]
        first, width = self._block(kind, symbol)
        places = (*arguments, *key[3:])
        return first + sum(value * weight for value, weight in zip(places, self._weights(width)))

    @property
    def numbers(self) -> dict[tuple, int]:
        """Every key with its number, for decoding a solver's model."""
        found: dict[tuple, int] = {}
        for (kind, symbol), (first, width) in self.blocks.items():
            for offset, places in enumerate(product(range(self.size), repeat=width)):
                if kind == "function":
                    found[(kind, symbol, places[:-1], places[-1])] = first + offset
                else:
                    found[(kind, symbol, places)] = first + offset
        return found

    def ground(self, clause: FlatClause) -> list[list[int]]:
        equalities = []
        compiled = []
        for literal in clause.literals:
            if literal.kind == "equality":
                equalities.append((literal.arguments[0], literal.arguments[1], literal.positive))
                continue
            first, width = self._block(literal.kind, literal.symbol)
            places = (*literal.arguments, literal.result) if literal.kind == "function" else literal.arguments
            terms = tuple(zip(places, self._weights(width)))
            compiled.append((1 if literal.positive else -1, first, terms))
        grounded = []
        for values in product(range(self.size), repeat=clause.variable_count):
            if any((values[a] == values[b]) == positive for a, b, positive in equalities):
                continue  # an equality literal true: the instance holds
            grounded.append([sign * (first + sum(values[v] * w for v, w in terms)) for sign, first, terms in compiled])
        return grounded

    def function_tables(self, function: Symbol) -> list[list[int]]:
        """Exactly one value for each argument tuple of ``function``."""
        constraints = []
        for arguments in product(range(self.size), repeat=function[1]):
            values = [self.number(("function", function, arguments, v)) for v in range(self.size)]
            constraints.append(values)
            constraints.extend([-a, -b] for a, b in combinations(values, 2))
        return constraints


def _ground_clause_count(size: int, clauses: Sequence[FlatClause], functions: set[Symbol]) -> int:
    per_entry = 1 + size * (size - 1) // 2
    return sum(size**c.variable_count for c in clauses) + sum(size**arity * per_entry for _, arity in functions)


def solve(problem: list[list[int]], conflicts: int) -> set[int] | bool | None:
    """The true variables of a model of the propositional ``problem``,
    False when it has none, None when the solver gave up after about
    ``conflicts`` conflicts (at least one)."""
    with Solver(name=SOLVER, bootstrap_with=problem) as solver:
        solver.conf_budget(max(1, conflicts))
        answer = solver.solve_limited()
        if not answer:
            return answer
        return {n for n in solver.get_model() if n > 0}


_FOUND: OrderedDict[tuple, tuple[int, int, Interpretation]] = OrderedDict()
"""Counter-models found lately, by premises and conclusion, with the
ground-clause and conflict bounds they were found under: the search
screens a step with small bounds before the checker asks again with its
own.  Domain sizes are tried in order and the solver is deterministic, so
a search with bounds at least as large finds the same model; only then is
the remembered one returned, and a result never depends on what was
asked before."""
_REMEMBERED = 256


def forget_countermodels() -> None:
    """Forget the remembered counter-models (between files)."""
    _FOUND.clear()


@nothing_without_search
def find_countermodel(
    premises: Sequence[Clause | Formula],
    conclusion: Clause | Formula,
    max_domain: int = 4,
    limit: int = 100_000,
    conflicts: int = 100_000,
) -> Interpretation | None:
    """A kernel-confirmed interpretation of at most ``max_domain`` elements
    in which the premises are true and the conclusion false, or None when
    there is none that small or a bound (``limit`` ground clauses per
    domain size, ``conflicts`` solver conflicts) was reached first."""
    key = (tuple(premises), conclusion)
    known = _FOUND.get(key)
    if known is not None and known[0] <= limit and known[1] <= conflicts and known[2].size <= max_domain:
        return known[2]
    found = _search(premises, conclusion, max_domain, limit, conflicts)
    if found is not None:
        _FOUND[key] = (limit, conflicts, found)
        if len(_FOUND) > _REMEMBERED:
            _FOUND.popitem(last=False)
    return found


def _search(
    premises: Sequence[Clause | Formula], conclusion: Clause | Formula, max_domain: int, limit: int, conflicts: int
) -> Interpretation | None:
    clausification = entailment_clausification(premises, conclusion)
    named = name_ground_terms(clausification.clauses)
    clauses = [flatten(clause) for clause in named]
    _, functions = _signature(literal.atom for clause in named for literal in clause.literals)
    own_predicates, own_functions = _signature(a for s in (*premises, conclusion) for a in _atoms(s))
    functions |= own_functions
    for size in range(1, max_domain + 1):
        if _ground_clause_count(size, clauses, functions) > limit:
            return None
        encoding = _Encoding(size)
        problem = [g for clause in clauses for g in encoding.ground(clause)]
        for function in sorted(functions):
            problem.extend(encoding.function_tables(function))
        true = solve(problem, conflicts)
        if true is None:
            return None
        if true is False:
            continue
        model = {key for key, n in encoding.numbers.items() if n in true}
        interpretation = Interpretation(
            size,
            {
                f: {key[2]: key[3] for key in model if key[0] == "function" and key[1] == f}
                for f in sorted(own_functions)
            },
            {
                p: frozenset(key[2] for key in model if key[0] == "predicate" and key[1] == p)
                for p in sorted(own_predicates)
            },
        )
        if confirm_countermodel(interpretation, premises, conclusion) is None:
            return interpretation
        # A decoded model the kernel refuses would be a bug of this module;
        # it is never returned, and larger domains are still tried.
    return None
