"""EN 1993-1-5:2006 clause formulas: resistance of an unstiffened web to a transverse force (section 6).

Only load type (c) of Figure 6.1 is used here: a force applied through one
flange next to an unstiffened beam end (a beam end sitting on a support or
bearing), ``c`` = distance from the end of the stiff bearing to the beam end.
Plain floats in N, mm, MPa (or forallpeople quantities when rendered).
"""

from __future__ import annotations

from math import sqrt

from ..core.clause import clause


@clause("EN 1993-1-5:2006, 6.3(1)", units={"s_s": "mm", "h_w": "mm"}, returns="mm",
        example=dict(s_s=500.0, h_w=428.0))
def s_s_eff(s_s: float, h_w: float) -> float:
    """Stiff bearing length used in section 6: s_s, but not more than h_w (mm), 6.3(1)."""
    s_s_eff = min(s_s, h_w)
    return s_s_eff


@clause("EN 1993-1-5:2006, 6.1(4), Figure 6.1", units={"s_s": "mm", "c": "mm", "h_w": "mm"}, returns="",
        example=dict(s_s=100.0, c=0.0, h_w=428.0))
def k_F_c(s_s: float, c: float, h_w: float) -> float:
    """Buckling coefficient for load type (c): k_F = 2 + 6 (s_s + c) / h_w <= 6, Figure 6.1."""
    k_F = min(2 + 6 * (s_s + c) / h_w, 6.0)
    return k_F


@clause("EN 1993-1-5:2006, 6.4(1), Eq. 6.5", units={"E": "MPa", "t_w": "mm", "h_w": "mm"}, returns="N",
        example=dict(k_F=3.4, t_w=8.5, h_w=428.0))
def F_cr(k_F: float, t_w: float, h_w: float, E: float = 210000.0) -> float:
    """Elastic critical transverse force F_cr = 0.9 k_F E t_w^3 / h_w (N), Eq. 6.5."""
    F_cr = 0.9 * k_F * E * t_w**3 / h_w
    return F_cr


@clause("EN 1993-1-5:2006, 6.5(1), Eq. 6.8", units={"f_yf": "MPa", "b_f": "mm", "f_yw": "MPa", "t_w": "mm"},
        returns="", example=dict(f_yf=355.0, b_f=189.9, f_yw=355.0, t_w=8.5))
def m_1(f_yf: float, b_f: float, f_yw: float, t_w: float) -> float:
    """m_1 = f_yf b_f / (f_yw t_w), Eq. 6.8."""
    m_1 = f_yf * b_f / (f_yw * t_w)
    return m_1


@clause("EN 1993-1-5:2006, 6.5(1), Eq. 6.9", units={"h_w": "mm", "t_f": "mm"}, returns="",
        example=dict(h_w=428.0, t_f=12.7, lamb_F=0.8))
def m_2(h_w: float, t_f: float, lamb_F: float) -> float:
    """m_2 = 0.02 (h_w / t_f)^2 if lambda_F > 0.5, else 0, Eq. 6.9."""
    if lamb_F > 0.5: m_2 = 0.02 * (h_w / t_f)**2
    else: m_2 = 0.0
    return m_2


@clause("EN 1993-1-5:2006, 6.5(3), Eq. 6.13",
        units={"E": "MPa", "t_w": "mm", "f_yw": "MPa", "h_w": "mm", "s_s": "mm", "c": "mm"}, returns="mm",
        example=dict(k_F=3.4, t_w=8.5, f_yw=355.0, h_w=428.0, s_s=100.0, c=0.0))
def l_e(k_F: float, t_w: float, f_yw: float, h_w: float, s_s: float, c: float, E: float = 210000.0) -> float:
    """l_e = k_F E t_w^2 / (2 f_yw h_w) <= s_s + c (mm), Eq. 6.13."""
    l_e = min(k_F * E * t_w**2 / (2 * f_yw * h_w), s_s + c)
    return l_e


@clause("EN 1993-1-5:2006, 6.5(3), Eq. 6.11 and 6.12", units={"l_e": "mm", "t_f": "mm"}, returns="mm",
        example=dict(l_e=100.0, t_f=12.7, m_1=22.3, m_2=22.7))
def l_y_c(l_e: float, t_f: float, m_1: float, m_2: float) -> float:
    """Effective loaded length for type (c): the smaller of Eq. 6.11 and Eq. 6.12 (mm)."""
    l_y_1 = l_e + t_f * sqrt(m_1 / 2 + (l_e / t_f)**2 + m_2)
    l_y_2 = l_e + t_f * sqrt(m_1 + m_2)
    l_y = min(l_y_1, l_y_2)
    return l_y


@clause("EN 1993-1-5:2006, 6.4(1), Eq. 6.4", units={"l_y": "mm", "t_w": "mm", "f_yw": "MPa", "F_cr": "N"},
        returns="", example=dict(l_y=180.0, t_w=8.5, f_yw=355.0, F_cr=902e3))
def lambda_F(l_y: float, t_w: float, f_yw: float, F_cr: float) -> float:
    """Slenderness lambda_F = sqrt(l_y t_w f_yw / F_cr), Eq. 6.4."""
    lamb_F = sqrt(l_y * t_w * f_yw / F_cr)
    return lamb_F


@clause("EN 1993-1-5:2006, 6.4(1), Eq. 6.3", units={}, returns="", example=dict(lamb_F=0.8))
def chi_F(lamb_F: float) -> float:
    """Reduction factor chi_F = 0.5 / lambda_F <= 1.0, Eq. 6.3."""
    chi_F = min(0.5 / lamb_F, 1.0)
    return chi_F


@clause("EN 1993-1-5:2006, 6.2(1), Eq. 6.1 and 6.2", units={"f_yw": "MPa", "l_y": "mm", "t_w": "mm"},
        returns="N", example=dict(f_yw=355.0, chi_F=0.62, l_y=180.0, t_w=8.5, gamma_M1=1.0))
def F_Rd(f_yw: float, chi_F: float, l_y: float, t_w: float, gamma_M1: float) -> float:
    """Design resistance to local buckling under a transverse force F_Rd = f_yw L_eff t_w / gamma_M1 (N)."""
    L_eff = chi_F * l_y
    F_Rd = f_yw * L_eff * t_w / gamma_M1
    return F_Rd


@clause("EN 1993-1-5:2006, 7.2(1), Eq. 7.2", units={"F_Rd": "N", "M_Ed": "Nmm", "M_Rd": "Nmm"}, returns="N",
        example=dict(F_Rd=350e3, M_Ed=200e6, M_Rd=522e6))
def F_Rd_M(F_Rd: float, M_Ed: float, M_Rd: float) -> float:
    """Transverse-force resistance with coexisting bending (N), from Eq. 7.2.

    eta_2 + 0.8 eta_1 <= 1.4 with eta_2 = F_Ed/F_Rd <= 1 rearranged:
    F_Ed <= F_Rd min(1, 1.4 - 0.8 eta_1), eta_1 = M_Ed / M_Rd.
    """
    eta_1 = M_Ed / M_Rd
    F_Rd_M = F_Rd * max(min(1.0, 1.4 - 0.8 * eta_1), 0.0)
    return F_Rd_M


__all__ = ["s_s_eff", "k_F_c", "F_cr", "m_1", "m_2", "l_e", "l_y_c", "lambda_F", "chi_F", "F_Rd", "F_Rd_M"]
