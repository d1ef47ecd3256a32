"""How the calc package lays out a job's checks (workflow.display): rule tables, repeated checks, a
second splice arranged like the first, the summary by part. The outputs are captured as a notebook
would publish them; every record must still be published exactly once (the sign-off digest covers
each)."""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest
from IPython.core.interactiveshell import InteractiveShell
from IPython.utils.capture import capture_output

from splicecalc.job import load_job
from splicecalc.report.display import CHECK_MIME, TABLE_MIME
from splicecalc.workflow import run_calc
from splicecalc.workflow import display as part

DEMO = Path(__file__).resolve().parents[1] / "examples" / "demo_workshop_gallery.toml"


@pytest.fixture(scope="module")
def result():
    InteractiveShell.instance()
    return run_calc(load_job(DEMO), render=True)


def _published(fn, *args):
    with capture_output() as cap:
        fn(*args)
    return [o.data for o in cap.outputs]


def test_detailing_rules_are_rows_and_strength_checks_full(result):
    s1 = result.splices[0]
    datas = _published(part.show_splice, result, s1)
    recs = [d[CHECK_MIME] for d in datas if CHECK_MIME in d]
    assert sorted(r["id"] for r in recs) == sorted(r.id for r in s1.records)      # each once
    for r in recs:
        rec = next(x for x in s1.records if x.id == r["id"])
        # detailing rules and the tie-force records (accidental: rows naming their formulas) are rows
        assert (r.get("layout") == "row") == (part.is_detailing_rule(rec) or rec.has("accidental"))
    assert any("spacing" in r["id"] and r.get("layout") == "row" for r in recs)
    assert any("bolt_shear" in r["id"] and r.get("layout") != "row" for r in recs)


def test_second_splice_arranged_like_the_first_refers_to_it(result):
    s1 = result.splices[0]
    # a second splice with S1's layout (its own label and records): the display must refer to S1
    twin = replace(s1, index=9, records=tuple(replace(r, id=r.id.replace("S1.", "S9.", 1),
                                                      title=r.title.replace("Splice S1", "Splice S9", 1))
                                              for r in s1.records))
    assert part.same_splice_layout(s1, twin)
    res = replace(result, splices=(s1, twin))
    datas = _published(part.show_splices, res)
    recs = [d[CHECK_MIME] for d in datas if CHECK_MIME in d]
    s9 = [r for r in recs if r["id"].startswith("S9.")]
    assert len(s9) == len(s1.records) and all(r.get("layout") == "row" for r in s9)
    text = " ".join(d.get("text/markdown", "") for d in datas)
    assert "Arranged as splice S1" in text
    assert sum(1 for d in datas if "application/vnd.splicecalc.figure+json" in d
               or "application/pdf" in d) <= 1                                      # one drawing, S1's


def test_repeated_segment_checks_refer_to_the_governing_one(result):
    again = part.repeated_checks(result.member_records)
    ltb = [r for r in result.member_records if r.id.startswith("ltb_")]
    if len(ltb) > 1:
        gov = max(ltb, key=lambda r: r.utilisation)
        assert set(again) == {r.id for r in ltb if r.id != gov.id}
        assert all(g.id == gov.id for g in again.values())


def test_summary_by_part_lists_each_part_once(result):
    from splicecalc.workflow.parts import job_parts

    datas = _published(part.show_summary, result)
    tables = [d[TABLE_MIME] for d in datas if TABLE_MIME in d]
    parts = [t for t in tables if t.get("kind") == "parts"][0]
    assert [r[0] for r in parts["rows"]] == [p.title for p in job_parts(result) if p.governing is not None]


def test_connection_drawing_to_a_stated_scale(result):
    from splicecalc.joints.connections.sheet_drawing import (PRINT_WIDTH_MM, SCALES, connection_drawing_data,
                                                             draw_connection_data)

    for c in result.connections:
        data = connection_drawing_data(c.design)
        det = c.design.detail
        assert data["plate"]["h_mm"] == det.h_p and data["bolts"]["rows"] == det.n_1        # from the design
        assert data["weld_leg_mm"] == det.weld_leg
        fig = draw_connection_data(data)
        ax = fig.axes[0]
        assert not ax.axison                                                            # no plot axes
        w_in, h_in = fig.get_size_inches()
        assert w_in * 25.4 == pytest.approx(PRINT_WIDTH_MM)
        x0, x1 = ax.get_xlim()
        y0, y1 = ax.get_ylim()
        scale = (x1 - x0) / PRINT_WIDTH_MM
        assert any(scale == pytest.approx(s) for s in SCALES)                           # a standard ratio
        assert (y1 - y0) / (h_in * 25.4) == pytest.approx(scale)                        # same scale both ways
        texts = " ".join(t.get_text() for t in ax.texts)
        assert f"Scale 1:{scale:g}" in texts and f"{det.h_p:g}" in texts and f"{det.weld_leg:g} mm fillet" in texts


def test_splice_drawing_to_a_stated_scale(result):
    from splicecalc.joints.sheet_scale import PRINT_WIDTH_MM, SCALES

    fig = result.splices[0].design.drawing()
    assert fig.get_size_inches()[0] * 25.4 == pytest.approx(PRINT_WIDTH_MM)
    assert getattr(fig, "splicecalc_tight", True) is False                        # saved uncropped
    texts = " ".join(t.get_text() for t in fig.texts)
    scale = float(texts.split("Scale 1:")[1].split()[0])
    assert scale in SCALES
    for ax in fig.axes:
        assert not ax.axison                                                        # no plot axes
        x0, x1 = ax.get_xlim()
        w_mm = ax.get_position().width * PRINT_WIDTH_MM
        assert (x1 - x0) / w_mm == pytest.approx(scale, rel=1e-6)                   # 1 mm on paper = scale mm


@pytest.mark.parametrize("kind", ["splice", "connection"])
def test_one_joint_packages_show_every_part(kind):
    # the splice_only and end_connection templates call the same display functions on a JointResult
    from splicecalc.workflow.single import run_end_connection, run_splice_only

    if kind == "splice":
        r = run_splice_only("406x178x60 UKB", "S355", 240.0, 30.0, 0.0, {"bolts": "M20 8.8"}, render=True)
        fns = (part.show_joint_inputs, part.show_splices, part.show_summary, part.show_references, part.show_cautions)
    else:
        spec = {"at": "start", "connection": "end plate", "bolts": "M20 8.8",
                "existing_member": {"designation": "existing column", "h": "254 mm", "b": "254 mm", "tw": "8.6 mm",
                                    "tf": "14.2 mm", "r": "12.7 mm"},
                "existing_face": "column flange", "existing_steel": "unknown"}
        r = run_end_connection("406x178x60 UKB", "S355", 120.0, spec, render=True)
        fns = (part.show_joint_inputs, part.show_connections, part.show_existing, part.show_summary,
               part.show_references, part.show_cautions)
    datas = []
    for fn in fns:
        datas += _published(fn, r)
    shown = [d[CHECK_MIME]["id"] for d in datas if CHECK_MIME in d]
    assert sorted(shown) == sorted(x.id for x in r.records)                 # every check once
    assert any(d.get(TABLE_MIME, {}).get("kind") == "parts" for d in datas)
