"""Tests of splicecalc.analysis (simply supported span, envelopes, diagrams).

Sources:
* closed-form results for simply supported beams from standard beam tables (any structural
  engineering handbook, e.g. the "beam formulas" tables; from memory): wL/2, wL^2/8,
  5wL^4/(384EI), wL^3/(24EI); PL/4, PL^3/(48EI); Pab/L and
  P a b (L + b) sqrt(3a(L + b)) / (27 E I L) at x = sqrt(a(a + 2b)/3) for a > b;
  partial UDL by statics (moments about a support);
* the independent general-purpose frame analysis library ``anastruct`` (PyPI, 2D FE).
"""

from __future__ import annotations

import io
import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from splicecalc.actions import UDL, PointLoad, uls_combinations
from splicecalc.analysis import (SimpleBeam, beam_diagrams, envelope, envelope_at, envelope_diagram,
                                 governing_M, governing_V, governing_w)
from splicecalc.core import InputError

E = 210_000.0          # MPa, EN 1993-1-1 3.2.6
I = 2.0e8              # mm4
EI = E * I
L = 7200.0             # mm


def G(w, a=0.0, b=None, name="g"):
    return UDL(name, "permanent", w, a, b)


def P(p, x, name="p"):
    return PointLoad(name, "permanent", p, x)


# ---------------------------------------------------------------- handbook cases
def test_full_udl():
    w = 12.5
    b = SimpleBeam(L, [G(w)], E=E, I=I)
    assert b.R_A == pytest.approx(w * L / 2, rel=1e-12)                 # wL/2
    assert b.R_B == pytest.approx(w * L / 2, rel=1e-12)
    m = b.M_max()
    assert m.value == pytest.approx(w * L ** 2 / 8, rel=1e-12)          # wL^2/8
    assert m.x_mm == pytest.approx(L / 2, rel=1e-12)
    d = b.w_max()
    assert d.value == pytest.approx(5 * w * L ** 4 / (384 * EI), rel=1e-9)   # 5wL^4/384EI
    assert d.x_mm == pytest.approx(L / 2, rel=1e-7)
    assert b.theta(0.0) == pytest.approx(w * L ** 3 / (24 * EI), rel=1e-12)  # end slope wL^3/24EI
    assert b.theta(L) == pytest.approx(-w * L ** 3 / (24 * EI), rel=1e-12)
    v = b.V_max()
    assert abs(v.value) == pytest.approx(w * L / 2, rel=1e-12)
    x = 1800.0
    assert b.M(x) == pytest.approx(w * x * (L - x) / 2, rel=1e-12)      # wx(L-x)/2
    assert b.V(x) == pytest.approx(w * (L / 2 - x), rel=1e-12)          # w(L/2 - x)
    assert b.w(x) == pytest.approx(w * x * (L ** 3 - 2 * L * x ** 2 + x ** 3) / (24 * EI), rel=1e-12)


def test_central_point_load():
    p = 40e3
    b = SimpleBeam(L, [P(p, L / 2)], E=E, I=I)
    assert b.M_max().value == pytest.approx(p * L / 4, rel=1e-12)             # PL/4
    assert b.M_max().x_mm == pytest.approx(L / 2)
    assert b.w_max().value == pytest.approx(p * L ** 3 / (48 * EI), rel=1e-9)  # PL^3/48EI
    assert b.V(L / 2, "left") == pytest.approx(p / 2) and b.V(L / 2, "right") == pytest.approx(-p / 2)


def test_off_centre_point_load():
    p, a = 30e3, 4700.0
    bb = L - a
    b = SimpleBeam(L, [P(p, a)], E=E, I=I)
    assert b.R_A == pytest.approx(p * bb / L, rel=1e-12)                 # Pb/L
    assert b.M_max().value == pytest.approx(p * a * bb / L, rel=1e-12)  # Pab/L
    assert b.M_max().x_mm == a
    d = b.w_max()
    expected = p * a * bb * (L + bb) * math.sqrt(3 * a * (L + bb)) / (27 * EI * L)  # a > b, handbook
    assert d.value == pytest.approx(expected, rel=1e-9)
    assert d.x_mm == pytest.approx(math.sqrt(a * (a + 2 * bb) / 3), rel=1e-7)
    assert b.theta(d.x_mm) == pytest.approx(0.0, abs=1e-12)
    # mirror: load at L - a gives the mirror position
    m = SimpleBeam(L, [P(p, bb)], E=E, I=I).w_max()
    assert m.value == pytest.approx(expected, rel=1e-9)
    assert m.x_mm == pytest.approx(L - math.sqrt(a * (a + 2 * bb) / 3), rel=1e-7)


def test_partial_udl_statics():
    w, c, d = 8.0, 1500.0, 4000.0
    b = SimpleBeam(L, [G(w, c, d)], E=E, I=I)
    W = w * (d - c)
    R_B = W * (c + d) / 2 / L          # moments about A
    R_A = W - R_B
    assert b.R_B == pytest.approx(R_B, rel=1e-12)
    assert b.R_A == pytest.approx(R_A, rel=1e-12)
    m = b.M_max()
    assert m.x_mm == pytest.approx(c + R_A / w, rel=1e-12)              # V = 0 inside the loaded length
    assert m.value == pytest.approx(R_A * c + R_A ** 2 / (2 * w), rel=1e-12)   # R_A(c + R_A/2w)
    assert b.M(c) == pytest.approx(R_A * c, rel=1e-12)
    assert b.M(d) == pytest.approx(R_B * (L - d), rel=1e-12)


def test_partial_udl_to_end_uses_span():
    b1 = SimpleBeam(L, [G(5.0, 2000.0)])
    b2 = SimpleBeam(L, [G(5.0, 2000.0, L)])
    assert b1.R_A == b2.R_A and b1.M_max() == b2.M_max()


def test_loads_on_supports_do_not_shear_span():
    b = SimpleBeam(L, [P(10e3, 0.0), P(20e3, L), G(2.0)])
    assert b.R_A == pytest.approx(10e3 + 2.0 * L / 2) and b.R_B == pytest.approx(20e3 + 2.0 * L / 2)
    assert b.V(0.0) == pytest.approx(2.0 * L / 2) and b.V(L, "left") == pytest.approx(-2.0 * L / 2)
    assert abs(b.V_max().value) == pytest.approx(2.0 * L / 2)
    assert b.M_max().value == pytest.approx(2.0 * L ** 2 / 8)


def test_vectorised_matches_scalar():
    loads = [G(4.0), G(6.0, 1000.0, 3500.0), P(15e3, 2200.0), P(9e3, 6100.0)]
    b = SimpleBeam(L, loads, E=E, I=I)
    xs = np.linspace(0.0, L, 37)
    for f in (b.M, b.V, b.w, b.theta):
        arr = f(xs)
        assert arr.shape == xs.shape
        assert all(arr[i] == pytest.approx(f(float(x)), rel=1e-12, abs=1e-9) for i, x in enumerate(xs))


def test_superposition():
    l1, l2 = [G(4.0), P(15e3, 2200.0)], [G(6.0, 1000.0, 3500.0), P(9e3, 6100.0)]
    b1, b2, b = (SimpleBeam(L, ll, E=E, I=I) for ll in (l1, l2, l1 + l2))
    xs = np.linspace(0.0, L, 25)
    assert np.allclose(b.M(xs), b1.M(xs) + b2.M(xs), rtol=1e-12, atol=1e-6)
    assert np.allclose(b.w(xs), b1.w(xs) + b2.w(xs), rtol=1e-12, atol=1e-12)


# ---------------------------------------------------------------- anastruct
def _anastruct(loads, span, EI_, step=60.0):
    """Reactions (N), max |M| (N*mm) and deflection at midspan (mm) from anastruct 2D FE."""
    from anastruct import SystemElements

    pts = {0.0, span, span / 2}
    for ld in loads:
        if isinstance(ld, PointLoad):
            pts.add(ld.x)
        else:
            a, b = ld.extent(span)
            pts.update((a, b))
    pts.update(np.arange(0.0, span, step).tolist())
    xs = np.array(sorted(pts))
    ss = SystemElements(EA=1e15, EI=EI_)
    for a, b in zip(xs[:-1], xs[1:]):
        ss.add_element([[float(a), 0.0], [float(b), 0.0]])
    n = len(xs)
    ss.add_support_hinged(1)
    ss.add_support_roll(n)
    mids = (xs[:-1] + xs[1:]) / 2
    q = np.zeros_like(mids)      # anastruct keeps one q per element: sum the UDLs first
    for ld in loads:
        if isinstance(ld, PointLoad):
            ss.point_load(int(np.argmin(np.abs(xs - ld.x))) + 1, Fy=-ld.P)
        else:
            a, b = ld.extent(span)
            q[(mids > a) & (mids < b)] += ld.w
    for i in np.nonzero(q)[0]:   # a list q would mean a linearly varying load (start, end)
        ss.q_load(q=-float(q[i]), element_id=int(i) + 1, direction="element")
    ss.solve()
    R_A = abs(ss.get_node_results_system(1)["Fy"])
    R_B = abs(ss.get_node_results_system(n)["Fy"])
    res = ss.get_element_results()
    M = max(max(abs(r["Mmin"]), abs(r["Mmax"])) for r in res)
    w_mid = ss.get_node_results_system(int(np.argmin(np.abs(xs - span / 2))) + 1)["uy"]
    return R_A, R_B, M, abs(w_mid)


MIXED = [
    (7200.0, [G(6.5), UDL("plant", "imposed", 9.0, 2000.0, 4800.0, category="E"), P(25e3, 1500.0),
              P(18e3, 5900.0)]),
    (9400.0, [G(3.2), UDL("store", "imposed", 14.0, 0.0, 3100.0, category="E"), P(42e3, 4100.0),
              P(11e3, 8650.0)]),
]


@pytest.mark.parametrize("span, loads", MIXED)
def test_against_anastruct(span, loads):
    b = SimpleBeam(span, loads, E=E, I=I)
    R_A, R_B, M, w_mid = _anastruct(loads, span, EI)
    tol = 0.005   # 0.5 %, anastruct result (discretised FE)
    assert b.R_A == pytest.approx(R_A, rel=tol)
    assert b.R_B == pytest.approx(R_B, rel=tol)
    assert b.M_max().value == pytest.approx(M, rel=tol)
    assert b.w(span / 2) == pytest.approx(w_mid, rel=tol)


# ---------------------------------------------------------------- property tests
@st.composite
def load_sets(draw):
    span = draw(st.floats(1000.0, 20000.0))
    loads = []
    for i in range(draw(st.integers(1, 6))):
        if draw(st.booleans()):
            a = draw(st.floats(0.0, 0.95)) * span
            b = a + draw(st.floats(0.02, 1.0)) * (span - a)
            loads.append(UDL(f"u{i}", "permanent", draw(st.floats(0.1, 100.0)), a, min(b, span)))
        else:
            loads.append(PointLoad(f"p{i}", "permanent", draw(st.floats(10.0, 5e5)),
                                   draw(st.floats(0.0, 1.0)) * span))
    return span, loads


@settings(max_examples=80, deadline=None)
@given(load_sets())
def test_equilibrium_and_end_conditions(case):
    span, loads = case
    b = SimpleBeam(span, loads, E=E, I=I)
    total = sum(ld.total(span) for ld in loads)
    assert b.R_A + b.R_B == pytest.approx(total, rel=1e-10)               # vertical equilibrium
    scale_M = total * span
    assert abs(b.M(0.0)) <= 1e-9 * scale_M and abs(b.M(span)) <= 1e-9 * scale_M   # M(0) = M(L) = 0
    wscale = total * span ** 3 / EI
    assert abs(b.w(0.0)) <= 1e-9 * wscale and abs(b.w(span)) <= 1e-9 * wscale     # w(0) = w(L) = 0
    # the exact maxima bound every sampled value
    xs = np.linspace(0.0, span, 401)
    assert b.M_max().abs >= np.max(np.abs(b.M(xs))) * (1 - 1e-12) - 1e-12 * scale_M
    assert b.w_max().abs >= np.max(np.abs(b.w(xs))) * (1 - 1e-12) - 1e-12 * wscale
    assert b.V_max().abs >= np.max(np.abs(b.V(xs))) * (1 - 1e-12) - 1e-12 * total
    assert abs(b.theta(b.w_max().x_mm)) <= 1e-7 * wscale / span
    # moment equals the integral of shear (trapezoid on a fine grid)
    xf = np.linspace(0.0, span, 4001)
    vm = (b.V(xf[:-1], "right") + b.V(xf[1:], "left")) / 2
    assert np.cumsum(vm * np.diff(xf))[-1] == pytest.approx(0.0, abs=2e-3 * scale_M)


junk = st.one_of(st.none(), st.text(max_size=3), st.floats(allow_nan=True, allow_infinity=True),
                 st.integers(-5, 5), st.lists(st.floats(), max_size=2))


@settings(max_examples=120, deadline=None)
@given(span=junk, x=junk, I_=junk, side=st.one_of(st.sampled_from(["left", "right"]), junk))
def test_bad_input_raises_only_input_error(span, x, I_, side):
    try:
        b = SimpleBeam(span, [G(1.0, 0.0, 500.0), P(1e3, 400.0)], I=I_)
    except InputError:
        b = SimpleBeam(1000.0, [G(1.0)], I=1e6)
    for f in (lambda: b.M(x), lambda: b.V(x, side), lambda: b.w(x), lambda: b.theta(x)):
        try:
            f()
        except InputError:
            pass


def test_absurd_sizes_are_refused_before_they_overflow():
    # the closed forms use L^4 and 1/(E I): sizes far outside any beam are input errors, not inf/nan
    import warnings

    with warnings.catch_warnings():
        warnings.simplefilter("error")                       # no overflow warning on the way
        for kw, field in ((dict(span_mm=1e300), "span_mm"), (dict(I=1e-300), "I"), (dict(E=1e300), "E")):
            args = dict(span_mm=5000.0, loads=[G(1.0)], I=1e8) | kw
            with pytest.raises(InputError, match=field):
                SimpleBeam(args.pop("span_mm"), args.pop("loads"), **args)
        with pytest.raises(InputError, match="w"):
            SimpleBeam(5000.0, [G(1e300)])
        with pytest.raises(InputError, match="P"):
            SimpleBeam(5000.0, [P(1e300, 100.0)])


def test_bad_input_messages():
    with pytest.raises(InputError, match="span_mm"):
        SimpleBeam(-1.0, [G(1.0)])
    with pytest.raises(InputError, match="x_end"):
        SimpleBeam(5000.0, [G(1.0, 0.0, 6000.0)])
    with pytest.raises(InputError, match="x"):
        SimpleBeam(5000.0, [G(1.0)]).M(5200.0)
    with pytest.raises(InputError, match="I"):
        SimpleBeam(5000.0, [G(1.0)]).w_max()
    with pytest.raises(InputError, match="side"):
        SimpleBeam(5000.0, [G(1.0)]).V(100.0, side="up")


# ---------------------------------------------------------------- combinations on the beam
FLOOR = [G(5.0, name="slab"), UDL("office", "imposed", 10.0, category="B"),
         PointLoad("tank", "imposed", 20e3, 2500.0, category="E", group="plant")]


def test_governing_helpers_and_envelope():
    combos = uls_combinations(FLOOR)
    gM = governing_M(combos, L)
    best = max(abs(SimpleBeam(L, c.loads).M_max().value) for c in combos)
    assert gM.value == pytest.approx(best, rel=1e-12)
    assert gM.combination.kind == "6.10b"     # light permanent load: 6.10b governs (hand check)
    gV = governing_V(combos, L)
    assert abs(gV.value) == pytest.approx(max(abs(SimpleBeam(L, c.loads).V_max().value) for c in combos))
    gw = governing_w(combos, L, I=I)
    assert gw.value == pytest.approx(max(SimpleBeam(L, c.loads, I=I).w_max().value for c in combos))
    env = envelope_at(combos, L, [1200.0, 2500.0, 3600.0])
    for i, x in enumerate(env.x_mm):
        assert env.M_Ed[i] == pytest.approx(max(abs(SimpleBeam(L, c.loads).M(x)) for c in combos))
        vv = max(max(abs(SimpleBeam(L, c.loads).V(x, s)) for s in ("left", "right")) for c in combos)
        assert env.V_Ed[i] == pytest.approx(vv)
    assert env.governing_M_name(0) in env.names
    full = envelope(combos, L, n=201)
    assert full.x_mm.shape == (201,) and full.M_Ed.max() <= gM.extreme.abs * (1 + 1e-12)
    with pytest.raises(InputError, match="x_mm"):
        envelope_at(combos, L, [L + 1.0])
    with pytest.raises(InputError, match="n"):
        envelope(combos, L, n=1)


# ---------------------------------------------------------------- diagrams
def test_diagrams():
    b = SimpleBeam(L, FLOOR, E=E, I=I)
    fig = beam_diagrams(b, splices_mm=[2400.0, 4800.0], restraints_mm=[3600.0], title="test")
    assert len(fig.axes) == 4                                         # loads, V, M, w
    texts = " ".join(t.get_text() for ax in fig.axes for t in ax.texts)
    assert f"{b.M_max().value / 1e6:.1f} kNm" in texts and "S2" in texts and "R1" in texts
    buf = io.BytesIO()
    fig.savefig(buf, format="pdf")
    assert buf.getvalue()[:4] == b"%PDF"
    assert len(beam_diagrams(SimpleBeam(L, FLOOR)).axes) == 3       # no I: no deflection panel
    assert len(beam_diagrams(SimpleBeam(L, FLOOR), show_loads=False).axes) == 2
    env_fig = envelope_diagram(envelope(uls_combinations(FLOOR), L), splices_mm=[2400.0])
    assert len(env_fig.axes) == 2
    with pytest.raises(InputError, match="splices_mm"):
        beam_diagrams(b, splices_mm=[L + 10.0])


def test_diagram_can_show_the_deflection_of_another_combination():
    # ULS V/M with the SLS deflection panel: the panel's maximum is that beam's exact w_max (5wL^4/384EI)
    uls = SimpleBeam(L, [G(15.0)])
    sls = SimpleBeam(L, [G(10.0)], E=E, I=I)
    fig = beam_diagrams(uls, deflection_of=sls, deflection_label="SLS")
    assert len(fig.axes) == 4
    assert sls.w_max().value == pytest.approx(5 * 10.0 * L ** 4 / (384 * EI), rel=1e-9)  # handbook
    with pytest.raises(InputError, match="deflection_of"):
        beam_diagrams(uls, deflection_of=SimpleBeam(L / 2, [G(1.0)], E=E, I=I))
    with pytest.raises(InputError, match="deflection_of"):
        beam_diagrams(uls, deflection_of=SimpleBeam(L, [G(1.0)]))       # no I
