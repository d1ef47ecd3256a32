"""What a notebook shows only to the person working in Jupyter stays out of the calc package.

Two nbconvert preprocessors run by :class:`~splicecalc.report.exporter.CalcPackageExporter`
(also when the package is exported from Jupyter's menu):

* :class:`LiveOnlyOutputsPreprocessor` drops the outputs of cells tagged ``form``
  (the job form) and every interactive widget view, whatever cell shows it: a
  widget has no meaning on paper, and its plain-text stand-in ("Job form for
  job.toml ...") must not be printed as if it were part of the calculation;
* :class:`StaleInputsPreprocessor` refuses to print a notebook whose calc ran with
  other inputs than the job file now holds (the form saved new values, the
  notebook was not run again): the package would print the old values with
  nothing to say so. :func:`job_file_drift` compares the canonical job inputs the
  notebook published with those of the job file its parameters cell names, in the
  notebook's folder.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

from nbconvert.preprocessors import Preprocessor
from traitlets import Bool

from .errors import CalcBuildError

#: tag of the cells whose outputs exist only in a live session
LIVE_ONLY_TAGS: frozenset[str] = frozenset({"form"})
#: MIME type of an ipywidgets view
WIDGET_VIEW_MIME = "application/vnd.jupyter.widget-view+json"


class LiveOnlyOutputsPreprocessor(Preprocessor):
    """Remove the job form's outputs and widget views from the notebook being exported."""

    enabled = Bool(True).tag(config=True)        # on in every export (nbconvert's default is off)

    def preprocess(self, nb: Any, resources: Any) -> tuple[Any, Any]:
        for cell in nb.cells:
            if cell.cell_type != "code":
                continue
            tags = set(cell.get("metadata", {}).get("tags", []))
            if tags & LIVE_ONLY_TAGS:
                cell.outputs = []
                continue
            outs = cell.get("outputs", [])
            kept = [o for o in outs if WIDGET_VIEW_MIME not in o.get("data", {})]
            if len(kept) != len(outs):
                cell.outputs = kept
        nb.metadata.pop("widgets", None)
        return nb, resources


def job_file_drift(nb: Any, folder: str | Path) -> str | None:
    """Why the job file no longer matches the inputs the notebook printed, or None (also when the
    notebook names no job file or published no inputs: nothing to compare)."""
    from ..core.errors import InputError
    from ..signoff.digest import canonical_json, job_inputs
    from ..signoff.notebook import job_file_name

    printed = job_inputs(nb)
    name = job_file_name(nb)
    if not printed or not name:
        return None
    path = Path(folder) / name
    if not path.is_file():
        return f"the job file {name} named by the notebook is missing"
    from ..job import load_job

    try:
        now = load_job(path).to_canonical_dict()
    except InputError as exc:
        return f"the job file {name} no longer loads ({exc})"
    if canonical_json(now) != canonical_json(printed):
        return f"the job file {name} changed since the notebook was executed"
    return None


class StaleInputsPreprocessor(Preprocessor):
    """Refuse to print a notebook whose outputs were computed from other inputs than its job file."""

    enabled = Bool(True).tag(config=True)

    def preprocess(self, nb: Any, resources: Any) -> tuple[Any, Any]:
        folder = (resources or {}).get("metadata", {}).get("path", "")
        if not folder:
            return nb, resources           # the notebook's folder is unknown: nothing to compare with
        why = job_file_drift(nb, folder)
        if why is not None:
            raise CalcBuildError(f"not printed: {why}, so the notebook's results are out of date. Run all "
                                 "cells again (Run > Run All Cells), save, then export; or build with "
                                 "`splicecalc build`.")
        return nb, resources


__all__ = ["job_file_drift", "LIVE_ONLY_TAGS", "LiveOnlyOutputsPreprocessor", "StaleInputsPreprocessor", "WIDGET_VIEW_MIME"]
