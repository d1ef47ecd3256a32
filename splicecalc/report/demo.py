"""The demo calc package: the cross-section template filled with an invented job.

``build_demo(out_dir)`` writes ``<out_dir>/../notebooks/demo_cross_section.ipynb``
(the filled, executed notebook) and ``<out_dir>/demo_cross_section.pdf``.
The scenario is invented: no real building, firm or person.
"""

from __future__ import annotations

import ast
import os
from pathlib import Path
from typing import Any

import nbformat

from ..core.errors import InputError
from ..core.shipped import shipped_dir
from .build import BuildReport, build_pdf, write_atomic

#: folder holding the calc templates (inside the installed package, or the repository's templates/)
TEMPLATES_DIR = shipped_dir("templates")

DEMO_NAME = "demo_cross_section"

#: invented scenario: a new mezzanine beam in an existing single-storey depot
DEMO_PARAMETERS: dict[str, Any] = {
    "section": "457x191x67 UKB",
    "grade": "S355",
    "M_Ed_kNm": 265.0,
    "V_Ed_kN": 455.0,
    "position": "the cover-plate splice of beam B3, 1.8 m from grid C",
}
DEMO_METADATA: dict[str, Any] = {
    "project": "Kestrel Yard depot, mezzanine extension",
    "job_number": "KY-2417",
    "title": "Beam B3: cross-section resistance at the splice",
    "revision": "P2",
    "status": "DRAFT",
    "prepared_by": "D. Engineer (demo)",
    "checked_by": "",
    "approved_by": "",
    "basis": "EN 1993-1-1:2005 with the UK National Annex",
    "revisions": [
        {"rev": "P1", "date": "2026-11-18", "description": "Preliminary, for design team comment",
         "by": "D. Engineer (demo)", "checked": ""},
        {"rev": "P2", "date": "2026-12-02", "description": "Shear at the splice from revised plant load",
         "by": "D. Engineer (demo)", "checked": ""},
    ],
    "signatures": [],
}


def template_path(name: str) -> Path:
    """Path of a calc template ``<name>.ipynb`` (``$SPLICECALC_TEMPLATES``, then the shipped templates)."""
    folders = [Path(p) for p in os.environ.get("SPLICECALC_TEMPLATES", "").split(os.pathsep) if p] + [TEMPLATES_DIR]
    for folder in folders:
        p = folder / f"{name}.ipynb"
        if p.is_file():
            return p
    raise InputError("template", name, "a template in " + ", ".join(str(f) for f in folders))


def parameters_cell(nb: Any) -> Any:
    """The code cell tagged ``parameters``."""
    for cell in nb.cells:
        if cell.cell_type == "code" and "parameters" in cell.get("metadata", {}).get("tags", []):
            return cell
    raise InputError("notebook", "no cell tagged 'parameters'", "a template whose first code cell is tagged 'parameters'")


def fill_template(nb: Any, parameters: dict[str, Any], metadata: dict[str, Any] | None = None) -> Any:
    """Set the values in the ``parameters`` cell (keeping its comments) and the calc metadata.

    Every key of ``parameters`` must be assigned in that cell; values must be
    Python literals (str, int, float, bool).
    """
    cell = parameters_cell(nb)
    tree = ast.parse(cell.source)
    assigns = {t.id: node for node in tree.body if isinstance(node, ast.Assign)
               for t in node.targets if isinstance(t, ast.Name)}
    lines = cell.source.splitlines()
    for key, value in parameters.items():
        if key not in assigns:
            raise InputError(f"parameters.{key}", value, "one of the template parameters " + ", ".join(sorted(assigns)))
        if not isinstance(value, (str, int, float, bool)):
            raise InputError(f"parameters.{key}", value, "a str, int, float or bool literal")
        node = assigns[key]
        if node.lineno != node.end_lineno:
            raise InputError(f"parameters.{key}", value, "a parameter assigned on one line of the template")
        i = node.lineno - 1
        rest = lines[i][node.end_col_offset:]       # spaces and the comment after the old value
        lines[i] = f"{key} = {value!r}{rest}"
    cell.source = "\n".join(lines)
    if metadata is not None:
        merged = dict(nb.metadata.get("splicecalc", {}))
        merged.update(metadata)
        nb.metadata["splicecalc"] = merged
    return nb


def write_demo_notebook(notebook_dir: str | Path) -> Path:
    """Write the filled (not yet executed) demo notebook; return its path."""
    nb = nbformat.read(template_path("cross_section"), as_version=4)
    fill_template(nb, DEMO_PARAMETERS, DEMO_METADATA)
    folder = Path(notebook_dir)
    folder.mkdir(parents=True, exist_ok=True)
    path = folder / f"{DEMO_NAME}.ipynb"
    write_atomic(path, nbformat.writes(nb).encode("utf-8"))
    return path


def build_demo_report(out_dir: str | Path, notebook_dir: str | Path | None = None,
                      progress: bool = True) -> BuildReport:
    """Like :func:`build_demo` but returns the full :class:`BuildReport` (timings, log, boxes)."""
    out = Path(out_dir)
    nb_dir = Path(notebook_dir) if notebook_dir is not None else out.resolve().parent / "notebooks"
    nb_path = write_demo_notebook(nb_dir)
    return build_pdf(nb_path, out / f"{DEMO_NAME}.pdf", execute=True, progress=progress, executed_path=nb_path)


def build_demo(out_dir: str | Path, notebook_dir: str | Path | None = None, progress: bool = True) -> Path:
    """Fill the cross-section template with the demo job and build ``<out_dir>/demo_cross_section.pdf``.

    The filled, executed notebook goes to ``notebook_dir`` (default: the
    ``notebooks`` folder next to ``out_dir``). Returns the PDF path.
    """
    return build_demo_report(out_dir, notebook_dir, progress).pdf_path


__all__ = ["DEMO_METADATA", "DEMO_NAME", "DEMO_PARAMETERS", "TEMPLATES_DIR", "build_demo", "build_demo_report",
           "fill_template", "parameters_cell", "template_path", "write_demo_notebook"]
