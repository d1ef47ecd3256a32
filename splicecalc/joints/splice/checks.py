"""EN 1993-1-8 checks of a bolted cover-plate beam splice (plain floats N, mm, MPa, N*mm).

Every check is a :class:`~splicecalc.core.record.CheckRecord` with its clause. The
formulas are the fastener owner's (:mod:`splicecalc.joints.bolts`, ``plates``,
``spacing``) and the member owner's (:mod:`splicecalc.members`); the only
splice-specific formulas here are the web plate's net modulus and the N-M interaction.

Methods (stated on the calc sheet):

* Flange bolt group (concentric, force ``F_f``): shear per bolt ``F_f/n``, on 1
  plane (outer plate) or, with outer + inner plates, on the more loaded of the two
  planes, which passes its plate's area share of the bolt force (the same for the
  friction surfaces of slip-resistant bolts), with beta_Lf (3.8, L_j =
  (rows - 1) p1) and beta_p (3.6.1(12), flange packing). Bearing per bolt and per
  ply with k1 and alpha_b by position (end / inner row, edge / inner line; the
  end row of the beam flange is the one nearest the beam end, of a plate the
  one nearest the plate end), force per ply split by area between the outer and
  inner plates; group resistance by 3.7(1) with each bolt's resistance the least
  of its plies. Rows = 1 with outer plates only: single-lap cap 3.6.1(10).
* Web bolt group: elastic polar forces (see :mod:`.forces`); shear per bolt
  over 2 planes; bearing on the beam web and on the two web plates checked per
  direction with the linear utilisation ``sqrt((F_x/F_b,x,Rd)^2 + (F_z/F_b,z,Rd)^2) <= 1``
  (:func:`splicecalc.joints.bolts.U_b_2d`, the one convention of the package), each F_b,Rd from
  Table 3.4 with alpha_d from what lies AHEAD of the bolt in that direction (a free
  edge at e1: e1/(3 d0); another bolt at p1: p1/(3 d0) - 1/4; nothing within the
  member, a beam-web bolt bearing into the beam: alpha_d does not limit) and k1 from
  the distances across it (:func:`web_bearing_positions`). In the beam web the top
  and bottom rows bearing towards a flange take the distance to the flange face as
  an end distance (conservative: the web is not free there). Each force component
  is taken in both senses (|M|, |V| of either sign, either side of the joint).
* Slip: category B with serviceability forces and gamma_M3,ser, category C with
  ULS forces and gamma_M3 (3.4.1, 3.9); bearing at ULS is checked for all
  categories, category C adds the net section at f_y (EN 1993-1-1 6.2.3(4)).
* Table 3.3 minima for every ply; maxima p <= min(14 t, 200 mm) (compression
  flange and web, either flange may be in compression under reversal) and
  4 t + 40 mm edges when ``exposed``; t is the thinner outer connected part
  (note 3). Web bolts are loaded both ways, so the web spacing is checked for a
  horizontal and a vertical load (pitch and gauge each >= 2.4 d0).
* Plates: tension gross/net (6.2.3), block tearing (3.10.2), compression with
  buckling between fasteners over max(p1, gap + 2 e1) (the plate strip across
  the joint is the longest unsupported length); web plates: shear gross/net,
  block tearing (eccentric, Eq. 3.10), in-plane bending at the first bolt column,
  with the web's axial share by the linear interaction of EN 1993-1-1 6.2.1(7).
* Beam at the splice: bending with tension-flange holes (EN 1993-1-1 6.2.5(4)),
  web net shear (6.2.6(7)), shear, beam-web block tearing under axial tension.

A layout that does not fit yields failing detailing records (never an exception):
dependent checks whose inputs are then meaningless report "not checked" as failures.
"""

from __future__ import annotations

import math
from dataclasses import replace
from typing import Callable

from ...core.clause import clause
from ...core.errors import InputError
from ...core.record import Calc, CheckRecord
from ...core.units import convert
from ...materials.partial_factors import NationalAnnex
from ...materials.steel import steel
from .. import bolts as B
from .. import plates as P
from .. import spacing as S
from ...members.en1993_1_1 import c_t_flange, epsilon, rho_V
from .geometry import Geometry

CL_DETAIL = "EN 1993-1-8:2005, 3.5(1)"
#: the buckling length of a compression cover plate across the joint is a stated method
GUIDE_STRIP = ("stated method: the plate strip across the joint, gap + 2 e1 long, is the longest unsupported "
               "length; buckling curve c with the Table 3.3 note 2 length factor 0.6 (conservative, no source)")
#: the fit rules are detailing practice, not code clauses
GUIDE_FIT = "detailing practice: washers, nuts and plates clear of the root fillets (common practice, no code clause)"
CL_BEAR = "EN 1993-1-8:2005, 3.6.1, Table 3.4"


@clause("EN 1993-1-1:2005, 6.2.5(5)", units={"t": "mm", "h": "mm", "d_0": "mm", "p": "mm"}, returns="mm3",
        example=dict(t=10.0, h=280.0, n_r=4, d_0=22.0, p=70.0))
def W_el_net_plate(t: float, h: float, n_r: int, d_0: float, p: float) -> float:
    """Elastic modulus of a plate t x h bent in its plane, net of one column of n_r holes d_0
    at pitch p symmetric about mid-depth (mm3): I_net = t h^3/12 - t d_0 p^2 n_r (n_r^2 - 1)/12
    - n_r t d_0^3/12, W = I_net / (h/2)."""
    I_net = t * h ** 3 / 12 - t * d_0 * p ** 2 * n_r * (n_r ** 2 - 1) / 12 - n_r * t * d_0 ** 3 / 12
    W_el_net = I_net / (h / 2)
    return W_el_net


@clause("EN 1993-1-1:2005, 6.2.1(7), Eq. 6.2", units={"N_Ed": "N", "N_Rd": "N", "M_Ed": "Nmm", "M_Rd": "Nmm"},
        returns="", example=dict(N_Ed=50e3, N_Rd=800e3, M_Ed=20e6, M_Rd=40e6))
def U_NM(N_Ed: float, N_Rd: float, M_Ed: float, M_Rd: float) -> float:
    """Linear interaction of axial force and bending, Eq. 6.2 (conservative): N/N_Rd + M/M_Rd <= 1."""
    U_NM = N_Ed / N_Rd + M_Ed / M_Rd
    return U_NM


CL_WEB_HOLES = "EN 1993-1-1:2005, 6.2.5(5)"


@clause(CL_WEB_HOLES, units={"b": "mm", "t_f": "mm", "h": "mm", "t_w": "mm"}, returns="mm2",
        example=dict(b=152.9, t_f=13.3, h=454.6, t_w=8.1))
def A_tz(b: float, t_f: float, h: float, t_w: float) -> float:
    """Gross area of the tension zone of a doubly symmetric I section in bending (mm2): the tension
    flange and the web from mid-depth (the plastic neutral axis) to the flange; root fillets left out."""
    A_tz = b * t_f + (h / 2 - t_f) * t_w
    return A_tz


@clause(CL_WEB_HOLES, units={"b": "mm", "t_f": "mm", "h": "mm", "t_w": "mm", "A_tz": "mm2"}, returns="mm",
        example=dict(b=152.9, t_f=13.3, h=454.6, t_w=8.1, A_tz=3767.0))
def y_tz(b: float, t_f: float, h: float, t_w: float, A_tz: float) -> float:
    """Centroid of the tension zone from mid-depth (mm)."""
    y_tz = (b * t_f * (h - t_f) / 2 + t_w * (h / 2 - t_f) ** 2 / 2) / A_tz
    return y_tz


@clause(CL_WEB_HOLES, units={"A_tz": "mm2", "d_0": "mm", "t_f": "mm", "t_w": "mm"}, returns="mm2",
        example=dict(A_tz=3767.0, n_f=2, d_0=22.0, t_f=13.3, n_w=2, t_w=8.1))
def A_tz_net(A_tz: float, n_f: int, d_0: float, t_f: float, n_w: int, t_w: float) -> float:
    """Net area of the tension zone (mm2): n_f holes across the flange, n_w web holes in the tension zone."""
    A_tz_net = A_tz - n_f * d_0 * t_f - n_w * d_0 * t_w
    return A_tz_net


@clause(CL_WEB_HOLES, units={"W_pl_y": "mm3", "A_tz": "mm2", "A_tz_net": "mm2", "f_u": "MPa", "f_y": "MPa",
                             "y_tz": "mm", "t_w": "mm"}, returns="mm3",
        example=dict(W_pl_y=1287.3e3, A_tz=3767.0, A_tz_net=2825.4, f_u=470.0, f_y=355.0, gamma_M0=1.0,
                     gamma_M2=1.1, y_tz=168.3, t_w=8.1))
def W_pl_y_tz_net(W_pl_y: float, A_tz: float, A_tz_net: float, f_u: float, f_y: float, gamma_M0: float,
                  gamma_M2: float, y_tz: float, t_w: float) -> float:
    """Plastic modulus with the tension zone reduced to the area that meets Eq. 6.16 (mm3): the
    deficit Delta A_tz = A_tz - 0.9 A_tz,net (f_u/gamma_M2)/(f_y/gamma_M0) is taken off at the
    zone's centroid y_tz, the plastic neutral axis moving Delta A_tz/(2 t_w) in the web."""
    Delta_A_tz = A_tz - 0.9 * A_tz_net * (f_u / gamma_M2) / (f_y / gamma_M0)
    W_pl_y_tz_net = W_pl_y - Delta_A_tz * y_tz - Delta_A_tz ** 2 / (4 * t_w)
    return W_pl_y_tz_net


def _fail(id: str, title: str, clause_: str, err: Exception, location_mm=None) -> CheckRecord:
    """A failing record for a check that cannot be made (layout does not fit)."""
    return CheckRecord(id=id, title=title, clause=clause_, demand=1.0, resistance=0.0, unit="",
                       utilisation=math.inf, ok=False, location_mm=location_mm,
                       note=f"not checked: {err}")


def _safe(out: list, fn: Callable, *, fid: str, ftitle: str, fclause: str, **kw):
    """Run a check; append its record(s); turn InputError (unfit geometry) into a failing record."""
    try:
        r = fn(**kw)
    except (InputError, ZeroDivisionError, ValueError) as e:
        out.append(_fail(fid, ftitle, fclause, e, kw.get("location_mm")))
        return None
    if isinstance(r, list):
        out.extend(r)
    else:
        out.append(r)
    return r


def _kN(rec: CheckRecord) -> float:
    """Resistance of a record in N (records hold report units)."""
    return convert(rec.resistance, "kN", "N") if rec.unit == "kN" else rec.resistance


def _fb(bolt, t, fu, e1, p1, e2, p2, gM2, hole, calc=None) -> float:
    """Table 3.4 bearing of one bolt position; non-positive distances -> 0 (does not fit).
    ``e1 = p1 = None``: nothing ahead of the bolt in the direction of the force (alpha_d does not limit)."""
    for v in (e1, p1, e2, p2):
        if v is not None and v <= 0.0:
            return 0.0
    try:
        return max(B.bearing_resistance(bolt, t, fu, e1, e2, p1, p2, hole=hole, gamma_M2=gM2, calc=calc,
                                        nothing_ahead=e1 is None and p1 is None), 0.0)
    except InputError:          # below the Table 3.3 minima: reported by the spacing records
        return 0.0


def _record(calc: Calc, **kw) -> CheckRecord:
    return calc.record(**kw)


#: tags every splice record carries by group: code looks checks up by these, never by list position
TAG_FLANGE, TAG_WEB, TAG_FIT, TAG_DETAILING, TAG_MEMBER = "flange", "web", "fit", "detailing", "member"


def _tag(records: list[CheckRecord], *tags: str) -> list[CheckRecord]:
    """The records with ``tags`` added (order kept). The records are the group's own, fresh from its
    checks and not yet shared, so the tags are set on them in place (a copy per record would cost the
    layout search, which makes thousands)."""
    for r in records:
        new = tuple(t for t in tags if t not in r.tags)
        if new:
            object.__setattr__(r, "tags", r.tags + new)
    return records


# ======================================================================== detailing
def detailing_records(section, bolt, g: Geometry, spec, loc=None) -> list[CheckRecord]:
    """Fit of the layout: bolt lines in the flange width, clear of the root radius, web plates
    between the fillets, inner plates beside the root; every dimension positive."""
    c = Calc()
    d0 = bolt.d_0
    emin = S.e_min(d_0=d0)
    out = [
        _record(c, id="fit_flange_width", title="Flange bolt lines fit the flange width", clause=CL_DETAIL,
                tags=(TAG_FIT, TAG_DETAILING, TAG_FLANGE), guidance=GUIDE_FIT,
                demand=g.g_f + 2 * g.p2o_f + 2 * emin, resistance=section.b, unit="mm", location_mm=loc,
                note="gauge + 2 gauge_outer + 2 x 1.2 d0 <= b"),
        _record(c, id="fit_flange_root", title="Flange bolts clear of the root radius", clause=CL_DETAIL,
                tags=(TAG_FIT, TAG_DETAILING, TAG_FLANGE), guidance=GUIDE_FIT,
                demand=g.washer_clear_gauge, resistance=g.g_f, unit="mm", location_mm=loc,
                note=f"gauge >= t_w + 2 r + washer OD ({bolt.washer_od:g} mm): washer and nut clear of the fillet"),
        _record(c, id="fit_web_depth", title="Web plates fit between the root fillets", clause=CL_DETAIL,
                tags=(TAG_FIT, TAG_DETAILING, TAG_WEB), guidance=GUIDE_FIT,
                demand=g.h_wp, resistance=g.d_web, unit="mm", location_mm=loc,
                note="h_wp = (rows - 1) p + 2 e_v <= d = h - 2 t_f - 2 r"),
        _record(c, id="fit_web_washer", title="Web bolts: washer clear of the flange fillet", clause=CL_DETAIL,
                tags=(TAG_FIT, TAG_DETAILING, TAG_WEB), guidance=GUIDE_FIT,
                demand=bolt.washer_od / 2, resistance=g.e_v + (g.d_web - g.h_wp) / 2, unit="mm", location_mm=loc),
    ]
    if g.t_pi > 0.0:
        out.append(_record(c, id="fit_inner_plate", title="Inner flange plates fit beside the root radius",
                           clause=CL_DETAIL, tags=(TAG_FIT, TAG_DETAILING, TAG_FLANGE), guidance=GUIDE_FIT, demand=emin, resistance=min(g.e2_pi_in, g.e2_pi_out), unit="mm",
                           location_mm=loc, note=f"inner plates {g.b_pi:g} mm wide, 5 mm clear of the root radius"))
    return out


# ======================================================================== flange group
def _flange_records(section, grade: str, bolt, g: Geometry, spec, F_f: float, na: NationalAnnex, calc: Calc,
                   F_f_ser: float | None = None, loc=None, fast: bool = False) -> list[CheckRecord]:
    """Flange bolts, flange cover plates and the beam flange for the flange force F_f (N).

    ``fast``: return as soon as a group of checks fails (layout search)."""
    out: list[CheckRecord] = []
    fy_b, fu_b = steel(grade, section.tf).f_y, steel(grade, section.tf).f_u
    pg = spec.plate_grade
    fu_o = steel(pg, g.t_po).f_u
    inner = g.t_pi > 0.0
    fu_i = steel(pg, g.t_pi).f_u if inner else 0.0
    d0 = bolt.d_0
    n = g.n_f
    rows = n // (2 if g.p2o_f == 0 else 4)
    cols = 2 if g.p2o_f == 0 else 4
    hole = spec.holes
    gM2 = na.gamma_M2
    F_b = F_f / n
    L_j = (rows - 1) * g.p1_f
    # -- shear. With outer + inner plates each shear plane (and friction surface) passes the force of
    # its own plate, shared by area: the most loaded plane carries max(share) of the bolt force, so
    # the bolt is checked on that plane (equal to double shear only when the areas are equal).
    share_max = max(g.share_o, 1.0 - g.share_o) if inner else 1.0
    plane = "most loaded shear plane, share by plate area" if inner else "single shear"
    rs = _safe(out, B.check_bolt_shear, fid="flange_bolt_shear", ftitle="Flange bolts: shear", fclause=CL_BEAR,
               bolt=bolt, F_v_Ed=F_b * share_max, n_s=1, threads_in_shear_plane=spec.threads_in_shear_plane, L_j=L_j,
               t_pack=spec.packing, na=na, calc=calc, id="flange_bolt_shear", title=f"Flange bolts: shear ({plane})",
               location_mm=loc)
    F_v = _kN(rs) / share_max if rs is not None else 0.0      # resistance of one bolt to its whole force
    # -- bearing per bolt and ply
    p1 = g.p1_f if rows > 1 else None
    if cols == 2:
        lines_b = [(g.e2_bf, g.g_f)] * 2
        lines_o = [(g.e2_po, g.g_f)] * 2
        lines_i = [(min(g.e2_pi_in, g.e2_pi_out), None)] * 2
    else:
        p2i = min(g.g_f, g.p2o_f)
        lines_b = [(g.e2_bf, g.p2o_f), (None, p2i), (None, p2i), (g.e2_bf, g.p2o_f)]
        lines_o = [(g.e2_po, g.p2o_f), (None, p2i), (None, p2i), (g.e2_po, g.p2o_f)]
        lines_i = [(g.e2_pi_out, g.p2o_f), (g.e2_pi_in, g.p2o_f), (g.e2_pi_in, g.p2o_f), (g.e2_pi_out, g.p2o_f)]
    share_o = g.share_o
    share_i = 1.0 - share_o
    lap = (rows == 1 and not inner)
    per_bolt: list[float] = []
    where: list[tuple] = []        # per bolt: the ply and Table 3.4 position that gives its resistance
    worst = {"beam flange": math.inf, "outer plate": math.inf, "inner plates": math.inf}
    cache: dict = {}

    def fb(key, t, fu, e1, pp1, e2, p2):
        k = (key, e1, pp1, e2, p2)
        if k not in cache:
            v = _fb(bolt, t, fu, e1, pp1, e2, p2, gM2, hole)
            if lap:
                v = min(v, B.F_b_Rd_lap(f_u=fu, d=bolt.d, t=t, gamma_M2=gM2))
            cache[k] = v
        return cache[k]

    for i in range(rows):                      # i = 0 nearest the joint
        beam_end = i == 0
        plate_end = i == rows - 1
        for j in range(cols):
            e2b, p2b = lines_b[j]
            v_b = fb("b", section.tf, fu_b, g.e1_f if beam_end else None, None if beam_end else p1, e2b, p2b)
            e2o, p2o = lines_o[j]
            v_o = fb("o", g.t_po, fu_o, g.e1_f if plate_end else None, None if plate_end else p1, e2o, p2o)
            worst["beam flange"] = min(worst["beam flange"], v_b)
            worst["outer plate"] = min(worst["outer plate"], v_o / share_o)
            cands = [(v_b, ("beam flange", section.tf, fu_b, g.e1_f if beam_end else None,
                            None if beam_end else p1, e2b, p2b, 1.0, "end row" if beam_end else "inner row", j)),
                     (v_o / share_o, ("outer plate", g.t_po, fu_o, g.e1_f if plate_end else None,
                                      None if plate_end else p1, e2o, p2o, share_o,
                                      "end row" if plate_end else "inner row", j))]
            if inner:
                e2i, p2ii = lines_i[j]
                v_i = fb("i", g.t_pi, fu_i, g.e1_f if plate_end else None, None if plate_end else p1, e2i, p2ii)
                worst["inner plates"] = min(worst["inner plates"], v_i / share_i)
                cands.append((v_i / share_i, ("inner plates", g.t_pi, fu_i, g.e1_f if plate_end else None,
                                              None if plate_end else p1, e2i, p2ii, share_i,
                                              "end row" if plate_end else "inner row", j)))
            v, w = min(cands, key=lambda c_: c_[0])
            per_bolt.append(v)
            where.append(w)
    gov = min((k for k in worst if math.isfinite(worst[k])), key=lambda k: worst[k])
    if calc.render:
        calc.note(f"Bearing, governing ply: {gov} (force per bolt divided by the ply's share of the flange force)")
        e2b, p2b = lines_b[0]
        calc.note("Beam flange, end bolt (row at the beam end, edge line), Table 3.4:")
        _fb(bolt, section.tf, fu_b, g.e1_f, None, e2b, p2b, gM2, hole, calc=calc)
        e2o, p2o_ = lines_o[0]
        calc.note("Outer plate, end bolt (row at the plate end, edge line), Table 3.4:")
        _fb(bolt, g.t_po, fu_o, g.e1_f, None, e2o, p2o_, gM2, hole, calc=calc)
        if per_bolt:
            k_min = min(range(len(per_bolt)), key=lambda k: per_bolt[k])
            ply, t_, fu_, e1_, p1_, e2_, p2_, sh, row, j_ = where[k_min]
            shown = {("beam flange", "end row"), ("outer plate", "end row")}
            if (ply, row) not in shown or j_ not in (0, cols - 1):
                line = "edge line" if e2_ is not None else "inner line"
                calc.note(f"Governing bolt of the group, $F_{{b,Rd,min}}$: {ply}, {row}, {line}, Table 3.4"
                          + (f" (its resistance divided by the ply's share {sh:.3f} of the flange force)"
                             if sh < 1.0 else "") + ":")
                _fb(bolt, t_, fu_, e1_, p1_, e2_, p2_, gM2, hole, calc=calc)
    if F_v > 0.0 and min(per_bolt) > 0.0:
        _safe(out, B.check_bolt_group, fid="flange_bolt_group", ftitle="Flange bolt group: bearing and shear (3.7)",
              fclause="EN 1993-1-8:2005, 3.7(1)", F_Ed=F_f, F_v_Rd_each=F_v, F_b_Rd_each=per_bolt, calc=calc,
              id="flange_bolt_group", title=f"Flange bolt group: bearing and shear (3.7), governing ply {gov}",
              location_mm=loc)
    else:
        out.append(_fail("flange_bolt_group", "Flange bolt group: bearing and shear (3.7)", "EN 1993-1-8:2005, 3.7(1)",
                         InputError("flange layout", "edge or end distance <= 0", "a layout that fits"), loc))
    if fast and not all(r.ok for r in out):
        return out
    # -- slip
    if spec.category in ("B", "C"):
        Fs = F_b if spec.category == "C" else (F_f_ser if F_f_ser is not None else F_f) / n
        _safe(out, B.check_slip, fid="flange_bolt_slip", ftitle="Flange bolts: slip", fclause="EN 1993-1-8:2005, 3.9.1, Eq. 3.6",
              bolt=bolt, F_v_Ed=Fs * share_max, category=spec.category, n=1, surface_class=spec.friction_class,
              hole=hole, na=na, calc=calc, id="flange_bolt_slip", location_mm=loc,
              title=f"Flange bolts: slip, category {spec.category} ({plane.replace('shear plane', 'friction surface').replace('single shear', 'one friction surface')})")
    # -- spacing, Table 3.3
    t_out = min(g.t_po, g.t_pi) if inner else min(g.t_po, section.tf)
    p2 = g.g_f if cols == 2 else min(g.g_f, g.p2o_f)
    for where, e2 in (("outer flange plate", g.e2_po), ("beam flange", g.e2_bf)) + (
            (("inner flange plates", min(g.e2_pi_in, g.e2_pi_out)),) if inner else ()):
        _safe(out, S.check_spacing, fid="flange_spacing", ftitle=f"Flange bolts spacing, {where}",
              fclause="EN 1993-1-8:2005, 3.5, Table 3.3", d_0=d0, t=t_out, e_1=g.e1_f, e_2=e2, p_1=p1,
              p_2=p2 if where != "inner flange plates" or cols == 4 else None, exposed=spec.exposed,
              compression=True, calc=calc, id="flange_spacing_" + where.split()[0], where=f"Flange, {where}",
              location_mm=loc)
    # -- plates in tension
    F_o = F_f * share_o
    _safe(out, P.check_plate_tension, fid="outer_plate_tension", ftitle="Outer flange plate: tension",
          fclause="EN 1993-1-1:2005, 6.2.3", N_Ed=F_o, b=g.b_po, t=g.t_po, grade=pg, n_holes=cols, d_0=d0,
          category_C=spec.category == "C", na=na, calc=calc, id="outer_plate_tension",
          title="Outer flange plate: tension (gross, net)", location_mm=loc)
    if inner:
        _safe(out, P.check_plate_tension, fid="inner_plate_tension", ftitle="Inner flange plates: tension",
              fclause="EN 1993-1-1:2005, 6.2.3", N_Ed=F_f * share_i / 2, b=g.b_pi, t=g.t_pi, grade=pg,
              n_holes=cols // 2, d_0=d0, category_C=spec.category == "C", na=na, calc=calc,
              id="inner_plate_tension", title="Inner flange plate (each): tension (gross, net)", location_mm=loc)
    # (the beam flange net section, with f_y for category C, is a member record: beam_flange_net)
    if fast and not all(r.ok for r in out):
        return out
    # -- block tearing (concentric, Eq. 3.9): centre block and both edge strips; inner plates eccentric (Eq. 3.10)
    spread = g.g_f + 2 * g.p2o_f
    p2_mean = spread / (cols - 1)             # (cols - 1)(p2_mean - d0) = spread - (cols - 1) d0
    blocks = []
    for who, t, e2, grade_, F in (("outer plate", g.t_po, g.e2_po, pg, F_o),
                                  ("beam flange", section.tf, g.e2_bf, grade, F_f)):
        for pat, pattern in (("centre block", "inner"), ("edge strips", "outer")):
            blocks.append((f"block_{who.replace(' ', '_')}_{pat.split()[0]}", f"Block tearing, {who}, {pat}",
                           "EN 1993-1-8:2005, 3.10.2(2), Eq. 3.9", False, t, e2, cols, p2_mean, pattern, grade_, F))
    if inner:
        blocks.append(("block_inner_plate", "Block tearing, inner plate (each; one shear plane, eccentric Eq. 3.10)",
                       "EN 1993-1-8:2005, 3.10.2(3), Eq. 3.10", True, g.t_pi, min(g.e2_pi_in, g.e2_pi_out), cols // 2,
                       g.p2o_f, "one_side", pg, F_f * share_i / 2))
    for bid, btitle, bclause, ecc, t, e2, n2, p2b, pattern, grade_, F in blocks:
        try:
            ba = P.block_tearing_areas(t=t, d_0=d0, n_1=rows, e_1=g.e1_f, p_1=g.p1_f if rows > 1 else 0.0,
                                       n_2=n2, e_2=e2 if e2 > 0 else 1e-9, p_2=p2b if n2 > 1 else 0.0,
                                       pattern=pattern)
        except InputError as e:
            out.append(_fail(bid, btitle, bclause, e, loc))
            continue
        _safe(out, P.check_block_tearing, fid=bid, ftitle=btitle, fclause=bclause, F_Ed=F, A_nt=ba.A_nt,
              A_nv=ba.A_nv, grade=grade_, t=t, eccentric=ecc, na=na, calc=calc, id=bid, title=btitle,
              location_mm=loc)
    # -- compression: buckling between fasteners and across the joint
    p_free = max(g.p1_f if rows > 1 else 0.0, spec.gap + 2 * g.e1_f)
    p_name = "gap + 2 e_1" if p_free == spec.gap + 2 * g.e1_f else "p_1"
    # oversize holes are not "filled by fasteners": net area in compression too (EN 1993-1-1 6.2.4)
    over = hole == "oversize"
    A_no = P.A_net_plate(b=g.b_po, t=g.t_po, n=cols, d_0=d0) if over else None
    A_ni = P.A_net_plate(b=g.b_pi, t=g.t_pi, n=cols // 2, d_0=d0) if (over and inner) else None
    _safe(out, P.check_plate_compression, fid="outer_plate_compression", ftitle="Outer flange plate: compression",
          fclause="EN 1993-1-8:2005, 3.5, Table 3.3", N_Ed=F_o, b=g.b_po, t=g.t_po, p_1=p_free, grade=pg, na=na,
          A_net=A_no, calc=calc, id="outer_plate_compression", length_name=p_name,
          title="Outer flange plate: compression, buckling over max(p1, gap + 2 e1)", location_mm=loc)
    for r in out:
        if r.id == "outer_plate_compression":
            object.__setattr__(r, "guidance", GUIDE_STRIP)
    if inner:
        _safe(out, P.check_plate_compression, fid="inner_plate_compression", ftitle="Inner flange plates: compression",
              fclause="EN 1993-1-8:2005, 3.5, Table 3.3", N_Ed=F_f * share_i / 2, b=g.b_pi, t=g.t_pi, p_1=p_free,
              grade=pg, na=na, A_net=A_ni, calc=calc, id="inner_plate_compression", length_name=p_name,
              title="Inner flange plate (each): compression, buckling over max(p1, gap + 2 e1)", location_mm=loc)
        for r in out:
            if r.id == "inner_plate_compression":
                object.__setattr__(r, "guidance", GUIDE_STRIP)
    # Table 3.3 note 2: in compression the edge distance must also meet the outstand limit of
    # EN 1993-1-1 Table 5.2 (c = e2 beyond the outer bolt line, Class 3: c/t <= 14 eps, full A f_y)
    plies = [("outer", "Outer flange plate", g.e2_po, g.t_po)]
    if inner:
        plies.append(("inner", "Inner flange plates", max(g.e2_pi_in, g.e2_pi_out), g.t_pi))
    for key, what, c_f, t_p in plies:
        if c_f <= 0.0:
            continue                    # does not fit: reported by the detailing and spacing records
        eps = calc(epsilon, f_y=steel(pg, t_p).f_y)
        ratio, _, _, lim3 = calc(c_t_flange, c_f=c_f, t_f=t_p, epsilon=eps)
        out.append(calc.record(id=f"{key}_plate_outstand", title=f"{what}: edge outstand in compression",
                               clause="EN 1993-1-8:2005, 3.5, Table 3.3", demand=ratio, resistance=lim3, unit="",
                               location_mm=loc, note="Table 3.3 note 2: e2 / t <= 14 eps (EN 1993-1-1 Table 5.2, "
                                                     "outstand in compression, Class 3)"))
    return out


# ======================================================================== web group
def web_bearing_positions(g: Geometry, section, ply: str, i: int, j: int) -> dict:
    """Table 3.4 distances of the web bolt in row ``i`` (0 at the top) and column ``j`` (0 nearest the
    joint) for each direction it may bear in on ``ply`` ('beam' web or web 'plates'): a dict
    ``{direction: (e1, p1, e2, p2)}`` with directions '+x' (away from the joint), '-x', '+z' (up), '-z'.

    alpha_d comes from what lies AHEAD of the bolt in that direction: a free edge at e1 (e1/(3 d0)), or
    another bolt at p1 (p1/(3 d0) - 1/4); both None: nothing ahead within the member (alpha_d does not
    limit). k1 comes from the edge e2 / spacing p2 across the direction. Beam web: towards the beam end
    (column nearest the joint) the end distance e1 of the web; into the beam (outer column) nothing
    ahead; towards a flange (top / bottom row) the distance to the flange face taken as an end
    distance (conservative: the web is not free there). Web plates: towards the plate end (outer
    column) e1; towards the joint (column nearest it) the bolt across the joint at gap + 2 e1; top and
    bottom rows the plate edges e_v."""
    n_r, n_c = g.n_r, g.n_c
    p = g.p_w if n_r > 1 else None
    gg = g.g_w if n_c > 1 else None
    top, bottom = i == 0, i == n_r - 1
    near, far = j == 0, j == n_c - 1
    if ply == "beam":
        e_z = (section.h - 2 * section.tf - (n_r - 1) * g.p_w) / 2        # row to the flange face
        ahead_x = {"-x": (g.e1_w, None) if near else (None, gg), "+x": (None, None) if far else (None, gg)}
        across_z = (g.e1_w if near else None, gg)                            # k1 of vertical bearing
    else:
        e_z = g.e_v
        ahead_x = {"+x": (g.e1_w, None) if far else (None, gg),
                   "-x": (None, g.g_a + 2 * g.e1_w) if near else (None, gg)}
        across_z = (g.e1_w if far else None, gg)
    ahead_z = {"+z": (e_z, None) if top else (None, p), "-z": (e_z, None) if bottom else (None, p)}
    across_x = (e_z if (top or bottom) else None, p)                        # k1 of horizontal bearing
    out = {d: (e1, p1) + across_x for d, (e1, p1) in ahead_x.items()}
    out.update({d: (e1, p1) + across_z for d, (e1, p1) in ahead_z.items()})
    return out


_DIR_WORDS = {"+x": "+x (away from the joint)", "-x": "-x (towards the joint)", "+z": "+z (up)", "-z": "-z (down)"}


def _ahead_words(ply: str, d: str, e1, p1) -> str:
    """What lies ahead of a web bolt in direction ``d`` (words for the calc sheet)."""
    if e1 is None and p1 is None:
        return "no free edge and no bolt ahead within the member"
    if p1 is not None:
        return f"next bolt at p1 = {p1:g} mm"
    if ply == "beam" and d in ("+z", "-z"):
        return f"flange face at {e1:g} mm, taken as an end distance (conservative: the web is not free there)"
    return f"free edge at e1 = {e1:g} mm"


def web_bolt_bearing(bolt, g: Geometry, section, t: float, fu: float, ply: str, gM2: float,
                     bolt_forces, calc: Calc | None = None, hole: str = "normal") -> tuple[float, tuple]:
    """Worst bearing interaction U over the web bolts for ``ply`` 'beam' (the beam web,
    thickness t) or 'plates' (both web plates, t = 2 t_wp). Returns (U, governing
    (x, z, F_x, F_z, F_b_x, F_b_z, dir_x, dir_z)).

    Each bolt bears in the direction of its force, and F_b,Rd in each direction takes alpha_d from what
    lies ahead in that direction (:func:`web_bearing_positions`). The splice is designed for |M| and |V|
    of either sign on either side of the joint, so each force component is taken in both senses (the
    four combinations per bolt, the worst governs)."""
    worst = (-1.0, None)
    cache: dict = {}
    n_c = g.n_c
    for k, (x, z, Fx, Fz, Fr) in enumerate(bolt_forces):
        i, j = divmod(k, n_c)                                     # i row from the top, j column from the joint
        if (i, j) not in cache:
            pos = web_bearing_positions(g, section, ply, i, j)
            cache[(i, j)] = {d: _fb(bolt, t, fu, e1, p1, e2, p2, gM2, hole) for d, (e1, p1, e2, p2) in pos.items()}
        fb = cache[(i, j)]
        for dx, dz in (("+x", "+z"), ("+x", "-z"), ("-x", "+z"), ("-x", "-z")):
            fbx, fbz = fb[dx], fb[dz]
            if fbx <= 0 or fbz <= 0:
                return math.inf, (x, z, Fx, Fz, fbx, fbz, dx, dz)
            U = B.U_b_2d(F_x_Ed=abs(Fx), F_b_x_Rd=fbx, F_z_Ed=abs(Fz), F_b_z_Rd=fbz)
            if U > worst[0]:
                worst = (U, (x, z, Fx, Fz, fbx, fbz, dx, dz))
    return worst


def _web_records(section, grade: str, bolt, g: Geometry, spec, forces, na: NationalAnnex, calc: Calc,
                ser_ratio: float | None = None, loc=None, fast: bool = False) -> list[CheckRecord]:
    """Web bolts (elastic polar forces), web plates and the beam web.

    ``fast``: return as soon as a bolt check fails (layout search)."""
    out: list[CheckRecord] = []
    pg = spec.plate_grade
    mat_w = steel(grade, section.tw)
    mat_p = steel(pg, g.t_wp)
    d0 = bolt.d_0
    F_r = forces.F_web_max
    L_j = max((g.n_r - 1) * g.p_w, (g.n_c - 1) * g.g_w)
    if math.isfinite(F_r):
        _safe(out, B.check_bolt_shear, fid="web_bolt_shear", ftitle="Web bolts: shear", fclause=CL_BEAR, bolt=bolt,
              F_v_Ed=F_r, n_s=2, threads_in_shear_plane=spec.threads_in_shear_plane, L_j=L_j, na=na, calc=calc,
              id="web_bolt_shear", title="Web bolts: shear (resultant, elastic polar method)", location_mm=loc)
    else:
        out.append(_fail("web_bolt_shear", "Web bolts: shear", CL_BEAR,
                         InputError("web.rows x web.columns", 1, "at least 2 bolts to resist the web moment"), loc))
        return out
    for ply, t, fu, what in (("beam", section.tw, mat_w.f_u, "beam web"),
                             ("plates", 2 * g.t_wp, mat_p.f_u, "web plates (pair)")):
        U, gv = web_bolt_bearing(bolt, g, section, t, fu, ply, na.gamma_M2, forces.bolt_forces, hole=spec.holes)
        c = calc
        if c.render and math.isfinite(U):
            x, z, Fx, Fz, fbx, fbz, dx, dz = gv
            i, j = divmod(next(k for k, b in enumerate(forces.bolt_forces) if b[0] == x and b[1] == z), g.n_c)
            pos = web_bearing_positions(g, section, ply, i, j)
            c.note(f"Governing bolt at x = {x:g} mm, z = {z:g} mm from the group centroid (x away from the joint, "
                   f"z up), bearing on the {what} towards {_DIR_WORDS[dx]} and {_DIR_WORDS[dz]} (each force component "
                   "taken in both senses: the splice is designed for |M| and |V| of either sign). Table 3.4 in each direction: "
                   "$\\alpha_{d}$ from what lies ahead (free edge e1, or bolt at p1), k1 from the distances across.")
            for d, sym in ((dx, "F_{b,x,Rd}"), (dz, "F_{b,z,Rd}")):
                e1, p1, e2, p2 = pos[d]
                c.note(f"${sym}$, bearing towards {_DIR_WORDS[d]}: {_ahead_words(ply, d, e1, p1)}")
                _fb(bolt, t, fu, e1, p1, e2, p2, na.gamma_M2, spec.holes, calc=c)
            c(B.U_b_2d, F_x_Ed=abs(Fx), F_b_x_Rd=fbx, F_z_Ed=abs(Fz), F_b_z_Rd=fbz)
        if gv is not None:
            c.keep("F_x_Ed", abs(gv[2]), "N")
            c.keep("F_z_Ed", abs(gv[3]), "N")
            c.keep("F_b_x_Rd", gv[4], "N")
            c.keep("F_b_z_Rd", gv[5], "N")
        out.append(c.record(id=f"web_bearing_{ply}", title=f"Web bolts: bearing on the {what}, two directions",
                            clause=CL_BEAR, demand=U, resistance=1.0, unit="", location_mm=loc,
                            note=B.BEARING_2D_CONVENTION + "; worst bolt", guidance=B.BEARING_2D_GUIDANCE))
        if fast and not out[-1].ok:
            return out
    if spec.category in ("B", "C"):
        Fs = F_r if spec.category == "C" else F_r * (ser_ratio if ser_ratio is not None else 1.0)
        _safe(out, B.check_slip, fid="web_bolt_slip", ftitle="Web bolts: slip", fclause="EN 1993-1-8:2005, 3.9.1, Eq. 3.6",
              bolt=bolt, F_v_Ed=Fs, category=spec.category, n=2, surface_class=spec.friction_class,
              hole=spec.holes, na=na, calc=calc, id="web_bolt_slip", location_mm=loc)
    # Table 3.3 for a group loaded both ways: horizontal (e1 = beam/plate end distance, p1 = gauge,
    # p2 = pitch) and vertical (p1 = pitch, p2 = gauge), so both spacings meet 2.4 d0; t is the
    # thinner outer connected part (note 3): the web plates, the beam web being the middle ply.
    p_v = g.p_w if g.n_r > 1 else None
    p_h = g.g_w if g.n_c > 1 else None
    _safe(out, S.check_spacing, fid="web_spacing", ftitle="Web bolts spacing", fclause="EN 1993-1-8:2005, 3.5, Table 3.3",
          d_0=d0, t=g.t_wp, e_1=g.e1_w, e_2=g.e_v, p_1=p_h, p_2=p_v, exposed=spec.exposed,
          compression=True, calc=calc, id="web_spacing_x", where="Web, horizontal load", location_mm=loc)
    if p_v is not None or p_h is not None:
        _safe(out, S.check_spacing, fid="web_spacing", ftitle="Web bolts spacing",
              fclause="EN 1993-1-8:2005, 3.5, Table 3.3", d_0=d0, t=g.t_wp, p_1=p_v, p_2=p_h, exposed=spec.exposed,
              compression=True, calc=calc, id="web_spacing_z", where="Web, vertical load", location_mm=loc)
    V = abs(forces.V_Ed)
    _safe(out, P.check_plate_shear, fid="web_plate_shear", ftitle="Web plates: shear", fclause="EN 1993-1-1:2005, 6.2.6",
          V_Ed=V / 2, h=g.h_wp, t=g.t_wp, grade=pg, n_holes=g.n_r, d_0=d0, na=na, calc=calc,
          id="web_plate_shear", title="Web plate (each of 2): shear, gross and net", location_mm=loc)
    e_v_bt = g.e_v
    try:
        ba = P.block_tearing_areas(t=g.t_wp, d_0=d0, n_1=g.n_r, e_1=e_v_bt, p_1=g.p_w if g.n_r > 1 else 0.0,
                                   n_2=g.n_c, e_2=g.e1_w, p_2=g.g_w if g.n_c > 1 else 0.0, pattern="one_side")
        _safe(out, P.check_block_tearing, fid="web_plate_block", ftitle="Web plates: block tearing",
              fclause="EN 1993-1-8:2005, 3.10.2(3), Eq. 3.10", F_Ed=V / 2, A_nt=ba.A_nt, A_nv=ba.A_nv, grade=pg,
              t=g.t_wp, eccentric=True, na=na, calc=calc, id="web_plate_block",
              title="Web plate (each of 2): block tearing under shear", location_mm=loc)
    except InputError as e:
        out.append(_fail("web_plate_block", "Web plates: block tearing", "EN 1993-1-8:2005, 3.10.2(3), Eq. 3.10", e, loc))
    M_pl = abs(forces.M_w_Ed) + V * (spec.gap / 2 + g.e1_w)
    try:
        fy_p = mat_p.f_y
        V_pl = calc(P.V_Rd_g, A_v=g.h_wp * g.t_wp, f_y=fy_p, gamma_M0=na.gamma_M0)
        rho = calc(rho_V, V_Ed=V / 2, V_pl_Rd=V_pl)
        W_n = calc(W_el_net_plate, t=g.t_wp, h=g.h_wp, n_r=g.n_r, d_0=d0, p=g.p_w if g.n_r > 1 else 0.0)
        if W_n <= 0.0:
            raise InputError("web plate", g.h_wp, "a plate deeper than its holes")
        M_Rd = calc(P.M_V_Rd_el, rho=rho, W_el=W_n, f_y=fy_p, gamma_M0=na.gamma_M0)
        calc.keep("W_el_net", W_n, "mm3")
        calc.keep("rho", rho)
        out.append(calc.record(id="web_plate_bending", title="Web plate (each of 2): in-plane bending at the first "
                               "bolt column, net section, with shear", clause="EN 1993-1-1:2005, 6.2.8(3)",
                               demand=M_pl / 2, resistance=M_Rd, unit="Nmm", location_mm=loc,
                               note="M = (M_w + V (gap/2 + e1))/2 per plate; W_el,net; f_y reduced by (1 - rho)"))
        N_p = abs(forces.N_w_Ed) / 2
        if N_p > 0.0:
            # the web plates also carry the web's axial share: linear interaction, EN 1993-1-1 6.2.1(7)
            A_g = g.h_wp * g.t_wp
            N_Rd = calc(P.N_pl_Rd, A=A_g, f_y=fy_p, gamma_M0=na.gamma_M0)
            if forces.N_w_Ed > 0.0:     # tension: net section at the bolt column (holes filled in compression)
                N_u = calc(P.N_u_Rd, A_net=P.A_net_plate(b=g.h_wp, t=g.t_wp, n=g.n_r, d_0=d0), f_u=mat_p.f_u,
                           gamma_M2=na.gamma_M2_member)
                N_Rd = min(N_Rd, N_u)
            if N_Rd <= 0.0 or M_Rd <= 0.0:
                raise InputError("web plate", (N_Rd, M_Rd), "positive axial and bending resistances")
            U = calc(U_NM, N_Ed=N_p, N_Rd=N_Rd, M_Ed=M_pl / 2, M_Rd=M_Rd)
            out.append(calc.record(id="web_plate_bending_axial", title="Web plate (each of 2): bending with the "
                                   "web's axial force", clause="EN 1993-1-1:2005, 6.2.1(7), Eq. 6.2", demand=U,
                                   resistance=1.0, unit="", location_mm=loc,
                                   note="N_w/2 per plate; N_Rd gross (net f_u in tension); M_Rd as above"))
    except InputError as e:
        fid = "web_plate_bending_axial" if any(r.id == "web_plate_bending" for r in out) else "web_plate_bending"
        out.append(_fail(fid, "Web plates: bending", "EN 1993-1-1:2005, 6.2.8(3)", e, loc))
    return out


# ======================================================================== member at the splice
def _member_records(section, grade: str, bolt, g: Geometry, spec, forces, na: NationalAnnex, calc: Calc,
                    loc=None, group: str | None = None) -> list[CheckRecord]:
    """The beam at the splice: tension flange net of holes for the flange force (6.2.3), bending with
    flange holes (6.2.5(4)), shear, web net shear, axial block tearing of the web.

    Each record is tagged ``flange`` or ``web``: the group of the layout it depends on."""
    from ...members import check_bending


    fl: list[CheckRecord] = []
    wb: list[CheckRecord] = []
    d0 = bolt.d_0
    cols = 2 if g.p2o_f == 0 else 4
    def web_holes() -> list[CheckRecord]:
        cls = _section_class(section, grade)
        out_: list[CheckRecord] = []
        _safe(out_, check_web_holes_bending, fid="beam_bending_web_holes", ftitle="Beam at the splice: bending with "
              "web holes (6.2.5(5))", fclause=CL_WEB_HOLES, section=section, grade=grade, g=g, forces=forces, na=na,
              calc=calc, d0=d0, cls=cls, loc=loc)
        return out_

    if group == TAG_WEB:
        return _tag(_member_web(section, grade, g, forces, na, calc, loc, d0) + web_holes(), TAG_WEB)
    A_f_net = P.A_net_plate(b=section.b, t=section.tf, n=cols, d_0=d0)
    # the beam's own tension flange, net of its holes, for the flange force the splice design assumes
    # (same moment split and lever arm as the bolts; taken at the outermost flange bolt row)
    _safe(fl, P.check_plate_tension, fid="beam_flange_net", ftitle="Beam tension flange at the splice: net section",
          fclause="EN 1993-1-1:2005, 6.2.3", N_Ed=forces.F_f_Ed, b=section.b, t=section.tf, grade=grade,
          n_holes=cols, d_0=d0, category_C=spec.category == "C", na=na, calc=calc, id="beam_flange_net",
          title="Beam tension flange at the splice: gross and net section (6.2.3) for F_f,Ed", location_mm=loc)
    if fl and fl[-1].id == "beam_flange_net":
        fl[-1] = replace(fl[-1], note=fl[-1].note + "; F_f,Ed from the stiffness split of the moment at the outermost "
                         "flange bolt row (M + V a), the force the flange bolts are designed for")
    if A_f_net <= 0:
        fl.append(_fail("beam_bending_holes", "Beam at the splice: bending with flange holes",
                        "EN 1993-1-1:2005, 6.2.5(4)", InputError("flange holes", cols * d0, "less than b"), loc))
    else:
        _safe(fl, check_bending, fid="beam_bending_holes", ftitle="Beam at the splice: bending with flange holes",
              fclause="EN 1993-1-1:2005, 6.2.5(4)", section=section, grade=grade, M_Ed=forces.M_f_Ed, na=na,
              calc=calc, A_f_net=A_f_net, location_mm=loc)
        fl[-1] = _retitle(fl[-1], "beam_bending_holes", "Beam at the splice: bending with tension-flange holes (6.2.5(4))")
    if group == TAG_FLANGE:
        return _tag(fl, TAG_FLANGE) + _tag(web_holes(), TAG_WEB)
    return _tag(fl, TAG_FLANGE) + _tag(_member_web(section, grade, g, forces, na, calc, loc, d0) + web_holes(), TAG_WEB)


def _section_class(section, grade: str) -> int:
    """Cross-section class in bending (the members layer's public classification)."""
    from ...members.checks import section_class
    return section_class(section, grade)


def check_web_holes_bending(section, grade: str, g: Geometry, forces, na: NationalAnnex, calc: Calc, d0: float,
                            cls: int, loc=None) -> CheckRecord:
    """Beam at the splice: bending with the holes of the complete tension zone, EN 1993-1-1 6.2.5(5):
    web holes in the tension zone may be ignored only when Eq. 6.16 (6.2.5(4)) is met for the tension
    flange plus the web's tension zone; else the zone is reduced to the area that meets it. The section
    is taken through one web bolt column with the flange holes (both at the splice); the moment is the
    largest of those at the joint line, the outermost flange row and the outermost web column."""
    from ...members import en1993_1_1 as f11
    fy, fu = steel(grade, section.tf).f_y, steel(grade, section.tf).f_u
    cols = 2 if g.p2o_f == 0 else 4
    n_w = g.n_r // 2                                  # web rows above mid-depth (a row at mid-depth is not in tension)
    At = calc(A_tz, b=section.b, t_f=section.tf, h=section.h, t_w=section.tw)
    At_net = calc(A_tz_net, A_tz=At, n_f=cols, d_0=d0, t_f=section.tf, n_w=n_w, t_w=section.tw)
    N_u = calc(f11.N_u_Rd, A_net=At_net, f_u=fu, gamma_M2=na.gamma_M2_member)
    N_pl = calc(f11.N_pl_Rd, A=At, f_y=fy, gamma_M0=na.gamma_M0)
    plastic = cls <= 2
    if N_u >= N_pl:
        calc.note("Eq. 6.16 met for the complete tension zone: the web holes need not be allowed for (6.2.5(5)).")
        W = section.Wpl_y if plastic else section.Wel_y
        how = "holes ignored (Eq. 6.16 met for flange + web tension zone)"
    else:
        calc.note("Eq. 6.16 not met for the complete tension zone: the zone is reduced to the area that meets it.")
        yt = calc(y_tz, b=section.b, t_f=section.tf, h=section.h, t_w=section.tw, A_tz=At)
        if plastic:
            W = calc(W_pl_y_tz_net, W_pl_y=section.Wpl_y, A_tz=At, A_tz_net=At_net, f_u=fu, f_y=fy,
                     gamma_M0=na.gamma_M0, gamma_M2=na.gamma_M2_member, y_tz=yt, t_w=section.tw)
        else:
            calc.note("Class 3: the elastic modulus with the tension zone's deficit taken off at its centroid "
                      "($\\Delta A_{f}$ below is the zone's deficit, $y_{f}$ its centroid $y_{tz}$).")
            A_eff = calc(f11.A_f_eff, A_f_net=At_net, f_u=fu, f_y=fy, gamma_M0=na.gamma_M0,
                         gamma_M2=na.gamma_M2_member)
            W = calc(f11.W_el_y_net, I_y=section.Iy, A=section.A, Delta_A_f=At - A_eff, y_f=yt, h=section.h)
        how = "tension zone reduced for its holes (Eq. 6.16 not met)"
    M_Rd = calc(f11.M_c_Rd, W_y=W, f_y=fy, gamma_M0=na.gamma_M0)
    calc.keep("A_tz_net", At_net, "mm2")
    calc.keep("W_y", W, "mm3")
    M_Ed = max(abs(forces.M_f_Ed), abs(forces.M_w_a_Ed), abs(forces.M_j_Ed))
    return calc.record(id="beam_bending_web_holes", title="Beam at the splice: bending with the holes of the "
                       "whole tension zone, flange and web (6.2.5(5))", clause=CL_WEB_HOLES, demand=M_Ed,
                       resistance=M_Rd, unit="Nmm", location_mm=loc,
                       note=f"{cols} flange holes and {n_w} web hole(s) above mid-depth, d0 = {d0:g} mm; {how}; "
                            "M the largest of the group moments (outermost flange row)")


def _member_web(section, grade, g, forces, na, calc, loc, d0) -> list[CheckRecord]:
    """The beam web at the splice: shear, net shear at the web bolts, block tearing under axial tension."""
    from ...members import check_shear
    from ..connections.formulas import A_v_net_web
    wb: list[CheckRecord] = []
    _safe(wb, check_shear, fid="beam_shear", ftitle="Beam at the splice: shear", fclause="EN 1993-1-1:2005, 6.2.6",
          section=section, grade=grade, V_Ed=abs(forces.V_Ed), na=na, calc=calc, location_mm=loc)
    wb[-1] = _retitle(wb[-1], "beam_shear", "Beam at the splice: shear (gross)")
    mat = steel(grade, section.tw)
    A_vn = A_v_net_web(A_v=section.Av_z, n_1=g.n_r, d_0=d0, t_w=section.tw)
    if A_vn > 0:
        A_vn = calc(A_v_net_web, A_v=section.Av_z, n_1=g.n_r, d_0=d0, t_w=section.tw)
        V_n = calc(P.V_Rd_n, A_v_net=A_vn, f_u=mat.f_u, gamma_M2=na.gamma_M2_member)
        calc.keep("A_v_net", A_vn, "mm2")
        wb.append(calc.record(id="beam_web_net_shear", title="Beam web at the splice: net shear",
                              clause="EN 1993-1-1:2005, 6.2.6(7)", demand=abs(forces.V_Ed), resistance=V_n, unit="N",
                              location_mm=loc, note=f"A_v,net = A_v - {g.n_r} d0 t_w"))
    else:
        wb.append(_fail("beam_web_net_shear", "Beam web at the splice: net shear", "EN 1993-1-1:2005, 6.2.6(7)",
                        InputError("web holes", g.n_r * d0, "less than the shear depth"), loc))
    if forces.N_w_Ed > 0.0 and g.n_r > 1:
        # block pulled out between the top and bottom web bolt rows: load along the beam (n_1 = columns)
        try:
            ba = P.block_tearing_areas(t=section.tw, d_0=d0, n_1=g.n_c, e_1=g.e1_w, p_1=g.g_w if g.n_c > 1 else 0.0,
                                       n_2=g.n_r, e_2=g.e_v, p_2=g.p_w, pattern="inner")
            _safe(wb, P.check_block_tearing, fid="beam_web_block", ftitle="Beam web: block tearing (axial)",
                  fclause="EN 1993-1-8:2005, 3.10.2(2), Eq. 3.9", F_Ed=forces.N_w_Ed, A_nt=ba.A_nt, A_nv=ba.A_nv,
                  grade=grade, t=section.tw, eccentric=False, na=na, calc=calc, id="beam_web_block",
                  title="Beam web: block tearing under the web's axial tension", location_mm=loc)
        except InputError:
            pass                     # no positive block: the web cannot tear out between the rows
    return wb


def flange_records(*args, **kw) -> list[CheckRecord]:
    """Flange bolts, flange cover plates and the beam flange, tagged ``flange``
    (spacing records also ``detailing``); see :func:`_flange_records`."""
    recs = _tag(_flange_records(*args, **kw), TAG_FLANGE)
    _tag([r for r in recs if "spacing" in r.id or "outstand" in r.id], TAG_DETAILING)
    return recs


def web_records(*args, **kw) -> list[CheckRecord]:
    """Web bolts, web plates and the beam web, tagged ``web`` (spacing also ``detailing``);
    see :func:`_web_records`."""
    recs = _tag(_web_records(*args, **kw), TAG_WEB)
    _tag([r for r in recs if "spacing" in r.id], TAG_DETAILING)
    return recs


def member_records(*args, **kw) -> list[CheckRecord]:
    """The beam at the splice, tagged ``member`` and ``flange`` or ``web`` by the group whose layout
    it depends on (``group="flange"`` / ``"web"``: only that group's checks); see :func:`_member_records`."""
    return _tag(_member_records(*args, **kw), TAG_MEMBER)


def _retitle(rec: CheckRecord, id: str, title: str) -> CheckRecord:
    from dataclasses import replace
    return replace(rec, id=id, title=title)


__all__ = ["U_NM", "W_el_net_plate", "detailing_records", "flange_records", "web_records", "member_records", "web_bolt_bearing"]
