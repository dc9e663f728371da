"""The proof picture (``assay graph``): a derivation as a layered DAG.

One node per step of the plan (nested records included), from the leaves
at the top to ``$false`` at the bottom, one edge per parent reference,
each node labelled with its name and shortened formula and coloured by
its outcome; the first failure is marked, and steps the refutation does
not use are faded.  Layout is Graphviz's ``dot``, through the ``graphviz``
package: the DOT text needs no Graphviz program, SVG and HTML do.  The
HTML page is one self-contained file: the picture, a table of steps, and
each step's explanation shown when its node or row is clicked.
"""

from __future__ import annotations

import html
import json
from dataclasses import dataclass

import graphviz

from checker.explain import explain, render_explanation
from checker.kernel.clauses import Clause
from checker.kernel.formulas import FALSE, Formula
from checker.opened import OpenedDerivation
from checker.outcomes import ASSUMED, CHECKED, FAILED, RECONSTRUCTED, REFUTED, UNFOUNDED, UNPROVEN, Report, StepResult

LABEL_CHARACTERS = 48

FILL_COLOURS = {
    CHECKED: "#c8e6c9", RECONSTRUCTED: "#dcedc8", ASSUMED: "#e0e0e0",
    FAILED: "#ef9a9a", REFUTED: "#ef9a9a", UNPROVEN: "#ffe082", UNFOUNDED: "#ffccbc",
}
NOT_CHECKED_ALONE = "#ffffff"

GRAPHVIZ_MISSING = (
    "Graphviz's `dot` program is needed for SVG and HTML and was not found: install Graphviz "
    "(Debian/Ubuntu: apt-get install graphviz; Fedora: dnf install graphviz; macOS: brew install graphviz), "
    "or write a .dot file, which needs no Graphviz"
)


class GraphvizMissing(Exception):
    """Raised when SVG or HTML is asked for and ``dot`` is not installed."""


@dataclass(frozen=True, slots=True)
class Node:
    """One step as the picture shows it."""

    identifier: str
    name: str
    formula: str
    outcome: str | None
    """the check's outcome, None for a nested record not checked on its own"""
    used: bool
    """the refutation depends on it"""
    first_failure: bool
    location: str
    rule: str


@dataclass(frozen=True, slots=True)
class ProofGraph:
    nodes: tuple[Node, ...]
    edges: tuple[tuple[str, str], ...]
    """(parent identifier, child identifier), one per parent reference"""
    verdict: str


def _shortened(text: str) -> str:
    return text if len(text) <= LABEL_CHARACTERS else text[: LABEL_CHARACTERS - 1] + "…"


def _is_refutation(content: Clause | Formula) -> bool:
    if isinstance(content, Clause):
        return content.is_empty
    return content.connective == FALSE


def _used(opened: OpenedDerivation) -> set[str]:
    """The steps the refutation rests on: everything above a ``$false``
    step (or, with none, above the last step)."""
    roots = [name for name, step in opened.steps.items()
             if step.statement is not None and _is_refutation(step.statement.content)]
    if not roots and opened.plan.steps:
        roots = [opened.plan.steps[-1].name]
    used: set[str] = set()
    stack = list(roots)
    while stack:
        name = stack.pop()
        if name in used or name not in opened.steps:
            continue
        used.add(name)
        stack.extend(opened.steps[name].parents)
    return used


def proof_graph(opened: OpenedDerivation, report: Report) -> ProofGraph:
    """The picture's nodes and edges, from the plan and the check's report."""
    results: dict[str, StepResult] = {}
    for result in report.steps:
        results.setdefault(result.name, result)
    failure = report.first_failure
    used = _used(opened)
    identifiers = {step.name: f"step{number}" for number, step in enumerate(opened.plan.steps)}
    nodes = []
    for step in opened.plan.steps:
        result = results.get(step.name)
        formula = str(step.statement.content) if step.statement is not None else "(conclusion not stated)"
        rule = step.inference.rule if step.inference is not None else "leaf"
        nodes.append(Node(identifiers[step.name], step.name, formula, result.outcome if result else None,
                          step.name in used, failure is not None and failure.name == step.name,
                          str(step.location), rule))
    edges = []
    for step in opened.plan.steps:
        for parent in step.parents:
            if parent not in identifiers:
                identifiers[parent] = f"undefined{len(identifiers)}"
                nodes.append(Node(identifiers[parent], parent, "(not defined)", None, False, False, "", "undefined"))
            edges.append((identifiers[parent], identifiers[step.name]))
    return ProofGraph(tuple(nodes), tuple(edges), report.verdict)


def to_dot(picture: ProofGraph, title: str) -> graphviz.Digraph:
    """The Graphviz graph (its ``.source`` is the DOT text)."""
    dot = graphviz.Digraph("proof", graph_attr={"rankdir": "TB", "label": title, "labelloc": "t", "fontname": "Helvetica"},
                           node_attr={"shape": "box", "style": "rounded,filled", "fontname": "Helvetica", "fontsize": "10"})
    for node in picture.nodes:
        fill = FILL_COLOURS.get(node.outcome, NOT_CHECKED_ALONE)
        attributes = {"id": node.identifier, "fillcolor": fill, "tooltip": f"{node.name}: {node.outcome or 'not checked alone'}",
                      "class": "step" if node.rule != "undefined" else "undefined"}
        label = f"{node.name} ({node.outcome or 'nested'})\\n{_shortened(node.formula)}"
        if node.first_failure:
            label = f"FIRST FAILURE: {label}"
            attributes.update(penwidth="3", color="#b71c1c", peripheries="2")
        if not node.used:
            attributes.update(fontcolor="#9e9e9e", color="#bdbdbd", style="rounded,filled,dashed",
                              fillcolor=fill + "66")
        dot.node(node.identifier, label, **attributes)
    leaves = [node.identifier for node in picture.nodes if node.rule == "leaf"]
    if leaves:
        with dot.subgraph(name="leaves", graph_attr={"rank": "min"}) as top:
            for identifier in leaves:
                top.node(identifier)
    for parent, child in picture.edges:
        dot.edge(parent, child)
    return dot


def render_svg(dot: graphviz.Digraph) -> str:
    try:
        return dot.pipe(format="svg", encoding="utf-8")
    except graphviz.ExecutableNotFound:
        raise GraphvizMissing(GRAPHVIZ_MISSING) from None


_PAGE = """<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<link rel="icon" href="data:,">
<title>{title}</title>
<style>
body {{ font-family: Helvetica, Arial, sans-serif; margin: 1em; color: #212121; }}
#layout {{ display: flex; gap: 1em; align-items: flex-start; }}
#picture {{ flex: 3; overflow: auto; border: 1px solid #ddd; }}
#picture svg {{ max-width: 100%; height: auto; }}
#explanation {{ flex: 2; position: sticky; top: 0; white-space: pre-wrap; font-family: monospace;
  font-size: 12px; background: #fafafa; border: 1px solid #ddd; padding: .5em; min-height: 4em; }}
g.node {{ cursor: pointer; }}
g.node.selected polygon, g.node.selected path {{ stroke: #0d47a1; stroke-width: 3; }}
table {{ border-collapse: collapse; margin-top: 1em; font-size: 12px; }}
td, th {{ border: 1px solid #ddd; padding: 2px 6px; text-align: left; vertical-align: top; }}
tr.unused td {{ color: #9e9e9e; }}
tr.first-failure td {{ font-weight: bold; }}
tr[data-node] {{ cursor: pointer; }}
</style>
</head>
<body>
<h1>{title}</h1>
<p>Verdict: <strong id="verdict">{verdict}</strong>. {summary} Click a step for its explanation.</p>
<div id="layout">
<div id="picture">{svg}</div>
<div id="explanation">No step selected.</div>
</div>
<table id="steps">
<thead><tr><th>step</th><th>outcome</th><th>rule</th><th>location</th><th>formula</th></tr></thead>
<tbody>
{rows}
</tbody>
</table>
<script type="application/json" id="explanations">{explanations}</script>
<script>
"use strict";
const explanations = JSON.parse(document.getElementById("explanations").textContent);
const panel = document.getElementById("explanation");
function show(identifier) {{
  panel.textContent = explanations[identifier] || "No explanation.";
  panel.dataset.node = identifier;
  document.querySelectorAll("g.node.selected").forEach(n => n.classList.remove("selected"));
  const node = document.getElementById(identifier);
  if (node) {{ node.classList.add("selected"); }}
}}
document.querySelectorAll("g.node").forEach(node => node.addEventListener("click", () => show(node.id)));
document.querySelectorAll("tr[data-node]").forEach(row => row.addEventListener("click", () => show(row.dataset.node)));
</script>
</body>
</html>
"""


def _row(node: Node) -> str:
    classes = " ".join(c for c, on in (("unused", not node.used), ("first-failure", node.first_failure)) if on)
    cells = (node.name, node.outcome or "nested", node.rule, node.location, _shortened(node.formula))
    return (f'<tr data-node="{node.identifier}" class="{classes}">'
            + "".join(f"<td>{html.escape(cell)}</td>" for cell in cells) + "</tr>")


def explanations(opened: OpenedDerivation, report: Report, picture: ProofGraph) -> dict[str, str]:
    """Each node's explanation as text; the evidence search is run again
    only for steps that did not pass, whose explanation needs it."""
    texts = {}
    for node in picture.nodes:
        if node.name not in opened.steps:
            texts[node.identifier] = f"`{node.name}` is named as a parent but not defined"
            continue
        searched = node.outcome in (FAILED, REFUTED, UNPROVEN)
        texts[node.identifier] = render_explanation(explain(opened, report, node.name, search=searched))
    return texts


def render_html(opened: OpenedDerivation, report: Report, picture: ProofGraph, title: str) -> str:
    svg = render_svg(to_dot(picture, title))
    svg = svg[svg.index("<svg"):]  # the XML prologue and doctype do not belong inside HTML
    failure = report.first_failure
    summary = (f"First failure: {html.escape(failure.name)} ({html.escape(failure.outcome)})."
               if failure is not None else "No failing step.")
    data = json.dumps(explanations(opened, report, picture)).replace("</", "<\\/")
    return _PAGE.format(
        title=html.escape(title), verdict=html.escape(report.verdict), summary=summary, svg=svg,
        rows="\n".join(_row(node) for node in picture.nodes), explanations=data,
    )
