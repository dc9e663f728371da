"""The trusted clausifier: formulas to clauses, preserving satisfiability.

For each input formula, in order:

1. Close it universally (a free variable is read as universal).
2. When naming, replace each side of an equivalence (``<=>``, ``<~>``) that
   is not a literal by a fresh atom ``d(X..)`` over the side's free
   variables, defined by ``! [X..] : (d(X..) <=> side)``.  A side of an
   equivalence occurs with both polarities, so the definition needs both
   directions.  Expanding an equivalence then copies literals only.
3. One pass from the outside in: push negations inward (NNF), read every
   other connective by its textbook expansion (``_EXPANSIONS``; a negated
   ``<=>`` is read as ``<~>`` and the other way round), give each
   universal variable a clause variable of its own (names kept where no
   other binder took them), replace each existential variable by a Skolem
   term, and multiply out disjunctions into clauses (CNF).
4. When naming, and multiplying two disjuncts would give more than
   ``DISTRIBUTION_LIMIT`` clauses, each disjunct with several clauses is
   replaced by a fresh atom ``d(X..)`` over its variables, with one clause
   ``~d(X..) | C`` per clause ``C`` of the disjunct.  One direction
   suffices because in NNF every subformula occurs positively (Plaisted
   and Greenbaum's polarity-aware naming); the clause count then stays
   linear in the size of the formula.

Skolem terms: one fresh function per existential variable, applied to the
universal variables in scope that occur free in the existential subformula
(once the Skolem terms of enclosing existentials are put in).  Leaving out
the universals that do not occur is sound: the witness cannot depend on
them.  Fresh symbols are named ``skolem_N`` and ``definition_N``, skipping
every name used by the input or listed as reserved.

Finally clauses are cleaned in ways that keep them equivalent: repeated
literals and repeated clauses are dropped, and so are tautologies.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause, Literal
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
    atomic,
    binary,
    free_variables,
    fresh_variable,
    make,
    negation,
    symbols_of_formula,
    universal_closure,
)
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import Term, application, variable, variables_of

DISTRIBUTION_LIMIT = 8
"""Most clauses one multiplied-out disjunction may give before its
disjuncts are named (only when naming)."""

SKOLEM_PREFIX = "skolem_"
DEFINITION_PREFIX = "definition_"

_EXPANSIONS = {
    IMPLIES: lambda a, b: binary(OR, negation(a), b),
    IFF: lambda a, b: binary(AND, binary(IMPLIES, a, b), binary(IMPLIES, b, a)),
    XOR: lambda a, b: binary(AND, binary(OR, a, b), binary(OR, negation(a), negation(b))),
    NOR: lambda a, b: negation(binary(OR, a, b)),
    NAND: lambda a, b: negation(binary(AND, a, b)),
}

_NEGATED = {IFF: XOR, XOR: IFF}
"""``~(a <=> b)`` is ``a <~> b`` and the other way round: expanding the
negation of either as the other keeps complementary copies of a side from
being multiplied together."""

Literals = tuple[Literal, ...]


@dataclass(frozen=True, slots=True)
class FreshSymbol:
    """A symbol the clausifier introduced: ``kind`` is ``skolem`` (a
    function) or ``definition`` (a predicate); ``source`` is the index of
    the input formula it was made for."""

    name: str
    arity: int
    kind: str
    source: int


@dataclass(frozen=True, slots=True)
class Clausification:
    """The clauses, in a fixed order, with the index of the input formula
    each came from (``sources``), and the symbols introduced on the way."""

    clauses: tuple[Clause, ...]
    sources: tuple[int, ...]
    fresh_symbols: tuple[FreshSymbol, ...]


def _is_literal(formula: Formula) -> bool:
    if formula.connective == NOT:
        formula = formula.arguments[0]
    return formula.connective in (ATOM, TRUE, FALSE)


def chain_operands(formula: Formula) -> list[Formula]:
    """The operands of a chain of one connective, ``a & (b & c)`` giving
    ``[a, b, c]``, so that long chains are one step and not a deep nest."""
    found: list[Formula] = []
    stack = [formula]
    while stack:
        current = stack.pop()
        if current.connective == formula.connective:
            stack.extend(reversed(current.arguments))
        else:
            found.append(current)
    return found


def _sorted_variables(variables: Iterable[Term]) -> tuple[Term, ...]:
    return tuple(sorted(variables, key=lambda v: v.symbol))


class _Clausifier:
    def __init__(self, used_names: set[str], naming: bool):
        self.used_names = used_names
        self.naming = naming
        self.source = 0
        self.fresh_symbols: list[FreshSymbol] = []
        self.definitions: dict[Formula, Formula] = {}

    def fresh_symbol(self, prefix: str, arity: int, kind: str) -> str:
        number = 1
        while f"{prefix}{number}" in self.used_names:
            number += 1
        name = f"{prefix}{number}"
        self.used_names.add(name)
        self.fresh_symbols.append(FreshSymbol(name, arity, kind, self.source))
        return name

    def name_equivalence_sides(self, formula: Formula) -> tuple[Formula, list[Formula]]:
        """Step 2: the formula with non-literal sides of equivalences named,
        and the definitions made for it."""
        made: list[Formula] = []
        rebuilt: dict[Formula, Formula] = {}
        stack = [formula]
        while stack:
            current = stack[-1]
            if current in rebuilt:
                stack.pop()
                continue
            pending = [a for a in current.arguments if a not in rebuilt]
            if pending:
                stack.extend(pending)
                continue
            stack.pop()
            arguments = tuple(rebuilt[a] for a in current.arguments)
            if current.connective in (IFF, XOR):
                arguments = tuple(side if _is_literal(side) else self.defined_atom(side, made) for side in arguments)
            rebuilt[current] = make(current.connective, arguments, current.variables, current.atom)
        return rebuilt[formula], made

    def defined_atom(self, side: Formula, made: list[Formula]) -> Formula:
        if side not in self.definitions:
            arguments = _sorted_variables(free_variables(side))
            name = self.fresh_symbol(DEFINITION_PREFIX, len(arguments), "definition")
            self.definitions[side] = atomic(application(name, arguments))
            made.append(universal_closure(binary(IFF, self.definitions[side], side)))
        return self.definitions[side]

    def name_clauses(self, clauses: list[Literals], definition_clauses: list[Literals]) -> list[Literals]:
        """Step 4: one clause ``d(X..)`` standing for the conjunction of
        ``clauses``, whose ``~d(X..) | C`` clauses are added to the output."""
        arguments = _sorted_variables({v for c in clauses for lit in c for v in variables_of(lit.atom)})
        name = self.fresh_symbol(DEFINITION_PREFIX, len(arguments), "definition")
        defined = application(name, arguments)
        definition_clauses.extend((Literal(False, defined), *c) for c in clauses)
        return [(Literal(True, defined),)]

    def clauses_of(self, formula: Formula) -> list[Literals]:
        """Step 3 (and 4) on a closed formula: its clauses, then the clauses
        of the definitions made while multiplying out."""
        definition_clauses: list[Literals] = []
        clause_variables: set[str] = set()
        results: list[list[Literals]] = []
        # A task is either (formula, positive, substitution, universals in
        # scope) to translate, or (is_conjunction, count) to combine the
        # last ``count`` results.
        tasks: list[tuple] = [(formula, True, IDENTITY, ())]
        while tasks:
            task = tasks.pop()
            if len(task) == 2:
                conjunction, count = task
                parts = results[len(results) - count :]
                del results[len(results) - count :]
                if conjunction:
                    results.append([c for part in parts for c in part])
                    continue
                product: list[Literals] = [()]
                for part in parts:
                    if self.naming and len(product) * len(part) > DISTRIBUTION_LIMIT:
                        # The product never exceeds the limit (each round keeps it
                        # within or names it), so here the part has several clauses.
                        if len(product) > 1:
                            product = self.name_clauses(product, definition_clauses)
                        part = self.name_clauses(part, definition_clauses)
                    product = [a + b for a in product for b in part]
                results.append(product)
                continue
            current, positive, substitution, universals = task
            connective = current.connective
            if connective == ATOM:
                results.append([(Literal(positive, substitution(current.atom)),)])
            elif connective in (TRUE, FALSE):
                results.append([] if (connective == TRUE) == positive else [()])
            elif connective == NOT:
                tasks.append((current.arguments[0], not positive, substitution, universals))
            elif connective in _NEGATED and not positive:
                tasks.append((make(_NEGATED[connective], current.arguments), True, substitution, universals))
            elif connective in _EXPANSIONS:
                tasks.append((_EXPANSIONS[connective](*current.arguments), positive, substitution, universals))
            elif connective in (FORALL, EXISTS):
                mapping = dict(substitution.mapping)
                if (connective == FORALL) == positive:
                    for bound in current.variables:
                        if bound.symbol in clause_variables:
                            mapping[bound] = fresh_variable(bound.symbol, clause_variables)
                        else:
                            clause_variables.add(bound.symbol)
                            mapping[bound] = variable(bound.symbol)
                        universals = (*universals, mapping[bound])
                else:
                    occurring = {v for free in free_variables(current) for v in variables_of(substitution(free))}
                    arguments = tuple(u for u in universals if u in occurring)
                    for bound in current.variables:
                        name = self.fresh_symbol(SKOLEM_PREFIX, len(arguments), "skolem")
                        mapping[bound] = application(name, arguments)
                tasks.append((current.arguments[0], positive, Substitution(mapping), universals))
            else:
                operands = chain_operands(current)
                tasks.append(((connective == AND) == positive, len(operands)))
                tasks.extend((operand, positive, substitution, universals) for operand in reversed(operands))
        return results[0] + definition_clauses


def _cleaned(literals: Literals) -> Clause | None:
    """The clause without repeated literals, or None for a tautology."""
    unique = tuple(dict.fromkeys(literals))
    present = set(unique)
    if any(literal.negated() in present for literal in unique):
        return None
    return Clause(unique)


def clausify(
    formulas: Sequence[Formula], *, naming: bool = True, reserved: Iterable[str] = frozenset()
) -> Clausification:
    """Clauses that are satisfiable exactly when the formulas together are.

    Without naming the clauses are equivalent to the formulas wherever no
    existential quantifier is involved; with naming they are equisatisfiable
    and their number grows linearly with the formulas' size.
    """
    used = set(reserved) | {name for formula in formulas for name, _ in symbols_of_formula(formula)}
    clausifier = _Clausifier(used, naming)
    clauses: dict[Clause, int] = {}
    for index, formula in enumerate(formulas):
        clausifier.source = index
        closed = universal_closure(formula)
        parts = [closed]
        if naming:
            main, definitions = clausifier.name_equivalence_sides(closed)
            parts = [main, *definitions]
        for part in parts:
            for literals in clausifier.clauses_of(part):
                clause = _cleaned(literals)
                if clause is not None:
                    clauses.setdefault(clause, index)
    return Clausification(tuple(clauses), tuple(clauses.values()), tuple(clausifier.fresh_symbols))
