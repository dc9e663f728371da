"""Satisfiability-preserving introductions: Skolem axioms and definitions.

A Skolemization or definition step does not follow from its premises; it
is sound because any model of the premises can be extended to interpret a
*fresh* symbol so that the step holds.  The kernel turns each introduction
into the axiom that extension satisfies (a Skolem axiom, or the definition
itself), after checking the shape that makes the extension exist.  The
step is then checked as an ordinary entailment from premises plus axioms.
Freshness across the whole derivation is the plan's job: these functions
see only one formula.
"""

from __future__ import annotations

from checker.kernel.failure import Failure
from checker.kernel.formulas import (
    ATOM,
    EXISTS,
    FORALL,
    IFF,
    IMPLIES,
    Formula,
    binary,
    free_variables,
    quantified,
    substitute_free,
    symbols_of_formula,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term


def _names(variables) -> str:
    return ", ".join(sorted(v.symbol for v in variables))


def _close(formula: Formula) -> Formula:
    free = sorted(free_variables(formula), key=lambda v: v.symbol)
    return quantified(FORALL, tuple(free), formula) if free else formula


def skolem_axiom(quantifier: Formula, witnesses: tuple[Term, ...]) -> Formula | Failure:
    """The axiom that interprets the witnesses' new symbols: for ``? [Y] : G``
    it is ``! [free] : ((? [Y] : G) => G{Y := witness})``; for a universal
    (met in negative polarity) ``! [free] : (G{Y := witness} => ! [Y] : G)``.

    Each witness must be a new symbol applied to distinct variables that
    include every free variable of the quantified formula: a witness that
    forgets one would have to choose the same value for all its values.
    """
    if quantifier.connective not in (EXISTS, FORALL):
        return Failure("not_quantified", f"`{quantifier}` is not a quantified formula")
    if len(witnesses) != len(quantifier.variables):
        return Failure(
            "witness_count",
            f"`{quantifier}` binds {len(quantifier.variables)} variable(s) but {len(witnesses)} witness(es) are given",
        )
    free = free_variables(quantifier)
    inside = {name for name, _ in symbols_of_formula(quantifier)}
    seen: set[str] = set()
    for bound, witness in zip(quantifier.variables, witnesses):
        arguments = witness.arguments
        if witness.is_variable or not all(a.is_variable for a in arguments) or len(set(arguments)) != len(arguments):
            return Failure(
                "not_a_skolem_term", f"witness `{witness}` for `{bound}` is not a symbol applied to distinct variables"
            )
        missing = free - set(arguments)
        if missing:
            verb = "occurs" if len(missing) == 1 else "occur"
            return Failure(
                "missing_dependency",
                f"Skolem term `{witness}` for `{bound}` does not depend on {_names(missing)}, "
                f"which {verb} free in `{quantifier}`",
            )
        if witness.symbol in inside or witness.symbol in seen:
            return Failure(
                "not_fresh", f"Skolem symbol `{witness.symbol}` already occurs in `{quantifier}` or witnesses it twice"
            )
        seen.add(witness.symbol)
    body = quantifier.arguments[0]
    instance = substitute_free(body, Substitution(dict(zip(quantifier.variables, witnesses))))
    if quantifier.connective == EXISTS:
        return _close(binary(IMPLIES, quantifier, instance))
    return _close(binary(IMPLIES, instance, quantifier))


def defined_symbol(definition: Formula) -> tuple[str, int] | Failure:
    """The symbol a definition introduces, when it has a definition's shape:
    ``! [X..] : (d(X..) <=> F)`` (or ``=>`` either way), with ``d`` applied to
    distinct variables that are exactly the free variables of ``F``, and
    ``d`` not occurring in ``F``.  Such a formula can always be made true by
    interpreting a fresh ``d``."""
    body = definition
    while body.connective == FORALL:
        body = body.arguments[0]
    if free_variables(definition):
        return Failure("definition_not_closed", f"definition `{definition}` has free variables")
    if body.connective not in (IFF, IMPLIES):
        return Failure("not_a_definition", f"`{definition}` is not an equivalence or implication")
    for defined, meaning in (body.arguments, body.arguments[::-1]):
        if defined.connective != ATOM:
            continue
        atom = defined.atom
        if atom.symbol == "=" or not all(a.is_variable for a in atom.arguments):
            continue
        if len(set(atom.arguments)) != atom.arity:
            continue
        if set(atom.arguments) != free_variables(meaning):
            return Failure(
                "definition_arguments",
                f"defined atom `{atom}` has arguments {{{_names(atom.arguments)}}} but its definition has "
                f"free variables {{{_names(free_variables(meaning))}}}",
            )
        if (atom.symbol, atom.arity) in symbols_of_formula(meaning):
            return Failure("definition_circular", f"`{atom.symbol}` occurs in its own definition `{meaning}`")
        return (atom.symbol, atom.arity)
    return Failure("not_a_definition", f"neither side of `{body}` is a new symbol applied to distinct variables")
