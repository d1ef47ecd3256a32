"""EN 1993-1-1:2005 clause formulas for members in compression and bending (columns).

Flexural buckling (6.3.1), cross-section resistance to axial force and bending
(6.2.4, 6.2.9.1) and the member interaction of 6.3.3 with the interaction
factors of Annex B (Method 2). Plain floats in N, mm, MPa, N*mm (or
forallpeople quantities when rendered). Used by the existing-column check
(:mod:`splicecalc.joints.connections.existing_member`); nothing here knows a job.

Slenderness arguments are spelled ``lamb_y`` / ``lamb_z`` (handcalcs renders
``lamb`` as the Greek lambda).
"""

from __future__ import annotations

from math import pi, sqrt

from ..core.clause import clause

#: imperfection factors for flexural buckling, EN 1993-1-1:2005, Table 6.1
ALPHA_FLEXURAL: dict[str, float] = {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}


def flexural_curves(h: float, b: float, t_f: float) -> tuple[str, str]:
    """Buckling curves (y-y, z-z) of a rolled I or H section in S235 to S420, EN 1993-1-1:2005, Table 6.2."""
    if h / b > 1.2:
        return ("a", "b") if t_f <= 40.0 else ("b", "c")
    return ("b", "c") if t_f <= 100.0 else ("d", "d")


# ------------------------------------------------------------------ flexural buckling 6.3.1
# (chi, Eq. 6.49, and N_b,Rd, Eq. 6.47, have their one home in splicecalc.joints.plates; N_pl,Rd in
# splicecalc.members.en1993_1_1)
@clause("EN 1993-1-1:2005, 6.3.1.3(1), Eq. 6.50", units={"E": "MPa", "I": "mm4", "L_cr": "mm"}, returns="N",
        example=dict(I=11410e4, L_cr=3600.0))
def N_cr(I: float, L_cr: float, E: float = 210000.0) -> float:
    """Elastic critical force for flexural buckling N_cr = pi^2 E I / L_cr^2 (N)."""
    N_cr = pi**2 * E * I / L_cr**2
    return N_cr


@clause("EN 1993-1-1:2005, 6.3.1.3(1), Eq. 6.50", units={"A": "mm2", "f_y": "MPa", "N_cr": "N"}, returns="",
        example=dict(A=9310.0, f_y=275.0, N_cr=18.25e6))
def lambda_flex(A: float, f_y: float, N_cr: float) -> float:
    """Non-dimensional slenderness lambda = sqrt(A f_y / N_cr) (Class 1, 2, 3)."""
    lamb = sqrt(A * f_y / N_cr)
    return lamb


# ------------------------------------------------------------------ cross-section N + M, 6.2.9.1
@clause("EN 1993-1-1:2005, 6.2.9.1(5), Eq. 6.36", units={"M_pl_y_Rd": "Nmm"}, returns="Nmm",
        example=dict(M_pl_y_Rd=273e6, n=0.3, a=0.23))
def M_N_y_Rd(M_pl_y_Rd: float, n: float, a: float) -> float:
    """Reduced plastic moment about y-y for axial force, rolled I or H: M_pl,y,Rd (1 - n)/(1 - 0.5 a) <= M_pl,y,Rd.

    n = N_Ed / N_pl,Rd; a = (A - 2 b t_f)/A <= 0.5.
    """
    M_N_y_Rd = min(M_pl_y_Rd * (1 - n) / (1 - 0.5 * a), M_pl_y_Rd)
    return M_N_y_Rd


@clause("EN 1993-1-1:2005, 6.2.9.1(5), Eq. 6.38", units={"M_pl_z_Rd": "Nmm"}, returns="Nmm",
        example=dict(M_pl_z_Rd=122e6, n=0.3, a=0.23))
def M_N_z_Rd(M_pl_z_Rd: float, n: float, a: float) -> float:
    """Reduced plastic moment about z-z: M_pl,z,Rd for n <= a (Eq. 6.37), else
    M_pl,z,Rd [1 - ((n - a)/(1 - a))^2] (Eq. 6.38)."""
    if n <= a: M_N_z_Rd = M_pl_z_Rd
    else: M_N_z_Rd = M_pl_z_Rd * (1 - ((n - a) / (1 - a))**2)
    return M_N_z_Rd


@clause("EN 1993-1-1:2005, 6.2.9.1(6), Eq. 6.41", units={"M_y_Ed": "Nmm", "M_N_y_Rd": "Nmm", "M_z_Ed": "Nmm",
                                                          "M_N_z_Rd": "Nmm"}, returns="",
        example=dict(M_y_Ed=80e6, M_N_y_Rd=220e6, M_z_Ed=5e6, M_N_z_Rd=110e6, n=0.3))
def U_biaxial_NM(M_y_Ed: float, M_N_y_Rd: float, M_z_Ed: float, M_N_z_Rd: float, n: float) -> float:
    """Bi-axial criterion for I and H sections: [M_y/M_N,y]^alpha + [M_z/M_N,z]^beta, alpha = 2, beta = 5 n >= 1."""
    beta = max(5 * n, 1.0)
    U_NM = (M_y_Ed / M_N_y_Rd)**2 + (M_z_Ed / M_N_z_Rd)**beta
    return U_NM


@clause("EN 1993-1-1:2005, 6.2.4(1), Eq. 6.9 and 6.2.9.1(6), Eq. 6.41", units={}, returns="",
        example=dict(U_NM=0.02, n=0.157))
def U_section_NM(U_NM: float, n: float) -> float:
    """Utilisation of an I or H cross-section under N + M: the larger of the axial check N_Ed / N_pl,Rd = n
    (Eq. 6.9) and the bi-axial criterion U_NM (Eq. 6.41), which on its own does not bound N."""
    U = max(U_NM, n)
    return U


@clause("EN 1993-1-1:2005, 6.2.9.2(1), Eq. 6.42", units={"N_Ed": "N", "A": "mm2", "M_y_Ed": "Nmm", "W_el_y": "mm3",
                                                          "M_z_Ed": "Nmm", "W_el_z": "mm3", "f_y": "MPa"},
        returns="", example=dict(N_Ed=600e3, A=9310.0, M_y_Ed=80e6, W_el_y=898e3, M_z_Ed=5e6, W_el_z=307e3,
                                 f_y=275.0, gamma_M0=1.0))
def U_elastic_NM(N_Ed: float, A: float, M_y_Ed: float, W_el_y: float, M_z_Ed: float, W_el_z: float, f_y: float,
                 gamma_M0: float) -> float:
    """Class 3: largest longitudinal stress over f_y/gamma_M0, (N/A + M_y/W_el,y + M_z/W_el,z) gamma_M0 / f_y."""
    sigma_x_Ed = N_Ed / A + M_y_Ed / W_el_y + M_z_Ed / W_el_z
    U_el = sigma_x_Ed * gamma_M0 / f_y
    return U_el


# ------------------------------------------------------------------ member interaction 6.3.3, Annex B
@clause("EN 1993-1-1:2005, Annex B, Table B.3", units={}, returns="", example=dict(psi=0.0))
def C_m_linear(psi: float) -> float:
    """Equivalent uniform moment factor for a linear moment diagram, C_m = 0.6 + 0.4 psi >= 0.4."""
    C_m = max(0.6 + 0.4 * psi, 0.4)
    return C_m


@clause("EN 1993-1-1:2005, Annex B, Table B.1", units={"N_Ed": "N", "N_Rk": "N"}, returns="",
        example=dict(N_Ed=600e3, chi=0.8, N_Rk=2.56e6, gamma_M1=1.0))
def n_ratio(N_Ed: float, chi: float, N_Rk: float, gamma_M1: float) -> float:
    """n = N_Ed / (chi N_Rk / gamma_M1), for n_y (chi_y) or n_z (chi_z)."""
    n_i = N_Ed / (chi * N_Rk / gamma_M1)
    return n_i


@clause("EN 1993-1-1:2005, Annex B, Table B.1", units={}, returns="",
        example=dict(C_my=0.6, lamb_y=0.45, n_y=0.25, cls=1))
def k_yy_B(C_my: float, lamb_y: float, n_y: float, cls: int) -> float:
    """k_yy, I sections: Class 1, 2 C_my (1 + (lambda_y - 0.2) n_y) <= C_my (1 + 0.8 n_y);
    Class 3 C_my (1 + 0.6 lambda_y n_y) <= C_my (1 + 0.6 n_y)."""
    if cls <= 2: k_yy = min(C_my * (1 + (lamb_y - 0.2) * n_y), C_my * (1 + 0.8 * n_y))
    else: k_yy = min(C_my * (1 + 0.6 * lamb_y * n_y), C_my * (1 + 0.6 * n_y))
    return k_yy


@clause("EN 1993-1-1:2005, Annex B, Table B.1", units={}, returns="",
        example=dict(C_mz=0.6, lamb_z=0.75, n_z=0.4, cls=1))
def k_zz_B(C_mz: float, lamb_z: float, n_z: float, cls: int) -> float:
    """k_zz, I sections: Class 1, 2 C_mz (1 + (2 lambda_z - 0.6) n_z) <= C_mz (1 + 1.4 n_z);
    Class 3 C_mz (1 + 0.6 lambda_z n_z) <= C_mz (1 + 0.6 n_z)."""
    if cls <= 2: k_zz = min(C_mz * (1 + (2 * lamb_z - 0.6) * n_z), C_mz * (1 + 1.4 * n_z))
    else: k_zz = min(C_mz * (1 + 0.6 * lamb_z * n_z), C_mz * (1 + 0.6 * n_z))
    return k_zz


@clause("EN 1993-1-1:2005, Annex B, Table B.1", units={}, returns="", example=dict(k_zz=0.9, cls=1))
def k_yz_B(k_zz: float, cls: int) -> float:
    """k_yz = 0.6 k_zz (Class 1, 2) or k_zz (Class 3)."""
    if cls <= 2: k_yz = 0.6 * k_zz
    else: k_yz = k_zz
    return k_yz


@clause("EN 1993-1-1:2005, Annex B, Table B.2", units={}, returns="",
        example=dict(lamb_z=0.75, n_z=0.4, C_mLT=0.6, cls=1))
def k_zy_B(lamb_z: float, n_z: float, C_mLT: float, cls: int) -> float:
    """k_zy for members susceptible to torsional deformation. Class 1, 2: lambda_z >= 0.4:
    [1 - 0.1 lambda_z n_z/(C_mLT - 0.25)] >= [1 - 0.1 n_z/(C_mLT - 0.25)]; lambda_z < 0.4:
    0.6 + lambda_z <= 1 - 0.1 lambda_z n_z/(C_mLT - 0.25). Class 3: [1 - 0.05 lambda_z n_z/(C_mLT - 0.25)]
    >= [1 - 0.05 n_z/(C_mLT - 0.25)]."""
    if cls >= 3: k_zy = max(1 - 0.05 * lamb_z * n_z / (C_mLT - 0.25), 1 - 0.05 * n_z / (C_mLT - 0.25))
    elif lamb_z >= 0.4: k_zy = max(1 - 0.1 * lamb_z * n_z / (C_mLT - 0.25), 1 - 0.1 * n_z / (C_mLT - 0.25))
    else: k_zy = min(0.6 + lamb_z, 1 - 0.1 * lamb_z * n_z / (C_mLT - 0.25))
    return k_zy


@clause("EN 1993-1-1:2005, 6.3.3(4), Eq. 6.61 and Eq. 6.62", units={"N_Ed": "N", "N_Rk": "N", "M_y_Ed": "Nmm",
                                                                    "M_y_Rk": "Nmm", "M_z_Ed": "Nmm",
                                                                    "M_z_Rk": "Nmm"}, returns="",
        example=dict(N_Ed=600e3, chi_i=0.9, N_Rk=2.56e6, k_iy=0.65, M_y_Ed=80e6, chi_LT=0.95, M_y_Rk=273e6,
                     k_iz=0.5, M_z_Ed=5e6, M_z_Rk=122e6, gamma_M1=1.0))
def U_buckling_NM(N_Ed: float, chi_i: float, N_Rk: float, k_iy: float, M_y_Ed: float, chi_LT: float,
                  M_y_Rk: float, k_iz: float, M_z_Ed: float, M_z_Rk: float, gamma_M1: float) -> float:
    """Member interaction for buckling about axis i: Eq. 6.61 (i = y: chi_y, k_yy, k_yz) and Eq. 6.62
    (i = z: chi_z, k_zy, k_zz): N/(chi_i N_Rk/g) + k_iy M_y/(chi_LT M_y,Rk/g) + k_iz M_z/(M_z,Rk/g)."""
    U_N = N_Ed / (chi_i * N_Rk / gamma_M1)
    U_M_y = k_iy * M_y_Ed / (chi_LT * M_y_Rk / gamma_M1)
    U_M_z = k_iz * M_z_Ed / (M_z_Rk / gamma_M1)
    U_i = U_N + U_M_y + U_M_z
    return U_i


# ------------------------------------------------------------------ torsion with shear 6.2.7(9)
@clause("EN 1993-1-1:2005, 6.2.7(9), Eq. 6.26", units={"V_pl_Rd": "N", "tau_t_Ed": "MPa", "f_y": "MPa"},
        returns="N", example=dict(V_pl_Rd=600e3, tau_t_Ed=40.0, f_y=275.0, gamma_M0=1.0))
def V_pl_T_Rd(V_pl_Rd: float, tau_t_Ed: float, f_y: float, gamma_M0: float) -> float:
    """Plastic shear resistance of an I or H section reduced for St Venant torsion (N):
    V_pl,T,Rd = sqrt(1 - tau_t,Ed / (1.25 (f_y/sqrt 3)/gamma_M0)) V_pl,Rd, the root over the bracket only
    (tau_Rd = 1.25 (f_y/sqrt 3)/gamma_M0 named as a step so the rendering shows it so; nil when tau_t,Ed
    reaches tau_Rd)."""
    tau_Rd = 1.25 * (f_y / sqrt(3)) / gamma_M0
    if tau_t_Ed < tau_Rd: V_pl_T_Rd = sqrt(1 - tau_t_Ed / tau_Rd) * V_pl_Rd
    else: V_pl_T_Rd = 0.0
    return V_pl_T_Rd


__all__ = ["ALPHA_FLEXURAL", "flexural_curves", "N_cr", "lambda_flex", "M_N_y_Rd", "M_N_z_Rd", "U_biaxial_NM",
           "U_elastic_NM", "U_section_NM", "C_m_linear", "n_ratio", "k_yy_B", "k_zz_B", "k_yz_B", "k_zy_B", "U_buckling_NM",
           "V_pl_T_Rd"]
