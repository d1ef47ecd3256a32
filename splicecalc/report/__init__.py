"""Calc-package reports: notebook execution, the nbconvert exporter and LaTeX template, display helpers.

Public API (imported lazily, so ``import splicecalc.report`` stays cheap)::

    build_pdf(notebook_path, pdf_path, execute=True, progress=True) -> BuildReport
    execute_notebook(nb_or_path, cwd=None, timeout=300) -> NotebookNode
    is_protected(pdf_path) -> bool
    CalcPackageExporter                      # nbconvert --to Calc_package_PDF
    show_check(record), show_summary(records), show_table(columns, rows)
    build_demo(out_dir) -> Path
    CalcBuildError, ToolMissingError, ProtectedPDFError, CellExecutionFailed
"""

from __future__ import annotations

from importlib import import_module
from typing import Any

from .errors import (INSTALL_COMMAND, CalcBuildError, CellExecutionFailed, ProtectedPDFError,
                     ToolMissingError)

_LAZY = {
    "build_pdf": "build", "BuildReport": "build", "is_protected": "build", "write_atomic": "build",
    "execute_notebook": "execute", "CalcPackageExporter": "exporter",
    "show_check": "display", "show_summary": "display", "show_table": "display",
    "summary_output": "display", "build_demo": "demo",
}


def __getattr__(name: str) -> Any:
    if name in _LAZY:
        return getattr(import_module(f".{_LAZY[name]}", __name__), name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


__all__ = ["INSTALL_COMMAND", "CalcBuildError", "CellExecutionFailed", "ProtectedPDFError",
           "ToolMissingError", *_LAZY]
