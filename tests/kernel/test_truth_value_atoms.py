"""`$true` and `$false` kept as atoms of a clause mean what TPTP says they
mean when a model is evaluated, so a valid clause is never "refuted"."""

from checker.kernel.models import Interpretation, confirm_countermodel
from checker.outcomes import REFUTED
from checker.run import check
from formats.tptp import parse_clause


def test_confirm_countermodel_reads_true_and_false_atoms_as_truth_values():
    # The TPTP reader keeps `$true` (and `~ $false`) in a cnf clause as a
    # literal whose atom is the constant $true/0 (resp. $false/0).  The
    # TPTP language fixes their meaning (TPTP syntax BNF, <defined_prop>,
    # from memory):
    # `$true | open(v2)` is a tautology.  models.evaluate_atom looks both
    # up in the predicate tables like any other predicate, so an
    # interpretation with "$true = false" is confirmed as a counter-model
    # of a valid clause, and the step is reported refuted.
    tautologies = [parse_clause("$true | open(v2)"), parse_clause("~ $false | open(v2)")]
    model = Interpretation(
        1, {("v2", 0): {(): 0}}, {("$true", 0): frozenset(), ("$false", 0): frozenset({()}), ("open", 1): frozenset()}
    )
    for clause in tautologies:
        assert confirm_countermodel(model, [], clause) is not None, clause


def test_a_valid_tautology_step_is_not_refuted(tmp_path):
    # End to end: a plant interlock (invented) whose step claims the
    # tautology `$true | open(v2)` from an axiom is valid, so it must never
    # be reported refuted by a counter-model.
    (tmp_path / "problem.p").write_text("cnf(valve_shut, axiom, shut(v1)).\n")
    (tmp_path / "proof.p").write_text(
        "cnf(valve_shut, axiom, shut(v1), file('problem.p', valve_shut)).\n"
        "cnf(c1, plain, $true | open(v2), inference(weaken, [status(thm)], [valve_shut])).\n"
    )
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))
    step = next(step for step in report.steps if step.name == "c1")
    assert step.outcome != REFUTED, step.details
