"""Clause formulas specific to simple end connections (partial-depth end plate, fin plate, notch).

Formulas shared with other joints (bolt shear and bearing, welds, plate tension,
block tearing, V_pl,Rd) are NOT repeated here: the checks call them from
:mod:`splicecalc.joints.bolts`, :mod:`~splicecalc.joints.welds`,
:mod:`~splicecalc.joints.plates` and :mod:`splicecalc.members.en1993_1_1`.

Several factors below come from published UK simple-joint design guidance (the
well-known "green book" method for simple joints to Eurocode 3) and are
written FROM MEMORY; each is flagged in its docstring and in the CheckRecord
note of the check that uses it:

* 1.27 reduction on gross shear of plates for the bending that coexists with shear;
* 0.8 allowance on the bolt shear resistance of an end plate for tension coexisting on the support side;
* 0.9 h_p t_w shear area of the beam web at a partial-depth end plate;
* long fin plate: z > t_p/0.15, lambda_LT = 2.8 sqrt(z h_p/(1.5 t_p^2)), BS 5950-1 Annex B
  Perry strength, resistance W_el f_pLT/(0.6 gamma_M1);
* no plate-bending check when h_p >= 2.73 z;
* notch stability limits (limiting notch length) for restrained beams;
* tying: T-stub of EN 1993-1-8 6.2.4 with f_u for f_y, gamma_Mu for gamma_M0, sum l_eff = h_p.

Units: N, mm, MPa, N*mm.
"""

from __future__ import annotations

from math import pi, sqrt

from ...core.clause import clause

# ------------------------------------------------------------------ shear of plates and webs


@clause("EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18", units={"h_p": "mm", "t_w": "mm"}, returns="mm2",
        example=dict(h_p=230.0, t_w=7.6, k_hp=0.9))
def A_v_hp(h_p: float, t_w: float, k_hp: float = 0.9) -> float:
    """Shear area of the beam web over the end-plate depth, A_v = k_hp h_p t_w (mm2).

    k_hp = 0.9: published simple-joint guidance (from memory); 1.0 = full gross web over h_p.
    """
    A_v = k_hp * h_p * t_w
    return A_v


@clause("EN 1993-1-1:2005, 6.2.6(7)", units={"A_v": "mm2", "d_0": "mm", "t_w": "mm"}, returns="mm2",
        example=dict(A_v=4094.0, n_1=4, d_0=22.0, t_w=8.5))
def A_v_net_web(A_v: float, n_1: float, d_0: float, t_w: float) -> float:
    """Net shear area of a beam web at a vertical line of n_1 holes, A_v - n_1 d_0 t_w (mm2)."""
    A_v_net = A_v - n_1 * d_0 * t_w
    return A_v_net


# ------------------------------------------------------------------ bolt groups


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"F_v_Rd": "N"}, returns="N",
        example=dict(F_v_Rd=94080.0, k_t=0.8))
def F_v_Rd_ep(F_v_Rd: float, k_t: float = 0.8) -> float:
    """Shear resistance of one end-plate bolt allowing for coexisting tension (N): k_t F_v,Rd.

    k_t = 0.8 (published simple-joint guidance, from memory) reduces the bolt SHEAR resistance
    only: tension in a bolt lowers its shear resistance (Table 3.4 interaction), not the
    bearing resistance of the plies. The group then follows 3.7(1) with k_t F_v,Rd in place
    of F_v,Rd (:func:`splicecalc.joints.bolts.F_Rd_group`).
    """
    F_v_Rd_red = k_t * F_v_Rd
    return F_v_Rd_red


@clause("EN 1993-1-8:2005, 3.7(1)", units={"V_Ed": "N", "z": "mm", "I_p": "mm2", "x_max": "mm"},
        returns="N", example=dict(V_Ed=200e3, n=4, z=50.0, I_p=24500.0, x_max=0.0))
def F_ver_Ed(V_Ed: float, n: float, z: float, I_p: float, x_max: float) -> float:
    """Vertical force component on the most loaded bolt (N): V_Ed/n + V_Ed z x_max / I_p."""
    F_ver = V_Ed / n + V_Ed * z * x_max / I_p
    return F_ver


@clause("EN 1993-1-8:2005, 3.7(1)", units={"V_Ed": "N", "z": "mm", "I_p": "mm2", "y_max": "mm"},
        returns="N", example=dict(V_Ed=200e3, z=50.0, I_p=24500.0, y_max=105.0))
def F_hor_Ed(V_Ed: float, z: float, I_p: float, y_max: float) -> float:
    """Horizontal force component on the most loaded bolt (N): V_Ed z y_max / I_p."""
    F_hor = V_Ed * z * y_max / I_p
    return F_hor


# ------------------------------------------------------------------ fin plate bending and LTB


@clause("EN 1993-1-1:2005, 6.2.5(2), Eq. 6.14", units={"M_c_Rd": "Nmm", "z": "mm"}, returns="N",
        example=dict(M_c_Rd=30.98e6, z=50.0))
def V_Rd_M(M_c_Rd: float, z: float) -> float:
    """Shear resistance of a fin plate limited by its bending at the weld, V = M_c,Rd / z (N)."""
    V_Rd_M = M_c_Rd / z
    return V_Rd_M


@clause("BS 5950-1:2000, B.2.1", units={"z": "mm", "h_p": "mm", "t_p": "mm"}, returns="",
        example=dict(z=80.0, h_p=360.0, t_p=10.0))
def lambda_LT_fin(z: float, h_p: float, t_p: float) -> float:
    """Slenderness of a long fin plate, lambda_LT = 2.8 sqrt(z h_p / (1.5 t_p^2)) (from memory of the
    published simple-joint guidance, which refers to BS 5950-1 for the plate strength)."""
    lambda_LT = 2.8 * sqrt(z * h_p / (1.5 * t_p**2))
    return lambda_LT


@clause("BS 5950-1:2000, B.2.1", units={"p_y": "MPa", "E": "MPa"}, returns="MPa",
        example=dict(lambda_LT=60.0, p_y=275.0, E=205000.0, alpha_LT=7.0))
def f_p_LT(lambda_LT: float, p_y: float, E: float = 205000.0, alpha_LT: float = 7.0) -> float:
    """Lateral-torsional buckling strength of a plate (BS 5950-1 Annex B.2.1, Perry formula, rolled
    sections alpha_LT = 7.0; from memory) (MPa)."""
    lambda_L0 = 0.4 * sqrt(pi**2 * E / p_y)
    eta_LT = max(alpha_LT * (lambda_LT - lambda_L0) / 1000, 0)
    p_E = pi**2 * E / lambda_LT**2
    phi_LT = (p_y + (eta_LT + 1) * p_E) / 2
    f_pLT = min(p_E * p_y / (phi_LT + (phi_LT**2 - p_E * p_y)**0.5), p_y)
    return f_pLT


@clause("EN 1993-1-1:2005, 6.3.2.1(3), Eq. 6.55", units={"W_el": "mm3", "f_pLT": "MPa", "z": "mm"},
        returns="N", example=dict(W_el=216e3, f_pLT=200.0, z=80.0, gamma_M1=1.0))
def V_Rd_fin_LTB(W_el: float, f_pLT: float, z: float, gamma_M1: float) -> float:
    """Shear resistance of a long fin plate limited by lateral-torsional buckling (N):
    V = (W_el / z) f_pLT / (0.6 gamma_M1) (published simple-joint guidance, from memory)."""
    V_Rd_LT = W_el * f_pLT / (z * 0.6 * gamma_M1)
    return V_Rd_LT


# ------------------------------------------------------------------ notched beams (tee at the notch)


@clause("EN 1993-1-1:2005, 6.2.5(2)", units={"h_T": "mm", "t_w": "mm", "b": "mm", "t_f": "mm"}, returns="mm2",
        example=dict(h_T=420.0, t_w=8.5, b=190.0, t_f=12.7))
def A_tee(h_T: float, t_w: float, b: float, t_f: float) -> float:
    """Area of the tee left at a top notch (mm2): flange b t_f plus web t_w (h_T - t_f); root fillets ignored."""
    A_T = b * t_f + t_w * (h_T - t_f)
    return A_T


@clause("EN 1993-1-1:2005, 6.2.5(2)", units={"h_T": "mm", "t_w": "mm", "b": "mm", "t_f": "mm"}, returns="mm",
        example=dict(h_T=420.0, t_w=8.5, b=190.0, t_f=12.7))
def y_c_tee(h_T: float, t_w: float, b: float, t_f: float) -> float:
    """Height of the tee's elastic centroid above the outer face of its flange (mm)."""
    A_f = b * t_f
    A_w = t_w * (h_T - t_f)
    y_c = (A_f * t_f / 2 + A_w * (t_f + (h_T - t_f) / 2)) / (A_f + A_w)
    return y_c


@clause("EN 1993-1-1:2005, 6.2.5(2)", units={"h_T": "mm", "t_w": "mm", "b": "mm", "t_f": "mm", "y_c": "mm"},
        returns="mm3", example=dict(h_T=420.0, t_w=8.5, b=190.0, t_f=12.7, y_c=129.9))
def W_el_tee(h_T: float, t_w: float, b: float, t_f: float, y_c: float) -> float:
    """Minimum elastic section modulus of the tee at the notch (mm3), about its own centroid."""
    h_web = h_T - t_f
    I_T = b * t_f**3 / 12 + b * t_f * (y_c - t_f / 2)**2 + t_w * h_web**3 / 12 + t_w * h_web * (t_f + h_web / 2 - y_c)**2
    W_el_N = I_T / max(y_c, h_T - y_c)
    return W_el_N


@clause("EN 1993-1-1:2005, 6.2.6(3)", units={"A_T": "mm2", "b": "mm", "t_f": "mm", "t_w": "mm", "r": "mm"},
        returns="mm2", example=dict(A_T=6900.0, b=190.0, t_f=12.7, t_w=8.5, r=10.2))
def A_v_tee(A_T: float, b: float, t_f: float, t_w: float, r: float) -> float:
    """Shear area of the tee at a notch (mm2): A_v = A_T - b t_f + (t_w + 2 r) t_f / 2 (the rolled-section
    rule of 6.2.6(3)(a) applied to one flange, as in published notched-beam guidance, from memory)."""
    A_v_N = A_T - b * t_f + (t_w + 2 * r) * t_f / 2
    return A_v_N


@clause("EN 1993-1-1:2005, 6.3.2.1", units={"h_b": "mm", "t_w": "mm", "f_y": "MPa", "f_ref": "MPa"}, returns="mm",
        example=dict(h_b=457.0, t_w=8.5, f_y=275.0, f_ref=275.0))
def c_lim_notch(h_b: float, t_w: float, f_y: float, f_ref: float = 275.0) -> float:
    """Longest single (top) notch needing no stability check, restrained beam (mm).

    Published notched-beam guidance (from memory): c <= h_b when h_b/t_w <= 54.3 (S275),
    else c <= 160 000 h_b / (h_b/t_w)^3; S355: 48.0 and 110 000. Written here as the S275
    values scaled by sqrt(275/f_y) on the ratio (and its cube on the constant), f_y >= 275.
    """
    R_lim = 54.3 * sqrt(f_ref / max(f_y, f_ref))
    ratio_w = h_b / t_w
    if ratio_w <= R_lim: c_lim = h_b
    else: c_lim = h_b * R_lim**3 / ratio_w**3
    return c_lim


# ------------------------------------------------------------------ double notch (both flanges cut)


@clause("EN 1993-1-1:2005, 6.2.5(2)", units={"h_b": "mm", "d_nt": "mm", "d_nb": "mm"}, returns="mm",
        example=dict(h_b=454.6, d_nt=35.0, d_nb=30.0))
def h_w_notch(h_b: float, d_nt: float, d_nb: float) -> float:
    """Depth of the web left between a top and a bottom notch (mm): h_b - d_nt - d_nb (a rectangle)."""
    h_w_N = h_b - d_nt - d_nb
    return h_w_N


@clause("EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18", units={"h_w": "mm", "t_w": "mm"}, returns="mm2",
        example=dict(h_w=389.6, t_w=8.1))
def A_v_rect(h_w: float, t_w: float) -> float:
    """Shear area of the rectangular web left by a double notch (mm2): the whole web, h_w t_w
    (published notched-beam guidance, from memory)."""
    A_v_N = h_w * t_w
    return A_v_N


@clause("EN 1993-1-1:2005, 6.3.2.1", units={"h_b": "mm"}, returns="mm", example=dict(h_b=454.6))
def d_lim_double_notch(h_b: float) -> float:
    """Deepest notch (top or bottom) of a double-notched restrained beam needing no stability check (mm):
    h_b / 5 (published notched-beam guidance, from memory)."""
    d_lim = h_b / 5
    return d_lim


# ------------------------------------------------------------------ tying (T-stub, 6.2.4 with f_u, gamma_Mu)


@clause("EN 1993-1-8:2005, 6.2.6.5, Figure 6.2", units={"p_3": "mm", "t_w": "mm", "a": "mm"}, returns="mm",
        example=dict(p_3=90.0, t_w=7.6, a=5.6))
def m_ep(p_3: float, t_w: float, a: float) -> float:
    """Distance m from bolt centre to the weld toe zone on an end plate (mm): (p_3 - t_w - 2 (0.8 a sqrt 2))/2."""
    m = (p_3 - t_w - 2 * 0.8 * a * sqrt(2)) / 2
    return m


@clause("EN 1993-1-8:2005, 6.2.6.4.1, Figure 6.8", units={"p_3": "mm", "t_w": "mm", "r": "mm"}, returns="mm",
        example=dict(p_3=90.0, t_w=8.6, r=12.7))
def m_cf(p_3: float, t_w: float, r: float) -> float:
    """Distance m from bolt centre to the root of a column flange (mm): (p_3 - t_w)/2 - 0.8 r."""
    m = (p_3 - t_w) / 2 - 0.8 * r
    return m


@clause("EN 1993-1-8:2005, 6.2.4.1, Table 6.2", units={"e_min": "mm", "m": "mm"}, returns="mm",
        example=dict(e_min=30.0, m=29.3))
def n_tstub(e_min: float, m: float) -> float:
    """n = min(e_min, 1.25 m), Table 6.2 (mm)."""
    n = min(e_min, 1.25 * m)
    return n


@clause("EN 1993-1-8:2005, 6.2.4.1, Table 6.2", units={"l_eff": "mm", "t_f": "mm", "f_u": "MPa"}, returns="Nmm",
        example=dict(l_eff=230.0, t_f=10.0, f_u=410.0, gamma_Mu=1.1))
def M_pl_Rd_u(l_eff: float, t_f: float, f_u: float, gamma_Mu: float) -> float:
    """Plastic moment of the T-stub flange for tying, 0.25 sum l_eff t_f^2 f_u / gamma_Mu (N*mm)
    (Table 6.2 with f_u for f_y and gamma_Mu for gamma_M0, as in published guidance, from memory)."""
    M_pl_u = 0.25 * l_eff * t_f**2 * f_u / gamma_Mu
    return M_pl_u


@clause("EN 1993-1-8:2005, 6.2.4.1, Table 6.2", units={"M_pl_u": "Nmm", "m": "mm", "n": "mm", "e_w": "mm"},
        returns="N", example=dict(M_pl_u=2.14e6, m=29.3, n=30.0, e_w=9.25))
def F_T_1_Rd(M_pl_u: float, m: float, n: float, e_w: float) -> float:
    """Mode 1 (complete yielding of the flange), method 2 of Table 6.2 (N):
    (8 n - 2 e_w) M_pl,1 / (2 m n - e_w (m + n))."""
    F_T_1 = (8 * n - 2 * e_w) * M_pl_u / (2 * m * n - e_w * (m + n))
    return F_T_1


@clause("EN 1993-1-8:2005, 6.2.4.1, Table 6.2", units={"M_pl_u": "Nmm", "n": "mm", "F_t_sum": "N", "m": "mm"},
        returns="N", example=dict(M_pl_u=2.14e6, n=30.0, F_t_sum=962e3, m=29.3))
def F_T_2_Rd(M_pl_u: float, n: float, F_t_sum: float, m: float) -> float:
    """Mode 2 (bolt failure with yielding of the flange), Table 6.2 (N): (2 M_pl,2 + n sum F_t) / (m + n)."""
    F_T_2 = (2 * M_pl_u + n * F_t_sum) / (m + n)
    return F_T_2


@clause("EN 1993-1-8:2005, 6.2.6.8, Eq. 6.22", units={"h_p": "mm", "t_w": "mm", "f_u": "MPa"}, returns="N",
        example=dict(h_p=230.0, t_w=7.6, f_u=410.0, gamma_Mu=1.1))
def F_t_wb_Rd_u(h_p: float, t_w: float, f_u: float, gamma_Mu: float) -> float:
    """Beam web in tension over the plate depth for tying, h_p t_w f_u / gamma_Mu (N)
    (Eq. 6.22 with b_eff = h_p, f_u for f_y, gamma_Mu for gamma_M0, from memory of published guidance)."""
    F_t_wb = h_p * t_w * f_u / gamma_Mu
    return F_t_wb


# ------------------------------------------------------------------ existing member


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"t_w2": "mm", "f_u2": "MPa", "f_yp": "MPa"}, returns="mm",
        example=dict(t_w2=8.0, f_u2=430.0, f_yp=275.0, gamma_M2=1.25))
def t_p_max_punching(t_w2: float, f_u2: float, f_yp: float, gamma_M2: float) -> float:
    """Largest fin plate thickness the supporting web can take without local punching (mm):
    t_p <= t_w2 f_u2 / (f_yp gamma_M2) (published simple-joint guidance, from memory)."""
    t_p_max = t_w2 * f_u2 / (f_yp * gamma_M2)
    return t_p_max


@clause("EN 1993-1-8:2005, 2.7(1)", units={"V_Ed": "N", "e": "mm"}, returns="Nmm",
        example=dict(V_Ed=150e3, e=227.0))
def M_add(V_Ed: float, e: float) -> float:
    """Moment applied to the supporting member by a reaction V_Ed at eccentricity e from its axis (N*mm):
    the member is designed for the moment of an eccentric intersection (EN 1993-1-8 2.7(1)); the
    eccentricity of a simple connection (100 mm from a column face) is published guidance."""
    M_add = V_Ed * e
    return M_add


@clause("EN 1993-1-8:2005, 6.4.2(2), Eq. 6.32", units={"d": "mm", "f_ub": "MPa", "f_y": "MPa"}, returns="mm",
        example=dict(d=20.0, f_ub=800.0, f_y=275.0))
def t_p_max_ductility(d: float, f_ub: float, f_y: float) -> float:
    """Largest end-plate thickness giving rotation capacity (mm): t <= 0.36 d sqrt(f_ub / f_y), Eq. 6.32."""
    t_max = 0.36 * d * sqrt(f_ub / f_y)
    return t_max

# ------------------------------------------------------------------ column web under transverse forces
@clause("EN 1993-1-8:2005, 6.2.6.2(1), Eq. 6.11", units={"l_load": "mm", "t_fc": "mm", "s": "mm"}, returns="mm",
        example=dict(l_load=230.0, t_fc=14.2, s=12.7))
def b_eff_wc(l_load: float, t_fc: float, s: float) -> float:
    """Effective width of a column web under a transverse force applied through its flange over the
    length l_load (the plate depth h_p of a simple connection): l_load + 5 (t_fc + s), s = r_c (mm)."""
    b_eff_wc = l_load + 5 * (t_fc + s)
    return b_eff_wc


@clause("EN 1993-1-8:2005, 6.2.6.2(1), Table 6.3", units={"b_eff": "mm", "t_wc": "mm", "A_vc": "mm2"}, returns="",
        example=dict(b_eff=366.0, t_wc=8.6, A_vc=2080.0))
def omega_1(b_eff: float, t_wc: float, A_vc: float) -> float:
    """Reduction for shear interaction in the column web, beta = 1 (one-sided joint):
    omega_1 = 1 / sqrt(1 + 1.3 (b_eff t_wc / A_vc)^2)."""
    omega = 1 / sqrt(1 + 1.3 * (b_eff * t_wc / A_vc)**2)
    return omega


@clause("EN 1993-1-8:2005, 6.2.6.2(2)", units={"sigma_com_Ed": "MPa", "f_y_wc": "MPa"}, returns="",
        example=dict(sigma_com_Ed=150.0, f_y_wc=275.0))
def k_wc(sigma_com_Ed: float, f_y_wc: float) -> float:
    """Reduction for the longitudinal compressive stress in the column web: 1 when sigma <= 0.7 f_y,wc,
    else 1.7 - sigma_com,Ed / f_y,wc."""
    if sigma_com_Ed <= 0.7 * f_y_wc: k_wc = 1.0
    else: k_wc = 1.7 - sigma_com_Ed / f_y_wc
    return k_wc


@clause("EN 1993-1-8:2005, 6.2.6.2(1), Eq. 6.13", units={"b_eff": "mm", "d_wc": "mm", "f_y_wc": "MPa", "E": "MPa",
                                                          "t_wc": "mm"}, returns="",
        example=dict(b_eff=366.0, d_wc=200.3, f_y_wc=275.0, t_wc=8.6))
def rho_wc(b_eff: float, d_wc: float, f_y_wc: float, t_wc: float, E: float = 210000.0) -> float:
    """Reduction for plate buckling of the column web: lambda_p = 0.932 sqrt(b_eff d_wc f_y,wc/(E t_wc^2));
    rho = 1 for lambda_p <= 0.72, else (lambda_p - 0.2)/lambda_p^2."""
    lamb_p = 0.932 * sqrt(b_eff * d_wc * f_y_wc / (E * t_wc**2))
    if lamb_p <= 0.72: rho = 1.0
    else: rho = (lamb_p - 0.2) / lamb_p**2
    return rho


@clause("EN 1993-1-8:2005, 6.2.6.2(1), Eq. 6.9", units={"b_eff": "mm", "t_wc": "mm", "f_y_wc": "MPa"}, returns="N",
        example=dict(omega=0.6, k_wc=1.0, rho=1.0, b_eff=366.0, t_wc=8.6, f_y_wc=275.0, gamma_M0=1.0, gamma_M1=1.0))
def F_c_wc_Rd(omega: float, k_wc: float, rho: float, b_eff: float, t_wc: float, f_y_wc: float, gamma_M0: float,
              gamma_M1: float) -> float:
    """Unstiffened column web in transverse compression (N):
    min(omega k_wc b_eff t_wc f_y,wc / gamma_M0, omega k_wc rho b_eff t_wc f_y,wc / gamma_M1)."""
    F_c_wc_Rd = min(omega * k_wc * b_eff * t_wc * f_y_wc / gamma_M0, omega * k_wc * rho * b_eff * t_wc * f_y_wc / gamma_M1)
    return F_c_wc_Rd


@clause("EN 1993-1-8:2005, 6.2.6.3(1), Eq. 6.15", units={"b_eff": "mm", "t_wc": "mm", "f_wc": "MPa"}, returns="N",
        example=dict(omega=0.6, b_eff=230.0, t_wc=8.6, f_wc=410.0, gamma_M=1.1))
def F_t_wc_Rd(omega: float, b_eff: float, t_wc: float, f_wc: float, gamma_M: float) -> float:
    """Unstiffened column web in transverse tension (N): omega b_eff,t,wc t_wc f_y,wc / gamma_M0
    (for tying: f_u for f_y and gamma_Mu, published guidance, from memory)."""
    F_t_wc_Rd = omega * b_eff * t_wc * f_wc / gamma_M
    return F_t_wc_Rd


# ------------------------------------------------------------------ structural integrity (tying)
@clause("EN 1991-1-7:2006, A.5.1, Eq. (A.1)", units={"W_acc": "N", "T_min": "N"}, returns="N",
        example=dict(k_T=0.8, W_acc=120e3))
def T_tie(k_T: float, W_acc: float, T_min: float = 75000.0) -> float:
    """Horizontal tie force of a framed structure, T = k_T (g_k + psi q_k) s L >= T_min (N).

    (g_k + psi q_k) s L = W_acc is the beam's total load in the accidental combination (line loads
    already carry the spacing s). k_T = 0.8 internal ties (EN 1991-1-7 A.5.1, class 2b), 0.5 for class
    2a by the UK NA (from memory); T_min = 75 kN.
    """
    T = max(k_T * W_acc, T_min)
    return T



# ------------------------------------------------------------------ torsion of a supporting beam
@clause("EN 1993-1-1:2005, 6.2.7(5)", units={"T_Ed": "Nmm", "h": "mm", "t_f": "mm", "a": "mm", "L": "mm"},
        returns="Nmm", example=dict(T_Ed=5e6, h=457.0, t_f=17.0, a=2100.0, L=6000.0))
def M_fl_warping(T_Ed: float, h: float, t_f: float, a: float, L: float) -> float:
    """Lateral moment in each flange when the whole torque T_Ed at a is carried by warping (N*mm):
    flange force T_Ed/(h - t_f) on a flange span L with forks at the ends (flange-bending analogy,
    published torsion design guidance, conservative)."""
    F_fl = T_Ed / (h - t_f)
    M_fl = F_fl * a * (L - a) / L
    return M_fl


@clause("EN 1993-1-1:2005, 6.2.7(5)", units={"M_y_Ed": "Nmm", "W_el_y": "mm3", "M_fl": "Nmm", "b": "mm",
                                              "t_f": "mm", "f_y": "MPa"}, returns="",
        example=dict(M_y_Ed=80e6, W_el_y=1120e3, M_fl=3e6, b=152.0, t_f=17.0, f_y=230.0, gamma_M0=1.0))
def U_bending_warping(M_y_Ed: float, W_el_y: float, M_fl: float, b: float, t_f: float, f_y: float,
                      gamma_M0: float) -> float:
    """Elastic flange-tip stress from major-axis bending plus warping over f_y/gamma_M0 (6.2.1(5) criterion):
    (M_y/W_el,y + M_fl/(t_f b^2/6)) gamma_M0/f_y."""
    W_fl = t_f * b**2 / 6
    U_w = (M_y_Ed / W_el_y + M_fl / W_fl) * gamma_M0 / f_y
    return U_w


@clause("EN 1993-1-1:2005, 6.2.7(9)", units={"T_Ed": "Nmm", "t_max": "mm", "I_t": "mm4"}, returns="MPa",
        example=dict(T_Ed=3e6, t_max=17.0, I_t=50e4))
def tau_t_Ed(T_Ed: float, t_max: float, I_t: float) -> float:
    """St Venant shear stress at the thickest element, tau_t = T_Ed t_max / I_t (MPa), the whole torque by St Venant."""
    tau_t = T_Ed * t_max / I_t
    return tau_t
