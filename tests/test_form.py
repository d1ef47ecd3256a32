"""The job form: FormState round trips, validation, atomic save, out-of-date flags, headless widget.

These tests check the form against the job loader (``splicecalc.job``) and the
beam design (``splicecalc.design.beam``), which are the references here: the
form must produce exactly the job those modules read from the file, and its
summary must be the design of that job. No engineering value is asserted.
"""

from __future__ import annotations

import copy
import json
import os
import tomllib
from pathlib import Path

import nbformat
import pytest

from splicecalc.core.errors import InputError
from splicecalc.form import FormFile, FormState, design_summary, job_sha256, package_status
from splicecalc.form.debounce import Debouncer
from splicecalc.form.files import HEADER, default_pdf, toml_text
from splicecalc.form.pick import filter_sections
from splicecalc.job import load_job
from splicecalc.job.loader import job_from_dict
from splicecalc.signoff.digest import JOB_MIME, compute_digest

EXAMPLE = Path(__file__).resolve().parents[1] / "examples" / "mezzanine_infill.toml"

#: a job using every part of the form plus keys the form has no control for
#: (invented scenario: a plant-room beam between an existing column and an existing beam)
RICH = {
    "project": {"number": "T-042", "title": "Plant room trimmer", "prepared_by": "B. Designer",
                "revision": "P1"},
    "beam": {"span": "6.3 m", "grade": "S355", "section": "auto", "families": ["UKB", "UKC"],
             "max_depth": "410 mm", "bearing_length": "90 mm", "end_distance": "10 mm",
             "restraints": ["2.1 m", "4.2 m"], "load_level": "shear centre", "deflection_limit": 300,
             "total_deflection_limit": 250, "combination": "6.10", "national_annex": {"xi": 0.9}},
    "load": [
        {"name": "screed", "action": "permanent", "udl": "4.2 kN/m"},
        {"name": "plant", "action": "imposed", "category": "E", "group": "plant", "point": "18 kN",
         "at": "2.0 m"},
        {"name": "access strip", "action": "imposed", "category": "B", "udl": "3 kN/m", "from": "1 m",
         "to": "3.5 m"},
        {"name": "roof snow", "action": "snow", "udl": "1.1 kN/m"},
    ],
    "splices": {"pieces": 2, "bolts": "M20 8.8", "category": "B", "friction_class": "B",
                "flange_plates": "outer", "plate_grade": "S275", "gap": "8 mm",
                "cost": {"per_bolt": 2.0, "per_kg": 0.75}},
    "support": [
        {"at": "start", "connection": "fin plate", "bolts": "M20 8.8", "plate": "10 mm S275",
         "existing_member": "254x254x73 UKC", "existing_face": "column flange", "existing_steel": "1950-1958",
         "tying_force": "90 kN"},
        {"at": "end", "connection": "end plate", "plate": "S275",
         "existing_member": {"h": "406 mm", "b": "178 mm", "tw": "7.9 mm", "tf": "12.8 mm", "r": "10.2 mm"},
         "existing_face": "beam web", "existing_steel": "S275", "notch_top": "40 mm x 120 mm"},
    ],
}


def _write(path: Path, data: dict) -> Path:
    from splicecalc.job.loader import dumps_toml
    path.write_text(dumps_toml(data), encoding="utf-8")
    return path


def _canon(job) -> dict:
    return job.to_canonical_dict()


class ManualClock:
    """Scheduler for the debouncer: callbacks run only when the test says so (no timing)."""

    class Handle:
        def __init__(self, cb):
            self.cb, self.cancelled = cb, False

        def cancel(self):
            self.cancelled = True

    def __init__(self):
        self.handles: list[ManualClock.Handle] = []

    def __call__(self, delay_s, cb):
        h = self.Handle(cb)
        self.handles.append(h)
        return h

    def run(self):
        hs, self.handles = self.handles, []
        for h in hs:
            if not h.cancelled:
                h.cb()


# ------------------------------------------------------------------ round trips
def test_rich_dict_is_accepted_by_the_loaders():
    job = job_from_dict(copy.deepcopy(RICH))           # the reference: the job loader itself
    assert job.splices.pieces == 2 and len(job.supports) == 2


def test_form_state_reproduces_the_job_dict_exactly():
    st = FormState.from_job_dict(copy.deepcopy(RICH))
    assert st.to_job_dict() == RICH
    # extras the form has no control for are kept, not dropped
    assert st.extras["beam"] == {"national_annex": {"xi": 0.9}}
    assert set(st.extras["splices"]) == {"gap", "cost"}
    assert st.support("start")["_extra"] == {"tying_force": "90 kN"}
    # a measured existing member is shown as one line (not blank) and written back as the file's table
    assert st.support("end")["existing_member"] == ("measured: h = 406 mm, b = 178 mm, tw = 7.9 mm, "
                                                    "tf = 12.8 mm, r = 10.2 mm")


@pytest.mark.parametrize("source", ["example", "rich"])
def test_round_trip_file_form_file_gives_same_canonical_job(tmp_path, source):
    if source == "example":
        src = tmp_path / "a.toml"
        src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    else:
        src = _write(tmp_path / "a.toml", RICH)
    before = load_job(src)
    ff = FormFile(src)
    assert ff.load_error == "" and not ff.unsaved()
    out = tmp_path / "b.toml"
    ff2 = FormFile(out)
    ff2.state = ff.state.copy()
    ff2.save()
    after = load_job(out)
    assert _canon(after) == _canon(before)
    assert job_sha256(after) == job_sha256(before)
    # and saving onto itself changes nothing either
    ff.save()
    assert _canon(load_job(src)) == _canon(before)


def test_typed_text_is_what_the_file_holds(tmp_path):
    ff = FormFile(tmp_path / "j.toml")
    st = ff.state
    st.set("beam.span", "7200 mm")
    i = st.add_load("udl", name="floor", value="12.5 kN/m")
    st.set_load(i, "from", "0.5 m")
    ff.save()
    text = (tmp_path / "j.toml").read_text(encoding="utf-8")
    assert 'span = "7200 mm"' in text and 'udl = "12.5 kN/m"' in text and 'from = "0.5 m"' in text
    job = load_job(tmp_path / "j.toml")
    assert job.beam.span == pytest.approx(7200.0)        # 7200 mm
    assert job.loads[0].w == pytest.approx(12.5)         # 12.5 kN/m = 12.5 N/mm


# ------------------------------------------------------------------ invalid input
def test_invalid_entry_names_the_field_and_does_not_write(tmp_path):
    src = tmp_path / "job.toml"
    src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    old = src.read_bytes()
    ff = FormFile(src)
    ff.state.set("beam.span", "7.2")                     # no unit
    with pytest.raises(InputError) as ei:
        ff.save()
    assert ei.value.field == "beam.span"
    assert src.read_bytes() == old
    st = ff.status()
    assert st.error is not None and st.error.field == "beam.span"
    assert any(lvl == "error" and "beam.span" in t for lvl, t in st.messages())
    s = design_summary(ff.state)
    assert s.error_field == "beam.span" and "beam.span" in s.error and not s.rows


@pytest.mark.parametrize("field,value,named", [
    ("beam.deflection_limit", "span/360", "beam.deflection_limit"),
    ("beam.restraints", "2.4 m, 9 m", "beam.restraints[2]"),
    ("splices.pieces", "three", "splices.pieces"),
])
def test_form_level_conversions_raise_input_errors_naming_the_field(tmp_path, field, value, named):
    src = _write(tmp_path / "job.toml", RICH)
    ff = FormFile(src)
    ff.state.set(field, value)
    job, err = ff.state.check()
    assert job is None and err.field == named


def test_load_row_error_names_the_row(tmp_path):
    ff = FormFile(_write(tmp_path / "job.toml", RICH))
    ff.state.set_load(1, "at", "9 m")                    # beyond the 6.3 m span
    _, err = ff.state.check()
    assert err.field == "load[2].at"


def test_design_failure_other_than_input_error_is_one_line(monkeypatch):
    import splicecalc.design.beam as beam
    import splicecalc.workflow.calc as calc      # imported first: it binds design_beam by name
    st = FormState.from_toml(EXAMPLE.read_text(encoding="utf-8"))

    def boom(job, render=False):
        raise RuntimeError("solver did not converge")
    monkeypatch.setattr(beam, "design_beam", boom)
    monkeypatch.setattr(calc, "design_beam", boom)
    s = design_summary(st)
    assert s.error == "the design could not run (RuntimeError: solver did not converge)"
    assert "Traceback" not in s.html()


# ------------------------------------------------------------------ atomic save
def _listing(folder: Path) -> set[str]:
    return {p.name for p in folder.iterdir()}


@pytest.mark.parametrize("failing", ["fsync", "replace"])
def test_save_is_atomic_when_the_write_fails(tmp_path, monkeypatch, failing):
    src = tmp_path / "job.toml"
    src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    old = src.read_bytes()
    ff = FormFile(src)
    ff.state.set("beam.span", "6 m")

    def fail(*a, **k):
        raise OSError("disk full (simulated)")
    monkeypatch.setattr(os, failing, fail)
    with pytest.raises(OSError):
        ff.save()
    monkeypatch.undo()
    assert src.read_bytes() == old                       # the old file is intact
    assert _listing(tmp_path) == {"job.toml"}            # no temporary file left
    assert ff.unsaved()                                  # the edit is still in the form
    ff.save()
    assert _listing(tmp_path) == {"job.toml"}
    assert load_job(src).beam.span == pytest.approx(6000.0)   # 6 m in mm


# ------------------------------------------------------------------ out-of-date flags
def test_unsaved_flag_follows_edits_and_ignores_equivalent_spelling(tmp_path):
    src = tmp_path / "job.toml"
    src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    ff = FormFile(src)
    assert not ff.unsaved() and not ff.status().out_of_date
    ff.state.set("beam.span", "6.9 m")
    assert ff.unsaved() and ff.status().unsaved
    assert any("unsaved edits" in t for _, t in ff.status().messages())
    ff.state.set("beam.span", "7200 mm")                 # same span as the file's "7.2 m"
    assert not ff.unsaved()
    ff.state.set("beam.span", "7.2 m")
    assert not ff.unsaved()


def test_new_file_is_flagged_until_saved(tmp_path):
    ff = FormFile(tmp_path / "new.toml")
    st = ff.status()
    assert st.missing and st.unsaved and st.error is not None      # no span yet
    ff.state.set("beam.span", "5 m")
    ff.save()
    assert not ff.status().missing and not ff.status().unsaved


def test_change_on_disk_is_flagged_and_not_overwritten_silently(tmp_path):
    src = tmp_path / "job.toml"
    src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    ff = FormFile(src)
    other = src.read_text(encoding="utf-8").replace('span = "7.2 m"', 'span = "7.5 m"')
    src.write_text(other, encoding="utf-8")              # another program edits the file
    st = ff.status()
    assert st.disk_changed and st.unsaved and st.out_of_date
    with pytest.raises(InputError) as ei:
        ff.save()
    assert ei.value.field == "job file"
    assert src.read_text(encoding="utf-8") == other
    ff.reload()
    assert ff.state.get("beam.span") == "7.5 m" and not ff.status().out_of_date
    ff.state.set("beam.span", "7.4 m")
    src.write_text(other.replace("7.5 m", "7.6 m"), encoding="utf-8")
    ff.save(force=True)
    assert load_job(src).beam.span == pytest.approx(7400.0)


def test_unreadable_file_is_not_overwritten(tmp_path):
    src = tmp_path / "job.toml"
    src.write_text("[beam\nspan = 7.2 m\n", encoding="utf-8")
    ff = FormFile(src)
    assert "valid TOML" in ff.load_error
    ff.state.set("beam.span", "7.2 m")
    with pytest.raises(InputError):
        ff.save()
    assert src.read_text(encoding="utf-8").startswith("[beam\n")


def _package(tmp_path: Path, job_dict: dict, *, tamper_notebook: bool = False) -> Path:
    """A printed package as the report step leaves it: PDF, sidecar (digest, notebook path), and
    the executed notebook publishing the canonical job inputs."""
    nb = nbformat.v4.new_notebook()
    cell = nbformat.v4.new_code_cell("job = load_job('job.toml')")
    cell.outputs = [nbformat.v4.new_output("display_data", data={JOB_MIME: job_dict, "text/plain": "job"})]
    nb.cells = [cell]
    nb_path = tmp_path / "calc.ipynb"
    digest = compute_digest(nb)
    if tamper_notebook:
        nb.cells.append(nbformat.v4.new_code_cell("x = 1"))
    nbformat.write(nb, str(nb_path))
    pdf = tmp_path / "job.pdf"
    pdf.write_bytes(b"%PDF-1.5 placeholder\n")
    (tmp_path / "job.pdf.json").write_text(json.dumps({"digest": digest, "notebook": str(nb_path)}),
                                           encoding="utf-8")
    return pdf


def test_printed_package_flags(tmp_path):
    src = tmp_path / "job.toml"
    src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    ff = FormFile(src)
    assert ff.status().package.state == "none" and not ff.status().out_of_date
    pdf = tmp_path / "job.pdf"
    pdf.write_bytes(b"%PDF-1.5 placeholder\n")
    assert ff.status().package.state == "unknown" and ff.status().out_of_date   # no sidecar
    _package(tmp_path, load_job(src).to_canonical_dict())
    st = ff.status()
    assert st.package.state == "current" and not st.out_of_date
    ff.state.set("beam.deflection_limit", "250")
    assert ff.status().package.state == "current"        # unsaved edits: the file is still the same
    assert ff.status().out_of_date                       # ... but the form says so
    ff.save()
    st = ff.status()
    assert st.package.state == "stale" and st.out_of_date and not st.unsaved
    assert any("printed from other inputs" in t for _, t in st.messages())


def test_package_built_from_a_changed_notebook_is_stale(tmp_path):
    src = tmp_path / "job.toml"
    src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    pdf = _package(tmp_path, load_job(src).to_canonical_dict(), tamper_notebook=True)
    assert package_status(pdf, job_sha256(load_job(src))).state == "stale"


def test_sidecar_job_sha256_is_compared_directly(tmp_path):
    job = load_job(EXAMPLE)
    pdf = tmp_path / "x.pdf"
    pdf.write_bytes(b"%PDF")
    (tmp_path / "x.pdf.json").write_text(json.dumps({"digest": "0" * 64, "job_sha256": job_sha256(job)}))
    assert package_status(pdf, job_sha256(job)).state == "current"
    assert package_status(pdf, job_sha256(job.with_section("457x191x67 UKB"))).state == "stale"


# ------------------------------------------------------------------ pieces of the widget logic
def test_section_filter_matches_every_word():
    hits = filter_sections("457 191")
    assert hits and all("457x191" in h for h in hits)
    assert filter_sections("ipe", families=("UKB",)) == []
    assert all(h.endswith("UKC") for h in filter_sections("", families=("UKC",)))


def test_splice_mode_switch_clears_the_other_modes():
    st = FormState.from_job_dict(copy.deepcopy(RICH))
    assert st.get("splices.mode") == "pieces"
    st.set_splice_mode("positions")
    st.set("splices.positions", "3.1 m")
    d = st.to_job_dict()["splices"]
    assert "pieces" not in d and d["positions"] == ["3.1 m"]
    st.set_splice_mode("none")
    assert "splices" not in st.to_job_dict()


def test_debouncer_runs_once_after_a_burst():
    clock, calls = ManualClock(), []
    d = Debouncer(lambda: calls.append(1), 0.3, clock)
    d(); d(); d()
    assert calls == []
    clock.run()
    assert calls == [1]
    d()
    d.flush()
    assert calls == [1, 1]


# ------------------------------------------------------------------ the widget, headless
def test_widget_headless_value_change_updates_summary(tmp_path):
    pytest.importorskip("ipywidgets")
    from splicecalc.form import JobForm
    src = tmp_path / "job.toml"
    src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    clock = ManualClock()
    form = JobForm(src, schedule=clock)
    first = form.summary
    assert first == design_summary(load_job(src))         # the summary is the design of the file
    assert "unsaved" not in form.banner.value
    runs = form._cache.runs

    form.controls["beam.span"].value = "5.4"              # typing: first without the unit ...
    form.controls["beam.span"].value = "5.4 m"            # ... then with it
    assert form.summary is first                          # debounced: nothing recomputed yet
    clock.run()
    expected = dict(job_from_dict(__import__("tomllib").loads(src.read_text())).to_canonical_dict())
    expected["beam"]["span"] = "5.4 m"
    assert form.summary == design_summary(job_from_dict(expected))
    assert form._cache.runs == runs + 1                    # one design for the burst
    assert "unsaved edits" in form.banner.value

    form.controls["beam.span"].value = "5.4"              # invalid: message naming the field, no write
    clock.run()
    assert "beam.span" in form.banner.value and "Traceback" not in form.banner.value
    assert "beam.span" in form.summary_html.value
    assert form.controls["beam.span"].layout.border_top == "2px solid #b00020"
    assert form.controls["beam.grade"].layout.border_top in ("", None)
    old = src.read_bytes()
    assert form.save() is False and src.read_bytes() == old
    assert "Not saved" in form.message.value

    form.controls["beam.span"].value = "5.4 m"
    assert form.save() is True
    assert load_job(src).beam.span == pytest.approx(5400.0)   # 5.4 m in mm
    assert "unsaved" not in form.banner.value
    assert form._repr_mimebundle_()["text/plain"].startswith("Job form for job.toml")


def test_widget_rows_sections_and_supports(tmp_path):
    pytest.importorskip("ipywidgets")
    from splicecalc.form import JobForm
    src = _write(tmp_path / "job.toml", RICH)
    form = JobForm(src)                                   # no running loop: updates run at once
    assert len(form.load_rows) == 4 and not form.status.out_of_date
    form.load_rows[1]["at"].value = "9 m"
    assert form.status.error.field == "load[2].at"
    assert form.load_rows[1]["at"].layout.border_top == "2px solid #b00020"
    form.remove_load(1)
    assert len(form.state.loads) == 3 and form.status.error is None
    form.add_load("point")
    form.load_rows[3]["value"].value = "12 kN"
    form.load_rows[3]["at"].value = "3 m"
    form.load_rows[3]["kind"].value = "udl"               # switching kind clears the position
    assert form.state.loads[3]["at"] == "" and form.state.to_job_dict()["load"][3]["udl"] == "12 kN"
    assert form.status.error.field == "load[4].udl"       # 12 kN is not a line load
    form.load_rows[3]["value"].value = "2 kN/m"
    assert form.status.error is None

    form.section_mode.value = "chosen"
    form.section_filter.value = "406 178"
    assert all("406x178" in o for o in form.section_select.options)
    form.section_select.value = form.section_select.options[0]
    assert form.state.get("beam.section") == form.section_select.options[0]
    form.section_mode.value = "auto"
    assert form.state.get("beam.section") == "auto"

    start = form.support_controls["start"]
    start["connection"].value = ""                        # remove the start connection
    assert form.state.support("start") is None
    start["connection"].value = "end plate"
    assert form.state.support("start")["connection"] == "end plate"
    start["existing_member"].value = "203x203x46 UKC"
    assert form.state.support("start")["existing_member"] == "203x203x46 UKC"
    assert form.status.error is None
    assert form.save()
    job = load_job(src)
    assert [s.connection for s in job.supports] == ["end plate", "end plate"]
    assert job.splices.category == "B" and job.beam.na_overrides == (("xi", 0.9),)   # extras kept


def test_widget_save_failure_keeps_file_and_edits(tmp_path, monkeypatch):
    pytest.importorskip("ipywidgets")
    from splicecalc.form import JobForm
    src = tmp_path / "job.toml"
    src.write_text(EXAMPLE.read_text(encoding="utf-8"), encoding="utf-8")
    old = src.read_bytes()
    form = JobForm(src)
    form.controls["project.title"].value = "Mezzanine infill beam, grid D"

    def fail(*a, **k):
        raise OSError("read-only file system (simulated)")
    monkeypatch.setattr(os, "replace", fail)
    assert form.save() is False
    monkeypatch.undo()
    assert "Not saved" in form.message.value and "Traceback" not in form.message.value
    assert src.read_bytes() == old and _listing(tmp_path) == {"job.toml"}
    assert form.state.get("project.title") == "Mezzanine infill beam, grid D"
    assert "unsaved edits" in form.banner.value


# ------------------------------------------------------------------ saving keeps the file's own text
COMMENTED = '''# Invented example: a store-room beam (test data)
[project]
number = "T-9"   # job number
title = "Store-room beam"

[beam]
span = "6.0 m"        # bearing centres
deflection_limit = 360

# loads from the architect's brief
[[load]]
name = "floor"
action = "permanent"
udl = "5 kN/m"   # screed and finishes

[[load]]
name = "stores"
action = "imposed"
category = "E"
udl = "7.5 kN/m"
'''


def test_save_unchanged_leaves_the_file_byte_identical(tmp_path):
    src = tmp_path / "job.toml"
    src.write_text(COMMENTED, encoding="utf-8")
    ff = FormFile(src)
    ff.save()
    assert src.read_text(encoding="utf-8") == COMMENTED     # no header, no defaults added, comments kept


def test_save_changes_only_the_edited_values(tmp_path):
    src = tmp_path / "job.toml"
    src.write_text(COMMENTED, encoding="utf-8")
    ff = FormFile(src)
    ff.state.set("beam.span", "6.5 m")
    ff.state.set_load(1, "value", "9 kN/m")
    ff.state.add_load("point", name="tank", action="permanent", value="20 kN", at="2 m")
    ff.save()
    text = src.read_text(encoding="utf-8")
    want = (COMMENTED.replace('span = "6.0 m"', 'span = "6.5 m"').replace('udl = "7.5 kN/m"', 'udl = "9 kN/m"'))
    assert text.startswith(want.rstrip("\n"))                 # every comment and line kept in place
    assert load_job(src).to_canonical_dict() == ff.state.to_job().to_canonical_dict()
    assert [ld.name for ld in load_job(src).loads] == ["floor", "stores", "tank"]
    ff.state.remove_load(0)
    ff.save()
    text = src.read_text(encoding="utf-8")
    assert "# Invented example" in text and "# bearing centres" in text and "floor" not in text.split("[[load]]", 1)[1]
    assert [ld.name for ld in load_job(src).loads] == ["stores", "tank"]


def test_new_file_gets_the_header(tmp_path):
    ff = FormFile(tmp_path / "new.toml")
    ff.state.set("beam.span", "5 m")
    ff.save()
    assert (tmp_path / "new.toml").read_text(encoding="utf-8").startswith(HEADER)


@pytest.mark.parametrize("source", ["mezzanine_infill.toml", "plant_room_trimmer.toml", "demo_workshop_gallery.toml"])
def test_examples_save_unchanged(tmp_path, source):
    text = (EXAMPLE.parent / source).read_text(encoding="utf-8")
    src = tmp_path / "job.toml"
    src.write_text(text, encoding="utf-8")
    FormFile(src).save()
    assert src.read_text(encoding="utf-8") == text


def test_toml_text_writes_exactly_the_data():
    # whatever the merge does, the text read back is the validated dict (the loader's reference)
    data = copy.deepcopy(RICH)
    old = COMMENTED
    assert tomllib.loads(toml_text(data, old)) == data
    assert tomllib.loads(toml_text(data, None)) == data


# ------------------------------------------------------------------ measured existing members
def test_measured_member_is_shown_and_can_be_edited(tmp_path):
    src = _write(tmp_path / "job.toml", RICH)
    ff = FormFile(src)
    shown = ff.state.support("end")["existing_member"]
    assert shown.startswith("measured: h = 406 mm")
    ff.state.set_support("end", "existing_member", shown.replace("tf = 12.8 mm", "tf = 12.0 mm"))
    job = ff.save()
    d = tomllib.loads(src.read_text(encoding="utf-8"))["support"][1]["existing_member"]
    assert d == {"h": "406 mm", "b": "178 mm", "tw": "7.9 mm", "tf": "12.0 mm", "r": "10.2 mm"}
    assert job.supports[1].existing_member.tf == pytest.approx(12.0)      # mm, as typed
    ff.state.set_support("end", "existing_member", "measured: h = 406 mm, b 178 mm")
    with pytest.raises(InputError) as e:
        ff.state.to_job()
    assert e.value.field == "support[2].existing_member" and "h = 406 mm" in str(e.value)


# ------------------------------------------------------------------ which PDF the form watches
def test_default_pdf_follows_the_notebook_and_the_builds(tmp_path, monkeypatch):
    job = tmp_path / "job.toml"
    monkeypatch.delenv("JPY_SESSION_NAME", raising=False)
    assert default_pdf(job) == tmp_path / "beam_splice.pdf"      # what `splicecalc build beam_splice.ipynb` writes
    (tmp_path / "job.pdf").write_bytes(b"%PDF")
    assert default_pdf(job) == tmp_path / "job.pdf"               # `splicecalc build job.toml`
    monkeypatch.chdir(tmp_path)
    monkeypatch.setenv("JPY_SESSION_NAME", "jobs/B2/calc_b2.ipynb")   # set by Jupyter for the kernel
    assert default_pdf(job) == tmp_path / "calc_b2.pdf"


# ------------------------------------------------------------------ the summary covers the whole job
def test_summary_covers_every_part_of_the_job():
    from splicecalc.workflow import run_calc
    from splicecalc.workflow.parts import job_parts
    job = load_job(EXAMPLE.parent / "plant_room_trimmer.toml")   # a splice and two end connections
    s = design_summary(job)
    ref = run_calc(job, render=False)                         # the reference: the whole calculation
    assert [p.key for p in s.parts] == [p.key for p in job_parts(ref)]
    assert {p.key for p in s.parts} >= {"member", "S1", "A", "B"}
    assert {r.id for r in s.rows} == {r.id for r in ref.records if r.is_check}   # checks made
    for r in ref.records:                                    # a NOT CHECKED record is never silent
        if r.status == "not checked":
            assert any(r.title in n for n in s.notes), r.title
    assert "S1" in s.html() and "governing check" in s.html()
    # a part that cannot be designed: the beam is still summarised, with the reason
    rich = copy.deepcopy(RICH)
    rich["beam"]["section"] = "356x127x33 UKB"   # passes the member checks; no splice of M20 bolts carries it
    bad = design_summary(job_from_dict(rich))
    assert bad.rows and not bad.ok and not bad.parts
    assert any("splices" in n for n in bad.notes)


# ------------------------------------------------------------------ the export
def _executed_like(tmp_path, span):
    """A notebook as Jupyter leaves it: the form's widget output and the job inputs it ran with."""
    nb = nbformat.v4.new_notebook()
    nb.cells = [nbformat.v4.new_code_cell('job_file = "job.toml"', metadata={"tags": ["parameters"]}),
                nbformat.v4.new_code_cell("form = show_form(job_file)", metadata={"tags": ["form"]}),
                nbformat.v4.new_code_cell("part.show_inputs(job)")]
    nb.cells[1].outputs = [nbformat.v4.new_output(
        "display_data", data={"text/plain": "Job form for job.toml (interactive)",
                              "application/vnd.jupyter.widget-view+json": {"model_id": "x", "version_major": 2,
                                                                           "version_minor": 0}})]
    data = copy.deepcopy(RICH)
    data["beam"]["span"] = span
    nb.cells[2].outputs = [nbformat.v4.new_output(
        "display_data", data={JOB_MIME: job_from_dict(data).to_canonical_dict(), "text/plain": "inputs"})]
    return nb


def test_export_drops_the_form_and_refuses_stale_outputs(tmp_path):
    from splicecalc.report.errors import CalcBuildError
    from splicecalc.report.liveonly import LiveOnlyOutputsPreprocessor, StaleInputsPreprocessor
    _write(tmp_path / "job.toml", RICH)
    res = {"metadata": {"name": "beam_splice", "path": str(tmp_path)}}
    nb = _executed_like(tmp_path, RICH["beam"]["span"])
    StaleInputsPreprocessor().preprocess(nb, res)             # ran with the file's inputs: printed
    nb, _ = LiveOnlyOutputsPreprocessor().preprocess(nb, res)
    assert nb.cells[1].outputs == [] and nb.cells[2].outputs    # the form is not printed, the calc is
    stale = _executed_like(tmp_path, "5.0 m")                  # saved in the form, not run again
    with pytest.raises(CalcBuildError, match="job.toml changed.*Run all cells again"):
        StaleInputsPreprocessor().preprocess(stale, res)
    # and the exporter runs it, as Jupyter's export menu calls it (refused before any LaTeX work)
    from splicecalc.report.exporter import CalcPackageExporter
    with pytest.raises(CalcBuildError, match="Run all cells again"):
        CalcPackageExporter().from_notebook_node(_executed_like(tmp_path, "5.0 m"), resources=copy.deepcopy(res))


def test_load_rows_have_their_own_layouts(tmp_path):
    pytest.importorskip("ipywidgets")
    from splicecalc.form import JobForm
    form = JobForm(_write(tmp_path / "job.toml", RICH))
    layouts = [w.layout.model_id for row in form.load_rows for w in row.values()]
    assert len(set(layouts)) == len(layouts)                  # hiding one box never hides another
    udl = form.load_rows[0]
    assert udl["value"].layout.display != "none" and udl["from"].layout.display != "none"
    assert udl["at"].layout.display == "none"                  # a UDL has no single position
    point = form.load_rows[1]
    assert point["at"].layout.display != "none" and point["value"].layout.display != "none"
    assert form.support_controls["end"]["existing_member"].value.startswith("measured: h = 406 mm")
