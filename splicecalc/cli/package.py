"""``splicecalc new | build | demo``: create, build and demonstrate calc packages.

    splicecalc new TEMPLATE FOLDER --project P --number N --title T [--job JOB.toml]
    splicecalc build NOTEBOOK_OR_JOB [-o PDF] [--quiet]
    splicecalc demo [--out DIR]

``build`` executes the notebook headless (a job file is built with the default
template), shows progress for the cells and the LaTeX passes, writes the
executed notebook next to the PDF (that notebook is what ``splicecalc sign``
signs and ``splicecalc verify`` checks), the PDF and its ``.pdf.json`` record.
An issued or signed PDF is never overwritten.

Exit codes: 0 built; 2 user error (bad input, a protected PDF, an existing
package); 1 build failure (a failing cell, a LaTeX error, a missing tool: the
message gives the install command).
"""

from __future__ import annotations

import argparse
import sys
from typing import Any

from ..core.errors import InputError


def _fail(msg: str, code: int) -> int:
    print(f"splicecalc: {'error' if code == 2 else 'build failed'}: {' '.join(str(msg).split())}", file=sys.stderr)
    return code


def _run(fn: Any) -> int:
    """Call ``fn`` mapping errors to exit codes: InputError / protected PDF 2, other build errors 1."""
    from ..report.errors import CalcBuildError, ProtectedPDFError
    from ..workflow.errors import CalcError
    from ..workflow.package import SignedPDFError

    try:
        return fn()
    except InputError as err:
        return _fail(str(err), 2)
    except (SignedPDFError, ProtectedPDFError) as err:
        return _fail(str(err), 2)
    except (CalcBuildError, CalcError) as err:
        return _fail(str(err), 1)


def _print_build(b: Any, quiet: bool) -> None:
    r = b.report
    print(f"PDF: {b.pdf} ({r.pages} sheets)")
    print(f"executed notebook: {b.notebook}  (sign it with: splicecalc sign {b.notebook} --role prepared "
          "--name NAME)")
    print(f"status: {b.status}; build record: {b.sidecar}")
    if not quiet:
        print(f"time: execution {r.execution_s:.1f} s (kernel start {r.kernel_start_s:.1f} s, cells {r.cells_s:.1f} s), "
              f"LaTeX {r.latex_passes} passes {r.latex_s:.1f} s, our overhead (all but kernel start and LaTeX) "
              f"{r.overhead_s:.1f} s, total {r.total_s:.1f} s")
        if r.wide_boxes:
            print(f"warning: {len(r.wide_boxes)} line(s) too wide for the sheet, see {r.log_path}", file=sys.stderr)


# ----------------------------------------------------------------- commands
def cmd_new(args: argparse.Namespace) -> int:
    from ..workflow.package import new_package

    def go() -> int:
        p = new_package(args.template, args.folder, project=args.project or "", number=args.number or "",
                        title=args.title or "", job=args.job)
        print(f"calc notebook: {p.notebook}")
        if p.job_file is not None:
            print(f"job file: {p.job_file}" + ("" if args.job else " (a starter: replace its values)"))
        print(f"build it with: splicecalc build {p.notebook}")
        return 0
    return _run(go)


def cmd_build(args: argparse.Namespace) -> int:
    from ..workflow.package import build_package

    def go() -> int:
        b = build_package(args.source, args.output, progress=not args.quiet, timeout=args.timeout)
        _print_build(b, args.quiet)
        return 0
    return _run(go)


def cmd_demo(args: argparse.Namespace) -> int:
    from ..workflow.package import build_demo

    def go() -> int:
        b = build_demo(args.out, progress=not args.quiet)
        _print_build(b, args.quiet)
        return 0
    return _run(go)


def add_parsers(sub: Any) -> None:
    """Register ``new``, ``build`` and ``demo`` on the ``splicecalc`` sub-parsers."""
    from ..workflow.package import DEFAULT_TEMPLATE, TEMPLATES

    p = sub.add_parser("new", help="start a calc package: copy a template into a project folder",
                       description="Copy a calc template into FOLDER with the project fields in the notebook's "
                                   "title block; the beam_splice template also gets FOLDER/job.toml (copied from "
                                   "--job, or a starter to edit).")
    p.add_argument("template", metavar="TEMPLATE", choices=TEMPLATES, help=" | ".join(TEMPLATES))
    p.add_argument("folder", metavar="FOLDER", help="project folder (created if missing)")
    p.add_argument("--project", default="", help="project name for the title block")
    p.add_argument("--number", default="", help="job number")
    p.add_argument("--title", default="", help="calculation title")
    p.add_argument("--job", metavar="JOB.toml", help=f"job file to copy ({DEFAULT_TEMPLATE} only)")
    p.set_defaults(func=cmd_new)

    p = sub.add_parser("build", help="execute a calc notebook (or a job file) and print its PDF package",
                       description="Execute headless and write PDF, executed notebook (for sign/verify) and "
                                   "the PDF's build record. A .toml job file is built with the "
                                   f"{DEFAULT_TEMPLATE} template. An issued or signed PDF is never overwritten.")
    p.add_argument("source", metavar="NOTEBOOK_OR_JOB", help=".ipynb calc notebook or .toml job file")
    p.add_argument("-o", "--output", metavar="PDF", help="PDF to write (default: the source name with .pdf)")
    p.add_argument("--quiet", action="store_true", help="no progress bars or timings")
    p.add_argument("--timeout", type=float, default=600.0, help="time limit per cell, s (default 600)")
    p.set_defaults(func=cmd_build)

    p = sub.add_parser("demo", help="build the demo calc package (an invented job) end to end",
                       description="Copy the demo job (examples/demo_*.toml) into DIR and build its package there.")
    p.add_argument("--out", default="out", metavar="DIR", help="output folder (default: out)")
    p.add_argument("--quiet", action="store_true", help="no progress bars or timings")
    p.set_defaults(func=cmd_demo)


__all__ = ["add_parsers", "cmd_build", "cmd_demo", "cmd_new"]
