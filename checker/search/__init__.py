"""Untrusted search for the evidence the kernel checks.

Nothing here is trusted: whatever a search finds is handed to the kernel,
which recomputes it.  The entry point for clause steps is
:func:`checker.search.reconstruct.reconstruct`.
"""
