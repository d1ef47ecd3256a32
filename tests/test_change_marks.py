"""Change marks on a rebuilt package and the comparison appendix (issue 15, item 3).

Unit tests of the pieces (which outputs changed, which issued revision is the previous one, the
appendix's LaTeX), then one real cycle, marked ``pdf``: build the demo (P1), sign it prepared and
checked, issue it, ``revise`` to P2, change one load in P2's job file, build P2. The outside
references are poppler's ``pdftotext`` (what each sheet says) and ``pdftoppm`` (the bar's pixels):
a sheet carries the bar exactly when it prints a line that issued P1 does not (the cover, the
contents and the comparison itself apart), and the cover lists those sheets.
"""

from __future__ import annotations

import hashlib
import json
import re
import shutil
import subprocess
from pathlib import Path

import pytest

from splicecalc.review.compare import changed_outputs, comparison_latex, output_fingerprint
from splicecalc.signoff.previous import previous_issue

CHECK = "application/vnd.splicecalc.check+json"
TABLE = "application/vnd.splicecalc.table+json"
FIGURE = "application/vnd.splicecalc.figure+json"


def _out(data: dict) -> dict:
    return {"output_type": "display_data", "metadata": {}, "data": data}


def _nb(*outputs_per_cell: list[dict]) -> dict:
    return {"cells": [{"cell_type": "code", "id": f"cell-{i}", "execution_count": i, "metadata": {}, "source": "",
                       "outputs": list(outs)} for i, outs in enumerate(outputs_per_cell, 1)],
            "metadata": {}, "nbformat": 4, "nbformat_minor": 5}


def _check(cid: str, u: float) -> dict:
    return _out({CHECK: {"id": cid, "title": cid, "utilisation": u, "ok": u <= 1}, "text/plain": cid})


def _project(rev: str) -> dict:
    return _out({TABLE: {"title": "Project (from the job file)", "columns": ["Project item", "Value"],
                         "rows": [["Number", "J1"], ["Revision", rev]]}, "text/plain": "project"})


# ----------------------------------------------------------------- which outputs changed
def _rev(nb: dict, rev: str) -> dict:
    nb["metadata"] = {"splicecalc": {"revision": rev}}
    return nb


def test_same_content_is_unchanged_and_the_revision_code_alone_is_no_change():
    line = "**Project (from the job file):** number J1; title Beam; revision {}."
    old = _rev(_nb([_project("P1"), _md(line.format("P1")), _check("a", 0.5)], [_check("b", 0.7)]), "P1")
    new = _rev(_nb([_project("P2"), _md(line.format("P2")), _check("a", 0.5)], [_check("b", 0.7)]), "P2")
    assert changed_outputs(old, new) == []
    other = _rev(_nb([_project("P3"), _md(line.format("P3")), _check("a", 0.5)], [_check("b", 0.7)]), "P2")
    assert changed_outputs(old, other) == [(0, 0), (0, 1)]          # not the package's own code: a change
    assert output_fingerprint(_md("plate P2 of 4"), "P2") != output_fingerprint(_md("plate P1 of 4"), "P1")


def test_a_changed_record_is_marked_at_its_place_and_a_moved_one_is_not():
    old = _nb([_check("a", 0.5), _check("b", 0.7)])
    new = _nb([_check("b", 0.7)], [_check("a", 0.6)])          # b moved to another cell; a's numbers changed
    assert changed_outputs(old, new) == [(1, 0)]


def test_an_output_printed_once_more_counts_as_changed():
    old = _nb([_check("a", 0.5)])
    new = _nb([_check("a", 0.5), _check("a", 0.5)])
    assert changed_outputs(old, new) == [(0, 1)]


def test_a_figure_is_compared_by_its_data_not_its_image_bytes():
    a = _out({FIGURE: {"kind": "beam", "span_mm": 7200}, "image/png": "AAAA", "application/pdf": "PDF1"})
    b = _out({FIGURE: {"kind": "beam", "span_mm": 7200}, "image/png": "BBBB", "application/pdf": "PDF2"})
    c = _out({FIGURE: {"kind": "beam", "span_mm": 7500}, "image/png": "AAAA", "application/pdf": "PDF1"})
    assert output_fingerprint(a) == output_fingerprint(b) != output_fingerprint(c)


def test_printed_text_is_compared_as_printed():
    s1 = {"output_type": "stream", "name": "stdout", "text": ["a\n", "b\n"]}
    s2 = {"output_type": "stream", "name": "stdout", "text": "a\nb\n"}
    s3 = {"output_type": "stream", "name": "stdout", "text": "a\nc\n"}
    assert output_fingerprint(s1) == output_fingerprint(s2) != output_fingerprint(s3)


# ----------------------------------------------------------------- the previous issued revision
def _issued(folder: Path, rev: str, name: str, nb_text: str = "{}", job: str = "J1", title: str = "T") -> dict:
    pdf = folder / f"{name}.pdf"
    pdf.write_bytes(f"not a real pdf {rev}".encode())
    (folder / f"{name}.ipynb").write_text(nb_text, encoding="utf-8")
    return {"revision": rev, "file": pdf.name, "job_number": job, "title": title,
            "time_utc": f"2026-12-0{len(rev)}T10:00:00+00:00",
            "pdf_sha256": hashlib.sha256(pdf.read_bytes()).hexdigest()}


def _meta(rev: str, history: list[str]) -> dict:
    return {"revision": rev, "job_number": "J1", "title": "T", "revisions": [{"rev": r} for r in history]}


def test_the_previous_issue_is_the_last_one_before_this_revision(tmp_path):
    rows = [_issued(tmp_path, "P1", "calc"), _issued(tmp_path, "P2", "calc_P2"),
            _issued(tmp_path, "P1", "other", job="J2")]
    (tmp_path / "issue_register.json").write_text(json.dumps(rows), encoding="utf-8")
    found, note = previous_issue(_meta("P3", ["P1", "P2", "P3"]), [tmp_path])
    assert note == "" and found.revision == "P2" and found.pdf.name == "calc_P2.pdf"
    assert found.notebook.name == "calc_P2.ipynb"
    found, _ = previous_issue(_meta("P2", ["P1", "P2"]), [tmp_path])          # P2's own issue is not "previous"
    assert found.revision == "P1" and found.pdf.name == "calc.pdf"
    assert previous_issue(_meta("P1", ["P1"]), [tmp_path]) == (None, "")          # nothing before P1
    assert previous_issue(dict(_meta("P3", ["P1", "P2", "P3"]), title="U"), [tmp_path]) == (None, "")


def test_a_changed_or_incomplete_issued_file_is_not_compared_with_and_says_why(tmp_path):
    rows = [_issued(tmp_path, "P1", "calc")]
    (tmp_path / "issue_register.json").write_text(json.dumps(rows), encoding="utf-8")
    (tmp_path / "calc.pdf").write_bytes(b"edited after the issue")
    found, note = previous_issue(_meta("P2", ["P1", "P2"]), [tmp_path])
    assert found is None and "SHA-256" in note and "not marked" in note
    rows = [_issued(tmp_path, "P1", "calc")]
    (tmp_path / "calc.ipynb").unlink()
    found, note = previous_issue(_meta("P2", ["P1", "P2"]), [tmp_path])
    assert found is None and "notebook" in note


# ----------------------------------------------------------------- the appendix's LaTeX
def test_every_notebook_text_reaches_tex_escaped():
    evil = r"\input{/etc/passwd}$x^^5c\write18{id}"
    c = {"old": {"name": evil, "revision": "P1", "checks_count": 1},
         "new": {"name": "b", "revision": "P2", "checks_count": 1}, "threshold_utilisation": 0.005,
         "changed": True, "changed_inputs": [{"input": evil, "old": evil, "new": "1 kN"}],
         "moved_checks": [{"id": evil, "title": evil, "old_utilisation": 0.5, "new_utilisation": 0.6,
                           "change_utilisation": 0.1, "old_verdict": "OK", "new_verdict": "OK"}],
         "added_checks": [{"id": evil, "title": evil, "utilisation": None, "verdict": "NOT CHECKED"}],
         "removed_checks": [],
         "governing_by_part": [{"part": evil, "title": evil, "old": {"id": evil, "utilisation": 0.5}, "new": None,
                                "governing_changed": True, "changed": True}]}
    tex = comparison_latex(c)
    assert r"\input" not in tex and r"\write" not in tex and "^^" not in tex
    # (core.text.escape_tex puts break points, \hspace{0pt}, into long unbroken runs: counted without them)
    assert tex.replace(r"\hspace{0pt}", "").count(r"\textbackslash{}input") == 10   # name, input, old value,
    # 2 moved, 2 added, part (2), governing
    assert "+0.100" in tex and "Checks removed" in tex


# ----------------------------------------------------------------- a real revise / issue / rebuild cycle
PW = b"cycle passphrase"
NAME = "demo_workshop_gallery"
POINT_OLD = 'point = "18 kN"'        # the demo's "extract fan unit" (3rd [[load]])
POINT_NEW = 'point = "21 kN"'


def _pages(pdf: Path) -> list[list[str]]:
    """pdftotext's lines of each sheet, spaces collapsed, without the strip and the footer."""
    text = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], capture_output=True, text=True, check=True).stdout
    out = []
    for page in text.split("\f")[:-1]:
        lines = [re.sub(r"\s+", " ", ln).strip() for ln in page.splitlines()]
        out.append([ln for ln in lines if ln and "Sheet " not in ln and "Rev. P" not in ln
                    and not ln.startswith("Printed ") and not ln.startswith("Demo Estates")])
    return out


def _appendix(pages: list[list[str]]) -> int:
    """The sheet the comparison starts on (its heading is in the contents too: found by its first line)."""
    return next(i for i, page in enumerate(pages, 1) if any(ln.startswith("Compared: ") for ln in page))


@pytest.fixture(scope="module")
def cycle(tmp_path_factory):
    from splicecalc.signoff import keys
    from splicecalc.signoff.package import issue_package, sign_package
    from splicecalc.signoff.revise import revise
    from splicecalc.workflow.package import build_demo, build_package

    if not (shutil.which("pdftotext") and shutil.which("pdftoppm")):
        pytest.skip("poppler-utils (pdftotext, pdftoppm) not installed")
    root = tmp_path_factory.mktemp("marks")
    mp = pytest.MonkeyPatch()
    mp.setenv(keys.TRUST_DIR_ENV, str(root / "trust"))
    ka = keys.new_key("A. Preparer", root / "a.p12", PW)
    kb = keys.new_key("B. Checker", root / "b.p12", PW)
    for k, n in ((ka, "a"), (kb, "b")):
        keys.export_cert(k, root / f"{n}.pem")
        keys.trust_cert(root / f"{n}.pem")
    pkg = root / "pkg"
    p1 = build_demo(pkg, progress=False)
    assert p1.changed_since == "" and p1.changed_sheets == ()          # nothing issued before P1
    sign_package(p1.pdf, "prepared", ka)
    sign_package(p1.pdf, "checked", kb, accept_not_checked="the three items are checked separately (test)")
    issue_package(p1.pdf, "for construction", kb)
    r = revise(p1.pdf, "P2", "fan unit heavier")
    text = r.job.read_text(encoding="utf-8")
    assert text.count(POINT_OLD) == 1
    r.job.write_text(text.replace(POINT_OLD, POINT_NEW), encoding="utf-8")
    p2 = build_package(r.notebook, progress=False)
    yield {"p1": p1, "p2": p2, "root": root}
    mp.undo()


@pytest.mark.pdf
def test_exactly_the_sheets_that_print_something_new_carry_the_bar(cycle):
    p1, p2 = cycle["p1"], cycle["p2"]
    assert p2.changed_since == "P1"
    old, new = _pages(p1.pdf), _pages(p2.pdf)
    seen = {ln for page in old for ln in page}
    labelled = {i for i, page in enumerate(new, 1) if "changed since P1" in page}       # the bar's label
    assert labelled == set(p2.changed_sheets) and labelled
    appendix = _appendix(new)
    # the body starts with its first section's heading on the contents' last sheet (the contents' line for
    # it ends in a sheet number); up to that sheet: cover and contents (new page numbers), not compared
    # here (that sheet also prints the job inputs' first table, whose output carries the whole job)
    start = next(i for i, page in enumerate(new, 1) if "1 Scope of this calculation" in page)
    for i, page in enumerate(new, 1):
        if i < start or i >= appendix:   # cover, contents and the comparison itself
            assert i not in labelled
            continue
        if i == start:
            continue
        novel = [ln for ln in page if ln not in seen and ln != "changed since P1"]
        assert (i in labelled) == bool(novel), (i, novel[:3])
    assert 0 < len(labelled) < len(new) - 5          # the unchanged sheets (rules, method) carry none


def _ranges(pages: tuple[int, ...]) -> str:
    out, run = [], [pages[0]]
    for p in pages[1:]:
        if p == run[-1] + 1:
            run.append(p)
        else:
            out.append(run)
            run = [p]
    out.append(run)
    return ", ".join(str(r[0]) if len(r) == 1 else f"{r[0]}–{r[-1]}" for r in out)


@pytest.mark.pdf
def test_the_cover_lists_the_sheets_and_the_comparison_is_bound_in(cycle):
    p2 = cycle["p2"]
    new = _pages(p2.pdf)
    cover = " ".join(new[0])
    assert f"Changed since P1 sheets {_ranges(p2.changed_sheets)} (a bar in the left margin)" in cover
    appendix = _appendix(new)
    assert f"what changed from issued revision P1: sheet {appendix}" in cover
    tail = " ".join(ln for page in new[appendix - 1:] for ln in page)
    assert "load[3].point 18 kN 21 kN" in tail


@pytest.mark.pdf
def test_the_bar_is_drawn_in_the_left_margin_of_a_changed_sheet_only(cycle):
    from PIL import Image

    p2 = cycle["p2"]
    marked = p2.changed_sheets[0]
    unmarked = next(i for i in range(4, 50) if i not in p2.changed_sheets)
    dpi = 72
    x = round((20 - 6) / 25.4 * dpi)          # 6 mm left of the 20 mm margin (the template's \calcchgbar)
    blue = {}
    for page in (marked, unmarked):
        stem = cycle["root"] / f"sheet{page}"
        subprocess.run(["pdftoppm", "-r", str(dpi), "-png", "-singlefile", "-f", str(page), "-l", str(page),
                        str(p2.pdf), str(stem)], check=True)
        img = Image.open(f"{stem}.png").convert("RGB")
        col = [img.getpixel((xx, y)) for y in range(img.height // 4, 3 * img.height // 4) for xx in (x - 1, x, x + 1)]
        blue[page] = sum(1 for r, g, b in col if b > 120 and r < 110 and b - r > 50)
    assert blue[marked] > 100 and blue[unmarked] == 0


@pytest.mark.pdf
def test_compare_writes_the_appendix_pdf_and_never_over_an_issued_file(cycle, capsys):
    from splicecalc.cli.main import main

    p1, p2 = cycle["p1"], cycle["p2"]
    out = cycle["root"] / "changes_P1_P2.pdf"
    assert main(["compare", str(p1.pdf), str(p2.pdf), "--pdf", str(out)]) == 1
    text = subprocess.run(["pdftotext", "-layout", str(out), "-"], capture_output=True, text=True, check=True).stdout
    flat = re.sub(r"\s+", " ", text)
    assert "Changes from revision P1 to revision P2" in flat and "load[3].point 18 kN 21 kN" in flat
    assert "Sheet 1 of" in flat and "Before relying on these calculations" in flat
    before = p1.pdf.read_bytes()
    capsys.readouterr()
    assert main(["compare", str(p1.pdf), str(p2.pdf), "--pdf", str(p1.pdf)]) == 2
    err = capsys.readouterr().err
    assert "--pdf" in err and "never overwritten" in err and len(err.strip().splitlines()) == 1
    assert p1.pdf.read_bytes() == before


# ----------------------------------------------------------------- the template's wiring (LaTeX only, no XeLaTeX)
def _md(text: str) -> dict:
    return _out({"text/markdown": text, "text/plain": text})


def _latex(nb: dict, **resources) -> str:
    import nbformat

    from splicecalc.report.exporter import CalcPackageExporter

    node = nbformat.from_dict(nb)
    node.metadata["splicecalc"] = {"title": "T", "job_number": "J1", "revision": "P2"}
    latex, _ = CalcPackageExporter().to_latex(node, {"metadata": {"name": "calc"}, **resources})
    return latex


@pytest.mark.skipif(shutil.which("pandoc") is None, reason="pandoc not installed")
def test_only_the_changed_output_is_wrapped_and_the_comparison_is_bound_in():
    old = _nb([_md("Span 7.2 m"), _md("Load 4 kN/m")], [{"output_type": "stream", "name": "stdout", "text": "kept\n"}])
    old["cells"][0]["outputs"].append(_out({"application/vnd.splicecalc.job+json": {"beam": {"span": "7.2 m"}},
                                            "text/plain": "job"}))
    new = json.loads(json.dumps(old))
    new["cells"][0]["outputs"][1] = _md("Load 5 kN/m")
    new["cells"][0]["outputs"][2]["data"]["application/vnd.splicecalc.job+json"] = {"beam": {"span": "7.5 m"}}
    tex = _latex(new, previous={"revision": "P1", "notebook": old, "name": "calc.pdf"})
    body = tex[tex.index(r"\begin{document}"):]
    assert body.count(r"\calcchangedbegin") == body.count(r"\calcchangedend") == 1
    inner = body[body.index(r"\calcchangedbegin"):body.index(r"\calcchangedend")]
    assert "Load 5" in inner and "Span" not in inner and "kept" not in inner
    assert r"\renewcommand\calcchgsince{P1}" in tex and r"\calcchangedsheets" in body
    assert r"\section{Changes since issued revision P1}" in body and "beam.span & 7.2 m & 7.5 m" in body
    plain = _latex(new)                                 # no previous issue: no marks, no appendix, no cover row
    plain = plain[plain.index(r"\begin{document}"):]
    assert r"\calcchangedbegin" not in plain and "Changes since issued" not in plain and "Changed since" not in plain


@pytest.mark.skipif(shutil.which("pandoc") is None, reason="pandoc not installed")
def test_a_reason_for_no_marks_is_printed_on_the_cover_escaped():
    tex = _latex(_nb([_md("x")]), changes_note="calc_P1.pdf is not the file issued as P1 ({#})")
    assert r"Changes & not marked: calc\_P1.pdf is not the file issued as P1 (\{\#\})" in tex


@pytest.mark.skipif(shutil.which("pandoc") is None, reason="pandoc not installed")
def test_a_notebook_without_job_inputs_is_still_marked_and_says_why_it_is_not_compared():
    old = _nb([_md("Section 254x146x31 UKB"), _md("M_c,Rd = 130 kN m")])
    new = _nb([_md("Section 254x146x31 UKB"), _md("M_c,Rd = 131 kN m")])
    tex = _latex(new, previous={"revision": "A", "notebook": old, "name": "calc.pdf"})
    body = tex[tex.index(r"\begin{document}"):]
    assert body.count(r"\calcchangedbegin") == 1 and "131" in body[body.index(r"\calcchangedbegin"):]
    assert r"\section{Changes since issued revision A}" in body and "No comparison of inputs and checks" in body
