"""Names without a stated definition, defined symbols used uncited, and
steps sound by a derivation-wide condition (pure predicates, unfolding a
fresh definition) — and the attacks on each that must not be accepted.

Definitional naming and its soundness condition (the name fresh, defined
over exactly the free variables of the subformula it names) follow
Tseitin's transformation as presented in M. Fitting, "First-Order Logic and
Automated Theorem Proving", 2nd ed., 1996, and A. Nonnengart and C.
Weidenbach, "Computing Small Clause Normal Forms", Handbook of Automated
Reasoning, 2001 (both from memory).  The pure literal rule (a predicate of
one polarity may be made true, or false, without losing a model) is from
M. Davis and H. Putnam, "A Computing Procedure for Quantification Theory",
JACM 7(3), 1960.  Expected verdicts are by construction; each attack's
problem has a small model, given beside it.
"""

from __future__ import annotations

from checker.freshness import build_symbol_table
from checker.outcomes import ACCEPTED, FAILED, RECONSTRUCTED, REFUTED, UNPROVEN
from checker.plan import make_plan
from checker.run import check
from formats.tptp import read_tptp


def run(tmp_path, proof: str, problem: str | None):
    (tmp_path / "proof.p").write_text(proof)
    if problem is None:
        return check(str(tmp_path / "proof.p"))
    (tmp_path / "problem.p").write_text(problem)
    return check(str(tmp_path / "proof.p"), str(tmp_path / "problem.p"))


def by_name(report):
    return {step.name: step for step in report.steps}


SHIPPING = """
fof(rule, axiom, ! [X] : (ships(X) => (held(X) | (wrapped(X) & labelled(X))))).
fof(audit, axiom, ! [X] : (audited(X) => held(X))).
"""

SHIPPING_LEAF = "fof(a1, axiom, ! [X] : (ships(X) => (held(X) | (wrapped(X) & labelled(X)))), file('problem.p', rule)).\n"


def test_the_symbol_table_collects_polarities_with_conjectures_reversed(tmp_path):
    # Polarity as in Nonnengart and Weidenbach (from memory): the antecedent
    # of an implication is negative, both sides of an equivalence are both;
    # a conjecture is refuted through its negation, so it counts reversed.
    (tmp_path / "problem.p").write_text(
        "fof(a, axiom, ! [X] : (p(X) => q(X))).\n"
        "fof(b, axiom, r <=> s).\n"
        "fof(c, conjecture, t).\n"
    )
    (tmp_path / "proof.p").write_text("cnf(n, negated_conjecture, ~ t, inference(negate, [status(cth)], [c])).\n")
    problem = read_tptp(str(tmp_path / "problem.p"))
    table = build_symbol_table(make_plan(read_tptp(str(tmp_path / "proof.p"))).steps, problem)
    assert set(table.polarities[("p", 1)]) == {-1}
    assert set(table.polarities[("q", 1)]) == {1}
    assert set(table.polarities[("r", 0)]) == {1, -1}
    assert set(table.polarities[("t", 0)]) == {-1}
    assert table.polarities[("t", 0)][-1][0] == "c"  # first seen in the problem's conjecture


def test_a_name_introduced_by_several_clause_steps_is_accepted_with_one_definition(tmp_path):
    report = run(
        tmp_path,
        SHIPPING_LEAF
        + "cnf(c1, plain, ~ ships(X0) | held(X0) | sP1(X0), inference(cnf_transformation, [], [a1])).\n"
        "cnf(c2, plain, ~ sP1(X0) | labelled(X0), inference(cnf_transformation, [], [a1])).\n",
        SHIPPING,
    )
    steps = by_name(report)
    for name in ("c1", "c2"):
        assert steps[name].outcome == RECONSTRUCTED, steps[name].message
        assert "sP1(X) <=> (wrapped(X) & labelled(X))" in steps[name].message


def test_attack_a_predicate_of_an_assumed_leaf_is_no_name(tmp_path):
    # No problem: the leaf l2 is an assumption that already speaks of sP1,
    # so c1 is an ordinary (wrong) consequence.  Model: a, b, c, d false,
    # sP1 false.
    report = run(
        tmp_path,
        "fof(l1, axiom, a | (b & c)).\n"
        "cnf(l2, axiom, ~ sP1 | d).\n"
        "cnf(c1, plain, b | sP1, inference(cnf_transformation, [], [l1])).\n",
        None,
    )
    step = by_name(report)["c1"]
    assert report.verdict != ACCEPTED
    assert_refuted_as_a_consequence(step)


def test_attack_a_definition_of_a_problem_predicate_is_not_fresh(tmp_path):
    report = run(
        tmp_path,
        "fof(d1, plain, ! [X] : (audited(X) <=> (wrapped(X) & labelled(X))), "
        "introduced(definition, [new_symbols(naming, [audited])])).\n",
        SHIPPING,
    )
    step = by_name(report)["d1"]
    assert step.outcome == FAILED and step.reason == "not_fresh"


def assert_refuted_as_a_consequence(step):
    """Refuted by a counter-model; or, where the symbol the parents lack is
    not fresh, failed as no introduction, with that counter-model shown."""
    assert (step.outcome == REFUTED and step.reason == "countermodel") or (
        step.outcome == FAILED and step.reason == "not_fresh" and "has a counter-model" in step.message
    )


def test_attack_a_problem_predicate_is_no_name(tmp_path):
    # audited/1 is the problem's: c1 is then an ordinary (wrong) consequence.
    # Model: ships and nothing else true.
    report = run(
        tmp_path,
        SHIPPING_LEAF + "cnf(c1, plain, ~ ships(X0) | held(X0) | audited(X0), inference(cnf_transformation, [], [a1])).\n",
        SHIPPING,
    )
    step = by_name(report)["c1"]
    assert report.verdict != ACCEPTED
    assert_refuted_as_a_consequence(step)


def test_attack_a_name_of_the_wrong_polarity_is_unproven_not_refuted(tmp_path):
    # sP1 would have to stand for the negation of a subformula, which no
    # equivalence over a subformula gives; the step may have meant another
    # definition, so a counter-model to this one refutes nothing.
    report = run(
        tmp_path,
        SHIPPING_LEAF + "cnf(c1, plain, ~ ships(X0) | held(X0) | ~ sP1(X0), inference(cnf_transformation, [], [a1])).\n"
        "cnf(c2, plain, ~ sP1(X0) | labelled(X0), inference(cnf_transformation, [], [a1])).\n",
        SHIPPING,
    )
    steps = by_name(report)
    assert report.verdict != ACCEPTED
    assert steps["c2"].outcome == RECONSTRUCTED
    assert steps["c1"].outcome == UNPROVEN and steps["c1"].reason == "naming_not_shown"


def test_attack_a_name_over_fewer_variables_than_its_subformula(tmp_path):
    # c1 names `q(X,Y) & r(X)` by sP1(X0), forgetting X1: over X alone only
    # r(X) is a subformula, with which c2 does not follow.
    report = run(
        tmp_path,
        "fof(l1, axiom, ! [X,Y] : (p(X,Y) => (q(X,Y) & r(X)))).\n"
        "cnf(c1, plain, ~ p(X0,X1) | sP1(X0), inference(cnf_transformation, [], [l1])).\n"
        "cnf(c2, plain, ~ sP1(X0) | q(X0,X1), inference(cnf_transformation, [], [l1])).\n",
        None,
    )
    steps = by_name(report)
    assert report.verdict != ACCEPTED
    assert UNPROVEN in (steps["c1"].outcome, steps["c2"].outcome)
    assert REFUTED not in (steps["c1"].outcome, steps["c2"].outcome)


def test_attack_two_steps_cannot_give_one_name_two_meanings(tmp_path):
    # c1 uses sP1 for `a & b`, c2 for `c`: each alone would pass with its
    # own definition, but one name has one definition.  Model of l1, l2:
    # everything false except c... (c1: a|sP1 needs sP1 ⊇ ..., c2: ~sP1 | c).
    report = run(
        tmp_path,
        "fof(l1, axiom, (a & b) | d).\n"
        "fof(l2, axiom, c | e).\n"
        "cnf(c1, plain, sP1 | d, inference(cnf_transformation, [], [l1])).\n"
        "cnf(c2, plain, sP1 | e, inference(cnf_transformation, [], [l2])).\n"
        "cnf(c3, plain, ~ sP1 | a, inference(cnf_transformation, [], [l1])).\n"
        "cnf(c4, plain, ~ sP1 | c, inference(cnf_transformation, [], [l2])).\n",
        None,
    )
    assert report.verdict != ACCEPTED
    judged = [step.message for step in report.steps if step.name in ("c1", "c2", "c3", "c4")]
    accepted = [step for step in report.steps if step.name in ("c1", "c2", "c3", "c4") and step.outcome == RECONSTRUCTED]
    definitions = {message.split("named by ")[1].split(" (proposed")[0] for message in judged if "named by" in message}
    assert len(definitions) <= 1  # every step was judged against the same definition
    assert len(accepted) < 4


PURE_PROBLEM = """
fof(rule, axiom, ! [X] : (armed(X) => (siren(X) | logged(X)))).
fof(charge, axiom, armed(c4)).
fof(goal, conjecture, siren(c4)).
"""


def test_attack_dropping_a_pure_positive_literal_is_not_removal(tmp_path):
    # logged/1 is pure (positive), but dropping it from a clause makes it
    # false, not true.  Model: armed(c4), logged(c4), no siren.
    report = run(
        tmp_path,
        "fof(a1, axiom, ! [X] : (armed(X) => (siren(X) | logged(X))), file('problem.p', rule)).\n"
        "fof(f1, plain, ! [X] : (armed(X) => siren(X)), inference(pure_predicate_removal, [], [a1])).\n",
        PURE_PROBLEM,
    )
    step = by_name(report)["f1"]
    assert report.verdict != ACCEPTED
    assert step.outcome == REFUTED


def test_attack_a_predicate_negated_only_in_the_derivation_is_not_pure(tmp_path):
    # In the problem logged/1 is positive only; the derivation's c2 has it
    # negatively, so it is not pure over the problem and the derivation.
    report = run(
        tmp_path,
        "fof(a1, axiom, ! [X] : (armed(X) => (siren(X) | logged(X))), file('problem.p', rule)).\n"
        "cnf(c1, plain, ~ armed(X) | siren(X) | logged(X), inference(cnf_transformation, [], [a1])).\n"
        "cnf(c2, plain, ~ logged(X) | ~ armed(X) | siren(X) | logged(X), inference(weaken, [], [c1])).\n"
        "cnf(c3, plain, ~ armed(X) | siren(X), inference(pure_predicate_removal, [], [c1])).\n",
        PURE_PROBLEM,
    )
    step = by_name(report)["c3"]
    assert report.verdict != ACCEPTED
    assert step.outcome == FAILED and step.reason == "not_pure"
    assert "negatively in `c2`" in step.message


def test_attack_a_conjecture_gives_the_other_polarity(tmp_path):
    # siren/1 is positive in the rule and in the conjecture, which counts
    # negated: not pure.  Model: armed(c4), siren(c4).
    report = run(
        tmp_path,
        "fof(a1, axiom, ! [X] : (armed(X) => (siren(X) | logged(X))), file('problem.p', rule)).\n"
        "fof(f1, plain, ! [X] : (armed(X) => logged(X)), inference(pure_predicate_removal, [], [a1])).\n",
        PURE_PROBLEM,
    )
    step = by_name(report)["f1"]
    assert step.outcome == FAILED and step.reason == "not_pure"
    assert "negatively in `goal`" in step.message


def test_attack_a_name_without_a_stated_definition_is_never_pure(tmp_path):
    # sP1 occurs only positively in what is written, but its implicit
    # definition (sP1 <=> logged(X)) has it both ways: removing it as pure
    # would make it true where logged is false.
    report = run(
        tmp_path,
        "fof(a1, axiom, ! [X] : (armed(X) => (siren(X) | logged(X))), file('problem.p', rule)).\n"
        "cnf(c1, plain, ~ armed(X) | siren(X) | sP1(X), inference(cnf_transformation, [], [a1])).\n"
        "cnf(c2, plain, ~ armed(X) | siren(X), inference(pure_predicate_removal, [], [c1])).\n",
        PURE_PROBLEM,
    )
    step = by_name(report)["c2"]
    assert report.verdict != ACCEPTED
    assert step.outcome == FAILED and step.reason == "not_pure"
    assert "without a stated definition" in step.message


def test_a_defined_symbol_is_unfolded_only_by_its_own_definition(tmp_path):
    # f2 unfolds cleared/1 correctly (accepted against the global condition);
    # f3 unfolds it into something its definition does not say.
    report = run(
        tmp_path,
        "fof(d1, plain, ! [X] : (cleared(X) <=> (badge(X) & pin(X))), introduced(definition, [new_symbols(naming, [cleared])])).\n"
        "fof(r1, axiom, ! [X] : ((badge(X) & pin(X)) => opens(X))).\n"
        "fof(f1, plain, ! [X] : (cleared(X) => opens(X)), inference(define, [], [r1, d1])).\n"
        "fof(f2, plain, ! [X] : ((badge(X) & pin(X)) => opens(X)), inference(unused_predicate_definition_removal, [], [f1])).\n"
        "fof(f3, plain, ! [X] : (badge(X) => opens(X)), inference(unused_predicate_definition_removal, [], [f1])).\n",
        None,
    )
    steps = by_name(report)
    assert steps["f2"].outcome == RECONSTRUCTED and "global condition" in steps["f2"].message
    assert steps["f3"].outcome in (REFUTED, UNPROVEN, FAILED)
    assert report.verdict != ACCEPTED


def test_attack_a_proxy_axiom_with_no_definition_is_not_taken(tmp_path):
    # Without the definition, sQ1_eqProxy(X0,X1) is an arbitrary relation:
    # the "axiom" is not valid.
    report = run(
        tmp_path,
        "cnf(p1, axiom, sQ1_eqProxy(X0,X1), introduced(equality_proxy_axiom, [])).\n",
        None,
    )
    assert by_name(report)["p1"].outcome == REFUTED


def test_attack_a_replacement_step_without_a_definition_is_not_a_name_for_equality(tmp_path):
    # The proxy is never defined; the search may only name subformulas, and
    # `a = b` under a name over (a, b)... is no subformula with two free
    # variables, so nothing defines it.
    report = run(
        tmp_path,
        "cnf(l1, axiom, a != b).\n"
        "cnf(c1, plain, ~ sQ1_eqProxy(a,b), inference(equality_proxy_replacement, [], [l1])).\n",
        None,
    )
    step = by_name(report)["c1"]
    assert step.outcome == UNPROVEN and step.reason == "no_naming_definition"
