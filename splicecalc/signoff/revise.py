"""The next revision of a calc package, as new files: a signed notebook is never edited.

:func:`revise` reads the package's notebook (``NAME.ipynb``, or the one beside ``NAME.pdf``)
and writes ``NAME_<REV>.ipynb`` (a trailing ``_<old rev>`` in the name is replaced) with:

* the cells as they are, outputs cleared, no signatures;
* ``metadata.splicecalc.revision`` = the new revision, its date, status DRAFT;
* the revision history with every earlier row kept, the current revision's row completed
  with who prepared and checked it (from its verified signatures), and a row for the new one;

and, when the notebook reads a job file, a copy of that job as ``JOB_<REV>.toml`` whose
``[project] revision`` is the new one (the title block and footer of a build from either
file then carry it), with the new notebook's parameters cell pointing at the copy. Existing
files are never overwritten (names compared ignoring case).
"""

from __future__ import annotations

import copy
import datetime as _dt
import os
import re
from dataclasses import dataclass
from pathlib import Path

from ..core.errors import InputError
from ..core.files import write_atomic
from . import notebook as nbs

REV_RE = re.compile(r"^([A-Z]{1,2}|[PC][0-9]{1,3}|[0-9]{1,3})$")


@dataclass(frozen=True)
class Revised:
    notebook: Path
    job: Path | None
    revision: str
    history: list[dict]


def _exists_ignoring_case(p: Path) -> bool:
    if p.exists():
        return True
    try:
        return any(f.name.casefold() == p.name.casefold() for f in p.parent.iterdir())
    except OSError:
        return False


def _new_stem(stem: str, old: str, new: str) -> str:
    for sep in ("_", "-"):
        if old and old != "-" and stem.casefold().endswith(f"{sep}{old}".casefold()):
            return stem[: -len(old) - 1] + f"{sep}{new}"
    return f"{stem}_{new}"


_PROJECT_RE = re.compile(r"^\[project\]\s*$", re.M)
_TABLE_RE = re.compile(r"^\s*\[", re.M)
_REV_LINE_RE = re.compile(r"^(\s*revision\s*=\s*)(\"[^\"\n]*\"|'[^'\n]*')(.*)$", re.M)


def set_job_revision(text: str, rev: str) -> str:
    """The job file's text with ``[project] revision = "<rev>"`` (added when missing); comments kept."""
    import tomllib

    m = _PROJECT_RE.search(text)
    if m is None:
        out = f'[project]\nrevision = "{rev}"\n\n' + text
    else:
        start = m.end()
        nxt = _TABLE_RE.search(text, start + 1)
        end = nxt.start() if nxt else len(text)
        body = text[start:end]
        if _REV_LINE_RE.search(body):
            body = _REV_LINE_RE.sub(lambda mm: f'{mm.group(1)}"{rev}"{mm.group(3)}', body, count=1)
        else:
            body = f'\nrevision = "{rev}"' + body
        out = text[:start] + body + text[end:]
    if tomllib.loads(out).get("project", {}).get("revision") != rev:   # pragma: no cover - defensive
        raise InputError("job file", "(text)", "a [project] table whose revision can be set")
    return out


_JOB_LINE_RE = re.compile(r"^(\s*job_file\s*=\s*).*$", re.M)


def _set_job_file(nb: dict, rel: str) -> None:
    """Point the parameters cell's ``job_file = "..."`` line at ``rel``."""
    import json

    for cell in nb.get("cells", []):
        if not isinstance(cell, dict) or cell.get("cell_type") != "code":
            continue
        src = nbs._join(cell.get("source", ""))
        if isinstance(src, str) and _JOB_LINE_RE.search(src):
            cell["source"] = _JOB_LINE_RE.sub(lambda m: m.group(1) + json.dumps(rel), src, count=1)
            return


def _signers(nb: dict, nb_path: Path) -> dict[str, str]:
    """role -> name of the valid signatures of the notebook (empty when unsigned or changed)."""
    sigs = nbs.verify_entries(nb, nb_path, [])
    if any(s.problems for s in sigs):
        return {}
    out = {s.role: s.signer for s in sigs}
    if sigs:
        out["date"] = min(s.signed_at for s in sigs)[:10]
    return out


def revise(source: str | Path, revision: str, description: str, *, date: str | None = None,
           by: str | None = None) -> Revised:
    """Start ``revision`` of the package ``source`` (its .ipynb or .pdf) as new files."""
    src = Path(source)
    if src.suffix.lower() == ".pdf":
        nb_src = nbs.sibling(src, ".ipynb")
        if nb_src is None:
            raise InputError("PACKAGE", str(source), "a package with its notebook beside the PDF")
    elif src.suffix.lower() == ".ipynb" and src.is_file():
        nb_src = src
    else:
        raise InputError("PACKAGE", str(source), "an existing .ipynb calc notebook or its .pdf package")
    if not isinstance(revision, str) or not REV_RE.match(revision.strip()):
        raise InputError("--revision", revision, "a revision code such as B, P2, C1 or 02")
    revision = revision.strip()
    if not isinstance(description, str) or not description.strip():
        raise InputError("--description", description, "a short description of what changed")
    date = date or _dt.date.today().isoformat()
    try:
        _dt.date.fromisoformat(date)
    except ValueError:
        raise InputError("--date", date, "an ISO date such as 2026-12-05") from None
    try:
        nb = nbs.read_notebook(nb_src)
    except nbs.MalformedNotebook as exc:
        raise InputError("PACKAGE", str(nb_src), "a calc notebook", str(exc)) from None
    meta = nbs.calc_meta(nb)
    old = str(meta.get("revision", "") or "").strip() or "-"
    history = [dict(r) for r in (meta.get("revisions") or []) if isinstance(r, dict)]
    for r in history:
        if "rev" not in r and "letter" in r:
            r["rev"] = r.pop("letter")
    known = {str(r.get("rev", "")).casefold() for r in history} | {old.casefold()}
    if revision.casefold() in known:
        raise InputError("--revision", revision, f"a new revision code (used so far: {', '.join(sorted(known))})")
    signed = _signers(nb, nb_src)
    cur = next((r for r in history if str(r.get("rev")) == old), None)
    if cur is None:
        cur = {"rev": old, "date": str(meta.get("date", "") or ""), "description": "First issue"}
        history.append(cur)
    if not cur.get("date"):
        cur["date"] = signed.get("date", "")          # undated: the day it was first signed
    cur["by"] = signed.get("prepared") or cur.get("by") or str(meta.get("prepared_by", "") or "")
    cur["checked"] = signed.get("checked") or cur.get("checked") or str(meta.get("checked_by", "") or "")
    if signed.get("approved"):
        cur["approved"] = signed["approved"]
    history.append({"rev": revision, "date": date, "description": " ".join(description.split()),
                    "by": by or str(meta.get("prepared_by", "") or ""), "checked": ""})

    new_nb_path = nb_src.with_name(_new_stem(nb_src.stem, old, revision) + ".ipynb")
    if _exists_ignoring_case(new_nb_path):
        raise InputError("--revision", revision, f"a revision whose notebook {new_nb_path.name} does not exist yet "
                         "(files of a revision are never overwritten)")
    new = copy.deepcopy(nb)
    nmeta = new.setdefault("metadata", {}).setdefault("splicecalc", {})
    nmeta.pop(nbs.SIGN_KEY, None)
    nmeta["signatures"] = []
    nmeta.update({"revision": revision, "date": date, "status": "DRAFT", "revisions": history,
                  "checked_by": "", "approved_by": ""})
    if by:
        nmeta["prepared_by"] = by
    for cell in new.get("cells", []):
        if isinstance(cell, dict) and cell.get("cell_type") == "code":
            cell["outputs"] = []
            cell["execution_count"] = None

    job_new: Path | None = None
    job_name = nbs.job_file_name(nb)
    if job_name:
        job_old = nb_src.parent / job_name
        if not job_old.is_file():
            raise InputError("job_file", job_name, "the job file the notebook reads (it is missing)")
        job_new = job_old.with_name(_new_stem(job_old.stem, old, revision) + job_old.suffix)
        if _exists_ignoring_case(job_new):
            raise InputError("--revision", revision, f"a revision whose job file {job_new.name} does not exist yet")
        text = set_job_revision(job_old.read_text(encoding="utf-8"), revision)
        rel = Path(os.path.relpath(job_new, nb_src.parent)).as_posix()
        _set_job_file(new, rel)
        write_atomic(job_new, text)
    nbs.write_notebook(new, new_nb_path)
    return Revised(new_nb_path, job_new, revision, history)


__all__ = ["REV_RE", "Revised", "revise", "set_job_revision"]
