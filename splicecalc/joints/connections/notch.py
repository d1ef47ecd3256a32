"""Beams notched (coped) at the top flange to fit under or beside existing steel.

Checks at the notch root, where the section is a tee (bottom flange + remaining web):

* shear of the tee, EN 1993-1-1:2005, 6.2.6 (A_v of the tee by the rolled-section rule on one flange);
* bending of the tee under M = V (c + g) with the elastic modulus of the tee, reduced for high
  shear as 6.2.8 (conservative, whole tee at (1 - rho) f_y);
* the notch depth d_n <= h_b / 2 (published notched-beam guidance, from memory); a notch shallower
  than t_f (not through the flange) or reaching the bottom root fillet is refused (InputError);
* local stability of the notched length: c <= c_lim from the published limits for restrained
  beams (from memory, see :func:`~splicecalc.joints.connections.formulas.c_lim_notch`). A longer
  notch fails the check: shorten it, or stiffen the notch (a detailed check of the notched length
  is NOT implemented). Beams not laterally restrained at the notch need a separate LTB check.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ...core.errors import InputError, require_non_negative, require_positive
from ...core.record import Calc, CheckRecord, not_checked
from ...materials.partial_factors import UK_NA, NationalAnnex
from ...members.en1993_1_1 import V_pl_Rd, rho_V
from .detail import CL_PINNED, GUIDANCE
from ..plates import M_V_Rd_el
from ..plates import W_el_plate
from .formulas import (A_tee, A_v_rect, A_v_tee, F_t_wb_Rd_u, W_el_tee, c_lim_notch, d_lim_double_notch,
                       h_w_notch, y_c_tee)

#: clearances of a notch cut to clear an existing beam (mm): depth past the root fillet and length past the
#: flange tip, then rounded up to the next 5 mm (common practice, no source)
NOTCH_DEPTH_CLEAR = 5.0
NOTCH_LENGTH_CLEAR = 10.0
NOTCH_ROUND = 5.0
NOTCH_PRACTICE = ("notch depth = existing t_f + r past the new beam's flange level + 5 mm, length = existing flange "
                  "outstand (b - t_w)/2 + 10 mm, each rounded up to 5 mm (common practice, no source)")
#: the tying note of the notched section
NOTE_TIE = "tying with f_u for f_y and gamma_Mu (published UK simple-joint guidance, from memory)"


@dataclass(frozen=True)
class NotchFit:
    """Where the new beam meets an existing beam's flanges (all mm, depths from the new beam's top).

    ``need_top`` / ``need_bottom``: depth of new beam that must be cut away at the top / bottom to clear
    the existing flange and root fillet (0: no clash); ``need_length``: the existing flange outstand,
    measured from the existing web face; ``top`` / ``bottom`` / ``length``: the notches designed with the
    clearances of common practice (None: no notch needed).
    """

    level: float
    need_top: float
    need_bottom: float
    need_length: float
    top: float | None
    bottom: float | None
    length: float

    @property
    def text(self) -> str:
        s = self.level
        where = ("tops of steel level" if abs(s) < 1e-9 else
                 f"new beam top {abs(s):g} mm {'below' if s > 0 else 'above'} the existing top")
        cuts = ([f"top {self.top:g} mm deep"] if self.top else []) + \
               ([f"bottom {self.bottom:g} mm deep"] if self.bottom else [])
        if not cuts:
            return f"End fit on the existing beam web ({where}): the new beam's flanges clear the existing flanges."
        kind = "Double notch" if len(cuts) == 2 else ("Top notch" if self.top else "Bottom notch")
        return (f"End fit on the existing beam web ({where}): the new beam's flanges meet the existing flanges "
                f"(cut needed: top {self.need_top:.1f} mm, bottom {self.need_bottom:.1f} mm, over the existing "
                f"outstand {self.need_length:.1f} mm). {kind} designed: " + ", ".join(cuts) +
                f", length {self.length:g} mm ({NOTCH_PRACTICE}).")


def notch_ltb_not_checked(spec) -> CheckRecord:
    """NOT CHECKED: the new beam's lateral-torsional buckling allowing for a notched end (beam not held
    laterally along its length). The member LTB check takes a fork at each support; a notch reduces the
    end's restraint against twist and the limits of :func:`check_notch` are for restrained beams."""
    end = "A" if spec.at == "start" else "B"
    return not_checked(id="notch_ltb", title="New beam: lateral-torsional buckling with the notched end",
                       clause="EN 1993-1-1:2005, 6.3.2.1",
                       reason=f"the new beam is notched at end {end} ({spec.notch_text}) and is not held laterally "
                              "along its length: the member LTB check takes a fork support there, which a notched "
                              "end may not give; check the end segment allowing for the notch (published guidance "
                              "for unrestrained notched beams: a longer effective length, from memory) or restrain "
                              "the top flange at the notch")


def _up(x: float) -> float:
    return math.ceil(x / NOTCH_ROUND - 1e-9) * NOTCH_ROUND


def notch_fit(beam, existing, level: float = 0.0) -> NotchFit:
    """Notches the new ``beam`` needs to frame into the web of the ``existing`` beam (Sections, mm).

    ``level``: the new beam's top below the existing beam's top (mm; 0 = tops of steel level, < 0 above).
    The existing top flange and its root fillet occupy the depth 0 to t_f + r below its top, the bottom
    ones h - t_f - r to h; the new beam occupies level to level + h_b. A notch is needed where they meet.
    """
    top_band = existing.tf + existing.r - level            # existing top flange + fillet, new-beam coordinates
    bot_band = existing.h - existing.tf - existing.r - level
    need_t = max(0.0, top_band) if level < existing.tf + existing.r else 0.0
    need_b = max(0.0, beam.h - bot_band)
    if level + beam.h <= 0.0 or level >= existing.h:
        need_t = need_b = 0.0                              # no overlap at all: the fit checks refuse the plate
    out = (existing.b - existing.tw) / 2.0
    top = _up(max(need_t + NOTCH_DEPTH_CLEAR, beam.tf)) if need_t > 0.0 else None
    bottom = _up(max(need_b + NOTCH_DEPTH_CLEAR, beam.tf)) if need_b > 0.0 else None
    return NotchFit(level=level, need_top=need_t, need_bottom=need_b, need_length=out, top=top, bottom=bottom,
                    length=_up(out + NOTCH_LENGTH_CLEAR))

NOTE_STABILITY = ("limiting notch length for a laterally restrained beam from published notched-beam guidance "
                  "(from memory); beyond it shorten the notch or stiffen it")


def check_notch(beam, f_y: float, V_Ed: float, d_n: float, c: float, lever: float, *, na: NationalAnnex = UK_NA,
                calc: Calc | None = None, prefix: str = "notch", tie: float | None = None, f_u: float = 0.0,
                holes: int = 0, d_0: float = 0.0) -> list[CheckRecord]:
    """Checks of a top-notched beam end (N, mm, MPa).

    ``beam``: the new beam's Section; ``d_n`` notch depth and ``c`` notch length (mm);
    ``lever``: distance from the line of the reaction to the notch root (mm), so
    M_Ed = V_Ed lever. Raises InputError for a notch that leaves no web. With ``tie`` (N) also the
    tying resistance of the tee (``f_u``; ``holes`` bolt holes of ``d_0`` in the web: fin plate).
    A bottom notch alone is the same tee upside down (``prefix`` names it).
    """
    V_Ed = require_non_negative("V_Ed", V_Ed, "N")
    d_n = require_positive("notch depth", d_n, "mm")
    c = require_positive("notch length", c, "mm")
    lever = require_positive("lever", lever, "mm")
    if d_n < beam.tf:
        raise InputError("notch depth", d_n, f"at least t_f = {beam.tf:g} mm of the beam (a notch removes the top "
                                             "flange; the checks take the section at the notch as a tee)")
    if d_n >= beam.h - beam.tf - beam.r:
        raise InputError("notch depth", d_n, f"less than h - t_f - r = {beam.h - beam.tf - beam.r:g} mm of the "
                                              "beam (the notch would cut into the bottom flange)")
    calc = calc if calc is not None else Calc()
    out: list[CheckRecord] = []
    out.append(calc.record(id=f"{prefix}_depth", title="Notch depth d_n <= h_b / 2", clause=CL_PINNED,
                           demand=d_n, resistance=beam.h / 2.0, unit="mm", guidance=GUIDANCE, tags=("detailing",),
                           note="a deeper notch needs a stiffened or deeper beam end; reduce the "
                                "notch depth"))
    h_T = beam.h - d_n
    A_T = calc(A_tee, h_T=h_T, t_w=beam.tw, b=beam.b, t_f=beam.tf)
    y_c = calc(y_c_tee, h_T=h_T, t_w=beam.tw, b=beam.b, t_f=beam.tf)
    W_N = calc(W_el_tee, h_T=h_T, t_w=beam.tw, b=beam.b, t_f=beam.tf, y_c=y_c)
    A_vN = calc(A_v_tee, A_T=A_T, b=beam.b, t_f=beam.tf, t_w=beam.tw, r=beam.r)
    V_N = calc(V_pl_Rd, A_v=A_vN, f_y=f_y, gamma_M0=na.gamma_M0)
    calc.keep("A_v_N", A_vN, "mm2")
    out.append(calc.record(id=f"{prefix}_shear", title="Shear of the notched section (tee)",
                           clause="EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18", demand=V_Ed, resistance=V_N, unit="N",
                           note="reduced end shear resistance at the notch; root fillets of the tee ignored in A_T"))
    rho = calc(rho_V, V_Ed=V_Ed, V_pl_Rd=V_N)
    M_Rd = calc(M_V_Rd_el, rho=rho, W_el=W_N, f_y=f_y, gamma_M0=na.gamma_M0)
    calc.keep("W_el_N", W_N, "mm3")
    calc.keep("y_c", y_c, "mm")
    calc.keep("rho", rho)
    calc.keep("M_Ed", V_Ed * lever, "Nmm")
    out.append(calc.record(id=f"{prefix}_bending", title="Bending of the notched section (tee) with shear",
                           clause="EN 1993-1-1:2005, 6.2.8(3)", demand=V_Ed * lever, resistance=M_Rd, unit="Nmm",
                           note=f"M_Ed = V_Ed x {lever:g} mm (reaction line to notch root)"))
    c_lim = calc(c_lim_notch, h_b=beam.h, t_w=beam.tw, f_y=f_y)
    out.append(calc.record(id=f"{prefix}_stability", title="Local stability of the notched length",
                           clause="EN 1993-1-1:2005, 6.3.2.1", demand=c, resistance=c_lim, unit="mm",
                           note=NOTE_STABILITY, guidance=GUIDANCE))
    if tie is not None:
        out.append(_tie_record(calc, prefix, h_T - beam.tf, beam.tw, f_u, tie, holes, d_0, na, "tee"))
    return out


def _tie_record(calc: Calc, prefix: str, h_web: float, t_w: float, f_u: float, tie: float, holes: int, d_0: float,
                na: NationalAnnex, what: str) -> CheckRecord:
    """Tying through the web left at the notch: depth ``h_web`` less ``holes`` bolt holes (a tee's flange
    ignored, conservative), f_u and gamma_Mu."""
    h_net = h_web - holes * d_0
    R = calc(F_t_wb_Rd_u, h_p=h_net, t_w=t_w, f_u=f_u, gamma_Mu=na.gamma_Mu)
    calc.keep("h_net", h_net, "mm")
    return calc.record(id=f"{prefix}_tie", title="Tying: tension of the web left at the notch",
                       clause="EN 1993-1-8:2005, 6.2.6.8, Eq. 6.22", demand=tie, resistance=R, unit="N",
                       guidance="published UK simple-joint guidance (from memory): tying resistances",
                       note=f"web of the {what} left at the notch, depth {h_web:.1f} mm"
                            + (f" less {holes} bolt holes of {d_0:g} mm" if holes else "")
                            + ("; the tee's flange ignored (conservative)" if what == "tee" else "")
                            + f"; {NOTE_TIE}")


def check_double_notch(beam, f_y: float, f_u: float, V_Ed: float, d_nt: float, d_nb: float, c: float, lever: float,
                       *, tie: float, holes: int = 0, d_0: float = 0.0, na: NationalAnnex = UK_NA,
                       calc: Calc | None = None, prefix: str = "notch") -> list[CheckRecord]:
    """Checks of a beam end notched at both flanges: the section left is the web rectangle h_w x t_w.

    Shear (6.2.6, A_v = h_w t_w), bending with shear at the notch root (M_Ed = V_Ed lever, elastic
    modulus t_w h_w^2/6, 6.2.8), local stability of the notched length (published notched-beam
    guidance, from memory: c within the single-notch limit and each notch depth <= h_b/5; beyond them
    a NOT CHECKED record names the method needed) and tying through the rectangle (f_u, gamma_Mu).
    """
    V_Ed = require_non_negative("V_Ed", V_Ed, "N")
    d_nt = require_positive("top notch depth", d_nt, "mm")
    d_nb = require_positive("bottom notch depth", d_nb, "mm")
    c = require_positive("notch length", c, "mm")
    lever = require_positive("lever", lever, "mm")
    if d_nt + d_nb >= beam.h - 2.0 * beam.tf:
        raise InputError("notch depth", d_nt + d_nb, f"top + bottom notch less than h - 2 t_f = "
                                                     f"{beam.h - 2 * beam.tf:g} mm of the beam (no web would be left)")
    calc = calc if calc is not None else Calc()
    out: list[CheckRecord] = []
    h_w = calc(h_w_notch, h_b=beam.h, d_nt=d_nt, d_nb=d_nb)
    A_v = calc(A_v_rect, h_w=h_w, t_w=beam.tw)
    V_N = calc(V_pl_Rd, A_v=A_v, f_y=f_y, gamma_M0=na.gamma_M0)
    calc.keep("A_v_N", A_v, "mm2")
    out.append(calc.record(id=f"{prefix}_shear", title="Shear of the double-notched section (web rectangle)",
                           clause="EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18", demand=V_Ed, resistance=V_N, unit="N",
                           note=f"h_w = {h_w:.1f} mm of web left between the notches"))
    rho = calc(rho_V, V_Ed=V_Ed, V_pl_Rd=V_N)
    W_N = calc(W_el_plate, t=beam.tw, h=h_w)
    M_Rd = calc(M_V_Rd_el, rho=rho, W_el=W_N, f_y=f_y, gamma_M0=na.gamma_M0)
    calc.keep("M_Ed", V_Ed * lever, "Nmm")
    out.append(calc.record(id=f"{prefix}_bending", title="Bending of the double-notched section with shear",
                           clause="EN 1993-1-1:2005, 6.2.8(3)", demand=V_Ed * lever, resistance=M_Rd, unit="Nmm",
                           note=f"M_Ed = V_Ed x {lever:g} mm (reaction line to the notch root); elastic "
                                "modulus of the web rectangle"))
    R_lim = 54.3 * math.sqrt(275.0 / max(f_y, 275.0))
    c_lim = calc(c_lim_notch, h_b=beam.h, t_w=beam.tw, f_y=f_y)
    d_lim = calc(d_lim_double_notch, h_b=beam.h)
    simple = max(d_nt, d_nb) <= d_lim + 1e-9
    if simple:
        out.append(calc.record(id=f"{prefix}_stability", title="Local stability of the double-notched length",
                               clause="EN 1993-1-1:2005, 6.3.2.1", demand=c, resistance=c_lim, unit="mm",
                               guidance=GUIDANCE,
                               note=f"both notches <= h_b/5 = {d_lim:.1f} mm (top {d_nt:g}, bottom {d_nb:g} mm); "
                                    f"h_b/t_w = {beam.h / beam.tw:.1f} against {R_lim:.1f}: "
                                    + NOTE_STABILITY))
    else:
        out.append(not_checked(id=f"{prefix}_stability", title="Local stability of the double-notched length",
                               clause="EN 1993-1-1:2005, 6.3.2.1",
                               reason=f"a notch deeper than h_b/5 = {d_lim:.1f} mm (top {d_nt:g}, bottom {d_nb:g} "
                                      "mm) is outside the simple limits of published notched-beam guidance (from "
                                      "memory): check the notched length by a buckling analysis of the web "
                                      "rectangle, or stiffen the notch"))
    out.append(_tie_record(calc, prefix, h_w, beam.tw, f_u, tie, holes, d_0, na, "web rectangle"))
    return out


__all__ = ["check_notch", "check_double_notch", "notch_fit", "NotchFit", "NOTCH_PRACTICE", "notch_ltb_not_checked"]
