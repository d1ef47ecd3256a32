"""Benchmark: ``splicecalc batch`` on a schedule of 20 demo-sized beams (design only).

The schedule: the demo job (examples/demo_workshop_gallery.toml) as [defaults], 20 beams
with spans from 8.4 m to 9.6 m and imposed loads from 6.5 to 8.0 kN/m (each beam distinct,
so no beam reuses another's remembered splice search). Times, in one run:

* the named alternative: each beam designed alone, one after the other in this process, by
  the same function the pool runs (``workflow.batch.design_one``: ``run_calc(render=False)``,
  what ``splicecalc run`` does), the in-process memos forgotten before each, summed;
* ``run_beams`` with a process pool of one worker per core (the parent's memos forgotten
  first), wall time; the ratio pool / sum (target <= 0.6 on 2 cores);
* end to end: ``splicecalc batch SCHEDULE --quiet`` in a new process vs 20 ``splicecalc run``
  processes one after the other (what a user would do without a schedule).

``--pdf N`` also builds the packages of the first N beams, in interleaved rounds (``--pdf-rounds``):
the N ``build_package`` calls one after the other (the alternative) and the ``--pdf`` pool; wall and
CPU of each (slow: about 10-30 s a package).

Run:  .venv/bin/python benchmarks/bench_batch.py [--rounds 3] [--pdf 4 [--pdf-rounds 2] [--pdf-only]]
"""

from __future__ import annotations

import argparse
import os
import resource
import statistics
import subprocess
import sys
import tempfile
import time
import tomllib
from pathlib import Path

from splicecalc.core import render as _render_mod
from splicecalc.design import splice_layout
from splicecalc.job.loader import dumps_toml
from splicecalc.workflow import batch as B

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "demo_workshop_gallery.toml"
N_BEAMS = 20


def _forget() -> None:
    splice_layout._SEARCHES.clear()
    _render_mod._RENDERED.clear()


def schedule_text(n: int = N_BEAMS) -> str:
    demo = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    doc: dict = {"schedule": {"title": f"{n} demo-sized gallery beams (benchmark)"}, "defaults": demo, "beam": {}}
    for i in range(n):
        span = 8.4 + 1.2 * i / (n - 1)
        q = 6.5 + 1.5 * ((i * 7) % n) / (n - 1)
        loads = [dict(t) for t in demo["load"]]
        loads[1]["udl"] = f"{q:.2f} kN/m"
        doc["beam"][f"B{i + 1:02d}"] = {"beam": {"span": f"{span:.3f} m",
                                                 "restraints": [f"{span / 3:.3f} m", f"{2 * span / 3:.3f} m"]},
                                        "load": loads}
    return dumps_toml(doc)


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--rounds", type=int, default=3)
    ap.add_argument("--pdf", type=int, default=0, help="also time the packages of the first N beams")
    ap.add_argument("--pdf-rounds", type=int, default=2, help="interleaved rounds of the --pdf timing")
    ap.add_argument("--pdf-only", action="store_true", help="only the --pdf timing")
    args = ap.parse_args()
    workers = B.default_workers()
    with tempfile.TemporaryDirectory() as tmp:
        sched = Path(tmp) / "bench_schedule.toml"
        sched.write_text(schedule_text(), encoding="utf-8")
        s = B.read_schedule(sched)
        assert all(b.ok for b in s.beams), [b.error for b in s.beams if not b.ok]
        if args.pdf_only:
            pdf_rounds(s, args.pdf, args.pdf_rounds, workers, Path(tmp))
            return
        B.design_one(s.beams[0].name, s.beams[0].text)           # imports and catalogue warm, as in a worker
        print(f"{len(s.beams)} beams, {workers} worker(s) (os.cpu_count() = {os.cpu_count()}), "
              f"load average {os.getloadavg()[0]:.1f}")
        ratios, sums, walls, cpu_ratios = [], [], [], []
        for r in range(args.rounds):
            total = 0.0
            c0 = time.process_time()
            for b in s.beams:
                _forget()
                t = time.perf_counter()
                row = B.design_one(b.name, b.text)
                total += time.perf_counter() - t
                assert row["outcome"] != "error", row["status"]
            cpu_single = time.process_time() - c0
            _forget()
            ch = resource.getrusage(resource.RUSAGE_CHILDREN)
            t = time.perf_counter()
            rows = B.run_beams(s, workers=workers, progress=False)
            wall = time.perf_counter() - t
            ch2 = resource.getrusage(resource.RUSAGE_CHILDREN)     # the workers, reaped at the pool's end
            cpu_pool = (ch2.ru_utime + ch2.ru_stime) - (ch.ru_utime + ch.ru_stime)
            assert all(x["outcome"] != "error" for x in rows)
            sums.append(total)
            walls.append(wall)
            ratios.append(wall / total)
            cpu_ratios.append(cpu_pool / cpu_single)
            print(f"round {r + 1}: sum of single designs {total:6.2f} s   pool wall {wall:6.2f} s   "
                  f"ratio {wall / total:.2f}   CPU pool workers / singles {cpu_pool:5.2f} / {cpu_single:5.2f} s   "
                  f"(load {os.getloadavg()[0]:.1f})")
        print(f"{'design, pool wall / sum of single designs':<52} median {statistics.median(ratios):.2f}  "
              f"(range {min(ratios):.2f}-{max(ratios):.2f}; target <= 0.6 on 2 cores)")
        print(f"{'  CPU of the pool workers / of the single designs':<52} median {statistics.median(cpu_ratios):.2f}")
        print(f"{'  per beam: single / pool wall':<52} {statistics.median(sums) / len(s.beams) * 1e3:.0f} ms / "
              f"{statistics.median(walls) / len(s.beams) * 1e3:.0f} ms")

        exe = [sys.executable, "-m", "splicecalc.cli.main"]
        t = time.perf_counter()
        p = subprocess.run(exe + ["batch", str(sched), "--out", str(Path(tmp) / "out"), "--quiet"],
                           capture_output=True, text=True)
        cli_batch = time.perf_counter() - t
        assert p.returncode in (0, 1, 3), p.stderr
        jobs = Path(tmp) / "jobs"
        jobs.mkdir()
        t_runs = 0.0
        for b in s.beams:
            jf = jobs / f"{b.name}.toml"
            jf.write_text(b.text, encoding="utf-8")
            t = time.perf_counter()
            q = subprocess.run(exe + ["run", str(jf)], capture_output=True, text=True)
            t_runs += time.perf_counter() - t
            assert q.returncode in (0, 1, 3), q.stderr
        print(f"{'end to end: splicecalc batch vs 20 x splicecalc run':<52} {cli_batch:6.2f} s vs {t_runs:6.2f} s "
              f"(ratio {cli_batch / t_runs:.2f})")

        if args.pdf:
            pdf_rounds(s, args.pdf, args.pdf_rounds, workers, Path(tmp))


def _cpu() -> float:
    a, b = resource.getrusage(resource.RUSAGE_SELF), resource.getrusage(resource.RUSAGE_CHILDREN)
    return a.ru_utime + a.ru_stime + b.ru_utime + b.ru_stime


def pdf_rounds(s: B.Schedule, n: int, rounds: int, workers: int, tmp: Path) -> None:
    """The first ``n`` packages one after the other in this process (the alternative: what ``splicecalc
    build`` does for each) and by the ``--pdf`` pool, interleaved, the order swapped each round. Wall and
    CPU (this process + every child waited for: kernels, XeLaTeX, the pool's workers)."""
    from splicecalc.workflow.package import build_package

    sub = B.Schedule(s.source, s.title, s.beams[:n])

    def seq(tag: str) -> tuple[float, float]:
        c, t = _cpu(), time.perf_counter()
        for b in sub.beams:
            d = tmp / tag / b.name
            d.mkdir(parents=True)
            jf = d / f"{b.name}.toml"
            jf.write_text(b.text, encoding="utf-8")
            build_package(jf, d / f"{b.name}.pdf", progress=False)
        return time.perf_counter() - t, _cpu() - c

    def pool(tag: str) -> tuple[float, float]:
        c, t = _cpu(), time.perf_counter()
        rows = B.run_beams(sub, out=tmp / tag, pdf=True, workers=workers, progress=False)
        wall, cpu = time.perf_counter() - t, _cpu() - c
        assert all(x.get("package_pdf") for x in rows), [x["status"] for x in rows]
        return wall, cpu

    runs = {"seq": seq, "pool": pool}
    got: dict[str, list[tuple[float, float]]] = {k: [] for k in runs}
    ratios, loads = [], []
    for r in range(rounds):
        for k in (("seq", "pool") if r % 2 == 0 else ("pool", "seq")):
            got[k].append(runs[k](f"r{r}{k}"))
            loads.append(os.getloadavg()[0])
        ratios.append(got["pool"][-1][0] / got["seq"][-1][0])
        print(f"{n} packages, round {r + 1}: one after the other {got['seq'][-1][0]:5.1f} s wall / "
              f"{got['seq'][-1][1]:5.1f} s CPU   pool {got['pool'][-1][0]:5.1f} s wall / {got['pool'][-1][1]:5.1f} s CPU"
              f"   ratio {ratios[-1]:.2f}  (load {loads[-1]:.1f})", flush=True)
    med = {k: (statistics.median(w for w, _ in v), statistics.median(c for _, c in v)) for k, v in got.items()}
    print(f"{f'{n} packages (--pdf), {rounds} interleaved rounds':<52} pool / one after the other: wall median "
          f"{statistics.median(ratios):.2f} x (range {min(ratios):.2f}-{max(ratios):.2f}; {med['pool'][0]:.1f} s vs "
          f"{med['seq'][0]:.1f} s), CPU {med['pool'][1]:.1f} s vs {med['seq'][1]:.1f} s; load {min(loads):.1f}-{max(loads):.1f}")

if __name__ == "__main__":
    main()
