"""First-order formulas, hash-consed like terms, and what the checker asks of them.

Formulas keep the connectives as written (TPTP's full set, with ``<=``
read as a reversed implication) so that a step can be compared with its
premise exactly; atoms are terms whose symbol is the predicate, and the
equality atom uses the symbol ``=``.  Besides construction and rendering
this module answers: which variables are free, are two formulas the same
up to renaming of bound variables, what is a capture-avoiding instance,
and with which polarity does each subformula occur.  Every traversal is
iterative: prover output chains thousands of conjuncts.
"""

from __future__ import annotations

from collections.abc import Iterator
from itertools import islice, repeat

from checker.kernel.clauses import Clause
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, post_order, render, symbols_of, variable, variables_of

ATOM = "atom"
TRUE = "$true"
FALSE = "$false"
NOT = "~"
AND = "&"
OR = "|"
IMPLIES = "=>"
IFF = "<=>"
XOR = "<~>"
NOR = "~|"
NAND = "~&"
FORALL = "!"
EXISTS = "?"

BINARY = (AND, OR, IMPLIES, IFF, XOR, NOR, NAND)
QUANTIFIERS = (FORALL, EXISTS)


class Formula:
    """A formula; build with the constructor functions below."""

    __slots__ = ("connective", "arguments", "variables", "atom", "__weakref__")

    connective: str
    arguments: tuple[Formula, ...]
    variables: tuple[Term, ...]
    atom: Term | None

    def __reduce__(self):
        # Flat, as for terms, so that pickling (worker processes) and copying
        # never recurse through a long chain; rebuilding hash-conses again.
        return (_from_flat, (_flat(self),))

    def __repr__(self) -> str:
        return f"Formula({render_formula(self)!r})"

    def __str__(self) -> str:
        return render_formula(self)


_table: dict[tuple, Formula] = {}


def make(
    connective: str,
    arguments: tuple[Formula, ...] = (),
    variables: tuple[Term, ...] = (),
    atom: Term | None = None,
) -> Formula:
    """The one formula object with these parts."""
    key = (connective, arguments, variables, atom)
    formula = _table.get(key)
    if formula is None:
        formula = object.__new__(Formula)
        formula.connective = connective
        formula.arguments = arguments
        formula.variables = variables
        formula.atom = atom
        _table[key] = formula
    return formula


def table_size() -> int:
    """How many formulas the table holds: a mark for :func:`forget_formulas_since`."""
    return len(_table)


def forget_formulas_since(mark: int) -> None:
    """Drop every formula made after ``mark`` from the table, and every
    free-variable memo made since (as :func:`terms.forget_terms_since`)."""
    for key in list(islice(_table, mark, None)):
        del _table[key]
    _free.clear()


def _flat(formula: Formula) -> tuple[tuple[str, tuple[int, ...], tuple[Term, ...], Term | None], ...]:
    """The distinct subformulas, innermost first, each with the indices of
    its arguments in this list."""
    nodes = post_order(formula)
    index = {node: number for number, node in enumerate(nodes)}
    return tuple((n.connective, tuple(index[a] for a in n.arguments), n.variables, n.atom) for n in nodes)


def _from_flat(entries: tuple[tuple[str, tuple[int, ...], tuple[Term, ...], Term | None], ...]) -> Formula:
    built: list[Formula] = []
    for connective, arguments, variables, atom in entries:
        built.append(make(connective, tuple(built[i] for i in arguments), variables, atom))
    return built[-1]


def atomic(atom: Term) -> Formula:
    return make(ATOM, atom=atom)


def negation(formula: Formula) -> Formula:
    return make(NOT, (formula,))


def binary(connective: str, left: Formula, right: Formula) -> Formula:
    if connective not in BINARY:
        raise ValueError(f"not a binary connective: {connective}")
    return make(connective, (left, right))


def quantified(quantifier: str, variables: tuple[Term, ...], body: Formula) -> Formula:
    if quantifier not in QUANTIFIERS:
        raise ValueError(f"not a quantifier: {quantifier}")
    return make(quantifier, (body,), tuple(variables))


VERUM = make(TRUE)
FALSUM = make(FALSE)


def render_formula(formula: Formula) -> str:
    """The formula in TPTP syntax; binary subformulas are bracketed so that
    the text reads back as the same formula."""
    parts: list[str] = []
    stack: list[Formula | str] = [formula]

    def push_operand(operand: Formula) -> None:
        if operand.connective in BINARY:
            stack.extend((")", operand, "("))
        else:
            stack.append(operand)

    while stack:
        item = stack.pop()
        if isinstance(item, str):
            parts.append(item)
        elif item.connective == ATOM:
            atom = item.atom
            if atom.symbol == "=" and atom.arity == 2:
                parts.append(f"{render(atom.arguments[0])} = {render(atom.arguments[1])}")
            else:
                parts.append(render(atom))
        elif item.connective in (TRUE, FALSE):
            parts.append(item.connective)
        elif item.connective == NOT:
            parts.append("~ ")
            push_operand(item.arguments[0])
        elif item.connective in QUANTIFIERS:
            names = ",".join(v.symbol for v in item.variables)
            parts.append(f"{item.connective} [{names}] : ")
            push_operand(item.arguments[0])
        else:
            left, right = item.arguments
            push_operand(right)
            stack.append(f" {item.connective} ")
            push_operand(left)
    return "".join(parts)


def _is_equality(atom: Term) -> bool:
    return atom.symbol == "=" and atom.arity == 2


_free: dict[Formula, frozenset[Term]] = {}
"""Free variables of every formula asked about, emptied when the table
forgets the formulas of a file (:func:`forget_formulas_since`)."""


def free_variables(formula: Formula) -> frozenset[Term]:
    """The variables that occur free in ``formula``."""
    for current in post_order(formula, _free):
        if current.connective == ATOM:
            found = frozenset(variables_of(current.atom))
        else:
            found = frozenset().union(*(_free[a] for a in current.arguments))
            found -= frozenset(current.variables)
        _free[current] = found
    return _free[formula]


def universal_closure(formula: Formula) -> Formula:
    """``! [free variables, by name] : formula``, or the formula itself when closed."""
    free = sorted(free_variables(formula), key=lambda v: v.symbol)
    return quantified(FORALL, tuple(free), formula) if free else formula


def formula_of_clause(clause: Clause) -> Formula:
    """The universal closure of the disjunction of the clause's literals, in
    written order; the empty clause is ``$false``."""
    result = None
    for literal in clause.literals:
        atom = atomic(literal.atom)
        disjunct = atom if literal.positive else negation(atom)
        result = disjunct if result is None else binary(OR, result, disjunct)
    return FALSUM if result is None else universal_closure(result)


def symbols_of_formula(formula: Formula) -> frozenset[tuple[str, int]]:
    """The predicate, function and constant symbols of ``formula``, as
    (name, arity); the equality atom contributes ``("=", 2)``."""
    found: set[tuple[str, int]] = set()
    seen: set[Formula] = set()
    stack = [formula]
    while stack:
        current = stack.pop()
        if current in seen:
            continue
        seen.add(current)
        if current.connective == ATOM:
            found |= symbols_of(current.atom)
        stack.extend(current.arguments)
    return frozenset(found)


def _variables_match(a: Term, b: Term, left_bound: dict[Term, int], right_bound: dict[Term, int]) -> bool:
    """Two variables correspond when bound by the same pair of binders, or
    are both free and the same variable."""
    binder = left_bound.get(a)
    return binder == right_bound.get(b) and (binder is not None or a is b)


def _terms_match(s: Term, t: Term, left_bound: dict[Term, int], right_bound: dict[Term, int]) -> bool:
    stack = [(s, t)]
    while stack:
        a, b = stack.pop()
        if a.is_variable or b.is_variable:
            if not (a.is_variable and b.is_variable and _variables_match(a, b, left_bound, right_bound)):
                return False
        elif a.symbol != b.symbol or a.arity != b.arity:
            return False
        elif not (a is b and a.ground):
            stack.extend(zip(a.arguments, b.arguments))
    return True


def _atoms_match(s: Term, t: Term, left_bound: dict[Term, int], right_bound: dict[Term, int]) -> bool:
    if _terms_match(s, t, left_bound, right_bound):
        return True
    if not (_is_equality(s) and _is_equality(t)):
        return False
    turned = application(t.symbol, t.arguments[::-1])
    return _terms_match(s, turned, left_bound, right_bound)


def alpha_equivalent(left: Formula, right: Formula) -> bool:
    """Whether the formulas are equal up to a consistent renaming of bound
    variables (quantifier blocks matched variable by variable, in order),
    with ``s = t`` and ``t = s`` taken as the same atom."""
    binders = 0
    stack: list[tuple[Formula, Formula, dict[Term, int], dict[Term, int]]] = [(left, right, {}, {})]
    while stack:
        f, g, left_bound, right_bound = stack.pop()
        if f is g and all(left_bound.get(v) == right_bound.get(v) for v in free_variables(f)):
            continue
        if f.connective != g.connective or len(f.variables) != len(g.variables):
            return False
        if f.connective == ATOM:
            if not _atoms_match(f.atom, g.atom, left_bound, right_bound):
                return False
        elif f.connective in QUANTIFIERS:
            left_inner, right_inner = dict(left_bound), dict(right_bound)
            for x, y in zip(f.variables, g.variables):
                binders += 1
                left_inner[x] = right_inner[y] = binders
            stack.append((f.arguments[0], g.arguments[0], left_inner, right_inner))
        else:
            stack.extend(zip(f.arguments, g.arguments, repeat(left_bound), repeat(right_bound)))
    return True


def _variable_names(formula: Formula) -> set[str]:
    """Every variable name in ``formula``, free or bound."""
    names: set[str] = set()
    seen: set[Formula] = set()
    stack = [formula]
    while stack:
        current = stack.pop()
        if current in seen:
            continue
        seen.add(current)
        names.update(v.symbol for v in current.variables)
        if current.connective == ATOM:
            names.update(v.symbol for v in variables_of(current.atom))
        stack.extend(current.arguments)
    return names


def fresh_variable(name: str, used: set[str]) -> Term:
    """A variable named ``name`` followed by the first number that makes it
    unused; the new name is added to ``used``."""
    number = 1
    while f"{name}{number}" in used:
        number += 1
    used.add(f"{name}{number}")
    return variable(f"{name}{number}")


def substitute_free(formula: Formula, substitution: Substitution) -> Formula:
    """The instance of ``formula`` with its free variables replaced as the
    substitution says; a bound variable that would capture a variable of a
    replacing term is renamed first."""
    used: set[str] | None = None
    results: list[Formula] = []
    # A task is a (formula, bindings) to rewrite, or a (connective, count,
    # variables) telling how to rebuild a formula from the last results.
    tasks: list[tuple] = [(formula, substitution.mapping)]
    while tasks:
        task = tasks.pop()
        if len(task) == 3:
            connective, count, bound = task
            arguments = tuple(results[len(results) - count :])
            del results[len(results) - count :]
            results.append(make(connective, arguments, bound))
            continue
        current, mapping = task
        relevant = {v: mapping[v] for v in free_variables(current) if v in mapping}
        if not relevant:
            results.append(current)
        elif current.connective == ATOM:
            results.append(atomic(Substitution(relevant)(current.atom)))
        elif current.connective in QUANTIFIERS:
            inner = dict(relevant)  # free variables of a quantified formula exclude its bound ones
            incoming = set().union(*(variables_of(t) for t in inner.values()))
            renamed = []
            for bound in current.variables:
                if bound in incoming:
                    if used is None:
                        used = _variable_names(formula) | {v.symbol for t in mapping.values() for v in variables_of(t)}
                    inner[bound] = fresh_variable(bound.symbol, used)
                    renamed.append(inner[bound])
                else:
                    renamed.append(bound)
            tasks.append((current.connective, 1, tuple(renamed)))
            tasks.append((current.arguments[0], inner))
        else:
            tasks.append((current.connective, len(current.arguments), ()))
            tasks.extend((argument, relevant) for argument in reversed(current.arguments))
    return results[0]


_ARGUMENT_POLARITY = {
    NOT: (-1,),
    AND: (1, 1),
    OR: (1, 1),
    IMPLIES: (-1, 1),
    IFF: (0, 0),
    XOR: (0, 0),
    NOR: (-1, -1),
    NAND: (-1, -1),
    FORALL: (1,),
    EXISTS: (1,),
}
"""How each connective turns the polarity of its arguments: kept (1),
flipped (-1), or lost (0, both at once)."""


def argument_polarities(connective: str) -> tuple[int, ...]:
    """The polarity factor of each argument of ``connective`` (none for atoms)."""
    return _ARGUMENT_POLARITY.get(connective, ())


def subformulas_with_polarity(formula: Formula) -> Iterator[tuple[Formula, int]]:
    """Every subformula occurrence, outermost first and left to right, with
    its polarity: +1 positive, -1 negative, 0 both (under an equivalence)."""
    stack = [(formula, 1)]
    while stack:
        current, polarity = stack.pop()
        yield current, polarity
        factors = argument_polarities(current.connective)
        for argument, factor in reversed(tuple(zip(current.arguments, factors))):
            stack.append((argument, polarity * factor))
