"""The commands that look into one derivation: ``explain``, ``extract``, ``graph``.

Each is a thin wrapper over its module's function; unreadable input and
unknown step names exit 2 with the place, never a traceback.
"""

from __future__ import annotations

import os
import sys

import click

from checker.opened import OpenedDerivation, open_derivation, unknown_step_message
from checker.outcomes import EXIT_USAGE
from formats.derivation import UnreadableInput

_PROBLEM = click.option("--problem", "problem", type=click.Path(dir_okay=False),
                        help="The TPTP problem the derivation refutes.")
_INCLUDES = click.option("--include-dir", "include_dirs", multiple=True, type=click.Path(exists=True, file_okay=False),
                         help="Where to look for include(...) files (also $TPTP).")


def _refuse(message: str) -> None:
    click.echo(f"assay: {message}", err=True)
    sys.exit(EXIT_USAGE)


def _opened(derivation: str, problem: str | None, include_dirs) -> OpenedDerivation:
    try:
        return open_derivation(derivation, problem, include_dirs)
    except UnreadableInput as error:
        _refuse(f"{error.location}: {error.message}" + (f"\n{error.excerpt}" if error.excerpt else ""))
    except OSError as error:
        _refuse(f"{error.filename or derivation}: cannot read: {error.strerror or error}")


def _write(path: str, text: str) -> None:
    try:
        with open(path, "w", encoding="utf-8") as out:
            out.write(text)
    except OSError as error:
        _refuse(f"{path}: cannot write: {error.strerror or error}")


@click.command("explain")
@click.argument("derivation", type=click.Path(dir_okay=False))
@click.argument("step")
@_PROBLEM
@_INCLUDES
def explain_command(derivation, step, problem, include_dirs) -> None:
    """Lay STEP of DERIVATION open: premises and claim as written, what was
    tried, the evidence found or the exact failure point, the counter-model.
    A nested record is named outer/1, outer/2 ..."""
    from checker.explain import explain, render_explanation
    from checker.run import check

    opened = _opened(derivation, problem, include_dirs)
    if step not in opened.steps:
        _refuse(unknown_step_message(opened, step))
    report = check(derivation, opened.problem_path, include_dirs)
    if report.error:
        _refuse(report.error)
    click.echo(render_explanation(explain(opened, report, step), styled=sys.stdout.isatty()))


@click.command("extract")
@click.argument("derivation", type=click.Path(dir_okay=False))
@click.argument("step")
@click.option("-o", "--output", "output", required=True, type=click.Path(dir_okay=False),
              help="Where to write the TPTP problem.")
@click.option("--with-model", is_flag=True, help="Add a counter-model of the step, if one is found, as a comment.")
@_PROBLEM
@_INCLUDES
def extract_command(derivation, step, output, with_model, problem, include_dirs) -> None:
    """Write a standalone TPTP problem for STEP of DERIVATION: its premises
    as axioms, its claimed conclusion (universally closed) as the conjecture."""
    from checker.extract import NoReproducer, extract

    opened = _opened(derivation, problem, include_dirs)
    if step not in opened.steps:
        _refuse(unknown_step_message(opened, step))
    reproducer = extract(opened, step, with_model)
    if isinstance(reproducer, NoReproducer):
        _refuse(f"{derivation}: {reproducer.message}")
    _write(output, reproducer.text)
    click.echo(f"wrote {output}: {len(reproducer.axioms)} axioms and the conjecture `{step}`"
               + (", with a counter-model" if reproducer.countermodel is not None else ""))


@click.command("graph")
@click.argument("derivation", type=click.Path(dir_okay=False))
@click.option("-o", "--output", "output", required=True, type=click.Path(dir_okay=False),
              help="The picture to write: .dot (needs no Graphviz), .svg or .html (need Graphviz's dot).")
@_PROBLEM
@_INCLUDES
def graph_command(derivation, output, problem, include_dirs) -> None:
    """Draw DERIVATION as a layered graph from its leaves to $false, each
    step coloured by outcome, the first failure marked, unused steps faded;
    HTML adds a table of steps and each step's explanation on a click."""
    from checker.graph import GraphvizMissing, proof_graph, render_html, render_svg, to_dot
    from checker.run import check

    kind = os.path.splitext(output)[1].lower()
    if kind not in (".dot", ".gv", ".svg", ".html", ".htm"):
        _refuse(f"{output}: the picture is written as .dot, .svg or .html; say which by the file's extension")
    opened = _opened(derivation, problem, include_dirs)
    report = check(derivation, opened.problem_path, include_dirs)
    if report.error:
        _refuse(report.error)
    picture = proof_graph(opened, report)
    title = f"{os.path.basename(derivation)}: {report.verdict}"
    try:
        if kind in (".dot", ".gv"):
            text = to_dot(picture, title).source
        elif kind == ".svg":
            text = render_svg(to_dot(picture, title))
        else:
            text = render_html(opened, report, picture, title)
    except GraphvizMissing as missing:
        _refuse(str(missing))
    _write(output, text)
    failure = report.first_failure
    click.echo(f"wrote {output}: {len(picture.nodes)} steps, {report.verdict}"
               + (f", first failure {failure.name}" if failure is not None else ""))
