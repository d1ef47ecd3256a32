"""The review register of one calc package: an append-only log of comments, replies and closures.

One file per job, beside it: ``<job stem>.review.jsonl``, one JSON event a line, under version
control with the job. Events are only ever appended, never rewritten:

    {"event": "comment", "id": "R1", "revision": "P1", "by": ..., "date": ..., "target": ...,
     "text": ..., "basis": {...} | null, "source": {...}, "prev": ...}
    {"event": "reply", "id": "R1", "by": ..., "date": ..., "text": ..., "prev": ...}
    {"event": "close", "id": "R1", "by": ..., "date": ..., "note": ..., "prev": ...}

``prev`` is the SHA-256 of the register's bytes before the event, so an edit to an earlier line
breaks the chain and the register refuses to load (a signature that covers the register's digest
then also shows the change). Names are what people type (``--by``): the register records who
said what; authenticity comes from the signatures on the package, not from here.

A comment's ``target`` is ``{"kind": "check", "id": "S1.flange_bolt_shear"}``,
``{"kind": "sheet", "sheet": 12}`` or ``{"kind": "package"}``. ``basis`` keeps the check's
demand, resistance and utilisation when the comment was made, so a rebuild can say whether
the check has moved since (:func:`comment_flags`).

States: ``open`` (new, or the author replied last), ``answered`` (someone other than the author
replied last), ``closed`` (by the author or the package's approver; final: a closed comment
takes no further events).
"""

from __future__ import annotations

import datetime as _dt
import fcntl
import hashlib
import json
import os
import re
from contextlib import contextmanager
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Iterator

from ..core.errors import InputError

REGISTER_SUFFIX = ".review.jsonl"
#: register format version written into every event
FORMAT = 1
_EVENTS = ("comment", "reply", "close")
_ID_RE = re.compile(r"^R[1-9][0-9]{0,5}$")
#: longest comment / reply text kept (a mark-up pasted from a long e-mail is cut with a note)
MAX_TEXT = 4000
#: largest register read (a register is text written by people; 20 MB is years of review)
MAX_BYTES = 20 * 1024 * 1024


class RegisterError(InputError):
    """The register file is damaged or an edit breaks its rules (one line, names the file)."""


@dataclass(frozen=True)
class Entry:
    """One message of a thread: the comment itself, a reply or the closing note."""

    kind: str          # comment | reply | close
    by: str
    date: str
    text: str
    #: a closure signed with the closer's key (``review close --key``): "trusted", "untrusted" (valid, signer
    #: not in the trust list) or "invalid"; "" for an entry whose name is only as typed (``--by``)
    signed: str = ""


@dataclass
class Comment:
    id: str
    revision: str
    by: str
    date: str
    target: dict[str, Any]
    text: str
    basis: dict[str, Any] | None = None
    source: dict[str, Any] = field(default_factory=dict)
    thread: list[Entry] = field(default_factory=list)
    state: str = "open"

    @property
    def target_label(self) -> str:
        return target_label(self.target)

    def to_dict(self) -> dict[str, Any]:
        return {"id": self.id, "revision": self.revision, "by": self.by, "date": self.date,
                "target": self.target, "target_label": self.target_label, "text": self.text,
                "state": self.state, "basis": self.basis, "source": self.source,
                "thread": [e.__dict__ for e in self.thread]}


def target_label(target: dict[str, Any]) -> str:
    kind = target.get("kind")
    if kind == "check":
        return str(target.get("id"))
    if kind == "sheet":
        return f"sheet {target.get('sheet')}"
    return "whole package"


def parse_target(text: str, check_ids: list[str] | None = None) -> dict[str, Any]:
    """``--on`` text -> target: a check id, ``sheet N`` / ``sheet:N``, or ``package``.

    With ``check_ids`` (the package's checks) a check id must be one of them.
    """
    t = (text or "").strip()
    if t.lower() in ("package", "whole", "all", "whole package"):
        return {"kind": "package"}
    m = re.fullmatch(r"(?i)sheet[\s:=]*([0-9]{1,5})", t)
    if m:
        n = int(m.group(1))
        if n < 1:
            raise InputError("--on", text, "a sheet number from 1")
        return {"kind": "sheet", "sheet": n}
    if not re.fullmatch(r"[A-Za-z0-9][A-Za-z0-9_.:\-]{0,120}", t):
        raise InputError("--on", text, "a check id (as printed beside each check, e.g. S1.flange_bolt_shear), "
                         "'sheet N' or 'package'")
    if check_ids is not None and t not in check_ids:
        close = [c for c in check_ids if t.lower() in c.lower()][:5]
        hint = f"Did you mean {', '.join(close)}?" if close else "List the checks with: splicecalc run JOB --json"
        raise InputError("--on", text, "the id of a check in this package, 'sheet N' or 'package'", hint)
    return {"kind": "check", "id": t}


def _now() -> str:
    return _dt.datetime.now(_dt.timezone.utc).replace(microsecond=0).isoformat().replace("+00:00", "Z")


def _clean_text(field_name: str, text: Any, *, required: bool = True) -> str:
    if not isinstance(text, str):
        raise InputError(field_name, text, "a text")
    # control characters (other than newline / tab) have no place in a review comment
    t = "".join(ch for ch in text if ch in "\n\t" or (ord(ch) >= 32 and ord(ch) != 127)).strip()
    if required and not t:
        raise InputError(field_name, text, "a non-empty text")
    if len(t) > MAX_TEXT:
        t = t[:MAX_TEXT] + " [cut: longer than the register keeps]"
    return t


def _name(by: Any) -> str:
    t = _clean_text("--by", by)
    if "\n" in t or len(t) > 120:
        raise InputError("--by", by, "a person's name on one line (at most 120 characters)")
    return t


class Register:
    """The review register of one package (see the module docstring)."""

    def __init__(self, path: str | os.PathLike, approver: str = "") -> None:
        self.path = Path(path)
        #: the package's approver (``[project] approved_by``): may close any comment
        self.approver = approver.strip()

    @classmethod
    def for_job(cls, job_file: str | os.PathLike, approver: str = "") -> "Register":
        jp = Path(job_file)
        return cls(jp.with_name(jp.stem + REGISTER_SUFFIX), approver)

    # ------------------------------------------------------------------ reading
    def _raw(self) -> bytes:
        try:
            size = self.path.stat().st_size
        except FileNotFoundError:
            return b""
        except OSError as err:
            raise RegisterError(str(self.path), err.strerror, "a readable review register") from None
        if size > MAX_BYTES:
            raise RegisterError(str(self.path), f"{size} bytes", f"a register under {MAX_BYTES // 2**20} MB")
        try:
            return self.path.read_bytes()
        except OSError as err:
            raise RegisterError(str(self.path), err.strerror, "a readable review register") from None

    def events(self) -> list[dict[str, Any]]:
        """Every event in order, the chain of ``prev`` digests checked."""
        raw = self._raw()
        out: list[dict[str, Any]] = []
        pos = 0
        for n, line in enumerate(raw.splitlines(keepends=True), start=1):
            prev = hashlib.sha256(raw[:pos]).hexdigest()
            pos += len(line)
            if not line.strip():
                continue
            try:
                ev = json.loads(line.decode("utf-8"))
            except (UnicodeDecodeError, json.JSONDecodeError, RecursionError):
                raise RegisterError(f"{self.path.name} line {n}", line[:60].decode("utf-8", "replace"),
                                    "one JSON event per line", "The register was edited by hand; "
                                    "restore it from version control") from None
            if not isinstance(ev, dict) or ev.get("event") not in _EVENTS or not _ID_RE.match(str(ev.get("id", ""))):
                raise RegisterError(f"{self.path.name} line {n}", str(ev)[:60], "a comment, reply or close event")
            if ev.get("prev") != prev:
                raise RegisterError(f"{self.path.name} line {n}", "an edited earlier line",
                                    "an append-only register (each event names the digest of all before it)",
                                    "Restore the register from version control; never edit it by hand")
            out.append(ev)
        return out

    def comments(self) -> list[Comment]:
        """The comments with their threads and states, in the order they were made."""
        by_id: dict[str, Comment] = {}
        for ev in self.events():
            cid = ev["id"]
            if ev["event"] == "comment":
                by_id[cid] = Comment(id=cid, revision=ev.get("revision", ""), by=ev["by"], date=ev["date"],
                                     target=ev["target"], text=ev["text"], basis=ev.get("basis"),
                                     source=ev.get("source") or {},
                                     thread=[Entry("comment", ev["by"], ev["date"], ev["text"])])
                continue
            c = by_id.get(cid)
            if c is None:
                raise RegisterError(f"{self.path.name}", cid, "replies and closures of a comment made earlier")
            if ev["event"] == "reply":
                c.thread.append(Entry("reply", ev["by"], ev["date"], ev["text"]))
                c.state = "open" if ev["by"] == c.by else "answered"
            else:
                c.thread.append(Entry("close", ev["by"], ev["date"], ev.get("note", ""),
                                      close_signature_state(ev) if "sig" in ev else ""))
                c.state = "closed"
        return list(by_id.values())

    def comment(self, cid: str) -> Comment:
        for c in self.comments():
            if c.id == cid:
                return c
        raise InputError("comment id", cid, "the id of a comment in " + self.path.name,
                         "List them with: splicecalc review list PACKAGE")

    def digest(self) -> str:
        """SHA-256 of the register's bytes (what a signature covers); of b'' when there is none."""
        return hashlib.sha256(self._raw()).hexdigest()

    def counts(self) -> dict[str, int]:
        cs = self.comments()
        return {s: sum(1 for c in cs if c.state == s) for s in ("open", "answered", "closed")}

    def unresolved(self) -> list[Comment]:
        """Comments not yet closed (open or answered): these hold up a ``checked`` signature."""
        return [c for c in self.comments() if c.state != "closed"]

    # ------------------------------------------------------------------ writing
    @contextmanager
    def _locked(self) -> Iterator[None]:
        """Hold the register's lock file (one writer at a time, across processes)."""
        lock = self.path.with_name(self.path.name + ".lock")
        try:
            fd = os.open(lock, os.O_CREAT | os.O_RDWR, 0o644)
        except OSError as err:
            raise RegisterError(str(lock), err.strerror, "a folder where the review register can be written",
                                "Check the folder's permissions") from None
        try:
            fcntl.flock(fd, fcntl.LOCK_EX)
            yield
        finally:
            fcntl.flock(fd, fcntl.LOCK_UN)
            os.close(fd)

    def _append(self, event: dict[str, Any]) -> None:
        """Append one event (caller holds the lock and has validated it against the current state)."""
        raw = self._raw()
        event = {"v": FORMAT, **event, "prev": hashlib.sha256(raw).hexdigest()}
        self._write_lines(raw, (json.dumps(event, ensure_ascii=False, sort_keys=True) + "\n").encode("utf-8"))

    def _write_lines(self, raw: bytes, line: bytes) -> None:
        if raw and not raw.endswith(b"\n"):
            raise RegisterError(self.path.name, "a last line without its end", "a register written by splicecalc")
        try:
            # append in one write() on an O_APPEND descriptor, then fsync: a crash leaves at worst a
            # missing last line, never a changed earlier one
            fd = os.open(self.path, os.O_WRONLY | os.O_APPEND | os.O_CREAT, 0o644)
            try:
                os.write(fd, line)
                os.fsync(fd)
            finally:
                os.close(fd)
        except OSError as err:
            raise RegisterError(str(self.path), err.strerror, "a writable review register",
                                "Check the folder's permissions and free space") from None

    def add(self, *, by: str, text: str, target: dict[str, Any], revision: str = "",
            basis: dict[str, Any] | None = None, source: dict[str, Any] | None = None,
            date: str | None = None) -> Comment:
        """Add a comment; returns it (with its new id). Duplicate PDF mark-ups are refused by the caller."""
        by, text = _name(by), _clean_text("comment text", text)
        with self._locked():
            existing = self.comments()
            cid = f"R{len(existing) + 1}"
            self._append({"event": "comment", "id": cid, "revision": str(revision), "by": by,
                          "date": date or _now(), "target": target, "text": text, "basis": basis,
                          "source": source or {"kind": "cli"}})
        return self.comment(cid)

    def add_many(self, items: list[dict[str, Any]]) -> list[Comment]:
        """Add several comments at once (one lock, one write): each item holds :meth:`add`'s arguments."""
        if not items:
            return []
        with self._locked():
            n = len(self.comments())
            lines, ids = [], []
            raw = self._raw()
            for k, it in enumerate(items, start=1):
                cid = f"R{n + k}"
                ev = {"v": FORMAT, "event": "comment", "id": cid, "revision": str(it.get("revision", "")),
                      "by": _name(it["by"]), "date": it.get("date") or _now(), "target": it["target"],
                      "text": _clean_text("comment text", it["text"]), "basis": it.get("basis"),
                      "source": it.get("source") or {"kind": "cli"}}
                ev["prev"] = hashlib.sha256(raw + b"".join(lines)).hexdigest()
                lines.append((json.dumps(ev, ensure_ascii=False, sort_keys=True) + "\n").encode("utf-8"))
                ids.append(cid)
            self._write_lines(raw, b"".join(lines))
        by_id = {c.id: c for c in self.comments()}
        return [by_id[i] for i in ids]

    def reply(self, cid: str, *, by: str, text: str) -> Comment:
        by, text = _name(by), _clean_text("reply text", text)
        with self._locked():
            c = self.comment(cid)
            if c.state == "closed":
                raise RegisterError(f"comment {cid}", "closed", "an open or answered comment",
                                    "A closed comment is history; add a new comment instead")
            self._append({"event": "reply", "id": cid, "by": by, "date": _now(), "text": text})
        return self.comment(cid)

    def close(self, cid: str, *, by: str = "", note: str = "", key: Any = None) -> Comment:
        """Close a comment. With ``key`` (a ``signoff.keys.KeyPair``) the closure is signed by the closer:
        the signature covers the event and the digest of the register before it, and the thread shows
        it as verified; without, the name is as typed."""
        if key is not None:
            by = by or key.name
            if _name(by).casefold() != key.name.strip().casefold():
                raise InputError("--by", by, f"the name of the signing key ({key.name}) or no --by")
        by = _name(by)
        note = _clean_text("--note", note, required=False)
        with self._locked():
            c = self.comment(cid)
            if c.state == "closed":
                raise RegisterError(f"comment {cid}", "closed", "an open or answered comment",
                                    "It was closed already")
            allowed = {c.by.casefold()} | ({self.approver.casefold()} if self.approver else set())
            if by.casefold() not in allowed:
                who = c.by + (f" or the approver ({self.approver})" if self.approver else "")
                raise InputError("--by", by, f"the comment's author ({who})",
                                 "Only the author of a comment, or the package's approver, closes it")
            ev = {"event": "close", "id": cid, "by": by, "date": _now(), "note": note}
            if key is not None:
                ev["sig"] = _sign_close(ev, hashlib.sha256(self._raw()).hexdigest(), key)
            self._append(ev)
        return self.comment(cid)


# ---------------------------------------------------------------------------- signed closures
def _close_message(ev: dict[str, Any], prev: str) -> bytes:
    """What a closure's signature covers: the event's words and the digest of the register before it."""
    msg = {"kind": "splicecalc review close", "id": ev.get("id"), "by": ev.get("by"), "date": ev.get("date"),
           "note": ev.get("note", ""), "prev": prev}
    return json.dumps(msg, sort_keys=True, separators=(",", ":"), ensure_ascii=False).encode("utf-8")


def _sign_close(ev: dict[str, Any], prev: str, key: Any) -> dict[str, str]:
    import base64

    from ..signoff.keys import cert_pem
    from ..signoff.notebook import _sign_bytes

    value, alg = _sign_bytes(key.key, _close_message(ev, prev))
    return {"alg": alg, "cert": cert_pem(key.cert), "value": base64.b64encode(value).decode("ascii")}


def close_signature_state(ev: dict[str, Any]) -> str:
    """"trusted", "untrusted" or "invalid" for a signed closure event (``cryptography`` verifies it; the
    certificate must carry the closer's name; trust as for package signatures, ``signoff.keys``)."""
    import base64

    from ..signoff import keys
    from ..signoff.notebook import _verify_bytes

    sig = ev.get("sig")
    try:
        cert = keys.load_cert(sig["cert"])
        ok = _verify_bytes(cert, base64.b64decode(sig["value"], validate=True), _close_message(ev, ev.get("prev", "")),
                           str(sig["alg"]))
    except (InputError, KeyError, TypeError, ValueError):
        return "invalid"
    if not ok or keys.cert_name(cert).strip().casefold() != str(ev.get("by", "")).strip().casefold():
        return "invalid"
    return "trusted" if keys.is_trusted(cert, keys.trusted_certs()) else "untrusted"


# ---------------------------------------------------------------------------- checks moved
#: relative change of a check's demand or resistance above which a comment is flagged as moved
MOVED_REL = 1e-3


def check_basis(record: dict[str, Any]) -> dict[str, Any]:
    """What a comment remembers of its check: demand, resistance, utilisation (unit-tagged keys)."""
    keep = {k: v for k, v in record.items()
            if k.startswith(("demand_", "resistance_")) or k in ("utilisation", "unit")}
    return {"id": record.get("id"), **keep}


def _moved(a: Any, b: Any) -> bool:
    if isinstance(a, (int, float)) and isinstance(b, (int, float)):
        return abs(a - b) > MOVED_REL * max(abs(a), abs(b), 1e-12)
    return a != b


def comment_flags(comments: list[Comment], records: list[dict[str, Any]]) -> dict[str, str]:
    """Per comment on a check: ``"unchanged"``, ``"moved"`` (its values changed since the comment)
    or ``"gone"`` (no check with that id in this build)."""
    by_id = {r.get("id"): r for r in records}
    flags: dict[str, str] = {}
    for c in comments:
        if c.target.get("kind") != "check":
            continue
        rec = by_id.get(c.target.get("id"))
        if rec is None:
            flags[c.id] = "gone"
        elif c.basis is None:
            flags[c.id] = "unchanged"
        else:
            now = check_basis(rec)
            flags[c.id] = "moved" if any(_moved(v, now.get(k)) for k, v in c.basis.items() if k != "id") else "unchanged"
    return flags


__all__ = ["Comment", "Entry", "MAX_TEXT", "REGISTER_SUFFIX", "Register", "RegisterError", "check_basis",
           "comment_flags", "parse_target", "target_label"]
