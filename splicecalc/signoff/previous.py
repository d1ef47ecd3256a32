"""The previous issued revision of a package: what a rebuilt package marks its changes against.

A package built for revision R (``metadata.splicecalc.revision``) after an issued one finds that
issue in the folder's issue register (``issue_register.json``, written by ``splicecalc issue``):
the row of the same job number and title whose revision comes last before R in the package's
revision history (the latest issued row when R is not in the history). The issued PDF must still
be the file the register names (its SHA-256 is the register's) and its executed notebook must be
beside it; otherwise there is nothing trustworthy to compare with, and the reason is returned so
the build can say so (a package is never marked against a file that is not what was issued).
"""

from __future__ import annotations

import hashlib
import json
from dataclasses import dataclass
from pathlib import Path
from typing import Any

REGISTER = "issue_register.json"


@dataclass(frozen=True)
class PreviousIssue:
    """The issued revision a build compares with: its code, PDF, executed notebook and register row."""

    revision: str
    pdf: Path
    notebook: Path
    row: dict[str, Any]


def _rows(folder: Path) -> list[dict[str, Any]]:
    p = folder / REGISTER
    try:
        rows = json.loads(p.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return []
    return [r for r in rows if isinstance(r, dict)] if isinstance(rows, list) else []


def previous_issue(meta: dict[str, Any], folders: list[Path]) -> tuple[PreviousIssue | None, str]:
    """(the previous issued revision of the package whose notebook metadata is ``meta``, a note).

    ``folders``: where to look for the issue register (the output folder, the source's folder).
    The note is empty when found or when nothing was issued before; else it says why the
    changes are not marked."""
    rev = str(meta.get("revision", "") or "").strip()
    history = [str(r.get("rev", r.get("letter", ""))) for r in meta.get("revisions") or [] if isinstance(r, dict)]
    job, title = meta.get("job_number"), meta.get("title")
    seen: set[Path] = set()
    candidates: list[tuple[Path, dict[str, Any]]] = []
    for folder in folders:
        f = folder.resolve()
        if f in seen:
            continue
        seen.add(f)
        for row in _rows(f):
            r = str(row.get("revision", "") or "")
            if (r and r.casefold() != rev.casefold() and row.get("job_number") == job and row.get("title") == title
                    and isinstance(row.get("file"), str)):
                candidates.append((f, row))
    if not candidates:
        return None, ""
    pos = {r.casefold(): i for i, r in enumerate(history)}
    if rev.casefold() in pos:           # the history orders the revisions: only those before this one
        here = pos[rev.casefold()]
        earlier = [(f, row) for f, row in candidates if pos.get(str(row["revision"]).casefold(), here) < here]
    else:                               # no history to order by: the latest issue
        earlier = candidates
    if not earlier:
        return None, ""
    folder, row = max(earlier, key=lambda fr: (pos.get(str(fr[1]["revision"]).casefold(), -1),
                                               str(fr[1].get("time_utc", ""))))
    pdf = folder / Path(row["file"]).name
    prev = str(row["revision"])
    try:
        data = pdf.read_bytes()
    except OSError:
        return None, f"issued revision {prev} ({pdf.name}) is not in {folder}: changes since it are not marked"
    if row.get("pdf_sha256") and hashlib.sha256(data).hexdigest() != row["pdf_sha256"]:
        return None, (f"{pdf.name} is not the file issued as revision {prev} (its SHA-256 differs from the issue "
                      "register's): changes since it are not marked")
    from .notebook import sibling

    nb = sibling(pdf, ".ipynb")
    if nb is None:
        return None, (f"the executed notebook of issued revision {prev} is not beside {pdf.name}: changes since it "
                      "are not marked")
    want = _issued_digest(pdf)
    if want is not None:
        from .notebook import MalformedNotebook, notebook_digest, read_notebook

        try:
            have = notebook_digest(read_notebook(nb))
        except (MalformedNotebook, OSError, ValueError):
            have = None
        if have != want:
            return None, (f"{nb.name} is not the notebook issued as revision {prev} (its digest differs from the "
                          "one the issue signature names): changes since it are not marked")
    return PreviousIssue(prev, pdf, nb, row), ""


def _issued_digest(pdf: Path) -> str | None:
    """The notebook digest the issue signature of ``pdf`` names (its ``/Reason`` tag), or None.

    Read from the signature dictionaries without validating them: the PDF's SHA-256 was matched
    with the issue register, and ``splicecalc verify`` is what proves the signatures."""
    from .pdfsign import parse_tag

    try:
        import pypdf

        fields = pypdf.PdfReader(str(pdf)).get_fields() or {}
    except Exception:  # noqa: BLE001 - pypdf raises many kinds on a damaged file
        return None
    digests = {}
    for f in fields.values():
        v = f.get("/V") if isinstance(f, dict) else None
        try:
            tag = parse_tag(v.get_object().get("/Reason")) if v is not None else {}
        except (AttributeError, TypeError):
            tag = {}
        if tag.get("notebook_sha256"):
            digests[tag.get("role")] = tag["notebook_sha256"]
    return digests.get("issued") or next(iter(digests.values()), None)


__all__ = ["PreviousIssue", "previous_issue"]
