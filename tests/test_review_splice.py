"""Checking engineer's review of the cover-plate splice: each test would have caught a finding.

Outside references:
* an independent rigid-body (equal bolt stiffness) solution of the web bolt group as the
  minimum-norm set of bolt forces in equilibrium with the loads placed where they act
  (numpy.linalg.lstsq), not the polar formula;
* EN 1993-1-8:2005 Table 3.3 / Table 3.4 hand calculations written beside the values;
* a brute-force search over the layout space stated in splicecalc.design.splice_layout,
  every pair checked in full with check_splice, cheapest first.
"""

from __future__ import annotations

import numpy as np
import pytest

from splicecalc.design import splice_layout as SL
from splicecalc.joints.splice import FlangeLayout, SpliceLayout, WebLayout, check_splice, parse_splices
from splicecalc.joints.splice.design import splice_bolt
from splicecalc.joints.splice.forces import splice_forces, web_bolt_coordinates
from splicecalc.sections import measured_section

# 457x191x67 UKB (BS 4-1 table, from memory): h 453.4, b 189.9, tw 8.5, tf 12.7, r 10.2
UKB457 = measured_section(h=453.4, b=189.9, tw=8.5, tf=12.7, r=10.2, designation="457x191x67 UKB (measured)")
# IPE 300 (EN 10365 table, from memory): h 300, b 150, tw 7.1, tf 10.7, r 15
IPE300 = measured_section(h=300.0, b=150.0, tw=7.1, tf=10.7, r=15.0, designation="IPE 300 (measured)")


def rec(design, id_):
    for r in design.records:
        if r.id == id_:
            return r
    raise KeyError(f"{id_} not in {[r.id for r in design.records]}")


def min_norm_bolt_forces(coords, N, V, e, M_w):
    """Bolt forces (f_x, f_z) of equally stiff bolts under a rigid plate, as the minimum-norm
    solution of the three equilibrium equations (elastic, equal stiffness <=> least squares).

    Loads on the group: N (horizontal) and V (vertical) acting at the joint line, which lies
    at x = -e from the group centroid (x away from the joint), and the web moment M_w turning
    the same way as V e (the side of the joint where the two add)."""
    n = len(coords)
    A = np.zeros((3, 2 * n))
    for i, (x, z) in enumerate(coords):
        A[0, 2 * i] = 1.0                  # sum f_x = N
        A[1, 2 * i + 1] = 1.0              # sum f_z = V
        A[2, 2 * i] = -z                   # sum (x f_z - z f_x) = moment of the loads about the centroid
        A[2, 2 * i + 1] = x
    moment = (-e) * V - abs(M_w)           # V at x = -e; M_w in the same sense
    f, *_ = np.linalg.lstsq(A, np.array([N, V, moment]), rcond=None)
    return f.reshape(n, 2)


# ------------------------------------------------- finding 1: web bolt forces, side of the joint
@pytest.mark.parametrize("rows,cols,p,g,N", [(4, 2, 70.0, 70.0, 0.0), (5, 3, 70.0, 65.0, 80e3), (3, 2, 90.0, 80.0, -50e3)])
def test_web_bolt_forces_match_rigid_body_with_shear_at_the_joint_line(rows, cols, p, g, N):
    f = splice_forces(UKB457, M_Ed=120e6, V_Ed=250e3, N_Ed=N, gap=10.0, web_rows=rows, web_columns=cols,
                      web_pitch=p, web_gauge=g, web_e1=35.0)
    coords = web_bolt_coordinates(rows, cols, p, g)
    ref = min_norm_bolt_forces(coords, f.N_w_Ed, 250e3, f.e_w, f.M_w_Ed)
    for (x, z, fx, fz, fr), (rx, rz) in zip(f.bolt_forces, ref):
        assert fx == pytest.approx(rx, rel=1e-9, abs=1e-6)
        assert fz == pytest.approx(rz, rel=1e-9, abs=1e-6)
    # the column nearest the joint (x < 0, the beam-end column of the beam web) takes the largest vertical force
    near = max(abs(b[3]) for b in f.bolt_forces if b[0] < 0)
    far = max(abs(b[3]) for b in f.bolt_forces if b[0] > 0)
    assert near > far


def test_beam_web_bearing_checks_the_beam_end_column_with_its_real_forces():
    # 457 UKB S355 (t_w 8.5, f_u 470), M20 8.8 (d0 22), web 4 rows x 2 columns, p = g = 70, e1 = 35 (default)
    web = WebLayout(rows=4, columns=2, pitch=70.0, gauge=70.0, plate=10.0)
    fl = FlangeLayout(rows=3, columns=2, pitch=70.0, gauge=100.0, plate=15.0)
    d = check_splice(UKB457, "S355", 100e6, 250e3, 0.0, spec=parse_splices({"bolts": "M20 8.8"}),
                     layout=SpliceLayout("M20", "8.8", fl, web))
    f = d.forces
    ref = min_norm_bolt_forces(web_bolt_coordinates(4, 2, 70.0, 70.0), 0.0, 250e3, f.e_w, f.M_w_Ed)
    e_fl = (453.4 - 2 * 12.7 - 3 * 70) / 2                      # top bolt to the flange face, 109 mm
    # EN 1993-1-8 Table 3.4, hand calculation, beam web 8.5 mm, f_u 470, f_ub 800:
    # beam-end column, horizontal: end bolt alpha_d = 35/66, k1 = min(2.8 e_fl/22 - 1.7, 1.4*70/22 - 1.7, 2.5) = 2.5
    Fbx_end = 2.5 * min(35 / 66, 800 / 470, 1.0) * 470 * 20 * 8.5 / 1.25
    # far column, horizontal: inner bolt alpha_d = 70/66 - 1/4
    Fbx_in = 2.5 * min(70 / 66 - 0.25, 800 / 470, 1.0) * 470 * 20 * 8.5 / 1.25
    # vertical, top row: towards the flange alpha_d = e_fl/66 > 1 -> 1, but towards the row below (the
    # force may point either way: |M|, |V| of either sign) alpha_d = 70/66 - 1/4 governs (checker A4);
    # k1 = min(2.8*35/22 - 1.7, 1.4*70/22 - 1.7, 2.5) = 2.5
    Fbz = 2.5 * min(70 / 66 - 0.25, 1.0) * 470 * 20 * 8.5 / 1.25
    assert min(2.8 * 35 / 22 - 1.7, 1.4 * 70 / 22 - 1.7) > 2.5 and e_fl / 66 > 1
    U = []
    for k, (fx, fz) in enumerate(ref):
        i, j = divmod(k, 2)
        if i in (0, 3):                                         # top and bottom rows govern
            U.append(((fx / (Fbx_end if j == 0 else Fbx_in)) ** 2 + (fz / Fbz) ** 2) ** 0.5)  # linear convention
    assert rec(d, "web_bearing_beam").utilisation == pytest.approx(max(U), rel=1e-9)
    # linear convention, M_w at the outermost web column, alpha_d from the bolt ahead in each direction
    # (was 0.970 with alpha_d = 1 vertically, 0.743 as a sum of squares at the joint line)
    assert max(U) == pytest.approx(1.004, abs=2e-3)


# ------------------------------------------------- finding 2: web spacing (Table 3.3)
def test_web_spacing_uses_the_web_plates_and_both_load_directions():
    fl = FlangeLayout(rows=3, columns=2, pitch=70.0, gauge=100.0, plate=15.0)
    spec = parse_splices({"bolts": "M20 8.8"})
    # p = 125 mm: 14 t_w = 119 mm but 14 t_wp = 210 mm; t is the thinner OUTER ply (Table 3.3 note 3) = web plate
    d = check_splice(UKB457, "S355", 50e6, 50e3, 0.0, spec=spec,
                     layout=SpliceLayout("M20", "8.8", fl, WebLayout(rows=3, columns=1, pitch=125.0, gauge=0.0,
                                                                     plate=15.0)))
    r = rec(d, "web_spacing_z_p_1_max")
    assert r.ok and r.resistance == pytest.approx(min(14 * 15.0, 200.0))      # Table 3.3, compression
    # vertical pitch 50 mm: >= 2.2 d0 = 48.4 but < 2.4 d0 = 52.8, the minimum across a horizontal load
    d2 = check_splice(UKB457, "S355", 50e6, 50e3, 0.0, spec=spec,
                      layout=SpliceLayout("M20", "8.8", fl, WebLayout(rows=3, columns=1, pitch=50.0, gauge=0.0,
                                                                      plate=10.0)))
    r2 = rec(d2, "web_spacing_x_p_2_min")
    assert not r2.ok and r2.demand == pytest.approx(2.4 * 22)                 # Table 3.3, p2 >= 2.4 d0


# ------------------------------------------------- finding 3/4: the search returns the cheapest passing layout
def brute_force(section, grade, M, V, spec, bolt, **kw):
    """Cheapest pair of the stated candidate space passing check_splice (every check), by enumeration."""
    s, c = bolt.split()
    b = splice_bolt(s, c, spec)
    pairs = sorted(((cf + cw, f, w) for cf, f in SL._flange_candidates(section, b, spec)
                    for cw, w in SL._web_candidates(section, b, spec)), key=lambda t: t[0])
    for cost, f, w in pairs:
        d = check_splice(section, grade, M, V, 0.0, spec=spec, layout=SpliceLayout(s, c, f, w), stop_on_fail=True, **kw)
        if d.ok:
            assert check_splice(section, grade, M, V, 0.0, spec=spec, layout=SpliceLayout(s, c, f, w), **kw).ok
            return cost
    return None


@pytest.mark.parametrize("section,grade,M,V,bolt,extra,ser,web_t", [
    (IPE300, "S275", 60e6, 150e3, "M16 8.8", {}, {}, (8.0, 10.0)),
    (UKB457, "S355", 150e6, 300e3, "M20 8.8", {}, {}, (8.0,)),
    # web net shear of the beam (member check) rules out the cheapest web groups: formerly no layout was found
    (UKB457, "S355", 50e6, 600e3, "M16 8.8", {}, {}, (8.0, 10.0)),   # flange plates: 8 mm only (see below)
    # category B with serviceability forces: the search must use them as the final check does
    (UKB457, "S355", 150e6, 300e3, "M20 8.8", {"category": "B"}, {"M_Ed_ser": 100e6, "V_Ed_ser": 200e3}, (8.0,)),
])
def test_search_returns_the_cheapest_passing_layout(monkeypatch, section, grade, M, V, bolt, extra, ser, web_t):
    # a smaller space, enumerated in full below (one flange plate size when the shear case is slow)
    monkeypatch.setattr(SL, "FLANGE_T", (8.0,) if V > 500e3 else (8.0, 10.0))
    monkeypatch.setattr(SL, "WEB_T", web_t)
    spec = parse_splices({"bolts": bolt, **extra})
    found = SL.search_layouts(section, grade, M, V, 0.0, spec, **ser)
    expected = brute_force(section, grade, M, V, spec, bolt, **ser)
    assert expected is not None
    assert found and found[0].ok
    assert found[0].cost == pytest.approx(expected, rel=1e-12)


def test_category_b_search_with_sls_forces_is_not_dearer_than_with_uls():
    spec = parse_splices({"bolts": "M20 8.8", "category": "B"})
    uls = SL.design_splice(UKB457, "S355", 150e6, 300e3, spec=spec)
    sls = SL.design_splice(UKB457, "S355", 150e6, 300e3, spec=spec, M_Ed_ser=100e6, V_Ed_ser=200e3)
    assert uls.ok and sls.ok
    assert sls.cost < uls.cost            # slip at SLS forces (gamma_M3,ser) allows fewer bolts here


# ------------------------------------------------- finding 5: oversize holes in compression plates
def test_oversize_holes_are_deducted_in_compression():
    # EN 1993-1-1 6.2.4: holes may be ignored in compression only when filled by fasteners, not oversize holes
    # (from memory of the clause wording). 457 UKB S355, M20 oversize d0 = 24 (EN 1090-2, d + 4), outer plate
    # 185 x 15 S355 (fy 355): p_free = gap + 2 e1 = 10 + 2*40 = 90 mm; 90/15 = 6 < 9 eps = 7.3: no buckling
    fl = FlangeLayout(rows=2, columns=2, pitch=80.0, gauge=100.0, plate=15.0)
    web = WebLayout(rows=3, columns=1, pitch=80.0, gauge=0.0, plate=10.0)
    d = check_splice(UKB457, "S355", 100e6, 50e3, 0.0, spec=parse_splices({"bolts": "M20 8.8", "holes": "oversize"}),
                     layout=SpliceLayout("M20", "8.8", fl, web))
    assert d.geometry.e1_f == 40.0 and (10 + 2 * 40) / 15 < 9 * (235 / 355) ** 0.5
    assert rec(d, "outer_plate_compression").resistance == pytest.approx((185 - 2 * 24) * 15 * 355 / 1e3)
    dn = check_splice(UKB457, "S355", 100e6, 50e3, 0.0, spec=parse_splices({"bolts": "M20 8.8"}),
                      layout=SpliceLayout("M20", "8.8", fl, web))
    assert rec(dn, "outer_plate_compression").resistance == pytest.approx(185 * 15 * 355 / 1e3)   # gross, filled holes


def test_plate_compression_net_area_argument():
    from splicecalc.core import InputError
    from splicecalc.joints.plates import check_plate_compression
    # 200 x 12 S275, p1 = 60 (60/12 = 5 < 9 eps = 8.3): resistance = A fy / gamma_M0 on the area given
    assert check_plate_compression(0.0, 200.0, 12.0, 60.0, "S275", A_net=1872.0).resistance == pytest.approx(
        1872.0 * 275 / 1e3)
    with pytest.raises(InputError):
        check_plate_compression(0.0, 200.0, 12.0, 60.0, "S275", A_net=2500.0)      # more than the gross area


# ------------------------------------------------- finding 6: edge outstand in compression (Table 3.3 note 2)
def test_outer_plate_edge_outstand_limit():
    # IPE 300: outer plate 150 x 8 S355 with gauge 70 -> e2 = 40; c/t = 5 <= 14 eps = 11.39 (Table 5.2, Class 3)
    fl = FlangeLayout(rows=2, columns=2, pitch=60.0, gauge=70.0, plate=8.0)
    web = WebLayout(rows=2, columns=1, pitch=70.0, gauge=0.0, plate=8.0)
    d = check_splice(IPE300, "S355", 30e6, 30e3, 0.0, spec=parse_splices({"bolts": "M16 8.8"}),
                     layout=SpliceLayout("M16", "8.8", fl, web))
    r = rec(d, "outer_plate_outstand")
    assert r.demand == pytest.approx(40 / 8) and r.resistance == pytest.approx(14 * (235 / 355) ** 0.5) and r.ok
    # a 200 mm wide, 6 mm outer plate: e2 = 65, c/t = 10.8 <= 11.39 passes; 5 mm: 13 > 11.39 fails
    for t, ok in ((6.0, True), (5.0, False)):
        fl2 = FlangeLayout(rows=2, columns=2, pitch=60.0, gauge=70.0, plate=t, plate_width=200.0)
        d2 = check_splice(IPE300, "S355", 1e6, 1e3, 0.0, spec=parse_splices({"bolts": "M16 8.8"}),
                          layout=SpliceLayout("M16", "8.8", fl2, web))
        assert rec(d2, "outer_plate_outstand").ok is ok


# ------------------------------------------------- finding 7: splice forces from the envelopes
def test_splice_forces_take_the_shear_envelope():
    from splicecalc.actions.loads import UDL
    from splicecalc.analysis import SimpleBeam
    from splicecalc.design.splice_positions import envelope
    L = 8000.0
    full = SimpleBeam(L, [UDL("g", "permanent", 40.0)])                                # hand: M = 20 x (8000 - x)
    part = SimpleBeam(L, [UDL("q", "permanent", 45.0, x_start=2000.0, x_end=8000.0)])   # imposed on the far part
    M_abs, V_abs, at = envelope([full, part], ["full", "partial"])
    x = 2100.0
    # hand: full 40 N/mm: M = 20*2100*5900 = 247.8 kNm, V = 40*1900 = 76 kN;
    # partial 45 N/mm on 2..8 m: R_A = 45*6000*3000/8000 = 101.25 kN, V = 101.25 - 4.5 = 96.75 kN, M = 212.4 kNm
    assert abs(float(full.M(x))) > abs(float(part.M(x)))
    assert abs(float(part.V(x, "left"))) > abs(float(full.V(x, "left")))
    M, V, N, name = at(x)
    assert M == pytest.approx(20 * 2100 * 5900)
    assert V == pytest.approx(float(V_abs(np.array([x]))[0]))                           # envelope of |V|
    assert V == pytest.approx(96750.0)
    assert "partial" in name and "full" in name


# ------------------------------------------------- positions: the DP is a true minimax
def test_positions_minimax_against_exhaustive_pairs():
    from splicecalc.design.splice_positions import choose_splice_positions
    L, w = 9000.0, 30.0
    M_abs = lambda x: w * np.asarray(x, float) * (L - np.asarray(x, float)) / 2     # noqa: E731  hand: UDL
    V_abs = lambda x: np.abs(w * (L / 2 - np.asarray(x, float)))                     # noqa: E731
    avoid = [2700.0, 6100.0]
    spec = parse_splices({"max_piece_mass": "260 kg", "clearance": "400 mm"})
    kw = dict(M_abs=M_abs, V_abs=V_abs, M_c_Rd=500e6, V_c_Rd=800e3, mass_per_m=67.0)
    r = choose_splice_positions(L, spec, avoid=avoid, splice_mass_kg=25.0, **kw)
    assert len(r.positions) == 2 and all(rc.ok for rc in r.records)

    def dem(x):
        return M_abs(x) / 500e6 + V_abs(x) / 800e3
    # exhaustive: every pair on the 25 mm grid plus the clearance boundaries, same rules (stated in the module):
    # clearance 400 mm from 0, L and the avoid points; pieces >= 600 mm; piece mass 0.067 L + 25 kg per splice end
    pts = [0.0, L, *avoid]
    xs = np.unique(np.concatenate([np.arange(0.0, L + 1, 25.0), [p + s * 400.0 for p in pts for s in (-1, 1)]]))
    xs = xs[(xs > 0) & (xs < L) & (np.min(np.abs(xs[:, None] - np.array(pts)[None, :]), axis=1) >= 400 - 1e-6)]
    a, b = np.meshgrid(xs, xs, indexing="ij")
    m1, m2, m3 = 0.067 * a + 25.0, 0.067 * (b - a) + 50.0, 0.067 * (L - b) + 25.0
    ok = (b - a >= 600) & (a >= 600) & (L - b >= 600) & (m1 <= 260 + 1e-9) & (m2 <= 260 + 1e-9) & (m3 <= 260 + 1e-9)
    worst = np.where(ok, np.maximum(dem(a), dem(b)), np.inf)
    assert np.isfinite(worst).any()
    assert r.worst_demand == pytest.approx(float(worst.min()), rel=1e-9)


# ------------------------------------------------- finding 8: outer + inner plates, force per shear plane
def test_outer_and_inner_plates_check_the_more_loaded_shear_plane():
    # share by area (stated method): outer 185 x 15 = 2775 mm2, inner 2 x 75 x 10 = 1500 mm2 -> outer plane
    # passes 2775/4275 = 0.649 of each bolt force, more than the half assumed by "double shear"
    fl = FlangeLayout(rows=3, columns=2, pitch=70.0, gauge=100.0, plate=15.0, inner_plate=10.0)
    d = check_splice(UKB457, "S355", 250e6, 100e3, 0.0,
                     spec=parse_splices({"bolts": "M20 8.8", "flange_plates": "outer+inner", "category": "C"}),
                     layout=SpliceLayout("M20", "8.8", fl, WebLayout(rows=4, columns=1, pitch=70.0, gauge=0.0,
                                                                     plate=10.0)))
    share = 2775 / (2775 + 1500)
    assert d.geometry.share_o == pytest.approx(share)
    F_b = d.forces.F_f_Ed / 6                                   # 3 rows x 2 lines per side
    F_v1 = 0.6 * 800 * 245 / 1.25                               # Table 3.4, one plane through the threads
    r = rec(d, "flange_bolt_shear")
    assert r.utilisation == pytest.approx(share * F_b / F_v1, rel=1e-9)
    # 3.7(1): the group can never exceed n x (one bolt's resistance to its whole force) = 6 F_v1 / share
    assert rec(d, "flange_bolt_group").resistance <= 6 * F_v1 / share / 1e3 + 1e-9
    # slip, category C: mu = 0.5 (class A), k_s = 1, one friction surface per plate (Eq. 3.6, 3.7)
    s = rec(d, "flange_bolt_slip")
    assert s.utilisation == pytest.approx(share * F_b / (0.5 * 0.7 * 800 * 245 / 1.25), rel=1e-9)


# ------------------------------------------------- finding 9: web plates carry the web's axial share too
def test_web_plates_bending_with_axial_force_hand_calculation():
    fl = FlangeLayout(rows=3, columns=2, pitch=70.0, gauge=100.0, plate=15.0)
    web = WebLayout(rows=4, columns=1, pitch=70.0, gauge=0.0, plate=10.0)
    N = 300e3                                                    # tension
    d = check_splice(UKB457, "S355", 100e6, 150e3, N, spec=parse_splices({"bolts": "M20 8.8"}),
                     layout=SpliceLayout("M20", "8.8", fl, web))
    f = d.forces
    # hand calculation (stated method): N_w = N - 2 N b t_f / A; per plate N_w/2
    N_w = N - 2 * N * 189.9 * 12.7 / UKB457.A
    assert f.N_w_Ed == pytest.approx(N_w)
    h_p, t_p = 3 * 70 + 2 * 35, 10.0                             # web plate 280 x 10 S355 (fy 355, fu 470)
    N_Rd = min(h_p * t_p * 355, 0.9 * (h_p - 4 * 22) * t_p * 470 / 1.1)   # EN 1993-1-1 6.2.3 (gamma_M2 = 1.1 UK NA)
    bend = rec(d, "web_plate_bending")
    U = (N_w / 2) / N_Rd + bend.utilisation                      # EN 1993-1-1 6.2.1(7), Eq. 6.2
    assert rec(d, "web_plate_bending_axial").utilisation == pytest.approx(U, rel=1e-9)
    d0 = check_splice(UKB457, "S355", 100e6, 150e3, 0.0, spec=parse_splices({"bolts": "M20 8.8"}),
                      layout=SpliceLayout("M20", "8.8", fl, web))
    assert "web_plate_bending_axial" not in {r.id for r in d0.records}


# ------------------------------------------------- finding 10: four bolt lines need their outer gauge
def test_four_columns_without_outer_gauge_is_refused_not_checked_as_two():
    from splicecalc.core import InputError
    web = WebLayout(rows=3, columns=1, pitch=70.0, gauge=0.0, plate=10.0)
    fl = FlangeLayout(rows=2, columns=4, pitch=70.0, gauge=100.0, plate=15.0)      # gauge_outer left at 0
    with pytest.raises(InputError, match="gauge_outer"):
        check_splice(UKB457, "S355", 100e6, 50e3, 0.0, spec=parse_splices({"bolts": "M20 8.8"}),
                     layout=SpliceLayout("M20", "8.8", fl, web))
    with pytest.raises(InputError, match="gauge_outer"):
        parse_splices({"bolts": "M20 8.8", "layout": {
            "flange": {"rows": 2, "columns": 4, "pitch": "70 mm", "gauge": "100 mm", "plate": "15 mm"},
            "web": {"rows": 3, "columns": 1, "pitch": "70 mm", "plate": "10 mm"}}})


# ------------------------------------------------- published values through the checks (from memory, flagged)
@pytest.mark.parametrize("what,size,cls,expected_kN", [
    ("shear", "M16", "10.9", 62.8),    # published bolt table, single shear through threads, gamma_M2 1.25 (from memory)
    ("shear", "M24", "10.9", 141.0),   # same table, 0.5*1000*353/1.25 = 141.2 (from memory, 3 s.f.)
    ("tension", "M30", "10.9", 404.0),  # same table, tension 0.9*1000*561/1.25 = 403.9 (from memory)
    ("tension", "M12", "8.8", 48.6),   # same table, 0.9*800*84.3/1.25 = 48.6 (from memory)
    ("slip", "M24", "10.9", 79.1),     # preload 247 kN (from memory); class B mu 0.4, gamma_M3 1.25, one surface
])
def test_published_bolt_values_through_the_checks(what, size, cls, expected_kN):
    from splicecalc.joints.bolts import check_bolt_shear, check_bolt_tension, check_slip, get_bolt
    b = get_bolt(size, cls)
    if what == "shear":
        r = check_bolt_shear(b, 0.0)
    elif what == "tension":
        r = check_bolt_tension(b, 0.0)
    else:
        r = check_slip(b, 0.0, category="C", surface_class="B")
    assert r.resistance == pytest.approx(expected_kN, rel=2e-3)


@pytest.mark.parametrize("theta", [0.0, 30.0, 45.0, 60.0, 90.0])
def test_fillet_directional_resistance_meets_eq_4_1_exactly(theta):
    # independent: resolve a force F (per mm) at theta to the weld axis onto the 45 degree throat of an equal-leg
    # fillet (EN 1993-1-8 4.5.3.2 Figure 4.5) and evaluate Eq. 4.1 with numpy; at F = F_w,Rd it is just met
    from splicecalc.joints.welds import F_w_Rd_dir
    a, fu, bw, g = 4.2, 410.0, 0.85, 1.25
    F = F_w_Rd_dir(a=a, f_u=fu, beta_w=bw, gamma_M2=g, theta=theta)
    th = np.radians(theta)
    F_perp, F_par = F * np.sin(th), F * np.cos(th)
    n = np.array([np.cos(np.pi / 4), np.sin(np.pi / 4)])          # throat normal in the section plane
    tvec = np.array([-np.sin(np.pi / 4), np.cos(np.pi / 4)])      # in-plane direction across the throat
    f_vec = np.array([F_perp, 0.0])                               # transverse force, along one leg
    sigma, tau_perp, tau_par = f_vec @ n / a, f_vec @ tvec / a, F_par / a
    lhs = np.sqrt(sigma ** 2 + 3 * (tau_perp ** 2 + tau_par ** 2))
    assert lhs == pytest.approx(fu / (bw * g), rel=1e-12)          # first condition of Eq. 4.1, just met
    assert abs(sigma) <= 0.9 * fu / g                             # second condition holds (beta_w >= 0.56)


def test_clearance_is_at_least_half_the_cover_plate():
    """A cover plate must not reach over a point load or restraint: the clearance used by the
    position choice is max(job clearance, half the longest plate). Geometry, hand check."""
    from splicecalc.design.splice_positions import choose_splice_positions
    from splicecalc.joints.splice.spec import parse_splices

    spec = parse_splices({"positions": ["3.0 m"], "clearance": "100 mm"})
    flat = lambda x: 0.0 * x + 1.0  # noqa: E731 - uniform demand
    common = dict(M_abs=flat, V_abs=flat, M_c_Rd=10.0, V_c_Rd=10.0, mass_per_m=50.0, avoid=[3200.0])
    ok = choose_splice_positions(8000.0, spec, **common)
    assert all(r.ok for r in ok.records if r.id.endswith("_clearance"))      # 200 mm >= 100 mm
    long_plate = choose_splice_positions(8000.0, spec, plate_half_length_mm=250.0, **common)
    rec = next(r for r in long_plate.records if r.id.endswith("_clearance"))
    assert not rec.ok and rec.demand == 250.0 and rec.resistance == 200.0     # plate would reach the load
