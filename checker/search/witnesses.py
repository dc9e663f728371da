"""Guessing which quantifier each new symbol of a Skolemization step witnesses.

Untrusted: a guess only names a quantifier and witness terms; the kernel
checks their shape and builds the Skolemized premise itself
(checker.kernel.introductions.skolemize), and the step must still follow
from that.  A wrong guess costs completeness only.  Quantifiers are taken
outermost first, so a witness for an inner quantifier is built after the
outer ones are replaced, as Skolemization does.
"""

from __future__ import annotations

import itertools
from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass

from checker.kernel.clauses import Clause
from checker.kernel.formulas import (
    EXISTS,
    FORALL,
    Formula,
    argument_polarities,
    free_variables,
    symbols_of_formula,
)
from checker.kernel.terms import Term, application, subterms, variable
from checker.search.findings import PAIRINGS, checked_pairing, hook

Symbol = tuple[str, int]


@dataclass(frozen=True, slots=True)
class Witnessing:
    """The proposal: in premise ``premise``, the bound variable ``bound`` of
    ``quantifier`` is witnessed by ``witness``."""

    premise: int
    quantifier: Formula
    bound: Term
    witness: Term


@dataclass(frozen=True, slots=True)
class Misfit:
    """Why no proposal fits a new symbol: it could only replace a quantifier
    of the wrong polarity (``wrong_polarity``), or there is none."""

    symbol: Symbol
    reason: str
    message: str


def _with_context(formula: Formula) -> Iterator[tuple[Formula, int, tuple[Term, ...]]]:
    """Subformula occurrences outermost first, with polarity and the
    variables bound around them, outermost binder first."""
    stack = [(formula, 1, ())]
    while stack:
        current, polarity, bound = stack.pop()
        yield current, polarity, bound
        inner = bound + current.variables
        factors = argument_polarities(current.connective)
        for argument, factor in reversed(tuple(zip(current.arguments, factors))):
            stack.append((argument, polarity * factor, inner))


def _uses(conclusion: Clause | Formula, symbols: set[Symbol]) -> list[Term]:
    """The first occurrence of each of ``symbols`` in the conclusion, in
    written order."""
    if isinstance(conclusion, Clause):
        atoms = [literal.atom for literal in conclusion.literals]
    else:
        atoms = [f.atom for f, _, _ in _with_context(conclusion) if f.atom is not None]
    uses: dict[Symbol, Term] = {}
    for atom in atoms:
        for position, term in subterms(atom):
            key = (term.symbol, term.arity)
            if position and not term.is_variable and key in symbols and key not in uses:
                uses[key] = term
    return list(uses.values())


def _arrangements(use: Term | None, symbol: Symbol, free_in_order: list[Term]) -> Iterator[Term]:
    """Skolem terms of ``symbol`` over the quantifier's free variables, the
    likeliest first: the symbol's first use when its arguments are exactly
    those variables, then every placement of them among the arguments
    (binding order first), extra arguments filled with new variables."""
    name, arity = symbol
    if use is not None and set(use.arguments) == set(free_in_order) and len(set(use.arguments)) == arity:
        yield use
    padding: list[Term] = []
    number = 0
    while len(padding) < arity - len(free_in_order):
        candidate = variable(f"W{number}")
        number += 1
        if candidate not in free_in_order:
            padding.append(candidate)
    for places in itertools.permutations(range(arity), len(free_in_order)):
        arguments = list(padding)
        for place in sorted(range(len(places)), key=places.__getitem__):
            arguments.insert(places[place], free_in_order[place])
        witness = application(name, tuple(arguments))
        if witness is not use:
            yield witness


def _replaceable(premises: Sequence[Formula], skipped: frozenset) -> tuple[list, Formula | None]:
    """The quantifiers (premise by premise, outermost first) that
    Skolemization may replace and that are not ``skipped``, each with its
    premise and its free variables in binding order; and a quantifier it
    may not replace, if there is one."""
    found = []
    improper = None
    for index, premise in enumerate(premises):
        for formula, polarity, bound in _with_context(premise):
            if formula.connective not in (EXISTS, FORALL) or (index, formula) in skipped:
                continue
            if polarity != (1 if formula.connective == EXISTS else -1):
                improper = improper or formula
                continue
            free = free_variables(formula)
            free_in_order = [v for v in dict.fromkeys(bound) if v in free]
            free_in_order += sorted(free - set(free_in_order), key=lambda v: v.symbol)
            found.append((index, formula, free_in_order))
    return found, improper


@dataclass(frozen=True, slots=True)
class Readings:
    """The ways found of pairing every new symbol with a quantifier of its
    own, each a list of witnessings in the order Skolemization applies them
    (outermost first); ``exhaustive`` when the bound did not cut the
    enumeration short, so that no other pairing exists; ``misfit`` says why
    there is none."""

    found: tuple[tuple[Witnessing, ...], ...]
    exhaustive: bool
    misfit: Misfit | None
    anonymous: frozenset[str] = frozenset()
    """the symbols of nothing else put in for outer existentials
    (:func:`readings_with_anonymous_outer`)"""


def _given_readings(args: tuple, kwargs: dict, pairings: tuple) -> Readings:
    """Pairings from a certificate, each re-checked by the kernel; never
    exhaustive, so that no choice of a certificate can refute a step."""
    for pairing in pairings:
        checked_pairing(args[0], args[2], pairing)
    found = tuple(tuple(Witnessing(*witnessing) for witnessing in pairing) for pairing in pairings)
    return Readings(found, False, None)


@hook(
    PAIRINGS,
    question=lambda premises, conclusion, new, *rest: (list(premises), conclusion, set(new)),
    keep=lambda readings: tuple(
        tuple((w.premise, w.quantifier, w.bound, w.witness) for w in pairing) for pairing in readings.found
    ) or None,
    give=_given_readings,
    nothing=lambda: Readings((), False, None),
)
def witness_readings(
    premises: Sequence[Formula],
    conclusion: Clause | Formula,
    new: set[Symbol],
    bound: int,
    replace: Callable[[Formula, Witnessing], Formula | None],
) -> Readings:
    """Every pairing of the new symbols with distinct quantifiers that
    Skolemization may replace, each symbol taking at least the quantifier's
    free variables as arguments, the likeliest first: symbols whose arity
    is the quantifier's number of free variables, in order of first use.
    A quantifier may be left unwitnessed.  ``replace`` applies a witnessing
    (the kernel's Skolemization; None when it refuses).  At most ``bound``
    choices are explored."""
    return _readings(premises, conclusion, new, bound, replace, anonymous=False)


def readings_with_anonymous_outer(
    premises: Sequence[Formula],
    conclusion: Clause | Formula,
    new: set[Symbol],
    bound: int,
    replace: Callable[[Formula, Witnessing], Formula | None],
) -> Readings:
    """The pairings in which some quantifier around another, witnessed by
    none of the new symbols, is witnessed by a symbol of no premise and not
    of the conclusion (named ``anonymous_N``).  A prover that writes only
    the clauses its refutation uses may print the clause with the inner
    witness (`p(X0,sk2(X0))`) and not the one with the outer existential's
    constant: the inner witness then takes no argument for it.  Entailment
    from the premises so Skolemized is over every meaning of the anonymous
    symbols, which occur nowhere else, so the claim follows from the
    premises with the outer existential as it is.  Only such pairings are
    returned (the others are :func:`witness_readings`')."""
    return _readings(premises, conclusion, new, bound, replace, anonymous=True)


def _anonymous_witness(taken: set[str], made: set[str], free_in_order: list[Term]) -> Term:
    """A term of a symbol named in nothing ``taken`` over the free variables."""
    number = 0
    while f"anonymous_{number}" in taken:
        number += 1
    taken.add(f"anonymous_{number}")
    made.add(f"anonymous_{number}")
    return application(f"anonymous_{number}", tuple(free_in_order))


def _encloses_quantifier(quantifier: Formula) -> bool:
    return any(f.connective in (EXISTS, FORALL) for f, _, _ in _with_context(quantifier.arguments[0]))


def _readings(
    premises: Sequence[Formula],
    conclusion: Clause | Formula,
    new: set[Symbol],
    bound: int,
    replace: Callable[[Formula, Witnessing], Formula | None],
    anonymous: bool,
) -> Readings:
    made: set[str] = set()
    taken = {name for name, _ in new} if anonymous else set()
    if anonymous:
        named = conclusion.symbols() if isinstance(conclusion, Clause) else symbols_of_formula(conclusion)
        taken |= {name for name, _ in named}
        taken |= {name for premise in premises for name, _ in symbols_of_formula(premise)}
    uses = {(use.symbol, use.arity): use for use in _uses(conclusion, new)}
    predicates = sorted(new - uses.keys())
    if predicates:
        name = f"{predicates[0][0]}/{predicates[0][1]}"
        message = f"new symbol `{name}` is not applied as a function, and only a function can witness a quantifier"
        return Readings((), True, Misfit(predicates[0], "no_quantifier", message))
    rank = {symbol: number for number, symbol in enumerate(uses)}
    found: list[tuple[Witnessing, ...]] = []
    short: list[tuple[Symbol, Formula, list[Term]]] = []
    improper: Formula | None = None
    budget = 16 * bound
    stack: list[tuple[tuple[Formula, ...], frozenset, frozenset, tuple[Witnessing, ...]]] = [
        (tuple(premises), frozenset(new), frozenset(), ())
    ]
    while stack:
        if budget <= 0 or len(found) >= bound:
            return Readings(tuple(found), False, None, frozenset(made))
        budget -= 1
        current, remaining, skipped, path = stack.pop()
        if not remaining:
            if not anonymous or any(w.witness.symbol in made for w in path):
                found.append(path)
            continue
        open_quantifiers, wrong = _replaceable(current, skipped)
        improper = improper or wrong
        # Each bound variable of a quantifier still there can take one
        # symbol: fewer than the symbols left means no pairing below here.
        if sum(len(q.variables) for _, q, _ in open_quantifiers) < len(remaining):
            if open_quantifiers:
                _, quantifier, free_in_order = open_quantifiers[0]
                short.extend((s, quantifier, free_in_order) for s in remaining if s[1] < len(free_in_order))
            continue
        index, quantifier, free_in_order = open_quantifiers[0]
        children = []
        fitting = sorted(remaining, key=lambda s: (s[1] != len(free_in_order), rank.get(s, len(rank)), s))
        for symbol in fitting:
            if symbol[1] < len(free_in_order):
                short.append((symbol, quantifier, free_in_order))
                continue
            for witness in _arrangements(uses.get(symbol), symbol, free_in_order):
                witnessing = Witnessing(index, quantifier, quantifier.variables[0], witness)
                replaced = replace(current[index], witnessing)
                if replaced is not None:
                    premises_after = current[:index] + (replaced,) + current[index + 1 :]
                    children.append((premises_after, remaining - {symbol}, skipped, (*path, witnessing)))
        if anonymous and _encloses_quantifier(quantifier):
            witnessing = Witnessing(index, quantifier, quantifier.variables[0], _anonymous_witness(taken, made, free_in_order))
            replaced = replace(current[index], witnessing)
            if replaced is not None:
                premises_after = current[:index] + (replaced,) + current[index + 1 :]
                children.append((premises_after, remaining, skipped, (*path, witnessing)))
        children.append((current, remaining, skipped | {(index, quantifier)}, path))
        stack.extend(reversed(children))
    return Readings(tuple(found), True, None if found else _misfit(new, uses, short, improper), frozenset(made))


def _misfit(new: set[Symbol], uses: dict[Symbol, Term], short: list, improper: Formula | None) -> Misfit:
    """Why no pairing exists: a symbol with too few arguments for every
    quantifier it could witness, quantifiers Skolemization may not replace,
    or too few quantifiers."""
    if short:
        symbol, quantifier, free_in_order = short[0]
        use = uses.get(symbol)
        if use is not None and set(use.arguments) <= set(free_in_order):
            missing = [v.symbol for v in free_in_order if v not in use.arguments]
            verb = "occurs" if len(missing) == 1 else "occur"
            message = (
                f"Skolem term `{use}` for `{quantifier.variables[0]}` does not depend on {', '.join(missing)}, "
                f"which {verb} free in `{quantifier}`"
            )
        else:
            message = (
                f"new symbol `{symbol[0]}/{symbol[1]}` takes {symbol[1]} argument{'s' if symbol[1] != 1 else ''}, "
                f"too few to witness `{quantifier}`, which depends on {', '.join(v.symbol for v in free_in_order)}"
            )
        return Misfit(symbol, "missing_dependency", message + ", and no other pairing of the new symbols with quantifiers fits")
    symbol = next(iter(uses), None) or min(new)
    name = f"{symbol[0]}/{symbol[1]}"
    if improper is not None:
        return Misfit(
            symbol,
            "wrong_polarity",
            f"new symbol `{name}` can only replace a variable of `{improper}`, which Skolemization may not "
            "replace (an existential of negative polarity, a universal of positive polarity, or under an equivalence)",
        )
    return Misfit(symbol, "no_quantifier", f"new symbol `{name}` witnesses no quantifier of the premises")


def matching_witnesses(quantifier: Formula, instance: Formula) -> dict[Term, Term] | None:
    """The terms that stand, in ``instance``, where ``quantifier``'s body has
    its bound variables: a parallel walk of the two formulas, None when their
    shapes differ or a variable stands for two different terms."""
    bound = set(quantifier.variables)
    found: dict[Term, Term] = {}
    stack = [(quantifier.arguments[0], instance)]
    while stack:
        pattern, target = stack.pop()
        if pattern.connective != target.connective or len(pattern.arguments) != len(target.arguments):
            return None
        if pattern.atom is None:
            stack.extend(zip(pattern.arguments, target.arguments))
            continue
        terms = [(pattern.atom, target.atom)]
        while terms:
            left, right = terms.pop()
            if left in bound:
                if found.setdefault(left, right) is not right:
                    return None
            elif left.is_variable or right.is_variable or left.symbol != right.symbol or left.arity != right.arity:
                if left is not right:
                    return None
            else:
                terms.extend(zip(left.arguments, right.arguments))
    return found
