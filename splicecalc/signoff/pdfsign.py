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
#: the summary's acceptance boxes (read-only text fields): a checked / approved signature over failing
#: checks or NOT CHECKED items fills its role's box in the same update, locked by that signature (FieldMDP)
ACCEPT_FIELDS = {"checked": "AcceptChecked", "approved": "AcceptApproved"}
ROLE_OF_ACCEPT = {v: k for k, v in ACCEPT_FIELDS.items()}
ACCEPT_PREFIX = "splicecalc.accept."
#: the template's box (``\acceptbox``): 480 pt x 60 pt, anchor 5.6 pt above its bottom edge, as \signbox
ACCEPT_W, ACCEPT_H = 480.0, 60.0
#: the acceptance text's font size and leading (pt) in the field's appearance (Courier: 0.6 em a character)
ACCEPT_FONT, ACCEPT_LEADING = 6.5, 7.8
_BOX_SIZES = {DEST_PREFIX: (FIELD_W, FIELD_H), ACCEPT_PREFIX: (ACCEPT_W, ACCEPT_H)}
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


def field_boxes(reader: Any, prefix: str = DEST_PREFIX,
                size: tuple[float, float] | None = None) -> dict[str, tuple[int, tuple[float, float, float, float]]]:
    """``role -> (page index, box)`` from the template's named destinations ``<prefix><role>`` (the
    signature boxes of the cover, or with :data:`ACCEPT_PREFIX` the summary's acceptance boxes);
    {} when there are none."""
    return anchor_boxes(reader, {prefix: size or _BOX_SIZES.get(prefix, (FIELD_W, FIELD_H))})[prefix]


def anchor_boxes(reader: Any, sizes: dict[str, tuple[float, float]] | None = None
                 ) -> dict[str, dict[str, tuple[int, tuple[float, float, float, float]]]]:
    """:func:`field_boxes` for several prefixes (default: the signature and the acceptance boxes) in one
    walk of the name tree and one of the page tree (each walk reads object streams: the costly part)."""
    sizes = sizes or _BOX_SIZES
    out: dict[str, dict[str, tuple[int, tuple[float, float, float, float]]]] = {k: {} for k in sizes}
    try:
        names = reader.root.get("/Names")
        tree = names.get_object().get("/Dests") if names is not None else None
    except Exception:  # noqa: BLE001 - a PDF without the tree just has no anchors
        return out
    if tree is None:
        return out
    lo, hi = min(sizes), max(sizes) + "~"
    raw: dict[tuple[str, str], tuple[int, float, float]] = {}   # (prefix, role) -> (page object number, x, y)

    def walk(node: Any, depth: int = 0) -> None:
        if depth > 20:
            return
        node = node.get_object()
        lim = node.get("/Limits")
        if lim is not None and len(lim) == 2 and (str(lim[1]) < lo or str(lim[0]) > hi):
            return                                 # a name-tree branch without our names
        arr = node.get("/Names")
        if arr is not None:
            for i in range(0, len(arr) - 1, 2):
                name = str(arr[i])
                prefix = next((p for p in sizes if name.startswith(p)), None)
                if prefix is None:
                    continue
                dest = arr[i + 1].get_object()
                if isinstance(dest, dict) or hasattr(dest, "keys"):
                    dest = dest.get("/D")
                try:
                    raw[(prefix, name[len(prefix):])] = (dest.raw_get(0).idnum, float(dest[2]), float(dest[3]))
                except (IndexError, TypeError, AttributeError, ValueError):
                    continue
        for kid in node.get("/Kids", []) or []:
            walk(kid, depth + 1)

    try:
        walk(tree)
        index = _page_indices(reader, {v[0] for v in raw.values()})
    except Exception:  # noqa: BLE001 - a damaged tree just has no anchors
        return out
    for (prefix, role), (idnum, x, y) in raw.items():
        if idnum in index:
            w, h = sizes[prefix]
            out[prefix][role] = (index[idnum], (x, y - FIELD_DEPTH, x + w, y - FIELD_DEPTH + h))
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


def accept_lines(text: str) -> list[str]:
    """The acceptance text as the lines of its box (wrapped at word boundaries, long words cut; what
    does not fit ends in "..."; the whole text is in the signature's ``/Reason`` and the notebook)."""
    import textwrap

    per_line = int((ACCEPT_W - 8) / (0.6 * ACCEPT_FONT))
    n_lines = int((ACCEPT_H - 8) / ACCEPT_LEADING)
    lines = textwrap.wrap(_ascii(text), per_line, break_long_words=True, break_on_hyphens=False) or [""]
    if len(lines) > n_lines:
        lines = lines[:n_lines]
        lines[-1] = lines[-1][:per_line - 3] + "..."
    return lines


def _add_accept_field(w: Any, name: str, page: int, box: tuple[float, float, float, float]) -> None:
    """An empty read-only text field ``name`` on ``page`` at ``box`` (field and widget in one dictionary)."""
    from pyhanko.pdf_utils import generic
    from pyhanko.pdf_utils.content import RawContent
    from pyhanko.pdf_utils.layout import BoxConstraints

    page_ref = w.find_page_for_modification(page)[0]
    width, height = box[2] - box[0], box[3] - box[1]
    ap = w.add_object(RawContent(b"", box=BoxConstraints(width=width, height=height)).as_form_xobject())
    n = generic.NameObject
    fld = generic.DictionaryObject({
        n("/Type"): n("/Annot"), n("/Subtype"): n("/Widget"), n("/FT"): n("/Tx"),
        n("/T"): generic.TextStringObject(name), n("/Ff"): generic.NumberObject(1),     # read-only
        n("/F"): generic.NumberObject(4),                                                 # printed
        n("/Rect"): generic.ArrayObject([generic.FloatObject(round(v, 2)) for v in box]),
        n("/P"): page_ref, n("/AP"): generic.DictionaryObject({n("/N"): ap}),
        n("/TU"): generic.TextStringObject(f"acceptance stated by the {ROLE_OF_ACCEPT[name]} signature"),
    })
    ref = w.add_object(fld)
    w.register_annotation(page_ref, ref)
    form = w.root["/AcroForm"]
    form["/Fields"].append(ref)
    w.update_container(form["/Fields"])


def sign_pdf_bytes(pdf_bytes: bytes, kp: Any, role: str, *, human_reason: str, tag: dict,
                   appearance_lines: list[str], when: _dt.datetime | None = None) -> bytes:
    """Sign ``pdf_bytes`` in ``role``'s field (incremental update) and return the new file's bytes.

    The first signature of the document creates every role's field and certifies it
    (DocMDP: form filling and further signatures only); where the summary reserved acceptance
    boxes (a package with failing checks or NOT CHECKED items) it also creates their read-only
    text fields, each locked by its role's signature field (``/Lock``, FieldMDP). A checked or
    approved signature whose ``tag`` carries ``accept_note`` fills its role's box with that text
    in the same update as the signature.
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
        anchors = anchor_boxes(w.prev)
        boxes = anchors[DEST_PREFIX] or _fallback_boxes()
        have = {f[0] for f in _form_field_names(w.prev)}
        accept = anchors[ACCEPT_PREFIX]
        for r, fname in FIELDS.items():
            if fname in have:
                continue
            page, box = boxes.get(r, _fallback_boxes()[r])
            lock = (fields.FieldMDPSpec(fields.FieldMDPAction.INCLUDE, [ACCEPT_FIELDS[r]])
                    if r in accept and r in ACCEPT_FIELDS else None)
            fields.append_signature_field(w, fields.SigFieldSpec(sig_field_name=fname, on_page=page,
                                                                 box=tuple(round(v, 2) for v in box),
                                                                 field_mdp_spec=lock))
        for r, fname in ACCEPT_FIELDS.items():
            if r in accept and fname not in have:
                _add_accept_field(w, fname, *accept[r])
    note = tag.get("accept_note")
    if role in ACCEPT_FIELDS and note and ACCEPT_FIELDS[role] in accept_values(w) \
            and accept_values(w)[ACCEPT_FIELDS[role]] is None:      # filled before: verify says so
        from pyhanko.pdf_utils import layout
        from pyhanko.pdf_utils.form_tools import populate_static_text_field

        top_left = layout.SimpleBoxLayoutRule(x_align=layout.AxisAlignment.ALIGN_MIN,
                                              y_align=layout.AxisAlignment.ALIGN_MAX,
                                              margins=layout.Margins(3, 3, 3, 3),
                                              inner_content_scaling=layout.InnerScaling.NO_SCALING)
        populate_static_text_field(w, ACCEPT_FIELDS[role], TextBoxStyle(font_size=ACCEPT_FONT, leading=ACCEPT_LEADING,
                                                                        box_layout_rule=top_left),
                                   "\n".join(accept_lines(note)))
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


def update_problems(reader: Any, after_revision: int, fills: dict[str, int] | None = None) -> list[str]:
    """What the incremental updates after revision ``after_revision`` change beyond filling signatures.

    The quick, strict rule used by default (pyHanko's full difference analysis walks every
    object of every revision and takes seconds on a package; ``thorough=True`` runs it):
    an update may add new objects, rewrite the document's XMP metadata stream, rewrite the
    catalog with no entry changed other than :data:`_CATALOG_FREE`, and fill our signature
    fields or our acceptance text fields (same name, type, page and place; a value and an
    appearance added, nothing else). Anything else (a page, its content, an annotation list, a
    font, a freed object, a filled field filled again) is a change. ``fills`` receives the
    revision in which each acceptance field was filled (the caller checks a signature of its
    role was made in that very revision).
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
            filled = _filled_accept_field(before, after)
            if filled:
                if fills is not None:
                    fills[filled] = rev
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


def _filled_accept_field(before: Any, after: Any) -> str | None:
    """The name of our acceptance text field when ``after`` is ``before`` filled (value and appearance
    added, /DA dropped, read-only kept), else None."""
    try:
        name = str(before.get("/T"))
        if before.get("/FT") != "/Tx" or after.get("/FT") != "/Tx" or name not in ROLE_OF_ACCEPT:
            return None
        if str(after.get("/T")) != name or "/V" in before or "/V" not in after:
            return None
        if int(after.get("/Ff", 0)) & 1 != 1:
            return None
        for k in set(before.keys()) | set(after.keys()):
            if k in ("/V", "/AP", "/DA", "/Ff"):
                continue
            if str(before.raw_get(k) if k in before else None) != str(after.raw_get(k) if k in after else None):
                return None
        return name
    except (AttributeError, KeyError, TypeError, ValueError):
        return None


def accept_values(reader: Any) -> dict[str, str | None]:
    """Value of each acceptance field present in the PDF (None while empty)."""
    out: dict[str, str | None] = {}
    for name, ref in _form_field_names(reader):
        if name in ROLE_OF_ACCEPT:
            v = ref.get_object().get("/V")
            out[name] = None if v is None else str(v)
    return out


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
        fills: dict[str, int] = {}
        try:
            upd = update_problems(reader, sigs[0].signed_revision, fills)
            upd += accept_problems(reader, sigs, out, fills)
        except Exception as exc:  # noqa: BLE001 - an unreadable update is a change
            upd = [f"the updates after the first signature cannot be read ({exc.__class__.__name__})"]
        if upd:
            out[0].problems.extend(upd)
    return out


def accept_problems(reader: Any, sigs: list[Any], found: list[PdfSig], fills: dict[str, int]) -> list[str]:
    """The summary's acceptance fields against the signatures: each filled in the very update that added
    its role's signature, with the text that signature's own record states (``accept_note``); a
    signature stating an acceptance leaves it in the box when the PDF has one."""
    problems: list[str] = []
    values = accept_values(reader)
    by_role = {f.role: (es, f) for es, f in zip(sigs, found)}
    for name, value in values.items():
        role = ROLE_OF_ACCEPT[name]
        es, f = by_role.get(role, (None, None))
        note = f.tag.get("accept_note") if f else None
        if value is None:
            if note:
                problems.append(f"the {role} signature states an acceptance that its box in the summary lacks")
            continue
        if es is None:
            problems.append(f"the summary's {role} acceptance box is filled without a {role} signature")
        elif fills.get(name) != es.signed_revision:
            problems.append(f"the summary's {role} acceptance box was not filled by the {role} signature's update")
        elif not note or value != "\n".join(accept_lines(note)):
            problems.append(f"the summary's {role} acceptance box does not say what the {role} signature states")
    return problems


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
