"""Calc-package workflow: the full beam-and-splice calculation of a job, its notebook parts and packages.

* :func:`run_calc` (job -> :class:`CalcResult`): actions, analysis, member checks,
  splice positions, each splice, each end connection and existing member, summary,
  references and cautions, calling the modules that own each method;
* :mod:`.display`: one call per part of the calc sheet (``show_actions(result)`` ...),
  built on the report display helpers;
* :mod:`.package`: calc templates, new packages, builds and the demo.

The names are imported on first use (:mod:`splicecalc.core.lazy`), so that a build
process, which only needs :mod:`.package`, does not load the calc library before it
starts the kernel that runs the calc.
"""

from ..core.lazy import lazy_exports

__getattr__, __dir__, __all__ = lazy_exports(__name__, {
    "CalcError": ".errors",
    **{n: ".calc" for n in ("CalcResult", "ConnectionPart", "SplicePart", "design_connections", "design_member",
                            "design_splices", "member_checks", "run_calc", "splice_envelope",
                            "splice_slip_checks")},
    **{n: ".references" for n in ("CAUTIONS", "STANDARDS", "cited_clauses", "standards_list")},
})
