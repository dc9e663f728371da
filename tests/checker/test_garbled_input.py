"""Garbled input never crashes assay: it is unreadable with a location, or
it is checked; it is never an internal error.

Common practice (robustness testing): random single edits of valid files
reach the error paths that hand-written bad inputs miss.
"""

from pathlib import Path

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from checker.outcomes import INTERNAL_ERROR, UNREADABLE
from checker.run import check
from checker.search.reconstruct import DEFAULT_LIMITS

FIXTURES = Path(__file__).resolve().parents[2] / "fixtures"
SOURCES = [
    FIXTURES / "demo" / "interlock.jsonl",
    FIXTURES / "tptp" / "pelletier" / "p41_refutation.p",
    FIXTURES / "tptp" / "derivations" / "oxygen_supply_nested" / "proof.p",
]
PIECES = ["(", ")", ",", ".", "[", "]", "~", "|", "&", "=", "!=", "X", "a", "'", '"', "{", "}", ":", "$false", "\n", "%"]


@st.composite
def garbled(draw):
    source = draw(st.sampled_from(SOURCES))
    text = source.read_text()
    for _ in range(draw(st.integers(1, 3))):
        at = draw(st.integers(0, len(text)))
        if draw(st.booleans()):
            text = text[:at] + draw(st.sampled_from(PIECES)) + text[at:]
        else:
            text = text[:at] + text[at + draw(st.integers(1, 8)):]
    return source, text


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(garbled())
def test_garbled_file_is_unreadable_or_checked_never_an_internal_error(tmp_path, case):
    source, text = case
    path = tmp_path / source.name
    path.write_text(text)
    report = check(str(path), limits=DEFAULT_LIMITS.scaled(0.25))
    assert report.verdict != INTERNAL_ERROR, report.error
    if report.verdict == UNREADABLE:
        assert report.error and str(path) in report.error
