"""A batch as a JUnit XML file, the test-report format CI systems read.

One test case per derivation (class name: its directory; name: its file
name).  ``accepted`` passes; ``rejected`` and ``undecided`` are failures and
``unreadable`` and internal errors are errors, each carrying the first
diagnosis with its location as the message and the full account as text.
"""

from __future__ import annotations

import os
import re
from xml.etree import ElementTree

from checker.batch import Batch
from checker.batch_report import first_problem
from checker.batch_results import FileResult
from checker.outcomes import ACCEPTED, INTERNAL_ERROR, UNREADABLE

SUITE_NAME = "assay batch"

# Characters XML 1.0 forbids (its Char production); a garbled file's excerpt may hold them.
_NOT_XML = re.compile("[^\u0009\u000a\u000d\u0020-\ud7ff\ue000-\ufffd\U00010000-\U0010ffff]")


def _xml_text(text: str) -> str:
    return _NOT_XML.sub("\ufffd", text)


def _account(result: FileResult) -> str:
    """Every line a person needs to find and understand the problem."""
    lines = [f"{result.path}: {result.verdict}"]
    if result.problem:
        lines.append(f"problem: {result.problem}")
    if result.error:
        lines.append(result.error)
    step = result.first_failure
    if step is not None:
        where = f"{step.location}: " if step.location else ""
        lines.append(f"{where}step {step.name} ({step.rule}): {step.outcome}: {step.message}")
        lines.extend(f"    {detail}" for detail in step.details)
    lines.extend(f"caution: {caution}" for caution in result.cautions)
    return _xml_text("\n".join(lines))


def _test_case(result: FileResult) -> ElementTree.Element:
    directory, name = os.path.split(result.path)
    case = ElementTree.Element(
        "testcase", classname=_xml_text(directory or "."), name=_xml_text(name), file=_xml_text(result.path),
        time=f"{result.seconds:.3f}",
    )
    if result.verdict != ACCEPTED:
        kind = "error" if result.verdict in (UNREADABLE, INTERNAL_ERROR) else "failure"
        outcome = ElementTree.SubElement(case, kind, message=_xml_text(first_problem(result)), type=result.verdict)
        outcome.text = _account(result)
    return case


def junit_xml(batch: Batch) -> ElementTree.ElementTree:
    cases = [_test_case(result) for result in batch.results]
    suite = ElementTree.Element(
        "testsuite",
        name=SUITE_NAME,
        tests=str(len(cases)),
        failures=str(sum(case.find("failure") is not None for case in cases)),
        errors=str(sum(case.find("error") is not None for case in cases)),
        skipped="0",
        time=f"{batch.seconds:.3f}",
    )
    suite.extend(cases)
    suites = ElementTree.Element("testsuites", name=SUITE_NAME, tests=suite.get("tests"),
                                 failures=suite.get("failures"), errors=suite.get("errors"), time=suite.get("time"))
    suites.append(suite)
    return ElementTree.ElementTree(suites)


def write_junit(batch: Batch, path: str) -> None:
    tree = junit_xml(batch)
    ElementTree.indent(tree)
    tree.write(path, encoding="utf-8", xml_declaration=True)
