"""Benchmark: numerical M_cr and the member-check set on the plain-float path.

Times (best of several repeats, per call):
* one numerical M_cr solve at the default mesh (thin-walled beam elements with
  warping, UDL moment diagram, load on the top flange); budget 5 ms;
* the full member-check set for one section (classification, bending with
  tension-flange holes, shear, bending + shear, LTB with the numerical M_cr and
  C_1, web bearing, deflection) with ``Calc()`` (no rendering).

Run:  /tmp/venv/bin/python benchmarks/bench_mcr.py
Exit status 1 if the M_cr budget is exceeded.
"""

from __future__ import annotations

import sys
import timeit

from splicecalc.members import (DEFAULT_N_ELEMENTS, M_cr_numerical, check_bending, check_bending_shear,
                                check_deflection, check_ltb, check_shear, check_web_bearing, classify)
from splicecalc.sections import get_section

BUDGET_MCR_MS = 5.0
SECTION = get_section("457x191x67 UKB")
GRADE = "S355"
L = 7200.0          # mm, segment between lateral restraints
Q = 45.0            # N/mm (= kN/m), ULS line load


def moment(x):
    return Q * x * (L - x) / 2.0


def one_mcr() -> float:
    return M_cr_numerical(SECTION, L, moment, q_N_per_mm=Q, z_g_mm=SECTION.h / 2)


def member_set() -> list:
    M_Ed, V_Ed = Q * L**2 / 8, Q * L / 2
    return [
        classify(SECTION, GRADE),
        check_bending(SECTION, GRADE, M_Ed=M_Ed, A_f_net=(SECTION.b - 2 * 22.0) * SECTION.tf),
        check_shear(SECTION, GRADE, V_Ed=V_Ed),
        check_bending_shear(SECTION, GRADE, M_Ed=M_Ed, V_Ed=V_Ed),
        check_ltb(SECTION, GRADE, M_Ed=M_Ed, L_mm=L, M=moment, q_N_per_mm=Q, z_g_mm=SECTION.h / 2),
        check_web_bearing(SECTION, GRADE, F_Ed=V_Ed, s_s=100.0, c=20.0),
        check_deflection(14.0, L, 360.0),
    ]


def best_ms(fn, number: int, repeat: int = 5) -> float:
    return min(timeit.repeat(fn, number=number, repeat=repeat)) / number * 1e3


def main() -> int:
    one_mcr()
    member_set()   # warm-up (imports, caches)
    t_mcr = best_ms(one_mcr, 200)
    t_set = best_ms(member_set, 50)
    print(f"numerical M_cr, {DEFAULT_N_ELEMENTS} elements: {t_mcr:7.3f} ms per solve (budget {BUDGET_MCR_MS} ms)")
    print(f"member-check set (7 checks, 3 M_cr solves): {t_set:7.3f} ms per section")
    for rec in member_set():
        print("  " + rec.summary_line())
    return 0 if t_mcr < BUDGET_MCR_MS else 1


if __name__ == "__main__":
    sys.exit(main())
