"""Combinations of actions, EN 1990:2002 section 6 with Annex A1 (buildings), UK NA defaults.

ULS STR (EN 1990:2002, 6.4.3.2, Table A1.2(B)), chosen by ``na.combination``:

* ``"6.10"``:   gamma_G G + gamma_Q Q_1 + gamma_Q psi_0,i Q_i
* ``"6.10ab"``: both 6.10a  gamma_G G + gamma_Q psi_0,i Q_i (all variable actions) and
  6.10b  xi gamma_G G + gamma_Q Q_1 + gamma_Q psi_0,i Q_i; the less favourable governs,
  which :func:`governing` finds by evaluating every combination.

Every variable action is taken as leading in turn. Imposed loads of several categories are by
default ONE variable action (``imposed="single"``, EN 1991-1-1:2002, 3.3.1(2)P; common practice
on one member): when it leads every part takes gamma_Q, when it accompanies each part takes
its own category's psi (psi_0, psi_1 or psi_2). ``imposed="separate"`` makes each category
(each action name) its own action, leading in turn. Imposed loads given an explicit ``group``
stay separate actions in both modes, and so does the imposed roof load of category H
(EN 1991-1-1 3.3.2). All loads on a simply
supported span act downward, so permanent actions are unfavourable
(gamma_G,sup) and no variable action is favourable (gamma_Q = 0 would simply
omit it; the leading-in-turn set includes the case without it only when it is
the sole variable action, which the permanent-only combination covers).

SLS (EN 1990:2002, 6.5.3): characteristic (6.14b) G + Q_1 + psi_0,i Q_i,
frequent (6.15b) G + psi_1,1 Q_1 + psi_2,i Q_i, quasi-permanent (6.16b)
G + psi_2,i Q_i, and "variable characteristic" Q_1 + psi_0,i Q_i (the
variable part of 6.14b, for deflection limits under variable actions).

Public API: :class:`Combination`, :class:`VariableAction`, :func:`variable_actions`,
:func:`uls_combinations`, :func:`sls_characteristic`, :func:`sls_frequent`,
:func:`sls_quasi_permanent`, :func:`sls_variable_characteristic`,
:func:`sls_combinations`, :func:`governing`, :func:`render_line_load`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Callable, Sequence

from ..core.errors import InputError, require_choice
from ..core.record import Calc
from ..materials.partial_factors import UK_NA, NationalAnnex
from . import formulas as fm
from .loads import UDL, Load, PointLoad
from .psi import PSI_UK_NA, PsiFactors, PsiTable

_CIT = {
    "6.10": "EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10)",
    "6.10a": "EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10a)",
    "6.10b": "EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10b)",
    "characteristic": "EN 1990:2002, 6.5.3, Eq. (6.14b)",
    "frequent": "EN 1990:2002, 6.5.3, Eq. (6.15b)",
    "quasi-permanent": "EN 1990:2002, 6.5.3, Eq. (6.16b)",
    "variable characteristic": "EN 1990:2002, 6.5.3, Eq. (6.14b)",
}


#: how imposed loads of several categories combine (see the module docstring)
IMPOSED_MODES: tuple[str, ...] = ("single", "separate")
#: name of the single imposed action made of several categories (followed by them, "imposed B+C")
IMPOSED_TOTAL = "imposed"


@dataclass(frozen=True)
class VariableAction:
    """One variable action: its name, type (imposed/snow/wind), category and psi factors.

    ``parts``: for the total imposed load taken as one action, the (action name, psi factors)
    of each category in it; empty for an ordinary action (then the action is its own part).
    """

    name: str
    action: str
    category: str | None
    psi: PsiFactors
    parts: tuple[tuple[str, PsiFactors], ...] = ()

    @property
    def members(self) -> tuple[tuple[str, PsiFactors], ...]:
        """(action name, psi) of every load group this action is made of."""
        return self.parts or ((self.name, self.psi),)


@dataclass(frozen=True)
class Combination:
    """One combination of actions.

    name: e.g. ``"ULS 6.10b, leading: imposed B"``; limit_state: ``"ULS"`` or ``"SLS"``;
    kind: ``"6.10"``, ``"6.10a"``, ``"6.10b"``, ``"characteristic"``, ``"frequent"``,
    ``"quasi-permanent"`` or ``"variable characteristic"``; citation of its equation;
    leading: name of the leading variable action (None if none);
    factors: (action name, factor) with ``"G"`` for the permanent actions;
    expression: the factors in words, e.g. ``"0.925 x 1.35 G + 1.5 Q(imposed B) + 1.5 x 0.5 Q(snow)"``;
    loads: the factored loads (same names, scaled w / P).
    """

    name: str
    limit_state: str
    kind: str
    citation: str
    leading: str | None
    factors: tuple[tuple[str, float], ...]
    expression: str
    loads: tuple[Load, ...]

    def factor(self, action_name: str) -> float:
        """Factor applied to the action ``action_name`` (``"G"`` for permanent); 0 if absent."""
        for k, f in self.factors:
            if k == action_name:
                return f
        return 0.0

    def to_dict(self) -> dict[str, Any]:
        """JSON-ready dict with the factored loads (unit-tagged keys)."""
        return {"name": self.name, "limit_state": self.limit_state, "kind": self.kind,
                "citation": self.citation, "leading": self.leading,
                "factors": {k: round(v, 6) for k, v in self.factors}, "expression": self.expression,
                "loads": [ld.to_dict() for ld in self.loads]}

    def __str__(self) -> str:
        return f"{self.name}: {self.expression}"


# ------------------------------------------------------------------ helpers
def _check_loads(loads: object) -> tuple[Load, ...]:
    if isinstance(loads, (UDL, PointLoad)):
        loads = (loads,)
    if not isinstance(loads, (list, tuple)) or not loads:
        raise InputError("loads", loads, "a non-empty list of UDL and PointLoad objects")
    for i, ld in enumerate(loads):
        if not isinstance(ld, (UDL, PointLoad)):
            raise InputError(f"loads[{i}]", ld, "a UDL or PointLoad")
    return tuple(loads)


def _check_na(na: object) -> NationalAnnex:
    if not isinstance(na, NationalAnnex):
        raise InputError("na", na, "a splicecalc.materials.NationalAnnex")
    require_choice("na.combination", na.combination, ("6.10", "6.10ab"))
    for f in ("gamma_G", "gamma_Q", "xi"):
        v = getattr(na, f)
        if not (isinstance(v, (int, float)) and math.isfinite(v) and v > 0):
            raise InputError(f"na.{f}", v, "a finite number > 0")
    return na


def _check_psi(psi: object) -> PsiTable:
    if not isinstance(psi, PsiTable):
        raise InputError("psi", psi, "a splicecalc.actions.PsiTable")
    return psi


def variable_actions(loads: Sequence[Load], psi: PsiTable = PSI_UK_NA,
                     imposed: str = "single") -> tuple[VariableAction, ...]:
    """The distinct variable actions among ``loads``, in order of first appearance.

    Loads sharing an action name must share type and category (else InputError). With
    ``imposed="single"`` the imposed categories without an explicit group are merged into one
    action named ``"imposed"`` (when there are two or more of them), see the module docstring.
    """
    loads = _check_loads(loads)
    psi = _check_psi(psi)
    require_choice("imposed", imposed, IMPOSED_MODES)
    vas = _variable_actions(loads, psi)
    if imposed == "separate":
        return vas
    # floor categories only: imposed roof load (H) is its own action (EN 1991-1-1 3.3.2)
    merge = [va for va in vas if va.action == "imposed" and va.name == f"imposed {va.category}"
             and va.category != "H"]
    if len(merge) < 2:
        return vas
    name = IMPOSED_TOTAL + " " + "+".join(va.category or "" for va in merge)
    total = VariableAction(name, "imposed", None, merge[0].psi,
                           parts=tuple((va.name, va.psi) for va in merge))
    out: list[VariableAction] = []
    for va in vas:
        if va in merge:
            if va is merge[0]:
                out.append(total)
        else:
            out.append(va)
    return tuple(out)


def _variable_actions(loads: tuple[Load, ...], psi: PsiTable) -> tuple[VariableAction, ...]:
    seen: dict[str, VariableAction] = {}
    for ld in loads:
        if ld.action == "permanent":
            continue
        name = ld.action_name
        va = VariableAction(name, ld.action, ld.category, psi.of(ld))
        if name in seen:
            if (seen[name].action, seen[name].category) != (va.action, va.category):
                raise InputError(f"load {ld.name!r}.group", name,
                                 f"loads of one action with the same type and category "
                                 f"({seen[name].action} {seen[name].category or ''})".rstrip())
        else:
            seen[name] = va
    return tuple(seen.values())


def _g(x: float) -> str:
    return f"{x:.4g}"


def _build(name: str, ls: str, kind: str, leading: str | None, loads: tuple[Load, ...],
           factors: dict[str, float], words: dict[str, str]) -> Combination:
    out: list[Load] = []
    for ld in loads:
        key = "G" if ld.action == "permanent" else ld.action_name
        f = factors.get(key, 0.0)
        if f > 0.0:
            out.append(ld.scaled(f))
    terms = []
    for key, f in factors.items():
        if f <= 0.0:
            continue
        sym = "G" if key == "G" else f"Q({key})"
        terms.append(f"{words[key]} {sym}" if words[key] != "1" else sym)
    return Combination(name=name, limit_state=ls, kind=kind, citation=_CIT[kind], leading=leading,
                       factors=tuple((k, v) for k, v in factors.items() if v > 0.0),
                       expression=" + ".join(terms) if terms else "(no load)", loads=tuple(out))


def _has_permanent(loads: tuple[Load, ...]) -> bool:
    return any(ld.action == "permanent" for ld in loads)


# --------------------------------------------------------------- ULS STR
def uls_combinations(loads: Sequence[Load], na: NationalAnnex = UK_NA,
                     psi: PsiTable = PSI_UK_NA, imposed: str = "single") -> list[Combination]:
    """ULS STR combinations, EN 1990:2002, 6.4.3.2, Table A1.2(B), each variable action leading in turn.

    ``na.combination == "6.10"``: one Eq. (6.10) combination per leading action.
    ``"6.10ab"``: one Eq. (6.10a) plus one Eq. (6.10b) per leading action.
    Without variable actions: permanent only (and for 6.10ab both 6.10a and 6.10b).
    """
    loads = _check_loads(loads)
    na = _check_na(na)
    vas = variable_actions(loads, psi, imposed)
    gG, gQ, xi = na.gamma_G, na.gamma_Q, na.xi
    hasG = _has_permanent(loads)
    combos: list[Combination] = []

    def base(fG: float, wG: str) -> tuple[dict[str, float], dict[str, str]]:
        return ({"G": fG}, {"G": wG}) if hasG else ({}, {})

    def add_variable(f: dict, w: dict, lead) -> None:
        """Leading action gamma_Q, accompanying ones gamma_Q psi_0 (Eq. 6.10 and 6.10b)."""
        for va in vas:
            for name, ps in va.members:
                if va is lead:
                    f[name], w[name] = gQ, _g(gQ)
                else:
                    f[name], w[name] = gQ * ps.psi_0, f"{_g(gQ)} x {_g(ps.psi_0)}"

    if na.combination == "6.10":
        leads = vas or (None,)
        for lead in leads:
            f, w = base(gG, _g(gG))
            add_variable(f, w, lead)
            nm = "ULS 6.10" + (f", leading: {lead.name}" if lead else "")
            combos.append(_build(nm, "ULS", "6.10", lead.name if lead else None, loads, f, w))
        return combos
    # 6.10a: all variable actions with psi_0 (independent of the leading action)
    f, w = base(gG, _g(gG))
    for va in vas:
        for name, ps in va.members:
            f[name], w[name] = gQ * ps.psi_0, f"{_g(gQ)} x {_g(ps.psi_0)}"
    combos.append(_build("ULS 6.10a", "ULS", "6.10a", None, loads, f, w))
    for lead in (vas or (None,)):
        f, w = base(xi * gG, f"{_g(xi)} x {_g(gG)}")
        add_variable(f, w, lead)
        nm = "ULS 6.10b" + (f", leading: {lead.name}" if lead else "")
        combos.append(_build(nm, "ULS", "6.10b", lead.name if lead else None, loads, f, w))
    return combos


# -------------------------------------------------------------------- SLS
def _sls(loads: Sequence[Load], psi: PsiTable, kind: str, with_G: bool,
         lead_factor: Callable[[PsiFactors], float], acc_factor: Callable[[PsiFactors], float],
         lead_word: Callable[[PsiFactors], str], acc_word: Callable[[PsiFactors], str],
         per_leading: bool, imposed: str = "single") -> list[Combination]:
    loads = _check_loads(loads)
    vas = variable_actions(loads, psi, imposed)
    hasG = with_G and _has_permanent(loads)
    combos = []
    leads: tuple[Any, ...] = (vas or (None,)) if per_leading else (None,)
    if kind == "variable characteristic" and not vas:
        return []
    for lead in leads:
        f: dict[str, float] = {"G": 1.0} if hasG else {}
        w: dict[str, str] = {"G": "1"} if hasG else {}
        for va in vas:
            for name, ps in va.members:
                if va is lead:
                    f[name], w[name] = lead_factor(ps), lead_word(ps)
                else:
                    f[name], w[name] = acc_factor(ps), acc_word(ps)
        nm = f"SLS {kind}" + (f", leading: {lead.name}" if lead is not None else "")
        combos.append(_build(nm, "SLS", kind, lead.name if lead is not None else None, loads, f, w))
    return combos


def sls_characteristic(loads: Sequence[Load], psi: PsiTable = PSI_UK_NA,
                       imposed: str = "single") -> list[Combination]:
    """SLS characteristic G + Q_1 + psi_0,i Q_i, EN 1990:2002, 6.5.3, Eq. (6.14b); each action leading."""
    return _sls(loads, _check_psi(psi), "characteristic", True, lambda p: 1.0, lambda p: p.psi_0,
                lambda p: "1", lambda p: _g(p.psi_0), True, imposed)


def sls_frequent(loads: Sequence[Load], psi: PsiTable = PSI_UK_NA,
                 imposed: str = "single") -> list[Combination]:
    """SLS frequent G + psi_1,1 Q_1 + psi_2,i Q_i, EN 1990:2002, 6.5.3, Eq. (6.15b); each action leading."""
    return _sls(loads, _check_psi(psi), "frequent", True, lambda p: p.psi_1, lambda p: p.psi_2,
                lambda p: _g(p.psi_1), lambda p: _g(p.psi_2), True, imposed)


def sls_quasi_permanent(loads: Sequence[Load], psi: PsiTable = PSI_UK_NA,
                        imposed: str = "single") -> list[Combination]:
    """SLS quasi-permanent G + psi_2,i Q_i, EN 1990:2002, 6.5.3, Eq. (6.16b) (one combination)."""
    return _sls(loads, _check_psi(psi), "quasi-permanent", True, lambda p: p.psi_2, lambda p: p.psi_2,
                lambda p: _g(p.psi_2), lambda p: _g(p.psi_2), False, imposed)


def sls_variable_characteristic(loads: Sequence[Load], psi: PsiTable = PSI_UK_NA,
                                imposed: str = "single") -> list[Combination]:
    """Variable actions only, characteristic: Q_1 + psi_0,i Q_i (EN 1990 Eq. (6.14b) without G).

    For the deflection limit under variable actions (UK NA to BS EN 1993-1-1, NA.2.23).
    Empty when there is no variable action.
    """
    return _sls(loads, _check_psi(psi), "variable characteristic", False, lambda p: 1.0,
                lambda p: p.psi_0, lambda p: "1", lambda p: _g(p.psi_0), True, imposed)


def sls_combinations(loads: Sequence[Load], psi: PsiTable = PSI_UK_NA,
                     imposed: str = "single") -> list[Combination]:
    """All SLS combinations: characteristic, frequent, quasi-permanent and variable characteristic."""
    return (sls_characteristic(loads, psi, imposed) + sls_frequent(loads, psi, imposed)
            + sls_quasi_permanent(loads, psi, imposed) + sls_variable_characteristic(loads, psi, imposed))


# ------------------------------------------------------------- governing
def governing(combos: Sequence[Combination], effect: Callable[[Combination], float]
              ) -> tuple[Combination, float]:
    """The combination with the largest |effect(combo)|, and that effect (signed).

    ``effect`` maps a combination to a number, e.g.
    ``lambda c: SimpleBeam(L, c.loads).M_max().value`` (see
    :func:`splicecalc.analysis.governing_M` for ready-made ones). Ties keep the first.
    """
    if not isinstance(combos, (list, tuple)) or not combos:
        raise InputError("combos", combos, "a non-empty list of Combination")
    for i, c in enumerate(combos):
        if not isinstance(c, Combination):
            raise InputError(f"combos[{i}]", c, "a Combination")
    if not callable(effect):
        raise InputError("effect", effect, "a function of a Combination returning a number")
    best, best_v = combos[0], effect(combos[0])
    for c in combos[1:]:
        v = effect(c)
        if abs(v) > abs(best_v) * (1 + 1e-12):
            best, best_v = c, v
    return best, float(best_v)


# --------------------------------------------------------------- rendering
def render_line_load(combo: Combination, loads: Sequence[Load], span_mm: float,
                     na: NationalAnnex = UK_NA, psi: PsiTable = PSI_UK_NA,
                     calc: Calc | None = None, imposed: str = "single") -> float:
    """Render the combined full-span line load of ``combo`` (N/mm) with its EN 1990 equation.

    Sums the characteristic full-span UDLs of each action of ``loads`` (partial
    UDLs and point loads are factored the same way but not part of this line)
    and calls the matching formula of :mod:`splicecalc.actions.formulas` through
    ``calc``; further load groups are added with ``w_acc``. Every factor is the one the
    combination itself applies (``combo.factor``), so the line shows what the analysis used;
    ``psi`` and ``imposed`` must be those the combinations were made with.
    """
    if not isinstance(combo, Combination):
        raise InputError("combo", combo, "a Combination")
    loads = _check_loads(loads)
    na = _check_na(na)
    calc = calc or Calc()
    vas = variable_actions(loads, psi, imposed)
    uls = combo.limit_state == "ULS"
    k = combo.kind

    def full(key: str) -> float:
        return sum(ld.w for ld in loads if isinstance(ld, UDL) and ld.is_full(span_mm)
                   and ("G" if ld.action == "permanent" else ld.action_name) == key)

    g_k = full("G")
    lead = next((v for v in vas if v.name == combo.leading), None)
    others = [v for v in vas if v is not lead]
    if lead is None and k in ("6.10a", "quasi-permanent") and others:
        lead, others = others[0], others[1:]
    # load groups (action name, psi) with a full-span load, leading action's first
    lead_parts = [m for m in (lead.members if lead else ()) if full(m[0]) > 0.0]
    acc_parts = [m for v in others for m in v.members if full(m[0]) > 0.0]
    first = lead_parts[0] if lead_parts else None
    second = acc_parts[0] if acc_parts else None
    rest = lead_parts[1:] + acc_parts[1:]
    q_k1 = full(first[0]) if first else 0.0
    q_k2 = full(second[0]) if second else 0.0
    p1 = first[1] if first else PsiFactors(0.0, 0.0, 0.0)
    p2 = second[1] if second else PsiFactors(0.0, 0.0, 0.0)
    if second is None and k == "6.10":           # no accompanying full-span action: no zero term shown
        w = calc(fm.w_Ed_610_1, g_k=g_k, q_k1=q_k1, gamma_G=na.gamma_G, gamma_Q=na.gamma_Q)
    elif second is None and k == "6.10a":
        w = calc(fm.w_Ed_610a_1, g_k=g_k, q_k1=q_k1, gamma_G=na.gamma_G, gamma_Q=na.gamma_Q, psi_01=p1.psi_0)
    elif second is None and k == "6.10b":
        w = calc(fm.w_Ed_610b_1, g_k=g_k, q_k1=q_k1, xi=na.xi, gamma_G=na.gamma_G, gamma_Q=na.gamma_Q)
    elif k == "6.10":
        w = calc(fm.w_Ed_610, g_k=g_k, q_k1=q_k1, q_k2=q_k2, gamma_G=na.gamma_G, gamma_Q=na.gamma_Q,
                 psi_02=p2.psi_0)
    elif k == "6.10a":
        w = calc(fm.w_Ed_610a, g_k=g_k, q_k1=q_k1, q_k2=q_k2, gamma_G=na.gamma_G, gamma_Q=na.gamma_Q,
                 psi_01=p1.psi_0, psi_02=p2.psi_0)
    elif k == "6.10b":
        w = calc(fm.w_Ed_610b, g_k=g_k, q_k1=q_k1, q_k2=q_k2, xi=na.xi, gamma_G=na.gamma_G,
                 gamma_Q=na.gamma_Q, psi_02=p2.psi_0)
    elif k == "characteristic":
        w = calc(fm.w_k_char, g_k=g_k, q_k1=q_k1, q_k2=q_k2, psi_02=p2.psi_0)
    elif k == "variable characteristic":
        w = calc(fm.w_k_char, g_k=0.0, q_k1=q_k1, q_k2=q_k2, psi_02=p2.psi_0)
    elif k == "frequent":
        w = calc(fm.w_k_freq, g_k=g_k, q_k1=q_k1, q_k2=q_k2, psi_11=p1.psi_1, psi_22=p2.psi_2)
    else:
        w = calc(fm.w_k_qp, g_k=g_k, q_k1=q_k1, q_k2=q_k2, psi_21=p1.psi_2, psi_22=p2.psi_2)
    gamma = na.gamma_Q if uls else 1.0
    for name, _ in rest:
        w = calc(fm.w_acc, w_prev=w, gamma_i=gamma, psi_i=combo.factor(name) / gamma, q_ki=full(name))
    return float(w)
