"""A quick reader for the plain shape of TPTP text, tried before the grammar.

Most of what a derivation says is plain: cnf and fof statements over
ordinary words, with an inference record or a file source, and terms,
clauses and formulas written alone (in a native certificate).
The LALR parser spends some 10 microseconds a token on them; this reader
cuts the text into tokens with one regular expression and reads the plain
shape straight into kernel objects.

It is no second grammar.  It recognises a strict subset of the language
and answers ``None`` for anything else -- typed statements and includes,
comments, numbers other than plain integers, distinct objects, quantified
clauses, formulas nested past a hundred levels, anything past an input
limit, and every error -- and the
caller then reads the text with the grammar (formats/tptp.lark), which
stays the reference for what the language means and the only source of
error messages.  Where it answers, it builds exactly what the grammar's
transformer builds; tests compare the two on generated text and on every
fixture.

Token shapes are those of the grammar's terminals (<lower_word>,
<upper_word>, <dollar_word>, <dollar_dollar_word>, <single_quoted>,
<integer>).  Terms and annotations are read iteratively, so their depth
costs no recursion; formulas recurse, at most a hundred levels (deeper
ones are left to the grammar).
"""

from __future__ import annotations

import re
import sys
from collections.abc import Callable, Collection

from checker.kernel.clauses import EQUALITY, Clause, Literal
from checker.kernel.formulas import FALSUM, IMPLIES, VERUM, Formula, atomic, binary, negation, quantified
from checker.kernel.terms import Term, application, variable
from formats.limits import current_limits

# A token, after optional whitespace: a word of the grammar's terminal
# shapes, an integer not continued as another number, or a mark.  Each is
# matched atomically, so the tokens the whole text is checked to consist of
# are exactly those findall cuts it into.
_ONE_TOKEN = (
    r"[ \t\r\n\f\v]*(?>("
    r"[a-z][a-zA-Z0-9_]*|[A-Z][a-zA-Z0-9_]*|\$\$?[a-z][a-zA-Z0-9_]*"
    r"|'(?:[ -&(-\[\]-~]|\\['\\])+'"
    r"|(?:0|[1-9][0-9]*)(?![0-9a-zA-Z_./])"
    r"|<=>|<~>|=>|<=|~\||~&|!=|[(),|&~=\[\]:.!?]))"
)
_TOKEN = re.compile(_ONE_TOKEN)
_ONLY_TOKENS = re.compile(f"(?:{_ONE_TOKEN})*+[ \t\r\n\f\v]*")
_LOWER_WORD = re.compile(r"[a-z][a-zA-Z0-9_]*")
_LOWER = frozenset("abcdefghijklmnopqrstuvwxyz")
_UPPER = frozenset("ABCDEFGHIJKLMNOPQRSTUVWXYZ")
_DIGITS = frozenset("0123456789")
_SYMBOL_START = _LOWER | _DIGITS | {"$", "'"}
_TRUE_ATOM = application("$true")
_FALSE_ATOM = application("$false")
_NONASSOC = frozenset(("<=>", "=>", "<=", "<~>", "~|", "~&"))
_FORMULA_DEPTH = 100
"""formulas bracketed, negated or quantified deeper than this are left to
the grammar, so that reading them here may recurse"""


class _NotPlain(Exception):
    """The text is not of the plain shape (or not well formed): leave it
    to the grammar."""


def _tokens(text: str) -> list[str | None] | None:
    """The tokens of ``text`` and a closing ``None``; None if some character
    is no token here or some word is longer than the name-length limit."""
    if _ONLY_TOKENS.fullmatch(text) is None:
        return None
    # Interned: a word kept in a term, a name or a role is then one object
    # for the run, not one per statement it appears in.
    tokens: list[str | None] = list(map(sys.intern, _TOKEN.findall(text)))
    limit = current_limits().name_length
    if len(text) > limit and max(map(len, tokens), default=0) > limit:
        return None
    tokens.append(None)
    return tokens


def _symbol(token: str) -> str:
    """A function or predicate symbol as the grammar's transformer names it:
    a single-quoted word loses its quotes when it needs none."""
    if token[0] == "'" and _LOWER_WORD.fullmatch(token, 1, len(token) - 1):
        return token[1:-1]
    return token


class _Reader:
    """One text's tokens, read from left to right."""

    __slots__ = ("tokens", "at")

    def __init__(self, tokens: list[str | None]):
        self.tokens = tokens
        self.at = 0

    def expect(self, mark: str) -> None:
        if self.tokens[self.at] != mark:
            raise _NotPlain
        self.at += 1

    def end(self) -> None:
        if self.tokens[self.at] is not None:
            raise _NotPlain

    def term(self) -> Term:
        """<fof_term>: a variable, or a plain, defined or system term."""
        tokens, at = self.tokens, self.at
        pending: list[tuple[str, list[Term]]] = []  # function terms whose arguments are being read
        while True:
            token = tokens[at]
            if token is None:
                raise _NotPlain
            at += 1
            first = token[0]
            if first in _UPPER:
                term = variable(token)
            elif first in _SYMBOL_START:
                symbol = _symbol(token) if first == "'" else token
                if tokens[at] == "(" and first not in _DIGITS:
                    at += 1
                    pending.append((symbol, []))
                    continue
                term = application(symbol)
            else:
                raise _NotPlain
            while pending:
                symbol, arguments = pending[-1]
                arguments.append(term)
                token = tokens[at]
                at += 1
                if token == ",":
                    break
                if token != ")":
                    raise _NotPlain
                pending.pop()
                term = application(symbol, tuple(arguments))
            else:
                self.at = at
                return term

    def literal(self) -> Literal | None:
        """<literal>; None for one the transformer drops ($false, ~$true)."""
        tokens = self.tokens
        positive = tokens[self.at] != "~"
        if not positive:
            self.at += 1
        left = self.term()
        relation = tokens[self.at]
        if relation == "=" or (relation == "!=" and positive):
            self.at += 1
            atom = application(EQUALITY, (left, self.term()))
            return Literal(relation == "=" and positive, atom)
        if left.is_variable or left.symbol[0] in _DIGITS:
            raise _NotPlain  # a variable or a number is no atom
        if atom_dropped(positive, left):
            return None
        return Literal(positive, left)

    def clause(self) -> Clause:
        """<cnf_formula> without a quantifier: a disjunction of literals,
        bracketed or not."""
        tokens = self.tokens
        bracketed = tokens[self.at] == "("
        if bracketed:
            self.at += 1
        limit = current_limits().literals
        literals: list[Literal] = []
        while True:
            literal = self.literal()
            if literal is not None:
                literals.append(literal)
                if len(literals) > limit:
                    raise _NotPlain
            if tokens[self.at] != "|":
                break
            self.at += 1
        if bracketed:
            self.expect(")")
        return Clause(literals)


    def formula(self, depth: int = 0) -> Formula:
        """<fof_logic_formula>: a unit formula, two joined by a
        non-associative connective, or a chain of ``|`` or of ``&``
        (grouped to the left, as the grammar's left-recursive rules do)."""
        tokens = self.tokens
        first = self.unit(depth)
        connective = tokens[self.at]
        if connective in _NONASSOC:
            self.at += 1
            second = self.unit(depth)
            return binary(IMPLIES, second, first) if connective == "<=" else binary(connective, first, second)
        if connective == "|" or connective == "&":
            while tokens[self.at] == connective:
                self.at += 1
                first = binary(connective, first, self.unit(depth))
        return first

    def unit(self, depth: int) -> Formula:
        """<fof_unit_formula>: negated, quantified, bracketed or atomic."""
        if depth > _FORMULA_DEPTH:
            raise _NotPlain
        tokens = self.tokens
        token = tokens[self.at]
        if token == "~":
            self.at += 1
            return negation(self.unit(depth + 1))
        if token == "!" or token == "?":
            self.at += 1
            self.expect("[")
            variables = []
            while True:
                name = tokens[self.at]
                if name is None or name[0] not in _UPPER:
                    raise _NotPlain
                variables.append(variable(name))
                separator = tokens[self.at + 1]
                self.at += 2
                if separator == "]":
                    break
                if separator != ",":
                    raise _NotPlain
            self.expect(":")
            return quantified(token, tuple(variables), self.unit(depth + 1))
        if token == "(":
            self.at += 1
            inner = self.formula(depth + 1)
            self.expect(")")
            return inner
        left = self.term()
        relation = tokens[self.at]
        if relation == "=" or relation == "!=":
            self.at += 1
            equation = atomic(application(EQUALITY, (left, self.term())))
            return equation if relation == "=" else negation(equation)
        if left.is_variable or left.symbol[0] in _DIGITS:
            raise _NotPlain  # a variable or a number is no atom
        if left is _TRUE_ATOM:
            return VERUM
        return FALSUM if left is _FALSE_ATOM else atomic(left)


def atom_dropped(positive: bool, atom: Term) -> bool:
    """Whether the transformer drops this literal from a clause."""
    return atom is (_FALSE_ATOM if positive else _TRUE_ATOM)


class PlainReader:
    """The quick reader, building annotations with the general-term
    classes of the grammar's transformer (given, so that both build the
    same objects)."""

    def __init__(
        self,
        word: Callable[..., object],
        function: Callable[[str, tuple], object],
        listing: Callable[[tuple], object],
        colon: Callable[[object, object], object],
        data: Callable[[str, object], object],
        roles: Collection[str],
    ):
        self._word, self._function, self._list = word, function, listing
        self._colon, self._data, self._roles = colon, data, roles

    def term(self, text: str) -> Term | None:
        """The term ``text`` spells, or None if it is not plain."""
        tokens = _tokens(text)
        if tokens is None:
            return None
        reader = _Reader(tokens)
        try:
            term = reader.term()
            reader.end()
        except _NotPlain:
            return None
        return term

    def clause(self, text: str) -> Clause | None:
        """The clause ``text`` spells (cnf syntax, no wrapper), or None."""
        tokens = _tokens(text)
        if tokens is None:
            return None
        reader = _Reader(tokens)
        try:
            clause = reader.clause()
            reader.end()
        except _NotPlain:
            return None
        return clause

    def formula(self, text: str) -> Formula | None:
        """The formula ``text`` spells (fof syntax, no wrapper), or None."""
        tokens = _tokens(text)
        if tokens is None:
            return None
        reader = _Reader(tokens)
        try:
            formula = reader.formula()
            reader.end()
        except _NotPlain:
            return None
        return formula

    def statement(self, text: str) -> tuple[str, str, str, Clause | Formula, object | None] | None:
        """Language, name, role, content and source (a general term, or
        None) of a plain ``cnf(...).`` or ``fof(...).`` statement, or None."""
        language = text[:3]
        if language != "cnf" and language != "fof":
            return None
        tokens = _tokens(text)
        if tokens is None or tokens[0] != language:
            return None
        reader = _Reader(tokens)
        reader.at = 1
        try:
            reader.expect("(")
            name = tokens[reader.at]
            if name is None or not (name[0] in _LOWER or name[0] in _DIGITS or name[0] == "'"):
                raise _NotPlain
            reader.at += 1
            reader.expect(",")
            role = tokens[reader.at]
            if role not in self._roles:
                raise _NotPlain
            reader.at += 1
            reader.expect(",")
            content = reader.clause() if language == "cnf" else reader.formula()
            source = None
            if tokens[reader.at] == ",":
                reader.at += 1
                source = self._general(reader)
                if tokens[reader.at] == ",":
                    reader.at += 1
                    self._general(reader)  # useful info: read, and not kept
            reader.expect(")")
            reader.expect(".")
            reader.end()
        except _NotPlain:
            return None
        return language, _symbol(name), role, content, source

    def _general(self, reader: _Reader) -> object:
        """<general_term>: words, variables, integers, functions, lists,
        ``data : term`` and formula data (``$fot``, ``$cnf``, ``$fof``)."""
        tokens = reader.tokens
        pending: list[list] = []  # ["(", name, items], ["[", items] or [":", data]
        while True:
            token = tokens[reader.at]
            reader.at += 1
            if token is None:
                raise _NotPlain
            first = token[0]
            is_data = True
            if token == "[":
                if tokens[reader.at] == "]":
                    reader.at += 1
                    value, is_data = self._list(()), False
                else:
                    pending.append(["[", []])
                    continue
            elif first in _LOWER or first == "'":
                if tokens[reader.at] == "(":
                    reader.at += 1
                    pending.append(["(", _symbol(token), []])
                    continue
                value = self._word(_symbol(token))
            elif first in _UPPER:
                value = self._word(token, is_variable=True)
            elif first in _DIGITS:
                value = self._word(token)
            elif token in _READ_DATA:
                reader.expect("(")
                value = self._data(token, _READ_DATA[token](reader))
                reader.expect(")")
            else:
                raise _NotPlain
            while True:
                if is_data and tokens[reader.at] == ":":
                    reader.at += 1
                    pending.append([":", value])
                    break
                while pending and pending[-1][0] == ":":
                    value = self._colon(pending.pop()[1], value)
                if not pending:
                    return value
                frame = pending[-1]
                frame[-1].append(value)
                token = tokens[reader.at]
                reader.at += 1
                if token == ",":
                    break
                if frame[0] == "(" and token == ")":
                    value, is_data = self._function(frame[1], tuple(frame[2])), True
                elif frame[0] == "[" and token == "]":
                    value, is_data = self._list(tuple(frame[1])), False
                else:
                    raise _NotPlain
                pending.pop()


_READ_DATA: dict[str, Callable[[_Reader], object]] = {"$fot": _Reader.term, "$cnf": _Reader.clause, "$fof": _Reader.formula}
