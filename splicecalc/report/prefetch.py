"""Export work done while the kernel runs: pandoc conversions and a ready exporter.

A build has two cores and, while the kernel computes, the build process only
waits for messages. :class:`ExportPrefetch` uses that time:

* the exporter (nbconvert, our LaTeX template compiled by Jinja) is made in a
  background thread;
* every markdown block the template will hand to pandoc is converted ahead of the
  template's own calls: the notebook's markdown cells at once (mostly from the cache),
  the code cells' markdown outputs in one call when the export starts
  (:meth:`ExportPrefetch.add_cell`, :meth:`ExportPrefetch.exporter`).

During the export :meth:`PandocPrefetch.installed` answers the template's pandoc
calls from those results; a call not foreseen runs as before. Same text out
(tests/test_render_memo.py compares the LaTeX with and without it).
"""

from __future__ import annotations

import hashlib
import json
import os
import re
import shutil
import threading
from concurrent.futures import Future, ThreadPoolExecutor
from contextlib import contextmanager
from pathlib import Path
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


#: a paragraph put between markdown blocks converted in one pandoc call (LaTeX keeps it as a line)
_BREAK = "SPLICECALCBREAK{:04d}"
_BREAK_RE = re.compile(r"\n\nSPLICECALCBREAK\d{4}\n\n")
#: what makes a markdown block depend on the others in one document: a heading (ATX, or setext
#: underline; pandoc labels headings uniquely per document) or a bracket (links to headings or to
#: reference definitions elsewhere, footnotes)
_CONTEXT_RE = re.compile(r"^ {0,3}(#{1,6}(\s|$)|=+\s*$|-+\s*$)|\[", re.M)
#: most entries kept in the cache of converted markdown cells
CACHE_MAX = 4000


def _cache_file() -> Path | None:
    """The cache of markdown-cell conversions for the pandoc on PATH (None without pandoc)."""
    exe = shutil.which("pandoc")
    if exe is None:
        return None
    st = os.stat(exe)
    tag = hashlib.sha256(f"{os.path.realpath(exe)}|{st.st_size}|{st.st_mtime_ns}".encode()).hexdigest()[:16]
    base = Path(os.environ.get("XDG_CACHE_HOME") or Path.home() / ".cache")
    return base / "splicecalc" / f"pandoc-cells-{tag}.json"


def _digest(job: _Job) -> str:
    return hashlib.sha256(json.dumps(job).encode("utf-8")).hexdigest()


class PandocPrefetch:
    """pandoc calls run side by side in ``pool`` and answered from memory during the export.

    ``nb_dir`` is the notebook's folder, as nbconvert's LaTeX exporter passes it to the
    template (a markdown cell's second call, JSON -> LaTeX, is foreseen through the
    template's own filters with it). ``priority``: the exporter's display priority
    (default :data:`splicecalc.report.display.DISPLAY_PRIORITY`).

    Two savings on top of running the calls early (each pandoc call is a process
    start of ~15 ms of CPU, on a machine whose other core runs the kernel):

    * a markdown *cell* (prose: in a template the same in every package made from it) is
      converted once per pandoc installation and remembered, keyed by its text, in the
      user's cache folder (``use_cache``), like ``__pycache__``; the kernel's outputs
      (which carry the job's values) are never cached;
    * the markdown outputs of the cells added together go to pandoc in one call, blocks
      parted by a marker paragraph, when that gives the same text as one call each: blocks with a
      heading or a bracket (whose labels, links and footnotes depend on the rest of the
      document) go on their own, and the parts must come back one per block.
    """

    def __init__(self, pool: ThreadPoolExecutor, nb_dir: str, priority: list[str] | None = None,
                 use_cache: bool = True) -> None:
        self._pool = pool
        self._nb_dir = nb_dir
        self._priority = list(priority) if priority is not None else None
        self._lock = threading.Lock()
        self._jobs: dict[_Job, Future] = {}
        self._done: dict[_Job, str] = {}
        self._cells: list[Future] = []
        self._cache_path = _cache_file() if use_cache else None
        self._cache: dict[str, str] | None = None
        self._cache_new: dict[str, str] = {}

    def add_cells(self, cells: Iterable[Any], together: bool = False) -> None:
        """Queue the pandoc calls of ``cells`` (a call already queued is not repeated).

        ``together``: plan all the cells as one document (their stand-alone markdown outputs
        in one pandoc call) rather than cell by cell.
        """
        snaps = [_snapshot(cell) for cell in cells]
        for part in ([snaps] if together else [[snap] for snap in snaps]):
            if part:
                self._cells.append(self._pool.submit(self._plan, part))

    def _cached(self) -> dict[str, str]:
        with self._lock:
            if self._cache is None:
                self._cache = {}
                if self._cache_path is not None:
                    try:
                        data = json.loads(self._cache_path.read_text(encoding="utf-8"))
                        if isinstance(data, dict):
                            self._cache = {k: v for k, v in data.items() if isinstance(v, str)}
                    except (OSError, ValueError):
                        pass   # no cache yet, or an unreadable one: convert afresh
            return self._cache

    def _plan(self, snapshots: list[tuple[str, str, list[tuple[str, dict]]]]) -> None:
        if self._priority is None:
            from .display import DISPLAY_PRIORITY   # the exporter's (imported here, off the main thread)

            self._priority = list(DISPLAY_PRIORITY)
        fresh: list[_Job] = []
        for snapshot in snapshots:
            cache = self._cached() if snapshot[0] == "markdown" and self._cache_path is not None else None
            for job in cell_jobs(snapshot, self._priority):
                with self._lock:
                    if job in self._jobs or job in self._done:
                        continue
                    if cache is not None and _digest(job) in cache:
                        self._from_cache(job, cache)
                        continue
                    fresh.append(job)
                    self._jobs[job] = Future()
        if not fresh:
            return
        # blocks that stand alone in a document are converted together; the others one by one
        batch = [job for job in fresh if job[2] == "latex" and not _CONTEXT_RE.search(job[0])]
        if len(batch) < 2:
            batch = []
        groups = ([batch] if batch else []) + [[job] for job in fresh if job not in batch]
        for group in groups:
            futures = [self._jobs[job] for job in group]
            self._pool.submit(self._run, group, self._cache_path is not None).add_done_callback(
                lambda f, fs=futures: [x.set_result(None) for x in fs])

    def _from_cache(self, job: _Job, cache: dict[str, str]) -> None:
        out = self._done[job] = cache[_digest(job)]
        if job[2] == "json":
            second = self._second_job(out)
            hit = cache.get(_digest(second))
            if hit is not None:
                self._done[second] = hit

    def _second_job(self, json_out: str) -> _Job:
        """The template's second call for a markdown cell: its JSON (through the template's filters) to LaTeX."""
        import nbconvert.filters.pandoc as fp
        from nbconvert.filters.filter_links import resolve_references

        relative = fp.ConvertExplicitlyRelativePaths(
            texinputs=os.path.abspath(self._nb_dir) if self._nb_dir else os.getcwd())
        return (relative(resolve_references(json_out)), "json", "latex", ())

    def _run(self, group: list[_Job], remember: bool) -> None:
        import nbconvert.filters.pandoc as fp

        try:
            if len(group) > 1:
                src = "\n\n".join(f"{job[0]}\n\n{_BREAK.format(i)}" for i, job in enumerate(group))
                parts = _BREAK_RE.split(fp.pandoc(src, group[0][1], "latex", extra_args=list(group[0][3])) + "\n\n")
                if len(parts) == len(group) + 1 and parts[-1].strip() == "":
                    for job, part in zip(group, parts):
                        self._done[job] = part.rstrip("\n")
                    return
            for job in group:   # one call each (also when a batch did not part cleanly)
                src, fmt, to, args = job
                out = self._done[job] = fp.pandoc(src, fmt, to, extra_args=list(args))
                if to == "json":
                    second = self._second_job(out)
                    self._done[second] = fp.pandoc(second[0], "json", "latex")
                    if remember:
                        self._cache_new[_digest(job)] = out
                        self._cache_new[_digest(second)] = self._done[second]
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

    def save_cache(self) -> None:
        """Add this run's markdown-cell conversions to the cache file (atomically; a failure costs speed only)."""
        if self._cache_path is None or not self._cache_new:
            return
        from ..core.files import write_atomic

        data = dict(self._cached())
        if len(data) + len(self._cache_new) > CACHE_MAX:
            data = {}
        data.update(self._cache_new)
        try:
            self._cache_path.parent.mkdir(parents=True, exist_ok=True)
            write_atomic(self._cache_path, json.dumps(data).encode("utf-8"))
        except OSError:
            pass
        self._cache_new = {}

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
            self.save_cache()


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
        self._deferred: list[Any] = []
        self.pandoc.add_cells(c for c in nb.cells if c.cell_type == "markdown")

    def add_cell(self, cell: Any) -> None:
        """A code cell the kernel has finished: its markdown outputs are converted when the export
        starts, all in one pandoc call (stand-alone blocks; see :class:`PandocPrefetch`), while the
        worker finishes the last figures. Converting them cell by cell during execution took
        CPU from the kernel on a two-core machine for no earlier result."""
        self._deferred.append(cell)

    def exporter(self) -> Any:
        """The exporter, made in the background, answering pandoc calls from this prefetch."""
        if self._deferred:
            self.pandoc.add_cells(self._deferred, together=True)
            self._deferred = []
        exporter = self._exporter.result()
        exporter.pandoc_prefetch = self.pandoc
        return exporter

    def close(self) -> None:
        self._pool.shutdown(wait=False, cancel_futures=True)


__all__ = ["ExportPrefetch", "MD_FORMAT", "PandocPrefetch", "cell_jobs", "pandoc_pool"]
