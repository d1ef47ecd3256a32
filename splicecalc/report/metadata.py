"""Calc-package metadata kept in the notebook: ``nb.metadata["splicecalc"]``.

Schema (every key optional except where noted; text is plain text, the
template escapes it for LaTeX)::

    {
      "project": "Riverside Depot mezzanine",
      "job_number": "RD-0417",
      "title": "Cross-section resistance, beam B3",
      "revision": "P1",
      "status": "DRAFT",                # one of STATUSES
      "prepared_by": "A. Person", "checked_by": "", "approved_by": "",
      "date": "2026-12-02",             # date of this revision (default: build date)
      "basis": "EN 1993-1-1:2005 with UK National Annex",
      "revisions": [{"rev" (or "letter"): "P1", "date": "...", "description": "...", "by": "...",
                     "checked": "..."}],
      "signatures": [{"role": "prepared" | "checked" | "approved", "name": "...", "date": "...",
                      "digest": "sha-256 hex" (sign-off ledger) or "mark": "text for the signature box"}]
    }

The latest signature of each role is printed; a signature with a digest is
shown as "signed electronically, digest <first 12 hex digits>".

The sign-off step fills ``signatures`` / ``status`` and writes the
``<name>.pdf.json`` sidecar that :func:`splicecalc.report.build.is_protected`
reads.
"""

from __future__ import annotations

import datetime as _dt
from typing import Any

from ..core.errors import InputError, require_choice
from ..core.text import TEXT_HARD_MAX

STATUSES = ("DRAFT", "PRELIMINARY", "FOR CHECK", "PREPARED", "CHECKED", "APPROVED", "ISSUED", "SUPERSEDED")
ROLES = ("prepared", "checked", "approved")
#: longest title-block text and revision description: the job file's limit (``core.text.TEXT_HARD_MAX``);
#: the sheet shortens long ones where room is short and prints them in full under "Texts in full"
TITLE_BLOCK_MAX = TEXT_HARD_MAX
DESCRIPTION_MAX = TEXT_HARD_MAX
_TEXT_KEYS = ("project", "job_number", "title", "revision", "status", "prepared_by", "checked_by",
              "approved_by", "date", "basis")


def calc_metadata(nb_metadata: dict[str, Any], default_title: str = "Calculation",
                  signoff: tuple[str, list[dict[str, Any]]] | None = None) -> dict[str, Any]:
    """Validated metadata with defaults filled in, ready for the LaTeX template.

    ``signoff`` = (status label, signatures valid for the current digest), from
    the sign-off ledger when it is available; it overrides ``status`` and
    ``signatures`` of the metadata.
    """
    raw = dict(nb_metadata.get("splicecalc", {}) or {})
    for key in _TEXT_KEYS:
        if key in raw and not isinstance(raw[key], str):
            raise InputError(f"metadata.splicecalc.{key}", raw[key], "a text string")
        if key in raw and len(raw[key]) > TITLE_BLOCK_MAX:
            raise InputError(f"metadata.splicecalc.{key}", raw[key][:40] + "...",
                             f"at most {TITLE_BLOCK_MAX} characters ({len(raw[key])} given)", "Shorten it")
    for i, r in enumerate(raw.get("revisions") or []):
        if isinstance(r, dict):
            for k, v in r.items():
                limit = DESCRIPTION_MAX if k == "description" else TITLE_BLOCK_MAX
                if isinstance(v, str) and len(v) > limit:
                    raise InputError(f"metadata.splicecalc.revisions[{i + 1}].{k}", v[:40] + "...",
                                     f"at most {limit} characters ({len(v)} given)", "Shorten it")
    status = str(raw.get("status", "DRAFT")).strip().upper()
    require_choice("metadata.splicecalc.status", status, STATUSES)
    if signoff is not None:
        status, raw["signatures"] = signoff[0], list(signoff[1])
    today = _dt.date.today().isoformat()
    meta: dict[str, Any] = {
        "project": raw.get("project", "").strip() or "(project)",
        "job_number": raw.get("job_number", "").strip() or "(job no.)",
        "title": raw.get("title", "").strip() or default_title,
        "revision": raw.get("revision", "").strip() or "-",
        "status": status,
        "prepared_by": raw.get("prepared_by", "").strip(),
        "checked_by": raw.get("checked_by", "").strip(),
        "approved_by": raw.get("approved_by", "").strip(),
        "date": raw.get("date", "").strip() or today,
        "basis": raw.get("basis", "").strip(),
        "build_date": today,
    }
    revisions = raw.get("revisions") or []
    if not isinstance(revisions, list) or not all(isinstance(r, dict) for r in revisions):
        raise InputError("metadata.splicecalc.revisions", revisions, "a list of tables with rev, date, description")
    meta["revisions"] = [{"rev": str(r.get("rev", r.get("letter", ""))),
                          **{k: str(r.get(k, "")) for k in ("date", "description", "by", "checked")}}
                         for r in revisions] or [{"rev": meta["revision"], "date": meta["date"],
                                                  "description": "First issue", "by": meta["prepared_by"],
                                                  "checked": meta["checked_by"]}]
    sigs = raw.get("signatures") or []
    if not isinstance(sigs, list) or not all(isinstance(s, dict) for s in sigs):
        raise InputError("metadata.splicecalc.signatures", sigs, "a list of tables with role, name, date")
    by_role = {}
    for s in sigs:
        role = str(s.get("role", "")).lower()
        require_choice("metadata.splicecalc.signatures.role", role, ROLES)
        by_role[role] = s
    meta["signoff"] = [
        {"role": role.capitalize(),
         "name": str(by_role.get(role, {}).get("name", "") or meta[f"{role}_by"]),
         "date": str(by_role.get(role, {}).get("date", "")),
         "mark": _mark(by_role.get(role, {}))}
        for role in ROLES
    ]
    return meta


def _mark(sig: dict[str, Any]) -> str:
    if sig.get("mark"):
        return str(sig["mark"])
    if sig.get("digest"):
        return f"signed electronically, digest {str(sig['digest'])[:12]}"
    return ""


#: hex digits of a SHA-256 shown on the cover (the full value is in the build record `<pdf>.json`)
SHORT_SHA = 16


def provenance(nb: Any, folder: str | None) -> dict[str, str]:
    """What a checker needs to reproduce the package, for the cover: splicecalc's version, the sheet
    template's SHA-256 and the job file's name and SHA-256 (short forms; ``signoff.notebook.versions``
    and ``job_record`` compute them, the build record keeps them in full). Texts only; the template
    escapes them."""
    from pathlib import Path

    from ..signoff.notebook import job_record, versions

    v = versions()
    out = {"version": str(v["splicecalc"]), "template_sha": str(v["latex_template_sha256"])[:SHORT_SHA],
           "job_name": "", "job_sha": ""}
    if folder:
        try:
            rec = job_record(nb, Path(folder) / "notebook.ipynb")
        except (OSError, ValueError, TypeError):
            rec = None
        if rec:
            out["job_name"] = Path(str(rec["name"])).name
            out["job_sha"] = str(rec["sha256"] or "")[:SHORT_SHA] or "(job file not found beside the notebook)"
    return out

