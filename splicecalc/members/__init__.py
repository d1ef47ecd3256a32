"""Member checks to EN 1993-1-1:2005 and EN 1993-1-5:2006 with the UK National Annex.

Public API (units: N, mm, MPa, N*mm; ``M_Ed`` in N*mm, ``V_Ed``/``F_Ed`` in N):

* classification (Table 5.2): :func:`classify` (record), :func:`section_class` (int, searches);
* cross-section: :func:`check_bending` (6.2.5, with tension-flange holes 6.2.5(4)),
  :func:`W_y_with_holes`, :func:`check_shear` (6.2.6), :func:`check_bending_shear` (6.2.8);
* lateral-torsional buckling: :func:`check_ltb` (6.3.2.2, 6.3.2.3, UK NA) and the elastic
  critical moment: :func:`M_cr_uniform`, :func:`M_cr_C1C2`, :func:`M_cr_closed_form`,
  :func:`C_1_linear`, :data:`C1_C2_PINNED`, :func:`M_cr_numerical`, :func:`mcr_numerical`,
  :func:`C_1_numerical`;
* webs under transverse forces, EN 1993-1-5 section 6: :func:`check_web_bearing` (support
  reaction, type (c)), :func:`check_transverse_force` (point load on a flange, type (a) or (c),
  Eq. 6.14), :func:`check_transverse_bending` (7.2, Eq. 7.2), :func:`transverse_resistance`;
* slender parts: :func:`effective_section` (Class 4, EN 1993-1-5 4.4), shear buckling inside
  :func:`check_shear` / :func:`check_bending_shear` (EN 1993-1-5 5 and 7.1), :func:`shear_resistance`;
* :func:`check_deflection` (UK NA NA.2.23 suggested limits; a total limit as agreed, EN 1990 A1.4.3);
* :func:`check_floor_frequency` (natural frequency of a floor beam, common practice, EN 1990 A1.4.4)
  and :func:`restraint_force` (design force of a lateral restraint, EN 1993-1-1 5.3.3).

The clause formulas themselves are in :mod:`.en1993_1_1` (incl. ``k_c_linear`` of Table 6.6,
``k_c_from_C1`` of the UK NA) and :mod:`.en1993_1_5`.

Class 4 sections and webs needing a shear-buckling check are designed (EN 1993-1-5), not refused.
"""

from . import en1993_1_1, en1993_1_5
from .checks import (ALPHA_LT, DEFLECTION_LIMITS, ShearBucklingError, SlenderSectionError, W_y_with_holes,
                     check_bending, check_bending_shear, check_deflection, check_ltb, check_shear,
                     check_transverse_bending, check_transverse_force, check_web_bearing, classify,
                     effective_section, ltb_curve_rolled, section_class, shear_resistance, transverse_resistance,
                     FLOOR_FREQUENCY_MIN_HZ, VIBRATION_IMPOSED_SHARE, bending_resistance, check_floor_frequency,
                     restraint_force, check_flange_induced_buckling)
from .mcr import (C1_C2_PINNED, DEFAULT_N_ELEMENTS, C_1_linear, C_1_numerical, M_cr_C1C2, M_cr_closed_form,
                  M_cr_numerical, M_cr_uniform, McrResult, mcr_numerical)

__all__ = [
    "en1993_1_1", "en1993_1_5",
    "ALPHA_LT", "DEFLECTION_LIMITS", "ShearBucklingError", "SlenderSectionError", "W_y_with_holes",
    "check_bending", "check_bending_shear", "check_deflection", "check_ltb", "check_shear", "check_web_bearing",
    "classify", "ltb_curve_rolled", "section_class", "check_transverse_bending", "check_transverse_force",
    "effective_section", "shear_resistance", "transverse_resistance",
    "FLOOR_FREQUENCY_MIN_HZ", "VIBRATION_IMPOSED_SHARE", "check_floor_frequency", "restraint_force",
    "bending_resistance", "check_flange_induced_buckling",
    "C1_C2_PINNED", "DEFAULT_N_ELEMENTS", "C_1_linear", "C_1_numerical", "M_cr_C1C2", "M_cr_closed_form",
    "M_cr_numerical", "M_cr_uniform", "McrResult", "mcr_numerical",
]
