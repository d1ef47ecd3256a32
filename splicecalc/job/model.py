"""The job: one validated, frozen input model for a beam design.

The same :class:`Job` is built three ways and always gives the same results:

* in a notebook, directly: ``Job(project=Project(...), beam=BeamSpec(span=7200.0, ...),
  loads=(UDL(...), PointLoad(...)))``;
* from a TOML job file: :func:`splicecalc.job.loader.load_job`;
* from the command line (``splicecalc run JOB.toml``), which calls the loader.

Internal units as everywhere in splicecalc: lengths mm, forces N, line loads
N/mm (= kN/m). Loads are the load-model objects of :mod:`splicecalc.actions.loads`
(:class:`~splicecalc.actions.loads.UDL`, :class:`~splicecalc.actions.loads.PointLoad`),
so the job does not re-define them.

:meth:`Job.to_canonical_dict` is the one serialisation of a job (job-file
layout, quantities written as strings with units, fixed key order); it is what
the sign-off digest hashes and what :meth:`Job.to_toml` writes.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, fields, replace
from typing import Any

from ..actions.loads import CATEGORIES, Load, PointLoad, UDL
from ..core.errors import (InputError, require_choice, require_in_range, require_non_negative,
                           require_positive)
from ..core.units import convert
from ..materials import UK_NA, NationalAnnex, normalise_grade

#: section families searched when ``section = "auto"``
FAMILIES: tuple[str, ...] = ("UKB", "UKC", "IPE", "HEA", "HEB")
#: height of the load application point relative to the shear centre
LOAD_LEVELS: tuple[str, ...] = ("top flange", "shear centre", "bottom flange")
#: EN 1990:2002, 6.4.3.2(3): Eq. 6.10, or the less favourable of Eqs. 6.10a and 6.10b
COMBINATIONS: tuple[str, ...] = ("6.10", "6.10ab")
#: psi-factor tables (EN 1990 Table A1.1): UK NA values or EN recommended values
PSI_TABLES: tuple[str, ...] = ("UK NA", "EN recommended")
#: imposed loads of several categories: one variable action (EN 1991-1-1 3.3.1(2)P) or separate actions
IMPOSED_MODES: tuple[str, ...] = ("single", "separate")
#: national-annex parameters a job may override (numbers), see NationalAnnex
NA_OVERRIDABLE: tuple[str, ...] = tuple(f.name for f in fields(NationalAnnex)
                                        if f.name not in ("name", "combination"))

#: name of the beam self-weight load the design adds (reserved: a job load may not use it)
SELF_WEIGHT_NAME: str = "beam self-weight"

PROJECT_KEYS: tuple[str, ...] = ("number", "title", "prepared_by", "checked_by", "approved_by", "client",
                                 "location", "date", "revision")


def _text(field_name: str, value: Any) -> str:
    if not isinstance(value, str):
        raise InputError(field_name, value, "a text (string)")
    return value.strip()


@dataclass(frozen=True)
class Project:
    """Title-block data of the calc package (all plain text, may be empty)."""

    number: str = ""
    title: str = ""
    prepared_by: str = ""
    checked_by: str = ""
    approved_by: str = ""
    client: str = ""
    location: str = ""
    date: str = ""
    revision: str = ""

    def __post_init__(self) -> None:
        for k in PROJECT_KEYS:
            object.__setattr__(self, k, _text(f"project.{k}", getattr(self, k)))


@dataclass(frozen=True)
class BeamSpec:
    """The beam to design (simply supported, fork supports at both ends).

    span: clear span between bearing centres, mm (> 0).
    grade: steel grade, e.g. ``"S355"`` (EN 10025-2).
    section: ``"auto"`` (lightest passing section of ``families``) or a designation.
    families: families searched when ``section == "auto"``.
    max_depth: headroom limit on the section depth h, mm, or ``None``.
    bearing_length: stiff bearing length s_s at each support where the beam bears on its bottom
        flange (a wall plate, a padstone, the top of a column), mm (EN 1993-1-5, 6.3); ``None``
        (default) when the beam hangs on end connections (no web bearing check at the supports).
        At most a quarter of the span.
    end_distance: distance c from the beam end to the stiff bearing, mm
        (EN 1993-1-5, Figure 6.1 type (c)); 0 when the beam ends at the bearing.
    restraints: positions of intermediate lateral-torsional restraints, mm from
        support A, strictly increasing, strictly inside the span.
    continuous_restraint: the top (compression) flange is held laterally along the whole span
        (job file ``restraints = "continuous"``, e.g. a floor fixed to it): no lateral-torsional buckling.
    load_level: where the loads act: ``"top flange"``, ``"shear centre"`` or ``"bottom flange"``.
    deflection_limit: N of the variable-action limit span / N (UK NA suggestion 360
        for beams carrying brittle finishes, 200 otherwise).
    total_deflection_limit: N of the total-load limit span / N, or ``None`` (not checked).
    combination: ``"6.10"`` or ``"6.10ab"`` (UK NA default: worse of 6.10a/6.10b).
    na_overrides: national-annex values replacing the UK NA defaults,
        as ``(name, value)`` pairs, e.g. ``(("xi", 0.85),)``.
    psi_table: ``"UK NA"`` (default) or ``"EN recommended"`` psi factors (EN 1990 Table A1.1).
    min_frequency: the smallest natural frequency of a floor beam (Hz) under its mass load (permanent
        plus 10 % of the imposed floor load); 4 Hz by default (common UK practice, from memory).
    imposed: ``"single"`` (default: the imposed loads of all categories are one variable action,
        EN 1991-1-1 3.3.1(2)P) or ``"separate"`` (each category its own action, leading in turn).
    """

    span: float
    grade: str = "S355"
    section: str = "auto"
    families: tuple[str, ...] = ("UKB",)
    max_depth: float | None = None
    bearing_length: float | None = None
    end_distance: float = 0.0
    restraints: tuple[float, ...] = ()
    load_level: str = "top flange"
    deflection_limit: float = 360.0
    total_deflection_limit: float | None = None
    combination: str = "6.10ab"
    na_overrides: tuple[tuple[str, float], ...] = ()
    psi_table: str = "UK NA"
    imposed: str = "single"
    min_frequency: float = 4.0
    continuous_restraint: bool = False

    def __post_init__(self) -> None:
        s = object.__setattr__
        if not isinstance(self.continuous_restraint, bool):
            raise InputError("beam.restraints", self.continuous_restraint, "'continuous' or a list of positions")
        if self.continuous_restraint and self.restraints:
            raise InputError("beam.restraints", self.restraints, "either 'continuous' (the top flange held along "
                             "the whole span) or a list of positions, not both")
        span = require_positive("beam.span", self.span, "mm")
        s(self, "span", span)
        try:
            s(self, "grade", normalise_grade(self.grade))
        except InputError as err:
            raise InputError("beam.grade", self.grade, err.allowed) from None
        sec = self.section
        if not isinstance(sec, str) or not sec.strip():
            raise InputError("beam.section", sec, "'auto' or a section designation such as '457x191x67 UKB'")
        sec = sec.strip()
        s(self, "section", "auto" if sec.lower() == "auto" else sec)
        fams = self.families
        if isinstance(fams, str):
            fams = (fams,)
        if not isinstance(fams, (list, tuple)) or not fams:
            raise InputError("beam.families", self.families, f"a non-empty list from {list(FAMILIES)}")
        clean = []
        for i, f in enumerate(fams):
            fu = f.strip().upper() if isinstance(f, str) else f
            require_choice(f"beam.families[{i + 1}]", fu, FAMILIES)
            if fu not in clean:
                clean.append(fu)
        s(self, "families", tuple(clean))
        if self.max_depth is not None:
            s(self, "max_depth", require_positive("beam.max_depth", self.max_depth, "mm"))
        if self.bearing_length is not None:
            bl = require_non_negative("beam.bearing_length", self.bearing_length, "mm")
            if bl > span / 4.0:
                raise InputError("beam.bearing_length", _q(bl, "mm", "mm"),
                                 f"a stiff bearing length up to a quarter of the span ({span / 4.0:g} mm), "
                                 "or leave it out when the beam hangs on end connections")
            s(self, "bearing_length", bl)
        s(self, "end_distance", require_non_negative("beam.end_distance", self.end_distance, "mm"))
        rs = self.restraints
        if not isinstance(rs, (list, tuple)):
            raise InputError("beam.restraints", rs, "a list of positions inside the span")
        out: list[float] = []
        for i, x in enumerate(rs):
            f = f"beam.restraints[{i + 1}]"
            xv = require_finite_pos(f, x)
            if not (0.0 < xv < span):
                raise InputError(f, x, f"a position strictly between 0 and the span {span:g} mm "
                                 "(the supports are fork restraints already)")
            if out and xv <= out[-1]:
                raise InputError(f, x, f"a position greater than the previous restraint {out[-1]:g} mm "
                                 "(list restraints in increasing order, no duplicates)")
            out.append(xv)
        s(self, "restraints", tuple(out))
        ll = self.load_level.strip().lower() if isinstance(self.load_level, str) else self.load_level
        if ll == "shear center":
            ll = "shear centre"
        require_choice("beam.load_level", ll, LOAD_LEVELS)
        s(self, "load_level", ll)
        s(self, "deflection_limit", require_in_range("beam.deflection_limit", self.deflection_limit,
                                                     50.0, 1000.0))
        if self.total_deflection_limit is not None:
            s(self, "total_deflection_limit", require_in_range(
                "beam.total_deflection_limit", self.total_deflection_limit, 50.0, 1000.0))
        require_choice("beam.combination", self.combination, COMBINATIONS)
        ov = self.na_overrides
        if isinstance(ov, dict):
            ov = tuple(ov.items())
        clean_ov: dict[str, float] = {}
        for item in ov:
            if not (isinstance(item, tuple) and len(item) == 2):
                raise InputError("beam.national_annex", ov, "(name, value) pairs")
            k, v = item
            require_choice("beam.national_annex", k, NA_OVERRIDABLE)
            clean_ov[k] = require_positive(f"beam.national_annex.{k}", v)
        s(self, "na_overrides", tuple(sorted(clean_ov.items())))
        require_choice("beam.psi_table", self.psi_table, PSI_TABLES)
        require_choice("beam.imposed", self.imposed, IMPOSED_MODES)
        s(self, "min_frequency", require_in_range("beam.min_frequency", self.min_frequency, 1.0, 20.0, "Hz"))

    @property
    def is_auto(self) -> bool:
        return self.section == "auto"

    @property
    def segments(self) -> tuple[tuple[float, float], ...]:
        """Lateral-torsional segments (x_start, x_end) in mm between supports and restraints."""
        pts = (0.0, *self.restraints, self.span)
        return tuple((pts[i], pts[i + 1]) for i in range(len(pts) - 1))


def require_finite_pos(field_name: str, value: Any) -> float:
    """A finite number (mm) for a position; sign is checked by the caller."""
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise InputError(field_name, value, "a finite position in mm")
    return float(value)


@dataclass(frozen=True)
class Job:
    """One beam design job: project data, beam, characteristic loads, splice and support specs.

    ``loads`` are characteristic actions (the beam self-weight is added by the
    design, not here). ``splices`` / ``supports`` hold the parsed specs of the
    joint modules (or the raw TOML tables when those modules are absent), and
    ``splices_table`` / ``support_tables`` the raw tables for serialisation.
    """

    beam: BeamSpec
    loads: tuple[Load, ...] = ()
    project: Project = field(default_factory=Project)
    splices: Any = None
    supports: tuple[Any, ...] = ()
    splices_table: dict | None = None
    support_tables: tuple[dict, ...] = ()
    notes: tuple[str, ...] = field(default=(), compare=False)

    def __post_init__(self) -> None:
        if not isinstance(self.beam, BeamSpec):
            raise InputError("beam", self.beam, "a BeamSpec")
        if not isinstance(self.project, Project):
            raise InputError("project", self.project, "a Project")
        lds = self.loads
        if isinstance(lds, (UDL, PointLoad)):
            lds = (lds,)
        if not isinstance(lds, (list, tuple)):
            raise InputError("load", lds, "a list of UDL / PointLoad objects")
        lds = tuple(lds)
        L = self.beam.span
        names: set[str] = set()
        for i, ld in enumerate(lds):
            validate_load_on_span(ld, L, f"load[{i + 1}]")
            if ld.name in names:
                raise InputError(f"load[{i + 1}].name", ld.name, "a name not used by another load")
            if ld.name.strip().lower() == SELF_WEIGHT_NAME:
                raise InputError(f"load[{i + 1}].name", ld.name,
                                 f"a name other than '{SELF_WEIGHT_NAME}' (reserved for the self-weight the "
                                 "design adds itself, which it treats as acting at the shear centre)")
            names.add(ld.name)
        object.__setattr__(self, "loads", lds)
        object.__setattr__(self, "supports", tuple(self.supports))
        object.__setattr__(self, "support_tables", tuple(self.support_tables))
        object.__setattr__(self, "notes", tuple(self.notes))
        canonical = check_section_choice(self.beam)
        if canonical is not None and canonical != self.beam.section:
            object.__setattr__(self, "beam", replace(self.beam, section=canonical))
        # the same plausibility bounds and cross-field checks as a job file, for a Job built in Python
        from .bounds import check_bounds, check_relations, check_text_lengths

        doc = self.to_canonical_dict()
        check_text_lengths(doc)
        check_bounds(doc)
        check_relations(self, doc)

    # ------------------------------------------------------------ derived
    @property
    def na(self) -> NationalAnnex:
        """UK NA defaults with the job's overrides and combination rule."""
        return replace(UK_NA, **dict(self.beam.na_overrides), combination=self.beam.combination,
                       name=UK_NA.name if not self.beam.na_overrides else f"{UK_NA.name} (modified)")

    @property
    def psi(self) -> Any:
        """The psi-factor table (:class:`splicecalc.actions.PsiTable`) named by ``beam.psi_table``."""
        from ..actions.psi import PSI_EN_RECOMMENDED, PSI_UK_NA
        return PSI_UK_NA if self.beam.psi_table == "UK NA" else PSI_EN_RECOMMENDED

    def with_section(self, designation: str) -> "Job":
        """A copy of the job with a fixed section (e.g. the chosen one)."""
        return replace(self, beam=replace(self.beam, section=designation))

    # ------------------------------------------------------------ serialisation
    def to_canonical_dict(self) -> dict[str, Any]:
        """The job in job-file layout with fixed key order and unit strings.

        Lengths along the beam in m, dimensions in mm, line loads in kN/m,
        point loads in kN; numbers to 12 significant figures, so
        ``job_from_dict(job.to_canonical_dict()) == job``.
        """
        b = self.beam
        proj = {k: getattr(self.project, k) for k in PROJECT_KEYS if getattr(self.project, k)}
        beam: dict[str, Any] = {
            "span": _q(b.span, "mm", "m"),
            "grade": b.grade,
            "section": b.section,
            "families": list(b.families),
        }
        if b.max_depth is not None:
            beam["max_depth"] = _q(b.max_depth, "mm", "mm")
        if b.bearing_length is not None:
            beam["bearing_length"] = _q(b.bearing_length, "mm", "mm")
        beam["end_distance"] = _q(b.end_distance, "mm", "mm")
        beam["restraints"] = "continuous" if b.continuous_restraint else [_q(x, "mm", "m") for x in b.restraints]
        beam["load_level"] = b.load_level
        beam["deflection_limit"] = _num(b.deflection_limit)
        if b.total_deflection_limit is not None:
            beam["total_deflection_limit"] = _num(b.total_deflection_limit)
        beam["combination"] = b.combination
        if b.na_overrides:
            beam["national_annex"] = {k: _num(v) for k, v in b.na_overrides}
        if b.psi_table != "UK NA":
            beam["psi_table"] = b.psi_table
        if b.imposed != "single":
            beam["imposed"] = b.imposed
        if b.min_frequency != 4.0:
            beam["min_frequency"] = _num(b.min_frequency)
        out: dict[str, Any] = {}
        if proj:
            out["project"] = proj
        out["beam"] = beam
        out["load"] = [load_to_dict(ld) for ld in self.loads]
        if self.splices_table is not None:
            out["splices"] = _plain(self.splices_table)
        if self.support_tables:
            out["support"] = [_plain(t) for t in self.support_tables]
        return out

    def to_toml(self) -> str:
        """The canonical dict as TOML text (tomli-w when installed, else a small writer)."""
        from .loader import dumps_toml
        return dumps_toml(self.to_canonical_dict())


# ---------------------------------------------------------------- helpers
def _num(x: float) -> int | float:
    """Integral floats as int (TOML-friendly), others unchanged."""
    xf = float(x)
    return int(xf) if xf.is_integer() and abs(xf) < 1e15 else float(f"{xf:.12g}")


def _q(value: float, internal: str, out_unit: str) -> str:
    """'7.2 m' style text of an internal float (12 significant figures)."""
    v = convert(value, internal, out_unit)
    return f"{v:.12g} {out_unit}"


def _plain(obj: Any) -> Any:
    """Deep copy of a TOML-like table with sorted keys (for a stable digest)."""
    if isinstance(obj, dict):
        return {k: _plain(obj[k]) for k in sorted(obj)}
    if isinstance(obj, (list, tuple)):
        return [_plain(v) for v in obj]
    return obj


def load_to_dict(ld: Load) -> dict[str, Any]:
    """One load in job-file layout (the inverse of the loader's ``[[load]]`` parser)."""
    d: dict[str, Any] = {"name": ld.name, "action": ld.action}
    if ld.category:
        d["category"] = ld.category
    if ld.group:
        d["group"] = ld.group
    if isinstance(ld, UDL):
        d["udl"] = _q(ld.w, "N/mm", "kN/m")
        if ld.x_start != 0.0:
            d["from"] = _q(ld.x_start, "mm", "m")
        if ld.x_end is not None:
            d["to"] = _q(ld.x_end, "mm", "m")
        if ld.applied_to != "flange":
            d["applied_to"] = ld.applied_to
    else:
        d["point"] = _q(ld.P, "N", "kN")
        d["at"] = _q(ld.x, "mm", "m")
        if ld.bearing_length:
            d["bearing_length"] = _q(ld.bearing_length, "mm", "mm")
        if ld.applied_to != "flange":
            d["applied_to"] = ld.applied_to
    return d


def check_section_choice(beam: BeamSpec) -> str | None:
    """Check the section designation exists and that some section meets ``max_depth``.

    Returns the catalogue spelling of a given designation (e.g. '457x191x67UB' ->
    '457x191x67 UKB'), None for "auto". Uses :mod:`splicecalc.sections` (imported lazily).
    """
    try:
        from ..sections import get_section, list_sections
    except ImportError:  # sections module not there yet: checked again at design time
        return None
    if not beam.is_auto:
        try:
            sec = get_section(beam.section)
        except InputError as err:
            raise InputError("beam.section", beam.section, err.allowed, err.hint) from None
        if beam.max_depth is not None and sec.h > beam.max_depth:
            raise InputError("beam.section", beam.section,
                             f"a section no deeper than beam.max_depth = {beam.max_depth:g} mm "
                             f"(h = {sec.h:g} mm)")
        return sec.designation
    if beam.max_depth is not None:
        shallowest = min(s.h for f in beam.families for s in list_sections(f))
        if shallowest > beam.max_depth:
            raise InputError("beam.max_depth", _q(beam.max_depth, "mm", "mm"),
                             f"a depth that some section of {', '.join(beam.families)} meets "
                             f"(the shallowest is h = {shallowest:g} mm)")
    return None


def validate_load_on_span(ld: Any, span: float, key: str) -> None:
    """Raise InputError (naming ``key``, e.g. 'load[2].at') when a load is not on [0, span]."""
    if not isinstance(ld, (UDL, PointLoad)):
        raise InputError(key, ld, "a UDL or PointLoad")
    if isinstance(ld, PointLoad):
        if not (0.0 <= ld.x <= span):
            raise InputError(f"{key}.at", _q(ld.x, "mm", "m"),
                             f"a position on the span, 0 to {_q(span, 'mm', 'm')}")
        if ld.bearing_length > span:
            raise InputError(f"{key}.bearing_length", _q(ld.bearing_length, "mm", "mm"),
                             f"the stiff bearing length of load '{ld.name}': 0 up to the span "
                             f"{_q(span, 'mm', 'm')} (0 when the load has no stiff bearing)")
    else:
        if ld.x_start >= span:
            raise InputError(f"{key}.from", _q(ld.x_start, "mm", "m"),
                             f"a position from 0 to below the span {_q(span, 'mm', 'm')}")
        if ld.x_end is not None and ld.x_end > span * (1 + 1e-12):
            raise InputError(f"{key}.to", _q(ld.x_end, "mm", "m"),
                             f"a position up to the span {_q(span, 'mm', 'm')}")


__all__ = ["FAMILIES", "LOAD_LEVELS", "COMBINATIONS", "PSI_TABLES", "NA_OVERRIDABLE", "CATEGORIES", "Project",
           "BeamSpec", "Job", "load_to_dict", "validate_load_on_span"]
