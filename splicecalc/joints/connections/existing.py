"""Local checks of the existing member where the new connection lands.

* its material: a modern grade (EN 10025-2) or a historic era band
  (:mod:`splicecalc.materials.historic`, values from memory, flagged in every note);
* bolt bearing in its flange or web (end plate), EN 1993-1-8:2005, 3.6.1, Table 3.4;
* local shear of a supporting web over the plate depth, gross (6.2.6) and net of holes
  (end plate), one shear plane taken (conservative for a one-sided connection);
* fin plate welded to a web: local punching limit t_p <= t_w2 f_u2 / (f_yp gamma_M2)
  (published simple-joint guidance, from memory);
* tying: punching of the bolts through the existing flange or web, B_p,Rd with gamma_Mu;
  for a column flange also its T-stub (modes 1, 2, 3 with f_u and gamma_Mu, sum l_eff = h_p);
  yield lines in a supporting web under tying are NOT checked (flagged);
* the moment the reaction adds to the existing member: M = V_Ed e, with e from the member axis
  to the line of the reaction, taken for columns as at least 100 mm from the face (nominal
  eccentricity of simple construction, published UK guidance, from memory). It is reported for
  the column (or, for a supporting beam, torsion) check, which is NOT done here: the existing
  member's own forces are not known to this module.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from ...core.errors import InputError, require_positive
from ...core.record import Calc, CheckRecord, not_checked
from ...materials.historic import EXISTING_STEEL_CAUTION, ExistingSteel, existing_material_of
from ...materials.partial_factors import UK_NA, NationalAnnex
from ...members.en1993_1_1 import V_pl_Rd
from ..bolts import B_p_Rd, F_t_Rd
from ..plates import A_net_plate, V_Rd_n
from .detail import E_NOMINAL_COLUMN, GUIDANCE, Context, Detail
from .endplate import support_bearing
from .formulas import (F_T_1_Rd, F_T_2_Rd, F_t_wc_Rd, M_add, M_pl_Rd_u, m_cf, n_tstub, omega_1,
                       t_p_max_punching)

GUIDANCE_TIE = ("published UK simple-joint guidance (from memory): tying resistances with f_u for f_y and gamma_Mu, "
                "sum of effective lengths = plate depth")
NOTE_ECC = ("moment added by the connection alone: it is combined with the existing member's own forces in "
            "the member check of the existing member (EN 1993-1-1 6.3.3) when its loads are given")


@dataclass(frozen=True)
class ExistingResult:
    """Local checks of the existing member, its material and the moment the reaction adds to it."""

    records: tuple[CheckRecord, ...]
    material: ExistingSteel
    M_add_Nmm: float
    e_mm: float
    axis: str           # "y" (column major axis), "z" (column minor axis) or "torsion" (supporting beam)
    text: str
    caution: str = EXISTING_STEEL_CAUTION
    member: Any = None  # ExistingMemberResult: the existing member checked as a member (or NOT CHECKED)

    @property
    def ok(self) -> bool:
        return all(r.ok for r in self.records)


def _note(ctx: Context, extra: str = "") -> str:
    base = f"{ctx.existing_mat.label}: {ctx.existing_mat.note}"
    return f"{extra}; {base}" if extra else base


def existing_checks(ctx: Context, det: Detail, V_Ed: float, calc: Calc) -> ExistingResult:
    """Local checks of the existing member for a connection ``det`` carrying V_Ed (N) and ctx.tie (N)."""
    na, ex, b = ctx.na, ctx.existing, det.bolt
    fy2, fu2 = ctx.existing_mat.f_y, ctx.existing_mat.f_u
    t2 = ctx.t_supp
    out: list[CheckRecord] = []
    web = ctx.face != "column flange"
    if det.kind == "end plate":
        Fb = support_bearing(ctx, det, na.gamma_M2, calc)
        out.append(calc.record(id="ex_bearing", title=f"Existing {ctx.face}: bolt bearing",
                               clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=V_Ed / det.n_b, resistance=Fb,
                               unit="N", note=_note(ctx, f"t = {t2:g} mm, f_u = {fu2:g} MPa")))
    if web:
        V_g = calc(V_pl_Rd, A_v=det.h_p * t2, f_y=fy2, gamma_M0=na.gamma_M0)
        V_R = V_g
        calc.keep("V_pl_Rd", V_g, "N")
        if det.kind == "end plate":
            A_n = calc(A_net_plate, b=det.h_p, t=t2, n=det.n_1, d_0=b.d_0)
            V_n = calc(V_Rd_n, A_v_net=A_n, f_u=fu2, gamma_M2=na.gamma_M2_member)
            calc.keep("V_Rd_n", V_n, "N")
            V_R = min(V_g, V_n)
        out.append(calc.record(id="ex_web_shear", title=f"Existing {ctx.face}: local shear over the plate depth",
                               clause="EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18", demand=V_Ed, resistance=V_R, unit="N",
                               note=_note(ctx, "one shear plane of depth h_p (conservative); a connection on the "
                                               "other side of the web adds to this shear")))
    if det.kind == "fin plate":
        # local shear of the supporting plate along the welds: webs and, on the same rule, a column flange
        t_max = calc(t_p_max_punching, t_w2=t2, f_u2=fu2, f_yp=_fy_plate(det), gamma_M2=na.gamma_M2)
        out.append(calc.record(id="ex_punching", guidance=GUIDANCE, title=f"Existing {ctx.face}: local punching by the fin plate",
                               clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=det.t_p, resistance=t_max,
                               unit="mm", note=_note(ctx, f"t_p <= t_2 f_u2/(f_yp gamma_M2) ({GUIDANCE})")))
    # tying into the existing member
    with calc.symbols(gamma_M2="gamma_Mu", gamma_M="gamma_Mu"):      # tying: gamma_Mu, never labelled gamma_M2
        gMu = na.gamma_Mu
        if det.kind == "end plate":
            B = calc(B_p_Rd, d_m=b.d_m, t_p=t2, f_u=fu2, gamma_M2=gMu)
            out.append(calc.record(id="ex_tie_punching", title=f"Tying: bolt punching through the existing {ctx.face}",
                                   clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=ctx.tie / det.n_b, resistance=B,
                                   unit="N", note=_note(ctx, "gamma_Mu in place of gamma_M2 for tying")))
            if ctx.face == "column flange":
                m = calc(m_cf, p_3=det.p_3, t_w=ex.tw, r=ex.r)
                e_c = (ex.b - det.p_3) / 2.0
                if m > 0.0 and e_c > 0.0:
                    n = calc(n_tstub, e_min=min(e_c, det.e_2), m=m)
                    M_pl = calc(M_pl_Rd_u, l_eff=det.h_p, t_f=t2, f_u=fu2, gamma_Mu=gMu)
                    Ft = calc(F_t_Rd, f_ub=b.f_ub, A_s=b.A_s, gamma_M2=gMu)
                    e_w = b.washer_od / 4.0
                    F1 = calc(F_T_1_Rd, M_pl_u=M_pl, m=m, n=n, e_w=e_w)
                    F2 = calc(F_T_2_Rd, M_pl_u=M_pl, n=n, F_t_sum=det.n_b * Ft, m=m)
                    R = min(F1, F2, det.n_b * Ft)
                    calc.keep("F_T_1_Rd", F1, "N")
                    calc.keep("F_T_2_Rd", F2, "N")
                else:
                    R = 0.0
                out.append(calc.record(id="ex_tie_flange", guidance=GUIDANCE_TIE, title="Tying: existing column flange in bending (T-stub)",
                                       clause="EN 1993-1-8:2005, 6.2.4.1, Table 6.2", demand=ctx.tie, resistance=R,
                                       unit="N", note=_note(ctx, "f_u for f_y, gamma_Mu, sum l_eff = h_p (published "
                                                                 "guidance, from memory)")))
        if ctx.face == "column flange":
            om = calc(omega_1, b_eff=det.h_p, t_wc=ex.tw, A_vc=ex.Av_z)
            Ft = calc(F_t_wc_Rd, omega=om, b_eff=det.h_p, t_wc=ex.tw, f_wc=fu2, gamma_M=gMu)
            out.append(calc.record(id="ex_tie_web_tension", guidance=GUIDANCE_TIE, title="Tying: existing column web in transverse tension",
                                   clause="EN 1993-1-8:2005, 6.2.6.3(1), Eq. 6.15", demand=ctx.tie, resistance=Ft,
                                   unit="N", note=_note(ctx, "b_eff,t,wc = h_p (the length the plate loads), one-sided "
                                                             "joint beta = 1; f_u and gamma_Mu for tying (published "
                                                             "simple-joint guidance, from memory)")))
    if web and det.kind == "end plate":
        out.append(not_checked(
            id="ex_tie_web_yield", title=f"Tying: existing {ctx.face} in bending (yield lines)",
            clause="EN 1993-1-8:2005, 6.2.4.1",
            reason=f"the tie force {ctx.tie / 1e3:.0f} kN pulls the bolts out of the existing web: yield-line "
                   "mechanisms of the web plate are not checked here (only bolt punching is); check them by a "
                   "yield-line analysis or published guidance for webs under tying"))
    if web and det.kind == "fin plate":
        out.append(not_checked(
            id="ex_tie_web_pull", title=f"Tying: existing {ctx.face} pulled by the welded fin plate",
            clause="EN 1993-1-8:2005, 6.2.4.1",
            reason=f"the tie force {ctx.tie / 1e3:.0f} kN pulls the fin plate out of the existing web: web bending "
                   "(yield lines) and the weld to the web under tension are not checked here"))
    # the moment added to the existing member
    if ctx.face == "column flange":
        e, axis = ex.h / 2.0 + max(det.z, E_NOMINAL_COLUMN), "y"
    elif ctx.face == "column web":
        e, axis = ex.tw / 2.0 + max(det.z, E_NOMINAL_COLUMN), "z"
    else:
        e, axis = ex.tw / 2.0 + det.z, "torsion"
    M = calc(M_add, V_Ed=V_Ed, e=e)
    who = "beam (torque)" if axis == "torsion" else f"column (about {axis}-{axis})"
    out.append(calc.info(id="ex_moment_added", title=f"Existing {who}: moment added by the reaction",
                         clause="EN 1993-1-8:2005, 2.7(1)", demand=M, resistance=0.0, unit="Nmm",
                         note=(f"e = {e:.1f} mm from the member axis" + ("" if axis == "torsion" else
                               f", at least {E_NOMINAL_COLUMN:g} mm from the face (nominal eccentricity of simple "
                               "construction, published UK guidance, from memory)")
                               + "; taken into the member check of the existing member")))
    if axis == "torsion":
        what = (f"torsion on the existing beam T = V_Ed x {e:.1f} mm = {M / 1e6:.2f} kNm (unbalanced reaction "
                "from one side): check the existing beam in torsion or show it is restrained by the floor")
    else:
        what = (f"moment on the existing column about its {axis} axis M = V_Ed x {e:.1f} mm = {M / 1e6:.2f} kNm "
                f"(e from the column axis, at least {E_NOMINAL_COLUMN:g} mm from the face: nominal eccentricity of "
                "simple construction, published UK guidance, from memory); " + NOTE_ECC)
    return ExistingResult(records=tuple(out), material=ctx.existing_mat, M_add_Nmm=M, e_mm=e, axis=axis, text=what)


def _fy_plate(det: Detail) -> float:
    from ...materials.steel import steel
    return steel(det.plate_grade, det.t_p).f_y


def existing_material(section, face: str, text: str) -> ExistingSteel:
    """Material of the existing member, strength taken at its flange thickness (thickest element of a
    rolled section, so the same value serves a web or a flange connection)."""
    return existing_material_of(text, section.tf)


def check_existing_member(existing_section, existing_steel_text: Any, face: str, detail: Detail, V_Ed: float, *,
                          beam_section, beam_grade: str = "S275", tying_force: float = 75_000.0,
                          notch_depth: float | None = None, notch_length: float | None = None,
                          na: NationalAnnex = UK_NA, render: bool = False, existing_loads: Any = None,
                          reactions: Any = None, psi: Any = None) -> ExistingResult:
    """Public entry: checks of an existing member receiving ``detail`` with reaction V_Ed (N).

    ``existing_steel_text``: era band (e.g. "1950-1958"), "unknown", a grade ("S275") or a
    :class:`~splicecalc.materials.historic.TestedSteel`; ``face``: "column flange" | "column web" |
    "beam web". Local checks always; the member check when ``existing_loads`` (from
    :func:`~.existing_spec.parse_existing_loads`) is given, else a NOT CHECKED record.
    ``reactions``: the new beam's characteristic reactions per action (None: V_Ed as a permanent
    action, conservative). Raises InputError for bad input.
    """
    from dataclasses import replace

    from ...materials.steel import steel
    from .existing_member import existing_member_checks
    from .spec import FACES
    if face not in FACES:
        raise InputError("existing_face", face, "one of " + ", ".join(repr(f) for f in FACES))
    V = require_positive("V_Ed", V_Ed, "N")
    tie = require_positive("tying_force", tying_force, "N")
    if not isinstance(detail, Detail):
        raise InputError("detail", detail, "a Detail (from design_end_connection)")
    mat = existing_material(existing_section, face, existing_steel_text)
    ctx = Context(beam=beam_section, beam_grade=beam_grade, beam_mat=steel(beam_grade, beam_section.tf),
                  existing=existing_section, face=face, existing_mat=mat, na=na, tie=tie,
                  notch_depth=notch_depth, notch_length=notch_length)
    calc = Calc(render=render)
    res = existing_checks(ctx, detail, V, calc)
    member = existing_member_checks(existing_section, existing_loads,
                                    lambda t: existing_material_of(existing_steel_text, t), face, detail, reactions,
                                    V, na, psi, tie, calc)
    return replace(res, records=res.records + member.records, member=member)


__all__ = ["ExistingResult", "existing_checks", "existing_material", "check_existing_member", "NOTE_ECC"]
