"""Calc packages on disk: templates, a new package folder, building a PDF, the demo.

* :func:`new_package` copies a template into a project folder with the project
  fields in ``nb.metadata["splicecalc"]`` and the job file beside it;
* :func:`build_package` executes a notebook (or a job file through the default
  template) headless, writes the executed notebook next to the PDF (it is what
  is signed and verified), the PDF (atomically) and its sidecar record
  (:func:`splicecalc.signoff.ledger.write_sidecar`). A PDF that is issued, or that
  was built signed, is never overwritten. Signatures and revisions already in the
  executed notebook are kept, so a rebuild after an input change shows as
  changed since signed;
* :func:`build_demo` builds the demo package from ``examples/demo_*.toml``.
"""

from __future__ import annotations

import json
import os
from contextlib import contextmanager
from dataclasses import dataclass
from pathlib import Path
from typing import Any, Iterator

from ..core.errors import InputError
from ..core.shipped import shipped_dir
from ..report.errors import CalcBuildError
from ..report.headless import HEADLESS_ENV  # set by a headless build for the kernel: the form stays hidden

#: templates shipped with splicecalc (:func:`splicecalc.core.shipped.shipped_dir`)
TEMPLATES: tuple[str, ...] = ("beam_splice", "splice_only", "end_connection")
DEFAULT_TEMPLATE = "beam_splice"
#: the job file name a new beam_splice package uses
JOB_FILE = "job.toml"
#: the example job files (inside the installed package, or the repository's examples/)
EXAMPLES_DIR = shipped_dir("examples")
DEMO_GLOB = "demo_*.toml"


class SignedPDFError(CalcBuildError):
    """The target PDF was built from a signed notebook (or is issued): it is a record, never overwritten."""

    def __init__(self, path: str, reason: str) -> None:
        self.path = path
        super().__init__(f"{path} is {reason} (see {path}.json); it will not be overwritten. "
                         "Build the new revision under another file name (-o NEW.pdf).")


@dataclass(frozen=True)
class PackageBuild:
    """What :func:`build_package` wrote: the PDF, the executed notebook, the sidecar, the build report."""

    pdf: Path
    notebook: Path
    sidecar: Path
    report: Any
    status: str
    #: the issued revision the changes are marked against ("" when none), the sheets that carry the bar
    #: (as TeX resolved them), and why changes are not marked although a revision was issued
    changed_since: str = ""
    changed_sheets: tuple[int, ...] = ()
    changes_note: str = ""

    def changes_line(self) -> str:
        """One line on the change marks, or ""."""
        if self.changed_since:
            return (f"sheets changed since issued revision {self.changed_since} (bar in the margin): "
                    + (", ".join(str(n) for n in self.changed_sheets) or "none"))
        return f"changes not marked: {self.changes_note}" if self.changes_note else ""

    def summary(self) -> str:
        extra = self.changes_line()
        return (f"{self.report.summary()}\nexecuted notebook: {self.notebook}\nstatus: {self.status} "
                f"(record {self.sidecar})" + (f"\n{extra}" if extra else ""))


# ======================================================================== templates and metadata
def template_path(name: str) -> Path:
    """The template ``<name>.ipynb`` (one of :data:`TEMPLATES`, or any name found on the template path)."""
    from ..report.demo import template_path as _find

    if not isinstance(name, str) or not name.strip():
        raise InputError("template", name, "one of " + ", ".join(TEMPLATES))
    try:
        return _find(name.strip().removesuffix(".ipynb"))
    except InputError:
        raise InputError("template", name, "one of " + ", ".join(TEMPLATES)) from None


def metadata_from_job(job: Any) -> dict[str, str]:
    """Title-block fields of ``nb.metadata["splicecalc"]`` from the job's ``[project]`` table."""
    p = job.project
    place = ", ".join(t for t in (p.client, p.location) if t)
    out = {"project": place or p.title, "job_number": p.number, "title": p.title, "prepared_by": p.prepared_by,
           "checked_by": p.checked_by, "revision": p.revision, "date": p.date}
    return {k: v for k, v in out.items() if v}


def set_parameter(nb: Any, name: str, value: str) -> None:
    """Set ``name = "value"`` on its own line of the ``parameters`` cell (the comment before it kept)."""
    from ..report.demo import fill_template

    fill_template(nb, {name: value})


def _read(path: Path) -> Any:
    import nbformat   # here, not at the top: a build launches its kernel before loading nbformat

    return nbformat.read(str(path), as_version=4)


def _write(nb: Any, path: Path) -> None:
    from ..report.build import write_atomic

    import nbformat

    write_atomic(path, nbformat.writes(nb).encode("utf-8"))


# ======================================================================== new package
@dataclass(frozen=True)
class NewPackage:
    notebook: Path
    job_file: Path | None


def new_package(template: str, folder: str | os.PathLike, *, project: str = "", number: str = "",
                title: str = "", job: str | os.PathLike | None = None) -> NewPackage:
    """Copy ``template`` into ``folder`` as ``<template>.ipynb`` with the project fields filled in.

    For ``beam_splice`` the job file is copied (``job``) or a starter job written,
    as ``folder/job.toml``; an existing notebook or job file is never overwritten.
    """
    src = template_path(template)
    name = src.stem
    from ..report.metadata import TITLE_BLOCK_MAX

    for field, v in (("--project", project), ("--number", number), ("--title", title)):
        if not isinstance(v, str):
            raise InputError(field, v, "a text")
        if len(v) > TITLE_BLOCK_MAX:
            raise InputError(field, v[:40] + "...", f"at most {TITLE_BLOCK_MAX} characters ({len(v)} given)",
                             "Shorten it; attach a longer document to the package and refer to it")
    dest = Path(folder)
    nb_path = dest / f"{name}.ipynb"
    if nb_path.exists():
        raise InputError("FOLDER", str(dest), f"a folder without {nb_path.name} (a package is never overwritten)")
    nb = _read(src)
    job_path = None
    if name == DEFAULT_TEMPLATE:
        job_path = dest / JOB_FILE
        if job_path.exists():
            raise InputError("FOLDER", str(dest), f"a folder without {JOB_FILE} (it would be overwritten)")
    meta = dict(nb.metadata.get("splicecalc", {}))
    if job is not None:
        if name != DEFAULT_TEMPLATE:
            raise InputError("--job", str(job), f"no job file for the {name} template (its inputs are typed in "
                             "the parameters cell)")
        from ..job import load_job

        j = load_job(job)                      # validated before anything is written
        meta.update(metadata_from_job(j))
    fields = {"project": project, "job_number": number, "title": title}
    meta.update({k: v.strip() for k, v in fields.items() if v and v.strip()})
    meta["template"] = name
    nb.metadata["splicecalc"] = meta
    dest.mkdir(parents=True, exist_ok=True)
    if job_path is not None:
        from ..job.loader import write_text_atomic

        if job is not None:
            write_text_atomic(job_path, Path(job).read_text(encoding="utf-8"))
        else:
            write_text_atomic(job_path, starter_job(project=project, number=number, title=title))
        set_parameter(nb, "job_file", JOB_FILE)
    _write(nb, nb_path)
    return NewPackage(nb_path, job_path)


STARTER_JOB = """\
# splicecalc job file: a starter. Every value marked REPLACE is a placeholder, not a design value:
# put in the job's own before relying on anything built from it. Quantities carry their units
# ("7.2 m", "10 kN/m", "35 kN"). Check the whole job with `splicecalc run job.toml`; build the
# calc package with `splicecalc build beam_splice.ipynb`.

{project}
[beam]
span = "6 m"                     # REPLACE: span between bearing centres
grade = "S355"                   # S235 | S275 | S355
section = "auto"                 # "auto" (lightest passing) or a designation, e.g. "457x191x67 UKB"
families = ["UKB"]               # searched when section = "auto"
load_level = "top flange"        # where the loads act: "top flange" | "shear centre" | "bottom flange"
deflection_limit = 360           # variable-action deflection limit, span / N
# max_depth = "460 mm"           # headroom limit on the depth
# restraints = ["2 m", "4 m"]    # intermediate lateral-torsional restraints (the ends are fork supports)
# bearing_length = "100 mm"      # stiff bearing, where the beam sits on a support

# One [[load]] table per characteristic load; the beam's self-weight is added by the design.
[[load]]
name = "permanent load"          # REPLACE with the job's loads
action = "permanent"
udl = "1 kN/m"                   # REPLACE

[[load]]
name = "imposed load"            # REPLACE
action = "imposed"
category = "B"                   # EN 1990 Table A1.1 category (psi factors)
udl = "1 kN/m"                   # REPLACE
# A point load:  point = "35 kN"  and  at = "3.0 m";  a partial UDL:  from = "0.5 m"  and  to = "2.5 m"

# Delivered in pieces? Uncomment and give the access limits (or positions = ["3 m"]):
# [splices]
# max_piece_length = "3.6 m"
# max_piece_mass = "250 kg"
# bolts = "auto"

# End connections to existing steel, one table per end ("start" and "end"):
# [[support]]
# at = "start"
# connection = "end plate"       # "end plate" | "fin plate"
# bolts = "auto"
# existing_member = {{ designation = "existing column (measured)", h = "254 mm", b = "203 mm", tw = "8.9 mm", tf = "12.7 mm", r = "10.2 mm" }}
# existing_face = "column flange"   # "column flange" | "column web" | "beam web"
# existing_steel = "unknown"     # era band ("1950-1958" ...), "unknown" (lowest band) or a grade
"""


def starter_job(project: str = "", number: str = "", title: str = "") -> str:
    """A minimal, commented starter job file: no demo data, every design value a marked placeholder
    (valid as it stands, so `run` and `build` work before it is filled in)."""
    import tomli_w

    from ..job import loads_job

    proj = {"number": number, "title": title, "location": project}
    proj = {k: v for k, v in proj.items() if v}
    table = tomli_w.dumps({"project": proj}) if proj else "# [project]\n# number = \"\"\n# title = \"\"\n"
    text = STARTER_JOB.format(project=table)
    loads_job(text)                               # the starter is itself a valid job
    return text


# ======================================================================== build
def executed_name(pdf: Path) -> Path:
    """Where a build keeps the executed notebook of ``pdf`` when the source notebook has its name:
    ``<stem>.executed.ipynb`` beside the PDF."""
    return pdf.with_name(f"{pdf.stem}.executed.ipynb")


from ..signoff.ledger import sidecar_path as _sidecar  # noqa: E402  (one definition of the record's name)


#: sidecar statuses of a PDF built from a notebook whose signatures were valid
SIGNED_STATUSES = ("PREPARED", "CHECKED", "APPROVED", "ISSUED")


def protection(pdf: str | os.PathLike) -> str | None:
    """Why ``pdf`` must not be overwritten (an issued revision, a signed package), or None.

    A PDF is signed when its build record shows a valid sign-off status; one built
    after its inputs changed (status "DRAFT - CHANGED SINCE SIGNED") is a draft.
    """
    from ..signoff.ledger import protection_reason

    p = Path(pdf)
    why = protection_reason(p)      # signed PDF or notebook, issued (names compared ignoring case)
    if why:
        return why
    sc = _sidecar(p)
    if sc.is_file():
        try:
            data = json.loads(sc.read_text(encoding="utf-8"))
        except (OSError, ValueError):
            return "recorded in an unreadable build record"
        if not isinstance(data, dict):
            return "recorded in an unreadable build record"
        if str(data.get("status", "")).upper() in SIGNED_STATUSES:
            return f"a signed calc package (status {data['status']})"
    return None


def notebook_for_job(job_file: str | os.PathLike, notebook: str | os.PathLike,
                     template: str = DEFAULT_TEMPLATE) -> Path:
    """Write (or refresh) the notebook that builds ``job_file`` with ``template``.

    The parameters cell points to the job file by a path relative to the
    notebook; the title block comes from the job's ``[project]`` table. Signatures
    and revisions of an existing notebook at that path are kept.
    """
    from ..job import load_job

    jp = Path(job_file)
    job = load_job(jp)                      # bad input stops here, before any file is written
    nbp = Path(notebook)
    nb = _read(template_path(template))
    rel = os.path.relpath(jp.resolve(), nbp.resolve().parent)
    set_parameter(nb, "job_file", Path(rel).as_posix())
    meta = dict(nb.metadata.get("splicecalc", {}))
    meta.update(metadata_from_job(job))
    meta["template"] = template
    if nbp.is_file():
        old = _read(nbp).metadata.get("splicecalc", {})
        for key in ("signatures", "revisions"):
            if old.get(key):
                meta[key] = old[key]
    nb.metadata["splicecalc"] = meta
    nbp.parent.mkdir(parents=True, exist_ok=True)
    _write(nb, nbp)
    return nbp


@contextmanager
def _headless() -> Iterator[None]:
    old = os.environ.get(HEADLESS_ENV)
    os.environ[HEADLESS_ENV] = "1"
    try:
        yield
    finally:
        if old is None:
            os.environ.pop(HEADLESS_ENV, None)
        else:
            os.environ[HEADLESS_ENV] = old


def _previous_executed(path: Path) -> dict | None:
    """The executed notebook of the previous build, as JSON, when it stores an inputs digest."""
    from ..report.uptodate import stored_inputs

    try:
        nb = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    return nb if isinstance(nb, dict) and stored_inputs(nb) else None


def _job_changed(previous: dict, src: Path) -> bool:
    """True when the job file ``src`` (a .toml) now reads differently from the inputs the previous
    executed notebook printed: its cells will run, so the kernel can be launched at once. Only a hint
    for when to launch it (the reuse decision is the digest's); False when unsure."""
    if src.suffix != ".toml":
        return False
    from ..job import load_job
    from ..signoff.digest import canonical_json, job_inputs

    try:
        printed = job_inputs(previous)
        return bool(printed) and canonical_json(load_job(src).to_canonical_dict()) != canonical_json(printed)
    except (InputError, ValueError, TypeError, AttributeError):
        return False                     # the build reports a bad job file itself, in its place


def build_package(source: str | os.PathLike, pdf: str | os.PathLike | None = None, *, progress: bool = True,
                  timeout: float = 600.0, fresh: bool = False) -> PackageBuild:
    """Build the calc package of ``source`` (a notebook, or a ``.toml`` job file) into ``pdf``.

    Default ``pdf``: the source's name with ``.pdf``. The executed notebook is
    written next to the PDF (same name, ``.ipynb``); for a job file that is also
    the notebook built. A source notebook is never rewritten: when it has that
    name, the executed copy is :func:`executed_name` (``<stem>.executed.ipynb``). Raises InputError for bad paths or inputs,
    :class:`SignedPDFError` when the PDF must not be overwritten, and
    :class:`~splicecalc.report.errors.CalcBuildError` (failing cell, missing tool, LaTeX) otherwise.

    Make-style: when the executed notebook of the previous build holds the same inputs digest as
    this build's cells (:mod:`splicecalc.report.uptodate`) and is, unedited and unsigned, what that
    build wrote, its outputs are reused and no cell runs (the report says so in one line); only the
    export and XeLaTeX run. ``fresh=True`` executes every cell and starts XeLaTeX from nothing.
    """
    src = Path(source)
    if not src.is_file():
        raise InputError("NOTEBOOK_OR_JOB", str(source), "an existing .ipynb notebook or .toml job file")
    if src.suffix not in (".ipynb", ".toml"):
        raise InputError("NOTEBOOK_OR_JOB", str(source), "a .ipynb notebook or a .toml job file")
    out = Path(pdf) if pdf is not None else src.with_suffix(".pdf")
    if out.suffix.lower() != ".pdf":
        raise InputError("-o", str(pdf), "a file name ending in .pdf")
    why = protection(out)
    if why:
        raise SignedPDFError(str(out), why)
    from ..report.compile import require_tool

    require_tool("xelatex")                 # missing tools stop the build before any file is written
    require_tool("pandoc")
    executed = out.with_suffix(".ipynb")
    if executed.resolve() == src.resolve():
        # never rewrite the notebook being built (it may be open in Jupyter, which would then ask to
        # overwrite or revert): the executed copy, which is what is signed, gets a name of its own
        executed = executed_name(out)
    out.parent.mkdir(parents=True, exist_ok=True)
    run_dir = executed.parent if src.suffix == ".toml" else src.parent   # where the notebook runs

    from ..report.kernel import KernelLaunch

    # the kernel boots (imports, on the other core) while the job is read and the notebook written;
    # a build that stops before the notebook runs shuts it down (the job is validated before the
    # notebook is written)
    from ..signoff.locks import folder_lock

    lock = folder_lock(out.parent, progress=progress)     # one build at a time per output folder
    why = protection(out)                                   # signed while we waited?
    if why:
        lock.release()
        raise SignedPDFError(str(out), why)
    # read before the notebook below overwrites it: the previous build's outputs, if it left a digest
    previous = None if fresh else _previous_executed(executed)
    # no candidate, or a job whose inputs visibly changed since it: boot the kernel first
    kernel = KernelLaunch(run_dir) if previous is None or _job_changed(previous, src) else None
    staged: Path | None = None
    try:
        from ..report.build import build_pdf
        from ..report.uptodate import cells_inputs, reusable_outputs

        if src.suffix == ".toml":
            nb_source = notebook_for_job(src, executed)
        else:
            # execute in the source's folder (relative job paths), keep the ledger of the executed copy
            nb = _read(src)
            meta = nb.metadata.setdefault("splicecalc", {})
            meta.pop("sign_off", None)          # signatures belong to the package they signed, not a rebuild
            meta.setdefault("title", src.stem)
            if executed.is_file():
                old = _read(executed).metadata.get("splicecalc", {})
                for key in ("signatures", "revisions"):
                    if old.get(key) and not meta.get(key):
                        meta[key] = old[key]
            staged = src.with_name(f".{src.stem}.build.ipynb")
            _write(nb, staged)
            nb_source = staged
        issued, note = _previous_issue(nb_source, [out.parent, src.parent], out.name)
        with _headless():
            digest, _why = cells_inputs(json.loads(nb_source.read_text(encoding="utf-8")), run_dir)
            reuse, _why = reusable_outputs(previous, out, digest) if previous is not None else (None, "")
            if reuse is None and kernel is None:
                kernel = KernelLaunch(run_dir)
            report = build_pdf(nb_source, out, execute=True, progress=progress, timeout=timeout,
                               executed_path=executed, kernel=kernel, inputs_digest=digest, reuse=reuse,
                               seed=not fresh, previous=issued, changes_note=note)
        from ..signoff.ledger import write_sidecar

        nb_exec = _read(executed)
        data = write_sidecar(out, nb_exec, executed.resolve())
    finally:
        if kernel is not None:
            kernel.discard()
        if staged is not None and staged.exists():
            staged.unlink()
        lock.release()
    since = issued["revision"] if issued else ""
    return PackageBuild(pdf=out, notebook=executed, sidecar=_sidecar(out), report=report, status=data["status"],
                        changed_since=since, changed_sheets=changed_sheets(report.tex_path) if since else (),
                        changes_note=note)


def _previous_issue(nb_source: Path, folders: list[Path], name: str) -> tuple[dict[str, Any] | None, str]:
    """The previous issued revision of the package being built (see :mod:`splicecalc.signoff.previous`),
    as ``build_pdf(previous=...)`` takes it, and the note when it cannot be used."""
    from ..signoff.previous import previous_issue

    meta = _read(nb_source).metadata.get("splicecalc", {})
    found, note = previous_issue(dict(meta), folders)
    if found is None:
        return None, note
    try:
        old = json.loads(found.notebook.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None, f"the notebook of issued revision {found.revision} ({found.notebook.name}) cannot be read"
    return {"revision": found.revision, "notebook": old, "name": found.pdf.name, "new_name": name}, ""


def changed_sheets(tex_path: str | os.PathLike) -> tuple[int, ...]:
    """The sheets the last XeLaTeX pass marked as changed (``\\calcchgsheets{5,9,10}`` in the .aux)."""
    import re

    try:
        text = Path(tex_path).with_suffix(".aux").read_text(encoding="utf-8", errors="replace")
    except OSError:
        return ()
    found = re.findall(r"\\calcchgsheets\{([0-9,]*)\}", text)
    return tuple(int(x) for x in found[-1].split(",") if x) if found else ()


# ======================================================================== demo
def demo_job_path() -> Path:
    """The demo job file (first ``examples/demo_*.toml``)."""
    found = sorted(EXAMPLES_DIR.glob(DEMO_GLOB))
    if not found:
        raise InputError("demo", str(EXAMPLES_DIR / DEMO_GLOB), "a demo job file among the shipped examples")
    return found[0]


def build_demo(out_dir: str | os.PathLike = "out", *, progress: bool = True, fresh: bool = False) -> PackageBuild:
    """Copy the demo job into ``out_dir`` and build its package there (``<demo name>.pdf``).

    An existing job file in ``out_dir`` is replaced by the demo's (it is the demo);
    a signed or issued demo PDF there is never overwritten.
    """
    job_src = demo_job_path()
    out = Path(out_dir)
    pdf = out / f"{job_src.stem}.pdf"
    why = protection(pdf)
    if why:
        raise SignedPDFError(str(pdf), why)
    out.mkdir(parents=True, exist_ok=True)
    job = out / job_src.name
    if job.resolve() != job_src.resolve():
        from ..job.loader import write_text_atomic

        write_text_atomic(job, job_src.read_text(encoding="utf-8"))
    return build_package(job, pdf, progress=progress, fresh=fresh)


__all__ = ["SIGNED_STATUSES", "DEFAULT_TEMPLATE", "HEADLESS_ENV", "JOB_FILE", "NewPackage", "PackageBuild", "SignedPDFError",
           "TEMPLATES", "build_demo", "build_package", "demo_job_path", "metadata_from_job", "new_package",
           "notebook_for_job", "protection", "starter_job", "template_path", "executed_name"]
