"""EN 1993-1-5:2006 clause formulas for rolled I sections.

* section 6, resistance of an unstiffened web to a transverse force: load type (a) of
  Figure 6.1 (a force through one flange, carried by web shear on both sides: a point load
  in the span) and type (c) (a force through one flange next to an unstiffened beam end,
  ``c`` = distance from the end of the stiff bearing to the beam end); verification 6.6
  Eq. 6.14 and the interaction with bending 7.2 Eq. 7.2;
* section 5, shear buckling of a web with no intermediate stiffeners (Eq. 5.1, 5.2, 5.5,
  Table 5.1 with non-rigid end posts) and the interaction with bending 7.1 Eq. 7.1;
* section 4, effective widths of plate elements in compression (4.4, Eq. 4.2, 4.3,
  Tables 4.1 and 4.2).

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


@clause("EN 1993-1-5:2006, 6.1(4), Figure 6.1", units={"h_w": "mm", "a": "mm"}, returns="",
        example=dict(h_w=332.0, a=3000.0))
def k_F_a(h_w: float, a: float) -> float:
    """Buckling coefficient for load type (a): k_F = 6 + 2 (h_w / a)^2, Figure 6.1 (a: stiffener spacing)."""
    k_F = 6 + 2 * (h_w / a)**2
    return k_F


@clause("EN 1993-1-5:2006, 6.5(2), Eq. 6.10", units={"s_s": "mm", "t_f": "mm"}, returns="mm",
        example=dict(s_s=0.0, t_f=9.7, m_1=24.44, m_2=23.43))
def l_y_a(s_s: float, t_f: float, m_1: float, m_2: float) -> float:
    """Effective loaded length for types (a) and (b): l_y = s_s + 2 t_f (1 + sqrt(m_1 + m_2)) (mm), Eq. 6.10."""
    l_y = s_s + 2 * t_f * (1 + sqrt(m_1 + m_2))
    return l_y


@clause("EN 1993-1-5:2006, 6.6(1), Eq. 6.14", units={"F_Ed": "N", "F_Rd": "N"}, returns="",
        example=dict(F_Ed=324e3, F_Rd=334e3))
def eta_2(F_Ed: float, F_Rd: float) -> float:
    """Utilisation of the web under the transverse force eta_2 = F_Ed / F_Rd <= 1.0, Eq. 6.14."""
    eta_2 = F_Ed / F_Rd
    return eta_2


@clause("EN 1993-1-5:2006, 7.2(1), Eq. 7.2", units={"M_Ed": "Nmm", "M_Rd": "Nmm"}, returns="",
        example=dict(eta_2=0.97, M_Ed=243.7e6, M_Rd=275.1e6))
def eta_7_2(eta_2: float, M_Ed: float, M_Rd: float) -> float:
    """Left-hand side of the transverse force and bending interaction eta_2 + 0.8 eta_1 (<= 1.4), Eq. 7.2."""
    eta_1 = M_Ed / M_Rd
    eta_7_2 = eta_2 + 0.8 * eta_1
    return eta_7_2


# ------------------------------------------------------------------ section 5: shear buckling
@clause("EN 1993-1-5:2006, 5.3(3), Eq. 5.5", units={"h_w": "mm", "t_w": "mm"}, returns="",
        example=dict(h_w=380.8, t_w=6.4, epsilon=0.814))
def lambda_w(h_w: float, t_w: float, epsilon: float) -> float:
    """Web slenderness with transverse stiffening at the supports only: h_w / (86.4 t_w epsilon), Eq. 5.5."""
    lamb_w = h_w / (86.4 * t_w * epsilon)
    return lamb_w


@clause("EN 1993-1-5:2006, 5.3(1), Table 5.1", units={}, returns="", example=dict(lamb_w=0.846, eta=1.0))
def chi_w(lamb_w: float, eta: float) -> float:
    """Web shear-buckling factor for a non-rigid end post: eta for lambda_w < 0.83/eta, else 0.83/lambda_w."""
    if lamb_w < 0.83 / eta: chi_w = eta
    else: chi_w = 0.83 / lamb_w
    return chi_w


@clause("EN 1993-1-5:2006, 5.2(1), Eq. 5.1 and 5.2", units={"f_yw": "MPa", "h_w": "mm", "t_w": "mm"},
        returns="N", example=dict(chi_w=0.981, f_yw=355.0, h_w=380.8, t_w=6.4, eta=1.0, gamma_M1=1.0))
def V_b_Rd(chi_w: float, f_yw: float, h_w: float, t_w: float, eta: float, gamma_M1: float) -> float:
    """Shear-buckling resistance, web contribution only (V_bf,Rd = 0, conservative) (N), Eq. 5.1, 5.2."""
    V_bw_Rd = chi_w * f_yw * h_w * t_w / (sqrt(3) * gamma_M1)
    V_b_Rd = min(V_bw_Rd, eta * f_yw * h_w * t_w / (sqrt(3) * gamma_M1))
    return V_b_Rd


@clause("EN 1993-1-5:2006, 7.1(1)", units={"b_f": "mm", "t_f": "mm", "h": "mm", "f_yf": "MPa"}, returns="Nmm",
        example=dict(b_f=141.8, t_f=8.6, h=398.0, f_yf=355.0, gamma_M0=1.0))
def M_f_Rd(b_f: float, t_f: float, h: float, f_yf: float, gamma_M0: float) -> float:
    """Plastic moment resistance of the flanges alone M_f,Rd = b_f t_f (h - t_f) f_yf / gamma_M0 (N mm)."""
    M_f_Rd = b_f * t_f * (h - t_f) * f_yf / gamma_M0
    return M_f_Rd


@clause("EN 1993-1-5:2006, 7.1(1), Eq. 7.1", units={"M_Ed": "Nmm", "M_pl_Rd": "Nmm", "M_f_Rd": "Nmm",
                                                     "V_Ed": "N", "V_bw_Rd": "N"}, returns="",
        example=dict(M_Ed=150e6, M_pl_Rd=257e6, M_f_Rd=176e6, V_Ed=300e3, V_bw_Rd=490e3))
def eta_7_1(M_Ed: float, M_pl_Rd: float, M_f_Rd: float, V_Ed: float, V_bw_Rd: float) -> float:
    """Bending and shear interaction eta_1 + (1 - M_f,Rd / M_pl,Rd)(2 eta_3 - 1)^2 (<= 1.0) for eta_3 > 0.5.

    For eta_3 <= 0.5 the value is eta_1 (no reduction, 7.1(1)). Applied also where
    eta_1 < M_f,Rd / M_pl,Rd, where it is conservative (the flanges alone carry the moment).
    """
    eta_1 = M_Ed / M_pl_Rd
    eta_3 = V_Ed / V_bw_Rd
    if eta_3 > 0.5: eta_7_1 = eta_1 + (1 - M_f_Rd / M_pl_Rd) * (2 * eta_3 - 1)**2
    else: eta_7_1 = eta_1
    return eta_7_1


@clause("EN 1993-1-5:2006, 8(1), Eq. 8.1", units={"E": "MPa", "f_yf": "MPa", "A_w": "mm2", "A_fc": "mm2"},
        returns="", example=dict(k=0.4, f_yf=355.0, A_w=2437.0, A_fc=1219.0))
def hw_tw_max_flange_induced(k: float, f_yf: float, A_w: float, A_fc: float, E: float = 210000.0) -> float:
    """Largest web slenderness against flange-induced buckling h_w/t_w <= k (E / f_yf) sqrt(A_w / A_fc), Eq. 8.1."""
    hw_tw_max = k * E / f_yf * sqrt(A_w / A_fc)
    return hw_tw_max


# ------------------------------------------------------------------ section 4: effective widths
@clause("EN 1993-1-5:2006, 4.4(2), Table 4.1", units={}, returns="", example=dict(psi=-1.0))
def k_sigma_internal(psi: float) -> float:
    """Buckling factor of an internal compression element for stress ratio psi (-3 <= psi <= 1), Table 4.1."""
    if psi >= 0: k_sigma = 8.2 / (1.05 + psi)
    elif psi > -1: k_sigma = 7.81 - 6.29 * psi + 9.78 * psi**2
    else: k_sigma = 5.98 * (1 - psi)**2
    return k_sigma


@clause("EN 1993-1-5:2006, 4.4(2)", units={"b_bar": "mm", "t": "mm"}, returns="",
        example=dict(b_bar=120.0, t=6.0, epsilon=0.814, k_sigma=0.43))
def lambda_p(b_bar: float, t: float, epsilon: float, k_sigma: float) -> float:
    """Plate slenderness lambda_p = (b_bar / t) / (28.4 epsilon sqrt(k_sigma)), Eq. 4.3."""
    lamb_p = (b_bar / t) / (28.4 * epsilon * sqrt(k_sigma))
    return lamb_p


@clause("EN 1993-1-5:2006, 4.4(2), Eq. 4.2", units={}, returns="", example=dict(lamb_p=1.2, psi=-1.0))
def rho_internal(lamb_p: float, psi: float) -> float:
    """Reduction factor of an internal element: 1 for lambda_p <= 0.673, else (lambda_p - 0.055 (3 + psi)) / lambda_p^2."""
    if lamb_p <= 0.673: rho = 1.0
    else: rho = min((lamb_p - 0.055 * (3 + psi)) / lamb_p**2, 1.0)
    return rho


@clause("EN 1993-1-5:2006, 4.4(2), Eq. 4.3", units={}, returns="", example=dict(lamb_p=1.0))
def rho_outstand(lamb_p: float) -> float:
    """Reduction factor of an outstand element: 1 for lambda_p <= 0.748, else (lambda_p - 0.188) / lambda_p^2."""
    if lamb_p <= 0.748: rho = 1.0
    else: rho = min((lamb_p - 0.188) / lamb_p**2, 1.0)
    return rho


__all__ = ["hw_tw_max_flange_induced", "k_F_a", "l_y_a", "eta_2", "eta_7_2", "lambda_w", "chi_w", "V_b_Rd", "M_f_Rd", "eta_7_1",
           "k_sigma_internal", "lambda_p", "rho_internal", "rho_outstand", "s_s_eff", "k_F_c", "F_cr", "m_1", "m_2", "l_e", "l_y_c", "lambda_F", "chi_F", "F_Rd"]
