"""Calc-package pipeline: equation splitting, log parsing, display outputs, PDF build.

References outside the project:
* the PDF is read back with poppler's ``pdftotext`` / ``pdftoppm`` (poppler-utils);
* overfull boxes are read from the XeTeX log in TeX's own message format
  ("Overfull \\hbox (12.3pt too wide) ...", The TeXbook, ch. 6, from memory);
* section data: 457x191x67 UKB, W_pl,y = 1471 cm3 (BS 4-1 section table, from memory);
  M_c,Rd = W_pl,y f_y / gamma_M0, EN 1993-1-1:2005, 6.2.5, Eq. 6.13.

Slow tests (XeLaTeX) are marked ``pdf``; the demo PDF is built once per module.
"""

from __future__ import annotations

import json
import os
import re
import shutil
import subprocess
from pathlib import Path

import nbformat
import numpy as np
import pytest
from nbformat.v4 import new_code_cell, new_markdown_cell, new_notebook, new_output

from splicecalc.core.record import Calc
from splicecalc.report import latexfix
from splicecalc.report.build import build_pdf, is_protected, sidecar_path
from splicecalc.report.display import CHECK_MIME, TABLE_MIME, CheckOutput, summary_output
from splicecalc.report.errors import INSTALL_COMMAND, CalcBuildError, CellExecutionFailed, ProtectedPDFError, \
    ToolMissingError
from splicecalc.report.latexout import check_latex, escape_tex, prose_tex

SNAPSHOTS = Path(__file__).with_name("snapshots")
HAVE_TEX = all(shutil.which(t) for t in ("xelatex", "pandoc", "pdftotext", "pdftoppm"))
needs_tex = pytest.mark.skipif(not HAVE_TEX, reason="xelatex, pandoc or poppler-utils missing")

# handcalcs output shapes (copied from handcalcs 1.9 renderings of splicecalc formulas)
SHORT = ("$$\n\\begin{aligned}\nV_{pl_{Rd}} &= A_{v} \\cdot \\frac{ f_{y} }{ \\sqrt { 3 } }  = "
         "4094.339\\ \\mathrm{mm}^{2} \\cdot \\frac{ 355.000\\ \\mathrm{MPa} }{ \\sqrt { 3 } } "
         "&= 839.173\\ \\mathrm{kN}  \n\\end{aligned}\n$$")
LONG = ("$$\n\\begin{aligned}\nA_{v_{0}} &= A - 2 \\cdot b \\cdot t_{f} \\\\&= 8550.769\\ \\mathrm{mm}^{2} - 2 \\cdot "
        "189.900\\ \\mathrm{mm} \\cdot 12.700\\ \\mathrm{mm} \\\\&= 3727.3\\ \\mathrm{mm}^{2}  \\\\\n\\\\\n"
        "A_{v} &= \\operatorname{max} \\left( A_{v_{0}} ,\\  A_{v_{min}} \\right)  = \\operatorname{max} "
        "\\left( 3727.3 ,\\  3638.0 \\right) &= 3727.3  \n\\end{aligned}\n$$")
COND = ("$$\n\\begin{aligned}\n\\mathrm{ratio} &= \\frac{ V_{Ed} }{ V_{pl_{Rd}} }  = \\frac{ 300.000\\ \\mathrm{kN} }"
        "{ 1.000\\ \\mathrm{MN} } &= 0.300  \n\\\\\n&\\text{Since, } \\mathrm{ratio} \\leq 0.5 \\rightarrow "
        "\\left( 0.300 \\leq 0.5 \\right) :   \\\\\n\\rho &= 0.000 \\; \n\\end{aligned}\n$$")


# ------------------------------------------------------------------ equation splitting
def test_short_step_is_set_on_one_line():
    out = latexfix.break_handcalcs(SHORT)
    assert "\\begin{aligned}" not in out and "\\begin{calcsteps}" in out
    rows = out.split("\\begin{calcsteps}")[1].split("\\end{calcsteps}")[0].strip().split("\\\\*")
    assert len(rows) == 1                                   # symbol = formula = numbers = result
    row = rows[0].strip()
    assert row.startswith("V_{pl_{Rd}} &= \\calcfit{A_{v}")
    assert row.index("A_{v}") < row.index("355.000") < row.index("839.173")
    assert "\\calclhs{V_{pl_{Rd}}}" in out                  # lhs measured for the row width


def test_long_step_is_split_into_symbolic_numeric_result():
    # M_cr-like step: the formula and its numbers do not share one row, the numbers and the result do
    sym = " + ".join(f"C_{{{i}}} \\cdot \\frac{{ \\pi^{{2}} \\cdot E \\cdot I_{{z}} }}{{ L_{{cr}}^{{2}} }}" for i in range(3))
    num = " + ".join(f"1.{i}00 \\cdot \\frac{{ 9.870 \\cdot 210.000\\ \\mathrm{{GPa}} \\cdot 645.000\\ "
                     f"\\mathrm{{cm}}^{{4}} }}{{ (3200.000\\ \\mathrm{{mm}})^{{2}} }}" for i in range(2))
    long_pieces = [sym, num, "400.123\\ \\mathrm{kN} \\cdot \\mathrm{m}"]
    room = latexfix.ROW_FILL * (latexfix.RHS_ROOM_EM - latexfix.shown_width("M_{cr}"))
    widths = [latexfix.shown_width(p) for p in long_pieces]
    assert sum(widths) > room > widths[1] + widths[2] + 1.34   # too long for one row; numbers = result fit one
    tex = "$$\n\\begin{aligned}\nM_{cr} &= " + " = ".join(long_pieces[:2]) + " &= " + long_pieces[2] + "\n\\end{aligned}\n$$"
    out = latexfix.break_handcalcs(tex)
    body = out.split("\\begin{calcsteps}")[1].split("\\end{calcsteps}")[0]
    rows = body.split("\\\\*")
    assert len(rows) == 2 and "L_{cr}" in rows[0] and "210.000" not in rows[0]   # the formula alone
    assert "210.000" in rows[1] and rows[1].rstrip().endswith("400.123\\ \\mathrm{kN} \\cdot \\mathrm{m}}")


def test_shown_width_counts_a_fraction_by_its_wider_part():
    # a stacked fraction prints as wide as its wider line, not the sum of both (TeX's \frac)
    frac = latexfix.shown_width("\\frac{ 245.000\\ \\mathrm{mm}^{2} }{ 1.250 }")
    assert frac == pytest.approx(latexfix.shown_width("245.000\\ \\mathrm{mm}^{2}") + 0.25)
    assert latexfix.shown_width("a \\cdot b") > latexfix.shown_width("ab")       # operator spacing counted


def test_packing_never_loses_or_reorders_a_piece():
    long = "\\operatorname{min} \\left( " + " + ".join(["123.456\\ \\mathrm{kN}"] * 12) + " \\right)"
    for pieces in (["a", "b", "c"], ["a", long, "c"], [long, long, "1.000"], [long, "c"]):
        rows = latexfix._pack(pieces, room=40.0)
        assert [p for r in rows for p in r] == pieces
        assert all(len(r) == 1 or sum(latexfix.shown_width(p) for p in r) <= 40.0 for r in rows)


def test_several_steps_keep_every_piece():
    out = latexfix.break_handcalcs(LONG)
    body = out.split("\\begin{calcsteps}")[1].split("\\end{calcsteps}")[0]
    steps = body.split("\\\\[0.6ex]")
    assert len(steps) == 2                                  # two statements -> two steps
    for piece in ("8550.769", "189.900", "3727.3", "3638.0", "\\operatorname{max}"):
        assert piece in out


def test_conditional_text_row_is_kept_whole():
    out = latexfix.break_handcalcs(COND)
    assert "&\\calcfit{\\text{Since, } \\mathrm{ratio} \\leq 0.5" in out
    assert "\\rho &= \\calcfit{0.000}" in out


def test_unrecognised_block_is_kept_in_a_fitting_box():
    tex = "$$\\begin{aligned}x &= \\begin{cases} 1 & a \\\\ 2 & b\\end{cases}\\end{aligned}$$"
    out = latexfix.break_handcalcs(tex)
    assert out.startswith("\\calcfitblock{\\begin{aligned}") and "\\begin{cases}" in out


def test_pandoc_display_brackets_are_handled_too():
    tex = SHORT.replace("$$\n", "\\[\n", 1).rsplit("$$", 1)[0] + "\\]"
    assert "\\begin{calcsteps}" in latexfix.break_handcalcs(tex)


# ------------------------------------------------------------------ log parsing
LOG = """(./calc.tex
Overfull \\hbox (12.34567pt too wide) in paragraph at lines 120--121
[]\\TU/lmr/m/n/10 text|
Overfull \\hbox (0.5pt too wide) detected at line 88
Overfull \\vbox (3.0pt too high) has occurred while \\output is active
LaTeX Warning: Label(s) may have changed. Rerun to get cross-references right.
"""


def test_overfull_boxes_are_parsed_with_their_width():
    boxes = latexfix.overfull_boxes(LOG)
    assert [(b.kind, b.amount_pt) for b in boxes] == [("hbox", 12.34567), ("hbox", 0.5), ("vbox", 3.0)]
    assert "lines 120--121" in boxes[0].where
    assert latexfix.needs_rerun(LOG) and not latexfix.needs_rerun("Output written on calc.pdf (3 pages).")


def test_first_error_names_the_line():
    log = "./calc.tex:182: Undefined control sequence.\nl.182 \\tightlist\n"
    assert latexfix.first_error(log) == "Undefined control sequence. (line 182)"
    assert latexfix.first_error("! Missing $ inserted.\n<inserted text>\nl.7 a_b\n") == \
        "Missing $ inserted. (line 7: a_b)"


# ------------------------------------------------------------------ display outputs
def _record(title: str, demand: float, resistance: float, unit: str = "N"):
    calc = Calc()
    return calc.record(id=title.lower().replace(" ", "_"), title=title, clause="EN 1993-1-1:2005, 6.2.6",
                       demand=demand, resistance=resistance, unit=unit)


def test_check_output_bundle_has_data_markdown_and_text():
    rec = _record("Shear resistance", 455e3, 839.2e3)
    bundle = CheckOutput(rec)._repr_mimebundle_()
    p = bundle[CHECK_MIME]
    assert p["utilisation"] == pytest.approx(455 / 839.2)   # hand calculation E_d / R_d
    assert p["demand_kN"] == pytest.approx(455.0) and p["unit"] == "kN"  # CheckRecord.to_dict keys kept
    assert "utilisation **0.54** — **OK**" in bundle["text/markdown"]
    json.dumps(p)                                            # notebook JSON must accept it


def test_summary_is_sorted_by_utilisation_and_flags_failures():
    recs = [_record("A", 100e3, 400e3), _record("B", 500e3, 400e3), _record("C", 300e3, 400e3)]
    p = summary_output(recs)._repr_mimebundle_()[TABLE_MIME]
    assert [r[0] for r in p["rows"]] == ["B", "C", "A"]      # 1.25 > 0.75 > 0.25
    assert p["rows"][0][-1] == "NOT OK" and p["notes"] == "1 check(s) NOT OK."


def test_summary_info_without_a_quantity_prints_a_dash_as_its_sheet():
    from splicecalc.core.record import Calc
    info = Calc().info(id="web_bearing", title="Web at the supports", clause="EN 1993-1-5:2006, 6.1")
    cls = Calc().info(id="classification", title="Class", clause="EN 1993-1-1:2005, 5.5", demand=50.3,
                      resistance=58.6)
    rows = {r[0]: r for r in summary_output([info, cls])._repr_mimebundle_()[TABLE_MIME]["rows"]}
    assert rows["Web at the supports"][1:3] == ["-", "-"] and rows["Web at the supports"][-1] == "INFO"
    assert rows["Class"][1] != "-"                           # an INFO with a quantity keeps it


def test_check_latex_escapes_text_and_marks_the_verdict():
    rec = _record("Weld & plate_1", 50e3, 40e3)
    tex = check_latex(CheckOutput(rec)._repr_mimebundle_()[CHECK_MIME])
    assert "\\calccheck{Weld \\& plate\\_1}" in tex
    assert "{1.25}{\\calcfail}" in tex                       # 50 / 40
    assert escape_tex("f ≤ 5%") == "f $\\leq$ 5\\%"


def test_prose_notes_set_code_symbols_as_math():
    assert prose_tex("V_Ed <= 0.5 V_pl,Rd: no reduction") == "$V_{Ed}$ $\\leq$ 0.5 $V_{pl,Rd}$: no reduction"
    assert prose_tex("gamma_M0 = 1.0 & 50%") == "$\\gamma_{M0}$ = 1.0 \\& 50\\%"
    assert prose_tex("kept $x_1$") == "kept $x_1$"


# ------------------------------------------------------------------ snapshots
def _snapshot(name: str, text: str) -> None:
    path = SNAPSHOTS / name
    if os.environ.get("SPLICECALC_UPDATE_SNAPSHOTS") or not path.exists():
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text(text, encoding="utf-8")
    assert text == path.read_text(encoding="utf-8"), f"rendering changed; see {path}"


def test_snapshot_rendered_shear_resistance():
    from splicecalc.members import en1993_1_1 as f11

    calc = Calc(render=True)
    V = calc(f11.V_pl_Rd, A_v=4094.339, f_y=355.0, gamma_M0=1.0)
    assert V == pytest.approx(4094.339 * 355.0 / 3 ** 0.5)   # EN 1993-1-1 Eq. 6.18 by hand
    _snapshot("V_pl_Rd.tex", calc.latex[0] + "\n")
    _snapshot("V_pl_Rd.calcsteps.tex", latexfix.break_handcalcs(calc.latex[0]) + "\n")


def test_snapshot_rendered_bending_resistance():
    from splicecalc.members import en1993_1_1 as f11

    calc = Calc(render=True)
    M = calc(f11.M_c_Rd, W_y=1471e3, f_y=355.0, gamma_M0=1.0)
    assert M == pytest.approx(1471e3 * 355.0)                # EN 1993-1-1 Eq. 6.13 by hand
    _snapshot("M_c_Rd.tex", calc.latex[0] + "\n")
    _snapshot("M_c_Rd.calcsteps.tex", latexfix.break_handcalcs(calc.latex[0]) + "\n")


# ------------------------------------------------------------------ build guards (fast)
def _tiny_notebook(path: Path, cells: list, meta: dict | None = None) -> Path:
    nb = new_notebook()
    nb.metadata["splicecalc"] = meta or {"project": "Test Yard canopy", "job_number": "TY-0001",
                                         "title": "Pipeline test"}
    nb.cells = cells
    nbformat.write(nb, path)
    return path


def test_protected_pdf_is_not_overwritten(tmp_path):
    nb = _tiny_notebook(tmp_path / "c.ipynb", [new_markdown_cell("# A")])
    pdf = tmp_path / "c.pdf"
    pdf.write_bytes(b"%PDF-1.5 issued revision")
    sidecar_path(pdf).write_text(json.dumps({"issued": True}))
    assert is_protected(pdf)
    with pytest.raises(ProtectedPDFError, match="issued revision"):
        build_pdf(nb, pdf, execute=False, progress=False)
    assert pdf.read_bytes() == b"%PDF-1.5 issued revision"
    sidecar_path(pdf).write_text(json.dumps({"issued": False}))
    assert not is_protected(pdf)
    sidecar_path(pdf).write_text("{not json")
    assert is_protected(pdf)                                 # unreadable record: stay safe


def test_missing_xelatex_gives_the_install_command(tmp_path, monkeypatch):
    from splicecalc.report import compile as comp

    nb = _tiny_notebook(tmp_path / "c.ipynb", [new_markdown_cell("# A")])
    real_which = shutil.which
    monkeypatch.setattr(comp.shutil, "which", lambda name: None if name == "xelatex" else real_which(name))
    with pytest.raises(ToolMissingError) as err:
        build_pdf(nb, tmp_path / "c.pdf", execute=False, progress=False)
    assert INSTALL_COMMAND in str(err.value) and "xelatex" in str(err.value)
    assert not (tmp_path / "c.pdf").exists()


def test_bad_metadata_fails_before_any_work(tmp_path):
    nb = _tiny_notebook(tmp_path / "c.ipynb", [new_markdown_cell("# A")], meta={"status": "MAYBE"})
    with pytest.raises(ValueError, match="status"):
        build_pdf(nb, tmp_path / "c.pdf", execute=False, progress=False)


def test_failing_cell_stops_the_build_and_leaves_no_pdf(tmp_path):
    nb = _tiny_notebook(tmp_path / "c.ipynb", [
        new_markdown_cell("# Calc"),
        new_code_cell("x = 1"),
        new_code_cell("M_Ed = check_something(x)  # undefined on purpose\ny = 2"),
        new_code_cell("z = 3"),
    ])
    # a stale kernelspec name in the notebook must not matter: the running interpreter is the kernel
    node = nbformat.read(nb, as_version=4)
    node.metadata["kernelspec"] = {"name": "no-such-kernel", "display_name": "gone", "language": "python"}
    nbformat.write(node, nb)
    pdf = tmp_path / "out" / "c.pdf"
    with pytest.raises(CellExecutionFailed) as err:
        build_pdf(nb, pdf, execute=True, progress=False)
    msg = str(err.value)
    assert "cell 3" in msg and "M_Ed = check_something(x)" in msg and "NameError" in msg
    assert "Traceback" not in msg and "\x1b[" not in msg
    assert isinstance(err.value, CalcBuildError)
    assert not pdf.exists() and not list((tmp_path / "out").glob("*.part"))


# ------------------------------------------------------------------ PDF builds
def _pages(pdf: Path) -> list[str]:
    txt = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], capture_output=True, check=True,
                         text=True).stdout
    return [p for p in txt.split("\f") if p.strip()]


def _wide_equation_notebook(path: Path) -> Path:
    """A notebook with outputs already in it (no kernel): a check whose substitution is far too wide."""
    terms = " + ".join(f"a_{{{i}}} \\cdot b_{{{i}}}" for i in range(40))
    nums = " + ".join(f"{i}.125\\ \\mathrm{{kN}} \\cdot {i}.500\\ \\mathrm{{mm}}" for i in range(40))
    step = f"$$\n\\begin{{aligned}}\nM_{{sum}} &= {terms}  = {nums} &= 1.000\\ \\mathrm{{kN}}  \n\\end{{aligned}}\n$$"
    rec = _record("Very long sum", 1e3, 2e3)
    payload = CheckOutput(rec)._repr_mimebundle_()[CHECK_MIME]
    payload["steps"] = [step, COND, LONG]
    cell = new_code_cell("show_check(rec)")
    cell.outputs = [new_output("display_data", data={CHECK_MIME: payload, "text/plain": "rec"})]
    return _tiny_notebook(path, [new_markdown_cell("# Long equations\n\nInline $f_y$ and a display:\n\n" + SHORT),
                                 cell], meta={"project": "Test Yard canopy", "job_number": "TY-0001",
                                              "title": "Wide equations", "revision": "A", "status": "CHECKED"})


@pytest.mark.pdf
@needs_tex
def test_wide_equations_fit_the_page_and_signatures_show(tmp_path):
    signoff = pytest.importorskip("splicecalc.signoff")
    nb = _wide_equation_notebook(tmp_path / "wide.ipynb")
    signoff.sign_notebook(nb, "prepared", "A. Preparer", date="2026-12-01")
    report = build_pdf(nb, tmp_path / "wide.pdf", execute=False, progress=False)
    assert report.wide_boxes == [], [str(b) for b in report.wide_boxes]
    tex = report.tex_path.read_text()
    assert "\\begin{aligned}" not in tex and tex.count("\\begin{calcsteps}") == 4
    assert report.latex_passes >= 2
    pages = _pages(report.pdf_path)
    cover = " ".join(pages[0].split())
    assert "PREPARED" in cover and "signed electronically, digest" in cover and "A. Preparer" in cover
    assert "Since," in " ".join(pages)


@pytest.fixture(scope="module")
def demo(tmp_path_factory):
    if not HAVE_TEX:
        pytest.skip("xelatex, pandoc or poppler-utils missing")
    from splicecalc.report.demo import build_demo_report

    root = tmp_path_factory.mktemp("demo")
    report = build_demo_report(root / "out", progress=False)
    return report


@pytest.mark.pdf
def test_demo_title_block_on_every_sheet(demo):
    from splicecalc.report.demo import DEMO_METADATA

    pages = _pages(demo.pdf_path)
    assert len(pages) == demo.pages >= 3
    M = len(pages)
    for n, text in enumerate(pages, start=1):
        flat = " ".join(text.split())
        assert DEMO_METADATA["project"] in flat, f"sheet {n}: project missing"
        assert DEMO_METADATA["job_number"] in flat, f"sheet {n}: job number missing"
        assert DEMO_METADATA["revision"] in flat and "DRAFT" in flat
        sheets = re.findall(r"Sheet (\d+) of (\d+)", flat)
        assert sheets and all((int(a), int(b)) == (n, M) for a, b in sheets), f"sheet {n}: {sheets}"


@pytest.mark.pdf
def test_demo_cover_contents_and_cautions(demo):
    pages = _pages(demo.pdf_path)
    cover = " ".join(pages[0].split())
    assert "Revision history" in cover and "Sign-off" in cover
    for role in ("Prepared", "Checked", "Approved"):
        assert role in cover
    assert "checked by a competent engineer" in cover
    assert "National Annex" in cover and "local building regulations govern" in cover
    assert "Existing steelwork must be verified on site" in cover
    assert "Contents" in pages[1]


@pytest.mark.pdf
def test_demo_shows_each_check_with_clause_and_verdict(demo):
    text = " ".join(" ".join(_pages(demo.pdf_path)).split())
    for clause in ("5.5.2, Table 5.2", "6.2.5, Eq. 6.12", "6.2.6, Eq. 6.17", "6.2.8, Eq. 6.30"):
        assert f"EN 1993-1-1:2005, {clause}" in text
    assert text.count("utilisation") >= 4 and "NOT OK" not in text
    assert "show_check" not in text and "import" not in text   # code inputs are hidden
    # M_c,Rd = W_pl,y f_y / gamma_M0 = 1471 cm3 x 355 MPa / 1.0 (BS 4-1 table value, from memory)
    expected = 1471e3 * 355.0 / 1.0 / 1e6
    found = [float(x) for x in re.findall(r"Rd = (\d+\.\d) kN m", text)]
    assert any(abs(x - expected) / expected < 0.003 for x in found), found


@pytest.mark.pdf
def test_demo_log_has_no_wide_overfull_box(demo):
    assert demo.log_path.exists()
    log_boxes = latexfix.overfull_boxes(demo.log_path.read_text(errors="replace"))
    assert [b for b in log_boxes if b.kind == "hbox" and b.amount_pt > 5.0] == []
    assert demo.wide_boxes == []


@pytest.mark.pdf
def test_demo_page_renders_not_blank(demo, tmp_path):
    import matplotlib.image as mpimg

    subprocess.run(["pdftoppm", "-png", "-r", "40", "-f", "3", "-l", "3", str(demo.pdf_path),
                    str(tmp_path / "p")], check=True)
    png = next(tmp_path.glob("p*.png"))
    img = mpimg.imread(png)
    grey = np.asarray(img[..., :3]).mean(axis=2) if img.ndim == 3 else np.asarray(img)
    dark = float((grey < 0.5).mean())
    # ink on the page, but not a black page (a sheet of rendered equations is about 0.4 % ink at 40 dpi)
    assert 0.002 < dark < 0.5, dark


@pytest.mark.pdf
def test_demo_notebook_is_filled_and_executed(demo):
    nb_path = demo.pdf_path.parent.parent / "notebooks" / "demo_cross_section.ipynb"
    nb = nbformat.read(nb_path, as_version=4)
    params = next(c for c in nb.cells if "parameters" in c.metadata.get("tags", []))
    assert "V_Ed_kN = 455.0" in params.source and "# coexisting design shear force" in params.source
    outs = [o for c in nb.cells if c.cell_type == "code" for o in c.outputs]
    assert sum(CHECK_MIME in o.get("data", {}) for o in outs) == 4
    assert not sorted(demo.pdf_path.parent.glob("*.part"))


def test_metadata_defaults_aliases_and_signature_marks():
    from splicecalc.report.metadata import calc_metadata

    meta = calc_metadata({"splicecalc": {
        "project": "Test Yard canopy", "status": "checked",
        "revisions": [{"letter": "A", "date": "2026-12-01", "description": "First issue"}],
        "signatures": [{"role": "prepared", "name": "A. Preparer", "date": "2026-12-01", "digest": "ab" * 32}],
    }}, default_title="calc")
    assert meta["status"] == "CHECKED" and meta["title"] == "calc"
    assert meta["revisions"][0]["rev"] == "A"                 # sign-off ledger spells it "letter"
    prepared = meta["signoff"][0]
    assert prepared["name"] == "A. Preparer" and prepared["mark"] == "signed electronically, digest " + "ab" * 6
    assert [s["role"] for s in meta["signoff"]] == ["Prepared", "Checked", "Approved"]
    with pytest.raises(ValueError, match="role"):
        calc_metadata({"splicecalc": {"signatures": [{"role": "boss"}]}})


def test_check_titles_print_symbols_as_subscripts_never_raw_underscores():
    # issue 13: "Gauge p_3 <= 140 mm" printed its underscore; code symbols in titles are math now, in the
    # heading, in a rule row and in the summary, and a load name typed with an underscore stays as typed
    from splicecalc.report.latexout import rule_row_latex, table_latex, title_tex

    assert title_tex("End A: Gauge p_3 <= 140 mm") == "End A: Gauge $p_{3}$ $\\leq$ 140 mm"
    assert title_tex("for F_f,Ed") == "for $F_{f,Ed}$"
    assert title_tex("load fan_unit") == "load fan\\_unit"
    p = {"id": "A.ep_gauge_max", "title": "End A: Gauge p_3 <= 140 mm", "clause": "EN 1993-1-8:2005, 3.5(1)",
         "demand": 90.0, "resistance": 140.0, "unit": "mm", "utilisation": 0.64, "ok": True, "steps": []}
    head = check_latex(p)
    assert "\\texorpdfstring{End A: Gauge $p_{3}$ $\\leq$ 140 mm}" in head and "p\\_3" not in head.split("}{", 1)[0]
    assert "$p_{3}$" in rule_row_latex(p)
    summary = table_latex({"columns": ["Check", "E_d"], "rows": [["End A: Gauge p_3 <= 140 mm", "90"]],
                           "align": "lr", "kind": "summary", "title": ""})
    assert "$p_{3}$" in summary and "p\\_3" not in summary


def test_prose_symbols_in_markdown_outputs_and_table_notes_are_subscripts():
    # pandoc writes f_y of a note or caution as f\_y; the template's calc_symbols filter sets it as math
    from splicecalc.report.latexout import prose_symbols_tex, table_latex

    out = prose_symbols_tex(r"historic steel (f\_y = 235 MPa, f\_u = 430 MPa), |M|/M\_c,Rd and gamma\_Q")
    assert out == r"historic steel ($f_{y}$ = 235 MPa, $f_{u}$ = 430 MPa), |M|/$M_{c,Rd}$ and $\gamma_{Q}$"
    kept = r"\texttt{load\_level}, ltb\_2, floor\_frequency, \textbf{x}\_1"      # words and commands as written
    assert prose_symbols_tex(kept) == kept
    t = table_latex({"columns": ["a"], "rows": [["1"]], "align": "l", "title": "", "notes": "every part at gamma_Q"})
    assert "$\\gamma_{Q}$" in t and "gamma\\_Q" not in t


def test_section_table_lists_the_properties_of_M_cr():
    """I_z, I_t, I_w printed in cm4, cm4, dm6 (the display-unit table). 457x191x67 UKB: I_z 1452 cm4,
    I_t 37.1 cm4, I_w 0.705 dm6 (UK section tables, from memory)."""
    from splicecalc.report.display import section_table
    from splicecalc.sections import get_section
    rows = {r[1]: r for r in section_table(get_section("457x191x67 UKB"), "S355")._repr_mimebundle_()[TABLE_MIME]["rows"]}
    assert float(rows["$I_z$"][2]) == pytest.approx(1452, rel=0.01) and "cm^{4}" in rows["$I_z$"][3]
    assert float(rows["$I_t$"][2]) == pytest.approx(37.1, rel=0.02) and "cm^{4}" in rows["$I_t$"][3]
    assert float(rows["$I_w$"][2]) == pytest.approx(0.705, rel=0.01) and "dm^{6}" in rows["$I_w$"][3]
