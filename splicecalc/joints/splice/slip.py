"""Slip of bearing-type (category A) splices in clearance holes: the kink and the deflection it adds.

A category A splice (EN 1993-1-8:2005, 3.4.1(1)) carries its forces in bearing, so before the
bolts bear the flange plates slide by up to the hole clearance: the tension flange joint opens
and the compression flange joint closes by the slip ``s`` each, and the beam kinks at the
splice by ``theta = 2 s / z`` (z the lever arm between the flange force lines, the same z as
the force split). On a simply supported span the kinks are rigid-body rotations at the splice
positions; by virtual work (unit load at x) each adds ``theta m(a; x)`` to the deflection at
x, with ``m(a; x) = a (L - x) / L`` for ``a <= x`` and ``x (L - a) / L`` otherwise (the moment at
the splice a from a unit load at x). The slip deflection is superposed on the elastic
deflection of the SLS check. The web bolts slip too: the beam ends move vertically against each
other by ``s``, a step whose deflection at x is ``s v(a; x)`` with ``v(a; x) = (L - x)/L`` for
``a <= x`` and ``x / L`` otherwise (the shear at a from a unit load at x), added to the kink's.
Category B (slip-resistant at SLS) or C splices do not slip at SLS.

``s`` by default is the hole clearance ``d_0 - d`` (a bolt may start anywhere in its hole, so
the full clearance is possible; stated as conservative), or the value the job gives.
"""

from __future__ import annotations

from ...core.clause import clause

CIT_SLIP = "EN 1993-1-8:2005, 3.4.1(1)"
CIT_SLS = "EN 1990:2002, A1.4.3"
#: the method's source (not a code formula)
SLIP_GUIDANCE = ("kink from slip in the flange joints, theta = 2 s / z, and step s from slip in the web joint, "
                 "superposed by virtual work on the simply supported span (structural mechanics; the code states "
                 "only that category A joints slip)")


@clause(CIT_SLIP, units={"s": "mm", "z": "mm"}, returns="", example=dict(s=2.0, z=440.7))
def theta_slip(s: float, z: float) -> float:
    """Kink at a splice (rad): the tension flange joint opens and the compression flange joint closes
    by the slip s each, over the lever arm z between them."""
    theta_s = 2 * s / z
    return theta_s


@clause(CIT_SLS, units={"a": "mm", "x": "mm", "L": "mm"}, returns="mm",
        example=dict(theta_s=0.00454, a=3000.0, x=4500.0, L=9000.0))
def delta_kink(theta_s: float, a: float, x: float, L: float) -> float:
    """Deflection at x (mm) of a simply supported span L from a kink theta_s at a (virtual work: the
    moment at a from a unit load at x times the kink)."""
    if a <= x: m_a = a * (L - x) / L
    else: m_a = x * (L - a) / L
    delta_k = theta_s * m_a
    return delta_k


@clause(CIT_SLS, units={"s": "mm", "a": "mm", "x": "mm", "L": "mm"}, returns="mm",
        example=dict(s=2.0, a=3000.0, x=4500.0, L=9000.0))
def delta_step(s: float, a: float, x: float, L: float) -> float:
    """Deflection at x (mm) of a simply supported span L from a vertical step s at a (the web bolts slipping
    in their holes): virtual work with the shear at a from a unit load at x."""
    if a <= x: v_a = (L - x) / L
    else: v_a = x / L
    delta_s = s * v_a
    return delta_s


__all__ = ["theta_slip", "delta_kink", "delta_step", "CIT_SLIP", "CIT_SLS", "SLIP_GUIDANCE"]
