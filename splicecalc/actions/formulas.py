"""EN 1990 combination formulas for line loads, as rendered clause functions.

Each takes the characteristic line loads of the permanent action ``g_k``, the
leading variable action ``q_k1`` and one accompanying variable action ``q_k2``
(N/mm = kN/m) and returns the combined line load (N/mm). Further accompanying
actions are added with :func:`w_acc`. Loads act unfavourably (all downward on a
simply supported span), so gamma_G,sup applies.

Public API: :func:`w_Ed_610`, :func:`w_Ed_610a`, :func:`w_Ed_610b`, :func:`w_k_char`,
:func:`w_k_freq`, :func:`w_k_qp`, :func:`w_acc`; ``..._1`` variants for one variable action on the
full span (the rendered line then carries no zero accompanying term).
"""

from __future__ import annotations

from ..core.clause import clause

_W = {"g_k": "N/mm", "q_k1": "N/mm", "q_k2": "N/mm"}
_EX = dict(g_k=5.0, q_k1=10.0, q_k2=2.0)


@clause("EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10)", units=_W, returns="N/mm",
        example=dict(_EX, gamma_G=1.35, gamma_Q=1.5, psi_02=0.5))
def w_Ed_610(g_k: float, q_k1: float, q_k2: float, gamma_G: float, gamma_Q: float,
             psi_02: float) -> float:
    """ULS STR/GEO design line load, EN 1990 Eq. (6.10): gamma_G G + gamma_Q Q1 + gamma_Q psi_0 Q2."""
    w_Ed = gamma_G * g_k + gamma_Q * q_k1 + gamma_Q * psi_02 * q_k2
    return w_Ed


@clause("EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10a)", units=_W, returns="N/mm",
        example=dict(_EX, gamma_G=1.35, gamma_Q=1.5, psi_01=0.7, psi_02=0.5))
def w_Ed_610a(g_k: float, q_k1: float, q_k2: float, gamma_G: float, gamma_Q: float,
              psi_01: float, psi_02: float) -> float:
    """ULS design line load, EN 1990 Eq. (6.10a): gamma_G G + gamma_Q psi_0 Q for every variable action."""
    w_Ed = gamma_G * g_k + gamma_Q * psi_01 * q_k1 + gamma_Q * psi_02 * q_k2
    return w_Ed


@clause("EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10b)", units=_W, returns="N/mm",
        example=dict(_EX, xi=0.925, gamma_G=1.35, gamma_Q=1.5, psi_02=0.5))
def w_Ed_610b(g_k: float, q_k1: float, q_k2: float, xi: float, gamma_G: float, gamma_Q: float,
              psi_02: float) -> float:
    """ULS design line load, EN 1990 Eq. (6.10b): xi gamma_G G + gamma_Q Q1 + gamma_Q psi_0 Q2."""
    w_Ed = xi * gamma_G * g_k + gamma_Q * q_k1 + gamma_Q * psi_02 * q_k2
    return w_Ed


_W1 = {"g_k": "N/mm", "q_k1": "N/mm"}
_EX1 = dict(g_k=5.0, q_k1=10.0)


@clause("EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10)", units=_W1, returns="N/mm",
        example=dict(_EX1, gamma_G=1.35, gamma_Q=1.5))
def w_Ed_610_1(g_k: float, q_k1: float, gamma_G: float, gamma_Q: float) -> float:
    """Eq. (6.10) with one variable action on the full span (no accompanying term to show)."""
    w_Ed = gamma_G * g_k + gamma_Q * q_k1
    return w_Ed


@clause("EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10a)", units=_W1, returns="N/mm",
        example=dict(_EX1, gamma_G=1.35, gamma_Q=1.5, psi_01=0.7))
def w_Ed_610a_1(g_k: float, q_k1: float, gamma_G: float, gamma_Q: float, psi_01: float) -> float:
    """Eq. (6.10a) with one variable action on the full span."""
    w_Ed = gamma_G * g_k + gamma_Q * psi_01 * q_k1
    return w_Ed


@clause("EN 1990:2002, 6.4.3.2, Table A1.2(B), Eq. (6.10b)", units=_W1, returns="N/mm",
        example=dict(_EX1, xi=0.925, gamma_G=1.35, gamma_Q=1.5))
def w_Ed_610b_1(g_k: float, q_k1: float, xi: float, gamma_G: float, gamma_Q: float) -> float:
    """Eq. (6.10b) with one variable action on the full span."""
    w_Ed = xi * gamma_G * g_k + gamma_Q * q_k1
    return w_Ed


@clause("EN 1990:2002, 6.5.3, Eq. (6.14b)", units=_W, returns="N/mm",
        example=dict(_EX, psi_02=0.5))
def w_k_char(g_k: float, q_k1: float, q_k2: float, psi_02: float) -> float:
    """SLS characteristic combination, EN 1990 Eq. (6.14b): G + Q1 + psi_0 Q2."""
    w_ser = g_k + q_k1 + psi_02 * q_k2
    return w_ser


@clause("EN 1990:2002, 6.5.3, Eq. (6.15b)", units=_W, returns="N/mm",
        example=dict(_EX, psi_11=0.5, psi_22=0.0))
def w_k_freq(g_k: float, q_k1: float, q_k2: float, psi_11: float, psi_22: float) -> float:
    """SLS frequent combination, EN 1990 Eq. (6.15b): G + psi_1 Q1 + psi_2 Q2."""
    w_fr = g_k + psi_11 * q_k1 + psi_22 * q_k2
    return w_fr


@clause("EN 1990:2002, 6.5.3, Eq. (6.16b)", units=_W, returns="N/mm",
        example=dict(_EX, psi_21=0.3, psi_22=0.0))
def w_k_qp(g_k: float, q_k1: float, q_k2: float, psi_21: float, psi_22: float) -> float:
    """SLS quasi-permanent combination, EN 1990 Eq. (6.16b): G + psi_2 Q1 + psi_2 Q2."""
    w_qp = g_k + psi_21 * q_k1 + psi_22 * q_k2
    return w_qp


@clause("EN 1990:2002, 6.4.3.2, Eq. (6.10)", units={"w_prev": "N/mm", "q_ki": "N/mm"},
        returns="N/mm", example=dict(w_prev=20.0, gamma_i=1.5, psi_i=0.5, q_ki=3.0))
def w_acc(w_prev: float, gamma_i: float, psi_i: float, q_ki: float) -> float:
    """Adds one further accompanying variable action gamma_Q,i psi_i Q_k,i to a combined line load."""
    w_comb = w_prev + gamma_i * psi_i * q_ki
    return w_comb
