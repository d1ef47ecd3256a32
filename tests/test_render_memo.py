"""The one in-memory cache of core.render gives the same text and numbers as rendering afresh.

Reference: handcalcs' own LatexRenderer, called on the formula's body each time (the uncached path).
"""

from __future__ import annotations

from splicecalc.core import render
from splicecalc.core.units import to_quantity
from splicecalc.joints.bolts import F_v_Rd


def test_render_memo_same_as_uncached():
    kw = dict(alpha_v=0.6, f_ub=800.0, A_s=245.0, gamma_M2=1.25)
    first = render.render(F_v_Rd, precision=3, **kw)
    assert first == render._render_uncached(F_v_Rd, 3, kw)
    assert render.render(F_v_Rd, precision=3, **kw) == first           # memoised answer, same text
    assert render.render(F_v_Rd, precision=2, **kw) == render._render_uncached(F_v_Rd, 2, kw)
    # 0.6 x 800 MPa x 245 mm2 / 1.25 = 94.08 kN (EN 1993-1-8 Table 3.4, worked by hand)
    assert abs(first[1] - 94080.0) < 1e-6


def test_render_key_tells_types_and_signed_zero_apart():
    a = render._render_key(F_v_Rd, 3, {"A_s": 0.0})
    assert a != render._render_key(F_v_Rd, 3, {"A_s": -0.0})
    assert render._render_key(F_v_Rd, 3, {"A_s": 1}) != render._render_key(F_v_Rd, 3, {"A_s": 1.0})
    assert render._render_key(F_v_Rd, 3, {"A_s": to_quantity(1.0, "mm2")}) is None   # rendered afresh
