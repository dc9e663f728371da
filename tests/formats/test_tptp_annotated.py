"""The TPTP reader on annotated formulas: names, roles, languages and the
sources that become Inference and Origin records."""

import pytest

from checker.kernel.clauses import Clause
from checker.kernel.formulas import Formula
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable
from formats.derivation import Inference, Location, Origin, Parent, UnreadableInput
from formats.tptp import ROLES, parse_clause, parse_formula, parse_term, parse_tptp


def only(text):
    (statement,) = parse_tptp(text).statements
    return statement


def source_of(annotation, language="cnf"):
    body = "p" if language == "cnf" else "q"
    return only(f"{language}(step, plain, {body}, {annotation}).").source


def test_cnf_and_fof_statements():
    # TPTP syntax BNF, <cnf_annotated> and <fof_annotated>:
    # <language>(<name>,<formula_role>,<formula><annotations>).
    document = parse_tptp(
        "cnf(lock_rule, axiom, ~ key(X) | locked(X)).\n"
        "fof(door_shut, conjecture, ! [D] : (door(D) => shut(D))).\n"
    )
    cnf, fof = document.statements
    assert (cnf.name, cnf.role, cnf.language) == ("lock_rule", "axiom", "cnf")
    assert cnf.content == parse_clause("~ key(X) | locked(X)")
    assert isinstance(cnf.content, Clause) and cnf.source is None
    assert (fof.name, fof.role, fof.language) == ("door_shut", "conjecture", "fof")
    assert fof.content is parse_formula("! [D] : (door(D) => shut(D))")
    assert isinstance(fof.content, Formula)
    assert (cnf.location, fof.location) == (Location("<string>", 1, 1), Location("<string>", 2, 1))
    assert document.format == "tptp" and document.notices == ()


@pytest.mark.parametrize("role", sorted(ROLES))
def test_every_role_of_the_standard_is_accepted(role):
    # TPTP syntax BNF, <formula_role>: the roles listed in the standard
    assert only(f"fof(r, {role}, p).").role == role


def test_the_role_list_is_the_standards():
    # TPTP syntax BNF, <formula_role> (the list of roles, from memory)
    assert ROLES == {
        "axiom", "hypothesis", "definition", "assumption", "lemma", "theorem",
        "corollary", "conjecture", "negated_conjecture", "plain", "type",
        "interpretation", "fi_domain", "fi_functors", "fi_predicates", "unknown",
    }


def test_unknown_role_is_unreadable_at_the_role():
    # TPTP syntax BNF, <formula_role>: any other word is not a role
    with pytest.raises(UnreadableInput) as caught:
        parse_tptp("\ncnf(r, axoim, p).")
    assert caught.value.location == Location("<string>", 2, 8)
    assert "axoim" in caught.value.message


@pytest.mark.parametrize(
    "written, stored",
    [("gate_7", "gate_7"), ("'gate_7'", "gate_7"), ("'Gate 7'", "'Gate 7'"), ("17", "17"), ("cnf", "cnf")],
)
def test_names(written, stored):
    # TPTP syntax BNF, <name> ::= <atomic_word> | <integer>
    assert only(f"cnf({written}, axiom, p).").name == stored


def test_keywords_are_ordinary_words_inside_statements():
    # TPTP syntax BNF, <atomic_word>: cnf, fof and include are lower words like any other
    statement = only("fof(include, axiom, cnf(fof) = include).")
    assert statement.name == "include"
    assert statement.content is parse_formula("cnf(fof) = include")


@pytest.mark.parametrize("language", ["tcf", "tpi"])
def test_other_languages_are_not_supported(language):
    # TPTP syntax BNF, <annotated_formula>: tcf and tpi are languages assay does not read
    # (tff and thf are read where first-order: tests/formats/test_tptp_typed.py)
    with pytest.raises(UnreadableInput) as caught:
        parse_tptp(f"cnf(a, axiom, p).\n  {language}(t, axiom, p).")
    assert caught.value.message.startswith(f"unsupported: the {'typed clause' if language == 'tcf' else 'process'}")
    assert caught.value.location == Location("<string>", 2, 3)


def test_file_source_with_and_without_name():
    # TPTP syntax BNF, <file_source> ::= file(<file_name><file_info>), <file_info> ::= ,<name> | <null>
    assert source_of("file('plant.p', valve_rule)") == Origin("file", ("plant.p", "valve_rule"))
    assert source_of("file('Axioms/plant.ax')") == Origin("file", ("Axioms/plant.ax", ""))
    assert source_of("file('it\\'s.p', 'v2')") == Origin("file", ("it's.p", "v2"))
    assert source_of("file(plant)") == Origin("file", ("plant", ""))


def test_inference_record():
    # TPTP syntax BNF, <inference_record> ::= inference(<inference_rule>,<useful_info>,<inference_parents>)
    source = source_of("inference(resolution, [status(thm), tried(3)], [c1, 'c2', 7])")
    assert source == Inference(
        "resolution", "thm", (Parent("c1"), Parent("c2"), Parent("7")), info=("tried(3)",)
    )


def test_inference_without_status():
    # TPTP syntax BNF, <useful_info> ::= [] | [<info_items>]: the status item is optional
    assert source_of("inference(split, [], [c1])") == Inference("split", None, (Parent("c1"),))
    assert source_of("inference(split, [], [])").parents == ()


def test_nested_inference_records_are_unnamed_steps():
    # TPTP syntax BNF, <parent_info> ::= <source><parent_details>: a parent may be an inference record
    source = source_of(
        "inference(rewrite, [status(thm)], "
        "[inference(superposition, [status(thm)], [c1, c2]), c3])"
    )
    assert source == Inference(
        "rewrite",
        "thm",
        (Inference("superposition", "thm", (Parent("c1"), Parent("c2"))), Parent("c3")),
    )


def test_parent_details_bind_variables():
    # TPTP syntax BNF, <parent_details> ::= :<general_list>, with bind(<variable>,<fof_term>)
    # items written as $fot(...) (<formula_data>) or as plain terms
    source = source_of(
        "inference(resolution, [status(thm)], "
        "[c1:[bind(X, $fot(gate(Y))), bind(Z, depot)], c2:[bind(W, 'Dock 4')], c3:[ordering(lr)]])"
    )
    X, Y, Z, W = (variable(name) for name in "XYZW")
    assert source.parents == (
        Parent("c1", Substitution({X: application("gate", (Y,)), Z: application("depot")})),
        Parent("c2", Substitution({W: application("'Dock 4'")})),
        Parent("c3"),
    )


def test_bindings_to_compound_terms_and_to_non_terms():
    # TPTP syntax BNF, <parent_details> ::= :<general_list>; a bind whose value
    # is no term (a list here) binds nothing
    source = source_of("inference(r, [], [c1:[bind(X, next_stop(Y, 'a')), bind(Y, [a])]])")
    X, Y = variable("X"), variable("Y")
    assert source.parents == (
        Parent("c1", Substitution({X: application("next_stop", (Y, application("a")))})),
    )


def test_non_name_parents_are_kept_as_info():
    # TPTP syntax BNF, <parent_info> ::= <source><parent_details>: a parent may be
    # an external source such as theory(equality)
    source = source_of("inference(rewrite, [status(thm)], [c1, theory(equality)])")
    assert source.parents == (Parent("c1"),)
    assert source.info == ("theory(equality)",)


def test_introduced_sources():
    # TPTP syntax BNF, <internal_source> ::= introduced(<intro_type><optional_info>)
    assert source_of("introduced(definition, [new_symbols(naming, [named_part0]), x])") == Origin(
        "introduced", ("definition", "new_symbols(naming,[named_part0])", "x")
    )
    assert source_of("introduced(tautology)") == Origin("introduced", ("tautology",))


def test_theory_sources():
    # TPTP syntax BNF, <theory> ::= theory(<theory_name><optional_info>)
    assert source_of("theory(equality)") == Origin("theory", ("equality",))
    assert source_of("theory(equality, [symmetry])") == Origin("theory", ("equality", "symmetry"))


@pytest.mark.parametrize(
    "annotation, text",
    [
        ("creator(planner, [version(2)])", "creator(planner,[version(2)])"),
        ("unknown", "unknown"),
        ("c7", "c7"),
        ("[c1, file('a.p')]", "[c1,file('a.p')]"),
        ('status(X):"note":12', 'status(X):"note":12'),
    ],
)
def test_other_sources_are_kept_as_unknown(annotation, text):
    # TPTP syntax BNF, <source> ::= <general_term>: anything else is kept as written
    assert source_of(annotation) == Origin("unknown", (text,))


def test_general_terms_anywhere_in_annotations():
    # TPTP syntax BNF, <general_data> includes <formula_data>: $fof(...), $cnf(...), $fot(...)
    source = source_of(
        "inference(r, [status(thm), note($fof(! [X] : p(X))), $cnf(p | ~ q), $fot(f(X)), [], -3.5], [c1]),"
        " [useful, [nested, info(1)], $fot(g(a))]",
        language="fof",
    )
    assert source.info == ("note($fof(! [X] : p(X)))", "$cnf(p | ~q)", "$fot(f(X))", "[]", "-3.5")


def test_deeply_nested_inference_records():
    # common practice: nested inference records may be deep; nothing may recurse per level
    depth = 5_000
    annotation = "c0"
    for level in range(depth):
        annotation = f"inference(step{level}, [], [{annotation}])"
    source = source_of(annotation)
    for level in reversed(range(depth)):
        assert source.rule == f"step{level}"
        (source,) = source.parents
    assert source == Parent("c0")


def test_location_of_statements_after_others_on_one_line():
    # TPTP syntax BNF, <TPTP_file> ::= <TPTP_input>*: inputs need not start a line
    first, second = parse_tptp("cnf(a, axiom, p).  cnf(b, axiom,\n q).").statements
    assert second.location == Location("<string>", 1, 20)
    assert second.content == parse_clause("q")


def test_string_parsers_accept_the_whole_input_only():
    # TPTP syntax BNF, <fof_term>: one term, nothing after it
    with pytest.raises(UnreadableInput):
        parse_term("f(a) g")
