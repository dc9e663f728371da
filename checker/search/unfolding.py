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
from checker.kernel.formulas import Formula, alpha_equivalent, formula_of_clause, universal_closure
from checker.kernel.unfolding import Definitions, Unfolding, check_unfolding, equivalence_definition, unfolded


def find_unfolding(premises: Sequence[Clause | Formula], conclusion: Clause | Formula) -> Unfolding | None:
    """An unfolding the kernel accepts, or None.  Premises that are not
    definitions are tried first as the one unfolded."""
    closed = [_closed(p) for p in premises]
    parts = [equivalence_definition(formula) for formula in closed]
    defining: dict[tuple[str, int], int] = {}
    for index, found in enumerate(parts):
        if found is not None:
            defining.setdefault((found[0].atom.symbol, found[0].atom.arity), index)
    definitions = tuple(sorted(defining.values()))
    if not definitions:
        return None
    # The kernel's comparison, made here first (the conclusion unfolded
    # once, not once per premise): only a premise that passes is put to it.
    meanings = {key: (parts[index][0].atom.arguments, parts[index][1]) for key, index in defining.items()}
    passes = len(definitions)
    target = _unfolded(_closed(conclusion), meanings, passes)
    order = sorted(range(len(premises)), key=lambda index: parts[index] is not None)
    for premise in order:
        if not alpha_equivalent(_unfolded(closed[premise], meanings, passes), target):
            continue
        unfolding = Unfolding(premise, definitions, passes)
        if check_unfolding(premises, conclusion, unfolding) is None:
            return unfolding
    return None


def _closed(statement: Clause | Formula) -> Formula:
    return formula_of_clause(statement) if isinstance(statement, Clause) else universal_closure(statement)


def _unfolded(formula: Formula, meanings: Definitions, passes: int) -> Formula:
    for _ in range(passes):
        formula = unfolded(formula, meanings)
    return formula
