"""Build a calc-package PDF from a notebook: execute, export, compile, write atomically.

>>> report = build_pdf("notebooks/demo_cross_section.ipynb", "out/demo_cross_section.pdf")  # doctest: +SKIP
>>> report.pages, report.wide_boxes                                                          # doctest: +SKIP
(6, [])

An issued revision is never overwritten: the sign-off step writes a sidecar
``<name>.pdf.json`` with ``{"issued": true}`` next to the PDF and
:func:`is_protected` reads it.
"""

from __future__ import annotations

import re
import shutil
import sys
import threading
import time
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import nbformat

from ..core.errors import InputError, require_non_negative, require_positive
from ..core.files import write_atomic
from ..signoff.ledger import is_protected, sidecar_path
from .compile import LatexRun, require_tool
from .errors import CalcBuildError, ProtectedPDFError
from .execute import execute_notebook
from .kernel import KernelLaunch
from .figures import FigureDrawer, fill_figures, mark_pending, real_figure_files, unmark_pending
from .prefetch import ExportPrefetch
from .latexfix import BadBox
from .metadata import calc_metadata

#: overfull boxes up to this width are typographic noise; wider ones are layout faults
OVERFULL_LIMIT_PT = 5.0


@dataclass
class BuildReport:
    """What a build did and how long each part took (seconds).

    ``total_s`` runs from the kernel's launch (or the start of :func:`build_pdf`) to
    the PDF written; ``execution_s`` = ``kernel_start_s`` + ``cells_s``; ``latex_s``
    is the XeLaTeX passes. Parts overlap (the export work runs while the kernel
    computes), so :attr:`overhead_s` is what is left of the total: everything but the
    kernel start and the TeX engine, cells included.
    """

    pdf_path: Path
    log_path: Path
    tex_path: Path
    pages: int
    latex_passes: int
    execution_s: float = 0.0
    kernel_start_s: float = 0.0
    cells_s: float = 0.0
    latex_s: float = 0.0
    total_s: float = 0.0
    overfull: list[BadBox] = field(default_factory=list)
    overfull_limit_pt: float = OVERFULL_LIMIT_PT

    @property
    def overhead_s(self) -> float:
        """Our overhead: the total less the kernel start and the XeLaTeX passes (the cells, the
        export work not hidden behind them, the writes)."""
        return max(self.total_s - self.kernel_start_s - self.latex_s, 0.0)

    @property
    def wide_boxes(self) -> list[BadBox]:
        """Overfull hboxes wider than :attr:`overfull_limit_pt` (should be none)."""
        return [b for b in self.overfull if b.kind == "hbox" and b.amount_pt > self.overfull_limit_pt]

    def summary(self) -> str:
        wide = self.wide_boxes
        return (f"{self.pdf_path} ({self.pages} sheets): execution {self.execution_s:.1f} s "
                f"(kernel start {self.kernel_start_s:.1f} s, cells {self.cells_s:.1f} s), LaTeX {self.latex_passes} "
                f"passes {self.latex_s:.1f} s, our overhead {self.overhead_s:.1f} s, total {self.total_s:.1f} s; "
                + ("no overfull box" if not wide else
                   f"{len(wide)} overfull box(es) > {self.overfull_limit_pt:g} pt, see {self.log_path}"))


def _save(path: Path, nb: Any) -> None:
    """Write the executed notebook atomically."""
    path.parent.mkdir(parents=True, exist_ok=True)
    write_atomic(path, nbformat.writes(nb).encode("utf-8"))


def _save_quietly(path: Path, nb: Any) -> None:
    """Write the executed notebook of a build that failed after execution (figure stand-ins removed)."""
    try:
        unmark_pending(nb)
        _save(path, nb)
    except Exception:  # noqa: BLE001 - the build's own error is the one to report
        pass


class _Background:
    """Run ``fn`` in a thread; :meth:`join` waits and raises what it raised."""

    def __init__(self, fn: Any) -> None:
        self._error: BaseException | None = None

        def run() -> None:
            try:
                fn()
            except BaseException as err:  # noqa: BLE001 - handed to join()
                self._error = err

        self._thread = threading.Thread(target=run, name="splicecalc-save")
        self._thread.start()

    def join(self, raise_error: bool = True) -> None:
        self._thread.join()
        if self._error is not None and raise_error:
            raise self._error


_PAGES_RE = re.compile(r"Output written on .*?\((\d+) pages?")


def build_pdf(notebook_path: str | Path, pdf_path: str | Path, execute: bool = True, progress: bool = True,
              timeout: float = 300.0, overfull_limit_pt: float = OVERFULL_LIMIT_PT,
              build_dir: str | Path | None = None, executed_path: str | Path | None = None,
              kernel: KernelLaunch | None = None) -> BuildReport:
    """Execute ``notebook_path`` (unless ``execute=False``) and write the calc package to ``pdf_path``.

    The PDF appears under its final name only when complete (temporary file
    + ``os.replace``); an issued PDF (:func:`is_protected`) is refused before
    any work. The LaTeX source and log stay in ``build_dir`` (default
    ``<pdf folder>/.build/<pdf stem>/``). ``executed_path``, if given,
    receives the executed notebook (written atomically). ``timeout`` (s) is
    per cell. ``kernel``: a kernel launched beforehand in the notebook's folder
    (:class:`~splicecalc.report.kernel.KernelLaunch`); the caller discards it if
    this function stops before running it.
    """
    t0 = kernel.launched_at if kernel is not None else time.perf_counter()
    nb_path = Path(notebook_path)
    out = Path(pdf_path)
    if nb_path.suffix != ".ipynb" or not nb_path.is_file():
        raise InputError("notebook_path", str(notebook_path), "an existing .ipynb file")
    if out.suffix.lower() != ".pdf":
        raise InputError("pdf_path", str(pdf_path), "a file name ending in .pdf")
    require_positive("timeout", timeout, "s")
    require_non_negative("overfull_limit_pt", overfull_limit_pt, "pt")
    if is_protected(out):
        raise ProtectedPDFError(str(out))
    require_tool("xelatex")
    require_tool("pandoc")

    nb = nbformat.read(nb_path, as_version=4)
    calc_metadata(nb.metadata, default_title=nb_path.stem)   # bad metadata fails before any cell runs
    out.parent.mkdir(parents=True, exist_ok=True)
    if build_dir is not None:
        work = Path(build_dir)            # the caller's folder: never emptied
    else:
        work = out.parent / ".build" / out.stem
        if work.exists():
            shutil.rmtree(work)           # ours: start clean so no stale .aux/.toc is read
    work.mkdir(parents=True, exist_ok=True)

    timings: dict[str, float] = {}
    execution_s = 0.0
    # while the kernel computes, this process makes the exporter and converts markdown with pandoc,
    # and a worker process draws each figure as soon as its output arrives (two cores: the waiting is used)
    prefetch = ExportPrefetch(nb, str(nb_path.parent), dict(progress=progress, build_directory=str(work)))
    drawer = FigureDrawer(cwd=str(nb_path.parent)) if execute else None   # where the kernel would draw
    ep = Path(executed_path) if execute and executed_path is not None else None
    saving: _Background | None = None
    try:
        if execute:
            nb = execute_notebook(nb, cwd=nb_path.parent, timeout=timeout, progress=progress, timings=timings,
                                  after_cell=prefetch.add_cell, after_output=drawer.submit_output, kernel=kernel,
                                  draw_figures=False)
            execution_s = timings.get("kernel_start_s", 0.0) + timings.get("cells_s", 0.0)
        try:
            # the LaTeX is laid out while the worker finishes the last figures (stand-ins until then);
            # without a worker the figures are drawn first, once
            if drawer is None:
                fill_figures(nb)
            pending = mark_pending(nb)
            exporter = prefetch.exporter()
            resources: dict[str, Any] = {"metadata": {"name": nb_path.stem, "path": str(nb_path.parent)}}
            latex, resources = exporter.to_latex(nb, resources)
            real_figure_files(resources.get("outputs") or {}, pending, drawer)
            fill_figures(nb, drawer)
        except BaseException:
            if ep is not None:          # keep what ran, so the cell or figure named can be looked at
                _save_quietly(ep, nb)
            raise
        if drawer is not None:
            drawer.close()
        if ep is not None:              # written while XeLaTeX runs (a process of its own)
            saving = _Background(lambda: _save(ep, nb))
        pdf_bytes, resources = exporter.compile(latex, resources)
    except BaseException:
        if saving is not None:
            saving.join(raise_error=False)   # the build's own error is the one to report
        raise
    finally:
        prefetch.close()
        if drawer is not None:
            drawer.close()
    if saving is not None:
        saving.join()
    run: LatexRun = resources["latex_run"]

    if is_protected(out):   # signed while we were building
        raise ProtectedPDFError(str(out))
    write_atomic(out, pdf_bytes)

    log_text = run.log_path.read_text(encoding="utf-8", errors="replace")
    m = _PAGES_RE.search(log_text)
    report = BuildReport(pdf_path=out, log_path=run.log_path, tex_path=run.log_path.with_suffix(".tex"),
                         pages=int(m.group(1)) if m else 0, latex_passes=run.passes,
                         execution_s=execution_s, kernel_start_s=timings.get("kernel_start_s", 0.0),
                         cells_s=timings.get("cells_s", 0.0), latex_s=run.seconds,
                         total_s=time.perf_counter() - t0, overfull=run.overfull,
                         overfull_limit_pt=overfull_limit_pt)
    if report.wide_boxes and progress:
        print(f"warning: {len(report.wide_boxes)} overfull box(es) wider than {overfull_limit_pt:g} pt:\n  "
              + "\n  ".join(str(b) for b in report.wide_boxes), file=sys.stderr)
    return report


__all__ = ["BuildReport", "build_pdf", "is_protected", "sidecar_path", "write_atomic", "OVERFULL_LIMIT_PT",
           "CalcBuildError"]
