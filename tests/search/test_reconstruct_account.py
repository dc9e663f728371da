"""What the evidence search says it tried (``Reconstruction.tried``), the
account ``assay explain`` prints: the stages in the order they ran, each
with what it came to.  Steps worked by hand in an invented freight yard."""

from __future__ import annotations

from search_strategies import N, P, eq, fn

from checker.kernel.clauses import Clause
from checker.kernel.substitution import Substitution
from checker.kernel.terms import application, variable
from checker.search.reconstruct import DEFAULT_LIMITS, reconstruct

X = variable("X")
dock, yard, gate, truck1 = (application(name) for name in ("dock", "yard", "gate", "truck1"))


def test_a_single_resolution_is_found_at_the_first_stage():
    premises = [Clause([N("loaded", X), P("ready", X)]), Clause([P("loaded", truck1)])]
    found = reconstruct(premises, Clause([P("ready", truck1)]), "resolution")
    assert found.evidence is not None
    assert len(found.tried) == 1 and found.tried[0].startswith("single inference: candidate ")


def test_a_chain_is_found_after_the_screen_finds_no_counter_model():
    # ships(next(next(dock))), next(dock) = yard, next(yard) = gate: two rewrites give ships(gate).
    premises = [Clause([P("ships", fn("next", fn("next", dock)))]), Clause([eq(fn("next", dock), yard)]),
                Clause([eq(fn("next", yard), gate)])]
    found = reconstruct(premises, Clause([P("ships", gate)]), "demodulation")
    assert found.evidence is not None
    assert [line.split(":")[0] for line in found.tried] == [
        "single inference", f"counter-model screen (domain up to {DEFAULT_LIMITS.screen_domain})",
        "chain of rewrites and deletions"]
    assert found.tried[1].endswith("none found") and found.tried[2].endswith("2 inferences")


def test_a_claim_with_a_counter_model_skips_the_costly_stages():
    # ready(truck1) does not follow from loaded(truck1) alone: ready false everywhere is a model.
    found = reconstruct([Clause([P("loaded", truck1)])], Clause([P("ready", truck1)]))
    assert found.evidence is None
    assert len(found.tried) == 2
    assert "a counter-model exists" in found.tried[1] and "skipped" in found.tried[1]


def test_wrong_stated_bindings_are_tried_with_and_then_without_them():
    premises = [Clause([N("loaded", X), P("ready", X)]), Clause([P("loaded", truck1)])]
    stated = [Substitution({X: dock}), None]
    found = reconstruct(premises, Clause([P("ready", truck1)]), "resolution", stated=stated)
    assert found.wrong_bindings
    assert found.tried[0].startswith("on the stated instances: single inference")
    assert any(line.startswith("without the stated bindings: single inference: candidate") for line in found.tried)
