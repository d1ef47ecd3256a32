"""The ``[[support]]`` table of a job file: one end connection of the new beam.

Example (TOML)::

    [[support]]
    at = "start"
    connection = "fin plate"            # or "end plate" (partial depth)
    bolts = "M20 8.8"
    plate = "10 mm S275"                # thickness optional: "S275" -> automatic thickness
    existing_member = "254x254x73 UKC"  # or measured {h = "254 mm", b = ..., tw, tf, r, taper = "8 deg",
                                        # designation = "10 in x 5 in joist"} (taper and label optional)
    existing_face = "column flange"     # "column web" | "beam web"
    existing_steel = "1950-1958"        # era band, a grade "S275", "unknown" (lowest band, caution) or
                                        # coupon tests { tested_fy = "262 MPa", tested_fu = "410 MPa",
                                        # samples = 3 } (characteristic value by EN 1990 Annex D)
    notch_top = "40 mm x 120 mm"        # depth x length, optional (on a beam web: designed when needed)
    top_below_existing = "0 mm"         # beam web only: new beam top below the existing top (default 0:
                                        # tops of steel level; negative = above); the notches that clear the
                                        # existing flanges and root fillets are designed from it
    tying_force = "75 kN"               # optional; default: from the new beam's loads by the UK NA rule
    consequence_class = "2b"            # optional: "1", "2a", "2b" (default) or "3", for the tying force
    [support.existing_loads]            # optional: loads and restraints of the existing member
                                        # (see joints/connections/existing_spec.py); without it the
                                        # existing member is NOT CHECKED as a member
    rows = 4                            # optional; missing -> automatic choice
    pitch = "70 mm"                     # optional
    gauge = "90 mm"                     # optional (end plate: bolt cross-centres)
    weld_leg = "8 mm"                   # optional

Every quantity is a string with units (:func:`splicecalc.core.units.parse_quantity`);
bad values raise :class:`InputError` naming the key, e.g. ``support[1].plate``.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from typing import Any

from ...core.errors import InputError
from ...core.units import parse_quantity
from ...materials.historic import allowed_materials, existing_steel
from ...materials.steel import normalise_grade

CONNECTIONS = ("end plate", "fin plate")
FACES = ("column flange", "column web", "beam web")
ENDS = ("start", "end")
#: default structural-integrity tie force (N): UK practice minimum 75 kN (from memory of
#: the UK building-regulation guidance and the UK NA to EN 1991-1-7, flagged)
TYING_MIN_N = 75_000.0
_KEYS = ("at", "connection", "bolts", "plate", "existing_member", "existing_face", "existing_steel",
         "notch_top", "tying_force", "rows", "pitch", "gauge", "weld_leg", "existing_loads", "consequence_class",
         "top_below_existing")
#: consequence classes of EN 1991-1-7 / UK NA for the tying force
CONSEQUENCE_CLASSES = ("1", "2a", "2b", "3")
_BOLT_RE = re.compile(r"^\s*(M\d{2})\s*(?:(?:class|gr\.?|grade)\s*)?(\d{1,2}\.\d)?\s*$", re.I)
_NOTCH_RE = re.compile(r"^\s*(.+?)\s*[x×*]\s*(.+?)\s*$")


@dataclass(frozen=True)
class SupportSpec:
    """One end connection as specified by the user (None = choose automatically).

    Lengths in mm, forces in N. ``existing_member`` is a :class:`Section`;
    ``existing_steel`` the user's text (era band or grade), validated here.
    """

    index: int
    at: str
    connection: str
    bolt_size: str = "M20"
    bolt_class: str = "8.8"
    plate_t: float | None = None
    plate_grade: str = "S275"
    existing_member: Any = None
    existing_face: str = "column flange"
    existing_steel: str = "S275"
    notch_depth: float | None = None
    notch_length: float | None = None
    tying_force: float = TYING_MIN_N
    rows: int | None = None
    pitch: float | None = None
    gauge: float | None = None
    weld_leg: float | None = None
    tying_given: bool = False
    consequence_class: str = "2b"
    existing_loads: Any = None
    #: beam web: the new beam's top below the existing beam's top (mm, 0 = tops of steel level)
    level: float = 0.0
    #: bottom notch (designed by :func:`~.notch.notch_fit` when the new beam meets the existing bottom flange)
    notch_bottom_depth: float | None = None
    notch_bottom_length: float | None = None
    #: how the notches were found (text for the calc sheet; '' when none was designed)
    notch_basis: str = ""

    @property
    def field(self) -> str:
        """Prefix naming this table in messages, e.g. ``support[1]``."""
        return f"support[{self.index}]"

    @property
    def notched(self) -> bool:
        return self.notch_depth is not None

    @property
    def notch_text(self) -> str:
        """Notches for the calc sheet, e.g. 'top 35 x 85 mm, bottom 30 x 85 mm' ('-' when none)."""
        parts = ([f"top {self.notch_depth:g} x {self.notch_length:g} mm"] if self.notched else []) + \
                ([f"bottom {self.notch_bottom_depth:g} x {self.notch_bottom_length:g} mm"]
                 if self.notch_bottom_depth else [])
        return ", ".join(parts) or "-"


def _text(table: dict, key: str, pre: str) -> str | None:
    if key not in table:
        return None
    v = table[key]
    if not isinstance(v, str) or not v.strip():
        raise InputError(f"{pre}.{key}", v, "a non-empty text value")
    return v.strip()


def parse_bolts(text: str, field: str) -> tuple[str, str]:
    """'M20 8.8' -> ('M20', '8.8'); class defaults to 8.8."""
    m = _BOLT_RE.match(text)
    if not m:
        raise InputError(field, text, "a bolt size and class such as 'M20 8.8' (sizes M12-M36; classes 4.6, "
                                      "8.8, 10.9)")
    size, cls = m.group(1).upper(), m.group(2) or "8.8"
    if size not in ("M12", "M16", "M20", "M22", "M24", "M27", "M30", "M36"):
        raise InputError(field, text, "a bolt size M12, M16, M20, M22, M24, M27, M30 or M36")
    if cls not in ("4.6", "4.8", "5.6", "5.8", "6.8", "8.8", "10.9"):
        raise InputError(field, text, "a bolt class 4.6, 4.8, 5.6, 5.8, 6.8, 8.8 or 10.9")
    return size, cls


def parse_plate(text: str, field: str) -> tuple[float | None, str]:
    """'10 mm S275' -> (10.0, 'S275'); 'S355' -> (None, 'S355')."""
    parts = text.split()
    grade_part = [p for p in parts if p.upper().startswith("S")]
    if len(grade_part) > 1:
        raise InputError(field, text, "a plate thickness and grade such as '10 mm S275'")
    grade = "S275"
    if grade_part:
        try:
            grade = normalise_grade(grade_part[0])
        except InputError:
            raise InputError(field, text, "a plate grade S235, S275, S355, S420 or S460, e.g. '10 mm S275'") \
                from None
    rest = " ".join(p for p in parts if p not in grade_part)
    t = None
    if rest:
        t = parse_quantity(rest, "mm", field)
        if not 5.0 <= t <= 40.0:
            raise InputError(field, text, "a plate thickness from 5 mm to 40 mm, e.g. '10 mm S275'")
    return t, grade


def parse_notch(text: str, field: str) -> tuple[float, float]:
    """'40 mm x 120 mm' -> (depth 40, length 120)."""
    m = _NOTCH_RE.match(text)
    if not m:
        raise InputError(field, text, "notch depth x length, e.g. '40 mm x 120 mm'")
    dn = parse_quantity(m.group(1), "mm", field)
    c = parse_quantity(m.group(2), "mm", field)
    if dn <= 0 or c <= 0:
        raise InputError(field, text, "a positive notch depth and length, e.g. '40 mm x 120 mm'")
    return dn, c


def _existing_member(value: Any, field: str) -> Any:
    from ...sections import get_section, measured_section
    if isinstance(value, str):
        try:
            return get_section(value)
        except InputError as err:
            raise InputError(field, value, err.allowed, err.hint) from None
    if isinstance(value, dict):
        known = ("designation", "h", "b", "tw", "tf", "r", "taper")
        extra = [k for k in value if k not in known]
        if extra:
            raise InputError(f"{field}.{extra[0]}", value[extra[0]], "one of the keys " + ", ".join(known))
        dims = {}
        for k in ("h", "b", "tw", "tf", "r"):
            if k not in value:
                raise InputError(f"{field}.{k}", None, "a measured dimension with its unit, e.g. '254 mm'")
            dims[k] = parse_quantity(value[k], "mm", f"{field}.{k}")
        label = value.get("designation", "measured existing member")
        from ...sections.tapered import designation_check, tapered_section
        designation_check(str(label), dims["h"], dims["b"], f"{field}.designation")
        try:
            if "taper" in value:
                taper = _angle(value["taper"], f"{field}.taper")
                return tapered_section(designation=str(label), taper_deg=taper, **dims)
            return measured_section(designation=str(label), **dims)
        except InputError as err:
            raise InputError(f"{field}.{err.field}", err.value, err.allowed, err.hint) from None
    raise InputError(field, value, "a catalogue designation such as '254x254x73 UKC' or a table of measured "
                                   "h, b, tw, tf, r with units")


def _angle(text: Any, field: str) -> float:
    """'8 deg' / '8°' / 8 -> 8.0 (degrees)."""
    if isinstance(text, (int, float)) and not isinstance(text, bool):
        v = float(text)
    else:
        m = re.match(r"^\s*([0-9.]+)\s*(?:deg|degrees|°)\s*$", str(text))
        if not m:
            raise InputError(field, text, "a flange taper in degrees, e.g. '8 deg'")
        v = float(m.group(1))
    if not 0.0 <= v <= 15.0:
        raise InputError(field, text, "a flange taper from 0 to 15 degrees")
    return v


def _existing_steel_value(table: dict, pre: str) -> Any:
    from ...materials.historic import tested_steel
    v = table.get("existing_steel")
    if isinstance(v, dict):
        return tested_steel(v, f"{pre}.existing_steel")
    mat = _text(table, "existing_steel", pre)
    if mat is None:
        raise InputError(f"{pre}.existing_steel", None, allowed_materials())
    existing_steel(mat, 10.0, f"{pre}.existing_steel")  # validates (era band, grade, unknown; iron refused)
    return mat


def parse_support(table: dict, index: int) -> SupportSpec:
    """Parse one ``[[support]]`` table (``index`` counts from 1 in messages)."""
    pre = f"support[{index}]"
    if not isinstance(table, dict):
        raise InputError(pre, table, "a table of connection keys")
    unknown = sorted(set(table) - set(_KEYS))
    if unknown:
        raise InputError(f"{pre}.{unknown[0]}", table[unknown[0]], "one of the keys " + ", ".join(_KEYS))
    at = _text(table, "at", pre)
    if at is None:
        raise InputError(f"{pre}.at", None, "'start' or 'end'")
    if at.lower() not in ENDS:
        raise InputError(f"{pre}.at", at, "'start' or 'end'")
    conn = _text(table, "connection", pre)
    if conn is None or conn.lower() not in CONNECTIONS:
        raise InputError(f"{pre}.connection", conn, "'end plate' (partial depth) or 'fin plate'")
    kw: dict[str, Any] = {"index": index, "at": at.lower(), "connection": conn.lower()}
    bolts = _text(table, "bolts", pre)
    if bolts is not None:
        kw["bolt_size"], kw["bolt_class"] = parse_bolts(bolts, f"{pre}.bolts")
    plate = _text(table, "plate", pre)
    if plate is not None:
        kw["plate_t"], kw["plate_grade"] = parse_plate(plate, f"{pre}.plate")
    if "existing_member" not in table:
        raise InputError(f"{pre}.existing_member", None,
                         "a catalogue designation such as '254x254x73 UKC' or measured h, b, tw, tf, r")
    kw["existing_member"] = _existing_member(table["existing_member"], f"{pre}.existing_member")
    face = _text(table, "existing_face", pre)
    if face is None or face.lower() not in FACES:
        raise InputError(f"{pre}.existing_face", face, "one of " + ", ".join(repr(f) for f in FACES))
    kw["existing_face"] = face.lower()
    kw["existing_steel"] = _existing_steel_value(table, pre)
    notch = _text(table, "notch_top", pre)
    if notch is not None:
        kw["notch_depth"], kw["notch_length"] = parse_notch(notch, f"{pre}.notch_top")
    if "top_below_existing" in table:
        if kw["existing_face"] != "beam web":
            raise InputError(f"{pre}.top_below_existing", table["top_below_existing"],
                             "no top_below_existing unless existing_face = 'beam web' (it sets the level of the "
                             "new beam against the existing beam's flanges)")
        lv = parse_quantity(table["top_below_existing"], "mm", f"{pre}.top_below_existing")
        if not -1000.0 <= lv <= 1000.0:
            raise InputError(f"{pre}.top_below_existing", table["top_below_existing"],
                             "a level from '-1000 mm' to '1000 mm' (0 mm = tops of steel level)")
        kw["level"] = lv
    if "tying_force" in table:
        tie = parse_quantity(table["tying_force"], "N", f"{pre}.tying_force")
        if tie <= 0.0:
            raise InputError(f"{pre}.tying_force", table["tying_force"], "a force > 0, e.g. '75 kN'")
        kw["tying_force"] = tie
        kw["tying_given"] = True
    if "consequence_class" in table:
        cc = str(table["consequence_class"]).strip().lower()
        if cc not in CONSEQUENCE_CLASSES:
            raise InputError(f"{pre}.consequence_class", table["consequence_class"],
                             "one of " + ", ".join(repr(c) for c in CONSEQUENCE_CLASSES) + " (EN 1991-1-7, UK NA)")
        kw["consequence_class"] = cc
    if "existing_loads" in table:
        from .existing_spec import parse_existing_loads
        kw["existing_loads"] = parse_existing_loads(table["existing_loads"], kw["existing_face"],
                                                    f"{pre}.existing_loads")
    if "rows" in table:
        rows = table["rows"]
        if isinstance(rows, bool) or not isinstance(rows, int) or not 1 <= rows <= 12:
            raise InputError(f"{pre}.rows", rows, "a whole number of bolt rows from 1 to 12")
        kw["rows"] = rows
    for key, lo, hi in (("pitch", 30.0, 200.0), ("gauge", 40.0, 200.0), ("weld_leg", 3.0, 20.0)):
        if key in table:
            v = parse_quantity(table[key], "mm", f"{pre}.{key}")
            if not lo <= v <= hi:
                raise InputError(f"{pre}.{key}", table[key], f"a length from {lo:g} mm to {hi:g} mm")
            kw[key] = v
    return SupportSpec(**kw)


__all__ = ["SupportSpec", "parse_support", "parse_bolts", "parse_plate", "parse_notch", "CONNECTIONS", "FACES",
           "TYING_MIN_N", "CONSEQUENCE_CLASSES"]
