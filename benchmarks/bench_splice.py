"""Speed of the splice design on the plain-float path.

1. Automatic layout of one splice over the full search space (target < 0.2 s).
2. Full design of a 3-piece beam: positions, two splices, all checks (target < 1 s).

Run: /tmp/venv/bin/python benchmarks/bench_splice.py
Scenario (invented): an 8 m transfer beam in a refurbished workshop, 457x191x67 UKB S355,
45 kN/m plus a 60 kN point load at mid-span (factored).
"""

from __future__ import annotations

import statistics
import time

from splicecalc.actions.loads import PointLoad, UDL
from splicecalc.analysis import SimpleBeam
from splicecalc.design import splice_layout
from splicecalc.design.splice_layout import design_splice, search_layouts
from splicecalc.design.splice_plan import plan_splices
from splicecalc.design.splice_positions import envelope
from splicecalc.joints.splice import parse_splices
from splicecalc.sections import get_section


def timed(fn, n=7):
    """Median and worst time of ``fn``; each run searches afresh (the remembered searches are
    forgotten first: the calc path may repeat a search, a benchmark must not time the memo)."""
    fn()                                   # warm-up (imports, catalogue)
    ts = []
    for _ in range(n):
        splice_layout._SEARCHES.clear()
        t = time.perf_counter()
        fn()
        ts.append(time.perf_counter() - t)
    return statistics.median(ts), max(ts)


def main() -> None:
    sec = get_section("457x191x67 UKB")
    spec_auto = parse_splices({})
    cases = [(250e6, 200e3), (100e6, 300e3), (350e6, 100e3)]
    print("automatic layout of one splice (bolts = auto, outer plates), target < 0.2 s")
    for M, V in cases:
        med, worst = timed(lambda: search_layouts(sec, "S355", M, V, 0.0, spec_auto))
        d = design_splice(sec, "S355", M, V, spec=spec_auto)
        print(f"  M = {M / 1e6:5.0f} kNm, V = {V / 1e3:4.0f} kN: median {med * 1e3:6.1f} ms, max {worst * 1e3:6.1f} ms"
              f"  {'OK ' if med < 0.2 else 'SLOW'}  -> {d.describe()}")
    spec_in = parse_splices({"flange_plates": "outer+inner"})
    med, worst = timed(lambda: search_layouts(sec, "S355", 250e6, 200e3, 0.0, spec_in))
    print(f"  outer+inner plates: median {med * 1e3:6.1f} ms, max {worst * 1e3:6.1f} ms  {'OK ' if med < 0.2 else 'SLOW'}")

    L = 8000.0
    beam = SimpleBeam(L, [UDL("w", "permanent", 45.0), PointLoad("P", "permanent", 60e3, x=4000.0)])
    Ma, Va, at = envelope([beam], ["ULS"])
    spec3 = parse_splices({"pieces": 3, "clearance": "300 mm"})

    def full():
        # the same loop the calc runs (design.splice_plan.plan_splices): positions <-> layouts until stable
        return plan_splices(sec, "S355", L, spec3, M_abs=Ma, V_abs=Va, at=at, avoid=[4000.0])

    med, worst = timed(full, n=5)
    plan = full()
    pos, ds = plan.positions, plan.designs
    print("full design of a 3-piece beam (positions, two splices, all checks), target < 1 s")
    print(f"  median {med * 1e3:6.1f} ms, max {worst * 1e3:6.1f} ms  {'OK ' if med < 1.0 else 'SLOW'}; "
          f"splices at {[round(x) for x in pos.positions]} mm, {sum(len(d.records) for d in ds)} check records, "
          f"all ok: {all(d.ok for d in ds)}")


if __name__ == "__main__":
    main()
