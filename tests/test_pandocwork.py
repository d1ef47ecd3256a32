"""Pandoc conversions started early (report.pandocwork) give the LaTeX nbconvert's filter gives.

The reference is nbconvert's own ``convert_pandoc`` (pandoc, a tool outside the project): the
exporter's LaTeX with conversions started ahead must equal, character for character, its LaTeX
without them, and every conversion the template asks for must have been started.
"""

from __future__ import annotations

import nbformat
import pytest

from splicecalc.report.exporter import CalcPackageExporter
from splicecalc.report.pandocwork import OUTPUT_MD_FORMAT, PandocWork

pytestmark = pytest.mark.skipif(__import__("shutil").which("pandoc") is None, reason="pandoc not installed")


def _notebook():
    nb = nbformat.v4.new_notebook()
    nb.metadata["splicecalc"] = {"title": "Pandoc test", "job_number": "T-1"}
    nb.cells = [
        nbformat.v4.new_markdown_cell("# Scope\n\nA *beam* with $M_{Ed}$ and a list:\n\n- one\n- two"),
        nbformat.v4.new_code_cell("x = 1", outputs=[nbformat.v4.new_output(
            "display_data", data={"text/markdown": "Job text with \\textbf{not TeX} and $5", "text/plain": "x"})]),
        nbformat.v4.new_markdown_cell("## Method\n\nSee [the clause](#scope), \\\\(a+b\\\\) and a table:\n\n"
                                      "| a | b |\n|---|---|\n| 1 | 2 |"),
        nbformat.v4.new_code_cell("y = 2", outputs=[nbformat.v4.new_output(
            "display_data", data={"text/latex": "$y$", "text/markdown": "never printed", "text/plain": "y"})]),
    ]
    return nb


def test_latex_with_conversions_started_early_is_the_same(tmp_path):
    res = {"metadata": {"name": "t", "path": str(tmp_path)}}
    plain, _ = CalcPackageExporter().to_latex(_notebook(), dict(res))
    work = PandocWork(tmp_path)
    try:
        work.start_notebook(_notebook())
        early, _ = CalcPackageExporter(pandoc_work=work).to_latex(_notebook(), dict(res))
    finally:
        work.close()
    assert early == plain
    assert work.misses == 0 and work.hits == 5          # 2 markdown cells x 2 conversions + 1 output
    assert "Job text with" in plain


def test_the_template_reads_markdown_outputs_in_the_format_named_here():
    from splicecalc.report.exporter import LATEX_DIR

    assert f"convert_pandoc('{OUTPUT_MD_FORMAT}', 'latex')" in (LATEX_DIR / "calcpackage" / "index.tex.j2").read_text()
