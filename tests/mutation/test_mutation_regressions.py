"""Mutants the large mutation runs (bench/bench_mutation.py) got wrong,
checked again as that run checks them: in one long-lived process, inside
``reading_once`` and ``reusing_checked_steps`` (one outer file scope, so
terms and cached results outlive each check), after other checks of the
same certificates.

Each mutant's expected answer is settled before assay sees it
(mutation_kinds.py by construction, or mutation_oracle.py with python-sat
on finite groundings).  The mutants are found by fixture, kind and
mutated step, not by index, so that a new kind of mutation does not
silently change what is tested.
"""

from __future__ import annotations

import pytest
from mutation_harness import RIGHT, judge, reading_once, reusing_checked_steps, run_mutant
from mutation_kinds import SOUND, UNSOUND, fixtures, mutants

# (fixture folder, kind, mutated step, which of the matching mutants or None for all, expected)
REGRESSIONS = (
    # split clauses renamed away: each side's parent dangles (was an internal error)
    ("depot_two_levels", "duplicated_name", "tank_empty", None, UNSOUND),
    ("warehouse_three_levels", "duplicated_name", "no_returns", None, UNSOUND),
    ("warehouse_three_levels", "duplicated_name", "found", None, UNSOUND),
    # a changed binding inside a nested record (was accepted)
    ("ambulance_dispatch_nested", "changed_binding", "c1", None, UNSOUND),
    # sound weakenings rejected at the weakened step
    ("boiler_pipe_valves", "added_literal", "f6", None, SOUND),
    ("irrigation_valve_sensors", "added_literal", "f8", None, SOUND),
    ("depot_two_levels", "added_literal", "s3", None, SOUND),
    ("warehouse_three_levels", "added_literal", "w3", None, SOUND),
    ("warehouse_three_levels", "added_literal", "w5", None, SOUND),
    # a rewriting record citing a step that claims $false as its equation (was an internal
    # error while inferring the prover's term order); the oracle leaves it undecided
    ("group_right_identity", "empty_clause_early", "c_0_12", None, None),
)
# extra leaves that made an earlier Skolem symbol look non-fresh (failed first there)
EXTRA_LEAVES = (("expense_request_approval", 2), ("lattice_idempotence", 2), ("crane_truck_pairing", 2))
WARM_UP = 6
"""other mutants of each certificate checked first, in the same process"""


def _chosen():
    by_folder = {f.path.parent.name: f for f in fixtures() if f.path.name == "proof.p"}
    warm, chosen = [], []
    for folder, kind, step, _, expected in REGRESSIONS:
        every = mutants(by_folder[folder])
        warm.extend(m for m in every[:WARM_UP] if m not in warm)
        found = [m for m in every if (m.kind, m.step) == (kind, step)]
        assert found, (folder, kind, step)
        chosen.extend((m, expected) for m in found)
    for folder, count in EXTRA_LEAVES:
        every = mutants(by_folder[folder])
        extra = [m for m in every if m.kind == "extra_leaf_axiom"]
        chosen.extend((m, None) for m in extra[-count:])
    return warm, chosen


WARM, CHOSEN = _chosen()


@pytest.fixture(scope="module")
def outcomes():
    with reading_once(), reusing_checked_steps():
        for mutant in WARM:
            run_mutant(mutant)
        return [(mutant, expected, run_mutant(mutant)) for mutant, expected in CHOSEN]


def test_every_regression_is_judged_right_in_a_long_lived_process(outcomes):
    wrong = [(o.where, o.judgement, o.verdict, o.first_step) for _, _, o in outcomes if o.judgement != RIGHT]
    assert wrong == []


def test_the_expected_answers_are_the_oracles(outcomes):
    for mutant, expected, outcome in outcomes:
        if expected is not None:
            assert outcome.expected == expected, outcome.where


def test_unsound_ones_are_rejected_at_the_mutated_step(outcomes):
    unsound = [(m, o) for m, _, o in outcomes if o.expected == UNSOUND]
    assert len(unsound) >= 5
    for mutant, outcome in unsound:
        assert outcome.verdict == "rejected", outcome.where
        assert outcome.first_step == mutant.step or outcome.first_step.startswith(mutant.step + "/"), outcome.where


def test_sound_weakenings_are_not_rejected_at_the_weakened_step(outcomes):
    sound = [(m, o) for m, _, o in outcomes if o.expected == SOUND]
    assert len(sound) == 5
    for mutant, outcome in sound:
        assert outcome.first_step != mutant.step, outcome.where


# Mutants the oracle got wrong (assay was right).  A derivation printed with its
# refutation first: the first statement in the file that mentions a Skolem
# symbol is a consequence, not its introduction (the choice axiom f9), which
# the oracle must take as background.  With f9 no longer cited, f10 is still
# a consequence of f8 and f9, and assay accepts it; the oracle called it unsound.
# (fixture folder, kind, mutated step, a text only the mutant meant has)
ORACLE_REGRESSIONS = (("subset_chain_saturation_printed", "dropped_parent", "f10", "new_symbols(skolem,[sK0])],[f8])"),)


def test_the_oracle_takes_introductions_in_parents_first_order(tmp_path):
    by_folder = {f.path.parent.name: f for f in fixtures() if f.path.name == "proof.p"}
    for folder, kind, step, text in ORACLE_REGRESSIONS:
        found = [m for m in mutants(by_folder[folder]) if (m.kind, m.step) == (kind, step) and text in m.text]
        assert found, (folder, kind, step)
        for mutant in found:
            path = tmp_path / "mutant.p"
            path.write_text(mutant.text, encoding="utf-8")
            assert judge(mutant, str(path)) != UNSOUND, mutant.index
