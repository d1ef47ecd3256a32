"""Bolts to EN 1993-1-8:2005, section 3.

Sources, beside each value:
* EN 1993-1-8:2005 Table 3.1 (f_yb, f_ub), Table 3.4 (resistances), 3.6.1(12), 3.7, 3.8, 3.9;
* EN ISO 898-1 tensile stress areas; EN 1090-2 Table 11 hole clearances;
* published UK bolt resistance tables for gamma_M2 = 1.25 (values quoted from memory, flagged);
* hand calculations from the clauses, written as expressions.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from splicecalc.core import Calc, InputError
from splicecalc.joints import bolts as B
from splicecalc.joints.bolts import (F_b_Rd, F_t_Rd, F_v_Rd, bearing_resistance, beta_Lf, beta_p,
                                     check_bolt_bearing, check_bolt_group, check_bolt_shear, check_bolt_tension,
                                     check_punching, check_shear_tension, check_slip, get_bolt)
from splicecalc.materials import UK_NA

REL = 1e-3  # published tables are rounded to 0.1 kN or 3 significant figures


# ----------------------------------------------------------------------- data
@pytest.mark.parametrize("size, A_s", [("M12", 84.3), ("M16", 157.0), ("M20", 245.0), ("M22", 303.0),
                                       ("M24", 353.0), ("M27", 459.0), ("M30", 561.0), ("M36", 817.0)])
def test_stress_areas(size, A_s):
    # EN ISO 898-1 tensile stress areas
    assert get_bolt(size).A_s == A_s


@pytest.mark.parametrize("size, d0, d0_over", [("M12", 13, 15), ("M16", 18, 20), ("M20", 22, 24), ("M22", 24, 26),
                                               ("M24", 26, 30), ("M27", 30, 35), ("M30", 33, 38), ("M36", 39, 44)])
def test_hole_clearances(size, d0, d0_over):
    # EN 1090-2 Table 11: normal +1/+2/+3, oversize +3/+4/+6/+8
    b = get_bolt(size)
    assert (b.d_0, b.d_0_oversize) == (d0, d0_over)
    assert b.hole("oversize") == d0_over


@pytest.mark.parametrize("cls, fyb, fub", [("4.6", 240, 400), ("8.8", 640, 800), ("10.9", 900, 1000)])
def test_bolt_classes(cls, fyb, fub):
    # EN 1993-1-8 Table 3.1
    b = get_bolt("M20", cls)
    assert (b.f_yb, b.f_ub) == (fyb, fub)
    assert b.A == pytest.approx(math.pi * 20 ** 2 / 4)  # gross shank area


def test_get_bolt_tolerant_and_numeric_class():
    assert get_bolt(" m20 ", 10.9).bolt_class == "10.9"


@pytest.mark.parametrize("size, cls, field", [("M21", "8.8", "size"), ("M20", "9.9", "bolt_class"),
                                              (20, "8.8", "size"), ("M20", None, "bolt_class")])
def test_unknown_bolt_lists_allowed(size, cls, field):
    with pytest.raises(InputError) as e:
        get_bolt(size, cls)
    assert e.value.field == field
    assert ("M20" in str(e.value)) if field == "size" else ("10.9" in str(e.value))


def test_alpha_v():
    # EN 1993-1-8 Table 3.4: 0.6 for 4.6/8.8 through threads, 0.5 for 10.9; 0.6 through the shank
    assert B.shear_factor_alpha_v("8.8") == 0.6
    assert B.shear_factor_alpha_v("4.6") == 0.6
    assert B.shear_factor_alpha_v("10.9") == 0.5
    assert B.shear_factor_alpha_v("10.9", threads_in_shear_plane=False) == 0.6


# -------------------------------------------------------- published tables
@pytest.mark.parametrize("size, cls, expected_kN", [
    ("M20", "8.8", 94.1),   # published bolt resistance table, single shear, gamma_M2 = 1.25 (from memory)
    ("M24", "8.8", 135.6),  # same table (from memory)
    ("M20", "10.9", 98.0),  # same table (from memory)
    ("M16", "8.8", 60.3),   # same table (from memory)
    ("M12", "8.8", 32.4),   # same table (from memory)
    ("M30", "8.8", 215.0),  # same table, 3 s.f. (from memory)
    ("M20", "4.6", 47.0),   # same table (from memory)
])
def test_shear_published(size, cls, expected_kN):
    b = get_bolt(size, cls)
    r = check_bolt_shear(b, 0.0)
    assert r.resistance == pytest.approx(expected_kN, rel=3e-3)
    assert r.unit == "kN"


@pytest.mark.parametrize("size, expected_kN", [
    ("M20", 141.0),  # published bolt resistance table, tension 8.8, gamma_M2 = 1.25 (from memory)
    ("M24", 203.0),  # same table (from memory)
    ("M16", 90.4),   # same table (from memory)
])
def test_tension_published(size, expected_kN):
    r = check_bolt_tension(get_bolt(size, "8.8"), 0.0)
    assert r.resistance == pytest.approx(expected_kN, rel=3e-3)


def test_preload_published():
    # F_p,C = 0.7 f_ub A_s, Eq. 3.7; published preload table M20 8.8: 137 kN (from memory)
    assert B.F_p_C(800.0, 245.0) == pytest.approx(0.7 * 800 * 245)
    assert B.F_p_C(800.0, 245.0) / 1e3 == pytest.approx(137.0, rel=2e-3)


# -------------------------------------------------------- hand calculations
def test_shear_formula_hand():
    # Table 3.4: F_v,Rd = alpha_v f_ub A / gamma_M2
    assert F_v_Rd(0.6, 800.0, 245.0, 1.25) == pytest.approx(0.6 * 800 * 245 / 1.25)
    # shank in shear plane, double shear: 2 x 0.6 x 800 x pi 20^2/4 / 1.25
    r = check_bolt_shear(get_bolt("M20"), 100e3, n_s=2, threads_in_shear_plane=False)
    assert r.resistance == pytest.approx(2 * 0.6 * 800 * math.pi * 400 / 4 / 1.25 / 1e3)


def test_bearing_formula_direct():
    # Table 3.4: F_b,Rd = k1 alpha_b fu d t / gamma_M2, times 0.8 for oversize holes (note 1)
    assert F_b_Rd(2.5, 0.606, 410.0, 20.0, 10.0, 1.25) == pytest.approx(2.5 * 0.606 * 410 * 20 * 10 / 1.25)
    assert F_b_Rd(2.5, 0.606, 410.0, 20.0, 10.0, 1.25, k_hole=0.8) == pytest.approx(0.8 * 2.5 * 0.606 * 410 * 200 / 1.25)


def test_bearing_hand_end_edge():
    # Table 3.4, M20 (d0 = 22) in 10 mm S275 (fu 410): e1 = 40, p1 = 70, e2 = 40, p2 = 70
    # alpha_d = min(40/(3*22), 70/(3*22) - 1/4) = 0.6061; alpha_b = min(0.6061, 800/410, 1)
    # k1 = min(2.8*40/22 - 1.7, 1.4*70/22 - 1.7, 2.5) = 2.5
    alpha = 40 / (3 * 22)
    k1 = min(2.8 * 40 / 22 - 1.7, 1.4 * 70 / 22 - 1.7, 2.5)
    expected = k1 * alpha * 410 * 20 * 10 / 1.25
    r = check_bolt_bearing(get_bolt("M20"), 50e3, 10.0, 410.0, e_1=40, e_2=40, p_1=70, p_2=70)
    assert r.resistance * 1e3 == pytest.approx(expected)
    assert expected == pytest.approx(99.39e3, rel=1e-3)


def test_bearing_hand_k1_governs_and_inner():
    # Table 3.4, single line e2 = 30: k1 = 2.8*30/22 - 1.7 = 2.118; inner alpha_d = 60/66 - 0.25 = 0.659
    k1 = 2.8 * 30 / 22 - 1.7
    alpha = 60 / (3 * 22) - 0.25
    expected = k1 * alpha * 410 * 20 * 12 / 1.25
    F = bearing_resistance(get_bolt("M20"), 12.0, 410.0, e_1=None, e_2=30.0, p_1=60.0)
    assert F == pytest.approx(expected)


def test_bearing_alpha_b_limited_by_fub_over_fu():
    # class 4.6 bolt: f_ub/f_u = 400/470 = 0.851 < alpha_d = 80/(3*22) = 1.21, so alpha_b = 0.851
    F = bearing_resistance(get_bolt("M20", "4.6"), 10.0, 470.0, e_1=80.0, e_2=60.0, p_2=None)
    assert F == pytest.approx(2.5 * (400 / 470) * 470 * 20 * 10 / 1.25)


def test_bearing_perpendicular_swaps_e1_e2():
    # load across axis 1: e_1 (along axis 1) becomes the edge distance e2 of Table 3.4
    b = get_bolt("M20")
    perp = check_bolt_bearing(b, 0.0, 10.0, 410.0, e_1=60.0, e_2=30.0, direction="perpendicular")
    par = check_bolt_bearing(b, 0.0, 10.0, 410.0, e_1=30.0, e_2=60.0)
    assert perp.resistance == pytest.approx(par.resistance)
    # hand: e1' = 30 -> alpha = 30/66; e2' = 60 -> k1 = min(2.8*60/22 - 1.7, 2.5) = 2.5
    assert par.resistance * 1e3 == pytest.approx(2.5 * 30 / 66 * 410 * 20 * 10 / 1.25)


def test_bearing_oversize_holes():
    # Table 3.4 note 1: 0.8 x the normal-hole value, with d0 = 24 for M20 oversize
    F = bearing_resistance(get_bolt("M20"), 10.0, 410.0, e_1=40.0, e_2=40.0, hole="oversize")
    k1 = min(2.8 * 40 / 24 - 1.7, 2.5)
    assert F == pytest.approx(0.8 * k1 * (40 / 72) * 410 * 20 * 10 / 1.25)


def test_bearing_below_table_3_3_minima_is_zero():
    # below e2 >= 1.2 d0 = 26.4 mm (Table 3.3) k1 = 2.8*20/22 - 1.7 = 0.85 is outside Table 3.4's range: resistance 0
    b = get_bolt("M20")
    r = check_bolt_bearing(b, 1.0, 10.0, 410.0, e_1=40.0, e_2=20.0, calc=Calc(render=True))
    assert r.resistance == 0.0 and not r.ok
    assert any("Table 3.3" in x for x in r.latex)
    assert bearing_resistance(b, 10.0, 410.0, e_1=40.0, e_2=40.0, p_1=45.0) == 0.0   # p1 < 2.2*22 = 48.4
    assert bearing_resistance(b, 10.0, 410.0, e_1=40.0, e_2=40.0, p_1=48.4) > 0.0


def test_bearing_single_lap_cap():
    # 3.6.1(10): single lap, one bolt: F_b,Rd <= 1.5 f_u d t / gamma_M2 = 1.5*410*20*10/1.25 = 98.4 kN
    r = check_bolt_bearing(get_bolt("M20"), 0.0, 10.0, 410.0, e_1=100.0, e_2=100.0, single_lap_one_bolt=True)
    assert r.resistance == pytest.approx(1.5 * 410 * 20 * 10 / 1.25 / 1e3)


def test_tension_countersunk_and_punching():
    # Table 3.4: k2 = 0.63 countersunk
    assert F_t_Rd(800.0, 245.0, 1.25, k_2=0.63) == pytest.approx(0.63 * 800 * 245 / 1.25)
    # punching: d_m = mean of across flats 30 and across corners 30*2/sqrt3 (ISO 4032 M20 nut)
    d_m = (30 + 30 * 2 / math.sqrt(3)) / 2
    r = check_punching(get_bolt("M20"), 100e3, 8.0, 410.0)
    assert r.resistance * 1e3 == pytest.approx(0.6 * math.pi * d_m * 8 * 410 / 1.25)
    # bolt tension with a thin plate: punching governs (0.6 pi 32.3 * 6 * 410 / 1.25 = 119.9 < 141.1 kN)
    r2 = check_bolt_tension(get_bolt("M20"), 100e3, t_p=6.0, f_u_p=410.0)
    assert r2.resistance * 1e3 == pytest.approx(0.6 * math.pi * d_m * 6 * 410 / 1.25)


def test_shear_tension_interaction():
    # Table 3.4: Fv/FvRd + Ft/(1.4 FtRd); M20 8.8: FvRd = 94.08, FtRd = 141.12 kN
    r = check_shear_tension(get_bolt("M20"), 50e3, 70e3)
    assert r.utilisation == pytest.approx(50 / 94.08 + 70 / (1.4 * 141.12))
    # tension alone beyond F_t,Rd fails even though the interaction sum is < 1
    r2 = check_shear_tension(get_bolt("M20"), 0.0, 150e3)
    assert r2.utilisation == pytest.approx(150 / 141.12)
    assert not r2.ok


def test_slip_categories():
    b = get_bolt("M20", "8.8")
    Fp = 0.7 * 800 * 245  # Eq. 3.7
    # category B (SLS): ks = 1, n = 2 surfaces, class A mu = 0.5, gamma_M3,ser = 1.1 (UK NA)
    rB = check_slip(b, 100e3, category="B", n=2, surface_class="A")
    assert rB.resistance * 1e3 == pytest.approx(1.0 * 2 * 0.5 * Fp / 1.1)
    # category C (ULS), oversize holes ks = 0.85 (Table 3.6), class B mu = 0.4 (Table 3.7), gamma_M3 = 1.25
    rC = check_slip(b, 100e3, category="C", n=1, surface_class="B", hole="oversize")
    assert rC.resistance * 1e3 == pytest.approx(0.85 * 1 * 0.4 * Fp / 1.25)
    # with tension, Eq. 3.8a: (Fp,C - 0.8 Ft,Ed)
    rT = check_slip(b, 10e3, category="C", F_t_Ed=50e3)
    assert rT.resistance * 1e3 == pytest.approx(0.5 * (Fp - 0.8 * 50e3) / 1.25)
    assert "3.9.2" in rT.clause


def test_slip_needs_preloadable_class():
    with pytest.raises(InputError):
        check_slip(get_bolt("M20", "4.6"), 10e3)


def test_beta_Lf_and_beta_p():
    # Eq. 3.5: Lj = 500, d = 20: 1 - (500 - 300)/4000 = 0.95; limits 0.75 .. 1.0
    assert beta_Lf(500.0, 20.0) == pytest.approx(1 - (500 - 15 * 20) / (200 * 20))
    assert beta_Lf(2000.0, 20.0) == 0.75
    assert beta_Lf(200.0, 20.0) == 1.0
    # Eq. 3.3: tp = 12 > d/3: 9*20/(160 + 36) = 0.918; tp = 4 < d/3: 1.0
    assert beta_p(20.0, 12.0) == pytest.approx(9 * 20 / (8 * 20 + 3 * 12))
    assert beta_p(20.0, 4.0) == 1.0
    r = check_bolt_shear(get_bolt("M20"), 0.0, L_j=500.0, t_pack=12.0)
    assert r.resistance * 1e3 == pytest.approx(94080 * 0.95 * 9 * 20 / 196)


def test_group_rule():
    # 3.7(1): Fv = 94.08 >= every Fb -> sum; else n x min
    r = check_bolt_group(200e3, 94.08e3, [80e3, 70e3, 60e3])
    assert r.resistance == pytest.approx(80 + 70 + 60)
    r2 = check_bolt_group(200e3, 75e3, [80e3, 70e3, 60e3])
    assert r2.resistance == pytest.approx(3 * 60)
    r3 = check_bolt_group(200e3, 50e3, [80e3, 70e3, 60e3])
    assert r3.resistance == pytest.approx(3 * 50)


# -------------------------------------------------------- rendering parity
RENDER_CASES = [
    lambda c: check_bolt_shear(get_bolt("M24"), 80e3, n_s=2, L_j=600.0, t_pack=10.0, calc=c),
    lambda c: check_bolt_bearing(get_bolt("M20"), 50e3, 10.0, 410.0, e_1=40, e_2=40, p_1=70, p_2=70, calc=c),
    lambda c: check_bolt_tension(get_bolt("M20"), 50e3, t_p=10.0, f_u_p=410.0, calc=c),
    lambda c: check_punching(get_bolt("M16"), 50e3, 8.0, 410.0, calc=c),
    lambda c: check_shear_tension(get_bolt("M20"), 50e3, 40e3, calc=c),
    lambda c: check_slip(get_bolt("M20", "10.9"), 50e3, category="C", F_t_Ed=10e3, calc=c),
    lambda c: check_bolt_group(300e3, 94e3, [90e3, 80e3, 70e3, 60e3], calc=c),
]


@pytest.mark.parametrize("case", RENDER_CASES)
def test_rendered_equals_float(case):
    plain = case(Calc())
    rend = case(Calc(render=True))
    assert rend.resistance == pytest.approx(plain.resistance, rel=1e-9)
    assert rend.latex and all(isinstance(x, str) and x for x in rend.latex)
    assert not plain.latex
    assert "\\begin{aligned}" in rend.latex[0]


def test_uk_na_default_and_other_annex():
    from dataclasses import replace
    na = replace(UK_NA, gamma_M2=1.0)
    r = check_bolt_shear(get_bolt("M20"), 0.0, na=na)
    assert r.resistance == pytest.approx(0.6 * 800 * 245 / 1e3)


# ---------------------------------------------------------- property tests
pos = st.floats(min_value=1.0, max_value=500.0, allow_nan=False, allow_infinity=False)


@settings(max_examples=60, deadline=None)
@given(t=st.floats(1.0, 60.0), dt=st.floats(0.0, 30.0), k1=st.floats(0.3, 6.0), de=st.floats(0.0, 100.0),
       k2=st.floats(0.3, 6.0), size=st.sampled_from(B.BOLT_SIZES))
def test_bearing_monotonic(t, dt, k1, de, k2, size):
    b = get_bolt(size)
    e1, e2 = k1 * b.d_0, k2 * b.d_0
    base = bearing_resistance(b, t, 410.0, e_1=e1, e_2=e2, p_1=None, p_2=None)
    assert bearing_resistance(b, t + dt, 410.0, e_1=e1, e_2=e2) >= base - 1e-9
    assert bearing_resistance(b, t, 410.0, e_1=e1 + de, e_2=e2) >= base - 1e-9
    assert bearing_resistance(b, t, 410.0, e_1=e1, e_2=e2 + de) >= base - 1e-9
    assert base >= 0.0


@settings(max_examples=40, deadline=None)
@given(size=st.sampled_from(B.BOLT_SIZES), cls=st.sampled_from(B.BOLT_CLASSES))
def test_bigger_bolt_never_weaker(size, cls):
    i = B.BOLT_SIZES.index(size)
    if i + 1 < len(B.BOLT_SIZES):
        small, big = get_bolt(size, cls), get_bolt(B.BOLT_SIZES[i + 1], cls)
        assert check_bolt_shear(big, 0).resistance > check_bolt_shear(small, 0).resistance
        assert check_bolt_tension(big, 0).resistance > check_bolt_tension(small, 0).resistance


BAD = [0.0, -1.0, float("nan"), float("inf"), -float("inf"), "x", None]


@settings(max_examples=60, deadline=None)
@given(bad=st.sampled_from(BAD), which=st.integers(0, 5))
def test_bad_input_only_input_error(bad, which):
    b = get_bolt("M20")
    calls = [
        lambda: check_bolt_bearing(b, 10e3, bad, 410.0, e_1=40.0, e_2=40.0),
        lambda: check_bolt_bearing(b, 10e3, 10.0, 410.0, e_1=bad, e_2=40.0),
        lambda: check_punching(b, 10e3, bad, 410.0),
        lambda: check_bolt_tension(b, 10e3, t_p=10.0, f_u_p=bad),
        lambda: bearing_resistance(b, 10.0, bad, e_1=40.0, e_2=40.0),
        lambda: check_bolt_group(10e3, bad, [1e3]),
    ]
    with pytest.raises(InputError):
        calls[which]()


@pytest.mark.parametrize("bad", [-1.0, float("nan"), float("inf"), "x"])
def test_negative_demands_rejected(bad):
    b = get_bolt("M20")
    for fn in (lambda: check_bolt_shear(b, bad), lambda: check_shear_tension(b, 1.0, bad),
               lambda: check_slip(b, bad), lambda: check_bolt_shear(b, 1.0, n_s=bad),
               lambda: check_bolt_shear(b, 1.0, L_j=bad)):
        with pytest.raises(InputError):
            fn()


def test_bad_choices():
    b = get_bolt("M20")
    with pytest.raises(InputError):
        check_bolt_bearing(b, 1.0, 10.0, 410.0, e_1=40.0, e_2=40.0, direction="diagonal")
    with pytest.raises(InputError):
        check_slip(b, 1.0, surface_class="E")
    with pytest.raises(InputError):
        check_bolt_shear("M20", 1.0)
    with pytest.raises(InputError):
        check_bolt_shear(b, 1.0, n_s=1.5)
    with pytest.raises(InputError):
        check_bolt_bearing(b, 1.0, 10.0, 410.0, e_1=None, e_2=40.0)
    with pytest.raises(InputError) as e:
        check_bolt_bearing(b, 1.0, 10.0, 410.0, e_1=40.0)   # k1 needs e2 or p2
    assert e.value.field == "e_2/p_2"


def test_formulas_accept_quantities():
    # the same clause function runs on forallpeople quantities (converted only through core.units)
    from splicecalc.core.units import to_float, to_quantity
    from splicecalc.joints.welds import F_w_Rd
    q = F_v_Rd(0.6, to_quantity(800.0, "MPa"), to_quantity(245.0, "mm2"), 1.25)
    assert to_float(q, "N") == pytest.approx(0.6 * 800 * 245 / 1.25)
    w = F_w_Rd(to_quantity(4.2, "mm"), to_quantity(410.0, "MPa"), 0.85, 1.25)
    assert to_float(w, "N/mm") == pytest.approx(4.2 * 410 / (math.sqrt(3) * 0.85 * 1.25))
    k = B.k_1_edge(to_quantity(40.0, "mm"), to_quantity(70.0, "mm"), to_quantity(22.0, "mm"))
    assert float(k) == pytest.approx(2.5)
