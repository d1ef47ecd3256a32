"""Sign-off without a PDF build: keys, the notebook's canonical digest and detached signatures,
role order, revisions, protection of signed files, the build lock.

References: X.509 / PKCS#12 parsing by the ``cryptography`` package (outside the project);
SHA-256 from Python's hashlib (FIPS 180-4); the notebook format from nbformat.
"""

from __future__ import annotations

import base64
import hashlib
import json
import os
import shutil
import subprocess
import sys
import tomllib
from pathlib import Path

import nbformat
import pytest

from splicecalc.core.errors import InputError
from splicecalc.signoff import keys
from splicecalc.signoff import notebook as nbs
from splicecalc.signoff.ledger import is_protected, protection_reason
from splicecalc.signoff.package import role_order_problems
from splicecalc.signoff.revise import revise, set_job_revision

CHECK = nbs.CHECK_MIME
PW = b"test passphrase 1"


@pytest.fixture(scope="module")
def keyset(tmp_path_factory):
    d = tmp_path_factory.mktemp("keys")
    return {n: keys.new_key(full, d / f"{n}.p12", PW, email=f"{n}@example.com", organisation="Test Works")
            for n, full in (("a", "A. Preparer"), ("b", "B. Checker"))}


def _nb(folder: Path, ok: bool = True) -> Path:
    nb = nbformat.v4.new_notebook()
    p = nbformat.v4.new_code_cell('job_file = "job.toml"')
    p.metadata["tags"] = ["parameters"]
    c = nbformat.v4.new_code_cell("show(check)")
    c.outputs = [nbformat.v4.new_output("display_data", data={
        CHECK: {"id": "bolt_shear", "title": "Bolt shear", "ok": ok, "utilisation": 0.5 if ok else 1.2},
        "text/plain": "Bolt shear\nE = 210 000 MPa"})]
    nb.cells = [nbformat.v4.new_markdown_cell("# Calc"), p, c]
    nb.metadata["splicecalc"] = {"title": "Test beam", "revision": "P1", "job_number": "T-1", "status": "DRAFT",
                                 "prepared_by": "A. Preparer", "revisions": []}
    (folder / "job.toml").write_text('[project]\nnumber = "T-1"\nrevision = "P1"   # keep\n\n[beam]\nspan = "6 m"\n',
                                     encoding="utf-8")
    path = folder / "calc.ipynb"
    nbformat.write(nb, str(path))
    return path


# ----------------------------------------------------------------- keys
def test_new_key_is_a_p12_with_a_self_signed_certificate(tmp_path, keyset):
    from cryptography.hazmat.primitives.serialization import pkcs12
    from cryptography.x509.oid import NameOID

    raw = (tmp_path.parent / "keys0" / "a.p12")
    kp = keyset["a"]
    key, cert, extra = pkcs12.load_key_and_certificates(kp.path.read_bytes(), PW)    # cryptography as reference
    assert cert.subject.get_attributes_for_oid(NameOID.COMMON_NAME)[0].value == "A. Preparer"
    assert cert.issuer == cert.subject                                              # self-signed
    with pytest.raises(ValueError):
        pkcs12.load_key_and_certificates(kp.path.read_bytes(), b"wrong passphrase")
    with pytest.raises(InputError, match="passphrase"):
        keys.load_key(kp.path, b"wrong passphrase")
    with pytest.raises(InputError, match="never overwritten"):
        keys.new_key("X", kp.path, PW)
    with pytest.raises(InputError, match="--email"):
        keys.new_key("X", tmp_path / "x.p12", PW, email="not an address")
    with pytest.raises(InputError, match="8 characters"):
        keys.new_key("X", tmp_path / "x.p12", b"short")
    assert not raw.exists() or raw.is_file()


def test_import_key_issued_by_a_firm_ca(tmp_path):
    """A CA made with cryptography signs an engineer's certificate; import packs key + chain."""
    import datetime as dt

    from cryptography import x509
    from cryptography.hazmat.primitives import hashes, serialization
    from cryptography.hazmat.primitives.asymmetric import ec
    from cryptography.x509.oid import NameOID

    now = dt.datetime.now(dt.timezone.utc)
    ca_key = ec.generate_private_key(ec.SECP256R1())
    ca_name = x509.Name([x509.NameAttribute(NameOID.COMMON_NAME, "Test Works CA")])
    ca = (x509.CertificateBuilder().subject_name(ca_name).issuer_name(ca_name).public_key(ca_key.public_key())
          .serial_number(1).not_valid_before(now).not_valid_after(now + dt.timedelta(days=30))
          .add_extension(x509.BasicConstraints(ca=True, path_length=0), critical=True).sign(ca_key, hashes.SHA256()))
    k = ec.generate_private_key(ec.SECP256R1())
    cert = (x509.CertificateBuilder().subject_name(x509.Name([x509.NameAttribute(NameOID.COMMON_NAME, "E. Staff")]))
            .issuer_name(ca_name).public_key(k.public_key()).serial_number(2).not_valid_before(now)
            .not_valid_after(now + dt.timedelta(days=30)).sign(ca_key, hashes.SHA256()))
    (tmp_path / "k.pem").write_bytes(k.private_bytes(serialization.Encoding.PEM, serialization.PrivateFormat.PKCS8,
                                                     serialization.NoEncryption()))
    (tmp_path / "c.pem").write_bytes(cert.public_bytes(serialization.Encoding.PEM))
    (tmp_path / "ca.pem").write_bytes(ca.public_bytes(serialization.Encoding.PEM))
    kp = keys.import_key(tmp_path / "e.p12", PW, key_pem=tmp_path / "k.pem", cert_pem_path=tmp_path / "c.pem",
                         chain=(tmp_path / "ca.pem",))
    back = keys.load_key(kp.path, PW)
    assert back.name == "E. Staff" and len(back.chain) == 1 and back.chain[0].subject == ca_name
    # trusting the firm's CA trusts the certificates it issued (and nothing else)
    assert keys.is_trusted(back.cert, [ca]) and not keys.is_trusted(back.cert, [])
    other = keys.new_key("F. Outsider", tmp_path / "f.p12", PW)
    assert not keys.is_trusted(other.cert, [ca])
    nbp = _nb(tmp_path)
    nb = _sign_nb(nbp, back, "prepared")
    assert [s.trusted for s in nbs.verify_entries(nb, nbp, [ca])] == [True]
    assert [s.trusted for s in nbs.verify_entries(nb, nbp, [other.cert])] == [False]
    with pytest.raises(InputError, match="certificate of this private key"):
        keys.import_key(tmp_path / "g.p12", PW, key_pem=tmp_path / "k.pem", cert_pem_path=tmp_path / "ca.pem")


def test_trust_list_lives_where_the_environment_says(tmp_path, monkeypatch, keyset):
    monkeypatch.setenv(keys.TRUST_DIR_ENV, str(tmp_path / "trust"))
    pem = tmp_path / "a.pem"
    keys.export_cert(keyset["a"], pem)
    assert keys.trusted_certs() == []
    dest, cert = keys.trust_cert(pem)
    assert dest.parent == tmp_path / "trust" and dest.name == keys.cert_fingerprint(cert) + ".pem"
    assert [keys.cert_fingerprint(c) for c in keys.trusted_certs()] == [keyset["a"].fingerprint]
    (tmp_path / "junk.pem").write_text("not a certificate")
    with pytest.raises(InputError, match="X.509"):
        keys.trust_cert(tmp_path / "junk.pem")


# ----------------------------------------------------------------- the notebook's digest and signatures
def test_digest_covers_the_whole_notebook_but_not_its_layout(tmp_path):
    p = _nb(tmp_path)
    nb = nbs.read_notebook(p)
    d = nbs.notebook_digest(nb)
    # re-indented, keys re-ordered, multi-line strings as lists or strings: same digest
    for dump in (dict(indent=4), dict(indent=None, separators=(",", ":")), dict(indent=2, sort_keys=True),
                 dict(indent=1, ensure_ascii=True)):
        (tmp_path / "re.ipynb").write_text(json.dumps(nb, **dump), encoding="utf-8")
        assert nbs.notebook_digest(nbs.read_notebook(tmp_path / "re.ipynb")) == d
    nb2 = json.loads(json.dumps(nb))
    nb2["cells"][2]["outputs"][0]["data"]["text/plain"] = ["Bolt shear\n", "E = 210 000 MPa"]
    assert nbs.notebook_digest(nb2) == d
    # any change of content: another digest (hashlib reference over the canonical form)
    nb2["cells"][2]["outputs"][0]["data"]["text/plain"] = "Bolt shear\nE = 250 000 MPa"
    assert nbs.notebook_digest(nb2) != d
    assert d == hashlib.sha256(nbs.canonical(nbs._normalise(nb))).hexdigest()


def _sign_nb(p: Path, kp, role: str, **extra) -> dict:
    nb = nbs.read_notebook(p)
    nbs.add_entry(nb, nbs.make_entry(nb, p, kp, role, pdf_sha256="0" * 64, extra=extra))
    nbs.write_notebook(nb, p)
    return nb


def test_detached_signature_detects_every_edit(tmp_path, keyset):
    p = _nb(tmp_path)
    _sign_nb(p, keyset["a"], "prepared")
    sigs = nbs.verify_entries(nbs.read_notebook(p), p, [])
    assert [(s.role, s.signer, s.valid, s.problems) for s in sigs] == [("prepared", "A. Preparer", True, [])]
    base = p.read_text(encoding="utf-8")

    def edit(fn):
        nb = json.loads(base)
        fn(nb)
        p.write_text(json.dumps(nb), encoding="utf-8")
        return nbs.verify_entries(nbs.read_notebook(p), p, [])[0].problems

    assert edit(lambda nb: nb["metadata"]["splicecalc"].__setitem__("title", "Other"))
    assert edit(lambda nb: nb["metadata"]["splicecalc"]["sign_off"][0]["message"].__setitem__("role", "approved"))
    assert edit(lambda nb: nb["metadata"]["splicecalc"]["sign_off"][0]["message"].__setitem__("signer", "Z. Other"))
    assert edit(lambda nb: nb["cells"][2]["outputs"][0]["data"][CHECK].__setitem__("ok", False))
    p.write_text(base, encoding="utf-8")
    (tmp_path / "job.toml").write_text((tmp_path / "job.toml").read_text() + "\n", encoding="utf-8")
    assert "job file job.toml changed" in " ".join(nbs.verify_entries(nbs.read_notebook(p), p, [])[0].problems)


def test_role_order_rules():
    a, b, c = ("fa", "A. One"), ("fb", "B. Two"), ("fc", "C. Three")
    ok = [("prepared", *a, {}), ("checked", *b, {}), ("approved", *c, {})]
    assert role_order_problems(ok) == []
    assert "checked without a prepared" in role_order_problems([("checked", *b, {})])[0]
    assert "approved without a checked" in role_order_problems([("prepared", *a, {}), ("approved", *c, {})])[0]
    assert "without a stated reason" in role_order_problems([("prepared", *a, {}), ("checked", *a, {})])[0]
    # same person by name with another key, too
    assert role_order_problems([("prepared", *a, {}), ("checked", "fz", "a. one", {})])
    assert role_order_problems([("prepared", *a, {}), ("checked", *a, {"same_person_ok": "sole practitioner"})]) == []
    assert "twice" in role_order_problems([("prepared", *a, {}), ("prepared", *b, {})])[0]


def test_failing_checks_are_listed(tmp_path):
    p = _nb(tmp_path, ok=False)
    assert nbs.failing_checks(nbs.read_notebook(p)) == ["bolt_shear (Bolt shear)"]


# ----------------------------------------------------------------- revisions
def test_revise_never_edits_the_signed_notebook(tmp_path, keyset):
    p = _nb(tmp_path)
    _sign_nb(p, keyset["a"], "prepared")
    nb = nbs.read_notebook(p)
    nbs.add_entry(nb, nbs.make_entry(nb, p, keyset["b"], "checked", pdf_sha256="0" * 64, extra={}))
    nbs.write_notebook(nb, p)
    before = p.read_bytes(), (tmp_path / "job.toml").read_bytes()
    r = revise(p, "P2", "Splice bolts changed to M24", date="2026-12-05")
    assert (p.read_bytes(), (tmp_path / "job.toml").read_bytes()) == before
    assert r.notebook.name == "calc_P2.ipynb" and r.job.name == "job_P2.toml"
    new = nbs.read_notebook(r.notebook)
    meta = new["metadata"]["splicecalc"]
    assert meta["revision"] == "P2" and "sign_off" not in meta and meta["status"] == "DRAFT"
    assert [(h["rev"], h["by"], h["checked"]) for h in meta["revisions"]] == [
        ("P1", "A. Preparer", "B. Checker"), ("P2", "A. Preparer", "")]
    assert nbs.job_file_name(new) == "job_P2.toml"
    assert tomllib.loads(r.job.read_text())["project"]["revision"] == "P2"
    assert "# keep" in r.job.read_text()                                   # comments kept
    # the next one from the new notebook keeps both earlier rows; names carry the revision
    r3 = revise(r.notebook, "P3", "Deflection limit changed")
    assert r3.notebook.name == "calc_P3.ipynb" and r3.job.name == "job_P3.toml"
    assert [h["rev"] for h in nbs.read_notebook(r3.notebook)["metadata"]["splicecalc"]["revisions"]] == ["P1", "P2", "P3"]
    with pytest.raises(InputError, match="new revision code"):
        revise(r3.notebook, "P2", "again")
    with pytest.raises(InputError, match="never overwritten"):
        revise(p, "P2", "again")
    with pytest.raises(InputError, match="revision code"):
        revise(p, "not a rev", "x")


def test_set_job_revision_adds_a_missing_key():
    out = set_job_revision('[project]\nnumber = "X"\n\n[beam]\nspan = "6 m"\n', "C1")
    assert tomllib.loads(out)["project"]["revision"] == "C1"
    assert tomllib.loads(set_job_revision('[beam]\nspan = "6 m"\n', "B"))["project"]["revision"] == "B"


# ----------------------------------------------------------------- protection
def test_signed_or_issued_files_are_protected_ignoring_case(tmp_path, keyset):
    p = _nb(tmp_path)
    pdf = tmp_path / "calc.pdf"
    pdf.write_bytes(b"%PDF-1.7\n%%EOF\n")
    assert not is_protected(pdf)
    _sign_nb(p, keyset["a"], "prepared")
    assert "signed notebook" in protection_reason(tmp_path / "CALC.PDF")
    assert is_protected(tmp_path / "calc.pdf")
    other = tmp_path / "other.pdf"
    other.write_bytes(b"%PDF-1.7\n1 0 obj <</Type /Sig /ByteRange [0 1 2 3]>> endobj\n%%EOF\n")
    assert "signed calc package" in protection_reason(tmp_path / "Other.PDF")
    (tmp_path / "issue_register.json").write_text(json.dumps([{"file": "Third.pdf"}]))
    assert protection_reason(tmp_path / "third.PDF") == "an issued revision"


# ----------------------------------------------------------------- the build lock
def test_second_build_in_a_folder_waits_then_stops_clearly(tmp_path):
    from splicecalc.signoff.locks import FolderBusyError, folder_lock

    holder = subprocess.Popen([sys.executable, "-c", (
        "import sys,time; from splicecalc.signoff.locks import folder_lock\n"
        f"l = folder_lock({str(tmp_path)!r}); print('held', flush=True); time.sleep(30)")],
        stdout=subprocess.PIPE, text=True)
    try:
        assert holder.stdout.readline().strip() == "held"
        with pytest.raises(FolderBusyError, match=f"pid {holder.pid}"):
            folder_lock(tmp_path, wait_s=0.5, progress=False)
        # the CLI stops with a clear one-line message before any work (it looks for XeLaTeX first)
        if shutil.which("xelatex") is None or shutil.which("pandoc") is None:
            return
        (tmp_path / "job.toml").write_text(Path(__file__).resolve().parents[1].joinpath(
            "examples", "demo_workshop_gallery.toml").read_text(), encoding="utf-8")
        env = dict(os.environ, SPLICECALC_BUILD_WAIT="0")
        r = subprocess.run([sys.executable, "-m", "splicecalc.cli.main", "build", "job.toml", "--quiet"],
                           cwd=tmp_path, env=env, capture_output=True, text=True, timeout=120)
        assert r.returncode == 1 and "another build" in r.stderr and "Traceback" not in r.stderr
        assert not (tmp_path / "job.pdf").exists() and not (tmp_path / "job.ipynb").exists()
    finally:
        holder.kill()
        holder.wait()
    # a killed holder never leaves the folder locked
    with folder_lock(tmp_path, wait_s=5, progress=False):
        pass


def test_cli_errors_are_one_line(tmp_path, monkeypatch):
    monkeypatch.setenv(keys.PASSPHRASE_ENV, PW.decode())
    (tmp_path / "junk.pdf").write_bytes(b"this is not a pdf")
    (tmp_path / "junk.ipynb").write_text("{not json")
    (tmp_path / "nocells.ipynb").write_text("[1, 2]")
    (tmp_path / "broken.pdf").write_bytes(b"%PDF-1.7\n1 0 obj << /Type /Catalog >> endobj\ntrailer junk\n")
    cases = [(["verify", "missing.pdf"], 2), (["verify", "junk.pdf"], 2), (["verify", "broken.pdf"], 1),
             (["verify", "junk.ipynb"], 2), (["verify", "nocells.ipynb"], 2), (["verify", "job.toml"], 2),
             (["sign", "junk.pdf", "--role", "prepared", "--key", "none.p12"], 2),
             (["keys", "trust", "junk.pdf"], 2), (["issue", "junk.pdf", "--purpose", "x", "--key", "none.p12"], 2),
             (["revise", "junk.ipynb", "--revision", "P2", "--description", "x"], 2)]
    (tmp_path / "job.toml").write_text("")
    for args, code in cases:
        r = subprocess.run([sys.executable, "-m", "splicecalc.cli.main", *args], cwd=tmp_path, capture_output=True,
                           text=True, timeout=60)
        assert r.returncode == code, (args, r.stdout, r.stderr)
        assert "Traceback" not in r.stderr and len((r.stderr + r.stdout).strip().splitlines()) == 1, (args, r.stderr)


def test_b64_signature_is_what_cryptography_verifies(tmp_path, keyset):
    """The stored signature verifies with cryptography directly (outside our code) over the canonical message."""
    from cryptography.hazmat.primitives import hashes
    from cryptography.hazmat.primitives.asymmetric import ec

    p = _nb(tmp_path)
    nb = _sign_nb(p, keyset["a"], "prepared")
    e = nb["metadata"]["splicecalc"]["sign_off"][0]
    cert = keys.load_cert(e["certificate"])
    cert.public_key().verify(base64.b64decode(e["signature"]), nbs.canonical(e["message"]), ec.ECDSA(hashes.SHA256()))
