"""Fillet welds to EN 1993-1-8:2005, section 4.

Sources, beside each value: EN 1993-1-8 Table 4.1 (beta_w), 4.5.3.2 Eq. 4.1 (directional
method), 4.5.3.3 Eq. 4.3/4.4 (simplified method), 4.11 Eq. 4.9; published UK fillet-weld
resistance tables per mm for gamma_M2 = 1.25 (values from memory, flagged); hand calculations.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from splicecalc.core import Calc, InputError
from splicecalc.joints.welds import (BETA_W, F_w_Rd, F_w_Rd_dir, a_throat, beta_Lw_1, beta_w_for,
                                     check_fillet_weld, check_fillet_weld_geometry, check_fillet_weld_stresses,
                                     check_full_strength_fillet, full_strength_fillet, sigma_w_eq, weld_strength)


def test_beta_w_table_4_1():
    # EN 1993-1-8 Table 4.1
    assert [beta_w_for(g) for g in ("S235", "S275", "S355", "S420", "S460")] == [0.80, 0.85, 0.90, 1.00, 1.00]
    assert beta_w_for("s355j2") == 0.90
    with pytest.raises(InputError):
        beta_w_for("S690")


def test_throat():
    # 4.5.2: a = 0.7 s for equal-leg 90 degree fillets (common practice, 1/sqrt2 rounded down)
    assert a_throat(6.0) == pytest.approx(4.2)


@pytest.mark.parametrize("leg, grade, fu, bw, published_kN_per_mm", [
    (6, "S275", 410, 0.85, 0.94),   # published fillet weld table, longitudinal, S275 (from memory)
    (8, "S275", 410, 0.85, 1.25),   # same table (from memory)
    (8, "S355", 470, 0.90, 1.35),   # same table, S355 (from memory)
    (6, "S355", 470, 0.90, 1.01),   # same table (from memory)
])
def test_simplified_per_mm(leg, grade, fu, bw, published_kN_per_mm):
    # 4.5.3.3 Eq. 4.3/4.4: F_w,Rd = a f_u / (sqrt3 beta_w gamma_M2)
    expected = 0.7 * leg * fu / (math.sqrt(3) * bw * 1.25)  # N/mm = kN/m
    r = check_fillet_weld(0.0, leg, grade, 10.0)
    assert r.resistance == pytest.approx(expected)
    assert r.unit == "kN/m"
    assert r.resistance / 1e3 == pytest.approx(published_kN_per_mm, abs=0.006)


def test_6mm_s275_expression():
    # the brief's reference value: 0.7*6*410/(sqrt3*0.85*1.25) = 0.936 kN/mm
    assert F_w_Rd(a=0.7 * 6, f_u=410.0, beta_w=0.85, gamma_M2=1.25) / 1e3 == pytest.approx(0.936, abs=5e-4)


@pytest.mark.parametrize("leg, grade, published_kN_per_mm", [
    (6, "S275", 1.15),   # published fillet weld table, transverse, S275 (from memory)
    (8, "S355", 1.65),   # same table, S355 (from memory)
])
def test_directional_transverse_published(leg, grade, published_kN_per_mm):
    fu, bw = weld_strength(grade, 10.0)[:2]
    # Eq. 4.1, transverse: sigma_perp = tau_perp = F/(a sqrt2) -> F = a fu / (beta_w gamma_M2 sqrt2)
    expected = 0.7 * leg * fu / (bw * 1.25 * math.sqrt(2))
    r = check_fillet_weld(0.0, leg, grade, 10.0, theta=90.0)
    assert r.resistance == pytest.approx(expected)
    assert r.resistance / 1e3 == pytest.approx(published_kN_per_mm, abs=0.01)


def test_directional_longitudinal_equals_simplified():
    # theta = 0: only tau_par, Eq. 4.1 reduces to the simplified method
    assert F_w_Rd_dir(4.2, 410.0, 0.85, 1.25, 0.0) == pytest.approx(F_w_Rd(4.2, 410.0, 0.85, 1.25))
    # K = sqrt(3/(2 + cos^2 45deg)) = sqrt(1.2) at 45 degrees
    assert F_w_Rd_dir(4.2, 410.0, 0.85, 1.25, 45.0) == pytest.approx(math.sqrt(1.2) * F_w_Rd(4.2, 410.0, 0.85, 1.25))


def test_directional_stresses():
    # Eq. 4.1 by hand: sqrt(150^2 + 3 (100^2 + 60^2)) against 470/(0.9*1.25); 0.9*470/1.25 for sigma_perp
    assert sigma_w_eq(150.0, 100.0, 60.0) == pytest.approx(math.sqrt(150 ** 2 + 3 * (100 ** 2 + 60 ** 2)))
    r = check_fillet_weld_stresses(150.0, 100.0, 60.0, "S355", 12.0)
    u1 = math.sqrt(150 ** 2 + 3 * (100 ** 2 + 60 ** 2)) / (470 / (0.9 * 1.25))
    assert r.utilisation == pytest.approx(max(u1, 150 / (0.9 * 470 / 1.25)))
    # pure normal stress: second condition governs when beta_w = 1.0 (S460): 1/(1*1.25) vs 0.9/1.25
    r2 = check_fillet_weld_stresses(300.0, 0.0, 0.0, "S460", 12.0)
    assert r2.utilisation == pytest.approx(300 / (0.9 * 540 / 1.25))


def test_weaker_part_governs():
    # 4.5.3.2(6): S275 (fu 410, bw 0.85) welded to S355 -> S275 values
    assert weld_strength("S355", 10.0, "S275", 10.0) == (410.0, 0.85, "S275")
    r1 = check_fillet_weld(0.0, 8, "S355", 10.0, grade_other="S275")
    r2 = check_fillet_weld(0.0, 8, "S275", 10.0)
    assert r1.resistance == pytest.approx(r2.resistance)


def test_long_weld():
    # 4.11 Eq. 4.9: L_j = 1200, a = 4.2: 1.2 - 0.2*1200/(150*4.2) = 0.819
    assert beta_Lw_1(1200.0, 4.2) == pytest.approx(1.2 - 0.2 * 1200 / (150 * 4.2))
    r = check_fillet_weld(0.0, 6, "S275", 10.0, L_j=1200.0)
    assert r.resistance == pytest.approx((1.2 - 0.2 * 1200 / 630) * 0.7 * 6 * 410 / (math.sqrt(3) * 0.85 * 1.25))
    # short weld (L_j <= 150 a): no reduction
    assert check_fillet_weld(0.0, 6, "S275", 10.0, L_j=600.0).resistance == pytest.approx(r.resistance / 0.819, rel=1e-3)


def test_full_strength():
    # double fillet, transverse (Eq. 4.1): a = beta_w gamma_M2 fy t / (sqrt2 fu gamma_M0)
    fs = full_strength_fillet(10.0, "S275")
    a = 0.85 * 1.25 * 275 * 10 / (math.sqrt(2) * 410 * 1.0)
    assert fs.a_req == pytest.approx(a)
    assert fs.s == math.ceil(a / 0.7)  # 7.2 mm leg -> 8 mm
    # simplified: a = sqrt3 beta_w gamma_M2 fy t / (2 fu gamma_M0) for S355 12 mm
    fs2 = full_strength_fillet(12.0, "S355", method="simplified")
    assert fs2.a_req == pytest.approx(math.sqrt(3) * 0.9 * 1.25 * 355 * 12 / (2 * 470))
    # the pair at the required throat resists exactly t fy / gamma_M0 transversely (consistency with Eq. 4.1)
    assert 2 * F_w_Rd_dir(fs.a_req, 410.0, 0.85, 1.25, 90.0) == pytest.approx(10 * 275)
    r = check_full_strength_fillet(8, 10.0, "S275")
    assert r.ok and r.utilisation == pytest.approx(a / 5.6)


def test_geometry_minima():
    # 4.5.2(2) a >= 3 mm; 4.5.1(2) L >= max(30, 6a)
    r_a, r_L = check_fillet_weld_geometry(4.0, 25.0)
    assert not r_a.ok and r_a.resistance == pytest.approx(2.8)
    assert not r_L.ok and r_L.demand == 30.0
    r_a, r_L = check_fillet_weld_geometry(10.0, 40.0)
    assert r_a.ok and r_L.demand == pytest.approx(42.0) and not r_L.ok


RENDER_CASES = [
    lambda c: check_fillet_weld(600.0, 6, "S275", 10.0, calc=c),
    lambda c: check_fillet_weld(600.0, 8, "S355", 10.0, theta=60.0, L_j=1500.0, calc=c),
    lambda c: check_fillet_weld_stresses(120.0, 80.0, 50.0, "S275", 10.0, calc=c),
    lambda c: check_full_strength_fillet(8, 10.0, "S275", calc=c),
]


@pytest.mark.parametrize("case", RENDER_CASES)
def test_rendered_equals_float(case):
    plain, rend = case(Calc()), case(Calc(render=True))
    assert rend.resistance == pytest.approx(plain.resistance, rel=1e-9)
    assert rend.utilisation == pytest.approx(plain.utilisation, rel=1e-9)
    assert rend.latex and "\\begin{aligned}" in rend.latex[0]


@settings(max_examples=60, deadline=None)
@given(s=st.floats(3.0, 25.0), ds=st.floats(0.0, 10.0), theta=st.floats(0.0, 90.0), dth=st.floats(0.0, 90.0),
       grade=st.sampled_from(sorted(BETA_W)))
def test_monotonic(s, ds, theta, dth, grade):
    # larger leg never weaker; a force turned towards transverse never lowers the directional resistance
    r = check_fillet_weld(0.0, s, grade, 10.0, theta=theta).resistance
    assert check_fillet_weld(0.0, s + ds, grade, 10.0, theta=theta).resistance >= r - 1e-9
    assert check_fillet_weld(0.0, s, grade, 10.0, theta=min(theta + dth, 90.0)).resistance >= r - 1e-9
    assert check_fillet_weld(0.0, s, grade, 10.0).resistance <= r + 1e-9


BAD = [0.0, -1.0, float("nan"), float("inf"), "x", None]


@settings(max_examples=50, deadline=None)
@given(bad=st.sampled_from(BAD), which=st.integers(0, 4))
def test_bad_input_only_input_error(bad, which):
    assume(not (bad is None and which == 4))  # L_j=None means "not a long joint"
    calls = [
        lambda: check_fillet_weld(100.0, bad, "S275", 10.0),
        lambda: check_fillet_weld(100.0, 6, "S275", bad),
        lambda: full_strength_fillet(bad, "S275"),
        lambda: check_fillet_weld_geometry(6.0, bad),
        lambda: check_fillet_weld(100.0, 6, "S275", 10.0, L_j=bad),
    ]
    with pytest.raises(InputError):
        calls[which]()


@pytest.mark.parametrize("call", [
    lambda: check_fillet_weld(-5.0, 6, "S275", 10.0),
    lambda: check_fillet_weld(100.0, 6, "S275", 10.0, theta=120.0),
    lambda: check_fillet_weld(100.0, 6, "X99", 10.0),
    lambda: check_fillet_weld_stresses(float("nan"), 0.0, 0.0, "S275", 10.0),
    lambda: full_strength_fillet(10.0, "S275", method="guess"),
])
def test_bad_values(call):
    with pytest.raises(InputError):
        call()
