"""PAdES signatures in the calc-package PDF (pyHanko does all of the PDF cryptography).

Each role has its own signature field on the cover, in the sign-off block: the LaTeX
template leaves a named destination ``splicecalc.sign.<role>`` at each signature cell
(``\\signbox`` in ``report/latex/calcpackage/index.tex.j2``) and :func:`field_boxes` reads
them back. The first signature creates all four fields (prepared, checked, approved, issue)
and certifies the document (DocMDP, form filling and signing only); every signature is an
incremental update, so the revisions signed before stay byte for byte as they were.

What splicecalc needs to know about a signature travels inside it, in the signed
signature dictionary: ``/Reason`` ends with a line ``[splicecalc {json}]`` (role, the
notebook digest, revision, failing checks, reasons given). Nothing outside the PDF is read
to verify it.
"""

from __future__ import annotations

import datetime as _dt
import io
import json
import re
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from ..core.errors import InputError

#: field name per role (no dots: a dot separates levels of a PDF form's field names)
FIELDS = {"prepared": "SignPrepared", "checked": "SignChecked", "approved": "SignApproved", "issued": "IssueStamp"}
ROLE_OF_FIELD = {v: k for k, v in FIELDS.items()}
DEST_PREFIX = "splicecalc.sign."
#: field size on the cover, pt (70 mm x 12 mm; the template's cell is about 78 mm x 12 mm)
FIELD_W, FIELD_H, FIELD_DEPTH = 198.0, 34.0, 5.6
_TAG_RE = re.compile(r"\[splicecalc (\{.*\})\]\s*$", re.S)


def tag_reason(human: str, tag: dict) -> str:
    """``/Reason`` text: the human sentence, then the machine-readable tag on its own line."""
    return f"{human}\n[splicecalc {json.dumps(tag, sort_keys=True, separators=(',', ':'))}]"


def parse_tag(reason: str | None) -> dict:
    if not reason:
        return {}
    m = _TAG_RE.search(str(reason))
    if not m:
        return {}
    try:
        d = json.loads(m.group(1))
    except ValueError:
        return {}
    return d if isinstance(d, dict) else {}


def _ascii(s: str) -> str:
    """Text for the appearance stream's standard font (Latin-1; other characters shown as ?)."""
    return "".join(c if 32 <= ord(c) < 256 else "?" for c in str(s))


# ----------------------------------------------------------------- reading the PDF
def _open(pdf_bytes: bytes):
    from pyhanko.pdf_utils.reader import PdfFileReader

    try:
        return PdfFileReader(io.BytesIO(pdf_bytes), strict=False)
    except Exception as exc:  # noqa: BLE001 - pyHanko raises many kinds (even AssertionError) on bad files
        raise MalformedPDF(f"not a readable PDF ({exc.__class__.__name__})") from None


class MalformedPDF(ValueError):
    """The file is not a PDF pyHanko can read."""


def field_boxes(reader: Any) -> dict[str, tuple[int, tuple[float, float, float, float]]]:
    """``role -> (page index, box)`` from the template's named destinations; {} when there are none."""
    try:
        names = reader.root.get("/Names")
        tree = names.get_object().get("/Dests") if names is not None else None
    except Exception:  # noqa: BLE001 - a PDF without the tree just has no anchors
        return {}
    if tree is None:
        return {}
    raw: dict[str, tuple[int, float, float]] = {}   # name -> (page object number, x, y)

    def walk(node: Any, depth: int = 0) -> None:
        if depth > 20:
            return
        node = node.get_object()
        lim = node.get("/Limits")
        if lim is not None and len(lim) == 2 and (str(lim[1]) < DEST_PREFIX or str(lim[0]) > DEST_PREFIX + "~"):
            return                                 # a name-tree branch without our names
        arr = node.get("/Names")
        if arr is not None:
            for i in range(0, len(arr) - 1, 2):
                name = str(arr[i])
                if not name.startswith(DEST_PREFIX):
                    continue
                dest = arr[i + 1].get_object()
                if isinstance(dest, dict) or hasattr(dest, "keys"):
                    dest = dest.get("/D")
                try:
                    raw[name[len(DEST_PREFIX):]] = (dest.raw_get(0).idnum, float(dest[2]), float(dest[3]))
                except (IndexError, TypeError, AttributeError, ValueError):
                    continue
        for kid in node.get("/Kids", []) or []:
            walk(kid, depth + 1)

    try:
        walk(tree)
        index = _page_indices(reader, {v[0] for v in raw.values()})
    except Exception:  # noqa: BLE001 - a damaged tree just has no anchors
        return {}
    out: dict[str, tuple[int, tuple[float, float, float, float]]] = {}
    for role, (idnum, x, y) in raw.items():
        if idnum in index:
            out[role] = (index[idnum], (x, y - FIELD_DEPTH, x + FIELD_W, y - FIELD_DEPTH + FIELD_H))
    return out


def _page_indices(reader: Any, wanted: set[int]) -> dict[int, int]:
    """Page index of each page object number in ``wanted`` (walks the page tree only until all are found)."""
    found: dict[int, int] = {}
    count = 0

    def walk(node: Any, depth: int) -> bool:
        nonlocal count
        if depth > 30:
            return False
        kids = node.get("/Kids")
        for i in range(len(kids) if kids is not None else 0):
            if len(found) == len(wanted):
                return True
            kid = kids.raw_get(i)
            obj = kid.get_object()
            if obj.get("/Type") == "/Pages":
                if walk(obj, depth + 1):
                    return True
            else:
                if getattr(kid, "idnum", None) in wanted:
                    found[kid.idnum] = count
                count += 1
        return len(found) == len(wanted)

    walk(reader.root["/Pages"], 0)
    return found


def _fallback_boxes() -> dict[str, tuple[int, tuple[float, float, float, float]]]:
    """Field places on sheet 1 when the PDF has no anchors (bottom margin, side by side)."""
    x0, y0, w = 57.0, 40.0, 118.0
    return {role: (0, (x0 + i * (w + 6), y0, x0 + i * (w + 6) + w, y0 + 30.0)) for i, role in enumerate(FIELDS)}


# ----------------------------------------------------------------- signing
def _signer(kp: Any):
    from asn1crypto import keys as akeys, x509 as ax509
    from cryptography.hazmat.primitives.serialization import Encoding, NoEncryption, PrivateFormat
    from pyhanko.sign.signers import SimpleSigner
    from pyhanko_certvalidator.registry import SimpleCertificateStore

    key = akeys.PrivateKeyInfo.load(kp.key.private_bytes(Encoding.DER, PrivateFormat.PKCS8, NoEncryption()))
    cert = ax509.Certificate.load(kp.cert.public_bytes(Encoding.DER))
    chain = [ax509.Certificate.load(c.public_bytes(Encoding.DER)) for c in kp.chain]
    return SimpleSigner(signing_cert=cert, signing_key=key, cert_registry=SimpleCertificateStore.from_certs(chain))


def sign_pdf_bytes(pdf_bytes: bytes, kp: Any, role: str, *, human_reason: str, tag: dict,
                   appearance_lines: list[str], when: _dt.datetime | None = None) -> bytes:
    """Sign ``pdf_bytes`` in ``role``'s field (incremental update) and return the new file's bytes.

    The first signature of the document creates every role's field and certifies it
    (DocMDP: form filling and further signatures only).
    """
    from pyhanko.pdf_utils.incremental_writer import IncrementalPdfFileWriter
    from pyhanko.pdf_utils.text import TextBoxStyle
    from pyhanko.sign import fields, signers
    from pyhanko.stamp import TextStampStyle

    if role not in FIELDS:
        raise InputError("role", role, "one of " + ", ".join(FIELDS))
    reader = _open(pdf_bytes)
    try:
        existing = {s.field_name: s for s in reader.embedded_signatures}
    except Exception as exc:  # noqa: BLE001 - pyHanko raises many kinds on a damaged form
        raise MalformedPDF(f"its signature fields cannot be read ({exc.__class__.__name__})") from None
    name = FIELDS[role]
    if name in existing:
        raise InputError("--role", role, "a role not yet signed in this PDF (its field is already signed)")
    try:
        w = IncrementalPdfFileWriter(io.BytesIO(pdf_bytes), strict=False)
    except Exception as exc:  # noqa: BLE001
        raise MalformedPDF(f"not a PDF that can be updated ({exc.__class__.__name__})") from None
    first = not existing
    if first:
        boxes = field_boxes(w.prev) or _fallback_boxes()
        have = {f[0] for f in _form_field_names(w.prev)}
        for r, fname in FIELDS.items():
            if fname in have:
                continue
            page, box = boxes.get(r, _fallback_boxes()[r])
            fields.append_signature_field(w, fields.SigFieldSpec(sig_field_name=fname, on_page=page,
                                                                 box=tuple(round(v, 2) for v in box)))
    meta = signers.PdfSignatureMetadata(
        field_name=name, reason=tag_reason(human_reason, tag), name=kp.name, location=None,
        certify=first, docmdp_permissions=fields.MDPPerm.FILL_FORMS, md_algorithm="sha256",
        subfilter=fields.SigSeedSubFilter.PADES)
    # pyHanko fills stamp_text in with %-formatting (its %(signer)s, %(ts)s): a "%" of ours is doubled
    style = TextStampStyle(stamp_text="\n".join(_ascii(x) for x in appearance_lines).replace("%", "%%"), border_width=1,
                           text_box_style=TextBoxStyle(font_size=6, leading=7))
    out = io.BytesIO()
    signers.PdfSigner(meta, _signer(kp), stamp_style=style).sign_pdf(w, existing_fields_only=True, output=out)
    return out.getvalue()


def _form_field_names(reader: Any) -> list[tuple[str, Any]]:
    try:
        form = reader.root.get("/AcroForm")
        if form is None:
            return []
        return [(str(f.get_object().get("/T")), f) for f in form.get_object().get("/Fields", [])]
    except Exception:  # noqa: BLE001
        return []


# ----------------------------------------------------------------- validation
@dataclass
class PdfSig:
    """One signature found in the PDF, as validated."""

    field: str
    role: str
    signer: str
    fingerprint: str
    signed_at: str
    intact: bool
    valid: bool
    trusted: bool
    covers_whole_file: bool
    modification_ok: bool
    certified: bool
    reason: str
    tag: dict = field(default_factory=dict)
    problems: list[str] = field(default_factory=list)

    @property
    def ok(self) -> bool:
        return self.intact and self.valid and not self.problems

    def to_dict(self) -> dict:
        return {k: getattr(self, k) for k in ("field", "role", "signer", "fingerprint", "signed_at", "intact",
                                              "valid", "trusted", "covers_whole_file", "modification_ok",
                                              "certified", "tag", "problems")}


def base_revision_sha256(pdf_bytes: bytes) -> str:
    """SHA-256 of the PDF as built: its bytes up to the end of the first revision (first ``%%EOF``)."""
    import hashlib

    i = pdf_bytes.find(b"%%EOF")
    if i < 0:
        raise MalformedPDF("no end-of-file marker")
    j = i + 5
    while j < len(pdf_bytes) and pdf_bytes[j:j + 1] in (b"\r", b"\n") and j < i + 7:
        j += 1
    return hashlib.sha256(pdf_bytes[:j]).hexdigest()


#: catalog entries a signing update may rewrite (document metadata, version, extension marks)
_CATALOG_FREE = {"/Metadata", "/Version", "/Extensions", "/DSS"}


def update_problems(reader: Any, after_revision: int) -> list[str]:
    """What the incremental updates after revision ``after_revision`` change beyond filling signatures.

    The quick, strict rule used by default (pyHanko's full difference analysis walks every
    object of every revision and takes seconds on a package; ``thorough=True`` runs it):
    an update may add new objects, rewrite the document's XMP metadata stream, rewrite the
    catalog with no entry changed other than :data:`_CATALOG_FREE`, and fill our signature
    fields (same name, type, page and place; a value and an appearance added). Anything else
    (a page, its content, an annotation list, a font, a freed object) is a change.
    """
    from pyhanko.pdf_utils.generic import Reference

    x = reader.xrefs
    problems: list[str] = []
    root_ref = reader.trailer.raw_get("/Root")
    for rev in range(after_revision + 1, x.total_revisions):
        old_res = reader.get_historical_resolver(rev - 1)
        new_res = reader.get_historical_resolver(rev)
        if list(x.refs_freed_in_revision(rev)):
            problems.append(f"update {rev} deletes objects")
        try:
            meta_ref = old_res(root_ref).raw_get("/Metadata")
        except (KeyError, AttributeError):
            meta_ref = None
        for ref in x.explicit_refs_in_revision(rev):
            try:
                existed = x.get_historical_ref(ref, rev - 1) is not None
            except Exception:  # noqa: BLE001 - pyHanko: not present before
                existed = False
            if not existed:
                continue
            r = Reference(ref.idnum, ref.generation, reader)
            before, after = old_res(r), new_res(r)
            if ref.idnum == root_ref.idnum:
                keys = (set(before.keys()) | set(after.keys())) - _CATALOG_FREE
                changed = sorted(k for k in keys if str(before.raw_get(k) if k in before else None)
                                 != str(after.raw_get(k) if k in after else None))
                if changed:
                    problems.append(f"update {rev} changes the document catalog ({', '.join(changed)})")
                continue
            if meta_ref is not None and getattr(meta_ref, "idnum", None) == ref.idnum:
                continue
            if _is_filled_sig_field(before, after):
                continue
            problems.append(f"update {rev} rewrites object {ref.idnum} "
                            f"({str(before.get('/Type', before.get('/Subtype', 'content')) if hasattr(before, 'get') else 'content')})")
    return problems


def _is_filled_sig_field(before: Any, after: Any) -> bool:
    try:
        if before.get("/FT") != "/Sig" or after.get("/FT") != "/Sig":
            return False
        if str(before.get("/T")) not in ROLE_OF_FIELD or str(after.get("/T")) != str(before.get("/T")):
            return False
        for k in set(before.keys()) | set(after.keys()):
            if k in ("/V", "/AP"):
                continue
            if str(before.raw_get(k) if k in before else None) != str(after.raw_get(k) if k in after else None):
                return False
        return "/V" not in before and "/V" in after
    except (AttributeError, KeyError, TypeError):
        return False


def validate_pdf_bytes(pdf_bytes: bytes, trust_roots: list[Any], thorough: bool = False) -> list[PdfSig]:
    """Validate every signature of the PDF with pyHanko against ``trust_roots`` (cryptography certs).

    Integrity, signature, certificate path and coverage always come from pyHanko; what later
    updates changed comes from :func:`update_problems`, or with ``thorough`` from pyHanko's own
    difference analysis as well."""
    from asn1crypto import x509 as ax509
    from cryptography.hazmat.primitives.serialization import Encoding
    from pyhanko.sign.diff_analysis import ModificationLevel
    from pyhanko.sign.validation import validate_pdf_signature
    from pyhanko.sign.validation.settings import KeyUsageConstraints
    from pyhanko.sign.validation.status import SignatureCoverageLevel
    from pyhanko_certvalidator import ValidationContext

    reader = _open(pdf_bytes)
    roots = [ax509.Certificate.load(c.public_bytes(Encoding.DER)) for c in trust_roots]
    vc = ValidationContext(trust_roots=roots, allow_fetching=False, revocation_mode="soft-fail")
    try:
        sigs = list(reader.embedded_signatures)
    except Exception as exc:  # noqa: BLE001
        raise MalformedPDF(f"its signatures cannot be read ({exc.__class__.__name__})") from None
    out: list[PdfSig] = []
    ku = KeyUsageConstraints(key_usage={"non_repudiation", "digital_signature"}, match_all_key_usages=False)
    for i, es in enumerate(sigs):
        problems: list[str] = []
        try:
            st = validate_pdf_signature(es, vc, key_usage_settings=ku, skip_diff=not (thorough and i == 0))
            intact, valid, trusted = bool(st.intact), bool(st.valid), bool(st.trusted)
            whole = st.coverage == SignatureCoverageLevel.ENTIRE_FILE
            mod_ok = st.modification_level is None or st.modification_level <= ModificationLevel.FORM_FILLING
            docmdp_ok = st.docmdp_ok is not False
            cert = st.signing_cert
            signer = cert.subject.native.get("common_name", cert.subject.human_friendly)
            fp = cert.sha256.hex()
            when = st.signer_reported_dt.isoformat(timespec="seconds") if st.signer_reported_dt else ""
        except Exception as exc:  # noqa: BLE001 - any failure to validate is an invalid signature, in one line
            out.append(PdfSig(str(es.field_name), ROLE_OF_FIELD.get(str(es.field_name), "?"), "?", "", "", False,
                              False, False, False, False, False, "", {},
                              [f"signature cannot be validated ({exc.__class__.__name__}: {str(exc)[:80]})"]))
            continue
        if not intact:
            problems.append("the signed bytes changed")
        if not valid:
            problems.append("the signature does not match its certificate")
        if not mod_ok or not docmdp_ok:
            problems.append("the document was changed after this signature in a way its certification forbids")
        reason = str(es.sig_object.get("/Reason", "") or "")
        tag = parse_tag(reason)
        role = ROLE_OF_FIELD.get(str(es.field_name), "?")
        if role == "?":
            problems.append(f"signature field {es.field_name!r} is not one of splicecalc's")
        elif tag.get("role") != role:
            problems.append(f"the signature's own record says role {tag.get('role')!r}, its field is {role!r}")
        out.append(PdfSig(str(es.field_name), role, str(signer), fp, when, intact, valid, trusted, whole, mod_ok,
                          es.sig_object.get("/Type") is not None and _is_certification(es), reason, tag, problems))
    if out and not out[-1].covers_whole_file:
        out[-1].problems.append("bytes were added after the last signature")
    if sigs:
        try:
            upd = update_problems(reader, sigs[0].signed_revision)
        except Exception as exc:  # noqa: BLE001 - an unreadable update is a change
            upd = [f"the updates after the first signature cannot be read ({exc.__class__.__name__})"]
        if upd:
            out[0].problems.extend(upd)
    return out


def _is_certification(es: Any) -> bool:
    try:
        return es.docmdp_level is not None
    except Exception:  # noqa: BLE001
        return False


def read_pdf(path: str | Path) -> bytes:
    p = Path(path)
    if not p.is_file():
        raise InputError("PACKAGE.pdf", str(path), "an existing PDF file")
    return p.read_bytes()


__all__ = ["FIELDS", "MalformedPDF", "PdfSig", "base_revision_sha256", "field_boxes", "parse_tag", "read_pdf",
           "sign_pdf_bytes", "tag_reason", "validate_pdf_bytes"]
