"""``splicecalc compare OLD NEW``: what changed between two revisions of a calc package.

OLD and NEW are executed calc notebooks (``NAME.ipynb``, ``NAME_P2.ipynb``) or package PDFs with
their notebook beside them (``NAME.pdf`` -> ``NAME.ipynb``). Prints changed inputs, checks whose
utilisation moved, checks added or removed and the governing check of each part before and
after (``--json`` for the same as data; ``--pdf OUT.pdf`` also writes it as a short PDF on the
package's sheets). Exit 0 no change, 1 changes found, 2 bad input.
"""

from __future__ import annotations

import argparse
import json
from pathlib import Path
from typing import Any

from ..core.errors import InputError


def notebook_path(arg: str, which: str) -> Path:
    """The notebook of OLD / NEW: the path itself (.ipynb) or the .ipynb beside a package PDF."""
    p = Path(arg)
    suffix = p.suffix.lower()
    if suffix == ".pdf":
        from ..signoff.notebook import sibling
        nb = sibling(p, ".ipynb") or p.with_suffix(".ipynb")     # <stem>.executed.ipynb when the build kept one
        if not nb.is_file():
            raise InputError(which, arg, f"a package PDF with its executed notebook beside it ({nb.name} is "
                             "missing: give the notebook, or copy it next to the PDF)")
        return nb
    if suffix != ".ipynb":
        raise InputError(which, arg, "an executed calc notebook (NAME.ipynb) or a package PDF (NAME.pdf) "
                         "with its notebook beside it")
    if not p.is_file():
        raise InputError(which, arg, "an existing file: check the path (e.g. out/beam_splice.ipynb)")
    return p


def read_notebook(path: Path, which: str) -> Any:
    """The notebook as a dict; :class:`InputError` when it is not readable JSON."""
    try:
        return json.loads(path.read_text(encoding="utf-8"))
    except (UnicodeDecodeError, json.JSONDecodeError, RecursionError):
        raise InputError(which, str(path), "a Jupyter notebook (JSON, UTF-8) as `splicecalc build` writes "
                         "it") from None


def _cmd_compare(args: argparse.Namespace) -> int:
    from ..review.compare import MOVE_THRESHOLD, compare_revisions, comparison_text

    threshold = MOVE_THRESHOLD if args.threshold is None else args.threshold
    if not (0.0 <= threshold < 1.0):
        raise InputError("--threshold", threshold, f"a utilisation change from 0 to below 1, e.g. {MOVE_THRESHOLD:g}")
    out = None
    if args.pdf is not None:
        from ..signoff.ledger import protection_reason

        out = Path(args.pdf)
        if out.suffix.lower() != ".pdf":
            raise InputError("--pdf", args.pdf, "a file name ending in .pdf, e.g. changes_P1_P2.pdf")
        why = protection_reason(out)
        if why:
            raise InputError("--pdf", args.pdf, f"a new file name ({out.name} is {why}; it is never overwritten)")
    paths = [notebook_path(args.old, "OLD"), notebook_path(args.new, "NEW")]
    if out is not None and out.resolve() in {p.resolve().with_suffix(".pdf") for p in paths}:
        raise InputError("--pdf", args.pdf, "a file other than the packages compared (e.g. changes_P1_P2.pdf)")
    old_nb, new_nb = (read_notebook(p, w) for p, w in zip(paths, ("OLD", "NEW")))
    c = compare_revisions(old_nb, new_nb, old_name=paths[0].name, new_name=paths[1].name,
                          threshold=threshold)
    print(json.dumps(c, indent=2) if args.json else comparison_text(c))
    if out is not None:
        from ..review.compare import write_comparison_pdf

        write_comparison_pdf(c, new_nb, out)
        if not args.json:
            print(f"comparison sheets: {out}")
    return 1 if c["changed"] else 0


def add_parser(sub: Any) -> None:
    s = sub.add_parser("compare", help="what changed between two revisions (notebooks or package PDFs)",
                       description=__doc__.split("\n\n")[1].replace("\n", " ").replace("``", ""))
    s.add_argument("old", metavar="OLD", help="the earlier revision: NAME.ipynb, or NAME.pdf with NAME.ipynb beside it")
    s.add_argument("new", metavar="NEW", help="the later revision (the same forms)")
    s.add_argument("--threshold", type=float, default=None,
                   help="utilisation change worth showing (default 0.005, review.compare.MOVE_THRESHOLD)")
    s.add_argument("--json", action="store_true", help="print the comparison as JSON (unit-tagged keys)")
    s.add_argument("--pdf", metavar="OUT.pdf", help="also write the comparison as a short PDF on the package's sheets "
                   "(an appendix for the checker; an issued or signed file is never overwritten)")
    s.set_defaults(func=_cmd_compare)
