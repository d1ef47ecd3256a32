"""Pandoc conversions of a build started early, on worker threads, while the kernel runs the cells.

The LaTeX template converts every markdown cell (two pandoc runs: markdown -> JSON -> LaTeX, as
nbconvert's own template does) and every markdown output (one run) with nbconvert's public
``convert_pandoc`` filter: about 60 pandoc processes for the demo, ~1 s of wall time after the
cells when run one after the other. The markdown cells are known before the kernel starts and
the outputs as each cell finishes, while the build's own process has nothing else to do.

:class:`PandocWork` is that filter with its answers started early: :meth:`PandocWork.start`
submits a conversion to a small thread pool (pandoc runs as a process, so the threads overlap it
with the kernel's work), and calling the object, as the template does through the exporter's
``convert_pandoc`` filter, returns the answer for exactly that input: keyed by the source text,
the formats and the extra arguments, computed by nbconvert's ``convert_pandoc``. An input that was
not started is converted there and then. Nothing outlives the build; the PDF is the same character
for character (``tests/test_pandocwork.py``).
"""

from __future__ import annotations

import threading
from concurrent.futures import Future, ThreadPoolExecutor
from pathlib import Path
from typing import Any

#: how the template reads a markdown cell (nbconvert's latex template, ``markdowncell`` block)
CELL_MD_FORMAT = "markdown+tex_math_double_backslash"
#: how the template reads a markdown output of the kernel (job text: no raw TeX, raw HTML or math;
#: the ``data_markdown`` block of ``latex/calcpackage/index.tex.j2`` names the same format)
OUTPUT_MD_FORMAT = ("markdown-raw_tex-raw_attribute-raw_html-tex_math_dollars-tex_math_single_backslash"
                    "-tex_math_double_backslash-latex_macros")
#: pandoc processes at a time (the machine's second core; more only queue)
WORKERS = 2


def _key(source: str, from_format: str, to_format: str, extra_args: Any) -> tuple:
    return (source, from_format, to_format, None if extra_args is None else tuple(extra_args))


class PandocWork:
    """nbconvert's ``convert_pandoc`` with conversions started ahead on worker threads."""

    def __init__(self, notebook_folder: str | Path | None = None, workers: int = WORKERS) -> None:
        from nbconvert.filters import ConvertExplicitlyRelativePaths

        self._pool = ThreadPoolExecutor(max_workers=workers, thread_name_prefix="pandoc")
        self._lock = threading.Lock()
        self._jobs: dict[tuple, Future] = {}
        self._relative = ConvertExplicitlyRelativePaths(texinputs=str(Path(notebook_folder).resolve())
                                                        if notebook_folder else None)
        #: answers served from a conversion started early / converted when asked
        self.hits = 0
        self.misses = 0

    # ---------------------------------------------------------------- starting
    def _submit(self, key: tuple, fn: Any, *args: Any) -> Future:
        with self._lock:
            fut = self._jobs.get(key)
            if fut is None:
                fut = self._pool.submit(fn, *args)
                self._jobs[key] = fut
            return fut

    def start(self, source: str, from_format: str, to_format: str, extra_args: Any = None) -> None:
        """Begin converting ``source`` (as ``convert_pandoc(source, from_format, to_format, extra_args)``)."""
        from nbconvert.filters import convert_pandoc

        self._submit(_key(source, from_format, to_format, extra_args), convert_pandoc, source, from_format,
                     to_format, extra_args)

    def _cell_chain(self, text: str) -> str:
        from nbconvert.filters import convert_pandoc
        from nbconvert.filters.filter_links import resolve_references

        as_json = convert_pandoc(text, CELL_MD_FORMAT, "json", extra_args=[])
        try:    # the second conversion of the template's chain, started as soon as its input is known
            self.start(self._relative(resolve_references(as_json)), "json", "latex")
        except Exception:  # noqa: BLE001 - only a head start: the template converts it when it asks
            pass
        return as_json

    def start_markdown_cell(self, source: str) -> None:
        """Both conversions of a markdown cell, as the template chains them."""
        from nbconvert.filters import citation2latex, strip_files_prefix

        text = strip_files_prefix(citation2latex(source))
        self._submit(_key(text, CELL_MD_FORMAT, "json", []), self._cell_chain, text)

    def start_markdown_output(self, markdown: str) -> None:
        from nbconvert.filters import citation2latex, strip_files_prefix

        self.start(strip_files_prefix(citation2latex(markdown)), OUTPUT_MD_FORMAT, "latex")

    def start_cell(self, cell: Any) -> None:
        """Whatever a cell will need: its text if markdown, its markdown outputs if code."""
        if cell.get("cell_type") == "markdown":
            self.start_markdown_cell(cell.get("source", ""))
        elif cell.get("cell_type") == "code":
            from .display import DISPLAY_PRIORITY

            for out in cell.get("outputs", []) or []:
                data = out.get("data") or {}
                # the MIME type the exporter prints (its display_data_priority), as the template picks it
                shown = next((m for m in DISPLAY_PRIORITY if m in data), None)
                if shown == "text/markdown" and isinstance(data[shown], str):
                    self.start_markdown_output(data[shown])

    def start_notebook(self, nb: Any) -> None:
        for cell in nb.get("cells", []):
            self.start_cell(cell)

    # ---------------------------------------------------------------- the filter
    def __call__(self, source: str, from_format: str, to_format: str, extra_args: Any = None) -> str:
        from nbconvert.filters import convert_pandoc

        with self._lock:
            fut = self._jobs.get(_key(source, from_format, to_format, extra_args))
        if fut is not None:
            try:
                out = fut.result()
            except Exception:  # noqa: BLE001 - converted again below: its own error, if any, is the one raised
                pass
            else:
                self.hits += 1
                return out
        self.misses += 1
        return convert_pandoc(source, from_format, to_format, extra_args)

    def close(self) -> None:
        """Stop the workers (conversions still queued are dropped)."""
        self._pool.shutdown(wait=False, cancel_futures=True)


__all__ = ["CELL_MD_FORMAT", "OUTPUT_MD_FORMAT", "PandocWork", "WORKERS"]
