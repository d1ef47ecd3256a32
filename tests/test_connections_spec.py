"""Job-file ``[[support]]`` tables: parsing and bad input (InputError names the key).

Expected values are the job-file text itself (units per splicecalc.core.units) and the
BS 4-1 catalogue section the text names.
"""

from __future__ import annotations

import pytest

from splicecalc.core.errors import InputError
from splicecalc.joints.connections import SupportSpec, parse_support
from splicecalc.joints.connections.spec import TYING_MIN_N


def _t(**kw):
    t = {"at": "end", "connection": "fin plate", "bolts": "M20 8.8", "plate": "10 mm S275",
         "existing_member": "254x254x73 UKC", "existing_face": "column flange", "existing_steel": "1950-1958"}
    t.update(kw)
    return {k: v for k, v in t.items() if v is not None}


def test_full_table():
    s = parse_support(_t(notch_top="40 mm x 120 mm", tying_force="90 kN", rows=3, pitch="7 cm",
                         weld_leg="8 mm"), 2)
    assert isinstance(s, SupportSpec)
    assert (s.at, s.connection, s.bolt_size, s.bolt_class) == ("end", "fin plate", "M20", "8.8")
    assert (s.plate_t, s.plate_grade) == (10.0, "S275")
    assert s.existing_member.designation.startswith("254x254x73")
    assert (s.notch_depth, s.notch_length) == (40.0, 120.0)
    assert s.tying_force == 90e3 and s.rows == 3 and s.pitch == 70.0 and s.weld_leg == 8.0
    assert s.field == "support[2]"


def test_defaults():
    s = parse_support(_t(bolts=None, plate=None), 1)
    assert (s.bolt_size, s.bolt_class, s.plate_t, s.plate_grade) == ("M20", "8.8", None, "S275")
    assert s.tying_force == TYING_MIN_N == 75e3      # UK practice minimum 75 kN (from memory)
    assert s.rows is None and s.notch_depth is None


def test_plate_grade_only_means_automatic_thickness():
    s = parse_support(_t(plate="S355"), 1)
    assert s.plate_t is None and s.plate_grade == "S355"


def test_measured_existing_member():
    s = parse_support(_t(existing_member={"h": "254 mm", "b": "254 mm", "tw": "8.6 mm", "tf": "14.2 mm",
                                          "r": "12.7 mm"}), 1)
    assert s.existing_member.family == "MEASURED" and s.existing_member.tf == 14.2


@pytest.mark.parametrize("key, value, match", [
    ("plate", "ten mm S275", r"support\[1\]\.plate"),
    ("plate", "10 kN S275", r"support\[1\]\.plate"),
    ("plate", "10 mm S999", r"support\[1\]\.plate"),
    ("bolts", "M21 8.8", r"support\[1\]\.bolts"),
    ("bolts", "M20 9.9", r"support\[1\]\.bolts"),
    ("at", "middle", r"support\[1\]\.at"),
    ("connection", "cleats", r"support\[1\]\.connection"),
    ("existing_face", "column side", r"support\[1\]\.existing_face"),
    ("existing_member", "999x999x1 UKB", r"support\[1\]\.existing_member"),
    ("notch_top", "40 mm", r"support\[1\]\.notch_top"),
    ("tying_force", "75", r"support\[1\]\.tying_force"),
    ("tying_force", "-5 kN", r"support\[1\]\.tying_force"),
    ("rows", 0, r"support\[1\]\.rows"),
    ("rows", 2.5, r"support\[1\]\.rows"),
    ("pitch", "7 kN", r"support\[1\]\.pitch"),
    ("weld_leg", "50 mm", r"support\[1\]\.weld_leg"),
    ("colour", "red", r"support\[1\]\.colour"),
])
def test_bad_values_name_the_key(key, value, match):
    with pytest.raises(InputError, match=match):
        parse_support(_t(**{key: value}), 1)


def test_missing_required_keys():
    for key in ("at", "connection", "existing_member", "existing_face", "existing_steel"):
        t = _t()
        del t[key]
        with pytest.raises(InputError, match=rf"support\[4\]\.{key}"):
            parse_support(t, 4)


def test_unknown_era_lists_allowed_bands_and_grades():
    with pytest.raises(InputError) as e:
        parse_support(_t(existing_steel="1820-1830"), 1)
    msg = str(e.value)
    assert "support[1].existing_steel" in msg and "1950-1958" in msg and "S275" in msg


def test_iron_is_refused():
    with pytest.raises(InputError, match="not steel"):
        parse_support(_t(existing_steel="cast iron"), 1)
    with pytest.raises(InputError, match="not steel"):
        parse_support(_t(existing_steel="wrought iron 1880"), 1)


def test_from_toml_text():
    import tomllib
    doc = tomllib.loads('''
[[support]]
at = "start"
connection = "end plate"
bolts = "M24 10.9"
plate = "12 mm S355"
existing_steel = "S275"
existing_face = "column web"
existing_member = { h = "203.2 mm", b = "203.6 mm", tw = "7.2 mm", tf = "11.0 mm", r = "10.2 mm" }
gauge = "100 mm"
''')
    s = parse_support(doc["support"][0], 1)
    assert (s.bolt_size, s.bolt_class, s.plate_t, s.plate_grade, s.gauge) == ("M24", "10.9", 12.0, "S355", 100.0)
    assert s.existing_member.h == 203.2 and s.existing_face == "column web"
