"""core.numeric against scipy.optimize (the general-purpose reference) on smooth and kinked functions."""

from __future__ import annotations

import math

import pytest
import scipy.optimize as so
from hypothesis import given
from hypothesis import strategies as st

import numpy as np

from splicecalc.core.numeric import max_sampled, root_bisect


@pytest.mark.parametrize("f,a,b", [
    (lambda x: x ** 3 - 2 * x - 5, 2.0, 3.0),                  # Newton's classic cubic
    (lambda x: math.cos(x) - x, 0.0, 1.0),
    (lambda x: (x - 4200.0) * (x + 10.0) * 1e-6, 1000.0, 7000.0),
])
def test_root_matches_brentq(f, a, b):
    assert root_bisect(f, a, b, xtol=1e-12) == pytest.approx(so.brentq(f, a, b, xtol=1e-14), abs=1e-10)


@given(st.floats(min_value=0.05, max_value=0.95), st.floats(min_value=0.5, max_value=5.0))
def test_max_of_a_kinked_moment_diagram(a_frac, P):
    # simply supported point load: M(x) = P b x / L left of a, P a (L - x) / L right; max P a b / L at x = a
    L = 1.0
    a, b = a_frac * L, (1 - a_frac) * L
    M = lambda x: np.where(x <= a, P * b * x / L, P * a * (L - x) / L)  # noqa: E731
    x, m = max_sampled(M, 0.0, L, xtol=1e-12)
    assert x == pytest.approx(a, abs=1e-9) and m == pytest.approx(P * a * b / L, rel=1e-9)
    ref = so.minimize_scalar(lambda t: -float(M(t)), bounds=(0.0, L), method="bounded", options={"xatol": 1e-12})
    assert m == pytest.approx(-ref.fun, rel=1e-7)


def test_max_of_a_smooth_function_matches_minimize_scalar():
    # UDL on a simple span with a partial UDL: smooth, off-centre peak
    f = lambda x: x * (10.0 - x) + 3.0 * np.clip(x - 6.0, 0.0, None) ** 2 * -0.5  # noqa: E731
    x, m = max_sampled(f, 0.0, 10.0, xtol=1e-10)
    ref = so.minimize_scalar(lambda t: -float(f(t)), bounds=(0.0, 10.0), method="bounded", options={"xatol": 1e-12})
    assert x == pytest.approx(ref.x, abs=1e-6) and m == pytest.approx(-ref.fun, rel=1e-12)
    with pytest.raises(ValueError):
        max_sampled(f, 0.0, 1.0, xtol=1e-3, n=2)


def test_root_needs_a_sign_change():
    with pytest.raises(ValueError):
        root_bisect(lambda x: x * x + 1.0, -1.0, 1.0, xtol=1e-9)


@given(st.lists(st.floats(min_value=-1e6, max_value=1e6, allow_nan=False), max_size=60))
def test_sorted_unique_matches_numpy_unique(xs):
    # numpy.unique is the general-purpose reference (-0.0 and 0.0 count as one value in both)
    from splicecalc.core.numeric import sorted_unique

    ours, ref = sorted_unique(np.array(xs, dtype=float)), np.unique(np.array(xs, dtype=float))
    assert ours.shape == ref.shape and np.array_equal(ours, ref)
