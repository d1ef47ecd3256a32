"""Benchmark: lightest-section search over every family (UKB, UKC, IPE, HEA, HEB), all checks.

Scenarios, all on the plain-float path with every check (numerical M_cr for every
segment of every candidate that reaches the LTB stage):

1. the example job (examples/mezzanine_infill.toml) with ``families`` widened to all five
   families and no depth limit;
2. the same job with every load x 4 (a heavy beam: most of the catalogue is tried);
3. the example without intermediate restraints (LTB governs: many eigenvalue M_cr solves);
4. the same job x 40 with no restraints: nothing passes, every section is tried and the
   heaviest gets the full set of checks (worst case).

Target: each under 0.5 s on one core.

    /tmp/venv/bin/python benchmarks/bench_beam_search.py [repeats]
"""

from __future__ import annotations

import dataclasses
import statistics
import sys
import time
from pathlib import Path

from splicecalc.design.beam import design_beam
from splicecalc.job import Job, load_job

ROOT = Path(__file__).resolve().parents[1]
ALL = ("UKB", "UKC", "IPE", "HEA", "HEB")


def _scaled(job: Job, factor: float, restraints: tuple[float, ...] | None = None) -> Job:
    loads = tuple(ld.scaled(factor) for ld in job.loads)
    beam = dataclasses.replace(job.beam, families=ALL, max_depth=None,
                               restraints=job.beam.restraints if restraints is None else restraints)
    return dataclasses.replace(job, beam=beam, loads=loads)


def _time(name: str, job: Job, repeats: int) -> None:
    design_beam(job)  # warm-up: imports, section catalogue, first numpy/scipy calls
    times, cpu = [], []
    for _ in range(repeats):
        t0, c0 = time.perf_counter(), time.process_time()
        d = design_beam(job)   # fresh design each time: the per-mass analysis cache lives in one call
        times.append(time.perf_counter() - t0)
        cpu.append(time.process_time() - c0)
    stages = {s: sum(1 for c in d.candidates if c.stage == s) for s in ("screen", "full")}
    print(f"[{name}] candidates tried: {len(d.candidates)} (screened out {stages['screen']}, "
          f"reached LTB {stages['full']})")
    print(f"    {d.message}")
    print(f"    time: median {statistics.median(times):.3f} s, min {min(times):.3f} s, max {max(times):.3f} s "
          f"over {repeats} runs (target < 0.5 s); CPU time median {statistics.median(cpu):.3f} s "
          "(steadier on a shared machine)")


def main(repeats: int = 5) -> None:
    base = load_job(ROOT / "examples" / "mezzanine_infill.toml")
    _time("example, all families", _scaled(base, 1.0), repeats)
    _time("loads x 4, all families", _scaled(base, 4.0), repeats)
    _time("example, no restraints (LTB governs)", _scaled(base, 1.0, ()), repeats)
    _time("loads x 40, no restraints (nothing passes)", _scaled(base, 40.0, ()), repeats)


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 5)
