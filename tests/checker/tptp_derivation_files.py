"""Where the TPTP derivation fixtures are, and what a mutant's header says.

Each scenario folder under fixtures/tptp/derivations holds a problem
(problem.p, perhaps with the files it includes), a valid derivation
(proof.p), and mutated copies (mutant_<what is broken>.p) whose header
names the broken step in a ``% broken-step: NAME`` line and, for some, the
words the diagnosis must contain in a ``% expected-message: WORDS`` line.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from pathlib import Path

DERIVATIONS = Path(__file__).resolve().parents[2] / "fixtures" / "tptp" / "derivations"

_HEADER = re.compile(r"^% (broken-step|expected-message): (.+?)\s*$", re.MULTILINE)


@dataclass(frozen=True, slots=True)
class Mutant:
    path: Path
    problem: Path
    broken_step: str
    expected_message: str | None

    @property
    def valid(self) -> Path:
        return self.path.with_name("proof.p")


def scenarios() -> list[Path]:
    """The scenario folders, each with its problem and valid derivation."""
    return sorted(folder for folder in DERIVATIONS.iterdir() if (folder / "proof.p").is_file())


def mutants() -> list[Mutant]:
    found = []
    for folder in scenarios():
        for path in sorted(folder.glob("mutant_*.p")):
            header = dict(_HEADER.findall(path.read_text(encoding="utf-8")))
            found.append(Mutant(path, folder / "problem.p", header.get("broken-step", ""), header.get("expected-message")))
    return found


def label(path: Path) -> str:
    """A test id: scenario, or scenario/file for a mutant."""
    return path.name if path.is_dir() else f"{path.parent.name}/{path.stem}"
