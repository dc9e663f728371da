"""Test helpers for native certificates: kernel replay of every step, and a
brute-force search for small counter-models that knows nothing of the kernel.

The counter-model search is the tests' independent judge of soundness:
it enumerates every interpretation of the symbols involved over domains
of one and two elements, with ``=`` as identity, and looks for one that
makes the premises true and the conclusion false.
"""

from __future__ import annotations

import itertools
from collections.abc import Iterator, Sequence

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.failure import Failure
from checker.kernel.rules import check_clause_step, replay
from checker.kernel.substitution import IDENTITY
from checker.kernel.terms import Term
from formats.derivation import Document, Inference, Statement

DOMAIN_SIZES = (1, 2)
INTERPRETATION_LIMIT = 300_000


def clause_steps(document: Document) -> Iterator[Statement]:
    """The statements that carry kernel evidence."""
    for statement in document.statements:
        if isinstance(statement.source, Inference) and statement.source.evidence is not None:
            yield statement


def premises_of(document: Document, statement: Statement) -> list[Clause]:
    """The parents' clauses as their own records state them."""
    contents = {s.name: s.content for s in document.statements}
    return [contents[parent.name] for parent in statement.source.parents]


def check_step(document: Document, statement: Statement) -> Failure | None:
    inference = statement.source
    return check_clause_step(
        premises_of(document, statement), statement.content, inference.evidence, inference.theta or IDENTITY
    )


def computed_clause(document: Document, statement: Statement) -> Clause | Failure:
    """What the step's evidence derives from its parents (not for refutations)."""
    return replay(premises_of(document, statement), statement.source.evidence)


def first_refused(document: Document) -> tuple[str, Failure] | None:
    """The first step, in written order, that the kernel refuses."""
    for statement in clause_steps(document):
        failure = check_step(document, statement)
        if failure is not None:
            return statement.name, failure
    return None


# ------------------------------------------------------------ small models


def _symbols(clauses: Sequence[Clause]) -> tuple[set[tuple[str, int]], set[tuple[str, int]]]:
    functions: set[tuple[str, int]] = set()
    predicates: set[tuple[str, int]] = set()
    for clause in clauses:
        for literal in clause.literals:
            atom = literal.atom
            if not is_equality(atom):
                predicates.add((atom.symbol, atom.arity))
            stack = list(atom.arguments)
            while stack:
                term = stack.pop()
                if not term.is_variable:
                    functions.add((term.symbol, term.arity))
                    stack.extend(term.arguments)
    return functions, predicates


def _value(term: Term, functions: dict, assignment: dict) -> int:
    if term.is_variable:
        return assignment[term]
    table = functions[(term.symbol, term.arity)]
    return table[tuple(_value(argument, functions, assignment) for argument in term.arguments)]


def _literal_true(literal, functions, predicates, assignment) -> bool:
    atom = literal.atom
    arguments = tuple(_value(argument, functions, assignment) for argument in atom.arguments)
    if is_equality(atom):
        holds = arguments[0] == arguments[1]
    else:
        holds = arguments in predicates[(atom.symbol, atom.arity)]
    return holds == literal.positive


def _clause_true(clause: Clause, domain: range, functions: dict, predicates: dict) -> bool:
    """True when every assignment of the clause's variables satisfies it."""
    variables = sorted(clause.variables(), key=lambda v: v.symbol)
    for values in itertools.product(domain, repeat=len(variables)):
        assignment = dict(zip(variables, values))
        if not any(_literal_true(lit, functions, predicates, assignment) for lit in clause.literals):
            return False
    return True


def _tables(domain: range, arity: int) -> Iterator[dict]:
    points = list(itertools.product(domain, repeat=arity))
    for values in itertools.product(domain, repeat=len(points)):
        yield dict(zip(points, values))


def _relations(domain: range, arity: int) -> Iterator[frozenset]:
    points = list(itertools.product(domain, repeat=arity))
    for chosen in itertools.product((False, True), repeat=len(points)):
        yield frozenset(point for point, keep in zip(points, chosen) if keep)


def small_counter_model(premises: Sequence[Clause], conclusion: Clause) -> dict | None:
    """An interpretation over 1 or 2 elements making every premise true and
    the conclusion false, or None when there is none."""
    function_symbols, predicate_symbols = _symbols([*premises, conclusion])
    functions_sorted = sorted(function_symbols)
    predicates_sorted = sorted(predicate_symbols)
    for size in DOMAIN_SIZES:
        domain = range(size)
        count = 1
        for _, arity in functions_sorted:
            count *= size ** (size**arity)
        for _, arity in predicates_sorted:
            count *= 2 ** (size**arity)
        assert count <= INTERPRETATION_LIMIT, f"{count} interpretations: too many symbols for brute force"
        choices = [list(_tables(domain, arity)) for _, arity in functions_sorted]
        choices += [list(_relations(domain, arity)) for _, arity in predicates_sorted]
        for combination in itertools.product(*choices):
            functions = dict(zip(functions_sorted, combination[: len(functions_sorted)]))
            predicates = dict(zip(predicates_sorted, combination[len(functions_sorted) :]))
            if _clause_true(conclusion, domain, functions, predicates):
                continue
            if all(_clause_true(premise, domain, functions, predicates) for premise in premises):
                return {"size": size, "functions": functions, "predicates": predicates}
    return None
