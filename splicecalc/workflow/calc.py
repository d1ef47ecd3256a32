"""The full beam-and-splice calculation of one job: :func:`run_calc` -> :class:`CalcResult`.

Chain (each part calls the module that owns its method; nothing is re-derived here):

1. inputs: the validated :class:`~splicecalc.job.Job`;
2. actions and analysis, member checks and the lightest section:
   :func:`splicecalc.design.beam.design_beam` (EN 1990 combinations with the beam
   self-weight, exact analysis, EN 1993-1-1 / 1-5 checks);
3. splice positions: :func:`splicecalc.design.splice_positions.choose_splice_positions`
   on the ULS envelopes of the chosen section, compared with equal cutting;
4. each splice: :func:`splicecalc.design.splice_layout.design_splice` for the forces
   of the governing combination at its position (forces, layout, drawing, checks);
5. each end connection and the existing member it lands on:
   :func:`splicecalc.joints.connections.design_end_connection` for the largest ULS
   reaction at that end;
6. summary (every record sorted by utilisation), references (distinct clauses
   cited plus the standards list) and cautions.

Splice positions and splice layouts depend on each other (the piece mass includes
an end piece's welded end plate; pieces are lifted bare, the splice kits fitted in place;
the shortest piece is one cover-plate length): the one loop that settles them is
:func:`splicecalc.design.splice_plan.plan_splices`, called here on the ULS envelopes
with the imposed load patterned (EN 1991-1-1 6.2.1(1)). The end connections are
designed first, so that their masses are known. Category A splices then repeat the
SLS deflection checks with the slip in their holes
(:func:`splicecalc.design.splice_plan.slip_records`).

A part whose module is missing or raises stops the calculation with that error:
nothing is skipped silently. A design that fails a check is a result (``ok`` False).
Internal units N, mm, N*mm, kg; records in report units.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace
from typing import Any

from ..actions import PointLoad
from ..core.errors import InputError
from ..core.record import CheckRecord, summary_order
from ..core.units import convert
from ..design.beam import BeamDesign, design_beam
from ..job.model import Job
from .errors import CalcError
from .references import CAUTIONS, Reference, cited_clauses, execution_cautions, standards_list

from ..design.splice_plan import FIRST_SPLICE_ZONE_MM, MAX_ROUNDS  # noqa: E402  (the loop's own settings)
#: end letters used for the supports (as in the member checks: support A at x = 0)
END_LETTER = {"start": "A", "end": "B"}


# ======================================================================== results
class PackageRecords:
    """References, standards, cautions and the summary order of a package's records.

    Needs ``records``, ``splices`` and ``connections`` on the class it is mixed into.
    """

    records: tuple[CheckRecord, ...]
    splices: tuple
    connections: tuple

    @property
    def joint_records(self) -> tuple[CheckRecord, ...]:
        """Records of the splices, then the end connections, then the existing members."""
        out: list[CheckRecord] = []
        for s in self.splices:
            out += s.records
        for c in self.connections:
            out += c.records
        for c in self.connections:
            out += c.existing_records
        return tuple(out)

    @property
    def summary_records(self) -> tuple[CheckRecord, ...]:
        """Every record: NOT CHECKED ones first, then highest utilisation first (ties by title)."""
        return tuple(sorted(self.records, key=summary_order))

    @property
    def governing(self) -> CheckRecord | None:
        """The made check with the highest utilisation (NOT CHECKED records never govern)."""
        return max((r for r in self.records if r.checked), key=lambda r: r.utilisation, default=None)

    @property
    def historic_steel_used(self) -> bool:
        return any(c.design.existing.material.historic for c in self.connections)

    @property
    def references(self) -> tuple[Reference, ...]:
        """Distinct clauses cited by all records, grouped by standard."""
        return cited_clauses(self.records)

    @property
    def standards(self) -> tuple[tuple[str, str], ...]:
        return standards_list(self.historic_steel_used)

    @property
    def cautions(self) -> tuple[str, ...]:
        """The general cautions, then the ones raised by this job's parts (distinct, in order)."""
        out = list(CAUTIONS)
        for c in self.connections:
            for w in c.design.warnings:
                t = f"End {c.end}: {w}"
                if t not in out:
                    out.append(t)
        if any(getattr(s.spec, "category", "") == "A" for s in self.splices):
            from ..design.splice_plan import category_b_needed
            slip = getattr(self, "slip_checks", ())
            if category_b_needed(slip):
                out.append("The category A (bearing) splices slip in their clearance holes and the kinks take the "
                           "deflection past its limit: specify preloaded bolts, category B (slip-resistant at SLS, "
                           "EN 1993-1-8 3.4.1), or fitted bolts.")
            else:
                out.append("The splices are bearing-type (category A) joints in clearance holes: the kink from slip "
                           "at each splice is computed and included in the deflection checks (unless the job "
                           "sets slip = 'ignored', shown as NOT CHECKED).")
        out += [c for c in execution_cautions(self) if c not in out]
        return tuple(out)


@dataclass(frozen=True)
class SplicePart:
    """One splice of the beam: its position and forces, the designed splice and its records.

    ``records`` are the splice's check records with ids prefixed ``S<k>.`` and titles
    ``Splice S<k>: ...`` so that they stay distinct in the package.
    """

    index: int
    x_mm: float
    M_Ed: float
    V_Ed: float
    N_Ed: float
    combination: str
    design: Any
    records: tuple[CheckRecord, ...]
    M_Ed_ser: float | None = None
    V_Ed_ser: float | None = None
    spec: Any = None

    @property
    def label(self) -> str:
        return f"S{self.index}"


@dataclass(frozen=True)
class ConnectionPart:
    """One end connection: the support spec, the design reaction, the connection design.

    ``records``: checks of the connection itself (detailing, bolts, plate, welds,
    beam web, tying); ``existing_records``: checks of the existing member it lands on.
    Ids are prefixed ``A.`` / ``B.`` and titles ``End A: ...``.
    """

    index: int
    end: str
    V_Ed: float
    combination: str
    design: Any
    records: tuple[CheckRecord, ...]
    existing_records: tuple[CheckRecord, ...]

    @property
    def spec(self) -> Any:
        return self.design.spec


@dataclass(frozen=True)
class CalcResult(PackageRecords):
    """Everything a calc package shows, in the order it is shown."""

    job: Job
    design: BeamDesign
    positions: Any = None
    splices: tuple[SplicePart, ...] = ()
    connections: tuple[ConnectionPart, ...] = ()
    splice_rounds: int = 0
    splice_kit_mass_kg: float = 0.0
    splice_zone_mm: float = 0.0
    splice_plan: Any = None
    slip_checks: tuple[CheckRecord, ...] = ()
    notes: tuple[str, ...] = field(default=())
    member_checks: tuple[CheckRecord, ...] = ()

    # ------------------------------------------------------------ records
    @property
    def section(self) -> Any:
        return self.design.section

    @property
    def member_records(self) -> tuple[CheckRecord, ...]:
        """Member checks, each note naming its governing combination."""
        return self.member_checks or tuple(self.design.records)

    @property
    def position_records(self) -> tuple[CheckRecord, ...]:
        return tuple(self.positions.records) if self.positions is not None else ()

    @property
    def records(self) -> tuple[CheckRecord, ...]:
        """Every check record of the package, in the order the parts show them."""
        return tuple(self.member_records) + tuple(self.position_records) + tuple(self.slip_checks) + self.joint_records

    @property
    def ok(self) -> bool:
        return self.design.ok and all(r.ok for r in self.records)

    @property
    def headline(self) -> str:
        """One line naming what the package designs."""
        out = f"Beam {self.section.designation} {self.job.beam.grade}, span {self.job.beam.span / 1000:g} m"
        if self.splices:
            out += (f", {len(self.splices)} splice(s) at "
                    + ", ".join(f"{s.x_mm / 1000:.3f} m" for s in self.splices))
        if self.connections:
            out += f", {len(self.connections)} end connection(s)"
        return out


# ======================================================================== helpers
def _relabel(rec: CheckRecord, id_prefix: str, title_prefix: str) -> CheckRecord:
    return replace(rec, id=f"{id_prefix}.{rec.id}", title=f"{title_prefix}: {rec.title}")


def _resistance(design: BeamDesign, check_id: str, unit_from: str, unit_to: str) -> float:
    try:
        rec = design.record(check_id)
    except KeyError:
        raise CalcError(f"the member checks returned no '{check_id}' record: cannot normalise the splice "
                        "demand") from None
    return convert(rec.resistance, unit_from, unit_to)


def _require_spec(job: Job) -> None:
    """Stop when the job kept raw tables because a joint module was missing."""
    if isinstance(job.splices, dict):
        raise CalcError("[splices] could not be read: the splice module (splicecalc.joints.splice) is not "
                        "available, so the splices cannot be designed")
    seen: dict[str, int] = {}
    for i, s in enumerate(job.supports):
        if isinstance(s, dict):
            raise CalcError(f"support[{i + 1}] could not be read: the connection module "
                            "(splicecalc.joints.connections) is not available")
        if s.at in seen:
            raise InputError(f"support[{i + 1}].at", s.at, f"an end not already given by support[{seen[s.at]}] "
                             "(one [[support]] table per end: 'start' and 'end')")
        seen[s.at] = i + 1


def _sls_at(design: BeamDesign, x: float) -> tuple[float, float]:
    """Largest characteristic |M| at x (N*mm) and the |V| of that combination (N)."""
    best = (0.0, 0.0)
    for _, b in design.analysis.sls_characteristic:
        M = abs(float(b.M(x)))
        V = max(abs(float(b.V(x, "left"))), abs(float(b.V(x, "right"))))
        if M > best[0]:
            best = (M, V)
    return best


# ======================================================================== parts
def design_member(job: Job, render: bool = True, whole_job: Any = None) -> BeamDesign:
    """Actions, analysis, member checks and (``section = "auto"``) the lightest section
    (for which ``whole_job`` finds no error: see :func:`splicecalc.design.beam.design_beam`)."""
    design = design_beam(job, render=render, whole_job=whole_job)
    if design.section is None or design.analysis is None:
        raise CalcError(f"the member design gave no section: {design.message}")
    return design


def member_checks(design: BeamDesign) -> tuple[CheckRecord, ...]:
    """The member records with the governing combination added to each note."""
    out = []
    for r in design.records:
        combo = design.governing.get(r.id)
        if combo:
            r = replace(r, note=f"{r.note}; governing combination: {combo}" if r.note
                        else f"governing combination: {combo}")
        out.append(r)
    return tuple(out)


def splice_envelope(job: Job, design: BeamDesign) -> tuple:
    """ULS envelopes (M_abs, V_abs, at) of the designed section for the splices, imposed load patterned
    (:func:`splicecalc.design.splice_positions.patterned_envelope`)."""
    from ..design.splice_positions import patterned_envelope
    return patterned_envelope([c for c, _ in design.analysis.uls], job.beam.span)


def design_splices(job: Job, design: BeamDesign, render: bool = True,
                   end_mass_kg: tuple[float, float] = (0.0, 0.0)) -> tuple[Any, tuple[SplicePart, ...]]:
    """Positions and designs of the splices by the one loop (:func:`~splicecalc.design.splice_plan.plan_splices`);
    returns ``(plan, parts)`` (``(None, ())`` without ``[splices]``)."""
    if job.splices is None:
        return None, ()
    from ..design.splice_plan import plan_splices

    M_abs, V_abs, at = splice_envelope(job, design)
    avoid = sorted({ld.x for ld in job.loads if isinstance(ld, PointLoad) and 0.0 < ld.x < job.beam.span}
                   | set(job.beam.restraints))
    plan = plan_splices(design.section, job.beam.grade, job.beam.span, job.splices, M_abs=M_abs, V_abs=V_abs, at=at,
                        avoid=avoid, na=job.na, M_c_Rd=_resistance(design, "bending", "kNm", "Nmm"),
                        V_c_Rd=_resistance(design, "shear", "kN", "N"), mass_per_m=design.section.mass_nominal,
                        end_mass_kg=end_mass_kg, sls_at=lambda x: _sls_at(design, x), render=render)
    out = []
    for k, (sp, d, (M_ser, V_ser)) in enumerate(zip(plan.positions.splices, plan.designs, plan.serviceability),
                                                start=1):
        recs = tuple(_relabel(r, f"S{k}", f"Splice S{k}") for r in d.records)
        out.append(SplicePart(index=k, x_mm=sp.x, M_Ed=sp.M_Ed, V_Ed=sp.V_Ed, N_Ed=sp.N_Ed,
                              combination=sp.combination, design=d, records=recs, M_Ed_ser=M_ser,
                              V_Ed_ser=V_ser, spec=job.splices))
    return plan, tuple(out)


def splice_tie_checks(job: Job, splices: tuple, connections: tuple, render: bool = True) -> tuple:
    """Each splice with its checks under the end connections' tie force added (accidental situation,
    :func:`splicecalc.joints.splice.tying.tie_records`): the tie runs the length of the beam. Without
    end connections there is no tie force: a NOT CHECKED record says so."""
    if not splices:
        return splices
    from ..core.record import not_checked
    from ..joints.splice.tying import tie_records
    ties = [(c.design.tie, c.design.tie_basis, c.end) for c in connections]
    out = []
    for s in splices:
        if ties:
            T, basis, end = max(ties, key=lambda t: t[0])
            recs = tie_records(s.design, job.splices, T, job.na, render=render, loc=s.x_mm,
                               basis=f"end {end}: {basis}")
        else:
            recs = [not_checked(id="tie", title="Tie force through the splice (accidental)",
                                clause="EN 1991-1-7:2006, A.5.1, Eq. (A.1)", location_mm=s.x_mm,
                                reason="no [[support]] is given, so the beam's tie force is not known; the splice "
                                       "must carry it (give the supports, or check the tie separately)")]
        extra = tuple(_relabel(r, s.label, f"Splice {s.label}") for r in recs)
        out.append(replace(s, records=s.records + extra))
    return tuple(out)


def splice_slip_checks(job: Job, design: BeamDesign, plan: Any, render: bool = True) -> tuple[CheckRecord, ...]:
    """The SLS deflection checks repeated with the slip of category A splices."""
    if plan is None or not plan.designs:
        return ()
    from ..design.splice_plan import DeflectionCase, slip_records
    a = design.analysis
    cases = [DeflectionCase("deflection_slip", "variable actions", job.beam.deflection_limit,
                            tuple((c.name, b) for c, b in a.sls_variable))]
    if job.beam.total_deflection_limit is not None:
        cases.append(DeflectionCase("deflection_total_slip", "total, characteristic", job.beam.total_deflection_limit,
                                    tuple((c.name, b) for c, b in a.sls_characteristic)))
    return tuple(slip_records(plan, job.splices, design.section, job.beam.span, cases, render=render))


def _end_masses(job: Job, connections: tuple) -> tuple[float, float]:
    """End connection masses (kg) carried by the first (end A) and last (end B) piece."""
    from ..design.splice_plan import end_connection_mass
    m = {"A": 0.0, "B": 0.0}
    for c in connections:
        m[c.end] = end_connection_mass(c.design).lifted_kg      # lifted bare: the welded end plate only
    return m["A"], m["B"]


def design_connections(job: Job, design: BeamDesign, render: bool = True) -> tuple[ConnectionPart, ...]:
    """Design every ``[[support]]`` connection for the largest ULS reaction at its end."""
    if not job.supports:
        return ()
    from ..joints.connections import design_end_connection
    from ..joints.connections.existing_member import reactions_by_action
    from ..core.record import Calc
    from ..joints.connections.tying import tying_force_from_loads, tying_record

    an = design.analysis
    uls = an.uls
    out = []
    for spec in job.supports:
        end = END_LETTER[spec.at]
        reactions = [(abs(b.R_A if end == "A" else b.R_B), c.name) for c, b in uls]
        V, combo = max(reactions, key=lambda t: t[0])
        # the existing member takes the characteristic reaction of each action (with the beam self-weight),
        # the tie force comes from the beam's loads by the consequence class
        parts = reactions_by_action(an.loads, an.span_mm, end)
        tcalc = Calc(render=render)
        tying = tying_force_from_loads(an.loads, an.span_mm, spec.consequence_class, job.psi, tcalc)
        d = design_end_connection(design.section, job.beam.grade, V, spec, job.na, render=render, reactions=parts,
                                  tying=tying, psi=job.psi, restrained=job.beam.continuous_restraint)
        tie_rec = tying_record(tcalc, d.tie, d.tie_basis, spec.tying_given)
        existing_ids = {id(r) for r in d.existing.records}
        own = tuple(_relabel(r, end, f"End {end}") for r in d.records if id(r) not in existing_ids)
        ex = tuple(_relabel(r, end, f"End {end}") for r in d.existing.records)
        if len(own) + len(ex) != len(d.records):
            # existing records not shared by identity: split by id instead
            ex_ids = {r.id for r in d.existing.records}
            own = tuple(_relabel(r, end, f"End {end}") for r in d.records if r.id not in ex_ids)
            ex = tuple(_relabel(r, end, f"End {end}") for r in d.records if r.id in ex_ids)
        own = (_relabel(tie_rec, end, f"End {end}"),) + own
        out.append(ConnectionPart(index=spec.index, end=end, V_Ed=V, combination=combo, design=d, records=own,
                                  existing_records=ex))
    return tuple(out)


def run_calc(job: Job, render: bool = True) -> CalcResult:
    """Run every part of the beam-and-splice calculation of ``job`` (see the module docstring).

    ``render``: render every check with handcalcs (the calc package); ``False`` runs
    the same checks on plain floats (tests, quick looks). Raises
    :class:`~splicecalc.core.errors.InputError` for bad input and :class:`CalcError`
    when a part cannot be carried out.
    """
    if not isinstance(job, Job):
        raise InputError("job", type(job).__name__, "a splicecalc.job.Job (load_job('job.toml'))")
    if not isinstance(render, bool):
        raise InputError("render", render, "True or False")
    _require_spec(job)
    # section = "auto" with splices: the search takes the lightest section with which the end connections
    # and the splices can be designed too (plain floats; kept to be reused when not rendering)
    tried: dict[str, tuple] = {}

    def joints(d: BeamDesign) -> Exception | str | None:
        # an end connection that cannot be designed stops the job (its error names the job's own input,
        # a notch or a plate, as with a given section); splices that cannot be designed pass it over
        conns = design_connections(job, d, render=False)
        try:
            tried[d.section.designation] = (conns, *design_splices(job, d, render=False,
                                                                    end_mass_kg=_end_masses(job, conns)))
        except (InputError, CalcError) as err:
            return err
        conns, _, parts = tried[d.section.designation]
        bad = [r for p in (*parts, *conns) for r in p.records if r.checked and not r.ok and not r.id.endswith("tie_force")]
        if bad:
            r = max(bad, key=lambda r: r.utilisation)
            return f"{r.title} exceeds capacity (u = {r.utilisation:.2f}; {r.clause or r.guidance})"
        return None

    auto_splices = job.beam.is_auto and job.splices is not None
    design = design_member(job, render=render, whole_job=joints if auto_splices else None)
    notes: list[str] = list(job.notes)

    if not render and design.section.designation in tried:
        connections, plan, splices = tried[design.section.designation]
    else:
        # end connections first: what they weigh is carried by the end pieces
        connections = design_connections(job, design, render=render)
        plan, splices = design_splices(job, design, render=render, end_mass_kg=_end_masses(job, connections))
    positions = plan.positions if plan is not None else None
    splices = splice_tie_checks(job, splices, connections, render=render)
    slip = splice_slip_checks(job, design, plan, render=render)
    rounds = plan.rounds if plan is not None else 0
    kit_mass = plan.kit_mass_kg if plan is not None else 0.0
    zone = plan.zone_mm if plan is not None else FIRST_SPLICE_ZONE_MM
    return CalcResult(job=job, design=design, positions=positions, splices=splices, connections=connections,
                      splice_rounds=rounds, splice_kit_mass_kg=kit_mass, splice_zone_mm=zone, notes=tuple(notes),
                      splice_plan=plan, slip_checks=slip,
                      member_checks=member_checks(design))


__all__ = ["CalcError", "CalcResult", "ConnectionPart", "SplicePart", "design_connections", "design_member",
           "design_splices", "member_checks", "run_calc", "splice_envelope", "splice_slip_checks", "splice_tie_checks", "END_LETTER",
           "MAX_ROUNDS"]
