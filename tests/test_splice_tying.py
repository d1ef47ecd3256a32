"""The accidental tie force through a cover-plate splice (checker finding A5).

Outside references: EN 1993-1-8 Table 3.4 (bolt shear), EN 1993-1-1 6.2.3 (net section), gamma_Mu = 1.10
for tying resistance from the UK NA to BS EN 1993-1-8 (from memory); hand calculations beside each value.
"""

from __future__ import annotations

import pytest

from splicecalc.joints.splice import SpliceLayout, check_splice, parse_splices
from splicecalc.joints.splice.tying import tie_records
from splicecalc.materials.partial_factors import UK_NA

from test_splice_checks import S1_FLANGE, S1_WEB, UKB457_152


def _s1():
    spec = parse_splices({"bolts": "M20 8.8", "gap": "10 mm", "plate_grade": "S355", "category": "B"})
    d = check_splice(UKB457_152, "S355", 237.068e6, 39.086e3, 0.0, spec=spec,
                     layout=SpliceLayout("M20", "8.8", S1_FLANGE, S1_WEB))
    return d, spec


def test_tie_force_through_splice_hand_calculation():
    d, spec = _s1()
    T = 87.9e3                                             # the demo's tie force, 0.8 (80.05 + 18 + 11.88) kN
    recs = {r.id: r for r in tie_records(d, spec, T, UK_NA)}
    A = UKB457_152.A
    N_f = T * 152.9 * 13.3 / A                             # flange share by area (hand calculation)
    N_w = T - 2 * N_f
    # flange bolts: 6 per flange each side, single shear, gamma_Mu = 1.1 (UK NA, from memory)
    assert recs["tie_flange_bolts"].demand == pytest.approx(N_f / 6 / 1e3, rel=1e-9)
    assert recs["tie_flange_bolts"].resistance == pytest.approx(0.6 * 800 * 245 / 1.1 / 1e3, rel=1e-9)  # Table 3.4
    # web bolts: 10 each side, two shear planes
    assert recs["tie_web_bolts"].demand == pytest.approx(N_w / 10 / 1e3, rel=1e-9)
    assert recs["tie_web_bolts"].resistance == pytest.approx(2 * 0.6 * 800 * 245 / 1.1 / 1e3, rel=1e-9)
    # outer flange plate 150 x 12, 2 holes 22: net 0.9 * 1272 * 470 / 1.1 = 489.1 kN (EN 1993-1-1 Eq. 6.7)
    assert recs["tie_outer_plate"].resistance == pytest.approx(0.9 * 1272 * 470 / 1.1 / 1e3, rel=1e-9)
    assert recs["tie_outer_plate"].demand == pytest.approx(N_f / 1e3, rel=1e-9)
    # web plate 350 x 8, 5 holes: net 0.9 * 8 * (350 - 110) * 470 / 1.1 = 738.3 kN, each takes N_w / 2
    assert recs["tie_web_plates"].resistance == pytest.approx(0.9 * 8 * 240 * 470 / 1.1 / 1e3, rel=1e-9)
    assert recs["tie_web_plates"].demand == pytest.approx(N_w / 2 / 1e3, rel=1e-9)
    assert all(r.has("accidental") for r in recs.values())


def test_a_tie_force_too_large_fails():
    d, spec = _s1()
    # T = 2600 kN: N_f = 2600 * 2033.6 / 7623.2 = 693.6 kN; per flange bolt 115.6 kN > 106.9 kN (hand calculation)
    recs = {r.id: r for r in tie_records(d, spec, 2600e3, UK_NA)}
    assert not recs["tie_flange_bolts"].ok
    assert not recs["tie_outer_plate"].ok                  # 693.6 kN > 489.1 kN net section
    assert "tie_bearing" in recs and not recs["tie_bearing"].checked   # beyond the ULS forces: NOT CHECKED


def test_demo_splices_carry_the_tie_force_in_run_and_json():
    # the demo's tie force 87.9 kN (checker's hand check: 0.8 (80.05 + 18 + 11.88)) appears at both splices
    from pathlib import Path

    from splicecalc.job import load_job
    from splicecalc.workflow.calc import run_calc
    job = load_job(Path(__file__).parents[1] / "examples" / "demo_workshop_gallery.toml")
    res = run_calc(job, render=False)
    for s in res.splices:
        ids = {r.id: r for r in s.records}
        r = ids[f"{s.label}.tie_outer_plate"]
        assert r.demand == pytest.approx(87.9 * 152.9 * 13.3 / UKB457_152.A, rel=2e-3)
        assert r.ok and r.has("accidental")


def test_no_supports_means_the_tie_is_not_checked_never_silence():
    # without [[support]] the beam's tie force is unknown: each splice gets a NOT CHECKED record
    from pathlib import Path

    from splicecalc.job import load_job
    from splicecalc.workflow.calc import run_calc, splice_tie_checks
    job = load_job(Path(__file__).parents[1] / "examples" / "demo_workshop_gallery.toml")
    res = run_calc(job, render=False)
    bare = tuple(type(s)(**{**s.__dict__, "records": tuple(r for r in s.records if not r.has("accidental"))})
                 for s in res.splices)
    out = splice_tie_checks(job, bare, (), render=False)
    for s in out:
        tie = [r for r in s.records if r.id == f"{s.label}.tie"]
        assert len(tie) == 1 and not tie[0].checked and "support" in tie[0].note
