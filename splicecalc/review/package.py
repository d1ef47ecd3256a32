"""Which files make up a package, as the review commands see it: job file, executed notebook, PDF.

``PACKAGE`` on the command line may be any of them: a PDF's notebook is the ``.ipynb`` of the
same name beside it; a notebook names its job file in its ``parameters`` cell (``job_file = ...``,
relative to the notebook). The register lives beside the job file.
"""

from __future__ import annotations

import json
import os
import re
import tomllib
from dataclasses import dataclass
from functools import cached_property
from pathlib import Path
from typing import Any

from ..core.errors import InputError
from .register import Register

_JOB_LINE = re.compile(r"""^\s*job_file\s*=\s*(?:r?)(["'])(.+?)\1\s*(?:#.*)?$""", re.M)


@dataclass(frozen=True)
class ReviewPackage:
    job_file: Path
    notebook: Path | None
    pdf: Path | None

    @property
    def register(self) -> Register:
        return Register.for_job(self.job_file, approver=self.project().get("approved_by", ""))

    def project(self) -> dict[str, str]:
        """The job's ``[project]`` table (text values only); {} if the job cannot be read."""
        try:
            data = tomllib.loads(self.job_file.read_text(encoding="utf-8"))
        except (OSError, UnicodeDecodeError, tomllib.TOMLDecodeError, RecursionError):
            return {}
        proj = data.get("project")
        return {k: v for k, v in proj.items() if isinstance(v, str)} if isinstance(proj, dict) else {}

    @cached_property
    def _notebook_json(self) -> dict[str, Any] | None:
        if self.notebook is None or not self.notebook.exists():
            return None
        return _read_notebook(self.notebook)

    def _nb(self) -> dict[str, Any] | None:
        return self._notebook_json

    def records(self) -> list[dict[str, Any]] | None:
        """The check records printed in the executed notebook, or None if it has not been built."""
        from ..signoff.digest import collect_records

        nb = self._nb()
        return None if nb is None else collect_records(nb)

    def revision(self) -> str:
        nb = self._nb()
        meta = (nb or {}).get("metadata", {}).get("splicecalc", {}) if nb else {}
        rev = meta.get("revision") if isinstance(meta, dict) else None
        return str(rev or self.project().get("revision", "") or "")


def _read_notebook(path: Path) -> dict[str, Any]:
    try:
        nb = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, UnicodeDecodeError, json.JSONDecodeError, RecursionError):
        raise InputError("PACKAGE", str(path), "an executed calc notebook (.ipynb) that can be read") from None
    if not isinstance(nb, dict) or not isinstance(nb.get("cells"), list):
        raise InputError("PACKAGE", str(path), "a Jupyter notebook")
    return nb


def _job_of_notebook(nb_path: Path) -> Path:
    nb = _read_notebook(nb_path)
    for cell in nb["cells"]:
        if not isinstance(cell, dict) or cell.get("cell_type") != "code":
            continue
        src = cell.get("source", "")
        src = "".join(src) if isinstance(src, list) else str(src)
        m = _JOB_LINE.search(src)
        if m:
            return (nb_path.parent / m.group(2)).resolve()
    raise InputError("PACKAGE", str(nb_path), "a calc notebook whose parameters cell names its job file "
                     "(job_file = \"job.toml\")")


def locate(package: str | os.PathLike) -> ReviewPackage:
    """Resolve ``PACKAGE`` (job file, notebook or PDF) to its files; errors name what is missing."""
    p = Path(package)
    suffix = p.suffix.lower()
    if suffix not in (".toml", ".ipynb", ".pdf"):
        raise InputError("PACKAGE", str(package), "a job file (.toml), an executed notebook (.ipynb) or a "
                         "calc package PDF (.pdf)")
    if not p.is_file():
        raise InputError("PACKAGE", str(package), "an existing file")
    if suffix == ".toml":
        return ReviewPackage(p.resolve(), None, None)
    pdf = p.resolve() if suffix == ".pdf" else None
    nb = p.resolve() if suffix == ".ipynb" else p.resolve().with_suffix(".ipynb")
    if suffix == ".pdf":
        from ..signoff.notebook import sibling
        nb = sibling(p.resolve(), ".ipynb") or nb      # the executed notebook beside it, by the one rule
    if not nb.is_file():
        raise InputError("PACKAGE", str(package), "a calc package PDF with its executed notebook beside it "
                         f"({nb.name})", "Give the notebook or the job file instead")
    job = _job_of_notebook(nb)
    if not job.is_file():
        raise InputError("PACKAGE", str(package), f"a package whose job file exists ({job})")
    return ReviewPackage(job, nb, pdf)


__all__ = ["ReviewPackage", "locate"]
