"""The look-up commands answer with units in their keys; user errors exit 2 with one line.

Reference values: EN 1993-1-8:2005 Table 3.4 formulas evaluated by hand; BS 4-1 section
table values (from memory).
"""

from __future__ import annotations

import json
import math

import pytest

from splicecalc.cli.main import main


def _json(capsys, argv):
    assert main(argv) == 0
    return json.loads(capsys.readouterr().out)


def test_section_lookup_tolerant_and_unit_keys(capsys):
    a = _json(capsys, ["section", "533x210x92UKB", "--json"])
    b = _json(capsys, ["section", "533 x 210 x 92 UKB", "--json"])
    assert a == b
    for key in ("h_mm", "b_mm", "tw_mm", "tf_mm", "r_mm", "mass_kg_per_m", "A_cm2", "Av_z_cm2", "Iy_cm4",
                "Iz_cm4", "Wel_y_cm3", "Wpl_y_cm3", "Wel_z_cm3", "Wpl_z_cm3", "iy_cm", "iz_cm", "It_cm4", "Iw_dm6"):
        assert key in a
    assert a["Iy_cm4"] == pytest.approx(55200, rel=0.01)  # BS 4-1 section table, 533x210x92 UKB (from memory)
    assert a["Wpl_y_cm3"] == pytest.approx(2360, rel=0.01)  # same table (from memory)


def test_sections_filter(capsys):
    rows = _json(capsys, ["sections", "IPE", "--max-depth", "300", "--json"])
    assert rows and all(r["h_mm"] <= 300 for r in rows)
    assert {r["designation"] for r in rows} >= {"IPE 300", "IPE 80"}  # EN 10365 IPE range


def test_bolt_lookup(capsys):
    d = _json(capsys, ["bolt", "M20", "--class", "8.8", "--json"])
    assert d["As_mm2"] == 245  # EN ISO 898-1 stress area (from memory)
    assert d["d0_mm"] == 22  # EN 1090-2 Table 11 normal hole
    assert d["Fv_Rd_kN"] == pytest.approx(0.6 * 800 * 245 / 1.25 / 1e3, rel=1e-6)  # EN 1993-1-8 Table 3.4
    assert d["Ft_Rd_kN"] == pytest.approx(0.9 * 800 * 245 / 1.25 / 1e3, rel=1e-6)  # EN 1993-1-8 Table 3.4
    assert d["Fp_C_kN"] == pytest.approx(0.7 * 800 * 245 / 1e3, rel=1e-6)  # EN 1993-1-8 3.9 (3.7)
    assert d["Fs_Rd_ULS_per_plane_kN"] == pytest.approx(1.0 * 0.5 * 137.2 / 1.25, rel=1e-3)  # Eq. 3.6, class A


def test_weld_lookup(capsys):
    d = _json(capsys, ["weld", "6", "--grade", "S275", "--json"])
    assert d["throat_mm"] == pytest.approx(4.2)
    # EN 1993-1-8 4.5.3.3: a fu / (sqrt3 beta_w gamma_M2), S275 beta_w 0.85 (Table 4.1), fu 410 (EN 10025-2)
    assert d["Fw_Rd_kN_per_mm"] == pytest.approx(4.2 * 410 / (math.sqrt(3) * 0.85 * 1.25) / 1e3, rel=1e-3)


@pytest.mark.parametrize("argv,needle", [
    (["section", "533x210x93 UKB"], "Nearest matches: 533x210x92 UKB"),
    (["bolt", "M21"], "M20"),
    (["bolt", "M20", "--class", "5.5"], "8.8"),
    (["weld", "-3"], "leg"),
    (["weld", "6", "--grade", "S999"], "grade"),
    (["sections", "W"], "family"),
])
def test_user_errors_are_one_line_exit_2(capsys, argv, needle):
    assert main(argv) == 2
    err = capsys.readouterr().err.strip()
    assert "\n" not in err and "Traceback" not in err and needle in err
