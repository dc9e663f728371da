"""Proposing an unfolding: which premise, which definitions (untrusted).

A step that applies definitions (`apply_def`, folding a subformula into
the atom that names it) is the premise with some subformulas replaced by
equivalent atoms; a refutation of that is long when the definitions sit
inside equivalences.  Unfolding every definition among the premises in
one premise and in the conclusion, and comparing, settles it at once.
This proposes each premise in turn with the equivalence definitions among
the others (and itself, when it is one); the kernel unfolds and compares
(checker.kernel.unfolding).
"""

from __future__ import annotations

from collections.abc import Sequence

from checker.kernel.clauses import Clause
from checker.kernel.formulas import Formula, formula_of_clause, universal_closure
from checker.kernel.unfolding import Unfolding, check_unfolding, equivalence_definition


def find_unfolding(premises: Sequence[Clause | Formula], conclusion: Clause | Formula) -> Unfolding | None:
    """An unfolding the kernel accepts, or None.  Premises that are not
    definitions are tried first as the one unfolded."""
    closed = [formula_of_clause(p) if isinstance(p, Clause) else universal_closure(p) for p in premises]
    parts = [equivalence_definition(formula) for formula in closed]
    defining: dict[tuple[str, int], int] = {}
    for index, found in enumerate(parts):
        if found is not None:
            defining.setdefault((found[0].atom.symbol, found[0].atom.arity), index)
    definitions = tuple(sorted(defining.values()))
    if not definitions:
        return None
    order = sorted(range(len(premises)), key=lambda index: parts[index] is not None)
    for premise in order:
        unfolding = Unfolding(premise, definitions, len(definitions))
        if check_unfolding(premises, conclusion, unfolding) is None:
            return unfolding
    return None
