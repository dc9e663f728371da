"""The ``assay`` command line: thin commands over the Python API."""

from __future__ import annotations

import json
import os
import sys
from dataclasses import fields, replace

import click

from checker.inspect_commands import explain_command, extract_command, graph_command
from checker.outcomes import ACCEPTED, EXIT_CODES, EXIT_USAGE, INTERNAL_ERROR, UNDECIDED, UNREADABLE, Report, worst
from checker.progress import Progress
from checker.record import (
    RECORD_INTERNAL_ERROR,
    RECORD_UNREADABLE,
    CheckOptions,
    UnreadableRecord,
    check_record,
    render_record_check,
    verify_record,
)
from checker.report import SAFETY_NOTE, render_json, render_text
from checker.run import check, describe_internal_error
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from checker.time_limit import Deadline
from formats.limits import DEFAULT_INPUT_LIMITS, INPUT_LIMIT_NAMES


class _Group(click.Group):
    """Usage errors exit with the code for bad usage, and internal errors
    with their own code, never with a Python traceback on screen."""

    def main(self, *args, **kwargs):
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


TIME_LIMIT_OPTION = click.option(
    "--time-limit", type=click.FloatRange(min=0, min_open=True), metavar="SECONDS",
    help="Stop checking after this many seconds of the whole run: steps not reached are left unchecked "
    "(listed in the report) and the run is at best undecided.",
)
QUIET_OPTION = click.option("--quiet", is_flag=True, help="Print nothing but errors; the exit code tells the verdict.")


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
@click.option("--all-steps", is_flag=True, help="List every step in the text report (every failing one, and those resting on a failure), not only the first failure.")
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
@TIME_LIMIT_OPTION
@QUIET_OPTION
def check_command(
    certificates, problem, include_dirs, report_format, all_steps, search_limits, input_limits, require_problem, jobs,
    record_path, time_limit, quiet,
) -> None:
    """Check each CERTIFICATE (TPTP derivation or assay's JSON Lines
    certificate); exit 0 accepted, 1 rejected, 2 unreadable, 3 undecided,
    4 internal error (for a batch: the worst)."""
    limits = _limits(search_limits)
    bounds = _input_limits(input_limits)
    if record_path and not os.path.isdir(os.path.dirname(os.path.abspath(record_path))):
        raise click.BadParameter(f"no directory to write {record_path} in", param_hint="--record")
    deadline = None if time_limit is None else Deadline.after(time_limit)
    progress = Progress(enabled=not quiet)
    reports: list[Report] = []
    for path in certificates:
        if deadline is not None and deadline.expired():
            reports.append(Report(path, UNDECIDED, problem=problem,
                                  error=f"not checked: {deadline.describe()} before this file was started"))
        else:
            reports.append(
                check(path, problem, include_dirs, limits, jobs, require_problem, deadline, progress, bounds)
            )
    progress.finish()
    if quiet:
        for report in reports:
            if report.verdict in (UNREADABLE, INTERNAL_ERROR):
                click.echo(f"{report.path}: {report.verdict}: {report.error}", err=True)
    elif report_format == "json":
        click.echo(render_json(reports))
    else:
        for report in reports:
            click.echo(render_text(report, verbose=all_steps))
        click.echo(SAFETY_NOTE)
    if record_path:
        try:
            with open(record_path, "w", encoding="utf-8") as out:
                options = CheckOptions(problem, tuple(include_dirs), limits, jobs, require_problem, bounds, time_limit)
                json.dump(check_record(reports, limits, options), out, indent=2)
        except OSError as error:
            raise click.FileError(record_path, hint=error.strerror or str(error)) from None
    sys.exit(EXIT_CODES[worst([report.verdict for report in reports])])


main.add_command(explain_command)
main.add_command(extract_command)
main.add_command(graph_command)


@main.command("verify-record")
@click.argument("record", type=click.Path(dir_okay=False))
@click.option("--base-dir", type=click.Path(exists=True, file_okay=False),
              help="Where relative paths in the record start (default: the directory the check ran in).")
def verify_record_command(record, base_dir) -> None:
    """Verify a check RECORD written by `check --record`: recompute every
    hash (certificate, problem, included files, the kernel's sources) and
    re-run the check with the recorded options.  Exit 0 the record holds,
    1 an outcome differs, 2 unreadable record or bad usage, 4 internal
    error, 5 a checked file changed or is missing, 6 the kernel's sources
    changed."""
    try:
        found = verify_record(record, base_dir)
    except UnreadableRecord as error:
        click.echo(f"assay: {error}", err=True)
        sys.exit(RECORD_UNREADABLE)
    except Exception as error:  # noqa: BLE001 - report, never crash
        click.echo(f"assay: {describe_internal_error(error)}", err=True)
        sys.exit(RECORD_INTERNAL_ERROR)
    click.echo(render_record_check(record, found))
    sys.exit(found.exit_code)


@main.command("elaborate")
@click.argument("derivation", type=click.Path(dir_okay=False))
@click.option("-o", "--output", "output", required=True, type=click.Path(dir_okay=False, writable=True),
              help="Where to write the native certificate (version 2, JSON Lines).")
@click.option("--problem", "problem", type=click.Path(dir_okay=False), help="The TPTP problem the derivation refutes.")
@click.option("--include-dir", "include_dirs", multiple=True, type=click.Path(exists=True, file_okay=False),
              help="Where to look for include(...) files (also $TPTP).")
@click.option("--search-limit", "search_limits", multiple=True, metavar="NAME=COUNT",
              help="Bounds of the evidence search, as for `assay check`.")
@click.option("--partial", is_flag=True,
              help="Write a certificate marked partial even when the derivation is not accepted.")
def elaborate_command(derivation, output, problem, include_dirs, search_limits, partial) -> None:
    """Check DERIVATION and write it with the evidence found for every step,
    so that checking the certificate needs no search.  Refuses (exit 1,
    nothing written) a derivation that is not accepted, unless --partial."""
    from checker.elaborate import elaborate  # only this command needs the writer

    if not os.path.isdir(os.path.dirname(os.path.abspath(output))):
        raise click.BadParameter(f"no directory to write {output} in", param_hint="--output")
    done = elaborate(derivation, output, problem, include_dirs, _limits(search_limits), partial)
    report = done.report
    # Not accepted: exit 1, but unreadable input and internal errors keep their own codes.
    refused = EXIT_CODES[report.verdict] if report.verdict in (UNREADABLE, INTERNAL_ERROR) else 1
    if done.written is None:
        click.echo(render_text(report))
        click.echo(f"assay: {derivation} is {report.verdict}; no certificate written", err=True)
        sys.exit(refused)
    counts = ", ".join(f"{count} {outcome}" for outcome, count in report.counts.items())
    state = "certificate" if report.verdict == ACCEPTED else "partial certificate"
    click.echo(f"{derivation}: {report.verdict} ({counts}); {state} written to {done.written}")
    sys.exit(0 if report.verdict == ACCEPTED else refused)
@main.command("batch")
@click.argument("sources", nargs=-1, required=True)
@click.option("--jobs", type=click.IntRange(min=1), default=1, show_default=True,
              help="Check this many files at once, each in a process of its own (on a cluster, "
              "its workers' threads decide).")
@click.option("--problems", "problems_dir", type=click.Path(exists=True, file_okay=False),
              help="Directory of problems: a derivation is paired with the problem of the same name "
              "(else with the one its leaves' file(...) sources name, looked for here too).")
@click.option("--problem-map", "problem_map", type=click.Path(dir_okay=False),
              help="JSON object from derivation (file name, or path relative to the map) to problem file.")
@click.option("--include-dir", "include_dirs", multiple=True, type=click.Path(exists=True, file_okay=False),
              help="Where to look for include(...) files (also $TPTP).")
@click.option("--search-limit", "search_limits", multiple=True, metavar="NAME=COUNT",
              help="One bound of the per-step evidence search, as for check.")
@click.option("--require-problem", is_flag=True, help="A derivation with no problem found is unreadable.")
@click.option("--file-timeout", type=click.FloatRange(min=0, min_open=True), metavar="SECONDS",
              help="A file not done in this many seconds is undecided (its steps not reached are left unchecked).")
@TIME_LIMIT_OPTION
@click.option("--json", "json_path", type=click.Path(dir_okay=False), help="Write the summary as JSON to this file.")
@click.option("--junit", "junit_path", type=click.Path(dir_okay=False),
              help="Write a JUnit XML file: one test case per derivation.")
@click.option("--cluster", metavar="ADDRESS",
              help="Run on the Dask cluster whose scheduler is at ADDRESS (needs assay[cluster]; "
              "the workers must see the files at the same paths).")
@QUIET_OPTION
def batch_command(
    sources, jobs, problems_dir, problem_map, include_dirs, search_limits, require_problem, file_timeout, time_limit,
    json_path, junit_path, cluster, quiet,
) -> None:
    """Check every derivation in SOURCES (files, directories, glob
    patterns), each against its problem, and print a summary table; exit
    with the worst verdict (0 accepted, 1 rejected, 2 unreadable,
    3 undecided, 4 internal error)."""
    from checker.batch import collect_derivations, make_jobs, run_batch
    from checker.batch_report import render_summary_json, render_table
    from checker.cluster import ClusterUnavailable
    from checker.junit import write_junit
    from formats.derivation import UnreadableInput

    limits = _limits(search_limits)
    for path, option in ((json_path, "--json"), (junit_path, "--junit")):
        if path and not os.path.isdir(os.path.dirname(os.path.abspath(path))):
            raise click.BadParameter(f"no directory to write {path} in", param_hint=option)
    paths, unmatched = collect_derivations(sources, [problems_dir] if problems_dir else [])
    for argument in unmatched:
        click.echo(f"assay: {argument}: no derivation files found", err=True)
    if not paths:
        raise click.UsageError("no derivation files to check")
    try:
        file_jobs = make_jobs(paths, problems_dir, problem_map, include_dirs, limits, require_problem, file_timeout)
    except UnreadableInput as error:
        raise click.BadParameter(f"{error.location}: {error.message}", param_hint="--problem-map") from None
    progress = Progress(unit="files", enabled=not quiet)
    progress.start(len(file_jobs))
    try:
        batch = run_batch(file_jobs, jobs, time_limit, cluster, on_result=lambda _: progress.advance())
    except ClusterUnavailable as error:
        raise click.UsageError(str(error)) from None
    progress.finish()
    for path, write in ((json_path, lambda p: _write_text(p, render_summary_json(batch) + "\n")),
                        (junit_path, lambda p: write_junit(batch, p))):
        if path:
            try:
                write(path)
            except OSError as error:
                raise click.FileError(path, hint=error.strerror or str(error)) from None
    if quiet:
        for result in batch.results:
            if result.verdict in (UNREADABLE, INTERNAL_ERROR):
                click.echo(f"{result.path}: {result.verdict}: {result.error}", err=True)
    else:
        click.echo(render_table(batch))
    sys.exit(EXIT_CODES[batch.verdict])


def _write_text(path: str, text: str) -> None:
    with open(path, "w", encoding="utf-8") as out:
        out.write(text)
