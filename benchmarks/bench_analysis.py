"""Benchmark: exact analysis of a simply supported beam with six loads.

Times (best of several repeats, per call):
* building ``SimpleBeam`` (reactions, integration constant);
* V, M, w on 201 points (vectorised);
* the exact maxima search (M_max, V_max, w_max with Brent's method);
* ULS combinations (6.10a/6.10b) plus the governing-moment search and a 201-point envelope.

Run:  /tmp/venv/bin/python benchmarks/bench_analysis.py
"""

from __future__ import annotations

import timeit

import numpy as np

from splicecalc.actions import UDL, PointLoad, self_weight_udl, uls_combinations
from splicecalc.analysis import SimpleBeam, envelope, governing_M

SPAN = 8400.0     # mm
I_Y = 5.5e8       # mm4
LOADS = [
    self_weight_udl(82.2),
    UDL("floor finishes", "permanent", 9.0),
    UDL("office floor", "imposed", 12.5, category="B"),
    UDL("archive zone", "imposed", 7.0, 2500.0, 5200.0, category="E", group="archive"),
    PointLoad("trimmer reaction", "permanent", 38e3, 3100.0),
    PointLoad("plant skid", "imposed", 22e3, 6300.0, category="E", group="archive"),
]
X = np.linspace(0.0, SPAN, 201)


def _time(label: str, fn, number: int) -> None:
    best = min(timeit.repeat(fn, number=number, repeat=5)) / number
    print(f"{label:<52} {best * 1e6:10.1f} us")


def main() -> None:
    beam = SimpleBeam(SPAN, LOADS, I=I_Y)
    combos = uls_combinations(LOADS)
    print(f"6-load beam, span {SPAN / 1e3:.1f} m, {len(combos)} ULS combinations")
    _time("SimpleBeam(...) construction", lambda: SimpleBeam(SPAN, LOADS, I=I_Y), 2000)
    _time("V, M, w on 201 points", lambda: (beam.V(X), beam.M(X), beam.w(X)), 2000)
    _time("construction + V, M, w on 201 points",
          lambda: (lambda b: (b.V(X), b.M(X), b.w(X)))(SimpleBeam(SPAN, LOADS, I=I_Y)), 1000)
    _time("M_max (exact)", beam.M_max, 2000)
    _time("V_max (exact)", beam.V_max, 2000)
    _time("w_max (Brent root of slope)", beam.w_max, 500)
    _time("uls_combinations (6.10a + 6.10b per leading)", lambda: uls_combinations(LOADS), 2000)
    _time("governing_M over all ULS combinations", lambda: governing_M(combos, SPAN), 500)
    _time("envelope on 201 points over all ULS combinations", lambda: envelope(combos, SPAN), 500)


if __name__ == "__main__":
    main()
