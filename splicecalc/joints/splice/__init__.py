"""Bolted cover-plate beam splice to EN 1993-1-8: job-file spec, design forces, checks, drawing.

Public API: :func:`parse_splices` -> :class:`SpliceSpec`; :class:`SpliceLayout`,
:class:`FlangeLayout`, :class:`WebLayout`; :func:`splice_forces`; :func:`check_splice`
-> :class:`SpliceDesign`; ``drawing.draw_splice`` (matplotlib, imported on demand). The automatic layout
search is :func:`splicecalc.design.splice_layout.design_splice`; positions along
the beam :func:`splicecalc.design.splice_positions.choose_splice_positions`.
"""

from .design import SpliceDesign, check_splice, moment_resistance, splice_cost
from .forces import SpliceForces, splice_forces
from .geometry import Geometry, geometry
from .spec import FlangeLayout, SpliceLayout, SpliceSpec, WebLayout, parse_splices

__all__ = ["SpliceDesign", "check_splice", "moment_resistance", "splice_cost", "SpliceForces", "splice_forces",
           "Geometry", "geometry", "FlangeLayout", "SpliceLayout", "SpliceSpec", "WebLayout", "parse_splices"]
