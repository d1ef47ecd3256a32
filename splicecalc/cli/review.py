"""``splicecalc review``: the checking conversation from the command line.

    splicecalc review add PACKAGE --on TARGET --by NAME "text"
    splicecalc review reply PACKAGE ID --by NAME "text"
    splicecalc review close PACKAGE ID --by NAME [--note TEXT]
    splicecalc review list PACKAGE [--open] [--json]
    splicecalc review import PACKAGE ANNOTATED.pdf --by NAME

PACKAGE is the job file, the executed notebook or the built PDF; the register is the
``<job>.review.jsonl`` file beside the job. TARGET is a check id, ``sheet N`` or ``package``.
"""

from __future__ import annotations

import argparse
import json
import textwrap


def _fmt(c, flag: str = "") -> str:
    head = f"{c.id:<5} {c.state:<9} {c.target_label}"
    if flag and flag != "unchanged":
        head += f"  [check {'changed since the comment' if flag == 'moved' else 'no longer in the package'}]"
    lines = [head]
    for e in c.thread:
        lead = {"comment": "", "reply": "reply ", "close": "closed "}[e.kind]
        body = textwrap.fill(e.text or "(no note)", width=88, initial_indent="        ", subsequent_indent="        ")
        signed = {"trusted": " (signed, trusted)", "untrusted": " (signed, signer not in the trust list)",
                  "invalid": " (signature INVALID)"}.get(getattr(e, "signed", ""), "")
        lines.append(f"      {lead}{e.by}, {e.date[:10]}{signed}:")
        lines.append(body)
    return "\n".join(lines)


def _cmd_add(args: argparse.Namespace) -> int:
    from ..review import add_comment

    c = add_comment(args.package, on=args.on, by=args.by, text=args.text)
    print(f"{c.id} added on {c.target_label} (revision {c.revision or '-'})")
    return 0


def _cmd_reply(args: argparse.Namespace) -> int:
    from ..review import locate

    c = locate(args.package).register.reply(args.id, by=args.by, text=args.text)
    print(f"{c.id} is now {c.state}")
    return 0


def _cmd_close(args: argparse.Namespace) -> int:
    from ..review import locate

    from ..core.errors import InputError

    key = None
    if args.key:
        from ..signoff.keys import load_key, passphrase

        key = load_key(args.key, passphrase())
    elif not args.by:
        raise InputError("--by", "", "your name (or --key YOUR.p12 to sign the closure)")
    c = locate(args.package).register.close(args.id, by=args.by or "", note=args.note or "", key=key)
    last = c.thread[-1]
    print(f"{c.id} closed by {last.by}" + (f" (signed, {last.signed})" if last.signed else " (name as typed)"))
    return 0


def _cmd_list(args: argparse.Namespace) -> int:
    from ..review import comment_flags, locate

    pkg = locate(args.package)
    comments = pkg.register.comments()
    records = pkg.records()
    flags = comment_flags(comments, records) if records is not None else {}
    shown = [c for c in comments if not args.open or c.state != "closed"]
    if args.json:
        print(json.dumps({"register": str(pkg.register.path), "counts": pkg.register.counts(),
                          "comments": [{**c.to_dict(), "check_flag": flags.get(c.id)} for c in shown]}, indent=2))
        return 0
    counts = pkg.register.counts()
    print(f"{pkg.register.path.name}: {counts['open']} open, {counts['answered']} answered, "
          f"{counts['closed']} closed")
    for c in shown:
        print(_fmt(c, flags.get(c.id, "")))
    return 0


def _cmd_import(args: argparse.Namespace) -> int:
    from ..review import import_markups

    res = import_markups(args.package, args.annotated, by=args.by)
    for c in res.added:
        print(f"{c.id} from sheet {c.source.get('sheet')} ({c.source.get('markup')}) on {c.target_label}")
    print(f"{len(res.added)} mark-up(s) added, {len(res.skipped)} already in the register")
    return 0


def add_parser(sub: argparse._SubParsersAction) -> None:
    r = sub.add_parser("review", help="review comments tied to checks; mark-ups read back from the PDF")
    rs = r.add_subparsers(dest="review_command", required=True)

    s = rs.add_parser("add", help="add a comment on a check, a sheet or the package")
    s.add_argument("package", help="job file, executed notebook or built PDF")
    s.add_argument("--on", required=True, help="check id (e.g. S1.flange_bolt_shear), 'sheet N' or 'package'")
    s.add_argument("--by", required=True, help="your name")
    s.add_argument("text")
    s.set_defaults(func=_cmd_add)

    s = rs.add_parser("reply", help="reply to a comment")
    s.add_argument("package")
    s.add_argument("id", help="comment id, e.g. R3")
    s.add_argument("--by", required=True)
    s.add_argument("text")
    s.set_defaults(func=_cmd_reply)

    s = rs.add_parser("close", help="close a comment (its author or the approver)",
                      description="Close a comment. With --key the closure is signed with your key (the thread then "
                                  "shows it as signed: trusted or not, as for package signatures); with --by only, "
                                  "the name is as typed and proves nothing.")
    s.add_argument("package")
    s.add_argument("id")
    s.add_argument("--by", help="your name (needed without --key; with --key, the key's name)")
    s.add_argument("--key", metavar="FILE.p12", help="sign the closure with your key (passphrase: "
                   "$SPLICECALC_PASSPHRASE or a prompt)")
    s.add_argument("--note", help="closing note")
    s.set_defaults(func=_cmd_close)

    s = rs.add_parser("list", help="list comments and their state")
    s.add_argument("package")
    s.add_argument("--open", action="store_true", help="only comments not yet closed")
    s.add_argument("--json", action="store_true")
    s.set_defaults(func=_cmd_list)

    s = rs.add_parser("import", help="read a marked-up PDF's annotations into the register")
    s.add_argument("package")
    s.add_argument("annotated", help="the PDF the checker annotated")
    s.add_argument("--by", required=True, help="the checker's name")
    s.set_defaults(func=_cmd_import)
