"""Random byte edits of the valid fixtures, checked end to end, each in a
process of its own with a time and memory bound.

Every edited derivation must end in a verdict or in a clear unreadable
error with file:line:column; a traceback, an internal error, a crash of
the process or a run past the time bound is a finding.  Prints the counts
by outcome and every finding (seed, file, edits, what happened), so a
finding can be replayed with --replay SEED.  Figures only; nothing is
asserted.

Run: python3 bench/fuzz_byte_edits.py [--runs N] [--seed S] [--timeout SECONDS]
     [--slow SECONDS] [--replay SEED] [--cli-every K]
"""

from __future__ import annotations

import argparse
import json
import multiprocessing
import os
import random
import re
import resource
import shutil
import subprocess
import sys
import tempfile
import time
from collections import Counter
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from checker.outcomes import INTERNAL_ERROR, UNREADABLE  # noqa: E402
from checker.run import check  # noqa: E402
from checker.search.reconstruct import DEFAULT_LIMITS  # noqa: E402

FIXTURES = ROOT / "fixtures"
LOCATED = re.compile(r"^.+:\d+:\d+: ", re.MULTILINE)
MEMORY_BOUND = 2 * 1024**3
PIECES = [b"(", b")", b",", b".", b"[", b"]", b"~", b"|", b"&", b"=", b"!=", b"X", b"a", b"'", b'"', b"{", b"}",
          b":", b"$false", b"\n", b"%", b"/*", b"=>", b"<=>", b"!", b"?", b"@", b"$", b"\\", b"\xff", b"\xc3",
          b"inference(", b"cnf(", b"fof(", b"include('", b"\t", b"0", b"-1", b"1e999", b"null", b"true"]


def candidates() -> list[Path]:
    """Every valid derivation and certificate among the fixtures (mutants
    and problems aside: they are edited through the derivations that use
    them, and their own edits are just more of the same)."""
    found = []
    for path in sorted(FIXTURES.rglob("*")):
        if not path.is_file() or path.name.startswith("mutant") or "problem" in path.name:
            continue
        if path.suffix in (".p", ".jsonl", ".txt"):
            found.append(path)
    return found


def edit(data: bytes, rng: random.Random) -> tuple[bytes, list[str]]:
    """One to three random edits: insert a byte or a token, delete, duplicate
    or overwrite a run, replace a word by another of the file, swap two lines."""
    done = []
    for _ in range(rng.randint(1, 3)):
        at = rng.randrange(len(data) + 1)
        kind = rng.randrange(7)
        if kind == 0:
            piece = rng.choice(PIECES)
            data, what = data[:at] + piece + data[at:], f"insert {piece!r} at {at}"
        elif kind == 1:
            piece = bytes([rng.randrange(256)])
            data, what = data[:at] + piece + data[at:], f"insert {piece!r} at {at}"
        elif kind == 2:
            length = rng.randint(1, 12)
            data, what = data[:at] + data[at + length:], f"delete {length} at {at}"
        elif kind == 3:
            length = rng.randint(1, 40)
            data, what = data[:at] + data[at:at + length] * 2 + data[at + length:], f"duplicate {length} at {at}"
        elif kind == 4 and data:
            at = min(at, len(data) - 1)
            piece = bytes([rng.randrange(256)])
            data, what = data[:at] + piece + data[at + 1:], f"overwrite {piece!r} at {at}"
        elif kind == 5:
            words = re.findall(rb"[A-Za-z_$][A-Za-z0-9_]*", data)
            if words:
                old, new = rng.choice(words), rng.choice(words)
                data, what = data.replace(old, new, 1), f"first {old!r} -> {new!r}"
            else:
                what = "no word to replace"
        else:
            lines = data.split(b"\n")
            first, second = rng.randrange(len(lines)), rng.randrange(len(lines))
            lines[first], lines[second] = lines[second], lines[first]
            data, what = b"\n".join(lines), f"swap lines {first + 1} and {second + 1}"
        done.append(what)
    return data, done


def _child(path: str, problem: str | None, queue) -> None:
    resource.setrlimit(resource.RLIMIT_AS, (MEMORY_BOUND, MEMORY_BOUND))
    report = check(path, problem, limits=DEFAULT_LIMITS)
    queue.put((report.verdict, report.error or ""))


def run_in_process(path: str, problem: str | None, timeout: float) -> tuple[str, str, float]:
    """(outcome, detail, seconds): a verdict, or ``crash`` / ``hang``."""
    context = multiprocessing.get_context("fork")
    queue = context.Queue()
    started = time.perf_counter()
    process = context.Process(target=_child, args=(path, problem, queue))
    process.start()
    process.join(timeout)
    seconds = time.perf_counter() - started
    if process.is_alive():
        process.kill()
        process.join()
        return "hang", f"no answer within {timeout:.0f} s", seconds
    if queue.empty():
        return "crash", f"process ended with code {process.exitcode}", seconds
    verdict, error = queue.get()
    if verdict == INTERNAL_ERROR:
        return "crash", error, seconds
    if verdict == UNREADABLE and not LOCATED.search(error):
        return "unlocated", error, seconds
    return verdict, "", seconds


def run_cli(path: str, problem: str | None, timeout: float) -> tuple[str, str, float]:
    command = [sys.executable, "-m", "checker", "check", path, "--report", "json"]
    if problem:
        command += ["--problem", problem]
    started = time.perf_counter()
    try:
        done = subprocess.run(command, capture_output=True, text=True, timeout=timeout, cwd=ROOT)
    except subprocess.TimeoutExpired:
        return "hang", f"no answer within {timeout:.0f} s", time.perf_counter() - started
    seconds = time.perf_counter() - started
    if "Traceback" in done.stderr or done.returncode not in (0, 1, 2, 3):
        return "crash", f"exit {done.returncode}: {done.stderr[-800:]}", seconds
    try:
        json.loads(done.stdout)
    except ValueError:
        return "crash", f"exit {done.returncode}: not JSON on stdout: {done.stdout[:200]!r}", seconds
    return f"exit {done.returncode}", "", seconds


def problem_for(path: Path) -> Path | None:
    for name in ("problem.p", path.name.replace("_refutation", "_problem"), "interlock_problem.p"):
        candidate = path.with_name(name)
        if candidate != path and candidate.is_file():
            return candidate
    return None


def trial(seed: int, sources: list[Path], timeout: float, use_cli: bool) -> dict:
    rng = random.Random(seed)
    source = rng.choice(sources)
    problem = problem_for(source)
    edit_problem = problem is not None and rng.random() < 0.15
    target = problem if edit_problem else source
    data, edits = edit(target.read_bytes(), rng)
    with tempfile.TemporaryDirectory(prefix="assay-fuzz-") as scratch:
        copy = Path(scratch) / "case"
        shutil.copytree(source.parent, copy)
        (copy / target.name).write_bytes(data)
        path = str(copy / source.name)
        problem_path = str(copy / problem.name) if problem else None
        runner = run_cli if use_cli else run_in_process
        outcome, detail, seconds = runner(path, problem_path, timeout)
        if outcome in ("crash", "hang", "unlocated"):
            keep = ROOT / "bench" / "findings"
            keep.mkdir(exist_ok=True)
            shutil.copytree(copy, keep / f"seed{seed}", dirs_exist_ok=True)
    return {"seed": seed, "file": str(source.relative_to(ROOT)), "edited": target.name, "edits": edits,
            "outcome": outcome, "detail": detail, "seconds": seconds, "cli": use_cli}


def quick_sources(sources: list[Path], slow: float) -> list[Path]:
    """The fixtures whose own check answers within ``slow`` seconds."""
    cache = Path(tempfile.gettempdir()) / f"assay-fuzz-quick-{slow:g}.txt"
    if cache.is_file():
        return [ROOT / line for line in cache.read_text().split()]
    quick = []
    for source in sources:
        problem = problem_for(source)
        outcome, _, seconds = run_in_process(str(source), str(problem) if problem else None, slow)
        if outcome != "hang":
            quick.append(source)
    cache.write_text("\n".join(str(path.relative_to(ROOT)) for path in quick))
    return quick


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--runs", type=int, default=300)
    parser.add_argument("--seed", type=int, default=1)
    parser.add_argument("--timeout", type=float, default=60.0, help="per edited file, seconds")
    parser.add_argument("--slow", type=float, default=5.0, help="leave out fixtures whose own check takes longer")
    parser.add_argument("--cli-every", type=int, default=25, help="every K-th trial goes through the command line")
    parser.add_argument("--replay", type=int, help="run one seed and print its outcome")
    options = parser.parse_args()

    sources = candidates()
    started = time.perf_counter()
    sources = quick_sources(sources, options.slow)
    print(f"{len(sources)} fixtures under {options.slow:.0f} s each "
          f"(baseline {time.perf_counter() - started:.0f} s); timeout {options.timeout:.0f} s per edited file")
    seeds = [options.replay] if options.replay is not None else range(options.seed, options.seed + options.runs)
    outcomes: Counter[str] = Counter()
    findings = []
    slowest = (0.0, None)
    for count, seed in enumerate(seeds, 1):
        result = trial(seed, sources, options.timeout, options.cli_every > 0 and count % options.cli_every == 0)
        outcomes[result["outcome"]] += 1
        slowest = max(slowest, (result["seconds"], seed))
        if result["outcome"] in ("crash", "hang", "unlocated") or options.replay is not None:
            findings.append(result)
            print(json.dumps(result), flush=True)
        if count % 100 == 0:
            print(f"... {count} trials: {dict(outcomes)}", flush=True)
    total = sum(outcomes.values())
    print(f"{total} edited derivations in {time.perf_counter() - started:.0f} s (under load from other work)")
    for outcome, number in sorted(outcomes.items()):
        print(f"  {outcome:12} {number:6}")
    print(f"findings (crash, hang, unlocated error): {len(findings) if options.replay is None else 0}; "
          f"slowest trial {slowest[0]:.1f} s (seed {slowest[1]})")


if __name__ == "__main__":
    main()
