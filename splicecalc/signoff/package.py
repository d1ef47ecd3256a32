"""Sign-off of a calc package: the PDF and its executed notebook signed, verified and issued together.

* :func:`sign_package` signs ``NAME.pdf`` (PAdES, :mod:`.pdfsign`) and ``NAME.ipynb`` beside it
  (detached signature, :mod:`.notebook`) with one key, in one role;
* :func:`verify_package` trusts signatures only (never the ``.pdf.json`` build record);
* :func:`issue_package` adds the issue stamp (a signature in the cover's issue field) and a row
  in the folder's issue register ``issue_register.json``.

Role order: prepared first; checked needs a prepared signature by someone else; approved needs
checked; the issue needs checked. One person in two roles needs a stated reason
(``same_person_ok``), which is printed in the signature on the cover.
"""

from __future__ import annotations

import datetime as _dt
import hashlib
import json
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from ..core.errors import InputError
from ..core.files import write_atomic
from ..review import register_changed_since, register_state
from . import notebook as nbs
from . import pdfsign

ROLES = ("prepared", "checked", "approved")
REGISTER = "issue_register.json"
EXIT_VALID, EXIT_CHANGED, EXIT_UNSIGNED = 0, 1, 3


class AlreadyIssued(InputError):
    """This revision was issued before."""


# ----------------------------------------------------------------- role order
def _same(a: tuple[str, str], b: tuple[str, str]) -> bool:
    return a[0] == b[0] or a[1].strip().casefold() == b[1].strip().casefold()


def role_order_problems(sigs: list[tuple[str, str, str, dict]]) -> list[str]:
    """Problems with the order of ``(role, fingerprint, name, tag)`` signatures (oldest first)."""
    problems: list[str] = []
    seen: dict[str, tuple[str, str]] = {}
    for role, fp, name, tag in sigs:
        who = (fp, name)
        if role in seen:
            problems.append(f"role {role} signed twice")
            continue
        if role == "prepared" and seen:
            problems.append("prepared must be the first signature")
        if role == "checked":
            if "prepared" not in seen:
                problems.append("checked without a prepared signature before it")
            elif _same(seen["prepared"], who) and not tag.get("same_person_ok"):
                problems.append(f"{name} signed both prepared and checked without a stated reason "
                                "(--same-person-ok)")
        if role == "approved":
            if "checked" not in seen:
                problems.append("approved without a checked signature before it")
            elif any(_same(seen[r], who) for r in ("prepared", "checked") if r in seen) and not tag.get("same_person_ok"):
                problems.append(f"{name} approved work they prepared or checked without a stated reason "
                                "(--same-person-ok)")
        if role == "issued" and "checked" not in seen:
            problems.append("issued without a checked signature")
        seen[role] = who
    return problems


# ----------------------------------------------------------------- verification
@dataclass
class PackageStatus:
    """What :func:`verify_package` found. state: valid | changed | unsigned."""

    path: Path
    state: str
    lines: list[str]
    pdf: list[Any] = field(default_factory=list)
    notebook: list[Any] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)

    @property
    def exit_code(self) -> int:
        return {"valid": EXIT_VALID, "changed": EXIT_CHANGED, "unsigned": EXIT_UNSIGNED}[self.state]

    @property
    def top_role(self) -> str | None:
        roles = [s.role for s in (self.pdf or self.notebook) if s.role in ROLES]
        return max(roles, key=ROLES.index) if roles else None

    def to_dict(self) -> dict:
        return {"path": str(self.path), "state": self.state, "lines": self.lines, "notes": self.notes,
                "pdf_signatures": [s.to_dict() for s in self.pdf],
                "notebook_signatures": [s.to_dict() for s in self.notebook]}


def _trust() -> list[Any]:
    from .keys import trusted_certs

    return trusted_certs()


def impostor_problems(kind: str, sigs: list[Any], certs: list[Any]) -> list[str]:
    """Valid signatures by an untrusted key whose name is that of a trusted certificate.

    Anyone can make a key in any name (``keys new``); a second key in a trusted colleague's name is
    what an impostor shows, so it is a problem, not "valid but untrusted"."""
    from .keys import cert_name

    names = {cert_name(c).strip().casefold() for c in certs}
    return [f"{kind} {s.role} ({s.signer}): signed with a key that is not in the trust list, although a trusted "
            f"certificate carries that name (an impostor, or a new key of theirs: confirm it with them, then "
            f"splicecalc keys trust THEIR.pem)"
            for s in sigs if s.valid and not s.trusted and s.signer.strip().casefold() in names]


def _trust_word(trusted: bool) -> str:
    return "trusted" if trusted else "valid but untrusted signer"


def _quiet_pyhanko():
    import logging

    for name in ("pyhanko", "pyhanko_certvalidator"):
        logging.getLogger(name).setLevel(logging.CRITICAL)


def acceptance_problems(kind: str, sigs: list[tuple[str, str, dict]], nb: dict) -> list[str]:
    """Checked / approved signatures ``(role, signer, record)`` over failing checks or NOT CHECKED records of
    ``nb`` that state no acceptance (`sign` refuses them; a signature made by other means is caught here)."""
    fails, gaps = nbs.failing_checks(nb), nbs.not_checked(nb)
    out = []
    for role, signer, rec in sigs:
        if role not in ("checked", "approved"):
            continue
        if fails and not rec.get("accept_failing"):
            out.append(f"{kind} {role} ({signer}): signed over {len(fails)} failing check(s) without stating "
                       "why they are accepted (--accept-failing)")
        if gaps and not rec.get("accept_not_checked"):
            out.append(f"{kind} {role} ({signer}): signed over {len(gaps)} NOT CHECKED item(s) without stating "
                       "how they are covered (--accept-not-checked)")
    return out


def _verify_nb(nb_path: Path, trusted: list[Any]) -> tuple[dict, list[Any], list[str], str]:
    nb = nbs.read_notebook(nb_path)
    digest = nbs.notebook_digest(nb)
    sigs = nbs.verify_entries(nb, nb_path, trusted, digest)
    problems = [f"notebook {s.role} ({s.signer}): {p}" for s in sigs for p in s.problems]
    problems += impostor_problems("notebook", sigs, trusted)
    problems += [f"notebook: {p}" for p in role_order_problems([(s.role, s.fingerprint, s.signer,
                                                                 s.message) for s in sigs])]
    for s in sigs:
        if s.role not in ROLES:
            problems.append(f"notebook: unknown role {s.role!r}")
    problems += acceptance_problems("notebook", [(s.role, s.signer, s.message) for s in sigs], nb)
    return nb, sigs, problems, digest


def verify_package(path: str | Path, thorough: bool = False) -> PackageStatus:
    """Verify a calc-package PDF (and the executed notebook beside it), or a notebook on its own.

    ``thorough``: also run pyHanko's full difference analysis over the PDF's later updates
    (seconds on a package; the quick rule of :func:`pdfsign.update_problems` always runs)."""
    p = Path(path)
    if not p.is_file():
        raise InputError("PATH", str(path), "an existing calc-package .pdf or executed .ipynb")
    _quiet_pyhanko()
    certs = _trust()
    if p.suffix.lower() == ".ipynb":
        try:
            nb, sigs, problems, _ = _verify_nb(p, certs)
        except nbs.MalformedNotebook as exc:        # not a notebook at all: bad input, not a changed one
            raise InputError("PATH", str(path), "an executed calc notebook (.ipynb JSON with cells)",
                             str(exc)) from None
        if not sigs:
            return PackageStatus(p, "unsigned", [f"UNSIGNED: {p.name} has no signatures"])
        lines = [f"{s.role}: {s.signer}, {s.signed_at} - "
                 + ("signature valid, " + _trust_word(s.trusted) if s.valid else "signature INVALID") for s in sigs]
        state = "changed" if problems else "valid"
        head = ("VALID: notebook signed " + ", ".join(s.role for s in sigs)) if not problems else \
            "CHANGED: " + "; ".join(problems)
        return PackageStatus(p, state, [head] + lines, notebook=sigs)
    if p.suffix.lower() != ".pdf":
        raise InputError("PATH", str(path), "a .pdf calc package or an .ipynb executed notebook")
    data = p.read_bytes()
    if not data.lstrip()[:5] == b"%PDF-":
        raise InputError("PATH", str(path), "a PDF file (it does not start with %PDF-)")
    try:
        psigs = pdfsign.validate_pdf_bytes(data, certs, thorough=thorough)
    except pdfsign.MalformedPDF as exc:
        return PackageStatus(p, "changed", [f"INVALID: {p.name} is {exc}"])
    if not psigs:
        return PackageStatus(p, "unsigned", [f"UNSIGNED: {p.name} has no signatures"])
    problems = [f"PDF {s.role} ({s.signer}): {x}" for s in psigs for x in s.problems]
    problems += impostor_problems("PDF", [s for s in psigs if s.intact], certs)
    problems += [f"PDF: {x}" for x in role_order_problems([(s.role, s.fingerprint, s.signer, s.tag) for s in psigs])]
    if psigs and not psigs[0].certified:
        problems.append("PDF: the first signature does not certify the document")
    notes: list[str] = []
    nsigs: list[Any] = []
    nb_path = nbs.sibling(p, ".ipynb")
    if nb_path is None:
        notes.append(f"no executed notebook {p.stem}.ipynb beside the PDF: the PDF alone was verified")
    else:
        try:
            nb, nsigs, nprob, digest = _verify_nb(nb_path, certs)
            problems += nprob
            base = pdfsign.base_revision_sha256(data)
            for s in psigs:
                if s.tag.get("notebook_sha256") not in (None, digest):
                    problems.append(f"PDF {s.role}: signed over another notebook than {nb_path.name}")
            pdf_roles = [(s.role, s.fingerprint) for s in psigs if s.role in ROLES]
            nb_roles = [(s.role, s.fingerprint) for s in nsigs]
            if pdf_roles != nb_roles:
                problems.append(f"the PDF's signatures ({', '.join(r for r, _ in pdf_roles) or 'none'}) and the "
                                f"notebook's ({', '.join(r for r, _ in nb_roles) or 'none'}) differ")
            why = pdf_notebook_job_mismatch(data, nb)
            if why:
                problems.append(f"PDF and notebook: {why}")
            problems += acceptance_problems("PDF", [(s.role, s.signer, s.tag) for s in psigs], nb)
            for s in nsigs:
                if s.message.get("pdf_sha256") != base:
                    problems.append(f"notebook {s.role}: signed with another PDF than {p.name}")
        except nbs.MalformedNotebook as exc:
            problems.append(f"notebook: {exc}")
    lines = []
    for s in psigs:
        extra = ""
        for key, label in (("same_person_ok", "same person"), ("accept_failing", "failing checks accepted"),
                           ("accept_not_checked", "NOT CHECKED items acknowledged"),
                           ("open_comments_ok", "open review comments accepted"),
                           ("override", "override"), ("purpose", "purpose")):
            if s.tag.get(key):
                extra += f"; {label}: {s.tag[key]}"
        lines.append(f"{s.role}: {s.signer}, {s.signed_at} - "
                     + (("signature valid, " + _trust_word(s.trusted)) if s.intact and s.valid else "signature INVALID")
                     + extra)
    for s_ in psigs:
        why = register_changed_since(p, s_.tag)
        if why:
            problems.append(f"PDF {s_.role}: {why}")
    rec_note = _build_record_note(p, psigs)
    if rec_note:
        notes.append(rec_note)
    if problems:
        return PackageStatus(p, "changed", ["CHANGED: " + "; ".join(problems)] + lines, psigs, nsigs, notes)
    roles = ", ".join(s.role for s in psigs)
    return PackageStatus(p, "valid", [f"VALID: {p.name} signed {roles}"] + lines + notes, psigs, nsigs, notes)


# ----------------------------------------------------------------- signing
def _notebook_for(pdf: Path) -> Path:
    nb = nbs.sibling(pdf, ".ipynb")
    if nb is None:
        raise InputError("PACKAGE.pdf", str(pdf), f"a calc package with its executed notebook {pdf.stem}.ipynb "
                         "beside it (as `splicecalc build` writes them)")
    return nb


def _text(field: str, v: str | None) -> str | None:
    if v is None:
        return None
    if not isinstance(v, str) or not v.strip():
        raise InputError(field, v, "a reason in words")
    v = " ".join(v.split())
    if len(v) > 300:
        raise InputError(field, v[:40] + "...", "a reason of at most 300 characters")
    return v


def _build_record_mismatch(pdf: Path, nb: dict, data: bytes) -> str | None:
    """Why the build record (a hint only) says this PDF was not built from this notebook, or None."""
    from .ledger import sidecar_path

    sc = sidecar_path(pdf)
    if not sc.is_file():
        return None
    try:
        rec = json.loads(sc.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    if not isinstance(rec, dict):
        return None
    if rec.get("notebook_sha256") and rec["notebook_sha256"] != nbs.notebook_digest(nb):
        return "the executed notebook is not the one this PDF was built from (or it was edited since)"
    if rec.get("pdf_sha256") and rec["pdf_sha256"] != hashlib.sha256(data).hexdigest():
        return "the PDF is not the one built with this notebook (or it was edited since)"
    return None


def _build_record_note(pdf: Path, psigs: list[Any]) -> str | None:
    """A note when the build record's list of signatures (a hint for people) is not what the PDF carries."""
    from .ledger import sidecar_path

    sc = sidecar_path(pdf)
    if not sc.is_file():
        return None
    try:
        rec = json.loads(sc.read_text(encoding="utf-8"))
        claimed = [(str(e.get("role")), str(e.get("signer"))) for e in rec.get("signed") or []]
    except (OSError, ValueError, AttributeError, TypeError):
        return f"the build record {sc.name} cannot be read (a hint only; the signatures above are what counts)"
    actual = [(s.role, s.signer) for s in psigs if s.role in ROLES]
    if claimed == actual:
        return None
    said = ", ".join(f"{r} {n}" for r, n in claimed) or "none"
    return (f"the build record {sc.name} lists other signatures ({said[:200]}) than the PDF carries: it is a "
            f"hint only and was edited or is stale; the signatures above are what counts")


def _alnum(text: Any) -> str:
    return "".join(ch for ch in str(text or "").casefold() if ch.isalnum())


def pdf_notebook_job_mismatch(data: bytes, nb: dict) -> str | None:
    """Why the PDF (its title and job number, set from the title block at build) is not of the
    notebook's job, or None. Compared on letters and digits only, so escaping cannot differ."""
    try:
        # pyHanko's reader (already imported to verify): the document information of the latest revision
        info = pdfsign._open(data).trailer_view.get("/Info")
        info = info.get_object() if info is not None else {}
        pdf_title, subject = str(info.get("/Title") or ""), str(info.get("/Subject") or "")
    except Exception:   # noqa: BLE001 - an unreadable PDF is reported by the signature check
        return None
    meta = nb.get("metadata", {}).get("splicecalc", {}) if isinstance(nb.get("metadata"), dict) else {}
    meta = meta if isinstance(meta, dict) else {}
    pdf_job = subject.rsplit(", job ", 1)[1] if ", job " in subject else ""
    for what, mine, theirs in (("job number", meta.get("job_number"), pdf_job), ("title", meta.get("title"), pdf_title)):
        # a long text is shortened in the PDF's metadata (core.text.shorten's marker): its kept start is compared
        cut = " [... " in theirs and "more characters: in full under" in theirs
        a, b = _alnum(mine), _alnum(theirs.split(" [... ")[0] if cut else theirs)
        if cut:
            a = a[:len(b)]
        if a and b and a != b:
            return f"the PDF's {what} ({str(theirs)[:60]!r}) is not the notebook's ({str(mine)[:60]!r}): another job"
    return None


def acceptance_note(role: str, name: str, failing: int, accept_failing: str | None, gaps: int,
                    accept_not_checked: str | None) -> str | None:
    """The sentence a checked / approved signature prints in the summary's acceptance box (and keeps in
    its own record as ``accept_note``), or None when it accepts nothing."""
    parts = []
    if accept_failing:
        parts.append(f"{failing} failing check(s) accepted: {accept_failing}")
    if accept_not_checked:
        parts.append(f"{gaps} NOT CHECKED item(s) acknowledged: {accept_not_checked}")
    if not parts:
        return None
    return f"{role.capitalize()} by {name}: " + ". ".join(parts) + "."


@dataclass(frozen=True)
class SignResult:
    pdf: Path
    notebook: Path
    role: str
    signer: str
    failing: list[str]
    not_checked: tuple[str, ...] = ()

    @property
    def status(self) -> PackageStatus:
        """The package verified after signing (computed when asked)."""
        return verify_package(self.pdf)


def _package_pdf(pdf: str | Path) -> Path:
    """The PACKAGE.pdf argument of sign / issue as a path; one-line error unless it is an existing PDF."""
    p = Path(pdf)
    if not p.is_file() or p.suffix.lower() != ".pdf":
        raise InputError("PACKAGE.pdf", str(pdf), "an existing calc-package PDF")
    return p


def sign_package(pdf: str | Path, role: str, kp: Any, *, reason: str | None = None,
                 same_person_ok: str | None = None, accept_failing: str | None = None,
                 open_comments_ok: str | None = None, accept_not_checked: str | None = None,
                 when: _dt.datetime | None = None) -> SignResult:
    """Sign the package ``pdf`` (and its notebook) in ``role`` with the key pair ``kp``.

    A checked or approved signature over failing checks needs ``accept_failing``, over NOT CHECKED
    records ``accept_not_checked`` (each a reason in words); both are printed in the signature on the
    cover and in the summary's acceptance box (:func:`acceptance_note`)."""
    if role not in ROLES:
        raise InputError("--role", role, "one of " + ", ".join(ROLES))
    reason, same_person_ok, accept_failing = (_text("--reason", reason), _text("--same-person-ok", same_person_ok),
                                              _text("--accept-failing", accept_failing))
    open_comments_ok = _text("--open-comments-ok", open_comments_ok)
    accept_not_checked = _text("--accept-not-checked", accept_not_checked)
    p = _package_pdf(pdf)
    nb_path = _notebook_for(p)
    st = verify_package(p)
    if st.state == "changed":
        raise InputError("PACKAGE.pdf", str(pdf), "a package whose signatures are intact",
                         "; ".join(st.lines[:1]))
    if any(s.role == "issued" for s in st.pdf):
        raise InputError("PACKAGE.pdf", str(pdf), "a package not yet issued (an issued file is never changed)",
                         "start the next revision with splicecalc revise")
    try:
        nb = nbs.read_notebook(nb_path)
    except nbs.MalformedNotebook as exc:
        raise InputError("notebook", str(nb_path), "an executed calc notebook", str(exc)) from None
    data = p.read_bytes()
    if st.state == "unsigned":
        if nbs.sign_off_entries(nb):
            raise InputError("notebook", str(nb_path), "the notebook of this unsigned PDF (it carries signatures)")
        why = _build_record_mismatch(p, nb, data) or pdf_notebook_job_mismatch(data, nb)
        if why:
            raise InputError("PACKAGE.pdf", str(pdf), "the PDF and notebook of one build", why)
    if not any(CHECK in json.dumps(c.get("outputs", [])) for c in nb.get("cells", []) if isinstance(c, dict)
               for CHECK in [nbs.CHECK_MIME]):
        raise InputError("notebook", str(nb_path), "an executed calc notebook with check records",
                         "build it first with splicecalc build")
    prior = [(s.role, s.fingerprint, s.signer, s.tag) for s in st.pdf]
    probs = role_order_problems(prior + [(role, kp.fingerprint, kp.name,
                                          {"same_person_ok": same_person_ok} if same_person_ok else {})])
    if probs:           # the order first: what else the role needs is said once it may sign at all
        raise InputError("--role", role, "the next role in order: prepared, then checked by another person, "
                         "then approved", probs[-1])
    failing = nbs.failing_checks(nb)
    if failing and role in ("checked", "approved") and not accept_failing:
        raise InputError("--role", role, "a package without failing checks, or --accept-failing \"reason\"",
                         f"{len(failing)} failing: " + ", ".join(failing[:8]) + ("..." if len(failing) > 8 else ""))
    if not failing or role == "prepared":
        accept_failing = None
    gaps = nbs.not_checked(nb)
    if gaps and role in ("checked", "approved") and not accept_not_checked:
        raise InputError("--role", role, "a package without NOT CHECKED items, or --accept-not-checked \"reason\"",
                         f"{len(gaps)} NOT CHECKED: " + ", ".join(gaps[:8]) + ("..." if len(gaps) > 8 else "")
                         + " (each needs information or a separate check; say how that is covered)")
    if not gaps or role == "prepared":
        accept_not_checked = None
    # the review register (splicecalc review): no checked / approved signature over open queries
    review = register_state(p)
    unresolved = review.unresolved if review else ()
    if unresolved and role in ("checked", "approved") and not open_comments_ok:
        raise InputError("--role", role, "a package whose review comments are all closed, or "
                         "--open-comments-ok \"reason\"", f"{len(unresolved)} not closed: " + ", ".join(unresolved[:10])
                         + " (splicecalc review list PACKAGE --open)")
    if not unresolved or role == "prepared":
        open_comments_ok = None
    digest = nbs.notebook_digest(nb)
    tag = {"role": role, "notebook_sha256": digest,
           "revision": str(nbs.calc_meta(nb).get("revision", "") or ""), "failing": len(failing)}
    if same_person_ok:
        tag["same_person_ok"] = same_person_ok
    if accept_failing:
        tag["accept_failing"] = accept_failing
    if accept_not_checked:
        tag["not_checked"] = len(gaps)
        tag["accept_not_checked"] = accept_not_checked
    note = acceptance_note(role, kp.name, len(failing), accept_failing, len(gaps), accept_not_checked)
    if note:
        tag["accept_note"] = note
    if review:
        tag.update(review.tag())
    if open_comments_ok:
        tag["open_comments_ok"] = open_comments_ok
    probs = role_order_problems(prior + [(role, kp.fingerprint, kp.name, tag)])
    if probs:
        raise InputError("--role", role, "the next role in order: prepared, then checked by another person, "
                         "then approved", probs[-1])
    when = when or _dt.datetime.now(_dt.timezone.utc)
    extra = {k: tag[k] for k in ("same_person_ok", "accept_failing", "accept_not_checked", "open_comments_ok",
                                 "review_register",
                                 "review_bytes", "review_sha256") if k in tag}
    entry = nbs.make_entry(nb, nb_path, kp, role, pdf_sha256=pdfsign.base_revision_sha256(data), extra=extra,
                           when=when, digest=digest)
    lines = [f"{role.capitalize()}: {kp.name}", f"signed {when.strftime('%Y-%m-%d %H:%M')} UTC (digital signature)"]
    if same_person_ok:
        lines.append(f"Same person as earlier role: {same_person_ok}"[:64])
    if accept_failing:
        lines.append(f"{len(failing)} failing check(s) accepted: {accept_failing}"[:64])
    if accept_not_checked:
        lines.append(f"{len(gaps)} NOT CHECKED acknowledged: {accept_not_checked}"[:64])
    if open_comments_ok:
        lines.append(f"{len(unresolved)} review comment(s) open: {open_comments_ok}"[:64])
    if reason:
        lines.append(reason[:64])
    human = f"{role.capitalize()} by {kp.name}" + (f": {reason}" if reason else "")
    if same_person_ok:
        human += f". Same person in two roles: {same_person_ok}"
    if accept_failing:
        human += f". {len(failing)} failing check(s) accepted: {accept_failing}"
    if accept_not_checked:
        human += f". {len(gaps)} NOT CHECKED item(s) acknowledged: {accept_not_checked}"
    if open_comments_ok:
        human += f". {len(unresolved)} review comment(s) open ({', '.join(unresolved[:10])}): {open_comments_ok}"
    signed = pdfsign.sign_pdf_bytes(data, kp, role, human_reason=human, tag=tag, appearance_lines=lines[:5],
                                    when=when)
    nbs.add_entry(nb, entry)
    write_atomic(p, signed)
    nbs.write_notebook(nb, nb_path)
    _update_record(p, nb)
    return SignResult(p, nb_path, role, kp.name, failing, tuple(gaps))


def _update_record(pdf: Path, nb: dict) -> None:
    """Refresh the build record (a hint for people; never read to verify)."""
    from .ledger import sidecar_path

    sc = sidecar_path(pdf)
    try:
        rec = json.loads(sc.read_text(encoding="utf-8")) if sc.is_file() else {}
        if not isinstance(rec, dict):
            rec = {}
    except (OSError, ValueError):
        rec = {}
    rec["signed"] = [{k: e["message"].get(k) for k in ("role", "signer", "signed_at")}
                     for e in nbs.sign_off_entries(nb) if isinstance(e, dict) and isinstance(e.get("message"), dict)]
    rec["note"] = "a hint for people only: `splicecalc verify` reads the signatures, never this file"
    write_atomic(sc, json.dumps(rec, indent=2))


# ----------------------------------------------------------------- issue
def register_path(pdf: Path) -> Path:
    return pdf.parent / REGISTER


def read_register(folder: Path) -> list[dict]:
    p = folder / REGISTER
    if not p.is_file():
        return []
    try:
        rows = json.loads(p.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        raise InputError("issue register", str(p), "a readable issue_register.json (restore it from backup)") from None
    return rows if isinstance(rows, list) else []


def issue_package(pdf: str | Path, purpose: str, kp: Any, *, override: str | None = None,
                  when: _dt.datetime | None = None) -> dict:
    """Issue a checked package: an issue signature on the cover and a row in the issue register."""
    purpose = _text("--purpose", purpose)
    override = _text("--override", override)
    p = _package_pdf(pdf)
    st = verify_package(p)
    if st.state == "unsigned":
        raise InputError("PACKAGE.pdf", str(pdf), "a package signed at least as checked (it is unsigned)")
    if st.state != "valid":
        raise InputError("PACKAGE.pdf", str(pdf), "a package whose signatures are valid", st.lines[0])
    roles = [s.role for s in st.pdf]
    rev = next((s.tag.get("revision") for s in st.pdf if s.tag.get("revision")), "") or "-"
    done = [s for s in st.pdf if s.role == "issued"]
    if done:
        t = done[0].tag
        raise AlreadyIssued("PACKAGE.pdf", str(pdf), "a revision not yet issued",
                            f"revision {rev} was already issued on {done[0].signed_at[:10]} by {done[0].signer} "
                            f"for {t.get('purpose', '?')!r}")
    if "checked" not in roles:
        raise InputError("PACKAGE.pdf", str(pdf), "a package signed as checked before it is issued",
                         "signed so far: " + ", ".join(roles))
    failing = max((int(s.tag.get("failing", 0) or 0) for s in st.pdf), default=0)
    if failing and not override:
        raise InputError("PACKAGE.pdf", str(pdf), "a package without failing checks, or --override \"reason\"",
                         f"{failing} check(s) fail")
    nb_path = nbs.sibling(p, ".ipynb")
    nb = nbs.read_notebook(nb_path) if nb_path else {}
    meta = nbs.calc_meta(nb)
    register = read_register(p.parent)
    for row in register:
        if (row.get("revision") == rev and row.get("job_number") == meta.get("job_number")
                and row.get("title") == meta.get("title")):
            raise AlreadyIssued("PACKAGE.pdf", str(pdf), "a revision not yet issued",
                                f"revision {rev} was already issued on {row.get('date')} as {row.get('file')} "
                                f"for {row.get('purpose')!r}")
    when = when or _dt.datetime.now(_dt.timezone.utc)
    tag = {"role": "issued", "purpose": purpose, "revision": rev, "issuer": kp.name,
           "date": when.date().isoformat(), "notebook_sha256": st.pdf[-1].tag.get("notebook_sha256"),
           "failing": failing}
    if override:
        tag["override"] = override
    lines = [f"ISSUED rev {rev}: {purpose}"[:64], f"by {kp.name}, {when.strftime('%Y-%m-%d %H:%M')} UTC"]
    if override:
        lines.append(f"Override ({failing} failing): {override}"[:64])
    human = f"Issued revision {rev} for {purpose} by {kp.name}" + (f". Override: {override}" if override else "")
    data = p.read_bytes()
    signed = pdfsign.sign_pdf_bytes(data, kp, "issued", human_reason=human, tag=tag, appearance_lines=lines,
                                    when=when)
    write_atomic(p, signed)
    row = {"date": when.date().isoformat(), "time_utc": when.isoformat(timespec="seconds"), "issuer": kp.name,
           "purpose": purpose, "revision": rev, "file": p.name, "job_number": meta.get("job_number"),
           "title": meta.get("title"), "signed": roles, "override": override,
           "pdf_sha256": hashlib.sha256(signed).hexdigest()}
    write_atomic(register_path(p), json.dumps(register + [row], indent=2))
    return row


__all__ = ["AlreadyIssued", "PackageStatus", "REGISTER", "ROLES", "SignResult", "issue_package", "read_register",
           "role_order_problems", "sign_package", "verify_package"]
