"""Run a calc notebook headless, with a progress bar and a clean error.

The kernel is always the Python that runs splicecalc (:mod:`.kernel`), whatever
kernelspecs are (or are not) installed. A failing cell stops the run with the
cell number, its first line and the error.
"""

from __future__ import annotations

import copy
import os
import subprocess
import sys
import threading
import time
from pathlib import Path
from typing import Any, Callable

import nbformat
from jupyter_core.utils import ensure_async
from nbclient import NotebookClient
from nbclient.exceptions import CellExecutionError, CellTimeoutError, DeadKernelError
from nbformat import NotebookNode

from ..core.errors import InputError, require_positive
from .errors import CalcBuildError, CellExecutionFailed
from .headless import HEADLESS_ENV
from .kernel import KERNEL_ARGS, KERNEL_NAME, KernelLaunch, ThisPythonKernelManager, reap_kernel


class _ProgressClient(NotebookClient):
    """NotebookClient that ticks a tqdm bar per code cell and remembers the running cell."""

    def __init__(self, *args: Any, progress: bool = True,
                 after_cell: Callable[[NotebookNode], None] | None = None,
                 after_output: Callable[[NotebookNode], None] | None = None, **kwargs: Any) -> None:
        super().__init__(*args, **kwargs)
        self._progress = progress
        self._after_cell = after_cell
        self._after_output = after_output
        self._bar: Any = None
        self.current_index: int | None = None
        #: perf_counter() when the first cell was sent to the kernel (the kernel is ready then)
        self.first_cell_at: float | None = None

    async def async_execute_cell(self, cell: NotebookNode, cell_index: int, execution_count: int | None = None,
                                 store_history: bool = True) -> NotebookNode:
        if self.first_cell_at is None:
            self.first_cell_at = time.perf_counter()
        self.current_index = cell_index
        if cell.cell_type == "code" and self._bar is None and self._progress:
            from tqdm import tqdm

            n = sum(c.cell_type == "code" for c in self.nb.cells)
            self._bar = tqdm(total=n, desc="Executing cells", unit="cell", file=sys.stderr, leave=False)
        out = await super().async_execute_cell(cell, cell_index, execution_count, store_history)
        if cell.cell_type == "code":
            if self._after_cell is not None:
                self._after_cell(out)
            if self._bar is not None:
                self._bar.update(1)
        return out

    def output(self, outs: list, msg: dict, display_id: str | None, cell_index: int) -> NotebookNode | None:
        out = super().output(outs, msg, display_id, cell_index)
        if out is not None and self._after_output is not None:
            self._after_output(out)
        return out

    def close_bar(self) -> None:
        if self._bar is not None:
            self._bar.close()
            self._bar = None

    async def _async_cleanup_kernel(self) -> None:
        """Ask the kernel to shut down; wait for its exit and tidy up in a background thread.

        The executed notebook is complete once the last reply is in; the kernel's
        own exit (Python finalising scipy, matplotlib, ...) takes ~0.5 s and
        needs nothing from the build, so it runs beside the export. The thread
        is not a daemon: the interpreter waits for it (kill after
        ``shutdown_wait_time``), and the connection file is removed as before.
        """
        km, kc = self.km, self.kc
        self.km = self.kc = None
        if km is None:
            return
        alive = False
        try:
            alive = bool(await ensure_async(km.is_alive()))
            if alive:
                await ensure_async(km.request_shutdown())
        except RuntimeError:
            pass  # no kernel running: nothing to ask
        finally:
            if kc is not None:
                await ensure_async(kc.stop_channels())
        threading.Thread(target=reap_kernel, args=(km, alive), name="splicecalc-kernel-exit").start()


def _first_line(source: str) -> str:
    return next((ln.strip() for ln in source.splitlines() if ln.strip()), "")


def _error_of(cell: NotebookNode) -> tuple[str, str]:
    for out in cell.get("outputs", []):
        if out.get("output_type") == "error":
            return out.get("ename", "Error"), out.get("evalue", "")
    return "", ""


def execute_notebook(nb: str | Path | NotebookNode, cwd: str | Path | None = None, timeout: float = 300.0,
                     progress: bool = True, timings: dict[str, float] | None = None,
                     after_cell: Callable[[NotebookNode], None] | None = None,
                     after_output: Callable[[NotebookNode], None] | None = None,
                     kernel: KernelLaunch | None = None, draw_figures: bool = True) -> NotebookNode:
    """Execute every code cell of ``nb`` (a path or a NotebookNode) and return the executed notebook.

    ``cwd`` is the kernel's working folder (default: the notebook's folder or
    the current one); ``timeout`` (s) applies per cell. A failing cell raises
    :class:`CellExecutionFailed` naming the cell number (1-based, counting all
    cells), its first source line and the exception. ``timings``, if given,
    receives ``kernel_start_s`` and ``cells_s``. ``after_cell``, if given, is called
    with each executed code cell as soon as the kernel has finished it (the build
    starts drawing its figures and converting its text while the kernel goes on);
    ``after_output`` likewise with each output as it arrives.
    ``kernel``: a kernel launched beforehand (:class:`KernelLaunch`, its own working
    folder); by default a new one is started. Either way it is shut down at the end,
    and ``kernel_start_s`` counts from its launch. The kernel runs headless, so it prints
    figures as data (:mod:`splicecalc.report.figures`); with ``draw_figures`` (default)
    they are drawn here before the notebook is returned, so every figure output carries
    its PDF (a build that draws them itself passes False). The callbacks are the build's
    own optimisations: a fault in one is ignored (the export does that work again).
    """
    require_positive("timeout", timeout, "s")
    if isinstance(nb, (str, Path)):
        path = Path(nb)
        if not path.is_file():
            raise InputError("notebook", str(nb), "an existing .ipynb file")
        node = nbformat.read(path, as_version=4)
        cwd = cwd if cwd is not None else path.parent
    elif isinstance(nb, NotebookNode):
        node = copy.deepcopy(nb)   # the caller's notebook is left as it was
    else:
        raise InputError("notebook", type(nb).__name__, "a path to an .ipynb file or an nbformat NotebookNode")
    cwd = Path(cwd) if cwd is not None else Path.cwd()
    if not cwd.is_dir():
        raise InputError("cwd", str(cwd), "an existing folder")
    if kernel is not None and (not isinstance(kernel, KernelLaunch) or kernel.used):
        raise InputError("kernel", kernel, "a KernelLaunch that has not run a notebook yet")

    client = _ProgressClient(node, kernel_manager_class=ThisPythonKernelManager, timeout=int(timeout), kernel_name=KERNEL_NAME,
                             resources={"metadata": {"path": str(cwd)}}, allow_errors=False,
                             record_timing=False, progress=progress, after_cell=_quiet(after_cell),
                             after_output=_quiet(after_output),
                             km=kernel.km if kernel is not None else None, extra_arguments=list(KERNEL_ARGS))
    t0 = time.perf_counter()
    try:
        if kernel is not None:
            kernel.used = True
            client.execute(cleanup_kc=True)      # our kernel: shut it down at the end all the same
        else:
            # the kernel's own stderr only carries transport chatter; cell errors come back as messages
            # HEADLESS_ENV tells templates that nobody is looking (the input form stays hidden)
            client.execute(stderr=subprocess.DEVNULL, env={**os.environ, HEADLESS_ENV: "1"})
    except CellExecutionError as exc:
        idx = client.current_index if client.current_index is not None else -1
        cell = node.cells[idx] if 0 <= idx < len(node.cells) else NotebookNode(source="", outputs=[])
        ename, evalue = _error_of(cell)
        raise CellExecutionFailed(idx + 1, _first_line(cell.source), ename or exc.ename,
                                  evalue or exc.evalue) from None
    except (CellTimeoutError, DeadKernelError) as exc:
        idx = client.current_index if client.current_index is not None else -1
        first = _first_line(node.cells[idx].source) if 0 <= idx < len(node.cells) else ""
        raise CellExecutionFailed(idx + 1, first, type(exc).__name__, str(exc).splitlines()[0] if str(exc) else "") from None
    except RuntimeError as exc:
        if client.first_cell_at is None:       # nothing ran: the kernel did not come up
            raise CalcBuildError(f"the Python kernel could not be started ({sys.executable}): {exc}") from None
        idx = client.current_index if client.current_index is not None else -1
        first = _first_line(node.cells[idx].source) if 0 <= idx < len(node.cells) else ""
        raise CellExecutionFailed(idx + 1, first, type(exc).__name__, str(exc).splitlines()[0] if str(exc) else "") \
            from None
    finally:
        client.close_bar()
    end = time.perf_counter()
    if timings is not None:
        start = kernel.launched_at if kernel is not None else t0
        first = client.first_cell_at if client.first_cell_at is not None else t0
        timings["kernel_start_s"] = first - start
        timings["cells_s"] = end - first
    node.metadata["kernelspec"] = {"name": "python3", "display_name": "Python 3", "language": "python"}
    if draw_figures:
        from .figures import fill_figures

        fill_figures(node)
    return node


def _quiet(fn: Callable[[NotebookNode], None] | None) -> Callable[[NotebookNode], None] | None:
    """``fn`` that never raises into nbclient (where any error would stop the run)."""
    if fn is None:
        return None

    def call(node: NotebookNode) -> None:
        try:
            fn(node)
        except Exception:  # noqa: BLE001 - an optimisation that failed; the export redoes its work
            pass

    return call
