"""Governing combination and envelopes of design effects over a list of combinations.

Units: x in mm, M in N*mm, V in N, w in mm. Envelopes are of absolute values
(max |M|, max |V|); at a point load the shear is taken as the larger of its
values just left and just right of the section.

Public API: :class:`Governing`, :func:`governing_M`, :func:`governing_V`,
:func:`governing_w`, :class:`Envelope`, :func:`envelope`, :func:`envelope_at`.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

import numpy as np

from ..actions.combinations import Combination
from ..core.errors import InputError, require_positive
from ..materials.steel import E_MPa
from .beam import Extreme, SimpleBeam


@dataclass(frozen=True)
class Governing:
    """Governing combination for one effect: the combination, its extreme (value, x_mm) and the beam."""

    combination: Combination
    extreme: Extreme
    beam: SimpleBeam

    @property
    def value(self) -> float:
        return self.extreme.value

    @property
    def x_mm(self) -> float:
        return self.extreme.x_mm


def _check_combos(combos: object) -> tuple[Combination, ...]:
    if isinstance(combos, Combination):
        combos = (combos,)
    if not isinstance(combos, (list, tuple)) or not combos:
        raise InputError("combos", combos, "a non-empty list of Combination")
    for i, c in enumerate(combos):
        if not isinstance(c, Combination):
            raise InputError(f"combos[{i}]", c, "a Combination")
    return tuple(combos)


def _pick(combos: Sequence[Combination], span_mm: float, what: str, E: float,
          I: float | None) -> Governing:
    combos = _check_combos(combos)
    L = require_positive("span_mm", span_mm, "mm")
    best: Governing | None = None
    for c in combos:
        if not c.loads:
            continue
        b = SimpleBeam(L, c.loads, E=E, I=I)
        ex = {"M": b.M_max, "V": b.V_max, "w": b.w_max}[what]()
        if best is None or ex.abs > best.extreme.abs * (1 + 1e-12):
            best = Governing(c, ex, b)
    if best is None:
        raise InputError("combos", [c.name for c in combos], "at least one combination with a load")
    return best


def governing_M(combos: Sequence[Combination], span_mm: float) -> Governing:
    """Combination giving the largest |M| (N*mm) anywhere on the span."""
    return _pick(combos, span_mm, "M", E_MPa, None)


def governing_V(combos: Sequence[Combination], span_mm: float) -> Governing:
    """Combination giving the largest |V| (N) anywhere on the span."""
    return _pick(combos, span_mm, "V", E_MPa, None)


def governing_w(combos: Sequence[Combination], span_mm: float, I: float, E: float = E_MPa) -> Governing:
    """Combination giving the largest |w| (mm) for E (MPa) and I (mm4)."""
    require_positive("I", I, "mm4")
    return _pick(combos, span_mm, "w", E, I)


@dataclass(frozen=True)
class Envelope:
    """Envelope on points ``x_mm``: M_Ed (N*mm) and V_Ed (N) as max absolute values over the
    combinations, with the index into ``names`` of the combination giving each."""

    x_mm: np.ndarray
    M_Ed: np.ndarray
    V_Ed: np.ndarray
    M_combo: np.ndarray
    V_combo: np.ndarray
    names: tuple[str, ...]

    def governing_M_name(self, i: int) -> str:
        return self.names[int(self.M_combo[i])]

    def governing_V_name(self, i: int) -> str:
        return self.names[int(self.V_combo[i])]


def envelope_at(combos: Sequence[Combination], span_mm: float, x_mm: object) -> Envelope:
    """M_Ed(x) and V_Ed(x) envelopes (max |.| over ``combos``) at the given positions x (mm)."""
    combos = _check_combos(combos)
    L = require_positive("span_mm", span_mm, "mm")
    try:
        x = np.atleast_1d(np.asarray(x_mm, dtype=float)) if not isinstance(x_mm, str) else None
    except (TypeError, ValueError):
        x = None
    if x is None or x.ndim != 1 or x.size == 0:
        raise InputError("x_mm", x_mm, "one or more positions in mm")
    bad = ~np.isfinite(x) | (x < 0.0) | (x > L)
    if bad.any():
        raise InputError("x_mm", float(x[bad][0]), f"positions from 0 to the span {L:g} mm")
    Ms, Vs = [], []
    for c in combos:
        if not c.loads:
            Ms.append(np.zeros_like(x))
            Vs.append(np.zeros_like(x))
            continue
        b = SimpleBeam(L, c.loads)
        Ms.append(np.abs(np.atleast_1d(b.M(x))))
        Vs.append(np.maximum(np.abs(np.atleast_1d(b.V(x, "left"))), np.abs(np.atleast_1d(b.V(x, "right")))))
    M = np.vstack(Ms)
    V = np.vstack(Vs)
    iM = np.argmax(M, axis=0)
    iV = np.argmax(V, axis=0)
    cols = np.arange(x.size)
    return Envelope(x_mm=x, M_Ed=M[iM, cols], V_Ed=V[iV, cols], M_combo=iM, V_combo=iV,
                    names=tuple(c.name for c in combos))


def envelope(combos: Sequence[Combination], span_mm: float, n: int = 201) -> Envelope:
    """Envelopes on ``n`` equally spaced points from 0 to the span (n >= 2)."""
    L = require_positive("span_mm", span_mm, "mm")
    if isinstance(n, bool) or not isinstance(n, (int, np.integer)) or n < 2:
        raise InputError("n", n, "an integer >= 2")
    return envelope_at(combos, L, np.linspace(0.0, L, int(n)))
