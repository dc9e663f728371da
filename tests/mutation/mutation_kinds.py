"""Single mutations of valid certificates, of many kinds, each with the step
it breaks and, where the kind decides it, whether the result is still sound.

``fixtures()`` lists every valid certificate of every shape the project
ships; ``mutants(fixture)`` makes every single mutation of it (in a fixed
order, so a run is reproducible).  A mutation changes one record (or, for
an extra leaf or an open assumption, one record and what cites it); the
judgement of content changes is left to mutation_oracle.py, the kinds that
are wrong by construction say so here.
"""

from __future__ import annotations

import json
import random
import re
from dataclasses import dataclass
from pathlib import Path

from mutation_formats import FORMATS, Record, is_leaf, parent_names

from checker.kernel.clauses import Clause, Literal
from checker.kernel.formulas import ATOM, BINARY, EXISTS, FALSUM, FORALL, NOT, Formula, make
from checker.kernel.terms import application, replace_at, subterms
from formats.derivation import Inference, Origin
from formats.tptp import read_tptp

ROOT = Path(__file__).resolve().parents[2]
FIXTURES = ROOT / "fixtures"

UNSOUND = "unsound"
SOUND = "sound"
JUDGED = None  # the oracle decides

SYMBOL_SWAPS_PER_RECORD = 3


@dataclass(frozen=True, slots=True)
class Fixture:
    shape: str
    path: Path
    problem: Path | None
    format: str


@dataclass(frozen=True, slots=True)
class Mutant:
    fixture: Fixture
    kind: str
    step: str
    """the step the first failure must be at (the mutated one)"""
    text: str
    expected: str | None
    """UNSOUND or SOUND by construction, or None for the oracle to decide"""
    index: int
    citing: tuple[str, ...] = ()
    """for a renamed step, the steps that cite its old name: they lose a
    parent, so failing first there is at the change too"""


def fixtures() -> list[Fixture]:
    """Every valid certificate with the shape it stands for."""
    found = []

    def add(shape: str, folder: Path, name: str = "proof.p") -> None:
        problem = folder / "problem.p"
        found.append(Fixture(shape, folder / name, problem if problem.is_file() else None, "tptp"))

    tptp = FIXTURES / "tptp"
    for folder in sorted((tptp / "derivations").iterdir()):
        if (folder / "proof.p").is_file():
            add(_derivation_shape(folder), folder)
    for shape in ("typed", "splitting"):
        for folder in sorted((tptp / shape).iterdir()):
            if (folder / "proof.p").is_file():
                add(shape, folder)
    for folder in sorted((tptp / "prover_corpus").iterdir()):
        if (folder / "proof.p").is_file():  # the large/ derivations are for scale, not for mutation
            add("prover_corpus", folder)
    for folder in sorted((tptp / "styles").iterdir()):
        if (folder / "proof.p").is_file():
            add("prover_styles", folder)
    for proof in sorted((tptp / "pelletier").glob("*_refutation.p")):
        problem = proof.with_name(proof.name.replace("_refutation", "_problem"))
        found.append(Fixture("pelletier", proof, problem, "tptp"))
    for proof in sorted((tptp / "clausification").glob("*_refutation.p")):
        problem = proof.with_name(proof.name.replace("_refutation", "_problem"))
        found.append(Fixture("formula_steps", proof, problem, "tptp"))
    found.append(Fixture("native_v1", FIXTURES / "demo" / "interlock.jsonl", FIXTURES / "demo" / "interlock_problem.p",
                         "native"))
    for certificate in sorted((FIXTURES / "native" / "elaborated").glob("*.jsonl")):
        header = json.loads(certificate.read_text(encoding="utf-8").splitlines()[0])
        found.append(Fixture("native_v2", certificate, (certificate.parent / header["problem"]).resolve(), "native_v2"))
    return found


def _derivation_shape(folder: Path) -> str:
    text = (folder / "proof.p").read_text(encoding="utf-8")
    if "nested" in folder.name or re.search(r"\[[^\]]*inference\(", text):
        return "nested_records"
    if "skolem" in text.lower():
        return "skolemization"
    if "introduced(definition" in text or "definition" in folder.name:
        return "definitions"
    if text.lstrip().startswith("fof") or "\nfof(" in text:
        return "formula_steps"
    return "clause_derivations"


# ---- content edits (clauses and formulas) -------------------------------------------------


def clause_edits(clause: Clause, other_literals: list[Literal]) -> list[tuple[str, Clause]]:
    literals = list(clause.literals)
    edits = []
    for i, literal in enumerate(literals):
        edits.append(("sign_flip", Clause(literals[:i] + [literal.negated()] + literals[i + 1 :])))
        if len(literals) > 1:
            edits.append(("dropped_literal", Clause(literals[:i] + literals[i + 1 :])))
        for swapped in _argument_swaps(literal.atom):
            edits.append(("swapped_arguments", Clause(literals[:i] + [Literal(literal.positive, swapped)] + literals[i + 1 :])))
    extra = [lit for lit in other_literals if lit not in clause.literal_set]
    if extra:
        edits.append(("added_literal", Clause(literals + [extra[0]])))
    if literals:
        edits.append(("empty_clause_early", Clause()))
    return edits


def _argument_swaps(atom):
    """The atom with two differing arguments of one application swapped, for each application."""
    for position, term in subterms(atom):
        if term.is_variable or term.arity < 2 or term.symbol == "=":
            continue
        first, second = term.arguments[0], term.arguments[1]
        if first is not second:
            swapped = application(term.symbol, (second, first, *term.arguments[2:]))
            yield replace_at(atom, position, swapped)


def _rebuild(formula: Formula, path: tuple[int, ...], replacement: Formula) -> Formula:
    """``formula`` with the subformula at ``path`` (argument indices) replaced."""
    spine = [formula]
    for index in path:
        spine.append(spine[-1].arguments[index])
    result = replacement
    for parent, index in zip(reversed(spine[:-1]), reversed(path)):
        arguments = parent.arguments[:index] + (result,) + parent.arguments[index + 1 :]
        result = make(parent.connective, arguments, parent.variables, parent.atom)
    return result


def formula_edits(formula: Formula) -> list[tuple[str, Formula]]:
    edits = []
    stack: list[tuple[tuple[int, ...], Formula]] = [((), formula)]
    while stack:
        path, current = stack.pop()
        connective = current.connective
        if connective == ATOM:
            edits.append(("sign_flip", _rebuild(formula, path, make(NOT, (current,)))))
            for swapped in _argument_swaps(current.atom):
                edits.append(("swapped_arguments", _rebuild(formula, path, make(ATOM, atom=swapped))))
        elif connective in (FORALL, EXISTS):
            other = EXISTS if connective == FORALL else FORALL
            edits.append(("quantifier_flip", _rebuild(formula, path, make(other, current.arguments, current.variables))))
        elif connective in BINARY and connective in ("&", "|"):
            for kept in current.arguments:
                edits.append(("dropped_literal", _rebuild(formula, path, kept)))
        elif connective == NOT and current.arguments[0].connective == ATOM:
            edits.append(("sign_flip", _rebuild(formula, path, current.arguments[0])))
            continue
        stack.extend((path + (i,), argument) for i, argument in reversed(list(enumerate(current.arguments))))
    if formula.connective != "$false":
        edits.append(("empty_clause_early", FALSUM))
    return edits


def symbol_swaps(content, signature: dict[int, list[str]], rng: random.Random) -> list[Formula | Clause]:
    """``content`` with one occurrence of a symbol replaced by another of the same arity."""
    atoms = [lit.atom for lit in content.literals] if isinstance(content, Clause) else _formula_atoms(content)
    candidates = []
    for a, atom in enumerate(atoms):
        for position, term in subterms(atom):
            if term.is_variable or term.symbol in ("=", "$true", "$false"):
                continue
            others = [s for s in signature.get((position == (), term.arity), []) if s != term.symbol]
            if others:
                candidates.append((a, position, term, others))
    rng.shuffle(candidates)
    found = []
    for a, position, term, others in candidates[:SYMBOL_SWAPS_PER_RECORD]:
        new_atom = replace_at(atoms[a], position, application(rng.choice(others), term.arguments))
        found.append(_with_atom(content, a, new_atom))
    return found


def _formula_atoms(formula: Formula) -> list:
    atoms, stack = [], [formula]
    while stack:
        current = stack.pop()
        if current.connective == ATOM:
            atoms.append(current.atom)
        stack.extend(reversed(current.arguments))
    return atoms


def _with_atom(content, index: int, atom):
    if isinstance(content, Clause):
        literals = list(content.literals)
        literals[index] = Literal(literals[index].positive, atom)
        return Clause(literals)
    count, stack = -1, [((), content)]
    while stack:
        path, current = stack.pop()
        if current.connective == ATOM:
            count += 1
            if count == index:
                return _rebuild(content, path, make(ATOM, atom=atom))
        stack.extend((path + (i,), a) for i, a in reversed(list(enumerate(current.arguments))))
    raise ValueError("no such atom")


def signature_of(contents) -> dict[tuple[bool, int], list[str]]:
    """(is a predicate, arity) → symbols, over the given clauses and formulas."""
    found: dict[tuple[bool, int], set[str]] = {}
    for content in contents:
        atoms = [lit.atom for lit in content.literals] if isinstance(content, Clause) else _formula_atoms(content)
        for atom in atoms:
            for position, term in subterms(atom):
                if not term.is_variable and not term.symbol.startswith("$") and term.symbol != "=":
                    found.setdefault((position == (), term.arity), set()).add(term.symbol)
    return {key: sorted(symbols) for key, symbols in found.items()}


# ---- whole mutants ---------------------------------------------------------------------


def mutants(fixture: Fixture) -> list[Mutant]:
    plugin = FORMATS[fixture.format]
    text = fixture.path.read_text(encoding="utf-8")
    records = plugin.records(text, str(fixture.path))
    problem = read_tptp(str(fixture.problem)).statements if fixture.problem else ()
    contents = [r.statement.content for r in records] + [s.content for s in problem]
    signature = signature_of(contents)
    rng = random.Random(f"{fixture.path.name}:{fixture.shape}")
    literals = [lit for r in records if isinstance(r.statement.content, Clause) for lit in r.statement.content.literals]
    problem_file = fixture.problem.name if fixture.problem else "problem.p"
    found: list[Mutant] = []

    def add(kind: str, step: str, new_text: str, expected: str | None, citing: tuple[str, ...] = ()) -> None:
        found.append(Mutant(fixture, kind, step, new_text, expected, len(found), citing))

    def replaced(record: Record, new_record: str, before: str = "") -> str:
        return text[: record.start] + before + new_record + text[record.end :]

    names = [r.statement.name for r in records]
    problem_symbols = set().union(*(symbols(s.content) for s in problem))
    children: dict[str, list[str]] = {}
    for r in records:
        for parent in parent_names(r.statement):
            children.setdefault(parent, []).append(r.statement.name)
    used = plugin.used_findings(str(fixture.path), str(fixture.problem)) if hasattr(plugin, "used_findings") else {}
    for i, record in enumerate(records):
        statement = record.statement
        name = statement.name
        content = statement.content
        renderable = fixture.format != "tptp" or statement.language in ("cnf", "fof")
        # content changes: judged by the oracle, except a weakening, which is sound by construction
        if renderable:
            edits = clause_edits(content, literals) if isinstance(content, Clause) else formula_edits(content)
            for kind, changed in edits:
                # A weaker claim is sound, but a leaf must be the problem's statement and a
                # negated conjecture exactly the conjecture's negation: those stay undecided.
                # A literal bringing a symbol the derivation introduces elsewhere makes the
                # step an introduction of it, refused when it witnesses nothing: not judged.
                weakening = (kind == "added_literal" and not is_leaf(statement)
                             and statement.role != "negated_conjecture"
                             and symbols(changed) <= symbols(content) | problem_symbols)
                add(kind, name, replaced(record, plugin.write(record, content=changed)), SOUND if weakening else JUDGED)
            for changed in symbol_swaps(content, signature, rng):
                add("symbol_swap", name, replaced(record, plugin.write(record, content=changed)), JUDGED)
        else:
            body = plugin.formula_text(record)
            add("negated_claim", name, replaced(record, plugin.write(record, formula_text=f"~ ( {body} )")), JUDGED)
            for group in signature.values():
                for symbol in group:
                    for other in group:
                        if other != symbol and _token_in(body, symbol):
                            new_body = _swap_token(body, symbol, other)
                            add("symbol_swap", name, replaced(record, plugin.write(record, formula_text=new_body)), JUDGED)
                            break
                    else:
                        continue
                    break
        if statement.role == "negated_conjecture" and isinstance(content, Formula) and content.connective == NOT:
            add("negation_removed", name, replaced(record, plugin.write(record, content=content.arguments[0])), UNSOUND)
        # the evidence: parents and bindings
        parents = parent_names(statement)
        # not a step resting on this one (written earlier in a refutation-first file):
        # that makes a cycle, which is reported where the cycle is first met
        resting = _resting_on(children, name)
        earlier = [n for n in names[:i] if n not in parents and n not in resting]
        for parent in parents:
            if earlier:
                other = rng.choice(earlier)
                changed = plugin.with_parent_renamed(record, parent, other)
                if changed:
                    add("changed_parent", name, replaced(record, changed), JUDGED)
            if len(parents) > 1:
                changed = plugin.with_parent_dropped(record, parent)
                if changed:
                    add("dropped_parent", name, replaced(record, changed), JUDGED)
        constants = signature.get((False, 0), [])
        if constants and isinstance(statement.source, Inference):
            for changed in plugin.with_binding_changed(record, rng.choice(constants))[:2]:
                add("changed_binding", name, replaced(record, changed),
                    UNSOUND if fixture.format != "tptp" else JUDGED)
        if hasattr(plugin, "with_index_changed"):
            for changed in plugin.with_index_changed(record)[:2]:
                add("changed_evidence_index", name, replaced(record, changed), UNSOUND)
        # the evidence a version 2 certificate carries: wrong by construction
        if hasattr(plugin, "finding_mutations"):
            for kind, changed in plugin.finding_mutations(record, constants, used.get(name, set())):
                add(kind, name, replaced(record, changed), UNSOUND)
        # the name: a duplicate of an earlier statement's (in a file written refutation
        # first, a step citing the vanished name may be checked, and fail, first)
        if i > 0:
            other = records[rng.randrange(i)].statement
            if other.content != content:
                add("duplicated_name", other.name, replaced(record, plugin.write(record, name=other.name)), UNSOUND,
                    tuple(children.get(name, ())))
        # an extra leaf stating this step's claim, cited in place of its first parent
        if parents and renderable and statement.language == "cnf" or (parents and fixture.format != "tptp"):
            leaf_name = f"extra_leaf_{i}"
            cited = plugin.with_parent_renamed(record, parents[0], leaf_name)
            if cited:
                leaf = plugin.leaf(leaf_name, "axiom", content, problem_file, statement.language)
                add("extra_leaf_axiom", leaf_name, replaced(record, cited, before=leaf + plugin.separator()), JUDGED)
        # introduced symbols: reused, or (for a Skolem function) an argument missing
        found.extend(_introduction_mutants(fixture, plugin, records, i, problem, text, signature, rng, len(found)))
    found.extend(_open_assumption_mutants(fixture, plugin, records, text, len(found)))
    return found


def _resting_on(children: dict[str, list[str]], name: str) -> set[str]:
    """The statements that cite ``name``, directly or through others."""
    found: set[str] = set()
    stack = list(children.get(name, ()))
    while stack:
        child = stack.pop()
        if child not in found:
            found.add(child)
            stack.extend(children.get(child, ()))
    return found


def _token_in(body: str, symbol: str) -> bool:
    return re.search(rf"(?<![\w$']){re.escape(symbol)}(?![\w'])", body) is not None


def _swap_token(body: str, symbol: str, other: str) -> str:
    return re.sub(rf"(?<![\w$']){re.escape(symbol)}(?![\w'])", other, body, count=1)


def symbols(content) -> set[tuple[str, int]]:
    atoms = [lit.atom for lit in content.literals] if isinstance(content, Clause) else _formula_atoms(content)
    found = set()
    for atom in atoms:
        for _, term in subterms(atom):
            if not term.is_variable:
                found.add((term.symbol, term.arity))
    return found


def _introduction_mutants(fixture, plugin, records, i, problem, text, signature, rng, start) -> list[Mutant]:
    """A symbol this statement introduces (in no parent, no earlier record, not the problem's):
    replaced by a symbol that already exists, or with its last argument missing.  Judged by
    the oracle: a reused symbol can turn the step into a plain consequence of its parents."""
    record = records[i]
    statement = record.statement
    if not (fixture.format != "tptp" or statement.language in ("cnf", "fof")):
        return []
    before: set[tuple[str, int]] = set()
    for s in problem:
        before |= symbols(s.content)
    for r in records[:i]:
        before |= symbols(r.statement.content)
    new = sorted(s for s in symbols(statement.content) - before if not s[0].startswith("$") and s[0] != "=")
    if not new:
        return []
    rule = statement.source.rule if isinstance(statement.source, Inference) else ""
    origin = statement.source.detail[0] if isinstance(statement.source, Origin) and statement.source.detail else ""
    found = []
    for symbol, arity in new:
        is_predicate = any(
            atom.symbol == symbol
            for atom in ([lit.atom for lit in statement.content.literals] if isinstance(statement.content, Clause)
                         else _formula_atoms(statement.content))
        )
        existing = sorted({s for s, a in before if a == arity and (is_predicate, a) in signature and s in signature[(is_predicate, a)]})
        if "split" in rule or "split" in origin or (is_predicate and arity == 0):
            kind = "split_symbol_reused"
        elif is_predicate or "definition" in origin:
            kind = "definition_symbol_reused"
        else:
            kind = "skolem_symbol_reused"
        if existing:
            changed = _rename_symbol(statement.content, symbol, arity, rng.choice(existing), arity)
            found.append(Mutant(fixture, kind, statement.name,
                                text[: record.start] + plugin.write(record, content=changed) + text[record.end :],
                                JUDGED, start + len(found)))
        if arity >= 1 and not is_predicate and "skolem" in (rule + origin).lower():
            changed = _rename_symbol(statement.content, symbol, arity, symbol, arity - 1)
            found.append(Mutant(fixture, "skolem_missing_argument", statement.name,
                                text[: record.start] + plugin.write(record, content=changed) + text[record.end :],
                                JUDGED, start + len(found)))
    return found


def _rename_symbol(content, symbol: str, arity: int, new_symbol: str, new_arity: int):
    """Every occurrence of symbol/arity made new_symbol applied to its first new_arity arguments."""

    def term_map(term):
        done = {}
        stack = [(term, False)]
        while stack:
            current, expanded = stack.pop()
            if current in done:
                continue
            if current.is_variable:
                done[current] = current
            elif not expanded:
                stack.append((current, True))
                stack.extend((a, False) for a in current.arguments)
            else:
                arguments = tuple(done[a] for a in current.arguments)
                if current.symbol == symbol and current.arity == arity:
                    done[current] = application(new_symbol, arguments[:new_arity])
                else:
                    done[current] = application(current.symbol, arguments)
        return done[term]

    if isinstance(content, Clause):
        return Clause(Literal(lit.positive, term_map(lit.atom)) for lit in content.literals)
    result, stack = content, [((), content)]
    edits = []
    while stack:
        path, current = stack.pop()
        if current.connective == ATOM:
            edits.append((path, make(ATOM, atom=term_map(current.atom))))
        stack.extend((path + (i,), a) for i, a in enumerate(current.arguments))
    for path, replacement in edits:
        result = _rebuild(result, path, replacement)
    return result


def _open_assumption_mutants(fixture, plugin, records, text, start) -> list[Mutant]:
    """The last refutation derived again inside a branch that is already closed,
    so an assumption is left open under it (wrong by construction)."""
    by_name = {r.statement.name: r for r in records}
    assumptions = [
        r.statement.name for r in records
        if isinstance(r.statement.source, Inference) and r.statement.source.rule == "splitLeft"
        or isinstance(r.statement.source, Origin) and r.statement.source.detail[:1] == ("assumption",)
    ]
    if not assumptions or not records:
        return []
    final = records[-1]
    closing = []
    for r in records[:-1]:
        content = r.statement.content
        if is_leaf(r.statement) or not (isinstance(content, Clause) and content.is_empty or
                                        isinstance(content, Formula) and content.connective == "$false"):
            continue
        if _rests_on(r.statement.name, assumptions, by_name):
            closing.append(r)
    found = []
    for r in closing[:2]:
        annotations = plugin.annotations(r) if hasattr(plugin, "annotations") else None
        if annotations is None:
            continue
        new_final = plugin.write(final, annotations=annotations)
        found.append(Mutant(fixture, "assumption_left_open", final.statement.name,
                            text[: final.start] + new_final + text[final.end :], UNSOUND, start + len(found)))
    return found


def _rests_on(name: str, assumptions: list[str], by_name: dict[str, Record]) -> bool:
    seen, stack = set(), [name]
    while stack:
        current = stack.pop()
        if current in assumptions:
            return True
        if current in seen or current not in by_name:
            continue
        seen.add(current)
        stack.extend(parent_names(by_name[current].statement))
    return False
