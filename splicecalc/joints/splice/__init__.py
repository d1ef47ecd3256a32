"""Bolted cover-plate beam splice to EN 1993-1-8: job-file spec, design forces, checks, drawing.

Public API: :func:`parse_splices` -> :class:`SpliceSpec`; :class:`SpliceLayout`,
:class:`FlangeLayout`, :class:`WebLayout`; :func:`splice_forces`; :func:`check_splice`
-> :class:`SpliceDesign`; ``drawing.draw_splice`` (matplotlib, imported on demand). The automatic layout
search is :func:`splicecalc.design.splice_layout.design_splice`; positions along
the beam :func:`splicecalc.design.splice_positions.choose_splice_positions`.
"""

from ...core.lazy import lazy_exports

# names imported on first use (splicecalc.core.lazy): reading the job's [splices] table needs .spec alone
__getattr__, __dir__, __all__ = lazy_exports(__name__, {
    **{n: ".design" for n in ("SpliceDesign", "check_splice", "moment_resistance", "splice_cost")},
    **{n: ".forces" for n in ("SpliceForces", "splice_forces")},
    **{n: ".geometry" for n in ("Geometry", "geometry")},
    **{n: ".spec" for n in ("FlangeLayout", "SpliceLayout", "SpliceSpec", "WebLayout", "parse_splices")},
})
