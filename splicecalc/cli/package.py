"""``splicecalc new | build | demo``: create, build and demonstrate calc packages.

    splicecalc new TEMPLATE FOLDER --project P --number N --title T [--job JOB.toml]
    splicecalc build NOTEBOOK_OR_JOB [-o PDF] [--quiet]
    splicecalc demo [--out DIR]
    splicecalc sign PACKAGE.pdf --role prepared|checked|approved --key FILE.p12 [--reason ...]
    splicecalc verify PACKAGE.pdf|NOTEBOOK.ipynb [--json]
    splicecalc revise PACKAGE --revision P2 --description "..."
    splicecalc issue PACKAGE.pdf --purpose "..." --key FILE.p12 [--override "reason"]
    splicecalc keys new|import|trust|cert ...

``build`` executes the notebook headless (a job file is built with the default
template), shows progress for the cells and the LaTeX passes, writes the
executed notebook next to the PDF (that notebook is what ``splicecalc sign``
signs and ``splicecalc verify`` checks), the PDF and its ``.pdf.json`` record.
An issued or signed PDF is never overwritten.

Exit codes of build: 0 built and every check OK; 1 built with failing checks
(they are listed), or a build failure (a failing cell, a LaTeX error, a missing
tool: the message gives the install command; another build holding the folder);
2 user error (bad input, a protected PDF, an existing package).
verify: 0 valid, 1 changed or invalid, 3 unsigned (2: no such file).
"""

from __future__ import annotations

import argparse
import sys
from typing import Any

from ..core.errors import InputError


def _fail(msg: str, code: int) -> int:
    print(f"splicecalc: {'error' if code == 2 else 'build failed'}: {' '.join(str(msg).split())}", file=sys.stderr)
    return code


def _run(fn: Any) -> int:
    """Call ``fn`` mapping errors to exit codes: InputError / protected PDF 2, other build errors 1."""
    from ..report.errors import CalcBuildError, ProtectedPDFError
    from ..workflow.errors import CalcError
    from ..signoff.locks import FolderBusyError
    from ..workflow.package import SignedPDFError

    try:
        return fn()
    except FolderBusyError as err:
        return _fail(str(err), 1)
    except InputError as err:
        return _fail(str(err), 2)
    except (SignedPDFError, ProtectedPDFError) as err:
        return _fail(str(err), 2)
    except (CalcBuildError, CalcError) as err:
        return _fail(str(err), 1)


def _print_build(b: Any, quiet: bool) -> None:
    r = b.report
    print(f"PDF: {b.pdf} ({r.pages} sheets)")
    print(f"executed notebook: {b.notebook}  (sign the package with: splicecalc sign {b.pdf} --role prepared "
          "--key YOUR.p12)")
    print(f"status: {b.status}; build record: {b.sidecar}")
    if r.cells_reused:
        print(r.reuse_line())
    if b.changes_line():
        print(b.changes_line())
    if not quiet:
        print(f"time: execution {r.execution_s:.1f} s (kernel start {r.kernel_start_s:.1f} s, cells {r.cells_s:.1f} s), "
              f"LaTeX {r.latex_passes} passes {r.latex_s:.1f} s, our overhead (all but kernel start and LaTeX) "
              f"{r.overhead_s:.1f} s, total {r.total_s:.1f} s")
        if r.wide_boxes:
            print(f"warning: {len(r.wide_boxes)} line(s) too wide for the sheet, see {r.log_path}", file=sys.stderr)
    if r.missing_chars:
        shown = ", ".join(r.missing_chars[:8]) + (" ..." if len(r.missing_chars) > 8 else "")
        print(f"warning: {len(r.missing_chars)} character(s) are not in the sheet's fonts and are left out of the "
              f"PDF: {shown}; write them differently in the job file (see {r.log_path})", file=sys.stderr)


def _failing_checks(notebook: Any) -> int:
    """Print the failing and NOT CHECKED checks of the executed notebook. The exit code is `run`'s:
    1 when a check fails, else 3 when some are NOT CHECKED, else 0 (the package is built in every case)."""
    from ..core.errors import EXIT_NOT_CHECKED
    from ..signoff.notebook import failing_checks, not_checked, read_notebook

    nb = read_notebook(notebook)
    gaps = not_checked(nb)
    if gaps:
        print(f"splicecalc: {len(gaps)} NOT CHECKED (the package says what is needed):", file=sys.stderr)
        for g in gaps:
            print(f"  NOT CHECKED  {g}", file=sys.stderr)
    failing = failing_checks(nb)
    if not failing:
        return EXIT_NOT_CHECKED if gaps else 0
    print(f"splicecalc: {len(failing)} check(s) FAIL - the package is built but must not be relied on:",
          file=sys.stderr)
    for f in failing:
        print(f"  NOT OK  {f}", file=sys.stderr)
    return 1


# ----------------------------------------------------------------- commands
def cmd_new(args: argparse.Namespace) -> int:
    from ..workflow.package import new_package

    def go() -> int:
        p = new_package(args.template, args.folder, project=args.project or "", number=args.number or "",
                        title=args.title or "", job=args.job)
        print(f"calc notebook: {p.notebook}")
        if p.job_file is not None:
            print(f"job file: {p.job_file}" + ("" if args.job else " (a starter: replace its values)"))
        print(f"build it with: splicecalc build {p.notebook}")
        return 0
    return _run(go)


def cmd_build(args: argparse.Namespace) -> int:
    from ..workflow.package import build_package

    def go() -> int:
        b = build_package(args.source, args.output, progress=not args.quiet, timeout=args.timeout,
                          fresh=args.fresh)
        _print_build(b, args.quiet)
        return _failing_checks(b.notebook)
    return _run(go)


def cmd_demo(args: argparse.Namespace) -> int:
    from ..workflow.package import build_demo

    def go() -> int:
        b = build_demo(args.out, progress=not args.quiet, fresh=args.fresh)
        _print_build(b, args.quiet)
        return _failing_checks(b.notebook)
    return _run(go)


def add_parsers(sub: Any) -> None:
    """Register ``new``, ``build`` and ``demo`` on the ``splicecalc`` sub-parsers."""
    from ..workflow.package import DEFAULT_TEMPLATE, TEMPLATES

    p = sub.add_parser("new", help="start a calc package: copy a template into a project folder",
                       description="Copy a calc template into FOLDER with the project fields in the notebook's "
                                   "title block; the beam_splice template also gets FOLDER/job.toml (copied from "
                                   "--job, or a starter to edit).")
    p.add_argument("template", metavar="TEMPLATE", choices=TEMPLATES, help=" | ".join(TEMPLATES))
    p.add_argument("folder", metavar="FOLDER", help="project folder (created if missing)")
    p.add_argument("--project", default="", help="project name for the title block")
    p.add_argument("--number", default="", help="job number")
    p.add_argument("--title", default="", help="calculation title")
    p.add_argument("--job", metavar="JOB.toml", help=f"job file to copy ({DEFAULT_TEMPLATE} only)")
    p.set_defaults(func=cmd_new)

    p = sub.add_parser("build", help="execute a calc notebook (or a job file) and print its PDF package",
                       description="Execute headless and write PDF, executed notebook (for sign/verify) and "
                                   "the PDF's build record. A .toml job file is built with the "
                                   f"{DEFAULT_TEMPLATE} template. An issued or signed PDF is never overwritten. "
                                   "Exit codes as `splicecalc run`: 0 every check within capacity; 1 a check "
                                   "exceeds it (listed); 2 bad input; 3 nothing exceeds capacity but some checks "
                                   "are NOT CHECKED (listed). The package is written in cases 0, 1 and 3.")
    p.add_argument("source", metavar="NOTEBOOK_OR_JOB", help=".ipynb calc notebook or .toml job file")
    p.add_argument("-o", "--output", metavar="PDF", help="PDF to write (default: the source name with .pdf)")
    p.add_argument("--quiet", action="store_true", help="no progress bars or timings")
    p.add_argument("--timeout", type=float, default=600.0, help="time limit per cell, s (default 600)")
    p.add_argument("--fresh", action="store_true",
                   help="execute every cell and run XeLaTeX from nothing, even when the previous build's "
                        "outputs are up to date (by default an unchanged job, template and splicecalc reuse "
                        "them: 'cells up to date, not executed')")
    p.set_defaults(func=cmd_build)

    p = sub.add_parser("demo", help="build the demo calc package (an invented job) end to end",
                       description="Copy the demo job (examples/demo_*.toml) into DIR and build its package there. "
                                   "Exit codes as `build` (the demo has NOT CHECKED items: 3).")
    p.add_argument("--out", default="out", metavar="DIR", help="output folder (default: out)")
    p.add_argument("--quiet", action="store_true", help="no progress bars or timings")
    p.add_argument("--fresh", action="store_true", help="execute every cell even if the last demo build is up to date")
    p.set_defaults(func=cmd_demo)


# ----------------------------------------------------------------- sign-off
def _signoff(fn: Any) -> int:
    """Run a sign-off command: bad input exit 2, malformed files exit 1, always one line, never a traceback."""
    import warnings

    # pyHanko imports cryptography's DSA module, deprecated there; not something a user can act on
    warnings.filterwarnings("ignore", message="DSA is deprecated")
    from ..signoff.locks import FolderBusyError
    from ..signoff.notebook import MalformedNotebook
    from ..signoff.pdfsign import MalformedPDF

    try:
        return fn()
    except InputError as err:
        return _fail(str(err), 2)
    except (MalformedPDF, MalformedNotebook) as err:
        print(f"splicecalc: invalid: {err}", file=sys.stderr)
        return 1
    except FolderBusyError as err:
        return _fail(str(err), 1)
    except KeyboardInterrupt:
        return 130
    except OSError as err:
        from ..core.errors import file_error_message

        return _fail(file_error_message(err, "read or write"), 2)
    except Exception as err:  # noqa: BLE001 - the promise is one line, never a traceback
        print(f"splicecalc: error: unexpected {err.__class__.__name__}: {str(err)[:200]}", file=sys.stderr)
        return 1


def _key(path: str) -> Any:
    from ..signoff.keys import load_key, passphrase

    return load_key(path, passphrase())


def cmd_sign(args: argparse.Namespace) -> int:
    from ..signoff.package import sign_package

    def go() -> int:
        r = sign_package(args.package, args.role, _key(args.key), reason=args.reason,
                         same_person_ok=args.same_person_ok, accept_failing=args.accept_failing,
                         open_comments_ok=args.open_comments_ok, accept_not_checked=args.accept_not_checked)
        print(f"signed {r.pdf.name} and {r.notebook.name} as {r.role} by {r.signer}")
        if r.failing:
            print(f"{len(r.failing)} failing check(s)"
                  + (f" accepted: {args.accept_failing}" if args.accept_failing and r.role != "prepared" else "")
                  + ": " + ", ".join(r.failing))
        if r.not_checked:
            print(f"{len(r.not_checked)} NOT CHECKED item(s)"
                  + (f" acknowledged: {args.accept_not_checked}" if args.accept_not_checked and r.role != "prepared"
                     else "") + ": " + ", ".join(r.not_checked))
        print("\n".join(r.status.lines))
        return 0
    return _signoff(go)


def cmd_verify(args: argparse.Namespace) -> int:
    from ..signoff.package import verify_package

    def go() -> int:
        st = verify_package(args.path, thorough=args.thorough)
        if args.json:
            import json

            print(json.dumps(st.to_dict(), indent=2))
        else:
            print("\n".join(st.lines))
        return st.exit_code
    return _signoff(go)


def cmd_revise(args: argparse.Namespace) -> int:
    from ..signoff.revise import revise

    def go() -> int:
        r = revise(args.package, args.revision, args.description, date=args.date, by=args.by)
        print(f"revision {r.revision} started: {r.notebook}" + (f" (job file {r.job})" if r.job else ""))
        print("history: " + "; ".join(f"{h.get('rev')} {h.get('date')} {h.get('description')}"
                                      f" (prepared {h.get('by') or '-'}, checked {h.get('checked') or '-'})"
                                      for h in r.history))
        print(f"build it with: splicecalc build {r.notebook}")
        return 0
    return _signoff(go)


def cmd_issue(args: argparse.Namespace) -> int:
    from ..signoff.package import issue_package

    def go() -> int:
        row = issue_package(args.package, args.purpose, _key(args.key), override=args.override)
        print(f"issued {row['file']} revision {row['revision']} on {row['date']} by {row['issuer']} "
              f"for {row['purpose']!r}" + (f"; override: {row['override']}" if row.get("override") else ""))
        print("recorded in the PDF (issue signature) and in issue_register.json")
        return 0
    return _signoff(go)


def cmd_keys(args: argparse.Namespace) -> int:
    from ..signoff import keys

    def go() -> int:
        if args.keys_command == "new":
            kp = keys.new_key(args.name, args.out, keys.passphrase(confirm=True), email=args.email,
                              organisation=args.organisation)
            print(f"key and self-signed certificate for {kp.name} written to {kp.path} "
                  f"(SHA-256 fingerprint {kp.fingerprint[:16]}...)")
            if args.cert_out:
                print(f"certificate for colleagues' trust lists: {keys.export_cert(kp, args.cert_out)}")
        elif args.keys_command == "import":
            pw = keys.passphrase(confirm=False, prompt="passphrase for the new .p12: ")
            kp = keys.import_key(args.out, pw, p12=args.p12, key_pem=args.key_pem, cert_pem_path=args.cert,
                                 chain=tuple(args.chain or ()))
            print(f"key of {kp.name} (issued by {kp.cert.issuer.rfc4514_string()}) written to {kp.path}")
        elif args.keys_command == "trust":
            dest, cert = keys.trust_cert(args.cert)
            print(f"trusted: {keys.cert_name(cert)} ({keys.cert_fingerprint(cert)[:16]}...) -> {dest}")
        elif args.keys_command == "cert":
            kp = _key(args.key)
            print(f"certificate of {kp.name}: {keys.export_cert(kp, args.out)}")
        return 0
    return _signoff(go)


def add_signoff_parsers(sub: Any) -> None:
    """Register ``sign``, ``verify``, ``revise``, ``issue`` and ``keys``."""
    p = sub.add_parser("sign", help="sign a built package (PDF + notebook) as prepared / checked / approved",
                       description="Add a PAdES signature to PACKAGE.pdf (an incremental update, in the role's field "
                                   "of the cover's sign-off block) and a detached signature to the executed notebook "
                                   "beside it, with one key. Passphrase: $SPLICECALC_PASSPHRASE or a prompt.")
    p.add_argument("package", metavar="PACKAGE.pdf")
    p.add_argument("--role", required=True, choices=["prepared", "checked", "approved"])
    p.add_argument("--key", required=True, metavar="FILE.p12", help="your key (splicecalc keys new)")
    p.add_argument("--reason", help="a remark shown with the signature")
    p.add_argument("--same-person-ok", metavar="REASON", help="you signed an earlier role too: say why that is "
                   "acceptable (printed in the signature on the cover)")
    p.add_argument("--accept-failing", metavar="REASON", help="check or approve a package with failing checks, "
                   "saying why (printed on the cover and in the summary's acceptance box)")
    p.add_argument("--accept-not-checked", metavar="REASON", help="check or approve a package with NOT CHECKED "
                   "items (checks it does not make), saying how they are covered (printed on the cover and in "
                   "the summary's acceptance box)")
    p.add_argument("--open-comments-ok", metavar="REASON", help="check or approve while review comments are not "
                   "closed (splicecalc review), saying why (printed on the cover)")
    p.set_defaults(func=cmd_sign)

    p = sub.add_parser("verify", help="verify a package's signatures (exit 0 valid, 1 changed, 3 unsigned)",
                       description="Validate every PDF signature with pyHanko (integrity of each signed revision, "
                                   "coverage, signer against the trust list) and the notebook's signatures; the "
                                   ".pdf.json build record is never trusted.")
    p.add_argument("path", metavar="PACKAGE.pdf|NOTEBOOK.ipynb")
    p.add_argument("--json", action="store_true")
    p.add_argument("--thorough", action="store_true", help="also run pyHanko's full analysis of what each update "
                   "after the first signature changed (a few seconds)")
    p.set_defaults(func=cmd_verify)

    p = sub.add_parser("revise", help="start the next revision as new files (a signed notebook is never edited)")
    p.add_argument("package", metavar="PACKAGE", help="the package's .ipynb or .pdf")
    p.add_argument("--revision", required=True, help="the new revision code, e.g. P2, C1, B")
    p.add_argument("--description", required=True, help="what changes in this revision")
    p.add_argument("--date", help="ISO date (default today)")
    p.add_argument("--by", help="who prepares the new revision (default: as before)")
    p.set_defaults(func=cmd_revise)

    p = sub.add_parser("issue", help="issue a checked package: an issue signature on the cover + issue register")
    p.add_argument("package", metavar="PACKAGE.pdf")
    p.add_argument("--purpose", required=True, help='e.g. "for construction"')
    p.add_argument("--key", required=True, metavar="FILE.p12", help="the issuer's key")
    p.add_argument("--override", metavar="REASON", help="issue despite failing checks, saying why (printed)")
    p.set_defaults(func=cmd_issue)

    p = sub.add_parser("keys", help="signing keys and the local trust list")
    ks = p.add_subparsers(dest="keys_command", required=True)
    k = ks.add_parser("new", help="a key and self-signed certificate in a passphrase-protected .p12")
    k.add_argument("--name", required=True, help='your name as it is to appear, e.g. "A. Engineer"')
    k.add_argument("--email")
    k.add_argument("--organisation")
    k.add_argument("--out", required=True, metavar="FILE.p12")
    k.add_argument("--cert-out", metavar="CERT.pem", help="also write the certificate (for colleagues to trust)")
    k = ks.add_parser("import", help="a key with a certificate issued by the firm's certificate authority")
    k.add_argument("--out", required=True, metavar="FILE.p12")
    k.add_argument("--p12", metavar="FROM.p12", help="a PKCS#12 file from the CA (same passphrase)")
    k.add_argument("--key-pem", metavar="KEY.pem")
    k.add_argument("--cert", metavar="CERT.pem")
    k.add_argument("--chain", action="append", metavar="CA.pem", help="CA certificate (repeat for each)")
    k = ks.add_parser("trust", help="add a firm or colleague certificate to the local trust list")
    k.add_argument("cert", metavar="CERT.pem")
    k = ks.add_parser("cert", help="write the certificate of a .p12 key as PEM")
    k.add_argument("key", metavar="FILE.p12")
    k.add_argument("--out", required=True, metavar="CERT.pem")
    p.set_defaults(func=cmd_keys)


__all__ = ["add_parsers", "add_signoff_parsers", "cmd_build", "cmd_demo", "cmd_issue", "cmd_keys", "cmd_new",
           "cmd_revise", "cmd_sign", "cmd_verify"]
