"""The calc kernel: always the Python that runs splicecalc, launched as early as a build can.

The kernel is ``sys.executable -m ipykernel_launcher`` whatever kernelspecs are
(or are not) installed, so a missing or stale ``python3`` kernelspec cannot break
a build. This module imports only jupyter_client, so a build can launch the
kernel (:class:`KernelLaunch`) before it loads nbformat, nbclient or nbconvert.
"""

from __future__ import annotations

import os
import subprocess
import sys
import time
from pathlib import Path

from jupyter_client.kernelspec import KernelSpec, KernelSpecManager
from jupyter_client.manager import AsyncKernelManager
from jupyter_core.utils import run_sync
from traitlets import default

from ..core.errors import InputError
from .errors import CalcBuildError
from .headless import HEADLESS_ENV

KERNEL_NAME = "splicecalc-python"
#: what nbclient gives every kernel it starts: an in-memory IPython history (no sqlite file)
KERNEL_ARGS = ("--HistoryManager.hist_file=:memory:",)


class ThisPythonSpecs(KernelSpecManager):
    """Kernelspec manager that always answers with the running interpreter."""

    def get_kernel_spec(self, kernel_name: str) -> KernelSpec:  # noqa: ARG002
        return KernelSpec(argv=[sys.executable, "-m", "ipykernel_launcher", "-f", "{connection_file}"],
                          display_name=f"Python {sys.version_info.major}.{sys.version_info.minor} (splicecalc)",
                          language="python", metadata={"debugger": False}, resource_dir="")

    def find_kernel_specs(self) -> dict[str, str]:
        return {KERNEL_NAME: ""}


class ThisPythonKernelManager(AsyncKernelManager):
    """Kernel manager whose only kernelspec is the running interpreter."""

    @default("kernel_spec_manager")
    def _default_ksm(self) -> KernelSpecManager:
        return ThisPythonSpecs()


class KernelLaunch:
    """The calc kernel, launched before its notebook is ready.

    A build launches the kernel first and then validates the job and writes the
    notebook while the kernel boots (about 0.5 s of Python imports on the other
    core); :func:`execute_notebook` then runs the cells on it. ``cwd`` is the
    kernel's working folder (the notebook's). The kernel is headless
    (:data:`~splicecalc.report.headless.HEADLESS_ENV` set). :meth:`discard`
    shuts it down when the build stops before running it.
    """

    def __init__(self, cwd: str | Path) -> None:
        if not Path(cwd).is_dir():
            raise InputError("cwd", str(cwd), "an existing folder")
        self.cwd = Path(cwd)
        self.km = ThisPythonKernelManager(kernel_name=KERNEL_NAME)
        self.launched_at = time.perf_counter()
        try:
            run_sync(self.km.start_kernel)(extra_arguments=list(KERNEL_ARGS), cwd=str(self.cwd),
                                           env={**os.environ, HEADLESS_ENV: "1"}, stderr=subprocess.DEVNULL)
        except RuntimeError as exc:
            raise CalcBuildError(f"the Python kernel could not be started ({sys.executable}): {exc}") from None
        self.used = False

    def discard(self) -> None:
        """Shut the kernel down if no notebook ran on it (a build that stopped early)."""
        if self.used:
            return
        self.used = True
        try:
            run_sync(self.km.shutdown_kernel)(now=True)
        except Exception:  # noqa: BLE001 - a kernel that is already gone needs nothing more
            pass


__all__ = ["KERNEL_ARGS", "KERNEL_NAME", "KernelLaunch", "ThisPythonKernelManager", "ThisPythonSpecs"]
