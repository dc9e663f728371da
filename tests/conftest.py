"""Test-wide settings: property tests explore fresh examples on every local
run, and replay a fixed sequence in CI so that a landing never depends on
the luck of the draw (common practice with hypothesis)."""

import os

from hypothesis import settings

settings.register_profile("ci", derandomize=True, print_blob=True)
if os.environ.get("CI"):
    settings.load_profile("ci")
