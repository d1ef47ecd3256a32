"""Signatures, revisions and verification, kept in the notebook's metadata.

``nb.metadata["splicecalc"]`` holds::

    signatures: [{role, name, date, digest}, ...]      # append-only history
    revisions:  [{letter, date, description}, ...]     # append-only

A built PDF gets a sidecar ``<name>.pdf.json`` with the PDF's own SHA-256,
the digest it was built from, the signatures valid at build time and
``issued``; an issued PDF is never overwritten.
"""

from __future__ import annotations

import datetime as _dt
import json
import re
from dataclasses import asdict, dataclass
from pathlib import Path
from typing import Any

from ..core.errors import InputError
from ..core.files import write_atomic
from .digest import compute_digest, file_sha256

#: sign-off roles in the order they must be given
ROLES = ("prepared", "checked", "approved")
_STATUS_BY_ROLE = {"prepared": "PREPARED", "checked": "CHECKED", "approved": "APPROVED"}
_REV_RE = re.compile(r"^([A-Z]{1,2}|[PC][0-9]{1,3}|[0-9]{1,3})$")

#: verify exit codes
EXIT_VALID, EXIT_CHANGED, EXIT_UNSIGNED = 0, 1, 3


@dataclass(frozen=True)
class Signature:
    role: str
    name: str
    date: str
    digest: str


@dataclass(frozen=True)
class Revision:
    letter: str
    date: str
    description: str


@dataclass(frozen=True)
class SignStatus:
    """Result of checking a notebook or PDF against its signatures.

    state: "valid" | "changed" | "unsigned"; label: what every page shows.
    """

    state: str
    label: str
    current_digest: str
    signed_digest: str | None
    signatures: tuple[Signature, ...]
    detail: str = ""

    @property
    def exit_code(self) -> int:
        return {"valid": EXIT_VALID, "changed": EXIT_CHANGED, "unsigned": EXIT_UNSIGNED}[self.state]


# ----------------------------------------------------------------- helpers
def _read_nb(path: str | Path):
    import nbformat

    p = Path(path)
    if not p.is_file():
        raise InputError("notebook", str(path), "an existing .ipynb file")
    return nbformat.read(str(p), as_version=4)


def _write_nb(nb: Any, path: str | Path) -> None:
    import nbformat

    write_atomic(path, nbformat.writes(nb))


def ledger_of(nb: Any) -> dict:
    """The splicecalc metadata dict of a notebook (created if absent)."""
    meta = nb.metadata.setdefault("splicecalc", {})
    meta.setdefault("signatures", [])
    meta.setdefault("revisions", [])
    return meta


def _today() -> str:
    return _dt.date.today().isoformat()


# ----------------------------------------------------------------- status
def status_of(nb: Any) -> SignStatus:
    """Compare the notebook's current digest with its latest signature."""
    meta = ledger_of(nb)
    sigs = tuple(Signature(**s) for s in meta["signatures"])
    current = compute_digest(nb)
    if not sigs:
        return SignStatus("unsigned", "DRAFT", current, None, sigs, "no signatures")
    latest = sigs[-1].digest
    if latest != current:
        return SignStatus("changed", "DRAFT - CHANGED SINCE SIGNED", current, latest, sigs,
                          f"signed digest {latest[:12]}..., current {current[:12]}...")
    valid_roles = [s.role for s in sigs if s.digest == current]
    top = max(valid_roles, key=ROLES.index)
    return SignStatus("valid", _STATUS_BY_ROLE[top], current, latest, sigs,
                      "signed: " + ", ".join(f"{s.role} {s.name}" for s in sigs if s.digest == current))


# ----------------------------------------------------------------- actions
def sign_notebook(path: str | Path, role: str, name: str, date: str | None = None) -> SignStatus:
    """Add a signature to an executed notebook (atomic write).

    A checker signs only over a prepared signature of the same digest, and
    must be someone else; an approver only over a checked one.
    """
    if role not in ROLES:
        raise InputError("role", role, "one of " + ", ".join(ROLES))
    if not isinstance(name, str) or not name.strip():
        raise InputError("name", name, "the signer's name (non-empty text)")
    date = date or _today()
    try:
        _dt.date.fromisoformat(date)
    except (TypeError, ValueError):
        raise InputError("date", date, "an ISO date, e.g. 2026-12-02") from None
    nb = _read_nb(path)
    meta = ledger_of(nb)
    from .digest import collect_records

    if not collect_records(nb):
        raise InputError("notebook", str(path), "an executed calc notebook with check records",
                         "Build it first (splicecalc build), then sign the executed notebook")
    digest = compute_digest(nb)
    current = [s for s in meta["signatures"] if s["digest"] == digest]
    if role == "checked":
        preparers = [s for s in current if s["role"] == "prepared"]
        if not preparers:
            raise InputError("role", role, "'prepared' to be signed first on this version")
        if any(s["name"].strip().lower() == name.strip().lower() for s in preparers):
            raise InputError("name", name, "a checker other than the preparer")
    if role == "approved" and not any(s["role"] == "checked" for s in current):
        raise InputError("role", role, "'checked' to be signed first on this version")
    meta["signatures"].append(asdict(Signature(role, name.strip(), date, digest)))
    _write_nb(nb, path)
    return status_of(nb)


def add_revision(path: str | Path, letter: str, description: str, date: str | None = None) -> list[Revision]:
    """Append a revision (letter, date, description); existing ones are never changed."""
    if not isinstance(letter, str) or not _REV_RE.match(letter):
        raise InputError("revision", letter, "a revision code such as A, B, P1, C2 or 01")
    if not isinstance(description, str) or not description.strip():
        raise InputError("description", description, "a short description of the revision")
    nb = _read_nb(path)
    meta = ledger_of(nb)
    if any(r["letter"] == letter for r in meta["revisions"]):
        raise InputError("revision", letter, "a new revision code (revisions are append-only)")
    meta["revisions"].append(asdict(Revision(letter, date or _today(), description.strip())))
    _write_nb(nb, path)
    return [Revision(**r) for r in meta["revisions"]]


# ----------------------------------------------------------------- PDF sidecar
def sidecar_path(pdf: str | Path) -> Path:
    """``<name>.pdf.json`` next to the PDF."""
    p = Path(pdf)
    return p.with_name(p.name + ".json")


def is_protected(pdf: str | Path) -> bool:
    """True when the PDF is an issued revision (sidecar ``{"issued": true}``): never overwrite it.

    A sidecar that exists but cannot be read, or is not a JSON object, also
    protects the PDF: when in doubt, an issued document is not overwritten.
    """
    sc = sidecar_path(pdf)
    if not sc.is_file():
        return False
    try:
        data = json.loads(sc.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return True
    return not isinstance(data, dict) or data.get("issued") is True


def write_sidecar(pdf: str | Path, nb: Any, notebook_path: str | Path | None, issued: bool = False) -> dict:
    """Record the PDF's hash and the sign-off state it was built with."""
    import hashlib

    from .digest import canonical_json, job_inputs

    st = status_of(nb)
    meta = ledger_of(nb)
    job = job_inputs(nb)
    data = {
        "pdf_sha256": file_sha256(pdf),
        "digest": st.current_digest,
        "job_sha256": hashlib.sha256(canonical_json(job).encode("utf-8")).hexdigest() if job else None,
        "status": st.label,
        "signatures": meta["signatures"],
        "revisions": meta["revisions"],
        "notebook": str(notebook_path) if notebook_path else None,
        "issued": issued,
    }
    write_atomic(sidecar_path(pdf), json.dumps(data, indent=2))
    return data


def issue_pdf(pdf: str | Path) -> dict:
    """Mark a built PDF as an issued revision: from now on it is never overwritten."""
    sc = sidecar_path(pdf)
    if not sc.is_file():
        raise InputError("pdf", str(pdf), "a PDF built by splicecalc (its .pdf.json record is missing)")
    data = json.loads(sc.read_text(encoding="utf-8"))
    if data.get("pdf_sha256") != file_sha256(pdf):
        raise InputError("pdf", str(pdf), "the PDF as built (its bytes changed since the build)")
    data["issued"] = True
    write_atomic(sc, json.dumps(data, indent=2))
    return data


def job_file_drift(nb: Any, notebook_path: str | Path) -> str | None:
    """Why the job file on disk no longer matches the inputs the notebook printed, or None.

    The job file is the one the notebook's parameter cell names (``job_file = "..."``,
    relative to the notebook's folder); its canonical inputs are compared with those
    the executed notebook published. No job file named, or none published: None.
    """
    import ast

    from .digest import canonical_json, job_inputs

    printed = job_inputs(nb)
    if not printed:
        return None
    name = None
    for cell in nb.get("cells", []):
        if cell.get("cell_type") != "code":
            continue
        try:
            tree = ast.parse(cell.get("source", "") if isinstance(cell.get("source"), str) else "".join(cell["source"]))
        except SyntaxError:
            continue
        for node in tree.body:
            if (isinstance(node, ast.Assign) and any(isinstance(t, ast.Name) and t.id == "job_file" for t in node.targets)
                    and isinstance(node.value, ast.Constant) and isinstance(node.value.value, str)):
                name = node.value.value
        if name:
            break
    if not name:
        return None
    job_path = Path(notebook_path).parent / name
    if not job_path.is_file():
        return f"the job file {name} named by the notebook is missing"
    from ..job import load_job

    try:
        now = load_job(job_path).to_canonical_dict()
    except InputError as exc:
        return f"the job file {name} no longer loads ({exc})"
    if canonical_json(now) != canonical_json(printed):
        return f"the job file {name} changed since the notebook was executed: rebuild, then sign again"
    return None


def _with_job_drift(st: SignStatus, nb: Any, notebook_path: str | Path) -> SignStatus:
    if st.state != "valid":
        return st
    why = job_file_drift(nb, notebook_path)
    if why is None:
        return st
    return SignStatus("changed", "DRAFT - CHANGED SINCE SIGNED", st.current_digest, st.signed_digest,
                      st.signatures, why)


def verify_path(path: str | Path) -> SignStatus:
    """Verify a notebook or a PDF against its recorded digest (no re-execution).

    Besides the digest, the job file the notebook names is compared with the inputs
    it printed, so an edited job file shows as changed before anyone rebuilds.
    """
    p = Path(path)
    if p.suffix == ".ipynb":
        nb = _read_nb(p)
        return _with_job_drift(status_of(nb), nb, p)
    if p.suffix != ".pdf":
        raise InputError("path", str(path), "a .ipynb notebook or a .pdf calc package")
    if not p.is_file():
        raise InputError("path", str(path), "an existing PDF")
    sc = sidecar_path(p)
    if not sc.is_file():
        return SignStatus("unsigned", "DRAFT", "", None, (), "no .pdf.json record next to the PDF")
    data = json.loads(sc.read_text(encoding="utf-8"))
    sigs = tuple(Signature(**s) for s in data.get("signatures", []))
    digest = data.get("digest", "")
    if data.get("pdf_sha256") != file_sha256(p):
        return SignStatus("changed", "CHANGED SINCE BUILT", digest, sigs[-1].digest if sigs else None, sigs,
                          "the PDF's bytes differ from those recorded at build time")
    nb_path = data.get("notebook")
    if nb_path and not Path(nb_path).is_absolute():
        nb_path = str(p.parent / nb_path)  # recorded relative to the PDF's folder
    nb = _read_nb(nb_path) if nb_path and Path(nb_path).is_file() else None
    if nb is not None:
        now = compute_digest(nb)
        if now != digest:
            return SignStatus("changed", "DRAFT - CHANGED SINCE SIGNED", now, digest, sigs,
                              "the notebook changed since this PDF was built")
    if not sigs:
        return SignStatus("unsigned", "DRAFT", digest, None, sigs, "built unsigned")
    if sigs[-1].digest != digest:
        return SignStatus("changed", "DRAFT - CHANGED SINCE SIGNED", digest, sigs[-1].digest, sigs,
                          "built from inputs that differ from the signed ones")
    top = max((s.role for s in sigs if s.digest == digest), key=ROLES.index)
    st = SignStatus("valid", _STATUS_BY_ROLE[top], digest, digest, sigs, "PDF matches its signed record")
    return _with_job_drift(st, nb, nb_path) if nb is not None else st
