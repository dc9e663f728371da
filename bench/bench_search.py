"""Speed of the evidence search on generated steps: prints figures, asserts nothing.

Random but valid steps of every kind are built over an invented logistics
vocabulary (shipments, depots, routes) by the same builders the search
tests use, and each is reconstructed with the default limits.  Printed per
kind: steps per second, mean and maximum milliseconds per step, how many
were reconstructed and by what kind of evidence.  A last section times
invalid steps (where every bound is used up) and multi-inference steps
that need the refutation search.

    python3 bench/bench_search.py [steps-per-kind] [seed]
"""

from __future__ import annotations

import random
import sys
import time
from collections import Counter
from pathlib import Path

# The step builders live with the search tests; reuse them rather than copy.
sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests" / "search"))

from search_steps import BUILDERS, Builder, Signature  # noqa: E402

from checker.kernel.clauses import Clause, Literal  # noqa: E402
from checker.kernel.terms import application  # noqa: E402
from checker.search.reconstruct import reconstruct  # noqa: E402

LOGISTICS = Signature(
    constants=("depot_north", "depot_south", "hub", "truck7"),
    functions=(("next_stop", 1), ("route", 2), ("carrier", 1)),
    predicates=(("shipment", 1), ("at", 2), ("delayed", 1)),
    variables=("S", "D", "R"),
)


def _evidence_kind(found) -> str:
    return type(found.evidence).__name__ if found.evidence is not None else "none"


def _run(kind: str, steps: list) -> None:
    times, kinds = [], Counter()
    for step in steps:
        start = time.perf_counter()
        found = reconstruct(step.premises, step.claimed, step.kind)
        times.append(time.perf_counter() - start)
        kinds[_evidence_kind(found)] += 1
    total = sum(times)
    found_count = len(steps) - kinds.get("none", 0)
    print(
        f"{kind:22} {len(steps) / total:9.0f} steps/s  mean {1000 * total / len(steps):7.2f} ms  "
        f"max {1000 * max(times):7.2f} ms  found {found_count}/{len(steps)}  "
        + ", ".join(f"{name} {count}" for name, count in sorted(kinds.items()))
    )


def main() -> None:
    count = int(sys.argv[1]) if len(sys.argv) > 1 else 200
    seed = int(sys.argv[2]) if len(sys.argv) > 2 else 1
    rng = random.Random(seed)
    print(f"valid steps, {count} per kind, seed {seed}")
    for kind, build in BUILDERS.items():
        _run(kind, [build(Builder(rng, LOGISTICS)) for _ in range(count)])
    print("harder steps")
    chains = [BUILDERS["rewriting_chain"](Builder(rng, LOGISTICS)) for _ in range(count // 4)]
    long_chains = [
        __import__("search_steps").rewriting_chain_step(Builder(rng, LOGISTICS), rewrites=6) for _ in range(count // 4)
    ]
    _run("rewriting_chain", chains)
    _run("rewriting_chain x6", long_chains)
    never = Literal(True, application("never_shipped", (application("hub"),)))
    invalid = []
    for kind, build in BUILDERS.items():
        for _ in range(max(1, count // 20)):
            step = build(Builder(rng, LOGISTICS))
            invalid.append(type(step)(step.kind, step.premises, Clause([*step.claimed.literals[1:], never])))
    _run("invalid (bounds used)", invalid)


if __name__ == "__main__":
    main()
