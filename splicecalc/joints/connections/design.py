"""Design of one end connection of the new beam: choose the detail, run every check.

:func:`design_end_connection` takes the beam, its grade, the design reaction and a
:class:`~.spec.SupportSpec`. Items the user left out (rows, plate thickness, gauge,
weld leg) are chosen automatically: candidate details are tried from the lightest
plate up, and the first one that passes every check is kept, with a short text
saying which lighter options failed and on which check.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Any, Sequence

from ...core.errors import InputError, require_positive
from ...core.record import Calc, CheckRecord
from ...materials.historic import EXISTING_STEEL_CAUTION
from ...materials.partial_factors import UK_NA, NationalAnnex
from ...materials.steel import normalise_grade, steel
from ..bolts import get_bolt
from ..welds import full_strength_fillet
from .detail import Context, Detail, ceil_to, detailing_checks, weld_grade_existing
from .endplate import end_plate_checks
from .existing import ExistingResult, existing_checks, existing_material
from .finplate import fin_plate_checks
from .notch import check_double_notch, check_notch, notch_fit, notch_ltb_not_checked
from .spec import TYING_MIN_N, SupportSpec

#: standard fillet leg sizes (mm)
WELD_LEGS = (4.0, 5.0, 6.0, 8.0, 10.0, 12.0, 15.0)
#: plate thicknesses tried when not given (mm)
END_PLATE_T = (10.0, 12.0, 15.0)
FIN_PLATE_T = (8.0, 10.0, 12.0, 15.0)
#: gauges tried for an end plate when not given (mm); 90-140 mm is the usual range
GAUGES = (90.0, 100.0, 120.0, 140.0)
#: gap between the beam end and the support face for a fin plate (mm)
FIN_GAP = 10.0
MAX_ROWS = 12


@dataclass(frozen=True)
class ConnectionDesign:
    """Result of :func:`design_end_connection`.

    ``records``: every CheckRecord (detailing, connection, notch, existing member);
    ``existing``: the existing-member result (its records are also in ``records``),
    with the added moment for the column / supporting beam check; ``choice``: how the
    detail was chosen; ``caution``: text to print in the calc; ``beam``: the new beam's Section.
    """

    spec: SupportSpec
    detail: Detail
    V_Ed: float
    records: tuple[CheckRecord, ...]
    existing: ExistingResult
    choice: str
    caution: str = EXISTING_STEEL_CAUTION
    warnings: tuple[str, ...] = ()
    beam: Any = None
    tie: float = TYING_MIN_N
    tie_basis: str = "75 kN minimum"

    @property
    def ok(self) -> bool:
        """Every check made passes and none is NOT CHECKED."""
        return all(r.ok for r in self.records)

    @property
    def checks_pass(self) -> bool:
        """Every check made passes (NOT CHECKED records aside: see :attr:`not_checked`)."""
        return all(r.ok for r in self.records if r.checked)

    @property
    def not_checked(self) -> list[CheckRecord]:
        return [r for r in self.records if not r.checked]

    @property
    def governing(self) -> CheckRecord:
        return max((r for r in self.records if r.checked), key=lambda r: r.utilisation)

    def failing(self) -> list[CheckRecord]:
        return [r for r in self.records if not r.ok]

    def summary(self) -> str:
        lines = [f"Support {self.spec.index} ({self.spec.at}): {self.detail.describe()}",
                 f"V_Ed = {self.V_Ed / 1e3:.1f} kN, tying force = {self.tie / 1e3:.1f} kN ({self.tie_basis})",
                 self.choice, self.existing.text]
        lines += [r.summary_line() for r in self.records]
        lines += list(self.warnings)
        lines.append(self.caution)
        return "\n".join(lines)

    def to_dict(self) -> dict[str, Any]:
        return {"support": self.spec.index, "at": self.spec.at, "connection": self.spec.connection,
                "V_Ed_kN": self.V_Ed / 1e3, "tying_force_kN": self.tie / 1e3, "tying_basis": self.tie_basis,
                "detail": self.detail.to_dict(), "ok": self.ok, "choice": self.choice,
                "notches": {"top_depth_mm": self.spec.notch_depth, "top_length_mm": self.spec.notch_length,
                            "bottom_depth_mm": self.spec.notch_bottom_depth,
                            "bottom_length_mm": self.spec.notch_bottom_length,
                            "top_below_existing_mm": self.spec.level, "basis": self.spec.notch_basis},
                "existing": {"material": self.existing.material.label, "f_y_MPa": self.existing.material.f_y,
                             "f_u_MPa": self.existing.material.f_u, "historic": self.existing.material.historic,
                             "M_add_kNm": self.existing.M_add_Nmm / 1e6, "e_mm": self.existing.e_mm,
                             "axis": self.existing.axis, "text": self.existing.text,
                             "member": _member_dict(self.existing.member)},
                "checks": [r.to_dict() for r in self.records], "warnings": list(self.warnings),
                "caution": self.caution}


def _member_dict(m: Any) -> dict[str, Any] | None:
    """JSON of the existing member's member check: kind ('' when NOT CHECKED), basis, loads, combination."""
    if m is None:
        return None
    return {"kind": m.kind or "not checked", "combination": m.combination, "basis": list(m.basis),
            "loads": [dict(zip(("load", "action", "value", "where"), r)) for r in m.load_rows]}


# ------------------------------------------------------------------ candidates

def _pitch(bolt) -> float:
    return max(70.0, ceil_to(2.5 * bolt.d_0, 5.0))


def _weld_leg(s_req: float) -> float:
    for s in WELD_LEGS:
        if s >= s_req - 1e-9:
            return s
    return WELD_LEGS[-1]


def _candidates(ctx: Context, spec: SupportSpec, bolt) -> tuple[list[Detail], str]:
    """Candidate details, lightest plate first, and a note on the row range."""
    kind = spec.connection
    d, d0 = bolt.d, bolt.d_0
    p_1 = spec.pitch or _pitch(bolt)
    if kind == "end plate":
        e_1 = max(40.0, ceil_to(1.5 * d0, 5.0))
        e_2 = max(30.0, ceil_to(1.25 * d0, 5.0))
        thick = (spec.plate_t,) if spec.plate_t else END_PLATE_T
        gauges = (spec.gauge,) if spec.gauge else GAUGES
    else:
        e_1 = ceil_to(2.5 * d, 5.0)
        e_2 = ceil_to(2.5 * d, 5.0)
        thick = (spec.plate_t,) if spec.plate_t else FIN_PLATE_T
        gauges = (0.0,)
    top = ctx.plate_top_min
    n_lo = 1 if kind == "end plate" else 2
    if spec.rows:
        rows = [spec.rows]
        note = f"{spec.rows} rows as specified"
    else:
        n_min = max(n_lo, math.ceil((0.6 * ctx.beam.h - 2.0 * e_1) / p_1 - 1e-9) + 1)
        n_fit = math.floor((ctx.plate_bottom_max - top - 2.0 * e_1) / p_1 + 1e-9) + 1
        n_max = min(MAX_ROWS, max(n_min, n_fit))
        rows = list(range(n_min, n_max + 1))
        note = (f"rows tried {n_min} to {n_max} (fewer than {n_min} would make h_p < 0.6 h_b; more than "
                f"{max(n_fit, n_min)} would not fit the web)")
    out: list[Detail] = []
    for n in rows:
        for t in thick:
            for g in gauges:
                if kind == "end plate":
                    s = spec.weld_leg or _weld_leg(full_strength_fillet(ctx.beam.tw, ctx.beam_grade,
                                                                        grade_other=spec.plate_grade,
                                                                        t_other=t, na=ctx.na).s_req)
                    out.append(Detail(kind, bolt, n, p_1, e_1, e_2, t, spec.plate_grade, s, top, p_3=g))
                else:
                    s = spec.weld_leg or _weld_leg(full_strength_fillet(t, spec.plate_grade,
                                                                        grade_other=weld_grade_existing(ctx),
                                                                        t_other=ctx.t_supp, na=ctx.na).s_req)
                    e_2b = ceil_to(2.0 * d, 5.0)
                    out.append(Detail(kind, bolt, n, p_1, e_1, e_2, t, spec.plate_grade, s, top, gap=FIN_GAP,
                                      e_2b=e_2b))
    out.sort(key=lambda det: (round(det.mass_kg, 6), det.n_b, det.t_p))
    return out, note


def evaluate(ctx: Context, det: Detail, V_Ed: float, calc: Calc) -> tuple[list[CheckRecord], ExistingResult]:
    """Every check of one detail: detailing, connection, notch, existing member."""
    recs = detailing_checks(ctx, det, calc)
    if det.kind == "end plate":
        recs += end_plate_checks(ctx, det, V_Ed, calc)
    else:
        recs += fin_plate_checks(ctx, det, V_Ed, calc)
    z0 = det.t_p if det.kind == "end plate" else det.gap
    holes = det.n_1 if det.kind == "fin plate" else 0      # fin plate bolts sit in the notched length
    fy, fu = ctx.beam_mat.f_y, ctx.beam_mat.f_u
    if ctx.notched and ctx.notch_bottom:
        c = max(ctx.notch_length, ctx.notch_bottom_length or 0.0)
        recs += check_double_notch(ctx.beam, fy, fu, V_Ed, ctx.notch_depth, ctx.notch_bottom, c, c + z0,
                                   tie=ctx.tie, holes=holes, d_0=det.bolt.d_0, na=ctx.na, calc=calc)
    elif ctx.notched:
        recs += check_notch(ctx.beam, fy, V_Ed, ctx.notch_depth, ctx.notch_length, ctx.notch_length + z0,
                            na=ctx.na, calc=calc, tie=ctx.tie, f_u=fu, holes=holes, d_0=det.bolt.d_0)
    elif ctx.notch_bottom:
        recs += check_notch(ctx.beam, fy, V_Ed, ctx.notch_bottom, ctx.notch_bottom_length,
                            ctx.notch_bottom_length + z0, na=ctx.na, calc=calc, prefix="notch_bottom", tie=ctx.tie,
                            f_u=fu, holes=holes, d_0=det.bolt.d_0)
    ex = existing_checks(ctx, det, V_Ed, calc)
    recs += list(ex.records)
    return recs, ex


def _fit_notches(beam: Any, spec: Any) -> Any:
    """On an existing beam web, find from the levels of both members where the new beam's flanges meet the
    existing flanges and root fillets, and design the notches the job did not give (top and / or bottom)."""
    if not isinstance(spec, SupportSpec) or spec.existing_face != "beam web" or not hasattr(beam, "h"):
        return spec
    fit = notch_fit(beam, spec.existing_member, spec.level)
    kw: dict[str, Any] = {"notch_basis": fit.text}
    if fit.top and not spec.notched:
        kw.update(notch_depth=fit.top, notch_length=fit.length)
    elif spec.notched and fit.top:
        kw["notch_basis"] = fit.text + f" Top notch as given in the job: {spec.notch_depth:g} x {spec.notch_length:g} mm."
    if fit.bottom:
        kw.update(notch_bottom_depth=fit.bottom, notch_bottom_length=fit.length)
    top = kw.get("notch_depth", spec.notch_depth) or 0.0
    bottom = fit.bottom or 0.0
    flat = beam.h - beam.tf - beam.r
    if (top and bottom and top + bottom >= beam.h - 2.0 * beam.tf) or (not bottom and top >= flat) \
            or (not top and bottom >= flat):
        where = "tops of steel level" if abs(spec.level) < 1e-9 else f"top_below_existing = {spec.level:g} mm"
        raise InputError(f"{spec.field}.top_below_existing", f"{spec.level:g} mm",
                         f"a level at which the new beam {beam.designation} keeps its web past the existing "
                         f"flanges ({where} needs notches of top {top:g} mm and bottom {bottom:g} mm in a "
                         f"{beam.h:g} mm beam)", "Change the level or the new beam's depth, or use a different "
                                                 "support detail")
    return replace(spec, **kw)


def _label(det: Detail) -> str:
    s = f"{det.n_1} rows, {det.t_p:g} mm plate"
    if det.kind == "end plate":
        s += f", gauge {det.p_3:g} mm"
    return s


def _validate(beam_section: Any, beam_grade: str, V_Ed: float, spec: Any, na: Any) -> tuple[float, str]:
    if not isinstance(spec, SupportSpec):
        raise InputError("spec", spec, "a SupportSpec from parse_support(table, index)")
    for k in ("h", "b", "tw", "tf", "r", "Av_z", "d"):
        if not hasattr(beam_section, k):
            raise InputError("beam_section", beam_section, "a Section (splicecalc.sections.get_section)")
    if not isinstance(na, NationalAnnex):
        raise InputError("na", na, "a NationalAnnex (e.g. splicecalc.materials.UK_NA)")
    try:
        V = require_positive("V_Ed", V_Ed, "N")
    except InputError:
        raise InputError(f"{spec.field}.V_Ed", V_Ed, "a design reaction > 0 N",
                         "A connection with no reaction cannot be designed: check the load case and the "
                         "support position") from None
    g = normalise_grade(beam_grade)
    if spec.notched:
        lim = beam_section.h - beam_section.tf - beam_section.r
        if not beam_section.tf <= spec.notch_depth < lim:
            raise InputError(f"{spec.field}.notch_top", spec.notch_depth,
                             f"a notch depth from t_f = {beam_section.tf:g} mm (a notch removes the top flange) to "
                             f"less than h - t_f - r = {lim:g} mm of the beam (and normally at most h/2 = "
                             f"{beam_section.h / 2:g} mm)")
    if spec.connection == "fin plate" and spec.rows is not None and spec.rows < 2:
        raise InputError(f"{spec.field}.rows", spec.rows, "at least 2 bolt rows for a fin plate",
                         "One bolt cannot resist the moment V_Ed z of the eccentric bolt group")
    return V, g


def design_end_connection(beam_section: Any, beam_grade: str, V_Ed: float, spec: SupportSpec,
                          na: NationalAnnex = UK_NA, render: bool = False, *, reactions: Sequence[Any] | None = None,
                          tying: tuple[float, str] | None = None, psi: Any = None,
                          restrained: bool = False) -> ConnectionDesign:
    """Design one end connection (partial-depth end plate or fin plate) of the new beam.

    ``beam_section``: Section of the new beam; ``beam_grade``: e.g. "S355"; ``V_Ed``: design
    reaction (N, > 0); ``spec``: from :func:`~.spec.parse_support`. Returns the chosen detail
    with every CheckRecord (each citing its clause), the existing-member result and the caution.
    ``render=True`` renders the chosen detail's checks with handcalcs.

    ``reactions``: the new beam's characteristic reactions at this end per action
    (:class:`~.existing_member.ReactionPart`, from :func:`~.existing_member.reactions_by_action`),
    used with ``spec.existing_loads`` in the member check of the existing member (None: ``V_Ed``
    taken as a permanent action, conservative). ``tying``: (force N, basis text) computed from the
    loads (:func:`~.tying.tying_force_from_loads`); a ``tying_force`` in the job overrides it; with
    neither the 75 kN minimum is used. ``psi``: the job's psi-factor table. ``restrained``: the new
    beam's compression flange is held laterally along its length (job ``restraints = "continuous"``);
    otherwise a notched end gets a NOT CHECKED record for the beam's LTB with the notch.
    """
    from ...materials.historic import existing_material_of
    from .existing_member import existing_member_checks

    spec = _fit_notches(beam_section, spec)
    V, grade = _validate(beam_section, beam_grade, V_Ed, spec, na)
    bolt = get_bolt(spec.bolt_size, spec.bolt_class)
    mat = existing_material(spec.existing_member, spec.existing_face, spec.existing_steel)
    if spec.tying_given:
        tie, tie_basis = spec.tying_force, "given in the job"
    elif tying is not None:
        tie, tie_basis = tying
    else:
        tie, tie_basis = TYING_MIN_N, "75 kN minimum (the beam's loads were not given to compute it)"
    ctx = Context(beam=beam_section, beam_grade=grade, beam_mat=steel(grade, beam_section.tf),
                  existing=spec.existing_member, face=spec.existing_face, existing_mat=mat, na=na,
                  tie=tie, notch_depth=spec.notch_depth, notch_length=spec.notch_length,
                  notch_bottom=spec.notch_bottom_depth, notch_bottom_length=spec.notch_bottom_length,
                  level=spec.level)
    cands, row_note = _candidates(ctx, spec, bolt)
    rejected: list[str] = []
    chosen = None
    best = None
    for det in cands:
        recs, _ = evaluate(ctx, det, V, Calc())
        worst = max((r for r in recs if r.checked), key=lambda r: r.utilisation)
        if best is None or worst.utilisation < best[1]:
            best = (det, worst.utilisation)
        if worst.ok:
            chosen = det
            break
        rejected.append(f"{_label(det)}: fails '{worst.title}' (u = {worst.utilisation:.2f})")
    auto = [k for k, v in (("rows", spec.rows), ("plate thickness", spec.plate_t), ("weld leg", spec.weld_leg))
            if v is None]
    if spec.connection == "end plate" and spec.gauge is None:
        auto.append("gauge")
    if chosen is not None:
        head = f"Chosen: {_label(chosen)}, {chosen.weld_leg:g} mm welds ({chosen.mass_kg:.1f} kg plate)"
        head += (", the lightest candidate that passes every check" if auto else ", as specified")
    else:
        chosen = best[0]
        head = (f"NO candidate passes every check; shown: {_label(chosen)} (lowest governing utilisation "
                f"{best[1]:.2f}). Change the connection type, bolt size, plate grade or the existing-member "
                "assumptions")
    parts = [head + "."] + ([spec.notch_basis] if spec.notch_basis else [])
    if auto:
        parts.append("Chosen automatically: " + ", ".join(auto) + f"; {row_note}; weld leg = smallest standard "
                     "leg giving a full-strength weld (EN 1993-1-8 4.5.3.2).")
    if rejected:
        shown = rejected[:8]
        more = f" (and {len(rejected) - 8} more)" if len(rejected) > 8 else ""
        parts.append("Lighter options rejected: " + "; ".join(shown) + more + ".")
    calc = Calc(render=render)
    recs, ex = evaluate(ctx, chosen, V, calc)
    member = existing_member_checks(spec.existing_member, spec.existing_loads,
                                    lambda t: existing_material_of(spec.existing_steel, t), spec.existing_face,
                                    chosen, reactions, V, na, psi, tie, calc)
    ex = replace(ex, records=ex.records + member.records, member=member)
    recs = list(recs) + list(member.records)
    if (spec.notched or spec.notch_bottom_depth) and not restrained:
        recs.append(notch_ltb_not_checked(spec))
    warnings = []
    if spec.connection == "fin plate":
        warnings.append("The fin plate is WELDED to the existing member: confirm the weldability of the existing "
                        "steel before specifying it (or use a bolted end plate).")
    if tie < TYING_MIN_N - 1e-6:
        warnings.append(f"Tying force {tie / 1e3:g} kN is below the {TYING_MIN_N / 1e3:g} kN minimum of UK "
                        "practice (from memory of the UK NA to EN 1991-1-7): confirm that the building's "
                        "consequence class allows it.")
    if mat.label.startswith("unknown"):
        warnings.append(f"EXISTING STEEL OF UNKNOWN DATE AND GRADE: {mat.label}, f_y = {mat.f_y:g} MPa, f_u = "
                        f"{mat.f_u:g} MPa (lowest era band of published appraisal guidance, from memory). Identify "
                        "the material (it may be wrought or cast iron) and test it before relying on these checks.")
    elif mat.label.startswith("tested"):
        warnings.append(f"Existing steel strength from coupon tests: {mat.label}, f_u,k = {mat.f_u:g} MPa by EN 1990 "
                        "Annex D (Table D1 from memory): confirm the coupons represent this member.")
    elif mat.historic:
        warnings.append(f"Existing steel strength from the era band {mat.label} (f_y = {mat.f_y:g} MPa, "
                        f"f_u = {mat.f_u:g} MPa): values from memory of published appraisal guidance; verify.")
    if spec.existing_loads is None:
        warnings.append("The existing member is NOT CHECKED as a member: its own loads are not given "
                        "([support.existing_loads]).")
    return ConnectionDesign(spec=spec, detail=chosen, V_Ed=V, records=tuple(recs), existing=ex,
                            choice=" ".join(parts), warnings=tuple(warnings), beam=beam_section, tie=tie,
                            tie_basis=tie_basis)


__all__ = ["ConnectionDesign", "design_end_connection", "evaluate", "WELD_LEGS"]
