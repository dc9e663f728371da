"""assay: an independent checker for first-order resolution proofs."""
