"""Read and write TOML job files.

Layout (every quantity a string with its unit; positions from support A)::

    [project]   number, title, prepared_by, checked_by, client, location, date, revision
    [beam]      span, grade, section ("auto" or a designation), families, max_depth,
                bearing_length, end_distance, restraints, load_level, deflection_limit,
                total_deflection_limit, combination ("6.10" | "6.10ab"), national_annex = {..},
                psi_table ("UK NA" | "EN recommended"), imposed ("single" | "separate"),
                min_frequency (Hz, a plain number, floor beams; default 4)
    [[load]]    name, action (permanent | imposed | snow | wind), category (imposed: A-H),
                group, and either udl (+ optional from, to, applied_to = "flange" | "top flange" |
                "bottom flange" | "shear centre") or point + at (+ optional bearing_length,
                applied_to = "flange" | "top flange" | "bottom flange" | "web")
    [splices]   handed to splicecalc.joints.splice.spec.parse_splices
    [[support]] each handed to splicecalc.joints.connections.spec.parse_support

Array entries are numbered from 1 in messages (``load[2].udl`` is the second
``[[load]]``). Every bad value raises :class:`~splicecalc.core.errors.InputError`
naming its key, before any design work.
"""

from __future__ import annotations

import importlib
import math
import os
import tomllib
from pathlib import Path
from typing import Any

from ..actions.loads import ACTIONS, APPLIED_TO, CATEGORIES, UDL_APPLIED_TO, PointLoad, UDL
from ..core.errors import InputError, require_choice
from ..core.files import write_atomic
from ..core.units import parse_quantity
from .bounds import check_bounds, check_text_lengths
from .model import BeamSpec, Job, NA_OVERRIDABLE, PROJECT_KEYS, Project

TOP_KEYS: tuple[str, ...] = ("project", "beam", "load", "splices", "support")
BEAM_KEYS: tuple[str, ...] = ("span", "grade", "section", "families", "max_depth", "bearing_length",
                              "end_distance", "restraints", "load_level", "deflection_limit",
                              "total_deflection_limit", "combination", "national_annex", "psi_table",
                              "imposed", "min_frequency")
LOAD_KEYS: tuple[str, ...] = ("name", "action", "category", "group", "udl", "width", "from", "to", "point", "at",
                              "bearing_length", "applied_to")


def _unknown(where: str, table: dict, allowed: tuple[str, ...]) -> None:
    extra = [k for k in table if k not in allowed]
    if extra:
        key = f"{where}.{extra[0]}" if where else extra[0]
        raise InputError(key, table[extra[0]] if not isinstance(table[extra[0]], (dict, list)) else "...",
                         f"a known key; allowed {('in [' + where + ']') if where else 'tables'}: "
                         + ", ".join(allowed))


def _table(value: Any, key: str) -> dict:
    if not isinstance(value, dict):
        raise InputError(key, value, "a table")
    return value


def _length(table: dict, key: str, field: str, *, positive: bool = False,
            default: float | None = None) -> float | None:
    if key not in table:
        return default
    v = parse_quantity(table[key], "mm", field)
    if v < 0.0 or (positive and v == 0.0):
        raise InputError(field, table[key], "a length > 0" if positive else "a length >= 0")
    return v


def _number(table: dict, key: str, field: str) -> float | None:
    if key not in table:
        return None
    v = table[key]
    if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v):
        raise InputError(field, v, "a plain number, e.g. 360 for span/360")
    return float(v)


# ---------------------------------------------------------------- sections
def parse_project(table: Any) -> Project:
    t = _table(table, "project")
    _unknown("project", t, PROJECT_KEYS)
    return Project(**{k: (t[k] if isinstance(t[k], str) else _bad_text(f"project.{k}", t[k]))
                      for k in PROJECT_KEYS if k in t})


def _bad_text(field: str, value: Any) -> str:
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        return str(value)
    raise InputError(field, value, "a text (string)")


def parse_beam(table: Any) -> BeamSpec:
    """The ``[beam]`` table -> :class:`BeamSpec` (lengths converted to mm)."""
    t = _table(table, "beam")
    _unknown("beam", t, BEAM_KEYS)
    if "span" not in t:
        raise InputError("beam.span", None, "the span with its unit, e.g. '7.2 m' (required)")
    span = _length(t, "span", "beam.span", positive=True)
    kw: dict[str, Any] = {"span": span}
    for k in ("grade", "section", "load_level", "combination", "psi_table", "imposed"):
        if k in t:
            if not isinstance(t[k], str):
                raise InputError(f"beam.{k}", t[k], "a text (string)")
            kw[k] = t[k]
    if "families" in t:
        fams = t["families"]
        if isinstance(fams, str):
            fams = [fams]
        if not isinstance(fams, list):
            raise InputError("beam.families", fams, "a list such as ['UKB', 'UKC']")
        kw["families"] = tuple(fams)
    if "max_depth" in t:
        kw["max_depth"] = _length(t, "max_depth", "beam.max_depth", positive=True)
    for k in ("bearing_length", "end_distance"):
        if k in t:
            kw[k] = _length(t, k, f"beam.{k}")
    if "restraints" in t:
        rs = t["restraints"]
        if isinstance(rs, str) and rs.strip().lower() == "continuous":
            kw["continuous_restraint"] = True
            rs = []
        elif not isinstance(rs, list):
            raise InputError("beam.restraints", rs, "a list of positions, e.g. ['2.4 m', '4.8 m'], or 'continuous' "
                             "(the top flange held along the whole span)")
        xs = []
        for i, r in enumerate(rs):
            x = parse_quantity(r, "mm", f"beam.restraints[{i + 1}]")
            if not (0.0 < x < span):
                raise InputError(f"beam.restraints[{i + 1}]", r,
                                 f"a position strictly inside the span (0 to {t['span']}); "
                                 "the supports are fork restraints already")
            if xs and x <= xs[-1]:
                raise InputError(f"beam.restraints[{i + 1}]", r,
                                 f"a position beyond the previous restraint {rs[i - 1]} "
                                 "(list restraints in increasing order, no duplicates)")
            xs.append(x)
        kw["restraints"] = tuple(xs)
    for k in ("deflection_limit", "total_deflection_limit", "min_frequency"):
        v = _number(t, k, f"beam.{k}")
        if v is not None:
            kw[k] = v
    if "national_annex" in t:
        na = _table(t["national_annex"], "beam.national_annex")
        _unknown("beam.national_annex", na, NA_OVERRIDABLE)
        ov = []
        for k, v in na.items():
            if isinstance(v, bool) or not isinstance(v, (int, float)):
                raise InputError(f"beam.national_annex.{k}", v, "a plain number")
            ov.append((k, float(v)))
        kw["na_overrides"] = tuple(ov)
    return BeamSpec(**kw)


def _unit_of(text: Any) -> str:
    """The unit part of a quantity text (after the number), '' when there is none."""
    if not isinstance(text, str):
        return ""
    return text.strip().lstrip("+-0123456789.eE ").strip()


def _force(text: Any, field: str) -> float:
    """A force (N) from ``"35 kN"`` or a mass ``"2 t"`` / ``"150 kg"`` (weight with g_n = 9.81 m/s2)."""
    from ..actions.loads import g_n

    if _unit_of(text) in ("t", "kg"):
        return parse_quantity(text, "kg", field) * g_n
    return parse_quantity(text, "N", field)


def _line_load(t: dict, key: str) -> float:
    """A line load (N/mm) from ``udl``: ``"10 kN/m"``, a mass per length ``"0.5 t/m"`` (weight, g_n),
    or an area load ``"5 kN/m2"`` with the tributary ``width`` (``"2.5 m"``) it is collected over."""
    from ..actions.loads import g_n

    text, field = t["udl"], f"{key}.udl"
    unit = _unit_of(text)
    if unit in ("kN/m2", "kPa", "N/m2", "kN/m²"):
        if "width" not in t:
            raise InputError(f"{key}.width", None, f"the tributary width the area load {text!r} is collected "
                             "over, e.g. width = '2.5 m' (or give udl as a line load in kN/m)")
        p = parse_quantity(text.replace("N/m2", "kN/m2") if unit == "N/m2" else text, "MPa", field)
        if unit == "N/m2":
            p /= 1000.0
        b = parse_quantity(t["width"], "mm", f"{key}.width")
        if not b > 0.0:
            raise InputError(f"{key}.width", t["width"], "a tributary width > 0, e.g. '2.5 m'")
        return p * b
    if "width" in t:
        raise InputError(f"{key}.width", t["width"], f"no width with a line load ({text!r}); a width goes with "
                         "an area load in kN/m2")
    if unit in ("t/m", "kg/m"):
        m = parse_quantity(text.replace("t/m", "kg/m") if unit == "t/m" else text, "kg/m", field)
        return m * (1000.0 if unit == "t/m" else 1.0) * g_n / 1000.0
    return parse_quantity(text, "N/mm", field)


def parse_load(table: Any, index: int, span: float) -> UDL | PointLoad:
    """One ``[[load]]`` table (``index`` from 1) -> UDL or PointLoad; checks it lies on the span."""
    key = f"load[{index}]"
    t = _table(table, key)
    _unknown(key, t, LOAD_KEYS)
    name = t.get("name", f"load {index}")
    if not isinstance(name, str) or not name.strip():
        raise InputError(f"{key}.name", name, "a non-empty text")
    if "action" not in t:
        raise InputError(f"{key}.action", None, "one of " + ", ".join(ACTIONS) + " (required)")
    action = t["action"]
    require_choice(f"{key}.action", action, ACTIONS)
    cat = t.get("category")
    if action == "imposed":
        if cat is None:
            raise InputError(f"{key}.category", None,
                             "an imposed-load category " + ", ".join(CATEGORIES) + " (EN 1991-1-1 Table 6.1)")
        if isinstance(cat, str):
            cat = cat.strip().upper()
        require_choice(f"{key}.category", cat, CATEGORIES)
    elif cat is not None:
        raise InputError(f"{key}.category", cat, "no category (categories apply to imposed loads)")
    group = t.get("group", "")
    if not isinstance(group, str):
        raise InputError(f"{key}.group", group, "a text naming the action")
    has_udl, has_point = "udl" in t, "point" in t
    if has_udl == has_point:
        raise InputError(key, name, "exactly one of 'udl' or 'point'")
    span_txt = f"{span / 1000.0:.12g} m"
    if has_udl:
        for k in ("at", "bearing_length"):
            if k in t:
                raise InputError(f"{key}.{k}", t[k], f"no '{k}' for a UDL (it belongs to a point load)")
        level = t.get("applied_to", "flange")
        if level not in UDL_APPLIED_TO:
            raise InputError(f"{key}.applied_to", level, "where the line load acts: " + " | ".join(
                f"'{v}'" for v in UDL_APPLIED_TO) + " ('flange' = the beam's load_level; a ceiling hung below: "
                "'bottom flange')")
        w = _line_load(t, key)
        if not w > 0.0:
            raise InputError(f"{key}.udl", t["udl"], "a line load > 0 (loads act downwards)")
        x0 = parse_quantity(t["from"], "mm", f"{key}.from") if "from" in t else 0.0
        x1 = parse_quantity(t["to"], "mm", f"{key}.to") if "to" in t else None
        if not (0.0 <= x0 < span):
            raise InputError(f"{key}.from", t["from"], f"a position from 0 to below the span {span_txt}")
        if x1 is not None:
            if not (0.0 < x1 <= span * (1 + 1e-12)):
                raise InputError(f"{key}.to", t["to"], f"a position on the span, up to {span_txt}")
            if x1 <= x0:
                raise InputError(f"{key}.to", t["to"], f"a position beyond from = {t.get('from', '0 m')}")
            x1 = min(x1, span)
        return UDL(name=name, action=action, w=w, x_start=x0, x_end=x1, category=cat, group=group,
                   applied_to=level)
    for k in ("from", "to"):
        if k in t:
            raise InputError(f"{key}.{k}", t[k], f"no '{k}' for a point load (use 'at')")
    if "width" in t:
        raise InputError(f"{key}.width", t["width"], "no width for a point load (width turns an area load "
                         "in kN/m2 into a line load)")
    P = _force(t["point"], f"{key}.point")
    if not P > 0.0:
        raise InputError(f"{key}.point", t["point"], "a force > 0 (loads act downwards)")
    if "at" not in t:
        raise InputError(f"{key}.at", None, "the position of the point load, e.g. '3.0 m' (required)")
    x = parse_quantity(t["at"], "mm", f"{key}.at")
    if not (0.0 <= x <= span):
        raise InputError(f"{key}.at", t["at"], f"a position on the span, 0 to {span_txt}")
    s_s = 0.0
    if "bearing_length" in t:
        s_s = parse_quantity(t["bearing_length"], "mm", f"{key}.bearing_length")
        if not 0.0 <= s_s <= span:
            raise InputError(f"{key}.bearing_length", t["bearing_length"],
                             f"the stiff bearing length of load '{name}': 0 up to the span {span_txt} "
                             "(0 when the load has no stiff bearing)")
    applied = t.get("applied_to", "flange")
    require_choice(f"{key}.applied_to", applied, APPLIED_TO)
    return PointLoad(name=name, action=action, P=P, x=x, category=cat, group=group, bearing_length=s_s,
                     applied_to=applied)


def _optional_parser(module: str, func: str) -> Any:
    """The parser function of a joint module, or None when that module does not exist yet."""
    try:
        mod = importlib.import_module(module)
    except ModuleNotFoundError as err:
        if err.name and module.startswith(err.name):
            return None
        raise
    return getattr(mod, func, None)


def job_from_dict(data: Any) -> Job:
    """A parsed TOML document (dict) -> validated :class:`Job`."""
    d = _table(data, "job file")
    _unknown("", d, TOP_KEYS)
    _check_depth(d)
    check_text_lengths(d)
    check_bounds(d)             # plausibility of every quantity, in the user's words and units
    if "beam" not in d:
        raise InputError("beam", None, "a [beam] table (required)")
    project = parse_project(d["project"]) if "project" in d else Project()
    beam = parse_beam(d["beam"])
    raw_loads = d.get("load", [])
    if not isinstance(raw_loads, list):
        raise InputError("load", raw_loads, "an array of tables written [[load]]")
    loads = tuple(parse_load(t, i + 1, beam.span) for i, t in enumerate(raw_loads))
    notes: list[str] = []
    splices = None
    splices_table = None
    if "splices" in d:
        splices_table = _table(d["splices"], "splices")
        parse = _optional_parser("splicecalc.joints.splice.spec", "parse_splices")
        if parse is None:
            splices = splices_table
            notes.append("[splices] kept as a raw table: splicecalc.joints.splice.spec is not available")
        else:
            splices = parse(splices_table)
            for i, x in enumerate(getattr(splices, "positions", None) or ()):
                if not 0.0 < x < beam.span:
                    raise InputError(f"splices.positions[{i + 1}]", splices_table["positions"][i],
                                     f"a position strictly inside the span (0 to {beam.span / 1000.0:g} m)")
    supports: list[Any] = []
    support_tables: list[dict] = []
    if "support" in d:
        raw = d["support"]
        if not isinstance(raw, list):
            raise InputError("support", raw, "an array of tables written [[support]]")
        parse = _optional_parser("splicecalc.joints.connections.spec", "parse_support")
        for i, t in enumerate(raw):
            tt = _table(t, f"support[{i + 1}]")
            support_tables.append(tt)
            supports.append(tt if parse is None else parse(tt, i + 1))
        if parse is None:
            notes.append("[[support]] kept as raw tables: splicecalc.joints.connections.spec is not available")
    # Job() checks the fields against each other and the sections the design may use (bounds.check_relations)
    return Job(beam=beam, loads=loads, project=project, splices=splices, supports=tuple(supports),
               splices_table=splices_table, support_tables=tuple(support_tables), notes=tuple(notes))


#: largest job file read (bytes): a job file is a few kB; anything near this is not one
MAX_JOB_BYTES = 1_000_000
#: deepest nesting of tables and arrays in a job file (the deepest the layout uses is 4)
MAX_DEPTH = 8


def _check_depth(data: Any, depth: int = 0, where: str = "") -> None:
    if depth > MAX_DEPTH:
        raise InputError(where or "job file", "...", f"tables and arrays nested at most {MAX_DEPTH} deep",
                         "The job-file layout nests at most 4 levels ([splices.layout.flange] is 3)")
    if isinstance(data, dict):
        for k, v in data.items():
            if isinstance(v, (dict, list)):
                _check_depth(v, depth + 1, f"{where}.{k}" if where else str(k))
    elif isinstance(data, list):
        for i, v in enumerate(data):
            if isinstance(v, (dict, list)):
                _check_depth(v, depth + 1, f"{where}[{i + 1}]")


def loads_job(text: str, source: str = "job") -> Job:
    """TOML text -> :class:`Job`."""
    if not isinstance(text, str):
        raise InputError(source, type(text).__name__, "TOML text")
    if len(text) > MAX_JOB_BYTES:
        raise InputError(source, f"{len(text)} characters", f"a job file of at most {MAX_JOB_BYTES // 1000} kB",
                         "Check it is the job file meant (job files are a few kB)")
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as err:
        raise InputError(source, "...", f"valid TOML ({err})") from None
    except RecursionError:
        raise InputError(source, "...", f"tables and arrays nested at most {MAX_DEPTH} deep (the file nests "
                         "them far deeper)") from None
    return job_from_dict(data)


def load_job(path: str | os.PathLike) -> Job:
    """Read a TOML job file -> :class:`Job` (at most :data:`MAX_JOB_BYTES`, UTF-8)."""
    p = Path(path)
    try:
        size = p.stat().st_size
        if size > MAX_JOB_BYTES:
            raise InputError("job file", str(p), f"a job file of at most {MAX_JOB_BYTES // 1000} kB "
                             f"({size // 1000} kB given)", "Check it is the job file meant (job files are a few kB)")
        raw = p.read_bytes()
    except FileNotFoundError:
        raise InputError("job file", str(p), "an existing file") from None
    except IsADirectoryError:
        raise InputError("job file", str(p), "a file (this is a folder)") from None
    except OSError as err:
        raise InputError("job file", str(p), f"a readable file ({err.strerror or err})") from None
    try:
        text = raw.decode("utf-8-sig")     # a byte-order mark (Windows editors write one) is not TOML
    except UnicodeDecodeError as err:
        raise InputError("job file", str(p), f"UTF-8 text (byte {err.start + 1} is not UTF-8)",
                         "Save the file as UTF-8") from None
    return loads_job(text, source=str(p))


# ---------------------------------------------------------------- writing
def dumps_toml(doc: dict[str, Any]) -> str:
    """TOML text of a job-file dict: tomli-w when installed, else a small writer."""
    try:
        import tomli_w
    except ModuleNotFoundError:  # pragma: no cover - tomli-w is in the dev environment
        return _dumps_small(doc)
    return tomli_w.dumps(doc)


def _scalar(v: Any) -> str:
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, int):
        return str(v)
    if isinstance(v, float):
        return repr(v)
    if isinstance(v, str):
        esc = v.replace("\\", "\\\\").replace('"', '\\"').replace("\n", "\\n").replace("\t", "\\t")
        return f'"{esc}"'
    if isinstance(v, (list, tuple)):
        return "[" + ", ".join(_scalar(x) for x in v) + "]"
    if isinstance(v, dict):
        return "{ " + ", ".join(f"{_key(k)} = {_scalar(x)}" for k, x in v.items()) + " }"
    raise TypeError(f"cannot write {type(v).__name__} to TOML")


def _key(k: str) -> str:
    return k if k.replace("_", "").replace("-", "").isalnum() else _scalar(k)


def _dumps_small(doc: dict[str, Any]) -> str:
    out: list[str] = []
    for name, val in doc.items():
        if isinstance(val, dict):
            out.append(f"[{_key(name)}]")
            out.extend(f"{_key(k)} = {_scalar(v)}" for k, v in val.items())
            out.append("")
        elif isinstance(val, list) and val and all(isinstance(x, dict) for x in val):
            for t in val:
                out.append(f"[[{_key(name)}]]")
                out.extend(f"{_key(k)} = {_scalar(v)}" for k, v in t.items())
                out.append("")
        else:
            out.insert(0, f"{_key(name)} = {_scalar(val)}")
    return "\n".join(out)


def write_text_atomic(path: str | os.PathLike, text: str) -> Path:
    """Write ``text`` to ``path`` atomically (see :func:`splicecalc.core.files.write_atomic`)."""
    return write_atomic(path, text)


def save_job(job: Job, path: str | os.PathLike) -> Path:
    """Write the job's canonical TOML to ``path`` atomically."""
    header = "# splicecalc job file (canonical form: quantities carry their units)\n"
    return write_text_atomic(path, header + job.to_toml())


__all__ = ["TOP_KEYS", "BEAM_KEYS", "LOAD_KEYS", "parse_project", "parse_beam", "parse_load",
           "job_from_dict", "loads_job", "load_job", "dumps_toml", "write_text_atomic", "save_job"]
