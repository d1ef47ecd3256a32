"""The job-file reference: every table and key a job file may hold, as a Markdown page and as a
JSON Schema an editor can use to validate and complete the TOML (e.g. with a TOML language server
that reads JSON Schema).

The key sets are the parsers' own (:mod:`splicecalc.job.loader`, the ``[splices]`` and
``[[support]]`` readers): :func:`documented_keys` is compared with them in
``tests/test_job_schema.py``, so a key added to a parser without a line here fails the tests.
The generated files live in ``docs/`` (``job-file.md``, ``job-schema.json``); ``splicecalc schema``
prints either, and the test checks the files are current.
"""

from __future__ import annotations

import json
from typing import Any

#: kinds of value and how a job file writes them (unit spellings as core.units.parse_quantity reads them)
KINDS: dict[str, tuple[str, str]] = {
    "text": ("text", ""),
    "length": ("quantity", r"(mm|cm|m)"),
    "force": ("quantity", r"(N|kN|MN|t|kg)"),
    "line load": ("quantity", r"(kN/m|N/mm|t/m|kg/m|kN/m2|kPa|N/m2)"),
    "mass": ("quantity", r"(kg|t)"),
    "moment": ("quantity", r"(kNm|kN m|kN\*m|Nmm)"),
    "stress": ("quantity", r"(MPa|N/mm2|kPa|kN/m2)"),
    "percent": ("quantity", r"(%)"),
    "number": ("number", ""),
    "integer": ("integer", ""),
    "boolean": ("boolean", ""),
    "lengths": ("array", "length"),
    "texts": ("array", "text"),
    "table": ("object", ""),
    "restraints": ("restraints", ""),
    "any": ("any", ""),
}

#: table -> key -> (kind, what it is; allowed values or default)
REFERENCE: dict[str, dict[str, tuple[str, str]]] = {
    "project": {
        "number": ("text", "job number, printed in every sheet's strip"),
        "title": ("text", "calculation title"),
        "prepared_by": ("text", "who prepared this revision (cover only)"),
        "checked_by": ("text", "who checked it (cover only)"),
        "approved_by": ("text", "who approved it (cover only)"),
        "client": ("text", "client"),
        "location": ("text", "project or site"),
        "date": ("text", "date of this revision, e.g. '2026-12-05'"),
        "revision": ("text", "revision, e.g. 'P1'"),
    },
    "beam": {
        "span": ("length", "span between bearing centres (required)"),
        "grade": ("text", "steel grade: S235 | S275 | S355 (EN 10025-2)"),
        "section": ("text", "'auto' (the lightest passing section) or a designation, e.g. '457x191x67 UKB'"),
        "families": ("texts", "families searched when section = 'auto': UKB, UKC, IPE, HEA, HEB"),
        "max_depth": ("length", "headroom limit on the section depth"),
        "bearing_length": ("length", "stiff bearing length where the beam sits on a support (web bearing)"),
        "end_distance": ("length", "distance from the beam end to the bearing centre"),
        "restraints": ("restraints", "positions of intermediate lateral-torsional restraints (ends are forks), "
                                     "or 'continuous' (top flange held along the whole span)"),
        "load_level": ("text", "where the loads act: 'top flange' | 'shear centre' | 'bottom flange'"),
        "deflection_limit": ("number", "variable-action deflection limit, span / N (default 360)"),
        "total_deflection_limit": ("number", "total deflection limit, span / N (optional)"),
        "combination": ("text", "ULS rule: '6.10' or '6.10a+b' (the less favourable of 6.10a and 6.10b)"),
        "national_annex": ("table", "values of the national annex to override (partial factors, xi ...)"),
        "psi_table": ("table", "psi factors by category to override EN 1990 Table A1.1"),
        "imposed": ("text", "imposed loads of several categories: one variable action or 'separate'"),
        "min_frequency": ("number", "lowest natural frequency of the floor, Hz (default 4)"),
    },
    "load": {
        "name": ("text", "name of the load"),
        "action": ("text", "permanent | imposed | snow | wind (required)"),
        "category": ("text", "imposed-load category A-H (EN 1991-1-1 Table 6.1), imposed loads only"),
        "group": ("text", "loads of one group act together as one variable action"),
        "udl": ("line load", "uniformly distributed load: kN/m, t/m, or an area load kN/m2 with width"),
        "width": ("length", "tributary width an area load (kN/m2) is collected over"),
        "from": ("length", "start of a partial UDL (default 0)"),
        "to": ("length", "end of a partial UDL (default the span)"),
        "point": ("force", "point load: kN, or a mass in t / kg (weight with g = 9.81 m/s2)"),
        "at": ("length", "position of a point load from support A (required with point)"),
        "bearing_length": ("length", "stiff bearing length of a point load (web under the load)"),
        "applied_to": ("text", "where the load acts for lateral-torsional buckling (its height) and, for a point "
                               "load, enters the beam: 'flange' (the beam's load_level) | 'top flange' | 'bottom "
                               "flange' (e.g. a hoist, a hung ceiling) | 'web' (point load through a web "
                               "connection) | 'shear centre' (line load)"),
    },
    "splices": {
        "pieces": ("integer", "number of pieces the beam is delivered in"),
        "positions": ("lengths", "splice positions from support A (instead of an automatic choice)"),
        "max_piece_length": ("length", "longest piece the access allows"),
        "max_piece_mass": ("mass", "heaviest piece the access or lifting allows"),
        "mass_margin": ("percent", "margin on every piece mass (rolling tolerance)"),
        "bolts": ("text", "'auto' or size and class, e.g. 'M20 8.8'"),
        "category": ("text", "EN 1993-1-8 3.4.1 category: A (bearing), B (slip-resistant at SLS), C (at ULS)"),
        "friction_class": ("text", "slip surface class A-D (category B or C)"),
        "flange_plates": ("text", "'outer' or 'outer+inner' cover plates"),
        "plate_grade": ("text", "grade of the cover plates"),
        "min_design_moment": ("number", "least design moment as a fraction of M_c,Rd"),
        "clearance": ("length", "distance kept from supports, point loads and restraints"),
        "gap": ("length", "gap between the beam ends at a splice"),
        "packing": ("length", "packing thickness (EN 1993-1-8 3.6.1(12))"),
        "exposed": ("boolean", "plates exposed to weather (spacing maxima of Table 3.3)"),
        "threads_in_shear_plane": ("boolean", "bolt threads in the shear plane"),
        "cost": ("table", "relative cost per bolt and per kg of plate for the layout search"),
        "layout": ("table", "an explicit layout: [splices.layout.flange] and [splices.layout.web] tables"),
        "holes": ("text", "'normal' clearance holes or 'oversize'"),
        "slip": ("text", "slip of a category A splice: 'computed' | 'ignored' | a length"),
    },
    "support": {
        "at": ("text", "'start' (support A) or 'end' (support B)"),
        "connection": ("text", "'end plate' | 'fin plate' | 'auto'"),
        "bolts": ("text", "'auto' or size and class, e.g. 'M20 8.8'"),
        "plate": ("text", "plate grade, or thickness and grade"),
        "existing_member": ("any", "the existing member: a catalogue designation, or a table of measured h, b, tw, tf, r"),
        "existing_face": ("text", "'column flange' | 'column web' | 'beam web'"),
        "existing_steel": ("any", "era band ('1950-1958' ...), 'unknown', a grade, or coupon tests"),
        "notch_top": ("table", "top notch of the new beam: depth and length"),
        "top_below_existing": ("length", "beam web only: new beam top below the existing beam top (0 = level)"),
        "tying_force": ("force", "tying force (default from the loads, at least 75 kN)"),
        "rows": ("integer", "bolt rows (default chosen)"),
        "pitch": ("length", "bolt pitch (default chosen)"),
        "gauge": ("length", "bolt gauge (default chosen)"),
        "weld_leg": ("length", "fillet weld leg (default chosen)"),
        "existing_loads": ("table", "what the existing member already carries (its member check)"),
        "consequence_class": ("text", "EN 1991-1-7 consequence class for the tying force: 1 | 2a | 2b | 3"),
    },
}

#: how each table appears in the file: a table or an array of tables
ARRAYS = {"load": True, "support": True}


def documented_keys() -> dict[str, set[str]]:
    """Keys described here, per table."""
    return {t: set(keys) for t, keys in REFERENCE.items()}


def _value_schema(kind: str, text: str) -> dict[str, Any]:
    base, extra = KINDS[kind]
    out: dict[str, Any]
    if base == "quantity":
        out = {"type": "string", "pattern": r"^\s*[-+]?(\d+(\.\d*)?|\.\d+)([eE][-+]?\d+)?\s*" + extra + r"\s*$"}
    elif base == "array":
        out = {"type": "array", "items": _value_schema(extra, "")}
    elif base == "any":
        out = {}
    elif base == "restraints":
        out = {"anyOf": [{"const": "continuous"}, _value_schema("lengths", "")]}
    else:
        out = {"type": {"text": "string", "table": "object"}.get(base, base)}
    if text:
        out["description"] = text
    return out


def json_schema() -> dict[str, Any]:
    """The JSON Schema (draft 2020-12) of a job file."""
    props: dict[str, Any] = {}
    for table, keys in REFERENCE.items():
        obj = {"type": "object", "additionalProperties": False,
               "properties": {k: _value_schema(kind, text) for k, (kind, text) in keys.items()}}
        if table == "beam":
            obj["required"] = ["span"]
        if table == "load":
            obj["required"] = ["action"]
        props[table] = {"type": "array", "items": obj} if ARRAYS.get(table) else obj
    return {
        "$schema": "https://json-schema.org/draft/2020-12/schema",
        "title": "splicecalc job file",
        "description": "A new steel beam, its splices and end connections (TOML; quantities as text with units).",
        "type": "object",
        "additionalProperties": False,
        "required": ["beam", "load"],
        "properties": props,
    }


def reference_markdown() -> str:
    """The reference page (Markdown): one table per job-file table."""
    lines = ["# Job file reference", "",
             "A job file is TOML. Quantities are text with their unit (`\"7.2 m\"`, `\"10 kN/m\"`, `\"35 kN\"`, "
             "`\"2 t\"`). Generated from `splicecalc.job.schema` (`splicecalc schema`); the JSON Schema for "
             "editors is `docs/job-schema.json`.", ""]
    for table, keys in REFERENCE.items():
        head = f"[[{table}]]" if ARRAYS.get(table) else f"[{table}]"
        lines += [f"## `{head}`", "", "| key | value | meaning |", "|---|---|---|"]
        for k, (kind, text) in keys.items():
            base, extra = KINDS[kind]
            units = extra.strip("()").replace("\\", "").replace("|", ", ") if base == "quantity" else ""
            what = f"{kind} ({units})" if units else kind
            lines.append(f"| `{k}` | {what} | {text.replace('|', '/')} |")
        lines.append("")
    lines += bounds_markdown()
    return "\n".join(lines)


def bounds_markdown() -> list[str]:
    """The plausibility bounds of :mod:`splicecalc.job.bounds`, one row each with its reason."""
    from .bounds import BOUNDS, _range_text

    lines = ["## Plausibility bounds", "",
             "Every quantity is checked against the range a beam in an existing building can have, when the job "
             "is read (`run`, the form and `build` alike). Generated from `splicecalc.job.bounds.BOUNDS`; "
             "`[]` stands for every entry of an array of tables.", "",
             "| field | allowed | reason |", "|---|---|---|"]
    for b in BOUNDS:
        lines.append(f"| `{b.path}` | {b.what} {_range_text(b)} | {b.reason.replace('|', '/')} |")
    lines.append("")
    return lines


def schema_json_text() -> str:
    return json.dumps(json_schema(), indent=2, sort_keys=False) + "\n"


__all__ = ["KINDS", "REFERENCE", "bounds_markdown", "documented_keys", "json_schema", "reference_markdown", "schema_json_text"]
