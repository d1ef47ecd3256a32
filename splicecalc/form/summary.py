"""The live utilisation summary of the form: the whole job on the plain-float path.

:func:`design_summary` validates the form and runs the whole calculation,
:func:`splicecalc.workflow.run_calc` with ``render=False`` (no handcalcs work):
beam, splice positions, every splice, every end connection and every existing
member. It keeps every check record, highest utilisation first, and one line per
part (:func:`splicecalc.workflow.parts.job_parts`) with its governing check, so the
form shows what ``splicecalc run`` and the package's summary show. When a part
beyond the beam cannot be designed, the beam design alone is shown with the reason.
Bad input gives a summary holding the :class:`~splicecalc.core.errors.InputError`
message, which names the field; any other failure gives a one-line message. The
summary never carries a traceback.
"""

from __future__ import annotations

import html
import math
from dataclasses import dataclass, field
from typing import Any

from ..core.errors import InputError
from ..job.model import Job
from .state import FormState


@dataclass(frozen=True)
class SummaryRow:
    """One check of the design: id, title, clause, utilisation, ok."""

    id: str
    title: str
    clause: str
    utilisation: float
    ok: bool


@dataclass(frozen=True)
class PartRow:
    """One part of the job (the beam, a splice, an end connection...) and its governing check."""

    key: str
    title: str
    checks: int
    governing: str
    utilisation: float
    ok: bool


@dataclass(frozen=True)
class Summary:
    """Result of :func:`design_summary`.

    ``error`` is the message to show when the design could not run (the
    InputError text, naming the field), ``error_field`` that field.
    """

    ok: bool = False
    message: str = ""
    section: str = ""
    rows: tuple[SummaryRow, ...] = ()
    governing: str = ""
    error: str = ""
    error_field: str = ""
    notes: tuple[str, ...] = field(default=())
    parts: tuple[PartRow, ...] = ()

    def text(self) -> str:
        """Plain-text summary (one line per check)."""
        if self.error:
            return "Cannot design: " + self.error
        lines = [self.message]
        for p in self.parts:
            u = "n/a" if not math.isfinite(p.utilisation) else f"{p.utilisation:.3f}"
            lines.append(f"{'ok  ' if p.ok else 'FAIL'} {u:>6}  {p.title}: {p.governing}")
        for r in self.rows:
            u = "n/a" if not math.isfinite(r.utilisation) else f"{r.utilisation:.3f}"
            lines.append(f"{'ok  ' if r.ok else 'FAIL'} {u:>6}  {r.title}  ({r.clause})")
        return "\n".join(lines)

    def html(self, limit: int = 12) -> str:
        """HTML table for the form (plain markup, no script)."""
        esc = html.escape
        if self.error:
            return (f"<div><b>Utilisation summary</b><br><span style='color:#b00020'>Cannot design: "
                    f"{esc(self.error)}</span></div>")
        head = (f"<b>Utilisation summary</b> ({'all checks pass' if self.ok else 'FAILS'})<br>"
                f"{esc(self.message)}")
        parts = []
        for p in self.parts:
            u = "n/a" if not math.isfinite(p.utilisation) else f"{p.utilisation:.3f}"
            style = "" if p.ok else " style='color:#b00020;font-weight:bold'"
            parts.append(f"<tr{style}><td>{esc(p.title)}</td><td style='text-align:right'>{p.checks}</td>"
                         f"<td>{esc(p.governing)}</td><td style='text-align:right'>{u}</td>"
                         f"<td>{'ok' if p.ok else 'FAIL'}</td></tr>")
        part_table = ("<table><tr><th>part</th><th>checks</th><th>governing check</th><th>utilisation</th>"
                      "<th></th></tr>" + "".join(parts) + "</table><b>Highest utilisations</b>" if parts else "")
        rows = []
        for r in self.rows[:limit]:
            u = "n/a" if not math.isfinite(r.utilisation) else f"{r.utilisation:.3f}"
            mark = "&#9656; " if r.id == self.governing else ""
            style = "" if r.ok else " style='color:#b00020;font-weight:bold'"
            rows.append(f"<tr{style}><td>{mark}{esc(r.title)}</td><td style='text-align:right'>{u}</td>"
                        f"<td>{'ok' if r.ok else 'FAIL'}</td><td>{esc(r.clause)}</td></tr>")
        more = (f"<br><i>{len(self.rows) - limit} further checks with lower utilisation</i>"
                if len(self.rows) > limit else "")
        notes = "".join(f"<br><i>{esc(n)}</i>" for n in self.notes)
        return (f"<div>{head}{part_table}<table><tr><th>check</th><th>utilisation</th><th></th><th>clause</th></tr>"
                + "".join(rows) + f"</table>{more}{notes}</div>")


def _failure(err: BaseException) -> Summary:
    if isinstance(err, InputError):
        return Summary(error=str(err), error_field=str(err.field))
    return Summary(error=f"the design could not run ({type(err).__name__}: {err})")


def _sorted_rows(records: Any) -> tuple[SummaryRow, ...]:
    # checks made only: information and NOT CHECKED records are listed by _not_checked / shown in the calc
    recs = sorted((r for r in records if r.is_check),
                  key=lambda r: (-(r.utilisation if math.isfinite(r.utilisation) else math.inf), r.id))
    return tuple(SummaryRow(r.id, r.title, r.clause, float(r.utilisation), bool(r.ok)) for r in recs)


def _not_checked(records: Any) -> list[str]:
    """A NOT CHECKED record is never silent: one note naming them."""
    from ..core.record import NOT_CHECKED
    names = [r.title for r in records if getattr(r, "status", "") == NOT_CHECKED]
    return [f"NOT CHECKED (see the calc package): {'; '.join(names)}."] if names else []


def design_summary(source: FormState | Job) -> Summary:
    """Validate (a form) and run the whole job on the plain-float path (see the module docstring)."""
    try:
        job = source.to_job() if isinstance(source, FormState) else source
        if not isinstance(job, Job):
            raise InputError("job", type(job).__name__, "a FormState or a splicecalc.job.Job")
        from ..workflow import run_calc
        from ..workflow.parts import job_parts
        try:
            result = run_calc(job, render=False)
        except Exception as whole_err:  # the job is valid (above): a part that cannot be designed  # a later part failed: show the beam, say why the rest is missing
            from ..design.beam import design_beam
            d = design_beam(job, render=False)
            gov = d.governing_record
            why = str(whole_err) if isinstance(whole_err, InputError) else f"{type(whole_err).__name__}: {whole_err}"
            notes = [*job.notes, *_not_checked(d.records), f"Only the beam is summarised: the rest of the job could not be designed ({why})."]
            return Summary(ok=False, message=d.message, section=d.section.designation if d.section else "",
                           rows=_sorted_rows(d.records), governing=gov.id if gov is not None else "",
                           notes=tuple(notes))
    except Exception as err:  # shown in the form as one line, never a traceback
        return _failure(err)
    parts = []
    for p in job_parts(result):
        g = p.governing
        parts.append(PartRow(p.key, p.title, len(p.records),
                             p.short_title(g) if g is not None else "(no checks recorded)",
                             float(p.utilisation) if g is not None else math.nan, bool(p.ok)))
    gov = result.governing
    return Summary(ok=bool(result.ok), message=result.headline, section=result.design.section.designation,
                   rows=_sorted_rows(result.records), governing=gov.id if gov is not None else "",
                   notes=(*job.notes, *_not_checked(result.records)), parts=tuple(parts))


class SummaryCache:
    """Keeps the last summary per canonical job, so an unchanged job is not designed twice."""

    def __init__(self) -> None:
        self._key: Any = None
        self._value: Summary | None = None
        self.runs = 0

    def get(self, state: FormState) -> Summary:
        job, err = state.check()
        if err is not None:
            return _failure(err)
        from .files import job_sha256
        try:
            key = job_sha256(job)
        except Exception as e:  # a job that cannot be serialised: design it anyway
            key = ("unserialisable", repr(e))
        if key != self._key or self._value is None:
            self.runs += 1
            self._value = design_summary(job)
            self._key = key
        return self._value


__all__ = ["PartRow", "Summary", "SummaryRow", "SummaryCache", "design_summary"]
