"""Large valid derivations of our own, for the benchmarks: a problem, the
derivation in TPTP (with ``bind(...)`` evidence on single inferences) and
the same derivation as a native certificate (every clause step with its
full evidence).

A derivation is a sequence of independent *blocks*, each on symbols of its
own (suffixed by the block number), cycling through five kinds until the
wanted number of steps is reached; the last block refutes the problem.
Every step is valid by construction:

- ``horn``: a parcel hops depot to depot, one binary resolution per hop;
- ``rewriting``: a long demodulation chain (``stage_i(X) = stage_{i+1}(X)``
  applied one equation per step), then one bundled step that removes a
  dozen ``wrap`` layers with one equation and resolves the result against
  a unit (a step that hides a dozen rewrites and a subsumption);
- ``wide``: clauses of 3 to 8 literals carried through resolutions;
- ``skolem``: a formula with an ``! [X] : ? [Y]`` prefix Skolemized, then
  put in clause form;
- ``split``: a clause split into components named by split symbols, each
  closed, and the propositional refutation of the split clause.

Scenario: a logistics network (depots, parcels, crates, dispatch stages).
Nothing here is stored in git: derivations are generated at run time.

Run: python3 bench/generate.py STEPS DIRECTORY [--kinds horn,rewriting,...]
"""

from __future__ import annotations

import argparse
import json
import os
from collections.abc import Callable
from dataclasses import dataclass, field

KINDS = ("horn", "rewriting", "wide", "skolem", "split")
BLOCK_LENGTH = 20
BUNDLED_REWRITES = 12
PROBLEM = "problem.p"


@dataclass(slots=True)
class Derivation:
    """The three texts being written, statement by statement."""

    problem: list[str] = field(default_factory=list)
    tptp: list[str] = field(default_factory=list)
    native: list[dict] = field(default_factory=list)
    steps: int = 0

    def axiom(self, name: str, clause: str, role: str = "axiom", language: str = "cnf") -> None:
        self.problem.append(f"{language}({name}, {role}, {clause}).")
        self.tptp.append(f"{language}({name}, {role}, {clause}, file('{PROBLEM}', {name})).")
        self.native.append({"name": name, "role": role, "language": language, "formula": clause,
                            "origin": {"kind": "file", "detail": [PROBLEM, name]}})

    def step(self, name: str, clause: str, rule: str, parents: list[str], evidence: dict | None = None,
             bindings: dict[str, dict[str, str]] | None = None, status: str = "thm", language: str = "cnf",
             info: str = "") -> None:
        """One derived statement; ``bindings`` maps a parent to the
        substitution stated for it in TPTP, ``evidence`` is the native
        inference's evidence with its rule (none for a step checked by search)."""
        cited = []
        for parent in parents:
            bound = (bindings or {}).get(parent)
            if bound:
                cited.append(parent + ":[" + ", ".join(f"bind({v}, $fot({t}))" for v, t in bound.items()) + "]")
            else:
                cited.append(parent)
        extra = f", {info}" if info else ""
        self.tptp.append(f"{language}({name}, plain, {clause}, "
                         f"inference({rule}, [status({status}){extra}], [{', '.join(cited)}])).")
        evidence = dict(evidence or {})
        inference = {"rule": evidence.pop("rule", rule), "parents": parents, **evidence}
        if status != "thm":
            inference["status"] = status
        self.native.append({"name": name, "role": "plain", "language": language, "formula": clause,
                            "inference": inference})
        self.steps += 1

    def introduced(self, name: str, formula: str, symbol: str) -> None:
        """A split symbol's definition (a leaf the derivation introduces)."""
        self.tptp.append(f"fof({name}, plain, {formula}, "
                         f"introduced(avatar_definition, [new_symbols(naming, [{symbol}])])).")
        self.native.append({"name": name, "role": "plain", "language": "fof", "formula": formula,
                            "origin": {"kind": "introduced", "detail": ["definition"]}})
        self.steps += 1


def resolution(left_substitution: dict[str, str] | None = None, right_substitution: dict[str, str] | None = None,
               left_literal: int = 0, right_literal: int = 0) -> dict:
    evidence = {"rule": "resolution", "left": 0, "left_literal": left_literal, "right": 1,
                "right_literal": right_literal}
    if left_substitution:
        evidence["left_substitution"] = left_substitution
    if right_substitution:
        evidence["right_substitution"] = right_substitution
    return evidence


def horn_block(out: Derivation, k: int, length: int, last: bool) -> None:
    """A parcel hops ``length`` depots; the last block's parcel is said
    never to arrive, and its arrival refutes that."""
    parcel = f"parcel{k}"
    for i in range(length):
        out.axiom(f"route{k}_{i}", f"~at{k}(P, depot{i}) | at{k}(P, depot{i + 1})")
    out.axiom(f"start{k}", f"at{k}({parcel}, depot0)")
    previous = f"start{k}"
    for i in range(length):
        name = f"reached{k}_{i + 1}"
        rule = f"route{k}_{i}"
        out.step(name, f"at{k}({parcel}, depot{i + 1})", "resolution", [rule, previous],
                 (resolution({"P": parcel})), bindings={rule: {"P": parcel}})
        previous = name
    if last:
        out.axiom(f"never_arrives{k}", f"~at{k}({parcel}, depot{length})", role="negated_conjecture")
        out.step(f"contradiction{k}", "$false", "resolution", [previous, f"never_arrives{k}"],
                 (resolution()))


def _wrapped(term: str, layers: int, symbol: str) -> str:
    return f"{symbol}(" * layers + term + ")" * layers


def rewriting_block(out: Derivation, k: int, length: int) -> None:
    """``length - 1`` demodulations one equation at a time, then a bundled
    step: a dozen rewrites by one equation and a resolution with a unit."""
    crate = f"crate{k}"
    for i in range(length - 1):
        out.axiom(f"handover{k}_{i}", f"stage{k}_{i}(X) = stage{k}_{i + 1}(X)")
    out.axiom(f"label{k}", f"tagged{k}(stage{k}_0({crate})) | held{k}({crate})")
    previous = f"label{k}"
    for i in range(length - 1):
        name = f"staged{k}_{i + 1}"
        equation = f"handover{k}_{i}"
        evidence = {"rule": "paramodulation", "equation": 1, "equation_literal": 0, "left_to_right": True,
                    "target": 0, "target_literal": 0, "position": [1], "equation_substitution": {"X": crate}}
        out.step(name, f"tagged{k}(stage{k}_{i + 1}({crate})) | held{k}({crate})", "demodulation",
                 [previous, equation], evidence, bindings={equation: {"X": crate}})
        previous = name
    # The bundled step: wrap(X) = X removes twelve layers, then ~held(crate) resolves one literal away.
    out.axiom(f"unwrap{k}", f"wrap{k}(X) = X")
    out.axiom(f"released{k}", f"~held{k}({crate})")
    out.axiom(f"packed{k}", f"sealed{k}({_wrapped(crate, BUNDLED_REWRITES, f'wrap{k}')}) | held{k}({crate})")
    parents = [f"packed{k}", f"unwrap{k}", f"released{k}"]
    inner = []
    for layer in range(BUNDLED_REWRITES):
        remaining = _wrapped(crate, BUNDLED_REWRITES - layer - 1, f"wrap{k}")
        inner.append({"rule": "paramodulation", "equation": 1, "equation_literal": 0, "left_to_right": True,
                      "target": 0 if layer == 0 else len(parents) + layer - 1, "target_literal": min(layer, 1),
                      "position": [1], "equation_substitution": {"X": remaining}})
    # A rewritten literal goes last: after the first rewrite the clause reads held | sealed(...).
    inner.append({"rule": "resolution", "left": len(parents) + BUNDLED_REWRITES - 1, "left_literal": 0,
                  "right": 2, "right_literal": 0})
    out.step(f"unpacked{k}", f"sealed{k}({crate})", "rewrite_and_simplify", parents, {"rule": "chain", "steps": inner})


def wide_block(out: Derivation, k: int, length: int) -> None:
    """A clause of ``3 + k % 6`` literals (3 to 8) carried through
    ``length`` resolutions that swap the arguments of its first literal."""
    side = [f"side{k}_{j}({'X' if j % 2 else 'Y'}, dock{j})" for j in range(2 + k % 6)]
    for i in range(length):
        out.axiom(f"transfer{k}_{i}", f"~load{k}_{i}(U, V) | load{k}_{i + 1}(V, U)")
    out.axiom(f"manifest{k}", " | ".join([f"load{k}_0(X, Y)", *side]))
    previous = f"manifest{k}"
    for i in range(length):
        name = f"moved{k}_{i + 1}"
        first, second = ("Y", "X") if i % 2 == 0 else ("X", "Y")
        clause = " | ".join([f"load{k}_{i + 1}({first}, {second})", *side])
        rule = f"transfer{k}_{i}"
        substitution = {"U": second, "V": first}
        out.step(name, clause, "resolution", [rule, previous], (resolution(substitution)),
                 bindings={rule: substitution})
        previous = name


def skolem_block(out: Derivation, k: int) -> None:
    """Every depot has a dock: Skolemize, then clause form."""
    out.axiom(f"docks{k}", f"! [X] : (depot{k}(X) => ? [Y] : (dock{k}(Y) & serves{k}(Y, X)))", language="fof")
    out.step(f"docks_sk{k}", f"! [X] : (depot{k}(X) => (dock{k}(dk{k}(X)) & serves{k}(dk{k}(X), X)))",
             "skolemize", [f"docks{k}"], status="esa", language="fof", info=f"new_symbols(skolem, [dk{k}])")
    out.step(f"docks_cnf{k}", f"~depot{k}(X) | serves{k}(dk{k}(X), X)", "clausify", [f"docks_sk{k}"])


def split_block(out: Derivation, k: int) -> None:
    """A dispatch clause with three variable-disjoint components, split and
    closed branch by branch (split symbols ``spl{k}_1..3``)."""
    s1, s2, s3 = (f"spl{k}_{n}" for n in (1, 2, 3))
    out.axiom(f"belt{k}", f"running{k}(main) | ~sensor{k}(X) | tripped{k}(X) | jammed{k}(Y)")
    out.axiom(f"belt_idle{k}", f"~running{k}(main)")
    out.axiom(f"sensors_on{k}", f"sensor{k}(X)")
    out.axiom(f"never_tripped{k}", f"~tripped{k}(s7)")
    out.axiom(f"clear{k}", f"~jammed{k}(roller)")
    out.introduced(f"d{k}_1", f"({s1} <=> running{k}(main))", s1)
    out.introduced(f"d{k}_2", f"({s2} <=> ! [X0] : (~sensor{k}(X0) | tripped{k}(X0)))", s2)
    out.introduced(f"d{k}_3", f"({s3} <=> ! [X1] : jammed{k}(X1))", s3)
    out.step(f"s{k}", f"({s1} | {s2} | {s3})", "avatar_split_clause", [f"belt{k}", f"d{k}_1", f"d{k}_2", f"d{k}_3"],
             language="fof")
    out.step(f"k{k}_1", f"running{k}(main) | ~{s1}", "avatar_component_clause", [f"d{k}_1"])
    out.step(f"k{k}_2", f"~sensor{k}(X0) | tripped{k}(X0) | ~{s2}", "avatar_component_clause", [f"d{k}_2"])
    out.step(f"k{k}_3", f"jammed{k}(X1) | ~{s3}", "avatar_component_clause", [f"d{k}_3"])
    out.step(f"r{k}_1", f"~{s1}", "resolution", [f"k{k}_1", f"belt_idle{k}"], (resolution()))
    out.step(f"r{k}_2", f"tripped{k}(X0) | ~{s2}", "resolution", [f"k{k}_2", f"sensors_on{k}"],
             (resolution(right_substitution={"X": "X0"})))
    out.step(f"r{k}_3", f"~{s2}", "resolution", [f"r{k}_2", f"never_tripped{k}"],
             (resolution({"X0": "s7"})), bindings={f"r{k}_2": {"X0": "s7"}})
    out.step(f"r{k}_4", f"~{s3}", "resolution", [f"k{k}_3", f"clear{k}"],
             (resolution({"X1": "roller"})), bindings={f"k{k}_3": {"X1": "roller"}})
    out.step(f"closed{k}", f"~({s1} | {s2} | {s3})", "avatar_sat_refutation",
             [f"s{k}", f"r{k}_1", f"r{k}_3", f"r{k}_4"], language="fof")


BLOCKS: dict[str, Callable[[Derivation, int], None]] = {
    "horn": lambda out, k: horn_block(out, k, BLOCK_LENGTH, last=False),
    "rewriting": lambda out, k: rewriting_block(out, k, BLOCK_LENGTH),
    "wide": lambda out, k: wide_block(out, k, BLOCK_LENGTH),
    "skolem": skolem_block,
    "split": split_block,
}


def generate(steps: int, kinds: tuple[str, ...] = KINDS) -> Derivation:
    """A valid derivation of about ``steps`` steps (at least one block of
    each kind asked for, the final refutation included)."""
    out = Derivation()
    k = 0
    while out.steps < steps - BLOCK_LENGTH - 1 or k < len(kinds):
        BLOCKS[kinds[k % len(kinds)]](out, k)
        k += 1
    horn_block(out, k, max(1, min(BLOCK_LENGTH, steps - out.steps - 1)), last=True)
    return out


def write(out: Derivation, directory: str) -> dict[str, str]:
    """Write problem, TPTP derivation and native certificate; their paths."""
    os.makedirs(directory, exist_ok=True)
    paths = {"problem": os.path.join(directory, PROBLEM), "tptp": os.path.join(directory, "proof.p"),
             "native": os.path.join(directory, "proof.jsonl")}
    with open(paths["problem"], "w") as handle:
        handle.write("\n".join(out.problem) + "\n")
    with open(paths["tptp"], "w") as handle:
        handle.write("\n".join(out.tptp) + "\n")
    header = {"assay_certificate": 1, "problem": PROBLEM, "producer": "bench/generate.py"}
    with open(paths["native"], "w") as handle:
        handle.write("\n".join(json.dumps(record) for record in [header, *out.native]) + "\n")
    return paths


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("steps", type=int)
    parser.add_argument("directory")
    parser.add_argument("--kinds", default=",".join(KINDS), help=f"comma-separated, from {', '.join(KINDS)}")
    options = parser.parse_args()
    out = generate(options.steps, tuple(options.kinds.split(",")))
    for kind, path in write(out, options.directory).items():
        print(f"{kind:8} {path}")
    print(f"{out.steps} steps")


if __name__ == "__main__":
    main()
