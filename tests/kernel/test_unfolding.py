"""The kernel's unfolding check: a premise and the conclusion agree once the
equivalence definitions among the premises are unfolded.

That a formula keeps its truth value when a subformula is replaced by an
equivalent one (replacement of equivalents) is common practice (every logic
textbook; Enderton, A Mathematical Introduction to Logic, 2001, from
memory).  Scenario (invented): badges, roles and zones of an access policy.
"""

from __future__ import annotations

import sympy
from hypothesis import given, settings
from hypothesis import strategies as st
from sympy.logic.inference import satisfiable

from checker.kernel.clauses import Clause, Literal
from checker.kernel.entailment import check_entailment
from checker.kernel.formulas import AND, IFF, IMPLIES, OR, VERUM, atomic, binary, negation, quantified
from checker.kernel.terms import application, variable
from checker.kernel.unfolding import Unfolding, check_unfolding, equivalence_definition, unfolded
from formats.tptp import parse_formula

ROLE = parse_formula("! [B,Z] : (cleared(B,Z) <=> ? [R] : (has_role(B,R) & grants(R,Z)))")
REVOKED = parse_formula("! [B] : (blocked(B) <=> ! [V] : (revocation(B,V) => expired(V)))")
POLICY = parse_formula("! [B,Z] : (opens(B,Z) <=> (? [R] : (has_role(B,R) & grants(R,Z)) & ~ ! [V] : (revocation(B,V) => expired(V))))")
FOLDED = parse_formula("! [B,Z] : (opens(B,Z) <=> (cleared(B,Z) & ~ blocked(B)))")


def test_a_policy_with_its_subformulas_named_unfolds_to_the_policy():
    # Folding two subformulas into the atoms defined for them, as a prover's
    # apply_def step does; unfolding both gives the policy back.
    assert check_unfolding([POLICY, ROLE, REVOKED], FOLDED, Unfolding(0, (1, 2), 2)) is None
    assert check_entailment([POLICY, ROLE, REVOKED], FOLDED, Unfolding(0, (1, 2), 1)) is None


def test_a_folded_subformula_with_other_arguments_differs():
    wrong = parse_formula("! [B,Z] : (opens(B,Z) <=> (cleared(Z,B) & ~ blocked(B)))")
    failure = check_unfolding([POLICY, ROLE, REVOKED], wrong, Unfolding(0, (1, 2), 2))
    assert failure is not None and failure.reason == "unfolded_differ"


def test_a_dropped_negation_differs():
    wrong = parse_formula("! [B,Z] : (opens(B,Z) <=> (cleared(B,Z) & blocked(B)))")
    assert check_unfolding([POLICY, ROLE, REVOKED], wrong, Unfolding(0, (1, 2), 2)).reason == "unfolded_differ"


def test_an_implication_is_not_an_equivalence_definition():
    one_way = parse_formula("! [B,Z] : (cleared(B,Z) => ? [R] : (has_role(B,R) & grants(R,Z)))")
    failure = check_unfolding([POLICY, one_way, REVOKED], FOLDED, Unfolding(0, (1, 2), 2))
    assert failure.reason == "not_a_definition"


def test_a_symbol_defined_twice_is_refused():
    other = parse_formula("! [B,Z] : (cleared(B,Z) <=> has_role(B,Z))")
    assert check_unfolding([POLICY, ROLE, other], FOLDED, Unfolding(0, (1, 2), 2)).reason == "defined_twice"


def test_premise_numbers_and_passes_are_bounded():
    assert check_unfolding([POLICY, ROLE], FOLDED, Unfolding(5, (1,), 1)).reason == "no_such_premise"
    assert check_unfolding([POLICY, ROLE], FOLDED, Unfolding(0, (1,), 0)).reason == "unfolding_passes"
    assert check_unfolding([POLICY, ROLE], FOLDED, Unfolding(0, (1,), 2)).reason == "unfolding_passes"


def test_a_premise_numbered_one_past_the_last_is_refused_with_its_number():
    # Premises are numbered from 0, so with two premises 2 is the first
    # number out of range.
    failure = check_unfolding([POLICY, ROLE], FOLDED, Unfolding(0, (2,), 1))
    assert failure.reason == "no_such_premise"
    assert failure.message == "the step has 2 premises, not one numbered 2"


def test_failure_messages_name_what_is_wrong():
    # A prover's developer reads the message, not the code: each names the
    # formula, the symbol or the counts at fault.
    passes = check_unfolding([POLICY, ROLE], FOLDED, Unfolding(0, (1,), 2))
    assert passes.message == "2 passes for 1 definitions"
    one_way = parse_formula("! [B] : (blocked(B) => expired(B))")
    not_definition = check_unfolding([POLICY, one_way], FOLDED, Unfolding(0, (1,), 1))
    assert not_definition.message.startswith("premise 1 `") and "blocked(B)" in not_definition.message
    other = parse_formula("! [B,Z] : (cleared(B,Z) <=> has_role(B,Z))")
    twice = check_unfolding([POLICY, ROLE, other], FOLDED, Unfolding(0, (1, 2), 2))
    assert twice.message == "`cleared/2` is defined by two of the premises"
    wrong = parse_formula("! [B,Z] : (opens(B,Z) <=> (cleared(B,Z) & blocked(B)))")
    differ = check_unfolding([POLICY, ROLE, REVOKED], wrong, Unfolding(0, (1, 2), 2))
    assert differ.message.startswith("unfolded, the premise is `") and "the conclusion `" in differ.message


def test_a_clause_premise_is_read_as_its_universal_closure():
    # cleared(B,Z) | ~ has_role(B,Z), with cleared defined as has_role.
    definition = parse_formula("! [B,Z] : (cleared(B,Z) <=> has_role(B,Z))")
    b, z = variable("B"), variable("Z")
    clause = Clause([Literal(True, application("has_role", (b, z))), Literal(False, application("has_role", (b, z)))])
    claimed = Clause([Literal(True, application("cleared", (b, z))), Literal(False, application("has_role", (b, z)))])
    assert check_unfolding([clause, definition], claimed, Unfolding(0, (1,), 1)) is None


def test_which_side_is_defined():
    # The atom on either side; equality, repeated or non-variable arguments,
    # and a meaning with other free variables do not define.
    right = parse_formula("! [B] : (! [V] : (revocation(B,V) => expired(V)) <=> blocked(B))")
    assert equivalence_definition(right)[0] == atomic(application("blocked", (variable("B"),)))
    for text in (
        "! [B,Z] : (B = Z <=> (has_role(B,Z) & grants(B,Z)))",
        "! [B] : (cleared(B,B) <=> has_role(B,B))",
        "cleared(b1,z1) <=> has_role(b1,z1)",
        "! [B,Z] : (blocked(B) <=> (has_role(B,Z) & grants(B,Z)))",
        "! [B] : (blocked(B) | expired(B))",
    ):
        assert equivalence_definition(parse_formula(text)) is None, text
    assert equivalence_definition(parse_formula("blocked(B) <=> expired(B)")) is None  # not closed


def test_unfolding_renames_a_bound_variable_that_would_capture():
    # Unfolding cleared(R,Z) puts the argument R under the meaning's own
    # binder ? [R]: the binder is renamed, as substitution must.
    inside = parse_formula("! [R,Z] : cleared(R,Z)")
    result = unfolded(inside, {("cleared", 2): ((variable("B"), variable("Z")), equivalence_definition(ROLE)[1])})
    assert result != inside and "R1" in str(result)


def test_truth_constants_and_undefined_atoms_stay():
    assert unfolded(VERUM, {}) is VERUM
    formula = quantified("!", (variable("B"),), binary(AND, VERUM, atomic(application("blocked", (variable("B"),)))))
    assert unfolded(formula, {}) is formula


# Random definitions and formulas against SymPy (a reference library from
# PyPI): an accepted unfolding is a true entailment of the conclusion by the
# premise and the definitions.
_BASE = [atomic(application(name, ())) for name in ("vented", "sealed", "armed")]
_DEFINED = [atomic(application(name, ())) for name in ("safe", "ready")]
_formulas = st.recursive(
    st.sampled_from(_BASE + _DEFINED),
    lambda children: st.one_of(st.builds(negation, children),
                               st.builds(binary, st.sampled_from((AND, OR, IMPLIES, IFF)), children, children)),
    max_leaves=6,
)
_meanings = st.recursive(
    st.sampled_from(_BASE),
    lambda children: st.builds(binary, st.sampled_from((AND, OR, IFF)), children, children),
    max_leaves=3,
)
_SYMPY = {AND: sympy.And, OR: sympy.Or, IMPLIES: sympy.Implies, IFF: sympy.Equivalent}


def _to_sympy(formula):
    if formula.connective == "atom":
        return sympy.Symbol(formula.atom.symbol)
    if formula.connective == "~":
        return sympy.Not(_to_sympy(formula.arguments[0]))
    return _SYMPY[formula.connective](*(_to_sympy(a) for a in formula.arguments))


@settings(max_examples=80, deadline=None)
@given(_formulas, _formulas, _meanings, _meanings)
def test_an_accepted_unfolding_is_an_entailment(premise, conclusion, safe_means, ready_means):
    definitions = [binary(IFF, _DEFINED[0], safe_means), binary(IFF, _DEFINED[1], ready_means)]
    premises = [premise, *definitions]
    if check_unfolding(premises, conclusion, Unfolding(0, (1, 2), 2)) is None:
        together = sympy.And(*(_to_sympy(p) for p in premises), sympy.Not(_to_sympy(conclusion)))
        assert satisfiable(together) is False
    # A premise unfolds to what the conclusion unfolds to when the conclusion
    # is the premise itself with a meaning folded back: always accepted.
    folded = conclusion
    assert check_unfolding([conclusion, *definitions], folded, Unfolding(0, (1, 2), 1)) is None
