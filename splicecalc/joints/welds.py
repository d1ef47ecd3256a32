"""Fillet welds to EN 1993-1-8:2005, section 4: clause formulas and checks.

Units: N, mm, MPa; weld forces and resistances per unit length in N/mm (= kN/m).
The strength is that of the weaker part joined (lower f_u, with its beta_w),
EN 1993-1-8:2005, 4.5.3.2(6); matching or overmatching consumables assumed (4.2).

Data
    ``BETA_W``, :func:`beta_w_for`, :func:`weld_strength` (f_u and beta_w of the weaker part)
Clause formulas (``@clause``)
    :func:`a_throat`, :func:`F_w_Rd` (simplified, 4.5.3.3), :func:`F_w_Rd_dir` (directional,
    force at angle theta to the weld axis), :func:`sigma_w_eq`, :func:`f_w_Rd`,
    :func:`sigma_perp_Rd` (Eq. 4.1 parts), :func:`beta_Lw_1` (long welds, 4.11),
    :func:`a_full_strength` (double fillet, transverse, from Eq. 4.1),
    :func:`a_full_strength_simple` (double fillet, simplified method)
Checks (return :class:`~splicecalc.core.record.CheckRecord`)
    :func:`check_fillet_weld`, :func:`check_fillet_weld_stresses`, :func:`check_fillet_weld_geometry`,
    :func:`check_full_strength_fillet`
Helpers
    :func:`full_strength_fillet` -> :class:`FullStrengthFillet` (required throat and leg)
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from math import cos, pi, sqrt

from ..core.clause import clause
from ..core.errors import require_choice, require_in_range, require_non_negative, require_positive
from ..core.record import Calc, CheckRecord
from ..materials.partial_factors import UK_NA, NationalAnnex
from ..materials.steel import normalise_grade, steel
from ..materials.partial_factors import require_national_annex

# shared validator (one definition)
_na = require_national_annex


#: correlation factor beta_w, EN 1993-1-8:2005, 4.5.3.2, Table 4.1 (S420/S460: EN 10025-3/-4 rows)
BETA_W: dict[str, float] = {"S235": 0.80, "S275": 0.85, "S355": 0.90, "S420": 1.00, "S460": 1.00}


def beta_w_for(grade: str) -> float:
    """beta_w of a steel grade, EN 1993-1-8:2005, 4.5.3.2, Table 4.1."""
    return BETA_W[normalise_grade(grade)]


def weld_strength(grade: str, t: float, grade_other: str | None = None,
                  t_other: float | None = None) -> tuple[float, float, str]:
    """(f_u MPa, beta_w, grade) of the weaker of the two parts joined (lower f_u), 4.5.3.2(6).

    ``t`` / ``t_other`` are the part thicknesses (mm) for the EN 10025 f_u lookup.
    """
    s1 = steel(grade, t, field="t")
    parts = [(s1.f_u, BETA_W[s1.grade], s1.grade)]
    if grade_other is not None:
        s2 = steel(grade_other, t if t_other is None else t_other, field="t_other")
        parts.append((s2.f_u, BETA_W[s2.grade], s2.grade))
    return min(parts, key=lambda p: (p[0], p[1]))


# ------------------------------------------------------------------ clause formulas
@clause("EN 1993-1-8:2005, 4.5.2(1)", units={"s": "mm"}, returns="mm", example=dict(s=6.0, k_a=0.7))
def a_throat(s: float, k_a: float = 0.7) -> float:
    """Throat a of an equal-leg 90 degree fillet of leg s (mm): a = 0.7 s (1/sqrt 2 rounded down)."""
    a = k_a * s
    return a


@clause("EN 1993-1-8:2005, 4.5.3.3, Eq. 4.3, Eq. 4.4", units={"a": "mm", "f_u": "MPa"}, returns="N/mm",
        example=dict(a=4.2, f_u=410.0, beta_w=0.85, gamma_M2=1.25))
def F_w_Rd(a: float, f_u: float, beta_w: float, gamma_M2: float) -> float:
    """Fillet weld resistance per unit length, simplified method (N/mm), Eq. 4.3/4.4."""
    f_vw_d = f_u / (sqrt(3) * beta_w * gamma_M2)
    F_w_Rd = f_vw_d * a
    return F_w_Rd


@clause("EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1", units={"a": "mm", "f_u": "MPa"}, returns="N/mm",
        example=dict(a=4.2, f_u=410.0, beta_w=0.85, gamma_M2=1.25, theta=90.0))
def F_w_Rd_dir(a: float, f_u: float, beta_w: float, gamma_M2: float, theta: float) -> float:
    """Equal-leg fillet resistance per unit length (N/mm) for a force at ``theta`` degrees to the weld axis.

    From Eq. 4.1 with sigma_perp = tau_perp = F sin(theta)/(a sqrt 2) and
    tau_par = F cos(theta)/a: F = a f_u / (beta_w gamma_M2 sqrt(2 + cos^2 theta)),
    i.e. K = sqrt(3/(2 + cos^2 theta)) times the simplified value (K = 1 longitudinal,
    1.225 transverse). The second condition sigma_perp <= 0.9 f_u/gamma_M2 holds
    for beta_w >= 0.56, i.e. for every grade of Table 4.1.
    """
    K = sqrt(3 / (2 + cos(theta * pi / 180) ** 2))
    F_w_Rd = K * a * f_u / (sqrt(3) * beta_w * gamma_M2)
    return F_w_Rd


@clause("EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1", units={"sigma_perp": "MPa", "tau_perp": "MPa", "tau_par": "MPa"},
        returns="MPa", example=dict(sigma_perp=150.0, tau_perp=150.0, tau_par=80.0))
def sigma_w_eq(sigma_perp: float, tau_perp: float, tau_par: float) -> float:
    """Left side of Eq. 4.1 (MPa): sqrt(sigma_perp^2 + 3 (tau_perp^2 + tau_par^2))."""
    sigma_w_eq = sqrt(sigma_perp ** 2 + 3 * (tau_perp ** 2 + tau_par ** 2))
    return sigma_w_eq


@clause("EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1", units={"f_u": "MPa"}, returns="MPa",
        example=dict(f_u=410.0, beta_w=0.85, gamma_M2=1.25))
def f_w_Rd(f_u: float, beta_w: float, gamma_M2: float) -> float:
    """Right side of Eq. 4.1 (MPa): f_u / (beta_w gamma_M2)."""
    f_w_Rd = f_u / (beta_w * gamma_M2)
    return f_w_Rd


@clause("EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1", units={"f_u": "MPa"}, returns="MPa",
        example=dict(f_u=410.0, gamma_M2=1.25))
def sigma_perp_Rd(f_u: float, gamma_M2: float) -> float:
    """Second condition of Eq. 4.1 (MPa): sigma_perp <= 0.9 f_u / gamma_M2."""
    sigma_perp_Rd = 0.9 * f_u / gamma_M2
    return sigma_perp_Rd


@clause("EN 1993-1-8:2005, 4.11, Eq. 4.9", units={"L_j": "mm", "a": "mm"}, returns="",
        example=dict(L_j=1200.0, a=5.6))
def beta_Lw_1(L_j: float, a: float) -> float:
    """Long lap-joint welds, Eq. 4.9: 1.2 - 0.2 L_j/(150 a) <= 1.0 (applies when L_j > 150 a)."""
    beta_Lw_1 = min(1.2 - 0.2 * L_j / (150 * a), 1.0)
    return beta_Lw_1


@clause("EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1", units={"t": "mm", "f_y": "MPa", "f_u": "MPa"}, returns="mm",
        example=dict(t=10.0, f_y=275.0, f_u=410.0, beta_w=0.85, gamma_M0=1.0, gamma_M2=1.25))
def a_full_strength(t: float, f_y: float, f_u: float, beta_w: float, gamma_M0: float, gamma_M2: float) -> float:
    """Throat (mm) of each of two fillets so that the pair carries the plate's t f_y / gamma_M0 transversely.

    Two welds at the transverse resistance a f_u/(sqrt 2 beta_w gamma_M2) (Eq. 4.1, theta = 90 deg):
    a = beta_w gamma_M2 f_y t / (sqrt 2 f_u gamma_M0).
    """
    a_req = beta_w * gamma_M2 * f_y * t / (sqrt(2) * f_u * gamma_M0)
    return a_req


@clause("EN 1993-1-8:2005, 4.5.3.3, Eq. 4.4", units={"t": "mm", "f_y": "MPa", "f_u": "MPa"}, returns="mm",
        example=dict(t=10.0, f_y=275.0, f_u=410.0, beta_w=0.85, gamma_M0=1.0, gamma_M2=1.25))
def a_full_strength_simple(t: float, f_y: float, f_u: float, beta_w: float, gamma_M0: float,
                           gamma_M2: float) -> float:
    """Throat (mm) of each of two fillets by the simplified method: a = sqrt 3 beta_w gamma_M2 f_y t / (2 f_u gamma_M0)."""
    a_req = sqrt(3) * beta_w * gamma_M2 * f_y * t / (2 * f_u * gamma_M0)
    return a_req


# ------------------------------------------------------------------------ checks


def check_fillet_weld(F_w_Ed: float, s: float, grade: str, t: float, *, grade_other: str | None = None,
                      t_other: float | None = None, theta: float | None = None, L_j: float | None = None,
                      na: NationalAnnex = UK_NA, calc: Calc | None = None, id: str = "fillet_weld",
                      title: str = "Fillet weld", location_mm: float | None = None) -> CheckRecord:
    """Equal-leg fillet weld, force per unit length F_w_Ed (N/mm), leg ``s`` (mm).

    ``theta=None``: simplified method, EN 1993-1-8:2005, 4.5.3.3 (any direction).
    ``theta`` in degrees between the resultant force and the weld axis: directional
    method, 4.5.3.2 Eq. 4.1 (see :func:`F_w_Rd_dir`). ``L_j``: length of a lap joint
    weld (mm) for the long-weld reduction beta_Lw,1 (4.11) when L_j > 150 a.
    f_u and beta_w are those of the weaker part (grade at thickness t, grade_other at t_other).
    """
    na = _na(na)
    F_w_Ed = require_non_negative("F_w_Ed", F_w_Ed, "N/mm")
    s = require_positive("s", s, "mm")
    t = require_positive("t", t, "mm")
    if theta is not None:
        theta = require_in_range("theta", theta, 0.0, 90.0, "degrees")
    if L_j is not None:
        L_j = require_positive("L_j", L_j, "mm")
    f_u, b_w, g = weld_strength(grade, t, grade_other, t_other)
    calc = calc if calc is not None else Calc()
    a = calc(a_throat, s=s)
    if theta is None:
        F_Rd = calc(F_w_Rd, a=a, f_u=f_u, beta_w=b_w, gamma_M2=na.gamma_M2)
        cl = "EN 1993-1-8:2005, 4.5.3.3, Eq. 4.3"
    else:
        F_Rd = calc(F_w_Rd_dir, a=a, f_u=f_u, beta_w=b_w, gamma_M2=na.gamma_M2, theta=theta)
        cl = "EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1"
    if L_j is not None and L_j > 150.0 * a:
        b_Lw = calc(beta_Lw_1, L_j=L_j, a=a)
        F_Rd = b_Lw * F_Rd
        calc.keep("beta_Lw_1", b_Lw)
    calc.keep("a", a, "mm")
    calc.keep("F_w_Rd", F_Rd, "N/mm")
    how = "simplified" if theta is None else f"directional, theta = {theta:g} deg"
    return calc.record(id=id, title=title, clause=cl, demand=F_w_Ed, resistance=F_Rd, unit="N/mm",
                       location_mm=location_mm, note=f"{s:g} mm leg, weaker part {g} (f_u = {f_u:g} MPa), {how}")


def check_fillet_weld_stresses(sigma_perp: float, tau_perp: float, tau_par: float, grade: str, t: float, *,
                               grade_other: str | None = None, t_other: float | None = None,
                               na: NationalAnnex = UK_NA, calc: Calc | None = None, id: str = "fillet_weld_dir",
                               title: str = "Fillet weld, directional method",
                               location_mm: float | None = None) -> CheckRecord:
    """Throat stresses (MPa) by the directional method, EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1.

    Utilisation (dimensionless) = max(sigma_w,eq / (f_u/(beta_w gamma_M2)), |sigma_perp| / (0.9 f_u/gamma_M2)).
    """
    na = _na(na)
    sp = require_in_range("sigma_perp", sigma_perp, -1e5, 1e5, "MPa")
    tp = require_in_range("tau_perp", tau_perp, -1e5, 1e5, "MPa")
    tl = require_in_range("tau_par", tau_par, -1e5, 1e5, "MPa")
    t = require_positive("t", t, "mm")
    f_u, b_w, g = weld_strength(grade, t, grade_other, t_other)
    calc = calc if calc is not None else Calc()
    s_eq = calc(sigma_w_eq, sigma_perp=sp, tau_perp=tp, tau_par=tl)
    f_Rd = calc(f_w_Rd, f_u=f_u, beta_w=b_w, gamma_M2=na.gamma_M2)
    s_Rd = calc(sigma_perp_Rd, f_u=f_u, gamma_M2=na.gamma_M2)
    calc.keep("sigma_w_eq", s_eq, "MPa")
    calc.keep("f_w_Rd", f_Rd, "MPa")
    calc.keep("sigma_perp_Rd", s_Rd, "MPa")
    u = max(s_eq / f_Rd, abs(sp) / s_Rd)
    return calc.record(id=id, title=title, clause="EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1", demand=u,
                       resistance=1.0, unit="", location_mm=location_mm,
                       note=f"weaker part {g}; utilisation = max of the two conditions of Eq. 4.1")


def check_fillet_weld_geometry(s: float, L: float, *, calc: Calc | None = None, id: str = "fillet_weld_geometry",
                               location_mm: float | None = None) -> list[CheckRecord]:
    """Minimum throat a >= 3 mm (4.5.2(2)) and effective length >= max(30 mm, 6 a) (4.5.1(2)).

    ``s`` leg (mm), ``L`` effective length (mm). For minima the demand is the
    required value and the resistance the provided one.
    """
    s = require_positive("s", s, "mm")
    L = require_positive("L", L, "mm")
    calc = calc if calc is not None else Calc()
    a = calc(a_throat, s=s)
    r1 = calc.record(id=f"{id}_throat", title="Fillet weld minimum throat", clause="EN 1993-1-8:2005, 4.5.2(2)",
                     demand=3.0, resistance=a, unit="mm", location_mm=location_mm)
    L_min = max(30.0, 6.0 * a)
    r2 = calc.record(id=f"{id}_length", title="Fillet weld minimum effective length",
                     clause="EN 1993-1-8:2005, 4.5.1(2)", demand=L_min, resistance=L, unit="mm",
                     location_mm=location_mm, note="max(30 mm, 6 a)")
    return [r1, r2]


@dataclass(frozen=True)
class FullStrengthFillet:
    """Required throat ``a_req`` (mm), the matching exact leg ``s_req`` = a_req/0.7 and the leg rounded up to 1 mm."""

    a_req: float
    s_req: float
    s: float
    grade: str
    method: str


def full_strength_fillet(t: float, grade: str, *, grade_other: str | None = None, t_other: float | None = None,
                         method: str = "directional", na: NationalAnnex = UK_NA,
                         calc: Calc | None = None) -> FullStrengthFillet:
    """Fillet size on both sides of a plate (thickness t mm, ``grade``) to develop its f_y t / gamma_M0.

    ``method='directional'`` (transverse load, 4.5.3.2) or ``'simplified'`` (4.5.3.3).
    f_u, beta_w from the weaker part joined; f_y of the plate.
    """
    na = _na(na)
    t = require_positive("t", t, "mm")
    require_choice("method", method, ("directional", "simplified"))
    plate = steel(grade, t, field="t")
    f_u, b_w, g = weld_strength(grade, t, grade_other, t_other)
    calc = calc if calc is not None else Calc()
    fn = a_full_strength if method == "directional" else a_full_strength_simple
    a = calc(fn, t=t, f_y=plate.f_y, f_u=f_u, beta_w=b_w, gamma_M0=na.gamma_M0, gamma_M2=na.gamma_M2)
    s_req = a / 0.7
    return FullStrengthFillet(a_req=a, s_req=s_req, s=float(math.ceil(s_req - 1e-9)), grade=g, method=method)


def check_full_strength_fillet(s: float, t: float, grade: str, *, grade_other: str | None = None,
                               t_other: float | None = None, method: str = "directional",
                               na: NationalAnnex = UK_NA, calc: Calc | None = None,
                               id: str = "fillet_full_strength", title: str = "Full-strength fillet welds",
                               location_mm: float | None = None) -> CheckRecord:
    """Provided leg ``s`` (mm, both sides) against the full-strength throat for a plate ``t`` (mm).

    Demand = required throat, resistance = provided throat 0.7 s (mm).
    """
    s = require_positive("s", s, "mm")
    calc = calc if calc is not None else Calc()
    fs = full_strength_fillet(t, grade, grade_other=grade_other, t_other=t_other, method=method, na=na, calc=calc)
    a = calc(a_throat, s=s)
    calc.keep("a_req", fs.a_req, "mm")
    cl = "EN 1993-1-8:2005, 4.5.3.2, Eq. 4.1" if method == "directional" else "EN 1993-1-8:2005, 4.5.3.3, Eq. 4.4"
    return calc.record(id=id, title=title, clause=cl, demand=fs.a_req, resistance=a, unit="mm",
                       location_mm=location_mm, note=f"double fillet, {method} method, weaker part {fs.grade}")


__all__ = [
    "BETA_W", "beta_w_for", "weld_strength", "a_throat", "F_w_Rd", "F_w_Rd_dir", "sigma_w_eq", "f_w_Rd",
    "sigma_perp_Rd", "beta_Lw_1", "a_full_strength", "a_full_strength_simple", "check_fillet_weld",
    "check_fillet_weld_stresses", "check_fillet_weld_geometry", "FullStrengthFillet", "full_strength_fillet",
    "check_full_strength_fillet",
]
