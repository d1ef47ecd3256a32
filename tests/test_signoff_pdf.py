"""Sign-off of a real package: PAdES signatures on the demo PDF, the tampering corpus, pdfsig.

One demo package is built per session and copied. Outside references: poppler's ``pdfsig``
(Debian poppler-utils) validates the signatures independently of pyHanko; ``pdftotext``
reads the cover. Every tampering case must make ``verify`` say something other than valid;
re-serialising the notebook's JSON must not.
"""

from __future__ import annotations

import base64
import io
import json
import os
import re
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from splicecalc.core.errors import InputError
from splicecalc.signoff import keys
from splicecalc.signoff import notebook as nbs
from splicecalc.signoff import pdfsign
from splicecalc.signoff.package import AlreadyIssued, issue_package, sign_package, verify_package

pytestmark = pytest.mark.pdf
PW = b"corpus passphrase"
CLI = [sys.executable, "-m", "splicecalc.cli.main"]
NAME = "demo_workshop_gallery"
#: the demo has NOT CHECKED items (the column below, tying yield lines, the existing beam's supports): a checked
#: or approved signature states how they are covered
NC = "column below, tying yield lines and existing supports covered by calc 0931-S2 (demo)"


@pytest.fixture(scope="session")
def env(tmp_path_factory):
    """Keys (A, B, C, and A2: another key with A's name), a trust list holding A, the demo package built once."""
    from splicecalc.workflow.package import build_demo

    root = tmp_path_factory.mktemp("signoff")
    old = os.environ.get(keys.TRUST_DIR_ENV)
    os.environ[keys.TRUST_DIR_ENV] = str(root / "trust")
    kd = root / "keys"
    kd.mkdir()
    ks = {k: keys.new_key(n, kd / f"{k}.p12", PW) for k, n in
          (("a", "A. Preparer"), ("b", "B. Checker"), ("c", "C. Approver"), ("a2", "A. Preparer"))}
    keys.export_cert(ks["a"], kd / "a.pem")
    keys.trust_cert(kd / "a.pem")
    built = root / "built"
    b = build_demo(built, progress=False)
    assert b.pdf.name == f"{NAME}.pdf"
    yield {"root": root, "keys": ks, "built": built}
    if old is None:
        os.environ.pop(keys.TRUST_DIR_ENV, None)
    else:
        os.environ[keys.TRUST_DIR_ENV] = old


def _copy(src: Path, dest: Path) -> Path:
    dest.mkdir(parents=True, exist_ok=True)
    for f in src.iterdir():
        if f.is_file() and not f.name.startswith("."):
            shutil.copy2(f, dest / f.name)
    return dest


@pytest.fixture(scope="session")
def signed(env, tmp_path_factory):
    """Two signed copies of the package: S1 prepared A + checked B; S2 prepared A + checked C."""
    out = {}
    for tag, checker in (("s1", "b"), ("s2", "c")):
        d = _copy(env["built"], tmp_path_factory.mktemp(tag))
        sign_package(d / f"{NAME}.pdf", "prepared", env["keys"]["a"])
        sign_package(d / f"{NAME}.pdf", "checked", env["keys"][checker], reason="checked against the drawings",
                     accept_not_checked=NC)
        out[tag] = d
    return out


def _fresh(src: Path, tmp_path: Path, name: str = "pkg") -> Path:
    return _copy(src, tmp_path / name)


# ----------------------------------------------------------------- the happy path
def test_signed_package_verifies_and_says_who_is_trusted(signed):
    st = verify_package(signed["s1"] / f"{NAME}.pdf")
    assert st.state == "valid" and st.exit_code == 0, st.lines
    text = "\n".join(st.lines)
    assert "prepared: A. Preparer" in text and "trusted" in text
    assert "checked: B. Checker" in text and "valid but untrusted signer" in text
    assert verify_package(signed["s1"] / f"{NAME}.ipynb").state == "valid"
    # the first signature certifies (DocMDP: form filling and signing only)
    assert st.pdf[0].certified and not st.pdf[1].certified


def test_signature_fields_sit_in_the_cover_sign_off_block(signed, env):
    from pyhanko.pdf_utils.reader import PdfFileReader

    base = PdfFileReader(io.BytesIO((env["built"] / f"{NAME}.pdf").read_bytes()))
    boxes = pdfsign.field_boxes(base)
    assert set(boxes) == {"prepared", "checked", "approved", "issued"}
    assert all(page == 0 for page, _ in boxes.values())
    r = PdfFileReader(io.BytesIO((signed["s1"] / f"{NAME}.pdf").read_bytes()))
    rects = {str(f.get_object()["/T"]): [float(v) for v in f.get_object()["/Rect"]]
             for f in r.root["/AcroForm"]["/Fields"]}
    for role, field in pdfsign.FIELDS.items():
        assert rects[field] == pytest.approx(list(boxes[role][1]), abs=0.01)
    # prepared and checked above approved and the issue, all inside the page, none overlapping
    ys = {r: boxes[r][1][1] for r in boxes}
    assert ys["prepared"] > ys["approved"] and ys["checked"] > ys["issued"] and min(ys.values()) > 0
    rects = [boxes[r][1] for r in ("prepared", "checked", "approved", "issued")]
    for i, a in enumerate(rects):
        for b in rects[i + 1:]:
            assert a[2] <= b[0] or b[2] <= a[0] or a[3] <= b[1] or b[3] <= a[1]
    # the cover shows the signer's name, role and date (poppler renders the appearance)
    txt = subprocess.run(["pdftotext", "-f", "1", "-l", "1", str(signed["s1"] / f"{NAME}.pdf"), "-"],
                         capture_output=True, text=True, check=True).stdout
    assert "Prepared: A. Preparer" in txt and "Checked: B. Checker" in txt
    assert re.search(r"signed 20\d\d-\d\d-\d\d \d\d:\d\d UTC", txt)


def test_pdfsig_validates_and_then_rejects_a_changed_byte(signed, tmp_path):
    """poppler's pdfsig, an independent implementation, agrees."""
    pdf = _fresh(signed["s1"], tmp_path) / f"{NAME}.pdf"
    out = subprocess.run(["pdfsig", str(pdf)], capture_output=True, text=True).stdout
    assert out.count("Signature Validation: Signature is Valid.") == 2, out
    data = bytearray(pdf.read_bytes())
    i = len(data) // 3                       # inside the first revision: covered by both signatures
    data[i] ^= 0x01
    pdf.write_bytes(bytes(data))
    out = subprocess.run(["pdfsig", str(pdf)], capture_output=True, text=True).stdout
    assert "Signature is Valid." not in out and ("Invalid" in out or "Mismatch" in out), out
    assert verify_package(pdf).state == "changed"


# ----------------------------------------------------------------- the tampering corpus
def _edit_nb(d: Path, fn) -> None:
    p = d / f"{NAME}.ipynb"
    nb = json.loads(p.read_text(encoding="utf-8"))
    fn(nb)
    p.write_text(json.dumps(nb, indent=1), encoding="utf-8")


def _outputs(nb, pred):
    for cell in nb["cells"]:
        for o in cell.get("outputs", []):
            if pred(o):
                return o
    raise AssertionError("no such output in the demo notebook")


def _data(mime):
    return lambda o: mime in o.get("data", {})


def _first_check(nb):
    return _outputs(nb, _data(nbs.CHECK_MIME))["data"][nbs.CHECK_MIME]


def _numeric_check(nb):
    return _outputs(nb, lambda o: isinstance(o.get("data", {}).get(nbs.CHECK_MIME, {}).get("utilisation"),
                                             float))["data"][nbs.CHECK_MIME]


def _code_cells(nb):
    return [c for c in nb["cells"] if c["cell_type"] == "code"]


def _md_cells(nb):
    return [c for c in nb["cells"] if c["cell_type"] == "markdown"]


def _set(path, value):
    def fn(nb):
        obj = nb
        for k in path[:-1]:
            obj = obj[k]
        obj[path[-1]] = value
    return fn


def _sigs(nb):
    return nb["metadata"]["splicecalc"]["sign_off"]


def _flip_text(s):
    s = "".join(s) if isinstance(s, list) else s
    return s[:-1] + ("X" if not s.endswith("X") else "Y")


def _resign(entry, kp, **changes):
    from splicecalc.signoff.notebook import _sign_bytes, canonical

    msg = dict(entry["message"], **changes)
    sig, alg = _sign_bytes(kp.key, canonical(msg))
    return {"message": msg, "algorithm": alg, "signature": base64.b64encode(sig).decode(),
            "certificate": keys.cert_pem(kp.cert)}


def _pdf_edit(d: Path, fn) -> None:
    p = d / f"{NAME}.pdf"
    p.write_bytes(bytes(fn(bytearray(p.read_bytes()))))


def _flip_at(frac=None, where=None):
    def fn(b):
        i = where(b) if where else int(len(b) * frac)
        b[i] ^= 0x01
        return b
    return fn


def _second_revision_offset(b):
    first_eof = bytes(b).find(b"%%EOF")
    return first_eof + 200           # inside the first signing update (covered by both signatures)


def _inside_contents(b):
    i = bytes(b).find(b"/Contents <")
    return i + 40


def _cut_last_revision(b):
    ends = [m.end() for m in re.finditer(rb"%%EOF\r?\n?", bytes(b))]
    return b[:ends[-2]]


def _incremental(d: Path, fn) -> None:
    """An incremental update made with pyHanko's writer (the way an editor appends a change)."""
    from pyhanko.pdf_utils.incremental_writer import IncrementalPdfFileWriter

    p = d / f"{NAME}.pdf"
    w = IncrementalPdfFileWriter(io.BytesIO(p.read_bytes()))
    fn(w)
    out = io.BytesIO()
    w.write(out)
    p.write_bytes(out.getvalue())


def _add_page_content(w):
    from pyhanko.pdf_utils import generic
    from pyhanko.pdf_utils.content import RawContent

    page_ref, _ = w.find_page_for_modification(0)
    w.add_stream_to_page(0, w.add_object(generic.StreamObject(stream_data=b"BT /F1 24 Tf 100 100 Td (APPROVED) Tj ET")))
    _ = page_ref, RawContent


def _add_annotation(w):
    from pyhanko.pdf_utils import generic

    page_ref, _ = w.find_page_for_modification(0)
    page = page_ref.get_object()
    annot = w.add_object(generic.DictionaryObject({
        generic.NameObject("/Type"): generic.NameObject("/Annot"),
        generic.NameObject("/Subtype"): generic.NameObject("/FreeText"),
        generic.NameObject("/Rect"): generic.ArrayObject([generic.FloatObject(v) for v in (50, 50, 300, 80)]),
        generic.NameObject("/Contents"): generic.TextStringObject("E = 250 000 MPa")}))
    annots = page.get("/Annots", generic.ArrayObject())
    annots = generic.ArrayObject(list(annots) + [annot])
    page[generic.NameObject("/Annots")] = annots
    w.update_container(page)


def _change_info(w):
    from pyhanko.pdf_utils import generic

    w.set_info(generic.DictionaryObject({generic.NameObject("/Title"): generic.TextStringObject("Other job")}))


def _catalog_js(w):
    from pyhanko.pdf_utils import generic

    w.root[generic.NameObject("/OpenAction")] = generic.DictionaryObject({
        generic.NameObject("/S"): generic.NameObject("/JavaScript"),
        generic.NameObject("/JS"): generic.TextStringObject("app.alert('x')")})
    w.update_root()


def _rewrite_sidecar(d: Path, **claims) -> None:
    import hashlib

    p = d / f"{NAME}.pdf"
    sc = d / f"{NAME}.pdf.json"
    rec = json.loads(sc.read_text()) if sc.is_file() else {}
    rec.update({"pdf_sha256": hashlib.sha256(p.read_bytes()).hexdigest(), "status": "APPROVED", "issued": False,
                "signatures": [{"role": "approved", "name": "Z", "date": "2026-12-01", "digest": "0" * 64}]})
    rec.update(claims)
    sc.write_text(json.dumps(rec))


def _low_level_sign(d: Path, kp, role: str, **tag_extra) -> None:
    """Sign PDF and notebook bypassing sign_package's checks (a forger's tool)."""
    p = d / f"{NAME}.pdf"
    nbp = d / f"{NAME}.ipynb"
    nb = nbs.read_notebook(nbp)
    data = p.read_bytes()
    tag = {"role": role, "notebook_sha256": nbs.notebook_digest(nb), "revision": "P1", "failing": 0, **tag_extra}
    signed_bytes = pdfsign.sign_pdf_bytes(data, kp, role, human_reason=role, tag=tag, appearance_lines=[role])
    if role != "issued":
        nbs.add_entry(nb, nbs.make_entry(nb, nbp, kp, role, pdf_sha256=pdfsign.base_revision_sha256(data),
                                         extra=dict(tag_extra)))
        nbs.write_notebook(nb, nbp)
    p.write_bytes(signed_bytes)


def _cp(a, b) -> None:
    shutil.copy(a, b)


def _k(env, name):
    return env["keys"][name]


# each case: (id, function(folder, env, signed) -> path to verify (None: the PDF))
CASES = []


def case(cid, base="s1"):
    def deco(fn):
        CASES.append(pytest.param(cid, base, fn, id=cid))
        return fn
    return deco


# notebook cells
case("cell-markdown-text")(lambda d, e, s: _edit_nb(d, lambda nb: _md_cells(nb)[0].__setitem__(
    "source", _flip_text(_md_cells(nb)[0]["source"]))))
case("cell-code-source")(lambda d, e, s: _edit_nb(d, lambda nb: _code_cells(nb)[1].__setitem__(
    "source", "".join(_code_cells(nb)[1]["source"]) + "\n# edited")))
case("cell-code-trailing-space")(lambda d, e, s: _edit_nb(d, lambda nb: _code_cells(nb)[2].__setitem__(
    "source", "".join(_code_cells(nb)[2]["source"]) + " ")))
case("cell-added")(lambda d, e, s: _edit_nb(d, lambda nb: nb["cells"].append(
    {"cell_type": "markdown", "metadata": {}, "source": "Extra note", "id": "extra01"})))
case("cell-deleted")(lambda d, e, s: _edit_nb(d, lambda nb: nb["cells"].pop()))
case("cells-swapped")(lambda d, e, s: _edit_nb(d, lambda nb: nb["cells"].__setitem__(
    slice(0, 2), [nb["cells"][1], nb["cells"][0]])))
case("cell-type-changed")(lambda d, e, s: _edit_nb(d, lambda nb: _md_cells(nb)[1].__setitem__("cell_type", "raw")))
case("cell-tags-changed")(lambda d, e, s: _edit_nb(d, lambda nb: _code_cells(nb)[3]["metadata"].__setitem__(
    "tags", ["remove_output"])))
case("cell-execution-count")(lambda d, e, s: _edit_nb(d, lambda nb: _code_cells(nb)[2].__setitem__(
    "execution_count", 99)))
case("cell-id")(lambda d, e, s: _edit_nb(d, lambda nb: nb["cells"][0].__setitem__("id", "forged-id")))
# outputs
case("output-text-plain")(lambda d, e, s: _edit_nb(d, lambda nb: _outputs(nb, _data(nbs.CHECK_MIME))["data"].__setitem__(
    "text/plain", "all fine")))
case("output-check-ok-flag")(lambda d, e, s: _edit_nb(d, lambda nb: _first_check(nb).__setitem__(
    "ok", not _first_check(nb)["ok"])))
case("output-check-utilisation")(lambda d, e, s: _edit_nb(d, lambda nb: _first_check(nb).__setitem__(
    "utilisation", 0.123456)))
case("output-check-last-digit")(lambda d, e, s: _edit_nb(d, lambda nb: _numeric_check(nb).__setitem__(
    "utilisation", _numeric_check(nb)["utilisation"] * (1 + 1e-12))))
case("output-latex")(lambda d, e, s: _edit_nb(d, lambda nb: _outputs(nb, _data("text/latex"))["data"].__setitem__(
    "text/latex", _flip_text(_outputs(nb, _data("text/latex"))["data"]["text/latex"]))))
case("output-markdown-rendered-value")(lambda d, e, s: _edit_nb(d, lambda nb: _outputs(nb, _data("text/markdown"))["data"].__setitem__(
    "text/markdown", _flip_text(_outputs(nb, _data("text/markdown"))["data"]["text/markdown"]))))
case("output-figure-pdf-bytes")(lambda d, e, s: _edit_nb(d, lambda nb: _outputs(nb, _data("application/pdf"))["data"].__setitem__(
    "application/pdf", _flip_text(_outputs(nb, _data("application/pdf"))["data"]["application/pdf"]))))
case("output-figure-data")(lambda d, e, s: _edit_nb(d, lambda nb: _outputs(
    nb, _data("application/vnd.splicecalc.figure+json"))["data"].__setitem__(
    "application/vnd.splicecalc.figure+json", {"kind": "forged"})))
case("output-table")(lambda d, e, s: _edit_nb(d, lambda nb: _outputs(
    nb, _data("application/vnd.splicecalc.table+json"))["data"].__setitem__(
    "application/vnd.splicecalc.table+json", {"title": "forged", "rows": []})))
case("output-job-inputs")(lambda d, e, s: _edit_nb(d, lambda nb: _outputs(
    nb, _data("application/vnd.splicecalc.job+json"))["data"].__setitem__(
    "application/vnd.splicecalc.job+json", {"beam": {"span": "1 m"}})))
case("output-deleted")(lambda d, e, s: _edit_nb(d, lambda nb: next(
    c for c in _code_cells(nb) if c.get("outputs"))["outputs"].pop()))
case("output-added-stream")(lambda d, e, s: _edit_nb(d, lambda nb: _code_cells(nb)[2].setdefault("outputs", []).append(
    {"output_type": "stream", "name": "stdout", "text": "All checks OK\n"})))
case("output-added-error")(lambda d, e, s: _edit_nb(d, lambda nb: _code_cells(nb)[2].setdefault("outputs", []).append(
    {"output_type": "error", "ename": "E", "evalue": "x", "traceback": []})))
case("output-metadata")(lambda d, e, s: _edit_nb(d, lambda nb: _outputs(nb, _data(nbs.CHECK_MIME)).__setitem__(
    "metadata", {"forged": True})))
# metadata reaching the PDF
for key, value in (("title", "Another beam"), ("revision", "C1"), ("status", "APPROVED"), ("project", "Elsewhere"),
                   ("job_number", "X-1"), ("prepared_by", "Z. Nobody"), ("checked_by", "Y. Checker"),
                   ("revisions", [{"rev": "P0", "date": "2026-01-01", "description": "forged"}]),
                   ("signatures", [{"role": "approved", "name": "Z", "date": "2026-12-01", "mark": "ok"}]),
                   ("basis", "none")):
    case(f"metadata-{key}")(lambda d, e, s, key=key, value=value: _edit_nb(
        d, _set(["metadata", "splicecalc", key], value)))
case("metadata-kernelspec")(lambda d, e, s: _edit_nb(d, _set(["metadata", "kernelspec", "name"], "other")))
case("metadata-top-level-added")(lambda d, e, s: _edit_nb(d, _set(["metadata", "extra"], {"a": 1})))
case("nbformat-minor")(lambda d, e, s: _edit_nb(d, _set(["nbformat_minor"], 99)))
# signer role and name
case("signer-role-in-record")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb)[1]["message"].__setitem__("role", "approved")))
case("signer-name-in-record")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb)[0]["message"].__setitem__("signer", "Z. Other")))
case("signer-certificate-swapped")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb)[1].__setitem__(
    "certificate", keys.cert_pem(_k(e, "c").cert))))
case("signer-signature-bytes")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb)[0].__setitem__(
    "signature", base64.b64encode(b"\x00" * 70).decode())))
case("signer-signature-not-base64")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb)[0].__setitem__("signature", "!!")))
case("signer-prepared-removed")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb).pop(0)))
case("signer-entries-reordered")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb).reverse()))
case("signer-entry-duplicated")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb).append(_sigs(nb)[1])))
case("signer-algorithm")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb)[0].__setitem__("algorithm", "rsa-pss-sha256")))
case("signer-previous-emptied")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb)[1]["message"].__setitem__("previous", [])))
case("signer-fingerprint")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb)[1]["message"].__setitem__(
    "cert_sha256", _k(e, "c").fingerprint)))
case("signer-forger-claims-name")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb).__setitem__(
    1, _resign(_sigs(nb)[1], _k(e, "c"), signer="B. Checker"))))
case("swap-checked-entry-for-a-genuine-other-signer")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb).__setitem__(
    1, _resign(_sigs(nb)[1], _k(e, "c"), signer="C. Approver", cert_sha256=_k(e, "c").fingerprint))))
case("signoff-list-removed")(lambda d, e, s: _edit_nb(d, lambda nb: nb["metadata"]["splicecalc"].pop("sign_off")))
# the job file
case("job-value")(lambda d, e, s: (d / f"{NAME}.toml").write_text(
    (d / f"{NAME}.toml").read_text().replace('span = "9.6 m"', 'span = "9.0 m"')))
case("job-comment")(lambda d, e, s: (d / f"{NAME}.toml").write_text((d / f"{NAME}.toml").read_text() + "# note\n"))
case("job-trailing-newline")(lambda d, e, s: (d / f"{NAME}.toml").write_text((d / f"{NAME}.toml").read_text() + "\n"))
case("job-deleted")(lambda d, e, s: (d / f"{NAME}.toml").unlink())
case("job-replaced")(lambda d, e, s: _cp(Path(__file__).resolve().parents[1] / "examples" / "mezzanine_infill.toml",
                                                 d / f"{NAME}.toml"))
# PDF bytes
case("pdf-byte-first-revision")(lambda d, e, s: _pdf_edit(d, _flip_at(0.3)))
case("pdf-byte-first-update")(lambda d, e, s: _pdf_edit(d, _flip_at(where=_second_revision_offset)))
case("pdf-byte-signature-contents")(lambda d, e, s: _pdf_edit(d, _flip_at(where=_inside_contents)))
case("pdf-byte-near-end")(lambda d, e, s: _pdf_edit(d, _flip_at(where=lambda b: len(b) - 300)))
case("pdf-last-revision-cut")(lambda d, e, s: _pdf_edit(d, _cut_last_revision))
case("pdf-bytes-appended")(lambda d, e, s: _pdf_edit(d, lambda b: b + b"\n% trailing junk\n"))
case("pdf-update-page-content")(lambda d, e, s: _incremental(d, _add_page_content))
case("pdf-update-annotation")(lambda d, e, s: _incremental(d, _add_annotation))
case("pdf-update-info")(lambda d, e, s: _incremental(d, _change_info))
case("pdf-update-catalog-script")(lambda d, e, s: _incremental(d, _catalog_js))
case("pdf-replaced-by-unsigned-build")(lambda d, e, s: _cp(e["built"] / f"{NAME}.pdf", d / f"{NAME}.pdf"))
case("pdf-truncated-half")(lambda d, e, s: _pdf_edit(d, lambda b: b[: len(b) // 2]))
# the sidecar never vouches (each with a real change that it tries to cover)
case("sidecar-claims-approved-after-byte-change")(lambda d, e, s: (_pdf_edit(d, _flip_at(0.4)), _rewrite_sidecar(d)))
case("sidecar-points-to-other-notebook")(lambda d, e, s: (
    _edit_nb(d, _set(["metadata", "splicecalc", "title"], "Other")),
    _rewrite_sidecar(d, notebook=str(s["s2"] / f"{NAME}.ipynb"))))
case("sidecar-notebook-null")(lambda d, e, s: (
    _edit_nb(d, _set(["metadata", "splicecalc", "status"], "APPROVED")), _rewrite_sidecar(d, notebook=None)))
case("sidecar-issued-on-changed-job")(lambda d, e, s: (
    (d / f"{NAME}.toml").write_text((d / f"{NAME}.toml").read_text() + " "), _rewrite_sidecar(d, issued=True)))
# moved packages
case("moved-pdf-beside-other-notebook")(lambda d, e, s: _cp(s["s2"] / f"{NAME}.pdf", d / f"{NAME}.pdf"))
case("moved-notebook-beside-other-pdf")(lambda d, e, s: _cp(s["s2"] / f"{NAME}.ipynb", d / f"{NAME}.ipynb"))


@case("moved-notebook-without-job")
def _moved_nb(d, e, s):
    other = d / "elsewhere"
    other.mkdir()
    shutil.move(d / f"{NAME}.ipynb", other / f"{NAME}.ipynb")
    return other / f"{NAME}.ipynb"


@case("moved-pdf-renamed-beside-other-notebook")
def _moved_rename(d, e, s):
    shutil.copy(s["s2"] / f"{NAME}.pdf", d / "other.pdf")
    shutil.copy(d / f"{NAME}.ipynb", d / "other.ipynb")
    return d / "other.pdf"


# transplanted signatures
case("transplant-notebook-signoff-list")(lambda d, e, s: _edit_nb(d, lambda nb: nb["metadata"]["splicecalc"].__setitem__(
    "sign_off", nbs.read_notebook(s["s2"] / f"{NAME}.ipynb")["metadata"]["splicecalc"]["sign_off"])))
case("transplant-notebook-checked-entry")(lambda d, e, s: _edit_nb(d, lambda nb: _sigs(nb).__setitem__(
    1, nbs.read_notebook(s["s2"] / f"{NAME}.ipynb")["metadata"]["splicecalc"]["sign_off"][1])))


@case("transplant-pdf-signature-contents")
def _transplant_contents(d, e, s):
    mine = bytearray((d / f"{NAME}.pdf").read_bytes())
    theirs = (s["s2"] / f"{NAME}.pdf").read_bytes()
    m1 = list(re.finditer(rb"/Contents <([0-9a-fA-F]+)>", bytes(mine)))[-1]
    m2 = list(re.finditer(rb"/Contents <([0-9a-fA-F]+)>", theirs))[-1]
    n = min(len(m1.group(1)), len(m2.group(1)))
    mine[m1.start(1):m1.start(1) + n] = m2.group(1)[:n]
    (d / f"{NAME}.pdf").write_bytes(bytes(mine))


@case("transplant-signatures-onto-edited-notebook")
def _transplant_edited(d, e, s):
    signed_list = nbs.read_notebook(d / f"{NAME}.ipynb")["metadata"]["splicecalc"]["sign_off"]
    shutil.copy(e["built"] / f"{NAME}.ipynb", d / f"{NAME}.ipynb")
    _edit_nb(d, lambda nb: (_first_check(nb).__setitem__("utilisation", 0.2),
                            nb["metadata"]["splicecalc"].__setitem__("sign_off", signed_list)))


# role order (signed with a forger's tool that skips sign_package's rules)
for cid, steps in (("order-checked-without-prepared", [("b", "checked")]),
                   ("order-approved-without-checked", [("a", "prepared"), ("c", "approved")]),
                   ("order-same-key-two-roles", [("a", "prepared"), ("a", "checked")]),
                   ("order-same-name-other-key", [("a", "prepared"), ("a2", "checked")]),
                   ("order-issued-without-checked", [("a", "prepared"), ("c", "issued")]),
                   ("order-approver-is-checker", [("a", "prepared"), ("b", "checked"), ("b", "approved")])):
    case(cid, base="built")(lambda d, e, s, steps=steps: [_low_level_sign(d, _k(e, k), role) for k, role in steps])


# the summary's acceptance boxes (read-only text fields, filled by a checked / approved signature's own update)
def _fill_accept(w, name="AcceptApproved", text="Approved by Z. Nobody: all accepted."):
    from pyhanko.pdf_utils.form_tools import populate_static_text_field
    from pyhanko.pdf_utils.text import TextBoxStyle

    populate_static_text_field(w, name, TextBoxStyle(font_size=6), text)


def _refill_accept(w):
    from pyhanko.pdf_utils import generic

    for ref in w.root["/AcroForm"]["/Fields"]:
        f = ref.get_object()
        if f.get("/T") == "AcceptChecked":
            f[generic.NameObject("/V")] = generic.TextStringObject("Checked by B. Checker: nothing to accept.")
            w.mark_update(ref)


case("accept-box-filled-by-hand")(lambda d, e, s: _incremental(d, _fill_accept))
case("accept-box-refilled")(lambda d, e, s: _incremental(d, _refill_accept))
# a forger's tool signs checked over the demo's NOT CHECKED items without stating how they are covered
case("accept-missing-checked", base="built")(lambda d, e, s: [
    _low_level_sign(d, _k(e, "a"), "prepared"), _low_level_sign(d, _k(e, "b"), "checked")])
case("accept-box-filled-then-signed", base="built")(lambda d, e, s: [
    _low_level_sign(d, _k(e, "a"), "prepared"), _incremental(d, lambda w: _fill_accept(w, "AcceptChecked", "x")),
    _low_level_sign(d, _k(e, "b"), "checked", accept_note="x")])


def test_corpus_is_large_enough():
    assert len(CASES) >= 60


@pytest.mark.parametrize("cid,base,tamper", CASES)
def test_tampering_is_detected(cid, base, tamper, env, signed, tmp_path):
    src = env["built"] if base == "built" else signed[base]
    d = _fresh(src, tmp_path)
    if base != "built":
        assert verify_package(d / f"{NAME}.pdf").state == "valid"
    target = tamper(d, env, signed)
    target = target if isinstance(target, Path) else d / f"{NAME}.pdf"
    st = verify_package(target)
    assert st.state != "valid", (cid, st.lines)
    assert st.exit_code in (1, 3)
    if cid.startswith(("cell-", "output-", "metadata-", "signer-", "job-", "nbformat")):
        assert verify_package(d / f"{NAME}.ipynb").state != "valid", cid


@pytest.mark.parametrize("dump", [dict(indent=4), dict(indent=None), dict(indent=2, ensure_ascii=True),
                                  dict(indent=1, sort_keys=False)])
def test_reserialised_json_is_not_flagged(dump, signed, tmp_path):
    d = _fresh(signed["s1"], tmp_path)
    p = d / f"{NAME}.ipynb"
    nb = json.loads(p.read_text(encoding="utf-8"))
    if not dump.get("sort_keys", True):
        nb = dict(reversed(list(nb.items())))
    p.write_text(json.dumps(nb, **dump), encoding="utf-8")
    assert verify_package(d / f"{NAME}.pdf").state == "valid"
    assert verify_package(p).state == "valid"


def test_nbformat_round_trip_is_not_flagged(signed, tmp_path):
    """Reading and writing the notebook with nbformat (what saving it in Jupyter does) changes no content."""
    import nbformat

    d = _fresh(signed["s1"], tmp_path)
    p = d / f"{NAME}.ipynb"
    nbformat.write(nbformat.read(str(p), as_version=4), str(p))
    assert verify_package(d / f"{NAME}.pdf").state == "valid"


def test_thorough_check_agrees_with_the_quick_one(signed, tmp_path):
    """pyHanko's full difference analysis finds the page-content update the quick rule finds."""
    d = _fresh(signed["s1"], tmp_path)
    pdf = d / f"{NAME}.pdf"
    assert all(not s.problems for s in pdfsign.validate_pdf_bytes(pdf.read_bytes(), [], thorough=True))
    _incremental(d, _add_annotation)
    quick = pdfsign.validate_pdf_bytes(pdf.read_bytes(), [])
    full = pdfsign.validate_pdf_bytes(pdf.read_bytes(), [], thorough=True)
    assert any(s.problems for s in quick) and any(s.problems for s in full)


# ----------------------------------------------------------------- order, failing checks, issue
def test_sign_refuses_out_of_order_and_same_person_needs_a_reason(env, tmp_path, monkeypatch):
    # both of A's keys trusted here (a sole practitioner's second key); the session's list trusts only "a"
    monkeypatch.setenv(keys.TRUST_DIR_ENV, str(tmp_path / "trust"))
    for k in ("a", "a2"):
        keys.export_cert(_k(env, k), tmp_path / f"{k}.pem")
        keys.trust_cert(tmp_path / f"{k}.pem")
    d = _fresh(env["built"], tmp_path)
    pdf = d / f"{NAME}.pdf"
    with pytest.raises(InputError, match="checked without a prepared"):
        sign_package(pdf, "checked", _k(env, "b"))
    sign_package(pdf, "prepared", _k(env, "a"))
    with pytest.raises(InputError, match="same-person-ok"):
        sign_package(pdf, "checked", _k(env, "a"))
    with pytest.raises(InputError, match="approved without a checked"):
        sign_package(pdf, "approved", _k(env, "c"))
    r = sign_package(pdf, "checked", _k(env, "a2"), same_person_ok="sole practitioner, checked a day later",
                     accept_not_checked=NC)
    st = r.status
    assert st.state == "valid" and "same person: sole practitioner" in "\n".join(st.lines)
    txt = subprocess.run(["pdftotext", "-f", "1", "-l", "1", str(pdf), "-"], capture_output=True, text=True).stdout
    assert "Same person as earlier role: sole practitioner" in txt          # printed on the cover
    with pytest.raises(InputError, match="signed twice"):
        sign_package(pdf, "checked", _k(env, "b"), accept_not_checked=NC)


def _make_failing(d: Path) -> None:
    _edit_nb(d, lambda nb: _first_check(nb).__setitem__("ok", False))
    (d / f"{NAME}.pdf.json").unlink()          # the build record would (rightly) say the notebook changed


def test_failing_package_needs_a_reason_to_be_checked_and_issued(env, tmp_path):
    d = _fresh(env["built"], tmp_path)
    _make_failing(d)
    pdf = d / f"{NAME}.pdf"
    r = sign_package(pdf, "prepared", _k(env, "a"))
    assert len(r.failing) == 1
    with pytest.raises(InputError, match="failing"):
        sign_package(pdf, "checked", _k(env, "b"))
    r = sign_package(pdf, "checked", _k(env, "b"), accept_failing="plate check conservative, see note 3",
                     accept_not_checked=NC)
    assert "failing checks accepted: plate check conservative" in "\n".join(r.status.lines)
    txt = subprocess.run(["pdftotext", "-f", "1", "-l", "1", str(pdf), "-"], capture_output=True, text=True).stdout
    assert "failing check(s) accepted" in txt
    with pytest.raises(InputError, match="override"):
        issue_package(pdf, "for construction", _k(env, "c"))
    row = issue_package(pdf, "for construction", _k(env, "c"), override="client instruction 14")
    assert row["override"] == "client instruction 14"
    assert verify_package(pdf).state == "valid"


def test_not_checked_items_need_an_acknowledgement_printed_on_the_cover_and_in_the_summary(env, tmp_path):
    """Issue 10 item 6 / audit: checked and approved signatures over failing checks or NOT CHECKED items state a
    reason, printed on the cover (the signature's appearance) and in the summary's acceptance box, a read-only
    text field filled in the signature's own update and locked by its field (FieldMDP)."""
    from pyhanko.pdf_utils.reader import PdfFileReader

    d = _fresh(env["built"], tmp_path)
    pdf = d / f"{NAME}.pdf"
    base = PdfFileReader(io.BytesIO(pdf.read_bytes()))
    boxes = pdfsign.field_boxes(base, pdfsign.ACCEPT_PREFIX, (pdfsign.ACCEPT_W, pdfsign.ACCEPT_H))
    assert set(boxes) == {"checked", "approved"}               # the demo has NOT CHECKED items: boxes reserved
    summary_page = boxes["checked"][0]
    sign_package(pdf, "prepared", _k(env, "a"))
    with pytest.raises(InputError, match="accept-not-checked") as exc:
        sign_package(pdf, "checked", _k(env, "b"))
    gaps = nbs.not_checked(nbs.read_notebook(d / f"{NAME}.ipynb"))
    assert gaps and f"{len(gaps)} NOT CHECKED" in str(exc.value) and "\n" not in str(exc.value)
    r = sign_package(pdf, "checked", _k(env, "b"), accept_not_checked=NC)
    assert len(r.not_checked) == len(gaps)
    st = r.status
    assert st.state == "valid" and "NOT CHECKED items acknowledged: " + NC in "\n".join(st.lines)
    reader = PdfFileReader(io.BytesIO(pdf.read_bytes()))
    vals = pdfsign.accept_values(reader)
    assert vals["AcceptApproved"] is None
    assert vals["AcceptChecked"].replace("\n", " ").startswith(f"Checked by B. Checker: {len(gaps)} NOT CHECKED "
                                                               "item(s) acknowledged: column below")
    lock = next(f.get_object()["/Lock"] for n, f in pdfsign._form_field_names(reader) if n == "SignChecked")
    assert lock["/Action"] == "/Include" and list(lock["/Fields"]) == ["AcceptChecked"]
    # pyHanko's full difference analysis and poppler's pdfsig agree the document is signed and unchanged since
    full = pdfsign.validate_pdf_bytes(pdf.read_bytes(), [], thorough=True)
    assert all(not s.problems and s.modification_ok for s in full), [s.problems for s in full]
    out = subprocess.run(["pdfsig", str(pdf)], capture_output=True, text=True).stdout
    assert out.count("Signature Validation: Signature is Valid.") == 2
    # printed: the cover (signature appearance) and the summary sheet (the field's appearance, rendered by poppler)
    txt = subprocess.run(["pdftotext", "-f", "1", "-l", "1", str(pdf), "-"], capture_output=True, text=True).stdout
    assert f"{len(gaps)} NOT CHECKED acknowledged" in txt
    png = tmp_path / "summary"
    subprocess.run(["pdftoppm", "-f", str(summary_page + 1), "-l", str(summary_page + 1), "-r", "40", "-png",
                    str(pdf), str(png)], check=True)
    blank = tmp_path / "blank"
    subprocess.run(["pdftoppm", "-f", str(summary_page + 1), "-l", str(summary_page + 1), "-r", "40", "-png",
                    str(env["built"] / f"{NAME}.pdf"), str(blank)], check=True)
    assert next(tmp_path.glob("summary*.png")).read_bytes() != next(tmp_path.glob("blank*.png")).read_bytes()
    # an approver over the same package says it again, in the approver's own box
    with pytest.raises(InputError, match="accept-not-checked"):
        sign_package(pdf, "approved", _k(env, "c"))
    sign_package(pdf, "approved", _k(env, "c"), accept_not_checked="agreed with the checker")
    vals = pdfsign.accept_values(PdfFileReader(io.BytesIO(pdf.read_bytes())))
    assert "agreed with the checker" in vals["AcceptApproved"] and "column below" in vals["AcceptChecked"]
    assert verify_package(pdf).state == "valid"
    assert all(not s.problems for s in pdfsign.validate_pdf_bytes(pdf.read_bytes(), [], thorough=True))


def test_sign_refuses_a_pdf_and_notebook_of_different_builds(env, tmp_path):
    d = _fresh(env["built"], tmp_path)
    _edit_nb(d, _set(["metadata", "splicecalc", "title"], "edited after the build"))
    with pytest.raises(InputError, match="one build"):
        sign_package(d / f"{NAME}.pdf", "prepared", _k(env, "a"))


def test_issue_needs_checked_records_and_refuses_twice(env, signed, tmp_path):
    d = _fresh(env["built"], tmp_path / "a")
    sign_package(d / f"{NAME}.pdf", "prepared", _k(env, "a"))
    with pytest.raises(InputError, match="checked"):
        issue_package(d / f"{NAME}.pdf", "for construction", _k(env, "c"))
    with pytest.raises(InputError, match="unsigned"):
        issue_package(_fresh(env["built"], tmp_path / "b") / f"{NAME}.pdf", "for construction", _k(env, "c"))
    d = _fresh(signed["s1"], tmp_path / "c")
    pdf = d / f"{NAME}.pdf"
    row = issue_package(pdf, "for construction", _k(env, "c"))
    assert (row["revision"], row["issuer"], row["purpose"]) == ("P1", "C. Approver", "for construction")
    reg = json.loads((d / "issue_register.json").read_text())
    assert [r["revision"] for r in reg] == ["P1"]
    st = verify_package(pdf)
    assert st.state == "valid" and st.pdf[-1].role == "issued" and st.pdf[-1].tag["purpose"] == "for construction"
    with pytest.raises(AlreadyIssued, match="already issued"):
        issue_package(pdf, "for construction", _k(env, "c"))
    # the same revision as another file in the folder: the register says so
    shutil.copy(signed["s2"] / f"{NAME}.pdf", d / "copy.pdf")
    shutil.copy(signed["s2"] / f"{NAME}.ipynb", d / "copy.ipynb")
    shutil.copy(signed["s2"] / f"{NAME}.toml", d / "copy_job.toml")
    with pytest.raises(AlreadyIssued, match="already issued"):
        issue_package(d / "copy.pdf", "for tender", _k(env, "c"))
    out = subprocess.run(["pdfsig", str(pdf)], capture_output=True, text=True).stdout
    assert out.count("Signature Validation: Signature is Valid.") == 3


def test_cli_sign_verify_issue(env, tmp_path):
    d = _fresh(env["built"], tmp_path)
    e = dict(os.environ, SPLICECALC_PASSPHRASE=PW.decode())
    run = lambda *a: subprocess.run([*CLI, *a], cwd=d, env=e, capture_output=True, text=True, timeout=120)  # noqa: E731
    assert run("verify", f"{NAME}.pdf").returncode == 3
    kd = env["root"] / "keys"
    r = run("sign", f"{NAME}.pdf", "--role", "prepared", "--key", str(kd / "a.p12"))
    assert r.returncode == 0, r.stderr
    r = run("sign", f"{NAME}.pdf", "--role", "checked", "--key", str(kd / "b.p12"), "--reason", "checked",
            "--accept-not-checked", NC)
    assert r.returncode == 0, r.stderr
    v = run("verify", f"{NAME}.pdf")
    assert v.returncode == 0 and "VALID" in v.stdout and "valid but untrusted signer" in v.stdout
    assert run("verify", f"{NAME}.pdf", "--json").returncode == 0
    assert run("verify", f"{NAME}.pdf", "--thorough").returncode == 0
    r = run("issue", f"{NAME}.pdf", "--purpose", "for construction", "--key", str(kd / "c.p12"))
    assert r.returncode == 0, r.stderr
    r = run("issue", f"{NAME}.pdf", "--purpose", "for construction", "--key", str(kd / "c.p12"))
    assert r.returncode == 2 and "already issued" in r.stderr
    r = run("sign", f"{NAME}.pdf", "--role", "approved", "--key", str(kd / "c.p12"))
    assert r.returncode == 2 and "never changed" in r.stderr           # issued: the file is final
    bad = dict(e, SPLICECALC_PASSPHRASE="wrong passphrase")
    r = subprocess.run([*CLI, "sign", f"{NAME}.pdf", "--role", "approved", "--key", str(kd / "c.p12")], cwd=d, env=bad,
                       capture_output=True, text=True)
    assert r.returncode == 2 and "passphrase" in r.stderr and "Traceback" not in r.stderr
    # a signed package is never rebuilt over, whatever the case of the name
    r = run("build", f"{NAME}.toml", "-o", f"{NAME.upper()}.PDF", "--quiet")
    assert r.returncode == 2 and "will not be overwritten" in r.stderr
    data = (d / f"{NAME}.pdf").read_bytes()
    data = data.replace(b"Gallery beam GB1", b"Gallery beam GB2", 1)
    (d / f"{NAME}.pdf").write_bytes(data)
    v = run("verify", f"{NAME}.pdf")
    assert v.returncode == 1 and "CHANGED" in v.stdout


def _failing_job(folder: Path) -> Path:
    """The demo job without splices, on a beam far too small: member checks fail (bending, LTB, deflection)."""
    import tomllib

    from splicecalc.job import dumps_toml
    from splicecalc.workflow.package import demo_job_path

    doc = tomllib.loads(demo_job_path().read_text(encoding="utf-8"))
    del doc["splices"]
    doc["beam"]["section"] = "203x133x25 UKB"       # 9.6 m span: hopeless on purpose
    folder.mkdir(parents=True, exist_ok=True)
    (folder / "job.toml").write_text(dumps_toml(doc), encoding="utf-8")
    return folder / "job.toml"


def test_killed_build_leaves_no_partial_file_then_failing_build_exits_1(tmp_path):
    d = tmp_path / "out"
    _failing_job(d)
    p = subprocess.Popen([*CLI, "build", "job.toml", "--quiet"], cwd=d, stdout=subprocess.PIPE,
                         stderr=subprocess.PIPE, start_new_session=True)
    time.sleep(6.0)                                   # the kernel is running cells
    os.killpg(p.pid, signal.SIGKILL)
    p.wait()
    # nothing half-written under a final name: the PDF is absent (or whole), the notebook parses
    pdf = d / "job.pdf"
    assert not pdf.exists() or pdf.read_bytes().rstrip().endswith(b"%%EOF")
    nb = d / "job.ipynb"
    if nb.exists():
        json.loads(nb.read_text(encoding="utf-8"))
    # the folder is not left locked; a failing package builds but exits 1 and names the failing checks
    r = subprocess.run([*CLI, "build", "job.toml", "--quiet"], cwd=d, capture_output=True, text=True, timeout=600)
    assert r.returncode == 1, r.stderr
    assert "check(s) FAIL" in r.stderr and "NOT OK  bending" in r.stderr and "NOT OK  ltb_1" in r.stderr
    assert pdf.is_file()


def test_revision_is_built_as_new_files_carrying_the_new_revision(signed, env, tmp_path):
    """After revise + build, the title block, footer and file names say P2 and the history keeps P1."""
    from splicecalc.signoff.revise import revise
    from splicecalc.workflow.package import build_package

    d = _fresh(signed["s1"], tmp_path)
    before = {f.name: f.read_bytes() for f in d.iterdir() if f.is_file()}
    r = revise(d / f"{NAME}.pdf", "P2", "Loads from the revised architect's layout")
    assert r.notebook.name == f"{NAME}_P2.ipynb" and r.job.name == f"{NAME}_P2.toml"
    b = build_package(r.notebook, progress=False)
    assert b.pdf.name == f"{NAME}_P2.pdf"
    for name, data in before.items():                       # nothing of P1 was touched
        if not name.endswith(".json"):
            assert (d / name).read_bytes() == data, name
    assert verify_package(d / f"{NAME}.pdf").state == "valid"
    pages = subprocess.run(["pdftotext", "-layout", str(b.pdf), "-"], capture_output=True, text=True,
                           check=True).stdout.split("\f")
    cover = pages[0]
    assert "Rev. P2" in " ".join(pages[1].split()) and "Rev. P2" in " ".join(cover.split())
    rows = [ln.split() for ln in cover.splitlines() if re.match(r"\s*P[12]\s+20\d\d-", ln)]
    assert [row[0] for row in rows] == ["P1", "P2"]
    p1 = " ".join(rows[0])
    assert "A. Preparer" in p1 and "B. Checker" in p1            # who prepared and checked P1
    assert verify_package(b.pdf).state == "unsigned"


def test_key_from_the_firms_ca_is_trusted_through_the_ca(env, tmp_path):
    """A key issued by a firm CA (made here with cryptography) signs; trusting the CA trusts the signer."""
    import datetime as dt

    from cryptography import x509
    from cryptography.hazmat.primitives import hashes, serialization
    from cryptography.hazmat.primitives.asymmetric import ec
    from cryptography.x509.oid import NameOID

    now = dt.datetime.now(dt.timezone.utc) - dt.timedelta(minutes=5)
    ku = dict(content_commitment=True, key_encipherment=False, data_encipherment=False, key_agreement=False,
              crl_sign=False, encipher_only=False, decipher_only=False)
    ca_key = ec.generate_private_key(ec.SECP256R1())
    ca_name = x509.Name([x509.NameAttribute(NameOID.COMMON_NAME, "Test Works CA")])
    ca = (x509.CertificateBuilder().subject_name(ca_name).issuer_name(ca_name).public_key(ca_key.public_key())
          .serial_number(11).not_valid_before(now).not_valid_after(now + dt.timedelta(days=30))
          .add_extension(x509.BasicConstraints(ca=True, path_length=0), critical=True)
          .add_extension(x509.KeyUsage(digital_signature=True, key_cert_sign=True, **{**ku, "crl_sign": True}),
                         critical=True)
          .sign(ca_key, hashes.SHA256()))
    k = ec.generate_private_key(ec.SECP256R1())
    cert = (x509.CertificateBuilder().subject_name(x509.Name([x509.NameAttribute(NameOID.COMMON_NAME, "D. Staff")]))
            .issuer_name(ca_name).public_key(k.public_key()).serial_number(12).not_valid_before(now)
            .not_valid_after(now + dt.timedelta(days=30))
            .add_extension(x509.KeyUsage(digital_signature=True, key_cert_sign=False, **ku), critical=True)
            .sign(ca_key, hashes.SHA256()))
    (tmp_path / "k.pem").write_bytes(k.private_bytes(serialization.Encoding.PEM, serialization.PrivateFormat.PKCS8,
                                                     serialization.NoEncryption()))
    (tmp_path / "c.pem").write_bytes(cert.public_bytes(serialization.Encoding.PEM))
    (tmp_path / "ca.pem").write_bytes(ca.public_bytes(serialization.Encoding.PEM))
    kp = keys.import_key(tmp_path / "d.p12", PW, key_pem=tmp_path / "k.pem", cert_pem_path=tmp_path / "c.pem",
                         chain=(tmp_path / "ca.pem",))
    d = _fresh(env["built"], tmp_path)
    sign_package(d / f"{NAME}.pdf", "prepared", kp)
    st = verify_package(d / f"{NAME}.pdf")
    assert st.state == "valid" and "valid but untrusted signer" in st.lines[1]
    keys.trust_cert(tmp_path / "ca.pem")
    try:
        st = verify_package(d / f"{NAME}.pdf")
        assert st.state == "valid" and st.lines[1].endswith("signature valid, trusted"), st.lines
        assert st.pdf[0].trusted and st.notebook[0].trusted
    finally:
        (Path(os.environ[keys.TRUST_DIR_ENV]) / f"{keys.cert_fingerprint(ca)}.pem").unlink()


def test_untrusted_key_in_a_trusted_name_is_not_valid(env, tmp_path):
    """Anyone can make a key in any name: a second, untrusted key in the name of a trusted
    certificate (A. Preparer, trusted as key "a") is an impostor's mark, never VALID."""
    d = _fresh(env["built"], tmp_path)
    pdf = d / f"{NAME}.pdf"
    sign_package(pdf, "prepared", _k(env, "a2"))          # a2: "A. Preparer", not in the trust list
    for target in (pdf, d / f"{NAME}.ipynb"):
        st = verify_package(target)
        assert st.state == "changed" and st.exit_code == 1, st.lines
        assert "not in the trust list, although a trusted certificate carries that name" in st.lines[0]
    # an untrusted key in a name nobody trusts stays "valid but untrusted signer"
    d2 = _fresh(env["built"], tmp_path, "pkg2")
    sign_package(d2 / f"{NAME}.pdf", "prepared", _k(env, "b"))
    st = verify_package(d2 / f"{NAME}.pdf")
    assert st.state == "valid" and "valid but untrusted signer" in st.lines[1], st.lines


def test_a_build_record_that_names_other_signers_gets_a_note(signed, tmp_path):
    """The .pdf.json build record is a hint for people: verify never trusts it, but says when it lies."""
    d = _fresh(signed["s1"], tmp_path)
    st = verify_package(d / f"{NAME}.pdf")
    assert not any("build record" in n for n in st.notes), st.notes          # as signed: no note
    sc = d / f"{NAME}.pdf.json"
    rec = json.loads(sc.read_text())
    rec["signed"] = [{"role": "prepared", "signer": "A. Preparer"}, {"role": "checked", "signer": "Z. Nobody"},
                     {"role": "approved", "signer": "Z. Nobody"}]
    sc.write_text(json.dumps(rec))
    st = verify_package(d / f"{NAME}.pdf")
    assert st.state == "valid"                                                # the signatures decide
    assert any("lists other signatures" in n and "Z. Nobody" in n for n in st.notes), st.notes
    assert any("lists other signatures" in line for line in st.lines)
    sc.write_text("[1]")
    assert any("cannot be read" in n for n in verify_package(d / f"{NAME}.pdf").notes)


def test_pdf_and_notebook_of_different_jobs_are_never_signed_or_valid(env, tmp_path):
    """Without the build record (a hint, deleted here) the PDF's own title and job number (set from the
    title block at build) still tie it to the notebook: another job's notebook beside it is refused."""
    d = _fresh(env["built"], tmp_path)
    (d / f"{NAME}.pdf.json").unlink()
    _edit_nb(d, lambda nb: nb["metadata"]["splicecalc"].update(title="Roof beam R7, other site", job_number="X-77"))
    with pytest.raises(InputError, match="another job"):
        sign_package(d / f"{NAME}.pdf", "prepared", _k(env, "a"))
    _low_level_sign(d, _k(env, "a"), "prepared")          # a forger's tool skips that refusal
    st = verify_package(d / f"{NAME}.pdf")
    assert st.state == "changed" and "another job" in st.lines[0], st.lines


def test_percent_signs_in_a_name_or_reason_sign_as_typed(env, tmp_path):
    """pyHanko fills the stamp text in with %-formatting: a "%" in a signer's name or reason once ended
    sign with 'unsupported format character'."""
    kp = keys.new_key("50% Partner & Co ~ #1 %(signer)s", tmp_path / "pct.p12", PW)
    d = _fresh(env["built"], tmp_path)
    sign_package(d / f"{NAME}.pdf", "prepared", kp, reason="100% of the checks %s %(ts)s")
    st = verify_package(d / f"{NAME}.pdf")
    assert st.state == "valid", st.lines
    assert "prepared: 50% Partner & Co ~ #1 %(signer)s" in st.lines[1]
