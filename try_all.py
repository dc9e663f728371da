import sys, time, glob, os
from checker.elaborate import elaborate
from checker.run import check
cases = []
for d in sorted(glob.glob("fixtures/tptp/derivations/*/")) + sorted(glob.glob("fixtures/tptp/splitting/*/")) + sorted(glob.glob("fixtures/tptp/typed/*/")):
    prob = d + "problem.p"
    cases.append((d + "proof.p", prob if os.path.exists(prob) else None))
cases.append(("fixtures/demo/interlock.jsonl", None))
if len(sys.argv) > 1: cases = [c for c in cases if sys.argv[1] in c[0]]
for src, prob in cases:
    t=time.process_time(); e = elaborate(src, "/tmp/out.jsonl", prob); t1=time.process_time()-t
    if not e.written:
        print("NOT WRITTEN", src, e.report.verdict); continue
    t=time.process_time(); r = check("/tmp/out.jsonl"); t2=time.process_time()-t
    bad = [s for s in r.steps if s.outcome not in ("checked","assumed")]
    flag = "OK " if r.verdict == e.report.verdict and not bad else "BAD"
    print(flag, src, e.report.verdict, r.verdict, r.counts, f"{t1:.2f}s -> {t2:.2f}s", r.error or "")
    for s in bad[:4]: print("     ", s.name, s.outcome, s.message[:160], s.details[:2])
