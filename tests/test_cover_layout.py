"""The cover as printed: long but realistic names and job numbers never overprint each other.

Checked on the PDF itself (poppler's ``pdftotext -bbox``): no two words of the cover overlap.
"""

from __future__ import annotations

import re
import subprocess
from pathlib import Path

import pytest

from splicecalc.workflow.package import build_package, demo_job_path

pytestmark = pytest.mark.pdf

# names with titles and post-nominals, as title blocks carry them (common practice, no source)
PREPARED = "Dr Alexandra B. Fitzwilliam-Worthington CEng MIStructE"
CHECKED = "Prof. Bartholomew C. Hetherington-Smythe FIStructE"


def _words(pdf: Path, page: int) -> list[tuple[str, float, float, float, float]]:
    out = subprocess.run(["pdftotext", "-bbox", "-f", str(page), "-l", str(page), str(pdf), "-"],
                         capture_output=True, text=True, check=True).stdout
    return [(m.group(5), float(m.group(1)), float(m.group(2)), float(m.group(3)), float(m.group(4)))
            for m in re.finditer(r'<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)</word>',
                                 out)]


def test_long_names_do_not_overprint_the_sign_off_panel(tmp_path):
    text = demo_job_path().read_text(encoding="utf-8")
    text = text.replace('prepared_by = "D. Engineer (demo)"',
                        f'prepared_by = "{PREPARED}"\nchecked_by = "{CHECKED}"', 1)
    assert PREPARED in text
    job = tmp_path / "job.toml"
    job.write_text(text, encoding="utf-8")
    b = build_package(job, tmp_path / "calc.pdf", progress=False)
    words = _words(b.pdf, 1)
    assert any(w[0] == "Fitzwilliam-Worthington" for w in words)
    clashes = []
    for i, (t1, x0, y0, x1, y1) in enumerate(words):
        for t2, u0, v0, u1, v1 in words[i + 1:]:
            # overlap across by more than 0.5 pt and over 40 % of the line height (the font boxes of two
            # tightly set lines overlap by about 1 pt; overprinted words share most of their height)
            if min(x1, u1) - max(x0, u0) > 0.5 and min(y1, v1) - max(y0, v0) > 0.4 * min(y1 - y0, v1 - v0):
                clashes.append((t1, t2))
    assert clashes == [], clashes
