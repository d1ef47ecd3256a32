"""Analysis of a simply supported span (exact, closed form).

Public API
----------
SimpleBeam(span_mm, loads, E=210000, I=None)
    .R_A, .R_B, .total_load (N); .V(x, side), .M(x), .theta(x) / .slope(x), .w(x) / .deflection(x);
    .M_max(), .V_max(), .w_max() -> Extreme(value, x_mm); .breakpoints()
Extreme(value, x_mm)
"""

from .beam import Extreme, SimpleBeam

__all__ = ["Extreme", "SimpleBeam"]
