"""Two revisions of a calc package side by side, for the checker (``splicecalc compare OLD NEW``).

Pure functions on executed notebook dicts (no file access here; the command reads the files):

* changed inputs: the job inputs each notebook published under
  :data:`splicecalc.signoff.digest.JOB_MIME`, compared key by key (``beam.span``,
  ``load[2].udl``; list items numbered from 1 as in the job file), values as written
  there, units included (``"7.5 kN/m"``);
* moved checks: checks made in both whose utilisation moved by more than
  :data:`MOVE_THRESHOLD`, or whose verdict changed (OK / NOT OK / NOT CHECKED / INFO);
* checks added and removed, by check id (records read with
  :func:`splicecalc.signoff.digest.collect_records`);
* the governing check of each part before and after: the parts are the package's own
  grouping (:mod:`splicecalc.workflow.parts`), published with its summary by part
  (``parts_index``) and read back with ``parts_from_index``; nothing is regrouped here.

Nothing is recomputed: every number is one a notebook printed.
"""

from __future__ import annotations

import hashlib
import json
import math
import re
from dataclasses import dataclass
from typing import Any

from ..core.errors import InputError
from ..core.record import CHECKED, INFO, KEY_TAG, CheckRecord
from ..report.display import TABLE_MIME
from ..signoff.digest import JOB_MIME, collect_records, job_inputs
from ..workflow.parts import Part, parts_from_index

#: utilisation change a checker is shown (absolute, dimensionless)
MOVE_THRESHOLD = 0.005


@dataclass(frozen=True)
class Revision:
    """What one executed calc notebook published: job inputs, records by id, parts (or None)."""

    name: str
    revision: str
    job: dict[str, Any]
    records: dict[str, dict[str, Any]]
    parts: tuple[Part, ...] | None


def _tables(nb: dict[str, Any]):
    for cell in nb.get("cells", []):
        if not isinstance(cell, dict) or cell.get("cell_type") != "code":
            continue
        for out in cell.get("outputs", []) or []:
            data = out.get("data") if isinstance(out, dict) else None
            if isinstance(data, dict) and isinstance(data.get(TABLE_MIME), dict):
                yield data[TABLE_MIME]


def _has_job(nb: dict[str, Any]) -> bool:
    return any(isinstance(out, dict) and isinstance(out.get("data"), dict) and JOB_MIME in out["data"]
               for cell in nb.get("cells", []) if isinstance(cell, dict)
               for out in (cell.get("outputs") or []))


def _record_from_dict(d: dict[str, Any]) -> CheckRecord:
    """A published record as a :class:`CheckRecord` (the numbers the grouping's ``governing`` needs)."""
    status = d.get("status", CHECKED)
    u = d.get("utilisation")
    util = float(u) if isinstance(u, (int, float)) and not isinstance(u, bool) else 0.0
    return CheckRecord(id=str(d.get("id", "")), title=str(d.get("title", "")), clause=str(d.get("clause", "")),
                       demand=math.nan, resistance=math.nan, unit=str(d.get("unit", "")), utilisation=util,
                       ok=bool(d.get("ok", False)), status=str(status))


def read_revision(nb: Any, name: str = "notebook", which: str = "notebook") -> Revision:
    """Read what a calc notebook published; :class:`InputError` (field ``which``, value ``name``) when
    ``nb`` is not an executed calc notebook."""
    if not isinstance(nb, dict) or not isinstance(nb.get("cells"), list):
        raise InputError(which, name, "a Jupyter notebook (.ipynb) with a list of cells")
    for cell in nb["cells"]:
        outs = cell.get("outputs", []) if isinstance(cell, dict) else None
        if not isinstance(outs, list) or not all(isinstance(o, dict) and isinstance(o.get("data", {}), dict)
                                                 for o in outs):
            raise InputError(which, name, "a Jupyter notebook: each cell a table, its outputs a list of tables",
                             "The file is not a notebook as Jupyter writes it (edited by hand, or damaged?)")
    recs = collect_records(nb)
    if not _has_job(nb):
        raise InputError(which, name, "an executed splicecalc calc notebook",
                         "This is not a calc notebook: it publishes no job inputs"
                         + ("" if recs else " and no check records")
                         + " (give the notebook `splicecalc build` wrote beside the PDF, or build the package)")
    records: dict[str, dict[str, Any]] = {}
    for r in recs:
        if not isinstance(r, dict) or not isinstance(r.get("id"), str):
            raise InputError(which, name, "a calc notebook whose check records have ids",
                             "A check record without an id: was the notebook edited by hand?")
        records.setdefault(r["id"], r)
    parts = None
    index = next((t["parts"] for t in _tables(nb) if t.get("kind") == "parts" and isinstance(t.get("parts"), list)),
                 None)
    if index is not None:
        objs = {i: _record_from_dict(r) for i, r in records.items()}
        try:
            parts = parts_from_index(index, objs)
        except (KeyError, TypeError):
            raise InputError(which, name, "a calc notebook with the summary by part as the package writes it",
                             "Was the notebook edited by hand?") from None
    try:
        job = job_inputs(nb)
    except (ValueError, TypeError):
        raise InputError(which, name, "a calc notebook whose job inputs are a JSON table",
                         "Was the notebook edited by hand?") from None
    meta = nb.get("metadata", {}).get("splicecalc", {}) if isinstance(nb.get("metadata"), dict) else {}
    rev = (meta.get("revision") if isinstance(meta, dict) else None) or (job.get("project") or {}).get("revision", "")
    return Revision(name=name, revision=str(rev or ""), job=job, records=records, parts=parts)


# ----------------------------------------------------------------- inputs
def flatten_inputs(job: Any, prefix: str = "") -> dict[str, Any]:
    """Job inputs as ``path -> value`` (``beam.span``, ``load[2].udl``, ``beam.restraints[1]``)."""
    out: dict[str, Any] = {}
    if isinstance(job, dict):
        for k, v in job.items():
            out.update(flatten_inputs(v, f"{prefix}.{k}" if prefix else str(k)))
    elif isinstance(job, list) and job and all(isinstance(x, dict) for x in job):
        for i, v in enumerate(job, 1):
            out.update(flatten_inputs(v, f"{prefix}[{i}]"))
    elif isinstance(job, list):
        out[prefix] = list(job)
    else:
        out[prefix] = job
    return out


def changed_inputs(old: dict[str, Any], new: dict[str, Any]) -> list[dict[str, Any]]:
    """Every input path whose value differs (None where a side does not have it), in job-file order."""
    a, b = flatten_inputs(old), flatten_inputs(new)
    keys = list(a) + [k for k in b if k not in a]
    return [{"input": k, "old": a.get(k), "new": b.get(k)} for k in keys if a.get(k) != b.get(k)]


# ----------------------------------------------------------------- checks
def _verdict(r: dict[str, Any]) -> str:
    status = r.get("status", CHECKED)
    if status != CHECKED:
        return "INFO" if status == INFO else "NOT CHECKED"
    return "OK" if r.get("ok") else "NOT OK"


def _util(r: dict[str, Any]) -> float | None:
    u = r.get("utilisation")
    if r.get("status", CHECKED) != CHECKED or not isinstance(u, (int, float)) or isinstance(u, bool):
        return None
    return float(u)


def _r6(x: float | None) -> float | None:
    return None if x is None else round(x, 6)


def _tag(unit: str) -> str:
    t = KEY_TAG.get(unit, unit.replace("/", "_per_"))
    return f"_{t}" if t else ""


def _brief(r: dict[str, Any]) -> dict[str, Any]:
    """A record as the comparison lists it: id, title, clause, unit-tagged demand and resistance."""
    sfx = _tag(str(r.get("unit", "")))
    return {"id": r["id"], "title": r.get("title", ""), "clause": r.get("clause", ""), "unit": r.get("unit", ""),
            f"demand{sfx}": r.get(f"demand{sfx}"), f"resistance{sfx}": r.get(f"resistance{sfx}"),
            "utilisation": _r6(_util(r)), "verdict": _verdict(r)}


def moved_checks(old: dict[str, dict], new: dict[str, dict], threshold: float = MOVE_THRESHOLD) -> list[dict]:
    """Checks in both revisions whose utilisation moved by more than ``threshold`` or whose verdict
    changed; largest move first. Demand and resistance keys carry each side's unit."""
    out = []
    for i, a in old.items():
        b = new.get(i)
        if b is None:
            continue
        ua, ub = _util(a), _util(b)
        moved = ua is not None and ub is not None and abs(ub - ua) > threshold * (1 + 1e-9)
        if not (moved or _verdict(a) != _verdict(b)):
            continue
        sa, sb = _tag(str(a.get("unit", ""))), _tag(str(b.get("unit", "")))
        out.append({"id": i, "title": b.get("title", ""), "clause": b.get("clause", ""),
                    f"old_demand{sa}": a.get(f"demand{sa}"), f"new_demand{sb}": b.get(f"demand{sb}"),
                    f"old_resistance{sa}": a.get(f"resistance{sa}"), f"new_resistance{sb}": b.get(f"resistance{sb}"),
                    "old_utilisation": _r6(ua), "new_utilisation": _r6(ub),
                    "change_utilisation": None if ua is None or ub is None else round(ub - ua, 6),
                    "old_verdict": _verdict(a), "new_verdict": _verdict(b)})
    out.sort(key=lambda d: -abs(d["change_utilisation"] or 0.0))
    return out


def _gov(p: Part | None) -> dict[str, Any] | None:
    g = p.governing if p is not None else None
    return None if g is None else {"id": g.id, "title": p.short_title(g), "clause": g.clause,
                                   "utilisation": round(g.utilisation, 6)}


def governing_by_part(old: Revision, new: Revision, threshold: float = MOVE_THRESHOLD) -> list[dict[str, Any]] | None:
    """Each part (by key, old order then new parts) with its governing check before and after
    (``changed``: another check governs, or its utilisation moved by more than ``threshold``);
    None when either notebook does not carry the grouping (built before it was published)."""
    if old.parts is None or new.parts is None:
        return None
    a = {p.key: p for p in old.parts}
    b = {p.key: p for p in new.parts}
    keys = list(a) + [k for k in b if k not in a]
    out = []
    for k in keys:
        ga, gb = _gov(a.get(k)), _gov(b.get(k))
        other = (ga or {}).get("id") != (gb or {}).get("id")
        moved = ga is not None and gb is not None and abs(gb["utilisation"] - ga["utilisation"]) > threshold * (1 + 1e-9)
        out.append({"part": k, "title": (b.get(k) or a[k]).title, "old": ga, "new": gb,
                    "governing_changed": other, "changed": other or moved})
    return out


def compare_revisions(old_nb: Any, new_nb: Any, *, old_name: str = "OLD", new_name: str = "NEW",
                      threshold: float = MOVE_THRESHOLD) -> dict[str, Any]:
    """The whole comparison as JSON-ready data (see the module docstring); ``changed`` says whether
    anything differs (inputs, moved / added / removed checks, a part's governing check)."""
    if not (isinstance(threshold, (int, float)) and 0.0 <= threshold < 1.0):
        raise InputError("threshold", threshold, "a utilisation change from 0 to below 1, e.g. 0.005")
    a, b = read_revision(old_nb, old_name, "OLD"), read_revision(new_nb, new_name, "NEW")
    added = [_brief(r) for i, r in b.records.items() if i not in a.records]
    removed = [_brief(r) for i, r in a.records.items() if i not in b.records]
    inputs = changed_inputs(a.job, b.job)
    moved = moved_checks(a.records, b.records, threshold)
    parts = governing_by_part(a, b, threshold)
    changed = bool(inputs or moved or added or removed or any(p["changed"] for p in parts or ()))
    return {
        "old": {"name": a.name, "revision": a.revision, "checks_count": len(a.records)},
        "new": {"name": b.name, "revision": b.revision, "checks_count": len(b.records)},
        "threshold_utilisation": threshold,
        "changed": changed,
        "changed_inputs": inputs,
        "moved_checks": moved,
        "added_checks": added,
        "removed_checks": removed,
        "governing_by_part": parts,
    }


# ----------------------------------------------------------------- text
def _cell(v: Any) -> str:
    if v is None:
        return "-"
    if isinstance(v, float):
        return f"{v:.3f}"
    if isinstance(v, list):
        return "[" + ", ".join(str(x) for x in v) + "]"
    return str(v)


def _printable(text: str) -> str:
    """Text from a notebook as a terminal shows it: control characters (escape sequences) as '?'."""
    return "".join(ch if ch.isprintable() else "?" for ch in text)


def _table(title: str, head: list[str], rows: list[list[str]]) -> list[str]:
    rows = [[_printable(c) for c in r] for r in rows]
    if not rows:
        return [f"{title}: none"]
    w = [max(len(h), *(len(r[i]) for r in rows)) for i, h in enumerate(head)]
    fmt = "  " + "  ".join(f"{{:<{n}}}" for n in w)
    return [f"{title} ({len(rows)})", fmt.format(*head).rstrip(), *(fmt.format(*r).rstrip() for r in rows)]


def _u(x: float | None) -> str:
    return "-" if x is None else f"{x:.3f}"


def comparison_text(c: dict[str, Any]) -> str:
    """One short table per section of :func:`compare_revisions`."""
    o, n = c["old"], c["new"]
    lines = [_printable(f"Compare {o['name']} (revision {o['revision'] or '-'}, {o['checks_count']} checks) -> "
                        f"{n['name']} (revision {n['revision'] or '-'}, {n['checks_count']} checks)"), ""]
    lines += _table("Changed inputs", ["Input", "Old", "New"],
                    [[d["input"], _cell(d["old"]), _cell(d["new"])] for d in c["changed_inputs"]])
    lines.append("")
    lines += _table(f"Checks moved by more than {c['threshold_utilisation']:g} in utilisation, or with a new verdict",
                    ["Check", "Old", "New", "Change", "Verdict"],
                    [[d["id"], _u(d["old_utilisation"]), _u(d["new_utilisation"]),
                      "-" if d["change_utilisation"] is None else f"{d['change_utilisation']:+.3f}",
                      d["new_verdict"] if d["old_verdict"] == d["new_verdict"]
                      else f"{d['old_verdict']} -> {d['new_verdict']}"] for d in c["moved_checks"]])
    for key, title in (("added_checks", "Checks added"), ("removed_checks", "Checks removed")):
        lines.append("")
        lines += _table(title, ["Check", "Title", "Util.", "Verdict"],
                        [[d["id"], d["title"], _u(d["utilisation"]), d["verdict"]] for d in c[key]])
    lines.append("")
    parts = c["governing_by_part"]
    if parts is None:
        lines.append("Governing check by part: not available (a notebook was built before the summary by part "
                     "carried its grouping; rebuild it)")
    else:
        def g(x: dict | None) -> str:
            return "-" if x is None else f"{x['id']} {x['utilisation']:.3f}"
        lines += _table("Governing check by part", ["Part", "Before", "After", ""],
                        [[p["part"], g(p["old"]), g(p["new"]), "another check" if p["governing_changed"]
                          else ("moved" if p["changed"] else "")] for p in parts])
    lines += ["", "Changes found." if c["changed"] else "No change."]
    return "\n".join(lines)


# ----------------------------------------------------------------- changed outputs (change bars)
#: the MIME type of a figure's data (drawn from it; its PDF / PNG bytes carry creation dates)
_FIGURE_MIME = "application/vnd.splicecalc.figure+json"


def output_fingerprint(output: Any, revision: str = "") -> str:
    """SHA-256 of what the package prints of one notebook output: the first MIME type of
    :data:`~splicecalc.report.display.DISPLAY_PRIORITY` it carries (a check record's JSON with its
    rendered steps, a table's rows, markdown text), a figure's data rather than its image bytes,
    printed text of a stream. ``revision``: the package's revision code, which is left out where the
    output names it ("revision P2", a table's "Revision" | "P2" row): a new code is on every sheet's
    strip and is not a change of content."""
    from ..report.display import DISPLAY_PRIORITY

    if not isinstance(output, dict):
        return ""
    if output.get("output_type") == "stream":
        text = output.get("text", "")
        body: Any = ["stream", str(output.get("name", "")), "".join(text) if isinstance(text, list) else str(text)]
    else:
        data = output.get("data") if isinstance(output.get("data"), dict) else {}
        mime = _FIGURE_MIME if _FIGURE_MIME in data else next((m for m in DISPLAY_PRIORITY if m in data), None)
        value = data.get(mime) if mime else sorted(data)
        if isinstance(value, list) and mime and mime.startswith("text/"):
            value = "".join(str(x) for x in value)
        body = [str(mime), value]
    raw = json.dumps(body, sort_keys=True, ensure_ascii=False, separators=(",", ":"), default=str)
    if revision:
        raw = re.sub(r'(?i)(revision[\s"\[\],:]*)' + re.escape(revision) + r"(?![A-Za-z0-9])", r"\1<revision>", raw)
    return hashlib.sha256(raw.encode("utf-8")).hexdigest()


def _revision_of(nb: Any) -> str:
    """The revision code a notebook was built for (its title block, else its job's [project])."""
    meta = nb.get("metadata", {}).get("splicecalc", {}) if isinstance(nb, dict) else {}
    rev = meta.get("revision") if isinstance(meta, dict) else None
    if not rev:
        try:
            rev = (job_inputs(nb).get("project") or {}).get("revision")
        except (ValueError, TypeError, AttributeError):
            rev = None
    return str(rev or "").strip()


def _outputs(nb: Any):
    for ci, cell in enumerate(nb.get("cells", []) if isinstance(nb, dict) else []):
        if isinstance(cell, dict) and cell.get("cell_type") == "code":
            for oi, out in enumerate(cell.get("outputs") or []):
                yield ci, oi, out


def changed_outputs(old_nb: Any, new_nb: Any) -> list[tuple[int, int]]:
    """(cell index, output index) of every output of ``new_nb`` whose printed content the old
    notebook does not have (compared by :func:`output_fingerprint`, each old output matched once, so a
    repeated output that appears once more counts as changed). An output only moved is not changed;
    what was removed is listed by the comparison (checks removed), it has no place to carry a bar."""
    from collections import Counter

    ra, rb = _revision_of(old_nb), _revision_of(new_nb)
    have = Counter(output_fingerprint(o, ra) for _, _, o in _outputs(old_nb))
    out = []
    for ci, oi, o in _outputs(new_nb):
        f = output_fingerprint(o, rb)
        if have[f] > 0:
            have[f] -= 1
        else:
            out.append((ci, oi))
    return out


# ----------------------------------------------------------------- LaTeX (the appendix)
def _tex_u(x: float | None) -> str:
    return "--" if x is None else f"{x:.3f}"


def _tex_table(title: str, spec: str, head: list[str], rows: list[list[str]], empty: str) -> list[str]:
    """One titled ``calctable`` (macros of the package template); cells are LaTeX already."""
    from ..core.text import escape_tex as e

    out = [r"\subsection*{" + e(title) + "}"]
    if not rows:
        return out + [r"{\small\itshape " + e(empty) + r"}\par"]
    out += [r"\begin{calctable}{" + spec + "}",
            " & ".join(r"\textbf{" + e(h) + "}" for h in head) + r" \\ \midrule\endhead"]
    out += [" & ".join(r) + r" \\" for r in rows]
    out += [r"\bottomrule", r"\end{calctable}"]
    return out


_RAGGED = r">{\raggedright\arraybackslash}"


def comparison_latex(c: dict[str, Any], *, heading: str = "", label: str = "calc-changes") -> str:
    """The comparison of :func:`compare_revisions` as a LaTeX section for the calc package's sheets
    (macros of ``report/latex/calcpackage``): changed inputs, moved checks, checks added and removed, the
    governing check of each part before and after. Every text from a notebook goes through
    :func:`splicecalc.core.text.escape_tex`; numbers are formatted here."""
    from ..core.text import escape_tex as e

    o, n = c["old"], c["new"]
    ro, rn = (o.get("revision") or "-"), (n.get("revision") or "-")
    heading = heading or f"Changes from revision {ro} to revision {rn}"
    lines = [r"\clearpage", r"\section{" + e(heading) + "}", r"\label{" + label + "}", "",
             r"{\small " + e(f"Compared: {o['name']} (revision {ro}, {o['checks_count']} records) with {n['name']} "
                             f"(revision {rn}, {n['checks_count']} records). Every value below is one the two "
                             "calc notebooks printed; nothing is recomputed. A check is listed when its "
                             f"utilisation moved by more than {c['threshold_utilisation']:g} or its verdict "
                             "changed. The calculation sheets govern; this list is an aid to the check.")
             + r"\par}", ""]
    lines += _tex_table("Changed inputs", f"{_RAGGED}p{{0.34\\linewidth}}{_RAGGED}p{{0.29\\linewidth}}"
                        f"{_RAGGED}p{{0.29\\linewidth}}",
                        ["Input (job file)", f"Revision {ro}", f"Revision {rn}"],
                        [[e(d["input"]), e(_cell(d["old"])), e(_cell(d["new"]))] for d in c["changed_inputs"]],
                        "No input changed.")
    moved = []
    for d in c["moved_checks"]:
        ch = d["change_utilisation"]
        same = d["old_verdict"] == d["new_verdict"]
        v = e(d["new_verdict"] if same else f"{d['old_verdict']} -> {d['new_verdict']}")
        if d["new_verdict"] in ("NOT OK", "NOT CHECKED"):
            v = r"\textcolor{failred}{\textbf{" + v + "}}"
        moved.append([e(d["id"]), e(d["title"]), _tex_u(d["old_utilisation"]), _tex_u(d["new_utilisation"]),
                      "--" if ch is None else f"{ch:+.3f}", v])
    lines += [""] + _tex_table(f"Checks whose utilisation moved by more than {c['threshold_utilisation']:g}, or "
                               "with another verdict",
                               f"{_RAGGED}p{{0.27\\linewidth}}{_RAGGED}p{{0.33\\linewidth}}rrr"
                               f"{_RAGGED}p{{0.11\\linewidth}}",
                               ["Check", "Title", f"u {ro}", f"u {rn}", "change", "Verdict"], moved,
                               "No check moved.")
    for key, title, rev in (("added_checks", "Checks added", rn), ("removed_checks", "Checks removed", ro)):
        rows = [[e(d["id"]), e(d["title"]), _tex_u(d["utilisation"]), e(d["verdict"])] for d in c[key]]
        lines += [""] + _tex_table(title, f"{_RAGGED}p{{0.25\\linewidth}}{_RAGGED}p{{0.45\\linewidth}}r"
                                   f"{_RAGGED}p{{0.14\\linewidth}}", ["Check", "Title", f"u {rev}", "Verdict"], rows,
                                   f"No check {title.split()[-1]}.")
    parts = c["governing_by_part"]
    lines.append("")
    if parts is None:
        lines += [r"\subsection*{Governing check by part}",
                  r"{\small\itshape " + e("Not available: a notebook was built before the summary by part carried "
                                          "its grouping (rebuild it).") + r"\par}"]
    else:
        def g(x: dict | None) -> str:
            return "--" if x is None else e(x["id"]) + r"\hfill " + f"{x['utilisation']:.3f}"
        rows = [[e(f"{p['part']}: {p['title']}"), g(p["old"]), g(p["new"]),
                 e("another check" if p["governing_changed"] else ("moved" if p["changed"] else "-"))]
                for p in parts]
        lines += _tex_table("Governing check by part", f"{_RAGGED}p{{0.30\\linewidth}}{_RAGGED}p{{0.25\\linewidth}}"
                            f"{_RAGGED}p{{0.25\\linewidth}}{_RAGGED}p{{0.12\\linewidth}}",
                            ["Part", f"Governing, {ro}", f"Governing, {rn}", ""], rows, "No parts.")
    return "\n".join(lines) + "\n"


def write_comparison_pdf(c: dict[str, Any], new_nb: Any, out: Any) -> Any:
    """Typeset :func:`comparison_latex` on the package's sheets (the title block of ``new_nb``, its
    strip and fonts; :class:`~splicecalc.report.exporter.ComparisonExporter`, XeLaTeX locked down as
    for a package) and write the PDF atomically to ``out``; an issued or signed file there is refused
    (checked again just before the write). Returns the path."""
    import copy
    import tempfile
    from pathlib import Path

    import nbformat

    from ..core.files import write_atomic
    from ..report.exporter import ComparisonExporter
    from ..signoff.ledger import protection_reason

    out = Path(out)
    meta = copy.deepcopy((new_nb.get("metadata") or {}).get("splicecalc") or {}) if isinstance(new_nb, dict) else {}
    for key in ("signatures", "sign_off"):        # the comparison is not the signed package
        meta.pop(key, None)
    if str(meta.get("status", "")).upper() in ("PREPARED", "CHECKED", "APPROVED", "ISSUED"):
        meta["status"] = "FOR CHECK"
    nb = nbformat.v4.new_notebook(metadata={"splicecalc": meta})
    o, n = c["old"], c["new"]
    heading = f"Changes from revision {o.get('revision') or '-'} to revision {n.get('revision') or '-'}"
    with tempfile.TemporaryDirectory(prefix="splicecalc-compare-") as tmp:
        exporter = ComparisonExporter(build_directory=tmp)
        resources = {"metadata": {"name": "comparison", "path": tmp},
                     "comparison": comparison_latex(c, heading=heading)}
        pdf, _ = exporter.from_notebook_node(nb, resources)
    why = protection_reason(out)
    if why:
        raise InputError("--pdf", str(out), f"a new file name ({out.name} is {why}; it is never overwritten)")
    out.parent.mkdir(parents=True, exist_ok=True)
    return write_atomic(out, pdf)


__all__ = ["MOVE_THRESHOLD", "Revision", "changed_inputs", "changed_outputs", "compare_revisions", "comparison_latex",
           "comparison_text", "flatten_inputs", "governing_by_part", "moved_checks", "output_fingerprint",
           "read_revision", "write_comparison_pdf"]
