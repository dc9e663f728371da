"""A derivation whose terms nest 100,000 deep is read and checked end to
end, search included, without hitting Python's recursion limit."""

from checker.outcomes import ACCEPTED
from checker.run import check

DEPTH = 100_000


def test_hundred_thousand_deep_terms_are_checked_end_to_end(tmp_path):
    deep = "f(" * DEPTH + "crate0" + ")" * DEPTH
    proof = tmp_path / "deep.p"
    proof.write_text(
        f"""
        cnf(c1, axiom, stacked({deep}) | misplaced(X)).
        cnf(c2, axiom, ~ stacked(X) | counted(X)).
        cnf(c3, plain, counted({deep}) | misplaced(Y), inference(resolve, [status(thm)], [c1, c2])).
        cnf(c4, axiom, ~ counted(X)).
        cnf(c5, axiom, ~ misplaced(X)).
        cnf(c6, plain, misplaced(Y), inference(resolve, [status(thm)], [c3, c4])).
        cnf(c7, plain, $false, inference(resolve, [status(thm)], [c6, c5])).
        """
    )
    report = check(str(proof))
    assert report.verdict == ACCEPTED, report.first_failure or report.error
    assert report.counts == {"reconstructed": 3, "assumed": 4}
