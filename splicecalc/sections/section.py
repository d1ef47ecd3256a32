"""The :class:`Section` type and validated user-measured sections.

A section is defined by h, b, tw, tf, r (mm) and a nominal mass (kg/m); every
other property is computed once from geometry when the object is built
(:func:`splicecalc.sections.geometry.properties`).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from ..core.errors import InputError, require_in_range, require_positive
from ..materials.steel import DENSITY_kg_per_m3
from .geometry import properties

FAMILIES: tuple[str, ...] = ("UKB", "UKC", "IPE", "HEA", "HEB")
MEASURED = "MEASURED"
#: accepted range of any defining dimension (mm); r may also be 0
DIM_MIN_mm = 1.0
DIM_MAX_mm = 5000.0


@dataclass(frozen=True)
class Section:
    """A doubly symmetric rolled I or H section (all lengths in mm).

    Defining data: ``h`` depth, ``b`` flange width, ``tw`` web thickness,
    ``tf`` flange thickness, ``r`` root radius, ``mass_nominal`` (kg/m, from
    the designation or the product table). ``standard`` names the source of
    the dimensions.

    Computed in mm units: ``A`` (mm2), ``Av_z`` (mm2, EN 1993-1-1 6.2.6(3)(a),
    eta = 1.0), ``hw`` = h - 2 tf, ``d`` = hw - 2 r, ``Iy``, ``Iz`` (mm4),
    ``Wel_y``, ``Wel_z``, ``Wpl_y``, ``Wpl_z`` (mm3), ``iy``, ``iz`` (mm),
    ``It`` (mm4), ``Iw`` (mm6), ``mass`` (kg/m from A and 7850 kg/m3),
    ``c_flange`` (mm, outstand (b - tw - 2r)/2), ``c_tf`` = c_flange/tf, ``c_tw`` = d/tw.
    """

    designation: str
    family: str
    h: float
    b: float
    tw: float
    tf: float
    r: float
    mass_nominal: float
    standard: str = ""

    A: float = field(init=False, repr=False, compare=False)
    Av_z: float = field(init=False, repr=False, compare=False)
    hw: float = field(init=False, repr=False, compare=False)
    d: float = field(init=False, repr=False, compare=False)
    Iy: float = field(init=False, repr=False, compare=False)
    Iz: float = field(init=False, repr=False, compare=False)
    Wel_y: float = field(init=False, repr=False, compare=False)
    Wel_z: float = field(init=False, repr=False, compare=False)
    Wpl_y: float = field(init=False, repr=False, compare=False)
    Wpl_z: float = field(init=False, repr=False, compare=False)
    iy: float = field(init=False, repr=False, compare=False)
    iz: float = field(init=False, repr=False, compare=False)
    It: float = field(init=False, repr=False, compare=False)
    Iw: float = field(init=False, repr=False, compare=False)
    c_flange: float = field(init=False, repr=False, compare=False)
    c_tf: float = field(init=False, repr=False, compare=False)
    c_tw: float = field(init=False, repr=False, compare=False)
    mass: float = field(init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        dims = _check_dimensions(self.h, self.b, self.tw, self.tf, self.r, where=self.designation)
        for name, value in zip(("h", "b", "tw", "tf", "r"), dims):
            object.__setattr__(self, name, value)
        object.__setattr__(self, "mass_nominal",
                           require_positive(f"{self.designation}.mass_nominal", self.mass_nominal, "kg/m"))
        p = properties(*dims)
        for name, value in zip(p._fields, p):
            object.__setattr__(self, name, value)
        object.__setattr__(self, "mass", p.A * 1e-6 * DENSITY_kg_per_m3)

    # ----------------------------------------------------------------- output
    def to_dict(self) -> dict[str, Any]:
        """JSON-ready dict; every numeric key carries its unit (section-table units).

        Lengths in mm, areas in cm2, moduli in cm3, second moments and It in
        cm4, radii of gyration in cm, Iw in dm6 (1 dm6 = 1e12 mm6), masses in kg/m.
        """
        out: dict[str, Any] = {"designation": self.designation, "family": self.family}
        if self.standard:
            out["standard"] = self.standard
        for key, value, factor in _dict_fields(self):
            out[key] = _sig(value * factor)
        return out


def _dict_fields(s: Section) -> tuple[tuple[str, float, float], ...]:
    return (
        ("h_mm", s.h, 1.0), ("b_mm", s.b, 1.0), ("tw_mm", s.tw, 1.0), ("tf_mm", s.tf, 1.0),
        ("r_mm", s.r, 1.0), ("hw_mm", s.hw, 1.0), ("d_mm", s.d, 1.0),
        ("mass_nominal_kg_per_m", s.mass_nominal, 1.0), ("mass_kg_per_m", s.mass, 1.0),
        ("A_cm2", s.A, 1e-2), ("Av_z_cm2", s.Av_z, 1e-2),
        ("Iy_cm4", s.Iy, 1e-4), ("Iz_cm4", s.Iz, 1e-4),
        ("Wel_y_cm3", s.Wel_y, 1e-3), ("Wpl_y_cm3", s.Wpl_y, 1e-3),
        ("Wel_z_cm3", s.Wel_z, 1e-3), ("Wpl_z_cm3", s.Wpl_z, 1e-3),
        ("iy_cm", s.iy, 0.1), ("iz_cm", s.iz, 0.1),
        ("It_cm4", s.It, 1e-4), ("Iw_dm6", s.Iw, 1e-12),
        ("c_flange_mm", s.c_flange, 1.0), ("c_tf", s.c_tf, 1.0), ("c_tw", s.c_tw, 1.0),
    )


def _sig(x: float, digits: int = 6) -> float:
    """Round to ``digits`` significant figures (keeps small Iw values meaningful)."""
    return float(f"{x:.{digits}g}")


def _check_dimensions(h: Any, b: Any, tw: Any, tf: Any, r: Any, where: str = "") -> tuple[float, ...]:
    """Validate I-section dimensions; return them as floats. Raises InputError naming the field."""
    pre = f"{where}." if where else ""
    h_ = require_in_range(pre + "h", h, DIM_MIN_mm, DIM_MAX_mm, "mm")
    b_ = require_in_range(pre + "b", b, DIM_MIN_mm, DIM_MAX_mm, "mm")
    tw_ = require_in_range(pre + "tw", tw, DIM_MIN_mm, DIM_MAX_mm, "mm")
    tf_ = require_in_range(pre + "tf", tf, DIM_MIN_mm, DIM_MAX_mm, "mm")
    r_ = require_in_range(pre + "r", r, 0.0, DIM_MAX_mm, "mm")
    if not 2.0 * tf_ < h_:
        raise InputError(pre + "tf", tf, f"less than h/2 = {h_ / 2:g} mm (two flanges must fit in the depth)")
    if not tw_ < b_:
        raise InputError(pre + "tw", tw, f"less than the flange width b = {b_:g} mm")
    hw = h_ - 2.0 * tf_
    if not 2.0 * r_ < hw:
        raise InputError(pre + "r", r, f"less than (h - 2 tf)/2 = {hw / 2:g} mm (root fillets must fit "
                                       "in the web depth)")
    if not tw_ + 2.0 * r_ < b_:
        raise InputError(pre + "r", r, f"less than (b - tw)/2 = {(b_ - tw_) / 2:g} mm (root fillets must "
                                       "fit in the flange width)")
    return h_, b_, tw_, tf_, r_


def measured_section(h: Any, b: Any, tw: Any, tf: Any, r: Any, designation: str = "measured") -> Section:
    """A section from measured dimensions (mm), e.g. an existing beam found on survey.

    Checks that every dimension is a finite number from 1 mm to 5000 mm (``r`` may be 0)
    and that the shape is a possible I section: 2 tf < h, tw < b, 2 r < h - 2 tf
    and tw + 2 r < b. Raises :class:`~splicecalc.core.errors.InputError`
    naming the field. The nominal mass is the computed mass (7850 kg/m3).
    """
    if not isinstance(designation, str) or not designation.strip():
        raise InputError("designation", designation, "a non-empty text label")
    h_, b_, tw_, tf_, r_ = _check_dimensions(h, b, tw, tf, r)
    mass = properties(h_, b_, tw_, tf_, r_).A * 1e-6 * DENSITY_kg_per_m3
    return Section(designation.strip(), MEASURED, h_, b_, tw_, tf_, r_, mass, "measured")


__all__ = ["FAMILIES", "MEASURED", "Section", "measured_section"]
