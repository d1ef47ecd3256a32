"""Time the section catalogue: cold build (read CSV + compute every property) and one look-up.

Run: python benchmarks/bench_catalogue.py
Budget: the whole catalogue in under 50 ms. Exit status 1 if the budget is exceeded.
"""

from __future__ import annotations

import statistics
import sys
import time

from splicecalc.sections import get_section, list_sections, properties
from splicecalc.sections.catalogue import clear_cache

BUDGET_MS = 50.0


def _best_and_median(fn, repeat: int) -> tuple[float, float]:
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return min(times), statistics.median(times)


def cold_build() -> None:
    clear_cache()
    list_sections()


def main() -> int:
    n = len(list_sections())
    best, med = _best_and_median(cold_build, 50)
    print(f"catalogue cold build ({n} sections, read CSV + all properties): "
          f"best {best * 1e3:.2f} ms, median {med * 1e3:.2f} ms (budget {BUDGET_MS:.0f} ms)")

    dims = [(s.h, s.b, s.tw, s.tf, s.r) for s in list_sections()]
    best_p, _ = _best_and_median(lambda: [properties(*d) for d in dims], 50)
    print(f"properties only, all {n} sections: best {best_p * 1e3:.2f} ms "
          f"({best_p / n * 1e6:.1f} us a section)")

    get_section("533x210x92 UKB")      # warm
    k = 10_000
    t0 = time.perf_counter()
    for _ in range(k):
        get_section("533 x 210 x 92 ukb")
    t_get = (time.perf_counter() - t0) / k
    print(f"get_section (warm catalogue): {t_get * 1e6:.1f} us a call")

    t0 = time.perf_counter()
    clear_cache()
    get_section("IPE 300")
    print(f"get_section on a cold catalogue (first call in a process): "
          f"{(time.perf_counter() - t0) * 1e3:.2f} ms")
    ok = med * 1e3 < BUDGET_MS
    print("budget:", "OK" if ok else "EXCEEDED")
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())
