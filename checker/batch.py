"""Checking many derivations in one run (``assay batch``).

Which files: each argument is a derivation, a directory (searched for
derivation files, see ``DERIVATION_SUFFIXES``) or a glob pattern.  Which
problem each is checked against, first that applies: the problem map (a
JSON object from derivation to problem file), a file of the same name in
the problems directory, or the problem its leaves' ``file(...)`` sources
cite, looked for next to the derivation and in the problems and include
directories; with none, the leaves are taken as assumptions.  How: one
process per file (``checker.file_processes``), or on a Dask cluster
(``checker.cluster``); one bad file never stops the others.
"""

from __future__ import annotations

import glob
import json
import os
import time
from collections.abc import Callable, Sequence
from dataclasses import dataclass

from checker.batch_results import FileJob, FileResult
from checker.file_processes import check_in_processes
from checker.outcomes import worst
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from checker.time_limit import Deadline, format_seconds
from formats.derivation import Location, UnreadableInput

DERIVATION_SUFFIXES = (".p", ".s", ".out", ".tptp", ".proof", ".jsonl")
"""what a directory given to a batch is searched for"""

PROBLEM_SUFFIXES = (".p", ".tptp")


@dataclass(frozen=True, slots=True)
class Batch:
    """A batch's results, in the order its files were found."""

    results: tuple[FileResult, ...]
    seconds: float

    @property
    def verdict(self) -> str:
        return worst([result.verdict for result in self.results])


def collect_derivations(arguments: Sequence[str], skip_dirs: Sequence[str] = ()) -> tuple[list[str], list[str]]:
    """The derivation files the arguments name, each once, in order, and
    the arguments that named nothing.  A path that names no file stays in
    the list, to be reported unreadable for itself."""
    skipped = [os.path.abspath(directory) + os.sep for directory in skip_dirs]
    found: list[str] = []
    unmatched: list[str] = []
    for argument in arguments:
        if os.path.isdir(argument):
            named = _derivations_in(argument)
        elif glob.has_magic(argument):
            named = sorted(path for path in glob.glob(argument, recursive=True) if not os.path.isdir(path))
        else:
            named = [argument]
        named = [path for path in named if not any(os.path.abspath(path).startswith(s) for s in skipped)]
        if not named:
            unmatched.append(argument)
        found.extend(named)
    seen: set[str] = set()
    unique = []
    for path in found:
        if os.path.abspath(path) not in seen:
            seen.add(os.path.abspath(path))
            unique.append(path)
    return unique, unmatched


def _derivations_in(directory: str) -> list[str]:
    found = []
    for root, directories, files in os.walk(directory):
        directories[:] = sorted(d for d in directories if not d.startswith("."))
        found.extend(
            os.path.join(root, name) for name in sorted(files)
            if name.endswith(DERIVATION_SUFFIXES) and not name.startswith(".")
        )
    return found


def read_problem_map(path: str) -> dict[str, str]:
    """The problem map: a JSON object from derivation (a path relative to
    the map, or a bare file name) to problem file (relative to the map).
    Raises UnreadableInput with the place of any fault."""
    try:
        with open(path, encoding="utf-8") as handle:
            text = handle.read()
    except OSError as error:
        raise UnreadableInput(f"cannot read: {error.strerror or error}", Location(path, 1, 1)) from None
    try:
        entries = json.loads(text)
    except json.JSONDecodeError as error:
        raise UnreadableInput(f"not JSON: {error.msg}", Location(path, error.lineno, error.colno)) from None
    if not isinstance(entries, dict) or not all(isinstance(v, str) for v in entries.values()):
        raise UnreadableInput("expected one JSON object from derivation to problem file name", Location(path, 1, 1))
    base = os.path.dirname(os.path.abspath(path))
    return {key: os.path.join(base, value) for key, value in entries.items()}


def problem_for(path: str, problem_map: dict[str, str], problems_dir: str | None, map_base: str = "") -> str | None:
    """The problem a derivation is paired with before its ``file(...)``
    sources are looked at: by the map, else by name in the problems directory."""
    for key, problem in problem_map.items():
        if key == os.path.basename(path) or os.path.abspath(os.path.join(map_base, key)) == os.path.abspath(path):
            return problem
    if problems_dir is None:
        return None
    name = os.path.basename(path)
    while True:
        for suffix in PROBLEM_SUFFIXES:
            candidate = os.path.join(problems_dir, name + suffix)
            if os.path.isfile(candidate):
                return candidate
        name, dot, _ = name.rpartition(".")
        if not dot or not name:
            return None


def make_jobs(
    paths: Sequence[str],
    problems_dir: str | None = None,
    problem_map_path: str | None = None,
    include_dirs: Sequence[str] = (),
    limits: SearchLimits = DEFAULT_LIMITS,
    require_problem: bool = False,
    file_timeout: float | None = None,
) -> list[FileJob]:
    """One job per derivation, paired with its problem."""
    problem_map = read_problem_map(problem_map_path) if problem_map_path else {}
    map_base = os.path.dirname(os.path.abspath(problem_map_path)) if problem_map_path else ""
    searched = tuple(include_dirs) + ((problems_dir,) if problems_dir else ())
    reached = f"the file time limit of {format_seconds(file_timeout)} was reached" if file_timeout else ""
    return [
        FileJob(path, problem_for(path, problem_map, problems_dir, map_base), searched, limits, require_problem,
                file_timeout, reached)
        for path in paths
    ]


def run_batch(
    jobs: Sequence[FileJob],
    workers: int = 1,
    time_limit: float | None = None,
    cluster: str | None = None,
    on_result: Callable[[FileResult], None] | None = None,
) -> Batch:
    """Check every job, ``workers`` at a time (here, or on the Dask cluster
    at ``cluster``); files not started within ``time_limit`` seconds of the
    start are ``undecided``."""
    started = time.perf_counter()
    deadline = None if time_limit is None else Deadline.after(time_limit)
    if cluster is not None:
        from checker.cluster import check_on_cluster

        results = check_on_cluster(cluster, jobs, deadline, on_result)
    else:
        results = check_in_processes(jobs, workers, deadline=deadline, on_result=on_result)
    return Batch(tuple(results), time.perf_counter() - started)
