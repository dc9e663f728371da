"""Mutation tests of the demo certificate: every small corruption of a step
must be refused by the kernel at that very step, unless the corrupted step
is still sound, which the test then shows.

Each step of fixtures/demo/interlock.jsonl is mutated in several ways (a
claimed literal's sign flipped, a symbol changed, a claimed literal dropped,
a binding changed, a parent swapped for another statement, a literal index
or orientation flag changed) and the whole mutated certificate is replayed
in written order.  The first refused step must be the mutated one.  A
mutant the kernel accepts must be a weakening or variant of the original
conclusion (theta(original computed) ⊆ mutated claimed) and must have no
counter-model over one or two elements, searched by brute force.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Iterator
from pathlib import Path

import pytest

from checker.kernel.clauses import Clause, Literal
from checker.kernel.rules import Chain, Refutation, check_conclusion
from checker.kernel.substitution import IDENTITY, Substitution
from checker.kernel.terms import Term, application, replace_at, subterms, variable
from formats.derivation import Document, Inference, Parent, Statement
from formats.native import EVIDENCE_FIELD_KINDS, FLAG, INDEX, SUBSTITUTION, read_native

from native_replay import check_step, clause_steps, computed_clause, first_refused, small_counter_model

DEMO = Path(__file__).resolve().parents[2] / "fixtures" / "demo" / "interlock.jsonl"
FRESH_CONSTANT = application("mutant_constant")
EXTRA_LITERAL = Literal(True, application("mutant_extra_condition"))


@dataclasses.dataclass(frozen=True)
class Mutant:
    step: str
    kind: str
    description: str
    document: Document
    claim_only: bool  # parents and evidence untouched, only the claimed clause changed


def _demo() -> Document:
    return read_native(str(DEMO))


def _replace_statement(document: Document, name: str, **changes) -> Document:
    statements = tuple(
        dataclasses.replace(s, **changes) if s.name == name else s for s in document.statements
    )
    return dataclasses.replace(document, statements=statements)


# ---------------------------------------------------------------- claim mutations


def _flip_signs(statement: Statement) -> Iterator[tuple[str, Clause]]:
    literals = statement.content.literals
    for index, literal in enumerate(literals):
        changed = [*literals[:index], literal.negated(), *literals[index + 1 :]]
        yield f"literal {index} `{literal}` negated", Clause(changed)


def _drop_literals(statement: Statement) -> Iterator[tuple[str, Clause]]:
    literals = statement.content.literals
    for index, literal in enumerate(literals):
        yield f"literal {index} `{literal}` dropped", Clause([*literals[:index], *literals[index + 1 :]])


def _rename_symbol(term: Term, position: tuple[int, ...]) -> Term:
    current = term
    for index in position:
        current = current.arguments[index - 1]
    renamed = application("mutant_" + current.symbol, current.arguments)
    return replace_at(term, position, renamed) if position else renamed


def _change_symbols(statement: Statement) -> Iterator[tuple[str, Clause]]:
    """One occurrence of a predicate or function symbol renamed at a time."""
    literals = statement.content.literals
    for index, literal in enumerate(literals):
        for position, subterm in subterms(literal.atom):
            if subterm.is_variable or (not position and subterm.symbol == "="):
                continue
            changed = Literal(literal.positive, _rename_symbol(literal.atom, position))
            yield (
                f"symbol `{subterm.symbol}` at {position or 'root'} of literal {index} renamed",
                Clause([*literals[:index], changed, *literals[index + 1 :]]),
            )


def _weaken(statement: Statement) -> Iterator[tuple[str, Clause]]:
    yield "an extra literal added", Clause([*statement.content.literals, EXTRA_LITERAL])


CLAIM_MUTATIONS = {
    "flip_sign": _flip_signs,
    "drop_literal": _drop_literals,
    "change_symbol": _change_symbols,
    "weaken": _weaken,
}


# ---------------------------------------------------------------- evidence mutations


def _primitive_mutations(evidence) -> Iterator[tuple[str, str, object]]:
    """(kind, description, mutated evidence) for each field of one primitive inference."""
    for field in dataclasses.fields(evidence):
        value = getattr(evidence, field.name)
        kind = EVIDENCE_FIELD_KINDS[field.name]
        if kind == SUBSTITUTION:
            for var, term in value.items_sorted():
                changed = Substitution({**value.mapping, var: FRESH_CONSTANT})
                yield "change_binding", f"{field.name} {var} -> {term} changed to {FRESH_CONSTANT}", dataclasses.replace(
                    evidence, **{field.name: changed}
                )
        elif kind == INDEX:
            yield "change_index", f"{field.name} {value} -> {value + 1}", dataclasses.replace(
                evidence, **{field.name: value + 1}
            )
            if value > 0:
                yield "change_index", f"{field.name} {value} -> {value - 1}", dataclasses.replace(
                    evidence, **{field.name: value - 1}
                )
        elif kind == FLAG:
            yield "flip_flag", f"{field.name} flipped", dataclasses.replace(evidence, **{field.name: not value})


def _evidence_mutations(evidence) -> Iterator[tuple[str, str, object]]:
    if isinstance(evidence, (Chain, Refutation)):
        chain = evidence.chain if isinstance(evidence, Refutation) else evidence
        for number, inner in enumerate(chain.steps):
            for kind, description, changed in _primitive_mutations(inner):
                steps = (*chain.steps[:number], changed, *chain.steps[number + 1 :])
                mutated = Chain(steps)
                yield kind, f"inner inference {number}: {description}", (
                    Refutation(mutated) if isinstance(evidence, Refutation) else mutated
                )
    else:
        yield from _primitive_mutations(evidence)


def _theta_mutations(inference: Inference) -> Iterator[tuple[str, str, Inference]]:
    theta = inference.theta or IDENTITY
    for var, term in theta.items_sorted():
        changed = Substitution({**theta.mapping, var: FRESH_CONSTANT})
        yield "change_binding", f"theta {var} -> {term} changed to {FRESH_CONSTANT}", dataclasses.replace(
            inference, theta=changed
        )


def _parent_mutations(document: Document, statement: Statement) -> Iterator[tuple[str, str, Inference]]:
    """Each parent in turn replaced by every other clause written before the step."""
    inference = statement.source
    earlier = []
    for candidate in document.statements:
        if candidate.name == statement.name:
            break
        earlier.append(candidate.name)
    for index, parent in enumerate(inference.parents):
        for name in earlier:
            if name != parent.name:
                parents = (*inference.parents[:index], Parent(name), *inference.parents[index + 1 :])
                yield "change_parent", f"parent {index} {parent.name} replaced by {name}", dataclasses.replace(
                    inference, parents=parents
                )


def mutants(document: Document) -> Iterator[Mutant]:
    for statement in clause_steps(document):
        for kind, mutate in CLAIM_MUTATIONS.items():
            for description, clause in mutate(statement):
                yield Mutant(statement.name, kind, description, _replace_statement(document, statement.name, content=clause), True)
        inference = statement.source
        changed_inferences = [
            (kind, description, dataclasses.replace(inference, evidence=evidence))
            for kind, description, evidence in _evidence_mutations(inference.evidence)
        ]
        changed_inferences += _theta_mutations(inference)
        changed_inferences += _parent_mutations(document, statement)
        for kind, description, changed in changed_inferences:
            yield Mutant(statement.name, kind, description, _replace_statement(document, statement.name, source=changed), False)


def _statement(document: Document, name: str) -> Statement:
    return next(s for s in document.statements if s.name == name)


def _premises(document: Document, statement: Statement) -> list[Clause]:
    contents = {s.name: s.content for s in document.statements}
    return [contents[p.name] for p in statement.source.parents]


def _is_weakening_of_original(original: Document, mutant: Mutant) -> bool:
    """theta(original computed) ⊆ mutated claimed: the mutated claim says no
    more than what the original evidence derives."""
    step = _statement(original, mutant.step)
    computed = computed_clause(original, step)
    claimed = _statement(mutant.document, mutant.step).content
    return check_conclusion(computed, claimed, step.source.theta or IDENTITY) is None


ALL_MUTANTS = list(mutants(_demo()))


def test_every_kind_of_mutation_reaches_every_step():
    kinds_by_step: dict[str, set[str]] = {}
    for mutant in ALL_MUTANTS:
        kinds_by_step.setdefault(mutant.step, set()).add(mutant.kind)
    steps = [s.name for s in clause_steps(_demo())]
    assert sorted(kinds_by_step) == sorted(steps)
    for step, kinds in kinds_by_step.items():
        # the empty clause has no literal to flip, drop or rename
        expected = {"weaken", "change_index", "change_parent"}
        if _statement(_demo(), step).content.literals:
            expected |= {"flip_sign", "drop_literal", "change_symbol"}
        assert expected <= kinds, step


@pytest.mark.parametrize("mutant", ALL_MUTANTS, ids=lambda m: f"{m.step}:{m.kind}:{m.description}")
def test_mutant_is_refused_at_its_step_or_is_sound(mutant: Mutant):
    original = _demo()
    refused = first_refused(mutant.document)
    if refused is not None and refused[0] == mutant.step:
        return
    # Nothing before the mutated step changed, so no earlier step may fail.
    assert refused is None or [s.name for s in original.statements].index(refused[0]) > [
        s.name for s in original.statements
    ].index(mutant.step), refused
    step = _statement(mutant.document, mutant.step)
    assert check_step(mutant.document, step) is None
    # Accepted, so it must be sound.  Why: the mutated conclusion is a
    # weakening or variant of what the original step derives ...
    assert _is_weakening_of_original(original, mutant), f"accepted mutant is no weakening: {mutant.description}"
    # ... and, independently of the kernel, no interpretation over one or
    # two elements makes the parents true and the mutated conclusion false.
    assert small_counter_model(_premises(mutant.document, step), step.content) is None


def test_weakened_claims_are_accepted_at_their_step():
    # Common practice (subsumption): when theta(C) ⊆ D, D follows from C, so
    # the conclusion test must admit a claim with an extra literal.
    weakened = [m for m in ALL_MUTANTS if m.kind == "weaken"]
    assert len(weakened) == len(list(clause_steps(_demo())))
    for mutant in weakened:
        assert check_step(mutant.document, _statement(mutant.document, mutant.step)) is None, mutant.step


def test_every_other_mutant_is_refused_at_its_step():
    """The demo's mutations all change what a step says or derives, so none
    is accepted; this keeps the parametrized test above from passing by
    way of its soundness branch alone."""
    others = [m for m in ALL_MUTANTS if m.kind != "weaken"]
    assert len(others) > 200
    for mutant in others:
        refused = first_refused(mutant.document)
        assert refused is not None and refused[0] == mutant.step, (mutant.step, mutant.description)


# ------------------------------------------------ the brute-force judge itself


def _clause(*literals: tuple[bool, Term]) -> Clause:
    return Clause(Literal(positive, atom) for positive, atom in literals)


X, Y = variable("X"), variable("Y")
A, B = application("a"), application("b")


def p(term: Term) -> Term:
    return application("p", (term,))


def test_small_counter_model_finds_a_model_for_a_non_consequence():
    # Common practice: p(a) does not entail p(b); two elements, a and b apart, p true of a only.
    model = small_counter_model([_clause((True, p(A)))], _clause((True, p(B))))
    assert model is not None and model["size"] == 2


def test_small_counter_model_finds_none_for_factoring():
    # Robinson's factoring (common practice): p(X) | p(Y) entails p(X).
    assert small_counter_model([_clause((True, p(X)), (True, p(Y)))], _clause((True, p(X)))) is None


def test_small_counter_model_treats_equality_as_identity():
    # Common practice (equality is a congruence): a = b and p(f(a)) entail p(f(b)), but a = b alone does not entail p(a).
    f = lambda term: application("f", (term,))  # noqa: E731
    equation = _clause((True, application("=", (A, B))))
    assert small_counter_model([equation, _clause((True, p(f(A))))], _clause((True, p(f(B))))) is None
    assert small_counter_model([equation], _clause((True, p(A)))) is not None


def test_small_counter_model_reads_variables_as_universal():
    # Common practice: clauses are universally closed, so p(X) entails p(a) but p(a) does not entail p(X).
    assert small_counter_model([_clause((True, p(X)))], _clause((True, p(A)))) is None
    assert small_counter_model([_clause((True, p(A)))], _clause((True, p(X)))) is not None
