"""Check a given cover-plate splice layout: :func:`check_splice` -> :class:`SpliceDesign`.

The automatic layout search that calls this lives one layer up, in
:func:`splicecalc.design.splice_layout.design_splice`.
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import Any

from ...core.errors import InputError, require_finite
from ...core.record import Calc, CheckRecord
from ...core.units import convert
from ...materials.partial_factors import UK_NA, NationalAnnex
from ...materials.steel import normalise_grade
from ..bolts import PRELOAD_CLASSES, get_bolt
from .checks import detailing_records, flange_records, member_records, web_records
from .forces import SpliceForces, flange_reach, splice_forces
from .geometry import Geometry, geometry
from .spec import SpliceLayout, SpliceSpec


@dataclass(frozen=True)
class SpliceDesign:
    """A checked splice: layout, derived geometry, forces, check records and cost."""

    section: Any
    grade: str
    layout: SpliceLayout
    geometry: Geometry
    forces: SpliceForces
    records: tuple[CheckRecord, ...]
    cost: float
    location_mm: float | None = None
    force_latex: tuple[str, ...] = ()
    notes: tuple[str, ...] = ()
    alternatives: tuple["SpliceDesign", ...] = ()

    @property
    def ok(self) -> bool:
        return all(r.ok for r in self.records)

    @property
    def max_utilisation(self) -> float:
        return max((r.utilisation for r in self.records), default=0.0)

    @property
    def governing(self) -> CheckRecord | None:
        return max(self.records, key=lambda r: r.utilisation, default=None)

    @property
    def n_bolts(self) -> int:
        return self.geometry.n_bolts

    @property
    def plate_mass(self) -> float:
        return self.geometry.plate_mass

    def drawing_data(self, title: str | None = None) -> dict[str, Any]:
        """Dimensions for the drawing (JSON, mm): :func:`splicecalc.joints.splice.drawing.splice_drawing_data`."""
        from .drawing import splice_drawing_data

        return splice_drawing_data(self, title)

    def drawing(self, title: str | None = None) -> Any:
        """Elevation and plan to scale (a matplotlib Figure; :func:`~.drawing.draw_splice`)."""
        from .drawing import draw_splice

        return draw_splice(self, title)

    def describe(self) -> str:
        f, w, L = self.layout.flange, self.layout.web, self.layout
        inner = f" + 2 inner {self.geometry.b_pi:g}x{f.inner_plate:g}" if f.inner_plate > 0 else ""
        return (f"{L.bolt_size} {L.bolt_class}; flange {f.rows}x{f.columns} bolts each side, p1 {f.pitch:g}, "
                f"gauge {f.gauge:g}, outer {self.geometry.b_po:g}x{f.plate:g}{inner} x {self.geometry.L_fp:g} long; "
                f"web {w.rows}x{w.columns}, p {w.pitch:g}" + (f", gauge {w.gauge:g}" if w.columns > 1 else "")
                + f", 2 plates {self.geometry.h_wp:g}x{w.plate:g} x {self.geometry.L_wp:g} long; "
                f"{self.n_bolts} bolts, plates {self.plate_mass:.1f} kg, cost {self.cost:.1f}")

    def to_dict(self) -> dict:
        f, w = self.layout.flange, self.layout.web
        return {
            "bolt": f"{self.layout.bolt_size} {self.layout.bolt_class}",
            "location_m": None if self.location_mm is None else round(self.location_mm / 1000, 4),
            "flange": {"rows": f.rows, "columns": f.columns, "pitch_mm": f.pitch, "gauge_mm": f.gauge,
                       "gauge_outer_mm": f.gauge_outer, "e1_mm": self.geometry.e1_f,
                       "outer_plate_mm": [self.geometry.b_po, f.plate, self.geometry.L_fp],
                       "inner_plate_mm": [self.geometry.b_pi, f.inner_plate, self.geometry.L_fp] if f.inner_plate else None},
            "web": {"rows": w.rows, "columns": w.columns, "pitch_mm": w.pitch, "gauge_mm": w.gauge,
                    "e1_mm": self.geometry.e1_w, "e_v_mm": self.geometry.e_v,
                    "plate_mm": [self.geometry.h_wp, w.plate, self.geometry.L_wp]},
            "forces": {"M_Ed_kNm": self.forces.M_Ed / 1e6, "V_Ed_kN": self.forces.V_Ed / 1e3,
                       "N_Ed_kN": self.forces.N_Ed / 1e3, "M_w_Ed_kNm": self.forces.M_w_Ed / 1e6,
                       "F_f_Ed_kN": self.forces.F_f_Ed / 1e3, "z_mm": self.forces.z,
                       "M_g_Ed_kNm": self.forces.M_g_Ed / 1e6, "F_web_max_kN": self.forces.F_web_max / 1e3},
            "n_bolts": self.n_bolts, "plate_mass_kg": round(self.plate_mass, 2), "cost": round(self.cost, 3),
            "ok": self.ok, "max_utilisation": round(self.max_utilisation, 4),
            "checks": [r.to_dict() for r in self.records], "notes": list(self.notes),
        }


@dataclass(frozen=True)
class SpliceKit:
    """Everything bolted on at one splice (kg): cover plates and bolt assemblies (flange and web sets)."""

    plates_kg: float
    n_flange_bolts: int
    flange_assembly: Any
    n_web_bolts: int
    web_assembly: Any

    @property
    def bolts_kg(self) -> float:
        return self.n_flange_bolts * self.flange_assembly.mass_kg + self.n_web_bolts * self.web_assembly.mass_kg

    @property
    def mass_kg(self) -> float:
        return self.plates_kg + self.bolts_kg

    def describe(self) -> str:
        fa, wa = self.flange_assembly, self.web_assembly
        return (f"cover plates {self.plates_kg:.1f} kg; {self.n_flange_bolts} flange assemblies {fa.size} x "
                f"{fa.length_mm:g} ({fa.mass_kg:.3f} kg each: {fa.standard}) and {self.n_web_bolts} web assemblies "
                f"{wa.size} x {wa.length_mm:g} ({wa.mass_kg:.3f} kg each) = {self.bolts_kg:.1f} kg; kit "
                f"{self.mass_kg:.1f} kg")


def splice_kit(design: "SpliceDesign", spec: SpliceSpec) -> SpliceKit:
    """The whole kit of a designed splice: plates from the geometry, bolt assemblies from the product
    standards' dimensions (:func:`splicecalc.joints.bolts.bolt_assembly`) for each group's grip
    (flange: outer plate + beam flange + inner plate + packing; web: two web plates + beam web);
    preloaded sets (EN 14399) for categories B and C."""
    from ..bolts import bolt_assembly
    g, sec, size = design.geometry, design.section, design.layout.bolt_size
    pre = spec.category in ("B", "C")
    grip_f = g.t_po + sec.tf + g.t_pi + spec.packing
    grip_w = 2 * g.t_wp + sec.tw
    return SpliceKit(plates_kg=g.plate_mass, n_flange_bolts=4 * g.n_f, flange_assembly=bolt_assembly(size, grip_f, pre),
                     n_web_bolts=2 * g.n_w, web_assembly=bolt_assembly(size, grip_w, pre))


def splice_bolt(size: str, bolt_class: str, spec: SpliceSpec):
    """The bolt with the hole of ``spec.holes``: for oversize holes ``d_0`` is the oversize
    hole (EN 1090-2 clearances, from the bolt data), so spacing, net areas and bearing use it."""
    b = get_bolt(size, bolt_class)
    return replace(b, d_0=b.d_0_oversize) if spec.holes == "oversize" else b


def splice_cost(n_bolts: int, plate_mass: float, spec: SpliceSpec) -> float:
    """Stated cost: per_bolt x number of bolts + per_kg x plate mass (kg)."""
    return spec.cost_per_bolt * n_bolts + spec.cost_per_kg * plate_mass


def moment_resistance(section, grade: str, na: NationalAnnex = UK_NA) -> float:
    """M_c,Rd of the gross section (N*mm), from the member checks (EN 1993-1-1 6.2.5)."""
    from ...members import check_bending
    r = check_bending(section, grade, 0.0, na)
    return convert(r.resistance, "kNm", "Nmm")


def validate_inputs(section, grade, M_Ed, V_Ed, N_Ed, spec, na) -> tuple[str, float, float, float]:
    for a in ("h", "b", "tw", "tf", "r", "Iy", "A"):
        if not hasattr(section, a):
            raise InputError("section", section, "a Section from splicecalc.sections.get_section")
    g = normalise_grade(grade)
    M = require_finite("M_Ed", M_Ed)
    V = require_finite("V_Ed", V_Ed)
    N = require_finite("N_Ed", N_Ed)
    if not isinstance(spec, SpliceSpec):
        raise InputError("spec", spec, "a SpliceSpec from parse_splices(...)")
    if not isinstance(na, NationalAnnex):
        raise InputError("na", na, "a NationalAnnex (e.g. splicecalc.materials.UK_NA)")
    return g, M, V, N


def serviceability_forces(section, spec: SpliceSpec, web, web_e1: float, forces: SpliceForces, M_Ed: float,
                          V_Ed: float, M_Ed_ser: float | None, V_Ed_ser: float | None, flange_a: float = 0.0):
    """Category B slip forces: (flange force F_f,ser (N) or None, web ratio F_r,ser/F_r or None, note).

    With no serviceability forces the ULS forces are used (conservative, noted); a
    missing one of the two is taken at its ULS value. Used by :func:`check_splice`
    and by the layout search, so both check slip with the same forces.
    """
    if spec.category != "B":
        return None, None, ""
    if M_Ed_ser is None and V_Ed_ser is None:
        return None, None, "Category B slip checked with the ULS forces (no serviceability forces given): conservative."
    Ms = abs(require_finite("M_Ed_ser", M_Ed_ser if M_Ed_ser is not None else M_Ed))
    Vs = abs(require_finite("V_Ed_ser", V_Ed_ser if V_Ed_ser is not None else V_Ed))
    fs = splice_forces(section, Ms, Vs, 0.0, gap=spec.gap, web_rows=web.rows, web_columns=web.columns,
                       web_pitch=web.pitch, web_gauge=web.gauge, web_e1=web_e1, flange_a=flange_a)
    ratio = fs.F_web_max / forces.F_web_max if forces.F_web_max > 0 else 1.0
    return fs.F_f_Ed, ratio, ""


def check_splice(section, grade: str, M_Ed: float, V_Ed: float, N_Ed: float = 0.0, *, spec: SpliceSpec,
                 layout: SpliceLayout, na: NationalAnnex = UK_NA, render: bool = False,
                 M_Ed_ser: float | None = None, V_Ed_ser: float | None = None, location_mm: float | None = None,
                 M_c_Rd: float | None = None, stop_on_fail: bool = False) -> SpliceDesign:
    """Check a given splice layout for M_Ed (N*mm), V_Ed (N), N_Ed (N, tension +).

    ``M_Ed_ser``/``V_Ed_ser``: serviceability forces for category B slip (default:
    the ULS forces, conservative, noted). ``M_c_Rd`` (N*mm): the beam's moment
    resistance for ``spec.min_design_moment`` (computed when not given).
    ``stop_on_fail``: the search's fast path (stop after the first failing group).
    """
    grade, M_Ed, V_Ed, N_Ed = validate_inputs(section, grade, M_Ed, V_Ed, N_Ed, spec, na)
    if not isinstance(layout, SpliceLayout):
        raise InputError("layout", layout, "a SpliceLayout")
    fl = layout.flange
    if fl.columns not in (2, 4):
        raise InputError("layout.flange.columns", fl.columns, "2 or 4 (bolt lines symmetric about the web)")
    if fl.columns == 4 and not fl.gauge_outer > 0.0:
        raise InputError("layout.flange.gauge_outer", fl.gauge_outer, "a length > 0 mm when columns = 4")
    bolt = splice_bolt(layout.bolt_size, layout.bolt_class, spec)
    if spec.category in ("B", "C") and bolt.bolt_class not in PRELOAD_CLASSES:
        raise InputError("splices.bolts", f"{bolt.size} {bolt.bolt_class}",
                         "a preloadable class 8.8 or 10.9 for category B or C (EN 1993-1-8 3.1.2)")
    notes: list[str] = []
    g = geometry(section, bolt, layout, spec.gap)
    k_min = spec.min_design_moment
    if k_min > 0 and M_c_Rd is None:
        M_c_Rd = moment_resistance(section, grade, na)
    calc = Calc(render=render)
    w = layout.web
    a_f = flange_reach(spec.gap, g.e1_f, layout.flange.rows, g.p1_f)
    forces = splice_forces(section, M_Ed, V_Ed, N_Ed, gap=spec.gap, web_rows=w.rows, web_columns=w.columns,
                           web_pitch=w.pitch, web_gauge=w.gauge, web_e1=g.e1_w, k_min=k_min,
                           M_c_Rd=M_c_Rd or 0.0, calc=calc, flange_a=a_f)
    force_latex = tuple(calc.latex)
    calc.latex = []
    F_f_ser, ser_ratio, note = serviceability_forces(section, spec, w, g.e1_w, forces, M_Ed, V_Ed, M_Ed_ser, V_Ed_ser,
                                                     a_f)
    if note:
        notes.append(note)
    if k_min > 0:
        notes.append(f"Design moment includes the minimum {k_min:g} M_c,Rd (user setting).")
    notes.append("Moment shared by stiffness (web M I_web/I_y, h_w = h - 2 t_f); flange force lever arm "
                 "z = h - t_f (conservative); each bolt group's forces taken at its outermost bolt row "
                 f"(M + V a: a_f = {a_f:g} mm flange, a_w = {forces.a_w:g} mm web); web bolts by the elastic "
                 "polar method (EN 1993-1-8 3.12(3)); two-direction bearing as a linear utilisation "
                 "sqrt((F_x/F_b,x,Rd)^2 + (F_z/F_b,z,Rd)^2).")
    records: list[CheckRecord] = []
    loc = location_mm
    det = detailing_records(section, bolt, g, spec, loc)
    records += det
    if stop_on_fail and not all(r.ok for r in det):
        return SpliceDesign(section, grade, layout, g, forces, tuple(records), splice_cost(g.n_bolts, g.plate_mass, spec),
                            loc, force_latex, tuple(notes))
    records += flange_records(section, grade, bolt, g, spec, forces.F_f_Ed, na, calc, F_f_ser, loc)
    if stop_on_fail and not all(r.ok for r in records):
        return SpliceDesign(section, grade, layout, g, forces, tuple(records), splice_cost(g.n_bolts, g.plate_mass, spec),
                            loc, force_latex, tuple(notes))
    records += web_records(section, grade, bolt, g, spec, forces, na, calc, ser_ratio, loc)
    records += member_records(section, grade, bolt, g, spec, forces, na, calc, loc)
    return SpliceDesign(section, grade, layout, g, forces, tuple(records), splice_cost(g.n_bolts, g.plate_mass, spec),
                        loc, force_latex, tuple(notes))


__all__ = ["SpliceDesign", "SpliceKit", "splice_kit", "check_splice", "serviceability_forces", "splice_bolt", "splice_cost", "moment_resistance", "validate_inputs"]
