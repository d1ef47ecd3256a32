"""Fit of the new beam on an existing beam web: notches found from the levels of both members, the
notched section checked, and no LTB restraint claimed at a connection that lets the existing beam twist.

Sources beside each value:
* section dimensions: UK section tables (from memory), as stored in splicecalc's section table;
* the demo crossbeam: measured dimensions of the invented demo job (h 457, b 152, t_w 9.9, t_f 17.0, r 10.2);
* hand calculations from EN 1993-1-1:2005 6.2.3, 6.2.6, 6.2.8 with the arithmetic written out;
* notch clearances (5 mm depth, 10 mm length, rounded up to 5 mm): common practice, no source;
* notched-beam stability limits: published simple-joint guidance (from memory);
* f_u = 470 MPa for S355, 3 mm < t <= 100 mm: EN 10025-2 Table 7; gamma_Mu = 1.1: UK practice for tying (from memory).
"""

from __future__ import annotations

from math import sqrt

import pytest

from splicecalc.core.errors import InputError
from splicecalc.joints.connections import design_end_connection, parse_support
from splicecalc.joints.connections.existing_spec import parse_existing_loads
from splicecalc.joints.connections.notch import notch_fit
from splicecalc.sections import get_section

REL = 1e-6
NEW = get_section("457x152x60 UKB")          # h 454.6, b 152.9, t_w 8.1, t_f 13.3, r 10.2 (section table)
CROSS = {"designation": "existing crossbeam (measured)", "h": "457 mm", "b": "152 mm", "tw": "9.9 mm",
         "tf": "17.0 mm", "r": "10.2 mm"}


def _support(**kw):
    t = {"at": "end", "connection": "end plate", "bolts": "M20 8.8", "plate": "S275", "existing_member": CROSS,
         "existing_face": "beam web", "existing_steel": "1950-1958"}
    t.update(kw)
    return parse_support(t, 2)


def _rec(d, id):
    return next(r for r in d.records if r.id == id)


def test_section_dimensions_used():
    # 457x152x60 UKB, section table (from memory)
    assert (NEW.h, NEW.tw, NEW.tf, NEW.r) == pytest.approx((454.6, 8.1, 13.3, 10.2))


@pytest.fixture(scope="module")
def demo_b():
    return design_end_connection(NEW, "S355", 97.65e3, _support())


def test_demo_end_b_clash_found_and_double_notch_designed(demo_b):
    """Checker finding: tops level, the 454.6 mm beam meets both flanges of the 457 mm crossbeam
    (clear depth 457 - 2 x 17 = 423 mm), and the plate top at 23.5 mm sat on the top root fillet."""
    s = demo_b.spec
    # cut needed at the top: t_f + r = 17 + 10.2 = 27.2 mm; at the bottom: 454.6 - (457 - 27.2) = 24.8 mm
    fit = notch_fit(NEW, s.existing_member, 0.0)
    assert fit.need_top == pytest.approx(27.2) and fit.need_bottom == pytest.approx(24.8)
    # + 5 mm clearance, up to 5 mm: 32.2 -> 35, 29.8 -> 30; length (152 - 9.9)/2 + 10 = 81.05 -> 85 (common practice)
    assert (s.notch_depth, s.notch_bottom_depth, s.notch_length, s.notch_bottom_length) == (35.0, 30.0, 85.0, 85.0)
    assert "Double notch" in demo_b.choice and "common practice" in demo_b.choice
    # plate moved clear of the fillets: top 35 + 10 = 45 mm (>= 27.2), bottom 45 + 290 = 335 <= 429.8
    assert demo_b.detail.top == pytest.approx(45.0)
    r = _rec(demo_b, "ex_fit_web_top")
    assert (r.demand, r.resistance) == pytest.approx((27.2, 45.0)) and r.ok
    r = _rec(demo_b, "ex_fit_web_bottom")
    assert r.demand == pytest.approx(45.0 + 290.0) and r.resistance == pytest.approx(457 - 17 - 10.2) and r.ok
    for id, need, got in (("ex_fit_notch", 27.2, 35.0), ("ex_fit_notch_bottom", 24.8, 30.0),
                          ("ex_fit_notch_len", 71.05, 85.0)):
        r = _rec(demo_b, id)
        assert (r.demand, r.resistance) == pytest.approx((need, got)) and r.ok, id
    assert demo_b.checks_pass


def test_demo_end_b_notched_section_by_hand(demo_b):
    h_w = 454.6 - 35 - 30                                       # 389.6 mm web rectangle
    V_pl = h_w * 8.1 * 355 / sqrt(3)                            # EN 1993-1-1 6.2.6 Eq. 6.18, gamma_M0 = 1.0
    assert _rec(demo_b, "notch_shear").resistance == pytest.approx(V_pl / 1e3, rel=REL)     # 646.8 kN
    assert V_pl / 1e3 == pytest.approx(646.8, abs=0.1)
    r = _rec(demo_b, "notch_bending")
    # V_Ed < 0.5 V_pl: rho = 0 (6.2.8(2)); W_el = t_w h_w^2 / 6; lever = c + t_p = 85 + 10 mm
    assert r.resistance == pytest.approx(8.1 * h_w**2 / 6 * 355 / 1e6, rel=REL)               # 72.74 kNm
    assert r.demand == pytest.approx(97.65 * 0.095, rel=REL)
    # published notched-beam guidance (from memory), S355: c <= 110 000 h_b/(h_b/t_w)^3 when h_b/t_w > 48.0
    r = _rec(demo_b, "notch_stability")
    assert r.resistance == pytest.approx(110000 * 454.6 / (454.6 / 8.1)**3, rel=1.5e-2) and r.ok
    assert "h_b/5" in r.note                                   # both notches <= 454.6/5 = 90.9 mm
    # tying through the rectangle, f_u 470 (EN 10025-2 Table 7), gamma_Mu 1.1: 1348.4 kN
    r = _rec(demo_b, "notch_tie")
    assert r.resistance == pytest.approx(h_w * 8.1 * 470 / 1.1 / 1e3, rel=REL)


def test_shallow_beam_needs_top_notch_only():
    beam = get_section("356x171x51 UKB")                       # h 355 < 429.8: clear of the bottom flange
    d = design_end_connection(beam, "S355", 80e3, _support())
    assert d.spec.notch_depth == 35.0 and d.spec.notch_bottom_depth is None
    assert {"notch_shear", "notch_bending", "notch_stability", "notch_tie"} <= {r.id for r in d.records}
    assert not any(r.id == "ex_fit_notch_bottom" for r in d.records)


def test_level_below_gives_bottom_notch_only():
    # new top 30 mm below the existing top: 30 > 27.2, no top cut; bottom 30 + 454.6 - 429.8 = 54.8 -> 60 mm
    d = design_end_connection(NEW, "S355", 80e3, _support(top_below_existing="30 mm"))
    assert d.spec.notch_depth is None and d.spec.notch_bottom_depth == 60.0
    assert _rec(d, "ex_fit_notch_bottom").demand == pytest.approx(54.8)
    assert _rec(d, "notch_bottom_shear").ok
    assert _rec(d, "ex_fit_web_top").resistance == pytest.approx(30 + d.detail.top)


def test_given_top_notch_too_shallow_fails():
    d = design_end_connection(NEW, "S355", 80e3, _support(notch_top="20 mm x 120 mm"))
    r = _rec(d, "ex_fit_notch")
    assert r.demand == pytest.approx(27.2) and r.resistance == 20.0 and not r.ok
    assert not d.checks_pass


def test_deep_double_notch_stability_not_checked():
    beam = get_section("533x210x92 UKB")                       # h 533.1: bottom cut 533.1 - 429.8 = 103.3 -> 110
    d = design_end_connection(beam, "S355", 120e3, _support())
    assert d.spec.notch_bottom_depth == 110.0 and 110.0 > beam.h / 5
    r = _rec(d, "notch_stability")
    assert not r.checked and "buckling analysis" in r.note


def test_top_below_existing_only_on_a_beam_web():
    with pytest.raises(InputError, match=r"support\[2\]\.top_below_existing"):
        _support(existing_face="column flange", existing_member="254x254x73 UKC", top_below_existing="10 mm")


# ------------------------------------------------------------------ A3: restraint at the connection

def _beam_loads(**kw):
    t = {"kind": "beam", "span": "6.0 m", "at": "3.0 m", "udl": {"permanent": "3.5 kN/m"}}
    t.update(kw)
    return parse_existing_loads(t, "beam web", "support[2].existing_loads")


def test_restraint_at_free_connection_refused():
    with pytest.raises(InputError) as ei:
        _beam_loads(restraints=["3.0 m"], torsion="free")
    msg = str(ei.value)
    assert "support[2].existing_loads.restraints[1]" in msg and "torsion = 'restrained'" in msg
    assert "\n" not in msg.strip()


def test_restraint_elsewhere_or_with_stated_torsional_restraint_accepted():
    assert _beam_loads(restraints=["2.0 m"], torsion="free").restraints == (2000.0,)
    assert _beam_loads(restraints=["3.0 m"], torsion="restrained").restraints == (3000.0,)


def test_demo_crossbeam_ltb_over_full_span():
    """The demo crossbeam is checked over its 6.0 m (no restraint at 3.0 m). Checker's rough independent estimate:
    M_b,Rd about 200 kNm against M_Ed = 7.378 x 4.5 + 97.7 x 1.5 = 179.7 kNm (hand)."""
    from pathlib import Path

    from splicecalc.job import load_job
    from splicecalc.workflow.calc import run_calc

    demo = Path(__file__).resolve().parents[1] / "examples" / "demo_workshop_gallery.toml"
    r = run_calc(load_job(demo), render=False)
    b = next(c for c in r.connections if c.end == "B")
    ltb = [x for x in b.existing_records if "lateral-torsional" in x.title]
    assert len(ltb) == 1                                        # one segment, 0 to 6 m
    assert ltb[0].demand == pytest.approx(179.7, abs=0.1)
    assert 190.0 < ltb[0].resistance < 215.0 and ltb[0].ok
    assert b.design.spec.notch_bottom_depth == 30.0            # the demo's end B is double notched


def test_level_leaving_no_web_is_one_line_error():
    # new top 400 mm above the existing top: top cut 17 + 10.2 + 400 = 427.2 mm, + 5 mm up to 435 mm, which is
    # past h - t_f - r = 454.6 - 13.3 - 10.2 = 431.1 mm of the new beam (its bottom root fillet): hand
    with pytest.raises(InputError, match=r"support\[2\]\.top_below_existing") as ei:
        design_end_connection(NEW, "S355", 80e3, _support(top_below_existing="-400 mm"))
    assert "\n" not in str(ei.value).strip()


def test_notched_end_ltb_not_checked_unless_restrained():
    d = design_end_connection(NEW, "S355", 80e3, _support())
    r = _rec(d, "notch_ltb")
    assert not r.checked and "end B" in r.note and "top 35 x 85 mm, bottom 30 x 85 mm" in r.note
    d = design_end_connection(NEW, "S355", 80e3, _support(), restrained=True)
    assert not any(x.id == "notch_ltb" for x in d.records)
