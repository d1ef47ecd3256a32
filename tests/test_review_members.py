"""Checker's review tests: member design against outside references and independent implementations.

Each test names its source beside the expected value. The independent reference for M_cr is a
Rayleigh-Ritz solution written here from the classical energy expression of a fork-supported
thin-walled beam (Timoshenko and Gere, *Theory of Elastic Stability*, 1961, ch. 6; Trahair,
*Flexural-Torsional Buckling of Structures*, 1993, ch. 3 and 6, from memory):

    Pi = 1/2 int(E Iz v''^2 + G It phi'^2 + E Iw phi''^2) dx + int(M v'' phi) dx - 1/2 int(q z_g phi^2) dx
         - 1/2 sum(P z_g phi(x_P)^2)

with v = sum a_n sin(n pi x / L), phi = sum b_n sin(n pi x / L) (fork supports: v = phi = 0,
v'' = phi'' = 0 at the ends), gravity loads q, P positive downwards and z_g positive above the
shear centre. It shares no code with splicecalc.members.mcr (sine series instead of Hermite
elements, its own quadrature split at the load discontinuities).
"""

from __future__ import annotations

from math import pi, sqrt

import numpy as np
import pytest
import scipy.linalg

from splicecalc.actions import PointLoad, UDL
from splicecalc.core.errors import InputError
from splicecalc.core.record import Calc
from splicecalc.design.beam import design_beam
from splicecalc.job import BeamSpec, Job
from splicecalc.members import (ShearBucklingError, check_ltb, check_shear, check_web_bearing, classify,
                                mcr_numerical, section_class)
from splicecalc.sections import get_section, measured_section

E, G = 210000.0, 81000.0   # MPa, EN 1993-1-1 3.2.6
g_n = 9.81                 # m/s2


# ================================================================ independent Rayleigh-Ritz M_cr
def _gauss(breaks: list[float], n: int = 24, pieces: int = 24) -> tuple[np.ndarray, np.ndarray]:
    """Gauss-Legendre points and weights: each interval between sorted break points cut in ``pieces``."""
    t, wt = np.polynomial.legendre.leggauss(n)
    xs, ws = [], []
    for a, b in zip(breaks[:-1], breaks[1:]):
        if b > a:
            edges = np.linspace(a, b, pieces + 1)
            for c, e in zip(edges[:-1], edges[1:]):
                xs.append(c + (t + 1) * (e - c) / 2)
                ws.append(wt * (e - c) / 2)
    return np.concatenate(xs), np.concatenate(ws)


def rr_alpha_cr(sec, L: float, M, q=None, z_g: float = 0.0, points=(), breaks=(), n_terms: int = 30) -> float:
    """Critical load factor by Rayleigh-Ritz with sine series (see the module docstring).

    M(x) moment (N*mm), q(x) line load (N/mm) with height z_g (mm), points = [(x, P)] at height z_g.
    """
    bp = sorted({0.0, L, *breaks, *(x for x, _ in points)})
    x, w = _gauss(bp)
    k = np.arange(1, n_terms + 1) * pi / L
    S, C = np.sin(np.outer(x, k)), np.cos(np.outer(x, k))
    S2 = -S * k**2
    Kvv = E * sec.Iz * (S2.T * w) @ S2
    Kpp = G * sec.It * ((C * k).T * w) @ (C * k) + E * sec.Iw * (S2.T * w) @ S2
    Cvp = (S2.T * (w * M(x))) @ S
    D = np.zeros((n_terms, n_terms))
    if q is not None:
        D += z_g * (S.T * (w * q(x))) @ S
    for xp, P in points:
        s = np.sin(k * xp)
        D += P * z_g * np.outer(s, s)
    KE = scipy.linalg.block_diag(Kvv, Kpp)
    KG = np.block([[np.zeros((n_terms, n_terms)), Cvp], [Cvp.T, D]])
    d = 1.0 / np.sqrt(np.diag(KE))               # diagonal scaling: same eigenvalues, better conditioning
    mu = scipy.linalg.eigh(KG * np.outer(d, d), KE * np.outer(d, d), eigvals_only=True)[-1]
    return 1.0 / mu


@pytest.fixture(scope="module")
def ukb457():
    return get_section("457x191x67 UKB")


def test_rayleigh_ritz_reference_reproduces_timoshenko_gere(ukb457):
    # the reference itself: uniform moment, closed form of Timoshenko and Gere 6.2 (exact for one sine term)
    L = 5000.0
    tg = pi**2 * E * ukb457.Iz / L**2 * sqrt(ukb457.Iw / ukb457.Iz + L**2 * G * ukb457.It / (pi**2 * E * ukb457.Iz))
    assert rr_alpha_cr(ukb457, L, lambda x: np.ones_like(x)) == pytest.approx(tg, rel=1e-9)


@pytest.mark.parametrize("L", [3000.0, 6000.0, 10000.0])
@pytest.mark.parametrize("z_sign", [0.0, 1.0, -1.0])
def test_udl_with_load_height_matches_rayleigh_ritz(ukb457, L, z_sign):
    # UDL on a fork-supported span, load at the shear centre / top flange / bottom flange
    q, zg = 10.0, z_sign * ukb457.h / 2
    M = lambda x: q * x * (L - x) / 2
    ref = rr_alpha_cr(ukb457, L, M, q=lambda x: np.full_like(x, q), z_g=zg) * q * L**2 / 8
    assert mcr_numerical(ukb457, L, M, q_N_per_mm=q, z_g_mm=zg).M_cr == pytest.approx(ref, rel=1e-3)


@pytest.mark.parametrize("a_over_L", [0.5, 0.3, 0.37])
@pytest.mark.parametrize("z_sign", [0.0, 1.0])
def test_point_load_anywhere_matches_rayleigh_ritz(ukb457, a_over_L, z_sign):
    # A point load between mesh nodes: before the review, M_max was read off a sampling grid
    # that missed the peak, so M_cr = alpha_cr M_max came out ~0.7 % low at a = 0.3 L
    L, P = 6000.0, 100e3
    a, zg = a_over_L * L, z_sign * ukb457.h / 2
    M = lambda x: np.where(x < a, P * (L - a) / L * x, P * a / L * (L - x))
    ref = rr_alpha_cr(ukb457, L, M, points=[(a, P)], z_g=zg) * P * a * (L - a) / L
    res = mcr_numerical(ukb457, L, M, point_loads=[(a, P)], z_g_mm=zg)
    assert res.M_max == pytest.approx(P * a * (L - a) / L, rel=1e-9)     # statics: P a b / L
    assert res.M_cr == pytest.approx(ref, rel=2e-3)


@pytest.mark.parametrize("psi", [-1.0, -0.5, 0.0, 0.5])
def test_linear_moment_including_reverse_curvature_matches_rayleigh_ritz(ukb457, psi):
    # end moments M and psi M (double curvature for psi < 0): the sign of the M v'' phi term must
    # follow the diagram along the member, not its magnitude only
    L, M0 = 5000.0, 300e6
    M = lambda x: M0 * (1.0 - (1.0 - psi) * x / L)
    ref = rr_alpha_cr(ukb457, L, M, n_terms=40) * M0
    assert mcr_numerical(ukb457, L, M).M_cr == pytest.approx(ref, rel=1e-3)


def test_segment_with_end_moments_partial_udl_and_point_load(ukb457):
    # a segment between restraints as design_beam builds it: linear end moments, a partial UDL and a
    # point load, all on the top flange; every load discontinuity inside an element
    L, zg = 3700.0, ukb457.h / 2
    q, xa, xb, P, xp = 25.0, 430.0, 2890.0, 60e3, 1234.0
    M0, M1 = 180e6, 240e6

    def M(x):
        x = np.asarray(x, dtype=float)
        lin = M0 + (M1 - M0) * x / L
        # simply supported segment under the partial UDL and the point load (statics)
        W = q * (xb - xa)
        R = W * (L - (xa + xb) / 2) / L + P * (L - xp) / L
        m = R * x - q * (np.clip(x, xa, xb) - xa) * (x - (np.clip(x, xa, xb) + xa) / 2) - P * np.clip(x - xp, 0, None)
        return lin + m

    qf = lambda x: np.where((x >= xa) & (x <= xb), q, 0.0)
    ref = rr_alpha_cr(ukb457, L, M, q=qf, z_g=zg, points=[(xp, P)], breaks=[xa, xb], n_terms=40)
    res = mcr_numerical(ukb457, L, M, q_N_per_mm=qf, point_loads=[(xp, P)], z_g_mm=zg)
    assert res.alpha_cr == pytest.approx(ref, rel=3e-3)
    # mesh convergence: the default 16 elements within 0.3 % of 128 elements
    fine = mcr_numerical(ukb457, L, M, q_N_per_mm=qf, point_loads=[(xp, P)], z_g_mm=zg, n_elements=128)
    assert res.alpha_cr == pytest.approx(fine.alpha_cr, rel=3e-3)
    assert fine.alpha_cr == pytest.approx(ref, rel=1e-3)


def test_mesh_convergence_from_above_for_udl(ukb457):
    # conforming displacement elements converge from above (Rayleigh quotient); cubic Hermite
    # elements: eigenvalue error ~ h^4 (halving the mesh divides the error by about 16)
    L, q = 6000.0, 10.0
    M = lambda x: q * x * (L - x) / 2
    ref = rr_alpha_cr(ukb457, L, M, n_terms=100)
    a = [mcr_numerical(ukb457, L, M, n_elements=n).alpha_cr for n in (4, 8, 16)]
    assert a[0] > a[1] > a[2] > ref
    assert (a[1] - ref) < (a[0] - ref) / 10 and (a[2] - ref) < (a[1] - ref) / 10
    assert a[2] == pytest.approx(ref, rel=1e-5)    # default mesh (16 elements)


# ================================================================ design_beam: LTB segments
def test_design_ltb_segments_use_the_segment_diagram_and_load_height():
    """6 m span, restraint at 2 m; G 10 kN/m + self-weight, Q 50 kN at 3 m (category B); top flange.

    Eq. 6.10 (one combination): w = 1.35 (10 + m g), P = 1.5 x 50 kN (EN 1990 Table A1.2(B), UK NA).
    Each segment's M_cr is recomputed here by Rayleigh-Ritz from the statics of that combination,
    with the self-weight at the shear centre and the other loads at z_g = h/2.
    """
    sec = get_section("305x165x40 UKB")
    L, xr, a = 6000.0, 2000.0, 3000.0
    job = Job(beam=BeamSpec(span=L, grade="S275", section=sec.designation, restraints=(xr,),
                            load_level="top flange", combination="6.10"),
              loads=(UDL("screed", "permanent", 10.0), PointLoad("tank", "imposed", 50e3, a, category="B")))
    d = design_beam(job)
    g_sw = sec.mass_nominal * g_n / 1000.0              # N/mm
    w, w_dest, P = 1.35 * (10.0 + g_sw), 1.35 * 10.0, 1.5 * 50e3
    R_A = w * L / 2 + P * (L - a) / L                    # statics

    def M_glob(x):
        return R_A * x - w * x**2 / 2 - P * np.clip(x - a, 0.0, None)

    zg = sec.h / 2
    for k, (x0, x1) in enumerate(((0.0, xr), (xr, L)), start=1):
        Ls = x1 - x0
        pts = [(a - x0, P)] if x0 < a < x1 else []
        Mloc = lambda x, x0=x0: M_glob(x0 + x)
        xs = np.linspace(0.0, Ls, 20001)
        M_max = max([float(np.abs(Mloc(xs)).max())] + [abs(float(Mloc(np.array([p[0]]))[0])) for p in pts])
        ref = rr_alpha_cr(sec, Ls, Mloc, q=lambda x: np.full_like(x, w_dest), z_g=zg, points=pts,
                          n_terms=40) * M_max
        rec = d.record(f"ltb_{k}")
        assert rec.values["M_cr"][0] == pytest.approx(ref / 1e6, rel=3e-3)      # kNm
        assert rec.demand == pytest.approx(M_max / 1e6, rel=1e-6)                # segment max |M|


# ================================================================ classification and shear: epsilon of the web
def test_web_classified_with_its_own_yield_strength():
    # S355: t_f = 20 mm -> f_y = 345 MPa, t_w = 8 mm -> f_y = 355 MPa (EN 10025-2 Table 7, from memory).
    # web c/t = 472/8 = 59.0: 72 eps_w = 72 sqrt(235/355) = 58.58 < 59.0 <= 83 eps_w = 67.5 -> Class 2
    # (Table 5.2); with the flange's epsilon (72 sqrt(235/345) = 59.42) it was wrongly Class 1.
    s = measured_section(h=512, b=200, tw=8, tf=20, r=0, designation="measured beam M1")
    assert 472 / 8 > 72 * sqrt(235 / 355) and 472 / 8 <= 72 * sqrt(235 / 345)
    assert section_class(s, "S355") == 2
    rec = classify(s, "S355")
    assert rec.values["Class_web"][0] == 2
    assert rec.values["epsilon_w"][0] == pytest.approx(sqrt(235 / 355))
    # and the shear-buckling limit of 6.2.6(6) uses the web's epsilon: h_w/t_w = 59.0 > 72 eps_w / eta = 58.6,
    # so the web gets the shear-buckling resistance of EN 1993-1-5 section 5
    rec = check_shear(s, "S355", V_Ed=100e3)
    assert rec.clause == "EN 1993-1-5:2006, 5.5, Eq. 5.10" and "chi_w" in rec.values


def test_same_thickness_band_unchanged():
    # 457x191x67 UKB S355: t_f = 12.7, t_w = 8.5, both <= 16 mm: one epsilon (EN 10025-2)
    rec = classify(get_section("457x191x67 UKB"), "S355")
    assert "epsilon_w" not in rec.values
    assert rec.values["epsilon"][0] == pytest.approx(sqrt(235 / 355))


# ================================================================ web bearing: s_s <= h_w
def test_web_bearing_stiff_bearing_limited_to_web_depth():
    # 203x203x46 UKC S355 on a 250 mm long bearing; EN 1993-1-5 6.3(1): s_s not more than h_w.
    s = get_section("203x203x46 UKC")
    h, b, tw, tf = s.h, s.b, s.tw, s.tf
    fy = 355.0                                          # t <= 16 mm (EN 10025-2 Table 7)
    hw = h - 2 * tf
    ss = min(250.0, hw)                                 # 6.3(1)
    kF = min(2 + 6 * ss / hw, 6.0)                      # Figure 6.1 (c), c = 0
    F_cr = 0.9 * kF * E * tw**3 / hw                    # Eq. 6.5
    m1 = fy * b / (fy * tw)                             # Eq. 6.8
    le = min(kF * E * tw**2 / (2 * fy * hw), ss)        # Eq. 6.13: the 3 E tw^2/(fy hw) = 508 mm is capped
    assert le == pytest.approx(hw)
    ly0 = min(le + tf * sqrt(m1 / 2 + (le / tf)**2), le + tf * sqrt(m1))      # Eq. 6.11, 6.12 with m2 = 0
    lam0 = sqrt(ly0 * tw * fy / F_cr)                    # Eq. 6.4
    m2 = 0.02 * (hw / tf)**2 if lam0 > 0.5 else 0.0     # Eq. 6.9 (settled with m2 first, see below)
    ly = min(le + tf * sqrt(m1 / 2 + (le / tf)**2 + m2), le + tf * sqrt(m1 + m2))
    lam = sqrt(ly * tw * fy / F_cr)
    if m2 == 0.0:
        assert lam <= 0.5
    chi = min(0.5 / lam, 1.0)                           # Eq. 6.3
    F_Rd = fy * chi * ly * tw                           # Eq. 6.1, 6.2, gamma_M1 = 1.0
    rec = check_web_bearing(s, "S355", F_Ed=300e3, s_s=250.0, c=0.0)
    assert rec.resistance == pytest.approx(F_Rd / 1e3, rel=1e-6)
    # anything longer than h_w gives the same resistance; the rendered path shows the limit
    assert check_web_bearing(s, "S355", F_Ed=300e3, s_s=400.0).resistance == pytest.approx(rec.resistance)
    shown = check_web_bearing(s, "S355", F_Ed=300e3, s_s=250.0, calc=Calc(render=True))
    assert shown.resistance == pytest.approx(rec.resistance, rel=1e-9)
    assert "s_{s_{eff}}" in shown.latex[0]


# ================================================================ LTB reduction-factor limits
def test_chi_LT_limited_by_one_over_lambda_squared():
    # 6.3.2.3(1) Eq. 6.57 with UK NA beta = 0.75: for large slenderness chi_LT from the curve exceeds
    # 1/lambda^2 (chi ~ 1/(0.75 lambda^2)), so the 1/lambda^2 limit governs. Hand: lambda = 3, curve b
    # (IPE 300, h/b = 2): Phi = 0.5 (1 + 0.34 x 2.6 + 0.75 x 9) = 4.317, chi = 0.1288 > 1/9 = 0.1111.
    s = get_section("IPE 300")
    W_fy = s.Wpl_y * 275.0
    M_cr = W_fy / 9.0
    rec = check_ltb(s, "S275", M_Ed=10e6, M_cr=M_cr)       # M_Ed/M_cr = 0.52 > 0.16; k_c = 1: f = 1
    assert rec.values["lambda_LT"][0] == pytest.approx(3.0)
    assert rec.resistance == pytest.approx(W_fy / 9.0 / 1e6, rel=1e-9)


def test_chi_LT_mod_not_more_than_one():
    # 6.3.2.3(2): chi_LT,mod = chi_LT / f <= 1. lambda = 0.45, curve c (457 UKB, h/b = 2.39):
    # Phi = 0.5 (1 + 0.49 x 0.05 + 0.75 x 0.2025) = 0.5882, chi = 0.972; k_c = 1/sqrt(1.7778) = 0.75:
    # f = 1 - 0.5 x 0.25 x (1 - 2 x 0.35^2) = 0.906, chi/f = 1.07 -> 1.0 (hand calculation)
    s = get_section("457x191x67 UKB")
    W_fy = s.Wpl_y * 355.0
    rec = check_ltb(s, "S355", M_Ed=0.9 * W_fy, M_cr=W_fy / 0.45**2, C_1=1 / 0.75**2)
    assert rec.values["chi_LT_mod"][0] == pytest.approx(1.0)
    assert rec.resistance == pytest.approx(W_fy / 1e6, rel=1e-9)


# ================================================================ job: reserved self-weight name
def test_job_refuses_a_load_named_like_the_self_weight():
    # the design excludes the load named "beam self-weight" from the load-height term of M_cr
    # (self-weight acts at the centroid = shear centre); a user load of that name would be taken
    # at the shear centre too, unconservative for a top-flange load
    with pytest.raises(InputError) as err:
        Job(beam=BeamSpec(span=6000.0), loads=(UDL("beam self-weight", "permanent", 2.0),))
    assert err.value.field == "load[1].name"


# ================================================================ design_beam: bending with shear at a point load
def test_design_bending_shear_governs_at_a_point_load_not_at_max_moment():
    """3 m span, 305x165x40 UKB S275, two permanent 150 kN point loads at 0.5 m and 2.5 m, Eq. 6.10.

    Between the loads the shear is almost nil; at a load the moment is nearly the maximum while
    the shear exceeds 0.5 V_pl,Rd, so 6.2.8 governs there (hand calculation below, EN 1993-1-1
    6.2.6(3)(a), Eq. 6.18, 6.29, 6.30; gamma_G = 1.35, EN 1990 Table A1.2(B)).
    """
    sec = get_section("305x165x40 UKB")
    L, a, Pk = 3000.0, 500.0, 150e3
    job = Job(beam=BeamSpec(span=L, grade="S275", section=sec.designation, load_level="shear centre",
                            combination="6.10"),
              loads=(PointLoad("column A", "permanent", Pk, a), PointLoad("column B", "permanent", Pk, L - a)))
    d = design_beam(job)
    w = 1.35 * sec.mass_nominal * g_n / 1000.0          # N/mm, factored self-weight
    P = 1.35 * Pk
    R_A = w * L / 2 + P                                  # statics (symmetric)
    V_a = R_A - w * a                                    # just left of the load
    M_a = R_A * a - w * a**2 / 2
    M_mid = R_A * L / 2 - w * (L / 2)**2 / 2 - P * (L / 2 - a)
    fy = 275.0                                           # t_f = 10.2 mm <= 16 (EN 10025-2 Table 7)
    hw = sec.h - 2 * sec.tf
    A_v = max(sec.A - 2 * sec.b * sec.tf + (sec.tw + 2 * sec.r) * sec.tf, hw * sec.tw)   # 6.2.6(3)(a), eta = 1
    V_pl = A_v * fy / sqrt(3)                            # Eq. 6.18
    assert V_a > 0.5 * V_pl
    rho = (2 * V_a / V_pl - 1) ** 2                      # Eq. 6.29
    M_V = (sec.Wpl_y - rho * (hw * sec.tw) ** 2 / (4 * sec.tw)) * fy   # Eq. 6.30
    assert M_a / M_V > M_mid / (sec.Wpl_y * fy)           # the point-load section governs
    rec = d.record("bending_shear")
    assert rec.location_mm in (pytest.approx(a), pytest.approx(L - a))
    assert rec.demand == pytest.approx(M_a / 1e6, rel=1e-9)
    assert rec.resistance == pytest.approx(M_V / 1e6, rel=1e-9)


def test_deflection_diagram_shows_the_governing_variable_combination():
    # imposed B 2 kN/m and snow 6 kN/m: characteristic variable part (EN 1990 Eq. 6.14b without G),
    # leading B: 2 + 0.5 x 6 = 5 kN/m; leading snow: 0.7 x 2 + 6 = 7.4 kN/m -> snow leads (psi_0, UK NA
    # Table NA.A1.1, from memory). The diagram must be the combination the deflection check uses.
    job = Job(beam=BeamSpec(span=5000.0, grade="S275", section="254x146x31 UKB", load_level="shear centre"),
              loads=(UDL("roof", "imposed", 2.0, category="B"), UDL("snow", "snow", 6.0)))
    d = design_beam(job)
    assert d.governing["deflection"] == "SLS variable characteristic, leading: snow"
    fig = d.analysis.deflection_diagrams()
    assert "leading: snow" in fig._suptitle.get_text()


# ================================================================ robustness found by the property tests
def test_rho_for_a_shear_far_beyond_v_pl_is_one_without_overflow(ukb457):
    # 6.2.8(3) Eq. 6.29 capped at 1 (V_Ed > V_pl,Rd fails the shear check itself); the square of
    # 2 V_Ed/V_pl,Rd - 1 used to overflow for an absurd V_Ed instead of returning a record
    from splicecalc.members import check_bending_shear
    rec = check_bending_shear(ukb457, "S355", M_Ed=0.0, V_Ed=4.36e159)
    assert rec.values["rho"][0] == 1.0


def test_negligible_M_cr_is_refused_not_overflowed(ukb457):
    # lambda_LT = sqrt(W f_y / M_cr) > 1e6 has no meaning (Eq. 6.57 overflowed near 1e77): InputError
    W_fy = ukb457.Wpl_y * 355.0
    with pytest.raises(InputError) as err:
        check_ltb(ukb457, "S355", M_Ed=1.0, M_cr=W_fy * 1e-160)
    assert err.value.field == "M_cr"
    # an upward point load below the shear centre with a vanishing moment diagram (property-test case)
    with pytest.raises(InputError):
        check_ltb(ukb457, "S355", M_Ed=1e-160, L_mm=19219.0, M=lambda x: 1e-172 * x * (19219.0 - x) / 2,
                  q_N_per_mm=1e-172, point_loads=[(9609.5, -1558.0)], z_g_mm=-398.0)
