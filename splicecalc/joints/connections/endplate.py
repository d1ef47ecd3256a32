"""Partial-depth end plate: resistance checks (vertical shear and structural-integrity tying).

The plate is welded to both sides of the beam web and bolted with two vertical lines
of bolts to the existing member. Checks (the detailing rules are in :mod:`.detail`):

Shear V_Ed
    * beam web shear over the plate depth: A_v = 0.9 h_p t_w (published simple-joint guidance,
      from memory), V_pl,Rd of EN 1993-1-1:2005, 6.2.6, Eq. 6.18;
    * bolt group: EN 1993-1-8:2005, 3.7(1) with 0.8 F_v,Rd in place of F_v,Rd (the 0.8 allowance
      for coexisting tension is published simple-joint guidance, from memory; it reduces bolt
      shear, not bearing) and per bolt F_b,Rd = min(F_b,Rd plate, F_b,Rd support), Table 3.4:
      sum of F_b,Rd when 0.8 F_v,Rd >= every F_b,Rd, else n_b x the smallest resistance;
    * end plate shear, gross (with 1.27) and net, per side of the web (two planes);
    * end plate block tearing per side, Eq. 3.10;
    * fillet welds to the beam web: full strength for the web, and the resistance per mm vs V_Ed.

Tying (gamma_Mu, f_u for f_y; published guidance, from memory)
    * end plate T-stub, modes 1, 2, 3 of EN 1993-1-8:2005, 6.2.4.1, Table 6.2, with sum l_eff = h_p;
    * beam web in tension over h_p.
"""

from __future__ import annotations

from ...core.record import Calc, CheckRecord
from ...materials.steel import steel
from ...members.en1993_1_1 import V_pl_Rd
from ..bolts import F_Rd_group, F_t_Rd, F_v_Rd, bearing_resistance, shear_factor_alpha_v
from ..plates import block_tearing_areas, check_block_tearing, check_plate_shear
from ..welds import a_throat, check_fillet_weld, check_full_strength_fillet
from .detail import GUIDANCE, Context, Detail
from .formulas import (A_v_hp, F_T_1_Rd, F_T_2_Rd, F_t_wb_Rd_u, F_v_Rd_ep, M_pl_Rd_u, m_ep, n_tstub)

NOTE_08 = ("group rule of EN 1993-1-8 3.7(1) with 0.8 F_v,Rd in place of F_v,Rd: the 0.8 allows for tension "
           "coexisting in the bolts; bearing per bolt is the weaker "
           "of the end plate and the existing member")
NOTE_TIE = ("tying: f_u in place of f_y and gamma_Mu in place of gamma_M0/gamma_M2, sum l_eff = h_p "
            "(simplified T-stub as in published simple-joint guidance, from memory)")


def support_bearing(ctx: Context, det: Detail, gamma_M2: float, calc: Calc) -> float:
    """F_b,Rd of one bolt in the existing member (N): all bolts treated as inner rows (continuous member)."""
    b = det.bolt
    ex = ctx.existing
    e_1 = None if det.n_1 > 1 else 3.0 * b.d_0
    p_1 = det.p_1 if det.n_1 > 1 else None
    e_2 = (ex.b - det.p_3) / 2.0 if ctx.face == "column flange" else None
    if e_2 is not None and e_2 <= 0.0:
        e_2 = 0.5 * b.d_0  # bolts off the flange: a bearing of (almost) nothing, the fit check fails anyway
    with calc.symbols(p_2="p_3"):          # the end-plate gauge is p_3 on the drawing and in the rules
        return bearing_resistance(b, ctx.t_supp, ctx.existing_mat.f_u, e_1, e_2, p_1, det.p_3, gamma_M2=gamma_M2,
                                  calc=calc)


def end_plate_checks(ctx: Context, det: Detail, V_Ed: float, calc: Calc) -> list[CheckRecord]:
    """Resistance checks of a partial-depth end plate for shear V_Ed (N) and the tying force ctx.tie (N)."""
    na, beam, b = ctx.na, ctx.beam, det.bolt
    fy_b, fu_b = ctx.beam_mat.f_y, ctx.beam_mat.f_u
    plate = steel(det.plate_grade, det.t_p)
    out: list[CheckRecord] = []

    # beam web shear over h_p
    A_v = calc(A_v_hp, h_p=det.h_p, t_w=beam.tw)
    V_w = calc(V_pl_Rd, A_v=A_v, f_y=fy_b, gamma_M0=na.gamma_M0)
    calc.keep("A_v", A_v, "mm2")
    out.append(calc.record(id="ep_web_shear", title="Beam web shear over the end plate depth",
                           clause="EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18", demand=V_Ed, resistance=V_w, unit="N",
                           note="A_v = 0.9 h_p t_w", guidance=GUIDANCE))

    # bolt group
    a_v = shear_factor_alpha_v(b.bolt_class)
    Fv = calc(F_v_Rd, alpha_v=a_v, f_ub=b.f_ub, A_s=b.A_s, gamma_M2=na.gamma_M2)
    with calc.symbols(p_2="p_3"):          # the end-plate gauge is p_3 on the drawing and in the rules
        Fb_end = bearing_resistance(b, det.t_p, plate.f_u, det.e_1, det.e_2, None, det.p_3, gamma_M2=na.gamma_M2,
                                    calc=calc)
        Fb_in = (bearing_resistance(b, det.t_p, plate.f_u, None, det.e_2, det.p_1, det.p_3, gamma_M2=na.gamma_M2,
                                    calc=calc) if det.n_1 > 1 else Fb_end)
    Fb_s = support_bearing(ctx, det, na.gamma_M2, calc)
    # bearing of each bolt position: the weaker of the plate and the existing member
    Fb_e = min(Fb_end, Fb_s)
    Fb_i = min(Fb_in, Fb_s)
    n_end, n_in = 2, 2 * (det.n_1 - 1)
    Fv_red = calc(F_v_Rd_ep, F_v_Rd=Fv)
    V_b = calc(F_Rd_group, n=det.n_b, F_v_Rd=Fv_red, F_b_Rd_max=max(Fb_e, Fb_i) if n_in else Fb_e,
               F_b_Rd_min=min(Fb_e, Fb_i) if n_in else Fb_e, F_b_Rd_sum=n_end * Fb_e + n_in * Fb_i)
    for k, v in (("F_v_Rd", Fv), ("F_v_Rd_red", Fv_red), ("F_b_Rd_plate_end", Fb_end),
                 ("F_b_Rd_plate_inner", Fb_in), ("F_b_Rd_support", Fb_s)):
        calc.keep(k, v, "N")
    out.append(calc.record(id="ep_bolt_group", title="Bolt group in shear and bearing (plate and existing member)",
                           clause="EN 1993-1-8:2005, 3.7(1)", demand=V_Ed, resistance=V_b, unit="N",
                           note=NOTE_08 + f"; existing member bearing with f_u = {ctx.existing_mat.f_u:g} MPa "
                                          f"({ctx.existing_mat.label})",
                           guidance=GUIDANCE + ": 0.8 F_v,Rd for tension coexisting in the bolts"))

    # end plate shear gross + net (two planes, one each side of the web), block tearing
    out.append(check_plate_shear(V_Ed / 2.0, det.h_p, det.t_p, det.plate_grade, n_holes=det.n_1, d_0=b.d_0,
                                 k_v=1.27, na=na, calc=calc, id="ep_plate_shear",
                                 title="End plate shear, gross (1.27) and net, per side of the web"))
    blk = block_tearing_areas(det.t_p, b.d_0, det.n_1, det.e_1, det.p_1, 1, det.e_2, pattern="one_side")
    out.append(check_block_tearing(V_Ed / 2.0, blk.A_nt, blk.A_nv, det.plate_grade, det.t_p, eccentric=True,
                                   na=na, calc=calc, id="ep_plate_block",
                                   title="End plate block tearing, per side of the web"))

    # welds to the beam web
    out.append(check_full_strength_fillet(det.weld_leg, beam.tw, ctx.beam_grade, grade_other=det.plate_grade,
                                          t_other=det.t_p, na=na, calc=calc, id="ep_weld_full_strength",
                                          title="Welds to the beam web: full-strength size"))
    L_w = det.h_p - 2.0 * det.weld_leg
    out.append(check_fillet_weld(V_Ed / (2.0 * L_w), det.weld_leg, ctx.beam_grade, beam.tw,
                                 grade_other=det.plate_grade, t_other=det.t_p, na=na, calc=calc,
                                 id="ep_weld_shear", title="Welds to the beam web: shear per unit length"))

    # tying: end plate T-stub and beam web in tension
    with calc.symbols(gamma_M2="gamma_Mu", gamma_M="gamma_Mu"):      # tying: gamma_Mu, never labelled gamma_M2
        gMu = na.gamma_Mu
        a = calc(a_throat, s=det.weld_leg)
        m = calc(m_ep, p_3=det.p_3, t_w=beam.tw, a=a)
        Ft = calc(F_t_Rd, f_ub=b.f_ub, A_s=b.A_s, gamma_M2=gMu)
        F_t_sum = det.n_b * Ft
        e_w = b.washer_od / 4.0
        tie_note = NOTE_TIE
        if m > 0.0:
            n = calc(n_tstub, e_min=det.e_2, m=m)
            M_pl = calc(M_pl_Rd_u, l_eff=det.h_p, t_f=det.t_p, f_u=plate.f_u, gamma_Mu=gMu)
            F1 = calc(F_T_1_Rd, M_pl_u=M_pl, m=m, n=n, e_w=e_w)
            F2 = calc(F_T_2_Rd, M_pl_u=M_pl, n=n, F_t_sum=F_t_sum, m=m)
            R_tie = min(F1, F2, F_t_sum)
            for k, v, u in (("m", m, "mm"), ("n", n, "mm"), ("e_w", e_w, "mm"), ("F_T_1_Rd", F1, "N"),
                            ("F_T_2_Rd", F2, "N"), ("F_T_3_Rd", F_t_sum, "N")):
                calc.keep(k, v, u)
        else:
            R_tie = 0.0
            calc.keep("m", m, "mm")
            tie_note += (f"; m = {m:.1f} mm <= 0: the bolts sit on the web welds, the T-stub model does not apply: "
                         "increase the gauge p_3")
        out.append(calc.record(id="ep_tie_plate", title="Tying: end plate in bending (T-stub modes 1, 2, 3)",
                               clause="EN 1993-1-8:2005, 6.2.4.1, Table 6.2", demand=ctx.tie,
                               resistance=R_tie, unit="N", note=tie_note, guidance=GUIDANCE + ": tying resistances"))
        Fw = calc(F_t_wb_Rd_u, h_p=det.h_p, t_w=beam.tw, f_u=fu_b, gamma_Mu=gMu)
        out.append(calc.record(id="ep_tie_web", title="Tying: beam web in tension over h_p",
                               clause="EN 1993-1-8:2005, 6.2.6.8, Eq. 6.22", demand=ctx.tie, resistance=Fw, unit="N",
                               note=NOTE_TIE + "; the welds are full strength for the web",
                               guidance=GUIDANCE + ": tying resistances"))
    return out


__all__ = ["end_plate_checks", "support_bearing", "NOTE_08", "NOTE_TIE"]
