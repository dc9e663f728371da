"""The trusted kernel: everything assay's verdicts rest on.

Standard library only, no search, no file reading.  Read the modules in
this order: terms, substitution, clauses, rules (the primitive inferences
and the conclusion test), formulas, then the clausifier and model
evaluation.
"""
