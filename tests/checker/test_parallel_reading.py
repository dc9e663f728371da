"""Reading a file in parts (``--jobs N``) gives the document, the report and
the errors that reading it whole gives; files whose statements depend on
each other are read whole."""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

sys.path.insert(0, str(Path(__file__).resolve().parents[2] / "bench"))

from generate import generate, write

from checker import parallel_reading
from checker.parallel_reading import read_in_parts
from checker.run import check, read_document, read_problem
from formats.limits import InputLimits, bounded
from formats.native import read_native
from formats.tptp import read_tptp


@pytest.fixture
def small_parts(monkeypatch):
    """Cut even a small file (the fork is what is tested, not its worth)."""
    monkeypatch.setattr(parallel_reading, "PARTS_FROM", 5)


@pytest.fixture(scope="module")
def generated(tmp_path_factory):
    return write(generate(60), str(tmp_path_factory.mktemp("generated")))


@pytest.mark.parametrize("jobs", [2, 3])
def test_a_generated_derivation_and_its_problem_read_in_parts_are_the_documents_read_whole(
        generated, small_parts, jobs):
    for native, path in ((True, generated["native"]), (False, generated["tptp"]), (False, generated["problem"])):
        in_parts = read_in_parts(path, native, (), jobs)
        assert in_parts is not None, path
        assert in_parts == (read_native(path) if native else read_tptp(path)), path


def test_the_report_is_the_same_with_one_and_two_jobs_when_reading_in_parts(generated, small_parts):
    for form in ("native", "tptp"):
        two = check(generated[form], generated["problem"], jobs=2)
        assert two.verdict == "accepted"
        assert two == check(generated[form], generated["problem"], jobs=1)


def test_statements_keep_their_lines_and_columns_across_comments_and_shared_lines(tmp_path, small_parts):
    text = "% a conveyor cell\n" + "\n".join(
        f"cnf(belt{i}, axiom, moves(belt{i}) | ~stopped(belt{i})).  cnf(motor{i}, axiom,\n"
        f"    /* spins */ spins(motor{i})). % motor\n\n   fof(feeds{i}, axiom, ! [X] : (feeds(X, belt{i}) => moves(X)))."
        for i in range(6)
    ) + "\n"
    path = tmp_path / "cell.p"
    path.write_text(text)
    in_parts = read_in_parts(str(path), False, (), 2)
    assert in_parts is not None and in_parts == read_tptp(str(path))
    assert [(s.location.line, s.location.column) for s in in_parts.statements][:3] == [(2, 1), (2, 53), (5, 4)]


def test_carriage_returns_end_lines_as_when_read_whole(tmp_path, small_parts):
    path = tmp_path / "returns.p"
    path.write_bytes(b"".join(b"cnf(lamp%d, axiom,\r\n  lit(lamp%d)).\r" % (i, i) for i in range(8)))
    in_parts = read_in_parts(str(path), False, (), 2)
    assert in_parts is not None and in_parts == read_tptp(str(path))
    assert in_parts.statements[3].location.line == 7


@pytest.mark.parametrize("text", [
    "include('other.ax').\n" + "cnf(a{i}, axiom, p{i}).\n" * 8,  # statements come from another file
    "tff(t, type, crate: $tType).\n" + "cnf(a{i}, axiom, p{i}).\n" * 8,  # types hold for what follows
    "A prover's log line.\n" + "cnf(a{i}, axiom, p{i}).\n" * 8,  # a skipped-text notice
])
def test_files_whose_statements_depend_on_each_other_are_read_whole(tmp_path, small_parts, text):
    path = tmp_path / "dependent.p"
    path.write_text("".join(line.replace("{i}", str(i)) + "\n" for i, line in enumerate(text.splitlines())))
    assert read_in_parts(str(path), False, (), 2) is None


def test_a_small_file_or_one_job_is_read_whole(generated):
    assert read_in_parts(generated["native"], True, (), 2) is None  # fewer statements than PARTS_FROM
    assert read_in_parts(generated["native"], True, (), 1) is None


def test_more_statements_than_the_limit_are_refused_as_when_read_whole(generated, small_parts):
    with bounded(InputLimits(statements=10)):
        assert read_in_parts(generated["tptp"], False, (), 2) is None
        assert read_in_parts(generated["native"], True, (), 2) is None
    whole = check(generated["native"], generated["problem"], input_limits=InputLimits(statements=10))
    assert whole.verdict == "unreadable" and "more than 10 statements" in whole.error
    assert check(generated["native"], generated["problem"], jobs=2, input_limits=InputLimits(statements=10)) == whole


@pytest.mark.parametrize("form", ["native", "tptp"])
def test_an_error_in_a_later_part_is_reported_as_reading_whole_reports_it(generated, small_parts, tmp_path, form):
    lines = Path(generated[form]).read_text().splitlines()
    broken = len(lines) * 3 // 4  # in the last part
    if form == "native":
        lines[broken] = lines[broken].replace('"formula": "', '"formula": "((', 1)
    else:
        lines[broken] = lines[broken].replace(", plain, ", ", plain, ((", 1)
    path = tmp_path / Path(generated[form]).name
    path.write_text("\n".join(lines) + "\n")
    assert read_in_parts(str(path), form == "native", (), 2) is None
    whole = check(str(path), generated["problem"])
    assert whole.verdict == "unreadable" and f":{broken + 1}:" in whole.error
    assert check(str(path), generated["problem"], jobs=2) == whole


def test_the_run_readers_read_in_parts_only_when_asked(generated, small_parts, monkeypatch):
    asked = []
    original = parallel_reading.read_in_parts
    monkeypatch.setattr("checker.run.read_in_parts", lambda *a: asked.append(a[-1]) or original(*a))
    assert read_document(generated["tptp"], (), 2) == read_document(generated["tptp"])
    assert read_problem(generated["problem"], (), 2) == read_tptp(generated["problem"])
    assert asked == [2, 1, 2]
