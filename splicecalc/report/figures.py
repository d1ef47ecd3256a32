"""Figures of a calc package: printed as data by the calc, drawn by matplotlib where it suits.

A figure output carries :data:`FIGURE_MIME`: JSON data with a ``kind`` that names
the function drawing it (:data:`DRAWERS`), e.g. the V/M/w diagrams of
:func:`splicecalc.analysis.diagrams.beam_diagram_data`. In Jupyter the kernel
draws it at once (PDF + PNG beside the data); in a headless build the kernel
prints the data only and the build draws the PDF in a worker process
(:class:`FigureDrawer`) while the kernel goes on with the next cells.
:func:`fill_figures` puts the drawn PDFs into the executed notebook, so the saved
notebook and the exporter see ordinary ``application/pdf`` outputs. One drawing
function per kind, whoever calls it.
"""

from __future__ import annotations

import base64
import io
import json
from concurrent.futures import Future
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


class FigureDrawer:
    """Draws figure outputs in a worker process while the kernel runs the next cells.

    ``submit_output(out)`` queues a figure output as it arrives (each distinct figure once);
    :func:`fill_figures` collects the PDFs. The worker
    (:mod:`splicecalc.report.figure_worker`, started at once so that it has imported
    matplotlib before the first figure comes) draws on a core of its own rather than
    in this process, which handles the kernel's messages; one thread here hands it
    the figures in turn. Should the worker not start or stop answering, figures are
    drawn in this process instead. ``close()`` stops the worker.
    """

    def __init__(self) -> None:
        import subprocess
        import sys
        from concurrent.futures import ThreadPoolExecutor

        self._jobs: dict[str, Future] = {}
        self._thread = ThreadPoolExecutor(max_workers=1, thread_name_prefix="splicecalc-figures")
        try:
            self._proc: Any = subprocess.Popen([sys.executable, "-m", "splicecalc.report.figure_worker"],
                                               stdin=subprocess.PIPE, stdout=subprocess.PIPE,
                                               stderr=subprocess.DEVNULL)
        except OSError:
            self._proc = None

    def submit_output(self, out: Any) -> None:
        """Queue one output if it is a figure without its PDF (never raises: faults show in :func:`fill_figures`)."""
        data = (out.get("data") or {}).get(FIGURE_MIME)
        if data is None or PDF_MIME in out.get("data", {}):
            return
        try:
            key = _key(data)
        except (TypeError, ValueError):
            return                      # not JSON: fill_figures draws it here and reports the fault
        if key not in self._jobs:
            self._jobs[key] = self._thread.submit(self._draw, key)

    def _draw(self, key: str) -> bytes:
        from .figure_worker import read_frame, write_frame

        if self._proc is not None:
            try:
                write_frame(self._proc.stdin, key.encode("utf-8"))
                reply = read_frame(self._proc.stdout)
            except (OSError, EOFError, ValueError):
                reply = None
            if reply is not None:
                if reply[:1] == b"\0":
                    return reply[1:]
                raise RuntimeError(reply[1:].decode("utf-8", "replace"))
            self._stop()                # the worker is gone: draw here from now on
        return draw_pdf(json.loads(key))

    def pdf(self, data: dict) -> bytes:
        """The PDF of figure ``data``: the queued drawing's result, or drawn now."""
        job = self._jobs.get(_key(data))
        return job.result() if job is not None else draw_pdf(data)

    def _stop(self) -> None:
        """Close the worker's input (it then exits) and reap it in a background thread.

        The worker's own exit (Python finalising matplotlib) takes a few tenths of a
        second and nothing waits for it; the thread is not a daemon, so the
        interpreter reaps the worker before it ends (killing it after 5 s).
        """
        import threading

        proc, self._proc = self._proc, None
        if proc is None:
            return
        try:
            proc.stdin.close()
        except OSError:
            pass
        threading.Thread(target=_reap, args=(proc,), name="splicecalc-figure-worker-exit").start()

    def close(self) -> None:
        """Drop queued drawings and stop the worker."""
        self._thread.shutdown(wait=True, cancel_futures=True)
        self._stop()


def _reap(proc: Any) -> None:
    try:
        proc.wait(timeout=5)
    except Exception:  # noqa: BLE001 - a worker that will not stop is killed
        proc.kill()
        proc.wait()
    finally:
        proc.stdout.close()


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
