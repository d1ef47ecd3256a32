"""``[support.existing_loads]``: what the existing member already carries, and how it is restrained.

Column (the new beam lands on a column flange or web)::

    [support.existing_loads]
    kind = "column"
    height = "3.6 m"                 # length between restraints, both axes (or height_y / height_z)
    axial = { permanent = "310 kN", imposed = "120 kN" }     # compression, at the connection level
    moment_y = { permanent = "0 kNm", imposed = "0 kNm" }     # optional, at the connection level
    moment_z = { permanent = "0 kNm", imposed = "0 kNm" }     # optional
    category = "B"                   # optional imposed-load category of the existing loads (default B)
    moment_share = 1.0               # optional share of the connection moment taken by this length
    moment_ratio = 0.0               # optional psi: moment at the far end / moment at the connection

Supporting beam (the new beam lands on the web of an existing beam)::

    [support.existing_loads]
    kind = "beam"
    span = "6.0 m"
    at = "2.1 m"                     # where the new beam lands, from the existing beam's left support
    udl = { permanent = "8 kN/m", imposed = "5 kN/m" }
    points = [{ at = "4.0 m", permanent = "20 kN", imposed = "10 kN" }]   # optional
    restraints = ["3.0 m"]           # optional lateral restraints between the supports (none within
                                     # 50 mm of ``at`` unless torsion = "restrained": the one-sided
                                     # connection itself does not hold the compression flange)
    category = "B"                   # optional
    load_level = "top flange"        # level of its own loads (the new reaction acts at the bolt group)
    deflection_limit = 360           # optional, span / N under the variable actions
    torsion = "restrained"           # optional: "restrained" (by the floor) or "free" (checked here)

Loads are characteristic, given as magnitudes (>= 0) with units; moments are added to the moment
of the connection with the same sense (conservative). Bad values raise InputError naming
``support[i].existing_loads.<key>``.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from ...core.errors import InputError, require_in_range
from ...core.units import parse_quantity

KINDS = ("column", "beam")
#: a lateral restraint of an existing beam this close to the new beam's connection (mm) is taken as the
#: connection itself: refused while the beam is free to twist there (see :func:`parse_existing_loads`)
RESTRAINT_AT_CONNECTION_MM = 50.0
_COLUMN_KEYS = ("kind", "height", "height_y", "height_z", "axial", "moment_y", "moment_z", "category",
                "moment_share", "moment_ratio")
_BEAM_KEYS = ("kind", "span", "at", "udl", "points", "restraints", "category", "load_level", "deflection_limit",
              "torsion")
_ACTIONS = ("permanent", "imposed")
LOAD_LEVELS = ("top flange", "shear centre", "bottom flange")
CATEGORIES = ("A", "B", "C", "D", "E", "F", "G", "H")


@dataclass(frozen=True)
class ActionPair:
    """Characteristic values of one quantity: permanent and imposed (N, N*mm or N/mm)."""

    permanent: float = 0.0
    imposed: float = 0.0

    @property
    def total(self) -> float:
        return self.permanent + self.imposed


@dataclass(frozen=True)
class ExistingColumnLoads:
    """Existing column: buckling lengths (mm), characteristic axial force (N) and moments (N*mm)."""

    L_y: float
    L_z: float
    axial: ActionPair
    moment_y: ActionPair
    moment_z: ActionPair
    category: str = "B"
    moment_share: float = 1.0
    moment_ratio: float = 0.0
    kind: str = "column"


@dataclass(frozen=True)
class ExistingPoint:
    x: float
    load: ActionPair


@dataclass(frozen=True)
class ExistingBeamLoads:
    """Existing supporting beam: span, connection position, restraints (mm); loads (N/mm, N)."""

    span: float
    at: float
    udl: ActionPair
    points: tuple[ExistingPoint, ...] = ()
    restraints: tuple[float, ...] = ()
    category: str = "B"
    load_level: str = "top flange"
    deflection_limit: float = 360.0
    torsion: str = "free"
    kind: str = "beam"


def _pair(value: Any, unit: str, field: str) -> ActionPair:
    if value is None:
        return ActionPair()
    if not isinstance(value, dict):
        raise InputError(field, value, f"a table {{ permanent = '...', imposed = '...' }} with units ({unit})")
    bad = sorted(set(value) - set(_ACTIONS))
    if bad:
        raise InputError(f"{field}.{bad[0]}", value[bad[0]], "'permanent' or 'imposed' (characteristic values)")
    out = {}
    for k in _ACTIONS:
        if k in value:
            v = parse_quantity(value[k], unit, f"{field}.{k}")
            if v < 0.0:
                raise InputError(f"{field}.{k}", value[k], "a characteristic value >= 0 (give magnitudes: moments "
                                                           "are added to the connection's moment, conservative)")
            require_in_range(f"{field}.{k}", v, 0.0, {"N": 1e8, "Nmm": 1e11, "N/mm": 1e4}[unit])
            out[k] = v
    return ActionPair(**out)


def _length(table: dict, key: str, pre: str, required: bool = True) -> float | None:
    if key not in table:
        if required:
            raise InputError(f"{pre}.{key}", None, "a length with its unit, e.g. '3.6 m'")
        return None
    v = parse_quantity(table[key], "mm", f"{pre}.{key}")
    if not 300.0 <= v <= 50_000.0:
        raise InputError(f"{pre}.{key}", table[key], "a length from 0.3 m to 50 m")
    return v


def _category(table: dict, pre: str) -> str:
    c = table.get("category", "B")
    if not isinstance(c, str) or c.strip().upper() not in CATEGORIES:
        raise InputError(f"{pre}.category", c, "an imposed-load category " + ", ".join(CATEGORIES))
    return c.strip().upper()


def parse_existing_loads(table: Any, face: str, pre: str) -> ExistingColumnLoads | ExistingBeamLoads:
    """Parse ``[support.existing_loads]`` for a support whose ``existing_face`` is ``face``."""
    if not isinstance(table, dict):
        raise InputError(pre, table, "a table [support.existing_loads] with kind = 'column' or 'beam'")
    kind = table.get("kind")
    if kind not in KINDS:
        raise InputError(f"{pre}.kind", kind, "'column' or 'beam'")
    want = "beam" if face == "beam web" else "column"
    if kind != want:
        raise InputError(f"{pre}.kind", kind, f"'{want}' for an existing_face of {face!r}")
    keys = _COLUMN_KEYS if kind == "column" else _BEAM_KEYS
    bad = sorted(set(table) - set(keys))
    if bad:
        raise InputError(f"{pre}.{bad[0]}", table[bad[0]], f"one of the keys for kind = '{kind}': " + ", ".join(keys))
    if kind == "column":
        L = _length(table, "height", pre, required=False)
        Ly = _length(table, "height_y", pre, required=False) or L
        Lz = _length(table, "height_z", pre, required=False) or L
        if Ly is None or Lz is None:
            raise InputError(f"{pre}.height", None, "the column length between restraints, e.g. '3.6 m' (or both "
                                                    "height_y and height_z)")
        if "axial" not in table:
            raise InputError(f"{pre}.axial", None, "the column's characteristic axial force, e.g. "
                                                   "{ permanent = '310 kN', imposed = '120 kN' }")
        share = require_in_range(f"{pre}.moment_share", table.get("moment_share", 1.0), 0.0, 1.0)
        psi = require_in_range(f"{pre}.moment_ratio", table.get("moment_ratio", 0.0), -1.0, 1.0)
        return ExistingColumnLoads(L_y=Ly, L_z=Lz, axial=_pair(table["axial"], "N", f"{pre}.axial"),
                                   moment_y=_pair(table.get("moment_y"), "Nmm", f"{pre}.moment_y"),
                                   moment_z=_pair(table.get("moment_z"), "Nmm", f"{pre}.moment_z"),
                                   category=_category(table, pre), moment_share=share, moment_ratio=psi)
    span = _length(table, "span", pre)
    if "at" not in table:
        raise InputError(f"{pre}.at", None, "where the new beam lands along the existing beam, e.g. '2.1 m'")
    at = parse_quantity(table["at"], "mm", f"{pre}.at")
    if not 0.0 < at < span:
        raise InputError(f"{pre}.at", table["at"], f"a position inside the existing span, between 0 and "
                                                   f"{span / 1000:g} m")
    pts = []
    raw = table.get("points", [])
    if not isinstance(raw, list):
        raise InputError(f"{pre}.points", raw, "a list of { at = '...', permanent = '...', imposed = '...' }")
    for i, p in enumerate(raw):
        f = f"{pre}.points[{i}]"
        if not isinstance(p, dict) or "at" not in p:
            raise InputError(f, p, "a table { at = '4.0 m', permanent = '20 kN', imposed = '10 kN' }")
        x = parse_quantity(p["at"], "mm", f"{f}.at")
        if not 0.0 <= x <= span:
            raise InputError(f"{f}.at", p["at"], f"a position on the existing span, 0 to {span / 1000:g} m")
        pts.append(ExistingPoint(x, _pair({k: v for k, v in p.items() if k != "at"}, "N", f)))
    rs = table.get("restraints", [])
    if not isinstance(rs, list):
        raise InputError(f"{pre}.restraints", rs, "a list of positions, e.g. ['3.0 m']")
    restr = []
    for i, r in enumerate(rs):
        x = parse_quantity(r, "mm", f"{pre}.restraints[{i + 1}]")
        if not 0.0 < x < span:
            raise InputError(f"{pre}.restraints[{i + 1}]", r, f"a position strictly inside the span (0 to "
                                                         f"{span / 1000:g} m)")
        restr.append(x)
    level = table.get("load_level", "top flange")
    if level not in LOAD_LEVELS:
        raise InputError(f"{pre}.load_level", level, "one of " + ", ".join(repr(v) for v in LOAD_LEVELS))
    lim = require_in_range(f"{pre}.deflection_limit", table.get("deflection_limit", 360.0), 100.0, 1000.0)
    tors = table.get("torsion", "free")
    if tors not in ("free", "restrained"):
        raise InputError(f"{pre}.torsion", tors, "'free' (the torsion is checked here) or 'restrained' (the "
                                                 "floor prevents the twist: stated, to be confirmed)")
    for i, x in enumerate(restr):
        if tors == "free" and abs(x - at) <= RESTRAINT_AT_CONNECTION_MM:
            raise InputError(f"{pre}.restraints[{i + 1}]", rs[i],
                             f"no restraint at the new beam's connection (at = {at / 1000:g} m) while torsion = "
                             "'free': a one-sided partial-depth connection does not hold the compression flange, "
                             "so remove it (LTB over the real unrestrained length) or write torsion = "
                             "'restrained' if the floor holds the flange there")
    return ExistingBeamLoads(span=span, at=at, udl=_pair(table.get("udl"), "N/mm", f"{pre}.udl"), points=tuple(pts),
                             restraints=tuple(sorted(set(restr))), category=_category(table, pre),
                             load_level=level, deflection_limit=lim, torsion=tors)


__all__ = ["ActionPair", "ExistingColumnLoads", "ExistingBeamLoads", "ExistingPoint", "parse_existing_loads",
           "KINDS", "LOAD_LEVELS"]
