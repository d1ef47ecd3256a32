"""`splicecalc compare OLD NEW` speed (issue 15 target: < 1 s), in a new process as a checker runs it.

Two revisions of the demo job (the second with the gallery's imposed UDL 20 % heavier) are run on
plain floats and written as notebooks the way the package publishes them (job inputs, every
check record, the summary by part), or ``--old`` / ``--new`` name two notebooks built before
(``splicecalc build``; larger, with their figures). Timed, each in a fresh process (interpreter
start and imports included):

* ``splicecalc compare OLD NEW`` (text) and ``--json``;
* the alternative a checker has without it: ``splicecalc run JOB --json`` of both revisions' job
  files (the results again, to be compared by eye), measured in the same session.

The in-process time of ``compare_revisions`` on the loaded notebooks is printed beside it.

    .venv/bin/python benchmarks/bench_compare.py [--runs 7] [--old A.ipynb --new B.ipynb]
"""

from __future__ import annotations

import argparse
import json
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_workshop_gallery.toml"


def _notebook(job_path: Path) -> dict:
    """A notebook as the package publishes it, from a plain-float run of ``job_path``."""
    from splicecalc.job import load_job
    from splicecalc.report.display import check_payload
    from splicecalc.signoff.digest import CHECK_MIME, JOB_MIME
    from splicecalc.workflow import run_calc
    from splicecalc.workflow.display import parts_table

    r = run_calc(load_job(job_path), render=False)
    outs = [{JOB_MIME: r.job.to_canonical_dict()}] + [{CHECK_MIME: check_payload(x)} for x in r.summary_records]
    outs.append(parts_table(r)._repr_mimebundle_())
    return {"nbformat": 4, "nbformat_minor": 5, "metadata": {},
            "cells": [{"cell_type": "code", "execution_count": 1, "metadata": {}, "source": "",
                       "outputs": [{"output_type": "display_data", "metadata": {}, "data": d} for d in outs]}]}


def _wall(cmd: list[str], ok: tuple[int, ...] = (0, 1)) -> float:
    t0 = time.perf_counter()
    p = subprocess.run(cmd, capture_output=True)
    dt = time.perf_counter() - t0
    if p.returncode not in ok:
        raise SystemExit(f"{' '.join(cmd)} exited {p.returncode}: {p.stderr.decode()[-400:]}")
    return dt


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--runs", type=int, default=7)
    ap.add_argument("--old", type=Path, help="a built notebook (with --new)")
    ap.add_argument("--new", type=Path, help="a built notebook (with --old)")
    args = ap.parse_args()
    work = Path(tempfile.mkdtemp(prefix="bench-compare-"))
    try:
        jobs = [work / "gallery.toml", work / "gallery_P2.toml"]
        src = DEMO.read_text(encoding="utf-8")
        jobs[0].write_text(src, encoding="utf-8")
        jobs[1].write_text(src.replace('udl = "7.5 kN/m"', 'udl = "9 kN/m"'), encoding="utf-8")
        if args.old and args.new:
            old, new = args.old.resolve(), args.new.resolve()
        else:
            old, new = work / "gallery.ipynb", work / "gallery_P2.ipynb"
            for job, nb in zip(jobs, (old, new)):
                nb.write_text(json.dumps(_notebook(job)), encoding="utf-8")
        from splicecalc.review.compare import compare_revisions

        cli = [sys.executable, "-m", "splicecalc.cli.main"]
        text, as_json, alt, inproc = [], [], [], []
        for _ in range(args.runs):                       # interleaved: the VM's load hits all alike
            text.append(_wall([*cli, "compare", str(old), str(new)]))
            as_json.append(_wall([*cli, "compare", str(old), str(new), "--json"]))
            alt.append(sum(_wall([*cli, "run", str(j), "--json"], ok=(0, 1, 3)) for j in jobs))
            t0 = time.perf_counter()
            a, b = (json.loads(p.read_text(encoding="utf-8")) for p in (old, new))
            c = compare_revisions(a, b)
            inproc.append(time.perf_counter() - t0)
        med = statistics.median
        size = (old.stat().st_size + new.stat().st_size) / 2 / 1e3
        print(f"notebooks: {old.name}, {new.name} (~{size:.0f} kB each); {len(c['moved_checks'])} moved, "
              f"{len(c['changed_inputs'])} input(s) changed")
        print(f"compare, new process: median {med(text):.3f} s (min {min(text):.3f}, max {max(text):.3f}); "
              f"--json {med(as_json):.3f} s; in process (read both + compare) {med(inproc) * 1e3:.0f} ms")
        print(f"alternative, `run --json` of both job files (new processes): median {med(alt):.3f} s; "
              f"compare / alternative = {med(text) / med(alt):.2f}")
    finally:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
