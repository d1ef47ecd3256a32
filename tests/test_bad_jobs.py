"""A generated corpus of bad job files, each run through ``splicecalc run`` in process.

The corpus is made at test time from the example jobs (nothing stored by hand): every
quantity of every example gets the usual mistakes (negative, zero where it is not allowed,
NaN, infinite, huge, missing or wrong unit, misspelt unit, a number or a list instead of a
text, non-ASCII digits, empty), every table an unknown key, required keys go missing, and
the issue's cases are added (deep nesting, huge and non-UTF-8 files, impossible access
limits, pieces, supports, notches, bolts, partial factors, iron-age dates, long texts).

Each file is classified by what the user sees: a clear one-line error naming the field
(exit 2), or a design result that fails as it should (exit 1). A traceback, an unexpected
error or a silent pass (exit 0) fails the test.
"""

from __future__ import annotations

import copy
import tomllib
from dataclasses import dataclass
from pathlib import Path
from typing import Any, Iterator

import pytest

from splicecalc.cli.main import main
from splicecalc.core.errors import InputError
from splicecalc.core.units import parse_quantity
from splicecalc.job.bounds import BOUNDS
from splicecalc.job.loader import dumps_toml

ROOT = Path(__file__).resolve().parents[1]
EXAMPLES = sorted((ROOT / "examples").glob("*.toml"))
DIMS = ("mm", "N/mm", "N", "kg")
#: one unit of each dimension that is certainly wrong for the others
WRONG_UNIT = {"mm": "5 kg", "N/mm": "5 mm", "N": "5 m", "kg": "5 kN"}


@dataclass
class Case:
    name: str
    expect: str              # "error": exit 2 naming ``field``; "fail": a failing design (exit 1)
    field: str = ""
    doc: dict | None = None  # written with tomli-w, or
    raw: bytes | None = None  # the file's bytes as they are


def _docs() -> dict[str, dict]:
    return {p.stem: tomllib.loads(p.read_text(encoding="utf-8")) for p in EXAMPLES}


def _leaves(d: Any, path: tuple = ()) -> Iterator[tuple[tuple, Any]]:
    if isinstance(d, dict):
        for k, v in d.items():
            yield from _leaves(v, path + (k,))
    elif isinstance(d, list):
        for i, v in enumerate(d):
            yield from _leaves(v, path + (i,))
    else:
        yield path, d


def _tables(d: Any, path: tuple = ()) -> Iterator[tuple[tuple, dict]]:
    if isinstance(d, dict):
        yield path, d
        for k, v in d.items():
            yield from _tables(v, path + (k,))
    elif isinstance(d, list):
        for i, v in enumerate(d):
            yield from _tables(v, path + (i,))


def _field(path: tuple) -> str:
    out = ""
    for p in path:
        out += f"[{p + 1}]" if isinstance(p, int) else (f".{p}" if out else p)
    return out


def _set(doc: dict, path: tuple, value: Any) -> dict:
    d = copy.deepcopy(doc)
    cur = d
    for p in path[:-1]:
        cur = cur[p]
    cur[path[-1]] = value
    return d


def _delete(doc: dict, path: tuple) -> dict:
    d = copy.deepcopy(doc)
    cur = d
    for p in path[:-1]:
        cur = cur[p]
    del cur[path[-1]]
    return d


def _dimension(v: Any) -> str | None:
    if not isinstance(v, str):
        return None
    for dim in DIMS:
        try:
            parse_quantity(v, dim, "x")
            return dim
        except InputError:
            continue
    return None


def quantity_mutations(dim: str, value: str) -> list[tuple[str, Any]]:
    unit = value.split()[-1] if " " in value.strip() else {"mm": "mm", "N": "kN", "N/mm": "kN/m", "kg": "kg"}[dim]
    return [("negative", f"-5 {unit}"), ("nan", f"nan {unit}"), ("inf", f"inf {unit}"), ("huge", f"1e30 {unit}"),
            ("no unit", "5"), ("wrong unit", WRONG_UNIT[dim]), ("misspelt unit", "5 meterz"),
            ("bare number", 5), ("boolean", True), ("list", [value]), ("table", {"value": value}),
            ("arabic-indic digits", f"\u0665 {unit}"), ("full-width digits", f"\uff15 {unit}"), ("empty", "")]


def generate() -> list[Case]:
    cases: list[Case] = []
    docs = _docs()
    for stem, doc in docs.items():
        # every quantity: the usual mistakes
        for path, v in _leaves(doc):
            dim = _dimension(v)
            if dim is None:
                continue
            field = _field(path)
            for what, bad in quantity_mutations(dim, v):
                cases.append(Case(f"{stem}: {field} {what}", "error", field, doc=_set(doc, path, bad)))
        # every table, inline ones too: an unknown key
        for path, t in _tables(doc):
            if not path:
                continue
            field = _field(path + ("colour",))
            cases.append(Case(f"{stem}: unknown key in {_field(path)}", "error", field,
                              doc=_set(doc, path + ("colour",), "blue")))
        cases.append(Case(f"{stem}: unknown top-level table", "error", "material", doc={**doc, "material": {"x": 1}}))
        # required keys missing
        for path in (("beam", "span"), ("load", 0, "action")):
            cases.append(Case(f"{stem}: missing {_field(path)}", "error", _field(path), doc=_delete(doc, path)))
        cases.append(Case(f"{stem}: no [beam]", "error", "beam", doc=_delete(doc, ("beam",))))
        # plausibility of single values
        for field, path, bad in [
            ("beam.span", ("beam", "span"), "1 mm"), ("beam.span", ("beam", "span"), "1e12 m"),
            ("beam.span", ("beam", "span"), "0 m"), ("beam.bearing_length", ("beam", "bearing_length"), "5 m"),
            ("beam.bearing_length", ("beam", "bearing_length"), "1e6 mm"),
            ("beam.end_distance", ("beam", "end_distance"), "100 m"),
            ("beam.max_depth", ("beam", "max_depth"), "20 mm"), ("beam.deflection_limit", ("beam", "deflection_limit"), 5),
            ("beam.deflection_limit", ("beam", "deflection_limit"), float("nan")),
            ("load[1].udl", ("load", 0, "udl"), "1e40 kN/m"), ("load[1].name", ("load", 0, "name"), "x" * 20_001),  # core.text.TEXT_HARD_MAX
            ("load[1].action", ("load", 0, "action"), "earthquake"), ("beam.grade", ("beam", "grade"), "S999"),
            ("beam.section", ("beam", "section"), "999x999x999 UKB"), ("beam.families", ("beam", "families"), ["ZZZ"]),
            ("project.title", ("project", "title"), "T" * 20_001), ("project.number", ("project", "number"), ["a"]),
            ("beam.load_level", ("beam", "load_level"), "sideways"), ("beam.combination", ("beam", "combination"), "6.99"),
        ]:
            cases.append(Case(f"{stem}: {field} = {str(bad)[:20]}", "error", field, doc=_set(doc, path, bad)))
        for k, v in (("gamma_M0", 1e-9), ("gamma_M1", 0.5), ("gamma_M2", 0.0), ("gamma_G", 0.01), ("gamma_Q", 0.01),
                     ("gamma_Q", 1e300), ("xi", -1.0), ("gamma_M0", float("inf")), ("gamma_M0", "1.0"),
                     ("gamma_X", 1.0)):
            cases.append(Case(f"{stem}: national_annex {k} = {v}", "error", f"beam.national_annex.{k}",
                              doc=_set(doc, ("beam", "national_annex"), {k: v})))
        cases.append(Case(f"{stem}: point load 1e40 kN", "error", f"load[{len(doc['load']) + 1}].point",
                          doc=_set(doc, ("load",), doc["load"] + [{"name": "huge", "action": "permanent",
                                                                 "point": "1e40 kN", "at": "1 m"}])))
    # the cases on the example with splices and supports
    demo = docs["demo_workshop_gallery"]
    sp, su = ("splices",), ("support",)
    for field, path, bad in [
        ("splices.max_piece_length", sp + ("max_piece_length",), "0.1 m"),
        ("splices.max_piece_length", sp + ("max_piece_length",), "1e9 m"),
        ("splices.max_piece_mass", sp + ("max_piece_mass",), "1 kg"),
        ("max_piece_mass", sp + ("max_piece_mass",), "30 kg"),      # too light for the section chosen
        ("splices.bolts", sp + ("bolts",), "M36 8.8"),
        ("support[1].existing_steel", su + (0, "existing_steel"), "1850-1860"),
        ("support[1].existing_steel", su + (0, "existing_steel"), "cast iron"),
        ("support[1].existing_member.h", su + (0, "existing_member", "h"), "1e9 mm"),
        ("support[1].notch_top", su + (0, "notch_top"), "500 mm x 100 mm"),
        ("support[1].notch_top", su + (0, "notch_top"), "40 mm x 5 m"),
        ("support[2].at", su + (1, "at"), "start"),
        ("support[1].tying_force", su + (0, "tying_force"), "1e9 kN"),
    ]:
        cases.append(Case(f"demo: {field} = {bad}", "error", field, doc=_set(demo, path, bad)))
    for n in (1, 20, 50):
        d = _set(_delete(_delete(demo, sp + ("max_piece_length",)), sp + ("max_piece_mass",)), sp + ("pieces",), n)
        cases.append(Case(f"demo: pieces = {n}", "error", "splices.pieces", doc=d))
    cases.append(Case("demo: three supports", "error", "support",
                      doc=_set(demo, su, demo["support"] + [copy.deepcopy(demo["support"][0])])))
    heavy = _set(_set(demo, ("beam", "section"), "305x102x25 UKB"), ("beam", "max_depth"), "540 mm")
    cases.append(Case("demo: M30 bolts on a 102 mm flange", "error", "splices.bolts",
                      doc=_set(heavy, sp + ("bolts",), "M30 8.8")))
    # a design that fails as it should: a section far too light for the loads
    light = _set(docs["mezzanine_infill"], ("beam", "section"), "203x102x23 UKB")
    cases.append(Case("mezzanine: 203x102x23 UKB for a 7.2 m floor beam", "fail", doc=light))
    # the file itself
    text = (ROOT / "examples" / "mezzanine_infill.toml").read_text(encoding="utf-8")
    cases += [
        Case("deeply nested arrays", "error", "", raw=(text + "\n[extra]\nx = " + "[" * 5000 + "]" * 5000).encode()),
        Case("deeply nested inline tables", "error", "",
             raw=(text + "\n[extra]\nx = " + "{a = " * 3000 + "1" + "}" * 3000).encode()),
        Case("nested too deep but parseable", "error", "", raw=("x = " + "[" * 12 + "]" * 12 + "\n" + text).encode()),
        Case("huge file", "error", "job file", raw=(text + "\n#" + "x" * 2_000_000).encode()),
        Case("non-UTF-8 bytes", "error", "job file", raw=text.encode("utf-8").replace(b"Mezzanine", b"Mezz\xe9nine")),
        Case("truncated TOML", "error", "", raw=text.encode()[: len(text) // 2] + b"\n[beam\n"),
        Case("duplicate key", "error", "", raw=(text + '\n[beam]\nspan = "3 m"\n').encode()),
        Case("empty file", "error", "beam", raw=b""),
        Case("binary file", "error", "job file", raw=bytes(range(256)) * 4),
    ]
    return cases


CASES = generate()


def test_corpus_is_large_and_generated():
    assert len(CASES) >= 300, len(CASES)
    assert len({c.name for c in CASES}) == len(CASES)


def test_every_quantity_of_the_examples_has_a_bound_or_a_position_rule():
    # positions along the span are bounded by the span itself (loader); every other quantity by BOUNDS
    bounded = {b.path for b in BOUNDS}
    positional = {"load[].at", "load[].from", "load[].to", "beam.restraints[]", "splices.positions[]",
                  "support[].existing_loads.at", "support[].existing_loads.restraints[]",
                  "support[].existing_loads.points[].at"}
    owned_by_spec = {"splices.layout.flange.pitch", "splices.layout.flange.gauge", "splices.layout.web.pitch",
                     "support[].pitch", "support[].gauge", "support[].weld_leg", "support[].notch_top"}
    missing = set()
    for doc in _docs().values():
        for path, v in _leaves(doc):
            if _dimension(v) is None:
                continue
            p = ".".join((f"{x}" if not isinstance(x, int) else "[]") for x in path).replace(".[]", "[]")
            if p not in bounded | positional | owned_by_spec:
                missing.add(p)
    assert not missing, f"quantities without a Bound in splicecalc/job/bounds.py: {sorted(missing)}"


def _run(case: Case, tmp_path: Path, capsys) -> tuple[int, str, str]:
    path = tmp_path / "job.toml"
    path.write_bytes(case.raw if case.raw is not None else dumps_toml(case.doc).encode("utf-8"))
    code = main(["run", str(path)])
    out = capsys.readouterr()
    return code, out.out, out.err


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_bad_job_gives_a_clear_result(case, tmp_path, capsys):
    try:
        code, out, err = _run(case, tmp_path, capsys)
    except BaseException as exc:  # noqa: BLE001 - anything escaping the CLI is a traceback for the user
        pytest.fail(f"traceback: {type(exc).__name__}: {exc}")
    assert "unexpected" not in err and "Traceback" not in err, err
    if case.expect == "error":
        assert code == 2, f"silent pass (exit {code}) for {case.name}"
        lines = [ln for ln in err.splitlines() if ln.strip()]
        assert len(lines) == 1 and lines[0].startswith("splicecalc: error:"), err
        assert case.field in lines[0], f"message does not name {case.field!r}: {lines[0]}"
        assert len(lines[0]) < 1500
    else:
        assert code == 1, f"exit {code}: {err or out[-300:]}"
        assert "NOT OK" in out or "OVER" in out or "exceed" in out.lower() or code == 1


# ---------------------------------------------------------------- property: the reader never crashes
from hypothesis import HealthCheck, given, settings  # noqa: E402
from hypothesis import strategies as st  # noqa: E402

_VALUES = st.recursive(
    st.one_of(st.none(), st.booleans(), st.integers(min_value=-(2 ** 63), max_value=2 ** 63 - 1),
              st.floats(allow_nan=True, allow_infinity=True), st.text(max_size=40),
              st.sampled_from(["7.2 m", "-0 mm", "1e308 kN", "nan m", "5 kN/m", "M20 8.8", "auto", "S275",
                               "1950-1958", "40 mm x 120 mm", "start", "end", "fin plate", "\u0665 m", ""])),
    lambda inner: st.one_of(st.lists(inner, max_size=3), st.dictionaries(st.text(max_size=8), inner, max_size=3)),
    max_leaves=6)
_ALL_DOCS = _docs()
_PATHS = [(stem, path) for stem, doc in _ALL_DOCS.items() for path, _ in _leaves(doc)] + \
         [(stem, path) for stem, doc in _ALL_DOCS.items() for path, _ in _tables(doc) if path]


@settings(max_examples=300, deadline=None, suppress_health_check=list(HealthCheck))
@given(st.sampled_from(_PATHS), _VALUES)
def test_reading_any_value_anywhere_raises_only_input_error(where, value):
    from splicecalc.job.loader import job_from_dict

    stem, path = where
    doc = _set(_ALL_DOCS[stem], path, value)
    try:
        job_from_dict(doc)
    except InputError as err:
        assert "\n" not in str(err)


def test_a_job_built_in_python_meets_the_same_bounds():
    """The Python API (Job, BeamSpec) goes through the same bounds as a job file."""
    from splicecalc.actions.loads import UDL
    from splicecalc.job.model import BeamSpec, Job

    with pytest.raises(InputError, match="beam.span"):
        Job(beam=BeamSpec(span=1e15))                           # 1e12 m in mm
    with pytest.raises(InputError, match=r"load\[1\].udl"):
        Job(beam=BeamSpec(span=7200.0), loads=(UDL(name="w", action="permanent", w=1e30),))
    with pytest.raises(InputError, match="gamma_G"):
        Job(beam=BeamSpec(span=7200.0, na_overrides=(("gamma_G", 0.01),)))
    Job(beam=BeamSpec(span=7200.0), loads=(UDL(name="w", action="permanent", w=8.5),))
