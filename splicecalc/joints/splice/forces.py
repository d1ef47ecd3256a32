"""Design forces in a bolted cover-plate beam splice (internal units N, mm, N*mm).

Method (stated in every calc sheet):

* Web share of the moment by stiffness, EN 1993-1-8:2005, 2.5(1) (a realistic
  distribution of internal forces): ``M_w = M I_web / I_y`` with
  ``I_web = t_w h_w^3 / 12`` and ``h_w = h - 2 t_f`` (the clear web between the
  flanges; root fillets are counted with the flanges); the flanges take the rest.
* Axial force shared by area: each flange ``N_f = N b t_f / A``, the web (with
  the fillets) ``N_w = N - 2 N_f``.
* Flange force ``F_f = (M - M_w) / z + |N_f|`` with the lever arm
  ``z = h - t_f`` between the flange centroids, for outer and outer+inner
  plates alike. This is the conservative choice: the force line of an outer
  plate lies at ``h + t_p`` and would give a smaller plate force, but the beam
  flange itself must carry the force at ``h - t_f``. Equilibrium holds exactly:
  ``F_f,M z + M_w = M``.
* Each bolt group's forces are taken at its outermost bolt row (column), not at
  the joint line: the moment there is ``M_a = |M| + |V| a`` with ``a`` the distance
  from the joint line (centre of the gap) to that row, on the side where the moment
  grows (conservative: either side may be that side). The flange force uses
  ``a_f = g_a/2 + e_1 + (rows - 1) p_1``, the web share ``a_w = g_a/2 + e_1 +
  (columns - 1) p_2``; the beam's net tension flange is checked for the same F_f.
* Web bolt group on one side of the joint: shear ``V``, axial ``N_w`` and the
  moment ``M_w + V e`` with ``e`` from the joint line (centre of the gap) to
  the centroid of the bolt group. Elastic polar method, EN 1993-1-8:2005,
  3.12(3): a rigid plate rotating about the group centroid on equally stiff
  bolts; per bolt ``F_x = N_w/n + M_g z_i / I_p``, ``F_z = V/n - M_g x_i / I_p``,
  resultant = vector sum. ``x_i`` is measured away from the joint, so the
  shear acts at ``x = -e`` and the moment ``M_g`` turns in the sense of
  ``V e``: the column nearest the joint (the beam-end column of the beam web)
  takes the largest vertical force (on the side where ``M_w`` and ``V e`` add,
  the governing side).
* Optional minimum design moment ``M = max(|M_Ed|, k_min M_c,Rd)`` (user-set
  fraction; no codified minimum is known for a simply supported beam splice,
  default 0).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ...core.clause import clause
from ...core.record import Calc
from ..bolts import F_r_Ed, I_p

CIT_DIST = "EN 1993-1-8:2005, 2.5(1)"
CIT_POLAR = "EN 1993-1-8:2005, 3.12(3)"


@clause(CIT_DIST, units={"t_w": "mm", "h": "mm", "t_f": "mm"}, returns="mm4",
        example=dict(t_w=10.2, h=533.1, t_f=15.6))
def I_web(t_w: float, h: float, t_f: float) -> float:
    """Second moment of area of the clear web, h_w = h - 2 t_f (mm4)."""
    h_w = h - 2 * t_f
    I_web = t_w * h_w ** 3 / 12
    return I_web


@clause(CIT_DIST, units={"M_Ed": "Nmm", "M_c_Rd": "Nmm"}, returns="Nmm",
        example=dict(M_Ed=150e6, k_min=0.25, M_c_Rd=800e6))
def M_j_Ed(M_Ed: float, k_min: float, M_c_Rd: float) -> float:
    """Splice design moment with a user-set minimum fraction k_min of M_c,Rd (N*mm)."""
    M_j_Ed = max(abs(M_Ed), k_min * M_c_Rd)
    return M_j_Ed


@clause(CIT_DIST, units={"M_j_Ed": "Nmm", "V_Ed": "N", "a_f": "mm"}, returns="Nmm",
        example=dict(M_j_Ed=300e6, V_Ed=200e3, a_f=140.0))
def M_f_Ed(M_j_Ed: float, V_Ed: float, a_f: float) -> float:
    """Moment at the outermost flange bolt row, a_f from the joint line, on the side where it grows (N*mm)."""
    M_f_Ed = abs(M_j_Ed) + abs(V_Ed) * a_f
    return M_f_Ed


@clause(CIT_DIST, units={"M_j_Ed": "Nmm", "V_Ed": "N", "a_w": "mm", "I_web": "mm4", "I_y": "mm4"}, returns="Nmm",
        example=dict(M_j_Ed=300e6, V_Ed=200e3, a_w=110.0, I_web=1.14e8, I_y=5.52e8))
def M_w_Ed(M_j_Ed: float, V_Ed: float, a_w: float, I_web: float, I_y: float) -> float:
    """Web share by stiffness of the moment at the outermost web bolt column, a_w from the joint line (N*mm)."""
    M_w_Ed = (abs(M_j_Ed) + abs(V_Ed) * a_w) * I_web / I_y
    return M_w_Ed


@clause(CIT_DIST, units={"N_Ed": "N", "b": "mm", "t_f": "mm", "A": "mm2"}, returns="N",
        example=dict(N_Ed=100e3, b=209.3, t_f=15.6, A=11700.0))
def N_f_Ed(N_Ed: float, b: float, t_f: float, A: float) -> float:
    """Axial force in one flange, shared by area (N, tension positive)."""
    N_f_Ed = N_Ed * b * t_f / A
    return N_f_Ed


@clause(CIT_DIST, units={"N_Ed": "N", "N_f_Ed": "N"}, returns="N",
        example=dict(N_Ed=100e3, N_f_Ed=27.9e3))
def N_w_Ed(N_Ed: float, N_f_Ed: float) -> float:
    """Axial force in the web (with fillets), the rest after two flanges (N)."""
    N_w_Ed = N_Ed - 2 * N_f_Ed
    return N_w_Ed


@clause(CIT_DIST, units={"h": "mm", "t_f": "mm"}, returns="mm", example=dict(h=533.1, t_f=15.6))
def z_f(h: float, t_f: float) -> float:
    """Lever arm between the flange centroids, z = h - t_f (mm)."""
    z_f = h - t_f
    return z_f


@clause(CIT_DIST, units={"M_f_Ed": "Nmm", "I_web": "mm4", "I_y": "mm4", "z_f": "mm", "N_f_Ed": "N"}, returns="N",
        example=dict(M_f_Ed=328e6, I_web=1.14e8, I_y=5.52e8, z_f=517.5, N_f_Ed=0.0))
def F_f_Ed(M_f_Ed: float, I_web: float, I_y: float, z_f: float, N_f_Ed: float) -> float:
    """Flange force at the outermost flange row: the flanges' share (1 - I_web/I_y) of M_f,Ed over the lever
    arm, plus the axial share (N)."""
    F_f_Ed = M_f_Ed * (1 - I_web / I_y) / z_f + abs(N_f_Ed)
    return F_f_Ed


@clause(CIT_POLAR, units={"g_a": "mm", "e_1": "mm", "p_2": "mm"}, returns="mm",
        example=dict(g_a=10.0, e_1=40.0, n_c=2, p_2=60.0))
def e_w(g_a: float, e_1: float, n_c: int, p_2: float) -> float:
    """Eccentricity from the joint line to the web bolt-group centroid on one side (mm):
    half the gap g_a, the end distance e_1 to the first column, half the columns' spread."""
    e_w = g_a / 2 + e_1 + (n_c - 1) * p_2 / 2
    return e_w


@clause(CIT_POLAR, units={"M_w_Ed": "Nmm", "V_Ed": "N", "e_w": "mm"}, returns="Nmm",
        example=dict(M_w_Ed=62e6, V_Ed=300e3, e_w=70.0))
def M_g_Ed(M_w_Ed: float, V_Ed: float, e_w: float) -> float:
    """Moment on the web bolt group about its centroid: the web share plus the shear times the distance
    e_w from the joint line to the centroid, on the side where they add (N*mm)."""
    M_g_Ed = M_w_Ed + abs(V_Ed) * e_w
    return M_g_Ed


@clause(CIT_POLAR, units={"N_w_Ed": "N", "M_g_Ed": "Nmm", "z_i": "mm", "I_p": "mm2"}, returns="N",
        example=dict(N_w_Ed=0.0, n=10, M_g_Ed=80e6, z_i=140.0, I_p=108500.0))
def F_x_Ed(N_w_Ed: float, n: int, M_g_Ed: float, z_i: float, I_p: float) -> float:
    """Horizontal force on a web bolt at height z_i above the group centroid (N); M_g turns in the
    sense of the shear acting at the joint line (x = -e)."""
    F_x_Ed = N_w_Ed / n + M_g_Ed * z_i / I_p
    return F_x_Ed


@clause(CIT_POLAR, units={"V_Ed": "N", "M_g_Ed": "Nmm", "x_i": "mm", "I_p": "mm2"}, returns="N",
        example=dict(V_Ed=300e3, n=10, M_g_Ed=80e6, x_i=30.0, I_p=108500.0))
def F_z_Ed(V_Ed: float, n: int, M_g_Ed: float, x_i: float, I_p: float) -> float:
    """Vertical force on a web bolt at distance x_i (away from the joint) from the group centroid (N):
    the column nearest the joint (x_i < 0) takes V/n plus the moment share."""
    F_z_Ed = V_Ed / n - M_g_Ed * x_i / I_p
    return F_z_Ed


@dataclass(frozen=True)
class SpliceForces:
    """Design forces at one splice (N, N*mm, mm)."""

    M_Ed: float            # moment from the analysis (at the joint line)
    V_Ed: float
    N_Ed: float
    M_j_Ed: float          # design moment incl. the minimum
    I_web: float
    M_w_Ed: float
    z: float
    F_f_M: float           # flange force from moment only
    N_f_Ed: float
    N_w_Ed: float
    F_f_Ed: float          # design flange force (moment + |axial share|)
    e_w: float
    M_g_Ed: float
    bolt_forces: tuple[tuple[float, float, float, float, float], ...]  # (x_i, z_i, F_x, F_z, F_r)
    I_p: float
    a_f: float = 0.0       # joint line -> outermost flange bolt row (mm)
    a_w: float = 0.0       # joint line -> outermost web bolt column (mm)
    M_f_Ed: float = 0.0    # moment at the outermost flange row: the flange force is taken there
    M_w_a_Ed: float = 0.0  # moment at the outermost web column: the web share M_w_Ed is taken there

    @property
    def F_web_max(self) -> float:
        return max(b[4] for b in self.bolt_forces)


def web_bolt_coordinates(n_r: int, n_c: int, p_1: float, p_2: float) -> list[tuple[float, float]]:
    """(x_i, z_i) of each bolt of one side's web group about its centroid (mm); x away
    from the joint, z upward."""
    return [((j - (n_c - 1) / 2) * p_2, ((n_r - 1) / 2 - i) * p_1) for i in range(n_r) for j in range(n_c)]


def flange_reach(gap: float, e_1: float, rows: int, p_1: float) -> float:
    """Distance from the joint line to the outermost flange bolt row (mm)."""
    return gap / 2 + e_1 + (rows - 1) * p_1


def web_reach(gap: float, e_1: float, columns: int, gauge: float) -> float:
    """Distance from the joint line to the outermost web bolt column (mm)."""
    return gap / 2 + e_1 + (columns - 1) * gauge


def flange_force(section, M_j: float, V_Ed: float, N_Ed: float, a_f: float, calc: Calc | None = None
                 ) -> tuple[float, float, float, float]:
    """Flange force at the outermost flange bolt row: (F_f,Ed, M_f,Ed, F_f from moment, N_f) in N, N*mm.

    The moment there (``|M_j| + |V| a_f``) is split by stiffness as at the joint line."""
    c = calc or Calc()
    Mf = c(M_f_Ed, M_j_Ed=M_j, V_Ed=V_Ed, a_f=a_f)
    Iw = I_web(t_w=section.tw, h=section.h, t_f=section.tf)
    Nf = c(N_f_Ed, N_Ed=N_Ed, b=section.b, t_f=section.tf, A=section.A) if N_Ed else 0.0
    z = z_f(h=section.h, t_f=section.tf)
    Ff = c(F_f_Ed, M_f_Ed=Mf, I_web=Iw, I_y=section.Iy, z_f=z, N_f_Ed=Nf)
    return Ff, Mf, Ff - abs(Nf), Nf


def splice_forces(section, M_Ed: float, V_Ed: float, N_Ed: float, *, gap: float, web_rows: int,
                  web_columns: int, web_pitch: float, web_gauge: float, web_e1: float,
                  k_min: float = 0.0, M_c_Rd: float = 0.0, calc: Calc | None = None,
                  flange_a: float = 0.0) -> SpliceForces:
    """All splice design forces (floats in N, mm, N*mm). ``calc`` renders each step.

    ``flange_a``: distance from the joint line to the outermost flange bolt row (mm,
    :func:`flange_reach`); the flange force is taken there and the web group's moment
    share at its own outermost column (``M + V a``), not at the joint line."""
    c = calc or Calc()
    Mj = c(M_j_Ed, M_Ed=M_Ed, k_min=k_min, M_c_Rd=M_c_Rd) if k_min > 0 else abs(M_Ed)
    Iw = c(I_web, t_w=section.tw, h=section.h, t_f=section.tf)
    z = c(z_f, h=section.h, t_f=section.tf)
    if c.render:
        c.note("Flange group: forces at its outermost bolt row, a_f from the joint line")
    Ff, Mf, FfM, Nf = flange_force(section, Mj, V_Ed, N_Ed, flange_a, calc=c)
    Nw = c(N_w_Ed, N_Ed=N_Ed, N_f_Ed=Nf) if N_Ed else 0.0
    aw = web_reach(gap, web_e1, web_columns, web_gauge)
    if c.render:
        c.note("Web group: moment share at its outermost bolt column, a_w from the joint line")
    Mw = c(M_w_Ed, M_j_Ed=Mj, V_Ed=V_Ed, a_w=aw, I_web=Iw, I_y=section.Iy)
    Mwa = M_f_Ed(M_j_Ed=Mj, V_Ed=V_Ed, a_f=aw)        # the moment at that column (not printed: M_w,Ed shows it)
    e = c(e_w, g_a=gap, e_1=web_e1, n_c=web_columns, p_2=web_gauge)
    Mg = c(M_g_Ed, M_w_Ed=Mw, V_Ed=V_Ed, e_w=e)
    n = web_rows * web_columns
    Ip = I_p(n_r=web_rows, n_c=web_columns, p_1=web_pitch, p_2=web_gauge)
    V = abs(V_Ed)
    forces = []
    for (x, zz) in web_bolt_coordinates(web_rows, web_columns, web_pitch, web_gauge):
        if Ip > 0.0:
            fx = F_x_Ed(N_w_Ed=Nw, n=n, M_g_Ed=Mg, z_i=zz, I_p=Ip)
            fz = F_z_Ed(V_Ed=V, n=n, M_g_Ed=Mg, x_i=x, I_p=Ip)
        else:  # a single bolt cannot carry a moment
            fx, fz = Nw / n, V / n
            if Mg > 0.0:
                fx = math.inf
        forces.append((x, zz, fx, fz, math.hypot(fx, fz)))
    if c.render and Ip > 0.0:
        # render the governing bolt with the same formulas
        xg, zg, *_ = max(forces, key=lambda f: f[4])
        c(I_p, n_r=web_rows, n_c=web_columns, p_1=web_pitch, p_2=web_gauge)
        if Nw == 0.0:
            c.note("$N_{w,Ed}$ = 0: the term $N_{w,Ed}/n$ of $F_{x,Ed}$ is zero and is not printed in the numbers.")
        fx = c(F_x_Ed, N_w_Ed=Nw, n=n, M_g_Ed=Mg, z_i=zg, I_p=Ip)
        fz = c(F_z_Ed, V_Ed=V, n=n, M_g_Ed=Mg, x_i=xg, I_p=Ip)
        c(F_r_Ed, F_x_Ed=fx, F_z_Ed=fz)
    return SpliceForces(M_Ed=M_Ed, V_Ed=V_Ed, N_Ed=N_Ed, M_j_Ed=Mj, I_web=Iw, M_w_Ed=Mw, z=z, F_f_M=FfM,
                        N_f_Ed=Nf, N_w_Ed=Nw, F_f_Ed=Ff, e_w=e, M_g_Ed=Mg, bolt_forces=tuple(forces), I_p=Ip,
                        a_f=flange_a, a_w=aw, M_f_Ed=Mf, M_w_a_Ed=Mwa)


__all__ = ["I_web", "M_f_Ed", "M_g_Ed", "flange_force", "flange_reach", "web_reach", "M_j_Ed", "M_w_Ed", "N_f_Ed", "N_w_Ed", "z_f", "F_f_Ed", "e_w",
           "F_x_Ed", "F_z_Ed", "SpliceForces", "splice_forces", "web_bolt_coordinates"]
