"""Physical plausibility bounds on the quantities of a job file, each with its reason.

One declarative table (:data:`BOUNDS`): a field of the job file, its dimension, the range
a real beam in an existing building can have, the unit the range is shown in, the reason
and an example of what to write. :func:`check_bounds` applies every entry to the *raw*
job-file document before any part of it is parsed, so the message quotes the value as
the user wrote it (``beam.span = '1e12 m'``, never ``span_mm = 1e15``) and names the
range in the unit engineers use for it. Values that are not a quantity of the right
dimension are left to the parser of that table, which names the expected unit.

To bound a new field, add one :class:`Bound` (``tests/test_bad_jobs.py`` checks that
every quantity of the example jobs has one).

Relations between fields (a bearing length against the span, a notch against the beam,
bolts against the flange, access limits against the lightest section, supports against
the two ends) are checked on the parsed job by :func:`check_relations`, still before any
design work. The sources are practice and the catalogues, flagged: common practice, no
source, unless a clause is named.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Iterator

from ..core.errors import InputError
from ..core.text import TEXT_HARD_MAX
from ..core.units import convert, parse_quantity


@dataclass(frozen=True)
class Bound:
    """``path``: job-file path, ``[]`` for every entry of an array of tables (``load[].udl``).
    ``dimension``: internal unit for :func:`~splicecalc.core.units.parse_quantity` (``mm``, ``N``,
    ``N/mm``, ``kg``) or ``""`` for a plain number. ``lo``/``hi``: inclusive, internal units.
    ``show``: unit the range is printed in. ``what``: the quantity in words."""

    path: str
    dimension: str
    lo: float
    hi: float
    show: str
    what: str
    reason: str
    example: str


_GM = ("a partial factor on a resistance below 1.0 would give more than the characteristic strength; "
       "1.5 is above any National Annex value (EN 1993-1-1 6.1, EN 1993-1-8 Table 2.1)")

#: every bounded quantity of a job file (internal units: mm, N, N/mm, kg)
BOUNDS: tuple[Bound, ...] = (
    # ---------------------------------------------------------------- beam
    Bound("beam.span", "mm", 1000.0, 36000.0, "m", "a span",
          "below 1 m the member is a lintel or bracket; beyond 36 m no rolled UKB/UKC/IPE/HE section is a "
          "practical simply supported beam (common practice, no source)", "'7.2 m'"),
    Bound("beam.max_depth", "mm", 80.0, 1200.0, "mm", "a depth limit",
          "the catalogue's sections are about 80 mm to 1100 mm deep", "'460 mm'"),
    Bound("beam.bearing_length", "mm", 0.0, 1000.0, "mm", "a stiff bearing length",
          "a wall plate, padstone or cap plate; more than 1 m is not a bearing (also at most span / 4)",
          "'100 mm'"),
    Bound("beam.end_distance", "mm", 0.0, 1000.0, "mm", "an end distance beyond the bearing",
          "a longer overhang is a cantilever, which this calculation does not cover", "'50 mm'"),
    Bound("beam.deflection_limit", "", 50.0, 1000.0, "", "N of span / N",
          "span/50 to span/1000 covers every limit in use (UK NA to BS EN 1993-1-1, NA.2.23: 200 to 360)",
          "360"),
    Bound("beam.total_deflection_limit", "", 50.0, 1000.0, "", "N of span / N",
          "span/50 to span/1000 covers every limit in use (UK NA to BS EN 1993-1-1, NA.2.23: 200 to 360)",
          "250"),
    # national-annex overrides: every field of NationalAnnex a job may set
    Bound("beam.national_annex.gamma_M0", "", 1.0, 1.5, "", "a partial factor gamma_M0", _GM, "1.0"),
    Bound("beam.national_annex.gamma_M1", "", 1.0, 1.5, "", "a partial factor gamma_M1", _GM, "1.0"),
    Bound("beam.national_annex.gamma_M2", "", 1.0, 1.5, "", "a partial factor gamma_M2", _GM, "1.25"),
    Bound("beam.national_annex.gamma_M2_member", "", 1.0, 1.5, "", "a partial factor gamma_M2", _GM, "1.1"),
    Bound("beam.national_annex.gamma_M3", "", 1.0, 1.5, "", "a partial factor gamma_M3", _GM, "1.25"),
    Bound("beam.national_annex.gamma_M3_ser", "", 1.0, 1.5, "", "a partial factor gamma_M3,ser", _GM, "1.1"),
    Bound("beam.national_annex.gamma_M7", "", 1.0, 1.5, "", "a partial factor gamma_M7", _GM, "1.1"),
    Bound("beam.national_annex.gamma_Mu", "", 1.0, 1.5, "", "a partial factor gamma_Mu", _GM, "1.1"),
    Bound("beam.national_annex.gamma_G", "", 1.0, 1.6, "", "a partial factor on permanent actions",
          "EN 1990 Table A1.2(B) recommends 1.35 and National Annexes use 1.2 to 1.35 at ULS; below 1.0 "
          "is not an ultimate limit state (accidental situations are not designed here)", "1.35"),
    Bound("beam.national_annex.gamma_G_inf", "", 0.9, 1.0, "", "a favourable permanent-action factor",
          "EN 1990 Table A1.2(B): 1.0 (0.9 in some annexes)", "1.0"),
    Bound("beam.national_annex.gamma_Q", "", 1.0, 1.8, "", "a partial factor on variable actions",
          "EN 1990 Table A1.2(B) recommends 1.5 and National Annexes use 1.35 to 1.6 at ULS; below 1.0 "
          "is not an ultimate limit state", "1.5"),
    Bound("beam.national_annex.xi", "", 0.85, 1.0, "", "the reduction factor xi of Eq. 6.10b",
          "EN 1990 Table A1.2(B) recommends 0.85; the UK NA uses 0.925", "0.925"),
    Bound("beam.national_annex.lambda_LT_0", "", 0.2, 0.4, "", "the plateau length lambda_LT,0",
          "EN 1993-1-1 6.3.2.3: 0.4 at most (UK NA 0.4; 0.2 is the general-case value)", "0.4"),
    Bound("beam.national_annex.beta_LT", "", 0.75, 1.0, "", "beta of EN 1993-1-1 6.3.2.3",
          "EN 1993-1-1 6.3.2.3: 0.75 at least (UK NA 0.75)", "0.75"),
    Bound("beam.national_annex.eta", "", 1.0, 1.2, "", "eta of EN 1993-1-5 5.1(2)",
          "EN 1993-1-5 5.1(2): 1.2 recommended up to S460, 1.0 in the UK NA", "1.0"),
    # ---------------------------------------------------------------- loads
    Bound("load[].udl", "N/mm", 0.001, 1000.0, "kN/m", "a line load",
          "from a light ceiling to a heavy transfer beam; beyond 1000 kN/m no rolled section carries it: "
          "check the unit (kN/m along the beam, not kN/m2)", "'8.5 kN/m'"),
    Bound("load[].point", "N", 1.0, 5.0e6, "kN", "a point load",
          "beyond 5000 kN no rolled section carries it in shear: check the unit (kN, not N or kg)", "'35 kN'"),
    Bound("load[].width", "mm", 100.0, 20000.0, "m", "a tributary width",
          "the width of floor or roof an area load is collected over: joist or slab spans of buildings",
          "'2.5 m'"),
    Bound("load[].bearing_length", "mm", 0.0, 1000.0, "mm", "a stiff bearing length under the load",
          "a cap or base plate; more than 1 m is a line load", "'100 mm'"),
    # ---------------------------------------------------------------- splices
    Bound("splices.max_piece_length", "mm", 1000.0, 40000.0, "m", "a longest piece",
          "a piece shorter than 1 m leaves no room for cover-plate splices (about 0.6 m each); a limit longer "
          "than the span means the beam needs no splice", "'3.6 m'"),
    Bound("splices.max_piece_mass", "kg", 20.0, 20000.0, "kg", "a heaviest piece",
          "below 20 kg no useful length of rolled beam can be handled; above 20 t is a crane lift, not an "
          "access limit", "'250 kg'"),
    Bound("splices.clearance", "mm", 0.0, 5000.0, "mm", "a clearance", "within the beam, up to 5 m",
          "'300 mm'"),
    Bound("splices.gap", "mm", 0.0, 50.0, "mm", "a gap between the beam ends",
          "fabrication gaps are a few mm; more than 50 mm is not a splice", "'10 mm'"),
    Bound("splices.packing", "mm", 0.0, 50.0, "mm", "a packing thickness",
          "EN 1993-1-8 3.6.1(12) reduces bolts for packs; more than 50 mm is not a packing", "'0 mm'"),
    # ---------------------------------------------------------------- supports
    Bound("support[].tying_force", "N", 1000.0, 2.0e6, "kN", "a tying force",
          "UK practice asks at least 75 kN; beyond 2000 kN no simple end connection ties it", "'75 kN'"),
    Bound("support[].top_below_existing", "mm", -1000.0, 1000.0, "mm", "a level of the new beam's top",
          "measured from the existing beam's top (negative: above it); beyond 1 m the new beam does not meet that "
          "existing beam's web", "'0 mm'"),
    # loads already on the existing member ([support.existing_loads], characteristic values)
    Bound("support[].existing_loads.span", "mm", 1000.0, 36000.0, "m", "the existing beam's span",
          "as for the new beam: rolled sections of buildings", "'6 m'"),
    Bound("support[].existing_loads.height", "mm", 1000.0, 30000.0, "m", "the existing column's height",
          "a storey or a few storeys of a building between restraints", "'3.6 m'"),
    Bound("support[].existing_loads.height_y", "mm", 1000.0, 30000.0, "m", "the existing column's height",
          "a storey or a few storeys of a building between restraints", "'3.6 m'"),
    Bound("support[].existing_loads.height_z", "mm", 1000.0, 30000.0, "m", "the existing column's height",
          "a storey or a few storeys of a building between restraints", "'3.6 m'"),
    *(Bound(f"support[].existing_loads.axial.{a}", "N", 0.0, 2.0e7, "kN", "an axial force in the column",
            "beyond 20 000 kN no rolled column of a building carries it: check the unit", "'450 kN'")
      for a in ("permanent", "imposed")),
    *(Bound(f"support[].existing_loads.{m}.{a}", "Nmm", 0.0, 5.0e9, "kNm", "a moment in the column",
            "beyond 5000 kNm no rolled column of a building carries it: check the unit", "'20 kNm'")
      for m in ("moment_y", "moment_z") for a in ("permanent", "imposed")),
    *(Bound(f"support[].existing_loads.udl.{a}", "N/mm", 0.0, 1000.0, "kN/m", "a line load on the existing beam",
            "as for the new beam's loads", "'3.5 kN/m'") for a in ("permanent", "imposed")),
    *(Bound(f"support[].existing_loads.points[].{a}", "N", 0.0, 5.0e6, "kN", "a point load on the existing beam",
            "as for the new beam's loads", "'20 kN'") for a in ("permanent", "imposed")),
    Bound("support[].existing_member.h", "mm", 50.0, 1200.0, "mm", "a measured depth",
          "rolled I sections and built-up girders of buildings", "'254 mm'"),
    Bound("support[].existing_member.b", "mm", 30.0, 600.0, "mm", "a measured flange width",
          "rolled I sections of buildings", "'203 mm'"),
    Bound("support[].existing_member.tw", "mm", 2.0, 80.0, "mm", "a measured web thickness",
          "rolled I sections of buildings", "'8.9 mm'"),
    Bound("support[].existing_member.tf", "mm", 2.0, 120.0, "mm", "a measured flange thickness",
          "rolled I sections of buildings", "'12.7 mm'"),
    Bound("support[].existing_member.r", "mm", 0.0, 40.0, "mm", "a measured root radius",
          "rolled I sections of buildings (0 for a built-up section)", "'10.2 mm'"),
)

#: longest text of any text field of a job file (characters): ``core.text.TEXT_HARD_MAX`` (20 000, the reason
#: is there). Within it every text prints: where room is short (title strip, table cells, headings,
#: figure labels) shortened with a marker, and in full once under "Texts in full" at the end of the package.
TEXT_MAX = {"project": TEXT_HARD_MAX, "load.name": TEXT_HARD_MAX, "load.group": TEXT_HARD_MAX,
            "designation": TEXT_HARD_MAX}
PROJECT_TEXT_MAX: dict[str, int] = {}


def _fmt(x: float) -> str:
    return f"{x:.6g}"


def _walk(doc: Any, parts: list[str], prefix: str) -> Iterator[tuple[str, Any]]:
    """(field name with 1-based indices, raw value) for every place ``parts`` reaches in ``doc``."""
    if not parts:
        yield prefix, doc
        return
    head, rest = parts[0], parts[1:]
    arr = head.endswith("[]")
    key = head[:-2] if arr else head
    if not isinstance(doc, dict) or key not in doc:
        return
    sub = doc[key]
    name = f"{prefix}.{key}" if prefix else key
    if arr:
        if not isinstance(sub, list):
            return
        for i, item in enumerate(sub):
            yield from _walk(item, rest, f"{name}[{i + 1}]")
    else:
        yield from _walk(sub, rest, name)


def _range_text(b: Bound) -> str:
    if b.dimension:
        lo, hi = convert(b.lo, b.dimension, b.show), convert(b.hi, b.dimension, b.show)
        return f"from {_fmt(lo)} {b.show} to {_fmt(hi)} {b.show}"
    return f"from {_fmt(b.lo)} to {_fmt(b.hi)}"


def check_bound(b: Bound, field: str, raw: Any) -> None:
    """Raise :class:`InputError` when the raw value ``raw`` of ``field`` is outside ``b``;
    values of another type or dimension are left to the table's parser."""
    if b.dimension:
        if not isinstance(raw, str):
            return
        try:
            v = parse_quantity(raw, b.dimension, field)
        except InputError:
            return
    else:
        if isinstance(raw, bool) or not isinstance(raw, (int, float)):
            return
        v = float(raw)
        if not math.isfinite(v):
            raise InputError(field, raw, f"{b.what} {_range_text(b)}", f"Write e.g. {b.example}")
    if not (b.lo <= v <= b.hi):
        raise InputError(field, raw, f"{b.what} {_range_text(b)} ({b.reason})", f"Write e.g. {b.example}")


def check_bounds(doc: dict) -> None:
    """Apply :data:`BOUNDS` to the raw job-file document (first violation raises)."""
    for b in BOUNDS:
        for field, raw in _walk(doc, b.path.split("."), ""):
            check_bound(b, field, raw)


def check_text_lengths(doc: dict) -> None:
    """Title-block fields, load names and groups, designations: at most :data:`TEXT_MAX` characters."""
    def one(field: str, v: Any, limit: int, where: str) -> None:
        if isinstance(v, str) and len(v) > limit:
            raise InputError(field, v[:40] + "...", f"at most {limit} characters ({len(v)} given): "
                             "a text of a job file, printed in full in the package", "Shorten it; attach a longer "
                             "document to the package and refer to it")
    proj = doc.get("project")
    if isinstance(proj, dict):
        for k, v in proj.items():
            one(f"project.{k}", v, PROJECT_TEXT_MAX.get(k, TEXT_MAX["project"]), "the sheet's title strip")
    loads = doc.get("load")
    if isinstance(loads, list):
        for i, ld in enumerate(loads):
            if isinstance(ld, dict):
                one(f"load[{i + 1}].name", ld.get("name"), TEXT_MAX["load.name"], "a table row")
                one(f"load[{i + 1}].group", ld.get("group"), TEXT_MAX["load.group"], "a table row")
    sups = doc.get("support")
    if isinstance(sups, list):
        for i, s in enumerate(sups):
            if isinstance(s, dict) and isinstance(s.get("existing_member"), dict):
                one(f"support[{i + 1}].existing_member.designation", s["existing_member"].get("designation"),
                    TEXT_MAX["designation"], "a heading")


# ---------------------------------------------------------------- relations between fields
#: shortest piece of a spliced beam (mm): room for a cover-plate splice (about 0.6 m) and the plain
#: beam between two splices (common practice, no source); also the bound of max_piece_length
MIN_PIECE_MM = 1000.0
#: EN 1993-1-8 Table 3.3 minima used for "do the bolts fit" (e2 >= 1.2 d0 each side, p2 >= 2.4 d0)
E2_MIN, P2_MIN = 1.2, 2.4


def _candidates(beam: Any) -> list[Any]:
    """The sections the design may choose: the given one, or every section of the families within
    max_depth (empty when the sections module is not there)."""
    try:
        from ..sections import get_section, list_sections
    except ImportError:      # pragma: no cover - sections always present in an installed package
        return []
    if not beam.is_auto:
        return [get_section(beam.section)]
    secs = [s for f in beam.families for s in list_sections(f)]
    if beam.max_depth is not None:
        secs = [s for s in secs if s.h <= beam.max_depth]
    return secs


def _which(beam: Any) -> str:
    return beam.section if not beam.is_auto else f"any section of {', '.join(beam.families)}" + (
        f" within max_depth = {beam.max_depth:g} mm" if beam.max_depth is not None else "")


def check_relations(job: Any, doc: dict) -> None:
    """Cross-field checks on the parsed job (before any design work); first violation raises."""
    _check_supports(job, doc)
    spec = job.splices
    if spec is not None and not isinstance(spec, dict):
        _check_splices(job, spec, doc.get("splices") or {})


def _check_supports(job: Any, doc: dict) -> None:
    sups = [s for s in job.supports if not isinstance(s, dict)]
    if len(job.supports) > 2:
        raise InputError("support", f"{len(job.supports)} [[support]] tables",
                         "at most two [[support]] tables, one at = 'start' and one at = 'end' (a simply "
                         "supported beam has two supports)", "Remove the extra table")
    seen: dict[str, int] = {}
    for s in sups:
        if s.at in seen:
            raise InputError(f"support[{s.index}].at", s.at,
                             f"the other end ('{'end' if s.at == 'start' else 'start'}'): support[{seen[s.at]}] "
                             f"is at '{s.at}' already", "Each end of the beam has one [[support]] table")
        seen[s.at] = s.index
    cands = _candidates(job.beam) if any(getattr(s, "notched", False) for s in sups) else []
    for s in sups:
        if not getattr(s, "notched", False) or not cands:
            continue
        field, raw = f"support[{s.index}].notch_top", (doc["support"][s.index - 1] or {}).get("notch_top")
        ok = [c for c in cands if c.tf <= s.notch_depth < c.h - c.tf - c.r]
        if not ok:
            c = cands[0] if len(cands) == 1 else max(cands, key=lambda c: c.h - c.tf - c.r)
            raise InputError(field, raw, f"a notch depth from t_f = {c.tf:g} mm to below h - t_f - r = "
                             f"{c.h - c.tf - c.r:g} mm of {_which(job.beam)} (a notch through the whole web "
                             "leaves no section at the support)", "Write e.g. '40 mm x 120 mm'")
        if s.notch_length > job.beam.span / 4.0:
            raise InputError(field, raw, f"a notch length up to a quarter of the span ({job.beam.span / 4000.0:g} m)",
                             "Write e.g. '40 mm x 120 mm'")


def bolt_fit_problem(section: Any, size: str, bolt_class: str = "8.8") -> str | None:
    """Why splice bolts of ``size`` cannot fit ``section`` (two bolt lines on each flange, one line
    in the web between the root radii, EN 1993-1-8, 3.5, Table 3.3 minima), or None."""
    from ..joints.bolts import get_bolt

    d0 = get_bolt(size, bolt_class).d_0
    b_need = 2.0 * E2_MIN * d0 + P2_MIN * d0
    if section.b < b_need:
        return (f"bolts that fit the flange of {section.designation}: two bolt lines of {size} need b >= 4.8 d0 = "
                f"{b_need:.0f} mm (EN 1993-1-8, 3.5, Table 3.3: e2 >= 1.2 d0, p2 >= 2.4 d0); b = {section.b:g} mm")
    room = section.h - 2.0 * section.tf - 2.0 * section.r
    if room < 2.0 * E2_MIN * d0:
        return (f"bolts that fit the web of {section.designation} between the root radii ({room:.0f} mm; one row "
                f"of {size} needs 2.4 d0 = {2.0 * E2_MIN * d0:.0f} mm, EN 1993-1-8, 3.5, Table 3.3)")
    return None


def _check_splices(job: Any, spec: Any, raw: dict) -> None:
    span = job.beam.span
    max_pieces = int(span // MIN_PIECE_MM)
    if getattr(spec, "pieces", None) is not None:
        if spec.pieces < 2:
            raise InputError("splices.pieces", spec.pieces, "2 or more pieces (one piece has no splice)",
                             "Leave out the [splices] table for a beam delivered in one piece")
        if spec.pieces > max_pieces:
            raise InputError("splices.pieces", spec.pieces,
                             f"at most {max_pieces} pieces on a {span / 1000.0:g} m span (each piece at least "
                             f"{MIN_PIECE_MM / 1000.0:g} m long, room for its splices)",
                             "Write fewer pieces, or give access limits (max_piece_length, max_piece_mass)")
    cands = _candidates(job.beam)
    L_max, m_max = getattr(spec, "max_piece_length", None), getattr(spec, "max_piece_mass", None)
    if cands and (L_max is not None or m_max is not None):
        m_light = min(c.mass_nominal for c in cands)          # kg/m
        if m_max is not None and m_max < m_light * MIN_PIECE_MM / 1000.0:
            raise InputError("splices.max_piece_mass", raw.get("max_piece_mass"),
                             f"at least {m_light * MIN_PIECE_MM / 1000.0:.0f} kg: a {MIN_PIECE_MM / 1000.0:g} m piece "
                             f"of the lightest section the design may use ({_which(job.beam)}: {m_light:g} kg/m) "
                             "weighs that much", "Raise the limit or lift with other equipment")
        n_len = math.ceil(span / L_max - 1e-9) if L_max is not None else 1
        n_mass = math.ceil(span / 1000.0 * m_light / m_max - 1e-9) if m_max is not None else 1
        if max(n_len, n_mass) > max_pieces:
            key = "max_piece_length" if n_len >= n_mass else "max_piece_mass"
            raise InputError(f"splices.{key}", raw.get(key),
                             f"a limit that needs at most {max_pieces} pieces on a {span / 1000.0:g} m span "
                             f"(it needs {max(n_len, n_mass)}; each piece at least {MIN_PIECE_MM / 1000.0:g} m)",
                             "Raise the limit")
    size = getattr(spec, "bolt_size", None)
    if size and cands:
        from ..joints.bolts import get_bolt

        d0 = get_bolt(size, spec.bolt_class).d_0
        problems = [bolt_fit_problem(c, size, spec.bolt_class) for c in cands]
        if all(problems):
            c = max(cands, key=lambda c: c.b)
            raise InputError("splices.bolts", raw.get("bolts"), bolt_fit_problem(c, size, spec.bolt_class)
                             + ("" if not job.beam.is_auto else f" (the widest flange the design may use)"),
                             "Use a smaller bolt (e.g. 'M16 8.8') or 'auto'")
        lay = getattr(spec, "flange", None)
        if lay is not None and not job.beam.is_auto:
            c = cands[0]
            if lay.gauge + 2.0 * E2_MIN * d0 > c.b + 1e-9:
                raise InputError("splices.layout.flange.gauge", ((raw.get("layout") or {}).get("flange") or {})
                                 .get("gauge"), f"a gauge up to b - 2.4 d0 = {c.b - 2 * E2_MIN * d0:.0f} mm for "
                                 f"{c.designation} (edge distance e2 >= 1.2 d0 on the flange, EN 1993-1-8, 3.5, "
                                 "Table 3.3)", "Reduce the gauge")
        web = getattr(spec, "web", None)
        if web is not None and not job.beam.is_auto:
            c = cands[0]
            depth = (web.rows - 1) * web.pitch + 2.0 * E2_MIN * d0
            room = c.h - 2.0 * c.tf - 2.0 * c.r
            if depth > room + 1e-9:
                raise InputError("splices.layout.web.rows", web.rows,
                                 f"a web bolt group that fits between the root radii of {c.designation} "
                                 f"({room:.0f} mm; {web.rows} rows at {web.pitch:g} mm pitch need {depth:.0f} mm "
                                 "with e >= 1.2 d0, EN 1993-1-8, 3.5, Table 3.3)", "Use fewer rows or a smaller pitch")


__all__ = ["BOUNDS", "Bound", "TEXT_MAX", "MIN_PIECE_MM", "bolt_fit_problem", "check_bound", "check_bounds", "check_relations",
           "check_text_lengths"]
