"""The benchmark generator's derivations (bench/generate.py) are valid by
construction, so assay must accept them in both forms; a changed step in
each must be rejected at that step (the figures of bench/ are only worth
something if what is timed is checked for real)."""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

sys.path.insert(0, str(Path(__file__).resolve().parents[2] / "bench"))

from generate import KINDS, generate, write

from checker.run import check


@pytest.fixture(scope="module")
def generated(tmp_path_factory):
    directory = tmp_path_factory.mktemp("generated")
    out = generate(110)
    return out, write(out, str(directory))


def test_every_kind_of_block_is_present_and_the_count_is_near_the_size(generated):
    out, paths = generated
    text = Path(paths["tptp"]).read_text()
    for marker in ("inference(resolution", "inference(demodulation", "inference(rewrite_and_simplify",
                   "inference(skolemize", "avatar_split_clause", "$false"):
        assert marker in text
    assert 100 <= out.steps <= 130 and len(KINDS) == 5


@pytest.mark.parametrize("form", ["tptp", "native"])
def test_generated_derivations_are_accepted(generated, form):
    _, paths = generated
    report = check(paths[form], paths["problem"])
    assert report.verdict == "accepted", [s for s in report.steps if s.outcome not in ("checked", "reconstructed")]


@pytest.mark.parametrize("form, old, new, step", [
    # A hop to the wrong depot: resolution cannot give it.
    ("tptp", "cnf(reached0_3, plain, at0(parcel0, depot3)", "cnf(reached0_3, plain, at0(parcel0, depot4)", "reached0_3"),
    ("native", '"formula": "at0(parcel0, depot3)"', '"formula": "at0(parcel0, depot4)"', "reached0_3"),
    # The bundled step claims a crate the rewrites never reach.
    ("tptp", "cnf(unpacked1, plain, sealed1(crate1)", "cnf(unpacked1, plain, sealed1(crate0)", "unpacked1"),
])
def test_a_changed_step_is_rejected_at_that_step(generated, tmp_path, form, old, new, step):
    _, paths = generated
    text = Path(paths[form]).read_text()
    assert old in text
    changed = tmp_path / Path(paths[form]).name
    changed.write_text(text.replace(old, new, 1))
    report = check(str(changed), paths["problem"])
    assert report.verdict == "rejected"
    bad = [s for s in report.steps if s.outcome in ("failed", "refuted")]
    assert bad and bad[0].name == step
