"""Finite interpretations: evaluating clauses and formulas, confirming counter-models.

A step that claims consequence is refuted by an interpretation in which
every premise is true and the conclusion false.  Whoever found the
interpretation, the kernel evaluates it here before the step is called
refuted.  Equality is identity on the domain.  A table the evaluation needs
but the interpretation lacks is a :class:`Failure`, never a default value.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from itertools import product

from checker.kernel.clauses import Clause
from checker.kernel.failure import Failure, quote
from checker.kernel.formulas import (
    AND,
    ATOM,
    EXISTS,
    FORALL,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    NOT,
    OR,
    QUANTIFIERS,
    TRUE,
    XOR,
    Formula,
    substitute_free,
    symbols_of_formula,
    universal_closure,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application

Symbol = tuple[str, int]
Assignment = Mapping[Term, int]


@dataclass(frozen=True, slots=True)
class Interpretation:
    """A finite structure over the domain ``0 .. size - 1``: for each
    function symbol its value on every argument tuple, for each predicate
    symbol the argument tuples where it is true."""

    size: int
    functions: Mapping[Symbol, Mapping[tuple[int, ...], int]]
    predicates: Mapping[Symbol, frozenset[tuple[int, ...]]]

    @property
    def domain(self) -> range:
        return range(self.size)


def _arguments_text(arguments: tuple[int, ...]) -> str:
    return "(" + ",".join(map(str, arguments)) + ")"


def evaluate_term(interpretation: Interpretation, term: Term, assignment: Assignment) -> int | Failure:
    """The domain element ``term`` denotes under ``assignment``."""
    values: dict[Term, int] = {}
    stack = [term]
    while stack:
        current = stack[-1]
        if current in values:
            stack.pop()
            continue
        if current.is_variable:
            if current not in assignment:
                return Failure("unassigned_variable", f"variable {current} has no value")
            values[current] = assignment[current]
            stack.pop()
            continue
        pending = [a for a in current.arguments if a not in values]
        if pending:
            stack.extend(pending)
            continue
        stack.pop()
        symbol = (current.symbol, current.arity)
        table = interpretation.functions.get(symbol)
        if table is None:
            return Failure("missing_table", f"the model has no table for function {current.symbol}/{current.arity}")
        arguments = tuple(values[a] for a in current.arguments)
        value = table.get(arguments)
        if value is None:
            return Failure(
                "missing_table_entry",
                f"the table of {current.symbol}/{current.arity} has no value at {_arguments_text(arguments)}",
            )
        if value not in interpretation.domain:
            return Failure("value_outside_domain", f"{current.symbol}{_arguments_text(arguments)} = {value} is not in the domain")
        values[current] = value
    return values[term]


def evaluate_atom(interpretation: Interpretation, atom: Term, assignment: Assignment) -> bool | Failure:
    values = []
    for argument in atom.arguments:
        value = evaluate_term(interpretation, argument, assignment)
        if isinstance(value, Failure):
            return value
        values.append(value)
    if atom.symbol == "=" and atom.arity == 2:
        return values[0] == values[1]
    if atom.arity == 0 and atom.symbol in ("$true", "$false"):
        return atom.symbol == "$true"  # TPTP's truth values, whatever a table says
    table = interpretation.predicates.get((atom.symbol, atom.arity))
    if table is None:
        return Failure("missing_table", f"the model has no table for predicate {atom.symbol}/{atom.arity}")
    return tuple(values) in table


def evaluate_clause(interpretation: Interpretation, clause: Clause) -> tuple[bool, dict[Term, int] | None] | Failure:
    """Whether the clause holds for every assignment of its variables, and
    if not, the first assignment (in domain order) that falsifies it.
    A literal found true settles its instance, whatever the others say."""
    variables = sorted(clause.variables(), key=lambda v: v.symbol)
    for values in product(interpretation.domain, repeat=len(variables)):
        assignment = dict(zip(variables, values))
        for literal in clause.literals:
            value = evaluate_atom(interpretation, literal.atom, assignment)
            if isinstance(value, Failure):
                return value
            if value == literal.positive:
                break
        else:
            return False, assignment
    return True, None


_COMBINE = {
    NOT: lambda values: not values[0],
    AND: all,
    OR: any,
    IMPLIES: lambda values: not values[0] or values[1],
    IFF: lambda values: values[0] == values[1],
    XOR: lambda values: values[0] != values[1],
    NOR: lambda values: not any(values),
    NAND: lambda values: not all(values),
    FORALL: all,
    EXISTS: any,
}


def evaluate_formula(interpretation: Interpretation, formula: Formula, assignment: Assignment | None = None) -> bool | Failure:
    """The truth value of ``formula`` under ``assignment`` (which must give
    every free variable a value); quantifiers range over the domain."""
    values: list[bool] = []
    # A task is (formula, assignment) to evaluate, or (connective, count)
    # to combine the last ``count`` values.
    tasks: list[tuple] = [(formula, dict(assignment or {}))]
    while tasks:
        task = tasks.pop()
        if isinstance(task[0], str):
            connective, count = task
            operands = values[len(values) - count :]
            del values[len(values) - count :]
            values.append(_COMBINE[connective](operands))
            continue
        current, env = task
        if current.connective == ATOM:
            value = evaluate_atom(interpretation, current.atom, env)
            if isinstance(value, Failure):
                return value
            values.append(value)
        elif not current.arguments:
            values.append(current.connective == TRUE)
        elif current.connective in QUANTIFIERS:
            extended = [
                {**env, **dict(zip(current.variables, elements))}
                for elements in product(interpretation.domain, repeat=len(current.variables))
            ]
            tasks.append((current.connective, len(extended)))
            tasks.extend((current.arguments[0], inner) for inner in reversed(extended))
        else:
            tasks.append((current.connective, len(current.arguments)))
            tasks.extend((argument, env) for argument in reversed(current.arguments))
    return values[0]


def holds(interpretation: Interpretation, statement: Clause | Formula) -> bool | Failure:
    """Whether a clause, or the universal closure of a formula, is true."""
    if isinstance(statement, Clause):
        result = evaluate_clause(interpretation, statement)
        return result if isinstance(result, Failure) else result[0]
    return evaluate_formula(interpretation, universal_closure(statement))


def confirm_countermodel(
    interpretation: Interpretation, premises: Sequence[Clause | Formula], conclusion: Clause | Formula
) -> Failure | None:
    """None when every premise is true in the interpretation and the
    conclusion is false; otherwise what is wrong with the claimed model."""
    if interpretation.size < 1:
        return Failure("empty_domain", "a first-order interpretation needs at least one element")
    for index, premise in enumerate(premises):
        value = holds(interpretation, premise)
        if isinstance(value, Failure):
            return value
        if not value:
            return Failure("premise_false", f"premise {index} {quote(premise)} is false in the model")
    value = holds(interpretation, conclusion)
    if isinstance(value, Failure):
        return value
    if value:
        return Failure("conclusion_true", f"the conclusion {quote(conclusion)} is true in the model")
    return None


def _element(value: int) -> Term:
    """A domain element as a term for display; digits cannot be a symbol's name."""
    return application(str(value))


def falsified_instance(interpretation: Interpretation, conclusion: Clause | Formula) -> Clause | Formula | Failure:
    """The conclusion with the first falsifying values put in for its
    variables (for a formula: its free variables, then those of each
    leading universal quantifier), shown as domain elements."""
    if isinstance(conclusion, Clause):
        result = evaluate_clause(interpretation, conclusion)
        if isinstance(result, Failure):
            return result
        if result[0]:
            return Failure("conclusion_true", f"the conclusion {quote(conclusion)} is true in the model")
        return conclusion.instance(Substitution({v: _element(e) for v, e in result[1].items()}))
    body = universal_closure(conclusion)
    assignment: dict[Term, int] = {}
    while body.connective == FORALL:
        for elements in product(interpretation.domain, repeat=len(body.variables)):
            inner = {**assignment, **dict(zip(body.variables, elements))}
            value = evaluate_formula(interpretation, body.arguments[0], inner)
            if isinstance(value, Failure):
                return value
            if not value:
                assignment, body = inner, body.arguments[0]
                break
        else:
            return Failure("conclusion_true", f"the conclusion {quote(conclusion)} is true in the model")
    return substitute_free(body, Substitution({v: _element(e) for v, e in assignment.items()}))


def _table_text(symbol: Symbol, table: Mapping[tuple[int, ...], int] | frozenset[tuple[int, ...]]) -> str:
    name, arity = symbol
    if isinstance(table, frozenset):
        if arity == 0:
            return f"{name} = {'true' if () in table else 'false'}"
        shown = (str(t[0]) if arity == 1 else _arguments_text(t) for t in sorted(table))
        return f"{name} = {{{', '.join(shown)}}}"
    if arity == 0 and () in table:
        return f"{name} = {table[()]}"
    shown = (f"{a[0] if len(a) == 1 else _arguments_text(a)} -> {v}" for a, v in sorted(table.items()))
    return f"{name} = {{{', '.join(shown)}}}"


def render_countermodel(
    interpretation: Interpretation, premises: Sequence[Clause | Formula], conclusion: Clause | Formula
) -> str:
    """The model as a report shows it: the domain, the tables of the symbols
    the step uses, and the instance of the conclusion that is false."""
    used: set[Symbol] = set()
    for statement in (*premises, conclusion):
        used |= statement.symbols() if isinstance(statement, Clause) else symbols_of_formula(statement)
    lines = ["domain = {" + ", ".join(map(str, interpretation.domain)) + "}"]
    for tables in (interpretation.functions, interpretation.predicates):
        lines.extend(_table_text(symbol, tables[symbol]) for symbol in sorted(tables) if symbol in used)
    instance = falsified_instance(interpretation, conclusion)
    if isinstance(instance, Failure):
        lines.append(f"no falsified instance: {instance.message}")
    else:
        lines.append(f"falsified: {instance}")
    return "\n".join(lines)
