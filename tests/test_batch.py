"""``splicecalc batch``: schedules of beams sharing defaults (splicecalc.workflow.batch, cli/batch.py).

Expected values come from the rules the module states (merge: tables key by key, arrays
replace) and from ``splicecalc run`` on the same job: a schedule beam must give exactly what
the single run gives (one path).
"""

from __future__ import annotations

import csv
import io
import tomllib
from pathlib import Path

import pytest

from splicecalc.cli.main import main
from splicecalc.core.errors import InputError
from splicecalc.job import load_job
from splicecalc.workflow import batch as B
from splicecalc.workflow import run_calc

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_workshop_gallery.toml"
GALLERY = ROOT / "examples" / "schedules" / "gallery_beams.toml"

#: two short beams on the demo's defaults (quick to design)
SMALL = '''
[schedule]
title = "two beams"

[defaults.beam]
grade = "S355"
section = "auto"
families = ["UKB"]
bearing_length = "100 mm"         # sits on bearings: web bearing checked, no NOT CHECKED record

[[defaults.load]]
action = "permanent"
udl = "4.0 kN/m"

[[defaults.load]]
action = "imposed"
category = "B"
udl = "7.5 kN/m"

[beam.B1.beam]
span = "5.0 m"

[beam.B2]
beam = { span = "6.0 m" }
'''


def _write(tmp_path: Path, text: str, name: str = "sched.toml") -> Path:
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return p


# ----------------------------------------------------------------- merge rules
def test_merge_tables_key_by_key_arrays_replace():
    base = {"beam": {"span": "9.6 m", "grade": "S355", "restraints": ["3.2 m", "6.4 m"]},
            "load": [{"action": "permanent", "udl": "4 kN/m"}, {"action": "imposed", "udl": "7.5 kN/m"}],
            "support": [{"at": "start", "existing_member": {"h": "254 mm", "b": "203 mm"}}]}
    over = {"beam": {"span": "7.2 m", "restraints": ["2.4 m"]},
            "load": [{"action": "permanent", "udl": "3 kN/m"}],
            "project": {"title": "B"}}
    m = B.merge(base, over)
    assert m["beam"] == {"span": "7.2 m", "grade": "S355", "restraints": ["2.4 m"]}   # key by key; array replaced
    assert m["load"] == [{"action": "permanent", "udl": "3 kN/m"}]                     # array of tables replaced
    assert m["support"] == base["support"] and m["project"] == {"title": "B"}
    assert base["beam"]["span"] == "9.6 m" and len(base["load"]) == 2                  # inputs untouched
    m["support"][0]["existing_member"]["h"] = "1 mm"
    assert base["support"][0]["existing_member"]["h"] == "254 mm"                      # a deep copy


def test_merge_nested_tables_at_any_depth():
    base = {"splices": {"layout": {"flange": {"rows": 2, "pitch": "70 mm"}, "web": {"rows": 3}}}}
    m = B.merge(base, {"splices": {"layout": {"flange": {"rows": 3}}}})
    assert m == {"splices": {"layout": {"flange": {"rows": 3, "pitch": "70 mm"}, "web": {"rows": 3}}}}


def test_dotted_csv_keys_and_their_values():
    doc = {"beam": {"span": "9.6 m"}, "load": [{"action": "permanent", "udl": "4 kN/m"}]}
    B.set_dotted(doc, "beam.span", B.csv_value("beam.span", "7.2 m"))
    B.set_dotted(doc, "beam.deflection_limit", B.csv_value("beam.deflection_limit", "250"))
    B.set_dotted(doc, "beam.families", B.csv_value("beam.families", '["UKB", "IPE"]'))
    B.set_dotted(doc, "project.number", B.csv_value("project.number", "0931"))    # text stays text
    B.set_dotted(doc, "project.date", B.csv_value("project.date", "2026-12-05"))  # not a TOML date
    B.set_dotted(doc, "load.1.udl", B.csv_value("load.1.udl", "5 kN/m"))
    B.set_dotted(doc, "load.2.action", "imposed")                                # one past the end: a new table
    B.set_dotted(doc, "load.2.udl", "2 kN/m")
    assert doc["beam"] == {"span": "7.2 m", "deflection_limit": 250, "families": ["UKB", "IPE"]}
    assert doc["project"] == {"number": "0931", "date": "2026-12-05"}
    assert doc["load"] == [{"action": "permanent", "udl": "5 kN/m"}, {"action": "imposed", "udl": "2 kN/m"}]
    with pytest.raises(InputError, match="load.4.udl"):
        B.set_dotted(doc, "load.4.udl", "1 kN/m")                                 # a gap in the array
    with pytest.raises(InputError, match="beam.span.x"):
        B.set_dotted(doc, "beam.span.x", "1")


def test_schedule_beams_are_the_defaults_with_their_overrides(tmp_path):
    s = B.read_schedule(_write(tmp_path, SMALL))
    assert [b.name for b in s.beams] == ["B1", "B2"] and all(b.ok for b in s.beams)
    d1 = tomllib.loads(s.beams[0].text)
    assert d1["beam"] == {"grade": "S355", "section": "auto", "families": ["UKB"], "bearing_length": "100 mm",
                          "span": "5.0 m"}
    assert len(d1["load"]) == 2 and s.title == "two beams"


def test_csv_rows_over_the_defaults_and_tables(tmp_path):
    sched = _write(tmp_path, SMALL)
    rows = tmp_path / "vary.csv"
    rows.write_text("name,beam.span,project.title,load.2.udl\nB2,6.5 m,Second,9 kN/m\nB3,4.5 m,Third,\n",
                    encoding="utf-8")
    s = B.read_schedule(sched, rows)
    assert [b.name for b in s.beams] == ["B1", "B2", "B3"]
    d2, d3 = (tomllib.loads(b.text) for b in s.beams[1:])
    assert d2["beam"]["span"] == "6.5 m" and d2["project"]["title"] == "Second" and d2["load"][1]["udl"] == "9 kN/m"
    assert d3["beam"]["span"] == "4.5 m" and d3["load"][1]["udl"] == "7.5 kN/m"      # empty cell: the default


@pytest.mark.parametrize("text, field", [
    ("[defaults]\nbeam = 3\n[beam.B1.project]\ntitle = 'x'\n", ""),     # a bad beam, not a bad schedule
    ("[beam.B1]\nbeam = { span = '5 m' }\n[other]\nx = 1\n", "schedule other"),
    ("[beam.'B 1'.beam]\nspan = '5 m'\n", "beam name"),
    ("[beam.b1.beam]\nspan = '5 m'\n[beam.B1.beam]\nspan = '6 m'\n", "beam name"),
    ("[defaults.beam]\nspan = '5 m'\n", "schedule"),
    ("[beam.B1]\nbeam = { span = '5 m' \n", "schedule"),
])
def test_bad_schedule_files_exit_2_with_one_line(tmp_path, capsys, text, field):
    p = _write(tmp_path, text)
    if not field:            # [defaults] beam = 3 merges; the beam's own validation reports it (not exit 2)
        s = B.read_schedule(p)
        assert not s.beams[0].ok and "beam" in s.beams[0].error
        return
    with pytest.raises(InputError) as ei:
        B.read_schedule(p)
    assert str(ei.value).startswith(field) and "\n" not in str(ei.value)
    assert main(["batch", str(p), "--out", str(tmp_path / "o"), "--quiet"]) == 2
    err = capsys.readouterr().err.strip()
    assert err.startswith("splicecalc: error:") and len(err.splitlines()) == 1
    assert not (tmp_path / "o").exists()                    # nothing done


# ----------------------------------------------------------------- one bad beam
def test_one_bad_beam_is_reported_and_the_others_complete(tmp_path, capsys):
    text = SMALL + '''
[beam.BAD.beam]
span = "1e12 m"

[beam.B4.beam]
span = "4.0 m"
'''
    p = _write(tmp_path, text)
    s = B.read_schedule(p)
    bad = next(b for b in s.beams if b.name == "BAD")
    assert not bad.ok and bad.error.startswith("beam.span = '1e12 m'")     # the loader's own one line
    rc = main(["batch", str(p), "--out", str(tmp_path / "o"), "--workers", "1", "--quiet"])
    out = capsys.readouterr().out
    assert rc == 1                                                          # a beam in error fails the schedule
    rows = list(csv.DictReader(io.StringIO((tmp_path / "o" / "sched_summary.csv").read_text(encoding="utf-8"))))
    assert [r["beam"] for r in rows] == ["B1", "B2", "BAD", "B4"]
    by = {r["beam"]: r for r in rows}
    assert by["BAD"]["status"].startswith("input error: beam.span = '1e12 m'") and by["BAD"]["section"] == ""
    for n in ("B1", "B2", "B4"):
        assert by[n]["section"].endswith("UKB") and by[n]["status"] == B.WITHIN
    assert "input error: beam.span" in out


def test_a_beam_that_cannot_be_designed_is_its_row_only():
    row = B.design_one("X", "[beam]\nspan = 'not a span'\n")
    assert row["outcome"] == "error" and row["status"].startswith("input error: beam.span")
    row = B.design_one("Y", "this is not TOML [")
    assert row["outcome"] == "error" and "valid TOML" in row["status"]


# ----------------------------------------------------------------- the summary
def test_summary_columns_units_and_values_match_run(tmp_path):
    job = load_job(DEMO)
    res = run_calc(job, render=False)                 # what `splicecalc run` computes for the demo
    row = B.design_one("GB2", DEMO.read_text(encoding="utf-8"))
    text = B.summary_csv([row, B.error_row("BAD", "input error: beam.span = 'x' is not allowed")])
    rdr = csv.reader(io.StringIO(text))
    header = next(rdr)
    assert tuple(header) == B.COLUMNS
    # every column holding a quantity with a unit says it in its name; the rest are names, counts, ratios
    assert {"span_m", "splice_positions_m", "heaviest_piece_kg"} <= set(header)
    unitless = {"beam", "section", "grade", "pieces", "splices", "bolts_per_splice", "checks", "exceeding",
                "not_checked", "governing_check", "governing_utilisation", "status", "package_pdf"}
    assert set(header) - unitless == {"span_m", "splice_positions_m", "heaviest_piece_kg"}
    assert set(B.COLUMN_NOTES) == set(B.COLUMNS)
    got = dict(zip(header, next(rdr)))
    assert got["section"] == res.section.designation
    assert float(got["span_m"]) == pytest.approx(9.6)                         # demo job: span 9.6 m
    assert int(got["splices"]) == len(res.splices) and int(got["pieces"]) == len(res.splices) + 1
    assert [int(b) for b in got["bolts_per_splice"].split(";")] == [s.design.n_bolts for s in res.splices]
    assert [float(x) for x in got["splice_positions_m"].split(";")] == pytest.approx(
        [s.x_mm / 1000 for s in res.splices], abs=1e-3)
    assert float(got["heaviest_piece_kg"]) <= 320.0 * 1.0 + 1e-9                  # the demo's access limit
    assert float(got["heaviest_piece_kg"]) == pytest.approx(max(res.positions.piece_mass_kg), abs=0.05)
    assert got["governing_check"] == res.governing.id
    assert float(got["governing_utilisation"]) == pytest.approx(res.governing.utilisation, abs=5e-4)
    assert int(got["checks"]) == len(res.records)
    gaps = sum(not r.checked for r in res.records)
    assert int(got["not_checked"]) == gaps and gaps > 0
    assert got["status"].startswith("NOT CHECKED: ")                 # a gap is never reported as within capacity
    bad = dict(zip(header, next(rdr)))
    assert bad["status"].startswith("input error:") and bad["span_m"] == ""
    assert B.exit_code([row]) == B.EXIT_NOT_CHECKED and B.exit_code([row, B.error_row("X", "e")]) == 1
    table = B.summary_table([row])
    assert "GB2" in table and res.section.designation in table and "NOT CHECKED" in table


# ----------------------------------------------------------------- parallel paths
def test_process_pool_with_two_beams(tmp_path):
    s = B.read_schedule(_write(tmp_path, SMALL))
    rows = B.run_beams(s, workers=2, progress=False)
    single = [B.design_one(b.name, b.text) for b in s.beams]          # the same function in this process
    assert [r["beam"] for r in rows] == ["B1", "B2"]
    assert rows == single
    assert all(r["outcome"] == "within" for r in rows)


def test_dask_local_cluster(tmp_path):
    distributed = pytest.importorskip("dask.distributed")
    s = B.read_schedule(_write(tmp_path, SMALL + "\n[beam.BAD.beam]\nspan = '0.1 m'\n"))
    with distributed.LocalCluster(n_workers=1, processes=False, threads_per_worker=1,
                                  dashboard_address=None) as cluster, distributed.Client(cluster) as client:
        rows = B.run_beams(s, cluster=client, progress=False)
    assert [r["beam"] for r in rows] == ["B1", "B2", "BAD"]
    assert rows[:2] == [B.design_one(b.name, b.text) for b in s.beams[:2]]
    assert rows[2]["outcome"] == "error" and rows[2]["status"].startswith("input error: beam.span")


def test_dask_by_scheduler_address(tmp_path):
    """--cluster ADDRESS: the client is made from the address and closed afterwards."""
    distributed = pytest.importorskip("dask.distributed")
    s = B.read_schedule(_write(tmp_path, SMALL))
    with distributed.LocalCluster(n_workers=1, processes=False, threads_per_worker=1,
                                  dashboard_address=None) as cluster:
        rows = B.run_beams(s, cluster=cluster.scheduler_address, progress=False)
    assert [r["outcome"] for r in rows] == ["within", "within"]
    assert rows == [B.design_one(b.name, b.text) for b in s.beams]


def test_pdf_without_xelatex_is_one_line_before_any_beam(tmp_path, capsys, monkeypatch):
    monkeypatch.setenv("PATH", str(tmp_path / "nothing-here"))     # no xelatex, no pandoc
    p = _write(tmp_path, SMALL)
    assert main(["batch", str(p), "--out", str(tmp_path / "o"), "--pdf", "--quiet"]) == 2
    err = capsys.readouterr().err.strip()
    assert "xelatex" in err and len(err.splitlines()) == 1
    assert not (tmp_path / "o" / "B1").exists()


def test_cluster_address_errors_are_one_line(tmp_path, capsys):
    pytest.importorskip("dask.distributed")
    p = _write(tmp_path, SMALL)
    assert main(["batch", str(p), "--out", str(tmp_path / "o"), "--cluster", "not an address"]) == 2
    assert "--cluster" in capsys.readouterr().err


def test_gallery_example_reads():
    s = B.read_schedule(GALLERY)
    assert len(s.beams) >= 4 and all(b.ok for b in s.beams), [b.error for b in s.beams]
    s = B.read_schedule(GALLERY, GALLERY.with_name("gallery_beams_more.csv"))
    assert [b.name for b in s.beams][-3:] == ["GB6", "GB7", "GB8"] and all(b.ok for b in s.beams)
    gb6, gb7, gb8 = (tomllib.loads(b.text) for b in s.beams[-3:])
    assert gb6["beam"]["restraints"] == ["2.8 m", "5.6 m"] and gb6["load"][1]["udl"] == "6.5 kN/m"
    assert gb7["beam"]["section"] == "auto" and gb8["load"][1]["udl"] == "7.5 kN/m"   # empty cells: defaults


@pytest.mark.pdf
def test_pdf_package_of_one_beam(tmp_path):
    p = _write(tmp_path, SMALL.split("[beam.B2]")[0])
    out = tmp_path / "o"
    assert main(["batch", str(p), "--out", str(out), "--pdf", "--quiet"]) == 0
    assert (out / "B1" / "B1.pdf").stat().st_size > 10_000 and (out / "B1" / "B1.toml").is_file()
    rows = list(csv.DictReader(io.StringIO((out / "sched_summary.csv").read_text(encoding="utf-8"))))
    assert rows[0]["package_pdf"] == "B1/B1.pdf"
    assert (out / "sched_summary.pdf").read_bytes()[:5] == b"%PDF-"          # the summary sheet


def test_summary_sheet_latex_escapes_job_text():
    row = B.error_row("X_1", "input error: beam.span = '\\input{/etc/passwd} $x^' is not allowed & 100 % # ~")
    tex = B.summary_latex([row], title="Bay {2} & $3$", source="a_b.toml")
    assert "\\input{" not in tex and "\\input\\{" not in tex.replace("\\textbackslash{}", "")
    assert "Bay \\{2\\} \\& \\$3\\$" in tex and "100 \\%" in tex and "X\\_1" in tex
