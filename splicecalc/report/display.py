"""Notebook outputs for calc sheets: one call per check keeps the templates small.

``show_check(record)`` displays a :class:`~splicecalc.core.record.CheckRecord`
as title + clause, the rendered handcalcs steps and a verdict line
("utilisation 0.73 — OK"). ``show_summary(records)`` displays all records
sorted by utilisation, ``show_table`` any small data table.

Each output carries a splicecalc MIME type with the data (JSON) that our PDF
exporter lays out, plus ``text/markdown`` for Jupyter and other exporters and
``text/plain`` for consoles. The layout therefore lives in one place, the
LaTeX template, and the notebook stays plain data.
"""

from __future__ import annotations

import math
from typing import Any, Iterable, Sequence

from ..core.record import CheckRecord, summary_order, verdict_sentence
from ..core.text import markdown_safe, safe_math

CHECK_MIME = "application/vnd.splicecalc.check+json"
TABLE_MIME = "application/vnd.splicecalc.table+json"
#: the review register's comments as the package prints them (splicecalc.review)
REVIEW_MIME = "application/vnd.splicecalc.review+json"
#: which MIME type of an output the calc package prints, first found first
DISPLAY_PRIORITY: tuple[str, ...] = (CHECK_MIME, TABLE_MIME, REVIEW_MIME, "text/latex", "application/pdf", "image/png",
                                     "image/jpeg", "text/markdown", "text/plain")

#: report unit -> LaTeX (text mode, inside $...$ via \mathrm)
UNIT_TEX = {
    "kN": r"\mathrm{kN}", "kNm": r"\mathrm{kN\,m}", "kN/m": r"\mathrm{kN/m}", "mm": r"\mathrm{mm}",
    "mm2": r"\mathrm{mm^{2}}", "mm3": r"\mathrm{mm^{3}}", "mm4": r"\mathrm{mm^{4}}", "mm6": r"\mathrm{mm^{6}}",
    "MPa": r"\mathrm{MPa}", "kg": r"\mathrm{kg}", "kg/m": r"\mathrm{kg/m}", "": "",
    "cm2": r"\mathrm{cm^{2}}", "cm3": r"\mathrm{cm^{3}}", "cm4": r"\mathrm{cm^{4}}", "cm": r"\mathrm{cm}",
    "dm6": r"\mathrm{dm^{6}}", "N": r"\mathrm{N}", "Nmm": r"\mathrm{N\,mm}", "Hz": r"\mathrm{Hz}",
}


def fmt_number(x: float | None) -> str:
    """A number as an engineer writes it: 3-4 significant figures, no exponent for usual sizes."""
    if x is None or (isinstance(x, float) and math.isnan(x)):
        return "-"
    if isinstance(x, float) and math.isinf(x):
        return r"$\infty$"
    a = abs(x)
    if a >= 100:
        return f"{x:.1f}"
    if a >= 1:
        return f"{x:.2f}"
    if a == 0:
        return "0"
    return f"{x:.3f}"


def fmt_utilisation(u: float) -> str:
    """Utilisation to two decimals (``inf`` when the resistance is nil)."""
    return r"$\infty$" if math.isinf(u) else f"{u:.2f}"


def _finite(x: float) -> float | None:
    return None if x is None or not math.isfinite(x) else float(x)


def check_payload(record: CheckRecord) -> dict[str, Any]:
    """The JSON data of one check output: ``record.to_dict()`` (unit-tagged keys, used by the
    sign-off digest) plus the rendered ``steps``, plain ``demand``/``resistance`` in ``unit`` and
    the ``verdict`` for the PDF layout."""
    p = record.to_dict()
    p.update({
        "steps": list(record.latex), "demand": _finite(record.demand),
        "resistance": _finite(record.resistance), "utilisation": _finite(record.utilisation),
        "ok": bool(record.ok), "verdict": record.verdict,
    })
    if not record.checked:
        p.update({"demand": None, "resistance": None, "utilisation": None})
    elif not record.is_check:
        # information (core.record.INFO) has no utilisation, and no resistance unless it carries a limit
        # (a class limit of c/t): "-" wherever it is shown, never "0 kN"
        p.update({"utilisation": None})
        if not record.resistance:
            p.update({"resistance": None})
    return p


def _utilisation_of(p: dict[str, Any]) -> float:
    u = p.get("utilisation")
    return math.inf if u is None else u


def _unit_md(unit: str) -> str:
    return f" {unit}" if unit else ""


#: how a check is laid out: in full (heading, rendered steps, verdict) or as one row of a rule table
LAYOUTS = ("full", "row")


class CheckOutput:
    """Rich display of one check (Jupyter calls ``_repr_mimebundle_``)."""

    def __init__(self, record: CheckRecord, layout: str = "full", label: str = "") -> None:
        if not isinstance(record, CheckRecord):
            raise TypeError(f"show_check expects a CheckRecord, got {type(record).__name__}")
        if layout not in LAYOUTS:
            raise ValueError(f"layout must be one of {', '.join(LAYOUTS)}, not {layout!r}")
        self.record = record
        self.layout = layout
        self.label = label

    def _repr_mimebundle_(self, include: Any = None, exclude: Any = None) -> dict[str, Any]:
        r = self.record
        p = check_payload(r)
        if self.layout == "row" and r.checked:
            # one row of a table of rules (detailing, or a check whose working is shown elsewhere)
            p["layout"] = "row"
            if self.label:
                p["label"] = self.label         # the row's text: the title without its part's prefix
            u = fmt_utilisation(r.utilisation).replace(r"$\infty$", "inf") if r.is_check else "-"
            rd = f"{fmt_number(r.resistance)}{_unit_md(r.unit)}" if r.is_check or r.resistance else "-"
            md = (f"| {r.title} | {fmt_number(r.demand)}{_unit_md(r.unit)} | {rd}"
                  f" | {u} | {r.verdict} | {r.clause or r.guidance} |")
            return {CHECK_MIME: p, "text/markdown": md, "text/plain": r.summary_line()}
        u = fmt_utilisation(r.utilisation).replace(r"$\infty$", "inf")
        md = [f"**{markdown_safe(r.title)}** — *{markdown_safe(r.clause)}*", ""]
        if r.guidance:
            md += [f"Method from: {markdown_safe(r.guidance)}", ""]
        md += [s.strip() + "\n" for s in r.latex]
        if not r.checked:
            md.append(f"**NOT CHECKED**: {markdown_safe(r.note)}")
            return {CHECK_MIME: p, "text/markdown": "\n".join(md), "text/plain": r.summary_line()}
        if r.note:
            md.append(f"*{markdown_safe(r.note)}*\n")
        if not r.is_check:
            md.append(f"**{r.verdict}** (information, no utilisation)")
            return {CHECK_MIME: p, "text/markdown": "\n".join(md), "text/plain": r.summary_line()}
        md.append(f"$E_d$ = {fmt_number(r.demand)}{_unit_md(r.unit)}, $R_d$ = {fmt_number(r.resistance)}"
                  f"{_unit_md(r.unit)}: utilisation **{u}** — **{r.verdict}**")
        return {CHECK_MIME: p, "text/markdown": "\n".join(md), "text/plain": r.summary_line()}


def _md_cell(cell: str) -> str:
    """A table cell for Jupyter's markdown: math in the small syntax kept, other text HTML-safe, one line."""
    c = " ".join(str(cell).split())
    if not (len(c) >= 2 and c.startswith("$") and c.endswith("$") and safe_math(c[1:-1])):
        c = markdown_safe(c)
    return c.replace("|", "\\|")


class TableOutput:
    """Rich display of a small table. Cells written as ``$...$`` are LaTeX math, others text."""

    def __init__(self, columns: Sequence[str], rows: Sequence[Sequence[Any]], title: str = "",
                 align: str = "", kind: str = "data", notes: str = "") -> None:
        cols = [str(c) for c in columns]
        if not cols:
            raise ValueError("a table needs at least one column")
        body = [[("" if c is None else str(c)) for c in row] for row in rows]
        for i, row in enumerate(body):
            if len(row) != len(cols):
                raise ValueError(f"table row {i + 1} has {len(row)} cells, expected {len(cols)}")
        al = align or ("l" * len(cols))
        if len(al) != len(cols) or set(al) - set("lrc"):
            raise ValueError(f"align {align!r} must give one of l, r, c per column ({len(cols)})")
        self.payload = {"title": title, "columns": cols, "rows": body, "align": al, "kind": kind,
                        "notes": notes}

    def _repr_mimebundle_(self, include: Any = None, exclude: Any = None) -> dict[str, Any]:
        p = self.payload
        md = [f"**{markdown_safe(p['title'])}**", ""] if p["title"] else []
        md.append("| " + " | ".join(_md_cell(c) for c in p["columns"]) + " |")
        md.append("|" + "|".join({"l": ":--", "r": "--:", "c": ":-:"}[a] for a in p["align"]) + "|")
        md += ["| " + " | ".join(_md_cell(c) for c in row) + " |" for row in p["rows"]]
        if p["notes"]:
            md += ["", f"*{markdown_safe(p['notes'])}*"]
        text = "\n".join(["\t".join(p["columns"])] + ["\t".join(r) for r in p["rows"]])
        return {TABLE_MIME: p, "text/markdown": "\n".join(md), "text/plain": text}


def summary_output(records: Iterable[CheckRecord], title: str = "Summary of checks") -> TableOutput:
    """Table of records, highest utilisation first."""
    recs = list(records)
    for r in recs:
        if not isinstance(r, CheckRecord):
            raise TypeError(f"summary expects CheckRecords, got {type(r).__name__}")
    recs.sort(key=summary_order)
    rows = []
    for r in recs:
        if not r.checked:
            rows.append([r.title, "-", "-", "", "-", r.verdict])
            continue
        unit = f"${UNIT_TEX.get(r.unit, r.unit)}$" if r.unit else ""
        if not r.is_check:             # INFO: its quantity, or "-" as on its sheet when it has none
            nothing = not r.demand and not r.resistance
            rows.append([r.title, "-" if nothing else fmt_number(r.demand), "-", "" if nothing else unit, "-",
                         r.verdict])
            continue
        rows.append([r.title, fmt_number(r.demand), fmt_number(r.resistance), unit,
                     fmt_utilisation(r.utilisation), r.verdict])
    notes = verdict_sentence(recs)
    # the clause of each check is printed with its working and in the summary by part
    return TableOutput(["Check", "$E_d$", "$R_d$", "Unit", "Util.", "Verdict"], rows,
                       title=title, align="lrrlrl", kind="summary", notes=notes)


def publish(obj: Any) -> None:
    """Show an output object (anything with ``_repr_mimebundle_``) in the notebook.

    Inside IPython its MIME bundle goes straight to the display publisher: the same
    output as ``IPython.display.display`` gives for these objects, without running
    every registered formatter on it (half the cost of each of the ~200 outputs of a
    calc package). Elsewhere, or for other objects, ``display`` as usual.
    """
    from IPython.core.getipython import get_ipython
    from IPython.display import display, publish_display_data

    make = getattr(obj, "_repr_mimebundle_", None)
    if get_ipython() is None or make is None:
        display(obj)
        return
    data = make()
    metadata: dict[str, Any] = {}
    if isinstance(data, tuple):
        data, metadata = data
    if not data:                        # nothing to show this way: IPython's own formatters decide
        display(obj)
        return
    publish_display_data(data, metadata or None)


def show_check(record: CheckRecord, layout: str = "full", label: str = "") -> None:
    """Display one check: title and clause, rendered steps, verdict line (``layout="row"``: one
    table row with E_d, R_d, utilisation and clause, under a rule-table heading)."""
    publish(CheckOutput(record, layout, label))


def show_summary(records: Iterable[CheckRecord], title: str = "Summary of checks") -> None:
    """Display the checks sorted by utilisation (highest first)."""
    publish(summary_output(records, title))


class ReviewOutput:
    """The review comments of a package (payload from :func:`splicecalc.review.review_payload`):
    the PDF prints a margin mark at each commented check and the threads; Jupyter shows the
    threads as a collapsible list per part of the package."""

    def __init__(self, payload: dict[str, Any]) -> None:
        self.payload = payload

    def _repr_mimebundle_(self, include: Any = None, exclude: Any = None) -> dict[str, Any]:
        import html

        p = self.payload
        c = p["counts"]
        head = (f"Review register {p['register']}: {c['open']} open, {c['answered']} answered, "
                f"{c['closed']} closed")
        parts: dict[str, list[dict[str, Any]]] = {}
        for cm in p["comments"]:
            parts.setdefault(cm["part"], []).append(cm)
        out = [f"<p><b>{html.escape(head)}</b></p>"]
        for part, cms in parts.items():
            n_open = sum(1 for cm in cms if cm["state"] != "closed")
            out.append(f"<details{' open' if n_open else ''}><summary>{html.escape(part)}: {n_open} not closed, "
                       f"{len(cms) - n_open} closed</summary><ul>")
            for cm in cms:
                flag = {"moved": " — check changed since", "gone": " — check no longer in the package"}.get(
                    cm.get("flag") or "", "")
                out.append(f"<li><b>{html.escape(cm['id'])}</b> [{html.escape(cm['state'])}] on "
                           f"<code>{html.escape(cm['target_label'])}</code>{html.escape(flag)}<ul>")
                out += [f"<li>{html.escape(e['by'])}, {html.escape(e['date'][:10])} ({html.escape(e['kind'])}): "
                        f"{html.escape(e['text'])}</li>" for e in cm["thread"]]
                out.append("</ul></li>")
            out.append("</ul></details>")
        lines = [head] + [f"{cm['id']} [{cm['state']}] {cm['target_label']}: {cm['thread'][0]['text'][:80]}"
                          for cm in p["comments"]]
        return {REVIEW_MIME: p, "text/html": "\n".join(out), "text/plain": "\n".join(lines)}


def show_table(columns: Sequence[str], rows: Sequence[Sequence[Any]], title: str = "",
               align: str = "", notes: str = "") -> None:
    """Display a small data table (e.g. section properties)."""
    publish(TableOutput(columns, rows, title=title, align=align, notes=notes))


def section_stability_rows(section: Any) -> list[list[str]]:
    """The properties M_cr is computed from (I_z, I_t, I_w), in the units of the display-unit table
    (core.units.displayed: cm4, cm4, dm6): ``[property, symbol, value, unit, source]``."""
    from ..core.units import displayed

    out = []
    for name, sym, value, unit, fmt in (("Second moment, minor axis", "$I_z$", section.Iz, "mm4", "{:.1f}"),
                                        ("Torsion constant", "$I_t$", section.It, "mm4", "{:.2f}"),
                                        ("Warping constant", "$I_w$", section.Iw, "mm6", "{:.4f}")):
        v, u = displayed(value, unit)
        out.append([name, sym, fmt.format(v), u, "from geometry"])
    return out


def section_table(section: Any, grade: str) -> TableOutput:
    """Dimensions and properties of a rolled section with its steel strengths.

    f_y and f_u are taken for the flange thickness (the thickest element of a
    rolled I section), EN 10025-2 Table 7 via :func:`splicecalc.materials.steel`,
    as the member checks do.
    """
    from ..materials import steel

    mat = steel(grade, section.tf, field="section.tf")
    src = getattr(section, "standard", "") or section.family
    rows = [
        ["Depth", "$h$", f"{section.h:.1f}", "mm", src],
        ["Width", "$b$", f"{section.b:.1f}", "mm", src],
        ["Web thickness", "$t_w$", f"{section.tw:.1f}", "mm", src],
        ["Flange thickness", "$t_f$", f"{section.tf:.1f}", "mm", src],
        ["Root radius", "$r$", f"{section.r:.1f}", "mm", src],
        ["Area", "$A$", f"{section.A / 1e2:.1f}", "cm2", "from geometry"],
        ["Second moment", "$I_y$", f"{section.Iy / 1e4:.0f}", "cm4", "from geometry"],
        ["Plastic modulus", "$W_{pl,y}$", f"{section.Wpl_y / 1e3:.0f}", "cm3", "from geometry"],
        ["Elastic modulus", "$W_{el,y}$", f"{section.Wel_y / 1e3:.0f}", "cm3", "from geometry"],
        *section_stability_rows(section),
        ["Yield strength", "$f_y$", f"{mat.f_y:.0f}", "MPa", f"EN 10025-2, {mat.grade}, t = {section.tf:g} mm"],
        ["Tensile strength", "$f_u$", f"{mat.f_u:.0f}", "MPa", f"EN 10025-2, {mat.grade}"],
    ]
    for row in rows:
        row[3] = f"${UNIT_TEX[row[3]]}$" if row[3] else ""
    return TableOutput(["Property", "Symbol", "Value", "Unit", "Source"], rows,
                       title=f"Section {section.designation}, grade {mat.grade}", align="llrll")


def show_section(section: Any, grade: str) -> None:
    """Display :func:`section_table`."""
    publish(section_table(section, grade))


__all__ = ["CHECK_MIME", "DISPLAY_PRIORITY", "REVIEW_MIME", "ReviewOutput", "TABLE_MIME", "CheckOutput", "TableOutput", "check_payload", "fmt_number", "publish",
           "fmt_utilisation", "section_table", "section_stability_rows", "show_section", "show_check", "show_summary", "show_table", "summary_output", "UNIT_TEX"]
