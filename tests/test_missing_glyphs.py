"""Characters the sheet's fonts lack are never dropped silently: the build reports them.

Outside reference: XeTeX itself. A one-line document with CJK characters in Latin Modern is
compiled with xelatex; its log says which characters it left out, and the parser must list
exactly those.
"""

from __future__ import annotations

import shutil
import subprocess

import pytest

from splicecalc.report.latexfix import missing_characters


@pytest.mark.skipif(shutil.which("xelatex") is None, reason="xelatex not installed")
def test_xetex_log_names_the_characters_left_out(tmp_path):
    tex = tmp_path / "t.tex"
    tex.write_text("\\documentclass{article}\\usepackage{fontspec}\\begin{document}"
                   "beam \u65e5\u672c x \u65e5\\end{document}\n", encoding="utf-8")
    subprocess.run(["xelatex", "-interaction=nonstopmode", "-no-shell-escape", tex.name], cwd=tmp_path,
                   capture_output=True, timeout=120)
    log = (tmp_path / "t.log").read_text(encoding="utf-8", errors="replace")
    assert missing_characters(log) == ["\u65e5 (U+65E5)", "\u672c (U+672C)"]     # each once, in order


def test_a_clean_log_has_none():
    assert missing_characters("Output written on t.pdf (1 page).\n") == []
