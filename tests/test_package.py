"""The demo calc package as printed, and the package commands (new / build / demo / sign / verify).

The demo PDF is built once per module (``splicecalc demo``); its pages are read
back with poppler (``pdftotext``, ``pdfinfo``, ``pdftoppm``), tools outside the
project, and compared with the job file (title block: number and title as typed
there) and with the check records the executed notebook carries
(``splicecalc.signoff.digest.collect_records``). The sign/verify and protection
tests use a smaller job (the demo without splices) to keep the builds short.
"""

from __future__ import annotations

import copy
import json
import os
import re
import shutil
import subprocess
import sys
import tomllib
from pathlib import Path

import nbformat
import pytest

from splicecalc.signoff.digest import collect_records
from splicecalc.workflow.package import build_demo, demo_job_path

pytestmark = pytest.mark.pdf

DEMO = demo_job_path()
JOB_DOC = tomllib.loads(DEMO.read_text(encoding="utf-8"))
CLI = [sys.executable, "-m", "splicecalc.cli.main"]


def cli(*args: str, cwd: Path | None = None, env: dict | None = None) -> subprocess.CompletedProcess:
    return subprocess.run([*CLI, *args], cwd=cwd, env=env, capture_output=True, text=True, timeout=600)


def pdf_pages(pdf: Path) -> list[str]:
    """Text of every page (pdftotext -layout, pages split on form feeds)."""
    out = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], capture_output=True, text=True, check=True)
    pages = out.stdout.split("\f")
    return pages[:-1] if pages and not pages[-1].strip() else pages


def pdf_page_count(pdf: Path) -> int:
    out = subprocess.run(["pdfinfo", str(pdf)], capture_output=True, text=True, check=True).stdout
    return int(re.search(r"^Pages:\s+(\d+)", out, re.M).group(1))


@pytest.fixture(scope="module")
def demo(tmp_path_factory):
    out = tmp_path_factory.mktemp("demo")
    b = build_demo(out, progress=False)
    r = b.report
    print(f"\ndemo build: {r.pages} sheets; execution {r.execution_s:.1f} s (kernel {r.kernel_start_s:.1f} s, "
          f"cells {r.cells_s:.1f} s), LaTeX {r.latex_passes} passes {r.latex_s:.1f} s, "
          f"our overhead {r.overhead_s:.1f} s, total {r.total_s:.1f} s")
    return b


@pytest.fixture(scope="module")
def pages(demo):
    return pdf_pages(demo.pdf)


# ------------------------------------------------------------------ the printed package
def test_job_strip_on_every_page(demo, pages):
    number, title = JOB_DOC["project"]["number"], JOB_DOC["project"]["title"]   # as typed in the job file
    assert len(pages) == pdf_page_count(demo.pdf) == demo.report.pages > 10
    for i, text in enumerate(pages, start=1):
        head = "\n".join(text.splitlines()[:4])
        assert number in head and title in head and "DRAFT" in head, f"sheet {i}: no job strip"
        # sign-off names are on the cover only, not in every sheet's strip
        assert "checked by" not in head.lower() and "prepared by" not in head.lower()


def test_no_line_wider_than_the_sheet(demo):
    # the criterion: no overfull box wider than 5 pt in the demo's XeTeX log (TeX's own report)
    assert demo.report.wide_boxes == [], [str(b) for b in demo.report.wide_boxes]


def test_a_fresh_demo_build_takes_two_passes_and_prints_what_three_print(demo, pages, tmp_path):
    # issue 14: the contents list predicted before the first pass and table widths settled on it;
    # the reference is the same LaTeX run by the plain passes (no prediction: three), read by pdftotext
    from splicecalc.report.compile import AUX_SUFFIXES, run_xelatex

    r = demo.report
    assert not r.latex_seeded and r.latex_passes == 2
    src = r.tex_path.parent
    for f in src.iterdir():
        if f.is_file() and (f.suffix not in (*AUX_SUFFIXES, ".pdf", ".xdv", ".log") or f.name.startswith("output_")):
            shutil.copyfile(f, tmp_path / f.name)
    plain = run_xelatex(tmp_path / r.tex_path.name, progress=False, predict_toc=False)
    assert plain.passes == 3 and not plain.toc_predicted
    assert pdf_pages(plain.pdf_path) == pages


def test_sheet_numbering_runs_1_to_M(pages):
    M = len(pages)
    for i, text in enumerate(pages, start=1):
        found = re.findall(r"Sheet (\d+) of (\d+)", text)
        assert len(found) == 1, f"sheet {i}: one sheet number in the strip expected, found {found}"
        assert all((int(n), int(m)) == (i, M) for n, m in found), f"sheet {i}: {found}"


def test_summary_lists_every_check(demo, pages):
    nb = nbformat.read(demo.notebook, as_version=4)
    records = collect_records(nb)
    assert len(records) > 100
    ids = [r["id"] for r in records]
    assert len(ids) == len(set(ids))                                     # each check published once
    # the summary table in the executed notebook holds exactly those checks
    tables = [o["data"]["application/vnd.splicecalc.table+json"] for c in nb.cells if c.cell_type == "code"
              for o in c.get("outputs", []) if "application/vnd.splicecalc.table+json" in o.get("data", {})]
    summary = [t for t in tables if t.get("kind") == "summary"]
    assert len(summary) == 1
    assert sorted(row[0] for row in summary[0]["rows"]) == sorted(r["title"] for r in records)
    # and the printed summary has one row per check, highest utilisation first
    text = "\n".join(pages)
    start = text.index(f"Summary of the {len(records)} checks")
    end = text.index("References", start)
    rows = re.findall(r"\s(\d+\.\d\d)\s+(OK|NOT OK)\s*$", text[start:end], re.M)
    # made checks print a utilisation and a verdict; NOT CHECKED and information records print "-"
    made = [r for r in records if r.get("utilisation") is not None and r.get("verdict") in ("OK", "NOT OK")]
    assert len(rows) == len(made)
    us = [float(u) for u, _ in rows]
    assert us == sorted(us, reverse=True)
    worst = max(made, key=lambda r: r["utilisation"])
    assert float(rows[0][0]) == pytest.approx(worst["utilisation"], abs=0.005)


def test_demo_is_concise(demo):
    # issue 13: the demo package was 85 sheets; with the rule tables, one-line short steps and rows for
    # repeated checks it was 44 sheets, then the demo gained the existing-member and slip checks (issues
    # 11, 12) and a second splice of its own layout (58 sheets); with steps packed into the rows they fit,
    # the second splice's flange checks referred to the first, and the references one row per standard,
    # 45 sheets: the target, with every check of `run --json` still in the summary (the test
    # above and test_run_json_equals_the_printed_records). A checking engineer's review then added real content
    # (end B's own notch detail, drawing and checks, NOT CHECKED records for the restraints, the tie force
    # through each splice, workings that were missing, Iz/It/Iw): 54 sheets. Layout only (tighter vertical
    # spacing, small method text, rule-table clause column on one line, a repeated prose basis referred to the
    # first check, the contents and the full list of checks scriptsize) brought it to 46, every check, working,
    # source and NOT CHECKED record kept. The target stays 45; this bound is the count actually
    # reached (above 45 by the content the checker's findings added), so a sheet gained without reason fails.
    assert demo.report.pages <= 46, demo.report.pages
    # no overfull box at all in the demo's XeTeX log (TeX's own report), not just none wider than 5 pt
    from splicecalc.report.latexfix import overfull_boxes

    assert overfull_boxes(demo.report.log_path.read_text(errors="replace")) == []
    assert demo.report.wide_boxes == []


def test_run_json_equals_the_printed_records(demo):
    # `splicecalc run --json` (plain floats, a separate process) and the package's published records
    # (rendered, the executed notebook) are the same checks: ids, demands, resistances
    p = cli("run", str(DEMO), "--json")
    assert p.returncode in (0, 1, 3), p.stderr
    ran = {c["id"]: c for part in json.loads(p.stdout)["parts"] for c in part["checks"]}
    nb = nbformat.read(demo.notebook, as_version=4)
    printed = {r["id"]: r for r in collect_records(nb)}
    assert set(ran) == set(printed)
    for cid, c in ran.items():
        for key, v in c.items():
            if key.startswith(("demand", "resistance")) or key in ("utilisation", "clause", "ok"):
                assert printed[cid][key] == (pytest.approx(v, rel=1e-6, abs=1e-6) if isinstance(v, float) else v), (cid, key)


def test_summary_by_part_and_rule_tables(demo, pages):
    nb = nbformat.read(demo.notebook, as_version=4)
    outs = [o["data"] for c in nb.cells if c.cell_type == "code" for o in c.get("outputs", []) if "data" in o]
    parts = [d["application/vnd.splicecalc.table+json"] for d in outs
             if d.get("application/vnd.splicecalc.table+json", {}).get("kind") == "parts"]
    assert len(parts) == 1
    p = cli("run", str(DEMO), "--json")
    run_parts = json.loads(p.stdout)["parts"]
    assert [r[0] for r in parts[0]["rows"]] == [q["title"] for q in run_parts]
    for row, q in zip(parts[0]["rows"], run_parts):
        assert float(row[3]) == pytest.approx(q["governing"]["utilisation"], abs=0.005)
    recs = [d["application/vnd.splicecalc.check+json"] for d in outs if "application/vnd.splicecalc.check+json" in d]
    rows = [r for r in recs if r.get("layout") == "row"]
    full = [r for r in recs if r.get("layout") != "row"]
    assert rows and full                                 # detailing rules as table rows, strength checks in full
    assert any(r["id"].startswith("S1.") and "spacing" in r["id"] for r in rows)
    assert any(r["id"].startswith("S1.") and "bolt_shear" in r["id"] for r in full)
    # a second splice arranged like the first: its checks are rows referring to S1's working; one of its
    # own layout is shown in full
    from splicecalc.job import load_job
    from splicecalc.workflow import run_calc
    from splicecalc.workflow.display import same_splice_layout

    res = run_calc(load_job(DEMO), render=False)
    text = re.sub(r"\s+", " ", "\n".join(pages))
    s2 = [r for r in recs if r["id"].startswith("S2.")]
    if same_splice_layout(*res.splices[:2]):
        assert all(r.get("layout") == "row" for r in s2) and "Arranged as splice S1" in text
    else:
        assert any(r.get("layout") != "row" for r in s2) and "Arranged as splice S1" not in text
    assert "Summary by part" in text
    # contents list each part's checks
    contents = re.sub(r"\s+", " ", pages[1])
    assert "Splice S1: detailing rules" in contents and "Lateral-torsional buckling" in contents


def test_cautions_and_references_printed(pages):
    text = re.sub(r"\s+", " ", "\n".join(pages))
    caut = text[text.rindex("Cautions"):]
    for phrase in ("competent engineer", "National Annex", "verified on site", "Cast iron and wrought iron are not "
                   "steel", "weldability"):
        assert phrase in caut
    refs = text[text.rindex("References"):text.rindex("Cautions")]
    for std in ("EN 1990:2002", "EN 1991-1-1:2002", "EN 1993-1-1:2005", "EN 1993-1-5:2006", "EN 1993-1-8:2005",
                "EN 10025-2:2004", "EN 1090-2", "appraisal guidance"):
        assert std in refs
    assert "3.6.1, Table 3.4" in refs                                    # a clause the bolt checks cite


def test_pages_render_not_blank(demo, tmp_path):
    from PIL import Image

    M = demo.report.pages
    for page in (1, M // 2):
        stem = tmp_path / f"p{page}"
        subprocess.run(["pdftoppm", "-png", "-r", "50", "-f", str(page), "-l", str(page), "-singlefile",
                        str(demo.pdf), str(stem)], check=True)
        im = Image.open(f"{stem}.png").convert("L")
        dark = sum(im.histogram()[:160]) / (im.width * im.height)
        assert 0.005 < dark < 0.6, f"sheet {page}: {dark:.3%} dark pixels"


# ------------------------------------------------------------------ sign, verify, protection
@pytest.fixture(scope="module")
def small(tmp_path_factory):
    """A short package: the demo job without splices, built from its job file."""
    from splicecalc.job import dumps_toml

    d = tmp_path_factory.mktemp("small")
    doc = copy.deepcopy(JOB_DOC)
    del doc["splices"]
    (d / "job.toml").write_text(dumps_toml(doc), encoding="utf-8")
    r = cli("build", "job.toml", "-o", "calc.pdf", "--quiet", cwd=d)
    assert r.returncode == 3 and "NOT CHECKED" in r.stderr, r.stderr   # built; existing members not checked
    return d


def test_edit_after_signing_is_detected_and_signed_pdf_kept(small, tmp_path):
    d = small
    env = dict(os.environ, SPLICECALC_PASSPHRASE="package test passphrase", SPLICECALC_TRUST_DIR=str(tmp_path / "trust"))
    for who, name in (("a", "A. Preparer"), ("b", "B. Checker")):
        r = cli("keys", "new", "--name", name, "--out", str(tmp_path / f"{who}.p12"), cwd=d, env=env)
        assert r.returncode == 0, r.stderr
    r = cli("sign", "calc.pdf", "--role", "prepared", "--key", str(tmp_path / "a.p12"), cwd=d, env=env)
    assert r.returncode == 0, r.stderr
    assert cli("verify", "calc.pdf", cwd=d, env=env).returncode == 0
    assert cli("verify", "calc.ipynb", cwd=d, env=env).returncode == 0
    job = d / "job.toml"
    text = job.read_text(encoding="utf-8")
    edited = text.replace('udl = "4.0 kN/m"', 'udl = "4.5 kN/m"', 1)
    assert edited != text
    job.write_text(edited, encoding="utf-8")                             # one input changed after signing
    v = cli("verify", "calc.pdf", cwd=d, env=env)
    assert v.returncode == 1 and "CHANGED" in v.stdout and "job file" in v.stdout
    # a signed package is never rebuilt over (whatever the case of the name)
    before = (d / "calc.pdf").read_bytes(), (d / "calc.ipynb").read_bytes()
    for out in ("calc.pdf", "CALC.PDF"):
        r = cli("build", "job.toml", "-o", out, "--quiet", cwd=d, env=env)
        assert r.returncode == 2 and "will not be overwritten" in r.stderr
    assert ((d / "calc.pdf").read_bytes(), (d / "calc.ipynb").read_bytes()) == before
    job.write_text(text, encoding="utf-8")
    r = cli("sign", "calc.pdf", "--role", "checked", "--key", str(tmp_path / "b.p12"),
            "--accept-not-checked", "covered by a separate calc (test)", cwd=d, env=env)
    assert r.returncode == 0, r.stderr
    r = cli("issue", "calc.pdf", "--purpose", "for construction", "--key", str(tmp_path / "b.p12"), cwd=d, env=env)
    assert r.returncode == 0, r.stderr
    assert cli("verify", "calc.pdf", cwd=d, env=env).returncode == 0


def test_failing_cell_is_named(tmp_path):
    nb = nbformat.v4.new_notebook()
    p = nbformat.v4.new_code_cell('x = 1')
    p.metadata["tags"] = ["parameters"]
    nb.cells = [nbformat.v4.new_markdown_cell("# A calc"), p,
                nbformat.v4.new_code_cell('raise ValueError("deliberate failure for the test")')]
    nbformat.write(nb, tmp_path / "bad.ipynb")
    r = cli("build", "bad.ipynb", "--quiet", cwd=tmp_path)
    assert r.returncode == 1
    assert "cell 3 failed" in r.stderr and "raise ValueError" in r.stderr
    assert "ValueError: deliberate failure for the test" in r.stderr
    assert not (tmp_path / "bad.pdf").exists()


def test_missing_tex_gives_install_command(tmp_path):
    env = dict(os.environ, PATH=str(tmp_path))                            # no xelatex, no pandoc
    (tmp_path / "job.toml").write_text(DEMO.read_text(encoding="utf-8"), encoding="utf-8")
    r = cli("build", "job.toml", "--quiet", cwd=tmp_path, env=env)
    assert r.returncode == 1
    assert "apt-get install -y texlive-xetex" in r.stderr
    assert not (tmp_path / "job.ipynb").exists()


def test_bad_input_exit_2(tmp_path):
    r = cli("build", "missing.toml", cwd=tmp_path)
    assert r.returncode == 2 and "NOTEBOOK_OR_JOB" in r.stderr
    (tmp_path / "bad.toml").write_text('[beam]\nspan = "-3 m"\n', encoding="utf-8")
    r = cli("build", "bad.toml", cwd=tmp_path)
    assert r.returncode == 2 and "beam.span" in r.stderr


def test_cover_states_the_result_the_records_give(demo, pages):
    # the cover's result line counts what the executed notebook holds (outside reading: pdftotext)
    recs = collect_records(nbformat.read(demo.notebook, as_version=4))
    made = [r for r in recs if r.get("status") not in ("info", "not checked")]
    gaps = [r for r in recs if r.get("status") == "not checked"]
    cover = " ".join(pages[0].split())
    failing = [r for r in made if not r.get("ok")]
    if failing:
        assert f"{len(failing)} of {len(made)} checks exceed capacity" in cover
    else:
        assert f"all {len(made)} checks made are within capacity" in cover
    top = max(made, key=lambda r: r.get("utilisation") or 0.0)
    assert f"highest utilisation {top['utilisation']:.2f}" in cover
    if gaps:
        assert f"{len(gaps)} NOT CHECKED" in cover
