"""Cost of checking the existing members as members (issue 12), plain-float path.

Run: .venv/bin/python benchmarks/bench_existing.py

Measures, on the demo job (an existing column and an existing supporting beam, both with their own
loads in ``[support.existing_loads]``):

1. the whole job, ``run_calc(render=False)``, with the existing loads as given, and the same job with
   the existing loads removed (the members then get a NOT CHECKED record): the difference is what
   the member checks add to a full job (target < 20 ms);
2. the member checks alone (``existing_member_checks``) for each support, with the designed detail.

Medians of interleaved runs (the VM is shared: the two job variants alternate so drift hits both);
the process CPU time is printed beside the wall time (less sensitive to other work on the machine).
"""

from __future__ import annotations

import statistics
import time
from dataclasses import replace
from pathlib import Path

from splicecalc.job import load_job
from splicecalc.joints.connections.existing_member import existing_member_checks, reactions_by_action
from splicecalc.materials.historic import existing_material_of
from splicecalc.workflow.calc import run_calc

DEMO = Path(__file__).resolve().parents[1] / "examples" / "demo_workshop_gallery.toml"


def _time(fn, n: int, clock=time.perf_counter) -> list[float]:
    out = []
    for _ in range(n):
        t0 = clock()
        fn()
        out.append(clock() - t0)
    return out


def main(repeat: int = 15) -> None:
    job = load_job(DEMO)
    bare = replace(job, supports=tuple(replace(s, existing_loads=None) for s in job.supports))
    run_calc(job, render=False)
    run_calc(bare, render=False)            # warm-up (imports, catalogue)
    for clock, name in ((time.perf_counter, "wall"), (time.process_time, "CPU")):
        with_, without = [], []
        for _ in range(repeat):
            with_ += _time(lambda: run_calc(job, render=False), 1, clock)
            without += _time(lambda: run_calc(bare, render=False), 1, clock)
        a, b = statistics.median(with_), statistics.median(without)
        print(f"whole demo job, run_calc(render=False), {name} time: with existing loads {a * 1e3:.1f} ms, "
              f"without {b * 1e3:.1f} ms (medians of {repeat}); added by the member checks {(a - b) * 1e3:.1f} ms")

    res = run_calc(job, render=False)
    an = res.design.analysis
    for part in res.connections:
        spec, d = part.spec, part.design
        parts = reactions_by_action(an.loads, an.span_mm, part.end)

        def one():
            existing_member_checks(spec.existing_member, spec.existing_loads,
                                   lambda t: existing_material_of(spec.existing_steel, t), spec.existing_face,
                                   d.detail, parts, part.V_Ed, job.na, job.psi, d.tie)
        one()
        ts = _time(one, 50)
        cs = _time(one, 50, time.process_time)
        kind = spec.existing_loads.kind if spec.existing_loads else "none"
        print(f"support {part.end} ({kind}): member checks alone {statistics.median(ts) * 1e3:.2f} ms median wall "
              f"(min {min(ts) * 1e3:.2f} ms), {statistics.median(cs) * 1e3:.2f} ms median CPU, 50 runs each")


if __name__ == "__main__":
    main()
