"""Splice design forces: equilibrium, web share, and the elastic polar bolt-group method.

Outside references: the elastic bolt-group result is compared with an
independent direct-stiffness solution in numpy (rigid plate on equal springy
bolts: K u = F, then bolt forces k (u_rigid at each bolt)); hand calculations
from the stated method (EN 1993-1-8:2005, 2.5(1) and 3.12(3)).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from splicecalc.core.record import Calc
from splicecalc.joints.splice.forces import I_p, splice_forces, web_bolt_coordinates
from splicecalc.sections import measured_section


SEC = measured_section(h=453.4, b=189.9, tw=8.5, tf=12.7, r=10.2, designation="test 457x191x67")


def direct_stiffness(coords, V, N, M):
    """Independent solution: rigid plate (u, w, theta) on bolts of unit stiffness in x and z.

    Displacement of bolt (x, z): (u - theta z, w + theta x). Forces = k * displacement.
    Equilibrium matrix assembled and solved with numpy.linalg.solve."""
    K = np.zeros((3, 3))
    for x, z in coords:
        Bm = np.array([[1.0, 0.0, -z], [0.0, 1.0, x]])
        K += Bm.T @ Bm
    F = np.array([N, V, M])
    u = np.linalg.solve(K, F)
    out = []
    for x, z in coords:
        Bm = np.array([[1.0, 0.0, -z], [0.0, 1.0, x]])
        fx, fz = Bm @ u
        out.append((fx, fz, math.hypot(fx, fz)))
    return out


@pytest.mark.parametrize("rows,cols,p,g", [(4, 1, 70.0, 0.0), (5, 2, 70.0, 60.0), (3, 3, 100.0, 80.0), (2, 2, 60.0, 90.0)])
def test_polar_method_matches_direct_stiffness(rows, cols, p, g):
    f = splice_forces(SEC, M_Ed=250e6, V_Ed=180e3, N_Ed=60e3, gap=10.0, web_rows=rows, web_columns=cols,
                      web_pitch=p, web_gauge=g, web_e1=40.0)
    coords = web_bolt_coordinates(rows, cols, p, g)
    # x is measured away from the joint: V acts at the joint line x = -e, so the group moment is -M_g
    # (V e and the web moment turn the same way on the governing side)
    ref = direct_stiffness(coords, V=180e3, N=f.N_w_Ed, M=-f.M_g_Ed)
    for (x, z, fx, fz, fr), (rx, rz, rr) in zip(f.bolt_forces, ref):
        assert fx == pytest.approx(rx, rel=1e-9, abs=1e-6)
        assert fz == pytest.approx(rz, rel=1e-9, abs=1e-6)
        assert fr == pytest.approx(rr, rel=1e-9)


def test_polar_sum_closed_form_against_loop():
    # hand calculation: sum of x^2 + z^2 over the grid
    for rows, cols, p, g in [(5, 2, 70.0, 60.0), (4, 3, 75.0, 65.0), (1, 2, 70.0, 80.0)]:
        coords = web_bolt_coordinates(rows, cols, p, g)
        assert I_p(n_r=rows, n_c=cols, p_1=p, p_2=g) == pytest.approx(sum(x * x + z * z for x, z in coords))


@settings(max_examples=40, deadline=None)
@given(M=st.floats(-800e6, 800e6), V=st.floats(0, 900e3), N=st.floats(-500e3, 500e3))
def test_equilibrium_exact(M, V, N):
    f = splice_forces(SEC, M_Ed=M, V_Ed=V, N_Ed=N, gap=10.0, web_rows=4, web_columns=2, web_pitch=70.0,
                      web_gauge=60.0, web_e1=40.0)
    # flange force x lever arm + web moment = M (moment part), EN 1993-1-8 2.5(1) equilibrium, at each
    # group's outermost row: flange at a_f (0 here: the joint line), web at a_w (M + V a_w)
    assert f.M_f_Ed == pytest.approx(abs(M) + abs(V) * f.a_f, rel=1e-12, abs=1e-3)
    assert f.F_f_M * f.z + f.M_f_Ed * f.I_web / SEC.Iy == pytest.approx(f.M_f_Ed, rel=1e-12, abs=1e-3)
    assert f.a_w == pytest.approx(10.0 / 2 + 40.0 + 60.0)                   # g/2 + e1 + (columns - 1) p2
    assert f.M_w_Ed == pytest.approx((abs(M) + abs(V) * f.a_w) * f.I_web / SEC.Iy, rel=1e-12, abs=1e-3)
    # axial: two flanges + web = N
    assert 2 * f.N_f_Ed + f.N_w_Ed == pytest.approx(N, rel=1e-12, abs=1e-6)
    # bolt group equilibrium on one side: sum F_z = V, sum F_x = N_w, sum moments = -(M_w + V e)
    # (x away from the joint, V acting at x = -e)
    assert sum(b[3] for b in f.bolt_forces) == pytest.approx(abs(V), rel=1e-9, abs=1e-6)
    assert sum(b[2] for b in f.bolt_forces) == pytest.approx(f.N_w_Ed, rel=1e-9, abs=1e-6)
    mom = sum(b[0] * b[3] - b[1] * b[2] for b in f.bolt_forces)
    assert mom == pytest.approx(-(abs(f.M_w_Ed) + abs(V) * f.e_w), rel=1e-9, abs=1e-3)


def test_web_share_and_lever_arm_hand_calculation():
    f = splice_forces(SEC, M_Ed=300e6, V_Ed=0.0, N_Ed=0.0, gap=10.0, web_rows=4, web_columns=1, web_pitch=70.0,
                      web_gauge=0.0, web_e1=40.0)
    h_w = 453.4 - 2 * 12.7                    # hand calculation, stated method
    I_w = 8.5 * h_w ** 3 / 12
    assert f.I_web == pytest.approx(I_w)
    assert f.M_w_Ed == pytest.approx(300e6 * I_w / SEC.Iy)
    assert f.z == pytest.approx(453.4 - 12.7)
    assert f.F_f_Ed == pytest.approx((300e6 - 300e6 * I_w / SEC.Iy) / (453.4 - 12.7))
    assert f.e_w == pytest.approx(10.0 / 2 + 40.0)


def test_minimum_design_moment():
    f = splice_forces(SEC, M_Ed=10e6, V_Ed=0.0, N_Ed=0.0, gap=10.0, web_rows=4, web_columns=1, web_pitch=70.0,
                      web_gauge=0.0, web_e1=40.0, k_min=0.25, M_c_Rd=500e6)
    assert f.M_j_Ed == pytest.approx(0.25 * 500e6)


def test_forces_render_same_numbers():
    c = Calc(render=True)
    f1 = splice_forces(SEC, M_Ed=250e6, V_Ed=180e3, N_Ed=50e3, gap=10.0, web_rows=5, web_columns=2, web_pitch=70.0,
                       web_gauge=60.0, web_e1=40.0, k_min=0.1, M_c_Rd=600e6, calc=c)
    f2 = splice_forces(SEC, M_Ed=250e6, V_Ed=180e3, N_Ed=50e3, gap=10.0, web_rows=5, web_columns=2, web_pitch=70.0,
                       web_gauge=60.0, web_e1=40.0, k_min=0.1, M_c_Rd=600e6)
    assert len(c.latex) >= 10
    assert f1.F_f_Ed == pytest.approx(f2.F_f_Ed, rel=1e-6)
    assert f1.M_g_Ed == pytest.approx(f2.M_g_Ed, rel=1e-6)
