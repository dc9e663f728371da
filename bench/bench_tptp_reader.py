"""Throughput of the TPTP reader on a synthetic logistics derivation.

Prints statements per second and MB per second at 1x and 10x size, and the
peak memory of each read (tracemalloc).  Figures only; nothing is asserted.
Run: python3 bench/bench_tptp_reader.py [base_statements]
"""

from __future__ import annotations

import random
import sys
import time
import tracemalloc

from formats.tptp import parse_tptp

DEPOTS = ["harbour", "airfield", "rail_yard", "cold_store", "hub_north", "hub_south"]
GOODS = ["pallet", "crate", "drum", "container", "parcel"]
TRUCKS = ["truck_a", "truck_b", "van_c", "lorry_d"]


def _term(rng: random.Random, depth: int) -> str:
    if depth == 0 or rng.random() < 0.3:
        return rng.choice(["X", "Y", "Z", rng.choice(DEPOTS), rng.choice(GOODS)])
    return f"next_stop({_term(rng, depth - 1)},{_term(rng, depth - 1)})"


def _literal(rng: random.Random) -> str:
    kind = rng.randrange(4)
    if kind == 0:
        return f"{_term(rng, 2)} = {_term(rng, 2)}"
    if kind == 1:
        return f"{_term(rng, 2)} != {rng.choice(DEPOTS)}"
    sign = "~" if kind == 2 else ""
    return f"{sign}loaded_at({rng.choice(TRUCKS)},{_term(rng, 3)},{rng.choice(GOODS)})"


def synthetic_derivation(statements: int, seed: int = 7) -> str:
    """Axioms, fof routing rules and cnf inference steps with parents."""
    rng = random.Random(seed)
    lines = ["% synthetic logistics derivation", "Planner log: routing started"]
    for index in range(statements):
        name = f"step_{index}"
        if index < 10 or index % 7 == 0:
            body = (
                f"! [X,Y] : (loaded_at({rng.choice(TRUCKS)},X,Y) => "
                f"(? [Z] : (route(X,Z) & ~ blocked(Z)) | X = {rng.choice(DEPOTS)}))"
            )
            lines.append(f"fof({name}, axiom, {body}, file('depots.p', {name})).")
        else:
            clause = " | ".join(_literal(rng) for _ in range(rng.randint(1, 5)))
            parents = ", ".join(f"step_{rng.randrange(index)}" for _ in range(2))
            lines.append(
                f"cnf({name}, plain, {clause}, "
                f"inference(resolution, [status(thm)], [{parents}]))."
            )
    return "\n".join(lines) + "\n"


def measure(statements: int) -> None:
    """Time one read, then read again under tracemalloc for the peak memory
    (tracing slows the reader, so the two are kept apart)."""
    text = synthetic_derivation(statements)
    megabytes = len(text.encode()) / 1e6
    started = time.perf_counter()
    document = parse_tptp(text, "synthetic.p")
    elapsed = time.perf_counter() - started
    tracemalloc.start()
    parse_tptp(text, "synthetic.p")
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    count = len(document.statements)
    print(
        f"{count:>7} statements  {megabytes:7.2f} MB  {elapsed:7.2f} s  "
        f"{count / elapsed:9.0f} statements/s  {megabytes / elapsed:6.2f} MB/s  "
        f"peak {peak / 1e6:7.1f} MB"
    )


def main() -> None:
    base = int(sys.argv[1]) if len(sys.argv) > 1 else 1000
    for factor in (1, 10):
        measure(base * factor)


if __name__ == "__main__":
    main()
