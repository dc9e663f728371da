"""Satisfiability-preserving introductions: Skolemization and definitions.

A Skolemization or definition step does not follow from its premises; it
is sound because any model of the premises can be extended to interpret a
*fresh* symbol so that the step holds.  The kernel checks the shape that
makes such an extension exist and builds the Skolemized premise itself;
the step must then follow from that.  Freshness across the whole
derivation is the plan's job: these functions see only their formulas.
"""

from __future__ import annotations

from collections.abc import Mapping

from checker.kernel.failure import Failure
from checker.kernel.formulas import (
    ATOM,
    EXISTS,
    FORALL,
    IFF,
    IMPLIES,
    Formula,
    alpha_equivalent,
    argument_polarities,
    free_variables,
    make,
    quantified,
    substitute_free,
    symbols_of_formula,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term


def _names(variables) -> str:
    return ", ".join(sorted(v.symbol for v in variables))


def _witness_failure(premise: Formula, quantifier: Formula, witnesses: Mapping[Term, Term]) -> Failure | None:
    """Why the witnesses cannot be Skolem terms for the quantifier, or None.

    Each witness must be a symbol new to the premise applied to distinct
    variables that include every free variable of the quantified formula:
    a witness that forgets one would have to pick one value for all of its
    values.
    """
    if quantifier.connective not in (EXISTS, FORALL):
        return Failure("not_quantified", f"`{quantifier}` is not a quantified formula")
    if not witnesses or not set(witnesses) <= set(quantifier.variables):
        return Failure("witness_variables", f"witnesses must be given for variables bound by `{quantifier}`")
    free = free_variables(quantifier)
    present = {name for name, _ in symbols_of_formula(premise)}
    symbols = [witness.symbol for witness in witnesses.values()]
    for bound, witness in witnesses.items():
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
        if witness.symbol in present or symbols.count(witness.symbol) > 1:
            return Failure(
                "not_fresh", f"Skolem symbol `{witness.symbol}` already occurs in `{premise}` or witnesses twice"
            )
    return None


def skolemize(premise: Formula, quantifier: Formula, witnesses: Mapping[Term, Term]) -> Formula | Failure:
    """``premise`` with every occurrence of ``quantifier`` that Skolemization
    may replace (an existential of positive polarity, a universal of
    negative polarity) replaced by its body with the witnessed variables
    substituted; variables without a witness stay quantified.

    Sound because premise ∧ (Skolem axiom of the witnesses) entails the
    result, and a model of the premise extends to one of the axiom by
    interpreting the fresh symbols as choice functions.
    """
    failure = _witness_failure(premise, quantifier, witnesses)
    if failure is not None:
        return failure
    wanted = 1 if quantifier.connective == EXISTS else -1
    body = substitute_free(quantifier.arguments[0], Substitution(dict(witnesses)))
    remaining = tuple(v for v in quantifier.variables if v not in witnesses)
    replacement = quantified(quantifier.connective, remaining, body) if remaining else body

    replaced = 0
    misplaced: set[int] = set()
    results: list[Formula] = []
    tasks: list[tuple] = [(premise, 1)]
    while tasks:
        task = tasks.pop()
        if len(task) == 3:
            _, original, count = task
            arguments = tuple(results[len(results) - count :])
            del results[len(results) - count :]
            results.append(make(original.connective, arguments, original.variables, original.atom))
            continue
        current, polarity = task
        if current is quantifier:
            if polarity == wanted:
                replaced += 1
                results.append(replacement)
                continue
            misplaced.add(polarity)
        if not current.arguments:
            results.append(current)
            continue
        tasks.append(("rebuild", current, len(current.arguments)))
        factors = argument_polarities(current.connective)
        tasks.extend((argument, polarity * factor) for argument, factor in reversed(tuple(zip(current.arguments, factors))))
    if not replaced:
        if misplaced:
            where = " and ".join(
                "under an equivalence" if p == 0 else ("in negative polarity" if p < 0 else "in positive polarity")
                for p in sorted(misplaced)
            )
            return Failure(
                "wrong_polarity",
                f"`{quantifier}` occurs in `{premise}` only {where}, where Skolemization may not replace it",
            )
        return Failure("no_occurrence", f"`{quantifier}` does not occur in `{premise}`")
    return results[0]


def check_choice_axiom(axiom: Formula, witnesses: Mapping[Term, Term]) -> Failure | None:
    """None when ``axiom`` is the Skolem axiom (TPTP's ``axiom_of_choice``)
    of the given witnesses: ``! [free] : ((? [Y] : G) => G{Y := w})`` or
    ``! [free] : (G{Y := w} => ! [Y] : G)``, variables left unwitnessed
    staying quantified.  It holds in an extension of any model that
    interprets the witnesses' fresh symbols as choice functions."""
    body = axiom
    while body.connective == FORALL:
        body = body.arguments[0]
    if free_variables(axiom):
        return Failure("choice_not_closed", f"axiom `{axiom}` has free variables")
    if body.connective != IMPLIES:
        return Failure("not_a_choice_axiom", f"`{axiom}` is not an implication under universal quantifiers")
    antecedent, consequent = body.arguments
    if antecedent.connective == EXISTS:
        quantifier, instance = antecedent, consequent
    elif consequent.connective == FORALL:
        quantifier, instance = consequent, antecedent
    else:
        return Failure("not_a_choice_axiom", f"neither `{antecedent}` is existential nor `{consequent}` universal")
    failure = _witness_failure(quantifier, quantifier, witnesses)
    if failure is not None:
        return failure
    expected = substitute_free(quantifier.arguments[0], Substitution(dict(witnesses)))
    remaining = tuple(v for v in quantifier.variables if v not in witnesses)
    if remaining:
        expected = quantified(quantifier.connective, remaining, expected)
    if not alpha_equivalent(expected, instance):
        return Failure("not_a_choice_axiom", f"`{instance}` is not `{expected}`, the quantified formula at the witnesses")
    return None


def check_definition(definition: Formula, symbol: tuple[str, int]) -> Failure | None:
    """None when ``definition`` defines ``symbol``: it reads
    ``! [X..] : (d(X..) <=> F)`` (or ``=>`` either way) with ``d`` the symbol
    applied to distinct variables that are exactly the free variables of
    ``F``, and ``d`` not occurring in ``F``.  Such a formula can always be
    made true by interpreting a fresh ``d``; freshness is checked by the
    caller."""
    name, arity = symbol
    body = definition
    while body.connective == FORALL:
        body = body.arguments[0]
    if free_variables(definition):
        return Failure("definition_not_closed", f"definition `{definition}` has free variables")
    if body.connective not in (IFF, IMPLIES):
        return Failure("not_a_definition", f"`{definition}` is not an equivalence or implication")
    for defined, meaning in (body.arguments, body.arguments[::-1]):
        atom = defined.atom
        if defined.connective != ATOM or atom.symbol != name or atom.arity != arity or name == "=":
            continue
        arguments = atom.arguments
        if not all(a.is_variable for a in arguments) or len(set(arguments)) != arity:
            return Failure("definition_arguments", f"defined atom `{atom}` is not `{name}` applied to distinct variables")
        if set(arguments) != free_variables(meaning):
            return Failure(
                "definition_arguments",
                f"defined atom `{atom}` has arguments {{{_names(arguments)}}} but its definition has "
                f"free variables {{{_names(free_variables(meaning))}}}",
            )
        if symbol in symbols_of_formula(meaning):
            return Failure("definition_circular", f"`{name}` occurs in its own definition `{meaning}`")
        return None
    return Failure("not_a_definition", f"neither side of `{body}` is an atom of `{name}/{arity}`")
