"""`splicecalc compare OLD NEW`: two revisions of the demo job, compared from their notebooks.

The notebooks are made here from real runs (``run_calc(..., render=False)``) and published the way
the package publishes them: the job inputs under JOB_MIME (``Job.to_canonical_dict``), each record
under CHECK_MIME (``report.display.check_payload``) and the summary by part
(``workflow.display.parts_table``). Expected values come from the two runs themselves and from
the definition of utilisation, E_d / R_d (EN 1990:2002, 6.4.2, Eq. (6.8) written as a ratio).
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from splicecalc.cli.main import main
from splicecalc.job import load_job
from splicecalc.report.display import check_payload
from splicecalc.review.compare import MOVE_THRESHOLD, compare_revisions, comparison_text, flatten_inputs
from splicecalc.signoff.digest import CHECK_MIME, JOB_MIME
from splicecalc.workflow import run_calc
from splicecalc.workflow.display import parts_table
from splicecalc.workflow.parts import job_parts

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_workshop_gallery.toml"
UDL_OLD = 'udl = "7.5 kN/m"'          # "gallery imposed" in the demo job (the 2nd [[load]])
UDL_NEW = 'udl = "9 kN/m"'            # 20 % heavier: 7.5 x 1.2 = 9.0 kN/m
END_B_OLD = ('connection = "end plate"\nbolts = "M20 8.8"\nplate = "S275"\n'
             'existing_member = { designation = "existing crossbeam')


def _out(data: dict) -> dict:
    return {"output_type": "display_data", "metadata": {}, "data": data}


def notebook_of(result) -> dict:
    """An executed calc notebook as the package publishes it (through JSON, as on disk)."""
    outs = [_out({JOB_MIME: result.job.to_canonical_dict(), "text/plain": "job inputs"})]
    outs += [_out({CHECK_MIME: check_payload(r), "text/plain": r.title}) for r in result.summary_records]
    outs.append(_out(parts_table(result)._repr_mimebundle_()))
    nb = {"nbformat": 4, "nbformat_minor": 5, "metadata": {},
          "cells": [{"cell_type": "code", "execution_count": 1, "metadata": {}, "source": "show_all(job)",
                     "outputs": outs}]}
    return json.loads(json.dumps(nb))


def _run(tmp: Path, name: str, text: str):
    p = tmp / f"{name}.toml"
    p.write_text(text, encoding="utf-8")
    return run_calc(load_job(p), render=False)


@pytest.fixture(scope="module")
def runs(tmp_path_factory):
    tmp = tmp_path_factory.mktemp("compare")
    src = DEMO.read_text(encoding="utf-8")
    assert src.count(UDL_OLD) == 1 and src.count(END_B_OLD) == 1
    base = _run(tmp, "base", src)
    heavy = _run(tmp, "heavy", src.replace(UDL_OLD, UDL_NEW))
    fin = _run(tmp, "fin", src.replace(END_B_OLD, END_B_OLD.replace("end plate", "fin plate")))
    return {"base": base, "heavy": heavy, "fin": fin,
            "nb": {k: notebook_of(v) for k, v in (("base", base), ("heavy", heavy), ("fin", fin))}}


def _by_id(result) -> dict:
    return {r.id: r for r in result.summary_records}


def test_changed_input_is_the_heavier_udl_as_written(runs):
    c = compare_revisions(runs["nb"]["base"], runs["nb"]["heavy"])
    assert c["changed"] is True
    assert c["changed_inputs"] == [{"input": "load[2].udl", "old": "7.5 kN/m", "new": "9 kN/m"}]
    # key by key: every other input of the job is equal
    assert flatten_inputs(runs["base"].job.to_canonical_dict())["load[2].name"] == "gallery imposed"


def test_moved_checks_are_exactly_those_the_two_runs_moved(runs):
    c = compare_revisions(runs["nb"]["base"], runs["nb"]["heavy"])
    old, new = _by_id(runs["base"]), _by_id(runs["heavy"])
    moved = {d["id"]: d for d in c["moved_checks"]}
    expected = {i for i in old.keys() & new.keys()
                if (old[i].is_check and new[i].is_check and abs(new[i].utilisation - old[i].utilisation) > MOVE_THRESHOLD)
                or old[i].verdict != new[i].verdict}
    assert set(moved) == expected and expected          # nothing missed, nothing extra
    for d in c["moved_checks"]:
        assert d["change_utilisation"] is None or abs(d["change_utilisation"]) > MOVE_THRESHOLD


def test_one_moved_utilisation_by_hand(runs):
    """The existing column at end A carries the heavier reaction: its interaction ratio rises."""
    c = compare_revisions(runs["nb"]["base"], runs["nb"]["heavy"])
    d = next(x for x in c["moved_checks"] if x["id"] == "A.ex_col_interaction_z")
    a, b = _by_id(runs["base"])["A.ex_col_interaction_z"], _by_id(runs["heavy"])["A.ex_col_interaction_z"]
    u_old = a.demand / a.resistance                     # utilisation = E_d / R_d (EN 1990 6.4.2)
    u_new = b.demand / b.resistance
    assert d["old_utilisation"] == pytest.approx(u_old, abs=1e-6)
    assert d["new_utilisation"] == pytest.approx(u_new, abs=1e-6)
    assert d["change_utilisation"] == pytest.approx(u_new - u_old, abs=2e-6)
    assert u_new > u_old + MOVE_THRESHOLD               # more imposed load on the column: it must rise


def test_added_and_removed_when_a_support_changes_connection(runs):
    c = compare_revisions(runs["nb"]["base"], runs["nb"]["fin"])
    assert c["changed_inputs"] == [{"input": "support[2].connection", "old": "end plate", "new": "fin plate"}]
    old, new = set(_by_id(runs["base"])), set(_by_id(runs["fin"]))
    added = {d["id"] for d in c["added_checks"]}
    removed = {d["id"] for d in c["removed_checks"]}
    assert added == new - old and removed == old - new
    assert any(i.startswith("B.fp_") for i in added) and any(i.startswith("B.ep_") for i in removed)
    assert not any(i.startswith("A.") for i in added | removed)     # end A is unchanged
    part_b = next(p for p in c["governing_by_part"] if p["part"] == "B")
    assert part_b["old"]["id"].startswith("B.ep_") and part_b["new"]["id"].startswith("B.fp_")
    assert part_b["governing_changed"] is True


def test_governing_by_part_is_the_packages_grouping(runs):
    c = compare_revisions(runs["nb"]["base"], runs["nb"]["heavy"])
    got = {p["part"]: p for p in c["governing_by_part"]}
    for side, result in (("old", runs["base"]), ("new", runs["heavy"])):
        parts = job_parts(result)
        assert list(got) == [p.key for p in parts]
        for p in parts:
            g = p.governing
            assert got[p.key][side]["id"] == g.id
            assert got[p.key][side]["utilisation"] == pytest.approx(g.utilisation, abs=1e-6)


def test_no_change_and_text(runs):
    nb = runs["nb"]["base"]
    c = compare_revisions(nb, json.loads(json.dumps(nb)))
    assert not c["changed"] and not c["changed_inputs"] and not c["moved_checks"]
    assert not c["added_checks"] and not c["removed_checks"]
    assert not any(p["changed"] for p in c["governing_by_part"])
    assert comparison_text(c).splitlines()[-1] == "No change."


def test_notebook_without_the_grouping_still_compares(runs):
    nb = json.loads(json.dumps(runs["nb"]["base"]))
    nb["cells"][0]["outputs"].pop()                     # a notebook built before the index was published
    c = compare_revisions(nb, runs["nb"]["heavy"])
    assert c["governing_by_part"] is None and c["moved_checks"]
    assert "not available" in comparison_text(c)


# ----------------------------------------------------------------- command line
def _write(path: Path, nb: dict) -> Path:
    path.write_text(json.dumps(nb), encoding="utf-8")
    return path


def test_cli_json_keys_and_exit_codes(runs, tmp_path, capsys):
    old = _write(tmp_path / "gallery.ipynb", runs["nb"]["base"])
    new = _write(tmp_path / "gallery_P2.ipynb", runs["nb"]["heavy"])
    (tmp_path / "gallery_P2.pdf").write_bytes(b"%PDF-1.7\n")   # a package PDF: its notebook is read
    assert main(["compare", str(old), str(old)]) == 0
    assert "No change." in capsys.readouterr().out
    assert main(["compare", str(old), str(tmp_path / "gallery_P2.pdf"), "--json"]) == 1
    c = json.loads(capsys.readouterr().out)
    assert set(c) == {"old", "new", "threshold_utilisation", "changed", "changed_inputs", "moved_checks",
                      "added_checks", "removed_checks", "governing_by_part"}
    d = next(x for x in c["moved_checks"] if x["id"] == "A.ex_col_interaction_z")
    assert {"old_utilisation", "new_utilisation", "change_utilisation", "old_verdict", "new_verdict"} <= set(d)
    kn = next(x for x in c["moved_checks"] if _by_id(runs["base"])[x["id"]].unit == "kN")
    assert {"old_demand_kN", "new_demand_kN", "old_resistance_kN", "new_resistance_kN"} <= set(kn)
    assert kn["old_demand_kN"] == pytest.approx(_by_id(runs["base"])[kn["id"]].demand, abs=1e-6)
    assert main(["compare", str(old), str(new)]) == 1
    text = capsys.readouterr().out
    assert "load[2].udl" in text and "7.5 kN/m" in text and "9 kN/m" in text and "Governing check by part" in text


@pytest.mark.parametrize("case", ["template", "not_json", "missing", "pdf_alone", "txt", "no_cells"])
def test_cli_bad_input_is_one_line_exit_2(runs, tmp_path, capsys, case):
    good = _write(tmp_path / "good.ipynb", runs["nb"]["base"])
    bad = {"template": ROOT / "templates" / "beam_splice.ipynb",
           "missing": tmp_path / "nope.ipynb",
           "pdf_alone": tmp_path / "alone.pdf",
           "txt": tmp_path / "job.toml"}.get(case)
    if case == "not_json":
        bad = tmp_path / "x.ipynb"
        bad.write_text("not a notebook", encoding="utf-8")
    if case == "no_cells":
        bad = _write(tmp_path / "y.ipynb", {"cells": 3})
    if case in ("pdf_alone", "txt"):
        bad.write_bytes(b"x")
    assert main(["compare", str(good), str(bad)]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and err.startswith("splicecalc: error: NEW") and "Traceback" not in err
    if case == "template":
        assert "not a calc notebook" in err


def _damaged(good: dict) -> dict:
    """Notebooks damaged in ways a hand edit or a broken copy leaves them (each must be exit 2)."""
    def cell_outputs(outputs):
        nb = json.loads(json.dumps(good))
        nb["cells"][0]["outputs"] = outputs
        return nb
    first = good["cells"][0]["outputs"]
    parts_out = first[-1]
    bad_index = json.loads(json.dumps(parts_out))
    bad_index["data"]["application/vnd.splicecalc.table+json"]["parts"] = [{"part": "member"}]
    return {
        "list": [good],
        "cell_is_text": {"cells": ["print(1)"]},
        "outputs_not_list": cell_outputs("x"),
        "output_is_text": cell_outputs(["x", *first]),
        "data_is_list": cell_outputs([{"output_type": "display_data", "data": [1]}, *first]),
        "job_not_json": cell_outputs([{"output_type": "display_data", "data": {JOB_MIME: "{"}}, *first[1:]]),
        "record_without_id": cell_outputs([*first[:-1], {"output_type": "display_data", "data": {CHECK_MIME: {}}}]),
        "parts_index_damaged": cell_outputs([*first[:-1], bad_index]),
    }


def test_cli_damaged_notebooks_are_exit_2(runs, tmp_path, capsys):
    good = _write(tmp_path / "good.ipynb", runs["nb"]["base"])
    for name, nb in _damaged(runs["nb"]["base"]).items():
        bad = _write(tmp_path / f"{name}.ipynb", nb)
        assert main(["compare", str(bad), str(good)]) == 2, name
        err = capsys.readouterr().err
        assert err.startswith("splicecalc: error: OLD") and err.count("\n") == 1, (name, err)
    assert main(["compare", str(good), str(good), "--threshold", "-1"]) == 2
    assert "--threshold" in capsys.readouterr().err


@pytest.mark.pdf
def test_a_built_package_is_read_by_part(runs, tmp_path, capsys):
    """A real build (kernel, IPython display, notebook on disk) carries the summary's grouping: the
    package PDF compared with the plain-float run's notebook gives the same governing check per part."""
    from splicecalc.workflow.package import build_package

    job = tmp_path / "gallery.toml"
    job.write_text(DEMO.read_text(encoding="utf-8"), encoding="utf-8")
    b = build_package(job, tmp_path / "gallery.pdf", progress=False)
    assert b.notebook == b.pdf.with_suffix(".ipynb")
    built = json.loads(b.notebook.read_text(encoding="utf-8"))
    c = compare_revisions(runs["nb"]["base"], built)
    assert c["governing_by_part"] is not None
    assert not c["changed"], comparison_text(c)             # same job: the rendered path printed the same records
    assert main(["compare", str(b.pdf), str(b.pdf)]) == 0
    assert "Governing check by part (8)" in capsys.readouterr().out


def test_text_from_a_notebook_cannot_drive_the_terminal(runs):
    nb = json.loads(json.dumps(runs["nb"]["base"]))
    nb["cells"][0]["outputs"][0]["data"][JOB_MIME]["project"]["title"] = "Gallery\x1b[2J\x1b]0;owned\x07 beam\nx"
    text = comparison_text(compare_revisions(runs["nb"]["base"], nb))
    assert "\x1b" not in text and "\x07" not in text and "Gallery?[2J" in text
    assert "project.title" in text
