"""``splicecalc batch SCHEDULE.toml``: a schedule of beams sharing defaults, designed in parallel.

    splicecalc batch SCHEDULE.toml [--csv FILE] [--pdf] [--out DIR] [--workers N] [--cluster ADDRESS]

The schedule's ``[defaults]`` hold any job-file tables, each ``[beam.<name>]`` what differs
(or ``--csv`` a row per beam of dotted job keys); see :mod:`splicecalc.workflow.batch`.
Each beam is read by the one job validation and designed as ``splicecalc run`` designs it;
``--pdf`` also builds its calc package into ``DIR/<name>/``. The summary is written to
``DIR/<schedule>_summary.csv`` (with ``--pdf`` also a summary sheet, ``DIR/<schedule>_summary.pdf``)
and printed as a table.

Exit codes: 0 every beam within capacity; 1 a beam exceeds capacity or could not be designed
(its row says why; the other beams are still designed); 2 a schedule file that cannot be read
as one (one line, before any beam is designed); 3 nothing exceeds capacity but some beam has
NOT CHECKED items.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path
from typing import Any

from ..core.errors import InputError


def add_parser(subparsers: Any) -> argparse.ArgumentParser:
    """Register the ``batch`` sub-command."""
    p = subparsers.add_parser(
        "batch", help="design a schedule of beams sharing defaults, in parallel (summary CSV; --pdf packages)",
        description="Design every beam of a schedule: [defaults] (job-file tables) and one [beam.<name>] table "
                    "per beam overriding them, or --csv with a row per beam. Exit 0: every beam within capacity; "
                    "1: a beam exceeds capacity or could not be designed; 2: bad schedule file; 3: NOT CHECKED "
                    "items.")
    p.add_argument("schedule", metavar="SCHEDULE.toml", help="schedule file")
    p.add_argument("--csv", metavar="FILE", help="CSV: a 'name' column and one column per dotted job key that "
                                                 "varies (beam.span, project.title, load.2.udl)")
    p.add_argument("--pdf", action="store_true", help="also build each beam's calc package into DIR/<name>/")
    p.add_argument("--out", metavar="DIR", help="output folder (default: a folder named after the schedule, "
                                                "beside it)")
    p.add_argument("--workers", metavar="N", type=int, help="worker processes (default: one per core; 1 runs "
                                                            "in this process)")
    p.add_argument("--cluster", metavar="ADDRESS", help="run on a Dask distributed scheduler "
                                                        "(e.g. tcp://10.0.0.5:8786; needs dask[distributed], "
                                                        "and --out on a folder every worker sees for --pdf)")
    p.add_argument("--quiet", action="store_true", help="no progress bar")
    p.set_defaults(func=batch_command)
    return p


def batch_command(args: argparse.Namespace) -> int:
    from ..report.errors import CalcBuildError
    from ..workflow.batch import (exit_code, read_schedule, run_beams, summary_table, write_summary,
                                  write_summary_pdf)

    if args.workers is not None and not 1 <= args.workers <= 256:
        raise InputError("--workers", args.workers, "a number of worker processes from 1 to 256")
    if args.cluster is not None and (not args.cluster.strip() or len(args.cluster) > 200
                                     or any(c.isspace() for c in args.cluster)):
        raise InputError("--cluster", args.cluster, "a Dask scheduler address such as tcp://10.0.0.5:8786")
    src = Path(args.schedule)
    schedule = read_schedule(src, args.csv)            # a bad schedule stops here (exit 2), before any work
    out = Path(args.out) if args.out else src.parent / src.stem
    try:
        rows = run_beams(schedule, out=out, pdf=args.pdf, workers=args.workers, cluster=args.cluster,
                         progress=not args.quiet)
    except CalcBuildError as err:       # xelatex or pandoc missing for --pdf: said once, before any beam
        print(f"splicecalc: error: {' '.join(str(err).split())}", file=sys.stderr)
        return 2
    path = write_summary(rows, out / f"{src.stem}_summary.csv")
    title = schedule.title or f"Schedule {src.name}"
    print(summary_table(rows, title=title))
    print(f"summary: {path}")
    if args.pdf:
        try:
            sheet = write_summary_pdf(rows, out / f"{src.stem}_summary.pdf", title, src.name)
            print(f"summary sheet: {sheet}")
        except CalcBuildError as err:
            print(f"splicecalc: error: the summary sheet was not typeset: {' '.join(str(err).split())}",
                  file=sys.stderr)
            return 1
    return exit_code(rows)


__all__ = ["add_parser", "batch_command"]
