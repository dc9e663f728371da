"""The first-order part of TPTP's typed languages (TFF and THF), read into
the same untyped kernel objects as FOF.

The grammar (formats/tptp.lark) reads a typed statement into the small
syntax tree below; here its types are checked and then erased.  Type
declarations build a :class:`Signature` (a symbol undeclared is typed as
the standard's default: individuals of ``$i``, and ``$o`` where a formula
stands).  Every term must be well-sorted against it, or reading stops with
the place of the offending term.  What is not first-order (lambda terms,
quantification over functions, predicates or ``$o``, partial application,
formulas as arguments, polymorphic types) stops reading too, with a
message that starts ``unsupported:``.

Erasing sorts is sound only where the sorts are monotone (Claessen,
Lillieström & Smallbone, "Sort it out with monotonicity", CADE 2011);
each statement keeps the set of sorts its terms have, so that the checker
can decide per step whether the erased check may be trusted
(checker/sorts.py).
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field

from lark import Token

from checker.kernel.clauses import EQUALITY
from checker.kernel.formulas import (
    AND,
    FALSUM,
    IMPLIES,
    OR,
    VERUM,
    Formula,
    atomic,
    binary,
    negation,
    quantified,
)
from checker.kernel.terms import Term, application, variable

INDIVIDUALS = "$i"
BOOLEAN = "$o"
TYPE_OF_TYPES = "$tType"
NUMERIC = frozenset(("$int", "$rat", "$real"))
"""The arithmetic sorts of the standard."""

_BUILTIN_SORTS = frozenset((INDIVIDUALS, *NUMERIC))
_UNDECLARED = "?"
"""The result of an undeclared symbol: ``$o`` where a formula stands, else
``$i`` (the standard's default types)."""


# ------------------------------------------------------------ syntax tree
# What the grammar builds for a typed statement; every node that can be
# wrong keeps the token where it starts, for the error's location.


@dataclass(frozen=True, slots=True, eq=False)
class Word:
    """A symbol: atomic word, ``$word``, ``$$word``, number or distinct object."""

    text: str
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class Var:
    name: str
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class Call:
    """A symbol applied to arguments, written ``f(a, b)`` or ``f @ a @ b``."""

    head: object
    arguments: tuple
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class Infix:
    """``left = right`` (``positive``) or ``left != right``."""

    positive: bool
    left: object
    right: object
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class Not:
    body: object


@dataclass(frozen=True, slots=True, eq=False)
class Connect:
    connective: str
    left: object
    right: object


@dataclass(frozen=True, slots=True, eq=False)
class Quantify:
    quantifier: str
    variables: tuple  # of (name, type or None, token)
    body: object
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class Refused:
    """A construct of the standard that is never first-order."""

    what: str
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class TypeAtom:
    name: str
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class TypeMapping:
    domain: object
    result: object
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class TypeProduct:
    items: tuple
    token: Token


@dataclass(frozen=True, slots=True, eq=False)
class Typing:
    """``symbol : type``, the content of a statement with role ``type``."""

    symbol: str
    type: object
    token: Token


def token_of(node) -> Token:
    """The token where a syntax-tree node starts."""
    while isinstance(node, (Not, Connect)):
        node = node.body if isinstance(node, Not) else node.left
    return node.token


# ------------------------------------------------------------ errors


class TypeFault(Exception):
    """Ill-sorted or unsupported typed input, at ``token``."""

    def __init__(self, message: str, token: Token):
        super().__init__(message)
        self.message = message
        self.token = token


def _unsupported(what: str, token: Token) -> TypeFault:
    return TypeFault(f"unsupported: {what}", token)


# ------------------------------------------------------------ signatures


@dataclass(frozen=True, slots=True)
class SymbolType:
    """A first-order type: argument sorts and a result sort (``$o`` for a
    predicate), or the reason it is not first-order."""

    arguments: tuple[str, ...]
    result: str
    unsupported: str | None = None

    def __str__(self) -> str:
        if not self.arguments:
            return self.result
        domain = " * ".join(self.arguments)
        return f"({domain}) > {self.result}" if len(self.arguments) > 1 else f"{domain} > {self.result}"


@dataclass(slots=True)
class Signature:
    """The sorts and symbol types declared so far in one file and its includes."""

    sorts: set[str] = field(default_factory=lambda: set(_BUILTIN_SORTS))
    symbols: dict[str, SymbolType] = field(default_factory=dict)

    def declare(self, typing: Typing) -> None:
        if isinstance(typing.type, TypeAtom) and typing.type.name == TYPE_OF_TYPES:
            if typing.symbol.startswith("$"):
                raise TypeFault(f"`{typing.symbol}` is a defined type of the standard", typing.token)
            self.sorts.add(typing.symbol)
            return
        declared = self._first_order(typing.type)
        known = self.symbols.get(typing.symbol)
        if known is not None and known != declared:
            raise TypeFault(
                f"`{typing.symbol}` is declared as `{declared}` but was declared as `{known}` before",
                typing.token,
            )
        self.symbols[typing.symbol] = declared

    def sort_of(self, node) -> str | None:
        """The sort an atomic type names (``$o`` included), None if the type
        is not atomic; an undeclared type name is an error."""
        if not isinstance(node, TypeAtom):
            return None
        if node.name in self.sorts or node.name == BOOLEAN:
            return node.name
        if node.name == TYPE_OF_TYPES or node.name[:1].isupper():
            return None
        raise TypeFault(f"type `{node.name}` is not declared (declare it as `{node.name}: $tType`)", node.token)

    def _first_order(self, node) -> SymbolType:
        """The type a declaration gives, flattened (``A > B > C`` and
        ``(A * B) > C`` alike take two arguments); one that is not
        first-order is kept with the reason, refused only where it is used."""
        arguments: list[str] = []
        while isinstance(node, TypeMapping):
            domain = node.domain.items if isinstance(node.domain, TypeProduct) else (node.domain,)
            for item in domain:
                sort = self.sort_of(item)
                if sort is None or sort == BOOLEAN:
                    return SymbolType((), BOOLEAN, _higher_order_reason(item))
                arguments.append(sort)
            node = node.result
        result = self.sort_of(node)
        if result is None:
            return SymbolType((), BOOLEAN, _higher_order_reason(node))
        return SymbolType(tuple(arguments), result)


def _higher_order_reason(node) -> str:
    if isinstance(node, TypeAtom) and node.name == BOOLEAN:
        return "a predicate or formula as an argument ($o in an argument type) is not first-order"
    if isinstance(node, TypeAtom) and node.name == TYPE_OF_TYPES:
        return "type constructors and polymorphic types ($tType) are not first-order"
    if isinstance(node, TypeAtom):
        return f"type variable `{node.name}` (polymorphic types are not first-order)"
    if isinstance(node, Refused):
        return node.what
    return "a function or predicate as an argument (higher-order type) is not first-order"


# ------------------------------------------------------------ arithmetic

_NUMBER_SORTS = (
    (re.compile(r"[+-]?[0-9]+"), "$int"),
    (re.compile(r"[+-]?[0-9]+/[0-9]+"), "$rat"),
)
_ARITHMETIC_PREDICATES = frozenset(("$less", "$lesseq", "$greater", "$greatereq", "$is_int", "$is_rat"))
_ARITHMETIC_FUNCTIONS = frozenset(
    (
        "$uminus", "$sum", "$difference", "$product", "$quotient", "$quotient_e", "$quotient_t",
        "$quotient_f", "$remainder_e", "$remainder_t", "$remainder_f", "$floor", "$ceiling",
        "$truncate", "$round",
    )
)
_CONVERSIONS = {"$to_int": "$int", "$to_rat": "$rat", "$to_real": "$real"}
_NOT_FIRST_ORDER_WORDS = {
    "$ite": "$ite (conditional terms and formulas) is not read",
    "$let": "$let (local definitions) is not read",
    "$distinct": "the $distinct predicate is not read",
}


def number_sort(text: str) -> str | None:
    """The arithmetic sort of a numeral (<integer>, <rational>, <real>), or None."""
    if not text[:1].isdigit() and not (text[:1] in "+-" and text[1:2].isdigit()):
        return None
    for pattern, sort in _NUMBER_SORTS:
        if pattern.fullmatch(text):
            return sort
    return "$real"


# ------------------------------------------------------------ checking and erasing


@dataclass(frozen=True, slots=True)
class _Value:
    """An evaluated node: a formula, or a term with its sort (an atom is a
    term of sort ``$o``); ``sort`` is None for a free variable whose sort is
    not known yet."""

    formula: Formula | None
    term: Term | None
    sort: str | None
    token: Token


@dataclass(frozen=True, slots=True)
class Erased:
    """A typed statement's content with sorts erased, and the sorts of
    individuals its terms and variables have."""

    formula: Formula
    sorts: frozenset[str]


class _Eraser:
    """Checks one statement's sorts and builds its kernel formula, by an
    iterative walk (the syntax tree may be deeper than Python's recursion
    limit), keeping the sort of each bound variable on a scope stack."""

    def __init__(self, signature: Signature):
        self.signature = signature
        self.scopes: dict[str, list[str]] = {}
        self.free: dict[str, str] = {}
        self.free_pairs: list[tuple[str, str, Token]] = []
        self.sorts: set[str] = set()

    def erase(self, root) -> Erased:
        values: list[_Value] = []
        stack: list[tuple[object, bool]] = [(root, False)]
        while stack:
            node, done = stack.pop()
            if isinstance(node, Quantify) and not done:
                self._open(node)
            if not done and isinstance(node, (Not, Connect, Quantify, Infix, Call)):
                stack.append((node, True))
                stack.extend((child, False) for child in reversed(_children(node)))
                continue
            count = len(_children(node)) if done else 0
            arguments = values[len(values) - count :]
            del values[len(values) - count :]
            values.append(self._value(node, arguments))
        self._settle_free_variables()
        return Erased(self._formula(values[0]), frozenset(self.sorts))

    # scopes
    def _open(self, node: Quantify) -> None:
        if node.quantifier == "^":
            raise _unsupported("lambda abstraction (^) is not first-order", node.token)
        if node.quantifier in ("@+", "@-"):
            raise _unsupported("choice and description binders (@+, @-) are not first-order", node.token)
        if node.quantifier in ("!>", "?*"):
            raise _unsupported("type quantification (!>, ?*) is not first-order", node.token)
        for name, declared, token in node.variables:
            if isinstance(declared, Refused):
                raise _unsupported(declared.what, declared.token)
            sort = INDIVIDUALS if declared is None else self.signature.sort_of(declared)
            if sort == BOOLEAN:
                raise _unsupported(f"quantification over $o (`{name}`) is not first-order", token)
            if sort is None:
                raise _unsupported(
                    f"quantification over functions or predicates (`{name}`) is not first-order", token
                )
            self.scopes.setdefault(name, []).append(sort)
            self.sorts.add(sort)

    def _close(self, node: Quantify) -> None:
        for name, _, _ in node.variables:
            self.scopes[name].pop()

    # values
    def _value(self, node, arguments: list[_Value]) -> _Value:
        if isinstance(node, Var):
            return self._variable(node)
        if isinstance(node, Word):
            return self._application(node, node, [])
        if isinstance(node, Call):
            return self._call(node, arguments)
        if isinstance(node, Refused):
            raise _unsupported(node.what, node.token)
        if isinstance(node, Infix):
            return self._equality(node, *arguments)
        if isinstance(node, Not):
            body = self._formula(arguments[0])
            return _Value(negation(body), None, BOOLEAN, arguments[0].token)
        if isinstance(node, Connect):
            left, right = (self._formula(a) for a in arguments)
            if node.connective == "<=":
                formula = binary(IMPLIES, right, left)
            else:
                formula = binary(node.connective, left, right)
            return _Value(formula, None, BOOLEAN, arguments[0].token)
        assert isinstance(node, Quantify)
        self._close(node)
        body = self._formula(arguments[0])
        bound = tuple(variable(name) for name, _, _ in node.variables)
        return _Value(quantified(node.quantifier, bound, body), None, BOOLEAN, node.token)

    def _variable(self, node: Var) -> _Value:
        scope = self.scopes.get(node.name)
        if scope:
            return _Value(None, variable(node.name), scope[-1], node.token)
        return _Value(None, variable(node.name), self.free.get(node.name), node.token)

    def _call(self, node: Call, arguments: list[_Value]) -> _Value:
        head = node.head
        if isinstance(head, Var):
            raise _unsupported(f"applying the variable `{head.name}` is not first-order", head.token)
        if isinstance(head, Refused):
            raise _unsupported(head.what, head.token)
        if isinstance(head, Quantify):
            self._open(head)  # refuses every binder but ! and ?
        if not isinstance(head, Word):
            raise _unsupported("applying something other than a symbol is not first-order", node.token)
        return self._application(head, node, arguments)

    def _application(self, head: Word, node, arguments: list[_Value]) -> _Value:
        symbol = head.text
        if symbol in ("$true", "$false") and not arguments:
            return _Value(VERUM if symbol == "$true" else FALSUM, None, BOOLEAN, head.token)
        for argument in arguments:
            if argument.formula is not None or argument.sort == BOOLEAN:
                raise _unsupported(
                    f"a formula as an argument of `{symbol}` is not first-order", argument.token
                )
        typed = self._type_of(head, arguments)
        if len(arguments) < len(typed.arguments):
            raise _unsupported(
                f"`{symbol}` of type `{typed}` is applied to {len(arguments)} of its "
                f"{len(typed.arguments)} arguments (partial application is not first-order)",
                head.token,
            )
        if len(arguments) > len(typed.arguments):
            raise TypeFault(
                f"`{symbol}` of type `{typed}` is applied to {len(arguments)} arguments", head.token
            )
        for position, (argument, sort) in enumerate(zip(arguments, typed.arguments), start=1):
            self._expect(argument, sort, f"argument {position} of `{symbol}`")
        term = application(symbol, tuple(a.term for a in arguments))
        if typed.result not in (BOOLEAN, _UNDECLARED):
            self.sorts.add(typed.result)
        return _Value(None, term, typed.result, head.token)

    def _type_of(self, head: Word, arguments: list[_Value]) -> SymbolType:
        symbol = head.text
        declared = self.signature.symbols.get(symbol)
        if declared is not None:
            if declared.unsupported:
                raise _unsupported(f"`{symbol}`: {declared.unsupported}", head.token)
            return declared
        number = number_sort(symbol)
        if number is not None:
            return SymbolType((), number)
        if symbol.startswith('"'):
            return SymbolType((), INDIVIDUALS)
        if symbol in _NOT_FIRST_ORDER_WORDS:
            raise _unsupported(_NOT_FIRST_ORDER_WORDS[symbol], head.token)
        if symbol in _ARITHMETIC_PREDICATES or symbol in _ARITHMETIC_FUNCTIONS or symbol in _CONVERSIONS:
            return self._arithmetic_type(head, arguments)
        if symbol.startswith("$") and not symbol.startswith("$$"):
            raise _unsupported(f"the defined symbol `{symbol}` is not read", head.token)
        # The standard's default: individuals in, and out unless a formula stands here.
        return SymbolType((INDIVIDUALS,) * len(arguments), _UNDECLARED)

    def _arithmetic_type(self, head: Word, arguments: list[_Value]) -> SymbolType:
        sorts = {a.sort for a in arguments if a.sort is not None}
        if len(sorts) != 1 or not sorts <= NUMERIC:
            raise TypeFault(
                f"the arguments of `{head.text}` must all be of one of $int, $rat, $real", head.token
            )
        (sort,) = sorts
        if head.text in _ARITHMETIC_PREDICATES:
            result = BOOLEAN
        else:
            result = _CONVERSIONS.get(head.text, sort)
        return SymbolType((sort,) * len(arguments), result)

    def _expect(self, value: _Value, sort: str, where: str) -> None:
        if value.sort is None:  # a free variable, first seen here
            self.free[value.term.symbol] = sort
            self.sorts.add(sort)
            return
        if value.sort == _UNDECLARED and sort == INDIVIDUALS:
            self.sorts.add(INDIVIDUALS)
            return
        if value.sort != sort:
            has = "is not declared, so is of type `$i`" if value.sort == _UNDECLARED else f"is of type `{value.sort}`"
            raise TypeFault(f"{where} must be of type `{sort}`, but `{value.term}` {has}", value.token)

    def _equality(self, node: Infix, left: _Value, right: _Value) -> _Value:
        for side in (left, right):
            if side.formula is not None or side.sort == BOOLEAN:
                raise _unsupported("equality between formulas is not read (use <=>)", side.token)
        left, right = (_individual(side, self.sorts) for side in (left, right))
        if left.sort is None and right.sort is None:
            self.free_pairs.append((left.term.symbol, right.term.symbol, node.token))
        elif left.sort is None:
            self._expect(left, right.sort, "the left side of `=`")
        elif right.sort is None:
            self._expect(right, left.sort, "the right side of `=`")
        elif left.sort != right.sort:
            raise TypeFault(
                f"the sides of `=` have different types: `{left.term}` is of type `{left.sort}`, "
                f"`{right.term}` of type `{right.sort}`",
                node.token,
            )
        atom = application(EQUALITY, (left.term, right.term))
        formula = atomic(atom) if node.positive else negation(atomic(atom))
        return _Value(formula, None, BOOLEAN, left.token)

    def _formula(self, value: _Value) -> Formula:
        if value.formula is not None:
            return value.formula
        if value.sort == _UNDECLARED or value.sort == BOOLEAN:
            if value.term.is_variable:
                raise _unsupported(
                    f"the variable `{value.term}` used as a formula is not first-order", value.token
                )
            return atomic(value.term)
        raise TypeFault(f"`{value.term}` of type `{value.sort}` stands where a formula is expected", value.token)

    def _settle_free_variables(self) -> None:
        """Free variables only ever equated to each other take the default sort."""
        for left, right, token in self.free_pairs:
            sorts = {self.free.get(left), self.free.get(right)} - {None}
            if len(sorts) > 1:
                raise TypeFault(f"the sides of `=` have different types: {' and '.join(sorted(sorts))}", token)
            sort = sorts.pop() if sorts else INDIVIDUALS
            self.free[left] = self.free[right] = sort
            self.sorts.add(sort)
        for name in self.free:
            self.sorts.add(self.free[name])


def _individual(value: _Value, sorts: set[str]) -> _Value:
    """An undeclared symbol's term, as a term: of type $i."""
    if value.sort != _UNDECLARED:
        return value
    sorts.add(INDIVIDUALS)
    return _Value(None, value.term, INDIVIDUALS, value.token)


def _children(node) -> tuple:
    if isinstance(node, Not):
        return (node.body,)
    if isinstance(node, Connect):
        return (node.left, node.right)
    if isinstance(node, Quantify):
        return (node.body,)
    if isinstance(node, Infix):
        return (node.left, node.right)
    if isinstance(node, Call):
        return node.arguments
    return ()


def erase_sorts(content, signature: Signature) -> Erased:
    """The kernel formula of a typed statement's content, after checking
    every term against ``signature``; raises :class:`TypeFault`."""
    return _Eraser(signature).erase(content)
