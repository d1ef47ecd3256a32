"""Connection plates: EN 1993-1-1:2005 6.2.3, 6.2.5, 6.2.6, 6.3.1 and EN 1993-1-8:2005 3.5, 3.10.2.

Sources, beside each value: hand calculations from the clauses written as expressions;
EN 1993-1-1 Table 6.1 / Figure 6.4 reduction factors chi (tabulated values quoted from memory);
EN 10025-2 Table 7 strengths (S275 <= 16 mm: fy 275, fu 410; S355 <= 16 mm: fy 355, fu 470).
"""

from __future__ import annotations

import math
from dataclasses import replace

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from splicecalc.core import Calc, InputError
from splicecalc.joints.plates import (A_net_stagger, block_tearing_areas, check_block_tearing, check_plate_bending,
                                      check_plate_compression, check_plate_shear, check_plate_tension, chi,
                                      lambda_bar_plate, p_1_t_lim)
from splicecalc.materials import UK_NA

SQ3 = math.sqrt(3)


def test_tension_gross_and_net():
    # 200 x 12 S275, two 22 mm holes: N_pl = 2400*275/1.0; N_u = 0.9*12*(200-44)*410/1.1 (gamma_M2 member, UK NA)
    r = check_plate_tension(0.0, 200.0, 12.0, "S275", n_holes=2, d_0=22.0)
    Npl = 200 * 12 * 275 / 1.0
    Nu = 0.9 * 12 * (200 - 2 * 22) * 410 / 1.1
    assert r.resistance * 1e3 == pytest.approx(min(Npl, Nu))
    assert r.values["N_pl_Rd"][0] == pytest.approx(Npl / 1e3)
    assert r.values["N_u_Rd"][0] == pytest.approx(Nu / 1e3)
    # category C adds A_net fy / gamma_M0 (Eq. 6.8)
    rC = check_plate_tension(0.0, 200.0, 12.0, "S275", n_holes=2, d_0=22.0, category_C=True)
    assert rC.resistance * 1e3 == pytest.approx(min(Npl, Nu, 12 * 156 * 275))
    # override gamma_M2 = 1.25
    r25 = check_plate_tension(0.0, 200.0, 12.0, "S275", n_holes=2, d_0=22.0, gamma_M2=1.25)
    assert r25.resistance * 1e3 == pytest.approx(0.9 * 1872 * 410 / 1.25)


def test_stagger_area():
    # EN 1993-1-1 Eq. 6.3: t (b - n d0 + sum s^2/(4p)): 12 (200 - 3*22 + 2*40^2/(4*60))
    assert A_net_stagger(200.0, 12.0, 3, 22.0, 2, 40.0, 60.0) == pytest.approx(12 * (200 - 66 + 2 * 1600 / 240))


def test_block_tearing_fin_plate_hand():
    # 10 mm S275 plate, one line of 3 M20 (d0 22): e1 = 40, p1 = 70, e2 = 50; eccentric (Eq. 3.10)
    A_nv = 10 * (40 + 2 * 70 - 2.5 * 22)  # 1250 mm2
    A_nt = 10 * (50 - 0.5 * 22)           # 390 mm2
    ba = block_tearing_areas(10.0, 22.0, n_1=3, e_1=40.0, p_1=70.0, n_2=1, e_2=50.0)
    assert (ba.A_nt, ba.A_nv) == pytest.approx((A_nt, A_nv))
    r = check_block_tearing(0.0, ba.A_nt, ba.A_nv, "S275", 10.0, eccentric=True)
    expected = 0.5 * 410 * A_nt / 1.1 + 275 * A_nv / (SQ3 * 1.0)
    assert r.resistance * 1e3 == pytest.approx(expected)
    assert expected / 1e3 == pytest.approx(271.1, abs=0.1)
    assert "Eq. 3.10" in r.clause


def test_block_tearing_tension_plate_patterns():
    # 200 x 12 plate, 2 lines at p2 = 100 with e2 = 50, 3 rows e1 = 40 p1 = 70, d0 = 22; Eq. 3.9
    inner = block_tearing_areas(12.0, 22.0, 3, 40.0, 70.0, 2, 50.0, 100.0, pattern="inner")
    assert inner.A_nt == pytest.approx(12 * (100 - 22))
    assert inner.A_nv == pytest.approx(2 * 12 * (40 + 140 - 2.5 * 22))
    outer = block_tearing_areas(12.0, 22.0, 3, 40.0, 70.0, 2, 40.0, 100.0, pattern="outer")
    assert outer.A_nt == pytest.approx(2 * 12 * (40 - 11))
    r = check_block_tearing(0.0, inner.A_nt, inner.A_nv, "S275", 12.0)
    assert r.resistance * 1e3 == pytest.approx(410 * 936 / 1.1 + 275 * 3000 / SQ3)
    with pytest.raises(InputError):
        block_tearing_areas(12.0, 22.0, 3, 40.0, 70.0, 1, 40.0, pattern="inner")


def test_plate_shear_hand():
    # 230 x 10 S275 with 3 holes of 22: gross 230*10*275/sqrt3; net 10*(230-66)*410/(sqrt3*1.1)
    r = check_plate_shear(0.0, 230.0, 10.0, "S275", n_holes=3, d_0=22.0)
    Vg = 2300 * 275 / SQ3
    Vn = 10 * (230 - 66) * 410 / (SQ3 * 1.1)
    assert r.resistance * 1e3 == pytest.approx(min(Vg, Vn))
    # 1.27 factor of published simple-joint guidance on the gross section
    r2 = check_plate_shear(0.0, 230.0, 10.0, "S275", k_v=1.27)
    assert r2.resistance * 1e3 == pytest.approx(2300 * 275 / (1.27 * SQ3))


def test_plate_bending_hand():
    # 230 x 10 S275: elastic 10*230^2/6*275; plastic 10*230^2/4*275 (N mm)
    r = check_plate_bending(0.0, 230.0, 10.0, "S275")
    assert r.resistance * 1e6 == pytest.approx(10 * 230 ** 2 / 6 * 275)
    rp = check_plate_bending(0.0, 230.0, 10.0, "S275", plastic=True)
    assert rp.resistance / r.resistance == pytest.approx(1.5)
    assert r.unit == "kNm"


@pytest.mark.parametrize("lam, alpha, tabulated", [
    (0.5, 0.49, 0.8430),  # EN 1993-1-1 Figure 6.4 / curve c tables (from memory)
    (1.0, 0.49, 0.5399),  # same (from memory)
    (1.0, 0.34, 0.5970),  # curve b (from memory)
    (0.2, 0.49, 1.0),     # plateau, 6.3.1.2(4)
])
def test_chi_tabulated(lam, alpha, tabulated):
    assert chi(lam, alpha) == pytest.approx(tabulated, abs=1e-4)


def test_compression_between_fasteners_hand():
    # Table 3.3 note 2: S355 t = 12: 9 eps = 9 sqrt(235/355) = 7.32; p1 = 150 -> 12.5 > 7.32, buckle
    assert p_1_t_lim(355.0) == pytest.approx(9 * math.sqrt(235 / 355))
    lam = (0.6 * 150) / ((12 / math.sqrt(12)) * math.pi * math.sqrt(210000 / 355))
    assert lambda_bar_plate(150.0, 12.0, 355.0, 210000.0) == pytest.approx(lam)
    phi = 0.5 * (1 + 0.49 * (lam - 0.2) + lam ** 2)
    x = 1 / (phi + math.sqrt(phi ** 2 - lam ** 2))
    r = check_plate_compression(0.0, 200.0, 12.0, 150.0, "S355")
    assert r.resistance * 1e3 == pytest.approx(x * 2400 * 355 / 1.0)
    assert "buckling checked" in r.note
    # p1 = 80 -> 6.67 < 7.32: gross yield only
    r2 = check_plate_compression(0.0, 200.0, 12.0, 80.0, "S355")
    assert r2.resistance * 1e3 == pytest.approx(2400 * 355)
    assert "no buckling" in r2.note


def test_other_annex_is_used():
    na = replace(UK_NA, gamma_M2_member=1.25, gamma_M0=1.05)
    r = check_plate_tension(0.0, 200.0, 12.0, "S275", n_holes=2, d_0=22.0, na=na)
    assert r.resistance * 1e3 == pytest.approx(min(2400 * 275 / 1.05, 0.9 * 1872 * 410 / 1.25))


RENDER_CASES = [
    lambda c: check_plate_tension(500e3, 200.0, 12.0, "S275", n_holes=2, d_0=22.0, category_C=True, calc=c),
    lambda c: check_block_tearing(300e3, 390.0, 1250.0, "S275", 10.0, eccentric=True, calc=c),
    lambda c: check_block_tearing(300e3, 936.0, 3000.0, "S355", 12.0, calc=c),
    lambda c: check_plate_shear(300e3, 230.0, 10.0, "S275", n_holes=3, d_0=22.0, calc=c),
    lambda c: check_plate_bending(10e6, 230.0, 10.0, "S275", plastic=True, calc=c),
    lambda c: check_plate_compression(500e3, 200.0, 12.0, 150.0, "S355", calc=c),
]


@pytest.mark.parametrize("case", RENDER_CASES)
def test_rendered_equals_float(case):
    plain, rend = case(Calc()), case(Calc(render=True))
    assert rend.resistance == pytest.approx(plain.resistance, rel=1e-9)
    assert rend.latex and "\\begin{aligned}" in rend.latex[0]


@settings(max_examples=50, deadline=None)
@given(b=st.floats(50.0, 500.0), db=st.floats(0.0, 200.0), t=st.floats(5.0, 40.0), dt=st.floats(0.0, 20.0),
       n=st.integers(0, 2))
def test_more_area_never_weaker(b, db, t, dt, n):
    base = check_plate_tension(0.0, b, t, "S355", n_holes=n, d_0=22.0).resistance
    assert check_plate_tension(0.0, b + db, t, "S355", n_holes=n, d_0=22.0).resistance >= base - 1e-9
    # thicker plates may drop a strength step (EN 10025 fy by thickness) but within one step more t is stronger
    if t + dt <= 16.0:
        assert check_plate_tension(0.0, b, t + dt, "S355", n_holes=n, d_0=22.0).resistance >= base - 1e-9
        assert check_plate_shear(0.0, b, t + dt, "S355").resistance >= check_plate_shear(0.0, b, t, "S355").resistance


@settings(max_examples=40, deadline=None)
@given(p1=st.floats(30.0, 400.0), dp=st.floats(0.0, 200.0), t=st.floats(5.0, 16.0))
def test_longer_pitch_never_stronger(p1, dp, t):
    a = check_plate_compression(0.0, 150.0, t, p1, "S275").resistance
    assert check_plate_compression(0.0, 150.0, t, p1 + dp, "S275").resistance <= a + 1e-9


BAD = [0.0, -3.0, float("nan"), float("inf"), "x", None]


@settings(max_examples=60, deadline=None)
@given(bad=st.sampled_from(BAD), which=st.integers(0, 5))
def test_bad_input_only_input_error(bad, which):
    calls = [
        lambda: check_plate_tension(1.0, bad, 10.0, "S275"),
        lambda: check_plate_shear(1.0, 200.0, bad, "S275"),
        lambda: check_block_tearing(1.0, bad, 100.0, "S275", 10.0),
        lambda: check_plate_bending(1.0, bad, 10.0, "S275"),
        lambda: check_plate_compression(1.0, 100.0, 10.0, bad, "S275"),
        lambda: block_tearing_areas(10.0, bad, 3, 40.0, 70.0, 1, 40.0),
    ]
    with pytest.raises(InputError):
        calls[which]()


@pytest.mark.parametrize("call", [
    lambda: check_plate_tension(1.0, 100.0, 10.0, "S275", n_holes=5, d_0=22.0),   # holes wider than the plate
    lambda: check_plate_tension(1.0, 100.0, 10.0, "S275", n_holes=1.5, d_0=22.0),
    lambda: check_plate_tension(1.0, 100.0, 10.0, "S275", A_net=2000.0),          # net > gross
    lambda: check_plate_tension(-1.0, 100.0, 10.0, "S275"),
    lambda: check_plate_compression(1.0, 100.0, 10.0, 100.0, "S275", curve="z"),
    lambda: block_tearing_areas(10.0, 22.0, 3, 40.0, 70.0, 1, 10.0),              # tension area <= 0
    lambda: check_plate_shear(1.0, 100.0, 300.0, "S275"),                         # beyond EN 10025 range
])
def test_bad_values(call):
    with pytest.raises(InputError):
        call()
