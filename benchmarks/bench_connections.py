"""Timing of one end-plate and one fin-plate design on the plain-float path (Calc(render=False)).

Run: /tmp/venv/bin/python benchmarks/bench_connections.py
Each design includes the automatic choice (candidate search) and every check of the chosen detail.
"""

from __future__ import annotations

import time

from splicecalc.core import render as _render
from splicecalc.joints.connections import design_end_connection, parse_support
from splicecalc.sections import get_section


def _bench(label: str, fn, repeat: int = 50) -> None:
    fn()  # warm-up
    t0 = time.perf_counter()
    for _ in range(repeat):
        fn()
    dt = (time.perf_counter() - t0) / repeat
    print(f"{label:<46} {dt * 1e3:8.2f} ms per design ({repeat} runs)")


def main() -> None:
    beam = get_section("457x191x67 UKB")
    common = {"at": "start", "bolts": "M20 8.8", "plate": "S275", "existing_member": "254x254x73 UKC",
              "existing_face": "column flange", "existing_steel": "1950-1958"}
    ep = parse_support({**common, "connection": "end plate"}, 1)
    fp = parse_support({**common, "connection": "fin plate"}, 2)
    _bench("end plate, automatic choice, V_Ed = 250 kN", lambda: design_end_connection(beam, "S355", 250e3, ep))
    _bench("fin plate, automatic choice, V_Ed = 250 kN", lambda: design_end_connection(beam, "S355", 250e3, fp))
    _bench("end plate, automatic choice, V_Ed = 520 kN", lambda: design_end_connection(beam, "S355", 520e3, ep))
    def rendered():
        _render._RENDERED.clear()          # render afresh each time (not the in-process memo)
        return design_end_connection(beam, "S355", 250e3, ep, render=True)

    _bench("end plate, rendered (handcalcs)", rendered, repeat=5)


if __name__ == "__main__":
    main()
