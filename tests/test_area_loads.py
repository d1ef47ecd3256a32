"""Loads as a practitioner writes them: area loads in kN/m2 with the tributary width they are collected
over, and masses in tonnes (weight with g = 9.81 m/s2, the value the package uses for self-weight).
Expected values by hand: line load = area load x width; weight = mass x g."""

from __future__ import annotations

import pytest

from splicecalc.core.errors import InputError
from splicecalc.job.loader import parse_load

SPAN = 9600.0   # mm


@pytest.mark.parametrize("udl, width, w_N_per_mm", [
    ("5 kN/m2", "2.5 m", 5.0 * 2.5),           # 5 kN/m2 x 2.5 m = 12.5 kN/m (hand)
    ("4 kPa", "3 m", 4.0 * 3.0),               # 1 kPa = 1 kN/m2
    ("3.5 kN/m2", "1800 mm", 3.5 * 1.8),
])
def test_area_load_times_tributary_width(udl, width, w_N_per_mm):
    ld = parse_load({"name": "floor", "action": "imposed", "category": "B", "udl": udl, "width": width}, 1, SPAN)
    assert ld.w == pytest.approx(w_N_per_mm)                 # kN/m = N/mm


def test_tonnes_as_weights():
    P = parse_load({"name": "hoist", "action": "imposed", "category": "E", "point": "2 t", "at": "3 m"}, 1, SPAN)
    assert P.P == pytest.approx(2000.0 * 9.81)               # 2 t x 9.81 m/s2 = 19.62 kN (hand)
    kg = parse_load({"name": "unit", "action": "permanent", "point": "150 kg", "at": "3 m"}, 1, SPAN)
    assert kg.P == pytest.approx(150.0 * 9.81)
    w = parse_load({"name": "racking", "action": "permanent", "udl": "0.5 t/m"}, 1, SPAN)
    assert w.w == pytest.approx(0.5 * 9.81)                  # 0.5 t/m = 4.905 kN/m (hand)


@pytest.mark.parametrize("table, field", [
    ({"udl": "5 kN/m2"}, "load[1].width"),                                # area load without width
    ({"udl": "5 kN/m", "width": "2 m"}, "load[1].width"),                 # width with a line load
    ({"udl": "5 kN/m2", "width": "0 m"}, "load[1].width"),
    ({"point": "2 t", "at": "1 m", "width": "1 m"}, "load[1].width"),     # width with a point load
    ({"udl": "5 kN/m3"}, "load[1].udl"),
])
def test_messages_name_the_field(table, field):
    with pytest.raises(InputError) as e:
        parse_load({"name": "x", "action": "permanent", **table}, 1, SPAN)
    assert str(e.value).startswith(field)
