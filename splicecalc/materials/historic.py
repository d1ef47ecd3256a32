"""Strengths for existing (historic) British rolled steel, by era of construction and thickness.

When the grade of an existing member is not known from records, appraisal
practice in the UK assigns a characteristic yield strength by the date of
construction and the element thickness, from tables published in appraisal
guidance for older structural steel. THE VALUES BELOW ARE FROM MEMORY of
that published guidance, deliberately rounded down, and are flagged as such
in every check that uses them: they are placeholders for values confirmed by
records, by survey, or by coupon testing of the actual member.

An era band applies to **steel** only. Cast iron and wrought iron behave
differently (brittle in tension / laminar, no weldability) and are refused.
A modern grade ("S275", "S355", ...) may be given instead of an era: it goes to
:func:`splicecalc.materials.steel.steel` (EN 10025-2).
"""

from __future__ import annotations

from dataclasses import dataclass

from ..core.errors import InputError, require_positive
from .steel import GRADES, Steel, normalise_grade, steel

#: Caution printed in every calc that relies on existing steelwork.
EXISTING_STEEL_CAUTION = (
    "CAUTION - EXISTING STRUCTURE. The strength, section size and condition of the existing "
    "member used in these calculations are assumptions. They must be verified on site by survey "
    "(measured dimensions, corrosion loss, distortion, previous alterations) and, where the grade "
    "is not known from records, by testing of the material. Confirm that the member is steel: cast "
    "iron and wrought iron are not steel, have different strengths and failure modes, and are not "
    "covered by these checks. Do not weld to old steel until its weldability (chemical composition, "
    "carbon equivalent, laminations) has been confirmed; prefer bolted connections. Historic strengths "
    "by era are from memory of published appraisal guidance and must be confirmed before use."
)

#: Note attached to every CheckRecord that uses an era strength.
HISTORIC_NOTE = ("existing steel strength taken by era of construction from published UK appraisal "
                 "guidance (values from memory, rounded down): verify by records or testing")


@dataclass(frozen=True)
class EraBand:
    """One era band: fy steps by thickness (t_max_mm, fy_MPa) and a lower-bound fu (MPa)."""

    name: str
    first_year: int
    last_year: int
    fy_steps: tuple[tuple[float, float], ...]
    f_u: float
    source: str


#: Era bands of historic British structural steel (values FROM MEMORY, flagged).
#: fy for t <= t_max; above the last step the band is not used (InputError).
ERA_BANDS: dict[str, EraBand] = {b.name: b for b in (
    EraBand("before 1909", 1850, 1908, ((40.0, 200.0), (100.0, 190.0)), 370.0,
            "early mild steel before the first national standard was in general use (from memory)"),
    EraBand("1909-1932", 1909, 1932, ((40.0, 210.0), (100.0, 200.0)), 400.0,
            "early issues of the British standard for structural steel (from memory)"),
    EraBand("1933-1949", 1933, 1949, ((16.0, 225.0), (40.0, 220.0), (100.0, 210.0)), 410.0,
            "British standard mild steel, inter-war and war years (from memory)"),
    EraBand("1950-1958", 1950, 1958, ((16.0, 235.0), (40.0, 230.0), (100.0, 220.0)), 430.0,
            "British standard mild steel, post-war issue (from memory)"),
    EraBand("1959-1967", 1959, 1967, ((16.0, 240.0), (40.0, 230.0), (100.0, 225.0)), 430.0,
            "British standard mild steel, metric-transition issue (from memory)"),
    EraBand("1968-1985", 1968, 1985, ((16.0, 265.0), (40.0, 255.0), (63.0, 245.0), (100.0, 235.0)), 430.0,
            "weldable structural steel grade 43 (early issues), from memory"),
    EraBand("1986-1992", 1986, 1992, ((16.0, 275.0), (40.0, 265.0), (63.0, 255.0), (100.0, 245.0)), 430.0,
            "weldable structural steel grade 43 (later issues), from memory"),
)}

_IRON_WORDS = ("iron", "cast", "wrought")


def allowed_materials() -> str:
    """Human list of the accepted era bands and grades (for error messages)."""
    return ("an era band (" + ", ".join(repr(k) for k in ERA_BANDS) + ") or a grade ("
            + ", ".join(GRADES) + ")")


def _normalise_era(text: str) -> str | None:
    s = text.strip().lower().replace("\u2013", "-").replace(" to ", "-").replace(" ", "")
    for name in ERA_BANDS:
        if s == name.replace(" ", ""):
            return name
    if s in ("pre-1909", "pre1909", "before1909", "<1909"):
        return "before 1909"
    # a single year or a range wholly inside one band
    parts = s.split("-")
    try:
        years = [int(p) for p in parts if p]
    except ValueError:
        return None
    if not years or len(years) > 2:
        return None
    lo, hi = min(years), max(years)
    for band in ERA_BANDS.values():
        if band.first_year <= lo and hi <= band.last_year:
            return band.name
    return None


def _era_hint(text: str) -> str:
    """Advice for a text that is neither a known era band nor a grade."""
    first, last = min(b.first_year for b in ERA_BANDS.values()), max(b.last_year for b in ERA_BANDS.values())
    years = [int(p) for p in text.replace("\u2013", "-").replace(" ", "").split("-") if p.isdigit()]
    if len(years) == 2 and first <= min(years) and max(years) <= last:
        return ("The years cross two era bands: give the band of the earliest year (the lower strength) "
                "unless records date the steel")
    return (f"Era bands cover {first} to {last}; for later steel give its grade (e.g. 'S275'), for earlier "
            "or unidentified material have it identified and tested (it may be iron, not steel)")


@dataclass(frozen=True)
class ExistingSteel:
    """Material of an existing member: label, Steel (fy, fu at the thickness), historic flag, note."""

    label: str
    material: Steel
    historic: bool
    note: str

    @property
    def f_y(self) -> float:
        return self.material.f_y

    @property
    def f_u(self) -> float:
        return self.material.f_u


def historic_steel(era: str, t_mm: float, field: str = "existing_steel") -> Steel:
    """fy and fu (MPa) of historic British steel of era band ``era`` at thickness ``t_mm`` (from memory)."""
    if not isinstance(era, str):
        raise InputError(field, era, allowed_materials())
    name = _normalise_era(era)
    if name is None:
        raise InputError(field, era, allowed_materials(), _era_hint(era))
    t = require_positive(field + " thickness", t_mm, "mm")
    band = ERA_BANDS[name]
    for t_max, fy in band.fy_steps:
        if t <= t_max:
            return Steel(f"historic {name}", t, fy, band.f_u)
    raise InputError(field + " thickness", t_mm,
                     f"at most {band.fy_steps[-1][0]:g} mm for era {name}: test the material")


def existing_steel(text: str, t_mm: float, field: str = "existing_steel") -> ExistingSteel:
    """Material of an existing member from an era band or a modern grade.

    Cast or wrought iron, unknown eras and unknown grades raise :class:`InputError`
    listing the allowed era bands and grades.
    """
    if not isinstance(text, str) or not text.strip():
        raise InputError(field, text, allowed_materials())
    low = text.lower()
    if any(w in low for w in _IRON_WORDS):
        raise InputError(field, text, allowed_materials(),
                         "Cast iron and wrought iron are not steel: these checks do not apply; "
                         "appraise the iron member by a specialist method")
    if text.strip().upper().startswith("S"):
        try:
            g = normalise_grade(text)
        except InputError:
            raise InputError(field, text, allowed_materials()) from None
        return ExistingSteel(g, steel(g, t_mm, field + " thickness"), False,
                             "existing steel grade as stated by the user: verify by records or testing")
    name = _normalise_era(text)
    if name is None:
        raise InputError(field, text, allowed_materials(), _era_hint(text))
    return ExistingSteel(f"historic steel {name}", historic_steel(name, t_mm, field), True, HISTORIC_NOTE)


__all__ = ["EXISTING_STEEL_CAUTION", "HISTORIC_NOTE", "ERA_BANDS", "EraBand", "ExistingSteel",
           "allowed_materials", "historic_steel", "existing_steel"]
