"""Problems of our own whose refutations are long (hundreds to thousands of
inferences), for the derivations in fixtures/tptp/prover_corpus/large/.

Each problem is a theorem by construction (said beside each writer), in an
invented scenario:

- ``crate_bays_pigeonhole``: six crates, five bays, no two crates in one
  bay (the pigeonhole principle; its resolution refutations are known to
  grow exponentially with the size, so five bays already take thousands
  of steps);
- ``conveyor_hub_reachability``: a corridor of hubs with spur links, and
  routes closed under following a link;
- ``valve_chain_skolem``: every valve of stage k feeds some valve of stage
  k+1 (a chain of existentials, so Skolem terms nest hundreds deep);
- ``pump_trip_interlock``: a trip spreads along pumps that are not
  bypassed, a bypass needs a key no pump has, and a tripped monitored pump
  raises an alarm;
- ``maintenance_order_cycle``: a transitive, irreflexive order on tasks
  cannot close a cycle;
- ``storage_level_meets``: meets of a chain of storage levels (a
  semilattice: commutative, associative, idempotent);
- ``tally_counter_squares``: a tally counter's successor arithmetic
  computes six times six.

The derivations stored beside each problem are what a saturation prover
printed for it in its automatic mode with proof objects (the text between
its proof markers, kept as printed).

Run: python3 bench/large_problems.py DIRECTORY   (writes DIRECTORY/NAME/problem.p)
"""

from __future__ import annotations

import argparse
import random
from pathlib import Path


def crate_bays_pigeonhole(bays: int = 5) -> list[str]:
    """Unsatisfiable: each of bays+1 crates is in some bay, no bay holds two."""
    lines = [f"cnf(placed{c}, axiom, " + " | ".join(f"in(crate{c}, bay{b})" for b in range(bays)) + ")."
             for c in range(bays + 1)]
    clash = 0
    for b in range(bays):
        for c in range(bays + 1):
            for d in range(c + 1, bays + 1):
                lines.append(f"cnf(clash{clash}, axiom, ~in(crate{c}, bay{b}) | ~in(crate{d}, bay{b})).")
                clash += 1
    return lines


def conveyor_hub_reachability(hubs: int = 400, spurs: int = 60) -> list[str]:
    """A theorem: hub0 links to hub1 ... to hub{hubs}, so a route joins the ends."""
    pick = random.Random(7)
    lines = ["fof(extend, axiom, ![X, Y, Z]: ((route(X, Y) & link(Y, Z)) => route(X, Z))).",
             "fof(direct, axiom, ![X, Y]: (link(X, Y) => route(X, Y)))."]
    lines += [f"fof(link{i}, axiom, link(hub{i}, hub{i + 1}))." for i in range(hubs)]
    lines += [f"fof(spur{j}, axiom, link(spur{j}, hub{pick.randrange(hubs)}))." for j in range(spurs)]
    lines.append(f"fof(ends_joined, conjecture, route(hub0, hub{hubs})).")
    return lines


def valve_chain_skolem(stages: int = 400) -> list[str]:
    """A theorem: from the inlet, some valve of each stage is reached in turn."""
    lines = ["fof(inlet_valve, axiom, valve0(inlet))."]
    lines += [f"fof(feeds{k}, axiom, ![X]: (valve{k}(X) => ?[Y]: (pipe(X, Y) & valve{k + 1}(Y))))."
              for k in range(stages)]
    lines.append(f"fof(outlet, conjecture, ?[Y]: valve{stages}(Y)).")
    return lines


def pump_trip_interlock(pumps: int = 300) -> list[str]:
    """A theorem: pump0 trips, no pump is keyed so none is bypassed, the
    trip reaches the last pump, which is monitored."""
    lines = ["fof(trip_spreads, axiom, ![X, Y]: ((tripped(X) & feeds(X, Y) & ~bypassed(Y)) => tripped(Y))).",
             "fof(alarm, axiom, ![X]: ((tripped(X) & monitored(X)) => alarm(X))).",
             "fof(bypass_needs_key, axiom, ![X]: (bypassed(X) => keyed(X))).",
             "cnf(trip0, axiom, tripped(pump0))."]
    for i in range(pumps):
        lines.append(f"cnf(feed{i}, axiom, feeds(pump{i}, pump{i + 1})).")
        lines.append(f"cnf(unkeyed{i + 1}, axiom, ~keyed(pump{i + 1})).")
    lines += [f"cnf(monitor{i}, axiom, monitored(pump{i}))." for i in range(0, pumps, 7)]
    lines.append(f"cnf(monitor_last, axiom, monitored(pump{pumps})).")
    lines.append(f"fof(last_alarm, conjecture, alarm(pump{pumps})).")
    return lines


def maintenance_order_cycle(tasks: int = 250) -> list[str]:
    """A theorem: task0 comes before the last, so the last cannot come before task0."""
    lines = ["fof(before_trans, axiom, ![X, Y, Z]: ((before(X, Y) & before(Y, Z)) => before(X, Z))).",
             "fof(before_irrefl, axiom, ![X]: ~before(X, X))."]
    lines += [f"cnf(order{i}, axiom, before(task{i}, task{i + 1}))." for i in range(tasks)]
    lines.append(f"fof(no_cycle, conjecture, ~before(task{tasks}, task0)).")
    return lines


def storage_level_meets(levels: int = 200) -> list[str]:
    """Unsatisfiable: each level is below the next, so level0 is below the last."""
    lines = ["cnf(meet_comm, axiom, meet(X, Y) = meet(Y, X)).",
             "cnf(meet_assoc, axiom, meet(meet(X, Y), Z) = meet(X, meet(Y, Z))).",
             "cnf(meet_idem, axiom, meet(X, X) = X)."]
    lines += [f"cnf(below{i}, axiom, meet(level{i}, level{i + 1}) = level{i})." for i in range(levels)]
    lines.append(f"cnf(goal, negated_conjecture, meet(level0, level{levels}) != level0).")
    return lines


def tally_counter_squares(count: int = 6) -> list[str]:
    """Unsatisfiable: the recursion equations compute count * count."""
    def numeral(n: int) -> str:
        text = "zero"
        for _ in range(n):
            text = f"succ({text})"
        return text

    return ["cnf(plus_zero, axiom, plus(X, zero) = X).",
            "cnf(plus_succ, axiom, plus(X, succ(Y)) = succ(plus(X, Y))).",
            "cnf(times_zero, axiom, times(X, zero) = zero).",
            "cnf(times_succ, axiom, times(X, succ(Y)) = plus(times(X, Y), X)).",
            f"cnf(goal, negated_conjecture, times({numeral(count)}, {numeral(count)}) != {numeral(count * count)})."]


PROBLEMS = {writer.__name__: writer for writer in (
    crate_bays_pigeonhole, conveyor_hub_reachability, valve_chain_skolem, pump_trip_interlock,
    maintenance_order_cycle, storage_level_meets, tally_counter_squares)}


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("directory", type=Path)
    options = parser.parse_args()
    for name, writer in PROBLEMS.items():
        folder = options.directory / name
        folder.mkdir(parents=True, exist_ok=True)
        (folder / "problem.p").write_text("\n".join(writer()) + "\n")
        print(folder / "problem.p")


if __name__ == "__main__":
    main()
