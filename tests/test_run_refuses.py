"""`splicecalc run` refuses, before any work, the jobs the package build would refuse (one code path,
run_calc): exit 2 with one line naming the field, never a traceback and never exit 0."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

DEMO = Path(__file__).resolve().parents[1] / "examples" / "demo_workshop_gallery.toml"


def _edit(text: str, old: str, new: str) -> str:
    assert old in text, old
    return text.replace(old, new, 1)


CASES = {
    "one piece": (lambda t: _edit(_edit(t, 'max_piece_length = "3.6 m"', "pieces = 1"),
                                  'max_piece_mass = "320 kg"', ""), "splices.pieces"),
    "two supports at one end": (lambda t: _edit(t, 'at = "end"', 'at = "start"'), "support[2].at"),
    "piece shorter than any splice": (lambda t: _edit(t, 'max_piece_length = "3.6 m"', 'max_piece_length = "0.2 m"'),
                                      "splices"),
    "area load without width": (lambda t: _edit(t, 'udl = "4.0 kN/m"', 'udl = "4.0 kN/m2"'), "load["),
}


@pytest.mark.parametrize("name", sorted(CASES))
def test_run_refuses_with_one_line(name, tmp_path):
    edit, field = CASES[name]
    text = DEMO.read_text(encoding="utf-8")
    job = tmp_path / "job.toml"
    job.write_text(edit(text), encoding="utf-8")
    p = subprocess.run([sys.executable, "-m", "splicecalc.cli.main", "run", str(job)], capture_output=True,
                       text=True, timeout=300)
    assert p.returncode == 2, (p.returncode, p.stderr, p.stdout[-500:])
    lines = p.stderr.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in p.stderr and field in lines[0], p.stderr
