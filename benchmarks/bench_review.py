"""Review register speed: `review import` of 50 PDF mark-ups, `review list` (issue targets: < 1 s, < 0.2 s).

Builds the demo package once (or takes ``--pdf`` of a package built before, with its notebook and
job beside it), puts 50 sticky notes on its sheets with pypdf, then times, each in a fresh
process as a user runs them (interpreter start and imports included):

* ``splicecalc review import`` of the 50 mark-ups into an empty register;
* ``splicecalc review list`` of the 50 comments (text and ``--json``).

Run it after the bootstrap has byte-compiled the sources (as an install does): with
PYTHONDONTWRITEBYTECODE set and no .pyc, each new process compiles the modules again.
The in-process time of the import itself (read the PDF, map 50 mark-ups, append 50 events) is
printed beside it.

    .venv/bin/python benchmarks/bench_review.py [--pdf out/demo_workshop_gallery.pdf] [--runs 5]
"""

from __future__ import annotations

import argparse
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path


def _annotate(src: Path, dst: Path, n: int) -> None:
    from pypdf import PdfReader, PdfWriter
    from pypdf.annotations import Text

    w = PdfWriter(clone_from=PdfReader(str(src)))
    pages = len(w.pages)
    for i in range(n):
        page = 2 + (i * 7) % max(pages - 2, 1)
        y = 120 + (i * 53) % 600
        w.add_annotation(page_number=page, annotation=Text(rect=(480, y, 498, y + 18), text=f"query {i}: why?"))
    with open(dst, "wb") as fh:
        w.write(fh)


def _wall(cmd: list[str]) -> float:
    t0 = time.perf_counter()
    subprocess.run(cmd, check=True, capture_output=True)
    return time.perf_counter() - t0


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--pdf", type=Path, help="a built package (notebook and job beside it)")
    ap.add_argument("--runs", type=int, default=5)
    args = ap.parse_args()
    work = Path(tempfile.mkdtemp(prefix="bench-review-"))
    try:
        if args.pdf:
            pdf = args.pdf.resolve()
        else:
            from splicecalc.workflow.package import build_demo

            pdf = build_demo(work / "pkg", progress=False).pdf
        marked = work / "marked.pdf"
        _annotate(pdf, marked, 50)
        cli = [sys.executable, "-m", "splicecalc.cli.main", "review"]
        imports, inproc, lists, lists_json = [], [], [], []
        from splicecalc.review import import_markups, locate

        register = locate(pdf).register.path
        for _ in range(args.runs):
            register.unlink(missing_ok=True)
            imports.append(_wall([*cli, "import", str(pdf), str(marked), "--by", "B. Checker"]))
            lists.append(_wall([*cli, "list", str(pdf)]))
            lists_json.append(_wall([*cli, "list", str(pdf), "--json"]))
            register.unlink()
            t0 = time.perf_counter()
            res = import_markups(pdf, marked, by="B. Checker")
            inproc.append(time.perf_counter() - t0)
            assert len(res.added) == 50
        register.unlink(missing_ok=True)
        med = statistics.median
        print(f"review import of 50 mark-ups, new process: median {med(imports):.3f} s "
              f"(min {min(imports):.3f}, max {max(imports):.3f}); in process {med(inproc) * 1e3:.0f} ms")
        print(f"review list of 50 comments, new process: median {med(lists):.3f} s; --json {med(lists_json):.3f} s")
    finally:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
