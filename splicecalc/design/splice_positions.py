"""Where the beam is cut: splice positions on a simply supported span (plain-float path).

Inputs are the design envelopes ``|M|(x)`` and ``|V|(x)`` (governing ULS
combination at each x), the resistances ``M_c,Rd`` and ``V_c,Rd`` used to
normalise them, and the places splices must keep clear of (supports, point
loads, restraints) by ``spec.clearance``.

Positions come from (in this order of precedence):

* ``spec.positions`` - explicit, checked as given (failing CheckRecords for a
  splice inside a clearance or a piece over a limit);
* ``spec.pieces`` - that many pieces, positions optimised; without an access
  limit no piece may exceed ``PIECES_SLACK`` (1.25) x L / n, so "3 pieces" keeps
  pieces of about equal handling length;
* ``spec.max_piece_length`` / ``spec.max_piece_mass`` - the fewest pieces that
  meet the access limits, positions optimised.

Optimisation: minimise the worst splice demand
``D(x) = |M(x)|/M_c,Rd + |V(x)|/V_c,Rd`` over a grid of candidate cuts
(dynamic programming, minimax with the sum as a tie-break), subject to
``L_min <= piece length <= L_max`` and the clearances. The piece mass is
``m' L`` plus what the caller counts per splice end (``splice_mass_kg``; the calc passes 0:
pieces are lifted bare and the kit is fitted in place, :data:`MASS_CONVENTION`). ``L_min`` is the splice zone: no piece may be shorter than one cover
plate length plus twice the clearance zone kept by the splice itself.
The result is compared with equal-length cutting.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Callable, Sequence

import numpy as np

from ..core.errors import InputError, require_in_range, require_non_negative, require_positive
from ..core.numeric import sorted_unique
from ..core.record import Calc, CheckRecord

#: not a code clause: these records check the limits the engineer set in the job file
_CL = "Job file (access limits and clearances)"
#: with ``pieces = n`` and no access limit, no piece may be longer than this factor x L / n
PIECES_SLACK = 1.25


@dataclass(frozen=True)
class SplicePoint:
    """One splice: position (mm), forces from the governing combination (N, N*mm)."""

    x: float
    M_Ed: float
    V_Ed: float
    N_Ed: float
    demand: float
    combination: str = ""


@dataclass(frozen=True)
class SplicePositions:
    """Chosen positions with their forces, piece lengths/masses and the equal-length comparison."""

    splices: tuple[SplicePoint, ...]
    pieces_mm: tuple[float, ...]
    piece_mass_kg: tuple[float, ...]
    worst_demand: float
    equal_positions: tuple[float, ...]
    equal_worst_demand: float
    equal_feasible: bool
    method: str
    records: tuple[CheckRecord, ...] = field(default_factory=tuple)
    piece_masses: tuple[PieceMass, ...] = ()
    mass_margin: float = 0.0

    @property
    def positions(self) -> tuple[float, ...]:
        return tuple(s.x for s in self.splices)

    def to_dict(self) -> dict:
        """JSON-ready summary; keys carry units."""
        return {
            "method": self.method,
            "splices": [{"x_m": round(s.x / 1000, 4), "M_Ed_kNm": s.M_Ed / 1e6, "V_Ed_kN": s.V_Ed / 1e3,
                         "N_Ed_kN": s.N_Ed / 1e3, "demand": round(s.demand, 4), "combination": s.combination}
                        for s in self.splices],
            "pieces_m": [round(p / 1000, 4) for p in self.pieces_mm],
            "piece_mass_kg": [round(m, 1) for m in self.piece_mass_kg],
            "piece_mass_build_up": [p.to_dict() for p in self.piece_masses],
            "mass_margin": self.mass_margin,
            "worst_demand": round(self.worst_demand, 4),
            "equal_length": {"x_m": [round(x / 1000, 4) for x in self.equal_positions],
                             "worst_demand": round(self.equal_worst_demand, 4),
                             "clear_of_supports_loads_restraints": self.equal_feasible},
            "checks": [r.to_dict() for r in self.records],
        }


@dataclass(frozen=True)
class PieceMass:
    """Mass build-up of one piece as lifted (kg): the beam steel, the splice kit (cover plates and
    bolt assemblies) at each of its splice ends, the end connection on an end piece, and the margin."""

    index: int
    length_mm: float
    steel_kg: float
    plates_kg: float
    bolts_kg: float
    end_kg: float
    margin_kg: float

    @property
    def total_kg(self) -> float:
        return self.steel_kg + self.plates_kg + self.bolts_kg + self.end_kg + self.margin_kg

    def to_dict(self) -> dict:
        return {"piece": self.index, "length_m": round(self.length_mm / 1000, 4),
                "steel_kg": round(self.steel_kg, 2), "splice_plates_kg": round(self.plates_kg, 2),
                "splice_bolts_kg": round(self.bolts_kg, 2), "end_connection_kg": round(self.end_kg, 2),
                "margin_kg": round(self.margin_kg, 2), "total_kg": round(self.total_kg, 2)}


#: how a piece's mass is counted (stated on the calc sheet)
MASS_CONVENTION = ("pieces are carried in and lifted bare: the splice kits (cover plates, bolt assemblies) and the "
                   "end connections' bolts are loose items, fitted in place after the lift. So one convention for "
                   "both access checks: piece mass = (beam steel m' L + on an end piece its welded end plate) x "
                   "(1 + mass margin); piece length = joint line to joint line (support line at an end), which the "
                   "bare steel does not exceed (it stops half the gap short of each joint line) and which no cover "
                   "plate adds to")


def _piece_masses(xs: Sequence[float], L: float, m_per_mm: float, kit: tuple[float, float],
                  end_mass: tuple[float, float] = (0.0, 0.0), margin: float = 0.0) -> list[PieceMass]:
    """Mass build-up of every piece: kit = (plates kg, bolts kg) of one splice; end_mass at x = 0 and L."""
    cuts = [0.0, *xs, L]
    n = len(cuts) - 1
    out = []
    for i in range(n):
        ends = (1 if i > 0 else 0) + (1 if i < n - 1 else 0)
        steel = (cuts[i + 1] - cuts[i]) * m_per_mm
        e = (end_mass[0] if i == 0 else 0.0) + (end_mass[1] if i == n - 1 else 0.0)
        base = steel + ends * (kit[0] + kit[1]) + e
        out.append(PieceMass(index=i + 1, length_mm=cuts[i + 1] - cuts[i], steel_kg=steel, plates_kg=ends * kit[0],
                             bolts_kg=ends * kit[1], end_kg=e, margin_kg=margin * base))
    return out


def envelope(beams: Sequence, names: Sequence[str] | None = None,
             N_Ed: Sequence[float] | float = 0.0) -> tuple[Callable, Callable, Callable]:
    """Envelope callables from per-combination beams (objects with ``M(x)`` and ``V(x)``).

    Returns ``(M_abs(x), V_abs(x), at(x) -> (M, V, N, name))``: the envelopes of
    |M| and |V| over the combinations, and the splice design forces at x: M and N
    of the combination that governs |M| (ties: the larger |V|) with V the envelope
    |V| at x (the largest over the combinations, which may come from another
    combination, e.g. a partial imposed load; designing for both maxima together is
    conservative and matches the demand |M|/M_c,Rd + |V|/V_c,Rd used to place the splice).
    """
    beams = list(beams)
    if not beams:
        raise InputError("beams", beams, "at least one analysed combination")
    names = list(names) if names is not None else [f"combination {i + 1}" for i in range(len(beams))]
    Ns = [float(N_Ed)] * len(beams) if isinstance(N_Ed, (int, float)) else [float(v) for v in N_Ed]

    def M_abs(x):
        return np.max(np.abs(np.vstack([np.atleast_1d(b.M(x)) for b in beams])), axis=0)

    def V_abs(x):
        return np.max(np.abs(np.vstack([np.atleast_1d(np.maximum(np.abs(b.V(x, "left")), np.abs(b.V(x, "right"))))
                                        for b in beams])), axis=0)

    def at(x: float):
        best = None
        v_best = None
        for b, nm, n in zip(beams, names, Ns):
            M = float(b.M(x))
            V = max(abs(float(b.V(x, "left"))), abs(float(b.V(x, "right"))))
            key = (abs(M), V)
            if best is None or key > best[0]:
                best = (key, (M, V, n, nm))
            if v_best is None or V > v_best[0]:
                v_best = (V, nm)
        M, V, n, nm = best[1]
        if v_best[0] > V:
            return M, v_best[0], n, f"{nm} (M), {v_best[1]} (V)"
        return M, V, n, nm

    return M_abs, V_abs, at


#: variable actions treated as free (patterned over partial spans), EN 1991-1-1:2002, 6.2.1(1)
FREE_ACTIONS: tuple[str, ...] = ("imposed",)
PATTERN_NOTE = ("imposed load patterned as a free action over partial spans for the splice shear "
                "(EN 1991-1-1 6.2.1(1)): at each x the imposed load on the side that increases |V|; the moment "
                "envelope of a simple span is the fully loaded one (its influence line has one sign)")


def _v_parts(loads, L: float, x: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Shear at x (sign of R_A) from the parts of ``loads`` right of x (>= 0) and left of x (<= 0): the
    influence line of V(x) is (L - xi)/L for xi > x and -xi/L for xi < x."""
    pos = np.zeros_like(x)
    neg = np.zeros_like(x)
    for ld in loads:
        if hasattr(ld, "P"):
            xi = float(ld.x)
            pos += np.where(xi >= x, ld.P * (L - xi) / L, 0.0)
            neg += np.where(xi <= x, -ld.P * xi / L, 0.0)
        else:
            a, b = ld.extent(L)
            b = min(b, L)
            s = np.clip(x, a, b)                  # load right of x: [s, b]; left of x: [a, s]
            pos += ld.w * ((L - s) ** 2 - (L - b) ** 2) / (2 * L)
            neg -= ld.w * (s ** 2 - a ** 2) / (2 * L)
    return pos, neg


def patterned_envelope(combinations: Sequence, span_mm: float, free_actions: Sequence[str] = FREE_ACTIONS,
                       N_Ed: float = 0.0) -> tuple[Callable, Callable, Callable]:
    """Envelopes ``(M_abs, V_abs, at)`` like :func:`envelope`, with the loads of ``free_actions``
    (imposed) of each ULS combination patterned over partial spans (EN 1991-1-1 6.2.1(1)).

    ``combinations``: :class:`~splicecalc.actions.Combination` objects (factored ``loads``). For the
    shear at x each free load counts only over the part of its extent on the side of x that adds to
    |V| (both sides tried); permanent and other variable loads stay where they are. The moment at x is
    the full-load moment (for downward loads on a simple span every part of a load adds to M).
    """
    from ..analysis import SimpleBeam
    combos = list(combinations)
    if not combos:
        raise InputError("combinations", combos, "at least one ULS combination")
    L = require_positive("span_mm", span_mm, "mm")
    parts = []
    for c in combos:
        full = SimpleBeam(L, c.loads)
        free = [ld for ld in c.loads if getattr(ld, "action", "") in free_actions]
        fixed = [ld for ld in c.loads if getattr(ld, "action", "") not in free_actions]
        parts.append((c, full, fixed, free))

    def V_fixed(fixed, x):
        if not fixed:
            return np.zeros_like(x), np.zeros_like(x)
        pos, neg = _v_parts(fixed, L, x)
        return pos + neg, pos + neg

    def V_pat(i, x):
        c, full, fixed, free = parts[i]
        x = np.atleast_1d(np.asarray(x, dtype=float))
        vf, _ = V_fixed(fixed, x)
        if not free:
            return np.maximum(np.abs(full.V(x, "left")), np.abs(full.V(x, "right")))
        pos, neg = _v_parts(free, L, x)
        return np.maximum(np.abs(vf + pos), np.abs(vf + neg))

    def M_abs(x):
        x = np.atleast_1d(np.asarray(x, dtype=float))
        return np.max(np.abs(np.vstack([np.atleast_1d(full.M(x)) for _, full, _, _ in parts])), axis=0)

    def V_abs(x):
        x = np.atleast_1d(np.asarray(x, dtype=float))
        return np.max(np.vstack([V_pat(i, x) for i in range(len(parts))]), axis=0)

    def at(x: float):
        best = None
        v_best = None
        for i, (c, full, _, free) in enumerate(parts):
            M = float(full.M(x))
            V = float(V_pat(i, np.array([x]))[0])
            if best is None or (abs(M), V) > best[0]:
                best = ((abs(M), V), (M, V, c.name, bool(free)))
            if v_best is None or V > v_best[0]:
                v_best = (V, c.name, bool(free))
        M, V, nm, _ = best[1]
        Vm, vnm, vfree = v_best
        pat = ", imposed patterned" if vfree else ""
        if vnm == nm:
            return M, Vm, float(N_Ed), nm + (" (V: imposed patterned)" if vfree else "")
        return M, max(Vm, V), float(N_Ed), f"{nm} (M), {vnm} (V{pat})"

    return M_abs, V_abs, at


def choose_splice_positions(span_mm: float, spec, *, M_abs: Callable, V_abs: Callable, M_c_Rd: float,
                            V_c_Rd: float, mass_per_m: float, avoid: Sequence[float] = (),
                            at: Callable | None = None, splice_mass_kg: float = 0.0,
                            splice_zone_mm: float = 600.0, grid_mm: float = 25.0,
                            max_pieces: int = 20, plate_half_length_mm: float = 0.0,
                            splice_bolts_kg: float = 0.0, end_mass_kg: tuple[float, float] = (0.0, 0.0),
                            mass_margin: float = 0.0) -> SplicePositions:
    """Choose splice positions on a span (see the module docstring).

    span_mm: span (mm); M_abs, V_abs: envelope callables of x (mm) -> N*mm, N
    (vectorised); M_c_Rd (N*mm), V_c_Rd (N) normalise the demand; mass_per_m:
    beam mass (kg/m); avoid: x (mm) of point loads and restraints (supports at
    0 and L are always added); at(x) -> (M, V, N, name) gives the governing
    combination's forces at a splice (default: the envelopes with N = 0);
    splice_mass_kg: the whole kit of one splice (cover plates + bolt assemblies), of which
    ``splice_bolts_kg`` are the bolt assemblies (for the build-up); end_mass_kg: the end
    connections carried by the first and last pieces; mass_margin: fraction added to every
    piece mass (e.g. 0.03 for rolling tolerance, 0 to 0.2); splice_zone_mm: shortest
    piece allowed (about one cover-plate length); plate_half_length_mm: half the
    longest cover plate, so that the clearance used is at least that much and no
    cover plate reaches over a point load, a restraint or a support.
    """
    L = require_positive("span_mm", span_mm, "mm")
    require_positive("M_c_Rd", M_c_Rd, "Nmm")
    require_positive("V_c_Rd", V_c_Rd, "N")
    m_mm = require_positive("mass_per_m", mass_per_m, "kg/m") / 1000.0
    m_sp = require_non_negative("splice_mass_kg", splice_mass_kg, "kg")
    m_b = require_non_negative("splice_bolts_kg", splice_bolts_kg, "kg")
    if m_b > m_sp:
        raise InputError("splice_bolts_kg", m_b, f"at most the whole kit splice_mass_kg = {m_sp:g} kg")
    kit = (m_sp - m_b, m_b)
    ends_kg = tuple(require_non_negative("end_mass_kg", v, "kg") for v in end_mass_kg)
    if len(ends_kg) != 2:
        raise InputError("end_mass_kg", end_mass_kg, "two masses (kg): the end connections at x = 0 and x = L")
    margin = require_in_range("mass_margin", mass_margin, 0.0, 0.2)
    zone = require_positive("splice_zone_mm", splice_zone_mm, "mm")
    clr = max(float(spec.clearance), require_non_negative("plate_half_length_mm", plate_half_length_mm, "mm"))
    pts = sorted({0.0, L, *[require_non_negative("avoid", a, "mm") for a in avoid]})
    if any(a > L for a in pts):
        raise InputError("avoid", list(avoid), f"positions within the span 0 .. {L:g} mm")
    at = at or (lambda x: (float(M_abs(np.array([x]))[0]), float(V_abs(np.array([x]))[0]), 0.0, "envelope"))

    def demand(x):
        x = np.atleast_1d(np.asarray(x, dtype=float))
        return np.asarray(M_abs(x), float) / M_c_Rd + np.asarray(V_abs(x), float) / V_c_Rd

    def clear_dist(x: float) -> float:
        return min(abs(x - p) for p in pts)

    L_max_len = spec.max_piece_length if spec.max_piece_length else math.inf
    if spec.pieces and not spec.max_piece_length and not spec.max_piece_mass and spec.pieces > 1:
        L_max_len = PIECES_SLACK * L / spec.pieces     # "n pieces" = pieces of about equal handling length

    def finish(xs: list[float], method: str, records: list[CheckRecord]) -> SplicePositions:
        xs = [float(x) for x in xs]
        cuts = [0.0, *xs, L]
        lengths = tuple(b - a for a, b in zip(cuts, cuts[1:]))
        build = tuple(_piece_masses(xs, L, m_mm, kit, ends_kg, margin))
        masses = tuple(p.total_kg for p in build)
        sps = []
        for x in xs:
            M, V, N, nm = at(x)
            sps.append(SplicePoint(x=x, M_Ed=M, V_Ed=V, N_Ed=N, demand=float(demand(x)[0]), combination=nm))
        n = len(xs) + 1
        eq = [L * i / n for i in range(1, n)]
        eq_d = float(np.max(demand(eq))) if eq else 0.0
        eq_ok = all(clear_dist(x) >= clr for x in eq)
        recs = list(records) + _records(xs, lengths, build, clr, clear_dist, spec, zone, margin)
        return SplicePositions(splices=tuple(sps), pieces_mm=lengths, piece_mass_kg=masses,
                               worst_demand=max((s.demand for s in sps), default=0.0), equal_positions=tuple(eq),
                               equal_worst_demand=eq_d, equal_feasible=eq_ok, method=method, records=tuple(recs),
                               piece_masses=build, mass_margin=margin)

    # ---------------------------------------------------------------- explicit
    if spec.positions:
        xs = list(spec.positions)
        if xs[-1] >= L:
            raise InputError("splices.positions", [f"{x / 1000:g} m" for x in xs],
                             f"positions inside the span (0 < x < {L / 1000:g} m)")
        return finish(xs, "explicit positions (checked as given)", [])

    # ----------------------------------------------------- number of pieces
    if spec.pieces:
        n_list = [spec.pieces]
    else:
        n_lo = 1
        if spec.max_piece_length:
            n_lo = max(n_lo, math.ceil(L / spec.max_piece_length - 1e-9))
        if spec.max_piece_mass:
            n_lo = max(n_lo, math.ceil(L * m_mm / spec.max_piece_mass - 1e-9))
        n_list = list(range(n_lo, max_pieces + 1))
    for n in n_list:
        if n == 1:
            ok_len = L <= L_max_len
            ok_mass = (not spec.max_piece_mass) or (L * m_mm + sum(ends_kg)) * (1 + margin) <= spec.max_piece_mass
            if ok_len and ok_mass:
                return finish([], "one piece (no splice needed)", [])
            continue
        xs = _optimise(L, n, demand, pts, clr, zone, L_max_len, spec.max_piece_mass, m_mm, m_sp, grid_mm,
                       ends_kg, margin)
        if xs is not None:
            how = f"{n} pieces, positions minimising the worst splice demand |M|/M_c,Rd + |V|/V_c,Rd"
            return finish(xs, how, [])
    lim = []
    if spec.max_piece_length:
        lim.append(f"max_piece_length = {spec.max_piece_length / 1000:g} m")
    if spec.max_piece_mass:
        lim.append(f"max_piece_mass = {spec.max_piece_mass:g} kg")
    what = (f"pieces = {spec.pieces}" if spec.pieces else " and ".join(lim))
    raise InputError("splices", what,
                     f"limits that can be met on a {L / 1000:g} m span with splices at least {clr:g} mm clear of "
                     f"supports, point loads and restraints at {[round(p) for p in pts]} mm and pieces no shorter "
                     f"than the splice zone {zone:g} mm (beam {m_mm * 1000:.1f} kg/m, splice kit {m_sp:.0f} kg with its "
                     f"bolts, end connections {ends_kg[0]:.0f} + {ends_kg[1]:.0f} kg, margin {margin * 100:g} %)",
                     "Relax the piece limits, reduce the clearance, or give explicit positions.")


def _optimise(L, n, demand, pts, clr, zone, L_max_len, m_max, m_mm, m_sp, grid, ends_kg=(0.0, 0.0), margin=0.0):
    """Minimax DP over grid cuts; returns positions or None when infeasible."""
    G = max(int(math.ceil(L / grid)), 4 * n)
    xg = np.linspace(0.0, L, G + 1)
    ok = np.ones_like(xg, dtype=bool)
    for p in pts:
        ok &= np.abs(xg - p) >= clr - 1e-9
    # refine: add the exact clearance boundaries as candidates
    extra = [p + s * clr for p in pts for s in (-1.0, 1.0) if 0.0 < p + s * clr < L]
    xc = sorted_unique(np.concatenate([xg[ok], np.array(extra, dtype=float)]))
    xc = xc[(xc > 0.0) & (xc < L)]
    if xc.size == 0:
        return None
    dist = np.min(np.abs(xc[:, None] - np.array(pts)[None, :]), axis=1)
    xc = xc[dist >= clr - 1e-6]
    if xc.size < n - 1:
        return None
    d = demand(xc)
    K = xc.size

    def lmax(ends: int, end_kg: float = 0.0) -> float:
        lm = L_max_len
        if m_max:
            lm = min(lm, (m_max / (1 + margin) - ends * m_sp - end_kg) / m_mm)
        return lm

    # first piece: 0 -> xc[j]
    INF = math.inf
    lm1 = lmax(1, ends_kg[0])
    val = np.where((xc >= zone) & (xc <= lm1 + 1e-9), d, INF)
    tot = np.where(np.isfinite(val), d, INF)
    back = []
    lm2 = lmax(2)
    eps = 1e-6
    for _ in range(n - 2):
        span = xc[None, :] - xc[:, None]            # i -> j
        feas = (span >= zone) & (span <= lm2 + 1e-9) & np.isfinite(val)[:, None]
        cand = np.where(feas, np.maximum(val[:, None], d[None, :]) + eps * (tot[:, None] + d[None, :]), INF)
        i_best = np.argmin(cand, axis=0)
        best = cand[i_best, np.arange(K)]
        new_val = np.where(np.isfinite(best), np.maximum(val[i_best], d), INF)
        new_tot = np.where(np.isfinite(best), tot[i_best] + d, INF)
        back.append(i_best)
        val, tot = new_val, new_tot
    lm_last = lmax(1, ends_kg[1])
    last_len = L - xc
    feas = (last_len >= zone) & (last_len <= lm_last + 1e-9) & np.isfinite(val)
    if not feas.any():
        return None
    score = np.where(feas, val + eps * tot, INF)
    j = int(np.argmin(score))
    xs = [float(xc[j])]
    for b in reversed(back):
        j = int(b[j])
        xs.append(float(xc[j]))
    return sorted(xs)


def _records(xs, lengths, build, clr, clear_dist, spec, zone, margin) -> list[CheckRecord]:
    recs = []
    calc = Calc()
    for k, x in enumerate(xs):
        recs.append(calc.record(id=f"splice{k + 1}_clearance", title=f"Splice {k + 1} joint line clear of supports, loads, restraints",
                                clause=_CL, demand=clr, resistance=clear_dist(x), unit="mm", location_mm=x,
                                note="distance from the joint line (the splice's centreline) to the nearest support, "
                                     "point load or restraint >= clearance (the job's clearance, and not less than "
                                     "half the longest cover plate)", tags=("clearance",)))
    for k, (Lp, pm) in enumerate(zip(lengths, build)):
        if spec.max_piece_length:
            recs.append(calc.record(id=f"piece{k + 1}_length", title=f"Piece {k + 1} length (access limit)",
                                    clause=_CL, demand=Lp, resistance=spec.max_piece_length, unit="mm",
                                    note="joint line to joint line (support line at an end); lifted bare, the "
                                         "cover plates fitted after the lift", tags=("piece", "length")))
        if spec.max_piece_mass:
            calc.keep("m_steel", pm.steel_kg, "kg")
            calc.keep("m_splice_plates", pm.plates_kg, "kg")
            calc.keep("m_splice_bolts", pm.bolts_kg, "kg")
            calc.keep("m_end_connection", pm.end_kg, "kg")
            calc.keep("m_margin", pm.margin_kg, "kg")
            recs.append(calc.record(id=f"piece{k + 1}_mass", title=f"Piece {k + 1} mass as lifted (access limit)",
                                    clause=_CL, demand=pm.total_kg, resistance=spec.max_piece_mass, unit="kg",
                                    note=(f"steel {pm.steel_kg:.1f} + "
                                          + (f"splice plates {pm.plates_kg:.1f} + bolt assemblies {pm.bolts_kg:.1f} + "
                                             if pm.plates_kg or pm.bolts_kg else "")
                                          + f"end plate {pm.end_kg:.1f} + margin {margin * 100:g} % "
                                          f"{pm.margin_kg:.1f} = {pm.total_kg:.1f} kg; " + MASS_CONVENTION),
                                    tags=("piece", "mass")))
        if len(lengths) > 1:
            recs.append(calc.record(id=f"piece{k + 1}_min_length", title=f"Piece {k + 1} longer than the splice zone",
                                    clause=_CL, demand=zone, resistance=Lp, unit="mm"))
    return recs


__all__ = ["SplicePoint", "SplicePositions", "PieceMass", "patterned_envelope", "FREE_ACTIONS", "PATTERN_NOTE", "MASS_CONVENTION", "choose_splice_positions", "envelope"]


#: width of a timber joist hanger, the usual fitting at a restraint (mm; common practice, from memory)
HANGER_WIDTH_MM = 100.0


def plate_end_clearances(result) -> list[tuple[int, float, float, float]]:
    """``(k, joint line to the nearest support / load / restraint, half the longest cover plate, plate end
    to it)`` in mm for each splice k whose clearance was checked: the clearance checks are measured from the
    joint line; the plate ends are half the longest cover plate nearer."""
    ends = []
    for k, sp in enumerate(getattr(result, "splices", ()), start=1):
        rec = next((r for r in result.position_records if r.id == f"splice{k}_clearance" and r.checked), None)
        geo = getattr(getattr(sp, "design", None), "geometry", None)
        if rec is None or geo is None:
            continue
        half = 0.5 * max(float(geo.L_fp), float(geo.L_wp))
        ends.append((k, float(rec.resistance), half, float(rec.resistance) - half))
    return ends
