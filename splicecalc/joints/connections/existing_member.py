"""The existing member checked as a member, with its own loads plus the new beam's reaction.

* **Column** (the new beam lands on a column flange or web): the reaction acts at the nominal
  eccentricity of simple construction (100 mm from the face, published UK guidance for simple
  construction, from memory; cited as guidance, not as a code clause), combined with the column's
  own axial force and moments through the EN 1990 combinations (each variable action leading in
  turn, :func:`splicecalc.actions.uls_combinations`). Checks: cross-section N + M (EN 1993-1-1
  6.2.9.1, or 6.2.9.2 for Class 3), flexural buckling about both axes (6.3.1), lateral-torsional
  buckling where a major-axis moment acts (6.3.2, M_cr by :func:`splicecalc.members.mcr.mcr_numerical`),
  the member interaction 6.3.3 with the Annex B factors (members susceptible to torsional
  deformation, braced, linear moment with the stated end ratio), and for a flange connection the
  column web in transverse compression under the tie force reversed (EN 1993-1-8 6.2.6.2, k_wc from
  the column's own compressive stress; the web in tension under tying, 6.2.6.3, is a local check in
  :mod:`.existing`).
* **Supporting beam** (the new beam lands on an existing beam's web): simply supported span with
  its own loads, its self-weight and the new reaction as point loads per action at the connection
  (combinations as above, analysis by :class:`splicecalc.analysis.SimpleBeam`). Checks: bending,
  shear, bending with shear, lateral-torsional buckling per segment between restraints with the
  numerical M_cr (own loads at their stated level, the reaction at the level of the bolt group with
  the tops of steel level), deflection under the variable actions, and the torsion from the one-sided
  connection: St Venant shear with the shear force (6.2.7(9)) and the flange stress when the whole
  torque is carried by warping (flange-bending analogy, conservative), or a NOT CHECKED record when
  the job states the floor restrains the twist.
* **No existing loads**: one NOT CHECKED record naming what is needed.

Strengths: f_y for resistances at the flange thickness (the thickest element), the web checks at
the web thickness (era bands and grades by thickness). Plain floats N, mm, MPa, N*mm.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Any, Callable, Sequence

import numpy as np

from ...actions import PointLoad, UDL, uls_combinations
from ...actions.combinations import sls_variable_characteristic
from ...actions.psi import PSI_UK_NA
from ...analysis import SimpleBeam
from ...core.record import Calc, CheckRecord, not_checked
from ...core.numeric import sorted_unique
from ...materials.partial_factors import NationalAnnex
from ...members import compression as fc
from ..plates import N_b_Rd, chi as chi_flex
from ...members import en1993_1_1 as f11
from ...members.checks import ALPHA_LT, check_deflection, ltb_curve_rolled, mcr_reference
from ...members.mcr import C_1_numerical, mcr_numerical
from .existing_spec import ExistingBeamLoads, ExistingColumnLoads
from .formulas import (F_c_wc_Rd, M_fl_warping, U_bending_warping, b_eff_wc, k_wc, omega_1, rho_wc,
                       tau_t_Ed)

#: nominal eccentricity of a simple connection from the column face (published UK guidance for simple
#: construction, from memory)
E_NOMINAL_FACE = 100.0
GUIDANCE_ECC = ("nominal eccentricity of simple construction: reaction 100 mm from the column face (published UK "
                "guidance for simple construction, from memory)")
GUIDANCE_PUSH = ("stated method: the transverse compression is the tie force reversed (the new beam acting as a "
                 "restraint strut), spread over the plate depth")
GUIDANCE_WARPING = ("published torsion design guidance: flange-bending analogy, the whole torque carried by warping "
                    "(from memory, conservative)")
NEEDS_COLUMN = ("add [support.existing_loads] with kind = 'column', height (length between restraints) and the "
                "characteristic axial force (and moments) the column carries at this level")
NEEDS_BEAM = ("add [support.existing_loads] with kind = 'beam', span, at (where the new beam lands) and the "
              "characteristic loads (udl, points) the existing beam carries")
G_ACC = 9.81e-3   # N per kg, per mm: kg/m x 9.81 N/kg / 1000 mm/m = N/mm


@dataclass(frozen=True)
class ReactionPart:
    """Characteristic reaction of the new beam from one action (N), with the action's identity."""

    action_name: str
    action: str
    category: str | None
    R: float


@dataclass(frozen=True)
class ExistingMemberResult:
    """Member checks of an existing member: records, the loads table and the basis in words."""

    kind: str                                # "column", "beam" or "" (not checked)
    records: tuple[CheckRecord, ...]
    load_rows: tuple[tuple[str, str, str, str], ...] = ()    # (load, action, value, where)
    basis: tuple[str, ...] = ()
    combination: str = ""
    material: Any = None
    #: supporting beam: (span mm, factored loads of the governing combination, restraints mm) for the
    #: calc sheet's diagram of that combination
    diagram: Any = None


def reactions_by_action(loads: Sequence[Any], span_mm: float, end: str) -> tuple[ReactionPart, ...]:
    """Characteristic reactions at ``end`` ("A" or "B") of a simply supported span, summed per action."""
    parts: dict[str, ReactionPart] = {}
    for ld in loads:
        b = SimpleBeam(span_mm, [ld])
        R = b.R_A if end == "A" else b.R_B
        key = "G" if ld.action == "permanent" else ld.action_name
        old = parts.get(key)
        parts[key] = ReactionPart(key, ld.action, ld.category, (old.R if old else 0.0) + R)
    return tuple(p for p in parts.values() if p.R > 0.0)


def design_valued_reaction(V_Ed: float, na: NationalAnnex) -> tuple[ReactionPart, ...]:
    """When only the design reaction is known: a permanent action that every ULS combination factors to
    at least V_Ed (V_Ed / (xi gamma_G) for 6.10a/b, V_Ed / gamma_G for 6.10; conservative)."""
    f = na.gamma_G * (na.xi if na.combination == "6.10ab" else 1.0)
    return (ReactionPart("G", "permanent", None, V_Ed / f),)


def _group(name: str, action: str, category: str | None) -> str:
    """The load group for an action name: none for permanent loads and for imposed loads of a category
    under their default name (so that the imposed loads of all categories make one action, EN 1991-1-1
    3.3.1(2), as for the new beam), else the name itself."""
    if action == "permanent" or name == f"imposed {category}":
        return ""
    return name


def _combos(actions: dict[str, tuple[str, str | None]], na: NationalAnnex, psi: Any) -> list[Any]:
    """ULS combinations over named actions (dummy unit loads carry each action's identity)."""
    loads = [PointLoad(name=k, action=a, P=1.0, x=0.0, category=c, group=_group(k, a, c))
             for k, (a, c) in actions.items()]
    if not loads:
        loads = [PointLoad(name="G", action="permanent", P=1.0, x=0.0)]
    return uls_combinations(loads, na, psi)


def _not_checked_member(face: str, where: str) -> ExistingMemberResult:
    col = face != "beam web"
    rec = not_checked(id="ex_member", title=f"Existing {'column' if col else 'supporting beam'} checked as a member",
                      clause="EN 1993-1-1:2005, 6.3.3" if col else "EN 1993-1-1:2005, 6.3.2",
                      reason=("the existing member's own loads and restraints are not given, so its resistance to "
                              "them plus the new reaction is not checked: " + (NEEDS_COLUMN if col else NEEDS_BEAM)))
    return ExistingMemberResult("", (rec,), basis=("Existing member not checked as a member: "
                                                   + (NEEDS_COLUMN if col else NEEDS_BEAM) + ".",))


def _section_class(sec: Any, f_y: float, compression: bool) -> int:
    eps = f11.epsilon(f_y=f_y)
    c_f = (sec.b - sec.tw - 2.0 * sec.r) / 2.0
    rf = f11.c_t_flange(c_f=c_f, t_f=sec.tf, epsilon=eps)
    if compression:
        rw = f11.c_t_web(c_w=sec.d, t_w=sec.tw, epsilon=eps, alpha=1.0, psi=1.0)
    else:
        rw = f11.c_t_web(c_w=sec.d, t_w=sec.tw, epsilon=eps, alpha=0.5, psi=-1.0)
    cls = 1
    for ratio, l1, l2, l3 in (rf, rw):
        c = 1 if ratio <= l1 else 2 if ratio <= l2 else 3 if ratio <= l3 else 4
        cls = max(cls, c)
    return cls


def _chi_LT(calc: Calc, sec: Any, W: float, f_y: float, M_cr: float, M_E: float, na: NationalAnnex,
            k_c: float | None = None, C_1: float | None = None) -> float:
    """chi_LT,mod for rolled sections (6.3.2.3 with the UK NA), 1 when LTB may be ignored (6.3.2.2(4))."""
    if math.isinf(M_cr):
        return 1.0
    lam = calc(f11.lambda_LT, W_y=W, f_y=f_y, M_cr=M_cr)
    lam0 = na.lambda_LT_0
    if lam <= lam0 or M_E / M_cr <= lam0**2:
        calc.note(f"$\\bar\\lambda_{{LT}} \\le {lam0:g}$ or $M_{{Ed}}/M_{{cr}} \\le {lam0**2:g}$: LTB effects "
                  "may be ignored (6.3.2.2(4)), $\\chi_{LT} = 1$.")
        return 1.0
    curve = ltb_curve_rolled(sec.h, sec.b)
    chi0 = calc(f11.chi_LT, lamb_LT=lam, alpha_LT=ALPHA_LT[curve], lamb_LT_0=lam0, beta=na.beta_LT)
    if k_c is None:
        k_c = calc(f11.k_c_from_C1, C_1=max(C_1 or 1.0, 1.0))
    f = calc(f11.f_LT, k_c=k_c, lamb_LT=lam)
    return calc(f11.chi_LT_mod, chi_LT=chi0, f=f, lamb_LT=lam)


# ======================================================================== column
def _column_actions(cl: ExistingColumnLoads, parts: Sequence[ReactionPart]) -> dict[str, dict[str, Any]]:
    """Characteristic quantities per action: N (N), the new reaction R (N), existing M_y, M_z (N*mm)."""
    acts: dict[str, dict[str, Any]] = {}

    def add(key: str, action: str, cat: str | None, **q: float) -> None:
        a = acts.setdefault(key, {"action": action, "category": cat, "N": 0.0, "R": 0.0, "M_y": 0.0, "M_z": 0.0})
        for k, v in q.items():
            a[k] += v
    imp = f"imposed {cl.category}"
    add("G", "permanent", None, N=cl.axial.permanent, M_y=cl.moment_y.permanent, M_z=cl.moment_z.permanent)
    if cl.axial.imposed or cl.moment_y.imposed or cl.moment_z.imposed:
        add(imp, "imposed", cl.category, N=cl.axial.imposed, M_y=cl.moment_y.imposed, M_z=cl.moment_z.imposed)
    for p in parts:
        add(p.action_name, p.action, p.category, N=p.R, R=p.R)
    return acts


def _column_forces(acts: dict[str, dict[str, Any]], combo: Any, e: float, axis: str, share: float
                   ) -> tuple[float, float, float, float]:
    """(N_Ed, M_y,Ed, M_z,Ed, R_Ed) of one combination; the connection moment share x R e on ``axis``."""
    N = My = Mz = R = 0.0
    for k, a in acts.items():
        f = combo.factor("G" if a["action"] == "permanent" else k)
        N += f * a["N"]
        R += f * a["R"]
        My += f * a["M_y"]
        Mz += f * a["M_z"]
    if axis == "y":
        My += share * R * e
    else:
        Mz += share * R * e
    return N, My, Mz, R


def _column_records(sec: Any, cl: ExistingColumnLoads, f_y: float, f_y_w: float, f_u_w: float, N: float,
                    My: float, Mz: float, na: NationalAnnex, calc: Calc, face: str, det: Any, tie: float,
                    where: str, M_cr: float) -> list[CheckRecord]:
    """Every member check of the column for one set of design forces (``M_cr``: elastic critical
    moment of the column length for its moment shape, N*mm)."""
    out: list[CheckRecord] = []
    cls = _section_class(sec, f_y, compression=True)
    if cls == 4:
        return [not_checked(id="ex_col_class4", title="Existing column: Class 4 cross-section",
                            clause="EN 1993-1-5:2006, 4.4",
                            reason="the existing column is Class 4 in compression: effective properties (EN 1993-1-5 "
                                   "4.4) are not applied here; check it separately")]
    note = f"Class {cls} in compression (Table 5.2, f_y = {f_y:g} MPa at t_f = {sec.tf:g} mm); {where}"
    A = sec.A
    N_Rk = A * f_y
    Wy, Wz = (sec.Wpl_y, sec.Wpl_z) if cls <= 2 else (sec.Wel_y, sec.Wel_z)
    My_Rk, Mz_Rk = Wy * f_y, Wz * f_y
    # --- cross-section
    if cls <= 2:
        Npl = calc(f11.N_pl_Rd, A=A, f_y=f_y, gamma_M0=na.gamma_M0)
        n = N / Npl
        calc.note(f"$n = N_{{Ed}} / N_{{pl,Rd}}$ = {N / 1e3:.1f} / {Npl / 1e3:.1f} = {n:.3f}")
        a_w = min((A - 2.0 * sec.b * sec.tf) / A, 0.5)
        with calc.symbols(M_c_Rd="M_pl_y_Rd", W_y="W_pl_y"):
            Mply = calc(f11.M_c_Rd, W_y=sec.Wpl_y, f_y=f_y, gamma_M0=na.gamma_M0)
        with calc.symbols(M_c_Rd="M_pl_z_Rd", W_y="W_pl_z"):
            Mplz = calc(f11.M_c_Rd, W_y=sec.Wpl_z, f_y=f_y, gamma_M0=na.gamma_M0)
        MNy = calc(fc.M_N_y_Rd, M_pl_y_Rd=Mply, n=n, a=a_w)
        MNz = calc(fc.M_N_z_Rd, M_pl_z_Rd=Mplz, n=n, a=a_w)
        # n >= 1: Eq. 6.41 does not apply (no moment left), the axial check alone governs
        U_NM = calc(fc.U_biaxial_NM, M_y_Ed=My, M_N_y_Rd=MNy, M_z_Ed=Mz, M_N_z_Rd=MNz, n=n) if n < 1.0 else 0.0
        U = calc(fc.U_section_NM, U_NM=U_NM, n=n)          # the value the verdict prints
        cl_txt = "EN 1993-1-1:2005, 6.2.9.1(6), Eq. 6.41"
    else:
        U = calc(fc.U_elastic_NM, N_Ed=N, A=A, M_y_Ed=My, W_el_y=sec.Wel_y, M_z_Ed=Mz, W_el_z=sec.Wel_z, f_y=f_y,
                 gamma_M0=na.gamma_M0)
        cl_txt = "EN 1993-1-1:2005, 6.2.9.2(1), Eq. 6.42"
    calc.keep("N_Ed", N, "N")
    calc.keep("M_y_Ed", My, "Nmm")
    calc.keep("M_z_Ed", Mz, "Nmm")
    out.append(calc.record(id="ex_col_section", guidance=GUIDANCE_ECC, title="Existing column: cross-section, axial force and bending",
                           clause=cl_txt, demand=U, resistance=1.0, unit="", note=note))
    # --- flexural buckling about both axes
    cy, cz = fc.flexural_curves(sec.h, sec.b, sec.tf)
    chi = {}
    lam = {}
    for ax, I, L, curve in (("y", sec.Iy, cl.L_y, cy), ("z", sec.Iz, cl.L_z, cz)):
        Ncr = calc(fc.N_cr, I=I, L_cr=L)
        lam[ax] = calc(fc.lambda_flex, A=A, f_y=f_y, N_cr=Ncr)
        chi[ax] = calc(chi_flex, lamb_bar=lam[ax], alpha=fc.ALPHA_FLEXURAL[curve])
        Nb = calc(N_b_Rd, chi=chi[ax], A=A, f_y=f_y, gamma_M1=na.gamma_M1)
        calc.keep(f"chi_{ax}", chi[ax])
        out.append(calc.record(id=f"ex_col_buckling_{ax}", title=f"Existing column: flexural buckling about {ax}-{ax}",
                               clause="EN 1993-1-1:2005, 6.3.1.1(1), Eq. 6.46", demand=N, resistance=Nb, unit="N",
                               note=f"curve {curve} (Table 6.2, rolled I/H), buckling length {L / 1000:g} m "
                                    f"(length between restraints, pinned ends); {note}"))
    # --- lateral-torsional buckling (major-axis moment)
    psi = cl.moment_ratio
    chi_LT = 1.0
    if My > 0.0:
        if math.isfinite(M_cr):
            calc.keep("M_cr", M_cr, "Nmm")
            calc.note(f"$M_{{cr}}$ = {M_cr / 1e6:.1f} kNm: thin-walled beam finite elements, length "
                      f"{cl.L_z / 1e3:g} m, linear moment with end ratio {psi:g}, no transverse load.")
        kc = calc(f11.k_c_linear, psi=psi)
        chi_LT = _chi_LT(calc, sec, Wy, f_y, M_cr, My, na, k_c=kc)
        Mb = calc(f11.M_b_Rd, chi_LT_mod=chi_LT, W_y=Wy, f_y=f_y, gamma_M1=na.gamma_M1)
        out.append(calc.record(id="ex_col_ltb", guidance=GUIDANCE_ECC, title="Existing column: lateral-torsional buckling",
                               clause="EN 1993-1-1:2005, 6.3.2.1, Eq. 6.54", demand=My, resistance=Mb, unit="Nmm",
                               note=f"rolled section, UK NA curves, k_c from Table 6.6 (psi = {psi:g}); {note}"))
    # --- member interaction, Annex B
    Cm = calc(fc.C_m_linear, psi=psi)
    with calc.symbols(n_i="n_y", chi="chi_y"):          # one formula for either axis: print the axis
        ny = calc(fc.n_ratio, N_Ed=N, chi=chi["y"], N_Rk=N_Rk, gamma_M1=na.gamma_M1)
    with calc.symbols(n_i="n_z", chi="chi_z"):
        nz = calc(fc.n_ratio, N_Ed=N, chi=chi["z"], N_Rk=N_Rk, gamma_M1=na.gamma_M1)
    kyy = calc(fc.k_yy_B, C_my=Cm, lamb_y=lam["y"], n_y=ny, cls=cls)
    kzz = calc(fc.k_zz_B, C_mz=Cm, lamb_z=lam["z"], n_z=nz, cls=cls)
    kyz = calc(fc.k_yz_B, k_zz=kzz, cls=cls)
    kzy = calc(fc.k_zy_B, lamb_z=lam["z"], n_z=nz, C_mLT=Cm, cls=cls)
    with calc.symbols(chi_i="chi_y", k_iy="k_yy", k_iz="k_yz", U_i="U_y"):      # Eq. 6.61
        U61 = calc(fc.U_buckling_NM, N_Ed=N, chi_i=chi["y"], N_Rk=N_Rk, k_iy=kyy, M_y_Ed=My, chi_LT=chi_LT,
                   M_y_Rk=My_Rk, k_iz=kyz, M_z_Ed=Mz, M_z_Rk=Mz_Rk, gamma_M1=na.gamma_M1)
    inote = (f"Annex B (Method 2), Tables B.1/B.2 (member susceptible to torsional deformation, braced), C_m = "
             f"{Cm:.2f} for the linear moment (Table B.3); {note}")
    calc.keep("U_6_61", U61)
    out.append(calc.record(id="ex_col_interaction_y", guidance=GUIDANCE_ECC, title="Existing column: buckling with bending, Eq. 6.61",
                           clause="EN 1993-1-1:2005, 6.3.3(4), Eq. 6.61", demand=U61, resistance=1.0, unit="",
                           note=inote))
    with calc.symbols(chi_i="chi_z", k_iy="k_zy", k_iz="k_zz", U_i="U_z"):      # Eq. 6.62
        U62 = calc(fc.U_buckling_NM, N_Ed=N, chi_i=chi["z"], N_Rk=N_Rk, k_iy=kzy, M_y_Ed=My, chi_LT=chi_LT,
                   M_y_Rk=My_Rk, k_iz=kzz, M_z_Ed=Mz, M_z_Rk=Mz_Rk, gamma_M1=na.gamma_M1)
    calc.keep("U_6_62", U62)
    out.append(calc.record(id="ex_col_interaction_z", guidance=GUIDANCE_ECC, title="Existing column: buckling with bending, Eq. 6.62",
                           clause="EN 1993-1-1:2005, 6.3.3(4), Eq. 6.62", demand=U62, resistance=1.0, unit="",
                           note=inote))
    # --- column web under transverse forces (connection to the flange)
    if face == "column flange":
        s = sec.r
        beff = calc(b_eff_wc, l_load=det.h_p, t_fc=sec.tf, s=s)
        Avc = sec.Av_z
        om = calc(omega_1, b_eff=beff, t_wc=sec.tw, A_vc=Avc)
        sigma = N / A + My / sec.Iy * (sec.h / 2.0 - sec.tf - sec.r)
        calc.keep("sigma_com_Ed", sigma, "MPa")
        k = calc(k_wc, sigma_com_Ed=sigma, f_y_wc=f_y_w)
        d_wc = sec.h - 2.0 * (sec.tf + sec.r)
        rho = calc(rho_wc, b_eff=beff, d_wc=d_wc, f_y_wc=f_y_w, t_wc=sec.tw)
        Fc = calc(F_c_wc_Rd, omega=om, k_wc=k, rho=rho, b_eff=beff, t_wc=sec.tw, f_y_wc=f_y_w,
                  gamma_M0=na.gamma_M0, gamma_M1=na.gamma_M1)
        out.append(calc.record(id="ex_col_web_compression", guidance=GUIDANCE_PUSH, title="Existing column web in transverse compression",
                               clause="EN 1993-1-8:2005, 6.2.6.2(1), Eq. 6.9", demand=tie, resistance=Fc, unit="N",
                               note="force = the tie force reversed (the new beam pushing as a restraint strut), "
                                    "spread over the plate depth h_p + 5 (t_fc + r_c); k_wc from the column's design "
                                    f"compressive stress; f_y,wc = {f_y_w:g} MPa at t_w"))
    return out


def column_member_checks(sec: Any, cl: ExistingColumnLoads, mat_at: Callable[[float], Any], face: str, det: Any,
                         parts: Sequence[ReactionPart], na: NationalAnnex, psi: Any, tie: float,
                         calc: Calc) -> ExistingMemberResult:
    """The existing column with its own loads and the new reaction (see the module docstring)."""
    mf, mw = mat_at(sec.tf), mat_at(sec.tw)
    e = (sec.h / 2.0 if face == "column flange" else sec.tw / 2.0) + max(det.z, E_NOMINAL_FACE)
    axis = "y" if face == "column flange" else "z"
    acts = _column_actions(cl, parts)
    # no transverse load in the column length: M_cr depends on the shape of the moment diagram only
    mcr_shape = mcr_numerical(sec, cl.L_z, (np.array([0.0, cl.L_z]), np.array([1e6, 1e6 * cl.moment_ratio]))).M_cr
    combos = _combos({k: (a["action"], a["category"]) for k, a in acts.items()}, na, psi)
    # every combination (each variable action leading in turn, EN 1990 6.4.3.2): each check is shown in
    # the combination that governs it (flexural buckling with the largest N_Ed, the interaction with the
    # largest utilisation, ...)
    worst: dict[str, tuple[float, int]] = {}
    forces = []
    ids: list[str] = []
    for i, c in enumerate(combos):
        N, My, Mz, R = _column_forces(acts, c, e, axis, cl.moment_share)
        forces.append((N, My, Mz, R))
        for r in _column_records(sec, cl, mf.f_y, mw.f_y, mw.f_u, N, My, Mz, na, Calc(), face, det, tie, c.name,
                                 mcr_shape):
            if r.id not in worst:
                ids.append(r.id)
            if r.id not in worst or r.utilisation > worst[r.id][0] + 1e-12:
                worst[r.id] = (r.utilisation, i)
    gov = max(worst.values())[1]
    by_id: dict[str, CheckRecord] = {}
    for i in sorted({i for _, i in worst.values()}):
        c = combos[i]
        N, My, Mz, R = forces[i]
        head = (f"Combination {c.name}: {c.expression}. Reaction {R / 1e3:.1f} kN at e = {e:.1f} mm from the column "
                f"axis ({GUIDANCE_ECC}), {cl.moment_share:g} of R e taken by this length as an end moment at the "
                f"connection end ({cl.moment_share * R * e / 1e6:.2f} kNm; {cl.moment_ratio:g} times it at the "
                f"other end): $N_{{Ed}}$ = {N / 1e3:.1f} kN, $M_{{y,Ed}}$ = {My / 1e6:.2f} kNm, "
                f"$M_{{z,Ed}}$ = {Mz / 1e6:.2f} kNm.")
        sub = Calc(render=calc.render, precision=calc.precision)
        for r in _column_records(sec, cl, mf.f_y, mw.f_y, mw.f_u, N, My, Mz, na, sub, face, det, tie, c.name,
                                 mcr_shape):
            if worst[r.id][1] == i:
                by_id[r.id] = replace(r, latex=((head,) if calc.render else ()) + r.latex)
    recs = [by_id[k] for k in ids]
    c = combos[gov]
    N, My, Mz, R = forces[gov]
    if cl.moment_share < 1.0:
        recs.append(not_checked(
            id="ex_col_above", title="Existing column: the length above takes the rest of the connection moment",
            clause="EN 1993-1-1:2005, 6.3.3",
            reason=f"{1.0 - cl.moment_share:g} of R e = {(1.0 - cl.moment_share) * R * e / 1e6:.2f} kNm (design) is "
                   "taken by the column length above the connection (job: moment_share), whose own forces are "
                   "not given: check that length with it"))
    rows = [("existing axial force", "permanent", f"{cl.axial.permanent / 1e3:g} kN", "at the connection level"),
            ("existing axial force", f"imposed {cl.category}", f"{cl.axial.imposed / 1e3:g} kN", "")]
    for nm, pair in (("existing moment M_y", cl.moment_y), ("existing moment M_z", cl.moment_z)):
        if pair.total:
            rows += [(nm, "permanent", f"{pair.permanent / 1e6:g} kNm", ""),
                     (nm, f"imposed {cl.category}", f"{pair.imposed / 1e6:g} kNm", "")]
    for p in parts:
        rows.append(("new beam reaction", p.action_name if p.action != "permanent" else "permanent",
                     f"{p.R / 1e3:.2f} kN", f"e = {e:.1f} mm, about {axis}-{axis}"))
    basis = (f"Column length between restraints {cl.L_y / 1e3:g} m (y-y), {cl.L_z / 1e3:g} m (z-z), pinned ends, "
             "braced (simple construction).",
             f"Reaction at e = {e:.1f} mm from the column axis: {GUIDANCE_ECC}; share of the moment taken by this "
             f"length {cl.moment_share:g}; moment ratio along the length psi = {cl.moment_ratio:g}. The connection "
             "is taken at the end of the length (its height on the length is not used): the moment share x R e is "
             f"an end moment there and psi = {cl.moment_ratio:g} times it at the other end; N_Ed includes R over "
             "the whole length (conservative for any connection height).",
             f"Material: {mf.label}, f_y = {mf.f_y:g} MPa at t_f = {sec.tf:g} mm, {mw.f_y:g} MPa at t_w = "
             f"{sec.tw:g} mm. {mf.note}",
             "Combinations tried (EN 1990 6.4.3.2, each variable action leading in turn; each check shown in the "
             "one that governs it): " + "; ".join(
                 f"{cc.name}: N_Ed = {ff[0] / 1e3:.1f} kN, M_y,Ed = {ff[1] / 1e6:.2f} kNm, M_z,Ed = {ff[2] / 1e6:.2f} kNm"
                 for cc, ff in zip(combos, forces)) + ".")
    return ExistingMemberResult("column", tuple(recs), tuple(rows), basis, c.name, mf)


# ======================================================================== supporting beam
def _beam_loads(sec: Any, bl: ExistingBeamLoads, parts: Sequence[ReactionPart]) -> list[Any]:
    cat = bl.category
    loads: list[Any] = [UDL("existing beam self-weight", "permanent", sec.mass * G_ACC)]
    if bl.udl.permanent > 0:
        loads.append(UDL("existing floor, permanent", "permanent", bl.udl.permanent))
    if bl.udl.imposed > 0:
        loads.append(UDL("existing floor, imposed", "imposed", bl.udl.imposed, category=cat))
    for i, p in enumerate(bl.points, start=1):
        if p.load.permanent > 0:
            loads.append(PointLoad(f"existing point {i}, permanent", "permanent", p.load.permanent, p.x))
        if p.load.imposed > 0:
            loads.append(PointLoad(f"existing point {i}, imposed", "imposed", p.load.imposed, p.x, category=cat))
    for p in parts:
        loads.append(PointLoad(f"new beam reaction ({p.action_name})", p.action, p.R, bl.at, category=p.category,
                               group=_group(p.action_name, p.action, p.category)))
    return loads


def _merged_reaction(loads: Sequence[Any], a: float) -> tuple[Any, ...]:
    """The factored loads with the new beam's reaction parts drawn as one point load."""
    new = [ld for ld in loads if isinstance(ld, PointLoad) and ld.name.startswith("new beam")]
    rest = tuple(ld for ld in loads if ld not in new)
    if not new:
        return rest
    return rest + (PointLoad("new beam reaction", "permanent", sum(ld.P for ld in new), a),)


def beam_member_checks(sec: Any, bl: ExistingBeamLoads, mat_at: Callable[[float], Any], det: Any,
                       parts: Sequence[ReactionPart], na: NationalAnnex, psi: Any, calc: Calc,
                       e_torsion: float) -> ExistingMemberResult:
    """The existing supporting beam with its own loads and the new reaction (see the module docstring)."""
    mf, mw = mat_at(sec.tf), mat_at(sec.tw)
    f_y = mf.f_y
    L, a = bl.span, bl.at
    loads = _beam_loads(sec, bl, parts)
    uls = [(c, SimpleBeam(L, c.loads)) for c in uls_combinations(loads, na, psi)]
    out: list[CheckRecord] = []
    cls = _section_class(sec, f_y, compression=False)
    where = f"existing beam span {L / 1e3:g} m, new beam at {a / 1e3:g} m"
    if cls == 4:
        rec = not_checked(id="ex_beam_class4", title="Existing beam: Class 4 cross-section",
                          clause="EN 1993-1-5:2006, 4.4",
                          reason="the existing beam is Class 4 in bending: effective properties are not applied here")
        return ExistingMemberResult("beam", (rec,))
    W = sec.Wpl_y if cls <= 2 else sec.Wel_y
    ext = [(c, b, b.M_max(), b.V_max()) for c, b in uls]      # extremes found once per combination
    cM, _, eM, _ = max(ext, key=lambda t: t[2].abs)
    cV, _, _, eV = max(ext, key=lambda t: t[3].abs)
    M_Ed, x_M, V_Ed = eM.abs, eM.x_mm, eV.abs
    note = f"Class {cls} in bending, f_y = {f_y:g} MPa at t_f = {sec.tf:g} mm; {where}"
    # bending
    calc.note(f"Governing combination for bending {cM.name}: {cM.expression}.")
    Mc = calc(f11.M_c_Rd, W_y=W, f_y=f_y, gamma_M0=na.gamma_M0)
    out.append(calc.record(id="ex_beam_bending", title="Existing beam: bending", clause="EN 1993-1-1:2005, 6.2.5(2), "
                           "Eq. 6.13", demand=M_Ed, resistance=Mc, unit="Nmm", location_mm=x_M,
                           note=f"{cM.name}; {note}"))
    # shear
    eps_w = f11.epsilon(f_y=mw.f_y)
    u_hw = f11.shear_buckling_ratio(h_w=sec.hw, t_w=sec.tw, epsilon=eps_w, eta=na.eta)
    Vpl = calc(f11.V_pl_Rd, A_v=sec.Av_z, f_y=f_y, gamma_M0=na.gamma_M0)
    out.append(calc.record(id="ex_beam_shear", title="Existing beam: shear", clause="EN 1993-1-1:2005, 6.2.6(2), "
                           "Eq. 6.18", demand=V_Ed, resistance=Vpl, unit="N", note=f"{cV.name}; {note}"))
    if u_hw > 1.0:
        out.append(not_checked(id="ex_beam_shear_buckling", title="Existing beam: shear buckling of the web",
                               clause="EN 1993-1-5:2006, 5.2",
                               reason=f"h_w/t_w exceeds 72 eps/eta (ratio {u_hw:.2f}): shear buckling is not checked "
                                      "for the existing beam here"))
    # bending with shear: at the maximum moment and at the connection point, every combination
    worst = None
    for c, b, em, _ in ext:
        for x in (em.x_mm, a):
            Vx = max(abs(float(b.V(x, "left"))), abs(float(b.V(x, "right"))))
            Mx = abs(float(b.M(x)))
            rho = f11.rho_V(V_Ed=Vx, V_pl_Rd=Vpl)
            MV = f11.M_y_V_Rd(W_pl_y=W, rho=rho, A_w=sec.hw * sec.tw, t_w=sec.tw, f_y=f_y, gamma_M0=na.gamma_M0,
                              M_c_Rd=Mc) if cls <= 2 else f11.M_y_V_Rd_el(W_el_y=W, rho=rho, t_w=sec.tw, h_w=sec.hw,
                                                                          h=sec.h, f_y=f_y, gamma_M0=na.gamma_M0,
                                                                          M_c_Rd=Mc)
            u = Mx / MV if MV > 0 else math.inf
            if worst is None or u > worst[0]:
                worst = (u, c, x, Mx, Vx)
    _, c, x, Mx, Vx = worst
    calc.keep("V_Ed", Vx, "N")
    rho = calc(f11.rho_V, V_Ed=Vx, V_pl_Rd=Vpl)
    if cls <= 2:
        MV = calc(f11.M_y_V_Rd, W_pl_y=W, rho=rho, A_w=sec.hw * sec.tw, t_w=sec.tw, f_y=f_y, gamma_M0=na.gamma_M0,
                  M_c_Rd=Mc)
    else:
        MV = calc(f11.M_y_V_Rd_el, W_el_y=W, rho=rho, t_w=sec.tw, h_w=sec.hw, h=sec.h, f_y=f_y, gamma_M0=na.gamma_M0,
                  M_c_Rd=Mc)
    out.append(calc.record(id="ex_beam_bending_shear", title="Existing beam: bending with shear",
                           clause="EN 1993-1-1:2005, 6.2.8(5), Eq. 6.30", demand=Mx, resistance=MV, unit="Nmm",
                           location_mm=x, note=f"{c.name}, at x = {x / 1e3:.3f} m; {note}"))
    # lateral-torsional buckling per segment
    z_own = {"top flange": sec.h / 2.0, "shear centre": 0.0, "bottom flange": -sec.h / 2.0}[bl.load_level]
    depth_bolts = det.top + det.h_p / 2.0
    z_conn = sec.h / 2.0 - depth_bolts
    edges = [0.0, *bl.restraints, L]
    for i, (x0, x1) in enumerate(zip(edges, edges[1:]), start=1):
        Ls = x1 - x0
        best = None
        for cc, b in uls:
            xs = np.linspace(x0, x1, 65)
            Ms = np.abs(np.asarray(b.M(xs)))
            m = float(Ms.max())
            if best is None or m > best[0]:
                best = (m, cc, b)
        M_seg, cc, b = best
        if M_seg <= 0.0:
            continue
        q = sum(ld.w for ld in cc.loads if isinstance(ld, UDL))
        pts = [(ld.x - x0, ld.P, z_conn if ld.name.startswith("new beam") else z_own)
               for ld in cc.loads if isinstance(ld, PointLoad) and x0 <= ld.x <= x1]
        # the segment's moment diagram as samples (exact at the point loads, linear between 1/128 steps)
        xs = sorted_unique(np.concatenate((np.linspace(x0, x1, 129), [p[0] + x0 for p in pts])))
        Mdiag = (xs - x0, np.asarray(b.M(xs), dtype=float))
        res = mcr_numerical(sec, Ls, Mdiag, q_N_per_mm=q, point_loads=pts, z_g_mm=z_own)
        C1 = C_1_numerical(sec, Ls, Mdiag)
        calc.note(f"Segment {i} ({x0 / 1e3:g} to {x1 / 1e3:g} m), {cc.name}: $M_{{cr}}$ = "
                  f"{res.M_cr / 1e6:.1f} kNm by thin-walled beam finite elements (own loads at the {bl.load_level}, "
                  f"{z_own:+.0f} mm; the new reaction at the bolt group, {z_conn:+.0f} mm from the shear centre with "
                  f"the tops of steel level), $C_1$ = {C1:.3f}.")
        if math.isfinite(res.M_cr):
            calc.keep("M_cr", res.M_cr, "Nmm")
        mcr_reference(calc, sec, Ls, res.M_cr)
        chi = _chi_LT(calc, sec, W, f_y, res.M_cr, M_seg, na, C_1=C1)
        Mb = calc(f11.M_b_Rd, chi_LT_mod=chi, W_y=W, f_y=f_y, gamma_M1=na.gamma_M1)
        out.append(calc.record(id=f"ex_beam_ltb_{i}", title=f"Existing beam: lateral-torsional buckling, segment {i}",
                               clause="EN 1993-1-1:2005, 6.3.2.1, Eq. 6.54", demand=M_seg, resistance=Mb, unit="Nmm",
                               note=f"{cc.name}; {note}"))
    # deflection under the variable actions
    sls = sls_variable_characteristic(loads, psi)
    if sls:
        dmax = max(abs(SimpleBeam(L, c.loads, I=sec.Iy).w_max().value) for c in sls)
        rec = check_deflection(dmax, L, bl.deflection_limit, which="existing beam, variable actions", calc=calc)
        out.append(replace(rec, id="ex_beam_deflection",
                           title=f"Existing beam: deflection, variable actions, span/{bl.deflection_limit:g}",
                           note="characteristic variable actions including the new reaction's variable parts "
                                "(the new beam's permanent load adds to the existing permanent deflection: "
                                "shim or pre-camber on site as needed)"))
    # torsion from the one-sided connection
    R_d = 0.0
    for c, b in uls:
        R_d = max(R_d, sum(ld.P for ld in c.loads if isinstance(ld, PointLoad) and ld.name.startswith("new beam")))
    T = R_d * e_torsion
    if bl.torsion == "restrained":
        out.append(not_checked(id="ex_beam_torsion", title="Existing beam: torsion from the one-sided connection",
                               clause="EN 1993-1-1:2005, 6.2.7",
                               reason=f"torque T = {R_d / 1e3:.1f} kN x {e_torsion:.1f} mm = {T / 1e6:.2f} kNm taken "
                                      "as restrained by the floor (job: torsion = 'restrained'): confirm the floor's "
                                      "connection to the existing beam can take it"))
    else:
        calc.note(f"Torque from the one-sided connection $T_{{Ed}}$ = {R_d / 1e3:.1f} kN x {e_torsion:.1f} mm = "
                  f"{T / 1e6:.2f} kNm at x = {a / 1e3:g} m; twist prevented at both supports (fork ends).")
        T_end = T * max(L - a, a) / L
        t_max = max(getattr(sec, "tf_root", sec.tf), sec.tw)
        tau = calc(tau_t_Ed, T_Ed=T_end, t_max=t_max, I_t=sec.It)
        V_end = V_Ed
        VT = calc(fc.V_pl_T_Rd, V_pl_Rd=Vpl, tau_t_Ed=tau, f_y=f_y, gamma_M0=na.gamma_M0)
        out.append(calc.record(id="ex_beam_torsion_shear", title="Existing beam: shear with St Venant torsion",
                               clause="EN 1993-1-1:2005, 6.2.7(9), Eq. 6.26", demand=V_end, resistance=VT, unit="N",
                               note="the whole torque by St Venant torsion, shared between the supports by the "
                                    "distances (conservative for the shear stress); " + note))
        M_at = max(abs(float(b.M(a))) for _, b in uls)
        Mfl = calc(M_fl_warping, T_Ed=T, h=sec.h, t_f=sec.tf, a=a, L=L)
        Uw = calc(U_bending_warping, M_y_Ed=M_at, W_el_y=sec.Wel_y, M_fl=Mfl, b=sec.b, t_f=sec.tf, f_y=f_y,
                  gamma_M0=na.gamma_M0)
        out.append(calc.record(id="ex_beam_torsion_warping", guidance=GUIDANCE_WARPING, title="Existing beam: bending with warping from torsion",
                               clause="EN 1993-1-1:2005, 6.2.7(5)", demand=Uw, resistance=1.0, unit="",
                               location_mm=a,
                               note="the whole torque by warping (flange-bending analogy, published torsion design "
                                    "guidance, conservative), elastic stresses at the flange tips; " + note))
    rows = [("existing beam self-weight", "permanent", f"{sec.mass * G_ACC:.2f} kN/m", "full span")]
    if bl.udl.total:
        rows += [("existing line load", "permanent", f"{bl.udl.permanent:g} kN/m", "full span"),
                 ("existing line load", f"imposed {bl.category}", f"{bl.udl.imposed:g} kN/m", "full span")]
    for i, p in enumerate(bl.points, start=1):
        rows += [(f"existing point load {i}", "permanent", f"{p.load.permanent / 1e3:g} kN", f"at {p.x / 1e3:g} m"),
                 (f"existing point load {i}", f"imposed {bl.category}", f"{p.load.imposed / 1e3:g} kN",
                  f"at {p.x / 1e3:g} m")]
    for p in parts:
        rows.append(("new beam reaction", p.action_name if p.action != "permanent" else "permanent",
                     f"{p.R / 1e3:.2f} kN", f"at {a / 1e3:g} m, {z_conn:+.0f} mm from the shear centre"))
    basis = (f"Existing beam simply supported over {L / 1e3:g} m, fork supports; lateral restraints at "
             + (", ".join(f"{r / 1e3:g} m" for r in bl.restraints) or "the supports only")
             + f"; its own loads at the {bl.load_level}.",
             f"Torque from the one-sided connection: reaction line {e_torsion:.1f} mm from the web centre; "
             + ("checked (St Venant shear and warping, each taking the whole torque)." if bl.torsion == "free" else
                "taken as restrained by the floor (stated in the job; NOT CHECKED)."),
             f"Material: {mf.label}, f_y = {mf.f_y:g} MPa at t_f = {sec.tf:g} mm. {mf.note}")
    return ExistingMemberResult("beam", tuple(out), tuple(rows), basis, cM.name, mf,
                                diagram=(L, _merged_reaction(cM.loads, a), tuple(bl.restraints)))


def existing_member_checks(sec: Any, loads: Any, mat_at: Callable[[float], Any], face: str, det: Any,
                           parts: Sequence[ReactionPart] | None, V_Ed: float, na: NationalAnnex, psi: Any = None,
                           tie: float = 75_000.0, calc: Calc | None = None) -> ExistingMemberResult:
    """Member checks of the existing member, or a NOT CHECKED record when ``loads`` is None.

    ``parts``: the new beam's characteristic reactions per action (None: ``V_Ed`` as a permanent action
    factored to at least V_Ed in every combination, conservative).
    """
    calc = calc or Calc()
    psi = psi or PSI_UK_NA
    if loads is None:
        res = _not_checked_member(face, "")
    else:
        parts = tuple(parts) if parts else design_valued_reaction(V_Ed, na)
        if isinstance(loads, ExistingColumnLoads):
            res = column_member_checks(sec, loads, mat_at, face, det, parts, na, psi, tie, calc)
        elif isinstance(loads, ExistingBeamLoads):
            e = sec.tw / 2.0 + det.z
            res = beam_member_checks(sec, loads, mat_at, det, parts, na, psi, calc, e)
        else:
            raise TypeError(f"existing loads of type {type(loads).__name__}")
    return replace(res, records=res.records + (_downstream(face, loads, V_Ed),))


def _downstream(face: str, loads: Any, V_Ed: float) -> CheckRecord:
    """NOT CHECKED: what carries the added load further down (the package stops at the existing member)."""
    if face == "beam web":
        if isinstance(loads, ExistingBeamLoads):
            L, a = loads.span, loads.at
            share = (f"about {V_Ed * (L - a) / L / 1e3:.1f} kN at its left support and {V_Ed * a / L / 1e3:.1f} kN "
                     "at its right support (design values, by the lever rule)")
        else:
            share = f"{V_Ed / 1e3:.1f} kN (design) shared between its supports"
        return not_checked(id="ex_downstream", title="Existing beam: its own end connections and supports",
                           clause="EN 1993-1-8:2005",
                           reason=f"the new beam adds {share}: the existing beam's end connections and what "
                                  "supports them are not checked here; check them for the increased reactions")
    return not_checked(id="ex_downstream", title="Existing column: splices, base and foundation below",
                       clause="EN 1993-1-8:2005, 6.2.8",
                       reason=f"the new beam adds {V_Ed / 1e3:.1f} kN (design) to the column below this level: its "
                              "splices, base plate, holding-down bolts and foundation (EN 1997) are not checked here")


__all__ = ["ReactionPart", "ExistingMemberResult", "reactions_by_action", "design_valued_reaction",
           "existing_member_checks", "column_member_checks", "beam_member_checks", "E_NOMINAL_FACE", "GUIDANCE_ECC"]
