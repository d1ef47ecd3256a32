"""One call per part of the calc sheet: the notebook templates stay short.

Every check is displayed once with :func:`splicecalc.report.display.show_check`,
whose output carries the record under the sign-off MIME type
(:data:`splicecalc.signoff.digest.CHECK_MIME`); the job's canonical inputs are
published once by :func:`show_inputs` under
:data:`splicecalc.signoff.digest.JOB_MIME`. Tables, headings, figures and
rendered equations are plain display data laid out by the PDF exporter.

Numbers shown here are results of the owning modules (design, splice, connection
results); nothing is recomputed for display.
"""

from __future__ import annotations

import math
import re
import os
import sys
from typing import Any, Iterable, Sequence

from ..actions import PointLoad, UDL
from ..core.record import CheckRecord, count_verdicts, verdict_sentence
from ..core.text import markdown_safe
from ..report.headless import HEADLESS_ENV
from ..report.display import (TABLE_MIME, UNIT_TEX, TableOutput, fmt_utilisation, publish, show_check,
                              show_section, show_table, summary_output)
from ..signoff.digest import CHECK_MIME, JOB_MIME
from .calc import CalcResult


def _u(unit: str) -> str:
    """A unit as a LaTeX math table cell."""
    return f"${UNIT_TEX.get(unit, unit)}$" if unit else ""


def _m(x_mm: float | None) -> str:
    return "-" if x_mm is None else f"{x_mm / 1000.0:.3f}"


class _Bundle:
    """Any MIME bundle as a displayable object."""

    def __init__(self, data: dict[str, Any], metadata: dict[str, Any] | None = None) -> None:
        self.data = data
        self.metadata = metadata or {}

    def _repr_mimebundle_(self, include: Any = None, exclude: Any = None) -> tuple[dict, dict]:
        return self.data, self.metadata


# ======================================================================== generic outputs
def show_heading(text: str, level: int = 1) -> None:
    """A heading in the output (level 1 = a numbered section of the package)."""
    line = " ".join(str(text).split())          # one line: job text cannot start a heading of its own
    publish(_Bundle({"text/markdown": "#" * level + " " + markdown_safe(line), "text/plain": text}))


def _latex_only(latex: str) -> None:
    """A piece of the template's own LaTeX (a macro of ours, no job text); nothing shows in Jupyter."""
    publish(_Bundle({"text/latex": latex, "text/markdown": "", "text/plain": ""}))


def contents_depth(depth: int = 1) -> None:
    """Limit the PDF contents list to ``depth`` (1: sections only) from here on.

    A long package lists every check as a subsection; the contents then runs to
    several sheets. This output carries only LaTeX (nothing shows in Jupyter).
    """
    if isinstance(depth, bool) or depth not in (0, 1, 2, 3):
        raise ValueError(f"contents depth must be 0, 1, 2 or 3, not {depth!r}")
    publish(_Bundle({"text/latex": f"\\addtocontents{{toc}}{{\\protect\\setcounter{{tocdepth}}{{{depth}}}}}",
                      "text/markdown": "", "text/plain": ""}))


def show_text(text: str) -> None:
    """A paragraph of Markdown text."""
    publish(_Bundle({"text/markdown": markdown_safe(text), "text/plain": text}))


def show_list(items: Iterable[str], title: str = "") -> None:
    """A bulleted list (Markdown)."""
    md = ([f"**{title}**", ""] if title else []) + [f"- {' '.join(str(t).split())}" for t in items]
    publish(_Bundle({"text/markdown": markdown_safe("\n".join(md)), "text/plain": "\n".join(md)}))


def show_steps(latex: Sequence[str], intro: str = "") -> None:
    """Rendered handcalcs steps (LaTeX) that are not a check of their own."""
    steps = [s for s in latex if s.strip()]
    if not steps:
        return
    from ..report.latexout import steps_latex

    body = steps_latex(steps)
    md = "\n\n".join(([intro] if intro else []) + list(steps))
    if intro:
        body = f"\\par{{{_tex_text(intro)}}}\\par\n" + body
    publish(_Bundle({"text/latex": body, "text/markdown": md, "text/plain": intro or "(rendered steps)"}))


def _tex_text(text: str) -> str:
    from ..report.latexout import escape_tex

    return escape_tex(text)


def figure_bundle(fig: Any, caption: str = "") -> dict[str, Any]:
    """PDF (vector, used by the calc package) and PNG (Jupyter, not in a headless build) of a matplotlib Figure."""
    from ..report.figures import figure_outputs

    out: dict[str, Any] = {"text/plain": caption or "figure"}
    out.update(figure_outputs(fig, ("pdf",) if os.environ.get(HEADLESS_ENV) else ("pdf", "png")))
    return out


def show_figure(fig: Any, caption: str = "") -> None:
    """Display a matplotlib Figure (vector PDF for the package, PNG for Jupyter), caption below."""
    publish(_Bundle(figure_bundle(fig, caption)))
    if caption:
        show_text(f"*{caption}*")


def show_drawing(data: dict[str, Any], caption: str = "", floating: bool = False) -> None:
    """Display a figure given by its data (:mod:`splicecalc.report.figures`), caption below.

    In Jupyter it is drawn here; in a headless build the build process draws it
    while this kernel goes on with the next cells. ``floating``: in the PDF the figure and its
    caption float to the top of a sheet (a tall to-scale drawing), so the text after it fills the
    sheet before it instead of leaving it part blank.
    """
    from ..report.figures import drawing_bundle

    if floating:
        data = {**data, "float": True, "caption": caption}
    publish(_Bundle(drawing_bundle(data, caption, headless=bool(os.environ.get(HEADLESS_ENV)))))
    if caption and floating:        # the PDF prints it inside the float; Jupyter shows it here
        publish(_Bundle({"text/markdown": f"*{markdown_safe(caption)}*", "text/latex": "\\relax", "text/plain": caption}))
    elif caption:
        show_text(f"*{caption}*")


def show_checks(records: Iterable[CheckRecord]) -> None:
    """Display each record once (rendered steps and verdict; publishes CHECK_MIME)."""
    for r in records:
        show_check(r)


#: clauses of detailing rules (spacing, edge and end distances, fits, access limits): shown as table rows
RULE_CLAUSES = ("EN 1993-1-8:2005, 3.5, Table 3.3", "EN 1993-1-8:2005, 3.5(1)", "Job file")
#: a rule's rendered working longer than this (characters of LaTeX) is a check of its own, shown in full
RULE_MAX_LATEX = 300
#: record-title prefixes of a part (``Splice S1: ``, ``End A: ``), left out of a rule table's rows
PART_PREFIXES = ("Splice S", "End ")
RULES_NOTE = ("For a minimum (end or edge distance, spacing, depth) $E_d$ is the value required and $R_d$ the "
              "value provided; for a maximum $E_d$ is the value provided and $R_d$ the limit.")


def is_detailing_rule(rec: CheckRecord) -> bool:
    """A made check of a detailing rule (spacing, distances, fit, access) with at most a one-line working."""
    return (rec.checked and (rec.has("detailing") or rec.clause.startswith(RULE_CLAUSES)) and len(rec.latex) <= 1
            and sum(len(x) for x in rec.latex) <= RULE_MAX_LATEX)


def show_rules(records: Sequence[CheckRecord], title: str, note: str = RULES_NOTE) -> None:
    """A table of checks, one row each (rule, E_d, R_d, utilisation, verdict, clause); each record is
    published once (CHECK_MIME) as a row. A NOT CHECKED record is shown in full."""
    recs = list(records)
    if not recs:
        return
    head = f"\\calcrulehead{{{_tex_text(title)}}}{{{note}}}"
    md = f"**{title}**\n\n{note}\n\n| Rule | E_d | R_d | u | Verdict | Clause / source |\n|:--|--:|--:|--:|:-:|:--|"
    publish(_Bundle({"text/latex": head, "text/markdown": md, "text/plain": title}))
    for r in recs:
        label = r.title.split(": ", 1)[1] if r.title.startswith(PART_PREFIXES) and ": " in r.title else ""
        show_check(r, layout="row" if r.checked else "full", label=label[:1].upper() + label[1:])
    publish(_Bundle({"text/latex": "\\calcruleend", "text/markdown": "", "text/plain": ""}))


_SEGMENT = re.compile(r"_(\d+)$")


def repeated_checks(records: Sequence[CheckRecord]) -> dict[str, CheckRecord]:
    """The same check made again for another segment (ids ``ltb_1``, ``ltb_2``...: same check, same
    clause): ``id -> the record of the family shown in full`` (the highest utilisation), for every
    other member of the family."""
    fam: dict[tuple[str, str], list[CheckRecord]] = {}
    for r in records:
        if r.checked and _SEGMENT.search(r.id):
            fam.setdefault((_SEGMENT.sub("", r.id), r.clause), []).append(r)
    out: dict[str, CheckRecord] = {}
    for rs in fam.values():
        if len(rs) > 1:
            g = max(rs, key=lambda r: r.utilisation)
            out.update({r.id: g for r in rs if r is not g})
    return out


#: a prose line of a working at least this long (characters), printed word for word by an earlier check of
#: the same part, is referred to that check (an existing member's combination, reaction and eccentricity)
PROSE_REFER_MIN = 200


def refer_repeated_prose(records: Sequence[CheckRecord]) -> list[CheckRecord]:
    """Checks shown in full, in order: a long prose line of a working that an earlier one of them printed word
    for word is referred to it by title, keeping the forces it ends with (the text after its last colon,
    when short). Formulas are never referred; demands, resistances and ids are unchanged."""
    import dataclasses

    first: dict[str, str] = {}
    out = []
    for r in records:
        steps = list(r.latex)
        for i, step in enumerate(steps):
            t = step.strip()
            if len(t) < PROSE_REFER_MIN or t.startswith(("$$", "\\[", "\\begin{")):
                continue
            if t in first:
                tail = t.rsplit(": ", 1)[1] if ": " in t else ""
                steps[i] = (f"Combination, actions and basis as stated for {first[t]} above"
                            + (f": {tail}" if tail and len(tail) <= 120 else "."))
            else:
                first[t] = r.title
        out.append(dataclasses.replace(r, latex=tuple(steps)) if steps != list(r.latex) else r)
    return out


def show_part_checks(records: Sequence[CheckRecord], rules_title: str) -> None:
    """Strength checks in full (rendered working); the same check at further segments as one table
    referring to the governing segment's working; then the detailing rules of the part as one table."""
    recs = list(records)
    strength = [r for r in recs if not is_detailing_rule(r)]
    again = repeated_checks(strength)
    show_checks(refer_repeated_prose([r for r in strength if r.id not in again]))
    governing = {g.id: g for g in again.values()}
    for g in governing.values():
        same = [r for r in strength if r.id in again and again[r.id].id == g.id]
        show_rules(same, f"{g.title.split(',')[0]}: further segments (working as for {g.title})",
                   note="Each row is the check above made for that segment with its own moments, length and "
                        "critical moment; the working is the same.")
    show_rules([r for r in recs if is_detailing_rule(r)], rules_title)


# ======================================================================== inputs
def job_tables(job: Any) -> list[TableOutput]:
    """Tables of the job's inputs: beam, loads, splices, supports (values as the job holds them)."""
    b = job.beam
    restr = ("continuous: top flange held along the whole span" if b.continuous_restraint else
             ", ".join(f"{x / 1000:g}" for x in b.restraints) or "none (fork supports at the ends only)")
    rows = [
        ["Span (bearing centres)", f"{b.span / 1000:g}", "m"],
        ["Steel grade", b.grade, ""],
        ["Section", b.section if not b.is_auto else f"lightest of {', '.join(b.families)}", ""],
        ["Headroom limit on depth", "-" if b.max_depth is None else f"{b.max_depth:g}", "mm"],
        ["Stiff bearing length at each support", "none (hangs on end connections)" if b.bearing_length is None
         else f"{b.bearing_length:g}", "" if b.bearing_length is None else "mm"],
        ["Lateral-torsional restraints at", restr, "m"],
        ["Load level", b.load_level, ""],
        ["Deflection limit, variable actions", f"span / {b.deflection_limit:g}", ""],
        ["Deflection limit, total", "-" if b.total_deflection_limit is None else
         f"span / {b.total_deflection_limit:g}", ""],
        ["ULS combination rule", "Eq. 6.10" if b.combination == "6.10" else "worse of Eq. 6.10a and 6.10b", ""],
        ["Smallest natural frequency of a floor beam", f"{b.min_frequency:g}", "Hz"],
        ["Imposed loads of several categories", "one variable action (EN 1991-1-1 3.3.1(2)P)"
         if b.imposed == "single" else "separate actions, each leading in turn", ""],
        ["National Annex", job.na.name, ""],
    ]
    beam = TableOutput(["Item", "Value", "Unit"], rows, title="Beam", align="lll")
    lrows = []
    for ld in job.loads:
        cat = ld.category or "-"
        if isinstance(ld, UDL):
            extent = "full span" if ld.x_start == 0.0 and ld.x_end is None else \
                f"{ld.x_start / 1000:g} to {(ld.x_end if ld.x_end is not None else job.beam.span) / 1000:g} m"
            if ld.applied_to != "flange":     # a line load at a level of its own (else the beam's load level)
                extent += f", at the {ld.applied_to}"
            lrows.append([ld.name, ld.action, cat, "line load", f"{ld.w:g}", _u("kN/m"), extent])
        else:
            on = "the flange" if ld.applied_to == "flange" else f"the {ld.applied_to}"
            how = (", through a web connection" if ld.applied_to == "web"
                   else (f", on {on}, s_s = {ld.bearing_length:g} mm" if ld.bearing_length else f", on {on}"))
            lrows.append([ld.name, ld.action, cat, "point load", f"{ld.P / 1000:g}", _u("kN"),
                          f"at {ld.x / 1000:g} m{how}"])
    loads = TableOutput(["Load", "Action", "Cat.", "Type", "Value", "Unit", "Where"], lrows,
                        title="Characteristic loads (beam self-weight added by the design)", align="lllrrll")
    out = [beam, loads]
    if job.splices is not None and not isinstance(job.splices, dict):
        s = job.splices
        srows = []
        if s.positions:
            srows.append(["Splice positions", ", ".join(f"{x / 1000:g} m" for x in s.positions)])
        if s.pieces:
            srows.append(["Number of pieces", str(s.pieces)])
        if s.max_piece_length:
            srows.append(["Longest piece allowed (access)", f"{s.max_piece_length / 1000:g} m"])
        if s.max_piece_mass:
            srows.append(["Heaviest piece allowed (access)", f"{s.max_piece_mass:g} kg"])
        srows += [["Bolts", s.bolts], ["Category (EN 1993-1-8, 3.4.1)", s.category],
                  ["Flange cover plates", s.flange_plates], ["Plate grade", s.plate_grade],
                  ["Clearance to supports, point loads, restraints", f"{s.clearance:g} mm"],
                  ["Gap between beam ends", f"{s.gap:g} mm"],
                  ["Minimum design moment", f"{s.min_design_moment:g} x Mc,Rd of the beam"]]
        if s.category in ("B", "C"):
            srows.append(["Slip surface class", s.friction_class])
        out.append(TableOutput(["Splice option", "Value"], srows, title="Splices", align="ll"))
    specs = [spec for spec in job.supports if not isinstance(spec, dict)]
    if specs:
        # one column per support: the ends read side by side
        items = ["End", "Connection", "Bolts", "Plate", "Existing member",
                 "Existing member h x b x tw x tf x r", "Face connected to", "Existing steel", "Tying force",
                 "Existing member's own loads"]
        if any(spec.notched for spec in specs):
            items.append("Top notch depth x length")
        cols = []
        for spec in specs:
            m = spec.existing_member
            cols.append([f"{spec.at} ({'A' if spec.at == 'start' else 'B'})", spec.connection,
                         f"{spec.bolt_size} {spec.bolt_class}",
                         (f"{spec.plate_t:g} mm " if spec.plate_t else "thickness chosen, ") + spec.plate_grade,
                         getattr(m, "designation", str(m)), f"{m.h:g} x {m.b:g} x {m.tw:g} x {m.tf:g} x {m.r:g} mm",
                         spec.existing_face, _steel_text(spec.existing_steel),
                         f"{spec.tying_force / 1000:g} kN" if spec.tying_given else
                         f"from the beam's loads, consequence class {spec.consequence_class} (at least 75 kN)",
                         _loads_text(spec.existing_loads)]
                        + ([f"{spec.notch_depth:g} x {spec.notch_length:g} mm" if spec.notched else "-"]
                           if len(items) > 10 else []))
        rows = [[item, *(c[i] for c in cols)] for i, item in enumerate(items)]
        out.append(TableOutput(["Support item", *(f"support[{spec.index}]" for spec in specs)], rows,
                               title="End connections (job [[support]] tables)", align="l" * (1 + len(specs))))
    return out


def _steel_text(value: Any) -> str:
    """The existing steel as the job gave it: a text, or coupon tests in words."""
    if isinstance(value, str):
        return value
    n = getattr(value, "samples", None)
    return (f"coupon tests ({n} results, EN 1990 Annex D, method '{getattr(value, 'method', '')}')"
            if n is not None else str(value))


def _loads_text(loads: Any) -> str:
    """One line on the existing member's own loads, or what is missing."""
    if loads is None:
        return "not given: the existing member is NOT CHECKED as a member"
    if getattr(loads, "kind", "") == "column":
        return (f"column, length {loads.L_y / 1e3:g} m (y) / {loads.L_z / 1e3:g} m (z), N = "
                f"{loads.axial.permanent / 1e3:g} kN permanent + {loads.axial.imposed / 1e3:g} kN imposed")
    return (f"beam, span {loads.span / 1e3:g} m, new beam at {loads.at / 1e3:g} m, "
            f"{loads.udl.permanent:g} + {loads.udl.imposed:g} kN/m, {len(loads.points)} point load(s)")


def show_inputs(job: Any) -> None:
    """Publish the canonical job inputs once (JOB_MIME, for the sign-off digest) with the input tables."""
    tables = job_tables(job)
    first = tables[0]
    bundle = first._repr_mimebundle_()
    bundle[JOB_MIME] = job.to_canonical_dict()
    publish(_Bundle(bundle))
    for t in tables[1:]:
        publish(t)
    p = job.project
    items = [f"{k.replace('_', ' ')} {getattr(p, k)}" for k in
             ("number", "title", "client", "location", "prepared_by", "checked_by", "date", "revision")
             if getattr(p, k)]
    if items:   # as on the cover: one line, not a table
        show_text("**Project (from the job file):** " + "; ".join(items) + ".")
    if job.notes:
        show_list(job.notes, "Notes on the job file")


def show_joint_inputs(result: Any) -> None:
    """Inputs of a one-joint package: publishes the canonical inputs once (JOB_MIME), then the tables."""
    inp = result.inputs
    rows = [[k.replace("_", " "), str(v)] for k, v in inp.items() if not isinstance(v, dict) and k != "template"]
    table = TableOutput(["Input", "Value"], rows, title="Design data", align="ll")
    bundle = table._repr_mimebundle_()
    bundle[JOB_MIME] = inp
    publish(_Bundle(bundle))
    for key in ("splices", "support"):
        sub = inp.get(key)
        if isinstance(sub, dict) and sub:
            show_table(["Option", "Value"], [[k, _flat(v)] for k, v in sub.items()],
                       title=f"[{key}] options as typed", align="ll")
    show_section(result.section, result.grade)


def _flat(v: Any) -> str:
    if isinstance(v, dict):
        return ", ".join(f"{k} = {_flat(x)}" for k, x in v.items())
    if isinstance(v, (list, tuple)):
        return ", ".join(_flat(x) for x in v)
    return str(v)


# ======================================================================== actions, analysis
def show_actions(result: CalcResult) -> None:
    """Characteristic loads with the self-weight, every ULS combination and the governing one rendered."""
    from ..actions import render_line_load
    from ..core.record import Calc

    d = result.design
    an = d.analysis
    rows = []
    for ld in an.loads:
        if isinstance(ld, UDL):
            ext = "full span" if ld.is_full(an.span_mm) else \
                f"{ld.x_start / 1000:g} to {(ld.x_end or an.span_mm) / 1000:g} m"
            rows.append([ld.name, ld.action + (f" ({ld.category})" if ld.category else ""), f"{ld.w:.2f}",
                         _u("kN/m"), ext])
        elif isinstance(ld, PointLoad):
            rows.append([ld.name, ld.action + (f" ({ld.category})" if ld.category else ""), f"{ld.P / 1000:.2f}",
                         _u("kN"), f"at {ld.x / 1000:g} m"])
    show_table(["Load", "Action", "Value", "Unit", "Where"], rows, align="llrll",
               title=f"Characteristic actions on the beam ({d.section.designation}, self-weight "
                     f"{d.section.mass_nominal:g} kg/m)")
    crow = []
    for i, (c, b) in enumerate(an.uls):
        M, V = b.M_max(), b.V_max()
        gov = ", ".join(t for t, j in (("M", an.governing_M), ("V", an.governing_V)) if i == j) or "-"
        crow.append([f"C{i + 1}", c.name, f"{abs(M.value) / 1e6:.1f}", f"{abs(V.value) / 1e3:.1f}", gov])
    show_table(["No.", "Combination", r"$\max M_{Ed}\ (\mathrm{kN\,m})$", r"$\max V_{Ed}\ (\mathrm{kN})$",
                "Governs"], crow, align="llrrl", title="ULS combinations (EN 1990:2002, 6.4.3.2 with the UK NA)",
               notes="Every variable action leads in turn; the beam self-weight is a permanent action. "
                     + ("Imposed loads of several categories are one variable action (EN 1991-1-1 3.3.1(2)P): "
                        "leading, every part at gamma_Q; accompanying, each part at its own category's psi."
                        if result.job.beam.imposed == "single" else
                        "Imposed loads of each category are separate actions (imposed = \"separate\"), "
                        "each leading in turn."))
    show_table(["No.", "Factors (ULS)"], [[f"C{i + 1}", c.expression] for i, (c, _) in enumerate(an.uls)],
               align="ll", title="Factors of each ULS combination")
    sls = list(an.sls_variable)
    if result.job.beam.total_deflection_limit is not None:
        sls += list(an.sls_characteristic)
    if sls:
        show_table(["No.", "Combination", "Factors (SLS)"],
                   [[f"D{i + 1}", c.name, c.expression] for i, (c, _) in enumerate(sls)], align="lll",
                   title="SLS combinations for deflection (EN 1990:2002, 6.5.3)")
    gov, _ = an.uls[an.governing_M]
    # the line load the analysis applied: the governing combination's own factored full-span UDLs
    used = sum(ld.w for ld in gov.loads if isinstance(ld, UDL) and ld.is_full(an.span_mm))
    calc = Calc(render=True)
    shown = render_line_load(gov, an.loads, an.span_mm, result.job.na, result.job.psi, calc,
                             result.job.beam.imposed)
    if abs(shown - used) <= 1e-6 * max(1.0, abs(used)):
        show_steps(calc.latex, intro=f"Governing combination for bending, {gov.name} ({result.job.beam.psi_table} "
                                     "psi factors, as the analysis), applied to the full-span line loads "
                                     "(partial-length and point loads are factored the same way):")
    else:
        show_text(f"Governing combination for bending, {gov.name}: {gov.expression}; full-span line load used by "
                  f"the analysis {used:.2f} kN/m (the sum of the combination's factored full-span loads).")


def show_analysis(result: CalcResult) -> None:
    """Diagrams of the governing combination with restraints and splices marked, and the reactions."""
    d = result.design
    an = d.analysis
    xs = [s.x_mm for s in result.splices] or (list(result.positions.positions) if result.positions else [])
    from ..analysis import SimpleBeam, beam_diagram_data

    c, b = an.uls[an.governing_M]
    # one figure: loads, V and M of the governing ULS combination, and the deflection of the
    # variable-action SLS combination the deflection check uses (with I_y of the section)
    sls = max(an.sls_variable, key=lambda cb: cb[1].w_max().abs) if an.sls_variable else None
    data = beam_diagram_data(SimpleBeam(an.span_mm, c.loads), splices_mm=xs or None,
                             restraints_mm=an.restraints_mm, title=f"{an.section}: {c.name}",
                             deflection_of=sls[1] if sls else None, deflection_label="SLS" if sls else "")
    caption = (f"Loads, shear force and bending moment for {c.name} (design values); restraints R, "
               "splices S and supports A, B marked.")
    if sls:
        caption += (f" Bottom panel: deflection under {sls[0].name} (characteristic variable actions) with "
                     f"the second moment of area I_y of {d.section.designation}.")
    # the splices are designed for patterned imposed load (on parts of the span), which gives more shear at a
    # point than the full-span load drawn: say so where a reader compares the two
    higher = [f"S{sp.index} {abs(sp.V_Ed) / 1e3:.1f} kN (diagram {abs(float(b.V(sp.x_mm))) / 1e3:.1f} kN)"
              for sp in result.splices if abs(sp.V_Ed) > abs(float(b.V(sp.x_mm))) + 1.0]
    if higher:
        caption += (" The splice design shears exceed the diagram's values at the splices (" + ", ".join(higher)
                    + "): they are for imposed load patterned on parts of the span, which gives more shear there "
                    "than load on the whole span.")
    show_drawing(data, caption)
    rows = []
    for (cc, bb) in an.uls:
        rows.append([cc.name, f"{bb.R_A / 1e3:.1f}", f"{bb.R_B / 1e3:.1f}", f"{abs(bb.M_max().value) / 1e6:.1f}",
                     _m(bb.M_max().x_mm)])
    show_table(["Combination", r"$R_A\ (\mathrm{kN})$", r"$R_B\ (\mathrm{kN})$", r"$\max M\ (\mathrm{kN\,m})$",
                r"$x\ (\mathrm{m})$"], rows, align="lrrrr",
               title="Reactions and maximum moment, every ULS combination")


# ======================================================================== member
def show_member(result: CalcResult) -> None:
    """The chosen section, the section search and every member check."""
    d = result.design
    show_section(d.section, result.job.beam.grade)
    show_text(("**Result.** " if d.ok else "**Result (FAILS).** ") + d.message + ".")
    if len(d.candidates) > 1:
        from ..design.beam import short_title

        lighter = list(d.lighter_failures)[-6:]
        rows = [[c.designation, f"{c.mass_kg_per_m:g}", "fails", short_title(c.title, c.designation),
                 fmt_utilisation(c.utilisation)] for c in lighter]
        rows += [[p.designation, f"{p.mass_kg_per_m:g}", "passed over", f"joints: see note {k}", "-"]
                 for k, p in enumerate(d.passed_over, start=1)]
        rows.append([d.section.designation, f"{d.section.mass_nominal:g}", "chosen" if d.ok else "fails",
                     (short_title(d.governing_record.title, d.section.designation) if d.governing_record else "-"),
                     fmt_utilisation(d.governing_record.utilisation) if d.governing_record else "-"])
        rows += [[c.designation, f"{c.mass_kg_per_m:g}", "passes", short_title(c.title, c.designation),
                  fmt_utilisation(c.utilisation)] for c in d.alternatives]
        show_table(["Section", "kg/m", "Verdict", "Governing check", "Util."], rows, align="lrlll",
                   title="Section search (the heaviest lighter sections tried, the chosen one, the next passing)",
                   notes="Each section with its worst check. A section stopped by the first checks (bending, "
                         "shear, deflection, floor frequency) shows the worst of those; one that reached the "
                         "lateral-torsional buckling stage was checked in full."
                         + "".join(f" ({k}) {p.designation} passes the member checks but is passed over: "
                                   f"{p.reason}." for k, p in enumerate(d.passed_over, start=1)))
    show_part_checks(result.member_records, "Member: detailing rules")


# ======================================================================== splices
def plate_end_clearance_note(result: CalcResult) -> str:
    """The clearance checks' datum stated, and what it leaves at the cover-plate ends (the distances are
    :func:`design.splice_positions.plate_end_clearances`'; this only words them)."""
    from ..design.splice_positions import HANGER_WIDTH_MM, plate_end_clearances

    ends = plate_end_clearances(result)
    if not ends:
        return ""
    parts = "; ".join(f"S{k}: {d:.0f} mm, plates {h:.0f} mm each side, plate ends {e:.0f} mm" for k, d, h, e in ends)
    worst = min(e for *_, e in ends)
    reach = HANGER_WIDTH_MM / 2
    return ("**Datum of the clearances:** the joint line, to the set-out line of the nearest support, load or "
            f"restraint ({parts}). A fitting there must reach less than the plate-end distance towards the splice: "
            f"a joist hanger up to {HANGER_WIDTH_MM:g} mm wide reaches {reach:g} mm (common practice, from memory), "
            + (f"less than the {worst:.0f} mm available." if worst >= reach else
               f"more than {worst:.0f} mm: confirm its width on the drawings or move the splice."))


def show_splice_positions(result: CalcResult) -> None:
    """Where the beam is cut: positions, pieces with their mass build-up, the comparison with equal cutting,
    position checks, and the slip deflection of category A splices."""
    from ..design.splice_positions import MASS_CONVENTION, PATTERN_NOTE
    from ..joints.bolts import ASSEMBLY_CONVENTION
    pos = result.positions
    if pos is None:
        show_text("No `[splices]` table in the job: the beam is delivered in one piece and has no splice.")
        return
    plan = getattr(result, "splice_plan", None)
    kit = (f"{plan.kit_plates_kg:.1f} kg of cover plates + {plan.kit_bolts_kg:.1f} kg of bolt assemblies = "
           f"{plan.kit_mass_kg:.1f} kg (the heaviest splice)" if plan is not None
           else f"{result.splice_kit_mass_kg:.1f} kg")
    show_text(f"**Method.** {pos.method}. Heaviest splice kit, loose and fitted in place after the lift (not in "
              f"the piece masses): {kit}; shortest piece "
              f"{result.splice_zone_mm:g} mm; {result.splice_rounds} round(s) of positions and splice layout. "
              f"Splice forces from the ULS envelopes with the {PATTERN_NOTE}.")
    if pos.splices:
        rows = [[f"S{k}", f"{s.x / 1000:.3f}", f"{s.M_Ed / 1e6:.1f}", f"{abs(s.V_Ed) / 1e3:.1f}",
                 f"{s.N_Ed / 1e3:.1f}", f"{s.demand:.3f}", s.combination]
                for k, s in enumerate(pos.splices, start=1)]
        show_table(["Splice", r"$x\ (\mathrm{m})$", r"$M_{Ed}\ (\mathrm{kN\,m})$", r"$V_{Ed}\ (\mathrm{kN})$",
                    r"$N_{Ed}\ (\mathrm{kN})$", "Demand", "Combination"],
                   rows, align="lrrrrrl", title="Splice positions and design forces",
                   notes="Demand = |M|/M_c,Rd + |V|/V_c,Rd of the beam at the splice (the quantity minimised).")
    cuts = [0.0, *pos.positions, result.job.beam.span]
    prow = [[str(p.index), f"{cuts[i] / 1000:.3f}-{cuts[i + 1] / 1000:.3f}", f"{p.length_mm / 1000:.3f}",
             f"{p.steel_kg:.1f}", f"{p.end_kg:.1f}", f"{p.margin_kg:.1f}", f"{p.total_kg:.1f}"]
            for i, p in enumerate(pos.piece_masses)]
    show_table(["Piece", "x (m)", "L (m)", "Steel", "End plate (welded)",
                f"Margin {pos.mass_margin * 100:g} %", "Total"], prow,
               align="llrrrrr", title="Pieces as lifted (bare): length and mass build-up (kg)",
               notes=MASS_CONVENTION + ".")
    if plan is not None and plan.kits:
        show_list([f"S{k}: {kt.describe()}" for k, kt in enumerate(plan.kits, start=1)],
                  title="Splice kits, loose items fitted in place (plates and bolt assemblies, from the product "
                        "standards' dimensions; bolt sets: " + ASSEMBLY_CONVENTION + ")")
    if pos.splices:
        eq = ", ".join(f"{x / 1000:.3f}" for x in pos.equal_positions)
        chosen = ", ".join(f"{x / 1000:.3f}" for x in pos.positions)
        rows = [["Chosen positions", chosen, f"{pos.worst_demand:.3f}", "yes"],
                ["Equal cutting", eq, f"{pos.equal_worst_demand:.3f}",
                 "yes" if pos.equal_feasible else "no (inside a clearance zone)"]]
        show_table(["Cutting", "Positions (m)", "Worst demand", "Clear of supports, loads, restraints"], rows,
                   align="llrl", title="Comparison with equal cutting")
    show_part_checks(result.position_records, "Access limits and clearances")
    clear_note = plate_end_clearance_note(result)
    if clear_note:
        show_text(clear_note)
    slip = getattr(result, "slip_checks", ())
    if slip:
        show_text("**Slip of the category A splices.** Bolts in clearance holes slip before they bear: each "
                  "splice kinks by theta = 2 s / z and the kinks add to the elastic deflection (virtual work on "
                  "the simply supported span). The SLS deflection checks are repeated with them.")
        show_checks(slip)


def splice_layout_rows(part: Any, plate_grade: str = "") -> list[list[str]]:
    """Layout of one designed splice as table rows (from the splice design's own data)."""
    d = part.design
    g, lay = d.geometry, d.layout
    f, w = lay.flange, lay.web
    rows = [
        ["Bolts", f"{lay.bolt_size} {lay.bolt_class}, {d.n_bolts} in all"],
        ["Flange bolts, each side of the joint", f"{f.rows} rows x {f.columns} lines, pitch {g.p1_f:g}, "
                                                  f"gauge {g.g_f:g}" + (f", outer gauge {g.p2o_f:g}" if g.p2o_f else "")
                                                  + f", end distance {g.e1_f:g} mm"],
        ["Outer flange plates (2)", f"{g.b_po:g} x {g.t_po:g} x {g.L_fp:g} mm {plate_grade}".rstrip()],
    ]
    if g.t_pi > 0:
        rows.append(["Inner flange plates (4)", f"{g.b_pi:g} x {g.t_pi:g} x {g.L_fp:g} mm {plate_grade}".rstrip()])
    rows += [
        ["Web bolts, each side of the joint", f"{w.rows} rows x {w.columns} columns, pitch {g.p_w:g}"
                                               + (f", gauge {g.g_w:g}" if w.columns > 1 else "")
                                               + f", end distance {g.e1_w:g}, edge {g.e_v:g} mm"],
        ["Web plates (2)", f"{g.h_wp:g} x {g.t_wp:g} x {g.L_wp:g} mm {plate_grade}".rstrip()],
        ["Plate mass of the splice", f"{d.plate_mass:.1f} kg"],
        ["Stated cost (per bolt + per kg)", f"{d.cost:.1f}"],
    ]
    return rows


def _splice_forces_table(part: Any) -> None:
    fo = part.design.forces
    rows = [["Design moment (governing combination)", "$M_{Ed}$", f"{fo.M_Ed / 1e6:.1f}", _u("kNm")],
            ["Shear force", "$V_{Ed}$", f"{abs(fo.V_Ed) / 1e3:.1f}", _u("kN")],
            ["Axial force (tension +)", "$N_{Ed}$", f"{fo.N_Ed / 1e3:.1f}", _u("kN")],
            ["Splice design moment (joint line)", "$M_{j,Ed}$", f"{fo.M_j_Ed / 1e6:.1f}", _u("kNm")],
            [f"Moment at the outermost flange row, $a_{{f}}$ = {fo.a_f:g} mm from the joint", "$M_{f,Ed}$",
             f"{fo.M_f_Ed / 1e6:.1f}", _u("kNm")],
            ["Flange force (beam flange and flange bolts)", "$F_{f,Ed}$", f"{fo.F_f_Ed / 1e3:.1f}", _u("kN")],
            [f"Web share of the moment at the outermost web column, $a_{{w}}$ = {fo.a_w:g} mm from the joint",
             "$M_{w,Ed}$", f"{fo.M_w_Ed / 1e6:.1f}", _u("kNm")],
            ["Moment on the web bolt group", "$M_{g,Ed}$", f"{fo.M_g_Ed / 1e6:.2f}", _u("kNm")],
            ["Largest web bolt force", "$F_{r,Ed}$", f"{fo.F_web_max / 1e3:.1f}", _u("kN")]]
    if part.M_Ed_ser is not None:
        rows.append(["Characteristic moment (slip, category B)", "$M_{Ed,ser}$", f"{part.M_Ed_ser / 1e6:.1f}",
                     _u("kNm")])
    show_table(["Force", "Symbol", "Value", "Unit"], rows, align="llrl",
               title=f"Forces at splice {part.label} ({part.combination})")


def _splice_heading(part: Any) -> None:
    if math.isfinite(part.x_mm):
        show_heading(f"Splice {part.label} at x = {part.x_mm / 1000:.3f} m")
    else:
        show_heading("Splice design" + (f": {part.combination}" if part.combination else ""))


def show_splice(result: CalcResult, part: Any, like: Any = None, groups: tuple[str, ...] = ()) -> None:
    """One splice: heading, forces (rendered), layout, drawing, alternatives, strength checks in full,
    detailing rules as one table. ``groups`` ("flange", "web") laid out as in the splice ``like`` shown
    before: their strength checks are rows referring to its working."""
    d = part.design
    _splice_heading(part)
    _splice_forces_table(part)
    show_steps(d.force_latex, intro="Share of the forces between flanges and web, and the web bolt group:")
    rows = splice_layout_rows(part, getattr(part.spec, "plate_grade", ""))
    show_table(["Item", "Layout"], rows, align="ll", title=f"Layout of splice {part.label}")
    show_drawing(d.drawing_data(), f"Splice {part.label}: elevation and plan of the top flange, to scale, dimensions in mm.")
    if d.notes and like is not None and list(d.notes) == list(like.design.notes):
        show_text(f"**Notes**: as for splice {like.label}.")
    elif d.notes:
        show_list(d.notes, "Notes")
    if d.alternatives:
        rows = [[a.layout.bolt_size + " " + a.layout.bolt_class, str(a.n_bolts), f"{a.plate_mass:.1f}",
                 f"{a.cost:.1f}", f"{a.max_utilisation:.2f}"] for a in d.alternatives]
        show_table(["Bolts", "No. of bolts", "Plates (kg)", "Cost", "Max util."], rows, align="lrrrr",
                   title="Alternatives considered (also passing)")
    records = list(part.records)
    if like is not None and groups:
        # a group (flange or web) laid out as in an earlier splice: its strength checks as rows, the
        # working referred to that splice; the other group's checks in full
        referred = [r for r in records if _splice_group(r) in groups and not is_detailing_rule(r)
                    and same_working(r, like)]
        words = " and ".join(groups)
        rest = "web" if groups == ("flange",) else "flange"
        verb = "are" if len(groups) > 1 else "is"
        show_text(f"**The {words} of splice {part.label} {verb} laid out as in splice {like.label}** (the same "
                  f"bolts, rows, pitches and plate sizes; plate thickness as tabled above). Its {words} checks "
                  f"are made for the forces and plates of {part.label} with the formulas shown in full for "
                  f"{like.label}; the {rest} checks follow in full.")
        show_rules(referred, f"Splice {part.label}: {words} checks (working as for {like.label})",
                   note=f"Each row is the check of splice {like.label} of the same title, made with the forces and "
                        f"plates of {part.label}; the formulas are those shown there.")
        records = [r for r in records if r not in referred]
    ties = [r for r in records if r.has("accidental")]
    show_part_checks([r for r in records if r not in ties], f"Splice {part.label}: detailing rules")
    show_tie_rows(part, ties)


def show_tie_rows(part: Any, ties: Sequence[CheckRecord]) -> None:
    """The splice under the accidental tie force (``joints.splice.tying``): one table of rows, the
    formulas named in the note (those of the splice's bolt shear and plate tension checks shown in
    full, with gamma_Mu), the tie force and its shares from the calculation's own values."""
    if not ties:
        return
    first = next((r for r in ties if r.checked and "N_f_Ed" in r.values), None)
    if first is None:
        show_rules(ties, f"Splice {part.label}: tie force (accidental)")
        return
    T, Nf, Nw = (first.values[k][0] for k in ("T_Ed", "N_f_Ed", "N_w_Ed"))
    show_rules(ties, f"Splice {part.label}: the tie force through the splice (accidental)",
               note=(f"Tie force T = {T:.1f} kN (the end connections' tie force), alone, shared by area: "
                     f"per flange T b tf / A = {Nf:.1f} kN, in the web the rest, {Nw:.1f} kN. Bolt shear by "
                     "EN 1993-1-8 Table 3.4 and plate tension by EN 1993-1-1 6.2.3, the formulas of this "
                     "splice's bolt shear and plate tension checks, with the partial factor for tying "
                     "1.1 (UK NA to BS EN 1993-1-8, from memory) in place of 1.25 for bolts."))


def show_splice_as(result: CalcResult, part: Any, first: Any) -> None:
    """A splice arranged like ``first`` (same bolts, rows, pitches and plate sizes; plate thickness may
    differ): its own forces and layout, every check as one table row, the working referred to ``first``."""
    _splice_heading(part)
    _splice_forces_table(part)
    grade = getattr(part.spec, "plate_grade", "")
    mine, theirs = splice_layout_rows(part, grade), splice_layout_rows(first, grade)
    diff = [f"{a[0].lower()}: {a[1]} ({first.label}: {b[1]})" for a, b in zip(mine[:-2], theirs[:-2]) if a != b]
    show_text(f"**Arranged as splice {first.label}**: the same bolts, rows, pitches and plate sizes"
              + (", except " + "; ".join(diff) if diff else "") + f". Every check below is made for the forces "
              f"and plates of {part.label} with the formulas shown in full for {first.label}.")
    if diff:
        show_table(["Item", "Layout"], mine, align="ll", title=f"Layout of splice {part.label}")
    if part.design.notes:
        show_list(part.design.notes, "Notes")
    own = [r for r in part.records if not same_working(r, first)]
    show_rules([r for r in part.records if r not in own], f"Splice {part.label}: every check (working as for "
               f"{first.label})")
    if own:
        show_text(f"The checks below take a different path in {part.label} than in {first.label} (e.g. buckling "
                  "that the first did not need, or a check it does not have): their working in full.")
        show_part_checks(own, f"Splice {part.label}: detailing rules")


def same_working(rec: CheckRecord, like: Any) -> bool:
    """True when the splice ``like`` has the check of ``rec`` (same id after the ``S<k>.`` prefix) worked
    with the same formulas, so a row may refer to its working: the same number of rendered steps with the
    same left-hand sides. A check that took another path (a buckling branch, a reduced section) or that
    ``like`` does not have is shown in full (checker: a resistance must never be printed without its working)."""
    suffix = rec.id.split(".", 1)[-1]
    other = next((r for r in like.records if r.id.split(".", 1)[-1] == suffix), None)
    if other is None:
        return False
    lhs = re.compile(r"^\s*\\begin\{aligned\}\s*([^&]*)&=", re.M)

    def shape(r):
        return [m.group(1).strip() for t in r.latex for m in lhs.finditer(t)], len(r.latex)
    return shape(rec) == shape(other)


_THICKNESS = re.compile(r"^(\d+(?:\.\d+)?) x \d+(?:\.\d+)? x ")


def same_splice_layout(a: Any, b: Any) -> bool:
    """True when two splices have the same bolts, rows, pitches and plate sizes (thickness aside)."""
    pa = getattr(a.spec, "plate_grade", "")
    ra, rb = splice_layout_rows(a, pa)[:-2], splice_layout_rows(b, pa)[:-2]
    return [[k, _THICKNESS.sub(r"\1 x t x ", v)] for k, v in ra] == [[k, _THICKNESS.sub(r"\1 x t x ", v)] for k, v in rb]


#: layout rows of each bolt group of a splice (``splice_layout_rows`` item names)
_GROUP_ROWS = {"flange": ("Flange bolts", "Outer flange plates", "Inner flange plates"),
               "web": ("Web bolts", "Web plates")}


def _splice_group(rec: CheckRecord) -> str:
    """The bolt group a splice record belongs to ("flange", "web") from its tags, or ""."""
    return next((g for g in _GROUP_ROWS if rec.has(g)), "")


def same_group_layout(a: Any, b: Any, group: str) -> bool:
    """True when one bolt group ("flange" or "web") of two splices has the same bolts, rows, pitches and
    plate sizes (thickness aside)."""
    def key(part: Any) -> list[Any]:
        lay = part.design.layout
        return [lay.bolt_size, lay.bolt_class] + [[k, _THICKNESS.sub(r"\1 x t x ", v)]
                                                  for k, v in splice_layout_rows(part)
                                                  if k.startswith(_GROUP_ROWS[group])]
    return key(a) == key(b)


def show_splices(result: CalcResult) -> None:
    """Every splice of the beam, one section each; a splice laid out like an earlier one refers to it,
    one whose flange (or web) alone is laid out like an earlier one's refers to it for those checks."""
    if not result.splices:
        show_text("No splice: the beam is delivered in one piece.")
        return
    shown: list[Any] = []
    for part in result.splices:
        first = next((f for f in shown if same_splice_layout(f, part)), None)
        if first is not None:
            show_splice_as(result, part, first)
            continue
        like, groups = None, ()
        for f in shown:
            groups = tuple(g for g in _GROUP_ROWS if same_group_layout(f, part, g))
            if groups:
                like = f
                break
        show_splice(result, part, like, groups)
        shown.append(part)


# ======================================================================== connections, existing
def _connection_head(part: Any) -> None:
    d = part.design
    spec = part.spec
    show_heading(f"End connection at support {part.end} ({spec.connection.replace('_', ' ')})")
    rows = [["Design reaction (largest ULS)", f"{part.V_Ed / 1e3:.1f} kN", part.combination],
            # a table cell is text: the basis's code symbols as plain words there (G_k -> Gk), never a raw _
            ["Tying force (accidental, structural integrity)", f"{d.tie / 1e3:.1f} kN",
             re.sub(r"\b([A-Za-z]{1,2}|psi|gamma)_([A-Za-z0-9]+)\b", r"\1\2", d.tie_basis)],
            ["Existing member", getattr(spec.existing_member, "designation", ""), spec.existing_face]]
    if d.spec.notch_text != "-" or d.spec.notch_basis:
        rows.append(["Notches of the new beam (depth x length)", d.spec.notch_text,
                     "designed from the levels of both members" if d.spec.notch_basis else "job"])
    show_table(["Item", "Value", "Source"], rows, align="lll", title=f"Support {part.end} actions")
    desc = d.detail.describe()
    show_text(f"**Detail.** {desc[:1].upper() + desc[1:]}.\n\n{d.choice}")


def show_connection(result: CalcResult, part: Any, like: Any = None) -> None:
    """One end connection: heading, reaction, chosen detail, checks, warnings.

    ``like``: an end connection already shown with the same detail; this one's checks are then
    one table of rows with the working referred to it.
    """
    d = part.design
    _connection_head(part)
    if like is None:
        from ..joints.connections.sheet_drawing import connection_drawing_data

        view = "view on the end plate" if d.detail.kind == "end plate" else "plan section through the bolts"
        show_drawing(connection_drawing_data(d), f"End {part.end}: elevation and {view}, to the scale stated, "
                                                  "dimensions in mm.", floating=True)
        show_part_checks(part.records, f"End {part.end}: detailing rules")
    else:
        show_text(f"**Same detail as end {like.end}**: every check below is made for the reaction at "
                  f"{part.end} with the formulas shown in full for end {like.end}.")
        show_rules(part.records, f"End {part.end}: every check (working as for end {like.end})")
    if d.warnings:
        show_list(d.warnings, "Warnings")


def show_connections(result: CalcResult) -> None:
    """Every end connection (one with the same detail as an earlier one refers to it)."""
    if not result.connections:
        show_text("No `[[support]]` table in the job: the end connections are not designed in this package.")
        return
    shown: list[Any] = []
    for part in result.connections:
        like = next((c for c in shown if c.spec.connection == part.spec.connection
                     and c.design.detail.describe() == part.design.detail.describe()
                     and c.design.spec.notch_text == part.design.spec.notch_text
                     and c.spec.existing_face == part.spec.existing_face), None)
        show_connection(result, part, like)
        if like is None:
            shown.append(part)


def show_existing(result: CalcResult) -> None:
    """The existing member at each end: material and old-steel cautions, local checks, the moment the
    reaction adds, and the member check with its own loads (or the NOT CHECKED record and what is needed)."""
    if not result.connections:
        show_text("No existing member: no `[[support]]` table in the job.")
        return
    cautioned: dict[str, str] = {}     # caution text -> the support where it was printed
    for part in result.connections:
        ex = part.design.existing
        m = part.spec.existing_member
        show_heading(f"Existing member at support {part.end}: {getattr(m, 'designation', '')}", level=2)
        dims = f"{m.h:g} x {m.b:g} x {m.tw:g} x {m.tf:g} x {m.r:g}"
        rows = [["Material", ex.material.label, ""],
                ["Yield strength (at the flange thickness)", f"{ex.material.f_y:g}", _u("MPa")],
                ["Ultimate strength", f"{ex.material.f_u:g}", _u("MPa")],
                ["Dimensions h x b x tw x tf x r", dims, _u("mm")]]
        if all(hasattr(m, k) for k in ("Iy", "Iz", "It", "Iw")):
            from ..report.display import section_stability_rows
            rows.append(["Second moment, major axis $I_y$", f"{m.Iy / 1e4:.0f}", _u("cm4")])
            rows += [[f"{name} {sym}", v, _u(u)] for name, sym, v, u, _ in section_stability_rows(m)]
        if getattr(m, "taper_deg", 0.0):
            rows.append(["Flange taper (tf measured midway along the outstand)", f"{m.taper_deg:g} deg, "
                         f"{m.tf_root:.1f} to {m.tf_toe:.1f} mm", ""])
        rows += [["Face connected to", part.spec.existing_face, ""],
                 ["Moment added by the reaction", f"{ex.M_add_Nmm / 1e6:.2f}", _u("kNm")],
                 ["Eccentricity from the member axis", f"{ex.e_mm:.1f}", _u("mm")]]
        show_table(["Item", "Value", "Unit"], rows, align="lrl", title=f"Existing member at support {part.end}",
                   notes=ex.material.note)
        if ex.material.historic and ex.caution in cautioned:
            show_text(f"**Old steel**: the caution at support {cautioned[ex.caution]} applies here too.")
        elif ex.material.historic:
            show_list([ex.caution], "Old steel: cautions")
            cautioned[ex.caution] = part.end
        show_text(ex.text[0].upper() + ex.text[1:] + ("." if not ex.text.endswith(".") else ""))
        member = ex.member
        member_ids = {f"{part.end}.{r.id}" for r in member.records} if member is not None else set()
        show_part_checks([r for r in part.existing_records if r.id not in member_ids],
                         f"Existing member at {part.end}: detailing rules")
        if member is None:
            continue
        what = {"column": "column", "beam": "supporting beam"}.get(member.kind, "member")
        # a numbered part of its own (in the contents), its checks its children (13.7.1 ...; not in the contents)
        show_heading(f"Existing {what} at support {part.end} checked as a member", level=2)
        _latex_only("\\calcnestedchecks")
        if member.basis:
            show_list(member.basis, "Basis")
        if member.load_rows:
            show_table(["Load", "Action", "Characteristic value", "Where"], [list(r) for r in member.load_rows],
                       align="llrl", title=f"Loads on the existing {what} (characteristic)",
                       notes=(f"Governing combination (highest utilisation): {member.combination}; each check names its own." if member.combination else ""))
        if getattr(member, "diagram", None):
            from ..analysis import SimpleBeam, beam_diagram_data

            span, loads, restraints = member.diagram
            show_drawing(beam_diagram_data(SimpleBeam(span, loads), restraints_mm=restraints or None,
                                           title=f"Existing beam: {member.combination}"),
                         f"Existing beam at support {part.end}: loads, shear force and bending moment of "
                         f"{member.combination} (design values, its own loads and the new reaction).")
        show_part_checks([r for r in part.existing_records if r.id in member_ids],
                         f"Existing {what} at {part.end}: detailing rules")
        _latex_only("\\calcnestedchecksend")


# ======================================================================== summary, references, cautions
def _part_verdict(records: Any) -> str:
    """NOT OK when a check made fails; else NOT CHECKED when something is not checked; else OK."""
    bad, gap = count_verdicts(records)
    return "NOT OK" if bad else ("NOT CHECKED" if gap else "OK")


def parts_table(result: CalcResult) -> TableOutput:
    """The summary by part (governing check of each); its data also carries the grouping itself
    (``workflow.parts.parts_index``: part keys and record ids) for ``splicecalc compare``."""
    from .parts import job_parts, parts_index

    parts = job_parts(result)
    rows = []
    for part in parts:
        g = part.governing
        if g is None:
            continue
        # a part's verdict NOT CHECKED names what is not checked, not only its highest utilisation
        gaps = [part.short_title(r) for r in part.records if not r.checked]
        gov_text = f"{part.short_title(g)} ({g.clause or g.guidance})" + (f"; NOT CHECKED: {'; '.join(gaps)}" if gaps else "")
        rows.append([part.title, gov_text, str(len(part.records)),
                     fmt_utilisation(g.utilisation), _part_verdict(part.records)])
    table = TableOutput(["Part", "Governing check (clause)", "Checks", "Util.", "Verdict"], rows, align="llrrl",
                        title="Summary by part: the governing check of each", kind="parts")
    table.payload["parts"] = parts_index(parts)
    bad, gap = count_verdicts(result.summary_records)
    if bad or gap:
        # the sheet reserves the checker's and approver's acceptance boxes (filled by `splicecalc sign`)
        table.payload["acceptance"] = {"failing": bad, "not_checked": gap}
    return table


def show_summary(result: CalcResult) -> None:
    """The governing check of each part (member, positions, each splice, each end connection, each
    existing member), then every record of the package, highest utilisation first (each listed once)."""
    recs = result.summary_records
    gov = result.governing
    # never "all checks pass" over a NOT CHECKED record; gaps are counted apart from failures
    show_text(f"**{verdict_sentence(recs)}** "
              + (f"Governing: {gov.title} (utilisation {fmt_utilisation(gov.utilisation)}). " if gov else "")
              + result.headline + ".")
    publish(parts_table(result))
    publish(summary_output(recs, title=f"Summary of the {len(recs)} checks (highest utilisation first)"))


def show_references(result: CalcResult) -> None:
    """Clauses cited by the checks (by standard) and the standards and guidance used."""
    # one row per standard, its clauses in one wrapping cell (a clause per row took a sheet); a clause and
    # its count never break across lines (no-break spaces)
    rows = [[r.standard, "; ".join(f"{c} ({n})".replace(" ", "\u00a0") for c, n in zip(r.clauses, r.counts))
             if r.clauses else "-", str(r.checks)] for r in result.references]
    show_table(["Standard", "Clauses cited (number of checks citing each)", "Checks"], rows, align="llr",
               title="Clauses cited by the checks of this package")
    show_list([f"**{doc}**: {title}" for doc, title in result.standards],
              "Standards and guidance (the UK National Annexes apply throughout)")


def show_review(job_file: str, result: CalcResult) -> None:
    """The review comments on this package (``splicecalc review``): threads, and a margin mark at each
    commented check in the PDF; in Jupyter a collapsible list per part. Says so when there are none."""
    from ..report.display import ReviewOutput
    from ..review import review_payload

    p = review_payload(job_file, [r.to_dict() for r in result.summary_records],
                       approver=result.job.project.approved_by)
    if p is None:
        show_text("No review comments recorded for this package yet (`splicecalc review add` or "
                  "`splicecalc review import` start the register beside the job file).")
        return
    publish(ReviewOutput(p))


def show_cautions(result: CalcResult) -> None:
    """The cautions of the package (general ones, then those raised by this job)."""
    show_list(result.cautions)


# ======================================================================== form (live sessions only)
def is_live_session() -> bool:
    """True in an interactive Jupyter session, False in headless builds and plain Python."""
    if os.environ.get(HEADLESS_ENV):
        return False
    ip = sys.modules.get("IPython")
    if ip is None:
        return False
    try:
        from IPython import get_ipython

        shell = get_ipython()
    except Exception:  # pragma: no cover - IPython without a shell
        return False
    return shell is not None and getattr(shell, "kernel", None) is not None and "ipykernel" in sys.modules


def show_form(job_file: str) -> Any:
    """The job form bound to ``job_file``, only in a live Jupyter session (never in a build).

    Returns the form (or None when not shown).
    """
    if not is_live_session():
        return None
    try:
        from ..form import JobForm
    except (ImportError, AttributeError) as err:
        show_text(f"The job form is not available in this installation ({err}); edit `{job_file}` instead.")
        return None
    form = JobForm(job_file)
    publish(form)
    return form


__all__ = ["HEADLESS_ENV", "contents_depth", "figure_bundle", "is_live_session", "job_tables", "show_actions", "show_analysis",
           "show_cautions", "show_checks", "show_connection", "show_connections", "show_drawing", "show_existing",
           "show_figure", "show_form", "show_heading", "show_inputs", "show_joint_inputs", "show_list", "show_member", "show_references",
           "show_splice", "show_splice_positions", "show_splices", "show_steps", "show_summary", "show_text",
           "CHECK_MIME", "TABLE_MIME"]
