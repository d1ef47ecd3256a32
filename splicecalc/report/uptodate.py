"""Is the executed notebook up to date? A make-style check, so that a rebuild runs no cell it need not.

A build stores in the executed notebook's metadata (``metadata.splicecalc.cells_inputs``) a digest
over everything that determines the cells' outputs (:func:`cells_inputs`):

* the notebook's cells (type, source, tags: the code and the text they sit in);
* the bytes of the job file the parameters cell names and of its review register
  (``<job>.review.jsonl``, printed by the "Review comments" cell), or their absence;
* every file of the installed splicecalc package (code, section tables, LaTeX template), so an
  edited formula in a development checkout counts, not only a new version number;
* the Python version and the versions of the libraries that shape an output (handcalcs,
  forallpeople, innerscope, pyparsing, numpy, scipy, matplotlib, IPython, ipykernel), and any
  ``matplotlibrc`` matplotlib would read;
* the headless flag the kernel runs with (a headless build never shows the job form).

What the cells cannot see is left out on purpose: the notebook's metadata (title block, revision,
status, revisions list, signatures) reaches only the LaTeX template, at export, which runs on
every build. The kernel never reads the notebook it runs; the project fields it prints come from
the job file, which is in the digest.

Only a notebook whose code is a shipped template's (the parameters cell aside, which must hold
plain literal assignments) has a digest: any other code may read files we cannot name, so it is
always executed. :func:`reusable_outputs` decides whether the previous executed notebook may be
reused; see its docstring for the document-control rules.
"""

from __future__ import annotations

import ast
import hashlib
import json
import os
import sys
from functools import lru_cache
from pathlib import Path
from typing import Any

#: key under ``metadata.splicecalc`` holding the digest of the inputs the outputs were computed from
INPUTS_KEY = "cells_inputs"
#: bump when what goes into the digest changes
DIGEST_SCHEME = 1
#: the distributions whose behaviour shapes a cell output
OUTPUT_LIBRARIES = ("handcalcs", "forallpeople", "innerscope", "pyparsing", "numpy", "scipy", "matplotlib",
                    "ipython", "ipykernel")


def _join(src: Any) -> str:
    return "".join(src) if isinstance(src, list) else str(src)


@lru_cache(maxsize=1)
def package_digest() -> str:
    """SHA-256 over every file of the installed splicecalc package (path, length, bytes), byte-code aside."""
    root = Path(__file__).resolve().parents[1]
    h = hashlib.sha256()
    for p in sorted(root.rglob("*")):
        if p.is_file() and "__pycache__" not in p.parts and p.suffix not in (".pyc", ".pyo"):
            b = p.read_bytes()
            h.update(p.relative_to(root).as_posix().encode() + b"\0" + len(b).to_bytes(8, "big") + b)
    return h.hexdigest()


@lru_cache(maxsize=1)
def library_versions() -> dict[str, str]:
    """Python and :data:`OUTPUT_LIBRARIES` versions (``"absent"`` for one not installed)."""
    from importlib.metadata import PackageNotFoundError, version

    out = {"python": sys.version.split()[0], "implementation": sys.implementation.name}
    for name in OUTPUT_LIBRARIES:
        try:
            out[name] = version(name)
        except PackageNotFoundError:
            out[name] = "absent"
    return out


def _matplotlibrc_files(cwd: Path) -> list[Path]:
    """Where matplotlib looks for a user ``matplotlibrc`` (its documented order)."""
    cands = [cwd / "matplotlibrc"]
    if os.environ.get("MATPLOTLIBRC"):
        p = Path(os.environ["MATPLOTLIBRC"])
        cands.append(p / "matplotlibrc" if p.is_dir() else p)
    if os.environ.get("MPLCONFIGDIR"):
        cands.append(Path(os.environ["MPLCONFIGDIR"]) / "matplotlibrc")
    cfg = Path(os.environ.get("XDG_CONFIG_HOME") or Path.home() / ".config")
    cands += [cfg / "matplotlib" / "matplotlibrc", Path.home() / ".matplotlib" / "matplotlibrc"]
    return cands


def _file_sha(p: Path) -> str | None:
    try:
        return hashlib.sha256(p.read_bytes()).hexdigest()
    except OSError:
        return None


def _literal_parameters(src: str) -> bool:
    """True when the parameters cell only assigns literals to names (nothing it runs can read a file)."""
    try:
        tree = ast.parse(src)
    except SyntaxError:
        return False
    for node in tree.body:
        if not (isinstance(node, ast.Assign) and all(isinstance(t, ast.Name) for t in node.targets)):
            return False
        try:
            ast.literal_eval(node.value)
        except (ValueError, TypeError, SyntaxError, RecursionError):
            return False
    return True


def _tags(cell: dict) -> list[str]:
    return list((cell.get("metadata") or {}).get("tags") or [])


def template_code_problem(nb: dict) -> str | None:
    """Why the notebook's code is not a shipped template's (None when it is)."""
    from ..core.shipped import shipped_dir

    name = str(((nb.get("metadata") or {}).get("splicecalc") or {}).get("template") or "")
    path = shipped_dir("templates") / f"{name}.ipynb"
    if not name or Path(name).name != name or not path.is_file():
        return "the notebook names no shipped template"
    tpl = json.loads(path.read_text(encoding="utf-8"))
    mine = [c for c in nb.get("cells", []) if c.get("cell_type") == "code"]
    theirs = [c for c in tpl.get("cells", []) if c.get("cell_type") == "code"]
    if len(mine) != len(theirs):
        return f"its code cells are not those of the {name} template"
    for a, b in zip(mine, theirs):
        if _tags(a) != _tags(b):
            return f"its code cells are not those of the {name} template"
        if "parameters" in _tags(a):
            if not _literal_parameters(_join(a.get("source", ""))):
                return "its parameters cell does more than assign values"
        elif _join(a.get("source", "")) != _join(b.get("source", "")):
            return f"its code cells are not those of the {name} template"
    return None


def cells_inputs(nb: dict, folder: str | os.PathLike) -> tuple[str | None, str]:
    """(digest, "") of everything the cells' outputs depend on when ``nb`` runs in ``folder``,
    or (None, why) when that cannot be known (the notebook is then always executed)."""
    from ..signoff.notebook import job_file_name

    why = template_code_problem(nb)
    if why:
        return None, why
    folder = Path(folder)
    parts: dict[str, Any] = {"scheme": DIGEST_SCHEME,
                             "cells": [[c.get("cell_type"), _join(c.get("source", "")), _tags(c)]
                                       for c in nb.get("cells", [])]}
    name = job_file_name(nb)
    if name:
        jp = folder / name
        job = _file_sha(jp)
        if job is None:
            return None, f"the job file {name} cannot be read"
        from ..review.register import Register

        parts["job"] = job
        parts["review_register"] = _file_sha(Register.for_job(jp).path)
    from .headless import HEADLESS_ENV

    parts["headless"] = bool(os.environ.get(HEADLESS_ENV))
    parts["package"] = package_digest()
    parts["versions"] = library_versions()
    parts["matplotlibrc"] = [_file_sha(p) for p in _matplotlibrc_files(folder)]
    blob = json.dumps(parts, sort_keys=True, separators=(",", ":"), ensure_ascii=True).encode("utf-8")
    return hashlib.sha256(blob).hexdigest(), ""


def stored_inputs(nb: dict) -> str | None:
    """The digest stored by the build that executed ``nb`` (None when none is stored)."""
    v = ((nb.get("metadata") or {}).get("splicecalc") or {}).get(INPUTS_KEY)
    return v if isinstance(v, str) else None


def reusable_outputs(old: dict, pdf: Path, digest: str | None) -> tuple[dict | None, str]:
    """``old`` (the previous build's executed notebook, as JSON) when its outputs may stand for this
    build's: (old, "") or (None, why not).

    All of these must hold: the build has a digest; ``old`` holds the same digest; it carries no
    sign-off (a signed notebook is a record: its package is never rebuilt, see
    :func:`splicecalc.signoff.ledger.protection_reason`) and no error output; and it is, unedited,
    the notebook the last build of ``pdf`` wrote (its digest equals the ``notebook_sha256`` of that
    build's record ``<pdf>.json``, which is not marked issued), so outputs changed by hand or by a
    run in Jupyter are never printed as if this build had computed them. The record is a cache
    check here, not a trust anchor: signatures are verified from the PDF and the notebook alone.
    """
    if digest is None:
        return None, "no digest"
    if not isinstance(old, dict) or stored_inputs(old) != digest:
        return None, "inputs changed"
    from ..signoff.ledger import sidecar_path
    from ..signoff.notebook import notebook_digest, sign_off_entries

    if sign_off_entries(old):
        return None, "the executed notebook is signed"
    try:
        record = json.loads(sidecar_path(pdf).read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None, "no readable build record"
    if not isinstance(record, dict) or record.get("issued") is True:
        return None, "the build record is issued or unreadable"
    try:
        same = record.get("notebook_sha256") == notebook_digest(old)
    except (ValueError, TypeError, AttributeError):
        same = False
    if not same:
        return None, "the executed notebook differs from the one the last build wrote"
    for cell in old.get("cells", []):
        if any(o.get("output_type") == "error" for o in cell.get("outputs", []) or []):
            return None, "the executed notebook holds an error"
    return old, ""


def with_outputs(nb: Any, old: dict) -> Any:
    """``nb`` (the notebook this build would run) with the outputs of ``old``, cell by cell.

    The digests are equal, so the cells are the same in number, type and source; checked again here.
    """
    import nbformat

    prev_nb = nbformat.reads(json.dumps(old), as_version=4)     # nbformat's reading: split lines joined
    if len(prev_nb.cells) != len(nb.cells):
        raise ValueError("the cells differ")
    for new, prev in zip(nb.cells, prev_nb.cells):
        if new.cell_type != prev.cell_type or new.source != prev.source:
            raise ValueError("the cells differ")
        if new.cell_type == "code":
            new.outputs = prev.outputs
            new.execution_count = prev.execution_count
    for key in ("language_info", "kernelspec"):
        if key in prev_nb.metadata:
            nb.metadata[key] = prev_nb.metadata[key]
    return nb


__all__ = ["DIGEST_SCHEME", "INPUTS_KEY", "OUTPUT_LIBRARIES", "cells_inputs", "library_versions", "package_digest",
           "reusable_outputs", "stored_inputs", "template_code_problem", "with_outputs"]
