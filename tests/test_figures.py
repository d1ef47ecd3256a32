"""Figures: data printed by the calc and drawn by the kernel (or the exporter's preprocessor).

References: simply supported beam under a UDL, V_max = wL/2, M_max = wL^2/8, w_max = 5wL^4/(384EI)
(any structural analysis handbook, e.g. the beam tables of the Steel Designers' Manual; standard results).
"""

from __future__ import annotations

import json

import nbformat
import pytest

from splicecalc.actions.loads import UDL, PointLoad
from splicecalc.analysis import SimpleBeam, beam_diagram_data, draw_beam_diagrams
from splicecalc.core.errors import InputError
from splicecalc.report import figures
from splicecalc.report.errors import CalcBuildError
from splicecalc.report.figures import FIGURE_MIME, PDF_MIME, PNG_MIME, draw_pdf, drawing_bundle, fill_figures

L, w, E, I = 6000.0, 10.0, 210000.0, 1.2e8          # mm, N/mm (= kN/m), MPa, mm4


def _beam() -> SimpleBeam:
    return SimpleBeam(L, [UDL("floor", "permanent", w)], E=E, I=I)


def test_diagram_data_carries_the_exact_extremes():
    d = beam_diagram_data(_beam(), splices_mm=[2000.0], restraints_mm=[3000.0], title="t")
    json.dumps(d)                                                          # plain JSON
    assert d["shear"]["max"]["abs_kN"] == pytest.approx(w * L / 2 / 1e3, rel=1e-9)           # wL/2
    assert d["moment"]["max"]["value_kNm"] == pytest.approx(w * L ** 2 / 8 / 1e6, rel=1e-9)  # wL^2/8
    assert d["deflection"]["max"]["value_mm"] == pytest.approx(5 * w * L ** 4 / (384 * E * I), rel=1e-9)
    assert max(d["moment"]["M_kNm"]) == pytest.approx(w * L ** 2 / 8 / 1e6, abs=1e-4)
    # at the splice (x = L/3): M = w x (L - x) / 2, |V| = w (L/2 - x)
    s = d["splices"][0]
    assert s["M_kNm"] == pytest.approx(w * 2000.0 * 4000.0 / 2 / 1e6, rel=1e-9)
    assert s["V_abs_kN"] == pytest.approx(w * 1000.0 / 1e3, rel=1e-9)
    assert d["restraints_m"] == [3.0] and d["loads"][0]["w_kN_per_m"] == w
    assert len(draw_beam_diagrams(d).axes) == 4                           # loads, V, M, w


def test_diagram_data_point_load_steps_and_bad_input():
    b = SimpleBeam(L, [PointLoad("P", "imposed", 30e3, 2000.0, category="B")])
    d = beam_diagram_data(b, show_loads=False)
    assert d["loads"] is None and d["deflection"] is None                   # no I: no w panel
    V = d["shear"]["V_kN"]
    assert max(V) == pytest.approx(20.0) and min(V) == pytest.approx(-10.0)  # R_A = P b / L, R_B = P a / L
    with pytest.raises(InputError, match="splices_mm"):
        beam_diagram_data(b, splices_mm=[L + 1.0])
    with pytest.raises(InputError, match="data"):
        draw_beam_diagrams({"kind": "splice"})


def test_bundle_is_drawn_in_the_kernel_png_only_in_front_of_a_person():
    import base64

    d = beam_diagram_data(_beam())
    headless = drawing_bundle(d, "cap", headless=True)
    assert FIGURE_MIME in headless and PNG_MIME not in headless
    assert base64.b64decode(headless[PDF_MIME]) == draw_pdf(d)   # no creation date: same figure, same bytes
    live = drawing_bundle(d, "cap", headless=False)
    assert live[PDF_MIME] and live[PNG_MIME] and live[FIGURE_MIME] is d


def _notebook(*datas) -> nbformat.NotebookNode:
    cells = [nbformat.v4.new_markdown_cell("# t")]
    for data in datas:
        out = nbformat.v4.new_output("display_data", data={FIGURE_MIME: data, "text/plain": "figure"})
        cells.append(nbformat.v4.new_code_cell("x", outputs=[out]))
    return nbformat.v4.new_notebook(cells=cells)


def test_fill_figures_draws_data_only_figures_once():
    import base64

    d = beam_diagram_data(_beam())
    nb = _notebook(d, d)
    assert fill_figures(nb) == 2
    pdf = base64.b64decode(nb.cells[1].outputs[0].data[PDF_MIME])
    assert pdf[:4] == b"%PDF" and pdf == draw_pdf(d)
    assert fill_figures(nb) == 0                           # nothing left to draw


def test_a_figure_that_cannot_be_drawn_names_its_cell():
    nb = _notebook(beam_diagram_data(_beam()), {"kind": "no such drawing"})
    with pytest.raises(CalcBuildError, match=r"cell 3 \(no such drawing\)"):
        fill_figures(nb)


def test_a_drawing_error_names_the_figure_and_the_error():
    nb = _notebook({"kind": "beam_diagrams", "span_m": 1.0})            # a kind we know, bad data
    with pytest.raises(CalcBuildError, match=r"cell 2 \(beam_diagrams\) could not be drawn: KeyError"):
        fill_figures(nb)


def test_every_drawer_kind_is_importable():
    for kind in figures.DRAWERS:
        assert callable(figures.drawer_of({"kind": kind}))
    with pytest.raises(InputError, match="figure kind"):
        figures.drawer_of({"kind": "x"})


def base64_pdf(text: str) -> bool:
    import base64

    return base64.b64decode(text)[:4] == b"%PDF"


_SHOW = """
from IPython.display import publish_display_data
from splicecalc.actions.loads import UDL
from splicecalc.analysis import SimpleBeam, beam_diagram_data
publish_display_data({"application/vnd.splicecalc.figure+json": %s, "text/plain": "figure"})
"""


def _figure_notebook(data_expr: str) -> nbformat.NotebookNode:
    return nbformat.v4.new_notebook(cells=[nbformat.v4.new_markdown_cell("# Figures"),
                                           nbformat.v4.new_code_cell(_SHOW % data_expr)])


def test_the_exporter_draws_figures_printed_as_data(tmp_path):
    # a cell that publishes the figure data itself: the exporter's FigurePreprocessor draws it
    from splicecalc.report.exporter import CalcPackageExporter
    from splicecalc.report.execute import execute_notebook

    nb = _figure_notebook('beam_diagram_data(SimpleBeam(6000.0, [UDL("g", "permanent", 10.0)]))')
    out = execute_notebook(nb, cwd=tmp_path, progress=False)
    assert PDF_MIME not in out.cells[1].outputs[0].data
    latex, res = CalcPackageExporter().to_latex(out, {"metadata": {"name": "t", "path": str(tmp_path)}})
    pdfs = [v for k, v in res["outputs"].items() if k.endswith(".pdf")]
    assert len(pdfs) == 1 and pdfs[0][:4] == b"%PDF"
    assert "includegraphics" in latex
    assert PDF_MIME not in out.cells[1].outputs[0].data    # the caller's notebook is left as it was


@pytest.mark.pdf
def test_a_build_whose_figure_fails_keeps_the_executed_notebook(tmp_path):
    # the export stops with the cell named; the executed notebook is still written
    from splicecalc.report.build import build_pdf

    src = tmp_path / "calc.ipynb"
    nbformat.write(_figure_notebook('{"kind": "no such drawing"}'), src)
    executed = tmp_path / "calc.executed.ipynb"
    with pytest.raises(CalcBuildError, match=r"cell 2 \(no such drawing\)"):
        build_pdf(src, tmp_path / "calc.pdf", progress=False, executed_path=executed)
    assert not (tmp_path / "calc.pdf").exists()
    data = nbformat.read(executed, as_version=4).cells[1].outputs[0].data
    assert data[FIGURE_MIME] == {"kind": "no such drawing"} and PDF_MIME not in data
