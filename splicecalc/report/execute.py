"""Run a calc notebook headless, with a progress bar and a clean error.

The kernel is always the Python that runs splicecalc (``sys.executable`` with
``ipykernel_launcher``), whatever kernelspecs are (or are not) installed, so
a missing or stale ``python3`` kernelspec cannot break a build.
"""

from __future__ import annotations

import asyncio
import copy
import os
import subprocess
import sys
import threading
import time
from pathlib import Path
from typing import Any, Callable

import nbformat
from jupyter_client.kernelspec import KernelSpec, KernelSpecManager
from jupyter_client.manager import AsyncKernelManager
from jupyter_core.utils import ensure_async
from nbclient import NotebookClient
from nbclient.exceptions import CellExecutionError, CellTimeoutError, DeadKernelError
from nbformat import NotebookNode
from traitlets import default

from ..core.errors import InputError, require_positive
from .errors import CalcBuildError, CellExecutionFailed
from .headless import HEADLESS_ENV

KERNEL_NAME = "splicecalc-python"


class _ThisPythonSpecs(KernelSpecManager):
    """Kernelspec manager that always answers with the running interpreter."""

    def get_kernel_spec(self, kernel_name: str) -> KernelSpec:  # noqa: ARG002
        return KernelSpec(argv=[sys.executable, "-m", "ipykernel_launcher", "-f", "{connection_file}"],
                          display_name=f"Python {sys.version_info.major}.{sys.version_info.minor} (splicecalc)",
                          language="python", metadata={"debugger": False}, resource_dir="")

    def find_kernel_specs(self) -> dict[str, str]:
        return {KERNEL_NAME: ""}


class _ThisPythonKernelManager(AsyncKernelManager):
    """Kernel manager whose only kernelspec is the running interpreter."""

    @default("kernel_spec_manager")
    def _default_ksm(self) -> KernelSpecManager:
        return _ThisPythonSpecs()

    async def _async_finish_shutdown(self, waittime: float | None = None, pollinterval: float = 0.1,
                                     restart: bool = False) -> None:
        # jupyter_client looks every 0.1 s whether the kernel has exited; look every 0.01 s
        # (the same graceful shutdown, noticed up to 0.1 s sooner)
        await super()._async_finish_shutdown(waittime=waittime, pollinterval=min(pollinterval, 0.01),
                                             restart=restart)


class _ProgressClient(NotebookClient):
    """NotebookClient that ticks a tqdm bar per code cell and remembers the running cell."""

    def __init__(self, *args: Any, progress: bool = True,
                 after_cell: Callable[[NotebookNode], None] | None = None, **kwargs: Any) -> None:
        super().__init__(*args, **kwargs)
        self._progress = progress
        self._after_cell = after_cell
        self._bar: Any = None
        self.current_index: int | None = None
        self.kernel_ready_s: float | None = None
        self._t0 = time.perf_counter()

    async def async_execute_cell(self, cell: NotebookNode, cell_index: int, execution_count: int | None = None,
                                 store_history: bool = True) -> NotebookNode:
        if self.kernel_ready_s is None:
            self.kernel_ready_s = time.perf_counter() - self._t0
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
        threading.Thread(target=_reap_kernel, args=(km, alive), name="splicecalc-kernel-exit").start()


def _reap_kernel(km: AsyncKernelManager, alive: bool) -> None:
    """Wait for a kernel asked to shut down (kill it after the grace time), then free its files."""
    async def finish() -> None:
        if alive:
            await km._async_finish_shutdown()
        await km._async_cleanup_resources()

    try:
        asyncio.run(finish())
    except Exception:  # noqa: BLE001 - a kernel that is already gone leaves nothing to tidy
        pass


def _first_line(source: str) -> str:
    return next((ln.strip() for ln in source.splitlines() if ln.strip()), "")


def _error_of(cell: NotebookNode) -> tuple[str, str]:
    for out in cell.get("outputs", []):
        if out.get("output_type") == "error":
            return out.get("ename", "Error"), out.get("evalue", "")
    return "", ""


def execute_notebook(nb: str | Path | NotebookNode, cwd: str | Path | None = None, timeout: float = 300.0,
                     progress: bool = True, timings: dict[str, float] | None = None,
                     after_cell: Callable[[NotebookNode], None] | None = None) -> NotebookNode:
    """Execute every code cell of ``nb`` (a path or a NotebookNode) and return the executed notebook.

    ``cwd`` is the kernel's working folder (default: the notebook's folder or
    the current one); ``timeout`` (s) applies per cell. A failing cell raises
    :class:`CellExecutionFailed` naming the cell number (1-based, counting all
    cells), its first source line and the exception. ``timings``, if given,
    receives ``kernel_start_s`` and ``cells_s``. ``after_cell``, if given, is called
    with each executed code cell as soon as the kernel has finished it (the build
    starts drawing its figures and converting its text while the kernel goes on).
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

    client = _ProgressClient(node, kernel_manager_class=_ThisPythonKernelManager, timeout=int(timeout), kernel_name=KERNEL_NAME,
                             resources={"metadata": {"path": str(cwd)}}, allow_errors=False,
                             record_timing=False, progress=progress, after_cell=after_cell)
    t0 = time.perf_counter()
    try:
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
    except RuntimeError as exc:  # kernel failed to start
        raise CalcBuildError(f"the Python kernel could not be started ({sys.executable}): {exc}") from None
    finally:
        client.close_bar()
    total = time.perf_counter() - t0
    if timings is not None:
        ks = client.kernel_ready_s if client.kernel_ready_s is not None else 0.0
        timings["kernel_start_s"] = ks
        timings["cells_s"] = total - ks
    node.metadata["kernelspec"] = {"name": "python3", "display_name": "Python 3", "language": "python"}
    return node
