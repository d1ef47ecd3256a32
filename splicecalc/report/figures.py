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
import hashlib
import io
import json
import threading
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
    """Import what drawing a PDF needs and draw a small figure once (fonts, glyph caches),
    so that the first real figure does not wait for any of it."""
    from matplotlib.figure import Figure
    from matplotlib.patches import Circle, Rectangle

    for module, _ in DRAWERS.values():
        import_module(module)
    fig = Figure(figsize=(2.0, 1.0))
    ax = fig.add_subplot()
    ax.plot([0.0, 1.0], [0.0, 1.0])
    ax.fill_between([0.0, 1.0], [0.0, 1.0], 0.0, alpha=0.15)
    ax.add_patch(Rectangle((0.0, 0.0), 0.5, 0.5))
    ax.add_patch(Circle((0.5, 0.5), 0.1))
    ax.annotate("R_A = 1.0 kN", (0.5, 0.5), xytext=(3, 3), textcoords="offset points", fontsize=7,
                bbox=dict(boxstyle="round,pad=0.15", fc="white", ec="none"))
    ax.set_title("warm-up", fontsize=8)
    figure_bytes(fig, "pdf")


#: longest wait for the worker's drawing of one figure (s) before it is drawn here instead
WORKER_TIMEOUT_S = 60.0


class FigureDrawError(RuntimeError):
    """The worker could not draw a figure (its message names the error)."""


class _WorkerGone(Exception):
    """No worker to ask (never started, stopped, or killed): the figure is drawn by the caller."""


class FigureDrawer:
    """Draws figure outputs in a worker process while the kernel runs the next cells.

    ``submit_output(out)`` queues a figure output as it arrives (each distinct figure once);
    :func:`fill_figures` collects the PDFs. The worker
    (:mod:`splicecalc.report.figure_worker`, started at once in ``cwd`` so that it has
    imported matplotlib before the first figure comes) draws on a core of its own rather
    than in this process, which handles the kernel's messages; one thread here hands it
    the figures in turn and only waits. Should the worker not start, stop answering
    (:data:`WORKER_TIMEOUT_S`) or die, the figures are drawn by whoever asks for them
    (:meth:`pdf`), one at a time in that thread. ``close()`` stops the worker, killing
    it if it is still busy, and never waits on it.
    """

    def __init__(self, cwd: str | None = None) -> None:
        import subprocess
        import sys
        from concurrent.futures import ThreadPoolExecutor

        self._jobs: dict[str, Future] = {}
        self._lock = threading.Lock()
        self._thread = ThreadPoolExecutor(max_workers=1, thread_name_prefix="splicecalc-figures")
        try:
            self._proc: Any = subprocess.Popen([sys.executable, "-m", "splicecalc.report.figure_worker"],
                                               stdin=subprocess.PIPE, stdout=subprocess.PIPE,
                                               stderr=subprocess.DEVNULL, cwd=cwd)
        except OSError:
            self._proc = None

    def submit_output(self, out: Any) -> None:
        """Queue one output if it is a figure without its PDF (never raises: faults show in :func:`fill_figures`)."""
        data = (out.get("data") or {}).get(FIGURE_MIME)
        if data is None or PDF_MIME in out.get("data", {}) or self._proc is None:
            return
        try:
            key = _key(data)
        except (TypeError, ValueError):
            return                      # not JSON: fill_figures draws it here and reports the fault
        if key not in self._jobs:
            try:
                self._jobs[key] = self._thread.submit(self._draw, key)
            except RuntimeError:
                pass                    # closed: drawn when asked for

    def _draw(self, key: str) -> bytes:
        """Ask the worker (runs in the drawer's thread; never draws here)."""
        from .figure_worker import read_frame, write_frame

        proc = self._proc
        if proc is None:
            raise _WorkerGone()
        try:
            write_frame(proc.stdin, key.encode("utf-8"))
            reply = read_frame(proc.stdout)
        except (OSError, EOFError, ValueError):
            reply = None
        if reply is None:
            self._stop(kill=True)       # the worker is gone: callers draw from now on
            raise _WorkerGone()
        if reply[:1] == b"\0":
            return reply[1:]
        raise FigureDrawError(reply[1:].decode("utf-8", "replace"))

    def pdf(self, data: dict) -> bytes:
        """The PDF of figure ``data``: the worker's drawing, or drawn now in this thread.

        A worker that has not answered within :data:`WORKER_TIMEOUT_S` is killed, so a
        stuck worker cannot hang the build.
        """
        from concurrent.futures import TimeoutError as FutureTimeout

        job = self._jobs.get(_key(data))
        if job is not None:
            try:
                return job.result(timeout=WORKER_TIMEOUT_S)
            except FutureTimeout:
                self._stop(kill=True)   # its pending read ends; the queued ones give up
            except _WorkerGone:
                pass
        return draw_pdf(data)

    def _stop(self, kill: bool = False) -> None:
        """Stop the worker: close its input (it then exits) or kill it; reap it in a background thread.

        The worker's own exit (Python finalising matplotlib) takes a few tenths of a
        second and nothing waits for it; the thread is not a daemon, so the
        interpreter reaps the worker before it ends (killing it after 5 s).
        """
        with self._lock:
            proc, self._proc = self._proc, None
        if proc is None:
            return
        if kill:
            proc.kill()
        try:
            proc.stdin.close()
        except OSError:
            pass
        threading.Thread(target=_reap, args=(proc,), name="splicecalc-figure-worker-exit").start()

    def close(self) -> None:
        """Drop queued drawings and stop the worker (killed if a drawing is still under way)."""
        busy = any(not job.done() for job in self._jobs.values())
        self._stop(kill=busy)           # first: a thread blocked on the worker's reply is released
        self._thread.shutdown(wait=True, cancel_futures=True)


def _reap(proc: Any) -> None:
    try:
        proc.wait(timeout=5)
    except Exception:  # noqa: BLE001 - a worker that will not stop is killed
        proc.kill()
        proc.wait()
    finally:
        proc.stdout.close()


#: the start of a stand-in PDF (see :func:`mark_pending`); never a real PDF, which starts "%PDF"
PENDING_PREFIX = b"%splicecalc-figure-pending "


def mark_pending(nb: Any) -> dict[bytes, tuple[int, dict]]:
    """Give every figure output of ``nb`` without a PDF a stand-in PDF; ``{stand-in bytes: (cell, data)}``.

    The export can then lay out the LaTeX (which only names the figure files) while
    the worker is still drawing; :func:`real_figure_files` swaps the stand-ins in the
    exporter's output files for the drawings before XeLaTeX reads them, and
    :func:`fill_figures` puts the drawings into the notebook.
    """
    pending: dict[bytes, tuple[int, dict]] = {}
    for i, data in figure_outputs_of(nb):
        if PDF_MIME in data:
            continue
        spec = data[FIGURE_MIME]
        try:
            token = PENDING_PREFIX + hashlib.sha256(_key(spec).encode("utf-8")).hexdigest().encode("ascii")
        except (TypeError, ValueError):
            continue                    # not JSON: fill_figures reports it
        pending[token] = (i, spec)
        data[PDF_MIME] = base64.b64encode(token).decode("ascii")
    return pending


def unmark_pending(nb: Any) -> int:
    """Remove the stand-in PDFs :func:`mark_pending` put in (a build that stopped); how many."""
    n = 0
    for _, data in figure_outputs_of(nb):
        if PDF_MIME in data and _is_pending(data):
            del data[PDF_MIME]
            n += 1
    return n


def _is_pending(data: dict) -> bool:
    try:
        return base64.b64decode(data[PDF_MIME]).startswith(PENDING_PREFIX)
    except (TypeError, ValueError):
        return False


def _drawn(i: int, spec: Any, drawer: FigureDrawer | None) -> bytes:
    """The PDF of figure ``spec`` of cell ``i``; a figure that cannot be drawn names its cell."""
    try:
        return drawer.pdf(spec) if drawer is not None else draw_pdf(spec)
    except Exception as err:  # noqa: BLE001 - any drawing fault is reported with its cell
        kind = spec.get("kind") if isinstance(spec, dict) else type(spec).__name__
        why = str(err) if isinstance(err, FigureDrawError) else f"{type(err).__name__}: {err}"
        raise CalcBuildError(f"the figure in cell {i} ({kind}) could not be drawn: {why}") from None


def real_figure_files(files: dict[str, Any], pending: dict[bytes, tuple[int, dict]],
                      drawer: FigureDrawer | None = None) -> int:
    """Replace the stand-in PDFs among an export's output ``files`` by the drawings; how many were replaced."""
    n = 0
    for name, content in files.items():
        if isinstance(content, bytes) and content in pending:
            files[name] = _drawn(*pending[content], drawer)
            n += 1
    return n


def fill_figures(nb: Any, drawer: FigureDrawer | None = None) -> int:
    """Add the PDF to every figure output of ``nb`` that has none (or a stand-in); return how many.

    A figure that cannot be drawn stops the build with the cell and the error named.
    """
    added = 0
    for i, data in figure_outputs_of(nb):
        if PDF_MIME in data and not _is_pending(data):
            continue
        data[PDF_MIME] = base64.b64encode(_drawn(i, data[FIGURE_MIME], drawer)).decode("ascii")
        added += 1
    return added


__all__ = ["DRAWERS", "FIGURE_MIME", "FigureDrawError", "unmark_pending", "PDF_MIME", "PENDING_PREFIX", "PNG_MIME", "FigureDrawer", "mark_pending",
           "real_figure_files", "drawer_of", "draw_pdf", "drawing_bundle", "figure_bytes",
           "figure_outputs", "figure_outputs_of", "fill_figures"]
