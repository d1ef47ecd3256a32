r"""Run XeLaTeX as many passes as a calc package needs, and no more, with TeX locked down.

Passes: XeLaTeX is run again only while the files it writes for the next pass (the
``.aux`` with the labels and "Sheet N of M", the ``.toc``, hyperref's ``.out``) change,
as latexmk decides: their SHA-256 before and after a pass are compared, and a pass
that reads exactly what it writes is the last one.
A fresh build takes two passes: before the first, the contents list is predicted from the
source (:func:`predicted_toc`, page numbers 0) so that it already has its final length, and
titled tables take their final column widths on the first pass (``\calctitlespan`` in the
template), so the second pass reads what it writes; a third pass follows whenever it does not.
A rebuild is *seeded* with the previous
build's files (kept in ``seed_dir``, one folder per output name): when the page
structure is unchanged (a rebuild after signing or revising) the first pass reads
what it writes and is the only one. When the page count differs from the seed's,
or a seeded pass fails, the seed is dropped and the build starts again from nothing
(full passes). The passes write XDV only (``-no-pdf``); the PDF is made once from
the last one with ``xdvipdfmx -q -E``, the command XeLaTeX itself runs.

Safety: XeLaTeX runs with ``-no-shell-escape`` and paranoid file access
(``openin_any=p``, ``openout_any=p``, ``shell_escape=f`` in its environment): no
command runs, no file outside the build folder (or TeX's own tree) is read, none is
written outside it, and no dot-file is touched.
"""

from __future__ import annotations

import hashlib
import json
import os
import shutil
import subprocess
import sys
import time
from dataclasses import dataclass, field
from pathlib import Path

from .errors import CalcBuildError, ToolMissingError
from .latexfix import BadBox, first_error, missing_characters, overfull_boxes

#: most XeLaTeX passes (latexmk's default limit)
MAX_PASSES = 5
#: files a pass writes for the next one; their hashes decide whether another pass is needed
AUX_SUFFIXES = (".aux", ".toc", ".out", ".lof", ".lot")
#: the seed folder's record of the build that filled it
SEED_STATE = "seed.json"
#: what XeLaTeX itself runs to turn its XDV into a PDF
XDV_DRIVER = ("xdvipdfmx", "-q", "-E")


def _no_space(folder: Path) -> bool:
    """True when the file system of ``folder`` has (almost) no free space left."""
    try:
        st = os.statvfs(folder)
    except (OSError, AttributeError):
        return False
    return st.f_bavail * st.f_frsize < 1_000_000


def require_tool(name: str) -> str:
    """Path of an external program, or :class:`ToolMissingError` with the install command."""
    path = shutil.which(name)
    if path is None:
        raise ToolMissingError(name)
    return path


def tex_environment(workdir: Path) -> dict[str, str]:
    """The environment of a TeX process: paranoid reading and writing, no shell escape (kpathsea variables)."""
    env = dict(os.environ)
    env.update(openin_any="p", openout_any="p", shell_escape="f", TEXMFOUTPUT=str(workdir))
    return env


@dataclass
class LatexRun:
    """Result of the XeLaTeX passes."""

    pdf_path: Path
    log_path: Path
    passes: int
    seconds: float
    pass_seconds: list[float] = field(default_factory=list)
    overfull: list[BadBox] = field(default_factory=list)
    #: characters left out of the PDF because the font lacks them (from the log)
    missing_chars: list[str] = field(default_factory=list)
    #: pages of the PDF (from the log)
    pages: int = 0
    #: the first pass read the previous build's files (``seed_dir``)
    seeded: bool = False
    #: a seed was offered but dropped (page count changed, or the seeded pass failed)
    seed_dropped: bool = False
    #: the first pass read a contents list predicted from the source (:func:`predicted_toc`)
    toc_predicted: bool = False


def _hashes(tex_path: Path) -> dict[str, str]:
    out = {}
    for sfx in AUX_SUFFIXES:
        p = tex_path.with_suffix(sfx)
        if p.is_file():
            out[sfx] = hashlib.sha256(p.read_bytes()).hexdigest()
    return out


def _pages(log_text: str) -> int:
    import re

    m = re.search(r"Output written on .*?\((\d+) pages?", log_text)
    return int(m.group(1)) if m else 0


def _lastpage(tex_path: Path) -> int | None:
    """The sheet count a pass wrote for "Sheet n of N" (the ``LastPage`` label in the ``.aux``), or None."""
    import re

    aux = tex_path.with_suffix(".aux")
    if not aux.is_file():
        return None
    m = re.search(r"\\newlabel\{LastPage\}\{\{[^{}]*\}\{(\d+)\}", aux.read_text(encoding="utf-8", errors="replace"))
    return int(m.group(1)) if m else None


def _clear(tex_path: Path) -> None:
    for sfx in AUX_SUFFIXES:
        tex_path.with_suffix(sfx).unlink(missing_ok=True)


#: commands that put a line in the contents list: (level, index of the title argument) for
#: this template's own macros (``\calccheck{title}{clause}`` and ``\calcrulehead{title}{note}`` are
#: subsections); LaTeX's own sectioning commands are read below
_TOC_MACROS = {"calccheck": ("subsection", 0, 2), "calcrulehead": ("subsection", 0, 2)}
_LEVELS = ("section", "subsection", "subsubsection")
#: the template's switches of \calccheck / \calcrulehead to \subsubsection (an existing member's own
#: member checks, children of its heading) and back
_NESTING = {"calcnestedchecks": True, "calcnestedchecksend": False}
_TOC_COMMAND = None


def _group(text: str, i: int, open_: str, close: str) -> tuple[str, int] | None:
    """The balanced ``open_ ... close`` group starting at ``text[i]`` (spaces skipped): (inside, index after)."""
    while i < len(text) and text[i] in " \t\n":
        i += 1
    if i >= len(text) or text[i] != open_:
        return None
    depth, j = 0, i
    while j < len(text):
        c = text[j]
        if c == "\\":
            j += 2
            continue
        if c == open_:
            depth += 1
        elif c == close:
            depth -= 1
            if depth == 0:
                return text[i + 1:j], j + 1
        j += 1
    return None


def predicted_toc(tex: str) -> str:
    r"""The contents file (``.toc``) a document will write, with every page number 0, read from its source.

    Written before a fresh build's first pass, so that the contents list already has its final
    number of lines on that pass: the sheets after it do not move on the second pass, and the second
    pass reads what it writes (two passes instead of three). Only the length of the list matters;
    a wrong prediction costs a pass, never a wrong page number (the passes go on until nothing changes).
    Read: ``\section``, ``\subsection``, ``\subsubsection`` (starred ones are not listed; the optional
    short title is), this template's ``\calccheck`` and ``\calcrulehead``, ``\addcontentsline{toc}``
    and ``\addtocontents{toc}``, after ``\begin{document}``, comments skipped.
    """
    import re

    global _TOC_COMMAND
    if _TOC_COMMAND is None:
        names = "|".join((*_LEVELS, *_TOC_MACROS, *_NESTING, "addcontentsline", "addtocontents"))
        _TOC_COMMAND = re.compile(r"\\(" + names + r")(?![A-Za-z@])(\*?)")
    start = tex.find("\\begin{document}")
    body = tex[start:] if start >= 0 else tex
    body = re.sub(r"(?<!\\)%[^\n]*", "", body)          # comments (an escaped \% stays)
    numbers = [0, 0, 0]
    lines = []
    nested = False
    for m in _TOC_COMMAND.finditer(body):
        name, star, pos = m.group(1), m.group(2), m.end()
        if name in _NESTING:
            nested = _NESTING[name]
            continue
        if name in ("addcontentsline", "addtocontents"):
            args = []
            for _ in range(3 if name == "addcontentsline" else 2):
                g = _group(body, pos, "{", "}")
                if g is None:
                    break
                args.append(g[0])
                pos = g[1]
            if len(args) < 2 or args[0].strip() != "toc":
                continue
            if name == "addtocontents":
                lines.append(args[1].replace("\\protect", "").strip())
            elif len(args) == 3:
                lines.append(f"\\contentsline {{{args[1].strip()}}}{{{args[2]}}}{{0}}{{}}%")
            continue
        if name in _TOC_MACROS:
            level, idx, nargs = _TOC_MACROS[name]
            args = []
            for _ in range(nargs):
                g = _group(body, pos, "{", "}")
                if g is None:
                    break
                args.append(g[0])
                pos = g[1]
            if len(args) <= idx:
                continue
            title = args[idx]
            if nested:                  # the template's \calcchecklevel is \subsubsection there
                level = "subsubsection"
        else:
            if star:
                continue
            level = name
            short = _group(body, pos, "[", "]")
            if short is not None:
                title, pos = short
                if _group(body, pos, "{", "}") is None:
                    continue
            else:
                g = _group(body, pos, "{", "}")
                if g is None:
                    continue
                title = g[0]
        title = " ".join(title.split())         # one line each, as TeX writes them
        k = _LEVELS.index(level)
        numbers[k] += 1
        numbers[k + 1:] = [0] * (len(numbers) - k - 1)
        num = ".".join(str(n) for n in numbers[:k + 1])
        lines.append(f"\\contentsline {{{level}}}{{\\numberline {{{num}}}{title}}}{{0}}{{{level}.{num}}}%")
    return "".join(line + "\n" for line in lines)


def _predict_toc(tex_path: Path) -> bool:
    """Write :func:`predicted_toc` beside ``tex_path`` when it starts from nothing (no .aux, no .toc)."""
    toc = tex_path.with_suffix(".toc")
    if toc.exists() or tex_path.with_suffix(".aux").exists():
        return False
    try:
        text = predicted_toc(tex_path.read_text(encoding="utf-8", errors="replace"))
        if text:
            toc.write_text(text, encoding="utf-8")
    except OSError:
        toc.unlink(missing_ok=True)
        return False
    return bool(text)


def _read_seed(seed_dir: Path | None, tex_path: Path) -> int | None:
    """Copy a seed's files beside ``tex_path``; the seed build's page count, or None without a usable seed."""
    if seed_dir is None:
        return None
    try:
        state = json.loads((seed_dir / SEED_STATE).read_text(encoding="utf-8"))
        pages = int(state["pages"])
        names = [str(n) for n in state["files"]]
    except (OSError, ValueError, KeyError, TypeError):
        return None
    if pages <= 0 or not names or any(Path(n).name != n or Path(n).suffix not in AUX_SUFFIXES for n in names):
        return None
    try:
        for n in names:
            shutil.copyfile(seed_dir / n, tex_path.with_name(tex_path.stem + Path(n).suffix))
    except OSError:
        _clear(tex_path)
        return None
    return pages


def save_seed(seed_dir: Path, tex_path: Path, pages: int) -> None:
    """Keep the files of a finished build in ``seed_dir`` for the next build of the same output.

    A failure only costs the next build its seed. The state file is written last (atomically):
    a seed folder without it, or with files from two builds, is never read as a seed.
    """
    from ..core.files import write_atomic

    try:
        seed_dir.mkdir(parents=True, exist_ok=True)
        (seed_dir / SEED_STATE).unlink(missing_ok=True)
        names = []
        for sfx in AUX_SUFFIXES:
            src = tex_path.with_suffix(sfx)
            if src.is_file():
                shutil.copyfile(src, seed_dir / f"seed{sfx}")
                names.append(f"seed{sfx}")
        write_atomic(seed_dir / SEED_STATE, json.dumps({"pages": pages, "files": names}).encode("utf-8"))
    except OSError:
        pass


def run_xelatex(tex_path: Path, progress: bool = True, timeout_s: float = 300.0,
                seed_dir: Path | None = None, predict_toc: bool = True) -> LatexRun:
    """Compile ``tex_path`` with xelatex in its own folder; raise :class:`CalcBuildError` on error.

    ``seed_dir``: a folder kept from the previous build of the same output (read if it holds
    a seed, see the module docstring); this function does not write it (:func:`save_seed`).
    ``predict_toc=False``: no predicted contents list before a first pass from nothing (the plain
    passes, for comparison).
    """
    exe = require_tool("xelatex")
    driver = require_tool(XDV_DRIVER[0])
    tex_path = Path(tex_path)
    workdir = tex_path.parent
    log_path = tex_path.with_suffix(".log")
    pdf_path = tex_path.with_suffix(".pdf")
    xdv_path = tex_path.with_suffix(".xdv")
    env = tex_environment(workdir)
    cmd = [exe, "-no-shell-escape", "-no-pdf", "-interaction=nonstopmode", "-halt-on-error",
           "-file-line-error-style", tex_path.name]
    for stale in (pdf_path, xdv_path):
        stale.unlink(missing_ok=True)
    seed_pages = _read_seed(seed_dir, tex_path)
    seeded, dropped = seed_pages is not None, False
    predicted = False if seeded or not predict_toc else _predict_toc(tex_path)
    bar = None
    if progress:
        from tqdm import tqdm

        bar = tqdm(total=1 if seeded else 2, desc="LaTeX passes", unit="pass", file=sys.stderr, leave=False)
    t0 = time.perf_counter()
    times: list[float] = []
    log_text = ""
    try:
        n = 0
        while True:
            n += 1
            before = _hashes(tex_path)
            t = time.perf_counter()
            try:
                proc = subprocess.run(cmd, cwd=workdir, env=env, stdin=subprocess.DEVNULL,
                                      capture_output=True, timeout=timeout_s)
            except subprocess.TimeoutExpired:
                raise CalcBuildError(f"xelatex pass {len(times) + 1} did not finish within {timeout_s:.0f} s "
                                     f"(log: {log_path})") from None
            times.append(time.perf_counter() - t)
            log_text = log_path.read_text(encoding="utf-8", errors="replace") if log_path.exists() else ""
            if bar is not None:
                if len(times) > bar.total:
                    bar.total = len(times)
                    bar.refresh()
                bar.update(1)
            failed = proc.returncode != 0 or not xdv_path.exists()
            if seeded and n == 1 and (failed or _pages(log_text) != seed_pages):
                # the seed does not fit this document: start from nothing
                seeded, dropped, n = False, True, 0
                _clear(tex_path)
                predicted = predict_toc and _predict_toc(tex_path)
                continue
            if failed:
                err = first_error(log_text) or proc.stdout.decode(errors="replace")[-400:].strip()
                out_txt = log_text + proc.stdout.decode(errors="replace")
                if "I can't write on file" in out_txt or ("Emergency stop" in out_txt and not first_error(log_text)) \
                        or _no_space(workdir):
                    err += (f"; XeLaTeX could not write in {workdir}: the disk may be full or the folder not "
                            "writable (free some space, or build to another folder with -o)")
                raise CalcBuildError(f"xelatex failed on pass {len(times)}: {err} (log: {log_path})")
            # a pass that read only a predicted contents list (no .aux) is never the last one
            if (before and _hashes(tex_path) == before and (seeded or n > 1)) or n >= MAX_PASSES:
                # last guard on "Sheet n of N": the count the last pass printed (read from the .aux it was
                # given, which equals the one it wrote) must be the sheets it wrote
                last = _lastpage(tex_path)
                if last is not None and last != _pages(log_text):
                    if n < MAX_PASSES:
                        continue
                    raise CalcBuildError(f"the sheets say 'of {last}' but {_pages(log_text)} were written after "
                                         f"{n} XeLaTeX passes; build again with --fresh (log: {log_path})")
                break
        t = time.perf_counter()
        proc = subprocess.run([driver, *XDV_DRIVER[1:], "-o", pdf_path.name, xdv_path.name], cwd=workdir, env=env,
                              stdin=subprocess.DEVNULL, capture_output=True, timeout=timeout_s)
        if proc.returncode != 0 or not pdf_path.exists():
            raise CalcBuildError(f"xdvipdfmx could not make the PDF: "
                                 f"{proc.stderr.decode(errors='replace')[-400:].strip()} (folder: {workdir})")
        times[-1] += time.perf_counter() - t
    except subprocess.TimeoutExpired:
        raise CalcBuildError(f"xdvipdfmx did not finish within {timeout_s:.0f} s (folder: {workdir})") from None
    finally:
        if bar is not None:
            bar.close()
    return LatexRun(pdf_path=pdf_path, log_path=log_path, passes=len(times),
                    seconds=time.perf_counter() - t0, pass_seconds=times,
                    overfull=overfull_boxes(log_text),
                    missing_chars=missing_characters(log_text), pages=_pages(log_text), seeded=seeded, seed_dropped=dropped,
                    toc_predicted=predicted)
