"""Every valid derivation and every mutant among the fixtures, checked:
verdicts and times per folder, and any valid step reported `refuted`.

Prints figures, asserts nothing.  Usage:
    python3 bench/bench_fixture_survey.py [FOLDER ...]   (default: fixtures/tptp)
"""

from __future__ import annotations

import sys
import time
from collections import Counter, defaultdict
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from checker.outcomes import ACCEPTED, REFUTED  # noqa: E402
from checker.run import check  # noqa: E402


def derivations(folders: list[Path]) -> list[tuple[Path, Path | None]]:
    """(derivation, problem) for every proof*.p and mutant_*.p with a problem.p beside it."""
    found = []
    for folder in folders:
        for path in sorted(folder.rglob("*.p")):
            if path.name.startswith(("proof", "mutant_")):
                problem = path.with_name("problem.p")
                found.append((path, problem if problem.is_file() else None))
    return found


def main() -> None:
    folders = [Path(a) for a in sys.argv[1:]] or [ROOT / "fixtures" / "tptp"]
    verdicts: dict[str, Counter] = defaultdict(Counter)
    seconds: dict[str, float] = defaultdict(float)
    surprises = []
    for path, problem in derivations(folders):
        kind = "mutant" if path.name.startswith("mutant_") else "valid"
        group = f"{path.relative_to(ROOT).parts[2] if len(path.relative_to(ROOT).parts) > 3 else path.parent.name} ({kind})"
        start = time.perf_counter()
        report = check(str(path), str(problem) if problem else None)
        seconds[group] += time.perf_counter() - start
        verdicts[group][report.verdict] += 1
        if kind == "valid" and report.verdict != ACCEPTED:
            surprises.append(f"{path.relative_to(ROOT)}: {report.verdict}: "
                             f"{report.first_failure.message if report.first_failure else report.error}")
        if kind == "valid" and any(step.outcome == REFUTED for step in report.steps):
            surprises.append(f"{path.relative_to(ROOT)}: a valid derivation has a refuted step")
        if kind == "mutant" and report.verdict == ACCEPTED:
            surprises.append(f"{path.relative_to(ROOT)}: mutant ACCEPTED")
    print(f"{'folder':45} {'files':>5} {'seconds':>8}  verdicts")
    for group in sorted(verdicts):
        count = sum(verdicts[group].values())
        tally = ", ".join(f"{n} {v}" for v, n in sorted(verdicts[group].items()))
        print(f"{group:45} {count:5} {seconds[group]:8.2f}  {tally}")
    print(f"\n{len(surprises)} surprise(s)")
    for line in surprises:
        print("  " + line)


if __name__ == "__main__":
    main()
