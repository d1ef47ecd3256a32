"""Fin plate: resistance checks (vertical shear and structural-integrity tying).

The plate is welded to the existing member and bolted to the beam web with one
vertical line of n_1 bolts at distance z from the weld. Checks (detailing in :mod:`.detail`):

Shear V_Ed
    * bolt group with the eccentricity z, elastic method, vector sum on the most loaded bolt
      (EN 1993-1-8:2005, 3.7 and Table 3.4): bolt shear; bearing on the plate and on the beam web
      with the two components combined as sqrt((F_ver/F_b,ver)^2 + (F_hor/F_b,hor)^2) <= 1
      (the package's one convention, linear in the load: :func:`splicecalc.joints.bolts.U_b_2d`)
      (published simple-joint guidance, from memory);
    * fin plate shear gross (1.27) / net, block tearing (Eq. 3.10);
    * fin plate bending V z <= W_el f_y/gamma_M0, required only when h_p < 2.73 z, and
      lateral-torsional buckling of a long plate (z > t_p/0.15), both published guidance (from memory);
    * beam web: shear gross and net at the bolt line; block tearing when the beam is notched;
    * welds to the support: full strength for the plate, EN 1993-1-8:2005, 4.5.3.2 (two fillets
      developing t_p f_y/gamma_M0 transversely: a >= beta_w gamma_M2 f_y t_p / (sqrt 2 f_u gamma_M0)).

Tying (gamma_Mu; published guidance, from memory)
    * bolt shear and bearing (plate and beam web) in the direction of the beam; the bearing is
      capped at 1.5 f_u d t / gamma_Mu (single lap, one bolt row across the load, EN 1993-1-8:2005,
      3.6.1(10));
    * plate and beam web net tension; block tearing of plate and web.
"""

from __future__ import annotations

from dataclasses import replace

from ...core.record import Calc, CheckRecord, not_checked
from ...materials.steel import steel
from ...members.en1993_1_1 import V_pl_Rd
from ..bolts import BEARING_2D_CONVENTION, BEARING_2D_GUIDANCE, F_b_Rd_lap, F_r_Ed, F_v_Rd, U_b_2d, bearing_resistance, shear_factor_alpha_v
from .. import bolts as _bolts
from ..plates import (M_c_Rd, V_Rd_n, W_el_plate, block_tearing_areas, check_block_tearing, check_plate_shear,
                      check_plate_tension)
from ..welds import check_full_strength_fillet
from .detail import GUIDANCE, Context, Detail, weld_grade_existing
from .formulas import (A_tee, A_v_net_web, A_v_tee, F_hor_Ed, F_ver_Ed, V_Rd_M,
                       V_Rd_fin_LTB, f_p_LT, lambda_LT_fin)

NOTE_TIE = "tying: gamma_Mu in place of gamma_M2 (published simple-joint guidance, from memory)"
NOTE_LAP = ("single-lap joint with one bolt row across the tie force: F_b,Rd <= 1.5 f_u d t / gamma "
            "(EN 1993-1-8 3.6.1(10)), and washers under both the bolt head and the nut")


def web_end_distance_vertical(ctx: Context, det: Detail) -> float | None:
    """Vertical distance (mm) from the top bolt to the top edge of the web of a notched beam; None if not notched."""
    if not ctx.notched:
        return None
    return det.top + det.e_1 - ctx.notch_depth


def _bearing_2d(calc: Calc, F_ver: float, Fb_ver: float, F_hor: float, Fb_hor: float) -> float:
    """Utilisation of a bolt bearing in two directions; +inf when a bearing resistance is nil (a distance
    below the Table 3.3 minima, where Table 3.4 gives 0): the check then fails instead of dividing by zero."""
    if Fb_ver <= 0.0 or Fb_hor <= 0.0:
        calc.note("A bearing resistance is 0 (spacing below the Table 3.3 minima): the check fails.")
        return float("inf")
    return calc(U_b_2d, F_x_Ed=F_hor, F_b_x_Rd=Fb_hor, F_z_Ed=F_ver, F_b_z_Rd=Fb_ver)


def _lap_capped(calc: Calc, F_b: float, f_u: float, d: float, t: float, gamma: float) -> float:
    """Bearing of a bolt in a single-lap joint with one bolt row across the load, capped at
    1.5 f_u d t / gamma (EN 1993-1-8:2005, 3.6.1(10), Eq. 3.2)."""
    return min(F_b, calc(F_b_Rd_lap, f_u=f_u, d=d, t=t, gamma_M2=gamma))


def fin_plate_checks(ctx: Context, det: Detail, V_Ed: float, calc: Calc) -> list[CheckRecord]:
    """Resistance checks of a fin plate for shear V_Ed (N) and the tying force ctx.tie (N)."""
    na, beam, b = ctx.na, ctx.beam, det.bolt
    fy_b, fu_b = ctx.beam_mat.f_y, ctx.beam_mat.f_u
    plate = steel(det.plate_grade, det.t_p)
    d0 = b.d_0
    z = det.z
    out: list[CheckRecord] = []
    e1b = web_end_distance_vertical(ctx, det)

    # bolt group forces (elastic, eccentricity z)
    n = det.n_1
    I_p = calc(_bolts.I_p, n_r=n, n_c=1, p_1=det.p_1, p_2=0.0)
    y_max = (n - 1) * det.p_1 / 2.0
    F_ver = calc(F_ver_Ed, V_Ed=V_Ed, n=n, z=z, I_p=I_p, x_max=0.0)
    F_hor = calc(F_hor_Ed, V_Ed=V_Ed, z=z, I_p=I_p, y_max=y_max)
    F_res = calc(F_r_Ed, F_x_Ed=F_hor, F_z_Ed=F_ver)
    a_v = shear_factor_alpha_v(b.bolt_class)
    Fv = calc(F_v_Rd, alpha_v=a_v, f_ub=b.f_ub, A_s=b.A_s, gamma_M2=na.gamma_M2)
    calc.keep("F_ver", F_ver, "N")
    calc.keep("F_hor", F_hor, "N")
    out.append(calc.record(id="fp_bolt_shear", title="Bolt shear, most loaded bolt (eccentricity z)",
                           clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=F_res, resistance=Fv, unit="N",
                           note=f"elastic bolt group, M = V_Ed z with z = {z:g} mm; single shear"))
    # bearing on the plate
    Fb_v = bearing_resistance(b, det.t_p, plate.f_u, det.e_1, det.e_2, det.p_1, None, gamma_M2=na.gamma_M2,
                              calc=calc)
    Fb_h = bearing_resistance(b, det.t_p, plate.f_u, det.e_2, det.e_1, None, det.p_1, gamma_M2=na.gamma_M2,
                              calc=calc)
    U_p = _bearing_2d(calc, F_ver, Fb_v, F_hor, Fb_h)
    calc.keep("F_b_ver_Rd", Fb_v, "N")
    calc.keep("F_b_hor_Rd", Fb_h, "N")
    out.append(calc.record(id="fp_bearing_plate", title="Bolt bearing on the fin plate (two directions)",
                           clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=U_p, resistance=1.0, unit="",
                           note=BEARING_2D_CONVENTION, guidance=BEARING_2D_GUIDANCE))
    # bearing on the beam web
    Fbw_v = bearing_resistance(b, beam.tw, fu_b, e1b, det.e_2b, det.p_1, None, gamma_M2=na.gamma_M2, calc=calc)
    Fbw_h = bearing_resistance(b, beam.tw, fu_b, det.e_2b, e1b, None, det.p_1, gamma_M2=na.gamma_M2, calc=calc)
    U_w = _bearing_2d(calc, F_ver, Fbw_v, F_hor, Fbw_h)
    calc.keep("F_b_ver_Rd", Fbw_v, "N")
    calc.keep("F_b_hor_Rd", Fbw_h, "N")
    out.append(calc.record(id="fp_bearing_web", title="Bolt bearing on the beam web (two directions)",
                           clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=U_w, resistance=1.0, unit="",
                           note=BEARING_2D_CONVENTION, guidance=BEARING_2D_GUIDANCE))

    # fin plate shear, block tearing, bending, LTB
    out.append(check_plate_shear(V_Ed, det.h_p, det.t_p, det.plate_grade, n_holes=n, d_0=d0, k_v=1.27, na=na,
                                 calc=calc, id="fp_plate_shear", title="Fin plate shear, gross (1.27) and net"))
    blk = block_tearing_areas(det.t_p, d0, n, det.e_1, det.p_1, 1, det.e_2, pattern="one_side")
    out.append(check_block_tearing(V_Ed, blk.A_nt, blk.A_nv, det.plate_grade, det.t_p, eccentric=True, na=na,
                                   calc=calc, id="fp_plate_block", title="Fin plate block tearing"))
    W = calc(W_el_plate, t=det.t_p, h=det.h_p)
    M = calc(M_c_Rd, W_y=W, f_y=plate.f_y, gamma_M0=na.gamma_M0)
    V_M = calc(V_Rd_M, M_c_Rd=M, z=z)
    V_bend = V_M
    long_plate = z > det.t_p / 0.15
    note = (f"h_p = {det.h_p:g} mm {'>=' if det.h_p >= 2.73 * z else '<'} 2.73 z = {2.73 * z:g} mm: "
            + ("bending cannot govern (published guidance, from memory); shown for completeness"
               if det.h_p >= 2.73 * z else "bending check required"))
    if long_plate:
        lam = calc(lambda_LT_fin, z=z, h_p=det.h_p, t_p=det.t_p)
        f_LT = calc(f_p_LT, lambda_LT=lam, p_y=plate.f_y)
        V_LT = calc(V_Rd_fin_LTB, W_el=W, f_pLT=f_LT, z=z, gamma_M1=na.gamma_M1)
        calc.keep("lambda_LT", lam)
        calc.keep("V_Rd_LTB", V_LT, "N")
        V_bend = min(V_M, V_LT)
        note += f"; long fin plate z > t_p/0.15 = {det.t_p / 0.15:.1f} mm: lateral-torsional buckling checked " \
                "(BS 5950-1 plate strength, from memory)"
    calc.keep("V_Rd_M", V_M, "N")
    out.append(calc.record(id="fp_plate_bending", title="Fin plate bending (and LTB of a long plate)",
                           clause="EN 1993-1-1:2005, 6.2.5(2), Eq. 6.14", demand=V_Ed, resistance=V_bend, unit="N",
                           note=note, guidance=GUIDANCE + ": moment V z at the bolt line, the 2.73 z rule and the "
                                               "long-plate LTB check (BS 5950-1 plate strength)"))

    # beam web shear at the bolt line (unnotched; the notched case is covered by the notch checks)
    if not ctx.notched:
        V_g = calc(V_pl_Rd, A_v=beam.Av_z, f_y=fy_b, gamma_M0=na.gamma_M0)
        A_vn = calc(A_v_net_web, A_v=beam.Av_z, n_1=n, d_0=d0, t_w=beam.tw)
        V_n = calc(V_Rd_n, A_v_net=A_vn, f_u=fu_b, gamma_M2=na.gamma_M2_member)
        calc.keep("V_pl_Rd", V_g, "N")
        calc.keep("V_Rd_n", V_n, "N")
        out.append(calc.record(id="fp_web_shear", title="Beam web shear at the bolt line, gross and net",
                               clause="EN 1993-1-1:2005, 6.2.6(7)", demand=V_Ed, resistance=min(V_g, V_n), unit="N"))
    elif ctx.notch_bottom:
        out.append(not_checked(id="fp_web_shear_net", title="Notched beam web: net shear and block tearing at the "
                               "bolt line (double notch)", clause="EN 1993-1-1:2005, 6.2.6(7)",
                               reason="the beam is notched at both flanges: the net shear of the web rectangle less "
                                      "the holes and the block tearing of the web are not implemented for a fin "
                                      "plate; check by hand (EN 1993-1-8 3.10.2) or use an end plate"))
    else:
        h_T = beam.h - ctx.notch_depth
        A_T = calc(A_tee, h_T=h_T, t_w=beam.tw, b=beam.b, t_f=beam.tf)
        A_vN = calc(A_v_tee, A_T=A_T, b=beam.b, t_f=beam.tf, t_w=beam.tw, r=beam.r)
        A_vn = calc(A_v_net_web, A_v=A_vN, n_1=n, d_0=d0, t_w=beam.tw)
        V_n = calc(V_Rd_n, A_v_net=A_vn, f_u=fu_b, gamma_M2=na.gamma_M2_member)
        calc.keep("A_v_N_net", A_vn, "mm2")
        out.append(calc.record(id="fp_web_shear_net", title="Notched beam web: net shear at the bolt line",
                               clause="EN 1993-1-1:2005, 6.2.6(7)", demand=V_Ed, resistance=V_n, unit="N",
                               note="tee shear area at the notch less the bolt holes, f_u/(sqrt 3 gamma_M2)"))
        blk_w = block_tearing_areas(beam.tw, d0, n, e1b, det.p_1, 1, det.e_2b, pattern="one_side")
        out.append(check_block_tearing(V_Ed, blk_w.A_nt, blk_w.A_nv, ctx.beam_grade, beam.tw, eccentric=True,
                                       na=na, calc=calc, id="fp_web_block",
                                       title="Beam web block tearing (notched beam)"))

    # welds to the support: full strength for the fin plate
    ex_grade = weld_grade_existing(ctx)
    w = check_full_strength_fillet(det.weld_leg, det.t_p, det.plate_grade, grade_other=ex_grade, t_other=ctx.t_supp,
                                   na=na, calc=calc, id="fp_weld_full_strength",
                                   title="Welds to the support: full strength for the fin plate")
    if ctx.existing_mat.historic:
        w = replace(w, note=w.note + f"; existing {ctx.existing_mat.label} (f_u = {ctx.existing_mat.f_u:g} MPa) "
                                     f"taken as {ex_grade} for f_u and beta_w (lower bound, EN 1993-1-8 4.5.3.2(6)); "
                                     "weldability of the old steel to be confirmed")
    out.append(w)

    # tying
    with calc.symbols(gamma_M2="gamma_Mu", gamma_M="gamma_Mu"):      # tying: gamma_Mu, never labelled gamma_M2
        gMu = na.gamma_Mu
        T1 = ctx.tie / n
        Fv_u = calc(F_v_Rd, alpha_v=a_v, f_ub=b.f_ub, A_s=b.A_s, gamma_M2=gMu)
        out.append(calc.record(id="fp_tie_bolts", title="Tying: bolt shear", clause="EN 1993-1-8:2005, 3.6.1, Table 3.4",
                               demand=T1, resistance=Fv_u, unit="N", note=NOTE_TIE, guidance=GUIDANCE + ": tying"))
        Fbp_u = bearing_resistance(b, det.t_p, plate.f_u, det.e_2, det.e_1, None, det.p_1, gamma_M2=gMu, calc=calc)
        Fbp_u = _lap_capped(calc, Fbp_u, plate.f_u, b.d, det.t_p, gMu)
        out.append(calc.record(id="fp_tie_bearing_plate", title="Tying: bolt bearing on the fin plate",
                               clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=T1, resistance=Fbp_u, unit="N",
                               note=NOTE_TIE + "; " + NOTE_LAP, guidance=GUIDANCE + ": tying"))
        Fbw_u = bearing_resistance(b, beam.tw, fu_b, det.e_2b, e1b, None, det.p_1, gamma_M2=gMu, calc=calc)
        Fbw_u = _lap_capped(calc, Fbw_u, fu_b, b.d, beam.tw, gMu)
        out.append(calc.record(id="fp_tie_bearing_web", title="Tying: bolt bearing on the beam web",
                               clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=T1, resistance=Fbw_u, unit="N",
                               note=NOTE_TIE + "; " + NOTE_LAP, guidance=GUIDANCE + ": tying"))
        out.append(check_plate_tension(ctx.tie, det.h_p, det.t_p, det.plate_grade, n_holes=n, d_0=d0, gamma_M2=gMu,
                                       na=na, calc=calc, id="fp_tie_plate_tension",
                                       title="Tying: fin plate in tension, gross and net"))
        out.append(check_plate_tension(ctx.tie, det.h_p, beam.tw, ctx.beam_grade, n_holes=n, d_0=d0, gamma_M2=gMu,
                                       na=na, calc=calc, id="fp_tie_web_tension",
                                       title="Tying: beam web in tension over h_p, gross and net"))
        if n > 1:
            blk_t = block_tearing_areas(det.t_p, d0, 1, det.e_2, 0.0, n, det.e_1, det.p_1, pattern="inner")
            blk_o = block_tearing_areas(det.t_p, d0, 1, det.e_2, 0.0, n, det.e_1, det.p_1, pattern="outer")
            worst = min((blk_t, blk_o), key=lambda a: 0.5 * a.A_nt * plate.f_u + a.A_nv * plate.f_y / 3 ** 0.5)
            out.append(check_block_tearing(ctx.tie, worst.A_nt, worst.A_nv, det.plate_grade, det.t_p, gamma_M2=gMu,
                                           na=na, calc=calc, id="fp_tie_plate_block",
                                           title=f"Tying: fin plate block tearing ({worst.pattern} block)"))
            blk_w = block_tearing_areas(beam.tw, d0, 1, det.e_2b, 0.0, n, det.e_2b, det.p_1, pattern="inner")
            out.append(check_block_tearing(ctx.tie, blk_w.A_nt, blk_w.A_nv, ctx.beam_grade, beam.tw, gamma_M2=gMu,
                                           na=na, calc=calc, id="fp_tie_web_block",
                                           title="Tying: beam web block tearing (inner block)"))
    return out


__all__ = ["fin_plate_checks", "web_end_distance_vertical", "NOTE_TIE", "NOTE_LAP"]
