"""Tables printed by ``splicecalc bolt`` and ``splicecalc weld`` (keys carry units).

Every number comes from the clause formulas in splicecalc.joints; nothing is
re-derived here.
"""

from __future__ import annotations

from ..core.errors import InputError, require_positive
from ..joints import bolts, welds
from ..materials import UK_NA, NationalAnnex, steel


def bolt_summary(size: str, bolt_class: str = "8.8", friction_class: str = "A",
                 na: NationalAnnex = UK_NA) -> dict:
    """Resistances of one bolt: EN 1993-1-8:2005, Table 3.4 and 3.9."""
    b = bolts.get_bolt(size, bolt_class)
    mu = bolts.friction_mu(friction_class)
    alpha_threads = bolts.shear_factor_alpha_v(b.bolt_class, True)
    alpha_shank = bolts.shear_factor_alpha_v(b.bolt_class, False)
    d = {
        "size": b.size,
        "bolt_class": b.bolt_class,
        "d_mm": b.d,
        "A_mm2": round(b.A, 1),
        "As_mm2": b.A_s,
        "d0_mm": b.d_0,
        "d0_oversize_mm": b.d_0_oversize,
        "f_ub_MPa": b.f_ub,
        "f_yb_MPa": b.f_yb,
        "Fv_Rd_kN": bolts.F_v_Rd(alpha_threads, b.f_ub, b.A_s, na.gamma_M2) / 1e3,
        "Fv_Rd_shank_kN": bolts.F_v_Rd(alpha_shank, b.f_ub, b.A, na.gamma_M2) / 1e3,
        "Ft_Rd_kN": bolts.F_t_Rd(b.f_ub, b.A_s, na.gamma_M2) / 1e3,
    }
    if b.bolt_class in bolts.PRELOAD_CLASSES:
        fpc = bolts.F_p_C(b.f_ub, b.A_s)
        ks = bolts.slip_factor_k_s("normal")
        d.update({
            "Fp_C_kN": fpc / 1e3,
            "friction_class": friction_class.upper(),
            "mu": mu,
            "Fs_Rd_ULS_per_plane_kN": bolts.F_s_Rd(ks, 1, mu, fpc, na.gamma_M3) / 1e3,
            "Fs_Rd_SLS_per_plane_kN": bolts.F_s_Rd(ks, 1, mu, fpc, na.gamma_M3_ser) / 1e3,
        })
    d["gamma_M2"] = na.gamma_M2
    d["note"] = "Fv_Rd per shear plane, threads in the plane unless 'shank'; normal round holes"
    return {k: (round(v, 3) if isinstance(v, float) else v) for k, v in d.items()}


def weld_summary(leg_mm: float, grade: str = "S275", na: NationalAnnex = UK_NA) -> dict:
    """Fillet weld resistance per mm, EN 1993-1-8:2005, 4.5.3.3 (simplified method)."""
    s = require_positive("leg", leg_mm, "mm")
    if not 3.0 <= s <= 50.0:      # EN 1993-1-8 4.5.2(2): throat >= 3 mm; 50 mm is beyond any fillet weld
        raise InputError("leg", leg_mm, "a fillet weld leg from 3 mm to 50 mm", "Write e.g. 8")
    mat = steel(grade, 16.0)
    beta_w = welds.beta_w_for(mat.grade)
    a = welds.a_throat(s)
    fvw = welds.f_w_Rd(mat.f_u, beta_w, na.gamma_M2)
    return {
        "leg_mm": s,
        "throat_mm": round(a, 3),
        "grade": mat.grade,
        "f_u_MPa": mat.f_u,
        "beta_w": beta_w,
        "gamma_M2": na.gamma_M2,
        "fvw_d_MPa": round(fvw, 2),
        "Fw_Rd_kN_per_mm": round(welds.F_w_Rd(a, mat.f_u, beta_w, na.gamma_M2) / 1e3, 4),
        "note": "equal-leg 90 degree fillet, throat = 0.7 leg; fu for t <= 100 mm (EN 10025-2)",
    }
