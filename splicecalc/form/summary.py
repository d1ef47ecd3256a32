"""The live utilisation summary of the form: the beam design on the plain-float path.

:func:`design_summary` validates the form, runs
:func:`splicecalc.design.beam.design_beam` (``render=False``, so no handcalcs
work) and keeps the check records, highest utilisation first. Bad input gives
a summary holding the :class:`~splicecalc.core.errors.InputError` message,
which names the field; any other failure gives a one-line message. The
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

    def text(self) -> str:
        """Plain-text summary (one line per check)."""
        if self.error:
            return "Cannot design: " + self.error
        lines = [self.message]
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
        return (f"<div>{head}<table><tr><th>check</th><th>utilisation</th><th></th><th>clause</th></tr>"
                + "".join(rows) + f"</table>{more}{notes}</div>")


def _failure(err: BaseException) -> Summary:
    if isinstance(err, InputError):
        return Summary(error=str(err), error_field=str(err.field))
    return Summary(error=f"the design could not run ({type(err).__name__}: {err})")


def design_summary(source: FormState | Job) -> Summary:
    """Validate (a form) and run the beam design on the plain-float path."""
    try:
        job = source.to_job() if isinstance(source, FormState) else source
        if not isinstance(job, Job):
            raise InputError("job", type(job).__name__, "a FormState or a splicecalc.job.Job")
        from ..design.beam import design_beam
        d = design_beam(job, render=False)
    except Exception as err:  # shown in the form as one line, never a traceback
        return _failure(err)
    recs = sorted((r for r in d.records if r.is_check),       # information / NOT CHECKED: in the calc
                  key=lambda r: (-(r.utilisation if math.isfinite(r.utilisation) else math.inf), r.id))
    gov = d.governing_record
    rows = tuple(SummaryRow(r.id, r.title, r.clause, float(r.utilisation), bool(r.ok)) for r in recs)
    notes: list[str] = list(job.notes)
    if job.splices is not None or job.supports:
        notes.append("Splices and end connections are checked in the calc package, not in this summary.")
    return Summary(ok=bool(d.ok), message=d.message, section=d.section.designation if d.section else "",
                   rows=rows, governing=gov.id if gov is not None else "", notes=tuple(notes))


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


__all__ = ["Summary", "SummaryRow", "SummaryCache", "design_summary"]
