"""Export work done while the kernel runs: pandoc conversions and a ready exporter.

A build has two cores and, while the kernel computes, the build process only
waits for messages. :class:`ExportPrefetch` uses that time:

* the exporter (nbconvert, our LaTeX template compiled by Jinja) is made in a
  background thread;
* every markdown block the template will hand to pandoc is converted as soon as
  it is known: the notebook's markdown cells at once, each code cell's markdown
  outputs when the kernel has finished that cell (:meth:`ExportPrefetch.add_cell`).

During the export :meth:`PandocPrefetch.installed` answers the template's pandoc
calls from those results; a call not foreseen runs as before. Same text out
(tests/test_render_memo.py compares the LaTeX with and without it).
"""

from __future__ import annotations

import os
import threading
from concurrent.futures import Future, ThreadPoolExecutor
from contextlib import contextmanager
from typing import Any, Iterable, Iterator

#: pandoc reader of the template's markdown blocks (``data_markdown`` and the first step of ``markdowncell``)
MD_FORMAT = "markdown+tex_math_double_backslash"

_Job = tuple[str, str, str, tuple[str, ...]]


def _snapshot(cell: Any) -> tuple[str, str, list[tuple[str, dict]]]:
    """What the pandoc jobs of a cell depend on, copied (the build adds figure PDFs to outputs later)."""
    outs = [(out.get("output_type", ""), dict(out.get("data") or {})) for out in cell.get("outputs", [])]
    return cell.cell_type, cell.get("source", ""), outs


def cell_jobs(snapshot: tuple[str, str, list[tuple[str, dict]]], priority: list[str]) -> list[_Job]:
    """The pandoc calls the template makes for one cell whose input is known: (source, from, to, args).

    Markdown outputs shown as markdown (no richer MIME type ahead of ``text/markdown``
    in ``priority``) go to LaTeX; markdown cells go to pandoc's JSON first. The
    sources pass through the same filters as in the template.
    """
    from nbconvert.filters import citation2latex, strip_files_prefix

    kind, source, outputs = snapshot
    rank = {m: i for i, m in enumerate(priority)}
    jobs: list[_Job] = []
    if kind == "markdown" and source:
        jobs.append((strip_files_prefix(citation2latex(source)), MD_FORMAT, "json", ()))
    for output_type, data in outputs:
        md = data.get("text/markdown")
        if md is None or output_type not in ("display_data", "execute_result"):
            continue
        if min((rank.get(m, len(rank)) for m in data), default=len(rank)) == rank.get("text/markdown"):
            jobs.append((strip_files_prefix(citation2latex(md)), MD_FORMAT, "latex", ()))
    return jobs


class PandocPrefetch:
    """pandoc calls run side by side in ``pool`` and answered from memory during the export.

    ``nb_dir`` is the notebook's folder, as nbconvert's LaTeX exporter passes it to the
    template (a markdown cell's second call, JSON -> LaTeX, is foreseen through the
    template's own filters with it). ``priority``: the exporter's display priority
    (default :data:`splicecalc.report.display.DISPLAY_PRIORITY`).
    """

    def __init__(self, pool: ThreadPoolExecutor, nb_dir: str, priority: list[str] | None = None) -> None:
        self._pool = pool
        self._nb_dir = nb_dir
        self._priority = list(priority) if priority is not None else None
        self._lock = threading.Lock()
        self._jobs: dict[_Job, Future] = {}
        self._done: dict[_Job, str] = {}
        self._cells: list[Future] = []

    def add_cells(self, cells: Iterable[Any]) -> None:
        """Queue the pandoc calls of ``cells`` (a call already queued is not repeated)."""
        for cell in cells:
            self._cells.append(self._pool.submit(self._plan, _snapshot(cell)))

    def _plan(self, snapshot: tuple[str, str, list[tuple[str, dict]]]) -> None:
        if self._priority is None:
            from .display import DISPLAY_PRIORITY   # the exporter's (imported here, off the main thread)

            self._priority = list(DISPLAY_PRIORITY)
        for job in cell_jobs(snapshot, self._priority):
            with self._lock:
                if job in self._jobs:
                    continue
                self._jobs[job] = self._pool.submit(self._run, job)

    def _run(self, job: _Job) -> None:
        import nbconvert.filters.pandoc as fp
        from nbconvert.filters.filter_links import resolve_references

        src, fmt, to, args = job
        try:
            out = fp.pandoc(src, fmt, to, extra_args=list(args))
            self._done[job] = out
            if to == "json":
                relative = fp.ConvertExplicitlyRelativePaths(
                    texinputs=os.path.abspath(self._nb_dir) if self._nb_dir else os.getcwd())
                second = relative(resolve_references(out))
                self._done[(second, "json", "latex", ())] = fp.pandoc(second, "json", "latex")
        except Exception:  # noqa: BLE001 - the template's own call runs again and reports it
            pass

    def wait(self) -> None:
        """Wait until every queued call has run."""
        for f in list(self._cells):
            f.result()
        with self._lock:
            jobs = list(self._jobs.values())
        for f in jobs:
            f.result()

    @contextmanager
    def installed(self) -> Iterator[None]:
        """nbconvert's pandoc filter answers from the results within this block."""
        import nbconvert.filters.pandoc as fp

        self.wait()
        original = fp.pandoc
        done = self._done

        def memo(source: str, fmt: str, to: str, extra_args: Any = None, encoding: str = "utf-8") -> str:
            hit = done.get((source, fmt, to, tuple(extra_args or ()))) if encoding == "utf-8" else None
            return hit if hit is not None else original(source, fmt, to, extra_args=extra_args, encoding=encoding)

        fp.pandoc = memo
        try:
            yield
        finally:
            fp.pandoc = original


def pandoc_pool() -> ThreadPoolExecutor:
    """Threads for pandoc calls (each call is a process of its own: threads only wait)."""
    return ThreadPoolExecutor(max_workers=min(8, 2 * (os.cpu_count() or 1)), thread_name_prefix="splicecalc-pandoc")


def _make_exporter(options: dict[str, Any]) -> Any:
    from .exporter import CalcPackageExporter

    exporter = CalcPackageExporter(**options)
    exporter.template   # noqa: B018 - loads and compiles the Jinja template now
    return exporter


class ExportPrefetch:
    """The export work a build can do while its kernel runs (see the module docstring).

    ``nb``: the notebook about to run (its markdown cells are converted at once);
    ``nb_dir``: its folder; ``exporter_options``: keyword arguments of
    :class:`~splicecalc.report.exporter.CalcPackageExporter`.
    """

    def __init__(self, nb: Any, nb_dir: str, exporter_options: dict[str, Any]) -> None:
        self._pool = pandoc_pool()
        self._exporter = self._pool.submit(_make_exporter, dict(exporter_options))
        self.pandoc = PandocPrefetch(self._pool, nb_dir)
        self.pandoc.add_cells(c for c in nb.cells if c.cell_type == "markdown")

    def add_cell(self, cell: Any) -> None:
        """A code cell the kernel has finished: convert its markdown outputs now."""
        self.pandoc.add_cells([cell])

    def exporter(self) -> Any:
        """The exporter, made in the background, answering pandoc calls from this prefetch."""
        exporter = self._exporter.result()
        exporter.pandoc_prefetch = self.pandoc
        return exporter

    def close(self) -> None:
        self._pool.shutdown(wait=False, cancel_futures=True)


__all__ = ["ExportPrefetch", "MD_FORMAT", "PandocPrefetch", "cell_jobs", "pandoc_pool"]
