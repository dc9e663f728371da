"""``assay graph``: the DOT parsed back, and the HTML page in a real browser.

The DOT text is read back with pydot (a general-purpose DOT reader from
PyPI): it must have one node per step (stated statements plus nested
records, counted here from the reader's data, not from the plan) and one
edge per parent reference.  Checking a derivation takes time, so the DOT
test runs on a sample: the explain fixtures, the native demo and a few
TPTP derivations with nested records, Skolemization and a failure.

The HTML page is opened in headless Chromium (Debian's chromium, driven
by Playwright's Python package; the browser is never downloaded): it must
load with no console error, and a click on the failing node must show
that step's explanation.  A screenshot is kept under build/test-artefacts.
"""

from __future__ import annotations

from pathlib import Path

import pydot
import pytest
from click.testing import CliRunner

from checker.cli import main
from checker.graph import proof_graph, to_dot
from checker.opened import open_derivation
from checker.run import check, read_document
from formats.derivation import Inference

ROOT = Path(__file__).resolve().parents[2]
ARTEFACTS = ROOT / "build" / "test-artefacts"
CHROMIUM = "/usr/bin/chromium"
CHROMIUM_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                 "--disable-background-networking", "--disable-component-update", "--disable-sync"]
DERIVATIONS = "fixtures/tptp/derivations"
SAMPLE = [
    ("fixtures/explain/dock_door.jsonl", None),
    ("fixtures/explain/dock_door_sign_clash.jsonl", None),
    ("fixtures/explain/dock_door_cycle.p", None),
    ("fixtures/demo/interlock_broken.jsonl", "fixtures/demo/interlock_problem.p"),
    (f"{DERIVATIONS}/valve_sensor_nested_skolemize/proof.p", None),
    (f"{DERIVATIONS}/ambulance_dispatch_nested/proof.p", None),
    (f"{DERIVATIONS}/signal_box_log/mutant_dropped_literal.p", None),
    (f"{DERIVATIONS}/alarm_panel_apply_definitions/proof.p", None),
]


def _counted_from_the_reader(path: str) -> tuple[int, int]:
    """Steps (statements and nested records) and parent references, as written."""
    steps = references = 0
    for statement in read_document(str(ROOT / path)).statements:
        steps += 1
        stack = [statement.source] if isinstance(statement.source, Inference) else []
        while stack:
            for parent in stack.pop().parents:
                references += 1
                if isinstance(parent, Inference):
                    steps += 1
                    stack.append(parent)
    return steps, references


@pytest.mark.parametrize("path,problem", SAMPLE, ids=[Path(p).stem for p, _ in SAMPLE])
def test_dot_parsed_back_has_one_node_per_step_and_one_edge_per_parent_reference(path, problem, tmp_path, monkeypatch):
    monkeypatch.chdir(ROOT)
    output = tmp_path / "proof.dot"
    result = CliRunner().invoke(main, ["graph", path, "-o", str(output)] + (["--problem", problem] if problem else []))
    assert result.exit_code == 0, result.output
    graphs = pydot.graph_from_dot_data(output.read_text(encoding="utf-8"))
    assert graphs is not None and len(graphs) == 1
    nodes = [node for node in graphs[0].get_nodes() if node.get_name() not in ("node", "graph", "edge")]
    steps, references = _counted_from_the_reader(path)
    assert len(nodes) == steps
    assert len(graphs[0].get_edges()) == references
    labels = [node.get("label").strip('"') for node in nodes]
    report = check(path, problem)
    failure = report.first_failure
    marked = [label for label in labels if label.startswith("FIRST FAILURE: ")]
    assert marked == ([] if failure is None else [f"FIRST FAILURE: {failure.name} ({failure.outcome})"
                                                    + marked[0].partition(")")[2]])


def test_steps_the_refutation_does_not_use_are_faded(monkeypatch, tmp_path):
    monkeypatch.chdir(ROOT)
    path = tmp_path / "spare_step.p"
    # A derivation with one step no refutation uses (worked by hand).
    path.write_text(
        "cnf(a, axiom, p).\ncnf(b, axiom, ~ p | q).\ncnf(c, negated_conjecture, ~ q).\n"
        "cnf(spare, plain, ~ p | q | r, inference(weaken, [status(thm)], [b])).\n"
        "cnf(d, plain, q, inference(resolve, [status(thm)], [a, b])).\n"
        "cnf(e, plain, $false, inference(resolve, [status(thm)], [d, c])).\n", encoding="utf-8")
    opened = open_derivation(str(path))
    picture = proof_graph(opened, check(str(path)))
    assert {node.name for node in picture.nodes if not node.used} == {"spare"}
    assert 'style="rounded,filled,dashed"' in to_dot(picture, "t").source


def test_svg_needs_graphviz_and_says_how_to_install_it(monkeypatch, tmp_path):
    monkeypatch.chdir(ROOT)
    monkeypatch.setenv("PATH", str(tmp_path))  # no `dot` on the path
    result = CliRunner().invoke(main, ["graph", "fixtures/explain/dock_door.jsonl", "-o", str(tmp_path / "p.svg")])
    assert result.exit_code == 2
    assert "apt-get install graphviz" in result.output
    dot = CliRunner().invoke(main, ["graph", "fixtures/explain/dock_door.jsonl", "-o", str(tmp_path / "p.dot")])
    assert dot.exit_code == 0 and (tmp_path / "p.dot").read_text().startswith("digraph")


def test_html_loads_without_console_errors_and_a_click_shows_the_failing_step(monkeypatch, tmp_path):
    from playwright.sync_api import sync_playwright

    assert Path(CHROMIUM).is_file(), f"no browser at {CHROMIUM}: scripts/test installs Debian's chromium"
    monkeypatch.chdir(ROOT)
    derivation = f"{DERIVATIONS}/signal_box_log/mutant_dropped_literal.p"
    page_path = tmp_path / "proof.html"
    result = CliRunner().invoke(main, ["graph", derivation, "-o", str(page_path)])
    assert result.exit_code == 0, result.output
    text = page_path.read_text(encoding="utf-8")
    assert "<script src" not in text and "<link rel=\"stylesheet\"" not in text  # one self-contained file
    failing = next(node for node in proof_graph(open_derivation(derivation), check(derivation)).nodes
                   if node.first_failure)
    ARTEFACTS.mkdir(parents=True, exist_ok=True)
    with sync_playwright() as playwright:
        browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
        try:
            page = browser.new_page(viewport={"width": 1400, "height": 900})
            errors: list[str] = []
            page.on("console", lambda message: errors.append(message.text) if message.type == "error" else None)
            page.on("pageerror", lambda error: errors.append(str(error)))
            page.goto(page_path.as_uri())
            page.wait_for_load_state("load")
            assert page.locator("#explanation").inner_text() == "No step selected."
            page.click(f"g.node#{failing.identifier}")
            shown = page.locator("#explanation").inner_text()
            page.screenshot(path=str(ARTEFACTS / "graph_failing_step.png"), full_page=True)
        finally:
            browser.close()
    assert errors == []
    assert shown.startswith(f"step {failing.name} at {derivation}:19:1")
    assert "outcome: refuted" in shown and "  - block_clear(block_of(sig_a))" in shown


def test_steps_resting_on_a_failure_have_a_colour_of_their_own(monkeypatch, tmp_path):
    monkeypatch.chdir(ROOT)
    path = tmp_path / "broken_then_sound.p"
    # Step d claims r where resolving a with b gives q (worked by hand); e
    # resolves d's claim soundly, so it rests on the failure.
    path.write_text(
        "cnf(a, axiom, p).\ncnf(b, axiom, ~ p | q).\ncnf(c, negated_conjecture, ~ r).\n"
        "cnf(d, plain, r, inference(resolve, [status(thm)], [a, b])).\n"
        "cnf(e, plain, $false, inference(resolve, [status(thm)], [d, c])).\n", encoding="utf-8")
    report = check(str(path))
    outcomes = {step.name: step.outcome for step in report.steps}
    assert outcomes["e"] == "unfounded"
    dot = to_dot(proof_graph(open_derivation(str(path)), report), "t").source
    colours = {node.get("tooltip").strip('"').partition(":")[0]: node.get("fillcolor").strip('"')
               for node in pydot.graph_from_dot_data(dot)[0].get_nodes() if node.get("fillcolor")}
    assert len({colours[n] for n in ("a", "d", "e")}) == 3
