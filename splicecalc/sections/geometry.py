"""Properties of a doubly symmetric rolled I or H section from its defining dimensions.

Dimensions (mm): overall depth ``h``, flange width ``b``, web thickness ``tw``,
flange thickness ``tf``, root radius ``r``. The section is two rectangular
flanges, a rectangular web and four root fillets; each fillet is the spandrel
left between an ``r x r`` square and a quarter circle of radius ``r``. Area,
second moments and plastic moduli are exact for that shape; the torsion
constant uses the usual empirical formula for rolled sections and the warping
constant the usual thin-walled approximation, as in the published section tables.

All results are plain floats in mm units (mm2, mm3, mm4, mm6).
"""

from __future__ import annotations

import math
from typing import NamedTuple

from ..core.clause import clause

#: area of one root fillet (spandrel) is _K_A * r**2
_K_A = 1.0 - math.pi / 4.0
#: centroid of a spandrel from each of the two straight sides is _K_E * r
_K_E = (10.0 - 3.0 * math.pi) / (12.0 - 3.0 * math.pi)
#: second moment of a spandrel about its own centroidal axis parallel to a straight side is _K_I * r**4
_K_I = (1.0 / 3.0 - (math.pi / 16.0 - (math.pi / 4.0) * (4.0 / (3.0 * math.pi)) ** 2
                     + (math.pi / 4.0) * (1.0 - 4.0 / (3.0 * math.pi)) ** 2)
        - _K_A * _K_E ** 2)


class Properties(NamedTuple):
    """Cross-section properties in mm units (see :func:`properties`)."""

    A: float
    Av_z: float
    hw: float
    d: float
    Iy: float
    Iz: float
    Wel_y: float
    Wel_z: float
    Wpl_y: float
    Wpl_z: float
    iy: float
    iz: float
    It: float
    Iw: float
    c_flange: float
    c_tf: float
    c_tw: float


@clause("EN 1993-1-1:2005, 6.2.6(3)(a)",
        units={"A": "mm2", "b": "mm", "t_f": "mm", "t_w": "mm", "r": "mm", "h_w": "mm"},
        returns="mm2",
        example=dict(A=11740.0, b=209.3, t_f=15.6, t_w=10.1, r=12.7, h_w=501.9, eta=1.0))
def A_v_z(A: float, b: float, t_f: float, t_w: float, r: float, h_w: float, eta: float = 1.0) -> float:
    """Shear area of a rolled I or H section, load parallel to the web (mm2).

    EN 1993-1-1:2005, 6.2.6(3)(a): ``A_v = A - 2 b t_f + (t_w + 2 r) t_f``
    but not less than ``eta h_w t_w``; ``eta`` from EN 1993-1-5 (1.0 in the UK NA).
    """
    A_v_0 = A - 2 * b * t_f + (t_w + 2 * r) * t_f
    A_v_min = eta * h_w * t_w
    A_v = max(A_v_0, A_v_min)
    return A_v


def torsion_constant(h: float, b: float, tw: float, tf: float, r: float) -> float:
    """St Venant torsion constant It of a rolled I section with root fillets (mm4).

    The empirical formula of El Darwish and Johnston (1965) used for the
    published UK and European section tables::

        It = 2/3 b tf^3 + 1/3 (h - 2 tf) tw^3 + 2 alpha D^4 - 0.420 tf^4
        alpha = -0.042 + 0.2204 tw/tf + 0.1355 r/tf - 0.0865 r tw/tf^2 - 0.0725 tw^2/tf^2
        D = ((tf + r)^2 + (r + tw/4) tw) / (2 r + tf)

    ``D`` is the diameter of the circle inscribed at the web-flange junction.
    The formula was fitted to rolled proportions; for unusual measured shapes
    the result is never taken below the sum of the torsion constants of the
    two flanges and the web taken apart (a strict lower bound, as the I shape
    contains the three rectangles).
    """
    alpha = (-0.042 + 0.2204 * tw / tf + 0.1355 * r / tf - 0.0865 * r * tw / tf ** 2
             - 0.0725 * tw ** 2 / tf ** 2)
    D = ((tf + r) ** 2 + (r + 0.25 * tw) * tw) / (2.0 * r + tf)
    It = (2.0 / 3.0) * b * tf ** 3 + (h - 2.0 * tf) * tw ** 3 / 3.0 + 2.0 * alpha * D ** 4 - 0.420 * tf ** 4
    lower = 2.0 * _rectangle_torsion(b, tf) + _rectangle_torsion(h - 2.0 * tf, tw)
    return max(It, lower)


def _rectangle_torsion(a: float, t: float) -> float:
    """Lower bound of the torsion constant of a solid a x t rectangle (mm4).

    ``(1/3) a t^3 (1 - 0.63 t/a)`` with ``a`` the long side (Roark, thick
    rectangle approximation; low by < 1 %, never high), zero if not positive.
    """
    long_, short = (a, t) if a >= t else (t, a)
    return max(long_ * short ** 3 / 3.0 * (1.0 - 0.63 * short / long_), 0.0)


def properties(h: float, b: float, tw: float, tf: float, r: float, eta: float = 1.0) -> Properties:
    """All derived properties of an I section (mm units); inputs are not validated here.

    * A, Iy, Iz, Wpl_y, Wpl_z: exact for flanges, web and four root fillets.
    * Wel_y = Iy / (h/2), Wel_z = Iz / (b/2); iy, iz radii of gyration.
    * Av_z: :func:`A_v_z` (EN 1993-1-1:2005, 6.2.6(3)(a)) with ``eta``.
    * It: :func:`torsion_constant`; Iw = Iz (h - tf)^2 / 4 (flange-centre-line
      approximation used in the section tables).
    * hw = h - 2 tf (web depth between flanges), d = hw - 2 r (depth between fillets),
      c_flange = (b - tw - 2 r)/2 (flange outstand, EN 1993-1-1 Table 5.2),
      c_tf = c_flange / tf, c_tw = d / tw.
    """
    hw = h - 2.0 * tf
    a_f = _K_A * r * r                     # one fillet
    e = _K_E * r                           # fillet centroid from the flange and from the web face
    i_f = _K_I * r ** 4                    # one fillet about its own centroid
    A = 2.0 * b * tf + hw * tw + 4.0 * a_f
    z_f = 0.5 * hw - e                     # fillet centroid from the y axis
    y_f = 0.5 * tw + e                     # fillet centroid from the z axis
    Iy = (b * h ** 3 - (b - tw) * hw ** 3) / 12.0 + 4.0 * (i_f + a_f * z_f ** 2)
    Iz = (2.0 * tf * b ** 3 + hw * tw ** 3) / 12.0 + 4.0 * (i_f + a_f * y_f ** 2)
    Wpl_y = b * tf * (h - tf) + 0.25 * tw * hw ** 2 + 4.0 * a_f * z_f
    Wpl_z = 0.5 * tf * b ** 2 + 0.25 * hw * tw ** 2 + 4.0 * a_f * y_f
    It = torsion_constant(h, b, tw, tf, r)
    Iw = Iz * (h - tf) ** 2 / 4.0
    c_flange = 0.5 * (b - tw - 2.0 * r)
    d = hw - 2.0 * r
    return Properties(
        A=A,
        Av_z=A_v_z(A=A, b=b, t_f=tf, t_w=tw, r=r, h_w=hw, eta=eta),
        hw=hw,
        d=d,
        Iy=Iy,
        Iz=Iz,
        Wel_y=2.0 * Iy / h,
        Wel_z=2.0 * Iz / b,
        Wpl_y=Wpl_y,
        Wpl_z=Wpl_z,
        iy=math.sqrt(Iy / A),
        iz=math.sqrt(Iz / A),
        It=It,
        Iw=Iw,
        c_flange=c_flange,
        c_tf=c_flange / tf,
        c_tw=d / tw,
    )


__all__ = ["A_v_z", "Properties", "properties", "torsion_constant"]
