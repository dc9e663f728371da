"""Every line and branch of the trusted kernel is covered by the kernel's own tests.

A pytest plug-in (loaded by tests/conftest.py).  When a run includes every
test file of tests/kernel/ in one process, without -k or -m selection (as
CI's plain ``python3 -m pytest`` does), it measures line and branch
coverage of checker/kernel/ while those tests run (and while modules are
imported, for the definitions themselves), and fails the run below 100%,
naming the missed lines and branches.  Other runs (a single file, ``-n``
workers, a run already under ``--cov``) are not measured, so they cost
nothing extra.
"""

from __future__ import annotations

import io
from pathlib import Path

import pytest

TESTS = Path(__file__).resolve().parent
KERNEL = TESTS.parent / "checker" / "kernel"
KERNEL_TESTS = TESTS / "kernel"

_measure = None
_kernel_items: set[str] = set()
_failed = False


def _wanted(config) -> bool:
    if hasattr(config, "workerinput") or getattr(config.option, "numprocesses", None):
        return False
    if getattr(config.option, "cov_source", None) or config.option.keyword or config.option.markexpr:
        return False
    if getattr(config.option, "collectonly", False):
        return False
    if any("::" in a for a in config.args):
        return False
    paths = [Path(a).resolve() for a in config.args] or [TESTS]
    return any(KERNEL_TESTS.is_relative_to(p) for p in paths)


def pytest_configure(config):
    global _measure
    if not _wanted(config):
        return
    import coverage

    _measure = coverage.Coverage(data_file=None, branch=True, source=[str(KERNEL)], config_file=False)
    _measure.start()  # kernel modules are imported while tests are collected


def pytest_collection_finish(session):
    global _measure
    if _measure is None:
        return
    _measure.stop()
    files = {item.path for item in session.items if KERNEL_TESTS in item.path.parents}
    if files != set(KERNEL_TESTS.glob("test_*.py")):
        _measure = None  # not every kernel test runs: coverage would say nothing


@pytest.hookimpl(hookwrapper=True)
def pytest_runtest_call(item):
    measuring = _measure is not None and KERNEL_TESTS in item.path.parents
    if measuring:
        _measure.start()
    try:
        yield
    finally:
        if measuring:
            _measure.stop()


def pytest_runtest_logreport(report):
    global _failed
    if report.failed:
        _failed = True


def pytest_sessionfinish(session, exitstatus):
    if _measure is None or _failed:
        return
    out = io.StringIO()
    percent = _measure.report(file=out, show_missing=True, skip_covered=True)
    if percent < 100.0:
        reporter = session.config.pluginmanager.get_plugin("terminalreporter")
        text = f"kernel coverage by tests/kernel is {percent:.2f}%, not 100% (lines and branches):\n{out.getvalue()}"
        if reporter is not None:
            reporter.write_line(text, red=True)
        session.exitstatus = pytest.ExitCode.TESTS_FAILED
