"""Build a calc-package PDF from a notebook: execute, export, compile, write atomically.

>>> report = build_pdf("notebooks/demo_cross_section.ipynb", "out/demo_cross_section.pdf")  # doctest: +SKIP
>>> report.pages, report.wide_boxes                                                          # doctest: +SKIP
(6, [])

An issued revision is never overwritten: the sign-off step writes a sidecar
``<name>.pdf.json`` with ``{"issued": true}`` next to the PDF and
:func:`is_protected` reads it.
"""

from __future__ import annotations

import shutil
import sys
import time
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from ..core.errors import InputError, require_non_negative, require_positive
from ..core.files import write_atomic
from ..signoff.ledger import is_protected, sidecar_path
from .compile import LatexRun, require_tool
from .errors import CalcBuildError, ProtectedPDFError
from .kernel import KernelLaunch
from .latexfix import BadBox
from .metadata import calc_metadata
from .pandocwork import PandocWork

#: overfull boxes up to this width are typographic noise; wider ones are layout faults
OVERFULL_LIMIT_PT = 5.0


@dataclass
class BuildReport:
    """What a build did and how long each part took (seconds).

    ``total_s`` runs from the kernel's launch (or the start of :func:`build_pdf`) to
    the PDF written; ``execution_s`` = ``kernel_start_s`` + ``cells_s``; ``latex_s``
    is the XeLaTeX passes (``latex_seeded``: the first pass read the previous build's
    .aux/.toc/.out). :attr:`overhead_s` is what is left of the total: everything but the
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
    latex_seeded: bool = False
    #: characters the fonts lack, left out of the PDF (never silently: the build warns)
    missing_chars: list[str] = field(default_factory=list)
    #: the inputs digest when the cells were up to date and not executed (their outputs reused,
    #: :mod:`splicecalc.report.uptodate`), else ""
    cells_reused: str = ""

    @property
    def overhead_s(self) -> float:
        """Our overhead: the total less the kernel start and the XeLaTeX passes (the cells, the
        export work not hidden behind them, the writes)."""
        return max(self.total_s - self.kernel_start_s - self.latex_s, 0.0)

    @property
    def wide_boxes(self) -> list[BadBox]:
        """Overfull hboxes wider than :attr:`overfull_limit_pt` (should be none)."""
        return [b for b in self.overfull if b.kind == "hbox" and b.amount_pt > self.overfull_limit_pt]

    def reuse_line(self) -> str:
        """The one line saying the cells were not executed, or ""."""
        return (f"cells up to date, not executed (inputs digest {self.cells_reused[:16]})"
                if self.cells_reused else "")

    def summary(self) -> str:
        wide = self.wide_boxes
        return ((self.reuse_line() + "\n" if self.cells_reused else "") + f"{self.pdf_path} ({self.pages} sheets): execution {self.execution_s:.1f} s "
                f"(kernel start {self.kernel_start_s:.1f} s, cells {self.cells_s:.1f} s), LaTeX {self.latex_passes} "
                f"pass{'' if self.latex_passes == 1 else 'es'}{' (seeded)' if self.latex_seeded else ''} "
                f"{self.latex_s:.1f} s, our overhead {self.overhead_s:.1f} s, total {self.total_s:.1f} s; "
                + ("no overfull box" if not wide else
                   f"{len(wide)} overfull box(es) > {self.overfull_limit_pt:g} pt, see {self.log_path}"))


def _save(path: Path, nb: Any) -> None:
    """Write the executed notebook atomically."""
    import nbformat

    path.parent.mkdir(parents=True, exist_ok=True)
    write_atomic(path, nbformat.writes(nb).encode("utf-8"))


def build_pdf(notebook_path: str | Path, pdf_path: str | Path, execute: bool = True, progress: bool = True,
              timeout: float = 300.0, overfull_limit_pt: float = OVERFULL_LIMIT_PT,
              build_dir: str | Path | None = None, executed_path: str | Path | None = None,
              kernel: KernelLaunch | None = None, inputs_digest: str | None = None,
              reuse: dict | None = None, seed: bool = True, previous: dict[str, Any] | None = None,
              changes_note: str = "") -> BuildReport:
    """Execute ``notebook_path`` (unless ``execute=False``) and write the calc package to ``pdf_path``.

    The PDF appears under its final name only when complete (temporary file
    + ``os.replace``); an issued PDF (:func:`is_protected`) is refused before
    any work. The LaTeX source and log stay in ``build_dir`` (default
    ``<pdf folder>/.build/<pdf stem>/``). ``executed_path``, if given,
    receives the executed notebook (written atomically). ``timeout`` (s) is
    per cell. ``kernel``: a kernel launched beforehand in the notebook's folder
    (:class:`~splicecalc.report.kernel.KernelLaunch`); the caller discards it if
    this function stops before running it. ``inputs_digest``: the digest of the cells' inputs
    (:func:`splicecalc.report.uptodate.cells_inputs`), stored in the executed notebook's metadata;
    ``reuse``: an executed notebook with that digest whose outputs stand for this run's
    (:func:`~splicecalc.report.uptodate.reusable_outputs`): the cells are not executed. ``seed=False``
    starts the XeLaTeX passes from nothing. ``previous``: the previous issued revision to mark
    changes against (``revision``, executed ``notebook`` dict, ``name``; see
    :class:`~splicecalc.report.exporter.ChangeMarkPreprocessor`); ``changes_note``: why changes are
    not marked although a revision was issued before (printed on the cover).
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

    # nbclient and nbconvert are imported here, not with this module: a build launches its kernel
    # first (workflow.package), after importing this module for is_protected
    import nbformat

    from .execute import execute_notebook

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
    reused = ""
    # pandoc's conversions start now, beside the kernel's cells (report.pandocwork); same text
    pandoc = PandocWork(nb_path.parent)
    try:
        if execute and reuse is not None and inputs_digest:
            from .uptodate import with_outputs

            nb = with_outputs(nb, reuse)
            reused = inputs_digest              # said in one line by BuildReport.reuse_line / summary
            pandoc.start_notebook(nb)
        elif execute:
            for cell in nb.cells:
                if cell.cell_type == "markdown":
                    pandoc.start_cell(cell)
            nb = execute_notebook(nb, cwd=nb_path.parent, timeout=timeout, progress=progress, timings=timings,
                                  kernel=kernel, on_cell_done=pandoc.start_cell)
            execution_s = timings.get("kernel_start_s", 0.0) + timings.get("cells_s", 0.0)
        else:
            pandoc.start_notebook(nb)
        return _export(nb, nb_path, out, work, execute, executed_path, inputs_digest, seed, progress, pandoc,
                       t0, timings, execution_s, reused, overfull_limit_pt, previous, changes_note)
    finally:
        pandoc.close()


def _export(nb: Any, nb_path: Path, out: Path, work: Path, execute: bool, executed_path: str | Path | None,
            inputs_digest: str | None, seed: bool, progress: bool, pandoc: PandocWork, t0: float,
            timings: dict[str, float], execution_s: float, reused: str, overfull_limit_pt: float,
            previous: dict[str, Any] | None, changes_note: str) -> BuildReport:
    """The second half of :func:`build_pdf`: the executed notebook saved, the LaTeX, XeLaTeX, the PDF."""
    from .exporter import CalcPackageExporter

    if execute and inputs_digest:
        from .uptodate import INPUTS_KEY

        nb.metadata.setdefault("splicecalc", {})[INPUTS_KEY] = inputs_digest
    ep = Path(executed_path) if execute and executed_path is not None else None
    if ep is not None:                  # kept even if the export fails: the cell named can be looked at
        _save(ep, nb)
    # the previous build of this output seeds the XeLaTeX passes (splicecalc.report.compile)
    seed_dir = out.parent / ".build" / f"{out.stem}.seed"
    if not seed:
        shutil.rmtree(seed_dir, ignore_errors=True)
    exporter = CalcPackageExporter(progress=progress, build_directory=str(work), seed_directory=str(seed_dir),
                                   pandoc_work=pandoc)
    resources: dict[str, Any] = {"metadata": {"name": nb_path.stem, "path": str(nb_path.parent)}}
    if previous:
        resources["previous"] = previous
    if changes_note:
        resources["changes_note"] = changes_note
    pdf_bytes, resources = exporter.from_notebook_node(nb, resources)
    run: LatexRun = resources["latex_run"]

    if is_protected(out):   # signed while we were building
        raise ProtectedPDFError(str(out))
    write_atomic(out, pdf_bytes)

    report = BuildReport(pdf_path=out, log_path=run.log_path, tex_path=run.log_path.with_suffix(".tex"),
                         pages=run.pages, latex_passes=run.passes, latex_seeded=run.seeded,
                         execution_s=execution_s, kernel_start_s=timings.get("kernel_start_s", 0.0),
                         cells_s=timings.get("cells_s", 0.0), latex_s=run.seconds,
                         total_s=time.perf_counter() - t0, overfull=run.overfull,
                         overfull_limit_pt=overfull_limit_pt, missing_chars=list(run.missing_chars),
                         cells_reused=reused)
    if report.wide_boxes and progress:
        print(f"warning: {len(report.wide_boxes)} overfull box(es) wider than {overfull_limit_pt:g} pt:\n  "
              + "\n  ".join(str(b) for b in report.wide_boxes), file=sys.stderr)
    return report


__all__ = ["BuildReport", "build_pdf", "is_protected", "sidecar_path", "write_atomic", "OVERFULL_LIMIT_PT",
           "CalcBuildError"]
