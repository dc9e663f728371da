"""Reader of the TPTP language (CNF, FOF, and TFF and THF where they are
first-order): files, and single clauses, formulas and terms written as
strings.

The grammar (formats/tptp.lark) is loaded once; an inline transformer
builds kernel objects during the LALR parse, so no parse tree is ever held
and nesting depth costs no Python recursion.  A file is first cut into
statements by formats/tptp_scan.py, which also skips a prover's log text
around the derivation; each statement is parsed on its own and its errors
are shifted back to the place in the file.  Typed statements are read
into a small syntax tree, whose types formats/tptp_types.py checks and
erases.
"""

from __future__ import annotations

import os
import re
from collections.abc import Iterator, Sequence
from dataclasses import dataclass
from pathlib import Path

from lark import Lark, Token, Transformer, v_args
from lark.exceptions import UnexpectedCharacters, UnexpectedToken

from checker.kernel.clauses import EQUALITY, Clause, Literal
from checker.kernel.formulas import (
    AND,
    FALSUM,
    IMPLIES,
    OR,
    VERUM,
    Formula,
    atomic,
    free_variables,
    binary,
    negation,
    quantified,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, variable
from formats.derivation import (
    Document,
    Inference,
    Location,
    Notice,
    Origin,
    Parent,
    Statement,
    UnreadableInput,
)
from formats.limits import current_limits, too_deep_at
from formats.tptp_plain import PlainReader
from formats.tptp_scan import SkippedText, StatementText, excerpt, most_statements, scan
from formats.tptp_types import (
    Call,
    Connect,
    Infix,
    Not,
    Quantify,
    Refused,
    Signature,
    TypeAtom,
    TypeFault,
    TypeMapping,
    TypeProduct,
    Typing,
    Var,
    Word,
    erase_sorts,
    token_of,
)

ROLES = frozenset(
    (
        "axiom", "hypothesis", "definition", "assumption", "lemma", "theorem",
        "corollary", "conjecture", "negated_conjecture", "plain", "type",
        "interpretation", "fi_domain", "fi_functors", "fi_predicates", "unknown",
    )
)
"""The formula roles of the TPTP syntax BNF (<formula_role>)."""

_LOWER_WORD = re.compile(r"[a-z][a-zA-Z0-9_]*")
_TRUE_ATOM = application("$true")
_FALSE_ATOM = application("$false")


# ------------------------------------------------------------ general terms
# The annotations of a statement are TPTP general terms; they are kept in
# this small form until the source is read from them.


@dataclass(frozen=True, slots=True, eq=False)
class _Word:
    """An atomic word, number, distinct object or variable."""

    text: str
    is_variable: bool = False


@dataclass(frozen=True, slots=True, eq=False)
class _Function:
    name: str
    arguments: tuple


@dataclass(frozen=True, slots=True, eq=False)
class _List:
    items: tuple


@dataclass(frozen=True, slots=True, eq=False)
class _Colon:
    """``data : term``, used by the standard for a parent's details."""

    data: object
    term: object


@dataclass(frozen=True, slots=True, eq=False)
class _Data:
    """``$fot(term)``, ``$fof(formula)`` or ``$cnf(clause)``."""

    kind: str
    value: Term | Formula | Clause


def _text(general) -> str:
    """A general term written back as TPTP text."""
    parts: list[str] = []
    stack: list = [general]
    while stack:
        item = stack.pop()
        if isinstance(item, str):
            parts.append(item)
        elif isinstance(item, _Word):
            parts.append(item.text)
        elif isinstance(item, _Data):
            parts.append(f"{item.kind}({item.value})")
        elif isinstance(item, _Colon):
            stack.extend((item.term, ":", item.data))
        else:
            if isinstance(item, _Function):
                opening, closing, members = item.name + "(", ")", item.arguments
            else:
                opening, closing, members = "[", "]", item.items
            parts.append(opening)
            stack.append(closing)
            for index in range(len(members) - 1, -1, -1):
                stack.append(members[index])
                if index:
                    stack.append(",")
    return "".join(parts)


def _as_term(general) -> Term | None:
    """The first-order term a general term spells, or None if it is not one
    (a list, a colon pair, formula data other than ``$fot``)."""
    done: dict[int, Term] = {}
    stack = [general]
    while stack:
        item = stack[-1]
        if isinstance(item, _Word):
            done[id(item)] = variable(item.text) if item.is_variable else application(item.text)
        elif isinstance(item, _Data) and item.kind == "$fot":
            done[id(item)] = item.value
        elif isinstance(item, _Function):
            pending = [a for a in item.arguments if id(a) not in done]
            if pending:
                stack.extend(pending)
                continue
            done[id(item)] = application(
                item.name, tuple(done[id(a)] for a in item.arguments)
            )
        else:
            return None
        stack.pop()
    return done[id(general)]


def _function(general, name: str, arities: tuple[int, ...]) -> bool:
    return (
        isinstance(general, _Function)
        and general.name == name
        and len(general.arguments) in arities
    )


def _members(general) -> tuple:
    """The items of a general list, or the term itself as the only item."""
    return general.items if isinstance(general, _List) else (general,)


def _unquoted(text: str) -> str:
    """The content of a single-quoted word, escapes resolved."""
    if len(text) >= 2 and text[0] == text[-1] == "'":
        return re.sub(r"\\(.)", r"\1", text[1:-1])
    return text


def _bindings(details) -> Substitution | None:
    """The ``bind(X, t)`` items of a parent's details, as a substitution."""
    mapping: dict[Term, Term] = {}
    for item in _members(details):
        if _function(item, "bind", (2,)):
            bound, value = item.arguments
            term = _as_term(value)
            if isinstance(bound, _Word) and bound.is_variable and term is not None:
                mapping[variable(bound.text)] = term
    return Substitution(mapping) if mapping else None


def _inference(record, built: dict[int, Inference]) -> Inference:
    rule, useful_info, parents = record.arguments
    status = None
    info: list[str] = []
    for item in _members(useful_info):
        if status is None and _function(item, "status", (1,)):
            status = _text(item.arguments[0])
        else:
            info.append(_text(item))
    found: list[Parent | Inference] = []
    for parent in _members(parents):
        details = None
        if isinstance(parent, _Colon):
            parent, details = parent.data, parent.term
        if id(parent) in built:
            found.append(built[id(parent)])
        elif isinstance(parent, _Word) and not parent.is_variable:
            found.append(Parent(parent.text, _bindings(details) if details else None))
        else:
            info.append(_text(parent))
    return Inference(_text(rule), status, tuple(found), info=tuple(info))


def _is_inference(general) -> bool:
    return _function(general, "inference", (3,))


def _source(general) -> Inference | Origin:
    """The source of a statement, from its general-term form (TPTP <source>)."""
    if _is_inference(general):
        records = []
        stack = [general]
        while stack:
            record = stack.pop()
            records.append(record)
            for parent in _members(record.arguments[2]):
                if isinstance(parent, _Colon):
                    parent = parent.data
                if _is_inference(parent):
                    stack.append(parent)
        built: dict[int, Inference] = {}
        for record in reversed(records):
            built[id(record)] = _inference(record, built)
        return built[id(general)]
    if _function(general, "file", (1, 2)) and isinstance(general.arguments[0], _Word):
        name = _text(general.arguments[1]) if len(general.arguments) == 2 else ""
        return Origin("file", (_unquoted(general.arguments[0].text), name))
    for kind in ("introduced", "theory"):
        if _function(general, kind, (1, 2)):
            first, *rest = general.arguments
            info = tuple(_text(item) for extra in rest for item in _members(extra))
            return Origin(kind, (_text(first),) + info)
    return Origin("unknown", (_text(general),))


# ------------------------------------------------------------ the transformer


class _Misread(Exception):
    """A statement that parses but breaks a rule of the standard; carries
    the token where it was noticed."""

    def __init__(self, message: str, token: Token):
        super().__init__(message)
        self.message = message
        self.token = token


@dataclass(frozen=True, slots=True)
class _Annotated:
    language: str
    name: str
    role: str
    content: object  # a Clause or Formula; for tff and thf, a tptp_types syntax tree
    source: Inference | Origin | None
    sorts: frozenset[str] | None = None


@dataclass(frozen=True, slots=True)
class _Include:
    file_name: str
    selection: tuple[str, ...] | None


def _appended(self, items, *more):
    """One step of a left-recursive list rule: start the list or extend it."""
    if not more:
        return [items]
    items.append(more[0])
    return items


@v_args(inline=True)
class _Builder(Transformer):
    """One short method per grammar rule, each returning a kernel object
    (or, for annotations, a general term)."""

    # terms
    def variable(self, token):
        return variable(str(token))

    def atomic_word(self, token):
        text = str(token)
        if text[0] == "'" and _LOWER_WORD.fullmatch(text, 1, len(text) - 1):
            return text[1:-1]
        return text

    def constant(self, symbol):
        return application(str(symbol))

    def function_term(self, symbol, arguments):
        return application(str(symbol), tuple(arguments))

    fof_arguments = _appended
    fof_variable_list = _appended

    # atoms
    def fof_defined_infix_formula(self, left, right):
        return application(EQUALITY, (left, right))

    fof_infix_unary = fof_defined_infix_formula

    # FOF
    def atom_formula(self, atom):
        if atom is _TRUE_ATOM:
            return VERUM
        if atom is _FALSE_ATOM:
            return FALSUM
        return atomic(atom)

    def negated_formula(self, formula):
        return negation(formula)

    def inequality_formula(self, atom):
        return negation(atomic(atom))

    def nonassoc_connective(self, token):
        return str(token)

    def fof_binary_nonassoc(self, left, connective, right):
        if connective == "<=":
            return binary(IMPLIES, right, left)
        return binary(connective, left, right)

    def fof_or_formula(self, left, right):
        return binary(OR, left, right)

    def fof_and_formula(self, left, right):
        return binary(AND, left, right)

    def fof_quantifier(self, token):
        return str(token)

    def fof_quantified_formula(self, quantifier, variables, body):
        return quantified(quantifier, tuple(variables), body)

    def fof_formula(self, formula):
        return formula

    # CNF: literals are None when they are dropped ($false, ~$true)
    def positive_literal(self, atom):
        return None if atom is _FALSE_ATOM else Literal(True, atom)

    def negative_literal(self, atom):
        return None if atom is _TRUE_ATOM else Literal(False, atom)

    def inequality_literal(self, atom):
        return Literal(False, atom)

    def disjunction(self, first, *more):
        """Start or extend the list of kept literals."""
        if not more:
            return [] if first is None else [first]
        if more[0] is not None:
            first.append(more[0])
            limits = current_limits()
            if len(first) > limits.literals:
                raise _Misread(f"a clause of more than {limits.literals} literals; {limits.describe('literals')}",
                               _last_bar[0])
        return first

    def single_literal(self, literal):
        return [] if literal is None else [literal]

    def cnf_quantified(self, variables, literals):
        return literals

    def cnf_formula(self, literals):
        return Clause(literals)

    # annotations
    def general_word(self, word):
        return _Word(str(word))

    def general_variable(self, token):
        return _Word(str(token), is_variable=True)

    def general_function(self, name, arguments):
        return _Function(name, tuple(arguments))

    def general_list(self, items=()):
        return _List(tuple(items))

    general_terms = _appended

    def general_colon(self, data, term):
        return _Colon(data, term)

    def formula_data(self, kind, value):
        return _Data(str(kind), value)

    def annotations(self, source, useful_info=None):
        """The source; a statement's own useful info has no place in the data model."""
        return source

    # statements
    def name(self, word):
        return str(word)

    name_list = _appended

    def formula_role(self, token):
        if token not in ROLES:
            raise _Misread(f"unknown formula role '{token}'", token)
        return str(token)

    def file_name(self, token):
        return _unquoted(str(token))

    def formula_selection(self, names):
        return tuple(names)

    def include(self, file_name, selection=None):
        return _Include(file_name, selection)

    def fof_annotated(self, name, role, formula, source=None):
        return _Annotated("fof", name, role, formula, None if source is None else _source(source))

    def cnf_annotated(self, name, role, clause, source=None):
        return _Annotated("cnf", name, role, clause, None if source is None else _source(source))

    def tff_annotated(self, name, role, content, source=None):
        return _Annotated("tff", name, role, content, None if source is None else _source(source))

    def thf_annotated(self, name, role, content, source=None):
        return _Annotated("thf", name, role, content, None if source is None else _source(source))

    # TFF and THF: a syntax tree, checked and erased in formats/tptp_types.py
    def thf_word(self, token):
        return Word(_symbol_text(token), token)

    def thf_quantifier_constant(self, token):
        return Refused(f"the quantifier constant {token} (quantifying over a function) is not first-order", token)

    def thf_connective_term(self, token):
        return Refused(f"the connective ({token}) used as a term is not first-order", token)

    def thf_variable_use(self, token):
        return Var(str(token), token)

    def thf_atomic_formula(self, word, arguments=None):
        if arguments is None:
            return word
        return Call(word, tuple(arguments), word.token if isinstance(word, Word) else word.token)

    thf_arguments = _appended

    def thf_apply_formula(self, function, argument):
        """``f @ a @ b`` as one application of ``f`` to both arguments,
        however it is bracketed."""
        if isinstance(function, Call):
            return Call(function.head, function.arguments + (argument,), function.token)
        return Call(function, (argument,), token_of(function))

    def thf_unary_formula(self, body):
        return Not(body)

    def thf_defined_infix(self, left, relation, right):
        return Infix(relation == "=", left, right, relation)

    def thf_binary_pair(self, left, connective, right):
        return Connect(connective, left, right)

    def thf_or_formula(self, left, right):
        return Connect(OR, left, right)

    def thf_and_formula(self, left, right):
        return Connect(AND, left, right)

    def thf_quantifier(self, token):
        return token

    def thf_variable(self, token, declared=None):
        return (str(token), declared, token)

    thf_variable_list = _appended

    def thf_quantified_formula(self, quantifier, variables, body):
        return Quantify(str(quantifier), tuple(variables), body, quantifier)

    def typed_symbol(self, token):
        return token

    def thf_atom_typing(self, symbol, declared=None):
        if declared is None:  # "(" typing ")"
            return symbol
        return Typing(_symbol_text(symbol), declared, symbol)

    def type_atom(self, token):
        return TypeAtom(_symbol_text(token), token)

    def type_application(self, token, arguments):
        return Refused(f"the type constructor `{token}` (types with arguments) is not first-order", token)

    type_arguments = _appended

    def type_mapping(self, domain, result):
        return TypeMapping(domain, result, _type_token(domain))

    def type_xprod(self, left, right):
        if isinstance(left, TypeProduct):
            return TypeProduct(left.items + (right,), left.token)
        return TypeProduct((left, right), _type_token(left))

    def type_quantified(self, variables, body):
        return Refused("polymorphic types (!>) are not first-order", variables[0][2])


def _symbol_text(token: Token) -> str:
    """A symbol as the fof reader names it: quotes dropped where the word
    needs none."""
    text = str(token)
    if text[0] == "'" and _LOWER_WORD.fullmatch(text, 1, len(text) - 1):
        return text[1:-1]
    return text


def _type_token(node) -> Token:
    return node.token


_WORDS = ("LOWER_WORD", "UPPER_WORD", "SINGLE_QUOTED", "DOLLAR_WORD", "DOLLAR_DOLLAR_WORD", "DISTINCT_OBJECT",
          "INTEGER", "NUMBER")
_last_bar: list[Token | None] = [None]
"""The last ``|`` the lexer passed: where a clause grew past the literal limit."""


def _bounded_word(token: Token) -> Token:
    limits = current_limits()
    if len(token) > limits.name_length:
        raise _Misread(f"a name of {len(token)} characters; {limits.describe('name_length')}", token)
    return token


def _seen_bar(token: Token) -> Token:
    _last_bar[0] = token
    return token


_PARSER = Lark(
    (Path(__file__).with_name("tptp.lark")).read_text(encoding="utf-8"),
    parser="lalr",
    start=["tptp_input", "cnf_formula", "fof_formula", "fof_term"],
    transformer=_Builder(),
    maybe_placeholders=False,
    lexer_callbacks={**{word: _bounded_word for word in _WORDS}, "VBAR": _seen_bar},
)


# ------------------------------------------------------------ errors

_TERMINAL_WORDS = {
    "LOWER_WORD": "a lower-case word",
    "UPPER_WORD": "a variable",
    "SINGLE_QUOTED": "a 'single-quoted' word",
    "DISTINCT_OBJECT": 'a "distinct object"',
    "DOLLAR_WORD": "a $word",
    "DOLLAR_DOLLAR_WORD": "a $$word",
    "INTEGER": "an integer",
    "NUMBER": "a number",
    "$END": "the end of the text",
    "QUANTIFIER_CONSTANT": "'!!', '??', '@@+', '@@-'",
    "CONNECTIVE_TERM": "a connective in brackets",
    "DEFINED_INFIX": "'=', '!='",
}


def _describe(terminal: str) -> str:
    """A terminal of the grammar in plain words; literal ones as written."""
    return _TERMINAL_WORDS.get(terminal) or f"'{_PARSER.get_terminal(terminal).pattern.value}'"


def _expected(terminals) -> str:
    words = sorted({_describe(name) for name in terminals})
    if len(words) > 1:
        words = [", ".join(words[:-1]) + " or " + words[-1]]
    return "".join(f"; expected {word}" for word in words)


def _explain(error: UnexpectedCharacters | UnexpectedToken) -> tuple[str, int, int]:
    """Message, line and column (within the parsed text) of a parse error."""
    if isinstance(error, UnexpectedCharacters):
        return (
            f"unexpected character {error.char!r}{_expected(error.allowed or ())}",
            error.line,
            error.column,
        )
    token = error.token
    if token.type == "$END":
        line = token.end_line or 1
        column = token.end_column or 1
        return f"unexpected end of text{_expected(error.expected)}", line, column
    return f"unexpected '{token}'{_expected(error.expected)}", token.line, token.column


def _parse(text: str, start: str, file: str, line: int, column: int, whole: str | None = None):
    """Parse ``text`` from rule ``start``; it begins at (line, column) of
    ``file``, whose full text ``whole`` supplies the excerpt when given."""
    limits = current_limits()
    deep = too_deep_at(text, limits.depth)
    if deep is not None:
        at_line = text.count("\n", 0, deep) + 1
        at_column = deep - (text.rfind("\n", 0, deep) + 1) + 1
        message = f"brackets nested more than {limits.depth} deep; {limits.describe('depth')}"
        raise _unreadable(message, at_line, at_column, text, file, line, column, whole)
    plain = _plain(text, start)
    if plain is not None:
        return plain
    try:
        return _PARSER.parse(text, start=start)
    except (UnexpectedCharacters, UnexpectedToken) as error:
        message, at_line, at_column = _explain(error)
        if start == "tptp_input" and text.startswith(("tff", "thf")):
            message += _TYPED_HINT
    except _Misread as error:
        message, at_line, at_column = error.message, error.token.line, error.token.column
    raise _unreadable(message, at_line, at_column, text, file, line, column, whole)


_PLAIN = PlainReader(_Word, _Function, _List, _Colon, _Data, ROLES)


def _plain(text: str, start: str):
    """What the grammar would read from ``text``, if it is of the plain shape
    formats/tptp_plain.py reads on its own (most statements, clauses,
    formulas and terms); else None."""
    if start == "cnf_formula":
        return _PLAIN.clause(text)
    if start == "fof_term":
        return _PLAIN.term(text)
    if start == "fof_formula":
        return _PLAIN.formula(text)
    if start == "tptp_input":
        read = _PLAIN.statement(text)
        if read is not None:
            language, name, role, content, source = read
            return _Annotated(language, name, role, content, None if source is None else _source(source))
    return None


_TYPED_HINT = (
    " (of tff and thf, only the first-order part is read: typed quantifiers, type declarations, "
    "application by @; see the README)"
)


def _unreadable(
    message: str, at_line: int, at_column: int, text: str, file: str, line: int, column: int, whole: str | None
) -> UnreadableInput:
    """The error at (at_line, at_column) of ``text``, which begins at (line,
    column) of ``file``."""
    file_line = line + at_line - 1
    file_column = at_column + (column - 1 if at_line == 1 else 0)
    if whole is None:
        shown, shown_column = text.split("\n")[at_line - 1], at_column
    else:
        shown, shown_column = whole.split("\n")[file_line - 1], file_column
    return UnreadableInput(message, Location(file, file_line, file_column), excerpt(shown, shown_column))


def _string_origin(where: Location | None) -> tuple[str, int, int]:
    return (where.file, where.line, where.column) if where else ("<string>", 1, 1)


# ------------------------------------------------------------ public API


_READINGS: dict[tuple[str, str], object] = {}
_READINGS_LIMITS: list = [None]
_READINGS_KEPT = 100_000


def _remembered(text: str, start: str, where: Location | None):
    """Term strings repeat in a certificate (a substitution's terms,
    variable names), so each distinct one is read once.  (Clause and
    formula strings rarely repeat: remembering them would keep the text of
    every statement for the whole run.)  Only readings that
    succeeded are kept, under the input limits they were read with; the
    kernel objects they hold are forgotten with the file
    (:func:`forget_readings`, from checker/tables.py)."""
    limits = current_limits()
    if _READINGS_LIMITS[0] is not limits or len(_READINGS) > _READINGS_KEPT:
        _READINGS.clear()
        _READINGS_LIMITS[0] = limits
    key = (start, text)
    read = _READINGS.get(key)
    if read is None:
        read = _READINGS[key] = _parse(text, start, *_string_origin(where))
    return read


def forget_readings() -> None:
    """Drop the remembered readings of strings (their terms are a file's)."""
    _READINGS.clear()


def parse_clause(text: str, where: Location | None = None) -> Clause:
    """A clause written in TPTP cnf syntax, without the cnf(...) wrapper."""
    return _parse(text, "cnf_formula", *_string_origin(where))


def parse_formula(text: str, where: Location | None = None) -> Formula:
    """A formula written in TPTP fof syntax, without the fof(...) wrapper."""
    return _parse(text, "fof_formula", *_string_origin(where))


def parse_term(text: str, where: Location | None = None) -> Term:
    """A first-order term written in TPTP syntax."""
    return _remembered(text, "fof_term", where)


# ------------------------------------------------------------ files

_UNSUPPORTED = {
    "tcf": "the typed clause language tcf is not read (write clauses as cnf, or typed formulas as tff)",
    "tpi": "the process instruction language tpi is not read",
}


@dataclass(slots=True)
class _Frame:
    """A file being read, with the statements read from it so far."""

    path: str
    identity: str | None
    text: str
    chunks: Iterator[StatementText | SkippedText]
    statements: list[Statement]
    selection: tuple[str, ...] | None = None
    included_at: Location | None = None


def _excerpt_at(whole: str, location: Location) -> str:
    lines = whole.split("\n")
    shown = lines[location.line - 1] if location.line <= len(lines) else ""
    return excerpt(shown, location.column)


def _identity(path: str) -> str:
    return os.path.realpath(path)


def _file_text(path: str, location: Location | None) -> str:
    """The text of ``path``; a failure to read it is unreadable input at
    ``location`` (the include), or at the file itself."""
    where = location or Location(path, 1, 1)
    try:
        with open(path, encoding="utf-8-sig") as handle:  # a byte-order mark is no text
            return handle.read()
    except FileNotFoundError:
        raise UnreadableInput(f"file not found: {path}", where) from None
    except UnicodeDecodeError as error:
        raise UnreadableInput(f"file is not UTF-8 text: {path} ({error.reason})", where) from None
    except OSError as error:
        raise UnreadableInput(f"cannot read {path}: {error.strerror}", where) from None


def _included_path(
    file_name: str, including: str, include_dirs: Sequence[str], location: Location, whole: str
) -> str:
    """Where an included file is: next to the including file, else in each
    include directory in turn."""
    if os.path.isabs(file_name):
        candidates = [file_name]
    else:
        candidates = [os.path.join(os.path.dirname(including), file_name)]
        candidates += [os.path.join(directory, file_name) for directory in include_dirs]
    for candidate in candidates:
        if os.path.isfile(candidate):
            return os.path.normpath(candidate)
    looked = ", ".join(os.path.normpath(c) for c in candidates)
    raise UnreadableInput(
        f"included file '{file_name}' not found (looked for {looked})",
        location,
        _excerpt_at(whole, location),
    )


def _selected(frame: _Frame, whole: str) -> list[Statement]:
    """The statements an include's name list selects, in written order."""
    wanted = set(frame.selection)
    missing = wanted - {statement.name for statement in frame.statements}
    if missing:
        raise UnreadableInput(
            f"included file {frame.path} has no statement named "
            + ", ".join(sorted(missing)),
            frame.included_at,
            _excerpt_at(whole, frame.included_at),
        )
    return [s for s in frame.statements if s.name in wanted]


def _read(text: str, path: str, include_dirs: Sequence[str], identity: str | None) -> Document:
    """Read one file's statements, expanding includes in place.  Open files
    form an explicit stack, which is also what finds include cycles."""
    notices: list[Notice] = []
    signature = Signature()
    files = [path]
    _within_statement_limit(text, path)
    allowed = None  # text that is not a file's has no directory of its own to keep includes in
    if identity is not None:
        allowed = tuple(os.path.realpath(directory) for directory in (os.path.dirname(identity), *include_dirs))
    root = _Frame(path, identity, text, scan(text, path), [])
    stack = [root]
    while stack:
        frame = stack[-1]
        chunk = next(frame.chunks, None)
        if chunk is None:
            stack.pop()
            if stack:
                done = frame.statements
                if frame.selection is not None:
                    done = _selected(frame, stack[-1].text)
                stack[-1].statements.extend(done)
            continue
        location = Location(frame.path, chunk.line, chunk.column)
        if isinstance(chunk, SkippedText):
            plural = "line" if chunk.lines == 1 else "lines"
            notices.append(
                Notice(f"skipped {chunk.lines} {plural} of text that is not TPTP", location)
            )
            continue
        if chunk.keyword in _UNSUPPORTED:
            raise UnreadableInput(
                f"unsupported: {_UNSUPPORTED[chunk.keyword]}",
                location,
                _excerpt_at(frame.text, location),
            )
        read = _parse(chunk.text, "tptp_input", frame.path, chunk.line, chunk.column, frame.text)
        if isinstance(read, _Annotated) and read.language in ("tff", "thf"):
            read = _typed(read, signature, chunk, frame)
            if read is None:  # a type declaration
                continue
        if isinstance(read, _Include):
            target = _included_path(
                read.file_name, frame.path, include_dirs, location, frame.text
            )
            target_identity = _identity(target)
            _refuse_outside(read.file_name, target_identity, allowed, location, frame.text)
            opened = [f.identity for f in stack]
            if target_identity in opened:
                cycle = [f.path for f in stack[opened.index(target_identity):]] + [target]
                raise UnreadableInput(
                    "include cycle: " + " -> ".join(cycle),
                    location,
                    _excerpt_at(frame.text, location),
                )
            included = _file_text(target, location)
            _within_statement_limit(included, target)
            files.append(target)
            stack.append(
                _Frame(
                    target, target_identity, included, scan(included, target), [],
                    read.selection, location,
                )
            )
        else:
            frame.statements.append(
                Statement(read.name, read.role, read.language, read.content, location, read.source, read.sorts)
            )
            notices.extend(_free_variable_notice(read, location))
    return Document(path, tuple(root.statements), tuple(notices), "tptp", tuple(files))


def _within_statement_limit(text: str, path: str) -> None:
    """Refuse, before parsing any, a file with more statements than the
    limit allows (each is at least 15 characters, so most files pass at
    the cost of their length, most others at the cost of counting their
    keywords)."""
    limit = current_limits().statements
    if len(text) <= 15 * limit or most_statements(text) <= limit:
        return
    count = 0
    for chunk in scan(text, path):
        if isinstance(chunk, StatementText):
            count += 1
            if count > limit:
                location = Location(path, chunk.line, chunk.column)
                raise UnreadableInput(
                    f"more than {limit} statements in one file; {current_limits().describe('statements')}",
                    location, _excerpt_at(text, location),
                )


def _refuse_outside(
    file_name: str, target: str, allowed: tuple[str, ...] | None, location: Location, whole: str
) -> None:
    """An include in a file may reach only into that file's directory and
    the include directories (and their subdirectories): a derivation must
    not make assay read other files."""
    if allowed is not None and not any(os.path.commonpath((target, directory)) == directory for directory in allowed):
        raise UnreadableInput(
            f"included file '{file_name}' is outside the allowed directories ({', '.join(allowed)}); "
            "add its directory with --include-dir if it is meant to be read",
            location,
            _excerpt_at(whole, location),
        )


def _free_variable_notice(read: _Annotated, location: Location) -> list[Notice]:
    """A formula statement with free variables: read as universally
    quantified, but the standard's formulas are closed, so a bracketing
    slip (``! [X] : p(X) => q(X)``) would silently change what it says."""
    if read.language == "cnf" or not isinstance(read.content, Formula):
        return []
    free = sorted(variable.symbol for variable in free_variables(read.content))
    if not free:
        return []
    plural = "variables" if len(free) > 1 else "variable"
    return [Notice(f"{read.language} formula {read.name} has the free {plural} {', '.join(free)} "
                   "(read as universally quantified; the standard's formulas are closed: check the brackets)",
                   location)]


def _typed(read: _Annotated, signature: Signature, chunk: StatementText, frame: _Frame) -> _Annotated | None:
    """A tff or thf statement with its sorts checked and erased; a type
    declaration goes into ``signature`` instead (None)."""
    try:
        if isinstance(read.content, Typing):
            if read.role != "type":
                raise TypeFault(f"a type declaration must have the role type, not {read.role}", read.content.token)
            signature.declare(read.content)
            return None
        if read.role == "type":
            raise TypeFault("a statement with the role type must declare a symbol (name: type)", token_of(read.content))
        erased = erase_sorts(read.content, signature)
    except TypeFault as fault:
        at_line, at_column = (fault.token.line, fault.token.column) if fault.token is not None else (1, 1)
        raise _unreadable(
            fault.message, at_line, at_column, chunk.text, frame.path, chunk.line, chunk.column, frame.text
        ) from None
    return _Annotated(read.language, read.name, read.role, erased.formula, read.source, erased.sorts)


def parse_tptp(text: str, path: str = "<string>", include_dirs: Sequence[str] = ()) -> Document:
    """The statements of TPTP text; includes are found relative to ``path``'s
    directory, then in ``include_dirs``."""
    identity = _identity(path) if os.path.isfile(path) else None
    return _read(text, path, include_dirs, identity)


def read_tptp(path: str, include_dirs: Sequence[str] = ()) -> Document:
    """The statements of a TPTP file, includes expanded in place."""
    return _read(_file_text(path, None), path, include_dirs, _identity(path))
