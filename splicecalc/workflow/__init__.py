"""Calc-package workflow: the full beam-and-splice calculation of a job, its notebook parts and packages.

* :func:`run_calc` (job -> :class:`CalcResult`): actions, analysis, member checks,
  splice positions, each splice, each end connection and existing member, summary,
  references and cautions, calling the modules that own each method;
* :mod:`.display`: one call per part of the calc sheet (``show_actions(result)`` ...),
  built on the report display helpers;
* :mod:`.package`: calc templates, new packages, builds and the demo.
"""

from .calc import (CalcError, CalcResult, ConnectionPart, SplicePart, design_connections, design_member,
                   design_splices, member_checks, run_calc, splice_positions)
from .references import CAUTIONS, STANDARDS, cited_clauses, standards_list

__all__ = ["CAUTIONS", "STANDARDS", "CalcError", "CalcResult", "ConnectionPart", "SplicePart", "cited_clauses",
           "design_connections", "design_member", "design_splices", "member_checks", "run_calc",
           "splice_positions", "standards_list"]
