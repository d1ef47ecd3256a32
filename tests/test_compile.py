"""XeLaTeX passes (report.compile): as many as the .aux/.toc/.out need, seeded rebuilds, locked-down TeX.

References: latexmk's rule (run again while the auxiliary files change, compared by content);
TeX Live's kpathsea settings openin_any / openout_any = p ("paranoid") and shell_escape = f,
documented in texmf.cnf; poppler's pdftotext as the outside judge of what a PDF shows.
"""

from __future__ import annotations

import re
import shutil
import subprocess
from pathlib import Path

import pytest

from splicecalc.report.compile import predicted_toc, run_xelatex, save_seed
from splicecalc.report.errors import CalcBuildError

pytestmark = [pytest.mark.pdf,
              pytest.mark.skipif(shutil.which("xelatex") is None or shutil.which("pdftotext") is None,
                                 reason="xelatex / pdftotext not installed")]

#: a small document with what a calc package has: contents list, "Sheet N of M", hyperref outlines
DOC = r"""\documentclass[a4paper]{article}
\usepackage{fancyhdr,lastpage,hyperref}
\pagestyle{fancy}\fancyfoot[C]{Sheet \thepage\ of \pageref{LastPage}}
\begin{document}
\tableofcontents
%s
\end{document}
"""


def _sections(n: int, paragraphs: int = 6) -> str:
    body = " ".join(["Text of the check, long enough to fill lines on the sheet."] * 12)
    return "\n".join(f"\\section{{Check {i}}}\\label{{s{i}}} See section~\\ref{{s{(i % n) + 1}}} on "
                     f"sheet~\\pageref{{s{(i % n) + 1}}}.\n" + "\n\n".join([body] * paragraphs)
                     for i in range(1, n + 1))


def _build(folder: Path, tex: str, seed: Path | None = None, predict_toc: bool = True):
    folder.mkdir(parents=True, exist_ok=True)
    path = folder / "calc.tex"
    path.write_text(tex, encoding="utf-8")
    run = run_xelatex(path, progress=False, seed_dir=seed, predict_toc=predict_toc)
    if seed is not None:
        save_seed(seed, path, run.pages)
    text = subprocess.run(["pdftotext", "-layout", str(run.pdf_path), "-"], capture_output=True, text=True,
                          check=True).stdout
    return run, text


def test_a_fresh_build_runs_until_the_aux_files_settle(tmp_path):
    run, text = _build(tmp_path / "a", DOC % _sections(12), predict_toc=False)
    assert run.passes == 3 and not run.seeded            # aux, then contents shift the pages, then settled
    assert not run.toc_predicted
    assert f"Sheet 1 of {run.pages}" in text and run.pages > 3
    assert "Check 12" in text and "??" not in text        # every reference resolved


def test_the_predicted_contents_list_is_the_one_xelatex_writes(tmp_path):
    # the outside reference: the .toc XeLaTeX itself wrote, its page numbers set to 0
    tex = DOC % ("\\section*{Foreword}\\addcontentsline{toc}{section}{Foreword}\n"
                 "\\section[Short]{A long title}\\subsection{Sub one}\\subsection*{Not listed}\n"
                 "% \\section{commented out}\n\\subsubsection{Deep}\n" + _sections(3))
    run, _ = _build(tmp_path / "a", tex, predict_toc=False)
    written = run.pdf_path.with_suffix(".toc").read_text(encoding="utf-8")
    expected = [re.sub(r"\}\{\d+\}\{([a-z*]*\.[\d.]+)?\}%$", "}{0}{}%", line) for line in written.splitlines()]
    got = [re.sub(r"\}\{0\}\{([a-z*]*\.[\d.]+)?\}%$", "}{0}{}%", line) for line in predicted_toc(tex).splitlines()]
    assert got == expected and len(got) == 7
    assert "\\numberline {1.1}Sub one" in predicted_toc(tex) and "Not listed" not in predicted_toc(tex)


def test_a_fresh_build_with_the_predicted_contents_takes_two_passes_and_shows_the_same(tmp_path):
    tex = DOC % _sections(12)
    run, text = _build(tmp_path / "a", tex)
    plain, plain_text = _build(tmp_path / "b", tex, predict_toc=False)
    assert run.toc_predicted and run.passes == 2 and plain.passes == 3
    assert text == plain_text and "??" not in text


def test_a_wrong_prediction_costs_a_pass_never_a_wrong_page(tmp_path):
    # sections the prediction cannot see (made by a macro of the preamble): the contents list
    # grows on the second pass, the pages move, the passes go on until nothing changes
    tex = DOC.replace("\\begin{document}", "\\newcommand\\hiddensec[1]{\\section{#1}}\n\\begin{document}") % (
        "\n".join(f"\\hiddensec{{Hidden {i}}}" for i in range(60)) + "\n" + _sections(12))
    run, text = _build(tmp_path / "a", tex)
    plain, plain_text = _build(tmp_path / "b", tex, predict_toc=False)
    assert run.toc_predicted and run.passes >= 3
    assert text == plain_text and "??" not in text and "Hidden 59" in text


def test_sheet_of_n_that_disagrees_with_the_sheets_written_is_never_printed(tmp_path):
    # a document whose "of N" settles on a count that is not the sheets written (here a label written by
    # hand; in practice a package that writes LastPage before the last sheet): never a silent PDF
    bogus = DOC.replace(r"\usepackage{fancyhdr,lastpage,hyperref}", r"\usepackage{fancyhdr,hyperref}").replace(
        r"\end{document}", r"\makeatletter\immediate\write\@auxout{\string\newlabel{LastPage}{{}{7}{}{page.7}{}}}"
        "\n\\end{document}")
    with pytest.raises(CalcBuildError, match=r"'of 7' but 1 were written"):
        _build(tmp_path / "n", bogus % "One short check.", predict_toc=False)


def test_a_seeded_rebuild_needs_one_pass_and_shows_the_same_text(tmp_path):
    seed = tmp_path / "seed"
    tex = DOC % _sections(12)
    fresh, fresh_text = _build(tmp_path / "one", tex, seed)
    assert fresh.passes == 2 and not fresh.seeded
    again, again_text = _build(tmp_path / "two", tex, seed)
    assert again.seeded and again.passes == 1
    plain, plain_text = _build(tmp_path / "three", tex, predict_toc=False)   # three from nothing, no seed
    assert plain.passes == 3
    assert again_text == plain_text == fresh_text


def test_a_seeded_rebuild_with_a_changed_name_on_the_same_pages_needs_one_pass(tmp_path):
    # a rebuild after signing: a name appears on the cover, the pages stay as they were
    seed = tmp_path / "seed"
    _build(tmp_path / "one", DOC % ("Prepared by \\underline{\\hspace{3cm}}\n\n" + _sections(12)), seed)
    signed, text = _build(tmp_path / "two", DOC % ("Prepared by A. Engineer\n\n" + _sections(12)), seed)
    _, plain_text = _build(tmp_path / "three", DOC % ("Prepared by A. Engineer\n\n" + _sections(12)))
    assert signed.seeded and signed.passes == 1
    assert text == plain_text and "A. Engineer" in text


def test_a_seed_with_another_page_count_falls_back_to_full_passes(tmp_path):
    seed = tmp_path / "seed"
    short, _ = _build(tmp_path / "one", DOC % _sections(12), seed)
    longer_tex = DOC % _sections(20)                            # more sheets than the seed's build
    longer, text = _build(tmp_path / "two", longer_tex, seed)
    assert longer.pages > short.pages
    assert not longer.seeded and longer.seed_dropped and longer.passes >= 3   # the seeded pass, then 2-3 fresh
    assert longer.toc_predicted
    _, plain_text = _build(tmp_path / "three", longer_tex)
    assert text == plain_text and f"Sheet 1 of {longer.pages}" in text


def test_a_seed_the_document_cannot_read_is_dropped(tmp_path):
    seed = tmp_path / "seed"
    _build(tmp_path / "one", DOC % _sections(4), seed)
    (seed / "seed.aux").write_text("\\relax\n\\undefinedmacrofromanoldtemplate\n", encoding="utf-8")
    run, text = _build(tmp_path / "two", DOC % _sections(4), seed)
    assert run.seed_dropped and not run.seeded and "Check 4" in text


def test_tex_cannot_read_a_file_outside_its_folder(tmp_path):
    secret = Path("/etc/hostname")
    if not secret.is_file():
        pytest.skip("no /etc/hostname here")
    tex = "\\documentclass{article}\\begin{document}\nX\\input{/etc/hostname}Y\n\\end{document}\n"
    with pytest.raises(CalcBuildError, match=r"(?i)not found|can't|cannot|not allowed|\/etc\/hostname"):
        _build(tmp_path / "a", tex)
    assert not (tmp_path / "a" / "calc.pdf").exists()


def test_tex_cannot_read_a_parent_folder_or_a_dot_file(tmp_path):
    (tmp_path / "outside.tex").write_text("OUTSIDE-TEXT", encoding="utf-8")
    with pytest.raises(CalcBuildError):
        _build(tmp_path / "a", "\\documentclass{article}\\begin{document}\\input{../outside.tex}\\end{document}\n")
    (tmp_path / "b").mkdir()
    (tmp_path / "b" / ".hidden.tex").write_text("HIDDEN-TEXT", encoding="utf-8")
    with pytest.raises(CalcBuildError):
        _build(tmp_path / "b", "\\documentclass{article}\\begin{document}\\input{.hidden.tex}\\end{document}\n")


def test_tex_cannot_write_outside_its_folder_nor_run_commands(tmp_path):
    target = tmp_path / "written-by-tex.txt"
    tex = ("\\documentclass{article}\\begin{document}\\newwrite\\f"
           f"\\immediate\\openout\\f={target}\\immediate\\write\\f{{x}}\\immediate\\closeout\\f\n"
           "Text.\\end{document}\n")
    try:
        _build(tmp_path / "a", tex)
    except CalcBuildError:
        pass                                                    # refused outright is as good
    assert not target.exists()
    marker = tmp_path / "shell-ran"
    tex = f"\\documentclass{{article}}\\begin{{document}}\\immediate\\write18{{touch {marker}}}Text.\\end{{document}}\n"
    run, text = _build(tmp_path / "b", tex)
    assert not marker.exists() and "Text." in text
