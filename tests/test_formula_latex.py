"""Every registered clause formula, rendered by handcalcs, compiles in the calc-package PDF.

The clause-registry test proves the rendered number equals the float one; this one proves the
LaTeX handcalcs writes for each formula is accepted by XeLaTeX through our exporter (an undefined
macro such as ``\\Mu`` from a variable named ``gamma_Mu`` stops the build) and fits the page.
Outside reference: XeTeX (TeX Live) itself, reading the generated document.
"""

from __future__ import annotations

import shutil

import nbformat
import pytest
from nbformat.v4 import new_code_cell, new_notebook, new_output

from splicecalc.core.record import Calc
from splicecalc.report.build import build_pdf
from splicecalc.report.display import CheckOutput
from splicecalc.signoff.digest import CHECK_MIME

from test_clause_registry import FORMULAS

needs_tex = pytest.mark.skipif(shutil.which("xelatex") is None or shutil.which("pandoc") is None,
                               reason="XeLaTeX / pandoc not installed (scripts/test.sh installs them)")


@pytest.mark.pdf
@needs_tex
def test_all_formulas_compile_and_fit(tmp_path):
    cells = []
    for fn in FORMULAS:
        calc = Calc(render=True)
        calc(fn, **fn.__clause__.example)
        rec = calc.record(id=fn.__name__, title=f"{fn.__module__.split('.')[-1]}.{fn.__name__}",
                          clause=fn.__clause__.citation, demand=1.0, resistance=2.0, unit="")
        cell = new_code_cell("show_check(rec)")
        cell.outputs = [new_output("display_data", data={CHECK_MIME: CheckOutput(rec)._repr_mimebundle_()[CHECK_MIME],
                                                          "text/plain": fn.__name__})]
        cells.append(cell)
    nb = new_notebook()
    nb.metadata["splicecalc"] = {"project": "Formula sheet (test)", "job_number": "TEST-0001",
                                 "title": "Every clause formula"}
    nb.cells = cells
    path = tmp_path / "formulas.ipynb"
    nbformat.write(nb, path)
    report = build_pdf(path, tmp_path / "formulas.pdf", execute=False, progress=False)
    assert report.pdf_path.is_file()
    assert report.wide_boxes == [], [str(b) for b in report.wide_boxes]
