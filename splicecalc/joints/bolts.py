"""Bolts to EN 1993-1-8:2005, section 3: data, clause formulas and checks.

Units: N, mm, MPa. Every clause formula runs on floats or forallpeople
quantities and renders with handcalcs through :class:`splicecalc.core.Calc`.

Data
    :class:`Bolt`, :func:`get_bolt`, ``BOLT_SIZES``, ``BOLT_CLASSES``,
    :func:`shear_factor_alpha_v`, :func:`slip_factor_k_s`, :func:`friction_mu`
Clause formulas (``@clause``)
    :func:`F_v_Rd`, :func:`F_v_Rd_n`, :func:`alpha_d_end`, :func:`alpha_d_inner`,
    :func:`alpha_b`, :func:`k_1_edge`, :func:`k_1_edge_single`, :func:`k_1_inner`,
    :func:`F_b_Rd`, :func:`F_b_Rd_lap`, :func:`F_t_Rd`, :func:`B_p_Rd`,
    :func:`U_vt`, :func:`F_p_C`, :func:`F_s_Rd`, :func:`F_s_Rd_t`,
    :func:`beta_Lf`, :func:`beta_p`, :func:`F_Rd_group`, bolt groups :func:`I_p`, :func:`F_r_Ed`,
    :func:`U_b_2d` (two-direction bearing, linear utilisation)
Checks (return :class:`~splicecalc.core.record.CheckRecord`)
    :func:`check_bolt_shear`, :func:`check_bolt_bearing`, :func:`check_bolt_tension`,
    :func:`check_punching`, :func:`check_shear_tension`, :func:`check_slip`,
    :func:`check_bolt_group`
Plain-float helpers
    :func:`bearing_resistance` (F_b,Rd of one bolt position, float path of the check)
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from math import pi
from typing import Sequence

from ..core.clause import clause
from ..core.errors import InputError, require_choice, require_non_negative, require_positive
from ..core.record import Calc, CheckRecord
from ..materials.partial_factors import UK_NA, NationalAnnex
from ..core.errors import require_count
from ..materials.partial_factors import require_national_annex

# shared validators (one definition each)
_count = require_count
_na = require_national_annex


# --------------------------------------------------------------------------- data
#: size -> (d, A_s, d_0 normal, d_0 oversize, washer OD, nut across flats ISO 4032, nut AF EN 14399-4)
#: A_s: EN ISO 898-1:2013, Table 4 (tensile stress area, coarse thread).
#: d_0: EN 1090-2:2018, Table 11: normal clearance d+1 (M12, M14), d+2 (M16-M24), d+3 (M27+);
#:      oversize d+3 (M12, M14), d+4 (M16-M22), d+6 (M24), d+8 (M27+).
#: washer OD: EN ISO 7089 / EN 14399-6 (from memory). Nut across flats: EN ISO 4032 (ordinary
#: nuts) and EN 14399-4 (HR preloading nuts), both from memory.
_BOLT_DATA: dict[str, tuple[float, float, float, float, float, float, float]] = {
    "M12": (12.0, 84.3, 13.0, 15.0, 24.0, 18.0, 22.0),
    "M16": (16.0, 157.0, 18.0, 20.0, 30.0, 24.0, 27.0),
    "M20": (20.0, 245.0, 22.0, 24.0, 37.0, 30.0, 32.0),
    "M22": (22.0, 303.0, 24.0, 26.0, 39.0, 34.0, 36.0),
    "M24": (24.0, 353.0, 26.0, 30.0, 44.0, 36.0, 41.0),
    "M27": (27.0, 459.0, 30.0, 35.0, 50.0, 41.0, 46.0),
    "M30": (30.0, 561.0, 33.0, 38.0, 56.0, 46.0, 50.0),
    "M36": (36.0, 817.0, 39.0, 44.0, 66.0, 55.0, 60.0),
}
#: bolt class -> (f_yb, f_ub) MPa, EN 1993-1-8:2005, 3.1.1, Table 3.1
_CLASS_DATA: dict[str, tuple[float, float]] = {
    "4.6": (240.0, 400.0),
    "4.8": (320.0, 400.0),
    "5.6": (300.0, 500.0),
    "5.8": (400.0, 500.0),
    "6.8": (480.0, 600.0),
    "8.8": (640.0, 800.0),
    "10.9": (900.0, 1000.0),
}
BOLT_SIZES: tuple[str, ...] = tuple(_BOLT_DATA)
BOLT_CLASSES: tuple[str, ...] = tuple(_CLASS_DATA)
#: classes that may be preloaded, EN 1993-1-8:2005, 3.1.2(1)
PRELOAD_CLASSES: tuple[str, ...] = ("8.8", "10.9")
#: classes with alpha_v = 0.6 when threads are in the shear plane, Table 3.4
_ALPHA_V_06 = ("4.6", "5.6", "8.8")

#: hole type -> k_s, EN 1993-1-8:2005, 3.9.1, Table 3.6
K_S: dict[str, float] = {
    "normal": 1.0,
    "oversize": 0.85,
    "short_slot_perpendicular": 0.85,
    "long_slot_perpendicular": 0.7,
    "short_slot_parallel": 0.76,
    "long_slot_parallel": 0.63,
}
#: friction surface class -> mu, EN 1993-1-8:2005, 3.9.1, Table 3.7
MU: dict[str, float] = {"A": 0.5, "B": 0.4, "C": 0.3, "D": 0.2}
#: hole type -> bearing factor, EN 1993-1-8:2005, 3.6.1, Table 3.4 note 1
K_HOLE_BEARING: dict[str, float] = {"normal": 1.0, "oversize": 0.8}


@dataclass(frozen=True)
class Bolt:
    """One bolt size and property class (all mm, mm2, MPa).

    ``A`` gross shank area pi d^2/4; ``A_s`` tensile stress area; ``d_0`` normal
    hole; ``d_0_oversize`` oversize hole; ``washer_od`` washer outside diameter;
    ``nut_af`` across flats of an ordinary nut (EN ISO 4032), ``nut_af_preloaded``
    of an HR preloading nut (EN 14399-4), for clearance near root radii.
    """

    size: str
    d: float
    A: float
    A_s: float
    d_0: float
    d_0_oversize: float
    bolt_class: str
    f_ub: float
    f_yb: float
    washer_od: float
    nut_af: float
    nut_af_preloaded: float = 0.0

    @property
    def d_m(self) -> float:
        """Mean of across flats and across corners of the (ordinary) nut, mm, for punching (Table 3.4).

        Across corners taken as the regular-hexagon value 2 s / sqrt(3).
        """
        return 0.5 * (self.nut_af + 2.0 * self.nut_af / math.sqrt(3.0))

    def hole(self, hole: str = "normal") -> float:
        """Hole diameter d_0 (mm) for ``hole`` = 'normal' or 'oversize'."""
        require_choice("hole", hole, ("normal", "oversize"))
        return self.d_0 if hole == "normal" else self.d_0_oversize


def _norm_class(bolt_class) -> str:
    if isinstance(bolt_class, (int, float)) and not isinstance(bolt_class, bool):
        bolt_class = f"{bolt_class:g}"
    if not isinstance(bolt_class, str) or bolt_class.strip() not in _CLASS_DATA:
        raise InputError("bolt_class", bolt_class, "one of " + ", ".join(BOLT_CLASSES),
                         "EN 1993-1-8 Table 3.1")
    return bolt_class.strip()


def get_bolt(size: str, bolt_class: str = "8.8") -> Bolt:
    """Bolt data for ``size`` (e.g. 'M20') and property class (e.g. '8.8').

    Unknown size or class raises :class:`InputError` listing the allowed values.
    """
    if not isinstance(size, str):
        raise InputError("size", size, "one of " + ", ".join(BOLT_SIZES))
    key = size.strip().upper().replace(" ", "")
    if key not in _BOLT_DATA:
        raise InputError("size", size, "one of " + ", ".join(BOLT_SIZES))
    cls = _norm_class(bolt_class)
    d, A_s, d0, d0o, wod, af, af_hr = _BOLT_DATA[key]
    f_yb, f_ub = _CLASS_DATA[cls]
    return Bolt(size=key, d=d, A=pi * d * d / 4.0, A_s=A_s, d_0=d0, d_0_oversize=d0o, bolt_class=cls,
                f_ub=f_ub, f_yb=f_yb, washer_od=wod, nut_af=af, nut_af_preloaded=af_hr)


def shear_factor_alpha_v(bolt_class: str, threads_in_shear_plane: bool = True) -> float:
    """alpha_v, EN 1993-1-8:2005, 3.6.1, Table 3.4.

    Threads in the shear plane: 0.6 for classes 4.6, 5.6, 8.8; 0.5 for 4.8, 5.8,
    6.8, 10.9. Unthreaded shank in the shear plane: 0.6 (use the gross area A).
    """
    cls = _norm_class(bolt_class)
    if not threads_in_shear_plane:
        return 0.6
    return 0.6 if cls in _ALPHA_V_06 else 0.5


def slip_factor_k_s(hole: str = "normal") -> float:
    """k_s, EN 1993-1-8:2005, 3.9.1, Table 3.6."""
    require_choice("hole", hole, tuple(K_S))
    return K_S[hole]


def friction_mu(surface_class: str = "A") -> float:
    """Slip factor mu for friction surface class A-D, EN 1993-1-8:2005, 3.9.1, Table 3.7."""
    require_choice("surface_class", surface_class, tuple(MU))
    return MU[surface_class]


# ------------------------------------------------------------------ clause formulas
@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"f_ub": "MPa", "A_s": "mm2"}, returns="N",
        example=dict(alpha_v=0.6, f_ub=800.0, A_s=245.0, gamma_M2=1.25))
def F_v_Rd(alpha_v: float, f_ub: float, A_s: float, gamma_M2: float) -> float:
    """Shear resistance per shear plane, Table 3.4 (N).

    ``A_s`` is the tensile stress area when the threads are in the shear plane,
    otherwise pass the gross shank area A (with alpha_v = 0.6).
    """
    F_v_Rd = alpha_v * f_ub * A_s / gamma_M2
    return F_v_Rd


@clause("EN 1993-1-8:2005, 3.6.1(12), 3.8(1)", units={"F_v_Rd": "N"}, returns="N",
        example=dict(n_s=2, beta_Lf=0.95, beta_p=1.0, F_v_Rd=94080.0))
def F_v_Rd_n(n_s: float, beta_Lf: float, beta_p: float, F_v_Rd: float) -> float:
    """Shear resistance of one bolt over ``n_s`` shear planes with the long-joint and packing factors (N)."""
    F_v_Rd_n = n_s * beta_Lf * beta_p * F_v_Rd
    return F_v_Rd_n


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"e_1": "mm", "d_0": "mm"}, returns="",
        example=dict(e_1=40.0, d_0=22.0))
def alpha_d_end(e_1: float, d_0: float) -> float:
    """alpha_d for end bolts (in the direction of load transfer), Table 3.4."""
    alpha_d = e_1 / (3 * d_0)
    return alpha_d


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"p_1": "mm", "d_0": "mm"}, returns="",
        example=dict(p_1=70.0, d_0=22.0))
def alpha_d_inner(p_1: float, d_0: float) -> float:
    """alpha_d for inner bolts (in the direction of load transfer), Table 3.4."""
    alpha_d = p_1 / (3 * d_0) - 1 / 4
    return alpha_d


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"f_ub": "MPa", "f_u": "MPa"}, returns="",
        example=dict(alpha_d=0.606, f_ub=800.0, f_u=410.0))
def alpha_b(alpha_d: float, f_ub: float, f_u: float) -> float:
    """alpha_b = min(alpha_d, f_ub/f_u, 1.0), Table 3.4."""
    alpha_b = min(alpha_d, f_ub / f_u, 1.0)
    return alpha_b


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"e_2": "mm", "p_2": "mm", "d_0": "mm"}, returns="",
        example=dict(e_2=40.0, p_2=70.0, d_0=22.0))
def k_1_edge(e_2: float, p_2: float, d_0: float) -> float:
    """k_1 for edge bolts (perpendicular to load transfer) with a second bolt line at p_2, Table 3.4."""
    k_1 = min(2.8 * e_2 / d_0 - 1.7, 1.4 * p_2 / d_0 - 1.7, 2.5)
    return k_1


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"e_2": "mm", "d_0": "mm"}, returns="",
        example=dict(e_2=30.0, d_0=22.0))
def k_1_edge_single(e_2: float, d_0: float) -> float:
    """k_1 for edge bolts of a single bolt line (no p_2), Table 3.4."""
    k_1 = min(2.8 * e_2 / d_0 - 1.7, 2.5)
    return k_1


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"p_2": "mm", "d_0": "mm"}, returns="",
        example=dict(p_2=60.0, d_0=22.0))
def k_1_inner(p_2: float, d_0: float) -> float:
    """k_1 for inner bolts (perpendicular to load transfer), Table 3.4."""
    k_1 = min(1.4 * p_2 / d_0 - 1.7, 2.5)
    return k_1


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"f_u": "MPa", "d": "mm", "t": "mm"}, returns="N",
        example=dict(k_1=2.5, alpha_b=0.606, f_u=410.0, d=20.0, t=10.0, gamma_M2=1.25, k_hole=1.0))
def F_b_Rd(k_1: float, alpha_b: float, f_u: float, d: float, t: float, gamma_M2: float,
           k_hole: float = 1.0) -> float:
    """Bearing resistance of one bolt, Table 3.4 (N).

    ``k_hole`` = 1.0 normal holes, 0.8 oversize holes (Table 3.4 note 1).
    """
    F_b_Rd = k_hole * k_1 * alpha_b * f_u * d * t / gamma_M2
    return F_b_Rd


@clause("EN 1993-1-8:2005, 3.6.1(10), Eq. 3.2", units={"f_u": "MPa", "d": "mm", "t": "mm"}, returns="N",
        example=dict(f_u=410.0, d=20.0, t=10.0, gamma_M2=1.25))
def F_b_Rd_lap(f_u: float, d: float, t: float, gamma_M2: float) -> float:
    """Upper limit of bearing for a single-lap joint with one bolt (row), 3.6.1(10) (N)."""
    F_b_Rd_lap = 1.5 * f_u * d * t / gamma_M2
    return F_b_Rd_lap


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"f_ub": "MPa", "A_s": "mm2"}, returns="N",
        example=dict(f_ub=800.0, A_s=245.0, gamma_M2=1.25, k_2=0.9))
def F_t_Rd(f_ub: float, A_s: float, gamma_M2: float, k_2: float = 0.9) -> float:
    """Tension resistance of one bolt, Table 3.4 (N); k_2 = 0.9, 0.63 for countersunk bolts."""
    F_t_Rd = k_2 * f_ub * A_s / gamma_M2
    return F_t_Rd


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"d_m": "mm", "t_p": "mm", "f_u": "MPa"}, returns="N",
        example=dict(d_m=32.3, t_p=10.0, f_u=410.0, gamma_M2=1.25))
def B_p_Rd(d_m: float, t_p: float, f_u: float, gamma_M2: float) -> float:
    """Punching shear resistance of the plate under the bolt head or nut, Table 3.4 (N)."""
    B_p_Rd = 0.6 * pi * d_m * t_p * f_u / gamma_M2
    return B_p_Rd


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"F_v_Ed": "N", "F_v_Rd": "N", "F_t_Ed": "N", "F_t_Rd": "N"},
        returns="", example=dict(F_v_Ed=50000.0, F_v_Rd=94080.0, F_t_Ed=40000.0, F_t_Rd=141120.0))
def U_vt(F_v_Ed: float, F_v_Rd: float, F_t_Ed: float, F_t_Rd: float) -> float:
    """Combined shear and tension, Table 3.4: F_v,Ed/F_v,Rd + F_t,Ed/(1.4 F_t,Rd) <= 1.0."""
    U_vt = F_v_Ed / F_v_Rd + F_t_Ed / (1.4 * F_t_Rd)
    return U_vt


@clause("EN 1993-1-8:2005, 3.9.1(2), Eq. 3.7", units={"f_ub": "MPa", "A_s": "mm2"}, returns="N",
        example=dict(f_ub=800.0, A_s=245.0))
def F_p_C(f_ub: float, A_s: float) -> float:
    """Design preload F_p,C = 0.7 f_ub A_s, Eq. 3.7 (N)."""
    F_p_C = 0.7 * f_ub * A_s
    return F_p_C


@clause("EN 1993-1-8:2005, 3.9.1, Eq. 3.6", units={"F_p_C": "N"}, returns="N",
        example=dict(k_s=1.0, n=1, mu=0.5, F_p_C=137200.0, gamma_M3=1.25))
def F_s_Rd(k_s: float, n: float, mu: float, F_p_C: float, gamma_M3: float) -> float:
    """Slip resistance of a preloaded bolt, Eq. 3.6 (N); n = number of friction surfaces."""
    F_s_Rd = k_s * n * mu * F_p_C / gamma_M3
    return F_s_Rd


@clause("EN 1993-1-8:2005, 3.9.2, Eq. 3.8", units={"F_p_C": "N", "F_t_Ed": "N"}, returns="N",
        example=dict(k_s=1.0, n=1, mu=0.5, F_p_C=137200.0, F_t_Ed=20000.0, gamma_M3=1.25))
def F_s_Rd_t(k_s: float, n: float, mu: float, F_p_C: float, F_t_Ed: float, gamma_M3: float) -> float:
    """Slip resistance with applied tension, Eq. 3.8a (category C, F_t,Ed) / 3.8b (category B, F_t,Ed,ser) (N)."""
    F_s_Rd = k_s * n * mu * (F_p_C - 0.8 * F_t_Ed) / gamma_M3
    return F_s_Rd


@clause("EN 1993-1-8:2005, 3.8(1), Eq. 3.5", units={"L_j": "mm", "d": "mm"}, returns="",
        example=dict(L_j=400.0, d=20.0))
def beta_Lf(L_j: float, d: float) -> float:
    """Long-joint reduction, Eq. 3.5: 1 - (L_j - 15 d)/(200 d), within 0.75..1.0."""
    beta_Lf = 1 - (L_j - 15 * d) / (200 * d)
    beta_Lf = max(min(beta_Lf, 1.0), 0.75)
    return beta_Lf


@clause("EN 1993-1-8:2005, 3.6.1(12), Eq. 3.3", units={"d": "mm", "t_p": "mm"}, returns="",
        example=dict(d=20.0, t_p=12.0))
def beta_p(d: float, t_p: float) -> float:
    """Packing reduction, Eq. 3.3: 9 d/(8 d + 3 t_p) <= 1 (reduces only when t_p > d/3)."""
    beta_p = min(9 * d / (8 * d + 3 * t_p), 1.0)
    return beta_p


@clause("EN 1993-1-8:2005, 3.7(1)", units={"F_v_Rd": "N", "F_b_Rd_max": "N", "F_b_Rd_min": "N",
                                           "F_b_Rd_sum": "N"}, returns="N",
        example=dict(n=4, F_v_Rd=94080.0, F_b_Rd_max=80000.0, F_b_Rd_min=60000.0, F_b_Rd_sum=280000.0))
def F_Rd_group(n: float, F_v_Rd: float, F_b_Rd_max: float, F_b_Rd_min: float, F_b_Rd_sum: float) -> float:
    """Group of fasteners, 3.7(1) (N): sum of F_b,Rd if every F_v,Rd >= F_b,Rd, else n x the smallest."""
    if F_v_Rd >= F_b_Rd_max: F_Rd_g = F_b_Rd_sum
    else: F_Rd_g = n * min(F_v_Rd, F_b_Rd_min)
    return F_Rd_g


# ------------------------------------------------------------- assembly masses
#: Product-standard dimensions used for the mass of a bolt assembly (bolt + nut + 2 washers), mm,
#: ALL FROM MEMORY of the standards' tables (nominal values; confirm against the documents):
#: ordinary (non-preloaded) sets: hexagon head bolt ISO 4014 / screw ISO 4017: s (across flats), k (head
#: height); nut ISO 4032: m (height), s as the bolt; plain washer ISO 7089: d1 (bore), d2 (outside), h.
_ISO_SET: dict[str, tuple[float, float, float, float, float, float]] = {
    #        s     k     m_nut  d1    d2    h
    "M12": (18.0, 7.5, 10.8, 13.0, 24.0, 2.5),
    "M16": (24.0, 10.0, 14.8, 17.0, 30.0, 3.0),
    "M20": (30.0, 12.5, 18.0, 21.0, 37.0, 3.0),
    "M22": (34.0, 14.0, 19.4, 23.0, 39.0, 3.0),
    "M24": (36.0, 15.0, 21.5, 25.0, 44.0, 4.0),
    "M27": (41.0, 17.0, 23.8, 28.0, 50.0, 4.0),
    "M30": (46.0, 18.7, 25.6, 31.0, 56.0, 4.0),
    "M36": (55.0, 22.5, 31.0, 37.0, 66.0, 5.0),
}
#: preloaded (HR) sets, EN 14399-4 bolt and nut (larger across flats), EN 14399-6 washers (from memory)
_HR_SET: dict[str, tuple[float, float, float, float, float, float]] = {
    "M12": (22.0, 8.0, 10.0, 13.0, 24.0, 3.0),
    "M16": (27.0, 10.0, 13.0, 17.0, 30.0, 4.0),
    "M20": (32.0, 13.0, 16.0, 21.0, 37.0, 4.0),
    "M22": (36.0, 14.0, 18.0, 23.0, 39.0, 4.0),
    "M24": (41.0, 15.0, 20.0, 25.0, 44.0, 4.0),
    "M27": (46.0, 17.0, 22.0, 28.0, 50.0, 5.0),
    "M30": (50.0, 19.0, 24.0, 31.0, 56.0, 5.0),
    "M36": (60.0, 23.0, 29.0, 37.0, 66.0, 6.0),
}
#: coarse thread pitch P, ISO 261 (from memory): protrusion beyond the nut is taken as 2 P
_PITCH: dict[str, float] = {"M12": 1.75, "M16": 2.0, "M20": 2.5, "M22": 2.5, "M24": 3.0, "M27": 3.0, "M30": 3.5,
                            "M36": 4.0}
STEEL_DENSITY_KG_PER_M3 = 7850.0
#: the stated convention of an assembly's mass
ASSEMBLY_CONVENTION = ("bolt + nut + 2 washers per assembly; volumes from the product standards' nominal "
                       "dimensions (hexagons without chamfers, full-diameter shank, nut bore at d), steel 7850 "
                       "kg/m3; length = grip + washers + nut + 2 thread pitches, rounded up to 5 mm (to 10 mm "
                       "above 80 mm)")


@dataclass(frozen=True)
class BoltAssembly:
    """One bolt assembly (bolt, nut, two washers) and its mass (kg) from the product standards' dimensions."""

    size: str
    preloaded: bool
    standard: str
    grip_mm: float
    length_mm: float
    bolt_kg: float
    nut_kg: float
    washers_kg: float

    @property
    def mass_kg(self) -> float:
        return self.bolt_kg + self.nut_kg + self.washers_kg


def bolt_length(size: str, grip_mm: float, preloaded: bool = False) -> float:
    """Nominal bolt length (mm) for a grip: grip + 2 washers + nut + 2 P, rounded up to the length steps."""
    s, k, m, d1, d2, h = (_HR_SET if preloaded else _ISO_SET)[size]
    need = grip_mm + 2 * h + m + 2 * _PITCH[size]
    step = 5.0 if need <= 80.0 else 10.0
    return math.ceil(need / step - 1e-9) * step


def bolt_assembly(size: str, grip_mm: float, preloaded: bool = False) -> BoltAssembly:
    """Mass of one assembly for a grip (mm): ISO 4014/4017 + ISO 4032 + 2 x ISO 7089 (ordinary) or
    EN 14399-4 + 2 x EN 14399-6 (preloaded). See :data:`ASSEMBLY_CONVENTION`."""
    if size not in _ISO_SET:
        raise InputError("bolt size", size, f"one of {', '.join(_ISO_SET)}")
    grip = require_positive("grip_mm", grip_mm, "mm")
    s, k, m, d1, d2, h = (_HR_SET if preloaded else _ISO_SET)[size]
    d = _BOLT_DATA[size][0]
    L = bolt_length(size, grip, preloaded)
    rho = STEEL_DENSITY_KG_PER_M3 * 1e-9
    hexagon = math.sqrt(3.0) / 2.0 * s * s
    bolt_kg = (hexagon * k + pi * d * d / 4.0 * L) * rho
    nut_kg = (hexagon - pi * d * d / 4.0) * m * rho
    washers_kg = 2 * pi / 4.0 * (d2 * d2 - d1 * d1) * h * rho
    std = ("EN 14399-4 bolt and nut, 2 EN 14399-6 washers" if preloaded
           else "ISO 4014/4017 bolt, ISO 4032 nut, 2 ISO 7089 washers")
    return BoltAssembly(size=size, preloaded=preloaded, standard=std, grip_mm=grip, length_mm=L, bolt_kg=bolt_kg,
                        nut_kg=nut_kg, washers_kg=washers_kg)


# ---------------------------------------------------------- bolt groups (one home)
#: stated convention for a bolt loaded in two directions (splice web bolts, fin plates)
BEARING_2D_CONVENTION = ("bearing in two directions: U = sqrt((F_x/F_b,x,Rd)^2 + (F_z/F_b,z,Rd)^2), each F_b,Rd "
                         "from Table 3.4 with e1/p1 taken in its own direction; U is linear in the load "
                         "(the vector-sum ratio), the same convention for every bolt group")
#: where that interaction comes from (not a code clause)
BEARING_2D_GUIDANCE = "published UK design guidance for bolt groups in two-direction bearing (from memory)"
#: the elastic bolt-group method (3.12(3) allows an elastic distribution; the formulas are textbook)
POLAR_GUIDANCE = "elastic (polar) bolt-group method of standard steel-design texts"


@clause("EN 1993-1-8:2005, 3.12(3)", units={"p_1": "mm", "p_2": "mm"}, returns="mm2",
        example=dict(n_r=5, n_c=2, p_1=70.0, p_2=60.0))
def I_p(n_r: int, n_c: int, p_1: float, p_2: float) -> float:
    """Polar sum of squares of a rectangular bolt grid about its centroid, sum(x_i^2 + z_i^2)
    (mm2 per unit bolt area): n_r rows at pitch p_1 (one above the other), n_c columns at p_2."""
    I_p = n_c * n_r * (n_r ** 2 - 1) * p_1 ** 2 / 12 + n_r * n_c * (n_c ** 2 - 1) * p_2 ** 2 / 12
    return I_p


@clause("EN 1993-1-8:2005, 3.12(3)", units={"F_x_Ed": "N", "F_z_Ed": "N"}, returns="N",
        example=dict(F_x_Ed=-103e3, F_z_Ed=52e3))
def F_r_Ed(F_x_Ed: float, F_z_Ed: float) -> float:
    """Resultant (vector sum) of the two force components on one bolt (N)."""
    F_r_Ed = (F_x_Ed ** 2 + F_z_Ed ** 2) ** 0.5
    return F_r_Ed


@clause("EN 1993-1-8:2005, 3.6.1, Table 3.4", units={"F_x_Ed": "N", "F_b_x_Rd": "N", "F_z_Ed": "N",
                                                    "F_b_z_Rd": "N"}, returns="",
        example=dict(F_x_Ed=60e3, F_b_x_Rd=100e3, F_z_Ed=30e3, F_b_z_Rd=90e3))
def U_b_2d(F_x_Ed: float, F_b_x_Rd: float, F_z_Ed: float, F_b_z_Rd: float) -> float:
    """Bearing of a bolt loaded in two directions, linear utilisation (the vector-sum ratio):
    U = sqrt((F_x/F_b,x,Rd)^2 + (F_z/F_b,z,Rd)^2) <= 1, each F_b,Rd from Table 3.4 with e_1/p_1
    in its own direction (interaction from published design guidance, from memory)."""
    U_b = ((F_x_Ed / F_b_x_Rd) ** 2 + (F_z_Ed / F_b_z_Rd) ** 2) ** 0.5
    return U_b


# ------------------------------------------------------------------------ checks
def _bolt(bolt) -> Bolt:
    if not isinstance(bolt, Bolt):
        raise InputError("bolt", bolt, "a Bolt from get_bolt(size, bolt_class)")
    return bolt




def check_bolt_shear(bolt: Bolt, F_v_Ed: float, *, n_s: int = 1, threads_in_shear_plane: bool = True,
                     L_j: float | None = None, t_pack: float = 0.0, na: NationalAnnex = UK_NA,
                     calc: Calc | None = None, id: str = "bolt_shear", title: str = "Bolt shear",
                     location_mm: float | None = None) -> CheckRecord:
    """Shear of one bolt over ``n_s`` shear planes, EN 1993-1-8:2005, 3.6.1, Table 3.4.

    F_v_Ed: design shear on the bolt (all planes), N. L_j: distance between end
    fasteners of a long joint, mm (3.8, beta_Lf); t_pack: packing thickness, mm
    (3.6.1(12), beta_p).
    """
    bolt = _bolt(bolt)
    na = _na(na)
    F_v_Ed = require_non_negative("F_v_Ed", F_v_Ed, "N")
    n_s = _count("n_s", n_s)
    if L_j is not None:
        L_j = require_non_negative("L_j", L_j, "mm")
    t_pack = require_non_negative("t_pack", t_pack, "mm")
    calc = calc if calc is not None else Calc()
    a_v = shear_factor_alpha_v(bolt.bolt_class, threads_in_shear_plane)
    area = bolt.A_s if threads_in_shear_plane else bolt.A
    F1 = calc(F_v_Rd, alpha_v=a_v, f_ub=bolt.f_ub, A_s=area, gamma_M2=na.gamma_M2)
    b_Lf = calc(beta_Lf, L_j=L_j, d=bolt.d) if (L_j is not None and L_j > 15.0 * bolt.d) else 1.0
    b_p = calc(beta_p, d=bolt.d, t_p=t_pack) if t_pack > bolt.d / 3.0 else 1.0
    F_Rd = calc(F_v_Rd_n, n_s=n_s, beta_Lf=b_Lf, beta_p=b_p, F_v_Rd=F1)
    calc.keep("F_v_Rd", F1, "N")
    calc.keep("beta_Lf", b_Lf)
    calc.keep("beta_p", b_p)
    where = "threads" if threads_in_shear_plane else "shank"
    return calc.record(id=id, title=title, clause="EN 1993-1-8:2005, 3.6.1, Table 3.4",
                       demand=F_v_Ed, resistance=F_Rd, unit="N", location_mm=location_mm,
                       note=f"{bolt.size} {bolt.bolt_class}, {n_s} shear plane(s) through the {where}")


def _opt_pos(name: str, v: float | None) -> float | None:
    return None if v is None else require_positive(name, v, "mm")


def bearing_resistance(bolt: Bolt, t: float, f_u: float, e_1: float | None, e_2: float | None = None,
                       p_1: float | None = None, p_2: float | None = None, *, hole: str = "normal",
                       gamma_M2: float = 1.25, calc: Calc | None = None, nothing_ahead: bool = False) -> float:
    """F_b,Rd (N) of the governing bolt position of a layout, load along direction 1.

    e_1 / p_1 are measured in the direction of load transfer, e_2 / p_2 across it;
    ``None`` means that position does not occur (no end bolt, single row, no edge,
    single line). alpha_d is the smaller of the end and inner values present and
    k_1 the smaller of the edge and inner values present (Table 3.4), a lower bound
    over the bolts of the layout; for the value of one bolt position (e.g. to sum
    per 3.7(1)) pass only that position's distances, e.g. an inner bolt:
    ``e_1=None, p_1=p_1, e_2=None, p_2=p_2``. Inputs are validated here as in
    :func:`check_bolt_bearing`. A distance below the Table 3.3 minimum (e >= 1.2 d_0,
    p_1 >= 2.2 d_0, p_2 >= 2.4 d_0), where the Table 3.4 factors lose meaning, gives 0.

    ``nothing_ahead=True`` with ``e_1 = p_1 = None``: the bolt bears towards neither a free edge nor
    another bolt within the member (e.g. a beam-web bolt bearing into the beam, away from its end);
    alpha_d then does not limit and alpha_b = min(f_ub/f_u, 1.0) (Table 3.4 with alpha_d taken as 1.0).
    """
    bolt = _bolt(bolt)
    t = require_positive("t", t, "mm")
    f_u = require_positive("f_u", f_u, "MPa")
    e_1, e_2, p_1, p_2 = (_opt_pos("e_1", e_1), _opt_pos("e_2", e_2), _opt_pos("p_1", p_1), _opt_pos("p_2", p_2))
    require_choice("hole", hole, tuple(K_HOLE_BEARING))
    gamma_M2 = require_positive("gamma_M2", gamma_M2)
    calc = calc if calc is not None else Calc()
    bad = _bearing_geometry(bolt, hole, e_1, e_2, p_1, p_2, nothing_ahead=nothing_ahead)
    if bad:
        return _below_minima(calc, bad)
    return _bearing(bolt, t, f_u, e_1, e_2, p_1, p_2, hole, gamma_M2, calc)


def _bearing_geometry(bolt: Bolt, hole: str, e_1, e_2, p_1, p_2, nothing_ahead: bool = False) -> list[str]:
    """Required positions present; returns the distances below the Table 3.3 minima (text, empty if none)."""
    if e_1 is None and p_1 is None and not nothing_ahead:
        raise InputError("e_1/p_1", None, "an end distance or a pitch in the direction of the load")
    if e_2 is None and p_2 is None:
        raise InputError("e_2/p_2", None, "an edge distance or a gauge across the load (k_1, Table 3.4)",
                         "Where no edge is near, give the real distance to the nearest free edge")
    d_0 = bolt.d_0 if hole == "normal" else bolt.d_0_oversize
    return [f"{name} = {v:g} mm, less than {k:g} d_0 = {k * d_0:g} mm"
            for name, v, k in (("e_1", e_1, 1.2), ("e_2", e_2, 1.2), ("p_1", p_1, 2.2), ("p_2", p_2, 2.4))
            if v is not None and v < k * d_0 - 1e-9]


def _below_minima(calc: Calc, bad: list[str]) -> float:
    calc.note("Below the EN 1993-1-8 Table 3.3 minima (" + "; ".join(bad)
              + "): Table 3.4 does not apply, bearing resistance taken as 0.")
    return 0.0


def _bearing(bolt: Bolt, t: float, f_u: float, e_1: float | None, e_2: float | None, p_1: float | None,
             p_2: float | None, hole: str, gamma_M2: float, calc: Calc) -> float:
    d_0 = bolt.d_0 if hole == "normal" else bolt.d_0_oversize
    ad = []
    if e_1 is not None:
        ad.append(calc(alpha_d_end, e_1=e_1, d_0=d_0))
    if p_1 is not None:
        ad.append(calc(alpha_d_inner, p_1=p_1, d_0=d_0))
    if len(ad) > 1:
        calc.note("The smaller $\\alpha_{d}$ (end or inner bolt) governs.")
    if not ad:
        calc.note("No free edge and no other bolt ahead in the direction of the force within the member: "
                  "$\\alpha_{d}$ does not limit (taken as 1.0).")
        ad.append(1.0)
    a_b = calc(alpha_b, alpha_d=min(ad), f_ub=bolt.f_ub, f_u=f_u)
    if e_2 is not None and p_2 is not None:
        k1 = calc(k_1_edge, e_2=e_2, p_2=p_2, d_0=d_0)
    elif e_2 is not None:
        k1 = calc(k_1_edge_single, e_2=e_2, d_0=d_0)
    elif p_2 is not None:
        k1 = calc(k_1_inner, p_2=p_2, d_0=d_0)
    else:  # pragma: no cover - excluded by _bearing_geometry
        raise InputError("e_2/p_2", None, "an edge distance or a gauge across the load")
    return calc(F_b_Rd, k_1=k1, alpha_b=a_b, f_u=f_u, d=bolt.d, t=t, gamma_M2=gamma_M2,
                k_hole=K_HOLE_BEARING[hole])


def check_bolt_bearing(bolt: Bolt, F_b_Ed: float, t: float, f_u: float, e_1: float | None,
                       e_2: float | None = None, p_1: float | None = None, p_2: float | None = None, *,
                       direction: str = "parallel", hole: str = "normal", single_lap_one_bolt: bool = False,
                       na: NationalAnnex = UK_NA, calc: Calc | None = None, id: str = "bolt_bearing",
                       title: str = "Bolt bearing", location_mm: float | None = None) -> CheckRecord:
    """Bearing of one bolt on a ply of thickness ``t`` (mm) and tensile strength ``f_u`` (MPa).

    EN 1993-1-8:2005, 3.6.1, Table 3.4. ``e_1, p_1`` are the ply's end distance and
    pitch along its axis 1, ``e_2, p_2`` across it (mm; ``None`` = not present).
    ``direction='parallel'``: load along axis 1; ``'perpendicular'``: load across,
    so the roles swap (e_1 <-> e_2, p_1 <-> p_2) as the table defines e_1, p_1 in
    the direction of load transfer. The governing (smallest) bolt position is
    used. ``hole='oversize'`` applies 0.8 (Table 3.4 note 1).
    ``single_lap_one_bolt`` caps at 1.5 f_u d t / gamma_M2 (3.6.1(10)). Below the
    Table 3.3 minima the resistance is 0 with a note (the check fails; see check_spacing).
    """
    bolt = _bolt(bolt)
    na = _na(na)
    F_b_Ed = require_non_negative("F_b_Ed", F_b_Ed, "N")
    t = require_positive("t", t, "mm")
    f_u = require_positive("f_u", f_u, "MPa")
    e_1, e_2, p_1, p_2 = (_opt_pos("e_1", e_1), _opt_pos("e_2", e_2), _opt_pos("p_1", p_1), _opt_pos("p_2", p_2))
    require_choice("direction", direction, ("parallel", "perpendicular"))
    require_choice("hole", hole, tuple(K_HOLE_BEARING))
    if direction == "perpendicular":
        e_1, e_2, p_1, p_2 = e_2, e_1, p_2, p_1
    bad = _bearing_geometry(bolt, hole, e_1, e_2, p_1, p_2)
    calc = calc if calc is not None else Calc()
    if bad:
        F_Rd = _below_minima(calc, bad)
    else:
        F_Rd = _bearing(bolt, t, f_u, e_1, e_2, p_1, p_2, hole, na.gamma_M2, calc)
    if single_lap_one_bolt:
        F_Rd = min(F_Rd, calc(F_b_Rd_lap, f_u=f_u, d=bolt.d, t=t, gamma_M2=na.gamma_M2))
    calc.keep("F_b_Rd", F_Rd, "N")
    return calc.record(id=id, title=title, clause="EN 1993-1-8:2005, 3.6.1, Table 3.4",
                       demand=F_b_Ed, resistance=F_Rd, unit="N", location_mm=location_mm,
                       note=f"{bolt.size} in {hole} hole, t = {t:g} mm, load {direction} to axis 1")


def check_bolt_tension(bolt: Bolt, F_t_Ed: float, *, countersunk: bool = False, t_p: float | None = None,
                       f_u_p: float | None = None, na: NationalAnnex = UK_NA, calc: Calc | None = None,
                       id: str = "bolt_tension", title: str = "Bolt tension",
                       location_mm: float | None = None) -> CheckRecord:
    """Tension of one bolt, EN 1993-1-8:2005, 3.6.1, Table 3.4 (k_2 = 0.9, 0.63 countersunk).

    With ``t_p`` (mm) and ``f_u_p`` (MPa) the punching shear B_p,Rd of that plate
    is included and the smaller resistance governs.
    """
    bolt = _bolt(bolt)
    na = _na(na)
    F_t_Ed = require_non_negative("F_t_Ed", F_t_Ed, "N")
    if (t_p is None) != (f_u_p is None):
        raise InputError("t_p/f_u_p", (t_p, f_u_p), "both the plate thickness and its f_u, or neither")
    if t_p is not None:
        t_p = require_positive("t_p", t_p, "mm")
        f_u_p = require_positive("f_u_p", f_u_p, "MPa")
    calc = calc if calc is not None else Calc()
    F_Rd = calc(F_t_Rd, f_ub=bolt.f_ub, A_s=bolt.A_s, gamma_M2=na.gamma_M2, k_2=0.63 if countersunk else 0.9)
    calc.keep("F_t_Rd", F_Rd, "N")
    if t_p is not None:
        B = calc(B_p_Rd, d_m=bolt.d_m, t_p=t_p, f_u=f_u_p, gamma_M2=na.gamma_M2)
        calc.keep("B_p_Rd", B, "N")
        F_Rd = min(F_Rd, B)
    return calc.record(id=id, title=title, clause="EN 1993-1-8:2005, 3.6.1, Table 3.4",
                       demand=F_t_Ed, resistance=F_Rd, unit="N", location_mm=location_mm,
                       note=f"{bolt.size} {bolt.bolt_class}")


def check_punching(bolt: Bolt, F_t_Ed: float, t_p: float, f_u: float, *, na: NationalAnnex = UK_NA,
                   calc: Calc | None = None, id: str = "bolt_punching", title: str = "Punching shear under bolt head/nut",
                   location_mm: float | None = None) -> CheckRecord:
    """Punching shear B_p,Rd of a plate t_p (mm), f_u (MPa), EN 1993-1-8:2005, 3.6.1, Table 3.4.

    d_m is the mean of across flats and across corners of the ordinary nut (see :attr:`Bolt.d_m`).
    """
    bolt = _bolt(bolt)
    na = _na(na)
    F_t_Ed = require_non_negative("F_t_Ed", F_t_Ed, "N")
    t_p = require_positive("t_p", t_p, "mm")
    f_u = require_positive("f_u", f_u, "MPa")
    calc = calc if calc is not None else Calc()
    B = calc(B_p_Rd, d_m=bolt.d_m, t_p=t_p, f_u=f_u, gamma_M2=na.gamma_M2)
    calc.keep("d_m", bolt.d_m, "mm")
    return calc.record(id=id, title=title, clause="EN 1993-1-8:2005, 3.6.1, Table 3.4",
                       demand=F_t_Ed, resistance=B, unit="N", location_mm=location_mm)


def check_shear_tension(bolt: Bolt, F_v_Ed: float, F_t_Ed: float, *, n_s: int = 1,
                        threads_in_shear_plane: bool = True, countersunk: bool = False,
                        na: NationalAnnex = UK_NA, calc: Calc | None = None, id: str = "bolt_shear_tension",
                        title: str = "Bolt shear and tension", location_mm: float | None = None) -> CheckRecord:
    """Combined shear and tension, EN 1993-1-8:2005, 3.6.1, Table 3.4.

    Utilisation = max(F_v,Ed/F_v,Rd + F_t,Ed/(1.4 F_t,Rd), F_t,Ed/F_t,Rd): the table
    also requires the tension alone to be within F_t,Rd.
    """
    bolt = _bolt(bolt)
    na = _na(na)
    F_v_Ed = require_non_negative("F_v_Ed", F_v_Ed, "N")
    F_t_Ed = require_non_negative("F_t_Ed", F_t_Ed, "N")
    n_s = _count("n_s", n_s)
    calc = calc if calc is not None else Calc()
    a_v = shear_factor_alpha_v(bolt.bolt_class, threads_in_shear_plane)
    area = bolt.A_s if threads_in_shear_plane else bolt.A
    Fv = n_s * calc(F_v_Rd, alpha_v=a_v, f_ub=bolt.f_ub, A_s=area, gamma_M2=na.gamma_M2)
    Ft = calc(F_t_Rd, f_ub=bolt.f_ub, A_s=bolt.A_s, gamma_M2=na.gamma_M2, k_2=0.63 if countersunk else 0.9)
    U = calc(U_vt, F_v_Ed=F_v_Ed, F_v_Rd=Fv, F_t_Ed=F_t_Ed, F_t_Rd=Ft)
    calc.keep("F_v_Rd", Fv, "N")
    calc.keep("F_t_Rd", Ft, "N")
    calc.keep("U_vt", U)
    return calc.record(id=id, title=title, clause="EN 1993-1-8:2005, 3.6.1, Table 3.4",
                       demand=max(U, F_t_Ed / Ft), resistance=1.0, unit="", location_mm=location_mm,
                       note="utilisation = max(interaction, F_t,Ed/F_t,Rd)")


def check_slip(bolt: Bolt, F_v_Ed: float, *, category: str = "B", n: int = 1, surface_class: str = "A",
               hole: str = "normal", F_t_Ed: float = 0.0, na: NationalAnnex = UK_NA, calc: Calc | None = None,
               id: str = "bolt_slip", title: str | None = None, location_mm: float | None = None) -> CheckRecord:
    """Slip resistance of one preloaded bolt (class 8.8 / 10.9), EN 1993-1-8:2005, 3.9.

    ``category`` 'B' (slip-resistant at SLS): F_v_Ed and F_t_Ed are serviceability
    values and gamma_M3,ser is used; 'C' (at ULS): design values and gamma_M3
    (3.4.1(1)). ``n`` friction surfaces; ``surface_class`` A-D (Table 3.7);
    ``hole`` for k_s (Table 3.6). With tension, Eq. 3.8a/b. Categories B and C
    also need the ULS bearing check (and C the net section at f_y, 3.4.1(1)c).
    """
    bolt = _bolt(bolt)
    na = _na(na)
    require_choice("category", category, ("B", "C"))
    if bolt.bolt_class not in PRELOAD_CLASSES:
        raise InputError("bolt_class", bolt.bolt_class, "8.8 or 10.9 for preloaded bolts (EN 1993-1-8 3.1.2(1))")
    F_v_Ed = require_non_negative("F_v_Ed", F_v_Ed, "N")
    F_t_Ed = require_non_negative("F_t_Ed", F_t_Ed, "N")
    n = _count("n", n)
    k_s = slip_factor_k_s(hole)
    mu = friction_mu(surface_class)
    gM3 = na.gamma_M3_ser if category == "B" else na.gamma_M3
    calc = calc if calc is not None else Calc()
    Fp = calc(F_p_C, f_ub=bolt.f_ub, A_s=bolt.A_s)
    if F_t_Ed > 0.0:
        Fs = calc(F_s_Rd_t, k_s=k_s, n=n, mu=mu, F_p_C=Fp, F_t_Ed=F_t_Ed, gamma_M3=gM3)
        cl = "EN 1993-1-8:2005, 3.9.2, Eq. 3.8"
    else:
        Fs = calc(F_s_Rd, k_s=k_s, n=n, mu=mu, F_p_C=Fp, gamma_M3=gM3)
        cl = "EN 1993-1-8:2005, 3.9.1, Eq. 3.6"
    Fs = max(Fs, 0.0)
    calc.keep("F_p_C", Fp, "N")
    calc.keep("k_s", k_s)
    calc.keep("mu", mu)
    t = title or f"Bolt slip, category {category} ({'SLS' if category == 'B' else 'ULS'})"
    return calc.record(id=id, title=t, clause=cl, demand=F_v_Ed, resistance=Fs, unit="N",
                       location_mm=location_mm,
                       note=f"{bolt.size} {bolt.bolt_class} preloaded, class {surface_class} surfaces, {hole} holes")


def check_bolt_group(F_Ed: float, F_v_Rd_each: float, F_b_Rd_each: Sequence[float], *,
                     calc: Calc | None = None, id: str = "bolt_group", title: str = "Bolt group resistance",
                     location_mm: float | None = None) -> CheckRecord:
    """Resistance of a group of fasteners, EN 1993-1-8:2005, 3.7(1).

    F_Ed: force on the group, N. F_v_Rd_each: shear resistance of one fastener
    (all planes, reduced), N. F_b_Rd_each: bearing resistance of each fastener, N
    (governing ply per fastener).
    """
    F_Ed = require_non_negative("F_Ed", F_Ed, "N")
    Fv = require_positive("F_v_Rd_each", F_v_Rd_each, "N")
    try:
        fb = [require_positive(f"F_b_Rd_each[{i}]", v, "N") for i, v in enumerate(F_b_Rd_each)]
    except TypeError:
        raise InputError("F_b_Rd_each", F_b_Rd_each, "a sequence of bearing resistances in N") from None
    if not fb:
        raise InputError("F_b_Rd_each", F_b_Rd_each, "at least one bearing resistance")
    calc = calc if calc is not None else Calc()
    F_Rd = calc(F_Rd_group, n=len(fb), F_v_Rd=Fv, F_b_Rd_max=max(fb), F_b_Rd_min=min(fb), F_b_Rd_sum=math.fsum(fb))
    return calc.record(id=id, title=title, clause="EN 1993-1-8:2005, 3.7(1)", demand=F_Ed, resistance=F_Rd,
                       unit="N", location_mm=location_mm, note=f"{len(fb)} fasteners")


__all__ = [
    "Bolt", "get_bolt", "BOLT_SIZES", "BOLT_CLASSES", "PRELOAD_CLASSES", "K_S", "MU", "K_HOLE_BEARING",
    "shear_factor_alpha_v", "slip_factor_k_s", "friction_mu",
    "F_v_Rd", "F_v_Rd_n", "alpha_d_end", "alpha_d_inner", "alpha_b", "k_1_edge", "k_1_edge_single",
    "k_1_inner", "F_b_Rd", "F_b_Rd_lap", "F_t_Rd", "B_p_Rd", "U_vt", "F_p_C", "F_s_Rd", "F_s_Rd_t",
    "beta_Lf", "beta_p", "F_Rd_group", "I_p", "F_r_Ed", "U_b_2d", "BEARING_2D_CONVENTION", "BEARING_2D_GUIDANCE",
    "POLAR_GUIDANCE", "BoltAssembly", "bolt_assembly", "bolt_length", "ASSEMBLY_CONVENTION", "bearing_resistance", "check_bolt_shear", "check_bolt_bearing", "check_bolt_tension", "check_punching",
    "check_shear_tension", "check_slip", "check_bolt_group",
]
