"""The structural-integrity tie force of a beam end, from its loads (EN 1991-1-7 Annex A with the UK NA).

Horizontal ties of a framed structure (EN 1991-1-7:2006, A.5.1, Eq. (A.1)): each internal tie
carries T_i = k_T (g_k + psi q_k) s L and not less than 75 kN. For a beam, (g_k + psi q_k) s L is
its total load in the accidental combination, W_acc = sum G_k + sum psi_1 Q_k (line loads already
include the spacing s; psi_1 for every variable action, the conservative reading of the
accidental combination EN 1990 Eq. (6.11b)). k_T by consequence class (UK NA to BS EN 1991-1-7,
FROM MEMORY, flagged in the basis text):

* class 1: no tie force is required by the code; the 75 kN minimum of UK practice is used;
* class 2a (lower group): k_T = 0.5;
* class 2b (upper group): k_T = 0.8 (the Annex A internal-tie value);
* class 3: k_T = 0.8 as a minimum; a systematic risk assessment is required (flagged).

A ``tying_force`` in the job overrides the computed value (:mod:`.spec`).
"""

from __future__ import annotations

from typing import Any, Sequence

from ...core.record import Calc
from .formulas import T_tie
from .spec import TYING_MIN_N

#: k_T by consequence class (UK NA to BS EN 1991-1-7 / EN 1991-1-7 A.5.1; from memory)
K_TIE = {"1": 0.0, "2a": 0.5, "2b": 0.8, "3": 0.8}


def accidental_load(loads: Sequence[Any], span_mm: float, psi: Any) -> float:
    """W_acc = sum G_k + sum psi_1 Q_k over the beam's characteristic loads (N)."""
    W = 0.0
    for ld in loads:
        total = ld.total(span_mm)
        W += total if ld.action == "permanent" else psi.of(ld).psi_1 * total
    return W


def tying_force_from_loads(loads: Sequence[Any], span_mm: float, consequence_class: str, psi: Any,
                           calc: Calc | None = None) -> tuple[float, str]:
    """(tie force N, basis text) for a beam with these characteristic loads (self-weight included)."""
    calc = calc or Calc()
    cc = consequence_class
    W = accidental_load(loads, span_mm, psi)
    k = K_TIE[cc]
    T = calc(T_tie, k_T=k, W_acc=W, T_min=TYING_MIN_N)
    if cc == "1":
        basis = ("consequence class 1: no tie force required by the code; 75 kN minimum of UK practice used "
                 "(from memory)")
    else:
        basis = (f"consequence class {cc}: T = {k:g} (G_k + psi_1 Q_k) = {k:g} x {W / 1e3:.1f} kN = "
                 f"{k * W / 1e3:.1f} kN, at least 75 kN (EN 1991-1-7 A.5.1 with the UK NA, k_T from memory)")
        if cc == "3":
            basis += "; class 3 also needs a systematic risk assessment (not part of this package)"
    return T, basis


def tying_record(calc: Calc, T: float, basis: str, given: bool) -> Any:
    """An INFO record of the tie force used (the rendered steps of :func:`tying_force_from_loads` when
    computed; the job's value when given)."""
    if given:
        calc.latex.clear()
        calc.values.clear()
    return calc.info(id="tie_force", title="Tie force (structural integrity)",
                     clause="EN 1991-1-7:2006, A.5.1, Eq. (A.1)", demand=T, unit="N",
                     note=("given in the job" if given else basis))


__all__ = ["K_TIE", "accidental_load", "tying_force_from_loads", "tying_record"]
