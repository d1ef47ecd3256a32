"""Timing of the fastener clause formulas: plain-float path against the rendered (handcalcs) path.

Target: each plain-float call well under 20 microseconds (design searches call them
thousands of times); the rendered path runs once per check on the calc sheet. Every
rendered call renders afresh: the in-process memo of whole renders
(``core.render._RENDERED``) is emptied before each, so the figure is handcalcs' work
with a warm line-parse cache, as in a calc kernel. Not timed: what a kernel does once
per formula (reading its source, innerscope's wrapper; about 1 ms a formula).

Run:  /tmp/venv/bin/python benchmarks/bench_fasteners.py
"""

from __future__ import annotations

import timeit

from splicecalc.core import Calc
from splicecalc.core import render as _render
from splicecalc.joints.bolts import F_b_Rd, F_v_Rd, bearing_resistance, check_bolt_bearing, get_bolt
from splicecalc.joints.welds import F_w_Rd, check_fillet_weld

TARGET_US = 20.0


def _per_call_us(fn, number: int, repeat: int = 5) -> float:
    return min(timeit.repeat(fn, number=number, repeat=repeat)) / number * 1e6


def main() -> None:
    bolt = get_bolt("M20", "8.8")
    cases = [
        ("F_v_Rd (Table 3.4)",
         lambda: F_v_Rd(alpha_v=0.6, f_ub=800.0, A_s=245.0, gamma_M2=1.25),
         lambda: Calc(render=True)(F_v_Rd, alpha_v=0.6, f_ub=800.0, A_s=245.0, gamma_M2=1.25)),
        ("F_b_Rd (Table 3.4)",
         lambda: F_b_Rd(k_1=2.5, alpha_b=0.606, f_u=410.0, d=20.0, t=10.0, gamma_M2=1.25),
         lambda: Calc(render=True)(F_b_Rd, k_1=2.5, alpha_b=0.606, f_u=410.0, d=20.0, t=10.0, gamma_M2=1.25)),
        ("bearing_resistance (alpha_d, alpha_b, k_1, F_b_Rd)",
         lambda: bearing_resistance(bolt, 10.0, 410.0, 40.0, 40.0, 70.0, 70.0),
         lambda: bearing_resistance(bolt, 10.0, 410.0, 40.0, 40.0, 70.0, 70.0, calc=Calc(render=True))),
        ("F_w_Rd (4.5.3.3)",
         lambda: F_w_Rd(a=4.2, f_u=410.0, beta_w=0.85, gamma_M2=1.25),
         lambda: Calc(render=True)(F_w_Rd, a=4.2, f_u=410.0, beta_w=0.85, gamma_M2=1.25)),
        ("check_bolt_bearing (validated, CheckRecord)",
         lambda: check_bolt_bearing(bolt, 50e3, 10.0, 410.0, 40.0, 40.0, 70.0, 70.0),
         lambda: check_bolt_bearing(bolt, 50e3, 10.0, 410.0, 40.0, 40.0, 70.0, 70.0, calc=Calc(render=True))),
        ("check_fillet_weld (validated, CheckRecord)",
         lambda: check_fillet_weld(500.0, 6.0, "S275", 10.0),
         lambda: check_fillet_weld(500.0, 6.0, "S275", 10.0, calc=Calc(render=True))),
    ]
    rows = []
    for name, plain, rendered in cases:
        rendered()  # warm the source and line-parse caches

        def afresh(fn=rendered) -> None:
            _render._RENDERED.clear()
            fn()

        p = _per_call_us(plain, 20000)
        r = _per_call_us(afresh, 20, repeat=3)
        rows.append((name, p, r))
    w = max(len(n) for n, _, _ in rows)
    print(f"{'call':<{w}}  {'float [us]':>11}  {'rendered [us]':>14}  {'ratio':>7}  target")
    print("-" * (w + 50))
    for name, p, r in rows:
        flag = "ok" if p < TARGET_US else "SLOW"
        if name.startswith("check_"):
            flag = "(check, no target)"
        print(f"{name:<{w}}  {p:11.2f}  {r:14.0f}  {r / p:7.0f}  {flag}")


if __name__ == "__main__":
    main()
