"""The executed notebook's detached signatures (``cryptography``; no hand-made cryptography).

What a signature covers (:func:`notebook_digest`): the WHOLE notebook, parsed from its JSON and
written again canonically (sorted keys, no spaces, multi-line strings joined), so every cell's
source, every output of every type (figures included) and all metadata (title block, revision
history, status) count, while re-indenting or re-ordering the JSON does not. Only the list of
signatures itself, ``metadata.splicecalc.sign_off``, is left out. The signed message adds the
job file's bytes (SHA-256), the versions of splicecalc and of its LaTeX template, the role, the
signer's certificate, the PDF as built (SHA-256 of its first revision), the failing checks and
any reasons given, and the hashes of the signatures before it.

Each entry of ``metadata.splicecalc.sign_off`` is ``{"message": {...}, "signature": base64,
"certificate": PEM}``; the message is signed as canonical JSON with the key of the certificate
(ECDSA with SHA-256, or RSA-PSS for an imported RSA key).
"""

from __future__ import annotations

import base64
import datetime as _dt
import hashlib
import json
import os
import re
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from ..core.errors import InputError
from ..core.files import write_atomic

SIGN_KEY = "sign_off"
MESSAGE_KIND = "splicecalc-notebook-signature/1"
CHECK_MIME = "application/vnd.splicecalc.check+json"
_JSON_MIME = re.compile(r"(^application/(.+\+)?json$)")


class MalformedNotebook(ValueError):
    """The file is not a notebook (JSON with cells)."""


def canonical(obj: Any) -> bytes:
    return json.dumps(obj, sort_keys=True, separators=(",", ":"), ensure_ascii=False).encode("utf-8")


def _join(x: Any) -> Any:
    return "".join(x) if isinstance(x, list) and all(isinstance(s, str) for s in x) else x


def _normalise(nb: dict) -> dict:
    """The notebook with multi-line strings joined (nbformat stores them either way) and no sign-off list.

    Shallow copies of what changes only (the notebook itself is never modified)."""
    d = dict(nb)
    meta = d.get("metadata")
    if isinstance(meta, dict) and isinstance(meta.get("splicecalc"), dict):
        sc = {k: v for k, v in meta["splicecalc"].items() if k != SIGN_KEY}
        d["metadata"] = {**meta, "splicecalc": sc}
    cells = d.get("cells")
    if isinstance(cells, list):
        d["cells"] = [_norm_cell(c) if isinstance(c, dict) else c for c in cells]
    return d


def _norm_cell(cell: dict) -> dict:
    c = dict(cell)
    if "source" in c:
        c["source"] = _join(c["source"])
    outs = c.get("outputs")
    if isinstance(outs, list):
        c["outputs"] = [_norm_output(o) if isinstance(o, dict) else o for o in outs]
    return c


def _norm_output(out: dict) -> dict:
    o = dict(out)
    if "text" in o:
        o["text"] = _join(o["text"])
    data = o.get("data")
    if isinstance(data, dict):
        o["data"] = {mime: (v if _JSON_MIME.match(mime) else _join(v)) for mime, v in data.items()}
    return o


def read_notebook(path: str | Path) -> dict:
    """The notebook's JSON as a dict; MalformedNotebook when it is not a notebook."""
    p = Path(path)
    if not p.is_file():
        raise InputError("notebook", str(path), "an existing .ipynb file")
    try:
        nb = json.loads(p.read_bytes().decode("utf-8"))
    except (UnicodeDecodeError, ValueError) as exc:
        raise MalformedNotebook(f"{p.name} is not a notebook (not JSON: {str(exc)[:60]})") from None
    if not isinstance(nb, dict) or not isinstance(nb.get("cells"), list) or not isinstance(nb.get("metadata", {}), dict):
        raise MalformedNotebook(f"{p.name} is not a notebook (no list of cells)")
    sc = nb.get("metadata", {}).get("splicecalc", {})
    if sc is not None and not isinstance(sc, dict):
        raise MalformedNotebook(f"{p.name}: metadata.splicecalc is not a table")
    return nb


def write_notebook(nb: dict, path: str | Path) -> None:
    write_atomic(path, json.dumps(nb, indent=1, ensure_ascii=False, sort_keys=True) + "\n")


def notebook_digest(nb: dict) -> str:
    """SHA-256 (hex) of the canonical notebook without its sign-off list."""
    return hashlib.sha256(canonical(_normalise(nb))).hexdigest()


def sign_off_entries(nb: dict) -> list:
    meta = nb.get("metadata", {}).get("splicecalc") or {}
    entries = meta.get(SIGN_KEY, [])
    return entries if isinstance(entries, list) else []


def calc_meta(nb: dict) -> dict:
    m = nb.get("metadata", {}).get("splicecalc") or {}
    return m if isinstance(m, dict) else {}


# ----------------------------------------------------------------- the job file and versions
def job_file_name(nb: dict) -> str | None:
    """The job file the parameters cell names (``job_file = "..."``), or None."""
    import ast

    for cell in nb.get("cells", []):
        if not isinstance(cell, dict) or cell.get("cell_type") != "code":
            continue
        src = _join(cell.get("source", ""))
        if not isinstance(src, str) or "job_file" not in src:
            continue
        try:
            tree = ast.parse(src)
        except SyntaxError:
            continue
        for node in tree.body:
            if (isinstance(node, ast.Assign) and any(isinstance(t, ast.Name) and t.id == "job_file" for t in node.targets)
                    and isinstance(node.value, ast.Constant) and isinstance(node.value.value, str)):
                return node.value.value
    return None


def job_record(nb: dict, nb_path: Path) -> dict | None:
    """``{"name", "sha256"}`` of the job file beside the notebook (sha256 None when it is missing)."""
    name = job_file_name(nb)
    if not name:
        return None
    p = nb_path.parent / name
    sha = hashlib.sha256(p.read_bytes()).hexdigest() if p.is_file() else None
    return {"name": name, "sha256": sha}


def versions() -> dict:
    """splicecalc's version and the SHA-256 of its LaTeX template files."""
    import splicecalc

    tdir = Path(__file__).resolve().parents[1] / "report" / "latex" / "calcpackage"
    h = hashlib.sha256()
    for f in sorted(tdir.glob("*")):
        if f.is_file():
            h.update(f.name.encode() + b"\0" + f.read_bytes())
    return {"splicecalc": splicecalc.__version__, "latex_template_sha256": h.hexdigest()}


#: a check record's status for a check the package does not make (core.record.NOT_CHECKED): never a
#: pass, but not a failure either; listed apart
NOT_CHECKED = "not checked"


def _records(nb: dict):
    for cell in nb.get("cells", []):
        if not isinstance(cell, dict):
            continue
        for o in cell.get("outputs", []) or []:
            data = o.get("data") if isinstance(o, dict) else None
            if not isinstance(data, dict) or CHECK_MIME not in data:
                continue
            rec = data[CHECK_MIME]
            if isinstance(rec, (str, list)):
                try:
                    rec = json.loads(_join(rec))
                except ValueError:
                    continue
            if isinstance(rec, dict):
                yield rec


def _label(rec: dict) -> str:
    label = str(rec.get("id", "?"))
    return label + (f" ({rec['title']})" if rec.get("title") else "")


def failing_checks(nb: dict) -> list[str]:
    """Ids (with titles) of the checks made in the notebook's outputs that are not OK."""
    out: list[str] = []
    for rec in _records(nb):
        if rec.get("ok") is False and rec.get("status") != NOT_CHECKED and _label(rec) not in out:
            out.append(_label(rec))
    return out


def not_checked(nb: dict) -> list[str]:
    """Ids (with titles) of the NOT CHECKED records: checks the package does not make."""
    out: list[str] = []
    for rec in _records(nb):
        if rec.get("status") == NOT_CHECKED and _label(rec) not in out:
            out.append(_label(rec))
    return out


# ----------------------------------------------------------------- signing
def _sign_bytes(key: Any, data: bytes) -> tuple[bytes, str]:
    from cryptography.hazmat.primitives import hashes
    from cryptography.hazmat.primitives.asymmetric import ec, padding, rsa

    if isinstance(key, ec.EllipticCurvePrivateKey):
        return key.sign(data, ec.ECDSA(hashes.SHA256())), "ecdsa-sha256"
    if isinstance(key, rsa.RSAPrivateKey):
        return key.sign(data, padding.PSS(mgf=padding.MGF1(hashes.SHA256()), salt_length=32), hashes.SHA256()), \
            "rsa-pss-sha256"
    raise InputError("--key", type(key).__name__, "an ECDSA or RSA key")


def _verify_bytes(cert: Any, sig: bytes, data: bytes, alg: str) -> bool:
    from cryptography.exceptions import InvalidSignature
    from cryptography.hazmat.primitives import hashes
    from cryptography.hazmat.primitives.asymmetric import ec, padding, rsa

    pub = cert.public_key()
    try:
        if alg == "ecdsa-sha256" and isinstance(pub, ec.EllipticCurvePublicKey):
            pub.verify(sig, data, ec.ECDSA(hashes.SHA256()))
        elif alg == "rsa-pss-sha256" and isinstance(pub, rsa.RSAPublicKey):
            pub.verify(sig, data, padding.PSS(mgf=padding.MGF1(hashes.SHA256()), salt_length=32), hashes.SHA256())
        else:
            return False
    except InvalidSignature:
        return False
    return True


def entry_hash(entry: dict) -> str:
    return hashlib.sha256(canonical(entry.get("message", {}))).hexdigest()


def make_entry(nb: dict, nb_path: Path, kp: Any, role: str, *, pdf_sha256: str | None, extra: dict,
               when: _dt.datetime | None = None, digest: str | None = None) -> dict:
    """A new signed entry for ``nb`` (not yet added to it)."""
    from .keys import cert_pem

    when = when or _dt.datetime.now(_dt.timezone.utc)
    msg = {
        "kind": MESSAGE_KIND,
        "role": role,
        "signer": kp.name,
        "cert_sha256": kp.fingerprint,
        "signed_at": when.isoformat(timespec="seconds"),
        "notebook_sha256": digest or notebook_digest(nb),
        "job": job_record(nb, nb_path),
        "versions": versions(),
        "pdf_sha256": pdf_sha256,
        "revision": str(calc_meta(nb).get("revision", "") or ""),
        "failing_checks": failing_checks(nb),
        "previous": [entry_hash(e) for e in sign_off_entries(nb) if isinstance(e, dict)],
        **extra,
    }
    sig, alg = _sign_bytes(kp.key, canonical(msg))
    return {"message": msg, "algorithm": alg, "signature": base64.b64encode(sig).decode("ascii"),
            "certificate": cert_pem(kp.cert)}


def add_entry(nb: dict, entry: dict) -> None:
    meta = nb.setdefault("metadata", {}).setdefault("splicecalc", {})
    meta.setdefault(SIGN_KEY, []).append(entry)


# ----------------------------------------------------------------- verifying
@dataclass
class NbSig:
    role: str
    signer: str
    fingerprint: str
    signed_at: str
    valid: bool
    trusted: bool
    message: dict
    problems: list[str] = field(default_factory=list)

    def to_dict(self) -> dict:
        return {"role": self.role, "signer": self.signer, "fingerprint": self.fingerprint,
                "signed_at": self.signed_at, "valid": self.valid, "trusted": self.trusted, "problems": self.problems}


def verify_entries(nb: dict, nb_path: Path, trusted: list[Any], digest: str | None = None) -> list[NbSig]:
    """Check every sign-off entry against the notebook as it is now (and the job file beside it);
    ``trusted``: the trust list's certificates."""
    from .keys import cert_fingerprint, cert_name, is_trusted, load_cert

    digest = digest or notebook_digest(nb)
    job_now = job_record(nb, nb_path)
    out: list[NbSig] = []
    earlier: list[str] = []
    for i, e in enumerate(sign_off_entries(nb)):
        problems: list[str] = []
        if not isinstance(e, dict) or not isinstance(e.get("message"), dict):
            out.append(NbSig("?", "?", "", "", False, False, {}, [f"sign-off entry {i + 1} is not a signature"]))
            earlier.append("")
            continue
        msg = e["message"]
        try:
            cert = load_cert(str(e.get("certificate", "")))
            sig = base64.b64decode(str(e.get("signature", "")), validate=True)
        except (InputError, ValueError):
            out.append(NbSig(str(msg.get("role", "?")), str(msg.get("signer", "?")), "", "", False, False, msg,
                             [f"sign-off entry {i + 1}: unreadable certificate or signature"]))
            earlier.append(entry_hash(e))
            continue
        fp = cert_fingerprint(cert)
        valid = _verify_bytes(cert, sig, canonical(msg), str(e.get("algorithm", "")))
        if not valid:
            problems.append("the signature does not match its record (role, name or contents edited)")
        if msg.get("kind") != MESSAGE_KIND:
            problems.append("not a splicecalc notebook signature")
        if msg.get("cert_sha256") != fp or msg.get("signer") != cert_name(cert):
            problems.append("signed by a certificate other than the one recorded")
        if msg.get("notebook_sha256") != digest:
            problems.append("the notebook changed since it was signed (cells, outputs or metadata)")
        if msg.get("job") != job_now:
            j = msg.get("job") or {}
            if job_now and job_now.get("sha256") is None:
                problems.append(f"the job file {job_now.get('name')} is missing")
            else:
                problems.append(f"the job file {j.get('name') or (job_now or {}).get('name')} changed since signed")
        if msg.get("previous") != earlier:
            problems.append("the signatures before this one were changed, removed or re-ordered")
        earlier.append(entry_hash(e))
        out.append(NbSig(str(msg.get("role", "?")), str(msg.get("signer", "?")), fp, str(msg.get("signed_at", "")),
                         valid, is_trusted(cert, trusted), msg, problems))
    return out


def sibling(path: Path, suffix: str) -> Path | None:
    """The file with ``path``'s stem and ``suffix`` in the same folder (case-insensitive), or None.

    A PDF's executed notebook is ``<stem>.executed.ipynb`` when the build kept it under that name
    (``splicecalc build X.ipynb`` never rewrites its source ``X.ipynb``), unless the PDF's build
    record names the plain ``<stem>.ipynb``."""
    if suffix == ".ipynb" and path.suffix.lower() == ".pdf":
        executed = path.with_name(f"{path.stem}.executed.ipynb")
        if executed.is_file():
            recorded = None
            try:
                recorded = json.loads(Path(str(path) + ".json").read_text(encoding="utf-8")).get("notebook")
            except (OSError, ValueError, AttributeError):
                pass
            if not recorded or Path(recorded).name != path.with_suffix(suffix).name:
                return executed
    want = (path.stem + suffix).casefold()
    exact = path.with_suffix(suffix)
    if exact.is_file():
        return exact
    try:
        for f in path.parent.iterdir():
            if f.name.casefold() == want and f.is_file():
                return f
    except OSError:
        return None
    return None


__all__ = ["MalformedNotebook", "NbSig", "SIGN_KEY", "add_entry", "calc_meta", "canonical", "failing_checks",
           "job_file_name", "job_record", "make_entry", "notebook_digest", "read_notebook", "sibling",
           "sign_off_entries", "verify_entries", "versions", "write_notebook"]
_ = os
