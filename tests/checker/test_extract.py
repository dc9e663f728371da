"""Reproducers (``assay extract``): a standalone TPTP problem per step.

For every mutant, the reproducer of its broken step must be a problem
whose conjecture does not follow: the counter-model written with it is
re-evaluated here by an evaluator of this test's own (Tarski's truth
definition over a finite domain, equality as identity: textbook semantics,
common practice), on the file as read back by the TPTP reader.  For the
valid derivations, every step whose status claims consequence and that
introduces no symbol must give a reproducer whose conjecture follows:
a refutation of axioms ∧ ¬conjecture replayed by the kernel, or a cover
of the conjecture's clauses by the axioms' that the kernel re-checks.
"""

from __future__ import annotations

import itertools

import pytest
from tptp_derivation_files import label, mutants, scenarios

from checker.extract import NoReproducer, Reproducer, extract, tptp_name
from checker.freshness import new_symbols
from checker.kernel.entailment import check_entailment
from checker.kernel.formulas import AND, ATOM, EXISTS, FALSE, FORALL, IFF, IMPLIES, NAND, NOR, NOT, OR, TRUE, XOR
from checker.opened import open_derivation
from checker.search.entailment import find_consequence
from checker.search.reconstruct import DEFAULT_LIMITS
from formats.tptp import read_tptp

MUTANTS = mutants()


def _value(model, term, assignment):
    if term.is_variable:
        return assignment[term]
    arguments = tuple(_value(model, argument, assignment) for argument in term.arguments)
    return model.functions[(term.symbol, len(arguments))][arguments]


def _true(model, formula, assignment):
    """Tarski's truth definition, written out here on purpose rather than
    taken from the kernel, so that the check does not rest on the code it checks."""
    connective, parts = formula.connective, formula.arguments
    if connective == ATOM:
        atom = formula.atom
        arguments = tuple(_value(model, argument, assignment) for argument in atom.arguments)
        if atom.symbol == "=":
            return arguments[0] == arguments[1]
        return arguments in model.predicates[(atom.symbol, len(arguments))]
    if connective in (TRUE, FALSE):
        return connective == TRUE
    if connective == NOT:
        return not _true(model, parts[0], assignment)
    if connective in (FORALL, EXISTS):
        values = (
            _true(model, parts[0], {**assignment, **dict(zip(formula.variables, elements))})
            for elements in itertools.product(range(model.size), repeat=len(formula.variables))
        )
        return all(values) if connective == FORALL else any(values)
    left, right = (_true(model, part, assignment) for part in parts)
    return {
        AND: left and right, OR: left or right, IMPLIES: (not left) or right, IFF: left == right,
        XOR: left != right, NOR: not (left or right), NAND: not (left and right),
    }[connective]


def _read_back(reproducer: Reproducer, tmp_path):
    path = tmp_path / "repro.p"
    path.write_text(reproducer.text, encoding="utf-8")
    statements = read_tptp(str(path)).statements
    axioms = [s.content for s in statements if s.role == "axiom"]
    conjectures = [s for s in statements if s.role == "conjecture"]
    assert len(conjectures) == 1 and len(axioms) + 1 == len(statements)
    return axioms, conjectures[0]


@pytest.mark.parametrize("mutant", MUTANTS, ids=lambda m: label(m.path))
def test_reproducer_of_a_broken_step_has_a_counter_model(mutant, tmp_path):
    opened = open_derivation(str(mutant.path), str(mutant.problem))
    reproducer = extract(opened, mutant.broken_step, with_model=True)
    assert isinstance(reproducer, Reproducer), reproducer
    assert f"step `{mutant.broken_step}` of {mutant.path}" in reproducer.text.splitlines()[0]
    axioms, conjecture = _read_back(reproducer, tmp_path)
    assert conjecture.name == tptp_name(mutant.broken_step).strip("'")
    model = reproducer.countermodel
    assert model is not None, "no counter-model: the conjecture may follow"
    assert all(_true(model, axiom, {}) for axiom in axioms)
    assert not _true(model, conjecture.content, {})
    assert "% Counter-model" in reproducer.text


def _consequence_steps(opened):
    """The stated inference steps whose reproducer claims consequence and
    whose conclusion has no symbol its premises lack."""
    for name, step in opened.steps.items():
        if step.is_leaf or step.statement is None:
            continue
        reproducer = extract(opened, name)
        assert isinstance(reproducer, Reproducer), reproducer
        formulas = [formula for _, formula in reproducer.axioms]
        if reproducer.consequence_claimed and not new_symbols(reproducer.conjecture, formulas):
            yield reproducer


@pytest.mark.parametrize("folder", scenarios(), ids=label)
def test_reproducers_of_valid_steps_are_kernel_checked_entailments(folder, tmp_path):
    opened = open_derivation(str(folder / "proof.p"), str(folder / "problem.p"))
    shown = 0
    for reproducer in _consequence_steps(opened):
        axioms, conjecture = _read_back(reproducer, tmp_path)
        # A refutation, or a cover for a step that only reshapes its premises.
        evidence = find_consequence(axioms, conjecture.content, DEFAULT_LIMITS)
        assert evidence is not None, f"{reproducer.step}: no evidence found"
        assert check_entailment(axioms, conjecture.content, evidence) is None
        shown += 1
    assert shown > 0


def test_nested_record_without_a_stated_conclusion_is_refused_with_the_outer_name():
    folder = next(f for f in scenarios() if f.name == "valve_sensor_nested_skolemize")
    opened = open_derivation(str(folder / "proof.p"), str(folder / "problem.p"))
    refused = extract(opened, "c_0_9/1")
    assert isinstance(refused, NoReproducer)
    assert "extract `c_0_9`" in refused.message


def test_names_outside_lower_word_are_quoted():
    # TPTP syntax, BNF rules <lower_word> and <single_quoted>.
    assert tptp_name("c_0_9") == "c_0_9"
    assert tptp_name("12") == "12"
    assert tptp_name("c_0_9/2") == "'c_0_9/2'"
    assert tptp_name("It's") == "'It\\'s'"
