"""[splices] table parsing: good tables parse to the right units, bad values raise InputError naming the key."""

from __future__ import annotations

import pytest

from splicecalc.core.errors import InputError
from splicecalc.joints.splice import parse_splices


def test_defaults_and_units():
    s = parse_splices({})
    assert s.bolts == "auto" and s.category == "A" and s.flange_plates == "outer" and s.plate_grade == "S355"
    s = parse_splices({"positions": ["2.6 m", "5000 mm"], "max_piece_mass": "0.25 t", "clearance": "30 cm",
                       "bolts": "m20  8.8", "category": "c", "friction_class": "b", "flange_plates": "Outer + Inner",
                       "plate_grade": "s275", "min_design_moment": 0.25, "cost": {"per_bolt": 2, "per_kg": 0.1}})
    assert s.positions == (2600.0, 5000.0)          # parse_quantity: m -> mm
    assert s.max_piece_mass == 250.0 and s.clearance == 300.0
    assert s.bolts == "M20 8.8" and s.bolt_size == "M20" and s.bolt_class == "8.8"
    assert s.category == "C" and s.friction_class == "B" and s.flange_plates == "outer+inner"
    assert s.plate_grade == "S275" and s.min_design_moment == 0.25 and s.cost_per_bolt == 2.0


def test_explicit_layout():
    s = parse_splices({"bolts": "M20 8.8", "layout": {
        "flange": {"rows": 3, "columns": 2, "pitch": "70 mm", "gauge": "100 mm", "plate": "15 mm"},
        "web": {"rows": 4, "columns": 1, "pitch": "70 mm", "plate": "8 mm"}}})
    assert s.layout_given and s.flange.rows == 3 and s.flange.pitch == 70.0 and s.web.plate == 8.0


@pytest.mark.parametrize("table,key", [
    ({"pieces": 0}, "splices.pieces"),
    ({"pieces": 2.5}, "splices.pieces"),
    ({"positions": "2.6 m"}, "splices.positions"),
    ({"positions": ["5 m", "2 m"]}, "splices.positions"),
    ({"positions": ["2.6"]}, "splices.positions[1]"),
    ({"positions": ["2.6 m"], "pieces": 3}, "splices.pieces"),
    ({"max_piece_length": "3 kN"}, "splices.max_piece_length"),
    ({"max_piece_mass": "-5 kg"}, "splices.max_piece_mass"),
    ({"bolts": "M21 8.8"}, "splices.bolts"),
    ({"bolts": "M20"}, "splices.bolts"),
    ({"category": "D"}, "splices.category"),
    ({"friction_class": "E"}, "splices.friction_class"),
    ({"flange_plates": "inner"}, "splices.flange_plates"),
    ({"plate_grade": "S999"}, "splices.plate_grade"),
    ({"min_design_moment": 1.5}, "splices.min_design_moment"),
    ({"min_design_moment": "0.2"}, "splices.min_design_moment"),
    ({"clearance": "300"}, "splices.clearance"),
    ({"gap": "80 mm"}, "splices.gap"),
    ({"exposed": "yes"}, "splices.exposed"),
    ({"cost": {"per_bolt": -1}}, "splices.cost.per_bolt"),
    ({"colour": "red"}, "splices.colour"),
    ({"bolts": "auto", "layout": {"flange": {"rows": 2, "columns": 2, "pitch": "70 mm", "gauge": "100 mm",
                                             "plate": "10 mm"},
                                  "web": {"rows": 3, "columns": 1, "pitch": "70 mm", "plate": "8 mm"}}}, "splices.bolts"),
    ({"bolts": "M20 8.8", "layout": {"flange": {"rows": 2, "columns": 3, "pitch": "70 mm", "gauge": "100 mm",
                                                "plate": "10 mm"},
                                     "web": {"rows": 3, "columns": 1, "pitch": "70 mm", "plate": "8 mm"}}},
     "splices.layout.flange.columns"),
    ({"bolts": "M20 8.8", "layout": {"flange": {"rows": 2, "columns": 2, "pitch": "70 mm", "gauge": "100 mm"},
                                     "web": {"rows": 3, "columns": 1, "pitch": "70 mm", "plate": "8 mm"}}},
     "splices.layout.flange.plate"),
    ({"bolts": "M20 8.8", "layout": {"web": {"rows": 3, "columns": 1, "pitch": "70 mm", "plate": "8 mm"}}},
     "splices.layout"),
    ({"bolts": "M20 8.8", "flange_plates": "outer+inner", "layout": {
        "flange": {"rows": 2, "columns": 2, "pitch": "70 mm", "gauge": "100 mm", "plate": "10 mm"},
        "web": {"rows": 3, "columns": 1, "pitch": "70 mm", "plate": "8 mm"}}}, "splices.layout.flange.inner_plate"),
])
def test_bad_values_name_the_key(table, key):
    with pytest.raises(InputError) as ei:
        parse_splices(table)
    assert ei.value.field == key
    assert key in str(ei.value)
