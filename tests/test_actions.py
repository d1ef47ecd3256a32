"""Tests of splicecalc.actions: load model, psi factors, EN 1990 combinations.

Sources:
* EN 1990:2002, Annex A1, Table A1.1 and UK NA to BS EN 1990, Table NA.A1.1 (psi factors) *(from memory)*;
* EN 1990:2002, 6.4.3.2 and Table A1.2(B), with UK NA Table NA.A1.2(B): gamma_G = 1.35,
  gamma_Q = 1.5, xi = 0.925 (EN recommended xi = 0.85) *(from memory)*;
* EN 1990:2002, 6.5.3, Eqs. (6.14b), (6.15b), (6.16b);
* hand calculations from those equations, written as expressions.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from splicecalc.actions import (PSI_EN_RECOMMENDED, PSI_UK_NA, UDL, PointLoad, check_loads_on_span, governing,
                                psi_factors, render_line_load, self_weight_udl, sls_characteristic,
                                sls_combinations, sls_frequent, sls_quasi_permanent,
                                sls_variable_characteristic, uls_combinations, variable_actions)
from splicecalc.actions import formulas as fm
from splicecalc.core import Calc, InputError
from splicecalc.materials import EN_RECOMMENDED, UK_NA, NationalAnnex

REL = 1e-12


def _w(combo, name):
    """Factored w (N/mm) of the load called ``name`` in ``combo`` (0 when absent)."""
    return sum(ld.w for ld in combo.loads if ld.name == name)


def _by_name(combos, name):
    (c,) = [c for c in combos if c.name == name]
    return c


# ------------------------------------------------------------------ psi factors
@pytest.mark.parametrize("action, cat, expected", [
    ("imposed", "A", (0.7, 0.5, 0.3)),   # UK NA Table NA.A1.1, domestic (from memory)
    ("imposed", "B", (0.7, 0.5, 0.3)),   # offices (from memory)
    ("imposed", "C", (0.7, 0.7, 0.6)),   # congregation (from memory)
    ("imposed", "D", (0.7, 0.7, 0.6)),   # shopping (from memory)
    ("imposed", "E", (1.0, 0.9, 0.8)),   # storage (from memory)
    ("imposed", "F", (0.7, 0.7, 0.6)),   # traffic, vehicle <= 30 kN (from memory)
    ("imposed", "G", (0.7, 0.5, 0.3)),   # traffic, 30-160 kN (from memory)
    ("imposed", "H", (0.7, 0.0, 0.0)),   # roofs, UK NA (from memory)
    ("snow", None, (0.5, 0.2, 0.0)),     # sites <= 1000 m a.s.l. (from memory)
    ("wind", None, (0.5, 0.2, 0.0)),     # UK NA (from memory)
])
def test_psi_uk_na(action, cat, expected):
    p = psi_factors(action, cat)
    assert (p.psi_0, p.psi_1, p.psi_2) == expected


def test_psi_en_recommended_differences():
    # EN 1990 Table A1.1 recommended values (from memory): roofs psi_0 = 0, wind psi_0 = 0.6
    assert psi_factors("imposed", "H", PSI_EN_RECOMMENDED).psi_0 == 0.0
    assert psi_factors("wind", None, PSI_EN_RECOMMENDED).psi_0 == 0.6
    assert psi_factors("imposed", "b").psi_0 == 0.7   # lower-case category accepted


@pytest.mark.parametrize("action, cat", [("permanent", None), ("imposed", "Z"), ("imposed", None),
                                         ("rain", None)])
def test_psi_bad_input(action, cat):
    with pytest.raises(InputError):
        psi_factors(action, cat)


# ------------------------------------------------------------------ load model
def test_udl_and_point_load_fields():
    u = UDL("screed", "permanent", 2.5, 1000.0, 3000.0)
    assert u.total(6000.0) == 2.5 * (3000.0 - 1000.0)          # resultant w (b - a)
    assert not u.is_full(6000.0)
    f = UDL("floor", "imposed", 7.5, category="b")
    assert f.category == "B" and f.action_name == "imposed B" and f.is_full(6000.0)
    assert f.extent(6000.0) == (0.0, 6000.0)
    p = PointLoad("tank", "imposed", 12e3, 2500.0, category="E", group="plant")
    assert p.action_name == "plant" and p.total(6000.0) == 12e3
    assert p.scaled(1.5).P == 1.5 * 12e3


@pytest.mark.parametrize("kwargs, field", [
    (dict(name="a", action="permanent", w=-1.0), "w"),
    (dict(name="a", action="permanent", w=0.0), "w"),
    (dict(name="a", action="permanent", w=float("nan")), "w"),
    (dict(name="a", action="permanent", w=float("inf")), "w"),
    (dict(name="a", action="permanent", w="heavy"), "w"),
    (dict(name="a", action="dead", w=1.0), "action"),
    (dict(name="a", action="imposed", w=1.0), "category"),
    (dict(name="a", action="imposed", w=1.0, category="K"), "category"),
    (dict(name="a", action="snow", w=1.0, category="B"), "category"),
    (dict(name="a", action="permanent", w=1.0, x_start=3000.0, x_end=2000.0), "x_end"),
    (dict(name="a", action="permanent", w=1.0, x_start=-5.0), "x_start"),
    (dict(name="", action="permanent", w=1.0), "name"),
])
def test_udl_bad_input_names_field(kwargs, field):
    with pytest.raises(InputError) as e:
        UDL(**kwargs)
    assert e.value.field.endswith(field)


def test_point_load_bad_input():
    for kw, field in ((dict(P=0.0, x=10.0), "P"), (dict(P=-5.0, x=10.0), "P"), (dict(P=5.0, x=-1.0), "x"),
                      (dict(P=5.0, x=float("inf")), "x")):
        with pytest.raises(InputError) as e:
            PointLoad("p", "permanent", **kw)
        assert e.value.field.endswith(field)


def test_loads_outside_span():
    with pytest.raises(InputError, match="x_end"):
        check_loads_on_span([UDL("a", "permanent", 1.0, 0.0, 7000.0)], 6000.0)
    with pytest.raises(InputError, match="x_start"):
        check_loads_on_span([UDL("a", "permanent", 1.0, 6000.0)], 6000.0)
    with pytest.raises(InputError, match=r"\.x"):
        check_loads_on_span([PointLoad("p", "permanent", 1.0, 6000.5)], 6000.0)
    with pytest.raises(InputError, match="loads"):
        check_loads_on_span(["not a load"], 6000.0)
    assert len(check_loads_on_span([PointLoad("p", "permanent", 1.0, 6000.0)], 6000.0)) == 1


def test_self_weight():
    sw = self_weight_udl(92.1)                      # e.g. a 533x210x92 UKB, 92.1 kg/m
    assert sw.action == "permanent" and sw.x_end is None
    assert sw.w == pytest.approx(92.1 * 9.81 / 1000.0, rel=REL)   # m g, kg/m x m/s2 = N/m -> N/mm
    with pytest.raises(InputError):
        self_weight_udl(-3.0)


def test_mixed_group_types_rejected():
    loads = [UDL("a", "imposed", 1.0, category="B", group="x"), UDL("b", "snow", 1.0, group="x")]
    with pytest.raises(InputError, match="group"):
        variable_actions(loads)


# ------------------------------------------------------------------ ULS
G, Q = 5.0, 10.0   # N/mm, characteristic permanent and office imposed


def _floor():
    return [UDL("slab", "permanent", G), UDL("office", "imposed", Q, category="B")]


def test_uls_610():
    na = NationalAnnex(combination="6.10")
    (c,) = uls_combinations(_floor(), na)
    assert c.name == "ULS 6.10, leading: imposed B"
    assert _w(c, "slab") == pytest.approx(1.35 * G, rel=REL)       # Table A1.2(B), gamma_G,sup
    assert _w(c, "office") == pytest.approx(1.5 * Q, rel=REL)      # gamma_Q
    assert c.expression == "1.35 G + 1.5 Q(imposed B)"


def test_uls_610ab_uk():
    combos = uls_combinations(_floor(), UK_NA)
    assert [c.name for c in combos] == ["ULS 6.10a", "ULS 6.10b, leading: imposed B"]
    a, b = combos
    assert _w(a, "slab") == pytest.approx(1.35 * G, rel=REL)              # Eq. 6.10a
    assert _w(a, "office") == pytest.approx(1.5 * 0.7 * Q, rel=REL)       # gamma_Q psi_0, cat B psi_0 = 0.7
    assert _w(b, "slab") == pytest.approx(0.925 * 1.35 * G, rel=REL)      # Eq. 6.10b, xi = 0.925 (UK NA)
    assert 0.925 * 1.35 == pytest.approx(1.249, abs=5e-4)                  # UK NA: 1.25 G as usually quoted
    assert _w(b, "office") == pytest.approx(1.5 * Q, rel=REL)
    assert b.expression == "0.925 x 1.35 G + 1.5 Q(imposed B)"
    # EN recommended xi = 0.85
    b_en = uls_combinations(_floor(), EN_RECOMMENDED)[1]
    assert _w(b_en, "slab") == pytest.approx(0.85 * 1.35 * G, rel=REL)


def _total_w(c):
    return sum(ld.w for ld in c.loads)


def test_governing_610a_vs_610b():
    # light permanent: 6.10b governs; 1.249*5 + 1.5*10 > 1.35*5 + 1.05*10 (hand calculation)
    c, v = governing(uls_combinations(_floor()), _total_w)
    assert c.kind == "6.10b" and v == pytest.approx(0.925 * 1.35 * G + 1.5 * Q, rel=REL)
    # heavy permanent: 6.10a governs; 1.35*30 + 1.05*2 = 42.6 > 1.249*30 + 3 = 40.46
    loads = [UDL("slab", "permanent", 30.0), UDL("office", "imposed", 2.0, category="B")]
    c, v = governing(uls_combinations(loads), _total_w)
    assert c.kind == "6.10a" and v == pytest.approx(1.35 * 30.0 + 1.5 * 0.7 * 2.0, rel=REL)


def test_each_variable_action_leads():
    loads = _floor() + [UDL("roof snow", "snow", 3.0), PointLoad("tank", "imposed", 8e3, 1500.0,
                                                                  category="E", group="plant")]
    ab = uls_combinations(loads)
    assert [c.name for c in ab] == ["ULS 6.10a", "ULS 6.10b, leading: imposed B", "ULS 6.10b, leading: snow",
                                    "ULS 6.10b, leading: plant"]
    snow_lead = _by_name(ab, "ULS 6.10b, leading: snow")
    assert _w(snow_lead, "roof snow") == pytest.approx(1.5 * 3.0, rel=REL)            # leading
    assert _w(snow_lead, "office") == pytest.approx(1.5 * 0.7 * Q, rel=REL)           # psi_0 cat B
    assert sum(ld.P for ld in snow_lead.loads if ld.name == "tank") == pytest.approx(1.5 * 1.0 * 8e3)  # psi_0 cat E
    assert snow_lead.factor("snow") == 1.5 and snow_lead.factor("G") == pytest.approx(0.925 * 1.35)
    six = uls_combinations(loads, NationalAnnex(combination="6.10"))
    assert len(six) == 3
    b_lead = _by_name(six, "ULS 6.10, leading: imposed B")
    assert _w(b_lead, "roof snow") == pytest.approx(1.5 * 0.5 * 3.0, rel=REL)         # psi_0 snow = 0.5


def test_permanent_only():
    loads = [UDL("slab", "permanent", G)]
    assert [c.name for c in uls_combinations(loads)] == ["ULS 6.10a", "ULS 6.10b"]
    assert [c.name for c in uls_combinations(loads, NationalAnnex(combination="6.10"))] == ["ULS 6.10"]
    assert sls_variable_characteristic(loads) == []


def test_variable_only_no_G():
    loads = [UDL("office", "imposed", Q, category="B")]
    a, b = uls_combinations(loads)
    assert "G" not in a.expression and _w(b, "office") == pytest.approx(1.5 * Q)


# ------------------------------------------------------------------ SLS
def test_sls_combinations():
    loads = _floor() + [UDL("roof snow", "snow", 3.0)]
    ch = _by_name(sls_characteristic(loads), "SLS characteristic, leading: imposed B")
    assert _total_w(ch) == pytest.approx(G + Q + 0.5 * 3.0, rel=REL)           # Eq. 6.14b
    fr = _by_name(sls_frequent(loads), "SLS frequent, leading: snow")
    assert _total_w(fr) == pytest.approx(G + 0.2 * 3.0 + 0.3 * Q, rel=REL)     # Eq. 6.15b, psi_1 snow, psi_2 B
    (qp,) = sls_quasi_permanent(loads)
    assert _total_w(qp) == pytest.approx(G + 0.3 * Q + 0.0 * 3.0, rel=REL)     # Eq. 6.16b
    vc = _by_name(sls_variable_characteristic(loads), "SLS variable characteristic, leading: imposed B")
    assert _total_w(vc) == pytest.approx(Q + 0.5 * 3.0, rel=REL)               # 6.14b without G
    assert len(sls_combinations(loads)) == 2 + 2 + 1 + 2


# ------------------------------------------------------------------ rendering
@pytest.mark.parametrize("fn", [fm.w_Ed_610, fm.w_Ed_610a, fm.w_Ed_610b, fm.w_k_char, fm.w_k_freq,
                                fm.w_k_qp, fm.w_acc])
def test_formulas_render_same_value(fn):
    ex = fn.__clause__.example
    calc = Calc(render=True)
    assert calc(fn, **ex) == pytest.approx(fn(**ex), rel=1e-9)
    assert calc.latex and "kN/m" in calc.latex[0]


def test_render_line_load_matches_combination():
    loads = _floor() + [UDL("roof snow", "snow", 3.0), UDL("wind uplift-free", "wind", 1.0),
                        PointLoad("p", "permanent", 5e3, 2000.0)]
    for c in uls_combinations(loads) + sls_combinations(loads):
        calc = Calc(render=True)
        w = render_line_load(c, loads, 6000.0, calc=calc)
        expected = sum(ld.w for ld in c.loads if isinstance(ld, UDL))   # all UDLs are full span here
        assert w == pytest.approx(expected, rel=1e-9), c.name
        assert calc.latex
    b = _by_name(uls_combinations(loads), "ULS 6.10b, leading: imposed B")
    # hand calculation, Eq. 6.10b: 0.925*1.35*5 + 1.5*10 + 1.5*0.5*3 + 1.5*0.5*1
    assert render_line_load(b, loads, 6000.0) == pytest.approx(0.925 * 1.35 * 5 + 1.5 * 10 + 1.5 * 0.5 * 3
                                                               + 1.5 * 0.5 * 1, rel=1e-12)


# ------------------------------------------------------------------ bad input
def test_combination_bad_input():
    with pytest.raises(InputError, match="combination"):
        uls_combinations(_floor(), NationalAnnex(combination="6.11"))
    with pytest.raises(InputError, match="na"):
        uls_combinations(_floor(), "UK")
    with pytest.raises(InputError, match="loads"):
        uls_combinations([])
    with pytest.raises(InputError, match="psi"):
        sls_characteristic(_floor(), psi={"B": 0.7})
    with pytest.raises(InputError, match="combos"):
        governing([], _total_w)


junk = st.one_of(st.none(), st.text(max_size=3), st.floats(allow_nan=True, allow_infinity=True),
                 st.integers(-10, 10), st.lists(st.integers(), max_size=2))


@settings(max_examples=150, deadline=None)
@given(name=st.one_of(st.just("x"), junk), action=st.one_of(st.sampled_from(["permanent", "imposed", "snow"]), junk),
       w=junk, a=junk, b=junk, cat=st.one_of(st.sampled_from(["A", "B", "Z"]), junk))
def test_bad_input_raises_only_input_error(name, action, w, a, b, cat):
    try:
        UDL(name, action, w, a if a is not None else 0.0, b, cat)
    except InputError:
        pass
    try:
        PointLoad(name, action, w, a, cat)
    except InputError:
        pass
    try:
        psi_factors(action, cat)
    except InputError:
        pass
    try:
        self_weight_udl(w)
    except InputError:
        pass


def test_psi_tables_are_distinct_objects():
    assert PSI_UK_NA.get("imposed", "E").psi_2 == 0.8          # storage psi_2 (from memory)
    assert not math.isclose(PSI_UK_NA.get("wind").psi_0, PSI_EN_RECOMMENDED.get("wind").psi_0)


def test_combination_to_dict_units():
    loads = [UDL("slab", "permanent", G), PointLoad("tank", "snow", 3e3, 100.0)]
    d = uls_combinations(loads)[1].to_dict()
    assert d["factors"] == {"G": pytest.approx(0.925 * 1.35), "snow": 1.5}        # Eq. 6.10b
    assert d["loads"][0]["w_kN_per_m"] == pytest.approx(0.925 * 1.35 * G)         # N/mm = kN/m
    assert d["loads"][1]["P_kN"] == pytest.approx(1.5 * 3e3 / 1e3)
    assert d["citation"] == "EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10b)"
