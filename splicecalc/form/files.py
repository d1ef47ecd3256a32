"""The job file behind a form: open, save atomically, and say what is out of date.

Two things can be out of date, and the form says so in a banner:

* **unsaved edits**: the job file on disk differs from what the form holds
  (compared first as job dicts, then, when both are valid, as canonical jobs,
  so ``"3.0 m"`` against ``"3 m"`` is not a difference);
* **the printed package**: the calc-package PDF next to the job file was built
  from other inputs than the current job file. The PDF's sidecar
  ``<pdf>.json`` (written by :mod:`splicecalc.signoff`) holds the sign-off
  ``digest`` and the path of the executed notebook; the notebook publishes the
  canonical job inputs it ran with. The package is current when the notebook
  still has the recorded digest and its job inputs hash (SHA-256 of
  :func:`splicecalc.signoff.canonical_json`) to the same value as the current
  job file's canonical job. A sidecar key ``job_sha256``, when present, is
  compared directly.

Saving keeps the file's comments, key order and layout: the new values are
merged into the parsed document (:mod:`tomlkit`), only changed keys are
rewritten, and the text written is checked to read back as exactly the job
dict the form validated (otherwise the whole file is written afresh).

Saving validates first (nothing is written for bad input), refuses to
overwrite a file that another program changed since the form read it (unless
forced), and writes through a temporary file in the same folder and
:func:`os.replace`, so the file on disk is always either the old or the new one.
"""

from __future__ import annotations

import hashlib
import json
import os
import tomllib
from dataclasses import dataclass, field
from functools import lru_cache
from pathlib import Path
from typing import Any

from ..core.errors import InputError
from ..job.loader import dumps_toml, job_from_dict, loads_job, write_text_atomic
from ..job.model import Job
from ..signoff.digest import canonical_json, compute_digest, job_inputs
from .state import FormState

#: first line of a new job file written by the form
HEADER = "# splicecalc job file, written by the job form (quantities carry their units)\n"


# ---------------------------------------------------------------- saving, keeping the file's layout
def _plain(v: Any) -> Any:
    unwrap = getattr(v, "unwrap", None)
    return unwrap() if callable(unwrap) else v


def _merge_table(table: Any, data: dict[str, Any]) -> None:
    """Make the tomlkit ``table`` hold ``data``: unchanged values keep their text and comments."""
    for k in [k for k in table if k not in data]:
        del table[k]
    for k, v in data.items():
        if k not in table:
            table[k] = v
            continue
        old = table[k]
        if isinstance(v, dict) and isinstance(_plain(old), dict) and hasattr(old, "keys"):
            _merge_table(old, v)
        elif (isinstance(v, list) and v and all(isinstance(x, dict) for x in v) and isinstance(_plain(old), list)
              and all(hasattr(x, "keys") for x in old)):
            _merge_rows(old, v)
        elif _plain(old) != v or type(_plain(old)) is not type(v):
            table[k] = v


def _merge_rows(rows: Any, data: list[dict[str, Any]]) -> None:
    """An array of tables (``[[load]]``) row by row: kept rows keep their comments."""
    while len(rows) > len(data):
        del rows[len(rows) - 1]
    for i, row in enumerate(data):
        if i < len(rows):
            _merge_table(rows[i], row)
        else:
            rows.append(row)


def toml_text(data: dict[str, Any], old_text: str | None) -> str:
    """TOML text holding exactly ``data``: ``old_text`` updated in place (its comments and layout kept),
    or, for a new file (or one tomlkit cannot update faithfully), the whole file written afresh."""
    if old_text is not None:
        try:
            import tomlkit

            doc = tomlkit.parse(old_text)
            _merge_table(doc, data)
            text = tomlkit.dumps(doc)
            if tomllib.loads(text) == data:
                return text
        except Exception:  # noqa: BLE001 - any surprise: write the file afresh (still exactly the job)
            pass
    return HEADER + dumps_toml(data)


def default_pdf(job_path: Path) -> Path:
    """The calc-package PDF printed from the job file at ``job_path``.

    In Jupyter, the notebook the form runs in names it (``<notebook>.pdf``, as
    ``splicecalc build <notebook>`` writes it; the kernel learns the notebook from
    ``JPY_SESSION_NAME``); otherwise the newest of ``<template>.pdf`` and ``<job>.pdf``
    beside the job file (``splicecalc build job.toml`` writes the latter), or the
    template's name when neither exists yet.
    """
    from ..workflow.package import DEFAULT_TEMPLATE

    session = os.environ.get("JPY_SESSION_NAME", "")
    if session.endswith(".ipynb"):
        return Path.cwd() / (Path(session).stem + ".pdf")
    folder = job_path.parent
    found = [p for p in (folder / f"{DEFAULT_TEMPLATE}.pdf", job_path.with_suffix(".pdf")) if p.is_file()]
    if found:
        return max(found, key=lambda p: p.stat().st_mtime_ns)
    return folder / f"{DEFAULT_TEMPLATE}.pdf"


def job_sha256(job: Job | dict[str, Any]) -> str:
    """SHA-256 of the canonical JSON of a job's canonical dict (or of such a dict)."""
    d = job.to_canonical_dict() if isinstance(job, Job) else job
    return hashlib.sha256(canonical_json(d).encode("utf-8")).hexdigest()


@dataclass(frozen=True)
class PackageStatus:
    """Whether the calc-package PDF matches the current job file.

    state: ``"none"`` (no PDF yet), ``"current"``, ``"stale"`` (built from other
    inputs) or ``"unknown"`` (cannot tell: no sidecar, notebook missing...).
    """

    state: str
    message: str
    pdf: str = ""

    @property
    def out_of_date(self) -> bool:
        return self.state in ("stale", "unknown")


def _resolve(p: str, base: Path) -> Path:
    q = Path(p)
    if q.is_absolute():
        return q
    return base / q if (base / q).exists() else q


@lru_cache(maxsize=8)
def _notebook_facts(path: str, mtime_ns: int, size: int) -> tuple[str, str | None]:
    """(sign-off digest, SHA-256 of the job inputs or None) of a notebook file, cached per version."""
    import nbformat
    nb = nbformat.read(path, as_version=4)
    inputs = job_inputs(nb)
    return compute_digest(nb), (job_sha256(inputs) if inputs else None)


def package_status(pdf: str | os.PathLike, job_digest: str | None) -> PackageStatus:
    """Compare the PDF's recorded inputs with ``job_digest`` (:func:`job_sha256` of the job file,
    None when the job file is missing or invalid)."""
    pdf = Path(pdf)
    if not pdf.is_file():
        return PackageStatus("none", f"no calc package printed yet ({pdf.name})", str(pdf))
    side = Path(str(pdf) + ".json")
    if not side.is_file():
        return PackageStatus("unknown", f"{pdf.name} has no {side.name} record: the inputs it was built from "
                             "are not known; print it again", str(pdf))
    try:
        data = json.loads(side.read_text(encoding="utf-8"))
        if not isinstance(data, dict):
            raise ValueError("not a JSON object")
    except (OSError, ValueError) as err:
        return PackageStatus("unknown", f"{side.name} cannot be read ({err}); print the package again", str(pdf))
    if job_digest is None:
        return PackageStatus("unknown", "the job file is missing or invalid, so the printed package cannot be "
                             "compared with it", str(pdf))
    built: str | None = data.get("job_sha256") if isinstance(data.get("job_sha256"), str) else None
    if built is None:
        nb_path = data.get("notebook")
        if not isinstance(nb_path, str) or not nb_path:
            return PackageStatus("unknown", f"{side.name} names no notebook: the inputs {pdf.name} was built "
                                 "from are not known; print it again", str(pdf))
        nbp = _resolve(nb_path, pdf.parent)
        if not nbp.is_file():
            return PackageStatus("unknown", f"the notebook {nb_path} that {pdf.name} was built from is "
                                 "missing; print the package again", str(pdf))
        try:
            st = nbp.stat()
            nb_digest, built = _notebook_facts(str(nbp), st.st_mtime_ns, st.st_size)
        except Exception as err:  # unreadable notebook: say so, never a traceback
            return PackageStatus("unknown", f"the notebook {nb_path} cannot be read ({type(err).__name__}); "
                                 "print the package again", str(pdf))
        if nb_digest != data.get("digest"):
            return PackageStatus("stale", f"the notebook {nbp.name} changed since {pdf.name} was printed: "
                                 "print it again", str(pdf))
        if built is None:
            return PackageStatus("unknown", f"the notebook {nbp.name} records no job inputs: cannot tell "
                                 f"what {pdf.name} was built from", str(pdf))
    if built != job_digest:
        return PackageStatus("stale", f"{pdf.name} was printed from other inputs than the current job file: "
                             "print it again", str(pdf))
    return PackageStatus("current", f"{pdf.name} was printed from the current job file", str(pdf))


@dataclass(frozen=True)
class FormStatus:
    """What the form shows above its fields."""

    error: InputError | None = None        # the form's current values are invalid
    unsaved: bool = False                  # the job file on disk differs from the form
    missing: bool = False                  # no job file on disk yet
    disk_changed: bool = False             # another program changed the file since the form read it
    disk_error: str = ""                   # the file on disk cannot be read as a job
    package: PackageStatus = field(default_factory=lambda: PackageStatus("none", ""))

    @property
    def valid(self) -> bool:
        return self.error is None

    @property
    def out_of_date(self) -> bool:
        """True when the banner must warn (unsaved edits or a stale printed package)."""
        return self.unsaved or self.package.out_of_date or self.disk_changed

    def messages(self) -> list[tuple[str, str]]:
        """(level, text) lines for the banner; level ``"error"``, ``"warn"`` or ``"ok"``."""
        out: list[tuple[str, str]] = []
        if self.error is not None:
            out.append(("error", str(self.error)))
        if self.disk_error:
            out.append(("error", self.disk_error))
        if self.disk_changed:
            out.append(("warn", "OUT OF DATE: the job file was changed by another program since the form "
                                "read it. Reload to see it (the form's edits are discarded), or save to "
                                "overwrite it."))
        if self.missing:
            out.append(("warn", "NOT SAVED: there is no job file yet; save to create it."))
        elif self.unsaved:
            out.append(("warn", "OUT OF DATE: unsaved edits. The job file on disk differs from the form; "
                                "the calc runs from the file, so save before printing."))
        if self.package.out_of_date:
            out.append(("warn", "OUT OF DATE: " + self.package.message + "."))
        elif self.package.message:
            out.append(("ok", self.package.message + "."))
        if not self.unsaved and not self.missing and not self.disk_changed and not self.disk_error:
            out.append(("ok", "The job file holds the values shown."))
        return out


class FormFile:
    """A :class:`FormState` bound to a job file (and the calc-package PDF printed from it).

    Opening reads the file into the form (if it exists). ``pdf`` defaults to
    :func:`default_pdf`.
    """

    def __init__(self, path: str | os.PathLike, pdf: str | os.PathLike | None = None) -> None:
        p = Path(path)
        if p.suffix.lower() != ".toml":
            raise InputError("job file", str(path), "a file name ending in .toml")
        self.path = p
        self._pdf = Path(pdf) if pdf is not None else None
        self.state = FormState()
        self.load_error = ""
        self._baseline: str | None = None   # text of the file when last read or written
        self.reload()

    @property
    def pdf(self) -> Path:
        """The calc-package PDF compared with the job file (given, or :func:`default_pdf` now)."""
        return self._pdf if self._pdf is not None else default_pdf(self.path)

    # ------------------------------------------------------------ disk
    def _read_disk(self) -> str | None:
        try:
            return self.path.read_text(encoding="utf-8")
        except FileNotFoundError:
            return None
        except (OSError, UnicodeDecodeError) as err:
            raise InputError("job file", str(self.path), f"a readable UTF-8 text file ({err})") from None

    def reload(self) -> None:
        """Read the job file into the form, replacing the form's values (explicit action)."""
        self.load_error = ""
        try:
            text = self._read_disk()
        except InputError as err:
            self.load_error = str(err)
            self._baseline = None
            return
        self._baseline = text
        if text is None:
            self.state = FormState()
            return
        try:
            self.state = FormState.from_toml(text, source=str(self.path))
        except InputError as err:
            self.load_error = str(err)
            self.state = FormState()

    def disk_changed(self) -> bool:
        """True when the file on disk is not the text the form last read or wrote."""
        try:
            return self._read_disk() != self._baseline
        except InputError:
            return True

    def unsaved(self) -> bool:
        """True when the job file on disk differs from the form (or does not exist)."""
        try:
            text = self._read_disk()
        except InputError:
            return True
        if text is None:
            return True
        try:
            disk = FormState.from_toml(text)
        except InputError:
            return True
        if disk.to_job_dict(strict=False) == self.state.to_job_dict(strict=False):
            return False
        a, _ = disk.check()
        b, _ = self.state.check()
        if a is None or b is None:
            return True
        return job_sha256(a) != job_sha256(b)

    def disk_job(self) -> tuple[Job | None, str]:
        """The job in the file on disk, or (None, why not)."""
        try:
            text = self._read_disk()
        except InputError as err:
            return None, str(err)
        if text is None:
            return None, ""
        try:
            return loads_job(text, source=self.path.name), ""      # the one validation path (size, nesting)
        except InputError as err:
            return None, f"the job file {self.path.name} is not valid: {err}"

    # ------------------------------------------------------------ save
    def save(self, force: bool = False) -> Job:
        """Validate and write the job file atomically; returns the job.

        Raises InputError (and writes nothing) when a value is invalid, when the
        file changed on disk since the form read it, or when the file on disk
        could not be read as TOML (it would be lost); ``force=True`` overwrites
        in the last two cases.
        """
        job = self.state.to_job()                      # bad input: InputError, nothing written
        data = self.state.to_job_dict(strict=True)
        if not force:
            if self.load_error:
                raise InputError("job file", str(self.path), "a job file the form could read",
                                 "It was not read (" + self.load_error + "); fix or move it, or overwrite it "
                                 "on purpose")
            if self.disk_changed() and self.path.exists():
                raise InputError("job file", str(self.path), "a file unchanged since the form read it",
                                 "Another program changed it: reload it (discarding the form's edits) or "
                                 "overwrite it on purpose")
        try:
            old = self._read_disk()
        except InputError:
            old = None
        text = toml_text(data, old if not self.load_error else None)
        if text == old:
            return job                                 # nothing changed: the file is left alone
        write_text_atomic(self.path, text)
        self._baseline = text
        self.load_error = ""
        return job

    # ------------------------------------------------------------ status
    def status(self) -> FormStatus:
        err: InputError | None
        _, err = self.state.check()
        missing = False
        try:
            missing = self._read_disk() is None
        except InputError:
            pass
        disk_job, disk_err = self.disk_job()
        if self.load_error:
            disk_err = self.load_error
        digest = job_sha256(disk_job) if disk_job is not None else None
        return FormStatus(error=err, unsaved=self.unsaved(), missing=missing,
                          disk_changed=self.disk_changed() and not missing, disk_error=disk_err,
                          package=package_status(self.pdf, digest))


__all__ = ["FormFile", "FormStatus", "PackageStatus", "package_status", "job_sha256", "HEADER", "default_pdf",
           "toml_text"]
