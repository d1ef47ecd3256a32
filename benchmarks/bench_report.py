"""The demo calc package build against the stock nbconvert route, side by side in one run.

    .venv/bin/python benchmarks/bench_report.py [--rounds 3] [--out DIR] [--no-stock]

Routes, each a fresh process timed from outside (interpreter start, imports, every write):

* **ours, fresh**   - ``splicecalc build JOB.toml -o demo.pdf --fresh`` with no earlier build in the
  folder (no PDF, executed notebook, build record or ``.build/`` seed: nothing from a previous build
  of the job), in a child Python set up as the ``splicecalc`` command sets up its process
  (``cli.main.lean_process``) that runs ``workflow.package.build_package`` and prints its timings;
* **ours, rebuild** - the same build again, unchanged job: the executed notebook is up to date, so
  no cell runs (report.uptodate: "cells up to date, not executed"), and the XeLaTeX passes are
  seeded with the previous build's .aux/.toc/.out (report.compile), as after signing or a revision
  that keeps the pages;
* **stock**         - ``jupyter nbconvert --to Calc_package_PDF --execute`` of the same notebook (the one our
  build writes from the job, its job file beside it, the kernel headless like ours): nbconvert's own
  command line and ExecutePreprocessor with our exporter (entry point ``Calc_package_PDF``), so the same
  LaTeX, with XeLaTeX passes from nothing (no seed: the CLI keeps no build folder) and none of our
  build's own arrangements (kernel launched first, pandoc started beside the cells, the contents list
  predicted before the first pass: ``--CalcPackageExporter.predict_contents=False``, so three passes
  for the demo, as nbconvert's own PDFExporter runs, ``latex_count`` = 3).
  ``--to pdf`` (nbconvert's own template) cannot typeset this notebook any more: its check tables are
  ``text/latex`` using macros of our template. ``--stock-exporter pdf`` tries it all the same (needs
  ``ulem.sty``, Debian: texlive-plain-generic).

Each round runs ours-fresh, stock, ours-rebuild in turn, so the machine's load is shared; the ratios
are taken within a round (ours / stock) and the medians printed, for the wall time and for the CPU
time of each process tree (user + system of the process and every process it waited for: kernel,
XeLaTeX, pandoc), which a machine shared with other work disturbs much less than the wall time. The
1-minute load average before each round is printed beside it. Our builds are split into kernel
start, cells, XeLaTeX passes and ours (the wall time less those three: process start, imports,
job reading, nbconvert/pandoc export, writes). Goals (issue 14): fresh <= 0.7, rebuild <= 0.4.
Nothing is cached between builds but the executed notebook and the XeLaTeX seed, both beside the
PDF and both removed before each fresh build.
"""

from __future__ import annotations

import argparse
import json
import os
import resource
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]

_OURS = """
import json, sys
from splicecalc.cli.main import lean_process
lean_process()                                  # as the splicecalc command does
from splicecalc.workflow.package import build_package
r = build_package(sys.argv[1], sys.argv[2], progress=False, fresh=sys.argv[3] == "fresh").report
print(json.dumps(dict(kernel_start_s=r.kernel_start_s, cells_s=r.cells_s, latex_s=r.latex_s,
                      latex_passes=r.latex_passes, seeded=r.latex_seeded, pages=r.pages,
                      reused=bool(r.cells_reused))))
"""


def _cpu() -> float:
    """CPU seconds (user + system) of the finished child processes and all they waited for."""
    r = resource.getrusage(resource.RUSAGE_CHILDREN)
    return r.ru_utime + r.ru_stime


def ours(job: Path, pdf: Path, fresh: bool) -> dict:
    if fresh:
        shutil.rmtree(pdf.parent / ".build", ignore_errors=True)
        for p in (pdf, pdf.with_suffix(".ipynb"), Path(str(pdf) + ".json")):
            p.unlink(missing_ok=True)
    c0, t0 = _cpu(), time.perf_counter()
    proc = subprocess.run([sys.executable, "-c", _OURS, str(job), str(pdf), "fresh" if fresh else "again"],
                          capture_output=True, text=True)
    wall, cpu = time.perf_counter() - t0, _cpu() - c0
    if proc.returncode != 0:
        raise SystemExit(f"splicecalc build failed:\n{proc.stderr[-2000:]}")
    r = json.loads(proc.stdout.strip().splitlines()[-1])
    r["wall_s"], r["cpu_s"] = wall, cpu
    r["ours_s"] = wall - r["kernel_start_s"] - r["cells_s"] - r["latex_s"]
    return r


def stock(notebook: Path, exporter: str = "Calc_package_PDF") -> dict:
    jupyter = Path(sys.executable).with_name("jupyter")
    out = notebook.with_name(notebook.stem + "_stock")
    env = {**os.environ, "SPLICECALC_HEADLESS": "1"}
    c0, t0 = _cpu(), time.perf_counter()
    # XeLaTeX as nbconvert's own PDFExporter runs it for this package: three passes from nothing
    # (its latex_count), i.e. without our predicted contents list (report.compile.predicted_toc)
    plain = ["--CalcPackageExporter.predict_contents=False"] if exporter == "Calc_package_PDF" else []
    proc = subprocess.run([str(jupyter), "nbconvert", "--to", exporter, "--execute", str(notebook),
                           "--output", out.name, *plain], capture_output=True, text=True, env=env, cwd=notebook.parent)
    wall, cpu = time.perf_counter() - t0, _cpu() - c0
    if proc.returncode != 0:
        raise SystemExit(f"the stock route (nbconvert --to {exporter}) failed:\n{proc.stderr[-2000:]}")
    pages = subprocess.run(["pdfinfo", str(out.with_suffix(".pdf"))], capture_output=True, text=True).stdout
    n = next((int(line.split()[-1]) for line in pages.splitlines() if line.startswith("Pages:")), 0)
    return {"wall_s": wall, "cpu_s": cpu, "pages": n}


def _fmt(r: dict) -> str:
    return (f"{r['wall_s']:5.1f} s, CPU {r['cpu_s']:5.1f} s  (kernel {r['kernel_start_s']:.1f}, cells {r['cells_s']:.1f}, "
            f"XeLaTeX {r['latex_passes']} pass{'es' if r['latex_passes'] != 1 else ''} {r['latex_s']:.1f}"
            f"{' seeded' if r['seeded'] else ''}, ours {r['ours_s']:.1f}; {r['pages']} sheets"
            f"{'; cells up to date, not executed' if r.get('reused') else ''})")


def _range(xs: list[float], fmt: str = "{:.2f}") -> str:
    return f"{fmt.format(statistics.median(xs))} (range {fmt.format(min(xs))}-{fmt.format(max(xs))})"


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--rounds", type=int, default=3)
    ap.add_argument("--out", type=Path, default=None)
    ap.add_argument("--no-stock", action="store_true", help="time our builds only")
    ap.add_argument("--stock-exporter", default="Calc_package_PDF",
                    help="nbconvert exporter of the stock route (default Calc_package_PDF; 'pdf' = nbconvert's template)")
    args = ap.parse_args()
    sys.path.insert(0, str(ROOT))
    from splicecalc.workflow.package import demo_job_path, notebook_for_job

    work = args.out or Path(tempfile.mkdtemp(prefix="bench-report-"))
    work.mkdir(parents=True, exist_ok=True)
    job = work / demo_job_path().name
    shutil.copyfile(demo_job_path(), job)
    pdf = work / "ours" / "demo.pdf"
    pdf.parent.mkdir(exist_ok=True)
    shutil.copyfile(job, pdf.parent / job.name)
    notebook = notebook_for_job(job, work / "stock.ipynb")     # the notebook our build runs, for the stock route

    rows: list[tuple[dict, dict | None, dict]] = []
    loads: list[float] = []
    for i in range(1, args.rounds + 1):
        loads.append(os.getloadavg()[0])
        fresh = ours(pdf.parent / job.name, pdf, fresh=True)
        base = None if args.no_stock else stock(notebook, args.stock_exporter)
        again = ours(pdf.parent / job.name, pdf, fresh=False)
        rows.append((fresh, base, again))
        print(f"round {i} (load {loads[-1]:.1f}): ours fresh   {_fmt(fresh)}")
        if base is not None:
            print(f"         stock         {base['wall_s']:5.1f} s, CPU {base['cpu_s']:5.1f} s  "
                  f"({base['pages']} pages, nbconvert --to {args.stock_exporter} --execute)")
        print(f"         ours rebuild {_fmt(again)}")
        if base is not None:
            print(f"         ratio fresh {fresh['wall_s'] / base['wall_s']:.2f} (CPU "
                  f"{fresh['cpu_s'] / base['cpu_s']:.2f}), rebuild {again['wall_s'] / base['wall_s']:.2f} "
                  f"(CPU {again['cpu_s'] / base['cpu_s']:.2f})")
    print(f"\nmedians over {args.rounds} rounds (1-minute load before the rounds: "
          f"{', '.join(f'{x:.1f}' for x in loads)})")
    for name, k in (("ours fresh", 0), ("ours rebuild", 2)):
        rs = [r[k] for r in rows]
        print(f"  {name:<13} wall {_range([r['wall_s'] for r in rs], '{:.1f}')} s, CPU "
              f"{_range([r['cpu_s'] for r in rs], '{:.1f}')} s; kernel start "
              f"{statistics.median(r['kernel_start_s'] for r in rs):.2f} s, cells "
              f"{statistics.median(r['cells_s'] for r in rs):.2f} s, XeLaTeX "
              f"{statistics.median(r['latex_s'] for r in rs):.2f} s "
              f"({statistics.median(r['latex_passes'] for r in rs):g} passes), ours "
              f"{statistics.median(r['ours_s'] for r in rs):.2f} s")
    if not args.no_stock:
        print(f"  {'stock':<13} wall {_range([r[1]['wall_s'] for r in rows], '{:.1f}')} s, CPU "
              f"{_range([r[1]['cpu_s'] for r in rows], '{:.1f}')} s")
        for name, k, goal in (("fresh", 0, 0.7), ("rebuild", 2, 0.4)):
            print(f"  ratio {name + ' / stock':<15} wall {_range([r[k]['wall_s'] / r[1]['wall_s'] for r in rows])}, "
                  f"CPU {_range([r[k]['cpu_s'] / r[1]['cpu_s'] for r in rows])}   goal <= {goal}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
