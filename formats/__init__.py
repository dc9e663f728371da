"""Readers and writers of certificate and problem syntaxes.

They produce the plain data of :mod:`formats.derivation` and know nothing
of checking.
"""
