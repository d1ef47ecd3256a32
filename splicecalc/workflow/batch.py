"""Schedules: many beams sharing defaults, each designed by the one path ``splicecalc run`` takes.

A schedule is TOML::

    [schedule]                 # optional
    title = "Gallery beams, bay 2"

    [defaults]                 # any tables and keys of a job file (docs/job-file.md)
    beam = { grade = "S355", section = "auto" }
    [[defaults.load]]
    ...

    [beam.GB1]                 # one table per beam: job-file tables overriding the defaults
    beam = { span = "9.6 m" }

    [beam.GB2.beam]
    span = "7.2 m"

Merge rules (:func:`merge`): tables merge key by key, at every depth; any other value,
arrays and arrays of tables (``[[load]]``, ``[[support]]``) included, replaces the default
whole. A CSV of the fields that vary (:func:`read_csv_rows`) has a ``name`` column and one
column per dotted job key (``beam.span``, ``project.title``, ``load.2.udl``: a number picks
the n-th table of an array, counted from 1; one past the end adds a table); each row is
applied over the defaults (and over the ``[beam.<name>]`` table of the same name, if any).

Every merged beam is written as TOML (tomli-w) and read by :func:`splicecalc.job.loads_job`,
the one validation path of ``run``, ``build`` and the form; a beam refused there is reported
with its one-line message and the others go on. Each valid beam is designed by
:func:`design_one` (``run_calc(job, render=False)``, and with ``pdf`` its package through
:func:`~splicecalc.workflow.package.build_package`), in a process pool sized to the cores or
on a Dask distributed cluster; the rows come back in schedule order for the summary
(:func:`summary_csv`, unit-tagged columns; :func:`summary_table`, text).
"""

from __future__ import annotations

import copy
import csv
import datetime as _dt
import io
import math
import os
import re
import sys
import threading
import tomllib
from concurrent.futures import Future
from dataclasses import dataclass
from pathlib import Path
from typing import Any, Callable, Iterable

from ..core.errors import EXIT_NOT_CHECKED, InputError
from ..core.files import write_atomic

#: top-level tables of a schedule file
SCHEDULE_KEYS: tuple[str, ...] = ("schedule", "defaults", "beam")
#: keys of the optional [schedule] table
SCHEDULE_TABLE_KEYS: tuple[str, ...] = ("title",)
#: a beam name: it names the beam's package folder, so letters, digits, '-' and '_' only
NAME_RE = re.compile(r"[A-Za-z0-9][A-Za-z0-9_-]{0,39}")
#: most beams in one schedule (a building's worth; a larger list is not a schedule meant)
MAX_BEAMS = 500
#: largest schedule or CSV file read
MAX_SCHEDULE_BYTES = 2_000_000
#: the CSV column naming the beam
NAME_COLUMN = "name"

#: the summary's columns, in order; a quantity's unit is in its name
COLUMNS: tuple[str, ...] = (
    "beam", "section", "grade", "span_m", "pieces", "splices", "splice_positions_m", "bolts_per_splice",
    "heaviest_piece_kg", "checks", "exceeding", "not_checked", "governing_check", "governing_utilisation",
    "status", "package_pdf",
)
#: what each column holds (the header of the text table and the docs)
COLUMN_NOTES: dict[str, str] = {
    "beam": "beam name in the schedule",
    "section": "section designed (or given)",
    "grade": "steel grade of the beam",
    "span_m": "span, m",
    "pieces": "pieces delivered (count)",
    "splices": "site splices (count)",
    "splice_positions_m": "splice positions from support A, m (';' between splices)",
    "bolts_per_splice": "bolts in each splice, flange and web, both sides (count; ';' between splices)",
    "heaviest_piece_kg": "heaviest piece as lifted bare, kg (steel, welded end plate, margin)",
    "checks": "check records (count)",
    "exceeding": "checks exceeding capacity (count)",
    "not_checked": "NOT CHECKED records (count)",
    "governing_check": "id of the check with the highest utilisation",
    "governing_utilisation": "its utilisation, demand / resistance (ratio)",
    "status": "within capacity | EXCEEDS capacity | NOT CHECKED | input error | cannot be designed | error",
    "package_pdf": "calc package built with --pdf (path below the output folder)",
}

#: outcome of one beam, worst last (the exit code follows the worst)
OUTCOMES: tuple[str, ...] = ("within", "not_checked", "exceeds", "error")
WITHIN = "within capacity"
OVER = "EXCEEDS capacity"
GAP = "NOT CHECKED"


# ======================================================================== merging
def merge(base: dict[str, Any], over: dict[str, Any]) -> dict[str, Any]:
    """``over`` applied to ``base``: tables merge key by key (recursively); every other value,
    arrays and arrays of tables included, replaces the default whole. Neither input is changed."""
    out = copy.deepcopy(base)
    for k, v in over.items():
        if isinstance(v, dict) and isinstance(out.get(k), dict):
            out[k] = merge(out[k], v)
        else:
            out[k] = copy.deepcopy(v)
    return out


def _segments(column: str) -> list[str | int]:
    """``load.2.udl`` -> ['load', 2, 'udl'] (numbers are 1-based array positions)."""
    segs: list[str | int] = []
    for s in column.split("."):
        s = s.strip()
        if not s:
            raise InputError("CSV column", column, "dotted job keys such as beam.span, project.title or load.2.udl")
        segs.append(int(s) if s.isdigit() else s)
    return segs


def set_dotted(doc: dict[str, Any], column: str, value: Any) -> None:
    """Set ``value`` at the dotted path ``column`` of ``doc`` (in place).

    A number picks the n-th table of an array (from 1); one past the end adds a table.
    Raises :class:`InputError` naming the column when the path does not fit the document.
    """
    segs = _segments(column)
    if isinstance(segs[0], int):
        raise InputError("CSV column", column, "a job table first, e.g. beam.span or load.2.udl")
    node: Any = doc
    for i, seg in enumerate(segs):
        last = i == len(segs) - 1
        if isinstance(seg, int):
            if not isinstance(node, list):
                raise InputError(column, value, "a path without a number here: "
                                 f"{'.'.join(map(str, segs[:i]))} is not an array of tables")
            if not 1 <= seg <= len(node) + 1:
                raise InputError(column, value, f"a table number from 1 to {len(node) + 1} "
                                 f"({len(node)} tables in the defaults and this beam; one more adds a table)")
            if seg == len(node) + 1:
                node.append({})
            if last:
                raise InputError("CSV column", column, "a key after the table number, e.g. load.2.udl")
            node = node[seg - 1]
            continue
        if not isinstance(node, dict):
            raise InputError(column, value, f"a path into a table: {'.'.join(map(str, segs[:i]))} is a value")
        if last:
            node[seg] = value
        else:
            nxt = segs[i + 1]
            if seg not in node:
                node[seg] = [] if isinstance(nxt, int) else {}
            node = node[seg]


#: kinds of the job-file reference whose cells are text as typed (quantities carry their unit)
_TEXT_KINDS = ("text", "length", "force", "line load", "mass", "moment", "stress", "percent")


def _kind(segs: list[str | int]) -> str:
    """The job-file reference's kind of a dotted key (``""`` when it does not say)."""
    from ..job.schema import REFERENCE

    keys = [s for s in segs if isinstance(s, str)]
    if len(keys) == 2 and keys[0] in REFERENCE:
        return REFERENCE[keys[0]].get(keys[1], ("", ""))[0]
    return ""


def csv_value(column: str, cell: str) -> Any:
    """A CSV cell as the TOML value the job file would hold.

    Text and quantity keys (per the job-file reference) keep the cell as typed; other cells
    are read as a TOML value (``360``, ``true``, ``["UKB", "IPE"]``, ``["3.2 m"]``) and, when
    that fails, kept as text for the job validation to name.
    """
    kind = _kind(_segments(column))
    if kind in _TEXT_KINDS:
        return cell
    try:
        v = tomllib.loads(f"v = {cell}")["v"]
    except tomllib.TOMLDecodeError:
        return cell
    if isinstance(v, (_dt.date, _dt.time, _dt.datetime)):
        return cell
    return v


# ======================================================================== reading
@dataclass(frozen=True)
class BeamEntry:
    """One beam of a schedule: its merged job document and TOML text, or its input error."""

    name: str
    text: str = ""
    error: str = ""

    @property
    def ok(self) -> bool:
        return not self.error


@dataclass(frozen=True)
class Schedule:
    source: str
    title: str
    beams: tuple[BeamEntry, ...]


def _read_text(path: Path, what: str) -> str:
    try:
        size = path.stat().st_size
        if size > MAX_SCHEDULE_BYTES:
            raise InputError(what, str(path), f"a file of at most {MAX_SCHEDULE_BYTES // 1000} kB ({size // 1000} kB)")
        raw = path.read_bytes()
    except FileNotFoundError:
        raise InputError(what, str(path), "an existing file") from None
    except IsADirectoryError:
        raise InputError(what, str(path), "a file (this is a folder)") from None
    except OSError as err:
        raise InputError(what, str(path), f"a readable file ({err.strerror or err})") from None
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as err:
        raise InputError(what, str(path), f"UTF-8 text (byte {err.start + 1} is not UTF-8)", "Save it as UTF-8") \
            from None


def _check_name(name: Any, where: str, seen: dict[str, str]) -> str:
    if not isinstance(name, str) or not NAME_RE.fullmatch(name):
        raise InputError(where, name, "a beam name of 1-40 letters, digits, '-' or '_' starting with a letter or "
                         "digit (it names the beam's package folder)", "Write e.g. GB1 or beam-2a")
    low = name.lower()
    if low in seen:
        raise InputError(where, name, f"a name used once (it repeats {seen[low]!r}; names are compared ignoring "
                         "case because they name folders)")
    seen[low] = name
    return name


def read_csv_rows(path: str | os.PathLike) -> list[tuple[str, dict[str, str]]]:
    """``(name, {column: cell})`` per row of a schedule CSV (empty cells left out)."""
    from ..job.loader import TOP_KEYS

    p = Path(path)
    text = _read_text(p, "--csv")
    rows = list(csv.reader(io.StringIO(text)))
    rows = [r for r in rows if any(c.strip() for c in r)]
    if not rows:
        raise InputError("--csv", str(p), f"a header row ({NAME_COLUMN}, then dotted job keys such as beam.span) "
                         "and one row per beam")
    header = [h.strip() for h in rows[0]]
    if NAME_COLUMN not in header:
        raise InputError(f"{p.name} header", ",".join(header)[:200], f"a '{NAME_COLUMN}' column naming each beam")
    if len(set(header)) != len(header):
        dup = next(h for h in header if header.count(h) > 1)
        raise InputError(f"{p.name} header", dup, "each column once")
    for h in header:
        if h == NAME_COLUMN:
            continue
        segs = _segments(h)
        if not isinstance(segs[0], str) or segs[0] not in TOP_KEYS or len(segs) < 2:
            raise InputError(f"{p.name} column", h, f"a dotted job key starting with one of {', '.join(TOP_KEYS)} "
                             "(e.g. beam.span, project.title, load.2.udl)")
    if len(rows) - 1 > MAX_BEAMS:
        raise InputError("--csv", str(p), f"at most {MAX_BEAMS} beams ({len(rows) - 1} rows)")
    out = []
    for n, r in enumerate(rows[1:], start=2):
        if len(r) != len(header):
            raise InputError(f"{p.name} line {n}", ",".join(r)[:120], f"{len(header)} cells, one per column")
        cells = {h: c.strip() for h, c in zip(header, r)}
        name = cells.pop(NAME_COLUMN)
        out.append((name, {h: c for h, c in cells.items() if c != ""}))
    return out


def _validate(name: str, doc: dict[str, Any]) -> BeamEntry:
    """The beam's TOML text and the one job validation (loads_job); its one-line error if refused."""
    from ..job.loader import dumps_toml, loads_job

    try:
        text = dumps_toml(doc)
        loads_job(text, source=f"beam {name}")
    except InputError as err:
        return BeamEntry(name, error=" ".join(str(err).split()))
    except (TypeError, ValueError) as err:    # a value TOML cannot hold (cannot come from TOML or CSV text)
        return BeamEntry(name, error=f"{type(err).__name__}: {err}")
    return BeamEntry(name, text=text)


def read_schedule(path: str | os.PathLike, csv_path: str | os.PathLike | None = None) -> Schedule:
    """Read a schedule (and a CSV of the fields that vary): every beam merged and validated.

    Raises :class:`InputError` (one line) for a schedule that cannot be read as one; a beam
    whose own input is refused is a :class:`BeamEntry` with ``error`` (the others go on).
    """
    p = Path(path)
    text = _read_text(p, "schedule")
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as err:
        raise InputError("schedule", str(p), f"valid TOML ({err})") from None
    except RecursionError:
        raise InputError("schedule", str(p), "tables nested at most a few levels deep") from None
    unknown = [k for k in doc if k not in SCHEDULE_KEYS]
    if unknown:
        raise InputError(f"schedule {unknown[0]}", doc[unknown[0]] if not isinstance(doc[unknown[0]], dict)
                         else "[table]", "only [schedule] (title), [defaults] (job-file tables) and "
                         "[beam.<name>] tables (each beam's overrides)")
    meta = doc.get("schedule", {})
    if not isinstance(meta, dict) or any(k not in SCHEDULE_TABLE_KEYS for k in meta):
        raise InputError("schedule", meta if not isinstance(meta, dict) else ", ".join(meta),
                         "a [schedule] table with a title only")
    title = meta.get("title", "")
    if not isinstance(title, str) or len(title) > 200:
        raise InputError("schedule.title", title, "text of at most 200 characters")
    defaults = doc.get("defaults", {})
    if not isinstance(defaults, dict):
        raise InputError("defaults", defaults, "a [defaults] table holding job-file tables ([defaults.beam] ...)")
    beams = doc.get("beam", {})
    if not isinstance(beams, dict):
        raise InputError("beam", beams, "one table per beam, written [beam.<name>] (e.g. [beam.GB1.beam])")
    seen: dict[str, str] = {}
    overrides: dict[str, dict[str, Any]] = {}
    for name, over in beams.items():
        _check_name(name, "beam name", seen)
        if not isinstance(over, dict):
            raise InputError(f"beam.{name}", over, "a table of job-file tables overriding the defaults, e.g. "
                             f"[beam.{name}.beam] span = \"7.2 m\"")
        overrides[name] = over
    rows = read_csv_rows(csv_path) if csv_path is not None else []
    csv_seen: dict[str, str] = {}
    for name, _cells in rows:
        _check_name(name, f"{Path(csv_path).name} {NAME_COLUMN}", csv_seen)  # type: ignore[arg-type]
    order = list(overrides) + [n for n, _ in rows if n.lower() not in seen]
    if not order:
        raise InputError("schedule", str(p), "at least one beam: a [beam.<name>] table or a row of --csv")
    if len(order) > MAX_BEAMS:
        raise InputError("schedule", str(p), f"at most {MAX_BEAMS} beams ({len(order)})")
    by_row = {n.lower(): cells for n, cells in rows}
    by_table = {n.lower(): t for n, t in overrides.items()}
    entries = []
    for name in order:
        merged = merge(defaults, by_table.get(name.lower(), {}))
        try:
            for col, cell in by_row.get(name.lower(), {}).items():
                set_dotted(merged, col, csv_value(col, cell))
        except InputError as err:
            entries.append(BeamEntry(name, error=" ".join(str(err).split())))
            continue
        entries.append(_validate(name, merged))
    return Schedule(source=str(p), title=title, beams=tuple(entries))


# ======================================================================== one beam
def _fmt(x: float, nd: int) -> float | None:
    return round(float(x), nd) if math.isfinite(x) else None


def summary_row(name: str, result: Any) -> dict[str, Any]:
    """The schedule row of one designed beam (a :class:`~splicecalc.workflow.calc.CalcResult`)."""
    recs = result.records
    over = [r for r in recs if r.checked and not r.ok]
    gaps = [r for r in recs if not r.checked]
    gov = result.governing
    pos = result.positions
    splices = result.splices
    if over:
        outcome, status = "exceeds", f"{OVER}: {len(over)} check(s)" + (f"; {len(gaps)} {GAP}" if gaps else "")
    elif gaps:
        outcome, status = "not_checked", f"{GAP}: {len(gaps)} item(s); the checks made are {WITHIN}"
    else:
        outcome, status = "within", WITHIN
    return {
        "beam": name,
        "section": result.section.designation,
        "grade": result.job.beam.grade,
        "span_m": _fmt(result.job.beam.span / 1000.0, 3),
        "pieces": len(pos.pieces_mm) if pos is not None else len(splices) + 1,
        "splices": len(splices),
        "splice_positions_m": [_fmt(s.x_mm / 1000.0, 3) for s in splices],
        "bolts_per_splice": [int(s.design.n_bolts) for s in splices],
        "heaviest_piece_kg": _fmt(max(pos.piece_mass_kg), 1) if pos is not None and len(pos.piece_mass_kg) else None,
        "checks": len(recs),
        "exceeding": len(over),
        "not_checked": len(gaps),
        "governing_check": gov.id if gov is not None else "",
        "governing_utilisation": _fmt(gov.utilisation, 3) if gov is not None else None,
        "status": status,
        "outcome": outcome,
        "package_pdf": "",
    }


def error_row(name: str, status: str) -> dict[str, Any]:
    """The row of a beam that could not be designed (``status`` is the one-line reason)."""
    row: dict[str, Any] = {c: "" for c in COLUMNS}
    row.update(beam=name, splice_positions_m=[], bolts_per_splice=[], status=" ".join(status.split()),
               outcome="error")
    for c in ("span_m", "pieces", "splices", "heaviest_piece_kg", "checks", "exceeding", "not_checked",
              "governing_utilisation"):
        row[c] = None
    return row


def _one_line(err: BaseException) -> str:
    return " ".join(str(err).split())[:400]


def design_one(name: str, text: str, pdf_dir: str | None = None) -> dict[str, Any]:
    """Design one beam from its job TOML (what ``splicecalc run`` does) and return its row.

    With ``pdf_dir`` the beam's calc package is built there (``<name>.toml``, ``<name>.pdf``,
    the executed notebook). Never raises: a beam that cannot be designed or packaged is a row
    whose status says why, so one beam never stops the others. This is the function the
    process pool and the Dask workers run.
    """
    from ..job.loader import loads_job
    from ..workflow.errors import CalcError

    try:
        job = loads_job(text, source=f"beam {name}")
    except InputError as err:
        return error_row(name, f"input error: {_one_line(err)}")
    try:
        from .calc import run_calc

        result = run_calc(job, render=False)
        row = summary_row(name, result)
    except InputError as err:
        return error_row(name, f"input error: {_one_line(err)}")
    except CalcError as err:
        return error_row(name, f"cannot be designed: {_one_line(err)}")
    except Exception as err:  # noqa: BLE001 - one beam's failure is its row, never the schedule's end
        return error_row(name, f"error: {type(err).__name__}: {_one_line(err)}")
    if pdf_dir is not None:
        try:
            row["package_pdf"] = _package(name, text, Path(pdf_dir))
        except Exception as err:  # noqa: BLE001 - reported on the beam's row
            row["status"] += f"; package not built: {_one_line(err)}"
            row["outcome"] = "error"
    return row


def _package(name: str, text: str, out: Path) -> str:
    """Write ``out/<name>/<name>.toml`` and build its package beside it; the PDF path below ``out``."""
    from .package import build_package, protection

    folder = out / name
    job_file = folder / f"{name}.toml"
    pdf = folder / f"{name}.pdf"
    why = protection(pdf)
    if why:
        raise InputError(f"{name}/{pdf.name}", str(pdf), "a package that is not signed or issued: "
                         f"it is {why}, never rebuilt; revise it with 'splicecalc revise' instead")
    folder.mkdir(parents=True, exist_ok=True)
    body = f"# beam {name} of a splicecalc schedule (defaults merged with the beam's own values)\n" + text
    if not job_file.is_file() or job_file.read_text(encoding="utf-8") != body:
        write_atomic(job_file, body)
    build_package(job_file, pdf, progress=False)
    return f"{name}/{pdf.name}"


# ======================================================================== many beams
def _pool_context() -> Any:
    """Worker start method: fork while this process runs one thread (workers inherit the
    imported calc modules: no import cost per worker), else forkserver (POSIX) or spawn."""
    import multiprocessing as mp

    methods = mp.get_all_start_methods()
    if "fork" in methods and threading.active_count() == 1:
        return mp.get_context("fork")
    if "forkserver" in methods:
        ctx = mp.get_context("forkserver")
        ctx.set_forkserver_preload(["splicecalc.workflow.batch", "splicecalc.workflow.calc"])
        return ctx
    return mp.get_context("spawn")


def default_workers() -> int:
    """Worker processes for a schedule: one per core."""
    return max(1, os.cpu_count() or 1)


class _NoBar:
    """Stands in for the bar without progress (a tqdm bar, even disabled, starts tqdm's monitor
    thread, and a process with a second thread starts its workers by forkserver, not fork)."""

    def __enter__(self) -> "_NoBar":
        return self

    def __exit__(self, *exc: Any) -> None:
        return None

    def update(self, n: int = 1) -> None:
        return None


def _bar(total: int, progress: bool) -> Any:
    if not progress:
        return _NoBar()
    from tqdm import tqdm

    return tqdm(total=total, desc="Beams", unit="beam", file=sys.stderr, leave=False)


def _require_cluster_client(address: str) -> Any:
    try:
        from dask.distributed import Client
    except ImportError:
        raise InputError("--cluster", address, "dask.distributed installed for a cluster run",
                         "Install it with: pip install 'dask[distributed]'") from None
    try:
        return Client(address, timeout=20, set_as_default=False)
    except (OSError, TimeoutError, ValueError) as err:
        raise InputError("--cluster", address, f"the address of a running Dask scheduler, e.g. "
                         f"tcp://10.0.0.5:8786 ({type(err).__name__}: {_one_line(err)})") from None


def run_beams(schedule: Schedule, *, out: str | os.PathLike | None = None, pdf: bool = False,
              workers: int | None = None, cluster: Any = None, progress: bool = True) -> list[dict[str, Any]]:
    """Design (and with ``pdf`` package) every valid beam of ``schedule``; rows in schedule order.

    ``cluster``: a ``dask.distributed.Client`` or a scheduler address; else a process pool of
    ``workers`` (default: one per core; one worker runs in this process).
    """
    if pdf and out is None:
        raise InputError("--out", None, "an output folder for the packages (--pdf)")
    pdf_dir = str(Path(out).resolve()) if pdf and out is not None else None
    if pdf_dir is not None and cluster is None:
        from ..report.compile import require_tool

        require_tool("xelatex")          # a missing tool stops the schedule once, before any beam
        require_tool("pandoc")
    rows: dict[str, dict[str, Any]] = {}
    todo = [b for b in schedule.beams if b.ok]
    for b in schedule.beams:
        if not b.ok:
            rows[b.name] = error_row(b.name, f"input error: {b.error}")
    if todo:
        if cluster is not None:
            _run_dask(todo, pdf_dir, cluster, rows, progress)
        else:
            n = min(workers or default_workers(), len(todo))
            if n <= 1:
                with _bar(len(todo), progress) as bar:
                    for b in todo:
                        rows[b.name] = design_one(b.name, b.text, pdf_dir)
                        bar.update(1)
            else:
                _run_pool(todo, pdf_dir, n, rows, progress)
    return [rows[b.name] for b in schedule.beams]


def _collect(futures: dict[Any, str], done: Iterable[Any], rows: dict[str, dict[str, Any]], bar: Any,
             result: Callable[[Any], dict[str, Any]]) -> None:
    for f in done:
        name = futures[f]
        try:
            rows[name] = result(f)
        except Exception as err:  # noqa: BLE001 - a lost worker fails its beam, not the schedule
            rows[name] = error_row(name, f"error: the worker running it stopped ({type(err).__name__}: "
                                   f"{_one_line(err)})")
        bar.update(1)


def _run_pool(todo: list[BeamEntry], pdf_dir: str | None, n: int, rows: dict[str, dict[str, Any]],
              progress: bool) -> None:
    from concurrent.futures import ProcessPoolExecutor, as_completed

    from . import calc  # noqa: F401 - imported before the workers fork, so they start with it loaded

    with ProcessPoolExecutor(max_workers=n, mp_context=_pool_context()) as ex:
        futures: dict[Future, str] = {ex.submit(design_one, b.name, b.text, pdf_dir): b.name for b in todo}
        try:
            with _bar(len(todo), progress) as bar:
                _collect(futures, as_completed(futures), rows, bar, lambda f: f.result())
        except BaseException:       # Ctrl-C: drop the beams not started instead of waiting for them all
            ex.shutdown(wait=False, cancel_futures=True)
            raise


def _run_dask(todo: list[BeamEntry], pdf_dir: str | None, cluster: Any, rows: dict[str, dict[str, Any]],
              progress: bool) -> None:
    own = isinstance(cluster, str)
    client = _require_cluster_client(cluster) if own else cluster
    try:
        from dask.distributed import as_completed

        futures = {client.submit(design_one, b.name, b.text, pdf_dir, pure=False, key=f"splicecalc-{b.name}-{id(b)}"):
                   b.name for b in todo}
        with _bar(len(todo), progress) as bar, client.as_current():   # as_completed asks for the current client
            _collect(futures, as_completed(list(futures)), rows, bar, lambda f: f.result())
    finally:
        if own:
            client.close()


# ======================================================================== summary
def _cell(v: Any) -> str:
    if v is None:
        return ""
    if isinstance(v, (list, tuple)):
        return ";".join(_cell(x) for x in v)
    if isinstance(v, float):
        return f"{v:g}" if abs(v) < 1e6 else repr(v)
    return str(v)


def summary_csv(rows: list[dict[str, Any]]) -> str:
    """The schedule summary as CSV: :data:`COLUMNS` (units in the names), one row per beam."""
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(COLUMNS)
    for r in rows:
        w.writerow([_cell(r.get(c)) for c in COLUMNS])
    return buf.getvalue()


def write_summary(rows: list[dict[str, Any]], path: str | os.PathLike) -> Path:
    """Write :func:`summary_csv` atomically to ``path`` (folder created)."""
    p = Path(path)
    p.parent.mkdir(parents=True, exist_ok=True)
    return write_atomic(p, summary_csv(rows))


def summary_table(rows: list[dict[str, Any]], title: str = "") -> str:
    """The schedule summary as a text table (the status in full, last)."""
    heads = ("beam", "section", "span m", "pieces", "splices", "bolts/splice", "heaviest kg", "governing check",
             "u", "status")
    body = []
    for r in rows:
        u = r.get("governing_utilisation")
        body.append((r["beam"], r.get("section") or "-", _cell(r.get("span_m")) or "-",
                     _cell(r.get("pieces")) or "-", _cell(r.get("splices")) or "-",
                     " ".join(str(b) for b in r.get("bolts_per_splice") or []) or "-",
                     _cell(r.get("heaviest_piece_kg")) or "-", r.get("governing_check") or "-",
                     f"{u:.2f}" if isinstance(u, float) else "-", r["status"]))
    widths = [max(len(h), *(len(str(b[i])) for b in body)) for i, h in enumerate(heads[:-1])]
    num = {2, 3, 4, 6, 8}

    def line(cells: tuple) -> str:
        parts = [f"{str(c):>{w}}" if i in num else f"{str(c):<{w}}" for i, (c, w) in enumerate(zip(cells, widths))]
        return "  ".join(parts) + "  " + str(cells[-1])

    lines = [title] if title else []
    lines += [line(heads), line(tuple("-" * w for w in widths) + ("-" * 6,))]
    lines += [line(b) for b in body]
    counts = {o: sum(r.get("outcome") == o for r in rows) for o in OUTCOMES}
    lines.append("")
    lines.append(f"{len(rows)} beam(s): {counts['within']} {WITHIN}, {counts['exceeds']} exceeding capacity, "
                 f"{counts['not_checked']} with NOT CHECKED items, {counts['error']} not designed (input or "
                 "other error)")
    lines.append("Design aid only: every result is to be checked by a competent engineer under the codes in "
                 "force at the site.")
    return "\n".join(lines)


def summary_latex(rows: list[dict[str, Any]], title: str, source: str = "") -> str:
    """The schedule summary sheet as a LaTeX document (every text escaped by ``core.text.escape_tex``)."""
    from ..core.text import escape_tex as e

    heads = ("beam", "section", "span (m)", "pieces", "splices", "bolts / splice", "heaviest piece (kg)",
             "governing check", "u", "status")
    body = []
    for r in rows:
        u = r.get("governing_utilisation")
        cells = [e(r["beam"]), e(r.get("section") or "-"), e(_cell(r.get("span_m")) or "-"),
                 e(_cell(r.get("pieces")) or "-"), e(_cell(r.get("splices")) or "-"),
                 e(" ".join(str(b) for b in r.get("bolts_per_splice") or []) or "-"),
                 e(_cell(r.get("heaviest_piece_kg")) or "-"), e(r.get("governing_check") or "-"),
                 f"{u:.2f}" if isinstance(u, float) else "-", e(r["status"])]
        if r.get("outcome") in ("exceeds", "error"):
            cells[-1] = r"\textbf{" + cells[-1] + "}"
        body.append(" & ".join(cells) + r" \\")
    counts = {o: sum(r.get("outcome") == o for r in rows) for o in OUTCOMES}
    tally = (f"{len(rows)} beam(s): {counts['within']} within capacity, {counts['exceeds']} exceeding capacity, "
             f"{counts['not_checked']} with NOT CHECKED items, {counts['error']} not designed.")
    return "\n".join([
        r"\documentclass[10pt]{article}",
        r"\usepackage[a4paper,landscape,margin=15mm]{geometry}",
        r"\usepackage{fontspec}",
        r"\usepackage{array,longtable,booktabs}",
        r"\pagestyle{plain}",
        r"\setlength{\parindent}{0pt}",
        r"\begin{document}",
        r"{\Large\bfseries " + e(title) + r"}\par\smallskip",
        r"{\small Schedule summary" + (r": " + e(source) if source else "") + r". Each beam designed as "
        r"\texttt{splicecalc run} designs it; u is the governing utilisation (demand / resistance) of the "
        r"checks made.}\par\medskip",
        r"\begin{longtable}{@{}l l r r r l r l r >{\raggedright\arraybackslash}p{70mm}@{}}",
        r"\toprule",
        " & ".join(r"\textbf{" + h + "}" for h in heads) + r" \\",
        r"\midrule\endhead",
        *body,
        r"\bottomrule",
        r"\end{longtable}",
        e(tally) + r"\par\medskip",
        r"{\small " + e("Design aid only: every result is to be checked by a competent engineer under the codes "
                         "in force at the site. A NOT CHECKED item is a check the calculation could not make; "
                         "it is not a pass. See each beam's calc package for the checks in full.") + "}",
        r"\end{document}",
        "",
    ])


def write_summary_pdf(rows: list[dict[str, Any]], path: str | os.PathLike, title: str, source: str = "") -> Path:
    """Typeset :func:`summary_latex` with XeLaTeX (locked down, in a temporary folder) and write the PDF
    atomically to ``path``."""
    import tempfile

    from ..report.compile import run_xelatex

    p = Path(path)
    with tempfile.TemporaryDirectory(prefix="splicecalc-schedule-") as tmp:
        tex = Path(tmp) / "schedule_summary.tex"
        tex.write_text(summary_latex(rows, title, source), encoding="utf-8")
        run = run_xelatex(tex, progress=False)
        data = Path(run.pdf_path).read_bytes()
    p.parent.mkdir(parents=True, exist_ok=True)
    return write_atomic(p, data)




def exit_code(rows: list[dict[str, Any]]) -> int:
    """0 every beam within capacity; 1 any beam exceeds capacity or could not be designed;
    3 none of those but some beam has NOT CHECKED items (a gap is not a pass)."""
    outs = {r.get("outcome") for r in rows}
    if outs & {"exceeds", "error"}:
        return 1
    return EXIT_NOT_CHECKED if "not_checked" in outs else 0


__all__ = ["COLUMNS", "COLUMN_NOTES", "BeamEntry", "Schedule", "merge", "set_dotted", "csv_value", "read_csv_rows",
           "read_schedule", "design_one", "summary_row", "error_row", "run_beams", "summary_csv", "write_summary",
           "summary_table", "summary_latex", "write_summary_pdf", "exit_code", "default_workers", "EXIT_NOT_CHECKED"]
