"""Soundness attacks on everything outside the kernel: derivations that do
not refute the problem's axioms plus negated conjecture, each of which must
not be accepted.

Each test states the attack and why accepting it would be unsound.  The
scenarios (warehouse docks, rail signals, badge readers) are invented.
Attacks that assay still accepts live in test_soundness_attacks_open.py.
"""

import json

from checker.outcomes import ACCEPTED, CHECKED, FAILED, RECONSTRUCTED, REFUTED, UNREADABLE
from checker.run import check

# A small consistent problem: two docks, one of them open; the conjecture
# (that the other is open too) does not follow.
DOCKS = """
fof(dock1_open, axiom, open(dock1)).
fof(docks_differ, axiom, dock1 != dock2).
fof(goal, conjecture, open(dock2)).
"""


def run(tmp_path, proof: str, problem: str = DOCKS, name: str = "proof.p", extra: dict | None = None):
    (tmp_path / name).write_text(proof)
    (tmp_path / "problem.p").write_text(problem)
    for file_name, text in (extra or {}).items():
        (tmp_path / file_name).write_text(text)
    return check(str(tmp_path / name), str(tmp_path / "problem.p"))


def native(tmp_path, records: list[dict], problem: str = DOCKS):
    header = {"assay_certificate": 1, "problem": "problem.p"}
    text = "\n".join(json.dumps(record) for record in [header, *records]) + "\n"
    return run(tmp_path, text, problem, name="proof.jsonl")


def outcome_of(report, name: str) -> str:
    return next(step.outcome for step in report.steps if step.name == name)


def reasons(report, name: str) -> set[str]:
    step = next(step for step in report.steps if step.name == name)
    return {line for line in step.details if line.startswith("reason: ")}


# The honest refutation the attacks below start from, minus the missing
# piece: every attack has to smuggle in `open(dock2)` or `$false`.
NEGATION = """
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [goal])).
"""


def test_the_unattacked_negation_alone_is_not_a_refutation(tmp_path):
    # Common practice: a derivation must reach the empty clause.
    report = run(tmp_path, NEGATION)
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "(derivation)") == FAILED


# ------------------------------------------------------------------ leaves


def test_axiom_renamed_to_the_conjecture_content(tmp_path):
    # A leaf citing a real axiom's name but stating the conjecture: the
    # problem never asserts open(dock2), so using it refutes nothing.
    report = run(tmp_path, NEGATION + """
fof(smuggled, axiom, open(dock2), file('problem.p', dock1_open)).
fof(f, plain, $false, inference(resolve, [status(thm)], [smuggled, n1])).
""")
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "smuggled") == FAILED


def test_axiom_with_a_constant_renamed(tmp_path):
    # Renaming a constant (dock1 to dock2) is not a renaming of variables:
    # dock2 != dock2 is a different, unasserted (and contradictory) leaf.
    report = run(tmp_path, NEGATION + """
cnf(renamed, axiom, dock2 != dock2, file('problem.p', docks_differ)).
cnf(f, plain, $false, inference(equality_resolution, [status(thm)], [renamed])).
""")
    assert outcome_of(report, "renamed") == FAILED
    assert "not in the problem:" in next(s.message for s in report.steps if s.name == "renamed")
    assert report.verdict != ACCEPTED


def test_clause_leaf_strengthened_by_dropping_a_literal(tmp_path):
    # Common practice: a leaf may weaken a problem clause (add literals),
    # never strengthen it; `open(X)` is far stronger than `open(X) | shut(X)`.
    problem = "cnf(open_or_shut, axiom, open(X) | shut(X)).\nfof(goal, conjecture, open(dock2)).\n"
    report = run(tmp_path, """
cnf(l1, axiom, open(X), file('problem.p', open_or_shut)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [goal])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [l1, n1])).
""", problem)
    assert outcome_of(report, "l1") == FAILED
    assert report.verdict != ACCEPTED


def test_formula_leaf_weakened_the_wrong_way(tmp_path):
    # A fof leaf must be the problem's formula up to renaming of bound
    # variables; dropping a disjunct strengthens it.
    problem = "fof(rule, axiom, ![X]: (open(X) | shut(X))).\nfof(goal, conjecture, open(dock2)).\n"
    report = run(tmp_path, """
fof(l1, axiom, ![X]: open(X), file('problem.p', rule)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [goal])).
fof(f, plain, $false, inference(resolve, [status(thm)], [l1, n1])).
""", problem)
    assert outcome_of(report, "l1") == FAILED
    assert report.verdict != ACCEPTED


def test_leaf_without_any_source(tmp_path):
    # A leaf with no source at all is a new assumption, not a problem input.
    report = run(tmp_path, NEGATION + """
fof(assumed, axiom, ~ open(dock1)).
fof(f, plain, $false, inference(resolve, [status(thm)], [assumed, dock1_open])).
""")
    assert outcome_of(report, "assumed") == FAILED
    assert report.verdict != ACCEPTED


def test_conjecture_used_as_an_axiom_under_an_axiom_name(tmp_path):
    # The conjecture's content cited as an axiom: the conjecture is what is
    # to be shown, never an assumption.
    report = run(tmp_path, NEGATION + """
fof(as_axiom, axiom, open(dock2), file('problem.p', goal)).
fof(f, plain, $false, inference(resolve, [status(thm)], [as_axiom, n1])).
""")
    assert outcome_of(report, "as_axiom") == FAILED
    assert report.verdict != ACCEPTED


def test_tautology_leaf_that_is_not_valid(tmp_path):
    # introduced(tautology) may only state what holds in every model;
    # open(dock2) does not (a one-element model with open false).
    report = run(tmp_path, NEGATION + """
fof(taut, plain, open(dock2), introduced(tautology)).
fof(f, plain, $false, inference(resolve, [status(thm)], [taut, n1])).
""")
    assert outcome_of(report, "taut") == REFUTED
    assert report.verdict != ACCEPTED


def test_theory_leaf_that_is_not_an_equality_axiom(tmp_path):
    # theory(equality) must be valid in every model with equality; `dock2 =
    # dock1` is false where the two docks differ (as the problem says).
    report = run(tmp_path, NEGATION + """
cnf(eq, axiom, dock2 = dock1, theory(equality)).
cnf(f, plain, $false, inference(rewrite, [status(thm)], [eq, dock1_open, n1])).
""")
    assert outcome_of(report, "eq") == REFUTED
    assert report.verdict != ACCEPTED


def test_theory_leaf_that_is_not_a_theory_axiom_at_all(tmp_path):
    # An unknown theory name confers nothing: the leaf must still be valid.
    report = run(tmp_path, NEGATION + """
cnf(th, axiom, open(dock2), theory(docks)).
cnf(f, plain, $false, inference(resolve, [status(thm)], [th, n1])).
""")
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "th") == REFUTED


# ------------------------------------------------------------- definitions


def test_definition_that_constrains_an_existing_symbol(tmp_path):
    # A "definition" of `open`, which the problem already uses, is a new
    # axiom about it: open(X) <=> X = X makes every dock open.
    report = run(tmp_path, NEGATION + """
fof(d, definition, ![X]: (open(X) <=> X = X), introduced(definition)).
fof(f, plain, $false, inference(resolve, [status(thm)], [d, n1])).
""")
    assert outcome_of(report, "d") == FAILED
    assert "reason: not_fresh" in reasons(report, "d")
    assert report.verdict != ACCEPTED


def test_a_symbol_defined_twice(tmp_path):
    # Two definitions of one fresh symbol: each alone is harmless, together
    # (ready <=> $true, ready <=> $false) they are inconsistent.
    report = run(tmp_path, NEGATION + """
fof(d1, definition, ready <=> $true, introduced(definition)).
fof(d2, definition, ready <=> $false, introduced(definition)).
fof(f, plain, $false, inference(resolve, [status(thm)], [d1, d2])).
""")
    assert report.verdict != ACCEPTED
    assert FAILED in {outcome_of(report, "d1"), outcome_of(report, "d2")}


def test_a_circular_definition(tmp_path):
    # ready <=> ~ready has no model at all: the defined symbol may not occur
    # in its own definition.
    report = run(tmp_path, NEGATION + """
fof(d, definition, ready <=> ~ ready, introduced(definition)).
fof(f, plain, $false, inference(clausify, [status(thm)], [d])).
""")
    assert outcome_of(report, "d") == FAILED
    assert report.verdict != ACCEPTED


def test_a_definition_with_a_variable_the_defined_atom_lacks(tmp_path):
    # blocked(X) <=> reserved(X, Y) with Y free means blocked(X) <=>
    # !Y reserved(X, Y) under TPTP's closure, i.e. it constrains `reserved`.
    # Common practice: the defined atom's arguments are exactly the free
    # variables of the definiens.
    report = run(tmp_path, NEGATION + """
fof(d, definition, ![X, Y]: (blocked(X) <=> reserved(X, Y)), introduced(definition)).
""")
    assert outcome_of(report, "d") == FAILED
    assert report.verdict != ACCEPTED


def test_a_definition_of_a_symbol_also_used_in_an_unrelated_step(tmp_path):
    # The defined symbol occurs in a step that does not descend from the
    # definition (here a second leaf that asserts it): not fresh.
    report = run(tmp_path, NEGATION + """
fof(d, definition, ready <=> open(dock2), introduced(definition)).
fof(t, plain, ready | ~ ready | open(dock2), introduced(tautology)).
fof(r, plain, ready, inference(assume, [status(esa)], [dock1_open, n1])).
fof(f, plain, $false, inference(resolve, [status(thm)], [d, r, n1])).
""")
    assert report.verdict != ACCEPTED


# ----------------------------------------------------------- axioms of choice


def test_choice_axiom_whose_witness_is_a_problem_constant(tmp_path):
    # (?[X]: open(X)) => open(dock2) names an existing constant as the
    # witness: that is a new claim about dock2, not a Skolem axiom.
    report = run(tmp_path, NEGATION + """
fof(ch, axiom, (?[X]: open(X)) => open(dock2), introduced(axiom_of_choice)).
fof(f, plain, $false, inference(resolve, [status(thm)], [dock1_open, ch, n1])).
""")
    assert outcome_of(report, "ch") == FAILED
    assert report.verdict != ACCEPTED


def test_choice_axiom_with_one_witness_for_two_variables(tmp_path):
    # (?[X, Y]: linked(X, Y)) => linked(w, w) claims a reflexive link, which
    # the existential does not give: two bound variables, one witness.
    problem = "fof(l, axiom, linked(dock1, dock2)).\nfof(goal, conjecture, ?[Z]: linked(Z, Z)).\n"
    report = run(tmp_path, """
fof(l, axiom, linked(dock1, dock2), file('problem.p', l)).
fof(goal, conjecture, ?[Z]: linked(Z, Z), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ ?[Z]: linked(Z, Z), inference(negate, [status(cth)], [goal])).
fof(ch, axiom, (?[X, Y]: linked(X, Y)) => linked(w, w), introduced(axiom_of_choice)).
fof(f, plain, $false, inference(resolve, [status(thm)], [l, ch, n1])).
""", problem)
    assert outcome_of(report, "ch") == FAILED
    assert report.verdict != ACCEPTED


def test_choice_axiom_that_forgets_a_dependency(tmp_path):
    # ![X]: ((?[Y]: next(X, Y)) => next(X, w)) picks one successor for every
    # X: the witness must be a function of X.
    problem = (
        "fof(succ, axiom, ![X]: ?[Y]: next(X, Y)).\n"
        "fof(goal, conjecture, ?[Y]: ![X]: next(X, Y)).\n"
    )
    report = run(tmp_path, """
fof(succ, axiom, ![X]: ?[Y]: next(X, Y), file('problem.p', succ)).
fof(goal, conjecture, ?[Y]: ![X]: next(X, Y), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ ?[Y]: ![X]: next(X, Y), inference(negate, [status(cth)], [goal])).
fof(ch, axiom, ![X]: ((?[Y]: next(X, Y)) => next(X, w)), introduced(axiom_of_choice)).
fof(f, plain, $false, inference(resolve, [status(thm)], [succ, ch, n1])).
""", problem)
    assert outcome_of(report, "ch") == FAILED
    assert report.verdict != ACCEPTED


def test_choice_symbol_reused_by_a_skolemization(tmp_path):
    # The same symbol `w` chosen for open(X) and Skolemizing ?[X]: ~open(X):
    # with one constant for both, open(w) & ~open(w).
    problem = "fof(some_open, axiom, ?[X]: open(X)).\nfof(some_shut, axiom, ?[X]: ~ open(X)).\n"
    report = run(tmp_path, """
fof(some_open, axiom, ?[X]: open(X), file('problem.p', some_open)).
fof(some_shut, axiom, ?[X]: ~ open(X), file('problem.p', some_shut)).
fof(ch, axiom, (?[X]: open(X)) => open(w), introduced(axiom_of_choice)).
cnf(s1, plain, ~ open(w), inference(skolemize, [status(esa)], [some_shut])).
cnf(s2, plain, open(w), inference(resolve, [status(thm)], [some_open, ch])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [s1, s2])).
""", problem)
    assert report.verdict != ACCEPTED


# ----------------------------------------------------------- Skolemization

SOME = """
fof(some_open, axiom, ?[X]: open(X)).
fof(some_shut, axiom, ?[X]: ~ open(X)).
"""
SOME_LEAVES = """
fof(some_open, axiom, ?[X]: open(X), file('problem.p', some_open)).
fof(some_shut, axiom, ?[X]: ~ open(X), file('problem.p', some_shut)).
"""


def test_one_skolem_constant_in_two_branches(tmp_path):
    # The classic: ?X open(X) and ?X ~open(X) are consistent together; with
    # the same Skolem constant for both they are not.
    report = run(tmp_path, SOME_LEAVES + """
cnf(s1, plain, open(sk1), inference(skolemize, [status(esa)], [some_open])).
cnf(s2, plain, ~ open(sk1), inference(skolemize, [status(esa)], [some_shut])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [s1, s2])).
""", SOME)
    assert report.verdict != ACCEPTED
    assert "reason: not_fresh" in reasons(report, "s2")


def test_skolem_symbol_that_occurs_in_the_problem(tmp_path):
    # Skolemizing ?X ~open(X) with dock1, which the problem says is open.
    report = run(tmp_path, """
fof(some_shut, axiom, ?[X]: ~ open(X), file('problem.p', some_shut)).
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
cnf(s1, plain, ~ open(dock1), inference(skolemize, [status(esa)], [some_shut])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [s1, dock1_open])).
""", "fof(some_shut, axiom, ?[X]: ~ open(X)).\nfof(dock1_open, axiom, open(dock1)).\n")
    assert report.verdict != ACCEPTED


def test_witness_for_an_existential_of_negative_polarity(tmp_path):
    # (?X open(X)) => alarm says nothing about any particular X; replacing
    # the existential by a constant yields open(sk) => alarm, which with
    # a further claim open(sk) would derive alarm.  Skolemization may only
    # replace existentials of positive polarity.
    problem = "fof(rule, axiom, (?[X]: open(X)) => alarm).\nfof(goal, conjecture, alarm | ~ alarm).\n"
    report = run(tmp_path, """
fof(rule, axiom, (?[X]: open(X)) => alarm, file('problem.p', rule)).
fof(s1, plain, ~ open(sk) | alarm, inference(skolemize, [status(esa)], [rule])).
fof(s2, plain, open(sk), inference(skolemize, [status(esa)], [s1])).
""", problem)
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "s1") == FAILED


def test_two_existentials_sharing_one_witness(tmp_path):
    # ?X ?Y linked(X, Y) does not give a reflexive link linked(sk, sk).
    problem = "fof(l, axiom, ?[X, Y]: linked(X, Y)).\nfof(irreflexive, axiom, ![X]: ~ linked(X, X)).\n"
    report = run(tmp_path, """
fof(l, axiom, ?[X, Y]: linked(X, Y), file('problem.p', l)).
fof(irreflexive, axiom, ![X]: ~ linked(X, X), file('problem.p', irreflexive)).
cnf(s1, plain, linked(sk, sk), inference(skolemize, [status(esa)], [l])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [s1, irreflexive])).
""", problem)
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "s1") in (FAILED, REFUTED)


def test_skolem_constant_for_an_inner_existential(tmp_path):
    # ![X]: ?[Y]: next(X, Y): witnessing Y by a constant, not a function of
    # X, claims one common successor (the inner quantifier witnessed as if
    # it were outermost).
    problem = (
        "fof(succ, axiom, ![X]: ?[Y]: next(X, Y)).\n"
        "fof(goal, conjecture, ?[Y]: ![X]: next(X, Y)).\n"
    )
    report = run(tmp_path, """
fof(succ, axiom, ![X]: ?[Y]: next(X, Y), file('problem.p', succ)).
fof(goal, conjecture, ?[Y]: ![X]: next(X, Y), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ ?[Y]: ![X]: next(X, Y), inference(negate, [status(cth)], [goal])).
cnf(s1, plain, next(X, sk), inference(skolemize, [status(esa)], [succ])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [s1, n1])).
""", problem)
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "s1") == FAILED


def test_skolemization_claimed_as_a_logical_consequence(tmp_path):
    # status(thm) claims ?X ~open(X) |= ~open(sk), which is false as a
    # consequence; but a step that introduces a symbol is judged by what it
    # does, and as a Skolemization it is sound.  Claimed with the witness
    # of the other existential, it is neither.
    report = run(tmp_path, SOME_LEAVES + """
cnf(s1, plain, ~ open(sk), inference(skolemize, [status(thm)], [some_shut])).
""", SOME)
    assert outcome_of(report, "s1") == RECONSTRUCTED
    report = run(tmp_path, SOME_LEAVES + """
cnf(s1, plain, ~ open(sk), inference(skolemize, [status(thm)], [some_open])).
""", SOME)
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "s1") == REFUTED


def test_skolemization_that_also_strengthens(tmp_path):
    # A Skolem step that replaces the existential correctly but also drops
    # a disjunct: (?X open(X)) | alarm to open(sk), which loses `alarm`.
    problem = "fof(rule, axiom, (?[X]: open(X)) | alarm).\nfof(quiet, axiom, ![X]: ~ open(X)).\n"
    report = run(tmp_path, """
fof(rule, axiom, (?[X]: open(X)) | alarm, file('problem.p', rule)).
fof(quiet, axiom, ![X]: ~ open(X), file('problem.p', quiet)).
cnf(s1, plain, open(sk), inference(skolemize, [status(esa)], [rule])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [s1, quiet])).
""", problem)
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "s1") in (FAILED, REFUTED)


def test_skolem_symbol_introduced_by_a_later_step_and_used_in_a_sibling(tmp_path):
    # sk introduced by s2 but already stated by s1, which does not descend
    # from s2: the witness was not fresh when s1 used it.
    report = run(tmp_path, SOME_LEAVES + """
cnf(s1, plain, open(sk), inference(skolemize, [status(esa)], [some_open])).
cnf(s2, plain, ~ open(sk), inference(skolemize, [status(esa)], [some_shut])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [s2, s1])).
""", SOME)
    assert report.verdict != ACCEPTED


# ------------------------------------------------------- negated conjecture


def test_negating_a_different_formula(tmp_path):
    # ~open(dock1) is not the negation of open(dock2); with it the axioms
    # refute at once.
    report = run(tmp_path, """
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open(dock1), inference(negate, [status(cth)], [goal])).
fof(f, plain, $false, inference(resolve, [status(thm)], [dock1_open, n1])).
""")
    assert outcome_of(report, "n1") in (FAILED, REFUTED)
    assert report.verdict != ACCEPTED


def test_dropped_negation(tmp_path):
    # The "negated" conjecture states the conjecture itself.
    report = run(tmp_path, """
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, open(dock2), inference(negate, [status(cth)], [goal])).
fof(n2, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [goal])).
fof(f, plain, $false, inference(resolve, [status(thm)], [n1, n2])).
""")
    assert outcome_of(report, "n1") in (FAILED, REFUTED)
    assert report.verdict != ACCEPTED


def test_conjecture_used_as_a_premise(tmp_path):
    # Common practice: only the negation of a conjecture may be used; the
    # conjecture itself is not assumed.
    report = run(tmp_path, NEGATION + """
fof(f, plain, $false, inference(resolve, [status(thm)], [goal, n1])).
""")
    assert outcome_of(report, "f") == FAILED
    assert "reason: conjecture_as_premise" in reasons(report, "f")
    assert report.verdict != ACCEPTED


def test_conjecture_used_as_a_premise_inside_a_nested_record(tmp_path):
    # The same, hidden inside an unnamed inference record.
    report = run(tmp_path, NEGATION + """
fof(f, plain, $false, inference(resolve, [status(thm)],
    [inference(copy, [status(thm)], [goal]), n1])).
""")
    assert report.verdict != ACCEPTED


def test_negation_step_with_an_extra_parent(tmp_path):
    # A cth step with an axiom as a second parent could state anything that
    # follows from the negation together with that axiom, e.g. $false.
    report = run(tmp_path, """
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, $false, inference(negate, [status(cth)], [goal, dock1_open])).
""")
    assert outcome_of(report, "n1") == FAILED
    assert "reason: negation_parents" in reasons(report, "n1")
    assert report.verdict != ACCEPTED


def test_negation_with_a_free_variable_is_stronger(tmp_path):
    # fof leaves free variables universal: ~open(X) is !X ~open(X), stronger
    # than the negation of !X open(X), which is ?X ~open(X).
    problem = "fof(dock1_open, axiom, open(dock1)).\nfof(goal, conjecture, ![X]: open(X)).\n"
    report = run(tmp_path, """
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
fof(goal, conjecture, ![X]: open(X), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open(X), inference(negate, [status(cth)], [goal])).
fof(f, plain, $false, inference(resolve, [status(thm)], [dock1_open, n1])).
""", problem)
    assert outcome_of(report, "n1") in (FAILED, REFUTED)
    assert report.verdict != ACCEPTED


def test_negated_and_skolemized_with_a_problem_constant(tmp_path):
    # ~![X]: open(X) Skolemized with dock1, which the problem says is open:
    # not a fresh witness.
    problem = "fof(dock1_open, axiom, open(dock1)).\nfof(goal, conjecture, ![X]: open(X)).\n"
    report = run(tmp_path, """
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
fof(goal, conjecture, ![X]: open(X), file('problem.p', goal)).
cnf(n1, negated_conjecture, ~ open(dock1), inference(negate, [status(cth)], [goal])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [dock1_open, n1])).
""", problem)
    assert outcome_of(report, "n1") in (FAILED, REFUTED)
    assert report.verdict != ACCEPTED


def test_an_axiom_relabelled_as_the_conjecture(tmp_path):
    # A problem with no conjecture: restating its axiom as a "conjecture"
    # and refuting its negation is trivial, and says nothing about the
    # (consistent) axioms.
    problem = "fof(dock1_open, axiom, open(dock1)).\n"
    report = run(tmp_path, """
fof(dock1_open, conjecture, open(dock1), file('problem.p', dock1_open)).
fof(n1, negated_conjecture, ~ open(dock1), inference(negate, [status(cth)], [dock1_open])).
fof(again, axiom, open(dock1), file('problem.p', dock1_open)).
fof(f, plain, $false, inference(resolve, [status(thm)], [again, n1])).
""", problem)
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "n1") == FAILED


def test_a_derived_statement_labelled_conjecture(tmp_path):
    # A derived step with role conjecture (here a copy of an axiom) is no
    # conjecture of the problem; negating it refutes nothing.
    report = run(tmp_path, """
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
fof(fake, conjecture, open(dock1), inference(copy, [status(thm)], [dock1_open])).
fof(n1, negated_conjecture, ~ open(dock1), inference(negate, [status(cth)], [fake])).
fof(f, plain, $false, inference(resolve, [status(thm)], [dock1_open, n1])).
""")
    assert report.verdict != ACCEPTED


def test_clause_of_a_fof_conjecture_as_the_conjecture(tmp_path):
    # The clause open(dock1) follows from the conjecture open(dock1) &
    # open(dock2), but a weaker conjecture has a stronger negation.
    problem = "fof(dock1_open, axiom, open(dock1)).\nfof(goal, conjecture, open(dock1) & open(dock2)).\n"
    report = run(tmp_path, """
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
cnf(goal, conjecture, open(dock1), file('problem.p', goal)).
cnf(n1, negated_conjecture, ~ open(dock1), inference(negate, [status(cth)], [goal])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [dock1_open, n1])).
""", problem)
    assert report.verdict != ACCEPTED


def test_two_conjectures_negated_together(tmp_path):
    # TPTP language standard (from memory): conjectures are proved one at a
    # time; refuting both negations at once proves only their disjunction.
    problem = "fof(either, axiom, open(dock1) | open(dock2)).\n" \
              "fof(g1, conjecture, open(dock1)).\nfof(g2, conjecture, open(dock2)).\n"
    report = run(tmp_path, """
fof(either, axiom, open(dock1) | open(dock2), file('problem.p', either)).
fof(g1, conjecture, open(dock1), file('problem.p', g1)).
fof(g2, conjecture, open(dock2), file('problem.p', g2)).
fof(n1, negated_conjecture, ~ open(dock1), inference(negate, [status(cth)], [g1])).
fof(n2, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [g2])).
fof(f, plain, $false, inference(resolve, [status(thm)], [either, n1, n2])).
""", problem)
    assert report.verdict != ACCEPTED
    assert "reason: second_conjecture" in reasons(report, "n2")


# ------------------------------------------------------------ structure


def test_duplicate_name_whose_second_statement_is_false(tmp_path):
    # Two statements named n1: whichever a step reads, the other is never
    # the one checked; the duplicate itself must fail the run.
    report = run(tmp_path, NEGATION + """
cnf(n1, plain, $false).
cnf(f, plain, $false, inference(resolve, [status(thm)], [n1])).
""")
    assert report.verdict != ACCEPTED


def test_leaf_that_is_also_derived(tmp_path):
    # One name, once as an (unjustified) leaf, once as a derived step: only
    # one of them can be the statement its users read.
    report = run(tmp_path, NEGATION + """
fof(x, plain, open(dock2), inference(copy, [status(thm)], [dock1_open])).
fof(x, axiom, open(dock2), file('problem.p', dock1_open)).
fof(f, plain, $false, inference(resolve, [status(thm)], [x, n1])).
""")
    assert report.verdict != ACCEPTED


def test_cycle_of_steps_justifying_each_other(tmp_path):
    # Common practice: a derivation is acyclic; x from y and y from x
    # justifies neither.
    report = run(tmp_path, NEGATION + """
fof(x, plain, open(dock2), inference(copy, [status(thm)], [y])).
fof(y, plain, open(dock2), inference(copy, [status(thm)], [x])).
fof(f, plain, $false, inference(resolve, [status(thm)], [x, n1])).
""")
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "x") == FAILED


def test_self_justifying_step(tmp_path):
    report = run(tmp_path, NEGATION + """
fof(x, plain, open(dock2), inference(copy, [status(thm)], [x])).
fof(f, plain, $false, inference(resolve, [status(thm)], [x, n1])).
""")
    assert report.verdict != ACCEPTED


def test_dangling_parent(tmp_path):
    report = run(tmp_path, NEGATION + """
fof(f, plain, $false, inference(resolve, [status(thm)], [nowhere, n1])).
""")
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "f") == FAILED


def test_parent_named_like_a_nested_record(tmp_path):
    # A step citing `x/1`, the name assay gives x's first nested record,
    # must not read an unchecked statement.  TPTP names cannot contain `/`
    # unquoted, and a quoted name keeps its quotes, so the citation is
    # simply dangling.
    report = run(tmp_path, NEGATION + """
fof(x, plain, open(dock1), inference(copy, [status(thm)], [inference(copy, [status(thm)], [dock1_open])])).
fof(f, plain, $false, inference(resolve, [status(thm)], ['x/1', n1])).
""")
    assert report.verdict != ACCEPTED


# -------------------------------------------------------------- statuses


def test_esa_status_without_new_symbols_is_still_checked(tmp_path):
    # esa (equisatisfiable) does not excuse a step that introduces nothing:
    # open(dock2) is not a consequence of open(dock1) and ~open(dock2)
    # (the parents that make dock2 no new symbol).
    report = run(tmp_path, NEGATION + """
fof(x, plain, open(dock2), inference(convert, [status(esa)], [dock1_open, n1])).
fof(f, plain, $false, inference(resolve, [status(thm)], [x, n1])).
""")
    assert outcome_of(report, "x") == REFUTED
    assert report.verdict != ACCEPTED


def test_unknown_status_is_still_checked(tmp_path):
    report = run(tmp_path, NEGATION + """
fof(x, plain, open(dock2), inference(convert, [status(anything)], [dock1_open, n1])).
fof(f, plain, $false, inference(resolve, [status(thm)], [x, n1])).
""")
    assert outcome_of(report, "x") == REFUTED
    assert report.verdict != ACCEPTED


def test_missing_status_is_still_checked(tmp_path):
    report = run(tmp_path, NEGATION + """
fof(x, plain, open(dock2), inference(convert, [], [dock1_open, n1])).
fof(f, plain, $false, inference(resolve, [], [x, n1])).
""")
    assert outcome_of(report, "x") == REFUTED
    assert report.verdict != ACCEPTED


def test_tautology_status_on_a_non_valid_step(tmp_path):
    # status(tau) claims validity; a step that is not even a consequence of
    # its parents is refuted all the same.
    report = run(tmp_path, NEGATION + """
fof(x, plain, open(dock2), inference(convert, [status(tau)], [dock1_open, n1])).
fof(f, plain, $false, inference(resolve, [status(thm)], [x, n1])).
""")
    assert outcome_of(report, "x") == REFUTED


def test_esa_step_that_introduces_a_predicate(tmp_path):
    # A new predicate is not a Skolem witness; an esa step cannot use one to
    # assert something (ready) that the premises say nothing about, and then
    # read `ready => open(dock2)` off a second such step.
    report = run(tmp_path, NEGATION + """
fof(x, plain, ~ ready | open(dock2), inference(convert, [status(esa)], [dock1_open, n1])).
fof(y, plain, ready, inference(convert, [status(esa)], [dock1_open, n1])).
fof(f, plain, $false, inference(resolve, [status(thm)], [x, y, n1])).
""")
    assert report.verdict != ACCEPTED


# ------------------------------------------------- clauses versus formulas


def test_cnf_with_a_quantifier(tmp_path):
    # TPTP syntax BNF: a <cnf_formula> is a disjunction of literals; a
    # quantifier there is not TPTP.  Either way it must not be accepted.
    report = run(tmp_path, NEGATION + """
cnf(x, axiom, ?[X]: open(X), file('problem.p', dock1_open)).
cnf(f, plain, $false, inference(resolve, [status(thm)], [x, n1])).
""")
    assert report.verdict != ACCEPTED


def test_free_variable_in_a_fof_axiom_means_every_value(tmp_path):
    # A leaf `open(X)` (free X, universal) citing `?[X]: open(X)`: some dock
    # open is not every dock open.
    problem = "fof(some, axiom, ?[X]: open(X)).\nfof(goal, conjecture, open(dock2)).\n"
    report = run(tmp_path, """
fof(some, axiom, open(X), file('problem.p', some)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [goal])).
fof(f, plain, $false, inference(resolve, [status(thm)], [some, n1])).
""", problem)
    assert outcome_of(report, "some") == FAILED
    assert report.verdict != ACCEPTED


def test_explicit_evidence_on_a_formula_step(tmp_path):
    # Native certificate: resolution evidence is for clauses; on a formula
    # step it would check the clause reading of something else.
    records = [
        {"name": "dock1_open", "role": "axiom", "language": "fof", "formula": "open(dock1)",
         "origin": {"kind": "file", "detail": ["problem.p", "dock1_open"]}},
        {"name": "goal", "role": "conjecture", "language": "fof", "formula": "open(dock2)",
         "origin": {"kind": "file", "detail": ["problem.p", "goal"]}},
        {"name": "n1", "role": "negated_conjecture", "language": "fof", "formula": "~ open(dock2)",
         "inference": {"rule": "negate", "parents": ["goal"], "status": "cth"}},
        {"name": "x", "role": "plain", "language": "fof", "formula": "open(dock2)",
         "inference": {"rule": "instantiation", "parents": ["dock1_open"], "premise": 0}},
        {"name": "f", "role": "plain", "language": "cnf", "formula": "$false",
         "inference": {"rule": "resolution", "parents": ["x", "n1"], "left": 0, "left_literal": 0,
                       "right": 1, "right_literal": 0}},
    ]
    report = native(tmp_path, records)
    assert report.verdict != ACCEPTED


def test_native_resolution_evidence_with_a_substitution_for_a_constant(tmp_path):
    # A substitution maps variables only; "mapping" the constant dock1 to
    # dock2 would turn open(dock1) into open(dock2).
    records = [
        {"name": "dock1_open", "role": "axiom", "language": "cnf", "formula": "open(dock1)",
         "origin": {"kind": "file", "detail": ["problem.p", "dock1_open"]}},
        {"name": "goal", "role": "conjecture", "language": "fof", "formula": "open(dock2)",
         "origin": {"kind": "file", "detail": ["problem.p", "goal"]}},
        {"name": "n1", "role": "negated_conjecture", "language": "cnf", "formula": "~ open(dock2)",
         "inference": {"rule": "negate", "parents": ["goal"], "status": "cth"}},
        {"name": "f", "role": "plain", "language": "cnf", "formula": "$false",
         "inference": {"rule": "resolution", "parents": ["dock1_open", "n1"], "left": 0, "left_literal": 0,
                       "right": 1, "right_literal": 0, "left_substitution": {"dock1": "dock2"}}},
    ]
    report = native(tmp_path, records, "cnf(dock1_open, axiom, open(dock1)).\nfof(goal, conjecture, open(dock2)).\n")
    assert report.verdict != ACCEPTED


def test_native_theta_that_maps_a_constant(tmp_path):
    # The conclusion test theta(computed) ⊆ claimed: theta too maps only
    # variables; with dock1 := dock2 it would claim open(dock2).
    records = [
        {"name": "dock1_open", "role": "axiom", "language": "cnf", "formula": "open(dock1)",
         "origin": {"kind": "file", "detail": ["problem.p", "dock1_open"]}},
        {"name": "x", "role": "plain", "language": "cnf", "formula": "open(dock2)",
         "inference": {"rule": "instantiation", "parents": ["dock1_open"], "premise": 0,
                       "theta": {"dock1": "dock2"}}},
    ]
    report = native(tmp_path, records, "cnf(dock1_open, axiom, open(dock1)).\n")
    assert report.verdict != ACCEPTED


# -------------------------------------------------------------- equality


def test_true_atom_in_a_problem_clause_is_not_dropped(tmp_path):
    # TPTP language standard: $true is the true atom, so `open(dock2) |
    # $true` is valid and asserts nothing; reading it as open(dock2) would
    # strengthen the axiom.
    problem = "cnf(vacuous, axiom, open(dock2) | $true).\nfof(goal, conjecture, open(dock2)).\n"
    report = run(tmp_path, """
cnf(vacuous, axiom, open(dock2) | $true, file('problem.p', vacuous)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [goal])).
cnf(f, plain, $false, inference(resolve, [status(thm)], [vacuous, n1])).
""", problem)
    assert report.verdict != ACCEPTED


def test_false_atom_as_a_leaf_clause_is_not_in_a_consistent_problem(tmp_path):
    report = run(tmp_path, NEGATION + """
cnf(x, axiom, $false | open(dock1), file('problem.p', dock1_open)).
cnf(y, axiom, $false, file('problem.p', dock1_open)).
""")
    assert outcome_of(report, "y") == FAILED
    assert report.verdict != ACCEPTED


def test_equality_sign_with_three_arguments(tmp_path):
    # TPTP syntax BNF: `=` is infix and binary; `=(a, b, c)` is no equation
    # and must not be read as one (nor accepted).
    report = run(tmp_path, NEGATION + """
cnf(x, axiom, =(dock1, dock2, dock1), theory(equality)).
""")
    assert report.verdict != ACCEPTED


def test_distinct_object_is_not_the_constant_of_the_same_letters(tmp_path):
    # TPTP language standard: "dock1" (a distinct object) and dock1 (a
    # constant) are different symbols; open(dock1) says nothing about
    # open("dock1").
    problem = "fof(dock1_open, axiom, open(dock1)).\nfof(goal, conjecture, open(\"dock1\")).\n"
    report = run(tmp_path, """
fof(dock1_open, axiom, open(dock1), file('problem.p', dock1_open)).
fof(goal, conjecture, open("dock1"), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open("dock1"), inference(negate, [status(cth)], [goal])).
fof(f, plain, $false, inference(resolve, [status(thm)], [dock1_open, n1])).
""", problem)
    assert report.verdict != ACCEPTED


def test_quoted_uppercase_word_is_a_constant(tmp_path):
    # TPTP syntax BNF: 'Dock' is a single-quoted atomic word (a constant),
    # not the variable Dock; open('Dock') does not make every dock open.
    problem = "fof(d, axiom, open('Dock')).\nfof(goal, conjecture, open(dock2)).\n"
    report = run(tmp_path, """
fof(d, axiom, open('Dock'), file('problem.p', d)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
fof(n1, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [goal])).
fof(f, plain, $false, inference(resolve, [status(thm)], [d, n1])).
""", problem)
    assert report.verdict != ACCEPTED


# -------------------------------------------------------------- includes


def test_include_selection_limits_the_problem(tmp_path):
    # TPTP language standard: include('f', [a]) includes only the named
    # statements; an axiom of the file left out is no axiom of the problem.
    # The file's other axiom contradicts the selected one.
    axioms = "fof(dock1_open, axiom, open(dock1)).\nfof(dock1_shut, axiom, ~ open(dock1)).\n"
    problem = "include('docks.ax', [dock1_open]).\nfof(goal, conjecture, open(dock2)).\n"
    report = run(tmp_path, NEGATION + """
fof(dock1_shut, axiom, ~ open(dock1), file('docks.ax', dock1_shut)).
fof(f, plain, $false, inference(resolve, [status(thm)], [dock1_shut, dock1_open])).
""", problem, extra={"docks.ax": axioms})
    assert outcome_of(report, "dock1_shut") == FAILED
    assert report.verdict != ACCEPTED


def test_include_in_the_derivation_does_not_add_axioms(tmp_path):
    # A derivation that includes a file of its own: what it brings in is a
    # set of leaves like any other, each linked to the problem.
    report = run(tmp_path, NEGATION + """
include('extra.ax').
fof(f, plain, $false, inference(resolve, [status(thm)], [dock1_shut, dock1_open])).
""", extra={"extra.ax": "fof(dock1_shut, axiom, ~ open(dock1)).\n"})
    assert report.verdict != ACCEPTED
    assert outcome_of(report, "dock1_shut") == FAILED


def test_the_certificate_given_as_its_own_problem(tmp_path):
    # A derivation cannot vouch for its own leaves.
    proof = "fof(dock2_open, axiom, open(dock2)).\n" + NEGATION.replace("file('problem.p', goal)", "file('proof.p', goal)")
    (tmp_path / "proof.p").write_text(proof)
    report = check(str(tmp_path / "proof.p"), str(tmp_path / "proof.p"))
    assert report.verdict != ACCEPTED


# -------------------------------------------------------- stated bindings


def test_stated_binding_that_the_inference_cannot_use(tmp_path):
    # A parent citation's bind(Y, dock1) that the inference cannot use (the
    # resolvent needs Y := dock2): a misstated unifier is the producer's
    # error even though another unifier works (common practice for
    # explicit certificates), and must not be silently replaced.
    problem = "cnf(all_open_if_any, axiom, ~ open(X) | open(Y)).\nfof(goal, conjecture, open(dock2)).\n"
    report = run(tmp_path, """
cnf(rule, axiom, ~ open(X) | open(Y), file('problem.p', all_open_if_any)).
fof(goal, conjecture, open(dock2), file('problem.p', goal)).
cnf(n1, negated_conjecture, ~ open(dock2), inference(negate, [status(cth)], [goal])).
cnf(x, plain, ~ open(X), inference(resolve, [status(thm)], [rule:[bind(Y, $fot(dock1))], n1])).
""", problem)
    assert outcome_of(report, "x") == FAILED
    assert "reason: wrong_bindings" in reasons(report, "x")


def test_unreadable_input_is_never_accepted(tmp_path):
    report = run(tmp_path, NEGATION + "fof(f, plain, $false, inference(resolve, [status(thm)], [n1\n")
    assert report.verdict == UNREADABLE


def test_a_leaf_matching_by_content_only_is_checked_not_trusted(tmp_path):
    # Control: a leaf cited under another name is fine when its content is
    # some problem axiom (the check is by content), so a wrong name is not
    # itself an attack.
    report = run(tmp_path, NEGATION + "fof(other, axiom, open(dock1), file('problem.p', docks_differ)).\n")
    assert outcome_of(report, "other") == CHECKED
