"""Actions: load model (EN 1991), psi factors and combinations (EN 1990 with UK NA).

Public API
----------
UDL(name, action, w, x_start=0, x_end=None, category=None, group="")   w in N/mm, x in mm
PointLoad(name, action, P, x, category=None, group="")                  P in N, x in mm
ACTIONS, CATEGORIES, Load, check_loads_on_span(loads, span_mm), self_weight_udl(mass_kg_per_m)
"""

from .loads import ACTIONS, CATEGORIES, UDL, Load, PointLoad, check_loads_on_span, g_n, self_weight_udl

__all__ = ["ACTIONS", "CATEGORIES", "UDL", "Load", "PointLoad", "check_loads_on_span", "g_n",
           "self_weight_udl"]
