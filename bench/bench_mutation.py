"""The large mutation run: every single mutation of every valid fixture, checked.

Makes the mutants of tests/mutation/mutation_kinds.py from every valid
certificate of every shape, settles each one's expected answer
independently of assay (tests/mutation/mutation_oracle.py), checks it in
process, and prints by kind: false accepts (must be 0), a first failure
at another step, the mutated step left unproven with a later step failing,
false rejections of sound mutants, and accepted mutants the oracle could
not decide (listed for review).  Each outcome is also written as a JSON
line to --out, so a long run can be read while it goes.

Prints figures, asserts nothing.  Usage:
    python3 bench/bench_mutation.py [--jobs N] [--limit N] [--shape SHAPE] [--seed N] [--skip FILE] [--out FILE]
    python3 bench/bench_mutation.py --summarize FILE [--summarize FILE ...]
"""

from __future__ import annotations

import argparse
import json
import multiprocessing
import random
import sys
import time
from dataclasses import asdict
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path[:0] = [str(ROOT), str(ROOT / "tests" / "mutation")]

from mutation_harness import (
    ACCEPTED_UNDECIDED,
    FALSE_ACCEPT,
    FALSE_REJECTION,
    INTERNAL_ERROR,
    STATED_EVIDENCE_REJECTED,
    UNPROVEN_THEN_LATER,
    WRONG_STEP,
    Outcome,
    reading_once,
    reusing_checked_steps,
    run_mutant,
    tally,
    where_of,
)
from mutation_kinds import fixtures, mutants

from checker.search.reconstruct import DEFAULT_LIMITS

_CONTEXTS: list = []
_LIMITS = DEFAULT_LIMITS


def _start_worker(reuse: bool) -> None:
    global _CONTEXTS
    _CONTEXTS = [reading_once(), *([reusing_checked_steps()] if reuse else [])]
    for context in _CONTEXTS:
        context.__enter__()


def _run(mutant):
    return run_mutant(mutant, _LIMITS)


def interleaved(groups: list[list]) -> list:
    """One of each fixture's mutants in turn, so that a partial run covers every shape."""
    found = []
    for i in range(max(map(len, groups), default=0)):
        found.extend(group[i] for group in groups if i < len(group))
    return found


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--jobs", type=int, default=2)
    parser.add_argument("--limit", type=int, default=0, help="check only the first N mutants (interleaved)")
    parser.add_argument("--shape", action="append", help="only fixtures of this shape (repeatable)")
    parser.add_argument("--out", type=Path, default=Path("mutation_outcomes.jsonl"))
    parser.add_argument("--limits-scale", type=float, default=1.0, help="every search bound times this factor")
    parser.add_argument("--seed", type=int, help="shuffle each certificate's mutants with this seed (a partial run "
                        "then samples every part of each certificate, not its first statements)")
    parser.add_argument("--skip", type=Path, action="append", default=[],
                        help="leave out the mutants already in this earlier --out file (repeatable)")
    parser.add_argument("--no-reuse", action="store_true", help="check every step of every mutant afresh")
    parser.add_argument("--summarize", type=Path, action="append",
                        help="print the figures of earlier (perhaps partial) runs' --out files, together")
    options = parser.parse_args()
    if options.summarize:
        outcomes = []
        for path in options.summarize:
            with path.open(encoding="utf-8") as lines:
                outcomes += [Outcome(**json.loads(line)) for line in lines if line.strip()]
        print(f"{len(outcomes)} mutants (from {', '.join(map(str, options.summarize))})\n")
        summarize(outcomes)
        return
    global _LIMITS
    _LIMITS = DEFAULT_LIMITS.scaled(options.limits_scale) if options.limits_scale != 1.0 else DEFAULT_LIMITS
    chosen = [f for f in fixtures() if not options.shape or f.shape in options.shape]
    start = time.perf_counter()
    groups = [mutants(f) for f in chosen]
    if options.seed is not None:
        for group in groups:
            random.Random(f"{options.seed}:{group[0].fixture.path if group else ''}").shuffle(group)
    every = interleaved(groups)
    done = set()
    for earlier in options.skip:
        with earlier.open(encoding="utf-8") as lines:
            done |= {json.loads(line)["where"] for line in lines if line.strip()}
    every = [m for m in every if where_of(m) not in done]
    if options.limit:
        every = every[: options.limit]
    shapes = sorted({m.fixture.shape for m in every})
    print(f"search bounds x{options.limits_scale}; unchanged steps {'checked afresh' if options.no_reuse else 'reused'}")
    print(f"{len(every)} mutants of {len(chosen)} certificates ({', '.join(shapes)}), "
          f"made in {time.perf_counter() - start:.1f} s", flush=True)
    outcomes = []
    with options.out.open("w", encoding="utf-8") as out, multiprocessing.get_context("fork").Pool(
        options.jobs, initializer=_start_worker, initargs=(not options.no_reuse,)
    ) as pool:
        for n, outcome in enumerate(pool.imap_unordered(_run, every, chunksize=8), start=1):
            outcomes.append(outcome)
            out.write(json.dumps(asdict(outcome)) + "\n")
            if n % 500 == 0:
                out.flush()
                print(f"  {n} checked, {time.perf_counter() - start:.0f} s", flush=True)
    seconds = time.perf_counter() - start
    print(f"\n{len(outcomes)} mutants in {seconds:.0f} s ({len(outcomes) / seconds:.1f} mutants/s, {options.jobs} jobs)\n")
    summarize(outcomes)


def summarize(outcomes: list[Outcome]) -> None:
    print(tally(outcomes))
    by_shape: dict[str, int] = {}
    for outcome in outcomes:
        by_shape[outcome.shape] = by_shape.get(outcome.shape, 0) + 1
    print("\nby shape: " + ", ".join(f"{shape} {n}" for shape, n in sorted(by_shape.items())))
    for judgement in (FALSE_ACCEPT, INTERNAL_ERROR, FALSE_REJECTION, WRONG_STEP, UNPROVEN_THEN_LATER,
                      STATED_EVIDENCE_REJECTED, ACCEPTED_UNDECIDED):
        listed = [o for o in outcomes if o.judgement == judgement]
        if listed:
            print(f"\n{judgement} ({len(listed)}):")
            for o in sorted(listed, key=lambda o: o.where)[:40]:
                print(f"  {o.kind:24} {o.where}: {o.verdict}, first failure {o.first_step}")


if __name__ == "__main__":
    main()
