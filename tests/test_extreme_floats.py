"""Property tests: the public check functions, given extreme floats, return a record or raise
the library's :class:`InputError` -- never OverflowError, ZeroDivisionError, ValueError of
``math``, RecursionError or anything else (hypothesis draws the numbers)."""

from __future__ import annotations

import importlib
import inspect
import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from splicecalc.core.errors import InputError

MODULES = ("splicecalc.members.checks", "splicecalc.joints.bolts", "splicecalc.joints.welds",
           "splicecalc.joints.plates", "splicecalc.joints.spacing", "splicecalc.joints.connections.notch")

#: the numbers that break arithmetic: signed zeros, subnormals, the ends of the float range, NaN, inf
EXTREME = st.one_of(
    st.sampled_from([0.0, -0.0, 5e-324, -5e-324, 4e-145, 1e-300, 1e300, -1e300, 1.7976931348623157e308,
                     -1.7976931348623157e308, math.inf, -math.inf, math.nan, 1e-9, 1e15, -1.0, 1.0]),
    st.floats(allow_nan=True, allow_infinity=True),
)


def _public_checks():
    out = []
    for m in MODULES:
        mod = importlib.import_module(m)
        for name, f in sorted(vars(mod).items()):
            if name.startswith("check_") and callable(f) and getattr(f, "__module__", "") == m:
                out.append(f)
    return out


def _fixed(name: str, ann: str):
    """A sensible value for a parameter that is not a float (section, grade, bolt ...)."""
    from splicecalc.joints.bolts import get_bolt
    from splicecalc.sections import get_section

    if name in ("section", "beam"):
        return get_section("457x191x67 UKB")
    if name.startswith("grade"):
        return "S275"
    if name == "bolt":
        return get_bolt("M20", "8.8")
    if name == "F_b_Rd_each":
        return [50e3, 60e3]
    return inspect.Parameter.empty


def _float_params(sig: inspect.Signature) -> list[str]:
    return [p.name for p in sig.parameters.values()
            if p.default is inspect.Parameter.empty and "float" in str(p.annotation)
            or (p.default is not inspect.Parameter.empty and str(p.annotation) in ("float", "float | None")
                and p.kind is not inspect.Parameter.KEYWORD_ONLY)]


CHECKS = _public_checks()


def test_the_checks_are_found():
    assert len(CHECKS) >= 20


@pytest.mark.parametrize("fn", CHECKS, ids=[f.__name__ for f in CHECKS])
def test_check_function_raises_only_input_error(fn):
    sig = inspect.signature(fn)
    floats = _float_params(sig)
    fixed = {}
    for p in sig.parameters.values():
        if p.name in floats or p.default is not inspect.Parameter.empty:
            continue
        v = _fixed(p.name, str(p.annotation))
        assert v is not inspect.Parameter.empty, f"{fn.__name__}: no test value for {p.name}"
        fixed[p.name] = v

    @settings(max_examples=60, deadline=None, suppress_health_check=list(HealthCheck))
    @given(st.lists(EXTREME, min_size=len(floats), max_size=len(floats)))
    def run(values):
        try:
            fn(**fixed, **dict(zip(floats, values)))
        except InputError:
            pass

    run()


def test_issue_example_plate_bending():
    from splicecalc.joints.plates import check_plate_bending

    with pytest.raises(InputError):
        check_plate_bending(-0.0, 1e300, 4e-145, "S275")
