"""The job input form: a plain :class:`FormState` (testable without a browser) and the
ipywidgets :class:`JobForm` on top of it, bound to a TOML job file.

In a calc template (first code cell)::

    from splicecalc.form import JobForm
    form = JobForm("job.toml")      # loads job.toml if it exists; Save writes it atomically
    form

and further down the calc runs from the saved file (``load_job("job.toml")``), so
what was typed is what gets printed. Modules:

* :mod:`.state`: :class:`FormState`, field values -> job dict -> TOML text, no widgets;
* :mod:`.files`: :class:`FormFile` (open, atomic save, unsaved / changed-on-disk flags)
  and :func:`package_status` (is the printed PDF built from the current job file?);
* :mod:`.summary`: the live utilisation summary (beam design on the plain-float path);
* :mod:`.pick`: section search; :mod:`.debounce`: recompute once after a burst of edits;
* :mod:`.widget`: :class:`JobForm`, the ipywidgets layer (imported on first use).

Layer: above ``design`` and ``signoff`` (like ``report``); nothing below imports it.
"""

from __future__ import annotations

from typing import Any

from .files import FormFile, FormStatus, PackageStatus, job_sha256, package_status
from .state import FormState
from .summary import Summary, SummaryCache, design_summary


def __getattr__(name: str) -> Any:
    # the widget class imports ipywidgets: only when asked for
    if name == "JobForm":
        from .widget import JobForm
        return JobForm
    raise AttributeError(name)


__all__ = ["FormFile", "FormState", "FormStatus", "JobForm", "PackageStatus", "Summary", "SummaryCache",
           "design_summary", "job_sha256", "package_status"]
