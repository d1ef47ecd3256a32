"""Bolt spacing, end and edge distances, EN 1993-1-8:2005, 3.5, Table 3.3 (steel to EN 10025 except -5).

Units: mm. ``e_1``/``p_1`` are measured in the direction of load transfer,
``e_2``/``p_2`` across it; ``t`` is the thickness of the thinner outer connected
part (Table 3.3 note 3); ``d_0`` the hole diameter.

Minima: e_1, e_2 >= 1.2 d_0; p_1 >= 2.2 d_0; p_2 >= 2.4 d_0.
Maxima (Table 3.3 note 1: maxima are unlimited except for compression members,
and for exposed members to prevent corrosion):

* e_1, e_2 <= 4 t + 40 mm for steel exposed to the weather or other corrosive
  influences; no maximum for steel not exposed;
* p_1 <= min(14 t, 200 mm) in compression; in tension (exposed) min(14 t, 200 mm)
  for outer lines and min(28 t, 400 mm) for inner lines;
* p_2 <= min(14 t, 200 mm).

So for a tension member not exposed to the weather no maximum pitch applies by
note 1; pass ``apply_maxima=True`` to enforce them anyway. Weathering steel
(EN 10025-5) and staggered rows (note 5) are not covered; buckling between
fasteners in compression (note 2) is :func:`splicecalc.joints.plates.check_plate_compression`.

Clause formulas (``@clause``): :func:`e_min`, :func:`p_1_min`, :func:`p_2_min`, :func:`e_max`, :func:`p_max`
Check: :func:`check_spacing` -> list of :class:`~splicecalc.core.record.CheckRecord`, one per rule.
"""

from __future__ import annotations

from ..core.clause import clause
from ..core.errors import InputError, require_choice, require_positive
from ..core.record import Calc, CheckRecord

_CL = "EN 1993-1-8:2005, 3.5, Table 3.3"


@clause(_CL, units={"d_0": "mm"}, returns="mm", example=dict(d_0=22.0))
def e_min(d_0: float) -> float:
    """Minimum end distance e_1 and edge distance e_2 (mm)."""
    e_min = 1.2 * d_0
    return e_min


@clause(_CL, units={"d_0": "mm"}, returns="mm", example=dict(d_0=22.0))
def p_1_min(d_0: float) -> float:
    """Minimum spacing p_1 in the direction of load transfer (mm)."""
    p_1_min = 2.2 * d_0
    return p_1_min


@clause(_CL, units={"d_0": "mm"}, returns="mm", example=dict(d_0=22.0))
def p_2_min(d_0: float) -> float:
    """Minimum spacing p_2 across the direction of load transfer (mm)."""
    p_2_min = 2.4 * d_0
    return p_2_min


@clause(_CL, units={"t": "mm", "c_e": "mm"}, returns="mm", example=dict(t=10.0, c_e=40.0))
def e_max(t: float, c_e: float = 40.0) -> float:
    """Maximum end or edge distance for exposed steel, 4 t + 40 mm."""
    e_max = 4 * t + c_e
    return e_max


@clause(_CL, units={"t": "mm", "p_lim": "mm"}, returns="mm", example=dict(t=10.0, k_t=14.0, p_lim=200.0))
def p_max(t: float, k_t: float = 14.0, p_lim: float = 200.0) -> float:
    """Maximum spacing min(k_t t, p_lim): 14 t / 200 mm, or 28 t / 400 mm for inner lines in tension."""
    p_max = min(k_t * t, p_lim)
    return p_max


def _opt(name: str, v: float | None) -> float | None:
    return None if v is None else require_positive(name, v, "mm")


def check_spacing(d_0: float, t: float, *, e_1: float | None = None, e_2: float | None = None,
                  p_1: float | None = None, p_2: float | None = None, exposed: bool = False,
                  compression: bool = False, line: str = "outer", apply_maxima: bool | None = None,
                  calc: Calc | None = None, id: str = "spacing", where: str = "",
                  location_mm: float | None = None, p_2_as: str = "") -> list[CheckRecord]:
    """One :class:`CheckRecord` per applicable Table 3.3 rule for a bolt layout (all mm).

    ``p_2_as``: the layout's own symbol of the spacing across the load (an end plate's gauge ``p_3``), used
    in the titles and the working so that one quantity keeps one symbol.

    Distances given as ``None`` are not present in the layout and not checked.
    ``line`` ('outer' or 'inner') selects the p_1 maximum for tension members.
    For a minimum the demand is the required value and the resistance the provided
    one; for a maximum the demand is the provided value and the resistance the limit.
    """
    d_0 = require_positive("d_0", d_0, "mm")
    t = require_positive("t", t, "mm")
    e_1, e_2, p_1, p_2 = _opt("e_1", e_1), _opt("e_2", e_2), _opt("p_1", p_1), _opt("p_2", p_2)
    require_choice("line", line, ("outer", "inner"))
    if not isinstance(exposed, bool) or not isinstance(compression, bool):
        raise InputError("exposed/compression", (exposed, compression), "True or False")
    if apply_maxima is None:
        apply_maxima = compression or exposed
    calc = calc if calc is not None else Calc()
    pre = f"{where}: " if where else ""
    out: list[CheckRecord] = []

    def rec(key: str, title: str, demand: float, resistance: float) -> None:
        out.append(calc.record(id=f"{id}_{key}", title=pre + title, clause=_CL, demand=demand,
                               resistance=resistance, unit="mm", location_mm=location_mm))

    if e_1 is not None:
        rec("e_1_min", "End distance e1 minimum", calc(e_min, d_0=d_0), e_1)
    if e_2 is not None:
        rec("e_2_min", "Edge distance e2 minimum", calc(e_min, d_0=d_0), e_2)
    if p_1 is not None:
        rec("p_1_min", "Spacing p1 minimum", calc(p_1_min, d_0=d_0), p_1)
    p2_txt = f"Gauge {p_2_as.replace('_', '')} (Table 3.3 p2)" if p_2_as else "Spacing p2"
    if p_2 is not None:
        with calc.symbols(**({"p_2_min": f"{p_2_as}_min"} if p_2_as else {})):
            rec("p_2_min", f"{p2_txt} minimum", calc(p_2_min, d_0=d_0), p_2)
    if exposed:
        if e_1 is not None:
            rec("e_1_max", "End distance e1 maximum (exposed)", e_1, calc(e_max, t=t))
        if e_2 is not None:
            rec("e_2_max", "Edge distance e2 maximum (exposed)", e_2, calc(e_max, t=t))
    if apply_maxima:
        if p_1 is not None:
            if compression or line == "outer":
                lim = calc(p_max, t=t, k_t=14.0, p_lim=200.0)
                what = "compression" if compression else "tension, outer line"
            else:
                lim = calc(p_max, t=t, k_t=28.0, p_lim=400.0)
                what = "tension, inner line"
            rec("p_1_max", f"Spacing p1 maximum ({what})", p_1, lim)
        if p_2 is not None:
            rec("p_2_max", f"{p2_txt} maximum", p_2, calc(p_max, t=t, k_t=14.0, p_lim=200.0))
    return out


__all__ = ["e_min", "p_1_min", "p_2_min", "e_max", "p_max", "check_spacing"]
