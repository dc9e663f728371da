"""The ground steps of the TPTP derivation fixtures, cross-checked with a SAT
solver (PyPI python-sat).

A step whose premises and claim are ground clauses without equality is
propositional: it is correct exactly when premises plus the negated claim
are unsatisfiable, each ground atom a propositional variable.  For every
such step of the valid derivations, the search must find kernel-accepted
evidence and the solver must confirm unsatisfiability; for every mutant
whose broken step is such a step, the solver must find a model, which
confirms independently of assay that the mutated step is wrong.
"""

from __future__ import annotations

from pathlib import Path

import pytest
from pysat.solvers import Minisat22

from checker.kernel.clauses import Clause, is_equality
from checker.kernel.rules import check_clause_step
from checker.search.reconstruct import reconstruct
from formats.derivation import Inference, Parent
from formats.tptp import read_tptp

DERIVATIONS = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "derivations"
BROKEN = "% broken-step: "


def _propositional(clause) -> bool:
    return isinstance(clause, Clause) and not clause.variables() and not any(is_equality(l.atom) for l in clause.literals)


def ground_steps(path: Path):
    """(name, premises, claimed) for each step of the file whose named
    parents and claim are ground clauses without equality."""
    statements = {s.name: s for s in read_tptp(str(path)).statements}
    for statement in statements.values():
        source = statement.source
        if not isinstance(source, Inference) or not all(isinstance(p, Parent) for p in source.parents):
            continue
        premises = [statements[p.name].content for p in source.parents]
        if _propositional(statement.content) and all(_propositional(p) for p in premises):
            yield statement.name, premises, statement.content


def satisfiable(premises, claimed: Clause) -> bool:
    """Whether premises and the negation of the claim have a propositional model."""
    numbers: dict = {}

    def encode(literal) -> int:
        number = numbers.setdefault(literal.atom, len(numbers) + 1)
        return number if literal.positive else -number

    cnf = [[encode(lit) for lit in premise.literal_set] for premise in premises]
    cnf += [[-encode(lit)] for lit in claimed.literal_set]
    with Minisat22(bootstrap_with=cnf) as solver:
        return solver.solve()


VALID_STEPS = [
    (f"{path.parent.name}/{name}", premises, claimed)
    for path in sorted(DERIVATIONS.glob("*/proof.p"))
    for name, premises, claimed in ground_steps(path)
]


def _broken_ground_steps():
    for path in sorted(DERIVATIONS.glob("*/mutant_*.p")):
        broken = next(line[len(BROKEN):].strip() for line in path.read_text().splitlines() if line.startswith(BROKEN))
        for name, premises, claimed in ground_steps(path):
            if name == broken:
                yield f"{path.parent.name}/{path.stem}/{name}", premises, claimed


BROKEN_STEPS = list(_broken_ground_steps())


def test_the_fixtures_have_enough_ground_steps_to_cross_check():
    assert len(VALID_STEPS) >= 20
    assert len(BROKEN_STEPS) >= 2


@pytest.mark.parametrize("name, premises, claimed", VALID_STEPS, ids=[s[0] for s in VALID_STEPS])
def test_reconstructed_ground_step_is_unsatisfiable_with_its_negated_claim(name, premises, claimed):
    found = reconstruct(premises, claimed)
    assert found.evidence is not None
    assert check_clause_step(premises, claimed, found.evidence, found.theta) is None
    # python-sat (Minisat 2.2): premises + negated claim must be unsatisfiable.
    assert not satisfiable(premises, claimed)


@pytest.mark.parametrize("name, premises, claimed", BROKEN_STEPS, ids=[s[0] for s in BROKEN_STEPS])
def test_broken_ground_step_of_a_mutant_has_a_propositional_counter_model(name, premises, claimed):
    # python-sat (Minisat 2.2): a model of premises + negated claim shows the step wrong.
    assert satisfiable(premises, claimed)
    assert reconstruct(premises, claimed).evidence is None
