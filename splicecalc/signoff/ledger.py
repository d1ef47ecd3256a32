"""The build record and protection of signed files, plus the old notebook ledger.

The trusted sign-off is in :mod:`.package` (PDF signatures with pyHanko, the notebook's
detached signatures). What stays here: :func:`protection_reason` / :func:`is_protected`
(a build never writes over a signed or issued package, names compared ignoring case),
the build record ``<name>.pdf.json`` (:func:`write_sidecar`, a hint for people, never
trusted), and the ledger of plain signature marks that the cover can print
(:func:`sign_notebook`, :func:`status_of`; no cryptography: use ``splicecalc sign``).

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


def _same_name_files(target: Path) -> list[Path]:
    """Files in ``target``'s folder whose name equals ``target``'s ignoring case (the file systems
    our users share packages on often ignore it), plus ``target`` itself."""
    out = [target]
    want = target.name.casefold()
    try:
        for f in target.parent.iterdir():
            if f.name.casefold() == want and f != target:
                out.append(f)
    except OSError:
        pass
    return out


def _pdf_is_signed(p: Path) -> bool:
    try:
        with open(p, "rb") as fh:
            data = fh.read()
    except OSError:
        return False
    return b"/ByteRange" in data and b"/Sig" in data


def _notebook_is_signed(p: Path) -> bool:
    try:
        meta = (json.loads(p.read_text(encoding="utf-8")).get("metadata") or {}).get("splicecalc") or {}
    except (OSError, ValueError, AttributeError):
        return True        # unreadable: when in doubt, keep it
    return bool(meta.get("sign_off"))     # the old plain marks ("signatures") are not signatures


def protection_reason(pdf: str | Path) -> str | None:
    """Why a build must not write ``pdf`` (or the executed notebook beside it), or None.

    Protected: a PDF that carries a signature, a notebook that carries one, a PDF listed in
    the folder's issue register or marked issued by its build record. Names are compared
    ignoring case, so ``NAME.PDF`` is the same package as ``name.pdf``.
    """
    p = Path(pdf)
    if p.parent.exists():
        p = p.parent.resolve() / p.name
    for cand in _same_name_files(p):
        if cand.is_file() and _pdf_is_signed(cand):
            return f"a signed calc package ({cand.name})"
        sc = sidecar_path(cand)
        if sc.is_file():
            try:
                data = json.loads(sc.read_text(encoding="utf-8"))
            except (OSError, ValueError):
                return "recorded in an unreadable build record"
            if not isinstance(data, dict) or data.get("issued") is True:
                return "an issued revision"
    for cand in [*_same_name_files(p.with_suffix(".ipynb")), p.with_name(f"{p.stem}.executed.ipynb")]:
        if cand.is_file() and _notebook_is_signed(cand):
            return f"the PDF of a signed notebook ({cand.name} is signed; its package is a record)"
    reg = p.parent / "issue_register.json"
    if reg.is_file():
        try:
            rows = json.loads(reg.read_text(encoding="utf-8"))
        except (OSError, ValueError):
            return "in a folder whose issue register cannot be read"
        if isinstance(rows, list) and any(isinstance(r, dict) and str(r.get("file", "")).casefold() == p.name.casefold()
                                          for r in rows):
            return "an issued revision"
    return None


def is_protected(pdf: str | Path) -> bool:
    """True when a build must not write ``pdf``: see :func:`protection_reason`."""
    return protection_reason(pdf) is not None


def _job_file(nb: Any, notebook_path: str | Path | None) -> dict | None:
    """``{"name", "sha256"}`` of the job file the notebook reads (None when there is no notebook path)."""
    from .notebook import job_record

    if not notebook_path:
        return None
    try:
        return job_record(nb, Path(notebook_path))
    except (OSError, ValueError, TypeError):
        return None


def write_sidecar(pdf: str | Path, nb: Any, notebook_path: str | Path | None, issued: bool = False) -> dict:
    """Record what was built: the PDF's and the notebook's SHA-256 (hints for people and for
    `splicecalc sign`, which refuses a PDF and notebook from different builds; never trusted by verify)."""
    import hashlib

    from .digest import canonical_json, job_inputs
    from .notebook import notebook_digest, read_notebook, versions

    st = status_of(nb)
    meta = ledger_of(nb)
    job = job_inputs(nb)
    nb_sha = None
    if notebook_path and Path(notebook_path).is_file():
        try:
            nb_sha = notebook_digest(read_notebook(notebook_path))
        except ValueError:
            nb_sha = None
    data = {
        "pdf_sha256": file_sha256(pdf),
        "notebook_sha256": nb_sha,
        "digest": st.current_digest,
        "job_sha256": hashlib.sha256(canonical_json(job).encode("utf-8")).hexdigest() if job else None,
        # what the cover prints in short (report.metadata.provenance): the software and the job file as read
        "versions": versions(),
        "job_file": _job_file(nb, notebook_path),
        "status": st.label,
        "signatures": meta["signatures"],
        "revisions": meta["revisions"],
        "notebook": str(notebook_path) if notebook_path else None,
        "issued": issued,
        "note": "a hint for people only: `splicecalc verify` reads the signatures, never this file",
    }
    write_atomic(sidecar_path(pdf), json.dumps(data, indent=2))
    return data
