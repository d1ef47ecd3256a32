"""Elastic critical moment M_cr for lateral-torsional buckling (EN 1993-1-1:2005, 6.3.2.2(2)).

EN 1993-1-1 asks for M_cr (gross section, real moment diagram, restraints and
load position) but gives no formula. Two routes are provided:

* closed forms: the uniform-moment solution (Timoshenko and Gere, *Theory of
  Elastic Stability*, 1961, section 6.2) and the three-factor formula with
  C_1, C_2 and the load height z_g for k = k_w = 1 (published NCCI for
  EN 1993-1-1, "Elastic critical moment for lateral torsional buckling");
* :func:`M_cr_numerical`: a thin-walled beam finite-element model with
  warping (Vlasov theory) for any moment diagram and load height.

Segment model (numerical): a segment between lateral restraints of length L,
fork supports at both ends (lateral displacement v = 0 and twist phi = 0;
v' and phi' free, i.e. free lateral bending and free warping). Per node the
degrees of freedom are (v, v', phi, phi'), with cubic Hermite shape functions.
The second variation of the total potential is

    1/2 int(E I_z v''^2 + G I_t phi'^2 + E I_w phi''^2) dx
      - lambda [ int(M v'' phi) dx + 1/2 int(q z_g phi^2) dx + 1/2 sum(P z_g phi^2) ]

where M(x) is the in-plane moment diagram, q(x) and P the transverse loads
(gravity positive, N/mm and N) and z_g their height above the shear centre
(mm, positive upwards: a downward load on the top flange is destabilising).
The smallest positive lambda of K_E x = lambda K_G x is the critical load
factor on the given loading; M_cr = lambda max|M|.

Units: N, mm, MPa, N*mm.
"""

from __future__ import annotations

from dataclasses import dataclass
from math import pi
from typing import Any, Callable, Sequence

import numpy as np

from ..core.numeric import max_sampled, sorted_unique
from ..core.clause import clause
from ..core.errors import InputError, require_finite, require_in_range, require_positive
from ..materials.steel import E_MPa, G_MPa

#: default number of beam elements per segment (see tests/test_mcr.py for the
#: convergence: <0.1 % on the uniform-moment closed form, <1 % on C_1)
DEFAULT_N_ELEMENTS = 16

_CIT = "EN 1993-1-1:2005, 6.3.2.2(2)"


# ------------------------------------------------------------------ closed forms
@clause(_CIT, units={"E": "MPa", "G": "MPa", "I_z": "mm4", "I_w": "mm6", "I_t": "mm4", "L": "mm"},
        returns="Nmm", example=dict(I_z=1452e4, I_w=0.705e12, I_t=37.1e4, L=3000.0))
def M_cr_uniform(I_z: float, I_w: float, I_t: float, L: float, E: float = 210000.0,
                 G: float = 81000.0) -> float:
    """Critical moment under uniform moment, fork supports (N*mm); Timoshenko and Gere (1961), 6.2.

    M_cr = (pi^2 E I_z / L^2) sqrt(I_w / I_z + L^2 G I_t / (pi^2 E I_z)).
    """
    M_cr = pi**2 * E * I_z / L**2 * (I_w / I_z + L**2 * G * I_t / (pi**2 * E * I_z))**0.5
    return M_cr


@clause(_CIT, units={"E": "MPa", "G": "MPa", "I_z": "mm4", "I_w": "mm6", "I_t": "mm4", "L": "mm", "z_g": "mm"},
        returns="Nmm", example=dict(C_1=1.127, C_2=0.454, I_z=1452e4, I_w=0.705e12, I_t=37.1e4, L=6000.0,
                                    z_g=226.7))
def M_cr_C1C2(C_1: float, C_2: float, I_z: float, I_w: float, I_t: float, L: float, z_g: float,
              E: float = 210000.0, G: float = 81000.0) -> float:
    """Three-factor formula for doubly symmetric sections, k = k_w = 1 (N*mm); published NCCI (from memory).

    M_cr = C_1 (pi^2 E I_z / L^2) [sqrt(I_w/I_z + L^2 G I_t/(pi^2 E I_z) + (C_2 z_g)^2) - C_2 z_g];
    z_g > 0 for a load applied above the shear centre and acting downwards (destabilising).
    """
    r_LT = (I_w / I_z + L**2 * G * I_t / (pi**2 * E * I_z) + (C_2 * z_g)**2)**0.5
    M_cr = C_1 * pi**2 * E * I_z / L**2 * (r_LT - C_2 * z_g)
    return M_cr


@clause(_CIT, units={}, returns="", example=dict(psi=0.0))
def C_1_linear(psi: float) -> float:
    """C_1 for a linear moment diagram, end-moment ratio -1 <= psi <= 1, fork supports.

    C_1 = 1.88 - 1.40 psi + 0.52 psi^2 <= 2.70: the widely used approximation
    of the published equivalent-uniform-moment factor (ENV 1993-1-1:1992
    Annex F practice; from memory). psi = 1 is uniform moment (C_1 = 1.0).
    """
    C_1 = min(1.88 - 1.40 * psi + 0.52 * psi**2, 2.70)
    return C_1


#: C_1, C_2 for a simply supported (fork) span with k = 1, published NCCI values (from memory;
#: older ENV 1993-1-1 Annex F gave C_1 = 1.132 and 1.365)
C1_C2_PINNED: dict[str, tuple[float, float]] = {"udl": (1.127, 0.454), "point_mid": (1.348, 0.630)}


def M_cr_closed_form(section: Any, L_mm: float, C_1: float = 1.0, C_2: float = 0.0, z_g_mm: float = 0.0,
                     E: float = E_MPa, G: float = G_MPa) -> float:
    """M_cr (N*mm) of ``section`` over a fork-supported length ``L_mm`` by the C_1, C_2, z_g formula."""
    require_positive("L_mm", L_mm, "mm")
    require_in_range("C_1", C_1, 0.5, 5.0)
    require_in_range("C_2", C_2, 0.0, 2.0)
    require_finite("z_g_mm", z_g_mm)
    return M_cr_C1C2(C_1=C_1, C_2=C_2, I_z=section.Iz, I_w=section.Iw, I_t=section.It, L=float(L_mm),
                     z_g=float(z_g_mm), E=E, G=G)


# ------------------------------------------------------------------ numerical
_GP, _GW = np.polynomial.legendre.leggauss(4)
_XI = 0.5 * (_GP + 1.0)           # Gauss points on [0, 1]
_WXI = 0.5 * _GW                  # weights on [0, 1]


def _hermite(xi: np.ndarray, Le: float) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Cubic Hermite N, dN/dx, d2N/dx2 at xi in [0, 1] for dofs (w1, w1', w2, w2'); shape (len(xi), 4)."""
    x2, x3 = xi * xi, xi * xi * xi
    N = np.stack([1 - 3 * x2 + 2 * x3, Le * (xi - 2 * x2 + x3), 3 * x2 - 2 * x3, Le * (x3 - x2)], axis=-1)
    dN = np.stack([(-6 * xi + 6 * x2) / Le, 1 - 4 * xi + 3 * x2, (6 * xi - 6 * x2) / Le, 3 * x2 - 2 * xi],
                  axis=-1)
    d2N = np.stack([(-6 + 12 * xi) / Le**2, (-4 + 6 * xi) / Le, (6 - 12 * xi) / Le**2, (-2 + 6 * xi) / Le],
                   axis=-1)
    return N, dN, d2N


@dataclass(frozen=True)
class McrResult:
    """Result of :func:`mcr_numerical` (N*mm, mm)."""

    alpha_cr: float      #: critical load factor on the given loading
    M_cr: float          #: alpha_cr * M_max (N*mm)
    M_max: float         #: max |M| in the segment (N*mm)
    x_M_max: float       #: position of M_max from the segment start (mm)
    n_elements: int


def _as_moment_fn(M: Any, L: float) -> Callable[[np.ndarray], np.ndarray]:
    if callable(M):
        def fn(x: np.ndarray) -> np.ndarray:
            try:
                out = np.asarray(M(x), dtype=float)
                if out.shape != x.shape:
                    out = np.broadcast_to(out, x.shape).astype(float)
            except (TypeError, ValueError):
                out = np.array([float(M(float(t))) for t in x.ravel()]).reshape(x.shape)
            return out
        return fn
    if isinstance(M, (int, float)) and not isinstance(M, bool):
        val = require_finite("M", M)
        return lambda x: np.full(np.shape(x), val)
    try:
        xs, ms = M
        xs = np.asarray(xs, dtype=float)
        ms = np.asarray(ms, dtype=float)
    except (TypeError, ValueError):
        raise InputError("M", type(M).__name__, "a callable M(x_mm) -> N*mm, a constant moment, or a pair "
                         "(x_mm array, M_Nmm array)") from None
    if xs.ndim != 1 or xs.shape != ms.shape or xs.size < 2 or not np.all(np.isfinite(xs)) \
            or not np.all(np.isfinite(ms)) or np.any(np.diff(xs) <= 0):
        raise InputError("M", "arrays", "two equal-length 1-D arrays (x_mm increasing, M_Nmm), at least 2 points")
    if xs[0] > 1e-6 * L or xs[-1] < L * (1 - 1e-6):
        raise InputError("M", f"x from {xs[0]:g} to {xs[-1]:g} mm", f"x values covering the segment 0 to {L:g} mm")
    return lambda x: np.interp(x, xs, ms)


def _as_load_fn(q: Any) -> Callable[[np.ndarray], np.ndarray] | None:
    if q is None:
        return None
    if callable(q):
        def fn(x: np.ndarray) -> np.ndarray:
            out = np.asarray(q(x), dtype=float)
            return np.broadcast_to(out, x.shape) if out.shape != x.shape else out
        return fn
    val = require_finite("q_N_per_mm", q)
    if val == 0.0:
        return None
    return lambda x: np.full(np.shape(x), val)


def _validate_point_loads(point_loads: Sequence, L: float, z_g: float) -> list[tuple[float, float, float]]:
    out = []
    try:
        items = list(point_loads or ())
    except TypeError:
        raise InputError("point_loads", point_loads, "a sequence of (x_mm, P_N) or (x_mm, P_N, z_g_mm)") from None
    for i, pl in enumerate(items):
        try:
            n = len(pl)
        except TypeError:
            n = 0
        if n not in (2, 3):
            raise InputError(f"point_loads[{i}]", pl, "a tuple (x_mm, P_N) or (x_mm, P_N, z_g_mm)")
        x = require_in_range(f"point_loads[{i}].x_mm", pl[0], 0.0, L, "mm")
        P = require_finite(f"point_loads[{i}].P_N", pl[1])
        zg = require_finite(f"point_loads[{i}].z_g_mm", pl[2]) if n == 3 else z_g
        out.append((x, P, zg))
    return out


def _validate_line_loads(line_loads: Sequence) -> list[tuple[Callable[[np.ndarray], np.ndarray], float]]:
    """``line_loads``: (q, z_g_mm) pairs, q constant or callable q(x_mm) (N/mm) -> [(q function, z_g)]."""
    out = []
    try:
        items = list(line_loads or ())
    except TypeError:
        raise InputError("line_loads", line_loads, "a sequence of (q_N_per_mm, z_g_mm) pairs") from None
    for i, item in enumerate(items):
        try:
            q, z = item
        except (TypeError, ValueError):
            raise InputError(f"line_loads[{i}]", item, "a pair (q_N_per_mm, z_g_mm)") from None
        zg = require_finite(f"line_loads[{i}].z_g_mm", z)
        fn = _as_load_fn(q)
        if fn is not None and zg != 0.0:
            out.append((fn, zg))
    return out


def _largest_generalized_eigenvalue(A: np.ndarray, B: np.ndarray) -> float:
    """Largest mu of A x = mu B x, A symmetric, B symmetric positive definite (the reduced elastic
    stiffness): B = L L^T (Cholesky), then the largest eigenvalue of L^-1 A L^-T, as LAPACK's
    generalized symmetric solver does it. numpy only: ``splicecalc run`` does not import scipy
    (its import is about a third of the command's CPU time); scipy's ``eigh(A, B)`` is the
    reference in tests/test_mcr.py."""
    L = np.linalg.cholesky(B)
    Li = np.linalg.solve(L, np.eye(L.shape[0]))
    C = Li @ A @ Li.T
    return float(np.linalg.eigvalsh(0.5 * (C + C.T))[-1])


def mcr_numerical(section: Any, L_mm: float, M: Any, *, q_N_per_mm: Any = 0.0, point_loads: Sequence = (),
                  z_g_mm: float = 0.0, line_loads: Sequence = (), n_elements: int = DEFAULT_N_ELEMENTS,
                  E: float = E_MPa, G: float = G_MPa) -> McrResult:
    """Elastic critical moment of a fork-supported segment by thin-walled beam finite elements.

    ``section`` needs ``Iz`` (mm4), ``It`` (mm4), ``Iw`` (mm6). ``L_mm`` is the
    segment length between lateral restraints. ``M`` is the in-plane moment
    diagram along the segment (N*mm; x from 0 to L_mm): a callable M(x_mm)
    (vectorised or not), a constant, or a pair of arrays (x_mm, M_Nmm)
    interpolated linearly. ``q_N_per_mm`` (constant or callable q(x_mm)) and
    ``point_loads`` ((x_mm, P_N) or (x_mm, P_N, z_g_mm)) are the transverse
    loads in the segment, gravity positive; they enter only through their
    height ``z_g_mm`` above the shear centre (positive up: top-flange gravity
    loads lower M_cr). ``line_loads`` are further line loads each at its own
    height: (q, z_g_mm) pairs, q constant or callable (a load hung from the
    bottom flange beside one on the top flange); the load-height term is
    1/2 int((q z_g + sum q_i z_i) phi^2) dx. Returns :class:`McrResult`;
    ``alpha_cr`` is ``inf`` when the loading cannot cause lateral-torsional buckling.
    """
    L = require_positive("L_mm", L_mm, "mm")
    if isinstance(n_elements, bool) or not isinstance(n_elements, (int, np.integer)):
        raise InputError("n_elements", n_elements, "an integer from 2 to 400")
    ne = int(require_in_range("n_elements", n_elements, 2, 400))
    zg = require_finite("z_g_mm", z_g_mm)
    EIz = require_positive("E", E, "MPa") * require_positive("section.Iz", getattr(section, "Iz", None), "mm4")
    GIt = require_positive("G", G, "MPa") * require_positive("section.It", getattr(section, "It", None), "mm4")
    EIw = E * require_positive("section.Iw", getattr(section, "Iw", None), "mm6")
    Mfn = _as_moment_fn(M, L)
    qfn = _as_load_fn(q_N_per_mm)
    lines = ([(qfn, zg)] if qfn is not None and zg != 0.0 else []) + _validate_line_loads(line_loads)
    pls = _validate_point_loads(point_loads, L, zg)

    Le = L / ne
    N, dN, d2N = _hermite(_XI, Le)                   # (ng, 4)
    w = _WXI * Le                                    # (ng,)
    # element elastic stiffness (identical elements)
    kb = EIz * np.einsum("g,ga,gb->ab", w, d2N, d2N)
    kt = GIt * np.einsum("g,ga,gb->ab", w, dN, dN) + EIw * np.einsum("g,ga,gb->ab", w, d2N, d2N)
    # moment and load at all Gauss points, shape (ne, ng)
    x0 = np.arange(ne) * Le
    xg = x0[:, None] + _XI[None, :] * Le
    Mg = Mfn(xg)
    if not np.all(np.isfinite(Mg)):
        raise InputError("M", "non-finite values", "a finite moment diagram")
    # max |M|: a fine grid plus the point-load positions (the peaks of a kinked diagram), then a
    # bounded local refinement around the best sample (a sampled peak alone under-reads M_max
    # and so M_cr = alpha_cr M_max, by up to ~1 % for a point load between grid points)
    xs = sorted_unique(np.concatenate((np.linspace(0.0, L, 8 * ne + 1), [p[0] for p in pls])))
    Ms = np.abs(Mfn(xs))
    i_max = int(np.argmax(Ms))
    M_max, x_M_max = float(Ms[i_max]), float(xs[i_max])
    lo, hi = xs[max(i_max - 1, 0)], xs[min(i_max + 1, xs.size - 1)]
    if hi > lo:
        x_ref, M_ref = max_sampled(lambda t: np.abs(Mfn(t)), float(lo), float(hi), xtol=1e-9 * L)
        if M_ref > M_max:
            M_max, x_M_max = float(M_ref), float(x_ref)
    if M_max == 0.0:   # no bending in the segment: no lateral-torsional buckling
        return McrResult(float("inf"), float("inf"), 0.0, 0.0, ne)
    Ce = np.einsum("g,eg,ga,gb->eab", w, Mg, d2N, N)          # v rows, phi columns
    De = None
    if lines:
        qz = np.zeros_like(xg)                              # sum of q z_g at the Gauss points
        for fn, z in lines:
            qg = fn(xg)
            if not np.all(np.isfinite(qg)):
                raise InputError("q_N_per_mm", "non-finite values", "a finite line load")
            qz = qz + z * qg
        De = np.einsum("g,eg,ga,gb->eab", w, qz, N, N)

    ndof = 4 * (ne + 1)
    KE = np.zeros((ndof, ndof))
    KG = np.zeros((ndof, ndof))
    base = 4 * np.arange(ne)
    vd = np.stack([base, base + 1, base + 4, base + 5], axis=1)      # (ne, 4)
    pd = vd + 2
    # elastic: identical blocks scattered with fancy indexing (no overlap within one add.at call)
    np.add.at(KE, (vd[:, :, None], vd[:, None, :]), np.broadcast_to(kb, (ne, 4, 4)))
    np.add.at(KE, (pd[:, :, None], pd[:, None, :]), np.broadcast_to(kt, (ne, 4, 4)))
    np.add.at(KG, (vd[:, :, None], pd[:, None, :]), Ce)
    np.add.at(KG, (pd[:, :, None], vd[:, None, :]), Ce.transpose(0, 2, 1))
    if De is not None:
        np.add.at(KG, (pd[:, :, None], pd[:, None, :]), De)
    for x, P, z in pls:
        if P == 0.0 or z == 0.0:
            continue
        e = min(int(x // Le), ne - 1)
        xi = np.array([(x - e * Le) / Le])
        Np = _hermite(xi, Le)[0][0]
        KG[np.ix_(pd[e], pd[e])] += P * z * np.outer(Np, Np)

    fixed = np.array([0, 2, 4 * ne, 4 * ne + 2])
    keep = np.ones(ndof, dtype=bool)
    keep[fixed] = False
    free = np.flatnonzero(keep)
    KEr = KE[np.ix_(free, free)]
    KGr = KG[np.ix_(free, free)]
    if not np.any(KGr):
        return McrResult(float("inf"), float("inf"), M_max, x_M_max, ne)
    mu = _largest_generalized_eigenvalue(KGr, KEr)
    if not mu > 1e-12:          # alpha_cr = 1/mu > 1e12 (or no positive eigenvalue): no buckling
        return McrResult(float("inf"), float("inf"), M_max, x_M_max, ne)
    alpha = 1.0 / float(mu)
    return McrResult(alpha, alpha * M_max, M_max, x_M_max, ne)


def M_cr_numerical(section: Any, L_mm: float, M: Any, *, q_N_per_mm: Any = 0.0, point_loads: Sequence = (),
                   z_g_mm: float = 0.0, line_loads: Sequence = (), n_elements: int = DEFAULT_N_ELEMENTS,
                   E: float = E_MPa, G: float = G_MPa) -> float:
    """M_cr (N*mm) referred to the largest |M| in the segment; see :func:`mcr_numerical` for the arguments."""
    return mcr_numerical(section, L_mm, M, q_N_per_mm=q_N_per_mm, point_loads=point_loads, z_g_mm=z_g_mm,
                         line_loads=line_loads, n_elements=n_elements, E=E, G=G).M_cr


def C_1_numerical(section: Any, L_mm: float, M: Any, *, n_elements: int = DEFAULT_N_ELEMENTS,
                  E: float = E_MPa, G: float = G_MPa) -> float:
    """Equivalent uniform moment factor C_1 = M_cr(M diagram, loads at the shear centre) / M_cr(uniform).

    Used for k_c = 1/sqrt(C_1) (UK NA, NA.2.18); the load height does not enter C_1.
    """
    res = mcr_numerical(section, L_mm, M, n_elements=n_elements, E=E, G=G)
    return res.M_cr / M_cr_uniform(I_z=section.Iz, I_w=section.Iw, I_t=section.It, L=float(L_mm), E=E, G=G)


__all__ = ["DEFAULT_N_ELEMENTS", "M_cr_uniform", "M_cr_C1C2", "C_1_linear", "C1_C2_PINNED", "M_cr_closed_form",
           "McrResult", "mcr_numerical", "M_cr_numerical", "C_1_numerical"]
