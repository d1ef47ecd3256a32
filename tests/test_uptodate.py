"""Make-style rebuilds (report.uptodate): unchanged inputs reuse the executed notebook's outputs.

The digest unit tests need no PDF. The build tests (marker ``pdf``) use the demo job without
splices (short) and compare the PDFs with poppler's ``pdftotext``, a tool outside the project.
"""

from __future__ import annotations

import copy
import json
import subprocess
import tomllib
from pathlib import Path

import nbformat
import pytest

from splicecalc.report.uptodate import INPUTS_KEY, cells_inputs, reusable_outputs, template_code_problem
from splicecalc.workflow.package import build_package, demo_job_path, notebook_for_job

DEMO = demo_job_path()


def _job(folder: Path, splices: bool = False) -> Path:
    from splicecalc.job import dumps_toml

    doc = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    if not splices:
        doc = copy.deepcopy(doc)
        del doc["splices"]
    p = folder / "job.toml"
    p.write_text(dumps_toml(doc), encoding="utf-8")
    return p


def _nb(folder: Path) -> dict:
    p = notebook_for_job(_job(folder), folder / "calc.ipynb")
    return json.loads(p.read_text(encoding="utf-8"))


# ------------------------------------------------------------------ the digest (no PDF)
def test_digest_follows_job_bytes_register_and_cells(tmp_path):
    nb = _nb(tmp_path)
    d0, why = cells_inputs(nb, tmp_path)
    assert d0 and not why
    assert cells_inputs(nb, tmp_path)[0] == d0                      # stable
    job = tmp_path / "job.toml"
    text = job.read_bytes()
    job.write_bytes(text + b" ")                                     # one byte more (a trailing space)
    assert cells_inputs(nb, tmp_path)[0] != d0
    job.write_bytes(text)
    assert cells_inputs(nb, tmp_path)[0] == d0
    reg = tmp_path / "job.review.jsonl"                              # the review register the cells print
    reg.write_text("{}\n", encoding="utf-8")
    assert cells_inputs(nb, tmp_path)[0] != d0
    reg.unlink()
    md = copy.deepcopy(nb)
    next(c for c in md["cells"] if c["cell_type"] == "markdown")["source"] = "# Another heading"
    assert cells_inputs(md, tmp_path)[0] != d0                       # the text the outputs sit in


def test_metadata_that_reaches_only_the_template_is_not_in_the_digest(tmp_path):
    nb = _nb(tmp_path)
    d0 = cells_inputs(nb, tmp_path)[0]
    meta = nb["metadata"]["splicecalc"]
    meta.update(revision="C3", status="FOR CONSTRUCTION", checked_by="B. Checker",
                revisions=[{"rev": "C3", "date": "2026-12-01", "description": "issued"}],
                signatures=[{"role": "prepared", "name": "A", "date": "2026-12-01", "digest": "0" * 64}])
    meta[INPUTS_KEY] = "f" * 64
    assert cells_inputs(nb, tmp_path)[0] == d0


def test_code_other_than_a_shipped_template_is_always_executed(tmp_path):
    nb = _nb(tmp_path)
    assert template_code_problem(nb) is None
    edited = copy.deepcopy(nb)
    cell = [c for c in edited["cells"] if c["cell_type"] == "code"][-1]
    cell["source"] = "open('other.csv').read()\n" + "".join(cell["source"])
    assert cells_inputs(edited, tmp_path) == (None, "its code cells are not those of the beam_splice template")
    params = copy.deepcopy(nb)
    cell = next(c for c in params["cells"] if "parameters" in c.get("metadata", {}).get("tags", []))
    cell["source"] = "job_file = open('x').read()"
    assert cells_inputs(params, tmp_path)[0] is None
    other = copy.deepcopy(nb)
    other["metadata"]["splicecalc"]["template"] = "../elsewhere"
    assert cells_inputs(other, tmp_path)[0] is None


def test_reuse_is_refused_for_a_signed_edited_or_unrecorded_notebook(tmp_path):
    nb = _nb(tmp_path)
    digest = cells_inputs(nb, tmp_path)[0]
    nb["metadata"]["splicecalc"][INPUTS_KEY] = digest
    pdf = tmp_path / "calc.pdf"
    assert reusable_outputs(nb, pdf, digest) == (None, "no readable build record")
    from splicecalc.signoff.notebook import notebook_digest

    (tmp_path / "calc.pdf.json").write_text(json.dumps({"notebook_sha256": notebook_digest(nb)}), encoding="utf-8")
    assert reusable_outputs(nb, pdf, digest)[0] is nb
    assert reusable_outputs(nb, pdf, "0" * 64) == (None, "inputs changed")
    edited = copy.deepcopy(nb)
    next(c for c in edited["cells"] if c["cell_type"] == "code")["outputs"] = [
        {"output_type": "stream", "name": "stdout", "text": "typed by hand"}]
    assert reusable_outputs(edited, pdf, digest)[0] is None
    signed = copy.deepcopy(nb)
    signed["metadata"]["splicecalc"]["sign_off"] = [{"role": "prepared"}]
    assert reusable_outputs(signed, pdf, digest) == (None, "the executed notebook is signed")
    (tmp_path / "calc.pdf.json").write_text(json.dumps({"notebook_sha256": notebook_digest(nb), "issued": True}),
                                            encoding="utf-8")
    assert reusable_outputs(nb, pdf, digest)[0] is None


# ------------------------------------------------------------------ builds
def _text(pdf: Path) -> str:
    return subprocess.run(["pdftotext", "-layout", str(pdf), "-"], capture_output=True, text=True, check=True).stdout


@pytest.mark.pdf
def test_rebuild_reuses_unchanged_cells_and_prints_the_same_pdf(tmp_path):
    job = _job(tmp_path)
    pdf = tmp_path / "calc.pdf"
    fresh = build_package(job, pdf, progress=False)
    assert not fresh.report.cells_reused and fresh.report.cells_s > 0
    fresh_text, fresh_nb = _text(pdf), nbformat.read(str(tmp_path / "calc.ipynb"), as_version=4)

    again = build_package(job, pdf, progress=False)                      # nothing changed
    assert again.report.cells_reused and again.report.cells_s == 0
    assert again.report.reuse_line().startswith("cells up to date, not executed (inputs digest ")
    assert again.report.reuse_line() in again.summary()
    assert _text(pdf) == fresh_text                                      # pdftotext of both builds
    assert nbformat.read(str(tmp_path / "calc.ipynb"), as_version=4) == fresh_nb
    assert again.status == fresh.status

    forced = build_package(job, pdf, progress=False, fresh=True)        # --fresh executes
    assert not forced.report.cells_reused and forced.report.cells_s > 0 and not forced.report.latex_seeded
    assert _text(pdf) == fresh_text

    job.write_bytes(job.read_bytes().replace(b"\n", b" \n", 1))          # one byte changed: executed
    changed = build_package(job, pdf, progress=False)
    assert not changed.report.cells_reused and changed.report.cells_s > 0
    changed_text = _text(pdf)                                            # the cover names the job's new SHA-256

    nbp = tmp_path / "calc.ipynb"                                        # outputs edited after the build
    nb = json.loads(nbp.read_text(encoding="utf-8"))
    nb["cells"][-1]["outputs"] = []
    nbp.write_text(json.dumps(nb), encoding="utf-8")
    edited = build_package(job, pdf, progress=False)
    assert not edited.report.cells_reused and edited.report.cells_s > 0
    assert _text(pdf) == changed_text


@pytest.mark.pdf
def test_cli_says_when_cells_were_not_executed(tmp_path):
    import sys

    job = _job(tmp_path)
    cmd = [sys.executable, "-m", "splicecalc.cli.main", "build", "job.toml", "-o", "calc.pdf", "--quiet"]
    first = subprocess.run(cmd, cwd=tmp_path, capture_output=True, text=True, timeout=600)
    assert first.returncode in (0, 1, 3), first.stderr
    assert "cells up to date" not in first.stdout
    second = subprocess.run(cmd, cwd=tmp_path, capture_output=True, text=True, timeout=600)
    assert second.returncode == first.returncode, second.stderr
    assert [ln for ln in second.stdout.splitlines() if ln.startswith("cells up to date, not executed (inputs digest ")]
    third = subprocess.run(cmd + ["--fresh"], cwd=tmp_path, capture_output=True, text=True, timeout=600)
    assert third.returncode == first.returncode and "cells up to date" not in third.stdout


def test_a_visibly_changed_job_launches_the_kernel_first(tmp_path):
    """Only a hint for when to launch the kernel: a job whose inputs differ from those the previous
    notebook printed will run its cells; an unchanged or re-spaced one may not."""
    from splicecalc.signoff.digest import JOB_MIME
    from splicecalc.job import load_job
    from splicecalc.workflow.package import _job_changed

    job = _job(tmp_path)
    printed = {"cells": [{"cell_type": "code", "source": "", "outputs": [
        {"output_type": "display_data", "data": {JOB_MIME: load_job(job).to_canonical_dict()}}]}]}
    assert not _job_changed(printed, job)
    job.write_text(job.read_text(encoding="utf-8") + "\n# a comment\n", encoding="utf-8")
    assert not _job_changed(printed, job)
    doc = tomllib.loads(job.read_text(encoding="utf-8"))
    doc["beam"]["span"] = "7.5 m" if doc["beam"]["span"] != "7.5 m" else "7.4 m"
    from splicecalc.job import dumps_toml

    job.write_text(dumps_toml(doc), encoding="utf-8")
    assert _job_changed(printed, job)
    job.write_text("not toml [", encoding="utf-8")
    assert not _job_changed(printed, job)                       # the build reports it in its place
    assert not _job_changed({"cells": []}, _job(tmp_path))      # nothing printed: unsure
