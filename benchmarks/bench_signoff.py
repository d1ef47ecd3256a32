"""Time signing and verifying an executed calc notebook (no re-execution).

    .venv/bin/python benchmarks/bench_signoff.py [NOTEBOOK]

Default notebook: notebooks/demo_cross_section.ipynb (the executed demo). The
notebook is copied to a temporary folder; the original is not touched.
"""

from __future__ import annotations

import shutil
import statistics
import sys
import tempfile
import time
from pathlib import Path

from splicecalc.signoff import sign_notebook, verify_path


def main(argv: list[str]) -> int:
    src = Path(argv[0]) if argv else Path(__file__).resolve().parents[1] / "notebooks" / "demo_cross_section.ipynb"
    sign_t, verify_t = [], []
    with tempfile.TemporaryDirectory(prefix="bench-sign-") as td:
        for _ in range(5):
            nb = Path(td) / "calc.ipynb"
            shutil.copy(src, nb)
            t0 = time.perf_counter()
            sign_notebook(nb, "prepared", "A. Preparer")
            t1 = time.perf_counter()
            st = verify_path(nb)
            t2 = time.perf_counter()
            assert st.state == "valid", st
            sign_t.append(t1 - t0)
            verify_t.append(t2 - t1)
    print(f"sign (prepared) : median {statistics.median(sign_t) * 1e3:7.1f} ms  (target < 2000 ms)")
    print(f"verify          : median {statistics.median(verify_t) * 1e3:7.1f} ms  (target < 2000 ms)")
    return 0 if max(statistics.median(sign_t), statistics.median(verify_t)) < 2.0 else 1


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
