"""assay: an independent checker for first-order resolution proofs.

``check(path, problem=None, ...)`` checks one certificate and returns its
:class:`~checker.outcomes.Report`; the command line is a thin layer over it.
"""


def check(*args, **kwargs):
    """Check a certificate; see :func:`checker.run.check`."""
    from checker.run import check as run_check

    return run_check(*args, **kwargs)
