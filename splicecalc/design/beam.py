"""Design of the simply supported beam of a job: all member checks, lightest section search.

:func:`design_beam` takes a :class:`~splicecalc.job.Job` and

* adds the beam self-weight (permanent, full span, from the section's nominal mass);
* forms every ULS combination (EN 1990 Eq. 6.10, or 6.10a and 6.10b, each variable
  action leading in turn) and the SLS characteristic combinations, with
  :mod:`splicecalc.actions`;
* analyses each exactly with :class:`~splicecalc.analysis.SimpleBeam`;
* runs the member checks of :mod:`splicecalc.members`, each for its governing
  combination and position: classification; bending at max |M|; shear at max |V|;
  bending with shear at the supports, point loads and max-M positions; lateral-torsional
  buckling of every segment between restraints with the numerical M_cr of the real
  moment diagram and load height (a closed form beside it only where a published
  C_1, C_2 case fits; the C_1 used for k_c kept); deflection under variable actions
  (span/N) and, when asked, total (characteristic) deflection; the natural frequency of
  a floor beam; the web under every point load on a flange (EN 1993-1-5 6.6, 7.2); web
  bearing at both supports where the beam bears (EN 1993-1-5, type (c)); the design force
  of each intermediate lateral restraint (EN 1993-1-1 5.3.3). Slender webs and Class 4
  sections are designed (EN 1993-1-5 sections 5 and 4), not refused.

With ``section = "auto"`` it searches the job's families (honouring ``max_depth``) on
the plain-float path, lightest first: cheap checks (bending, shear, deflection) before
the eigenvalue M_cr solves, failing fast; the analysis is cached per section mass since
only the self-weight changes. The result names the lightest passing section, the next
two passing candidates and why every lighter one failed. Given ``whole_job`` (the calc gives it
for a job with splices), a section passing the member checks is taken only when its splices and
end connections can be designed too; the lighter ones that could not are ``passed_over``, each
with its one-line reason. ``render=True`` re-runs the
chosen section's checks with handcalcs rendering (only that section).

Units: N, mm, N*mm internally; records in kN, kNm, mm.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from typing import Any, Callable, Sequence

import numpy as np

from ..actions import (Combination, PointLoad, PsiTable, UDL, self_weight_udl, sls_characteristic,
                       sls_variable_characteristic, uls_combinations)
from ..analysis import Envelope, SimpleBeam, beam_diagrams, envelope
from ..core.errors import InputError
from ..core.record import Calc, CheckRecord, not_checked
from ..job.model import SELF_WEIGHT_NAME, Job
from ..materials import E_MPa, NationalAnnex
from ..members import (C1_C2_PINNED, VIBRATION_IMPOSED_SHARE, C_1_linear, M_cr_C1C2, check_bending,
                       bending_resistance, check_bending_shear, check_flange_induced_buckling,
                       check_floor_frequency, restraint_force,
                       check_deflection, check_ltb, check_shear, check_transverse_bending, check_transverse_force,
                       check_web_bearing, classify, shear_resistance, transverse_resistance)
from ..sections import Section, get_section, list_sections

#: name of the self-weight load added by the design (reserved in job loads)
SELF_WEIGHT = SELF_WEIGHT_NAME
#: failing candidates re-run with every check (worst check reported): the heaviest this many
SHOWN_FAILURES = 6


# ======================================================================== analysis
class _MassCase:
    """Combinations and exact analyses for one self-weight (section mass, kg/m).

    Deflections use I = 1 mm4 and are divided by the section's I_y (linear
    elasticity: w is proportional to 1/(E I)), so one case serves every
    section of the same mass.
    """

    __slots__ = ("loads", "uls", "beams", "M", "V", "iM", "iV", "R_A", "R_B", "_char", "_ctx", "_vib")

    def __init__(self, ctx: "_Context", mass: float) -> None:
        self._ctx = ctx
        sw = self_weight_udl(mass, name=SELF_WEIGHT)
        self.loads = (sw, *ctx.job.loads)
        self.uls = tuple(uls_combinations(self.loads, ctx.na, ctx.psi, ctx.beam.imposed))
        L = ctx.L
        self.beams = tuple(SimpleBeam(L, c.loads) for c in self.uls)
        self.M = tuple(b.M_max() for b in self.beams)
        self.V = tuple(b.V_max() for b in self.beams)
        self.iM = max(range(len(self.M)), key=lambda i: (abs(self.M[i].value), -i))
        self.iV = max(range(len(self.V)), key=lambda i: (abs(self.V[i].value), -i))
        self.R_A = tuple(b.R_A for b in self.beams)
        self.R_B = tuple(b.R_B for b in self.beams)
        self._char: tuple | None = None
        self._vib: tuple | None = None

    def vibration(self) -> tuple[float, float, str] | None:
        """(w_max * I, x, text) of the mass load for the natural frequency: permanent actions (with the
        self-weight) plus a share of the imposed floor loads (categories A-G); None without such loads.
        The deflected shape is the job's part (analysed once per design) plus the self-weight's, summed
        on 801 points along the span (the largest of the sum; mid-span is one of the points)."""
        if self._vib is None:
            v = self._ctx.vibration_shape()
            if v is None:
                self._vib = (None,)
            else:
                xs, w_rest, w_unit, text = v
                w_sw = self.loads[0].w                       # the self-weight, first of the loads
                tot = np.abs(w_rest + w_sw * w_unit)
                i = int(np.argmax(tot))
                self._vib = ((float(tot[i]), float(xs[i]), text),)
        return self._vib[0]

    def characteristic(self) -> tuple[tuple[Combination, SimpleBeam, float, float], ...]:
        """SLS characteristic combinations (Eq. 6.14b): (combination, beam with I = 1, w_max * I, x)."""
        if self._char is None:
            out = []
            for c in sls_characteristic(self.loads, self._ctx.psi, self._ctx.beam.imposed):
                b = SimpleBeam(self._ctx.L, c.loads, I=1.0)
                w = b.w_max()
                out.append((c, b, abs(w.value), w.x_mm))
            self._char = tuple(out)
        return self._char


class _Context:
    """Everything of a job that does not depend on the section."""

    def __init__(self, job: Job, psi: PsiTable) -> None:
        self.job = job
        self.beam = job.beam
        self.L = job.beam.span
        self.na: NationalAnnex = job.na
        self.psi = psi
        self.grade = job.beam.grade
        self._cases: dict[float, _MassCase] = {}
        self.point_x = tuple(sorted({ld.x for ld in job.loads if isinstance(ld, PointLoad)
                                     and 0.0 < ld.x < self.L}))
        self.point_groups = _point_groups(self)
        self._vib_shape: tuple | None = None
        #: plain-float LTB records of this design call by (section, segment index, combination index)
        self.ltb_memo: dict[tuple[str, int, int], CheckRecord] = {}
        # variable actions only (characteristic, each leading): independent of the section
        var = []
        if any(ld.action != "permanent" for ld in job.loads):
            for c in sls_variable_characteristic(job.loads, psi, job.beam.imposed):
                b = SimpleBeam(self.L, c.loads, I=1.0)
                w = b.w_max()
                var.append((c, b, abs(w.value), w.x_mm))
        self.variable = tuple(var)

    def vibration_shape(self) -> tuple[np.ndarray, np.ndarray, np.ndarray, str] | None:
        """Deflected shape (I = 1) of the job's mass load without the self-weight and of a unit full-span
        line load, on 801 points; None when the beam carries no imposed floor load (categories A-G)."""
        if self._vib_shape is None:
            floor = [ld for ld in self.job.loads if ld.action == "imposed" and ld.category in "ABCDEFG"]
            if not floor:
                self._vib_shape = (None,)
            else:
                k = VIBRATION_IMPOSED_SHARE
                loads = [ld for ld in self.job.loads if ld.action == "permanent"] + [ld.scaled(k) for ld in floor]
                xs = np.linspace(0.0, self.L, 801)
                w_rest = np.asarray(SimpleBeam(self.L, loads, I=1.0).w(xs), dtype=float)
                w_unit = np.asarray(SimpleBeam(self.L, [UDL("unit", "permanent", 1.0)], I=1.0).w(xs), dtype=float)
                self._vib_shape = ((xs, w_rest, w_unit, f"G + {k:g} x imposed floor load (categories A-G)"),)
        return self._vib_shape[0]

    def case(self, mass: float) -> _MassCase:
        key = round(float(mass), 9)
        c = self._cases.get(key)
        if c is None:
            c = self._cases[key] = _MassCase(self, key)
        return c

    def z_g(self, section: Section) -> float:
        """Height of the load above the shear centre (mm), from the job's load level."""
        return {"top flange": section.h / 2.0, "shear centre": 0.0,
                "bottom flange": -section.h / 2.0}[self.beam.load_level]


@dataclass(frozen=True)
class BeamAnalysis:
    """The analysis of the designed beam (real I_y), for diagrams and the calc package.

    ``loads``: characteristic loads including the self-weight; ``uls`` / ``sls_variable`` /
    ``sls_characteristic``: (combination, SimpleBeam) pairs; ``governing_M`` etc. index into ``uls``.
    """

    span_mm: float
    section: str
    loads: tuple
    uls: tuple[tuple[Combination, SimpleBeam], ...]
    sls_variable: tuple[tuple[Combination, SimpleBeam], ...]
    sls_characteristic: tuple[tuple[Combination, SimpleBeam], ...]
    governing_M: int
    governing_V: int
    restraints_mm: tuple[float, ...] = ()

    def effects(self) -> list[dict[str, Any]]:
        """Per ULS combination: reactions, max |V| and max M with positions (unit-tagged keys)."""
        out = []
        for c, b in self.uls:
            m, v = b.M_max(), b.V_max()
            out.append({"combination": c.name, "expression": c.expression, "R_A_kN": round(b.R_A / 1e3, 6),
                        "R_B_kN": round(b.R_B / 1e3, 6), "M_max_kNm": round(m.value / 1e6, 6),
                        "x_M_max_m": round(m.x_mm / 1e3, 6), "V_max_kN": round(abs(v.value) / 1e3, 6),
                        "x_V_max_m": round(v.x_mm / 1e3, 6)})
        return out

    def envelope(self, n: int = 201) -> Envelope:
        """ULS M_Ed and V_Ed envelopes over all combinations (:func:`splicecalc.analysis.envelope`)."""
        return envelope([c for c, _ in self.uls], self.span_mm, n)

    def diagrams(self, splices_mm: Sequence[float] | None = None) -> Any:
        """V, M diagrams of the combination governing bending (matplotlib Figure)."""
        c, b = self.uls[self.governing_M]
        return beam_diagrams(b, splices_mm=splices_mm, restraints_mm=self.restraints_mm,
                             title=f"{self.section}: {c.name}")

    def deflection_diagrams(self) -> Any:
        """V, M, w diagrams of the variable-action SLS combination with the largest deflection
        (the one the deflection check uses; None if there is none)."""
        if not self.sls_variable:
            return None
        c, b = max(self.sls_variable, key=lambda cb: cb[1].w_max().abs)
        return beam_diagrams(b, restraints_mm=self.restraints_mm, title=f"{self.section}: {c.name}")


# ======================================================================== results
def short_title(title: str, designation: str) -> str:
    """A check title without the section it names at its end (``..., 457x152x60 UKB``): for a sentence or
    a table that already names the section; words, never a check id."""
    suffix = f", {designation}"
    return title[:-len(suffix)] if designation and title.endswith(suffix) else title


@dataclass(frozen=True)
class Candidate:
    """One section tried by the search: pass/fail and the check that governs it.

    ``governing`` is the id of the check with the highest utilisation among those
    run (the search stops at the first stage that fails), ``stage`` says how far
    it got: ``"screen"`` (bending, shear, deflection) or ``"full"``.
    """

    designation: str
    family: str
    mass_kg_per_m: float
    h_mm: float
    ok: bool
    governing: str
    title: str
    utilisation: float
    stage: str
    note: str = ""

    def to_dict(self) -> dict[str, Any]:
        return {"designation": self.designation, "family": self.family, "mass_kg_per_m": self.mass_kg_per_m,
                "h_mm": self.h_mm, "ok": self.ok, "governing_check": self.governing, "title": self.title,
                "utilisation": None if not math.isfinite(self.utilisation) else round(self.utilisation, 6),
                "stage": self.stage, **({"note": self.note} if self.note else {})}

    def summary(self) -> str:
        u = "n/a" if not math.isfinite(self.utilisation) else f"{self.utilisation:.3f}"
        verdict = "passes" if self.ok else "fails"
        return (f"{self.designation:<18} {self.mass_kg_per_m:6.1f} kg/m  {verdict:<6} governing: "
                f"{self.governing} (u = {u})" + (f"  {self.note}" if self.note else ""))


@dataclass(frozen=True)
class PassedOver:
    """A section that passes every member check but with which the rest of the job cannot be
    carried out (``section = "auto"`` with a ``whole_job`` test): no splice layout fits or carries
    the forces, or the pieces cannot meet the access limits. ``reason``: one line, from the error."""

    designation: str
    mass_kg_per_m: float
    reason: str

    def line(self) -> str:
        return f"{self.designation}: {self.reason}"

    def to_dict(self) -> dict[str, Any]:
        return {"designation": self.designation, "mass_kg_per_m": self.mass_kg_per_m, "reason": self.reason}


@dataclass(frozen=True)
class BeamDesign:
    """Result of :func:`design_beam`.

    section: the chosen section (or, when nothing passes, the heaviest candidate);
    ok: every check passes; records: all check records of ``section``;
    governing: check id -> name of the governing combination;
    analysis: :class:`BeamAnalysis` of ``section``; candidates: every section tried,
    lightest first; alternatives: the next two passing sections after the chosen one;
    message: one line saying what was found.
    """

    job: Job
    section: Section | None
    ok: bool
    records: tuple[CheckRecord, ...]
    governing: dict[str, str]
    analysis: BeamAnalysis | None
    candidates: tuple[Candidate, ...] = ()
    alternatives: tuple[Candidate, ...] = ()
    message: str = ""
    combinations: tuple[str, ...] = field(default=())
    #: lighter sections that pass the member checks but fail the ``whole_job`` test, lightest first
    passed_over: tuple[PassedOver, ...] = ()

    @property
    def governing_record(self) -> CheckRecord | None:
        """The failing record with the highest utilisation, else the highest-utilised resistance check."""
        return _Run(list(self.records)).worst()

    @property
    def lighter_failures(self) -> tuple[Candidate, ...]:
        """Candidates lighter than the chosen section (all failed), lightest first."""
        if self.section is None or not self.ok:
            return tuple(c for c in self.candidates if not c.ok)
        m = self.section.mass_nominal
        return tuple(c for c in self.candidates if not c.ok and c.mass_kg_per_m <= m
                     and c.designation != self.section.designation)

    def record(self, check_id: str) -> CheckRecord:
        for r in self.records:
            if r.id == check_id:
                return r
        raise KeyError(check_id)

    def summary(self, source: str = "", show_candidates: int = 12) -> str:
        """Readable summary: section, combinations, every check with clause, demand/resistance,
        utilisation, verdict, position and governing combination; the heaviest candidates tried."""
        return _summary(self, source, show_candidates)

    def _repr_markdown_(self) -> str:
        return "```\n" + self.summary() + "\n```"

    def to_dict(self) -> dict[str, Any]:
        """JSON-ready result; keys carry units (records via CheckRecord.to_dict)."""
        return {
            "ok": self.ok,
            "message": self.message,
            "section": self.section.to_dict() if self.section is not None else None,
            "grade": self.job.beam.grade,
            "span_m": round(self.job.beam.span / 1000.0, 6),
            "combinations": list(self.combinations),
            "uls_effects": self.analysis.effects() if self.analysis is not None else [],
            "governing_combination": dict(self.governing),
            "checks": [r.to_dict() for r in self.records],
            "candidates": [c.to_dict() for c in self.candidates],
            "alternatives": [c.to_dict() for c in self.alternatives],
            "passed_over": [p.to_dict() for p in self.passed_over],
        }


def _fmt_x(x_mm: float | None) -> str:
    return "" if x_mm is None else f"x = {x_mm / 1000.0:.2f} m"


def _fmt_num(v: float) -> str:
    return f"{v:.2f}" if abs(v) < 1e5 else f"{v:.4g}"


def _summary(design: "BeamDesign", source: str = "", show_candidates: int = 12) -> str:
    """Readable multi-line summary of a design (used by ``splicecalc run``)."""
    job = design.job
    b = job.beam
    lines: list[str] = []
    p = job.project
    head = " - ".join(t for t in (p.number, p.title) if t) or "splicecalc job"
    lines.append(head + (f"   ({source})" if source else ""))
    restr = "continuous (top flange)" if b.continuous_restraint else ", ".join(f"{x / 1000.0:g}" for x in b.restraints)
    comb = "Eq. 6.10" if b.combination == "6.10" else "worse of Eq. 6.10a and 6.10b"
    lines.append(f"Beam: span {b.span / 1000.0:g} m, {b.grade}, "
                 + (f"lateral restraints at {restr} m" if restr else "no intermediate lateral restraint")
                 + f", loads at the {b.load_level}; ULS {comb} (national annex: {job.na.name}, xi = {job.na.xi:g})")
    lines.append("")
    lines.append(("PASS  " if design.ok else "FAIL  ") + design.message)
    s = design.section
    if s is not None:
        lines.append(f"Section: {s.designation} {b.grade}, {s.mass_nominal:g} kg/m, h = {s.h:g} mm, "
                     f"b = {s.b:g} mm (self-weight included)")
    lines.append("")
    lines.append("Combinations:")
    lines.extend(f"  {c}" for c in design.combinations)
    lines.append("")
    lines.append("Checks:")
    for r in design.records:
        verdict = "OK" if r.ok else "NOT OK"
        lines.append(f"  {r.title}")
        lines.append(f"      {r.clause}")
        unit = f" {r.unit}" if r.unit else ""
        where = _fmt_x(r.location_mm)
        combo = design.governing.get(r.id, "")
        tail = "; ".join(t for t in (where, combo) if t)
        lines.append(f"      {_fmt_num(r.demand)} / {_fmt_num(r.resistance)}{unit}   u = {r.utilisation:.3f}   "
                     f"{verdict}" + (f"   [{tail}]" if tail else ""))
        if r.note:
            lines.append(f"      {r.note}")
    if len(design.candidates) > 1 or design.alternatives:
        lines.append("")
        lines.append("Candidates tried (lightest first):")
        cands = list(design.candidates)
        if len(cands) > show_candidates:
            hidden = cands[:len(cands) - show_candidates]
            lines.append(f"  ... {len(hidden)} lighter sections fail as well (all listed with --json)")
            cands = cands[len(hidden):]
        lines.extend(f"  {c.summary()}" for c in cands)
        if design.passed_over:
            lines.append("Passed over (pass the member checks, but the job cannot be completed with them):")
            lines.extend(f"  {p.line()}" for p in design.passed_over)
        if design.alternatives:
            lines.append("Next passing candidates: " + ", ".join(
                f"{c.designation} ({c.mass_kg_per_m:g} kg/m, {c.governing} u = {c.utilisation:.3f})"
                for c in design.alternatives))
    if job.notes:
        lines.append("")
        lines.extend(f"Note: {n}" for n in job.notes)
    return "\n".join(lines)


# ======================================================================== checks
@dataclass
class _Run:
    """Records of one section as they are produced, with the governing combinations."""

    records: list[CheckRecord] = field(default_factory=list)
    governing: dict[str, str] = field(default_factory=dict)

    def add(self, rec: CheckRecord, combo: str | None = None) -> CheckRecord:
        self.records.append(rec)
        if combo:
            self.governing[rec.id] = combo
        return rec

    def worst(self) -> CheckRecord | None:
        """The check (demand over resistance) with the highest utilisation, failing or not;
        information and NOT CHECKED records never govern."""
        pool = [r for r in self.records if r.is_check] or self.records
        return max(pool, key=lambda r: r.utilisation, default=None)

    def failed(self) -> bool:
        """A check made fails (INFO and NOT CHECKED records do not stop a section)."""
        return any(not r.ok for r in self.records if r.is_check)


def _calc(render: bool) -> Calc:
    return Calc(render=render)


def _segment_M_max(ctx: _Context, case: _MassCase, i: int, x0: float, x1: float) -> tuple[float, float]:
    """Largest |M| (N*mm) in [x0, x1] for combination i, and where.

    All loads act downwards, so M is concave (M'' = -q <= 0): the maximum over an
    interval is the span maximum when that lies inside, else at an interval end.
    """
    ext = case.M[i]
    if x0 <= ext.x_mm <= x1:
        return abs(ext.value), ext.x_mm
    b = case.beams[i]
    m0, m1 = abs(float(b.M(x0))), abs(float(b.M(x1)))
    return (m0, x0) if m0 >= m1 else (m1, x1)


def _line_loads(combo: Combination, x0: float, height: Callable[[str], float]) -> list[tuple[Any, float]]:
    """Factored line loads of the combination (N/mm) as (q(x), z_g) pairs, one per load height
    (``height(applied_to)``, mm above the shear centre), as functions of the local segment coordinate;
    the self-weight acts at the shear centre and is left out."""
    by_z: dict[float, list[tuple[float, float, float | None]]] = {}
    for ld in combo.loads:
        if isinstance(ld, UDL) and ld.name != SELF_WEIGHT:
            by_z.setdefault(height(ld.applied_to), []).append((ld.w, ld.x_start, ld.x_end))

    def q_of(parts: list[tuple[float, float, float | None]]) -> Callable[[np.ndarray], np.ndarray]:
        def q(x: np.ndarray) -> np.ndarray:
            X = x0 + np.asarray(x, dtype=float)
            out = np.zeros_like(X)
            for w, a, b in parts:
                out = out + w * ((X >= a) & (X <= (math.inf if b is None else b)))
            return out
        return q
    return [(q_of(parts), z) for z, parts in by_z.items()]


def _M_fn(beam: SimpleBeam, x0: float, L: float) -> Callable[[np.ndarray], np.ndarray]:
    def M(x: np.ndarray) -> np.ndarray:
        xa = np.asarray(x, dtype=float)
        return np.asarray(beam.M(np.clip(x0 + xa.ravel(), 0.0, L)), dtype=float).reshape(xa.shape)
    return M


def _ltb_one(ctx: _Context, section: Section, case: _MassCase, i: int, k: int, x0: float, x1: float,
             calc: Calc, with_cross_check: bool) -> CheckRecord:
    """LTB of segment k (1-based) for ULS combination i; numerical M_cr with the load height."""
    combo, beam = case.uls[i], case.beams[i]
    L_seg = x1 - x0
    M_Ed, x_M = _segment_M_max(ctx, case, i, x0, x1)
    z_g = ctx.z_g(section)
    # each load at its own height: a load hung from the bottom flange (applied_to) is below the shear
    # centre (stabilising), a point load through a web connection or a line load at the shear centre at
    # it; the others at the job's level
    own = {"top flange": section.h / 2.0, "bottom flange": -section.h / 2.0, "web": 0.0, "shear centre": 0.0}
    pls = [(ld.x - x0, ld.P, own.get(ld.applied_to, z_g)) for ld in combo.loads
           if isinstance(ld, PointLoad) and x0 < ld.x < x1]
    lines = _line_loads(combo, x0, lambda where: own.get(where, z_g))
    def in_segment(ld: Any) -> bool:
        if isinstance(ld, PointLoad):
            return x0 < ld.x < x1
        a, b = ld.extent(ctx.L)
        return ld.name != SELF_WEIGHT and a < x1 and b > x0
    levels = sorted({f"{ld.name} at the {ld.applied_to}" for ld in combo.loads
                     if ld.applied_to in own and in_segment(ld)})
    if with_cross_check:
        _closed_form_cross_check(ctx, section, beam, combo, x0, x1, M_Ed, z_g, calc)
    rec = check_ltb(section, ctx.grade, M_Ed, None, ctx.na, calc, L_mm=L_seg, M=_M_fn(beam, x0, ctx.L),
                    line_loads=lines, point_loads=pls, z_g_mm=z_g, location_mm=x_M, segment=str(k))
    where = f"segment {k}, x = {x0 / 1e3:.3g} to {x1 / 1e3:.3g} m"
    return replace(rec, title=f"Lateral-torsional buckling, {where}, {section.designation}",
                   note=f"{rec.note}; numerical M_cr, loads at the {ctx.beam.load_level} "
                        f"(z_g = {z_g:.1f} mm)" + (f" except {', '.join(levels)}" if levels else "")
                        + ", fork restraints at the segment ends")


def _closed_form_cross_check(ctx: _Context, section: Section, beam: SimpleBeam, combo: Combination, x0: float,
                             x1: float, M_Ed: float, z_g: float, calc: Calc) -> None:
    """Closed-form M_cr (C_1, C_2, z_g formula) beside the numerical one, only where a published case fits.

    * one segment (no intermediate restraint) under full-span UDLs only: C_1 = 1.127, C_2 = 0.454
      for a UDL on a simple span with k = k_w = 1 (published NCCI tables, from memory), every load
      (the self-weight too, conservative) at the job's load height z_g;
    * a segment with no transverse load of its own but the self-weight, whose moment is linear
      to within 2 % of M_Ed at the mid-length: C_1 from the end-moment ratio psi (C_2 plays no part);
    * any other moment shape: no closed form fits, none is shown (the numerical M_cr governs).
    The kept values: C_1_closed_form, C_2_closed_form, M_cr_closed_form.
    """
    L_seg = x1 - x0
    one_segment = not ctx.beam.restraints
    # the published case has every load at one height: a line load at a level of its own does not fit it
    only_full_udl = all(isinstance(ld, UDL) and ld.is_full(ctx.L) and (ld.applied_to == "flange"
                                                                       or ld.name == SELF_WEIGHT)
                        for ld in combo.loads)
    lead = "Cross-check only (the numerical $M_{cr}$ below governs): closed-form $M_{cr}$ with "
    if one_segment and only_full_udl:
        C_1, C_2 = C1_C2_PINNED["udl"]
        calc.note(lead + f"$C_1$ = {C_1:g}, $C_2$ = {C_2:g} for a UDL on a simple span, $k = k_w = 1$ (published "
                  "tables, from memory), all load at $z_g$ = " + f"{z_g:.0f} mm (the self-weight too).")
        z = z_g
    else:
        own = [ld for ld in combo.loads if (isinstance(ld, PointLoad) and x0 < ld.x < x1)
               or (isinstance(ld, UDL) and ld.name != SELF_WEIGHT and ld.extent(ctx.L)[0] < x1
                   and ld.extent(ctx.L)[1] > x0)]
        M0, M1, Mm = float(beam.M(x0)), float(beam.M(x1)), float(beam.M(0.5 * (x0 + x1)))
        if own or M_Ed <= 0.0 or abs(Mm - 0.5 * (M0 + M1)) > 0.02 * M_Ed:
            calc.note("No published closed form fits this segment's moment diagram and load height: the "
                      "numerical $M_{cr}$ below is used without a closed-form comparison.")
            return
        big, small = (M0, M1) if abs(M0) >= abs(M1) else (M1, M0)
        psi = small / big if big != 0.0 else 1.0
        calc.note(lead + f"$C_1$ from the end-moment ratio $\\psi$ = {psi:.3f} (no load of its own in the "
                  "segment but the self-weight: moment linear within 2 %).")
        C_1 = calc(C_1_linear, psi=psi)
        C_2, z = 0.0, 0.0
    M_cr_cf = calc(M_cr_C1C2, C_1=C_1, C_2=C_2, I_z=section.Iz, I_w=section.Iw, I_t=section.It, L=L_seg,
                   z_g=z, E=E_MPa)
    calc.keep("C_1_closed_form", C_1)
    calc.keep("C_2_closed_form", C_2)
    calc.keep("M_cr_closed_form", M_cr_cf, "Nmm")


def _check_section_all(ctx: _Context, section: Section, render: bool = False,
                       fail_fast: bool = False) -> _Run:
    """Every member check of ``section``; each check's governing combination found on floats.

    With ``fail_fast`` (search) the cheap checks come first and the run stops at the first
    stage with a failure; in the LTB stage every segment is solved, each down its combinations
    (largest moment first) until one fails. :func:`design_beam` re-runs the failures it shows
    without ``fail_fast``, so each is reported with its worst check.
    With ``render`` the governing case of each check is re-run with handcalcs rendering.
    """
    case = ctx.case(section.mass_nominal)
    na, grade = ctx.na, ctx.grade
    run = _Run()
    uls = case.uls

    # --- classification (Table 5.2): an information record; Class 4 gets effective properties
    run.add(classify(section, grade, na, _calc(render)))

    # --- stage 1: bending, shear, deflection (cheap)
    iM, Mx = case.iM, case.M[case.iM]
    run.add(check_bending(section, grade, Mx.value, na, _calc(render), location_mm=Mx.x_mm), uls[iM].name)
    iV, Vx = case.iV, case.V[case.iV]
    run.add(check_shear(section, grade, Vx.value, na, _calc(render), location_mm=Vx.x_mm), uls[iV].name)
    _deflections(ctx, case, section, run, render)
    if not (fail_fast and run.failed()):    # a section already out needs no frequency (its deflection under
        _vibration(ctx, case, section, run, render)   # the mass load can pass the 100 m bound of that check)
    if fail_fast and run.failed():
        return run

    # --- stage 2: web bearing at the supports (where the beam bears on its flange), the web under
    # every point load, bending with shear at the critical points
    _support_bearing(ctx, case, section, run, render)
    _point_loads(ctx, case, section, run, render)
    _bending_shear(ctx, case, section, run, render)
    if shear_resistance(section, grade, na)[1]:   # a slender web: flange-induced buckling, EN 1993-1-5 8
        run.add(check_flange_induced_buckling(section, grade, na, _calc(render)))
    if fail_fast and run.failed():
        return run

    # --- stage 3: lateral-torsional buckling per segment (numerical M_cr)
    if ctx.beam.continuous_restraint:
        # the top flange is held along the whole span; under downward loads on a simply supported
        # span it is the compression flange throughout, so the member cannot buckle laterally
        run.add(_calc(render).info(
            id="ltb", title=f"Lateral-torsional buckling, {section.designation}: compression flange restrained "
                            "continuously", clause="EN 1993-1-1:2005, 6.3.2.1", demand=0.0, resistance=0.0,
            unit="", note="top flange held laterally along the whole span (job: restraints = 'continuous'); "
                             "the top flange is in compression throughout (simply supported, downward loads), so "
                             "lateral-torsional buckling does not occur; the restraint (floor, decking and its "
                             "fixings) must be able to hold the flange (EN 1993-1-1 5.3.3 and 6.3.2.1, a force of "
                             "the order of 1 % of the flange force), to be confirmed by the engineer"))
        return run
    segs = ctx.beam.segments
    order = list(range(len(segs)))
    if fail_fast:  # most highly stressed segment first
        order.sort(key=lambda k: -max(_segment_M_max(ctx, case, i, *segs[k])[0] for i in range(len(uls))))
    ltb: dict[int, tuple[CheckRecord, int]] = {}
    for k in order:
        x0, x1 = segs[k]
        combos = sorted(range(len(uls)), key=lambda i: -_segment_M_max(ctx, case, i, x0, x1)[0])
        best: tuple[CheckRecord, int] | None = None
        for i in combos:
            key = (section.designation, k, i)
            rec = ctx.ltb_memo.get(key)
            if rec is None:
                rec = ctx.ltb_memo[key] = _ltb_one(ctx, section, case, i, k + 1, x0, x1, Calc(),
                                                   with_cross_check=False)
            if best is None or rec.utilisation > best[0].utilisation:
                best = (rec, i)
            if fail_fast and not rec.ok:
                break
        assert best is not None
        ltb[k] = best
    for k in sorted(ltb):
        _, i = ltb[k]
        x0, x1 = segs[k]
        rec = _ltb_one(ctx, section, case, i, k + 1, x0, x1, _calc(render), with_cross_check=True)
        run.add(rec, uls[i].name)
    if not fail_fast or not run.failed():
        _restraint_forces(ctx, case, section, run, render)
    return run


def _deflections(ctx: _Context, case: _MassCase, section: Section, run: _Run, render: bool) -> None:
    """Variable-action deflection (span/N) and, when asked, total characteristic deflection."""
    I = section.Iy
    L = ctx.L
    if ctx.variable:
        j = max(range(len(ctx.variable)), key=lambda t: (ctx.variable[t][2], -t))
        c, _, w1, x = ctx.variable[j]
        rec = check_deflection(w1 / I, L, ctx.beam.deflection_limit, which="variable actions",
                               calc=_calc(render), location_mm=x)
        run.add(replace(rec, id="deflection",
                        note=f"{c.name}: {c.expression}; E = {E_MPa:g} MPa, I_y = {I / 1e4:.0f} cm4"),
                c.name)
    else:
        rec = check_deflection(0.0, L, ctx.beam.deflection_limit, which="variable actions",
                               calc=_calc(render))
        run.add(replace(rec, id="deflection", note="no variable actions on the beam"))
    if ctx.beam.total_deflection_limit is not None:
        ch = case.characteristic()
        j = max(range(len(ch)), key=lambda t: (ch[t][2], -t))
        c, _, w1, x = ch[j]
        rec = check_deflection(w1 / I, L, ctx.beam.total_deflection_limit, which="total, characteristic",
                               total=True,
                               calc=_calc(render), location_mm=x)
        run.add(replace(rec, id="deflection_total",
                        note=f"{c.name}: {c.expression}; E = {E_MPa:g} MPa, I_y = {I / 1e4:.0f} cm4; limit agreed "
                             "for the project (the UK NA suggests limits for variable actions only)"),
                c.name)


def _support_bearing(ctx: _Context, case: _MassCase, section: Section, run: _Run, render: bool) -> None:
    """EN 1993-1-5 section 6 at the supports, only where the beam bears on its flange (``bearing_length``)."""
    bl = ctx.beam.bearing_length
    ends = {getattr(sp, "at", None) for sp in ctx.job.supports}
    missing = [e for e, at in (("A", "start"), ("B", "end")) if at not in ends]
    if bl is None and missing:
        run.add(not_checked(
            id="web_bearing", title=f"Web at support{'s' if len(missing) > 1 else ''} {' and '.join(missing)}, "
                                    f"{section.designation}",
            clause="EN 1993-1-5:2006, 6.1",
            reason="how the beam is carried at this end is not given: no stiff bearing length (the beam does not "
                   "bear on its flange) and no end connection; give the stiff bearing length where it sits on a "
                   "bearing (web bearing, EN 1993-1-5 section 6) or a [[support]] end connection (its design "
                   "checks the beam web)"))
        return
    if bl is None:
        calc = _calc(render)
        calc.note("The beam hangs on end connections (no stiff bearing length given): it does not bear on its "
                  "flange at the supports, so the web-bearing check of EN 1993-1-5 section 6 does not apply there. "
                  "The beam web at each end is checked with its end connection.")
        run.add(calc.info(id="web_bearing", title=f"Web at the supports, {section.designation}",
                          clause="EN 1993-1-5:2006, 6.1",
                          note="beam on end connections: no bearing on the flange, web bearing not applicable; "
                               "give the stiff bearing length in the job where the beam sits on a bearing"))
        return
    for end, R, x in (("A", case.R_A, 0.0), ("B", case.R_B, ctx.L)):
        i = max(range(len(R)), key=lambda j: (abs(R[j]), -j))
        rec = check_web_bearing(section, ctx.grade, abs(R[i]), bl, ctx.beam.end_distance, ctx.na,
                                _calc(render), location_mm=x)
        run.add(replace(rec, id=f"web_bearing_{end}",
                        title=f"Web bearing at support {end}, {section.designation}",
                        note=f"{rec.note}; s_s = {bl:g} mm, c = {ctx.beam.end_distance:g} mm"),
                case.uls[i].name)


def _point_groups(ctx: _Context) -> list[tuple[float, str, tuple[str, ...], float]]:
    """Point loads inside the span grouped by position and how they enter the beam:
    (x mm, "flange" | "web", load names, stiff bearing length s_s mm = the smallest of the group)."""
    groups: dict[tuple[float, str], list[PointLoad]] = {}   # by position and how it is applied
    for ld in ctx.job.loads:
        if isinstance(ld, PointLoad) and 0.0 < ld.x < ctx.L:
            groups.setdefault((ld.x, ld.applied_to), []).append(ld)
    return [(x, how, tuple(ld.name for ld in lds), min(ld.bearing_length for ld in lds))
            for (x, how), lds in sorted(groups.items())]


def _point_loads(ctx: _Context, case: _MassCase, section: Section, run: _Run, render: bool) -> None:
    """The web under every point load on a flange (and every partial line load no longer than h_w, a
    patch load of its length): EN 1993-1-5 6.6 Eq. 6.14 and, on the compression flange, the interaction
    with bending 7.2 Eq. 7.2, each for its governing ULS combination. A load applied through a
    connection to the web is a NOT CHECKED record (the web is checked locally with that connection)."""
    h_w = section.h - 2.0 * section.tf
    # short partial line loads (no longer than h_w) act on the flange like a point load spread over
    # their length: checked the same way, with s_s = their length
    patches = [(0.5 * (a + b), "flange", (ld.name,), b - a) for ld in ctx.job.loads if isinstance(ld, UDL)
               for a, b in (ld.extent(ctx.L),) if not ld.is_full(ctx.L) and b - a <= h_w]
    items = [("P", k, *g) for k, g in enumerate(ctx.point_groups, start=1)]
    items += [("U", k, *g) for k, g in enumerate(patches, start=1)]
    if not items:
        return
    M_c = bending_resistance(section, ctx.grade, ctx.na)
    top_default = ctx.beam.load_level != "bottom flange"
    bl = ctx.beam.bearing_length
    end_a = -(0.5 * bl + ctx.beam.end_distance) if bl is not None else 0.0     # beam end positions
    end_b = ctx.L - end_a
    for kind, k, x, how, names, s_s in items:
        label = ", ".join(names)
        where = f"x = {x / 1e3:.3g} m"
        what = "point load" if kind == "P" else "short line load"
        tag = f"{kind}{k}"
        on_top = top_default if how == "flange" else how == "top flange"   # the compression flange
        if how == "web":
            run.add(not_checked(
                id=f"web_connection_{tag}", title=f"Web at the connection of {label} ({where}), {section.designation}",
                clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", location_mm=x,
                reason="the load is applied through a connection to the web (a secondary beam's end plate or fin "
                     "plate), not on a flange: EN 1993-1-5 section 6 does not apply; check the web locally with "
                     "that connection's design (bolt bearing on the web, web shear and block tearing)"))
            continue
        c = min(x - end_a, end_b - x) - 0.5 * s_s
        res = transverse_resistance(section, ctx.grade, s_s, max(c, 0.0), ctx.na)
        F_Rd = res["F_Rd"]
        best6 = best7 = None
        for i, (combo, beam) in enumerate(zip(case.uls, case.beams)):
            if kind == "P":
                F = sum(ld.P for ld in combo.loads if isinstance(ld, PointLoad) and ld.name in names)
            else:
                F = sum(ld.w * s_s for ld in combo.loads if isinstance(ld, UDL) and ld.name in names)
            if F <= 0.0:
                continue
            M = abs(float(beam.M(x)))
            u6 = F / F_Rd
            u7 = (u6 + 0.8 * M / M_c) / 1.4
            if best6 is None or u6 > best6[0] * (1 + 1e-12):
                best6 = (u6, i, F, M)
            if best7 is None or u7 > best7[0] * (1 + 1e-12):
                best7 = (u7, i, F, M)
        if best6 is None:
            continue
        _, i, F, M = best6
        calc = _calc(render)
        calc.note(f"{what.capitalize()} {label} at {where} on the {'top' if on_top else 'bottom'} flange, "
                  + (f"stiff bearing $s_s$ = {s_s:g} mm." if kind == "P" else
                     f"{s_s:g} mm long: a patch load with $s_s$ = its length."))
        rec = check_transverse_force(section, ctx.grade, F, s_s, ctx.na, calc, c=max(c, 0.0), location_mm=x,
                                     name=label)
        run.add(replace(rec, id=f"transverse_force_{tag}",
                        title=f"Web under {what} {label} ({where}), {section.designation}"), case.uls[i].name)
        if on_top:
            assert best7 is not None
            _, i, F, M = best7
            rec = check_transverse_bending(section, ctx.grade, F, M, F_Rd, ctx.na, _calc(render), location_mm=x,
                                           name=label)
            run.add(replace(rec, id=f"transverse_bending_{tag}",
                            title=f"{what.capitalize()} {label} and bending ({where}), {section.designation}"),
                    case.uls[i].name)
        else:
            calc = _calc(render)
            calc.note("The load acts on the tension flange: EN 1993-1-5 7.2(2) asks for section 6 and "
                      "EN 1993-1-1 6.2.1(5) only; bending is checked by the bending checks.")
            run.add(calc.info(id=f"transverse_bending_{tag}",
                              title=f"{what.capitalize()} {label} and bending ({where}), {section.designation}",
                              clause="EN 1993-1-5:2006, 7.2(2)", location_mm=x,
                              note="load on the tension flange: no 7.2(1) interaction"))


def _vibration(ctx: _Context, case: _MassCase, section: Section, run: _Run, render: bool) -> None:
    """Natural frequency of a floor beam (imposed floor loads present), common practice."""
    v = case.vibration()
    if v is None:
        return
    w1, x, text = v
    run.add(check_floor_frequency(w1 / section.Iy, ctx.beam.min_frequency, calc=_calc(render), location_mm=x,
                                  load_text=text))


def _restraint_forces(ctx: _Context, case: _MassCase, section: Section, run: _Run, render: bool) -> None:
    """Design force of each intermediate lateral restraint (EN 1993-1-1 5.3.3), information records:
    N_Ed = largest ULS M_Ed / h, q_d over the length of flange each restraint takes (half way to its
    neighbours or the supports)."""
    rs = ctx.beam.restraints
    if not rs:
        return
    M_max = abs(case.M[case.iM].value)
    N = M_max / section.h
    pts = (0.0, *rs, ctx.L)
    for k, x in enumerate(rs, start=1):
        a = 0.5 * (pts[k + 1] - pts[k - 1])
        rec = restraint_force(N, ctx.L, a, calc=_calc(render), location_mm=x, name=f"R{k} at x = {x / 1e3:.3g} m")
        run.add(replace(rec, id=f"restraint_force_R{k}"), case.uls[case.iM].name)


def _bending_shear(ctx: _Context, case: _MassCase, section: Section, run: _Run, render: bool) -> None:
    """M-V interaction (6.2.8) at the supports, point loads and max-M positions of every combination."""
    L = ctx.L
    pts = {0.0, L, *ctx.point_x, *(m.x_mm for m in case.M)}
    best: tuple[float, int, float, float, float] | None = None   # (u, i, x, M, V)
    fast = Calc()
    # with V_Ed <= 0.5 V_Rd there is no reduction (6.2.8(2); EN 1993-1-5 7.1(1) with V_bw,Rd >= V_Rd):
    # u = M_Ed / M_c,Rd there without calling the check
    V_Rd, _ = shear_resistance(section, ctx.grade, ctx.na)
    M_c = bending_resistance(section, ctx.grade, ctx.na)
    for i, b in enumerate(case.beams):
        for x in sorted(pts):
            M = abs(float(b.M(x)))
            V = max(abs(float(b.V(x, "left"))), abs(float(b.V(x, "right"))))
            if V <= 0.5 * V_Rd:
                u = M / M_c
            else:
                u = check_bending_shear(section, ctx.grade, M, V, ctx.na, fast).utilisation
            if best is None or u > best[0] * (1 + 1e-12):
                best = (u, i, x, M, V)
    assert best is not None
    _, i, x, M, V = best
    rec = check_bending_shear(section, ctx.grade, M, V, ctx.na, _calc(render), location_mm=x)
    run.add(replace(rec, note=f"{rec.note}; V_Ed = {V / 1e3:.1f} kN at the same section "
                              "(critical points: supports, point loads, max M)"), case.uls[i].name)


# ======================================================================== search
def _candidate(section: Section, run: _Run, stage: str) -> Candidate:
    gov = run.worst()
    assert gov is not None
    return Candidate(section.designation, section.family, section.mass_nominal, section.h, not run.failed(),
                     gov.id, gov.title, gov.utilisation, stage)


def _try(ctx: _Context, section: Section) -> tuple[Candidate, _Run | None]:
    """Fail-fast checks of one section on floats (Class 4 and slender webs designed, EN 1993-1-5)."""
    run = _check_section_all(ctx, section, render=False, fail_fast=True)
    stage = "full" if any(r.id.startswith("ltb") for r in run.records) else "screen"
    return _candidate(section, run, stage), run


def search_candidates(job: Job) -> list[Section]:
    """Sections of the job's families with h <= max_depth, lightest first (mass, then depth)."""
    secs = [s for f in job.beam.families for s in list_sections(f)
            if job.beam.max_depth is None or s.h <= job.beam.max_depth + 1e-9]
    if not secs:
        raise InputError("beam.max_depth", job.beam.max_depth,
                         f"a depth that some section of {', '.join(job.beam.families)} meets")
    return sorted(secs, key=lambda s: (s.mass_nominal, s.h, s.designation))


def _analysis(ctx: _Context, section: Section) -> BeamAnalysis:
    case = ctx.case(section.mass_nominal)
    I = section.Iy
    uls = tuple((c, SimpleBeam(ctx.L, c.loads, I=I)) for c in case.uls)
    var = tuple((c, SimpleBeam(ctx.L, c.loads, I=I)) for c, _, _, _ in ctx.variable)
    char = tuple((c, SimpleBeam(ctx.L, c.loads, I=I))
                 for c in sls_characteristic(case.loads, ctx.psi, ctx.beam.imposed))
    return BeamAnalysis(ctx.L, section.designation, case.loads, uls, var, char, case.iM, case.iV,
                        ctx.beam.restraints)


def design_beam(job: Job, render: bool = False, *, psi: PsiTable | None = None,
                whole_job: Callable[["BeamDesign"], Exception | str | None] | None = None) -> BeamDesign:
    """Design (``section = "auto"``) or check (a designation) the job's beam; see the module docstring.

    ``render``: render the chosen section's checks with handcalcs (LaTeX in each record).
    ``psi``: combination factors; None (default) takes the job's ``beam.psi_table`` (UK NA unless set).
    ``whole_job`` (``section = "auto"`` only): the test of the rest of the job for a section that
    passes the member checks, given its plain-float design; it returns None when the job can be
    completed with it (the splices fit, carry the forces and the pieces meet the access limits), else
    the error that stopped it, or a one-line reason when the joints were designed but one of their
    checks fails. Such a section is passed over (``passed_over``, with the reason) and the search goes
    on, heavier, through the sections that pass the member checks (only those: a failed attempt costs
    one splice plan). When none completes the job, the lightest whose joints only fail a check is the
    result (those checks failing in it); when every one stopped with an error, the heaviest one's
    error is raised, naming how many were tried. The search stays the one loop of the design.
    Raises :class:`InputError` for bad input; a failing design is a result (``ok`` False).
    """
    if not isinstance(job, Job):
        raise InputError("job", type(job).__name__, "a splicecalc.job.Job")
    if not isinstance(render, bool):
        raise InputError("render", render, "True or False")
    if psi is None:
        psi = job.psi
    if not isinstance(psi, PsiTable):
        raise InputError("psi", psi, "a splicecalc.actions.PsiTable")
    ctx = _Context(job, psi)

    if not job.beam.is_auto:
        try:
            section = get_section(job.beam.section)
        except InputError as err:
            raise InputError("beam.section", job.beam.section, err.allowed, err.hint) from None
        run = _check_section_all(ctx, section, render=render)
        cand = _candidate(section, run, "full")
        msg = (f"{section.designation} {job.beam.grade}: " +
               ("all checks pass" if cand.ok else
                f"fails {short_title(cand.title, section.designation)} (u = {cand.utilisation:.3f})"))
        return _result(ctx, section, run, (cand,), (), msg)

    secs = search_candidates(job)
    tried: list[Candidate] = []
    chosen: tuple[Section, _Run] | None = None
    alternatives: list[Candidate] = []
    passed: list[PassedOver] = []
    errors: list[Exception] = []           # of the passed-over sections (while none only fails a check)
    fallback: tuple[Section, _Run, int] | None = None     # the lightest whose joints fail a check only
    for s in secs:
        cand, run = _try(ctx, s)
        tried.append(cand)
        if cand.ok:
            if chosen is None:
                if whole_job is not None:
                    err = whole_job(_result(ctx, s, run, (cand,), (), ""))   # plain floats, this section
                    if err is not None:
                        passed.append(PassedOver(s.designation, s.mass_nominal, _reason(err, s)))
                        if not isinstance(err, str):
                            errors.append(err)
                        elif fallback is None:
                            fallback = (s, run, len(passed) - 1)
                        continue
                chosen = (s, run)  # type: ignore[assignment]
            else:
                alternatives.append(cand)
                if len(alternatives) == 2:
                    break
    fams = ", ".join(job.beam.families)
    depth = f" with h <= {job.beam.max_depth:g} mm" if job.beam.max_depth is not None else ""
    # the failures shown that reached the LTB stage (the heaviest few) get every check, so each is
    # reported with its worst check rather than the first one found failing; a section screened out
    # by the cheap checks is reported with the worst of those (stage "screen")
    by_name = {sec.designation: sec for sec in secs}
    m_chosen = chosen[0].mass_nominal if chosen is not None else math.inf
    shown = [i for i, c in enumerate(tried) if not c.ok and c.mass_kg_per_m <= m_chosen][-SHOWN_FAILURES:]
    for i in (i for i in shown if tried[i].stage == "full"):
        sec = by_name[tried[i].designation]
        tried[i] = _candidate(sec, _check_section_all(ctx, sec, render=False), "full")
    if chosen is None and fallback is not None:
        # no section completes the job with every joint check within capacity, but this one's joints
        # can be designed: it is the result, its failing joint checks shown (not an error)
        chosen = (fallback[0], fallback[1])
        passed = passed[:fallback[2]]
    if chosen is None and passed:
        # the cause shared by most of them is the real one (the access limits for every section, say, when
        # a few light ones also fail on bolts that do not fit their flange); named for the lightest of
        # those, the nearest to working, with the first of any other cause
        def cause(e: Exception) -> str:
            return (f"{e.field}: {' '.join(str(e.allowed).split()[:3])}" if isinstance(e, InputError)
                    else type(e).__name__)
        errs = [(p, e) for p, e in zip(passed, errors)]
        counts: dict[str, int] = {}
        for _, e in errs:
            counts[cause(e)] = counts.get(cause(e), 0) + 1
        main = max(counts, key=lambda k: counts[k])
        p0, e0 = next((p, e) for p, e in errs if cause(e) == main)
        other = next((p for p, e in errs if cause(e) != main), None)
        what = (f"beam.section = 'auto': none of the {len(passed)} sections of {fams}{depth} that pass the "
                f"member checks can be spliced (and connected) within the job's limits; {counts[main]} of "
                f"them for this cause, the lightest, {p0.line()}"
                + (f"; {len(passed) - counts[main]} for others, e.g. {other.line()}" if other is not None else ""))
        if isinstance(e0, InputError):
            raise InputError(e0.field, e0.value, what, e0.hint) from None
        raise type(e0)(what) from None
    if chosen is None:
        heaviest = max(secs, key=lambda s: (s.mass_nominal, s.h))
        last = next(c for c in tried if c.designation == heaviest.designation)
        run = _check_section_all(ctx, heaviest, render=render)
        msg = (f"No section of {fams}{depth} passes: the heaviest, {heaviest.designation}, is stopped by "
               f"{last.governing} ({last.title}, u = {last.utilisation:.3f})")
        return _result(ctx, heaviest, run, tuple(tried), (), msg, force_fail=True)
    section, _ = chosen
    run = _check_section_all(ctx, section, render=render)   # full set of records, all combinations
    gov = run.worst()
    assert gov is not None
    msg = (f"Lightest passing section of {fams}{depth}: {section.designation} {job.beam.grade} "
           f"({section.mass_nominal:g} kg/m), governed by {short_title(gov.title, section.designation)} "
           f"(u = {gov.utilisation:.3f})")
    if passed:
        msg += (f"; passed over (pass the member checks, but their splices or end connections cannot be "
                f"designed, or fail a check): "
                + ", ".join(p.designation for p in passed))
    # the passing record of the chosen section replaces its fail-fast entry
    tried = [(_candidate(section, run, "full") if c.designation == section.designation else c) for c in tried]
    return replace(_result(ctx, section, run, tuple(tried), tuple(alternatives), msg), passed_over=tuple(passed))


def _reason(err: Exception, section: Section) -> str:
    """One line of why the job cannot be completed with ``section``, from its error: what was
    expected (an InputError's 'expected ...' part, which names the cause) or the message."""
    if isinstance(err, str):
        text = err
    elif isinstance(err, InputError):
        text = f"{err.field} = {err.value!r}: needs {err.allowed}"
    else:
        text = str(err)
    return " ".join(text.split())


def _result(ctx: _Context, section: Section, run: _Run, candidates: tuple[Candidate, ...],
            alternatives: tuple[Candidate, ...], message: str, force_fail: bool = False) -> BeamDesign:
    case = ctx.case(section.mass_nominal)
    combos = tuple(f"{c.name}: {c.expression}" for c in case.uls)
    combos += tuple(f"{c.name}: {c.expression}" for c, _, _, _ in ctx.variable)
    if ctx.beam.total_deflection_limit is not None:
        combos += tuple(f"{c.name}: {c.expression}" for c, _, _, _ in case.characteristic())
    ok = (not force_fail) and bool(run.records) and not run.failed()
    return BeamDesign(job=ctx.job, section=section, ok=ok, records=tuple(run.records),
                      governing=dict(run.governing), analysis=_analysis(ctx, section), candidates=candidates,
                      alternatives=alternatives, message=message, combinations=combos)


__all__ = ["SELF_WEIGHT", "BeamAnalysis", "BeamDesign", "Candidate", "PassedOver", "design_beam", "search_candidates"]
