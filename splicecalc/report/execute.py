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
import time
from pathlib import Path
from typing import Any

import nbformat
from nbclient import NotebookClient
from nbclient.exceptions import CellExecutionError, CellTimeoutError, DeadKernelError
from nbformat import NotebookNode

from ..core.errors import InputError, require_positive
from .errors import CalcBuildError, CellExecutionFailed
from .headless import HEADLESS_ENV
from .kernel import KERNEL_ARGS, KERNEL_NAME, KernelLaunch, ThisPythonKernelManager


class _Progress:
    """nbclient hooks (``on_notebook_start``, ``on_cell_start``, ``on_cell_executed``): a tqdm bar over the
    code cells, the index of the running cell, and when the kernel was ready."""

    def __init__(self, nb: NotebookNode, show: bool, on_cell_done: Any = None) -> None:
        self._n = sum(c.cell_type == "code" for c in nb.cells)
        self._on_cell_done = on_cell_done
        self._show = show
        self._bar: Any = None
        #: index of the cell running (or last run)
        self.current_index: int | None = None
        #: perf_counter() when the kernel answered and the first cell could be sent
        self.ready_at: float | None = None

    def notebook_start(self, notebook: NotebookNode, **_: Any) -> None:  # noqa: ARG002
        self.ready_at = time.perf_counter()

    def cell_start(self, cell: NotebookNode, cell_index: int, **_: Any) -> None:
        self.current_index = cell_index
        if cell.cell_type == "code" and self._bar is None and self._show:
            from tqdm import tqdm

            self._bar = tqdm(total=self._n, desc="Executing cells", unit="cell", file=sys.stderr, leave=False)

    def cell_executed(self, cell: NotebookNode, **_: Any) -> None:
        if self._bar is not None and cell.cell_type == "code":
            self._bar.update(1)
        if self._on_cell_done is not None:
            self._on_cell_done(cell)

    def close(self) -> None:
        if self._bar is not None:
            self._bar.close()
            self._bar = None


def _first_line(source: str) -> str:
    return next((ln.strip() for ln in source.splitlines() if ln.strip()), "")


def _error_of(cell: NotebookNode) -> tuple[str, str]:
    for out in cell.get("outputs", []):
        if out.get("output_type") == "error":
            return out.get("ename", "Error"), out.get("evalue", "")
    return "", ""


def execute_notebook(nb: str | Path | NotebookNode, cwd: str | Path | None = None, timeout: float = 300.0,
                     progress: bool = True, timings: dict[str, float] | None = None,
                     kernel: KernelLaunch | None = None, on_cell_done: Any = None) -> NotebookNode:
    """Execute every code cell of ``nb`` (a path or a NotebookNode) and return the executed notebook.

    ``cwd`` is the kernel's working folder (default: the notebook's folder or
    the current one); ``timeout`` (s) applies per cell. A failing cell raises
    :class:`CellExecutionFailed` naming the cell number (1-based, counting all
    cells), its first source line and the exception. ``timings``, if given,
    receives ``kernel_start_s`` and ``cells_s``.
    ``kernel``: a kernel launched beforehand (:class:`KernelLaunch`, its own working
    folder); by default a new one is started. Either way it is shut down at the end
    (nbclient's ``shutdown_kernel="immediate"``: every output is in by then), and
    ``kernel_start_s`` counts from its launch. The kernel runs headless
    (:data:`~splicecalc.report.headless.HEADLESS_ENV`). ``on_cell_done(cell)``: called with each
    cell as it finishes, outputs in (nbclient's ``on_cell_executed`` hook).
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

    hooks = _Progress(node, progress, on_cell_done)
    client = NotebookClient(node, kernel_manager_class=ThisPythonKernelManager, timeout=int(timeout),
                            kernel_name=KERNEL_NAME, resources={"metadata": {"path": str(cwd)}},
                            allow_errors=False, record_timing=False, shutdown_kernel="immediate",
                            on_notebook_start=hooks.notebook_start, on_cell_start=hooks.cell_start,
                            on_cell_executed=hooks.cell_executed,
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
        idx = hooks.current_index if hooks.current_index is not None else -1
        cell = node.cells[idx] if 0 <= idx < len(node.cells) else NotebookNode(source="", outputs=[])
        ename, evalue = _error_of(cell)
        raise CellExecutionFailed(idx + 1, _first_line(cell.source), ename or exc.ename,
                                  evalue or exc.evalue) from None
    except (CellTimeoutError, DeadKernelError) as exc:
        idx = hooks.current_index if hooks.current_index is not None else -1
        first = _first_line(node.cells[idx].source) if 0 <= idx < len(node.cells) else ""
        raise CellExecutionFailed(idx + 1, first, type(exc).__name__, str(exc).splitlines()[0] if str(exc) else "") from None
    except RuntimeError as exc:
        if hooks.ready_at is None:       # nothing ran: the kernel did not come up
            raise CalcBuildError(f"the Python kernel could not be started ({sys.executable}): {exc}") from None
        idx = hooks.current_index if hooks.current_index is not None else -1
        first = _first_line(node.cells[idx].source) if 0 <= idx < len(node.cells) else ""
        raise CellExecutionFailed(idx + 1, first, type(exc).__name__, str(exc).splitlines()[0] if str(exc) else "") \
            from None
    finally:
        hooks.close()
    end = time.perf_counter()
    if timings is not None:
        start = kernel.launched_at if kernel is not None else t0
        ready = hooks.ready_at if hooks.ready_at is not None else t0
        timings["kernel_start_s"] = ready - start
        timings["cells_s"] = end - ready
    node.metadata["kernelspec"] = {"name": "python3", "display_name": "Python 3", "language": "python"}
    return node
