"""Structural steel grades to EN 10025-2 with thickness-dependent strengths.

The UK National Annex to BS EN 1993-1-1 (NA.2.4) takes fy and fu from the
product standard rather than from EN 1993-1-1 Table 3.1, so both depend on
the nominal thickness. Values: EN 10025-2:2004, Table 7 (yield: minimum ReH;
tensile: lower bound of the Rm range for 3 mm <= t <= 100 mm).
"""

from __future__ import annotations

from dataclasses import dataclass

from ..core.errors import InputError, require_positive

#: grade -> list of (t_max_mm, fy_MPa); EN 10025-2:2004, Table 7 (ReH, min)
_FY_STEPS: dict[str, tuple[tuple[float, float], ...]] = {
    "S235": ((16, 235), (40, 225), (63, 215), (80, 215), (100, 215), (150, 195), (200, 185), (250, 175)),
    "S275": ((16, 275), (40, 265), (63, 255), (80, 245), (100, 235), (150, 225), (200, 215), (250, 205)),
    "S355": ((16, 355), (40, 345), (63, 335), (80, 325), (100, 315), (150, 295), (200, 285), (250, 275)),
    "S420": ((16, 420), (40, 400), (63, 390), (80, 370), (100, 360), (150, 340)),  # EN 10025-3/-4 (from memory)
    "S460": ((16, 460), (40, 440), (63, 430), (80, 410), (100, 400), (150, 380)),  # EN 10025-3/-4 (from memory)
}
#: grade -> list of (t_max_mm, fu_MPa); EN 10025-2:2004, Table 7 (Rm, lower bound), 3 < t <= 100
_FU_STEPS: dict[str, tuple[tuple[float, float], ...]] = {
    "S235": ((3, 360), (100, 360), (150, 350), (250, 340)),
    "S275": ((3, 430), (100, 410), (150, 400), (250, 380)),
    "S355": ((3, 510), (100, 470), (150, 450), (250, 450)),
    "S420": ((100, 520), (150, 500)),  # EN 10025-3 N/NL (from memory)
    "S460": ((100, 540), (150, 530)),  # EN 10025-3 N/NL (from memory)
}

GRADES: tuple[str, ...] = tuple(_FY_STEPS)

#: modulus of elasticity and shear modulus, EN 1993-1-1:2005, 3.2.6(1)
E_MPa = 210_000.0
G_MPa = 81_000.0
#: density used for self-weight, EN 1991-1-1:2002, Table A.4 (77 to 78.5 kN/m3)
DENSITY_kg_per_m3 = 7850.0


@dataclass(frozen=True)
class Steel:
    """A steel grade at a given thickness: fy, fu in MPa."""

    grade: str
    t_mm: float
    f_y: float
    f_u: float

    @property
    def epsilon(self) -> float:
        """eps = sqrt(235 / fy), EN 1993-1-1:2005, Table 5.2."""
        return (235.0 / self.f_y) ** 0.5


def normalise_grade(grade: str) -> str:
    """'s355', 'S355JR', 'S355 J2' -> 'S355'; unknown grades raise InputError."""
    if not isinstance(grade, str):
        raise InputError("grade", grade, f"one of {', '.join(GRADES)}")
    g = grade.strip().upper().replace(" ", "")
    for base in GRADES:
        if g.startswith(base):
            return base
    raise InputError("grade", grade, f"one of {', '.join(GRADES)} (sub-grades such as S355J2 accepted)")


def _step(table: tuple[tuple[float, float], ...], t: float) -> float | None:
    for t_max, val in table:
        if t <= t_max:
            return val
    return None


def steel(grade: str, t_mm: float, field: str = "thickness") -> Steel:
    """Return fy and fu (MPa) of ``grade`` for nominal thickness ``t_mm``.

    Raises :class:`InputError` for an unknown grade or a thickness outside the
    product standard's range for that grade.
    """
    g = normalise_grade(grade)
    t = require_positive(field, t_mm, "mm")
    t_lim = _FY_STEPS[g][-1][0]
    if t > t_lim:
        raise InputError(field, t_mm, f"a thickness from 0 to {t_lim:g} mm for {g} (EN 10025)")
    fy = _step(_FY_STEPS[g], t)
    fu = _step(_FU_STEPS[g], t)
    if fu is None:  # pragma: no cover - tables cover the same range
        fu = _FU_STEPS[g][-1][1]
    return Steel(g, t, float(fy), float(fu))


def steel_strength(grade: str, t_mm: float) -> tuple[float, float]:
    """(fy, fu) in MPa for ``grade`` at thickness ``t_mm``; see :func:`steel`."""
    s = steel(grade, t_mm)
    return s.f_y, s.f_u
