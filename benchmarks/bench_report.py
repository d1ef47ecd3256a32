"""Time the demo calc-package build (the full beam-and-splice package), split into its parts.

    /tmp/venv/bin/python benchmarks/bench_report.py [--repeat 3] [--out DIR]

Parts (seconds, median over the repeats):
* kernel start  - launching the Python kernel until the first cell runs;
* cells         - running the template's cells (imports, checks, handcalcs rendering);
* LaTeX passes  - the XeLaTeX passes (2 or 3) for "Sheet N of M" and the contents;
* own overhead  - everything else: reading/filling the notebook, nbconvert + pandoc
                  export, equation splitting, atomic writes.
"""

from __future__ import annotations

import argparse
import statistics
import sys
import tempfile
from pathlib import Path


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=3, help="number of builds (default 3)")
    ap.add_argument("--out", type=Path, default=None, help="output folder (default: a temporary folder)")
    args = ap.parse_args(argv)
    if args.repeat < 1:
        ap.error("--repeat must be >= 1")

    from splicecalc.workflow.package import build_demo

    rows = []
    with tempfile.TemporaryDirectory(prefix="bench-report-") as td:
        root = args.out or Path(td)
        for i in range(args.repeat):
            r = build_demo(root / f"out{i}", progress=False).report
            rows.append(r)
            print(f"run {i + 1}: total {r.total_s:6.2f} s | kernel {r.kernel_start_s:5.2f} | cells {r.cells_s:5.2f} "
                  f"| LaTeX {r.latex_passes}x {r.latex_s:5.2f} | own {r.overhead_s:5.2f} | {r.pages} sheets",
                  file=sys.stderr)

    def med(attr: str) -> float:
        return statistics.median(getattr(r, attr) for r in rows)

    total = med("total_s")
    print(f"demo calc package ({rows[-1].pages} sheets), median of {len(rows)} builds:")
    for label, attr in (("kernel start", "kernel_start_s"), ("cells", "cells_s"),
                        ("execution (kernel + cells)", "execution_s"), ("LaTeX passes", "latex_s"),
                        ("own overhead", "overhead_s"), ("total", "total_s")):
        v = med(attr)
        print(f"  {label:<28} {v:7.2f} s  {100 * v / total:5.1f} %")
    print(f"  LaTeX passes per build       {rows[-1].latex_passes}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
