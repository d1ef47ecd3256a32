"""Existing member: historic steel strengths and local checks where the connection lands.

Sources beside each value: published UK appraisal guidance for older steels (era table,
FROM MEMORY), EN 10025-2 Table 7 for modern grades, hand calculations from EN 1993-1-8
Table 3.4 / EN 1993-1-1 6.2.6, and the nominal 100 mm eccentricity of simple construction
(published UK guidance, from memory).
"""

from __future__ import annotations

from math import pi, sqrt

import pytest

from splicecalc.core.errors import InputError
from splicecalc.joints.connections import (EXISTING_STEEL_CAUTION, check_existing_member, design_end_connection,
                                           parse_support)
from splicecalc.materials.historic import ERA_BANDS, existing_steel, historic_steel
from splicecalc.sections import get_section

BEAM = get_section("457x191x67 UKB")
COL = get_section("254x254x73 UKC")


# ------------------------------------------------------------------ historic steel table

def test_era_band_values_from_memory():
    # published appraisal guidance (from memory): about 235 MPa for thin post-war mild steel, 275 after 1986
    assert historic_steel("1950-1958", 12.0).f_y == 235.0
    assert historic_steel("1950-1958", 25.0).f_y == 230.0
    assert historic_steel("1986-1992", 12.0).f_y == 275.0
    assert historic_steel("before 1909", 12.0).f_y == 200.0


def test_year_and_alias_lookup():
    assert historic_steel("1955", 10.0).grade == "historic 1950-1958"
    assert historic_steel("pre-1909", 10.0).grade == "historic before 1909"
    assert historic_steel("1952 - 1956", 10.0).grade == "historic 1950-1958"


def test_bands_are_contiguous_and_strength_never_falls_with_era():
    bands = sorted(ERA_BANDS.values(), key=lambda b: b.first_year)
    for a, b in zip(bands, bands[1:]):
        assert b.first_year == a.last_year + 1
        assert b.fy_steps[0][1] >= a.fy_steps[0][1]


def test_modern_grade_passes_through_en10025():
    m = existing_steel("S275", 14.2)
    assert (m.f_y, m.f_u, m.historic) == (275.0, 410.0, False)   # EN 10025-2 Table 7, t <= 16
    m = existing_steel("S355", 20.0)
    assert m.f_y == 345.0                                          # EN 10025-2 Table 7, 16 < t <= 40


def test_historic_note_flags_memory():
    m = existing_steel("1950-1958", 14.2)
    assert m.historic and "from memory" in m.note


@pytest.mark.parametrize("bad", ["1820-1830", "Victorian", "S999", "", "cast iron", "wrought iron"])
def test_unknown_material_lists_allowed(bad):
    with pytest.raises(InputError) as e:
        existing_steel(bad, 10.0)
    assert "1950-1958" in str(e.value) and "S355" in str(e.value)


def test_caution_text():
    for words in ("survey", "testing", "cast iron", "wrought iron", "weld"):
        assert words in EXISTING_STEEL_CAUTION


# ------------------------------------------------------------------ local checks

def _spec(**kw):
    t = {"at": "start", "connection": "end plate", "bolts": "M20 8.8", "plate": "10 mm S275", "rows": 4,
         "gauge": "90 mm", "weld_leg": "8 mm", "existing_member": "254x254x73 UKC",
         "existing_face": "column flange", "existing_steel": "1950-1958"}
    t.update(kw)
    return parse_support({k: v for k, v in t.items() if v is not None}, 1)


def test_bearing_in_historic_flange_by_hand():
    d = design_end_connection(BEAM, "S355", 200e3, _spec())
    r = next(x for x in d.records if x.id == "ex_bearing")
    # historic 1950-1958: f_u 430 MPa (from memory); t_f 14.2; inner alpha_d = 70/66 - 1/4; k1 = 2.5
    Fb = 2.5 * min(70 / 66 - 0.25, 800 / 430, 1.0) * 430 * 20 * COL.tf / 1.25
    assert r.resistance == pytest.approx(Fb / 1e3, rel=1e-6)
    assert r.demand == pytest.approx(200 / 8)
    assert "from memory" in r.note
    assert d.caution == EXISTING_STEEL_CAUTION


def test_punching_for_tying_by_hand():
    d = design_end_connection(BEAM, "S355", 200e3, _spec())
    r = next(x for x in d.records if x.id == "ex_tie_punching")
    # Table 3.4: B_p,Rd = 0.6 pi d_m t_p f_u / gamma_Mu; d_m = mean of nut across flats 30 and corners 30 x 2/sqrt3
    d_m = 0.5 * (30 + 2 * 30 / sqrt(3))
    assert r.resistance == pytest.approx(0.6 * pi * d_m * COL.tf * 430 / 1.1 / 1e3, rel=1e-6)


def test_eccentric_moment_column_flange():
    d = design_end_connection(BEAM, "S355", 200e3, _spec())
    # e = h/2 + 100 mm nominal from the face (published guidance, from memory), major axis
    assert d.existing.axis == "y"
    assert d.existing.M_add_Nmm == pytest.approx(200e3 * (COL.h / 2 + 100.0), rel=1e-9)


def test_eccentric_moment_column_web_minor_axis():
    d = design_end_connection(BEAM, "S355", 200e3, _spec(existing_face="column web"))
    assert d.existing.axis == "z"
    assert d.existing.M_add_Nmm == pytest.approx(200e3 * (COL.tw / 2 + 100.0), rel=1e-9)


def test_existing_web_local_shear_by_hand():
    ex = get_section("533x210x92 UKB")
    d = design_end_connection(BEAM, "S355", 200e3, _spec(existing_member="533x210x92 UKB",
                                                          existing_face="beam web", existing_steel="S275",
                                                          notch_top="50 mm x 130 mm"))
    r = next(x for x in d.records if x.id == "ex_web_shear")
    # one plane h_p t_w2: gross f_y/sqrt3 (EN 1993-1-1 6.2.6), net (h_p - 4 d0) t_w2 f_u/(sqrt3 x 1.1)
    # S275 strength at t_f = 15.6 mm (thickest element): f_y 275, f_u 410 (EN 10025-2 Table 7)
    g = 290 * ex.tw * 275 / sqrt(3)
    n = (290 - 4 * 22) * ex.tw * 410 / (sqrt(3) * 1.1)
    assert r.resistance == pytest.approx(min(g, n) / 1e3, rel=1e-6)
    assert d.existing.axis == "torsion"


def test_fin_plate_on_web_punching_limit():
    d = design_end_connection(BEAM, "S355", 200e3, _spec(connection="fin plate", existing_face="column web",
                                                          existing_steel="S275", gauge=None))
    r = next(x for x in d.records if x.id == "ex_punching")
    # t_p <= t_w2 f_u2/(f_yp gamma_M2) (published guidance, from memory): 8.6 x 410/(275 x 1.25)
    assert r.resistance == pytest.approx(COL.tw * 410 / (275 * 1.25), rel=1e-6)
    assert any("WELDED" in w for w in d.warnings)


def test_check_existing_member_public_entry():
    d = design_end_connection(BEAM, "S355", 200e3, _spec())
    res = check_existing_member(COL, "1950-1958", "column flange", d.detail, 200e3, beam_section=BEAM,
                                beam_grade="S355")
    assert [r.id for r in res.records] == [r.id for r in d.existing.records]
    with pytest.raises(InputError, match="existing_face"):
        check_existing_member(COL, "1950-1958", "column side", d.detail, 200e3, beam_section=BEAM)
    with pytest.raises(InputError, match="V_Ed"):
        check_existing_member(COL, "1950-1958", "column flange", d.detail, 0.0, beam_section=BEAM)
    with pytest.raises(InputError, match="existing_steel"):
        check_existing_member(COL, "1700", "column flange", d.detail, 1e3, beam_section=BEAM)
