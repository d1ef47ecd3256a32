"""Exact analysis of a simply supported span under full / partial UDLs and point loads.

Closed-form superposition with Macaulay brackets (no mesh). Sign convention:

* x from the left support A (mm), 0 <= x <= L;
* loads downward positive (N, N/mm); reactions R_A, R_B upward positive (N);
* shear force V(x) = R_A minus the load to the left of the section (N): positive
  near A, negative near B;
* bending moment M(x) sagging positive (N*mm);
* deflection w(x) downward positive (mm), slope theta(x) = dw/dx (rad),
  from E I w'' = -M, w(0) = w(L) = 0 (Euler-Bernoulli, no shear deformation).

A load standing exactly on a support goes straight into the reaction and
produces no shear in the span.

Public API: :class:`SimpleBeam`, :class:`Extreme`.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

import numpy as np

from ..actions.loads import UDL, Load, PointLoad, check_loads_on_span
from ..core.numeric import root_bisect, sorted_unique
from ..core.errors import InputError, require_in_range
from ..materials.steel import E_MPa


@dataclass(frozen=True)
class Extreme:
    """An extreme value and where it occurs: ``value`` (N, N*mm or mm, signed) at ``x_mm``."""

    value: float
    x_mm: float

    @property
    def abs(self) -> float:
        return abs(self.value)


def _as_array(x: object, L: float, field: str = "x") -> tuple[np.ndarray, bool]:
    try:
        arr = np.asarray(x, dtype=float)
    except (TypeError, ValueError):
        raise InputError(field, x, "a position or an array of positions in mm") from None
    if arr.size and (not np.all(np.isfinite(arr)) or arr.min() < -1e-9 * L or arr.max() > L * (1 + 1e-9)):
        bad = arr[~np.isfinite(arr) | (arr < -1e-9 * L) | (arr > L * (1 + 1e-9))]
        raise InputError(field, float(bad.flat[0]), f"a position from 0 to the span {L:g} mm")
    return np.clip(arr, 0.0, L), arr.ndim == 0


class SimpleBeam:
    """Simply supported span ``span_mm`` under ``loads`` (UDL / PointLoad, any mix).

    E: modulus of elasticity, MPa (default 210 000, EN 1993-1-1:2005, 3.2.6);
    I: second moment of area, mm4 (needed only for slope and deflection).
    All methods accept a float or an array of x (mm) and return the same shape.
    """

    def __init__(self, span_mm: float, loads: Sequence[Load] | Load, E: float = E_MPa,
                 I: float | None = None) -> None:
        # bounds far outside any beam, so that the closed forms (L^4, 1/EI) stay finite: a span from
        # 1 mm to 1 km, E from 1 MPa to 10^7 MPa, I from 1 mm4 to 10^15 mm4, loads up to 10^6 kN/m, 10^7 kN
        self.L = require_in_range("span_mm", span_mm, 1.0, 1e6, "mm")
        self.loads = check_loads_on_span(loads, self.L)
        for ld in self.loads:
            if isinstance(ld, PointLoad):
                require_in_range(f"load {ld.name!r}.P", ld.P, -1e10, 1e10, "N")
            else:
                require_in_range(f"load {ld.name!r}.w", ld.w, -1e6, 1e6, "N/mm")
        self.E = require_in_range("E", E, 1.0, 1e7, "MPa")
        self.I = None if I is None else require_in_range("I", I, 1.0, 1e15, "mm4")
        L = self.L
        pts = [ld for ld in self.loads if isinstance(ld, PointLoad)]
        udls = [ld for ld in self.loads if isinstance(ld, UDL)]
        self._P = np.array([p.P for p in pts], dtype=float)
        self._a = np.array([p.x for p in pts], dtype=float)
        self._w = np.array([u.w for u in udls], dtype=float)
        ext = [u.extent(L) for u in udls]
        self._ua = np.array([e[0] for e in ext], dtype=float)
        self._ub = np.array([min(e[1], L) for e in ext], dtype=float)
        # statics: moments about A for R_B
        mom = float(np.sum(self._P * self._a)) + float(np.sum(self._w * (self._ub - self._ua) * (self._ua + self._ub) / 2.0))
        self.total_load = float(np.sum(self._P)) + float(np.sum(self._w * (self._ub - self._ua)))
        self.R_B = mom / L
        self.R_A = self.total_load - self.R_B
        # F(L) = double integral of M from 0 to L (for the deflection constant)
        self._FL = float(self._F(np.array([L]))[0])

    # ------------------------------------------------------------ internals
    @staticmethod
    def _mac(x: np.ndarray, a: np.ndarray, n: int) -> np.ndarray:
        """Macaulay bracket <x - a>^n, shape (len(x), len(a))."""
        d = x[:, None] - a[None, :]
        return np.where(d > 0.0, d, 0.0) ** n

    def _M(self, x: np.ndarray) -> np.ndarray:
        m = self.R_A * x
        if self._P.size:
            m = m - self._mac(x, self._a, 1) @ self._P
        if self._w.size:
            m = m - (self._mac(x, self._ua, 2) - self._mac(x, self._ub, 2)) @ self._w / 2.0
        return m

    def _F1(self, x: np.ndarray) -> np.ndarray:
        """Integral of M from 0 to x (N*mm2)."""
        f = self.R_A * x ** 2 / 2.0
        if self._P.size:
            f = f - self._mac(x, self._a, 2) @ self._P / 2.0
        if self._w.size:
            f = f - (self._mac(x, self._ua, 3) - self._mac(x, self._ub, 3)) @ self._w / 6.0
        return f

    def _F(self, x: np.ndarray) -> np.ndarray:
        """Double integral of M from 0 to x (N*mm3)."""
        f = self.R_A * x ** 3 / 6.0
        if self._P.size:
            f = f - self._mac(x, self._a, 3) @ self._P / 6.0
        if self._w.size:
            f = f - (self._mac(x, self._ua, 4) - self._mac(x, self._ub, 4)) @ self._w / 24.0
        return f

    def _EI(self) -> float:
        if self.I is None:
            raise InputError("I", None, "a second moment of area in mm4 (needed for slope and deflection)")
        return self.E * self.I

    @staticmethod
    def _out(arr: np.ndarray, scalar: bool) -> float | np.ndarray:
        return float(arr.reshape(-1)[0]) if scalar else arr

    # ------------------------------------------------------------ responses
    def V(self, x: object, side: str = "right") -> float | np.ndarray:
        """Shear force (N) just to the ``side`` ("right" or "left") of section x.

        At a point load the shear jumps; ``side`` picks the value. Loads on
        the supports never enter the span shear.
        """
        if side not in ("right", "left"):
            raise InputError("side", side, "'right' or 'left'")
        xa, scalar = _as_array(x, self.L)
        x1 = np.atleast_1d(xa)
        v = np.full(x1.shape, self.R_A)
        if self._P.size:
            if side == "right":
                h = (x1[:, None] >= self._a[None, :]) & (self._a[None, :] < self.L)
                h = h & ~((x1[:, None] >= self.L) & (self._a[None, :] >= self.L))
            else:
                h = (x1[:, None] > self._a[None, :]) | (self._a[None, :] <= 0.0)
            v = v - h.astype(float) @ self._P
        if self._w.size:
            c = np.clip(x1[:, None], self._ua[None, :], self._ub[None, :]) - self._ua[None, :]
            v = v - c @ self._w
        return self._out(v, scalar)

    def M(self, x: object) -> float | np.ndarray:
        """Bending moment (N*mm), sagging positive."""
        xa, scalar = _as_array(x, self.L)
        return self._out(self._M(np.atleast_1d(xa)), scalar)

    def theta(self, x: object) -> float | np.ndarray:
        """Slope dw/dx (rad), w downward positive: positive where the beam descends with x."""
        EI = self._EI()
        xa, scalar = _as_array(x, self.L)
        x1 = np.atleast_1d(xa)
        return self._out((-self._F1(x1) + self._FL / self.L) / EI, scalar)

    slope = theta

    def w(self, x: object) -> float | np.ndarray:
        """Deflection (mm), downward positive."""
        EI = self._EI()
        xa, scalar = _as_array(x, self.L)
        x1 = np.atleast_1d(xa)
        return self._out((-self._F(x1) + x1 * self._FL / self.L) / EI, scalar)

    deflection = w

    # ------------------------------------------------------------- maxima
    def breakpoints(self) -> np.ndarray:
        """Sorted unique positions where the load pattern changes (mm), incl. 0 and L."""
        pts = np.concatenate(([0.0, self.L], self._a, self._ua, self._ub))
        return sorted_unique(np.clip(pts, 0.0, self.L))

    def _shear_zeros(self) -> np.ndarray:
        """Positions where V crosses zero inside a segment (V linear there) or jumps through zero."""
        bp = self.breakpoints()
        vr = np.atleast_1d(self.V(bp[:-1], side="right"))
        vl = np.atleast_1d(self.V(bp[1:], side="left"))
        out = []
        for x0, x1, v0, v1 in zip(bp[:-1], bp[1:], vr, vl):
            if v0 == 0.0:
                out.append(x0)
            if (v0 > 0.0 > v1) or (v0 < 0.0 < v1):
                out.append(x0 + (x1 - x0) * v0 / (v0 - v1))
        return np.array(out, dtype=float)

    def M_max(self) -> Extreme:
        """Largest |M| (signed value, N*mm) and its position: exact (ends, load positions, V = 0)."""
        cand = np.concatenate((self.breakpoints(), self._shear_zeros()))
        m = np.atleast_1d(self.M(cand))
        i = int(np.argmax(np.abs(m)))
        return Extreme(float(m[i]), float(cand[i]))

    def V_max(self) -> Extreme:
        """Largest |V| in the span (signed, N) and its position (V is piecewise linear)."""
        bp = self.breakpoints()
        vr = np.atleast_1d(self.V(bp, side="right"))
        vl = np.atleast_1d(self.V(bp, side="left"))
        # at A only the right-hand value and at B only the left-hand value are in the span
        vr[-1] = vl[-1]
        vl[0] = vr[0]
        both = np.concatenate((vr, vl))
        xs = np.concatenate((bp, bp))
        i = int(np.argmax(np.abs(both)))
        return Extreme(float(both[i]), float(xs[i]))

    def w_max(self) -> Extreme:
        """Largest |w| (mm, signed) and its position: root of theta = 0.

        The slope is a piecewise cubic; each grid interval with a sign change of
        theta is solved by bisection to 1e-12 L (core.numeric.root_bisect).
        """
        self._EI()
        bp = self.breakpoints()
        # refine so that a cubic segment cannot hide two roots between samples
        grid = sorted_unique(np.concatenate([np.linspace(x0, x1, 5) for x0, x1 in zip(bp[:-1], bp[1:])]))
        th = np.atleast_1d(self.theta(grid))
        cand = [0.0, self.L]

        def f(xx: float) -> float:
            return float(self.theta(xx))

        for x0, x1, t0, t1 in zip(grid[:-1], grid[1:], th[:-1], th[1:]):
            if t0 == 0.0:
                cand.append(float(x0))
            elif t0 * t1 < 0.0:
                f0, f1 = f(float(x0)), f(float(x1))   # same evaluation path as inside the root search
                if f0 * f1 < 0.0:
                    cand.append(root_bisect(f, float(x0), float(x1), xtol=1e-12 * self.L))
                else:  # sign change at round-off level: keep the sample nearer to zero
                    cand.append(float(x0) if abs(f0) <= abs(f1) else float(x1))
        cand_arr = np.array(cand)
        wv = np.atleast_1d(self.w(cand_arr))
        i = int(np.argmax(np.abs(wv)))
        return Extreme(float(wv[i]), float(cand_arr[i]))

    def __repr__(self) -> str:
        return f"SimpleBeam(span_mm={self.L:g}, loads={len(self.loads)}, R_A={self.R_A:.6g} N, R_B={self.R_B:.6g} N)"
