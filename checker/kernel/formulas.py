"""First-order formulas, hash-consed like terms.

Formulas keep the connectives as written (TPTP's full set, with ``<=``
read as a reversed implication) so that a step can be compared with its
premise exactly; atoms are terms whose symbol is the predicate, and the
equality atom uses the symbol ``=``.
"""

from __future__ import annotations

from checker.kernel.terms import Term, render

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
        return (make, (self.connective, self.arguments, self.variables, self.atom))

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
