"""``splicecalc run JOB.toml [--json]``: design or check the beam of a job file.

Prints the chosen section, the combinations, every check (title, clause,
demand / resistance with units, utilisation, verdict, where along the beam and
for which combination it governs) and the candidates of a section search.
``--json`` prints every check record (``CheckRecord.to_dict``: unit-tagged keys).

Exit codes: 0 every check passes; 1 the design fails (a result, not an error);
2 bad input (one line on stderr).
"""

from __future__ import annotations

import argparse
import json
import sys
from typing import Any

from ..core.errors import InputError


#: candidates listed in the text summary (the heaviest ones tried; --json lists all)
SHOW_CANDIDATES = 12


def add_parser(subparsers: Any) -> argparse.ArgumentParser:
    """Register the ``run`` sub-command on an ``argparse`` sub-parsers object."""
    p = subparsers.add_parser("run", help="design or check the beam of a TOML job file",
                              description="Design (section = \"auto\") or check the beam of a job file: "
                                          "EN 1990 combinations, exact analysis, EN 1993-1-1 / 1-5 member checks.")
    p.add_argument("job", metavar="JOB.toml", help="job file")
    p.add_argument("--json", action="store_true", help="print the result and every check record as JSON")
    p.set_defaults(func=run_command)
    return p


def summary_text(design: Any, source: str = "") -> str:
    """The readable summary printed by ``splicecalc run`` (see :meth:`BeamDesign.summary`)."""
    return design.summary(source, show_candidates=SHOW_CANDIDATES)


def result_dict(design: Any, source: str = "") -> dict[str, Any]:
    """JSON-ready output of ``splicecalc run --json``."""
    d: dict[str, Any] = {"job_file": source, "project": {k: v for k, v in vars(design.job.project).items() if v}}
    d.update(design.to_dict())
    if design.job.notes:
        d["notes"] = list(design.job.notes)
    return d


def run_command(args: argparse.Namespace) -> int:
    """Run the design of ``args.job``; print a summary (or JSON with ``args.json``).

    Returns 0 when every check passes, 1 when the design fails, 2 on bad input
    (message on stderr).
    """
    from ..design.beam import design_beam
    from ..job import load_job

    try:
        job = load_job(args.job)
        design = design_beam(job)
    except InputError as err:
        print(f"splicecalc: error: {err}", file=sys.stderr)
        return 2
    if getattr(args, "json", False):
        print(json.dumps(result_dict(design, str(args.job)), indent=2))
    else:
        print(summary_text(design, str(args.job)))
    return 0 if design.ok else 1


__all__ = ["add_parser", "run_command", "summary_text", "result_dict"]
