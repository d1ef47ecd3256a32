"""Signing keys (ECDSA P-256) and the local trust list (``cryptography`` does all the cryptography).

* :func:`new_key` makes an ECDSA key and a self-signed X.509 certificate for one engineer and
  writes them as a passphrase-protected PKCS#12 file;
* :func:`import_key` packs a key and a certificate issued by the firm's own certificate
  authority (PEM, or a PKCS#12 from elsewhere) into our PKCS#12 form;
* :func:`load_key` opens a PKCS#12 file;
* :func:`trust_cert` adds a firm or colleague certificate to the local trust list, a folder
  of PEM files named by their SHA-256 fingerprint: ``$SPLICECALC_TRUST_DIR`` or
  ``~/.config/splicecalc/trust``.

The passphrase comes from ``$SPLICECALC_PASSPHRASE`` or, on a terminal, a prompt
(:func:`passphrase`).
"""

from __future__ import annotations

import datetime as _dt
import hashlib
import os
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from ..core.errors import InputError
from ..core.files import write_atomic

PASSPHRASE_ENV = "SPLICECALC_PASSPHRASE"
TRUST_DIR_ENV = "SPLICECALC_TRUST_DIR"
#: new keys are ECDSA on NIST P-256 (128-bit security, NIST SP 800-57 part 1; as strong as RSA-3072,
#: and quick to load and use, which keeps signing a package under a second)
#: validity of a self-signed certificate, days
VALID_DAYS = 5 * 365


@dataclass(frozen=True)
class KeyPair:
    """A private key with its certificate (and the issuing chain, if any)."""

    key: Any
    cert: Any
    chain: tuple[Any, ...] = ()
    path: Path | None = None

    @property
    def name(self) -> str:
        return cert_name(self.cert)

    @property
    def fingerprint(self) -> str:
        return cert_fingerprint(self.cert)


# ----------------------------------------------------------------- certificates
def cert_name(cert: Any) -> str:
    """The certificate subject's common name (the signer's name)."""
    from cryptography.x509.oid import NameOID

    cn = cert.subject.get_attributes_for_oid(NameOID.COMMON_NAME)
    return str(cn[0].value) if cn else cert.subject.rfc4514_string()


def cert_fingerprint(cert: Any) -> str:
    """SHA-256 of the certificate's DER bytes, hex."""
    from cryptography.hazmat.primitives.serialization import Encoding

    return hashlib.sha256(cert.public_bytes(Encoding.DER)).hexdigest()


def cert_pem(cert: Any) -> str:
    from cryptography.hazmat.primitives.serialization import Encoding

    return cert.public_bytes(Encoding.PEM).decode("ascii")


def load_cert(data: bytes | str, what: str = "certificate") -> Any:
    """A certificate from PEM or DER bytes; InputError if it is not one."""
    from cryptography import x509

    raw = data.encode("ascii", "replace") if isinstance(data, str) else bytes(data)
    try:
        if b"-----BEGIN CERTIFICATE-----" in raw:
            return x509.load_pem_x509_certificate(raw)
        return x509.load_der_x509_certificate(raw)
    except (ValueError, TypeError):
        raise InputError(what, "(file contents)", "an X.509 certificate (PEM or DER)") from None


def _check_text(field: str, value: Any, required: bool) -> str:
    if value is None and not required:
        return ""
    if not isinstance(value, str) or (required and not value.strip()):
        raise InputError(field, value, "a non-empty text" if required else "a text")
    v = value.strip()
    if len(v) > 64 or any(ord(c) < 32 for c in v):
        raise InputError(field, value, "at most 64 printable characters")
    return v


# ----------------------------------------------------------------- passphrase
def passphrase(confirm: bool = False, prompt: str = "passphrase for the key: ") -> bytes:
    """The key passphrase: ``$SPLICECALC_PASSPHRASE``, else a prompt on a terminal."""
    env = os.environ.get(PASSPHRASE_ENV)
    if env is not None:
        if not env:
            raise InputError(PASSPHRASE_ENV, "(empty)", "a passphrase of at least 8 characters")
        return env.encode("utf-8")
    import getpass
    import sys

    if not sys.stdin.isatty():
        raise InputError("passphrase", "(none)", f"a passphrase in ${PASSPHRASE_ENV} (no terminal to ask on)")
    p1 = getpass.getpass(prompt)
    if confirm and getpass.getpass("again: ") != p1:
        raise InputError("passphrase", "(typed twice)", "the same passphrase twice")
    if not p1:
        raise InputError("passphrase", "(empty)", "a passphrase of at least 8 characters")
    return p1.encode("utf-8")


# ----------------------------------------------------------------- keys
def _p12_bytes(key: Any, cert: Any, chain: tuple[Any, ...], name: str, password: bytes) -> bytes:
    from cryptography.hazmat.primitives.serialization import BestAvailableEncryption, pkcs12

    return pkcs12.serialize_key_and_certificates(name.encode("utf-8"), key, cert, list(chain) or None,
                                                 BestAvailableEncryption(password))


def _refuse_existing(out: Path) -> None:
    if out.exists():
        raise InputError("--out", str(out), "a new file name (an existing key file is never overwritten)")
    if out.suffix.lower() not in (".p12", ".pfx"):
        raise InputError("--out", str(out), "a file name ending in .p12")


def new_key(name: str, out: str | os.PathLike, password: bytes, *, email: str | None = None,
            organisation: str | None = None, now: _dt.datetime | None = None) -> KeyPair:
    """Make a key and a self-signed certificate for ``name``; write them to ``out`` (PKCS#12)."""
    from cryptography import x509
    from cryptography.hazmat.primitives import hashes
    from cryptography.hazmat.primitives.asymmetric import ec
    from cryptography.x509.oid import ExtendedKeyUsageOID, NameOID

    name = _check_text("--name", name, True)
    email = _check_text("--email", email, False)
    org = _check_text("--organisation", organisation, False)
    if email and ("@" not in email or " " in email):
        raise InputError("--email", email, "an e-mail address such as a.engineer@example.com")
    if not isinstance(password, bytes) or len(password) < 8:
        raise InputError("passphrase", "(given)", "a passphrase of at least 8 characters")
    out_p = Path(out)
    _refuse_existing(out_p)
    key = ec.generate_private_key(ec.SECP256R1())
    attrs = [x509.NameAttribute(NameOID.COMMON_NAME, name)]
    if org:
        attrs.append(x509.NameAttribute(NameOID.ORGANIZATION_NAME, org))
    if email:
        attrs.append(x509.NameAttribute(NameOID.EMAIL_ADDRESS, email))
    subject = x509.Name(attrs)
    t0 = (now or _dt.datetime.now(_dt.timezone.utc)) - _dt.timedelta(minutes=5)
    b = (x509.CertificateBuilder().subject_name(subject).issuer_name(subject).public_key(key.public_key())
         .serial_number(x509.random_serial_number()).not_valid_before(t0)
         .not_valid_after(t0 + _dt.timedelta(days=VALID_DAYS))
         .add_extension(x509.BasicConstraints(ca=False, path_length=None), critical=True)
         .add_extension(x509.KeyUsage(digital_signature=True, content_commitment=True, key_encipherment=False,
                                      data_encipherment=False, key_agreement=False, key_cert_sign=False,
                                      crl_sign=False, encipher_only=False, decipher_only=False), critical=True)
         .add_extension(x509.ExtendedKeyUsage([ExtendedKeyUsageOID.EMAIL_PROTECTION]), critical=False)
         .add_extension(x509.SubjectKeyIdentifier.from_public_key(key.public_key()), critical=False))
    if email:
        b = b.add_extension(x509.SubjectAlternativeName([x509.RFC822Name(email)]), critical=False)
    cert = b.sign(key, hashes.SHA256())
    out_p.parent.mkdir(parents=True, exist_ok=True)
    write_atomic(out_p, _p12_bytes(key, cert, (), name, password))
    os.chmod(out_p, 0o600)
    return KeyPair(key, cert, (), out_p)


def load_key(path: str | os.PathLike, password: bytes) -> KeyPair:
    """Open a PKCS#12 key file; one-line InputError for a missing file, a wrong passphrase or bad data."""
    from cryptography.hazmat.primitives.serialization import pkcs12

    p = Path(path)
    if not p.is_file():
        raise InputError("--key", str(path), "an existing .p12 key file (make one with: splicecalc keys new)")
    try:
        key, cert, extra = pkcs12.load_key_and_certificates(p.read_bytes(), password)
    except ValueError:
        raise InputError("--key", str(path), "a PKCS#12 key file and its passphrase (wrong passphrase, or not "
                         "a .p12 file)") from None
    if key is None or cert is None:
        raise InputError("--key", str(path), "a PKCS#12 file holding both a private key and its certificate")
    return KeyPair(key, cert, tuple(extra or ()), p)


def import_key(out: str | os.PathLike, password: bytes, *, p12: str | os.PathLike | None = None,
               p12_password: bytes | None = None, key_pem: str | os.PathLike | None = None,
               cert_pem_path: str | os.PathLike | None = None,
               chain: tuple[str | os.PathLike, ...] = ()) -> KeyPair:
    """Take a key with a certificate issued by the firm's CA and write it as our PKCS#12 ``out``.

    Either ``p12`` (a PKCS#12 from the CA, opened with ``p12_password`` or ``password``) or
    ``key_pem`` + ``cert_pem_path`` (PEM files; an encrypted key is opened with ``password``);
    ``chain``: the CA certificate(s).
    """
    from cryptography.hazmat.primitives.serialization import load_pem_private_key

    out_p = Path(out)
    _refuse_existing(out_p)
    if p12 is not None:
        kp = load_key(p12, p12_password if p12_password is not None else password)
        key, cert, extra = kp.key, kp.cert, list(kp.chain)
    else:
        if key_pem is None or cert_pem_path is None:
            raise InputError("keys import", "(arguments)", "--p12 FILE, or --key-pem KEY.pem with --cert CERT.pem")
        kp_path, cp = Path(key_pem), Path(cert_pem_path)
        for field, f in (("--key-pem", kp_path), ("--cert", cp)):
            if not f.is_file():
                raise InputError(field, str(f), "an existing PEM file")
        raw = kp_path.read_bytes()
        try:
            key = load_pem_private_key(raw, password=password if b"ENCRYPTED" in raw else None)
        except (ValueError, TypeError):
            raise InputError("--key-pem", str(kp_path), "a PEM private key (and its passphrase if encrypted)") from None
        cert = load_cert(cp.read_bytes(), "--cert")
        extra = []
    for c in chain:
        cpath = Path(c)
        if not cpath.is_file():
            raise InputError("--chain", str(c), "an existing CA certificate file")
        extra.append(load_cert(cpath.read_bytes(), "--chain"))
    from cryptography.hazmat.primitives.serialization import Encoding, PublicFormat

    pub = lambda k: k.public_bytes(Encoding.DER, PublicFormat.SubjectPublicKeyInfo)  # noqa: E731
    if pub(key.public_key()) != pub(cert.public_key()):
        raise InputError("--cert", str(cert_pem_path or p12), "the certificate of this private key")
    if not isinstance(password, bytes) or len(password) < 8:
        raise InputError("passphrase", "(given)", "a passphrase of at least 8 characters")
    out_p.parent.mkdir(parents=True, exist_ok=True)
    write_atomic(out_p, _p12_bytes(key, cert, tuple(extra), cert_name(cert), password))
    os.chmod(out_p, 0o600)
    return KeyPair(key, cert, tuple(extra), out_p)


# ----------------------------------------------------------------- trust list
def trust_dir() -> Path:
    """The trust-list folder: ``$SPLICECALC_TRUST_DIR`` or ``~/.config/splicecalc/trust``."""
    env = os.environ.get(TRUST_DIR_ENV)
    if env:
        return Path(env)
    base = os.environ.get("XDG_CONFIG_HOME") or str(Path.home() / ".config")
    return Path(base) / "splicecalc" / "trust"


def trust_cert(path: str | os.PathLike) -> tuple[Path, Any]:
    """Add the certificate in ``path`` (PEM/DER; a .p12's own certificate is refused) to the trust list."""
    p = Path(path)
    if not p.is_file():
        raise InputError("CERT", str(path), "an existing certificate file (.pem, .crt or .cer)")
    cert = load_cert(p.read_bytes(), "CERT")
    d = trust_dir()
    d.mkdir(parents=True, exist_ok=True)
    dest = d / f"{cert_fingerprint(cert)}.pem"
    if not dest.exists():
        write_atomic(dest, cert_pem(cert))
    return dest, cert


def trusted_certs() -> list[Any]:
    """Every certificate in the trust list (unreadable files are skipped)."""
    d = trust_dir()
    if not d.is_dir():
        return []
    out = []
    for f in sorted(d.glob("*.pem")):
        try:
            out.append(load_cert(f.read_bytes()))
        except (InputError, OSError):
            continue
    return out


def is_trusted(cert: Any, trusted: list[Any], when: _dt.datetime | None = None) -> bool:
    """True when ``cert`` is in the trust list, or was issued (signed) by a CA certificate in it and is
    within its validity period. (The PDF's signatures are judged by pyHanko's path validation.)"""
    fp = cert_fingerprint(cert)
    if any(cert_fingerprint(t) == fp for t in trusted):
        return True
    now = when or _dt.datetime.now(_dt.timezone.utc)
    try:
        if not (cert.not_valid_before_utc <= now <= cert.not_valid_after_utc):
            return False
    except AttributeError:  # pragma: no cover - cryptography < 42
        return False
    for ca in trusted:
        try:
            from cryptography import x509

            bc = ca.extensions.get_extension_for_class(x509.BasicConstraints).value
            if not bc.ca:
                continue
            cert.verify_directly_issued_by(ca)
            return True
        except Exception:  # noqa: BLE001 - not issued by this one (or not a CA)
            continue
    return False


def export_cert(kp: KeyPair, out: str | os.PathLike) -> Path:
    """Write the key's certificate as PEM (to hand to colleagues for their trust list)."""
    p = Path(out)
    if p.exists():
        raise InputError("--cert-out", str(out), "a new file name")
    write_atomic(p, cert_pem(kp.cert))
    return p


__all__ = ["KeyPair", "PASSPHRASE_ENV", "TRUST_DIR_ENV", "cert_fingerprint", "cert_name", "cert_pem", "export_cert",
           "import_key", "is_trusted", "load_cert", "load_key", "new_key", "passphrase", "trust_cert", "trust_dir", "trusted_certs"]
