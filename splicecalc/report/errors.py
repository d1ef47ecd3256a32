"""Errors of the calc-package build. ``str(err)`` is a short message fit for the CLI."""

from __future__ import annotations

#: apt packages the PDF build needs (XeTeX engine, the LaTeX packages our
#: template loads, Latin Modern fonts, pandoc for markdown cells)
APT_PACKAGES = ("texlive-xetex", "texlive-latex-recommended", "texlive-latex-extra", "lmodern", "pandoc")
INSTALL_COMMAND = "apt-get install -y " + " ".join(APT_PACKAGES)


class CalcBuildError(RuntimeError):
    """The calc package could not be built (failing cell, LaTeX error, ...)."""


class ToolMissingError(CalcBuildError):
    """An external program (xelatex, pandoc) is not on PATH."""

    def __init__(self, tool: str) -> None:
        self.tool = tool
        super().__init__(f"{tool} was not found on PATH; the PDF build needs it. "
                         f"Install with: {INSTALL_COMMAND}")


class ProtectedPDFError(CalcBuildError):
    """The target PDF is a signed / issued revision and must not be overwritten."""

    def __init__(self, path: str) -> None:
        self.path = path
        super().__init__(f"{path} is marked as an issued revision (see {path}.json); "
                         "it will not be overwritten. Build a new revision under another file name.")


class CellExecutionFailed(CalcBuildError):
    """A notebook cell raised: names the cell, its first source line and the exception."""

    def __init__(self, cell_number: int, first_line: str, ename: str, evalue: str) -> None:
        self.cell_number = cell_number
        self.first_line = first_line
        self.ename = ename
        self.evalue = evalue
        super().__init__(f"cell {cell_number} failed ({first_line!r}): {ename}: {evalue}")
