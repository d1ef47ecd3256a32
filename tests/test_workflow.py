"""Workflow: the full beam-and-splice calculation of a job, its notebook parts, templates, packages.

Outside references used here:

* statics of a simply supported beam (hand formulas written out in this file):
  R_A = sum P (L - a)/L + w l (L - c)/L, M(x) = R_A x - sum of the loads left of x
  times their lever arm; they check the splice forces and the connection reactions
  the workflow passes on;
* the job file's own limits (access: piece length and mass) and the definition of
  equal cutting (n equal pieces: cuts at L i / n);
* the list of documents and cautions the calc package must state (project brief).

Fast: everything runs on the plain-float path (``render=False``) except one small
rendered splice; no PDF is built here (see tests/test_package.py).
"""

from __future__ import annotations

import copy
import json
import math
import tomllib
from pathlib import Path

import nbformat
import pytest

from splicecalc.actions import PointLoad, UDL
from splicecalc.core.errors import InputError
from splicecalc.job import job_from_dict, load_job
from splicecalc.signoff.digest import CHECK_MIME, JOB_MIME
from splicecalc.workflow import CAUTIONS, STANDARDS, CalcError, run_calc
from splicecalc.workflow import display as part
from splicecalc.workflow.package import (DEFAULT_TEMPLATE, TEMPLATES, demo_job_path, metadata_from_job,
                                         new_package, notebook_for_job, protection, template_path)
from splicecalc.workflow.single import run_end_connection, run_splice_only

ROOT = Path(__file__).resolve().parents[1]
DEMO = demo_job_path()


@pytest.fixture(scope="module")
def demo_doc() -> dict:
    return tomllib.loads(DEMO.read_text(encoding="utf-8"))


@pytest.fixture(scope="module")
def demo_result():
    return run_calc(load_job(DEMO), render=False)


# ------------------------------------------------------------------ hand statics (outside reference)
def _hand_reaction_A(loads, L: float) -> float:
    """R_A (N) of a simply supported span L (mm) by moments about B."""
    R = 0.0
    for ld in loads:
        if isinstance(ld, PointLoad):
            R += ld.P * (L - ld.x) / L
        else:
            a, b = ld.x_start, (L if ld.x_end is None else ld.x_end)
            W, c = ld.w * (b - a), (a + b) / 2.0
            R += W * (L - c) / L
    return R


def _hand_moment(loads, L: float, x: float) -> float:
    """M(x) (N*mm), sagging positive: R_A x minus the loads left of x times their lever arms."""
    M = _hand_reaction_A(loads, L) * x
    for ld in loads:
        if isinstance(ld, PointLoad):
            if ld.x < x:
                M -= ld.P * (x - ld.x)
        else:
            a, b = ld.x_start, (L if ld.x_end is None else ld.x_end)
            l = max(0.0, min(x, b) - a)
            M -= ld.w * l * (x - a - l / 2.0)
    return M


# ------------------------------------------------------------------ demo job: the scenario asked for
def test_demo_job_meets_the_brief(demo_doc):
    job = load_job(DEMO)
    assert job.beam.span >= 8000.0                                      # span at least 8 m
    s = job.splices
    assert s.max_piece_length or s.max_piece_mass                        # access limits
    assert math.ceil(job.beam.span / s.max_piece_length) >= 3            # at least 3 pieces
    assert {sp.at for sp in job.supports} == {"start", "end"}
    assert all(not sp.existing_steel.upper().startswith("S") for sp in job.supports)  # era band, not a grade
    kinds = {("point" if isinstance(ld, PointLoad) else
              "partial" if (ld.x_start > 0 or ld.x_end is not None) else "full", ld.action) for ld in job.loads}
    assert ("full", "permanent") in kinds and ("full", "imposed") in kinds
    assert any(k[0] == "point" for k in kinds) and any(k[0] == "partial" for k in kinds)


def test_demo_result_three_pieces_within_access_limits(demo_result, demo_doc):
    r = demo_result
    pos = r.positions
    L = r.job.beam.span
    assert len(pos.pieces_mm) == 3 and len(r.splices) == 2
    assert sum(pos.pieces_mm) == pytest.approx(L)                        # pieces make the span
    lim_L = float(demo_doc["splices"]["max_piece_length"].split()[0]) * 1000.0   # job file, "3.6 m"
    lim_m = float(demo_doc["splices"]["max_piece_mass"].split()[0])              # job file, "250 kg"
    m_per_mm = r.section.mass_nominal / 1000.0
    for Lp, mp in zip(pos.pieces_mm, pos.piece_mass_kg):
        assert Lp <= lim_L + 1e-6
        assert mp <= lim_m + 1e-6
        assert mp >= m_per_mm * Lp - 1e-6                                # the steel of the piece at least
    # equal cutting: n equal pieces (definition), here on the two restraints, so not clear of them
    assert pos.equal_positions == pytest.approx((L / 3.0, 2.0 * L / 3.0))
    assert not pos.equal_feasible
    for x in pos.positions:
        for avoid in (*r.job.beam.restraints, 5400.0):                   # restraints, the fan point load
            assert abs(x - avoid) >= r.job.splices.clearance - 1e-6


def test_splice_forces_match_hand_statics(demo_result):
    r = demo_result
    an = r.design.analysis
    L = r.job.beam.span
    for sp in r.splices:
        hand = [abs(_hand_moment(c.loads, L, sp.x_mm)) for c, _ in an.uls]
        assert abs(sp.M_Ed) == pytest.approx(max(hand), rel=1e-9)        # governing |M| at the splice
        assert abs(sp.design.forces.M_Ed) == pytest.approx(max(hand), rel=1e-9)


def test_connection_reactions_match_hand_statics(demo_result):
    r = demo_result
    an = r.design.analysis
    L = r.job.beam.span
    for c in r.connections:
        if c.end == "A":
            hand = max(_hand_reaction_A(cc.loads, L) for cc, _ in an.uls)
        else:
            hand = max(sum(ld.P for ld in cc.loads if isinstance(ld, PointLoad))
                       + sum(ld.w * ((L if ld.x_end is None else ld.x_end) - ld.x_start)
                             for ld in cc.loads if isinstance(ld, UDL))
                       - _hand_reaction_A(cc.loads, L) for cc, _ in an.uls)
        assert c.V_Ed == pytest.approx(hand, rel=1e-9)
        assert c.design.V_Ed == pytest.approx(hand, rel=1e-9)


def test_records_complete_unique_and_summary_sorted(demo_result):
    r = demo_result
    recs = r.records
    ids = [x.id for x in recs]
    assert len(ids) == len(set(ids))
    n = (len(r.design.records) + len(r.positions.records)
         + sum(len(s.design.records) + sum(1 for x in s.records if x.has("accidental")) for s in r.splices)  # + tie
         + sum(len(c.design.records) + 1 for c in r.connections))   # + the tie-force INFO record of each end
    assert len(recs) == n                                                # every part's records, once
    summ = r.summary_records
    gaps = [x for x in summ if not x.checked]
    assert summ[:len(gaps)] == tuple(gaps)                             # NOT CHECKED listed first
    us = [x.utilisation for x in summ if x.checked]
    assert us == sorted(us, reverse=True)
    assert sorted(ids) == sorted(x.id for x in summ)
    assert r.governing.utilisation == us[0]
    # existing-member records are split from the connection's own
    for c in r.connections:
        assert {x.id.split(".", 1)[1] for x in c.existing_records} == {x.id for x in c.design.existing.records}
        assert all(x.title.startswith(f"End {c.end}: ") for x in (*c.records, *c.existing_records))


def test_references_and_cautions(demo_result):
    r = demo_result
    stds = [s for s, _ in r.standards]
    for name in ("EN 1990:2002", "EN 1991-1-1:2002", "EN 1991-1-7:2006", "EN 1993-1-1:2005", "EN 1993-1-5:2006",
                 "EN 1993-1-8:2005", "EN 10025-2:2004", "EN 1090-2"):
        assert name in stds
    assert any("historic" in t for s, t in r.standards if s == "Guidance")      # era bands used
    cited = {ref.standard: set(ref.clauses) for ref in r.references}
    for rec in r.records:                                                # every citation is listed
        if not rec.clause:                   # a rule with no code clause names its source in guidance
            assert rec.guidance and "5.2.2.2" not in rec.guidance, rec.id
            continue
        std, _, cl = rec.clause.partition(", ")
        assert std in cited and (not cl or cl in cited[std])
    text = " ".join(r.cautions).lower()
    for phrase in ("competent engineer", "national annex", "verified on site", "cast iron", "wrought iron",
                   "not steel", "weldability"):
        assert phrase in text
    assert tuple(r.cautions[:len(CAUTIONS)]) == CAUTIONS
    assert len(STANDARDS) == 8


def test_job_without_splices_or_supports_is_one_piece(demo_doc):
    doc = copy.deepcopy(demo_doc)
    del doc["splices"], doc["support"]
    r = run_calc(job_from_dict(doc), render=False)
    assert r.positions is None and r.splices == () and r.connections == ()
    assert not r.historic_steel_used
    assert len(r.records) == len(r.design.records)


def test_missing_module_or_raising_part_fails_loudly(demo_doc, monkeypatch):
    job = load_job(DEMO)
    raw = type(job)(beam=job.beam, loads=job.loads, project=job.project, splices=dict(demo_doc["splices"]),
                    supports=job.supports, splices_table=job.splices_table, support_tables=job.support_tables)
    with pytest.raises(CalcError, match="splice module"):
        run_calc(raw, render=False)
    import splicecalc.design.splice_layout as sl

    def boom(*a, **k):
        raise RuntimeError("splice part broke")
    monkeypatch.setattr(sl, "design_splice", boom)
    with pytest.raises(RuntimeError, match="splice part broke"):
        run_calc(job, render=False)


def test_run_calc_rejects_bad_arguments():
    with pytest.raises(InputError, match="job"):
        run_calc({"beam": {}})
    with pytest.raises(InputError, match="render"):
        run_calc(load_job(DEMO), render="yes")


# ------------------------------------------------------------------ notebook parts
@pytest.fixture(scope="module")
def shell():
    from IPython.core.interactiveshell import InteractiveShell

    return InteractiveShell.instance()


def test_parts_publish_job_once_and_every_check_once(demo_result, shell):
    from IPython.utils.capture import capture_output

    r = demo_result
    with capture_output() as cap:
        part.show_inputs(r.job)
        for fn in (part.show_actions, part.show_analysis, part.show_member, part.show_splice_positions,
                   part.show_splices, part.show_connections, part.show_existing, part.show_summary,
                   part.show_references, part.show_cautions):
            fn(r)
    datas = [o.data for o in cap.outputs]
    jobs = [d[JOB_MIME] for d in datas if JOB_MIME in d]
    assert jobs == [r.job.to_canonical_dict()]
    shown = [d[CHECK_MIME]["id"] for d in datas if CHECK_MIME in d]
    assert sorted(shown) == sorted(x.id for x in r.records)              # each record exactly once
    figures = [d for d in datas if "image/png" in d and "application/pdf" in d]
    # V/M/w diagrams (one figure) + a drawing per splice layout (a splice laid out like an earlier one refers to it)
    layouts = []
    for s in r.splices:
        if not any(part.same_splice_layout(f, s) for f in layouts):
            layouts.append(s)
    assert len(figures) >= 1 + len(layouts)


def test_form_hidden_outside_live_session(monkeypatch, tmp_path):
    monkeypatch.setenv(part.HEADLESS_ENV, "1")
    assert not part.is_live_session()
    assert part.show_form(str(tmp_path / "job.toml")) is None
    monkeypatch.delenv(part.HEADLESS_ENV)
    assert not part.is_live_session()                                    # plain pytest: no kernel


def test_one_joint_packages(shell):
    from IPython.utils.capture import capture_output

    r = run_splice_only("406x178x60 UKB", "S355", 240.0, 30.0, 0.0, {"bolts": "M20 8.8"}, render=True)
    assert r.splices and r.records and all(x.id.startswith("S1.") for x in r.records)
    assert any(x.latex for x in r.splices[0].design.records)             # rendered
    with capture_output() as cap:
        part.show_joint_inputs(r)
        part.show_splices(r)
    assert [o.data[JOB_MIME]["M_Ed"] for o in cap.outputs if JOB_MIME in o.data] == ["240 kNm"]
    c = run_end_connection("406x178x60 UKB", "S355", 110.0,
                           {"at": "end", "connection": "end plate", "bolts": "M20 8.8",
                            "existing_member": "254x254x73 UKC", "existing_face": "column flange",
                            "existing_steel": "1959-1967"}, render=False)
    assert c.connections[0].end == "B" and c.connections[0].V_Ed == pytest.approx(110e3)
    assert c.historic_steel_used
    with pytest.raises(InputError, match="section"):
        run_splice_only("999x1x1 UKB", "S355", 100.0, 10.0)
    with pytest.raises(InputError, match="splices.positions"):
        run_splice_only("406x178x60 UKB", "S355", 100.0, 10.0, 0.0, {"positions": ["2 m"]})
    with pytest.raises(InputError, match="V_Ed_kN"):
        run_end_connection("406x178x60 UKB", "S355", -5.0, {})


# ------------------------------------------------------------------ templates
@pytest.mark.parametrize("name", TEMPLATES)
def test_template_structure(name):
    nb = nbformat.read(template_path(name), as_version=4)
    codes = [c for c in nb.cells if c.cell_type == "code"]
    assert "parameters" in codes[0].metadata.get("tags", [])
    if name == DEFAULT_TEMPLATE:
        assert 'job_file = "job.toml"' in codes[0].source
        assert any("show_form(job_file)" in c.source for c in codes)
    for c in codes[1:]:                                                  # short calls into the workflow
        lines = [ln for ln in c.source.splitlines() if ln.strip() and not ln.lstrip().startswith("#")]
        assert len(lines) <= 8, c.source
        assert not c.outputs
    # prose before each part
    for i, c in enumerate(nb.cells):
        if c.cell_type == "code" and c.source.startswith("part.show_"):
            assert nb.cells[i - 1].cell_type == "markdown"
    assert nb.cells[0].cell_type == "markdown"
    assert nb.metadata["splicecalc"]["template"] == name


# ------------------------------------------------------------------ packages on disk
def test_new_package_and_refusals(tmp_path):
    p = new_package("beam_splice", tmp_path / "proj", project="Demo yard", number="D-7", title="Beam B1",
                    job=DEMO)
    nb = nbformat.read(p.notebook, as_version=4)
    meta = nb.metadata["splicecalc"]
    assert (meta["project"], meta["job_number"], meta["title"]) == ("Demo yard", "D-7", "Beam B1")
    assert p.job_file.read_text(encoding="utf-8") == DEMO.read_text(encoding="utf-8")
    with pytest.raises(InputError, match="never overwritten"):
        new_package("beam_splice", tmp_path / "proj")
    q = new_package("splice_only", tmp_path / "proj", title="Splice S1")
    assert q.job_file is None and q.notebook.name == "splice_only.ipynb"
    starter = new_package("beam_splice", tmp_path / "fresh", number="N-1", title="T")
    job = load_job(starter.job_file)                                     # a valid starter job
    assert (job.project.number, job.project.title) == ("N-1", "T")
    with pytest.raises(InputError, match="template"):
        new_package("no_such_template", tmp_path / "x")
    assert not (tmp_path / "x").exists()


def test_notebook_for_job_relative_path_and_metadata(tmp_path):
    out = tmp_path / "out" / "calc.ipynb"
    notebook_for_job(DEMO, out)
    nb = nbformat.read(out, as_version=4)
    src = next(c for c in nb.cells if c.cell_type == "code").source
    rel = src.split("job_file = ")[1].strip().strip("'\"")
    assert (out.parent / rel).resolve() == DEMO.resolve()
    assert nb.metadata["splicecalc"]["job_number"] == metadata_from_job(load_job(DEMO))["job_number"] == "DEMO-0931"


def test_protection_from_build_record(tmp_path):
    pdf = tmp_path / "a.pdf"
    pdf.write_bytes(b"%PDF-1.4")
    side = Path(str(pdf) + ".json")
    assert protection(pdf) is None                                       # no record: a draft
    side.write_text(json.dumps({"status": "DRAFT - CHANGED SINCE SIGNED", "signatures": [{"role": "prepared"}],
                                "issued": False}))
    assert protection(pdf) is None                                       # stale signatures: a draft
    side.write_text(json.dumps({"status": "CHECKED", "issued": False}))
    assert "signed" in protection(pdf)
    side.write_text(json.dumps({"status": "DRAFT", "issued": True}))
    assert "issued" in protection(pdf)
    side.write_text("{not json")
    assert protection(pdf) is not None                                   # in doubt: protected


def test_form_shown_in_live_session(monkeypatch, tmp_path, shell):
    from IPython.utils.capture import capture_output

    job = tmp_path / "job.toml"
    job.write_text(DEMO.read_text(encoding="utf-8"), encoding="utf-8")
    monkeypatch.delenv(part.HEADLESS_ENV, raising=False)
    monkeypatch.setattr(part, "is_live_session", lambda: True)
    with capture_output() as cap:
        form = part.show_form(str(job))
    assert form is not None
    assert any("application/vnd.jupyter.widget-view+json" in o.data for o in cap.outputs)


def test_two_supports_at_one_end_refused(demo_doc):
    doc = copy.deepcopy(demo_doc)
    doc["support"][1]["at"] = "start"
    with pytest.raises(InputError, match=r"support\[2\]\.at"):
        run_calc(job_from_dict(doc), render=False)
