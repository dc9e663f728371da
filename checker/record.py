"""The check record: what to file with a safety case or a verification log.

It ties the verdict to the exact bytes that were checked (SHA-256 of the
certificate, the problem and every file either includes), the assay
version and the search bounds, and
it states plainly what a checked proof does and does not show.
"""

from __future__ import annotations

import hashlib
import platform
from dataclasses import asdict
from datetime import datetime, timezone
from importlib.metadata import PackageNotFoundError, version

from checker.outcomes import Report
from checker.report import report_json
from checker.search.reconstruct import SearchLimits

SCOPE_STATEMENT = (
    "A checked proof shows that the conclusion follows from the axioms as written in the problem file "
    "identified above. It does not show that those axioms describe the real system, nor that the problem "
    "states the property that matters. This record supports, and does not replace, the review required by "
    "the applicable standards; defer to them and to qualified reviewers."
)


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


def check_record(reports: list[Report], limits: SearchLimits) -> dict:
    return {
        "record": "assay check record",
        "scope": SCOPE_STATEMENT,
        "assay_version": _assay_version(),
        "python": platform.python_version(),
        "checked_at": datetime.now(timezone.utc).isoformat(timespec="seconds"),
        "search_limits": asdict(limits),
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
