"""The job file's ``[splices]`` table, parsed and validated into a :class:`SpliceSpec`.

Example (TOML)::

    [splices]
    pieces = 3                      # or positions = ["2.6 m", "5.0 m"], or access limits:
    max_piece_length = "3.0 m"      # and/or max_piece_mass = "250 kg"
    bolts = "M20 8.8"               # or "auto"
    category = "A"                  # A bearing, B slip-resistant at SLS, C slip-resistant at ULS
    friction_class = "A"            # A..D (categories B and C), EN 1090-2 Table 18
    flange_plates = "outer"         # or "outer+inner"
    plate_grade = "S355"
    min_design_moment = 0.0         # fraction of the beam's moment resistance M_c,Rd
    clearance = "300 mm"            # keep splices this far from supports, point loads, restraints
    gap = "10 mm"                   # gap between the beam ends
    packing = "0 mm"                # packing thickness in the flange joint, EN 1993-1-8 3.6.1(12)
    exposed = false                 # edges exposed to weather: Table 3.3 maxima 4t + 40 mm
    holes = "normal"                # or "oversize" (EN 1090-2 clearances; bearing x 0.8, k_s = 0.85)
    mass_margin = "3 %"             # added to every piece mass for an access limit (0 to 20 %; or 0.03)
    slip = "computed"               # category A: deflection from hole clearance computed ("ignored", or "1.5 mm")
    [splices.cost]                  # cost = per_bolt * n_bolts + per_kg * plate mass (kg)
    per_bolt = 1.0
    per_kg = 0.5
    [splices.layout.flange]         # optional: checked as given
    rows = 3; columns = 2; pitch = "70 mm"; gauge = "100 mm"; plate = "15 mm"; inner_plate = "15 mm"
    [splices.layout.web]
    rows = 4; columns = 1; pitch = "70 mm"; gauge = "60 mm"; plate = "8 mm"

Layout words (used throughout the splice package):

* flange group: ``columns`` = bolt lines along the beam across the flange width
  (2 or 4, symmetric about the web), ``rows`` = bolt rows along the beam on *each*
  side of the joint, ``pitch`` = p1 along the beam, ``gauge`` = cross-centres of the
  two lines either side of the web, ``gauge_outer`` = p2 between the inner and outer
  line on one side (4 columns only), ``plate`` / ``inner_plate`` = thicknesses.
* web group: ``rows`` = bolts one above the other, ``columns`` = vertical lines on
  each side of the joint, ``pitch`` = p1 vertical, ``gauge`` = p2 horizontal,
  ``plate`` = thickness of each of the two web plates.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from ...core.errors import InputError, require_choice, require_in_range
from ...core.units import parse_quantity
from ...materials.steel import normalise_grade

BOLT_SIZES: tuple[str, ...] = ("M12", "M16", "M20", "M22", "M24", "M27", "M30", "M36")
BOLT_CLASSES: tuple[str, ...] = ("4.6", "5.6", "8.8", "10.9")
CATEGORIES: tuple[str, ...] = ("A", "B", "C")
FRICTION_CLASSES: tuple[str, ...] = ("A", "B", "C", "D")
FLANGE_PLATES: tuple[str, ...] = ("outer", "outer+inner")


@dataclass(frozen=True)
class FlangeLayout:
    """Flange bolt group and cover plates (mm). ``inner_plate`` 0 = outer plate only.

    ``e1``: end distance (plate end and beam end to the nearest row), ``e2``:
    edge distance of the outer plate; ``None`` = derived (e1 from the bolt,
    e2 from the plate width).
    """

    rows: int
    columns: int
    pitch: float
    gauge: float
    plate: float
    inner_plate: float = 0.0
    gauge_outer: float = 0.0
    e1: float | None = None
    plate_width: float | None = None


@dataclass(frozen=True)
class WebLayout:
    """Web bolt group and the pair of web plates (mm). ``e1``: horizontal end distance
    (beam end and plate end to the nearest column); ``e_v``: vertical edge distance
    of the plate (top and bottom bolt to plate edge)."""

    rows: int
    columns: int
    pitch: float
    gauge: float
    plate: float
    e1: float | None = None
    e_v: float | None = None


@dataclass(frozen=True)
class SpliceLayout:
    """A complete splice layout: bolt, flange group, web group."""

    bolt_size: str
    bolt_class: str
    flange: FlangeLayout
    web: WebLayout


@dataclass(frozen=True)
class SpliceSpec:
    """Validated ``[splices]`` options; lengths in mm, masses in kg."""

    pieces: int | None = None
    positions: tuple[float, ...] = ()
    max_piece_length: float | None = None
    max_piece_mass: float | None = None
    bolts: str = "auto"
    category: str = "A"
    friction_class: str = "A"
    flange_plates: str = "outer"
    plate_grade: str = "S355"
    min_design_moment: float = 0.0
    clearance: float = 300.0
    gap: float = 10.0
    packing: float = 0.0
    exposed: bool = False
    holes: str = "normal"
    threads_in_shear_plane: bool = True
    cost_per_bolt: float = 1.0
    cost_per_kg: float = 0.5
    mass_margin: float = 0.0
    slip: str = "computed"
    slip_mm: float | None = None
    flange: FlangeLayout | None = None
    web: WebLayout | None = None

    @property
    def bolt_size(self) -> str | None:
        return None if self.bolts == "auto" else self.bolts.split()[0]

    @property
    def bolt_class(self) -> str | None:
        return None if self.bolts == "auto" else self.bolts.split()[1]

    @property
    def layout_given(self) -> bool:
        return self.flange is not None and self.web is not None and self.bolts != "auto"


_KEYS = {"pieces", "positions", "max_piece_length", "max_piece_mass", "bolts", "category",
         "friction_class", "flange_plates", "plate_grade", "min_design_moment", "clearance", "gap",
         "packing", "exposed", "threads_in_shear_plane", "cost", "layout", "holes", "mass_margin", "slip"}
_FLANGE_KEYS = {"rows", "columns", "pitch", "gauge", "plate", "inner_plate", "gauge_outer", "e1",
                "plate_width"}
_WEB_KEYS = {"rows", "columns", "pitch", "gauge", "plate", "e1", "e_v"}


def _int(field: str, v: Any, lo: int, hi: int) -> int:
    if isinstance(v, bool) or not isinstance(v, int):
        raise InputError(field, v, f"a whole number from {lo} to {hi}")
    require_in_range(field, v, lo, hi)
    return int(v)


def _length(field: str, v: Any, lo: float = 0.0, hi: float = 1e9, positive: bool = True) -> float:
    x = parse_quantity(v, "mm", field)
    if (positive and x <= 0.0) or x < lo or x > hi:
        raise InputError(field, v, f"a length {'> 0' if positive else '>= 0'}"
                         + (f" and <= {hi:g} mm" if hi < 1e9 else ""))
    return x


def parse_bolts(field: str, v: Any) -> str:
    """'M20 8.8' -> 'M20 8.8'; 'auto' -> 'auto'."""
    if not isinstance(v, str):
        raise InputError(field, v, "'auto' or a bolt such as 'M20 8.8'")
    s = " ".join(v.strip().split())
    if s.lower() == "auto":
        return "auto"
    parts = s.upper().split(" ")
    if len(parts) != 2 or parts[0] not in BOLT_SIZES or parts[1] not in BOLT_CLASSES:
        raise InputError(field, v, f"'auto' or '<size> <class>' with size one of {', '.join(BOLT_SIZES)} "
                         f"and class one of {', '.join(BOLT_CLASSES)}, e.g. 'M20 8.8'")
    return f"{parts[0]} {parts[1]}"


def parse_mass_margin(field: str, v: Any) -> float:
    """'3 %' / '3%' / 0.03 -> 0.03; a fraction from 0 to 0.20 (0 to 20 %)."""
    allowed = "a margin from 0 to 20 %, e.g. '3 %' or 0.03"
    if isinstance(v, bool):
        raise InputError(field, v, allowed)
    if isinstance(v, str):
        t = v.strip()
        if not t.endswith("%"):
            raise InputError(field, v, allowed)
        try:
            x = float(t[:-1].strip()) / 100.0
        except ValueError:
            raise InputError(field, v, allowed) from None
    elif isinstance(v, (int, float)):
        x = float(v)
    else:
        raise InputError(field, v, allowed)
    if not (0.0 <= x <= 0.20):
        raise InputError(field, v, allowed, "Write the margin as a percentage, e.g. '3 %' for rolling tolerance.")
    return x


def parse_slip(field: str, v: Any) -> tuple[str, float | None]:
    """'computed' | 'ignored' | a slip per flange joint with units ('1.5 mm') -> (mode, mm or None)."""
    allowed = "'computed' (from the hole clearance), 'ignored', or a slip with units such as '2 mm'"
    if isinstance(v, str):
        t = v.strip().lower()
        if t in ("computed", "ignored"):
            return t, None
        try:
            x = parse_quantity(v, "mm", field)
        except InputError:
            raise InputError(field, v, allowed) from None
        if not (0.0 <= x <= 10.0):
            raise InputError(field, v, "a slip from 0 to 10 mm (e.g. '2 mm'), 'computed' or 'ignored'")
        return "given", x
    raise InputError(field, v, allowed)


def _check_keys(field: str, table: dict, allowed: set[str]) -> None:
    if not isinstance(table, dict):
        raise InputError(field, table, "a table of options")
    for k in table:
        if k not in allowed:
            raise InputError(f"{field}.{k}", table[k], f"a known key ({', '.join(sorted(allowed))})")


def _parse_flange(t: dict) -> FlangeLayout:
    f = "splices.layout.flange"
    _check_keys(f, t, _FLANGE_KEYS)
    for k in ("rows", "columns", "pitch", "gauge", "plate"):
        if k not in t:
            raise InputError(f"{f}.{k}", None, "a value (rows, columns, pitch, gauge and plate are required)")
    cols = _int(f"{f}.columns", t["columns"], 2, 4)
    if cols == 3:
        raise InputError(f"{f}.columns", cols, "2 or 4 (bolt lines symmetric about the web)")
    if cols == 4 and "gauge_outer" not in t:
        raise InputError(f"{f}.gauge_outer", None, "a length > 0 (the second bolt line's spacing) when columns = 4")
    return FlangeLayout(
        rows=_int(f"{f}.rows", t["rows"], 1, 12), columns=cols,
        pitch=_length(f"{f}.pitch", t["pitch"], hi=400.0), gauge=_length(f"{f}.gauge", t["gauge"], hi=600.0),
        plate=_length(f"{f}.plate", t["plate"], hi=100.0),
        inner_plate=_length(f"{f}.inner_plate", t["inner_plate"], hi=100.0) if "inner_plate" in t else 0.0,
        gauge_outer=_length(f"{f}.gauge_outer", t["gauge_outer"], hi=300.0) if "gauge_outer" in t else 0.0,
        e1=_length(f"{f}.e1", t["e1"], hi=300.0) if "e1" in t else None,
        plate_width=_length(f"{f}.plate_width", t["plate_width"], hi=1000.0) if "plate_width" in t else None)


def _parse_web(t: dict) -> WebLayout:
    f = "splices.layout.web"
    _check_keys(f, t, _WEB_KEYS)
    for k in ("rows", "columns", "pitch", "plate"):
        if k not in t:
            raise InputError(f"{f}.{k}", None, "a value (rows, columns, pitch and plate are required)")
    cols = _int(f"{f}.columns", t["columns"], 1, 4)
    gauge = _length(f"{f}.gauge", t["gauge"], hi=300.0) if "gauge" in t else 0.0
    if cols > 1 and gauge <= 0.0:
        raise InputError(f"{f}.gauge", t.get("gauge"), "a length > 0 when columns > 1")
    return WebLayout(
        rows=_int(f"{f}.rows", t["rows"], 1, 30), columns=cols,
        pitch=_length(f"{f}.pitch", t["pitch"], hi=400.0), gauge=gauge,
        plate=_length(f"{f}.plate", t["plate"], hi=100.0),
        e1=_length(f"{f}.e1", t["e1"], hi=300.0) if "e1" in t else None,
        e_v=_length(f"{f}.e_v", t["e_v"], hi=300.0) if "e_v" in t else None)


def parse_splices(table: dict) -> SpliceSpec:
    """Parse and validate the ``[splices]`` table; bad values raise InputError naming the key."""
    if table is None:
        table = {}
    _check_keys("splices", table, _KEYS)
    kw: dict[str, Any] = {}
    if "pieces" in table:
        kw["pieces"] = _int("splices.pieces", table["pieces"], 1, 50)
    if "positions" in table:
        pos = table["positions"]
        if not isinstance(pos, (list, tuple)):
            raise InputError("splices.positions", pos, "a list of lengths, e.g. ['2.6 m', '5.0 m']")
        xs = tuple(_length(f"splices.positions[{i + 1}]", p) for i, p in enumerate(pos))
        if any(b <= a for a, b in zip(xs, xs[1:])):
            raise InputError("splices.positions", pos, "positions in increasing order")
        if "pieces" in kw and kw["pieces"] != len(xs) + 1:
            raise InputError("splices.pieces", kw["pieces"], f"{len(xs) + 1} (one more than the number of positions)")
        kw["positions"] = xs
    if "max_piece_length" in table:
        kw["max_piece_length"] = _length("splices.max_piece_length", table["max_piece_length"])
    if "max_piece_mass" in table:
        kw["max_piece_mass"] = parse_quantity(table["max_piece_mass"], "kg", "splices.max_piece_mass")
        if kw["max_piece_mass"] <= 0:
            raise InputError("splices.max_piece_mass", table["max_piece_mass"], "a mass > 0, e.g. '250 kg'")
    if "bolts" in table:
        kw["bolts"] = parse_bolts("splices.bolts", table["bolts"])
    if "category" in table:
        c = table["category"]
        kw["category"] = require_choice("splices.category", c.strip().upper() if isinstance(c, str) else c, CATEGORIES)
    if "friction_class" in table:
        c = table["friction_class"]
        kw["friction_class"] = require_choice("splices.friction_class",
                                              c.strip().upper() if isinstance(c, str) else c, FRICTION_CLASSES)
    if "flange_plates" in table:
        c = table["flange_plates"]
        kw["flange_plates"] = require_choice("splices.flange_plates",
                                             c.strip().lower().replace(" ", "") if isinstance(c, str) else c,
                                             FLANGE_PLATES)
    if "plate_grade" in table:
        try:
            kw["plate_grade"] = normalise_grade(table["plate_grade"])
        except InputError as e:
            raise InputError("splices.plate_grade", table["plate_grade"], e.allowed) from None
    if "min_design_moment" in table:
        v = table["min_design_moment"]
        if isinstance(v, bool) or not isinstance(v, (int, float)):
            raise InputError("splices.min_design_moment", v, "a fraction of M_c,Rd from 0 to 1")
        kw["min_design_moment"] = require_in_range("splices.min_design_moment", v, 0.0, 1.0)
    if "clearance" in table:
        kw["clearance"] = _length("splices.clearance", table["clearance"], positive=False, hi=5000.0)
    if "gap" in table:
        kw["gap"] = _length("splices.gap", table["gap"], positive=False, hi=50.0)
    if "packing" in table:
        kw["packing"] = _length("splices.packing", table["packing"], positive=False, hi=50.0)
    if "mass_margin" in table:
        kw["mass_margin"] = parse_mass_margin("splices.mass_margin", table["mass_margin"])
    if "slip" in table:
        kw["slip"], kw["slip_mm"] = parse_slip("splices.slip", table["slip"])
    if "holes" in table:
        c = table["holes"]
        kw["holes"] = require_choice("splices.holes", c.strip().lower() if isinstance(c, str) else c,
                                     ("normal", "oversize"))
    for b in ("exposed", "threads_in_shear_plane"):
        if b in table:
            if not isinstance(table[b], bool):
                raise InputError(f"splices.{b}", table[b], "true or false")
            kw[b] = table[b]
    if "cost" in table:
        c = table["cost"]
        _check_keys("splices.cost", c, {"per_bolt", "per_kg"})
        for k in ("per_bolt", "per_kg"):
            if k in c:
                v = c[k]
                if isinstance(v, bool) or not isinstance(v, (int, float)):
                    raise InputError(f"splices.cost.{k}", v, "a number >= 0")
                kw[f"cost_{k}"] = require_in_range(f"splices.cost.{k}", v, 0.0, 1e6)
    if "layout" in table:
        lay = table["layout"]
        _check_keys("splices.layout", lay, {"flange", "web"})
        if "flange" not in lay or "web" not in lay:
            raise InputError("splices.layout", lay, "both [splices.layout.flange] and [splices.layout.web]")
        kw["flange"] = _parse_flange(lay["flange"])
        kw["web"] = _parse_web(lay["web"])
        if kw.get("bolts", "auto") == "auto":
            raise InputError("splices.bolts", table.get("bolts", "auto"),
                             "a bolt such as 'M20 8.8' when an explicit layout is given")
    spec = SpliceSpec(**kw)
    if spec.flange is not None:
        if spec.flange_plates == "outer+inner" and spec.flange.inner_plate <= 0.0:
            raise InputError("splices.layout.flange.inner_plate", None,
                             "a thickness when flange_plates = 'outer+inner'")
        if spec.flange_plates == "outer" and spec.flange.inner_plate > 0.0:
            raise InputError("splices.layout.flange.inner_plate", spec.flange.inner_plate,
                             "no inner plate when flange_plates = 'outer' (or set flange_plates = 'outer+inner')")
    return spec


__all__ = ["SpliceSpec", "SpliceLayout", "FlangeLayout", "WebLayout", "parse_splices", "parse_bolts",
           "BOLT_SIZES", "BOLT_CLASSES"]
