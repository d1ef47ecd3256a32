"""Load model: characteristic line loads and point loads on a simply supported span.

Units: line load ``w`` in N/mm (= kN/m), positions in mm, point load ``P`` in N.
Loads act downwards and are given as positive numbers (the beam analysis takes
downward load positive). Each load carries the action it belongs to:

* ``"permanent"`` (G, EN 1990:2002, 4.1.1),
* ``"imposed"`` with an imposed-load category ``"A"`` ... ``"H"`` (EN 1991-1-1:2002, 6.3, Table 6.1),
* ``"snow"`` (EN 1991-1-3), ``"wind"`` (EN 1991-1-4).

Loads of one variable action act together in a combination. By default the
action of a load is named after its type (``"imposed B"``, ``"snow"``,
``"wind"``), so all category-B imposed loads lead together; give ``group=`` to
treat a load as a separate independent action (e.g. ``group="plant"``).

Public API: :data:`ACTIONS`, :data:`CATEGORIES`, :data:`APPLIED_TO`, :data:`UDL_APPLIED_TO`, :class:`UDL`, :class:`PointLoad`,
:data:`Load`, :func:`check_loads_on_span`, :func:`self_weight_udl`, :data:`g_n`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Union

from ..core.errors import InputError, require_choice, require_finite, require_non_negative, require_positive

#: action types accepted by the load model
ACTIONS: tuple[str, ...] = ("permanent", "imposed", "snow", "wind")
#: imposed-load categories, EN 1991-1-1:2002, 6.3.1.1, Table 6.1 (A-D), 6.3.2.1 (E),
#: 6.3.3.1 (F, G), 6.3.4.1 (H)
CATEGORIES: tuple[str, ...] = ("A", "B", "C", "D", "E", "F", "G", "H")
#: standard acceleration of gravity, m/s2 (used for self-weight from mass)
g_n: float = 9.81


def _check_name(name: object, field: str) -> str:
    if not isinstance(name, str) or not name.strip():
        raise InputError(field, name, "a non-empty text naming the load")
    return name


def _check_action(action: object, category: object, field: str) -> tuple[str, str | None]:
    require_choice(f"{field}.action", action, ACTIONS)
    if action == "imposed":
        if isinstance(category, str):
            category = category.strip().upper()
        require_choice(f"{field}.category", category, CATEGORIES)
        return str(action), str(category)
    if category not in (None, ""):
        raise InputError(f"{field}.category", category,
                         "no category (categories A-H apply to imposed loads only)")
    return str(action), None


def _check_group(group: object, field: str) -> str:
    if group is None:
        return ""
    if not isinstance(group, str):
        raise InputError(f"{field}.group", group, "a text naming the action this load belongs to")
    return group.strip()


@dataclass(frozen=True)
class UDL:
    """Uniformly distributed line load, full span or partial.

    w: characteristic (or factored) line load, N/mm (= kN/m), > 0.
    x_start, x_end: extent from the left support A, mm; ``x_end=None`` means
        "to the right support" (full span when ``x_start=0``).
    applied_to: the height it acts at for lateral-torsional buckling (:data:`UDL_APPLIED_TO`):
        ``"flange"`` (default: the job's load level), ``"top flange"``, ``"bottom flange"`` (a
        ceiling or services hung below) or ``"shear centre"``.
    action: one of :data:`ACTIONS`; category: A-H for imposed loads only.
    group: the variable action this load belongs to (see module docstring).
    """

    name: str
    action: str
    w: float
    x_start: float = 0.0
    x_end: float | None = None
    category: str | None = None
    group: str = ""
    applied_to: str = "flange"

    def __post_init__(self) -> None:
        f = f"load {self.name!r}" if isinstance(self.name, str) else "load"
        _check_name(self.name, f"{f}.name")
        action, cat = _check_action(self.action, self.category, f)
        require_choice(f"{f}.applied_to", self.applied_to, UDL_APPLIED_TO)
        w = require_positive(f"{f}.w", self.w, "N/mm")
        xs = require_non_negative(f"{f}.x_start", self.x_start, "mm")
        xe = None
        if self.x_end is not None:
            xe = require_finite(f"{f}.x_end", self.x_end)
            if xe <= xs:
                raise InputError(f"{f}.x_end", self.x_end, f"a position > x_start = {xs:g} mm")
        object.__setattr__(self, "action", action)
        object.__setattr__(self, "category", cat)
        object.__setattr__(self, "w", w)
        object.__setattr__(self, "x_start", xs)
        object.__setattr__(self, "x_end", xe)
        object.__setattr__(self, "group", _check_group(self.group, f))

    # -------------------------------------------------------------- helpers
    @property
    def kind(self) -> str:
        return "udl"

    @property
    def action_name(self) -> str:
        """Name of the action this load belongs to (its group, or a default from type/category)."""
        return _action_name(self)

    def is_full(self, span_mm: float) -> bool:
        """True when the load covers the whole span."""
        return self.x_start == 0.0 and (self.x_end is None or self.x_end >= span_mm)

    def extent(self, span_mm: float) -> tuple[float, float]:
        """(x_start, x_end) in mm with ``x_end=None`` resolved to the span."""
        return self.x_start, (span_mm if self.x_end is None else self.x_end)

    def total(self, span_mm: float) -> float:
        """Resultant force, N."""
        a, b = self.extent(span_mm)
        return self.w * (b - a)

    def scaled(self, factor: float, name: str | None = None) -> "UDL":
        """A copy with ``w`` multiplied by ``factor`` (> 0)."""
        return replace(self, w=self.w * factor, name=name or self.name)

    def to_dict(self) -> dict:
        """JSON-ready dict; keys carry units (w in kN/m = N/mm, positions in mm)."""
        return {"name": self.name, "type": "udl", "action": self.action, "category": self.category,
                "group": self.action_name, "w_kN_per_m": self.w, "x_start_mm": self.x_start,
                "x_end_mm": self.x_end, "applied_to": self.applied_to}

    def describe(self) -> str:
        ext = "full span" if self.x_start == 0.0 and self.x_end is None else \
            f"x = {self.x_start / 1e3:.3g} to {'L' if self.x_end is None else f'{self.x_end / 1e3:.3g}'} m"
        return f"{self.name}: {self.w:.3g} kN/m, {ext} ({self.action_name})"


#: how a point load enters the beam: on a flange (the web is checked under it, EN 1993-1-5
#: section 6): "flange" = the flange of the job's load level, or "top flange" / "bottom flange";
#: or through a connection to the web (a secondary beam's end plate or fin plate)
APPLIED_TO: tuple[str, ...] = ("flange", "top flange", "bottom flange", "web")
#: the height a line load acts at for lateral-torsional buckling: on the flange of the job's load level,
#: on the top or bottom flange (its own level), or at the shear centre (e.g. through the web)
UDL_APPLIED_TO: tuple[str, ...] = ("flange", "top flange", "bottom flange", "shear centre")


@dataclass(frozen=True)
class PointLoad:
    """Concentrated load ``P`` (N, > 0, downwards) at ``x`` (mm from support A).

    bearing_length: stiff bearing length s_s (mm, >= 0) over which the load is spread on the
        flange (EN 1993-1-5 6.3); 0 (default) for a load with no stiff bearing.
    applied_to: ``"flange"`` (default: on the flange of the job's load level, the web is checked
        under it), ``"top flange"`` / ``"bottom flange"`` (that flange, e.g. a hanger on the bottom
        flange), or ``"web"`` (through a connection to the web, e.g. a secondary beam's end plate
        or fin plate).
    """

    name: str
    action: str
    P: float
    x: float
    category: str | None = None
    group: str = ""
    bearing_length: float = 0.0
    applied_to: str = "flange"

    def __post_init__(self) -> None:
        f = f"load {self.name!r}" if isinstance(self.name, str) else "load"
        _check_name(self.name, f"{f}.name")
        action, cat = _check_action(self.action, self.category, f)
        P = require_positive(f"{f}.P", self.P, "N")
        x = require_non_negative(f"{f}.x", self.x, "mm")
        object.__setattr__(self, "action", action)
        object.__setattr__(self, "category", cat)
        object.__setattr__(self, "P", P)
        object.__setattr__(self, "x", x)
        object.__setattr__(self, "group", _check_group(self.group, f))
        object.__setattr__(self, "bearing_length", require_non_negative(f"{f}.bearing_length",
                                                                        self.bearing_length, "mm"))
        require_choice(f"{f}.applied_to", self.applied_to, APPLIED_TO)

    @property
    def kind(self) -> str:
        return "point"

    @property
    def action_name(self) -> str:
        return _action_name(self)

    def total(self, span_mm: float) -> float:
        return self.P

    def scaled(self, factor: float, name: str | None = None) -> "PointLoad":
        return replace(self, P=self.P * factor, name=name or self.name)

    def to_dict(self) -> dict:
        """JSON-ready dict; keys carry units."""
        d = {"name": self.name, "type": "point", "action": self.action, "category": self.category,
             "group": self.action_name, "P_kN": self.P / 1e3, "x_mm": self.x}
        if self.bearing_length:
            d["bearing_length_mm"] = self.bearing_length
        if self.applied_to != "flange":
            d["applied_to"] = self.applied_to
        return d

    def describe(self) -> str:
        return f"{self.name}: {self.P / 1e3:.3g} kN at x = {self.x / 1e3:.3g} m ({self.action_name})"


Load = Union[UDL, PointLoad]


def _action_name(load: Load) -> str:
    if load.group:
        return load.group
    if load.action == "imposed":
        return f"imposed {load.category}"
    return load.action


def check_loads_on_span(loads: object, span_mm: float, field: str = "loads") -> tuple[Load, ...]:
    """Validate that every load is a :class:`UDL` / :class:`PointLoad` lying on ``[0, span_mm]``.

    Returns the loads as a tuple. Raises :class:`InputError` naming the load and field.
    """
    L = require_positive("span_mm", span_mm, "mm")
    if isinstance(loads, (UDL, PointLoad)):
        loads = (loads,)
    if not isinstance(loads, (list, tuple)):
        raise InputError(field, loads, "a list of UDL and PointLoad objects")
    out: list[Load] = []
    for i, ld in enumerate(loads):
        if not isinstance(ld, (UDL, PointLoad)):
            raise InputError(f"{field}[{i}]", ld, "a UDL or PointLoad")
        f = f"load {ld.name!r}"
        if isinstance(ld, PointLoad):
            if ld.x > L:
                raise InputError(f"{f}.x", ld.x, f"a position from 0 to the span {L:g} mm")
            if ld.bearing_length > L:
                raise InputError(f"{f}.bearing_length", ld.bearing_length,
                                 f"a stiff bearing length from 0 to the span {L:g} mm")
        else:
            if ld.x_start >= L:
                raise InputError(f"{f}.x_start", ld.x_start, f"a position from 0 to below the span {L:g} mm")
            if ld.x_end is not None and ld.x_end > L * (1 + 1e-12):
                raise InputError(f"{f}.x_end", ld.x_end, f"a position up to the span {L:g} mm")
        out.append(ld)
    return tuple(out)


def self_weight_udl(mass_kg_per_m: float, name: str = "beam self-weight",
                    g: float = g_n) -> UDL:
    """Beam self-weight as a permanent full-span UDL, w = m g (N/mm).

    mass_kg_per_m: mass per metre, kg/m; g: acceleration of gravity, m/s2 (9.81).
    m [kg/m] x g [m/s2] = N/m; / 1000 gives N/mm (= kN/m). EN 1991-1-1:2002, 5.1.
    """
    m = require_positive("mass_kg_per_m", mass_kg_per_m, "kg/m")
    gg = require_positive("g", g, "m/s2")
    if not math.isfinite(m * gg):
        raise InputError("mass_kg_per_m", mass_kg_per_m, "a finite mass per metre")
    return UDL(name=name, action="permanent", w=m * gg / 1000.0)
