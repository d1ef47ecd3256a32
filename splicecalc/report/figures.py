"""Figures of a calc package: printed as data by the calc, drawn by matplotlib where it suits.

A figure output carries :data:`FIGURE_MIME`: JSON data with a ``kind`` that names
the function drawing it (:data:`DRAWERS`), e.g. the V/M/w diagrams of
:func:`splicecalc.analysis.diagrams.beam_diagram_data`. In Jupyter the kernel
draws it at once (PDF + PNG beside the data; PDF only in a headless build), so
the executed notebook and the exporter see ordinary ``application/pdf`` outputs.
A figure printed as data only is drawn by the exporter's
:class:`~splicecalc.report.exporter.FigurePreprocessor` (:func:`fill_figures`).
One drawing function per kind, whoever calls it.
"""

from __future__ import annotations

import base64
import io
from importlib import import_module
from typing import Any, Callable, Iterator

from ..core.errors import InputError
from ..core.text import plain_text_figures
from .errors import CalcBuildError

FIGURE_MIME = "application/vnd.splicecalc.figure+json"
PDF_MIME = "application/pdf"
PNG_MIME = "image/png"

#: figure kind -> (module, function) drawing its data as a matplotlib Figure
DRAWERS: dict[str, tuple[str, str]] = {
    "beam_diagrams": ("splicecalc.analysis.diagrams", "draw_beam_diagrams"),
    "splice": ("splicecalc.joints.splice.drawing", "draw_splice_data"),
    "connection": ("splicecalc.joints.connections.sheet_drawing", "draw_connection_data"),
}


def drawer_of(data: Any) -> Callable[[dict], Any]:
    """The drawing function for figure ``data`` (its ``kind`` must be in :data:`DRAWERS`)."""
    kind = data.get("kind") if isinstance(data, dict) else None
    if kind not in DRAWERS:
        raise InputError("figure kind", kind, f"one of {', '.join(sorted(DRAWERS))}")
    module, name = DRAWERS[kind]
    return plain_text_figures(getattr(import_module(module), name))


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
    """The MIME bundle of a figure given by its data, drawn now (in the kernel that shows it).

    The data (JSON), the PDF (the calc package) and, in front of a person (not
    ``headless``), a PNG for Jupyter; a headless build needs no PNG.
    """
    fig = drawer_of(data)(data)
    bundle: dict[str, Any] = {FIGURE_MIME: data, "text/plain": caption or "figure"}
    bundle.update(figure_outputs(fig, ("pdf",) if headless else ("pdf", "png")))
    return bundle


def figure_outputs_of(nb: Any) -> Iterator[tuple[int, dict]]:
    """(cell number, output data) of every figure output of ``nb`` (cells counted from 1)."""
    for i, cell in enumerate(nb.cells, start=1):
        for out in cell.get("outputs", []):
            data = out.get("data") or {}
            if FIGURE_MIME in data:
                yield i, data


def fill_figures(nb: Any) -> int:
    """Draw the PDF of every figure output of ``nb`` that carries the data only; return how many.

    A notebook whose figures were published as data only (an older build, or a cell that
    published :data:`FIGURE_MIME` itself) gets its drawings here, in this process. A
    figure that cannot be drawn stops the build with the cell and the error named.
    """
    added = 0
    for i, data in figure_outputs_of(nb):
        if PDF_MIME in data:
            continue
        spec = data[FIGURE_MIME]
        try:
            pdf = draw_pdf(spec)
        except Exception as err:  # noqa: BLE001 - any drawing fault is reported with its cell
            kind = spec.get("kind") if isinstance(spec, dict) else type(spec).__name__
            raise CalcBuildError(f"the figure in cell {i} ({kind}) could not be drawn: "
                                 f"{type(err).__name__}: {err}") from None
        data[PDF_MIME] = base64.b64encode(pdf).decode("ascii")
        added += 1
    return added


__all__ = ["DRAWERS", "FIGURE_MIME", "PDF_MIME", "PNG_MIME", "drawer_of", "draw_pdf",
           "drawing_bundle", "figure_bytes", "figure_outputs", "figure_outputs_of", "fill_figures"]
