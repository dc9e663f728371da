"""Counter-models, re-evaluated by a brute-force evaluator written here.

A step reported `refuted` carries its counter-model in the report's
details.  Each such model is read back from the report and evaluated
below, independently of assay's own evaluator; the search's counter-model
finder is also run on the same premises and conclusion and its answer
evaluated the same way.  The problems the mutant fixtures claim to refute
get the same treatment: a finite model of their axioms in which the
conjecture is false shows that a refutation of them must contain an
unsound step.
"""

import re
from dataclasses import dataclass, field
from itertools import product
from pathlib import Path

import pytest

from checker.kernel.clauses import Clause
from checker.kernel.formulas import formula_of_clause, negation, universal_closure
from checker.outcomes import REFUTED
from checker.run import check
from checker.search.models import find_countermodel
from formats.derivation import Inference
from formats.tptp import parse_formula, read_tptp

FIXTURES = Path(__file__).resolve().parents[2] / "fixtures" / "tptp"
CLAUSIFICATION = FIXTURES / "clausification"


@dataclass
class Model:
    """A finite structure as plain tables (the shape the finder returns)."""

    size: int
    functions: dict = field(default_factory=dict)
    predicates: dict = field(default_factory=dict)


def value_of(model, term, env):
    if term.is_variable:
        return env[term]
    arguments = tuple(value_of(model, a, env) for a in term.arguments)
    return model.functions[(term.symbol, term.arity)][arguments]


def true_in(model, formula, env=None):
    """Tarski's truth definition, by brute force over the domain."""
    env = env or {}
    connective, parts = formula.connective, formula.arguments
    if connective == "atom":
        atom = formula.atom
        arguments = tuple(value_of(model, a, env) for a in atom.arguments)
        if atom.symbol == "=" and atom.arity == 2:
            return arguments[0] == arguments[1]
        return arguments in model.predicates[(atom.symbol, atom.arity)]
    if connective in ("!", "?"):
        rows = (
            true_in(model, parts[0], {**env, **dict(zip(formula.variables, values))})
            for values in product(range(model.size), repeat=len(formula.variables))
        )
        return all(rows) if connective == "!" else any(rows)
    values = [true_in(model, part, env) for part in parts]
    return {
        "$true": lambda: True,
        "$false": lambda: False,
        "~": lambda a: not a,
        "&": lambda a, b: a and b,
        "|": lambda a, b: a or b,
        "=>": lambda a, b: not a or b,
        "<=>": lambda a, b: a == b,
        "<~>": lambda a, b: a != b,
        "~|": lambda a, b: not (a or b),
        "~&": lambda a, b: not (a and b),
    }[connective](*values)


def closed(content):
    return formula_of_clause(content) if isinstance(content, Clause) else universal_closure(content)


def assert_countermodel(model, premises, conclusion):
    assert model.size >= 1
    for premise in premises:
        assert true_in(model, premise), f"premise false: {premise}"
    assert not true_in(model, conclusion), f"conclusion true: {conclusion}"


def signature(formulas):
    """Predicate and function symbols (name, arity) of some formulas."""
    predicates, functions = set(), set()
    stack = list(formulas)
    while stack:
        formula = stack.pop()
        stack.extend(formula.arguments)
        if formula.connective == "atom":
            if formula.atom.symbol != "=":
                predicates.add((formula.atom.symbol, formula.atom.arity))
            terms = list(formula.atom.arguments)
            while terms:
                term = terms.pop()
                if not term.is_variable:
                    functions.add((term.symbol, term.arity))
                    terms.extend(term.arguments)
    return predicates, functions


def entries(text):
    """`{0, (1,0)}` or `{0 -> 1, (0,1) -> 0}` as a list of (tuple, value or None)."""
    found = []
    for match in re.finditer(r"(?:\(([\d,]+)\)|(\d+))(?:\s*->\s*(\d+))?", text.strip()[1:-1]):
        arguments = tuple(int(n) for n in (match.group(1) or match.group(2)).split(","))
        found.append((arguments, None if match.group(3) is None else int(match.group(3))))
    return found


def model_from_report(details, formulas):
    """The model a report shows, read back from its lines."""
    predicates, functions = signature(formulas)
    arity = {name: a for name, a in predicates | functions}
    size = len(entries(details[0].split(" = ", 1)[1]))
    model = Model(size)
    for line in details[1:]:
        if line.startswith("falsified:"):
            continue
        name, shown = line.split(" = ", 1)
        symbol = (name, arity[name])
        if symbol in predicates:
            if shown in ("true", "false"):
                model.predicates[symbol] = frozenset({()} if shown == "true" else ())
            else:
                model.predicates[symbol] = frozenset(arguments for arguments, _ in entries(shown))
        elif symbol[1] == 0:
            model.functions[symbol] = {(): int(shown)}
        else:
            model.functions[symbol] = {arguments: result for arguments, result in entries(shown)}
    return model


# Skolem axioms written out by hand for the Skolemization steps that are
# refuted: (? [Y] : G) => G{Y := witness} (common practice).
SKOLEM_AXIOMS = {("skolemization_strengthened", "s1"): "(? [B] : damaged(B)) => damaged(sk1)"}


def step_premises(path, name):
    """The premises and conclusion a refuted step was checked against:
    for a negated conjecture, the negation of the conjecture; otherwise the
    parents, plus the Skolem axiom for a Skolemization step."""
    statements = {s.name: s for s in read_tptp(str(path)).statements}
    step = statements[name]
    assert isinstance(step.source, Inference)
    parents = [statements[p.name] for p in step.source.parents]
    if [p.role for p in parents] == ["conjecture"]:
        premises = [negation(closed(parents[0].content))]
    else:
        premises = [closed(p.content) for p in parents]
        axiom = SKOLEM_AXIOMS.get((path.stem, name))
        if step.source.status == "esa":
            assert axiom is not None, "write the Skolem axiom for this step"
            premises.append(parse_formula(axiom))
    return premises, closed(step.content)


DERIVATIONS = sorted(p for p in CLAUSIFICATION.glob("*.p") if not p.name.endswith("_problem.p"))


@pytest.fixture(scope="module")
def refuted_steps():
    found = []
    for path in DERIVATIONS:
        for step in check(str(path)).steps:
            if step.outcome == REFUTED:
                found.append((path, step))
    return found


def test_refuted_steps_are_the_ones_expected(refuted_steps):
    assert {(path.stem, step.name) for path, step in refuted_steps} >= {
        ("negated_conjecture_negation_dropped", "n1"),
        ("negated_conjecture_changed", "n1"),
        ("negated_conjecture_other_conjecture", "n1"),
        ("clause_form_sign_flipped", "c1"),
        ("skolemization_strengthened", "s1"),
    }


def test_every_reported_model_is_a_countermodel(refuted_steps):
    for path, step in refuted_steps:
        premises, conclusion = step_premises(path, step.name)
        assert step.details[0] == "reason: countermodel"
        start = next(i for i, line in enumerate(step.details) if line.startswith("domain = {"))
        end = next(i for i, line in enumerate(step.details) if line.startswith("falsified: "))
        lines = step.details[start : end + 1]
        model = model_from_report(lines, [*premises, conclusion])
        assert_countermodel(model, premises, conclusion)


def test_finder_models_for_refuted_steps_are_countermodels(refuted_steps):
    for path, step in refuted_steps:
        premises, conclusion = step_premises(path, step.name)
        model = find_countermodel(premises, conclusion)
        assert model is not None, (path.stem, step.name)
        assert_countermodel(model, premises, conclusion)


# The problems the mutants claim to refute, with the conjecture meant.
# None of these conjectures follows (each scenario is invented so that it
# does not); a finite counter-model shows it.
COUNTER_SATISFIABLE = [
    ("vault_keys_problem.p", "guard_is_staff"),
    ("shift_cover_problem.p", "sunday_is_weekday"),
    ("crate_inspection_problem.p", "every_crate_inspected"),
    ("site_visitors_problem.p", "guest_is_cleared"),
    ("parcel_tracking_problem.p", "vase_untracked"),
    ("parcel_insurance_problem.p", "lamp_insured"),
    ("parcel_two_conjectures_problem.p", "tracked_are_fragile"),
]


def axioms_and_conjecture(path, conjecture):
    statements = read_tptp(str(path)).statements
    axioms = [closed(s.content) for s in statements if s.role != "conjecture"]
    (goal,) = [closed(s.content) for s in statements if s.name == conjecture]
    return axioms, goal


@pytest.mark.parametrize(("problem", "conjecture"), COUNTER_SATISFIABLE)
def test_problem_of_a_mutant_has_a_countermodel(problem, conjecture):
    axioms, goal = axioms_and_conjecture(CLAUSIFICATION / problem, conjecture)
    model = find_countermodel(axioms, goal)
    assert model is not None
    assert_countermodel(model, axioms, goal)


# Pelletier (1986), problems 18, 19, 21, 30, 32, 35, 39 and 40, from memory:
# theorems, so no interpretation of any size falsifies them.
@pytest.mark.parametrize("number", (18, 19, 21, 30, 32, 35, 39, 40))
def test_pelletier_theorems_have_no_small_countermodel(number):
    path = FIXTURES / "pelletier" / f"p{number}_problem.p"
    (conjecture,) = [s.name for s in read_tptp(str(path)).statements if s.role == "conjecture"]
    axioms, goal = axioms_and_conjecture(path, conjecture)
    assert find_countermodel(axioms, goal, max_domain=3) is None


def every_structure(size, predicates):
    """All interpretations of some predicate symbols over ``size`` elements."""
    cells = [(symbol, row) for symbol in sorted(predicates) for row in product(range(size), repeat=symbol[1])]
    for truth in product((False, True), repeat=len(cells)):
        tables = {symbol: set() for symbol in predicates}
        for (symbol, row), holds in zip(cells, truth):
            if holds:
                tables[symbol].add(row)
        yield Model(size, predicates={s: frozenset(rows) for s, rows in tables.items()})


# Pelletier (1986), the same problems from memory: checked here in every
# structure of one and two elements by the evaluator above, so that a slip
# in writing a problem down from memory would show.
@pytest.mark.parametrize("number", (18, 19, 21, 30, 32, 35, 39, 40))
def test_pelletier_theorems_hold_in_every_small_structure(number):
    path = FIXTURES / "pelletier" / f"p{number}_problem.p"
    (conjecture,) = [s.name for s in read_tptp(str(path)).statements if s.role == "conjecture"]
    axioms, goal = axioms_and_conjecture(path, conjecture)
    predicates, functions = signature([*axioms, goal])
    assert functions == set()
    for size in (1, 2):
        for model in every_structure(size, predicates):
            assert not all(true_in(model, axiom) for axiom in axioms) or true_in(model, goal)


def test_the_evaluator_itself_tells_true_from_false():
    # Common practice: in a two-element structure where p holds of 0 only,
    # ? [X] : p(X) is true, ! [X] : p(X) false, and X = X true.
    model = Model(2, predicates={("p", 1): frozenset({(0,)})})
    assert true_in(model, parse_formula("? [X] : p(X)"))
    assert not true_in(model, parse_formula("! [X] : p(X)"))
    assert true_in(model, parse_formula("! [X] : X = X"))
    assert not true_in(model, parse_formula("! [X, Y] : X = Y"))
    assert true_in(model, parse_formula("! [X] : (p(X) <~> ~ p(X))"))
