"""Bolt spacing, end and edge distances: EN 1993-1-8:2005, 3.5, Table 3.3.

Every limit below is read from Table 3.3 (and its notes 1 and 3), written as the
table's expression in d_0 and t.
"""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from splicecalc.core import Calc, InputError
from splicecalc.joints.spacing import check_spacing, e_max, e_min, p_1_min, p_2_min, p_max


def _by_id(records):
    return {r.id.removeprefix("spacing_"): r for r in records}


def test_minima_m20():
    # Table 3.3, d0 = 22: e1, e2 >= 1.2 d0; p1 >= 2.2 d0; p2 >= 2.4 d0
    assert e_min(22.0) == pytest.approx(1.2 * 22)
    assert p_1_min(22.0) == pytest.approx(2.2 * 22)
    assert p_2_min(22.0) == pytest.approx(2.4 * 22)
    r = _by_id(check_spacing(22.0, 10.0, e_1=40.0, e_2=26.0, p_1=48.0, p_2=60.0))
    assert r["e_1_min"].ok and r["e_1_min"].demand == pytest.approx(26.4)
    assert not r["e_2_min"].ok       # 26 < 26.4
    assert not r["p_1_min"].ok       # 48 < 48.4
    assert r["p_2_min"].ok           # 60 >= 52.8
    assert set(r) == {"e_1_min", "e_2_min", "p_1_min", "p_2_min"}  # not exposed, tension: no maxima (note 1)


def test_maxima_exposed_tension():
    # Table 3.3, exposed, t = 10: e <= 4t + 40 = 80; p1 outer <= min(14t, 200) = 140; inner <= min(28t, 400) = 280
    assert e_max(10.0) == pytest.approx(4 * 10 + 40)
    outer = _by_id(check_spacing(22.0, 10.0, e_1=85.0, e_2=80.0, p_1=150.0, p_2=150.0, exposed=True))
    assert not outer["e_1_max"].ok and outer["e_1_max"].resistance == pytest.approx(80.0)
    assert outer["e_2_max"].ok
    assert not outer["p_1_max"].ok and outer["p_1_max"].resistance == pytest.approx(14 * 10)
    assert not outer["p_2_max"].ok and outer["p_2_max"].resistance == pytest.approx(14 * 10)
    inner = _by_id(check_spacing(22.0, 10.0, p_1=150.0, exposed=True, line="inner"))
    assert inner["p_1_max"].ok and inner["p_1_max"].resistance == pytest.approx(28 * 10)


def test_maxima_caps_200_400():
    # thick plate t = 20: min(14*20, 200) = 200; min(28*20, 400) = 400
    assert p_max(20.0) == pytest.approx(200.0)
    assert p_max(20.0, k_t=28.0, p_lim=400.0) == pytest.approx(400.0)
    assert p_max(10.0) == pytest.approx(140.0)


def test_compression_not_exposed():
    # compression member not exposed: p1, p2 <= min(14t, 200), no edge maximum
    r = _by_id(check_spacing(22.0, 8.0, e_1=200.0, e_2=200.0, p_1=120.0, p_2=100.0, compression=True))
    assert "e_1_max" not in r and "e_2_max" not in r
    assert r["p_1_max"].resistance == pytest.approx(14 * 8) and not r["p_1_max"].ok
    assert r["p_2_max"].ok


def test_force_maxima():
    r = _by_id(check_spacing(22.0, 10.0, p_1=150.0, apply_maxima=True))
    assert not r["p_1_max"].ok


def test_records_carry_clause_and_mm():
    for rec in check_spacing(18.0, 10.0, e_1=30.0, e_2=30.0, p_1=60.0, p_2=60.0, exposed=True, where="flange plate"):
        assert rec.clause == "EN 1993-1-8:2005, 3.5, Table 3.3"
        assert rec.unit == "mm"
        assert rec.title.startswith("flange plate: ")


def test_rendered_equals_float():
    kw = dict(e_1=40.0, e_2=30.0, p_1=70.0, p_2=90.0, exposed=True, compression=True)
    plain = check_spacing(22.0, 10.0, **kw)
    rend = check_spacing(22.0, 10.0, calc=Calc(render=True), **kw)
    assert len(plain) == len(rend) == 8
    for a, b in zip(plain, rend):
        assert a.id == b.id and a.demand == pytest.approx(b.demand) and a.resistance == pytest.approx(b.resistance)
        assert b.latex and "\\begin{aligned}" in b.latex[0]


@settings(max_examples=50, deadline=None)
@given(d0=st.floats(10.0, 45.0), k=st.floats(0.5, 4.0))
def test_min_rule_threshold(d0, k):
    # e1 = k d0 passes exactly when k >= 1.2 (Table 3.3)
    (r,) = check_spacing(d0, 10.0, e_1=k * d0)
    assert r.ok == (k * d0 >= 1.2 * d0 - 1e-9)


BAD = [0.0, -1.0, float("nan"), float("inf"), "x"]


@settings(max_examples=40, deadline=None)
@given(bad=st.sampled_from(BAD), which=st.integers(0, 3))
def test_bad_input_only_input_error(bad, which):
    calls = [
        lambda: check_spacing(bad, 10.0, e_1=30.0),
        lambda: check_spacing(22.0, bad, e_1=30.0),
        lambda: check_spacing(22.0, 10.0, p_1=bad),
        lambda: check_spacing(22.0, 10.0, e_2=bad),
    ]
    with pytest.raises(InputError):
        calls[which]()


def test_bad_choices():
    with pytest.raises(InputError):
        check_spacing(22.0, 10.0, p_1=60.0, line="middle")
    with pytest.raises(InputError):
        check_spacing(22.0, 10.0, p_1=60.0, exposed="yes")
