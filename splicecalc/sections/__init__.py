"""Section catalogue (UKB, UKC, IPE, HEA, HEB) and properties from geometry.

The CSV data hold only h, b, tw, tf, r and the nominal mass; area, second
moments, moduli, torsion and warping constants, shear area and c/t ratios are
computed from the geometry with the root fillets (see :mod:`.geometry`).

>>> s = get_section("533x210x92 UKB")
>>> round(s.Wpl_y / 1e3)          # cm3
2360
"""

from .catalogue import get_section, list_sections
from .geometry import A_v_z, properties, torsion_constant
from .section import FAMILIES, MEASURED, Section, measured_section

__all__ = ["FAMILIES", "MEASURED", "Section", "A_v_z", "get_section", "list_sections",
           "measured_section", "properties", "torsion_constant"]
