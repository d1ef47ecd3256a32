"""Geometry of a simple end connection and its detailing rules.

Coordinates: vertical distances from the top of the new beam (mm), horizontal
from the face of the existing member (mm). An end plate is welded to the beam
web and bolted to the support with two vertical lines of bolts at gauge p_3; a
fin plate is welded to the support and bolted to the beam web with one line of
bolts at distance z from the weld.

Detailing rules and their sources:

* h_p >= 0.6 h_b (plate depth, for torsional restraint of the beam end) and the
  plate within the web between the root fillets: published simple-joint guidance (from memory);
* end plate thickness for rotation capacity: EN 1993-1-8:2005, 6.4.2(2), Eq. 6.32;
  gauge 90 to 140 mm: published guidance (from memory);
* fin plate t_p <= 0.5 d and end/edge distances >= 2 d (ductility, bolt bearing
  before bolt shear): published guidance (from memory);
* long fin plate when z > t_p / 0.15: published guidance (from memory);
* Table 3.3 minimum spacing: :mod:`splicecalc.joints.spacing`;
* fit on the existing member: bolts on its flange (edge distance, clear of the root fillet), plate
  width and depth within its web between the root fillets and, for a notched beam on an existing
  beam web (top flanges level), the plate bottom above the existing bottom root fillet.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

from ...core.record import Calc, CheckRecord
from ...materials.historic import ExistingSteel
from ...materials.partial_factors import NationalAnnex
from ...materials.steel import DENSITY_kg_per_m3, Steel, steel
from ..bolts import Bolt
from ..spacing import check_spacing
from .formulas import t_p_max_ductility

GUIDANCE = "published simple-joint guidance (from memory)"
#: clause of the detailing rules of a simple joint (h_p >= 0.6 h_b, gauge 90-140 mm, e >= 2 d, fits): none.
#: The rules come from published simple-joint guidance (``GUIDANCE``) or the geometry of the detail
#: (``GEOMETRY``), named in the record's ``guidance``; EN 1993-1-8 5.2.2.2 is joint classification and
#: is not their source. A code clause is cited only where one applies (end plate t_p, 6.4.2(2)).
CL_PINNED = ""
#: guidance of a fit rule: the plate or bolts must physically fit the member they meet
GEOMETRY = "geometric fit of the detail, no code clause"
CL_SPACING = "EN 1993-1-8:2005, 3.5, Table 3.3"
#: nominal eccentricity of a beam reaction from the face of a column in simple construction (mm),
#: published UK guidance for simple columns (from memory)
E_NOMINAL_COLUMN = 100.0


@dataclass(frozen=True)
class Detail:
    """One end-connection detail (all mm).

    ``kind`` "end plate" | "fin plate"; ``n_1`` bolt rows; ``n_2`` bolt lines (2 end plate,
    1 fin plate); ``p_1`` vertical pitch; ``e_1`` vertical end distance of the plate
    (top and bottom); ``e_2`` horizontal edge distance of the plate; ``p_3`` gauge
    (end plate); ``t_p`` plate thickness; ``weld_leg`` fillet leg; ``top`` depth from
    the beam top to the top of the plate; ``gap`` beam end to support face (fin plate);
    ``e_2b`` bolt line to beam end (fin plate, horizontal end distance in the beam web).
    """

    kind: str
    bolt: Bolt
    n_1: int
    p_1: float
    e_1: float
    e_2: float
    t_p: float
    plate_grade: str
    weld_leg: float
    top: float
    p_3: float = 0.0
    gap: float = 0.0
    e_2b: float = 0.0

    @property
    def n_2(self) -> int:
        return 2 if self.kind == "end plate" else 1

    @property
    def n_b(self) -> int:
        """Number of bolts."""
        return self.n_1 * self.n_2

    @property
    def h_p(self) -> float:
        """Plate depth (mm)."""
        return (self.n_1 - 1) * self.p_1 + 2.0 * self.e_1

    @property
    def b_p(self) -> float:
        """Plate width (mm): p_3 + 2 e_2 (end plate) or z + e_2 (fin plate)."""
        if self.kind == "end plate":
            return self.p_3 + 2.0 * self.e_2
        return self.z + self.e_2

    @property
    def z(self) -> float:
        """Fin plate: weld face to bolt line (mm); end plate: plate thickness (reaction at the face)."""
        return self.gap + self.e_2b if self.kind == "fin plate" else self.t_p

    @property
    def mass_kg(self) -> float:
        """Plate mass (kg), for ranking candidate details."""
        return self.h_p * self.b_p * self.t_p * 1e-9 * DENSITY_kg_per_m3

    def describe(self) -> str:
        """One line for the calc sheet."""
        b = self.bolt
        if self.kind == "end plate":
            return (f"partial-depth end plate {self.b_p:g} x {self.h_p:g} x {self.t_p:g} mm {self.plate_grade}, "
                    f"{self.n_b} {b.size} {b.bolt_class} bolts ({self.n_1} rows x 2 at {self.p_3:g} mm gauge, "
                    f"pitch {self.p_1:g} mm, e1 {self.e_1:g} mm, e2 {self.e_2:g} mm), {self.weld_leg:g} mm fillet "
                    f"welds both sides of the beam web, plate top {self.top:g} mm below the beam top")
        return (f"fin plate {self.b_p:g} x {self.h_p:g} x {self.t_p:g} mm {self.plate_grade}, {self.n_b} "
                f"{b.size} {b.bolt_class} bolts in one line (pitch {self.p_1:g} mm, e1 {self.e_1:g} mm, e2 "
                f"{self.e_2:g} mm, z {self.z:g} mm, beam end distance {self.e_2b:g} mm, gap {self.gap:g} mm), "
                f"{self.weld_leg:g} mm fillet welds both sides to the support, plate top {self.top:g} mm below "
                "the beam top")

    def to_dict(self) -> dict[str, Any]:
        return {"kind": self.kind, "bolt": f"{self.bolt.size} {self.bolt.bolt_class}", "n_rows": self.n_1,
                "n_lines": self.n_2, "p_1_mm": self.p_1, "e_1_mm": self.e_1, "e_2_mm": self.e_2,
                "p_3_mm": self.p_3, "t_p_mm": self.t_p, "h_p_mm": self.h_p, "b_p_mm": self.b_p,
                "z_mm": self.z, "gap_mm": self.gap, "e_2b_mm": self.e_2b, "weld_leg_mm": self.weld_leg,
                "top_mm": self.top, "plate_grade": self.plate_grade, "plate_mass_kg": round(self.mass_kg, 3)}


@dataclass(frozen=True)
class Context:
    """Everything the checks need besides the detail (all mm, MPa, N)."""

    beam: Any                      # Section of the new beam
    beam_grade: str
    beam_mat: Steel                # at the flange thickness (thickest element)
    existing: Any                  # Section of the existing member
    face: str                      # "column flange" | "column web" | "beam web"
    existing_mat: ExistingSteel    # at the thickness where the connection lands
    na: NationalAnnex
    tie: float                     # tying force, N
    notch_depth: float | None = None
    notch_length: float | None = None
    notch_bottom: float | None = None        # bottom notch depth (mm)
    notch_bottom_length: float | None = None
    level: float = 0.0                       # beam web: new beam top below the existing top (mm)

    @property
    def t_supp(self) -> float:
        """Thickness of the existing element the connection lands on (mm)."""
        return self.existing.tf if self.face == "column flange" else self.existing.tw

    @property
    def notched(self) -> bool:
        return self.notch_depth is not None

    @property
    def web_bottom(self) -> float:
        """Depth from the beam top to the bottom of the usable web (mm): above the bottom root fillet, and
        at least 10 mm above a bottom notch."""
        flat = self.beam.h - self.beam.tf - self.beam.r
        if self.notch_bottom:
            return min(flat, self.beam.h - self.notch_bottom - 10.0)
        return flat

    @property
    def plate_top_min(self) -> float:
        """Highest plate top (mm below the new beam top): on the new web and, on an existing beam web, below
        the existing top root fillet."""
        if self.face == "beam web":
            return max(self.web_top, self.existing.tf + self.existing.r - self.level)
        return self.web_top

    @property
    def plate_bottom_max(self) -> float:
        """Lowest plate bottom (mm below the new beam top): on the new web and, on an existing beam web,
        above the existing bottom root fillet."""
        if self.face == "beam web":
            return min(self.web_bottom, self.existing.h - self.existing.tf - self.existing.r - self.level)
        return self.web_bottom

    @property
    def web_top(self) -> float:
        """Depth from the beam top to the top of the usable web (mm): below the top root fillet, and
        at least 10 mm below a top notch."""
        if self.notched:
            return max(self.notch_depth + 10.0, self.beam.tf + self.beam.r)
        return self.beam.tf + self.beam.r


def weld_grade_existing(ctx: Context) -> str:
    """Grade taken for the existing member as a part joined by a weld (EN 1993-1-8:2005, 4.5.3.2(6):
    the weaker part governs f_u and beta_w).

    A modern grade is used as stated. Historic steel has no Table 4.1 beta_w: it is taken as the
    strongest EN 10025-2 grade (S235, S275, S355) whose f_u at the member thickness does not exceed
    the era f_u, i.e. a lower bound (an era f_u below every grade's falls back to S235).
    """
    mat = ctx.existing_mat
    if not mat.historic:
        return mat.material.grade
    best = "S235"
    for g in ("S235", "S275", "S355"):
        if steel(g, ctx.t_supp).f_u <= mat.f_u + 1e-9:
            best = g
    return best


def _rec(calc: Calc, id: str, title: str, clause: str, demand: float, resistance: float, note: str = "",
         unit: str = "mm", guidance: str = "") -> CheckRecord:
    """A detailing record (tag ``detailing``). A rule with no code clause (``clause`` empty, CL_PINNED) names
    its source in ``guidance``: published simple-joint guidance (``note`` GUIDANCE) or the geometry of the
    detail (GEOMETRY); ``clause`` holds a code clause only."""
    if note == GUIDANCE:                     # the rule itself is the guidance's: say so in its own field
        note, guidance = "", guidance or GUIDANCE
    if not clause and not guidance:
        guidance = GEOMETRY
    return calc.record(id=id, title=title, clause=clause, demand=demand, resistance=resistance, unit=unit,
                       note=note, guidance=guidance, tags=("detailing",))


def detailing_checks(ctx: Context, det: Detail, calc: Calc) -> list[CheckRecord]:
    """Detailing rules of the connection and its fit on the existing member (CheckRecords in mm)."""
    b, beam = det.bolt, ctx.beam
    d0 = b.d_0
    out: list[CheckRecord] = []
    pre = "ep" if det.kind == "end plate" else "fp"
    out.append(_rec(calc, f"{pre}_hp_min", "Plate depth h_p >= 0.6 h_b (torsional restraint)", CL_PINNED,
                    0.6 * beam.h, det.h_p, GUIDANCE))
    out.append(_rec(calc, f"{pre}_hp_fit", "Plate within the beam web between root fillets", CL_PINNED,
                    det.top + det.h_p, ctx.web_bottom,
                    f"plate from {det.top:g} to {det.top + det.h_p:g} mm below the beam top; usable web ends "
                    f"{ctx.web_bottom:g} mm below the top (h - t_f - r): use fewer rows or a smaller pitch"))
    out.append(_rec(calc, f"{pre}_top_fit", "Plate top below the top root fillet / notch", CL_PINNED,
                    ctx.web_top, det.top, "plate must sit on the flat part of the web"))
    if det.kind == "end plate":
        t_max = calc(t_p_max_ductility, d=b.d, f_ub=b.f_ub, f_y=_plate_fy(det))
        out.append(_rec(calc, "ep_tp_ductility", "End plate thickness for rotation capacity",
                        "EN 1993-1-8:2005, 6.4.2(2), Eq. 6.32", det.t_p, t_max,
                        "typical partial-depth end plates are 10 mm (M20) or 12 mm (M24)"))
        out.append(_rec(calc, "ep_gauge_min", "Gauge p_3 >= 90 mm (weld access, rotation)", CL_PINNED,
                        90.0, det.p_3, GUIDANCE))
        out.append(_rec(calc, "ep_gauge_max", "Gauge p_3 <= 140 mm", CL_PINNED, det.p_3, 140.0, GUIDANCE))
        out += check_spacing(d0, det.t_p, e_1=det.e_1, e_2=det.e_2, p_1=det.p_1 if det.n_1 > 1 else None,
                             p_2=det.p_3, calc=calc, id="ep_spacing", where="end plate", p_2_as="p_3")
    else:
        out.append(_rec(calc, "fp_tp_ductility", "Fin plate t_p <= 0.5 d (bolt ductility)", CL_PINNED,
                        det.t_p, 0.5 * b.d, GUIDANCE))
        out.append(_rec(calc, "fp_e1_2d", "Fin plate vertical end distance e_1 >= 2 d", CL_PINNED, 2.0 * b.d,
                        det.e_1, GUIDANCE))
        out.append(_rec(calc, "fp_e2_2d", "Fin plate horizontal edge distance e_2 >= 2 d", CL_PINNED, 2.0 * b.d,
                        det.e_2, GUIDANCE))
        out.append(_rec(calc, "fp_e2b_2d", "Beam web end distance e_2,b >= 2 d", CL_PINNED, 2.0 * b.d,
                        det.e_2b, GUIDANCE))
        out.append(_rec(calc, "fp_rows_min", "At least two bolt rows (moment V z)", CL_PINNED, 2.0,
                        float(det.n_1), "a single bolt cannot resist the eccentricity", unit="", guidance=GUIDANCE))
        out += check_spacing(d0, det.t_p, e_1=det.e_1, e_2=det.e_2, p_1=det.p_1 if det.n_1 > 1 else None,
                             calc=calc, id="fp_spacing", where="fin plate")
        out += check_spacing(d0, beam.tw, e_1=det.e_2b, calc=calc, id="fp_web_spacing", where="beam web")
    out += fit_checks(ctx, det, calc)
    return out


def _plate_fy(det: Detail) -> float:
    from ...materials.steel import steel
    return steel(det.plate_grade, det.t_p).f_y


def fit_checks(ctx: Context, det: Detail, calc: Calc) -> list[CheckRecord]:
    """Does the connection fit the existing member? (bolts in its flange or web, plate in its web)."""
    ex, b = ctx.existing, det.bolt
    out: list[CheckRecord] = []
    if ctx.face == "column flange":
        if det.kind == "end plate":
            e2c = (ex.b - det.p_3) / 2.0
            out.append(_rec(calc, "ex_fit_edge", "Bolts in the existing flange: edge distance >= 1.2 d_0",
                            CL_SPACING, 1.2 * b.d_0, e2c,
                            f"(b - p_3)/2 = ({ex.b:g} - {det.p_3:g})/2: reduce the gauge or use smaller bolts"))
            clear = det.p_3 / 2.0 - ex.tw / 2.0 - ex.r
            out.append(_rec(calc, "ex_fit_root", "Bolts clear the existing root fillet (washer seats flat)",
                            CL_PINNED, b.washer_od / 2.0, clear,
                            f"p_3/2 - t_w/2 - r of the existing member; washer diameter {b.washer_od:g} mm "
                            "(practical rule): increase the gauge"))
            out.append(_rec(calc, "ex_fit_width", "End plate width within the existing flange", CL_PINNED,
                            det.b_p, ex.b, "b_p <= b of the existing flange"))
        else:
            out.append(_rec(calc, "ex_fit_width", "Fin plate thickness within the existing flange width",
                            CL_PINNED, det.t_p + 2.0 * det.weld_leg, ex.b, "plate plus two welds"))
    else:
        d_ex = ex.d
        if ctx.face == "beam web":
            out.append(_rec(calc, "ex_fit_depth", "Plate depth within the existing beam web between root fillets",
                            CL_PINNED, det.h_p, d_ex, f"existing d = h - 2 t_f - 2 r = {d_ex:.1f} mm: use fewer "
                                                      "rows or a smaller pitch"))
        elif det.kind == "end plate":
            out.append(_rec(calc, "ex_fit_width", "End plate width within the existing column web between fillets",
                            CL_PINNED, det.b_p, d_ex, f"b_p <= d = {d_ex:.1f} mm of the column: the plate must sit "
                                                      "flat; reduce the gauge or edge distance"))
            clear = d_ex / 2.0 - det.p_3 / 2.0
            out.append(_rec(calc, "ex_fit_root", "Bolts clear the column root fillets (washer seats flat)",
                            CL_PINNED, det.bolt.washer_od / 2.0, clear,
                            f"d/2 - p_3/2 of the existing column; washer diameter {det.bolt.washer_od:g} mm "
                            "(practical rule): reduce the gauge"))
        if ctx.face == "column web":
            space = ex.h - 2.0 * ex.tf
            out.append(_rec(calc, "ex_fit_flange", "New beam flange fits between the column flanges", CL_PINNED,
                            ctx.beam.b, space, "b of the new beam <= h - 2 t_f of the column: else notch the "
                            "beam flanges"))
        if ctx.face == "beam web":
            out += _beam_web_fit(ctx, det, calc)
    return out


def _beam_web_fit(ctx: Context, det: Detail, calc: Calc) -> list[CheckRecord]:
    """Levels on an existing beam web: the plate on its flat web, the new beam's flanges clear of its flanges
    and root fillets (notches), from the levels of both members (ctx.level: new top below existing top)."""
    from .notch import notch_fit
    ex, lv = ctx.existing, ctx.level
    where = ("tops of steel level" if abs(lv) < 1e-9 else f"new beam top {lv:g} mm below the existing top")
    out: list[CheckRecord] = []
    high = ex.tf + ex.r
    out.append(_rec(calc, "ex_fit_web_top", f"Plate top below the existing beam's top root fillet ({where})",
                    CL_PINNED, high, lv + det.top,
                    f"plate top {lv + det.top:g} mm below the existing top; the existing web is flat from t_f + r = "
                    f"{high:.1f} mm: lower the plate (a deeper top notch)"))
    low = ex.h - ex.tf - ex.r
    out.append(_rec(calc, "ex_fit_web_bottom", f"Plate bottom above the existing beam's bottom root fillet ({where})",
                    CL_PINNED, lv + det.top + det.h_p, low,
                    f"plate from {lv + det.top:g} to {lv + det.top + det.h_p:g} mm below the existing top; the "
                    f"existing web is flat down to h - t_f - r = {low:.1f} mm: use fewer rows, a smaller pitch or a "
                    "shallower notch"))
    fit = notch_fit(ctx.beam, ex, lv)
    lengths = []
    if fit.need_top > 0.0:
        out.append(_rec(calc, "ex_fit_notch", f"New beam's top clears the existing top flange and root fillet ({where})",
                        CL_PINNED, fit.need_top, ctx.notch_depth or 0.0,
                        f"cut needed = existing t_f + r - level = {high:.1f} - {lv:g} mm; top notch given "
                        f"{ctx.notch_depth or 0:g} mm: notch the top flange", guidance=GEOMETRY))
        lengths.append(ctx.notch_length or 0.0)
    if fit.need_bottom > 0.0:
        out.append(_rec(calc, "ex_fit_notch_bottom", f"New beam's bottom clears the existing bottom flange and root "
                        f"fillet ({where})", CL_PINNED, fit.need_bottom, ctx.notch_bottom or 0.0,
                        f"cut needed = level + h_b - (h - t_f - r) of the existing = {lv:g} + {ctx.beam.h:g} - "
                        f"{low:.1f} mm; bottom notch {ctx.notch_bottom or 0:g} mm: notch the bottom flange",
                        guidance=GEOMETRY))
        lengths.append(ctx.notch_bottom_length or 0.0)
    if lengths:
        out.append(_rec(calc, "ex_fit_notch_len", "Notch length clears the existing flange outstand", CL_PINNED,
                        fit.need_length, min(lengths),
                        f"(b - t_w)/2 = ({ex.b:g} - {ex.tw:g})/2 of the existing beam, from its web face (the plate "
                        "thickness or gap taken as tolerance)", guidance=GEOMETRY))
    return out


def ceil_to(x: float, step: float) -> float:
    """Round up to a multiple of ``step``."""
    return math.ceil(x / step - 1e-9) * step


__all__ = ["Detail", "Context", "detailing_checks", "fit_checks", "weld_grade_existing", "GUIDANCE", "CL_PINNED", "GEOMETRY",
           "E_NOMINAL_COLUMN", "ceil_to"]
