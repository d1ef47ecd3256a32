"""Checker's review of the simple end connections: one test per finding, each with the hand
calculation from the clause written out beside the expected value.

Sources: EN 1993-1-8:2005 (3.6.1 Table 3.4 and 3.6.1(10), 3.7(1), 4.5.3.2 Eq. 4.1, 6.2.4.1
Table 6.2), EN 1993-1-1:2005 (6.2.6), BS 4-1 section dimensions as held in the catalogue,
published simple-joint guidance factors (0.8 on bolt shear, 1.27, 2.73 z) FROM MEMORY, and
historic-steel era strengths FROM MEMORY (flagged in the package).
"""

from __future__ import annotations

from math import sqrt

import pytest

from splicecalc.core.errors import InputError
from splicecalc.core.record import Calc
from splicecalc.joints.bolts import get_bolt
from splicecalc.joints.connections import check_notch, design_end_connection, parse_support
from splicecalc.joints.connections.detail import Context, Detail
from splicecalc.joints.connections.endplate import end_plate_checks
from splicecalc.materials import UK_NA, steel
from splicecalc.materials.historic import existing_steel
from splicecalc.sections import get_section

REL = 1e-6
BEAM = get_section("457x191x67 UKB")     # h 453.4, b 189.9, t_w 8.5, t_f 12.7, r 10.2 (BS 4-1)
COL = get_section("254x254x73 UKC")      # h 254.1, b 254.6, t_w 8.6, t_f 14.2, r 12.7 (BS 4-1)


def _table(**kw):
    t = {"at": "start", "connection": "end plate", "bolts": "M20 8.8", "plate": "10 mm S275",
         "existing_member": "254x254x73 UKC", "existing_face": "column flange", "existing_steel": "S275"}
    t.update(kw)
    return t


def _ctx(existing_steel_text="S275", existing=COL, face="column flange", tie=75e3):
    return Context(beam=BEAM, beam_grade="S355", beam_mat=steel("S355", BEAM.tf), existing=existing, face=face,
                   existing_mat=existing_steel(existing_steel_text, existing.tf), na=UK_NA, tie=tie)


def _rec(records, id):
    return next(r for r in records if r.id == id)


# ------------------------------------------------------------------ end plate bolt group: EN 1993-1-8 3.7(1)

def test_end_plate_group_takes_n_times_smallest_when_bearing_is_below_bolt_shear():
    """Finding: the group was 0.8 x sum of per-bolt min(F_v, F_b), which is not 3.7(1) and is
    unconservative when the end-row bearing is the smallest resistance. Fixed: 3.7(1) with 0.8 F_v,Rd."""
    det = Detail("end plate", get_bolt("M20", "8.8"), 4, 70.0, 30.0, 30.0, 10.0, "S275", 8.0, 22.9, p_3=90.0)
    recs = end_plate_checks(_ctx(), det, 300e3, Calc())
    r = _rec(recs, "ep_bolt_group")
    # Table 3.4, M20 8.8: F_v,Rd = 0.6 x 800 x 245 / 1.25 = 94 080 N; 0.8 F_v,Rd = 75 264 N (0.8 from memory)
    Fv = 0.6 * 800 * 245 / 1.25
    # plate 10 mm S275 (f_u 410): k_1 = min(2.8 x 30/22 - 1.7, 1.4 x 90/22 - 1.7, 2.5) = 2.118
    k1 = min(2.8 * 30 / 22 - 1.7, 1.4 * 90 / 22 - 1.7, 2.5)
    Fb_end = k1 * min(30 / 66, 800 / 410, 1.0) * 410 * 20 * 10 / 1.25      # e_1 = 30: 63.2 kN
    Fb_in = k1 * min(70 / 66 - 0.25, 800 / 410, 1.0) * 410 * 20 * 10 / 1.25  # p_1 = 70: 112.6 kN
    # existing 14.2 mm S275 flange: inner alpha_d, k_1 = 2.5 (e_2 = (254.6 - 90)/2 = 82.3): 160 kN, not governing
    Fb_s = 2.5 * min(70 / 66 - 0.25, 1.0) * 410 * 20 * 14.2 / 1.25
    assert Fb_s > Fb_in
    assert Fb_end < 0.8 * Fv < Fb_in          # so 3.7(1): n x the smallest resistance
    expected = 8 * Fb_end                     # 505.3 kN
    assert r.resistance == pytest.approx(expected / 1e3, rel=REL)
    assert r.clause == "EN 1993-1-8:2005, 3.7(1)"
    old = 0.8 * (2 * Fb_end + 6 * min(Fv, Fb_in))   # the former rule: 552.6 kN, 9 % above 3.7(1)
    assert old > 1.09 * expected


def test_end_plate_group_sums_bearing_when_every_bearing_is_below_reduced_shear():
    # 3.7(1): if 0.8 F_v,Rd >= F_b,Rd of every bolt, the group is the sum of F_b,Rd (no 0.8 on bearing)
    det = Detail("end plate", get_bolt("M24", "10.9"), 3, 70.0, 40.0, 35.0, 10.0, "S275", 8.0, 22.9, p_3=100.0)
    recs = end_plate_checks(_ctx(), det, 200e3, Calc())
    # Table 3.4, M24 10.9: alpha_v 0.5, A_s 353: F_v,Rd = 0.5 x 1000 x 353 / 1.25 = 141.2 kN; 0.8 x = 112.96 kN
    Fv08 = 0.8 * 0.5 * 1000 * 353 / 1.25
    # d_0 = 26; k_1 = min(2.8 x 35/26 - 1.7, 1.4 x 100/26 - 1.7, 2.5) = 2.069
    k1 = min(2.8 * 35 / 26 - 1.7, 1.4 * 100 / 26 - 1.7, 2.5)
    Fb_end = k1 * (40 / 78) * 410 * 24 * 10 / 1.25                 # 83.5 kN
    Fb_in = k1 * (70 / 78 - 0.25) * 410 * 24 * 10 / 1.25           # 105.4 kN
    assert max(Fb_end, Fb_in) <= Fv08
    assert _rec(recs, "ep_bolt_group").resistance == pytest.approx((2 * Fb_end + 4 * Fb_in) / 1e3, rel=REL)


# ------------------------------------------------------------------ full-strength web welds: derivation from Eq. 4.1

def test_full_strength_throat_is_per_fillet_from_eq_4_1_stresses():
    """The required throat of EACH of the two fillets: a = beta_w gamma_M2 f_y t_w / (sqrt2 f_u gamma_M0),
    with no further halving. Check it from the throat stresses of Eq. 4.1 (transverse double fillet)."""
    spec = parse_support(_table(rows=4, gauge="90 mm", weld_leg="8 mm"), 1)
    d = design_end_connection(BEAM, "S355", 250e3, spec)
    a_req = _rec(d.records, "ep_weld_full_strength").demand
    # web 8.5 mm S355 (f_y 355) pulled by N = t_w f_y / gamma_M0 per mm; two fillets share it
    N = 8.5 * 355 / 1.0
    # each throat at 45 deg: sigma_perp = tau_perp = (N/2) / (a sqrt 2)
    sigma = tau = (N / 2) / (a_req * sqrt(2))
    # weaker part: S275 plate, f_u 410, beta_w 0.85 (Table 4.1); Eq. 4.1 exactly at its limit
    assert sqrt(sigma**2 + 3 * tau**2) == pytest.approx(410 / (0.85 * 1.25), rel=REL)
    assert sigma <= 0.9 * 410 / 1.25                                 # second condition of Eq. 4.1
    assert a_req == pytest.approx(0.85 * 1.25 * 355 * 8.5 / (sqrt(2) * 410 * 1.0), rel=REL)   # 6.19 mm, not 3.1


# ------------------------------------------------------------------ fin plate: 2.73 z from the 1.27 gross shear

def test_fin_plate_2_73_z_is_where_bending_equals_gross_shear():
    # W_el f_y / z = h t f_y / (1.27 sqrt 3)  <=>  h = 6 z / (1.27 sqrt 3) = 2.728 z (guidance 1.27, from memory)
    assert 6 / (1.27 * sqrt(3)) == pytest.approx(2.73, abs=0.005)
    spec = parse_support(_table(connection="fin plate", rows=4), 1)
    d = design_end_connection(BEAM, "S355", 250e3, spec)
    bend = _rec(d.records, "fp_plate_bending")
    shear_gross = 310 * 10 * 275 / (1.27 * sqrt(3))              # h_p 310, t_p 10, S275
    assert d.detail.h_p >= 2.73 * d.detail.z and bend.resistance * 1e3 >= shear_gross


# ------------------------------------------------------------------ fin plate tying: single lap, one bolt row

def test_fin_plate_tying_bearing_capped_for_single_lap_one_row():
    """Finding: under the tie force the fin plate / beam web lap has one bolt row across the load, so
    EN 1993-1-8 3.6.1(10) caps F_b,Rd at 1.5 f_u d t / gamma_M2 (gamma_Mu for tying). It was not applied."""
    spec = parse_support(_table(connection="fin plate", rows=4), 1)
    d = design_end_connection(BEAM, "S355", 250e3, spec)
    # plate 10 mm S275: load horizontal, e_1 -> e_2 = 50 (alpha_d 50/66 = 0.758), k_1 = min(2.8 x 50/22 - 1.7,
    # 1.4 x 70/22 - 1.7, 2.5) = 2.5: Table 3.4 gives 2.5 x 0.758 x 410 x 20 x 10 / 1.1 = 141.2 kN
    table_34 = 2.5 * (50 / 66) * 410 * 20 * 10 / 1.1
    cap = 1.5 * 410 * 20 * 10 / 1.1                                 # Eq. 3.2: 111.8 kN
    r = _rec(d.records, "fp_tie_bearing_plate")
    assert cap < table_34 and r.resistance == pytest.approx(cap / 1e3, rel=REL)
    assert "3.6.1(10)" in r.note
    # beam web 8.5 mm S355 (f_u 470): e = 40 (alpha_d 0.606), k_1 = min(1.4 x 70/22 - 1.7, 2.5) = 2.5
    web_34 = 2.5 * (40 / 66) * 470 * 20 * 8.5 / 1.1
    web_cap = 1.5 * 470 * 20 * 8.5 / 1.1
    assert _rec(d.records, "fp_tie_bearing_web").resistance == pytest.approx(min(web_34, web_cap) / 1e3, rel=REL)


# ------------------------------------------------------------------ fin plate: bad layouts fail cleanly

def test_fin_plate_single_row_is_input_error():
    # one bolt cannot carry V z (sum r^2 = 0): was a ZeroDivisionError
    with pytest.raises(InputError, match=r"support\[2\]\.rows.*at least 2"):
        design_end_connection(BEAM, "S355", 100e3, parse_support(_table(connection="fin plate", rows=1), 2))


def test_fin_plate_pitch_below_minimum_fails_instead_of_crashing():
    # p_1 = 30 < 2.2 d_0 = 48.4 mm (Table 3.3): Table 3.4 bearing is 0, the two-direction check must fail
    d = design_end_connection(BEAM, "S355", 100e3,
                              parse_support(_table(connection="fin plate", rows=2, pitch="30 mm"), 1))
    for id in ("fp_bearing_plate", "fp_bearing_web", "fp_spacing_p_1_min"):
        assert not _rec(d.records, id).ok
    assert not d.ok


# ------------------------------------------------------------------ end plate T-stub with m <= 0

def test_tstub_with_bolts_on_the_welds_fails_with_advice():
    # Figure 6.2: m = (p_3 - t_w)/2 - 0.8 a sqrt 2 = (20 - 8.5)/2 - 0.8 x 5.6 x sqrt 2 = -0.59 mm <= 0
    det = Detail("end plate", get_bolt("M20", "8.8"), 4, 70.0, 40.0, 30.0, 10.0, "S275", 8.0, 22.9, p_3=20.0)
    assert (20 - 8.5) / 2 - 0.8 * 5.6 * sqrt(2) < 0
    r = _rec(end_plate_checks(_ctx(), det, 100e3, Calc()), "ep_tie_plate")
    assert not r.ok and "increase the gauge" in r.note


# ------------------------------------------------------------------ welds to historic steel

@pytest.mark.parametrize("era, grade", [("before 1909", "S235"),   # era f_u 370 (from memory) < S275 410
                                        ("1909-1932", "S235"),     # 400 < 410
                                        ("1950-1958", "S275"),     # 430: S275 (410) <= 430 < S355 (470)
                                        ("S355", "S355")])         # modern grade used as stated
def test_weld_grade_of_existing_steel(era, grade):
    from splicecalc.joints.connections.detail import weld_grade_existing
    assert weld_grade_existing(_ctx(era)) == grade


def test_fin_plate_weld_to_old_steel_uses_the_weaker_part():
    """Finding: the fin plate weld to a historic member ignored the member's f_u (EN 1993-1-8 4.5.3.2(6):
    the weaker part governs). Before 1909 (f_u 370 from memory) is taken as S235: f_u 360, beta_w 0.80."""
    spec = parse_support(_table(connection="fin plate", rows=4, existing_steel="before 1909", weld_leg="8 mm"), 1)
    d = design_end_connection(BEAM, "S355", 150e3, spec)
    r = _rec(d.records, "fp_weld_full_strength")
    # a = beta_w gamma_M2 f_y t_p / (sqrt 2 f_u gamma_M0) = 0.80 x 1.25 x 275 x 10 / (sqrt 2 x 360) = 5.40 mm
    assert r.demand == pytest.approx(0.80 * 1.25 * 275 * 10 / (sqrt(2) * 360), rel=REL)
    assert "S235" in r.note and "weldability" in r.note


# ------------------------------------------------------------------ fit in an existing beam web (top flanges level)

def test_plate_below_existing_bottom_root_fillet_fails():
    """Finding: with top flanges level (notched beam on an existing beam web) only h_p <= d of the
    existing web was checked, not where the plate ends. 406x178x60 UKB: h - t_f - r = 406.4 - 12.8 - 10.2."""
    spec = parse_support(_table(rows=5, existing_member="406x178x60 UKB", existing_face="beam web",
                                notch_top="40 mm x 120 mm"), 1)
    d = design_end_connection(BEAM, "S355", 150e3, spec)
    r = _rec(d.records, "ex_fit_web_bottom")
    # plate top 40 + 10 = 50 mm; h_p = 4 x 70 + 2 x 40 = 360 <= d = 360.4 (the old check passed)
    assert _rec(d.records, "ex_fit_depth").ok
    assert r.demand == pytest.approx(50 + 360) and r.resistance == pytest.approx(406.4 - 12.8 - 10.2)
    assert not r.ok and "fewer rows" in r.note


def test_supporting_beam_web_tying_limitation_is_flagged():
    spec = parse_support(_table(rows=4, existing_member="533x210x92 UKB", existing_face="beam web",
                                notch_top="50 mm x 130 mm"), 1)
    d = design_end_connection(BEAM, "S355", 150e3, spec)
    r = _rec(d.records, "ex_tie_web_yield")          # a NOT CHECKED record, not just a warning (issue 11.8)
    assert not r.checked and "beam web" in r.title and "yield lines" in r.title


# ------------------------------------------------------------------ notch shallower than the flange

def test_notch_shallower_than_flange_is_input_error():
    with pytest.raises(InputError, match=r"support\[1\]\.notch_top.*t_f = 12.7"):
        design_end_connection(BEAM, "S355", 100e3, parse_support(_table(notch_top="5 mm x 100 mm"), 1))
    with pytest.raises(InputError, match="notch depth"):
        check_notch(BEAM, 355.0, 100e3, 5.0, 100.0, 110.0)


def test_plate_top_stays_below_root_fillet_for_a_shallow_notch():
    # notch 12.8 mm, just through t_f = 12.7: "10 mm below the notch" gives 22.8 mm, which is still on the
    # root fillet (t_f + r = 12.7 + 10.2 = 22.9 mm); the usable web starts at the larger of the two
    ctx = Context(beam=BEAM, beam_grade="S355", beam_mat=steel("S355", BEAM.tf), existing=COL,
                  face="column flange", existing_mat=existing_steel("S275", COL.tf), na=UK_NA, tie=75e3,
                  notch_depth=12.8, notch_length=100.0)
    assert ctx.web_top == pytest.approx(12.7 + 10.2)


# ------------------------------------------------------------------ tying force and material messages

def test_low_tying_force_is_flagged():
    d = design_end_connection(BEAM, "S355", 150e3, parse_support(_table(rows=4, tying_force="40 kN"), 1))
    assert any("75 kN minimum" in w for w in d.warnings)
    d = design_end_connection(BEAM, "S355", 150e3, parse_support(_table(rows=4), 1))
    assert not any("75 kN minimum" in w for w in d.warnings)


def test_era_after_the_table_says_give_the_grade():
    with pytest.raises(InputError) as e:
        existing_steel("1998", 10.0)
    assert "give its grade" in str(e.value) and "1986-1992" in str(e.value)


def test_years_crossing_two_bands_ask_for_the_earlier_band():
    with pytest.raises(InputError) as e:
        existing_steel("1930-1955", 10.0)
    assert "earliest year" in str(e.value)


# ------------------------------------------------------------------ independent checks where coverage was thin

def test_fin_plate_bolt_forces_against_rigid_plate_compatibility():
    """The elastic bolt-group forces from an independent solve: the plate moves rigidly (translation v,
    rotation theta about the group centroid), bolt force = k x displacement, equilibrium with V and
    M = V z (z = support face to bolt line). numpy solves the 2 x 2 system; no formula is shared."""
    np = pytest.importorskip("numpy")
    spec = parse_support(_table(connection="fin plate", rows=4), 1)
    V = 250e3
    d = design_end_connection(BEAM, "S355", V, spec)
    z, y = d.detail.z, np.array([-105.0, -35.0, 35.0, 105.0])      # 4 rows at 70 mm about the centroid
    # unknowns k v and k theta: sum k v = V (vertical); sum k theta y^2 = V z (moment about the centroid)
    A = np.array([[len(y), 0.0], [0.0, float(np.sum(y**2))]])
    kv, kt = np.linalg.solve(A, np.array([V, V * z]))
    F = np.hypot(kv, kt * y)                                     # vertical kv, horizontal k theta y per bolt
    assert _rec(d.records, "fp_bolt_shear").demand == pytest.approx(F.max() / 1e3, rel=1e-9)


def test_tstub_method_2_reduces_to_method_1_without_washer_spread():
    # EN 1993-1-8 Table 6.2: mode 1 method 2 with e_w = 0 is method 1, F = 4 M_pl,1,Rd / m
    from splicecalc.joints.connections import formulas as F
    M, m, n = 2.0e6, 34.0, 30.0
    assert F.F_T_1_Rd(M_pl_u=M, m=m, n=n, e_w=0.0) == pytest.approx(4 * M / m, rel=1e-12)
    # and mode 2 with no bolt tension is the flange alone: 2 M / (m + n)
    assert F.F_T_2_Rd(M_pl_u=M, n=n, F_t_sum=0.0, m=m) == pytest.approx(2 * M / (m + n), rel=1e-12)
