"""The digest a signature covers.

digest = SHA-256 of the canonical JSON (sorted keys, no spaces, floats
rounded to 9 significant figures so that re-execution noise in the last bit
does not matter) of::

    {"job": canonical job inputs, "checks": every check record in the
     executed notebook, "code": the source of every code cell,
     "version": splicecalc.__version__}

Check records travel in the executed notebook as display data with the MIME
type :data:`CHECK_MIME` (written by ``splicecalc.report``), so verification
needs no re-execution.
"""

from __future__ import annotations

import hashlib
import json
import math
from pathlib import Path
from typing import Any

import splicecalc

#: MIME type under which a check record (CheckRecord.to_dict()) is published in a notebook output
CHECK_MIME = "application/vnd.splicecalc.check+json"
#: MIME type of the canonical job inputs published by a template's first cell
JOB_MIME = "application/vnd.splicecalc.job+json"


def _normalise(x: Any) -> Any:
    if isinstance(x, float):
        if not math.isfinite(x):
            return str(x)
        return float(f"{x:.9g}")
    if isinstance(x, dict):
        return {str(k): _normalise(v) for k, v in x.items()}
    if isinstance(x, (list, tuple)):
        return [_normalise(v) for v in x]
    return x


def canonical_json(obj: Any) -> str:
    """Deterministic JSON: sorted keys, compact, floats to 9 significant figures."""
    return json.dumps(_normalise(obj), sort_keys=True, separators=(",", ":"), ensure_ascii=True)


def _outputs(nb: Any):
    for cell in nb.get("cells", []):
        if cell.get("cell_type") != "code":
            continue
        for out in cell.get("outputs", []):
            data = out.get("data") or {}
            yield data


def collect_records(nb: Any) -> list[dict]:
    """Every check record published in the notebook's outputs, in order."""
    recs = []
    for data in _outputs(nb):
        if CHECK_MIME in data:
            rec = data[CHECK_MIME]
            if isinstance(rec, str):
                rec = json.loads(rec)
            recs.append(rec)
    return recs


def job_inputs(nb: Any) -> dict:
    """The canonical job inputs published by the notebook (last one wins), or {}."""
    job: dict = {}
    for data in _outputs(nb):
        if JOB_MIME in data:
            j = data[JOB_MIME]
            job = json.loads(j) if isinstance(j, str) else dict(j)
    return job


def code_cells(nb: Any) -> list[str]:
    """Source of every code cell, whitespace at the ends stripped."""
    out = []
    for cell in nb.get("cells", []):
        if cell.get("cell_type") == "code":
            src = cell.get("source", "")
            if isinstance(src, list):
                src = "".join(src)
            out.append(src.strip())
    return out


def digest_payload(nb: Any) -> dict:
    """What the digest covers, as a dict (useful to show a reviewer what changed)."""
    return {
        "job": job_inputs(nb),
        "checks": collect_records(nb),
        "code": code_cells(nb),
        "version": splicecalc.__version__,
    }


def compute_digest(nb: Any) -> str:
    """SHA-256 hex digest of :func:`digest_payload`."""
    return hashlib.sha256(canonical_json(digest_payload(nb)).encode("utf-8")).hexdigest()


def file_sha256(path: str | Path) -> str:
    """SHA-256 of a file's bytes."""
    h = hashlib.sha256()
    with open(path, "rb") as f:
        for chunk in iter(lambda: f.read(1 << 16), b""):
            h.update(chunk)
    return h.hexdigest()
