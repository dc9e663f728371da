"""The TPTP reader on whole files: comments, includes (selection, lookup,
cycles, missing files) and prover log text skipped with notices."""

import os
from pathlib import Path

import pytest

from formats.derivation import Inference, Location, Notice, Origin, Parent, UnreadableInput
from formats.tptp import parse_clause, parse_formula, parse_tptp, read_tptp

FIXTURES = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "reader"
LIBRARY = str(FIXTURES / "library")


def fixture(name):
    return str(FIXTURES / name)


def names(document):
    return [statement.name for statement in document.statements]


def test_comments_are_skipped_without_notices():
    # TPTP syntax BNF, <comment> ::= <comment_line> | <comment_block>
    document = parse_tptp(
        "% SZS status Theorem\n"
        "/* a block\n   comment */ cnf(a, axiom, p).\n"
        "cnf(b, /* inside */ axiom, % to the end of the line\n  q).  % after\n"
    )
    assert names(document) == ["a", "b"]
    assert document.notices == ()
    assert document.statements[0].location == Location("<string>", 3, 15)


def test_comment_characters_inside_quotes_are_not_comments():
    # TPTP syntax BNF, <single_quoted> and <distinct_object> may hold % and /*
    document = parse_tptp("cnf(a, axiom, p('50% open', \"/* x\")).\ncnf(b, axiom, q).")
    assert names(document) == ["a", "b"]
    assert document.statements[0].content == parse_clause("p('50% open', \"/* x\")")


def test_includes_are_expanded_in_place():
    # TPTP syntax BNF, <include> ::= include(<file_name><formula_selection>).
    # The include directory stands for the TPTP root, as the standard's
    # Axioms/... file names assume
    document = read_tptp(fixture("plant_interlock.p"), include_dirs=[LIBRARY])
    assert names(document) == [
        "run_needs_open_inlet",
        "closed_or_open",
        "valve_names_differ",
        "pump_runs",
        "inlet_of_pump",
        "valve_safe",
    ]
    by_name = {statement.name: statement for statement in document.statements}
    assert by_name["run_needs_open_inlet"].content is parse_formula(
        "! [P] : (running(P) => open(inlet(P)))"
    )
    assert by_name["run_needs_open_inlet"].location == Location(fixture("interlock_axioms.ax"), 2, 1)
    assert by_name["closed_or_open"].location == Location(fixture("interlock_axioms.ax"), 6, 1)
    assert by_name["valve_names_differ"].location == Location(
        os.path.join(LIBRARY, "Axioms", "plant_equality.ax"), 2, 1
    )
    assert by_name["valve_safe"].location == Location(fixture("plant_interlock.p"), 6, 1)
    assert document.path == fixture("plant_interlock.p")


def test_include_not_found_without_the_include_directory():
    # TPTP syntax BNF, <include>: the named file must exist
    with pytest.raises(UnreadableInput) as caught:
        read_tptp(fixture("plant_interlock.p"))
    assert caught.value.location == Location(fixture("plant_interlock.p"), 3, 1)
    assert "Axioms/plant_equality.ax" in caught.value.message


def test_include_with_selection_keeps_only_the_named_statements():
    # TPTP syntax BNF, <formula_selection> ::= ,[<name_list>]: only the named
    # formulae are included, in the order of the included file
    document = read_tptp(fixture("access_policy.p"))
    assert names(document) == ["rule_badge", "rule_escort", "visitor_in_lab"]


def test_selection_of_a_name_the_file_lacks():
    # TPTP syntax BNF, <formula_selection>: each selected name is a formula of the file
    with pytest.raises(UnreadableInput) as caught:
        read_tptp(fixture("access_policy_unknown_rule.p"))
    assert "rule_fire_door" in caught.value.message
    assert caught.value.location == Location(fixture("access_policy_unknown_rule.p"), 2, 1)


def test_include_cycle_is_unreadable_at_the_closing_include():
    # common practice: a file that includes itself, directly or not, has no expansion
    with pytest.raises(UnreadableInput) as caught:
        read_tptp(fixture("include_cycle_first.p"))
    assert "include cycle" in caught.value.message
    assert caught.value.location == Location(fixture("include_cycle_second.p"), 2, 1)


def test_missing_included_file_is_unreadable_at_the_include():
    # TPTP syntax BNF, <include>: the named file must exist
    with pytest.raises(UnreadableInput) as caught:
        read_tptp(fixture("include_missing_file.p"))
    assert caught.value.location == Location(fixture("include_missing_file.p"), 2, 3)
    assert caught.value.excerpt.splitlines()[1] == "  ^"


def test_syntax_error_in_included_file_points_into_that_file():
    # TPTP syntax BNF, <fof_arguments>: an empty argument is not a term
    with pytest.raises(UnreadableInput) as caught:
        read_tptp(fixture("syntax_error_in_included_file.p"))
    assert caught.value.location == Location(fixture("broken_signal_rules.ax"), 3, 38)
    assert caught.value.excerpt == (
        "    ~ green(S) | clear(block_after(S,))).\n"
        "                                     ^"
    )


def test_includes_of_a_string_are_found_in_the_include_directories():
    # TPTP syntax BNF, <include>: file names are relative to the TPTP root
    document = parse_tptp("include('Axioms/plant_equality.ax').", include_dirs=[LIBRARY])
    assert names(document) == ["valve_names_differ"]


def test_missing_top_file_is_unreadable():
    # common practice: a file that cannot be opened is unreadable input
    with pytest.raises(UnreadableInput) as caught:
        read_tptp(fixture("no_such_problem.p"))
    assert caught.value.location.file == fixture("no_such_problem.p")


def test_prover_log_is_read_with_a_notice_per_skipped_run():
    # TPTP syntax BNF, <TPTP_file>: the annotated formulae are the derivation;
    # the log text around them is not TPTP and is skipped with notices
    document = read_tptp(fixture("prover_log_rail_signalling.txt"))
    assert names(document) == ["red_stops", "signal_s4_red", "not_stopped", "s4_stopped", "refutation"]
    log = fixture("prover_log_rail_signalling.txt")
    assert document.notices == (
        Notice("skipped 2 lines of text that is not TPTP", Location(log, 1, 1)),
        Notice("skipped 1 line of text that is not TPTP", Location(log, 8, 1)),
        Notice("skipped 2 lines of text that is not TPTP", Location(log, 12, 1)),
    )
    red_stops, _, _, s4_stopped, refutation = document.statements
    assert red_stops.source == Origin("file", ("rail_signalling.p", "red_stops"))
    assert s4_stopped.source == Inference(
        "resolution", "thm", (Parent("red_stops"), Parent("signal_s4_red"))
    )
    assert refutation.content.is_empty
    assert refutation.location == Location(log, 10, 1)


def test_statement_keywords_inside_log_lines_are_not_statements():
    # common practice: a statement starts a line or follows a previous statement
    document = parse_tptp("note: cnf(a, axiom, p). was derived\ncnf(b, axiom, q). trailing words\n")
    assert names(document) == ["b"]
    assert [notice.location for notice in document.notices] == [
        Location("<string>", 1, 1),
        Location("<string>", 2, 19),
    ]


def test_unclosed_block_comment_is_unreadable():
    # TPTP syntax BNF, <comment_block> ::: [/][*]<not_star_slash>[*][*]*[/]
    with pytest.raises(UnreadableInput) as caught:
        parse_tptp("cnf(a, axiom, p).\n  /* never closed\ncnf(b, axiom, q).")
    assert caught.value.location == Location("<string>", 2, 3)


def test_empty_file_has_no_statements():
    # TPTP syntax BNF, <TPTP_file> ::= <TPTP_input>*
    document = parse_tptp("")
    assert document.statements == () and document.notices == ()


def test_absolute_include_path(tmp_path):
    # TPTP syntax BNF, <file_name> ::= <single_quoted>: any path, absolute ones as they are
    rules = tmp_path / "crane_rules.ax"
    rules.write_text("cnf(crane_idle, axiom, idle(crane_c1)).\n")
    document = parse_tptp(f"include('{rules}').")
    assert names(document) == ["crane_idle"]
    assert document.statements[0].location == Location(str(rules), 1, 1)


def test_file_that_is_not_utf8_text_is_unreadable(tmp_path):
    # common practice: TPTP files are ASCII text; undecodable bytes are unreadable input
    binary = tmp_path / "scrambled.p"
    binary.write_bytes(b"cnf(a, axiom, p(\xff)).")
    with pytest.raises(UnreadableInput) as caught:
        read_tptp(str(binary))
    assert "not UTF-8" in caught.value.message


def test_directory_is_unreadable(tmp_path):
    # common practice: only a regular file can be read
    with pytest.raises(UnreadableInput) as caught:
        read_tptp(str(tmp_path))
    assert caught.value.location == Location(str(tmp_path), 1, 1)
