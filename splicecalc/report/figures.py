"""Figures of a calc package: printed as data by the calc, drawn by matplotlib where it suits.

A figure output carries :data:`FIGURE_MIME`: JSON data with a ``kind`` that names
the function drawing it (:data:`DRAWERS`), e.g. the V/M/w diagrams of
:func:`splicecalc.analysis.diagrams.beam_diagram_data`. In Jupyter the kernel
draws it at once (PDF + PNG beside the data); in a headless build the kernel
prints the data only and the build process draws the PDF in a background thread
(:class:`FigureDrawer`) while the kernel goes on with the next cells.
:func:`fill_figures` puts the drawn PDFs into the executed notebook, so the saved
notebook and the exporter see ordinary ``application/pdf`` outputs. One drawing
function per kind, whoever calls it.
"""

from __future__ import annotations

import base64
import io
import json
from concurrent.futures import Future, ThreadPoolExecutor
from importlib import import_module
from typing import Any, Callable, Iterator

from ..core.errors import InputError
from .errors import CalcBuildError

FIGURE_MIME = "application/vnd.splicecalc.figure+json"
PDF_MIME = "application/pdf"
PNG_MIME = "image/png"

#: figure kind -> (module, function) drawing its data as a matplotlib Figure
DRAWERS: dict[str, tuple[str, str]] = {
    "beam_diagrams": ("splicecalc.analysis.diagrams", "draw_beam_diagrams"),
    "splice": ("splicecalc.joints.splice.drawing", "draw_splice_data"),
}


def drawer_of(data: Any) -> Callable[[dict], Any]:
    """The drawing function for figure ``data`` (its ``kind`` must be in :data:`DRAWERS`)."""
    kind = data.get("kind") if isinstance(data, dict) else None
    if kind not in DRAWERS:
        raise InputError("figure kind", kind, f"one of {', '.join(sorted(DRAWERS))}")
    module, name = DRAWERS[kind]
    return getattr(import_module(module), name)


def figure_bytes(fig: Any, fmt: str, dpi: int = 150) -> bytes:
    """A matplotlib Figure as PDF (vector, no creation date: same figure, same bytes) or PNG."""
    if fmt not in ("pdf", "png"):
        raise InputError("fmt", fmt, "'pdf' or 'png'")
    buf = io.BytesIO()
    tight = getattr(fig, "splicecalc_tight", True)  # figures drawn inside fixed margins opt out
    fig.savefig(buf, format=fmt, dpi=dpi, bbox_inches="tight" if tight else None, pad_inches=0.04,
                metadata={"CreationDate": None} if fmt == "pdf" else None)
    return buf.getvalue()


def figure_outputs(fig: Any, formats: tuple[str, ...] = ("pdf", "png")) -> dict[str, str]:
    """MIME data (base64) of a matplotlib Figure: PDF for the calc package, PNG for Jupyter."""
    mime = {"pdf": PDF_MIME, "png": PNG_MIME}
    return {mime[f]: base64.b64encode(figure_bytes(fig, f)).decode("ascii") for f in formats}


def draw_pdf(data: dict) -> bytes:
    """Draw figure ``data`` and return the PDF bytes."""
    return figure_bytes(drawer_of(data)(data), "pdf")


def drawing_bundle(data: dict, caption: str = "", headless: bool = False) -> dict[str, Any]:
    """The MIME bundle of a figure given by its data: the data, and (not headless) PDF + PNG drawn now."""
    bundle: dict[str, Any] = {FIGURE_MIME: data, "text/plain": caption or "figure"}
    if not headless:
        bundle.update(figure_outputs(drawer_of(data)(data)))
    return bundle


def _key(data: Any) -> str:
    return json.dumps(data, sort_keys=True, separators=(",", ":"))


def figure_outputs_of(nb: Any) -> Iterator[tuple[int, dict]]:
    """(cell number, output data) of every figure output of ``nb`` (cells counted from 1)."""
    for i, cell in enumerate(nb.cells, start=1):
        for out in cell.get("outputs", []):
            data = out.get("data") or {}
            if FIGURE_MIME in data:
                yield i, data


def _warm_matplotlib() -> None:
    """Import what drawing a PDF needs, so the first figure does not wait for it."""
    import matplotlib.backends.backend_pdf  # noqa: F401
    import matplotlib.figure  # noqa: F401


class FigureDrawer:
    """Draws figure outputs in one background thread while the kernel runs the next cells.

    ``submit(cell)`` queues the cell's figure outputs (each distinct figure once);
    :func:`fill_figures` collects the PDFs. matplotlib is imported in the same
    thread as soon as the drawer is made. ``close()`` stops it (queued drawings are dropped).
    """

    def __init__(self) -> None:
        self._pool = ThreadPoolExecutor(max_workers=1, thread_name_prefix="splicecalc-figures")
        self._jobs: dict[str, Future] = {}
        self._pool.submit(_warm_matplotlib)

    def submit(self, cell: Any) -> None:
        for out in cell.get("outputs", []):
            data = (out.get("data") or {}).get(FIGURE_MIME)
            if data is not None and PDF_MIME not in out.get("data", {}):
                key = _key(data)
                if key not in self._jobs:
                    self._jobs[key] = self._pool.submit(draw_pdf, data)

    def pdf(self, data: dict) -> bytes:
        """The PDF of figure ``data``: the queued drawing's result, or drawn now."""
        job = self._jobs.get(_key(data))
        return job.result() if job is not None else draw_pdf(data)

    def close(self) -> None:
        self._pool.shutdown(wait=False, cancel_futures=True)


def fill_figures(nb: Any, drawer: FigureDrawer | None = None) -> int:
    """Add the PDF to every figure output of ``nb`` that has none; return how many were added.

    A figure that cannot be drawn stops the build with the cell and the error named.
    """
    added = 0
    for i, data in figure_outputs_of(nb):
        if PDF_MIME in data:
            continue
        spec = data[FIGURE_MIME]
        try:
            pdf = drawer.pdf(spec) if drawer is not None else draw_pdf(spec)
        except Exception as err:  # noqa: BLE001 - any drawing fault is reported with its cell
            kind = spec.get("kind") if isinstance(spec, dict) else type(spec).__name__
            raise CalcBuildError(f"the figure in cell {i} ({kind}) could not be drawn: "
                                 f"{type(err).__name__}: {err}") from None
        data[PDF_MIME] = base64.b64encode(pdf).decode("ascii")
        added += 1
    return added


__all__ = ["DRAWERS", "FIGURE_MIME", "PDF_MIME", "PNG_MIME", "FigureDrawer", "drawer_of", "draw_pdf", "drawing_bundle", "figure_bytes",
           "figure_outputs", "figure_outputs_of", "fill_figures"]
