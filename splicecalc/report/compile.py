"""Run XeLaTeX the number of passes a calc package needs.

Pass 1 writes the contents list and the last-page label to the ``.aux``;
pass 2 typesets "Sheet N of M" and the contents; a third pass runs only if
the log still asks for one (the contents list moved the pages).
"""

from __future__ import annotations

import os
import shutil
import subprocess
import sys
import time
from dataclasses import dataclass, field
from pathlib import Path

from .errors import CalcBuildError, ToolMissingError
from .latexfix import BadBox, first_error, needs_rerun, overfull_boxes

MAX_PASSES = 3
MIN_PASSES = 2


def require_tool(name: str) -> str:
    """Path of an external program, or :class:`ToolMissingError` with the install command."""
    path = shutil.which(name)
    if path is None:
        raise ToolMissingError(name)
    return path


@dataclass
class LatexRun:
    """Result of the XeLaTeX passes."""

    pdf_path: Path
    log_path: Path
    passes: int
    seconds: float
    pass_seconds: list[float] = field(default_factory=list)
    overfull: list[BadBox] = field(default_factory=list)


def run_xelatex(tex_path: Path, progress: bool = True, timeout_s: float = 300.0) -> LatexRun:
    """Compile ``tex_path`` with xelatex in its own folder; raise :class:`CalcBuildError` on error."""
    exe = require_tool("xelatex")
    tex_path = Path(tex_path)
    workdir = tex_path.parent
    log_path = tex_path.with_suffix(".log")
    pdf_path = tex_path.with_suffix(".pdf")
    env = dict(os.environ)
    # keep TeX from asking questions or reading a user's half-configured tree
    env.setdefault("TEXMFOUTPUT", str(workdir))
    cmd = [exe, "-interaction=nonstopmode", "-halt-on-error", "-file-line-error-style", tex_path.name]
    bar = None
    if progress:
        from tqdm import tqdm

        bar = tqdm(total=MIN_PASSES, desc="LaTeX passes", unit="pass", file=sys.stderr, leave=False)
    t0 = time.perf_counter()
    times: list[float] = []
    log_text = ""
    try:
        for i in range(1, MAX_PASSES + 1):
            t = time.perf_counter()
            try:
                proc = subprocess.run(cmd, cwd=workdir, env=env, stdin=subprocess.DEVNULL,
                                      capture_output=True, timeout=timeout_s)
            except subprocess.TimeoutExpired:
                raise CalcBuildError(f"xelatex pass {i} did not finish within {timeout_s:.0f} s "
                                     f"(log: {log_path})") from None
            times.append(time.perf_counter() - t)
            log_text = log_path.read_text(encoding="utf-8", errors="replace") if log_path.exists() else ""
            if bar is not None:
                if i > bar.total:
                    bar.total = i
                    bar.refresh()
                bar.update(1)
            if proc.returncode != 0 or not pdf_path.exists():
                err = first_error(log_text) or proc.stdout.decode(errors="replace")[-400:].strip()
                raise CalcBuildError(f"xelatex failed on pass {i}: {err} (log: {log_path})")
            if i >= MIN_PASSES and not needs_rerun(log_text):
                break
    finally:
        if bar is not None:
            bar.close()
    return LatexRun(pdf_path=pdf_path, log_path=log_path, passes=len(times),
                    seconds=time.perf_counter() - t0, pass_seconds=times,
                    overfull=overfull_boxes(log_text))
