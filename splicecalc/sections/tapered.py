"""Existing sections found on survey: tapered flanges and historic designations.

Older British joists and beams were rolled with the inner faces of the flanges
sloping (a taper of a few degrees). A measured section with ``taper_deg > 0`` is
built here: ``tf`` is the flange thickness measured midway along the outstand
(a quarter of (b - tw) from the toe, where the old section tables quoted it;
from memory), so the flange is ``tf + tan(taper) (b - tw)/4`` thick at the web
face and ``tf - tan(taper) (b - tw)/4`` at the toe.

Properties come from the exact polygon of the shape (flanges with sloping inner
faces, web, and the four root fillets of radius ``r`` as spandrels, their arcs as
24-sided polylines) integrated by Green's theorem: A, I_y, I_z, W_el, W_pl are
exact for that polygon. I_t uses the rolled-section formula of
:func:`~splicecalc.sections.geometry.torsion_constant` with the parallel flange
term replaced by the tapered strip integral (sum of b t^3 / 3 over the varying
thickness); I_w = I_z (h - t_f)^2 / 4 (thin-walled approximation). Tests compare
with ``sectionproperties`` (finite elements on the same shape).

A historic designation such as ``"10 in x 5 in RSJ"`` given with measured
dimensions is a label: :func:`designation_check` compares its nominal inches
with the measured depth and width and refuses a mismatch above 10 %.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

from ..core.errors import InputError, require_in_range
from ..materials.steel import DENSITY_kg_per_m3
from .geometry import A_v_z, torsion_constant
from .section import MEASURED, Section, _check_dimensions

#: largest flange taper accepted (degrees); the old rolled tapers were well below this
TAPER_MAX_DEG = 15.0
_ARC_SEGMENTS = 24
_IMPERIAL_RE = re.compile(r"(\d+(?:\.\d+)?)\s*(?:in|\")?\s*[x×]\s*(\d+(?:\.\d+)?)\s*(?:in|\")", re.I)


def _quarter_polygon(h: float, b: float, tw: float, t1: float, t2: float, r: float) -> list[tuple[float, float]]:
    """Counter-clockwise outline of the quarter x >= 0, y >= 0 of the section (origin at the centroid)."""
    y1 = h / 2.0 - t1                 # flange inner face at the web face
    pts = [(0.0, 0.0), (tw / 2.0, 0.0)]
    if r > 0.0:
        cx, cy = tw / 2.0 + r, y1 - r
        for k in range(_ARC_SEGMENTS + 1):
            th = math.pi - (math.pi / 2.0) * k / _ARC_SEGMENTS
            pts.append((cx + r * math.cos(th), cy + r * math.sin(th)))
    else:
        pts.append((tw / 2.0, y1))
    pts += [(b / 2.0, h / 2.0 - t2), (b / 2.0, h / 2.0), (0.0, h / 2.0)]
    return pts


def _integrals(pts: list[tuple[float, float]]) -> tuple[float, float, float, float, float]:
    """(A, int y dA, int x dA, int y^2 dA, int x^2 dA) of a closed polygon (Green's theorem)."""
    A = Sy = Sx = Iyy = Ixx = 0.0
    n = len(pts)
    for i in range(n):
        x0, y0 = pts[i]
        x1, y1 = pts[(i + 1) % n]
        c = x0 * y1 - x1 * y0
        A += c
        Sy += (y0 + y1) * c
        Sx += (x0 + x1) * c
        Iyy += (y0 * y0 + y0 * y1 + y1 * y1) * c
        Ixx += (x0 * x0 + x0 * x1 + x1 * x1) * c
    return A / 2.0, Sy / 6.0, Sx / 6.0, Iyy / 12.0, Ixx / 12.0


def flange_thicknesses(b: float, tw: float, tf: float, taper_deg: float) -> tuple[float, float]:
    """(thickness at the web face, thickness at the toe) of a tapered flange, tf measured midway (mm)."""
    d = math.tan(math.radians(taper_deg)) * (b - tw) / 4.0
    return tf + d, tf - d


@dataclass(frozen=True)
class TaperedSection(Section):
    """A measured I section whose flanges taper (inner faces sloping by ``taper_deg``).

    Same attributes as :class:`Section` (``tf`` = mean flange thickness) plus
    ``taper_deg``, ``tf_root`` and ``tf_toe`` (mm).
    """

    taper_deg: float = 0.0

    def __post_init__(self) -> None:
        dims = _check_dimensions(self.h, self.b, self.tw, self.tf, self.r, where=self.designation)
        h, b, tw, tf, r = dims
        a = require_in_range(f"{self.designation}.taper", self.taper_deg, 0.0, TAPER_MAX_DEG, "degrees")
        t1, t2 = flange_thicknesses(b, tw, tf, a)
        if t2 <= 0.5 * tf:
            raise InputError(f"{self.designation}.taper", self.taper_deg,
                             f"a taper leaving the flange toe at least tf/2 thick (toe {t2:.1f} mm)")
        if not 2.0 * (t1 + r) < h:
            raise InputError(f"{self.designation}.tf", tf, "a flange and root that leave a web between them")
        for name, value in zip(("h", "b", "tw", "tf", "r"), dims):
            object.__setattr__(self, name, value)
        A4, Sy, Sx, Iyy, Ixx = _integrals(_quarter_polygon(h, b, tw, t1, t2, r))
        A = 4.0 * A4
        Iy, Iz = 4.0 * Iyy, 4.0 * Ixx
        hw = h - 2.0 * tf
        c = (b - tw) / 2.0
        It = (torsion_constant(h, b, tw, tf, r) - 2.0 * b * tf**3 / 3.0
              + 2.0 * (tw * t1**3 / 3.0 + 2.0 * c * (t1 + t2) * (t1**2 + t2**2) / 12.0))
        c_fl = (b - tw - 2.0 * r) / 2.0
        vals = {
            "A": A, "Av_z": A_v_z(A=A, b=b, t_f=tf, t_w=tw, r=r, h_w=hw), "hw": hw, "d": h - 2.0 * t1 - 2.0 * r,
            "Iy": Iy, "Iz": Iz, "Wel_y": Iy / (h / 2.0), "Wel_z": Iz / (b / 2.0), "Wpl_y": 4.0 * Sy,
            "Wpl_z": 4.0 * Sx, "iy": math.sqrt(Iy / A), "iz": math.sqrt(Iz / A), "It": It,
            "Iw": Iz * (h - tf) ** 2 / 4.0, "c_flange": c_fl, "c_tf": c_fl / tf,
            "c_tw": (h - 2.0 * t1 - 2.0 * r) / tw, "mass": A * 1e-6 * DENSITY_kg_per_m3,
        }
        for k, v in vals.items():
            object.__setattr__(self, k, v)
        object.__setattr__(self, "mass_nominal", vals["mass"])

    @property
    def tf_root(self) -> float:
        return flange_thicknesses(self.b, self.tw, self.tf, self.taper_deg)[0]

    @property
    def tf_toe(self) -> float:
        return flange_thicknesses(self.b, self.tw, self.tf, self.taper_deg)[1]


def designation_check(designation: str, h: float, b: float, field: str = "designation") -> str:
    """Compare an imperial designation ("10 in x 5 in ...") with the measured h and b (mm).

    Returns a note ('' when the label has no imperial size); a depth or width more than
    10 % away from the nominal inches raises InputError naming the field.
    """
    m = _IMPERIAL_RE.search(designation or "")
    if not m:
        return ""
    D, B = float(m.group(1)) * 25.4, float(m.group(2)) * 25.4
    for what, nominal, measured in (("depth", D, h), ("width", B, b)):
        if abs(measured - nominal) > 0.10 * nominal:
            raise InputError(field, designation,
                             f"a designation whose nominal {what} ({nominal:.0f} mm) is within 10 % of the measured "
                             f"{what} ({measured:g} mm)", "Check the survey or the label")
    return (f"historic designation {m.group(0)} (nominal {D:.0f} x {B:.0f} mm); properties from the measured "
            "dimensions")


def tapered_section(h: float, b: float, tw: float, tf: float, r: float, taper_deg: float,
                    designation: str = "measured (tapered flanges)") -> TaperedSection:
    """A measured section with tapered flanges (``tf`` midway along the outstand, mm; taper in degrees)."""
    if not isinstance(designation, str) or not designation.strip():
        raise InputError("designation", designation, "a non-empty text label")
    return TaperedSection(designation.strip(), MEASURED, h, b, tw, tf, r, 1.0, "measured, tapered flanges",
                          taper_deg=taper_deg)


__all__ = ["TaperedSection", "tapered_section", "designation_check", "flange_thicknesses", "TAPER_MAX_DEG"]
