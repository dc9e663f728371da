"""The mutation harness's own judge of a step: is it sound, independently of assay?

Two questions, each answered with python-sat and nothing of assay's
checking code (only its data classes, to hold what the reader read):

* ``countermodel_size``: is there a finite interpretation (domain of 1, 2
  or 3 elements, equality as identity) in which every premise is true and
  the conclusion false?  Found, the step is certainly unsound.  The search
  is exhaustive for each size: the formulas are grounded over the domain
  (functions as one-hot value tables, quantifiers expanded) into a
  propositional problem, and the SAT solver decides it.
* ``ground_entailment``: for premises and conclusion that are ground and
  have no equality, does propositional reasoning alone show the
  conclusion?  Shown, the step is certainly sound.

Anything else is undecided, and the harness says so rather than guess.
Standard model theory (finite models; Herbrand's theorem for the ground
case), common practice for testing a checker.
"""

from __future__ import annotations

import itertools

from pysat.solvers import Solver

from checker.kernel.clauses import Clause
from checker.kernel.formulas import (
    AND,
    ATOM,
    EXISTS,
    FALSE,
    FORALL,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    NOT,
    OR,
    TRUE,
    XOR,
    Formula,
)
from checker.kernel.terms import Term

SIZES = (1, 2, 3)
MAX_CLAUSES = 400_000


class _TooLarge(Exception):
    """The grounding outgrew the budget: the question stays undecided."""


def is_interpreted(content) -> bool:
    """Arithmetic and other ``$`` symbols have a fixed meaning a finite
    uninterpreted model does not respect: such steps stay undecided."""
    return any(symbol.startswith("$") for symbol, _ in _symbols(content))


def _symbols(content) -> set[tuple[str, int]]:
    found: set[tuple[str, int]] = set()
    for term in _atoms(content):
        stack = [term]
        while stack:
            t = stack.pop()
            if not t.is_variable:
                if t.symbol != "=":
                    found.add((t.symbol, len(t.arguments)))
                stack.extend(t.arguments)
    return found


def _atoms(content) -> list[Term]:
    if isinstance(content, Clause):
        return [literal.atom for literal in content.literals]
    atoms, stack = [], [content]
    while stack:
        formula = stack.pop()
        if formula.connective == ATOM:
            atoms.append(formula.atom)
        stack.extend(formula.arguments)
    return atoms


class _Grounding:
    """Premises and a negated conclusion over a domain of ``size`` elements, as clauses."""

    def __init__(self, size: int):
        self.size = size
        self.clauses: list[list[int]] = []
        self.count = 0
        self.predicate: dict[tuple, int] = {}
        self.function: dict[tuple, int] = {}
        self.tables: set[tuple[str, tuple[int, ...]]] = set()
        self.true = self._new()
        self.clauses.append([self.true])

    def _new(self) -> int:
        self.count += 1
        return self.count

    def _add(self, clause: list[int]) -> None:
        self.clauses.append(clause)
        if len(self.clauses) > MAX_CLAUSES:
            raise _TooLarge

    def _value(self, symbol: str, arguments: tuple[int, ...], value: int) -> int:
        key = (symbol, arguments, value)
        if key not in self.function:
            self.function[key] = self._new()
            if (symbol, arguments) not in self.tables:
                self.tables.add((symbol, arguments))
        return self.function[key]

    def close_tables(self) -> None:
        """Every function has exactly one value at every argument tuple."""
        for symbol, arguments in self.tables:
            options = [self._value(symbol, arguments, v) for v in range(self.size)]
            self._add(options)
            for a, b in itertools.combinations(options, 2):
                self._add([-a, -b])

    def _choices(self, term: Term, env: dict[Term, int]) -> list[tuple[int, tuple[int, ...]]]:
        """(value, function-table literals that give it) for each way the tables may go."""
        if term.is_variable:
            return [(env[term], ())]
        found = []
        per_argument = [self._choices(argument, env) for argument in term.arguments]
        for combination in itertools.product(*per_argument):
            arguments = tuple(value for value, _ in combination)
            conditions = tuple(c for _, conds in combination for c in conds)
            for value in range(self.size):
                found.append((value, conditions + (self._value(term.symbol, arguments, value),)))
        return found

    def _gate(self, kind: str, inputs: list[int]) -> int:
        """A fresh variable equivalent to the AND / OR of ``inputs``."""
        if not inputs:
            return self.true if kind == AND else -self.true
        if len(inputs) == 1:
            return inputs[0]
        out = self._new()
        if kind == AND:
            for i in inputs:
                self._add([-out, i])
            self._add([out, *(-i for i in inputs)])
        else:
            for i in inputs:
                self._add([out, -i])
            self._add([-out, *inputs])
        return out

    def _iff(self, a: int, b: int) -> int:
        return self._gate(OR, [self._gate(AND, [a, b]), self._gate(AND, [-a, -b])])

    def atom(self, atom: Term, env: dict[Term, int]) -> int:
        if atom.symbol == "=" and len(atom.arguments) == 2:
            left, right = (self._choices(t, env) for t in atom.arguments)
            ways = [self._gate(AND, list(lc + rc)) for lv, lc in left for rv, rc in right if lv == rv]
            return self._gate(OR, ways)
        ways = []
        for combination in itertools.product(*(self._choices(t, env) for t in atom.arguments)):
            arguments = tuple(value for value, _ in combination)
            key = (atom.symbol, arguments)
            if key not in self.predicate:
                self.predicate[key] = self._new()
            conditions = [c for _, conds in combination for c in conds]
            ways.append(self._gate(AND, [*conditions, self.predicate[key]]))
        return self._gate(OR, ways)

    def formula(self, formula: Formula, env: dict[Term, int]) -> int:
        connective = formula.connective
        if connective == ATOM:
            return self.atom(formula.atom, env)
        if connective == TRUE:
            return self.true
        if connective == FALSE:
            return -self.true
        if connective in (FORALL, EXISTS):
            parts = []
            for values in itertools.product(range(self.size), repeat=len(formula.variables)):
                inner = dict(env)
                inner.update(zip(formula.variables, values))
                parts.append(self.formula(formula.arguments[0], inner))
            return self._gate(AND if connective == FORALL else OR, parts)
        parts = [self.formula(argument, env) for argument in formula.arguments]
        if connective == NOT:
            return -parts[0]
        left, right = parts
        return {
            AND: lambda: self._gate(AND, [left, right]),
            OR: lambda: self._gate(OR, [left, right]),
            IMPLIES: lambda: self._gate(OR, [-left, right]),
            IFF: lambda: self._iff(left, right),
            XOR: lambda: -self._iff(left, right),
            NOR: lambda: -self._gate(OR, [left, right]),
            NAND: lambda: -self._gate(AND, [left, right]),
        }[connective]()

    def clause(self, clause: Clause, env: dict[Term, int]) -> int:
        return self._gate(OR, [self.atom(l.atom, env) * (1 if l.positive else -1) for l in clause.literals])

    def closure(self, content) -> int:
        """The universal closure of a clause or formula, as one variable."""
        free = sorted(_free_variables(content), key=lambda v: v.symbol)
        parts = []
        for values in itertools.product(range(self.size), repeat=len(free)):
            env = dict(zip(free, values))
            parts.append(self.clause(content, env) if isinstance(content, Clause) else self.formula(content, env))
        return self._gate(AND, parts)


def _free_variables(content) -> set[Term]:
    if isinstance(content, Clause):
        return content.variables()
    free: set[Term] = set()
    stack: list[tuple[Formula, frozenset]] = [(content, frozenset())]
    while stack:
        formula, bound = stack.pop()
        if formula.connective == ATOM:
            todo = [formula.atom]
            while todo:
                t = todo.pop()
                if t.is_variable and t not in bound:
                    free.add(t)
                todo.extend(t.arguments)
        elif formula.connective in (FORALL, EXISTS):
            stack.append((formula.arguments[0], bound | set(formula.variables)))
        else:
            stack.extend((argument, bound) for argument in formula.arguments)
    return free


class OracleGaveUp(Exception):
    """The SAT solver ran out of budget: neither a model nor its absence is known."""


SAT_CONFLICTS = 200_000
"""The SAT solver's budget per domain size: a few grounded mutants of the
larger derivations otherwise keep it busy for many minutes."""


def countermodel_size(premises: list, conclusion, sizes: tuple[int, ...] = SIZES) -> int | None:
    """The smallest domain size with a model of the premises that falsifies
    the conclusion, or None if there is none up to the largest size (or the
    grounding grew too large); OracleGaveUp when the solver's budget ran out."""
    for size in sizes:
        grounding = _Grounding(size)
        try:
            for premise in premises:
                grounding.clauses.append([grounding.closure(premise)])
            grounding.clauses.append([-grounding.closure(conclusion)])
            grounding.close_tables()
        except _TooLarge:
            return None
        with Solver(name="m22", bootstrap_with=grounding.clauses) as solver:
            solver.conf_budget(SAT_CONFLICTS)
            found = solver.solve_limited()
            if found is None:
                raise OracleGaveUp(f"no answer within {SAT_CONFLICTS} conflicts at domain size {size}")
            if found:
                return size
    return None


def ground_entailment(premises: list, conclusion) -> bool:
    """Premises ⊨ conclusion shown propositionally (ground atoms as
    variables); only for ground clauses without equality."""
    contents = [*premises, conclusion]
    if not all(isinstance(c, Clause) and not c.variables() for c in contents):
        return False
    if any(l.atom.symbol == "=" for c in contents for l in c.literals):
        return False
    numbers: dict[Term, int] = {}

    def number(literal) -> int:
        return numbers.setdefault(literal.atom, len(numbers) + 1) * (1 if literal.positive else -1)

    clauses = [[number(l) for l in c.literals] for c in premises]
    clauses += [[-number(l)] for l in conclusion.literals]
    with Solver(name="m22", bootstrap_with=clauses) as solver:
        return not solver.solve()
