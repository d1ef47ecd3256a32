"""``section = "auto"`` with ``[splices]``: the lightest section with which the WHOLE job works.

The section search (splicecalc.design.beam.design_beam) used to stop at the lightest section passing
the member checks; the splices were designed afterwards and, for a short lightly loaded beam, no splice
fitted that section, so the job ended with an input error although a heavier section splices. Now a
section whose splices (or end connections) cannot be designed is passed over, with its reason.

Outside references: the flange-width rule of EN 1993-1-8:2005 Table 3.3 (e2 >= 1.2 d0, p2 >= 2.4 d0,
so two bolt lines need b >= 4.8 d0) with the catalogue flange width b = 102.4 mm of 305x102x33 UKB
(BS 4-1 section table, from memory) and d0 = 22 mm for M20 in normal clearance holes (EN 1090-2
Table 11: d + 2 mm); the passed-over sections are also re-tried directly with the splice design.
Invented scenario: a 7.2 m gallery beam (the demo schedule's bay 3).
"""

from __future__ import annotations

import subprocess
import sys

import pytest

from splicecalc.core.errors import InputError
from splicecalc.design.splice_layout import design_splice
from splicecalc.job import loads_job
from splicecalc.sections import get_section
from splicecalc.workflow import run_calc

CLI = [sys.executable, "-m", "splicecalc.cli.main"]

JOB = """
load = [
    { name = "floor build-up", action = "permanent", udl = "3.2 kN/m" },
    { name = "gallery imposed", action = "imposed", category = "B", udl = "6.0 kN/m" },
]

[project]
number = "DEMO-0931"
title = "Gallery beam GB3, bay 3 (demo)"

[beam]
grade = "S355"
section = "auto"
families = ["UKB"]
max_depth = "540 mm"
load_level = "top flange"
deflection_limit = 360
span = "7.2 m"
restraints = ["2.4 m", "4.8 m"]

[splices]
max_piece_length = "3.6 m"
max_piece_mass = "320 kg"
mass_margin = "3 %"
bolts = "M20 8.8"
category = "B"
flange_plates = "outer"
plate_grade = "S355"
clearance = "300 mm"
"""


@pytest.fixture(scope="module")
def result():
    return run_calc(loads_job(JOB, source="auto-splice test"), render=False)


def test_a_heavier_section_that_splices_is_chosen(result):
    d = result.design
    assert d.passed_over, "the lightest member-passing section should have been passed over"
    names = [p.designation for p in d.passed_over]
    # the lightest section passing the member checks is 305x102x33 UKB (33 kg/m); it cannot be spliced
    assert names[0] == "305x102x33 UKB"
    assert all(p.mass_kg_per_m <= d.section.mass_nominal for p in d.passed_over)
    assert d.section.designation not in names
    # each passed-over section passes every member check (it was passed over for its joints only)
    by_name = {c.designation: c for c in d.candidates}
    assert all(by_name[n].ok for n in names)
    # the chosen one passes every check of the whole job
    assert d.ok and result.splices
    assert all(r.ok for r in result.records if r.checked), [r.id for r in result.records if r.checked and not r.ok]


def test_the_passed_over_sections_indeed_cannot_be_spliced(result):
    spec = result.job.splices
    for p in result.design.passed_over:
        sec = get_section(p.designation)
        for sp in result.splices:                   # the forces at the splice positions of the chosen beam
            with pytest.raises(InputError):
                design_splice(sec, "S355", sp.M_Ed, abs(sp.V_Ed), sp.N_Ed, spec)
    # and the chosen section splices at the same forces
    for sp in result.splices:
        assert design_splice(result.section, "S355", sp.M_Ed, abs(sp.V_Ed), sp.N_Ed, spec).layout is not None


def test_the_reason_is_reported(result):
    first = result.design.passed_over[0]
    # EN 1993-1-8 Table 3.3: two bolt lines need b >= 4.8 d0 = 4.8 x 22 = 105.6 mm > 102.4 mm (section table)
    assert 4.8 * 22.0 > get_section("305x102x33 UKB").b == pytest.approx(102.4, abs=0.05)
    assert "M20" in first.reason and "102.4" in first.reason and "flange" in first.reason
    assert "\n" not in first.line()
    assert first.line().startswith("305x102x33 UKB: ")
    assert "305x102x33 UKB" in result.design.message
    dd = result.design.to_dict()
    assert dd["passed_over"][0]["designation"] == "305x102x33 UKB" and "flange" in dd["passed_over"][0]["reason"]


def test_run_output_lists_the_passed_over_sections(tmp_path):
    job = tmp_path / "gb3.toml"
    job.write_text(JOB)
    p = subprocess.run([*CLI, "run", str(job)], capture_output=True, text=True, timeout=300)
    assert p.returncode in (0, 3), p.stderr
    assert "passed over" in p.stdout
    line = next(ln for ln in p.stdout.splitlines() if ln.strip().startswith("305x102x33 UKB:"))
    assert "flange" in line


def test_a_fixed_section_that_cannot_be_spliced_is_one_line_error(tmp_path):
    job = tmp_path / "fixed.toml"
    job.write_text(JOB.replace('section = "auto"', 'section = "305x102x33 UKB"'))
    p = subprocess.run([*CLI, "run", str(job)], capture_output=True, text=True, timeout=300)
    assert p.returncode == 2
    err = p.stderr.strip()
    assert "\n" not in err and "Traceback" not in err
    assert err.startswith("splicecalc: error: splices.bolts = 'M20 8.8' is not allowed")
    assert "305x102x33 UKB" in err


def test_when_no_section_can_be_spliced_one_error_names_the_cause():
    # 20 kg a piece (the least the job file allows) cannot be met by the sections this job can use: a piece
    # is at least one splice zone long (600 mm), 0.6 m x 33 kg/m x 1.03 = 20.4 kg for the lightest that
    # carries it (305x102x33 UKB, BS 4-1 table, from memory); pieces are lifted bare
    job = loads_job(JOB.replace('max_piece_mass = "320 kg"', 'max_piece_mass = "20 kg"'), source="tiny")
    with pytest.raises(InputError) as ei:
        run_calc(job, render=False)
    msg = str(ei.value)
    assert "\n" not in msg
    assert "beam.section = 'auto'" in msg and "max_piece_mass = 20 kg" in msg
    assert ei.value.field == "splices"


SUPPORTS = """
[[support]]
at = "start"
connection = "end plate"
bolts = "M20 8.8"
plate = "S275"
existing_face = "column flange"
existing_steel = "1950-1958"

[support.existing_member]
designation = "existing stanchion (measured)"
h = "254 mm"
b = "203 mm"
tw = "8.9 mm"
tf = "12.7 mm"
r = "10.2 mm"

[support.existing_loads]
kind = "column"
height = "4.2 m"
category = "H"

[support.existing_loads.axial]
permanent = "95 kN"
imposed = "40 kN"

[[support]]
at = "end"
connection = "end plate"
bolts = "M20 8.8"
plate = "S275"
existing_face = "beam web"
existing_steel = "1950-1958"

[support.existing_member]
designation = "existing crossbeam (measured)"
h = "457 mm"
b = "152 mm"
tw = "9.9 mm"
tf = "17.0 mm"
r = "10.2 mm"

[support.existing_loads]
kind = "beam"
span = "6.0 m"
at = "3.0 m"
category = "H"
torsion = "free"

[support.existing_loads.udl]
permanent = "3.5 kN/m"
imposed = "2.0 kN/m"
"""


@pytest.fixture(scope="module")
def with_supports():
    return run_calc(loads_job(JOB + SUPPORTS, source="auto-splice test, supports"), render=False)


def test_a_section_whose_end_plate_fails_is_passed_over(with_supports):
    r = with_supports
    d = r.design
    over = {p.designation: p.reason for p in d.passed_over}
    # 254x146x37 UKB splices, but its end plate does not fit the web between the root fillets
    assert "254x146x37 UKB" in over and over["254x146x37 UKB"].startswith("End ")
    assert all(p.mass_kg_per_m <= d.section.mass_nominal for p in d.passed_over)
    assert d.ok and all(rec.ok for rec in r.records if rec.checked)
    # the same section given by the job: designed, with the failing end-plate check the reason names
    fixed = run_calc(loads_job((JOB + SUPPORTS).replace('section = "auto"', 'section = "254x146x37 UKB"'),
                               source="fixed"), render=False)
    bad = [rec for rec in fixed.records if rec.checked and not rec.ok]
    assert bad and any(rec.title in over["254x146x37 UKB"] for rec in bad)


def test_joints_failing_a_check_for_every_section_are_a_result_not_an_error():
    # an existing stanchion flange too narrow (102 mm) for the end plate's bolts: a joint check fails
    # whatever the beam; the lightest section whose joints can be designed is the result, its failing
    # checks shown (a failing design is a result, never an input error)
    text = (JOB + SUPPORTS).replace('b = "203 mm"', 'b = "102 mm"', 1)
    r = run_calc(loads_job(text, source="narrow stanchion"), render=False)
    assert not r.ok and r.design.ok
    assert any(rec.id.startswith("A.") and rec.checked and not rec.ok for rec in r.records)
    # only the sections stopped by an error are listed as passed over (lighter than the result)
    assert [p.designation for p in r.design.passed_over] == ["305x102x33 UKB", "356x127x33 UKB"]
