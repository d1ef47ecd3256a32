"""Core: unit conversions, job-file quantity parsing, input errors, check records.

References: SI prefixes and derived units (BIPM SI Brochure, 9th ed.): 1 kN = 1e3 N, 1 MPa = 1 N/mm2,
1 kNm = 1e6 Nmm, 1 kN/m = 1 N/mm.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from splicecalc.core import Calc, InputError, parse_quantity, require_positive, to_float, to_quantity
from splicecalc.core.record import utilisation


@pytest.mark.parametrize("value,unit", [(245.0, "mm2"), (94080.0, "N"), (355.0, "MPa"), (1.5e8, "Nmm"),
                                        (12.5, "N/mm"), (5.4e8, "mm4"), (7200.0, "mm")])
def test_round_trip_through_forallpeople(value, unit):
    q = to_quantity(value, unit)
    assert to_float(q, unit) == pytest.approx(value, rel=1e-12)


def test_float_of_quantity_is_the_displayed_number_trap():
    q = to_quantity(94080.0, "N")  # displays as 94.080 kN
    assert float(q) == pytest.approx(94.08)  # forallpeople: the displayed value
    assert q.value == pytest.approx(94080.0)  # SI base value
    assert to_float(q, "kN") == pytest.approx(94.08)


@pytest.mark.parametrize("text,unit,expected", [
    ("7.2 m", "mm", 7200.0), ("460 mm", "mm", 460.0), ("12.5 kN/m", "N/mm", 12.5), ("35 kN", "N", 35000.0),
    ("250 kg", "kg", 250.0), ("1.5e2 kNm", "Nmm", 1.5e8), ("355 MPa", "MPa", 355.0), ("3 kPa", "MPa", 0.003),
])
def test_parse_quantity(text, unit, expected):
    assert parse_quantity(text, unit, "field") == pytest.approx(expected)


@pytest.mark.parametrize("text,unit", [("7.2", "mm"), (7.2, "mm"), ("7.2 kN", "mm"), ("abc m", "mm"),
                                       ("inf m", "mm"), ("12 kN/m2", "N/mm")])
def test_parse_quantity_errors_name_the_key(text, unit):
    with pytest.raises(InputError, match="beam.span"):
        parse_quantity(text, unit, "beam.span")


@pytest.mark.parametrize("bad", [0.0, -1.0, float("nan"), float("inf"), "x", None, True])
def test_require_positive(bad):
    with pytest.raises(InputError) as e:
        require_positive("t_p", bad, "mm")
    assert "t_p" in str(e.value)


def test_quantities_are_refused_where_floats_are_expected():
    with pytest.raises(InputError, match="plain float"):
        require_positive("t_p", to_quantity(10.0, "mm"))


@given(st.floats(min_value=0.0, max_value=1e9), st.floats(min_value=1e-6, max_value=1e9))
def test_utilisation_is_ratio(d, r):
    assert utilisation(d, r) == pytest.approx(d / r)


def test_utilisation_with_nil_resistance_is_infinite():
    assert math.isinf(utilisation(1.0, 0.0))


def test_record_json_keys_carry_units():
    c = Calc()
    c.keep("F_v_Rd", 94080.0, "N")
    rec = c.record(id="x", title="t", clause="EN 1993-1-8:2005, 3.6.1, Table 3.4", demand=50e3,
                   resistance=94080.0, unit="N")
    d = rec.to_dict()
    assert d["demand_kN"] == 50.0 and d["resistance_kN"] == 94.08
    assert d["values"]["F_v_Rd_kN"] == 94.08
    assert d["ok"] is True


def test_write_atomic_leaves_no_temp_and_uses_umask(tmp_path):
    import os
    import stat

    from splicecalc.core.files import write_atomic

    p = tmp_path / "job.toml"
    write_atomic(p, "a = 1\n")
    write_atomic(p, b"a = 2\n")
    assert p.read_text() == "a = 2\n"
    assert [f.name for f in tmp_path.iterdir()] == ["job.toml"]
    mask = os.umask(0)
    os.umask(mask)
    assert stat.S_IMODE(p.stat().st_mode) == 0o666 & ~mask  # POSIX open() default mode
