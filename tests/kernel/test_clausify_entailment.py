"""Formula-level consequence replayed over the kernel's own clauses.

Scenario (invented): rail signalling.  A green signal means its block is
clear; a clear block lets the train proceed.
"""

from __future__ import annotations

from checker.kernel.clauses import Clause, Literal
from checker.kernel.entailment import check_entailment, entailment_clausification, entailment_clauses
from checker.kernel.failure import Failure
from checker.kernel.formulas import FORALL, IMPLIES, atomic, binary, quantified
from checker.kernel.rules import Chain, Resolution
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable

S, X = variable("S"), variable("X")
signal_a = application("signal_a")
skolem = application("skolem_1")


def green(t):
    return application("green", (t,))


def clear(t):
    return application("clear", (t,))


def proceed(t):
    return application("proceed", (t,))


def implication(variable_, left, right):
    return quantified(FORALL, (variable_,), binary(IMPLIES, atomic(left(variable_)), atomic(right(variable_))))


GREEN_MEANS_CLEAR = implication(S, green, clear)
CLEAR_MEANS_PROCEED = implication(S, clear, proceed)


def test_clause_list_of_a_ground_consequence_and_its_refutation():
    premises = [GREEN_MEANS_CLEAR, atomic(green(signal_a))]
    conclusion = atomic(clear(signal_a))
    assert entailment_clauses(premises, conclusion) == (
        Clause([Literal(False, green(S)), Literal(True, clear(S))]),
        Clause([Literal(True, green(signal_a))]),
        Clause([Literal(False, clear(signal_a))]),
    )
    chain = Chain(
        (
            Resolution(0, 0, 1, 0, left_substitution=Substitution({S: signal_a})),
            Resolution(3, 0, 2, 0),
        )
    )
    assert check_entailment(premises, conclusion, chain) is None


def test_universal_conclusion_is_negated_with_a_skolem_constant():
    premises = [GREEN_MEANS_CLEAR, CLEAR_MEANS_PROCEED]
    conclusion = implication(X, green, proceed)
    clausification = entailment_clausification(premises, conclusion)
    assert clausification.clauses == (
        Clause([Literal(False, green(S)), Literal(True, clear(S))]),
        Clause([Literal(False, clear(S)), Literal(True, proceed(S))]),
        Clause([Literal(True, green(skolem))]),
        Clause([Literal(False, proceed(skolem))]),
    )
    assert clausification.sources == (0, 1, 2, 2)
    to_skolem = Substitution({S: skolem})
    chain = Chain(
        (
            Resolution(2, 0, 0, 0, right_substitution=to_skolem),
            Resolution(4, 0, 1, 0, right_substitution=to_skolem),
            Resolution(5, 0, 3, 0),
        )
    )
    assert check_entailment(premises, conclusion, chain) is None


def test_clauses_are_accepted_as_premises_and_conclusion():
    premise = Clause([Literal(False, green(X)), Literal(True, clear(X))])
    conclusion = Clause([Literal(False, green(X)), Literal(True, clear(X))])
    clauses = entailment_clauses([premise], conclusion)
    assert clauses == (
        premise,
        Clause([Literal(True, green(skolem))]),
        Clause([Literal(False, clear(skolem))]),
    )
    chain = Chain((Resolution(0, 0, 1, 0, left_substitution=Substitution({X: skolem})), Resolution(3, 0, 2, 0)))
    assert check_entailment([premise], conclusion, chain) is None


def test_a_chain_with_wrong_evidence_is_refused_at_that_inference():
    premises = [GREEN_MEANS_CLEAR, atomic(green(signal_a))]
    conclusion = atomic(clear(signal_a))
    wrong = Chain((Resolution(0, 0, 1, 0), Resolution(3, 0, 2, 0)))
    failure = check_entailment(premises, conclusion, wrong)
    assert isinstance(failure, Failure)
    assert failure.message.startswith("inference 1 of 2:")


def test_a_chain_that_stops_short_of_the_empty_clause_is_refused():
    premises = [GREEN_MEANS_CLEAR, atomic(green(signal_a))]
    conclusion = atomic(clear(signal_a))
    short = Chain((Resolution(0, 0, 1, 0, left_substitution=Substitution({S: signal_a})),))
    failure = check_entailment(premises, conclusion, short)
    assert failure == Failure("refutation_incomplete", "the refutation ends in `clear(signal_a)`, not the empty clause")
