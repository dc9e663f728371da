"""The trusted clausifier, checked against SymPy, python-sat, a textbook, and
finite models.

Hand-written first-order cases use an invented rail-signalling scenario:
``clear(B)`` for a block, ``next(B, C)`` for adjacency, ``green(S)`` for a
signal, ``guard(B)`` for the signal protecting a block.
"""

from __future__ import annotations

import itertools

import sympy
from hypothesis import given, settings
from hypothesis import strategies as st
from pysat.solvers import Solver
from sympy.logic.boolalg import And, Equivalent, Implies, Nand, Nor, Not, Or, Xor, to_cnf
from sympy.logic.inference import satisfiable

from checker.kernel.clausify import DISTRIBUTION_LIMIT, Clausification, FreshSymbol, clausify
from checker.kernel.clauses import Clause, Literal
from checker.kernel.formulas import (
    AND,
    ATOM,
    EXISTS,
    FALSUM,
    FORALL,
    IFF,
    IMPLIES,
    NAND,
    NOR,
    OR,
    VERUM,
    XOR,
    Formula,
    atomic,
    binary,
    negation,
    quantified,
    symbols_of_formula,
)
from checker.kernel.terms import Term, application, variable

X, Y, Z, U, V, W = (variable(n) for n in "XYZUVW")


def forall(variables, body):
    return quantified(FORALL, tuple(variables), body)


def exists(variables, body):
    return quantified(EXISTS, tuple(variables), body)


def atom(name, *arguments):
    return atomic(application(name, tuple(arguments)))


def positive(name, *arguments):
    return Literal(True, application(name, tuple(arguments)))


def negative(name, *arguments):
    return Literal(False, application(name, tuple(arguments)))


# --- propositional: against SymPy and python-sat -----------------------------

NAMES = ("p", "q", "r", "s")
propositions = st.sampled_from([atom(n) for n in NAMES] + [VERUM, FALSUM])
CONNECTIVES = (AND, OR, IMPLIES, IFF, XOR, NOR, NAND)


def _extend(children):
    return st.one_of(
        st.builds(negation, children),
        st.builds(binary, st.sampled_from(CONNECTIVES), children, children),
    )


small_formulas = st.recursive(propositions, _extend, max_leaves=7)
large_formulas = st.recursive(propositions, _extend, max_leaves=24)

SYMPY_ATOMS = {n: sympy.Symbol(n) for n in NAMES}
SYMPY_CONNECTIVES = {AND: And, OR: Or, IMPLIES: Implies, IFF: Equivalent, XOR: Xor, NOR: Nor, NAND: Nand}


def to_sympy(formula: Formula):
    """The formula as a SymPy Boolean expression (recursive; test formulas are small)."""
    c = formula.connective
    if c == ATOM:
        return SYMPY_ATOMS[formula.atom.symbol]
    if c == "$true":
        return sympy.true
    if c == "$false":
        return sympy.false
    if c == "~":
        return Not(to_sympy(formula.arguments[0]))
    return SYMPY_CONNECTIVES[c](*(to_sympy(a) for a in formula.arguments))


def clauses_to_sympy(clauses):
    def literal(lit):
        symbol = SYMPY_ATOMS[lit.atom.symbol]
        return symbol if lit.positive else Not(symbol)

    return And(*(Or(*(literal(lit) for lit in clause.literals)) for clause in clauses))


@settings(max_examples=200, deadline=None)
@given(small_formulas)
def test_clauses_without_naming_are_equivalent_to_the_formula(formula):
    # SymPy (sympy.logic.boolalg, satisfiable): the CNF is logically
    # equivalent to the formula, i.e. their non-equivalence is unsatisfiable.
    result = clausify([formula], naming=False)
    assert result.fresh_symbols == ()
    ours = clauses_to_sympy(result.clauses)
    assert satisfiable(Not(Equivalent(ours, to_sympy(formula)))) is False
    # SymPy's own CNF of the formula: the same Boolean function.
    assert satisfiable(Not(Equivalent(ours, to_cnf(to_sympy(formula), simplify=False)))) is False


def assert_conservative(formula: Formula, clausification: Clausification) -> None:
    """For every assignment to the formula's own atoms: the formula is true
    (SymPy) exactly when the clauses are satisfiable under that assignment
    (python-sat with assumptions).  That is equisatisfiability, and more:
    the definitions add nothing about the original atoms."""
    numbers: dict[str, int] = {}
    for name in NAMES:
        numbers[name] = len(numbers) + 1
    encoded = []
    for clause in clausification.clauses:
        for lit in clause.literals:
            numbers.setdefault(lit.atom.symbol, len(numbers) + 1)
        encoded.append([numbers[lit.atom.symbol] if lit.positive else -numbers[lit.atom.symbol] for lit in clause.literals])
    expression = to_sympy(formula)
    with Solver(name="minisat22", bootstrap_with=encoded) as solver:
        for values in itertools.product((False, True), repeat=len(NAMES)):
            expected = bool(expression.subs(dict(zip((SYMPY_ATOMS[n] for n in NAMES), values))))
            assumptions = [numbers[n] if v else -numbers[n] for n, v in zip(NAMES, values)]
            assert solver.solve(assumptions=assumptions) == expected


@settings(max_examples=150, deadline=None)
@given(large_formulas)
def test_clauses_with_naming_are_a_conservative_extension(formula):
    result = clausify([formula])
    assert all(symbol.kind == "definition" for symbol in result.fresh_symbols)
    assert_conservative(formula, result)


def disjunction_of_conjunctions(count: int) -> Formula:
    formula = binary(AND, atom("p"), atom("q"))
    for index in range(1, count):
        formula = binary(OR, formula, binary(AND, atom(f"p{index}"), atom(f"q{index}")))
    return formula


def equivalence_chain(count: int) -> Formula:
    formula = atom("p0")
    for index in range(1, count):
        formula = binary(IFF, atom(f"p{index}"), binary(XOR, formula, atom("q")) if index % 3 == 0 else formula)
    return formula


def test_naming_keeps_multiplied_out_disjunctions_linear():
    for count in (4, 8, 16):
        without = clausify([disjunction_of_conjunctions(count)], naming=False)
        named = clausify([disjunction_of_conjunctions(count)])
        assert len(without.clauses) == 2**count
        assert len(named.clauses) <= 4 * count
        assert named.fresh_symbols
    assert DISTRIBUTION_LIMIT == 8


def test_naming_keeps_nested_equivalences_linear():
    sizes = [len(clausify([equivalence_chain(n)]).clauses) for n in (5, 10, 20, 40)]
    assert all(size <= 6 * n for size, n in zip(sizes, (5, 10, 20, 40)))
    assert len(clausify([equivalence_chain(10)], naming=False).clauses) >= 2**8


def test_named_clause_sets_of_large_formulas_stay_conservative():
    # The conservative-extension check on formulas that do trigger both
    # kinds of naming, over the atoms p, q, r, s.
    p, q, r, s = (atom(n) for n in NAMES)
    wide = binary(OR, binary(OR, binary(AND, p, q), binary(AND, r, s)), binary(OR, binary(AND, q, r), binary(AND, s, p)))
    nested = binary(IFF, binary(IFF, p, binary(NAND, q, r)), binary(XOR, binary(NOR, s, p), negation(binary(IFF, q, s))))
    for formula in (wide, nested, binary(AND, wide, nested), negation(binary(OR, nested, wide))):
        result = clausify([formula])
        assert result.fresh_symbols
        assert_conservative(formula, result)



def test_a_first_disjunct_too_large_to_multiply_out_is_named_alone():
    # Plaisted and Greenbaum's naming (from memory): a disjunct with more
    # clauses than the limit becomes one fresh atom, here while nothing has
    # been multiplied yet, so only the disjunct is named; checked against
    # SymPy and python-sat by assert_conservative.
    p, q, r, s = (atom(n) for n in NAMES)
    parts = [p, q, r, s, binary(OR, p, q), binary(OR, q, r), binary(OR, r, s), binary(OR, s, p), binary(OR, p, r)]
    assert len(parts) == DISTRIBUTION_LIMIT + 1
    large = parts[0]
    for part in parts[1:]:
        large = binary(AND, large, part)
    formula = binary(OR, large, negation(q))
    result = clausify([formula])
    # The fresh atom is a nullary predicate named like every definition.
    assert result.fresh_symbols == (FreshSymbol("definition_1", 0, "definition", 0),)
    assert len(result.clauses) == len(parts) + 1
    assert_conservative(formula, result)

def test_a_named_disjunct_keeps_its_variables():
    # Plaisted and Greenbaum's naming (from memory): the fresh atom takes the
    # named part's free variables, d(X), with one clause ~d(X) | C per clause
    # C of the part.  A nullary d would claim (! [X] : A) | (! [X] : B), which
    # is stronger than ! [X] : (A | B).  Rail scenario: a block is either
    # checked on nine counts or under guard.
    checks = [atom(f"check_{n}", X) for n in range(DISTRIBUTION_LIMIT + 1)]
    large = checks[0]
    for check in checks[1:]:
        large = binary(AND, large, check)
    result = clausify([forall([X], binary(OR, large, atom("guard", X)))])
    assert result.fresh_symbols == (FreshSymbol("definition_1", 1, "definition", 0),)
    assert result.clauses == (
        Clause([positive("definition_1", X), positive("guard", X)]),
        *(Clause([negative("definition_1", X), positive(f"check_{n}", X)]) for n in range(DISTRIBUTION_LIMIT + 1)),
    )


def test_a_product_of_exactly_the_limit_is_multiplied_out():
    # The module's step 4 names disjuncts only when multiplying would give
    # *more* than DISTRIBUTION_LIMIT clauses; (a1 & a2) | (a3 & a4) | (a5 & a6)
    # gives 2 * 2 * 2 = 8, so it is multiplied out with no fresh atom.
    assert DISTRIBUTION_LIMIT == 8
    p, q, r, s = (atom(n) for n in NAMES)
    pairs = [binary(AND, p, q), binary(AND, r, s), binary(AND, negation(p), negation(r))]
    formula = binary(OR, binary(OR, pairs[0], pairs[1]), pairs[2])
    result = clausify([formula])
    assert result.fresh_symbols == ()
    assert_conservative(formula, result)


def test_both_disjuncts_with_several_clauses_are_named():
    # Plaisted and Greenbaum's naming (from memory), as the module's step 4
    # states it: when multiplying would exceed the limit, *each* disjunct with
    # several clauses is named, here the two clauses already multiplied out as
    # well as the nine-clause part, so the disjunction is one clause d1 | d2.
    p, q, r, s = (atom(n) for n in NAMES)
    parts = [p, q, r, s, binary(OR, p, q), binary(OR, q, r), binary(OR, r, s), binary(OR, s, p), binary(OR, p, r)]
    large = parts[0]
    for part in parts[1:]:
        large = binary(AND, large, part)
    two = binary(AND, negation(p), negation(s))
    formula = binary(OR, two, large)
    result = clausify([formula])
    assert result.fresh_symbols == (
        FreshSymbol("definition_1", 0, "definition", 0),
        FreshSymbol("definition_2", 0, "definition", 0),
    )
    assert Clause([positive("definition_1"), positive("definition_2")]) in result.clauses
    assert len(result.clauses) == 1 + 2 + len(parts)
    assert_conservative(formula, result)


# --- deep input ---------------------------------------------------------------


def test_long_chains_are_clausified_without_recursion():
    conjunction = atom("clear", application("block_0"))
    disjunction = conjunction
    for index in range(1, 20_000):
        conjunction = binary(AND, atom("clear", application(f"block_{index}")), conjunction)
    for index in range(1, 3_000):
        disjunction = binary(OR, disjunction, atom("clear", application(f"block_{index}")))
    assert len(clausify([conjunction]).clauses) == 20_000
    (clause,) = clausify([disjunction]).clauses
    assert len(clause) == 3_000
    negations = atom("green", application("signal_a"))
    for _ in range(5_001):
        negations = negation(negations)
    assert clausify([negations]).clauses == (Clause([negative("green", application("signal_a"))]),)


# --- first-order: textbook, Skolem arity, freshness --------------------------


def test_skolemization_example_of_chang_and_lee():
    # Chang and Lee, "Symbolic Logic and Mechanical Theorem Proving" (1973),
    # section 4.2, from memory: (Ex)(Ay)(Az)(Eu)(Av)(Ew) P(x,y,z,u,v,w) has the
    # standard form (Ay)(Az)(Av) P(a, y, z, f(y,z), v, g(y,z,v)).
    formula = exists([X], forall([Y, Z], exists([U], forall([V], exists([W], atom("P", X, Y, Z, U, V, W))))))
    result = clausify([formula])
    (clause,) = result.clauses
    (literal,) = clause.literals
    a, y, z, f, v, g = literal.atom.arguments
    assert literal.positive and literal.atom.symbol == "P"
    assert (y, z, v) == (Y, Z, V)
    assert a.arity == 0 and f.arguments == (Y, Z) and g.arguments == (Y, Z, V)
    assert [(s.name, s.arity, s.kind) for s in result.fresh_symbols] == [
        (a.symbol, 0, "skolem"),
        (f.symbol, 2, "skolem"),
        (g.symbol, 3, "skolem"),
    ]


def test_clause_form_example_of_chang_and_lee():
    # Chang and Lee (1973), section 4.2, from memory: (Ax)(Ey)(Ez)((~P(x,y) &
    # Q(x,z)) | R(x,y,z)) gives the clauses ~P(x,f(x)) | R(x,f(x),g(x)) and
    # Q(x,g(x)) | R(x,f(x),g(x)).
    formula = forall([X], exists([Y, Z], binary(OR, binary(AND, negation(atom("P", X, Y)), atom("Q", X, Z)), atom("R", X, Y, Z))))
    result = clausify([formula])
    f = application("skolem_1", (X,))
    g = application("skolem_2", (X,))
    assert result.clauses == (
        Clause([negative("P", X, f), positive("R", X, f, g)]),
        Clause([positive("Q", X, g), positive("R", X, f, g)]),
    )


def test_skolem_terms_take_only_the_universals_that_occur():
    # Every guarded block has a next block: the witness depends on B only.
    formula = forall([X, Y], binary(IMPLIES, atom("guard", X, Y), exists([Z], atom("next", X, Z))))
    result = clausify([formula])
    assert result.clauses == (Clause([negative("guard", X, Y), positive("next", X, application("skolem_1", (X,)))]),)
    # An inner witness that mentions an outer one depends on the outer
    # one's universals: skolem_2(X), not skolem_2(X, Z).
    nested = forall(
        [X], exists([Y], binary(AND, atom("next", X, Y), forall([Z], binary(AND, atom("clear", Z), exists([W], atom("next", Y, W))))))
    )
    first = application("skolem_1", (X,))
    assert clausify([nested]).clauses == (
        Clause([positive("next", X, first)]),
        Clause([positive("clear", Z)]),
        Clause([positive("next", first, application("skolem_2", (X,)))]),
    )
    # A witness whose subformula mentions no universal is a constant.
    constant = forall([X], binary(AND, atom("clear", X), exists([Y], atom("green", Y))))
    assert clausify([constant]).clauses[1] == Clause([positive("green", application("skolem_1"))])


def test_polarity_decides_which_quantifiers_are_skolemized():
    green = lambda t: atom("green", t)  # noqa: E731
    assert clausify([negation(exists([X], green(X)))]).clauses == (Clause([negative("green", X)]),)
    refuted = clausify([negation(forall([X], green(X)))])
    assert refuted.clauses == (Clause([negative("green", application("skolem_1"))]),)
    # An existential under an implication's left side is universal.
    implied = clausify([binary(IMPLIES, exists([X], green(X)), atom("clear", application("block_a")))])
    assert implied.fresh_symbols == ()
    assert implied.clauses == (Clause([negative("green", X), positive("clear", application("block_a"))]),)


def test_equivalence_under_quantifiers_is_skolemized_in_both_directions():
    # All blocks clear <=> some signal green: each side occurs both ways.
    formula = binary(IFF, forall([X], atom("clear", X)), exists([Y], atom("green", Y)))
    result = clausify([formula], naming=False)
    assert [s.arity for s in result.fresh_symbols] == [0, 0]
    first, second = (application(s.name) for s in result.fresh_symbols)
    assert set(result.clauses) == {
        Clause([negative("clear", first), positive("green", second)]),
        Clause([negative("green", Y), positive("clear", X)]),
    }


def test_universal_variables_are_renamed_apart():
    # (All X clear(X)) | (All X green(X)) is stronger than All X (clear(X) |
    # green(X)); the clause must keep two variables.
    formula = binary(OR, forall([X], atom("clear", X)), forall([X], atom("green", X)))
    (clause,) = clausify([formula]).clauses
    assert clause == Clause([positive("clear", X), positive("green", variable("X1"))])
    shadowed = forall([X], binary(OR, atom("clear", X), forall([X], atom("green", X))))
    assert clausify([shadowed]).clauses == (clause,)
    # A free variable is closed universally first.
    assert clausify([atom("clear", Y)]).clauses == (Clause([positive("clear", Y)]),)


def test_fresh_symbols_avoid_the_input_and_reserved_names():
    taken = forall([X], exists([Y], binary(IFF, atom("skolem_1", X), binary(AND, atom("definition_1", Y), atom("next", X, Y)))))
    result = clausify([taken], reserved={"skolem_2", "definition_2"})
    names = [s.name for s in result.fresh_symbols]
    assert names == ["definition_3", "skolem_3"]
    used = {name for name, _ in symbols_of_formula(taken)}
    assert not set(names) & (used | {"skolem_2", "definition_2"})
    assert result.fresh_symbols[0] == FreshSymbol("definition_3", 2, "definition", 0)
    assert result.fresh_symbols[1] == FreshSymbol("skolem_3", 1, "skolem", 0)


def test_definitions_of_the_same_side_are_shared_and_sources_recorded():
    side = binary(AND, atom("clear", X), atom("green", X))
    first = forall([X], binary(IFF, atom("guard", X), side))
    second = forall([X], binary(XOR, atom("next", X, X), side))
    result = clausify([first, second, atom("clear", application("block_b"))])
    assert [(s.name, s.source) for s in result.fresh_symbols] == [("definition_1", 0)]
    assert result.sources == tuple(sorted(result.sources))
    assert result.sources[-1] == 2 and result.clauses[-1] == Clause([positive("clear", application("block_b"))])
    assert set(result.sources) == {0, 1, 2}
    assert clausify([first, second, atom("clear", application("block_b"))]) == result


def test_constants_true_and_false_simplify_away():
    clear = atom("clear", application("block_a"))
    assert clausify([binary(OR, clear, VERUM)]).clauses == ()
    assert clausify([VERUM]).clauses == ()
    assert clausify([negation(VERUM)]).clauses == (Clause([]),)
    assert Clause([]) in clausify([binary(AND, clear, FALSUM)]).clauses
    assert clausify([binary(OR, clear, FALSUM)]).clauses == (Clause([positive("clear", application("block_a"))]),)


def test_repeated_literals_tautologies_and_symmetric_equations_merge():
    a, b = application("block_a"), application("block_b")
    equation = atomic(application("=", (a, b)))
    turned = atomic(application("=", (b, a)))
    (clause,) = clausify([binary(OR, equation, turned)]).clauses
    assert clause.literals == (Literal(True, application("=", (a, b))),)
    assert clausify([binary(OR, equation, negation(turned))]).clauses == ()
    clear = atom("clear", a)
    assert clausify([binary(AND, clear, clear)]).clauses == (Clause([positive("clear", a)]),)


# --- first-order: against brute-force finite models ---------------------------

DOMAIN_SIZES = (1, 2)
fo_terms = st.sampled_from([X, Y, application("c")])
fo_atoms = st.one_of(
    st.builds(lambda t: atom("p", t), fo_terms),
    st.builds(lambda s, t: atom("r", s, t), fo_terms, fo_terms),
    st.builds(lambda s, t: atomic(application("=", (s, t))), fo_terms, fo_terms),
)


def _fo_extend(children):
    return st.one_of(
        st.builds(negation, children),
        st.builds(binary, st.sampled_from(CONNECTIVES), children, children),
        st.builds(forall, st.sampled_from([[X], [Y]]), children),
        st.builds(exists, st.sampled_from([[X], [Y]]), children),
    )


fo_formulas = st.recursive(fo_atoms, _fo_extend, max_leaves=4)


def _value(term: Term, env, tables):
    if term.is_variable:
        return env[term]
    return tables[term.symbol][tuple(_value(a, env, tables) for a in term.arguments)]


def _atom_true(atom_term: Term, env, tables) -> bool:
    args = tuple(_value(a, env, tables) for a in atom_term.arguments)
    if atom_term.symbol == "=":
        return args[0] == args[1]
    return args in tables[atom_term.symbol]


def _true(formula: Formula, env, tables, size) -> bool:
    """Tarski semantics, recursively, written for this test."""
    c = formula.connective
    if c == ATOM:
        return _atom_true(formula.atom, env, tables)
    if c in ("$true", "$false"):
        return c == "$true"
    if c == "~":
        return not _true(formula.arguments[0], env, tables, size)
    if c in (FORALL, EXISTS):
        results = (
            _true(formula.arguments[0], {**env, **dict(zip(formula.variables, vs))}, tables, size)
            for vs in itertools.product(range(size), repeat=len(formula.variables))
        )
        return all(results) if c == FORALL else any(results)
    a, b = (_true(x, env, tables, size) for x in formula.arguments)
    return {AND: a and b, OR: a or b, IMPLIES: not a or b, IFF: a == b, XOR: a != b, NOR: not (a or b), NAND: not (a and b)}[c]


def _clauses_true(clauses, tables, size) -> bool:
    for clause in clauses:
        variables = sorted(clause.variables(), key=lambda v: v.symbol)
        for values in itertools.product(range(size), repeat=len(variables)):
            env = dict(zip(variables, values))
            if not any(_atom_true(lit.atom, env, tables) == lit.positive for lit in clause.literals):
                return False
    return True


def _tables_for(symbol: FreshSymbol, size):
    """Every interpretation of one fresh symbol over the domain."""
    points = list(itertools.product(range(size), repeat=symbol.arity))
    if symbol.kind == "skolem":
        for values in itertools.product(range(size), repeat=len(points)):
            yield dict(zip(points, values))
    else:
        for flags in itertools.product((False, True), repeat=len(points)):
            yield frozenset(p for p, flag in zip(points, flags) if flag)


structures = st.sampled_from(DOMAIN_SIZES).flatmap(
    lambda size: st.fixed_dictionaries(
        {
            "size": st.just(size),
            "c": st.sampled_from(range(size)).map(lambda v: {(): v}),
            "p": st.sets(st.sampled_from([(v,) for v in range(size)])).map(frozenset),
            "r": st.sets(st.sampled_from(list(itertools.product(range(size), repeat=2)))).map(frozenset),
        }
    )
)


@settings(max_examples=120, deadline=None)
@given(fo_formulas, structures, st.booleans())
def test_formula_true_exactly_when_some_extension_satisfies_its_clauses(formula, structure, naming):
    # Common practice (Skolem's theorem and the definitional transform): the
    # clauses, read with the fresh symbols existentially, say what the
    # formula says.  So in each small structure the (closed) formula is true
    # exactly when some interpretation of the fresh symbols, found here by
    # brute force, makes every clause true.
    size = structure["size"]
    tables = {name: structure[name] for name in ("c", "p", "r")}
    result = clausify([formula], naming=naming)
    closed = quantified(FORALL, (X, Y), formula)
    expected = _true(closed, {}, tables, size)
    choices = [list(_tables_for(symbol, size)) for symbol in result.fresh_symbols]
    found = any(
        _clauses_true(result.clauses, {**tables, **{s.name: t for s, t in zip(result.fresh_symbols, chosen)}}, size)
        for chosen in itertools.product(*choices)
    )
    assert found == expected
