"""Connection plates: tension, block tearing, shear, bending, compression between fasteners.

EN 1993-1-1:2005, 6.2 / 6.3.1 and EN 1993-1-8:2005, 3.5 and 3.10.2. Units: N, mm, MPa, N*mm.

Partial factors (all from the :class:`~splicecalc.materials.NationalAnnex` passed in):
gamma_M0 for yield, gamma_M1 for buckling, and ``na.gamma_M2_member`` (UK NA to
BS EN 1993-1-1: 1.10) for fracture of net sections in tension and shear and for
block tearing, since EN 1993-1-8 Table 2.1 refers the resistance of members and
cross-sections to EN 1993-1-1. Every check accepts ``gamma_M2=`` to override
(e.g. 1.25, the EN 1993-1-8 bolt/weld/bearing value, for a more cautious result).
Checker's note: the UK NA to BS EN 1993-1-8 sets 1.25 for bolts, welds, pins and
plates *in bearing*; net-section and block-tearing fracture of plates is a
cross-section resistance, for which published UK joint guidance uses 1.10 (from
memory). Accepted; ``EN_RECOMMENDED`` (1.25 throughout) gives the cautious value.

Clause formulas (``@clause``)
    :func:`A_net_plate`, :func:`A_net_stagger`, :func:`N_pl_Rd`, :func:`N_u_Rd`, :func:`N_net_Rd`,
    :func:`V_eff_1_Rd`, :func:`V_eff_2_Rd`, :func:`V_Rd_g`, :func:`V_Rd_n`, :func:`W_el_plate`,
    :func:`W_pl_plate`, :func:`M_V_Rd_el` (M_c_Rd is the member formula,
    :func:`splicecalc.members.en1993_1_1.M_c_Rd`), :func:`p_1_t_lim`, :func:`lambda_bar_plate`, :func:`chi`,
    :func:`N_b_Rd`
Checks (return :class:`~splicecalc.core.record.CheckRecord`)
    :func:`check_plate_tension`, :func:`check_block_tearing`, :func:`check_plate_shear`,
    :func:`check_plate_bending`, :func:`check_plate_compression`
Helpers
    :func:`block_tearing_areas` -> :class:`BlockAreas` (A_nt, A_nv for the usual bolt-group patterns),
    ``ALPHA_IMP`` (imperfection factors, EN 1993-1-1 Table 6.1)
"""

from __future__ import annotations

from dataclasses import dataclass
from math import pi, sqrt

from ..core.clause import clause
from ..members.en1993_1_1 import M_c_Rd, N_net_Rd, N_pl_Rd, N_u_Rd  # one formula, one home: EN 1993-1-1 6.2
from ..core.errors import InputError, require_choice, require_in_range, require_non_negative, require_positive
from ..core.record import Calc, CheckRecord
from ..materials.partial_factors import UK_NA, NationalAnnex
from ..materials.steel import E_MPa, steel
from ..core.errors import require_count
from ..materials.partial_factors import require_national_annex

# shared validators (one definition each)
_count = require_count
_na = require_national_annex


#: imperfection factor alpha by buckling curve, EN 1993-1-1:2005, 6.3.1.2, Table 6.1
ALPHA_IMP: dict[str, float] = {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}


# ------------------------------------------------------------------ clause formulas
@clause("EN 1993-1-1:2005, 6.2.2.2(3)", units={"b": "mm", "t": "mm", "d_0": "mm"}, returns="mm2",
        example=dict(b=200.0, t=12.0, n=2, d_0=22.0))
def A_net_plate(b: float, t: float, n: float, d_0: float) -> float:
    """Net area of a plate b x t with n holes d_0 across the critical section (mm2)."""
    A_net = t * (b - n * d_0)
    return A_net


@clause("EN 1993-1-1:2005, 6.2.2.2(4), Eq. 6.3", units={"b": "mm", "t": "mm", "d_0": "mm", "s": "mm", "p": "mm"},
        returns="mm2", example=dict(b=200.0, t=12.0, n=3, d_0=22.0, n_s=2, s=40.0, p=60.0))
def A_net_stagger(b: float, t: float, n: float, d_0: float, n_s: float, s: float, p: float) -> float:
    """Net area along a zig-zag line through n holes with n_s staggered gaps of pitch s and gauge p (mm2)."""
    A_net = t * (b - n * d_0 + n_s * s ** 2 / (4 * p))
    return A_net


@clause("EN 1993-1-8:2005, 3.10.2(2), Eq. 3.9", units={"f_u": "MPa", "A_nt": "mm2", "f_y": "MPa", "A_nv": "mm2"},
        returns="N", example=dict(f_u=410.0, A_nt=1000.0, gamma_M2=1.1, f_y=275.0, A_nv=2000.0, gamma_M0=1.0))
def V_eff_1_Rd(f_u: float, A_nt: float, gamma_M2: float, f_y: float, A_nv: float, gamma_M0: float) -> float:
    """Block tearing, symmetric bolt group under concentric load, Eq. 3.9 (N)."""
    V_eff_1_Rd = f_u * A_nt / gamma_M2 + f_y * A_nv / (sqrt(3) * gamma_M0)
    return V_eff_1_Rd


@clause("EN 1993-1-8:2005, 3.10.2(3), Eq. 3.10", units={"f_u": "MPa", "A_nt": "mm2", "f_y": "MPa", "A_nv": "mm2"},
        returns="N", example=dict(f_u=410.0, A_nt=1000.0, gamma_M2=1.1, f_y=275.0, A_nv=2000.0, gamma_M0=1.0))
def V_eff_2_Rd(f_u: float, A_nt: float, gamma_M2: float, f_y: float, A_nv: float, gamma_M0: float) -> float:
    """Block tearing, bolt group under eccentric load (e.g. a web in shear), Eq. 3.10 (N)."""
    V_eff_2_Rd = 0.5 * f_u * A_nt / gamma_M2 + f_y * A_nv / (sqrt(3) * gamma_M0)
    return V_eff_2_Rd


@clause("EN 1993-1-1:2005, 6.2.6(2), Eq. 6.18", units={"A_v": "mm2", "f_y": "MPa"}, returns="N",
        example=dict(A_v=2400.0, f_y=275.0, gamma_M0=1.0, k_v=1.27))
def V_Rd_g(A_v: float, f_y: float, gamma_M0: float, k_v: float = 1.0) -> float:
    """Gross-section plastic shear resistance of a plate, Eq. 6.18 (N).

    ``k_v`` = 1.0 per Eq. 6.18; published simple-joint guidance uses 1.27 for fin and
    end plates to allow for coexisting bending.
    """
    V_Rd_g = A_v * f_y / (k_v * sqrt(3) * gamma_M0)
    return V_Rd_g


@clause("EN 1993-1-1:2005, 6.2.6(7)", units={"A_v_net": "mm2", "f_u": "MPa"}, returns="N",
        example=dict(A_v_net=1872.0, f_u=410.0, gamma_M2=1.1))
def V_Rd_n(A_v_net: float, f_u: float, gamma_M2: float) -> float:
    """Net-section shear resistance at a connection, A_v,net f_u / (sqrt 3 gamma_M2) (N).

    6.2.6(7) requires holes to be allowed for at connections; the f_u/sqrt 3 net
    form is the one of published UK simple-joint guidance.
    """
    V_Rd_n = A_v_net * f_u / (sqrt(3) * gamma_M2)
    return V_Rd_n


@clause("EN 1993-1-1:2005, 6.2.5(2), Eq. 6.14", units={"t": "mm", "h": "mm"}, returns="mm3",
        example=dict(t=10.0, h=200.0))
def W_el_plate(t: float, h: float) -> float:
    """Elastic modulus of a rectangular plate t x h bent in its plane (mm3)."""
    W_el = t * h ** 2 / 6
    return W_el


@clause("EN 1993-1-1:2005, 6.2.5(2), Eq. 6.13", units={"t": "mm", "h": "mm"}, returns="mm3",
        example=dict(t=10.0, h=200.0))
def W_pl_plate(t: float, h: float) -> float:
    """Plastic modulus of a rectangular plate t x h bent in its plane (mm3)."""
    W_pl = t * h ** 2 / 4
    return W_pl


@clause("EN 1993-1-1:2005, 6.2.8(3)", units={"W_el": "mm3", "f_y": "MPa"}, returns="Nmm",
        example=dict(rho=0.1, W_el=100e3, f_y=355.0, gamma_M0=1.0))
def M_V_Rd_el(rho: float, W_el: float, f_y: float, gamma_M0: float) -> float:
    """Elastic bending resistance with the yield strength reduced to (1 - rho) f_y for coexisting
    shear over the whole section (N*mm), 6.2.8(3): conservative for a plate (all of it shear area)
    and for a notched tee (the reduction applied to the flange too)."""
    M_V_Rd = (1 - rho) * W_el * f_y / gamma_M0
    return M_V_Rd


@clause("EN 1993-1-8:2005, 3.5, Table 3.3", units={"f_y": "MPa", "f_ref": "MPa"}, returns="",
        example=dict(f_y=275.0, f_ref=235.0))
def p_1_t_lim(f_y: float, f_ref: float = 235.0) -> float:
    """Table 3.3 note 2: buckling between fasteners need not be checked if p_1/t < 9 eps."""
    epsilon = sqrt(f_ref / f_y)
    p_1_t_lim = 9 * epsilon
    return p_1_t_lim


@clause("EN 1993-1-1:2005, 6.3.1.3, Eq. 6.50", units={"p_1": "mm", "t": "mm", "f_y": "MPa", "E": "MPa"},
        returns="", example=dict(p_1=150.0, t=10.0, f_y=275.0, E=210000.0, k_L=0.6))
def lambda_bar_plate(p_1: float, t: float, f_y: float, E: float, k_L: float = 0.6) -> float:
    """Slenderness of a plate strip between fasteners, buckling length 0.6 p_1 (Table 3.3 note 2)."""
    L_cr = k_L * p_1
    i = t / sqrt(12)
    lamb_1 = pi * sqrt(E / f_y)
    lamb_bar = L_cr / (i * lamb_1)
    return lamb_bar


@clause("EN 1993-1-1:2005, 6.3.1.2, Eq. 6.49", units={}, returns="",
        example=dict(lamb_bar=0.6, alpha=0.49))
def chi(lamb_bar: float, alpha: float) -> float:
    """Flexural buckling reduction factor, Eq. 6.49 (chi <= 1); ``lamb_bar`` is the
    non-dimensional slenderness (spelled ``lamb`` so handcalcs renders lambda)."""
    Phi = 0.5 * (1 + alpha * (lamb_bar - 0.2) + lamb_bar ** 2)
    chi = min(1 / (Phi + sqrt(Phi ** 2 - lamb_bar ** 2)), 1.0)
    return chi


@clause("EN 1993-1-1:2005, 6.3.1.1, Eq. 6.47", units={"A": "mm2", "f_y": "MPa"}, returns="N",
        example=dict(chi=0.8, A=2400.0, f_y=275.0, gamma_M1=1.0))
def N_b_Rd(chi: float, A: float, f_y: float, gamma_M1: float) -> float:
    """Flexural buckling resistance, Eq. 6.47 (N)."""
    N_b_Rd = chi * A * f_y / gamma_M1
    return N_b_Rd


# ------------------------------------------------------------------------ helpers
@dataclass(frozen=True)
class BlockAreas:
    """Net areas for block tearing (mm2): A_nt in tension, A_nv in shear; ``pattern`` names the block."""

    A_nt: float
    A_nv: float
    pattern: str


def block_tearing_areas(t: float, d_0: float, n_1: int, e_1: float, p_1: float, n_2: int, e_2: float,
                        p_2: float = 0.0, pattern: str = "one_side") -> BlockAreas:
    """Net areas of a block of a bolt group (n_1 rows along the load, n_2 lines across), mm2.

    e_1 end distance and p_1 pitch along the load; e_2 edge distance and p_2 gauge
    across it (mm). Shear plane length along one bolt line: e_1 + (n_1 - 1) p_1,
    net of (n_1 - 0.5) holes. Patterns (EN 1993-1-8:2005, 3.10.2, Figure 3.8):

    * ``'one_side'``: one shear plane along the inner bolt line, tension from it to
      one edge, e_2 + (n_2 - 1) p_2 net of (n_2 - 0.5) holes (web/fin plate in shear);
    * ``'inner'``: tension between the outer bolt lines, (n_2 - 1)(p_2 - d_0), and two
      shear planes along them (plate in tension, block pulled out of the middle);
    * ``'outer'``: two shear planes along the outer bolt lines and tension from each
      of them to its edge, 2 (e_2 - d_0/2) (plate in tension, both sides torn off).
    """
    t = require_positive("t", t, "mm")
    d_0 = require_positive("d_0", d_0, "mm")
    n_1 = _count("n_1", n_1)
    n_2 = _count("n_2", n_2)
    e_1 = require_positive("e_1", e_1, "mm")
    e_2 = require_positive("e_2", e_2, "mm")
    p_1 = require_non_negative("p_1", p_1, "mm")
    p_2 = require_non_negative("p_2", p_2, "mm")
    require_choice("pattern", pattern, ("one_side", "inner", "outer"))
    if n_1 > 1 and p_1 <= 0.0:
        raise InputError("p_1", p_1, "a pitch > 0 mm when n_1 > 1")
    if n_2 > 1 and p_2 <= 0.0:
        raise InputError("p_2", p_2, "a gauge > 0 mm when n_2 > 1")
    L_v = e_1 + (n_1 - 1) * p_1 - (n_1 - 0.5) * d_0
    if pattern == "one_side":
        L_t = e_2 + (n_2 - 1) * p_2 - (n_2 - 0.5) * d_0
        A_nt, A_nv = t * L_t, t * L_v
    elif pattern == "inner":
        if n_2 < 2:
            raise InputError("n_2", n_2, "at least 2 bolt lines for the 'inner' block")
        A_nt, A_nv = t * (n_2 - 1) * (p_2 - d_0), 2.0 * t * L_v
    else:
        A_nt, A_nv = 2.0 * t * (e_2 - 0.5 * d_0), 2.0 * t * L_v
    if A_nt <= 0.0 or A_nv <= 0.0:
        raise InputError("layout", (e_1, p_1, e_2, p_2, d_0), "a layout with positive net tension and shear areas")
    return BlockAreas(A_nt=A_nt, A_nv=A_nv, pattern=pattern)




def _gM2(na: NationalAnnex, gamma_M2: float | None) -> float:
    return na.gamma_M2_member if gamma_M2 is None else require_positive("gamma_M2", gamma_M2)


# ------------------------------------------------------------------------ checks
def check_plate_tension(N_Ed: float, b: float, t: float, grade: str, *, n_holes: int = 0, d_0: float = 0.0,
                        A_net: float | None = None, category_C: bool = False, gamma_M2: float | None = None,
                        na: NationalAnnex = UK_NA, calc: Calc | None = None, id: str = "plate_tension",
                        title: str = "Plate in tension", location_mm: float | None = None) -> CheckRecord:
    """Plate b x t (mm) in tension N_Ed (N), EN 1993-1-1:2005, 6.2.3.

    N_t,Rd = min(N_pl,Rd, N_u,Rd) (Eq. 6.6, 6.7), plus N_net,Rd (Eq. 6.8) for
    category C slip-resistant joints. Net area from ``n_holes`` of ``d_0`` across
    the section, or ``A_net`` given directly (e.g. staggered, :func:`A_net_stagger`).
    """
    na = _na(na)
    N_Ed = require_non_negative("N_Ed", N_Ed, "N")
    b = require_positive("b", b, "mm")
    t = require_positive("t", t, "mm")
    n_holes = _count("n_holes", n_holes, 0)
    d_0 = require_non_negative("d_0", d_0, "mm")
    if A_net is not None:
        A_net = require_positive("A_net", A_net, "mm2")
        if A_net > b * t:
            raise InputError("A_net", A_net, f"at most the gross area {b * t:g} mm2")
    elif n_holes * d_0 >= b:
        raise InputError("n_holes*d_0", n_holes * d_0, f"less than the plate width b = {b:g} mm")
    gM2 = _gM2(na, gamma_M2)
    mat = steel(grade, t, field="t")
    calc = calc if calc is not None else Calc()
    A = b * t
    Npl = calc(N_pl_Rd, A=A, f_y=mat.f_y, gamma_M0=na.gamma_M0)
    if A_net is None:
        A_net = calc(A_net_plate, b=b, t=t, n=n_holes, d_0=d_0) if n_holes else A
    Nu = calc(N_u_Rd, A_net=A_net, f_u=mat.f_u, gamma_M2=gM2)
    N_Rd = min(Npl, Nu)
    calc.keep("N_pl_Rd", Npl, "N")
    calc.keep("N_u_Rd", Nu, "N")
    if category_C:
        Nnet = calc(N_net_Rd, A_net=A_net, f_y=mat.f_y, gamma_M0=na.gamma_M0)
        calc.keep("N_net_Rd", Nnet, "N")
        N_Rd = min(N_Rd, Nnet)
    return calc.record(id=id, title=title, clause="EN 1993-1-1:2005, 6.2.3", demand=N_Ed, resistance=N_Rd,
                       unit="N", location_mm=location_mm,
                       note=f"{b:g} x {t:g} {mat.grade}, gamma_M2 = {gM2:g} for the net section")


def check_block_tearing(F_Ed: float, A_nt: float, A_nv: float, grade: str, t: float, *, eccentric: bool = False,
                        gamma_M2: float | None = None, na: NationalAnnex = UK_NA, calc: Calc | None = None,
                        id: str = "block_tearing", title: str = "Block tearing",
                        location_mm: float | None = None) -> CheckRecord:
    """Block tearing, EN 1993-1-8:2005, 3.10.2: Eq. 3.9 (concentric) or Eq. 3.10 (eccentric).

    A_nt, A_nv net areas (mm2, see :func:`block_tearing_areas`); ``t`` (mm) selects f_y, f_u.
    """
    na = _na(na)
    F_Ed = require_non_negative("F_Ed", F_Ed, "N")
    A_nt = require_positive("A_nt", A_nt, "mm2")
    A_nv = require_positive("A_nv", A_nv, "mm2")
    t = require_positive("t", t, "mm")
    gM2 = _gM2(na, gamma_M2)
    mat = steel(grade, t, field="t")
    calc = calc if calc is not None else Calc()
    fn = V_eff_2_Rd if eccentric else V_eff_1_Rd
    V = calc(fn, f_u=mat.f_u, A_nt=A_nt, gamma_M2=gM2, f_y=mat.f_y, A_nv=A_nv, gamma_M0=na.gamma_M0)
    cl = "EN 1993-1-8:2005, 3.10.2(3), Eq. 3.10" if eccentric else "EN 1993-1-8:2005, 3.10.2(2), Eq. 3.9"
    calc.keep("A_nt", A_nt, "mm2")
    calc.keep("A_nv", A_nv, "mm2")
    return calc.record(id=id, title=title, clause=cl, demand=F_Ed, resistance=V, unit="N",
                       location_mm=location_mm, note=f"{mat.grade}, gamma_M2 = {gM2:g}")


def check_plate_shear(V_Ed: float, h: float, t: float, grade: str, *, n_holes: int = 0, d_0: float = 0.0,
                      k_v: float = 1.0, gamma_M2: float | None = None, na: NationalAnnex = UK_NA,
                      calc: Calc | None = None, id: str = "plate_shear", title: str = "Plate in shear",
                      location_mm: float | None = None) -> CheckRecord:
    """Plate of depth h and thickness t (mm) in shear V_Ed (N): min(gross, net).

    Gross: EN 1993-1-1:2005, 6.2.6, Eq. 6.18 with A_v = h t (and ``k_v``, see :func:`V_Rd_g`);
    net: A_v,net = t (h - n_holes d_0) with f_u/sqrt 3 (6.2.6(7)).
    """
    na = _na(na)
    V_Ed = require_non_negative("V_Ed", V_Ed, "N")
    h = require_positive("h", h, "mm")
    t = require_positive("t", t, "mm")
    n_holes = _count("n_holes", n_holes, 0)
    d_0 = require_non_negative("d_0", d_0, "mm")
    k_v = require_positive("k_v", k_v)
    if n_holes * d_0 >= h:
        raise InputError("n_holes*d_0", n_holes * d_0, f"less than the plate depth h = {h:g} mm")
    gM2 = _gM2(na, gamma_M2)
    mat = steel(grade, t, field="t")
    calc = calc if calc is not None else Calc()
    Vg = calc(V_Rd_g, A_v=h * t, f_y=mat.f_y, gamma_M0=na.gamma_M0, k_v=k_v)
    calc.keep("V_Rd_g", Vg, "N")
    V_Rd = Vg
    if n_holes:
        A_vn = calc(A_net_plate, b=h, t=t, n=n_holes, d_0=d_0)
        Vn = calc(V_Rd_n, A_v_net=A_vn, f_u=mat.f_u, gamma_M2=gM2)
        calc.keep("V_Rd_n", Vn, "N")
        V_Rd = min(Vg, Vn)
    return calc.record(id=id, title=title, clause="EN 1993-1-1:2005, 6.2.6", demand=V_Ed, resistance=V_Rd,
                       unit="N", location_mm=location_mm, note=f"{h:g} x {t:g} {mat.grade}")


#: sizes and actions far outside any plate of a joint, refused so that the arithmetic never
#: overflows or divides by an underflowed zero (a plate 1 um to 100 m, forces to 1e12 N)
MIN_PLATE_MM, MAX_PLATE_MM = 1e-3, 1e5
MAX_FORCE_N, MAX_MOMENT_NMM = 1e12, 1e16


def check_plate_bending(M_Ed: float, h: float, t: float, grade: str, *, plastic: bool = False,
                        na: NationalAnnex = UK_NA, calc: Calc | None = None, id: str = "plate_bending",
                        title: str = "Plate in bending", location_mm: float | None = None) -> CheckRecord:
    """Plate h x t (mm) bent in its plane by M_Ed (N mm), EN 1993-1-1:2005, 6.2.5.

    Elastic (W_el = t h^2/6) by default; ``plastic=True`` uses W_pl = t h^2/4. Holes are
    not deducted (6.2.5(5) allows this in the compression zone; the caller checks the
    net section where it matters). Lateral-torsional buckling of long plates is not covered.
    """
    na = _na(na)
    M_Ed = require_in_range("M_Ed", require_non_negative("M_Ed", M_Ed, "Nmm"), 0.0, MAX_MOMENT_NMM, "Nmm")
    h = require_in_range("h", require_positive("h", h, "mm"), MIN_PLATE_MM, MAX_PLATE_MM, "mm")
    t = require_in_range("t", require_positive("t", t, "mm"), MIN_PLATE_MM, MAX_PLATE_MM, "mm")
    mat = steel(grade, t, field="t")
    calc = calc if calc is not None else Calc()
    W = calc(W_pl_plate if plastic else W_el_plate, t=t, h=h)
    M_Rd = calc(M_c_Rd, W_y=W, f_y=mat.f_y, gamma_M0=na.gamma_M0)
    calc.keep("W", W, "mm3")
    cl = "EN 1993-1-1:2005, 6.2.5(2), Eq. 6.13" if plastic else "EN 1993-1-1:2005, 6.2.5(2), Eq. 6.14"
    return calc.record(id=id, title=title, clause=cl, demand=M_Ed, resistance=M_Rd, unit="Nmm",
                       location_mm=location_mm, note=f"{'plastic' if plastic else 'elastic'}, {h:g} x {t:g} {mat.grade}")


def check_plate_compression(N_Ed: float, b: float, t: float, p_1: float, grade: str, *, curve: str = "c",
                            A_net: float | None = None, na: NationalAnnex = UK_NA, calc: Calc | None = None,
                            id: str = "plate_compression", title: str = "Plate in compression between fasteners",
                            location_mm: float | None = None, length_name: str = "p_1") -> CheckRecord:
    """Plate b x t (mm) in compression N_Ed (N) with fastener pitch p_1 (mm) along the load.

    EN 1993-1-8:2005, 3.5, Table 3.3 note 2: if p_1/t < 9 eps the cross-section
    resistance governs; otherwise also flexural buckling of the strip, EN 1993-1-1
    6.3.1 with L_cr = 0.6 p_1 and curve c. The cross-section resistance is on the
    gross area (holes filled by bolts, EN 1993-1-1 6.2.4), or on ``A_net`` (mm2)
    when given: oversize and slotted holes must be allowed for in compression too.
    ``length_name``: what ``p_1`` is, for the note (e.g. "gap + 2 e_1" for the strip across a joint).
    """
    na = _na(na)
    N_Ed = require_in_range("N_Ed", require_non_negative("N_Ed", N_Ed, "N"), 0.0, MAX_FORCE_N, "N")
    b = require_in_range("b", require_positive("b", b, "mm"), MIN_PLATE_MM, MAX_PLATE_MM, "mm")
    t = require_in_range("t", require_positive("t", t, "mm"), MIN_PLATE_MM, MAX_PLATE_MM, "mm")
    p_1 = require_in_range("p_1", require_positive("p_1", p_1, "mm"), MIN_PLATE_MM, MAX_PLATE_MM, "mm")
    require_choice("curve", curve, tuple(ALPHA_IMP))
    if A_net is not None:
        A_net = require_positive("A_net", A_net, "mm2")
        if A_net > b * t:
            raise InputError("A_net", A_net, f"at most the gross area {b * t:g} mm2")
    mat = steel(grade, t, field="t")
    calc = calc if calc is not None else Calc()
    lim = calc(p_1_t_lim, f_y=mat.f_y)
    Npl = calc(N_pl_Rd, A=b * t if A_net is None else A_net, f_y=mat.f_y, gamma_M0=na.gamma_M0)
    calc.keep("p_1_t", p_1 / t)
    calc.keep("p_1_t_lim", lim)
    N_Rd = Npl
    if p_1 / t >= lim:
        lam = calc(lambda_bar_plate, p_1=p_1, t=t, f_y=mat.f_y, E=E_MPa)
        x = calc(chi, lamb_bar=lam, alpha=ALPHA_IMP[curve])
        Nb = calc(N_b_Rd, chi=x, A=b * t, f_y=mat.f_y, gamma_M1=na.gamma_M1)
        calc.keep("lambda_bar", lam)
        calc.keep("chi", x)
        N_Rd = min(Npl, Nb)
        note = (f"({length_name})/t = {p_1:g}/{t:g} = {p_1 / t:.2f} >= 9 eps = {lim:.2f}: buckling checked, "
                f"L_cr = 0.6 ({length_name}), curve {curve}")
    else:
        note = (f"({length_name})/t = {p_1:g}/{t:g} = {p_1 / t:.2f} < 9 eps = {lim:.2f}: no buckling between "
                "fasteners (Table 3.3 note 2)")
    return calc.record(id=id, title=title, clause="EN 1993-1-8:2005, 3.5, Table 3.3", demand=N_Ed,
                       resistance=N_Rd, unit="N", location_mm=location_mm, note=note)


__all__ = [
    "ALPHA_IMP", "A_net_plate", "A_net_stagger", "N_pl_Rd", "N_u_Rd", "N_net_Rd", "V_eff_1_Rd", "V_eff_2_Rd",
    "V_Rd_g", "V_Rd_n", "W_el_plate", "W_pl_plate", "M_c_Rd", "M_V_Rd_el", "p_1_t_lim", "lambda_bar_plate", "chi", "N_b_Rd",
    "BlockAreas", "block_tearing_areas", "check_plate_tension", "check_block_tearing", "check_plate_shear",
    "check_plate_bending", "check_plate_compression",
]
