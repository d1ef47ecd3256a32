"""The checking conversation: review comments tied to checks, PDF mark-ups read back.

``register`` keeps the append-only log beside the job file; ``package`` finds a package's job,
notebook and PDF; ``markups`` reads annotations from a PDF a checker marked up; the functions here
are what the ``splicecalc review`` commands call.
"""

from __future__ import annotations

import hashlib
import os
from dataclasses import dataclass
from pathlib import Path

from ..core.errors import InputError
from .markups import Markup, anchor_name, read_markups
from .package import ReviewPackage, locate
from .register import (Comment, Register, RegisterError, check_basis, comment_flags, parse_target,
                       target_label)


def _package_pdf(pkg: ReviewPackage) -> Path | None:
    """The package's built PDF: the one named, or the PDF beside its notebook or job file."""
    for cand in (pkg.pdf, pkg.notebook and pkg.notebook.with_suffix(".pdf"), pkg.job_file.with_suffix(".pdf")):
        if cand is not None and cand.is_file():
            return cand
    return None


def _pdf_facts(path: Path | None) -> tuple[int, str] | None:
    """(number of sheets, /Subject: title-block client, location and job number) of a PDF, or None."""
    if path is None:
        return None
    import logging

    from pypdf import PdfReader

    logging.getLogger("pypdf").setLevel(logging.ERROR)
    try:
        r = PdfReader(str(path))
        return len(r.pages), str((r.metadata or {}).get("/Subject") or "")
    except Exception:   # noqa: BLE001 - an unreadable PDF is reported by whoever reads it in full
        return None


def add_comment(package: str | os.PathLike, *, on: str, by: str, text: str) -> Comment:
    """Add a comment on a check id, a sheet or the whole package."""
    pkg = locate(package)
    records = pkg.records()
    ids = None if records is None else [r.get("id") for r in records]
    target = parse_target(on, ids)
    if target["kind"] == "sheet":
        facts = _pdf_facts(_package_pdf(pkg))
        if facts is not None and target["sheet"] > facts[0]:
            raise InputError("--on", on, f"a sheet of this package: 1 to {facts[0]}")
    basis = None
    if target["kind"] == "check" and records is not None:
        basis = next((check_basis(r) for r in records if r.get("id") == target["id"]), None)
    return pkg.register.add(by=by, text=text, target=target, revision=pkg.revision(), basis=basis)


@dataclass(frozen=True)
class ImportResult:
    added: tuple[Comment, ...]
    skipped: tuple[Markup, ...]     # already in the register (same mark-up imported before)


def import_markups(package: str | os.PathLike, annotated_pdf: str | os.PathLike, *, by: str) -> ImportResult:
    """Read the mark-ups of ``annotated_pdf`` into the package's register (each mark-up once)."""
    pkg = locate(package)
    mine, theirs = _pdf_facts(_package_pdf(pkg)), _pdf_facts(Path(annotated_pdf))
    if mine and theirs and mine[1] and theirs[1] and mine[1] != theirs[1]:
        raise InputError("ANNOTATED_PDF", str(annotated_pdf), f"a mark-up of this package ({mine[1][:80]})",
                         f"it is a mark-up of another job ({theirs[1][:80]})")
    records = pkg.records() or []
    back = {anchor_name(str(r.get("id")))[len("chk-"):]: str(r.get("id")) for r in records}
    marks = read_markups(annotated_pdf, back)
    reg = pkg.register
    seen = {c.source.get("key") for c in reg.comments() if c.source.get("kind") == "pdf"}
    by_id = {str(r.get("id")): r for r in records}
    pdf_sha = hashlib.sha256(Path(annotated_pdf).read_bytes()).hexdigest()
    revision = pkg.revision()
    items, skipped = [], []
    for m in marks:
        if m.key in seen:
            skipped.append(m)
            continue
        who = by if not m.author or m.author.casefold() == by.casefold() else f"{by} (mark-up by {m.author})"
        items.append({"by": who if len(who) <= 120 else by, "text": m.text, "target": m.target,
                      "revision": revision, "basis": check_basis(by_id[m.check_id]) if m.check_id in by_id else None,
                      "source": {"kind": "pdf", "key": m.key, "sheet": m.sheet, "markup": m.kind, "pdf_sha256": pdf_sha}})
        seen.add(m.key)
    added = reg.add_many(items)
    return ImportResult(tuple(added), tuple(skipped))


@dataclass(frozen=True)
class RegisterState:
    """The review register as a signature records it: its first ``size`` bytes and their digest,
    and the comments not yet closed at that moment."""

    path: Path
    size: int
    sha256: str
    unresolved: tuple[str, ...]

    def tag(self) -> dict:
        return {"review_register": self.path.name, "review_bytes": self.size, "review_sha256": self.sha256,
                "review_unresolved": len(self.unresolved)}


def register_state(package: str | os.PathLike) -> RegisterState | None:
    """The register of the package at ``package`` now, or None when the package names no job file
    or has no register (a package without review comments)."""
    try:
        pkg = locate(package)
    except InputError:
        return None
    reg = pkg.register
    if not reg.path.exists():
        return None
    raw = reg.path.read_bytes()
    unresolved = tuple(c.id for c in reg.unresolved())     # also checks the chain
    return RegisterState(reg.path, len(raw), hashlib.sha256(raw).hexdigest(), unresolved)


def register_changed_since(package: str | os.PathLike, tag: dict) -> str | None:
    """Why the register no longer starts with what a signature recorded (``RegisterState.tag``), or None.

    The register is append-only: comments added after a signature are fine; any change to the bytes
    the signature saw is not."""
    size, sha = tag.get("review_bytes"), tag.get("review_sha256")
    if size is None or sha is None:
        return None
    try:
        pkg = locate(package)
        raw = pkg.register.path.read_bytes()
    except (InputError, OSError):
        return f"the review register {tag.get('review_register', '')} recorded at signing cannot be read"
    if len(raw) < int(size) or hashlib.sha256(raw[:int(size)]).hexdigest() != sha:
        return f"the review register {pkg.register.path.name} was changed after signing (not only appended to)"
    try:
        pkg.register.events()          # what was appended since must be events of the register, chained
    except RegisterError as err:
        return f"the review register {pkg.register.path.name} was appended to by hand after signing ({err})"
    return None


def _part(target: dict) -> str:
    if target.get("kind") == "check":
        head = str(target.get("id", "")).split(".", 1)[0]
        return f"checks {head}.*"
    return "sheets and package" if target.get("kind") == "sheet" else "sheets and package"


def review_payload(job_file: str | os.PathLike, records: list[dict], approver: str = "") -> dict | None:
    """What the package prints of its review register: every comment with its thread, whether its
    check moved since the comment (or is gone), counts and the register's digest; None when the
    job has no register yet."""
    reg = Register.for_job(job_file, approver=approver)
    if not reg.path.exists():
        return None
    comments = reg.comments()
    flags = comment_flags(comments, records)
    out = []
    for c in comments:
        d = c.to_dict()
        d.pop("basis", None)
        d.update(flag=flags.get(c.id), part=_part(c.target))
        if c.target.get("kind") == "check":
            d["anchor"] = anchor_name(str(c.target.get("id")))
        out.append(d)
    return {"register": reg.path.name, "digest": reg.digest(), "counts": reg.counts(), "comments": out}


__all__ = ["RegisterState", "register_changed_since", "register_state", "Comment", "ImportResult", "Markup", "Register", "RegisterError", "ReviewPackage", "add_comment",
           "anchor_name", "comment_flags", "import_markups", "locate", "parse_target", "read_markups",
           "review_payload", "target_label"]
