"""The ``splicecalc`` command.

Look-ups:   section, sections, bolt, weld
Design:     run
Package:    new, build, demo
Sign-off:   keys, sign, verify, revise, issue

User errors (bad input) print one line to stderr and exit 2; run and build exit 1
when a check fails and 3 when nothing fails but some checks are NOT CHECKED;
verify exits 0 valid, 1 changed or invalid, 3 unsigned.
"""

from __future__ import annotations

import argparse
import json
import sys
from typing import Any, Callable

from ..core.errors import InputError


def _emit(data: dict | list, as_json: bool, text: Callable[[], str]) -> None:
    if as_json:
        print(json.dumps(data, indent=2))
    else:
        print(text())


def _key_values(title: str, d: dict) -> str:
    """A title line, then one indented ``key value`` line per entry (numbers right-aligned)."""
    return "\n".join([title] + [f"  {k:<22} {v:>10.4g}" if isinstance(v, (int, float)) and not isinstance(v, bool)
                                 else f"  {k:<22} {v}" for k, v in d.items()])


# ----------------------------------------------------------------- look-ups
def _cmd_section(args: argparse.Namespace) -> int:
    from ..sections import get_section

    sec = get_section(args.designation)
    d = sec.to_dict()

    def text() -> str:
        lines = [f"{sec.designation}  ({sec.family})"]
        for k, v in d.items():
            if k in ("designation", "family"):
                continue
            lines.append(f"  {k:<24} {v:>12.6g}" if isinstance(v, (int, float)) else f"  {k:<24} {v}")
        return "\n".join(lines)

    _emit(d, args.json, text)
    return 0


def _cmd_sections(args: argparse.Namespace) -> int:
    from ..sections import list_sections

    for opt, v in (("--max-depth", args.max_depth), ("--min-wpl", args.min_wpl)):
        if v is not None and not (v > 0.0 and v < 1e6):
            raise InputError(opt, v, "a number > 0 (mm for --max-depth, cm3 for --min-wpl)")
    fam = args.family.upper() if args.family else None
    if fam and fam not in ("UKB", "UKC", "IPE", "HEA", "HEB"):
        raise InputError("family", args.family, "one of UKB, UKC, IPE, HEA, HEB")
    secs = list_sections(fam)
    if args.max_depth is not None:
        secs = [s for s in secs if s.h <= args.max_depth]
    if args.min_wpl is not None:
        secs = [s for s in secs if s.Wpl_y / 1e3 >= args.min_wpl]
    rows = [s.to_dict() for s in secs]

    def text() -> str:
        head = f"{'designation':<22}{'mass_kg_per_m':>14}{'h_mm':>8}{'b_mm':>8}{'Iy_cm4':>12}{'Wpl_y_cm3':>12}"
        body = [f"{r['designation']:<22}{r['mass_kg_per_m']:>14.1f}{r['h_mm']:>8.1f}{r['b_mm']:>8.1f}"
                f"{r['Iy_cm4']:>12.0f}{r['Wpl_y_cm3']:>12.0f}" for r in rows]
        return "\n".join([head, *body, f"({len(rows)} sections)"])

    _emit(rows, args.json, text)
    return 0


def _cmd_bolt(args: argparse.Namespace) -> int:
    from .lookups import bolt_summary

    d = bolt_summary(args.size, args.bolt_class, friction_class=args.friction_class)

    _emit(d, args.json, lambda: _key_values(f"{args.size.upper()} class {args.bolt_class}", d))
    return 0


def _cmd_weld(args: argparse.Namespace) -> int:
    from .lookups import weld_summary

    d = weld_summary(args.leg, args.grade)

    _emit(d, args.json, lambda: _key_values(f"{args.leg:g} mm fillet weld, {args.grade}", d))
    return 0


def _cmd_schema(args: argparse.Namespace) -> int:
    from ..job.schema import reference_markdown, schema_json_text

    print(schema_json_text() if args.json else reference_markdown(), end="" if args.json else "\n")
    return 0


#: the commands that live in their own modules: (module under splicecalc.cli, its registering function).
#: Imported plainly: a module that fails to import is an error to see, never a command that quietly
#: disappears from the CLI.
_COMMAND_MODULES: tuple[tuple[str, str], ...] = (
    ("review", "add_parser"), ("compare", "add_parser"), ("batch", "add_parser"),
    ("package", "add_parsers"), ("package", "add_signoff_parsers"),
)


def _register(sub: Any, module: str, attr: str) -> None:
    import importlib

    getattr(importlib.import_module(f"splicecalc.cli.{module}"), attr)(sub)


class _Parser(argparse.ArgumentParser):
    """argparse with one-line errors (``splicecalc: error: ...``, exit 2) like every other error."""

    def error(self, message: str) -> Any:  # type: ignore[override]
        self.exit(2, f"splicecalc: error: {' '.join(message.split())} (see: {self.prog} --help)\n")


def build_parser() -> argparse.ArgumentParser:
    p = _Parser(prog="splicecalc", description="Design a new steel beam delivered in pieces and spliced on site "
                "(EN 1990, EN 1993-1-1/-1-5/-1-8, UK NA), check the existing steel it hangs on, and build, sign "
                "and review its calc package. A design aid: every result is to be checked by a competent "
                "engineer. 'splicecalc COMMAND --help' explains each command.")
    sub = p.add_subparsers(dest="command", required=True)

    s = sub.add_parser("section", help="properties of one catalogue section")
    s.add_argument("designation", help='e.g. "533x210x92 UKB", "IPE300"')
    s.add_argument("--json", action="store_true")
    s.set_defaults(func=_cmd_section)

    s = sub.add_parser("sections", help="list or filter a section family")
    s.add_argument("family", nargs="?", help="UKB, UKC, IPE, HEA or HEB (all when omitted)")
    s.add_argument("--max-depth", type=float, help="maximum depth h in mm")
    s.add_argument("--min-wpl", type=float, help="minimum Wpl,y in cm3")
    s.add_argument("--json", action="store_true")
    s.set_defaults(func=_cmd_sections)

    s = sub.add_parser("bolt", help="resistances of one bolt (EN 1993-1-8)")
    s.add_argument("size", help="M12 ... M36")
    s.add_argument("--class", dest="bolt_class", default="8.8", help="4.6, 8.8 or 10.9 (default 8.8)")
    s.add_argument("--friction-class", default="A", help="slip surface class A-D for slip per plane")
    s.add_argument("--json", action="store_true")
    s.set_defaults(func=_cmd_bolt)

    s = sub.add_parser("weld", help="fillet weld design resistance per mm (simplified method)")
    s.add_argument("leg", type=float, help="leg length in mm")
    s.add_argument("--grade", default="S275", help="parent steel grade (default S275)")
    s.add_argument("--json", action="store_true")
    s.set_defaults(func=_cmd_weld)

    _register(sub, "run", "add_parser")

    s = sub.add_parser("schema", help="the job-file reference (Markdown) or, with --json, its JSON Schema",
                       description="Every table and key a job file may hold. --json prints the JSON Schema an "
                                   "editor can use to validate and complete job files (also in docs/).")
    s.add_argument("--json", action="store_true", help="print the JSON Schema")
    s.set_defaults(func=_cmd_schema)

    for module, attr in _COMMAND_MODULES:
        _register(sub, module, attr)
    return p


#: set to 1 to see the Python traceback of an unexpected error (for a bug report)
DEBUG_ENV = "SPLICECALC_DEBUG"


def _error(msg: str, code: int) -> int:
    print(f"splicecalc: error: {' '.join(str(msg).split())}", file=sys.stderr)
    return code


def _is_unreadable_file(e: BaseException) -> bool:
    """A malformed input file seen by a reader library (nbformat, json, jsonschema, pypdf ...)."""
    mod = type(e).__module__.split(".")[0]
    return isinstance(e, (UnicodeDecodeError, json.JSONDecodeError)) or mod in (
        "nbformat", "jsonschema", "fastjsonschema", "pypdf", "pyhanko", "asn1crypto")


#: optional modules that a library the CLI loads imports if they are installed, that no command uses,
#: and whose import is costly: jsonschema (loaded by nbformat) imports ``rfc3987_syntax`` for its
#: "iri" format check, which builds a grammar for ~2 s; nbformat's schemas have no "format" check.
#: The ``splicecalc`` process marks them absent (Python's documented ``sys.modules[name] = None``),
#: as the library already allows (it catches the ImportError); a program that imports splicecalc
#: keeps its own modules as they are.
UNUSED_OPTIONAL_MODULES = ("rfc3987_syntax",)


def lean_process() -> None:
    """Mark :data:`UNUSED_OPTIONAL_MODULES` absent in this process (the ``splicecalc`` command's own)."""
    for name in UNUSED_OPTIONAL_MODULES:
        if name not in sys.modules:
            sys.modules[name] = None   # type: ignore[assignment]  # import raises ModuleNotFoundError


def main(argv: list[str] | None = None) -> int:
    """Run one command. Every failure is one line on stderr, never a traceback:
    2 bad input (InputError, a calculation that cannot be made from the inputs, a file that
    cannot be read or written: the message names the path and what to do), 130 interrupted,
    1 an unexpected error (one line; ``SPLICECALC_DEBUG=1`` shows the traceback), 141 quietly
    when the reader of the output stops reading (a pipe into ``head``)."""
    import os

    from ..core.errors import file_error_message

    lean_process()
    parser = build_parser()
    args = parser.parse_args(argv)
    try:
        return int(args.func(args) or 0)
    except InputError as e:
        return _error(str(e), 2)
    except KeyboardInterrupt:
        return 130
    except RecursionError:
        return _error("the input is nested too deeply to read (tables or arrays inside each other); "
                      "write the job file with at most a few levels of nesting", 2)
    except MemoryError:
        return _error("out of memory reading or running the input; check the job file is the one meant "
                      "(job files are a few kB)", 2)
    except BrokenPipeError:
        # the reader stopped reading (``splicecalc sections | head``): not an error, say nothing;
        # stdout goes to devnull so the interpreter's final flush does not complain either
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
        return 141                                   # 128 + SIGPIPE, as a shell reports it
    except OSError as e:
        if os.environ.get(DEBUG_ENV):
            raise
        return _error(file_error_message(e, "read or write"), 2)
    except ModuleNotFoundError as e:
        if os.environ.get(DEBUG_ENV):
            raise
        return _error(f"the Python package '{e.name}' that this command needs is not installed: reinstall "
                      "splicecalc with its dependencies (pip install --upgrade splicecalc, or in a checkout: "
                      "bash scripts/bootstrap.sh)", 1)
    except Exception as e:  # noqa: BLE001 - the last line of defence: one line, never a traceback
        if os.environ.get(DEBUG_ENV):
            raise
        from ..workflow.errors import CalcError

        if isinstance(e, CalcError):
            return _error(str(e), 2)
        if _is_unreadable_file(e):
            return _error(f"a file given cannot be read as a notebook, JSON or PDF: {type(e).__name__}: "
                          f"{str(e)[:300]} (check the path is the file meant, unchanged since it was written)", 2)
        where = type(e).__module__.split(".")[0]
        return _error(f"unexpected {type(e).__name__}: {e} (in {where}; please report it with the "
                      f"job file; run with {DEBUG_ENV}=1 to see the details)", 1)


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
