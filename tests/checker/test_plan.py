"""The plan: structural faults of a derivation and the order of its steps."""

from checker.outcomes import FAILED
from checker.plan import make_plan
from formats.tptp import parse_tptp


def plan_of(text: str):
    return make_plan(parse_tptp(text, "plan.p"))


def test_parents_come_first_and_written_order_is_kept_otherwise():
    # A step written before its parent is checked after it (common practice:
    # a derivation is a DAG, checked parents first).
    plan = plan_of(
        """
        cnf(c3, plain, q, inference(r, [status(thm)], [c1, c2])).
        cnf(c1, axiom, p | q).
        cnf(c2, axiom, ~p).
        cnf(c4, axiom, r).
        """
    )
    assert [step.name for step in plan.steps] == ["c1", "c2", "c3", "c4"]
    assert plan.faults == {}


def test_duplicate_name_is_a_fault_naming_the_first_definition():
    plan = plan_of("cnf(c1, axiom, p).\ncnf(c1, axiom, q).\n")
    assert [d.name for d in plan.duplicates] == ["c1"]
    assert plan.duplicates[0].outcome == FAILED
    assert "plan.p:1:1" in plan.duplicates[0].message
    assert plan.duplicates[0].location.line == 2


def test_dangling_parent_is_a_fault_of_the_step_that_uses_it():
    plan = plan_of("cnf(c1, axiom, p).\ncnf(c2, plain, p, inference(r, [status(thm)], [c1, missing])).\n")
    assert set(plan.faults) == {"c2"}
    assert "`missing`" in plan.faults["c2"].message


def test_cycle_is_reported_with_its_path():
    plan = plan_of(
        """
        cnf(a, plain, p, inference(r, [status(thm)], [b])).
        cnf(b, plain, p, inference(r, [status(thm)], [a])).
        cnf(c, plain, p, inference(r, [status(thm)], [a])).
        cnf(d, axiom, p).
        """
    )
    assert set(plan.faults) == {"a", "b", "c"}
    assert "depends on itself: a -> b -> a" in plan.faults["a"].message
    assert "depends on a cycle" in plan.faults["c"].message
    # Steps caught on a cycle come after all the others.
    assert [step.name for step in plan.steps] == ["d", "a", "b", "c"]


def test_nested_inference_records_become_named_steps_before_their_user():
    # TPTP syntax BNF, <inference_parent>: a parent may itself be an
    # inference record (an unnamed intermediate step).
    plan = plan_of(
        """
        cnf(c1, axiom, p | q).
        cnf(c2, axiom, ~p).
        cnf(c3, axiom, ~q).
        cnf(c4, plain, $false,
            inference(r, [status(thm)], [inference(s, [status(thm)], [c1, c2]), c3])).
        """
    )
    names = [step.name for step in plan.steps]
    assert names == ["c1", "c2", "c3", "c4/1", "c4"]
    nested = plan.steps[3]
    assert nested.statement is None and nested.parents == ("c1", "c2")
    assert plan.steps[4].parents == ("c4/1", "c3")


def test_deeply_chained_derivation_plans_without_recursion():
    # 5,000 steps in a line: ordering must not recurse per step.
    lines = ["cnf(s0, axiom, p)."]
    lines += [f"cnf(s{i}, plain, p, inference(r, [status(thm)], [s{i - 1}]))." for i in range(1, 5000)]
    plan = plan_of("\n".join(reversed(lines)))
    assert [step.name for step in plan.steps][:3] == ["s0", "s1", "s2"]
    assert len(plan.steps) == 5000


def test_symbols_reach_a_step_through_its_nested_records():
    # c4 inherits `sk` through its nested record, so c4 introduces nothing;
    # only s1 introduces `sk`.
    from checker.freshness import build_symbol_table

    plan = plan_of(
        """
        fof(a1, axiom, ? [X] : p(X)).
        fof(s1, plain, p(sk), inference(skolemize, [status(esa)], [a1])).
        cnf(c2, axiom, ~ p(X) | q(X)).
        cnf(c3, axiom, ~ q(X) | r(X)).
        cnf(c4, plain, r(sk), inference(r, [status(thm)], [inference(s, [status(thm)], [s1, c2]), c3])).
        """
    )
    table = build_symbol_table(plan.steps, None)
    assert table.introducers[("sk", 0)] == ["s1"]
