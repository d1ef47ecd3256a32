"""``splicecalc run JOB.toml [--json]``: the whole job, as the calc package computes it.

One code path: :func:`splicecalc.workflow.run_calc` (``render=False``, plain floats), the
function the calc notebook calls, then :func:`splicecalc.workflow.parts.job_parts` to group
its records: the beam member, the splice positions, each splice, each end connection,
each existing member. The text output is one table per part headed by its governing
check; ``--json`` prints :func:`~splicecalc.workflow.parts.whole_job_dict` (every record
with unit-tagged keys).

Exit codes: 0 every check within capacity; 1 any check exceeds it (a result, not an
error); 2 bad input or a job that cannot be designed (one line on stderr); 3 no check exceeds
capacity but some are NOT CHECKED (listed: a gap is never reported as a pass).
"""

from __future__ import annotations

import argparse
import json
import math
import shutil
import sys
import textwrap
from typing import Any

from ..core.errors import EXIT_NOT_CHECKED, InputError

#: verdict words of a part and of the whole job (our wording)
WITHIN = "within capacity"
OVER = "EXCEEDS capacity"
GAP = "NOT CHECKED"


def add_parser(subparsers: Any) -> argparse.ArgumentParser:
    """Register the ``run`` sub-command on an ``argparse`` sub-parsers object."""
    p = subparsers.add_parser(
        "run", help="design the whole job: beam, splice positions, splices, end connections, existing members",
        description="Run every check of a job file, exactly as its calc package computes them: the beam "
                    "(EN 1990 combinations, EN 1993-1-1 / 1-5), where it is cut, each splice and each end "
                    "connection (EN 1993-1-8) and the existing members. Exit 0: every check within "
                    "capacity; 1: a check exceeds it; 2: bad input; 3: nothing exceeds capacity but some "
                    "checks are NOT CHECKED (listed: each needs information or a separate check). `build` "
                    "exits the same way.")
    p.add_argument("job", metavar="JOB.toml", help="job file")
    p.add_argument("--json", action="store_true", help="print the whole job and every check record as JSON")
    p.set_defaults(func=run_command)
    return p


def _num(v: float) -> str:
    if not math.isfinite(v):
        return "-"
    a = abs(v)
    if a >= 1e5:
        return f"{v:.4g}"
    if a >= 100:
        return f"{v:.1f}"
    return f"{v:.2f}" if a >= 1 or a == 0 else f"{v:.3f}"


def _u(u: float) -> str:
    return f"{u:.2f}" if math.isfinite(u) else "inf"


def _status(part: Any) -> str:
    """Within / exceeds capacity over the checks made, with the NOT CHECKED count when there are gaps."""
    over = any(r.checked and not r.ok for r in part.records)
    gaps = sum(not r.checked for r in part.records)
    return (OVER if over else WITHIN) + (f", {gaps} {GAP}" if gaps else "")


def part_table(part: Any, width: int = 110) -> list[str]:
    """The lines of one part: a heading with its governing check, then one row per check."""
    g = part.governing
    head = f"{part.title}"
    if g is not None:
        head += f"\n  governing: {part.short_title(g)}   u = {_u(g.utilisation)}   " \
                f"{_status(part)}"
    else:
        head += "\n  no checks"
    lines = [head]
    if not part.records:
        return lines
    rows = [(part.short_title(r), _num(r.demand), _num(r.resistance), r.unit,
             _u(r.utilisation) if r.is_check else "-", ("" if r.ok else "OVER") if r.is_check else "INFO",
             r.clause) if r.checked else
            (part.short_title(r), "-", "-", "", "-", "GAP", f"{GAP}: {r.clause}") for r in part.records]
    w_e = max(3, *(len(r[1]) for r in rows))
    w_r = max(3, *(len(r[2]) for r in rows))
    w_unit = max(4, *(len(r[3]) for r in rows))
    fixed = 2 + w_e + 2 + w_r + 1 + w_unit + 2 + 5 + 1 + 4 + 2
    rest = max(30, width - fixed)
    w_t = min(max(len(r[0]) for r in rows), max(24, rest * 5 // 9))
    w_c = max(12, rest - w_t - 2)
    lines.append(f"  {'check':<{w_t}}  {'E_d':>{w_e}} {'R_d':>{w_r}} {'unit':<{w_unit}}  {'u':>5} {'':<4}  clause")
    blank = f"  {'':<{w_t}}  {'':>{w_e}} {'':>{w_r}} {'':<{w_unit}}  {'':>5} {'':<4}  "
    for t, e, r, unit, u, flag, cl in rows:
        tw = textwrap.wrap(t, w_t) or [""]
        cw = textwrap.wrap(cl, w_c) or [""]
        lines.append(f"  {tw[0]:<{w_t}}  {e:>{w_e}} {r:>{w_r}} {unit:<{w_unit}}  {u:>5} {flag:<4}  {cw[0]}")
        for i in range(1, max(len(tw), len(cw))):
            a = tw[i] if i < len(tw) else ""
            b = cw[i] if i < len(cw) else ""
            lines.append((f"    {a:<{w_t - 2}}" + blank[2 + w_t:] + b).rstrip())
    return lines


def summary_text(result: Any, source: str = "") -> str:
    """The text printed by ``splicecalc run``: the job, then one table per part."""
    from ..workflow.parts import job_parts

    job = result.job
    p = job.project
    head = " - ".join(t for t in (p.number, p.title) if t) or "splicecalc job"
    width = max(90, min(140, shutil.get_terminal_size((110, 24)).columns))
    lines = [head + (f"   ({source})" if source else ""), result.headline + "."]
    passed = getattr(result.design, "passed_over", ())
    if passed:
        lines.append("Section search: lighter sections that pass the member checks, passed over:")
        lines += [f"  {p.line()}" for p in passed]
    parts = job_parts(result)
    for part in parts:
        lines.append("")
        lines += part_table(part, width)
    recs = result.records
    bad = [r for r in recs if r.checked and not r.ok]
    gaps = [r for r in recs if not r.checked]
    gov = result.governing
    lines.append("")
    lines.append("By part (highest utilisation of each):")
    wk = max(len(pt.key) for pt in parts)
    for pt in parts:
        g = pt.governing
        if g is None:
            lines.append(f"  {pt.key:<{wk}}      -  no checks")
            continue
        lines.append(f"  {pt.key:<{wk}}  u = {_u(g.utilisation):>5}  {_status(pt):<16}  "
                     f"{pt.short_title(g)}")
    lines.append("")
    if gov is not None:
        if bad:
            lines.append(f"{len(bad)} of {len(recs)} checks {OVER}:")
            lines += [f"  {r.title}  u = {_u(r.utilisation)}  ({r.clause})" for r in bad]
        elif not gaps:
            lines.append(f"All {len(recs)} checks {WITHIN}; highest utilisation {_u(gov.utilisation)}:")
            lines.append(f"  {gov.title} ({gov.clause})")
        else:
            lines.append(f"The {len(recs) - len(gaps)} checks made are {WITHIN} (highest utilisation "
                         f"{_u(gov.utilisation)}, {gov.title}), but this is NOT a pass:")
    if gaps:
        lines.append(f"{len(gaps)} check(s) {GAP} (each needs information or a separate check):")
        lines += [f"  {r.title}: {r.note}" for r in gaps]
    for n in job.notes:
        lines.append(f"Note: {n}")
    lines.append("Design aid only: every result is to be checked by a competent engineer under the codes in "
                 "force at the site.")
    return "\n".join(lines)


def beam_dict(design: Any, source: str = "") -> dict[str, Any]:
    """JSON-ready result of the beam design alone (:class:`~splicecalc.design.beam.BeamDesign`)."""
    d: dict[str, Any] = {"job_file": source, "project": {k: v for k, v in vars(design.job.project).items() if v}}
    d.update(design.to_dict())
    if design.job.notes:
        d["notes"] = list(design.job.notes)
    return d


def result_dict(result: Any, source: str = "") -> dict[str, Any]:
    """JSON-ready output of ``splicecalc run --json`` (the whole job)."""
    from ..workflow.parts import whole_job_dict

    return whole_job_dict(result, source)


def run_command(args: argparse.Namespace) -> int:
    """Run the whole job of ``args.job``; print the parts (or JSON with ``args.json``).

    Returns 0 when every check is within capacity, 1 when any exceeds it, 2 on bad input,
    3 when none exceeds it but some are NOT CHECKED.
    """
    from ..job import load_job
    from ..workflow import run_calc
    from ..workflow.errors import CalcError

    try:
        job = load_job(args.job)
        result = run_calc(job, render=False)
    except (InputError, CalcError) as err:
        print(f"splicecalc: error: {err}", file=sys.stderr)
        return 2
    if getattr(args, "json", False):
        print(json.dumps(result_dict(result, str(args.job)), indent=2))
    else:
        print(summary_text(result, str(args.job)))
    if any(r.checked and not r.ok for r in result.records):
        return 1
    return EXIT_NOT_CHECKED if any(not r.checked for r in result.records) else 0


__all__ = ["beam_dict", "add_parser", "part_table", "run_command", "summary_text", "result_dict", "WITHIN", "OVER"]
