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

from ...core.errors import InputError, require_non_negative, require_positive
from ...core.record import Calc, CheckRecord
from ...materials.partial_factors import UK_NA, NationalAnnex
from ...members.en1993_1_1 import V_pl_Rd, rho_V
from .detail import CL_PINNED, GUIDANCE
from ..plates import M_V_Rd_el
from .formulas import A_tee, A_v_tee, W_el_tee, c_lim_notch, y_c_tee

NOTE_STABILITY = ("limiting notch length for a laterally restrained beam from published notched-beam guidance "
                  "(from memory); beyond it shorten the notch or stiffen it")


def check_notch(beam, f_y: float, V_Ed: float, d_n: float, c: float, lever: float, *, na: NationalAnnex = UK_NA,
                calc: Calc | None = None, prefix: str = "notch") -> list[CheckRecord]:
    """Checks of a top-notched beam end (N, mm, MPa).

    ``beam``: the new beam's Section; ``d_n`` notch depth and ``c`` notch length (mm);
    ``lever``: distance from the line of the reaction to the notch root (mm), so
    M_Ed = V_Ed lever. Raises InputError for a notch that leaves no web.
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
                           note=NOTE_STABILITY))
    return out


__all__ = ["check_notch"]
