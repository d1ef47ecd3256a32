"""Benchmark: ``splicecalc run`` on the demo job, the whole job on plain floats.

Times
* ``run_calc(job, render=False)`` in process: beam search, splice positions, two splices,
  two end connections, the existing members (what ``run`` computes), median of 7 runs, each
  with the remembered splice searches forgotten first;
* the named alternative measured in the same run: ``run_calc(job, render=True)``, the same
  function as the calc notebook calls it (every step rendered by handcalcs; the in-process
  memo of renders forgotten too), and the ratio;
* ``splicecalc run demo.toml --json`` end to end in a new Python process (interpreter start,
  imports, job file, JSON), median of 5.

Run:  .venv/bin/python benchmarks/bench_run.py
"""

from __future__ import annotations

import statistics
import subprocess
import sys
import time
from pathlib import Path

from splicecalc.core import render as _render_mod
from splicecalc.design import splice_layout
from splicecalc.job import load_job
from splicecalc.workflow import run_calc

DEMO = Path(__file__).resolve().parents[1] / "examples" / "demo_workshop_gallery.toml"


def _forget() -> None:
    splice_layout._SEARCHES.clear()
    _render_mod._RENDERED.clear()


def timed(fn, n: int = 7) -> tuple[float, float]:
    fn()
    ts = []
    for _ in range(n):
        _forget()
        t = time.perf_counter()
        fn()
        ts.append(time.perf_counter() - t)
    return statistics.median(ts), max(ts)


def main() -> None:
    job = load_job(DEMO)
    res = run_calc(job, render=False)
    print(f"demo job: {len(res.records)} checks, {len(res.splices)} splices, {len(res.connections)} end connections")
    f_med, f_max = timed(lambda: run_calc(job, render=False))
    r_med, r_max = timed(lambda: run_calc(job, render=True), n=5)
    print(f"{'run_calc, plain floats (splicecalc run)':<52} median {f_med * 1e3:7.0f} ms  worst {f_max * 1e3:7.0f} ms")
    print(f"{'run_calc, rendered (the calc notebook)':<52} median {r_med * 1e3:7.0f} ms  worst {r_max * 1e3:7.0f} ms")
    print(f"{'ratio rendered / plain floats':<52} {r_med / f_med:7.1f}x")
    ts = []
    for _ in range(5):
        t = time.perf_counter()
        p = subprocess.run([sys.executable, "-m", "splicecalc.cli.main", "run", str(DEMO), "--json"],
                           capture_output=True, text=True)
        ts.append(time.perf_counter() - t)
        assert p.returncode in (0, 1, 3), p.stderr      # 3: the demo has NOT CHECKED items (no pass)
    print(f"{'splicecalc run demo --json, new process':<52} median {statistics.median(ts) * 1e3:7.0f} ms  "
          f"worst {max(ts) * 1e3:7.0f} ms  (target < 1 s)")


if __name__ == "__main__":
    main()
