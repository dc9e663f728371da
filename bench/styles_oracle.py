"""Settle the hand-written derivations of fixtures/tptp/styles without assay's checks.

For every derivation not printed by a prover (folders not ending in
``_eprover...``), each step is handed to ``eprover`` as a problem of its
own and must come back ``Theorem`` (or ``ContradictoryAxioms`` for a
claim such as ``$false``):

- a logical-consequence step: its premises (nested records resolved to
  the statements under them) as axioms, its claim as the conjecture;
- a leaf citing a problem statement: that statement entails the leaf (both
  ways for a conjecture), a leaf with no usable source: the problem's
  axioms entail it;
- a negated conjecture: equivalent to the negation of its conjecture.

Steps that introduce a symbol (Skolemizations, axioms of choice,
definitions, namings) are sound by construction and listed as such.  Only
reading and planning come from the project; the judge is the prover.

    python3 bench/styles_oracle.py [FOLDER ...]
"""

from __future__ import annotations

import subprocess
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from checker.formula_steps import as_formula  # noqa: E402
from checker.freshness import content_symbols  # noqa: E402
from checker.opened import claimed_status, cited_problem_statement, open_derivation, resolved_premises  # noqa: E402
from formats.derivation import Origin  # noqa: E402

STYLES = Path(__file__).resolve().parents[1] / "fixtures" / "tptp" / "styles"


def proved(axioms: list[str], conjecture: str) -> bool:
    text = "".join(f"fof(a{n}, axiom, {a}).\n" for n, a in enumerate(axioms)) + f"fof(goal, conjecture, {conjecture}).\n"
    with tempfile.NamedTemporaryFile("w", suffix=".p", delete=False) as handle:
        handle.write(text)
    run = subprocess.run(["eprover", "--auto", "--cpu-limit=20", "-s", handle.name], capture_output=True, text=True)
    Path(handle.name).unlink()
    # A claim that is false outright (`$false`) follows when the axioms contradict each other.
    return "SZS status Theorem" in run.stdout or "SZS status ContradictoryAxioms" in run.stdout


def settle(folder: Path) -> tuple[int, int, list[str]]:
    opened = open_derivation(str(folder / "proof.p"), str(folder / "problem.p"))
    problem_symbols = set().union(*(content_symbols(s.content) for s in opened.problem.statements))
    axioms = [str(as_formula(s.content)) for s in opened.problem.statements if s.role != "conjecture"]
    shown, by_construction, wrong = 0, 0, []
    for step in opened.plan.steps:
        statement = step.statement
        if statement is None:
            continue
        claim = str(as_formula(statement.content))
        source = statement.source
        if step.is_leaf:
            if isinstance(source, Origin) and source.kind == "introduced":
                by_construction += 1
                continue
            cited = cited_problem_statement(opened, step)
            if cited is None:
                ok = proved(axioms, claim)
            elif cited.role == "conjecture":
                ok = proved([str(as_formula(cited.content))], claim) and proved([claim], str(as_formula(cited.content)))
            else:
                ok = proved([str(as_formula(cited.content))], claim)
        else:
            names = resolved_premises(opened, step)
            premises = [opened.statements[n] for n in names if n in opened.statements]
            if statement.role == "negated_conjecture" and any(p.role == "conjecture" for p in premises):
                conjecture = next(p for p in premises if p.role == "conjecture")
                negated = f"~ ({as_formula(conjecture.content)})"
                new = content_symbols(statement.content) - content_symbols(conjecture.content)
                if new:
                    by_construction += 1
                    continue
                ok = proved([negated], claim) and proved([claim], negated)
            else:
                known = set(problem_symbols).union(*(content_symbols(p.content) for p in premises))
                if claimed_status(opened, step) == "esa" or content_symbols(statement.content) - known:
                    by_construction += 1
                    continue
                ok = proved([str(as_formula(p.content)) for p in premises], claim)
        if ok:
            shown += 1
        else:
            wrong.append(step.name)
    return shown, by_construction, wrong


def main(arguments: list[str]) -> int:
    folders = [STYLES / name for name in arguments] or sorted(
        f for f in STYLES.iterdir() if f.is_dir() and "_eprover" not in f.name
    )
    failures = 0
    for folder in folders:
        shown, by_construction, wrong = settle(folder)
        failures += len(wrong)
        print(f"{folder.name:45} shown by the prover {shown:3}  by construction {by_construction:3}  not shown {wrong}")
    return 1 if failures else 0


if __name__ == "__main__":
    raise SystemExit(main(sys.argv[1:]))
