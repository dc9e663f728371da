"""Hypothesis strategies over a small signature, and a finite-model evaluator
written for the tests, independent of the kernel's own model evaluation.

Signature: constants a, b; unary f; binary g; predicates p/1, q/2, r/0;
equality; variables X, Y, Z.  An interpretation has a domain of 1 to 3
elements, random function tables and predicate extensions, and equality
as identity.  The ``fitted_*`` helpers build premises around a chosen
substitution so that a good share of random evidence actually fits.
"""

from __future__ import annotations

import itertools
import random
from dataclasses import dataclass

from hypothesis import assume
from hypothesis import strategies as st

from checker.kernel.clauses import Clause, Literal
from checker.kernel.rules import (
    EqualityFactoring,
    EqualityResolution,
    Instantiation,
    Paramodulation,
    Resolution,
)
from checker.kernel.substitution import Substitution
from checker.kernel.terms import Term, application, variable

X, Y, Z = variable("X"), variable("Y"), variable("Z")
VARIABLES = (X, Y, Z)
a, b = application("a"), application("b")


def f(t: Term) -> Term:
    return application("f", (t,))


def g(s: Term, t: Term) -> Term:
    return application("g", (s, t))


def p(t: Term) -> Term:
    return application("p", (t,))


def q(s: Term, t: Term) -> Term:
    return application("q", (s, t))


r = application("r")


def eq(s: Term, t: Term) -> Term:
    return application("=", (s, t))


def pos(atom: Term) -> Literal:
    return Literal(True, atom)


def neg(atom: Term) -> Literal:
    return Literal(False, atom)


# --- terms, literals, clauses, substitutions ---------------------------------

terms = st.recursive(
    st.sampled_from((X, Y, Z, a, b)),
    lambda inner: st.one_of(st.builds(f, inner), st.builds(g, inner, inner)),
    max_leaves=4,
)
ground_terms = st.recursive(
    st.sampled_from((a, b)),
    lambda inner: st.one_of(st.builds(f, inner), st.builds(g, inner, inner)),
    max_leaves=3,
)


def atoms_over(term_strategy, with_equality: bool = True):
    choices = [st.builds(p, term_strategy), st.builds(q, term_strategy, term_strategy), st.just(r)]
    if with_equality:
        choices.append(st.builds(eq, term_strategy, term_strategy))
    return st.one_of(*choices)


atoms = atoms_over(terms)
literals = st.builds(Literal, st.booleans(), atoms)


def clauses(min_size: int = 0, max_size: int = 3, literal_strategy=literals):
    return st.lists(literal_strategy, min_size=min_size, max_size=max_size).map(Clause)


substitutions = st.dictionaries(st.sampled_from(VARIABLES), terms, max_size=3).map(Substitution)
renamings = st.permutations(VARIABLES).map(lambda image: Substitution(dict(zip(VARIABLES, image))))


# --- finite interpretations and the evaluator --------------------------------


@dataclass(frozen=True)
class Interpretation:
    """A finite interpretation of the small signature over range(size)."""

    size: int
    constants: dict[str, int]
    f_table: tuple[int, ...]
    g_table: dict[tuple[int, int], int]
    p_true: frozenset[int]
    q_true: frozenset[tuple[int, int]]
    r_true: bool


def random_interpretation(rng: random.Random) -> Interpretation:
    """An interpretation with domain size 1-3 and uniformly random tables."""
    size = rng.randint(1, 3)
    elements = range(size)
    pairs = list(itertools.product(elements, repeat=2))
    return Interpretation(
        size=size,
        constants={"a": rng.randrange(size), "b": rng.randrange(size)},
        f_table=tuple(rng.randrange(size) for _ in elements),
        g_table={pair: rng.randrange(size) for pair in pairs},
        p_true=frozenset(e for e in elements if rng.random() < 0.5),
        q_true=frozenset(pair for pair in pairs if rng.random() < 0.5),
        r_true=rng.random() < 0.5,
    )


def interpretation_samples(count: int):
    """``count`` interpretations from one seed: uniform where Hypothesis's
    own choices would favour the smallest tables.  Lazy, so that a search
    for models of some premises stops as soon as it has enough."""
    return st.integers(0, 2**32 - 1).map(
        lambda seed: (random_interpretation(rng) for rng in [random.Random(seed)] for _ in range(count))
    )


def value(term: Term, model: Interpretation, assignment: dict[Term, int]) -> int:
    if term.is_variable:
        return assignment[term]
    if term.symbol == "f":
        return model.f_table[value(term.arguments[0], model, assignment)]
    if term.symbol == "g":
        return model.g_table[tuple(value(t, model, assignment) for t in term.arguments)]
    return model.constants[term.symbol]


def literal_holds(literal: Literal, model: Interpretation, assignment: dict[Term, int]) -> bool:
    atom = literal.atom
    arguments = tuple(value(t, model, assignment) for t in atom.arguments)
    if atom.symbol == "=":
        truth = arguments[0] == arguments[1]
    elif atom.symbol == "p":
        truth = arguments[0] in model.p_true
    elif atom.symbol == "q":
        truth = arguments in model.q_true
    else:
        assert atom.symbol == "r"
        truth = model.r_true
    return truth == literal.positive


def variables_in(clause: Clause) -> list[Term]:
    found: dict[Term, None] = {}
    stack = [literal.atom for literal in clause.literals]
    while stack:
        term = stack.pop()
        if term.is_variable:
            found[term] = None
        else:
            stack.extend(term.arguments)
    return list(found)


def clause_holds(clause: Clause, model: Interpretation) -> bool:
    """The universal closure of ``clause`` is true in ``model``."""
    names = variables_in(clause)
    for values in itertools.product(range(model.size), repeat=len(names)):
        assignment = dict(zip(names, values))
        if not any(literal_holds(lit, model, assignment) for lit in clause.literals):
            return False
    return True


def consequence_holds(premises, claimed: Clause, models, wanted: int = 6) -> tuple[bool, int]:
    """Whether ``claimed`` is true in every model of the premises among
    ``models`` (looking at the first ``wanted`` such models), and how many
    models of the premises were looked at."""
    relevant = 0
    for model in models:
        if all(clause_holds(premise, model) for premise in premises):
            relevant += 1
            if not clause_holds(claimed, model):
                return False, relevant
            if relevant == wanted:
                break
    return True, relevant


# --- building premises around a chosen substitution --------------------------


def mostly(draw) -> bool:
    """True about five times in six (Hypothesis favours small integers, so
    the rarer choice is the largest value, not the smallest)."""
    return draw(st.integers(0, 5)) != 5


def generalize(draw, term: Term, bindings: dict[Term, Term]) -> Term:
    """A term whose instance under ``bindings`` (extended here) is ``term``."""
    usable = [v for v in VARIABLES if bindings.get(v, term) is term]
    if term.is_variable or (usable and draw(st.booleans())):
        assume(usable)
        chosen = draw(st.sampled_from(usable))
        bindings[chosen] = term
        return chosen
    return application(term.symbol, tuple(generalize(draw, argument, bindings) for argument in term.arguments))


def generalize_atom(draw, atom: Term, bindings: dict[Term, Term]) -> Term:
    """Like :func:`generalize`, keeping the predicate (an atom is never a variable)."""
    return application(atom.symbol, tuple(generalize(draw, argument, bindings) for argument in atom.arguments))


def matcher(general: Term, instance: Term) -> dict[Term, Term]:
    """The bindings that make ``general`` into ``instance`` (which must be
    an instance of it): the two are walked side by side."""
    bindings: dict[Term, Term] = {}
    stack = [(general, instance)]
    while stack:
        pattern, term = stack.pop()
        if pattern.is_variable:
            assert bindings.setdefault(pattern, term) is term
        else:
            assert (pattern.symbol, pattern.arity) == (term.symbol, term.arity)
            stack.extend(zip(pattern.arguments, term.arguments))
    return bindings


def written_either_way(draw, atom: Term) -> Term:
    """An equation in either orientation (the kernel must not care)."""
    if atom.symbol == "=" and draw(st.booleans()):
        return eq(atom.arguments[1], atom.arguments[0])
    return atom


def substitution_with(draw, bindings: dict[Term, Term]) -> Substitution:
    """``bindings`` plus random bindings of the variables it leaves free."""
    extra = draw(substitutions).mapping
    return Substitution({**extra, **bindings})


def insert_at(draw, clause: Clause, literal: Literal) -> tuple[Clause, int]:
    index = draw(st.integers(0, len(clause.literals)))
    written = list(clause.literals)
    written.insert(index, literal)
    return Clause(written), index


def term_positions(term: Term) -> list[tuple[int, ...]]:
    found = []
    stack = [((), term)]
    while stack:
        position, current = stack.pop()
        found.append(position)
        stack.extend((position + (i + 1,), argument) for i, argument in enumerate(current.arguments))
    return found


def fitted_resolution(draw, clause: Clause, index: int, partner_index: int):
    """A partner clause and evidence resolving some literal of ``clause``
    (premise ``index``) against it; fitted most of the time, random else."""
    literal_index = draw(st.integers(0, len(clause.literals) - 1))
    own = draw(substitutions)
    literal = clause.literals[literal_index]
    if mostly(draw):
        bindings: dict[Term, Term] = {}
        partner_atom = written_either_way(draw, generalize_atom(draw, own(literal.atom), bindings))
        partner_literal = Literal(not literal.positive, partner_atom)
        partner_substitution = substitution_with(draw, bindings)
    else:
        partner_literal = draw(literals)
        partner_substitution = draw(substitutions)
    partner, partner_literal_index = insert_at(draw, draw(clauses(max_size=2)), partner_literal)
    if draw(st.booleans()):
        evidence = Resolution(index, literal_index, partner_index, partner_literal_index, own, partner_substitution)
    else:
        evidence = Resolution(partner_index, partner_literal_index, index, literal_index, partner_substitution, own)
    return partner, evidence


def fitted_paramodulation(draw, clause: Clause, index: int, partner_index: int):
    """An equation clause and evidence rewriting a subterm of some literal of
    ``clause`` (premise ``index``); fitted most of the time, random else."""
    with_arguments = [i for i, literal in enumerate(clause.literals) if literal.atom.arguments]
    if with_arguments and mostly(draw):
        literal_index = draw(st.sampled_from(with_arguments))
    else:
        literal_index = draw(st.integers(0, len(clause.literals) - 1))
    target_substitution = draw(substitutions)
    instance = target_substitution(clause.literals[literal_index].atom)
    positions = [position for position in term_positions(instance) if position]
    left_to_right = draw(st.booleans())
    if positions and mostly(draw):
        position = draw(st.sampled_from(positions))
        subterm = instance
        for i in position:
            subterm = subterm.arguments[i - 1]
        bindings: dict[Term, Term] = {}
        found = generalize(draw, subterm, bindings)
        other = draw(terms)
        equation = eq(found, other) if left_to_right else eq(other, found)
        equation_substitution = substitution_with(draw, bindings)
    else:
        position = tuple(draw(st.lists(st.integers(0, 3), max_size=3)))
        equation = draw(st.builds(eq, terms, terms)) if mostly(draw) else draw(atoms)
        equation_substitution = draw(substitutions)
    equation_clause, equation_index = insert_at(draw, draw(clauses(max_size=2)), Literal(mostly(draw), equation))
    evidence = Paramodulation(
        partner_index,
        equation_index,
        left_to_right,
        index,
        literal_index,
        position,
        equation_substitution,
        target_substitution,
    )
    return equation_clause, evidence


@st.composite
def resolution_steps(draw):
    """Two premises (in either order, sometimes with a third) and resolution evidence."""
    first = draw(clauses(min_size=1))
    partner, evidence = fitted_resolution(draw, first, 0, 1)
    premises = [first, partner]
    if draw(st.booleans()):
        premises.append(draw(clauses()))
    return premises, evidence


@st.composite
def paramodulation_steps(draw):
    target = draw(clauses(min_size=1))
    equation_clause, evidence = fitted_paramodulation(draw, target, 0, 1)
    return [target, equation_clause], evidence


@st.composite
def equality_resolution_steps(draw):
    """A premise with a disequality whose sides a chosen substitution makes equal."""
    bindings: dict[Term, Term] = {}
    common = draw(terms)
    if mostly(draw):
        sides = generalize(draw, common, bindings), generalize(draw, common, bindings)
        literal = neg(eq(*sides))
    else:
        literal = draw(literals)
    premise, index = insert_at(draw, draw(clauses(max_size=2)), literal)
    return [premise], EqualityResolution(0, index, substitution_with(draw, bindings))


@st.composite
def equality_factoring_steps(draw):
    """A premise with two equations whose chosen sides a substitution makes equal."""
    bindings: dict[Term, Term] = {}
    common = draw(terms)
    first_reversed, other_reversed = draw(st.booleans()), draw(st.booleans())
    if mostly(draw):
        s, s2 = generalize(draw, common, bindings), generalize(draw, common, bindings)
        t, t2 = draw(terms), draw(terms)
        first = pos(eq(t, s) if first_reversed else eq(s, t))
        other = pos(eq(t2, s2) if other_reversed else eq(s2, t2))
    else:
        first, other = draw(literals), draw(literals)
    rest = list(draw(clauses(max_size=2)).literals)
    written = [first, other, *rest]
    order = draw(st.permutations(range(len(written))))
    premise = Clause(written[i] for i in order)
    evidence = EqualityFactoring(
        0, order.index(0), order.index(1), first_reversed, other_reversed, substitution_with(draw, bindings)
    )
    return [premise], evidence


@st.composite
def instantiation_steps(draw):
    return [draw(clauses())], Instantiation(0, draw(substitutions))


def claimed_from(draw, computed: Clause | None) -> tuple[Clause, Substitution]:
    """A claimed clause and theta: the computed clause renamed, instantiated,
    permuted and weakened (which the conclusion test must accept), or at
    random (which it may or may not)."""
    if computed is None or not mostly(draw):
        return draw(clauses()), draw(substitutions)
    theta = draw(st.one_of(renamings, substitutions))
    written = list(computed.instance(theta).literals)
    if draw(st.booleans()):
        written += draw(clauses(max_size=2)).literals
    order = draw(st.permutations(range(len(written))))
    return Clause(written[i] for i in order), theta
