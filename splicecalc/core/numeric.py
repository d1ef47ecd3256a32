"""Two small searches used on the calc path.

They stand in for ``scipy.optimize.brentq`` / ``minimize_scalar`` only because
importing ``scipy.optimize`` costs about 0.3 s in every calc kernel while these
two uses need nothing more than a bracketed root and a bracketed maximum to a
fixed tolerance (both far below what is printed); the maximum is searched with
vectorised samples (numpy) rather than one point at a time. scipy stays the tool for the
eigenproblems (``scipy.linalg``).
"""

from __future__ import annotations

import math
from typing import Callable

import numpy as np


def root_bisect(f: Callable[[float], float], a: float, b: float, xtol: float, maxiter: int = 200) -> float:
    """Root of ``f`` in [a, b] where f(a) and f(b) have opposite signs, by bisection to ``xtol``."""
    fa, fb = f(a), f(b)
    if fa == 0.0:
        return a
    if fb == 0.0:
        return b
    if fa * fb > 0.0:
        raise ValueError("root_bisect needs a sign change on [a, b]")
    for _ in range(maxiter):
        m = 0.5 * (a + b)
        if b - a <= xtol:
            return m
        fm = f(m)
        if fm == 0.0:
            return m
        if (fm < 0.0) == (fa < 0.0):
            a, fa = m, fm
        else:
            b = m
    return 0.5 * (a + b)


def sorted_unique(values: np.ndarray) -> np.ndarray:
    """The distinct values of a 1-D float array (no NaN), ascending: ``np.unique`` without its
    general machinery (a sort and one comparison), for the short grids of the beam analysis."""
    a = np.sort(np.asarray(values, dtype=float).ravel())
    if a.size < 2:
        return a
    keep = np.empty(a.size, dtype=bool)
    keep[0] = True
    np.not_equal(a[1:], a[:-1], out=keep[1:])
    return a[keep]


def max_sampled(f: Callable[[np.ndarray], np.ndarray], a: float, b: float, xtol: float, n: int = 33,
                maxiter: int = 60) -> tuple[float, float]:
    """(x, f(x)) of the maximum of a unimodal ``f`` on [a, b] to ``xtol``, ``f`` taking an array of x.

    Each round samples ``n`` points and keeps the two intervals beside the best one,
    so the bracket shrinks (n - 1) / 2 times per call of ``f``: six vectorised calls
    where a golden-section search makes some forty scalar ones.
    """
    if n < 3:
        raise ValueError("max_sampled needs n >= 3 points per round")
    best_x, best_f = a, -math.inf
    for _ in range(maxiter):
        xs = np.linspace(a, b, n)
        fs = np.asarray(f(xs), dtype=float)
        i = int(np.argmax(fs))
        if fs[i] >= best_f:
            best_x, best_f = float(xs[i]), float(fs[i])
        if b - a <= xtol:
            break
        a, b = float(xs[max(i - 1, 0)]), float(xs[min(i + 1, n - 1)])
    return best_x, best_f
