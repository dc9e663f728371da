"""The ``assay`` command line: thin commands over the Python API."""

from __future__ import annotations

import json
import os
import sys
from dataclasses import fields, replace

import click

from checker.outcomes import EXIT_CODES, EXIT_USAGE, INTERNAL_ERROR, Report, worst
from checker.record import check_record
from checker.report import SAFETY_NOTE, render_json, render_text
from checker.run import check, describe_internal_error
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from formats.limits import DEFAULT_INPUT_LIMITS, INPUT_LIMIT_NAMES


class _Group(click.Group):
    """Usage errors exit with the code for bad usage, and internal errors
    with their own code, never with a Python traceback on screen."""

    def main(self, *args, **kwargs):  # noqa: D401 - click entry point
        kwargs["standalone_mode"] = False
        try:
            return super().main(*args, **kwargs)
        except click.exceptions.Exit as done:
            sys.exit(done.exit_code)
        except click.ClickException as error:
            error.show()
            sys.exit(EXIT_USAGE)
        except click.exceptions.Abort:
            sys.exit(EXIT_USAGE)
        except KeyboardInterrupt:
            click.echo("assay: interrupted", err=True)
            sys.exit(EXIT_USAGE)
        except Exception as error:  # noqa: BLE001 - report, never crash
            click.echo(f"assay: {describe_internal_error(error)}", err=True)
            sys.exit(EXIT_CODES[INTERNAL_ERROR])


LIMIT_NAMES = tuple(field.name for field in fields(SearchLimits))


def _limits(settings: tuple[str, ...]) -> SearchLimits:
    """The search bounds with each NAME=COUNT setting applied."""
    changes = {}
    for setting in settings:
        name, _, count = setting.partition("=")
        if name not in LIMIT_NAMES or not count.isdigit() or int(count) < 1:
            raise click.BadParameter(
                f"`{setting}`: expected NAME=COUNT with NAME one of {', '.join(LIMIT_NAMES)} and COUNT a positive whole number",
                param_hint="--search-limit",
            )
        changes[name] = int(count)
    return replace(DEFAULT_LIMITS, **changes)


def _input_limits(settings: tuple[str, ...]):
    """The input bounds with each NAME=COUNT setting applied."""
    changes = {}
    for setting in settings:
        name, _, count = setting.partition("=")
        if name not in INPUT_LIMIT_NAMES or not count.isdigit() or int(count) < 1:
            raise click.BadParameter(
                f"`{setting}`: expected NAME=COUNT with NAME one of {', '.join(INPUT_LIMIT_NAMES)} and COUNT a positive whole number",
                param_hint="--input-limit",
            )
        changes[name] = int(count)
    return replace(DEFAULT_INPUT_LIMITS, **changes)


@click.group(cls=_Group)
@click.version_option(package_name="assay")
def main() -> None:
    """assay: an independent checker for first-order resolution proofs."""


@main.command("check")
@click.argument("certificates", nargs=-1, required=True, type=click.Path(dir_okay=False))
@click.option("--problem", "problem", type=click.Path(dir_okay=False), help="The TPTP problem the derivation refutes.")
@click.option("--include-dir", "include_dirs", multiple=True, type=click.Path(exists=True, file_okay=False),
              help="Where to look for include(...) files (also $TPTP).")
@click.option("--report", "report_format", type=click.Choice(["text", "json"]), default="text", show_default=True)
@click.option("--all-steps", is_flag=True, help="List every step in the text report, not only the first failure.")
@click.option("--search-limit", "search_limits", multiple=True, metavar="NAME=COUNT",
              help="Raise or lower one bound of the per-step evidence search (counts, never time): "
              + ", ".join(f"{name} (default {getattr(DEFAULT_LIMITS, name)})" for name in LIMIT_NAMES) + ".")
@click.option("--input-limit", "input_limits", multiple=True, metavar="NAME=COUNT",
              help="Raise or lower one bound on what is read (larger input is refused as unreadable, exit 2): "
              + ", ".join(f"{name} (default {getattr(DEFAULT_INPUT_LIMITS, name)})" for name in INPUT_LIMIT_NAMES) + ".")
@click.option("--require-problem", is_flag=True,
              help="Refuse (exit 2) a certificate with no problem to check its leaves against, instead of "
              "checking it on assumptions: for gates in pipelines.")
@click.option("--jobs", type=click.IntRange(min=1), default=1, show_default=True,
              help="Check steps in this many processes.")
@click.option("--record", "record_path", type=click.Path(dir_okay=False, writable=True),
              help="Also write a check record (JSON with file hashes and scope statement) for a safety case.")
def check_command(
    certificates, problem, include_dirs, report_format, all_steps, search_limits, input_limits, require_problem, jobs,
    record_path,
) -> None:
    """Check each CERTIFICATE (TPTP derivation or assay's JSON Lines
    certificate); exit 0 accepted, 1 rejected, 2 unreadable, 3 undecided,
    4 internal error (for a batch: the worst)."""
    limits = _limits(search_limits)
    bounds = _input_limits(input_limits)
    if record_path and not os.path.isdir(os.path.dirname(os.path.abspath(record_path))):
        raise click.BadParameter(f"no directory to write {record_path} in", param_hint="--record")
    reports: list[Report] = [
        check(path, problem, include_dirs, limits, jobs, require_problem, bounds) for path in certificates
    ]
    if report_format == "json":
        click.echo(render_json(reports))
    else:
        for report in reports:
            click.echo(render_text(report, verbose=all_steps))
        click.echo(SAFETY_NOTE)
    if record_path:
        try:
            with open(record_path, "w", encoding="utf-8") as out:
                json.dump(check_record(reports, limits), out, indent=2)
        except OSError as error:
            raise click.FileError(record_path, hint=error.strerror or str(error)) from None
    sys.exit(EXIT_CODES[worst([report.verdict for report in reports])])
