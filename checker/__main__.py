"""``python -m checker`` is the ``assay`` command."""

from checker.cli import main

main(prog_name="assay")
