"""The structural-integrity tie force through a cover-plate splice (accidental design situation).

The tie force ``T`` of the beam's end connections (EN 1991-1-7:2006, A.5.1, Eq. (A.1), computed in
:mod:`splicecalc.joints.connections.tying`) runs along the whole beam, so it passes through every
splice. Method (stated on the calc sheet):

* the tie force alone, as axial tension with no moment or shear: the usual UK reading of the tying
  requirement (the tie is checked as an accidental action on its own; from memory);
* shared by area as the ULS axial force is (:func:`.forces.N_f_Ed`, :func:`.forces.N_w_Ed`, EN 1993-1-8
  2.5(1)): each flange ``N_f = T b t_f / A``, the web the rest;
* resistances with gamma_Mu = 1.10 in place of gamma_M2 (UK NA to BS EN 1993-1-8, structural
  integrity / tying resistance; from memory), gamma_M0 = 1.0 for gross yield: flange bolts and web
  bolts in shear (Table 3.4), flange cover plates and web plates in tension, gross and net
  (EN 1993-1-1 6.2.3). Bearing and block tearing of the same plies are covered by the ULS checks
  whenever the ULS force of the group is larger (stated in a record; if not, NOT CHECKED).
"""

from __future__ import annotations

from dataclasses import replace

from ...core.record import Calc, CheckRecord, not_checked
from ...materials.partial_factors import NationalAnnex
from .. import bolts as B
from .. import plates as P
from .forces import N_f_Ed, N_w_Ed

#: where the partial factor for tying comes from (kept apart from the clauses)
GUIDE_TIE = ("tie force alone as axial tension (no moment or shear), shared by area; gamma_Mu = 1.10 for "
             "tying resistance from the UK NA to BS EN 1993-1-8 (from memory), printed below as gamma_M2")
CL_TIE = "EN 1991-1-7:2006, A.5.1, Eq. (A.1)"


def tie_records(design, spec, T: float, na: NationalAnnex, render: bool = False, loc: float | None = None,
                basis: str = "") -> list[CheckRecord]:
    """Records of the splice ``design`` (a :class:`~.design.SpliceDesign`, job ``spec``) under the tie
    force ``T`` (N).

    Ids start ``tie_``; every record carries the tag ``accidental``."""
    section, g = design.section, design.geometry
    lay = design.layout
    bolt = B.get_bolt(lay.bolt_size, lay.bolt_class)
    pg = spec.plate_grade
    threads = spec.threads_in_shear_plane
    na_u = replace(na, gamma_M2=na.gamma_Mu, gamma_M2_member=na.gamma_Mu)
    out: list[CheckRecord] = []
    d0 = bolt.d_0
    cols = 2 if g.p2o_f == 0 else 4
    rows = g.n_f // cols
    inner = g.t_pi > 0.0

    def calc() -> Calc:
        c = Calc(render=render)
        if render:
            c.note(f"Accidental design situation: tie force $T$ = {T / 1e3:.1f} kN through the splice"
                   + (f" ({basis})" if basis else "") + ", shared by area; $\\gamma_{M2}$ below is "
                   "$\\gamma_{Mu}$ = " + f"{na.gamma_Mu:g} (tying).")
        return c

    c = calc()
    Nf = c(N_f_Ed, N_Ed=T, b=section.b, t_f=section.tf, A=section.A)
    Nw = c(N_w_Ed, N_Ed=T, N_f_Ed=Nf)
    c.keep("T_Ed", T, "N")
    c.keep("N_f_Ed", Nf, "N")
    c.keep("N_w_Ed", Nw, "N")
    share_o = g.share_o
    share_max = max(share_o, 1.0 - share_o) if inner else 1.0
    out.append(B.check_bolt_shear(bolt, Nf / g.n_f * share_max, n_s=1, threads_in_shear_plane=threads,
                                  L_j=(rows - 1) * g.p1_f, na=na_u, calc=c, id="tie_flange_bolts",
                                  title="Tie force: flange bolts in shear (accidental, gamma_Mu)", location_mm=loc))
    c = calc()
    out.append(B.check_bolt_shear(bolt, Nw / g.n_w, n_s=2, threads_in_shear_plane=threads,
                                  L_j=max((g.n_r - 1) * g.p_w, (g.n_c - 1) * g.g_w), na=na_u, calc=c,
                                  id="tie_web_bolts", title="Tie force: web bolts in shear (accidental, gamma_Mu)",
                                  location_mm=loc))
    c = calc()
    out.append(P.check_plate_tension(Nf * share_o, g.b_po, g.t_po, pg, n_holes=cols, d_0=d0, na=na_u, calc=c,
                                     id="tie_outer_plate", title="Tie force: outer flange plate in tension, gross "
                                     "and net (accidental, gamma_Mu)", location_mm=loc))
    if inner:
        c = calc()
        out.append(P.check_plate_tension(Nf * (1.0 - share_o) / 2, g.b_pi, g.t_pi, pg, n_holes=cols // 2, d_0=d0,
                                         na=na_u, calc=c, id="tie_inner_plate",
                                         title="Tie force: inner flange plate (each) in tension (accidental, "
                                         "gamma_Mu)", location_mm=loc))
    c = calc()
    out.append(P.check_plate_tension(Nw / 2, g.h_wp, g.t_wp, pg, n_holes=g.n_r, d_0=d0, na=na_u, calc=c,
                                     id="tie_web_plates", title="Tie force: web plate (each of 2) in tension, gross "
                                     "and net (accidental, gamma_Mu)", location_mm=loc))
    # bearing / block tearing: covered by the ULS design when its forces on the same plies are larger
    F_f_uls = design.forces.F_f_Ed
    F_x_uls = max(abs(b[2]) for b in design.forces.bolt_forces)
    if Nf <= F_f_uls and Nw / g.n_w <= F_x_uls:
        c = Calc(render=render)
        out.append(c.record(id="tie_bearing_covered", title="Tie force: bearing and block tearing covered by the "
                            "ULS checks of this splice", clause="EN 1993-1-8:2005, 3.6.1, Table 3.4",
                            demand=Nf, resistance=F_f_uls, unit="N", location_mm=loc,
                            note=(f"flange force under the tie N_f = {Nf / 1e3:.1f} kN <= ULS flange force "
                                  f"F_f,Ed = {F_f_uls / 1e3:.1f} kN, web bolt axial share {Nw / g.n_w / 1e3:.2f} kN "
                                  f"<= ULS horizontal F_x = {F_x_uls / 1e3:.1f} kN, both checked with gamma_M2 = "
                                  f"{na.gamma_M2:g} > gamma_Mu = {na.gamma_Mu:g}: bearing and block tearing pass "
                                  "for the tie too")))
    else:
        out.append(not_checked(id="tie_bearing", title="Tie force: bearing and block tearing of the splice plies",
                               clause="EN 1993-1-8:2005, 3.6.1, Table 3.4",
                               reason="the tie force's share exceeds the ULS forces of a bolt group; bearing and "
                                      "block tearing under the tie need their own check", location_mm=loc))
    for r in out:
        tags = tuple(t for t in ("accidental", "tying") if t not in r.tags)
        object.__setattr__(r, "tags", r.tags + tags)
        if r.checked:
            object.__setattr__(r, "guidance", GUIDE_TIE)
    return out


__all__ = ["tie_records", "GUIDE_TIE"]
