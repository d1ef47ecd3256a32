"""Two small scalar searches used on the calc path.

They stand in for ``scipy.optimize.brentq`` / ``minimize_scalar`` only because
importing ``scipy.optimize`` costs about 0.3 s in every calc kernel while these
two uses need nothing more than a bracketed root and a bracketed maximum to a
fixed tolerance (both far below what is printed). scipy stays the tool for the
eigenproblems (``scipy.linalg``).
"""

from __future__ import annotations

import math
from typing import Callable

_GOLD = (math.sqrt(5.0) - 1.0) / 2.0  # 0.618...


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


def max_golden(f: Callable[[float], float], a: float, b: float, xtol: float, maxiter: int = 200) -> tuple[float, float]:
    """(x, f(x)) of the maximum of a unimodal ``f`` on [a, b], by golden-section search to ``xtol``."""
    c, d = b - _GOLD * (b - a), a + _GOLD * (b - a)
    fc, fd = f(c), f(d)
    for _ in range(maxiter):
        if b - a <= xtol:
            break
        if fc >= fd:
            b, d, fd = d, c, fc
            c = b - _GOLD * (b - a)
            fc = f(c)
        else:
            a, c, fc = c, d, fd
            d = a + _GOLD * (b - a)
            fd = f(d)
    return (c, fc) if fc >= fd else (d, fd)
