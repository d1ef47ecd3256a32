"""Automatic layout of a bolted cover-plate beam splice (plain-float search) and :func:`design_splice`.

Search space (per bolt size and class; ``spec.bolts`` fixes one):

* flange: 2 or 4 bolt lines; 2-10 rows each side (at least two rows: detailing choice); pitch p1 in {2.2 d0, 3 d0,
  3.75 d0} rounded up to 5 mm (3.75 d0 gives alpha_d = 1 for inner bolts);
  gauge from the least clear of the root radius (t_w + 2 r + washer OD) to the
  widest that keeps e2 = 1.5 d0 in the flange (3 values); outer plate as wide
  as the flange; thickness 8-40 mm; inner plates (``outer+inner``) of the
  outer plate's thickness or one size either side;
* web: 1-3 columns, 2 rows up to what fits between the fillets, pitch as for
  the flange, gauge 3 d0, plates 6-20 mm.

The flange and web groups are independent for a given bolt (the flange force
does not depend on the web layout), so each is searched on its own in order
of cost, with cheap bounds first (bolt shear of the group, gross plate yield,
bearing with k1 alpha_b = 2.5); full checks run only on candidates that pass
the bounds, and stop at the first failing group. The cheapest flange and web
per bolt are then combined and the whole splice checked (beam net section,
web net shear). Cost (stated): ``per_bolt x n_bolts + per_kg x plate mass``
(defaults 1.0 and 0.5 / kg, ``[splices.cost]``). Two alternatives are kept:
the next cheapest with a different bolt, or else a different group layout.
"""

from __future__ import annotations

import math
from dataclasses import replace

from ..core.errors import InputError
from ..materials.partial_factors import UK_NA, NationalAnnex
from ..materials.steel import steel
from ..joints import bolts as B
from ..joints import plates as P
from ..joints.bolts import PRELOAD_CLASSES
from ..joints.splice.checks import (TAG_FIT, TAG_FLANGE, TAG_WEB, detailing_records, flange_records, member_records,
                                    web_records)
from ..joints.splice.design import (SpliceDesign, check_splice, moment_resistance, serviceability_forces, splice_bolt,
                                    validate_inputs)
from ..joints.splice.forces import flange_force, flange_reach, splice_forces
from ..joints.splice.geometry import default_edge, geometry, round_down, round_up
from ..joints.splice.spec import FlangeLayout, SpliceLayout, SpliceSpec, WebLayout
from ..core.record import Calc, find

#: bolts tried with ``bolts = "auto"`` (size, class)
AUTO_BOLTS: tuple[tuple[str, str], ...] = tuple((s, c) for s in ("M16", "M20", "M24", "M30") for c in ("8.8", "10.9"))
FLANGE_T: tuple[float, ...] = (8.0, 10.0, 12.0, 15.0, 20.0, 25.0, 30.0, 35.0, 40.0)
WEB_T: tuple[float, ...] = (8.0, 10.0, 12.0, 15.0, 20.0)
DENSITY = 7850e-9  # kg/mm3


def _pitches(d0: float, k_min: float = 2.2) -> list[float]:
    return sorted({round_up(k_min * d0), round_up(3.0 * d0), round_up(3.75 * d0)})


def _flange_candidates(section, bolt, spec: SpliceSpec):
    """(cost, FlangeLayout) of every geometrically sensible flange layout."""
    d0 = bolt.d_0
    e2p = default_edge(d0)
    g_min = round_up(max(section.tw + 2 * section.r + bolt.washer_od, 2.4 * d0))
    out = []
    inner = spec.flange_plates == "outer+inner"
    x_pi = section.tw / 2 + section.r + 5.0
    b_pi = round_down(section.b / 2 - x_pi) if inner else 0.0
    for cols in (2, 4):
        p2o = round_up(3.0 * d0) if cols == 4 else 0.0
        g_max = round_down(section.b - 2 * e2p - 2 * p2o)
        if g_max < g_min:
            continue
        gauges = sorted({g_min, round_up((g_min + g_max) / 2), g_max}) if cols == 2 else [g_min]
        for g in gauges:
            if inner and (g / 2 - x_pi < 1.2 * d0 or x_pi + b_pi - g / 2 - p2o < 1.2 * d0):
                continue
            for p1 in _pitches(d0):
                for rows in range(2, 11):
                    e1 = default_edge(d0)
                    L = spec.gap + 2 * (2 * e1 + (rows - 1) * p1)
                    n_b = 4 * rows * cols
                    for k, t in enumerate(FLANGE_T):
                        # inner plates: the same thickness as the outer plate or one size either side
                        for ti in (FLANGE_T[max(0, k - 1):k + 2] if inner else (0.0,)):
                            mass = 2 * (round_down(section.b) * t + 2 * b_pi * ti) * L * DENSITY
                            out.append((spec.cost_per_bolt * n_b + spec.cost_per_kg * mass,
                                        FlangeLayout(rows=rows, columns=cols, pitch=p1, gauge=g, plate=t,
                                                     inner_plate=ti, gauge_outer=p2o)))
    out.sort(key=lambda c: c[0])
    return out


def _web_candidates(section, bolt, spec: SpliceSpec):
    d0 = bolt.d_0
    e = default_edge(d0)
    d = section.h - 2 * section.tf - 2 * section.r
    out = []
    for cols in (1, 2, 3):
        gw = round_up(3.0 * d0) if cols > 1 else 0.0
        for p in _pitches(d0, 2.4):
            rmax = int(math.floor((d - 2 * e) / p + 1e-9)) + 1
            for rows in range(2, rmax + 1):
                h = (rows - 1) * p + 2 * e
                L = spec.gap + 2 * (2 * e + (cols - 1) * gw)
                for t in WEB_T:
                    mass = 2 * h * t * L * DENSITY
                    out.append((spec.cost_per_bolt * 2 * rows * cols + spec.cost_per_kg * mass,
                                WebLayout(rows=rows, columns=cols, pitch=p, gauge=gw, plate=t)))
    out.sort(key=lambda c: c[0])
    return out


def _flange_bound(bolt, f: FlangeLayout, F_f: float, spec, pg: str, na, section, grade: str) -> bool:
    """Cheap necessary conditions: group shear, bearing upper bound, gross plate yield."""
    n = f.rows * f.columns
    n_s = 2 if f.inner_plate > 0 else 1
    a_v = B.shear_factor_alpha_v(bolt.bolt_class, spec.threads_in_shear_plane)
    Fv = B.F_v_Rd(alpha_v=a_v, f_ub=bolt.f_ub, A_s=bolt.A_s if spec.threads_in_shear_plane else bolt.A,
                  gamma_M2=na.gamma_M2)
    if n * n_s * Fv < F_f:
        return False
    fy = steel(pg, f.plate).f_y
    A_o = round_down(section.b) * f.plate
    A_i = 0.0
    if f.inner_plate > 0:
        x_pi = section.tw / 2 + section.r + 5.0
        A_i = 2 * round_down(section.b / 2 - x_pi) * f.inner_plate
        fy = min(fy, steel(pg, f.inner_plate).f_y)
    if P.N_pl_Rd(A=A_o + A_i, f_y=fy, gamma_M0=na.gamma_M0) < F_f:
        return False
    # bearing upper bound per ply: k1 = 2.5, alpha_b by row (1 end row, the others inner), Table 3.4
    d0 = bolt.d_0
    e1 = default_edge(d0)
    a_end = B.alpha_d_end(e_1=e1, d_0=d0)
    a_in = B.alpha_d_inner(p_1=f.pitch, d_0=d0) if f.rows > 1 else 0.0
    fu_o = steel(pg, f.plate).f_u
    fu_b = steel(grade, section.tf).f_u

    def ply_bound(t, fu):
        ab_e = min(a_end, bolt.f_ub / fu, 1.0)
        ab_i = min(a_in, bolt.f_ub / fu, 1.0)
        per_col = (ab_e + (f.rows - 1) * ab_i) * 2.5 * fu * bolt.d * t / na.gamma_M2
        return f.columns * per_col

    # the beam's own tension flange, net of this layout's holes (a member check of the splice, EN 1993-1-1 6.2.3)
    fb = steel(grade, section.tf)
    A_fn = P.A_net_plate(b=section.b, t=section.tf, n=f.columns, d_0=bolt.d_0)
    if A_fn <= 0 or min(section.b * section.tf * fb.f_y / na.gamma_M0,
                        0.9 * A_fn * fb.f_u / na.gamma_M2_member) < F_f:
        return False
    share_o = A_o / (A_o + A_i)
    if ply_bound(f.plate, fu_o) < F_f * share_o or ply_bound(section.tf, fu_b) < F_f:
        return False
    if P.N_u_Rd(A_net=P.A_net_plate(b=round_down(section.b), t=f.plate, n=f.columns, d_0=d0), f_u=fu_o, gamma_M2=na.gamma_M2_member) < F_f * share_o:
        return False
    return True


def _web_bound(bolt, w: WebLayout, section, forces_fn, spec, na, pg: str, grade: str) -> tuple[bool, object]:
    """Cheap necessary conditions: bolt shear, bearing upper bounds (plates, beam web), plate bending."""
    fo = forces_fn(w)
    Fr = fo.F_web_max
    a_v = B.shear_factor_alpha_v(bolt.bolt_class, spec.threads_in_shear_plane)
    Fv = B.F_v_Rd(alpha_v=a_v, f_ub=bolt.f_ub, A_s=bolt.A_s if spec.threads_in_shear_plane else bolt.A,
                  gamma_M2=na.gamma_M2)
    if not (Fr <= 2 * Fv):
        return False, fo
    mp = steel(pg, w.plate)
    fb = B.F_b_Rd(k_1=2.5, alpha_b=min(1.0, bolt.f_ub / mp.f_u), f_u=mp.f_u, d=bolt.d, t=2 * w.plate,
                  gamma_M2=na.gamma_M2)
    if Fr > fb:
        return False, fo
    fu_w = steel(grade, section.tw).f_u
    fbw = B.F_b_Rd(k_1=2.5, alpha_b=min(1.0, bolt.f_ub / fu_w), f_u=fu_w, d=bolt.d, t=section.tw,
                   gamma_M2=na.gamma_M2)
    if Fr > fbw:
        return False, fo
    # the end columns bear along the beam towards a free end (the beam end, the plate end): there
    # alpha_d = e1/(3 d0) caps F_b,x,Rd (Table 3.4, k1 <= 2.5), and U >= |F_x| / F_b,x,Rd
    a_end = B.alpha_d_end(e_1=default_edge(bolt.d_0), d_0=bolt.d_0)
    xs = [b[0] for b in fo.bolt_forces]
    Fx_beam = max(abs(b[2]) for b in fo.bolt_forces if b[0] == min(xs))
    Fx_plate = max(abs(b[2]) for b in fo.bolt_forces if b[0] == max(xs))
    if Fx_beam > B.F_b_Rd(k_1=2.5, alpha_b=min(a_end, bolt.f_ub / fu_w, 1.0), f_u=fu_w, d=bolt.d, t=section.tw,
                          gamma_M2=na.gamma_M2):
        return False, fo
    if Fx_plate > B.F_b_Rd(k_1=2.5, alpha_b=min(a_end, bolt.f_ub / mp.f_u, 1.0), f_u=mp.f_u, d=bolt.d,
                           t=2 * w.plate, gamma_M2=na.gamma_M2):
        return False, fo
    h = (w.rows - 1) * w.pitch + 2 * default_edge(bolt.d_0)
    M_pl = abs(fo.M_w_Ed) + abs(fo.V_Ed) * (spec.gap / 2 + default_edge(bolt.d_0))
    if M_pl / 2 > P.M_c_Rd(W_y=P.W_el_plate(t=w.plate, h=h), f_y=mp.f_y, gamma_M0=na.gamma_M0):
        return False, fo
    return True, fo


def _first_passing(cands, test, k: int = 2, limit: int = 400):
    """The first k candidates (in cost order) passing ``test``; at most ``limit`` full tests."""
    found = []
    n_full = 0
    for cost, lay in cands:
        r = test(lay)
        if r is None:
            continue               # failed a cheap bound
        n_full += 1
        if r:
            found.append((cost, lay))
            if len(found) >= k:
                break
        if n_full >= limit:
            break
    return found


#: results of recent searches, keyed by all their (immutable) inputs: the calc path runs the same
#: search on floats and again for the rendered pass; results are plain-float designs, not rendered
_SEARCHES: dict = {}
_SEARCHES_MAX = 64


def search_layouts(section, grade: str, M_Ed: float, V_Ed: float, N_Ed: float, spec: SpliceSpec,
                   na: NationalAnnex = UK_NA, M_c_Rd: float | None = None, n_keep: int = 3, *,
                   M_Ed_ser: float | None = None, V_Ed_ser: float | None = None):
    """Cheapest passing layouts (see :func:`_search_layouts`), remembered for identical inputs."""
    key = (section, grade, M_Ed, V_Ed, N_Ed, spec, na, M_c_Rd, n_keep, M_Ed_ser, V_Ed_ser)
    try:
        hit = _SEARCHES.get(key)
    except TypeError:  # an unhashable input: search without remembering
        return _search_layouts(section, grade, M_Ed, V_Ed, N_Ed, spec, na, M_c_Rd, n_keep,
                               M_Ed_ser=M_Ed_ser, V_Ed_ser=V_Ed_ser)
    if hit is None:
        hit = _search_layouts(section, grade, M_Ed, V_Ed, N_Ed, spec, na, M_c_Rd, n_keep,
                              M_Ed_ser=M_Ed_ser, V_Ed_ser=V_Ed_ser)
        if len(_SEARCHES) >= _SEARCHES_MAX:
            _SEARCHES.pop(next(iter(_SEARCHES)))
        _SEARCHES[key] = hit
    return list(hit)


def _search_layouts(section, grade: str, M_Ed: float, V_Ed: float, N_Ed: float, spec: SpliceSpec,
                    na: NationalAnnex = UK_NA, M_c_Rd: float | None = None, n_keep: int = 3, *,
                    M_Ed_ser: float | None = None, V_Ed_ser: float | None = None):
    """Cheapest passing layouts (list of SpliceDesign, cheapest first).

    Every check of :func:`check_splice` belongs to the flange group or to the web group
    (the member checks at the splice too: flange holes in bending with the flange, web
    net shear and block tearing with the web), so the cheapest passing flange plus the
    cheapest passing web is the cheapest passing splice for a bolt. ``M_Ed_ser``,
    ``V_Ed_ser``: serviceability forces for category B slip, as in :func:`check_splice`.
    """
    grade, M_Ed, V_Ed, N_Ed = validate_inputs(section, grade, M_Ed, V_Ed, N_Ed, spec, na)
    if spec.bolts != "auto":
        bolts = [(spec.bolt_size, spec.bolt_class)]
    else:
        bolts = [bc for bc in AUTO_BOLTS if spec.category == "A" or bc[1] in PRELOAD_CLASSES]
    k_min = spec.min_design_moment
    if k_min > 0 and M_c_Rd is None:
        M_c_Rd = moment_resistance(section, grade, na)
    pg = spec.plate_grade
    M_j = max(abs(M_Ed), k_min * (M_c_Rd or 0.0)) if k_min > 0 else abs(M_Ed)   # as forces.M_j_Ed
    combos = []
    for size, cls in bolts:
        bolt = splice_bolt(size, cls, spec)
        dummy_web = WebLayout(rows=2, columns=1, pitch=70.0, gauge=0.0, plate=10.0)

        def flange_forces(f: FlangeLayout):
            a_f = flange_reach(spec.gap, default_edge(bolt.d_0), f.rows, f.pitch)
            return splice_forces(section, M_Ed, V_Ed, N_Ed, gap=spec.gap, web_rows=2, web_columns=1, web_pitch=70.0,
                                 web_gauge=0.0, web_e1=40.0, k_min=k_min, M_c_Rd=M_c_Rd or 0.0, flange_a=a_f), a_f

        def flange_test(f: FlangeLayout):
            a_f = flange_reach(spec.gap, default_edge(bolt.d_0), f.rows, f.pitch)
            F_f = flange_force(section, M_j, V_Ed, N_Ed, a_f)[0]          # cheap: the bounds first
            if not _flange_bound(bolt, f, F_f, spec, pg, na, section, grade):
                return None
            fo, _ = flange_forces(f)
            lay = SpliceLayout(size, cls, f, dummy_web)
            g = geometry(section, bolt, lay, spec.gap)
            if not all(r.ok for r in find(detailing_records(section, bolt, g, spec), TAG_FIT, TAG_FLANGE)):
                return False
            F_f_ser, _, _ = serviceability_forces(section, spec, dummy_web, default_edge(bolt.d_0), fo, M_Ed, V_Ed,
                                                  M_Ed_ser, V_Ed_ser, a_f)
            if not all(r.ok for r in flange_records(section, grade, bolt, g, spec, F_f, na, Calc(), F_f_ser,
                                                    fast=True)):
                return False
            return all(r.ok for r in member_records(section, grade, bolt, g, spec, fo, na, Calc(), group=TAG_FLANGE))

        def forces_fn(w: WebLayout):
            e1 = default_edge(bolt.d_0)
            return splice_forces(section, M_Ed, V_Ed, N_Ed, gap=spec.gap, web_rows=w.rows, web_columns=w.columns,
                                 web_pitch=w.pitch, web_gauge=w.gauge, web_e1=e1, k_min=k_min,
                                 M_c_Rd=M_c_Rd or 0.0)

        def web_test(w: WebLayout):
            ok, fo = _web_bound(bolt, w, section, forces_fn, spec, na, pg, grade)
            if not ok:
                return None
            f0 = FlangeLayout(rows=1, columns=2, pitch=70.0, gauge=section.b / 2, plate=10.0)
            lay = SpliceLayout(size, cls, f0, w)
            g = geometry(section, bolt, lay, spec.gap)
            if not all(r.ok for r in find(detailing_records(section, bolt, g, spec), TAG_FIT, TAG_WEB)):
                return False
            _, ratio, _ = serviceability_forces(section, spec, w, g.e1_w, fo, M_Ed, V_Ed, M_Ed_ser, V_Ed_ser)
            if not all(r.ok for r in web_records(section, grade, bolt, g, spec, fo, na, Calc(), ratio, fast=True)):
                return False
            return all(r.ok for r in member_records(section, grade, bolt, g, spec, fo, na, Calc(), group=TAG_WEB))

        fl = _first_passing(_flange_candidates(section, bolt, spec), flange_test, k=2)
        if not fl:
            continue
        wb = _first_passing(_web_candidates(section, bolt, spec), web_test, k=2)
        if not wb:
            continue
        for cf, f in fl:
            for cw, w in wb:
                combos.append((cf + cw, SpliceLayout(size, cls, f, w)))
    combos.sort(key=lambda c: c[0])
    out: list[SpliceDesign] = []
    other_sizes: set[str] = set()
    for cost, lay in combos:
        d = check_splice(section, grade, M_Ed, V_Ed, N_Ed, spec=spec, layout=lay, na=na, M_c_Rd=M_c_Rd,
                         M_Ed_ser=M_Ed_ser, V_Ed_ser=V_Ed_ser, stop_on_fail=True)
        if d.ok:
            out.append(d)
            if d.layout.bolt_size != out[0].layout.bolt_size:
                other_sizes.add(d.layout.bolt_size)
            if len(other_sizes) >= n_keep - 1:
                break          # the alternatives below are the first of each other bolt size in cost order
    # alternatives: prefer another bolt size, then another group layout (never the same geometry)
    if not out:
        return []
    best = out[0]

    def geo(d):
        L = d.layout
        return (L.bolt_size, L.flange, L.web)

    alts: list[SpliceDesign] = []
    seen_geo = {geo(best)}
    seen_size = {best.layout.bolt_size}
    for d in out[1:]:
        if d.layout.bolt_size not in seen_size and geo(d) not in seen_geo:
            alts.append(d)
            seen_size.add(d.layout.bolt_size)
            seen_geo.add(geo(d))
    for d in out[1:]:
        if len(alts) >= n_keep - 1:
            break
        if geo(d) not in seen_geo:
            alts.append(d)
            seen_geo.add(geo(d))
    alts.sort(key=lambda d: d.cost)
    return [best] + alts[:n_keep - 1]


def design_splice(section, grade: str, M_Ed: float, V_Ed: float, N_Ed: float = 0.0, spec: SpliceSpec | None = None,
                  na: NationalAnnex = UK_NA, render: bool = False, *, M_Ed_ser: float | None = None,
                  V_Ed_ser: float | None = None, location_mm: float | None = None,
                  M_c_Rd: float | None = None) -> SpliceDesign:
    """Design (or check) one splice: M_Ed (N*mm), V_Ed (N), N_Ed (N, tension +).

    With an explicit layout in ``spec`` it is checked as given; otherwise the
    cheapest passing layout is searched (:func:`search_layouts`) and returned
    with up to two alternatives. ``render=True`` re-runs the chosen layout with
    handcalcs rendering (the drawing: ``design.drawing()``). No passing layout raises
    :class:`InputError` naming what to change.
    """
    spec = spec if spec is not None else SpliceSpec()
    grade, M_Ed, V_Ed, N_Ed = validate_inputs(section, grade, M_Ed, V_Ed, N_Ed, spec, na)
    kw = dict(na=na, M_Ed_ser=M_Ed_ser, V_Ed_ser=V_Ed_ser, location_mm=location_mm, M_c_Rd=M_c_Rd)
    if spec.layout_given:
        lay = SpliceLayout(spec.bolt_size, spec.bolt_class, spec.flange, spec.web)
        d = check_splice(section, grade, M_Ed, V_Ed, N_Ed, spec=spec, layout=lay, render=render, **kw)
    else:
        if spec.bolt_size:      # bolts that cannot fit this section: say so, rather than blame the forces
            from ..job.bounds import bolt_fit_problem

            why = bolt_fit_problem(section, spec.bolt_size, spec.bolt_class)
            if why:
                raise InputError("splices.bolts", spec.bolts, why, "Use a smaller bolt or bolts = 'auto'")
        found = search_layouts(section, grade, M_Ed, V_Ed, N_Ed, spec, na, M_c_Rd, M_Ed_ser=M_Ed_ser,
                               V_Ed_ser=V_Ed_ser)
        if not found:
            raise InputError("splices", f"M_Ed = {M_Ed / 1e6:.1f} kNm, V_Ed = {V_Ed / 1e3:.1f} kN on "
                             f"{getattr(section, 'designation', section)}",
                             "forces that a cover-plate splice of this section can carry with the searched bolts "
                             f"({spec.bolts}) and plates up to {FLANGE_T[-1]:g} mm",
                             "Try bolts = 'auto', flange_plates = 'outer+inner', category A, or move the splice "
                             "to a position of lower moment.")
        best, alts = found[0], found[1:]
        d = check_splice(section, grade, M_Ed, V_Ed, N_Ed, spec=spec, layout=best.layout, render=render, **kw)
        alts = tuple(check_splice(section, grade, M_Ed, V_Ed, N_Ed, spec=spec, layout=a.layout, **kw) for a in alts)
        d = replace(d, alternatives=alts)
    return d


__all__ = ["design_splice", "search_layouts", "AUTO_BOLTS", "FLANGE_T", "WEB_T"]
