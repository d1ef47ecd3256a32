"""Member checks to EN 1993-1-1:2005 and EN 1993-1-5:2006 (UK National Annex by default).

Each ``check_*`` function validates its input, calls the clause formulas of
:mod:`.en1993_1_1`, :mod:`.en1993_1_5` and :mod:`.mcr` through a
:class:`~splicecalc.core.record.Calc` and returns a
:class:`~splicecalc.core.record.CheckRecord`.

Units of the arguments: moments ``M_Ed`` in N*mm, forces ``V_Ed``/``F_Ed`` in N,
lengths in mm, areas in mm2 (records show kN, kNm, mm). Signs of ``M_Ed`` and
``V_Ed`` are ignored (magnitudes are checked).

``section`` is any object with the attributes of
:class:`splicecalc.sections.Section` (doubly symmetric rolled I or H):
``h, b, tw, tf, r`` (mm), ``A`` (mm2), ``Iy, Iz, It`` (mm4), ``Iw`` (mm6),
``Wel_y, Wpl_y`` (mm3) and ``designation``. The yield strength is taken for
the flange thickness (the thickest element, EN 10025-2 via
:func:`splicecalc.materials.steel`) for the resistances (the lower value,
conservative). The epsilon of each element is from its own thickness: Table 5.2
classifies the web with f_y for t_w, and the shear-buckling limit of 6.2.6(6)
uses the web's epsilon; web bearing uses f_yf and f_yw separately as
EN 1993-1-5 Eq. 6.8 does.

Slender parts are designed, not refused: a Class 4 cross-section in major-axis bending
gets its effective section modulus W_eff,y (EN 1993-1-5 4.4, :func:`effective_section`),
used for M_c,Rd and lateral-torsional buckling; a web with h_w/t_w > 72 eps/eta gets
the shear-buckling resistance V_b,Rd of EN 1993-1-5 section 5 (non-rigid end posts,
flange contribution neglected) and the bending-shear interaction of EN 1993-1-5 7.1.
:class:`SlenderSectionError` / :class:`ShearBucklingError` remain for callers that
catch them but are no longer raised by these checks.
"""

from __future__ import annotations

import math
from dataclasses import replace
from typing import Any, Sequence

from ..core.errors import InputError, require_finite, require_in_range, require_non_negative, require_positive
from ..core.record import NOT_CHECKED, Calc, CheckRecord
from ..materials.partial_factors import UK_NA, NationalAnnex
from ..materials.steel import E_MPa, steel
from ..sections.geometry import A_v_z
from . import en1993_1_1 as f11
from . import en1993_1_5 as f15
from .mcr import C_1_numerical, M_cr_uniform, mcr_numerical


class SlenderSectionError(InputError):
    """A Class 4 cross-section: effective properties (EN 1993-1-5) are not implemented."""


class ShearBucklingError(InputError):
    """A web with h_w/t_w > 72 eps/eta: the shear-buckling check of EN 1993-1-5 section 5 is not implemented."""


#: imperfection factors, EN 1993-1-1:2005, Table 6.3
ALPHA_LT: dict[str, float] = {"a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}

_SECTION_ATTRS = ("h", "b", "tw", "tf", "A", "Iy", "Iz", "It", "Iw", "Wel_y", "Wpl_y")


# ------------------------------------------------------------------ helpers
def _check_section(section: Any) -> None:
    for name in _SECTION_ATTRS:
        if not hasattr(section, name):
            raise InputError("section", type(section).__name__,
                             "a splicecalc.sections.Section (or an object with h, b, tw, tf, r, A, Iy, Iz, It, Iw, "
                             f"Wel_y, Wpl_y); missing '{name}'")
        require_positive(f"section.{name}", getattr(section, name))
    if not hasattr(section, "r"):
        raise InputError("section", type(section).__name__, "an object with the root radius 'r' (mm)")
    require_non_negative("section.r", section.r, "mm")
    if not 2 * section.tf + 2 * section.r < section.h:
        raise InputError("section.h", section.h, "more than 2 tf + 2 r (a web between the root fillets)")
    if not section.tw + 2 * section.r < section.b:
        raise InputError("section.b", section.b, "more than tw + 2 r (flange outstands)")


def _name(section: Any) -> str:
    return str(getattr(section, "designation", "section"))


def _check_na(na: Any) -> NationalAnnex:
    if not isinstance(na, NationalAnnex):
        raise InputError("na", type(na).__name__, "a splicecalc.materials.NationalAnnex (e.g. UK_NA)")
    return na


def _check_calc(calc: Any) -> Calc:
    if calc is None:
        return Calc()
    if not isinstance(calc, Calc):
        raise InputError("calc", type(calc).__name__, "a splicecalc.core.Calc or None")
    return calc


def _fy(section: Any, grade: str) -> tuple[float, float]:
    """(f_y, f_u) in MPa for the flange thickness (thickest element of a rolled I)."""
    s = steel(grade, section.tf, field="section.tf")
    return s.f_y, s.f_u


def _h_w(section: Any) -> float:
    return section.h - 2.0 * section.tf


def _c_flange(section: Any) -> float:
    return (section.b - section.tw - 2.0 * section.r) / 2.0


def _c_web(section: Any) -> float:
    return section.h - 2.0 * section.tf - 2.0 * section.r


def _loc(location_mm: Any) -> float | None:
    return None if location_mm is None else require_finite("location_mm", location_mm)


_ORD = {1: "Class 1", 2: "Class 2", 3: "Class 3", 4: "Class 4"}


def _class_of(ratio: float, lims: Sequence[float]) -> int:
    for i, lim in enumerate(lims[:3]):
        if ratio <= lim:
            return i + 1
    return 4


def _fy_web(section: Any, grade: str) -> float:
    """f_y (MPa) of the web, for its own thickness t_w (EN 10025-2 via :func:`steel`)."""
    return steel(grade, section.tw, field="section.tw").f_y


def _classification(section: Any, grade: str, N_Ed: float, calc: Calc) -> dict[str, Any]:
    """Run Table 5.2 for flange and web through ``calc``; return classes, ratios and limits.

    Each element is classified with the epsilon of its own yield strength: the flange with
    f_y for t_f, the web with f_y for t_w (a thinner web may be in a higher-strength
    thickness band, EN 10025-2, which gives it a smaller epsilon).
    """
    f_y, _ = _fy(section, grade)
    f_yw = _fy_web(section, grade)
    eps = calc(f11.epsilon, f_y=f_y)
    fl = calc(f11.c_t_flange, c_f=_c_flange(section), t_f=section.tf, epsilon=eps)
    eps_w = eps if f_yw == f_y else calc(f11.epsilon, f_y=f_yw)
    if N_Ed > 0.0:
        alpha = calc(f11.alpha_web, N_Ed=N_Ed, c_w=_c_web(section), t_w=section.tw, f_y=f_yw)
        psi = calc(f11.psi_web, N_Ed=N_Ed, A=section.A, f_y=f_y)
    else:
        alpha, psi = 0.5, -1.0
    wb = calc(f11.c_t_web, c_w=_c_web(section), t_w=section.tw, epsilon=eps_w, alpha=alpha, psi=psi)
    fl = tuple(float(x) for x in fl)
    wb = tuple(float(x) for x in wb)
    cf, cw = _class_of(fl[0], fl[1:]), _class_of(wb[0], wb[1:])
    return dict(f_y=f_y, f_yw=f_yw, epsilon=eps, epsilon_w=eps_w, flange=fl, web=wb, class_flange=cf,
                class_web=cw, section_class=max(cf, cw), alpha=alpha, psi=psi)


def _section_class_fast(section: Any, grade: str, N_Ed: float = 0.0) -> dict[str, Any]:
    return _classification(section, grade, N_Ed, Calc())


# ------------------------------------------------------------------ classification
def section_class(section: Any, grade: str, N_Ed: float = 0.0) -> int:
    """Cross-section class 1-4 (EN 1993-1-1 Table 5.2), for design searches.

    Plain-float path; returns 4 for a slender section instead of raising.
    ``N_Ed`` (N, compression >= 0) changes the web limits (bending and compression).
    """
    _check_section(section)
    N = require_non_negative("N_Ed", N_Ed, "N")
    return _section_class_fast(section, grade, N)["section_class"]


def classify(section: Any, grade: str, na: NationalAnnex = UK_NA, calc: Calc | None = None, *,
             N_Ed: float = 0.0) -> CheckRecord:
    """Classify the cross-section in major-axis bending (and compression ``N_Ed`` >= 0, N), Table 5.2.

    An information record (``kind == "info"``, no utilisation: a class cannot fail):
    ``demand`` = c/t of the governing element, ``resistance`` = the limit of the class
    it reaches (the Class 3 limit for a Class 4 element); ``values`` hold both elements'
    c/t and classes. A Class 4 section is designed with its effective properties
    (EN 1993-1-5 4.4, see :func:`effective_section`). ``na`` is accepted for a uniform
    signature (Table 5.2 has no national choices).
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    N = require_non_negative("N_Ed", N_Ed, "N")
    if N > 0.0:
        calc.note(f"Web in bending and compression, $N_{{Ed}}$ = {N / 1e3:.1f} kN.")
    cl = _classification(section, grade, N, calc)
    k = cl["section_class"]
    kk = min(k, 3)
    u_f = cl["flange"][0] / cl["flange"][min(cl["class_flange"], 3)]
    u_w = cl["web"][0] / cl["web"][min(cl["class_web"], 3)]
    gov, data = ("flange", cl["flange"]) if u_f >= u_w else ("web", cl["web"])
    calc.note(f"Flange {_ORD[cl['class_flange']]}, web {_ORD[cl['class_web']]}: section {_ORD[k]}.")
    calc.keep("f_y", cl["f_y"], "MPa")
    calc.keep("epsilon", cl["epsilon"])
    if cl["f_yw"] != cl["f_y"]:
        calc.keep("f_yw", cl["f_yw"], "MPa")
        calc.keep("epsilon_w", cl["epsilon_w"])
    calc.keep("c_t_flange", cl["flange"][0])
    calc.keep("c_t_web", cl["web"][0])
    calc.keep("Class_flange", cl["class_flange"])
    calc.keep("Class_web", cl["class_web"])
    calc.keep("Class", k)
    gov = "flange" if cl["class_flange"] > cl["class_web"] else ("web" if cl["class_web"] > cl["class_flange"]
                                                                   else gov)
    data = cl["flange"] if gov == "flange" else cl["web"]
    lim = "Class 3 limit exceeded: effective properties, EN 1993-1-5 4.4" if k == 4 else f"{_ORD[k]} limit"
    return calc.info(id="classification", title=f"Cross-section classification, {_name(section)}",
                     clause="EN 1993-1-1:2005, 5.5.2, Table 5.2", demand=data[0], resistance=data[kk], unit="",
                     note=f"{_ORD[k]}; governing element: {gov}, c/t = {data[0]:.2f} ({lim} {data[kk]:.2f}); "
                          "information, no utilisation")


# ------------------------------------------------------------------ Class 4: effective section
def effective_section(section: Any, grade: str, calc: Calc | None = None) -> dict[str, float]:
    """Effective section of a rolled I in sagging major-axis bending, EN 1993-1-5 4.4 (4.3(1) rolled: no shear lag).

    Compression flange first (outstands, k_sigma = 0.43, Table 4.2, psi = 1) with the gross
    web; then the web with psi from the section with the effective flange (4.4(3)), internal
    element of width c = h - 2 t_f - 2 r (as in Table 5.2), k_sigma by Table 4.1, the
    compressed part b_c = c / (1 - psi) reduced to b_eff = rho b_c, split b_e1 = 0.4 b_eff
    (next to the flange) and b_e2 = 0.6 b_eff (next to the neutral axis), Table 4.1.
    Returns W_eff (the smaller elastic modulus of the effective section, mm3), rho_f, rho_w,
    the neutral-axis shift z_n (mm, downwards positive) and I_eff (mm4).
    The removed parts are taken as rectangles; their own second moments are included.
    """
    _check_section(section)
    calc = _check_calc(calc)
    f_y, _ = _fy(section, grade)
    f_yw = _fy_web(section, grade)
    h, tf, tw = section.h, section.tf, section.tw
    eps = f11.epsilon(f_y=f_y)
    eps_w = f11.epsilon(f_y=f_yw)
    # compression flange outstands
    c_f = _c_flange(section)
    lam_f = calc(f15.lambda_p, b_bar=c_f, t=tf, epsilon=eps, k_sigma=0.43)
    rho_f = calc(f15.rho_outstand, lamb_p=lam_f)
    dA_f = 2.0 * (1.0 - rho_f) * c_f * tf
    d_f = (h - tf) / 2.0                               # flange centroid above the gross centroid
    A1 = section.A - dA_f
    I_c = section.Iy - dA_f * d_f**2 - 2.0 * (1.0 - rho_f) * c_f * tf**3 / 12.0
    z1 = -dA_f * d_f / A1                              # neutral axis of the section with the effective flange
    # web (internal element), stress ratio from that section
    c_w = _c_web(section)
    z_t, z_b = c_w / 2.0, -c_w / 2.0
    psi = (z_b - z1) / (z_t - z1)
    k_s = calc(f15.k_sigma_internal, psi=psi)
    lam_w = calc(f15.lambda_p, b_bar=c_w, t=tw, epsilon=eps_w, k_sigma=k_s)
    rho_w = calc(f15.rho_internal, lamb_p=lam_w, psi=psi)
    b_c = c_w / (1.0 - psi) if psi < 0.0 else c_w
    b_eff = rho_w * b_c
    gap = b_c - b_eff
    dA_w = gap * tw
    z_h = z_t - 0.4 * b_eff - gap / 2.0                # centre of the ineffective strip of web
    A2 = A1 - dA_w
    I_c2 = I_c - dA_w * z_h**2 - tw * gap**3 / 12.0
    z2 = (-dA_f * d_f - dA_w * z_h) / A2
    I_eff = I_c2 - A2 * z2**2
    W_eff = I_eff / max(h / 2.0 - z2, h / 2.0 + z2)
    W_eff = min(W_eff, section.Wel_y)
    calc.keep("rho_flange", rho_f)
    calc.keep("psi_web", psi)
    calc.keep("rho_web", rho_w)
    calc.keep("W_eff_y", W_eff, "mm3")
    calc.note(f"Effective section (EN 1993-1-5 4.4): flange outstands $\\rho$ = {rho_f:.3f}, web $\\psi$ = "
              f"{psi:.3f}, $\\rho$ = {rho_w:.3f}; neutral axis {z2:.1f} mm from the gross centroid, "
              f"$W_{{eff,y}}$ = {W_eff / 1e3:.0f} cm$^3$ ($W_{{el,y}}$ = {section.Wel_y / 1e3:.0f} cm$^3$).")
    return dict(W_eff=W_eff, rho_f=rho_f, rho_w=rho_w, psi=psi, z_n=-z2, I_eff=I_eff)


# ------------------------------------------------------------------ bending
def _W_y(section: Any, grade: str, cls: int, A_f_net: float | None, W_net: float | None, na: NationalAnnex,
         calc: Calc) -> tuple[float, str]:
    """Bending modulus for M_c,Rd (mm3), with tension-flange holes (6.2.5(4)); and a note."""
    f_y, f_u = _fy(section, grade)
    plastic = cls <= 2
    W = section.Wpl_y if plastic else section.Wel_y
    note = ("W_pl,y (Class 1 or 2, Eq. 6.13)" if plastic else "W_el,y (Class 3, Eq. 6.14)")
    if cls == 4:
        W = effective_section(section, grade, calc)["W_eff"]
        note = "W_eff,y (Class 4, Eq. 6.15, effective widths to EN 1993-1-5 4.4)"
        if A_f_net is not None:   # holes in the tension flange: the elastic net modulus if smaller
            W_net_el = min(W, W_y_with_holes_elastic(section, grade, A_f_net, na, calc))
            return W_net_el, note + "; not more than the elastic modulus net of tension-flange holes"
    if W_net is not None:
        return W_net, note + "; net modulus given by the user"
    if A_f_net is None:
        return W, note
    A_f = section.b * section.tf
    N_u = calc(f11.N_u_Rd, A_net=A_f_net, f_u=f_u, gamma_M2=na.gamma_M2_member)
    N_pl = calc(f11.N_pl_Rd, A=A_f, f_y=f_y, gamma_M0=na.gamma_M0)
    if N_u >= N_pl:
        calc.note("Eq. 6.16 met: fastener holes in the tension flange may be ignored (6.2.5(4)).")
        return W, note + "; holes in the tension flange ignored (Eq. 6.16 met)"
    calc.note("Eq. 6.16 not met: the tension flange area is reduced to $A_{f,eff}$.")
    A_eff = calc(f11.A_f_eff, A_f_net=A_f_net, f_u=f_u, f_y=f_y, gamma_M0=na.gamma_M0, gamma_M2=na.gamma_M2_member)
    dA = A_f - A_eff
    y_f = (section.h - section.tf) / 2.0
    if plastic:
        W = calc(f11.W_pl_y_net, W_pl_y=section.Wpl_y, Delta_A_f=dA, y_f=y_f, t_w=section.tw)
    else:
        W = calc(f11.W_el_y_net, I_y=section.Iy, A=section.A, Delta_A_f=dA, y_f=y_f, h=section.h)
    calc.keep("A_f_eff", A_eff, "mm2")
    return W, note + "; tension flange reduced for holes (Eq. 6.16 not met)"


def _validate_holes(section: Any, A_f_net: Any, W_net: Any) -> tuple[float | None, float | None]:
    if A_f_net is not None and W_net is not None:
        raise InputError("W_net", W_net, "None when A_f_net is given (give one of them)")
    a = None if A_f_net is None else require_in_range("A_f_net", A_f_net, 1e-9, section.b * section.tf, "mm2")
    w = None if W_net is None else require_in_range("W_net", W_net, 1e-9, section.Wpl_y, "mm3")
    if a is not None and A_f_net <= 0:
        raise InputError("A_f_net", A_f_net, "a positive net flange area in mm2")
    return a, w


def W_y_with_holes(section: Any, grade: str, A_f_net: float, na: NationalAnnex = UK_NA) -> float:
    """Bending modulus (mm3) for M_c,Rd with fastener holes in the tension flange, EN 1993-1-1 6.2.5(4).

    ``A_f_net`` = net area of the tension flange (mm2) at the hole line, e.g.
    ``(b - n d_0) t_f``. Returns W_pl,y / W_el,y (by class) unchanged when
    Eq. 6.16 is met, else the modulus with the flange reduced to A_f,eff.
    Plain-float path for the splice design.
    """
    _check_section(section)
    _check_na(na)
    a, _ = _validate_holes(section, A_f_net, None)
    cl = _section_class_fast(section, grade)
    return _W_y(section, grade, cl["section_class"], a, None, na, Calc())[0]


def W_y_with_holes_elastic(section: Any, grade: str, A_f_net: float, na: NationalAnnex, calc: Calc) -> float:
    """Elastic modulus (mm3) with the tension flange reduced for holes by 6.2.5(4) (Class 3 rule)."""
    return _W_y(section, grade, 3, A_f_net, None, na, calc)[0]


def _M_c_Rd(section: Any, grade: str, na: NationalAnnex, calc: Calc, A_f_net: float | None = None,
            W_net: float | None = None) -> tuple[float, int, float, str]:
    cl = _section_class_fast(section, grade)
    cls = cl["section_class"]
    W, note = _W_y(section, grade, cls, A_f_net, W_net, na, calc)
    M = calc(f11.M_c_Rd, W_y=W, f_y=cl["f_y"], gamma_M0=na.gamma_M0)
    return M, cls, W, note


def bending_resistance(section: Any, grade: str, na: NationalAnnex = UK_NA) -> float:
    """M_c,Rd (N mm) on floats, EN 1993-1-1 6.2.5 (W_pl, W_el or W_eff by class), for searches."""
    _check_section(section)
    _check_na(na)
    return _M_c_Rd(section, grade, na, Calc())[0]


def check_bending(section: Any, grade: str, M_Ed: float, na: NationalAnnex = UK_NA, calc: Calc | None = None, *,
                  A_f_net: float | None = None, W_net: float | None = None,
                  location_mm: float | None = None) -> CheckRecord:
    """Major-axis bending resistance M_c,Rd, EN 1993-1-1 6.2.5 (Eq. 6.12-6.14).

    ``M_Ed`` in N*mm. ``A_f_net`` (mm2): net area of the tension flange where
    it has fastener holes (6.2.5(4), Eq. 6.16 with gamma_M2 = ``na.gamma_M2_member``);
    ``W_net`` (mm3): a net modulus given directly instead. Class 4: the effective
    modulus W_eff,y of EN 1993-1-5 4.4 (Eq. 6.15).
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    M = abs(require_finite("M_Ed", M_Ed))
    a, w = _validate_holes(section, A_f_net, W_net)
    loc = _loc(location_mm)
    M_c, cls, W, note = _M_c_Rd(section, grade, na, calc, a, w)
    calc.keep("Class", cls)
    calc.keep("W_y", W, "mm3")
    calc.keep("M_c_Rd", M_c, "Nmm")
    return calc.record(id="bending", title=f"Bending resistance, {_name(section)}",
                       clause="EN 1993-1-1:2005, 6.2.5, Eq. 6.12", demand=M, resistance=M_c, unit="Nmm",
                       location_mm=loc, note=f"{_ORD[cls]}, {note}")


# ------------------------------------------------------------------ shear
def _V_pl_Rd(section: Any, grade: str, na: NationalAnnex, calc: Calc) -> tuple[float, float, float]:
    """Shear-buckling ratio then V_pl,Rd; returns (V_pl_Rd N, A_v mm2, u_hw = (h_w/t_w) / (72 eps/eta))."""
    f_y, _ = _fy(section, grade)
    eps = f11.epsilon(f_y=_fy_web(section, grade))     # 6.2.6(6): epsilon of the web, f_y for t_w
    h_w = _h_w(section)
    u_hw = calc(f11.shear_buckling_ratio, h_w=h_w, t_w=section.tw, epsilon=eps, eta=na.eta)
    A_v = calc(A_v_z, A=section.A, b=section.b, t_f=section.tf, t_w=section.tw, r=section.r, h_w=h_w, eta=na.eta)
    V = calc(f11.V_pl_Rd, A_v=A_v, f_y=f_y, gamma_M0=na.gamma_M0)
    return V, A_v, u_hw


def _V_b_Rd(section: Any, grade: str, na: NationalAnnex, calc: Calc) -> float:
    """Shear-buckling resistance V_b,Rd (N), EN 1993-1-5 5.2, 5.3: no intermediate stiffeners
    (Eq. 5.5), non-rigid end posts (Table 5.1), flange contribution V_bf,Rd neglected."""
    f_yw = _fy_web(section, grade)
    eps = f11.epsilon(f_y=f_yw)
    h_w = _h_w(section)
    lam = calc(f15.lambda_w, h_w=h_w, t_w=section.tw, epsilon=eps)
    chi = calc(f15.chi_w, lamb_w=lam, eta=na.eta)
    V_b = calc(f15.V_b_Rd, chi_w=chi, f_yw=f_yw, h_w=h_w, t_w=section.tw, eta=na.eta, gamma_M1=na.gamma_M1)
    calc.keep("lambda_w", lam)
    calc.keep("chi_w", chi)
    calc.keep("V_b_Rd", V_b, "N")
    return V_b


def shear_resistance(section: Any, grade: str, na: NationalAnnex = UK_NA) -> tuple[float, bool]:
    """(V_Rd in N, slender web?) on floats: V_pl,Rd, or min(V_pl,Rd, V_b,Rd) for h_w/t_w > 72 eps/eta."""
    fast = Calc()
    V_pl, _, u_hw = _V_pl_Rd(section, grade, na, fast)
    if u_hw > 1.0:
        return min(V_pl, _V_b_Rd(section, grade, na, fast)), True
    return V_pl, False


def check_shear(section: Any, grade: str, V_Ed: float, na: NationalAnnex = UK_NA, calc: Calc | None = None, *,
                location_mm: float | None = None) -> CheckRecord:
    """Shear resistance: V_pl,Rd (EN 1993-1-1 6.2.6(2), Eq. 6.18) with A_v from 6.2.6(3)(a); for a web
    with h_w/t_w > 72 eps/eta (6.2.6(6)) also the shear-buckling resistance V_b,Rd of EN 1993-1-5
    section 5 (Eq. 5.10), the smaller governing. ``V_Ed`` in N.
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    V = abs(require_finite("V_Ed", V_Ed))
    loc = _loc(location_mm)
    V_pl, A_v, u_hw = _V_pl_Rd(section, grade, na, calc)
    calc.keep("A_v", A_v, "mm2")
    calc.keep("V_pl_Rd", V_pl, "N")
    calc.keep("hw_tw_over_limit", u_hw)
    if u_hw <= 1.0:
        return calc.record(id="shear", title=f"Shear resistance, {_name(section)}",
                           clause="EN 1993-1-1:2005, 6.2.6, Eq. 6.17", demand=V, resistance=V_pl, unit="N",
                           location_mm=loc, note="no shear buckling check needed (6.2.6(6))")
    calc.note("$h_w/t_w > 72\\varepsilon/\\eta$: the web is checked for shear buckling, EN 1993-1-5 section 5 "
              "(transverse stiffening at the supports only, non-rigid end posts, flange contribution neglected).")
    V_b = _V_b_Rd(section, grade, na, calc)
    V_R = min(V_pl, V_b)
    gov = "V_b,Rd (shear buckling)" if V_b <= V_pl else "V_pl,Rd"
    return calc.record(id="shear", title=f"Shear resistance with shear buckling, {_name(section)}",
                       clause="EN 1993-1-5:2006, 5.5, Eq. 5.10", demand=V, resistance=V_R, unit="N",
                       location_mm=loc, note=f"slender web (h_w/t_w over 72 eps/eta by {u_hw:.3f}): "
                                         f"resistance = min(V_pl,Rd, V_b,Rd), {gov} governs")


# ------------------------------------------------------------------ bending and shear
def check_flange_induced_buckling(section: Any, grade: str, na: NationalAnnex = UK_NA,
                                  calc: Calc | None = None) -> CheckRecord:
    """Flange-induced buckling of the web, EN 1993-1-5 section 8, Eq. 8.1 (a geometric limit, no load).

    k = 0.4 where the plastic moment resistance is used (Class 1 and 2), 0.55 where the elastic
    one is (Class 3 and 4), 8(1); A_w = h_w t_w, A_fc = b t_f. Record: demand = h_w/t_w,
    resistance = the limit.
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    f_yf, _ = _fy(section, grade)
    cls = _section_class_fast(section, grade)["section_class"]
    k = 0.4 if cls <= 2 else 0.55
    h_w = _h_w(section)
    lim = calc(f15.hw_tw_max_flange_induced, k=k, f_yf=f_yf, A_w=h_w * section.tw, A_fc=section.b * section.tf,
               E=E_MPa)
    calc.keep("hw_tw", h_w / section.tw)
    calc.keep("hw_tw_max", lim)
    return calc.record(id="flange_induced_buckling", title=f"Flange-induced buckling of the web, {_name(section)}",
                       clause="EN 1993-1-5:2006, 8(1), Eq. 8.1", demand=h_w / section.tw, resistance=lim, unit="",
                       note=f"k = {k:g} ({_ORD[cls]}: {'plastic' if cls <= 2 else 'elastic'} moment resistance used)")


def check_bending_shear(section: Any, grade: str, M_Ed: float, V_Ed: float, na: NationalAnnex = UK_NA,
                        calc: Calc | None = None, *, A_f_net: float | None = None,
                        location_mm: float | None = None) -> CheckRecord:
    """Bending with coexisting shear, EN 1993-1-1 6.2.8 (Eq. 6.29, 6.30).

    ``M_Ed`` (N*mm) and ``V_Ed`` (N) act at the same cross-section. When
    V_Ed <= 0.5 V_pl,Rd there is no reduction. Class 1/2: Eq. 6.30 with
    A_w = h_w t_w; Class 3: the web at (1 - rho) f_y (6.2.8(3)). rho is capped
    at 1 (V_Ed > V_pl,Rd fails the shear check itself). ``A_f_net`` as in
    :func:`check_bending`.
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    M = abs(require_finite("M_Ed", M_Ed))
    V = abs(require_finite("V_Ed", V_Ed))
    a, _ = _validate_holes(section, A_f_net, None)
    loc = _loc(location_mm)
    fast = Calc()
    V_pl, _, u_hw = _V_pl_Rd(section, grade, na, fast)
    M_c, cls, W, note = _M_c_Rd(section, grade, na, fast, a, None)
    f_y, _ = _fy(section, grade)
    if u_hw > 1.0:
        return _bending_shear_slender(section, grade, M, V, na, calc, M_c, loc)
    calc.keep("V_pl_Rd", V_pl, "N")
    calc.keep("M_c_Rd", M_c, "Nmm")
    rho = calc(f11.rho_V, V_Ed=V, V_pl_Rd=V_pl)
    if rho <= 0.0:
        calc.note("$V_{Ed} \\le 0.5\\,V_{pl,Rd}$: no reduction of the moment resistance (6.2.8(2)).")
        M_V = M_c
    elif cls <= 2:
        h_w = _h_w(section)
        M_V = calc(f11.M_y_V_Rd, W_pl_y=W, rho=rho, A_w=h_w * section.tw, t_w=section.tw, f_y=f_y,
                   gamma_M0=na.gamma_M0, M_c_Rd=M_c)
    else:
        M_V = calc(f11.M_y_V_Rd_el, W_el_y=W, rho=rho, t_w=section.tw, h_w=_h_w(section), h=section.h, f_y=f_y,
                   gamma_M0=na.gamma_M0, M_c_Rd=M_c)
    calc.keep("rho", rho)
    calc.keep("M_y_V_Rd", M_V, "Nmm")
    extra = "; V_Ed > V_pl,Rd (rho capped at 1, see the shear check)" if V > V_pl else ""
    return calc.record(id="bending_shear", title=f"Bending and shear, {_name(section)}",
                       clause="EN 1993-1-1:2005, 6.2.8, Eq. 6.30", demand=M, resistance=M_V, unit="Nmm",
                       location_mm=loc, note=f"{_ORD[cls]}, {note}{extra}")


def _bending_shear_slender(section: Any, grade: str, M: float, V: float, na: NationalAnnex, calc: Calc,
                           M_c: float, loc: float | None) -> CheckRecord:
    """EN 1993-1-5 7.1 Eq. 7.1 for a web that needs the shear-buckling check; also M_Ed <= M_c,Rd."""
    f_y, _ = _fy(section, grade)
    calc.note("Web with $h_w/t_w > 72\\varepsilon/\\eta$: interaction of bending and shear by EN 1993-1-5 7.1 "
              "with the shear-buckling resistance of the web, $\\bar\\eta_3 = V_{Ed}/V_{bw,Rd}$.")
    V_bw = _V_b_Rd(section, grade, na, calc)
    W_pl, b_f = section.Wpl_y, section.b
    if _section_class_fast(section, grade)["class_flange"] == 4:
        # 7.1(1): M_pl,Rd and M_f,Rd with the effective flanges. The compression flange's loss is taken
        # from both flanges at the full lever arm h - t_f (on the safe side) and b_f reduced alike.
        rho_f = effective_section(section, grade)["rho_f"]
        dA = 2.0 * (1.0 - rho_f) * _c_flange(section) * section.tf
        W_pl = section.Wpl_y - dA * (section.h - section.tf)
        b_f = section.b - dA / section.tf
        calc.note(f"Class 4 flanges: $M_{{pl,Rd}}$ and $M_{{f,Rd}}$ with the effective flanges ($\\rho$ = "
                  f"{rho_f:.3f}), the lost area taken at the flange lever arm.")
    M_pl = calc(f11.M_c_Rd, W_y=W_pl, f_y=f_y, gamma_M0=na.gamma_M0)
    M_f = calc(f15.M_f_Rd, b_f=b_f, t_f=section.tf, h=section.h, f_yf=f_y, gamma_M0=na.gamma_M0)
    lhs = calc(f15.eta_7_1, M_Ed=M, M_pl_Rd=M_pl, M_f_Rd=M_f, V_Ed=V, V_bw_Rd=V_bw)
    calc.keep("M_pl_Rd", M_pl, "Nmm")
    calc.keep("M_f_Rd", M_f, "Nmm")
    calc.keep("M_c_Rd", M_c, "Nmm")
    # the bending resistance of the (possibly Class 3 or 4) section also bounds eta_1
    u_M = M / M_c
    if u_M > lhs:
        calc.note(f"$M_{{Ed}}/M_{{c,Rd}}$ = {u_M:.3f} exceeds the Eq. 7.1 value: it governs.")
        lhs = u_M
    return calc.record(id="bending_shear", title=f"Bending and shear (slender web), {_name(section)}",
                       clause="EN 1993-1-5:2006, 7.1, Eq. 7.1", demand=lhs, resistance=1.0, unit="",
                       location_mm=loc, note=f"eta_1 + (1 - M_f,Rd/M_pl,Rd)(2 eta_3 - 1)^2 <= 1 (eta_3 = V_Ed/V_bw,Rd;"
                                             f" V_Ed = {V / 1e3:.1f} kN, M_Ed = {M / 1e6:.1f} kNm)")


# ------------------------------------------------------------------ lateral-torsional buckling
def ltb_curve_rolled(h: float, b: float) -> str:
    """Buckling curve for rolled I/H sections, 6.3.2.3 with UK NA (NA.2.17, from memory).

    h/b <= 2: curve b; 2 < h/b <= 3.1: curve c; h/b > 3.1: curve d.
    """
    hb = require_positive("h", h, "mm") / require_positive("b", b, "mm")
    return "b" if hb <= 2.0 else ("c" if hb <= 3.1 else "d")


def mcr_reference(calc: Calc, section: Any, L_mm: float, M_cr: float) -> float:
    """M_cr,0 for reference beside a numerical M_cr: the closed form for uniform moment with fork ends and
    loads at the shear centre (:func:`~splicecalc.members.mcr.M_cr_uniform`), rendered under its own
    symbol, with the ratio M_cr / M_cr,0 (the moment shape's C_1 with the load height's effect). N*mm."""
    with calc.symbols(M_cr="M_cr_0"):
        M0 = calc(M_cr_uniform, I_z=section.Iz, I_w=section.Iw, I_t=section.It, L=float(L_mm))
    calc.keep("M_cr_0", M0, "Nmm")
    if math.isfinite(M_cr) and M0 > 0.0:
        calc.note(f"For reference: $M_{{cr,0}}$ = {M0 / 1e6:.1f} kNm (uniform moment, closed form, length "
                  f"{float(L_mm) / 1e3:.3g} m); $M_{{cr}} / M_{{cr,0}}$ = {M_cr / M0:.3f} (moment shape and load "
                  "height).")
    return M0


def check_ltb(section: Any, grade: str, M_Ed: float, M_cr: float | None = None, na: NationalAnnex = UK_NA,
              calc: Calc | None = None, *, C_1: float | None = None, k_c: float | None = None,
              L_mm: float | None = None, M: Any = None, q_N_per_mm: Any = 0.0, point_loads: Sequence = (),
              z_g_mm: float = 0.0, line_loads: Sequence = (), location_mm: float | None = None,
              segment: str = "") -> CheckRecord:
    """Lateral-torsional buckling of one segment between lateral restraints, 6.3.2.2 and 6.3.2.3 (UK NA).

    ``M_Ed`` (N*mm) = largest |M| in the segment. ``M_cr`` (N*mm) for the same
    moment diagram; when None it is computed by :func:`~splicecalc.members.mcr.mcr_numerical`
    from ``L_mm`` (segment length), ``M`` (moment diagram: callable M(x_mm),
    constant or (x, M) arrays, x from the segment start), ``q_N_per_mm``,
    ``point_loads`` and ``z_g_mm`` (load height above the shear centre), ``line_loads`` (line
    loads at heights of their own: (q, z_g_mm) pairs).
    ``k_c`` (Table 6.6) or ``C_1`` (k_c = 1/sqrt(C_1), UK NA NA.2.18) set the
    f-modification; with neither, C_1 is computed numerically when ``M`` is
    given, else k_c = 1 (no modification, conservative). Rolled sections only
    (lambda_LT,0 = ``na.lambda_LT_0``, beta = ``na.beta_LT``, curve by h/b).
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    M_E = abs(require_finite("M_Ed", M_Ed))
    loc = _loc(location_mm)
    if C_1 is not None and k_c is not None:
        raise InputError("k_c", k_c, "None when C_1 is given (give one of them)")
    if C_1 is not None:
        require_in_range("C_1", C_1, 1.0, 5.0)
    if k_c is not None:
        require_in_range("k_c", k_c, 0.5, 1.0)
    need_C1 = False
    if M_cr is not None:
        Mcr = require_positive("M_cr", M_cr, "N*mm")
        if L_mm is not None:
            require_positive("L_mm", L_mm, "mm")
        mcr_text = f"$M_{{cr}}$ = {Mcr / 1e6:.1f} kNm (given)."
    else:
        if L_mm is None or M is None:
            raise InputError("M_cr", None, "a positive M_cr in N*mm, or L_mm and the moment diagram M to compute it")
        require_positive("L_mm", L_mm, "mm")
        res = mcr_numerical(section, L_mm, M, q_N_per_mm=q_N_per_mm, point_loads=point_loads, z_g_mm=z_g_mm,
                            line_loads=line_loads)
        Mcr = res.M_cr
        mcr_text = (f"$M_{{cr}}$ = {Mcr / 1e6:.1f} kNm: thin-walled beam finite elements with warping "
                    f"({res.n_elements} elements), segment length {float(L_mm) / 1e3:.3g} m with fork supports, "
                    f"loads {float(z_g_mm):+.0f} mm from the shear centre.")
        need_C1 = C_1 is None and k_c is None
    M_c, cls, W, _ = _M_c_Rd(section, grade, na, Calc())
    f_y, _ = _fy(section, grade)
    curve = ltb_curve_rolled(section.h, section.b)
    a_LT = ALPHA_LT[curve]
    where = f" {segment}" if segment else ""
    if math.isinf(Mcr):
        calc.note("$M_{cr}$ is unbounded for this loading (no lateral-torsional buckling).")
        lam = 0.0
    else:
        if Mcr < 1e-12 * W * f_y:   # lambda_LT > 1e6: no meaningful resistance (and Eq. 6.57 overflows)
            raise InputError("M_cr", Mcr, f"an elastic critical moment above 1e-12 W_y f_y = {1e-12 * W * f_y:.3g} "
                             "N*mm (lambda_LT <= 1e6)",
                             hint="the segment buckles under a negligible moment: check the loads, their "
                                  "height z_g and the moment diagram")
        calc.keep("M_cr", Mcr, "Nmm")
        calc.note(mcr_text)
        if M_cr is None:             # computed here: the closed form beside it, so a checker can follow it
            mcr_reference(calc, section, L_mm, Mcr)
        lam = calc(f11.lambda_LT, W_y=W, f_y=f_y, M_cr=Mcr)
    lam0 = na.lambda_LT_0
    calc.keep("lambda_LT", lam)
    if lam <= lam0 or M_E / Mcr <= lam0**2:
        calc.note(f"$\\bar\\lambda_{{LT}} \\le {lam0:g}$ or $M_{{Ed}}/M_{{cr}} \\le {lam0**2:g}$: "
                  "buckling effects may be ignored (6.3.2.2(4)), $\\chi_{LT} = 1$.")
        chi = 1.0
        note = "LTB effects ignored (6.3.2.2(4))"
    else:
        calc.note(f"Rolled section, $h/b$ = {section.h / section.b:.2f}: curve {curve}, $\\alpha_{{LT}}$ = {a_LT:g} "
                  "(6.3.2.3, UK NA).")
        chi0 = calc(f11.chi_LT, lamb_LT=lam, alpha_LT=a_LT, lamb_LT_0=lam0, beta=na.beta_LT)
        if need_C1:   # only where the f-modification is used (computed from the same model)
            C_1 = max(C_1_numerical(section, L_mm, M), 1.0)
            calc.note(f"$C_1$ = {C_1:.3f} for $k_c$: the ratio of the segment's elastic critical moment for its own "
                      "moment diagram to that for uniform moment, both with the loads at the shear centre "
                      "(same model).")
        if k_c is None and C_1 is not None:
            calc.keep("C_1", C_1)
            k_c = calc(f11.k_c_from_C1, C_1=C_1)
        if k_c is None:
            k_c = 1.0
            calc.note("$k_c = 1.0$ (moment distribution not given: no modification).")
        f = calc(f11.f_LT, k_c=k_c, lamb_LT=lam)
        chi = calc(f11.chi_LT_mod, chi_LT=chi0, f=f, lamb_LT=lam)
        calc.keep("k_c", k_c)
        note = f"curve {curve}, k_c = {k_c:.3f}" + (f" (C_1 = {C_1:.3f})" if C_1 is not None else "")
    M_b = calc(f11.M_b_Rd, chi_LT_mod=chi, W_y=W, f_y=f_y, gamma_M1=na.gamma_M1)
    calc.keep("chi_LT_mod", chi)
    calc.keep("M_b_Rd", M_b, "Nmm")
    if L_mm is not None:
        calc.keep("L", float(L_mm), "mm")
    return calc.record(id="ltb" + (f"_{segment}" if segment else ""),
                       title=f"Lateral-torsional buckling{where}, {_name(section)}",
                       clause="EN 1993-1-1:2005, 6.3.2.1, Eq. 6.54", demand=M_E, resistance=M_b, unit="Nmm",
                       location_mm=loc, note=f"{_ORD[cls]}, {note}")


# ------------------------------------------------------------------ transverse forces (EN 1993-1-5 section 6)
def _l_y(kind: str, s_s: float, c: float, h_w: float, t_f: float, t_w: float, f_yw: float, k_F: float,
         m_1: float, m_2: float, calc: Calc) -> float:
    if kind == "a":
        return calc(f15.l_y_a, s_s=s_s, t_f=t_f, m_1=m_1, m_2=m_2)
    le = calc(f15.l_e, k_F=k_F, t_w=t_w, f_yw=f_yw, h_w=h_w, s_s=s_s, c=c, E=E_MPa)
    return calc(f15.l_y_c, l_e=le, t_f=t_f, m_1=m_1, m_2=m_2)


def _F_Rd_type(section: Any, grade: str, kind: str, s_s: float, c: float, na: NationalAnnex,
               calc: Calc) -> dict[str, float]:
    """F_Rd of load type ``kind`` ("a" or "c") of Figure 6.1 through ``calc``; m_2 settled on floats first."""
    f_yf = steel(grade, section.tf, field="section.tf").f_y
    f_yw = steel(grade, section.tw, field="section.tw").f_y
    h_w, tw, tf = _h_w(section), section.tw, section.tf
    fast = Calc()
    kF = 6.0 if kind == "a" else f15.k_F_c(s_s=s_s, c=c, h_w=h_w)
    Fcr = f15.F_cr(k_F=kF, t_w=tw, h_w=h_w, E=E_MPa)
    m1 = f15.m_1(f_yf=f_yf, b_f=section.b, f_yw=f_yw, t_w=tw)
    ly = _l_y(kind, s_s, c, h_w, tf, tw, f_yw, kF, m1, f15.m_2(h_w=h_w, t_f=tf, lamb_F=1.0), fast)
    lam_first = f15.lambda_F(l_y=ly, t_w=tw, f_yw=f_yw, F_cr=Fcr)
    if kind == "a":
        calc.note("Load type (a) of EN 1993-1-5 Figure 6.1 (force through the flange, carried by web shear on "
                  "both sides); unstiffened web, no transverse stiffeners (their spacing $a$ taken as infinite): "
                  "$k_F$ = 6.")
    else:
        calc.note("Load type (c) of EN 1993-1-5 Figure 6.1 (force through the flange next to an unstiffened "
                  f"beam end), $c$ = {c:.0f} mm from the end of the stiff bearing to the beam end.")
        kF = calc(f15.k_F_c, s_s=s_s, c=c, h_w=h_w)
    Fcr = calc(f15.F_cr, k_F=kF, t_w=tw, h_w=h_w, E=E_MPa)
    m1 = calc(f15.m_1, f_yf=f_yf, b_f=section.b, f_yw=f_yw, t_w=tw)
    m2 = calc(f15.m_2, h_w=h_w, t_f=tf, lamb_F=lam_first)
    ly = _l_y(kind, s_s, c, h_w, tf, tw, f_yw, kF, m1, m2, calc)
    lam = calc(f15.lambda_F, l_y=ly, t_w=tw, f_yw=f_yw, F_cr=Fcr)
    chi = calc(f15.chi_F, lamb_F=lam)
    F_R = calc(f15.F_Rd, f_yw=f_yw, chi_F=chi, l_y=ly, t_w=tw, gamma_M1=na.gamma_M1)
    return dict(F_Rd=F_R, k_F=kF, l_y=ly, lambda_F=lam, chi_F=chi)


def transverse_resistance(section: Any, grade: str, s_s: float = 0.0, c: float | None = None,
                          na: NationalAnnex = UK_NA, calc: Calc | None = None) -> dict[str, Any]:
    """Design resistance F_Rd (N) of the unstiffened web to a transverse force through one flange,
    EN 1993-1-5 6.2-6.5 (Eq. 6.1-6.13).

    ``s_s`` (mm): stiff bearing length (6.3, at most h_w, 6.3(1)); ``c`` (mm): None for a
    force in the span (type (a), k_F = 6 for a web without transverse stiffeners); a number
    for the distance from the end of its stiff bearing to an unstiffened beam end: while that end
    is close (type (c)'s k_F = 2 + 6 (s_s + c)/h_w below 6) both type (a) and type (c) are
    computed and the smaller governs, else type (a). Returns
    ``F_Rd`` and the governing ``type``, ``k_F``, ``l_y``, ``lambda_F``, ``chi_F``.
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    ss = require_non_negative("s_s", s_s, "mm")
    h_w = _h_w(section)
    if ss > h_w:   # 6.3(1): s_s not more than h_w
        ss = calc(f15.s_s_eff, s_s=ss, h_w=h_w)
        calc.note("The stiff bearing length is limited to $h_w$ (EN 1993-1-5 6.3(1)).")
    kinds = ["a"]
    c_ = 0.0
    if c is not None:
        c_ = require_non_negative("c", c, "mm")
        # type (c) is the case of a force next to the end: while its k_F = 2 + 6 (s_s + c)/h_w is below
        # the 6 of type (a); farther from the end the force is of type (a)
        if 2.0 + 6.0 * (ss + c_) / h_w < 6.0:
            kinds = ["a", "c"]
    if len(kinds) == 2:   # pick the governing type on floats, render that one
        ra = _F_Rd_type(section, grade, "a", ss, c_, na, Calc())
        rc = _F_Rd_type(section, grade, "c", ss, c_, na, Calc())
        kinds = ["c"] if rc["F_Rd"] < ra["F_Rd"] else ["a"]
        if kinds == ["a"]:
            calc.note(f"Type (c) with $c$ = {c_:.0f} mm gives more ({rc['F_Rd'] / 1e3:.0f} kN): type (a) governs.")
        else:
            calc.note(f"Type (a) gives {ra['F_Rd'] / 1e3:.0f} kN: the beam end is close, type (c) governs.")
    out: dict[str, Any] = _F_Rd_type(section, grade, kinds[0], ss, c_, na, calc)
    out["type"] = kinds[0]
    out["s_s"] = ss
    return out


def _keep_transverse(calc: Calc, res: dict[str, Any]) -> None:
    calc.keep("s_s", res["s_s"], "mm")
    calc.keep("k_F", res["k_F"])
    calc.keep("l_y", res["l_y"], "mm")
    calc.keep("lambda_F", res["lambda_F"])
    calc.keep("chi_F", res["chi_F"])
    calc.keep("F_Rd", res["F_Rd"], "N")


def check_web_bearing(section: Any, grade: str, F_Ed: float, s_s: float, c: float = 0.0,
                      na: NationalAnnex = UK_NA, calc: Calc | None = None, *,
                      location_mm: float | None = None) -> CheckRecord:
    """Web under the support reaction of a beam bearing on its flange, EN 1993-1-5 section 6, type (c):
    verification 6.6 Eq. 6.14, F_Ed <= F_Rd (resistance Eq. 6.1).

    ``F_Ed`` (N) through one flange over the stiff bearing length ``s_s`` (mm, 6.3; taken not more
    than h_w, 6.3(1)); ``c`` (mm) from the end of the stiff bearing to the beam end. f_yf and f_yw
    by element thickness; m_2 (Eq. 6.9) settled on lambda_F. At a simple support M_Ed = 0 and the
    interaction of 7.2 does not apply (the reaction acts on the tension flange anyway, 7.2(2)).
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    F = abs(require_finite("F_Ed", F_Ed))
    ss = require_non_negative("s_s", s_s, "mm")
    c_ = require_non_negative("c", c, "mm")
    loc = _loc(location_mm)
    if ss > _h_w(section):   # 6.3(1): s_s not more than h_w
        ss = calc(f15.s_s_eff, s_s=ss, h_w=_h_w(section))
        calc.note("The stiff bearing length is limited to $h_w$ (EN 1993-1-5 6.3(1)).")
    res = dict(_F_Rd_type(section, grade, "c", ss, c_, na, calc))
    res["s_s"] = ss
    _keep_transverse(calc, res)
    calc.note("$M_{Ed} = 0$ at the support (simple support): the interaction with bending (EN 1993-1-5 7.2) "
              "does not apply.")
    return calc.record(id="web_bearing", title=f"Web bearing at the support, {_name(section)}",
                       clause="EN 1993-1-5:2006, 6.6, Eq. 6.14", demand=F, resistance=res["F_Rd"], unit="N",
                       location_mm=loc, note="load type (c); resistance EN 1993-1-5 6.2 Eq. 6.1; M_Ed = 0 at a "
                                             "simple support, no 7.2 interaction")


def check_transverse_force(section: Any, grade: str, F_Ed: float, s_s: float = 0.0, na: NationalAnnex = UK_NA,
                           calc: Calc | None = None, *, c: float | None = None, location_mm: float | None = None,
                           name: str = "") -> CheckRecord:
    """Web under a point load on a flange, EN 1993-1-5 section 6: verification 6.6 Eq. 6.14,
    eta_2 = F_Ed / F_Rd <= 1, with F_Rd of :func:`transverse_resistance` (type (a), or type (c)
    when the load is close to the beam end ``c``). ``F_Ed`` (N), ``s_s`` stiff bearing length (mm,
    default 0: a load with no stiff bearing). ``name`` names the load in the title.
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    F = abs(require_finite("F_Ed", F_Ed))
    loc = _loc(location_mm)
    res = transverse_resistance(section, grade, s_s, c, na, calc)
    _keep_transverse(calc, res)
    what = f" ({name})" if name else ""
    return calc.record(id="transverse_force", title=f"Web under point load{what}, {_name(section)}",
                       clause="EN 1993-1-5:2006, 6.6, Eq. 6.14", demand=F, resistance=res["F_Rd"], unit="N",
                       location_mm=loc, note=f"load type ({res['type']}), s_s = {res['s_s']:g} mm; resistance "
                                             "EN 1993-1-5 6.2 Eq. 6.1")


def check_transverse_bending(section: Any, grade: str, F_Ed: float, M_Ed: float, F_Rd: float,
                             na: NationalAnnex = UK_NA, calc: Calc | None = None, *,
                             location_mm: float | None = None, name: str = "") -> CheckRecord:
    """Interaction of a transverse force on the compression flange with bending, EN 1993-1-5 7.2(1)
    Eq. 7.2: eta_2 + 0.8 eta_1 <= 1.4, eta_2 = F_Ed / F_Rd (Eq. 6.14), eta_1 = M_Ed / M_c,Rd.

    Record: demand = eta_2 + 0.8 eta_1, resistance = 1.4. eta_1 is taken with the cross-section
    bending resistance M_c,Rd of EN 1993-1-1 6.2.5 (W_pl for Class 1 and 2, W_el Class 3,
    W_eff Class 4); EN 1993-1-5 4.6 writes it with W_eff, which for a Class 1 or 2 section
    is commonly read as the plastic modulus (from memory). For a force on the tension flange
    7.2(2) asks only for section 6 and EN 1993-1-1 6.2.1(5): do not call this.
    """
    _check_section(section)
    _check_na(na)
    calc = _check_calc(calc)
    F = abs(require_finite("F_Ed", F_Ed))
    M = abs(require_finite("M_Ed", M_Ed))
    FR = require_positive("F_Rd", F_Rd, "N")
    loc = _loc(location_mm)
    M_c, cls, _, _ = _M_c_Rd(section, grade, na, Calc())
    calc.keep("F_Rd", FR, "N")
    calc.keep("M_c_Rd", M_c, "Nmm")
    e2 = calc(f15.eta_2, F_Ed=F, F_Rd=FR)
    lhs = calc(f15.eta_7_2, eta_2=e2, M_Ed=M, M_Rd=M_c)
    calc.keep("eta_2", e2)
    calc.keep("eta_1", M / M_c)
    what = f" ({name})" if name else ""
    return calc.record(id="transverse_bending", title=f"Point load and bending{what}, {_name(section)}",
                       clause="EN 1993-1-5:2006, 7.2, Eq. 7.2", demand=lhs, resistance=1.4, unit="",
                       location_mm=loc, note=f"eta_2 + 0.8 eta_1 <= 1.4 with eta_2 = {e2:.3f}, eta_1 = M_Ed/M_c,Rd = "
                                             f"{M / M_c:.3f} ({_ORD[cls]}); F_Ed = {F / 1e3:.1f} kN, "
                                             f"M_Ed = {M / 1e6:.1f} kNm")


# ------------------------------------------------------------------ deflection
DEFLECTION_LIMITS: dict[str, float] = {"brittle finishes": 360.0, "other": 200.0, "cantilever": 180.0}


def check_deflection(delta_mm: float, span_mm: float, limit_ratio: float = 360.0, which: str = "imposed load",
                     calc: Calc | None = None, *, location_mm: float | None = None,
                     total: bool = False) -> CheckRecord:
    """Vertical deflection against span / ``limit_ratio`` (EN 1993-1-1 7.2.1; UK NA NA.2.23 suggested limits).

    ``delta_mm`` is the computed deflection (sign ignored) for the SLS
    combination named by ``which`` (e.g. "imposed load", "total"); UK NA
    suggested limits (variable actions, characteristic): span/360 for beams
    carrying brittle finishes, span/200 other beams, span/180 cantilevers
    (:data:`DEFLECTION_LIMITS`; from memory). ``total=True``: a limit on the total deflection,
    which the UK NA does not give: it is a limit agreed for the project (EN 1990 A1.4.3, EN 1993-1-1
    7.2.1(1)B) and is cited so.
    """
    calc = _check_calc(calc)
    d = abs(require_finite("delta_mm", delta_mm))
    L = require_positive("span_mm", span_mm, "mm")
    n = require_in_range("limit_ratio", limit_ratio, 50.0, 1000.0)
    if not isinstance(which, str):
        raise InputError("which", which, "a text label for the load case")
    loc = _loc(location_mm)
    lim = calc(f11.delta_lim, L=L, n_lim=n)
    calc.keep("delta_lim", lim, "mm")
    return calc.record(id="deflection", title=f"Deflection ({which}), span/{n:g}",
                       clause=("EN 1990:2002, A1.4.3" if total else "UK NA to BS EN 1993-1-1:2005+A1:2014, NA.2.23"),
                       demand=d, resistance=lim, unit="mm",
                       location_mm=loc)


# ------------------------------------------------------------------ floor vibration, restraint forces
#: usual minimum natural frequency of a floor beam (Hz): common UK practice for floors (from memory)
FLOOR_FREQUENCY_MIN_HZ = 4.0
#: share of the imposed floor load taken as mass for the natural frequency (common practice, from memory)
VIBRATION_IMPOSED_SHARE = 0.1


def check_floor_frequency(delta_mm: float, f_min: float = FLOOR_FREQUENCY_MIN_HZ, calc: Calc | None = None, *,
                          location_mm: float | None = None, load_text: str = "") -> CheckRecord:
    """Natural frequency of a floor beam against the usual minimum (common practice, EN 1990 A1.4.4).

    ``delta_mm``: largest deflection (mm) of the beam under its mass load (permanent actions plus a
    share of the imposed floor load, :data:`VIBRATION_IMPOSED_SHARE`); f_1 = (pi/2) sqrt(5 g /
    (384 delta)) (exact for a uniform mass). Record: demand = the minimum frequency, resistance = f_1
    (a minimum requirement), unit Hz. EN 1990 A1.4.4 asks for vibration limits agreed for the
    project; the 4 Hz floor and the mass load are common UK practice, not code values (from memory).
    Floors with a frequency near the limit, or sensitive uses, need a response (acceleration) check.
    """
    calc = _check_calc(calc)
    # a floor beam deflecting less than 1 micron under its own mass would have f_1 above 15 kHz: outside
    # any floor, and the formula divides by delta (a bound, not a crash, for any float); a large
    # deflection is no input error: it gives a low frequency, and the check fails as it should
    d = require_positive("delta_mm", delta_mm, "mm")
    if d < 1e-3:
        raise InputError("delta_mm", delta_mm, "a deflection of at least 0.001 mm under the mass load")
    fm = require_in_range("f_min", f_min, 1.0, 20.0)
    loc = _loc(location_mm)
    f1 = calc(f11.f_1_beam, delta_mm=d)
    calc.keep("delta_mass", d, "mm")
    calc.keep("f_1", f1, "Hz")
    return calc.record(id="floor_frequency", title=f"Floor vibration: natural frequency, at least {fm:g} Hz",
                       clause="EN 1990:2002, A1.4.4", demand=fm, resistance=f1, unit="Hz", location_mm=loc,
                       note=(f"mass load: {load_text}; " if load_text else "") + f"delta = {d:.2f} mm; "
                            f"minimum {fm:g} Hz and the mass load are common UK practice for floors (from memory); "
                            "a response (acceleration) check is needed for sensitive floors",
                       guidance="common UK floor-vibration practice: f_1 >= 4 Hz under permanent load plus 10 % "
                                "of the imposed load (from memory)")


def restraint_force(N_f_Ed: float, span_mm: float, tributary_mm: float, m: float = 1.0,
                    calc: Calc | None = None, *, location_mm: float | None = None,
                    name: str = "") -> CheckRecord:
    """Design force of one intermediate lateral restraint, EN 1993-1-1 5.3.3(2): a NOT CHECKED record.

    ``N_f_Ed`` (N): the compression-flange force the restraints stabilise, N_Ed = M_Ed / h (5.3.3(4));
    ``span_mm``: the length L of the restrained flange (the span); ``tributary_mm``: the length of
    flange this restraint collects the equivalent stabilising force q_d from; ``m``: members restrained
    by the same system (1: this beam alone). delta_q, the in-plane deflection of the restraint system,
    is taken as L/2500 (a stiff restraint, common practice, from memory). The restraint and its
    fixings are not designed by the package: the record is NOT CHECKED (the member checks rely on it)
    and states the force they need as the demand (``values["F_restraint"]``, the working, the note),
    never as a resistance.
    """
    calc = _check_calc(calc)
    N = require_non_negative("N_f_Ed", N_f_Ed, "N")
    L = require_positive("span_mm", span_mm, "mm")
    a = require_positive("tributary_mm", tributary_mm, "mm")
    mm = require_in_range("m", m, 1.0, 100.0)
    loc = _loc(location_mm)
    e0 = calc(f11.e_0_bracing, m=mm, L=L)
    q = calc(f11.q_d_bracing, N_Ed=N, e_0=e0, delta_q=L / 2500.0, L=L)
    F = q * a
    calc.keep("N_f_Ed", N, "N")
    calc.keep("q_d", q, "N/mm")
    calc.keep("a_trib", a, "mm")
    calc.keep("F_restraint", F, "N")
    pct = 100.0 * F / N if N > 0 else 0.0
    calc.note(f"Restraint force (demand) $F_{{Ed}} = q_d \\cdot a$ = {F / 1e3:.2f} kN over {a / 1e3:.3g} m of "
              f"flange ({pct:.2f} % of the flange force).")
    what = f" {name}" if name else ""
    rec = calc.info(id="restraint_force", title=f"Lateral restraint{what}: strength, stiffness, path to a diaphragm",
                    clause="EN 1993-1-1:2005, 5.3.3(2), Eq. 5.13", demand=F, resistance=0.0, unit="N",
                    location_mm=loc)
    # the member checks rely on this restraint, which the package does not design: NOT CHECKED, never a pass
    # (the force is the demand the restraint must take; there is no resistance to put beside it)
    return replace(rec, status=NOT_CHECKED, ok=False, utilisation=0.0,
                   note=f"Demand F_Ed = {F / 1e3:.2f} kN ({pct:.2f} % of the compression-flange force N_Ed = M_Ed/h = "
                        f"{N / 1e3:.0f} kN, 5.3.3(4); delta_q = L/2500 assumed). The LTB check relies on this "
                        "restraint: design the restraint and its fixings for F_Ed, check its stiffness and its load "
                        "path to a stable diaphragm or bracing (not designed in this package). 6.3.5.2 (2.5 % at "
                        "plastic hinges) does not apply: elastic analysis, no plastic hinges")


__all__ = ["SlenderSectionError", "ShearBucklingError", "ALPHA_LT", "DEFLECTION_LIMITS", "section_class",
           "classify", "W_y_with_holes", "check_bending", "check_shear", "check_bending_shear",
           "ltb_curve_rolled", "check_ltb", "check_web_bearing", "check_deflection", "effective_section",
           "check_floor_frequency", "restraint_force", "bending_resistance", "mcr_reference",
           "check_flange_induced_buckling", "FLOOR_FREQUENCY_MIN_HZ", "VIBRATION_IMPOSED_SHARE",
           "shear_resistance", "transverse_resistance", "check_transverse_force", "check_transverse_bending"]
