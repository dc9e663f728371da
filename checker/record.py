"""The check record: what to file with a safety case or a verification log,
and verifying it later.

A record ties the verdict to the exact bytes that were checked (SHA-256 of
the certificate, the problem and every file either includes) and to the
kernel that checked them (SHA-256 of each of its source files), keeps the
options the check ran with (problem, include directories, search and input
bounds, the whole-run time limit),
and states plainly what a checked proof does and does not show.

``verify_record`` recomputes every hash and re-runs the check with the
recorded options: the record holds when no file changed and every verdict
and step outcome (with its reason code) is the same.
"""

from __future__ import annotations

import hashlib
import json
import os
import platform
from dataclasses import asdict, dataclass, fields
from datetime import UTC, datetime
from importlib.metadata import PackageNotFoundError, version
from pathlib import Path

from checker import kernel
from checker.outcomes import UNDECIDED, Report
from checker.report import report_json
from checker.run import check
from checker.search.reconstruct import DEFAULT_LIMITS, SearchLimits
from formats.limits import DEFAULT_INPUT_LIMITS, InputLimits

RECORD_KIND = "assay check record"
RECORD_VERSION = 2
"""1: hashes and reports only; 2: adds the options, the working directory
and the kernel's sources, so that a record can be verified"""

SCOPE_STATEMENT = (
    "A checked proof shows that the conclusion follows from the axioms as written in the problem file "
    "identified above. It does not show that those axioms describe the real system, nor that the problem "
    "states the property that matters. This record supports, and does not replace, the review required by "
    "the applicable standards; defer to them and to qualified reviewers."
)

# Exit codes of `assay verify-record` (documented in README.md).
RECORD_HOLDS = 0
OUTCOME_DIFFERS = 1
RECORD_UNREADABLE = 2
RECORD_INTERNAL_ERROR = 4
FILE_CHANGED = 5
KERNEL_CHANGED = 6


def _sha256(path: str | None) -> str | None:
    if path is None:
        return None
    try:
        with open(path, "rb") as handle:
            return hashlib.file_digest(handle, "sha256").hexdigest()
    except OSError:
        return None


def _assay_version() -> str:
    try:
        return version("assay")
    except PackageNotFoundError:
        return "unknown"


def kernel_sources() -> list[dict]:
    """Every source file of the trusted kernel with its SHA-256, by its
    path from the project root (``checker/kernel/rules.py``)."""
    folder = Path(kernel.__file__).parent
    return [
        {"path": f"checker/kernel/{source.name}", "sha256": _sha256(str(source))}
        for source in sorted(folder.glob("*.py"))
    ]


@dataclass(frozen=True, slots=True)
class CheckOptions:
    """The options a check ran with, as the record keeps them."""

    problem: str | None = None
    include_dirs: tuple[str, ...] = ()
    limits: SearchLimits = DEFAULT_LIMITS
    jobs: int = 1
    require_problem: bool = False
    input_limits: InputLimits = DEFAULT_INPUT_LIMITS
    time_limit: float | None = None
    """seconds; kept to explain an ``undecided`` outcome, never re-applied
    (wall-clock time is not reproducible)"""


def check_record(reports: list[Report], limits: SearchLimits, options: CheckOptions | None = None) -> dict:
    options = options or CheckOptions(limits=limits)
    return {
        "record": RECORD_KIND,
        "record_version": RECORD_VERSION,
        "scope": SCOPE_STATEMENT,
        "assay_version": _assay_version(),
        "python": platform.python_version(),
        "checked_at": datetime.now(UTC).isoformat(timespec="seconds"),
        "working_directory": os.getcwd(),
        "search_limits": asdict(limits),
        "options": {
            "problem": options.problem,
            "include_dirs": list(options.include_dirs),
            "tptp_directory": os.environ.get("TPTP"),
            "require_problem": options.require_problem,
            "jobs": options.jobs,
            "input_limits": asdict(options.input_limits),
            "time_limit": options.time_limit,
        },
        "kernel_sources": kernel_sources(),
        "files": [
            {
                "certificate": report.path,
                "certificate_sha256": _sha256(report.path),
                "problem": report.problem,
                "problem_sha256": _sha256(report.problem),
                "files_read": [{"path": read, "sha256": _sha256(read)} for read in dict.fromkeys(report.files)],
                "report": report_json(report),
            }
            for report in reports
        ],
    }


class UnreadableRecord(Exception):
    """The record is not JSON, or not a check record this version can verify."""


@dataclass(frozen=True, slots=True)
class RecordCheck:
    """What verifying a record found: the files whose bytes changed (or are
    gone), the kernel sources that changed, and where the re-check differs."""

    changed_files: tuple[str, ...]
    changed_kernel: tuple[str, ...]
    differences: tuple[str, ...]
    verdicts: tuple[str, ...]
    """the re-check's verdict for each certificate, in the record's order"""

    @property
    def holds(self) -> bool:
        return not (self.changed_files or self.changed_kernel or self.differences)

    @property
    def exit_code(self) -> int:
        if self.changed_files:
            return FILE_CHANGED
        if self.changed_kernel:
            return KERNEL_CHANGED
        return OUTCOME_DIFFERS if self.differences else RECORD_HOLDS


def read_record(path: str) -> dict:
    try:
        with open(path, encoding="utf-8") as handle:
            record = json.load(handle)
    except OSError as error:
        raise UnreadableRecord(f"{path}: cannot read: {error.strerror or error}") from None
    except (json.JSONDecodeError, UnicodeDecodeError) as error:
        raise UnreadableRecord(f"{path}: not a JSON check record ({error})") from None
    if not isinstance(record, dict) or record.get("record") != RECORD_KIND:
        raise UnreadableRecord(f"{path}: not an assay check record")
    if record.get("record_version") != RECORD_VERSION:
        raise UnreadableRecord(
            f"{path}: record version {record.get('record_version', 1)} cannot be verified "
            f"(it lacks the options and kernel hashes; version {RECORD_VERSION} has them)"
        )
    for key in ("working_directory", "search_limits", "options", "kernel_sources", "files"):
        if key not in record:
            raise UnreadableRecord(f"{path}: the record has no `{key}`")
    return record


def _limits(recorded: dict, path: str) -> SearchLimits:
    known = {field.name for field in fields(SearchLimits)}
    unknown = set(recorded) - known
    if unknown or not all(isinstance(v, int) for v in recorded.values()):
        raise UnreadableRecord(f"{path}: search limits this assay does not know: {', '.join(sorted(unknown))}")
    return SearchLimits(**recorded)


def _input_limits(options: dict, path: str) -> InputLimits:
    """The recorded input bounds; a record written before they were kept
    was read with the defaults."""
    recorded = options.get("input_limits", {})
    known = {field.name for field in fields(InputLimits)}
    unknown = set(recorded) - known
    if unknown or not all(isinstance(v, int) for v in recorded.values()):
        raise UnreadableRecord(f"{path}: input limits this assay does not know: {', '.join(sorted(unknown))}")
    return InputLimits(**recorded)


def _outcomes(report: dict) -> dict[str, tuple[str, str | None]]:
    found: dict[str, tuple[str, str | None]] = {}
    for step in report.get("steps", []):
        found.setdefault(step["name"], (step["outcome"], step.get("reason")))
    return found


def _describe(outcome: tuple[str, str | None]) -> str:
    return outcome[0] + (f" ({outcome[1]})" if outcome[1] else "")


def compare_reports(certificate: str, recorded: dict, now: dict) -> list[str]:
    """Where the re-check's report differs from the recorded one: the
    verdict, and each step's outcome and reason code."""
    differences = []
    if recorded.get("verdict") != now["verdict"]:
        differences.append(f"{certificate}: verdict recorded {recorded.get('verdict')}, now {now['verdict']}")
    before, after = _outcomes(recorded), _outcomes(now)
    for name, outcome in before.items():
        if name not in after:
            differences.append(f"{certificate}: step {name}: recorded {_describe(outcome)}, now absent")
        elif after[name] != outcome:
            differences.append(
                f"{certificate}: step {name}: recorded {_describe(outcome)}, now {_describe(after[name])}"
            )
    for name, outcome in after.items():
        if name not in before:
            differences.append(f"{certificate}: step {name}: not in the record, now {_describe(outcome)}")
    return differences


def verify_record(path: str, base_dir: str | None = None) -> RecordCheck:
    """Recompute every hash the record holds and re-run each check with the
    recorded options.  Relative paths are taken from ``base_dir`` (default:
    the directory the check ran in).  A recorded time limit is not applied
    again; a difference is then flagged as possibly due to it."""
    record = read_record(path)
    base = base_dir or record["working_directory"]
    options = record["options"]
    limits = _limits(record["search_limits"], path)
    input_limits = _input_limits(options, path)
    time_limit = options.get("time_limit")

    def here(name: str) -> str:
        return os.path.join(base, name)

    changed_files: list[str] = []
    for entry in record["files"]:
        for read in entry.get("files_read", []):
            if _sha256(here(read["path"])) != read["sha256"]:
                changed_files.append(read["path"])
        for name, digest in ((entry.get("certificate"), entry.get("certificate_sha256")),
                             (entry.get("problem"), entry.get("problem_sha256"))):
            if name and name not in changed_files and _sha256(here(name)) != digest:
                changed_files.append(name)
    current = {source["path"]: source["sha256"] for source in kernel_sources()}
    recorded_kernel = {source["path"]: source["sha256"] for source in record["kernel_sources"]}
    changed_kernel = sorted(name for name in current.keys() | recorded_kernel.keys()
                            if current.get(name) != recorded_kernel.get(name))

    differences: list[str] = []
    verdicts: list[str] = []
    include_dirs = [here(d) for d in options.get("include_dirs", [])]
    if options.get("tptp_directory"):
        include_dirs.append(here(options["tptp_directory"]))
    for entry in record["files"]:
        problem = options.get("problem")
        report = check(
            here(entry["certificate"]),
            here(problem) if problem else None,
            include_dirs,
            limits,
            1,
            bool(options.get("require_problem")),
            input_limits=input_limits,
        )
        now = report_json(report)
        verdicts.append(f"{entry['certificate']}: {now['verdict']}")
        found = compare_reports(entry["certificate"], entry["report"], now)
        if found and time_limit is not None and entry["report"].get("verdict") == UNDECIDED:
            found = [f"{line} (the recorded check ran under a time limit of {time_limit:g} s)" for line in found]
        differences.extend(found)
        read_now = [os.path.normpath(f) for f in now["files_read"]]
        read_then = [os.path.normpath(here(read["path"])) for read in entry.get("files_read", [])]
        if read_now != read_then and not changed_files:
            differences.append(f"{entry['certificate']}: the re-check read other files: " + ", ".join(
                os.path.relpath(f, base) for f in read_now))
    return RecordCheck(tuple(dict.fromkeys(changed_files)), tuple(changed_kernel), tuple(differences), tuple(verdicts))


def render_record_check(path: str, found: RecordCheck) -> str:
    if found.holds:
        holds = (f"{path}: the record holds: no checked file and no kernel source changed, and the re-check "
                 "with the recorded options gives the recorded outcomes")
        return "\n".join([holds, *(f"  {verdict}" for verdict in found.verdicts)])
    lines = [f"{path}: the record does not hold"]
    lines.extend(f"  changed: {name}" for name in found.changed_files)
    lines.extend(f"  kernel source changed: {name}" for name in found.changed_kernel)
    lines.extend(f"  outcome differs: {difference}" for difference in found.differences)
    return "\n".join(lines)
