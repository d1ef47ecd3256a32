"""EN 1993-1-1:2005 clause formulas for members (cross-section and lateral-torsional buckling).

Each function is one code formula, decorated with :func:`splicecalc.core.clause.clause`.
Plain floats in N, mm, MPa, N*mm (or forallpeople quantities when rendered).
The check functions that assemble them are in :mod:`splicecalc.members.checks`.
Slenderness arguments are spelled ``lamb_LT`` / ``lamb_LT_0`` (handcalcs renders
``lamb`` as the Greek lambda; ``lambda`` is a Python keyword).
"""

from __future__ import annotations

from math import pi, sqrt

from ..core.clause import clause

# ------------------------------------------------------------------ classification
_T52 = "EN 1993-1-1:2005, 5.5.2, Table 5.2"


@clause(_T52, units={"f_y": "MPa", "f_ref": "MPa"}, returns="",
        example=dict(f_y=355.0))
def epsilon(f_y: float, f_ref: float = 235.0) -> float:
    """eps = sqrt(235 / fy), EN 1993-1-1 Table 5.2 (fy in MPa)."""
    epsilon = sqrt(f_ref / f_y)
    return epsilon


@clause(_T52 + " sheet 2", units={"c_f": "mm", "t_f": "mm"}, returns="",
        example=dict(c_f=80.5, t_f=12.7, epsilon=0.8136))
def c_t_flange(c_f: float, t_f: float, epsilon: float) -> tuple[float, float, float, float]:
    """Outstand flange in compression (rolled): c/t and its limits 9, 10, 14 eps for Class 1, 2, 3.

    ``c_f = (b - t_w - 2 r)/2`` (mm). Returns (c/t, limit 1, limit 2, limit 3).
    """
    ratio_f = c_f / t_f
    lim_f_1 = 9 * epsilon
    lim_f_2 = 10 * epsilon
    lim_f_3 = 14 * epsilon
    return ratio_f, lim_f_1, lim_f_2, lim_f_3


@clause(_T52 + " sheet 1", units={"c_w": "mm", "t_w": "mm"}, returns="",
        example=dict(c_w=407.6, t_w=8.5, epsilon=0.8136, alpha=0.5, psi=-1.0))
def c_t_web(c_w: float, t_w: float, epsilon: float, alpha: float = 0.5,
            psi: float = -1.0) -> tuple[float, float, float, float]:
    """Internal web part in bending and/or compression: c/t and its Class 1, 2, 3 limits.

    ``c_w`` = depth between root fillets (mm). ``alpha`` = compressed fraction of
    c under the plastic stress distribution (0.5 pure bending, 1.0 pure
    compression); ``psi`` = elastic stress ratio (-1 pure bending, +1 pure
    compression). Pure bending gives 72/83/124 eps, pure compression 33/38/42 eps.
    Returns (c/t, limit 1, limit 2, limit 3).
    """
    ratio_w = c_w / t_w
    if alpha > 0.5: lim_w_1 = 396 * epsilon / (13 * alpha - 1)
    else: lim_w_1 = 36 * epsilon / alpha
    if alpha > 0.5: lim_w_2 = 456 * epsilon / (13 * alpha - 1)
    else: lim_w_2 = 41.5 * epsilon / alpha
    if psi > -1: lim_w_3 = 42 * epsilon / (0.67 + 0.33 * psi)
    else: lim_w_3 = 62 * epsilon * (1 - psi) * sqrt(-psi)
    return ratio_w, lim_w_1, lim_w_2, lim_w_3


@clause(_T52 + " sheet 1", units={"N_Ed": "N", "c_w": "mm", "t_w": "mm", "f_y": "MPa"}, returns="",
        example=dict(N_Ed=200e3, c_w=407.6, t_w=8.5, f_y=355.0))
def alpha_web(N_Ed: float, c_w: float, t_w: float, f_y: float) -> float:
    """Compressed fraction alpha of the web depth c (plastic, doubly symmetric I, axial N_Ed >= 0 compression).

    alpha = (1 + N_Ed / (c t_w f_y)) / 2 <= 1: the plastic neutral axis moves
    by N_Ed / (2 t_w f_y) from mid-depth (Table 5.2 sheet 1 stress diagram).
    """
    alpha = min((1 + N_Ed / (c_w * t_w * f_y)) / 2, 1.0)
    return alpha


@clause(_T52 + " sheet 1", units={"N_Ed": "N", "A": "mm2", "f_y": "MPa"}, returns="",
        example=dict(N_Ed=200e3, A=8550.0, f_y=355.0))
def psi_web(N_Ed: float, A: float, f_y: float) -> float:
    """Elastic stress ratio psi of the web for Class 3 (doubly symmetric I, compression N_Ed >= 0).

    psi = 2 N_Ed / (A f_y) - 1 <= 1 (compression edge at f_y; the common
    approximation taking the web edge stresses equal to the extreme-fibre ones).
    """
    psi = min(2 * N_Ed / (A * f_y) - 1, 1.0)
    return psi


# ------------------------------------------------------------------ bending 6.2.5
@clause("EN 1993-1-1:2005, 6.2.5(2), Eq. 6.13", units={"W_y": "mm3", "f_y": "MPa"}, returns="Nmm",
        example=dict(W_y=1471e3, f_y=355.0, gamma_M0=1.0))
def M_c_Rd(W_y: float, f_y: float, gamma_M0: float) -> float:
    """Design bending resistance M_c,Rd = W f_y / gamma_M0 (N*mm), Eq. 6.13 (W = W_pl, Class 1, 2) / 6.14 (W = W_el, Class 3)."""
    M_c_Rd = W_y * f_y / gamma_M0
    return M_c_Rd


# ------------------------------------------------------------------ tension 6.2.3 (one home: members and plates)
@clause("EN 1993-1-1:2005, 6.2.3(2), Eq. 6.6", units={"A": "mm2", "f_y": "MPa"}, returns="N",
        example=dict(A=2400.0, f_y=275.0, gamma_M0=1.0))
def N_pl_Rd(A: float, f_y: float, gamma_M0: float) -> float:
    """Plastic resistance of the gross cross-section, Eq. 6.6 (N); also the right side of Eq. 6.16
    for a tension flange (A = A_f)."""
    N_pl_Rd = A * f_y / gamma_M0
    return N_pl_Rd


@clause("EN 1993-1-1:2005, 6.2.3(2), Eq. 6.7", units={"A_net": "mm2", "f_u": "MPa"}, returns="N",
        example=dict(A_net=1960.0, f_u=410.0, gamma_M2=1.1))
def N_u_Rd(A_net: float, f_u: float, gamma_M2: float) -> float:
    """Ultimate resistance of the net cross-section at the holes, Eq. 6.7 (N); also the left side of
    Eq. 6.16 for a tension flange (A_net = A_f,net)."""
    N_u_Rd = 0.9 * A_net * f_u / gamma_M2
    return N_u_Rd


@clause("EN 1993-1-1:2005, 6.2.3(4), Eq. 6.8", units={"A_net": "mm2", "f_y": "MPa"}, returns="N",
        example=dict(A_net=1960.0, f_y=275.0, gamma_M0=1.0))
def N_net_Rd(A_net: float, f_y: float, gamma_M0: float) -> float:
    """Net-section yield resistance for category C slip-resistant connections, Eq. 6.8 (N)."""
    N_net_Rd = A_net * f_y / gamma_M0
    return N_net_Rd


@clause("EN 1993-1-1:2005, 6.2.5(4), Eq. 6.16", units={"A_f_net": "mm2", "f_u": "MPa", "f_y": "MPa"},
        returns="mm2", example=dict(A_f_net=1854.0, f_u=470.0, f_y=355.0, gamma_M0=1.0, gamma_M2=1.1))
def A_f_eff(A_f_net: float, f_u: float, f_y: float, gamma_M0: float, gamma_M2: float) -> float:
    """Effective tension-flange area when Eq. 6.16 is not met (mm2).

    A_f,eff = 0.9 A_f,net (f_u/gamma_M2) / (f_y/gamma_M0): the flange area that
    just satisfies Eq. 6.16 (the usual UK reading of 6.2.5(4); from memory).
    """
    A_f_eff = 0.9 * A_f_net * (f_u / gamma_M2) / (f_y / gamma_M0)
    return A_f_eff


@clause("EN 1993-1-1:2005, 6.2.5(4)", units={"W_pl_y": "mm3", "Delta_A_f": "mm2", "y_f": "mm", "t_w": "mm"},
        returns="mm3", example=dict(W_pl_y=1471e3, Delta_A_f=200.0, y_f=220.35, t_w=8.5))
def W_pl_y_net(W_pl_y: float, Delta_A_f: float, y_f: float, t_w: float) -> float:
    """Plastic modulus with the tension-flange area reduced by Delta_A_f (mm3).

    The plastic neutral axis moves Delta_A_f/(2 t_w) towards the compression
    flange (kept in the web); y_f = (h - t_f)/2 is the flange lever arm from
    mid-depth: W = W_pl - Delta_A_f y_f - Delta_A_f^2 / (4 t_w).
    """
    W_pl_y_net = W_pl_y - Delta_A_f * y_f - Delta_A_f**2 / (4 * t_w)
    return W_pl_y_net


@clause("EN 1993-1-1:2005, 6.2.5(4)", units={"I_y": "mm4", "A": "mm2", "Delta_A_f": "mm2", "y_f": "mm", "h": "mm"},
        returns="mm3", example=dict(I_y=29380e4, A=8550.0, Delta_A_f=200.0, y_f=220.35, h=453.4))
def W_el_y_net(I_y: float, A: float, Delta_A_f: float, y_f: float, h: float) -> float:
    """Elastic modulus with the tension-flange area reduced by Delta_A_f (mm3), the smaller of the two fibres.

    Centroid shift e = Delta_A_f y_f / (A - Delta_A_f) towards the compression
    flange; I_net = I_y - Delta_A_f y_f^2 - (A - Delta_A_f) e^2; the tension fibre
    is now the farther one (h/2 + e), so W = I_net/(h/2 + e) governs first yield.
    """
    e_c = Delta_A_f * y_f / (A - Delta_A_f)
    I_y_net = I_y - Delta_A_f * y_f**2 - (A - Delta_A_f) * e_c**2
    W_el_y_net = I_y_net / (h / 2 + e_c)
    return W_el_y_net


# ------------------------------------------------------------------ shear 6.2.6
@clause("EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18", units={"A_v": "mm2", "f_y": "MPa"}, returns="N",
        example=dict(A_v=4094.0, f_y=355.0, gamma_M0=1.0))
def V_pl_Rd(A_v: float, f_y: float, gamma_M0: float) -> float:
    """Plastic shear resistance V_pl,Rd = A_v (f_y / sqrt 3) / gamma_M0 (N), Eq. 6.18."""
    V_pl_Rd = A_v * (f_y / sqrt(3)) / gamma_M0
    return V_pl_Rd


@clause("EN 1993-1-1:2005, 6.2.6(6), Eq. 6.22", units={"h_w": "mm", "t_w": "mm"}, returns="",
        example=dict(h_w=428.0, t_w=8.5, epsilon=0.8136, eta=1.0))
def shear_buckling_ratio(h_w: float, t_w: float, epsilon: float, eta: float) -> float:
    """(h_w / t_w) / (72 eps / eta): > 1 means the web must be checked for shear buckling (EN 1993-1-5 section 5)."""
    ratio_hw = h_w / t_w
    lim_hw = 72 * epsilon / eta
    u_hw = ratio_hw / lim_hw
    return u_hw


# ------------------------------------------------------------------ bending and shear 6.2.8
@clause("EN 1993-1-1:2005, 6.2.8(3), Eq. 6.29", units={"V_Ed": "N", "V_pl_Rd": "N"}, returns="",
        example=dict(V_Ed=600e3, V_pl_Rd=839e3))
def rho_V(V_Ed: float, V_pl_Rd: float) -> float:
    """rho = (2 V_Ed / V_pl,Rd - 1)^2 when V_Ed > 0.5 V_pl,Rd, else 0 (6.2.8(2)); capped at 1.

    The cap is applied to the base (2 V_Ed / V_pl,Rd - 1 <= 1, i.e. V_Ed <= V_pl,Rd), which is the
    same for every V_Ed and cannot overflow.
    """
    if V_Ed <= 0.5 * V_pl_Rd: rho = 0.0
    else: rho = min(2 * V_Ed / V_pl_Rd - 1, 1.0)**2
    return rho


@clause("EN 1993-1-1:2005, 6.2.8(5), Eq. 6.30",
        units={"W_pl_y": "mm3", "A_w": "mm2", "t_w": "mm", "f_y": "MPa", "M_c_Rd": "Nmm"}, returns="Nmm",
        example=dict(W_pl_y=1471e3, rho=0.18, A_w=3638.0, t_w=8.5, f_y=355.0, gamma_M0=1.0, M_c_Rd=522.2e6))
def M_y_V_Rd(W_pl_y: float, rho: float, A_w: float, t_w: float, f_y: float, gamma_M0: float,
             M_c_Rd: float) -> float:
    """Reduced plastic moment for I-sections with shear (N*mm), Eq. 6.30, not more than M_c,Rd.

    ``A_w = h_w t_w`` (mm2).
    """
    M_y_V_Rd = min((W_pl_y - rho * A_w**2 / (4 * t_w)) * f_y / gamma_M0, M_c_Rd)
    return M_y_V_Rd


@clause("EN 1993-1-1:2005, 6.2.8(3)",
        units={"W_el_y": "mm3", "t_w": "mm", "h_w": "mm", "h": "mm", "f_y": "MPa", "M_c_Rd": "Nmm"},
        returns="Nmm", example=dict(W_el_y=1296e3, rho=0.18, t_w=8.5, h_w=428.0, h=453.4, f_y=355.0,
                                    gamma_M0=1.0, M_c_Rd=460.1e6))
def M_y_V_Rd_el(W_el_y: float, rho: float, t_w: float, h_w: float, h: float, f_y: float, gamma_M0: float,
                M_c_Rd: float) -> float:
    """Reduced elastic moment for Class 3 I-sections with shear (N*mm), 6.2.8(3).

    The web (shear area h_w t_w) works at the reduced strength (1 - rho) f_y:
    W = W_el - rho t_w h_w^3 / (6 h), moment of the web about the centroid over h/2.
    """
    M_y_V_Rd = min((W_el_y - rho * t_w * h_w**3 / (6 * h)) * f_y / gamma_M0, M_c_Rd)
    return M_y_V_Rd


# ------------------------------------------------------------------ LTB 6.3.2
@clause("EN 1993-1-1:2005, 6.3.2.2(1)", units={"W_y": "mm3", "f_y": "MPa", "M_cr": "Nmm"}, returns="",
        example=dict(W_y=1471e3, f_y=355.0, M_cr=1100e6))
def lambda_LT(W_y: float, f_y: float, M_cr: float) -> float:
    """Non-dimensional slenderness lambda_LT = sqrt(W_y f_y / M_cr)."""
    lamb_LT = sqrt(W_y * f_y / M_cr)
    return lamb_LT


@clause("EN 1993-1-1:2005, 6.3.2.3(1), Eq. 6.57", units={}, returns="",
        example=dict(lamb_LT=0.85, alpha_LT=0.49, lamb_LT_0=0.4, beta=0.75))
def chi_LT(lamb_LT: float, alpha_LT: float, lamb_LT_0: float, beta: float) -> float:
    """Reduction factor chi_LT for rolled sections, Eq. 6.57: <= 1 and <= 1/lambda_LT^2."""
    Phi_LT = 0.5 * (1 + alpha_LT * (lamb_LT - lamb_LT_0) + beta * lamb_LT**2)
    chi_LT = min(1 / (Phi_LT + sqrt(Phi_LT**2 - beta * lamb_LT**2)), 1.0, 1 / lamb_LT**2)
    return chi_LT


@clause("EN 1993-1-1:2005, 6.3.2.3(2), Eq. 6.58", units={}, returns="",
        example=dict(k_c=0.94, lamb_LT=0.85))
def f_LT(k_c: float, lamb_LT: float) -> float:
    """Modification factor f = 1 - 0.5 (1 - k_c) [1 - 2 (lambda_LT - 0.8)^2] <= 1, Eq. 6.58."""
    f = min(1 - 0.5 * (1 - k_c) * (1 - 2 * (lamb_LT - 0.8)**2), 1.0)
    return f


@clause("EN 1993-1-1:2005, 6.3.2.3(2), Eq. 6.58", units={}, returns="",
        example=dict(chi_LT=0.65, f=0.97, lamb_LT=0.85))
def chi_LT_mod(chi_LT: float, f: float, lamb_LT: float) -> float:
    """chi_LT,mod = chi_LT / f, not more than 1 nor 1/lambda_LT^2."""
    chi_LT_mod = min(chi_LT / f, 1.0, 1 / lamb_LT**2)
    return chi_LT_mod


@clause("UK NA to BS EN 1993-1-1:2005+A1:2014, NA.2.18", units={}, returns="", example=dict(C_1=1.127))
def k_c_from_C1(C_1: float) -> float:
    """Correction factor k_c = 1/sqrt(C_1) for the moment distribution (UK NA, NA.2.18; from memory)."""
    k_c = 1 / sqrt(C_1)
    return k_c


@clause("EN 1993-1-1:2005, 6.3.2.3(2), Table 6.6", units={}, returns="", example=dict(psi=0.0))
def k_c_linear(psi: float) -> float:
    """Correction factor for a linear moment diagram, end-moment ratio -1 <= psi <= 1: k_c = 1/(1.33 - 0.33 psi).

    Other Table 6.6 cases (simply supported span): UDL 0.94, central point load 0.86 (from memory).
    """
    k_c = 1 / (1.33 - 0.33 * psi)
    return k_c


@clause("EN 1993-1-1:2005, 6.3.2.1(3), Eq. 6.55", units={"W_y": "mm3", "f_y": "MPa"}, returns="Nmm",
        example=dict(chi_LT_mod=0.7, W_y=1471e3, f_y=355.0, gamma_M1=1.0))
def M_b_Rd(chi_LT_mod: float, W_y: float, f_y: float, gamma_M1: float) -> float:
    """Design buckling resistance moment M_b,Rd = chi_LT,mod W_y f_y / gamma_M1 (N*mm), Eq. 6.55 with 6.3.2.3(2)."""
    M_b_Rd = chi_LT_mod * W_y * f_y / gamma_M1
    return M_b_Rd


# ------------------------------------------------------------------ serviceability
@clause("EN 1993-1-1:2005, 7.2.1(1)", units={"L": "mm"}, returns="mm",
        example=dict(L=7200.0, n_lim=360.0))
def delta_lim(L: float, n_lim: float) -> float:
    """Deflection limit L / n (mm); UK NA suggested n = 360 (brittle finishes), 200 (other), 180 (cantilevers)."""
    delta_lim = L / n_lim
    return delta_lim


__all__ = [
    "epsilon", "c_t_flange", "c_t_web", "alpha_web", "psi_web", "M_c_Rd",
    "N_pl_Rd", "N_u_Rd", "N_net_Rd", "A_f_eff", "W_pl_y_net", "W_el_y_net", "V_pl_Rd", "shear_buckling_ratio",
    "rho_V", "M_y_V_Rd", "M_y_V_Rd_el", "lambda_LT", "chi_LT", "f_LT", "chi_LT_mod", "k_c_from_C1", "k_c_linear",
    "M_b_Rd", "delta_lim",
]


# ------------------------------------------------------------------ lateral restraints 5.3.3
@clause("EN 1993-1-1:2005, 5.3.3(1), Eq. 5.12", units={"L": "mm"}, returns="mm", example=dict(m=1.0, L=7200.0))
def e_0_bracing(m: float, L: float) -> float:
    """Bow imperfection of the restrained flange e_0 = alpha_m L / 500, alpha_m = sqrt(0.5 (1 + 1/m)) (mm)."""
    alpha_m = sqrt(0.5 * (1 + 1 / m))
    e_0 = alpha_m * L / 500
    return e_0


@clause("EN 1993-1-1:2005, 5.3.3(2), Eq. 5.13", units={"N_Ed": "N", "e_0": "mm", "delta_q": "mm", "L": "mm"},
        returns="N/mm", example=dict(N_Ed=900e3, e_0=14.4, delta_q=2.9, L=7200.0))
def q_d_bracing(N_Ed: float, e_0: float, delta_q: float, L: float) -> float:
    """Equivalent stabilising force on the restraint system q_d = N_Ed 8 (e_0 + delta_q) / L^2 (N/mm)."""
    q_d = N_Ed * 8 * (e_0 + delta_q) / L**2
    return q_d


# ------------------------------------------------------------------ floor vibration (EN 1990 A1.4.4)
@clause("EN 1990:2002, A1.4.4", units={}, returns="", example=dict(delta_mm=8.4))
def f_1_beam(delta_mm: float, g_acc: float = 9810.0) -> float:
    """Fundamental frequency of a simply supported beam from the deflection delta under its own mass load
    f_1 = (pi/2) sqrt(5 g / (384 delta)) in Hz, with delta in mm and g in mm/s2 (plain numbers, so the
    sheet shows the frequency in Hz and the deflection in mm): exact for a uniform mass
    (= (pi/2) sqrt(E I / (m L^4))), the common approximation otherwise."""
    f_1 = pi / 2 * (5 * g_acc / (384 * delta_mm))**0.5
    return f_1
