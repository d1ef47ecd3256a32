"""What the calc sheet prints for the checker's presentation findings: INFO records without a
resistance, table cells without a marker pointing nowhere, code symbols and plain-text maths set as
maths, the cover's provenance, the execution cautions and the clearance datum.

Expected texts are the project's own conventions (no published source); EN clause numbers are cited
where a text names them (EN 1993-1-8:2005 3.6.1(12), packing factor beta_p = 9d/(8d + 3t_p), from memory).
"""

from __future__ import annotations

import hashlib
from types import SimpleNamespace

from splicecalc.core.record import Calc
from splicecalc.core.render import tex_clean
from splicecalc.report.display import check_payload
from splicecalc.report.latexout import CELL_MAX, cell_tex, check_latex, prose_symbols_tex, prose_tex, rule_row_latex


def _tie_info():
    # an information record with a value and no resistance (the accidental tie force)
    return Calc().info(id="tie", title="Tie force (accidental)", clause="EN 1991-1-7:2006, A.5.1",
                       demand=87_900.0, unit="N")


def test_info_record_shows_no_resistance_in_any_layout():
    p = check_payload(_tie_info())
    assert p["resistance"] is None and p["utilisation"] is None
    full = check_latex(p)
    assert "INFO" in full and r"\infty" not in full and "calcok" not in full
    # the verdict band: E_d with its unit, R_d a dash (never "0 kN")
    band = full[full.index("\\calcverdict"):]
    assert "{-}" in band and "{0" not in band
    row = rule_row_latex({**p, "layout": "row"})
    assert "INFO" in row and r"\infty" not in row and "calcok" not in row and "{0" not in row.split("}{", 2)[2][:3]


def test_info_record_keeps_a_limit_it_carries():
    # the section class: c/t (demand) and the limit of the class reached (resistance) are both information
    rec = Calc().info(id="cls", title="Cross-section class", clause="EN 1993-1-1:2005, 5.5.2, Table 5.2",
                      demand=50.3, resistance=58.6)
    p = check_payload(rec)
    assert p["resistance"] == 58.6
    assert "58.60" in check_latex(p)


def test_long_cell_of_our_own_is_printed_whole():
    # the References table lists every clause of a standard in one cell (about 400 characters in the demo)
    cell = "; ".join(f"3.{i}.1, Table 3.{i} ({i})" for i in range(1, 25))
    assert 200 < len(cell) < CELL_MAX
    out = cell_tex(cell)
    assert "more characters" not in out and "Texts in full" not in out
    # a job text longer than the cell limit is still shortened, with the marker (it is printed in full
    # under "Texts in full", which lists every job text longer than 200 characters)
    assert "more characters" in cell_tex("x " * CELL_MAX)


def test_code_symbols_in_cells_and_plain_maths_in_prose():
    out = cell_tex("consequence class 2b: T = 0.8 (G_k + psi_1 Q_k), k_T from memory")
    assert "$G_{k}$" in out and r"$\psi_{1}$" in out and "$k_{T}$" in out and r"\_" not in out
    note = prose_tex("U = sqrt((F_x/F_b,x,Rd)^2 + (F_z/F_b,z,Rd)^2)")
    assert "sqrt" not in note and r"\^{}" not in note and r"\surd" in note and r"\textsuperscript{2}" in note
    # what pandoc writes for markdown outputs (method text, results): "<=" and "^2" as maths
    pandoc = prose_symbols_tex(r"with h \textless{}= 540 mm; sqrt((F\_x)\^{}2)")
    assert r"$\leq$" in pandoc and "textless" not in pandoc and "sqrt" not in pandoc and r"\^{}" not in pandoc


def test_lambda_bar_is_a_barred_symbol_not_a_subscript():
    out = tex_clean(r"\Phi = 0.5 \cdot \left( 1 + \alpha \cdot \left( \lambda_{bar} - 0.2 \right) \right)")
    assert r"\bar{\lambda}" in out and "_{bar}" not in out


def test_cover_provenance_names_version_template_and_job_file(tmp_path):
    from splicecalc import __version__
    from splicecalc.report.metadata import SHORT_SHA, provenance

    job = tmp_path / "job.toml"
    job.write_bytes(b"[project]\nname = 'x'\n")
    nb = {"cells": [{"cell_type": "code", "source": 'job_file = "job.toml"\n', "outputs": []}]}
    p = provenance(nb, str(tmp_path))
    assert p["version"] == __version__
    assert p["job_name"] == "job.toml"
    assert p["job_sha"] == hashlib.sha256(job.read_bytes()).hexdigest()[:SHORT_SHA]
    assert len(p["template_sha"]) == SHORT_SHA
    assert provenance(nb, None)["job_name"] == ""


def _result(category="B", ends=2, restraints=(3000.0,)):
    spec = SimpleNamespace(category=category, friction_class="A", holes="normal")
    det = SimpleNamespace(kind="end plate", bolt=SimpleNamespace(d=20.0))
    conns = [SimpleNamespace(spec=SimpleNamespace(existing_member=object()), design=SimpleNamespace(detail=det))
             for _ in range(ends)]
    beam = SimpleNamespace(restraints=restraints, continuous_restraint=False)
    return SimpleNamespace(splices=[SimpleNamespace(spec=spec)], connections=conns, job=SimpleNamespace(beam=beam))


def test_execution_cautions():
    from splicecalc.workflow.references import execution_cautions

    text = " ".join(execution_cautions(_result()))
    assert "class A" in text and "slip factor 0.5" in text and "no slip" in text and "EN 1090-2" in text and "preload" in text
    # fit-up between two fixed existing members: packs up to d/3 keep beta_p = 1 (EN 1993-1-8 3.6.1(12))
    assert "3.6.1(12)" in text and "6.7 mm" in text and "9d/(8d + 3t_p)" in text
    assert "Erection" in text
    # a bearing splice, one end on existing steel, no restraints: none of these
    assert execution_cautions(_result(category="A", ends=1, restraints=())) == []


def test_clearance_datum_and_plate_end_distance():
    # the demo's S1: 300 mm from the joint line to the R1 hanger, cover plates 350 long: plate ends 125 mm clear
    from splicecalc.workflow.display import plate_end_clearance_note

    rec = Calc().record(id="splice1_clearance", title="Splice 1 joint line clear of supports, loads, restraints",
                        clause="Job file (access limits and clearances)", demand=300.0, resistance=300.0, unit="mm")
    sp = SimpleNamespace(design=SimpleNamespace(geometry=SimpleNamespace(L_fp=350.0, L_wp=290.0)))
    text = plate_end_clearance_note(SimpleNamespace(splices=[sp], position_records=[rec]))
    assert "joint line" in text and "plates 175 mm each side" in text and "plate ends 125 mm" in text
    assert "less than the 125 mm available" in text
    tight = Calc().record(id="splice1_clearance", title="x", clause="Job file (access limits and clearances)",
                         demand=200.0, resistance=200.0, unit="mm")
    assert "move the splice" in plate_end_clearance_note(SimpleNamespace(splices=[sp], position_records=[tight]))


def test_predicted_contents_know_the_nested_checks():
    # the template's \calccheck is a \subsubsection between \calcnestedchecks and \calcnestedchecksend: the
    # predicted .toc says so (a wrong prediction costs a XeLaTeX pass on every fresh build)
    from splicecalc.report.compile import predicted_toc

    tex = ("\\begin{document}\\section{Existing}\\calccheck{Bearing}{cl}\\subsection{Column as a member}"
           "\\calcnestedchecks\\calccheck{Buckling}{cl}\\calcnestedchecksend\\calccheck{Web}{cl}\\end{document}")
    toc = predicted_toc(tex)
    assert "{subsubsection}{\\numberline {1.2.1}Buckling}" in toc
    assert "{subsection}{\\numberline {1.3}Web}" in toc
